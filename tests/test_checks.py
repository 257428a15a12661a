"""Lateral checks: centres, torsion ratio, A_x, drifts, element shares, regularity, mode order,
and the rule sets (core/lateral/centres.py, checks.py, evaluation.py through analyse())."""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from core.analysis import analyse
from core.lateral.centres import element_storey_stiffness
from core.lateral.records import Check, Status
from core.lateral.response import amplification, end_ratio, mass_ratios, stiffness_ratios
from core.model import (
    GRAVITY,
    BracedFrame,
    BracePattern,
    Element,
    Level,
    LoadMethod,
    Project,
    RuleSet,
    Settings,
    ShearWall,
    Spring,
)
from tests.builders import rectangle, spring_building, square

WALL = ShearWall()


def two_wall_building(
    length: float = 24.0,
    depth: float = 12.0,
    storeys: int = 1,
    share: float = 0.05,
    rule_set: RuleSet = RuleSet.ASCE7,
    centred: bool = True,
) -> Project:
    """Doubly symmetric: two equal y-walls on the short edges, two equal x-walls on the x centre
    line (they add no torsional stiffness), so K_y = 2k, K_θ = 2k(L/2)²."""
    levels = tuple(Level(f"L{j + 1}", 3.5, rectangle(length, depth)) for j in range(storeys))
    mid = depth / 2
    elements = (
        Element("WY1", (0.0, mid - 3.0), (0.0, mid + 3.0), 0, storeys, WALL),
        Element("WY2", (length, mid - 3.0), (length, mid + 3.0), 0, storeys, WALL),
        Element("WX1", (length / 2 - 8.0, mid), (length / 2 - 4.0, mid), 0, storeys, WALL),
        Element("WX2", (length / 2 + 4.0, mid), (length / 2 + 8.0, mid), 0, storeys, WALL),
    )
    settings = Settings(
        rule_set=rule_set,
        load_method=LoadMethod.COEFFICIENT,
        accidental_eccentricity=share,
        include_centred_case=centred,
    )
    return Project(levels=levels, elements=elements, settings=settings)


def wall_stiffness(length: float, height: float, wall: ShearWall = WALL) -> float:
    """Timoshenko cantilever, tip load: 1/(h³/(3EI) + h/(κGA)) (docs/sources.md), cracked factor."""
    E = wall.stiffness_factor * wall.modulus
    G = E / (2 * (1 + wall.poisson))
    inertia = wall.thickness * length**3 / 12
    area = wall.thickness * length
    return 1.0 / (height**3 / (3 * E * inertia) + height / (5 / 6 * G * area))


# --- doubly symmetric plans ---------------------------------------------------------------------


def test_doubly_symmetric_centres_coincide_and_centred_ratio_is_one():
    results = analyse(two_wall_building(storeys=3)).lateral
    for storey in results.storeys:
        assert storey.rigidity_centre == pytest.approx((12.0, 6.0), abs=1e-9)
        assert storey.no_twist_centre == pytest.approx((12.0, 6.0), abs=1e-9)
        assert storey.mass_centre == pytest.approx((12.0, 6.0), abs=1e-12)
    for case in results.cases:
        if case.case.eccentricity_sign == 0:
            assert case.torsion_ratio == pytest.approx(np.ones(3), abs=1e-9)
            assert np.abs(case.displacements[:, 2]).max() < 1e-15


@pytest.mark.parametrize("share", [0.05, 0.10])
def test_two_wall_torsion_ratio_matches_closed_form(share):
    # Static equilibrium of the one-storey rigid floor (the derivation of the torsion ratio):
    # y load F at e = s·L: u = F/K_y, θ = F·e/K_θ, end drift u ± θL/2, so
    # ratio = 1 + e·K_y·(L/2)/K_θ = 1 + s·L·2k·(L/2)/(2k·L²/4) = 1 + 2s, whatever k is.
    L, B = 24.0, 12.0
    results = analyse(two_wall_building(L, B, share=share)).lateral
    ky = wall_stiffness(6.0, 3.5)
    kx = wall_stiffness(4.0, 3.5)
    ratio_y = 1 + 2 * share
    # x load at e = s·B: ratio = 1 + s·B·2k_x·(B/2)/(2k_y·L²/4) = 1 + 2s·(k_x/k_y)(B/L)².
    ratio_x = 1 + 2 * share * (kx / ky) * (B / L) ** 2
    for case in results.cases:
        if case.case.eccentricity_sign == 0:
            continue
        expected = ratio_y if case.case.direction == "y" else ratio_x
        assert case.torsion_ratio[0] == pytest.approx(expected, rel=1e-9)
    assert results.worst_torsion_ratio("y") == pytest.approx(ratio_y, rel=1e-9)
    assert results.storey(1).torsional_radius[0] == pytest.approx(L / 2, rel=1e-9)  # r_x = √(K_θ/K_y)


def test_two_wall_element_shares_and_base_moment():
    # Wall forces k(u ± θL/2) = F/2·(1 ± 2s): shares 0.55 and 0.45 at 5 %; one storey, so the
    # wall's base moment is V·h (statics).
    project = two_wall_building(share=0.05, centred=False)
    results = analyse(project).lateral
    wy2 = results.element("WY2")
    assert wy2.share_envelope[0] == pytest.approx(0.55, rel=1e-9)
    base_shear = results.load("y").base_shear
    assert wy2.shear_envelope[0] == pytest.approx(0.55 * base_shear, rel=1e-9)
    assert wy2.base_moment_envelope == pytest.approx(0.55 * base_shear * 3.5, rel=1e-9)
    assert base_shear == pytest.approx(0.1 * 8.0 * 24 * 12, rel=1e-12)  # V = c·W, c = 0.1


def test_asce7_torsion_verdicts_follow_table_12_3_1():
    # ratio = 1 + 2s (closed form above): s = 0.05 → 1.1 pass, 0.15 → 1.3 type 1a, 0.25 → 1.5 type 1b.
    expected = {0.05: Status.PASS, 0.15: Status.WARN, 0.25: Status.FAIL}
    for share, status in expected.items():
        lateral = analyse(two_wall_building(share=share)).lateral
        worst = lateral.worst_torsion
        assert worst is not None and worst.direction == "y"
        assert worst.value == pytest.approx(1 + 2 * share, rel=1e-9)
        assert worst.status is status
        assert "Table 12.3-1" in worst.clause


def test_amplification_of_asce7_12_8_4_3():
    # check (docs/sources.md): ratio 1.414 → A_x = (1.414/1.2)² = 1.388 (ASCE 7-16 Eq. 12.8-14).
    assert amplification(np.array([[1.414, 0.586]]))[0] == pytest.approx(1.3885, abs=1e-4)
    assert amplification(np.array([[1.1, 0.9]]))[0] == 1.0  # not below 1
    assert amplification(np.array([[2.0, 0.0]]))[0] == pytest.approx((2 / 1.2) ** 2)
    assert amplification(np.array([[1.0, -0.9]]))[0] == 3.0  # capped at 3.0


def test_end_ratio_edge_cases():
    assert end_ratio(np.array([[0.0, 0.0]]))[0] == 1.0
    assert math.isinf(end_ratio(np.array([[1.0, -1.0]]))[0])  # pure twist: the average does not move


# --- centres: the two definitions ---------------------------------------------------------------


def unbalanced_building(storeys: int = 4) -> Project:
    """Walls and braced frames (not proportionate), unbalanced in x."""
    levels = tuple(Level(f"L{j + 1}", 3.5, rectangle(30.0, 16.0)) for j in range(storeys))
    frame = BracedFrame(pattern=BracePattern.CROSS)
    elements = (
        Element("W1", (0.0, 2.0), (0.0, 9.0), 0, storeys, WALL),
        Element("B1", (20.0, 5.0), (20.0, 11.0), 0, storeys, frame),
        Element("B2", (4.0, 0.0), (10.0, 0.0), 0, storeys, frame),
        Element("W2", (18.0, 16.0), (24.0, 16.0), 0, storeys, WALL),
    )
    return Project(levels=levels, elements=elements)


def test_no_twist_centre_makes_no_floor_rotate():
    # Definition (b) checked by its own statement: apply the static pattern at the no-twist points
    # of every floor, solve K u = f with numpy, and no floor turns.
    project = unbalanced_building()
    results = analyse(project)
    K = np.asarray(results.stiffness)
    n = len(results.floors)
    for axis, direction in enumerate("xy"):
        pattern = results.lateral.load(direction).storey_forces
        f = np.zeros(3 * n)
        for j, storey in enumerate(results.lateral.storeys):
            offset = np.subtract(storey.no_twist_centre, storey.mass_centre)
            f[3 * j + axis] = pattern[j]
            f[3 * j + 2] = -offset[1] * pattern[j] if direction == "x" else offset[0] * pattern[j]
        u = np.linalg.solve(K, f).reshape(n, 3)
        assert np.abs(u[:, 2]).max() * 30.0 < 1e-9 * np.abs(u[:, axis]).max()
    # The building is not proportionate, so the floor centres move up the height.
    xs = [s.no_twist_centre[0] for s in results.lateral.storeys]
    assert max(xs) - min(xs) > 0.1


def test_proportionate_system_centres_agree():
    # For proportionate systems (all element matrices proportional) the storey centres (a) and the
    # floor centres (b) coincide (Hejal & Chopra 1989; Tso 1990 — docs/sources.md).
    levels = tuple(Level(f"L{j + 1}", 3.2, rectangle(30.0, 20.0)) for j in range(5))
    walls = (
        Element("W1", (0.0, 2.0), (0.0, 8.0), 0, 5, WALL),
        Element("W2", (9.0, 10.0), (9.0, 16.0), 0, 5, WALL),
        Element("W3", (4.0, 20.0), (10.0, 20.0), 0, 5, WALL),
        Element("W4", (20.0, 5.0), (26.0, 5.0), 0, 5, WALL),
        Element("W5", (20.0, 0.0), (26.0, 0.0), 0, 5, WALL),
    )
    lateral = analyse(Project(levels=levels, elements=walls)).lateral
    for storey in lateral.storeys:
        assert storey.no_twist_centre == pytest.approx(storey.rigidity_centre, abs=1e-8)
    # x_r = (0 + 9)/2 for two equal y-walls; y_r = (20 + 5 + 0)/3 for three equal x-walls.
    assert lateral.storey(3).rigidity_centre == pytest.approx((4.5, 25.0 / 3.0), rel=1e-12)


def test_element_storey_stiffness_of_a_shear_chain_is_its_spring():
    # A spring chain's storey shear over storey drift is its own storey stiffness, whatever the load.
    k = np.array([3.0e5, 2.0e5, 1.0e5])
    K = np.diag(k + np.append(k[1:], 0.0)) - np.diag(k[1:], 1) - np.diag(k[1:], -1)
    assert element_storey_stiffness(K, np.array([1.0, 2.0, 3.0])) == pytest.approx(k, rel=1e-12)


# --- drifts -------------------------------------------------------------------------------------


def test_drift_of_a_spring_building_by_hand():
    # Doubly symmetric shear building: the mass-centre drift of storey j is V_j / k_j.
    k = [4.0e5, 3.0e5]
    project = spring_building(k, [200.0, 150.0])
    settings = Settings(load_method=LoadMethod.COEFFICIENT, base_shear_coefficient=0.2, drift_limit=0.001)
    lateral = analyse(Project(levels=project.levels, elements=project.elements, settings=settings)).lateral
    weight = 350.0 * GRAVITY
    forces = 0.2 * weight * np.array([200.0 * 3, 150.0 * 6]) / (200.0 * 3 + 150.0 * 6)
    shears = np.array([forces.sum(), forces[1]])
    expected = shears / np.array(k) / 3.0  # drift ratio, amplification 1 for a plain coefficient
    for j, storey in enumerate(lateral.storeys):
        assert storey.drift_ratio == pytest.approx((expected[j], expected[j]), rel=1e-9)
        assert storey.storey_stiffness == pytest.approx((k[j], k[j]), rel=1e-9)
    drift = [v for v in lateral.verdicts if v.name == "storey drift ratio"]
    assert len(drift) == 4
    for v in drift:
        # EN 1998 rule set: ν = 0.5 applied (EN 1998-1 §4.4.3.2(2)).
        assert v.value == pytest.approx(0.5 * expected[v.storey - 1], rel=1e-9)
        assert v.status is (Status.FAIL if v.value > 0.001 else Status.PASS)


def test_en1998_drifts_are_amplified_by_q():
    # One storey, 3 m, x stiffness 1e5 kN/m in two lines on the edges (no twist under the centred
    # load, the ±e cases twist the floor by the same amount each way).
    def lateral(q: float):
        project = spring_building([1.0e5], [200.0])
        settings = dataclasses.replace(
            project.settings, eurocode8=dataclasses.replace(project.settings.eurocode8, behaviour_factor=q)
        )
        return analyse(dataclasses.replace(project, settings=settings)).lateral

    low, high = lateral(2.0), lateral(4.0)
    for result, q in ((low, 2.0), (high, 4.0)):
        # Elastic drift of a one-storey shear building at the mass centre: d_e = V / k (statics).
        case = result.cases_in("x")[0]
        assert case.drifts[0] == pytest.approx(result.load("x").base_shear / 1.0e5, rel=1e-9)
        # EN 1998-1 §4.3.4(1): d_s = q_d·d_e with q_d = q; the drift ratio is over the 3 m storey.
        assert result.storey(1).drift_ratio[0] == pytest.approx(q * result.load("x").base_shear / 1.0e5 / 3.0)
    # T = 2π√(200 t / 1e5 kN/m) = 0.28 s lies on the plateau T_B ≤ T ≤ T_C of ground B, where the
    # design spectrum is a_g·S·2.5/q (EN 1998-1 Eq. 3.14), so the elastic drift falls as 1/q and the design drift q·d_e does not change with q
    # (the equal-displacement idea behind §4.3.4).
    assert high.load("x").base_shear == pytest.approx(low.load("x").base_shear / 2.0, rel=1e-12)
    assert high.storey(1).drift_ratio[0] == pytest.approx(low.storey(1).drift_ratio[0], rel=1e-12)


# --- vertical regularity -------------------------------------------------------------------------


def test_soft_storey_and_heavy_floor():
    # Shear building: storey 1 has half the stiffness of the storeys above; floor 2 twice the mass.
    k = [1.0e5, 2.0e5, 2.0e5, 2.0e5, 2.0e5]
    m = [100.0, 200.0, 100.0, 100.0, 100.0]
    base = spring_building(k, m)
    for rule_set, soft_status in ((RuleSet.ASCE7, Status.FAIL), (RuleSet.EN1998, Status.WARN)):
        settings = Settings(rule_set=rule_set)
        lateral = analyse(Project(levels=base.levels, elements=base.elements, settings=settings)).lateral
        first = lateral.storey(1)
        assert first.stiffness_ratio_above == pytest.approx((0.5, 0.5), rel=1e-9)
        assert first.stiffness_ratio_average == pytest.approx((0.5, 0.5), rel=1e-9)
        assert lateral.storey(2).mass_ratio == pytest.approx((2.0, 2.0), rel=1e-12)
        soft = [v for v in lateral.verdicts if v.name.startswith("storey stiffness") and v.storey == 1]
        assert {v.status for v in soft} == {soft_status}  # ASCE 7-16 Table 12.3-2 1b: below 60 % / 70 %
        heavy = [v for v in lateral.verdicts if v.name == "mass over adjacent storey" and v.storey == 2]
        assert heavy[0].status is Status.WARN and heavy[0].value == pytest.approx(2.0)
        assert all(v.status is Status.PASS for v in soft if v.storey and v.storey > 1)


def test_regularity_ratios():
    above, average = stiffness_ratios(np.array([1.0, 2.0, 4.0, 4.0, 4.0]))
    assert above[:4] == pytest.approx([0.5, 0.5, 1.0, 1.0]) and math.isnan(above[4])
    assert average[0] == pytest.approx(1.0 / (10.0 / 3.0)) and average[1] == pytest.approx(0.5)
    assert np.isnan(average[2:]).all()
    ratios = mass_ratios(np.array([100.0, 150.0, 75.0]))
    assert ratios[1] == pytest.approx([1.5, 2.0])
    assert math.isnan(ratios[0, 0]) and math.isnan(ratios[2, 1])


# --- modes --------------------------------------------------------------------------------------


def _four_springs(offset: float) -> Project:
    """Square 20 m plan, one spring line per side at ``offset`` from the centre lines."""
    c = 10.0
    lines = {
        "SX1": ((c - 3, c - offset), (c + 3, c - offset)),
        "SX2": ((c - 3, c + offset), (c + 3, c + offset)),
        "SY1": ((c - offset, c - 3), (c - offset, c + 3)),
        "SY2": ((c + offset, c - 3), (c + offset, c + 3)),
    }
    elements = tuple(Element(i, a, b, 0, 1, Spring((1.0e5,))) for i, (a, b) in lines.items())
    return Project(levels=(Level("L1", 3.0, square(20.0)),), elements=elements)


def test_mode_order_flags_a_torsionally_flexible_core():
    # Torsion frequency over translation: ω_θ²/ω_y² = (Σk·d²/J)/(Σk_y/m) = 2k·2d²·m/(2k·J) … for
    # springs 1 m off the centre lines, J/m = 20²/6 = 66.7 m² ≫ 2d² = 2 m²: torsion comes first.
    core = analyse(_four_springs(1.0)).lateral
    assert core.mode_order.first_torsion == 1
    assert core.mode_order.torsion_before_translation
    flagged = [v for v in core.verdicts if v.name is Check.TORSION_MODE_ORDER]
    assert flagged[0].status is Status.WARN and flagged[0].clause.startswith("No code clause")
    # Period ratio: T_θ/T_y = √(J/m / (2d²)) for this layout (same k in every line).
    assert core.mode_order.period_ratio == pytest.approx(math.sqrt((400 / 6) / 2.0), rel=1e-9)
    perimeter = analyse(_four_springs(10.0)).lateral
    assert perimeter.mode_order.first_torsion == 3
    assert not perimeter.mode_order.torsion_before_translation
    assert perimeter.mode_order.period_ratio == pytest.approx(math.sqrt((400 / 6) / 200.0), rel=1e-9)


# --- braces --------------------------------------------------------------------------------------


def test_single_brace_force_is_storey_shear_over_cosine():
    # One storey, single diagonal, pinned joints: horizontal equilibrium of the top gives
    # N·cos α = V for each frame (statics).
    bay, h = 6.0, 4.0
    frame = BracedFrame(pattern=BracePattern.SINGLE)
    levels = (Level("L1", h, rectangle(24.0, 12.0)),)
    elements = (
        Element("BY1", (0.0, 3.0), (0.0, 3.0 + bay), 0, 1, frame),
        Element("BY2", (24.0, 3.0), (24.0, 3.0 + bay), 0, 1, frame),
        Element("BX1", (3.0, 6.0), (3.0 + bay, 6.0), 0, 1, frame),
        Element("BX2", (15.0, 6.0), (15.0 + bay, 6.0), 0, 1, frame),
    )
    lateral = analyse(Project(levels=levels, elements=elements)).lateral
    cos = bay / math.hypot(bay, h)
    for demand in lateral.elements:
        assert demand.brace_force_envelope.shape == (1, 1)
        assert demand.brace_force_envelope[0, 0] == pytest.approx(demand.shear_envelope[0] / cos, rel=1e-9)
    # Two equal frames on the short edges at 5 % eccentricity: share (1 + 2·0.05)/2 = 0.55.
    assert lateral.element("BY2").share_envelope[0] == pytest.approx(0.55, rel=1e-9)


def test_results_carry_sources_and_are_frozen():
    lateral = analyse(two_wall_building()).lateral
    assert lateral.verdicts and all(v.clause for v in lateral.verdicts)
    assert {v.name for v in lateral.verdicts} >= {Check.TORSION_RATIO, Check.DRIFT}
    with pytest.raises(ValueError):
        lateral.cases[0].displacements[0, 0] = 1.0


def test_en1998_drift_verdicts_say_they_judge_the_reduced_design_drift():
    """Under EN 1998-1 the judged figure is ν·d_r/h (§4.4.3.2(1)), not the design drift itself:
    the verdict's note must say so, and its value is ν times the storey's design drift ratio."""
    from app.resources import sample_projects
    from core.model.fileio import load_project

    project = load_project(next(p for p in sample_projects() if "office" in p.stem))
    lateral = analyse(project).lateral
    drifts = [v for v in lateral.verdicts if v.name == Check.DRIFT]
    assert drifts
    nu = project.settings.drift_reduction
    for verdict in drifts:
        assert "ν·d_r" in verdict.note
        storey = next(s for s in lateral.storeys if s.storey == verdict.storey)
        i = "xy".index(verdict.direction)
        # × 1/(1 − θ) where P-Δ amplifies the storey (EN 1998-1 §4.4.2.2(3)).
        assert verdict.value == pytest.approx(nu * storey.drift_ratio[i] * storey.p_delta_factor[i], rel=1e-12)
