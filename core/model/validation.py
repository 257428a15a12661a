"""The model's shared refusals: each raises ModelError naming the field that is wrong."""

from __future__ import annotations

from shapely.geometry import Polygon
from shapely.validation import explain_validity

from core.errors import ModelError
from core.model.bounds import count, within

Point = tuple[float, float]
Ring = tuple[Point, ...]


def require(condition: bool, path: str, message: str) -> None:
    if not condition:
        raise ModelError(path, message)


def finite_point(point: Point, path: str) -> None:
    require(len(point) == 2, path, f"must be an (x, y) pair, got {point!r}")
    for c in point:
        within(c, "coordinate", path)


def as_point(point: Point) -> Point:
    return (float(point[0]), float(point[1]))


def as_ring(ring: Ring) -> Ring:
    return tuple(as_point(p) for p in ring)


def valid_ring(ring: Ring, path: str) -> Polygon:
    require(len(ring) >= 3, path, f"a polygon needs at least 3 points, got {len(ring)}")
    count(ring, "points", path)
    for i, point in enumerate(ring):
        finite_point(point, f"{path}[{i}]")
    polygon = Polygon(ring)
    if not polygon.is_valid:
        reason = explain_validity(polygon)
        if "Self-intersection" in reason or "Ring Self-intersection" in reason:
            raise ModelError(path, "polygon intersects itself")
        raise ModelError(path, f"polygon is not valid ({reason})")
    require(polygon.area > 1e-9, path, "polygon has no area")
    return polygon
