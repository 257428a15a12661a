"""Graphics items that redraw many lines or panels per frame cheaply.

``SegmentLines`` is one pyqtgraph curve holding any number of separate segments (rows 2i, 2i+1);
``FilledQuads`` fills any number of closed quads with one path. Both take the arrays that
``core.report.mode_frames`` produces, which are always finite, so the finite checks are skipped.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import QRectF, Qt
from PySide6.QtGui import QBrush, QPainter, QPainterPath, QPen

from core.arrays import FloatArray
from core.report.mode_frames import QUAD_ROWS


class SegmentLines(pg.PlotCurveItem):
    """Separate line segments in one item: a single path per redraw, whatever their number."""

    def __init__(self, pen: QPen, z: float = 0.0) -> None:
        super().__init__(pen=pen, connect="pairs", skipFiniteCheck=True, antialias=True)
        self.setZValue(z)

    def set_segments(self, xy: FloatArray) -> None:
        self.setData(xy[:, 0], xy[:, 1], connect="pairs", skipFiniteCheck=True)


_REVERSED = np.array([0, 3, 2, 1, 0])


class FilledQuads(pg.GraphicsObject):
    """Closed quads (QUAD_ROWS rows each) filled and outlined with one path.

    The path is filled with the non-zero winding rule after turning every quad counter-clockwise
    on screen, so quads that overlap in a projection never cancel into holes.
    """

    def __init__(self, pen: QPen, brush: QBrush, z: float = 0.0) -> None:
        super().__init__()
        self._pen, self._brush = pen, brush
        self._path = QPainterPath()
        self.setZValue(z)

    def set_quads(self, xy: FloatArray) -> None:
        quads = xy.reshape(-1, QUAD_ROWS, 2)
        x, y = quads[:, :4, 0], quads[:, :4, 1]
        signed_area = (x * np.roll(y, -1, axis=1) - np.roll(x, -1, axis=1) * y).sum(axis=1)
        quads = np.where((signed_area < 0)[:, None, None], quads[:, _REVERSED], quads)
        flat = quads.reshape(-1, 2)
        connect = np.tile(np.array([1, 1, 1, 1, 0], dtype=np.int32), len(quads))  # 1: joins the next
        path = pg.arrayToQPath(flat[:, 0], flat[:, 1], connect=connect, finiteCheck=False)
        path.setFillRule(Qt.FillRule.WindingFill)
        self.prepareGeometryChange()
        self._path = path
        self.update()

    def boundingRect(self) -> QRectF:
        return self._path.boundingRect()

    def paint(self, painter: QPainter, *args: object) -> None:
        # Filling without antialiasing halves the cost of a frame of the 3D view; the edges are
        # then stroked smooth on top.
        painter.setRenderHint(QPainter.RenderHint.Antialiasing, False)
        painter.fillPath(self._path, self._brush)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        painter.strokePath(self._path, self._pen)
