"""The analysis session equals a cold analysis over random edit sequences.

Each example builds a small generated building, then applies a random sequence of edits (move,
stretch, property change, add, delete, storey height change) and, after each edit, analyses the
state both with one long-lived session and with a fresh one. Every number the results hold —
the JSON summary, K, M, every element's shears and shares — must agree to 1e-9 (relative, or
absolute for values near zero against the scale of their group), and a layout that cannot stand
must fail with the same message in both."""

from __future__ import annotations

import dataclasses
import math

import numpy as np
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from benchmarks.buildings import DEPTH, WIDTH, generated_building
from core.analysis import analyse
from core.engine import AnalysisSession
from core.errors import AnalysisError
from core.model import BracedFrame, Element, Project, ShearWall
from core.report.summary import results_to_dict
from core.results import Results
from tests.builders import numbers

TOLERANCE = 1e-9


def outcome(session: AnalysisSession, project: Project) -> Results | str:
    try:
        return session.analyse(project)
    except AnalysisError as error:
        return str(error)


def assert_same(project: Project, warm: Results | str, cold: Results | str) -> None:
    assert type(warm) is type(cold)
    if isinstance(cold, str):
        assert warm == cold
        return
    assert isinstance(warm, Results)
    a = numbers(results_to_dict(project, warm))
    b = numbers(results_to_dict(project, cold))
    assert a.keys() == b.keys()
    for key, value in b.items():
        if math.isnan(value):
            assert math.isnan(a[key]), key
        else:
            assert math.isclose(a[key], value, rel_tol=TOLERANCE, abs_tol=TOLERANCE), (key, a[key], value)
    scale = np.abs(cold.stiffness).max()
    np.testing.assert_allclose(warm.stiffness, cold.stiffness, rtol=0, atol=TOLERANCE * scale)
    np.testing.assert_array_equal(warm.mass, cold.mass)
    for w, c in zip(warm.lateral.elements, cold.lateral.elements, strict=True):
        assert w.element == c.element
        size = max(np.abs(c.shears).max(initial=0.0), 1.0)
        np.testing.assert_allclose(w.shears, c.shears, rtol=0, atol=TOLERANCE * size)
        # Shares reach hundreds where a near-mechanism makes two close lines fight a torsion, so the
        # tolerance follows their size as it does for the shears.
        share_size = max(np.abs(c.shares).max(initial=0.0), 1.0)
        np.testing.assert_allclose(w.shares, c.shares, rtol=0, atol=TOLERANCE * share_size)
        np.testing.assert_allclose(w.brace_force_envelope, c.brace_force_envelope, rtol=0, atol=TOLERANCE * size)


def replace_element(project: Project, index: int, element: Element) -> Project:
    elements = list(project.elements)
    elements[index] = element
    return dataclasses.replace(project, elements=tuple(elements))


def clamp(point: tuple[float, float]) -> tuple[float, float]:
    return (min(max(point[0], 0.2), WIDTH - 0.2), min(max(point[1], 0.2), DEPTH - 0.2))


def moved_by(element: Element, dx: float, dy: float) -> Element:
    """``element`` moved by (dx, dy), each end kept inside the plan."""
    return dataclasses.replace(
        element,
        start=clamp((element.start[0] + dx, element.start[1] + dy)),
        end=clamp((element.end[0] + dx, element.end[1] + dy)),
    )


@st.composite
def edit(draw: st.DrawFn, project: Project) -> Project:
    kind = draw(st.sampled_from(["move", "stretch", "property", "add", "delete", "height"]))
    count = len(project.elements)
    index = draw(st.integers(0, max(count - 1, 0)))
    dx = draw(st.floats(-3.0, 3.0))
    dy = draw(st.floats(-3.0, 3.0))
    if kind == "add" or count == 0:
        start = clamp((draw(st.floats(1.0, WIDTH - 1.0)), draw(st.floats(1.0, DEPTH - 1.0))))
        end = clamp((start[0] + dx + 0.5, start[1] + dy))
        top = draw(st.integers(1, len(project.levels)))
        new = Element(f"N{count + 1}_{draw(st.integers(0, 10**6))}", start, end, 0, top, BracedFrame())
        if any(e.id == new.id for e in project.elements):
            return project
        return dataclasses.replace(project, elements=(*project.elements, new))
    element = project.elements[index]
    if kind == "move":
        return replace_element(project, index, moved_by(element, dx, dy))
    if kind == "stretch":
        return replace_element(
            project, index, dataclasses.replace(element, end=clamp((element.end[0] + dx, element.end[1] + dy)))
        )
    if kind == "property":
        properties = ShearWall(thickness=draw(st.floats(0.15, 0.4))) if draw(st.booleans()) else BracedFrame()
        return replace_element(project, index, dataclasses.replace(element, properties=properties))
    if kind == "delete":
        return dataclasses.replace(project, elements=project.elements[:index] + project.elements[index + 1 :])
    level = draw(st.integers(0, len(project.levels) - 1))
    levels = list(project.levels)
    levels[level] = dataclasses.replace(levels[level], height=draw(st.floats(2.5, 5.0)))
    return dataclasses.replace(project, levels=tuple(levels))


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(st.data(), st.sampled_from([(1, 6), (3, 12), (5, 20)]))
def test_session_equals_cold_analysis_over_random_edits(data: st.DataObject, size: tuple[int, int]) -> None:
    project = generated_building(*size, seed=data.draw(st.integers(0, 50)))
    session = AnalysisSession()
    for _ in range(data.draw(st.integers(1, 8))):
        project = data.draw(edit(project))
        assert_same(project, outcome(session, project), outcome(AnalysisSession(), project))


def test_unrelated_projects_in_one_session_equal_cold_analyses() -> None:
    session = AnalysisSession()
    for levels, elements, seed in [(5, 20, 1), (3, 12, 2), (5, 20, 1), (5, 20, 3)]:
        project = generated_building(levels, elements, seed)
        assert_same(project, outcome(session, project), outcome(AnalysisSession(), project))


def test_many_moves_stay_exact_across_rebuilds() -> None:
    """More moves than the session's rebuild interval: the incremental K never drifts."""
    project = generated_building(5, 20)
    session = AnalysisSession()
    rng = np.random.default_rng(3)
    for step in range(150):
        index = step % len(project.elements)
        element = project.elements[index]
        dx, dy = rng.uniform(-0.5, 0.5, 2)
        project = replace_element(project, index, moved_by(element, float(dx), float(dy)))
        warm = outcome(session, project)
    assert_same(project, warm, outcome(AnalysisSession(), project))


def test_analyse_uses_one_session_and_gives_equal_results() -> None:
    """The module-level entry point, called on related and then unrelated projects."""
    first = generated_building(3, 12)
    moved = replace_element(
        first, 0, dataclasses.replace(first.elements[0], start=(2.0, 2.0), end=(6.0, 2.0))
    )
    for project in (first, moved, generated_building(5, 20, seed=9), first):
        assert_same(project, analyse(project), outcome(AnalysisSession(), project))


def test_a_failure_part_way_leaves_the_next_analysis_exact(monkeypatch) -> None:
    """An unexpected error half-way through updating the storey matrices (the moved element's old
    rows taken out, its new ones not yet in) makes the session forget what it kept, so the next
    state is analysed as from cold."""
    import core.engine.session as session_module

    project = generated_building(3, 12)
    session = AnalysisSession()
    session.analyse(project)
    moved = replace_element(project, 0, dataclasses.replace(project.elements[0], start=(2.0, 2.0), end=(6.0, 2.0)))
    real = session_module._storey_slice
    calls = []

    def failing_on_the_third_call(element):
        calls.append(element.id)
        if len(calls) == 3:  # 1: the fresh rows, 2: the old rows out, 3: the new rows in
            raise FloatingPointError("injected")
        return real(element)

    monkeypatch.setattr(session_module, "_storey_slice", failing_on_the_third_call)
    try:
        session.analyse(moved)
    except FloatingPointError:
        pass
    monkeypatch.setattr(session_module, "_storey_slice", real)
    assert len(calls) == 3
    again = replace_element(moved, 1, dataclasses.replace(moved.elements[1], properties=ShearWall(thickness=0.3)))
    assert_same(again, outcome(session, again), outcome(AnalysisSession(), again))
