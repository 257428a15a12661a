"""Canary for the PySide6 6.12.0 / Python 3.11 defect: each signal emit leaked a reference to True
and the process aborted ("Fatal Python error: bool_dealloc") after about two thousand emits."""

from __future__ import annotations

import sys

from PySide6.QtCore import QObject, Signal


class _Emitter(QObject):
    pinged = Signal()
    flagged = Signal(bool)


def test_signal_emits_keep_the_refcount_of_true(qapp):
    """10,000 emits must leave sys.getrefcount(True) where it was; checked every 100 emits so the
    leak is reported as a failure before it can abort the process."""
    emitter = _Emitter()
    received = []
    emitter.flagged.connect(received.append)
    before = sys.getrefcount(True)
    for batch in range(100):
        for _ in range(100):
            emitter.pinged.emit()
            emitter.flagged.emit(True)
        received.clear()
        now = sys.getrefcount(True)
        assert now >= before, f"refcount of True fell from {before} to {now} after {100 * (batch + 1)} emits"
