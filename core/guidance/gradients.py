"""The move that helps most: for every element, the derivative of the worst torsion ratio and of a
chosen measure with respect to moving it along its normal and along its own line.

The derivatives are differences of the vectorised what-if (:func:`element_positions`, equal to a
full analysis of each moved layout) over a small step h, extrapolated (Richardson) from steps h
and 2h so the truncation error is O(h⁴): central where the element may move both ways, one-sided
(second order) where it stands on an outline edge and one way would leave the floor. Moving an
element along its own line leaves the stiffness unchanged (only the line's offset enters it), so
that derivative is zero to rounding; it is computed all the same, not assumed.

The normal is the element's direction turned a quarter counter-clockwise: n = (−s, c). An arrow
points down the gradient, −(g_n·n + g_a·a), the way that lowers the measure.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core.arrays import FloatArray
from core.engine.session import AnalysisSession
from core.engine.whatif import element_positions
from core.guidance.measures import Measure, position_values
from core.guidance.position_map import MapCancelledError, Progress, StopAsked
from core.model import Project

RELATIVE_STEP = 1e-4
"""The difference step as a share of the plan's larger side (3 mm on a 30 m plan)."""


@dataclass(frozen=True)
class MoveGradient:
    """How one element's move changes the measures, per metre."""

    element_id: str
    normal: tuple[float, float]
    along: tuple[float, float]
    torsion_ratio: tuple[float, float]
    """d(worst torsion ratio)/d(move) along the normal and along the line, 1/m."""
    measure: tuple[float, float]
    """The same for the chosen measure."""
    inward: int
    """0 where the element may move both ways along its normal; +1 or −1 where it stands on an
    outline edge and only that sense of the normal keeps it on the floor (the derivative is then
    one-sided, toward that side)."""

    @property
    def one_sided(self) -> bool:
        return self.inward != 0

    @property
    def blocked(self) -> bool:
        """The measure falls only by moving off the floor: the element is best where it is."""
        return self.inward * self.measure[0] > 0

    @property
    def benefit(self) -> float:
        """How fast the best possible move lowers the chosen measure, 1/m (the gradient's length;
        0 for an element on an edge whose only helpful move would leave the floor)."""
        return 0.0 if self.blocked else float(np.hypot(*self.measure))

    @property
    def helps(self) -> tuple[float, float]:
        """(dx, dy) per metre of the move down the chosen measure's gradient (0 when blocked)."""
        if self.blocked:
            return 0.0, 0.0
        gn, ga = self.measure
        return (
            -(gn * self.normal[0] + ga * self.along[0]),
            -(gn * self.normal[1] + ga * self.along[1]),
        )


def _plan_size(project: Project) -> float:
    ring = np.concatenate([np.asarray(level.outline, dtype=float) for level in project.levels])
    return float(np.ptp(ring, axis=0).max())


def move_gradients(
    project: Project,
    measure: Measure = Measure.TORSION_RATIO,
    step: float | None = None,
    session: AnalysisSession | None = None,
    progress: Progress | None = None,
    stop: StopAsked | None = None,
) -> list[MoveGradient]:
    """The derivatives of every active element of ``project`` (which must analyse), ranked by
    benefit, largest first; ``progress`` and ``stop`` as for :func:`position_map`, per element."""
    session = session or AnalysisSession()
    h = step if step is not None else RELATIVE_STEP * _plan_size(project)
    active = [e.id for e in project.elements if e.active]
    gradients = []
    for done, element_id in enumerate(active, start=1):
        if stop is not None and stop():
            raise MapCancelledError
        gradients.append(_gradient(project, element_id, measure, h, session))
        if progress is not None:
            progress(done, len(active))
    return sorted(gradients, key=lambda g: -g.benefit)


_FACTORS = np.array([-2.0, -1.0, 0.0, 1.0, 2.0])


def _gradient(project: Project, element_id: str, measure: Measure, h: float, session: AnalysisSession) -> MoveGradient:
    element = project.element(element_id)
    c, s = element.direction
    normal, along = np.array([-s, c]), np.array([c, s])
    middle = np.asarray(element.midpoint)
    points = np.concatenate([middle + _FACTORS[:, None] * h * normal, middle + _FACTORS[:, None] * h * along])
    figures = element_positions(project, element_id, points, session)
    torsion = position_values(figures, Measure.TORSION_RATIO).reshape(2, 5)
    chosen = position_values(figures, measure).reshape(2, 5)
    stands = np.isfinite(torsion[0])
    inward = 0 if stands.all() else (1 if stands[3:].all() else (-1 if stands[:2].all() else 0))
    return MoveGradient(
        element_id=element_id,
        normal=(float(normal[0]), float(normal[1])),
        along=(float(along[0]), float(along[1])),
        torsion_ratio=(_derivative(torsion[0], h), _derivative(torsion[1], h)),
        measure=(_derivative(chosen[0], h), _derivative(chosen[1], h)),
        inward=inward,
    )


def _derivative(values: FloatArray, h: float) -> float:
    """f'(0) from f at (−2h, −h, 0, h, 2h): the fourth-order central difference where all five
    stand, else the second-order one-sided difference toward the side that stands (0 if neither)."""
    f = values
    if np.isfinite(f).all():
        return float((8 * (f[3] - f[1]) - (f[4] - f[0])) / (12 * h))
    if np.isfinite(f[2:]).all():
        return float((-3 * f[2] + 4 * f[3] - f[4]) / (2 * h))
    if np.isfinite(f[:3]).all():
        return float((3 * f[2] - 4 * f[1] + f[0]) / (2 * h))
    return 0.0
