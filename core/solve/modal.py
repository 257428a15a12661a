"""Undamped free vibration of the rigid-diaphragm model: K φ = ω² M φ.

M is diagonal and positive, so the problem is solved in the symmetric standard form
M^(-1/2) K M^(-1/2) v = ω² v, and φ = M^(-1/2) v comes out mass-normalised (φᵀMφ = 1).
Participation uses ground translation in x and y, and rigid rotation about the vertical axis
through the building's overall mass centre, so each direction's mass ratios sum to 1.
"""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum

import numpy as np

from core.arrays import FloatArray
from core.errors import AnalysisError
from core.solve.assembly import FloorMass

SINGULAR_TOLERANCE = 1e-10
"""Smallest ω² over the largest below which the stiffness is taken as singular."""


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


def influence_vectors(floors: tuple[FloorMass, ...]) -> FloatArray:
    """(3, 3N) rows ι_x, ι_y, ι_θ: unit ground translation in x, y, and unit rigid rotation about
    the overall mass centre, expressed in each floor's DOFs at its own mass centre."""
    masses = np.array([f.mass for f in floors])
    centres = np.array([f.centre for f in floors])
    X, Y = (masses @ centres) / masses.sum()
    iota = np.zeros((3, len(floors), 3))
    iota[0, :, 0] = 1.0
    iota[1, :, 1] = 1.0
    iota[2, :, 0] = -(centres[:, 1] - Y)
    iota[2, :, 1] = centres[:, 0] - X
    iota[2, :, 2] = 1.0
    return iota.reshape(3, 3 * len(floors))


@dataclass(frozen=True)
class ScaledEigen:
    """The eigen-solution of M^(-1/2) K M^(-1/2): solved once per analysis, shared by the
    stiffness diagnostics and the modal analysis."""

    values: FloatArray
    """ω², ascending."""
    vectors: FloatArray
    """Orthonormal eigenvectors v (columns); φ = M^(-1/2) v."""
    scale: FloatArray
    """M^(-1/2) as a vector."""


def scaled_eigen(K: FloatArray, mass: FloatArray) -> ScaledEigen:
    """Eigenvalues and vectors of M^(-1/2) K M^(-1/2) for the diagonal of M, ``mass`` (all > 0)."""
    scale = 1.0 / np.sqrt(mass)
    values, vectors = np.linalg.eigh(K * scale[:, None] * scale[None, :])  # numpy: less checking per call
    return ScaledEigen(values, vectors, scale)


EQUAL_PERIODS = 1.0e-6
"""Relative difference of ω² below which two modes count as having one period (a symmetric plan)."""


def aligned_to_axes(values: FloatArray, vectors: FloatArray, directions: FloatArray) -> FloatArray:
    """``vectors`` with each group of equal eigenvalues turned within its own space so that the
    first vector of the group takes all the group's participation along ``directions[0]`` (x, in
    the scaled space), the next along ``directions[1]`` (y), and so on.

    Any orthonormal basis of a repeated eigenvalue's space is a valid set of modes; the solver
    returns an arbitrary one (a symmetric plan gives a pair "97 % x, 3 % y"). Turning the pair to
    the plan axes gives modes that are pure x and pure y where the plan allows it."""
    out = vectors.copy()
    n = len(values)
    # Only where a value is close to the next can a group begin: the loop visits those alone.
    close = np.flatnonzero(values[1:] - values[:-1] <= EQUAL_PERIODS * np.abs(values[1:]))
    start = 0
    for candidate in close.tolist():
        if candidate < start:
            continue
        start = candidate
        end = start + 1
        while end < n and values[end] - values[start] <= EQUAL_PERIODS * abs(values[end]):
            end += 1
        group = vectors[:, start:end]
        q, _ = np.linalg.qr(group.T @ directions.T, mode="complete")
        out[:, start:end] = group @ q
        start = end
    return out


def modal_analysis(
    K: FloatArray, M: FloatArray, floors: tuple[FloorMass, ...], eigen: ScaledEigen | None = None
) -> tuple[Mode, ...]:
    """All modes, longest period first, with participation, mass ratios and energy shares.
    ``eigen`` is the solution of this K and M if already computed."""
    m = np.diag(M).copy()
    if np.any(m <= 0.0):
        bad = sorted({floors[i // 3].name for i in np.flatnonzero(m <= 0.0)})
        raise AnalysisError(
            f"level {', '.join(bad)} has no mass: give it a seismic weight or a point mass",
            levels=tuple(floors[i // 3].level for i in np.flatnonzero(m <= 0.0)),
        )
    if eigen is None:
        eigen = scaled_eigen(K, m)
    eigenvalues, vectors, scale = eigen.values, eigen.vectors, eigen.scale
    largest = max(abs(eigenvalues[-1]), 1e-300)
    if eigenvalues[0] <= SINGULAR_TOLERANCE * largest:
        raise AnalysisError("the lateral stiffness is singular: some floor can move without resistance")
    iota = influence_vectors(floors)
    phi = aligned_to_axes(eigenvalues, vectors, iota / scale[None, :]) * scale[:, None]
    # A deterministic sign: the largest component of each mode is positive.
    peak = np.argmax(np.abs(phi), axis=0)
    phi = np.where(phi[peak, np.arange(phi.shape[1])] < 0, -phi, phi)

    totals = np.einsum("ri,i,ri->r", iota, m, iota)
    gammas = (phi.T * m) @ iota.T  # (modes, 3)
    ratios = gammas**2 / totals
    cumulative = np.cumsum(ratios, axis=0)
    energy = phi**2 * m[:, None]  # (3N, modes); columns sum to 1
    shares = np.stack([energy[0::3].sum(axis=0), energy[1::3].sum(axis=0), energy[2::3].sum(axis=0)], axis=1)

    shapes = np.ascontiguousarray(phi.T).reshape(phi.shape[1], -1, 3)
    shapes.setflags(write=False)  # each mode's shape is a read-only view of this
    return tuple(
        Mode(number=j + 1, omega=omega, shape=shapes[j], participation=g, mass_ratio=r, cumulative=c, shares=e)
        for j, (omega, g, r, c, e) in enumerate(
            zip(
                np.sqrt(eigenvalues).tolist(),
                map(tuple, gammas.tolist()),
                map(tuple, ratios.tolist()),
                map(tuple, cumulative.tolist()),
                map(tuple, shares.tolist()),
                strict=True,
            )
        )
    )
