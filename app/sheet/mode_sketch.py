"""Small sketches of the first modes for the sheet, drawn from core data with QPainter.

Each sketch shows the top floor's outline at the mode's peak over its undeformed outline (the
same rigid-floor motion as the animated views, ``core.report.mode_frames``) and, beside it, the mode's
shape over the height: u_x, u_y and θ·l_s per floor, scaled to the largest.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QPolygonF

from app.mode_views.palette import ROTATION_COLOUR, X_COLOUR, Y_COLOUR
from app.sheet.content import period_text
from app.sheet.painting import ALIGN_LEFT, INK, MUTED, RULE, Paper
from app.sheet.plan_drawing import MASS_COLOUR, mass_centre_mark
from core.model import Project
from core.report.figures import MODE_KIND_WORDS
from core.report.mode_frames import AttachedPoints, LayerMotion, building_geometry, height_profile, peak_scale
from core.results import Mode, Results

PEAK_SHARE = 0.15
"""The drawn peak displacement as a share of the plan size (our own choice, for legibility)."""

MOTION_COLOUR = QColor("#1e63b5")
PROFILE_STYLES: tuple[tuple[str, QColor, Qt.PenStyle], ...] = (
    ("u_x", X_COLOUR, Qt.PenStyle.SolidLine),
    ("u_y", Y_COLOUR, Qt.PenStyle.DashLine),
    ("θ·l_s", ROTATION_COLOUR, Qt.PenStyle.DotLine),
)
"""The shape over height in the mode views' colours, told apart by dashes on a grey print too."""


def mode_caption(mode: Mode) -> tuple[str, str]:
    """The two caption lines of a sketch: number and period, then kind and mass shares."""
    first = f"Mode {mode.number}   T = {period_text(mode.period)} s"
    mx, my, mr = (100 * v for v in mode.mass_ratio)
    second = f"{MODE_KIND_WORDS[mode.kind]} · mass x {mx:.0f} %, y {my:.0f} %, θ {mr:.0f} %"
    return first, second


def draw_mode_sketch(paper: Paper, box: QRectF, project: Project, results: Results, mode: Mode) -> None:
    """Caption, roof plan at the peak and the shape over height, all inside ``box``."""
    first, second = mode_caption(mode)
    title_font, small = paper.font(7.0, bold=True), paper.font(5.8)
    h1, h2 = paper.line_height(title_font), paper.line_height(small)
    paper.text(QRectF(box.left(), box.top(), box.width(), h1), first, title_font, INK, ALIGN_LEFT)
    paper.text(QRectF(box.left(), box.top() + h1, box.width(), h2), second, small, MUTED, ALIGN_LEFT)
    body = QRectF(box.left(), box.top() + h1 + h2 + paper.mm(1.0), box.width(), box.height() - h1 - h2 - paper.mm(1.0))
    strip = paper.mm(11.0)
    plan_box = QRectF(body.left(), body.top(), body.width() - strip - paper.mm(2.0), body.height())
    profile_box = QRectF(body.right() - strip, body.top(), strip, body.height())
    paper.frame(body, RULE, 0.12)
    _roof_at_peak(paper, plan_box.adjusted(paper.mm(2), paper.mm(2), -paper.mm(1), -paper.mm(2)), project, results,
                  mode)
    _profile(paper, profile_box.adjusted(paper.mm(1), paper.mm(2), -paper.mm(1), -paper.mm(2)), results, mode)


def _roof_at_peak(paper: Paper, box: QRectF, project: Project, results: Results, mode: Mode) -> None:
    floors = results.floors
    top = len(floors) - 1
    geometry = building_geometry(project, floors)
    scale = peak_scale(geometry, floors, mode, PEAK_SHARE * geometry.plan_size)
    centre = floors[top].centre
    layers = {
        "outline": geometry.outlines.on_floor(top),
        "centre": AttachedPoints.of([centre], top, floors[top].elevation),
    }
    motion = LayerMotion(layers, floors, mode.shape, scale)
    still = motion.undeformed()
    moved = motion.plan(math.pi / 2)
    every = [*still["outline"], *moved["outline"]]
    xs, ys = [p[0] for p in every], [p[1] for p in every]
    width, height = max(max(xs) - min(xs), 1e-6), max(max(ys) - min(ys), 1e-6)
    factor = min(box.width() / width, box.height() / height)
    cx, cy = (max(xs) + min(xs)) / 2, (max(ys) + min(ys)) / 2

    def at(p) -> QPointF:
        return QPointF(box.center().x() + (p[0] - cx) * factor, box.center().y() - (p[1] - cy) * factor)

    painter = paper.painter
    painter.setBrush(Qt.BrushStyle.NoBrush)
    painter.setPen(paper.pen(MUTED, 0.2, Qt.PenStyle.DashLine))
    _segments(painter, [at(p) for p in still["outline"]])
    painter.setPen(paper.pen(MOTION_COLOUR, 0.4))
    painter.setBrush(QBrush(QColor(30, 99, 181, 28)))
    _segments(painter, [at(p) for p in moved["outline"]])
    mass_centre_mark(paper, at(still["centre"][0]), QColor(MUTED), radius_mm=0.9)
    mass_centre_mark(paper, at(moved["centre"][0]), MASS_COLOUR, radius_mm=1.1)


def _segments(painter, points: list[QPointF]) -> None:
    """Segments as drawn by core.report.mode_frames: rows 2i and 2i + 1 form one segment."""
    for a, b in zip(points[0::2], points[1::2], strict=True):
        painter.drawLine(a, b)


def _profile(paper: Paper, box: QRectF, results: Results, mode: Mode) -> None:
    profile = height_profile(results.floors, mode)
    height = float(profile.elevation[-1]) or 1.0
    painter = paper.painter
    mid = box.center().x()
    half = box.width() / 2

    def at(value: float, z: float) -> QPointF:
        return QPointF(mid + value * half, box.bottom() - z / height * box.height())

    painter.setPen(paper.pen(RULE, 0.15))
    painter.drawLine(QPointF(mid, box.top()), QPointF(mid, box.bottom()))
    painter.setPen(paper.pen(INK, 0.3))
    painter.drawLine(QPointF(box.left(), box.bottom()), QPointF(box.right(), box.bottom()))
    for (_, colour, style), values in zip(PROFILE_STYLES, (profile.u_x, profile.u_y, profile.twist), strict=True):
        painter.setPen(paper.pen(colour, 0.35, style))
        points = [at(float(v), float(z)) for v, z in zip(values, profile.elevation, strict=True)]
        painter.drawPolyline(QPolygonF(points))
