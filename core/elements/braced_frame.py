"""Braced frame: a pin-jointed planar truss of columns and braces over equal bays, rigid floors.

Columns are axial members (EA = column_area·E), continuous over the height, pinned at the base.
Braces are truss members (brace_area·E). Brace and column areas may change storey by storey
(``BracedFrame.storeys``). Beam–column joints are pinned, and the floor is rigid in
its plane, so the beams of single-diagonal and cross frames would only carry axial force the floor
already takes: they add no stiffness and are left out (hence ``beam_area`` never matters).
Chevron frames keep the beam's flexure: a beam, continuous over the mid-span node where the two
braces meet and hinged at the columns, so the braces' unbalanced vertical force bends it.

Patterns (x along the element line, "rising" = from a bay's lower start-side corner to its upper
far corner):

- single: one diagonal per bay and storey, the same in every bay of a storey, rising in odd
  storeys (1, 3, …) and falling in even ones, counted from the element's bottom;
- cross: both diagonals, not connected where they cross;
- cross, tension-only: only the rising diagonals, which are the ones in tension when every storey
  drifts + along the line. The mirror image (falling diagonals, drifts −) has the same matrix, so
  it holds for either sense as long as all storeys drift the same way;
- chevron: two braces from the lower corners of each bay to a node at mid-span of its top beam.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core.arrays import FloatArray, frozen_array
from core.elements.forces import ElementForces
from core.elements.planar_frame import FrameModel, IntArray, PlanarFrame
from core.model import BracedFrame, BracePattern
from core.model.properties import BraceStorey, storey_sections


@dataclass(frozen=True)
class BracedFrameModel(FrameModel):
    """The condensed planar braced frame and the member numbers to report forces by."""

    braces: IntArray
    """(n, braces per storey) member numbers, ordered as in :attr:`ElementForces.brace_axial`."""
    columns: IntArray
    """(n, bays + 1) member numbers."""

    def forces(self, displacements: FloatArray) -> ElementForces:
        end_forces, shear, overturning = self.resultants(displacements)
        axial = end_forces[:, 3]
        return ElementForces(
            storey_shear=frozen_array(shear),
            overturning_moment=frozen_array(overturning),
            brace_axial=frozen_array(axial[self.braces]),
            column_axial=frozen_array(axial[self.columns]),
        )


def condense(frame: BracedFrame, length: float, storey_heights: tuple[float, ...]) -> BracedFrameModel:
    """Build the planar braced frame over ``length`` and ``storey_heights`` and condense it."""
    n, bays = len(storey_heights), frame.bays
    width = length / bays
    E = frame.modulus
    model = PlanarFrame(storey_heights)
    grid = model.add_grid(length, bays)
    sections = storey_sections(frame, BraceStorey, n)

    columns = [
        [model.add_truss(grid[i][k], grid[i + 1][k], sections[i].column_area * E) for k in range(bays + 1)]
        for i in range(n)
    ]

    braces: list[list[int]] = []
    for i in range(n):
        brace_EA = sections[i].brace_area * E
        lower, upper = grid[i], grid[i + 1]
        row: list[int] = []
        for k in range(bays):
            rising = (lower[k], upper[k + 1])
            falling = (lower[k + 1], upper[k])
            if frame.pattern is BracePattern.SINGLE:
                pairs = [rising if i % 2 == 0 else falling]
            elif frame.pattern is BracePattern.CROSS:
                pairs = [rising] if frame.tension_only else [rising, falling]
            else:
                apex = model.add_node((k + 0.5) * width, i + 1)
                beam_EA, beam_EI = frame.beam_area * E, frame.beam_inertia * E
                model.add_beam(upper[k], apex, beam_EA, beam_EI, hinge_start=True)
                model.add_beam(apex, upper[k + 1], beam_EA, beam_EI, hinge_end=True)
                pairs = [(lower[k], apex), (lower[k + 1], apex)]
            row.extend(model.add_truss(a, b, brace_EA) for a, b in pairs)
        braces.append(row)

    return BracedFrameModel(
        frame=model.condense("braced frame"),
        braces=np.array(braces, dtype=np.intp),
        columns=np.array(columns, dtype=np.intp),
    )
