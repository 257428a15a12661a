"""The Edit menu of one main window: undo and redo, select all on the level, and the edits of the
selected elements (delete, rotate, copy to other levels). Each edit is one undo step; the actions
that need a selection or a level are enabled only when there is one."""

from __future__ import annotations

from typing import Any

from PySide6.QtCore import QEvent, QObject
from PySide6.QtGui import QAction, QKeyEvent, QKeySequence
from PySide6.QtWidgets import QApplication, QMessageBox, QWidget

from app import commands
from app.action_factory import icon, make_action
from app.copy_levels_dialog import ask_copy_span
from app.tools.select import describe
from core.errors import ModelError


def _redo_keys() -> list[QKeySequence]:
    """The platform's redo keys, and both common conventions (Ctrl+Y, Ctrl+Shift+Z) everywhere."""
    keys = [*QKeySequence.keyBindings(QKeySequence.StandardKey.Redo), QKeySequence("Ctrl+Y"),
            QKeySequence("Ctrl+Shift+Z")]
    return list(dict.fromkeys(keys))


class ProjectKeysFirst(QObject):
    """Lets the project's Undo and Redo keys reach their actions while a text field of the window has
    the keyboard (a field would otherwise claim Ctrl+Z for its own text undo)."""

    def __init__(self, window: Any, actions: list[QAction]) -> None:
        super().__init__(window)
        self.window = window
        self.actions = actions

    def eventFilter(self, watched: QObject, event: QEvent) -> bool:
        if event.type() != QEvent.Type.ShortcutOverride or not isinstance(watched, QWidget):
            return False
        if watched.window() is not self.window:
            return False  # dialogs keep their fields' own undo
        assert isinstance(event, QKeyEvent)
        pressed = QKeySequence(event.keyCombination())
        return any(pressed in action.shortcuts() for action in self.actions)


class EditActions(QObject):
    """Undo, redo and the element edits of ``window``'s document."""

    def __init__(self, window: Any) -> None:
        super().__init__(window)
        self.window = window
        self.document = document = window.document
        key = QKeySequence.StandardKey
        self.undo_action = document.undo_stack.createUndoAction(window, "&Undo")
        self.undo_action.setShortcut(key.Undo)
        self.undo_action.setIcon(icon("undo"))
        self.redo_action = document.undo_stack.createRedoAction(window, "&Redo")
        self.redo_action.setShortcuts(_redo_keys())
        self.redo_action.setIcon(icon("redo"))
        self._keys_first = ProjectKeysFirst(window, [self.undo_action, self.redo_action])
        QApplication.instance().installEventFilter(self._keys_first)
        self.delete_action = make_action(window, "&Delete elements", self.delete_selection, key.Delete)
        self.rotate_action = make_action(
            window,
            "&Rotate 90°",
            self.rotate_selection,
            "R",
            "rotate",
            "Turn the selected elements a quarter turn counter-clockwise",
        )
        self.copy_levels_action = make_action(
            window,
            "&Copy to levels…",
            self.copy_selection_dialog,
            "Ctrl+Shift+C",
            "copy_levels",
            "Copy the selected elements to another span of levels",
        )
        self.select_all_action = make_action(window, "Select all on this level", self.select_all, key.SelectAll)
        document.project_changed.connect(self.update_enabled)
        document.selection_changed.connect(self.update_enabled)
        self.update_enabled()

    def update_enabled(self, *_: object) -> None:
        selected = bool(self.document.selection)
        for action in (self.delete_action, self.rotate_action, self.copy_levels_action):
            action.setEnabled(selected)
        self.select_all_action.setEnabled(bool(self.document.project.levels))

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
            QMessageBox.warning(self.window, "Copy to levels", str(error))
            return []
        self.document.apply(project, f"Copy {describe(self.document.selection)} to levels {bottom}–{top}")
        self.document.select(new_ids)
        return new_ids

    def copy_selection_dialog(self) -> None:
        project = self.document.project
        if not self.document.selection or not project.levels:
            return
        span = ask_copy_span(self.window, project)
        if span is not None:
            self.copy_selection_to(*span)


def install(window: Any) -> EditActions:
    """Add undo, redo and the element edits to ``window``'s Edit menu."""
    edits = EditActions(window)
    menu = window.menu("edit")
    menu.addActions([edits.undo_action, edits.redo_action])
    menu.addSeparator()
    menu.addActions([edits.select_all_action, edits.delete_action, edits.rotate_action, edits.copy_levels_action])
    return edits
