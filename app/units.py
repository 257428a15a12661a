"""Display units: the one place where internal kN, m, t, s values become what the screen shows.

The model keeps SI base units (kPa for moduli, m² for areas); engineers read sections in mm² and
10⁶ mm⁴, moduli in GPa, wall thickness in mm. A :class:`Quantity` converts both ways.
"""

from __future__ import annotations

import math
from dataclasses import dataclass


@dataclass(frozen=True)
class Quantity:
    """How a model value is shown: ``shown = internal × factor``, with a unit label and decimals."""

    unit: str
    factor: float = 1.0
    decimals: int = 3

    def show(self, value: float) -> str:
        """The value in display units, without trailing zeros beyond what matters."""
        shown = value * self.factor
        text = f"{shown:.{self.decimals}f}"
        if "." in text:
            text = text.rstrip("0").rstrip(".")
        return "0" if text in ("-0", "") else text

    def parse(self, text: str) -> float:
        """The internal value of typed ``text``; ValueError names what could not be read."""
        cleaned = text.strip()
        if cleaned.count(",") == 1 and "." not in cleaned:  # a decimal comma
            cleaned = cleaned.replace(",", ".")
        if self.unit and cleaned.endswith(self.unit):
            cleaned = cleaned[: -len(self.unit)].strip()
        try:
            value = float(cleaned)
        except ValueError:
            raise ValueError(f"{text!r} is not a number") from None
        if not math.isfinite(value):
            raise ValueError(f"{text!r} is not a finite number")
        return value / self.factor


LENGTH = Quantity("m", 1.0, 3)
THICKNESS = Quantity("mm", 1e3, 1)
AREA = Quantity("mm²", 1e6, 0)
INERTIA = Quantity("10⁶ mm⁴", 1e6, 2)
MODULUS = Quantity("GPa", 1e-6, 2)
STIFFNESS = Quantity("kN/m", 1.0, 0)
AREA_LOAD = Quantity("kPa", 1.0, 2)
PERCENT = Quantity("%", 100.0, 2)
PLAIN = Quantity("", 1.0, 3)
"""A dimensionless figure (ratios, factors) or a value whose unit the label states."""
DRIFT = Quantity("", 1.0, 4)
DEGREES = Quantity("°", 1.0, 2)
"""An angle already in degrees (the model keeps plan angles only as end points)."""
ACCELERATION = Quantity("g", 1.0, 3)
SECONDS = Quantity("s", 1.0, 2)


LENGTH_DECIMALS = 4
"""Typed geometry is kept to 0.1 mm (the model's length tolerance): no 8.000000000000002 in files."""
ANGLE_DECIMALS = 9
"""Typed angles are kept to 1e-9 rad before their sine and cosine are taken."""


def typed_coordinate(value: float) -> float:
    """A coordinate reached by typing, rounded to the model's 0.1 mm."""
    return round(value, LENGTH_DECIMALS) + 0.0  # + 0.0 turns -0.0 into 0.0


def polar_point(start: tuple[float, float], length: float, degrees: float) -> tuple[float, float]:
    """The point ``length`` from ``start`` at ``degrees`` counter-clockwise from +x, rounded to 0.1 mm
    (so 8 m at 90° ends at exactly 8, not at 3.67e-16 beside it)."""
    a = round(math.radians(degrees), ANGLE_DECIMALS)
    return (typed_coordinate(start[0] + length * math.cos(a)), typed_coordinate(start[1] + length * math.sin(a)))


def degrees_of(dx: float, dy: float) -> float:
    """Angle of the vector (dx, dy) in degrees, counter-clockwise from +x, in (-180, 180]."""
    return math.degrees(math.atan2(dy, dx))
