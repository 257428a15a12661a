"""Modes of equal period are turned to the plan axes before they are classified."""

from __future__ import annotations

import math

import numpy as np
import pytest

from core.analysis import analyse
from core.model import Element, Level, Project, Spring
from core.solve.modal import ModeKind, aligned_to_axes


def _three_fold_building(first_angle: float) -> Project:
    """A round plan (12-gon) with three equal spring lines at 120° to each other, tangent to a
    circle about the centre: its lateral stiffness is the same in every direction in plan (the sum
    of k·(cos θ, sin θ)ᵀ(cos θ, sin θ) over three lines 120° apart is 1.5 k·I), so the two
    translational modes share one period and any pair of orthogonal directions is a valid pair."""
    outline = tuple((10 + 10 * math.cos(math.radians(a)), 10 + 10 * math.sin(math.radians(a))) for a in range(0, 360, 30))
    levels = tuple(Level(f"L{j}", 3.0, outline, seismic_weight=5.0) for j in (1, 2))
    elements = []
    for i in range(3):
        t = math.radians(first_angle + 120 * i)
        cx, cy = 10 + 6 * math.cos(t), 10 + 6 * math.sin(t)
        dx, dy = -3 * math.sin(t), 3 * math.cos(t)
        elements.append(Element(f"S{i + 1}", (cx - dx, cy - dy), (cx + dx, cy + dy), 0, 2, Spring((1.0e5, 1.0e5))))
    return Project(levels=levels, elements=tuple(elements))


@pytest.mark.parametrize("first_angle", [90.0, 17.0, 61.0])
def test_a_symmetric_plan_gives_a_pure_x_and_a_pure_y_mode(first_angle: float) -> None:
    modes = analyse(_three_fold_building(first_angle)).modes
    first, second = modes[0], modes[1]
    assert first.period == pytest.approx(second.period, rel=1e-9)
    assert (first.kind, second.kind) == (ModeKind.X, ModeKind.Y)
    assert first.shares[0] == pytest.approx(1.0, abs=1e-9)
    assert second.shares[1] == pytest.approx(1.0, abs=1e-9)
    # The plan is the same in x and in y, so the x mode takes as much mass in x as the y mode in y.
    assert first.mass_ratio[0] == pytest.approx(second.mass_ratio[1], rel=1e-9)
    assert first.mass_ratio[1] == pytest.approx(0.0, abs=1e-9)


def test_modes_of_distinct_periods_are_left_alone() -> None:
    values = np.array([1.0, 2.0, 3.0])
    vectors = np.linalg.qr(np.random.default_rng(1).normal(size=(3, 3)))[0]
    assert np.array_equal(aligned_to_axes(values, vectors, np.eye(3)), vectors)


def test_a_turned_pair_stays_an_orthonormal_basis_of_the_same_space() -> None:
    vectors = np.linalg.qr(np.random.default_rng(2).normal(size=(4, 4)))[0]
    values = np.array([1.0, 1.0, 2.0, 3.0])
    turned = aligned_to_axes(values, vectors, np.eye(4)[:3])
    assert turned[:, :2].T @ turned[:, :2] == pytest.approx(np.eye(2), abs=1e-12)
    # Same span: projecting the new pair onto the old pair loses nothing.
    projector = vectors[:, :2] @ vectors[:, :2].T
    assert projector @ turned[:, :2] == pytest.approx(turned[:, :2], abs=1e-12)
    # The first of the pair takes all the pair's participation along the first direction.
    assert turned[0, 1] == pytest.approx(0.0, abs=1e-12)
