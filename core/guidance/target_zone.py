"""Target zone: where each storey's centre of rigidity would have to lie, with today's stiffness,
for the storey to meet e_0 ≤ 0.30·r (EN 1998-1 §4.2.3.2(6) Eq. 4.1a) and the torsion ratio limit
(ASCE 7-16 Table 12.3-1, 1.2).

"Today's stiffness" holds the storey's K_x, K_y and K_θ about its centre of rigidity (definition
(a), :class:`core.lateral.records.StoreyLateral`) and moves only the centre. Then:

- e_0/r: |x_r − x_m| ≤ 0.30·r_x and |y_r − y_m| ≤ 0.30·r_y, a rectangle about the mass centre;
- torsion ratio: a storey of one rigid floor with the static load V at the mass centre ± e_a
  (e_a as the load cases use it) turns by θ = V·(±e_a − e)/K_θ about the centre, which moves by
  V/K; the drift at the two extreme points of the outline across the load is V/K + θ·(x − x_r),
  and the ratio of the larger to their average must not exceed the limit for either sign of e_a.
  Each load direction bounds the offset across it, so this zone is a rectangle too.

For one storey this is exact (tests hold it to a full analysis); above, it reads each storey on its
own, as the storey centres of definition (a) do.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from scipy.optimize import brentq

from core.arrays import FloatArray
from core.guidance.measures import ECCENTRICITY_LIMIT, LIMITS, Measure
from core.lateral.cases import DIRECTIONS
from core.lateral.response import end_ratio, extreme_points
from core.model import Project
from core.results import Results

Interval = tuple[float, float]
"""(low, high) offsets of the centre of rigidity from the mass centre, m."""

SAMPLES = 801
"""Offsets tried across the plan before the zone's ends are refined by root finding."""


@dataclass(frozen=True)
class StoreyZone:
    """The target zone of one storey, as offsets from its mass centre (None: no position works)."""

    storey: int
    mass_centre: tuple[float, float]
    rigidity_centre: tuple[float, float] | None
    eccentricity: tuple[Interval, Interval] | None
    """x and y offsets that meet e_0/r ≤ 0.30."""
    torsion: tuple[Interval | None, Interval | None]
    """x offsets (from loads in y) and y offsets (from loads in x) that meet the torsion ratio limit."""

    def rectangle(self, which: Measure) -> tuple[float, float, float, float] | None:
        """(x0, y0, x1, y1) in plan of the zone for ``which`` (eccentricity or torsion ratio)."""
        zone = self.eccentricity if which is Measure.ECCENTRICITY else self.torsion
        if zone is None:
            return None
        across_x, across_y = zone
        if across_x is None or across_y is None:
            return None
        (a, b), (c, d) = across_x, across_y
        x, y = self.mass_centre
        return x + a, y + c, x + b, y + d


def target_zones(project: Project, results: Results, storeys: list[int] | None = None) -> list[StoreyZone]:
    """The zone of every storey of the analysed ``project`` (or of the 1-based ``storeys``)."""
    lateral = results.lateral
    limit = LIMITS[Measure.TORSION_RATIO].value
    ends = {d: extreme_points(project, d) for d in DIRECTIONS}
    zones = []
    for j, storey in enumerate(lateral.storeys):
        if storeys is not None and storey.storey not in storeys:
            continue
        kx, ky = storey.lateral_stiffness
        k_theta = storey.torsional_stiffness
        rx, ry = storey.torsional_radius
        xm, ym = storey.mass_centre
        if storey.rigidity_centre is None or k_theta <= 0 or kx <= 0 or ky <= 0:
            zones.append(StoreyZone(storey.storey, storey.mass_centre, None, None, (None, None)))
            continue
        ax, ay = ECCENTRICITY_LIMIT * rx, ECCENTRICITY_LIMIT * ry
        eccentricity = ((-ax, ax), (-ay, ay))
        e_a = lateral.accidental_eccentricity[j]
        across_y = ends["y"][j][:, 0] - xm  # the two ends' x from the mass centre, for loads in y
        across_x = ends["x"][j][:, 1] - ym
        torsion = (
            _torsion_interval(ky, k_theta, float(e_a[1]), across_y, limit),
            _torsion_interval(kx, k_theta, float(e_a[0]), across_x, limit),
        )
        zones.append(StoreyZone(storey.storey, storey.mass_centre, storey.rigidity_centre, eccentricity, torsion))
    return zones


def storey_torsion_ratio(k: float, k_theta: float, e_a: float, ends: FloatArray, offsets: FloatArray) -> FloatArray:
    """The worst end ratio over ±e_a of one rigid storey whose centre of rigidity sits at each of
    ``offsets`` from the mass centre across the load; ``ends`` are the two extreme points' offsets."""
    offsets = np.asarray(offsets, dtype=float)[..., None]
    worst = np.ones(offsets.shape[:-1])
    for sign in (1.0, -1.0):
        theta = (sign * e_a - offsets) / k_theta
        worst = np.maximum(worst, end_ratio(1.0 / k + theta * (ends - offsets)))
    return worst


def _torsion_interval(k: float, k_theta: float, e_a: float, ends: FloatArray, limit: float) -> Interval | None:
    """The offsets around the mass centre where :func:`storey_torsion_ratio` ≤ ``limit``: the run
    of sampled offsets that meet it nearest to the mass centre, its ends found by root finding."""
    span = float(np.ptp(ends)) or 1.0
    offsets = np.linspace(-span, span, SAMPLES)

    def excess(offset: float) -> float:
        value = float(storey_torsion_ratio(k, k_theta, e_a, ends, np.array(offset)))
        return (value if math.isfinite(value) else 1e6) - limit

    meets = storey_torsion_ratio(k, k_theta, e_a, ends, offsets) <= limit
    if not meets.any():
        return None
    centre = int(np.argmin(np.where(meets, np.abs(offsets), np.inf)))
    low = high = centre
    while low > 0 and meets[low - 1]:
        low -= 1
    while high < len(offsets) - 1 and meets[high + 1]:
        high += 1
    last = len(offsets) - 1
    a = offsets[low] if low == 0 else brentq(excess, offsets[low - 1], offsets[low], xtol=1e-12)
    b = offsets[high] if high == last else brentq(excess, offsets[high], offsets[high + 1], xtol=1e-12)
    return float(a), float(b)
