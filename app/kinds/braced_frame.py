"""Braced frames in the app: chords, posts and the brace pattern of every bay."""

from __future__ import annotations

import itertools
import math
from collections.abc import Sequence

from PySide6.QtCore import QLineF, QPointF, Qt
from PySide6.QtGui import QColor, QPainter

from app.canvas.style import pen
from app.kinds.drawing import bay_nodes
from app.kinds.spec import AppKindSpec
from app.panels.fields import Row, StoreyColumn
from app.sheet.painting import Paper
from app.units import AREA, INERTIA, MODULUS
from core.model import BracedFrame, BracePattern, ElementKind


def draw_canvas(
    painter: QPainter, a: QPointF, u: QPointF, n: QPointF, length: float, w: float, scale: float,
    properties: BracedFrame, colour: QColor,
) -> float:
    painter.setPen(pen(colour, 1.6))
    painter.setBrush(Qt.BrushStyle.NoBrush)
    top, bottom = n * w, n * -w
    b = a + u * length
    painter.drawLine(QLineF(a + top, b + top))
    painter.drawLine(QLineF(a + bottom, b + bottom))
    bay = length / properties.bays
    for i in range(properties.bays + 1):
        c = a + u * (bay * i)
        painter.drawLine(QLineF(c + top, c + bottom))
    painter.setPen(pen(colour, 1.1))
    for i in range(properties.bays):
        left, right = a + u * (bay * i), a + u * (bay * (i + 1))
        if properties.pattern is BracePattern.CROSS:
            painter.drawLine(QLineF(left + bottom, right + top))
            painter.drawLine(QLineF(left + top, right + bottom))
        elif properties.pattern is BracePattern.SINGLE:
            if i % 2 == 0:
                painter.drawLine(QLineF(left + bottom, right + top))
            else:
                painter.drawLine(QLineF(left + top, right + bottom))
        else:
            apex = (left + right) / 2 + top
            painter.drawLine(QLineF(left + bottom, apex))
            painter.drawLine(QLineF(right + bottom, apex))
    return w


def draw_sheet(
    paper: Paper, a: QPointF, b: QPointF, u: tuple[float, float], n: tuple[float, float], factor: float,
    properties: BracedFrame, colour: QColor,
) -> None:
    painter = paper.painter
    (ux, uy), (nx, ny) = u, n
    painter.setPen(paper.pen(colour, 0.45))
    painter.drawLine(a, b)
    h = paper.mm(1.1)
    painter.setPen(paper.pen(colour, 0.25))
    for p, q in itertools.pairwise(bay_nodes(a, b, properties.bays)):
        bay = math.hypot(q.x() - p.x(), q.y() - p.y())
        half = min(h, 0.4 * bay)
        m = QPointF((p.x() + q.x()) / 2, (p.y() + q.y()) / 2)

        def at(along: float, across: float, m: QPointF = m) -> QPointF:
            return QPointF(m.x() + ux * along + nx * across, m.y() + uy * along + ny * across)

        if properties.pattern is BracePattern.CROSS:
            painter.drawLine(at(-half, -half), at(half, half))
            painter.drawLine(at(-half, half), at(half, -half))
        elif properties.pattern is BracePattern.SINGLE:
            painter.drawLine(at(-half, -half), at(half, half))
        else:
            painter.drawLine(at(-half, -half), at(0, half))
            painter.drawLine(at(0, half), at(half, -half))


def property_rows() -> list[Row]:
    return [
        Row(
            "Brace pattern",
            "properties.pattern",
            "choice",
            choices=[
                ("X (two diagonals)", BracePattern.CROSS),
                ("Single diagonal", BracePattern.SINGLE),
                ("Chevron", BracePattern.CHEVRON),
            ],
        ),
        Row("Bays", "properties.bays", "int"),
        Row("Tension only", "properties.tension_only", "check", tip="Cross pattern: the compression brace buckles."),
        Row("Beam area", "properties.beam_area", "number", AREA),
        Row("Beam I", "properties.beam_inertia", "number", INERTIA, tip="Matters for the chevron pattern."),
        Row("Modulus E", "properties.modulus", "number", MODULUS),
    ]


STOREY_COLUMNS = (
    StoreyColumn("Brace", "brace_shape", tip="A generic steel shape, or blank to type the area."),
    StoreyColumn("Brace area", "brace_area", AREA, shape="brace_shape"),
    StoreyColumn("Column", "column_shape", tip="A generic steel shape, or blank to type the area."),
    StoreyColumn("Column area", "column_area", AREA, shape="column_shape"),
)


def stiffness_note(frames: Sequence[BracedFrame]) -> str:
    tension_only = any(f.tension_only for f in frames)
    return "braced frames gross, " + ("some tension-only" if tension_only else "braces act both ways")


SPEC = AppKindSpec(
    kind=ElementKind.BRACED_FRAME,
    label="Braced frame",
    colour=QColor("#1f5fa8"),
    shortcut="B",
    icon="braced_frame",
    dxf_role="BRACED",
    dxf_colour=5,
    draw_canvas=draw_canvas,
    draw_sheet=draw_sheet,
    property_rows=property_rows,
    stiffness_note=stiffness_note,
    mode_line_width=4.0,
    storey_columns=STOREY_COLUMNS,
)
