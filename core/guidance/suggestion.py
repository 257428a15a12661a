"""Suggested position: the best point of the what-if map, refined by a continuous optimiser.

The figures of a layout depend on an element's position only through its line's offset across
its direction (a move along the line changes no stiffness), so the search is over that offset:

- ``outline``: anywhere the element lies within its floors. The map's best point is refined by
  bounded Brent minimisation (scipy.optimize.minimize_scalar) over the offset within one grid step
  either side; at each trial offset the element keeps its own place along its line, or the
  nearest place on that line where it fits (the shortest move to the best offset).
- ``edges``: on an outline edge parallel to the element; each such edge is one offset, all are
  tried and the best kept.
- ``grid``: on a grid line parallel to the element (lines every ``grid_spacing`` from the origin,
  for elements along x or y); every grid line the element fits on is tried and the best kept.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from enum import StrEnum

import numpy as np
import shapely
from scipy.optimize import minimize_scalar

from core.arrays import FloatArray
from core.engine.session import AnalysisSession
from core.engine.whatif import element_positions
from core.errors import AnalysisError
from core.guidance.measures import Measure, position_values
from core.guidance.position_map import DEFAULT_STEPS, PositionMap, position_map
from core.model import Element, Project

PARALLEL = 1e-6
"""|sin| of the angle below which an edge or grid line counts as parallel to the element."""


class Constraint(StrEnum):
    """Where a suggested position may lie."""

    OUTLINE = "outline"
    EDGES = "edges"
    GRID = "grid"


@dataclass(frozen=True)
class Suggestion:
    """Where to put one element, and what the measure would become."""

    element_id: str
    measure: Measure
    constraint: Constraint
    start: tuple[float, float]
    end: tuple[float, float]
    value: float
    """The measure with the element there."""
    current: float
    """The measure as the layout is."""
    map_point: tuple[float, float, float]
    """(x, y, value) of the map's best grid point, before refinement."""

    def moved(self, element: Element) -> Element:
        """``element`` at the suggested position."""
        return replace(element, start=self.start, end=self.end)


def suggest(
    project: Project,
    element_id: str,
    measure: Measure = Measure.TORSION_RATIO,
    constraint: Constraint = Constraint.OUTLINE,
    grid_spacing: float | None = None,
    steps: int = DEFAULT_STEPS,
    session: AnalysisSession | None = None,
    prepared: PositionMap | None = None,
) -> Suggestion:
    """The suggested position of element ``element_id`` (``prepared``: its map, if already made)."""
    session = session or AnalysisSession()
    element = project.element(element_id)
    grid = prepared if prepared is not None and prepared.measure is measure else None
    grid = grid or position_map(project, element_id, measure, steps, session)
    best = grid.best()
    if best is None:
        raise AnalysisError(f"element {element_id} fits nowhere on the floors it connects")
    placement = _Placement(project, element)
    along = float(np.asarray(element.direction) @ np.asarray(element.midpoint))

    def value_at(offset: float) -> tuple[float, FloatArray | None]:
        midpoint = placement.midpoint(offset, along)
        if midpoint is None:
            return math.inf, None
        figures = element_positions(project, element_id, [midpoint], session)
        found = float(position_values(figures, measure)[0])
        return (found if math.isfinite(found) else math.inf), midpoint

    if constraint is Constraint.OUTLINE:
        middle = placement.offset(np.array(best[:2]))
        step = grid.step
        low, high = placement.offsets()
        result = minimize_scalar(
            lambda d: min(value_at(float(d))[0], 1e300),
            bounds=(max(middle - step, low), min(middle + step, high)),
            method="bounded",
            options={"xatol": 1e-7 * max(step, 1e-3)},
        )
        candidates = [float(result.x), middle]
    else:
        if constraint is Constraint.EDGES:
            candidates = placement.edge_offsets()
        else:
            candidates = placement.grid_offsets(grid_spacing)
        if not candidates:
            raise AnalysisError(f"no {constraint.value} line parallel to element {element_id} to place it on")
    scored = [(value_at(d), d) for d in candidates]
    (value, midpoint), _ = min(scored, key=lambda item: item[0][0])
    if midpoint is None:
        raise AnalysisError(f"element {element_id} fits on no {constraint.value} line parallel to it")
    half = np.array([element.end[0] - element.start[0], element.end[1] - element.start[1]]) / 2
    start, end = midpoint - half, midpoint + half
    return Suggestion(
        element_id=element_id,
        measure=measure,
        constraint=constraint,
        start=(float(start[0]), float(start[1])),
        end=(float(end[0]), float(end[1])),
        value=value,
        current=grid.current,
        map_point=best,
    )


class _Placement:
    """Where an element of fixed length and direction fits on the floors it connects."""

    def __init__(self, project: Project, element: Element) -> None:
        floors = [project.levels[f - 1] for f in range(max(element.bottom, 1), element.top + 1)]
        self.outlines = [np.asarray(level.outline, dtype=float) for level in floors]
        self.region = shapely.intersection_all([shapely.Polygon(o) for o in self.outlines])
        self.direction = np.asarray(element.direction, dtype=float)
        self.normal = np.array([-self.direction[1], self.direction[0]])
        self.length = element.length
        self.reach = 4 * float(np.ptp(np.concatenate(self.outlines), axis=0).max()) + self.length

    def offset(self, point: FloatArray) -> float:
        """The offset along the normal of the line through ``point``."""
        return float(self.normal @ point)

    def offsets(self) -> tuple[float, float]:
        """The lowest and highest offset of the floors' outlines."""
        reach = np.concatenate(self.outlines) @ self.normal
        return float(reach.min()), float(reach.max())

    def midpoint(self, offset: float, along: float) -> FloatArray | None:
        """The midpoint on the line at ``offset`` nearest to ``along`` where the element fits."""
        base = offset * self.normal
        line = shapely.LineString([base - self.reach * self.direction, base + self.reach * self.direction])
        hair = 1e-9 * self.reach
        pieces = shapely.get_parts(shapely.intersection(line, self.region.buffer(hair)))
        best: float | None = None
        for piece in pieces:
            if not isinstance(piece, shapely.LineString) or piece.length + 2 * hair < self.length:
                continue
            coords = np.asarray(piece.coords)
            positions = coords @ self.direction
            low = positions.min() + self.length / 2 - hair
            high = positions.max() - self.length / 2 + hair
            if low > high:
                low = high = (low + high) / 2
            chosen = float(np.clip(along, low, high))
            if best is None or abs(chosen - along) < abs(best - along):
                best = chosen
        return None if best is None else base + best * self.direction

    def edge_offsets(self) -> list[float]:
        """The offsets of the outline edges parallel to the element."""
        offsets = []
        for ring in self.outlines:
            for a, b in zip(ring, np.roll(ring, -1, axis=0), strict=True):
                edge = b - a
                size = float(np.hypot(*edge))
                if size > 0 and abs(float(self.direction[0] * edge[1] - self.direction[1] * edge[0])) < PARALLEL * size:
                    offsets.append(self.offset(a))
        return sorted(set(np.round(offsets, 9).tolist()))

    def grid_offsets(self, spacing: float | None) -> list[float]:
        """The offsets of the grid lines (every ``spacing`` from the origin) parallel to the element."""
        if spacing is None or spacing <= 0:
            raise AnalysisError("placing on grid lines needs a grid spacing")
        if min(abs(self.normal[0]), abs(self.normal[1])) > PARALLEL:
            raise AnalysisError("grid lines run along x and y: the element is skew to them")
        low, high = self.offsets()
        first, last = math.ceil(low / spacing - 1e-9), math.floor(high / spacing + 1e-9)
        return [k * spacing for k in range(first, last + 1)]
