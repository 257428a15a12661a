"""The rule sets (code limits) and the registry that finds a project's by ``Settings.rule_set``.

One module per rule set: :mod:`~core.lateral.rules.en1998`, :mod:`~core.lateral.rules.asce7`.
A new one (a national annex, another code) builds a :class:`CodeRules` and calls
:func:`register_rule_set`.
"""

from __future__ import annotations

from core.errors import ModelError
from core.lateral.records import Check, CheckGroup
from core.lateral.rules import asce7, en1998
from core.lateral.rules.base import CodeRules, DriftChoice, DriftLimit
from core.model import Settings
from core.model.settings import register_rule_set_name, unregister_rule_set_name

__all__ = [
    "Check",
    "CheckGroup",
    "CodeRules",
    "DriftChoice",
    "DriftLimit",
    "register_rule_set",
    "registered_rule_sets",
    "rules_for",
    "unregister_rule_set",
]

_RULES: dict[str, CodeRules] = {en1998.RULES.name: en1998.RULES, asce7.RULES.name: asce7.RULES}


def register_rule_set(rules: CodeRules) -> None:
    """Make ``rules`` selectable by ``Settings(rule_set=rules.name)``."""
    if rules.name in _RULES:
        raise ValueError(f"rule set {rules.name!r} is registered already")
    if not rules.drift_limits:
        raise ValueError(f"rule set {rules.name!r} needs at least one drift limit")
    register_rule_set_name(rules.name)
    _RULES[rules.name] = rules


def unregister_rule_set(name: str) -> None:
    """Forget a registered rule set (the built-in ones stay)."""
    if name not in (en1998.RULES.name, asce7.RULES.name):
        _RULES.pop(name, None)
        unregister_rule_set_name(name)


def registered_rule_sets() -> tuple[CodeRules, ...]:
    return tuple(_RULES.values())


def rules_for(settings: Settings) -> CodeRules:
    """The rule set ``settings`` name."""
    try:
        return _RULES[settings.rule_set]
    except KeyError:
        raise ModelError("settings.rule_set", f"no rule set {settings.rule_set!r} is registered") from None
