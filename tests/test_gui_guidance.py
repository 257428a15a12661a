"""The placement guide in the editor: the map appears for the selected element, follows a drag on
the worker thread without holding the drag up, a suggestion is accepted as one undo step, and a
switched-off element is drawn faded, left out of the analysis and compared with and without."""

from __future__ import annotations

import threading
import time

import numpy as np
import pytest

from app.guidance import panel as panel_module
from app.guidance.plan_items import GuidanceLayer
from app.units import PLAIN, SECONDS
from core.analysis import analyse
from core.guidance.measures import Measure, results_value
from core.guidance.position_map import position_map
from tests.helpers import drag, frame, make_window, one_storey, settle


def layout():
    """Four edge frames and one inner frame B5 along y at x = 10 m, which the tests move."""
    return one_storey(
        (
            frame("B1", (0.0, 6.0), (0.0, 12.0)),
            frame("B2", (36.0, 6.0), (36.0, 12.0)),
            frame("B3", (15.0, 0.0), (21.0, 0.0)),
            frame("B4", (15.0, 18.0), (21.0, 18.0)),
            frame("B5", (10.0, 6.0), (10.0, 12.0)),
        )
    )


@pytest.fixture
def window(qtbot, tmp_path):
    w = make_window(qtbot, tmp_path, layout())
    w.guidance.show()
    settle(w)
    yield w
    w.guidance.panel.worker.cancel()
    w.guidance.panel.worker.wait(10_000)


def test_map_appears_for_the_selected_element(window, qtbot):
    panel = window.guidance.panel
    window.document.select(["B5"])
    qtbot.waitUntil(lambda: panel.map is not None, timeout=20_000)
    expected = position_map(window.document.project, "B5", Measure.TORSION_RATIO)
    np.testing.assert_array_equal(panel.map.values, expected.values)
    layer = next(i for i in window.scene.items() if isinstance(i, GuidanceLayer))
    assert layer.map is panel.map and panel.progress.value() == 100
    assert not layer.boundingRect().isEmpty()
    image = window.plan_view.viewport().grab().toImage()
    centre = window.plan_view.mapFromScene(20.0, 9.0)  # inside the floor, away from the elements
    colour = image.pixelColor(centre)
    assert (colour.red(), colour.green(), colour.blue()) != (255, 255, 255)  # the map tints the floor
    qtbot.waitUntil(lambda: bool(panel.gradients), timeout=20_000)
    assert panel.moves.rowCount() == 5


def test_map_follows_a_drag_on_the_worker_thread(window, qtbot, monkeypatch):
    panel = window.guidance.panel
    window.document.select(["B5"])
    qtbot.waitUntil(lambda: panel.map is not None, timeout=20_000)
    threads: list[int] = []
    slow = threading.Event()

    def slow_map(*args, **kwargs):
        threads.append(threading.get_ident())
        slow.wait(0.6)  # a map that takes longer than the whole drag
        return position_map(*args, **kwargs)

    monkeypatch.setattr(panel_module, "position_map", slow_map)
    started = time.perf_counter()
    drag(window, (10.0, 9.0), (16.0, 9.0), steps=8)
    dragged = time.perf_counter() - started
    assert window.document.project.element("B5").start[0] == pytest.approx(16.0, abs=0.6)
    assert panel.worker.busy() or dragged < 0.6  # the drag ended while the map was still being made
    assert threads and all(t != threading.get_ident() for t in threads)
    moved = window.document.project
    qtbot.waitUntil(lambda: panel.map is not None and panel.map.current == pytest.approx(
        results_value(analyse(moved), Measure.TORSION_RATIO), rel=1e-9), timeout=20_000)


def test_accepting_a_suggestion_is_one_undo_step(window, qtbot):
    panel = window.guidance.panel
    document = window.document
    window.document.select(["B5"])
    qtbot.waitUntil(lambda: panel.map is not None, timeout=20_000)
    before = document.project
    panel.request_suggestion()
    qtbot.waitUntil(lambda: panel.suggestion is not None, timeout=30_000)
    found = panel.suggestion
    assert panel.accept_button.isEnabled() and panel.marks.ghost is not None
    steps = document.undo_stack.count()
    panel.accept_button.click()
    settle(window)
    assert document.undo_stack.count() == steps + 1
    assert document.project.element("B5").start == pytest.approx(found.start)
    assert results_value(document.results, found.measure) == pytest.approx(found.value, rel=1e-9)
    assert panel.suggestion is None and panel.marks.ghost is None
    document.undo_stack.undo()
    settle(window)
    assert document.project == before


def test_switched_off_element_is_faded_left_out_and_compared(window, qtbot):
    document = window.document
    document.select(["B5"])
    steps = document.undo_stack.count()
    window.guidance.switch_action.trigger()
    settle(window)
    assert document.undo_stack.count() == steps + 1 and not document.project.element("B5").active
    assert window.scene.element_items["B5"].opacity() < 0.5
    deleted = analyse(one_storey(layout().elements[:4]))
    assert document.results.periods == pytest.approx(deleted.periods, rel=1e-12)
    panel = window.guidance.panel
    qtbot.waitUntil(lambda: panel.comparison.rowCount() > 0, timeout=20_000)
    rows = {panel.comparison.item(r, 0).text(): (panel.comparison.item(r, 1).text(), panel.comparison.item(r, 2).text())
            for r in range(panel.comparison.rowCount())}
    with_b5 = analyse(layout())
    assert rows["T1 (s)"] == (SECONDS.show(with_b5.periods[0]), SECONDS.show(deleted.periods[0]))
    worst_y = rows["worst torsion ratio y"]
    assert worst_y == (PLAIN.show(with_b5.lateral.worst_torsion_ratio("y")),
                       PLAIN.show(deleted.lateral.worst_torsion_ratio("y")))
    assert worst_y[0] != worst_y[1]
    window.guidance.switch_action.trigger()
    settle(window)
    assert document.project.element("B5").active
    panel.request_losses()
    qtbot.waitUntil(lambda: panel.losses.rowCount() == 5, timeout=30_000)


def test_a_new_element_is_mapped_before_placing_and_placed_by_one_undo_step(window, qtbot):
    panel = window.guidance.panel
    document = window.document
    panel.subject.setCurrentIndex(panel.subject.findText("a new braced frame"))
    panel.new_along.setCurrentIndex(1)  # along y
    qtbot.waitUntil(lambda: panel.map is not None and panel.map.element_id == "B6", timeout=20_000)
    assert "a new B6" in panel.target.text()
    candidate = panel.candidate()
    assert candidate is not None and candidate[1].direction == pytest.approx((0.0, 1.0))
    steps = document.undo_stack.count()
    panel.request_suggestion()
    qtbot.waitUntil(lambda: panel.suggestion is not None, timeout=30_000)
    found = panel.suggestion
    panel.accept_button.click()
    settle(window)
    assert document.undo_stack.count() == steps + 1
    placed = document.project.element("B6")
    assert placed.start == pytest.approx(found.start) and placed.length == pytest.approx(6.0)
    assert results_value(document.results, found.measure) == pytest.approx(found.value, rel=1e-9)
    document.undo_stack.undo()
    settle(window)
    assert "B6" not in {e.id for e in document.project.elements}
