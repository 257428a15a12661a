"""The map's colour ramp, legend and picture: one painter for the plan, the PNG and the CLI.

The ramp is Poise's own: five stops from pale cream (low, good) through ochre, sea green and
slate blue to deep indigo (high, bad). Its lightness falls steadily from end to end, so it reads on a
grey printer and without telling red from green; the code limit is drawn over it as a dashed
black line on a white halo, which shows on every colour of the ramp.
"""

from __future__ import annotations

from collections.abc import Callable

import numpy as np
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QFont, QImage, QLinearGradient, QPainter, QPen, QPolygonF, QRegion

from app.units import PERCENT, PLAIN, Quantity
from core.guidance.contour import level_segments
from core.guidance.measures import Measure
from core.guidance.position_map import PositionMap

STOPS = (
    (0.00, (253, 248, 222)),
    (0.25, (238, 206, 124)),
    (0.50, (116, 178, 152)),
    (0.75, (66, 110, 165)),
    (1.00, (39, 24, 78)),
)
"""(position, sRGB) of the ramp, lightness falling monotonically."""
OPACITY = 0.62
"""How strongly the map covers the plan (the floor and elements stay readable below it)."""
LEGEND_FONT = QFont("DejaVu Sans", 8)

ToDevice = Callable[[tuple[float, float]], QPointF]


def quantity(measure: Measure) -> Quantity:
    """How the measure's values are shown (ratios plain, the torsional share in per cent)."""
    return PERCENT if measure is Measure.TORSIONAL_SHARE else PLAIN


def ramp_colours(t: np.ndarray) -> np.ndarray:
    """(…, 3) uint8 colours of positions ``t`` in [0, 1] along the ramp."""
    positions = np.array([p for p, _ in STOPS])
    rgb = np.array([c for _, c in STOPS], dtype=float)
    clipped = np.clip(t, 0.0, 1.0)
    return np.stack([np.interp(clipped, positions, rgb[:, k]) for k in range(3)], axis=-1).round().astype(np.uint8)


def value_range(pmap: PositionMap) -> tuple[float, float]:
    """The values the ramp spans: the map's own, widened to hold the limit when it is close."""
    finite = pmap.values[np.isfinite(pmap.values)]
    if finite.size == 0:
        return 0.0, 1.0
    low, high = float(finite.min()), float(finite.max())
    if high - low < 1e-9 * max(1.0, abs(high)):
        high = low + max(1e-3, 1e-3 * abs(low))
    return low, high


def map_image(pmap: PositionMap, low: float, high: float) -> QImage:
    """One pixel per grid point, row 0 at the lowest y (the caller flips it onto a y-up plan);
    blank where the element cannot stand."""
    values = np.asarray(pmap.values, dtype=float)
    t = (values - low) / (high - low)
    rgba = np.zeros((*values.shape, 4), dtype=np.uint8)
    rgba[..., :3] = ramp_colours(np.nan_to_num(t))
    rgba[..., 3] = np.where(np.isfinite(values), round(255 * OPACITY), 0)
    data = np.ascontiguousarray(rgba[::-1])  # image rows run top down
    image = QImage(data.data, data.shape[1], data.shape[0], 4 * data.shape[1], QImage.Format.Format_RGBA8888)
    return image.copy()  # own the pixels: the numpy buffer goes away


def draw_map(painter: QPainter, pmap: PositionMap, to_device: ToDevice, clip: QPolygonF | None = None) -> None:
    """The map and its limit contour, with ``to_device`` mapping plan metres to device points,
    kept within ``clip`` (device points: the floor's outline) if given."""
    low, high = value_range(pmap)
    dx = (pmap.xs[1] - pmap.xs[0]) / 2 if len(pmap.xs) > 1 else 0.5
    dy = (pmap.ys[1] - pmap.ys[0]) / 2 if len(pmap.ys) > 1 else 0.5
    corner_a = to_device((float(pmap.xs[0] - dx), float(pmap.ys[-1] + dy)))
    corner_b = to_device((float(pmap.xs[-1] + dx), float(pmap.ys[0] - dy)))
    painter.save()
    if clip is not None:
        painter.setClipRegion(QRegion(clip.toPolygon()))
    painter.setRenderHint(QPainter.RenderHint.SmoothPixmapTransform, False)
    painter.drawImage(QRectF(corner_a, corner_b).normalized(), map_image(pmap, low, high))
    segments = level_segments(pmap.xs, pmap.ys, pmap.values, pmap.limit.value)
    for colour, width, style in ((QColor(255, 255, 255, 230), 4.0, Qt.PenStyle.SolidLine),
                                 (QColor("#111111"), 1.8, Qt.PenStyle.DashLine)):
        pen = QPen(colour, width, style)
        pen.setCosmetic(True)
        painter.setPen(pen)
        for a, b in segments:
            painter.drawLine(to_device(a), to_device(b))
    painter.restore()


def draw_legend(painter: QPainter, box: QRectF, pmap: PositionMap) -> None:
    """A vertical ramp with the low and high values, the limit's tick and what it is, in ``box``."""
    low, high = value_range(pmap)
    shown = quantity(pmap.measure)
    unit = f" {shown.unit}" if shown.unit else ""
    painter.save()
    painter.setFont(LEGEND_FONT)
    metrics = painter.fontMetrics()
    line = metrics.height()
    painter.setPen(Qt.PenStyle.NoPen)
    painter.setBrush(QColor(255, 255, 255, 235))
    painter.drawRoundedRect(box, 4, 4)
    painter.setPen(QColor("#1d1d1b"))
    inner = box.adjusted(8, 6, -8, -6)
    painter.drawText(QRectF(inner.left(), inner.top(), inner.width(), line), Qt.AlignmentFlag.AlignLeft,
                     f"{pmap.measure.label} if {pmap.element_id} stood here")
    bar = QRectF(inner.left(), inner.top() + 1.4 * line, 14, inner.height() - 3.8 * line)
    gradient = QLinearGradient(bar.bottomLeft(), bar.topLeft())
    for position, rgb in STOPS:
        gradient.setColorAt(position, QColor(*rgb))
    painter.setBrush(gradient)
    painter.setPen(QPen(QColor("#5b5850"), 1))
    painter.drawRect(bar)

    def at(value: float) -> float:
        return bar.bottom() - (value - low) / (high - low) * bar.height()

    painter.setPen(QColor("#1d1d1b"))
    for value in (low, high):
        painter.drawText(QPointF(bar.right() + 6, at(value) + metrics.ascent() / 2), shown.show(value) + unit)
    limit = pmap.limit
    if low <= limit.value <= high:
        y = at(limit.value)
        pen = QPen(QColor("#111111"), 2, Qt.PenStyle.DashLine)
        painter.setPen(pen)
        painter.drawLine(QPointF(bar.left() - 3, y), QPointF(bar.right() + 3, y))
        painter.setPen(QColor("#1d1d1b"))
        painter.drawText(QPointF(bar.right() + 6, y + metrics.ascent() / 2), f"limit {shown.show(limit.value)}{unit}")
    footer = inner.bottom() - 2.2 * line
    painter.setPen(QColor("#1d1d1b"))
    kind = "limit" if limit.code else "threshold"
    painter.drawText(QRectF(inner.left(), footer, inner.width(), line), Qt.AlignmentFlag.AlignLeft,
                     f"- - {kind}: {limit.source}")
    painter.drawText(QRectF(inner.left(), footer + line, inner.width(), line), Qt.AlignmentFlag.AlignLeft,
                     f"now {shown.show(pmap.current)}{unit}; blank: it would not fit or stand")
    painter.restore()


LEGEND_SIZE = (330.0, 150.0)
"""Width and height of the legend box, device pixels."""
