"""Charts of the modal results: periods, effective mass ratios, and the shape over height.

Clicking a bar of the period or mass chart asks for that mode (``mode_clicked``); the selected
mode is drawn dark in both bar charts and its shape is the one plotted over height.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QBrush, QColor

from app.canvas.style import pen
from app.mode_views.items import SegmentLines
from app.mode_views.palette import (
    CHART_BACKGROUND,
    COMPONENT_COLOURS,
    KIND_BAR_COLOURS,
    SELECTED_BAR,
    TEXT,
    colour_key,
)
from core.report.figures import MODE_KIND_SYMBOLS
from core.report.mode_frames import height_profile
from core.results import ModeKind, Results

BAR_WIDTH = 0.7
TARGET_MASS_RATIO = 0.9
"""Cumulative effective mass the modes considered should reach: 90 % of the total
(EN 1998-1 §4.3.3.3.1(3), from memory: docs/sources.md)."""
HEADROOM = 1.08
"""Top of the mass chart over its tallest figure, so the 100 % lines stay clear of the frame."""
COMPONENT_NAMES = ("x", "y", "θ")
SHAPE_NAMES = ("u_x", "u_y", "θ·l_s")
FLOOR_TICK = 0.03
"""Half-length of the floor strokes on the shape chart, in its relative units."""


def _style(plot: pg.PlotItem, bottom: str, left: str, title: str) -> None:
    plot.setMenuEnabled(False)
    plot.hideButtons()
    plot.setMouseEnabled(False, False)
    plot.showGrid(x=False, y=True, alpha=0.2)
    for name, label in (("bottom", bottom), ("left", left)):
        axis = plot.getAxis(name)
        axis.enableAutoSIPrefix(False)
        axis.setLabel(label)
    plot.setTitle(title, size="9pt")


def _faded(colour: QColor, alpha: int = 150) -> QColor:
    faded = QColor(colour)
    faded.setAlpha(alpha)
    return faded


class _ModeBarChart(pg.PlotWidget):
    """A bar chart with one slot per mode that reports clicks as mode numbers."""

    mode_clicked = Signal(int)

    def __init__(self, parent: object = None) -> None:
        super().__init__(parent=parent, background=CHART_BACKGROUND)
        self._mode_count = 0
        self.scene().sigMouseClicked.connect(self._clicked)

    def _clicked(self, event) -> None:  # a pyqtgraph MouseClickEvent
        if event.button() != Qt.MouseButton.LeftButton or self._mode_count == 0:
            return
        point = self.getPlotItem().vb.mapSceneToView(event.scenePos())
        number = round(point.x())
        if 1 <= number <= self._mode_count and abs(point.x() - number) <= BAR_WIDTH / 2:
            self.mode_clicked.emit(number)

    def _set_mode_axis(self, count: int) -> None:
        self._mode_count = count
        axis = self.getPlotItem().getAxis("bottom")
        step = max(1, int(np.ceil(count / 12)))
        axis.setTicks([[(n, str(n)) for n in range(1, count + 1, step)], []])
        self.getPlotItem().setXRange(0.4, count + 0.6, padding=0)


class PeriodChart(_ModeBarChart):
    """Period of every mode, longest first; the selected mode's bar drawn dark."""

    def __init__(self, parent: object = None) -> None:
        super().__init__(parent)
        self.setObjectName("modePeriodChart")
        key = colour_key(tuple((MODE_KIND_SYMBOLS[kind], KIND_BAR_COLOURS[kind]) for kind in ModeKind))
        _style(self.getPlotItem(), "mode", "period T (s)", f"Periods {key}")
        self._bars = pg.BarGraphItem(x=[], height=[], width=BAR_WIDTH)
        self.addItem(self._bars)
        self._periods: list[float] = []
        self._kinds: list[ModeKind] = []
        self.selected = 0

    def show_results(self, results: Results, selected: int) -> None:
        self._periods = [m.period for m in results.modes]
        self._kinds = [m.kind for m in results.modes]
        self._set_mode_axis(len(self._periods))
        self.getPlotItem().setYRange(0.0, 1.1 * max(self._periods, default=1.0), padding=0)
        self.select_mode(selected)

    def select_mode(self, number: int) -> None:
        """Bars coloured by what each mode mostly does; the selected one opaque with a dark edge."""
        self.selected = number
        brushes, pens = [], []
        for n, kind in enumerate(self._kinds, start=1):
            colour = KIND_BAR_COLOURS[kind]
            brushes.append(QBrush(colour if n == number else _faded(colour, 110)))
            pens.append(pen(SELECTED_BAR, 2.0) if n == number else pen(_faded(colour, 160), 0.5))
        self._bars.setOpts(x=np.arange(1, len(self._periods) + 1), height=self._periods, width=BAR_WIDTH,
                           brushes=brushes, pens=pens)

    def clear_results(self) -> None:
        self._periods, self._kinds = [], []
        self._set_mode_axis(0)
        self._bars.setOpts(x=[], height=[], brushes=None, pens=None)


class MassRatioChart(_ModeBarChart):
    """Effective mass ratios per mode stacked x, y, rotation, with the cumulative ratio of each."""

    def __init__(self, parent: object = None) -> None:
        super().__init__(parent)
        self.setObjectName("modeMassChart")
        plot = self.getPlotItem()
        key = colour_key(tuple(zip(COMPONENT_NAMES, COMPONENT_COLOURS, strict=True)))
        _style(plot, "mode", "mass ratio (lines: cumulative)", f"Effective mass {key}")
        self._stacks = []
        self._cumulative = []
        for colour in COMPONENT_COLOURS:
            bars = pg.BarGraphItem(x=[], height=[], width=BAR_WIDTH, brush=_faded(colour), pen=pen(colour, 0.5))
            self.addItem(bars)
            self._stacks.append(bars)
            line = pg.PlotCurveItem([], [], pen=pen(colour, 2.0), antialias=True)
            self.addItem(line)
            self._cumulative.append(line)
        self._target = pg.InfiniteLine(pos=TARGET_MASS_RATIO, angle=0, pen=pen(TEXT, 1.0, Qt.PenStyle.DotLine),
                                       label="90 % (EN 1998-1 §4.3.3.3.1)",
                                       labelOpts={"position": 0.98, "color": TEXT, "anchors": [(1, 0), (1, 0)],
                                                  "fill": _faded(CHART_BACKGROUND, 225)})
        self.addItem(self._target)
        self._marker = pg.BarGraphItem(x=[], height=[], width=BAR_WIDTH, brush=None, pen=pen(SELECTED_BAR, 2.0))
        self.addItem(self._marker)
        self._ratios = np.zeros((0, 3))
        self.selected = 0

    def show_results(self, results: Results, selected: int) -> None:
        self._ratios = np.array([m.mass_ratio for m in results.modes], dtype=float).reshape(-1, 3)
        cumulative = np.array([m.cumulative for m in results.modes], dtype=float).reshape(-1, 3)
        count = len(self._ratios)
        numbers = np.arange(1, count + 1)
        self._set_mode_axis(count)
        bottom = np.zeros(count)
        for i, bars in enumerate(self._stacks):
            bars.setOpts(x=numbers, y0=bottom.copy(), height=self._ratios[:, i], width=BAR_WIDTH)
            bottom += self._ratios[:, i]
        for i, line in enumerate(self._cumulative):
            line.setData(numbers, cumulative[:, i])
        top = max(1.0, float(bottom.max(initial=0.0)))
        self.getPlotItem().setYRange(0.0, HEADROOM * top, padding=0)
        self.select_mode(selected)

    def select_mode(self, number: int) -> None:
        self.selected = number
        if 1 <= number <= len(self._ratios):
            total = float(self._ratios[number - 1].sum())
            self._marker.setOpts(x=[number], y0=[0.0], height=[total], width=BAR_WIDTH)
        else:
            self._marker.setOpts(x=[], y0=[], height=[])

    def clear_results(self) -> None:
        self._ratios = np.zeros((0, 3))
        self._set_mode_axis(0)
        for bars in (*self._stacks, self._marker):
            bars.setOpts(x=[], y0=[], height=[])
        for line in self._cumulative:
            line.setData([], [])


class ShapeChart(pg.PlotWidget):
    """The selected mode over height: u_x, u_y and θ·l_s against elevation, largest component = 1."""

    def __init__(self, parent: object = None) -> None:
        super().__init__(parent=parent, background=CHART_BACKGROUND)
        self.setObjectName("modeShapeChart")
        plot = self.getPlotItem()
        _style(plot, "relative displacement (largest = 1)", "elevation (m)", "Shape over height")
        plot.showGrid(x=True, y=True, alpha=0.2)
        plot.addItem(pg.InfiniteLine(pos=0.0, angle=90, pen=pen(TEXT, 1.0)))
        self._lines = [pg.PlotCurveItem([], [], pen=pen(colour, 2.0), antialias=True) for colour in COMPONENT_COLOURS]
        self._ticks = [SegmentLines(pen(colour, 3.0)) for colour in COMPONENT_COLOURS]
        """A short level stroke on each line at every floor."""
        for item in (*self._lines, *self._ticks):
            plot.addItem(item)
        self._key = colour_key(tuple(zip(SHAPE_NAMES, COMPONENT_COLOURS, strict=True)))
        plot.setXRange(-1.1, 1.1, padding=0)
        self.shown_mode = 0

    def show_mode(self, results: Results, number: int) -> None:
        mode = results.modes[number - 1]
        profile = height_profile(results.floors, mode)
        columns = (profile.u_x, profile.u_y, profile.twist)
        for line, values in zip(self._lines, columns, strict=True):
            line.setData(values, profile.elevation)
        for ticks, values in zip(self._ticks, columns, strict=True):
            rows = np.empty((2 * len(values), 2))
            rows[0::2, 0], rows[1::2, 0] = values - FLOOR_TICK, values + FLOOR_TICK
            rows[0::2, 1] = rows[1::2, 1] = profile.elevation
            ticks.set_segments(rows)
        self.getPlotItem().setYRange(0.0, float(profile.elevation[-1]) * 1.05, padding=0)
        if number != self.shown_mode:
            self.getPlotItem().setTitle(f"Mode {number} {self._key}", size="9pt")
        self.shown_mode = number

    def clear_results(self) -> None:
        for line in self._lines:
            line.setData([], [])
        for ticks in self._ticks:
            ticks.set_segments(np.zeros((0, 2)))
        self.shown_mode = 0
