"""The properties and level forms: valid values apply as one undo step, invalid ones are refused in
place with the model's message and leave the model untouched."""

from __future__ import annotations

from dataclasses import replace

import pytest
from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

from core.model import ShearWall
from tests.helpers import balanced_box, make_window, settle


@pytest.fixture
def window(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    window.document.select(["B1"])
    settle(window)
    return window


def type_into(widget, text: str) -> None:
    widget.setFocus()
    widget.selectAll()
    QTest.keyClicks(widget, text)
    QTest.keyClick(widget, Qt.Key.Key_Return)
    settle(widget.window())


def type_into_cell(table, row: int, label: str, text: str) -> None:
    """Type ``text`` into the per-storey table's cell as the user's edit would commit it."""
    table.table.item(row, table.column(label)).setText(text)
    settle(table.window())


def test_a_valid_section_applies_in_display_units(window):
    table = window.properties.storeys
    type_into_cell(table, 0, "Brace area", "4500")
    assert window.document.project.element("B1").properties.brace_area == pytest.approx(4.5e-3)
    assert table.error_text() == ""
    assert window.document.undo_stack.count() == 1


@pytest.mark.parametrize(
    "text, message", [("-5", "must be from 1 to 1e+10 mm²"), ("lots", "is not a number")]
)
def test_an_invalid_section_is_refused_in_place(window, text, message):
    before = window.document.project
    table = window.properties.storeys
    type_into_cell(table, 0, "Brace area", text)
    assert window.document.project == before
    assert window.document.undo_stack.count() == 0
    assert message in table.error_text()


@pytest.mark.parametrize(
    "label, text, message",
    [
        ("Bays", "0", "whole number from 1 to 20"),
        ("Bays", "2.5", "not a whole number"),
        ("Id", "B2", "is used by another element"),
        ("Id", "  ", "must not be empty"),
        ("Length", "0", "must be a positive number"),
    ],
)
def test_invalid_element_input_is_refused_in_place(window, label, text, message):
    before = window.document.project
    form = window.properties.form
    type_into(form.editor(label), text)
    assert window.document.project == before
    assert window.document.undo_stack.count() == 0
    assert message in form.error_text(label)
    assert form.editor(label).text() == text, "the refused text stays for the user to correct"
    assert form.editor(label).property("refused")


def test_a_refused_level_range_goes_back_with_a_message(qtbot, tmp_path):
    box = balanced_box()
    two = replace(box, levels=(box.levels[0], replace(box.levels[0], name="Level 2")))
    window = make_window(qtbot, tmp_path, two)
    window.document.select(["B1"])  # spans Base → Level 1
    before = window.document.project
    form = window.properties.form
    combo = form.editor("From level")
    combo.setCurrentIndex(1)  # stand on Level 1 while reaching Level 1: refused
    combo.activated.emit(1)
    assert window.document.project == before
    assert "above the bottom level" in form.error_text("From level")
    assert combo.currentText() == "Base", "a refused choice shows the model's value again"
    top = form.editor("To level")
    top.setCurrentIndex(1)
    top.activated.emit(1)
    assert (window.document.project.element("B1").bottom, window.document.project.element("B1").top) == (0, 2)


def test_changing_the_kind_gives_that_kinds_defaults(window):
    combo = window.properties.form.editor("Kind")
    combo.setCurrentIndex(combo.findText("Shear wall"))
    combo.activated.emit(combo.currentIndex())
    element = window.document.project.element("B1")
    assert isinstance(element.properties, ShearWall)
    table = window.properties.storeys
    assert table.table.item(0, table.column("Thickness")).text() == "250"


def test_level_fields_refuse_a_zero_height(window):
    form = window.levels_panel.form
    before = window.document.project
    type_into(form.editor("Storey height"), "0")
    assert window.document.project == before
    assert "must be from 0.1 to 200 m" in form.error_text("Storey height")
    type_into(form.editor("Storey height"), "4.25")
    assert window.document.project.levels[0].height == 4.25
    assert form.error_text("Storey height") == ""


def test_project_settings_are_edited_when_nothing_is_selected(window):
    window.document.select([])
    form = window.properties.form
    type_into(form.editor("Accidental eccentricity"), "10")
    assert window.document.project.settings.accidental_eccentricity == pytest.approx(0.10)
    type_into(form.editor("Accidental eccentricity"), "80")
    assert window.document.project.settings.accidental_eccentricity == pytest.approx(0.10)
    assert "from 0 to 50 %" in form.error_text("Accidental eccentricity")
