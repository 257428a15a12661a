"""``poise map`` and ``poise suggest``: summary, CSV equal to the core map, PNG written, bad input."""

from __future__ import annotations

import csv
import math

import numpy as np
from PySide6.QtGui import QImage

from app.cli import main
from app.resources import sample_path
from app.units import LENGTH
from core.guidance.measures import Measure
from core.guidance.position_map import position_map
from core.guidance.suggestion import suggest
from core.model.fileio import load_project
from core.report.summary import CAUTION

RESIDENTIAL = sample_path("residential_8_storey_walls")


def test_map_prints_a_summary(capsys) -> None:
    assert main(["map", str(RESIDENTIAL), "--element", "W3", "--steps", "20"]) == 0
    out = capsys.readouterr().out
    assert "worst torsion ratio with W3 moved" in out and "lowest:" in out and CAUTION in out


def test_map_csv_equals_the_core_map(tmp_path, capsys) -> None:
    out = tmp_path / "map.csv"
    assert main(["map", str(RESIDENTIAL), "--element", "W5", "--measure", "eccentricity", "--steps", "12",
                 "--csv", str(out)]) == 0
    rows = list(csv.reader(out.open(encoding="utf-8")))
    assert rows[0] == ["x (m)", "y (m)", "largest e₀/r"]
    expected = position_map(load_project(RESIDENTIAL), "W5", Measure.ECCENTRICITY, 12)
    assert len(rows) - 1 == expected.values.size
    for row, value in zip(rows[1:], expected.values.ravel(), strict=True):
        if np.isfinite(value):
            assert math.isclose(float(row[2]), value, abs_tol=5e-4)
        else:
            assert row[2] == ""


def test_map_png_is_written(tmp_path, capsys) -> None:
    out = tmp_path / "map.png"
    assert main(["map", str(RESIDENTIAL), "--element", "W5", "--steps", "16", "--png", str(out)]) == 0
    image = QImage(str(out))
    assert image.width() == 1200 and image.height() == 900


def test_suggest_prints_the_core_suggestion(capsys) -> None:
    assert main(["suggest", str(RESIDENTIAL), "--element", "W5", "--steps", "16"]) == 0
    out = capsys.readouterr().out
    found = suggest(load_project(RESIDENTIAL), "W5", steps=16)
    assert f"move W5 to ({LENGTH.show(found.start[0])}, {LENGTH.show(found.start[1])})" in out
    assert "now →" in out and CAUTION in out


def test_bad_input_is_one_line_and_exit_2(tmp_path, capsys) -> None:
    assert main(["map", str(RESIDENTIAL), "--element", "Q9"]) == 2
    assert "no element 'Q9'" in capsys.readouterr().err
    assert main(["suggest", str(RESIDENTIAL), "--element", "W5", "--on", "grid"]) == 2
    assert "grid spacing" in capsys.readouterr().err
    assert main(["map", str(RESIDENTIAL), "--element", "W5", "--steps", "1"]) == 2
    assert "--steps" in capsys.readouterr().err
