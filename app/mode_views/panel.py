"""The mode-shape panel: animated plan, 3D view and modal charts, linked to the open document.

The panel follows the document: a new analysis rebuilds the drawn geometry and keeps the
animation running where it was (no new timer, no restart); selecting a mode anywhere
(``document.mode_selected``) selects it in every view here; an unstable layout shows the
diagnostic instead of the motion. The one animation clock stops while the panel is hidden.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from PySide6.QtCore import Qt
from PySide6.QtGui import QAction, QColor, QHideEvent, QResizeEvent, QShowEvent
from PySide6.QtWidgets import (
    QComboBox,
    QGridLayout,
    QHBoxLayout,
    QLabel,
    QSizePolicy,
    QSlider,
    QStackedWidget,
    QTabWidget,
    QToolButton,
    QVBoxLayout,
    QWidget,
)

from app.canvas.style import DIAGNOSTIC, MASS_CENTRE, RIGIDITY_CENTRE
from app.document import ProjectDocument
from app.drag_throttle import DragThrottle
from app.kinds import app_kinds
from app.mode_views.building_view import BuildingMotionView
from app.mode_views.charts import MassRatioChart, PeriodChart, ShapeChart
from app.mode_views.clock import DEFAULT_CYCLE_SECONDS, ModeClock
from app.mode_views.palette import UNDEFORMED, mode_caption, mode_label
from app.mode_views.plan_view import PlanMotionView
from core.model import Point
from core.report.mode_frames import BuildingGeometry, building_geometry, peak_scale
from core.report.summary import CAUTION
from core.results import Results

if TYPE_CHECKING:
    from app.main_window import MainWindow

DEFAULT_AMPLITUDE_PERCENT = 8
"""Peak drawn motion as a share of the plan size (mode shapes have no absolute size)."""
PACE_STEPS_PER_SECOND = 10
WIDE_RATIO = 2.2
"""Views go in one row when the panel's view area is wider than this times its height."""
CHROME_HEIGHT = 60
DRAG_REFRESH_MS = 120
"""While a drag is under way the views rebuild at most this often; the animation runs on between."""
"""Height of the control row and the footer, px (roughly)."""



def rigidity_centres(results: Results) -> list[Point | None]:
    """Centre of rigidity (storey stiffness definition) of the storey below each floor, if known."""
    return [storey.rigidity_centre for storey in results.lateral.storeys]


def _key_html() -> str:
    def swatch(colour: QColor, text: str) -> str:
        return f"<span style='color:{colour.name()}'>&#9632;</span>&nbsp;{text}"

    parts = [
        f"<span style='color:{MASS_CENTRE.name()}'>&#8853;</span>&nbsp;centre of mass",
        f"<span style='color:{RIGIDITY_CENTRE.name()}'>&#9671;</span>&nbsp;centre of rigidity",
        *(swatch(spec.colour, spec.label.lower()) for spec in app_kinds()),
        f"<span style='color:{UNDEFORMED.name()}'>&#9633;</span>&nbsp;at rest",
    ]
    return " &nbsp; ".join(parts)


class ModeViewsPanel(QWidget):
    """Animated mode shapes (plan and 3D) and the period, mass and shape charts of one document."""

    def __init__(self, document: ProjectDocument, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.setObjectName("modeViewsPanel")
        self.document = document
        self.clock = ModeClock(self)
        self.plan = PlanMotionView()
        self.building = BuildingMotionView()
        self.periods = PeriodChart()
        self.masses = MassRatioChart()
        self.shape = ShapeChart()
        self.mode_number = max(1, document.current_mode)
        self.floor_index: int | None = None
        """0-based floor emphasised in the plan: the roof until the editor's level changes."""
        self._geometry: BuildingGeometry | None = None
        self._results: Results | None = None
        self._shown = False
        """Between showEvent and hideEvent."""
        self._on_screen = True
        """False while the dock holding the panel has its tab behind another."""
        self._stale = True
        """The document changed while the panel was off screen."""
        self._throttle = DragThrottle(document, DRAG_REFRESH_MS, self.refresh, lambda: self.on_screen, self)
        self._build_controls()
        self._build_layout()
        self._connect()
        self.refresh()

    # ------------------------------------------------------------------ construction

    def _build_controls(self) -> None:
        self.mode_box = QComboBox()
        self.mode_box.setObjectName("modeChoice")
        self.mode_box.setSizeAdjustPolicy(QComboBox.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
        self.mode_box.setMinimumContentsLength(20)
        self.play_action = QAction("Play", self)
        self.play_action.setCheckable(True)
        self.play_action.setToolTip("Play or pause the motion")
        self.step_action = QAction("Step", self)
        self.step_action.setToolTip("Pause and move on by a sixteenth of a cycle")
        self.play_button = QToolButton()
        self.play_button.setDefaultAction(self.play_action)
        self.step_button = QToolButton()
        self.step_button.setDefaultAction(self.step_action)
        self.pace_slider = QSlider(Qt.Orientation.Horizontal)
        self.pace_slider.setObjectName("paceSlider")
        self.pace_slider.setRange(5, 60)  # tenths of a second per cycle
        self.pace_slider.setValue(round(DEFAULT_CYCLE_SECONDS * PACE_STEPS_PER_SECOND))
        self.pace_slider.setFixedWidth(70)
        self.pace_label = QLabel()
        self.amplitude_slider = QSlider(Qt.Orientation.Horizontal)
        self.amplitude_slider.setObjectName("amplitudeSlider")
        self.amplitude_slider.setRange(1, 40)
        self.amplitude_slider.setValue(DEFAULT_AMPLITUDE_PERCENT)
        self.amplitude_slider.setFixedWidth(70)
        self.amplitude_label = QLabel()
        self.floor_box = QComboBox()
        self.floor_box.setObjectName("floorChoice")
        self.floor_box.setToolTip("The floor highlighted in the plan, with its elements and centres")

    def _build_layout(self) -> None:
        controls = QHBoxLayout()
        controls.setContentsMargins(4, 2, 4, 0)
        groups = (
            (QLabel("Mode"), self.mode_box, self.play_button, self.step_button),
            (QLabel("Pace"), self.pace_slider, self.pace_label),
            (QLabel("Amplitude"), self.amplitude_slider, self.amplitude_label),
            (QLabel("Floor"), self.floor_box),
        )
        for group in groups:
            for widget in group:
                controls.addWidget(widget)
            controls.addSpacing(8)
        controls.addStretch(1)

        self.chart_tabs = QTabWidget(self)
        self.chart_tabs.setObjectName("modeChartTabs")
        self.chart_tabs.setDocumentMode(True)
        self.views = QWidget()
        self._grid = QGridLayout(self.views)
        self._grid.setContentsMargins(0, 0, 0, 0)
        self._grid.setSpacing(2)
        self.wide = False
        self._arrange(wide=False)
        self.diagnostic = QLabel()
        self.diagnostic.setObjectName("modeDiagnostic")
        self.diagnostic.setWordWrap(True)
        self.diagnostic.setAlignment(Qt.AlignmentFlag.AlignCenter)
        self.diagnostic.setStyleSheet(f"color: {DIAGNOSTIC.name()}; font-size: 11pt; padding: 24px;")
        self.stack = QStackedWidget()
        self.stack.addWidget(self.views)
        self.stack.addWidget(self.diagnostic)
        self.stack.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Expanding)

        key = QLabel(_key_html())
        key.setTextFormat(Qt.TextFormat.RichText)
        caution = QLabel(CAUTION)
        caution.setObjectName("modeCaution")
        caution.setWordWrap(True)
        caution.setStyleSheet("color: #6b675c; font-size: 8pt;")
        layout = QVBoxLayout(self)
        layout.setContentsMargins(0, 0, 0, 0)
        layout.setSpacing(2)
        layout.addLayout(controls)
        layout.addWidget(self.stack, 1)
        for line in (key, caution):
            line.setContentsMargins(4, 0, 4, 0)
            layout.addWidget(line)

    def _arrange(self, wide: bool) -> None:
        """A wide, low strip (a bottom dock): plan, 3D and the charts as tabs side by side.
        Otherwise the motion above and the three charts in a row below."""
        self.wide = wide
        grid = self._grid
        charts = ((self.periods, "Periods"), (self.masses, "Mass"), (self.shape, "Shape"))
        for widget in (self.plan, self.building, self.chart_tabs, *(c for c, _ in charts)):
            grid.removeWidget(widget)
        while self.chart_tabs.count():
            self.chart_tabs.removeTab(0)
        for i in range(6):
            grid.setColumnStretch(i, 0)
            grid.setRowStretch(i, 0)
        if wide:
            for column, widget in enumerate((self.plan, self.building, self.chart_tabs)):
                grid.addWidget(widget, 0, column)
                grid.setColumnStretch(column, 1)
            for chart, title in charts:
                self.chart_tabs.addTab(chart, title)
            grid.setRowStretch(0, 1)
            self.chart_tabs.show()
        else:
            self.chart_tabs.hide()
            grid.addWidget(self.plan, 0, 0, 1, 3)
            grid.addWidget(self.building, 0, 3, 1, 3)
            for column, (chart, _) in zip((0, 2, 4), charts, strict=True):
                grid.addWidget(chart, 1, column, 1, 2)
                chart.show()
            for column in range(6):
                grid.setColumnStretch(column, 1)
            grid.setRowStretch(0, 3)
            grid.setRowStretch(1, 2)

    def resizeEvent(self, event: QResizeEvent) -> None:
        super().resizeEvent(event)
        wide = event.size().width() > WIDE_RATIO * max(1, event.size().height() - CHROME_HEIGHT)
        if wide != self.wide:
            self._arrange(wide)

    def _connect(self) -> None:
        document = self.document
        document.preview_changed.connect(self._update_ticking)
        document.mode_selected.connect(self.select_mode)
        document.current_level_changed.connect(self._follow_level)
        self.clock.phase_changed.connect(self._draw_frame)
        self.clock.playing_changed.connect(self._show_playing)
        self.play_action.toggled.connect(self._play_toggled)
        self.step_action.triggered.connect(self._step)
        self.pace_slider.valueChanged.connect(self._pace_changed)
        self.amplitude_slider.valueChanged.connect(self._amplitude_changed)
        self.mode_box.activated.connect(self._mode_chosen)
        self.floor_box.activated.connect(self._floor_chosen)
        self.periods.mode_clicked.connect(self._ask_for_mode)
        self.masses.mode_clicked.connect(self._ask_for_mode)
        self._pace_changed(self.pace_slider.value())

    # ------------------------------------------------------------------ following the document

    @property
    def on_screen(self) -> bool:
        return self._shown and self._on_screen

    def refresh(self) -> None:
        """Rebuild from the document's latest results; the animation carries on from its phase.

        Off screen the work waits (``_stale``) until the panel is shown again, so a drag in the
        editor pays nothing for a panel behind another tab."""
        self._throttle.cancel()
        if not self.on_screen:
            self._stale = True
            self._update_ticking()
            return
        self._stale = False
        results, project = self.document.results, self.document.analysed_project
        if results is None or project is None or not results.modes:
            self._results = self._geometry = None
            for box in (self.mode_box, self.floor_box):  # no choices from a project no longer shown
                box.clear()
            error = self.document.error
            message = error.message if error is not None else "The analysis has not run yet."
            self.diagnostic.setText(f"No mode shapes to show.\n\n{message}")
            self.stack.setCurrentIndex(1)
            self.plan.clear_mode()
            self.building.clear_mode()
            for chart in (self.periods, self.masses, self.shape):
                chart.clear_results()
            self._update_ticking()
            return
        self._results = results
        self._geometry = building_geometry(project, results.floors, rigidity_centres(results))
        self.mode_number = min(max(1, self.mode_number), len(results.modes))
        roof = len(results.floors) - 1
        self.floor_index = roof if self.floor_index is None else min(self.floor_index, roof)
        self._fill_choices()
        self.stack.setCurrentIndex(0)
        self.periods.show_results(results, self.mode_number)
        self.masses.show_results(results, self.mode_number)
        self._show_motion()
        self._update_ticking()

    def select_mode(self, number: int) -> None:
        """Show mode ``number`` (1-based) in every view."""
        self.mode_number = int(number)
        if not self.on_screen:
            self._stale = True
            return
        if self._results is None:
            return
        self.mode_number = min(max(1, self.mode_number), len(self._results.modes))
        self.mode_box.setCurrentIndex(self.mode_number - 1)
        self.periods.select_mode(self.mode_number)
        self.masses.select_mode(self.mode_number)
        self._show_motion()

    def _follow_level(self, level: int) -> None:
        self.set_floor(level - 1)

    def set_floor(self, index: int) -> None:
        """Emphasise 0-based floor ``index`` in the plan."""
        self.floor_index = max(0, index)
        if not self.on_screen:
            self._stale = True
            return
        if self._results is None:
            return
        self.floor_index = min(self.floor_index, len(self._results.floors) - 1)
        self.floor_box.setCurrentIndex(self.floor_index)
        self._show_motion()

    def _fill_choices(self) -> None:
        assert self._results is not None
        labels = [mode_label(m) for m in self._results.modes]
        if [self.mode_box.itemText(i) for i in range(self.mode_box.count())] != labels:
            self.mode_box.blockSignals(True)
            self.mode_box.clear()
            for i, mode in enumerate(self._results.modes):
                self.mode_box.addItem(labels[i])
                self.mode_box.setItemData(i, mode_caption(mode), Qt.ItemDataRole.ToolTipRole)
            self.mode_box.blockSignals(False)
        self.mode_box.setCurrentIndex(self.mode_number - 1)
        names = [f.name for f in self._results.floors]
        if [self.floor_box.itemText(i) for i in range(self.floor_box.count())] != names:
            self.floor_box.blockSignals(True)
            self.floor_box.clear()
            self.floor_box.addItems(names)
            self.floor_box.blockSignals(False)
        self.floor_box.setCurrentIndex(self.floor_index)

    def _show_motion(self) -> None:
        results, geometry, floor = self._results, self._geometry, self.floor_index
        if results is None or geometry is None or floor is None:
            return
        mode = results.modes[self.mode_number - 1]
        peak = self.amplitude_slider.value() / 100 * geometry.plan_size
        scale = peak_scale(geometry, results.floors, mode, peak)
        phase = self.clock.phase
        self.plan.show_mode(geometry, results.floors, mode, scale, peak, floor, phase)
        self.building.show_mode(geometry, results.floors, mode, scale, peak, phase)
        self.shape.show_mode(results, self.mode_number)
        self.amplitude_label.setText(f"{self.amplitude_slider.value()} % = {peak:.2f} m")
        self.amplitude_slider.setToolTip("Largest drawn motion as a share of the plan size: mode shapes have no "
                                         f"size of their own (now {peak:.2f} m)")
        self._pace_changed(self.pace_slider.value())
        self.mode_box.setToolTip(mode_caption(mode))

    # ------------------------------------------------------------------ controls

    def _ask_for_mode(self, number: int) -> None:
        """A view asked for a mode: let the document broadcast it, so its tables follow too."""
        self.document.select_mode(number)

    def _mode_chosen(self, index: int) -> None:
        self._ask_for_mode(index + 1)

    def _floor_chosen(self, index: int) -> None:
        self.set_floor(index)

    def _play_toggled(self, on: bool) -> None:
        if on:
            self.clock.play()
        else:
            self.clock.pause()

    def _show_playing(self, playing: bool) -> None:
        self.play_action.blockSignals(True)
        self.play_action.setChecked(playing)
        self.play_action.setText("Pause" if playing else "Play")
        self.play_action.blockSignals(False)

    def _step(self) -> None:
        self.clock.step()

    def _pace_changed(self, value: int) -> None:
        seconds = value / PACE_STEPS_PER_SECOND
        self.clock.set_cycle_seconds(seconds)
        self.pace_label.setText(f"{seconds:.1f} s/cycle")
        if self._results is not None:
            real = self._results.modes[self.mode_number - 1].period
            self.pace_label.setToolTip(f"Visual pace only: the mode's real period is {real:.3f} s")

    def _amplitude_changed(self, _value: int) -> None:
        self._show_motion()

    def _draw_frame(self, phase: float) -> None:
        if self._results is None:
            return
        self.plan.set_phase(phase)
        self.building.set_phase(phase)

    # ------------------------------------------------------------------ visibility

    def set_on_screen(self, on_screen: bool) -> None:
        """Told by a dock whose tab is behind another one (it stays 'visible' to Qt meanwhile)."""
        self._on_screen = on_screen
        self._visibility_changed()

    def _visibility_changed(self) -> None:
        if self.on_screen and self._stale:
            self.refresh()
        else:
            self._update_ticking()

    def _update_ticking(self) -> None:
        """Animate while shown with results; hold still while a drag is under way (the mouse is
        down), so the drag's steps get the whole frame."""
        if self.on_screen and self._results is not None and not self.document.previewing:
            self.clock.resume()
        else:
            self.clock.suspend()

    def showEvent(self, event: QShowEvent) -> None:
        super().showEvent(event)
        self._shown = True
        self._visibility_changed()

    def hideEvent(self, event: QHideEvent) -> None:
        super().hideEvent(event)
        self._shown = False
        self._visibility_changed()


def install(window: MainWindow) -> ModeViewsPanel:
    """Add the mode-shape panel to the main window, following ``window.document``."""
    panel = ModeViewsPanel(window.document)
    dock = window.add_panel(panel, "Mode shapes", "modeShapesPanel", Qt.DockWidgetArea.BottomDockWidgetArea)
    dock.visibilityChanged.connect(panel.set_on_screen)
    menu = window.menu("&Modes")
    menu.addAction(panel.play_action)
    menu.addAction(panel.step_action)
    return panel
