"""Prints what the lateral block of ``analyse()`` costs on each sample project, warm (element
matrices cached, as while an element is dragged): the layout and stiffness diagnostics, and
``lateral_checks`` (loads, all load cases on one factorisation, centres, checks, verdicts)."""

from __future__ import annotations

import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from app.resources import sample_projects
from core.analysis import analyse
from core.lateral.evaluation import lateral_checks
from core.model.fileio import load_project
from core.solve.assembly import assemble_mass, assemble_stiffness, floor_masses
from core.solve.diagnostics import check_layout, check_stiffness
from core.solve.modal import modal_analysis


def best_of(function, repeats: int = 50) -> float:
    best = float("inf")
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        best = min(best, time.perf_counter() - start)
    return best * 1e3


def main() -> None:
    print(f"{'sample':<32}{'storeys':>8}{'cases':>7}{'layout ms':>11}{'K check ms':>12}{'lateral ms':>12}")
    for path in sample_projects():
        project = load_project(path)
        results = analyse(project)
        floors = floor_masses(project)
        K = assemble_stiffness(project, floors)
        modes = modal_analysis(K, assemble_mass(floors), floors)
        layout = best_of(lambda p=project: check_layout(p))
        stiffness = best_of(lambda p=project, f=floors, k=K: check_stiffness(p, f, k))
        lateral = best_of(lambda p=project, f=floors, k=K, m=modes: lateral_checks(p, f, k, m))
        print(
            f"{path.stem:<32}{len(floors):>8}{len(results.lateral.cases):>7}"
            f"{layout:>11.2f}{stiffness:>12.2f}{lateral:>12.2f}"
        )


if __name__ == "__main__":
    main()
