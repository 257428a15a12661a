"""The animation clock shared by the mode views: play, pause, step, pace.

A precise timer asks for a frame every ``FRAME_MS``; the phase is read from an elapsed-time
clock, so a late or dropped frame never slows the motion down, it only skips ahead. The pace is
visual (seconds per cycle on screen), not the mode's real period.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QElapsedTimer, QObject, Qt, QTimer, Signal

FRAME_MS = 16
"""Timer interval, ms (about 60 frames per second when the drawing keeps up)."""
STEP_FRACTION = 1 / 16
"""One press of Step advances the motion by this share of a cycle."""
DEFAULT_CYCLE_SECONDS = 2.0


class ModeClock(QObject):
    """Phase of the mode animation, radians in [0, 2π); emits ``phase_changed`` for each frame."""

    phase_changed = Signal(float)
    playing_changed = Signal(bool)

    def __init__(self, parent: QObject | None = None) -> None:
        super().__init__(parent)
        self._timer = QTimer(self)
        self._timer.setTimerType(Qt.TimerType.PreciseTimer)
        self._timer.setInterval(FRAME_MS)
        self._timer.timeout.connect(self._tick)
        self._elapsed = QElapsedTimer()
        self._phase_at_start = 0.0
        self._phase = 0.0
        self._cycle = DEFAULT_CYCLE_SECONDS
        self._playing = False
        self._suspended = False

    @property
    def phase(self) -> float:
        return self._phase

    @property
    def playing(self) -> bool:
        """The user's choice: True while playing, even when suspended because the view is hidden."""
        return self._playing

    @property
    def running(self) -> bool:
        """True while the timer actually ticks."""
        return self._timer.isActive()

    @property
    def cycle_seconds(self) -> float:
        return self._cycle

    def set_cycle_seconds(self, seconds: float) -> None:
        """Screen time for one full cycle; the motion carries on from where it is."""
        self._rebase()
        self._cycle = max(0.05, float(seconds))

    def play(self) -> None:
        if not self._playing:
            self._playing = True
            self.playing_changed.emit(True)
        self._start_if_allowed()

    def pause(self) -> None:
        self._rebase()
        self._timer.stop()
        if self._playing:
            self._playing = False
            self.playing_changed.emit(False)

    def toggle(self) -> None:
        if self._playing:
            self.pause()
        else:
            self.play()

    def step(self, fraction: float = STEP_FRACTION) -> None:
        """Pause and move the motion on by ``fraction`` of a cycle."""
        self.pause()
        self.set_phase(self._phase + 2 * math.pi * fraction)

    def set_phase(self, phase: float) -> None:
        self._phase = phase % (2 * math.pi)
        self._phase_at_start = self._phase
        self._elapsed.restart()
        self.phase_changed.emit(self._phase)

    def suspend(self) -> None:
        """Stop ticking (the views are hidden) without forgetting that the user wants motion."""
        self._rebase()
        self._suspended = True
        self._timer.stop()

    def resume(self) -> None:
        self._suspended = False
        self._start_if_allowed()

    def _start_if_allowed(self) -> None:
        if self._playing and not self._suspended and not self._timer.isActive():
            self._phase_at_start = self._phase
            self._elapsed.restart()
            self._timer.start()

    def _rebase(self) -> None:
        """Fold the time run so far into the phase, so pace changes and pauses do not jump."""
        if self._timer.isActive():
            self._phase = self._current()
            self._phase_at_start = self._phase
            self._elapsed.restart()

    def _current(self) -> float:
        turns = self._elapsed.elapsed() / 1000.0 / self._cycle
        return (self._phase_at_start + 2 * math.pi * turns) % (2 * math.pi)

    def _tick(self) -> None:
        self._phase = self._current()
        self.phase_changed.emit(self._phase)
