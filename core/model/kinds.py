"""The registry of element kinds: what the model needs to know of each kind, keyed by its name.

A kind is named by a plain string (the built-in ones are the members of
:class:`~core.model.properties.ElementKind`, a ``StrEnum``, so they are strings too). The model
stage keeps here what it needs of a kind — its property type, the prefix of its ids, its default
properties and which of its fields holds one value per storey. The element stage
(:mod:`core.elements.kinds`) adds the planar model builder under the same name, and the app adds its
painter, colour and the like under the same name again: one name, one spec per stage.

Adding a kind: define its property dataclass, build a :class:`KindSpec` and hand it, with its model
builder, to :func:`core.elements.kinds.register_element_kind`.
"""

from __future__ import annotations

import dataclasses
import typing
from collections.abc import Callable, Iterator
from dataclasses import dataclass
from enum import StrEnum
from typing import Any

from core.errors import ModelError
from core.model.properties import (
    BracedFrame,
    ElementKind,
    Material,
    MomentFrame,
    ShearWall,
    Spring,
    steel_or_concrete_frame,
    steel_or_concrete_wall,
)

Kind = str
"""The name of an element kind as stored in a ``.poise`` file (``"braced_frame"``, …)."""


class Elevation(StrEnum):
    """How a kind looks in elevation (the 3D mode view draws it so)."""

    FRAME = "frame"
    """Columns on the bay lines (``properties.bays`` if it has one), a beam at each floor."""
    WALL = "wall"
    """A panel over each storey."""
    POST = "post"
    """One post at mid-line and a line at each floor (a spring)."""


@dataclass(frozen=True)
class KindSpec:
    """One element kind as the model sees it."""

    kind: Kind
    """The name stored in the file's ``kind`` field; unique among registered kinds."""
    properties: type
    """The frozen, validated dataclass of the kind's properties."""
    id_prefix: str
    """Ids of new elements of this kind are the prefix and a number (``W3``)."""
    defaults: Callable[[Material | None], Any]
    """Sensible concept-stage properties in a material (the kind's usual one for None)."""
    storey_values: str | None = None
    """The name of the properties' field that holds one value per storey spanned (a spring's
    ``storey_stiffness``, the walls' and frames' ``storeys`` sections), or None when the
    properties do not depend on the span. An empty tuple there means "the same in every storey"
    (a kind that needs its values, like the spring, refuses it itself)."""
    elevation: Elevation = Elevation.FRAME
    """How the kind is drawn in elevation."""

    def __post_init__(self) -> None:
        if not dataclasses.is_dataclass(self.properties):
            raise TypeError(f"kind {self.kind!r}: properties must be a dataclass type")
        if not self.id_prefix or not self.id_prefix.isalpha():
            raise TypeError(f"kind {self.kind!r}: id_prefix must be letters, got {self.id_prefix!r}")


_SPECS: dict[Kind, KindSpec] = {}


def register_kind(spec: KindSpec) -> None:
    """Make ``spec`` known to the model (and so to the file format). Refuses a kind, a property
    type or an id prefix another registered kind already uses."""
    for other in _SPECS.values():
        if other.kind == spec.kind:
            raise ValueError(f"element kind {spec.kind!r} is registered already")
        if other.properties is spec.properties:
            raise ValueError(f"{spec.properties.__name__} already belongs to kind {other.kind!r}")
        if other.id_prefix == spec.id_prefix:
            raise ValueError(f"id prefix {spec.id_prefix!r} already belongs to kind {other.kind!r}")
    _SPECS[spec.kind] = spec


def unregister_kind(kind: Kind) -> None:
    """Forget ``kind`` (tests that register a throw-away kind clean up with this)."""
    _SPECS.pop(kind, None)


def kind_spec(kind: Kind) -> KindSpec:
    """The spec of ``kind``; ModelError at ``kind`` naming the known kinds when there is none."""
    try:
        return _SPECS[kind]
    except (KeyError, TypeError):
        known = ", ".join(repr(str(k)) for k in _SPECS)
        raise ModelError("kind", f"unknown element kind {kind!r}; must be one of {known}") from None


def kind_of(properties: object) -> Kind:
    """The kind whose property type ``properties`` is."""
    for spec in _SPECS.values():
        if type(properties) is spec.properties:
            return spec.kind
    raise ModelError("properties", f"not an element kind: no registered kind has {type(properties).__name__}")


def registered_kinds() -> Iterator[Kind]:
    """The registered kinds, in the order they were registered (the built-in ones first)."""
    return iter(tuple(_SPECS))


def default_properties(kind: Kind, material: Material | None = None, storeys: int = 1) -> Any:
    """The default properties of ``kind`` in ``material`` for an element spanning ``storeys``."""
    return resized(kind_spec(kind).defaults(material), storeys)


def storey_values(properties: object) -> tuple[Any, ...] | None:
    """The per-storey values of ``properties`` (empty: the same for all storeys), or None for a
    kind that has none."""
    name = kind_spec(kind_of(properties)).storey_values
    return None if name is None else tuple(getattr(properties, name))


def _with_storey_values(properties: Any, edit: Callable[[list[Any]], None]) -> Any:
    name = kind_spec(kind_of(properties)).storey_values
    if name is None:
        return properties
    values = list(getattr(properties, name))
    if not values:
        return properties  # the same section in every storey, whatever the span
    edit(values)
    return dataclasses.replace(properties, **{name: tuple(values)})


def resized(properties: Any, storeys: int) -> Any:
    """``properties`` for a span of ``storeys``: per-storey values are cut, or the last one repeats."""
    if storeys < 1:
        return properties

    def fit(values: list[Any]) -> None:
        values[:] = (values + [values[-1]] * storeys)[:storeys]

    return _with_storey_values(properties, fit)


def storey_inserted(properties: Any, index: int) -> Any:
    """``properties`` with one more storey at ``index`` (0 = its lowest), copying the value there
    (the nearest one when ``index`` is past either end)."""

    def insert(values: list[Any]) -> None:
        source = min(max(index, 0), len(values) - 1)
        values.insert(source, values[source])

    return _with_storey_values(properties, insert)


def storey_removed(properties: Any, index: int) -> Any:
    """``properties`` without storey ``index`` (0 = its lowest)."""
    return _with_storey_values(properties, lambda values: values.pop(index))


def storey_value_type(kind: Kind) -> type | None:
    """The type of one per-storey value of ``kind`` (a section dataclass, or ``float`` for a
    spring's stiffness), or None for a kind without per-storey values."""
    spec = kind_spec(kind)
    if spec.storey_values is None:
        return None
    hint = typing.get_type_hints(spec.properties)[spec.storey_values]
    value_type: type = typing.get_args(hint)[0]
    return value_type


def split_by_storey(properties: Any, storeys: int) -> Any:
    """``properties`` with a section of its own in each of ``storeys`` storeys, each a copy of the
    one it has now ("same for all" turned off); unchanged if it has per-storey values already."""
    spec = kind_spec(kind_of(properties))
    value_type = storey_value_type(spec.kind)
    if spec.storey_values is None or getattr(properties, spec.storey_values) or value_type is None:
        return properties
    if not dataclasses.is_dataclass(value_type):
        raise ValueError(f"kind {spec.kind!r} has no section to repeat")
    section = value_type(**{f.name: getattr(properties, f.name) for f in dataclasses.fields(value_type)})
    return dataclasses.replace(properties, **{spec.storey_values: (section,) * storeys})


def same_for_all(properties: Any) -> Any:
    """``properties`` with one section for all storeys: its lowest storey's ("same for all")."""
    spec = kind_spec(kind_of(properties))
    value_type = storey_value_type(spec.kind)
    if spec.storey_values is None or value_type is None or not dataclasses.is_dataclass(value_type):
        return properties
    return dataclasses.replace(properties, **{spec.storey_values: ()})



def _register_builtin_kinds() -> None:
    """The four kinds Poise ships with (their element models live in core/elements)."""
    register_kind(KindSpec(ElementKind.BRACED_FRAME, BracedFrame, "B", lambda material: BracedFrame(), "storeys"))
    register_kind(
        KindSpec(ElementKind.SHEAR_WALL, ShearWall, "W", steel_or_concrete_wall, "storeys", Elevation.WALL)
    )
    register_kind(KindSpec(ElementKind.MOMENT_FRAME, MomentFrame, "M", steel_or_concrete_frame, "storeys"))
    register_kind(
        KindSpec(ElementKind.SPRING, Spring, "S", lambda material: Spring(), "storey_stiffness", Elevation.POST)
    )


_register_builtin_kinds()
