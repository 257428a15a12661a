"""A form of model fields that refuses bad values in place.

Each :class:`Row` reads one value from a model object and writes it back by building a new,
validated object. When the model refuses (``ModelError``) the field keeps what was typed, turns
red and shows the model's message under it; the model is unchanged. Numbers are typed in display
units (:mod:`app.units`).
"""

from __future__ import annotations

import re
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from typing import Any

from PySide6.QtCore import Qt, Signal
from PySide6.QtWidgets import QCheckBox, QComboBox, QFormLayout, QLabel, QLineEdit, QVBoxLayout, QWidget

from app.commands import get_path, set_path
from app.units import Quantity
from core.errors import ModelError
from core.model.bounds import OutOfRangeError

MIXED = object()
"""Marks a value that differs between the selected objects."""

ERROR_STYLE = "QLineEdit, QComboBox { border: 1.5px solid #c62828; background: #fff3f3; }"


@dataclass
class Row:
    """One field of the form."""

    label: str
    path: str = ""
    """Dotted path of the value inside the edited object (see app.commands.get_path)."""
    kind: str = "number"
    """number, int, text, choice, check, numbers (comma-separated list) or readonly."""
    quantity: Quantity | None = None
    choices: Sequence[tuple[str, Any]] = ()
    getter: Callable[[Any], Any] | None = None
    setter: Callable[[Any, Any], Any] | None = None
    """Build the new object from the old one and the value (default: set_path)."""
    tip: str = ""

    def read(self, obj: Any) -> Any:
        return self.getter(obj) if self.getter else get_path(obj, self.path)

    def write(self, obj: Any, value: Any) -> Any:
        return self.setter(obj, value) if self.setter else set_path(obj, self.path, value)

    @property
    def title(self) -> str:
        unit = self.quantity.unit if self.quantity and self.quantity.unit else ""
        return f"{self.label}, {unit}" if unit else self.label


@dataclass(frozen=True)
class StoreyColumn:
    """One column of the per-storey section table: a field of a kind's per-storey section."""

    label: str
    field: str
    """The field of the storey section (and of the element's own "same for all" fields); "" when
    the per-storey value is a bare number (a spring's stiffness)."""
    quantity: Quantity | None = None
    """How the number is shown and typed; None for a steel-shape choice."""
    shape: str = ""
    """For a number: the shape field a typed value clears (the shape would set it otherwise)."""
    tip: str = ""

    @property
    def title(self) -> str:
        unit = self.quantity.unit if self.quantity and self.quantity.unit else ""
        return f"{self.label}, {unit}" if unit else self.label


def short_message(error: ModelError, quantity: Quantity | None = None) -> str:
    """The model's message without the echoed internal value (the field shows what was typed),
    with an accepted range restated in the field's display units."""
    if isinstance(error, OutOfRangeError) and quantity is not None:
        bound = error.bound
        low, high = f"{bound.low * quantity.factor:g}", f"{bound.high * quantity.factor:g}"
        return f"must be {bound.describe(low, high, quantity.unit)}"
    return re.sub(r",? got .*$", "", error.message)


class _Editor:
    """Glue between one Row and its widget."""

    def __init__(self, form: FieldForm, row: Row) -> None:
        self.form, self.row = form, row
        self.error = QLabel()
        self.error.setWordWrap(True)
        self.error.setStyleSheet("color: #c62828; font-size: 8pt;")
        self.error.hide()
        kind = row.kind
        if kind == "choice":
            # Values stay on the Python side: a QVariant would turn an enum into a plain str.
            self.choices = [value for _text, value in row.choices]
            self.widget: QWidget = QComboBox()
            self.widget.addItems([text for text, _value in row.choices])
            self.widget.activated.connect(lambda i: self._commit(self.choices[i]) if i >= 0 else None)
        elif kind == "check":
            self.widget = QCheckBox()
            self.widget.clicked.connect(lambda checked: self._commit(bool(checked)))
        elif kind == "readonly":
            self.widget = QLabel()
            self.widget.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        else:
            self.widget = QLineEdit()
            self.widget.editingFinished.connect(self._typed)
            self.widget.returnPressed.connect(self._entered)
        self.widget.setObjectName(f"field:{row.path or row.label}")
        if row.tip:
            self.widget.setToolTip(row.tip)
        self.shown = ""

    # ------------------------------------------------------------------ display

    def format(self, value: Any) -> str:
        if value is MIXED:
            return ""
        q = self.row.quantity
        if self.row.kind == "numbers":
            return ", ".join(q.show(v) if q else f"{v:g}" for v in value)
        if self.row.kind == "number" and q is not None:
            return q.show(value)
        if self.row.kind == "readonly" and q is not None and isinstance(value, float):
            return q.show(value) + (f" {q.unit}" if q.unit else "")
        return str(value)

    def show(self, value: Any) -> None:
        self.clear_error()
        w = self.widget
        if isinstance(w, QComboBox):
            w.setCurrentIndex(self.choices.index(value) if value in self.choices else -1)
        elif isinstance(w, QCheckBox):
            w.setTristate(value is MIXED)
            w.setCheckState(Qt.CheckState.PartiallyChecked if value is MIXED else Qt.CheckState(2 * bool(value)))
        else:
            self.shown = self.format(value)
            w.setText(self.shown)
            if isinstance(w, QLineEdit):
                w.setPlaceholderText("(differs)" if value is MIXED else "")
                w.setCursorPosition(0)

    # ------------------------------------------------------------------ input

    def parse(self, text: str) -> Any:
        kind, q = self.row.kind, self.row.quantity
        if kind == "text":
            return text
        if kind == "int":
            try:
                return int(text.strip())
            except ValueError:
                raise ValueError(f"{text!r} is not a whole number") from None
        if kind == "numbers":
            parts = [p for p in re.split(r"[;\s]+|,\s+", text.strip()) if p]
            return tuple((q or Quantity("")).parse(p) for p in parts)
        return (q or Quantity("")).parse(text)

    def _typed(self) -> None:
        assert isinstance(self.widget, QLineEdit)
        text = self.widget.text()
        if text == self.shown and not self.error.isVisible():
            return
        if not text.strip() and self.widget.placeholderText():
            return  # a mixed value left blank: nothing to change
        try:
            value = self.parse(text)
        except ValueError as error:
            self.set_error(str(error))
            return
        self._commit(value)

    def _entered(self) -> None:
        """Enter: once the value is taken, the keyboard goes back to where the user works (Qt
        sends this before editingFinished, so the value is read here first)."""
        self._typed()
        if not self.error.isVisible():
            self.form.finished.emit()

    def _commit(self, value: Any) -> None:
        problem = self.form.commit(self.row, value)
        if problem is None and self.form.holds(self):
            self.clear_error()  # also when the corrected value equals the model's (no refresh comes)
        if problem:
            self.set_error(problem)
            if isinstance(self.widget, QComboBox | QCheckBox):
                self.form.refresh_row(self)  # a refused choice goes back to the model's value
                self.set_error(problem)

    def set_error(self, text: str) -> None:
        self.error.setText(text)
        self.error.show()
        self.widget.setStyleSheet(ERROR_STYLE)
        self.widget.setProperty("refused", True)

    def clear_error(self) -> None:
        self.error.hide()
        self.error.setText("")
        self.widget.setStyleSheet("")
        self.widget.setProperty("refused", False)


class FieldForm(QWidget):
    """A form of rows over one or more model objects of the same type.

    ``apply(objects_after) -> str | None`` is given the edited objects and returns an error text
    when the edit cannot be taken (it pushes the undo step otherwise).
    """

    edited = Signal()
    finished = Signal()
    """Enter was pressed in a field whose value was taken."""

    def __init__(self, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self._layout = QFormLayout()
        self._layout.setFieldGrowthPolicy(QFormLayout.FieldGrowthPolicy.AllNonFixedFieldsGrow)
        self._layout.setLabelAlignment(Qt.AlignmentFlag.AlignRight)
        self._layout.setContentsMargins(4, 4, 4, 4)
        self._layout.setVerticalSpacing(3)
        outer = QVBoxLayout(self)
        outer.setContentsMargins(0, 0, 0, 0)
        outer.addLayout(self._layout)
        self._editors: list[_Editor] = []
        self._rows_key: tuple = ()
        self.objects: list[Any] = []
        self.apply: Callable[[list[Any]], str | None] = lambda objects: "nothing to edit"

    def set_rows(self, rows: list[Row]) -> None:
        """Show these rows (rebuilt only if they differ from the current ones)."""
        key = tuple((r.label, r.path, r.kind, tuple(r.choices)) for r in rows)
        if key == self._rows_key:
            for editor, row in zip(self._editors, rows, strict=True):
                editor.row = row
            return
        self._rows_key = key
        while self._layout.rowCount():
            self._layout.removeRow(0)
        self._editors = []
        for row in rows:
            editor = _Editor(self, row)
            box = QWidget()
            column = QVBoxLayout(box)
            column.setContentsMargins(0, 0, 0, 0)
            column.setSpacing(1)
            column.addWidget(editor.widget)
            column.addWidget(editor.error)
            self._layout.addRow(row.title, box)
            self._editors.append(editor)

    def holds(self, editor: _Editor) -> bool:
        """Whether ``editor`` is still one of the form's rows (an edit may rebuild them)."""
        return editor in self._editors

    def show_objects(self, objects: list[Any]) -> None:
        self.objects = list(objects)
        for editor in self._editors:
            self.refresh_row(editor)

    def refresh_row(self, editor: _Editor) -> None:
        values = []
        for obj in self.objects:
            try:
                values.append(editor.row.read(obj))
            except (AttributeError, IndexError, KeyError):
                values.append(MIXED)
        value = values[0] if values and all(v == values[0] for v in values) else MIXED
        editor.show(value)

    def commit(self, row: Row, value: Any) -> str | None:
        try:
            changed = [row.write(obj, value) for obj in self.objects]
        except ModelError as error:
            return f"{row.label}: {short_message(error, row.quantity)}"
        problem = self.apply(changed)
        if problem is None:
            self.edited.emit()
        return problem

    def editor(self, label: str) -> QWidget:
        """The widget of the row titled ``label`` (for tests and focus)."""
        for e in self._editors:
            if e.row.label == label:
                return e.widget
        raise KeyError(label)

    def error_text(self, label: str) -> str:
        """The refusal message under the row titled ``label`` ('' if none)."""
        for e in self._editors:
            if e.row.label == label:
                return e.error.text()
        raise KeyError(label)
