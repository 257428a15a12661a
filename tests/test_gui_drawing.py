"""Drawing on the plan with simulated mouse and key events: outlines, openings, elements, corners."""

from __future__ import annotations

import math
from dataclasses import replace

import pytest
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtTest import QTest

from core.model import BracedFrame, ElementKind, Project
from tests.helpers import balanced_box, click, drag, frame, make_window, one_storey, settle, view_point


@pytest.fixture
def window(qtbot, tmp_path):
    return make_window(qtbot, tmp_path, Project())


def test_outline_by_clicks_closes_on_first_corner(window):
    window.drawing.set_tool("polygon-outline")
    window.plan_view.fit(QRectF(-2, -2, 30, 20))
    corners = [(0, 0), (24, 0), (24, 12), (10, 12), (10, 8), (0, 8)]
    for x, y in corners:
        click(window, x + 0.1, y - 0.1)  # off the grid by a little: snapping puts it back
    click(window, 0.05, 0.05)
    settle(window)
    project = window.document.project
    assert len(project.levels) == 1
    assert project.levels[0].outline == tuple((float(x), float(y)) for x, y in corners)
    assert window.document.undo_stack.count() == 1


def test_outline_closes_with_enter_and_backspace_takes_back_a_corner(window):
    window.drawing.set_tool("polygon-outline")
    for x, y in [(0, 0), (20, 0), (25, 5), (20, 10)]:
        click(window, x, y)
    QTest.keyClick(window.plan_view, Qt.Key.Key_Backspace)
    click(window, 0, 10)
    QTest.keyClick(window.plan_view, Qt.Key.Key_Return)
    settle(window)
    assert window.document.project.levels[0].outline == ((0, 0), (20, 0), (25, 5), (0, 10))


def test_self_crossing_outline_is_refused_with_a_message(window):
    window.drawing.set_tool("polygon-outline")
    for x, y in [(0, 0), (10, 10), (10, 0), (0, 10)]:
        click(window, x, y)
    QTest.keyClick(window.plan_view, Qt.Key.Key_Return)
    settle(window)
    assert window.document.project == Project()
    assert "intersects itself" in window.status.hint.text()


def test_rectangle_outline_by_drag_then_braced_frame_by_drag(window):
    window.drawing.set_tool("rectangle-outline")
    drag(window, (0, 0), (30, 15))
    assert window.document.project.levels[0].outline == ((0, 0), (30, 0), (30, 15), (0, 15))
    window.drawing.set_tool("place-braced_frame")
    drag(window, (0, 4), (0, 10))
    project = window.document.project
    (element,) = project.elements
    assert (element.id, element.kind, element.start, element.end) == ("B1", ElementKind.BRACED_FRAME, (0, 4), (0, 10))
    assert (element.bottom, element.top) == (0, 1)
    assert isinstance(element.properties, BracedFrame)
    assert window.document.selection == ("B1",)
    assert window.document.undo_stack.count() == 2


def test_element_by_two_clicks_with_typed_length_and_angle(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, one_storey())
    window.drawing.set_tool("place-shear_wall")
    click(window, 30, 3)
    QTest.keyClick(window.plan_view, "7")  # typing on the plan continues in the length field
    field_length, field_angle = window.tool_options.fields
    assert field_length.hasFocus()
    QTest.keyClicks(field_length, ".5")
    QTest.keyClick(field_length, Qt.Key.Key_Tab)
    QTest.keyClicks(field_angle, "90")
    QTest.keyClick(field_angle, Qt.Key.Key_Return)
    settle(window)
    (wall,) = window.document.project.elements
    assert wall.kind is ElementKind.SHEAR_WALL
    assert wall.start == (30, 3)
    assert wall.end == pytest.approx((30, 10.5), abs=1e-9)


def test_new_element_snaps_to_an_existing_end_off_the_grid(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, one_storey((frame("B1", (3.37, 2.21), (3.37, 8.63)),)))
    window.drawing.set_tool("place-moment_frame")
    drag(window, (3.37 + 0.1, 8.63 + 0.1), (12.0, 8.63))
    new = window.document.project.element("M1")
    assert new.start == (3.37, 8.63)


def test_element_spans_the_chosen_levels(qtbot, tmp_path):
    level = one_storey().levels[0]
    project = Project(levels=(level, replace(level, name="Level 2"), replace(level, name="Level 3")))
    window = make_window(qtbot, tmp_path, project)
    window.placement.set(1, 2)
    window.document.set_current_level(2)
    window.drawing.set_tool("place-spring")
    drag(window, (10, 0), (10, 18))
    (spring,) = window.document.project.elements
    assert (spring.bottom, spring.top) == (1, 2)
    assert len(spring.properties.storey_stiffness) == 1


def test_rectangle_opening_inside_and_refused_outside(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, one_storey())
    window.drawing.set_tool("rectangle-opening")
    drag(window, (4, 4), (8, 9))
    assert window.document.project.levels[0].openings == (((4, 4), (8, 4), (8, 9), (4, 9)),)
    before = window.document.project
    drag(window, (30, 10), (40, 16))
    assert window.document.project == before
    assert "inside the outline" in window.status.hint.text()


def test_corner_drag_and_edge_insert(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, one_storey())
    window.drawing.set_tool("vertex")
    drag(window, (36, 18), (30, 20))
    assert window.document.project.levels[0].outline[2] == (30, 20)
    assert window.document.undo_stack.count() == 1
    viewport = window.plan_view.viewport()
    pos = window.plan_view.mapFromScene(18.0, 0.0)
    QTest.mouseDClick(viewport, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, pos)
    settle(window)
    assert window.document.project.levels[0].outline == ((0, 0), (18, 0), (36, 0), (30, 20), (0, 18))


def test_arrow_keys_nudge_and_rotate_turns_a_quarter(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    window.document.select(["B3"])
    window.plan_view.setFocus()
    for _ in range(3):
        QTest.keyClick(window.plan_view, Qt.Key.Key_Right)
    settle(window)
    assert window.document.project.element("B3").start == (18, 0)
    assert window.document.undo_stack.count() == 1, "a run of nudges is one undo step"
    window.edits.rotate_action.trigger()
    b3 = window.document.project.element("B3")
    assert (b3.start, b3.end) == ((21, -3), (21, 3))


def test_copy_to_levels_makes_new_elements(qtbot, tmp_path):
    base = balanced_box()
    levels = tuple(replace(base.levels[0], name=f"Level {j}") for j in (1, 2, 3))
    window = make_window(qtbot, tmp_path, replace(base, levels=levels))
    window.document.select(["B1"])
    new_ids = window.edits.copy_selection_to(2, 3)
    copy = window.document.project.element(new_ids[0])
    assert (copy.start, copy.end, copy.bottom, copy.top) == ((0, 6), (0, 12), 2, 3)
    assert window.document.selection == tuple(new_ids)
    window.document.select(["B1"])
    joined_ids = window.edits.copy_selection_to(1, 2)  # stands on B1 and under the first copy
    frame = window.document.project.element("B1")
    assert (frame.bottom, frame.top) == (0, 3), "pieces stacked on one line are joined into one element"
    assert not {*joined_ids, *new_ids} & {e.id for e in window.document.project.elements}
    assert window.document.selection == ("B1",)


def test_underlay_is_shown_locked_and_snappable(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, one_storey())
    segments = [((5.37, 3.11), (14.52, 3.11)), ((14.52, 3.11), (14.52, 11.8))]
    window.document.set_underlay(1, segments)
    settle(window)
    underlay = window.scene._underlay
    assert underlay is not None and not underlay.acceptedMouseButtons()
    window.drawing.set_tool("place-braced_frame")
    drag(window, (5.4, 3.15), (14.5, 3.1))
    (element,) = window.document.project.elements
    assert (element.start, element.end) == ((5.37, 3.11), (14.52, 3.11))
    window.document.set_current_level(1)
    assert window.document.underlay(2) == []


@pytest.mark.parametrize("steps", [1, -1, 3])
def test_wheel_zoom_keeps_the_point_under_the_cursor(qtbot, tmp_path, steps):
    """A wheel step zooms about the cursor: the plan point under it stays there to a pixel."""
    from PySide6.QtCore import QPoint, QPointF
    from PySide6.QtGui import QWheelEvent
    from PySide6.QtWidgets import QApplication

    from tests.helpers import balanced_box, make_window, view_point

    window = make_window(qtbot, tmp_path, balanced_box())
    view = window.plan_view
    for x, y in [(3.0, 2.0), (30.0, 15.0)]:  # one move first, then the point the wheel turns at
        pos = view_point(window, x, y)
        QTest.mouseMove(view.viewport(), pos)
    before = view.to_plan(QPointF(pos))
    pixel_before = view.pixel
    wheel = QWheelEvent(QPointF(pos), QPointF(view.viewport().mapToGlobal(pos)), QPoint(0, 0), QPoint(0, 120 * steps),
                        Qt.MouseButton.NoButton, Qt.KeyboardModifier.NoModifier, Qt.ScrollPhase.NoScrollPhase, False)
    QApplication.sendEvent(view.viewport(), wheel)
    assert view.pixel != pytest.approx(pixel_before)
    after = view.to_plan(QPointF(pos))
    assert abs(after[0] - before[0]) <= 1.01 * max(view.pixel, pixel_before)
    assert abs(after[1] - before[1]) <= 1.01 * max(view.pixel, pixel_before)


def test_plan_points_map_to_the_cursor_position(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, balanced_box())
    pos = view_point(window, 12.0, 5.0)
    x, y = window.plan_view.to_plan(QPointF(pos))
    assert abs(x - 12.0) < 2 * window.plan_view.pixel and abs(y - 5.0) < 2 * window.plan_view.pixel


@pytest.mark.parametrize("tool, values", [("place-shear_wall", ("8", "60")), ("polygon-outline", ("8", "120"))])
def test_typed_length_and_angle_store_no_float_noise(qtbot, tmp_path, tool, values):
    """8 m at 60° ends at (4, 6.9282) to the model's 0.1 mm, not at 4.000000000000001."""
    from tests.helpers import click, make_window, one_storey, settle

    window = make_window(qtbot, tmp_path, one_storey() if tool.startswith("place") else Project())
    window.drawing.set_tool(tool)
    click(window, 10, 3)
    QTest.keyClick(window.plan_view, values[0][0])
    field_length, field_angle = window.tool_options.fields
    QTest.keyClick(field_length, Qt.Key.Key_Tab)
    QTest.keyClicks(field_angle, values[1])
    QTest.keyClick(field_angle, Qt.Key.Key_Return)
    settle(window)
    project = window.document.project
    point = project.elements[0].end if tool.startswith("place") else window.plan_view.tool.points[-1]
    assert all(round(c, 4) == c for c in point), point
    assert point == pytest.approx((10 + 8 * math.cos(math.radians(float(values[1]))),
                                   3 + 8 * math.sin(math.radians(float(values[1])))), abs=1e-4)
