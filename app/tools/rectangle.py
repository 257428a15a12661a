"""Draw a rectangular outline or opening: drag corner to corner, or click two corners; or click
one corner and type the width and depth (negative values go left or down)."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtGui import QKeyEvent

from app.tools.base import PlanEvent, Tool, dragged
from app.tools.outline import OUTLINE, commit_shape
from app.tools.temporary import RubberPath
from app.units import typed_coordinate
from core.model import Point


def rectangle(a: Point, b: Point) -> tuple[Point, ...]:
    """The counter-clockwise rectangle with opposite corners ``a`` and ``b``."""
    x1, x2 = sorted((a[0], b[0]))
    y1, y2 = sorted((a[1], b[1]))
    return ((x1, y1), (x2, y1), (x2, y2), (x1, y2))


class RectangleTool(Tool):
    typed_fields = ("Width, m", "Depth, m")

    def __init__(self, view, target: str) -> None:
        super().__init__(view)
        self.target = target
        self.name = f"rectangle-{target}"
        self.title = "Outline (rectangle)" if target == OUTLINE else "Opening (rectangle)"
        self.icon = f"rectangle_{target}"
        self.shortcut = "Shift+O" if target == OUTLINE else "H"
        self._first: Point | None = None
        self._press_pos = None
        self._rubber: RubberPath | None = None

    def default_hint(self) -> str:
        if self._first is None:
            return f"{self.title}: press at one corner and drag to the opposite one, or click both corners."
        return "Click the opposite corner, or type the width (Tab: depth) and press Enter."

    def anchor(self) -> Point | None:
        return self._first

    def press(self, event: PlanEvent) -> None:
        if event.button != Qt.MouseButton.LeftButton:
            return
        if self._first is None:
            self._first, self._press_pos = event.point, event.view_pos
            self.say()
        else:
            self._finish(event.point)

    def move(self, event: PlanEvent) -> None:
        if self._first is None:
            return
        if self._rubber is None:
            self._rubber = RubberPath(self.view.scene())
        self._rubber.show_points(list(rectangle(self._first, event.point)), closed=True)
        self.measure_changed.emit((event.point[0] - self._first[0], event.point[1] - self._first[1]))

    def release(self, event: PlanEvent) -> None:
        if self._first is None or self._press_pos is None:
            return
        moved = dragged(self._press_pos, event)
        self._press_pos = None
        if moved:
            self._finish(event.point)

    def _finish(self, corner: Point) -> None:
        assert self._first is not None
        if abs(corner[0] - self._first[0]) < 1e-6 or abs(corner[1] - self._first[1]) < 1e-6:
            self.say("the rectangle has no area: pick a corner off the first one's lines")
            return
        taken, message = commit_shape(self.document, self.target, rectangle(self._first, corner))
        if taken:
            self._clear()
        self.say(message)

    def _clear(self) -> None:
        self._first = self._press_pos = None
        self.measure_changed.emit(None)
        if self._rubber is not None:
            self._rubber.remove()
            self._rubber = None

    def cancel(self) -> None:
        self._clear()
        super().cancel()
        self.say()

    def key_press(self, event: QKeyEvent) -> bool:
        if event.key() == Qt.Key.Key_Escape and self._first is not None:
            self.cancel()
            return True
        return False

    def enter_typed(self, values: tuple[float | None, ...]) -> str | None:
        if self._first is None:
            return "click the first corner, then type the width and depth"
        width, depth = values[0], values[1]
        if not width or not depth:
            return "type a width and a depth, both non-zero"
        self._finish((typed_coordinate(self._first[0] + width), typed_coordinate(self._first[1] + depth)))
        return None
