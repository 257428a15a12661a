"""The float array type core passes around, and read-only copies of it for results."""

from __future__ import annotations

import numpy as np
import numpy.typing as npt

FloatArray = npt.NDArray[np.float64]


def frozen_array(values: npt.ArrayLike) -> FloatArray:
    """A read-only float copy of ``values``."""
    array = np.array(values, dtype=float)
    array.setflags(write=False)
    return array
