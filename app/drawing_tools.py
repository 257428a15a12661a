"""The drawing tools of one main window: select, edit vertices, draw outlines and openings, place
each element kind. One tool is active at a time; its action is checked in the Draw menu and the
tool bar, its options show above the plan and its instruction in the status bar."""

from __future__ import annotations

from typing import Any

from PySide6.QtCore import QObject, Qt
from PySide6.QtGui import QAction, QActionGroup
from PySide6.QtWidgets import QToolBar

from app.action_factory import make_action
from app.kinds import app_kinds
from app.tools.base import Tool
from app.tools.outline import OPENING, OUTLINE, PolygonTool
from app.tools.place import PlaceElementTool
from app.tools.rectangle import RectangleTool
from app.tools.select import SelectTool
from app.tools.vertex import VertexTool

TOOL_BAR_GROUPS_START = (2, 6)
"""Tool bar separators before the outline tools and before the element tools."""


class DrawingTools(QObject):
    """The tools of ``window``'s plan view by name, with one checkable action each."""

    def __init__(self, window: Any) -> None:
        super().__init__(window)
        self.window = window
        view = window.plan_view
        tools: list[Tool] = [
            SelectTool(view),
            VertexTool(view),
            PolygonTool(view, OUTLINE),
            RectangleTool(view, OUTLINE),
            RectangleTool(view, OPENING),
            PolygonTool(view, OPENING),
        ]
        tools += [PlaceElementTool(view, spec, window.placement) for spec in app_kinds()]
        self.tools: dict[str, Tool] = {tool.name: tool for tool in tools}
        self.group = QActionGroup(window)
        self.actions: dict[str, QAction] = {}
        for name, tool in self.tools.items():
            action = make_action(
                window,
                tool.title,
                lambda name=name: self.set_tool(name),
                tool.shortcut,
                tool.icon,
                f"{tool.title} ({tool.shortcut})",
            )
            action.setCheckable(True)
            self.group.addAction(action)
            self.actions[name] = action
            tool.hint_changed.connect(window.status.show_hint)

    def set_tool(self, name: str) -> None:
        """Make tool ``name`` the active one."""
        tool = self.tools[name]
        self.window.plan_view.set_tool(tool)
        self.actions[name].setChecked(True)
        self.window.tool_options.show_tool(tool)
        self.window.status.show_hint(tool.hint)


def install(window: Any) -> DrawingTools:
    """Add the tools to ``window``'s Draw menu and to a tool bar on its left."""
    drawing = DrawingTools(window)
    window.menu("draw").addActions(list(drawing.actions.values()))
    bar = QToolBar("Drawing tools")
    bar.setObjectName("drawingTools")
    for i, action in enumerate(drawing.actions.values()):
        if i in TOOL_BAR_GROUPS_START:
            bar.addSeparator()
        bar.addAction(action)
    window.addToolBar(Qt.ToolBarArea.LeftToolBarArea, bar)
    return drawing
