"""The centre marks, painted by one function for the canvas and the sheet: the mass centre as a
circle with a cross, the rigidity centre as a square on its corner with a smaller square inside.
The shapes are core.report.mode_frames' segments, which the mode views animate and the DXF writes,
so every view draws the same two marks."""

from __future__ import annotations

from typing import Literal

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QColor, QPainter, QPen, QPolygonF

from core.report.mode_frames import mass_centre_symbol, rigidity_centre_symbol

Centre = Literal["mass", "rigidity"]
BACKING = QColor(255, 255, 255, 230)
"""The mark's fill, so it reads over grid, floor and elements."""


def draw_centre_mark(painter: QPainter, which: Centre, at: QPointF, radius: float, pen: QPen) -> None:
    """Paint the ``which`` centre's mark at ``at`` (device units, y down) with ``radius`` and ``pen``."""
    symbol = mass_centre_symbol if which == "mass" else rigidity_centre_symbol
    points = [QPointF(at.x() + x, at.y() - y) for x, y in symbol((0.0, 0.0), radius)]
    painter.save()
    painter.setPen(Qt.PenStyle.NoPen)
    painter.setBrush(BACKING)
    if which == "mass":
        painter.drawEllipse(at, radius, radius)
    else:
        painter.drawPolygon(QPolygonF(points[0:8:2]))  # the outer square's corners
    painter.setPen(pen)
    painter.setBrush(Qt.BrushStyle.NoBrush)
    painter.drawLines(points)
    painter.restore()
