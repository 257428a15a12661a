"""P-Δ: the stability coefficient θ by hand and where 1/(1 − θ) is applied (core/lateral/p_delta.py;
EN 1998-1 §4.4.2.2(2)–(3); ASCE 7-16 §12.8.7)."""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from core.analysis import analyse
from core.lateral.records import Check, Status
from core.model import GRAVITY, Asce7Spectrum, LoadMethod, Project, RuleSet, Settings
from tests.builders import spring_building

K = [1.0e4, 3.0e4]
MASSES = [200.0, 150.0]
HEIGHT = 3.0


def two_storeys(**settings: object) -> Project:
    project = spring_building(K, MASSES)
    base = {"load_method": LoadMethod.COEFFICIENT, "base_shear_coefficient": 0.2}
    return dataclasses.replace(project, settings=Settings(**{**base, **settings}))  # type: ignore[arg-type]


def hand_theta() -> list[float]:
    """θ_j = P_j·d_j/(V_j·h): in a shear building the elastic drift is d_j = V_j/k_j, so θ_j = P_j/(k_j·h)
    with P_j the weight at and above storey j (EN 1998-1 Eq. 4.28 with q_d = 1 for the plain loads)."""
    above = [sum(MASSES), MASSES[1]]
    return [GRAVITY * p / (k * HEIGHT) for p, k in zip(above, K, strict=True)]


def test_theta_by_hand_for_two_storeys():
    lateral = analyse(two_storeys()).lateral
    theta = hand_theta()  # storey 1: 350 t × g / (1e4 · 3) = 0.1144; storey 2: 0.0163
    assert theta[0] == pytest.approx(0.11442, abs=1e-5)
    for j, storey in enumerate(lateral.storeys):
        assert storey.gravity_load == pytest.approx(GRAVITY * sum(MASSES[j:]), rel=1e-12)
        assert storey.stability_coefficient == pytest.approx((theta[j], theta[j]), rel=1e-9)
    # Storey 1 is above 0.10, so amplified by 1/(1 − θ) (EN 1998-1 §4.4.2.2(3)); storey 2 is not.
    assert lateral.storey(1).p_delta_factor == pytest.approx((1 / (1 - theta[0]),) * 2)
    assert lateral.storey(2).p_delta_factor == (1.0, 1.0)
    verdicts = {(v.storey, v.direction): v for v in lateral.verdicts if v.name is Check.STABILITY}
    assert verdicts[(1, "x")].status is Status.PASS and "1/(1 − θ)" in verdicts[(1, "x")].note
    assert verdicts[(1, "x")].limit == 0.30


def test_the_amplification_reaches_the_drift_verdicts_and_the_element_demands_of_that_storey_only():
    amplified = analyse(two_storeys()).lateral
    plain = analyse(two_storeys(gravity_factor=0.5)).lateral  # θ halves: 0.057, below 0.10
    assert plain.storey(1).p_delta_factor == (1.0, 1.0)
    factor = 1 / (1 - hand_theta()[0])
    drift = {(v.storey, v.direction): v.value for v in amplified.verdicts if v.name is Check.DRIFT}
    drift_plain = {(v.storey, v.direction): v.value for v in plain.verdicts if v.name is Check.DRIFT}
    assert drift[(1, "x")] == pytest.approx(factor * drift_plain[(1, "x")], rel=1e-9)
    assert drift[(2, "x")] == pytest.approx(drift_plain[(2, "x")], rel=1e-12)
    # The figures of the load cases stay first-order; the judged drift carries the factor.
    assert amplified.storey(1).drift_ratio == plain.storey(1).drift_ratio
    for element in ("SX1", "SY2"):
        a, p = amplified.element(element), plain.element(element)
        assert a.shear_envelope == pytest.approx(p.shear_envelope * np.array([factor, 1.0]), rel=1e-9)
        assert a.share_envelope == pytest.approx(p.share_envelope, rel=1e-12)


def test_theta_beyond_the_limit_fails():
    # Storey 1 four times softer: θ = 0.458 > 0.30 (EN 1998-1 §4.4.2.2(4)).
    project = dataclasses.replace(two_storeys(), elements=spring_building([2.5e3, 3.0e4], MASSES).elements)
    lateral = analyse(project).lateral
    worst = max((v for v in lateral.verdicts if v.name is Check.STABILITY), key=lambda v: v.value)
    assert worst.value == pytest.approx(4 * hand_theta()[0], rel=1e-9) and worst.status is Status.FAIL
    assert lateral.storey(1).p_delta_factor[0] == pytest.approx(1 / (1 - 0.30))


def test_asce7_theta_uses_the_elastic_drift_and_theta_max():
    # ASCE 7-16 §12.8.7 Eq. 12.8-16: θ = P·Δ·I_e/(V·h·C_d) with Δ = C_d·δ_e/I_e (Eq. 12.8-15),
    # so θ = P·δ_e/(V·h) = P/(k·h) as above, whatever C_d; θ_max = 0.5/(β·C_d) (Eq. 12.8-17, β = 1).
    for cd, status in ((5.0, Status.FAIL), (4.0, Status.PASS)):
        project = two_storeys(
            rule_set=RuleSet.ASCE7, load_method=LoadMethod.ASCE7, asce7=Asce7Spectrum(deflection_amplification=cd)
        )
        lateral = analyse(project).lateral
        verdict = next(v for v in lateral.verdicts if v.name is Check.STABILITY and v.storey == 1)
        assert verdict.value == pytest.approx(hand_theta()[0], rel=1e-9)
        assert verdict.limit == pytest.approx(min(0.5 / cd, 0.25))
        assert verdict.status is status
