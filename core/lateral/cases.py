"""The static load cases: the inputs of the load-case response, by direction, sense and eccentricity."""

from __future__ import annotations

from dataclasses import dataclass

Direction = str
"""``"x"`` or ``"y"``: the direction of a load, of an analysis, or of a stiffness."""

DIRECTIONS: tuple[Direction, Direction] = ("x", "y")


@dataclass(frozen=True)
class LoadCase:
    """A static load case: the pattern of one direction and sense, at an eccentric point."""

    name: str
    """E.g. ``"+x, e+"``: load in +x, mass centre moved by +e (toward +y)."""
    direction: Direction
    sign: int
    """+1 or −1: the sense of the load along ``direction``."""
    eccentricity_sign: int
    """+1, −1, or 0 for the centred (wind-style) case. The mass centre moves by
    eccentricity_sign·e_a along the axis perpendicular to ``direction`` (+y for an x load, +x
    for a y load), the same sense on all floors (EN 1998-1 §4.3.2(1); ASCE 7 §12.8.4.2)."""
