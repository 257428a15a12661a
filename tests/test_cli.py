"""The ``poise`` command on every sample project, and its handling of bad input."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from app.cli import main
from app.resources import DEFAULT_SAMPLE, sample_path, sample_projects
from core.report.summary import CAUTION

SAMPLES = sample_projects()


def test_the_three_samples_are_bundled():
    names = {p.stem for p in SAMPLES}
    assert {DEFAULT_SAMPLE, "residential_8_storey_walls", "pavilion_1_storey"} <= names
    assert sample_path(DEFAULT_SAMPLE).is_file()


@pytest.mark.parametrize("path", SAMPLES, ids=lambda p: p.stem)
def test_analyse_prints_a_summary(path, capsys):
    assert main(["analyse", str(path)]) == 0
    out = capsys.readouterr().out
    assert "Floors" in out and "Modes" in out and CAUTION in out


@pytest.mark.parametrize("path", SAMPLES, ids=lambda p: p.stem)
def test_analyse_json_is_documented_layout(path, capsys):
    assert main(["analyse", str(path), "--json"]) == 0
    document = json.loads(capsys.readouterr().out)
    assert document["format"] == "poise-results"
    assert document["modes"][0]["period"] > 0
    assert document["modes"][-1]["cumulative"] == pytest.approx([1.0, 1.0, 1.0], abs=1e-9)
    assert {"level", "mass", "centre", "radius_of_gyration"} <= set(document["floors"][0])


def test_bad_file_exits_2_with_one_line(tmp_path):
    bad = tmp_path / "bad.poise"
    bad.write_text('{"format": "poise-project", "version": 1, "levels": [{"name": "L1", "height": -1}]}')
    completed = subprocess.run(
        [sys.executable, "-m", "app", "analyse", str(bad)], capture_output=True, text=True, cwd=Path(__file__).parent.parent
    )
    assert completed.returncode == 2
    assert completed.stderr.count("\n") == 1
    assert "levels[0]" in completed.stderr and "Traceback" not in completed.stderr


def test_missing_file_exits_2(tmp_path, capsys):
    assert main(["analyse", str(tmp_path / "nothing.poise")]) == 2
    assert "cannot read" in capsys.readouterr().err
    assert main([str(tmp_path / "nothing.poise")]) == 2


def test_help_lists_every_command_with_its_purpose(capsys):
    from app.cli import COMMANDS

    with pytest.raises(SystemExit):
        main(["--help"])
    text = capsys.readouterr().out
    assert set(COMMANDS) == {"analyse", "sheet", "map", "suggest"}
    for name in COMMANDS:
        assert f"poise {name}" in text


def test_level_help_names_the_floor_plainly(capsys):
    with pytest.raises(SystemExit):
        main(["sheet", "--help"])
    text = " ".join(capsys.readouterr().out.split())
    assert "1 = lowest floor above the base" in text and "first floor" not in text


def test_samples_name_plainly_invented_people_and_places():
    from core.model.fileio import load_project

    for path in sample_projects():
        project = load_project(path)
        assert project.name.startswith("Sample ") and project.engineer == "A. Engineer"
