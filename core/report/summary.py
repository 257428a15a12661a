"""Results as readable text and as documented JSON, for the command line and for tests.

JSON layout (``poise analyse FILE --json``), all values in kN, m, t, s, rad:

- ``format``: ``"poise-results"``; ``version``: 1; ``project``: the project name;
  ``caution``: the concept-stage caution.
- ``floors``: one object per floor, bottom up: ``level`` (1-based), ``name``, ``elevation``,
  ``area`` (net, m²), ``mass`` (t), ``centre`` ([x, y] of the mass), ``inertia`` (t·m² about the
  centre), ``radius_of_gyration`` (l_s, m).
- ``modes``: one object per mode, longest period first: ``number``, ``period`` (s),
  ``frequency`` (Hz), ``kind`` (``x``, ``y``, ``torsion`` or ``mixed``), ``shares`` (kinetic
  energy shares [x, y, θ]), ``participation`` ([Γ_x, Γ_y, Γ_θ]), ``mass_ratio`` and
  ``cumulative`` ([x, y, θ] effective modal mass over the total), ``shape`` (per floor
  [u_x, u_y, θ] at the mass centre, mass-normalised).
- ``lateral``: the lateral checks, fields named as in :mod:`core.lateral.records` (where every
  field is documented): ``rule_set``, ``rule_set_title``, ``status`` (worst verdict: ``pass``,
  ``warn``, ``fail``), ``notes`` (sentences to show beside the verdicts), ``drift_amplification``,
  ``drift_reduction``, ``drift_limit``, ``drift_basis`` (where the limit comes from), ``accidental_eccentricity``
  (per floor [e for x loads, e for y loads], m); ``loads`` (x then y: ``direction``, ``method``,
  ``modal_period``, ``period``, ``approximate_period_en1998``, ``approximate_period_asce7``,
  ``period_cap_asce7``, ``coefficient``, ``base_shear``, ``distribution_exponent``,
  ``storey_forces``, ``clause``); ``storeys`` (bottom up: centres of mass, of rigidity (a) and
  no-twist (b), eccentricities, radii, the EN 1998-1 §4.2.3.2(6) ratios, worst torsion ratio,
  A_x and drift ratios per direction [x, y], storey stiffness and regularity ratios);
  ``cases`` (``name``, ``direction``, ``sign``, ``eccentricity_sign``, and per storey
  ``forces``, ``storey_shears``, ``displacements``, ``drifts``, ``end_drifts``,
  ``torsion_ratio``, ``amplification``, ``corner_drifts``); ``elements`` (``element``,
  ``storeys``, ``shear_envelope``, ``share_envelope``, ``brace_force_envelope``,
  ``base_moment_envelope``); ``mode_order``; ``verdicts`` (``name``, ``value``, ``limit``,
  ``status``, ``clause``, ``storey``, ``direction``, ``note``). Numbers that are not finite
  (an undefined centre, a ratio over a vanishing average) are ``null``.
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Sequence
from enum import Enum
from typing import Any

import numpy as np

from core.lateral.records import LateralResults, Status
from core.model import Project
from core.report.figures import CODE_LIMITS, verdict_figures
from core.results import Results

CAUTION = (
    "Concept-stage estimate from a rigid-floor model of the lateral system: verify with a full "
    "analysis, follow the governing local code, and defer to a licensed engineer's judgement."
)
"""The one caution text: the GUI, the sheet, the text summary and the README carry these words."""


def results_to_dict(project: Project, results: Results) -> dict[str, Any]:
    """The JSON-ready summary of ``results``; the layout is documented in this module."""
    return {
        "format": "poise-results",
        "version": 1,
        "project": project.name,
        "caution": CAUTION,
        "floors": [
            {
                "level": f.level,
                "name": f.name,
                "elevation": f.elevation,
                "area": f.area,
                "mass": f.mass,
                "centre": list(f.centre),
                "inertia": f.inertia,
                "radius_of_gyration": f.radius_of_gyration,
            }
            for f in results.floors
        ],
        "modes": [
            {
                "number": m.number,
                "period": m.period,
                "frequency": m.frequency,
                "kind": m.kind.value,
                "shares": list(m.shares),
                "participation": list(m.participation),
                "mass_ratio": list(m.mass_ratio),
                "cumulative": list(m.cumulative),
                "shape": m.shape.tolist(),
            }
            for m in results.modes
        ],
        "lateral": lateral_to_dict(results.lateral),
    }


def format_summary(project: Project, results: Results, mode_count: int = 12) -> str:
    """A plain-text report: masses and centres per level, then periods and mass ratios per mode."""
    lines = [f"Poise — {project.name}" + (f" (job {project.job_number})" if project.job_number else ""), ""]
    lines.append("Floors (mass at the centre of mass)")
    lines.append(f"{'level':<14}{'z m':>8}{'area m²':>10}{'mass t':>10}{'x_m m':>9}{'y_m m':>9}{'l_s m':>8}")
    for f in reversed(results.floors):
        lines.append(
            f"{f.name:<14}{f.elevation:>8.2f}{f.area:>10.1f}{f.mass:>10.1f}"
            f"{f.centre[0]:>9.2f}{f.centre[1]:>9.2f}{f.radius_of_gyration:>8.2f}"
        )
    lines.append(f"{'total':<14}{'':>8}{'':>10}{results.total_mass:>10.1f}")
    lines.append("")
    lines.append("Modes (effective mass ratios; Σ cumulative)")
    lines.append(
        f"{'mode':>4}{'T s':>8}{'f Hz':>8}  {'type':<8}{'x':>7}{'y':>7}{'θ':>7}{'Σx':>7}{'Σy':>7}{'Σθ':>7}"
    )
    for m in results.modes[:mode_count]:
        lines.append(
            f"{m.number:>4}{m.period:>8.3f}{m.frequency:>8.3f}  {m.kind.value:<8}"
            + "".join(f"{v:>7.3f}" for v in m.mass_ratio)
            + "".join(f"{v:>7.3f}" for v in m.cumulative)
        )
    if len(results.modes) > mode_count:
        lines.append(f"… {len(results.modes) - mode_count} more modes (see --json)")
    lines.append("")
    lines.extend(format_lateral(results.lateral))
    lines.append("")
    lines.append(CAUTION)
    return "\n".join(lines)


_CASE_FIELDS = (
    "forces",
    "storey_shears",
    "displacements",
    "drifts",
    "end_drifts",
    "torsion_ratio",
    "amplification",
    "corner_drifts",
)
_ELEMENT_FIELDS = ("element", "storeys", "shear_envelope", "share_envelope", "brace_force_envelope")


def _plain(value: Any) -> Any:
    """JSON-ready: dataclasses to dicts, arrays and tuples to lists, non-finite floats to None."""
    if dataclasses.is_dataclass(value) and not isinstance(value, type):
        return {f.name: _plain(getattr(value, f.name)) for f in dataclasses.fields(value)}
    if isinstance(value, Enum):
        return value.value
    if isinstance(value, np.ndarray):
        return _plain(value.tolist())
    if isinstance(value, list | tuple):
        return [_plain(v) for v in value]
    if isinstance(value, float | np.floating):
        return float(value) if math.isfinite(value) else None
    if isinstance(value, np.integer):
        return int(value)
    return value


def lateral_to_dict(lateral: LateralResults) -> dict[str, Any]:
    """The ``lateral`` section of the JSON (layout in this module's docstring)."""
    return {
        "rule_set": lateral.rule_set,
        "rule_set_title": lateral.rule_set_title,
        "status": lateral.status.value,
        "notes": list(lateral.notes),
        "drift_amplification": lateral.drift_amplification,
        "drift_reduction": lateral.drift_reduction,
        "drift_limit": lateral.drift_limit,
        "drift_basis": lateral.drift_basis,
        "accidental_eccentricity": _plain(lateral.accidental_eccentricity),
        "loads": _plain(lateral.loads),
        "storeys": _plain(lateral.storeys),
        "cases": [
            {
                "name": c.case.name,
                "direction": c.case.direction,
                "sign": c.case.sign,
                "eccentricity_sign": c.case.eccentricity_sign,
                **{name: _plain(getattr(c, name)) for name in _CASE_FIELDS},
            }
            for c in lateral.cases
        ],
        "elements": [
            {
                **{name: _plain(getattr(e, name)) for name in _ELEMENT_FIELDS},
                "base_moment_envelope": _plain(e.base_moment_envelope),
            }
            for e in lateral.elements
        ],
        "mode_order": _plain(lateral.mode_order),
        "verdicts": _plain(lateral.verdicts),
    }


def _num(value: float | None, width: int, digits: int = 2) -> str:
    if value is None or not math.isfinite(value):
        return f"{'–':>{width}}"
    return f"{value:>{width}.{digits}f}"


def _row(first: str, cells: Sequence[tuple[float | None, int, int]]) -> str:
    """A table row: a left-aligned label, then numbers (value, width, digits)."""
    return f"{first:<10}" + "".join(_num(v, w, d) for v, w, d in cells)


def _header(first: str, names: list[tuple[str, int]]) -> str:
    return f"{first:<10}" + "".join(f"{name:>{w}}" for name, w in names)


def format_lateral(lateral: LateralResults) -> list[str]:
    """Text lines of the lateral checks: loads, centres and torsion per storey, element demands,
    and every verdict that does not pass."""
    lines = ["Static loads (equivalent lateral force)"]
    lines.append(
        _header(
            "direction",
            [
                ("T modal", 9),
                ("T used", 8),
                ("T EN", 7),
                ("T_a", 7),
                ("C_u·T_a", 9),
                ("V/W", 8),
                ("V kN", 10),
                ("k", 6),
            ],
        )
    )
    cells: list[tuple[float | None, int, int]]
    for load in lateral.loads:
        cells = [
            (load.modal_period, 9, 3),
            (load.period, 8, 3),
            (load.approximate_period_en1998, 7, 3),
            (load.approximate_period_asce7, 7, 3),
            (load.period_cap_asce7, 9, 3),
            (load.coefficient, 8, 4),
            (load.base_shear, 10, 1),
            (load.distribution_exponent, 6, 2),
        ]
        lines.append(_row(load.direction, cells))
        lines.append(f"    {load.clause}")
    lines.append("")
    lines.append(
        "Centres per storey: mass, rigidity (a) from element storey stiffnesses, no-twist (b) from the "
        "full stiffness under the static pattern"
    )
    names = ["x_m", "y_m", "x_r", "y_r", "x_nt", "y_nt", "r_x", "r_y", "l_s", "e0x/r_x", "e0y/r_y"]
    lines.append(_header("storey", [(name, 8) for name in names]))
    for s in reversed(lateral.storeys):
        rc = s.rigidity_centre or (None, None)
        nt = s.no_twist_centre or (None, None)
        values = [*s.mass_centre, *rc, *nt, *s.torsional_radius, s.radius_of_gyration, *s.eccentricity_ratio]
        lines.append(_row(s.name, [(v, 8, 2) for v in values]))
    lines.append("")
    lines.append(
        "Torsion and drift per storey, worst case (torsion ratio per ASCE 7 Table 12.3-1; design drift = "
        f"{lateral.drift_amplification:g} × elastic)"
    )
    names = [
        "TR x",
        "TR y",
        "A_x x",
        "A_x y",
        "drift x",
        "drift y",
        "corner x",
        "corner y",
        "k_x/up",
        "k_y/up",
    ]
    lines.append(_header("storey", [(name, 9) for name in names]))
    for s in reversed(lateral.storeys):
        cells = [(v, 9, 3) for v in (*s.torsion_ratio, *s.amplification)]
        cells += [(v, 9, 5) for v in (*s.drift_ratio, *s.corner_drift_ratio)]
        cells += [(v, 9, 2) for v in s.stiffness_ratio_above]
        lines.append(_row(s.name, cells))
    lines.append("")
    lines.append("Element demands (envelope over the load cases, lowest storey spanned)")
    lines.append(_header("element", [("V kN", 10), ("share", 8), ("brace N kN", 12), ("M base kN·m", 14)]))
    for e in lateral.elements:
        brace = float(e.brace_force_envelope[0].max()) if e.brace_force_envelope.size else None
        cells = [
            (float(e.shear_envelope[0]), 10, 1),
            (float(e.share_envelope[0]), 8, 2),
            (brace, 12, 1),
            (e.base_moment_envelope, 14, 0),
        ]
        lines.append(_row(e.element, cells))
    lines.append("")
    failing = [v for v in lateral.verdicts if v.status is not Status.PASS]
    lines.append(
        f"Checks against {CODE_LIMITS.lower()} {lateral.rule_set_title}: {lateral.status.value}; "
        f"{len(lateral.verdicts) - len(failing)} of {len(lateral.verdicts)} pass; "
        f"drift limit {lateral.drift_basis}"
    )
    lines.extend(f"  Note: {note}" for note in lateral.notes)
    for v in failing:
        where = ", ".join(
            part
            for part in (f"storey {v.storey}" if v.storey else "", f"in {v.direction}" if v.direction else "")
            if part
        )
        label = f"{v.name} ({where})" if where else v.name
        value, limit = verdict_figures(v)
        lines.append(f"  {v.status.value.upper():<5}{label}: {value} vs {limit} — {v.clause}")
    return lines
