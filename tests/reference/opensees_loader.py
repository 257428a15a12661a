"""OpenSeesPy for reference checks: load its bundled BLAS first on Linux, skip if it is missing.

The Linux wheel (package ``openseespylinux``) links against a ``libblas.so.3`` it ships but does not
put on the loader path; loading that library globally before the import makes the import work.
"""

from __future__ import annotations

import ctypes
import importlib.util
import os
from types import ModuleType

import pytest


def load_opensees() -> ModuleType:
    """The ``openseespy.opensees`` module, or skip the calling test if OpenSeesPy is not installed."""
    spec = importlib.util.find_spec("openseespylinux")
    if spec is not None and spec.origin is not None:
        blas = os.path.join(os.path.dirname(spec.origin), "lib", "libblas.so.3")
        if os.path.exists(blas):
            ctypes.CDLL(blas, mode=ctypes.RTLD_GLOBAL)
    try:
        import openseespy.opensees as ops
    except ImportError as error:
        pytest.skip(f"OpenSeesPy is not available: {error}")
    return ops
