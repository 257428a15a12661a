"""What the guidance draws on the plan: the what-if map with its limit contour and the storey's
target zone under the elements, the move arrows and the suggested position's ghost above them.

Symbols are Poise's own. The target zone is two outlined boxes about the mass centre: e₀ ≤ 0.30·r
with a solid edge, the torsion ratio limit with a dotted one; the centre of rigidity should sit
inside both. An arrow starts at an element's midpoint and points the way a move lowers the
measure, its length growing with the benefit (longest for the element that helps most). The ghost
is the element's line dashed where it would go, with the measure it would give.
"""

from __future__ import annotations

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPainterPath, QPolygonF
from PySide6.QtWidgets import QGraphicsItem, QStyleOptionGraphicsItem, QWidget

from app.canvas import style
from app.guidance.ramp import draw_map, quantity
from core.guidance.gradients import MoveGradient
from core.guidance.measures import Measure
from core.guidance.position_map import PositionMap
from core.guidance.suggestion import Suggestion
from core.guidance.target_zone import StoreyZone
from core.model import Element, Level

ZONE = QColor("#1f4e79")
ARROW = QColor("#1d1d1b")
GHOST = QColor("#7a3e9d")
ARROW_PIXELS = (10.0, 46.0)
"""Shortest and longest arrow, device pixels."""


class GuidanceLayer(QGraphicsItem):
    """The map and the target zone of the current level (under the elements)."""

    def __init__(self) -> None:
        super().__init__()
        self.map: PositionMap | None = None
        self.level: Level | None = None
        self.zone: StoreyZone | None = None
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        self.setZValue(5)

    def show_map(self, pmap: PositionMap | None, level: Level | None) -> None:
        self.prepareGeometryChange()
        self.map, self.level = pmap, level
        self.update()

    def show_zone(self, zone: StoreyZone | None) -> None:
        if zone != self.zone:
            self.prepareGeometryChange()
            self.zone = zone
            self.update()

    def boundingRect(self) -> QRectF:
        rect = QRectF()
        if self.map is not None:
            xs, ys = self.map.xs, self.map.ys
            pad = self.map.step
            rect = QRectF(QPointF(xs[0] - pad, ys[0] - pad), QPointF(xs[-1] + pad, ys[-1] + pad))
        for which in (Measure.ECCENTRICITY, Measure.TORSION_RATIO):
            box = self.zone.rectangle(which) if self.zone is not None else None
            if box is not None:
                pad = 40 * getattr(self.scene(), "pixel", 0.05)
                zone = QRectF(QPointF(box[0], box[1]), QPointF(box[2], box[3]))
                rect = rect.united(zone.adjusted(-pad, -pad, pad, pad))
        return rect

    def paint(self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None) -> None:
        transform = painter.worldTransform()

        def to_device(p: tuple[float, float]) -> QPointF:
            return transform.map(QPointF(*p))

        painter.save()
        painter.resetTransform()
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        if self.map is not None:
            clip = QPolygonF([to_device(p) for p in self.level.outline]) if self.level is not None else None
            draw_map(painter, self.map, to_device, clip)
        if self.zone is not None:
            _draw_zone(painter, self.zone, to_device)
        painter.restore()


def _draw_zone(painter: QPainter, zone: StoreyZone, to_device) -> None:
    painter.setBrush(Qt.BrushStyle.NoBrush)
    painter.setFont(style.LABEL_FONT)
    for which, line, text in (
        (Measure.ECCENTRICITY, Qt.PenStyle.SolidLine, "e₀ ≤ 0.30 r"),
        (Measure.TORSION_RATIO, Qt.PenStyle.DotLine, "torsion ratio ≤ limit"),
    ):
        box = zone.rectangle(which)
        if box is None:
            continue
        rect = QRectF(to_device((box[0], box[3])), to_device((box[2], box[1]))).normalized()
        painter.setPen(style.pen(QColor(255, 255, 255, 220), 4.0))
        painter.drawRect(rect)
        painter.setPen(style.pen(ZONE, 1.8, line))
        painter.drawRect(rect)
        painter.setPen(ZONE)
        painter.drawText(rect.topLeft() + QPointF(3, -4), text)


class GuidanceMarks(QGraphicsItem):
    """Move arrows on the current storey's elements and the suggested position's ghost (above them)."""

    def __init__(self) -> None:
        super().__init__()
        self.elements: dict[str, Element] = {}
        self.gradients: list[MoveGradient] = []
        self.suggestion: Suggestion | None = None
        self.ghost: Element | None = None
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        self.setZValue(55)

    def show(self, elements: dict[str, Element], gradients: list[MoveGradient],
             suggestion: Suggestion | None, ghost: Element | None) -> None:
        self.prepareGeometryChange()
        self.elements, self.gradients, self.suggestion, self.ghost = elements, gradients, suggestion, ghost
        self.update()

    def boundingRect(self) -> QRectF:
        points = [p for e in self.elements.values() for p in (e.start, e.end)]
        if self.ghost is not None:
            points += [self.ghost.start, self.ghost.end]
        if not points:
            return QRectF()
        pad = 80 * getattr(self.scene(), "pixel", 0.05)
        xs, ys = [p[0] for p in points], [p[1] for p in points]
        return QRectF(QPointF(min(xs), min(ys)), QPointF(max(xs), max(ys))).adjusted(-pad, -pad, pad, pad)

    def paint(self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None) -> None:
        transform = painter.worldTransform()
        painter.save()
        painter.resetTransform()
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        largest = max((g.benefit for g in self.gradients if g.element_id in self.elements), default=0.0)
        for g in self.gradients:
            element = self.elements.get(g.element_id)
            if element is None or largest <= 0 or g.benefit <= 1e-9 * largest:
                continue
            a = transform.map(QPointF(*element.midpoint))
            dx, dy = g.helps
            b = transform.map(QPointF(element.midpoint[0] + dx, element.midpoint[1] + dy))
            direction = QLineF(a, b)
            if direction.length() == 0:
                continue
            low, high = ARROW_PIXELS
            direction.setLength(low + (high - low) * g.benefit / largest)
            _arrow(painter, direction)
        if self.ghost is not None and self.suggestion is not None:
            a, b = transform.map(QPointF(*self.ghost.start)), transform.map(QPointF(*self.ghost.end))
            painter.setPen(style.pen(QColor(255, 255, 255, 230), 8.0))
            painter.drawLine(a, b)
            painter.setPen(style.pen(GHOST, 4.0, Qt.PenStyle.DashLine))
            painter.drawLine(a, b)
            shown = quantity(self.suggestion.measure)
            text = f"{self.ghost.id} here: {shown.show(self.suggestion.value)}{' ' + shown.unit if shown.unit else ''}"
            painter.setFont(style.LABEL_FONT)
            width = painter.fontMetrics().horizontalAdvance(text) + 10
            box = QRectF((a + b) / 2 + QPointF(10, -22), QPointF((a + b) / 2 + QPointF(10 + width, -6)))
            style.draw_label(painter, box, text, GHOST, 230, 100)
        painter.restore()


def _arrow(painter: QPainter, line: QLineF) -> None:
    u = QPointF(line.dx() / line.length(), line.dy() / line.length())
    n = QPointF(-u.y(), u.x())
    tip = line.p2()
    painter.setPen(style.pen(QColor(255, 255, 255, 220), 4.0))
    painter.drawLine(line)
    painter.setPen(style.pen(ARROW, 2.0))
    painter.drawLine(QLineF(line.p1(), tip - u * 6.0))
    head = QPainterPath()
    head.addPolygon(QPolygonF([tip, tip - u * 9.0 + n * 4.5, tip - u * 9.0 - n * 4.5]))
    painter.fillPath(head, ARROW)
