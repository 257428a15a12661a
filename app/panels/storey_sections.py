"""The per-storey section table of the properties panel: one row per storey, or one for all.

"Same for all storeys" (the default) shows one row that sets the element's own section; turned
off, each storey it spans gets a row, top storey first as in an elevation, each starting as a copy
of the section it had. Steel shapes are chosen from the generic catalogue (or typed, ``SHS 150×8``)
and set their figures; typing a figure clears the shape. Edits go through the model's validation:
a refused value turns its cell red, the message shows under the table and the project is unchanged.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Callable, Sequence
from typing import Any

from PySide6.QtGui import QColor
from PySide6.QtWidgets import (
    QAbstractItemView,
    QCheckBox,
    QComboBox,
    QHeaderView,
    QLabel,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app.kinds import app_kind
from app.panels.fields import StoreyColumn, short_message
from core.errors import ModelError
from core.model import Element, Project, kind_spec
from core.model.kinds import same_for_all, split_by_storey, storey_value_type
from core.model.sections import CATALOGUE

REFUSED = QColor("#fff3f3")
TYPED = "(typed)"
"""The shape choice that means "no shape: the figures are typed"."""


def _storey_name(project: Project, element: Element, storey: int) -> str:
    """Row label of the element's ``storey`` (0 = its lowest): the floor on top of it."""
    return project.levels[element.bottom + storey].name


class StoreySectionTable(QWidget):
    """The sections of the selected elements (of one kind) storey by storey."""

    def __init__(self, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.same = QCheckBox("Same for all storeys")
        self.same.setToolTip("Off: each storey the element spans gets its own section.")
        self.same.toggled.connect(self._same_toggled)
        self.table = QTableWidget()
        self.table.setSelectionMode(QAbstractItemView.SelectionMode.NoSelection)
        self.table.verticalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        self.table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        self.table.itemChanged.connect(self._typed)
        self.error = QLabel()
        self.error.setWordWrap(True)
        self.error.setStyleSheet("color: #c62828; font-size: 8pt;")
        self.error.hide()
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 2, 4, 2)
        layout.setSpacing(2)
        layout.addWidget(QLabel("<b>Sections by storey</b>"))
        layout.addWidget(self.same)
        layout.addWidget(self.table)
        layout.addWidget(self.error)
        self.apply: Callable[[list[Element]], str | None] = lambda changed: "nothing to edit"
        self._elements: list[Element] = []
        self._columns: tuple[StoreyColumn, ...] = ()
        self._per_storey = False
        self._filling = False

    # ------------------------------------------------------------------ showing

    def show_elements(self, project: Project, elements: Sequence[Element]) -> bool:
        """Show the table for ``elements``; False (and hidden) when it has nothing to show: no
        elements, mixed kinds, or a kind without per-storey sections."""
        kinds = {e.kind for e in elements}
        columns = app_kind(next(iter(kinds))).storey_columns if len(kinds) == 1 else ()
        if not columns:
            self.hide()
            self._elements = []
            return False
        self._elements, self._columns = list(elements), columns
        spans = {(e.bottom, e.top) for e in elements}
        name = kind_spec(elements[0].kind).storey_values
        given = [bool(getattr(e.properties, name)) for e in elements] if name else [False]
        bare_values = storey_value_type(elements[0].kind) is float
        self._per_storey = bare_values or all(given)
        self._filling = True
        self.same.setVisible(not bare_values)
        self.same.setChecked(not self._per_storey)
        self.same.setEnabled(len(spans) == 1 or self._per_storey)
        self.same.setToolTip(
            "Off: each storey the element spans gets its own section."
            if len(spans) == 1
            else "The selected elements span different storeys: select one to give it sections by storey."
        )
        self._fill(project, len(spans) == 1)
        self._filling = False
        self.error.hide()
        self.show()
        return True

    def _fill(self, project: Project, one_span: bool) -> None:
        first = self._elements[0]
        storeys = first.storey_count if self._per_storey and one_span else 1
        self.table.clear()
        self.table.setColumnCount(len(self._columns))
        self.table.setHorizontalHeaderLabels([c.title for c in self._columns])
        for c, column in enumerate(self._columns):
            header = self.table.horizontalHeaderItem(c)
            if header is not None and column.tip:
                header.setToolTip(column.tip)
        self.table.setRowCount(storeys)
        labels = []
        for row in range(storeys):
            storey = storeys - 1 - row  # top storey first
            labels.append(_storey_name(project, first, storey) if self._per_storey and one_span else "All storeys")
            for c, column in enumerate(self._columns):
                values = [self._read(e, storey, column) for e in self._elements]
                value = values[0] if all(v == values[0] for v in values) else None
                if column.quantity is None:
                    self._shape_cell(row, c, value)
                else:
                    text = "" if value is None else column.quantity.show(float(value))
                    item = QTableWidgetItem(text)
                    shape = StoreyColumn(column.shape, column.shape)
                    shaped = bool(column.shape) and any(self._read(e, storey, shape) for e in self._elements)
                    item.setToolTip("Set by the shape; typing a value clears the shape." if shaped else column.tip)
                    if shaped:
                        item.setForeground(QColor("#555555"))
                    self.table.setItem(row, c, item)
        self.table.setVerticalHeaderLabels(labels)
        self.table.resizeColumnsToContents()
        self.table.resizeRowsToContents()
        frame = 2 * self.table.frameWidth()
        self.table.setFixedHeight(
            self.table.horizontalHeader().sizeHint().height()
            + sum(self.table.rowHeight(r) for r in range(storeys))
            + self.table.horizontalScrollBar().sizeHint().height()
            + frame
        )

    def _shape_cell(self, row: int, c: int, value: Any) -> None:
        box = QComboBox()
        box.setEditable(True)
        box.addItems([TYPED, *CATALOGUE])
        box.setCurrentText(TYPED if value == "" else (value or ""))
        box.setToolTip("A generic steel shape (area and inertia from its dimensions), or typed figures.")
        box.activated.connect(lambda _index, r=row, col=c, b=box: self._shape_chosen(r, col, b.currentText()))
        line = box.lineEdit()
        if line is not None:
            line.editingFinished.connect(lambda r=row, col=c, b=box: self._shape_chosen(r, col, b.currentText()))
        self.table.setCellWidget(row, c, box)

    @staticmethod
    def _values(element: Element) -> tuple[Any, ...]:
        name = kind_spec(element.kind).storey_values
        return tuple(getattr(element.properties, name)) if name else ()

    def _read(self, element: Element, storey: int, column: StoreyColumn) -> Any:
        values = self._values(element)
        if not column.field:
            return values[storey] if storey < len(values) else None
        source = values[storey] if values and storey < len(values) else element.properties
        return getattr(source, column.field)

    # ------------------------------------------------------------------ editing

    def _same_toggled(self, same: bool) -> None:
        if self._filling:
            return
        try:
            changed = [
                dataclasses.replace(
                    e, properties=same_for_all(e.properties) if same else split_by_storey(e.properties, e.storey_count)
                )
                for e in self._elements
            ]
        except (ModelError, ValueError) as error:
            self._refuse(str(error))
            return
        self._commit(changed)

    def _typed(self, item: QTableWidgetItem) -> None:
        if self._filling:
            return
        column = self._columns[item.column()]
        assert column.quantity is not None
        try:
            value = column.quantity.parse(item.text())
        except ValueError as error:
            self._refuse(f"{column.label}: {error}", item)
            return
        clears = {column.shape: ""} if column.shape else {}
        self._edit(item.row(), column, value, clears, item)

    def _shape_chosen(self, row: int, c: int, text: str) -> None:
        if self._filling:
            return
        column = self._columns[c]
        designation = "" if text.strip() in ("", TYPED) else text.strip()
        if all(self._read(e, self._storey(row), column) == designation for e in self._elements):
            return
        self._edit(row, column, designation, {}, None)

    def _storey(self, row: int) -> int:
        return self.table.rowCount() - 1 - row

    def _edit(self, row: int, column: StoreyColumn, value: Any, clears: dict[str, Any], item: Any) -> None:
        storey = self._storey(row)
        try:
            changed = [self._with_value(e, storey, column, value, clears) for e in self._elements]
        except ModelError as error:
            self._refuse(f"{column.label}: {short_message(error, column.quantity)}", item)
            return
        self._commit(changed)

    def _with_value(
        self, element: Element, storey: int, column: StoreyColumn, value: Any, clears: dict[str, Any]
    ) -> Element:
        props = element.properties
        name = kind_spec(element.kind).storey_values
        values = list(self._values(element))
        if name and values:
            if column.field:
                values[storey] = dataclasses.replace(values[storey], **{column.field: value, **clears})
            else:
                values[storey] = value
            props = dataclasses.replace(props, **{name: tuple(values)})
        else:
            props = dataclasses.replace(props, **{column.field: value, **clears})
        return dataclasses.replace(element, properties=props)

    def _commit(self, changed: list[Element]) -> None:
        problem = self.apply(changed)
        if problem:
            self._refuse(problem)

    def _refuse(self, message: str, item: QTableWidgetItem | None = None) -> None:
        if item is not None:
            self._filling = True
            item.setBackground(REFUSED)
            self._filling = False
        self.error.setText(message)
        self.error.show()

    def column(self, label: str) -> int:
        """The index of the column labelled ``label`` (for tests and focus)."""
        return [c.label for c in self._columns].index(label)

    def error_text(self) -> str:
        """The refusal message under the table ('' if none)."""
        return "" if self.error.isHidden() else self.error.text()
