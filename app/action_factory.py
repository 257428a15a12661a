"""Icons and menu actions made one way for every part of the window."""

from __future__ import annotations

from collections.abc import Callable
from typing import Any

from PySide6.QtCore import QObject
from PySide6.QtGui import QAction, QIcon, QKeySequence

from app.resources import icon_path


def icon(name: str) -> QIcon:
    """The bundled icon ``name``, or an empty icon when the file is missing."""
    path = icon_path(name)
    return QIcon(str(path)) if path.exists() else QIcon()


def make_action(
    parent: QObject,
    text: str,
    slot: Callable[[], object],
    shortcut: Any = None,
    icon_name: str = "",
    tip: str = "",
) -> QAction:
    """An action that calls ``slot`` without arguments; the tip shows as tooltip and status tip."""
    action = QAction(text, parent)
    if icon_name:
        action.setIcon(icon(icon_name))
    if shortcut is not None:
        action.setShortcut(QKeySequence(shortcut))
    if tip:
        action.setToolTip(tip)
        action.setStatusTip(tip)
    action.triggered.connect(lambda _checked=False: slot())
    return action
