"""The live readouts beside the plan: does the building twist, and how does it sway?

The worst torsion ratio in each direction, the first three periods with what each mode does, and
one pass/warn/fail line per check (its worst storey, the clause as data). They follow every
mouse move of a drag, so they are painted directly (no rich-text labels to lay out again on each
move); hovering a check line shows its full clause and note.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import ClassVar

from PySide6.QtCore import QEvent, QPoint, QRectF, Qt
from PySide6.QtGui import QColor, QFont, QFontMetrics, QHelpEvent, QPainter, QPaintEvent
from PySide6.QtWidgets import QLabel, QScrollArea, QToolTip, QVBoxLayout, QWidget

from app.canvas import style
from app.document import ProjectDocument
from app.panels.results import fmt_number, mode_type
from app.panels.verdicts import STATUS_WORDS, check_summaries, colour_of
from app.panels.when_shown import WhenShown
from core.lateral.records import Check
from core.report.figures import CODE_LIMITS, verdict_figures
from core.report.summary import CAUTION

GREY = QColor("#6d695f")
HEADING = QFont("DejaVu Sans", 9, QFont.Weight.Bold)
BODY = QFont("DejaVu Sans", 9)
SMALL = QFont("DejaVu Sans", 7)
BIG = QFont("DejaVu Sans", 16, QFont.Weight.Bold)
MARGIN = 4


@dataclass(frozen=True)
class Row:
    """One painted line of the board."""

    kind: str
    """heading, torsion, period, check or message."""
    texts: tuple[str, ...]
    colour: QColor = field(default_factory=lambda: QColor(style.FLOOR_EDGE))
    tip: str = ""


class ReadoutBoard(QWidget):
    """Paints a list of :class:`Row`; its height follows the number of rows."""

    HEIGHTS: ClassVar[dict[str, int]] = {"heading": 20, "torsion": 48, "period": 16, "check": 30}

    def __init__(self, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.rows: list[Row] = []
        self.torsion_colours: tuple[QColor, QColor] = (style.UNKNOWN, style.UNKNOWN)
        """Colours of the two torsion figures (their verdicts' status)."""
        self.setMouseTracking(True)

    def set_rows(self, rows: list[Row]) -> None:
        self.rows = rows
        height = sum(self._height(r) for r in rows) + 2 * MARGIN
        if height != self.minimumHeight():
            self.setMinimumHeight(height)
        self.update()

    def _height(self, row: Row) -> int:
        if row.kind == "message":
            metrics = QFontMetrics(BODY)
            box = metrics.boundingRect(
                0, 0, max(self.width() - 2 * MARGIN, 100), 1000, Qt.TextFlag.TextWordWrap, row.texts[0]
            )
            return box.height() + 8
        return self.HEIGHTS[row.kind]

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        if any(r.kind == "message" for r in self.rows):
            self.set_rows(self.rows)

    def plain_text(self) -> str:
        """Everything shown, as lines of text (for tests and the clipboard)."""
        return "\n".join(" ".join(t for t in r.texts if t) for r in self.rows)

    def event(self, event: QEvent) -> bool:
        if event.type() == QEvent.Type.ToolTip:
            assert isinstance(event, QHelpEvent)
            row = self._row_at(event.pos())
            if row is not None and row.tip:
                QToolTip.showText(event.globalPos(), row.tip, self)
            else:
                QToolTip.hideText()
            return True
        return super().event(event)

    def _row_at(self, pos: QPoint) -> Row | None:
        y = MARGIN
        for row in self.rows:
            h = self._height(row)
            if y <= pos.y() < y + h:
                return row
            y += h
        return None

    def paintEvent(self, event: QPaintEvent) -> None:
        painter = QPainter(self)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        y = MARGIN
        width = self.width() - 2 * MARGIN
        for row in self.rows:
            h = self._height(row)
            box = QRectF(MARGIN, y, width, h)
            getattr(self, f"_paint_{row.kind}")(painter, box, row)
            y += h
        painter.end()

    # ------------------------------------------------------------------ row painters

    def _paint_heading(self, painter: QPainter, box: QRectF, row: Row) -> None:
        painter.setFont(HEADING)
        painter.setPen(style.FLOOR_EDGE)
        left = QRectF(box.left(), box.top() + 4, box.width(), box.height() - 4)
        painter.drawText(left, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter, row.texts[0])
        if len(row.texts) > 1:
            offset = painter.fontMetrics().horizontalAdvance(row.texts[0] + "  ")
            painter.setFont(SMALL)
            painter.setPen(GREY)
            rest = left.adjusted(offset, 0, 0, 0)
            text = painter.fontMetrics().elidedText(row.texts[1], Qt.TextElideMode.ElideRight, int(rest.width()))
            painter.drawText(rest, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter, text)

    def _paint_torsion(self, painter: QPainter, box: QRectF, row: Row) -> None:
        # texts: label, value, note for the load in x, then the same for y
        half = box.width() / 2
        for i in range(2):
            label, value, note = row.texts[3 * i : 3 * i + 3]
            cell = QRectF(box.left() + i * half, box.top(), half - 6, box.height())
            painter.setFont(BODY)
            painter.setPen(style.FLOOR_EDGE)
            painter.drawText(cell.adjusted(0, 2, 0, 0), Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop, label)
            painter.setFont(BIG)
            painter.setPen(self.torsion_colours[i])
            offset = QFontMetrics(BODY).horizontalAdvance(label + " ")
            painter.drawText(
                cell.adjusted(offset, -2, 0, -14), Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter, value
            )
            painter.setFont(SMALL)
            painter.setPen(GREY)
            text = painter.fontMetrics().elidedText(note, Qt.TextElideMode.ElideRight, int(cell.width()))
            painter.drawText(cell, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignBottom, text)

    def _paint_period(self, painter: QPainter, box: QRectF, row: Row) -> None:
        painter.setFont(BODY)
        painter.setPen(style.FLOOR_EDGE)
        name, period, kind = row.texts
        painter.drawText(box.adjusted(4, 0, 0, 0), Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter, name)
        painter.drawText(
            QRectF(box.left() + 28, box.top(), 62, box.height()),
            Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter,
            period,
        )
        painter.drawText(box.adjusted(100, 0, 0, 0), Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter, kind)

    def _paint_check(self, painter: QPainter, box: QRectF, row: Row) -> None:
        word, name, detail = row.texts
        painter.setPen(Qt.PenStyle.NoPen)
        painter.setBrush(row.colour)
        painter.drawEllipse(QRectF(box.left() + 2, box.top() + 5, 9, 9))
        painter.setFont(HEADING)
        painter.setPen(row.colour)
        painter.drawText(
            QRectF(box.left() + 16, box.top() + 1, 40, 16),
            Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter,
            word,
        )
        painter.setFont(BODY)
        painter.setPen(style.FLOOR_EDGE)
        text_box = QRectF(box.left() + 54, box.top() + 1, box.width() - 54, 16)
        painter.drawText(
            text_box,
            Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter,
            painter.fontMetrics().elidedText(name, Qt.TextElideMode.ElideRight, int(text_box.width())),
        )
        painter.setFont(SMALL)
        painter.setPen(GREY)
        detail_box = QRectF(box.left() + 54, box.top() + 16, box.width() - 54, 12)
        painter.drawText(
            detail_box,
            Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter,
            painter.fontMetrics().elidedText(detail, Qt.TextElideMode.ElideRight, int(detail_box.width())),
        )

    def _paint_message(self, painter: QPainter, box: QRectF, row: Row) -> None:
        painter.setFont(BODY)
        painter.setPen(row.colour)
        painter.drawText(box.adjusted(0, 4, 0, 0), Qt.TextFlag.TextWordWrap, row.texts[0])


class ReadoutsPanel(QWidget):
    """Caution line and the readout board, following ``document.results``."""

    def __init__(self, document: ProjectDocument, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.document = document
        self.caution = QLabel(CAUTION)
        self.caution.setWordWrap(True)
        self.caution.setObjectName("caution")
        self.caution.setStyleSheet(
            "background: #fff6e0; border: 1px solid #e2c27a; border-radius: 3px; padding: 4px; font-size: 8pt;"
        )
        self.board = ReadoutBoard()
        scroll = QScrollArea()
        scroll.setWidgetResizable(True)
        scroll.setFrameShape(QScrollArea.Shape.NoFrame)
        scroll.setWidget(self.board)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        layout.addWidget(self.caution)
        layout.addWidget(scroll, 1)
        document.results_changed.connect(self.refresh)
        self._when_shown = WhenShown(self, self._fill)
        self._when_shown.fill()

    def refresh(self) -> None:
        """Show the latest results now, or when the panel is next shown if it is hidden."""
        self._when_shown.request()

    def torsion_values(self) -> tuple[float, float] | None:
        """(worst x, worst y) torsion ratio shown, or None when no results are shown."""
        results = self.document.results
        if results is None:
            return None
        return results.lateral.worst_torsion_ratio("x"), results.lateral.worst_torsion_ratio("y")

    def text(self) -> str:
        return self.board.plain_text()

    def _fill(self) -> None:
        document = self.document
        results = document.results
        if results is None:
            if document.error is not None and document.shown_project.levels:
                rows = [
                    Row("heading", ("Cannot analyse this layout",), style.DIAGNOSTIC),
                    Row("message", (document.error.message,), style.DIAGNOSTIC),
                ]
            else:
                rows = [Row("message", (document.error.message if document.error else "Analysing…",))]
            self.board.set_rows(rows)
            return
        lateral = results.lateral
        judged = [v for v in lateral.verdicts if v.name is Check.TORSION_RATIO]
        texts: list[str] = []
        colours = []
        for i, d in enumerate(("x", "y")):
            values = [s.torsion_ratio[i] for s in lateral.storeys]
            worst_value = max(values)
            storey = lateral.storeys[values.index(worst_value)].name
            verdicts = [v for v in judged if v.direction == d]
            status = max(verdicts, key=lambda v: v.value).status if verdicts else None
            colours.append(colour_of(status) if status else QColor(style.FLOOR_EDGE))
            word = STATUS_WORDS[status] if status else "not judged by the code limits"
            texts += [f"load in {d}:", fmt_number(worst_value, 2), f"{storey} · {word}"]
        self.board.torsion_colours = (colours[0], colours[1])
        rows = [
            Row("heading", ("Worst torsion ratio", "δmax/δavg of the end drifts, ±e accidental")),
            Row("torsion", tuple(texts)),
            Row("heading", ("Periods",)),
        ]
        rows += [Row("period", (f"T{m.number}", f"{m.period:.3f} s", mode_type(m))) for m in results.modes[:3]]
        overall = lateral.status
        rows.append(
            Row(
                "heading",
                ("Checks", f"{CODE_LIMITS} {lateral.rule_set_title} · worst storey · overall {STATUS_WORDS[overall]}"),
            )
        )
        for summary in check_summaries(lateral):
            v = summary.worst
            where = ", ".join(p for p in (f"storey {v.storey}" if v.storey is not None else "", v.direction or "") if p)
            value, limit = verdict_figures(v)
            detail = f"{value} vs {limit}" + (f" ({where})" if where else "") + f" · {v.clause}"
            tip = f"<b>{summary.name}</b><br>{v.clause}<br>{v.note}<br>{summary.flagged} of {summary.count} flagged"
            rows.append(Row("check", (STATUS_WORDS[v.status], summary.name, detail), colour_of(v.status), tip))
        self.board.set_rows(rows)
