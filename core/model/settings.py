"""Project-wide analysis settings: rule set, load method, spectra, eccentricity, drift limits."""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum

from core.model.bounds import within
from core.model.validation import require


class RuleSet(StrEnum):
    """Which code's limits are judged pass/warn/fail; both sets' figures are always computed."""

    EN1998 = "en1998"
    ASCE7 = "asce7"


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
    damping_percent: float = 5.0

    def __post_init__(self) -> None:
        within(self.ag, "ground_acceleration", "ag")
        require(self.ground_type in ("A", "B", "C", "D", "E"), "ground_type", "must be one of A, B, C, D, E")
        require(self.spectrum_type in (1, 2), "spectrum_type", "must be 1 or 2")
        within(self.behaviour_factor, "behaviour_factor", "behaviour_factor")
        within(self.lower_bound, "lower_bound_factor", "lower_bound")
        within(self.damping_percent, "damping_percent", "damping_percent")


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

    def __post_init__(self) -> None:
        within(self.sds, "spectral_acceleration", "sds")
        within(self.sd1, "spectral_acceleration", "sd1")
        within(self.s1, "spectral_acceleration_s1", "s1")
        for name in ("long_period", "response_modification", "importance", "deflection_amplification"):
            within(getattr(self, name), name, name)


@dataclass(frozen=True)
class Settings:
    """Project-wide analysis settings."""

    rule_set: RuleSet = RuleSet.EN1998
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
    drift_limit: float = 0.005
    """Storey drift ratio limit (EN 1998-1 §4.4.3.2(a): d_r·ν ≤ 0.005 h, brittle finishes)."""
    drift_reduction: float = 0.5
    """ν of EN 1998-1 §4.4.3.2(2), applied to the design drift under the EN 1998 rule set
    (recommended 0.5 for importance classes I and II, 0.4 for III and IV)."""
    damping_ratio: float = 0.05

    def __post_init__(self) -> None:
        within(self.base_shear_coefficient, "base_shear_coefficient", "base_shear_coefficient")
        within(self.accidental_eccentricity, "accidental_eccentricity", "accidental_eccentricity")
        within(self.drift_limit, "drift_limit", "drift_limit")
        within(self.drift_reduction, "drift_reduction", "drift_reduction")
        within(self.damping_ratio, "damping_ratio", "damping_ratio")
