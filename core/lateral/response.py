"""The response of the model to the static load cases, and the figures the rule sets judge.

Per case: displacements, drifts at the mass centre, the ends and the corners, torsion ratios and
A_x; per storey: design drifts, stiffness and mass ratios; per element: its share of the storey
shear; over the modes: where the first rotation-dominated one falls. No limit lives here: the rule
sets (:mod:`core.lateral.rules`) judge these figures.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from functools import lru_cache

import numpy as np

from core.arrays import FloatArray, frozen_array, sums_from_top
from core.lateral.cases import Direction, LoadCase
from core.lateral.records import CaseResult, ModeOrder
from core.model import LoadMethod, Point, Project, Ring, Settings
from core.solve.assembly import FloorMass
from core.solve.modal import Mode

AMPLIFICATION_BASE = 1.2
"""The 1.2 of ASCE 7-16 §12.8.4.3 Eq. 12.8-14: A_x = (δ_max / 1.2 δ_avg)²."""
AMPLIFICATION_CAP = 3.0
"""ASCE 7-16 §12.8.4.3: A_x need not exceed 3.0."""


# --- response of one load case -----------------------------------------------------------------


def point_displacements(
    displacements: FloatArray, centres: FloatArray, points: FloatArray, direction: Direction
) -> FloatArray:
    """Rigid-floor displacement along ``direction`` at plan points.

    ``displacements`` (…, N, 3) at the mass centres (leading axes: cases), ``centres`` (N, 2),
    ``points`` (N, P, 2); returns (…, N, P): u_x(p) = u_x − θ·(p_y − y_m),
    u_y(p) = u_y + θ·(p_x − x_m)."""
    theta = displacements[..., 2:3]
    if direction == "x":
        return displacements[..., 0:1] - theta * (points[:, :, 1] - centres[:, 1:2])
    return displacements[..., 1:2] + theta * (points[:, :, 0] - centres[:, 0:1])


def storey_drifts(
    displacements: FloatArray, centres: FloatArray, points: FloatArray, direction: Direction
) -> FloatArray:
    """(…, N, P) drift of storey j at the points of level j: its floor's motion there less that of
    the floor below at the same plan points (the base does not move)."""
    top = point_displacements(displacements, centres, points, direction)
    below = np.zeros_like(top)
    if displacements.shape[-2] > 1:
        below[..., 1:, :] = point_displacements(
            displacements[..., :-1, :], centres[:-1], points[1:], direction
        )
    return top - below


def extreme_points(project: Project, direction: Direction) -> FloatArray:
    """(N, 2, 2) the two outline vertices of each level farthest apart across ``direction``: lowest
    and highest y for x loads, lowest and highest x for y loads. Drift along the load is linear
    across it, so these are the two ends of ASCE 7 Table 12.3-1."""
    axis = 1 if direction == "x" else 0
    return np.array([_extremes(level.outline, axis) for level in project.levels], dtype=float).reshape(-1, 2, 2)


@lru_cache(maxsize=4096)
def _extremes(outline: Ring, axis: int) -> tuple[Point, Point]:
    """The outline vertices with the lowest and the highest coordinate ``axis`` (kept per outline:
    a drag leaves the outlines alone)."""
    ring = np.asarray(outline, dtype=float)
    return outline[int(np.argmin(ring[:, axis]))], outline[int(np.argmax(ring[:, axis]))]


def outline_vertices(project: Project) -> FloatArray:
    """(N, P, 2) every level's outline vertices, padded by repeating the last one to a common P."""
    count = max(len(level.outline) for level in project.levels)
    return np.array([_padded(level.outline, count) for level in project.levels], dtype=float)


@lru_cache(maxsize=4096)
def _padded(outline: Ring, count: int) -> Ring:
    return outline + (outline[-1],) * (count - len(outline))


def end_ratio(ends: FloatArray) -> FloatArray:
    """max |δ| over |average δ| of the two ends (last axis); inf if the average vanishes while an
    end moves, 1 if neither end moves."""
    largest = np.abs(ends).max(axis=-1)
    average = np.abs(ends.sum(axis=-1)) / 2
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = np.where(average > 1e-12 * largest, largest / average, math.inf)
    return np.where(largest > 0, ratio, 1.0)


def amplification(end_displacements: FloatArray) -> FloatArray:
    """A_x = (δ_max / 1.2 δ_avg)², 1 ≤ A_x ≤ 3 (ASCE 7-16 §12.8.4.3 Eq. 12.8-14)."""
    ratio = end_ratio(end_displacements)
    return np.clip((ratio / AMPLIFICATION_BASE) ** 2, 1.0, AMPLIFICATION_CAP)


def case_results(
    cases: Sequence[LoadCase],
    unit_displacements: FloatArray,
    base_shears: FloatArray,
    unit_forces: FloatArray,
    offsets: FloatArray,
    centres: FloatArray,
    project: Project,
) -> tuple[CaseResult, ...]:
    """The response to each case from its response to the pattern scaled to a 1 kN base shear.

    ``unit_displacements`` (C, N, 3), ``base_shears`` (C,), ``unit_forces`` (C, N) and
    ``offsets`` (C, N, 2) per case. Ratios come from the unit response, so they stay defined
    when a base shear is zero."""
    vertices = outline_vertices(project)
    out: list[CaseResult | None] = [None] * len(cases)
    for d in ("x", "y"):
        index = [i for i, c in enumerate(cases) if c.direction == d]
        if not index:
            continue
        U = unit_displacements[index]
        ends = extreme_points(project, d)
        end_drifts = storey_drifts(U, centres, ends, d)
        end_disp = point_displacements(U, centres, ends, d)
        drifts = storey_drifts(U, centres, centres[:, None, :], d)[..., 0]
        corner = np.abs(storey_drifts(U, centres, vertices, d)).max(axis=-1)
        ratios = end_ratio(end_drifts)
        amplified = amplification(end_disp)
        # All cases of the direction at once; each CaseResult holds read-only views of these.
        scale = np.asarray(base_shears, dtype=float)[index]
        signs = np.array([cases[i].sign for i in index], dtype=float)
        forces = (signs * scale)[:, None] * unit_forces[index]
        arrays = {
            "forces": forces,
            "application_points": centres + offsets[index],
            "displacements": scale[:, None, None] * U,
            "storey_shears": sums_from_top(forces, axis=1),
            "drifts": scale[:, None] * drifts,
            "end_drifts": scale[:, None, None] * end_drifts,
            "torsion_ratio": ratios,
            "end_displacements": scale[:, None, None] * end_disp,
            "amplification": amplified,
            "corner_drifts": scale[:, None] * corner,
        }
        for name, array in arrays.items():
            arrays[name] = np.ascontiguousarray(array)
            arrays[name].setflags(write=False)
        end_points = frozen_array(ends)
        for row, i in enumerate(index):
            out[i] = CaseResult(
                case=cases[i], end_points=end_points, **{name: array[row] for name, array in arrays.items()}
            )
    return tuple(r for r in out if r is not None)


# --- drifts ------------------------------------------------------------------------------------


def drift_amplification(settings: Settings) -> float:
    """Elastic → design drift: q_d = q (EN 1998-1 §4.3.4(1), q_d = q by default), C_d/I_e
    (ASCE 7-16 §12.8.6 Eq. 12.8-15), or 1 for a plain coefficient (loads taken as given)."""
    if settings.load_method is LoadMethod.EN1998:
        return settings.eurocode8.behaviour_factor
    if settings.load_method is LoadMethod.ASCE7:
        return settings.asce7.deflection_amplification / settings.asce7.importance
    return 1.0


# --- regularity --------------------------------------------------------------------------------


def stiffness_ratios(stiffness: FloatArray) -> tuple[FloatArray, FloatArray]:
    """Per storey: k_j / k_(j+1), and k_j / mean(k_(j+1..j+3)); NaN where the storeys above are
    missing (ASCE 7-16 Table 12.3-2 type 1a)."""
    n = len(stiffness)
    above = np.full(n, np.nan)
    average = np.full(n, np.nan)
    with np.errstate(divide="ignore", invalid="ignore"):
        upper = stiffness[1:]
        above[:-1] = np.where(upper > 0, stiffness[:-1] / upper, np.nan)
        if n > 3:
            mean = (stiffness[1:-2] + stiffness[2:-1] + stiffness[3:]) / 3
            average[: n - 3] = np.where(mean > 0, stiffness[: n - 3] / mean, np.nan)
    return above, average


def mass_ratios(masses: FloatArray) -> FloatArray:
    """(N, 2) m_j / m_(j−1) and m_j / m_(j+1); NaN where there is no such floor."""
    n = len(masses)
    out = np.full((n, 2), np.nan)
    with np.errstate(divide="ignore", invalid="ignore"):
        out[1:, 0] = masses[1:] / masses[:-1]
        out[:-1, 1] = masses[:-1] / masses[1:]
    return out


# --- element shares ----------------------------------------------------------------------------


def element_shares(shears: FloatArray, along_load: FloatArray, storey_shears: FloatArray) -> FloatArray:
    """(…, cases, storeys) share of the storey shear: the element shear's component along the load
    over the case's storey shear (both signed, so a share is positive when the element helps).
    ``along_load`` is (…, cases); leading axes are elements."""
    with np.errstate(divide="ignore", invalid="ignore"):
        share = shears * along_load[..., None] / storey_shears
    return np.where(np.isfinite(share), share, 0.0)


# --- modes -------------------------------------------------------------------------------------


def mode_order(modes: Sequence[Mode]) -> ModeOrder:
    """Where the first rotation-dominated mode falls (dominant = largest kinetic energy share)."""
    firsts: list[int | None] = [None, None, None]
    for mode in modes:
        k = max(range(3), key=mode.shares.__getitem__)  # the first largest, as argmax
        if firsts[k] is None:
            firsts[k] = mode.number
    first_x, first_y, first_torsion = firsts
    translational = [m for m in (first_x, first_y) if m is not None]
    ratio = 0.0
    before = False
    if first_torsion is not None and translational:
        ratio = modes[first_torsion - 1].period / modes[min(translational) - 1].period
        before = len(translational) < 2 or first_torsion < max(translational)
    return ModeOrder(first_x, first_y, first_torsion, ratio, before)


def design_drift_ratios(
    cases: Sequence[CaseResult], heights: FloatArray, direction: Direction, factor: float
) -> tuple[FloatArray, FloatArray]:
    """Worst design drift ratio per storey over the cases in ``direction``: at the mass centre and
    at the worst corner."""
    chosen = [c for c in cases if c.case.direction == direction]
    if not chosen:
        return np.zeros(len(heights)), np.zeros(len(heights))
    centre = np.max([np.abs(c.drifts) for c in chosen], axis=0)
    corner = np.max([c.corner_drifts for c in chosen], axis=0)
    return factor * centre / heights, factor * corner / heights


def floor_arrays(floors: Sequence[FloorMass]) -> tuple[FloatArray, FloatArray]:
    """Masses (N,) and mass centres (N, 2) of the floors."""
    return np.array([f.mass for f in floors]), np.array([f.centre for f in floors], dtype=float)
