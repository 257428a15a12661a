"""Undo and redo: every edit is one step, undo restores the model exactly, redo re-applies it."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

from tests.helpers import balanced_box, drag, make_window, settle


def test_undo_restores_exactly_and_redo_reapplies(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    document = window.document
    states = [document.project]

    window.drawing.set_tool("place-shear_wall")
    drag(window, (10.0, 18.0), (10.0, 12.0))  # a wall, one step
    states.append(document.project)
    window.drawing.set_tool("select")
    drag(window, (18.0, 0.0), (24.0, 0.0))  # move B3 by its middle, one step
    states.append(document.project)
    window.plan_view.setFocus()
    for _ in range(4):
        QTest.keyClick(window.plan_view, Qt.Key.Key_Up)  # four nudges of B3: one step
    settle(window)
    states.append(document.project)
    window.levels.add_level_action.trigger()
    states.append(document.project)
    window.document.select(["B1"])
    window.edits.delete_action.trigger()
    states.append(document.project)

    assert document.undo_stack.count() == len(states) - 1
    assert document.project.element("B3").start == (21.0, 4.0)
    for expected in reversed(states[:-1]):
        window.edits.undo_action.trigger()
        assert document.project == expected
    assert document.project is states[0] or document.project == states[0]
    for expected in states[1:]:
        window.edits.redo_action.trigger()
        assert document.project == expected


def test_modified_marker_follows_the_undo_stack(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    assert not window.isWindowModified()
    window.document.select(["B2"])
    window.edits.rotate_action.trigger()
    assert window.isWindowModified()
    assert "[*]" in window.windowTitle()
    window.edits.undo_action.trigger()
    assert not window.isWindowModified()


def test_a_drag_back_to_its_start_leaves_no_step(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    start = window.document.project
    drag(window, (0.0, 9.0), (5.0, 9.0), release=False)
    drag(window, (5.0, 9.0), (0.0, 9.0), press=False)
    assert window.document.project == start
    assert window.document.undo_stack.count() == 0


def _type_into(widget, text: str) -> None:
    widget.setFocus()
    widget.selectAll()
    QTest.keyClicks(widget, text)
    QTest.keyClick(widget, Qt.Key.Key_Return)
    settle(widget.window())


def _active(qtbot, window):
    window.activateWindow()
    qtbot.waitActive(window)


def test_enter_commits_a_field_and_hands_the_keyboard_back_to_the_plan(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    _active(qtbot, window)
    field = window.levels_panel.form.editor("Storey height")
    _type_into(field, "4.25")
    assert window.document.project.levels[0].height == 4.25
    assert window.plan_view.hasFocus(), "the next W reaches the plan's tools, not the field"
    _type_into(field, "nonsense")
    assert field.hasFocus(), "a refused value keeps the field, to be corrected"


def test_project_undo_and_redo_work_with_the_keyboard_in_a_field(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    _active(qtbot, window)
    document = window.document
    form = window.levels_panel.form
    _type_into(form.editor("Storey height"), "4.25")
    field = form.editor("Seismic weight")
    field.setFocus()
    QTest.keyClick(field, Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier)
    settle(window)
    assert document.project.levels[0].height == 3.5, "Ctrl+Z in a field is the project's undo"
    QTest.keyClick(field, Qt.Key.Key_Y, Qt.KeyboardModifier.ControlModifier)
    settle(window)
    assert document.project.levels[0].height == 4.25, "Ctrl+Y redoes"
    window.edits.undo_action.trigger()
    QTest.keyClick(field, Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier | Qt.KeyboardModifier.ShiftModifier)
    settle(window)
    assert document.project.levels[0].height == 4.25, "Ctrl+Shift+Z redoes too"


def test_a_corrected_value_clears_the_stale_message(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    form = window.levels_panel.form
    _type_into(form.editor("Storey height"), "w6")
    assert "not a number" in form.error_text("Storey height")
    _type_into(form.editor("Storey height"), "3.5")  # the value it already had
    assert form.error_text("Storey height") == ""
    options = window.tool_options
    window.drawing.set_tool("place-shear_wall")
    options.fields[0].setText("w6")
    options.enter()
    assert "not a number" in options.message.text()
    QTest.keyClicks(options.fields[0], "")
    options.fields[0].setFocus()
    QTest.keyClick(options.fields[0], Qt.Key.Key_Backspace)
    assert options.message.text() == "", "editing the value clears the old complaint"
