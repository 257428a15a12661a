"""The material choice of kinds whose defaults come in steel and concrete (walls, moment frames)."""

from __future__ import annotations

import dataclasses

from app.panels.fields import Row
from core.model import CONCRETE_E, STEEL_E, Element, Material, default_properties

MATERIALS = [("Steel", Material.STEEL.value), ("Concrete", Material.CONCRETE.value), ("Custom", "custom")]


def material_of(element: Element) -> str:
    """Steel or concrete when the element's modulus is that material's, else custom."""
    modulus = getattr(element.properties, "modulus", None)
    if modulus == STEEL_E:
        return Material.STEEL.value
    if modulus == CONCRETE_E:
        return Material.CONCRETE.value
    return "custom"


def with_material(element: Element, material: str) -> Element:
    """The element with its kind's default properties in ``material`` (custom keeps them)."""
    if material == "custom" or material == material_of(element):
        return element
    properties = default_properties(element.kind, Material(material), element.storey_count)
    return dataclasses.replace(element, properties=properties)


def material_row(tip: str = "") -> Row:
    return Row("Material", kind="choice", choices=MATERIALS, getter=material_of, setter=with_material, tip=tip)
