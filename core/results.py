"""Immutable results of :func:`core.analysis.analyse`: floor masses, stiffness, modes.

Arrays are read-only views so no view can change a result another view is showing.
"""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum
from typing import TYPE_CHECKING

import numpy as np
import numpy.typing as npt

from core.model import Point

if TYPE_CHECKING:
    from core.lateral_results import LateralResults

FloatArray = npt.NDArray[np.float64]


def frozen_array(values: npt.ArrayLike) -> FloatArray:
    """A read-only float copy of ``values``."""
    array = np.array(values, dtype=float)
    array.setflags(write=False)
    return array


@dataclass(frozen=True)
class FloorMass:
    """Seismic mass of one floor and where it sits."""

    level: int
    """Level index, 1 = the first floor above the base."""
    name: str
    elevation: float
    area: float
    """Net floor area (openings removed), m²."""
    mass: float
    """t."""
    centre: Point
    """Centre of mass, m."""
    inertia: float
    """Mass moment of inertia about the vertical axis through the centre, t·m²."""

    @property
    def radius_of_gyration(self) -> float:
        """l_s = √(J/m), the floor's mass radius of gyration (EN 1998-1 §4.2.3.2(6))."""
        return float(np.sqrt(self.inertia / self.mass)) if self.mass > 0 else 0.0


class ModeKind(StrEnum):
    """What a mode mostly does, judged by the shares of its kinetic energy."""

    X = "x"
    Y = "y"
    TORSION = "torsion"
    MIXED = "mixed"


DOMINANT_SHARE = 0.7
"""A mode is called x, y or torsion when that component holds at least this share of its kinetic
energy, otherwise mixed (our own threshold; a common-practice reading, no code sets it)."""


@dataclass(frozen=True)
class Mode:
    """One natural mode of the rigid-diaphragm model."""

    number: int
    """1-based, longest period first."""
    omega: float
    """Circular frequency, rad/s."""
    shape: FloatArray
    """(floors, 3) array of [u_x, u_y, θ] at each floor's mass centre, mass-normalised (φᵀMφ = 1)."""
    participation: tuple[float, float, float]
    """Γ_x, Γ_y, Γ_θ = φᵀ M ι for unit ground translation in x, y and rigid rotation about the
    building's overall mass centre."""
    mass_ratio: tuple[float, float, float]
    """Effective modal mass over the total, in x, y and rotation."""
    cumulative: tuple[float, float, float]
    """Sum of mass ratios up to and including this mode."""
    shares: tuple[float, float, float]
    """Shares of the mode's kinetic energy in x translation, y translation and rotation (sum 1)."""

    @property
    def period(self) -> float:
        return float(2 * np.pi / self.omega)

    @property
    def frequency(self) -> float:
        return float(self.omega / (2 * np.pi))

    @property
    def kind(self) -> ModeKind:
        index = int(np.argmax(self.shares))
        if self.shares[index] < DOMINANT_SHARE:
            return ModeKind.MIXED
        return (ModeKind.X, ModeKind.Y, ModeKind.TORSION)[index]


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
