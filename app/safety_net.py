"""The last line of defence: an unexpected error in the editor keeps the program and the work.

Qt calls Python slots from its event loop; an exception that escapes one reaches
``sys.excepthook``. Poise's hook prints the traceback to standard error, writes the open project
to a recovery file, and tells the user in a message box — the window stays open.
"""

from __future__ import annotations

import sys
import tempfile
import traceback
from pathlib import Path
from types import TracebackType

from PySide6.QtWidgets import QMessageBox, QWidget

from app.document import ProjectDocument
from core.model.fileio import save_project

RECOVERY_SUFFIX = ".recovered.poise"


def recovery_path(document: ProjectDocument) -> Path:
    """Beside the open file (``office.poise`` → ``office.recovered.poise``), else in the temp folder."""
    if document.file_path is not None:
        return document.file_path.with_name(document.file_path.stem + RECOVERY_SUFFIX)
    return Path(tempfile.gettempdir()) / f"untitled{RECOVERY_SUFFIX}"


def save_recovery(document: ProjectDocument) -> Path | None:
    """Write the project's last committed state to its recovery file; None if even that fails."""
    for path in (recovery_path(document), Path(tempfile.gettempdir()) / f"poise{RECOVERY_SUFFIX}"):
        try:
            save_project(document.project, path)
            return path
        except OSError:
            continue
    return None


def install(window: QWidget, document: ProjectDocument) -> None:
    """Route uncaught exceptions to a message box over ``window`` after saving a recovery copy."""

    def hook(kind: type[BaseException], error: BaseException, trace: TracebackType | None) -> None:
        traceback.print_exception(kind, error, trace, file=sys.stderr)
        if issubclass(kind, KeyboardInterrupt):
            return
        saved = save_recovery(document)
        where = f"A copy of your project was saved to {saved}." if saved else "No recovery copy could be written."
        QMessageBox.critical(
            window,
            "Poise — unexpected error",
            f"Something went wrong inside Poise: {error}\n\n{where}\n"
            "The window stays open; save your work under a new name before going on.",
        )

    sys.excepthook = hook
