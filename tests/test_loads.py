"""Design spectra, base shear, vertical distributions and load cases (core/lateral/loads.py).

Each external value names its source beside it; "[memory]" marks a value recalled, not read in
the standard (see docs/sources.md).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from core.lateral.loads import (
    accidental_eccentricities,
    approximate_period_asce7,
    approximate_period_en1998,
    asce7_design_spectrum,
    asce7_response_coefficient,
    case_load_vector,
    damping_correction,
    distribution_exponent,
    en1998_correction_factor,
    en1998_design,
    en1998_elastic,
    load_cases,
    period_cap_coefficient,
    static_load,
    vertical_distribution,
)
from core.lateral.records import LoadCase
from core.model import (
    Asce7Spectrum,
    Eurocode8Spectrum,
    Level,
    LoadMethod,
    Project,
    Settings,
    SystemType,
)
from core.results import FloorMass
from core.solve.assembly import GRAVITY

# --- EN 1998-1 §3.2.2 -------------------------------------------------------------------------

GROUND_B = Eurocode8Spectrum(ag=0.25, ground_type="B", spectrum_type=1, behaviour_factor=4.0)


@pytest.mark.parametrize(
    ("period", "expected"),
    [
        # EN 1998-1 §3.2.2.2 Eqs. 3.2–3.5, Table 3.2 ground B (S = 1.2, T_B 0.15, T_C 0.5, T_D 2.0),
        # η = 1 at 5 %; check values (docs/sources.md): S_e(0) = 0.30 g, plateau 0.75 g, S_e(0.8) = 0.46875 g.
        (0.0, 0.30),
        (0.075, 0.30 * (1 + 0.5 * (2.5 - 1))),  # half-way up the rising branch: 0.525 g
        (0.15, 0.75),  # T_B
        (0.5, 0.75),  # T_C
        (0.8, 0.46875),
        (2.0, 0.75 * 0.5 / 2.0),  # T_D: 0.1875 g
        (3.0, 0.75 * 0.5 * 2.0 / 9.0),  # beyond T_D: 0.08333 g
    ],
)
def test_en1998_elastic_spectrum_ground_b(period, expected):
    assert en1998_elastic(period, GROUND_B) == pytest.approx(expected, rel=1e-12)


def test_damping_correction():
    # EN 1998-1 §3.2.2.2(3) Eq. 3.6: η = √(10/(5 + ξ)) ≥ 0.55.
    assert damping_correction(5.0) == pytest.approx(1.0)
    assert damping_correction(10.0) == pytest.approx(math.sqrt(10 / 15))
    assert damping_correction(30.0) == pytest.approx(0.55)  # √(10/35) = 0.5345 < 0.55
    ground_b = Eurocode8Spectrum(ag=0.25, ground_type="B")
    # On the plateau S_e = a_g·S·η·2.5 (Eq. 3.3): 0.75 g at 5 %, times η at 10 %.
    assert en1998_elastic(0.3, ground_b, damping_percent=10.0) == pytest.approx(0.75 * math.sqrt(10 / 15))


@pytest.mark.parametrize(
    ("period", "expected"),
    [
        # EN 1998-1 §3.2.2.5(4) Eqs. 3.13–3.16 with q = 4, β = 0.2: a_g·S = 0.30 g.
        (0.0, 0.30 * 2 / 3),
        (0.15, 0.30 * 2.5 / 4),  # plateau 0.1875 g
        (0.5, 0.1875),
        (1.0, 0.1875 * 0.5 / 1.0),
        (2.5, max(0.1875 * 0.5 * 2.0 / 2.5**2, 0.2 * 0.25)),  # 0.03 g < β·a_g = 0.05 g
        (3.5, 0.05),
    ],
)
def test_en1998_design_spectrum(period, expected):
    assert en1998_design(period, GROUND_B) == pytest.approx(expected, rel=1e-12)


def test_en1998_type_2_spectrum():
    # EN 1998-1 Table 3.3 ground B: S = 1.35, T_B 0.05, T_C 0.25, T_D 1.2 [memory].
    spectrum = Eurocode8Spectrum(ag=0.1, ground_type="B", spectrum_type=2)
    assert en1998_elastic(0.1, spectrum) == pytest.approx(0.1 * 1.35 * 2.5)
    assert en1998_elastic(0.5, spectrum) == pytest.approx(0.1 * 1.35 * 2.5 * 0.25 / 0.5)
    assert en1998_elastic(2.0, spectrum) == pytest.approx(0.1 * 1.35 * 2.5 * 0.25 * 1.2 / 4.0)


def test_en1998_correction_factor():
    # EN 1998-1 §4.3.3.2.2(1): λ = 0.85 if T_1 ≤ 2 T_C and more than two storeys, else 1.0.
    assert en1998_correction_factor(1.0, GROUND_B, storeys=3) == 0.85
    assert en1998_correction_factor(1.01, GROUND_B, storeys=3) == 1.0
    assert en1998_correction_factor(0.5, GROUND_B, storeys=2) == 1.0


def test_en1998_approximate_period():
    # EN 1998-1 §4.3.3.2.2(3) Eq. 4.6, C_t = 0.085 steel moment frames, 0.050 others [memory].
    assert approximate_period_en1998(20.0, SystemType.STEEL_MOMENT) == pytest.approx(0.085 * 20**0.75)
    assert approximate_period_en1998(20.0, SystemType.OTHER) == pytest.approx(0.05 * 9.4574, rel=1e-4)


# --- ASCE 7 ------------------------------------------------------------------------------------

ASCE = Asce7Spectrum(sds=1.0, sd1=0.6, s1=0.6, long_period=8.0, response_modification=8.0, importance=1.0)


def test_asce7_response_coefficient_worked_case():
    # check (docs/sources.md): S_DS = 1.0, S_D1 = 0.6, R = 8, I_e = 1, T = 1.2 s → C_s = 0.0625
    # (ASCE 7-16 §12.8.1.1 Eq. 12.8-3 governs: 0.6 / (1.2 · 8)).
    assert asce7_response_coefficient(1.2, ASCE) == pytest.approx(0.0625, rel=1e-12)


def test_asce7_response_coefficient_caps_and_floors():
    # ASCE 7-16 Eq. 12.8-2: short periods give S_DS/(R/I_e) = 0.125.
    assert asce7_response_coefficient(0.3, ASCE) == pytest.approx(0.125)
    # Beyond T_L (Eq. 12.8-4) 0.6·8/(10²·8) = 0.006, raised to the floors: 0.044·S_DS·I_e = 0.044
    # (Eq. 12.8-5) over 0.5·S_1/(R/I_e) = 0.0375 (Eq. 12.8-6) [memory for the floors].
    assert asce7_response_coefficient(10.0, ASCE) == pytest.approx(0.044)
    strong = Asce7Spectrum(sds=1.0, sd1=0.6, s1=1.0, response_modification=8.0)
    assert asce7_response_coefficient(10.0, strong) == pytest.approx(0.0625)  # 0.5·1.0/8


def test_asce7_design_spectrum():
    # ASCE 7-16 §11.4.6: T_0 = 0.2·S_D1/S_DS = 0.12 s, T_S = 0.6 s.
    assert asce7_design_spectrum(0.0, ASCE) == pytest.approx(0.4)
    assert asce7_design_spectrum(0.06, ASCE) == pytest.approx(0.7)
    assert asce7_design_spectrum(0.4, ASCE) == pytest.approx(1.0)
    assert asce7_design_spectrum(1.2, ASCE) == pytest.approx(0.5)
    assert asce7_design_spectrum(10.0, ASCE) == pytest.approx(0.6 * 8.0 / 100.0)


def test_asce7_approximate_period_and_cap():
    # ASCE 7-16 Eq. 12.8-7 with Table 12.8-2 (SI): steel moment frames 0.0724·h^0.8.
    assert approximate_period_asce7(20.0, SystemType.STEEL_MOMENT) == pytest.approx(0.0724 * 20**0.8)
    # All other systems, h_n = 16 m: 0.0488·16^0.75 = 0.0488·8 = 0.3904 s.
    assert approximate_period_asce7(16.0, SystemType.OTHER) == pytest.approx(0.3904)
    # Table 12.8-1 C_u: 1.4 at S_D1 ≥ 0.4, 1.7 at ≤ 0.1, 1.45 half-way between 0.2 (1.5) and 0.3 (1.4).
    assert period_cap_coefficient(0.6) == pytest.approx(1.4)
    assert period_cap_coefficient(0.05) == pytest.approx(1.7)
    assert period_cap_coefficient(0.25) == pytest.approx(1.45)


@pytest.mark.parametrize(("period", "k"), [(0.3, 1.0), (0.5, 1.0), (1.0, 1.25), (2.5, 2.0), (4.0, 2.0)])
def test_asce7_distribution_exponent(period, k):
    # ASCE 7-16 §12.8.3: k = 1 up to 0.5 s, 2 from 2.5 s, linear between (k(1.0 s) = 1.25).
    assert distribution_exponent(period) == pytest.approx(k)


# --- vertical distribution of a 5-storey building ----------------------------------------------

MASSES = np.array([500.0, 500.0, 500.0, 500.0, 400.0])
ELEVATIONS = np.array([4.0, 7.0, 10.0, 13.0, 16.0])


def test_en1998_vertical_distribution_by_hand():
    # EN 1998-1 §4.3.3.2.3 Eq. 4.11: F_i = F_b·z_i·m_i/Σ z_j·m_j; Σ z·m = 500·34 + 400·16 = 23400.
    forces = vertical_distribution(1000.0, MASSES, ELEVATIONS)
    expected = 1000.0 * np.array([2000, 3500, 5000, 6500, 6400]) / 23400
    assert forces == pytest.approx(expected, rel=1e-12)
    assert forces.sum() == pytest.approx(1000.0)


def test_asce7_vertical_distribution_by_hand():
    # ASCE 7-16 Eqs. 12.8-11/12.8-12 with k = 1.25 (T = 1.0 s): C_vx = w_x h_x^k / Σ w_i h_i^k.
    k = 1.25
    weights = [500 * 4**k, 500 * 7**k, 500 * 10**k, 500 * 13**k, 400 * 16**k]
    expected = [800.0 * w / sum(weights) for w in weights]
    forces = vertical_distribution(800.0, MASSES, ELEVATIONS, exponent=k)
    assert forces == pytest.approx(expected, rel=1e-12)
    # The top force share grows with k: 16^1.25 weighs more than 16^1.
    assert forces[-1] / 800.0 > 6400 / 23400


def _floors() -> tuple[FloorMass, ...]:
    return tuple(
        FloorMass(j + 1, f"L{j + 1}", float(z), 300.0, float(m), (10.0, 5.0), float(m) * 100.0)
        for j, (m, z) in enumerate(zip(MASSES, ELEVATIONS, strict=True))
    )


def test_static_load_en1998_base_shear():
    # EN 1998-1 Eq. 4.5: F_b = S_d(T_1)·m·λ. T_1 = 0.6 s on ground B, q = 4: S_d = 0.1875·0.5/0.6 g,
    # λ = 0.85 (T_1 ≤ 2 T_C = 1.0 s, five storeys).
    settings = Settings(load_method=LoadMethod.EN1998, eurocode8=GROUND_B)
    load = static_load("x", settings, _floors(), modal_period=0.6)
    sd = 0.1875 * 0.5 / 0.6
    assert load.coefficient == pytest.approx(sd * 0.85)
    assert load.base_shear == pytest.approx(sd * 0.85 * MASSES.sum() * GRAVITY)
    assert load.storey_forces == pytest.approx(vertical_distribution(load.base_shear, MASSES, ELEVATIONS))
    assert load.storey_shears[0] == pytest.approx(load.base_shear)
    assert load.approximate_period_en1998 == pytest.approx(0.05 * 16**0.75)


def test_static_load_asce7_caps_the_period():
    # ASCE 7-16 §12.8.2: T ≤ C_u·T_a = 1.4 · 0.0488·16^0.75 = 0.54656 s; k = 1 + (T − 0.5)/2;
    # C_s = min(S_DS/(R/I_e) = 1/6, S_D1/(T·R/I_e) = 0.183) = 1/6 (R = 6).
    settings = Settings(load_method=LoadMethod.ASCE7, asce7=Asce7Spectrum(sds=1.0, sd1=0.6, s1=0.6))
    load = static_load("y", settings, _floors(), modal_period=1.0)
    assert load.period == pytest.approx(1.4 * 0.3904)
    assert load.distribution_exponent == pytest.approx(1 + (0.54656 - 0.5) / 2)
    assert load.coefficient == pytest.approx(1 / 6)
    assert load.base_shear == pytest.approx(MASSES.sum() * GRAVITY / 6)
    expected = vertical_distribution(load.base_shear, MASSES, ELEVATIONS, load.distribution_exponent)
    assert load.storey_forces == pytest.approx(expected)


def test_static_load_plain_coefficient():
    settings = Settings(load_method=LoadMethod.COEFFICIENT, base_shear_coefficient=0.12)
    load = static_load("x", settings, _floors(), modal_period=0.8)
    assert load.base_shear == pytest.approx(0.12 * MASSES.sum() * GRAVITY)
    assert load.distribution_exponent == 1.0


# --- load cases and accidental eccentricity ----------------------------------------------------


def test_eight_cases_and_the_centred_option():
    cases = load_cases(include_centred=False)
    assert len(cases) == 8
    assert {(c.direction, c.sign, c.eccentricity_sign) for c in cases} == {
        (d, s, e) for d in "xy" for s in (1, -1) for e in (1, -1)
    }
    with_centred = load_cases(include_centred=True)
    assert len(with_centred) == 12
    assert sum(c.eccentricity_sign == 0 for c in with_centred) == 4


def test_accidental_eccentricity_is_five_percent_of_the_perpendicular_dimension():
    # EN 1998-1 §4.3.2(1) Eq. 4.3 and ASCE 7-16 §12.8.4.2: e = ±0.05·L_i, L_i ⟂ to the load.
    level = Level("L1", 3.0, ((0, 0), (40, 0), (40, 10), (0, 10)))
    project = Project(levels=(level,))
    e = accidental_eccentricities(project, 0.05)
    assert e[0] == pytest.approx([0.5, 2.0])  # x loads move along y by 0.05·10; y loads along x by 0.05·40


def test_case_load_vector_moments():
    forces = np.array([10.0, 20.0])
    e = np.array([[0.5, 2.0], [0.5, 2.0]])
    vector, offsets = case_load_vector(LoadCase("+x, e+", "x", 1, 1), forces, e)
    # F_x at y_m + e: moment −e·F_x (θ counter-clockwise positive).
    np.testing.assert_allclose(vector.reshape(2, 3), [[10, 0, -5], [20, 0, -10]])
    np.testing.assert_allclose(offsets, [[0, 0.5], [0, 0.5]])
    vector, offsets = case_load_vector(LoadCase("−y, e−", "y", -1, -1), forces, e)
    # F_y = −10 at x_m − 2: moment (x − x_m)·F_y = (−2)(−10) = +20.
    np.testing.assert_allclose(vector.reshape(2, 3), [[0, -10, 20], [0, -20, 40]])
    np.testing.assert_allclose(offsets, [[-2, 0], [-2, 0]])
