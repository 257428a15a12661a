"""The properties panel's per-storey section table: "same for all" by default, one row per storey
when turned off, shapes from the generic catalogue, one undo step per edit, refusals in place."""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest

from core.model import Element, Level, Project, ShearWall
from core.model.properties import WallStorey
from core.model.sections import steel_shape
from tests.helpers import RECTANGLE_36_18, balanced_box, make_window, settle

SCREENSHOTS = Path(__file__).parent / "screenshots"


def three_storeys() -> Project:
    box = balanced_box()
    levels = tuple(Level(f"L{j}", 3.5, RECTANGLE_36_18) for j in (1, 2, 3))
    elements = (*tuple(replace(e, top=3) for e in box.elements), Element("W1", (6.0, 9.0), (12.0, 9.0), 0, 3, ShearWall()))
    return replace(box, levels=levels, elements=elements)


@pytest.fixture
def window(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, three_storeys())
    return window


def select(window, element_id: str):
    window.document.select([element_id])
    settle(window)
    return window.properties.storeys


def type_cell(table, row: int, label: str, text: str) -> None:
    table.table.item(row, table.column(label)).setText(text)
    settle(table.window())


def test_same_for_all_is_the_default_with_one_row(window):
    table = select(window, "W1")
    assert table.isVisible() and table.same.isChecked()
    assert table.table.rowCount() == 1
    assert table.table.verticalHeaderItem(0).text() == "All storeys"
    type_cell(table, 0, "Thickness", "300")
    wall = window.document.project.element("W1").properties
    assert wall.thickness == pytest.approx(0.3) and wall.storeys == ()
    assert window.document.undo_stack.count() == 1


def test_turning_it_off_gives_each_storey_a_row_top_first_and_each_edit_one_undo_step(window):
    table = select(window, "W1")
    table.same.setChecked(False)
    settle(window)
    assert window.document.undo_stack.count() == 1
    assert window.document.project.element("W1").properties.storeys == (WallStorey(0.25, 0.5),) * 3
    table = window.properties.storeys
    assert [table.table.verticalHeaderItem(r).text() for r in range(3)] == ["L3", "L2", "L1"]
    type_cell(table, 0, "Thickness", "200")  # the top storey
    wall = window.document.project.element("W1").properties
    assert [s.thickness for s in wall.storeys] == pytest.approx([0.25, 0.25, 0.2])
    assert window.document.undo_stack.count() == 2
    period_stepped = window.document.results.modes[0].period
    window.document.undo_stack.undo()
    settle(window)
    assert window.document.results.modes[0].period != period_stepped, "the storey's own value is analysed"
    window.document.undo_stack.redo()
    settle(window)
    table = window.properties.storeys
    table.same.setChecked(True)
    settle(window)
    wall = window.document.project.element("W1").properties
    assert wall.storeys == () and wall.thickness == pytest.approx(0.25), "same for all keeps the lowest storey's"


def test_a_shape_sets_the_figures_and_typing_a_figure_clears_it(window):
    table = select(window, "B1")
    table.same.setChecked(False)
    settle(window)
    table = window.properties.storeys
    box = table.table.cellWidget(2, table.column("Brace"))  # the lowest storey
    box.setCurrentText("CHS 168.3×8")
    box.activated.emit(box.currentIndex())
    settle(window)
    storeys = window.document.project.element("B1").properties.storeys
    assert storeys[0].brace_shape == "CHS 168.3×8"
    assert storeys[0].brace_area == pytest.approx(steel_shape("CHS 168.3×8").area)
    table = window.properties.storeys
    assert table.table.item(2, table.column("Brace area")).text() == "4029"
    type_cell(table, 2, "Brace area", "3500")
    storeys = window.document.project.element("B1").properties.storeys
    assert (storeys[0].brace_shape, storeys[0].brace_area) == ("", pytest.approx(3.5e-3))


def test_a_bad_shape_or_value_is_refused_with_its_message(window):
    table = select(window, "B1")
    before = window.document.project
    box = table.table.cellWidget(0, table.column("Column"))
    box.setCurrentText("SHS 100×60")
    box.activated.emit(box.currentIndex())
    settle(window)
    assert window.document.project == before
    assert "too thick" in window.properties.storeys.error_text()
    type_cell(window.properties.storeys, 0, "Column area", "0")
    assert window.document.project == before
    assert "must be from 1 to 1e+10 mm²" in window.properties.storeys.error_text()


def test_a_spring_shows_its_storey_stiffnesses_without_same_for_all(qtbot, tmp_path):
    from core.model import Spring

    project = three_storeys()
    project = replace(project, elements=(*project.elements, Element("S1", (30, 2), (30, 8), 0, 3, Spring((1e5,) * 3))))
    window = make_window(qtbot, tmp_path, project)
    table = select(window, "S1")
    assert table.same.isHidden() and table.table.rowCount() == 3
    type_cell(table, 2, "Storey stiffness", "250000")
    assert window.document.project.element("S1").properties.storey_stiffness == (2.5e5, 1e5, 1e5)


def test_screenshot_of_the_table(window):
    table = select(window, "W1")
    table.same.setChecked(False)
    settle(window)
    type_cell(window.properties.storeys, 0, "Thickness", "200")
    SCREENSHOTS.mkdir(exist_ok=True)
    assert window.properties.storeys.grab().save(str(SCREENSHOTS / "storey_sections_wall.png"))
    table = select(window, "B1")
    table.same.setChecked(False)
    settle(window)
    table = window.properties.storeys
    box = table.table.cellWidget(2, table.column("Brace"))
    box.setCurrentText("CHS 219.1×10")
    box.activated.emit(box.currentIndex())
    settle(window)
    assert window.properties.storeys.grab().save(str(SCREENSHOTS / "storey_sections_braced.png"))
