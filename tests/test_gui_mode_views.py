"""The mode-shape panel (app.mode_views) driven through a real ProjectDocument, offscreen.

Checks that every view follows the selected mode, that editing the plan while the animation runs
keeps it running on the same timer, that the clock stops while hidden, that an unstable layout
shows its diagnostic, and writes screenshots of each view for the three samples to
tests/screenshots/ (ignored by git) for a person to look at.
"""

from __future__ import annotations

import dataclasses
import math
from pathlib import Path

import numpy as np
import pytest
from PySide6.QtCore import QEvent, QPoint, QPointF, Qt, QTimer
from PySide6.QtGui import QMouseEvent
from PySide6.QtWidgets import QApplication

from app.document import ProjectDocument
from app.mode_views.clock import STEP_FRACTION, ModeClock
from app.mode_views.panel import ModeViewsPanel, rigidity_centres
from app.resources import sample_path
from core.report.mode_frames import LayerMotion, building_geometry, peak_scale
from tests.helpers import drag, make_window, settle

SAMPLES = ("office_5_storey_braced", "residential_8_storey_walls", "pavilion_1_storey")
SCREENSHOTS = Path(__file__).parent / "screenshots"


@pytest.fixture
def open_sample(qtbot):
    """Opens a sample in a document and a shown panel, and keeps both alive until the panel has
    been closed and deleted through the event loop. (Letting the last Python reference drop
    instead deletes the widget tree from Python in an order that pyqtgraph items do not survive:
    "pure virtual method called".)"""
    opened: list[tuple[ProjectDocument, ModeViewsPanel]] = []

    def open_(sample: str) -> tuple[ProjectDocument, ModeViewsPanel]:
        document = ProjectDocument()
        document.open(sample_path(sample))
        document.flush_analysis()
        assert document.results is not None, document.error
        panel = ModeViewsPanel(document)
        panel.resize(1500, 900)
        panel.show()
        qtbot.waitExposed(panel)
        opened.append((document, panel))
        return document, panel

    yield open_
    for _, panel in opened:
        panel.close()
        panel.deleteLater()
    QApplication.sendPostedEvents(None, QEvent.Type.DeferredDelete)
    QApplication.processEvents()
    opened.clear()


def _curve(item) -> np.ndarray:
    x, y = item.getData()
    return np.column_stack([x, y])


def _move_first_element(document: ProjectDocument, dx: float) -> None:
    """Shift the first element by ``dx`` in x, as one undo step (a drag step of the editor)."""
    project = document.project
    element = project.elements[0]
    moved = dataclasses.replace(element, start=(element.start[0] + dx, element.start[1]),
                                end=(element.end[0] + dx, element.end[1]))
    document.apply(dataclasses.replace(project, elements=(moved, *project.elements[1:])), "move element")


def test_selecting_a_mode_updates_every_view(qtbot, open_sample):
    document, panel = open_sample("office_5_storey_braced")
    panel.clock.set_phase(math.pi / 2)
    first_floor = _curve(panel.plan._floor)
    first_3d = _curve(panel.building._floors)
    document.select_mode(3)
    assert panel.mode_number == 3
    assert panel.mode_box.currentIndex() == 2
    assert panel.periods.selected == 3 and panel.masses.selected == 3
    assert panel.shape.shown_mode == 3
    assert not np.allclose(_curve(panel.plan._floor), first_floor)
    assert not np.allclose(_curve(panel.building._floors), first_3d)
    # The plan draws exactly the core frame of mode 3 at the chosen amplitude.
    results, project = document.results, document.analysed_project
    geometry = building_geometry(project, results.floors, rigidity_centres(results))
    mode = results.modes[2]
    peak = panel.amplitude_slider.value() / 100 * geometry.plan_size
    motion = LayerMotion({"floor": geometry.outlines.on_floor(panel.floor_index)}, results.floors, mode.shape,
                         peak_scale(geometry, results.floors, mode, peak))
    np.testing.assert_allclose(_curve(panel.plan._floor), motion.plan(math.pi / 2)["floor"])
    # The shape chart plots that mode's u_x over height (base first, largest component 1).
    x, _ = panel.shape._lines[0].getData()
    assert x[0] == 0.0 and len(x) == len(results.floors) + 1


def test_choosing_a_mode_in_the_panel_goes_through_the_document(qtbot, open_sample):
    document, panel = open_sample("residential_8_storey_walls")
    heard = []
    document.mode_selected.connect(heard.append)
    panel.mode_box.setCurrentIndex(1)
    panel.mode_box.activated.emit(1)
    assert heard == [2] and document.current_mode == 2 and panel.mode_number == 2
    # A click on the third bar of the period chart asks for mode 3.
    chart = panel.periods
    scene_point = chart.getPlotItem().vb.mapViewToScene(QPointF(3.0, 0.05))
    qtbot.mouseClick(chart.viewport(), Qt.MouseButton.LeftButton, pos=chart.mapFromScene(scene_point))
    assert heard[-1] == 3 and panel.masses.selected == 3


def test_editing_the_plan_while_animating_keeps_it_running(qtbot, open_sample):
    document, panel = open_sample("residential_8_storey_walls")
    clocks = panel.findChildren(ModeClock)
    timers = [t for clock in clocks for t in clock.findChildren(QTimer)]
    assert len(clocks) == 1 and len(timers) == 1
    original = document.project.elements[0]
    panel.clock.play()
    assert panel.clock.running
    start = panel.plan.frames_drawn
    qtbot.waitUntil(lambda: panel.plan.frames_drawn > start + 3, timeout=3000)
    for step in range(12):  # a drag: many live edits in a row, analysed now and then
        _move_first_element(document, 0.25)
        QApplication.processEvents()
        if step % 3 == 0:
            document.flush_analysis()
    document.flush_analysis()
    assert document.results is not None
    assert panel.clock.running and panel.clock.playing
    assert panel.findChildren(ModeClock) == clocks and clocks[0].findChildren(QTimer) == timers  # nothing new
    frames = panel.building.frames_drawn
    qtbot.waitUntil(lambda: panel.building.frames_drawn > frames + 3, timeout=3000)
    # The views show the edited building: at rest, the moved wall's plan line starts 3 m further on.
    panel.clock.pause()
    panel.clock.set_phase(0.0)
    moved = document.project.elements[0]
    assert moved.start[0] == pytest.approx(original.start[0] + 3.0)
    lines = _curve(panel.plan._elements[moved.kind])
    assert np.any(np.all(np.isclose(lines, moved.start), axis=1))
    assert not np.any(np.all(np.isclose(lines, original.start), axis=1))


def test_the_clock_stops_while_hidden_and_resumes(qtbot, open_sample):
    _, panel = open_sample("pavilion_1_storey")
    (timer,) = panel.clock.findChildren(QTimer)
    panel.clock.play()
    assert panel.clock.running and timer.isActive()
    panel.hide()
    assert not panel.clock.running and panel.clock.playing
    # The clock's one timer is what draws frames: stopped, nothing can tick however long we wait.
    assert not timer.isActive()
    frames, phase = panel.plan.frames_drawn, panel.clock.phase
    QApplication.processEvents()
    assert panel.plan.frames_drawn == frames and panel.clock.phase == phase
    panel.show()
    assert panel.clock.running
    qtbot.waitUntil(lambda: panel.plan.frames_drawn > frames, timeout=3000)


def test_play_pause_step_pace_and_amplitude(qtbot, open_sample):
    _, panel = open_sample("office_5_storey_braced")
    panel.play_action.trigger()
    assert panel.clock.playing and panel.play_action.text() == "Pause"
    panel.play_action.trigger()
    assert not panel.clock.playing and panel.play_action.text() == "Play"
    panel.clock.set_phase(0.0)
    panel.step_action.trigger()
    assert panel.clock.phase == pytest.approx(2 * math.pi * STEP_FRACTION)
    panel.pace_slider.setValue(35)
    assert panel.clock.cycle_seconds == pytest.approx(3.5)
    assert panel.pace_label.text() == "3.5 s/cycle"
    # The amplitude sets the largest outline motion at the peak. It is set on the linear motion
    # u + α ẑ×r; the drawn rigid turn differs from that by at most r(1 − cos α) + r(α − sin α),
    # about r·α²/2: a few per cent at this amplitude.
    panel.amplitude_slider.setValue(20)
    panel.clock.set_phase(math.pi / 2)
    geometry = panel._geometry
    peak = 0.20 * geometry.plan_size
    assert panel.amplitude_label.text() == f"20 % = {peak:.2f} m"
    rest = panel.building._motion.undeformed()["floors"]
    drawn = panel.building._motion.plan(math.pi / 2)["floors"] - rest
    largest = float(np.max(np.hypot(drawn[:, 0], drawn[:, 1])))
    assert largest == pytest.approx(peak, rel=0.03)


def test_turning_the_3d_view_with_the_mouse(qtbot, open_sample):
    _, panel = open_sample("office_5_storey_braced")
    view = panel.building
    before = view.view
    viewport = view.viewport()
    centre = viewport.rect().center()

    def send(kind, point: QPoint, buttons) -> None:
        event = QMouseEvent(kind, QPointF(point), QPointF(viewport.mapToGlobal(point)), Qt.MouseButton.LeftButton,
                            buttons, Qt.KeyboardModifier.NoModifier)
        QApplication.sendEvent(viewport, event)

    send(QMouseEvent.Type.MouseButtonPress, centre, Qt.MouseButton.LeftButton)
    send(QMouseEvent.Type.MouseMove, centre + QPoint(10, 5), Qt.MouseButton.LeftButton)
    send(QMouseEvent.Type.MouseMove, centre + QPoint(40, 20), Qt.MouseButton.LeftButton)
    send(QMouseEvent.Type.MouseButtonRelease, centre + QPoint(40, 20), Qt.MouseButton.NoButton)
    assert view.view.azimuth < before.azimuth
    assert view.view.elevation > before.elevation
    assert f"{math.degrees(view.view.azimuth):.0f}°, " in view.getPlotItem().titleLabel.text


def test_an_unstable_layout_shows_the_diagnostic(qtbot, open_sample):
    document, panel = open_sample("pavilion_1_storey")
    panel.clock.play()
    document.apply(dataclasses.replace(document.project, elements=()), "delete all")
    document.flush_analysis()
    assert document.results is None and document.error is not None
    assert panel.stack.currentWidget() is panel.diagnostic
    assert document.error.message in panel.diagnostic.text()
    assert not panel.clock.running and panel.clock.playing
    document.undo_stack.undo()
    document.flush_analysis()
    assert panel.stack.currentIndex() == 0 and panel.clock.running


@pytest.mark.parametrize("sample", SAMPLES)
def test_screenshots_of_each_view(qtbot, sample, open_sample):
    """Pictures for a person to look at; the assertions only check that something was drawn."""
    document, panel = open_sample(sample)
    SCREENSHOTS.mkdir(exist_ok=True)
    results = document.results
    first_three = results.modes[:3]
    torsion = max(first_three, key=lambda m: m.shares[2]).number  # the first torsion-led mode
    for number in sorted({1, torsion}):
        document.select_mode(number)
        panel.set_floor(len(results.floors) - 1)
        panel.clock.set_phase(math.pi / 2)
        QApplication.processEvents()
        views = {"panel": panel, "plan": panel.plan, "3d": panel.building}
        if number == 1:
            views |= {"periods": panel.periods, "mass": panel.masses, "shape": panel.shape}
        for name, widget in views.items():
            image = widget.grab().toImage()
            assert image.width() > 100 and image.height() > 100
            assert len({image.pixel(x, y) for x in range(0, image.width(), 7) for y in range(0, image.height(), 7)}) > 3
            image.save(str(SCREENSHOTS / f"modes_{sample}_mode{number}_{name}.png"))


def test_the_plan_starts_on_the_roof_and_follows_the_edited_level(qtbot, open_sample):
    document, panel = open_sample("office_5_storey_braced")
    roof = len(document.results.floors) - 1
    assert panel.floor_index == roof and panel.floor_box.currentIndex() == roof
    document.set_current_level(2)
    assert panel.floor_index == 1 and panel.floor_box.currentText() == document.project.levels[1].name
    np.testing.assert_allclose(_curve(panel.plan._rest_outlines), panel._geometry.outlines.xy)
    panel.clock.set_phase(0.0)
    np.testing.assert_allclose(_curve(panel.plan._floor), panel._geometry.outlines.on_floor(1).xy)


def test_through_the_main_window(qtbot, tmp_path):
    """Installed by the main window: the modes table drives it, hiding its dock pauses it, and a
    wall dragged on the plan while the motion runs shows up in the motion."""
    from PySide6.QtWidgets import QDockWidget

    from app.resources import sample_path as bundled

    window = make_window(qtbot, tmp_path)
    window.files.open_sample(bundled("residential_8_storey_walls"), confirm=False)
    settle(window)
    panel = window.findChild(ModeViewsPanel)
    dock = window.findChild(QDockWidget, "modeShapesPanel")
    assert dock is not None and dock.widget() is panel
    assert panel.play_action in window.menu("modes").actions()
    dock.raise_()
    QApplication.processEvents()
    panel.play_action.trigger()
    assert panel.clock.running

    window.tables_dock.raise_()  # the tables share the bottom strip as a tab: the motion stops
    window.tables.tabs.setCurrentWidget(window.tables.modes)
    QApplication.processEvents()
    assert not panel.clock.running and panel.clock.playing
    table = window.tables.modes
    qtbot.mouseClick(table.viewport(), Qt.MouseButton.LeftButton, pos=table.visualRect(table.model().index(2, 0)).center())
    assert window.document.current_mode == 3
    dock.raise_()
    QApplication.processEvents()
    assert panel.clock.running
    assert panel.mode_number == 3 and panel.periods.selected == 3 and panel.shape.shown_mode == 3

    window.document.set_current_level(2)
    window.document.set_current_level(1)  # the editor is on level 1: the motion plan follows
    window.drawing.set_tool("select")
    wall = window.document.project.element("W1")  # (20, 0)–(26, 0)
    drag(window, (23.0, 0.0), (23.0, 2.0))
    moved = window.document.project.element("W1")
    assert moved.start[1] == pytest.approx(wall.start[1] + 2.0, abs=0.5)
    frames = panel.plan.frames_drawn
    qtbot.waitUntil(lambda: panel.plan.frames_drawn > frames + 3, timeout=3000)
    assert panel.clock.running and panel.floor_index == 0
    panel.clock.pause()
    panel.clock.set_phase(0.0)
    walls = _curve(panel.plan._elements[moved.kind])
    assert np.any(np.all(np.isclose(walls, moved.start), axis=1))
    SCREENSHOTS.mkdir(exist_ok=True)
    panel.clock.set_phase(math.pi / 2)
    QApplication.processEvents()
    window.grab().save(str(SCREENSHOTS / "modes_main_window.png"))
