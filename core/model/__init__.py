"""The model stage: the project and its parts, settings, outline geometry and the ``.poise`` file."""

from core.model.kinds import (
    Kind,
    KindSpec,
    default_properties,
    kind_spec,
    register_kind,
    registered_kinds,
)
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
    STEEL_E,
    BracedFrame,
    BracePattern,
    ElementKind,
    ElementProperties,
    Material,
    MomentFrame,
    ShearWall,
    Spring,
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
    "STEEL_E",
    "Asce7Spectrum",
    "BracePattern",
    "BracedFrame",
    "Element",
    "ElementKind",
    "ElementProperties",
    "Eurocode8Spectrum",
    "Kind",
    "KindSpec",
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
    "kind_spec",
    "register_kind",
    "registered_kinds",
]
