"""Checks both built-in rule sets make, with the thresholds and clause text handed in.

Each function takes the limits it judges by as arguments (from the calling rule set's
parameters), so no check asks which code it serves.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from core.lateral.cases import DIRECTIONS
from core.lateral.p_delta import StabilityLimits
from core.lateral.records import Check, ModeOrder, Status, StoreyLateral, Verdict

NO_CODE = "No code clause: EN 1998-1 and ASCE 7-16 set no such limit; a rule of thumb of concept design"
"""Clause text of the checks no code sets (mode order)."""


@dataclass(frozen=True)
class RegularityLimits:
    """Vertical regularity thresholds and the clause text they are quoted with."""

    soft_storey: tuple[float, float]
    """Stiffness below these shares of the storey above / of the three above is soft."""
    extreme_soft_storey: tuple[float, float]
    """Below these it is extremely soft."""
    extreme_status: Status
    """The status of an extremely soft storey (a code with no such class: WARN)."""
    mass_ratio: float
    """A floor heavier than this many times an adjacent one is a mass irregularity."""
    stiffness_clause: str
    mass_clause: str


def table_12_3_2(extreme_status: Status, stiffness_clause: str, mass_clause: str) -> RegularityLimits:
    """The thresholds of ASCE 7-16 Table 12.3-2: a soft storey below 70 % of the storey above or
    80 % of the three above, extremely soft below 60 % / 70 % (types 1a, 1b), a floor heavier than
    150 % of an adjacent one (type 2)."""
    return RegularityLimits((0.70, 0.80), (0.60, 0.70), extreme_status, 1.5, stiffness_clause, mass_clause)


@dataclass(frozen=True)
class ModeLimits:
    """The mode-order checks' limits."""

    torsion_period_ratio: float = 0.9
    """Period of the first rotation-dominated mode over the longest translational one."""
    torsion_mode_number: int = 3
    clause: str = NO_CODE


def regularity(storeys: Sequence[StoreyLateral], limits: RegularityLimits) -> list[Verdict]:
    """Soft storeys (stiffness over the storey above and over the three above) and heavy floors."""
    out = []
    top = len(storeys)
    for s in storeys:
        for i, d in enumerate(DIRECTIONS):
            for ratio, (warn_at, fail_at), check in (
                (
                    s.stiffness_ratio_above[i],
                    (limits.soft_storey[0], limits.extreme_soft_storey[0]),
                    Check.STIFFNESS_ABOVE,
                ),
                (
                    s.stiffness_ratio_average[i],
                    (limits.soft_storey[1], limits.extreme_soft_storey[1]),
                    Check.STIFFNESS_AVERAGE,
                ),
            ):
                if ratio is None:
                    continue
                if ratio >= warn_at:
                    status = Status.PASS
                elif ratio >= fail_at:
                    status = Status.WARN
                else:
                    status = limits.extreme_status
                out.append(
                    Verdict(
                        name=check,
                        value=ratio,
                        limit=warn_at,
                        status=status,
                        clause=limits.stiffness_clause,
                        storey=s.storey,
                        direction=d,
                        note=f"a soft storey below the limit (extremely soft below {fail_at:.0%}).",
                    )
                )
        # A roof lighter than the floor below need not be considered (ASCE 7-16 Table 12.3-2 type 2).
        candidates = [s.mass_ratio[0]]
        if s.storey + 1 < top:
            candidates.append(s.mass_ratio[1])
        finite = [r for r in candidates if r is not None]
        if finite:
            ratio = max(finite)
            out.append(
                Verdict(
                    name=Check.MASS_RATIO,
                    value=ratio,
                    limit=limits.mass_ratio,
                    status=Status.PASS if ratio <= limits.mass_ratio else Status.WARN,
                    clause=limits.mass_clause,
                    storey=s.storey,
                    note="a heavy floor between lighter ones above the limit (weight irregularity).",
                )
            )
    return out


def drift(
    storey: StoreyLateral,
    direction_index: int,
    value: float,
    limit: float,
    clause: str,
    where: str,
    quantity: str = "design drift",
) -> Verdict:
    """The drift verdict of one storey and direction: ``value`` (``quantity``, e.g. the design drift
    or the reduced design drift ν·d_r of EN 1998-1, over the storey height) against ``limit``."""
    return Verdict(
        name=Check.DRIFT,
        value=value,
        limit=limit,
        status=Status.PASS if value <= limit else Status.FAIL,
        clause=clause,
        storey=storey.storey,
        direction=DIRECTIONS[direction_index],
        note=f"{quantity} {where} over the storey height, against the drift limit.",
    )


def p_delta_words(factor: float) -> str:
    """What a drift verdict adds when P-Δ amplifies the drift (nothing when it does not)."""
    return "" if factor == 1.0 else f" × 1/(1 − θ) = {factor:.3g} for P-Δ"


def mode_order(order: ModeOrder, limits: ModeLimits) -> list[Verdict]:
    """The first rotation-dominated mode should come after both translational ones, and its period
    should be clearly shorter than theirs."""
    if order.first_torsion is None:
        return []
    return [
        Verdict(
            name=Check.TORSION_MODE_ORDER,
            value=float(order.first_torsion),
            limit=float(limits.torsion_mode_number),
            status=Status.WARN if order.torsion_before_translation else Status.PASS,
            clause=limits.clause,
            note="the first rotation-dominated mode should follow both translational ones.",
        ),
        Verdict(
            name=Check.TORSION_PERIOD_RATIO,
            value=order.period_ratio,
            limit=limits.torsion_period_ratio,
            status=Status.PASS if order.period_ratio <= limits.torsion_period_ratio else Status.WARN,
            clause=limits.clause,
            note="period of the first rotation-dominated mode over the longest translational period.",
        ),
    ]


def vertical_irregularities(storeys: Sequence[StoreyLateral], limits: RegularityLimits) -> list[str]:
    """What makes the building irregular in elevation by the stiffness and mass thresholds of
    ``limits``, in words ("soft storey 3 in x", "heavy floor 5"); empty if nothing does."""
    out = []
    for s in storeys:
        for i, d in enumerate(DIRECTIONS):
            above, average = s.stiffness_ratio_above[i], s.stiffness_ratio_average[i]
            if (above is not None and above < limits.soft_storey[0]) or (
                average is not None and average < limits.soft_storey[1]
            ):
                out.append(f"soft storey {s.storey} in {d}")
        top = s.storey == len(storeys)
        ratios = [r for r in (s.mass_ratio[0], None if top else s.mass_ratio[1]) if r is not None]
        if ratios and max(ratios) > limits.mass_ratio:
            out.append(f"heavy floor {s.storey}")
    return out


def stability(storeys: Sequence[StoreyLateral], limits: StabilityLimits) -> list[Verdict]:
    """The P-Δ verdict of each storey and direction: ignored, amplified by 1/(1 − θ), a second-order
    analysis needed, or not allowed."""
    out = []
    for s in storeys:
        for i, d in enumerate(DIRECTIONS):
            theta = s.stability_coefficient[i]
            if theta <= limits.ignore:
                status, note = Status.PASS, f"θ ≤ {limits.ignore:g}: second-order effects need not be considered."
            elif theta <= limits.amplify:
                status = Status.PASS
                note = f"drifts and element demands of this storey are multiplied by 1/(1 − θ) = {1 / (1 - theta):.3g}."
            elif theta <= limits.upper:
                status = Status.WARN
                note = (
                    f"θ above {limits.amplify:g}: a second-order analysis is needed; 1/(1 − θ) = "
                    f"{1 / (1 - theta):.3g} is applied as an estimate."
                )
            else:
                status, note = Status.FAIL, f"θ above {limits.upper:g} is not allowed: the storey is too flexible."
            out.append(
                Verdict(
                    name=Check.STABILITY,
                    value=theta,
                    limit=limits.upper,
                    status=status,
                    clause=limits.clause,
                    storey=s.storey,
                    direction=d,
                    note=note,
                )
            )
    return out
