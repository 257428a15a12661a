"""Prints the cost of one condensed element matrix (10 storeys, 3 bays): built, cached, and the
member-force recovery behind the element shares."""

from __future__ import annotations

import sys
import timeit
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from core.elements import _condensed, condensed_stiffness, member_forces
from core.model import BracedFrame, BracePattern, MomentFrame, ShearWall, Spring

HEIGHTS = (4.0,) + (3.5,) * 9
CASES = {
    "braced single": BracedFrame(pattern=BracePattern.SINGLE, bays=3),
    "braced cross": BracedFrame(bays=3),
    "braced cross tension-only": BracedFrame(bays=3, tension_only=True),
    "braced chevron": BracedFrame(pattern=BracePattern.CHEVRON, bays=3),
    "shear wall": ShearWall(),
    "moment frame": MomentFrame(bays=3),
    "spring": Spring((1e5,) * 10),
}


def main() -> None:
    displacements = np.linspace(1e-3, 1e-2, len(HEIGHTS))
    for name, properties in CASES.items():

        def build(p=properties) -> None:
            _condensed.cache_clear()
            condensed_stiffness(p, 18.0, HEIGHTS)

        built = min(timeit.repeat(build, number=50, repeat=5)) / 50
        condensed_stiffness(properties, 18.0, HEIGHTS)
        hit = min(timeit.repeat(lambda p=properties: condensed_stiffness(p, 18.0, HEIGHTS), number=20000, repeat=5))
        forces = min(
            timeit.repeat(lambda p=properties: member_forces(p, 18.0, HEIGHTS, displacements), number=2000, repeat=5)
        )
        print(f"{name:28s} build {built * 1e3:6.3f} ms   cached {hit / 20000 * 1e6:5.2f} µs"
              f"   member forces {forces / 2000 * 1e6:6.1f} µs")


if __name__ == "__main__":
    main()
