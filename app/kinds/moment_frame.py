"""Moment frames in the app: the beam line with a square at every rigid joint."""

from __future__ import annotations

from collections.abc import Sequence

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QPainter

from app.canvas.style import pen
from app.kinds.drawing import bay_nodes
from app.kinds.materials import material_row
from app.kinds.spec import AppKindSpec
from app.panels.fields import Row, StoreyColumn
from app.sheet.painting import Paper
from app.units import AREA, INERTIA, MODULUS, PLAIN
from core.model import ElementKind, MomentFrame


def draw_canvas(
    painter: QPainter, a: QPointF, u: QPointF, n: QPointF, length: float, w: float, scale: float,
    properties: MomentFrame, colour: QColor,
) -> float:
    painter.setPen(pen(colour, 2.4))
    painter.drawLine(QLineF(a, a + u * length))
    painter.setBrush(colour)
    painter.setPen(Qt.PenStyle.NoPen)
    for i in range(properties.bays + 1):
        c = a + u * (length * i / properties.bays)
        painter.drawRect(QRectF(c.x() - w * 0.8, c.y() - w * 0.8, 1.6 * w, 1.6 * w))
    return w


def draw_sheet(
    paper: Paper, a: QPointF, b: QPointF, u: tuple[float, float], n: tuple[float, float], factor: float,
    properties: MomentFrame, colour: QColor,
) -> None:
    painter = paper.painter
    painter.setPen(paper.pen(colour, 0.45))
    painter.drawLine(a, b)
    painter.setPen(Qt.PenStyle.NoPen)
    painter.setBrush(QBrush(colour))
    s = paper.mm(0.7)
    for node in bay_nodes(a, b, properties.bays):
        painter.drawRect(QRectF(node.x() - s, node.y() - s, 2 * s, 2 * s))


def property_rows() -> list[Row]:
    return [
        material_row(),
        Row("Bays", "properties.bays", "int"),
        Row("Modulus E", "properties.modulus", "number", MODULUS),
        Row("Stiffness factor", "properties.stiffness_factor", "number", PLAIN),
    ]


STOREY_COLUMNS = (
    StoreyColumn("Column", "column_shape", tip="A generic steel shape, or blank to type the figures."),
    StoreyColumn("Column I", "column_inertia", INERTIA, shape="column_shape"),
    StoreyColumn("Column area", "column_area", AREA, shape="column_shape"),
    StoreyColumn("Beam", "beam_shape", tip="The beams on top of the storey: a generic steel shape, or blank."),
    StoreyColumn("Beam I", "beam_inertia", INERTIA, shape="beam_shape"),
    StoreyColumn("Beam area", "beam_area", AREA, shape="beam_shape"),
)


def stiffness_note(frames: Sequence[MomentFrame]) -> str:
    return "moment frames " + ", ".join(f"{f:g}" for f in sorted({m.stiffness_factor for m in frames})) + " of gross"


SPEC = AppKindSpec(
    kind=ElementKind.MOMENT_FRAME,
    label="Moment frame",
    colour=QColor("#2e7d4f"),
    shortcut="M",
    icon="moment_frame",
    dxf_role="MOMENT",
    dxf_colour=3,
    draw_canvas=draw_canvas,
    draw_sheet=draw_sheet,
    property_rows=property_rows,
    stiffness_note=stiffness_note,
    mode_line_width=4.0,
    storey_columns=STOREY_COLUMNS,
)
