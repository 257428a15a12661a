"""Live analysis: re-run ``analyse()`` on the newest project state, at once when that is quick.

``analyse()`` takes a few milliseconds for the sample buildings (benchmarks/bench_drag.py: 3–9 ms
here), so while the last run was quicker than ``INLINE_SECONDS`` a request is analysed at once, and
a mouse move is followed by a single repaint that already shows its results. A model that takes
longer is analysed from a zero-delay timer instead: the request only remembers the newest
project, so moves that arrive meanwhile fold into one run and the window never queues stale work.
Everything runs on the GUI thread; nothing is shared with another thread.
"""

from __future__ import annotations

import sys
import time
import traceback
from collections.abc import Callable

from PySide6.QtCore import QObject, QTimer, Signal

from core.analysis import analyse
from core.errors import AnalysisError
from core.model import Project
from core.results import Results

INLINE_SECONDS = 0.03
"""Analyse at once (inside the edit) while the previous analysis took less than this."""


class LiveAnalysis(QObject):
    """Runs ``analyse`` on the newest requested project and reports each outcome once."""

    computed = Signal(object, object, object, float)
    """(project, Results or None, AnalysisError or None, seconds taken)."""

    def __init__(self, analyse_function: Callable[[Project], Results] = analyse, parent: QObject | None = None):
        super().__init__(parent)
        self._analyse = analyse_function
        self._pending: Project | None = None
        self._last: Project | None = None
        self._last_seconds = 0.0
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(0)
        self._timer.timeout.connect(self.flush)

    @property
    def pending(self) -> bool:
        return self._pending is not None

    def request(self, project: Project) -> None:
        """Analyse ``project`` soon (at the next idle moment), replacing any older request."""
        self._pending = project
        if self._last_seconds < INLINE_SECONDS:
            self.flush()
        elif not self._timer.isActive():
            self._timer.start()

    def flush(self) -> None:
        """Run the pending analysis now, if there is one."""
        self._timer.stop()
        project, self._pending = self._pending, None
        if project is None or project is self._last:
            return
        self._last = project
        start = time.perf_counter()
        results: Results | None = None
        error: AnalysisError | None = None
        try:
            results = self._analyse(project)
        except AnalysisError as failure:
            error = failure
        except Exception as failure:  # a defect in the engine must not take the editor down
            traceback.print_exc(file=sys.stderr)
            error = AnalysisError(f"the analysis failed unexpectedly ({type(failure).__name__}: {failure})")
        self._last_seconds = time.perf_counter() - start
        self.computed.emit(project, results, error, self._last_seconds)
