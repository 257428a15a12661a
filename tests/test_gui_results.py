"""Results tables: contents from the core's results, row clicks that show a level, an element or a
mode, and copying as tab-separated text."""

from __future__ import annotations

import dataclasses

import pytest
from PySide6.QtGui import QGuiApplication

from app.panels.results import elements_table, modes_table, storeys_table
from app.panels.verdicts import worst
from app.resources import sample_path
from core.lateral.records import Check, Status, Verdict
from core.model.fileio import load_project
from tests.helpers import make_window


@pytest.fixture
def window(qtbot, tmp_path):
    return make_window(qtbot, tmp_path, load_project(sample_path("residential_8_storey_walls")))


def click_row(table, row: int) -> None:
    table.clicked.emit(table.rows_model.index(row, 0))


def test_tables_hold_the_core_results(window):
    results = window.document.results
    tables = window.tables
    assert tables.modes.rows_model.rowCount() == len(results.modes)
    assert tables.storeys.rows_model.rowCount() == len(results.lateral.storeys)
    first = tables.modes.rows_model.rows[0]
    assert float(first[1]) == pytest.approx(results.modes[0].period, abs=5e-4)
    top = tables.storeys.rows_model.rows[-1]
    assert float(top[16]) == pytest.approx(results.lateral.storeys[-1].torsion_ratio[0], abs=5e-4)


def test_row_clicks_show_the_level_element_or_mode(window, qtbot):
    tables = window.tables
    click_row(tables.storeys, 4)
    assert window.document.current_level == 5
    with qtbot.waitSignal(window.document.mode_selected) as blocker:
        click_row(tables.modes, 2)
    assert blocker.args == [3] and window.document.current_mode == 3
    rows = tables.elements.rows_model.rows
    index = next(i for i, r in enumerate(rows) if r[0] == "W3" and r[1] == "2")
    click_row(tables.elements, index)
    assert window.document.selection == ("W3",) and window.document.current_level == 2
    assert window.scene.element_items["W3"].selected


def test_copy_gives_tab_separated_text(window):
    table = window.tables.storeys
    text = table.copy()
    lines = text.strip().split("\n")
    assert lines[0].split("\t")[:3] == ["Storey", "Level", "h, m"]
    assert len(lines) == 1 + len(window.document.results.lateral.storeys)
    assert QGuiApplication.clipboard().text() == text
    table.selectRow(1)
    assert table.copy().strip().split("\n")[1].split("\t")[0] == "2"


def test_the_worst_verdict_is_the_one_nearest_failing():
    def verdict(value, limit, status, storey):
        return Verdict(Check.DRIFT, value, limit, status, "clause", storey)

    drifts = [verdict(0.002, 0.005, Status.PASS, 1), verdict(0.004, 0.005, Status.PASS, 2)]
    assert worst(drifts).storey == 2
    radii = [verdict(1.5, 1.0, Status.PASS, 1), verdict(1.1, 1.0, Status.PASS, 2), verdict(1.3, 1.0, Status.PASS, 3)]
    assert worst(radii).storey == 2
    mixed = [verdict(0.9, 1.0, Status.FAIL, 1), verdict(0.7, 1.0, Status.FAIL, 2), verdict(1.2, 1.0, Status.PASS, 3)]
    assert worst(mixed).storey == 2


def test_forces_tab_shows_base_shear_and_storey_forces(window):
    tables = window.tables
    lateral = window.document.results.lateral
    assert "Storey forces" in [tables.tabs.tabText(i) for i in range(tables.tabs.count())]
    rows = tables.forces.rows_model.rows
    headers = tables.forces.rows_model.headers
    x = lateral.load("x")
    level_rows = [r for r in rows if r[0].isdigit()]
    assert len(level_rows) == len(window.document.results.floors)
    fx = headers.index("F x, kN")
    assert sum(float(r[fx]) for r in level_rows) == pytest.approx(x.base_shear, rel=1e-3)
    base = next(r for r in rows if r[1] == "base shear")
    assert float(base[headers.index("V x, kN")]) == pytest.approx(x.base_shear, rel=1e-3)


def test_element_shares_tab_says_shares_are_envelopes(window):
    tables = window.tables
    tables.tabs.setCurrentWidget(tables.elements)
    assert "envelope" in tables.tab_note.text() and "100 %" in tables.tab_note.text()
    tables.tabs.setCurrentWidget(tables.storeys)
    assert "100 %" not in tables.tab_note.text()


def test_a_drag_refreshes_the_tab_in_front_and_the_rest_when_shown_or_at_its_end(window, qtbot):
    document, tables = window.document, window.tables
    tables.tabs.setCurrentWidget(tables.storeys)
    project = document.project
    element = project.elements[0]
    dx, dy = -0.4 * element.direction[1], 0.4 * element.direction[0]  # across its line: the shares change
    moved = dataclasses.replace(
        element, start=(element.start[0] + dx, element.start[1] + dy), end=(element.end[0] + dx, element.end[1] + dy)
    )
    trial = dataclasses.replace(project, elements=(moved, *project.elements[1:]))
    before = [list(r) for r in tables.elements.rows_model.rows]
    document.preview(trial)
    document.flush_analysis()
    qtbot.waitUntil(lambda: tables.storeys.rows_model.rows == storeys_table(document.results)[1], timeout=3000)
    assert [list(r) for r in tables.elements.rows_model.rows] == before  # behind: left for later
    tables.tabs.setCurrentWidget(tables.modes)  # shown mid-drag: filled at once
    assert tables.modes.rows_model.rows == modes_table(document.results)[1]
    document.apply(trial, "move")
    document.flush_analysis()
    assert tables.elements.rows_model.rows == elements_table(document.results)[1]
