"""The main window: the plan at the centre, the building's levels to its left, the live results and
the properties of the selection to its right, the tables below.

The layout follows what the engineer looks at together while placing the lateral system: the
plan being edited, where in the height of the building it is, whether it twists, and the numbers
of the element in hand. Panels are docks; their arrangement, the window size and the recent files
are kept in QSettings.
"""

from __future__ import annotations

import sys
from pathlib import Path

from PySide6.QtCore import QSettings, Qt, QTimer
from PySide6.QtGui import QCloseEvent, QShowEvent
from PySide6.QtWidgets import QApplication, QDockWidget, QMainWindow, QMenu, QMessageBox, QToolBar, QWidget

from app import safety_net
from app.action_factory import icon, make_action
from app.canvas.scene import PlanScene
from app.canvas.view import PlanView
from app.document import ProjectDocument
from app.drawing_tools import install as install_drawing_tools
from app.edit_actions import install as install_edit_actions
from app.exchange.actions import install as install_exchange
from app.file_actions import install as install_file_actions
from app.guidance import install as install_guidance
from app.level_actions import install as install_level_actions
from app.mode_views.panel import install as install_mode_views
from app.panels.levels import LevelsPanel
from app.panels.properties import PropertiesPanel
from app.panels.readouts import ReadoutsPanel
from app.panels.results import TablesPanel
from app.panels.status import StatusPanel
from app.panels.tool_options import ToolOptions
from app.recovery import RecoveryStore
from app.resources import DEFAULT_SAMPLE, sample_path
from app.tools.place import PlacementRange
from app.view_actions import install as install_view_actions
from core.report.summary import CAUTION

MENU_TITLES = {
    "file": "&File",
    "edit": "&Edit",
    "draw": "&Draw",
    "view": "&View",
    "level": "&Level",
    "analysis": "&Analysis",
    "help": "&Help",
}


class MainWindow(QMainWindow):
    """Poise's editor window; ``document`` holds the project, ``plan_view`` is the canvas.

    The window assembles: its menus, tool bars and docks hold what the installed parts make —
    ``files`` (the project file), ``edits`` (undo and element edits), ``drawing`` (the tools),
    ``views`` (fit, zoom, grid, snap), ``levels`` (level changes), the mode views and ``exchange``
    (sheet, DXF, CSV, PNG)."""

    def __init__(self, settings: QSettings | None = None, recovery: RecoveryStore | None = None) -> None:
        super().__init__()
        self.settings = settings if settings is not None else QSettings()
        self.recovery = recovery if recovery is not None else RecoveryStore()
        """Where unsaved work and error copies go (the user's data folder; tests give a temp one)."""
        self.document = ProjectDocument(self)
        self.scene = PlanScene(self.document)
        self.plan_view = PlanView(self.scene)
        self.placement = PlacementRange(self)
        self._menus: dict[str, QMenu] = {}
        self._fitted = False
        self.setWindowIcon(icon("poise"))
        self.setCentralWidget(self.plan_view)
        self.setDockOptions(QMainWindow.DockOption.AnimatedDocks | QMainWindow.DockOption.AllowTabbedDocks)

        self.status = StatusPanel(self.document)
        self.setStatusBar(self.status)
        self.tool_options = ToolOptions(self.document, self.plan_view, self.placement)
        for name in MENU_TITLES:
            self.menu(name)
        self.files = install_file_actions(self)
        self.edits = install_edit_actions(self)
        self.drawing = install_drawing_tools(self)
        self.views = install_view_actions(self)
        self.levels = install_level_actions(self)
        self._make_analysis_and_help()
        self._make_main_tool_bar()
        self._make_panels()
        self._connect()
        install_mode_views(self)
        self.exchange = install_exchange(self)
        self.guidance = install_guidance(self)
        self._stack_bottom_panels()
        self._restore_settings()
        self.drawing.set_tool("select")
        self._update_title()

    # ------------------------------------------------------------------ public API for other parts

    def menu(self, name: str) -> QMenu:
        """The menu called ``name`` (file, edit, draw, view, level, analysis, help, or a new one,
        which is added before Help)."""
        key = name.lower().replace("&", "")
        if key not in self._menus:
            bar = self.menuBar()
            menu = QMenu(MENU_TITLES.get(key, name), self)
            help_menu = self._menus.get("help")
            if help_menu is not None:
                bar.insertMenu(help_menu.menuAction(), menu)
            else:
                bar.addMenu(menu)
            self._menus[key] = menu
        return self._menus[key]

    def add_panel(
        self,
        widget: QWidget,
        title: str,
        object_name: str,
        area: Qt.DockWidgetArea = Qt.DockWidgetArea.RightDockWidgetArea,
    ) -> QDockWidget:
        """Dock ``widget`` under ``title``; its place is saved with the window state."""
        dock = QDockWidget(title, self)
        dock.setObjectName(object_name)
        dock.setWidget(widget)
        self.addDockWidget(area, dock)
        self.menu("view").addAction(dock.toggleViewAction())
        return dock

    # ------------------------------------------------------------------ assembly

    def _make_analysis_and_help(self) -> None:
        self.recompute_action = make_action(self, "&Recompute now", self.document.flush_analysis, "F5")
        self.caution_action = make_action(self, "&About the results…", self.show_caution)
        self.menu("analysis").addAction(self.recompute_action)
        self.menu("help").addAction(self.caution_action)

    def _make_main_tool_bar(self) -> None:
        edits, views = self.edits, self.views
        main = QToolBar("Main")
        main.setObjectName("mainToolbar")
        main.setToolButtonStyle(Qt.ToolButtonStyle.ToolButtonIconOnly)
        main.addActions([edits.undo_action, edits.redo_action])
        main.addSeparator()
        main.addActions([views.fit_action, views.snap_action, edits.rotate_action, edits.copy_levels_action])
        self.addToolBar(Qt.ToolBarArea.TopToolBarArea, main)
        self.addToolBar(Qt.ToolBarArea.TopToolBarArea, self.tool_options)

    def _make_panels(self) -> None:
        left, right, bottom = (
            Qt.DockWidgetArea.LeftDockWidgetArea,
            Qt.DockWidgetArea.RightDockWidgetArea,
            Qt.DockWidgetArea.BottomDockWidgetArea,
        )
        self.levels_panel = LevelsPanel(self.document, self.levels.changes)
        self.readouts = ReadoutsPanel(self.document)
        self.properties = PropertiesPanel(self.document)
        self.tables = TablesPanel(self.document)
        self.levels_dock = self.add_panel(self.levels_panel, "Levels", "levelsPanel", left)
        self.readouts_dock = self.add_panel(self.readouts, "Live results", "liveResultsPanel", right)
        self.properties_dock = self.add_panel(self.properties, "Properties", "propertiesPanel", right)
        self.tables_dock = self.add_panel(self.tables, "Tables", "tablesPanel", bottom)
        for form in (self.levels_panel.form, self.properties.form):
            form.finished.connect(lambda: self.plan_view.setFocus())
        self.setCorner(Qt.Corner.BottomLeftCorner, left)
        self.setCorner(Qt.Corner.BottomRightCorner, right)
        self.resize(1500, 950)

    def _stack_bottom_panels(self) -> None:
        """Panels at the bottom share the full width as tabs (the tables first, the last added shown)."""
        docks = [
            d
            for d in self.findChildren(QDockWidget)
            if self.dockWidgetArea(d) == Qt.DockWidgetArea.BottomDockWidgetArea
        ]
        for dock in docks[1:]:
            self.tabifyDockWidget(docks[0], dock)
        if docks:
            docks[-1].raise_()

    def _connect(self) -> None:
        document = self.document
        document.undo_stack.cleanChanged.connect(self._update_title)
        document.project_changed.connect(self._update_title)
        document.file_path_changed.connect(self._update_title)
        view = self.plan_view
        view.cursor_moved.connect(self.status.show_cursor)
        view.snap_changed.connect(self.status.show_snap)
        view.typing_started.connect(self.tool_options.start_typing)

    def _update_title(self, *_: object) -> None:
        document = self.document
        where = document.file_path.name if document.file_path else "not saved yet"
        self.setWindowTitle(f"{document.project.name} — {where}[*] — Poise")
        self.setWindowModified(document.is_modified)

    # ------------------------------------------------------------------ window life and settings

    def _default_sizes(self) -> None:
        """Give the plan most of the window: side columns and the bottom strip at modest sizes."""
        horizontal, vertical = Qt.Orientation.Horizontal, Qt.Orientation.Vertical
        self.resizeDocks([self.levels_dock, self.readouts_dock], [275, 360], horizontal)
        self.resizeDocks([self.readouts_dock, self.properties_dock], [560, 440], vertical)
        self.resizeDocks([self.tables_dock], [max(240, self.height() // 3)], vertical)

    def showEvent(self, event: QShowEvent) -> None:
        super().showEvent(event)
        if not self._fitted:
            self._fitted = True
            if not self._layout_restored:
                self._default_sizes()
            QTimer.singleShot(0, self.plan_view.fit)

    def _restore_settings(self) -> None:
        s = self.settings
        geometry = s.value("window/geometry")
        if geometry is not None:
            self.restoreGeometry(geometry)
        state = s.value("window/state")
        self._layout_restored = state is not None and self.restoreState(state)
        self.views.restore(s)

    def save_settings(self) -> None:
        s = self.settings
        s.setValue("window/geometry", self.saveGeometry())
        s.setValue("window/state", self.saveState())
        self.views.save(s)
        s.sync()

    def closeEvent(self, event: QCloseEvent) -> None:
        if not self.files.confirm_discard():
            event.ignore()
            return
        if self.plan_view.tool is not None:
            self.plan_view.tool.cancel()
        self.save_settings()
        self.files.close()
        event.accept()

    def show_caution(self) -> None:
        QMessageBox.information(self, "About the results", CAUTION)


def run(path: Path | None = None) -> int:
    """Start the editor on ``path`` (or the bundled sample) and run until the window closes."""
    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setOrganizationName("Poise")
    app.setApplicationName("Poise")
    window = MainWindow()
    safety_net.install(window, window.document, window.recovery)
    window.show()
    if window.files.offer_recovery():
        pass  # the recovered work is open
    elif path is not None:
        window.files.open_file(Path(path), confirm=False)
    else:
        window.files.open_sample(sample_path(DEFAULT_SAMPLE), confirm=False)
    return app.exec()
