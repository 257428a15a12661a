"""Modal analysis of shear buildings against closed forms and a textbook example."""

from __future__ import annotations

import math

import numpy as np
import pytest

from core.analysis import analyse
from core.results import ModeKind
from tests.builders import spring_building


def x_modes(results):
    return [m for m in results.modes if m.kind is ModeKind.X]


@pytest.mark.parametrize("storeys", [1, 3, 10])
def test_uniform_shear_building_matches_closed_form(storeys):
    """Source: uniform fixed–free shear chain, ω_j = 2√(k/m)·sin((2j−1)π / (2(2N+1)))
    (standard closed form; e.g. Chopra, Dynamics of Structures, Ch. 12 / Clough & Penzien,
    Dynamics of Structures, lumped-mass shear beam)."""
    k, m = 2.0e5, 150.0
    results = analyse(spring_building([k] * storeys, [m] * storeys))
    expected = sorted(
        (2 * math.pi / (2 * math.sqrt(k / m) * math.sin((2 * j - 1) * math.pi / (2 * (2 * storeys + 1))))
         for j in range(1, storeys + 1)),
        reverse=True,
    )
    periods = [mode.period for mode in x_modes(results)]
    assert len(periods) == storeys
    np.testing.assert_allclose(periods, expected, rtol=1e-9)


def test_two_storey_textbook_frame():
    """Source: Chopra, Dynamics of Structures, Example 10.4 (from memory, values checked by hand):
    m1 = 2m, m2 = m, k1 = 2k, k2 = k → ω1 = √(k/2m) = 0.70711√(k/m), ω2 = √(2k/m) = 1.41421√(k/m),
    shapes φ1 = [1/2, 1], φ2 = [−1, 1]."""
    k, m = 1.0e5, 100.0
    results = analyse(spring_building([2 * k, k], [2 * m, m]))
    modes = x_modes(results)
    omegas = [mode.omega for mode in modes]
    np.testing.assert_allclose(omegas, [0.70711 * math.sqrt(k / m), 1.41421 * math.sqrt(k / m)], rtol=1e-5)
    first, second = (mode.shape[:, 0] for mode in modes)
    np.testing.assert_allclose(first / first[1], [0.5, 1.0], atol=1e-12)
    np.testing.assert_allclose(second / second[1], [-1.0, 1.0], atol=1e-12)


def test_modes_are_mass_and_stiffness_orthogonal():
    """Property of any generalized eigen-solution: φᵀMφ = I and φᵀKφ = diag(ω²)."""
    results = analyse(spring_building([3e5, 2e5, 1e5], [120.0, 110.0, 90.0]))
    phi = np.column_stack([m.shape.ravel() for m in results.modes])
    np.testing.assert_allclose(phi.T @ results.mass @ phi, np.eye(phi.shape[1]), atol=1e-10)
    omega2 = np.array([m.omega**2 for m in results.modes])
    np.testing.assert_allclose(phi.T @ results.stiffness @ phi, np.diag(omega2), atol=1e-6 * omega2.max())


def test_mass_ratios_sum_to_one_in_each_direction():
    results = analyse(spring_building([3e5, 2e5, 1e5], [120.0, 110.0, 90.0]))
    np.testing.assert_allclose(results.modes[-1].cumulative, (1.0, 1.0, 1.0), atol=1e-12)
