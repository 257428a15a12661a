"""The engine's speed on generated buildings, beside scipy's eigen-solve and OpenSeesPy.

For 5 levels / 20 elements, 20 / 100 and 60 / 300 (benchmarks/buildings.py: 48 × 32 m, walls and
cross-braced frames in both directions) it times, in one run so the ratios hold on a busy machine:

- cold: a fresh session with the element matrices' cache cleared;
- move, stretch, property change: one edit of one element, then ``analyse`` through a kept
  session (the drag path) and every result the live views read (:func:`read_live`: readouts,
  plan overlays, mode list); "+ demands" also reads the element demands (the results table);
- BLAS at its default threads instead of one, for cold and move;
- file save and load of the project;
- what-if per position: a 50 × 50 grid of midpoints (aligned with the element, so one eigen-solve
  per grid row) and 100 random midpoints (one eigen-solve each), beside numpy's batched eigh of
  as many matrices of the same size (the random case's floor);
- scipy ``eigh(K, M)`` on the same K and M, all modes (the floor for any analysis of this model);
- OpenSeesPy: the 3D member model with rigid floors of tests/reference/opensees_building.py (one
  ``fix`` call per node), its build and its eigen-solve of the first modes timed apart, with the
  band and the sparse (UmfPack) system (the faster counts), the largest period difference to
  Poise over those modes, and OpenSeesPy's eigen-solve alone over Poise's whole cold analysis.

Figures are this process's CPU time (time spent waiting for a core on a shared machine left
out; ``--wall`` for wall-clock time); the rows with BLAS at its default threads are wall-clock.
Prints a table (median and spread = the 10th–90th percentile range) and writes JSON beside
the table when given ``--json FILE``. Tests never time; this script only reports.

Run: ``PYTHONPATH=. python benchmarks/bench_engine.py [--quick] [--no-opensees] [--wall] [--json out.json]``
"""

from __future__ import annotations

import argparse
import contextlib
import dataclasses
import json
import platform
import statistics
import subprocess
import sys
import tempfile
import time
from collections.abc import Callable
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from benchmarks.buildings import DEPTH, WIDTH, generated_building
from core.elements import _condensed
from core.engine import AnalysisSession
from core.engine import session as session_module
from core.engine.whatif import element_positions
from core.lateral.evaluation import brace_influence
from core.model import Project, ShearWall
from core.model.fileio import load_project, save_project
from core.results import Results

SIZES = ((5, 20), (20, 100), (60, 300))
OPENSEES_MODES = 6
OPENSEES_SYSTEMS = ("BandGeneral", "UmfPack")
"""The linear systems OpenSeesPy's eigen-solve is timed with; the faster counts. The rigid
diaphragms tie every node of a floor together, so the band is wide and the band solver slows
down badly with size (50 s at 20 levels / 100 elements): it runs only up to ``BAND_SIZE``
levels × elements."""
BAND_SIZE = 500


clock = time.process_time
"""The clock every figure is read on: this process's CPU time by default, so that time spent
waiting for a core on a shared machine is left out (``--wall`` switches to wall-clock time).
Rows with BLAS at its default threads are wall-clock always: CPU time would add up the threads."""


def times(function: Callable[[], object], repeats: int) -> list[float]:
    out = []
    for _ in range(repeats):
        start = clock()
        function()
        out.append(clock() - start)
    return out


def summary(seconds: list[float], per: int = 1) -> dict[str, float]:
    ms = sorted(1e3 * t / per for t in seconds)
    low, high = np.percentile(ms, [10, 90]) if len(ms) > 2 else (ms[0], ms[-1])
    return {"median_ms": statistics.median(ms), "p10_ms": float(low), "p90_ms": float(high), "runs": len(ms)}


def edited(project: Project, index: int, step: int, kind: str) -> Project:
    element = project.elements[index]
    d = 0.05 * (1 + step % 20)
    if kind == "move":
        new = dataclasses.replace(
            element, start=(element.start[0], element.start[1] + d), end=(element.end[0], element.end[1] + d)
        )
    elif kind == "stretch":
        c, s = element.direction
        new = dataclasses.replace(element, end=(element.end[0] + c * d, element.end[1] + s * d))
    else:
        new = dataclasses.replace(element, properties=ShearWall(thickness=0.2 + 0.001 * (step + 1)))
    elements = list(project.elements)
    elements[index] = new
    return dataclasses.replace(project, elements=tuple(elements))


def read_live(results: Results) -> None:
    """Read what the editor's live views read after each drag step: the readouts (worst torsion
    ratio per direction with its storey and verdict, the first three periods and kinds, every
    check's worst verdict and the overall status), the plan overlays (each storey's centres and
    radii) and the mode list (every mode's period and kind)."""
    lateral = results.lateral
    for d in ("x", "y"):
        lateral.worst_torsion_ratio(d)
    worst: dict[object, object] = {}
    for v in lateral.verdicts:
        if v.name not in worst or v.value > worst[v.name].value:  # type: ignore[attr-defined]
            worst[v.name] = v
    lateral.status  # noqa: B018 — read as the readouts read it
    for s in lateral.storeys:
        _ = (s.torsion_ratio, s.rigidity_centre, s.mass_centre, s.torsional_radius, s.eccentricity_ratio)
    for m in results.modes:
        _ = (m.period, m.kind)


def edit_times(project: Project, kind: str, repeats: int, demands: bool = False) -> list[float]:
    """Seconds per edit → analysed through a kept session → every live result read (read_live)."""
    session = AnalysisSession()
    session.analyse(project)
    states = [edited(project, 0, step, kind) for step in range(repeats)]
    out = []
    for state in states:
        start = clock()
        results = session.analyse(state)
        read_live(results)
        if demands:
            len(results.lateral.elements)
        out.append(clock() - start)
    return out


def cold_times(project: Project, repeats: int) -> list[float]:
    def cold() -> None:
        _condensed.cache_clear()
        brace_influence.cache_clear()
        AnalysisSession().analyse(project)

    return times(cold, repeats)


@contextlib.contextmanager
def default_blas_threads():
    """The engine without its one-thread limit (BLAS at its default threads)."""
    limited = session_module.one_blas_thread
    session_module.one_blas_thread = contextlib.nullcontext
    try:
        yield
    finally:
        session_module.one_blas_thread = limited


@contextlib.contextmanager
def wall_clock():
    """Figures read on wall-clock time (for several BLAS threads)."""
    global clock
    kept, clock = clock, time.perf_counter
    try:
        yield
    finally:
        clock = kept


def what_if_times(project: Project, repeats: int) -> tuple[dict[str, float], dict[str, float]]:
    session = AnalysisSession()
    element = project.elements[0]  # along x: a grid row shares one offset
    xs, ys = np.meshgrid(np.linspace(4.0, WIDTH - 4.0, 50), np.linspace(1.0, DEPTH - 1.0, 50))
    grid = np.column_stack([xs.ravel(), ys.ravel()])
    rng = np.random.default_rng(5)
    scattered = np.column_stack([rng.uniform(4.0, WIDTH - 4.0, 100), rng.uniform(1.0, DEPTH - 1.0, 100)])
    element_positions(project, element.id, grid[:10], session)  # the session holds the project now
    on_grid = times(lambda: element_positions(project, element.id, grid, session), repeats)
    # Random midpoints of a skewed copy: every position has its own offset.
    at_random = times(lambda: element_positions(project, element.id, scattered, session), repeats)
    # The floor of the random case: numpy's batched eigh of as many matrices of this size.
    K = np.repeat(np.array(session.analyse(project).stiffness)[None], len(scattered), axis=0)
    with session_module.one_blas_thread():
        floor = times(lambda: np.linalg.eigh(K), repeats)
    return summary(on_grid, len(grid)), summary(at_random, len(scattered)), summary(floor, len(scattered))


def eigh_times(project: Project, repeats: int) -> list[float]:
    from scipy.linalg import eigh

    results = AnalysisSession().analyse(project)
    K, M = np.array(results.stiffness), np.array(results.mass)
    with session_module.one_blas_thread():
        return times(lambda: eigh(K, M), repeats)


def file_times(project: Project, repeats: int) -> tuple[list[float], list[float]]:
    with tempfile.TemporaryDirectory() as folder:
        path = Path(folder) / "bench.poise"
        save = times(lambda: save_project(project, path), repeats)
        load = times(lambda: load_project(path), repeats)
    return save, load


def opensees(project: Project, system: str) -> dict[str, float] | None:
    """Build and eigen-solve times of the OpenSeesPy model with linear ``system``, and the largest
    period difference to Poise over its first modes."""
    try:
        from tests.reference import opensees_building as reference
        from tests.reference.opensees_loader import load_opensees

        ops = load_opensees()
    except BaseException as error:  # pytest.skip raises a BaseException subclass
        print(f"  OpenSeesPy unavailable: {error}")
        return None
    start = clock()
    floors = [reference.floor_mass(level) for level in project.levels]
    builder = reference._Builder(ops, project, floors)
    for element in project.elements:
        builder.add(element)
    builder.diaphragms()
    ops.constraints("Transformation")
    ops.numberer("RCM")
    ops.system(system)
    ops.algorithm("Linear")
    ops.integrator("LoadControl", 1.0)
    ops.analysis("Static")
    built = clock()
    omega2 = np.array(ops.eigen(OPENSEES_MODES))
    solved = clock()
    nodes = len(ops.getNodeTags())
    ops.wipe()
    periods = 2 * np.pi / np.sqrt(omega2)
    poise = np.array(AnalysisSession().analyse(project).periods[:OPENSEES_MODES])
    return {
        "build_ms": 1e3 * (built - start),
        "eigen_ms": 1e3 * (solved - built),
        "nodes": nodes,
        "system": system,
        "largest_period_difference_percent": float(np.max(np.abs(periods / poise - 1.0)) * 100),
    }


def machine() -> dict[str, str]:
    model = ""
    with contextlib.suppress(OSError, subprocess.SubprocessError):
        for line in subprocess.run(["lscpu"], capture_output=True, text=True, check=False).stdout.splitlines():
            if line.startswith("Model name"):
                model = line.split(":", 1)[1].strip()
    load = ""
    with contextlib.suppress(OSError):
        load = Path("/proc/loadavg").read_text().split()[0]
    import os

    return {"cpu": model, "cores": str(os.cpu_count()), "python": platform.python_version(),
            "numpy": np.__version__, "load_average_1min": load}


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="fewer repeats")
    parser.add_argument("--no-opensees", action="store_true")
    parser.add_argument("--json", type=Path)
    parser.add_argument("--wall", action="store_true", help="wall-clock time instead of CPU time")
    args = parser.parse_args()
    global clock
    if args.wall:
        clock = time.perf_counter
    repeats = 5 if args.quick else 21
    report: dict[str, object] = {"machine": machine(), "clock": "wall" if args.wall else "cpu", "sizes": {}}
    rows: list[tuple[str, list[str]]] = []
    names = [f"{levels} lv / {count} el" for levels, count in SIZES]
    table: dict[str, list[str]] = {}

    def put(row: str, column: int, value: dict[str, float] | None, unit: str = "ms") -> None:
        cells = table.setdefault(row, ["–"] * len(SIZES))
        if value is not None:
            cells[column] = f"{value['median_ms']:.3g} ({value['p10_ms']:.3g}–{value['p90_ms']:.3g})"

    for column, (levels, count) in enumerate(SIZES):
        project = generated_building(levels, count)
        big = levels >= 60
        r = max(3, repeats // (4 if big else 1))
        figures: dict[str, object] = {}
        print(f"{names[column]} …", flush=True)
        figures["cold"] = summary(cold_times(project, max(3, r // 3)))
        figures["move → every live result"] = summary(edit_times(project, "move", r))
        figures["move + element demands"] = summary(edit_times(project, "move", r, demands=True))
        figures["stretch"] = summary(edit_times(project, "stretch", r))
        figures["property change"] = summary(edit_times(project, "property", r))
        with default_blas_threads(), wall_clock():
            figures["move → every live result, BLAS default threads"] = summary(edit_times(project, "move", r))
            figures["cold, BLAS default threads"] = summary(cold_times(project, max(3, r // 3)))
        save, load = file_times(project, r)
        figures["file save"], figures["file load"] = summary(save), summary(load)
        grid, scattered, floor = what_if_times(project, max(3, r // 4))
        figures["what-if per position, 50 × 50 grid"] = grid
        figures["what-if per position, random"] = scattered
        figures["numpy batched eigh per matrix, same size (the random case's floor)"] = floor
        figures["scipy eigh(K, M), all modes"] = summary(eigh_times(project, r))
        if not args.no_opensees:
            runs = [opensees(project, s) for s in OPENSEES_SYSTEMS if s != "BandGeneral" or levels * count <= BAND_SIZE]
            done = [run for run in runs if run is not None]
            result = min(done, key=lambda run: run["eigen_ms"]) if done else None
            if result is not None:
                figures["OpenSeesPy build"] = {"median_ms": result["build_ms"], "p10_ms": result["build_ms"],
                                               "p90_ms": result["build_ms"], "runs": 1}
                figures["OpenSeesPy eigen (first 6 modes)"] = {"median_ms": result["eigen_ms"],
                                                               "p10_ms": result["eigen_ms"],
                                                               "p90_ms": result["eigen_ms"], "runs": 1}
                figures["OpenSeesPy"] = result
        report["sizes"][names[column]] = figures  # type: ignore[index]
        for name, value in figures.items():
            if name != "OpenSeesPy":
                put(name, column, value)  # type: ignore[arg-type]
        if "OpenSeesPy" in figures:
            o = figures["OpenSeesPy"]
            table.setdefault("OpenSeesPy nodes, system; largest period difference", ["–"] * len(SIZES))[column] = (
                f"{o['nodes']} nodes, {o['system']}; {o['largest_period_difference_percent']:.2g} %"  # type: ignore[index]
            )
            for poise in ("cold", "move → every live result"):
                ratio = o["eigen_ms"] / figures[poise]["median_ms"]  # type: ignore[index]
                table.setdefault(f"OpenSeesPy eigen alone ÷ Poise {poise}", ["–"] * len(SIZES))[column] = (
                    f"{ratio:.3g} ×"
                )
    rows = list(table.items())
    print(f"\nmachine: {report['machine']}")
    kind = "wall-clock" if args.wall else "CPU"
    print(f"ms of {kind} time (BLAS-default rows: wall-clock), median (10th–90th percentile)\n")
    print("| | " + " | ".join(names) + " |")
    print("|---|" + "---|" * len(names))
    for name, cells in rows:
        print(f"| {name} | " + " | ".join(cells) + " |")
    if args.json:
        args.json.write_text(json.dumps(report, indent=2))


if __name__ == "__main__":
    main()
