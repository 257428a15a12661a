"""CSV export: every results table opens with Python's csv module and holds the results to ten
significant figures, without float noise."""

from __future__ import annotations

import csv
import math

import pytest
from PySide6.QtCore import QSettings

from app.exchange.csv_export import export_csv, results_tables
from app.exchange.errors import ExchangeError
from app.resources import sample_projects
from core.analysis import analyse
from core.model.fileio import load_project

SAMPLES = sample_projects()


def read_rows(path) -> list[dict[str, str]]:
    with path.open(newline="", encoding="utf-8") as stream:
        return list(csv.DictReader(stream))


def close(expected, absolute: float = 0.0):
    """Equal to the ten significant figures the CSV carries."""
    return pytest.approx(expected, rel=1e-9, abs=absolute)


def number(text: str) -> float:
    return math.nan if text == "" else float(text)


@pytest.fixture(scope="module", params=SAMPLES, ids=lambda p: p.stem)
def exported(request, tmp_path_factory):
    project = load_project(request.param)
    results = analyse(project)
    folder = tmp_path_factory.mktemp(request.param.stem)
    files = export_csv(project, results, folder, "sample")
    return project, results, {p.stem.removeprefix("sample-"): p for p in files}


def test_every_table_is_written_and_parses(exported):
    _, results, files = exported
    tables = results_tables(results)
    assert set(files) == {t.name for t in tables}
    for table in tables:
        with files[table.name].open(newline="", encoding="utf-8") as stream:
            rows = list(csv.reader(stream))
        assert tuple(rows[0]) == table.header
        assert len(rows) - 1 == len(table.rows)
        assert all(len(row) == len(table.header) for row in rows)


def test_floors_match_the_floor_masses(exported):
    _, results, files = exported
    rows = read_rows(files["floors"])
    assert len(rows) == len(results.floors)
    for row, floor in zip(rows, results.floors, strict=True):
        assert int(row["level"]) == floor.level and row["name"] == floor.name
        assert float(row["mass_t"]) == close(floor.mass)  # ten significant figures
        assert (float(row["centre_x_m"]), float(row["centre_y_m"])) == close(floor.centre)
        assert float(row["radius_of_gyration_m"]) == close(floor.radius_of_gyration)


def test_modes_and_shapes_match(exported):
    _, results, files = exported
    rows = read_rows(files["modes"])
    assert [float(r["period_s"]) for r in rows] == close(list(results.periods))
    for row, mode in zip(rows, results.modes, strict=True):
        assert row["kind"] == mode.kind.value
        assert (float(row["cumulative_x"]), float(row["cumulative_y"]), float(row["cumulative_rotation"])) \
            == close(mode.cumulative)
    shapes = read_rows(files["mode_shapes"])
    assert len(shapes) == len(results.modes) * len(results.floors)
    for row in shapes:
        mode = results.modes[int(row["mode"]) - 1]
        floor = int(row["level"]) - 1
        assert [float(row["u_x_m"]), float(row["u_y_m"]), float(row["theta_rad"])] == \
            close(mode.shape[floor].tolist(), absolute=1e-12 * float(abs(mode.shape).max()))


def test_lateral_tables_match(exported):
    _, results, files = exported
    lateral = results.lateral
    storeys = read_rows(files["storeys"])
    for row, storey in zip(storeys, lateral.storeys, strict=True):
        assert number(row["torsion_ratio_x"]) == close(storey.torsion_ratio[0])
        assert number(row["drift_ratio_y"]) == close(storey.drift_ratio[1])
        if storey.rigidity_centre is None:
            assert row["rigidity_centre_x_m"] == ""
        else:
            assert number(row["rigidity_centre_x_m"]) == close(storey.rigidity_centre[0], absolute=1e-9)
        above = row["stiffness_ratio_above_x"]
        expected = storey.stiffness_ratio_above[0]
        assert (above == "" and expected is None) or float(above) == close(expected)
    cases = read_rows(files["load_cases"])
    assert len(cases) == len(lateral.cases) * len(results.floors)
    first = lateral.cases[0]
    assert [float(r["storey_shear_kN"]) for r in cases[: len(results.floors)]] == close(first.storey_shears.tolist())
    loads = read_rows(files["static_loads"])
    assert [float(r["base_shear_kN"]) for r in loads] == close([load.base_shear for load in lateral.loads])
    forces = read_rows(files["storey_forces"])
    assert [float(r["force_x_kN"]) for r in forces] == close(lateral.load("x").storey_forces.tolist())
    checks = read_rows(files["checks"])
    assert [(r["name"], r["status"], r["clause"]) for r in checks] == \
        [(v.name, v.status.value, v.clause) for v in lateral.verdicts]
    envelopes = read_rows(files["element_envelopes"])
    assert len(envelopes) == sum(len(d.storeys) for d in lateral.elements)
    shears = read_rows(files["element_shears"])
    assert len(shears) == sum(len(d.storeys) * len(lateral.cases) for d in lateral.elements)
    braces = read_rows(files["brace_forces"])
    assert len(braces) == sum(d.brace_force_envelope.size for d in lateral.elements)


def test_unwritable_folder_is_an_exchange_error(tmp_path):
    project = load_project(SAMPLES[0])
    blocker = tmp_path / "file"
    blocker.write_text("not a folder")
    with pytest.raises(ExchangeError, match="cannot write CSV files"):
        export_csv(project, analyse(project), blocker / "inside")


def test_default_stem_comes_from_the_project_name(tmp_path):
    project = load_project(SAMPLES[0])
    files = export_csv(project, analyse(project), tmp_path)
    stem = "".join(c if c.isalnum() or c in "-_" else "_" for c in project.name)
    assert all(p.name.startswith(stem + "-") for p in files)


def test_csv_action_writes_into_the_chosen_folder(qtbot, tmp_path, monkeypatch):
    from app.main_window import MainWindow

    window = MainWindow(settings=QSettings(str(tmp_path / "poise.ini"), QSettings.Format.IniFormat))
    qtbot.addWidget(window)
    window.document.reset(load_project(SAMPLES[0]), SAMPLES[0])
    exchange = window.exchange
    monkeypatch.setattr("app.exchange.actions.QFileDialog.getExistingDirectory", lambda *a, **k: str(tmp_path))
    exchange.csv_action.trigger()
    written = sorted(p.name for p in tmp_path.glob("*.csv"))
    assert f"{SAMPLES[0].stem}-modes.csv" in written and len(written) == len(results_tables(window.document.results))


def test_numbers_carry_sensible_significant_figures_without_float_noise(exported):
    """No 12.000000000000002 or 6.8e-20 beside figures of order one: ten significant figures, and
    a figure below 1e-12 of its column's largest is written as 0."""
    _, _, files = exported
    for path in files.values():
        with path.open(newline="", encoding="utf-8") as stream:
            rows = list(csv.reader(stream))[1:]
        columns = list(zip(*rows, strict=True)) if rows else []
        for column in columns:
            values = [float(t) for t in column if _is_number(t)]
            if not values:
                continue
            largest = max(abs(v) for v in values)
            for text in column:
                if _is_number(text):
                    digits = text.lower().split("e")[0].lstrip("-").replace(".", "").lstrip("0")
                    assert len(digits) <= 10, f"{path.name}: {text}"
                    assert float(text) == 0 or abs(float(text)) > 1e-12 * largest, f"{path.name}: {text}"


def _is_number(text: str) -> bool:
    try:
        float(text)
    except ValueError:
        return False
    return text.strip() != "" and text not in ("nan", "inf", "-inf")


def test_export_into_a_folder_that_does_not_exist_creates_it(tmp_path):
    project = load_project(SAMPLES[0])
    folder = tmp_path / "new" / "results"
    files = export_csv(project, analyse(project), folder)
    assert folder.is_dir() and files and all(p.parent == folder for p in files)
