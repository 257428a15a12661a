"""The float array type core passes around, read-only copies of it for results, and the sum from
the top that turns floor forces into storey shears."""

from __future__ import annotations

import numpy as np
import numpy.typing as npt

FloatArray = npt.NDArray[np.float64]


def frozen_array(values: npt.ArrayLike) -> FloatArray:
    """A read-only float copy of ``values``."""
    array = np.array(values, dtype=float)
    array.setflags(write=False)
    return array


def sums_from_top(values: FloatArray, axis: int = 0) -> FloatArray:
    """Σ_(k ≥ i) values_k along ``axis`` (floors bottom first): the storey shears of floor forces,
    the overturning moments of storey moments."""
    summed: FloatArray = np.flip(np.cumsum(np.flip(values, axis), axis=axis), axis)
    return summed
