"""How judged figures read on screen and on paper: drifts as percentages, mode numbers as
integers, other figures to four significant figures, and a value never printed the same as the
limit it differs from. Plain text only (no Qt), shared by the panels and the sheet."""

from __future__ import annotations

import math

from core.lateral.records import Check, Verdict
from core.results import ModeKind

MODE_KIND_WORDS = {
    ModeKind.X: "x translation",
    ModeKind.Y: "y translation",
    ModeKind.TORSION: "torsion",
    ModeKind.MIXED: "mixed",
}
"""What a mode does, in words: the one table for tables, readouts, mode views and the sheet."""
MODE_KIND_SYMBOLS = {ModeKind.X: "x", ModeKind.Y: "y", ModeKind.TORSION: "θ",
                     ModeKind.MIXED: MODE_KIND_WORDS[ModeKind.MIXED]}
"""The same in one symbol, for chart keys where words do not fit."""
MODE_NUMBER_CHECKS = frozenset({Check.TORSION_MODE_ORDER})
"""Verdicts whose value and limit are mode numbers (shown as integers)."""
SIGNIFICANT = 4
"""Significant figures of a judged figure (more only where value and limit would read the same)."""


def drift_text(ratio: float, decimals: int = 2) -> str:
    """A drift ratio as a percentage: 0.000791 → "0.08 %"."""
    return f"{100 * ratio:.{decimals}f} %"


def verdict_figures(verdict: Verdict) -> tuple[str, str]:
    """The value and the limit of ``verdict`` as shown (see :func:`judged_figures`)."""
    return judged_figures(verdict.name, verdict.value, verdict.limit)


def judged_figures(name: str, value: float, limit: float) -> tuple[str, str]:
    """A judged figure of check ``name`` and its limit as shown: drifts as percentages with two
    decimals, mode numbers as integers, anything else with four significant figures. Where the value
    differs from its limit, more digits are given until the two texts differ too (never "0.5 % vs
    0.5 %")."""
    if name in MODE_NUMBER_CHECKS and float(value).is_integer() and float(limit).is_integer():
        return f"{value:.0f}", f"{limit:.0f}"
    if not (math.isfinite(value) and math.isfinite(limit)):
        return _general(value, SIGNIFICANT), _general(limit, SIGNIFICANT)
    drift = name == Check.DRIFT
    for extra in range(8):
        if drift:
            texts = drift_text(value, 2 + extra), drift_text(limit, 2 + extra)
        else:
            texts = _general(value, SIGNIFICANT + extra), _general(limit, SIGNIFICANT + extra)
        if texts[0] != texts[1] or value == limit:
            break
    return texts


def _general(value: float, digits: int) -> str:
    if math.isinf(value):
        return "∞" if value > 0 else "−∞"
    return f"{value:.{digits}g}"


CODE_LIMITS = "Code limits"
"""The one name of the setting that chooses whose limits judge the figures."""
