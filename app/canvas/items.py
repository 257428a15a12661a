"""Graphics items of the plan: the floor with its openings, lateral elements, the underlay.

Geometry is in metres (scene units). Symbols are drawn in device pixels so they keep their size
at every zoom: ``paint`` maps the element's ends to the device and draws there. Items ask the
scene for ``pixel`` (metres per device pixel) to size their bounding box and pick area.
"""

from __future__ import annotations

from functools import lru_cache

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import (
    QBrush,
    QColor,
    QFontMetricsF,
    QPainter,
    QPainterPath,
    QPainterPathStroker,
    QPolygonF,
)
from PySide6.QtWidgets import QGraphicsItem, QGraphicsPathItem, QStyleOptionGraphicsItem, QWidget

from app.canvas import style
from app.kinds import app_kind
from core.model import Element, Level, Ring

PICK_PIXELS = 6.0
"""Half-width of an element's pick area, device pixels."""
SYMBOL_PIXELS = 5.0
"""Half-width of the braced-frame band, zigzag amplitude and joint size, device pixels."""


def ring_polygon(ring: Ring) -> QPolygonF:
    return QPolygonF([QPointF(x, y) for x, y in ring])


def floor_path(level: Level) -> QPainterPath:
    """The floor as a path: outline with the openings as holes (odd-even fill)."""
    path = QPainterPath()
    path.setFillRule(Qt.FillRule.OddEvenFill)
    path.addPolygon(ring_polygon(level.outline))
    path.closeSubpath()
    for opening in level.openings:
        path.addPolygon(ring_polygon(opening))
        path.closeSubpath()
    return path


def _pixel(item: QGraphicsItem) -> float:
    scene = item.scene()
    return getattr(scene, "pixel", 0.05) if scene is not None else 0.05


class FloorItem(QGraphicsPathItem):
    """The current level's floor plate, or a faint outline of a level below."""

    def __init__(self, level: Level, faint: bool = False) -> None:
        super().__init__()
        self.level = level
        self.faint = faint
        if faint:
            self.setPen(style.pen(style.BELOW, 1.0, Qt.PenStyle.DashLine))
            self.setBrush(Qt.BrushStyle.NoBrush)
        else:
            self.setPen(style.pen(style.FLOOR_EDGE, 1.6))
            self.setBrush(QBrush(style.FLOOR_FILL))
        self.set_level(level)

    def set_level(self, level: Level) -> None:
        self.level = level
        self.setPath(floor_path(level))

    def paint(self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None) -> None:
        super().paint(painter, option, widget)
        if self.faint:
            return
        painter.setBrush(Qt.BrushStyle.NoBrush)
        painter.setPen(style.pen(style.FLOOR_EDGE, 1.0, Qt.PenStyle.DashLine))
        for opening in self.level.openings:
            polygon = ring_polygon(opening)
            painter.setBrush(QBrush(style.OPENING_FILL, Qt.BrushStyle.BDiagPattern))
            painter.drawPolygon(polygon)


class UnderlayItem(QGraphicsPathItem):
    """A locked, faint line drawing under the plan (for instance from an architect's DXF)."""

    def __init__(self, segments: list[tuple[tuple[float, float], tuple[float, float]]]) -> None:
        super().__init__()
        path = QPainterPath()
        for (x1, y1), (x2, y2) in segments:
            path.moveTo(x1, y1)
            path.lineTo(x2, y2)
        self.setPath(path)
        self.setPen(style.pen(style.UNDERLAY, 1.0))
        self.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIsSelectable, False)
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)


class ElementItem(QGraphicsItem):
    """One lateral element on the plan, with a symbol of its kind drawn in device pixels."""

    def __init__(self, element: Element, faint: bool = False) -> None:
        super().__init__()
        self.element = element
        self.faint = faint
        self.selected = False
        self.culprit = False
        self.transfer = False
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)  # tools pick by position
        # Painted once per look and zoom into a pixmap the view reuses: a drag that moves one
        # element repaints that element, and the other items are copied, not drawn again.
        self.setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)

    def set_element(self, element: Element) -> None:
        if element != self.element:
            self.prepareGeometryChange()
            self.element = element
            self.update()

    def set_marks(self, selected: bool, culprit: bool, transfer: bool = False) -> None:
        if (selected, culprit, transfer) != (self.selected, self.culprit, self.transfer):
            self.selected, self.culprit, self.transfer = selected, culprit, transfer
            self.update()

    def pixel_changed(self) -> None:
        self.prepareGeometryChange()

    def _margin(self) -> float:
        """Room around the line, m: the symbol and the id label beside it (the item's cached
        picture holds only what lies inside the bounding rectangle)."""
        thickness = app_kind(self.element.kind).thickness(self.element.properties)
        label = 20.0 + 0.85 * (_label_width(self.element.id) + 6.0)  # px: see _draw_label
        return max(24.0, label) * _pixel(self) + thickness

    def boundingRect(self) -> QRectF:
        (x1, y1), (x2, y2) = self.element.start, self.element.end
        m = self._margin()
        return QRectF(QPointF(min(x1, x2), min(y1, y2)), QPointF(max(x1, x2), max(y1, y2))).adjusted(-m, -m, m, m)

    def shape(self) -> QPainterPath:
        path = QPainterPath(QPointF(*self.element.start))
        path.lineTo(QPointF(*self.element.end))
        stroker = QPainterPathStroker()
        stroker.setWidth(2 * PICK_PIXELS * _pixel(self))
        return stroker.createStroke(path)

    def paint(self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None) -> None:
        transform = painter.worldTransform()
        a = transform.map(QPointF(*self.element.start))
        b = transform.map(QPointF(*self.element.end))
        painter.save()
        painter.resetTransform()
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        draw_element_symbol(painter, self.element, a, b, transform.m11(), self.faint, self.selected, self.culprit)
        if self.transfer and not self.faint:
            draw_transfer_mark(painter, a, b)
        painter.restore()


def draw_element_symbol(
    painter: QPainter,
    element: Element,
    a: QPointF,
    b: QPointF,
    scale: float,
    faint: bool = False,
    selected: bool = False,
    culprit: bool = False,
    label: bool = True,
) -> None:
    """Draw ``element`` between device points ``a`` and ``b``; ``scale`` is device pixels per metre."""
    line = QLineF(a, b)
    length = line.length()
    spec = app_kind(element.kind)
    colour = spec.colour
    if faint:
        painter.setPen(style.pen(style.BELOW, 1.4, Qt.PenStyle.DashLine))
        painter.drawLine(line)
        return
    for flag, halo in ((culprit, style.CULPRIT), (selected, style.SELECTION)):
        if flag:
            halo_pen = style.pen(halo, 14.0)
            halo_pen.setCapStyle(Qt.PenCapStyle.RoundCap)
            painter.setPen(halo_pen)
            painter.drawLine(line)
    if length < 1.0:
        painter.setPen(style.pen(colour, 2.0))
        painter.drawEllipse(a, 3.0, 3.0)
        return
    u = QPointF((b.x() - a.x()) / length, (b.y() - a.y()) / length)
    n = QPointF(-u.y(), u.x())
    w = spec.draw_canvas(painter, a, u, n, length, SYMBOL_PIXELS, scale, element.properties, colour)
    if label:
        _draw_label(painter, element.id, (a + b) / 2, n, w + 9.0, colour)


TRANSFER_PIXELS = 7.0
"""Half-width of the transfer mark, px."""


def draw_transfer_mark(painter: QPainter, a: QPointF, b: QPointF) -> None:
    """The mark of an element whose base is fixed on a floor (a transfer, or a line left in two
    pieces): a wedge inside each end, pointing along the line, in the warning colour."""
    line = QLineF(a, b)
    if line.length() < 1.0:
        return
    u = QPointF(line.dx() / line.length(), line.dy() / line.length())
    n = QPointF(-u.y(), u.x())
    s = TRANSFER_PIXELS
    painter.setPen(style.pen(style.WARN.darker(140), 1.6))
    painter.setBrush(style.WARN)
    for end, inward in ((a, u), (b, -u)):
        foot = end + inward * (1.6 * s)
        painter.drawPolygon(QPolygonF([foot + n * s, foot - n * s, foot + inward * (1.4 * s)]))


@lru_cache(maxsize=4096)
def _label_width(text: str) -> float:
    """Width of an element's id label, px."""
    return QFontMetricsF(style.LABEL_FONT).horizontalAdvance(text)


def _draw_label(painter: QPainter, text: str, centre: QPointF, n: QPointF, offset: float, colour: QColor) -> None:
    painter.setFont(style.LABEL_FONT)
    metrics = painter.fontMetrics()
    width, height = metrics.horizontalAdvance(text) + 6, metrics.height()
    # Put the label on the side of the line that is up or left on screen.
    if n.y() > 0 or (abs(n.y()) < 1e-9 and n.x() > 0):
        n = -n
    c = centre + n * (offset + max(width, height) * 0.35 * abs(n.x()))
    box = QRectF(c.x() - width / 2, c.y() - height / 2, width, height)
    style.draw_label(painter, box, text, colour, 215, 140)
