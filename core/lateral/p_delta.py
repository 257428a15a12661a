"""P-Δ: the stability coefficient θ of each storey and the first-order amplification 1/(1 − θ).

θ = P·Δ / (V·h) · c with P the gravity load at and above the storey, Δ the design storey drift at
the mass centre, V the storey shear of the static load and h the storey height; c is 1 for
EN 1998-1 §4.4.2.2(2) Eq. 4.28 (d_r = q·d_e) and I_e/C_d for ASCE 7-16 §12.8.7 Eq. 12.8-16
(Δ = C_d·δ_e/I_e). Above the code's threshold for ignoring it (0.10 in both), the storey's action
effects are multiplied by 1/(1 − θ) (EN 1998-1 §4.4.2.2(3); ASCE 7-16 §12.8.7).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core.arrays import FloatArray, sums_from_top
from core.model import GRAVITY


@dataclass(frozen=True)
class StabilityLimits:
    """A code's thresholds on θ and the clause they are quoted with."""

    ignore: float
    """At or below: second-order effects need not be taken into account."""
    amplify: float
    """Up to this, 1/(1 − θ) is enough; above it up to ``upper`` a second-order analysis is needed."""
    upper: float
    """θ must not exceed this."""
    drift_factor: float
    """c in θ = P·Δ/(V·h)·c (1 for EN 1998-1, I_e/C_d for ASCE 7-16)."""
    clause: str


def gravity_loads(masses: FloatArray, factor: float) -> FloatArray:
    """(N,) gravity load at and above each storey, kN: ``factor`` × the seismic weight above."""
    loads: FloatArray = factor * GRAVITY * sums_from_top(np.asarray(masses, dtype=float))
    return loads


def stability_coefficients(
    gravity: FloatArray, drift_ratios: FloatArray, storey_shears: FloatArray, drift_factor: float
) -> FloatArray:
    """(N, 2) θ per storey and direction from the gravity load (N,), the design drift over the
    storey height (N, 2) and the static storey shear (N, 2); 0 where a storey carries no shear."""
    shears = np.abs(np.asarray(storey_shears, dtype=float))
    with np.errstate(divide="ignore", invalid="ignore"):
        theta = np.where(shears > 0, gravity[:, None] * np.abs(drift_ratios) * drift_factor / shears, 0.0)
    result: FloatArray = theta
    return result


def amplification(theta: FloatArray, limits: StabilityLimits) -> FloatArray:
    """1/(1 − θ) where θ > ``limits.ignore``, 1 below; θ is taken at most at ``limits.upper``
    (beyond it no factor makes the storey acceptable: its verdict fails)."""
    capped = np.minimum(theta, limits.upper)
    factor: FloatArray = np.where(theta > limits.ignore, 1.0 / (1.0 - capped), 1.0)
    return factor
