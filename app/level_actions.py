"""The Level menu of one main window: add, insert, duplicate and delete levels, and step up and down
through them. Each change is one undo step; the changes are enabled only when the project has levels."""

from __future__ import annotations

from typing import Any

from PySide6.QtCore import QObject
from PySide6.QtGui import QAction

from app import commands
from app.action_factory import make_action
from app.tools.select import describe


class LevelActions(QObject):
    """The level changes of ``window``'s document; ``changes`` also sit under the levels panel."""

    def __init__(self, window: Any) -> None:
        super().__init__(window)
        self.window = window
        self.document = document = window.document
        self.add_level_action = make_action(
            window,
            "&Add level on top",
            self.add_level,
            None,
            "level_add",
            "A new level above the roof with the top level's outline",
        )
        self.insert_level_action = make_action(
            window,
            "&Insert level below",
            self.insert_level,
            None,
            "level_insert",
            "A new level under the current one; elements passing it span it too",
        )
        self.duplicate_level_action = make_action(
            window,
            "&Duplicate level with its elements",
            self.duplicate_level,
            None,
            "level_duplicate",
            "A copy of the current level directly above it, elements carried up",
        )
        self.delete_level_action = make_action(
            window, "De&lete level", self.delete_level, None, "level_delete", "Remove the current level and its storey"
        )
        self.level_up_action = make_action(window, "Level a&bove", lambda: self.step_level(1), "PgUp")
        self.level_down_action = make_action(window, "Level bel&ow", lambda: self.step_level(-1), "PgDown")
        document.project_changed.connect(self.update_enabled)
        self.update_enabled()

    @property
    def changes(self) -> list[QAction]:
        """The four actions that change the list of levels."""
        return [self.add_level_action, self.insert_level_action, self.duplicate_level_action, self.delete_level_action]

    def update_enabled(self, *_: object) -> None:
        has_levels = bool(self.document.project.levels)
        for action in self.changes:
            action.setEnabled(has_levels)

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
                self.window.status.show_hint(
                    f"Deleted {name} and {describe(removed)} that stood only in its storey (Undo restores)."
                )


def install(window: Any) -> LevelActions:
    """Add the level changes and the level steps to ``window``'s Level menu."""
    levels = LevelActions(window)
    menu = window.menu("level")
    menu.addActions(levels.changes)
    menu.addSeparator()
    menu.addActions([levels.level_up_action, levels.level_down_action])
    return levels
