"""ASCE 7-16 limits: torsional irregularity (Table 12.3-1), vertical irregularity (Table 12.3-2),
allowable storey drift (§12.12.1, Table 12.12-1)."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field

from core.lateral.cases import DIRECTIONS
from core.lateral.p_delta import StabilityLimits
from core.lateral.records import Check, ModeOrder, StaticLoad, Status, StoreyLateral, Verdict
from core.lateral.response import drift_amplification
from core.lateral.rules import common
from core.lateral.rules.base import CodeRules, DriftLimit
from core.model import LoadMethod, RuleSet, Settings


@dataclass(frozen=True)
class Asce7Parameters:
    """The limits of ASCE 7-16 that Poise judges."""

    torsion_irregular: float = 1.2
    """Table 12.3-1 type 1a: torsional irregularity above this ratio."""
    torsion_extreme: float = 1.4
    """Table 12.3-1 type 1b: extreme torsional irregularity above this ratio."""
    regularity: common.RegularityLimits = field(
        default_factory=lambda: common.table_12_3_2(
            Status.FAIL, "ASCE 7-16 Table 12.3-2 types 1a and 1b", "ASCE 7-16 Table 12.3-2 type 2"
        )
    )
    modes: common.ModeLimits = field(default_factory=common.ModeLimits)
    static_height_limit: float = 48.768
    """Table 12.6-1: 160 ft, m."""
    static_period_factor: float = 3.5
    """Table 12.6-1: T < 3.5·T_s for taller regular structures."""
    stability_ignore: float = 0.10
    """§12.8.7: θ ≤ 0.10, P-Δ need not be considered."""
    stability_beta: float = 1.0
    """β of Eq. 12.8-17 (§12.8.7 permits 1.0, the conservative value)."""
    stability_cap: float = 0.25
    """θ_max ≤ 0.25 (Eq. 12.8-17)."""


_TABLE = "ASCE 7-16 Table 12.12-1"
DRIFT_LIMITS = (
    DriftLimit("other_II", 0.020, "all other structures, risk category I or II", _TABLE),
    DriftLimit("other_III", 0.015, "all other structures, risk category III", _TABLE),
    DriftLimit("other_IV", 0.010, "all other structures, risk category IV", _TABLE),
    DriftLimit(
        "low_rise_II",
        0.025,
        "four storeys or fewer, finishes built for the drift, risk category I or II",
        _TABLE,
    ),
    DriftLimit(
        "low_rise_III", 0.020, "four storeys or fewer, finishes built for the drift, risk category III", _TABLE
    ),
    DriftLimit(
        "low_rise_IV", 0.015, "four storeys or fewer, finishes built for the drift, risk category IV", _TABLE
    ),
)
"""Allowable storey drift Δ_a / h_sx by structure and risk category (masonry rows left out: Poise
has no masonry walls)."""


@dataclass(frozen=True)
class Asce7Rules(CodeRules):
    """ASCE 7-16's torsional and vertical irregularities and its allowable drift."""

    parameters: Asce7Parameters = field(default_factory=Asce7Parameters)

    def judge(self, settings: Settings, storeys: Sequence[StoreyLateral], order: ModeOrder) -> tuple[Verdict, ...]:
        verdicts: list[Verdict] = []
        for s in storeys:
            verdicts.extend(self._torsion(s))
        verdicts.extend(common.regularity(storeys, self.parameters.regularity))
        limit = self.drift_limit(settings).ratio
        clause = "ASCE 7-16 §12.12.1 (Δ = C_d·δ_e/I_e, §12.8.6; at the edges if torsionally irregular)"
        for s in storeys:
            for i in range(2):
                irregular = s.torsion_ratio[i] > self.parameters.torsion_irregular
                value = s.corner_drift_ratio[i] if irregular else s.drift_ratio[i]
                where = "at the worst corner" if irregular else "at the mass centre"
                where += common.p_delta_words(s.p_delta_factor[i])
                verdicts.append(common.drift(s, i, value * s.p_delta_factor[i], limit, clause, where))
        verdicts.extend(common.stability(storeys, self.stability_limits(settings)))
        verdicts.extend(common.mode_order(order, self.parameters.modes))
        return tuple(verdicts)

    def stability_limits(self, settings: Settings) -> StabilityLimits:
        """§12.8.7: θ = P_x·Δ·I_e/(V_x·h_sx·C_d) ≤ 0.10 ignored, up to θ_max = 0.5/(β·C_d) ≤ 0.25
        amplified by 1/(1 − θ), above θ_max not allowed. Δ·I_e/C_d is the elastic drift δ_e under
        the design loads, so the design drift is divided by the loads' own drift factor."""
        p = self.parameters
        cd = settings.asce7.deflection_amplification
        theta_max = min(0.5 / (p.stability_beta * cd), p.stability_cap)
        return StabilityLimits(
            ignore=p.stability_ignore,
            amplify=theta_max,
            upper=theta_max,
            drift_factor=1.0 / drift_amplification(settings),
            clause=f"ASCE 7-16 §12.8.7: θ ≤ 0.10 ignored, else × 1/(1 − θ); θ ≤ θ_max = 0.5/(β·C_d) = "
            f"{theta_max:.3g} (β = {p.stability_beta:g})",
        )

    def method_limits(
        self, settings: Settings, loads: Sequence[StaticLoad], storeys: Sequence[StoreyLateral], height: float
    ) -> tuple[Verdict, ...]:
        """Table 12.6-1: the equivalent lateral force procedure is permitted in seismic design
        categories B and C; in D, E and F only for a structure with none of the irregularities
        Poise finds (torsional, Table 12.3-1 type 1; soft storey and weight, Table 12.3-2 types 1
        and 2) that is at most 160 ft tall or has T < 3.5·T_s, and for buildings of risk category I
        or II of at most two storeys (the risk category of the drift limit's row). Light-frame
        construction, which the table also permits, is not known to Poise."""
        p = self.parameters
        category = settings.asce7.design_category
        ts = settings.asce7.sd1 / settings.asce7.sds
        limit = p.static_period_factor * ts
        irregular = [
            f"torsional irregularity storey {s.storey} in {d}"
            for s in storeys
            for i, d in enumerate(DIRECTIONS)
            if s.torsion_ratio[i] > p.torsion_irregular
        ]
        irregular += common.vertical_irregularities(storeys, p.regularity)
        clause = "ASCE 7-16 Table 12.6-1 (SDC, height 160 ft, T < 3.5·T_s, irregularities)"
        out = []
        for load in loads:
            period = load.period
            reasons = []
            low_risk = not self.drift_row(settings).key.endswith(("_III", "_IV"))
            if category in ("D", "E", "F") and not (low_risk and len(storeys) <= 2):
                if irregular:
                    reasons.append(f"SDC {category} with " + ", ".join(irregular[:3]))
                if height > p.static_height_limit and period >= limit:
                    reasons.append(
                        f"SDC {category}, taller than 160 ft ({height:.3g} m) with T = {period:.3g} s ≥ 3.5·T_s "
                        f"= {limit:.3g} s"
                    )
            if reasons:
                note = "; ".join(reasons) + ": the equivalent lateral force procedure is not permitted; use the "
                note += "modal response spectrum analysis (§12.9.1)."
            elif category in ("D", "E", "F") and height <= p.static_height_limit:
                note = f"SDC {category}, at most 160 ft and regular: the equivalent lateral force procedure is "
                note += "permitted (T is limited to 3.5·T_s only above 160 ft)."
            else:
                note = f"SDC {category}: the equivalent lateral force procedure is permitted."
            out.append(
                Verdict(
                    name=Check.STATIC_METHOD,
                    value=period,
                    limit=limit,
                    status=Status.FAIL if reasons else Status.PASS,
                    clause=clause,
                    direction=load.direction,
                    note=note,
                )
            )
        return tuple(out)

    def _torsion(self, s: StoreyLateral) -> list[Verdict]:
        out = []
        p = self.parameters
        for i, d in enumerate(DIRECTIONS):
            ratio = s.torsion_ratio[i]
            if ratio <= p.torsion_irregular:
                status, note = Status.PASS, "no torsional irregularity."
            elif ratio <= p.torsion_extreme:
                status, note = Status.WARN, "torsional irregularity type 1a; A_x amplifies accidental torsion."
            else:
                status, note = Status.FAIL, "extreme torsional irregularity type 1b (§12.3.3.1 limits its use)."
            out.append(
                Verdict(
                    name=Check.TORSION_RATIO,
                    value=ratio,
                    limit=p.torsion_irregular,
                    status=status,
                    clause=f"ASCE 7-16 Table 12.3-1 types 1a (> {p.torsion_irregular:g}) "
                    f"and 1b (> {p.torsion_extreme:g})",
                    storey=s.storey,
                    direction=d,
                    note=f"largest storey drift at an end over the average of both ends; {note}",
                )
            )
        return out


RULES = Asce7Rules(
    name=RuleSet.ASCE7,
    title="ASCE 7-16",
    native_loads=LoadMethod.ASCE7,
    drift_limits=DRIFT_LIMITS,
    continuity_clause=(
        "ASCE 7-16 Table 12.3-1 Type 4 and Table 12.3-2 Type 4: offsets and in-plane discontinuities"
        " of vertical elements"
    ),
)
