"""What every canvas tool shares: the plan event it receives and the interface it offers the view.

A tool is an interaction object (style.md): it turns presses, moves and keys into a trial
project shown with ``document.preview`` while the gesture lasts, and one ``document.apply`` (one
undo step) when it is finished; ``cancel`` throws the trial away. Tools that place points accept
typed values (a length and an angle, or a width and a depth) through :meth:`Tool.enter_typed`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import TYPE_CHECKING

from PySide6.QtCore import QObject, QPointF, Qt, Signal
from PySide6.QtGui import QKeyEvent

from app.canvas.snapping import Snap
from core.model import Point

if TYPE_CHECKING:
    from app.canvas.view import PlanView
    from app.document import ProjectDocument


@dataclass(frozen=True)
class PlanEvent:
    """A mouse event in plan terms."""

    raw: Point
    """Cursor position, m."""
    point: Point
    """The position after snapping (and the orthogonal constraint with Shift), m."""
    snap: Snap
    button: Qt.MouseButton
    modifiers: Qt.KeyboardModifier
    view_pos: QPointF

    @property
    def shift(self) -> bool:
        return bool(self.modifiers & Qt.KeyboardModifier.ShiftModifier)

    @property
    def toggle(self) -> bool:
        """Ctrl or Shift: add to / remove from the selection."""
        return bool(self.modifiers & (Qt.KeyboardModifier.ShiftModifier | Qt.KeyboardModifier.ControlModifier))


CLICK_PIXELS = 4.0
"""A press and release closer than this on screen are a click, not a drag."""


def dragged(press_pos: QPointF, release: PlanEvent) -> bool:
    """True when the cursor moved more than a click's tolerance between the press and ``release``."""
    d = release.view_pos - press_pos
    return math.hypot(d.x(), d.y()) > CLICK_PIXELS


class Tool(QObject):
    """Base class of the canvas tools; the defaults ignore everything."""

    hint_changed = Signal(str)
    """The one-line instruction (or problem) to show in the status bar."""
    measure_changed = Signal(object)
    """Live values of the typed fields while the cursor moves (tuple of floats), or None."""

    name = "tool"
    title = "Tool"
    icon = ""
    shortcut = ""
    typed_fields: tuple[str, ...] = ()
    """Labels of the values one may type while using the tool, e.g. ("Length, m", "Angle, °")."""

    def __init__(self, view: PlanView) -> None:
        super().__init__(view)
        self.view = view
        self._hint = ""

    @property
    def document(self) -> ProjectDocument:
        return self.view.document

    # ------------------------------------------------------------------ hint

    def default_hint(self) -> str:
        return ""

    @property
    def hint(self) -> str:
        return self._hint or self.default_hint()

    def say(self, text: str = "") -> None:
        """Show ``text`` in place of the default hint ('' goes back to the default)."""
        self._hint = text
        self.hint_changed.emit(self.hint)

    # ------------------------------------------------------------------ life cycle

    def activate(self) -> None:
        self.say()

    def deactivate(self) -> None:
        self.cancel()

    def cancel(self) -> None:
        """Drop whatever the tool was in the middle of; the model stays as committed."""
        self.document.end_preview()

    # ------------------------------------------------------------------ input

    def press(self, event: PlanEvent) -> None:
        pass

    def move(self, event: PlanEvent) -> None:
        pass

    def release(self, event: PlanEvent) -> None:
        pass

    def double_click(self, event: PlanEvent) -> None:
        pass

    def key_press(self, event: QKeyEvent) -> bool:
        """Handle a key; True when it was used."""
        return False

    def anchor(self) -> Point | None:
        """The point the next one is placed from (for Shift and typed input), if any."""
        return None

    def snap_exclude(self) -> frozenset[str]:
        """Element ids that must not attract the cursor (those being moved)."""
        return frozenset()

    def enter_typed(self, values: tuple[float | None, ...]) -> str | None:
        """Place from typed values (None where a field was left empty); an error text or None."""
        return "this tool takes no typed values"
