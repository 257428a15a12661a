"""Element property types (sections and materials of each kind) and their defaults.

Units are kN, m, t, s (modulus in kPa).
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from enum import StrEnum
from typing import Any, TypeVar

from core.errors import ModelError
from core.model.bounds import count, within
from core.model.sections import steel_shape
from core.model.validation import require

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


# ---------------------------------------------------------------- sections per storey


def _shape_sets(obj: object, shape: str, area: str, inertia: str | None = None) -> None:
    """When ``obj``'s field ``shape`` names a steel shape, that shape sets its ``area`` (and
    ``inertia``): the designation is the input, the figures follow from its dimensions."""
    designation = getattr(obj, shape)
    require(isinstance(designation, str), shape, "must be a section name or empty")
    if designation.strip():
        section = steel_shape(designation, shape)
        object.__setattr__(obj, shape, section.designation)
        object.__setattr__(obj, area, section.area)
        if inertia is not None:
            object.__setattr__(obj, inertia, section.inertia)
    else:
        object.__setattr__(obj, shape, "")


@dataclass(frozen=True)
class BraceStorey:
    """The sections of a braced frame in one storey."""

    brace_area: float = 3.0e-3
    column_area: float = 1.2e-2
    brace_shape: str = ""
    """A generic steel shape (``CHS 168.3×8``) that sets ``brace_area``; empty when typed."""
    column_shape: str = ""
    """A generic steel shape that sets ``column_area``; empty when typed."""

    def __post_init__(self) -> None:
        _shape_sets(self, "brace_shape", "brace_area")
        _shape_sets(self, "column_shape", "column_area")
        within(self.brace_area, "section_area", "brace_area")
        within(self.column_area, "section_area", "column_area")


@dataclass(frozen=True)
class WallStorey:
    """The section of a shear wall in one storey."""

    thickness: float = 0.25
    stiffness_factor: float = CRACKED_FACTOR

    def __post_init__(self) -> None:
        within(self.thickness, "thickness", "thickness")
        within(self.stiffness_factor, "stiffness_factor", "stiffness_factor")


@dataclass(frozen=True)
class FrameStorey:
    """The member sizes of a moment frame in one storey: its columns and the beams on top of it."""

    column_inertia: float = 2.5e-4
    column_area: float = 1.5e-2
    beam_inertia: float = 3.4e-4
    beam_area: float = 1.0e-2
    column_shape: str = ""
    """A generic steel shape (``I 300×300×19×11``) that sets the column's area and inertia."""
    beam_shape: str = ""
    """A generic steel shape that sets the beam's area and inertia."""

    def __post_init__(self) -> None:
        _shape_sets(self, "column_shape", "column_area", "column_inertia")
        _shape_sets(self, "beam_shape", "beam_area", "beam_inertia")
        for name in ("column_area", "beam_area"):
            within(getattr(self, name), "section_area", name)
        for name in ("column_inertia", "beam_inertia"):
            within(getattr(self, name), "second_moment", name)


StoreySection = BraceStorey | WallStorey | FrameStorey
_S = TypeVar("_S", BraceStorey, WallStorey, FrameStorey)


def uniform_section(properties: Any, storey_type: type[_S]) -> _S:
    """The one section of ``properties`` that holds for all its storeys ("same for all")."""
    return storey_type(**{f.name: getattr(properties, f.name) for f in dataclasses.fields(storey_type)})


def _settle_storeys(properties: Any, storey_type: type) -> None:
    """Check the per-storey sections of ``properties``; when there are some, the element's own
    section fields hold its lowest storey's values (kept in step, so they never mislead)."""
    storeys = properties.storeys
    require(isinstance(storeys, tuple | list), "storeys", "must be a list of per-storey sections")
    object.__setattr__(properties, "storeys", tuple(storeys))
    count(properties.storeys, "levels", "storeys")
    for i, section in enumerate(properties.storeys):
        if not isinstance(section, storey_type):
            raise ModelError(f"storeys[{i}]", f"must be a {storey_type.__name__}")
    if properties.storeys:
        lowest = properties.storeys[0]
        for f in dataclasses.fields(storey_type):
            object.__setattr__(properties, f.name, getattr(lowest, f.name))


def storey_sections(properties: Any, storey_type: type[_S], storeys: int) -> tuple[_S, ...]:
    """The section of each of ``storeys`` storeys, bottom up: the per-storey ones, or the uniform
    one repeated. ModelError when per-storey sections are given for another number of storeys."""
    given: tuple[_S, ...] = properties.storeys
    if not given:
        return (uniform_section(properties, storey_type),) * storeys
    if len(given) != storeys:
        raise ModelError("storeys", f"needs {storeys} sections (one per storey spanned), got {len(given)}")
    return given


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
    brace_shape: str = ""
    """A generic steel shape that sets ``brace_area``; empty when the area is typed."""
    column_shape: str = ""
    """A generic steel shape that sets ``column_area``; empty when the area is typed."""
    storeys: tuple[BraceStorey, ...] = ()
    """Brace and column sections storey by storey, bottom up; empty: the same in all storeys."""

    def __post_init__(self) -> None:
        require(isinstance(self.bays, int) and 1 <= self.bays <= 20, "bays", "must be a whole number from 1 to 20")
        require(
            not self.tension_only or self.pattern is BracePattern.CROSS,
            "tension_only",
            "applies to the cross pattern only",
        )
        _settle_storeys(self, BraceStorey)
        _shape_sets(self, "brace_shape", "brace_area")
        _shape_sets(self, "column_shape", "column_area")
        within(self.modulus, "modulus", "modulus")
        for name in ("brace_area", "column_area", "beam_area"):
            within(getattr(self, name), "section_area", name)
        within(self.beam_inertia, "second_moment", "beam_inertia")


@dataclass(frozen=True)
class ShearWall:
    """A plane wall, modelled as a Timoshenko cantilever (flexure and shear) fixed at its base."""

    thickness: float = 0.25
    modulus: float = CONCRETE_E
    poisson: float = 0.2
    stiffness_factor: float = CRACKED_FACTOR
    """Share of the gross flexural and shear stiffness that is effective after cracking."""
    storeys: tuple[WallStorey, ...] = ()
    """Thickness and cracking factor storey by storey, bottom up; empty: the same in all storeys."""

    def __post_init__(self) -> None:
        _settle_storeys(self, WallStorey)
        within(self.thickness, "thickness", "thickness")
        within(self.modulus, "modulus", "modulus")
        within(self.poisson, "poisson", "poisson")
        within(self.stiffness_factor, "stiffness_factor", "stiffness_factor")


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
    column_shape: str = ""
    """A generic steel shape that sets the columns' area and inertia; empty when they are typed."""
    beam_shape: str = ""
    """A generic steel shape that sets the beams' area and inertia; empty when they are typed."""
    storeys: tuple[FrameStorey, ...] = ()
    """Column and beam sizes storey by storey, bottom up; empty: the same in all storeys."""

    def __post_init__(self) -> None:
        require(isinstance(self.bays, int) and 1 <= self.bays <= 20, "bays", "must be a whole number from 1 to 20")
        _settle_storeys(self, FrameStorey)
        _shape_sets(self, "column_shape", "column_area", "column_inertia")
        _shape_sets(self, "beam_shape", "beam_area", "beam_inertia")
        within(self.modulus, "modulus", "modulus")
        for name in ("column_area", "beam_area"):
            within(getattr(self, name), "section_area", name)
        for name in ("column_inertia", "beam_inertia"):
            within(getattr(self, name), "second_moment", name)
        within(self.stiffness_factor, "stiffness_factor", "stiffness_factor")


@dataclass(frozen=True)
class Spring:
    """A lateral line with storey stiffnesses the user gives, kN/m, one per storey spanned."""

    storey_stiffness: tuple[float, ...] = (1.0e5,)

    def __post_init__(self) -> None:
        require(len(self.storey_stiffness) >= 1, "storey_stiffness", "needs one value per storey")
        count(self.storey_stiffness, "levels", "storey_stiffness")
        for i, k in enumerate(self.storey_stiffness):
            within(k, "spring_stiffness", f"storey_stiffness[{i}]")


ElementProperties = BracedFrame | ShearWall | MomentFrame | Spring


class ElementKind(StrEnum):
    """The names of the built-in element kinds (more may be registered: :mod:`core.model.kinds`)."""

    BRACED_FRAME = "braced_frame"
    SHEAR_WALL = "shear_wall"
    MOMENT_FRAME = "moment_frame"
    SPRING = "spring"


def steel_or_concrete_wall(material: Material | None) -> ShearWall:
    """A concrete wall (cracked, EN 1998-1 §4.3.1(7)), or a steel plate wall for steel."""
    if material is Material.STEEL:
        return ShearWall(thickness=0.012, modulus=STEEL_E, poisson=0.3, stiffness_factor=1.0)
    return ShearWall()


def steel_or_concrete_frame(material: Material | None) -> MomentFrame:
    """A steel moment frame, or a cracked concrete one of 600 mm columns and 400 × 700 beams."""
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
