"""A new element kind needs one core module, one app module and an icon: a throw-away kind,
registered here for the app too, is placed, drawn, analysed, saved, exported and printed without
any other edit. Drawing is checked by the kind's own colour showing up in the pictures."""

from __future__ import annotations

from collections.abc import Iterator

import ezdxf
import numpy as np
import pyqtgraph as pg
import pytest
from PySide6.QtCore import QRectF, Qt
from PySide6.QtGui import QColor, QImage, QPainter

from app.canvas.style import pen
from app.kinds import AppKindSpec, app_kinds, register_app_kind, unregister_app_kind
from app.panels.fields import Row
from app.resources import icon_path
from app.sheet.painting import Paper
from app.sheet.render import render_sheet
from app.units import STIFFNESS
from core.model import Element, Level, Project
from core.model.fileio import load_project
from tests.helpers import drag, make_window, settle
from tests.throwaway_kind import STRUT_KIND, StrutLine, strut_kind_registered

STRUT_COLOUR = QColor(200, 0, 200)
"""Used by no built-in kind, so its pixels in a picture can only come from a strut symbol."""
OUTLINE = ((0.0, 0.0), (20.0, 0.0), (20.0, 12.0), (0.0, 12.0))


def _draw_on_canvas(painter, a, u, n, length, w, scale, properties, colour) -> float:
    painter.setPen(pen(colour, 3.0))
    painter.drawLine(a, a + u * length)
    return w


def _draw_on_sheet(paper: Paper, a, b, u, n, factor, properties, colour) -> None:
    paper.painter.setPen(paper.pen(colour, 0.8))
    paper.painter.drawLine(a, b)


STRUT_APP_SPEC = AppKindSpec(
    kind=STRUT_KIND,
    label="Strut line",
    colour=STRUT_COLOUR,
    shortcut="U",
    icon="spring",
    dxf_role="STRUTS",
    dxf_colour=4,
    draw_canvas=_draw_on_canvas,
    draw_sheet=_draw_on_sheet,
    property_rows=lambda: [Row("Strut stiffness", "properties.stiffness", "number", STIFFNESS)],
    stiffness_note=lambda struts: "strut lines as given",
)


@pytest.fixture
def strut_kind() -> Iterator[AppKindSpec]:
    """The throw-away kind in the core and in the app, forgotten again after the test."""
    with strut_kind_registered():
        register_app_kind(STRUT_APP_SPEC)
        try:
            yield STRUT_APP_SPEC
        finally:
            unregister_app_kind(STRUT_KIND)


def _strut_project() -> Project:
    """One storey; struts along x on both long edges, springs-free: the struts carry x, a wall of
    struts along y carries y (an invented test layout)."""
    elements = (
        Element("Q1", (2.0, 0.0), (8.0, 0.0), 0, 1, StrutLine()),
        Element("Q2", (12.0, 12.0), (18.0, 12.0), 0, 1, StrutLine()),
        Element("Q3", (0.0, 3.0), (0.0, 9.0), 0, 1, StrutLine()),
        Element("Q4", (20.0, 3.0), (20.0, 9.0), 0, 1, StrutLine()),
    )
    return Project(name="Struts", levels=(Level("Level 1", 3.5, OUTLINE),), elements=elements)


def _colour_pixels(image: QImage, colour: QColor = STRUT_COLOUR, tolerance: int = 40) -> int:
    """How many pixels of ``image`` are within ``tolerance`` (sum of |ΔR|+|ΔG|+|ΔB|) of ``colour``."""
    image = image.convertToFormat(QImage.Format.Format_RGB32)
    bgra = np.frombuffer(image.constBits(), np.uint8).reshape(image.height(), image.bytesPerLine() // 4, 4)
    rgb = bgra[:, : image.width(), 2::-1].astype(int)
    return int((np.abs(rgb - (colour.red(), colour.green(), colour.blue())).sum(axis=2) < tolerance).sum())


def test_a_throwaway_kind_goes_through_the_whole_app(strut_kind, qtbot, tmp_path):
    assert [spec.kind for spec in app_kinds()][-1] == STRUT_KIND
    window = make_window(qtbot, tmp_path, _strut_project())

    # Analysed: the struts alone make the layout stable, so there are results and no error.
    document = window.document
    assert document.results is not None and document.error is None
    assert len(document.results.modes) == 3

    # Drawn on the canvas in its own colour (none of that colour without the elements).
    assert _colour_pixels(window.plan_view.grab().toImage()) > 200

    # Its tool places one more strut, with the kind's id prefix, in one undo step.
    window.drawing.set_tool(f"place-{STRUT_KIND}")
    assert window.drawing.actions[f"place-{STRUT_KIND}"].shortcut().toString() == "U"
    drag(window, (6.0, 6.0), (14.0, 6.0))
    assert [e.id for e in document.project.elements][-1] == "Q5"
    assert document.project.element("Q5").properties == StrutLine()

    # Its own property rows in the properties panel.
    document.select(["Q5"])
    settle(window)
    assert window.properties.form.editor("Strut stiffness").text() != ""

    # The mode views draw it.
    window.tables_dock.hide()
    settle(window)
    mode_plan = window.findChild(pg.PlotWidget, "modePlanView")
    qtbot.waitUntil(lambda: _colour_pixels(mode_plan.grab().toImage()) > 20, timeout=5000)

    # Saved and loaded unchanged.
    path = tmp_path / "struts.poise"
    assert window.files.save_as(path)
    assert load_project(path) == document.project

    # Exported to DXF on the kind's own layer.
    dxf = tmp_path / "struts.dxf"
    window.exchange.export_dxf_to(dxf)
    lines = ezdxf.readfile(dxf).modelspace().query('LINE[layer=="POISE-L01-STRUTS"]')
    assert len(lines) == 5

    # Printed on the sheet: the plan and the legend draw it, the assumptions name it.
    image = QImage(1240, 1754, QImage.Format.Format_RGB32)
    image.fill(Qt.GlobalColor.white)
    painter = QPainter(image)
    content = render_sheet(painter, QRectF(0, 0, image.width(), image.height()), document.project,
                           document.results, 1)
    painter.end()
    assert _colour_pixels(image) > 100
    assert any("strut lines as given" in line for line in content.assumptions)


def test_an_app_kind_needs_its_core_half_and_a_free_shortcut():
    with pytest.raises(Exception, match="unknown element kind 'test_strut'"):
        register_app_kind(STRUT_APP_SPEC)
    with strut_kind_registered():
        clash = AppKindSpec(**{**STRUT_APP_SPEC.__dict__, "shortcut": "B"})
        with pytest.raises(ValueError, match="shortcut 'B' already places braced frames"):
            register_app_kind(clash)


def test_every_drawing_tool_has_its_icon_and_its_own_key(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path)
    tools = window.drawing.tools.values()
    missing = [tool.name for tool in tools if not icon_path(tool.icon).exists()]
    assert missing == []
    keys = [tool.shortcut for tool in tools]
    assert len(set(keys)) == len(keys)
    assert {f"place-{spec.kind}" for spec in app_kinds()} <= set(window.drawing.tools)
