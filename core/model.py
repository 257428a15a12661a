"""The project model: levels, lateral elements and settings as frozen, validated dataclasses.

Units are kN, m, t, s throughout (stress and modulus in kPa, area load in kPa). Levels are the
floors above the fixed base, listed from the ground up: ``levels[0]`` is the floor at the top of
storey 1. An element spans from level index ``bottom`` (0 = the base, j = the floor of
``levels[j - 1]``) to level index ``top``.

Objects are immutable: an edit builds a new object with :func:`dataclasses.replace`, which runs
the same validation, so an invalid value is refused whole and never half-applied.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from enum import StrEnum

from shapely.geometry import Polygon
from shapely.validation import explain_validity

from core.errors import ModelError

Point = tuple[float, float]
Ring = tuple[Point, ...]

GRAVITY = 9.80665
"""Standard gravity, m/s² (ISO 80000-3): seismic weight in kN over GRAVITY is mass in t."""
STEEL_E = 2.0e8
"""Young's modulus of structural steel, kPa (EN 1993-1-1 §3.2.6: 210 GPa; 200 GPa is the
value in ASCE/AISC practice — we take the rounder, slightly softer figure)."""
CONCRETE_E = 3.3e7
"""Secant modulus of C30/37 concrete, kPa (EN 1992-1-1 Table 3.1: E_cm = 33 GPa)."""
CRACKED_FACTOR = 0.5
"""Effective stiffness of cracked concrete members as a share of the gross section
(EN 1998-1 §4.3.1(7): one-half of the uncracked flexural and shear stiffness)."""


def _require(condition: bool, path: str, message: str) -> None:
    if not condition:
        raise ModelError(path, message)


def _positive(value: float, path: str) -> None:
    _require(math.isfinite(value) and value > 0.0, path, f"must be a positive number, got {value!r}")


def _non_negative(value: float, path: str) -> None:
    _require(math.isfinite(value) and value >= 0.0, path, f"must be zero or positive, got {value!r}")


def _finite_point(point: Point, path: str) -> None:
    _require(
        len(point) == 2 and all(math.isfinite(c) for c in point),
        path,
        f"must be a finite (x, y) pair, got {point!r}",
    )


def _as_point(point: Point) -> Point:
    return (float(point[0]), float(point[1]))


def _as_ring(ring: Ring) -> Ring:
    return tuple(_as_point(p) for p in ring)


def _valid_ring(ring: Ring, path: str) -> Polygon:
    _require(len(ring) >= 3, path, f"a polygon needs at least 3 points, got {len(ring)}")
    for i, point in enumerate(ring):
        _finite_point(point, f"{path}[{i}]")
    polygon = Polygon(ring)
    if not polygon.is_valid:
        reason = explain_validity(polygon)
        if "Self-intersection" in reason or "Ring Self-intersection" in reason:
            raise ModelError(path, "polygon intersects itself")
        raise ModelError(path, f"polygon is not valid ({reason})")
    _require(polygon.area > 1e-9, path, "polygon has no area")
    return polygon


class Material(StrEnum):
    """Material family; it sets the default modulus and the cracking factor."""

    STEEL = "steel"
    CONCRETE = "concrete"


class BracePattern(StrEnum):
    """How the braces of one bay of one storey are laid out."""

    SINGLE = "single"
    """One diagonal per bay and storey, alternating direction storey by storey."""
    CROSS = "cross"
    """Two crossing diagonals per bay and storey (an X)."""
    CHEVRON = "chevron"
    """Two braces from the lower corners to the beam's mid-span (an inverted V)."""


@dataclass(frozen=True)
class BracedFrame:
    """A concentrically braced steel frame: axial columns, truss braces, rigid floors."""

    pattern: BracePattern = BracePattern.CROSS
    bays: int = 1
    tension_only: bool = False
    """For the cross pattern: only the brace in tension resists (the other buckles)."""
    modulus: float = STEEL_E
    brace_area: float = 3.0e-3
    column_area: float = 1.2e-2
    beam_area: float = 8.0e-3
    beam_inertia: float = 3.0e-4
    """Beam second moment of area, m⁴; it matters for the chevron pattern."""

    def __post_init__(self) -> None:
        _require(isinstance(self.bays, int) and 1 <= self.bays <= 20, "bays", "must be a whole number from 1 to 20")
        _require(
            not self.tension_only or self.pattern is BracePattern.CROSS,
            "tension_only",
            "applies to the cross pattern only",
        )
        for name in ("modulus", "brace_area", "column_area", "beam_area", "beam_inertia"):
            _positive(getattr(self, name), name)


@dataclass(frozen=True)
class ShearWall:
    """A plane wall, modelled as a Timoshenko cantilever (flexure and shear) fixed at its base."""

    thickness: float = 0.25
    modulus: float = CONCRETE_E
    poisson: float = 0.2
    stiffness_factor: float = CRACKED_FACTOR
    """Share of the gross flexural and shear stiffness that is effective after cracking."""

    def __post_init__(self) -> None:
        _positive(self.thickness, "thickness")
        _positive(self.modulus, "modulus")
        _require(0.0 <= self.poisson < 0.5, "poisson", f"must be from 0 to 0.5, got {self.poisson!r}")
        _require(
            math.isfinite(self.stiffness_factor) and 0.0 < self.stiffness_factor <= 1.0,
            "stiffness_factor",
            f"must be above 0 and at most 1, got {self.stiffness_factor!r}",
        )


@dataclass(frozen=True)
class MomentFrame:
    """A plane frame of columns and beams over ``bays`` equal bays, rigid floors, fixed bases."""

    bays: int = 1
    modulus: float = STEEL_E
    column_inertia: float = 2.5e-4
    column_area: float = 1.5e-2
    beam_inertia: float = 3.4e-4
    beam_area: float = 1.0e-2
    stiffness_factor: float = 1.0
    """Share of the gross flexural stiffness that is effective (0.5 for cracked concrete)."""

    def __post_init__(self) -> None:
        _require(isinstance(self.bays, int) and 1 <= self.bays <= 20, "bays", "must be a whole number from 1 to 20")
        for name in ("modulus", "column_inertia", "column_area", "beam_inertia", "beam_area"):
            _positive(getattr(self, name), name)
        _require(
            math.isfinite(self.stiffness_factor) and 0.0 < self.stiffness_factor <= 1.0,
            "stiffness_factor",
            f"must be above 0 and at most 1, got {self.stiffness_factor!r}",
        )


@dataclass(frozen=True)
class Spring:
    """A lateral line with storey stiffnesses the user gives, kN/m, one per storey spanned."""

    storey_stiffness: tuple[float, ...] = (1.0e5,)

    def __post_init__(self) -> None:
        _require(len(self.storey_stiffness) >= 1, "storey_stiffness", "needs one value per storey")
        for i, k in enumerate(self.storey_stiffness):
            _positive(k, f"storey_stiffness[{i}]")


ElementProperties = BracedFrame | ShearWall | MomentFrame | Spring


class ElementKind(StrEnum):
    """The four kinds of lateral element."""

    BRACED_FRAME = "braced_frame"
    SHEAR_WALL = "shear_wall"
    MOMENT_FRAME = "moment_frame"
    SPRING = "spring"


PROPERTY_TYPES: dict[ElementKind, type[ElementProperties]] = {
    ElementKind.BRACED_FRAME: BracedFrame,
    ElementKind.SHEAR_WALL: ShearWall,
    ElementKind.MOMENT_FRAME: MomentFrame,
    ElementKind.SPRING: Spring,
}


def default_properties(kind: ElementKind, material: Material | None = None) -> ElementProperties:
    """Sensible concept-stage properties of ``kind`` in ``material`` (its usual one by default)."""
    if kind is ElementKind.BRACED_FRAME:
        return BracedFrame()
    if kind is ElementKind.SHEAR_WALL:
        if material is Material.STEEL:
            return ShearWall(thickness=0.012, modulus=STEEL_E, poisson=0.3, stiffness_factor=1.0)
        return ShearWall()
    if kind is ElementKind.MOMENT_FRAME:
        if material is Material.CONCRETE:
            return MomentFrame(
                modulus=CONCRETE_E,
                column_inertia=0.6**4 / 12,
                column_area=0.36,
                beam_inertia=0.4 * 0.7**3 / 12,
                beam_area=0.28,
                stiffness_factor=CRACKED_FACTOR,
            )
        return MomentFrame()
    return Spring()


@dataclass(frozen=True)
class Element:
    """A lateral element on a straight line in plan, spanning levels ``bottom`` to ``top``."""

    id: str
    start: Point
    end: Point
    bottom: int
    top: int
    properties: ElementProperties = field(default_factory=BracedFrame)

    def __post_init__(self) -> None:
        _require(bool(self.id.strip()), "id", "must not be empty")
        _finite_point(self.start, "start")
        _finite_point(self.end, "end")
        object.__setattr__(self, "start", _as_point(self.start))
        object.__setattr__(self, "end", _as_point(self.end))
        _require(isinstance(self.bottom, int) and self.bottom >= 0, "bottom", "must be a level index ≥ 0")
        _require(isinstance(self.top, int) and self.top > self.bottom, "top", "must be above the bottom level")
        if isinstance(self.properties, Spring):
            _require(
                len(self.properties.storey_stiffness) == self.storey_count,
                "properties.storey_stiffness",
                f"needs {self.storey_count} values (one per storey spanned), "
                f"got {len(self.properties.storey_stiffness)}",
            )

    @property
    def kind(self) -> ElementKind:
        return next(k for k, t in PROPERTY_TYPES.items() if isinstance(self.properties, t))

    @property
    def length(self) -> float:
        return math.dist(self.start, self.end)

    @property
    def storey_count(self) -> int:
        return self.top - self.bottom

    @property
    def direction(self) -> Point:
        """Unit vector from start to end (undefined for a zero-length line: (1, 0))."""
        length = self.length
        if length == 0.0:
            return (1.0, 0.0)
        return ((self.end[0] - self.start[0]) / length, (self.end[1] - self.start[1]) / length)

    @property
    def midpoint(self) -> Point:
        return ((self.start[0] + self.end[0]) / 2, (self.start[1] + self.end[1]) / 2)


@dataclass(frozen=True)
class PointMass:
    """An extra mass on a floor (plant, a tank, a heavy roof garden), t, at (x, y)."""

    mass: float
    position: Point
    label: str = ""

    def __post_init__(self) -> None:
        _positive(self.mass, "mass")
        _finite_point(self.position, "position")
        object.__setattr__(self, "position", _as_point(self.position))


@dataclass(frozen=True)
class Level:
    """A floor: the storey below it, its outline and openings, and its seismic mass."""

    name: str
    height: float
    """Storey height below this floor, m."""
    outline: Ring
    openings: tuple[Ring, ...] = ()
    seismic_weight: float = 8.0
    """Seismic weight per floor area, kPa (dead load plus the combined share of imposed load)."""
    point_masses: tuple[PointMass, ...] = ()

    def __post_init__(self) -> None:
        _require(bool(self.name.strip()), "name", "must not be empty")
        _positive(self.height, "height")
        outer = _valid_ring(self.outline, "outline")
        object.__setattr__(self, "outline", _as_ring(self.outline))
        object.__setattr__(self, "openings", tuple(_as_ring(o) for o in self.openings))
        for i, opening in enumerate(self.openings):
            hole = _valid_ring(opening, f"openings[{i}]")
            _require(outer.contains(hole), f"openings[{i}]", "opening must lie inside the outline")
        _non_negative(self.seismic_weight, "seismic_weight")


class RuleSet(StrEnum):
    """Which code's limits are judged pass/warn/fail; both sets' figures are always computed."""

    EN1998 = "en1998"
    ASCE7 = "asce7"


class LoadMethod(StrEnum):
    """How the equivalent static base shear is found."""

    EN1998 = "en1998"
    ASCE7 = "asce7"
    COEFFICIENT = "coefficient"


class SystemType(StrEnum):
    """Structural system, for the codes' approximate period formulas."""

    STEEL_MOMENT = "steel_moment"
    CONCRETE_MOMENT = "concrete_moment"
    ECCENTRIC_BRACED = "eccentric_braced"
    OTHER = "other"


@dataclass(frozen=True)
class Eurocode8Spectrum:
    """EN 1998-1 §3.2.2 spectrum parameters (recommended values by default)."""

    ag: float = 0.25
    """Design ground acceleration on type A ground, a_g = γ_I·a_gR, in g."""
    ground_type: str = "B"
    spectrum_type: int = 1
    behaviour_factor: float = 4.0
    lower_bound: float = 0.2
    damping_percent: float = 5.0

    def __post_init__(self) -> None:
        _positive(self.ag, "ag")
        _require(self.ground_type in ("A", "B", "C", "D", "E"), "ground_type", "must be one of A, B, C, D, E")
        _require(self.spectrum_type in (1, 2), "spectrum_type", "must be 1 or 2")
        _require(
            math.isfinite(self.behaviour_factor) and self.behaviour_factor >= 1.0,
            "behaviour_factor",
            "must be at least 1",
        )
        _non_negative(self.lower_bound, "lower_bound")
        _positive(self.damping_percent, "damping_percent")


@dataclass(frozen=True)
class Asce7Spectrum:
    """ASCE 7 §11.4 design spectrum and §12.8 base-shear parameters."""

    sds: float = 1.0
    sd1: float = 0.6
    s1: float = 0.6
    long_period: float = 8.0
    """T_L, s."""
    response_modification: float = 6.0
    """R."""
    importance: float = 1.0
    """I_e."""
    deflection_amplification: float = 5.0
    """C_d."""

    def __post_init__(self) -> None:
        for name in ("sds", "sd1", "long_period", "response_modification", "importance", "deflection_amplification"):
            _positive(getattr(self, name), name)
        _non_negative(self.s1, "s1")


@dataclass(frozen=True)
class Settings:
    """Project-wide analysis settings."""

    rule_set: RuleSet = RuleSet.EN1998
    load_method: LoadMethod = LoadMethod.EN1998
    eurocode8: Eurocode8Spectrum = field(default_factory=Eurocode8Spectrum)
    asce7: Asce7Spectrum = field(default_factory=Asce7Spectrum)
    base_shear_coefficient: float = 0.1
    """For the plain-coefficient method: base shear over seismic weight."""
    system_type: SystemType = SystemType.OTHER
    accidental_eccentricity: float = 0.05
    """Share of the plan dimension perpendicular to the load (EN 1998-1 §4.3.2; ASCE 7 §12.8.4.2)."""
    include_centred_case: bool = False
    """Add the wind-style load cases with no accidental eccentricity."""
    drift_limit: float = 0.005
    """Storey drift ratio limit (EN 1998-1 §4.4.3.2(a): d_r·ν ≤ 0.005 h, brittle finishes)."""
    drift_reduction: float = 0.5
    """ν of EN 1998-1 §4.4.3.2(2), applied to the design drift under the EN 1998 rule set
    (recommended 0.5 for importance classes I and II, 0.4 for III and IV)."""
    damping_ratio: float = 0.05

    def __post_init__(self) -> None:
        _non_negative(self.base_shear_coefficient, "base_shear_coefficient")
        _require(
            math.isfinite(self.accidental_eccentricity) and 0.0 <= self.accidental_eccentricity <= 0.5,
            "accidental_eccentricity",
            "must be from 0 to 0.5",
        )
        _positive(self.drift_limit, "drift_limit")
        _require(
            math.isfinite(self.drift_reduction) and 0.0 < self.drift_reduction <= 1.0,
            "drift_reduction",
            "must be above 0 and at most 1",
        )
        _require(
            math.isfinite(self.damping_ratio) and 0.0 < self.damping_ratio < 1.0,
            "damping_ratio",
            "must be above 0 and below 1",
        )


@dataclass(frozen=True)
class Project:
    """A whole building: who and what it is for, its levels and its lateral elements."""

    name: str = "Untitled"
    job_number: str = ""
    engineer: str = ""
    notes: str = ""
    revision: str = ""
    """Revision of the layout, shown in the plan sheet's title block (e.g. P1, A)."""
    settings: Settings = field(default_factory=Settings)
    levels: tuple[Level, ...] = ()
    elements: tuple[Element, ...] = ()

    def __post_init__(self) -> None:
        seen: set[str] = set()
        for i, element in enumerate(self.elements):
            path = f"elements[{i}]"
            if element.id in seen:
                raise ModelError(f"{path}.id", f"id {element.id!r} is used by another element")
            seen.add(element.id)
            if element.top > len(self.levels):
                raise ModelError(
                    f"{path}.top",
                    f"element {element.id} reaches level {element.top} but the building has {len(self.levels)}",
                )

    @property
    def elevations(self) -> tuple[float, ...]:
        """Elevation of each floor above the base, m."""
        z = 0.0
        out = []
        for level in self.levels:
            z += level.height
            out.append(z)
        return tuple(out)

    def element(self, element_id: str) -> Element:
        for element in self.elements:
            if element.id == element_id:
                return element
        raise KeyError(element_id)

    def elements_in_storey(self, storey: int) -> tuple[Element, ...]:
        """Elements that span storey ``storey`` (1-based: storey j lies below ``levels[j-1]``)."""
        return tuple(e for e in self.elements if e.bottom < storey <= e.top)

    def next_element_id(self, kind: ElementKind) -> str:
        """A fresh id such as ``W3`` for the third wall."""
        prefix = {"braced_frame": "B", "shear_wall": "W", "moment_frame": "M", "spring": "S"}[kind.value]
        used = {e.id for e in self.elements}
        n = 1
        while f"{prefix}{n}" in used:
            n += 1
        return f"{prefix}{n}"
