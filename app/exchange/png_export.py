"""Pictures of the views as PNG files: the plan canvas and any mode view or chart.

pyqtgraph plots go through pyqtgraph's own ImageExporter (rendering their scene straight into
another painter garbles the axes on this Qt stack, see shared qt-notes); any other widget,
the plan canvas included, is grabbed as drawn on screen, at ``scale`` times its pixel size.
"""

from __future__ import annotations

import re
from pathlib import Path

import pyqtgraph as pg
from pyqtgraph.exporters import ImageExporter
from PySide6.QtCore import QPoint, Qt
from PySide6.QtGui import QImage, QPainter
from PySide6.QtWidgets import QWidget

from app.exchange.errors import ExchangeError

DEFAULT_SCALE = 2.0
"""Pixels of the picture per pixel of the view (sharper than the screen for slides and reports)."""


def view_label(widget: QWidget) -> str:
    """A readable name for a view: its accessible name, else its class name in words."""
    if widget.accessibleName():
        return widget.accessibleName()
    words = re.sub(r"(?<!^)(?=[A-Z])", " ", type(widget).__name__).lower()
    return words[:1].upper() + words[1:]


def widget_image(widget: QWidget, scale: float = DEFAULT_SCALE) -> QImage:
    """The widget drawn into an image ``scale`` times its size (white behind transparent parts)."""
    if scale <= 0:
        raise ExchangeError(f"the picture scale must be positive, got {scale!r}")
    if isinstance(widget, pg.PlotWidget):
        exporter = ImageExporter(widget.getPlotItem())
        exporter.parameters()["width"] = max(1, round(widget.width() * scale))
        image = exporter.export(toBytes=True)
        if not isinstance(image, QImage) or image.isNull():
            raise ExchangeError(f"{view_label(widget)}: the plot could not be drawn")
        return image
    size = widget.size() * scale
    if size.isEmpty():
        raise ExchangeError(f"{view_label(widget)} has no size to draw (is it hidden?)")
    image = QImage(size, QImage.Format.Format_ARGB32_Premultiplied)
    image.setDevicePixelRatio(scale)
    image.fill(Qt.GlobalColor.white)
    painter = QPainter(image)
    try:
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        QWidget.render(widget, painter, QPoint(0, 0))  # the widget as on screen (not QGraphicsView.render)
    finally:
        painter.end()
    return image


def export_png(widget: QWidget, path: str | Path, scale: float = DEFAULT_SCALE) -> QImage:
    """Write ``widget`` as a PNG picture to ``path``; returns the image written."""
    image = widget_image(widget, scale)
    if not image.save(str(path), "PNG"):
        raise ExchangeError(f"cannot write the picture {path}")
    return image
