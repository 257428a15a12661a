"""Panels that do their work only while shown: a request made while the panel is hidden waits
until the panel is next shown, so a hidden dock costs nothing during a drag."""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtCore import QEvent, QObject
from PySide6.QtWidgets import QWidget


class WhenShown(QObject):
    """Runs ``fill`` for ``panel`` now if it is visible, else at its next show event."""

    def __init__(self, panel: QWidget, fill: Callable[[], None]) -> None:
        super().__init__(panel)
        self._panel = panel
        self._fill = fill
        self.stale = False
        """A request came while the panel was hidden; it is filled when shown."""
        panel.installEventFilter(self)

    def request(self, *_: object) -> None:
        """Bring the panel up to date now, or when it is next shown if it is hidden."""
        if self._panel.isVisible():
            self.fill()
        else:
            self.stale = True

    def fill(self) -> None:
        self.stale = False
        self._fill()

    def eventFilter(self, watched: QObject, event: QEvent) -> bool:
        if watched is self._panel and event.type() == QEvent.Type.Show and self.stale:
            self.fill()
        return False
