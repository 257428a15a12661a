"""Element property types (sections and materials of each kind) and their defaults.

Units are kN, m, t, s (modulus in kPa).
"""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum

from core.model.bounds import count, within
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
        require(isinstance(self.bays, int) and 1 <= self.bays <= 20, "bays", "must be a whole number from 1 to 20")
        require(
            not self.tension_only or self.pattern is BracePattern.CROSS,
            "tension_only",
            "applies to the cross pattern only",
        )
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

    def __post_init__(self) -> None:
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

    def __post_init__(self) -> None:
        require(isinstance(self.bays, int) and 1 <= self.bays <= 20, "bays", "must be a whole number from 1 to 20")
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
