"""The placement guide: where the selected element should go, and what losing an element costs.

"Map and moves": the measure (chosen here) the building would have with the selected element's
midpoint — or a new element's, of a kind chosen here with its default section, before placing
it — at each point of the plan, painted under the elements with its legend and the limit
contour; an arrow on every element of the level pointing the way a move lowers the measure, and
the elements ranked by how much; the storey's target zone for the centre of rigidity; a suggested
position drawn as a ghost, which Accept moves the element to as one undo step. The map follows
every edit and a drag's previews (at most every ``THROTTLE_MS``) on the worker thread; a newer
state makes an older map stale, so the plan never waits. Arrows, suggestions and rankings follow
committed edits only.

"Switched off": the selected element with and without it, side by side, and the ranking of the
loss of each element.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

from PySide6.QtCore import QRectF, QSize, Qt
from PySide6.QtGui import QPainter
from PySide6.QtWidgets import (
    QCheckBox,
    QComboBox,
    QFormLayout,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QProgressBar,
    QPushButton,
    QScrollArea,
    QTableWidget,
    QTableWidgetItem,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from app.drag_throttle import DragThrottle
from app.guidance.plan_items import GuidanceLayer, GuidanceMarks
from app.guidance.ramp import LEGEND_SIZE, draw_legend, quantity
from app.guidance.worker import GuidanceWorker
from app.kinds import app_kinds
from app.panels.when_shown import WhenShown
from app.units import DRIFT, LENGTH, PERCENT, PLAIN, SECONDS
from core.errors import AnalysisError, ModelError
from core.guidance.gradients import MoveGradient, move_gradients
from core.guidance.measures import Measure
from core.guidance.position_map import DEFAULT_STEPS, PositionMap, position_map, with_candidate
from core.guidance.robustness import Comparison, Loss, compare, loss_ranking
from core.guidance.suggestion import Constraint, Suggestion, suggest
from core.guidance.target_zone import target_zones
from core.lateral.cases import DIRECTIONS
from core.model import Element, Project
from core.model.edits import add_elements, new_element
from core.report.summary import CAUTION

THROTTLE_MS = 150
NEW_LENGTH = 6.0
"""Length of a new element mapped before placing it, m, until the user types another."""
CONSTRAINT_LABELS = {
    Constraint.OUTLINE: "anywhere on its floors",
    Constraint.EDGES: "on an outline edge",
    Constraint.GRID: "on a grid line",
}


class LegendView(QWidget):
    """The map's legend (the same painter as the picture the command line writes)."""

    def __init__(self) -> None:
        super().__init__()
        self.map: PositionMap | None = None
        self.setMinimumSize(QSize(int(LEGEND_SIZE[0]), int(LEGEND_SIZE[1])))

    def set_map(self, pmap: PositionMap | None) -> None:
        self.map = pmap
        self.update()

    def paintEvent(self, event: Any) -> None:
        if self.map is None:
            return
        painter = QPainter(self)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        draw_legend(painter, QRectF(0, 0, self.width(), LEGEND_SIZE[1]), self.map)
        painter.end()


def _table(headers: list[str]) -> QTableWidget:
    table = QTableWidget(0, len(headers))
    table.setHorizontalHeaderLabels(headers)
    table.verticalHeader().setVisible(False)
    table.setEditTriggers(QTableWidget.EditTrigger.NoEditTriggers)
    table.horizontalHeader().setStretchLastSection(True)
    return table


def _fill(table: QTableWidget, rows: list[list[str]]) -> None:
    table.setRowCount(len(rows))
    for r, row in enumerate(rows):
        for c, text in enumerate(row):
            item = QTableWidgetItem(text)
            if c > 0:
                item.setTextAlignment(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
            table.setItem(r, c, item)
    table.resizeColumnsToContents()


class GuidancePanel(QWidget):
    """The placement guide's dock contents; it draws on ``window.scene`` through two items."""

    def __init__(self, window: Any) -> None:
        super().__init__()
        self.window = window
        self.document = window.document
        self.worker = GuidanceWorker(self)
        self.layer, self.marks = GuidanceLayer(), GuidanceMarks()
        window.scene.addItem(self.layer)
        window.scene.addItem(self.marks)
        self.map: PositionMap | None = None
        self.gradients: list[MoveGradient] = []
        self.suggestion: Suggestion | None = None
        self._suggested_for: Project | None = None
        self._new: Element | None = None
        """The new element a suggestion places (None: it moves the selected one)."""
        self._build()
        self._shown = WhenShown(self, self.refresh)
        self._throttle = DragThrottle(self.document, THROTTLE_MS, self._shown.request, self.isVisible, self)
        self.document.selection_changed.connect(self._shown.request)
        self.document.current_level_changed.connect(self._redraw)
        self.worker.done.connect(self._done)
        self.worker.progress.connect(self._progress)
        self.worker.failed.connect(self._failed)

    # ------------------------------------------------------------------ layout

    def _build(self) -> None:
        tabs = QTabWidget()
        for page, title in ((self._map_tab(), "Map and moves"), (self._off_tab(), "Switched off")):
            scroll = QScrollArea()
            scroll.setWidget(page)
            scroll.setWidgetResizable(True)
            scroll.setFrameShape(QScrollArea.Shape.NoFrame)
            tabs.addTab(scroll, title)
        caution = QLabel(CAUTION)
        caution.setWordWrap(True)
        caution.setStyleSheet("color: #6b5200;")
        layout = QVBoxLayout(self)
        layout.addWidget(tabs)
        layout.addWidget(caution)

    def _map_tab(self) -> QWidget:
        page = QWidget()
        self.target = QLabel("Select one element to see where it could go.")
        self.target.setWordWrap(True)
        self.subject = QComboBox()
        self.subject.addItem("the selected element", None)
        for spec in app_kinds():
            self.subject.addItem(f"a new {spec.label.lower()}", spec.kind)
        self.subject.currentIndexChanged.connect(self.refresh)
        self.new_length = QLineEdit(LENGTH.show(NEW_LENGTH))
        self.new_length.editingFinished.connect(self.refresh)
        self.new_along = QComboBox()
        self.new_along.addItems(["along x", "along y"])
        self.new_along.currentIndexChanged.connect(self.refresh)
        self.measure = QComboBox()
        for m in Measure:
            self.measure.addItem(m.label, m)
        self.measure.currentIndexChanged.connect(self.refresh)
        self.show_map = QCheckBox("Map")
        self.show_map.setChecked(True)
        self.show_arrows = QCheckBox("Move arrows")
        self.show_arrows.setChecked(True)
        self.show_zone = QCheckBox("Target zone")
        self.show_zone.setChecked(True)
        for box in (self.show_map, self.show_arrows, self.show_zone):
            box.toggled.connect(self.refresh)
        switches = QHBoxLayout()
        for box in (self.show_map, self.show_arrows, self.show_zone):
            switches.addWidget(box)
        self.progress = QProgressBar()
        self.progress.setRange(0, 100)
        self.progress.setFormat("%p %")
        self.legend = LegendView()
        self.legend.setFixedHeight(int(LEGEND_SIZE[1]))
        self.constraint = QComboBox()
        for c, text in CONSTRAINT_LABELS.items():
            self.constraint.addItem(text, c)
        self.suggest_button = QPushButton("Suggest a position")
        self.suggest_button.clicked.connect(self.request_suggestion)
        self.accept_button = QPushButton("Accept")
        self.accept_button.setEnabled(False)
        self.accept_button.clicked.connect(self.accept_suggestion)
        self.suggestion_text = QLabel("")
        self.suggestion_text.setWordWrap(True)
        buttons = QHBoxLayout()
        buttons.addWidget(self.suggest_button)
        buttons.addWidget(self.accept_button)
        self.moves = _table(["element", "d(torsion ratio)", "d(measure)", "best move"])
        self.moves_note = QLabel("")
        self.moves_note.setWordWrap(True)
        form = QFormLayout()
        form.addRow("Map for", self.subject)
        form.addRow(f"New element's length, {LENGTH.unit}", self.new_length)
        form.addRow("New element runs", self.new_along)
        form.addRow("Measure", self.measure)
        form.addRow("Place", self.constraint)
        layout = QVBoxLayout(page)
        layout.addWidget(self.target)
        layout.addLayout(form)
        layout.addLayout(switches)
        layout.addWidget(self.progress)
        layout.addWidget(self.legend)
        layout.addLayout(buttons)
        layout.addWidget(self.suggestion_text)
        layout.addWidget(QLabel("Moves that help most (per metre of move, along the element's normal)"))
        layout.addWidget(self.moves)
        layout.addWidget(self.moves_note)
        return page

    def _off_tab(self) -> QWidget:
        page = QWidget()
        self.compare_note = QLabel("Select one element to compare the layout with and without it.")
        self.compare_note.setWordWrap(True)
        self.comparison = _table(["", "with", "without"])
        self.loss_button = QPushButton("Rank the loss of each element")
        self.loss_button.clicked.connect(self.request_losses)
        self.losses = _table(["element", "worst torsion ratio", "worst drift ratio", "worse by"])
        layout = QVBoxLayout(page)
        layout.addWidget(self.compare_note)
        layout.addWidget(self.comparison)
        layout.addWidget(self.loss_button)
        layout.addWidget(self.losses)
        return page

    # ------------------------------------------------------------------ state

    def chosen_measure(self) -> Measure:
        return Measure(self.measure.currentData())  # Qt hands the enum back as its text

    def candidate(self) -> tuple[Project, Element] | None:
        """The shown layout with a new element of the chosen kind (its default section, over every
        level, of the chosen length and direction) where it fits, if a new element is chosen."""
        kind = self.subject.currentData()
        project = self.document.shown_project
        if kind is None or not project.levels:
            return None
        try:
            length = LENGTH.parse(self.new_length.text())
        except ValueError:
            length = NEW_LENGTH
        length = max(length, 0.1)
        end = (length, 0.0) if self.new_along.currentIndex() == 0 else (0.0, length)
        element = new_element(project, kind, (0.0, 0.0), end, 0, len(project.levels))
        try:
            placed = with_candidate(project, element)
        except (AnalysisError, ModelError):
            return None
        return placed, placed.elements[-1]

    def selected(self) -> Element | None:
        """The one selected active element of the shown layout, if exactly one is selected."""
        ids = self.document.selection
        if len(ids) != 1:
            return None
        try:
            return self.document.shown_project.element(ids[0])
        except KeyError:
            return None

    def refresh(self) -> None:
        """Bring the guidance up to the shown layout: a new map job, and on committed states the
        arrows, the comparison and the zone."""
        self._throttle.cancel()
        shown = self.document.shown_project
        candidate = self.candidate()
        project, element = candidate if candidate is not None else (shown, self.selected())
        measure = self.chosen_measure()
        if self._suggested_for is not shown:
            self._drop_suggestion()
        stands = self.document.results is not None and self.document.analysed_project is shown
        if element is None or not element.active:
            self.worker.cancel("map")
            self.map = None
            self.target.setText("Switched off: switch it on to map where it could go." if element is not None
                                else "Select one element to see where it could go.")
        elif self.show_map.isChecked() and stands:
            self.target.setText(f"Where {element.id} could stand: {measure.label}.")
            self.worker.submit("map", lambda s, p, q: position_map(project, element.id, measure, DEFAULT_STEPS,
                                                                    s, p, q))
            if candidate is not None:
                self.target.setText(f"Where a new {element.id} could stand: {measure.label}.")
        elif not stands:
            self.worker.cancel("map")
            self.target.setText("The layout does not stand: no map until it does.")
        if not self.show_map.isChecked():
            self.map = None
        if not self.document.previewing and stands:
            if self.show_arrows.isChecked():
                self.worker.submit("moves", lambda s, p, q: move_gradients(shown, measure, session=s, stop=q))
            if element is not None and candidate is None:
                self.worker.submit("compare", lambda s, p, q: compare(project, element.id, s))
        if not self.show_arrows.isChecked():
            self.gradients = []
        self._redraw()

    def _redraw(self, *_: object) -> None:
        project = self.document.shown_project
        number = self.document.current_level
        level = project.levels[number - 1] if 1 <= number <= len(project.levels) else None
        self.layer.show_map(self.map if self.show_map.isChecked() else None, level)
        self.legend.set_map(self.map)
        zone = None
        results = self.document.results
        if self.show_zone.isChecked() and results is not None and level is not None:
            analysed = self.document.analysed_project
            zones = target_zones(analysed, results, [number]) if analysed is not None else []
            zone = zones[0] if zones else None
        self.layer.show_zone(zone)
        elements = {e.id: e for e in project.elements_in_storey(number) if e.active}
        ghost = None
        if self.suggestion is not None:
            base = self._new if self._new is not None else project.element(self.suggestion.element_id)
            ghost = self.suggestion.moved(base)
        self.marks.show(elements, self.gradients, self.suggestion, ghost)

    # ------------------------------------------------------------------ suggestion

    def request_suggestion(self) -> None:
        candidate = self.candidate()
        project, element = candidate if candidate is not None else (self.document.project, self.selected())
        if element is None or not element.active or self.document.results is None:
            self.suggestion_text.setText("Select one element of a layout that stands.")
            return
        measure = self.chosen_measure()
        self._new = element if candidate is not None else None
        constraint = Constraint(self.constraint.currentData())
        spacing = self.window.plan_view.grid_spacing
        prepared = self.map if self.map is not None and self.map.element_id == element.id else None
        self.suggestion_text.setText("Looking for a better position…")
        self._suggested_for = self.document.project
        self.worker.submit("suggest", lambda s, p, q: suggest(project, element.id, measure, constraint, spacing,
                                                               DEFAULT_STEPS, s, prepared))

    def accept_suggestion(self) -> None:
        """Move the element to the suggested position: one undo step."""
        found = self.suggestion
        if found is None:
            return
        project, new = self.document.project, self._new
        self._drop_suggestion()
        if new is not None:
            placed = found.moved(new)
            self.document.apply(add_elements(project, [placed]), f"Add {placed.id} at the suggested position")
            self.document.select([placed.id])
            return
        moved = found.moved(project.element(found.element_id))
        elements = tuple(moved if e.id == found.element_id else e for e in project.elements)
        self.document.apply(replace(project, elements=elements), f"Move {found.element_id} to the suggested position")

    def _drop_suggestion(self) -> None:
        self.worker.cancel("suggest")
        self.suggestion, self._suggested_for, self._new = None, None, None
        self.accept_button.setEnabled(False)
        self.suggestion_text.setText("")

    def request_losses(self) -> None:
        if self.document.results is None:
            return
        project = self.document.project
        self.loss_button.setText("Ranking…")
        self.worker.submit("loss", lambda s, p, q: loss_ranking(project, s, p, q))

    # ------------------------------------------------------------------ worker results

    def _progress(self, kind: str, done: int, total: int) -> None:
        if kind in ("map", "loss"):
            self.progress.setValue(round(100 * done / max(total, 1)))

    def _failed(self, kind: str, message: str) -> None:
        if kind == "suggest":
            self.suggestion_text.setText(message)
        elif kind == "map":
            self.map = None
            self.target.setText(message)
            self._redraw()
        elif kind == "loss":
            self.loss_button.setText("Rank the loss of each element")

    def _done(self, kind: str, result: object) -> None:
        if kind == "map":
            assert isinstance(result, PositionMap)
            self.map = result
            self.progress.setValue(100)
        elif kind == "moves":
            assert isinstance(result, list)
            self.gradients = result
            self._show_moves()
        elif kind == "suggest":
            assert isinstance(result, Suggestion)
            self._show_suggestion(result)
        elif kind == "compare":
            assert isinstance(result, Comparison)
            self._show_comparison(result)
        elif kind == "loss":
            assert isinstance(result, list)
            self._show_losses(result)
        self._redraw()

    def _show_moves(self) -> None:
        measure = self.chosen_measure()
        shown = quantity(measure)
        per = f"/{LENGTH.unit}"
        rows = []
        for g in self.gradients:
            dx, dy = g.helps
            rows.append([
                g.element_id + (" (on an edge)" if g.one_sided else ""),
                f"{PLAIN.show(g.torsion_ratio[0] / LENGTH.factor)}{per}",
                f"{shown.show(g.measure[0] / LENGTH.factor)}{' ' + shown.unit if shown.unit else ''}{per}",
                _direction(dx, dy),
            ])
        _fill(self.moves, rows)
        self.moves_note.setText(
            "Moving an element along its own line changes nothing: only its offset enters the stiffness."
        )

    def _show_suggestion(self, found: Suggestion) -> None:
        if self._suggested_for is not self.document.project:
            return
        self.suggestion = found
        shown = quantity(found.measure)
        unit = f" {shown.unit}" if shown.unit else ""
        m = LENGTH.unit
        self.suggestion_text.setText(
            f"{found.element_id} from ({LENGTH.show(found.start[0])}, {LENGTH.show(found.start[1])}) to "
            f"({LENGTH.show(found.end[0])}, {LENGTH.show(found.end[1])}) {m}: {found.measure.label} "
            f"{shown.show(found.current)}{unit} → {shown.show(found.value)}{unit}."
        )
        self.accept_button.setEnabled(True)

    def _show_comparison(self, comparison: Comparison) -> None:
        rows: list[list[str]] = []
        outcomes = (comparison.with_element, comparison.without_element)
        results = [o.results for o in outcomes]
        self.compare_note.setText(
            f"The layout with {comparison.element_id} and without it"
            + "".join(f"; without it: {o.error}" for o in outcomes[1:] if o.error)
        )
        count = min((len(r.modes) for r in results if r is not None), default=0)
        for i in range(min(count, 3)):
            periods = [SECONDS.show(r.modes[i].period) if r else "–" for r in results]
            rows.append([f"T{i + 1} ({SECONDS.unit})", *periods])
            for a, axis in enumerate(("x", "y", "θ")):
                rows.append([f"  mass share {axis} ({PERCENT.unit})"]
                            + [PERCENT.show(r.modes[i].mass_ratio[a]) if r else "–" for r in results])
        for a, d in enumerate(DIRECTIONS):
            rows.append([f"worst torsion ratio {d}"]
                        + [PLAIN.show(r.lateral.worst_torsion_ratio(d)) if r else "–" for r in results])
            rows.append([f"worst drift ratio {d}"]
                        + [DRIFT.show(max(s.drift_ratio[a] for s in r.lateral.storeys)) if r else "–"
                           for r in results])
        number = self.document.current_level
        rows.append([f"CR of storey {number} ({LENGTH.unit})"] + [_centre(r, number) for r in results])
        rows.append([f"CM of storey {number} ({LENGTH.unit})"] + [_mass_centre(r, number) for r in results])
        _fill(self.comparison, rows)

    def _show_losses(self, losses: list[Loss]) -> None:
        self.loss_button.setText("Rank the loss of each element")
        rows = []
        for loss in losses:
            increase = max(loss.torsion_increase, loss.drift_increase)
            worse = "no longer stands" if loss.error else f"{PERCENT.show(increase)} {PERCENT.unit}"
            rows.append([
                loss.element_id,
                "–" if loss.error else PLAIN.show(loss.torsion_ratio),
                "–" if loss.error else DRIFT.show(loss.drift_ratio),
                worse,
            ])
        _fill(self.losses, rows)


def _direction(dx: float, dy: float) -> str:
    if abs(dx) < 1e-12 and abs(dy) < 1e-12:
        return "stay (best where it is)"
    if abs(dx) >= abs(dy):
        return "toward +x" if dx > 0 else "toward −x"
    return "toward +y" if dy > 0 else "toward −y"


def _centre(results: Any, number: int) -> str:
    if results is None or not 1 <= number <= len(results.lateral.storeys):
        return "–"
    centre = results.lateral.storey(number).rigidity_centre
    return "–" if centre is None else f"{LENGTH.show(centre[0])}, {LENGTH.show(centre[1])}"


def _mass_centre(results: Any, number: int) -> str:
    if results is None or not 1 <= number <= len(results.lateral.storeys):
        return "–"
    centre = results.lateral.storey(number).mass_centre
    return f"{LENGTH.show(centre[0])}, {LENGTH.show(centre[1])}"
