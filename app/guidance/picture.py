"""A picture of one what-if map on its floor: the outline, the elements, the map with its limit
contour, the legend and the caution. Used by ``poise map --png`` (the plan draws the same map
with the same painter, :func:`app.guidance.ramp.draw_map`)."""

from __future__ import annotations

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QImage, QPainter, QPen, QPolygonF

from app.canvas import style
from app.canvas.items import draw_element_symbol, ring_polygon
from app.guidance.ramp import LEGEND_FONT, LEGEND_SIZE, draw_legend, draw_map
from core.guidance.position_map import PositionMap
from core.model import Project
from core.report.summary import CAUTION

MARGIN = 40.0


def map_picture(project: Project, pmap: PositionMap, width: int = 1200, height: int = 900) -> QImage:
    """The map of ``pmap`` over the first floor its element connects, as an RGB image."""
    element = project.element(pmap.element_id)
    level = project.levels[max(element.bottom, 1) - 1]
    image = QImage(width, height, QImage.Format.Format_RGB32)
    image.fill(QColor("white"))
    painter = QPainter(image)
    painter.setRenderHint(QPainter.RenderHint.Antialiasing)
    legend_w, legend_h = LEGEND_SIZE
    x0, x1 = float(pmap.xs[0]), float(pmap.xs[-1])
    y0, y1 = float(pmap.ys[0]), float(pmap.ys[-1])
    usable_w, usable_h = width - 2 * MARGIN, height - 2 * MARGIN - legend_h - 30
    scale = min(usable_w / max(x1 - x0, 1e-6), usable_h / max(y1 - y0, 1e-6))
    left = MARGIN + (usable_w - scale * (x1 - x0)) / 2
    top = MARGIN + 24

    def to_device(p: tuple[float, float]) -> QPointF:
        return QPointF(left + (p[0] - x0) * scale, top + (y1 - p[1]) * scale)

    outline = ring_polygon(level.outline)
    device_outline = QPolygonF([to_device((p.x(), p.y())) for p in outline])
    painter.setPen(QPen(style.FLOOR_EDGE, 1.6))
    painter.setBrush(QColor(250, 250, 248))
    painter.drawPolygon(device_outline)
    draw_map(painter, pmap, to_device, device_outline)
    painter.setBrush(Qt.BrushStyle.NoBrush)
    painter.setPen(QPen(style.FLOOR_EDGE, 1.6))
    painter.drawPolygon(device_outline)
    floor_number = max(element.bottom, 1)
    for other in project.elements_in_storey(floor_number):
        a, b = to_device(other.start), to_device(other.end)
        draw_element_symbol(painter, other, a, b, scale, faint=not other.active, selected=other.id == element.id)
    painter.setFont(LEGEND_FONT)
    painter.setPen(QColor("#1d1d1b"))
    painter.drawText(QRectF(MARGIN, 8, width - 2 * MARGIN, 20), Qt.AlignmentFlag.AlignLeft,
                     f"{project.name}: where {element.id} could stand, drawn on {level.name}")
    legend = QRectF(MARGIN, height - MARGIN - legend_h, legend_w, legend_h)
    draw_legend(painter, legend, pmap)
    painter.drawText(QRectF(legend.right() + 16, legend.top(), width - legend.right() - 16 - MARGIN, legend_h),
                     Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignBottom | Qt.TextFlag.TextWordWrap, CAUTION)
    painter.end()
    return image
