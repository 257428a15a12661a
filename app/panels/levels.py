"""The levels panel: a to-scale elevation strip of the building and the current level's fields.

Each storey is a band whose height is proportional to the storey height; the floor at its top is
a slab line. Two chips on each band show the storey's torsion ratio and judged drift ratio, each
coloured only by its own check (grey where the code limits do not judge it). Clicking a band
makes that level current; the context menu holds the level commands (add, insert, duplicate with elements, delete).
"""

from __future__ import annotations

import dataclasses
from collections.abc import Sequence

from PySide6.QtCore import QPointF, QRectF, QSize, Qt, Signal
from PySide6.QtGui import (
    QAction,
    QColor,
    QContextMenuEvent,
    QFont,
    QMouseEvent,
    QPainter,
    QPaintEvent,
    QPen,
)
from PySide6.QtWidgets import QHBoxLayout, QLabel, QMenu, QSizePolicy, QToolButton, QVBoxLayout, QWidget

from app.canvas import style
from app.commands import replace_level
from app.document import ProjectDocument
from app.panels.fields import FieldForm, Row
from app.panels.verdicts import colour_of, storey_state
from app.panels.when_shown import WhenShown
from app.units import AREA_LOAD, LENGTH
from core.report.figures import drift_text
from core.solve.assembly import floor_masses

GROUND_PIXELS = 22
TOP_PIXELS = 16
CHIP_WIDTH, CHIP_HEIGHT = 44, 15


class LevelStrip(QWidget):
    """The elevation strip; emits ``level_clicked`` with a 1-based level number."""

    level_clicked = Signal(int)

    def __init__(self, document: ProjectDocument, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.document = document
        self.context_actions: Sequence[QAction] = ()
        self._hover: int | None = None
        self.setMouseTracking(True)
        self.setMinimumSize(190, 220)
        self.setSizePolicy(QSizePolicy.Policy.Preferred, QSizePolicy.Policy.Expanding)
        for signal in (document.project_changed, document.preview_changed, document.results_changed):
            signal.connect(self.update)
        document.current_level_changed.connect(self._level_changed)

    def _level_changed(self, _level: int) -> None:
        self.update()

    def sizeHint(self) -> QSize:
        return QSize(220, 420)

    # ------------------------------------------------------------------ geometry

    def bands(self) -> list[QRectF]:
        """Screen rectangle of each storey band, bottom storey first."""
        levels = self.document.shown_project.levels
        if not levels:
            return []
        total = sum(lv.height for lv in levels)
        usable = max(self.height() - GROUND_PIXELS - TOP_PIXELS, 10)
        scale = usable / total
        base = self.height() - GROUND_PIXELS
        left, width = 10.0, self.width() - 20.0
        out, z = [], 0.0
        for lv in levels:
            bottom, top = base - z * scale, base - (z + lv.height) * scale
            out.append(QRectF(left, top, width, bottom - top))
            z += lv.height
        return out

    def level_at(self, pos: QPointF) -> int | None:
        for number, band in enumerate(self.bands(), start=1):
            if band.contains(pos):
                return number
        return None

    # ------------------------------------------------------------------ input

    def mousePressEvent(self, event: QMouseEvent) -> None:
        number = self.level_at(event.position())
        if number is not None and event.button() == Qt.MouseButton.LeftButton:
            self.level_clicked.emit(number)

    def mouseMoveEvent(self, event: QMouseEvent) -> None:
        number = self.level_at(event.position())
        if number != self._hover:
            self._hover = number
            self.setToolTip(self._tooltip(number) if number else "")
            self.update()

    def leaveEvent(self, event) -> None:
        self._hover = None
        self.update()

    def contextMenuEvent(self, event: QContextMenuEvent) -> None:
        number = self.level_at(QPointF(event.pos()))
        if number is not None:
            self.level_clicked.emit(number)
        if self.context_actions:
            menu = QMenu(self)
            menu.addActions(list(self.context_actions))
            menu.exec(event.globalPos())

    def _tooltip(self, number: int) -> str:
        project = self.document.shown_project
        level = project.levels[number - 1]
        lines = [
            f"<b>{level.name}</b>",
            f"storey height {level.height:.2f} m, floor at +{project.elevations[number - 1]:.2f} m",
        ]
        results = self.document.results
        if results is not None and number <= len(results.floors):
            s = results.lateral.storey(number)
            lines.append(f"mass {results.floors[number - 1].mass:.1f} t")
            lateral = results.lateral
            elastic = [d / lateral.drift_amplification for d in s.drift_ratio]
            lines.append(f"torsion ratio δmax/δavg x {s.torsion_ratio[0]:.3f}, y {s.torsion_ratio[1]:.3f}")
            lines.append(f"design drift ratio x {drift_text(s.drift_ratio[0])}, y {drift_text(s.drift_ratio[1])} "
                         f"(d_r/h at the mass centre)")
            lines.append(f"elastic drift ratio x {drift_text(elastic[0])}, y {drift_text(elastic[1])} "
                         f"(d_r = {lateral.drift_amplification:g} × elastic)")
        lines.append(
            f"<small>Chips: the storey's torsion ratio δmax/δavg and its judged drift ({self._drift_word()}), "
            "each coloured by its own check of the code limits (grey: not judged).</small>"
        )
        return "<br>".join(lines)

    # ------------------------------------------------------------------ drawing

    def paintEvent(self, event: QPaintEvent) -> None:
        painter = QPainter(self)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        painter.fillRect(self.rect(), style.PAPER)
        bands = self.bands()
        if not bands:
            painter.setPen(style.FLOOR_EDGE)
            painter.drawText(
                self.rect().adjusted(12, 12, -12, -12),
                Qt.TextFlag.TextWordWrap | Qt.AlignmentFlag.AlignCenter,
                "No levels yet.\nDraw the floor outline on the plan to create level 1.",
            )
            painter.end()
            return
        document = self.document
        levels = document.shown_project.levels
        error = document.error
        flagged = set(error.levels) if error is not None else set()
        results = document.results
        base = bands[0].bottom()
        if results is not None:
            self._draw_header(painter, bands[0])
        painter.setPen(QPen(style.FLOOR_EDGE, 1.0))
        for x in range(0, self.width() + 12, 8):
            painter.drawLine(QPointF(x, base + 12), QPointF(x + 8, base + 4))
        painter.setPen(QPen(style.FLOOR_EDGE, 2.0))
        painter.drawLine(QPointF(0, base), QPointF(self.width(), base))
        for number, (band, level) in enumerate(zip(bands, levels, strict=True), start=1):
            current = number == document.current_level
            fill = QColor("#fff1d6") if current else QColor("#ffffff")
            if number in flagged:
                fill = QColor("#ffe3e3")
            elif number == self._hover:
                fill = fill.darker(104)
            painter.setPen(Qt.PenStyle.NoPen)
            painter.setBrush(fill)
            painter.drawRect(band)
            painter.setPen(QPen(style.BELOW, 1.0))
            painter.drawLine(band.bottomLeft() + QPointF(6, 0), band.topLeft() + QPointF(6, 0))
            painter.drawLine(band.bottomRight() - QPointF(6, 0), band.topRight() - QPointF(6, 0))
            painter.setPen(QPen(style.TEMPORARY if current else style.FLOOR_EDGE, 3.0 if current else 2.2))
            painter.drawLine(band.topLeft(), band.topRight())
            self._draw_texts(painter, band, level.name, level.height, current)
            if results is not None and number <= len(results.floors):
                state = storey_state(results.lateral, number)
                self._draw_chips(painter, band, state)
        painter.end()

    def _draw_texts(self, painter: QPainter, band: QRectF, name: str, height: float, current: bool) -> None:
        font = QFont("DejaVu Sans", 9)
        font.setBold(current)
        painter.setFont(font)
        painter.setPen(style.FLOOR_EDGE)
        text_box = band.adjusted(12, 3, -2 * CHIP_WIDTH - 16, -2)
        if band.height() >= 34:
            painter.drawText(text_box, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop, name)
            painter.setFont(QFont("DejaVu Sans", 8))
            painter.setPen(QColor("#6d695f"))
            painter.drawText(text_box, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignBottom, f"h = {height:.2f} m")
        else:
            painter.drawText(
                text_box, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter, f"{name} · {height:.2f} m"
            )

    def _chip_boxes(self, band: QRectF) -> list[QRectF]:
        """The torsion and drift chips of a band, side by side at its right end."""
        height = min(CHIP_HEIGHT, band.height() - 4)
        top = band.center().y() - height / 2
        right = band.right() - 10
        return [
            QRectF(right - 2 * CHIP_WIDTH - 3, top, CHIP_WIDTH, height),
            QRectF(right - CHIP_WIDTH, top, CHIP_WIDTH, height),
        ]

    def _draw_header(self, painter: QPainter, band: QRectF) -> None:
        painter.setFont(QFont("DejaVu Sans", 7))
        painter.setPen(QColor("#6d695f"))
        for box, text in zip(self._chip_boxes(band), ("δmax/δavg", self._drift_word()), strict=True):
            painter.drawText(
                QRectF(box.left() - 6, 0, box.width() + 12, TOP_PIXELS), Qt.AlignmentFlag.AlignCenter, text
            )

    def _drift_word(self) -> str:
        """What the drift chip shows: the drift the code limits judge (ν·d_r/h under a reduction)."""
        results = self.document.results
        reduced = results is not None and results.lateral.drift_reduction != 1.0
        return "ν·d_r/h" if reduced else "d_r/h"

    def _draw_chips(self, painter: QPainter, band: QRectF, state) -> None:
        texts = [f"{state.torsion_ratio:.2f}", drift_text(state.drift_ratio)]
        statuses = [state.torsion_status, state.drift_status]
        painter.setFont(QFont("DejaVu Sans", 7))
        for box, text, status in zip(self._chip_boxes(band), texts, statuses, strict=True):
            painter.setPen(Qt.PenStyle.NoPen)
            painter.setBrush(colour_of(status))
            painter.drawRoundedRect(box, 4, 4)
            painter.setPen(QColor("white"))
            painter.drawText(box, Qt.AlignmentFlag.AlignCenter, text)


def level_rows(document: ProjectDocument, number: int) -> list[Row]:
    """Editable fields of level ``number`` and its figures (known even while the layout is unstable)."""

    floor = floor_masses(document.shown_project)[number - 1]
    return [
        Row("Name", "name", "text"),
        Row("Storey height", "height", "number", LENGTH, tip="Height of the storey below this floor."),
        Row(
            "Seismic weight",
            "seismic_weight",
            "number",
            AREA_LOAD,
            tip="Dead load plus the combined share of imposed load, per floor area.",
        ),
        Row("Floor at", kind="readonly", getter=lambda _lv: f"+{document.shown_project.elevations[number - 1]:.2f} m"),
        Row("Floor area", kind="readonly", getter=lambda _lv: f"{floor.area:.1f} m²"),
        Row("Mass", kind="readonly", getter=lambda _lv: f"{floor.mass:.1f} t"),
        Row("Point masses", kind="readonly", getter=lambda lv: str(len(lv.point_masses))),
    ]


class LevelsPanel(QWidget):
    """Strip, level command buttons and the current level's fields."""

    def __init__(self, document: ProjectDocument, actions: Sequence[QAction], parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.document = document
        self.strip = LevelStrip(document)
        self.strip.context_actions = actions
        self.strip.level_clicked.connect(document.set_current_level)
        buttons = QHBoxLayout()
        buttons.setSpacing(2)
        for action in actions:
            button = QToolButton()
            button.setDefaultAction(action)
            button.setAutoRaise(True)
            buttons.addWidget(button)
        buttons.addStretch(1)
        self.title = QLabel()
        self.title.setStyleSheet("font-weight: bold; padding: 2px 4px;")
        self.form = FieldForm()
        self.form.apply = self._apply
        layout = QVBoxLayout(self)
        layout.setContentsMargins(2, 2, 2, 2)
        layout.addWidget(self.strip, 1)
        layout.addLayout(buttons)
        layout.addWidget(self.title)
        layout.addWidget(self.form)
        # The fields show the level's own figures, not results: a drag's results leave them alone.
        document.project_changed.connect(self.refresh)
        document.current_level_changed.connect(self.refresh)
        self._when_shown = WhenShown(self, self._fill)
        self._when_shown.fill()

    def refresh(self, *_: object) -> None:
        """Show the current level's fields now, or when the panel is next shown if it is hidden."""
        self._when_shown.request()

    def _fill(self) -> None:
        project = self.document.project
        number = self.document.current_level
        if not project.levels:
            self.title.setText("No level yet")
            self.form.set_rows([])
            self.form.show_objects([])
            return
        self.title.setText(f"Level {number} of {len(project.levels)}")
        self.form.set_rows(level_rows(self.document, number))
        self.form.show_objects([project.levels[number - 1]])

    def _apply(self, changed: list) -> str | None:
        level = changed[0]
        number = self.document.current_level
        old = self.document.project.levels[number - 1]
        what = next(
            (f.name for f in dataclasses.fields(old) if getattr(old, f.name) != getattr(level, f.name)), "level"
        )
        self.document.apply(replace_level(self.document.project, number, level), f"Change {old.name}: {what}")
        return None
