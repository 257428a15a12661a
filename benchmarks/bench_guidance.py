"""Prints how long the guidance takes: the 50 × 50 what-if map of one element on the 8-storey
sample and on a generated 20-level, 100-element building, the move derivatives of every element,
and a suggestion. Each figure is the best of a few runs in one process (the machine is shared);
BLAS runs on one thread inside the engine."""

from __future__ import annotations

import dataclasses
import math
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from app.resources import sample_path
from benchmarks.buildings import generated_building
from core.engine import AnalysisSession
from core.guidance.gradients import move_gradients
from core.guidance.position_map import position_map
from core.guidance.suggestion import suggest
from core.model import Project
from core.model.fileio import load_project


def best_of(function, repeats: int) -> float:
    best = math.inf
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        best = min(best, time.perf_counter() - start)
    return best


def turned(project: Project, element_id: str, degrees: float) -> Project:
    """``project`` with one element turned about its midpoint (a skew line: every grid point its own offset)."""
    e = project.element(element_id)
    (mx, my), half = e.midpoint, e.length / 2
    c, s = math.cos(math.radians(degrees)), math.sin(math.radians(degrees))
    skew = dataclasses.replace(e, start=(mx - half * c, my - half * s), end=(mx + half * c, my + half * s))
    return dataclasses.replace(project, elements=tuple(skew if x.id == element_id else x for x in project.elements))


def main() -> None:
    residential = load_project(sample_path("residential_8_storey_walls"))
    generated = generated_building(20, 100)
    cases = [
        ("8-storey sample, W5 along x", residential, "W5"),
        ("8-storey sample, W3 along y", residential, "W3"),
        ("8-storey sample, W5 turned 30°", turned(residential, "W5", 30.0), "W5"),
        ("generated 20 levels, 100 elements, B2", generated, generated.elements[1].id),
    ]
    print(f"{'building, element':<44}{'map 50×50 s':>12}{'derivatives s':>15}{'suggest s':>11}")
    for label, project, element_id in cases:
        session = AnalysisSession()
        session.analyse(project)
        grid = best_of(lambda p=project, i=element_id, s=session: position_map(p, i, steps=50, session=s), 3)
        slopes = best_of(lambda p=project, s=session: move_gradients(p, session=s), 1)
        found = best_of(lambda p=project, i=element_id, s=session: suggest(p, i, session=s), 1)
        print(f"{label:<44}{grid:>12.3f}{slopes:>15.3f}{found:>11.3f}")


if __name__ == "__main__":
    main()
