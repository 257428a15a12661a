"""Rigid-diaphragm assembly: floor masses, element → floor transformation, global K and M.

Each floor has three DOFs [u_x, u_y, θ] at its own mass centre, floor-major (design.md). An
element line with unit direction (c, s) sees the floor displacement a·u along its line with
a = [c, s, s·(x − x_m) − c·(y − y_m)] for any point (x, y) on the line; its condensed matrix k_e
acts on the displacements of its floors relative to its bottom floor, so K = Σ Tᵀ k_e T.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core.arrays import FloatArray
from core.elements import condensed_stiffness
from core.errors import AnalysisError, ModelError
from core.model import GRAVITY, Element, Level, Point, Project
from core.model.geometry import area_properties

DOF_PER_FLOOR = 3


@dataclass(frozen=True)
class FloorMass:
    """Seismic mass of one floor and where it sits."""

    level: int
    """Level index, 1 = the first floor above the base."""
    name: str
    elevation: float
    area: float
    """Net floor area (openings removed), m²."""
    mass: float
    """t."""
    centre: Point
    """Centre of mass, m."""
    inertia: float
    """Mass moment of inertia about the vertical axis through the centre, t·m²."""

    @property
    def radius_of_gyration(self) -> float:
        """l_s = √(J/m), the floor's mass radius of gyration (EN 1998-1 §4.2.3.2(6))."""
        return float(np.sqrt(self.inertia / self.mass)) if self.mass > 0 else 0.0


def floor_masses(project: Project) -> tuple[FloorMass, ...]:
    """Mass, centre and rotational inertia of each floor from its outline and point masses."""
    return tuple(
        floor_mass(index, level, elevation)
        for index, (level, elevation) in enumerate(zip(project.levels, project.elevations, strict=True), start=1)
    )


def floor_mass(index: int, level: Level, elevation: float) -> FloorMass:
    """The :class:`FloorMass` of ``level``, the ``index``-th floor (1-based) at ``elevation``."""
    props = area_properties(level.outline, level.openings)
    density = level.seismic_weight / GRAVITY  # t/m²
    slab_mass = density * props.area
    masses = [slab_mass] + [p.mass for p in level.point_masses]
    xs = [props.centroid[0]] + [p.position[0] for p in level.point_masses]
    ys = [props.centroid[1]] + [p.position[1] for p in level.point_masses]
    total = float(sum(masses))
    if total <= 0.0:
        return FloorMass(index, level.name, elevation, props.area, 0.0, props.centroid, 0.0)
    cx = float(np.dot(masses, xs) / total)
    cy = float(np.dot(masses, ys) / total)
    inertia = density * props.polar + slab_mass * ((props.centroid[0] - cx) ** 2 + (props.centroid[1] - cy) ** 2)
    inertia += sum(p.mass * ((p.position[0] - cx) ** 2 + (p.position[1] - cy) ** 2) for p in level.point_masses)
    return FloorMass(index, level.name, elevation, props.area, total, (cx, cy), float(inertia))


def line_rows(element: Element, centres: FloatArray) -> FloatArray:
    """(m, 3) the rows a that turn the DOFs [u_x, u_y, θ] of floors with mass centres ``centres``
    (m, 2) into displacement along the element's line: a = [c, s, s(x − x_m) − c(y − y_m)]."""
    c, s = element.direction
    x, y = element.start
    a = np.empty((len(centres), 3))
    a[:, 0], a[:, 1] = c, s
    a[:, 2] = s * (x - centres[:, 0]) - c * (y - centres[:, 1])
    return a


def line_vector(element: Element, floor: FloorMass) -> FloatArray:
    """The row a that turns floor DOFs [u_x, u_y, θ] into displacement along the element's line."""
    row: FloatArray = line_rows(element, np.array([floor.centre], dtype=float))[0]
    return row


def element_transformation(element: Element, floors: tuple[FloorMass, ...]) -> FloatArray:
    """T (storeys spanned × 3N): global DOFs → the element's floor displacements relative to its bottom."""
    n = element.storey_count
    T = np.zeros((n, DOF_PER_FLOOR * len(floors)))
    below = line_vector(element, floors[element.bottom - 1]) if element.bottom > 0 else None
    for i in range(n):
        f = element.bottom + i  # 0-based index of the i-th floor the element spans
        T[i, DOF_PER_FLOOR * f : DOF_PER_FLOOR * f + 3] = line_vector(element, floors[f])
        if below is not None:
            b = element.bottom - 1
            T[i, DOF_PER_FLOOR * b : DOF_PER_FLOOR * b + 3] -= below
    return T


def element_storey_heights(project: Project, element: Element) -> tuple[float, ...]:
    """Heights of the storeys an element spans, bottom up, m."""
    return tuple(level.height for level in project.levels[element.bottom : element.top])


def element_matrix(project: Project, element: Element) -> FloatArray:
    """The element's condensed lateral stiffness over its storeys (cached in core.elements)."""
    if element.length <= 0.0:
        raise AnalysisError(f"element {element.id} has zero length", elements=(element.id,))
    try:
        return condensed_stiffness(element.properties, element.length, element_storey_heights(project, element))
    except ModelError as error:
        raise AnalysisError(
            f"element {element.id}: {error.message}",
            levels=tuple(range(element.bottom + 1, element.top + 1)),
            elements=(element.id,),
        ) from None


def element_floors(element: Element) -> range:
    """0-based indices of the floors an element connects: its bottom floor (if above the base)
    and every floor it spans; their DOFs are contiguous in K."""
    return range(max(element.bottom - 1, 0), element.top)


def element_block(element: Element, k: FloatArray, centres: FloatArray) -> FloatArray:
    """The element's Tᵀ k T restricted to the DOFs of :func:`element_floors`, (3m × 3m).

    ``centres`` (m, 2) are the mass centres of those floors. With the line rows a_p of the floors
    and k̂ = Lᵀ k L (L = [−1 | I] takes the bottom floor's displacement off), the block is
    k̂_pq·a_p a_qᵀ: no dense T is formed."""
    return _outer_block(floor_relative(element, k), line_rows(element, centres))


def element_blocks_at_offsets(element: Element, k: FloatArray, centres: FloatArray, offsets: FloatArray) -> FloatArray:
    """(P, 3m, 3m) :func:`element_block` of the element moved so that its line's offset
    s·x − c·y (direction (c, s)) is each of ``offsets`` (P,): a move changes only the rows'
    third entry, offset − (s·x_m − c·y_m)."""
    return _outer_block(floor_relative(element, k), line_rows_at_offsets(element, centres, offsets))


def line_rows_at_offsets(element: Element, centres: FloatArray, offsets: FloatArray) -> FloatArray:
    """(P, m, 3) :func:`line_rows` of the element moved so that its line's offset s·x − c·y is
    each of ``offsets``: a = [c, s, offset − (s·x_m − c·y_m)]."""
    c, s = element.direction
    a = np.empty((len(offsets), len(centres), 3))
    a[..., 0], a[..., 1] = c, s
    a[..., 2] = offsets[:, None] - (s * centres[:, 0] - c * centres[:, 1])[None, :]
    return a


def floor_relative(element: Element, k: FloatArray) -> FloatArray:
    """k̂ = Lᵀ k L over the floors of :func:`element_floors` (k itself for an element on the base)."""
    if element.bottom == 0:
        return k
    n = k.shape[0]
    k_hat = np.empty((n + 1, n + 1))
    k_hat[1:, 1:] = k
    k_hat[1:, 0] = -k.sum(axis=1)
    k_hat[0, 1:] = -k.sum(axis=0)
    k_hat[0, 0] = k.sum()
    return k_hat


def _outer_block(k_hat: FloatArray, a: FloatArray) -> FloatArray:
    """(…, 3m, 3m) k̂_pq·a_p a_qᵀ for line rows ``a`` (…, m, 3)."""
    m = a.shape[-2]
    lead = a.shape[:-2]
    block = k_hat[..., :, None, :, None] * a[..., :, :, None, None] * a[..., None, None, :, :]
    return block.reshape(*lead, 3 * m, 3 * m)


def assemble_stiffness(project: Project, floors: tuple[FloorMass, ...]) -> FloatArray:
    """Global lateral stiffness K = Σ Tᵀ k_e T, 3N × 3N."""
    size = DOF_PER_FLOOR * len(floors)
    K = np.zeros((size, size))
    centres = np.array([f.centre for f in floors], dtype=float).reshape(-1, 2)
    for element in project.elements:
        spanned = element_floors(element)
        dofs = slice(DOF_PER_FLOOR * spanned.start, DOF_PER_FLOOR * spanned.stop)
        K[dofs, dofs] += element_block(element, element_matrix(project, element), centres[spanned.start : spanned.stop])
    return (K + K.T) / 2


def assemble_mass(floors: tuple[FloorMass, ...]) -> FloatArray:
    """Diagonal mass matrix (m, m, J) per floor."""
    return np.diag([v for f in floors for v in (f.mass, f.mass, f.inertia)])
