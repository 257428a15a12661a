"""Read an architect's DXF floor plan as an underlay to trace over.

Model space is flattened to straight segments in metres: lines, light-weight and 2D/3D polylines
(bulges included), arcs, circles, ellipses and splines are cut into chords no more than
``CHORD_TOLERANCE`` from the curve, and block inserts are expanded (nested, arrays too). Closed
polylines and circles are also returned as rings, largest first, so one can become a floor outline.
Entities on layers that are off or frozen are left out, like the architect sees them; text, hatches
and dimensions are counted and skipped. Units come from the header ($INSUNITS) or from the caller.
Qt-free, so tests and the command line can use it.
"""

from __future__ import annotations

import dataclasses
import itertools
from collections import Counter
from collections.abc import Iterator
from dataclasses import dataclass
from pathlib import Path

import ezdxf
import numpy as np
from ezdxf import recover
from ezdxf.entities import DXFGraphic, Insert
from ezdxf.path import make_path
from shapely.geometry import Polygon
from shapely.geometry.polygon import orient

from app.exchange.errors import ExchangeError, MissingUnitsError
from core.arrays import FloatArray, frozen_array
from core.model import Ring

DRAWING_UNITS: dict[int, tuple[str, float]] = {
    1: ("in", 0.0254),
    2: ("ft", 0.3048),
    4: ("mm", 0.001),
    5: ("cm", 0.01),
    6: ("m", 1.0),
    10: ("yd", 0.9144),
    14: ("dm", 0.1),
}
"""$INSUNITS codes Poise understands: short name and metres per drawing unit (DXF reference)."""

UNIT_CHOICES: dict[str, float] = {name: factor for name, factor in DRAWING_UNITS.values()}
"""The units a user may pick when the drawing does not say, by short name."""

CHORD_TOLERANCE = 0.005
"""Largest gap between a curve and its chords, m (5 mm: below what a 1:100 plan shows)."""

CURVE_TYPES = frozenset({"LINE", "LWPOLYLINE", "POLYLINE", "ARC", "CIRCLE", "ELLIPSE", "SPLINE"})
"""Entity types drawn into the underlay; everything else is counted as skipped."""

MAX_BLOCK_DEPTH = 16
"""Nesting depth of block inserts followed before giving up (guards against self-reference)."""


@dataclass(frozen=True)
class ClosedPolyline:
    """A closed polyline or circle of the drawing, in metres, counter-clockwise, no repeated end."""

    ring: Ring
    layer: str

    @property
    def area(self) -> float:
        return float(Polygon(self.ring).area)


@dataclass(frozen=True)
class Underlay:
    """What was read from one drawing, ready to draw faintly and to snap to."""

    segments: FloatArray
    """(n, 2, 2) array: segment i runs from segments[i, 0] to segments[i, 1], (x, y) in m."""
    layers: tuple[str, ...]
    """The drawing layer of each segment."""
    closed: tuple[ClosedPolyline, ...]
    """Closed polylines that are valid polygons, largest area first."""
    units: str
    """Short name of the drawing unit, e.g. ``mm``."""
    metres_per_unit: float
    units_from_header: bool
    skipped: tuple[tuple[str, int], ...]
    """Entity types left out, with their counts, most frequent first."""

    @property
    def bounds(self) -> tuple[float, float, float, float]:
        """(x_min, y_min, x_max, y_max) of the segments, m."""
        points = self.segments.reshape(-1, 2)
        (x0, y0), (x1, y1) = points.min(axis=0), points.max(axis=0)
        return float(x0), float(y0), float(x1), float(y1)

    def shifted(self, dx: float, dy: float) -> Underlay:
        """The same drawing moved by (dx, dy) m: for plans drawn far from the origin."""
        move = np.array([dx, dy])
        return dataclasses.replace(
            self,
            segments=frozen_array(self.segments + move),
            closed=tuple(
                ClosedPolyline(tuple((x + dx, y + dy) for x, y in c.ring), c.layer) for c in self.closed
            ),
        )

    def segment_list(self) -> list[tuple[tuple[float, float], tuple[float, float]]]:
        """The segments as plain ((x1, y1), (x2, y2)) tuples, as the editor's document takes them."""
        return [((float(a[0]), float(a[1])), (float(b[0]), float(b[1]))) for a, b in self.segments]


def units_from_header(doc: ezdxf.document.Drawing) -> tuple[str, float] | None:
    """The drawing's unit from $INSUNITS, or None when it is unitless or not one Poise knows."""
    code = doc.header.get("$INSUNITS", 0)
    return DRAWING_UNITS.get(int(code))


def guess_metres_per_unit(extent: float) -> float:
    """A first guess of the unit from the drawing's largest extent, for the question to the user.

    Building plans drawn in millimetres span thousands of units, in metres tens to hundreds
    (common practice, no source).
    """
    return 0.001 if extent > 1000.0 else 1.0


def read_underlay(path: str | Path, metres_per_unit: float | None = None) -> Underlay:
    """Read ``path`` as an underlay; ``metres_per_unit`` overrides the header's unit.

    Raises :class:`MissingUnitsError` when neither the header nor the caller gives the unit, and
    :class:`ExchangeError` when the file is missing, is not DXF, or has nothing to draw.
    """
    path = Path(path)
    doc = _read_document(path)
    header_unit = units_from_header(doc)
    if metres_per_unit is not None:
        if not (np.isfinite(metres_per_unit) and metres_per_unit > 0):
            raise ExchangeError(f"{path.name}: the drawing unit must be a positive length, got {metres_per_unit!r}")
        unit_name = next((n for n, f in UNIT_CHOICES.items() if np.isclose(f, metres_per_unit)), "custom")
        factor, from_header = float(metres_per_unit), False
    elif header_unit is not None:
        (unit_name, factor), from_header = header_unit, True
    else:
        factor, unit_name, from_header = 0.0, "", False

    if factor == 0.0:
        extent = _model_extent(doc)
        raise MissingUnitsError(
            f"{path.name}: the drawing does not say its units ($INSUNITS is unitless); choose them",
            guess_metres_per_unit(extent),
        )

    chord = CHORD_TOLERANCE / factor
    segments: list[tuple[tuple[float, float], tuple[float, float]]] = []
    layers: list[str] = []
    closed: list[ClosedPolyline] = []
    skipped: Counter[str] = Counter()
    hidden = _hidden_layers(doc)
    for entity, layer in _flattened(doc.modelspace(), "0", 0, skipped):
        if layer.lower() in hidden:
            continue
        if entity.dxftype() == "POLYLINE" and (entity.is_polygon_mesh or entity.is_poly_face_mesh):
            skipped["POLYLINE (mesh)"] += 1
            continue
        try:
            curve = make_path(entity, segments=8)
        except (TypeError, ValueError, ZeroDivisionError, ezdxf.DXFError):
            skipped[f"{entity.dxftype()} (unreadable)"] += 1
            continue
        for part in curve.sub_paths():
            points = [(float(v.x) * factor, float(v.y) * factor) for v in part.flattening(chord)]
            for a, b in itertools.pairwise(points):
                if a != b:
                    segments.append((a, b))
                    layers.append(layer)
            ring = _as_ring(points, entity.dxftype(), part.is_closed)
            if ring is not None:
                closed.append(ClosedPolyline(ring, layer))

    if not segments:
        found = ", ".join(f"{n} {t}" for t, n in skipped.most_common()) or "nothing"
        raise ExchangeError(
            f"{path.name}: no visible lines, polylines or arcs in model space (found {found})"
        )
    closed.sort(key=lambda c: c.area, reverse=True)
    return Underlay(
        segments=frozen_array(np.array(segments, dtype=float).reshape(-1, 2, 2)),
        layers=tuple(layers),
        closed=tuple(closed),
        units=unit_name,
        metres_per_unit=factor,
        units_from_header=from_header,
        skipped=tuple(skipped.most_common()),
    )


def _read_document(path: Path) -> ezdxf.document.Drawing:
    """The drawing, read strictly, else by ezdxf's recovery reader if that finds any entities
    (drawings written by other programs are often slightly off the standard)."""
    if not path.is_file():
        raise ExchangeError(f"{path}: no such file")
    try:
        return ezdxf.readfile(path)
    except Exception as strict:  # any parser failure on a foreign file: try to recover, else unreadable
        reason = str(strict).removeprefix("DXFStructureError: ") or type(strict).__name__
    try:
        doc, _auditor = recover.readfile(path)
    except Exception:  # the recovery reader failed too: the strict reason says more
        doc = None
    if doc is None or len(doc.modelspace()) == 0:
        raise ExchangeError(f"{path.name}: not a readable DXF file ({reason})")
    return doc


def _hidden_layers(doc: ezdxf.document.Drawing) -> set[str]:
    return {layer.dxf.name.lower() for layer in doc.layers if layer.is_off() or layer.is_frozen()}


def _flattened(
    entities: object, parent_layer: str, depth: int, skipped: Counter[str]
) -> Iterator[tuple[DXFGraphic, str]]:
    """Curve entities with their effective layer, block inserts expanded recursively.

    Entities on layer 0 inside a block take the layer of the insert (the DXF convention).
    """
    for entity in entities:  # type: ignore[attr-defined]
        layer = entity.dxf.get("layer", "0")
        if layer == "0" and depth > 0:
            layer = parent_layer
        kind = entity.dxftype()
        if isinstance(entity, Insert):
            if depth >= MAX_BLOCK_DEPTH:
                skipped["INSERT (nested too deep)"] += 1
                continue
            try:
                inserts = list(entity.multi_insert()) if entity.mcount > 1 else [entity]
                for single in inserts:
                    children = list(single.virtual_entities())
                    yield from _flattened(children, layer, depth + 1, skipped)
            except (ezdxf.DXFError, ValueError, ZeroDivisionError, KeyError):
                skipped["INSERT (unreadable)"] += 1
        elif kind in CURVE_TYPES:
            yield entity, layer
        else:
            skipped[kind] += 1


def _as_ring(points: list[tuple[float, float]], kind: str, is_closed: bool) -> Ring | None:
    """The closed chain as a counter-clockwise ring, or None if it is open or not a valid polygon."""
    if kind not in ("LWPOLYLINE", "POLYLINE", "CIRCLE", "ELLIPSE", "SPLINE") or not is_closed:
        return None
    if len(points) > 1 and np.allclose(points[0], points[-1], rtol=0.0, atol=1e-9 * (1 + abs(points[0][0]))):
        points = points[:-1]
    if len(points) < 3:
        return None
    polygon = Polygon(points)
    if not polygon.is_valid or polygon.area <= 1e-9:
        return None
    ccw = orient(polygon, sign=1.0)
    return tuple((float(x), float(y)) for x, y in ccw.exterior.coords[:-1])


def _model_extent(doc: ezdxf.document.Drawing) -> float:
    """Largest side of the box around the model-space curve points (drawing units)."""
    xs: list[float] = []
    ys: list[float] = []
    for entity, _layer in _flattened(doc.modelspace(), "0", 0, Counter()):
        try:
            for v in make_path(entity).control_vertices():
                xs.append(v.x)
                ys.append(v.y)
        except (TypeError, ValueError, ezdxf.DXFError):
            continue
    if not xs:
        return 0.0
    return max(max(xs) - min(xs), max(ys) - min(ys))
