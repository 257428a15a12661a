"""The plan of one level on the sheet, at a true drawing scale: outline, openings, the elements
of the storey below with their ids, the centres of mass and rigidity and the eccentricity.

Symbols and colours are the editor's (``core.report.mode_frames``, ``app.canvas.style``): the mass centre
is a circle with a cross, the rigidity centre a square on its corner with a smaller square inside.
Element kinds differ in colour and in shape, so the plan still reads on a grey printer: walls are
solid bars, braced frames carry their brace pattern per bay, moment frames show their rigid
joints, springs are dashed with a coil.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QPainterPath, QPolygonF

from app.canvas.centre_marks import draw_centre_mark
from app.canvas.style import MASS_CENTRE, RIGIDITY_CENTRE, SWITCHED_OFF_OPACITY
from app.kinds import app_kind, app_kinds
from app.sheet.painting import ALIGN_CENTRE, ALIGN_LEFT, ALIGN_RIGHT, INK, MUTED, Paper
from core.model import Element, Kind, Point, Project, default_properties
from core.results import Results

MASS_COLOUR = MASS_CENTRE
RIGIDITY_COLOUR = RIGIDITY_CENTRE
FLOOR_FILL = QColor("#eef2f5")
OPENING_HATCH = QColor("#9aa5b1")

STANDARD_SCALES = (20, 25, 50, 75, 100, 125, 150, 200, 250, 300, 400, 500, 750, 1000, 1250, 1500, 2000, 2500, 5000)
"""Drawing scales 1:n a plan is fitted to, so it can be measured on the print (common practice)."""

MARKER_MM = 1.7
"""Radius of the centre symbols on paper, mm."""
FOOT_MM = 5.0
"""Strip kept free at the foot of the plan for the axes and the scale bar, mm."""


@dataclass(frozen=True)
class PlanScale:
    """World (m, y up) to device units: device = origin + (x, −y)·factor."""

    factor: float
    """Device units per metre."""
    origin: QPointF
    ratio: int | None
    """n of the 1:n drawing scale, or None when the plan had to be fitted freely."""

    def at(self, point: Point) -> QPointF:
        return QPointF(self.origin.x() + point[0] * self.factor, self.origin.y() - point[1] * self.factor)


def choose_scale(paper: Paper, box: QRectF, bounds: tuple[float, float, float, float]) -> PlanScale:
    """The largest standard scale at which ``bounds`` (m) fits ``box``, centred in it."""
    x0, y0, x1, y1 = bounds
    width, height = max(x1 - x0, 1e-6), max(y1 - y0, 1e-6)
    fit = min(box.width() / width, box.height() / height)
    ratio = None
    factor = fit
    for n in STANDARD_SCALES:
        candidate = paper.mm(1000.0 / n)
        if candidate <= fit:
            ratio, factor = n, candidate
            break
    centre = box.center()
    origin = QPointF(centre.x() - (x0 + x1) / 2 * factor, centre.y() + (y0 + y1) / 2 * factor)
    return PlanScale(factor, origin, ratio)


def ring_path(scale: PlanScale, rings: Sequence[Sequence[Point]]) -> QPainterPath:
    path = QPainterPath()
    path.setFillRule(Qt.FillRule.OddEvenFill)
    for ring in rings:
        path.addPolygon(QPolygonF([scale.at(p) for p in ring]))
        path.closeSubpath()
    return path


def mass_centre_mark(paper: Paper, at: QPointF, colour: QColor = MASS_COLOUR, radius_mm: float = MARKER_MM) -> None:
    """The canvas's mass-centre mark, sized in millimetres of paper."""
    draw_centre_mark(paper.painter, "mass", at, paper.mm(radius_mm), paper.pen(colour, 0.3))


def rigidity_centre_mark(
    paper: Paper, at: QPointF, colour: QColor = RIGIDITY_COLOUR, radius_mm: float = MARKER_MM
) -> None:
    """The canvas's rigidity-centre mark, sized in millimetres of paper."""
    draw_centre_mark(paper.painter, "rigidity", at, paper.mm(radius_mm), paper.pen(colour, 0.3))


def _unit(a: QPointF, b: QPointF) -> tuple[float, float]:
    dx, dy = b.x() - a.x(), b.y() - a.y()
    length = math.hypot(dx, dy) or 1.0
    return dx / length, dy / length


def draw_element(paper: Paper, scale: PlanScale, element: Element) -> None:
    """One element in its kind's sheet symbol (see the module docstring)."""
    spec = app_kind(element.kind)
    a, b = scale.at(element.start), scale.at(element.end)
    ux, uy = _unit(a, b)
    spec.draw_sheet(paper, a, b, (ux, uy), (-uy, ux), scale.factor, element.properties, spec.colour)


class LabelPlacer:
    """Places small labels near anchors without overlapping each other or the given keep-outs."""

    def __init__(self, paper: Paper, keep_out: Sequence[QRectF] = ()) -> None:
        self.paper = paper
        self.taken: list[QRectF] = list(keep_out)

    def place(self, text: str, font, candidates: Sequence[QPointF], colour: QColor) -> QRectF:
        """Draw ``text`` centred on the first candidate point whose box is free (else the first)."""
        paper = self.paper
        w = paper.text_width(text, font) + paper.mm(0.8)
        h = paper.line_height(font)
        boxes = [QRectF(c.x() - w / 2, c.y() - h / 2, w, h) for c in candidates]
        chosen = next((box for box in boxes if not any(box.intersects(t) for t in self.taken)), boxes[0])
        self.taken.append(chosen)
        painter = paper.painter
        painter.setPen(Qt.PenStyle.NoPen)
        painter.setBrush(QBrush(QColor(255, 255, 255, 220)))
        painter.drawRoundedRect(chosen, paper.mm(0.5), paper.mm(0.5))
        paper.text(chosen, text, font, colour, ALIGN_CENTRE)
        return chosen


def _label_candidates(paper: Paper, scale: PlanScale, element: Element) -> list[QPointF]:
    a, b = scale.at(element.start), scale.at(element.end)
    ux, uy = _unit(a, b)
    nx, ny = -uy, ux
    m = QPointF((a.x() + b.x()) / 2, (a.y() + b.y()) / 2)
    length = math.hypot(b.x() - a.x(), b.y() - a.y())
    d = paper.mm(2.6)
    return [
        QPointF(m.x() + nx * d * side + ux * along * length, m.y() + ny * d * side + uy * along * length)
        for along in (0.0, 0.3, -0.3)
        for side in (1, -1)
    ]


def plan_bounds(project: Project, level: int) -> tuple[float, float, float, float]:
    floor = project.levels[level - 1]
    points = list(floor.outline)
    for element in project.elements_in_storey(level):
        points += [element.start, element.end]
    xs, ys = [p[0] for p in points], [p[1] for p in points]
    return min(xs), min(ys), max(xs), max(ys)


def draw_plan(paper: Paper, box: QRectF, project: Project, results: Results, level: int) -> PlanScale:
    """Draw level ``level`` (1-based) fitted into ``box``; returns the scale used."""
    painter = paper.painter
    margin = paper.mm(4.5)
    inner = box.adjusted(margin, margin, -margin, -margin - paper.mm(FOOT_MM))
    scale = choose_scale(paper, inner, plan_bounds(project, level))
    floor = project.levels[level - 1]
    painter.save()
    painter.setClipRect(box)

    painter.setPen(paper.pen(INK, 0.5))
    painter.setBrush(QBrush(FLOOR_FILL))
    painter.drawPath(ring_path(scale, [floor.outline, *floor.openings]))
    for opening in floor.openings:
        _hatch(paper, ring_path(scale, [opening]))

    elements = project.elements_in_storey(level)
    for element in elements:
        painter.setOpacity(1.0 if element.active else SWITCHED_OFF_OPACITY)
        draw_element(paper, scale, element)
    painter.setOpacity(1.0)

    mass = scale.at(results.floors[level - 1].centre)
    centre = results.lateral.storey(level).rigidity_centre
    rigidity = None
    if centre is not None:
        rigidity = scale.at(centre)
        painter.setPen(paper.pen(RIGIDITY_COLOUR, 0.3, Qt.PenStyle.DashLine))
        painter.drawLine(mass, rigidity)
        rigidity_centre_mark(paper, rigidity)
    mass_centre_mark(paper, mass)

    marker = paper.mm(MARKER_MM + 0.3)
    keep_out = [QRectF(p.x() - marker, p.y() - marker, 2 * marker, 2 * marker) for p in (mass, rigidity) if p]
    placer = LabelPlacer(paper, keep_out)
    font = paper.font(6.5, bold=True)
    for element in elements:
        placer.place(element.id, font, _label_candidates(paper, scale, element), app_kind(element.kind).colour)
    small = paper.font(6.0, bold=True)
    offsets = [(1, -1), (1, 1), (-1, -1), (-1, 1)]
    d = paper.mm(MARKER_MM + 2.2)
    placer.place("CM", small, [QPointF(mass.x() + sx * d, mass.y() + sy * d) for sx, sy in offsets], MASS_COLOUR)
    if rigidity is not None:
        placer.place("CR", small, [QPointF(rigidity.x() + sx * d, rigidity.y() + sy * d) for sx, sy in offsets],
                     RIGIDITY_COLOUR)
    painter.restore()
    _axes(paper, box)
    _scale_bar(paper, box, scale)
    return scale


def _hatch(paper: Paper, path: QPainterPath) -> None:
    painter = paper.painter
    painter.save()
    painter.setClipPath(path, Qt.ClipOperation.IntersectClip)
    painter.fillPath(path, QBrush(QColor(255, 255, 255)))
    painter.setPen(paper.pen(OPENING_HATCH, 0.15))
    bounds = path.boundingRect()
    step = paper.mm(1.2)
    span = bounds.width() + bounds.height()
    t = 0.0
    while t < span:
        painter.drawLine(QPointF(bounds.left() + t, bounds.bottom()), QPointF(bounds.left() + t - bounds.height(),
                                                                               bounds.top()))
        t += step
    painter.restore()
    painter.setPen(paper.pen(INK, 0.25))
    painter.setBrush(Qt.BrushStyle.NoBrush)
    painter.drawPath(path)


def _axes(paper: Paper, box: QRectF) -> None:
    """Small x and y arrows in the lower-left corner: the plan's axes."""
    painter = paper.painter
    o = QPointF(box.left() + paper.mm(2.5), box.bottom() - paper.mm(2.5))
    length = paper.mm(6)
    painter.setPen(paper.pen(MUTED, 0.25))
    head = paper.mm(0.9)
    for dx, dy, word in ((1, 0, "x"), (0, -1, "y")):
        tip = QPointF(o.x() + dx * length, o.y() + dy * length)
        painter.drawLine(o, tip)
        painter.drawLine(tip, QPointF(tip.x() - dx * head - dy * head * 0.6, tip.y() - dy * head + dx * head * 0.6))
        painter.drawLine(tip, QPointF(tip.x() - dx * head + dy * head * 0.6, tip.y() - dy * head - dx * head * 0.6))
        label = QRectF(tip.x() + dx * paper.mm(0.6) - paper.mm(1.5) * (1 - dx),
                       tip.y() - paper.mm(1.6) + (-paper.mm(1.2) if dy else 0), paper.mm(3), paper.mm(3))
        paper.text(label, word, paper.font(6.0, italic=True), MUTED, ALIGN_CENTRE if dy else ALIGN_LEFT)


def _nice_length(target: float) -> float:
    """A round length (1, 2 or 5 × 10^k m) not above ``target``."""
    exponent = math.floor(math.log10(target))
    for step in (5, 2, 1):
        value = step * 10**exponent
        if value <= target:
            return value
    return 10**exponent


def _scale_bar(paper: Paper, box: QRectF, scale: PlanScale) -> None:
    """A bar of a round length in the lower-right corner, with the drawing scale beside it."""
    painter = paper.painter
    length_m = _nice_length(paper.mm(25) / scale.factor)
    length = length_m * scale.factor
    right = box.right() - paper.mm(2.5)
    y = box.bottom() - paper.mm(2.5)
    left = right - length
    tick = paper.mm(0.8)
    painter.setPen(paper.pen(INK, 0.3))
    painter.drawLine(QPointF(left, y), QPointF(right, y))
    for t in (0.0, 0.5, 1.0):
        x = left + t * length
        painter.drawLine(QPointF(x, y - tick), QPointF(x, y + (tick if t != 0.5 else 0)))
    painter.setBrush(QBrush(INK))
    painter.drawRect(QRectF(left, y - paper.mm(0.4), length / 2, paper.mm(0.4)))
    font = paper.font(5.8)
    words = f"{length_m:g} m"
    paper.text(QRectF(left - paper.mm(20), y - paper.mm(4.2), paper.mm(20) + length, paper.mm(3)), words, font, INK,
               Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignBottom)
    ratio = f"1:{scale.ratio} at 100 %" if scale.ratio else "not to scale"
    paper.text(QRectF(left - paper.mm(30), y - paper.mm(1.6), paper.mm(29), paper.mm(3.2)), ratio, font, MUTED,
               ALIGN_RIGHT)


def draw_legend(paper: Paper, box: QRectF, kinds: Sequence[Kind], with_rigidity: bool) -> float:
    """One line (wrapping if needed) of symbol + word for the kinds shown and the centres; returns
    the height used."""
    font = paper.font(6.0)
    swatch = paper.mm(6.0)
    gap = paper.mm(3.0)
    line = paper.line_height(font) * 1.25
    entries: list[tuple[str, Element | str]] = [
        (spec.label.lower(), _legend_sample(spec.kind)) for spec in app_kinds() if spec.kind in kinds
    ]
    entries.append(("centre of mass", "mass"))
    if with_rigidity:
        entries.append(("centre of rigidity", "rigidity"))
    x, y = box.left(), box.top()
    for word, what in entries:
        width = swatch + paper.mm(1.8) + paper.text_width(word, font)
        if x + width > box.right() and x > box.left():
            x, y = box.left(), y + line
        mid = QPointF(x + swatch / 2, y + line / 2)
        if isinstance(what, Element):
            _draw_swatch(paper, mid, swatch / 2, what)
        elif what == "mass":
            mass_centre_mark(paper, mid, radius_mm=1.3)
        else:
            rigidity_centre_mark(paper, mid, radius_mm=1.3)
        paper.text(QRectF(x + swatch + paper.mm(1.8), y, width, line), word, font, INK, ALIGN_LEFT)
        x += width + gap
    return y + line - box.top()


def _draw_swatch(paper: Paper, mid: QPointF, half: float, element: Element) -> None:
    """The element symbol drawn over ``2·half`` device units centred on ``mid``."""
    draw_element(paper, PlanScale(2 * half, QPointF(mid.x() - half, mid.y()), None), element)


def _legend_sample(kind: Kind) -> Element:
    """A 1 m element of ``kind`` with the legend's properties (the kind's defaults unless it says)."""
    properties = app_kind(kind).legend_properties
    if properties is None:
        properties = default_properties(kind)
    return Element("legend", (0.0, 0.0), (1.0, 0.0), 0, 1, properties)
