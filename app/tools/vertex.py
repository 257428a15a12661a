"""Edit the corners of the floor outline and its openings: drag a corner, double-click an edge to
add one, Delete (or a right click) on a corner removes it. A change that would make the outline
cross itself, or push an opening out of the floor, is refused and the message says why."""

from __future__ import annotations

import dataclasses
import math

from PySide6.QtCore import Qt
from PySide6.QtGui import QKeyEvent

from app.canvas.snapping import nearest_on_segment
from app.commands import replace_level
from app.tools.base import PlanEvent, Tool
from app.tools.temporary import Handles
from core.errors import ModelError
from core.model import Level, Point, Project, Ring

VertexRef = tuple[int, int]
"""(ring, corner): ring 0 is the outline, ring k the opening k − 1."""


def rings_of(level: Level) -> list[Ring]:
    return [level.outline, *level.openings]


def with_ring(level: Level, ring_index: int, ring: Ring) -> Level:
    """``level`` with one ring replaced; raises ModelError if the result is not a valid floor."""
    if ring_index == 0:
        return dataclasses.replace(level, outline=ring)
    openings = list(level.openings)
    openings[ring_index - 1] = ring
    return dataclasses.replace(level, openings=tuple(openings))


class VertexTool(Tool):
    name = "vertex"
    title = "Edit corners"
    icon = "vertex"
    shortcut = "E"

    def __init__(self, view) -> None:
        super().__init__(view)
        self._handles: Handles | None = None
        self._drag: VertexRef | None = None
        self._hover: VertexRef | None = None

    def default_hint(self) -> str:
        return "Drag a corner to move it; double-click an edge to add a corner; Delete or right-click removes one."

    # ------------------------------------------------------------------ handles

    def activate(self) -> None:
        super().activate()
        self._handles = Handles(self.view.scene())
        for signal in (
            self.document.project_changed,
            self.document.preview_changed,
            self.document.current_level_changed,
        ):
            signal.connect(self._refresh)
        self._refresh()

    def deactivate(self) -> None:
        super().deactivate()
        for signal in (
            self.document.project_changed,
            self.document.preview_changed,
            self.document.current_level_changed,
        ):
            signal.disconnect(self._refresh)
        if self._handles is not None:
            self._handles.remove()
            self._handles = None

    def _level(self, project: Project | None = None) -> Level | None:
        project = project or self.document.shown_project
        number = self.document.current_level
        return project.levels[number - 1] if 1 <= number <= len(project.levels) else None

    def _refresh(self, *_: object) -> None:
        if self._handles is None:
            return
        level = self._level()
        refs = [(r, i) for r, ring in enumerate(rings_of(level)) for i in range(len(ring))] if level else []
        points = [rings_of(level)[r][i] for r, i in refs] if level else []
        hot = refs.index(self._hover) if self._hover in refs else None
        self._handles.set_points(points, hot)

    def _vertex_under(self, raw: Point) -> VertexRef | None:
        level = self._level(self.document.project)
        if level is None:
            return None
        best = None
        for r, ring in enumerate(rings_of(level)):
            for i, p in enumerate(ring):
                d = math.dist(raw, p)
                if d <= self.view.tolerance and (best is None or d < best[0]):
                    best = (d, (r, i))
        return best[1] if best else None

    # ------------------------------------------------------------------ edits

    def _try(self, ring_index: int, ring: Ring) -> Project | None:
        level = self._level(self.document.project)
        assert level is not None
        try:
            changed = with_ring(level, ring_index, tuple(ring))
        except ModelError as error:
            self.say(f"refused: {error.message}")
            return None
        self.say()
        return replace_level(self.document.project, self.document.current_level, changed)

    def press(self, event: PlanEvent) -> None:
        ref = self._vertex_under(event.raw)
        if ref is None:
            return
        if event.button == Qt.MouseButton.RightButton:
            self._remove(ref)
        elif event.button == Qt.MouseButton.LeftButton:
            self._drag = ref

    def move(self, event: PlanEvent) -> None:
        if self._drag is None:
            hover = self._vertex_under(event.raw)
            if hover != self._hover:
                self._hover = hover
                self._refresh()
            return
        level = self._level(self.document.project)
        assert level is not None
        r, i = self._drag
        ring = list(rings_of(level)[r])
        ring[i] = event.point
        trial = self._try(r, tuple(ring))
        if trial is not None:
            self.document.preview(trial)

    def release(self, event: PlanEvent) -> None:
        if self._drag is not None and self.document.previewing:
            self.document.apply(self.document.shown_project, "Move corner")
        self._drag = None
        self.document.end_preview()

    def double_click(self, event: PlanEvent) -> None:
        level = self._level(self.document.project)
        if level is None:
            return
        best = None
        for r, ring in enumerate(rings_of(level)):
            for i in range(len(ring)):
                a, b = ring[i], ring[(i + 1) % len(ring)]
                q = nearest_on_segment(event.point, a, b)
                d = math.dist(event.raw, q)
                if d <= self.view.tolerance and (best is None or d < best[0]):
                    best = (d, r, i, q)
        if best is None:
            return
        _, r, i, q = best
        ring = list(rings_of(level)[r])
        ring.insert(i + 1, q)
        trial = self._try(r, tuple(ring))
        if trial is not None:
            self.document.apply(trial, "Add corner")

    def _remove(self, ref: VertexRef) -> None:
        level = self._level(self.document.project)
        assert level is not None
        r, i = ref
        ring = list(rings_of(level)[r])
        if len(ring) <= 3:
            self.say("a polygon keeps at least three corners")
            return
        del ring[i]
        trial = self._try(r, tuple(ring))
        if trial is not None:
            self._hover = None
            self.document.apply(trial, "Remove corner")

    def key_press(self, event: QKeyEvent) -> bool:
        if event.key() in (Qt.Key.Key_Delete, Qt.Key.Key_Backspace) and self._hover is not None:
            self._remove(self._hover)
            return True
        if event.key() == Qt.Key.Key_Escape and self._drag is not None:
            self._drag = None
            self.cancel()
            return True
        return False
