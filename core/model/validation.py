"""The model's shared refusals: each raises ModelError naming the field that is wrong."""

from __future__ import annotations

import math

from shapely.geometry import Polygon
from shapely.validation import explain_validity

from core.errors import ModelError

Point = tuple[float, float]
Ring = tuple[Point, ...]


def require(condition: bool, path: str, message: str) -> None:
    if not condition:
        raise ModelError(path, message)


def positive(value: float, path: str) -> None:
    require(math.isfinite(value) and value > 0.0, path, f"must be a positive number, got {value!r}")


def non_negative(value: float, path: str) -> None:
    require(math.isfinite(value) and value >= 0.0, path, f"must be zero or positive, got {value!r}")


def finite_point(point: Point, path: str) -> None:
    require(
        len(point) == 2 and all(math.isfinite(c) for c in point),
        path,
        f"must be a finite (x, y) pair, got {point!r}",
    )


def as_point(point: Point) -> Point:
    return (float(point[0]), float(point[1]))


def as_ring(ring: Ring) -> Ring:
    return tuple(as_point(p) for p in ring)


def valid_ring(ring: Ring, path: str) -> Polygon:
    require(len(ring) >= 3, path, f"a polygon needs at least 3 points, got {len(ring)}")
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
