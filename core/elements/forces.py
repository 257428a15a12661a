"""What an element's members carry under given floor displacements: the figures to size them by.

Signs follow the element's line: a floor load or displacement is positive along the line, from
the element's start towards its end. Storeys are counted from the element's bottom (row 0 is its
lowest storey); axial forces are tension positive.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Protocol

from core.arrays import FloatArray


@dataclass(frozen=True)
class ElementForces:
    """Member forces of one element; arrays are read-only, None where a kind has no such member."""

    storey_shear: FloatArray
    """(n,) kN. Horizontal shear the element carries in each storey, positive when it resists
    loads acting + along the line (for a shear wall: the wall's shear at the base of each storey)."""
    overturning_moment: FloatArray
    """(n,) kN·m. Moment the element carries at the base of each storey, equal to
    Σ_(k ≥ i) F_k (z_k − z_(i−1)) for floor loads F (for a shear wall: the wall's bending moment
    at the base of each storey, positive when its start-side face is in tension; for a frame: the
    couple of its column and brace forces there)."""
    brace_axial: FloatArray | None = None
    """Braced frames, (n, braces per storey) kN, tension positive. Per storey the braces are listed
    bay by bay from the start of the line: single — the one diagonal; cross — [rising, falling]
    (rising = from a bay's lower start-side corner to its upper far corner); cross tension-only —
    the rising one; chevron — [start-side, far-side]."""
    column_axial: FloatArray | None = None
    """Braced and moment frames, (n, bays + 1) kN, tension positive, column lines from the start of
    the line; row 0 holds the forces at the base."""
    column_moment: FloatArray | None = None
    """Moment frames, (n, bays + 1) kN·m: the larger of the two end moments (magnitude) of each
    column in each storey."""
    beam_moment: FloatArray | None = None
    """Moment frames, (n, bays, 2) kN·m: end moments [start-side, far-side] of the beam of each bay
    at the floor on top of each storey, sagging positive (tension in the bottom fibre)."""


class CondensedElement(Protocol):
    """A planar element model condensed to its floors' lateral DOFs."""

    @property
    def stiffness(self) -> FloatArray:
        """n × n lateral stiffness, kN/m (read-only)."""
        ...

    def forces(self, displacements: FloatArray) -> ElementForces:
        """Member forces for floor displacements (n,) along the line relative to the bottom."""
        ...
