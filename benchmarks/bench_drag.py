"""Time per drag step in the editor: one mouse move → live analysis → overlays and views redrawn.

For each sample project and a generated 20-level, 100-element building (benchmarks/buildings.py)
the main window is opened offscreen at 1600 × 1000 with its default
panels, the first element of level 1 is grabbed by its middle and dragged back and forth in 0.25 m
steps (every step a new position, so every step re-analyses). One step is timed from the mouse
move until the event loop is idle again and the plan has been repainted, which includes the
analysis, the scene update, the readouts, the strip, the tables and the mode views.

Run: ``QT_QPA_PLATFORM=offscreen python benchmarks/bench_drag.py [--json out.json]`` (or with
``QT_QPA_PLATFORM=xcb DISPLAY=:N`` under Xvfb).
"""

from __future__ import annotations

import argparse
import json
import os
import statistics
import sys
import tempfile
import time
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from PySide6.QtCore import QPointF, QSettings, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication, QDockWidget

from app.main_window import MainWindow
from app.resources import sample_projects
from benchmarks.buildings import generated_building
from core.model.fileio import save_project

STEPS = 120
STEP_METRES = 0.25
"""Every step moves the element this far (the grid spacing too), up to 10 m and back."""


def bench(window: MainWindow, path: Path) -> dict[str, float]:
    app = QApplication.instance()
    window.files.ask_unsaved = lambda: "discard"
    window.files.open_sample(path, confirm=False)
    window.tool_options.grid.setValue(STEP_METRES)
    window.drawing.set_tool("select")
    app.processEvents()
    window.plan_view.fit()
    window.document.flush_analysis()
    app.processEvents()
    view, viewport = window.plan_view, window.plan_view.viewport()
    element = window.document.project.elements_in_storey(1)[0]
    (x0, y0) = element.midpoint
    c, s = element.direction
    nx, ny = -s, c  # drag across the element's line, toward the middle of the floor
    centre = window.document.results.floors[0].centre
    if (centre[0] - x0) * nx + (centre[1] - y0) * ny < 0:
        nx, ny = -nx, -ny
    QTest.mouseMove(viewport, view.mapFromScene(QPointF(x0, y0)))
    QTest.mousePress(
        viewport, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, view.mapFromScene(QPointF(x0, y0))
    )
    app.processEvents()
    step_times, analysis_times, failed = [], [], 0
    offsets = [STEP_METRES * (i % 40 if (i // 40) % 2 == 0 else 40 - i % 40) for i in range(1, STEPS + 1)]
    for offset in offsets:
        target = view.mapFromScene(QPointF(x0 + nx * offset, y0 + ny * offset))
        start = time.perf_counter()
        QTest.mouseMove(viewport, target)
        app.processEvents()  # the coalescing timer fires: analysis, results_changed, redraw requests
        app.processEvents()
        viewport.repaint()
        step_times.append(time.perf_counter() - start)
        analysis_times.append(window.document.analysis_seconds)
        failed += window.document.results is None
    QTest.mouseRelease(viewport, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, target)
    app.processEvents()
    assert window.document.undo_stack.count() == 1, "the drag must end as one undo step"
    ms = sorted(1000 * t for t in step_times)
    return {
        "median": statistics.median(ms),
        "p90": ms[int(0.9 * len(ms)) - 1],
        "max": ms[-1],
        "analysis": 1000 * statistics.median(analysis_times),
        "failed": failed,
        "levels": len(window.document.project.levels),
        "elements": len(window.document.project.elements),
    }


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--json", type=Path, help="also write the figures as JSON")
    args = parser.parse_args()
    report: dict[str, dict[str, dict[str, float]]] = {}
    app = QApplication.instance() or QApplication(sys.argv[:1])
    with tempfile.TemporaryDirectory() as folder:
        settings = QSettings(str(Path(folder) / "bench.ini"), QSettings.Format.IniFormat)
        window = MainWindow(settings=settings)
        window.resize(1600, 1000)
        window.show()
        app.processEvents()
        print(f"drag steps of {STEP_METRES} m, {STEPS} per sample; times per step in ms (mouse move → repainted)")
        generated = Path(folder) / "generated_20_levels_100_elements.poise"
        save_project(generated_building(20, 100), generated)
        paths = [*sample_projects(), generated]
        mode_dock = next((d for d in window.findChildren(QDockWidget) if d.objectName() == "modeShapesPanel"), None)
        for title in ("default panels (mode shapes tab in front)", "mode-shape panel hidden"):
            print(f"\n{title}")
            print(
                f"{'sample':36} {'levels':>6} {'elems':>5} {'median':>7} {'p90':>7} {'max':>7} {'analyse':>8} "
                f"{'steps/s':>8} {'unstable':>8}"
            )
            for path in paths:
                r = bench(window, path)
                report.setdefault(title, {})[path.stem] = r
                print(
                    f"{path.stem:36} {r['levels']:6d} {r['elements']:5d} {r['median']:7.1f} {r['p90']:7.1f} "
                    f"{r['max']:7.1f} {r['analysis']:8.1f} {1000 / r['median']:8.0f} {r['failed']:8d}"
                )
            if mode_dock is None:
                break
            mode_dock.hide()
            app.processEvents()
        window.close()
    if args.json:
        args.json.write_text(json.dumps({"platform": os.environ.get("QT_QPA_PLATFORM", ""), "runs": report}, indent=2))


if __name__ == "__main__":
    main()
