"""Place a lateral element: drag from start to end, or click the start and then the end.

While the end follows the cursor the new element is part of a previewed project, so the centre
of rigidity and the readouts move live before the element is committed. The element spans the
levels chosen in the tool options (always including the level being drawn on).
"""

from __future__ import annotations

import math

from PySide6.QtCore import QObject, Qt, Signal
from PySide6.QtGui import QKeyEvent

from app.commands import add_elements, new_element
from app.kinds import AppKindSpec
from app.tools.base import PlanEvent, Tool, dragged
from app.units import degrees_of, polar_point
from core.model import Point, Project

MIN_LENGTH = 0.05
"""Shortest element one can place, m."""


class PlacementRange(QObject):
    """The levels new elements span: ``bottom`` (0 = the base) to ``top`` (None = the roof)."""

    changed = Signal()

    def __init__(self, parent: QObject | None = None) -> None:
        super().__init__(parent)
        self.bottom = 0
        self.top: int | None = None

    def set(self, bottom: int, top: int | None) -> None:
        if (bottom, top) != (self.bottom, self.top):
            self.bottom, self.top = bottom, top
            self.changed.emit()

    def span(self, project: Project, level: int) -> tuple[int, int]:
        """(bottom, top) for an element drawn on ``level``, widened to include that level."""
        count = max(len(project.levels), 1)
        top = count if self.top is None else min(self.top, count)
        bottom = min(self.bottom, top - 1)
        return min(bottom, level - 1), max(top, level)


class PlaceElementTool(Tool):
    typed_fields = ("Length, m", "Angle, °")

    def __init__(self, view, spec: AppKindSpec, placement: PlacementRange) -> None:
        super().__init__(view)
        self.kind = spec.kind
        self.placement = placement
        self.name = f"place-{spec.kind}"
        self.title = spec.label
        self.icon = spec.icon
        self.shortcut = spec.shortcut
        self._start: Point | None = None
        self._press_pos = None
        self._end: Point | None = None

    def default_hint(self) -> str:
        if self._start is None:
            return f"{self.title}: press at the start and drag to the end, or click the start point."
        return "Click the end point, or type the length (Tab: angle) and press Enter. Esc cancels."

    def anchor(self) -> Point | None:
        return self._start

    def _trial(self, end: Point) -> Project | None:
        assert self._start is not None
        if math.dist(self._start, end) < MIN_LENGTH:
            return None
        project = self.document.project
        bottom, top = self.placement.span(project, self.document.current_level)
        return add_elements(project, [new_element(project, self.kind, self._start, end, bottom, top)])

    def press(self, event: PlanEvent) -> None:
        if event.button != Qt.MouseButton.LeftButton:
            return
        if not self.document.project.levels:
            self.say("Draw the floor outline first: elements stand on a level.")
            return
        if self._start is None:
            self._start, self._end, self._press_pos = event.point, event.point, event.view_pos
            self.say()
        elif math.dist(self._start, event.point) >= MIN_LENGTH:
            self._commit(event.point)

    def move(self, event: PlanEvent) -> None:
        if self._start is None:
            return
        self._end = event.point
        trial = self._trial(event.point)
        if trial is not None:
            self.document.preview(trial)
        else:
            self.document.end_preview()
        dx, dy = event.point[0] - self._start[0], event.point[1] - self._start[1]
        self.measure_changed.emit((math.hypot(dx, dy), degrees_of(dx, dy)))

    def release(self, event: PlanEvent) -> None:
        if self._start is None or self._press_pos is None:
            return
        moved = dragged(self._press_pos, event)
        self._press_pos = None
        if moved and math.dist(self._start, event.point) >= MIN_LENGTH:
            self._commit(event.point)

    def _commit(self, end: Point) -> None:
        trial = self._trial(end)
        self._start = self._end = None
        self.measure_changed.emit(None)
        if trial is None:
            self.cancel()
            return
        element = trial.elements[-1]
        self.document.apply(trial, f"Add {element.id}")
        self.document.select([element.id])
        self.say(f"Placed {element.id} ({element.length:.3f} m){self._widened_note(trial, element)}. "
                 "Next: press at a start point.")

    def _widened_note(self, project: Project, element) -> str:
        """Why the element spans more than the chosen span, when the chosen one missed this level."""
        count = len(project.levels)
        bottom, top = self.placement.bottom, min(self.placement.top or count, count)
        if element.bottom >= bottom and element.top <= top:
            return ""
        names = ["Base", *(level.name for level in project.levels)]
        return (f", spanning {names[element.bottom]} to {names[element.top]}: the chosen span "
                f"{names[bottom]} to {names[top]} does not include {names[self.document.current_level]}, "
                "so it was widened")

    def enter_typed(self, values: tuple[float | None, ...]) -> str | None:
        if self._start is None:
            return "click the start point first, then type the length"
        length, angle = values[0], values[1]
        if length is None or not length > 0:
            return "type a length above zero"
        if angle is None:
            end = self._end or self._start
            dx, dy = end[0] - self._start[0], end[1] - self._start[1]
            angle = degrees_of(dx, dy) if (dx or dy) else 0.0
        self._commit(polar_point(self._start, length, angle))
        return None

    def cancel(self) -> None:
        self._start = self._end = self._press_pos = None
        self.measure_changed.emit(None)
        super().cancel()
        self.say()

    def key_press(self, event: QKeyEvent) -> bool:
        if event.key() == Qt.Key.Key_Escape and self._start is not None:
            self.cancel()
            return True
        return False
