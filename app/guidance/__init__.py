"""The placement guide in the editor (what-if map, move arrows, target zone, suggestion, switched-off
elements) and ``poise map`` / ``poise suggest``; the work itself is :mod:`core.guidance`."""

from __future__ import annotations

from typing import Any

from PySide6.QtCore import Qt

from app.action_factory import make_action
from app.guidance.panel import GuidancePanel
from app.tools.select import describe
from core.model.edits import switch_elements


class GuidanceActions:
    """``window.guidance``: the panel and its dock, the show action and Switch off / on."""

    def __init__(self, window: Any) -> None:
        self.window = window
        self.document = window.document
        self.panel = GuidancePanel(window)
        self.dock = window.add_panel(self.panel, "Placement guide", "placementGuidePanel",
                                     Qt.DockWidgetArea.RightDockWidgetArea)
        window.tabifyDockWidget(window.properties_dock, self.dock)  # full height when it is in front
        self.dock.hide()
        self.show_action = make_action(window, "&Placement guide…", self.show)
        self.switch_action = make_action(window, "Switch &off / on", self.switch_selection)
        window.menu("analysis").addAction(self.show_action)
        window.menu("edit").addAction(self.switch_action)
        self.document.selection_changed.connect(self._update_enabled)
        self._update_enabled()

    def show(self) -> None:
        self.dock.show()
        self.dock.raise_()

    def _update_enabled(self) -> None:
        self.switch_action.setEnabled(bool(self.document.selection))

    def switch_selection(self) -> None:
        """Switch the selected elements off, or on again if all of them are off: one undo step."""
        ids = list(self.document.selection)
        if not ids:
            return
        project = self.document.project
        chosen = [project.element(i) for i in ids if i in {e.id for e in project.elements}]
        turn_on = all(not e.active for e in chosen)
        verb = "Switch on" if turn_on else "Switch off"
        self.document.apply(switch_elements(project, ids, turn_on), f"{verb} {describe(tuple(ids))}")


def install(window: Any) -> GuidanceActions:
    return GuidanceActions(window)
