"""The plan view: y up, zoom about the cursor, pan, fit, grid, snap marker and diagnostics.

The view turns Qt mouse events into :class:`app.tools.base.PlanEvent` (metres, snapped) and hands
them to the active tool. It draws the grid behind the scene and, in front of it, the snap marker;
the banner that explains an unstable layout sits in a strip above the plan, never over it.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt, Signal
from PySide6.QtGui import QColor, QFont, QKeyEvent, QMouseEvent, QPainter, QResizeEvent, QTransform, QWheelEvent
from PySide6.QtWidgets import QFrame, QGraphicsView, QLabel, QWidget

from app.canvas import style
from app.canvas.grid import draw_grid
from app.canvas.scene import PlanScene
from app.canvas.snapping import Snap, SnapKind, constrain_orthogonal, nearest_on_segment, plan_targets, snap_point
from app.document import ProjectDocument
from app.tools.base import PlanEvent, Tool
from core.model import Point

SNAP_PIXELS = 9.0
"""How near the cursor must come to a feature to snap to it, device pixels."""
ZOOM_STEP = 1.2
MIN_SCALE, MAX_SCALE = 0.3, 4000.0
"""Zoom limits, device pixels per metre."""
BANNER_FONT = QFont("DejaVu Sans", 10)


class PlanView(QGraphicsView):
    """The canvas widget."""

    cursor_moved = Signal(float, float)
    snap_changed = Signal(object)
    """The :class:`Snap` under the cursor (or None when the cursor left the plan)."""
    typing_started = Signal(str)
    """A digit or sign was typed on the canvas while a tool takes typed values."""

    def __init__(self, scene: PlanScene, parent: QWidget | None = None) -> None:
        super().__init__(scene, parent)
        self.document: ProjectDocument = scene.document
        self.grid_spacing = 1.0
        """Grid spacing, m (the user sets it)."""
        self.grid_visible = True
        self.snap_enabled = True
        self.tool: Tool | None = None
        self._snap: Snap | None = None
        self._targets_key: object = None
        self._targets = None
        self._pan_from: QPointF | None = None
        self._space_down = False
        self.setRenderHint(QPainter.RenderHint.Antialiasing)
        self.setViewportUpdateMode(QGraphicsView.ViewportUpdateMode.FullViewportUpdate)
        self.setCacheMode(QGraphicsView.CacheModeFlag.CacheBackground)  # the grid; redrawn on zoom and pan
        self.setTransformationAnchor(QGraphicsView.ViewportAnchor.AnchorUnderMouse)
        self.setResizeAnchor(QGraphicsView.ViewportAnchor.AnchorViewCenter)
        self.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setVerticalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setFrameShape(QFrame.Shape.NoFrame)
        self.setFocusPolicy(Qt.FocusPolicy.StrongFocus)
        self.setMouseTracking(True)
        self.viewport().setMouseTracking(True)
        self.setTransform(QTransform.fromScale(20.0, -20.0))
        self._zoom_changed()
        self.banner = QLabel(self)
        """The strip above the plan that says why the layout cannot be analysed (hidden otherwise)."""
        self.banner.setFont(BANNER_FONT)
        self.banner.setWordWrap(True)
        self.banner.hide()
        self.document.results_changed.connect(self.viewport().update)
        self.document.results_changed.connect(self._refresh_banner)
        self.document.project_changed.connect(self._refresh_banner)
        self.document.project_changed.connect(self._forget_targets)
        self.document.current_level_changed.connect(self._forget_targets)
        self.document.underlay_changed.connect(self._forget_targets)

    @property
    def plan_scene(self) -> PlanScene:
        return self.scene()  # type: ignore[return-value]

    # ------------------------------------------------------------------ tools

    def set_tool(self, tool: Tool) -> None:
        if self.tool is tool:
            return
        if self.tool is not None:
            self.tool.deactivate()
        self.tool = tool
        tool.activate()
        self.viewport().update()

    # ------------------------------------------------------------------ geometry helpers

    @property
    def pixel(self) -> float:
        """Metres per device pixel."""
        return 1.0 / abs(self.transform().m11())

    @property
    def tolerance(self) -> float:
        """The snap and pick distance, m."""
        return SNAP_PIXELS * self.pixel

    def to_plan(self, view_pos: QPointF) -> Point:
        p = self.mapToScene(view_pos.toPoint())
        return (p.x(), p.y())

    def to_view(self, point: Point) -> QPointF:
        return QPointF(self.mapFromScene(QPointF(*point)))

    def _forget_targets(self) -> None:
        self._targets_key = None

    def snap(self, raw: Point, exclude: frozenset[str] = frozenset()) -> Snap:
        """What ``raw`` snaps to on the current level (grid, features, underlay)."""
        if not self.snap_enabled:
            return Snap(raw, SnapKind.FREE)
        document = self.document
        key = (document.project, document.current_level, exclude)
        old = self._targets_key
        if old is None or old[0] is not key[0] or old[1:] != key[1:]:
            self._targets_key = key
            self._targets = plan_targets(
                document.project, document.current_level, document.underlay(document.current_level), exclude
            )
        return snap_point(raw, self._targets, self.tolerance, self.grid_spacing)

    def pick_element(self, raw: Point) -> str | None:
        """Id of the element of the current level nearest to ``raw`` within the pick distance."""
        best: tuple[float, str] | None = None
        for element_id, item in self.plan_scene.element_items.items():
            e = item.element
            d = math.dist(raw, nearest_on_segment(raw, e.start, e.end))
            if d <= self.tolerance and (best is None or d < best[0]):
                best = (d, element_id)
        return best[1] if best else None

    # ------------------------------------------------------------------ zoom and pan

    def redraw_background(self) -> None:
        """Drop the cached grid (after its spacing or visibility changed)."""
        self.resetCachedContent()
        self.viewport().update()

    def _zoom_changed(self) -> None:
        self.resetCachedContent()
        self.plan_scene.set_pixel(self.pixel)
        self._targets_key = None
        self.viewport().update()

    def zoom_by(self, factor: float, about: QPointF | None = None) -> None:
        """Zoom by ``factor`` keeping the plan point at ``about`` (viewport pixels; default the
        centre) where it is on screen."""
        scale = abs(self.transform().m11())
        factor = max(MIN_SCALE / scale, min(MAX_SCALE / scale, factor))
        anchor = (about if about is not None else QPointF(self.viewport().rect().center())).toPoint()
        fixed = self.mapToScene(anchor)
        self.setTransformationAnchor(QGraphicsView.ViewportAnchor.NoAnchor)
        self.scale(factor, factor)
        self.setTransformationAnchor(QGraphicsView.ViewportAnchor.AnchorUnderMouse)
        moved = self.mapFromScene(fixed) - anchor
        self.horizontalScrollBar().setValue(self.horizontalScrollBar().value() + moved.x())
        self.verticalScrollBar().setValue(self.verticalScrollBar().value() + moved.y())
        self._zoom_changed()

    def fit(self, rect: QRectF | None = None) -> None:
        """Show ``rect`` (default: the whole plan) with a margin."""
        rect = rect or self.plan_scene.plan_rect()
        w, h = max(rect.width(), 1.0), max(rect.height(), 1.0)
        view = self.viewport().rect()
        scale = 0.86 * min(view.width() / w, view.height() / h)
        scale = max(MIN_SCALE, min(MAX_SCALE, scale))
        self.setTransform(QTransform.fromScale(scale, -scale))
        self.centerOn(rect.center())
        self._zoom_changed()

    def wheelEvent(self, event: QWheelEvent) -> None:
        steps = event.angleDelta().y() / 120.0
        if steps:
            self.zoom_by(ZOOM_STEP**steps, event.position())
        event.accept()

    def _pan(self, view_pos: QPointF) -> None:
        assert self._pan_from is not None
        delta = view_pos - self._pan_from
        self._pan_from = view_pos
        self.horizontalScrollBar().setValue(self.horizontalScrollBar().value() - round(delta.x()))
        self.verticalScrollBar().setValue(self.verticalScrollBar().value() - round(delta.y()))

    # ------------------------------------------------------------------ mouse

    def _plan_event(self, event: QMouseEvent) -> PlanEvent:
        raw = self.to_plan(event.position())
        tool = self.tool
        snap = self.snap(raw, tool.snap_exclude() if tool else frozenset())
        point = snap.point
        anchor = tool.anchor() if tool else None
        if anchor is not None and event.modifiers() & Qt.KeyboardModifier.ShiftModifier:
            point = constrain_orthogonal(anchor, point)
        return PlanEvent(raw, point, snap, event.button(), event.modifiers(), event.position())

    def mousePressEvent(self, event: QMouseEvent) -> None:
        self.setFocus()
        if event.button() == Qt.MouseButton.MiddleButton or (
            event.button() == Qt.MouseButton.LeftButton and self._space_down
        ):
            self._pan_from = event.position()
            self.viewport().setCursor(Qt.CursorShape.ClosedHandCursor)
            return
        if self.tool is not None:
            self.tool.press(self._plan_event(event))

    def mouseMoveEvent(self, event: QMouseEvent) -> None:
        super().mouseMoveEvent(event)  # the base view keeps the cursor's scene point for its anchors
        if self._pan_from is not None:
            self._pan(event.position())
            return
        plan_event = self._plan_event(event)
        self._snap = plan_event.snap if plan_event.snap.kind is not SnapKind.FREE else None
        self.cursor_moved.emit(*plan_event.point)
        self.snap_changed.emit(plan_event.snap)
        if self.tool is not None:
            self.tool.move(plan_event)
        self.viewport().update()

    def mouseReleaseEvent(self, event: QMouseEvent) -> None:
        if self._pan_from is not None and event.button() in (Qt.MouseButton.MiddleButton, Qt.MouseButton.LeftButton):
            self._pan_from = None
            self.viewport().unsetCursor()
            return
        if self.tool is not None:
            self.tool.release(self._plan_event(event))

    def mouseDoubleClickEvent(self, event: QMouseEvent) -> None:
        if self.tool is not None and event.button() == Qt.MouseButton.LeftButton:
            self.tool.double_click(self._plan_event(event))

    def leaveEvent(self, event) -> None:
        self._snap = None
        self.snap_changed.emit(None)
        self.viewport().update()
        super().leaveEvent(event)

    # ------------------------------------------------------------------ keys

    def keyPressEvent(self, event: QKeyEvent) -> None:
        if event.key() == Qt.Key.Key_Space and not event.isAutoRepeat():
            self._space_down = True
            return
        if self.tool is not None and self.tool.key_press(event):
            self.viewport().update()
            return
        if event.key() == Qt.Key.Key_Escape and self.tool is not None:
            self.tool.cancel()
            return
        text = event.text()
        if self.tool is not None and self.tool.typed_fields and text and (text.isdigit() or text in "-.,"):
            self.typing_started.emit(text)
            return
        if event.key() in (Qt.Key.Key_Left, Qt.Key.Key_Right, Qt.Key.Key_Up, Qt.Key.Key_Down):
            return  # arrows belong to the tools, never scroll the plan
        super().keyPressEvent(event)

    def keyReleaseEvent(self, event: QKeyEvent) -> None:
        if event.key() == Qt.Key.Key_Space and not event.isAutoRepeat():
            self._space_down = False
            return
        super().keyReleaseEvent(event)

    # ------------------------------------------------------------------ drawing

    def drawBackground(self, painter: QPainter, rect: QRectF) -> None:
        painter.fillRect(rect, style.PAPER)
        if self.grid_visible:
            draw_grid(painter, rect, self.grid_spacing, self.pixel)

    def drawForeground(self, painter: QPainter, rect: QRectF) -> None:
        painter.save()
        painter.resetTransform()
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        if self._snap is not None:
            draw_snap_marker(painter, self.to_view(self._snap.point), self._snap.kind, self._snap.along)
        painter.restore()

    @property
    def shown_snap(self) -> Snap | None:
        """The snap whose marker is drawn (None when the cursor catches nothing)."""
        return self._snap

    def snap_tag(self) -> str:
        """The tag drawn by the cursor ("" when no marker is shown)."""
        return SNAP_TAGS.get(self._snap.kind, "") if self._snap is not None else ""

    def diagnostic_text(self) -> str | None:
        """The explanation shown on the canvas when the layout cannot be analysed, else None."""
        document = self.document
        error = document.error
        if error is None:
            return None
        if not document.shown_project.levels:
            return "No floor yet: draw the outline of level 1 (Outline or Rectangle tool)."
        return f"Cannot analyse this layout: {error.message}"  # the message names the levels and motion

    def _refresh_banner(self) -> None:
        """Show the diagnostic in the strip above the plan, shrinking the plan by its height. A
        drag's previews repeat the same text, so an unchanged text costs nothing."""
        text = self.diagnostic_text()
        if text == (self.banner.text() if self.banner.isVisibleTo(self) else None):
            return
        if not text:
            self.banner.hide()
            self.setViewportMargins(0, 0, 0, 0)
            return
        unstable = bool(self.document.shown_project.levels)
        edge = style.DIAGNOSTIC if unstable else style.FLOOR_EDGE
        fill = "#fff0f0" if unstable else "#ffffff"
        self.banner.setStyleSheet(
            f"QLabel {{ background: {fill}; color: {edge.name()}; border-bottom: 2px solid {edge.name()};"
            " padding: 6px 10px; }"
        )
        self.banner.setText(text)
        self._place_banner()
        self.banner.show()

    def _place_banner(self) -> None:
        width = self.width()
        height = self.banner.heightForWidth(width)
        self.banner.setGeometry(0, 0, width, height)
        self.setViewportMargins(0, height, 0, 0)

    def resizeEvent(self, event: QResizeEvent) -> None:
        super().resizeEvent(event)
        if self.banner.isVisible():
            self._place_banner()

SNAP_TAGS: dict[SnapKind, str] = {
    SnapKind.VERTEX: "corner",
    SnapKind.END: "end",
    SnapKind.MIDPOINT: "middle",
    SnapKind.EDGE: "on line",
    SnapKind.UNDERLAY: "on drawing",
    SnapKind.GRID: "grid",
}
"""The word by the cursor that names what the cursor caught."""
TAG_FONT = QFont("DejaVu Sans", 8)


def draw_snap_marker(painter: QPainter, c: QPointF, kind: SnapKind, along: Point | None = None) -> None:
    """Poise's snap marker at ``c`` (device pixels) and a tag naming the snap beside it: a filled
    dot for a corner or an end, a short tick across the line for a middle, a small ring on the
    line for a point on a line or drawing, a small plus for a grid point."""
    painter.save()
    if kind in (SnapKind.VERTEX, SnapKind.END):
        painter.setPen(style.pen(QColor("white"), 1.5))
        painter.setBrush(style.SNAP)
        painter.drawEllipse(c, 4.5, 4.5)
    elif kind is SnapKind.MIDPOINT:
        dx, dy = along if along is not None else (1.0, 0.0)
        across = QPointF(-dy, -dx) * 8.0  # perpendicular on screen (the view flips y)
        painter.setPen(style.pen(style.SNAP, 3.0))
        painter.drawLine(QLineF(c - across, c + across))
    elif kind in (SnapKind.EDGE, SnapKind.UNDERLAY):
        painter.setBrush(Qt.BrushStyle.NoBrush)
        painter.setPen(style.pen(style.SNAP, 2.0))
        painter.drawEllipse(c, 5.5, 5.5)
    else:
        r = 4.0
        painter.setPen(style.pen(style.SNAP, 1.5))
        painter.drawLine(QLineF(c.x() - r, c.y(), c.x() + r, c.y()))
        painter.drawLine(QLineF(c.x(), c.y() - r, c.x(), c.y() + r))
    tag = SNAP_TAGS.get(kind)
    if tag:
        painter.setFont(TAG_FONT)
        width = painter.fontMetrics().horizontalAdvance(tag) + 8
        box = QRectF(c.x() + 11, c.y() - 22, width, painter.fontMetrics().height() + 2)
        style.draw_label(painter, box, tag, style.SNAP, 225, 130)
    painter.restore()
