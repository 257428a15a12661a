"""Whether the code lets the equivalent static method stand: EN 1998-1 §4.3.3.2.1(2), ASCE 7-16
Table 12.6-1 (core/lateral/rules/en1998.py, asce7.py: method_limits)."""

from __future__ import annotations

import dataclasses
import math

import pytest

from core.analysis import analyse
from core.lateral.records import Check, Status
from core.model import Asce7Spectrum, Eurocode8Spectrum, LoadMethod, Project, RuleSet, Settings
from tests.builders import spring_building


def tall_shear_building() -> Project:
    """60 levels of 500 t on 3 m storeys, every storey 48 800 kN/m: T_1 = 2π / (2·√(k/m)·sin(π/242))
    = 24.5 s (uniform fixed-free shear chain, closed form in /work/shared/references.md)."""
    return spring_building([48_800.0] * 60, [500.0] * 60)


def regular_four_storey() -> Project:
    return spring_building([2.0e5] * 4, [100.0] * 4)


def method_verdicts(project: Project, **settings: object):
    project = dataclasses.replace(project, settings=Settings(**settings))  # type: ignore[arg-type]
    results = analyse(project)
    return results, [v for v in results.lateral.verdicts if v.name is Check.STATIC_METHOD]


def test_the_tall_building_has_the_period_of_the_closed_form():
    results = analyse(tall_shear_building())
    omega = 2.0 * math.sqrt(48_800.0 / 500.0) * math.sin(math.pi / (2 * (2 * 60 + 1)))
    assert results.modes[0].period == pytest.approx(2 * math.pi / omega, rel=1e-9)
    assert results.modes[0].period == pytest.approx(24.5, abs=0.05)


def test_en1998_tells_the_60_level_model_the_static_method_does_not_apply():
    _, verdicts = method_verdicts(tall_shear_building(), rule_set=RuleSet.EN1998, load_method=LoadMethod.EN1998)
    assert [v.direction for v in verdicts] == ["x", "y"]
    for v in verdicts:
        # EN 1998-1 §4.3.3.2.1(2)a: T_1 ≤ min(4·T_C, 2.0 s); ground B T_C = 0.5 s (Table 3.2) → 2.0 s.
        assert v.status is Status.FAIL and v.limit == pytest.approx(2.0)
        assert v.value == pytest.approx(24.5, abs=0.05)
        assert "does not apply" in v.note and "§4.3.3.3" in v.note


def test_en1998_period_limit_is_four_corner_periods_on_stiff_ground():
    # Ground A: T_C = 0.4 s (EN 1998-1 Table 3.2) → min(1.6, 2.0) = 1.6 s.
    _, verdicts = method_verdicts(regular_four_storey(), eurocode8=Eurocode8Spectrum(ground_type="A"))
    assert [v.limit for v in verdicts] == pytest.approx([1.6, 1.6])


def test_asce7_tells_the_60_level_model_the_static_method_is_not_permitted():
    _results, verdicts = method_verdicts(tall_shear_building(), rule_set=RuleSet.ASCE7, load_method=LoadMethod.ASCE7)
    for v in verdicts:
        # Table 12.6-1, SDC D: taller than 160 ft with T ≥ 3.5·T_s (T_s = 0.6/1.0 s) → not permitted.
        assert v.status is Status.FAIL and v.limit == pytest.approx(3.5 * 0.6)
        assert "not permitted" in v.note and "160 ft" in v.note


def test_asce7_seismic_design_category_c_permits_it():
    _, verdicts = method_verdicts(
        tall_shear_building(), rule_set=RuleSet.ASCE7, load_method=LoadMethod.ASCE7, asce7=Asce7Spectrum(design_category="C")
    )
    assert all(v.status is Status.PASS for v in verdicts)  # Table 12.6-1: SDC B and C, all structures.


@pytest.mark.parametrize("rule_set", list(RuleSet))
def test_a_regular_four_storey_building_is_told_the_static_method_applies(rule_set):
    _results, verdicts = method_verdicts(regular_four_storey(), rule_set=rule_set)
    assert len(verdicts) == 2
    assert all(v.status is Status.PASS for v in verdicts), [v.note for v in verdicts]
    assert all(v.value < 0.5 for v in verdicts)


def test_a_soft_storey_makes_the_building_irregular_in_elevation():
    # EN 1998-1 §4.3.3.2.1(2)b needs regularity in elevation (§4.2.3.3); storey 1 at half the
    # stiffness of storey 2 is soft by the ASCE 7-16 Table 12.3-2 thresholds Poise uses for it.
    project = spring_building([1.0e5, 2.0e5, 2.0e5, 2.0e5], [100.0] * 4)
    for rule_set in RuleSet:
        _, verdicts = method_verdicts(project, rule_set=rule_set)
        assert all(v.status is Status.FAIL and "soft storey 1" in v.note for v in verdicts)


def test_asce7_low_rise_of_risk_category_ii_is_permitted_despite_irregularity():
    # Table 12.6-1, first row for SDC D–F: risk category I or II buildings of at most two storeys.
    project = spring_building([1.0e5, 2.0e5], [100.0, 100.0])
    _, verdicts = method_verdicts(project, rule_set=RuleSet.ASCE7)
    assert all(v.status is Status.PASS for v in verdicts)
    _, verdicts = method_verdicts(project, rule_set=RuleSet.ASCE7, drift_basis="other_IV")
    assert all(v.status is Status.FAIL for v in verdicts)
