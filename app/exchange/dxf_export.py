"""Write the lateral layout to DXF so the architect can lay it over their plans.

Each level gets its own set of layers, named ``POISE-L<nn>-<ROLE>`` (``POISE-L03-WALLS``) so a
drawing program can switch a level or a role on and off: the outline and openings as closed
polylines, each element as a line on its kind's layer carrying its id as extended data (appid
``POISE``), the centres of mass and rigidity as small symbols with the eccentricity between them,
and text labels. Coordinates are written in metres (or millimetres) and $INSUNITS says which.
Qt-free.
"""

from __future__ import annotations

from pathlib import Path
from typing import Literal

import ezdxf
from ezdxf.enums import TextEntityAlignment

from app.exchange.errors import ExchangeError
from app.kinds import app_kind, app_kinds
from core.model import Point, Project
from core.report.mode_frames import mass_centre_symbol, rigidity_centre_symbol
from core.results import Results

APP_ID = "POISE"
"""Registered application name of the extended data that carries element ids."""

PLAN_ROLE_COLOURS: dict[str, int] = {"OUTLINE": 7, "OPENINGS": 8}
MARK_ROLE_COLOURS: dict[str, int] = {"CENTRES": 30, "LABELS": 7}
"""Roles of the layers of each level besides the element kinds' (``app.kinds``: one layer per
kind) and their AutoCAD colour index (our own choice)."""


def role_colours() -> dict[str, int]:
    """Every layer role of a level and its colour: outline and openings, the kinds, centres, labels."""
    kinds = {spec.dxf_role: spec.dxf_colour for spec in app_kinds()}
    return PLAN_ROLE_COLOURS | kinds | MARK_ROLE_COLOURS

UNIT_CODES: dict[str, tuple[int, float]] = {"m": (6, 1.0), "mm": (4, 1000.0)}
"""$INSUNITS code and drawing units per metre of the two units Poise writes."""

TEXT_HEIGHT = 0.25
"""Label height, m (2.5 mm on a 1:100 print)."""
SYMBOL_RADIUS = 0.3
"""Radius of the centre symbols, m."""


def _segments(msp, points, layer: str) -> None:
    """Rows 2i and 2i + 1 of ``points`` as one DXF line each."""
    for a, b in zip(points[0::2], points[1::2], strict=True):
        msp.add_line((float(a[0]), float(a[1])), (float(b[0]), float(b[1])), dxfattribs={"layer": layer})


def layer_name(level: int, role: str) -> str:
    """The layer of ``role`` on level ``level`` (1-based), e.g. ``POISE-L03-WALLS``."""
    return f"POISE-L{level:02d}-{role}"


def export_layout_dxf(
    project: Project,
    path: str | Path,
    results: Results | None = None,
    levels: tuple[int, ...] | None = None,
    unit: Literal["m", "mm"] = "m",
) -> None:
    """Write ``levels`` (1-based; all by default) of ``project`` to the DXF file ``path``.

    With ``results`` the centres of mass and (when the lateral checks ran) of rigidity are drawn.
    Raises :class:`ExchangeError` for an unknown level or a file that cannot be written.
    """
    if unit not in UNIT_CODES:
        raise ExchangeError(f"DXF unit must be 'm' or 'mm', got {unit!r}")
    count = len(project.levels)
    chosen = tuple(range(1, count + 1)) if levels is None else levels
    for level in chosen:
        if not 1 <= level <= count:
            raise ExchangeError(f"level {level} does not exist: the project has levels 1 to {count}")
    code, scale = UNIT_CODES[unit]
    doc = ezdxf.new("R2013", setup=False)
    doc.header["$INSUNITS"] = code
    doc.header["$MEASUREMENT"] = 1
    doc.appids.add(APP_ID)
    msp = doc.modelspace()

    def at(point: Point) -> tuple[float, float]:
        return (point[0] * scale, point[1] * scale)

    for level in chosen:
        for role, colour in role_colours().items():
            doc.layers.add(layer_name(level, role), color=colour)
        floor = project.levels[level - 1]
        msp.add_lwpolyline([at(p) for p in floor.outline], close=True,
                           dxfattribs={"layer": layer_name(level, "OUTLINE")})
        for opening in floor.openings:
            msp.add_lwpolyline([at(p) for p in opening], close=True,
                               dxfattribs={"layer": layer_name(level, "OPENINGS")})
        labels = layer_name(level, "LABELS")
        top_left = (min(p[0] for p in floor.outline), max(p[1] for p in floor.outline) + 2 * TEXT_HEIGHT)
        _text(msp, f"{floor.name} (level {level})", at(top_left), 1.6 * TEXT_HEIGHT * scale, labels,
              TextEntityAlignment.BOTTOM_LEFT)
        for element in project.elements_in_storey(level):
            line = msp.add_line(at(element.start), at(element.end),
                                dxfattribs={"layer": layer_name(level, app_kind(element.kind).dxf_role)})
            line.set_xdata(APP_ID, [(1000, element.id)])
            _text(msp, element.id, at(element.midpoint), TEXT_HEIGHT * scale, labels,
                  TextEntityAlignment.BOTTOM_CENTER)
        if results is not None:
            _centres(msp, results, level, scale)

    try:
        doc.saveas(Path(path))
    except OSError as error:
        raise ExchangeError(f"cannot write {path}: {error.strerror or error}") from error


def _text(msp, text: str, point: tuple[float, float], height: float, layer: str, align: TextEntityAlignment) -> None:
    msp.add_text(text, height=height, dxfattribs={"layer": layer}).set_placement(point, align=align)


def _centres(msp, results: Results, level: int, scale: float) -> None:
    """Mass centre (circle with a cross), rigidity centre (a square on its corner with a smaller
    square inside): the marks of core.report.mode_frames that every view draws (the circle as a
    true circle), and the line between them."""
    layer = layer_name(level, "CENTRES")
    labels = layer_name(level, "LABELS")
    r = SYMBOL_RADIUS * scale
    mx, my = (c * scale for c in results.floors[level - 1].centre)
    msp.add_circle((mx, my), r, dxfattribs={"layer": layer})  # a true circle, which CAD snaps to
    _segments(msp, mass_centre_symbol((mx, my), r)[-4:], layer)  # the mark's cross
    _text(msp, "CM", (mx + 1.2 * r, my + 1.2 * r), TEXT_HEIGHT * scale, labels, TextEntityAlignment.BOTTOM_LEFT)
    centre = results.lateral.storey(level).rigidity_centre
    if centre is None:
        return
    rx, ry = (c * scale for c in centre)
    _segments(msp, rigidity_centre_symbol((rx, ry), r), layer)
    msp.add_line((mx, my), (rx, ry), dxfattribs={"layer": layer})
    _text(msp, "CR", (rx + 1.2 * r, ry - 1.2 * r), TEXT_HEIGHT * scale, labels, TextEntityAlignment.TOP_LEFT)
