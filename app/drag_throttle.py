"""How a panel that costs more than a mouse move follows the document's results: a committed
change at once, a drag's previews at most every ``interval_ms`` while the panel is on screen, and
a drag's final state as soon as the drag ends (not when the timer would next fire)."""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtCore import QObject, QTimer

from app.document import ProjectDocument


class DragThrottle(QObject):
    """Calls ``refresh`` when ``document``'s results change, throttled during a drag while
    ``on_screen()``. ``refresh`` calls :meth:`cancel` and brings the panel up to date (or, off
    screen, remembers that it is stale)."""

    def __init__(
        self,
        document: ProjectDocument,
        interval_ms: int,
        refresh: Callable[[], None],
        on_screen: Callable[[], bool],
        parent: QObject | None = None,
    ) -> None:
        super().__init__(parent)
        self.document = document
        self._refresh = refresh
        self._on_screen = on_screen
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(interval_ms)
        self._timer.timeout.connect(refresh)
        document.results_changed.connect(self._results_changed)
        document.preview_changed.connect(self._preview_changed)

    def cancel(self) -> None:
        """Drop a pending throttled refresh (the panel is refreshing now)."""
        self._timer.stop()

    def _results_changed(self) -> None:
        if self.document.previewing and self._on_screen():
            if not self._timer.isActive():
                self._timer.start()
            return
        self._refresh()

    def _preview_changed(self) -> None:
        if not self.document.previewing and self._timer.isActive():
            self._refresh()
