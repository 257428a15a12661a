"""The one-page plan sheet, composed with one QPainter so a print, the PDF and a preview agree.

Portrait pages stack: plan of the chosen level beside sketches of modes 1–3; the modes table beside
the key assumptions; the per-storey checks; the caution; the title block. Landscape pages put
the plan and the assumptions on the left and the sketches, tables and caution on the right.
Heights are measured before anything is drawn; when the content is too long for the page the
table fonts shrink a little, then fewer modes are listed (never fewer than three), then the
storeys that pass everything are left out, so the page never spills or overlaps.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Callable
from dataclasses import dataclass

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter

from app.sheet.content import (
    ChecksColumn,
    SheetContent,
    listed_modes,
    period_text,
    sheet_content,
)
from app.sheet.mode_sketch import PROFILE_STYLES, draw_mode_sketch
from app.sheet.painting import (
    ALIGN_LEFT,
    INK,
    MUTED,
    RULE,
    WRAP,
    Cell,
    Column,
    Paper,
    TableLayout,
)
from app.sheet.plan_drawing import draw_legend, draw_plan
from core.lateral.records import STATUS_ORDER, Status
from core.model import Project
from core.report.figures import CODE_LIMITS, judged_figures
from core.results import Results

MIDDLE = Qt.TextElideMode.ElideMiddle
GAP_MM = 3.5
TITLE_MM = 21.0
MIN_PLAN_MM = 88.0
"""Smallest height of the plan before the tables give way."""
MIN_SKETCH_MM = 30.0
"""Smallest height of the row of mode sketches on a landscape page."""
FONT_SCALES = (1.0, 0.92, 0.85)
CAUTION_FILL = QColor("#fff6dd")
CAUTION_EDGE = QColor("#b07d00")


@dataclass
class Block:
    """A piece of the page: its height for a width, and how to draw it in a rectangle."""

    measure: Callable[[float], float]
    draw: Callable[[QRectF], None]


class SheetPainter:
    """Measures and draws the blocks of one sheet for one content and font scale."""

    def __init__(self, painter: QPainter, project: Project, results: Results, content: SheetContent,
                 font_scale: float) -> None:
        self.paper = Paper(painter, font_scale)
        self.project = project
        self.results = results
        self.content = content

    # ------------------------------------------------------------ headings and text

    def heading_height(self) -> float:
        return self.paper.line_height(self.paper.font(7.5, bold=True)) + self.paper.mm(1.2)

    def heading(self, rect: QRectF, text: str, note: str = "") -> float:
        """A section heading with a rule under it; returns its height."""
        paper = self.paper
        font = paper.font(7.5, bold=True)
        h = paper.line_height(font)
        used = paper.text(QRectF(rect.left(), rect.top(), rect.width(), h), text, font, INK, ALIGN_LEFT)
        if note:
            paper.text(QRectF(used.right() + paper.mm(2), rect.top(), rect.width() - used.width() - paper.mm(2), h),
                       note, paper.font(6.2), MUTED, ALIGN_LEFT)
        paper.hline(rect.left(), rect.right(), rect.top() + h + paper.mm(0.4), INK, 0.3)
        return self.heading_height()

    def lines_height(self, lines: list[str], width: float, points: float, bullet: bool = False) -> float:
        font = self.paper.font(points)
        indent = self.paper.mm(2.2) if bullet else 0.0
        return sum(self.paper.text_height(t, font, width - indent) for t in lines) + self.paper.mm(0.5) * len(lines)

    def lines(self, rect: QRectF, lines: list[str], points: float, bullet: bool = False,
              colour: QColor = INK) -> float:
        paper = self.paper
        font = paper.font(points)
        indent = paper.mm(2.2) if bullet else 0.0
        y = rect.top()
        for text in lines:
            h = paper.text_height(text, font, rect.width() - indent)
            if bullet:
                paper.text(QRectF(rect.left(), y, indent, paper.line_height(font)), "•", font, MUTED, ALIGN_LEFT)
            paper.text(QRectF(rect.left() + indent, y, rect.width() - indent, h), text, font, colour,
                       ALIGN_LEFT | WRAP)
            y += h + paper.mm(0.5)
        return y - rect.top()

    # ------------------------------------------------------------ plan and sketches

    def draw_plan_panel(self, rect: QRectF) -> None:
        """Heading, the plan at a true scale, its legend and the centres in figures."""
        content, paper = self.content, self.paper
        floor = self.results.floors[content.level - 1]
        storey = self.results.lateral.storey(content.level)
        info = [f"Centre of mass ({floor.centre[0]:.2f}, {floor.centre[1]:.2f}) m; "
                f"mass radius of gyration l_s = {floor.radius_of_gyration:.2f} m."]
        with_rigidity = storey.rigidity_centre is not None
        if with_rigidity:
            cr = storey.rigidity_centre
            ex, ey = storey.eccentricity
            rx, ry = storey.torsional_radius
            info.append(
                f"Centre of rigidity ({cr[0]:.2f}, {cr[1]:.2f}) m from storey stiffnesses; eccentricity "
                f"e_0x = {_signed(ex)} m, e_0y = {_signed(ey)} m; torsional radius r_x = {rx:.2f} m, "
                f"r_y = {ry:.2f} m."
            )
        else:
            info.append("No centre of rigidity: the storey cannot resist translation in both directions.")
        kinds = sorted({e.kind for e in self.project.elements_in_storey(content.level)})
        note = f"{content.level_reason}; elements of storey {content.level} below it"
        top = rect.top() + self.heading(rect, f"Plan of level {content.level} · {floor.name}", note)
        legend_h = paper.line_height(paper.font(6.0)) * 1.25 * 2
        info_h = self.lines_height(info, rect.width(), 6.2)
        drawing = QRectF(rect.left(), top, rect.width(), rect.bottom() - top - info_h - legend_h - paper.mm(1))
        paper.frame(drawing, RULE, 0.15)
        draw_plan(paper, drawing, self.project, self.results, content.level)
        legend = QRectF(rect.left(), drawing.bottom() + paper.mm(1), rect.width(), legend_h)
        used = draw_legend(paper, legend, kinds, with_rigidity)
        self.lines(QRectF(rect.left(), legend.top() + used, rect.width(), info_h), info, 6.2)

    def draw_sketches(self, rect: QRectF, across: bool) -> None:
        """Modes 1–3 stacked (``across`` False) or side by side, with one shared key."""
        paper = self.paper
        modes = self.content.sketched
        top = rect.top() + self.heading(rect, "Modes 1–3", "top floor at peak; shape over height")
        key_h = paper.text_height(self._sketch_key(), paper.font(5.8), rect.width()) + paper.mm(1)
        area = QRectF(rect.left(), top, rect.width(), rect.bottom() - top - key_h)
        gap = paper.mm(GAP_MM * 0.7)
        count = max(len(modes), 1)
        for i, mode in enumerate(modes):
            if across:
                w = (area.width() - gap * (count - 1)) / count
                box = QRectF(area.left() + i * (w + gap), area.top(), w, area.height())
            else:
                h = (area.height() - gap * (count - 1)) / count
                box = QRectF(area.left(), area.top() + i * (h + gap), area.width(), h)
            draw_mode_sketch(paper, box, self.project, self.results, mode)
        key = QRectF(rect.left(), area.bottom() + paper.mm(1), rect.width(), key_h)
        paper.text(key, self._sketch_key(), paper.font(5.8), MUTED, ALIGN_LEFT | WRAP)

    @staticmethod
    def _sketch_key() -> str:
        return "Plan: undeformed dashed, at peak solid. Profile: " + ", ".join(
            f"{name} {word}" for (name, _, _), word in zip(PROFILE_STYLES, ("solid", "dashed", "dotted"), strict=True)
        ) + " (scaled to the largest)."

    # ------------------------------------------------------------ tables

    def modes_table(self, width: float) -> TableLayout:
        columns = [
            Column("Mode", 0.8),
            Column("T s", 1.1),
            Column("f Hz", 1.0),
            Column("kind", 1.5, ALIGN_LEFT),
            Column("M_x %", 1.0),
            Column("M_y %", 1.0),
            Column("M_θ %", 1.0),
            Column("ΣM_x %", 1.1),
            Column("ΣM_y %", 1.1),
            Column("ΣM_θ %", 1.1),
        ]
        rows = [
            [
                str(m.number),
                Cell(period_text(m.period), bold=True),
                f"{m.frequency:.2f}",
                m.kind.value,
                *(f"{100 * v:.1f}" for v in m.mass_ratio),
                *(f"{100 * v:.1f}" for v in m.cumulative),
            ]
            for m in self.content.modes
        ]
        return TableLayout(self.paper, width, columns, rows, 6.5, max_column_mm=13.0)

    def modes_block(self) -> Block:
        content = self.content

        def note() -> str:
            rest = content.modes_total - len(content.modes)
            return f"{len(content.modes)} of {content.modes_total}" + (" (all in the CSV export)" if rest else "")

        def measure(width: float) -> float:
            return self.heading_height() + self.modes_table(width).height

        def draw(rect: QRectF) -> None:
            top = rect.top() + self.heading(rect, "Modes", note())
            self.modes_table(rect.width()).draw(rect.left(), top)

        return Block(measure, draw)

    def checks_table(self, width: float) -> tuple[TableLayout, bool]:
        """The per-storey table for ``width``, and whether it is compact: when the cells do not fit,
        a passing figure is printed without the word "pass" (warn and fail keep theirs)."""
        table = self._checks_table(width, compact=False)
        if table.squeezed:
            return self._checks_table(width, compact=True), True
        return table, False

    def _checks_table(self, width: float, compact: bool) -> TableLayout:
        content = self.content
        columns = [Column("Storey", 1.5, ALIGN_LEFT)] + [Column(_column_header(c), 1.0) for c in content.columns]
        rows = []
        for row in content.rows:
            cells: list[Cell | str] = [f"{row.storey} · {row.name}"]
            for column, cell in zip(content.columns, row.cells, strict=True):
                if cell is None:
                    cells.append("–")
                    continue
                value, limit = judged_figures(column.name, cell.value, cell.limit)
                if column.limit is None:
                    value += f"/{limit}"
                word = "" if compact and cell.status is Status.PASS else f" {cell.status.value}"
                cells.append(Cell(value + word, cell.status, bold=cell.status is Status.FAIL))
            rows.append(cells)
        return TableLayout(self.paper, width, columns, rows, 6.3, max_column_mm=19.0)

    def checks_notes(self, compact: bool) -> list[str]:
        content = self.content
        notes = ["A figure printed without a word passes." if compact else ""]
        notes += [f"{c.text} — {c.status.value} [{c.clause}]." for c in content.building_checks]
        if content.omitted:
            notes.append(f"Not listed for want of room: storeys {_ranges(content.omitted)} "
                         "(every figure is in the CSV export).")
        notes += [f"[{i}] {clause}" for i, clause in enumerate(content.clauses, start=1)]
        return [n for n in notes if n]

    def checks_block(self) -> Block:
        """Heading, the per-storey table, the whole-building checks and the clause footnotes."""
        content = self.content
        paper = self.paper
        title = "Checks per storey"
        if not content.columns:
            message = [f"No figure is judged per storey under the code limits of {content.rule_set}.",
                       *self.checks_notes(compact=False)]

            def measure_empty(width: float) -> float:
                return self.heading_height() + self.lines_height(message, width, 6.2)

            def draw_empty(rect: QRectF) -> None:
                top = rect.top() + self.heading(rect, title)
                self.lines(QRectF(rect.left(), top, rect.width(), rect.height()), message, 6.2)

            return Block(measure_empty, draw_empty)
        note = f"code limits {content.rule_set}; x, y: direction of analysis; worst case per storey, top first"

        def measure(width: float) -> float:
            table, compact = self.checks_table(width)
            notes = self.checks_notes(compact)
            return self.heading_height() + table.height + paper.mm(1) + self.lines_height(notes, width, 5.8)

        def draw(rect: QRectF) -> None:
            top = rect.top() + self.heading(rect, title, note)
            table, compact = self.checks_table(rect.width())
            bottom = table.draw(rect.left(), top)
            self.lines(QRectF(rect.left(), bottom + paper.mm(1), rect.width(), rect.bottom() - bottom),
                       self.checks_notes(compact), 5.8, colour=MUTED)

        return Block(measure, draw)

    def assumptions_block(self) -> Block:
        lines = list(self.content.assumptions)

        def measure(width: float) -> float:
            return self.heading_height() + self.lines_height(lines, width, 6.2, bullet=True)

        def draw(rect: QRectF) -> None:
            top = rect.top() + self.heading(rect, "Key assumptions")
            self.lines(QRectF(rect.left(), top, rect.width(), rect.bottom() - top), lines, 6.2, bullet=True)

        return Block(measure, draw)

    # ------------------------------------------------------------ caution and title block

    def caution_block(self) -> Block:
        paper = self.paper
        text = "Caution — " + self.content.caution
        font = paper.font(7.0, bold=True, scaled=False)
        pad = paper.mm(1.6)

        def measure(width: float) -> float:
            return paper.text_height(text, font, width - 2 * pad) + 2 * pad

        def draw(rect: QRectF) -> None:
            paper.fill(rect, CAUTION_FILL)
            paper.frame(rect, CAUTION_EDGE, 0.35)
            paper.text(rect.adjusted(pad, pad, -pad, -pad), text, font, INK, ALIGN_LEFT | WRAP)

        return Block(measure, draw)

    def draw_title_block(self, rect: QRectF) -> None:
        paper = self.paper
        title = self.content.title
        painter = paper.painter
        painter.setPen(paper.pen(INK, 0.5))
        painter.setBrush(Qt.BrushStyle.NoBrush)
        painter.drawRect(rect)
        mark_w = paper.mm(40)
        fields_w = paper.mm(92)
        project_w = rect.width() - mark_w - fields_w
        x = rect.left()
        pad = paper.mm(1.8)

        mark = QRectF(x, rect.top(), mark_w, rect.height())
        paper.fill(mark.adjusted(paper.mm(0.25), paper.mm(0.25), 0, -paper.mm(0.25)), QColor("#1d232a"))
        word = paper.font(15, bold=True, scaled=False)
        word.setLetterSpacing(word.SpacingType.PercentageSpacing, 112)
        paper.text(QRectF(x + pad, rect.top() + pad, mark_w - 2 * pad, paper.mm(8)), "POISE", word,
                   QColor("#ffffff"), ALIGN_LEFT)
        paper.text(QRectF(x + pad, rect.top() + paper.mm(10), mark_w - 2 * pad, paper.mm(9)),
                   "Lateral layout sheet\nconcept stage · sheet 1 of 1", paper.font(6.0, scaled=False),
                   QColor("#d5dbe0"), ALIGN_LEFT | WRAP)
        x += mark_w
        painter.setPen(paper.pen(INK, 0.3))
        painter.drawLine(QPointF(x, rect.top()), QPointF(x, rect.bottom()))
        project_box = QRectF(x + pad, rect.top() + pad * 0.8, project_w - 2 * pad, rect.height() - 1.6 * pad)
        label = paper.font(5.2, bold=True, scaled=False)
        label_h = paper.line_height(label)
        paper.text(QRectF(project_box.left(), project_box.top(), project_box.width(), label_h), "PROJECT", label, MUTED)
        name_font = paper.font(11.5, bold=True, scaled=False)
        name_h = paper.line_height(name_font)
        while paper.text_width(title.project, name_font) > project_box.width() and name_font.pointSizeF() > 7:
            name_font.setPointSizeF(name_font.pointSizeF() - 0.5)
        paper.text(QRectF(project_box.left(), project_box.top() + label_h, project_box.width(), name_h),
                   paper.elided(title.project, name_font, project_box.width(), MIDDLE), name_font, INK)
        file_font = paper.font(6.2, scaled=False)
        paper.text(QRectF(project_box.left(), project_box.bottom() - paper.line_height(file_font), project_box.width(),
                          paper.line_height(file_font)),
                   paper.elided(f"file  {title.file_name or '(not saved)'}", file_font, project_box.width(), MIDDLE),
                   file_font, MUTED)
        x += project_w
        fields = [
            ("JOB NO.", title.job_number or "–"),
            ("ENGINEER", title.engineer or "–"),
            ("DATE", title.date or "–"),
            ("REVISION", title.revision or "–"),
            ("LEVEL DRAWN", f"{self.content.level} · {self.results.floors[self.content.level - 1].name}"),
            (CODE_LIMITS.upper(), self.content.rule_set or "–"),
        ]
        cell_w, cell_h = fields_w / 3, rect.height() / 2
        value_font = paper.font(7.6, scaled=False)
        for i, (name, value) in enumerate(fields):
            cx = x + (i % 3) * cell_w
            cy = rect.top() + (i // 3) * cell_h
            painter.setPen(paper.pen(INK, 0.2))
            painter.setBrush(Qt.BrushStyle.NoBrush)
            painter.drawRect(QRectF(cx, cy, cell_w, cell_h))
            paper.text(QRectF(cx + pad, cy + pad * 0.6, cell_w - 2 * pad, label_h), name, label, MUTED)
            paper.text(QRectF(cx + pad, cy + pad * 0.6 + label_h, cell_w - 2 * pad, cell_h - label_h - pad),
                       paper.elided(value, value_font, cell_w - 2 * pad, MIDDLE), value_font, INK)


def _signed(value: float) -> str:
    """A length with its sign, two decimals, never "-0.00"."""
    return f"{round(value, 2) + 0.0:+.2f}"


def _ranges(numbers: tuple[int, ...]) -> str:
    """1, 2, 3, 5 → "1–3, 5"."""
    parts: list[str] = []
    start = previous = numbers[0]
    for n in (*numbers[1:], None):
        if n is not None and n == previous + 1:
            previous = n
            continue
        parts.append(f"{start}–{previous}" if previous > start else f"{start}")
        if n is not None:
            start = previous = n
    return ", ".join(parts)


def _column_header(column: ChecksColumn) -> str:
    name = column.label + (f", {column.direction}" if column.direction else "")
    shown = judged_figures(column.name, column.limit, column.limit)[1] if column.limit is not None else ""
    limit = f"limit {shown} " if column.limit is not None else ""
    return f"{name}\n{limit}[{', '.join(column.clauses)}]"


# ---------------------------------------------------------------- composition


def _fit(painter: QPainter, project: Project, results: Results, content: SheetContent,
         fits: Callable[[SheetPainter], bool]) -> SheetPainter:
    """The first font scale, then content trimming, for which ``fits`` holds (see the module doc)."""
    full = dataclasses.replace(content, modes=listed_modes(results.modes))
    for scale in FONT_SCALES:
        sheet = SheetPainter(painter, project, results, full, scale)
        if fits(sheet):
            return sheet
    sheet.content = dataclasses.replace(full, modes=listed_modes(results.modes, 3))
    rows = list(content.rows)
    while not fits(sheet) and rows:
        passing = [r for r in rows if r.storey != content.level
                   and all(c is None or c.status is Status.PASS for c in r.cells)]
        candidates = passing or [r for r in rows if r.storey != content.level] or rows
        drop = min(candidates, key=lambda r: (_severity(r), r.storey))
        rows.remove(drop)
        omitted = tuple(sorted(r.storey for r in content.rows if r not in rows))
        sheet.content = dataclasses.replace(sheet.content, rows=tuple(rows), omitted=omitted)
    return sheet


def _severity(row) -> int:
    return max((STATUS_ORDER[c.status] for c in row.cells if c is not None), default=0)


def render_sheet(
    painter: QPainter,
    page_rect: QRectF,
    project: Project,
    results: Results,
    level: int | None = None,
    *,
    file_name: str = "",
    revision: str = "",
    date: str | None = None,
) -> SheetContent:
    """Paint the sheet into ``page_rect`` (device units of ``painter``); returns what was drawn.

    ``level`` is 1-based (None: the level with the worst torsion ratio). Raises ValueError for a
    level the project does not have.
    """
    content = sheet_content(project, results, level, file_name=file_name, revision=revision, date=date)
    page = QRectF(page_rect)
    probe = Paper(painter)
    gap = probe.mm(GAP_MM)
    title_h = probe.mm(TITLE_MM)
    body_bottom = page.bottom() - title_h - gap
    if page.width() > page.height():
        sheet = _landscape(painter, project, results, content, page, body_bottom, gap)
    else:
        sheet = _portrait(painter, project, results, content, page, body_bottom, gap)
    sheet.draw_title_block(QRectF(page.left(), page.bottom() - title_h, page.width(), title_h))
    return sheet.content


def _portrait(painter: QPainter, project: Project, results: Results, content: SheetContent, page: QRectF,
              body_bottom: float, gap: float) -> SheetPainter:
    width = page.width()
    split = width * 0.54

    def middle_height(sheet: SheetPainter) -> float:
        return max(sheet.modes_block().measure(split), sheet.assumptions_block().measure(width - split - gap))

    def band(sheet: SheetPainter) -> float:
        return (body_bottom - page.top() - sheet.caution_block().measure(width) - sheet.checks_block().measure(width)
                - middle_height(sheet) - 3 * gap)

    sheet = _fit(painter, project, results, content, lambda s: band(s) >= s.paper.mm(MIN_PLAN_MM))
    plan_h = band(sheet)
    sketch_w = width * 0.33
    plan_w = width - sketch_w - gap
    y = page.top()
    sheet.draw_plan_panel(QRectF(page.left(), y, plan_w, plan_h))
    sheet.draw_sketches(QRectF(page.left() + plan_w + gap, y, sketch_w, plan_h), across=False)
    y += plan_h + gap
    mid = middle_height(sheet)
    sheet.modes_block().draw(QRectF(page.left(), y, split, mid))
    sheet.assumptions_block().draw(QRectF(page.left() + split + gap, y, width - split - gap, mid))
    y += mid + gap
    checks = sheet.checks_block()
    checks.draw(QRectF(page.left(), y, width, checks.measure(width)))
    caution = sheet.caution_block()
    c_h = caution.measure(width)
    caution.draw(QRectF(page.left(), body_bottom - c_h, width, c_h))
    return sheet


def _landscape(painter: QPainter, project: Project, results: Results, content: SheetContent, page: QRectF,
               body_bottom: float, gap: float) -> SheetPainter:
    """Left: plan, assumptions, caution. Right: sketches in a row, modes, checks with their notes."""
    left_w = page.width() * 0.42
    right_w = page.width() - left_w - gap
    x = page.left() + left_w + gap
    body = body_bottom - page.top()

    def plan_height(sheet: SheetPainter) -> float:
        return body - sheet.assumptions_block().measure(left_w) - sheet.caution_block().measure(left_w) - 2 * gap

    def sketch_height(sheet: SheetPainter) -> float:
        return body - sheet.modes_block().measure(right_w) - sheet.checks_block().measure(right_w) - 2 * gap

    def fits(sheet: SheetPainter) -> bool:
        paper = sheet.paper
        return plan_height(sheet) >= paper.mm(MIN_PLAN_MM) and sketch_height(sheet) >= paper.mm(MIN_SKETCH_MM)

    sheet = _fit(painter, project, results, content, fits)
    plan_h, sketch_h = plan_height(sheet), sketch_height(sheet)
    y = page.top()
    sheet.draw_plan_panel(QRectF(page.left(), y, left_w, plan_h))
    assumptions = sheet.assumptions_block()
    a_h = assumptions.measure(left_w)
    assumptions.draw(QRectF(page.left(), y + plan_h + gap, left_w, a_h))
    caution = sheet.caution_block()
    c_h = caution.measure(left_w)
    caution.draw(QRectF(page.left(), body_bottom - c_h, left_w, c_h))
    sheet.draw_sketches(QRectF(x, y, right_w, sketch_h), across=True)
    y += sketch_h + gap
    modes, checks = sheet.modes_block(), sheet.checks_block()
    m_h = modes.measure(right_w)
    modes.draw(QRectF(x, y, right_w, m_h))
    y += m_h + gap
    checks.draw(QRectF(x, y, right_w, checks.measure(right_w)))
    return sheet
