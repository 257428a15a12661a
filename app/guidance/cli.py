"""``poise map FILE --element ID`` and ``poise suggest FILE --element ID``: the what-if map and the
suggested position from the command line.

``map`` prints the map's summary (where it is lowest, the value now, the share of positions within
the limit), ``--csv`` writes every grid point (x, y, value; blank where the element would not fit
or stand) and ``--png`` a picture. ``suggest`` prints where to move the element and what the measure
becomes. Bad input ends with exit status 2 and a one-line message, like every ``poise`` command.
"""

from __future__ import annotations

import argparse
import csv
from pathlib import Path

import numpy as np

from app.guidance.ramp import quantity
from app.units import LENGTH
from core.errors import ModelError
from core.guidance.measures import Measure
from core.guidance.position_map import DEFAULT_STEPS, PositionMap
from core.guidance.suggestion import Constraint
from core.model import Project
from core.report.summary import CAUTION


def _common(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", type=Path, help="the .poise project file")
    parser.add_argument("--element", required=True, metavar="ID", help="the element to move")
    parser.add_argument("--measure", choices=[m.value for m in Measure], default=Measure.TORSION_RATIO.value,
                        help="what to map or minimise (default torsion-ratio: the worst storey torsion ratio; "
                             "eccentricity: the largest e0/r; torsional-share: of the first two modes)")
    parser.add_argument("--steps", type=int, default=DEFAULT_STEPS, metavar="N",
                        help=f"grid points along each side of the plan (default {DEFAULT_STEPS})")


def map_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(prog="poise map", description="Map what the measure would be with the "
                                     "element's midpoint at each point of a grid over its floors.")
    _common(parser)
    output = parser.add_mutually_exclusive_group()
    output.add_argument("--csv", type=Path, metavar="OUT.csv", help="write every grid point to a CSV file")
    output.add_argument("--png", type=Path, metavar="OUT.png", help="write a picture of the map")
    return parser


def suggest_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(prog="poise suggest", description="Suggest where to move the element: the "
                                     "best point of its map, refined by a continuous optimiser.")
    _common(parser)
    parser.add_argument("--on", choices=[c.value for c in Constraint], default=Constraint.OUTLINE.value,
                        help="outline: anywhere within its floors (default); edges: on an outline edge "
                             "parallel to it; grid: on a grid line (needs --grid)")
    parser.add_argument("--grid", type=float, metavar="SPACING", help="grid line spacing, m (for --on grid)")
    return parser


def _steps(value: int) -> int:
    if not 2 <= value <= 400:
        raise ModelError("--steps", f"must be from 2 to 400, got {value}")
    return value


def run_map(arguments: argparse.Namespace) -> int:
    """Print the map's summary, or write its CSV or picture."""
    from core.guidance.position_map import position_map
    from core.model.fileio import load_project

    project = load_project(arguments.file)
    _known(project, arguments.element)
    measure = Measure(arguments.measure)
    pmap = position_map(project, arguments.element, measure, _steps(arguments.steps))
    if arguments.csv is not None:
        _write_csv(pmap, arguments.csv)
        print(f"wrote {arguments.csv}: {pmap.values.size} grid points of {measure.label} for {arguments.element}")
    elif arguments.png is not None:
        from app.guidance.picture import map_picture
        from app.sheet_cli import _gui_application

        _app = _gui_application()
        if not map_picture(project, pmap).save(str(arguments.png), "PNG"):
            raise OSError(f"cannot write the picture: {arguments.png}")
        print(f"wrote {arguments.png}: map of {measure.label} for {arguments.element}")
    else:
        print(_summary(pmap))
    print(CAUTION)
    return 0


def _known(project: Project, element_id: str) -> None:
    if element_id not in {e.id for e in project.elements}:
        ids = ", ".join(e.id for e in project.elements) or "none"
        raise ModelError("--element", f"no element {element_id!r} in the project (its elements: {ids})")


def _write_csv(pmap: PositionMap, path: Path) -> None:
    shown = quantity(pmap.measure)
    header = f"{pmap.measure.label}" + (f" ({shown.unit})" if shown.unit else "")
    with path.open("w", newline="", encoding="utf-8") as out:
        writer = csv.writer(out)
        writer.writerow([f"x ({LENGTH.unit})", f"y ({LENGTH.unit})", header])
        for (x, y), value in zip(pmap.points(), pmap.values.ravel(), strict=True):
            writer.writerow([LENGTH.show(x), LENGTH.show(y), shown.show(value) if np.isfinite(value) else ""])


def _summary(pmap: PositionMap) -> str:
    shown = quantity(pmap.measure)
    unit = f" {shown.unit}" if shown.unit else ""
    m = LENGTH.unit
    finite = pmap.values[np.isfinite(pmap.values)]
    lines = [f"{pmap.measure.label} with {pmap.element_id} moved ({len(pmap.xs)} × {len(pmap.ys)} grid, "
             f"step {LENGTH.show(pmap.step)} {m})",
             f"  now: {shown.show(pmap.current)}{unit}"]
    best = pmap.best()
    if best is None:
        lines.append("  it fits nowhere on its floors")
    else:
        within = float(np.mean(finite <= pmap.limit.value))
        lines += [
            f"  lowest: {shown.show(best[2])}{unit} with its midpoint at "
            f"({LENGTH.show(best[0])}, {LENGTH.show(best[1])}) {m}",
            f"  highest: {shown.show(float(finite.max()))}{unit}",
            f"  within the {'limit' if pmap.limit.code else 'threshold'} {shown.show(pmap.limit.value)}{unit} "
            f"({pmap.limit.source}): {round(100 * within)} % of the positions where it fits",
        ]
    return "\n".join(lines)


def run_suggest(arguments: argparse.Namespace) -> int:
    """Print the suggested position of one element."""
    from core.guidance.suggestion import suggest
    from core.model.fileio import load_project

    project = load_project(arguments.file)
    _known(project, arguments.element)
    measure = Measure(arguments.measure)
    found = suggest(project, arguments.element, measure, Constraint(arguments.on), arguments.grid,
                    _steps(arguments.steps))
    shown = quantity(measure)
    unit = f" {shown.unit}" if shown.unit else ""
    m = LENGTH.unit
    element = project.element(arguments.element)
    dx, dy = found.start[0] - element.start[0], found.start[1] - element.start[1]
    print(f"move {found.element_id} to ({LENGTH.show(found.start[0])}, {LENGTH.show(found.start[1])}) – "
          f"({LENGTH.show(found.end[0])}, {LENGTH.show(found.end[1])}) {m}  "
          f"(by {LENGTH.show(dx)}, {LENGTH.show(dy)} {m}, on the {found.constraint.value})")
    print(f"{measure.label}: {shown.show(found.current)}{unit} now → {shown.show(found.value)}{unit} there "
          f"(best grid point {shown.show(found.map_point[2])}{unit})")
    print(CAUTION)
    return 0
