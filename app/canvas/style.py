"""Poise's own drawing palette: colours and cosmetic pens shared by the canvas and the panels."""

from __future__ import annotations

from PySide6.QtCore import QRectF, Qt
from PySide6.QtGui import QColor, QFont, QPainter, QPen

PAPER = QColor("#f6f5f0")
GRID_MINOR = QColor("#e7e4da")
GRID_MAJOR = QColor("#d2cdbf")
AXIS = QColor("#bdb6a4")
FLOOR_FILL = QColor(255, 255, 255, 205)
"""Slightly see-through, so the grid shows faintly across the floor."""
FLOOR_EDGE = QColor("#34332f")
OPENING_FILL = QColor("#e9e6de")
BELOW = QColor("#a9a394")
"""Outlines and elements of the levels below, drawn for reference."""
UNDERLAY = QColor("#8aa4b8")
TEMPORARY = QColor("#d0560b")
"""Rubber lines of a shape or element being drawn."""
SNAP = QColor("#d0560b")
SELECTION = QColor(255, 176, 0, 110)
CULPRIT = QColor(198, 21, 47, 120)
HANDLE = QColor("#1d1d1b")
SWITCHED_OFF_OPACITY = 0.3
"""A switched-off element is drawn faded (plan and sheet): kept in the layout, out of the analysis."""

LABEL_FONT = QFont("DejaVu Sans", 8)
"""Element ids and the centres' letters on the canvas."""

MASS_CENTRE = QColor("#c2361b")
RIGIDITY_CENTRE = QColor("#0b7d86")
ECCENTRICITY = QColor("#2b2a27")
ACCIDENTAL_BAND = QColor(194, 54, 27, 40)

PASS = QColor("#2e8b57")
WARN = QColor("#d99a00")
FAIL = QColor("#c62828")
UNKNOWN = QColor("#9e9a90")
DIAGNOSTIC = QColor("#b3122e")


def pen(colour: QColor, width: float = 1.0, style: Qt.PenStyle = Qt.PenStyle.SolidLine) -> QPen:
    """A cosmetic pen: ``width`` in device pixels at every zoom."""
    p = QPen(colour, width, style)
    p.setCosmetic(True)
    p.setCapStyle(Qt.PenCapStyle.FlatCap)
    p.setJoinStyle(Qt.PenJoinStyle.MiterJoin)
    return p


def draw_label(painter: QPainter, box: QRectF, text: str, colour: QColor, opacity: int, darker: int) -> None:
    """Text on a rounded white plate, so a label stays legible over grid, outline and elements."""
    painter.setPen(Qt.PenStyle.NoPen)
    painter.setBrush(QColor(255, 255, 255, opacity))
    painter.drawRoundedRect(box, 3, 3)
    painter.setPen(colour.darker(darker))
    painter.drawText(box, Qt.AlignmentFlag.AlignCenter, text)
