"""The element stage's registry: the planar model builder of each element kind, by kind name.

A builder takes the kind's properties, the element's length and the heights of the storeys it
spans, and returns a :class:`~core.elements.forces.CondensedElement` — its condensed stiffness and
its per-storey force recovery. The model half of a kind (property type, id prefix, defaults) lives
in :mod:`core.model.kinds`; :func:`register_element_kind` registers both halves at once.
"""

from __future__ import annotations

from collections.abc import Callable
from typing import Any

from core.elements import braced_frame, moment_frame, shear_wall, spring
from core.elements.forces import CondensedElement
from core.errors import ModelError
from core.model import ElementKind, Kind, KindSpec, register_kind
from core.model.kinds import kind_of, unregister_kind

Builder = Callable[[Any, float, tuple[float, ...]], CondensedElement]
"""(properties, length m, storey heights m) → the condensed planar model."""

_BUILDERS: dict[Kind, Builder] = {
    ElementKind.BRACED_FRAME: braced_frame.condense,
    ElementKind.SHEAR_WALL: shear_wall.condense,
    ElementKind.MOMENT_FRAME: moment_frame.condense,
    ElementKind.SPRING: spring.condense,
}


def register_element_kind(spec: KindSpec, builder: Builder) -> None:
    """Register a new kind: its model half (:func:`core.model.register_kind`) and its builder."""
    register_kind(spec)
    _BUILDERS[spec.kind] = builder


def unregister_element_kind(kind: Kind) -> None:
    """Forget both halves of ``kind`` (for tests that register a throw-away kind)."""
    _BUILDERS.pop(kind, None)
    unregister_kind(kind)


def builder_of(properties: object) -> Builder:
    """The builder of the kind ``properties`` belong to; ModelError when it has none."""
    builder = _BUILDERS.get(kind_of(properties))
    if builder is None:
        raise ModelError("properties", f"no element model for kind {kind_of(properties)!r}")
    return builder
