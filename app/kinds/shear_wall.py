"""Shear walls in the app: a solid bar as thick as the wall (at least a few pixels or 0.9 mm)."""

from __future__ import annotations

from collections.abc import Sequence

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QBrush, QColor, QPainter, QPolygonF

from app.canvas.style import pen
from app.kinds.materials import material_row
from app.kinds.spec import AppKindSpec
from app.panels.fields import Row, StoreyColumn
from app.sheet.painting import Paper
from app.units import MODULUS, PLAIN, THICKNESS
from core.model import ElementKind, ShearWall

WALL_MIN_MM = 0.9
"""Walls thinner than this on paper are drawn this thick, so they stay visible."""
WALL_MIN_PIXELS = 3.0
"""Half-width of the thinnest wall on the canvas, px."""


def draw_canvas(
    painter: QPainter, a: QPointF, u: QPointF, n: QPointF, length: float, w: float, scale: float,
    properties: ShearWall, colour: QColor,
) -> float:
    half = max(abs(scale) * properties.thickness / 2, WALL_MIN_PIXELS)
    b = a + u * length
    fill = QColor(colour)
    fill.setAlpha(200)
    painter.setPen(pen(colour.darker(130), 1.0))
    painter.setBrush(fill)
    painter.drawPolygon(QPolygonF([a + n * half, b + n * half, b - n * half, a - n * half]))
    return half


def draw_sheet(
    paper: Paper, a: QPointF, b: QPointF, u: tuple[float, float], n: tuple[float, float], factor: float,
    properties: ShearWall, colour: QColor,
) -> None:
    nx, ny = n
    half = max(properties.thickness * factor, paper.mm(WALL_MIN_MM)) / 2
    corners = [QPointF(a.x() + nx * half, a.y() + ny * half), QPointF(b.x() + nx * half, b.y() + ny * half),
               QPointF(b.x() - nx * half, b.y() - ny * half), QPointF(a.x() - nx * half, a.y() - ny * half)]
    painter = paper.painter
    painter.setPen(Qt.PenStyle.NoPen)
    painter.setBrush(QBrush(colour))
    painter.drawPolygon(QPolygonF(corners))


def property_rows() -> list[Row]:
    return [
        material_row("Sets the material's typical wall (concrete 250 mm cracked, or a steel plate)."),
        Row("Modulus E", "properties.modulus", "number", MODULUS),
        Row("Poisson's ratio", "properties.poisson", "number", PLAIN),
    ]


STOREY_COLUMNS = (
    StoreyColumn("Thickness", "thickness", THICKNESS),
    StoreyColumn(
        "Stiffness factor",
        "stiffness_factor",
        PLAIN,
        tip="Effective share of the gross stiffness after cracking (EN 1998-1 §4.3.1(7): 0.5).",
    ),
)


def stiffness_note(walls: Sequence[ShearWall]) -> str:
    return "walls " + ", ".join(f"{f:g}" for f in sorted({w.stiffness_factor for w in walls})) + " of gross"


def thickness(properties: ShearWall) -> float:
    return properties.thickness


SPEC = AppKindSpec(
    kind=ElementKind.SHEAR_WALL,
    label="Shear wall",
    colour=QColor("#8a5a2b"),
    shortcut="W",
    icon="shear_wall",
    dxf_role="WALLS",
    dxf_colour=1,
    draw_canvas=draw_canvas,
    draw_sheet=draw_sheet,
    property_rows=property_rows,
    stiffness_note=stiffness_note,
    mode_line_width=6.0,
    thickness=thickness,
    legend_properties=ShearWall(thickness=0.18),
    storey_columns=STOREY_COLUMNS,
)
