"""Switched-off elements: the layout with and without one element, and the loss of each element —
which single element, if lost, hurts the torsion ratio and the drifts most (a redundancy check).

"Without" an element is the project with that element switched off, which analyses exactly as the
project with it deleted (the analysis leaves switched-off elements out).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from core.analysis import analyse
from core.engine.session import AnalysisSession
from core.errors import AnalysisError, ModelError
from core.guidance.position_map import MapCancelledError, Progress, StopAsked
from core.lateral.cases import DIRECTIONS
from core.model import Project
from core.model.edits import switch_elements
from core.results import Results


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


def outcome(project: Project, session: AnalysisSession | None = None) -> Outcome:
    """Analyse ``project`` (on ``session``, else through :func:`core.analysis.analyse`); a layout
    that cannot stand gives its reason instead of raising."""
    try:
        return Outcome(session.analyse(project) if session is not None else analyse(project))
    except (AnalysisError, ModelError) as error:
        return Outcome(None, str(error))


@dataclass(frozen=True)
class Comparison:
    """The layout with element ``element_id`` and without it."""

    element_id: str
    with_element: Outcome
    without_element: Outcome


def compare(project: Project, element_id: str, session: AnalysisSession | None = None) -> Comparison:
    """The layout with the element switched on and with it switched off."""
    return Comparison(
        element_id,
        outcome(switch_elements(project, [element_id], True), session),
        outcome(switch_elements(project, [element_id], False), session),
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


def loss_ranking(
    project: Project,
    session: AnalysisSession | None = None,
    progress: Progress | None = None,
    stop: StopAsked | None = None,
) -> list[Loss]:
    """Each active element's loss, the most harmful first: layouts that no longer stand, then by
    the larger of the torsion ratio's and the drift's increase (``progress``, ``stop`` per element,
    as for :func:`core.guidance.position_map.position_map`)."""
    base = outcome(project, session)
    if base.results is None:
        raise AnalysisError(base.error or "the layout cannot be analysed")
    losses = []
    active = [e for e in project.elements if e.active]
    for done, element in enumerate(active, start=1):
        if stop is not None and stop():
            raise MapCancelledError
        without = outcome(switch_elements(project, [element.id], False), session)
        if progress is not None:
            progress(done, len(active))
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
