"""The app half of an element kind, and the registry of them, keyed by the core's kind name.

The core registers what the model and the analysis need of a kind (:mod:`core.model.kinds`,
:mod:`core.elements.kinds`); the app registers here, under the same name, everything the window,
the sheet and the exchange formats need: the label, colour, tool shortcut and icon, the symbol
painters for the canvas and for the sheet, the DXF layer role, the property rows and a sentence
for the sheet's assumptions. Every app place that differs by kind asks :func:`app_kind`.
"""

from __future__ import annotations

from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass
from typing import Any, Protocol

from PySide6.QtCore import QPointF
from PySide6.QtGui import QColor, QPainter

from app.panels.fields import Row, StoreyColumn
from app.sheet.painting import Paper
from core.model import Kind, kind_spec, registered_kinds


class CanvasSymbol(Protocol):
    """Paint the kind's symbol on the plan canvas in device pixels, from ``a`` along unit vector
    ``u`` for ``length`` px, ``n`` the unit normal, ``w`` the symbol's half-width in px, ``scale``
    px per metre. Returns the half-width actually drawn (the label keeps clear of it)."""

    def __call__(
        self,
        painter: QPainter,
        a: QPointF,
        u: QPointF,
        n: QPointF,
        length: float,
        w: float,
        scale: float,
        properties: Any,
        colour: QColor,
    ) -> float: ...


class SheetSymbol(Protocol):
    """Paint the kind's symbol on the sheet between device points ``a`` and ``b``; ``u`` and ``n``
    are the unit direction and normal, ``factor`` device units per metre."""

    def __call__(
        self,
        paper: Paper,
        a: QPointF,
        b: QPointF,
        u: tuple[float, float],
        n: tuple[float, float],
        factor: float,
        properties: Any,
        colour: QColor,
    ) -> None: ...


def no_thickness(properties: Any) -> float:
    return 0.0


@dataclass(frozen=True)
class AppKindSpec:
    """One element kind as the app shows it."""

    kind: Kind
    """The core's kind name (:class:`core.model.KindSpec`); the core half must be registered first."""
    label: str
    """The kind's name in menus, tool tips, the properties panel and legends ("Braced frame")."""
    colour: QColor
    """Its colour on the canvas, in the mode views, on the sheet and in legends."""
    shortcut: str
    """The key that picks its placing tool."""
    icon: str
    """Its icon's file name in icons/ without ``.svg`` (a missing file gives an empty icon)."""
    dxf_role: str
    """The role part of its DXF layer names (``POISE-L01-<role>``)."""
    dxf_colour: int
    """The AutoCAD colour index of that layer."""
    draw_canvas: CanvasSymbol
    draw_sheet: SheetSymbol
    property_rows: Callable[[], list[Row]]
    """The properties panel's rows for the kind's own fields (after id, span and geometry)."""
    stiffness_note: Callable[[Sequence[Any]], str]
    """A phrase for the sheet's assumptions on how the given elements' properties of this kind
    enter the stiffness ("walls 0.5 of gross")."""
    mode_line_width: float = 4.0
    """Line width of the kind in the animated mode plan, px."""
    thickness: Callable[[Any], float] = no_thickness
    """The thickness the symbol shows to scale, m (0 for a line symbol)."""
    legend_properties: Any = None
    """Properties of the sheet legend's sample symbol; None uses the kind's defaults."""
    storey_columns: tuple[StoreyColumn, ...] = ()
    """The columns of the properties panel's per-storey table (the fields of the kind's
    per-storey section, :attr:`core.model.KindSpec.storey_values`); empty: no table."""


_SPECS: dict[Kind, AppKindSpec] = {}


def register_app_kind(spec: AppKindSpec) -> None:
    """Make ``spec`` known to the app. The core half must exist; the kind, its shortcut and its DXF
    role must be new."""
    kind_spec(spec.kind)
    for other in _SPECS.values():
        if other.kind == spec.kind:
            raise ValueError(f"the app already has element kind {spec.kind!r}")
        if other.shortcut == spec.shortcut:
            raise ValueError(f"shortcut {spec.shortcut!r} already places {other.label.lower()}s")
        if other.dxf_role == spec.dxf_role:
            raise ValueError(f"DXF role {spec.dxf_role!r} already belongs to {other.label.lower()}s")
    _SPECS[spec.kind] = spec


def unregister_app_kind(kind: Kind) -> None:
    """Forget the app half of ``kind`` (tests that register a throw-away kind clean up with this)."""
    _SPECS.pop(kind, None)


def app_kind(kind: Kind) -> AppKindSpec:
    """The app half of ``kind``; KeyError naming the kind when the app does not know it."""
    try:
        return _SPECS[kind]
    except KeyError:
        raise KeyError(f"element kind {kind!r} has no app spec: register one with register_app_kind") from None


def app_kinds() -> Iterator[AppKindSpec]:
    """The app's kinds in the core's registration order (the built-in ones first)."""
    return iter([_SPECS[kind] for kind in registered_kinds() if kind in _SPECS])
