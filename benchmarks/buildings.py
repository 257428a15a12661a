"""Generated benchmark buildings: a 48 × 32 m plan, walls and cross-braced frames in both directions.

``generated_building(levels, elements)`` places ``elements`` element lines (a quarter walls along x,
a quarter walls along y, a quarter braced frames along x, a quarter along y) at deterministic but
irregular positions, each spanning the full height except every fifth, which stops half-way up, so
the storeys do not all hold the same elements. The layout is invented for benchmarking only.
"""

from __future__ import annotations

import numpy as np

from core.model import BracedFrame, Element, Level, Project, ShearWall

WIDTH, DEPTH = 48.0, 32.0
OUTLINE = ((0.0, 0.0), (WIDTH, 0.0), (WIDTH, DEPTH), (0.0, DEPTH))


def generated_building(levels: int, elements: int, seed: int = 7) -> Project:
    """A ``levels``-storey building with ``elements`` element lines (see the module docstring)."""
    rng = np.random.default_rng(seed)
    storeys = tuple(Level(f"L{i + 1}", 4.0 if i == 0 else 3.2, OUTLINE) for i in range(levels))
    placed = []
    for i in range(elements):
        along_x = i % 2 == 0
        wall = (i // 2) % 2 == 0
        length = float(rng.uniform(3.0, 8.0)) if wall else 6.0
        if along_x:
            x = float(rng.uniform(0.5, WIDTH - length - 0.5))
            y = float(rng.uniform(0.5, DEPTH - 0.5))
            start, end = (x, y), (x + length, y)
        else:
            x = float(rng.uniform(0.5, WIDTH - 0.5))
            y = float(rng.uniform(0.5, DEPTH - length - 0.5))
            start, end = (x, y), (x, y + length)
        top = levels if i % 5 != 4 or levels < 2 else max(1, levels // 2)
        properties = ShearWall(thickness=0.2 + 0.05 * (i % 3)) if wall else BracedFrame()
        placed.append(Element(f"{'W' if wall else 'B'}{i + 1}", start, end, 0, top, properties))
    return Project(name=f"generated {levels} levels, {elements} elements", levels=storeys, elements=tuple(placed))
