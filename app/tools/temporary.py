"""Temporary items a tool shows while a gesture lasts: rubber lines and vertex handles."""

from __future__ import annotations

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QPainter, QPainterPath
from PySide6.QtWidgets import QGraphicsItem, QGraphicsPathItem, QGraphicsScene, QStyleOptionGraphicsItem, QWidget

from app.canvas import style
from app.canvas.scene import Z_TEMPORARY
from core.model import Point


class RubberPath(QGraphicsPathItem):
    """A dashed polyline (optionally closed) in the drawing colour."""

    def __init__(self, scene: QGraphicsScene) -> None:
        super().__init__()
        self.setPen(style.pen(style.TEMPORARY, 1.6, Qt.PenStyle.DashLine))
        self.setZValue(Z_TEMPORARY)
        scene.addItem(self)

    def show_points(self, points: list[Point], closed: bool = False) -> None:
        path = QPainterPath()
        if points:
            path.moveTo(*points[0])
            for p in points[1:]:
                path.lineTo(*p)
            if closed:
                path.closeSubpath()
        self.setPath(path)

    def remove(self) -> None:
        if self.scene() is not None:
            self.scene().removeItem(self)


class Handles(QGraphicsItem):
    """Square grips at the vertices being edited; the one under the cursor is filled."""

    SIZE = 4.5

    def __init__(self, scene: QGraphicsScene) -> None:
        super().__init__()
        self.points: list[Point] = []
        self.hot: int | None = None
        self.setZValue(Z_TEMPORARY)
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        scene.addItem(self)

    def set_points(self, points: list[Point], hot: int | None = None) -> None:
        self.prepareGeometryChange()
        self.points, self.hot = points, hot
        self.update()

    def boundingRect(self) -> QRectF:
        if not self.points:
            return QRectF()
        pixel = getattr(self.scene(), "pixel", 0.05)
        xs, ys = [p[0] for p in self.points], [p[1] for p in self.points]
        m = 10 * pixel
        return QRectF(min(xs) - m, min(ys) - m, max(xs) - min(xs) + 2 * m, max(ys) - min(ys) + 2 * m)

    def paint(self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None) -> None:
        transform = painter.worldTransform()
        painter.save()
        painter.resetTransform()
        s = self.SIZE
        for i, p in enumerate(self.points):
            c = transform.map(QPointF(*p))
            painter.setPen(style.pen(style.HANDLE, 1.2))
            painter.setBrush(style.SNAP if i == self.hot else style.FLOOR_FILL)
            painter.drawRect(QRectF(c.x() - s, c.y() - s, 2 * s, 2 * s))
        painter.restore()

    def remove(self) -> None:
        if self.scene() is not None:
            self.scene().removeItem(self)
