"""Lateral checks against hand methods and the bundled unbalanced sample.

1. A one-storey rectangular building with shear walls, worked by hand with the classic
   single-storey centre-of-rigidity method: x_r = Σk_y·x / Σk_y, y_r = Σk_x·y / Σk_x,
   K_θ = Σk_y(x − x_r)² + Σk_x(y − y_r)² about the centre of rigidity (e.g. Paulay & Priestley,
   Seismic Design of Reinforced Concrete and Masonry Buildings, 1992, ch. 5 [memory for the
   chapter]); r_x = √(K_θ/K_y), r_y = √(K_θ/K_x) and l_s = √(I_p/m) = √((L² + B²)/12) for a
   uniform rectangle (EN 1998-1 §4.2.3.2(6); docs/sources.md). Wall stiffness from the Timoshenko
   cantilever δ = h³/(3EI) + h/(κGA), κ = 5/6 (docs/sources.md).
2. The torsion ratio of the same building by rigid-floor statics about the centre of rigidity.
3. The unbalanced sample office: moving its braced frame B2 east, toward balance, lowers the
   largest torsion ratio; the value is recomputed independently with numpy from K.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from app.resources import sample_path
from core.analysis import analyse
from core.lateral.loads import vertical_distribution
from core.model import Element, Level, LoadMethod, Project, Settings, ShearWall
from core.model.fileio import load_project
from core.solve.assembly import GRAVITY, assemble_stiffness, floor_masses

WALL = ShearWall()
H = 4.0
L, B = 30.0, 18.0


def timoshenko_stiffness(length: float) -> float:
    """Tip stiffness of a cracked cantilever wall (EN 1998-1 §4.3.1(7) factor on EI and GA)."""
    E = WALL.stiffness_factor * WALL.modulus
    G = E / (2 * (1 + WALL.poisson))
    return 1.0 / (
        H**3 / (3 * E * WALL.thickness * length**3 / 12) + H / (5 / 6 * G * WALL.thickness * length)
    )


Y_WALLS = {"W1": (0.0, 3.0, 6.0), "W2": (30.0, 6.0, 4.0), "W5": (22.0, 8.0, 6.0)}  # x, y start, length
X_WALLS = {"W3": (10.0, 0.0, 5.0), "W4": (12.0, 18.0, 8.0)}  # x start, y, length


def one_storey_walls() -> Project:
    elements = [Element(i, (x, y), (x, y + n), 0, 1, WALL) for i, (x, y, n) in Y_WALLS.items()]
    elements += [Element(i, (x, y), (x + n, y), 0, 1, WALL) for i, (x, y, n) in X_WALLS.items()]
    level = Level("Roof", H, ((0, 0), (L, 0), (L, B), (0, B)), seismic_weight=8.0)
    settings = Settings(load_method=LoadMethod.COEFFICIENT, base_shear_coefficient=0.15)
    return Project(levels=(level,), elements=tuple(elements), settings=settings)


def hand_figures() -> dict[str, float]:
    ky = {i: timoshenko_stiffness(n) for i, (_, _, n) in Y_WALLS.items()}
    kx = {i: timoshenko_stiffness(n) for i, (_, _, n) in X_WALLS.items()}
    Ky, Kx = sum(ky.values()), sum(kx.values())
    x_r = sum(ky[i] * Y_WALLS[i][0] for i in ky) / Ky
    y_r = sum(kx[i] * X_WALLS[i][1] for i in kx) / Kx
    K_theta = sum(ky[i] * (Y_WALLS[i][0] - x_r) ** 2 for i in ky) + sum(
        kx[i] * (X_WALLS[i][1] - y_r) ** 2 for i in kx
    )
    return {"Kx": Kx, "Ky": Ky, "x_r": x_r, "y_r": y_r, "K_theta": K_theta}


def test_one_storey_walls_centres_and_radii_by_hand():
    hand = hand_figures()
    lateral = analyse(one_storey_walls()).lateral
    storey = lateral.storey(1)
    # Mass centre of a uniform rectangle: its centroid.
    assert storey.mass_centre == pytest.approx((15.0, 9.0), abs=1e-12)
    assert storey.rigidity_centre == pytest.approx((hand["x_r"], hand["y_r"]), rel=1e-9)
    # For one storey the no-twist centre (b) is the storey centre (a) (EN 1998-1 §4.2.3.2(8) [memory]).
    assert storey.no_twist_centre == pytest.approx((hand["x_r"], hand["y_r"]), rel=1e-9)
    assert storey.lateral_stiffness == pytest.approx((hand["Kx"], hand["Ky"]), rel=1e-9)
    assert storey.torsional_stiffness == pytest.approx(hand["K_theta"], rel=1e-9)
    r_x = math.sqrt(hand["K_theta"] / hand["Ky"])
    r_y = math.sqrt(hand["K_theta"] / hand["Kx"])
    assert storey.torsional_radius == pytest.approx((r_x, r_y), rel=1e-9)
    l_s = math.sqrt((L**2 + B**2) / 12)
    assert storey.radius_of_gyration == pytest.approx(l_s, rel=1e-12)
    e0x, e0y = hand["x_r"] - 15.0, hand["y_r"] - 9.0
    assert storey.eccentricity == pytest.approx((e0x, e0y), rel=1e-9)
    assert storey.eccentricity_ratio == pytest.approx((abs(e0x) / r_x, abs(e0y) / r_y), rel=1e-9)
    assert storey.radius_ratio == pytest.approx((r_x / l_s, r_y / l_s), rel=1e-9)
    # EN 1998-1 §4.2.3.2(6) verdicts carry the clause and follow e_0 ≤ 0.30 r, r ≥ l_s.
    for v in lateral.verdicts:
        if v.name == "eccentricity over torsional radius":
            assert v.clause == "EN 1998-1 §4.2.3.2(6) Eq. 4.1a"
            assert (v.status.value == "pass") == (v.value <= 0.30)


def test_one_storey_walls_torsion_ratio_by_statics():
    # Rigid floor about the centre of rigidity: u_c = F/K, θ = F·arm/K_θ; drift along the load at
    # the two extreme edges; ratio = max |δ| / |mean δ| (ASCE 7-16 Table 12.3-1).
    hand = hand_figures()
    lateral = analyse(one_storey_walls()).lateral
    for case in lateral.cases:
        s = case.case.sign
        if case.case.direction == "y":
            x_force = 15.0 + case.case.eccentricity_sign * 0.05 * L
            theta = s * (x_force - hand["x_r"]) / hand["K_theta"]
            ends = [s / hand["Ky"] + theta * (x - hand["x_r"]) for x in (0.0, L)]
        else:
            y_force = 9.0 + case.case.eccentricity_sign * 0.05 * B
            theta = -s * (y_force - hand["y_r"]) / hand["K_theta"]
            ends = [s / hand["Kx"] - theta * (y - hand["y_r"]) for y in (0.0, B)]
        expected = max(abs(e) for e in ends) / abs(sum(ends) / 2)
        assert case.torsion_ratio[0] == pytest.approx(expected, rel=1e-9), case.case.name
        V = abs(case.forces[0])
        assert case.end_drifts[0] == pytest.approx(np.array(ends) * V, rel=1e-9)
    assert lateral.load("x").base_shear == pytest.approx(0.15 * 8.0 * L * B, rel=1e-12)
    assert lateral.storey(1).mass_centre == pytest.approx((15.0, 9.0))
    assert floor_masses(one_storey_walls())[0].mass == pytest.approx(8.0 * L * B / GRAVITY)


def _with_b2_at(project: Project, x: float) -> Project:
    elements = tuple(
        dataclasses.replace(e, start=(x, e.start[1]), end=(x, e.end[1])) if e.id == "B2" else e
        for e in project.elements
    )
    return dataclasses.replace(project, elements=elements)


def _independent_torsion_ratio(project: Project, storey: int) -> float:
    """Case '+y, e+' of ``storey`` from K by numpy: forces of the EN 1998-1 §4.3.3.2.3 pattern at
    x_m + 0.05·L_x on every floor, drifts at the outline's lowest and highest x."""
    results = analyse(project)
    floors = floor_masses(project)
    K = assemble_stiffness(project, floors)
    n = len(floors)
    masses = np.array([f.mass for f in floors])
    z = np.array([f.elevation for f in floors])
    forces = vertical_distribution(results.lateral.load("y").base_shear, masses, z)
    f = np.zeros(3 * n)
    for j, level in enumerate(project.levels):
        xs = [p[0] for p in level.outline]
        e = 0.05 * (max(xs) - min(xs))
        f[3 * j + 1] = forces[j]
        f[3 * j + 2] = e * forces[j]
    u = np.linalg.solve(K, f).reshape(n, 3)
    xs = [p[0] for p in project.levels[storey - 1].outline]
    ends = []
    for x in (min(xs), max(xs)):
        top = u[storey - 1, 1] + u[storey - 1, 2] * (x - floors[storey - 1].centre[0])
        below = 0.0
        if storey > 1:
            below = u[storey - 2, 1] + u[storey - 2, 2] * (x - floors[storey - 2].centre[0])
        ends.append(top - below)
    return max(abs(d) for d in ends) / abs(sum(ends) / 2)


def test_moving_a_frame_toward_balance_lowers_the_torsion_ratio():
    sample = load_project(sample_path("office_5_storey_braced"))
    b2 = sample.element("B2")
    assert b2.start[0] == b2.end[0]  # a frame along y that can slide east
    positions = [b2.start[0], b2.start[0] + 8.0, b2.start[0] + 16.0]
    worst = []
    for x in positions:
        project = _with_b2_at(sample, x)
        lateral = analyse(project).lateral
        worst.append(max(lateral.worst_torsion_ratio("x"), lateral.worst_torsion_ratio("y")))
        # The '+y, e+' ratio of the ground storey, independently from K.
        case = next(c for c in lateral.cases if c.case.name == "+y, e+")
        assert case.torsion_ratio[0] == pytest.approx(_independent_torsion_ratio(project, 1), rel=1e-9)
    assert worst[0] > worst[1] > worst[2]
    assert worst[0] > 1.4  # the sample is unbalanced on purpose (ASCE 7 type 1b)
