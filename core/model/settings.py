"""Project-wide analysis settings: code limits, load method, spectra, eccentricity, drift limit.

No setting here names a damping ratio: no result of Poise depends on one yet. The EN 1998-1
design spectrum (§3.2.2.5) has no damping correction η (damping enters through q), and the
ASCE 7-16 design spectrum (§11.4.6) is for 5 % damping. Files that still hold the retired
``damping_ratio`` and ``eurocode8.damping_percent`` load, and the values are dropped
(:data:`RETIRED_FIELDS`).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum

from core.model.bounds import within
from core.model.validation import require


class RuleSet(StrEnum):
    """The built-in code limits (the rule sets of :mod:`core.lateral.rules`); which code's limits
    judge pass/warn/fail. More may be registered (:func:`register_rule_set_name`)."""

    EN1998 = "en1998"
    ASCE7 = "asce7"


_RULE_SET_NAMES: dict[str, None] = dict.fromkeys(RuleSet)


def register_rule_set_name(name: str) -> None:
    """Let ``Settings.rule_set`` take ``name`` (core.lateral.rules registers a new rule set's name)."""
    _RULE_SET_NAMES[name] = None


def unregister_rule_set_name(name: str) -> None:
    if name not in tuple(RuleSet):
        _RULE_SET_NAMES.pop(name, None)


def rule_set_names() -> tuple[str, ...]:
    return tuple(_RULE_SET_NAMES)


class LoadMethod(StrEnum):
    """How the equivalent static base shear is found."""

    EN1998 = "en1998"
    ASCE7 = "asce7"
    COEFFICIENT = "coefficient"


class SystemType(StrEnum):
    """Structural system, for the codes' approximate period formulas."""

    STEEL_MOMENT = "steel_moment"
    CONCRETE_MOMENT = "concrete_moment"
    ECCENTRIC_BRACED = "eccentric_braced"
    OTHER = "other"


@dataclass(frozen=True)
class Eurocode8Spectrum:
    """EN 1998-1 §3.2.2 spectrum parameters (recommended values by default)."""

    ag: float = 0.25
    """Design ground acceleration on type A ground, a_g = γ_I·a_gR, in g."""
    ground_type: str = "B"
    spectrum_type: int = 1
    behaviour_factor: float = 4.0
    lower_bound: float = 0.2

    def __post_init__(self) -> None:
        within(self.ag, "ground_acceleration", "ag")
        require(self.ground_type in ("A", "B", "C", "D", "E"), "ground_type", "must be one of A, B, C, D, E")
        require(self.spectrum_type in (1, 2), "spectrum_type", "must be 1 or 2")
        within(self.behaviour_factor, "behaviour_factor", "behaviour_factor")
        within(self.lower_bound, "lower_bound_factor", "lower_bound")


SEISMIC_DESIGN_CATEGORIES = ("A", "B", "C", "D", "E", "F")
"""ASCE 7-16 §11.6."""


@dataclass(frozen=True)
class Asce7Spectrum:
    """ASCE 7 §11.4 design spectrum and §12.8 base-shear parameters."""

    sds: float = 1.0
    sd1: float = 0.6
    s1: float = 0.6
    long_period: float = 8.0
    """T_L, s."""
    response_modification: float = 6.0
    """R."""
    importance: float = 1.0
    """I_e."""
    deflection_amplification: float = 5.0
    """C_d."""
    design_category: str = "D"
    """Seismic design category A–F (§11.6): which analysis methods Table 12.6-1 permits."""

    def __post_init__(self) -> None:
        require(
            self.design_category in SEISMIC_DESIGN_CATEGORIES,
            "design_category",
            f"must be one of {', '.join(SEISMIC_DESIGN_CATEGORIES)}, got {self.design_category!r}",
        )
        within(self.sds, "spectral_acceleration", "sds")
        within(self.sd1, "spectral_acceleration", "sd1")
        within(self.s1, "spectral_acceleration_s1", "s1")
        for name in ("long_period", "response_modification", "importance", "deflection_amplification"):
            within(getattr(self, name), name, name)


@dataclass(frozen=True)
class Settings:
    """Project-wide analysis settings."""

    rule_set: str = RuleSet.EN1998
    """The name of the code limits that judge the figures (a :class:`RuleSet` or a registered one)."""
    load_method: LoadMethod = LoadMethod.EN1998
    eurocode8: Eurocode8Spectrum = field(default_factory=Eurocode8Spectrum)
    asce7: Asce7Spectrum = field(default_factory=Asce7Spectrum)
    base_shear_coefficient: float = 0.1
    """For the plain-coefficient method: base shear over seismic weight."""
    system_type: SystemType = SystemType.OTHER
    accidental_eccentricity: float = 0.05
    """Share of the plan dimension perpendicular to the load (EN 1998-1 §4.3.2; ASCE 7 §12.8.4.2)."""
    include_centred_case: bool = False
    """Add the wind-style load cases with no accidental eccentricity."""
    drift_limit: float | None = None
    """The project's own storey drift ratio limit; None takes the code limits' value for
    ``drift_basis``."""
    drift_basis: str = ""
    """Which of the code limits' drift limits applies when ``drift_limit`` is None: a key of the rule
    set's table (EN 1998-1 §4.4.3.2 by non-structural elements, ASCE 7-16 Table 12.12-1 by risk
    category and structure); empty or a key the rule set does not have: its first."""
    drift_reduction: float = 0.5
    """ν of EN 1998-1 §4.4.3.2(2), applied to the design drift under the EN 1998 rule set
    (recommended 0.5 for importance classes I and II, 0.4 for III and IV)."""
    gravity_factor: float = 1.0
    """Gravity load above each storey for the P-Δ stability coefficient, over the seismic weight
    above it (EN 1998-1 §4.4.2.2(2) P_tot, ASCE 7-16 §12.8.7 P_x: the load of the seismic design
    situation; 1 takes the seismic weight itself)."""

    def __post_init__(self) -> None:
        require(
            self.rule_set in _RULE_SET_NAMES,
            "rule_set",
            "must be one of " + ", ".join(repr(str(n)) for n in _RULE_SET_NAMES) + f", got {self.rule_set!r}",
        )
        if self.rule_set in tuple(RuleSet):
            object.__setattr__(self, "rule_set", RuleSet(self.rule_set))
        within(self.base_shear_coefficient, "base_shear_coefficient", "base_shear_coefficient")
        within(self.accidental_eccentricity, "accidental_eccentricity", "accidental_eccentricity")
        if self.drift_limit is not None:
            within(self.drift_limit, "drift_limit", "drift_limit")
        within(self.drift_reduction, "drift_reduction", "drift_reduction")
        within(self.gravity_factor, "gravity_factor", "gravity_factor")


RETIRED_FIELDS: dict[type, frozenset[str]] = {
    Settings: frozenset({"damping_ratio"}),
    Eurocode8Spectrum: frozenset({"damping_percent"}),
}
"""Fields older files may hold that no longer exist; reading drops them (neither changed a result)."""
