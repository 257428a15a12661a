"""Storey springs in the app: a zigzag coil on the canvas, a dashed line with a coil on the sheet."""

from __future__ import annotations

from collections.abc import Sequence

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QColor, QPainter, QPolygonF

from app.canvas.style import pen
from app.kinds.spec import AppKindSpec
from app.panels.fields import Row, StoreyColumn
from app.sheet.painting import Paper
from app.units import STIFFNESS
from core.model import ElementKind, Spring

COIL_TEETH = 6


def draw_canvas(
    painter: QPainter, a: QPointF, u: QPointF, n: QPointF, length: float, w: float, scale: float,
    properties: Spring, colour: QColor,
) -> float:
    painter.setPen(pen(colour, 1.8))
    painter.setBrush(Qt.BrushStyle.NoBrush)
    lead = length * 0.3
    points = [a, a + u * lead]
    step = (length - 2 * lead) / COIL_TEETH
    for i in range(COIL_TEETH):
        side = 1 if i % 2 == 0 else -1
        points.append(a + u * (lead + step * (i + 0.5)) + n * (side * w * 1.2))
    points += [a + u * (length - lead), a + u * length]
    painter.drawPolyline(QPolygonF(points))
    return w


def draw_sheet(
    paper: Paper, a: QPointF, b: QPointF, u: tuple[float, float], n: tuple[float, float], factor: float,
    properties: Spring, colour: QColor,
) -> None:
    painter = paper.painter
    painter.setPen(paper.pen(colour, 0.35, Qt.PenStyle.DashLine))
    painter.drawLine(a, b)
    (ux, uy), (nx, ny) = u, n
    m = QPointF((a.x() + b.x()) / 2, (a.y() + b.y()) / 2)
    step, amp = paper.mm(0.45), paper.mm(0.9)
    points = []
    for i in range(-4, 5):
        across = 0.0 if abs(i) == 4 else (amp if i % 2 else -amp)
        points.append(QPointF(m.x() + ux * step * i + nx * across, m.y() + uy * step * i + ny * across))
    painter.setPen(paper.pen(colour, 0.3))
    painter.drawPolyline(QPolygonF(points))


def property_rows() -> list[Row]:
    return []


STOREY_COLUMNS = (StoreyColumn("Storey stiffness", "", STIFFNESS),)


def stiffness_note(springs: Sequence[Spring]) -> str:
    return "springs as given"


SPEC = AppKindSpec(
    kind=ElementKind.SPRING,
    label="Storey spring",
    colour=QColor("#7a3fa0"),
    shortcut="K",
    icon="spring",
    dxf_role="SPRINGS",
    dxf_colour=6,
    draw_canvas=draw_canvas,
    draw_sheet=draw_sheet,
    property_rows=property_rows,
    stiffness_note=stiffness_note,
    mode_line_width=3.0,
    storey_columns=STOREY_COLUMNS,
)
