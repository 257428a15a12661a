"""The View menu's plan actions of one main window: fit, zoom, the grid and snapping. The grid and
snap switches and the grid spacing are kept in QSettings with the window."""

from __future__ import annotations

from typing import Any

from PySide6.QtCore import QObject, QSettings
from PySide6.QtGui import QKeySequence

from app.action_factory import make_action


class ViewActions(QObject):
    """Fit, zoom, grid and snap of ``window``'s plan view."""

    def __init__(self, window: Any) -> None:
        super().__init__(window)
        self.window = window
        view = window.plan_view
        key = QKeySequence.StandardKey
        self.fit_action = make_action(window, "&Fit plan", view.fit, "F", "fit", "Show the whole plan")
        self.zoom_in_action = make_action(window, "Zoom &in", lambda: view.zoom_by(1.25), key.ZoomIn)
        self.zoom_out_action = make_action(window, "Zoom &out", lambda: view.zoom_by(0.8), key.ZoomOut)
        self.grid_action = make_action(window, "Show &grid", self.grid_toggled, "Ctrl+G")
        self.grid_action.setCheckable(True)
        self.grid_action.setChecked(True)
        self.snap_action = make_action(
            window,
            "&Snap",
            self.snap_toggled,
            "N",
            "snap",
            "Snap to the grid, corners, edges, element ends and middles",
        )
        self.snap_action.setCheckable(True)
        self.snap_action.setChecked(True)

    def grid_toggled(self) -> None:
        view = self.window.plan_view
        view.grid_visible = self.grid_action.isChecked()
        view.redraw_background()

    def snap_toggled(self) -> None:
        self.window.plan_view.snap_enabled = self.window.status.snap_enabled = self.snap_action.isChecked()
        self.window.status.show_snap(None)

    def restore(self, settings: QSettings) -> None:
        """Take the grid spacing, snap and grid switches from ``settings``."""
        self.window.tool_options.grid.setValue(float(settings.value("canvas/grid_spacing", 1.0)))
        self.snap_action.setChecked(settings.value("canvas/snap", True, type=bool))
        self.snap_toggled()
        self.grid_action.setChecked(settings.value("canvas/grid", True, type=bool))
        self.grid_toggled()

    def save(self, settings: QSettings) -> None:
        view = self.window.plan_view
        settings.setValue("canvas/grid_spacing", view.grid_spacing)
        settings.setValue("canvas/snap", view.snap_enabled)
        settings.setValue("canvas/grid", view.grid_visible)


def install(window: Any) -> ViewActions:
    """Add fit, zoom, grid and snap to ``window``'s View menu (the panel switches follow)."""
    views = ViewActions(window)
    menu = window.menu("view")
    menu.addActions([views.fit_action, views.zoom_in_action, views.zoom_out_action])
    menu.addSeparator()
    menu.addActions([views.grid_action, views.snap_action])
    menu.addSeparator()
    return views
