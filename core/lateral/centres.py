"""Centres of rigidity and torsional radii, by two documented definitions.

No unique centre of rigidity exists for a multi-storey building (Hejal & Chopra 1989; Tso 1990,
J. Struct. Eng. 116(5)); the two we report agree for one storey and for "proportionate" systems.

(a) Storey centre: each element's storey stiffness k_e,j = storey shear / storey drift of that
    element loaded alone by the static pattern; the storey's 3 × 3 stiffness about the floor's
    mass centre is Σ k_e,j·aᵀa (a = [c, s, s(x − x_m) − c(y − y_m)], design.md), and the centre,
    the torsional stiffness about it and the torsional radii r_x = √(K_θ/K_y), r_y = √(K_θ/K_x)
    follow (EN 1998-1 §4.2.3.2(6), (8)).
(b) No-twist (floor) centre: with the full stiffness K, the points through which the pattern's
    floor forces must act, all floors at once, so that no floor rotates (Cheung & Tso 1986 [memory]).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from scipy.linalg import cho_factor, cho_solve

from core.arrays import FloatArray, sums_from_top
from core.model import Element, Project
from core.solve.assembly import FloorMass, element_matrix, line_rows

RELATIVE_TOLERANCE = 1e-12


@dataclass(frozen=True)
class StoreyStiffness:
    """Definition (a): the storey's stiffness about the floor's mass centre, and what follows."""

    matrix: FloatArray
    """3 × 3 [u_x, u_y, θ] storey stiffness about the mass centre of the floor above."""
    centre: tuple[float, float] | None
    """Centre of rigidity, m; None if the storey cannot resist both translations."""
    torsional_stiffness: float
    """K_θ about the centre of rigidity, kN·m/rad."""
    torsional_radius: tuple[float, float]
    """(r_x, r_y), m; (0, 0) if undefined."""


def element_storey_stiffness(element_k: FloatArray, pattern: FloatArray) -> FloatArray:
    """Storey shear over storey drift of one element loaded alone by ``pattern`` on its floors.

    ``element_k`` is the element's condensed matrix relative to its bottom, ``pattern`` the floor
    forces on the floors it spans, bottom up. A storey that does not drift the way the shear
    pushes it (drift ≤ 0) gets 0: it adds no storey stiffness by this definition."""
    try:
        displacement = np.linalg.solve(element_k, pattern)
    except np.linalg.LinAlgError:
        return np.zeros_like(pattern)
    drifts = np.diff(displacement, prepend=0.0)
    shears = sums_from_top(pattern)
    with np.errstate(divide="ignore", invalid="ignore"):
        k = np.where((drifts > 0) & (shears > 0), shears / drifts, 0.0)
    return k


def element_pattern(element: Element, patterns: FloatArray) -> FloatArray:
    """The pattern (x or y, whichever axis the element's line is closer to) on its floors."""
    c, s = element.direction
    pattern: FloatArray = patterns[0] if abs(c) >= abs(s) else patterns[1]
    return pattern[element.bottom : element.top]


def storey_stiffnesses(
    project: Project, floors: tuple[FloorMass, ...], patterns: FloatArray
) -> tuple[StoreyStiffness, ...]:
    """Definition (a) for every storey. ``patterns`` is (2, N): the floor forces in x and in y."""
    centres = np.array([f.centre for f in floors], dtype=float).reshape(-1, 2)
    matrices = np.zeros((len(floors), 3, 3))
    for e in project.elements:
        k = element_storey_stiffness(element_matrix(project, e), element_pattern(e, patterns))
        matrices[e.bottom : e.top] += element_storey_rows(e, k, centres[e.bottom : e.top])
    return storey_properties(matrices)


def element_storey_rows(element: Element, stiffness: FloatArray, centres: FloatArray) -> FloatArray:
    """(storeys, 3, 3) one element's k_e,j·aᵀa on the storeys it spans; ``centres`` (storeys, 2)
    are the mass centres of the floors above them. The storey matrices are their sums."""
    a = line_rows(element, centres)  # design.md's a
    return stiffness[:, None, None] * a[:, :, None] * a[:, None, :]


def storey_properties(matrices: FloatArray) -> tuple[StoreyStiffness, ...]:
    """Centre, torsional stiffness and radii of each storey from its 3 × 3 matrix (N, 3, 3), all
    storeys at once (:func:`storey_property_arrays`)."""
    stands, offsets, k_theta, radii = storey_property_arrays(matrices)
    out = []
    for j, (ok, offset, k, (r_x, r_y)) in enumerate(
        zip(stands.tolist(), offsets.tolist(), k_theta.tolist(), radii.tolist(), strict=True)
    ):
        if ok:
            out.append(StoreyStiffness(matrices[j], (offset[0], offset[1]), k, (r_x, r_y)))
        else:
            out.append(StoreyStiffness(matrices[j], None, 0.0, (0.0, 0.0)))
    return tuple(out)


def storey_property_arrays(matrices: FloatArray) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
    """For storey matrices (…, 3, 3): whether each resists both translations (relative
    determinant of the translational part above RELATIVE_TOLERANCE), the centre's offset (…, 2)
    from the mass centre, K_θ about it (…) and the radii (r_x, r_y) (…, 2); zeros where it does not."""
    translational = matrices[..., :2, :2]
    coupling = matrices[..., :2, 2]
    scale = np.maximum(np.abs(translational).max(axis=(-2, -1)), 1e-300)
    if matrices.size:
        determinant = np.linalg.det(translational / scale[..., None, None])
    else:
        determinant = np.zeros(matrices.shape[:-2])
    stands = determinant > RELATIVE_TOLERANCE
    minus_y_x = np.zeros((*matrices.shape[:-2], 2))  # [−y_r, x_r] about the mass centre
    if np.any(stands):
        minus_y_x[stands] = np.linalg.solve(translational[stands], coupling[stands][..., None])[..., 0]
    k_theta = np.where(
        stands, np.maximum(matrices[..., 2, 2] - np.einsum("...j,...j->...", coupling, minus_y_x), 0.0), 0.0
    )
    with np.errstate(divide="ignore", invalid="ignore"):
        radii = np.stack(
            [np.sqrt(k_theta / translational[..., 1, 1]), np.sqrt(k_theta / translational[..., 0, 0])], axis=-1
        )
    radii = np.where(stands[..., None], radii, 0.0)
    offsets = np.stack([minus_y_x[..., 1], -minus_y_x[..., 0]], axis=-1)
    return stands, offsets, k_theta, radii


def no_twist_offsets(K: FloatArray, patterns: FloatArray) -> FloatArray:
    """Definition (b): (N, 2) offsets (x, y) of the no-twist centres from the floors' mass centres.

    With θ = 0 on every floor, the translational rows give K_tt·u_t = f_t, and the floor moments
    the loads must then supply are M = K_θt·u_t. A force F_x at height offset y has moment
    −y·F_x, so y = −M/F_x from the x pattern; x = M/F_y from the y pattern. NaN where the pattern
    puts no force on a floor."""
    n = K.shape[0] // 3
    t = np.array([i for i in range(3 * n) if i % 3 != 2])
    r = np.arange(2, 3 * n, 3)
    factor = cho_factor(K[np.ix_(t, t)], check_finite=False)  # K is finite (check_stiffness)
    loads = np.zeros((2 * n, 2))
    loads[0::2, 0] = patterns[0]
    loads[1::2, 1] = patterns[1]
    moments = K[np.ix_(r, t)] @ cho_solve(factor, loads, check_finite=False)  # (N, 2): from the x and the y pattern
    offsets = np.full((n, 2), np.nan)
    with np.errstate(divide="ignore", invalid="ignore"):
        has_x = np.abs(patterns[0]) > 0
        has_y = np.abs(patterns[1]) > 0
        offsets[has_y, 0] = moments[has_y, 1] / patterns[1][has_y]
        offsets[has_x, 1] = -moments[has_x, 0] / patterns[0][has_x]
    return offsets
