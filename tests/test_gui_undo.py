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
