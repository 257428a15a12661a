"""Immutable results of :func:`core.analysis.analyse`: floor masses, stiffness, modes, lateral checks.

Arrays are read-only views so no view can change a result another view is showing. The per-stage
records (floor masses, modes) are defined by the stage that computes them and re-exported here.
"""

from __future__ import annotations

from dataclasses import dataclass

from core.arrays import FloatArray
from core.lateral.records import LateralResults
from core.solve.assembly import FloorMass
from core.solve.modal import DOMINANT_SHARE, Mode, ModeKind

__all__ = ["DOMINANT_SHARE", "FloorMass", "Mode", "ModeKind", "Results"]


@dataclass(frozen=True)
class Results:
    """Everything Poise computed for one project state."""

    floors: tuple[FloorMass, ...]
    stiffness: FloatArray
    """Global lateral stiffness, 3n × 3n, DOFs [u_x, u_y, θ] per floor at its mass centre."""
    mass: FloatArray
    """Global mass matrix, diagonal (m, m, J) per floor."""
    modes: tuple[Mode, ...]
    lateral: LateralResults
    """Centres, radii, static load cases, torsion ratios, drifts, element demands and verdicts."""

    @property
    def total_mass(self) -> float:
        return float(sum(f.mass for f in self.floors))

    @property
    def periods(self) -> tuple[float, ...]:
        return tuple(m.period for m in self.modes)
