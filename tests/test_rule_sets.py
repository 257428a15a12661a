"""Rule sets are objects: a throw-away one judges a sample; each brings its own drift limits; one
code's limits on another code's loads carry a note; user-visible clauses carry no source marks."""

from __future__ import annotations

import dataclasses
import json
from collections.abc import Sequence
from dataclasses import dataclass

import pytest

from app.resources import sample_projects
from core.analysis import analyse
from core.errors import ModelError
from core.lateral.records import Check, CheckGroup, ModeOrder, Status, StoreyLateral, Verdict
from core.lateral.rules import CodeRules, DriftLimit, register_rule_set, rules_for, unregister_rule_set
from core.lateral.rules import en1998 as en1998_rules
from core.lateral.rules.common import drift
from core.model import LoadMethod, Project, RuleSet, Settings
from core.model.fileio import dumps, load_project, loads

OFFICE = next(p for p in sample_projects() if p.stem == "office_5_storey_braced")


@dataclass(frozen=True)
class StrictDrift(CodeRules):
    """An invented rule set for tests: only drift at the mass centre, against a strict limit."""

    parameters: None = None

    def judge(self, settings: Settings, storeys: Sequence[StoreyLateral], order: ModeOrder) -> tuple[Verdict, ...]:
        limit = self.drift_limit(settings).ratio
        return tuple(
            drift(s, i, s.drift_ratio[i], limit, "invented test rule", "at the mass centre")
            for s in storeys
            for i in range(2)
        )


STRICT = StrictDrift(
    name="test_strict",
    title="Strict test limits",
    native_loads=None,
    drift_limits=(DriftLimit("tight", 0.001, "anything", "invented"),),
)


@pytest.fixture
def strict_rules():
    register_rule_set(STRICT)
    yield STRICT
    unregister_rule_set(STRICT.name)


def _with(project: Project, **settings: object) -> Project:
    return dataclasses.replace(project, settings=dataclasses.replace(project.settings, **settings))


def test_a_registered_rule_set_judges_a_sample(strict_rules):
    project = _with(load_project(OFFICE), rule_set="test_strict", drift_limit=None)
    lateral = analyse(project).lateral
    assert lateral.rule_set_title == "Strict test limits"
    assert lateral.drift_limit == 0.001
    assert [v.name for v in lateral.verdicts] == [Check.DRIFT] * (2 * len(project.levels))
    for v in lateral.verdicts:
        figure = lateral.storey(v.storey).drift_ratio[0 if v.direction == "x" else 1]
        assert v.value == figure
        assert v.status is (Status.PASS if figure <= 0.001 else Status.FAIL)
    # The name is a valid setting while registered: saved and read back.
    assert loads(dumps(project)).settings.rule_set == "test_strict"


def test_an_unregistered_rule_set_is_refused():
    with pytest.raises(ModelError, match="rule_set"):
        Settings(rule_set="test_strict")


def test_each_rule_set_brings_its_own_default_drift_limit():
    project = load_project(OFFICE)
    en = analyse(_with(project, rule_set=RuleSet.EN1998, drift_limit=None, drift_basis="")).lateral
    # EN 1998-1 §4.4.3.2(1)a: ν·d_r ≤ 0.005 h with brittle non-structural elements.
    assert en.drift_limit == 0.005 and "§4.4.3.2(1)a" in en.drift_basis
    asce = analyse(_with(project, rule_set=RuleSet.ASCE7, drift_limit=None, drift_basis="")).lateral
    # ASCE 7-16 Table 12.12-1, all other structures, risk category I or II: Δ_a = 0.020 h_sx.
    assert asce.drift_limit == 0.020 and "Table 12.12-1" in asce.drift_basis
    drift_verdicts = [v for v in asce.verdicts if v.name is Check.DRIFT]
    assert {v.limit for v in drift_verdicts} == {0.020}
    assert all("ASCE 7-16" in v.clause for v in drift_verdicts)
    # A row of the other code's table is not used: the rule set's first row applies.
    assert analyse(_with(project, rule_set=RuleSet.ASCE7, drift_limit=None, drift_basis="ductile")).lateral.drift_limit == 0.020
    # Risk category IV (ASCE 7-16 Table 12.12-1): 0.010 h_sx.
    assert rules_for(Settings(rule_set=RuleSet.ASCE7, drift_limit=None, drift_basis="other_IV")).drift_limit(
        Settings(rule_set=RuleSet.ASCE7, drift_limit=None, drift_basis="other_IV")
    ).ratio == 0.010
    own = analyse(_with(project, drift_limit=0.004)).lateral
    assert own.drift_limit == 0.004 and "own" in own.drift_basis


def test_limits_of_one_code_on_loads_of_another_carry_a_note():
    project = load_project(OFFICE)
    assert project.settings.load_method is LoadMethod.EN1998
    assert analyse(project).lateral.notes == ()
    mixed = analyse(_with(project, rule_set=RuleSet.ASCE7)).lateral
    assert len(mixed.notes) == 1 and "ASCE 7-16 limits judge EN 1998-1 loads" in mixed.notes[0]
    plain = analyse(_with(project, rule_set=RuleSet.ASCE7, load_method=LoadMethod.COEFFICIENT)).lateral
    assert plain.notes == ()


def test_a_national_annex_is_the_rule_set_with_other_parameters():
    project = load_project(OFFICE)
    strict_eccentricity = dataclasses.replace(en1998_rules.RULES.parameters, eccentricity_limit=0.0)
    annex = dataclasses.replace(
        en1998_rules.RULES, name="test_annex", title="EN 1998-1 test annex", parameters=strict_eccentricity
    )
    register_rule_set(annex)
    try:
        lateral = analyse(_with(project, rule_set="test_annex")).lateral
    finally:
        unregister_rule_set("test_annex")
    eccentricity = [v for v in lateral.verdicts if v.name is Check.ECCENTRICITY_RATIO]
    assert eccentricity and {v.limit for v in eccentricity} == {0.0}
    assert all(v.status is (Status.PASS if v.value == 0.0 else Status.WARN) for v in eccentricity)


@pytest.mark.parametrize("rule_set", list(RuleSet))
@pytest.mark.parametrize("sample", sample_projects(), ids=lambda p: p.stem)
def test_user_visible_clauses_carry_no_source_marks(sample, rule_set):
    lateral = analyse(_with(load_project(sample), rule_set=rule_set)).lateral
    texts = [t for v in lateral.verdicts for t in (v.clause, v.note)] + [lateral.drift_basis, *lateral.notes]
    for text in texts:
        for mark in ("[memory]", "from memory", "common practice", "no source", "references.md"):
            assert mark not in text


def test_verdict_names_are_checks_with_a_group():
    lateral = analyse(load_project(OFFICE)).lateral
    assert all(isinstance(v.name, Check) for v in lateral.verdicts)
    assert Check.TORSION_RATIO.group is CheckGroup.TORSION and Check.DRIFT.group is CheckGroup.DRIFT


def test_files_with_the_retired_damping_fields_still_load():
    document = json.loads(OFFICE.read_text())
    document["settings"]["damping_ratio"] = 0.07
    document["settings"]["eurocode8"]["damping_percent"] = 7.0
    project = loads(json.dumps(document))
    assert not hasattr(project.settings, "damping_ratio")
    assert not hasattr(project.settings.eurocode8, "damping_percent")
    assert "damping" not in dumps(project)
