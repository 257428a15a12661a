"""Prints how long ``analyse()`` takes on each sample project: cold (element matrices built) and
warm (element matrices cached, as while an element is dragged in plan)."""

from __future__ import annotations

import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from app.resources import sample_projects
from core.analysis import analyse
from core.elements import _condensed
from core.model.fileio import load_project


def best_of(function, repeats: int) -> float:
    best = float("inf")
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        best = min(best, time.perf_counter() - start)
    return best


def main() -> None:
    print(f"{'sample':<32}{'cold ms':>10}{'warm ms':>10}")
    for path in sample_projects():
        project = load_project(path)
        _condensed.cache_clear()
        start = time.perf_counter()
        analyse(project)
        cold = time.perf_counter() - start
        warm = best_of(lambda p=project: analyse(p), 50)
        print(f"{path.stem:<32}{cold * 1e3:>10.2f}{warm * 1e3:>10.2f}")


if __name__ == "__main__":
    main()
