"""Shear wall: a Timoshenko cantilever on the wall's centre line, one member per storey, fixed base.

Each storey has its own section (``ShearWall.storeys``, or the same one throughout).
Section of length L (the element line) and thickness t: A = t·L, I = t·L³/12, shear area κA with
κ = 5/6 (rectangle), G = E / (2(1 + ν)). The cracking factor scales both the flexural and the shear
stiffness (EN 1998-1 §4.3.1(7)); the axial stiffness stays gross (it does not enter the lateral
stiffness of a straight cantilever). One exact Timoshenko member per storey makes the condensed
matrix exact for floor loads: for a uniform wall its inverse is the flexibility
f_ij = a²(3b − a)/(6EI) + a/(κGA), a = min(z_i, z_j), b = max(z_i, z_j).
"""

from __future__ import annotations

from dataclasses import dataclass
from itertools import pairwise

from core.arrays import FloatArray, frozen_array
from core.elements.forces import ElementForces
from core.elements.planar_frame import FrameModel, PlanarFrame
from core.model import ShearWall
from core.model.properties import WallStorey, storey_sections

SHEAR_COEFFICIENT = 5.0 / 6.0
"""κ of a solid rectangular section (Timoshenko beam theory)."""


@dataclass(frozen=True)
class ShearWallModel(FrameModel):
    """The condensed wall; its forces are the shear and bending moment at each storey's base."""

    def forces(self, displacements: FloatArray) -> ElementForces:
        _, shear, moment = self.resultants(displacements)
        return ElementForces(storey_shear=frozen_array(shear), overturning_moment=frozen_array(moment))


def condense(wall: ShearWall, length: float, storey_heights: tuple[float, ...]) -> ShearWallModel:
    """Build the stacked Timoshenko cantilever of a wall ``length`` long and condense it."""
    E = wall.modulus
    G = E / (2.0 * (1.0 + wall.poisson))
    model = PlanarFrame(storey_heights)
    levels = range(len(storey_heights) + 1)
    nodes = [model.add_node(length / 2.0, level, fixed_rotation=level == 0) for level in levels]
    sections = storey_sections(wall, WallStorey, len(storey_heights))
    for (lower, upper), section in zip(pairwise(nodes), sections, strict=True):
        area = section.thickness * length
        EI = section.stiffness_factor * E * section.thickness * length**3 / 12.0
        kGA = section.stiffness_factor * SHEAR_COEFFICIENT * G * area
        model.add_beam(lower, upper, E * area, EI, kGA)
    return ShearWallModel(model.condense("shear wall"))
