"""Condensed lateral stiffness of each element kind against independent references.

1. OpenSeesPy (an independent general FE library) on the same planar models: 2D, ndm = 2, ndf = 3,
   floors made rigid with ``equalDOF`` on the lateral DOF, ``Truss`` braces and columns,
   ``elasticBeamColumn`` frame members (``-release`` for the chevron beams' pinned ends),
   ``ElasticTimoshenkoBeam`` walls. Its matrix is the inverse of the flexibility found by a unit
   load at each floor in turn. The acceptance bound is 0.1 %; being the same model, the two agree
   to rounding (about 1e-14), so the tests hold them to 1e-8: a modelling slip worth a fraction of
   a per cent (a chevron beam made continuous over the columns moves K by 1e-4) cannot hide.
   The member forces are compared too.
2. Closed forms, each with its source named beside it.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass, field
from types import ModuleType

import numpy as np
import pytest

from core.elements import condensed_stiffness, member_forces
from core.model import BracedFrame, BracePattern, MomentFrame, ShearWall, Spring
from tests.reference.opensees_loader import load_opensees

AGREEMENT = 1e-8
"""Relative to the largest entry of the reference matrix (far inside the required 0.1 %)."""


@pytest.fixture(scope="module")
def ops() -> ModuleType:
    return load_opensees()


# --------------------------------------------------------------------------------------------
# OpenSees models of the same planar elements
# --------------------------------------------------------------------------------------------


@dataclass
class Tags:
    """Node tags of each floor's retained node and element tags by role, storey-major."""

    masters: list[int] = field(default_factory=list)
    braces: list[list[int]] = field(default_factory=list)
    columns: list[list[int]] = field(default_factory=list)
    beams: list[list[int]] = field(default_factory=list)
    walls: list[int] = field(default_factory=list)


def _elevations(heights: tuple[float, ...]) -> list[float]:
    return [0.0, *np.cumsum(heights).tolist()]


def _node_grid(ops: ModuleType, bays: int, width: float, heights: tuple[float, ...], base_fix: tuple) -> list:
    z = _elevations(heights)
    grid = []
    for i, zi in enumerate(z):
        row = []
        for k in range(bays + 1):
            tag = 100 * i + k + 1
            ops.node(tag, k * width, zi)
            row.append(tag)
        grid.append(row)
    for tag in grid[0]:
        ops.fix(tag, *base_fix)
    return grid


def _rigid_floors(ops: ModuleType, grid: list, extra: dict[int, list[int]], tags: Tags) -> None:
    """equalDOF on the lateral DOF: the first node of each floor is retained, all others follow."""
    for i in range(1, len(grid)):
        master = grid[i][0]
        tags.masters.append(master)
        for slave in grid[i][1:] + extra.get(i, []):
            ops.equalDOF(master, slave, 1)


def opensees_braced(ops: ModuleType, frame: BracedFrame, length: float, heights: tuple[float, ...]) -> Tags:
    width = length / frame.bays
    z = _elevations(heights)
    n = len(heights)
    grid = _node_grid(ops, frame.bays, width, heights, (1, 1, 1))
    for row in grid[1:]:
        for tag in row:
            ops.fix(tag, 0, 0, 1)  # only trusses (or released beam ends) meet here: no rotation stiffness
    ops.uniaxialMaterial("Elastic", 1, frame.modulus)
    ops.geomTransf("Linear", 1)
    tags = Tags()
    apexes: dict[int, list[int]] = {}
    ele = iter(range(1, 100_000))
    for i in range(n):
        tags.columns.append([])
        for k in range(frame.bays + 1):
            tag = next(ele)
            ops.element("Truss", tag, grid[i][k], grid[i + 1][k], frame.column_area, 1)
            tags.columns[i].append(tag)
        tags.braces.append([])
        for k in range(frame.bays):
            lower, upper = grid[i], grid[i + 1]
            rising, falling = (lower[k], upper[k + 1]), (lower[k + 1], upper[k])
            if frame.pattern is BracePattern.CHEVRON:
                apex = 10_000 + 100 * (i + 1) + k
                ops.node(apex, (k + 0.5) * width, z[i + 1])
                apexes.setdefault(i + 1, []).append(apex)
                ops.element(
                    "elasticBeamColumn", next(ele), upper[k], apex, frame.beam_area, frame.modulus,
                    frame.beam_inertia, 1, "-release", 1,
                )  # fmt: skip
                ops.element(
                    "elasticBeamColumn", next(ele), apex, upper[k + 1], frame.beam_area, frame.modulus,
                    frame.beam_inertia, 1, "-release", 2,
                )  # fmt: skip
                pairs = [(lower[k], apex), (lower[k + 1], apex)]
            else:
                # Pin-ended floor beams: under a rigid floor they add nothing, which this shows.
                ops.element("Truss", next(ele), upper[k], upper[k + 1], frame.beam_area, 1)
                if frame.pattern is BracePattern.SINGLE:
                    pairs = [rising if i % 2 == 0 else falling]
                else:
                    pairs = [rising] if frame.tension_only else [rising, falling]
            for a, b in pairs:
                tag = next(ele)
                ops.element("Truss", tag, a, b, frame.brace_area, 1)
                tags.braces[i].append(tag)
    _rigid_floors(ops, grid, apexes, tags)
    return tags


def opensees_wall(ops: ModuleType, wall: ShearWall, length: float, heights: tuple[float, ...]) -> Tags:
    t, f = wall.thickness, wall.stiffness_factor
    E = wall.modulus
    G = E / (2 * (1 + wall.poisson))
    ops.geomTransf("Linear", 1)
    tags = Tags()
    for i, zi in enumerate(_elevations(heights)):
        ops.node(i + 1, length / 2, zi)
    ops.fix(1, 1, 1, 1)
    for i in range(len(heights)):
        ops.element(
            "ElasticTimoshenkoBeam", i + 1, i + 1, i + 2, f * E, f * G, t * length, t * length**3 / 12,
            5 / 6 * t * length, 1,
        )  # fmt: skip
        tags.walls.append(i + 1)
        tags.masters.append(i + 2)
    return tags


def opensees_moment_frame(
    ops: ModuleType, frame: MomentFrame, length: float, heights: tuple[float, ...]
) -> Tags:
    width = length / frame.bays
    grid = _node_grid(ops, frame.bays, width, heights, (1, 1, 1))
    ops.geomTransf("Linear", 1)
    E, f = frame.modulus, frame.stiffness_factor
    tags = Tags()
    ele = iter(range(1, 100_000))
    for i in range(len(heights)):
        tags.columns.append([])
        for k in range(frame.bays + 1):
            tag = next(ele)
            ops.element(
                "elasticBeamColumn", tag, grid[i][k], grid[i + 1][k], frame.column_area, E,
                f * frame.column_inertia, 1,
            )  # fmt: skip
            tags.columns[i].append(tag)
        tags.beams.append([])
        for k in range(frame.bays):
            tag = next(ele)
            ops.element(
                "elasticBeamColumn", tag, grid[i + 1][k], grid[i + 1][k + 1], frame.beam_area, E,
                f * frame.beam_inertia, 1,
            )  # fmt: skip
            tags.beams[i].append(tag)
    _rigid_floors(ops, grid, {}, tags)
    return tags


BUILDERS: dict[type, Callable[..., Tags]] = {
    BracedFrame: opensees_braced,
    ShearWall: opensees_wall,
    MomentFrame: opensees_moment_frame,
}


def solve_opensees(ops: ModuleType, properties, length: float, heights: tuple[float, ...], loads) -> Tags:
    """Build the OpenSees model, apply lateral ``loads`` (kN) at the floors and solve (linear static)."""
    ops.wipe()
    ops.model("basic", "-ndm", 2, "-ndf", 3)
    tags = BUILDERS[type(properties)](ops, properties, length, heights)
    ops.timeSeries("Linear", 1)
    ops.pattern("Plain", 1, 1)
    for master, load in zip(tags.masters, loads, strict=True):
        if load:
            ops.load(master, float(load), 0.0, 0.0)
    ops.constraints("Transformation")
    ops.numberer("RCM")
    ops.system("FullGeneral")
    ops.algorithm("Linear")
    ops.integrator("LoadControl", 1.0)
    ops.analysis("Static")
    assert ops.analyze(1) == 0, "OpenSees static analysis failed"
    return tags


def opensees_stiffness(ops: ModuleType, properties, length: float, heights: tuple[float, ...]) -> np.ndarray:
    """K = F⁻¹, F column by column from a unit lateral load at each floor's retained node."""
    n = len(heights)
    F = np.empty((n, n))
    for j in range(n):
        tags = solve_opensees(ops, properties, length, heights, np.eye(n)[j])
        F[:, j] = [ops.nodeDisp(m, 1) for m in tags.masters]
    return np.linalg.inv(F)


def relative_difference(K: np.ndarray, reference: np.ndarray) -> float:
    return float(np.abs(K - reference).max() / np.abs(reference).max())


UNEQUAL = (4.5, 3.5, 3.5, 3.0)
CONCRETE_FRAME = MomentFrame(
    bays=3, modulus=3.3e7, column_inertia=0.0108, column_area=0.36, beam_inertia=0.0114, beam_area=0.28,
    stiffness_factor=0.5,
)  # fmt: skip

OPENSEES_CASES = {
    "single 1 bay 1 storey": (BracedFrame(pattern=BracePattern.SINGLE), 6.0, (4.0,)),
    "single 2 bays 4 storeys": (BracedFrame(pattern=BracePattern.SINGLE, bays=2), 12.0, UNEQUAL),
    "cross 1 bay 1 storey": (BracedFrame(pattern=BracePattern.CROSS), 6.0, (4.0,)),
    "cross 3 bays 4 storeys": (
        BracedFrame(pattern=BracePattern.CROSS, bays=3, brace_area=5e-3),
        15.0,
        UNEQUAL,
    ),
    "cross tension-only 2 bays 3 storeys": (
        BracedFrame(pattern=BracePattern.CROSS, bays=2, tension_only=True),
        14.0,
        (4.0, 3.5, 3.5),
    ),
    "chevron 1 bay 1 storey": (BracedFrame(pattern=BracePattern.CHEVRON, beam_inertia=1e-4), 7.2, (3.6,)),
    "chevron 2 bays 4 storeys": (BracedFrame(pattern=BracePattern.CHEVRON, bays=2), 16.0, UNEQUAL),
    "chevron 3 bays 4 storeys": (BracedFrame(pattern=BracePattern.CHEVRON, bays=3), 18.0, UNEQUAL),
    "wall 1 storey": (ShearWall(), 5.0, (3.5,)),
    "wall 4 storeys": (ShearWall(thickness=0.3, stiffness_factor=0.7), 6.5, UNEQUAL),
    "moment frame 2 bays 3 storeys": (MomentFrame(bays=2), 12.0, (4.2, 3.6, 3.6)),
    "concrete moment frame 3 bays 4 storeys": (CONCRETE_FRAME, 18.0, UNEQUAL),
}


@pytest.mark.parametrize("case", OPENSEES_CASES)
def test_stiffness_matches_opensees(ops: ModuleType, case: str) -> None:
    properties, length, heights = OPENSEES_CASES[case]
    reference = opensees_stiffness(ops, properties, length, heights)
    K = condensed_stiffness(properties, length, heights)
    assert relative_difference(K, reference) < AGREEMENT
    np.testing.assert_allclose(np.diag(K), np.diag(reference), rtol=AGREEMENT)


FORCE_CASES = {
    "cross 2 bays 3 storeys": (BracedFrame(bays=2), 12.0, (4.0, 3.5, 3.5)),
    "single 2 bays 4 storeys": (BracedFrame(pattern=BracePattern.SINGLE, bays=2), 12.0, UNEQUAL),
    "chevron 2 bays 3 storeys": (BracedFrame(pattern=BracePattern.CHEVRON, bays=2), 16.0, (4.0, 3.5, 3.5)),
    "moment frame 2 bays 3 storeys": (MomentFrame(bays=2), 12.0, (4.2, 3.6, 3.6)),
    "wall 4 storeys": (ShearWall(), 6.0, UNEQUAL),
}


@pytest.mark.parametrize("case", FORCE_CASES)
def test_member_forces_match_opensees(ops: ModuleType, case: str) -> None:
    """Feed OpenSees' floor displacements to member_forces; member forces must match its own."""
    properties, length, heights = FORCE_CASES[case]
    n = len(heights)
    loads = 100.0 * np.arange(1, n + 1)  # kN, an inverted-triangle pattern
    tags = solve_opensees(ops, properties, length, heights, loads)
    d = np.array([ops.nodeDisp(m, 1) for m in tags.masters])
    forces = member_forces(properties, length, heights, d)
    scale = loads.sum()

    def close(ours, theirs, scale_of):
        np.testing.assert_allclose(ours, theirs, rtol=AGREEMENT, atol=AGREEMENT * scale_of)

    close(forces.storey_shear, np.cumsum(loads[::-1])[::-1], scale)
    if tags.braces:
        close(forces.brace_axial, [[ops.basicForce(t)[0] for t in row] for row in tags.braces], scale)
    if isinstance(properties, BracedFrame):
        close(forces.column_axial, [[ops.basicForce(t)[0] for t in row] for row in tags.columns], scale)
    if isinstance(properties, MomentFrame):
        local = {t: ops.eleResponse(t, "localForce") for row in tags.columns + tags.beams for t in row}
        column_moment = [[max(abs(local[t][2]), abs(local[t][5])) for t in row] for row in tags.columns]
        base_moment = sum(loads * np.array(_elevations(heights)[1:]))
        close(forces.column_moment, column_moment, base_moment)
        close(forces.column_axial, [[local[t][3] for t in row] for row in tags.columns], scale)
        # OpenSees' local end moments act counter-clockwise on the member; sagging = −M_i, +M_j.
        close(
            forces.beam_moment,
            [[(-local[t][2], local[t][5]) for t in row] for row in tags.beams],
            base_moment,
        )
    if tags.walls:
        local = [ops.eleResponse(t, "localForce") for t in tags.walls]
        close(
            forces.overturning_moment, [f[2] for f in local], sum(loads * np.array(_elevations(heights)[1:]))
        )
        close(forces.storey_shear, [f[1] for f in local], scale)  # local y of a vertical member is −x


# --------------------------------------------------------------------------------------------
# Closed forms
# --------------------------------------------------------------------------------------------

RIGID_AREA = 1.0e3
"""m², a column or beam area large enough to act as axially rigid."""


def test_single_diagonal_with_rigid_columns() -> None:
    """Standard truss result k = EA cos²θ / L_brace; docs/sources.md: E = 200 GPa, A = 2000 mm²,
    bay 6 m, storey 4 m → 3.8402e7 N/m = 3.8402e4 kN/m."""
    frame = BracedFrame(pattern=BracePattern.SINGLE, modulus=2.0e8, brace_area=2.0e-3, column_area=RIGID_AREA)
    k = condensed_stiffness(frame, 6.0, (4.0,))[0, 0]
    brace = math.hypot(6.0, 4.0)
    assert k == pytest.approx(2.0e8 * 2.0e-3 * (6.0 / brace) ** 2 / brace, rel=1e-5)
    assert k == pytest.approx(3.8402e4, rel=1e-4)


def test_cross_and_chevron_with_rigid_members() -> None:
    """Standard truss result k = Σ EA cos²θ / L over the braces: X → two diagonals of the bay; chevron
    (rigid beam) → two braces to mid-span; X tension-only → one diagonal, as the single pattern."""
    E, A, b, h = 2.0e8, 3.0e-3, 6.0, 4.0
    diagonal = math.hypot(b, h)
    half = math.hypot(b / 2, h)
    common = {"modulus": E, "brace_area": A, "column_area": RIGID_AREA}
    cross = BracedFrame(pattern=BracePattern.CROSS, **common)
    tension = BracedFrame(pattern=BracePattern.CROSS, tension_only=True, **common)
    chevron = BracedFrame(pattern=BracePattern.CHEVRON, beam_inertia=1.0e3, **common)
    assert condensed_stiffness(cross, b, (h,))[0, 0] == pytest.approx(
        2 * E * A * (b / diagonal) ** 2 / diagonal, rel=1e-5
    )
    assert condensed_stiffness(tension, b, (h,))[0, 0] == pytest.approx(
        E * A * (b / diagonal) ** 2 / diagonal, rel=1e-5
    )
    assert condensed_stiffness(chevron, b, (h,))[0, 0] == pytest.approx(
        2 * E * A * (b / 2 / half) ** 2 / half, rel=1e-5
    )


def test_chevron_beam_flexure() -> None:
    """One symmetric bay under lateral load deforms antisymmetrically about its mid-line, so the
    apex does not move vertically and the beam does not bend: its inertia has no effect. Over two
    bays the column shortening differs bay to bay, the apex moves, and a softer beam gives a softer
    frame (statics of symmetric structures, standard result; checks of direction)."""
    heights = (4.0, 3.5, 3.5)

    def k(bays: int, inertia: float) -> np.ndarray:
        frame = BracedFrame(pattern=BracePattern.CHEVRON, bays=bays, beam_inertia=inertia)
        return np.diag(condensed_stiffness(frame, 6.0 * bays, heights))

    np.testing.assert_allclose(k(1, 1.0e-5), k(1, 1.0e3), rtol=1e-9)
    assert np.all(k(2, 1.0e-5) < (1 - 1e-4) * k(2, 1.0e3))


@pytest.mark.parametrize(
    ("rho", "coefficient"),
    [(0.25, 96 / 7), (1e-9, 6.0), (1e9, 24.0)],
    ids=["rho=1/4", "rho->0", "rho->inf"],
)
def test_portal_frame(rho: float, coefficient: float) -> None:
    """Chopra, Dynamics of Structures, Eq. 1.3.5 [from memory, unconfirmed]:
    k = (24EI_c/h³)(12ρ + 1)/(12ρ + 4), ρ = Σ(EI_b/L_b)/Σ(EI_c/h); ρ = ¼ → 13.714 EI_c/h³,
    limits 6 (two cantilevers) and 24 (two fixed–fixed columns); axially rigid members."""
    h, L, Ic = 3.5, 7.0, 2.0e-4
    Ib = rho * 2 * (Ic / h) * L
    frame = MomentFrame(column_inertia=Ic, beam_inertia=Ib, column_area=RIGID_AREA, beam_area=RIGID_AREA)
    k = condensed_stiffness(frame, L, (h,))[0, 0]
    EIc = frame.modulus * Ic
    assert k == pytest.approx(24 * EIc / h**3 * (12 * rho + 1) / (12 * rho + 4), rel=1e-6)
    assert k == pytest.approx(coefficient * EIc / h**3, rel=1e-6)


def test_moment_frame_with_rigid_beams_is_a_shear_chain() -> None:
    """Rigid beams and axially rigid columns: each storey is (bays + 1) fixed–fixed columns,
    k_i = (bays + 1)·12EI/h_i³ (standard beam theory), in a series chain."""
    heights = (4.0, 3.2, 3.0)
    frame = MomentFrame(bays=2, beam_inertia=1.0e3, column_area=RIGID_AREA, beam_area=RIGID_AREA)
    k = np.array([3 * 12 * frame.modulus * frame.column_inertia / h**3 for h in heights])
    expected = np.diag(k + np.append(k[1:], 0)) - np.diag(k[1:], 1) - np.diag(k[1:], -1)
    np.testing.assert_allclose(
        condensed_stiffness(frame, 10.0, heights), expected, rtol=1e-6, atol=1e-6 * k.max()
    )


def _wall_sections(wall: ShearWall, length: float) -> tuple[float, float]:
    E, G = wall.modulus, wall.modulus / (2 * (1 + wall.poisson))
    EI = wall.stiffness_factor * E * wall.thickness * length**3 / 12
    kGA = wall.stiffness_factor * 5 / 6 * G * wall.thickness * length
    return EI, kGA


def test_wall_tip_deflection() -> None:
    """Timoshenko cantilever under a tip load P: δ = PH³/(3EI) + PH/(κGA), κ = 5/6
    (standard beam theory, docs/sources.md); EI and κGA both times the cracking factor
    (EN 1998-1 §4.3.1(7))."""
    wall, L, H = ShearWall(), 4.0, 3.2
    EI, kGA = _wall_sections(wall, L)
    k = condensed_stiffness(wall, L, (H,))[0, 0]
    assert 1 / k == pytest.approx(H**3 / (3 * EI) + H / kGA, rel=1e-10)


def test_wall_multi_storey_flexibility() -> None:
    """Cantilever flexibility f_ij = a²(3b − a)/(6EI) + a/(κGA), a = min(z_i, z_j),
    b = max(z_i, z_j) (standard beam theory, docs/sources.md); K = F⁻¹."""
    wall, L = ShearWall(thickness=0.3, poisson=0.15, stiffness_factor=0.6), 6.0
    EI, kGA = _wall_sections(wall, L)
    z = np.cumsum(UNEQUAL)
    a, b = np.minimum.outer(z, z), np.maximum.outer(z, z)
    F = a**2 * (3 * b - a) / (6 * EI) + a / kGA
    np.testing.assert_allclose(np.linalg.inv(condensed_stiffness(wall, L, UNEQUAL)), F, rtol=1e-9)


def test_spring_chain() -> None:
    """Springs in series (standard result): f_ij = Σ_(s ≤ min(i, j)) 1/k_s; K is tridiagonal."""
    k = np.array([8.0e4, 6.0e4, 5.0e4, 2.0e4])
    K = condensed_stiffness(Spring(tuple(k)), 3.0, UNEQUAL)
    index = np.minimum.outer(np.arange(4), np.arange(4))
    F = np.cumsum(1 / k)[index]
    np.testing.assert_allclose(np.linalg.inv(K), F, rtol=1e-12)
    np.testing.assert_array_equal(K[np.abs(np.subtract.outer(range(4), range(4))) > 1], 0.0)
