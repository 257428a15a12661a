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
from PySide6.QtGui import QAction, QActionGroup, QCloseEvent, QIcon, QKeySequence, QShowEvent
from PySide6.QtWidgets import (
    QApplication,
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QDockWidget,
    QFileDialog,
    QFormLayout,
    QMainWindow,
    QMenu,
    QMessageBox,
    QToolBar,
    QWidget,
)

from app import commands, safety_net
from app.canvas.scene import PlanScene
from app.canvas.view import PlanView
from app.document import ProjectDocument
from app.exchange.actions import install as install_exchange
from app.mode_views.panel import install as install_mode_views
from app.panels.levels import LevelsPanel
from app.panels.properties import PropertiesPanel
from app.panels.readouts import ReadoutsPanel
from app.panels.results import CAUTION, TablesPanel
from app.panels.status import StatusPanel
from app.panels.tool_options import ToolOptions
from app.resources import DEFAULT_SAMPLE, icon_path, sample_path, sample_projects
from app.tools.base import Tool
from app.tools.outline import OPENING, OUTLINE, PolygonTool
from app.tools.place import PlaceElementTool, PlacementRange
from app.tools.rectangle import RectangleTool
from app.tools.select import SelectTool, describe
from app.tools.vertex import VertexTool
from core.errors import ModelError
from core.model import ElementKind, Project
from core.model.fileio import load_project

FILE_FILTER = "Poise projects (*.poise);;All files (*)"
RECENT_LIMIT = 8
MENU_TITLES = {
    "file": "&File",
    "edit": "&Edit",
    "draw": "&Draw",
    "view": "&View",
    "level": "&Level",
    "analysis": "&Analysis",
    "help": "&Help",
}


def icon(name: str) -> QIcon:
    path = icon_path(name)
    return QIcon(str(path)) if path.exists() else QIcon()


class MainWindow(QMainWindow):
    """Poise's editor window; ``document`` holds the project, ``plan_view`` is the canvas."""

    def __init__(self, settings: QSettings | None = None) -> None:
        super().__init__()
        self.settings = settings if settings is not None else QSettings()
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
        self.tools = self._make_tools()
        self._make_actions()
        self.tool_options = ToolOptions(self.document, self.plan_view, self.placement)
        self._make_menus_and_bars()
        self._make_panels()
        self._connect()
        install_mode_views(self)
        install_exchange(self)
        self._stack_bottom_panels()
        self._restore_settings()
        self.set_tool("select")
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

    # ------------------------------------------------------------------ construction

    def _make_tools(self) -> dict[str, Tool]:
        view = self.plan_view
        tools: list[Tool] = [
            SelectTool(view),
            VertexTool(view),
            PolygonTool(view, OUTLINE),
            RectangleTool(view, OUTLINE),
            RectangleTool(view, OPENING),
            PolygonTool(view, OPENING),
        ]
        tools += [PlaceElementTool(view, kind, self.placement) for kind in ElementKind]
        return {tool.name: tool for tool in tools}

    def _action(self, text: str, slot, shortcut=None, icon_name: str = "", tip: str = "") -> QAction:
        action = QAction(text, self)
        if icon_name:
            action.setIcon(icon(icon_name))
        if shortcut is not None:
            action.setShortcut(QKeySequence(shortcut))
        if tip:
            action.setToolTip(tip)
            action.setStatusTip(tip)
        action.triggered.connect(lambda _checked=False: slot())
        return action

    def _make_actions(self) -> None:
        key = QKeySequence.StandardKey
        self.new_action = self._action("&New", self.new_project, key.New)
        self.open_action = self._action("&Open…", self.open_dialog, key.Open)
        self.save_action = self._action("&Save", self.save, key.Save)
        self.save_as_action = self._action("Save &As…", self.save_as, key.SaveAs)
        self.quit_action = self._action("&Quit", self.close, key.Quit)
        self.undo_action = self.document.undo_stack.createUndoAction(self, "&Undo")
        self.undo_action.setShortcut(key.Undo)
        self.undo_action.setIcon(icon("undo"))
        self.redo_action = self.document.undo_stack.createRedoAction(self, "&Redo")
        self.redo_action.setShortcut(key.Redo)
        self.redo_action.setIcon(icon("redo"))
        self.delete_action = self._action("&Delete elements", self.delete_selection, key.Delete)
        self.rotate_action = self._action(
            "&Rotate 90°",
            self.rotate_selection,
            "R",
            "rotate",
            "Turn the selected elements a quarter turn counter-clockwise",
        )
        self.copy_levels_action = self._action(
            "&Copy to levels…",
            self.copy_selection_dialog,
            "Ctrl+Shift+C",
            "copy_levels",
            "Copy the selected elements to another span of levels",
        )
        self.select_all_action = self._action("Select all on this level", self.select_all, key.SelectAll)
        self.fit_action = self._action("&Fit plan", self.plan_view.fit, "F", "fit", "Show the whole plan")
        self.zoom_in_action = self._action("Zoom &in", lambda: self.plan_view.zoom_by(1.25), key.ZoomIn)
        self.zoom_out_action = self._action("Zoom &out", lambda: self.plan_view.zoom_by(0.8), key.ZoomOut)
        self.grid_action = self._action("Show &grid", self._grid_toggled, "Ctrl+G")
        self.grid_action.setCheckable(True)
        self.grid_action.setChecked(True)
        self.snap_action = self._action(
            "&Snap", self._snap_toggled, "N", "snap", "Snap to the grid, corners, edges, element ends and middles"
        )
        self.snap_action.setCheckable(True)
        self.snap_action.setChecked(True)
        self.add_level_action = self._action(
            "&Add level on top",
            self.add_level,
            None,
            "level_add",
            "A new level above the roof with the top level's outline",
        )
        self.insert_level_action = self._action(
            "&Insert level below",
            self.insert_level,
            None,
            "level_insert",
            "A new level under the current one; elements passing it span it too",
        )
        self.duplicate_level_action = self._action(
            "&Duplicate level with its elements",
            self.duplicate_level,
            None,
            "level_duplicate",
            "A copy of the current level directly above it, elements carried up",
        )
        self.delete_level_action = self._action(
            "De&lete level", self.delete_level, None, "level_delete", "Remove the current level and its storey"
        )
        self.level_up_action = self._action("Level a&bove", lambda: self.step_level(1), "PgUp")
        self.level_down_action = self._action("Level bel&ow", lambda: self.step_level(-1), "PgDown")
        self.recompute_action = self._action("&Recompute now", self.document.flush_analysis, "F5")
        self.caution_action = self._action("&About the results…", self.show_caution)
        self.tool_group = QActionGroup(self)
        self.tool_actions: dict[str, QAction] = {}
        for name, tool in self.tools.items():
            action = self._action(
                tool.title,
                lambda name=name: self.set_tool(name),
                tool.shortcut,
                tool.icon,
                f"{tool.title} ({tool.shortcut})",
            )
            action.setCheckable(True)
            self.tool_group.addAction(action)
            self.tool_actions[name] = action

    def _make_menus_and_bars(self) -> None:
        file_menu = self.menu("file")
        file_menu.addActions([self.new_action, self.open_action])
        self.samples_menu = file_menu.addMenu("Open &sample")
        for path in sample_projects():
            self.samples_menu.addAction(path.stem.replace("_", " "), lambda p=path: self.open_sample(p))
        self.recent_menu = file_menu.addMenu("Open &recent")
        self.recent_menu.aboutToShow.connect(self._fill_recent)
        file_menu.addSeparator()
        file_menu.addActions([self.save_action, self.save_as_action])
        file_menu.addSeparator()
        file_menu.addAction(self.quit_action)
        edit = self.menu("edit")
        edit.addActions([self.undo_action, self.redo_action])
        edit.addSeparator()
        edit.addActions([self.select_all_action, self.delete_action, self.rotate_action, self.copy_levels_action])
        draw = self.menu("draw")
        for name in self.tools:
            draw.addAction(self.tool_actions[name])
        view = self.menu("view")
        view.addActions([self.fit_action, self.zoom_in_action, self.zoom_out_action])
        view.addSeparator()
        view.addActions([self.grid_action, self.snap_action])
        view.addSeparator()
        level = self.menu("level")
        level.addActions(self.level_actions())
        level.addSeparator()
        level.addActions([self.level_up_action, self.level_down_action])
        self.menu("analysis").addAction(self.recompute_action)
        self.menu("help").addAction(self.caution_action)

        main = QToolBar("Main")
        main.setObjectName("mainToolbar")
        main.setToolButtonStyle(Qt.ToolButtonStyle.ToolButtonIconOnly)
        main.addActions([self.undo_action, self.redo_action])
        main.addSeparator()
        main.addActions([self.fit_action, self.snap_action, self.rotate_action, self.copy_levels_action])
        self.addToolBar(Qt.ToolBarArea.TopToolBarArea, main)
        self.addToolBar(Qt.ToolBarArea.TopToolBarArea, self.tool_options)
        tools = QToolBar("Drawing tools")
        tools.setObjectName("drawingTools")
        for i, name in enumerate(self.tools):
            if i in (2, 6):
                tools.addSeparator()
            tools.addAction(self.tool_actions[name])
        self.addToolBar(Qt.ToolBarArea.LeftToolBarArea, tools)

    def level_actions(self) -> list[QAction]:
        return [self.add_level_action, self.insert_level_action, self.duplicate_level_action, self.delete_level_action]

    def _make_panels(self) -> None:
        left, right, bottom = (
            Qt.DockWidgetArea.LeftDockWidgetArea,
            Qt.DockWidgetArea.RightDockWidgetArea,
            Qt.DockWidgetArea.BottomDockWidgetArea,
        )
        self.levels_panel = LevelsPanel(self.document, self.level_actions())
        self.readouts = ReadoutsPanel(self.document)
        self.properties = PropertiesPanel(self.document)
        self.tables = TablesPanel(self.document)
        self.levels_dock = self.add_panel(self.levels_panel, "Levels", "levelsPanel", left)
        self.readouts_dock = self.add_panel(self.readouts, "Live results", "liveResultsPanel", right)
        self.properties_dock = self.add_panel(self.properties, "Properties", "propertiesPanel", right)
        self.tables_dock = self.add_panel(self.tables, "Tables", "tablesPanel", bottom)
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
        document.project_changed.connect(self._update_enabled)
        document.selection_changed.connect(self._update_enabled)
        document.current_level_changed.connect(self._update_enabled)
        document.file_path_changed.connect(self._update_title)
        view = self.plan_view
        view.cursor_moved.connect(self.status.show_cursor)
        view.snap_changed.connect(self.status.show_snap)
        view.typing_started.connect(self.tool_options.start_typing)
        for tool in self.tools.values():
            tool.hint_changed.connect(self.status.show_hint)
        self._update_enabled()

    # ------------------------------------------------------------------ tools and view toggles

    def set_tool(self, name: str) -> None:
        tool = self.tools[name]
        self.plan_view.set_tool(tool)
        self.tool_actions[name].setChecked(True)
        self.tool_options.show_tool(tool)
        self.status.show_hint(tool.hint)

    def _grid_toggled(self) -> None:
        self.plan_view.grid_visible = self.grid_action.isChecked()
        self.plan_view.redraw_background()

    def _snap_toggled(self) -> None:
        self.plan_view.snap_enabled = self.status.snap_enabled = self.snap_action.isChecked()
        self.status.show_snap(None)

    def _update_enabled(self, *_: object) -> None:
        project = self.document.project
        has_levels = bool(project.levels)
        selected = bool(self.document.selection)
        for action in (self.delete_action, self.rotate_action, self.copy_levels_action):
            action.setEnabled(selected)
        for action in (
            self.add_level_action,
            self.insert_level_action,
            self.duplicate_level_action,
            self.delete_level_action,
            self.select_all_action,
        ):
            action.setEnabled(has_levels)

    def _update_title(self, *_: object) -> None:
        document = self.document
        where = document.file_path.name if document.file_path else "not saved yet"
        self.setWindowTitle(f"{document.project.name} — {where}[*] — Poise")
        self.setWindowModified(document.is_modified)

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

    # ------------------------------------------------------------------ element commands

    def delete_selection(self) -> None:
        ids = self.document.selection
        if ids:
            self.document.apply(commands.remove_elements(self.document.project, ids), f"Delete {describe(ids)}")

    def rotate_selection(self) -> None:
        ids = self.document.selection
        if ids:
            self.document.apply(commands.rotate_elements(self.document.project, ids), f"Rotate {describe(ids)}")

    def select_all(self) -> None:
        level = self.document.current_level
        self.document.select([e.id for e in self.document.project.elements_in_storey(level)])

    def copy_selection_to(self, bottom: int, top: int) -> list[str]:
        """Copy the selected elements to span ``bottom``..``top``; returns the new ids (selected)."""
        try:
            project, new_ids = commands.copy_elements_to(self.document.project, self.document.selection, bottom, top)
        except ModelError as error:
            self.show_problem("Copy to levels", str(error))
            return []
        self.document.apply(project, f"Copy {describe(self.document.selection)} to levels {bottom}–{top}")
        self.document.select(new_ids)
        return new_ids

    def copy_selection_dialog(self) -> None:
        project = self.document.project
        if not self.document.selection or not project.levels:
            return
        dialog = QDialog(self)
        dialog.setWindowTitle("Copy to levels")
        bottom, top = QComboBox(), QComboBox()
        bottom.addItem("Base", 0)
        for i, level in enumerate(project.levels, start=1):
            top.addItem(level.name, i)
            if i < len(project.levels):
                bottom.addItem(level.name, i)
        form = QFormLayout(dialog)
        form.addRow("Copies stand on", bottom)
        form.addRow("and reach", top)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(dialog.accept)
        buttons.rejected.connect(dialog.reject)
        form.addRow(buttons)
        if dialog.exec() == QDialog.DialogCode.Accepted:
            self.copy_selection_to(bottom.currentData(), top.currentData())

    # ------------------------------------------------------------------ level commands

    def step_level(self, step: int) -> None:
        self.document.set_current_level(self.document.current_level + step)

    def add_level(self) -> None:
        project = self.document.project
        if project.levels:
            self.document.apply(commands.add_level_on_top(project), "Add level")
            self.document.set_current_level(len(self.document.project.levels))

    def insert_level(self) -> None:
        project = self.document.project
        if project.levels:
            number = self.document.current_level
            self.document.apply(commands.insert_level_below(project, number), f"Insert level below {number}")

    def duplicate_level(self) -> None:
        project = self.document.project
        if project.levels:
            number = self.document.current_level
            self.document.apply(commands.duplicate_level(project, number), f"Duplicate level {number}")
            self.document.set_current_level(number + 1)

    def delete_level(self) -> None:
        project = self.document.project
        if project.levels:
            number = self.document.current_level
            name = project.levels[number - 1].name
            changed, removed = commands.delete_level(project, number)
            self.document.apply(changed, f"Delete {name}")
            if removed:
                self.status.show_hint(
                    f"Deleted {name} and {describe(removed)} that stood only in its storey (Undo restores)."
                )

    # ------------------------------------------------------------------ files

    def ask_unsaved(self) -> str:
        """Ask what to do with unsaved changes: 'save', 'discard' or 'cancel'."""
        buttons = QMessageBox.StandardButton
        answer = QMessageBox.question(
            self,
            "Unsaved changes",
            f"“{self.document.project.name}” has changes that are not saved. Save them first?",
            buttons.Save | buttons.Discard | buttons.Cancel,
            buttons.Save,
        )
        return {buttons.Save: "save", buttons.Discard: "discard"}.get(answer, "cancel")

    def confirm_discard(self) -> bool:
        """True when the current work may be replaced (saved, unchanged, or the user lets it go)."""
        if not self.document.is_modified:
            return True
        answer = self.ask_unsaved()
        if answer == "save":
            return self.save()
        return answer == "discard"

    def show_problem(self, title: str, text: str) -> None:
        QMessageBox.warning(self, title, text)

    def new_project(self) -> None:
        if self.confirm_discard():
            self.document.reset(Project())
            self.set_tool("polygon-outline")
            self.plan_view.fit()

    def open_dialog(self) -> None:
        if not self.confirm_discard():
            return
        start = str(self.document.file_path.parent) if self.document.file_path else ""
        path, _ = QFileDialog.getOpenFileName(self, "Open project", start, FILE_FILTER)
        if path:
            self.open_file(Path(path), confirm=False)

    def open_file(self, path: Path, confirm: bool = True) -> bool:
        """Open ``path``; a bad file gives a message and leaves the current project as it was."""
        if confirm and not self.confirm_discard():
            return False
        try:
            self.document.open(Path(path))
        except ModelError as error:
            self.show_problem("Cannot open the project", str(error))
            self._forget_recent(Path(path))
            return False
        self._remember_recent(Path(path))
        self.plan_view.fit()
        return True

    def open_sample(self, path: Path, confirm: bool = True) -> bool:
        """Open a bundled sample as an unsaved copy (Save asks where, the sample stays untouched)."""
        if confirm and not self.confirm_discard():
            return False
        try:
            project = load_project(path)
        except ModelError as error:
            self.show_problem("Cannot open the sample", str(error))
            return False
        self.document.reset(project, None)
        self.plan_view.fit()
        return True

    def save(self) -> bool:
        if self.document.file_path is None:
            return self.save_as()
        return self._save_to(self.document.file_path)

    def save_as(self, path: Path | None = None) -> bool:
        if path is None:
            start = str(self.document.file_path or f"{self.document.project.name}.poise")
            chosen, _ = QFileDialog.getSaveFileName(self, "Save project as", start, FILE_FILTER)
            if not chosen:
                return False
            path = Path(chosen)
        if not path.suffix:
            path = path.with_suffix(".poise")
        return self._save_to(path)

    def _save_to(self, path: Path) -> bool:
        try:
            self.document.save(path)
        except (OSError, ModelError) as error:
            self.show_problem("Cannot save the project", f"{path}: {error}")
            return False
        self._remember_recent(path)
        self.status.show_hint(f"Saved {path.name}")
        return True

    # ------------------------------------------------------------------ recent files and settings

    def recent_files(self) -> list[str]:
        return [str(p) for p in self.settings.value("recent_files", [], type=list)]

    def _remember_recent(self, path: Path) -> None:
        text = str(path.resolve())
        recent = [text] + [p for p in self.recent_files() if p != text]
        self.settings.setValue("recent_files", recent[:RECENT_LIMIT])

    def _forget_recent(self, path: Path) -> None:
        text = str(path.resolve())
        self.settings.setValue("recent_files", [p for p in self.recent_files() if p != text])

    def _fill_recent(self) -> None:
        self.recent_menu.clear()
        recent = self.recent_files()
        if not recent:
            self.recent_menu.addAction("(none yet)").setEnabled(False)
        for text in recent:
            self.recent_menu.addAction(text, lambda t=text: self.open_file(Path(t)))

    def _restore_settings(self) -> None:
        s = self.settings
        geometry = s.value("window/geometry")
        if geometry is not None:
            self.restoreGeometry(geometry)
        state = s.value("window/state")
        self._layout_restored = state is not None and self.restoreState(state)
        spacing = float(s.value("canvas/grid_spacing", 1.0))
        self.tool_options.grid.setValue(spacing)
        self.snap_action.setChecked(s.value("canvas/snap", True, type=bool))
        self._snap_toggled()
        self.grid_action.setChecked(s.value("canvas/grid", True, type=bool))
        self._grid_toggled()

    def save_settings(self) -> None:
        s = self.settings
        s.setValue("window/geometry", self.saveGeometry())
        s.setValue("window/state", self.saveState())
        s.setValue("canvas/grid_spacing", self.plan_view.grid_spacing)
        s.setValue("canvas/snap", self.plan_view.snap_enabled)
        s.setValue("canvas/grid", self.plan_view.grid_visible)
        s.sync()

    def closeEvent(self, event: QCloseEvent) -> None:
        if not self.confirm_discard():
            event.ignore()
            return
        if self.plan_view.tool is not None:
            self.plan_view.tool.cancel()
        self.save_settings()
        event.accept()

    def show_caution(self) -> None:
        QMessageBox.information(self, "About the results", CAUTION)


def run(path: Path | None = None) -> int:
    """Start the editor on ``path`` (or the bundled sample) and run until the window closes."""
    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setOrganizationName("Poise")
    app.setApplicationName("Poise")
    window = MainWindow()
    safety_net.install(window, window.document)
    if path is not None:
        window.open_file(Path(path), confirm=False)
    else:
        window.open_sample(sample_path(DEFAULT_SAMPLE), confirm=False)
    window.show()
    return app.exec()
