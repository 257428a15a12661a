"""Reading the lateral checks' verdicts for display: worst status per check and per storey."""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass

from PySide6.QtGui import QColor

from app.canvas import style
from core.lateral.records import STATUS_ORDER, Check, LateralResults, Status, Verdict

STATUS_COLOURS = {Status.PASS: style.PASS, Status.WARN: style.WARN, Status.FAIL: style.FAIL}
STATUS_WORDS = {Status.PASS: "pass", Status.WARN: "warn", Status.FAIL: "fail"}


def colour_of(status: Status | None) -> QColor:
    return STATUS_COLOURS.get(status, style.UNKNOWN) if status is not None else style.UNKNOWN


def passes_below(verdicts: list[Verdict]) -> bool:
    """Whether these verdicts of one check pass at values below their limit (a drift) rather than
    above it (a radius ratio), read from the verdicts themselves."""
    passing = [v for v in verdicts if v.status is Status.PASS]
    if passing:
        return passing[0].value <= passing[0].limit
    return verdicts[0].value > verdicts[0].limit


def worst(verdicts: Iterable[Verdict]) -> Verdict | None:
    """The verdict with the worst status and, among those, the value furthest toward failing."""
    verdicts = list(verdicts)
    if not verdicts:
        return None
    status = max((v.status for v in verdicts), key=STATUS_ORDER.__getitem__)
    candidates = [v for v in verdicts if v.status is status]
    if passes_below(verdicts):
        return max(candidates, key=lambda v: v.value)
    return min(candidates, key=lambda v: v.value)


@dataclass(frozen=True)
class CheckSummary:
    """One check over the whole building: its worst verdict and how many storeys fail or warn."""

    name: str
    worst: Verdict
    count: int
    flagged: int


def check_summaries(lateral: LateralResults) -> list[CheckSummary]:
    """One line per distinct check, in the order the checks first appear."""
    groups: dict[str, list[Verdict]] = {}
    for v in lateral.verdicts:
        groups.setdefault(v.name, []).append(v)
    out = []
    for name, verdicts in groups.items():
        w = worst(verdicts)
        assert w is not None
        out.append(CheckSummary(name, w, len(verdicts), sum(v.status is not Status.PASS for v in verdicts)))
    return out


@dataclass(frozen=True)
class StoreyState:
    """At-a-glance state of one storey: torsion and drift, each a figure and a status."""

    torsion_ratio: float
    torsion_status: Status | None
    drift_ratio: float
    drift_status: Status | None


def storey_state(lateral: LateralResults, storey: int) -> StoreyState:
    """The storey's torsion ratio and judged drift, each coloured only by its own check (a torsion
    ratio the rule set does not judge stays grey, whatever the storey's other torsion checks say)."""
    figures = lateral.storey(storey)
    mine = [v for v in lateral.verdicts if v.storey == storey]
    torsion = worst(v for v in mine if v.name is Check.TORSION_RATIO)
    drifts = [v for v in mine if v.name is Check.DRIFT]
    drift = worst(drifts)
    drift_value = max((v.value for v in drifts), default=max(figures.drift_ratio))
    return StoreyState(
        max(figures.torsion_ratio),
        torsion.status if torsion else None,
        drift_value,
        drift.status if drift else None,
    )

