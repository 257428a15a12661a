"""Snapping: the point a cursor position stands for, and what it caught.

Targets come from the plan in order of precedence: points (outline and opening vertices,
element ends and midpoints, underlay line ends) within the tolerance, then the nearest point on
a line (outline edges, element lines, underlay lines), then the grid. Pure geometry, no Qt.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, field
from enum import StrEnum

from core.model import Point, Project


class SnapKind(StrEnum):
    VERTEX = "vertex"
    END = "end"
    MIDPOINT = "midpoint"
    EDGE = "edge"
    UNDERLAY = "underlay"
    GRID = "grid"
    FREE = "free"


@dataclass(frozen=True)
class Snap:
    point: Point
    kind: SnapKind
    label: str = ""
    """What was caught, for the status bar: ``end of B2``."""
    along: Point | None = None
    """Unit direction of the line caught (a midpoint or a point on a line), for the marker."""


@dataclass
class SnapTargets:
    """Feature points and lines one can snap to on one level."""

    points: list[tuple[Point, SnapKind, str, Point | None]] = field(default_factory=list)
    """Point, kind, label and the direction of the line it lies on (midpoints only)."""
    lines: list[tuple[Point, Point, SnapKind, str]] = field(default_factory=list)


def _ring_edges(ring: tuple[Point, ...]) -> list[tuple[Point, Point]]:
    return [(ring[i], ring[(i + 1) % len(ring)]) for i in range(len(ring))]


def plan_targets(
    project: Project,
    level: int,
    underlay: Sequence[tuple[Point, Point]] = (),
    exclude: frozenset[str] = frozenset(),
) -> SnapTargets:
    """Targets on ``level`` (1-based): its outline and openings and the level below's outline,
    every element's line (elements line up from level to level), and the underlay."""
    targets = SnapTargets()
    for number in (level, level - 1):
        if 1 <= number <= len(project.levels):
            floor = project.levels[number - 1]
            name = "outline" if number == level else f"outline of {floor.name}"
            for ring, what in [(floor.outline, name)] + [(o, "opening") for o in floor.openings]:
                targets.points.extend((p, SnapKind.VERTEX, f"corner of {what}", None) for p in ring)
                targets.lines.extend((a, b, SnapKind.EDGE, f"edge of {what}") for a, b in _ring_edges(ring))
    for element in project.elements:
        if element.id in exclude:
            continue
        targets.points.append((element.start, SnapKind.END, f"end of {element.id}", None))
        targets.points.append((element.end, SnapKind.END, f"end of {element.id}", None))
        targets.points.append((element.midpoint, SnapKind.MIDPOINT, f"middle of {element.id}",
                               direction(element.start, element.end)))
        targets.lines.append((element.start, element.end, SnapKind.EDGE, f"line of {element.id}"))
    for a, b in underlay:
        targets.points.extend([(a, SnapKind.END, "underlay end", None), (b, SnapKind.END, "underlay end", None)])
        targets.lines.append((a, b, SnapKind.UNDERLAY, "underlay line"))
    return targets


def direction(a: Point, b: Point) -> Point | None:
    """Unit vector from ``a`` to ``b`` (None for a point)."""
    length = math.dist(a, b)
    return ((b[0] - a[0]) / length, (b[1] - a[1]) / length) if length > 0.0 else None


def nearest_on_segment(p: Point, a: Point, b: Point) -> Point:
    dx, dy = b[0] - a[0], b[1] - a[1]
    length2 = dx * dx + dy * dy
    if length2 == 0.0:
        return a
    t = max(0.0, min(1.0, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / length2))
    return (a[0] + t * dx, a[1] + t * dy)


def snap_to_grid(p: Point, spacing: float) -> Point:
    return (round(p[0] / spacing) * spacing + 0.0, round(p[1] / spacing) * spacing + 0.0)


def snap_point(
    raw: Point,
    targets: SnapTargets | None,
    tolerance: float,
    grid_spacing: float | None,
) -> Snap:
    """The snapped point for ``raw``: a feature point within ``tolerance``, else a line within it,
    else the nearest grid point (when ``grid_spacing`` is given), else ``raw`` itself."""
    if targets is not None:
        best: tuple[float, Snap] | None = None
        for point, kind, label, along in targets.points:
            d = math.dist(raw, point)
            if d <= tolerance and (best is None or d < best[0]):
                best = (d, Snap(point, kind, label, along))
        if best is not None:
            return best[1]
        for a, b, kind, label in targets.lines:
            q = nearest_on_segment(raw, a, b)
            d = math.dist(raw, q)
            if d <= tolerance and (best is None or d < best[0]):
                if grid_spacing:
                    q = grid_crossing(q, a, b, grid_spacing, tolerance)
                best = (d, Snap(q, kind, label, direction(a, b)))
        if best is not None:
            return best[1]
    if grid_spacing:
        return Snap(snap_to_grid(raw, grid_spacing), SnapKind.GRID, "grid")
    return Snap(raw, SnapKind.FREE, "")


def grid_crossing(q: Point, a: Point, b: Point, spacing: float, tolerance: float) -> Point:
    """The point of segment ``a``–``b`` nearest ``q`` where it meets a grid line (so a point
    caught on an edge still lands on round coordinates), or ``q`` if none is within ``tolerance``."""
    candidates = []
    for axis in (0, 1):
        line = round(q[axis] / spacing) * spacing
        span = b[axis] - a[axis]
        if abs(span) > 1e-12:
            t = (line - a[axis]) / span
            if 0.0 <= t <= 1.0:
                candidates.append((a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])))
        elif abs(a[axis] - line) < 1e-9:  # the segment runs along this grid line: round the other way
            other = 1 - axis
            lo, hi = sorted((a[other], b[other]))
            value = min(max(round(q[other] / spacing) * spacing, lo), hi)
            point = [0.0, 0.0]
            point[axis], point[other] = a[axis], value
            candidates.append((point[0], point[1]))
    near = [c for c in candidates if math.dist(c, q) <= tolerance]
    return min(near, key=lambda c: math.dist(c, q)) if near else q


def constrain_orthogonal(anchor: Point, p: Point) -> Point:
    """``p`` moved onto the horizontal or vertical through ``anchor``, whichever is nearer."""
    if abs(p[0] - anchor[0]) >= abs(p[1] - anchor[1]):
        return (p[0], anchor[1])
    return (anchor[0], p[1])
