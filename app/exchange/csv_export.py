"""Every results table as a CSV file, for spreadsheets and for checking by hand.

One file per table, named ``<stem>-<table>.csv``; the first row is the header, with the unit in
each column name (``period_s``, ``mass_t``). Numbers carry ten significant figures (far more than
the model knows) and a figure below 1e-12 of its column's largest, which is rounding noise, is
written as 0; an undefined figure is an empty cell. Qt-free.
"""

from __future__ import annotations

import csv
import math
from dataclasses import dataclass
from pathlib import Path

from app.exchange.errors import ExchangeError
from core.lateral.cases import DIRECTIONS
from core.lateral.records import LateralResults
from core.model import Project
from core.results import Results

Cell = str | int | float | None


@dataclass(frozen=True)
class Table:
    """A named table: one header row and rows of cells."""

    name: str
    header: tuple[str, ...]
    rows: tuple[tuple[Cell, ...], ...]


def _xy(name: str, unit: str = "") -> tuple[str, str]:
    suffix = f"_{unit}" if unit else ""
    return (f"{name}_x{suffix}", f"{name}_y{suffix}")


def floors_table(results: Results) -> Table:
    header = (
        "level", "name", "elevation_m", "area_m2", "mass_t", "centre_x_m", "centre_y_m",
        "inertia_t_m2", "radius_of_gyration_m",
    )
    rows = tuple(
        (f.level, f.name, f.elevation, f.area, f.mass, f.centre[0], f.centre[1], f.inertia, f.radius_of_gyration)
        for f in results.floors
    )
    return Table("floors", header, rows)


def modes_table(results: Results) -> Table:
    header = (
        "mode", "period_s", "frequency_hz", "kind",
        "energy_share_x", "energy_share_y", "energy_share_rotation",
        "participation_x", "participation_y", "participation_rotation",
        "mass_ratio_x", "mass_ratio_y", "mass_ratio_rotation",
        "cumulative_x", "cumulative_y", "cumulative_rotation",
    )
    rows = tuple(
        (m.number, m.period, m.frequency, m.kind.value, *m.shares, *m.participation, *m.mass_ratio, *m.cumulative)
        for m in results.modes
    )
    return Table("modes", header, rows)


def mode_shapes_table(results: Results) -> Table:
    header = ("mode", "level", "name", "u_x_m", "u_y_m", "theta_rad")
    rows = tuple(
        (m.number, f.level, f.name, *(float(v) for v in m.shape[i]))
        for m in results.modes
        for i, f in enumerate(results.floors)
    )
    return Table("mode_shapes", header, rows)


def storeys_table(lateral: LateralResults) -> Table:
    header = (
        "storey", "name", "height_m", *_xy("mass_centre", "m"), *_xy("rigidity_centre", "m"),
        *_xy("no_twist_centre", "m"), *_xy("eccentricity", "m"), *_xy("no_twist_eccentricity", "m"),
        *_xy("lateral_stiffness", "kN_per_m"), "torsional_stiffness_kNm_per_rad",
        *_xy("torsional_radius", "m"), "radius_of_gyration_m", *_xy("eccentricity_ratio"),
        *_xy("radius_ratio"), *_xy("torsion_ratio"), *_xy("amplification"), *_xy("drift_ratio"),
        *_xy("corner_drift_ratio"), *_xy("storey_stiffness", "kN_per_m"), *_xy("stiffness_ratio_above"),
        *_xy("stiffness_ratio_average"), "mass_ratio_below", "mass_ratio_above",
    )
    rows = tuple(
        (
            s.storey, s.name, s.height, *s.mass_centre, *(s.rigidity_centre or (None, None)),
            *(s.no_twist_centre or (None, None)), *s.eccentricity, *s.no_twist_eccentricity,
            *s.lateral_stiffness, s.torsional_stiffness, *s.torsional_radius, s.radius_of_gyration,
            *s.eccentricity_ratio, *s.radius_ratio, *s.torsion_ratio, *s.amplification, *s.drift_ratio,
            *s.corner_drift_ratio, *s.storey_stiffness, *s.stiffness_ratio_above, *s.stiffness_ratio_average,
            *s.mass_ratio,
        )
        for s in lateral.storeys
    )
    return Table("storeys", header, rows)


def static_loads_table(lateral: LateralResults) -> Table:
    header = (
        "direction", "method", "modal_period_s", "period_s", "approximate_period_en1998_s",
        "approximate_period_asce7_s", "period_cap_asce7_s", "coefficient", "base_shear_kN",
        "distribution_exponent", "clause",
    )
    rows = tuple(
        (
            load.direction, load.method, load.modal_period, load.period, load.approximate_period_en1998,
            load.approximate_period_asce7, load.period_cap_asce7, load.coefficient, load.base_shear,
            load.distribution_exponent, load.clause,
        )
        for load in lateral.loads
    )
    return Table("static_loads", header, rows)


def storey_forces_table(results: Results, lateral: LateralResults) -> Table:
    header = (
        "level", "name", "force_x_kN", "force_y_kN", "shear_x_kN", "shear_y_kN",
        "accidental_eccentricity_for_x_load_m", "accidental_eccentricity_for_y_load_m",
    )
    x, y = (lateral.load(d) for d in DIRECTIONS)
    shear_x, shear_y = x.storey_shears, y.storey_shears
    rows = tuple(
        (
            f.level, f.name, float(x.storey_forces[i]), float(y.storey_forces[i]), float(shear_x[i]),
            float(shear_y[i]), *(float(v) for v in lateral.accidental_eccentricity[i]),
        )
        for i, f in enumerate(results.floors)
    )
    return Table("storey_forces", header, rows)


def load_cases_table(results: Results, lateral: LateralResults) -> Table:
    header = (
        "case", "direction", "sign", "eccentricity_sign", "level", "name", "force_kN",
        "application_x_m", "application_y_m", "u_x_m", "u_y_m", "theta_rad", "storey_shear_kN",
        "drift_m", "end_drift_1_m", "end_drift_2_m", "torsion_ratio", "end_displacement_1_m",
        "end_displacement_2_m", "amplification", "corner_drift_m",
    )
    rows = []
    for result in lateral.cases:
        case = result.case
        for i, f in enumerate(results.floors):
            rows.append(
                (
                    case.name, case.direction, case.sign, case.eccentricity_sign, f.level, f.name,
                    float(result.forces[i]), *(float(v) for v in result.application_points[i]),
                    *(float(v) for v in result.displacements[i]), float(result.storey_shears[i]),
                    float(result.drifts[i]), *(float(v) for v in result.end_drifts[i]),
                    float(result.torsion_ratio[i]), *(float(v) for v in result.end_displacements[i]),
                    float(result.amplification[i]), float(result.corner_drifts[i]),
                )
            )
    return Table("load_cases", header, tuple(rows))


def element_envelopes_table(lateral: LateralResults) -> Table:
    header = ("element", "storey", "shear_envelope_kN", "share_envelope", "base_moment_envelope_kNm")
    rows = tuple(
        (d.element, storey, float(d.shear_envelope[k]), float(d.share_envelope[k]), d.base_moment_envelope)
        for d in lateral.elements
        for k, storey in enumerate(d.storeys)
    )
    return Table("element_envelopes", header, rows)


def element_shears_table(lateral: LateralResults) -> Table:
    header = ("element", "storey", "case", "shear_kN", "share")
    rows = tuple(
        (d.element, storey, result.case.name, float(d.shears[c, k]), float(d.shares[c, k]))
        for d in lateral.elements
        for c, result in enumerate(lateral.cases)
        for k, storey in enumerate(d.storeys)
    )
    return Table("element_shears", header, rows)


def brace_forces_table(lateral: LateralResults) -> Table:
    header = ("element", "storey", "brace", "axial_force_envelope_kN")
    rows = tuple(
        (d.element, storey, b + 1, float(d.brace_force_envelope[k, b]))
        for d in lateral.elements
        for k, storey in enumerate(d.storeys)
        for b in range(d.brace_force_envelope.shape[1])
    )
    return Table("brace_forces", header, rows)


def verdicts_table(lateral: LateralResults) -> Table:
    header = ("name", "storey", "direction", "value", "limit", "status", "clause", "note")
    rows = tuple(
        (v.name, v.storey, v.direction, v.value, v.limit, v.status.value, v.clause, v.note) for v in lateral.verdicts
    )
    return Table("checks", header, rows)


def results_tables(results: Results) -> tuple[Table, ...]:
    """Every results table: masses and modes, then the lateral checks."""
    lateral = results.lateral
    return (
        floors_table(results),
        modes_table(results),
        mode_shapes_table(results),
        storeys_table(lateral),
        static_loads_table(lateral),
        storey_forces_table(results, lateral),
        load_cases_table(results, lateral),
        element_envelopes_table(lateral),
        element_shears_table(lateral),
        brace_forces_table(lateral),
        verdicts_table(lateral),
    )


SIGNIFICANT = 10
"""Significant figures of a written number: far beyond what the model knows, free of float noise."""
NOISE = 1e-12
"""A figure smaller than this share of its column's largest is rounding noise and written as 0."""


def _text(cell: Cell, scale: float) -> str:
    if cell is None:
        return ""
    if isinstance(cell, float):
        if math.isfinite(cell) and abs(cell) <= NOISE * scale:
            return "0"
        return f"{cell:.{SIGNIFICANT}g}"
    return str(cell)


def _column_scales(table: Table) -> list[float]:
    """The largest finite magnitude of each column (0 for a column without numbers)."""
    scales = [0.0] * len(table.header)
    for row in table.rows:
        for i, cell in enumerate(row):
            if isinstance(cell, float) and math.isfinite(cell):
                scales[i] = max(scales[i], abs(cell))
    return scales


def write_table(table: Table, path: Path) -> None:
    """Write one table; a cell that is None or NaN is left empty."""
    scales = _column_scales(table)
    with path.open("w", newline="", encoding="utf-8") as stream:
        writer = csv.writer(stream)
        writer.writerow(table.header)
        writer.writerows([_text(c, scales[i]) for i, c in enumerate(row)] for row in table.rows)


def export_csv(project: Project, results: Results, folder: str | Path, stem: str | None = None) -> list[Path]:
    """Write every results table of ``project`` into ``folder``; returns the files written."""
    folder = Path(folder)
    stem = stem or _safe_stem(project.name)
    written: list[Path] = []
    try:
        folder.mkdir(parents=True, exist_ok=True)
        for table in results_tables(results):
            path = folder / f"{stem}-{table.name}.csv"
            write_table(table, path)
            written.append(path)
    except OSError as error:
        raise ExchangeError(f"cannot write CSV files in {folder}: {error.strerror or error}") from error
    return written


def _safe_stem(name: str) -> str:
    """A file-name stem from a project name: letters, digits, - and _ kept, the rest as _."""
    cleaned = "".join(c if c.isalnum() or c in "-_" else "_" for c in name.strip())
    return cleaned.strip("_") or "poise"

