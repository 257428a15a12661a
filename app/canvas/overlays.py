"""Live overlays on the plan: mass centre, rigidity centre, eccentricity, accidental band.

Symbols are Poise's own: the mass centre is a solid disc inside a ring; the storey centre of
rigidity is an open diamond with a solid core; the eccentricity is an arrow from the first to the
second; the accidental-eccentricity band is the shaded box the mass centre is moved within by the
code's ± e_a in each direction. All sizes are device pixels.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QPainter, QPolygonF
from PySide6.QtWidgets import QGraphicsItem, QStyleOptionGraphicsItem, QWidget

from app.canvas import style
from app.canvas.centre_marks import draw_centre_mark
from core.model import Point
from core.results import Results


@dataclass(frozen=True)
class OverlayData:
    """What the overlay shows on one level."""

    mass_centre: Point
    rigidity_centre: Point | None = None
    accidental: tuple[float, float] | None = None
    """Half-widths of the accidental band along x and y, m."""


def overlay_data(results: Results | None, level: int) -> OverlayData | None:
    """The overlay of ``level`` (1-based) from ``results``, or None if it has no floor there."""
    if results is None or not 1 <= level <= len(results.floors):
        return None
    centre = results.floors[level - 1].centre
    lateral = getattr(results, "lateral", None)
    if lateral is None:
        return OverlayData(centre)
    storey = lateral.storey(level)
    along_y, along_x = (float(v) for v in lateral.accidental_eccentricity[level - 1])
    return OverlayData(storey.mass_centre, storey.rigidity_centre, (along_x, along_y))


class OverlayItem(QGraphicsItem):
    """Draws the current :class:`OverlayData` above the plan."""

    def __init__(self) -> None:
        super().__init__()
        self.data: OverlayData | None = None
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        self.setZValue(50)

    def set_data(self, data: OverlayData | None) -> None:
        if data != self.data:
            self.prepareGeometryChange()
            self.data = data
            self.update()

    def boundingRect(self) -> QRectF:
        if self.data is None:
            return QRectF()
        pixel = getattr(self.scene(), "pixel", 0.05)
        points = [self.data.mass_centre] + ([self.data.rigidity_centre] if self.data.rigidity_centre else [])
        xs, ys = [p[0] for p in points], [p[1] for p in points]
        ax, ay = self.data.accidental or (0.0, 0.0)
        m = 140 * pixel
        return QRectF(
            min(xs) - ax - m, min(ys) - ay - m, max(xs) - min(xs) + 2 * (ax + m), max(ys) - min(ys) + 2 * (ay + m)
        )

    def paint(self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None) -> None:
        if self.data is None:
            return
        transform = painter.worldTransform()
        painter.save()
        painter.resetTransform()
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        draw_overlay(painter, self.data, lambda p: transform.map(QPointF(*p)))
        painter.restore()


def draw_overlay(painter: QPainter, data: OverlayData, to_device) -> None:
    """Paint ``data`` with ``to_device`` mapping plan points (m) to device points."""
    m = to_device(data.mass_centre)
    if data.accidental is not None:
        ax, ay = data.accidental
        x, y = data.mass_centre
        corner_a, corner_b = to_device((x - ax, y - ay)), to_device((x + ax, y + ay))
        band = QRectF(corner_a, corner_b).normalized()
        painter.setPen(style.pen(style.MASS_CENTRE, 1.0, Qt.PenStyle.DashLine))
        painter.setBrush(QBrush(style.ACCIDENTAL_BAND))
        painter.drawRect(band)
    # Labels go on the far side of each symbol along the line CM → CR, so they never cover it.
    u = QPointF(-0.7071, -0.7071)
    if data.rigidity_centre is not None:
        r = to_device(data.rigidity_centre)
        distance = QLineF(m, r).length()
        if distance > 14:
            u = (r - m) / distance
            _arrow(painter, m, r)
        draw_centre_mark(painter, "rigidity", r, 9.0, style.pen(style.RIGIDITY_CENTRE, 2.0))
        dx = data.rigidity_centre[0] - data.mass_centre[0]
        dy = data.rigidity_centre[1] - data.mass_centre[1]
        _label(painter, r, u, f"CR  e = {math.hypot(dx, dy):.2f} m", style.RIGIDITY_CENTRE)
    draw_centre_mark(painter, "mass", m, 8.0, style.pen(style.MASS_CENTRE, 2.0))
    _label(painter, m, -u, "CM", style.MASS_CENTRE)


def _arrow(painter: QPainter, a: QPointF, b: QPointF) -> None:
    line = QLineF(a, b)
    length = line.length()
    u = QPointF((b.x() - a.x()) / length, (b.y() - a.y()) / length)
    n = QPointF(-u.y(), u.x())
    tip = b - u * 10.0
    painter.setPen(style.pen(style.ECCENTRICITY, 1.6))
    painter.drawLine(QLineF(a + u * 8.0, tip))
    painter.setPen(Qt.PenStyle.NoPen)
    painter.setBrush(style.ECCENTRICITY)
    head = QPolygonF([tip + u * 0.5, tip - u * 9.0 + n * 4.5, tip - u * 9.0 - n * 4.5])
    painter.drawPolygon(head)


def _label(painter: QPainter, at: QPointF, u: QPointF, text: str, colour: QColor) -> None:
    """A boxed label beside the symbol at ``at``, pushed out along the unit vector ``u``."""
    painter.setFont(style.LABEL_FONT)
    metrics = painter.fontMetrics()
    w, h = metrics.horizontalAdvance(text) + 8, metrics.height()
    gap = 13.0
    centre = at + u * gap + QPointF(u.x() * w / 2, u.y() * h / 2)
    box = QRectF(centre.x() - w / 2, centre.y() - h / 2, w, h)
    style.draw_label(painter, box, text, colour, 220, 120)
