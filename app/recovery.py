"""Recovery copies of unsaved work, in the user's data folder, never beside the user's file.

Each editor session owns one autosave copy under a name no other session uses (the file's stem,
the time and a random tag), with a small JSON note of the file it belongs to; a QLockFile held by
the session marks the copy as in use. On the next start, copies whose session is gone (a crash,
a kill, a power cut) are offered back. The safety net's copies after an unexpected error go to the
same folder, each under a new name, so no copy ever overwrites another.
"""

from __future__ import annotations

import json
import os
import secrets
import time
from dataclasses import dataclass
from pathlib import Path

import shiboken6
from PySide6.QtCore import QLockFile, QObject, QStandardPaths, QTimer

from app.document import ProjectDocument
from core.errors import ModelError
from core.model import Project
from core.model.fileio import load_project, save_project

AUTOSAVE_SECONDS = 60
"""Unsaved work is copied at least this often."""
AUTOSAVE_EDITS = 20
"""… and after this many edits, whichever comes first."""
COPY_SUFFIX = ".poise"
NOTE_SUFFIX = ".json"
LOCK_SUFFIX = ".lock"


def default_folder() -> Path:
    """``recovery`` in the platform's application data folder (QStandardPaths.AppDataLocation)."""
    return Path(QStandardPaths.writableLocation(QStandardPaths.StandardLocation.AppDataLocation)) / "recovery"


def safe_stem(path: Path | None) -> str:
    """A short, always encodable stem for a copy's name: letters, digits, '-', '_' of the file's
    stem (lone surrogates and separators dropped), or 'untitled'."""
    stem = "".join(c for c in (path.stem if path else "") if (c.isalnum() and c.isprintable()) or c in "-_")
    return stem[:40] or "untitled"


@dataclass(frozen=True)
class RecoveryCopy:
    """A copy on disk: the project file, its note, and what the note says."""

    copy: Path
    original: Path | None
    """The file the work belonged to (None if it had never been saved)."""
    saved_at: float
    """When the copy was written, seconds since the epoch."""
    reason: str
    """'autosave' or 'error'."""

    @property
    def note(self) -> Path:
        return self.copy.with_suffix(NOTE_SUFFIX)

    def load(self) -> Project:
        return load_project(self.copy)

    def remove(self) -> None:
        for path in (self.copy, self.note, self.copy.with_suffix(LOCK_SUFFIX)):
            path.unlink(missing_ok=True)


class RecoveryStore:
    """The recovery folder: write this session's copy, find the copies crashed sessions left."""

    def __init__(self, folder: Path | None = None) -> None:
        self.folder = Path(folder) if folder is not None else default_folder()
        self._own: RecoveryCopy | None = None
        self._lock: QLockFile | None = None

    def _new_name(self, original: Path | None, reason: str) -> Path:
        stamp = time.strftime("%Y%m%d-%H%M%S")
        tag = secrets.token_hex(4)
        return self.folder / f"{safe_stem(original)}.{reason}-{stamp}-{tag}{COPY_SUFFIX}"

    def _write(self, project: Project, copy: Path, original: Path | None, reason: str) -> RecoveryCopy:
        self.folder.mkdir(parents=True, exist_ok=True)
        save_project(project, copy)
        entry = RecoveryCopy(copy, original, time.time(), reason)
        note = {"original": None if original is None else str(original), "saved_at": entry.saved_at, "reason": reason}
        temporary = entry.note.with_suffix(".note.tmp")
        # ensure_ascii keeps a path with undecodable bytes (lone surrogates) writable and readable
        temporary.write_text(json.dumps(note, ensure_ascii=True), encoding="ascii")
        os.replace(temporary, entry.note)
        return entry

    def autosave(self, project: Project, original: Path | None) -> RecoveryCopy:
        """Write this session's copy (the same name for the whole session; locked while alive)."""
        if self._own is None or self._own.original != original:
            self.discard()
            copy = self._new_name(original, "autosave")
            self.folder.mkdir(parents=True, exist_ok=True)
            self._lock = QLockFile(str(copy.with_suffix(LOCK_SUFFIX)))
            self._lock.setStaleLockTime(0)
            self._lock.tryLock(0)
            self._own = RecoveryCopy(copy, original, 0.0, "autosave")
        self._own = self._write(project, self._own.copy, original, "autosave")
        return self._own

    def save_error_copy(self, project: Project, original: Path | None) -> RecoveryCopy:
        """A copy after an unexpected error: always a new name, never overwriting another copy."""
        return self._write(project, self._new_name(original, "recovered"), original, "error")

    def discard(self) -> None:
        """Remove this session's autosave copy (the work was saved, or let go)."""
        if self._own is not None:
            self._own.remove()
            self._own = None
        if self._lock is not None:
            self._lock.unlock()
            self._lock = None

    def leftovers(self) -> list[RecoveryCopy]:
        """Copies no running session owns, newest first (unreadable notes are skipped)."""
        found = []
        for note in self.folder.glob(f"*{NOTE_SUFFIX}"):
            copy = note.with_suffix(COPY_SUFFIX)
            if not copy.exists() or (self._own is not None and copy == self._own.copy):
                continue
            lock = QLockFile(str(copy.with_suffix(LOCK_SUFFIX)))
            lock.setStaleLockTime(0)
            if not lock.tryLock(0):
                continue  # another window's autosave, alive
            lock.unlock()
            try:
                data = json.loads(note.read_text(encoding="ascii"))
                original = None if data["original"] is None else Path(data["original"])
                found.append(RecoveryCopy(copy, original, float(data["saved_at"]), str(data["reason"])))
            except (OSError, ValueError, KeyError, TypeError):
                continue
        return sorted(found, key=lambda c: c.saved_at, reverse=True)


class Autosave(QObject):
    """Copies the document's unsaved work to the store every ``seconds`` and after ``edits`` edits;
    removes the copy when the work is saved or a new project replaces it."""

    def __init__(
        self,
        document: ProjectDocument,
        store: RecoveryStore,
        seconds: float = AUTOSAVE_SECONDS,
        edits: int = AUTOSAVE_EDITS,
    ) -> None:
        super().__init__(document)
        self.document = document
        self.store = store
        self.edits = edits
        self._pending = 0
        self._written_index: int | None = None
        self.last_error = ""
        """Why the last copy could not be written ('' when it was)."""
        self.timer = QTimer(self)
        self.timer.setInterval(int(seconds * 1000))
        self.timer.timeout.connect(self.write_now)
        self.timer.start()
        document.undo_stack.indexChanged.connect(self._edited)
        document.undo_stack.cleanChanged.connect(self._clean_changed)
        document.file_path_changed.connect(self._clean_changed)

    def _alive(self) -> bool:
        """False while the window is being torn down (its undo stack already deleted)."""
        return shiboken6.isValid(self.document.undo_stack)

    def _edited(self) -> None:
        self._pending += 1
        if self._pending >= self.edits:
            self.write_now()

    def _clean_changed(self) -> None:
        if self._alive() and not self.document.is_modified:
            self.store.discard()
            self._pending = 0
            self._written_index = None

    def write_now(self) -> None:
        """Copy the unsaved work now, if there is any not yet copied."""
        document = self.document
        if not self._alive():
            return
        index = document.undo_stack.index()
        if not document.is_modified or index == self._written_index:
            return
        try:
            self.store.autosave(document.project, document.file_path)
        except (OSError, ModelError) as error:
            self.last_error = str(error)
            return
        self.last_error = ""
        self._written_index = index
        self._pending = 0


def recovery_text(copy: RecoveryCopy) -> str:
    """One line saying what a leftover copy is, for the restore prompt."""
    when = time.strftime("%Y-%m-%d %H:%M", time.localtime(copy.saved_at))
    what = "unsaved work" if copy.reason == "autosave" else "work saved after an unexpected error"
    where = f"of {copy.original}" if copy.original else "of a project never saved"
    return f"{what} {where}, copied {when}"


def difference_text(copy: RecoveryCopy) -> str:
    """What the copy changes against the file it belongs to, as a unified diff of the files."""
    import difflib

    theirs = copy.copy.read_text(encoding="utf-8").splitlines()
    if copy.original is None or not copy.original.exists():
        return "The file it belongs to is not there; the copy holds:\n" + "\n".join(theirs[:40])
    try:
        ours = copy.original.read_text(encoding="utf-8").splitlines()
    except (OSError, UnicodeDecodeError) as error:
        return f"The file it belongs to cannot be read: {error}"
    lines = list(difflib.unified_diff(ours, theirs, "on disk", "recovered", lineterm="", n=1))
    return "\n".join(lines[:400]) if lines else "The copy equals the file on disk."
