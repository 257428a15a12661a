"""Generic steel member shapes, their area and second moment computed from their dimensions.

A shape is named by its family and its dimensions in millimetres, the way engineers write them:
``SHS 150×8`` (square hollow, side × wall), ``RHS 200×100×8`` (rectangular hollow, depth × width ×
wall, bending about the strong axis), ``CHS 168.3×8`` (circular hollow, diameter × wall) and
``I 300×150×10×7`` (doubly symmetric I, depth × flange width × flange × web thickness). The
figures are those of the idealised thin-walled outline — sharp corners, no root fillets, no
corner radii — from the plane-section formulas (e.g. Roark's Formulas for Stress and Strain,
Table A.1): rolled and cold-formed sections of the same nominal size differ by a few per cent,
which is inside what a concept-stage estimate resolves. ``CATALOGUE`` is a list of such generic
sizes to choose from; any other dimensions may be typed.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from enum import StrEnum

from core.errors import ModelError
from core.model.bounds import BOUNDS

MM = 1.0e-3
"""Designations give dimensions in millimetres; the model works in metres."""


class ShapeFamily(StrEnum):
    """The generic outlines a designation may name."""

    SHS = "SHS"
    """Square hollow section: side b, wall t."""
    RHS = "RHS"
    """Rectangular hollow section: depth h, width b, wall t (bending about the axis parallel to b)."""
    CHS = "CHS"
    """Circular hollow section: outside diameter d, wall t."""
    I = "I"
    """Doubly symmetric I section: depth h, flange width b, flange thickness t_f, web thickness t_w."""


_DIMENSIONS = {ShapeFamily.SHS: 2, ShapeFamily.RHS: 3, ShapeFamily.CHS: 2, ShapeFamily.I: 4}
_NAMES = {
    ShapeFamily.SHS: "side × wall",
    ShapeFamily.RHS: "depth × width × wall",
    ShapeFamily.CHS: "diameter × wall",
    ShapeFamily.I: "depth × flange width × flange × web",
}
_PATTERN = re.compile(r"^\s*([A-Za-z]+)\s*([\d.]+(?:\s*[x×*]\s*[\d.]+)*)\s*$")


@dataclass(frozen=True)
class SteelShape:
    """A generic steel shape; ``dimensions`` in metres, in the order its family lists them."""

    family: ShapeFamily
    dimensions: tuple[float, ...]

    @property
    def designation(self) -> str:
        """The shape's name, dimensions in mm (``SHS 150×8``)."""
        return f"{self.family.value} " + "×".join(f"{d / MM:g}" for d in self.dimensions)

    @property
    def area(self) -> float:
        """Cross-section area, m²."""
        f, d = self.family, self.dimensions
        if f is ShapeFamily.SHS:
            b, t = d
            return b * b - (b - 2 * t) ** 2
        if f is ShapeFamily.RHS:
            h, b, t = d
            return h * b - (h - 2 * t) * (b - 2 * t)
        if f is ShapeFamily.CHS:
            D, t = d
            return math.pi / 4 * (D * D - (D - 2 * t) ** 2)
        h, b, tf, tw = d
        return 2 * b * tf + (h - 2 * tf) * tw

    @property
    def inertia(self) -> float:
        """Second moment of area about the strong (bending) axis, m⁴."""
        f, d = self.family, self.dimensions
        if f is ShapeFamily.SHS:
            b, t = d
            return (b**4 - (b - 2 * t) ** 4) / 12
        if f is ShapeFamily.RHS:
            h, b, t = d
            return (b * h**3 - (b - 2 * t) * (h - 2 * t) ** 3) / 12
        if f is ShapeFamily.CHS:
            D, t = d
            return math.pi / 64 * (D**4 - (D - 2 * t) ** 4)
        h, b, tf, tw = d
        return (b * h**3 - (b - tw) * (h - 2 * tf) ** 3) / 12


def steel_shape(designation: str, path: str = "") -> SteelShape:
    """The shape ``designation`` names; ModelError at ``path`` saying what a valid name looks like."""
    match = _PATTERN.match(designation)
    example = "e.g. SHS 150×8, RHS 200×100×8, CHS 168.3×8 or I 300×150×10×7 (mm)"
    if match is None:
        raise ModelError(path, f"{designation!r} is not a section name; {example}")
    try:
        family = ShapeFamily(match.group(1).upper())
    except ValueError:
        raise ModelError(path, f"unknown section family {match.group(1)!r}; {example}") from None
    try:
        values = [float(v) for v in re.split(r"\s*[x×*]\s*", match.group(2))]
    except ValueError:
        raise ModelError(path, f"{designation!r} is not a section name; {example}") from None
    if len(values) != _DIMENSIONS[family]:
        raise ModelError(path, f"{family.value} needs {_NAMES[family]} in mm, got {designation!r}")
    d = [v * MM for v in values]
    bound = BOUNDS["shape_dimension"]
    if not all(bound.low <= v <= bound.high for v in d):
        limits = f"from {bound.low / MM:g} to {bound.high / MM:g} mm"
        raise ModelError(path, f"dimensions of {designation!r} must be {limits}")
    if family is ShapeFamily.RHS:
        walls_fit = 2 * d[2] < min(d[0], d[1])
    elif family is ShapeFamily.I:
        walls_fit = 2 * d[2] < d[0] and d[3] < d[1]
    else:
        walls_fit = 2 * d[1] < d[0]
    if not walls_fit:
        raise ModelError(path, f"the walls of {designation!r} are too thick for its outline")
    return SteelShape(family, tuple(d))


def _sizes(family: str, rows: tuple[tuple[float, ...], ...]) -> tuple[str, ...]:
    return tuple(f"{family} " + "×".join(f"{v:g}" for v in row) for row in rows)


CATALOGUE: tuple[str, ...] = (
    _sizes("SHS", ((80, 5), (100, 6), (120, 8), (150, 8), (150, 10), (180, 10), (200, 10), (250, 12), (300, 12)))
    + _sizes("RHS", ((150, 100, 6), (200, 100, 8), (250, 150, 10), (300, 200, 10), (400, 200, 12)))
    + _sizes("CHS", ((114.3, 6), (139.7, 8), (168.3, 8), (219.1, 10), (273, 10), (323.9, 12)))
    + _sizes(
        "I",
        (
            (200, 100, 8, 5.5),
            (300, 150, 10, 7),
            (400, 180, 13, 8.5),
            (500, 200, 16, 10),
            (300, 300, 19, 11),
            (400, 300, 24, 13.5),
            (500, 300, 28, 14.5),
            (600, 300, 30, 15.5),
        ),
    )
)
"""Generic sizes offered in the section choice (our own round dimensions, no maker's table)."""
