"""An independent 3D model of a Poise project in OpenSeesPy: real members, rigid floors, eigen.

Used by the 3D acceptance check (test_building_3d_opensees.py). Nothing here calls Poise's
analysis: masses come from the outlines by shapely's constrained triangulation, stiffness from
OpenSees members in each element's own vertical plane. What is the same as in Poise is the
modelling, which the check is about:

- every floor is a rigid diaphragm (``rigidDiaphragm 3``) whose master node sits at the floor's
  mass centre, at the floor's elevation, with masses m, m and J on u_x, u_y and θ_z;
- an element's members lie in its vertical plane. Local axes are turned to its line: for columns
  and walls local z runs along the line (bending in the plane is about local y), for beams local z
  is vertical (again in-plane bending about local y);
- each element works in its own plane only (Poise neglects out-of-plane stiffness): out-of-plane
  second moments, out-of-plane shear areas and torsion constants of members that would stiffen
  a floor out of plane or in twist are ``OUT_OF_PLANE`` times the in-plane value;
- nodes whose in-plane rotation nothing resists (truss joints, and the column joints of chevron
  beams, whose ends are released there with ``-releasey``) have their rotations fixed; the nodes
  of walls, moment frames and chevron apexes keep theirs;
- sections may change storey by storey: ``properties.storeys`` (same field names as the element's
  own, which hold when that list is empty) gives each storey's section, bottom up; a moment
  frame's storey holds its columns and the beams on top of them;
- an element's base is fixed (at the ground) or, if it starts on a floor, moves with that floor's
  diaphragm and is fixed against vertical movement and rotation — the planar models' fixed base.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from itertools import count, pairwise

import numpy as np
import shapely
from shapely.geometry import Polygon

from core.model import GRAVITY, BracedFrame, BracePattern, Element, Level, MomentFrame, Project, ShearWall
from tests.reference.opensees_loader import load_opensees

OUT_OF_PLANE = 1e-8
"""Out-of-plane and torsional member stiffness as a share of the in-plane value. Measured on the
three test buildings, the largest period difference to Poise scales with it (1e-4 → 6e-4,
1e-6 → 6e-6, 1e-8 → 6e-8), so it is the only difference between the two models; at 1e-12 the
eigen solver loses the regularity it needs (complex eigenvalues)."""

SHEAR_COEFFICIENT = 5.0 / 6.0
"""κ of a solid rectangular wall section (Timoshenko beam theory)."""

FIXED, FREE = 1, 0


@dataclass(frozen=True)
class FloorMass:
    """Mass of one floor, its centre and its rotational inertia about that centre (t, m, t·m²)."""

    mass: float
    centre: tuple[float, float]
    inertia: float


@dataclass(frozen=True)
class OpenSeesModes:
    """Periods and effective mass ratios (x, y, rotation) of the OpenSees model, longest first."""

    periods: np.ndarray
    mass_ratios: np.ndarray
    """(modes, 3)."""


def floor_mass(level: Level) -> FloorMass:
    """Mass, centre and polar moment of a floor by exact integration over the triangles of
    shapely's constrained Delaunay triangulation of the outline less its openings, plus the
    point masses (∫r² dA over a triangle = A/6 (|a|² + |b|² + |c|² + a·b + b·c + c·a))."""
    density = level.seismic_weight / GRAVITY
    polygon = Polygon(level.outline, holes=list(level.openings))
    masses, xs, ys, polars = [], [], [], []
    for triangle in shapely.get_parts(shapely.constrained_delaunay_triangles(polygon)):
        a, b, c = np.asarray(triangle.exterior.coords)[:3]
        area = abs((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])) / 2
        masses.append(density * area)
        xs.append((a[0] + b[0] + c[0]) / 3)
        ys.append((a[1] + b[1] + c[1]) / 3)
        polars.append(density * area / 6 * (a @ a + b @ b + c @ c + a @ b + b @ c + c @ a))
    for point in level.point_masses:
        masses.append(point.mass)
        xs.append(point.position[0])
        ys.append(point.position[1])
        polars.append(point.mass * (point.position[0] ** 2 + point.position[1] ** 2))
    total = float(sum(masses))
    cx, cy = float(np.dot(masses, xs) / total), float(np.dot(masses, ys) / total)
    return FloorMass(total, (cx, cy), float(sum(polars)) - total * (cx * cx + cy * cy))


def influence_vectors(floors: list[FloorMass]) -> np.ndarray:
    """(3, 3N) ground translation in x, in y, and rigid rotation about the building's overall mass
    centre, at each floor's own mass centre."""
    m = np.array([f.mass for f in floors])
    centres = np.array([f.centre for f in floors])
    X, Y = m @ centres / m.sum()
    iota = np.zeros((3, 3 * len(floors)))
    for j, (x, y) in enumerate(centres):
        iota[0, 3 * j] = iota[1, 3 * j + 1] = iota[2, 3 * j + 2] = 1.0
        iota[2, 3 * j] = -(y - Y)
        iota[2, 3 * j + 1] = x - X
    return iota


def mass_ratios(shapes: np.ndarray, floors: list[FloorMass]) -> np.ndarray:
    """Effective modal mass over total mass, (modes, 3): (φᵀMι)² / (φᵀMφ · ιᵀMι) for each mode φ
    (rows of ``shapes``) and each influence vector ι — independent of how φ is normalised."""
    m = np.array([v for f in floors for v in (f.mass, f.mass, f.inertia)])
    iota = influence_vectors(floors)
    gamma = (shapes * m) @ iota.T
    return gamma**2 / (np.einsum("ki,i,ki->k", shapes, m, shapes)[:, None] * np.einsum("ri,i,ri->r", iota, m, iota))


class _Builder:
    """Creates the OpenSees domain of one project."""

    def __init__(self, ops, project: Project, floors: list[FloorMass]) -> None:
        self.ops = ops
        self.elevations = (0.0, *project.elevations)
        self.tags = count(1)
        self.slaves: list[list[int]] = [[] for _ in self.elevations]
        self.masters = []
        ops.wipe()
        ops.model("basic", "-ndm", 3, "-ndf", 6)
        for f, floor in enumerate(floors, start=1):
            tag = next(self.tags)
            ops.node(tag, *floor.centre, self.elevations[f])
            ops.fix(tag, FREE, FREE, FIXED, FIXED, FIXED, FREE)
            ops.mass(tag, floor.mass, floor.mass, 0.0, 0.0, 0.0, floor.inertia)
            self.masters.append(tag)
        ops.uniaxialMaterial("Elastic", 1, 1.0)  # unit modulus: a truss's EA goes in as its area

    def node(self, element: Element, along: float, floor: int, rotations_fixed: bool) -> int:
        """A node of ``element`` at distance ``along`` from its start on ``floor``."""
        c, s = element.direction
        tag = next(self.tags)
        self.ops.node(tag, element.start[0] + along * c, element.start[1] + along * s, self.elevations[floor])
        rotation = FIXED if rotations_fixed else FREE
        if floor == 0:
            self.ops.fix(tag, *[FIXED] * 6)
        elif floor == element.bottom:
            self.ops.fix(tag, FREE, FREE, FIXED, FIXED, FIXED, FREE)
            self.slaves[floor].append(tag)
        else:
            self.ops.fix(tag, FREE, FREE, FREE, rotation, rotation, FREE)
            self.slaves[floor].append(tag)
        return tag

    def transformation(self, element: Element, vertical: bool) -> int:
        """A linear transformation turned to the element's line (see the module docstring)."""
        c, s = element.direction
        tag = next(self.tags)
        self.ops.geomTransf("Linear", tag, *((c, s, 0.0) if vertical else (0.0, 0.0, 1.0)))
        return tag

    def truss(self, i: int, j: int, EA: float) -> None:
        self.ops.element("Truss", next(self.tags), i, j, EA, 1)

    def frame_member(self, i: int, j: int, transf: int, E: float, A: float, I: float, *releases) -> None:
        """An Euler–Bernoulli member bending in the element's plane (about local y)."""
        G = E / 2.0  # enters only the (negligible) torsion
        tiny = OUT_OF_PLANE * I
        self.ops.element("elasticBeamColumn", next(self.tags), i, j, A, E, G, tiny, I, tiny, transf, *releases)

    def add(self, element: Element) -> None:
        props = element.properties
        if isinstance(props, BracedFrame):
            self.braced_frame(element, props)
        elif isinstance(props, MomentFrame):
            self.moment_frame(element, props)
        elif isinstance(props, ShearWall):
            self.shear_wall(element, props)
        else:
            raise NotImplementedError(f"{type(props).__name__} has no 3D model here")

    def floors_of(self, element: Element) -> range:
        return range(element.bottom, element.top + 1)

    @staticmethod
    def sections(element: Element) -> list:
        """The section of each storey the element spans, bottom up."""
        props = element.properties
        return list(props.storeys) or [props] * element.storey_count

    def braced_frame(self, element: Element, frame: BracedFrame) -> None:
        """Axial columns on every column line, truss braces per bay and storey, and for chevrons
        a beam per bay hinged at the columns and continuous through the braces' apex."""
        bays, width, E = frame.bays, element.length / frame.bays, frame.modulus
        grid = [[self.node(element, k * width, f, True) for k in range(bays + 1)] for f in self.floors_of(element)]
        sections = self.sections(element)
        for (lower, upper), section in zip(pairwise(grid), sections, strict=True):
            for i, j in zip(lower, upper, strict=True):
                self.truss(i, j, section.column_area * E)
        beam_transf = self.transformation(element, vertical=False)
        for storey, (lower, upper) in enumerate(pairwise(grid)):
            for k in range(bays):
                rising, falling = (lower[k], upper[k + 1]), (lower[k + 1], upper[k])
                if frame.pattern is BracePattern.SINGLE:
                    braces = [rising if storey % 2 == 0 else falling]
                elif frame.pattern is BracePattern.CROSS:
                    braces = [rising] if frame.tension_only else [rising, falling]
                else:
                    apex = self.node(element, (k + 0.5) * width, element.bottom + storey + 1, False)
                    I, A = frame.beam_inertia, frame.beam_area
                    self.frame_member(upper[k], apex, beam_transf, E, A, I, "-releasey", 1)
                    self.frame_member(apex, upper[k + 1], beam_transf, E, A, I, "-releasey", 2)
                    braces = [(lower[k], apex), (lower[k + 1], apex)]
                for i, j in braces:
                    self.truss(i, j, sections[storey].brace_area * E)

    def moment_frame(self, element: Element, frame: MomentFrame) -> None:
        """Columns on every column line and a beam per bay at every floor, rigid joints."""
        bays, width, E = frame.bays, element.length / frame.bays, frame.modulus
        grid = [[self.node(element, k * width, f, False) for k in range(bays + 1)] for f in self.floors_of(element)]
        column_transf = self.transformation(element, vertical=True)
        beam_transf = self.transformation(element, vertical=False)
        for (lower, upper), s in zip(pairwise(grid), self.sections(element), strict=True):
            Ic, Ib = frame.stiffness_factor * s.column_inertia, frame.stiffness_factor * s.beam_inertia
            for i, j in zip(lower, upper, strict=True):
                self.frame_member(i, j, column_transf, E, s.column_area, Ic)
            for i, j in pairwise(upper):
                self.frame_member(i, j, beam_transf, E, s.beam_area, Ib)

    def shear_wall(self, element: Element, wall: ShearWall) -> None:
        """A stack of Timoshenko members on the wall's centre line, one per storey."""
        L, E = element.length, wall.modulus
        G = E / (2.0 * (1.0 + wall.poisson))
        transf = self.transformation(element, vertical=True)
        nodes = [self.node(element, L / 2.0, f, False) for f in self.floors_of(element)]
        for (i, j), s in zip(pairwise(nodes), self.sections(element), strict=True):
            t = s.thickness
            I = s.stiffness_factor * t * L**3 / 12.0
            shear_area = s.stiffness_factor * SHEAR_COEFFICIENT * t * L
            # E G A J I_y I_z A_vy A_vz: in-plane bending about local y, in-plane shear along local z.
            section = (E, G, t * L, OUT_OF_PLANE * I, I, OUT_OF_PLANE * I, OUT_OF_PLANE * shear_area, shear_area)
            self.ops.element("ElasticTimoshenkoBeam", next(self.tags), i, j, *section, transf)

    def diaphragms(self) -> None:
        for f, master in enumerate(self.masters, start=1):
            if self.slaves[f]:
                self.ops.rigidDiaphragm(3, master, *self.slaves[f])


def opensees_modes(project: Project, modes: int = 6) -> OpenSeesModes:
    """Build ``project`` in OpenSeesPy (3D, 6 DOF per node) and solve its first ``modes`` modes."""
    ops = load_opensees()
    floors = [floor_mass(level) for level in project.levels]
    builder = _Builder(ops, project, floors)
    for element in project.elements:
        builder.add(element)
    builder.diaphragms()
    ops.constraints("Transformation")
    ops.numberer("RCM")
    ops.system("FullGeneral")
    ops.algorithm("Linear")
    ops.integrator("LoadControl", 1.0)
    ops.analysis("Static")
    omega2 = np.array(ops.eigen("-fullGenLapack", modes))
    shapes = np.array(
        [
            [ops.nodeEigenvector(tag, k, dof) for tag in builder.masters for dof in (1, 2, 6)]
            for k in range(1, modes + 1)
        ]
    )
    ops.wipe()
    return OpenSeesModes(periods=2 * math.pi / np.sqrt(omega2), mass_ratios=mass_ratios(shapes, floors))
