"""ASCE 7-16 limits: torsional irregularity (Table 12.3-1), vertical irregularity (Table 12.3-2),
allowable storey drift (§12.12.1, Table 12.12-1)."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field

from core.lateral.cases import DIRECTIONS
from core.lateral.records import Check, ModeOrder, Status, StoreyLateral, Verdict
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
                verdicts.append(common.drift(s, i, value, limit, clause, where))
        verdicts.extend(common.mode_order(order, self.parameters.modes))
        return tuple(verdicts)

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
)
