"""Helpers shared by the editor tests: a main window on a throw-away settings file, mouse gestures
in plan coordinates (metres), and small projects built in code. Test modules import from here,
never from one another; ``test_gui_drawing`` checks the helpers' coordinate mapping."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QPoint, QPointF, QSettings, Qt
from PySide6.QtTest import QTest

from app.main_window import MainWindow
from app.recovery import RecoveryStore
from core.model import BracedFrame, Element, Level, Project

RECTANGLE_36_18 = ((0.0, 0.0), (36.0, 0.0), (36.0, 18.0), (0.0, 18.0))


def make_window(qtbot, tmp_path: Path, project: Project | None = None) -> MainWindow:
    """A shown main window with its own settings file and recovery folder; closing it never asks a
    question."""
    settings = QSettings(str(tmp_path / "poise-test.ini"), QSettings.Format.IniFormat)
    window = MainWindow(settings=settings, recovery=RecoveryStore(tmp_path / "recovery"))
    window.files.ask_unsaved = lambda: "discard"
    qtbot.addWidget(window)
    window.resize(1400, 900)
    window.show()
    qtbot.waitExposed(window)
    if project is not None:
        show(window, project)
    return window


def show(window: MainWindow, project: Project) -> None:
    """Make ``project`` the open one, fit it on screen and bring the results up to date."""
    window.document.reset(project)
    window.plan_view.fit()
    settle(window)


def settle(window: MainWindow) -> None:
    """Run pending events and the pending analysis."""
    from PySide6.QtWidgets import QApplication

    QApplication.processEvents()
    window.document.flush_analysis()
    QApplication.processEvents()


def view_point(window: MainWindow, x: float, y: float) -> QPoint:
    return window.plan_view.mapFromScene(QPointF(x, y))


def click(
    window: MainWindow, x: float, y: float, button=Qt.MouseButton.LeftButton, modifiers=Qt.KeyboardModifier.NoModifier
):
    viewport = window.plan_view.viewport()
    pos = view_point(window, x, y)
    QTest.mouseMove(viewport, pos)
    QTest.mouseClick(viewport, button, modifiers, pos)


def drag(
    window: MainWindow,
    start: tuple[float, float],
    end: tuple[float, float],
    steps: int = 6,
    press: bool = True,
    release: bool = True,
):
    """Press at ``start`` (unless continuing a drag), move in steps to ``end``, release (optionally)."""
    viewport = window.plan_view.viewport()
    a = view_point(window, *start)
    b = view_point(window, *end)
    if press:
        QTest.mouseMove(viewport, a)
        QTest.mousePress(viewport, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, a)
    for i in range(1, steps + 1):
        p = a + (b - a) * (i / steps)
        QTest.mouseMove(viewport, p)
    if release:
        QTest.mouseRelease(viewport, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, b)
    settle(window)


def frame(element_id: str, start, end, bottom: int = 0, top: int = 1) -> Element:
    return Element(element_id, start, end, bottom, top, BracedFrame())


def one_storey(elements: tuple[Element, ...] = (), outline=RECTANGLE_36_18) -> Project:
    return Project(name="Test", levels=(Level("Level 1", 3.5, outline),), elements=elements)


def balanced_box() -> Project:
    """A 36 × 18 m one-storey plate with a braced frame on each edge (stable, symmetric)."""
    return one_storey(
        (
            frame("B1", (0.0, 6.0), (0.0, 12.0)),
            frame("B2", (36.0, 6.0), (36.0, 12.0)),
            frame("B3", (15.0, 0.0), (21.0, 0.0)),
            frame("B4", (15.0, 18.0), (21.0, 18.0)),
        )
    )
