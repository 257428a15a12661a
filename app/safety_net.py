"""The last line of defence: an unexpected error in the editor keeps the program and the work.

Qt calls Python slots from its event loop; an exception that escapes one reaches
``sys.excepthook``. Poise's hook prints the traceback to standard error, writes the open project
to a new copy in the recovery folder (app/recovery.py; offered back on the next start), and tells
the user in a message box — the window stays open.
"""

from __future__ import annotations

import sys
import traceback
from pathlib import Path
from types import TracebackType

from PySide6.QtWidgets import QMessageBox, QWidget

from app.document import ProjectDocument
from app.recovery import RecoveryStore


def save_recovery(document: ProjectDocument, store: RecoveryStore) -> Path | None:
    """Write the project's last committed state to a new copy in the recovery folder (offered on
    the next start); None if even that fails."""
    try:
        return store.save_error_copy(document.project, document.file_path).copy
    except OSError:
        return None


def install(window: QWidget, document: ProjectDocument, store: RecoveryStore) -> None:
    """Route uncaught exceptions to a message box over ``window`` after saving a recovery copy."""

    def hook(kind: type[BaseException], error: BaseException, trace: TracebackType | None) -> None:
        traceback.print_exception(kind, error, trace, file=sys.stderr)
        if issubclass(kind, KeyboardInterrupt):
            return
        saved = save_recovery(document, store)
        where = f"A copy of your project was saved to {saved}." if saved else "No recovery copy could be written."
        QMessageBox.critical(
            window,
            "Poise — unexpected error",
            f"Something went wrong inside Poise: {error}\n\n{where}\n"
            "The window stays open; save your work under a new name before going on.",
        )

    sys.excepthook = hook
