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
