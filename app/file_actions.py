"""The project file of one main window: new, open, open a sample or a recent file, save, save as,
and the question about unsaved changes before any of them (and before the window closes).

Every way in or out of a file passes through ``FileActions``, so what guards the user's work
(asking before discarding, messages for files that cannot be read or written) lives in one place.
A bad file gives a message and leaves the open project as it was.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

from PySide6.QtCore import QObject
from PySide6.QtGui import QKeySequence
from PySide6.QtWidgets import QFileDialog, QMessageBox

from app.action_factory import make_action
from app.recent_files import RecentFiles
from app.resources import sample_projects
from core.errors import ModelError
from core.model import Project
from core.model.fileio import load_project

FILE_FILTER = "Poise projects (*.poise);;All files (*)"


class FileActions(QObject):
    """The File menu's project actions of ``window`` and the file handling behind them."""

    def __init__(self, window: Any) -> None:
        super().__init__(window)
        self.window = window
        self.document = window.document
        self.recent = RecentFiles(window.settings)
        key = QKeySequence.StandardKey
        self.new_action = make_action(window, "&New", self.new_project, key.New)
        self.open_action = make_action(window, "&Open…", self.open_dialog, key.Open)
        self.save_action = make_action(window, "&Save", self.save, key.Save)
        self.save_as_action = make_action(window, "Save &As…", self.save_as, key.SaveAs)
        self.quit_action = make_action(window, "&Quit", window.close, key.Quit)

    # ------------------------------------------------------------------ unsaved changes

    def ask_unsaved(self) -> str:
        """Ask what to do with unsaved changes: 'save', 'discard' or 'cancel'."""
        buttons = QMessageBox.StandardButton
        answer = QMessageBox.question(
            self.window,
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
        QMessageBox.warning(self.window, title, text)

    # ------------------------------------------------------------------ opening

    def new_project(self) -> None:
        if self.confirm_discard():
            self.document.reset(Project())
            self.window.drawing.set_tool("polygon-outline")
            self.window.plan_view.fit()

    def open_dialog(self) -> None:
        if not self.confirm_discard():
            return
        start = str(self.document.file_path.parent) if self.document.file_path else ""
        path, _ = QFileDialog.getOpenFileName(self.window, "Open project", start, FILE_FILTER)
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
            self.recent.forget(Path(path))
            return False
        self.recent.remember(Path(path))
        self.window.plan_view.fit()
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
        self.window.plan_view.fit()
        return True

    # ------------------------------------------------------------------ saving

    def save(self) -> bool:
        if self.document.file_path is None:
            return self.save_as()
        return self._save_to(self.document.file_path)

    def save_as(self, path: Path | None = None) -> bool:
        if path is None:
            start = str(self.document.file_path or f"{self.document.project.name}.poise")
            chosen, _ = QFileDialog.getSaveFileName(self.window, "Save project as", start, FILE_FILTER)
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
        self.recent.remember(path)
        self.window.status.show_hint(f"Saved {path.name}")
        return True

    # ------------------------------------------------------------------ menus

    def fill_recent(self) -> None:
        """Rebuild the Open recent submenu (it is filled each time it opens)."""
        self.recent_menu.clear()
        recent = self.recent.paths()
        if not recent:
            self.recent_menu.addAction("(none yet)").setEnabled(False)
        for text in recent:
            self.recent_menu.addAction(text, lambda t=text: self.open_file(Path(t)))

    def add_to(self, file_menu: Any) -> None:
        file_menu.addActions([self.new_action, self.open_action])
        self.samples_menu = file_menu.addMenu("Open &sample")
        for path in sample_projects():
            self.samples_menu.addAction(path.stem.replace("_", " "), lambda p=path: self.open_sample(p))
        self.recent_menu = file_menu.addMenu("Open &recent")
        self.recent_menu.aboutToShow.connect(self.fill_recent)
        file_menu.addSeparator()
        file_menu.addActions([self.save_action, self.save_as_action])
        file_menu.addSeparator()
        file_menu.addAction(self.quit_action)


def install(window: Any) -> FileActions:
    """Add the project file actions to ``window``'s File menu (Quit last)."""
    files = FileActions(window)
    files.add_to(window.menu("file"))
    return files
