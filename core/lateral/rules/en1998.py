"""EN 1998-1:2004 limits: plan regularity by Eq. 4.1a/4.1b, vertical regularity, damage limitation.

The parameters are the recommended values; a national annex that sets others is a module that
replaces :data:`RULES` with its own :class:`En1998Parameters` (and a name and title of its own).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field

from core.lateral.loads import ground_parameters
from core.lateral.p_delta import StabilityLimits
from core.lateral.records import Check, ModeOrder, StaticLoad, Status, StoreyLateral, Verdict
from core.lateral.rules import common
from core.lateral.rules.base import CodeRules, DriftLimit
from core.model import LoadMethod, RuleSet, Settings

NO_NUMBER = "EN 1998-1 gives no number; threshold from ASCE 7-16 Table 12.3-2"


@dataclass(frozen=True)
class En1998Parameters:
    """Limits of EN 1998-1 and the regularity thresholds it leaves open."""

    eccentricity_limit: float = 0.30
    """e_0 ≤ 0.30 r (§4.2.3.2(6) Eq. 4.1a)."""
    radius_limit: float = 1.0
    """r ≥ l_s (§4.2.3.2(6) Eq. 4.1b)."""
    regularity: common.RegularityLimits = field(
        default_factory=lambda: common.table_12_3_2(
            Status.WARN,
            f"EN 1998-1 §4.2.3.3(3): no abrupt change of storey stiffness; {NO_NUMBER}",
            f"EN 1998-1 §4.2.3.3(3): no abrupt change of storey mass; {NO_NUMBER}",
        )
    )
    modes: common.ModeLimits = field(default_factory=common.ModeLimits)
    static_period_corner_factor: float = 4.0
    """§4.3.3.2.1(2)a: T_1 ≤ 4·T_C …"""
    static_period_limit: float = 2.0
    """… and T_1 ≤ 2.0 s."""
    stability: StabilityLimits = field(
        default_factory=lambda: StabilityLimits(
            ignore=0.10,
            amplify=0.20,
            upper=0.30,
            drift_factor=1.0,
            clause="EN 1998-1 §4.4.2.2(2)–(4): θ = P_tot·d_r/(V_tot·h) ≤ 0.10 ignored, "
            "≤ 0.20 × 1/(1 − θ), ≤ 0.30",
        )
    )


DRIFT_LIMITS = (
    DriftLimit("brittle", 0.005, "brittle non-structural elements attached", "EN 1998-1 §4.4.3.2(1)a"),
    DriftLimit("ductile", 0.0075, "ductile non-structural elements", "EN 1998-1 §4.4.3.2(1)b"),
    DriftLimit("none", 0.010, "no non-structural elements in the way", "EN 1998-1 §4.4.3.2(1)c"),
)
"""Damage limitation ν·d_r ≤ ratio·h by the kind of non-structural elements."""


@dataclass(frozen=True)
class En1998Rules(CodeRules):
    """EN 1998-1's plan regularity criteria, vertical regularity and damage limitation."""

    parameters: En1998Parameters = field(default_factory=En1998Parameters)

    def judge(self, settings: Settings, storeys: Sequence[StoreyLateral], order: ModeOrder) -> tuple[Verdict, ...]:
        verdicts: list[Verdict] = []
        for s in storeys:
            verdicts.extend(self._plan(s))
        verdicts.extend(common.regularity(storeys, self.parameters.regularity))
        limit = self.drift_limit(settings).ratio
        nu = self.drift_reduction(settings)
        clause = f"EN 1998-1 §4.4.3.2(1): ν·d_r ≤ limit·h, ν = {nu:g} (§4.4.3.2(2)); d_r = q·d_e (§4.3.4)"
        for s in storeys:
            for i in range(2):
                reduced = nu * s.drift_ratio[i] * s.p_delta_factor[i]
                where = "at the mass centre" + common.p_delta_words(s.p_delta_factor[i])
                verdicts.append(
                    common.drift(s, i, reduced, limit, clause, where, quantity="reduced design drift ν·d_r")
                )
        verdicts.extend(common.stability(storeys, self.parameters.stability))
        verdicts.extend(common.mode_order(order, self.parameters.modes))
        return tuple(verdicts)

    def stability_limits(self, settings: Settings) -> StabilityLimits:
        return self.parameters.stability

    def method_limits(
        self, settings: Settings, loads: Sequence[StaticLoad], storeys: Sequence[StoreyLateral], height: float
    ) -> tuple[Verdict, ...]:
        """§4.3.3.2.1(2): the lateral force method needs T_1 ≤ min(4·T_C, 2.0 s) in both main
        directions (T_C of the project's EN 1998-1 spectrum) and regularity in elevation (§4.2.3.3,
        judged here by the storey stiffness and mass criteria)."""
        p = self.parameters
        tc = ground_parameters(settings.eurocode8).tc
        limit = min(p.static_period_corner_factor * tc, p.static_period_limit)
        irregular = common.vertical_irregularities(storeys, p.regularity)
        out = []
        for load in loads:
            period = load.modal_period
            reasons = []
            if period > limit:
                reasons.append(f"T_1 = {period:.3g} s exceeds min(4·T_C, 2.0 s) = {limit:.3g} s")
            if irregular:
                reasons.append("not regular in elevation (" + ", ".join(irregular[:3]) + ")")
            note = (
                "; ".join(reasons) + ": the lateral force method does not apply; use the modal response "
                "spectrum analysis (§4.3.3.3)."
                if reasons
                else f"T_1 = {period:.3g} s ≤ {limit:.3g} s and regular in elevation: the lateral force method applies."
            )
            out.append(
                Verdict(
                    name=Check.STATIC_METHOD,
                    value=period,
                    limit=limit,
                    status=Status.FAIL if reasons else Status.PASS,
                    clause="EN 1998-1 §4.3.3.2.1(2): T_1 ≤ min(4·T_C, 2.0 s) and regular in elevation (§4.2.3.3)",
                    direction=load.direction,
                    note=note,
                )
            )
        return tuple(out)

    def drift_reduction(self, settings: Settings) -> float:
        """ν of §4.4.3.2(2), the project's (recommended 0.5 for importance classes I and II, 0.4
        for III and IV)."""
        return settings.drift_reduction

    def _plan(self, s: StoreyLateral) -> list[Verdict]:
        out = []
        limits = self.parameters
        # Eq. 4.1a/4.1b with the direction of analysis: e_0x and r_x belong to the analysis in y.
        for i, (ecc_axis, analysis) in enumerate((("x", "y"), ("y", "x"))):
            if s.rigidity_centre is None:
                continue
            ratio = s.eccentricity_ratio[i]
            out.append(
                Verdict(
                    name=Check.ECCENTRICITY_RATIO,
                    value=ratio,
                    limit=limits.eccentricity_limit,
                    status=Status.PASS if ratio <= limits.eccentricity_limit else Status.WARN,
                    clause="EN 1998-1 §4.2.3.2(6) Eq. 4.1a",
                    storey=s.storey,
                    direction=analysis,
                    note=f"e_0{ecc_axis}/r_{ecc_axis}; above the limit the building is not regular in plan "
                    "(§4.2.3.1: a spatial model and the regularity consequences apply).",
                )
            )
            radius = s.radius_ratio[i]
            out.append(
                Verdict(
                    name=Check.RADIUS_RATIO,
                    value=radius,
                    limit=limits.radius_limit,
                    status=Status.PASS if radius >= limits.radius_limit else Status.FAIL,
                    clause="EN 1998-1 §4.2.3.2(6) Eq. 4.1b",
                    storey=s.storey,
                    direction=analysis,
                    note=f"r_{ecc_axis}/l_s; below 1 the system is torsionally flexible (for concrete "
                    "buildings a much lower behaviour factor, §5.2.2.1).",
                )
            )
        return out


RULES = En1998Rules(
    name=RuleSet.EN1998,
    title="EN 1998-1",
    native_loads=LoadMethod.EN1998,
    drift_limits=DRIFT_LIMITS,
    continuity_clause="EN 1998-1 §4.2.3.3(2): lateral systems run without interruption from the foundation to the top",
)
