"""The .poise format: round trip, atomic save with backup, and errors that name the bad field."""

from __future__ import annotations

import json

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from core.errors import ModelError
from core.model import (
    BracedFrame,
    BracePattern,
    Element,
    Level,
    MomentFrame,
    PointMass,
    Project,
    ShearWall,
    Spring,
)
from core.model.fileio import FORMAT_VERSION, dumps, load_project, loads, save_project
from tests.builders import rectangle


def full_project() -> Project:
    levels = (
        Level("Ground", 4.2, rectangle(24, 12), ((( 2, 2), (4, 2), (4, 4), (2, 4)),), 7.5, (PointMass(12.5, (20, 6), "tank"),)),
        Level("Roof", 3.6, rectangle(24, 12), seismic_weight=5.0),
    )
    elements = (
        Element("B1", (0.0, 3.0), (0.0, 9.0), 0, 2, BracedFrame(BracePattern.CHEVRON, bays=1)),
        Element("W1", (6.0, 0.0), (12.0, 0.0), 0, 2, ShearWall(thickness=0.3)),
        Element("M1", (0.0, 12.0), (24.0, 12.0), 0, 1, MomentFrame(bays=3)),
        Element("S1", (24.0, 0.0), (24.0, 12.0), 1, 2, Spring((5.0e4,))),
    )
    return Project("Round trip", "J-001", "A. Engineer", "notes\nwith a second line", levels=levels, elements=elements,
                   revision="P2")


def test_save_load_round_trip(tmp_path):
    project = full_project()
    path = tmp_path / "p.poise"
    save_project(project, path)
    assert load_project(path) == project


def test_file_is_tagged_and_diff_friendly(tmp_path):
    text = dumps(full_project())
    document = json.loads(text)
    assert document["format"] == "poise-project" and document["version"] == FORMAT_VERSION
    assert document["units"]["length"] == "m"
    assert '"start": [0.0, 3.0]' in text  # points on one line
    assert dumps(loads(text)) == text  # stable


def test_save_keeps_a_backup_and_leaves_no_temporary(tmp_path):
    path = tmp_path / "p.poise"
    first = full_project()
    save_project(first, path)
    second = Project("Second", levels=first.levels)
    save_project(second, path)
    assert load_project(path) == second
    assert load_project(tmp_path / "p.poise.bak") == first
    assert sorted(p.name for p in tmp_path.iterdir()) == ["p.poise", "p.poise.bak"]


def edited(change) -> str:
    document = json.loads(dumps(full_project()))
    change(document)
    return json.dumps(document)


@pytest.mark.parametrize(
    ("change", "path", "message"),
    [
        (lambda d: d["levels"][1].update(outline=[[0, 0], [10, 10], [10, 0], [0, 10]]), "levels[1].outline", "intersects itself"),
        (lambda d: d["levels"][0].update(height=-3), "levels[0].height", "from 0.1 to 200 m"),
        (lambda d: d["levels"][0].update(height="tall"), "levels[0].height", "expected a number"),
        (lambda d: d["levels"][0].update(hieght=3), "levels[0].hieght", "unknown field"),
        (lambda d: d["levels"][0]["openings"][0].__setitem__(0, [30, 30]), "levels[0].openings[0]", "inside the outline"),
        (lambda d: d["elements"][0].update(kind="tower"), "elements[0].kind", "must be one of"),
        (lambda d: d["elements"][1]["properties"].update(poisson=0.7), "elements[1].properties.poisson", "from 0 to 0.49"),
        (lambda d: d["elements"][2].update(top=7), "elements[2].top", "building has 2"),
        (lambda d: d["elements"][3].update(id="B1"), "elements[3].id", "used by another"),
        (lambda d: d["elements"][0].pop("start"), "elements[0].start", "missing"),
        (lambda d: d["settings"].update(rule_set="nowhere"), "settings.rule_set", "must be one of"),
        (lambda d: d["settings"]["eurocode8"].update(ground_type="Z"), "settings.eurocode8.ground_type", "A, B"),
        (lambda d: d.update(version=FORMAT_VERSION + 1), "version", "update Poise"),
        (lambda d: d.update(format="spreadsheet"), "format", "not a Poise project"),
    ],
)
def test_bad_files_name_the_field(change, path, message):
    with pytest.raises(ModelError) as caught:
        loads(edited(change))
    assert caught.value.path == path
    assert message in str(caught.value)


def test_broken_json_and_missing_file_are_model_errors(tmp_path):
    with pytest.raises(ModelError, match="not valid JSON"):
        loads('{"format": "poise-project",')
    with pytest.raises(ModelError, match="cannot read"):
        load_project(tmp_path / "absent.poise")


coordinates = st.floats(min_value=-1e4, max_value=1e4, allow_nan=False, allow_infinity=False)


@settings(max_examples=60, deadline=None)
@given(x=coordinates, y=coordinates, length=st.floats(0.5, 50.0), height=st.floats(2.0, 8.0))
def test_round_trip_keeps_every_float(x, y, length, height):
    level = Level("L", height, ((x, y), (x + 40.0, y), (x + 40.0, y + 20.0), (x, y + 20.0)))
    element = Element("B", (x + 1.0, y + 1.0), (x + 1.0 + length / 3, y + 1.0), 0, 1)
    project = Project(levels=(level,), elements=(element,))
    assert loads(dumps(project)) == project


def test_bundled_samples_are_canonical_files():
    """Every sample loads, and saving it again reproduces the file byte for byte."""
    from app.resources import sample_projects

    for path in sample_projects():
        assert dumps(load_project(path)) == path.read_text(encoding="utf-8"), path.name
