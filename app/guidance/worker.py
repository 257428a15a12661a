"""Guidance work off the GUI thread: one worker thread runs the jobs (maps, derivatives,
suggestions, loss rankings) in turn, each tagged with a generation; a newer request of the same
kind makes the older one stale, and a stale job stops at its next chunk and reports nothing.

Results reach the GUI thread through queued signals of a parentless QObject the job keeps alive,
so a job that finishes after its panel is gone emits to no one. Each job of the worker runs on
its own analysis session (the GUI thread's analysis keeps the module session to itself).
"""

from __future__ import annotations

from collections.abc import Callable
from typing import Any

from PySide6.QtCore import QObject, QThreadPool, Signal

from core.engine.session import AnalysisSession
from core.errors import AnalysisError, ModelError
from core.guidance.position_map import MapCancelledError

Job = Callable[[AnalysisSession, Callable[[int, int], None], Callable[[], bool]], Any]
"""A job: (session, progress(done, total), stop()) → result. It raises MapCancelledError when asked to stop."""


class _Signals(QObject):
    done = Signal(str, int, object)
    progress = Signal(str, int, int, int)
    failed = Signal(str, int, str)


class GuidanceWorker(QObject):
    """Runs guidance jobs on one background thread; ``done(kind, result)``, ``progress(kind,
    done, total)`` and ``failed(kind, message)`` arrive on the GUI thread for current jobs only."""

    done = Signal(str, object)
    progress = Signal(str, int, int)
    failed = Signal(str, str)

    def __init__(self, parent: QObject | None = None) -> None:
        super().__init__(parent)
        self._pool = QThreadPool()
        self._pool.setMaxThreadCount(1)
        self._session = AnalysisSession()
        self._generation: dict[str, int] = {}
        self._signals = _Signals()
        self._signals.done.connect(self._done)
        self._signals.progress.connect(self._progress)
        self._signals.failed.connect(self._failed)

    def current(self, kind: str) -> int:
        return self._generation.get(kind, 0)

    def submit(self, kind: str, job: Job) -> int:
        """Queue ``job``; any earlier job of ``kind`` becomes stale. Returns the job's generation."""
        generation = self.current(kind) + 1
        self._generation[kind] = generation
        signals, session, generations = self._signals, self._session, self._generation

        def stop() -> bool:
            return generations.get(kind, 0) != generation

        def report(done: int, total: int) -> None:
            signals.progress.emit(kind, generation, done, total)

        def run() -> None:
            if stop():
                return
            try:
                result = job(session, report, stop)
            except MapCancelledError:
                return
            except (AnalysisError, ModelError, ValueError, ArithmeticError) as error:
                signals.failed.emit(kind, generation, str(error))
                return
            signals.done.emit(kind, generation, result)

        self._pool.start(run)
        return generation

    def cancel(self, kind: str | None = None) -> None:
        """Make the running and queued jobs (of ``kind``, or all) stale."""
        for name in [kind] if kind is not None else list(self._generation):
            self._generation[name] = self.current(name) + 1

    def busy(self) -> bool:
        return self._pool.activeThreadCount() > 0

    def wait(self, milliseconds: int = -1) -> bool:
        """Wait for the worker thread to finish its jobs (at shutdown, and in tests)."""
        return self._pool.waitForDone(milliseconds)

    def _done(self, kind: str, generation: int, result: object) -> None:
        if generation == self.current(kind):
            self.done.emit(kind, result)

    def _progress(self, kind: str, generation: int, done: int, total: int) -> None:
        if generation == self.current(kind):
            self.progress.emit(kind, done, total)

    def _failed(self, kind: str, generation: int, message: str) -> None:
        if generation == self.current(kind):
            self.failed.emit(kind, message)
