"""Results tables below the plan: modes, storeys and element shares.

Clicking a row shows that level, element or mode; any table copies to the clipboard as
tab-separated text. (The live readouts beside the plan are in :mod:`app.panels.readouts`.)
"""

from __future__ import annotations

import math
from collections.abc import Callable

from PySide6.QtCore import QAbstractTableModel, QModelIndex, QPersistentModelIndex, Qt, Signal
from PySide6.QtGui import QAction, QGuiApplication, QKeySequence
from PySide6.QtWidgets import (
    QAbstractItemView,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QPushButton,
    QTableView,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from app.document import ProjectDocument
from app.drag_throttle import DragThrottle
from core.report.figures import MODE_KIND_WORDS
from core.report.summary import CAUTION
from core.results import Mode, ModeKind, Results


def mode_type(mode: Mode) -> str:
    """``y translation`` or ``mixed (x 52 %, θ 41 %)``: what the mode does."""
    if mode.kind is not ModeKind.MIXED:
        return MODE_KIND_WORDS[mode.kind]
    parts = [
        f"{name} {100 * share:.0f} %" for name, share in zip(("x", "y", "θ"), mode.shares, strict=True) if share >= 0.1
    ]
    return f"{MODE_KIND_WORDS[ModeKind.MIXED]} ({', '.join(parts)})"


def fmt_number(value: float | None, digits: int = 3) -> str:
    """``value`` with ``digits`` decimals; — where it does not apply (None), ∞ for infinity."""
    if value is None:
        return "—"
    if math.isinf(value):
        return "∞"
    return f"{value:.{digits}f}"


# ------------------------------------------------------------------ table contents


TableContents = Callable[[Results], tuple[list[str], list[list[str]]]]
"""What a table shows of the results: header and rows."""


def modes_table(results: Results) -> tuple[list[str], list[list[str]]]:
    headers = ["Mode", "T, s", "f, Hz", "Type", "Mx %", "My %", "Mθ %", "ΣMx %", "ΣMy %", "ΣMθ %"]
    rows = [
        [str(m.number), fmt_number(m.period), fmt_number(m.frequency), mode_type(m)]
        + [f"{100 * v:.1f}" for v in m.mass_ratio]
        + [f"{100 * v:.1f}" for v in m.cumulative]
        for m in results.modes
    ]
    return headers, rows


def storeys_table(results: Results) -> tuple[list[str], list[list[str]]]:
    headers = [
        "Storey",
        "Level",
        "h, m",
        "CM x",
        "CM y",
        "CR x",
        "CR y",
        "e0x",
        "e0y",
        "r_x",
        "r_y",
        "l_s",
        "e0x/r_x",
        "e0y/r_y",
        "r_x/l_s",
        "r_y/l_s",
        "δmax/δavg x",
        "δmax/δavg y",
        "design drift x %",
        "design drift y %",
    ]
    rows = []
    for s in results.lateral.storeys:
        cr = s.rigidity_centre
        rows.append(
            [
                str(s.storey),
                s.name,
                fmt_number(s.height, 2),
                fmt_number(s.mass_centre[0], 2),
                fmt_number(s.mass_centre[1], 2),
                fmt_number(cr[0], 2) if cr else "—",
                fmt_number(cr[1], 2) if cr else "—",
                fmt_number(s.eccentricity[0], 2),
                fmt_number(s.eccentricity[1], 2),
                fmt_number(s.torsional_radius[0], 2),
                fmt_number(s.torsional_radius[1], 2),
                fmt_number(s.radius_of_gyration, 2),
                fmt_number(s.eccentricity_ratio[0]),
                fmt_number(s.eccentricity_ratio[1]),
                fmt_number(s.radius_ratio[0]),
                fmt_number(s.radius_ratio[1]),
                fmt_number(s.torsion_ratio[0]),
                fmt_number(s.torsion_ratio[1]),
                fmt_number(100 * s.drift_ratio[0], 2),
                fmt_number(100 * s.drift_ratio[1], 2),
            ]
        )
    return headers, rows


def forces_table(results: Results) -> tuple[list[str], list[list[str]]]:
    """The static storey forces and storey shears of each direction, top floor first, then the
    base shear (the shear of the lowest storey)."""
    lateral = results.lateral
    x, y = lateral.load("x"), lateral.load("y")
    headers = ["Level", "Name", "F x, kN", "F y, kN", "V x, kN", "V y, kN"]
    rows = [
        [str(f.level), f.name, fmt_number(float(x.storey_forces[i]), 1), fmt_number(float(y.storey_forces[i]), 1),
         fmt_number(float(x.storey_shears[i]), 1), fmt_number(float(y.storey_shears[i]), 1)]
        for i, f in reversed(list(enumerate(results.floors)))
    ]
    rows.append(["", "base shear", "", "", fmt_number(x.base_shear, 1), fmt_number(y.base_shear, 1)])
    return headers, rows


TAB_NOTES = {
    "Storeys": "Design drift: the elastic drift times the code's amplification (q_d, or C_d/I_e), over the "
               "storey height; δmax/δavg: the torsion ratio.",
    "Modes": "Mass ratios of each mode and their running sums.",
    "Storey forces": "Static storey forces F and storey shears V of the equivalent lateral load in each "
                     "direction; the last row is the base shear.",
    "Element shares": "Shears and shares are envelopes over the load cases (each the largest of any case), "
                      "so the shares of one storey may sum to more than 100 %.",
}
"""The line above the tables that says what the current tab's figures are."""


def elements_table(results: Results) -> tuple[list[str], list[list[str]]]:
    headers = ["Element", "Storey", "Shear, kN", "Share %", "Largest brace force, kN", "Base moment, kN·m"]
    rows = []
    for d in results.lateral.elements:
        for k, storey in enumerate(d.storeys):
            braces = d.brace_force_envelope[k] if d.brace_force_envelope.shape[1] else ()
            rows.append(
                [
                    d.element,
                    str(storey),
                    fmt_number(float(d.shear_envelope[k]), 1),
                    fmt_number(100 * float(d.share_envelope[k]), 1),
                    fmt_number(float(max(braces)), 1) if len(braces) else "—",
                    fmt_number(d.base_moment_envelope, 0) if k == 0 and d.base_moment_envelope else "",
                ]
            )
    return headers, rows


NO_PARENT = QModelIndex()


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

    def update_rows(self, headers: list[str], rows: list[list[str]]) -> bool:
        """Take new contents; True when the shape changed (columns then need sizing again)."""
        if headers == self.headers and len(rows) == len(self.rows):
            self.rows = rows
            if rows:
                self.dataChanged.emit(self.index(0, 0), self.index(len(rows) - 1, len(headers) - 1))
            return False
        self.set_rows(headers, rows)
        return True

    def rowCount(self, parent: QModelIndex | QPersistentModelIndex = NO_PARENT) -> int:
        return 0 if parent.isValid() else len(self.rows)

    def columnCount(self, parent: QModelIndex | QPersistentModelIndex = NO_PARENT) -> int:
        return 0 if parent.isValid() else len(self.headers)

    def data(self, index, role=Qt.ItemDataRole.DisplayRole):
        if role == Qt.ItemDataRole.DisplayRole:
            return self.rows[index.row()][index.column()]
        if role == Qt.ItemDataRole.TextAlignmentRole:
            text = self.rows[index.row()][index.column()]
            numeric = text[:1].isdigit() or text[:1] in "-—∞"
            return int(
                (Qt.AlignmentFlag.AlignRight if numeric else Qt.AlignmentFlag.AlignLeft) | Qt.AlignmentFlag.AlignVCenter
            )
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
        self.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Interactive)
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


TABLE_REFRESH_MS = 150
"""While a drag is under way the tables follow at most this often (the readouts follow every move)."""


class TablesPanel(QWidget):
    """Tabs of modes, storeys and element shares, kept up to date with the results while shown."""

    def __init__(self, document: ProjectDocument, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.document = document
        self._stale_tabs: set[QWidget] = set()
        """Tabs a drag's preview left behind (filled when shown or when the drag ends)."""
        self.tabs = QTabWidget()
        self.modes, self.storeys, self.elements = ResultsTable(), ResultsTable(), ResultsTable()
        self.forces = ResultsTable()
        self.tabs.addTab(self.storeys, "Storeys")
        self.tabs.addTab(self.modes, "Modes")
        self.tabs.addTab(self.forces, "Storey forces")
        self.tabs.addTab(self.elements, "Element shares")
        self.tab_note = QLabel()
        self.tab_note.setWordWrap(True)
        self.tab_note.setStyleSheet("font-size: 8pt; padding: 1px 4px;")
        self.tabs.currentChanged.connect(self._show_tab_note)
        self._show_tab_note()
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
        layout.addWidget(self.tab_note)
        layout.addWidget(self.tabs, 1)
        layout.addLayout(bar)
        self.modes.row_clicked.connect(lambda row: document.select_mode(row + 1))
        self.storeys.row_clicked.connect(lambda row: document.set_current_level(row + 1))
        self.elements.row_clicked.connect(self._element_clicked)
        self._stale = True
        self._throttle = DragThrottle(document, TABLE_REFRESH_MS, self._follow, self.isVisible, self)
        document.preview_changed.connect(self._drag_ended)
        self.refresh()

    def _drag_ended(self) -> None:
        """The tabs a drag left behind catch up when it ends (its last results are the committed
        project's, so no new results may follow)."""
        if self.document.previewing or not self._stale_tabs:
            return
        if not self.isVisible():
            self._stale = True
            return
        contents = self._contents()
        for table in [t for t in contents if t in self._stale_tabs]:
            self._fill(table, contents[table])
        self._stale_tabs = set()

    def _follow(self) -> None:
        """The results changed: refresh now if shown, else when shown."""
        if self.isVisible():
            self.refresh()
        else:
            self._throttle.cancel()
            self._stale = True

    def showEvent(self, event) -> None:
        super().showEvent(event)
        if self._stale:
            self.refresh()

    def refresh(self) -> None:
        """Every table; during a drag only the tab in front (the others follow when shown or when
        the drag ends: the element shares alone cost a whole drag step on a large building)."""
        self._throttle.cancel()
        self._stale = False
        tables = self._contents()
        if self.document.previewing:
            front = self.tabs.currentWidget()
            self._stale_tabs = {table for table in tables if table is not front}
            tables = {front: tables[front]} if front in tables else {}
        else:
            self._stale_tabs = set()
        for table, contents in tables.items():
            self._fill(table, contents)

    def _contents(self) -> dict[ResultsTable, TableContents]:
        return {
            self.modes: modes_table,
            self.storeys: storeys_table,
            self.forces: forces_table,
            self.elements: elements_table,
        }

    def _fill(self, table: ResultsTable, contents: TableContents) -> None:
        results = self.document.results
        if table.rows_model.update_rows(*(contents(results) if results is not None else ([], []))):
            table.resizeColumnsToContents()

    def _show_tab_note(self, *_: object) -> None:
        self.tab_note.setText(TAB_NOTES.get(self.tabs.tabText(self.tabs.currentIndex()), ""))
        front = self.tabs.currentWidget()
        if front in self._stale_tabs:
            self._stale_tabs.discard(front)
            self._fill(front, self._contents()[front])

    def _element_clicked(self, row: int) -> None:
        element_id, storey = self.elements.rows_model.rows[row][:2]
        self.document.set_current_level(int(storey))
        self.document.select([element_id])
