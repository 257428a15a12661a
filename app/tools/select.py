"""Select and move: pick elements, drag them (or one end), nudge them with the arrow keys.

A drag previews the moved project on every mouse move (live results) and commits one undo step
on release. The grabbed point is the element's end or middle nearest the press, so the grid and
the snap targets pull that point, and ends land exactly where the engineer aims.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QRectF, Qt
from PySide6.QtGui import QKeyEvent
from PySide6.QtWidgets import QGraphicsRectItem

from app.canvas import style
from app.canvas.scene import Z_TEMPORARY
from app.canvas.snapping import SnapKind, snap_to_grid
from app.commands import move_elements, replace_elements, set_element_end
from app.tools.base import PlanEvent, Tool
from core.errors import ModelError
from core.model import Point

DRAG_START_PIXELS = 3.0
"""How far the cursor must travel after a press before it counts as a drag."""


def describe(ids: tuple[str, ...] | list[str]) -> str:
    return ", ".join(ids) if len(ids) <= 3 else f"{len(ids)} elements"


class SelectTool(Tool):
    name = "select"
    title = "Select and move"
    icon = "select"
    shortcut = "S"

    def __init__(self, view) -> None:
        super().__init__(view)
        self._mode: str | None = None
        self._press: PlanEvent | None = None
        self._grab: Point = (0.0, 0.0)
        self._end: tuple[str, str] | None = None
        self._band: QGraphicsRectItem | None = None

    def default_hint(self) -> str:
        return (
            "Click an element to select it (Shift or Ctrl adds), drag to move it or one of its ends; "
            "arrow keys nudge by the grid step, Shift × 10."
        )

    def snap_exclude(self) -> frozenset[str]:
        if self._mode in ("move", "maybe-move"):
            return frozenset(self.document.selection)
        if self._mode == "stretch" and self._end is not None:
            return frozenset([self._end[0]])
        return frozenset()

    def anchor(self) -> Point | None:
        if self._mode == "stretch" and self._end is not None:
            element = self.document.project.element(self._end[0])
            return element.end if self._end[1] == "start" else element.start
        if self._mode == "move":
            return self._grab
        return None

    # ------------------------------------------------------------------ mouse

    def _end_under(self, raw: Point) -> tuple[str, str] | None:
        for element_id in self.document.selection:
            item = self.view.plan_scene.element_items.get(element_id)
            if item is None:
                continue
            for which in ("start", "end"):
                if math.dist(raw, getattr(item.element, which)) <= self.view.tolerance:
                    return element_id, which
        return None

    def press(self, event: PlanEvent) -> None:
        if event.button != Qt.MouseButton.LeftButton or self._mode in ("move", "stretch"):
            return
        self._press = event
        end = self._end_under(event.raw)
        if end is not None and not event.toggle:
            self._mode, self._end = "stretch", end
            return
        picked = self.view.pick_element(event.raw)
        document = self.document
        if picked is None:
            if not event.toggle:
                document.select(())
            self._mode = "band"
            return
        if event.toggle:
            chosen = list(document.selection)
            if picked in chosen:
                chosen.remove(picked)
            else:
                chosen.append(picked)
            document.select(chosen)
            self._mode = None
            return
        if picked not in document.selection:
            document.select([picked])
        element = document.project.element(picked)
        self._grab = min((element.start, element.end, element.midpoint), key=lambda p: math.dist(p, event.raw))
        self._mode = "maybe-move"

    def _travelled(self, event: PlanEvent) -> bool:
        assert self._press is not None
        d = event.view_pos - self._press.view_pos
        return math.hypot(d.x(), d.y()) >= DRAG_START_PIXELS

    def _delta(self, event: PlanEvent) -> Point:
        """Plan displacement of the grabbed point for this cursor position."""
        assert self._press is not None
        raw_dx, raw_dy = event.raw[0] - self._press.raw[0], event.raw[1] - self._press.raw[1]
        if event.snap.kind is SnapKind.GRID:
            target = snap_to_grid((self._grab[0] + raw_dx, self._grab[1] + raw_dy), self.view.grid_spacing)
        elif event.snap.kind is SnapKind.FREE:
            target = (self._grab[0] + raw_dx, self._grab[1] + raw_dy)
        else:
            target = event.snap.point
        if event.shift:
            target = (target[0], self._grab[1]) if abs(raw_dx) >= abs(raw_dy) else (self._grab[0], target[1])
        return target[0] - self._grab[0], target[1] - self._grab[1]

    def move(self, event: PlanEvent) -> None:
        if self._press is None:
            return
        if self._mode == "maybe-move" and self._travelled(event):
            self._mode = "move"
        document = self.document
        if self._mode == "move":
            dx, dy = self._delta(event)
            document.preview(move_elements(document.project, document.selection, dx, dy))
            self.say(f"Moving {describe(document.selection)} by ({dx:+.3f}, {dy:+.3f}) m")
        elif self._mode == "stretch" and self._end is not None:
            element_id, which = self._end
            element = set_element_end(document.project.element(element_id), which, event.point)
            document.preview(replace_elements(document.project, [element]))
            self.say(f"{element_id}: length {element.length:.3f} m")
        elif self._mode == "band" and self._travelled(event):
            if self._band is None:
                self._band = QGraphicsRectItem()
                self._band.setPen(style.pen(style.TEMPORARY, 1.0, Qt.PenStyle.DashLine))
                self._band.setZValue(Z_TEMPORARY)
                self.view.scene().addItem(self._band)
            self._band.setRect(self._band_rect(event))

    def _band_rect(self, event: PlanEvent) -> QRectF:
        assert self._press is not None
        (x1, y1), (x2, y2) = self._press.raw, event.raw
        return QRectF(min(x1, x2), min(y1, y2), abs(x2 - x1), abs(y2 - y1))

    def release(self, event: PlanEvent) -> None:
        document = self.document
        mode, self._mode = self._mode, None
        if mode in ("move", "stretch") and document.previewing:
            what = describe(document.selection) if mode == "move" else self._end[0]  # type: ignore[index]
            document.apply(document.shown_project, f"Move {what}" if mode == "move" else f"Change {what}")
        elif mode == "band" and self._band is not None:
            rect = self._band_rect(event)
            inside = [
                i
                for i, item in self.view.plan_scene.element_items.items()
                if rect.contains(item.element.start[0], item.element.start[1])
                and rect.contains(item.element.end[0], item.element.end[1])
            ]
            document.select(list(document.selection) + inside if event.toggle else inside)
        self._finish()

    def _finish(self) -> None:
        self._press = None
        self._end = None
        if self._band is not None:
            self.view.scene().removeItem(self._band)
            self._band = None
        self.say()

    def cancel(self) -> None:
        self._mode = None
        self._finish()
        super().cancel()

    # ------------------------------------------------------------------ keys

    def key_press(self, event: QKeyEvent) -> bool:
        steps = {
            Qt.Key.Key_Left: (-1, 0),
            Qt.Key.Key_Right: (1, 0),
            Qt.Key.Key_Up: (0, 1),
            Qt.Key.Key_Down: (0, -1),
        }
        document = self.document
        if event.key() in steps and document.selection and self._mode is None:
            factor = 10.0 if event.modifiers() & Qt.KeyboardModifier.ShiftModifier else 1.0
            sx, sy = steps[Qt.Key(event.key())]
            step = self.view.grid_spacing * factor
            try:
                moved = move_elements(document.project, document.selection, sx * step, sy * step)
            except ModelError as error:
                self.say(str(error))
                return True
            document.apply(moved, f"Nudge {describe(document.selection)}", merge_key=("nudge", document.selection))
            return True
        if event.key() == Qt.Key.Key_Escape:
            if self._mode is not None:
                self.cancel()
            else:
                document.select(())
            return True
        return False
