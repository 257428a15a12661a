"""Stability diagnostics, run before anything is solved.

Each finding stops the analysis with :class:`core.errors.AnalysisError` whose message says in
words which level moves how and names the elements, so the engineer knows what to fix; no numpy
error or NaN ever reaches the results.

The layout checks are exact for the rigid-diaphragm model: if every element spanning storey j is
parallel, or every element line of storey j passes through one point, then level j and all levels
above can move together (slide across the lines, or turn about the point) without deforming any
element — elements above move rigidly with their bottom floor, and those spanning storey j see no
displacement along their own lines.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from functools import lru_cache

import numpy as np
import shapely

from core.arrays import FloatArray
from core.errors import AnalysisError
from core.model import Element, Level, Project
from core.model.geometry import bounding_size
from core.model.validation import Ring
from core.solve.assembly import FloorMass, element_transformation
from core.solve.modal import ScaledEigen, scaled_eigen

ZERO_LENGTH = 1e-6
"""Element lines shorter than this, m, have no direction."""
PARALLEL_TOLERANCE = 1e-6
"""|sin| of the angle between two lines below which they count as parallel."""
CONCURRENT_TOLERANCE = 1e-6
"""Distance of a line from the common point, relative to the plan size, below which lines meet."""
SINGULAR = 1e-12
"""Smallest over largest ω² at or below which K counts as singular."""
ILL_CONDITIONED = 1e-9
"""… and below which it is too nearly singular to mean anything: a period ratio above about
3·10⁴ (our own bound; real buildings stay below 10³)."""


class LayoutMemo:
    """What the layout checks learnt about a sequence of related projects: the prepared outline
    regions, and which element lines were found inside their floors. An analysis session keeps
    one, so a move re-checks only the moved element. Bounded: cleared when it grows large."""

    LIMIT = 20_000

    def __init__(self) -> None:
        self.regions: dict[tuple[tuple[float, float], ...], tuple[int, shapely.Polygon]] = {}
        self.inside: set[tuple[object, ...]] = set()
        self.codes: tuple[int, ...] = ()
        """The outline numbers of the levels the last check saw."""
        self.passed: dict[str, Element] = {}
        """Elements found inside under ``codes``, by id (the very objects: a kept one is not re-keyed)."""
        self.elements: tuple[Element, ...] = ()
        self.lines: FloatArray = np.zeros((0, 6))
        """Per element of ``elements``: bottom, top, direction (c, s), start (x, y)."""

    def line_table(self, elements: tuple[Element, ...]) -> FloatArray:
        """(E, 6) bottom, top, c, s, x, y of ``elements``: the rows of elements kept from the last
        call are reused, so a drag rebuilds one row."""
        old = self.elements
        if len(old) == len(elements):
            changed = [i for i, (a, b) in enumerate(zip(old, elements, strict=True)) if a is not b]
            table = self.lines.copy()
        else:
            changed, table = list(range(len(elements))), np.zeros((len(elements), 6))
        for i in changed:
            e = elements[i]
            table[i] = (e.bottom, e.top, *e.direction, *e.start)
        self.elements, self.lines = elements, table
        return table

    def region(self, level: Level) -> tuple[int, shapely.Polygon]:
        """(a number naming the outline, its region grown by a hair) for ``level``."""
        found = self.regions.get(level.outline)
        if found is None:
            if len(self.regions) > self.LIMIT:
                self.regions.clear()
                self.inside.clear()
                self.codes, self.passed = (), {}  # the numbers start again: what they named is gone
            # Grown by a hair, so that a line on the outline's edge counts as inside.
            region = shapely.Polygon(level.outline).buffer(1e-6 * _plan_size(level) + 1e-9)
            shapely.prepare(region)
            found = (len(self.regions), region)
            self.regions[level.outline] = found
        return found


def check_layout(project: Project, memo: LayoutMemo | None = None) -> None:
    """Raise AnalysisError for a layout that cannot stand: zero-length elements, elements off
    their floors' outlines, storeys without elements, all-parallel or concurrent storeys.
    ``memo`` carries what earlier checks of related projects found."""
    if not project.levels:
        raise AnalysisError("the project has no levels: draw a floor outline first")
    _zero_length(project)
    _outside_outline(project, memo or LayoutMemo())
    n = len(project.levels)
    table = (memo or LayoutMemo()).line_table(project.elements)
    storeys = np.arange(1, n + 1)[:, None]
    members = (table[:, 0] < storeys) & (storeys <= table[:, 1])  # (storeys, elements)
    directions, starts = table[:, 2:4], table[:, 4:6]
    checked: set[tuple[bytes, float]] = set()
    for storey in range(1, n + 1):
        # Storeys with the same elements and plan size give the same answer: check each set once.
        level = project.levels[storey - 1]
        key = (members[storey - 1].tobytes(), _plan_size(level))
        if key in checked:
            continue
        inside = members[storey - 1]
        if not _clearly_stable(directions[inside], starts[inside], level):
            _storey_layout(project, storey)
        checked.add(key)


def _clearly_stable(directions: FloatArray, starts: FloatArray, level: Level) -> bool:
    """True when the element lines are far from all parallel and far from meeting in one point.

    Each line is a row [n, −n·p/size] (n its normal, p a point on it relative to the outline's
    middle). Lines all parallel to d, or all through a point P, leave a vector ([d, 0] or
    [P/size, 1], length ≥ 1) that every row nearly misses (by ≤ the tolerances of
    :func:`_storey_layout`), so the rows' Gram matrix then has an eigenvalue ≤ count·10⁻¹². A
    smallest eigenvalue far above that proves the storey stands, and the exact check is skipped."""
    count = len(directions)
    if count < 3:
        return False
    points = np.asarray(level.outline, dtype=float)
    middle = (points.min(axis=0) + points.max(axis=0)) / 2
    size = max(_plan_size(level), 1e-9)
    normals = np.column_stack([-directions[:, 1], directions[:, 0]])
    rows = np.column_stack([normals, -np.einsum("ij,ij->i", normals, starts - middle) / size])
    smallest = float(np.linalg.eigvalsh(rows.T @ rows)[0])
    return smallest > 1e-8 * count


def check_stiffness(
    project: Project, floors: Sequence[FloorMass], K: FloatArray, eigen: ScaledEigen | None = None
) -> None:
    """Raise AnalysisError if K is not finite, singular or ill-conditioned, saying which levels
    move how in the (near) mechanism and which elements span the storeys that deform.

    The measure is physical: ω² = eigenvalues of M^(-1/2) K M^(-1/2), so "ill-conditioned" means
    a longest period absurdly long beside the shortest. Floors without mass are left to the modal
    analysis, which names them. ``eigen`` is the modal analysis's solution of this K, if at hand."""
    if not np.all(np.isfinite(K)):
        raise AnalysisError("the lateral stiffness has non-finite entries: check the element properties")
    mass = np.array([v for f in floors for v in (f.mass, f.mass, f.inertia)])
    if np.any(mass <= 0.0):
        return
    if eigen is None:
        eigen = scaled_eigen(K, mass)
    values, vectors, scale = eigen.values, eigen.vectors, eigen.scale
    largest = max(float(values[-1]), 1e-300)
    ratio = float(values[0]) / largest
    if ratio <= SINGULAR:
        _raise_mechanism(project, floors, vectors[:, 0] * scale, "can move without any resistance", True)
    if ratio <= ILL_CONDITIONED:
        longest = 2 * math.pi / math.sqrt(values[0])
        shortest = 2 * math.pi / math.sqrt(largest)
        _raise_mechanism(
            project,
            floors,
            vectors[:, 0] * scale,
            f"is almost unrestrained (its longest period would be {longest:.3g} s beside a shortest of "
            f"{shortest:.3g} s; the results would be meaningless)",
            singular=False,
        )


# --- layout ------------------------------------------------------------------------------------


def _zero_length(project: Project) -> None:
    short = [e for e in project.elements if e.length <= ZERO_LENGTH]
    if short:
        names = ", ".join(f"{e.id} at ({e.start[0]:.2f}, {e.start[1]:.2f})" for e in short)
        raise AnalysisError(
            f"element{'s' if len(short) > 1 else ''} {names} {'have' if len(short) > 1 else 'has'} zero "
            "length: start and end coincide, so it has no direction to resist load in. "
            "Drag one end away or delete it.",
            levels=tuple(sorted({j for e in short for j in range(e.bottom + 1, e.top + 1)})),
            elements=tuple(e.id for e in short),
        )


def _outside_outline(project: Project, memo: LayoutMemo) -> None:
    numbered = [memo.region(level) for level in project.levels]
    codes = tuple(number for number, _ in numbered)
    if codes != memo.codes or len(memo.passed) > memo.LIMIT:
        memo.codes, memo.passed = codes, {}
    passed = memo.passed
    code_level = {code: i for i, code in enumerate(codes)}  # a level (0-based) holding each region
    bad: list[tuple[Element, int]] = []
    for element in project.elements:
        if passed.get(element.id) is element:
            continue
        first = max(element.bottom, 1)  # the floors it connects: its bottom floor (if any) and those it spans
        key = (element.start, element.end, first, element.top, codes[first - 1 : element.top])
        if key in memo.inside:
            passed[element.id] = element
            continue
        line = shapely.LineString([element.start, element.end])
        # Floors with one outline share its region: each distinct region is asked once.
        covered = {code: numbered[code_level[code]][1].covers(line) for code in set(codes[first - 1 : element.top])}
        outside = [level for level in range(first, element.top + 1) if not covered[codes[level - 1]]]
        if outside:
            bad.extend((element, level) for level in outside)
        else:
            memo.inside.add(key)
            passed[element.id] = element
    if bad:
        parts = [f"element {e.id} leaves the outline of level {project.levels[j - 1].name!r}" for e, j in bad]
        raise AnalysisError(
            f"{'; '.join(parts)}: an element must stand within every floor it connects. "
            "Move it inside the outline or change the levels it spans.",
            levels=tuple(sorted({j for _, j in bad})),
            elements=tuple(dict.fromkeys(e.id for e, _ in bad)),
        )


def _storey_layout(project: Project, storey: int) -> None:
    level = project.levels[storey - 1]
    moving = tuple(range(storey, len(project.levels) + 1))
    above = " and every level above it" if storey < len(project.levels) else ""
    elements = project.elements_in_storey(storey)
    where = f"storey {storey} (below level {level.name!r})"
    if not elements:
        raise AnalysisError(
            f"{where} has no lateral elements: level {level.name!r}{above} can slide and turn freely. "
            "Place at least three element lines there, not all parallel and not all through one point.",
            levels=moving,
        )
    names = ", ".join(e.id for e in elements)
    ids = tuple(e.id for e in elements)
    directions = np.array([e.direction for e in elements])
    c0, s0 = directions[0]
    cross = np.abs(directions[:, 0] * s0 - directions[:, 1] * c0)
    size = max(_plan_size(level), 1e-9)
    if np.all(cross <= PARALLEL_TOLERANCE):
        normal = np.array([-s0, c0])
        offsets = np.array([normal @ np.asarray(e.start) for e in elements])
        collinear = np.ptp(offsets) <= CONCURRENT_TOLERANCE * size
        turn = " and, since they lie on one line, turn about it" if collinear else ""
        raise AnalysisError(
            f"every element of {where} runs {_describe_direction(c0, s0)} ({names}): nothing resists "
            f"movement {_describe_direction(-s0, c0)}, so level {level.name!r}{above} can slide "
            f"{_describe_direction(-s0, c0)}{turn}. Add an element across them.",
            levels=moving,
            elements=ids,
        )
    point = _common_point(elements, size)
    if point is not None:
        raise AnalysisError(
            f"the lines of every element of {where} ({names}) pass through one point, "
            f"({point[0]:.2f}, {point[1]:.2f}): nothing resists turning about it, so level "
            f"{level.name!r}{above} can rotate freely. Move an element so its line misses that point.",
            levels=moving,
            elements=ids,
        )


def _plan_size(level: Level) -> float:
    """Diagonal of the outline's bounding box, m: the length tolerances are relative to it."""
    return _outline_size(level.outline)


@lru_cache(maxsize=4096)
def _outline_size(outline: Ring) -> float:
    """:func:`_plan_size` of an outline (kept per outline: a drag leaves the outlines alone)."""
    return math.hypot(*bounding_size(outline))


def _common_point(elements: Sequence[Element], size: float) -> FloatArray | None:
    """The point all element lines pass through, if there is one (least squares, then a check)."""
    normals = np.array([(-e.direction[1], e.direction[0]) for e in elements])
    offsets = np.array([n @ np.asarray(e.start) for n, e in zip(normals, elements, strict=True)])
    point: FloatArray = np.linalg.lstsq(normals, offsets, rcond=None)[0]
    if np.all(np.abs(normals @ point - offsets) <= CONCURRENT_TOLERANCE * size):
        return point
    return None


def _describe_direction(c: float, s: float) -> str:
    """'along x', 'along y', or 'at 30° to x' for a unit vector (sense ignored)."""
    angle = math.degrees(math.atan2(s, c)) % 180.0
    if min(angle, 180.0 - angle) < 0.5:
        return "along x"
    if abs(angle - 90.0) < 0.5:
        return "along y"
    return f"at {angle:.0f}° to x"


# --- stiffness ---------------------------------------------------------------------------------


def _raise_mechanism(
    project: Project, floors: Sequence[FloorMass], vector: FloatArray, what: str, singular: bool
) -> None:
    """Describe the (near) null vector of K floor by floor and raise."""
    motion = vector.reshape(-1, 3)
    radii = np.array([max(f.radius_of_gyration, 1e-9) for f in floors])
    size = np.hypot(np.hypot(motion[:, 0], motion[:, 1]), motion[:, 2] * radii)
    largest = size.max()
    moving = [j for j in range(len(floors)) if size[j] >= 0.1 * largest]
    parts = [_describe_floor_motion(floors[j], motion[j], radii[j]) for j in moving]
    # Storeys that deform: the floor's motion differs from that of the floor below.
    deforming = []
    for j in range(len(floors)):
        below = _rigid_motion_at(motion[j - 1], floors[j - 1].centre, floors[j].centre) if j else np.zeros(3)
        relative = motion[j] - below
        if np.hypot(np.hypot(relative[0], relative[1]), relative[2] * radii[j]) >= 0.1 * largest:
            deforming.append(j + 1)
    # The elements the motion strains are the weak ones; in an exact mechanism none is strained.
    strain = {e.id: np.abs(element_transformation(e, tuple(floors)) @ vector).max() for e in project.elements}
    strained = tuple(i for i, v in strain.items() if v > 1e-3 * largest)
    if strained:
        elements = strained
        names = ", ".join(elements)
        if singular:
            named = f" It strains {names}, yet they give it no stiffness: check their properties."
        else:
            named = f" Only {names} resist{'s' if len(elements) == 1 else ''} it, and barely."
    else:
        elements = tuple(dict.fromkeys(e.id for s in deforming for e in project.elements_in_storey(s)))
        named = f" Elements of the storeys involved: {', '.join(elements)}." if elements else ""
    raise AnalysisError(
        f"the building {what}: {'; '.join(parts)}.{named} Add or stiffen elements there.",
        levels=tuple(floors[j].level for j in moving),
        elements=elements,
    )


def _rigid_motion_at(
    motion: FloatArray, centre: tuple[float, float], point: tuple[float, float]
) -> FloatArray:
    """A floor's rigid motion (u_x, u_y, θ at ``centre``) expressed at ``point``."""
    ux, uy, theta = motion
    return np.array([ux - theta * (point[1] - centre[1]), uy + theta * (point[0] - centre[0]), theta])


def _describe_floor_motion(floor: FloorMass, motion: FloatArray, radius: float) -> str:
    ux, uy, theta = motion
    translation = math.hypot(ux, uy)
    if abs(theta) * radius <= 1e-3 * translation:
        return f"level {floor.name!r} slides {_describe_direction(ux / translation, uy / translation)}"
    x = floor.centre[0] - uy / theta
    y = floor.centre[1] + ux / theta
    return f"level {floor.name!r} turns about ({x:.2f}, {y:.2f})"
