"""Frames per second of the mode animation (plan and 3D views) on each sample, offscreen.

Prints, per sample and for its first mode:
- core ms: computing one frame's arrays for both views (core.report.mode_frames);
- sync fps: frames drawn back to back, each one phase step plus a forced repaint of both views;
- timer fps: frames actually painted by each view while the animation clock runs for a few
  seconds through the event loop (the timer asks for about 60; aim at 30 or more).
Offscreen rendering is software rendering, so a desktop with a GPU-backed window system is
usually no slower.
"""

from __future__ import annotations

import math
import os
import sys
import time
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from PySide6.QtCore import QEvent, QObject, QTimer
from PySide6.QtWidgets import QApplication

from app.document import ProjectDocument
from app.mode_views.panel import ModeViewsPanel
from app.resources import sample_projects

RUN_SECONDS = 3.0
SYNC_FRAMES = 200


class PaintCounter(QObject):
    """Counts the paint events a widget receives."""

    def __init__(self, widget) -> None:
        super().__init__(widget)
        self.count = 0
        widget.installEventFilter(self)

    def eventFilter(self, watched, event) -> bool:
        if event.type() == QEvent.Type.Paint:
            self.count += 1
        return False


def measure(app: QApplication, path: Path) -> tuple[float, float, float, float]:
    document = ProjectDocument()
    document.open(path)
    document.flush_analysis()
    panel = ModeViewsPanel(document)
    panel.resize(1500, 900)
    panel.show()
    app.processEvents()

    plan_motion, building = panel.plan._motion, panel.building
    start = time.perf_counter()
    for i in range(SYNC_FRAMES):
        phase = 2 * math.pi * i / 60
        plan_motion.plan(phase)
        building._motion.screen(phase, building.view, building._origin)
    core_ms = (time.perf_counter() - start) / SYNC_FRAMES * 1e3

    start = time.perf_counter()
    for i in range(SYNC_FRAMES):
        panel.clock.set_phase(2 * math.pi * i / 60)
        panel.plan.viewport().repaint()
        panel.building.viewport().repaint()
    sync_fps = SYNC_FRAMES / (time.perf_counter() - start)

    plan_paints = PaintCounter(panel.plan.viewport())
    building_paints = PaintCounter(panel.building.viewport())
    panel.clock.play()
    QTimer.singleShot(int(RUN_SECONDS * 1000), app.quit)
    app.exec()
    panel.clock.pause()
    result = (core_ms, sync_fps, plan_paints.count / RUN_SECONDS, building_paints.count / RUN_SECONDS)
    panel.close()
    panel.deleteLater()
    app.processEvents()
    return result


def main() -> None:
    app = QApplication.instance() or QApplication(sys.argv)
    print(f"{'sample':<32}{'core ms':>9}{'sync fps':>10}{'timer fps plan':>16}{'timer fps 3D':>14}")
    for path in sample_projects():
        core_ms, sync_fps, plan_fps, building_fps = measure(app, path)
        print(f"{path.stem:<32}{core_ms:>9.3f}{sync_fps:>10.1f}{plan_fps:>16.1f}{building_fps:>14.1f}")


if __name__ == "__main__":
    main()
