"""Level commands (add, insert, duplicate with elements, delete) and the elevation strip."""

from __future__ import annotations

from dataclasses import replace

import pytest
from PySide6.QtCore import QPoint, Qt
from PySide6.QtTest import QTest

from core.model import Element, Level, Project, Spring
from core.model.edits import add_level_on_top, delete_level, duplicate_level, insert_level_below
from tests.helpers import RECTANGLE_36_18, frame, make_window, settle


def three_storeys() -> Project:
    """Levels 1–3; B1 over all three storeys, B2 only in storey 2, S1 (a spring) in storeys 2–3."""
    levels = tuple(Level(f"Level {i}", h, RECTANGLE_36_18) for i, h in ((1, 4.0), (2, 3.5), (3, 3.0)))
    spring = Element("S1", (36.0, 0.0), (36.0, 18.0), 1, 3, Spring(storey_stiffness=(2.0e5, 3.0e5)))
    return Project(
        levels=levels, elements=(frame("B1", (0, 6), (0, 12), 0, 3), frame("B2", (10, 0), (16, 0), 1, 2), spring)
    )


def spans(project: Project) -> dict[str, tuple[int, int]]:
    return {e.id: (e.bottom, e.top) for e in project.elements}


def test_insert_below_splits_the_storeys_elements_pass_through():
    project = insert_level_below(three_storeys(), 2)
    assert [lv.height for lv in project.levels] == [4.0, 3.5, 3.5, 3.0]
    assert spans(project) == {"B1": (0, 4), "B2": (1, 3), "S1": (1, 4)}
    assert project.element("S1").properties.storey_stiffness == (2.0e5, 2.0e5, 3.0e5)


def test_duplicate_carries_the_elements_that_reach_the_level_up():
    project = duplicate_level(three_storeys(), 2)
    assert [lv.name for lv in project.levels] == ["Level 1", "Level 2", "Level 4", "Level 3"]
    # B2 ended at level 2, so it now reaches the copy; B1 and S1 passed through anyway.
    assert spans(project) == {"B1": (0, 4), "B2": (1, 3), "S1": (1, 4)}
    assert project.element("S1").properties.storey_stiffness == (2.0e5, 2.0e5, 3.0e5)


def test_delete_removes_the_storey_and_elements_only_in_it():
    project, removed = delete_level(three_storeys(), 2)
    assert removed == ["B2"]
    assert [lv.name for lv in project.levels] == ["Level 1", "Level 3"]
    assert spans(project) == {"B1": (0, 2), "S1": (1, 2)}
    assert project.element("S1").properties.storey_stiffness == (3.0e5,)


def test_add_on_top_copies_the_top_outline_without_elements():
    project = add_level_on_top(three_storeys())
    assert len(project.levels) == 4 and project.levels[-1].outline == RECTANGLE_36_18
    assert spans(project) == spans(three_storeys())


def test_strip_bands_are_to_scale_and_a_click_picks_the_level(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, three_storeys())
    strip = window.levels_panel.strip
    bands = strip.bands()
    heights = [b.height() for b in bands]
    assert heights[0] / heights[2] == pytest.approx(4.0 / 3.0, rel=1e-6)
    assert bands[0].top() > bands[1].top() > bands[2].top(), "level 1 at the bottom"
    centre = bands[2].center()
    QTest.mouseClick(
        strip, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, QPoint(int(centre.x()), int(centre.y()))
    )
    assert window.document.current_level == 3
    assert set(window.scene.element_items) == {"B1", "S1"}


def test_level_actions_in_the_window_are_undoable(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, three_storeys())
    start = window.document.project
    window.document.set_current_level(2)
    window.levels.duplicate_level_action.trigger()
    assert window.document.current_level == 3 and len(window.document.project.levels) == 4
    window.levels.delete_level_action.trigger()
    window.levels.insert_level_action.trigger()
    window.levels.add_level_action.trigger()
    settle(window)
    for _ in range(4):
        window.edits.undo_action.trigger()
    assert window.document.project == start
    renamed = replace(start.levels[0], name="Ground")
    window.document.set_current_level(1)
    form = window.levels_panel.form
    field = form.editor("Name")
    field.setText("Ground")
    field.editingFinished.emit()
    assert window.document.project.levels[0] == renamed


def test_copy_to_levels_dialog_says_from_and_to_and_offers_only_valid_tops(qtbot):
    from PySide6.QtWidgets import QFormLayout

    from app.copy_levels_dialog import CopySpanDialog
    from core.model import Level, Project

    outline = ((0.0, 0.0), (10.0, 0.0), (10.0, 10.0), (0.0, 10.0))
    project = Project(levels=tuple(Level(f"Level {i}", 3.0, outline) for i in range(1, 5)))
    dialog = CopySpanDialog(None, project)
    qtbot.addWidget(dialog)
    form = dialog.findChild(QFormLayout)
    labels = [form.itemAt(i, QFormLayout.ItemRole.LabelRole).widget().text() for i in range(2)]
    assert "from" in labels[0] and labels[1] == "to"
    dialog.bottom.setCurrentIndex(dialog.bottom.findData(2))
    tops = [dialog.top.itemData(i) for i in range(dialog.top.count())]
    assert tops == [3, 4]
    assert dialog.span() == (2, 3)


def test_a_span_that_misses_the_current_level_is_widened_and_says_so(qtbot, tmp_path):
    from app.tools.place import PlaceElementTool
    from core.model import Level, Project
    from tests.helpers import drag, make_window

    outline = ((0.0, 0.0), (20.0, 0.0), (20.0, 10.0), (0.0, 10.0))
    window = make_window(qtbot, tmp_path, Project(levels=tuple(Level(f"Level {i}", 3.0, outline) for i in (1, 2, 3))))
    window.document.set_current_level(3)
    window.drawing.set_tool("place-shear_wall")
    tool = window.plan_view.tool
    assert isinstance(tool, PlaceElementTool)
    tool.placement.set(0, 2)
    drag(window, (2.0, 2.0), (8.0, 2.0))
    (wall,) = window.document.project.elements
    assert (wall.bottom, wall.top) == (0, 3)
    hint = window.status.hint.text()
    assert "Base to Level 3" in hint and "does not include Level 3" in hint
