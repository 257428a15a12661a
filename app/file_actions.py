"""The project file of one main window: new, open, open a sample or a recent file, save, save as,
and the question about unsaved changes before any of them (and before the window closes).

Every way in or out of a file passes through ``FileActions``, so what guards the user's work
lives in one place: asking before discarding; messages for files that cannot be read or written;
the lock that keeps one writer per file ("open read-only / open anyway" when it is in use); the
warning before overwriting a file that changed on disk since it was opened; the question before
overwriting a read-only file; the autosave of unsaved work and, on start, the offer to restore,
compare or discard what a crashed session left (app/recovery.py). A bad file gives a message and
leaves the open project as it was.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

from PySide6.QtCore import QObject
from PySide6.QtGui import QKeySequence
from PySide6.QtWidgets import QFileDialog, QMessageBox

from app.action_factory import make_action
from app.file_guard import FileGuard, LockHolder
from app.recent_files import RecentFiles
from app.recovery import Autosave, RecoveryCopy, difference_text, recovery_text
from app.resources import sample_projects
from core.errors import ModelError
from core.model import Project
from core.model.fileio import ReadOnlyFileError, load_project

FILE_FILTER = "Poise projects (*.poise);;All files (*)"


class FileActions(QObject):
    """The File menu's project actions of ``window`` and the file handling behind them."""

    def __init__(self, window: Any) -> None:
        super().__init__(window)
        self.window = window
        self.document = window.document
        self.recent = RecentFiles(window.settings)
        self.guard = FileGuard()
        self.autosave = Autosave(self.document, window.recovery)
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

    # ------------------------------------------------------------------ questions about the file

    def ask_in_use(self, path: Path, holder: LockHolder) -> str:
        """The file is open for writing elsewhere: 'read-only', 'anyway' or 'cancel'."""
        box = QMessageBox(QMessageBox.Icon.Warning, "File in use", "", parent=self.window)
        box.setText(
            f"{path.name} is open in {holder.describe()}. Two windows saving one file would discard "
            "each other's changes."
        )
        read_only = box.addButton("Open read-only", QMessageBox.ButtonRole.AcceptRole)
        anyway = box.addButton("Open anyway", QMessageBox.ButtonRole.DestructiveRole)
        box.addButton(QMessageBox.StandardButton.Cancel)
        box.exec()
        return {read_only: "read-only", anyway: "anyway"}.get(box.clickedButton(), "cancel")

    def ask_overwrite_changed(self, path: Path) -> bool:
        """The file changed on disk since it was opened or saved: overwrite it?"""
        buttons = QMessageBox.StandardButton
        answer = QMessageBox.warning(
            self.window,
            "File changed on disk",
            f"{path.name} was changed by someone or something else since you opened it. Saving now "
            "replaces those changes with yours (the file as it is now is kept as the .bak copy). "
            "Overwrite it? Cancel, then Save As, keeps both.",
            buttons.Yes | buttons.Cancel,
            buttons.Cancel,
        )
        return answer == buttons.Yes

    def ask_overwrite_read_only(self, path: Path) -> bool:
        buttons = QMessageBox.StandardButton
        answer = QMessageBox.question(
            self.window,
            "Read-only file",
            f"{path.name} is read-only. Overwrite it anyway (it stays read-only)?",
            buttons.Yes | buttons.Cancel,
            buttons.Cancel,
        )
        return answer == buttons.Yes

    def ask_recovery(self, copy: RecoveryCopy, can_restore: bool) -> str:
        """What to do with a crashed session's copy: 'restore', 'compare', 'discard' or 'later'."""
        box = QMessageBox(QMessageBox.Icon.Question, "Recover unsaved work", "", parent=self.window)
        box.setText(f"Poise found {recovery_text(copy)}. Restore it?")
        choices = {}
        if can_restore:
            choices[box.addButton("Restore", QMessageBox.ButtonRole.AcceptRole)] = "restore"
        choices[box.addButton("Compare…", QMessageBox.ButtonRole.ActionRole)] = "compare"
        choices[box.addButton("Discard", QMessageBox.ButtonRole.DestructiveRole)] = "discard"
        choices[box.addButton("Keep for later", QMessageBox.ButtonRole.RejectRole)] = "later"
        box.exec()
        return choices.get(box.clickedButton(), "later")

    def show_difference(self, copy: RecoveryCopy) -> None:
        box = QMessageBox(QMessageBox.Icon.Information, "Recovered work against the file", "", parent=self.window)
        box.setText(f"Lines the recovered copy changes in {copy.original or 'the project'}:")
        box.setDetailedText(difference_text(copy))
        box.exec()

    # ------------------------------------------------------------------ recovery

    def offer_recovery(self) -> bool:
        """Offer each copy a crashed session left; True if one was restored into this window."""
        restored = False
        for copy in self.window.recovery.leftovers():
            answer = self.ask_recovery(copy, can_restore=not restored)
            while answer == "compare":
                self.show_difference(copy)
                answer = self.ask_recovery(copy, can_restore=not restored)
            if answer == "restore":
                restored = self._restore(copy) or restored
            elif answer == "discard":
                copy.remove()
        return restored

    def _restore(self, copy: RecoveryCopy) -> bool:
        """Open ``copy`` as unsaved changes on top of its file (one undo step back to the file)."""
        try:
            recovered = copy.load()
        except ModelError as error:
            self.show_problem("Cannot restore the copy", str(error))
            return False
        base, path = Project(), None
        if copy.original is not None and copy.original.exists():
            try:
                base, path = load_project(copy.original), copy.original
            except ModelError:
                pass
        self.document.reset(base, path)
        if path is not None:
            self.guard.take(path)
        else:
            self.guard.release()
        self.document.apply(recovered, "Recovered work")
        self.autosave.write_now()
        copy.remove()
        self.window.plan_view.fit()
        return True

    def close(self) -> None:
        """The window closes (its work saved or let go): unlock the file, drop the autosave copy."""
        self.guard.release()
        self.window.recovery.discard()

    # ------------------------------------------------------------------ opening

    def new_project(self) -> None:
        if self.confirm_discard():
            self.guard.release()
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
        holder = self.guard.holder(Path(path)) if Path(path) != self.guard.path else None
        answer = self.ask_in_use(Path(path), holder) if holder is not None else "anyway"
        if answer == "cancel":
            return False
        try:
            self.document.open(Path(path))
        except ModelError as error:
            self.show_problem("Cannot open the project", str(error))
            self.recent.forget(Path(path))
            return False
        self.guard.take(Path(path), read_only=answer == "read-only")
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
        self.guard.release()
        self.document.reset(project, None)
        self.window.plan_view.fit()
        return True

    # ------------------------------------------------------------------ saving

    def save(self) -> bool:
        if self.document.file_path is None or self.guard.read_only:
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
        same = path == self.guard.path
        if same and self.guard.read_only:
            self.show_problem("Opened read-only", f"{path.name} is open elsewhere: save under another name.")
            return False
        if same and self.guard.changed_on_disk() and not self.ask_overwrite_changed(path):
            return False
        if not same and (holder := self.guard.holder(path)) is not None:
            self.show_problem("File in use", f"{path.name} is open in {holder.describe()}: choose another name.")
            return False
        try:
            try:
                self.document.save(path)
            except ReadOnlyFileError:
                if not self.ask_overwrite_read_only(path):
                    return False
                self.document.save(path, overwrite_read_only=True)
        except (OSError, ModelError) as error:
            self.show_problem("Cannot save the project", f"{path}: {error}")
            return False
        if same:
            self.guard.remember()
        else:
            self.guard.take(path)
        self.recent.remember(path)
        self.window.status.show_file_note(f"Saved {path.name}")
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
