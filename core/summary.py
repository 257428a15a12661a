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
"""

from __future__ import annotations

from typing import Any

from core.model import Project
from core.results import Results

CAUTION = (
    "Concept-stage estimate: verify with a full analysis, follow the governing local code, "
    "and defer to a licensed engineer's judgement."
)


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
    lines.append(CAUTION)
    return "\n".join(lines)
