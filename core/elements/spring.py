"""Spring: storey stiffnesses k_i in series, a shear chain with a tridiagonal stiffness matrix.

Storey i deforms by its drift d_i − d_(i−1) and carries V_i = k_i (d_i − d_(i−1)), so
K = Σ_i k_i a_iᵀ a_i with a_i = e_i − e_(i−1).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core.arrays import FloatArray, frozen_array, sums_from_top
from core.elements.forces import ElementForces
from core.errors import ModelError
from core.model import Spring


@dataclass(frozen=True)
class SpringChain:
    """The chain's matrix and what its storeys need to report forces."""

    stiffness: FloatArray
    storey_stiffness: FloatArray
    storey_heights: FloatArray

    def forces(self, displacements: FloatArray) -> ElementForces:
        shear = self.storey_stiffness * np.diff(displacements, prepend=0.0)
        # The moment grows by V_k h_k down storey k: M_i = Σ_(k ≥ i) V_k h_k.
        overturning = sums_from_top(shear * self.storey_heights)
        return ElementForces(storey_shear=frozen_array(shear), overturning_moment=frozen_array(overturning))


def condense(spring: Spring, length: float, storey_heights: tuple[float, ...]) -> SpringChain:
    """The tridiagonal matrix of the spring's storey stiffnesses (``length`` plays no part)."""
    if len(spring.storey_stiffness) != len(storey_heights):
        raise ModelError(
            "storey_stiffness",
            f"needs {len(storey_heights)} values, one per storey spanned; got {len(spring.storey_stiffness)}",
        )
    k = np.array(spring.storey_stiffness, dtype=float)
    K = np.diag(k + np.append(k[1:], 0.0)) - np.diag(k[1:], 1) - np.diag(k[1:], -1)
    if not np.all(np.isfinite(K)):
        raise ModelError("storey_stiffness", "values too large to add up; give them in kN/m")
    return SpringChain(frozen_array(K), frozen_array(k), frozen_array(storey_heights))
