"""The what-if map: the measure the building would have if one element stood at each point of a
grid covering the floors it connects, with its present length and direction.

The grid spans the bounding box of those floors' outlines, edges included (engineers put frames
on the perimeter); a point where the element would leave an outline, or the layout would not
stand, holds NaN. The figures come from :func:`core.engine.whatif.element_positions`, which equals
a full analysis of each moved layout; they depend only on the line's offset across its
direction, so the grid is solved in chunks of distinct offsets (the progress and cancellation
steps) rather than row by row.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, replace

import numpy as np
import shapely

from core.arrays import FloatArray, frozen_array
from core.engine.session import AnalysisSession
from core.engine.whatif import element_positions
from core.errors import AnalysisError
from core.guidance.measures import Limit, Measure, position_values
from core.model import Element, Project

DEFAULT_STEPS = 50
"""Grid points along each side of the map."""
OFFSETS_PER_CHUNK = 64
"""Distinct offsets solved between two progress reports (and cancellation checks): a grid aligned
with the element is one chunk; each chunk costs a warm analysis besides its offsets."""

Progress = Callable[[int, int], None]
"""Called with (done, total) points after each chunk."""
StopAsked = Callable[[], bool]
"""Asked before each chunk; True ends the map with :class:`MapCancelledError`."""


class MapCancelledError(Exception):
    """The caller asked the map to stop (a newer edit made it stale)."""


@dataclass(frozen=True)
class PositionMap:
    """The measure over a grid of midpoints of one element."""

    element_id: str
    measure: Measure
    xs: FloatArray
    """(nx,) grid x, m."""
    ys: FloatArray
    """(ny,) grid y, m."""
    values: FloatArray
    """(ny, nx) the measure with the element's midpoint at (xs[i], ys[j]); NaN where it cannot stand."""
    current: float
    """The measure of the layout as it is."""

    @property
    def limit(self) -> Limit:
        return self.measure.limit

    @property
    def step(self) -> float:
        """The larger of the grid's two spacings, m."""
        return float(max(_spacing(self.xs), _spacing(self.ys)))

    def points(self) -> FloatArray:
        """(ny·nx, 2) the grid midpoints in the order of ``values.ravel()``."""
        gx, gy = np.meshgrid(self.xs, self.ys)
        return np.column_stack([gx.ravel(), gy.ravel()])

    def best(self) -> tuple[float, float, float] | None:
        """(x, y, value) of the lowest standing grid point; None if none stands."""
        if not np.isfinite(self.values).any():
            return None
        j, i = np.unravel_index(int(np.nanargmin(self.values)), self.values.shape)
        return float(self.xs[i]), float(self.ys[j]), float(self.values[j, i])


def _spacing(axis: FloatArray) -> float:
    return float(axis[1] - axis[0]) if len(axis) > 1 else 0.0


def map_extent(project: Project, element: Element) -> tuple[float, float, float, float]:
    """(x0, y0, x1, y1) the bounding box of the outlines of the floors ``element`` connects."""
    floors = range(max(element.bottom, 1), element.top + 1)
    box = shapely.union_all([shapely.Polygon(project.levels[f - 1].outline) for f in floors]).bounds
    return float(box[0]), float(box[1]), float(box[2]), float(box[3])


def grid_axes(extent: tuple[float, float, float, float], steps: int) -> tuple[FloatArray, FloatArray]:
    """``steps`` points along each side of ``extent``, ends included."""
    x0, y0, x1, y1 = extent
    return np.linspace(x0, x1, steps), np.linspace(y0, y1, steps)


def position_map(
    project: Project,
    element_id: str,
    measure: Measure = Measure.TORSION_RATIO,
    steps: int = DEFAULT_STEPS,
    session: AnalysisSession | None = None,
    progress: Progress | None = None,
    stop: StopAsked | None = None,
) -> PositionMap:
    """The map of ``measure`` for element ``element_id`` of ``project`` (which must analyse)."""
    if steps < 2:
        raise ValueError("a map needs at least 2 points a side")
    session = session or AnalysisSession()
    element = project.element(element_id)
    if not element.active:
        raise AnalysisError(f"element {element_id} is switched off: switch it on to map where it could go")
    xs, ys = grid_axes(map_extent(project, element), steps)
    gx, gy = np.meshgrid(xs, ys)
    points = np.column_stack([gx.ravel(), gy.ravel()])
    c, s = element.direction
    offsets = np.round(s * points[:, 0] - c * points[:, 1], 9)
    distinct, where = np.unique(offsets, return_inverse=True)
    where = where.reshape(-1)
    values = np.full(len(points), np.nan)
    current = np.nan
    done = 0
    for first in range(0, len(distinct), OFFSETS_PER_CHUNK):
        if stop is not None and stop():
            raise MapCancelledError
        chunk = np.flatnonzero((where >= first) & (where < first + OFFSETS_PER_CHUNK))
        asked = np.vstack([points[chunk], element.midpoint]) if first == 0 else points[chunk]
        found = position_values(element_positions(project, element_id, asked, session), measure)
        values[chunk] = found[: len(chunk)]
        current = float(found[-1]) if first == 0 else current
        done += len(chunk)
        if progress is not None:
            progress(done, len(points))
    return PositionMap(
        element_id=element_id,
        measure=measure,
        xs=frozen_array(xs),
        ys=frozen_array(ys),
        values=frozen_array(values.reshape(len(ys), len(xs))),
        current=current,
    )


def with_candidate(project: Project, element: Element) -> Project:
    """``project`` with ``element`` (an id not yet used) added where it lies within its floors:
    where it is drawn, or else centred on a point inside the first floor it connects. The map of
    a kind and section before placing one is the map of this candidate."""
    if any(e.id == element.id for e in project.elements):
        raise AnalysisError(f"the candidate's id {element.id} is already used")
    floors = [project.levels[f - 1] for f in range(max(element.bottom, 1), element.top + 1)]
    line = shapely.LineString([element.start, element.end])
    regions = [shapely.Polygon(level.outline) for level in floors]
    if all(region.buffer(1e-9).covers(line) for region in regions):
        return replace(project, elements=(*project.elements, element))
    inside = shapely.intersection_all(regions).representative_point()
    dx, dy = inside.x - element.midpoint[0], inside.y - element.midpoint[1]
    moved = replace(
        element,
        start=(element.start[0] + dx, element.start[1] + dy),
        end=(element.end[0] + dx, element.end[1] + dy),
    )
    return replace(project, elements=(*project.elements, moved))
