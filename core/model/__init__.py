"""The model stage: the project and its parts, settings, outline geometry and the ``.poise`` file."""

from core.model.project import (
    Element,
    Level,
    PointMass,
    Project,
)
from core.model.properties import (
    CONCRETE_E,
    CRACKED_FACTOR,
    GRAVITY,
    PROPERTY_TYPES,
    STEEL_E,
    BracedFrame,
    BracePattern,
    ElementKind,
    ElementProperties,
    Material,
    MomentFrame,
    ShearWall,
    Spring,
    default_properties,
)
from core.model.settings import (
    Asce7Spectrum,
    Eurocode8Spectrum,
    LoadMethod,
    RuleSet,
    Settings,
    SystemType,
)
from core.model.validation import (
    Point,
    Ring,
)

__all__ = [
    "CONCRETE_E",
    "CRACKED_FACTOR",
    "GRAVITY",
    "PROPERTY_TYPES",
    "STEEL_E",
    "Asce7Spectrum",
    "BracePattern",
    "BracedFrame",
    "Element",
    "ElementKind",
    "ElementProperties",
    "Eurocode8Spectrum",
    "Level",
    "LoadMethod",
    "Material",
    "MomentFrame",
    "Point",
    "PointMass",
    "Project",
    "Ring",
    "RuleSet",
    "Settings",
    "ShearWall",
    "Spring",
    "SystemType",
    "default_properties",
]
