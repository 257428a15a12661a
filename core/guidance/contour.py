"""The limit drawn on a map: the segments where a gridded measure crosses a level (marching
squares with linear interpolation along each cell edge). Cells with a blank (NaN) corner carry no
segment, so the line never runs along the edge of where the element fits."""

from __future__ import annotations

import numpy as np

from core.arrays import FloatArray

Segment = tuple[tuple[float, float], tuple[float, float]]


def level_segments(xs: FloatArray, ys: FloatArray, values: FloatArray, level: float) -> list[Segment]:
    """Segments (in the units of ``xs``, ``ys``) where ``values`` (ny, nx) crosses ``level``."""
    v = np.asarray(values, dtype=float) - level
    segments: list[Segment] = []
    ny, nx = v.shape
    if ny < 2 or nx < 2:
        return segments
    corners = np.stack([v[:-1, :-1], v[:-1, 1:], v[1:, 1:], v[1:, :-1]])  # counter-clockwise from (j, i)
    whole = np.isfinite(corners).all(axis=0)
    signs = corners > 0
    mixed = whole & (signs.any(axis=0) & ~signs.all(axis=0))
    for j, i in zip(*np.nonzero(mixed), strict=True):
        ring = [(i, j), (i + 1, j), (i + 1, j + 1), (i, j + 1)]
        c = corners[:, j, i]
        points = []
        for k in range(4):
            a, b = c[k], c[(k + 1) % 4]
            if (a > 0) != (b > 0):
                t = a / (a - b)
                (ia, ja), (ib, jb) = ring[k], ring[(k + 1) % 4]
                fi, fj = ia + t * (ib - ia), ja + t * (jb - ja)
                points.append((float(np.interp(fi, np.arange(nx), xs)), float(np.interp(fj, np.arange(ny), ys))))
        for first in range(0, len(points) - 1, 2):
            segments.append((points[first], points[first + 1]))
    return segments
