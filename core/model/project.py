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
from dataclasses import dataclass, field, replace
from functools import cached_property

from core.errors import ModelError
from core.model.bounds import count, text, within
from core.model.kinds import Kind, kind_of, kind_spec, storey_values
from core.model.properties import BracedFrame, ElementProperties
from core.model.settings import Settings
from core.model.validation import (
    Point,
    Ring,
    as_point,
    as_ring,
    finite_point,
    require,
    valid_ring,
)


@dataclass(frozen=True)
class Element:
    """A lateral element on a straight line in plan, spanning levels ``bottom`` to ``top``."""

    id: str
    start: Point
    end: Point
    bottom: int
    top: int
    properties: ElementProperties = field(default_factory=BracedFrame)
    active: bool = True
    """False: switched off — kept in the file and drawn faded, but left out of the analysis."""

    def __post_init__(self) -> None:
        text(self.id, "id")
        require(isinstance(self.active, bool), "active", "must be true or false")
        require(bool(self.id.strip()), "id", "must not be empty")
        finite_point(self.start, "start")
        finite_point(self.end, "end")
        object.__setattr__(self, "start", as_point(self.start))
        object.__setattr__(self, "end", as_point(self.end))
        require(isinstance(self.bottom, int) and self.bottom >= 0, "bottom", "must be a level index ≥ 0")
        require(isinstance(self.top, int) and self.top > self.bottom, "top", "must be above the bottom level")
        per_storey = storey_values(self.properties)
        if per_storey:
            require(
                len(per_storey) == self.storey_count,
                f"properties.{kind_spec(self.kind).storey_values}",
                f"needs {self.storey_count} values (one per storey spanned), got {len(per_storey)}",
            )

    @property
    def kind(self) -> Kind:
        """The registered kind of the element's properties (:mod:`core.model.kinds`)."""
        return kind_of(self.properties)

    @cached_property
    def length(self) -> float:
        """Kept once computed (the analysis asks for it many times per element)."""
        return math.dist(self.start, self.end)

    @property
    def storey_count(self) -> int:
        return self.top - self.bottom

    @cached_property
    def direction(self) -> Point:
        """Unit vector from start to end (undefined for a zero-length line: (1, 0)); kept once computed."""
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
        within(self.mass, "point_mass", "mass")
        finite_point(self.position, "position")
        text(self.label, "label")
        object.__setattr__(self, "position", as_point(self.position))


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
        text(self.name, "name")
        require(bool(self.name.strip()), "name", "must not be empty")
        within(self.height, "storey_height", "height")
        count(self.openings, "openings", "openings")
        count(self.point_masses, "point_masses", "point_masses")
        outer = valid_ring(self.outline, "outline")
        object.__setattr__(self, "outline", as_ring(self.outline))
        object.__setattr__(self, "openings", tuple(as_ring(o) for o in self.openings))
        for i, opening in enumerate(self.openings):
            hole = valid_ring(opening, f"openings[{i}]")
            require(outer.contains(hole), f"openings[{i}]", "opening must lie inside the outline")
        within(self.seismic_weight, "seismic_weight", "seismic_weight")


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
        for name in ("name", "job_number", "engineer", "notes", "revision"):
            text(getattr(self, name), name)
        count(self.levels, "levels", "levels")
        count(self.elements, "elements", "elements")
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

    def active_part(self) -> Project:
        """The project as analysed: without its switched-off elements (itself if there are none)."""
        if all(e.active for e in self.elements):
            return self
        return replace(self, elements=tuple(e for e in self.elements if e.active))

    def elements_in_storey(self, storey: int) -> tuple[Element, ...]:
        """Elements that span storey ``storey`` (1-based: storey j lies below ``levels[j-1]``)."""
        return tuple(e for e in self.elements if e.bottom < storey <= e.top)

    def next_element_id(self, kind: Kind) -> str:
        """A fresh id such as ``W3`` for the third wall: the kind's prefix and the first free number."""
        prefix = kind_spec(kind).id_prefix
        used = {e.id for e in self.elements}
        n = 1
        while f"{prefix}{n}" in used:
            n += 1
        return f"{prefix}{n}"
