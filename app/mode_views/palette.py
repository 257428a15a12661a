"""Colours and words of the mode views, on top of the shared palette in app.canvas.style."""

from __future__ import annotations

from PySide6.QtGui import QColor

from core.report.figures import MODE_KIND_WORDS
from core.results import Mode, ModeKind

X_COLOUR = QColor("#2f6db5")
Y_COLOUR = QColor("#d4881c")
ROTATION_COLOUR = QColor("#8e3d8f")
COMPONENT_COLOURS = (X_COLOUR, Y_COLOUR, ROTATION_COLOUR)

MIXED_COLOUR = QColor("#8b877b")
KIND_BAR_COLOURS = {
    ModeKind.X: X_COLOUR,
    ModeKind.Y: Y_COLOUR,
    ModeKind.TORSION: ROTATION_COLOUR,
    ModeKind.MIXED: MIXED_COLOUR,
}

UNDEFORMED = QColor(120, 116, 104, 90)
"""The building at rest, drawn faint beneath the motion."""
OTHER_FLOORS = QColor(70, 68, 62, 80)
MOVING_FLOOR = QColor("#2b2a27")
SELECTED_BAR = QColor("#2b2a27")
CHART_BACKGROUND = QColor("#fbfaf7")
TEXT = QColor("#2b2a27")



def mode_caption(mode: Mode) -> str:
    """One line that names a mode: number, period, what it does and its energy shares."""
    x, y, r = (round(100 * s) for s in mode.shares)
    return (f"Mode {mode.number} · T = {mode.period:.3f} s · {MODE_KIND_WORDS[mode.kind]} "
            f"(energy x {x} %, y {y} %, θ {r} %)")


def mode_label(mode: Mode) -> str:
    """A short name for lists: number, period and what it does."""
    return f"Mode {mode.number} · {mode.period:.3f} s · {MODE_KIND_WORDS[mode.kind]}"


def colour_key(items: tuple[tuple[str, QColor], ...]) -> str:
    """Rich text naming each item in its colour, for chart titles (no legend box over the data)."""
    return " ".join(f"<span style='color:{colour.name()}'>&#9632;&nbsp;{name}</span>" for name, colour in items)
