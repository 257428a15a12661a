"""Equivalent static seismic loads: design spectra, base shear, vertical distribution, load cases.

Spectral ordinates are in units of g; base shears in kN from masses in t. Sources by function:
EN 1998-1:2004 §3.2.2.2 (elastic spectrum, Tables 3.2 and 3.3), §3.2.2.5 (design spectrum),
§4.3.3.2.2 (base shear, approximate period), §4.3.3.2.3 (vertical distribution), §4.3.2(1)
(accidental eccentricity); ASCE 7-16 §11.4.6 (design spectrum), §12.8.1.1 (C_s), §12.8.2 and
§12.8.2.1 (periods, C_u), §12.8.3 (vertical distribution), §12.8.4.2 (accidental torsion).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core.arrays import FloatArray, frozen_array
from core.lateral.cases import Direction, LoadCase
from core.lateral.records import StaticLoad
from core.model import GRAVITY, Asce7Spectrum, Eurocode8Spectrum, LoadMethod, Project, Settings, SystemType
from core.model.geometry import bounding_size
from core.solve.assembly import FloorMass


@dataclass(frozen=True)
class GroundParameters:
    """Soil factor S and corner periods T_B, T_C, T_D (s) of an EN 1998-1 elastic spectrum."""

    soil_factor: float
    tb: float
    tc: float
    td: float


EN1998_GROUND: dict[int, dict[str, GroundParameters]] = {
    # EN 1998-1 Table 3.2, Type 1 recommended values (S, T_B, T_C, T_D).
    1: {
        "A": GroundParameters(1.0, 0.15, 0.4, 2.0),
        "B": GroundParameters(1.2, 0.15, 0.5, 2.0),
        "C": GroundParameters(1.15, 0.20, 0.6, 2.0),
        "D": GroundParameters(1.35, 0.20, 0.8, 2.0),
        "E": GroundParameters(1.4, 0.15, 0.5, 2.0),
    },
    # EN 1998-1 Table 3.3, Type 2 recommended values [from memory: docs/sources.md].
    2: {
        "A": GroundParameters(1.0, 0.05, 0.25, 1.2),
        "B": GroundParameters(1.35, 0.05, 0.25, 1.2),
        "C": GroundParameters(1.5, 0.10, 0.25, 1.2),
        "D": GroundParameters(1.8, 0.10, 0.30, 1.2),
        "E": GroundParameters(1.6, 0.05, 0.25, 1.2),
    },
}


def ground_parameters(spectrum: Eurocode8Spectrum) -> GroundParameters:
    return EN1998_GROUND[spectrum.spectrum_type][spectrum.ground_type]


def damping_correction(damping_percent: float) -> float:
    """η = √(10 / (5 + ξ)) ≥ 0.55, ξ in % (EN 1998-1 §3.2.2.2(3) Eq. 3.6)."""
    return max(math.sqrt(10.0 / (5.0 + damping_percent)), 0.55)


def en1998_elastic(period: float, spectrum: Eurocode8Spectrum, damping_percent: float = 5.0) -> float:
    """Elastic horizontal spectrum S_e(T) in g (EN 1998-1 §3.2.2.2 Eqs. 3.2–3.5) for viscous damping
    ξ in %, through η (Eq. 3.6). No result uses it yet: the static loads use the design spectrum
    (§3.2.2.5), which has no η; the damping enters there through q."""
    g = ground_parameters(spectrum)
    eta = damping_correction(damping_percent)
    plateau = spectrum.ag * g.soil_factor * eta * 2.5
    T = period
    if T <= g.tb:
        return spectrum.ag * g.soil_factor * (1.0 + T / g.tb * (2.5 * eta - 1.0))
    if T <= g.tc:
        return plateau
    if T <= g.td:
        return plateau * g.tc / T
    return plateau * g.tc * g.td / T**2


def en1998_design(period: float, spectrum: Eurocode8Spectrum) -> float:
    """Design spectrum S_d(T) in g for behaviour factor q (EN 1998-1 §3.2.2.5(4) Eqs. 3.13–3.16).
    It has no damping correction η: EN 1998-1 accounts for damping in q."""
    g = ground_parameters(spectrum)
    ag, S, q = spectrum.ag, g.soil_factor, spectrum.behaviour_factor
    floor = spectrum.lower_bound * ag
    T = period
    if T <= g.tb:
        return ag * S * (2.0 / 3.0 + T / g.tb * (2.5 / q - 2.0 / 3.0))
    if T <= g.tc:
        return ag * S * 2.5 / q
    if T <= g.td:
        return max(ag * S * 2.5 / q * g.tc / T, floor)
    return max(ag * S * 2.5 / q * g.tc * g.td / T**2, floor)


def en1998_correction_factor(period: float, spectrum: Eurocode8Spectrum, storeys: int) -> float:
    """λ = 0.85 if T_1 ≤ 2 T_C and the building has more than two storeys, else 1.0
    (EN 1998-1 §4.3.3.2.2(1))."""
    return 0.85 if period <= 2.0 * ground_parameters(spectrum).tc and storeys > 2 else 1.0


def asce7_design_spectrum(period: float, spectrum: Asce7Spectrum) -> float:
    """Design response spectrum S_a(T) in g (ASCE 7-16 §11.4.6 Eqs. 11.4-5 to 11.4-8), for 5 %
    damping (§11.4.6 defines it so; there is no damping input)."""
    t0 = 0.2 * spectrum.sd1 / spectrum.sds
    ts = spectrum.sd1 / spectrum.sds
    T = period
    if T < t0:
        return spectrum.sds * (0.4 + 0.6 * T / t0)
    if T <= ts:
        return spectrum.sds
    if T <= spectrum.long_period:
        return spectrum.sd1 / T
    return spectrum.sd1 * spectrum.long_period / T**2


def asce7_response_coefficient(period: float, spectrum: Asce7Spectrum) -> float:
    """Seismic response coefficient C_s with its caps and floors (ASCE 7-16 §12.8.1.1
    Eqs. 12.8-2 to 12.8-6; the floors are from memory: docs/sources.md)."""
    r_over_i = spectrum.response_modification / spectrum.importance
    cs = spectrum.sds / r_over_i
    if period <= spectrum.long_period:
        cap = spectrum.sd1 / (period * r_over_i)
    else:
        cap = spectrum.sd1 * spectrum.long_period / (period**2 * r_over_i)
    cs = min(cs, cap)
    floor = max(0.044 * spectrum.sds * spectrum.importance, 0.01)
    if spectrum.s1 >= 0.6:
        floor = max(floor, 0.5 * spectrum.s1 / r_over_i)
    return max(cs, floor)


EN1998_PERIOD_COEFFICIENT: dict[SystemType, float] = {
    # EN 1998-1 §4.3.3.2.2(3) Eq. 4.6, C_t for H in m [values from memory: docs/sources.md].
    SystemType.STEEL_MOMENT: 0.085,
    SystemType.CONCRETE_MOMENT: 0.075,
    SystemType.ECCENTRIC_BRACED: 0.075,
    SystemType.OTHER: 0.050,
}

ASCE7_PERIOD_COEFFICIENT: dict[SystemType, tuple[float, float]] = {
    # ASCE 7-16 Table 12.8-2, (C_t in SI units for h_n in m, x).
    SystemType.STEEL_MOMENT: (0.0724, 0.8),
    SystemType.CONCRETE_MOMENT: (0.0466, 0.9),
    SystemType.ECCENTRIC_BRACED: (0.0731, 0.75),
    SystemType.OTHER: (0.0488, 0.75),
}

ASCE7_CU_TABLE: tuple[tuple[float, float], ...] = (
    # ASCE 7-16 Table 12.8-1: (S_D1, C_u), linear between the rows.
    (0.1, 1.7),
    (0.15, 1.6),
    (0.2, 1.5),
    (0.3, 1.4),
    (0.4, 1.4),
)


def approximate_period_en1998(height: float, system: SystemType) -> float:
    """T_1 = C_t·H^(3/4) (EN 1998-1 §4.3.3.2.2(3) Eq. 4.6; meant for H ≤ 40 m)."""
    return float(EN1998_PERIOD_COEFFICIENT[system] * height**0.75)


def approximate_period_asce7(height: float, system: SystemType) -> float:
    """T_a = C_t·h_n^x (ASCE 7-16 §12.8.2.1 Eq. 12.8-7, Table 12.8-2 in SI units)."""
    ct, x = ASCE7_PERIOD_COEFFICIENT[system]
    return float(ct * height**x)


def period_cap_coefficient(sd1: float) -> float:
    """C_u of ASCE 7-16 Table 12.8-1, linear between its rows, constant beyond them."""
    rows = ASCE7_CU_TABLE
    return float(np.interp(sd1, [r[0] for r in rows], [r[1] for r in rows]))


def distribution_exponent(period: float) -> float:
    """k = 1 for T ≤ 0.5 s, 2 for T ≥ 2.5 s, linear between (ASCE 7-16 §12.8.3)."""
    return float(np.clip(1.0 + (period - 0.5) / 2.0, 1.0, 2.0))


def load_exponent(settings: Settings, height: float, modal_period: float) -> float:
    """The vertical distribution's exponent k of :func:`static_load`: ASCE 7-16 §12.8.3 with the
    period capped at C_u·T_a (§12.8.2); 1 (F_i ∝ z_i·m_i) for the other methods."""
    if settings.load_method is not LoadMethod.ASCE7:
        return 1.0
    cap = period_cap_coefficient(settings.asce7.sd1) * approximate_period_asce7(height, settings.system_type)
    return distribution_exponent(min(modal_period, cap))


def vertical_distribution(
    base_shear: float, masses: FloatArray, elevations: FloatArray, exponent: float = 1.0
) -> FloatArray:
    """Floor forces F_i = V·m_i·z_i^k / Σ m_j·z_j^k (EN 1998-1 Eq. 4.11 with k = 1;
    ASCE 7-16 Eqs. 12.8-11 and 12.8-12)."""
    weights = np.asarray(masses, dtype=float) * np.asarray(elevations, dtype=float) ** exponent
    total = weights.sum()
    if total <= 0.0:
        return np.zeros_like(weights)
    forces: FloatArray = base_shear * weights / total
    return forces


def static_load(
    direction: Direction,
    settings: Settings,
    floors: tuple[FloorMass, ...],
    modal_period: float,
) -> StaticLoad:
    """The static load in ``direction`` by the project's load method.

    The period is the modal one (EN 1998-1 §4.3.3.2.2(2) allows methods of structural dynamics);
    for ASCE 7 it is capped at C_u·T_a (§12.8.2). The plain coefficient uses the inverted-triangle
    distribution (k = 1)."""
    masses = np.array([f.mass for f in floors])
    elevations = np.array([f.elevation for f in floors])
    height = float(elevations[-1])
    weight = float(masses.sum()) * GRAVITY
    system = settings.system_type
    t_en = approximate_period_en1998(height, system)
    t_asce = approximate_period_asce7(height, system)
    cap = period_cap_coefficient(settings.asce7.sd1) * t_asce
    method = settings.load_method
    if method is LoadMethod.EN1998:
        period = modal_period
        spectrum = settings.eurocode8
        lam = en1998_correction_factor(period, spectrum, len(floors))
        coefficient = en1998_design(period, spectrum) * lam
        exponent = 1.0
        clause = (
            f"EN 1998-1 §3.2.2.5 design spectrum type {spectrum.spectrum_type}, "
            f"ground {spectrum.ground_type}; "
            f"§4.3.3.2.2 F_b = S_d(T_1)·m·λ (λ = {lam:g}); §4.3.3.2.3 F_i ∝ z_i·m_i"
        )
    elif method is LoadMethod.ASCE7:
        period = min(modal_period, cap)
        coefficient = asce7_response_coefficient(period, settings.asce7)
        exponent = load_exponent(settings, height, modal_period)
        clause = (
            "ASCE 7-16 §12.8.1.1 V = C_s·W; §12.8.2 T ≤ C_u·T_a; "
            f"§12.8.3 F_x ∝ w_x·h_x^k (k = {exponent:.3g})"
        )
    else:
        period = modal_period
        coefficient = settings.base_shear_coefficient
        exponent = 1.0
        clause = "plain base-shear coefficient V = c·W, inverted-triangle distribution F_i ∝ z_i·m_i"
    base_shear = coefficient * weight
    forces = vertical_distribution(base_shear, masses, elevations, exponent)
    return StaticLoad(
        direction=direction,
        method=method.value,
        modal_period=modal_period,
        period=period,
        approximate_period_en1998=t_en,
        approximate_period_asce7=t_asce,
        period_cap_asce7=cap,
        coefficient=coefficient,
        base_shear=base_shear,
        distribution_exponent=exponent,
        storey_forces=frozen_array(forces),
        clause=clause,
    )


def load_cases(include_centred: bool) -> tuple[LoadCase, ...]:
    """±x and ±y, each with the mass centre moved by +e and by −e (eight cases), then the four
    centred cases if asked (EN 1998-1 §4.3.2(1); ASCE 7-16 §12.8.4.2)."""
    cases = []
    for direction in ("x", "y"):
        for sign in (1, -1):
            for ecc in (1, -1):
                cases.append(LoadCase(_case_name(direction, sign, ecc), direction, sign, ecc))
    if include_centred:
        for direction in ("x", "y"):
            for sign in (1, -1):
                cases.append(LoadCase(_case_name(direction, sign, 0), direction, sign, 0))
    return tuple(cases)


def _case_name(direction: Direction, sign: int, ecc: int) -> str:
    load = f"{'+' if sign > 0 else '−'}{direction}"
    return f"{load}, centred" if ecc == 0 else f"{load}, e{'+' if ecc > 0 else '−'}"


def accidental_eccentricities(project: Project, share: float) -> FloatArray:
    """(N, 2) e_a per floor: for x loads share·L_y (the mass moves along y), for y loads
    share·L_x, from the bounding box of each level's outline (EN 1998-1 §4.3.2(1) Eq. 4.3)."""
    sizes = np.array([bounding_size(level.outline) for level in project.levels])
    return share * sizes[:, ::-1]


def case_load_vector(
    case: LoadCase, forces: FloatArray, eccentricities: FloatArray
) -> tuple[FloatArray, FloatArray]:
    """The global load vector (3N,) [F_x, F_y, M] at the mass centres, and the (N, 2) offsets of
    the points of application from the mass centres.

    A force F_x at (x_m, y_m + e) has moment −e·F_x about the mass centre; F_y at (x_m + e, y_m)
    has +e·F_y (θ counter-clockwise positive)."""
    n = len(forces)
    signed = case.sign * np.asarray(forces, dtype=float)
    vector = np.zeros(3 * n)
    offsets = np.zeros((n, 2))
    if case.direction == "x":
        e = case.eccentricity_sign * eccentricities[:, 0]
        vector[0::3] = signed
        vector[2::3] = -e * signed
        offsets[:, 1] = e
    else:
        e = case.eccentricity_sign * eccentricities[:, 1]
        vector[1::3] = signed
        vector[2::3] = e * signed
        offsets[:, 0] = e
    return vector, offsets
