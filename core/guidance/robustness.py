"""Switched-off elements: the layout with and without one element, and the loss of each element —
which single element, if lost, hurts the torsion ratio and the drifts most (a redundancy check).

"Without" an element is the project with that element switched off, which analyses exactly as the
project with it deleted (the analysis leaves switched-off elements out).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from core.analysis import analyse
from core.errors import AnalysisError
from core.lateral.cases import DIRECTIONS
from core.model import Project
from core.results import Results


def switched(project: Project, element_id: str, active: bool) -> Project:
    """``project`` with element ``element_id`` switched on or off."""
    return replace(
        project,
        elements=tuple(replace(e, active=active) if e.id == element_id else e for e in project.elements),
    )


@dataclass(frozen=True)
class Outcome:
    """One layout's results, or why it cannot stand."""

    results: Results | None
    error: str | None = None

    @property
    def worst_torsion_ratio(self) -> float:
        """The worst storey torsion ratio in x or y (inf if the layout does not stand)."""
        if self.results is None:
            return math.inf
        return max(self.results.lateral.worst_torsion_ratio(d) for d in DIRECTIONS)

    @property
    def worst_drift_ratio(self) -> float:
        """The largest design storey drift ratio at the mass centre in x or y (inf if it does not stand)."""
        if self.results is None:
            return math.inf
        return max((max(s.drift_ratio) for s in self.results.lateral.storeys), default=0.0)


def outcome(project: Project) -> Outcome:
    """Analyse ``project``; a layout that cannot stand gives its reason instead of raising."""
    try:
        return Outcome(analyse(project))
    except AnalysisError as error:
        return Outcome(None, str(error))


@dataclass(frozen=True)
class Comparison:
    """The layout with element ``element_id`` and without it."""

    element_id: str
    with_element: Outcome
    without_element: Outcome


def compare(project: Project, element_id: str) -> Comparison:
    """The layout with the element switched on and with it switched off."""
    return Comparison(
        element_id,
        outcome(switched(project, element_id, True)),
        outcome(switched(project, element_id, False)),
    )


@dataclass(frozen=True)
class Loss:
    """What losing one element does."""

    element_id: str
    torsion_ratio: float
    """Worst torsion ratio without it (inf: the layout no longer stands)."""
    drift_ratio: float
    """Worst design storey drift ratio without it (inf: the layout no longer stands)."""
    torsion_increase: float
    """Over the worst torsion ratio with every element, as a share (0.1 = 10 % worse)."""
    drift_increase: float
    error: str | None
    """Why the layout without it cannot stand, if it cannot."""


def loss_ranking(project: Project) -> list[Loss]:
    """Each active element's loss, the most harmful first: layouts that no longer stand, then by
    the larger of the torsion ratio's and the drift's increase."""
    base = outcome(project)
    if base.results is None:
        raise AnalysisError(base.error or "the layout cannot be analysed")
    losses = []
    for element in project.elements:
        if not element.active:
            continue
        without = outcome(switched(project, element.id, False))
        torsion, drift = without.worst_torsion_ratio, without.worst_drift_ratio
        losses.append(
            Loss(
                element.id,
                torsion,
                drift,
                torsion / base.worst_torsion_ratio - 1.0,
                drift / base.worst_drift_ratio - 1.0 if base.worst_drift_ratio > 0 else math.inf,
                without.error,
            )
        )
    return sorted(losses, key=lambda loss: -max(loss.torsion_increase, loss.drift_increase))
