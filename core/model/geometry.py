"""Plan geometry of a floor: area, centroid and second moments of an outline with openings.

Second moments use the exact polygon (shoelace) formulas, so a rectangle a × b gives
I_p = A(a² + b²)/12 about its centroid to rounding.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np

from core.model import Point, Ring


@dataclass(frozen=True)
class AreaProperties:
    """Area, centroid and second moments about the centroid (I_xx about the x axis)."""

    area: float
    centroid: Point
    ixx: float
    iyy: float
    ixy: float

    @property
    def polar(self) -> float:
        return self.ixx + self.iyy


def _ring_sums(ring: Ring) -> tuple[float, float, float, float, float, float]:
    """Signed A, S_x·…, raw moments about the origin for one closed ring (any orientation)."""
    p = np.asarray(ring, dtype=float)
    x, y = p[:, 0], p[:, 1]
    x1, y1 = np.roll(x, -1), np.roll(y, -1)
    cross = x * y1 - x1 * y
    a = cross.sum() / 2
    sx = ((x + x1) * cross).sum() / 6  # ∫x dA
    sy = ((y + y1) * cross).sum() / 6  # ∫y dA
    ixx = ((y * y + y * y1 + y1 * y1) * cross).sum() / 12  # ∫y² dA
    iyy = ((x * x + x * x1 + x1 * x1) * cross).sum() / 12  # ∫x² dA
    ixy = ((x * y1 + 2 * x * y + 2 * x1 * y1 + x1 * y) * cross).sum() / 24  # ∫xy dA
    return a, sx, sy, ixx, iyy, ixy


def area_properties(outline: Ring, openings: tuple[Ring, ...] = ()) -> AreaProperties:
    """Properties of ``outline`` less ``openings``, about the net centroid."""
    totals = np.zeros(6)
    for ring, sign in [(outline, 1.0)] + [(o, -1.0) for o in openings]:
        sums = np.array(_ring_sums(ring))
        totals += sign * np.sign(sums[0]) * sums
    a, sx, sy, ixx, iyy, ixy = totals
    cx, cy = sx / a, sy / a
    return AreaProperties(
        area=float(a),
        centroid=(float(cx), float(cy)),
        ixx=float(ixx - a * cy * cy),
        iyy=float(iyy - a * cx * cx),
        ixy=float(ixy - a * cx * cy),
    )


@lru_cache(maxsize=4096)
def bounding_size(outline: Ring) -> tuple[float, float]:
    """Plan dimensions (L_x, L_y) of the outline's bounding box, m (kept per outline)."""
    p = np.asarray(outline, dtype=float)
    return float(np.ptp(p[:, 0])), float(np.ptp(p[:, 1]))
