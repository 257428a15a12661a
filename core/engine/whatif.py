"""What-if of one element's position: the figures a scheme search or a position map needs, for
many plan positions of one element at once.

:func:`element_positions` moves one element (keeping its length and direction) to each of P
midpoints and returns, per position, what a full :func:`core.analysis.analyse` of that layout
would report (tests hold them equal to 1e-9):

- ``periods`` (P, modes), s, longest first;
- ``rotation_share`` (P, modes): the share of each mode's kinetic energy in rotation (the
  torsional share; the first modes are the telling ones);
- ``torsion_ratio`` (P, 2): the worst storey torsion ratio over the reported load cases, for
  loads in x and in y (``LateralResults.worst_torsion_ratio``, ASCE 7-16 Table 12.3-1);
- ``eccentricity_ratio`` (P, N, 2): e_0x/r_x and e_0y/r_y per storey (``StoreyLateral``,
  EN 1998-1 §4.2.3.2(6) Eq. 4.1a);
- ``stands`` (P,): the element lies within every floor it connects and the stiffness is not
  singular or ill-conditioned there (otherwise that position's figures are NaN, where analyse
  would raise).

Why it is cheap: moving an element changes K only through the offset of its line from the
mass centres, d = s·x − c·y for direction (c, s); a move along the line changes nothing. So
positions are grouped by d, and each distinct offset costs one small eigen-solve and one solve
of the load cases, batched over offsets in numpy. A grid aligned with the element has one offset
per row. Under ASCE 7 the vertical distribution follows the period (§12.8.3); where it changes
with the position, the storey stiffnesses of every element are recomputed for that pattern, which
costs more.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import numpy.typing as npt
import shapely

from core.arrays import FloatArray, frozen_array
from core.engine.session import AnalysisSession, KeptElement, dof_slice, one_blas_thread
from core.lateral.cases import DIRECTIONS, LoadCase
from core.lateral.centres import (
    element_pattern,
    element_storey_rows,
    element_storey_stiffness,
    storey_property_arrays,
)
from core.lateral.loads import (
    accidental_eccentricities,
    case_load_vector,
    load_cases,
    load_exponent,
    vertical_distribution,
)
from core.lateral.response import end_ratio, extreme_points, floor_arrays, storey_drifts
from core.model import Element, Project
from core.solve.assembly import (
    DOF_PER_FLOOR,
    FloorMass,
    element_blocks_at_offsets,
    element_floors,
    line_rows_at_offsets,
)
from core.solve.diagnostics import ILL_CONDITIONED, LayoutMemo
from core.solve.modal import influence_vectors

BATCH = 64
"""Distinct offsets solved together (bounds the memory of the batched eigen-solve)."""


@dataclass(frozen=True)
class PositionFigures:
    """The figures of one element at P midpoints (see the module docstring)."""

    midpoints: FloatArray
    periods: FloatArray
    rotation_share: FloatArray
    torsion_ratio: FloatArray
    eccentricity_ratio: FloatArray
    stands: npt.NDArray[np.bool_]


def element_positions(
    project: Project, element_id: str, midpoints: npt.ArrayLike, session: AnalysisSession | None = None
) -> PositionFigures:
    """The figures of ``project`` with element ``element_id`` moved to each of ``midpoints``
    (P, 2). ``project`` itself must analyse (AnalysisError otherwise); its switched-off elements
    are left out, and ``element_id`` must be an active one."""
    session = session or AnalysisSession()
    project = project.active_part()
    centres_xy = np.asarray(midpoints, dtype=float).reshape(-1, 2)
    results, kept = session.analyse_keeping(project)
    index = [e.id for e in project.elements].index(element_id)
    element = project.elements[index]
    with one_blas_thread():
        return _figures(project, results.floors, results.stiffness, kept, index, element, centres_xy)


def _figures(
    project: Project,
    floors: tuple[FloorMass, ...],
    stiffness: FloatArray,
    kept: list[KeptElement],
    index: int,
    element: Element,
    midpoints: FloatArray,
) -> PositionFigures:
    settings = project.settings
    n = len(floors)
    size = DOF_PER_FLOOR * n
    masses, centres = floor_arrays(floors)
    elevations = np.array([f.elevation for f in floors])
    mass = np.array([v for f in floors for v in (f.mass, f.mass, f.inertia)])
    scale = 1.0 / np.sqrt(mass)
    iota = influence_vectors(floors)
    totals = np.einsum("ri,i,ri->r", iota, mass, iota)
    matrix = kept[index].matrix
    spanned = element_floors(element)
    dofs = dof_slice(spanned)
    rest = np.array(stiffness)  # K without the element: the others' blocks stay where they are
    rest[dofs, dofs] -= kept[index].block
    near = centres[spanned.start : spanned.stop]

    c, s = element.direction
    half = np.array([element.end[0] - element.start[0], element.end[1] - element.start[1]]) / 2
    starts = midpoints - half
    distinct, where = np.unique(s * starts[:, 0] - c * starts[:, 1], return_inverse=True)
    where = where.reshape(-1)

    cases = load_cases(include_centred=True)
    # Reported cases; ±sign gives the same ratios, so one sense per (direction, eccentricity).
    solved = [c for c in cases if c.sign > 0 and (c.eccentricity_sign != 0 or settings.include_centred_case)]
    eccentricity = accidental_eccentricities(project, settings.accidental_eccentricity)
    ends = {d: extreme_points(project, d) for d in DIRECTIONS}
    height = float(elevations[-1])

    periods = np.full((len(distinct), size), np.nan)
    rotation = np.full((len(distinct), size), np.nan)
    torsion = np.full((len(distinct), 2), np.nan)
    ecc_ratio = np.full((len(distinct), n, 2), np.nan)
    stiff = np.zeros(len(distinct), dtype=bool)
    others: dict[bytes, FloatArray] = {}
    for first in range(0, len(distinct), BATCH):
        chunk = slice(first, min(first + BATCH, len(distinct)))
        offsets = distinct[chunk]
        K = np.repeat(rest[None], len(offsets), axis=0)
        K[:, dofs, dofs] += element_blocks_at_offsets(element, matrix, near, offsets)
        K = (K + K.transpose(0, 2, 1)) / 2
        values, vectors = np.linalg.eigh(K * scale[:, None] * scale[None, :])
        ok = values[:, 0] > ILL_CONDITIONED * np.maximum(values[:, -1], 1e-300)
        stiff[chunk] = ok
        with np.errstate(invalid="ignore", divide="ignore"):
            periods[chunk] = 2 * np.pi / np.sqrt(values)
        phi = vectors * scale[None, :, None]
        rotation[chunk] = (phi[:, 2::3] ** 2 * mass[None, 2::3, None]).sum(axis=1)
        ratios = np.einsum("bim,i,ri->bmr", phi, mass, iota) ** 2 / totals
        dominant = ratios[..., :2].argmax(axis=1)  # (B, 2): the mode with the largest mass in x and in y
        # Offsets whose periods give the same load pattern share it (always, but under ASCE 7's
        # period-dependent distribution): their load cases and storey matrices go together.
        groups: dict[tuple[float, float], list[int]] = {}
        for b in np.flatnonzero(ok).tolist():
            x, y = (load_exponent(settings, height, float(periods[first + b, dominant[b, a]])) for a in range(2))
            groups.setdefault((x, y), []).append(b)
        for exponents, members in groups.items():
            patterns = np.stack([vertical_distribution(1.0, masses, elevations, k) for k in exponents])
            at = [first + b for b in members]
            torsion[at] = _worst_torsion(K[members], solved, patterns, eccentricity, centres, ends)
            key = patterns.tobytes()
            if key not in others:
                others[key] = _storey_matrices(kept, index, patterns, centres)
            rows = _moved_rows(element, matrix, patterns, centres[element.bottom : element.top], offsets[members], n)
            ecc_ratio[at] = _eccentricity_ratios(others[key][None] + rows)

    stands = stiff[where] & _inside(project, element, starts, starts + 2 * half)
    periods, rotation, torsion, ecc_ratio = (array[where] for array in (periods, rotation, torsion, ecc_ratio))
    for array in (periods, rotation, torsion, ecc_ratio):
        array[~stands] = np.nan
    return PositionFigures(
        midpoints=frozen_array(midpoints),
        periods=frozen_array(periods),
        rotation_share=frozen_array(rotation),
        torsion_ratio=frozen_array(torsion),
        eccentricity_ratio=frozen_array(ecc_ratio),
        stands=stands,
    )


def _worst_torsion(
    K: FloatArray,
    cases: list[LoadCase],
    patterns: FloatArray,
    eccentricity: FloatArray,
    centres: FloatArray,
    ends: dict[str, FloatArray],
) -> FloatArray:
    """(G, 2) worst torsion ratio over the storeys and ``cases`` in x and in y (1 without cases)
    for each stiffness of ``K`` (G, 3N, 3N) under the same ``patterns``."""
    n = len(centres)
    if not cases:
        return np.ones((len(K), 2))
    loads = np.column_stack(
        [case_load_vector(c, patterns[DIRECTIONS.index(c.direction)], eccentricity)[0] for c in cases]
    )
    unit = np.linalg.solve(K, np.broadcast_to(loads, (len(K), *loads.shape)))
    unit = unit.transpose(0, 2, 1).reshape(len(K), len(cases), n, 3)
    worst = np.ones((len(K), 2))
    for a, d in enumerate(DIRECTIONS):
        rows = [i for i, c in enumerate(cases) if c.direction == d]
        if rows:
            drifts = storey_drifts(np.asarray(unit[:, rows], dtype=np.float64), centres, ends[d], d)
            worst[:, a] = end_ratio(drifts).max(axis=(1, 2))
    return worst


def _storey_matrices(kept: list[KeptElement], index: int, patterns: FloatArray, centres: FloatArray) -> FloatArray:
    """(N, 3, 3) storey stiffness matrices (definition (a)) of every element but ``index``."""
    total = np.zeros((len(centres), 3, 3))
    for j, entry in enumerate(kept):
        if j != index:
            pattern = element_pattern(entry.element, patterns)
            k = entry.storey_stiffness
            if k is None or entry.pattern is None or not np.array_equal(entry.pattern, pattern):
                k = element_storey_stiffness(entry.matrix, pattern)
            spanned = slice(entry.element.bottom, entry.element.top)
            total[spanned] += element_storey_rows(entry.element, k, centres[spanned])
    return total


def _moved_rows(
    element: Element, matrix: FloatArray, patterns: FloatArray, centres: FloatArray, offsets: FloatArray, n: int
) -> FloatArray:
    """(P, N, 3, 3) the moved element's share of the storey matrices, k_e,j·aᵀa, at each of
    ``offsets`` (its storey stiffness does not depend on where it stands)."""
    k = element_storey_stiffness(matrix, element_pattern(element, patterns))
    a = line_rows_at_offsets(element, centres, offsets)
    out = np.zeros((len(offsets), n, 3, 3))
    out[:, element.bottom : element.top] = k[None, :, None, None] * a[..., :, None] * a[..., None, :]
    return out


def _eccentricity_ratios(matrices: FloatArray) -> FloatArray:
    """(…, N, 2) |e_0x|/r_x and |e_0y|/r_y as StoreyLateral.eccentricity_ratio (0 where undefined)."""
    stands, offsets, _, radii = storey_property_arrays(matrices)
    e = np.abs(np.where(stands[..., None], offsets, 0.0))
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(radii > 0, e / radii, np.where(e == 0, 0.0, np.inf))


def _inside(project: Project, element: Element, starts: FloatArray, ends: FloatArray) -> npt.NDArray[np.bool_]:
    """(P,) whether the element line at each position lies within every floor it connects."""
    lines = shapely.linestrings(np.stack([starts, ends], axis=1))
    memo = LayoutMemo()
    inside = np.ones(len(starts), dtype=bool)
    for level in range(max(element.bottom, 1), element.top + 1):
        inside &= shapely.covers(memo.region(project.levels[level - 1])[1], lines)
    return inside
