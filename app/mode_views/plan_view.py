"""Animated plan of one mode: every floor swinging, one floor emphasised with its elements and centres."""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np
import pyqtgraph as pg
from PySide6.QtWidgets import QGraphicsItem

from app.canvas.style import MASS_CENTRE, PAPER, RIGIDITY_CENTRE, pen
from app.kinds import app_kinds
from app.mode_views.items import SegmentLines
from app.mode_views.palette import MOVING_FLOOR, OTHER_FLOORS, UNDEFORMED
from core.report.mode_frames import AttachedPoints, BuildingGeometry, LayerMotion
from core.results import FloorMass, Mode


class PlanMotionView(pg.PlotWidget):
    """Plan view, y up, fixed range: the mode's motion of the floors seen from above."""

    def __init__(self, parent: object = None) -> None:
        super().__init__(parent=parent, background=PAPER)
        self.setObjectName("modePlanView")
        item = self.getPlotItem()
        item.setAspectLocked(True)
        item.setMouseEnabled(False, False)
        item.hideButtons()
        item.setMenuEnabled(False)
        item.showGrid(x=True, y=True, alpha=0.15)
        for name, label in (("bottom", "x (m)"), ("left", "y (m)")):
            axis = item.getAxis(name)
            axis.enableAutoSIPrefix(False)
            axis.setLabel(label)
            # The axes also draw the grid across the view; replaying that on every frame cost
            # most of the frame, and the range never changes while the motion runs.
            axis.setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)
        item.vb.disableAutoRange()
        self._rest_outlines = SegmentLines(pen(UNDEFORMED, 1.0), z=0)
        self._rest_markers = SegmentLines(pen(UNDEFORMED, 1.0), z=0)
        self._other_floors = SegmentLines(pen(OTHER_FLOORS, 1.0), z=1)
        self._floor = SegmentLines(pen(MOVING_FLOOR, 1.5), z=2)
        self._elements = {
            spec.kind: SegmentLines(pen(spec.colour, spec.mode_line_width), z=3) for spec in app_kinds()
        }
        self._mass = SegmentLines(pen(MASS_CENTRE, 2.0), z=5)
        self._rigidity = SegmentLines(pen(RIGIDITY_CENTRE, 2.0), z=4)
        for line in (self._rest_outlines, self._rest_markers, self._other_floors, self._floor,
                     *self._elements.values(), self._mass, self._rigidity):
            item.addItem(line)
        self._motion: LayerMotion | None = None
        self._range: tuple[float, float, float, float] | None = None
        self._title = ""
        self.frames_drawn = 0

    def show_mode(
        self,
        geometry: BuildingGeometry,
        floors: Sequence[FloorMass],
        mode: Mode,
        scale: float,
        peak: float,
        floor: int,
        phase: float,
    ) -> None:
        """Precompute the motion of ``mode`` at drawn ``scale`` (largest motion ``peak`` m), emphasising
        0-based ``floor``; the range leaves room for that peak."""
        floor = max(0, min(floor, geometry.floor_count - 1))
        layers: dict[str, AttachedPoints] = {
            "others": AttachedPoints.join([geometry.outlines.on_floor(j)
                                           for j in range(geometry.floor_count) if j != floor]),
            "floor": geometry.outlines.on_floor(floor),
            "mass": geometry.mass_markers.on_floor(floor),
            "rigidity": geometry.rigidity_markers.on_floor(floor),
        }
        for kind in self._elements:
            layers[kind] = geometry.plan_elements[kind].on_floor(floor)
        self._motion = LayerMotion(layers, floors, mode.shape, scale)
        rest = self._motion.undeformed()
        self._rest_outlines.set_segments(geometry.outlines.xy)
        self._rest_markers.set_segments(np.concatenate([rest["mass"], rest["rigidity"]]))
        name = floors[floor].name if floor < len(floors) else ""
        title = f"Plan · {name} highlighted"
        if title != self._title:
            self._title = title
            self.getPlotItem().setTitle(title, size="9pt")
        self._fix_range(geometry, peak)
        self.set_phase(phase)

    def clear_mode(self) -> None:
        self._motion = None
        for line in (self._rest_outlines, self._rest_markers, self._other_floors, self._floor,
                     *self._elements.values(), self._mass, self._rigidity):
            line.setData([], [])

    def _fix_range(self, geometry: BuildingGeometry, peak: float) -> None:
        x0, y0, x1, y1 = geometry.bounds
        margin = peak + 2 * geometry.marker_size
        wanted = (x0 - margin, y0 - margin, x1 + margin, y1 + margin)
        if wanted != self._range:
            self._range = wanted
            self.getPlotItem().vb.setRange(xRange=(wanted[0], wanted[2]), yRange=(wanted[1], wanted[3]), padding=0)

    def set_phase(self, phase: float) -> None:
        if self._motion is None:
            return
        frame = self._motion.plan(phase)
        self._other_floors.set_segments(frame["others"])
        self._floor.set_segments(frame["floor"])
        self._mass.set_segments(frame["mass"])
        self._rigidity.set_segments(frame["rigidity"])
        for kind, line in self._elements.items():
            line.set_segments(frame[kind])
        self.frames_drawn += 1
