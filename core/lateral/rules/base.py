"""What a rule set is: the checks it judges, its limits with their clauses, its drift limits.

A rule set (one module per code, e.g. :mod:`core.lateral.rules.en1998`) is a :class:`CodeRules`
object. It judges the figures the lateral stage computed — storeys and mode order — into
:class:`~core.lateral.records.Verdict` objects named by :class:`Check`, so views group and style
verdicts by the enum and never by matching text. Its ``parameters`` hold the nationally
determined parameters and other limits, so a national annex is the same rule set with other
parameters (``dataclasses.replace(rules, name=…, title=…, parameters=…)``) in a module of its own.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

from core.lateral.p_delta import StabilityLimits
from core.lateral.records import ModeOrder, StaticLoad, StoreyLateral, Verdict
from core.model import LoadMethod, Settings


@dataclass(frozen=True)
class DriftLimit:
    """One row of a code's table of storey drift limits."""

    key: str
    """Stored in ``Settings.drift_basis``."""
    ratio: float
    """Limit on storey drift over storey height."""
    label: str
    """What the row applies to, in words (e.g. ``"brittle non-structural elements"``)."""
    clause: str


@dataclass(frozen=True)
class DriftChoice:
    """The drift limit a project is judged by, and where it comes from, in words."""

    ratio: float
    basis: str
    """E.g. ``"0.005 · brittle non-structural elements (EN 1998-1 §4.4.3.2(1)a)"`` or
    ``"0.004 · the project's own limit"``."""


@dataclass(frozen=True)
class CodeRules:
    """A set of code limits. Subclasses judge; the fields say what the set is and holds."""

    name: str
    """The key stored in ``Settings.rule_set``."""
    title: str
    """The code, as the user reads it (``"EN 1998-1"``)."""
    native_loads: LoadMethod | None
    """The load method of the same code; judging another code's loads earns a note."""
    drift_limits: tuple[DriftLimit, ...]
    """The code's drift limits; the first is the default."""
    parameters: Any
    """The set's limits and nationally determined parameters (a frozen dataclass)."""
    continuity_clause: str = "no code number: lateral elements should run down to the foundation"
    """Where the code asks lateral elements to run without interruption to the foundation (the
    clause of the transfer warnings)."""

    def judge(self, settings: Settings, storeys: Sequence[StoreyLateral], order: ModeOrder) -> tuple[Verdict, ...]:
        """Every verdict of this set for the figures of one analysis."""
        raise NotImplementedError

    def method_limits(
        self, settings: Settings, loads: Sequence[StaticLoad], storeys: Sequence[StoreyLateral], height: float
    ) -> tuple[Verdict, ...]:
        """Whether the code lets the equivalent static (lateral force) method stand for this
        building, per direction, and why not (none if the set has no such rule)."""
        return ()

    def stability_limits(self, settings: Settings) -> StabilityLimits | None:
        """The P-Δ thresholds on θ (None: the set judges no P-Δ and amplifies nothing)."""
        return None

    def drift_reduction(self, settings: Settings) -> float:
        """The factor on design drifts before they meet the limit (1 unless the code has one)."""
        return 1.0

    def drift_limit(self, settings: Settings) -> DriftChoice:
        """The project's own limit, or the row of :attr:`drift_limits` that ``drift_basis`` names."""
        if settings.drift_limit is not None:
            return DriftChoice(settings.drift_limit, f"{settings.drift_limit:g} · the project's own limit")
        row = self.drift_row(settings)
        return DriftChoice(row.ratio, f"{row.ratio:g} · {row.label} ({row.clause})")

    def drift_row(self, settings: Settings) -> DriftLimit:
        """The row ``drift_basis`` names; the first row if it names none of this set's rows."""
        return next((r for r in self.drift_limits if r.key == settings.drift_basis), self.drift_limits[0])

    def notes(self, settings: Settings) -> tuple[str, ...]:
        """Sentences a view shows beside the verdicts (e.g. limits of one code on loads of another)."""
        if self.native_loads is None or settings.load_method in (self.native_loads, LoadMethod.COEFFICIENT):
            return ()
        loads = {LoadMethod.EN1998: "EN 1998-1", LoadMethod.ASCE7: "ASCE 7-16"}[settings.load_method]
        return (
            f"{self.title} limits judge {loads} loads: the codes' loads, drift factors and limits "
            "belong together, so read these verdicts as an indication only.",
        )
