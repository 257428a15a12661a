"""Condensed element stiffness: matrix properties, caching, member-force equilibrium, bad input."""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest

from core.elements import condensed_stiffness, member_forces
from core.errors import ModelError
from core.model import BracedFrame, BracePattern, Element, MomentFrame, ShearWall, Spring

HEIGHTS = (4.5, 3.5, 3.5, 3.0)

ELEMENTS = {
    "single": BracedFrame(pattern=BracePattern.SINGLE, bays=2),
    "cross": BracedFrame(pattern=BracePattern.CROSS, bays=3),
    "cross tension-only": BracedFrame(pattern=BracePattern.CROSS, bays=2, tension_only=True),
    "chevron": BracedFrame(pattern=BracePattern.CHEVRON, bays=2),
    "wall": ShearWall(),
    "steel plate wall": ShearWall(thickness=0.012, modulus=2.0e8, poisson=0.3, stiffness_factor=1.0),
    "moment frame": MomentFrame(bays=3),
    "cracked moment frame": MomentFrame(bays=1, modulus=3.3e7, column_inertia=0.0108, column_area=0.36,
                                        beam_inertia=0.0114, beam_area=0.28, stiffness_factor=0.5),
    "spring": Spring((9.0e4, 7.0e4, 5.0e4, 3.0e4)),
}  # fmt: skip

LOADS = np.array([100.0, 180.0, 250.0, 300.0])
"""kN, a roughly inverted-triangle pattern of floor loads."""


def elevations(heights: tuple[float, ...]) -> np.ndarray:
    return np.cumsum(heights)


def response(properties, length: float = 12.0, heights: tuple[float, ...] = HEIGHTS):
    """Displacements under LOADS and the member forces they cause."""
    K = condensed_stiffness(properties, length, heights)
    d = np.linalg.solve(K, LOADS[: len(heights)])
    return d, member_forces(properties, length, heights, d)


# --------------------------------------------------------------------------------------------
# The matrix
# --------------------------------------------------------------------------------------------


@pytest.mark.parametrize("name", ELEMENTS)
@pytest.mark.parametrize("heights", [(3.8,), HEIGHTS], ids=["1 storey", "4 storeys"])
def test_matrix_is_symmetric_positive_definite_and_read_only(name: str, heights: tuple[float, ...]) -> None:
    properties = ELEMENTS[name]
    if isinstance(properties, Spring):
        properties = Spring(properties.storey_stiffness[: len(heights)])
    K = condensed_stiffness(properties, 12.0, heights)
    assert K.shape == (len(heights), len(heights))
    assert K.dtype == np.float64
    np.testing.assert_array_equal(K, K.T)
    assert np.linalg.eigvalsh(K).min() > 0
    assert not K.flags.writeable
    with pytest.raises(ValueError):
        K[0, 0] = 0.0


@pytest.mark.parametrize("name", ["single", "cross", "chevron", "moment frame"])
def test_more_bays_over_the_same_length_are_stiffer(name: str) -> None:
    """More braced bays or more column lines over the same line length resist more (common sense check)."""
    properties = ELEMENTS[name]
    one, three = (np.diag(condensed_stiffness(replace(properties, bays=b), 12.0, HEIGHTS)) for b in (1, 3))
    assert np.all(three > one)


def test_tension_only_is_softer_than_cross() -> None:
    """One effective diagonal instead of two: the storey stiffness falls (here to between a third and
    two thirds, the columns' axial flexibility being shared)."""
    cross = condensed_stiffness(ELEMENTS["cross"], 12.0, (4.0,))[0, 0]
    tension = condensed_stiffness(replace(ELEMENTS["cross"], tension_only=True), 12.0, (4.0,))[0, 0]
    assert cross / 3 < tension < 2 * cross / 3


def test_wall_cracking_factor_scales_the_matrix() -> None:
    """Both flexural and shear stiffness carry the factor, so the whole matrix scales with it
    (EN 1998-1 §4.3.1(7))."""
    gross = condensed_stiffness(ShearWall(stiffness_factor=1.0), 5.0, HEIGHTS)
    cracked = condensed_stiffness(ShearWall(stiffness_factor=0.5), 5.0, HEIGHTS)
    np.testing.assert_allclose(cracked, 0.5 * gross, rtol=1e-12)


# --------------------------------------------------------------------------------------------
# Caching
# --------------------------------------------------------------------------------------------


def test_equal_inputs_return_the_same_matrix_object() -> None:
    a = condensed_stiffness(BracedFrame(bays=2, brace_area=4e-3), 10.0, (4.0, 3.5))
    b = condensed_stiffness(BracedFrame(bays=2, brace_area=4e-3), 10.0, [4.0, 3.5])
    assert a is b
    c = condensed_stiffness(BracedFrame(bays=2, brace_area=5e-3), 10.0, (4.0, 3.5))
    assert c is not a
    assert not np.array_equal(a, c)


def test_moving_an_element_in_plan_keeps_its_matrix() -> None:
    """Translations make the recomputed length differ in its last bits; the key still matches."""
    element = Element("B1", (0.3, 0.7), (6.4, 2.9), 0, 2, BracedFrame(bays=2))
    heights = (4.0, 3.5)
    K = condensed_stiffness(element.properties, element.length, heights)
    moved = [
        replace(element, start=(element.start[0] + dx, element.start[1] + dy), end=(element.end[0] + dx, element.end[1] + dy))
        for dx, dy in [(0.1, 0.2), (13.37, -4.21), (-0.7, 101.9), (1e3 / 3, 1e3 / 7)]
    ]  # fmt: skip
    assert any(m.length != element.length for m in moved)  # else the test would prove nothing
    for m in moved:
        assert condensed_stiffness(m.properties, m.length, heights) is K


def test_member_forces_reuse_the_cached_model() -> None:
    from core.elements import _condensed

    frame = MomentFrame(bays=2, beam_inertia=4.1e-4)
    d = np.array([0.01, 0.02])
    _condensed.cache_clear()
    stiffness = condensed_stiffness(frame, 12.0, (4.0, 3.5))
    first = member_forces(frame, 12.0, (4.0, 3.5), d)
    # A length that differs by rounding noise (below the 1 µm key) is the same model.
    member_forces(frame, 12.0 + 2e-7, (4.0, 3.5), d)
    info = _condensed.cache_info()
    assert (info.misses, info.hits) == (1, 2)
    assert condensed_stiffness(frame, 12.0, (4.0, 3.5)) is stiffness
    # The forces belong to that model: the storey shears balance its floor loads K·d (statics).
    np.testing.assert_allclose(first.storey_shear, np.cumsum((stiffness @ d)[::-1])[::-1], rtol=1e-9)
    assert not first.storey_shear.flags.writeable


# --------------------------------------------------------------------------------------------
# Member forces: equilibrium
# --------------------------------------------------------------------------------------------


@pytest.mark.parametrize("name", list(ELEMENTS))
def test_storey_shear_and_overturning_balance_the_floor_loads(name: str) -> None:
    """Statics of the part above each storey's base: V_i = Σ_(k ≥ i) F_k and
    M_i = Σ_(k ≥ i) F_k (z_k − z_(i−1)), with F = K d the floor loads."""
    _, forces = response(ELEMENTS[name])
    z = np.concatenate(([0.0], elevations(HEIGHTS)))
    shear = np.cumsum(LOADS[::-1])[::-1]
    moment = [sum(LOADS[k] * (z[k + 1] - z[i]) for k in range(i, 4)) for i in range(4)]
    np.testing.assert_allclose(forces.storey_shear, shear, rtol=1e-9)
    np.testing.assert_allclose(forces.overturning_moment, moment, rtol=1e-9)


def brace_geometry(frame: BracedFrame, length: float, heights: tuple[float, ...]) -> list[list[tuple]]:
    """(x_lower, Δx, Δz) of every brace, ordered as ElementForces.brace_axial documents."""
    b = length / frame.bays
    out = []
    for i, h in enumerate(heights):
        row = []
        for k in range(frame.bays):
            rising, falling = (k * b, b, h), ((k + 1) * b, -b, h)
            if frame.pattern is BracePattern.SINGLE:
                row.append(rising if i % 2 == 0 else falling)
            elif frame.pattern is BracePattern.CROSS:
                row.extend([rising] if frame.tension_only else [rising, falling])
            else:
                row.extend([(k * b, b / 2, h), ((k + 1) * b, -b / 2, h)])
        out.append(row)
    return out


@pytest.mark.parametrize("name", ["single", "cross", "cross tension-only", "chevron"])
def test_braces_carry_the_storey_shear(name: str) -> None:
    """Columns are axial, so per storey: Σ N_b Δx_b/L_b = V_i (the braces' horizontal components),
    Σ N_c + Σ N_b Δz_b/L_b = 0 (no vertical load), and the column and brace forces at the cut make
    the overturning moment, M_i = −Σ x N_z."""
    frame = ELEMENTS[name]
    length = 12.0
    _, forces = response(frame, length)
    columns_x = np.arange(frame.bays + 1) * length / frame.bays
    for i, row in enumerate(brace_geometry(frame, length, HEIGHTS)):
        x0, dx, dz = (np.array(v) for v in zip(*row, strict=True))
        N = forces.brace_axial[i]
        L = np.hypot(dx, dz)
        assert np.sum(N * dx / L) == pytest.approx(forces.storey_shear[i], rel=1e-9)
        vertical = np.sum(forces.column_axial[i]) + np.sum(N * dz / L)
        assert abs(vertical) < 1e-9 * forces.storey_shear[i]
        moment = -np.sum(columns_x * forces.column_axial[i]) - np.sum(x0 * N * dz / L)
        assert moment == pytest.approx(forces.overturning_moment[i], rel=1e-9)


def test_tension_only_braces_are_in_tension_under_positive_load() -> None:
    """The kept diagonal is the one in tension when every storey drifts + along the line."""
    _, forces = response(ELEMENTS["cross tension-only"])
    assert np.all(forces.brace_axial > 0)


def test_single_diagonals_alternate() -> None:
    """Odd storeys rise (tension under + load), even ones fall (compression)."""
    _, forces = response(ELEMENTS["single"])
    assert np.all(forces.brace_axial[0::2] > 0)
    assert np.all(forces.brace_axial[1::2] < 0)


def test_wall_base_moment() -> None:
    """Cantilever statics: wall base moment = Σ F_i z_i, base shear = Σ F_i."""
    _, forces = response(ELEMENTS["wall"], 5.0)
    assert forces.overturning_moment[0] == pytest.approx(np.sum(LOADS * elevations(HEIGHTS)), rel=1e-9)
    assert forces.storey_shear[0] == pytest.approx(LOADS.sum(), rel=1e-9)
    assert forces.brace_axial is None and forces.column_moment is None


def test_portal_with_rigid_beam_moments() -> None:
    """Fixed–fixed columns of a portal with a rigid beam carry V/2 each with contraflexure at
    mid-height: end moments V h / 4 (standard beam theory); the beam ends balance the column
    tops and, by antisymmetry, hog at one end and sag at the other."""
    h, V = 3.6, 200.0
    frame = MomentFrame(beam_inertia=1.0e3, column_area=1.0e3, beam_area=1.0e3)
    K = condensed_stiffness(frame, 6.0, (h,))
    forces = member_forces(frame, 6.0, (h,), [V / K[0, 0]])
    np.testing.assert_allclose(forces.column_moment, [[V * h / 4, V * h / 4]], rtol=1e-6)
    start, far = forces.beam_moment[0, 0]
    assert far == pytest.approx(-start, rel=1e-9)
    assert abs(start) == pytest.approx(V * h / 4, rel=1e-6)


def test_moment_frame_joint_balance() -> None:
    """At a top-floor corner joint only the column top and the beam end meet: their moments are
    equal in size (joint equilibrium); the column's larger end moment is at least that."""
    frame = ELEMENTS["moment frame"]
    _, forces = response(frame, 12.0, (4.0,))
    assert forces.column_moment[0, 0] >= abs(forces.beam_moment[0, 0, 0]) * (1 - 1e-12)
    assert np.sum(forces.column_axial) == pytest.approx(0.0, abs=1e-9 * LOADS[0])


def test_spring_storey_shear() -> None:
    d, forces = response(ELEMENTS["spring"])
    k = np.array(ELEMENTS["spring"].storey_stiffness)
    np.testing.assert_allclose(forces.storey_shear, k * np.diff(d, prepend=0.0), rtol=1e-12)


# --------------------------------------------------------------------------------------------
# Bad input
# --------------------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("length", "heights", "path"),
    [
        (0.0, (3.0,), "length"),
        (-4.0, (3.0,), "length"),
        (math.nan, (3.0,), "length"),
        (math.inf, (3.0,), "length"),
        (1e-8, (3.0,), "length"),
        (6.0, (), "storey_heights"),
        (6.0, (3.0, 0.0), "storey_heights[1]"),
        (6.0, (-3.0,), "storey_heights[0]"),
        (6.0, (3.0, math.nan), "storey_heights[1]"),
        ("six", (3.0,), "length"),
        (6.0, (3.0, None), "storey_heights[1]"),
        (6.0, 3.0, "storey_heights"),
    ],
)
@pytest.mark.parametrize("name", ["cross", "chevron", "wall", "moment frame", "spring"])
def test_degenerate_geometry_raises_model_error(name: str, length, heights, path: str) -> None:
    properties = ELEMENTS[name]
    if isinstance(properties, Spring) and isinstance(heights, tuple) and heights:
        properties = Spring((1.0e5,) * len(heights))
    with pytest.raises(ModelError) as caught:
        condensed_stiffness(properties, length, heights)
    assert caught.value.path == path
    assert caught.value.message


def test_spring_needs_one_stiffness_per_storey() -> None:
    with pytest.raises(ModelError, match="needs 4 values"):
        condensed_stiffness(Spring((1.0e5, 2.0e5)), 3.0, HEIGHTS)


def test_unknown_properties_raise_model_error() -> None:
    with pytest.raises(ModelError, match="not an element kind"):
        condensed_stiffness("a wall", 3.0, HEIGHTS)  # type: ignore[arg-type]


def test_sizes_that_would_overflow_are_refused_at_the_door() -> None:
    """Absurd numbers (E·A beyond float range) never reach the element: the model refuses them."""
    with pytest.raises(ModelError) as caught:
        BracedFrame(modulus=1e300, column_area=1e300)
    assert caught.value.path == "modulus"


@pytest.mark.parametrize(
    "displacements", [[0.01], [0.01, 0.02, 0.03], [0.01, math.nan], ["a", "b"], [[0.0, 0.0]]]
)
def test_bad_displacements_raise_model_error(displacements) -> None:
    with pytest.raises(ModelError) as caught:
        member_forces(BracedFrame(), 6.0, (4.0, 3.5), displacements)
    assert caught.value.path == "displacements"
