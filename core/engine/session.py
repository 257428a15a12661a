"""An analysis session: ``session.analyse(project) -> Results`` for a sequence of related states.

A drag, a stretch or a property edit changes one element; a level edit changes a few floors. The
session keeps, from the state it analysed last:

- each floor's mass, by level (a level that is equal and at the same elevation is reused);
- each element's condensed matrix, its block Tᵀ k T of the global stiffness and its storey
  stiffness under the last load pattern, by element id (kept while the element, the centres of
  the floors it connects and the heights of the storeys it spans are unchanged);
- the global K itself: an edit subtracts the changed elements' old blocks and adds their new
  ones; K is rebuilt in element order whenever many elements changed and every
  ``REBUILD_EVERY`` updates, so rounding never accumulates;
- which element lines were found inside their floors' outlines (:class:`LayoutMemo`).

Everything else — the one eigen-solve (shared by the stiffness diagnostics and the modal
analysis), the load cases and the checks — runs on every call. The result equals a cold analysis
to rounding (tests/test_engine_session.py holds it to 1e-9 over random edit sequences). Unrelated
projects are safe: nothing matches, and the session analyses from scratch. BLAS is limited to one
thread while it runs (the problems are small and dense; more threads only add overhead).
"""

from __future__ import annotations

import threading
from dataclasses import dataclass
from typing import Any

import numpy as np
from threadpoolctl import ThreadpoolController

from core.arrays import FloatArray, frozen_array
from core.errors import AnalysisError
from core.lateral.centres import element_pattern, element_storey_rows, element_storey_stiffness
from core.lateral.evaluation import lateral_checks
from core.model import Element, Level, Project
from core.results import Results
from core.solve.assembly import (
    DOF_PER_FLOOR,
    FloorMass,
    assemble_mass,
    element_block,
    element_floors,
    element_matrix,
    floor_mass,
)
from core.solve.diagnostics import LayoutMemo, check_layout, check_stiffness
from core.solve.modal import modal_analysis, scaled_eigen

REBUILD_EVERY = 64
"""Incremental K updates between two rebuilds from the elements' blocks."""


@dataclass
class KeptElement:
    """What the session keeps of one element."""

    element: Element
    floors: range
    """0-based floors it connects (its DOFs in K are contiguous)."""
    centres: FloatArray
    """Mass centres of those floors when the block was made."""
    heights: tuple[float, ...]
    matrix: FloatArray
    """Condensed stiffness over its storeys."""
    block: FloatArray
    pattern: FloatArray | None = None
    storey_stiffness: FloatArray | None = None
    """Storey shear over drift under ``pattern`` (core.lateral.centres.element_storey_stiffness)."""
    rows: FloatArray | None = None
    """Its share of the storey matrices (core.lateral.centres.element_storey_rows)."""
    stamp: int = -1
    """The session's pattern stamp when ``storey_stiffness`` and ``rows`` were made."""


class AnalysisSession:
    """Analyses project states one after the other, reusing what an edit leaves unchanged."""

    def __init__(self) -> None:
        self._lock = threading.Lock()
        self._forget()

    def _forget(self) -> None:
        """Drop everything kept: the next analysis starts cold."""
        self._levels: tuple[Level, ...] = ()
        self._floors: tuple[FloorMass, ...] = ()
        self._kept: dict[str, KeptElement] = {}
        self._K: FloatArray = np.zeros((0, 0))
        self._updates = 0
        self._layout = LayoutMemo()
        self._floors_before: tuple[FloorMass, ...] = ()
        self._patterns: FloatArray | None = None
        self._stamp = 0
        self._storeys: FloatArray = np.zeros((0, 3, 3))
        self._storey_updates = 0
        self._replaced: list[KeptElement] = []
        """Entries the last K update took out: their storey rows go out of the storey matrices too."""
        self._last: tuple[Project, Results] | None = None
        """The project analysed last and its results: the same object again costs nothing."""

    def analyse(self, project: Project) -> Results:
        """Masses, stiffness and modes of ``project`` without its switched-off elements; raises
        AnalysisError if it cannot stand."""
        with self._lock, one_blas_thread():
            return self._guarded(project.active_part())

    def _guarded(self, project: Project) -> Results:
        """:meth:`_analyse`; an unexpected failure part-way may leave the kept state half
        updated, so the session then forgets everything and the next call starts cold."""
        try:
            return self._analyse(project)
        except AnalysisError:
            raise  # raised before the kept state changes, or after it is consistent again
        except BaseException:
            self._forget()
            raise

    def analyse_keeping(self, project: Project) -> tuple[Results, list[KeptElement]]:
        """:meth:`analyse`, and what the session keeps of each element (for the what-if)."""
        project = project.active_part()
        with self._lock, one_blas_thread():
            results = self._guarded(project)
            return results, [self._kept[e.id] for e in project.elements]

    def _analyse(self, project: Project) -> Results:
        if self._last is not None and self._last[0] is project:
            return self._last[1]
        results = self._fresh(project)
        self._last = (project, results)
        return results

    def _fresh(self, project: Project) -> Results:
        if not project.levels:
            raise AnalysisError("the project has no levels: draw a floor outline first")
        check_layout(project, self._layout)
        old_levels = self._levels
        floors = self._floor_masses(project)
        moved = _moved_floors(old_levels, project.levels, self._floors_before, floors)
        if moved is not None and moved[-1] == 0:  # no floor moved: an element kept as it was is reused
            same = self._kept
            kept = [
                old
                if (old := same.get(e.id)) is not None and old.element is e
                else self._element(project, e, floors, moved)
                for e in project.elements
            ]
        else:
            kept = [self._element(project, e, floors, moved) for e in project.elements]
        K = self._stiffness(project, floors, kept)
        mass = np.array([v for f in floors for v in (f.mass, f.mass, f.inertia)])
        eigen = scaled_eigen(K, mass) if np.all(mass > 0.0) and np.all(np.isfinite(K)) else None
        check_stiffness(project, floors, K, eigen)
        M = assemble_mass(floors)
        modes = modal_analysis(K, M, floors, eigen)

        def storey_matrices(patterns: FloatArray) -> FloatArray:
            return self._storey_matrices(floors, kept, patterns)

        lateral = lateral_checks(project, floors, K, modes, storey_matrices, [e.matrix for e in kept])
        return Results(floors=floors, stiffness=frozen_array(K), mass=frozen_array(M), modes=modes, lateral=lateral)

    def _floor_masses(self, project: Project) -> tuple[FloorMass, ...]:
        """The floors, reusing those whose level and elevation are unchanged."""
        old_levels, old_floors = self._levels, self._floors
        self._floors_before = old_floors
        floors = []
        for index, (level, elevation) in enumerate(zip(project.levels, project.elevations, strict=True), start=1):
            i = index - 1
            if i < len(old_levels) and old_levels[i] == level and old_floors[i].elevation == elevation:
                floors.append(old_floors[i])
            else:
                floors.append(floor_mass(index, level, elevation))
        self._levels, self._floors = project.levels, tuple(floors)
        return self._floors

    def _element(
        self, project: Project, element: Element, floors: tuple[FloorMass, ...], moved: FloatArray | None
    ) -> KeptElement:
        """The kept entry of ``element``, made anew if the element or its floors changed.

        ``moved`` counts, cumulatively by floor, the floors whose centre or storey height changed
        since the last analysis (None: every floor may have changed)."""
        spanned = element_floors(element)
        old = self._kept.get(element.id)
        if (
            old is not None
            and moved is not None
            and (old.element is element or old.element == element)
            and moved[spanned.stop] == moved[spanned.start]
        ):
            return old
        heights = tuple(level.height for level in project.levels[element.bottom : element.top])
        centres = np.array([floors[f].centre for f in spanned], dtype=float)
        if (
            old is not None
            and (old.element is element or old.element == element)
            and old.heights == heights
            and np.array_equal(old.centres, centres)
        ):
            return old
        matrix = element_matrix(project, element)
        if old is not None and old.matrix is matrix and old.floors == spanned and np.array_equal(old.centres, centres):
            pattern, stiffness = old.pattern, old.storey_stiffness
        else:
            pattern = stiffness = None
        block = element_block(element, matrix, centres)
        return KeptElement(element, spanned, centres, heights, matrix, block, pattern, stiffness)

    def _stiffness(self, project: Project, floors: tuple[FloorMass, ...], kept: list[KeptElement]) -> FloatArray:
        """K from the kept blocks: updated by the changed ones, or rebuilt."""
        size = DOF_PER_FLOOR * len(floors)
        order = tuple(e.id for e in project.elements)
        changed = [entry for entry in kept if self._kept.get(entry.element.id) is not entry]
        removed = [self._kept[i] for i in self._kept.keys() - set(order)]
        rebuild = (
            self._K.shape != (size, size)
            or self._updates + len(changed) + len(removed) > REBUILD_EVERY
            or 2 * (len(changed) + len(removed)) > len(kept)
        )
        if rebuild:
            K = np.zeros((size, size))
            for entry in kept:
                dofs = dof_slice(entry.floors)
                K[dofs, dofs] += entry.block
            self._updates = 0
        else:
            K = self._K
            for old in removed + [self._kept[e.element.id] for e in changed if e.element.id in self._kept]:
                dofs = dof_slice(old.floors)
                K[dofs, dofs] -= old.block
            for entry in changed:
                dofs = dof_slice(entry.floors)
                K[dofs, dofs] += entry.block
            self._updates += len(changed) + len(removed)
        self._K = K
        # Kept until the storey matrices take them out (an analysis may stop before it gets there).
        self._replaced += removed + [self._kept[e.element.id] for e in changed if e.element.id in self._kept]
        self._kept = {entry.element.id: entry for entry in kept}
        return (K + K.T) / 2

    def _storey_matrices(
        self, floors: tuple[FloorMass, ...], kept: list[KeptElement], patterns: FloatArray
    ) -> FloatArray:
        """The storey matrices of definition (a) from the kept rows: updated by the elements that
        changed since the last analysis, or rebuilt in element order when the pattern changed."""
        same_pattern = self._patterns is not None and np.array_equal(self._patterns, patterns)
        if not same_pattern:
            self._patterns, self._stamp = patterns, self._stamp + 1
        centres = np.array([f.centre for f in floors], dtype=float).reshape(-1, 2)
        fresh = []
        for entry in kept:
            if entry.stamp != self._stamp:
                pattern = element_pattern(entry.element, patterns)
                if (
                    entry.pattern is None
                    or not np.array_equal(entry.pattern, pattern)
                    or entry.storey_stiffness is None
                ):
                    entry.pattern = pattern
                    entry.storey_stiffness = element_storey_stiffness(entry.matrix, pattern)
                spanned = _storey_slice(entry.element)
                entry.rows = element_storey_rows(entry.element, entry.storey_stiffness, centres[spanned])
                entry.stamp = self._stamp
                fresh.append(entry)
        total = self._storeys
        rebuild = (
            not same_pattern
            or total.shape != (len(floors), 3, 3)
            or self._storey_updates + len(fresh) + len(self._replaced) > REBUILD_EVERY
            or 2 * (len(fresh) + len(self._replaced)) > len(kept)
        )
        if rebuild:
            total = np.zeros((len(floors), 3, 3))
            for entry in kept:
                assert entry.rows is not None  # every entry was brought to this stamp above
                total[_storey_slice(entry.element)] += entry.rows
            self._storey_updates = 0
        else:
            for old in self._replaced:
                if old.rows is not None:
                    total[_storey_slice(old.element)] -= old.rows
            for entry in fresh:
                assert entry.rows is not None
                total[_storey_slice(entry.element)] += entry.rows
            self._storey_updates += len(fresh) + len(self._replaced)
        self._storeys, self._replaced = total, []
        return total.copy()


_CONTROLLER: ThreadpoolController | None = None


def one_blas_thread() -> Any:
    """A context that limits BLAS to one thread (the libraries are looked up once per process:
    each lookup reads the process's library list, a quarter of a millisecond)."""
    global _CONTROLLER
    if _CONTROLLER is None:
        _CONTROLLER = ThreadpoolController()
    return _CONTROLLER.limit(limits=1, user_api="blas")


def _moved_floors(
    old_levels: tuple[Level, ...],
    levels: tuple[Level, ...],
    old_floors: tuple[FloorMass, ...],
    floors: tuple[FloorMass, ...],
) -> FloatArray | None:
    """(N + 1,) running count of floors whose mass centre or storey height changed; None if the
    number of levels changed."""
    if len(old_floors) != len(floors) or len(old_levels) != len(levels):
        return None
    changed = [
        new is not old and (new.centre != old.centre or new_level.height != old_level.height)
        for new, old, new_level, old_level in zip(floors, old_floors, levels, old_levels, strict=True)
    ]
    return np.concatenate([[0], np.cumsum(changed)])


def _storey_slice(element: Element) -> slice:
    return slice(element.bottom, element.top)


def dof_slice(floors: range) -> slice:
    """The DOFs in K of contiguous floors."""
    return slice(DOF_PER_FLOOR * floors.start, DOF_PER_FLOOR * floors.stop)
