"""The physical ranges the model accepts: one table, limits no real building reaches.

Every number of a project is checked against its row here when the object is built, so a value
outside its range is refused with the field's path before any computation sees it. The limits are
wide enough for any building Poise is meant for and narrow enough that nothing computed from
valid input overflows, divides by zero or loses all its digits (products of the largest
coordinates, moduli and section figures stay many orders below the float range). They are our
own choice (common practice, no source); DEVELOPERS.md carries the same table.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from core.errors import ModelError


@dataclass(frozen=True)
class Bound:
    """An accepted range [low, high] in the model's units; ``zero`` also lets exactly 0 through."""

    low: float
    high: float
    unit: str
    zero: bool = False

    def describe(self, low: str = "", high: str = "", unit: str | None = None) -> str:
        """'from 0.1 to 200 m', or the same with the ends and unit as a view shows them."""
        unit = self.unit if unit is None else unit
        span = f"from {low or f'{self.low:g}'} to {high or f'{self.high:g}'}{f' {unit}' if unit else ''}"
        return f"0 or {span}" if self.zero else span


class OutOfRangeError(ModelError):
    """A number outside its row of :data:`BOUNDS`; ``bound`` lets a view restate the range in
    its own display units."""

    def __init__(self, path: str, message: str, bound: Bound) -> None:
        super().__init__(path, message)
        self.bound = bound


BOUNDS: dict[str, Bound] = {
    "coordinate": Bound(-1.0e5, 1.0e5, "m"),
    "storey_height": Bound(0.1, 200.0, "m"),
    "seismic_weight": Bound(0.01, 500.0, "kPa", zero=True),
    "point_mass": Bound(1.0e-3, 1.0e6, "t"),
    "modulus": Bound(1.0e3, 1.0e10, "kPa"),
    "section_area": Bound(1.0e-6, 1.0e4, "m²"),
    "second_moment": Bound(1.0e-15, 1.0e7, "m⁴"),
    "thickness": Bound(1.0e-3, 10.0, "m"),
    "shape_dimension": Bound(5.0e-4, 5.0, "m"),
    "spring_stiffness": Bound(1.0e-6, 1.0e13, "kN/m"),
    "poisson": Bound(0.0, 0.49, ""),
    "stiffness_factor": Bound(1.0e-3, 1.0, ""),
    "ground_acceleration": Bound(1.0e-3, 5.0, "g"),
    "behaviour_factor": Bound(1.0, 10.0, ""),
    "lower_bound_factor": Bound(0.0, 1.0, ""),
    "spectral_acceleration": Bound(1.0e-3, 10.0, "g"),
    "spectral_acceleration_s1": Bound(0.0, 10.0, "g"),
    "long_period": Bound(0.1, 100.0, "s"),
    "response_modification": Bound(1.0, 10.0, ""),
    "importance": Bound(0.5, 2.0, ""),
    "deflection_amplification": Bound(1.0, 10.0, ""),
    "base_shear_coefficient": Bound(0.0, 5.0, ""),
    "accidental_eccentricity": Bound(0.0, 0.5, ""),
    "drift_limit": Bound(1.0e-4, 0.1, ""),
    "drift_reduction": Bound(0.01, 1.0, ""),
    "gravity_factor": Bound(0.1, 5.0, ""),
}
"""Range of each kind of number (the row names are what :func:`within` takes)."""

COUNTS = {"levels": 500, "elements": 20_000, "points": 10_000, "openings": 1_000, "point_masses": 10_000}
"""Most entries a list of the model may hold: levels, elements, points of one outline, openings
and point masses of one level."""

TEXT_LENGTH = 10_000
"""Most characters in one text field (a name, an id, the notes)."""

FILE_SIZE = 64 * 1024 * 1024
"""Largest ``.poise`` file read, bytes (a 500-level, 20,000-element project is a few MB)."""

NESTING = 16
"""Deepest nesting of lists and objects a ``.poise`` file may have (a valid one has 6)."""


def within(value: float, row: str, path: str) -> None:
    """Refuse ``value`` at ``path`` unless it is a finite number in the range of ``row``."""
    bound = BOUNDS[row]
    if isinstance(value, bool) or not isinstance(value, int | float):
        raise ModelError(path, f"must be a number, got {value!r}")
    try:
        finite = math.isfinite(value)
    except OverflowError:
        finite = False
    if finite and (bound.low <= value <= bound.high or (bound.zero and value == 0)):
        return
    raise OutOfRangeError(path, f"must be {bound.describe()}, got {_short(value)}", bound)


def count(items: tuple[object, ...], row: str, path: str) -> None:
    """Refuse a list at ``path`` with more entries than ``COUNTS[row]``."""
    if len(items) > COUNTS[row]:
        raise ModelError(path, f"holds {len(items)} entries; at most {COUNTS[row]} are accepted")


def text(value: object, path: str) -> None:
    """Refuse text that is not a string, is too long, or cannot be written as UTF-8."""
    if not isinstance(value, str):
        raise ModelError(path, f"must be text, got {_short(value)}")
    if len(value) > TEXT_LENGTH:
        raise ModelError(path, f"is {len(value)} characters long; at most {TEXT_LENGTH} are accepted")
    try:
        value.encode("utf-8")
    except UnicodeEncodeError as error:
        raise ModelError(
            path, f"holds a character that cannot be stored (code {ord(value[error.start]):#06x} at {error.start})"
        ) from None


def _short(value: object) -> str:
    """``repr(value)`` cut to a readable length (a huge number or text stays one short line)."""
    try:
        shown = repr(value)
    except ValueError:  # an int too long to print
        return "a number too long to show"
    return shown if len(shown) <= 40 else shown[:37] + "…"
