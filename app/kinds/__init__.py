"""Element kinds in the app: one module per kind (its painters, colour, rows …), one registry.

Adding a kind to the app: write a module like :mod:`app.kinds.spring` that builds an
:class:`AppKindSpec` under the core's kind name, register it below (or, for a kind outside the
package, call :func:`register_app_kind`), and add ``icons/<icon>.svg``.
"""

from app.kinds import braced_frame, moment_frame, shear_wall, spring
from app.kinds.spec import (
    AppKindSpec,
    CanvasSymbol,
    SheetSymbol,
    app_kind,
    app_kinds,
    register_app_kind,
    unregister_app_kind,
)

for _module in (braced_frame, shear_wall, moment_frame, spring):
    register_app_kind(_module.SPEC)

__all__ = [
    "AppKindSpec",
    "CanvasSymbol",
    "SheetSymbol",
    "app_kind",
    "app_kinds",
    "register_app_kind",
    "unregister_app_kind",
]
