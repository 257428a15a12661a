"""Geometry of animated mode shapes: where every drawn point of the building is at a phase.

A mode moves each floor rigidly by [u_x, u_y, θ] at its mass centre c. A drawn point p fixed to
that floor is shown at

    c + f·u + R(f·θ)·(p − c),    f = scale · sin(phase),

the exact rigid rotation about the floor's mass centre, so a floor keeps its shape however large
the drawn amplitude (for small f this is the linear motion u + θ ẑ×(p − c) that the stiffness
assembly uses). Phase 0 is the undeformed building, phase π/2 the peak.

Everything a frame needs is precomputed per mode (:class:`LayerMotion`), so one frame is a few
array operations over all drawn points. Lines are stored as segments (rows 2i and 2i+1 form one
segment) and wall panels as closed quads of five rows, so the views can hand them to pyqtgraph
without any non-finite break markers. Pure and Qt-free: tested without a display.
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from functools import lru_cache

import numpy as np
import numpy.typing as npt

from core.arrays import FloatArray
from core.model import (
    BracedFrame,
    BracePattern,
    Element,
    Kind,
    Point,
    Project,
    kind_spec,
    registered_kinds,
)
from core.model.kinds import Elevation
from core.solve.assembly import FloorMass
from core.solve.modal import Mode

IntArray = npt.NDArray[np.int64]
Point3 = tuple[float, float, float]

BASE = -1
"""Floor index of points fixed to the ground: they never move."""

QUAD_ROWS = 5
"""Rows per wall panel: four corners and the first corner again, so its edge draws closed."""

MARKER_SHARE = 0.025
"""Size of the centre markers as a share of the plan size (our own choice, for legibility)."""

_CIRCLE_SEGMENTS = 24


@dataclass(frozen=True, eq=False)
class AttachedPoints:
    """Drawn points, each fixed to one floor (or to the base) and moving rigidly with it."""

    xy: FloatArray
    """(P, 2) plan coordinates in the undeformed building, m."""
    floor: IntArray
    """(P,) 0-based floor index of each point; BASE for the fixed ground."""
    z: FloatArray
    """(P,) elevation of each point, m."""

    def __post_init__(self) -> None:
        if self.xy.shape != (len(self.floor), 2) or self.z.shape != (len(self.floor),):
            raise ValueError("xy must be (P, 2) and floor, z must be (P,)")

    def __len__(self) -> int:
        return len(self.floor)

    @staticmethod
    def empty() -> AttachedPoints:
        return AttachedPoints(np.zeros((0, 2)), np.zeros(0, dtype=np.int64), np.zeros(0))

    @staticmethod
    def of(xy: npt.ArrayLike, floor: int, z: float) -> AttachedPoints:
        """Points ``xy`` all fixed to one floor at elevation ``z``."""
        points = np.asarray(xy, dtype=float).reshape(-1, 2)
        n = len(points)
        return AttachedPoints(points, np.full(n, floor, dtype=np.int64), np.full(n, float(z)))

    @staticmethod
    def join(parts: Sequence[AttachedPoints]) -> AttachedPoints:
        if not parts:
            return AttachedPoints.empty()
        return AttachedPoints(
            np.concatenate([p.xy for p in parts]).reshape(-1, 2),
            np.concatenate([p.floor for p in parts]).astype(np.int64),
            np.concatenate([p.z for p in parts]),
        )

    def on_floor(self, floor: int) -> AttachedPoints:
        """The points fixed to ``floor`` (segments of one floor keep their pairs)."""
        mask = self.floor == floor
        return AttachedPoints(self.xy[mask], self.floor[mask], self.z[mask])


def ring_segments(ring: Sequence[Point] | FloatArray) -> FloatArray:
    """The closed ring's edges as segment rows: p0 p1, p1 p2, …, p(k−1) p0."""
    p = np.asarray(ring, dtype=float).reshape(-1, 2)
    out = np.empty((2 * len(p), 2))
    out[0::2] = p
    out[1::2] = np.roll(p, -1, axis=0)
    return out


def circle_ring(centre: Point, radius: float, segments: int = _CIRCLE_SEGMENTS) -> FloatArray:
    t = np.linspace(0.0, 2 * np.pi, segments, endpoint=False)
    return np.column_stack([centre[0] + radius * np.cos(t), centre[1] + radius * np.sin(t)])


def mass_centre_symbol(centre: Point, size: float) -> FloatArray:
    """Our mass-centre mark as segments: a circle of radius ``size`` with a cross through it."""
    x, y = centre
    cross = np.array([[x - size, y], [x + size, y], [x, y - size], [x, y + size]])
    return np.concatenate([ring_segments(circle_ring(centre, size)), cross])


def rigidity_centre_symbol(centre: Point, size: float) -> FloatArray:
    """Our rigidity-centre mark as segments: a square on its corner with a smaller square inside."""
    x, y = centre
    outer = [(x + size, y), (x, y + size), (x - size, y), (x, y - size)]
    inner = [(x + 0.4 * size, y + 0.4 * size), (x - 0.4 * size, y + 0.4 * size),
             (x - 0.4 * size, y - 0.4 * size), (x + 0.4 * size, y - 0.4 * size)]
    return np.concatenate([ring_segments(outer), ring_segments(inner)])


# ---------------------------------------------------------------- the building as drawn


@dataclass(frozen=True, eq=False)
class BuildingGeometry:
    """Every drawn line of the building in its undeformed position, grouped by layer."""

    floor_count: int
    elevations: tuple[float, ...]
    bounds: tuple[float, float, float, float]
    """(x_min, y_min, x_max, y_max) over every floor outline, m."""
    plan_size: float
    """The larger plan dimension of that box, m: the yardstick for amplitudes and markers."""
    outlines: AttachedPoints
    """Each floor's outline and openings, as segments at its elevation."""
    ground: AttachedPoints
    """The first floor's outline on the fixed base, as segments at z = 0."""
    plan_elements: Mapping[Kind, AttachedPoints]
    """Each element's plan line on every floor it reaches, as segments."""
    frame_lines: Mapping[Kind, AttachedPoints]
    """In elevation, storey by storey: columns, beams and braces of frames, storey springs (segments)."""
    wall_panels: AttachedPoints
    """Shear walls storey by storey as closed quads (QUAD_ROWS rows each)."""
    mass_markers: AttachedPoints
    rigidity_markers: AttachedPoints
    mass_axis: AttachedPoints
    """Segments from the base up through every floor's mass centre."""
    rigidity_axis: AttachedPoints
    """Segments through the rigidity centres of consecutive floors that have one."""

    @property
    def height(self) -> float:
        return self.elevations[-1] if self.elevations else 0.0

    @property
    def marker_size(self) -> float:
        return MARKER_SHARE * self.plan_size


def _storey_ends(storey: int, elevations: Sequence[float]) -> tuple[int, float, int, float]:
    """(lower floor, its z, upper floor, its z) of 1-based ``storey``; the lower may be BASE."""
    lower = storey - 2 if storey >= 2 else BASE
    z_lower = elevations[lower] if lower != BASE else 0.0
    return lower, z_lower, storey - 1, elevations[storey - 1]


def _bay_points(element: Element, bays: int) -> FloatArray:
    start, end = np.asarray(element.start, dtype=float), np.asarray(element.end, dtype=float)
    t = np.linspace(0.0, 1.0, bays + 1)[:, None]
    points: FloatArray = start + t * (end - start)
    return points


class _SegmentCollector:
    """Collects segments whose two ends may sit on different floors."""

    def __init__(self) -> None:
        self._xy: list[FloatArray] = []
        self._floor: list[int] = []
        self._z: list[float] = []

    def add(self, a: FloatArray, a_end: tuple[int, float], b: FloatArray, b_end: tuple[int, float]) -> None:
        """Segment from plan point ``a`` on (floor, z) ``a_end`` to ``b`` on ``b_end``."""
        for point, (floor, z) in ((a, a_end), (b, b_end)):
            self._xy.append(point)
            self._floor.append(floor)
            self._z.append(z)

    def points(self) -> AttachedPoints:
        if not self._xy:
            return AttachedPoints.empty()
        return AttachedPoints(np.array(self._xy, dtype=float), np.array(self._floor, dtype=np.int64),
                              np.array(self._z, dtype=float))


def _elevation_segments(element: Element, elevations: Sequence[float], out: _SegmentCollector) -> None:
    """Columns, beam and braces (or the spring's post) of each storey the element spans."""
    props = element.properties
    bays = int(getattr(props, "bays", 1))
    post = kind_spec(element.kind).elevation is Elevation.POST
    nodes = _bay_points(element, bays)
    for storey in range(element.bottom + 1, element.top + 1):
        lower, z_lo, upper, z_hi = _storey_ends(storey, elevations)
        lo, hi = (lower, z_lo), (upper, z_hi)
        out.add(nodes[0], hi, nodes[-1], hi)  # the beam, or the spring's line, at the floor above
        if post:
            middle = (nodes[0] + nodes[-1]) / 2
            out.add(middle, lo, middle, hi)
        else:
            for node in nodes:
                out.add(node, lo, node, hi)
        if not isinstance(props, BracedFrame):
            continue
        for a, b in itertools.pairwise(nodes):
            if props.pattern is BracePattern.CROSS:
                out.add(a, lo, b, hi)
                out.add(b, lo, a, hi)
            elif props.pattern is BracePattern.SINGLE:
                first, second = (a, b) if storey % 2 else (b, a)
                out.add(first, lo, second, hi)
            else:
                middle = (a + b) / 2
                out.add(a, lo, middle, hi)
                out.add(b, lo, middle, hi)


def _wall_quads(element: Element, elevations: Sequence[float]) -> AttachedPoints:
    parts = []
    s, e = element.start, element.end
    for storey in range(element.bottom + 1, element.top + 1):
        lower, z_lo, upper, z_hi = _storey_ends(storey, elevations)
        parts.append(
            AttachedPoints(
                np.array([s, e, e, s, s], dtype=float),
                np.array([lower, lower, upper, upper, lower], dtype=np.int64),
                np.array([z_lo, z_lo, z_hi, z_hi, z_lo]),
            )
        )
    return AttachedPoints.join(parts)


def _axis(centres: Sequence[Point | None], elevations: Sequence[float]) -> AttachedPoints:
    """Segments joining consecutive known centres; the first floor's also drops to the base."""
    parts = []
    first = centres[0] if centres else None
    if first is not None:
        parts.append(AttachedPoints(np.array([first, first], dtype=float), np.array([BASE, 0]),
                                    np.array([0.0, elevations[0]])))
    for j in range(1, len(centres)):
        a, b = centres[j - 1], centres[j]
        if a is None or b is None:
            continue
        parts.append(AttachedPoints(np.array([a, b], dtype=float), np.array([j - 1, j]),
                                    np.array([elevations[j - 1], elevations[j]])))
    return AttachedPoints.join(parts)


@lru_cache(maxsize=4096)
def _element_parts(
    element: Element, elevations: tuple[float, ...], look: Elevation
) -> tuple[AttachedPoints, AttachedPoints]:
    """One element's plan lines on the floors it reaches, and its elevation drawn as ``look``
    (its kind's): wall quads, or the frame's or spring's segments. Kept per element and
    elevations, so a drag re-makes the moved element's alone; the arrays are read-only (shared)."""
    plan = AttachedPoints.join([
        AttachedPoints.of([element.start, element.end], j - 1, elevations[j - 1])
        for j in range(element.bottom + 1, element.top + 1)
    ])
    if look is Elevation.WALL:
        side = _wall_quads(element, elevations)
    else:
        collector = _SegmentCollector()
        _elevation_segments(element, elevations, collector)
        side = collector.points()
    for points in (plan, side):
        for array in (points.xy, points.floor, points.z):
            array.setflags(write=False)
    return plan, side


def building_geometry(
    project: Project,
    floors: Sequence[FloorMass],
    rigidity_centres: Sequence[Point | None] = (),
) -> BuildingGeometry:
    """The drawn building of an analysed project (one FloorMass per level): outlines, elements
    and centre markers. ``rigidity_centres`` has one entry per floor (None where a floor has
    none), or is empty when none are known.
    """
    if not project.levels or len(floors) != len(project.levels):
        raise ValueError(f"{len(floors)} floor masses for {len(project.levels)} levels")
    elevations = tuple(f.elevation for f in floors)
    n = len(floors)
    all_points = np.concatenate([np.asarray(level.outline, dtype=float) for level in project.levels])
    x_min, y_min = all_points.min(axis=0)
    x_max, y_max = all_points.max(axis=0)
    plan_size = float(max(x_max - x_min, y_max - y_min, 1e-6))
    marker = MARKER_SHARE * plan_size

    outlines = AttachedPoints.join([
        AttachedPoints.of(ring_segments(ring), j, elevations[j])
        for j, level in enumerate(project.levels)
        for ring in (level.outline, *level.openings)
    ])
    ground = AttachedPoints.of(ring_segments(project.levels[0].outline), BASE, 0.0)

    plan_elements: dict[Kind, AttachedPoints] = {}
    frame_lines: dict[Kind, AttachedPoints] = {}
    walls: list[AttachedPoints] = []
    for kind in registered_kinds():
        look = kind_spec(kind).elevation
        parts = [  # switched-off elements do not move
            _element_parts(e, elevations, look) for e in project.elements if e.kind is kind and e.active
        ]
        plan_elements[kind] = AttachedPoints.join([plan for plan, _ in parts])
        if look is Elevation.WALL:
            walls.extend(side for _, side in parts)
            frame_lines[kind] = AttachedPoints.empty()
        else:
            frame_lines[kind] = AttachedPoints.join([side for _, side in parts])

    rigidity = list(rigidity_centres) if rigidity_centres else [None] * n
    if len(rigidity) != n:
        raise ValueError(f"{len(rigidity)} rigidity centres for {n} floors")
    mass_markers = AttachedPoints.join(
        [AttachedPoints.of(mass_centre_symbol(f.centre, marker), j, f.elevation)
         for j, f in enumerate(floors)]
    )
    rigidity_markers = AttachedPoints.join([
        AttachedPoints.of(rigidity_centre_symbol(c, marker), j, elevations[j])
        for j, c in enumerate(rigidity) if c is not None
    ])
    return BuildingGeometry(
        floor_count=n,
        elevations=elevations,
        bounds=(float(x_min), float(y_min), float(x_max), float(y_max)),
        plan_size=plan_size,
        outlines=outlines,
        ground=ground,
        plan_elements=plan_elements,
        frame_lines=frame_lines,
        wall_panels=AttachedPoints.join(walls),
        mass_markers=mass_markers,
        rigidity_markers=rigidity_markers,
        mass_axis=_axis([f.centre for f in floors], elevations),
        rigidity_axis=_axis(rigidity, elevations),
    )


# ---------------------------------------------------------------- motion


def _extended(floors: Sequence[FloorMass], shape: FloatArray) -> tuple[FloatArray, FloatArray, FloatArray]:
    """Centres, translations and rotations per floor with the fixed base appended as the last row,
    so that floor index BASE (−1) picks it."""
    centres = np.array([f.centre for f in floors], dtype=float).reshape(-1, 2)
    shape = np.asarray(shape, dtype=float).reshape(-1, 3)
    if len(shape) != len(centres):
        raise ValueError(f"mode shape has {len(shape)} floors, the building {len(centres)}")
    return (
        np.vstack([centres, [0.0, 0.0]]),
        np.vstack([shape[:, :2], [0.0, 0.0]]),
        np.append(shape[:, 2], 0.0),
    )


def unit_peak(points: AttachedPoints, floors: Sequence[FloorMass], shape: FloatArray) -> float:
    """Largest displacement |u + θ ẑ×(p − c)| of any of ``points`` under ``shape`` at unit scale."""
    if len(points) == 0:
        return 0.0
    centres, u, theta = _extended(floors, shape)
    rel = points.xy - centres[points.floor]
    d = u[points.floor] + theta[points.floor, None] * np.column_stack([-rel[:, 1], rel[:, 0]])
    return float(np.max(np.hypot(d[:, 0], d[:, 1])))


def peak_scale(geometry: BuildingGeometry, floors: Sequence[FloorMass], mode: Mode, peak: float) -> float:
    """The scale that makes the mode's largest outline displacement ``peak`` metres (0 if nothing moves)."""
    reach = unit_peak(geometry.outlines, floors, mode.shape)
    return peak / reach if reach > 0.0 else 0.0


@dataclass(frozen=True)
class ViewAngle:
    """An orthographic view direction for the 3D drawing.

    The viewer looks from plan direction ``azimuth`` (from +x, counter-clockwise) and ``elevation``
    above the horizon toward the building; screen x runs to the viewer's right, screen y up.
    """

    azimuth: float = math.radians(-60.0)
    elevation: float = math.radians(25.0)

    MAX_ELEVATION = math.radians(89.0)

    def rotated(self, d_azimuth: float, d_elevation: float) -> ViewAngle:
        limit = self.MAX_ELEVATION
        return ViewAngle(
            math.remainder(self.azimuth + d_azimuth, 2 * math.pi),
            min(limit, max(-limit, self.elevation + d_elevation)),
        )

    @property
    def axes(self) -> FloatArray:
        """(2, 3): rows are the screen right and up directions in model space (orthonormal)."""
        a, e = self.azimuth, self.elevation
        return np.array([
            [-math.sin(a), math.cos(a), 0.0],
            [-math.sin(e) * math.cos(a), -math.sin(e) * math.sin(a), math.cos(e)],
        ])

    def project(self, xy: FloatArray, z: FloatArray, origin: Point3 = (0.0, 0.0, 0.0)) -> FloatArray:
        """(P, 2) screen coordinates of model points (xy, z) measured from ``origin``."""
        A = self.axes
        ox, oy, oz = origin
        return (xy - (ox, oy)) @ A[:, :2].T + np.outer(z - oz, A[:, 2])


class LayerMotion:
    """One mode's motion of named layers of attached points, precomputed so a frame is cheap.

    All layers are stacked into one array; a frame is computed once and handed out as views.
    """

    def __init__(
        self,
        layers: Mapping[str, AttachedPoints],
        floors: Sequence[FloorMass],
        shape: FloatArray,
        scale: float,
    ) -> None:
        self.names = tuple(layers)
        self._slices: dict[str, slice] = {}
        start = 0
        for name in self.names:
            self._slices[name] = slice(start, start + len(layers[name]))
            start += len(layers[name])
        points = AttachedPoints.join([layers[name] for name in self.names])
        centres, u, theta = _extended(floors, shape)
        f = points.floor
        self.z = points.z
        self._origin = centres[f]
        self._rel = points.xy - self._origin
        self._perp = np.column_stack([-self._rel[:, 1], self._rel[:, 0]])
        self._u = u[f] * scale
        self._theta = theta[f] * scale
        self._undeformed = {name: points.xy[s] for name, s in self._slices.items()}

    def undeformed(self) -> dict[str, FloatArray]:
        return dict(self._undeformed)

    def _plan(self, phase: float) -> FloatArray:
        k = math.sin(phase)
        angle = k * self._theta
        rotated = self._rel * np.cos(angle)[:, None] + self._perp * np.sin(angle)[:, None]
        return self._origin + k * self._u + rotated

    def plan(self, phase: float) -> dict[str, FloatArray]:
        """Displaced plan coordinates (P_layer, 2) of each layer at ``phase`` (radians)."""
        xy = self._plan(phase)
        return {name: xy[s] for name, s in self._slices.items()}

    def screen(self, phase: float, view: ViewAngle, origin: Point3) -> dict[str, FloatArray]:
        """Projected screen coordinates of each layer at ``phase`` for the 3D view."""
        xy = view.project(self._plan(phase), self.z, origin)
        return {name: xy[s] for name, s in self._slices.items()}


# ---------------------------------------------------------------- the shape over height


@dataclass(frozen=True)
class HeightProfile:
    """A mode's components against elevation, base first, scaled so the largest magnitude is 1."""

    elevation: FloatArray
    u_x: FloatArray
    u_y: FloatArray
    twist: FloatArray
    """θ times the floor's mass radius of gyration: the rotation as a comparable length."""


def height_profile(floors: Sequence[FloorMass], mode: Mode) -> HeightProfile:
    shape = np.asarray(mode.shape, dtype=float).reshape(-1, 3)
    radius = np.array([f.radius_of_gyration for f in floors])
    columns = np.column_stack([shape[:, 0], shape[:, 1], shape[:, 2] * radius])
    largest = float(np.max(np.abs(columns))) if columns.size else 0.0
    if largest > 0.0:
        columns = columns / largest
    columns = np.vstack([np.zeros((1, 3)), columns])
    z = np.concatenate([[0.0], [f.elevation for f in floors]])
    return HeightProfile(z, columns[:, 0].copy(), columns[:, 1].copy(), columns[:, 2].copy())
