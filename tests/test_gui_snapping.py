"""Snapping rules: feature points before lines before the grid; grid crossings along a line."""

from __future__ import annotations

import pytest

from app.canvas.snapping import SnapKind, constrain_orthogonal, grid_crossing, plan_targets, snap_point
from tests.helpers import frame, one_storey


@pytest.fixture
def targets():
    project = one_storey((frame("B1", (3.3, 2.2), (3.3, 8.6)),))
    return plan_targets(project, 1, underlay=[((10.0, 10.0), (14.0, 13.0))])


def test_points_win_over_lines_and_lines_over_the_grid(targets):
    assert snap_point((3.35, 8.55), targets, 0.2, 1.0).point == (3.3, 8.6)
    assert snap_point((3.35, 8.55), targets, 0.2, 1.0).kind is SnapKind.END
    assert snap_point((3.35, 5.4), targets, 0.2, 1.0).point == (3.3, 5.4), "on B1's line at y = 5.4"
    mid = snap_point((3.31, 5.41), targets, 0.2, 1.0)
    assert mid.kind is SnapKind.MIDPOINT and mid.point == pytest.approx((3.3, 5.4))
    assert snap_point((20.3, 9.6), targets, 0.2, 1.0).point == (20.0, 10.0)
    assert snap_point((20.3, 9.6), targets, 0.2, None).kind is SnapKind.FREE


def test_outline_corner_and_underlay_end(targets):
    assert snap_point((35.9, 17.95), targets, 0.2, 1.0).label == "corner of outline"
    assert snap_point((14.1, 12.9), targets, 0.2, 1.0).point == (14.0, 13.0)


def test_a_point_on_a_grid_aligned_edge_lands_on_the_grid(targets):
    snap = snap_point((0.05, 4.03), targets, 0.2, 1.0)
    assert snap.kind is SnapKind.EDGE and snap.point == (0.0, 4.0)


def test_grid_crossing_on_a_slanted_line():
    # The line y = 0.5 x crosses the grid line x = 2 at (2, 1).
    assert grid_crossing((2.05, 1.02), (0.0, 0.0), (4.0, 2.0), 1.0, 0.2) == pytest.approx((2.0, 1.0))
    assert grid_crossing((2.5, 1.25), (0.0, 0.0), (4.0, 2.0), 1.0, 0.1) == (2.5, 1.25)


def test_orthogonal_constraint():
    assert constrain_orthogonal((0.0, 0.0), (5.0, 1.0)) == (5.0, 0.0)
    assert constrain_orthogonal((0.0, 0.0), (1.0, 5.0)) == (0.0, 5.0)


def test_a_snap_on_a_line_knows_the_line_direction(targets):
    mid = snap_point((3.31, 5.41), targets, 0.2, 1.0)
    assert mid.along == pytest.approx((0.0, 1.0))
    on_line = snap_point((3.35, 4.4), targets, 0.2, 1.0)
    assert on_line.kind is SnapKind.EDGE and on_line.along == pytest.approx((0.0, 1.0))
    assert snap_point((3.35, 8.55), targets, 0.2, 1.0).along is None


def _marker_image(kind, along=None):
    from PySide6.QtCore import QPointF, Qt
    from PySide6.QtGui import QImage, QPainter

    from app.canvas.view import draw_snap_marker

    image = QImage(80, 60, QImage.Format.Format_ARGB32)
    image.fill(Qt.GlobalColor.white)
    painter = QPainter(image)
    draw_snap_marker(painter, QPointF(30, 30), kind, along)
    painter.end()
    return image


def _ink(image, x0, y0, x1, y1) -> int:
    return sum(image.pixelColor(x, y).lightness() < 200 for x in range(x0, x1) for y in range(y0, y1))


def test_markers_are_poise_own_dot_tick_and_ring_with_a_tag(qapp):
    from app.canvas.view import SNAP_TAGS

    dot = _marker_image(SnapKind.END)
    assert dot.pixelColor(30, 30).lightness() < 200, "an end is a filled dot: its centre is inked"
    ring = _marker_image(SnapKind.EDGE, (1.0, 0.0))
    assert ring.pixelColor(30, 30).lightness() >= 200 and _ink(ring, 24, 24, 37, 37) > 10, "a ring: hollow centre"
    tick = _marker_image(SnapKind.MIDPOINT, (1.0, 0.0))  # a horizontal line: the tick stands upright
    assert _ink(tick, 29, 22, 32, 39) > 10 and _ink(tick, 20, 29, 27, 32) == 0
    assert len({SNAP_TAGS[k] for k in SnapKind if k is not SnapKind.FREE}) == len(SnapKind) - 1
    for image in (dot, ring, tick):
        assert _ink(image, 40, 8, 80, 24) > 5, "the tag by the cursor names the snap"


def test_screenshot_shows_the_snap_markers(qtbot, tmp_path):
    """Screenshots of the canvas with the cursor on an element's end, its middle and its line,
    written to tests/screenshots/ for a person to look at."""
    from pathlib import Path

    from PySide6.QtTest import QTest

    from app.canvas.view import SNAP_TAGS
    from tests.helpers import make_window, view_point

    window = make_window(qtbot, tmp_path, one_storey((frame("B1", (6.0, 3.0), (6.0, 13.0)),)))
    view = window.plan_view
    folder = Path(__file__).parent / "screenshots"
    folder.mkdir(exist_ok=True)
    for where, kind in (((6.0, 13.0), SnapKind.END), ((6.0, 8.0), SnapKind.MIDPOINT), ((6.0, 5.3), SnapKind.EDGE)):
        QTest.mouseMove(view.viewport(), view_point(window, 1.0, 1.0))
        QTest.mouseMove(view.viewport(), view_point(window, *where))
        assert view.shown_snap is not None and view.shown_snap.kind is kind
        image = view.viewport().grab().toImage()  # viewport pixels, as view_point gives
        assert image.save(str(folder / f"snap_{kind.value}.png"))
        c = view_point(window, *where)
        inked = [image.pixelColor(c.x() + dx, c.y() + dy) for dx in range(-6, 7) for dy in range(-6, 7)]
        assert any(p.red() > 180 and p.green() < 130 and p.blue() < 80 for p in inked), "the snap colour is there"
        assert view.snap_tag() == SNAP_TAGS[kind]
