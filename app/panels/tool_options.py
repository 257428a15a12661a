"""The tool options bar above the plan: the level span of new elements, typed values, grid, snap.

Typed values: while a tool that places points is active, typing a number on the plan moves the
focus here; Tab goes to the second field, Enter places the point, Esc returns to the plan. While
the cursor moves, the fields show the live length and angle (or width and depth) as grey hints.
"""

from __future__ import annotations

from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QKeyEvent
from PySide6.QtWidgets import QComboBox, QDoubleSpinBox, QLabel, QLineEdit, QToolBar, QWidget

from app.canvas.view import PlanView
from app.document import ProjectDocument
from app.tools.base import Tool
from app.tools.place import PlaceElementTool, PlacementRange
from app.units import PLAIN


class TypedField(QLineEdit):
    """A value field that hands Esc back to the plan."""

    escaped = Signal()

    def keyPressEvent(self, event: QKeyEvent) -> None:
        if event.key() == Qt.Key.Key_Escape:
            self.clear()
            self.escaped.emit()
            return
        super().keyPressEvent(event)


class ToolOptions(QToolBar):
    def __init__(
        self, document: ProjectDocument, view: PlanView, placement: PlacementRange, parent: QWidget | None = None
    ):
        super().__init__("Tool options", parent)
        self.setObjectName("toolOptions")
        self.document, self.view, self.placement = document, view, placement
        self.tool: Tool | None = None

        self.span_label = QLabel(" New elements span ")
        self.bottom = QComboBox()
        self.to_label = QLabel(" to ")
        self.top = QComboBox()
        self.bottom.setToolTip("The level new elements stand on (Base = the foundation)")
        self.top.setToolTip("The highest floor new elements reach")
        self.bottom.activated.connect(self._span_chosen)
        self.top.activated.connect(self._span_chosen)
        self._span_actions = [self.addWidget(w) for w in (self.span_label, self.bottom, self.to_label, self.top)]
        self._span_actions.append(self.addSeparator())

        self.labels = [QLabel(), QLabel()]
        self.fields = [TypedField(), TypedField()]
        self.message = QLabel()
        self.message.setStyleSheet("color: #c62828;")
        self._typed_actions = []
        for label, field in zip(self.labels, self.fields, strict=True):
            field.setFixedWidth(80)
            field.returnPressed.connect(self.enter)
            field.textEdited.connect(self.message.clear)
            field.escaped.connect(self._back_to_plan)
            self._typed_actions += [self.addWidget(label), self.addWidget(field)]
        self._typed_actions.append(self.addWidget(self.message))
        self._typed_actions.append(self.addSeparator())

        self.addWidget(QLabel(" Grid "))
        self.grid = QDoubleSpinBox()
        self.grid.setRange(0.05, 50.0)
        self.grid.setDecimals(2)
        self.grid.setSingleStep(0.25)
        self.grid.setSuffix(" m")
        self.grid.setValue(view.grid_spacing)
        self.grid.setToolTip("Grid spacing: the snap step and the arrow-key nudge")
        self.grid.valueChanged.connect(self._grid_changed)
        self.addWidget(self.grid)

        document.project_changed.connect(self._fill_span)
        placement.changed.connect(self._fill_span)
        self._fill_span()
        self.show_tool(None)

    # ------------------------------------------------------------------ span of new elements

    def _fill_span(self) -> None:
        levels = self.document.project.levels
        self.bottom.clear()
        self.top.clear()
        self.bottom.addItem("Base", 0)
        for i, level in enumerate(levels[:-1], start=1):
            self.bottom.addItem(level.name, i)
        for i, level in enumerate(levels, start=1):
            self.top.addItem(level.name, i)
        self.top.addItem("Roof (always the top)", None)
        self.bottom.setCurrentIndex(max(self.bottom.findData(self.placement.bottom), 0))
        index = self.top.findData(self.placement.top) if self.placement.top is not None else self.top.count() - 1
        self.top.setCurrentIndex(index if index >= 0 else self.top.count() - 1)

    def _span_chosen(self) -> None:
        self.placement.set(self.bottom.currentData() or 0, self.top.currentData())

    def _grid_changed(self, value: float) -> None:
        self.view.grid_spacing = value
        self.view.redraw_background()

    # ------------------------------------------------------------------ typed values

    def show_tool(self, tool: Tool | None) -> None:
        if self.tool is not None:
            self.tool.measure_changed.disconnect(self.show_measure)
        self.tool = tool
        if tool is not None:
            tool.measure_changed.connect(self.show_measure)
        for action in self._span_actions:
            action.setVisible(isinstance(tool, PlaceElementTool))
        typed = tool.typed_fields if tool is not None else ()
        for action in self._typed_actions:
            action.setVisible(bool(typed))
        for label, field, text in zip(self.labels, self.fields, (*typed, "", ""), strict=False):
            label.setText(f" {text} ")
            field.clear()
            field.setPlaceholderText("")
        self.message.clear()

    def show_measure(self, values) -> None:
        for field, value in zip(self.fields, values or ("", ""), strict=True):
            field.setPlaceholderText(f"{value:.3f}" if isinstance(value, float) else "")

    def start_typing(self, text: str) -> None:
        """Called when a number is typed on the plan: continue it in the first field."""
        field = self.fields[0]
        field.setFocus()
        field.setText(text)
        self.message.clear()

    def enter(self) -> None:
        """Place from the typed values."""
        if self.tool is None:
            return
        values: list[float | None] = []
        for field in self.fields:
            text = field.text().strip()
            try:
                values.append(PLAIN.parse(text) if text else None)
            except ValueError as error:
                self.message.setText(f" {error}")
                return
        problem = self.tool.enter_typed(tuple(values))
        if problem:
            self.message.setText(f" {problem}")
            return
        for field in self.fields:
            field.clear()
        self.message.clear()
        self._back_to_plan()

    def _back_to_plan(self) -> None:
        self.view.setFocus()
