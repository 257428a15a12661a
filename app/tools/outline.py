"""Draw a floor outline or an opening as a polygon: click the corners, close on the first one
(or press Enter); Backspace takes back the last corner; a length and angle may be typed."""

from __future__ import annotations

import math

from PySide6.QtCore import Qt
from PySide6.QtGui import QKeyEvent

from app.commands import add_opening, set_outline
from app.document import ProjectDocument
from app.tools.base import PlanEvent, Tool
from app.tools.temporary import Handles, RubberPath
from app.units import degrees_of, polar_point
from core.errors import ModelError
from core.model import Point, Ring

OUTLINE, OPENING = "outline", "opening"


def commit_shape(document: ProjectDocument, target: str, ring: Ring) -> tuple[bool, str]:
    """Make ``ring`` the current level's outline or add it as an opening.

    Returns whether it was taken, and a message for the user ('' when there is nothing to say).
    """
    project, level = document.project, document.current_level
    try:
        if target == OUTLINE:
            changed, dropped = set_outline(project, level, ring)
            text = "Draw outline"
        else:
            if not project.levels:
                return False, "draw the floor outline before its openings"
            changed, dropped = add_opening(project, level, ring), 0
            text = "Add opening"
    except ModelError as error:
        return False, f"{target} refused: {error.message}"
    document.apply(changed, text)
    if dropped:
        return True, f"outline changed; {dropped} opening(s) no longer inside it were removed (Undo restores them)"
    return True, ""


class PolygonTool(Tool):
    typed_fields = ("Length, m", "Angle, °")

    def __init__(self, view, target: str) -> None:
        super().__init__(view)
        self.target = target
        self.name = f"polygon-{target}"
        self.title = "Outline (polygon)" if target == OUTLINE else "Opening (polygon)"
        self.icon = f"polygon_{target}"
        self.shortcut = "O" if target == OUTLINE else "Shift+H"
        self.points: list[Point] = []
        self._cursor: Point | None = None
        self._rubber: RubberPath | None = None
        self._first: Handles | None = None

    def default_hint(self) -> str:
        if not self.points:
            return f"{self.title}: click the first corner."
        return "Click the next corner; click the first corner or press Enter to close; Backspace undoes a corner."

    def anchor(self) -> Point | None:
        return self.points[-1] if self.points else None

    def _show(self) -> None:
        if self._rubber is None:
            self._rubber = RubberPath(self.view.scene())
            self._first = Handles(self.view.scene())
        shown = self.points + ([self._cursor] if self._cursor is not None else [])
        self._rubber.show_points(shown, closed=len(shown) >= 3)  # the closing edge shows the shape so far
        assert self._first is not None
        near_first = self._closes_at(self._cursor) if self._cursor is not None else False
        self._first.set_points(self.points[:1], 0 if near_first else None)

    def _closes_at(self, point: Point) -> bool:
        return len(self.points) >= 3 and math.dist(point, self.points[0]) <= self.view.tolerance

    def press(self, event: PlanEvent) -> None:
        if event.button != Qt.MouseButton.LeftButton:
            return
        if self._closes_at(event.point):
            self.close()
            return
        if self.points and math.dist(event.point, self.points[-1]) < 1e-9:
            return
        self.points.append(event.point)
        self.say()
        self._show()

    def double_click(self, event: PlanEvent) -> None:
        if len(self.points) >= 3:
            self.close()

    def move(self, event: PlanEvent) -> None:
        self._cursor = event.point
        if self.points:
            self._show()
            last = self.points[-1]
            dx, dy = event.point[0] - last[0], event.point[1] - last[1]
            self.measure_changed.emit((math.hypot(dx, dy), degrees_of(dx, dy)))

    def close(self) -> None:
        """Finish the polygon with the corners placed so far."""
        if len(self.points) < 3:
            self.say("an outline needs at least three corners")
            return
        taken, message = commit_shape(self.document, self.target, tuple(self.points))
        if taken:
            self._clear()
        self.say(message)

    def _clear(self) -> None:
        self.points = []
        self.measure_changed.emit(None)
        for item in (self._rubber, self._first):
            if item is not None:
                item.remove()
        self._rubber = self._first = None

    def cancel(self) -> None:
        self._clear()
        super().cancel()
        self.say()

    def key_press(self, event: QKeyEvent) -> bool:
        key = event.key()
        if key in (Qt.Key.Key_Return, Qt.Key.Key_Enter) and self.points:
            self.close()
            return True
        if key == Qt.Key.Key_Backspace and self.points:
            self.points.pop()
            self._show()
            self.say()
            return True
        if key == Qt.Key.Key_Escape and self.points:
            self.cancel()
            return True
        return False

    def enter_typed(self, values: tuple[float | None, ...]) -> str | None:
        if not self.points:
            return "click the first corner, then type the length of each side"
        length, angle = values[0], values[1]
        if length is None or not length > 0:
            return "type a length above zero"
        last = self.points[-1]
        if angle is None:
            cursor = self._cursor or last
            dx, dy = cursor[0] - last[0], cursor[1] - last[1]
            angle = degrees_of(dx, dy) if (dx or dy) else 0.0
        point = polar_point(last, length, angle)
        if self._closes_at(point):
            self.close()
        else:
            self.points.append(point)
            self._show()
        return None
