"""Continuous lines and transfers: which elements stand on which, in plan and in height.

Elements of one kind on the same plan segment (both ends within ``LINE_TOLERANCE``, either way
round), both switched on or both off, whose levels touch (the upper one's bottom is the lower one's top) are one lateral line:
:func:`join_stacked` merges each such stack into its lowest element, spanning all its storeys, with
each storey keeping its own section. The editor does this on every committed edit, so a wall drawn
in two pieces is analysed as one cantilever, never as two with a fixed base between them.

An element that starts above the base is analysed with its base fixed on the floor it stands on
(the documented model). With nothing of its kind continuing beneath it, it is a *transfer*: the
floor and whatever is below must carry its forces across. :func:`transfers` names every such
element with the level and what, if anything, is beneath it — also a stack left as two elements
(a file written by a script), whose fixed base between them makes the line too stiff.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass
from typing import Any

from core.model.kinds import kind_of, kind_spec, storey_value_type
from core.model.project import Element, Project

LINE_TOLERANCE = 0.05
"""Ends of two elements this close (m) are the same point of one line (common practice, no
source: well inside a wall's thickness, well beyond a typed coordinate's rounding)."""


def same_segment(a: Element, b: Element, tolerance: float = LINE_TOLERANCE) -> bool:
    """Whether ``a`` and ``b`` lie on the same plan segment, either way round."""
    return (math.dist(a.start, b.start) <= tolerance and math.dist(a.end, b.end) <= tolerance) or (
        math.dist(a.start, b.end) <= tolerance and math.dist(a.end, b.start) <= tolerance
    )


def overlap(a: Element, b: Element, tolerance: float = LINE_TOLERANCE) -> float:
    """Length of ``a`` that ``b`` covers in plan (0 unless the two lie on one straight line)."""
    (c, s), length = a.direction, a.length
    if length == 0.0:
        return 0.0

    def along(p: tuple[float, float]) -> float:
        return (p[0] - a.start[0]) * c + (p[1] - a.start[1]) * s

    def off(p: tuple[float, float]) -> float:
        return abs(-(p[0] - a.start[0]) * s + (p[1] - a.start[1]) * c)

    if off(b.start) > tolerance or off(b.end) > tolerance:
        return 0.0
    low, high = sorted((along(b.start), along(b.end)))
    return max(0.0, min(high, length) - max(low, 0.0))


def _sections(properties: Any, storeys: int) -> list[Any]:
    """One value per storey: the per-storey ones, or the element's own section repeated."""
    spec = kind_spec(kind_of(properties))
    name = spec.storey_values
    assert name is not None
    values = list(getattr(properties, name))
    if values:
        return values
    value_type = storey_value_type(spec.kind)
    assert value_type is not None and dataclasses.is_dataclass(value_type)
    section = value_type(**{f.name: getattr(properties, f.name) for f in dataclasses.fields(value_type)})
    return [section] * storeys


def joined_properties(lower: Element, upper: Element) -> Any | None:
    """The properties of one element spanning ``lower``'s storeys and then ``upper``'s, each with
    its own section; None when the two differ in something that is not per storey (modulus, bays,
    pattern …), so they cannot be one planar model."""
    a: Any = lower.properties
    b: Any = upper.properties
    if type(a) is not type(b):
        return None
    spec = kind_spec(lower.kind)
    name = spec.storey_values
    if name is None:
        return a if a == b else None
    value_type = storey_value_type(spec.kind)
    if value_type is not None and dataclasses.is_dataclass(value_type):
        section_fields = {f.name: getattr(b, f.name) for f in dataclasses.fields(value_type)}
        if dataclasses.replace(a, **{name: ()}, **section_fields) != dataclasses.replace(b, **{name: ()}):
            return None
        if not getattr(a, name) and not getattr(b, name) and a == b:
            return a  # the same section throughout stays "same for all"
    elif dataclasses.replace(a, **{name: getattr(b, name)}) != b:
        return None
    values = _sections(a, lower.storey_count) + _sections(b, upper.storey_count)
    return dataclasses.replace(a, **{name: tuple(values)})


def join_stacked(project: Project) -> tuple[Project, dict[str, str]]:
    """``project`` with every stack of same-kind elements on one segment merged into its lowest
    element, and which id went into which (upper → lower). Unchanged (and an empty map) when
    nothing is stacked; stacks that cannot be one model (:func:`joined_properties`) stay apart."""
    if all(e.bottom == 0 for e in project.elements):
        return project, {}
    merged: dict[str, Element] = {}
    ending: dict[int, list[str]] = {}
    """Ids of the merged elements by the level they reach now."""
    absorbed: dict[str, str] = {}
    for element in sorted(project.elements, key=lambda e: e.bottom):
        host = next(
            (
                merged[i]
                for i in ending.get(element.bottom, [])
                if merged[i].kind == element.kind
                and merged[i].active == element.active
                and same_segment(merged[i], element)
                and joined_properties(merged[i], element) is not None
            ),
            None,
        )
        properties = None if host is None else joined_properties(host, element)
        if host is None or properties is None:
            merged[element.id] = element
            ending.setdefault(element.top, []).append(element.id)
            continue
        ending[host.top].remove(host.id)
        merged[host.id] = dataclasses.replace(host, top=element.top, properties=properties)
        ending.setdefault(element.top, []).append(host.id)
        absorbed[element.id] = host.id
    if not absorbed:
        return project, {}
    elements = tuple(merged[e.id] for e in project.elements if e.id in merged)
    return dataclasses.replace(project, elements=elements), absorbed


@dataclass(frozen=True)
class Transfer:
    """An element starting on a floor without its kind continuing beneath it as one model: its
    base is fixed on that floor."""

    element: str
    level: int
    """The level index it stands on (1 = the first floor)."""
    level_name: str
    beneath: tuple[str, ...]
    """The elements under its line in the storey below (any kind); empty when nothing is."""
    stacked_on: str | None = None
    """The element of its kind on the same segment that ends where it starts, if any: the two are
    one line kept as two elements (joinable, or differing in more than their sections)."""
    joinable: bool = False
    """Whether it and ``stacked_on`` could be one element (:func:`join_stacked` would merge them)."""

    @property
    def message(self) -> str:
        """What the warning says: the element, the level and what it stands on."""
        base = f"analysed with its base fixed on {self.level_name}"
        if self.stacked_on is not None:
            why = "join them into one element" if self.joinable else "they differ in more than their sections"
            return f"{self.element} is stacked on {self.stacked_on} as a separate element, {base} (too stiff): {why}"
        what = "nothing beneath it" if not self.beneath else f"only {', '.join(self.beneath)} beneath it"
        return f"{self.element} starts on {self.level_name} with {what}: a transfer, {base}"


def transfers(project: Project) -> tuple[Transfer, ...]:
    """Every element that starts above the base, in the project's order: each has its base fixed
    on a floor, so each is a transfer or a line split in two."""
    found = []
    for element in project.elements:
        if element.bottom == 0:
            continue
        below = [e for e in project.elements if e.bottom < element.bottom <= e.top]
        stacked = next(
            (e for e in below if e.top == element.bottom and e.kind == element.kind and same_segment(e, element)),
            None,
        )
        found.append(
            Transfer(
                element=element.id,
                level=element.bottom,
                level_name=project.levels[element.bottom - 1].name,
                beneath=tuple(e.id for e in below if overlap(element, e) > LINE_TOLERANCE),
                stacked_on=None if stacked is None else stacked.id,
                joinable=stacked is not None and joined_properties(stacked, element) is not None,
            )
        )
    return tuple(found)
