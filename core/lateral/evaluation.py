"""The lateral checks of one project state: ``lateral_checks(project, floors, K, modes)``.

Order: static loads per direction from the modal periods → the load cases (all solved with one
Cholesky factorisation of K) → centres and radii per storey → torsion ratios, drifts, element
demands, regularity → the rule set's verdicts. Everything is linear, so each case is solved for
its pattern scaled to a 1 kN base shear and then scaled by the base shear.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterator, Sequence
from functools import lru_cache

import numpy as np
from scipy.linalg import cho_factor, cho_solve

from core.arrays import FloatArray, frozen_array, sums_from_top
from core.elements import member_forces
from core.lateral.cases import DIRECTIONS
from core.lateral.centres import StoreyStiffness, no_twist_offsets, storey_properties, storey_stiffnesses
from core.lateral.loads import (
    accidental_eccentricities,
    case_load_vector,
    load_cases,
    static_load,
    vertical_distribution,
)
from core.lateral.p_delta import StabilityLimits, amplification, gravity_loads, stability_coefficients
from core.lateral.records import (
    CaseResult,
    Check,
    ElementDemand,
    LateralResults,
    StaticLoad,
    Status,
    StoreyLateral,
    Verdict,
)
from core.lateral.response import (
    case_results,
    design_drift_ratios,
    drift_amplification,
    element_shares,
    floor_arrays,
    mass_ratios,
    mode_order,
    stiffness_ratios,
    storey_drifts,
)
from core.lateral.rules import rules_for
from core.model import BracedFrame, Element, Project
from core.model.continuity import overlap, transfers
from core.solve.assembly import FloorMass, element_matrix
from core.solve.modal import Mode

StoreyMatrices = Callable[[FloatArray], FloatArray]
"""patterns (2, N) → the (N, 3, 3) storey matrices of definition (a) (centres.storey_stiffnesses)."""


def lateral_checks(
    project: Project,
    floors: tuple[FloorMass, ...],
    K: FloatArray,
    modes: Sequence[Mode],
    storey_matrices: StoreyMatrices | None = None,
    element_matrices: Sequence[FloatArray] | None = None,
) -> LateralResults:
    """Centres, radii, static load cases, torsion ratios, drifts, element demands, regularity and
    verdicts. ``K`` must have passed :func:`core.solve.diagnostics.check_stiffness`. An analysis
    session passes what it kept: the storey matrices and the elements' condensed matrices."""
    settings = project.settings
    n = len(floors)
    masses, centres = floor_arrays(floors)
    elevations = np.array([f.elevation for f in floors])
    heights = np.array([level.height for level in project.levels])

    loads = tuple(static_load(d, settings, floors, _modal_period(modes, i)) for i, d in enumerate(DIRECTIONS))
    patterns = np.stack(
        [vertical_distribution(1.0, masses, elevations, ld.distribution_exponent) for ld in loads]
    )
    eccentricity = accidental_eccentricities(project, settings.accidental_eccentricity)

    # Every case (the centred ones too: they give the storey stiffnesses), one factorisation.
    all_cases = load_cases(include_centred=True)
    axis = [DIRECTIONS.index(c.direction) for c in all_cases]
    vectors, offsets = zip(
        *(case_load_vector(c, patterns[a], eccentricity) for c, a in zip(all_cases, axis, strict=True)),
        strict=True,
    )
    # K passed check_stiffness, so it is finite: scipy need not scan it again.
    factor = cho_factor(K, check_finite=False)
    unit = cho_solve(factor, np.column_stack(vectors), check_finite=False)  # (3N, cases), 1 kN base shear each
    unit_cases = unit.T.reshape(len(all_cases), n, 3)
    results = case_results(
        all_cases,
        unit_cases,
        np.array([loads[a].base_shear for a in axis]),
        patterns[axis],
        np.array(offsets),
        centres,
        project,
    )
    reported = [
        i for i, c in enumerate(all_cases) if c.eccentricity_sign != 0 or settings.include_centred_case
    ]
    cases = tuple(results[i] for i in reported)

    centred = {
        c.direction: unit_cases[i] for i, c in enumerate(all_cases) if c.eccentricity_sign == 0 and c.sign > 0
    }
    storey_k = np.column_stack(
        [_storey_stiffness(centred[d], centres, patterns[i], d) for i, d in enumerate(DIRECTIONS)]
    )

    rules = rules_for(settings)
    storeys = _storeys(
        project,
        floors,
        storey_stiffnesses(project, floors, patterns)
        if storey_matrices is None
        else storey_properties(storey_matrices(patterns)),
        no_twist_offsets(K, patterns),
        cases,
        storey_k,
        masses,
        heights,
        drift_amplification(settings),
        _stability(rules.stability_limits(settings), masses, settings.gravity_factor, loads, heights),
    )
    scales = np.array([loads[DIRECTIONS.index(r.case.direction)].base_shear for r in cases])
    matrices = element_matrices or [element_matrix(project, e) for e in project.elements]
    displacements = unit[:, reported] * scales
    p_delta = np.array([s.p_delta_factor for s in storeys])
    elements = ElementDemands(lambda: element_demands(project, floors, matrices, displacements, cases, p_delta))
    order = mode_order(modes)
    drift_limit = rules.drift_limit(settings)
    return LateralResults(
        rule_set=str(rules.name),
        rule_set_title=rules.title,
        loads=(loads[0], loads[1]),
        accidental_eccentricity=frozen_array(eccentricity),
        drift_amplification=drift_amplification(settings),
        drift_reduction=rules.drift_reduction(settings),
        drift_limit=drift_limit.ratio,
        drift_basis=drift_limit.basis,
        cases=cases,
        storeys=storeys,
        elements=elements,
        mode_order=order,
        verdicts=rules.judge(settings, storeys, order)
        + rules.method_limits(settings, loads, storeys, float(elevations[-1]))
        + continuity_verdicts(project, rules.continuity_clause),
        notes=rules.notes(settings),
    )


def continuity_verdicts(project: Project, clause: str) -> tuple[Verdict, ...]:
    """A warning for each element whose base is fixed on a floor (:func:`core.model.continuity.transfers`):
    the share of its length that lateral elements beneath carry on down, against all of it."""
    out = []
    for transfer in transfers(project):
        element = project.element(transfer.element)
        below = [project.element(i) for i in transfer.beneath]
        carried = sum(overlap(element, e) for e in below) / element.length if element.length > 0 else 0.0
        out.append(
            Verdict(
                name=Check.CONTINUITY,
                value=min(1.0, carried) if transfer.stacked_on is None else 1.0,
                limit=1.0,
                status=Status.WARN,
                clause=clause,
                note=transfer.message + ".",
            )
        )
    return tuple(out)


def _modal_period(modes: Sequence[Mode], axis: int) -> float:
    """Period of the mode with the largest effective mass in direction ``axis`` (0 = x, 1 = y)."""
    return max(modes, key=lambda m: m.mass_ratio[axis]).period


StoreyStability = tuple[FloatArray, Callable[[FloatArray], tuple[FloatArray, FloatArray]]]
"""The gravity loads (N,) and a function from design drift ratios (N, 2) to θ and 1/(1 − θ)."""


def _stability(
    limits: StabilityLimits | None,
    masses: FloatArray,
    factor: float,
    loads: Sequence[StaticLoad],
    heights: FloatArray,
) -> StoreyStability:
    gravity = gravity_loads(masses, factor)
    shears = np.column_stack([ld.storey_shears for ld in loads])

    def judged(drift_ratios: FloatArray) -> tuple[FloatArray, FloatArray]:
        if limits is None:
            return np.zeros_like(drift_ratios), np.ones_like(drift_ratios)
        theta = stability_coefficients(gravity, drift_ratios, shears, limits.drift_factor)
        return theta, amplification(theta, limits)

    return gravity, judged


def _storey_stiffness(
    unit: FloatArray, centres: FloatArray, pattern: FloatArray, direction: str
) -> FloatArray:
    """Storey shear over storey drift at the mass centre under a centred unit pattern (NaN where
    the storey does not drift with the load; the regularity ratios then do not apply)."""
    drifts = storey_drifts(unit, centres, centres[:, None, :], direction)[:, 0]
    shears = sums_from_top(pattern)
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(drifts > 0, shears / drifts, np.nan)


def _storeys(
    project: Project,
    floors: tuple[FloorMass, ...],
    rigidity: tuple[StoreyStiffness, ...],
    no_twist: FloatArray,
    cases: tuple[CaseResult, ...],
    storey_k: FloatArray,
    masses: FloatArray,
    heights: FloatArray,
    amplification: float,
    stability: StoreyStability,
) -> tuple[StoreyLateral, ...]:
    drift = {d: design_drift_ratios(cases, heights, d, amplification) for d in DIRECTIONS}
    gravity, judged = stability
    theta, p_delta = (a.tolist() for a in judged(np.column_stack([drift["x"][0], drift["y"][0]])))
    gravity_list = gravity.tolist()
    ratios = {d: stiffness_ratios(storey_k[:, i]) for i, d in enumerate(DIRECTIONS)}
    mass = _applicable(mass_ratios(masses))
    worst = {
        name: np.column_stack(
            [
                np.max([getattr(c, name) for c in cases if c.case.direction == d], axis=0)
                if any(c.case.direction == d for c in cases)
                else np.ones(len(floors))
                for d in DIRECTIONS
            ]
        ).tolist()
        for name in ("torsion_ratio", "amplification")
    }
    drift_ratio = np.column_stack([drift["x"][0], drift["y"][0]]).tolist()
    corner_ratio = np.column_stack([drift["x"][1], drift["y"][1]]).tolist()
    above = _applicable(np.column_stack([ratios["x"][0], ratios["y"][0]]))
    average = _applicable(np.column_stack([ratios["x"][1], ratios["y"][1]]))
    stiffness = _applicable(storey_k)
    twists = no_twist.tolist()
    twist_known = (~np.any(np.isnan(no_twist), axis=1)).tolist()
    twist_values = np.nan_to_num(no_twist).tolist()
    out = []
    for j, floor in enumerate(floors):
        a = rigidity[j]
        cx, cy = floor.centre
        ecc = a.centre if a.centre is not None else (0.0, 0.0)
        r_x, r_y = a.torsional_radius
        l_s = floor.radius_of_gyration
        twist = twists[j]
        out.append(
            StoreyLateral(
                storey=j + 1,
                name=floor.name,
                height=float(heights[j]),
                mass_centre=(cx, cy),
                rigidity_centre=None if a.centre is None else (cx + ecc[0], cy + ecc[1]),
                no_twist_centre=(cx + twist[0], cy + twist[1]) if twist_known[j] else None,
                eccentricity=(float(ecc[0]), float(ecc[1])),
                no_twist_eccentricity=(twist_values[j][0], twist_values[j][1]),
                lateral_stiffness=(float(a.matrix[0, 0]), float(a.matrix[1, 1])),
                torsional_stiffness=a.torsional_stiffness,
                torsional_radius=(r_x, r_y),
                radius_of_gyration=l_s,
                eccentricity_ratio=(_ratio(abs(ecc[0]), r_x), _ratio(abs(ecc[1]), r_y)),
                radius_ratio=(_ratio(r_x, l_s), _ratio(r_y, l_s)),
                torsion_ratio=(worst["torsion_ratio"][j][0], worst["torsion_ratio"][j][1]),
                amplification=(worst["amplification"][j][0], worst["amplification"][j][1]),
                drift_ratio=(drift_ratio[j][0], drift_ratio[j][1]),
                corner_drift_ratio=(corner_ratio[j][0], corner_ratio[j][1]),
                storey_stiffness=(stiffness[j][0], stiffness[j][1]),
                stiffness_ratio_above=(above[j][0], above[j][1]),
                stiffness_ratio_average=(average[j][0], average[j][1]),
                mass_ratio=(mass[j][0], mass[j][1]),
                gravity_load=gravity_list[j],
                stability_coefficient=(theta[j][0], theta[j][1]),
                p_delta_factor=(p_delta[j][0], p_delta[j][1]),
            )
        )
    return tuple(out)


def _applicable(ratios: FloatArray) -> list[list[float | None]]:
    """Rows of ``ratios`` as lists, with None where a ratio does not apply (NaN or infinite:
    no such storey, or nothing to divide by)."""
    return [[v if math.isfinite(v) else None for v in row] for row in ratios.tolist()]


def _ratio(numerator: float, denominator: float) -> float:
    if denominator > 0:
        return numerator / denominator
    return 0.0 if numerator == 0 else float("inf")


class ElementDemands(Sequence[ElementDemand]):
    """The element demands of one analysis, computed for all elements together the first time a
    view asks for any (a drag that shows none never pays for them)."""

    def __init__(self, compute: Callable[[], tuple[ElementDemand, ...]]) -> None:
        self._compute: Callable[[], tuple[ElementDemand, ...]] | None = compute
        self._demands: tuple[ElementDemand, ...] | None = None

    @property
    def demands(self) -> tuple[ElementDemand, ...]:
        if self._demands is None:
            assert self._compute is not None
            self._demands, self._compute = self._compute(), None
        return self._demands

    def __len__(self) -> int:
        return len(self.demands)

    def __getitem__(self, index):  # type: ignore[no-untyped-def]
        return self.demands[index]

    def __iter__(self) -> Iterator[ElementDemand]:
        return iter(self.demands)

    def __eq__(self, other: object) -> bool:
        if isinstance(other, ElementDemands):
            return self.demands == other.demands
        return self.demands == other

    __hash__ = None  # type: ignore[assignment]

    def __repr__(self) -> str:
        return f"ElementDemands({self.demands!r})"


def element_demands(
    project: Project,
    floors: tuple[FloorMass, ...],
    matrices: Sequence[FloatArray],
    displacements: FloatArray,
    cases: tuple[CaseResult, ...],
    p_delta: FloatArray | None = None,
) -> tuple[ElementDemand, ...]:
    """Shears, shares, brace forces and base moment of every element over the reported cases.

    ``displacements`` is (3N, cases): the global response of each case; ``matrices`` the elements'
    condensed matrices; ``p_delta`` (N, 2) the storeys' P-Δ factors 1/(1 − θ) in x and y, which
    multiply the shears, brace forces and base moment (the largest factor of the storeys spanned)
    of the cases in that direction (the shares are unchanged). The displacements along every
    element's line on every floor it spans are found in one batch; each element then costs one
    product with its matrix."""
    if not project.elements:
        return ()
    line, first = element_lines(project, floors, displacements)
    groups: dict[tuple[int, int], list[int]] = {}
    for i, e in enumerate(project.elements):
        groups.setdefault((e.bottom, e.top), []).append(i)
    axis = np.array([0 if r.case.direction == "x" else 1 for r in cases], dtype=int)
    factors = np.ones((len(floors), len(cases))) if p_delta is None else p_delta[:, axis]
    demands: list[ElementDemand | None] = [None] * len(project.elements)
    for (bottom_level, top_level), members in groups.items():
        spanned = slice(bottom_level, top_level)
        group_lines = np.stack([line[first[i] : first[i + 1]] for i in members])  # (G, storeys, cases)
        for i, demand in zip(
            members,
            _span_group_demands(
                project,
                [project.elements[i] for i in members],
                np.stack([matrices[i] for i in members]),
                group_lines,
                cases,
                spanned,
                factors[spanned],
            ),
            strict=True,
        ):
            demands[i] = demand
    return tuple(d for d in demands if d is not None)


def element_lines(
    project: Project, floors: tuple[FloorMass, ...], displacements: FloatArray
) -> tuple[FloatArray, FloatArray]:
    """The displacements along every element's line on every floor it spans, relative to its
    bottom, for each column of ``displacements`` (3N, columns): rows of element i are
    ``first[i]:first[i + 1]`` of the (Σ storeys, columns) array."""
    counts = [e.storey_count for e in project.elements]
    floor = np.concatenate([np.arange(e.bottom, e.top) for e in project.elements])
    lines = np.repeat(np.array([(*e.direction, *e.start) for e in project.elements], dtype=float), counts, axis=0)
    bottom = np.repeat([e.bottom - 1 for e in project.elements], counts)
    centres = np.array([f.centre for f in floors], dtype=float)
    u = displacements.reshape(len(floors), 3, -1)

    def along(floors_at: FloatArray) -> FloatArray:
        c, s, x, y = lines.T
        a = np.column_stack([c, s, s * (x - centres[floors_at, 0]) - c * (y - centres[floors_at, 1])])
        moved: FloatArray = np.einsum("rk,rkc->rc", a, u[floors_at])
        return moved

    line = along(floor)
    above_base = bottom >= 0
    if np.any(above_base):
        line -= np.where(above_base[:, None], along(np.maximum(bottom, 0)), 0.0)
    first = np.concatenate([[0], np.cumsum(counts)])
    return line, first


def element_shears(
    project: Project, floors: tuple[FloorMass, ...], matrices: Sequence[FloatArray], displacements: FloatArray
) -> list[FloatArray]:
    """Per element, its (columns, storeys spanned) shear along its line for each column of
    ``displacements`` (3N, columns), kN: the modal or wind responses, where no case record exists."""
    if not project.elements:
        return []
    line, first = element_lines(project, floors, displacements)
    return [
        sums_from_top(matrices[i] @ line[first[i] : first[i + 1]], axis=0).T for i in range(len(project.elements))
    ]


def _span_group_demands(
    project: Project,
    elements: list[Element],
    matrices: FloatArray,
    lines: FloatArray,
    cases: tuple[CaseResult, ...],
    spanned: slice,
    factors: FloatArray,
) -> list[ElementDemand]:
    """The demands of elements that span the same storeys, together: ``matrices`` (G, n, n) and
    ``lines`` (G, n, cases), their floors' displacements along their lines relative to their bottom;
    ``factors`` (n, cases) the P-Δ factors of their storeys."""
    n = matrices.shape[1]
    floor_forces = matrices @ lines  # (G, n, cases): one product per element
    shears = np.ascontiguousarray(sums_from_top(floor_forces, axis=1).transpose(0, 2, 1))  # (G, cases, n)
    directions = np.array([e.direction for e in elements], dtype=float)
    axis = np.array([0 if r.case.direction == "x" else 1 for r in cases], dtype=int)
    along = directions[:, axis]  # (G, cases)
    storey_shears = np.array([r.storey_shears[spanned] for r in cases]).reshape(len(cases), n)
    shares = element_shares(shears, along, storey_shears)
    amplified = bool(np.any(factors != 1.0))
    if amplified:
        shears = shears * factors.T[None]
    z = np.cumsum([level.height for level in project.levels[spanned]])
    if len(cases):
        moments = np.abs(np.einsum("f,gfc->gc", z, floor_forces)) * factors.max(axis=0)[None]
        base_moments = moments.max(axis=1).tolist()
        shear_envelopes = np.abs(shears).max(axis=1)
        share_envelopes = shares.max(axis=1)
    else:
        base_moments = [0.0] * len(elements)
        shear_envelopes = share_envelopes = np.zeros((len(elements), n))
    for array in (shears, shares, shear_envelopes, share_envelopes):
        array.setflags(write=False)  # each element's arrays are read-only views of these
    heights = tuple(level.height for level in project.levels[spanned])
    storeys = tuple(range(spanned.start + 1, spanned.stop + 1))
    out = []
    for g, element in enumerate(elements):
        braces = np.zeros((n, 0))
        if isinstance(element.properties, BracedFrame) and len(cases):
            # Rounded to 1 µm like the element cache, so a drag's rounding noise still hits the cache.
            influence = brace_influence(element.properties, round(element.length, 6), heights)
            forces = np.einsum("sbf,fc->csb", influence, lines[g])
            if amplified:
                forces = forces * factors.T[:, :, None]
            braces = np.abs(forces).max(axis=0)
        braces.setflags(write=False)
        out.append(
            ElementDemand(
                element=element.id,
                storeys=storeys,
                shears=shears[g],
                shares=shares[g],
                shear_envelope=shear_envelopes[g],
                share_envelope=share_envelopes[g],
                brace_force_envelope=braces,
                base_moment_envelope=base_moments[g],
            )
        )
    return out


@lru_cache(maxsize=512)
def brace_influence(properties: BracedFrame, length: float, heights: tuple[float, ...]) -> FloatArray:
    """(storeys, braces, floors): brace axial forces per unit displacement of each floor, built
    once per frame shape (forces are linear in the displacements) so a drag costs one product."""
    n = len(heights)
    columns = [_braces(member_forces(properties, length, heights, np.eye(n)[i]).brace_axial) for i in range(n)]
    influence = np.stack(columns, axis=-1)
    influence.setflags(write=False)
    return influence


def _braces(forces: FloatArray | None) -> FloatArray:
    """A braced frame's brace forces (always present for that kind)."""
    assert forces is not None
    return forces
