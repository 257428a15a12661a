"""Immutable results of the lateral checks (:func:`core.lateral.lateral_checks`).

Conventions (design.md): storeys and levels are numbered 1…N from the ground up, storey j lies
below level j; directions are ``"x"`` and ``"y"``; lengths m, forces kN, moments kN·m, masses t.
Per-floor arrays have one row per level, bottom first. Every judged figure is also a
:class:`Verdict` that carries its clause or source as data, so views can show where a limit
comes from. All figures are concept-stage estimates.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from enum import StrEnum

from core.arrays import FloatArray, sums_from_top
from core.lateral.cases import DIRECTIONS, Direction, LoadCase
from core.model import Point


class CheckGroup(StrEnum):
    """What a check is about; views colour and sort verdicts by group."""

    TORSION = "torsion"
    DRIFT = "drift"
    REGULARITY = "regularity"
    MODES = "modes"
    METHOD = "analysis method"
    STABILITY = "second-order effects"


class Check(StrEnum):
    """The name of a judged figure (:attr:`Verdict.name`); its value is the figure in words, as
    reports print it. Views pick verdicts by member, never by text."""

    TORSION_RATIO = "torsion ratio"
    ECCENTRICITY_RATIO = "eccentricity over torsional radius"
    RADIUS_RATIO = "torsional radius over radius of gyration"
    STIFFNESS_ABOVE = "storey stiffness over storey above"
    STIFFNESS_AVERAGE = "storey stiffness over three storeys above"
    MASS_RATIO = "mass over adjacent storey"
    DRIFT = "storey drift ratio"
    TORSION_MODE_ORDER = "first rotational mode"
    TORSION_PERIOD_RATIO = "rotational over translational period"
    STATIC_METHOD = "lateral force method applies"
    STABILITY = "P-Δ stability coefficient θ"
    CONTINUITY = "share of an element's length carried on down"

    @property
    def group(self) -> CheckGroup:
        return _GROUPS[self]


_GROUPS = {
    Check.TORSION_RATIO: CheckGroup.TORSION,
    Check.ECCENTRICITY_RATIO: CheckGroup.TORSION,
    Check.RADIUS_RATIO: CheckGroup.TORSION,
    Check.STIFFNESS_ABOVE: CheckGroup.REGULARITY,
    Check.STIFFNESS_AVERAGE: CheckGroup.REGULARITY,
    Check.MASS_RATIO: CheckGroup.REGULARITY,
    Check.DRIFT: CheckGroup.DRIFT,
    Check.TORSION_MODE_ORDER: CheckGroup.MODES,
    Check.TORSION_PERIOD_RATIO: CheckGroup.MODES,
    Check.STATIC_METHOD: CheckGroup.METHOD,
    Check.STABILITY: CheckGroup.STABILITY,
    Check.CONTINUITY: CheckGroup.REGULARITY,
}


class Status(StrEnum):
    """How a figure compares with its limit under the active rule set."""

    PASS = "pass"
    WARN = "warn"
    FAIL = "fail"


STATUS_ORDER = {Status.PASS: 0, Status.WARN: 1, Status.FAIL: 2}


@dataclass(frozen=True)
class Verdict:
    """One judged figure: a value against a limit, with the clause the limit comes from."""

    name: Check
    """What is judged (its value is the figure in words, e.g. ``"torsion ratio"``)."""
    value: float
    """The computed figure (may be ``inf`` where a denominator vanishes)."""
    limit: float
    """The limit the value is compared with."""
    status: Status
    clause: str
    """Where the limit comes from, in words the user reads: standard and clause, or that no code
    sets it."""
    storey: int | None = None
    """Storey (1-based) the figure belongs to; None for a whole-building figure."""
    direction: Direction | None = None
    """Direction of analysis, where it matters."""
    note: str = ""
    """One sentence saying what the value means and what follows from the status."""


@dataclass(frozen=True)
class StaticLoad:
    """The equivalent static load in one direction: period, base shear and storey forces."""

    direction: Direction
    method: str
    """``"en1998"``, ``"asce7"`` or ``"coefficient"`` (core.model.LoadMethod values)."""
    modal_period: float
    """Period of the mode with the largest effective mass in this direction, s."""
    period: float
    """Period used for the load, s: the modal one, capped at C_u·T_a for ASCE 7 (§12.8.2)."""
    approximate_period_en1998: float
    """EN 1998-1 §4.3.3.2.2 Eq. (4.6) T_1 = C_t·H^(3/4), s."""
    approximate_period_asce7: float
    """ASCE 7 §12.8.2.1 Eq. 12.8-7 T_a = C_t·h_n^x, s."""
    period_cap_asce7: float
    """C_u·T_a (ASCE 7 Table 12.8-1), s."""
    coefficient: float
    """Base shear over seismic weight: S_d(T)·λ/g (EN 1998-1), C_s (ASCE 7) or the plain value."""
    base_shear: float
    """kN."""
    distribution_exponent: float
    """k of the vertical distribution F_i ∝ m_i·z_i^k (1 for EN 1998-1 §4.3.3.2.3 and the plain
    coefficient; ASCE 7 §12.8.3 k from the period)."""
    storey_forces: FloatArray
    """(N,) force at each floor, kN, positive in +direction."""
    clause: str
    """Clauses of the spectrum, base shear and distribution used."""

    @property
    def storey_shears(self) -> FloatArray:
        """(N,) shear in each storey: the sum of the floor forces at and above it, kN."""
        return sums_from_top(self.storey_forces)


@dataclass(frozen=True)
class CaseResult:
    """Response of the rigid-diaphragm model to one static load case (elastic, unamplified)."""

    case: LoadCase
    forces: FloatArray
    """(N,) floor force along the load direction, signed, kN."""
    application_points: FloatArray
    """(N, 2) plan points where the floor forces act (mass centre + accidental eccentricity)."""
    displacements: FloatArray
    """(N, 3) [u_x, u_y, θ] of each floor at its mass centre, m and rad."""
    storey_shears: FloatArray
    """(N,) storey shear along the load direction, signed, kN."""
    drifts: FloatArray
    """(N,) storey drift along the load direction at the floor's mass centre, signed, m."""
    end_drifts: FloatArray
    """(N, 2) storey drift along the load direction at the two extreme points of the outline
    across the load (lower, upper y for an x load; lower, upper x for a y load), signed, m."""
    end_points: FloatArray
    """(N, 2, 2) the two extreme outline points of each level whose drifts are in ``end_drifts``."""
    torsion_ratio: FloatArray
    """(N,) max |end drift| over the average of the two ends' drifts (ASCE 7 Table 12.3-1);
    ``inf`` if the ends' average does not move with the load."""
    end_displacements: FloatArray
    """(N, 2) displacement along the load direction at the same extreme points, m."""
    amplification: FloatArray
    """(N,) A_x = (δ_max / 1.2 δ_avg)², 1 ≤ A_x ≤ 3 (ASCE 7 §12.8.4.3 Eq. 12.8-14)."""
    corner_drifts: FloatArray
    """(N,) largest |storey drift along the load direction| at any outline vertex, m."""


@dataclass(frozen=True)
class StoreyLateral:
    """Centres, radii and regularity figures of one storey, and its worst-case drifts."""

    storey: int
    """1-based; the storey below level ``storey``."""
    name: str
    """Name of the level at the top of the storey."""
    height: float
    """Storey height, m."""
    mass_centre: Point
    """Centre of mass of the floor at the top of the storey, m."""
    rigidity_centre: Point | None
    """Definition (a), storey centre of rigidity: the centre of the elements' storey stiffnesses
    in this storey, each element's storey stiffness taken as storey shear over storey drift of that
    element alone under the static load pattern (exact for one storey; EN 1998-1 §4.2.3.2(8)
    allows such approximations). None if the storey cannot resist translation."""
    no_twist_centre: Point | None
    """Definition (b), floor centre of rigidity: the point of the floor through which the storey
    forces of the static pattern must act, on every floor at once, for no floor to rotate (full
    multi-storey stiffness). The x coordinate comes from the y pattern and y from the x pattern.
    None where the pattern puts no force on the floor."""
    eccentricity: tuple[float, float]
    """(e_0x, e_0y) = rigidity centre (a) − mass centre, m (0 where (a) is undefined)."""
    no_twist_eccentricity: tuple[float, float]
    """(e_x, e_y) = no-twist centre (b) − mass centre, m."""
    lateral_stiffness: tuple[float, float]
    """(K_x, K_y): the storey's translational stiffness from definition (a), kN/m."""
    torsional_stiffness: float
    """The storey's torsional stiffness about its rigidity centre (a), kN·m/rad."""
    torsional_radius: tuple[float, float]
    """(r_x, r_y): r_x = √(K_θ / K_y), r_y = √(K_θ / K_x), m (EN 1998-1 §4.2.3.2(6))."""
    radius_of_gyration: float
    """l_s = √(J/m) of the floor mass, m (EN 1998-1 §4.2.3.2(6))."""
    eccentricity_ratio: tuple[float, float]
    """(|e_0x| / r_x, |e_0y| / r_y); EN 1998-1 §4.2.3.2(6) Eq. (4.1a) asks ≤ 0.30."""
    radius_ratio: tuple[float, float]
    """(r_x / l_s, r_y / l_s); EN 1998-1 §4.2.3.2(6) Eq. (4.1b) asks ≥ 1."""
    torsion_ratio: tuple[float, float]
    """Worst torsion ratio over the load cases in x and in y (ASCE 7 Table 12.3-1)."""
    amplification: tuple[float, float]
    """Worst A_x of the level over the cases in x and in y (ASCE 7 §12.8.4.3)."""
    drift_ratio: tuple[float, float]
    """Design storey drift at the mass centre over the storey height, worst case, x and y."""
    corner_drift_ratio: tuple[float, float]
    """Design storey drift at the worst outline vertex over the storey height, x and y."""
    storey_stiffness: tuple[float | None, float | None]
    """Storey shear over storey drift at the mass centre under the centred load cases, kN/m; None
    where the mass centre does not drift with the load (a mass centre far off the plan)."""
    stiffness_ratio_above: tuple[float | None, float | None]
    """Storey stiffness over that of the storey above, x and y; None where it does not apply
    (the top storey, or a storey above without stiffness)."""
    stiffness_ratio_average: tuple[float | None, float | None]
    """Storey stiffness over the average of the three storeys above; None if fewer than three."""
    mass_ratio: tuple[float | None, float | None]
    """Floor mass over that of the floor below and of the floor above; None where there is no
    such floor or it has no mass."""
    gravity_load: float = 0.0
    """P-Δ gravity load at and above this storey, kN (``Settings.gravity_factor`` × seismic weight)."""
    stability_coefficient: tuple[float, float] = (0.0, 0.0)
    """θ in x and y by the rule set's definition (EN 1998-1 §4.4.2.2(2) P_tot·d_r/(V_tot·h);
    ASCE 7-16 §12.8.7 Eq. 12.8-16 P_x·Δ·I_e/(V_x·h_sx·C_d)), from the worst design drift and the
    static storey shear."""
    p_delta_factor: tuple[float, float] = (1.0, 1.0)
    """1/(1 − θ) where θ is above the code's threshold for ignoring P-Δ, else 1; it multiplies the
    storey's judged drifts and the element demands in it (at θ beyond the code's upper limit, the
    factor of that limit: the verdict fails anyway)."""


@dataclass(frozen=True)
class ElementDemand:
    """Forces in one element: its shear per storey and case, the envelope, and its share."""

    element: str
    """Element id."""
    storeys: tuple[int, ...]
    """The storeys it spans, bottom up (1-based)."""
    shears: FloatArray
    """(cases, storeys) shear along the element's line in each storey it spans, signed, kN."""
    shares: FloatArray
    """(cases, storeys) component of that shear along the case's load direction over the storey
    shear of the case (1 = the element carries the whole storey)."""
    shear_envelope: FloatArray
    """(storeys,) the largest |shear| over the cases, kN."""
    share_envelope: FloatArray
    """(storeys,) the largest share over the cases."""
    brace_force_envelope: FloatArray
    """(storeys, braces per storey) largest |axial force| in each brace over the cases, kN;
    an empty (storeys, 0) array for elements without braces."""
    base_moment_envelope: float
    """Largest |overturning moment| at the element's base over the cases, kN·m: Σ F_k·z_k of the
    floor forces it resists, z_k above its base (a wall's base bending moment; for a frame the
    couple of its column and brace forces)."""


@dataclass(frozen=True)
class ModeOrder:
    """Where the first torsion-dominated mode falls among the modes."""

    first_x: int | None
    """Number of the first x-dominated mode (None if none)."""
    first_y: int | None
    first_torsion: int | None
    period_ratio: float
    """Period of the first torsion-dominated mode over the longest translational period (0 if no
    torsion-dominated mode)."""
    torsion_before_translation: bool
    """True if a torsion-dominated mode comes before both an x and a y mode have appeared."""


@dataclass(frozen=True)
class LateralResults:
    """Everything the lateral checks computed for one project state."""

    rule_set: str
    """The name of the rule set whose limits judge the verdicts (``Settings.rule_set``)."""
    rule_set_title: str
    """That rule set's code as the user reads it (``"EN 1998-1"``)."""
    loads: tuple[StaticLoad, StaticLoad]
    """The static load in x and in y."""
    accidental_eccentricity: FloatArray
    """(N, 2) e_a of each floor for loads in x (moves along y) and in y (moves along x), m."""
    drift_amplification: float
    """Factor from elastic drifts under the design loads to design drifts: q_d = q (EN 1998-1
    §4.3.4), C_d/I_e (ASCE 7 §12.8.6) or 1 (plain coefficient)."""
    drift_reduction: float
    """ν of EN 1998-1 §4.4.3.2 applied before comparing with the limit (1 for the ASCE 7 set)."""
    drift_limit: float
    """The storey drift ratio limit the drifts were judged by."""
    drift_basis: str
    """Where that limit comes from, in words (a row of the code's table, or the project's own)."""
    cases: tuple[CaseResult, ...]
    """The reported load cases: ±x and ±y each with ±e (eight), plus ±x and ±y centred if the
    project asks for them."""
    storeys: tuple[StoreyLateral, ...]
    elements: Sequence[ElementDemand]
    """One per element, in the project's order; built when first read."""
    mode_order: ModeOrder
    verdicts: tuple[Verdict, ...]
    notes: tuple[str, ...] = ()
    """Sentences to show beside the verdicts (e.g. one code's limits judging another code's loads)."""

    def worst_torsion_ratio(self, direction: Direction) -> float:
        """The largest torsion ratio of any storey under the cases in ``direction``."""
        values = [s.torsion_ratio[DIRECTIONS.index(direction)] for s in self.storeys]
        return max(values, default=1.0)

    def storey(self, storey: int) -> StoreyLateral:
        """The figures of storey ``storey`` (1-based)."""
        return self.storeys[storey - 1]

    def load(self, direction: Direction) -> StaticLoad:
        return self.loads[DIRECTIONS.index(direction)]

    def cases_in(self, direction: Direction) -> tuple[CaseResult, ...]:
        return tuple(c for c in self.cases if c.case.direction == direction)

    def element(self, element_id: str) -> ElementDemand:
        for demand in self.elements:
            if demand.element == element_id:
                return demand
        raise KeyError(element_id)

    @property
    def status(self) -> Status:
        """The worst status of all verdicts (pass if there are none)."""
        return max((v.status for v in self.verdicts), key=STATUS_ORDER.__getitem__, default=Status.PASS)

    @property
    def worst_torsion(self) -> Verdict | None:
        """The torsion-ratio verdict with the largest value, if the rule set judges it."""
        torsion = [v for v in self.verdicts if v.name is Check.TORSION_RATIO]
        return max(torsion, key=lambda v: v.value, default=None)

