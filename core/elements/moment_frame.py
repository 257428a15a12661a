"""Moment frame: Euler–Bernoulli columns and beams with rigid joints over equal bays, fixed bases.

``bays + 1`` column lines; columns and the beams on top of them may change storey by storey
(``MomentFrame.storeys``); every floor is rigid in its plane (its nodes share the lateral DOF, so
beams do not shorten). The effective-stiffness factor scales EI of columns and beams
(EN 1998-1 §4.3.1(7) for cracked concrete); axial stiffness stays gross, and column shortening is
kept, so tall slender frames show their overturning flexibility.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core.arrays import FloatArray, frozen_array
from core.elements.forces import ElementForces
from core.elements.planar_frame import FrameModel, IntArray, PlanarFrame
from core.model import MomentFrame
from core.model.properties import FrameStorey, storey_sections


@dataclass(frozen=True)
class MomentFrameModel(FrameModel):
    """The condensed planar moment frame and the member numbers to report forces by."""

    columns: IntArray
    """(n, bays + 1) member numbers, lower end first."""
    beams: IntArray
    """(n, bays) member numbers of the beams on top of each storey, start side first."""

    def forces(self, displacements: FloatArray) -> ElementForces:
        end_forces, shear, overturning = self.resultants(displacements)
        column = end_forces[self.columns]
        beam = end_forces[self.beams]
        # Member-end moments act counter-clockwise on the member; the sagging bending moment is
        # −M at the start end and +M at the far end.
        beam_moment = np.stack((-beam[..., 2], beam[..., 5]), axis=-1)
        return ElementForces(
            storey_shear=frozen_array(shear),
            overturning_moment=frozen_array(overturning),
            column_axial=frozen_array(column[..., 3]),
            column_moment=frozen_array(np.maximum(np.abs(column[..., 2]), np.abs(column[..., 5]))),
            beam_moment=frozen_array(beam_moment),
        )


def condense(frame: MomentFrame, length: float, storey_heights: tuple[float, ...]) -> MomentFrameModel:
    """Build the planar moment frame over ``length`` and ``storey_heights`` and condense it."""
    n, bays = len(storey_heights), frame.bays
    E, factor = frame.modulus, frame.stiffness_factor
    sections = storey_sections(frame, FrameStorey, n)
    model = PlanarFrame(storey_heights)
    grid = model.add_grid(length, bays, fixed_base=True)
    columns = [
        [
            model.add_beam(grid[i][k], grid[i + 1][k], E * s.column_area, factor * E * s.column_inertia)
            for k in range(bays + 1)
        ]
        for i, s in enumerate(sections)
    ]
    beams = [
        [
            model.add_beam(grid[i + 1][k], grid[i + 1][k + 1], E * s.beam_area, factor * E * s.beam_inertia)
            for k in range(bays)
        ]
        for i, s in enumerate(sections)
    ]
    return MomentFrameModel(
        frame=model.condense("moment frame"),
        columns=np.array(columns, dtype=np.intp),
        beams=np.array(beams, dtype=np.intp),
    )
