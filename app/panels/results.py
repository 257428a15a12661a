"""Results: the live readouts beside the plan and the tables below it.

The readouts answer at a glance whether the building twists: the worst torsion ratio in each
direction, the first three periods with what each mode does, and one pass/warn/fail line per
check. The tables list modes, storeys and element shares; clicking a row shows that level,
element or mode, and any table copies to the clipboard as tab-separated text.
"""

from __future__ import annotations

import html
import math

from PySide6.QtCore import QAbstractTableModel, QModelIndex, QPersistentModelIndex, Qt, Signal
from PySide6.QtGui import QAction, QGuiApplication, QKeySequence
from PySide6.QtWidgets import (
    QAbstractItemView,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QPushButton,
    QScrollArea,
    QTableView,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from app.document import ProjectDocument
from app.panels.verdicts import STATUS_WORDS, check_summaries, colour_of
from core.lateral_results import TORSION_RATIO
from core.results import Mode, ModeKind, Results

CAUTION = (
    "Concept-stage estimate from a rigid-floor model (elements stiff in their own plane only). "
    "Verify with a full analysis, follow the governing local code, and defer to a licensed engineer."
)

MODE_WORDS = {ModeKind.X: "x", ModeKind.Y: "y", ModeKind.TORSION: "torsion", ModeKind.MIXED: "mixed"}


def mode_type(mode: Mode) -> str:
    """``y`` or ``mixed (x 52 %, θ 41 %)``: what the mode does."""
    if mode.kind is not ModeKind.MIXED:
        return MODE_WORDS[mode.kind]
    parts = [f"{name} {100 * share:.0f} %" for name, share in zip(("x", "y", "θ"), mode.shares, strict=True) if share >= 0.1]
    return f"mixed ({', '.join(parts)})"


def _fmt(value: float, digits: int = 3) -> str:
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "—"
    if math.isinf(value):
        return "∞"
    return f"{value:.{digits}f}"


# ------------------------------------------------------------------ table contents


def modes_table(results: Results) -> tuple[list[str], list[list[str]]]:
    headers = ["Mode", "T, s", "f, Hz", "Type", "Mx %", "My %", "Mθ %", "ΣMx %", "ΣMy %", "ΣMθ %"]
    rows = [
        [str(m.number), _fmt(m.period), _fmt(m.frequency), mode_type(m)]
        + [f"{100 * v:.1f}" for v in m.mass_ratio]
        + [f"{100 * v:.1f}" for v in m.cumulative]
        for m in results.modes
    ]
    return headers, rows


def storeys_table(results: Results) -> tuple[list[str], list[list[str]]]:
    headers = [
        "Storey", "Level", "h, m", "CM x", "CM y", "CR x", "CR y", "e0x", "e0y", "r_x", "r_y", "l_s",
        "e0x/r_x", "e0y/r_y", "r_x/l_s", "r_y/l_s", "TR x", "TR y", "drift x %", "drift y %",
    ]
    rows = []
    for s in results.lateral.storeys:
        cr = s.rigidity_centre
        rows.append(
            [str(s.storey), s.name, _fmt(s.height, 2), _fmt(s.mass_centre[0], 2), _fmt(s.mass_centre[1], 2),
             _fmt(cr[0], 2) if cr else "—", _fmt(cr[1], 2) if cr else "—",
             _fmt(s.eccentricity[0], 2), _fmt(s.eccentricity[1], 2),
             _fmt(s.torsional_radius[0], 2), _fmt(s.torsional_radius[1], 2), _fmt(s.radius_of_gyration, 2),
             _fmt(s.eccentricity_ratio[0]), _fmt(s.eccentricity_ratio[1]),
             _fmt(s.radius_ratio[0]), _fmt(s.radius_ratio[1]),
             _fmt(s.torsion_ratio[0]), _fmt(s.torsion_ratio[1]),
             _fmt(100 * s.drift_ratio[0], 3), _fmt(100 * s.drift_ratio[1], 3)]
        )
    return headers, rows


def elements_table(results: Results) -> tuple[list[str], list[list[str]]]:
    headers = ["Element", "Storey", "Shear, kN", "Share %", "Largest brace force, kN", "Base moment, kN·m"]
    rows = []
    for d in results.lateral.elements:
        for k, storey in enumerate(d.storeys):
            braces = d.brace_force_envelope[k] if d.brace_force_envelope.shape[1] else ()
            rows.append(
                [d.element, str(storey), _fmt(float(d.shear_envelope[k]), 1), _fmt(100 * float(d.share_envelope[k]), 1),
                 _fmt(float(max(braces)), 1) if len(braces) else "—",
                 _fmt(d.base_moment_envelope, 0) if k == 0 and d.base_moment_envelope else ""]
            )
    return headers, rows


class RowsModel(QAbstractTableModel):
    """A read-only table of strings."""

    def __init__(self) -> None:
        super().__init__()
        self.headers: list[str] = []
        self.rows: list[list[str]] = []

    def set_rows(self, headers: list[str], rows: list[list[str]]) -> None:
        self.beginResetModel()
        self.headers, self.rows = headers, rows
        self.endResetModel()

    def rowCount(self, parent: QModelIndex | QPersistentModelIndex = QModelIndex()) -> int:
        return 0 if parent.isValid() else len(self.rows)

    def columnCount(self, parent: QModelIndex | QPersistentModelIndex = QModelIndex()) -> int:
        return 0 if parent.isValid() else len(self.headers)

    def data(self, index, role=Qt.ItemDataRole.DisplayRole):
        if role == Qt.ItemDataRole.DisplayRole:
            return self.rows[index.row()][index.column()]
        if role == Qt.ItemDataRole.TextAlignmentRole:
            text = self.rows[index.row()][index.column()]
            numeric = text[:1].isdigit() or text[:1] in "-—∞"
            return int((Qt.AlignmentFlag.AlignRight if numeric else Qt.AlignmentFlag.AlignLeft) | Qt.AlignmentFlag.AlignVCenter)
        return None

    def headerData(self, section, orientation, role=Qt.ItemDataRole.DisplayRole):
        if role == Qt.ItemDataRole.DisplayRole and orientation == Qt.Orientation.Horizontal:
            return self.headers[section]
        return None

    def tsv(self, rows: list[int] | None = None) -> str:
        """The header and the given rows (default all) as tab-separated text."""
        chosen = self.rows if rows is None else [self.rows[i] for i in rows]
        return "\n".join("\t".join(r) for r in [self.headers, *chosen]) + "\n"


class ResultsTable(QTableView):
    row_clicked = Signal(int)

    def __init__(self, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.rows_model = RowsModel()
        self.setModel(self.rows_model)
        self.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.setAlternatingRowColors(True)
        self.verticalHeader().hide()
        self.verticalHeader().setDefaultSectionSize(20)
        self.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        self.clicked.connect(lambda index: self.row_clicked.emit(index.row()))
        copy = QAction("Copy as tab-separated text", self)
        copy.setShortcut(QKeySequence.StandardKey.Copy)
        copy.setShortcutContext(Qt.ShortcutContext.WidgetShortcut)
        copy.triggered.connect(self.copy)
        self.addAction(copy)
        self.setContextMenuPolicy(Qt.ContextMenuPolicy.ActionsContextMenu)

    def copy(self) -> str:
        """Copy the selected rows (all rows if none) to the clipboard; returns the text."""
        selected = sorted({i.row() for i in self.selectionModel().selectedRows()}) or None
        text = self.rows_model.tsv(selected)
        QGuiApplication.clipboard().setText(text)
        return text


class TablesPanel(QWidget):
    """Tabs of modes, storeys and element shares, kept up to date with the results."""

    def __init__(self, document: ProjectDocument, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.document = document
        self.tabs = QTabWidget()
        self.modes, self.storeys, self.elements = ResultsTable(), ResultsTable(), ResultsTable()
        self.tabs.addTab(self.storeys, "Storeys")
        self.tabs.addTab(self.modes, "Modes")
        self.tabs.addTab(self.elements, "Element shares")
        copy = QPushButton("Copy table")
        copy.setToolTip("Copy the selected rows (or the whole table) as tab-separated text")
        copy.clicked.connect(lambda: self.tabs.currentWidget().copy())
        self.note = QLabel(CAUTION)
        self.note.setWordWrap(True)
        self.note.setStyleSheet("color: #6d695f; font-size: 8pt;")
        bar = QHBoxLayout()
        bar.addWidget(self.note, 1)
        bar.addWidget(copy)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(2, 2, 2, 2)
        layout.addWidget(self.tabs, 1)
        layout.addLayout(bar)
        self.modes.row_clicked.connect(lambda row: document.select_mode(row + 1))
        self.storeys.row_clicked.connect(lambda row: document.set_current_level(row + 1))
        self.elements.row_clicked.connect(self._element_clicked)
        document.results_changed.connect(self.refresh)
        self.refresh()

    def refresh(self) -> None:
        results = self.document.results
        for table, contents in (
            (self.modes, modes_table),
            (self.storeys, storeys_table),
            (self.elements, elements_table),
        ):
            table.rows_model.set_rows(*(contents(results) if results is not None else ([], [])))

    def _element_clicked(self, row: int) -> None:
        element_id, storey = self.elements.rows_model.rows[row][:2]
        self.document.set_current_level(int(storey))
        self.document.select([element_id])


class ReadoutsPanel(QWidget):
    """The live readouts: caution, torsion ratios, periods and one line per check."""

    def __init__(self, document: ProjectDocument, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.document = document
        self.caution = QLabel(CAUTION)
        self.caution.setWordWrap(True)
        self.caution.setObjectName("caution")
        self.caution.setStyleSheet(
            "background: #fff6e0; border: 1px solid #e2c27a; border-radius: 3px; padding: 4px; font-size: 8pt;"
        )
        self.torsion = QLabel()
        self.periods = QLabel()
        self.checks = QLabel()
        for label in (self.torsion, self.periods, self.checks):
            label.setWordWrap(True)
            label.setTextFormat(Qt.TextFormat.RichText)
            label.setAlignment(Qt.AlignmentFlag.AlignTop | Qt.AlignmentFlag.AlignLeft)
        body = QWidget()
        column = QVBoxLayout(body)
        column.setContentsMargins(0, 0, 0, 0)
        for label in (self.torsion, self.periods, self.checks):
            column.addWidget(label)
        column.addStretch(1)
        scroll = QScrollArea()
        scroll.setWidgetResizable(True)
        scroll.setFrameShape(QScrollArea.Shape.NoFrame)
        scroll.setWidget(body)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        layout.addWidget(self.caution)
        layout.addWidget(scroll, 1)
        document.results_changed.connect(self.refresh)
        self.refresh()

    def torsion_values(self) -> tuple[float, float] | None:
        """(worst x, worst y) torsion ratio shown, or None when no results are shown."""
        results = self.document.results
        if results is None:
            return None
        return results.lateral.worst_torsion_ratio("x"), results.lateral.worst_torsion_ratio("y")

    def refresh(self) -> None:
        document = self.document
        results = document.results
        if results is None:
            message = document.error.message if document.error else "Analysing…"
            if document.error and document.shown_project.levels:
                self.torsion.setText(
                    f"<p style='color:#b3122e'><b>Cannot analyse this layout.</b><br>{html.escape(message)}</p>"
                )
            else:
                self.torsion.setText(f"<p>{html.escape(message)}</p>")
            self.periods.setText("")
            self.checks.setText("")
            return
        lateral = results.lateral
        verdicts = [v for v in lateral.verdicts if v.name == TORSION_RATIO]
        cells = []
        for d in ("x", "y"):
            storey_values = [s.torsion_ratio[0 if d == "x" else 1] for s in lateral.storeys]
            worst_value = max(storey_values)
            storey = lateral.storeys[storey_values.index(worst_value)].name
            judged = [v for v in verdicts if v.direction == d]
            status = max(judged, key=lambda v: v.value).status if judged else None
            colour = colour_of(status).name()
            word = STATUS_WORDS[status] if status else "not judged by EN 1998-1 limits"
            cells.append(
                f"<td style='padding-right:14px'>load in {d}: <span style='font-size:15pt; color:{colour}'>"
                f"<b>{_fmt(worst_value, 2)}</b></span><br><small>{html.escape(storey)} · {word}</small></td>"
            )
        self.torsion.setText(
            "<b>Worst torsion ratio</b> <small>(max end drift / mean, ±5 % eccentricity)</small>"
            f"<table><tr>{''.join(cells)}</tr></table>"
        )
        period_rows = "".join(
            f"<tr><td>T{m.number}</td><td align='right'>&nbsp;{m.period:.3f} s&nbsp;</td><td>{html.escape(mode_type(m))}</td></tr>"
            for m in results.modes[:3]
        )
        self.periods.setText(f"<b>Periods</b><table>{period_rows}</table>")
        lines = []
        for summary in check_summaries(lateral):
            v = summary.worst
            where = []
            if v.storey is not None:
                where.append(f"storey {v.storey}")
            if v.direction:
                where.append(v.direction)
            colour = colour_of(v.status).name()
            detail = f"{_fmt(v.value)} vs {_fmt(v.limit)}" + (f" ({', '.join(where)})" if where else "")
            lines.append(
                f"<tr><td><span style='color:{colour}; font-size:11pt'>●</span></td>"
                f"<td><b style='color:{colour}'>{STATUS_WORDS[v.status]}</b></td>"
                f"<td>{html.escape(summary.name)}<br><small style='color:#6d695f'>{html.escape(detail)} · "
                f"{html.escape(v.clause)}</small></td></tr>"
            )
        state = lateral.status
        self.checks.setText(
            f"<b>Checks</b> <small>({html.escape(lateral.rule_set.upper())} rule set, worst storey shown; "
            f"overall <span style='color:{colour_of(state).name()}'>{STATUS_WORDS[state]}</span>)</small>"
            f"<table cellspacing='2'>{''.join(lines)}</table>"
        )
