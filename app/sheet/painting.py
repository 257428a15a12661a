"""Drawing kit of the sheet: millimetres and points on any paint device, text and tables.

The sheet is laid out in millimetres and fonts are set in points, so it looks the same on a
300 dpi PDF, a printer at its own resolution and a preview image. ``Paper`` converts; the
device's logical resolution says how many device units a millimetre is.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QFont, QPainter, QPen

from core.lateral.records import Status

FONT_FAMILIES = ["DejaVu Sans", "Liberation Sans", "Arial", "Helvetica"]
NO_LIGATURES = ("liga", "clig")
"""OpenType features switched off so the PDF's text layer holds plain letters ("fi", not "ﬁ"),
and a search for a project name in a PDF viewer finds it."""

INK = QColor("#1d232a")
MUTED = QColor("#5f6b76")
RULE = QColor("#9aa5b1")
PAPER_TINT = QColor("#f3f5f7")

STATUS_COLOURS: dict[Status, tuple[QColor, QColor]] = {
    Status.PASS: (QColor("#e2f0e5"), QColor("#1e6b34")),
    Status.WARN: (QColor("#fdf0c8"), QColor("#7a5200")),
    Status.FAIL: (QColor("#f8d9d9"), QColor("#a11b1b")),
}
"""Cell tint and text colour per verdict; the word is always printed too, for grey printers."""

ALIGN_LEFT = Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter
ALIGN_RIGHT = Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter
ALIGN_CENTRE = Qt.AlignmentFlag.AlignCenter
WRAP = Qt.TextFlag.TextWordWrap


class Paper:
    """Millimetre geometry, point-size fonts and pens for one painter."""

    def __init__(self, painter: QPainter, font_scale: float = 1.0) -> None:
        self.painter = painter
        device = painter.device()
        self.units_per_mm = device.logicalDpiX() / 25.4
        self.font_scale = font_scale

    def mm(self, value: float) -> float:
        return value * self.units_per_mm

    def font(
        self, points: float, bold: bool = False, italic: bool = False, scaled: bool = True, narrow: bool = False
    ) -> QFont:
        """A sheet font of ``points`` (times the sheet's font scale if ``scaled``); ``narrow`` picks
        the semi-condensed face, for table cells."""
        font = QFont()
        font.setFamilies(FONT_FAMILIES)
        font.setPointSizeF(points * (self.font_scale if scaled else 1.0))
        font.setBold(bold)
        font.setItalic(italic)
        for tag in NO_LIGATURES:
            font.setFeature(QFont.Tag(tag), 0)
        if narrow:
            font.setStretch(QFont.Stretch.SemiCondensed)
        return font

    def pen(self, colour: QColor, width_mm: float, style: Qt.PenStyle = Qt.PenStyle.SolidLine) -> QPen:
        pen = QPen(colour, self.mm(width_mm), style)
        pen.setCapStyle(Qt.PenCapStyle.FlatCap)
        pen.setJoinStyle(Qt.PenJoinStyle.MiterJoin)
        return pen

    def line_height(self, font: QFont) -> float:
        """Height of one line of ``font`` in device units."""
        self.painter.setFont(font)
        return self.painter.fontMetrics().height() * 1.0

    def text_width(self, text: str, font: QFont) -> float:
        self.painter.setFont(font)
        return self.painter.fontMetrics().horizontalAdvance(text) * 1.0

    def elided(
        self, text: str, font: QFont, width: float, mode: Qt.TextElideMode = Qt.TextElideMode.ElideRight
    ) -> str:
        """``text`` shortened with an ellipsis if it is wider than ``width`` device units."""
        self.painter.setFont(font)
        return self.painter.fontMetrics().elidedText(text, mode, int(width))

    def text_height(self, text: str, font: QFont, width: float) -> float:
        """Height of ``text`` wrapped to ``width`` device units."""
        self.painter.setFont(font)
        bound = self.painter.boundingRect(QRectF(0, 0, width, 1e6), int(ALIGN_LEFT | WRAP), text)
        return bound.height()

    def text(
        self,
        rect: QRectF,
        text: str,
        font: QFont,
        colour: QColor = INK,
        flags: Qt.AlignmentFlag | int = ALIGN_LEFT,
    ) -> QRectF:
        """Draw ``text`` in ``rect``; returns the rectangle the text took."""
        self.painter.setFont(font)
        self.painter.setPen(QPen(colour))
        return self.painter.drawText(rect, int(flags), text)

    def fill(self, rect: QRectF, colour: QColor) -> None:
        self.painter.fillRect(rect, QBrush(colour))

    def frame(self, rect: QRectF, colour: QColor = RULE, width_mm: float = 0.2) -> None:
        self.painter.setPen(self.pen(colour, width_mm))
        self.painter.setBrush(Qt.BrushStyle.NoBrush)
        self.painter.drawRect(rect)

    def hline(self, x0: float, x1: float, y: float, colour: QColor = RULE, width_mm: float = 0.15) -> None:
        self.painter.setPen(self.pen(colour, width_mm))
        self.painter.drawLine(QPointF(x0, y), QPointF(x1, y))


@dataclass(frozen=True)
class Column:
    """A table column: its header text, width share and alignment."""

    header: str
    width: float
    """Relative width (columns are scaled to fill the table)."""
    align: Qt.AlignmentFlag = ALIGN_RIGHT


@dataclass(frozen=True)
class Cell:
    text: str
    status: Status | None = None
    bold: bool = False


class TableLayout:
    """A table measured for a width, so its height is known before it is drawn."""

    MIN_FONT_SHARE = 0.8
    """The cell font shrinks to at most this share of its size to fit a narrow table."""

    def __init__(
        self,
        paper: Paper,
        width: float,
        columns: Sequence[Column],
        rows: Sequence[Sequence[Cell | str]],
        points: float = 6.5,
        max_column_mm: float | None = None,
    ) -> None:
        """Columns get the width their widest cell (and longest header word) needs, and share what
        is left by their ``width`` weights; ``max_column_mm`` keeps a table of few columns compact.
        When the cells do not fit, the font shrinks (to ``MIN_FONT_SHARE``) and then cells elide."""
        self.paper = paper
        self.columns = list(columns)
        self.rows = [[c if isinstance(c, Cell) else Cell(c) for c in row] for row in rows]
        self.pad = paper.mm(0.8)
        share = 1.0
        natural = self._natural_widths(points)
        if sum(natural) > width:
            share = max(self.MIN_FONT_SHARE, width / sum(natural))
            natural = self._natural_widths(points * share)
        self._fonts(points * share)
        self.squeezed = sum(natural) > width
        """True when even the smallest font leaves cells too wide: they are then elided."""
        if max_column_mm is not None:
            width = min(width, sum(max(n, paper.mm(max_column_mm) * c.width) for n, c in zip(natural, columns,
                                                                                              strict=True)))
        if sum(natural) <= width:
            self.widths = _level_widths(natural, [c.width for c in columns], width)
        else:
            self.widths = [n * width / sum(natural) for n in natural]
        self.width = width
        self.row_height = paper.line_height(self.body_font) * 1.3
        self.header_height = (
            max(
                paper.text_height(c.header, self.header_font, w - 2 * self.pad)
                for c, w in zip(self.columns, self.widths, strict=True)
            )
            + 2 * self.pad
        )

    def _fonts(self, points: float) -> None:
        paper = self.paper
        self.body_font = paper.font(points, narrow=True)
        self.bold_font = paper.font(points, bold=True, narrow=True)
        self.header_font = paper.font(points - 0.5, bold=True, narrow=True)

    def _natural_widths(self, points: float) -> list[float]:
        """Width each column needs at ``points``: its widest cell or longest header word."""
        self._fonts(points)
        paper = self.paper
        widths = []
        for i, column in enumerate(self.columns):
            words = column.header.split()
            need = max((paper.text_width(w, self.header_font) for w in words), default=0.0)
            for row in self.rows:
                cell = row[i]
                need = max(need, paper.text_width(cell.text, self.bold_font if cell.bold else self.body_font))
            widths.append(need + 2 * self.pad + paper.mm(0.3))
        return widths

    @property
    def height(self) -> float:
        return self.header_height + self.row_height * len(self.rows)

    def draw(self, x: float, y: float) -> float:
        """Draw with the top left at (x, y) device units; returns the y below the table."""
        paper = self.paper
        paper.fill(QRectF(x, y, self.width, self.header_height), PAPER_TINT)
        left = x
        for column, w in zip(self.columns, self.widths, strict=True):
            cell = QRectF(left + self.pad, y + self.pad, w - 2 * self.pad, self.header_height - 2 * self.pad)
            flags = (column.align & ~Qt.AlignmentFlag.AlignVCenter) | Qt.AlignmentFlag.AlignBottom
            paper.text(cell, column.header, self.header_font, INK, flags | WRAP)
            left += w
        top = y + self.header_height
        paper.hline(x, x + self.width, top, INK, 0.25)
        for index, row in enumerate(self.rows):
            left = x
            for column, w, cell in zip(self.columns, self.widths, row, strict=True):
                box = QRectF(left, top, w, self.row_height)
                colour = INK
                if cell.status is not None:
                    tint, colour = STATUS_COLOURS[cell.status]
                    paper.fill(box.adjusted(paper.mm(0.15), paper.mm(0.15), -paper.mm(0.15), -paper.mm(0.15)), tint)
                font = self.bold_font if cell.bold else self.body_font
                inner = box.adjusted(self.pad, 0, -self.pad, 0)
                paper.text(inner, paper.elided(cell.text, font, inner.width()), font, colour, column.align)
                left += w
            top += self.row_height
            if index < len(self.rows) - 1:
                paper.hline(x, x + self.width, top, RULE, 0.1)
        paper.hline(x, x + self.width, top, INK, 0.25)
        return top


def _level_widths(natural: Sequence[float], weights: Sequence[float], width: float) -> list[float]:
    """Column widths max(natural_i, t·weight_i) with t chosen so they sum to ``width``: the spare
    room goes to the narrowest columns first, so headers wrap evenly."""
    low, high = 0.0, width / min(weights)
    for _ in range(60):
        t = (low + high) / 2
        if sum(max(n, t * w) for n, w in zip(natural, weights, strict=True)) > width:
            high = t
        else:
            low = t
    widths = [max(n, low * w) for n, w in zip(natural, weights, strict=True)]
    rest = width - sum(widths)
    return [w + rest / len(widths) for w in widths]
