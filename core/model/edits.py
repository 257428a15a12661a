"""Pure model edits: each builds a new, validated Project (or Element, Level) from an old one.

The model is frozen, so an edit builds new objects and validation runs on the way; an invalid
edit raises ModelError and changes nothing. The editor wraps each edit in one undo step
(app/commands.py); scripts and tests call them directly.
"""

from __future__ import annotations

import dataclasses
import math
import re
from collections.abc import Iterable
from typing import Any

from core.errors import ModelError
from core.model.kinds import Kind, default_properties, resized, storey_inserted, storey_removed
from core.model.project import Element, Level, Project
from core.model.validation import Point, Ring

# ------------------------------------------------------------------ generic field paths

_PATH_PART = re.compile(r"([A-Za-z_][A-Za-z0-9_]*)|\[(\d+)\]")


def _parts(path: str) -> list[str | int]:
    parts: list[str | int] = []
    for name, index in _PATH_PART.findall(path):
        parts.append(name if name else int(index))
    return parts


def get_path(obj: Any, path: str) -> Any:
    """The value at ``path`` (``settings.eurocode8.ag``, ``start[0]``) inside a model object."""
    for part in _parts(path):
        obj = obj[part] if isinstance(part, int) else getattr(obj, part)
    return obj


def set_path(obj: Any, path: str, value: Any) -> Any:
    """A copy of ``obj`` with ``value`` at ``path``; every object on the way is rebuilt and validated."""
    return _set_parts(obj, _parts(path), value)


def _set_parts(obj: Any, parts: list[str | int], value: Any) -> Any:
    if not parts:
        return value
    head, rest = parts[0], parts[1:]
    if isinstance(head, int):
        items = list(obj)
        items[head] = _set_parts(items[head], rest, value)
        return tuple(items)
    return dataclasses.replace(obj, **{head: _set_parts(getattr(obj, head), rest, value)})


# ------------------------------------------------------------------ elements


def new_element(project: Project, kind: Kind, start: Point, end: Point, bottom: int, top: int) -> Element:
    """An element of ``kind`` with the kind's default properties and a fresh id."""
    properties = default_properties(kind, storeys=top - bottom)
    return Element(project.next_element_id(kind), _point(start), _point(end), bottom, top, properties)


def add_elements(project: Project, elements: Iterable[Element]) -> Project:
    return dataclasses.replace(project, elements=(*project.elements, *elements))


def remove_elements(project: Project, ids: Iterable[str]) -> Project:
    gone = set(ids)
    return dataclasses.replace(project, elements=tuple(e for e in project.elements if e.id not in gone))


def replace_elements(project: Project, changed: Iterable[Element]) -> Project:
    """``project`` with the elements of the same ids replaced, order kept."""
    by_id = {e.id: e for e in changed}
    return dataclasses.replace(project, elements=tuple(by_id.get(e.id, e) for e in project.elements))


def switch_elements(project: Project, ids: Iterable[str], active: bool) -> Project:
    """``project`` with the elements ``ids`` switched on or off (kept in the project either way)."""
    wanted = set(ids)
    return dataclasses.replace(
        project,
        elements=tuple(dataclasses.replace(e, active=active) if e.id in wanted else e for e in project.elements),
    )


def _point(p: tuple[float, float]) -> Point:
    return (float(p[0]), float(p[1]))


def move_elements(project: Project, ids: Iterable[str], dx: float, dy: float) -> Project:
    ids = set(ids)
    moved = [
        dataclasses.replace(e, start=(e.start[0] + dx, e.start[1] + dy), end=(e.end[0] + dx, e.end[1] + dy))
        for e in project.elements
        if e.id in ids
    ]
    return replace_elements(project, moved)


def rotate_elements(project: Project, ids: Iterable[str], quarter_turns: int = 1) -> Project:
    """Turn the elements by 90° steps counter-clockwise about the centre of their bounding box."""
    chosen = [e for e in project.elements if e.id in set(ids)]
    if not chosen:
        return project
    xs = [c for e in chosen for c in (e.start[0], e.end[0])]
    ys = [c for e in chosen for c in (e.start[1], e.end[1])]
    cx, cy = (min(xs) + max(xs)) / 2, (min(ys) + max(ys)) / 2
    c, s = [(1, 0), (0, 1), (-1, 0), (0, -1)][quarter_turns % 4]

    def turn(p: Point) -> Point:
        x, y = p[0] - cx, p[1] - cy
        return (cx + c * x - s * y, cy + s * x + c * y)

    return replace_elements(project, [dataclasses.replace(e, start=turn(e.start), end=turn(e.end)) for e in chosen])


def set_element_end(element: Element, which: str, point: Point) -> Element:
    """The element with its ``start`` or ``end`` moved to ``point``."""
    if which == "start":
        return dataclasses.replace(element, start=_point(point))
    if which == "end":
        return dataclasses.replace(element, end=_point(point))
    raise ValueError(f"which must be 'start' or 'end', got {which!r}")


def set_length_and_angle(element: Element, length: float, angle_degrees: float) -> Element:
    """The element from its start point with the given length (m) and angle (°, from +x)."""
    if not (math.isfinite(length) and length > 0):
        raise ModelError("length", f"must be a positive number, got {length!r}")
    a = math.radians(angle_degrees)
    x, y = element.start
    return dataclasses.replace(element, end=(x + length * math.cos(a), y + length * math.sin(a)))


def respan(element: Element, bottom: int, top: int) -> Element:
    """The element over levels ``bottom``..``top``; per-storey properties (a spring's storey
    stiffnesses) follow, the last value repeating for added storeys."""
    properties = resized(element.properties, top - bottom)
    return dataclasses.replace(element, bottom=bottom, top=top, properties=properties)


def copy_elements_to(project: Project, ids: Iterable[str], bottom: int, top: int) -> tuple[Project, list[str]]:
    """Copies of the elements in the same plan positions over levels ``bottom``..``top``."""
    wanted = set(ids)
    new_ids = []
    for element in [e for e in project.elements if e.id in wanted]:
        copy = respan(dataclasses.replace(element, id=project.next_element_id(element.kind)), bottom, top)
        project = add_elements(project, [copy])
        new_ids.append(copy.id)
    return project, new_ids


# ------------------------------------------------------------------ levels


def replace_level(project: Project, level_number: int, level: Level) -> Project:
    levels = list(project.levels)
    levels[level_number - 1] = level
    return dataclasses.replace(project, levels=tuple(levels))


def set_outline(project: Project, level_number: int, outline: Ring) -> tuple[Project, int]:
    """The level's outline replaced (or level 1 created); openings no longer inside are dropped.

    Returns the new project and how many openings were dropped.
    """
    outline = tuple(_point(p) for p in outline)
    if not project.levels:
        level = Level("Level 1", DEFAULT_STOREY_HEIGHT, outline)
        return dataclasses.replace(project, levels=(level,)), 0
    old = project.levels[level_number - 1]
    kept: list[Ring] = []
    for opening in old.openings:
        try:
            dataclasses.replace(old, outline=outline, openings=(*kept, opening))
        except ModelError:
            continue
        kept.append(opening)
    level = dataclasses.replace(old, outline=outline, openings=tuple(kept))
    return replace_level(project, level_number, level), len(old.openings) - len(kept)


def add_opening(project: Project, level_number: int, opening: Ring) -> Project:
    old = project.levels[level_number - 1]
    opening = tuple(_point(p) for p in opening)
    return replace_level(project, level_number, dataclasses.replace(old, openings=(*old.openings, opening)))


DEFAULT_STOREY_HEIGHT = 3.5
"""Storey height given to a new level, m (a common office storey; the user changes it)."""


def _shift_index(index: int, after: int) -> int:
    return index + 1 if index > after else index


def unique_level_name(project: Project, stem: str = "Level") -> str:
    names = {level.name for level in project.levels}
    n = len(project.levels) + 1
    while f"{stem} {n}" in names:
        n += 1
    return f"{stem} {n}"


def insert_level(
    project: Project, position: int, level: Level, extend: Iterable[str] = (), copy_storey_below: bool = False
) -> Project:
    """``level`` inserted as level ``position + 1`` (0 ≤ position ≤ number of levels).

    Level indices above the new floor move up by one, so elements that pass the new floor span
    the new storey too. Elements named in ``extend`` that end at the floor below it are carried
    up to the new floor. A spring's new storey takes the stiffness of the storey it splits, or,
    with ``copy_storey_below``, of the storey under it (the one being copied).
    """
    extend = set(extend)
    levels = list(project.levels)
    levels.insert(position, level)
    elements = []
    for e in project.elements:
        bottom, top = _shift_index(e.bottom, position), _shift_index(e.top, position)
        if e.id in extend and e.top == position and e.bottom < position:
            top = position + 1
        properties = e.properties
        if top - bottom != e.top - e.bottom:
            properties = storey_inserted(properties, position - e.bottom - (1 if copy_storey_below else 0))
        elements.append(dataclasses.replace(e, bottom=bottom, top=top, properties=properties))
    return dataclasses.replace(project, levels=tuple(levels), elements=tuple(elements))


def new_level_like(project: Project, template: Level) -> Level:
    """A level with ``template``'s outline, openings, height and weight, and a fresh name."""
    return dataclasses.replace(template, name=unique_level_name(project), point_masses=())


def add_level_on_top(project: Project) -> Project:
    top = project.levels[-1]
    return insert_level(project, len(project.levels), new_level_like(project, top))


def insert_level_below(project: Project, level_number: int) -> Project:
    """A new level under ``level_number`` (it becomes that number; the old one moves up)."""
    template = project.levels[level_number - 1]
    return insert_level(project, level_number - 1, new_level_like(project, template))


def duplicate_level(project: Project, level_number: int) -> Project:
    """A copy of the level, with its point masses, placed directly above it; the elements that
    reach it are carried up one storey."""
    template = project.levels[level_number - 1]
    copy = dataclasses.replace(template, name=unique_level_name(project))
    reaching = [e.id for e in project.elements if e.top == level_number and e.bottom < level_number]
    return insert_level(project, level_number, copy, extend=reaching, copy_storey_below=True)


def delete_level(project: Project, level_number: int) -> tuple[Project, list[str]]:
    """The project without level ``level_number`` and its storey; returns the ids of elements
    that spanned only that storey (they are removed)."""
    levels = list(project.levels)
    del levels[level_number - 1]
    elements = []
    removed = []
    for e in project.elements:
        bottom = e.bottom if e.bottom < level_number else e.bottom - 1
        top = e.top if e.top < level_number else e.top - 1
        if top <= bottom:
            removed.append(e.id)
            continue
        properties = e.properties
        if e.bottom < level_number <= e.top:
            properties = storey_removed(properties, level_number - 1 - e.bottom)
        elements.append(dataclasses.replace(e, bottom=bottom, top=top, properties=properties))
    return dataclasses.replace(project, levels=tuple(levels), elements=tuple(elements)), removed
