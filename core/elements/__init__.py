"""The condensed lateral stiffness of each element kind, and the member forces behind it.

Each kind builds a planar model in the element's own vertical plane (one module per kind) and
condenses it to one lateral DOF per floor it spans: DOF i is the lateral displacement of the
i-th floor above the element's bottom, along the element's line, relative to that bottom (the
element's base: fixed against rotation and vertical movement). Matrices are cached by
(properties, length, storey heights) — not by position — so moving an element in plan re-uses
its matrix. Length and heights enter the key rounded to 1 µm, so the rounding noise of a move
(a length recomputed from shifted end points) still hits the cache.
"""

from __future__ import annotations

from functools import lru_cache

import numpy as np
import numpy.typing as npt

from core.arrays import FloatArray
from core.elements.forces import CondensedElement, ElementForces
from core.elements.kinds import builder_of, register_element_kind, unregister_element_kind
from core.errors import ModelError
from core.model import ElementProperties

__all__ = [
    "ElementForces",
    "condensed_stiffness",
    "member_forces",
    "register_element_kind",
    "unregister_element_kind",
]

KEY_SCALE = 1.0e6
"""Length and storey heights are rounded to 1/KEY_SCALE m (1 µm) for the cache key."""


def condensed_stiffness(
    properties: ElementProperties, length: float, storey_heights: tuple[float, ...]
) -> FloatArray:
    """n × n lateral stiffness (kN/m) of one element, n = len(storey_heights) = storeys it spans.

    DOF i is the lateral displacement along the element's line of the i-th floor it spans,
    relative to its bottom. Returns a read-only array, the same object for equal inputs.
    Raises ModelError on degenerate input (zero length, a storey without height, …).
    """
    return _model(properties, length, storey_heights).stiffness


def member_forces(
    properties: ElementProperties,
    length: float,
    storey_heights: tuple[float, ...],
    displacements: npt.ArrayLike,
) -> ElementForces:
    """Member forces of one element for its floor displacements (n,) along its line, relative to
    its bottom: storey shears, overturning moments and, by kind, brace, column and beam forces
    (see :class:`ElementForces`)."""
    model = _model(properties, length, storey_heights)
    n = model.stiffness.shape[0]
    try:
        d = np.asarray(displacements, dtype=float)
    except (TypeError, ValueError) as error:
        raise ModelError("displacements", "must be numbers, one per floor") from error
    if d.shape != (n,):
        raise ModelError("displacements", f"needs {n} values (one per floor spanned), got shape {d.shape}")
    if not np.all(np.isfinite(d)):
        raise ModelError("displacements", "must be finite numbers")
    try:
        with np.errstate(over="raise", invalid="raise"):
            return model.forces(d)
    except FloatingPointError as error:
        raise ModelError("displacements", "too large to give finite forces; give them in m") from error


def _model(
    properties: ElementProperties, length: float, storey_heights: tuple[float, ...]
) -> CondensedElement:
    """The cached condensed model, after checking the input and rounding the key."""
    builder_of(properties)  # ModelError now for properties of no registered kind
    length = _metres(length, "length")
    try:
        heights = tuple([round(h * KEY_SCALE) / KEY_SCALE for h in storey_heights])
    except (TypeError, ValueError, OverflowError):
        heights = ()  # the loop below names the culprit
    if not heights or not min(heights) > 0.0:
        heights = _checked_heights(storey_heights)
    return _condensed(properties, length, heights)


def _checked_heights(storey_heights: tuple[float, ...]) -> tuple[float, ...]:
    """The slow path for bad heights: ModelError naming the first bad one (or the whole)."""
    try:
        values = list(storey_heights)
    except TypeError:
        raise ModelError("storey_heights", f"must be a list of heights, got {storey_heights!r}") from None
    if not values:
        raise ModelError("storey_heights", "an element must span at least one storey")
    return tuple(_metres(h, f"storey_heights[{i}]") for i, h in enumerate(values))


def _metres(value: float, path: str) -> float:
    """``value`` rounded to the key's 1 µm; ModelError at ``path`` unless it is a positive number."""
    try:
        rounded = round(value * KEY_SCALE) / KEY_SCALE
    except (TypeError, ValueError, OverflowError):
        raise ModelError(path, f"must be a finite number of metres, got {value!r}") from None
    if not rounded > 0.0:
        raise ModelError(path, f"must be at least 1 µm, got {value!r}")
    return rounded


@lru_cache(maxsize=4096)
def _condensed(
    properties: ElementProperties, length: float, storey_heights: tuple[float, ...]
) -> CondensedElement:
    return builder_of(properties)(properties, length, storey_heights)
