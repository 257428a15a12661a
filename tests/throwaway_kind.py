"""A throw-away element kind that tests register to prove a new kind needs no edits elsewhere.

A "strut line": one stiffness k (kN/m) that every storey it spans has, a shear chain — invented
for tests only. Register it with :func:`strut_kind_registered` (a context manager that forgets it
again), so no other test sees it.
"""

from __future__ import annotations

from collections.abc import Iterator
from contextlib import contextmanager
from dataclasses import dataclass

import numpy as np

from core.arrays import FloatArray, frozen_array
from core.elements import ElementForces, register_element_kind, unregister_element_kind
from core.model import KindSpec, Material
from core.model.bounds import within

STRUT_KIND = "test_strut"


@dataclass(frozen=True)
class StrutLine:
    """The same lateral stiffness in every storey spanned, kN/m."""

    stiffness: float = 4.0e4

    def __post_init__(self) -> None:
        within(self.stiffness, "spring_stiffness", "stiffness")


@dataclass(frozen=True)
class StrutChain:
    """The condensed strut line: K = Σ k a_iᵀ a_i with a_i = e_i − e_(i−1)."""

    stiffness: FloatArray
    k: float

    def forces(self, displacements: FloatArray) -> ElementForces:
        shear = self.k * np.diff(displacements, prepend=0.0)
        return ElementForces(storey_shear=frozen_array(shear), overturning_moment=frozen_array(np.zeros_like(shear)))


def condense_strut(line: StrutLine, length: float, storey_heights: tuple[float, ...]) -> StrutChain:
    n = len(storey_heights)
    k = line.stiffness
    K = 2 * k * np.eye(n) - k * np.eye(n, k=1) - k * np.eye(n, k=-1)
    K[-1, -1] = k
    return StrutChain(frozen_array(K), k)


def _defaults(material: Material | None) -> StrutLine:
    return StrutLine()


STRUT_SPEC = KindSpec(STRUT_KIND, StrutLine, "Q", _defaults)


@contextmanager
def strut_kind_registered() -> Iterator[KindSpec]:
    """The strut kind registered for the duration of a ``with`` block."""
    register_element_kind(STRUT_SPEC, condense_strut)
    try:
        yield STRUT_SPEC
    finally:
        unregister_element_kind(STRUT_KIND)
