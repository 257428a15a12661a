"""Floor masses, the element → floor transformation, and coupling of the rigid-diaphragm model."""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from core.analysis import analyse
from core.errors import AnalysisError
from core.model import GRAVITY, Element, Level, PointMass, Project, Spring
from core.model.geometry import area_properties
from core.results import ModeKind
from core.solve.assembly import element_transformation, floor_masses
from tests.builders import rectangle, spring_building


def test_rectangle_mass_and_inertia():
    """Source: uniform rectangle a × b, J = m(a² + b²)/12 about its centroid (standard result)."""
    a, b, w = 30.0, 12.0, 8.0
    project = Project(levels=(Level("L1", 3.5, rectangle(a, b), seismic_weight=w),))
    (floor,) = floor_masses(project)
    m = w * a * b / GRAVITY
    assert floor.mass == pytest.approx(m, rel=1e-12)
    assert floor.centre == pytest.approx((a / 2, b / 2), rel=1e-12)
    assert floor.inertia == pytest.approx(m * (a * a + b * b) / 12, rel=1e-12)
    assert floor.radius_of_gyration == pytest.approx(math.sqrt((a * a + b * b) / 12), rel=1e-12)


def test_l_shape_by_composite_rectangles():
    """An L of two rectangles, checked by the parallel-axis theorem (Steiner), by hand."""
    outline = ((0, 0), (30, 0), (30, 12), (12, 12), (12, 30), (0, 30))
    props = area_properties(outline)
    parts = [(30.0, 12.0, 15.0, 6.0), (12.0, 18.0, 6.0, 21.0)]  # (width, depth, cx, cy)
    area = sum(w * d for w, d, _, _ in parts)
    cx = sum(w * d * x for w, d, x, _ in parts) / area
    cy = sum(w * d * y for w, d, _, y in parts) / area
    ixx = sum(w * d**3 / 12 + w * d * (y - cy) ** 2 for w, d, _, y in parts)
    iyy = sum(d * w**3 / 12 + w * d * (x - cx) ** 2 for w, d, x, _ in parts)
    ixy = sum(w * d * (x - cx) * (y - cy) for w, d, x, y in parts)
    assert props.area == pytest.approx(area)
    assert props.centroid == pytest.approx((cx, cy))
    assert (props.ixx, props.iyy, props.ixy) == pytest.approx((ixx, iyy, ixy))


def test_openings_and_point_masses_move_the_centre():
    opening = ((2.0, 2.0), (6.0, 2.0), (6.0, 6.0), (2.0, 6.0))
    plain = Level("L1", 3.0, rectangle(20, 10), seismic_weight=9.80665)
    holed = dataclasses.replace(plain, openings=(opening,))
    heavy = dataclasses.replace(plain, point_masses=(PointMass(50.0, (18.0, 5.0)),))
    m_plain, m_holed, m_heavy = (floor_masses(Project(levels=(lv,)))[0] for lv in (plain, holed, heavy))
    assert m_holed.mass == pytest.approx(200.0 - 16.0)
    assert m_holed.centre[0] > 10.0 and m_holed.centre[1] > 5.0
    assert m_heavy.mass == pytest.approx(250.0)
    assert m_heavy.centre[0] == pytest.approx((200 * 10 + 50 * 18) / 250)
    # Parallel-axis check of J with a point mass: J = J_slab + m_s d_s² + m_p d_p².
    d_s, d_p = m_heavy.centre[0] - 10.0, 18.0 - m_heavy.centre[0]
    assert m_heavy.inertia == pytest.approx(m_plain.inertia + 200 * d_s**2 + 50 * d_p**2)


def test_line_vector_of_an_element_off_the_mass_centre():
    """A y-direction line at x = x_m + 4 sees θ as 4·θ along y (design.md sign convention)."""
    project = spring_building([1e5], [100.0])
    floors = floor_masses(project)
    element = Element("S", (9.0, 0.0), (9.0, 10.0), 0, 1, Spring((1e5,)))
    T = element_transformation(element, floors)
    np.testing.assert_allclose(T, [[0.0, 1.0, 4.0]], atol=1e-12)


def test_element_above_the_base_sees_relative_displacement():
    project = spring_building([1e5, 1e5, 1e5], [100.0] * 3)
    floors = floor_masses(project)
    element = Element("S", (0.0, 5.0), (10.0, 5.0), 1, 3, Spring((1e5, 1e5)))
    T = element_transformation(element, floors)
    u = np.array([1.0, 0, 0, 3.0, 0, 0, 6.0, 0, 0])
    np.testing.assert_allclose(T @ u, [2.0, 5.0])


def test_doubly_symmetric_layout_has_no_coupling():
    results = analyse(spring_building([2e5, 2e5, 2e5], [150.0] * 3))
    for mode in results.modes:
        assert max(mode.shares) == pytest.approx(1.0, abs=1e-12)
        assert mode.kind in (ModeKind.X, ModeKind.Y, ModeKind.TORSION)


def test_moving_one_line_off_centre_couples_the_first_modes():
    base = spring_building([2e5, 2e5, 2e5], [150.0] * 3)
    moved = dataclasses.replace(
        base,
        elements=tuple(
            dataclasses.replace(e, start=(6.0, 0.0), end=(6.0, 10.0)) if e.id == "SY2" else e for e in base.elements
        ),
    )
    results = analyse(moved)
    y_dominated = [m for m in results.modes if m.shares[1] > 0.3]
    assert y_dominated[0].shares[2] > 0.01
    assert all(m.shares[0] == pytest.approx(0.0, abs=1e-12) for m in y_dominated)


def test_no_levels_is_an_analysis_error():
    with pytest.raises(AnalysisError, match="no levels"):
        analyse(Project())


def test_floor_without_mass_is_an_analysis_error():
    project = spring_building([1e5, 1e5], [100.0, 100.0])
    levels = (project.levels[0], dataclasses.replace(project.levels[1], seismic_weight=0.0))
    with pytest.raises(AnalysisError, match="L2 has no mass"):
        analyse(dataclasses.replace(project, levels=levels))


def test_results_are_immutable():
    results = analyse(spring_building([1e5, 1e5], [100.0, 100.0]))
    with pytest.raises(ValueError):
        results.stiffness[0, 0] = 0.0
    with pytest.raises(ValueError):
        results.modes[0].shape[0, 0] = 0.0
    with pytest.raises(dataclasses.FrozenInstanceError):
        results.modes = ()  # type: ignore[misc]
