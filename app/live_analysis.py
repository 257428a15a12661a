"""Live analysis: re-run ``analyse()`` on the newest project state, coalescing bursts of edits.

A request only remembers the newest project and arms a zero-delay timer; when the event loop
is idle again the timer runs one analysis of whatever is newest. Mouse moves that arrive while
an analysis runs are therefore folded into the next one, and the window never queues stale work.
``analyse()`` takes a few milliseconds for the sample buildings (benchmarks/bench_drag.py), so it
runs on the GUI thread; nothing here is shared with another thread.
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


class LiveAnalysis(QObject):
    """Runs ``analyse`` on the newest requested project and reports each outcome once."""

    computed = Signal(object, object, object, float)
    """(project, Results or None, AnalysisError or None, seconds taken)."""

    def __init__(self, analyse_function: Callable[[Project], Results] = analyse, parent: QObject | None = None):
        super().__init__(parent)
        self._analyse = analyse_function
        self._pending: Project | None = None
        self._last: Project | None = None
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
        if not self._timer.isActive():
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
        self.computed.emit(project, results, error, time.perf_counter() - start)
