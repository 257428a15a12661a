"""What the one-page sheet says, gathered from the project and its results (Qt-free).

The painter modules only lay out and draw; every figure, word and choice on the sheet is made
here, so tests can check the content without a display: which level is drawn and why, which
modes are listed, the checks table, the assumptions and the caution.
"""

from __future__ import annotations

import datetime as _dt
import math
from dataclasses import dataclass

from app.kinds import app_kinds
from core.lateral.cases import DIRECTIONS
from core.lateral.records import STATUS_ORDER, Check, LateralResults, Status, Verdict
from core.model import (
    LoadMethod,
    Project,
    Settings,
)
from core.report.figures import CODE_LIMITS, verdict_figures
from core.report.summary import CAUTION
from core.results import Mode, Results

MASS_SHARE_TARGET = 0.90
"""Modes are listed until their effective masses reach this share in x and in y
(EN 1998-1 §4.3.3.3.1(3): the modes taken into account sum to at least 90 % of the mass)."""

MIN_MODES_LISTED = 3


def period_text(period: float) -> str:
    """A period as printed on the sheet, in seconds (three decimals, as in the CLI summary)."""
    return f"{period:.3f}"


@dataclass(frozen=True)
class TitleFields:
    """The title block: who, what and when."""

    project: str
    job_number: str
    engineer: str
    date: str
    revision: str
    file_name: str


SHORT_NAMES: dict[Check, str] = {
    Check.ECCENTRICITY_RATIO: "e₀ / r",
    Check.RADIUS_RATIO: "r / l_s",
    Check.STIFFNESS_ABOVE: "stiffness / storey above",
    Check.STIFFNESS_AVERAGE: "stiffness / 3 storeys above",
    Check.MASS_RATIO: "mass / adjacent",
    Check.DRIFT: "drift ratio",
    Check.STABILITY: "θ (P-Δ)",
    Check.STATIC_METHOD: "static method",
}
"""Column headings for the verdict names of core.lateral, short enough for a narrow table; the
footnotes spell each one out. Names not listed are shown in full."""


@dataclass(frozen=True)
class ChecksColumn:
    """One judged figure of the per-storey checks: its name, direction, limit and clauses."""

    name: str
    label: str
    """The short heading (SHORT_NAMES), or the name itself."""
    direction: str | None
    limit: float | None
    """The limit if it is the same for every storey, else None (cells then show their own)."""
    clauses: tuple[str, ...]
    """Footnote numbers (1-based, into SheetContent.clauses) of the clauses this column uses."""



@dataclass(frozen=True)
class ChecksCell:
    value: float
    limit: float
    status: Status


@dataclass(frozen=True)
class ChecksRow:
    storey: int
    name: str
    cells: tuple[ChecksCell | None, ...]


@dataclass(frozen=True)
class BuildingCheck:
    """A judged figure that belongs to the whole building (e.g. the mode order)."""

    text: str
    status: Status
    clause: int
    """Footnote number of its clause."""


@dataclass(frozen=True)
class SheetContent:
    """Everything the sheet shows, in the order it is drawn."""

    title: TitleFields
    level: int
    """The level drawn in plan (1-based)."""
    level_reason: str
    modes: tuple[Mode, ...]
    """The modes listed in the table."""
    modes_total: int
    sketched: tuple[Mode, ...]
    """Modes 1–3 (fewer if the building has fewer), drawn as small sketches."""
    columns: tuple[ChecksColumn, ...]
    rows: tuple[ChecksRow, ...]
    """Storeys top first, as a building reads."""
    building_checks: tuple[BuildingCheck, ...]
    clauses: tuple[str, ...]
    """Footnotes of the checks: the clause or source of each limit."""
    rule_set: str
    assumptions: tuple[str, ...]
    caution: str
    omitted: tuple[int, ...] = ()
    """Storeys left out of the checks table because the page was full (passing ones first)."""


def worst_torsion_level(results: Results) -> tuple[int, str]:
    """The level with the largest torsion ratio in either direction, and a phrase saying so.

    An infinite ratio (the ends' average does not move) counts as the worst, an undefined one as
    none; of equal ratios the lowest storey is taken.
    """

    def worst(ratios: tuple[float, float]) -> float:
        return max((r for r in ratios if not math.isnan(r)), default=0.0)

    best = max(results.lateral.storeys, key=lambda s: (worst(s.torsion_ratio), -s.storey))
    ratio = worst(best.torsion_ratio)
    direction = DIRECTIONS[int(best.torsion_ratio[1] == ratio)]
    shown = "∞" if math.isinf(ratio) else f"{ratio:.2f}"
    return best.storey, f"largest torsion ratio, {shown} in {direction}"


def listed_modes(modes: tuple[Mode, ...], capacity: int | None = None) -> tuple[Mode, ...]:
    """The modes for the table: up to 90 % effective mass in x and y, at least three, at most
    ``capacity`` (what fits on the page)."""
    needed = len(modes)
    for mode in modes:
        if mode.cumulative[0] >= MASS_SHARE_TARGET and mode.cumulative[1] >= MASS_SHARE_TARGET:
            needed = mode.number
            break
    count = min(len(modes), max(needed, MIN_MODES_LISTED))
    if capacity is not None:
        count = min(count, max(capacity, 1))
    return modes[:count]


def _storey_verdicts(lateral: LateralResults) -> list[Verdict]:
    return [v for v in lateral.verdicts if v.storey is not None]


def checks_table(
    lateral: LateralResults, level_names: dict[int, str]
) -> tuple[tuple[ChecksColumn, ...], tuple[ChecksRow, ...], tuple[BuildingCheck, ...], tuple[str, ...]]:
    """Columns (one per judged figure and direction), rows (storeys, top first), the whole-building
    checks and the clause footnotes, from the verdicts of the active rule set."""
    clauses: list[str] = []

    def footnote(text: str) -> int:
        if text not in clauses:
            clauses.append(text)
        return clauses.index(text) + 1

    keys: list[tuple[str, str | None]] = []
    by_key: dict[tuple[str, str | None], list[Verdict]] = {}
    for verdict in _storey_verdicts(lateral):
        key = (verdict.name, verdict.direction)
        if key not in by_key:
            keys.append(key)
            by_key[key] = []
        by_key[key].append(verdict)
    names = list(dict.fromkeys(name for name, _ in keys))
    keys.sort(key=lambda k: (names.index(k[0]), _DIRECTION_ORDER.get(k[1], 2)))
    columns = []
    for key in keys:
        verdicts = by_key[key]
        limits = {v.limit for v in verdicts}
        label = SHORT_NAMES.get(key[0], key[0])
        named = f"{label} — {key[0]}" if label != key[0] else key[0]
        numbers = tuple(dict.fromkeys(footnote(f"{named}: {v.clause}") for v in verdicts))
        columns.append(ChecksColumn(key[0], label, key[1], limits.pop() if len(limits) == 1 else None,
                                    tuple(str(n) for n in numbers)))
    storeys = sorted({v.storey for v in _storey_verdicts(lateral)} | set(level_names), reverse=True)
    rows = []
    for storey in storeys:
        cells = []
        for key in keys:
            found = [v for v in by_key[key] if v.storey == storey]
            if found:
                worst = max(found, key=lambda v: STATUS_ORDER[v.status])
                cells.append(ChecksCell(worst.value, worst.limit, worst.status))
            else:
                cells.append(None)
        rows.append(ChecksRow(storey, level_names.get(storey, f"storey {storey}"), tuple(cells)))
    building = tuple(
        BuildingCheck(_building_text(v), v.status, footnote(v.clause))
        for v in lateral.verdicts
        if v.storey is None
    )
    return tuple(columns), tuple(rows), building, tuple(clauses)


_DIRECTION_ORDER = {"x": 0, "y": 1}


def _building_text(verdict: Verdict) -> str:
    direction = f" ({verdict.direction})" if verdict.direction else ""
    note = f"; {verdict.note.rstrip('.')}" if verdict.note else ""
    value, limit = verdict_figures(verdict)
    return f"{verdict.name}{direction}: {value} against {limit}{note}"


def _spectrum_text(settings: Settings) -> str:
    method = settings.load_method
    if method is LoadMethod.EN1998:
        s = settings.eurocode8
        return (
            f"EN 1998-1 §3.2.2.5 design spectrum, type {s.spectrum_type}, ground {s.ground_type}: "
            f"a_g = {s.ag:g} g, q = {s.behaviour_factor:g}, β = {s.lower_bound:g}"
        )
    if method is LoadMethod.ASCE7:
        s = settings.asce7
        return (
            f"ASCE 7 §11.4 design spectrum: S_DS = {s.sds:g} g, S_D1 = {s.sd1:g} g, S_1 = {s.s1:g} g, "
            f"T_L = {s.long_period:g} s, R = {s.response_modification:g}, I_e = {s.importance:g}, "
            f"C_d = {s.deflection_amplification:g}"
        )
    return f"base shear coefficient {settings.base_shear_coefficient:g} of the seismic weight"


def _stiffness_text(project: Project) -> str:
    """How each kind present enters the stiffness, in the order the kinds are registered."""
    parts = []
    for spec in app_kinds():
        of_kind = [e.properties for e in project.elements if e.kind == spec.kind]
        if of_kind:
            parts.append(spec.stiffness_note(of_kind))
    return "Stiffness factors: " + ("; ".join(parts) if parts else "no elements") + "."


def _loads_text(lateral: LateralResults) -> str:
    parts = [
        f"{load.direction}: T = {period_text(load.period)} s, V_b = {load.base_shear:,.0f} kN "
        f"({load.coefficient:.3f} W)"
        for load in lateral.loads
    ]
    return "Static loads " + "; ".join(parts) + "."


def assumptions(project: Project, results: Results) -> tuple[str, ...]:
    """The key assumptions behind the figures, one sentence each."""
    settings = project.settings
    lines = [
        "Floors are rigid in their plane: three degrees of freedom per floor at its mass centre.",
        "Elements resist only in their own plane; out-of-plane stiffness is neglected; bases fixed.",
        _stiffness_text(project),
        "Mass from the seismic weight per floor area plus point masses; "
        f"total {results.total_mass:,.0f} t over {len(results.floors)} floor(s).",
        "Spectrum: " + _spectrum_text(settings) + ".",
        f"Accidental eccentricity ±{settings.accidental_eccentricity:.0%} of the plan dimension "
        "across the load, same sense on all floors (EN 1998-1 §4.3.2; ASCE 7 §12.8.4.2).",
    ]
    lateral = results.lateral
    lines.append(_loads_text(lateral))
    lines.append(
        f"Drift: design drift d_r = {lateral.drift_amplification:g} × elastic drift; ν·d_r with "
        f"ν = {lateral.drift_reduction:g} is held to the limit {lateral.drift_basis}. "
        f"{CODE_LIMITS}: {lateral.rule_set_title}."
    )
    lines.extend(lateral.notes)
    return tuple(lines)


def check_level(project: Project, level: int) -> None:
    """Raise ValueError unless ``level`` (1-based) is one of the project's levels."""
    count = len(project.levels)
    if not 1 <= level <= count:
        raise ValueError(f"level {level} does not exist: the project has levels 1 to {count}")


def sheet_content(
    project: Project,
    results: Results,
    level: int | None = None,
    file_name: str = "",
    revision: str = "",
    date: str | None = None,
) -> SheetContent:
    """Gather the sheet's content. ``level`` is 1-based; None picks the worst torsion ratio.

    Raises ValueError for a level the project does not have.
    """
    if level is None:
        level, reason = worst_torsion_level(results)
    else:
        check_level(project, level)
        reason = "chosen level"
    names = {f.level: f.name for f in results.floors}
    columns, rows, building, clauses = checks_table(results.lateral, names)
    return SheetContent(
        title=TitleFields(
            project=project.name,
            job_number=project.job_number,
            engineer=project.engineer,
            date=date if date is not None else _dt.date.today().isoformat(),
            revision=revision or project.revision,
            file_name=file_name,
        ),
        level=level,
        level_reason=reason,
        modes=listed_modes(results.modes),
        modes_total=len(results.modes),
        sketched=results.modes[:3],
        columns=columns,
        rows=rows,
        building_checks=building,
        clauses=clauses,
        rule_set=results.lateral.rule_set_title,
        assumptions=assumptions(project, results),
        caution=CAUTION,
    )
