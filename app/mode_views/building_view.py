"""The whole building in 3D, moving in the mode, drawn with our own orthographic projection.

No GPU: a plain 2D pyqtgraph view shows the projected lines. Dragging with the left button turns
the building (left–right: azimuth, up–down: elevation). The range is fixed to the projected
bounding sphere of the building plus the drawn amplitude, so no angle or phase ever rescales it.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QBrush, QColor

from app.canvas.style import MASS_CENTRE, PAPER, RIGIDITY_CENTRE, pen
from app.kinds import app_kind, app_kinds
from app.mode_views.items import FilledQuads, SegmentLines
from app.mode_views.palette import MOVING_FLOOR, TEXT, UNDEFORMED
from core.model import ElementKind
from core.report.mode_frames import AttachedPoints, BuildingGeometry, LayerMotion, Point3, ViewAngle
from core.results import FloorMass, Mode

DEGREES_PER_PIXEL = 0.5
"""Turn of the view per pixel of mouse drag."""
TRIAD_SHARE = 0.12
"""Length of the x, y, z arrows at the ground as a share of the plan size."""


class _TurntableBox(pg.ViewBox):
    """A view box that turns drags into rotation requests instead of panning, and ignores the wheel."""

    turned = Signal(float, float)

    def __init__(self) -> None:
        super().__init__(enableMenu=False)
        self.setMouseEnabled(False, False)
        self.setAspectLocked(True)
        self.disableAutoRange()

    def mouseDragEvent(self, ev, axis=None) -> None:
        if ev.button() != Qt.MouseButton.LeftButton:
            ev.ignore()
            return
        ev.accept()
        delta = ev.screenPos() - ev.lastScreenPos()
        self.turned.emit(float(delta.x()), float(delta.y()))

    def wheelEvent(self, ev, axis=None) -> None:
        ev.ignore()


class BuildingMotionView(pg.PlotWidget):
    """Floors at their elevations, elements between them, the mass and rigidity axes, all moving."""

    view_turned = Signal()

    def __init__(self, parent: object = None) -> None:
        box = _TurntableBox()
        super().__init__(parent=parent, background=PAPER, viewBox=box)
        self._box = box
        self.setObjectName("modeBuildingView")
        item = self.getPlotItem()
        item.hideAxis("left")
        item.hideAxis("bottom")
        item.hideButtons()
        item.setMenuEnabled(False)
        self._box.turned.connect(self._turn)
        self.view = ViewAngle()
        self._ground = SegmentLines(pen(UNDEFORMED, 1.5), z=0)
        self._rest = SegmentLines(pen(UNDEFORMED, 1.0), z=0)
        self._triad = SegmentLines(pen(TEXT, 1.0), z=0)
        self._floors = SegmentLines(pen(MOVING_FLOOR, 1.5), z=2)
        wall = QColor(app_kind(ElementKind.SHEAR_WALL).colour)
        wall_fill = QColor(wall)
        wall_fill.setAlpha(70)
        self._walls = FilledQuads(pen(wall, 1.0), QBrush(wall_fill), z=1)
        self._lines = {spec.kind: SegmentLines(pen(spec.colour, 1.5), z=3) for spec in app_kinds()}
        self._mass_axis = SegmentLines(pen(MASS_CENTRE, 2.5), z=5)
        self._rigidity_axis = SegmentLines(pen(RIGIDITY_CENTRE, 2.5, Qt.PenStyle.DashLine), z=4)
        for line in (self._ground, self._rest, self._triad, self._floors, self._walls, *self._lines.values(),
                     self._mass_axis, self._rigidity_axis):
            item.addItem(line)
        self._labels = [pg.TextItem(name, color=TEXT, anchor=(0.5, 0.5)) for name in ("x", "y", "z")]
        for label in self._labels:
            item.addItem(label)
        self._geometry: BuildingGeometry | None = None
        self._motion: LayerMotion | None = None
        self._origin: Point3 = (0.0, 0.0, 0.0)
        self._phase = 0.0
        self._reach = 1.0
        self._title = ""
        self.frames_drawn = 0

    def show_mode(
        self,
        geometry: BuildingGeometry,
        floors: Sequence[FloorMass],
        mode: Mode,
        scale: float,
        peak: float,
        phase: float,
    ) -> None:
        """Precompute the motion of ``mode`` at drawn ``scale`` and draw it at ``phase``."""
        layers: dict[str, AttachedPoints] = {
            "floors": geometry.outlines,
            "walls": geometry.wall_panels,
            "mass_axis": geometry.mass_axis,
            "rigidity_axis": geometry.rigidity_axis,
        }
        for kind in self._lines:
            layers[kind] = geometry.frame_lines[kind]
        self._geometry = geometry
        self._motion = LayerMotion(layers, floors, mode.shape, scale)
        x0, y0, x1, y1 = geometry.bounds
        self._origin = ((x0 + x1) / 2, (y0 + y1) / 2, geometry.height / 2)
        reach = math.sqrt(((x1 - x0) / 2) ** 2 + ((y1 - y0) / 2) ** 2 + (geometry.height / 2) ** 2) + peak
        if not math.isclose(reach, self._reach, rel_tol=1e-9):
            self._reach = reach
            self._box.setRange(xRange=(-reach, reach), yRange=(-reach, reach), padding=0.02)
        self._draw_still()
        self.set_phase(phase)

    def clear_mode(self) -> None:
        self._motion = None
        self._geometry = None
        for line in (self._ground, self._rest, self._triad, self._floors, *self._lines.values(),
                     self._mass_axis, self._rigidity_axis):
            line.setData([], [])
        self._walls.set_quads(np.zeros((0, 2)))
        for label in self._labels:
            label.setText("")

    def set_view(self, view: ViewAngle) -> None:
        self.view = view
        self._draw_still()
        self.set_phase(self._phase)
        self._update_title()
        self.view_turned.emit()

    def _turn(self, dx: float, dy: float) -> None:
        k = math.radians(DEGREES_PER_PIXEL)
        self.set_view(self.view.rotated(-dx * k, dy * k))

    def _update_title(self) -> None:
        """Short, for narrow strips: the view's azimuth and elevation in degrees."""
        title = f"3D · drag to turn · {math.degrees(self.view.azimuth):.0f}°, {math.degrees(self.view.elevation):.0f}°"
        if title != self._title:
            self._title = title
            self.getPlotItem().setTitle(title, size="9pt")

    def _draw_still(self) -> None:
        """The parts that move only when the view turns: ground, building at rest, axis arrows."""
        geometry = self._geometry
        if geometry is None:
            return
        self._update_title()
        project = self.view.project
        self._ground.set_segments(project(geometry.ground.xy, geometry.ground.z, self._origin))
        self._rest.set_segments(project(geometry.outlines.xy, geometry.outlines.z, self._origin))
        x0, y0 = geometry.bounds[0], geometry.bounds[1]
        length = TRIAD_SHARE * geometry.plan_size
        tips = np.array([[x0 + length, y0, 0.0], [x0, y0 + length, 0.0], [x0, y0, length]])
        rows = np.empty((6, 3))
        rows[0::2] = (x0, y0, 0.0)
        rows[1::2] = tips
        self._triad.set_segments(project(rows[:, :2], rows[:, 2], self._origin))
        labels = project(x0 + 1.15 * (tips[:, :2] - (x0, y0)), 1.15 * tips[:, 2], self._origin)
        for label, name, (sx, sy) in zip(self._labels, ("x", "y", "z"), labels, strict=True):
            label.setText(name)
            label.setPos(float(sx), float(sy))

    def set_phase(self, phase: float) -> None:
        self._phase = phase
        if self._motion is None:
            return
        frame = self._motion.screen(phase, self.view, self._origin)
        self._floors.set_segments(frame["floors"])
        self._walls.set_quads(frame["walls"])
        self._mass_axis.set_segments(frame["mass_axis"])
        self._rigidity_axis.set_segments(frame["rigidity_axis"])
        for kind, line in self._lines.items():
            line.set_segments(frame[kind])
        self.frames_drawn += 1
