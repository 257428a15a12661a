"""Guidance: the what-if map equals full analyses (1e-9), the move derivatives equal central
differences of full analyses (1e-5), the suggestion finds the mirror of a missing frame's twin,
the target zone matches a full analysis of one storey, and switched-off elements analyse as
deleted ones."""

from __future__ import annotations

import dataclasses
import itertools
import math
from pathlib import Path

import numpy as np
import pytest

from benchmarks.buildings import generated_building
from core.analysis import analyse
from core.errors import AnalysisError
from core.guidance.gradients import move_gradients
from core.guidance.measures import LIMITS, Measure, results_value
from core.guidance.position_map import MapCancelledError, position_map, with_candidate
from core.guidance.robustness import compare, loss_ranking
from core.guidance.suggestion import Constraint, suggest
from core.guidance.target_zone import target_zones
from core.model import BracedFrame, Element, Level, Project
from core.model.edits import switch_elements
from core.model.fileio import dumps, load_project, loads

SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"
RESIDENTIAL = SAMPLES / "residential_8_storey_walls.poise"


def moved_to(project: Project, element_id: str, midpoint: tuple[float, float]) -> Project:
    element = project.element(element_id)
    dx, dy = midpoint[0] - element.midpoint[0], midpoint[1] - element.midpoint[1]
    shifted = dataclasses.replace(
        element,
        start=(element.start[0] + dx, element.start[1] + dy),
        end=(element.end[0] + dx, element.end[1] + dy),
    )
    return dataclasses.replace(project, elements=tuple(shifted if e.id == element_id else e for e in project.elements))


def symmetric_but_one(levels: int = 3) -> Project:
    """A 30 × 20 m plan braced symmetrically about both axes, but for the frame at x = 28 m."""
    outline = ((0.0, 0.0), (30.0, 0.0), (30.0, 20.0), (0.0, 20.0))
    storeys = tuple(Level(f"L{j + 1}", 3.5, outline) for j in range(levels))
    lines = {
        "X1": ((12.0, 0.0), (18.0, 0.0)),
        "X2": ((12.0, 20.0), (18.0, 20.0)),
        "Y1": ((2.0, 7.0), (2.0, 13.0)),
        "Y3": ((10.0, 7.0), (10.0, 13.0)),
        "Y4": ((20.0, 7.0), (20.0, 13.0)),
    }
    elements = tuple(Element(i, a, b, 0, levels, BracedFrame()) for i, (a, b) in lines.items())
    return Project(name="symmetric but one", levels=storeys, elements=elements)


@pytest.mark.parametrize("measure", list(Measure))
def test_map_at_random_points_equals_full_analyses(measure: Measure) -> None:
    project = load_project(RESIDENTIAL)
    element_id = "W3"
    grid = position_map(project, element_id, measure, steps=50)
    points, values = grid.points(), grid.values.ravel()
    rng = np.random.default_rng(5)
    standing = np.flatnonzero(np.isfinite(values))
    assert len(standing) > 100
    for p in rng.choice(standing, 20, replace=False):
        layout = moved_to(project, element_id, (float(points[p, 0]), float(points[p, 1])))
        expected = results_value(analyse(layout), measure)
        assert math.isclose(values[p], expected, rel_tol=1e-9, abs_tol=1e-12), (points[p], values[p], expected)
    outside = np.flatnonzero(~np.isfinite(values))
    assert len(outside) > 0
    with pytest.raises(AnalysisError):  # where the map is blank the moved layout cannot be analysed
        analyse(moved_to(project, element_id, (float(points[outside[0], 0]), float(points[outside[0], 1]))))
    assert math.isclose(grid.current, results_value(analyse(project), measure), rel_tol=1e-9)


def turned(project: Project, element_id: str) -> Project:
    """One element turned a little: every grid point has its own offset, so the map takes chunks."""
    e = project.element(element_id)
    skew = dataclasses.replace(e, end=(e.end[0] + 0.5, e.end[1]))
    return dataclasses.replace(project, elements=tuple(skew if x.id == element_id else x for x in project.elements))


def test_map_reports_progress_and_stops_when_asked() -> None:
    project = symmetric_but_one()
    reports: list[tuple[int, int]] = []
    position_map(turned(project, "Y3"), "Y3", steps=40, progress=lambda done, total: reports.append((done, total)))
    assert len(reports) > 1 and reports[-1] == (1600, 1600)
    assert all(a[0] < b[0] for a, b in itertools.pairwise(reports))
    asked = []
    with pytest.raises(MapCancelledError):
        position_map(turned(project, "Y3"), "Y3", steps=40, stop=lambda: asked.append(1) is None and len(asked) > 1)
    assert len(asked) == 2


def difference(project: Project, element_id: str, direction: np.ndarray, measure: Measure, h: float) -> float:
    """The central difference of full analyses, or where the element stands on an outline edge
    (one way leaves the floor) (−3f(0) + 4f(h) − f(2h)) / 2h toward the inside."""
    middle = np.asarray(project.element(element_id).midpoint)
    try:
        ahead = results_value(analyse(moved_to(project, element_id, tuple(middle + h * direction))), measure)
        behind = results_value(analyse(moved_to(project, element_id, tuple(middle - h * direction))), measure)
        return (ahead - behind) / (2 * h)
    except AnalysisError:
        pass
    for sense in (1.0, -1.0):
        try:
            f = [
                results_value(analyse(moved_to(project, element_id, tuple(middle + k * sense * h * direction))), measure)
                for k in (0, 1, 2)
            ]
        except AnalysisError:
            continue
        return sense * (-3 * f[0] + 4 * f[1] - f[2]) / (2 * h)
    raise AssertionError(f"{element_id} cannot move either way")


@pytest.mark.parametrize(
    "project, measure",
    [
        (load_project(RESIDENTIAL), Measure.ECCENTRICITY),
        (generated_building(3, 12, seed=4), Measure.TORSIONAL_SHARE),
    ],
    ids=["residential", "generated"],
)
def test_move_derivatives_equal_central_differences_of_full_analyses(project: Project, measure: Measure) -> None:
    gradients = move_gradients(project, measure)
    assert [g.benefit for g in gradients] == sorted((g.benefit for g in gradients), reverse=True)
    central = 0
    for g in gradients:
        normal, along = np.array(g.normal), np.array(g.along)
        for mine, which in ((g.torsion_ratio, Measure.TORSION_RATIO), (g.measure, measure)):
            expected = difference(project, g.element_id, normal, which, 1e-4)
            assert math.isclose(mine[0], expected, rel_tol=1e-5, abs_tol=1e-9), (g.element_id, which, mine, expected)
            sideways = difference(project, g.element_id, along, which, 1e-4)
            assert abs(mine[1] - sideways) <= 1e-9 and abs(sideways) <= 1e-8
        central += not g.one_sided
    assert central >= 2
    assert any(abs(g.torsion_ratio[0]) > 1e-3 for g in gradients)  # the test compares numbers that matter


def test_arrow_points_the_way_that_lowers_the_measure() -> None:
    project = symmetric_but_one()
    gradient = next(g for g in move_gradients(project) if g.element_id == "Y4")
    dx, dy = gradient.helps
    assert dx > 0 and abs(dy) < 1e-9  # Y4 should move toward the missing frame's side
    before = results_value(analyse(project), Measure.TORSION_RATIO)
    after = results_value(analyse(moved_to(project, "Y4", (20.5, 10.0))), Measure.TORSION_RATIO)
    assert after < before


def test_suggestion_for_a_missing_frame_is_the_mirror_of_its_twin() -> None:
    project = symmetric_but_one()
    twin = project.element("Y1")
    candidate = with_candidate(project, dataclasses.replace(twin, id="Y2"))
    suggestion = suggest(candidate, "Y2", Measure.TORSION_RATIO, steps=50)
    grid_step = 30.0 / 49
    assert abs(suggestion.map_point[0] - 28.0) <= grid_step
    middle = ((suggestion.start[0] + suggestion.end[0]) / 2, (suggestion.start[1] + suggestion.end[1]) / 2)
    assert math.dist(middle, (28.0, 10.0)) <= 1e-3, middle
    assert suggestion.value <= suggestion.map_point[2] + 1e-12
    assert suggestion.value < suggestion.current
    placed = analyse(dataclasses.replace(candidate, elements=tuple(
        suggestion.moved(e) if e.id == "Y2" else e for e in candidate.elements
    )))
    assert math.isclose(results_value(placed, Measure.TORSION_RATIO), suggestion.value, rel_tol=1e-9)


def test_suggestion_on_edges_and_grid_lines() -> None:
    project = symmetric_but_one()
    candidate = with_candidate(project, dataclasses.replace(project.element("Y1"), id="Y2"))
    on_edge = suggest(candidate, "Y2", constraint=Constraint.EDGES, steps=20)
    assert on_edge.start[0] == pytest.approx(30.0) and on_edge.end[0] == pytest.approx(30.0)
    on_grid = suggest(candidate, "Y2", constraint=Constraint.GRID, grid_spacing=4.0, steps=20)
    assert on_grid.start[0] == pytest.approx(28.0)
    with pytest.raises(AnalysisError, match="grid spacing"):
        suggest(candidate, "Y2", constraint=Constraint.GRID, steps=20)


def test_target_zone_of_one_storey_matches_a_full_analysis() -> None:
    """Shifting every element alike moves the centre of rigidity and nothing else of the storey
    (K_x, K_y and K_θ about the centre stay): with the centre at the zone's edge, a full analysis
    gives the limits exactly."""
    project = dataclasses.replace(symmetric_but_one(levels=1), elements=symmetric_but_one(1).elements[:4])
    results = analyse(project)
    zone = target_zones(project, results)[0]
    assert zone.rigidity_centre is not None and zone.eccentricity is not None
    assert zone.torsion[0] is not None and zone.torsion[1] is not None
    present = zone.rigidity_centre[0] - zone.mass_centre[0]
    assert not zone.torsion[0][0] <= present <= zone.torsion[0][1]  # this layout is outside the zone
    edges = [(offset, "torsion") for offset in zone.torsion[0]] + [(zone.eccentricity[0][0], "eccentricity")]
    for offset, check in edges:
        shift = offset - present
        elements = tuple(
            dataclasses.replace(e, start=(e.start[0] + shift, e.start[1]), end=(e.end[0] + shift, e.end[1]))
            for e in project.elements
        )
        storey = analyse(dataclasses.replace(project, elements=elements)).lateral.storeys[0]
        assert storey.rigidity_centre is not None
        assert storey.rigidity_centre[0] - storey.mass_centre[0] == pytest.approx(offset, abs=1e-9)
        if check == "torsion":
            assert storey.torsion_ratio[1] == pytest.approx(LIMITS[Measure.TORSION_RATIO].value, rel=1e-9)
        else:
            assert storey.eccentricity_ratio[0] == pytest.approx(0.30, rel=1e-9)
    rectangle = zone.rectangle(Measure.TORSION_RATIO)
    assert rectangle is not None and rectangle[0] < zone.mass_centre[0] < rectangle[2]


def test_switched_off_element_round_trips_and_analyses_as_deleted() -> None:
    project = load_project(RESIDENTIAL)
    off = switch_elements(project, ["W2"], False)
    again = loads(dumps(off))
    assert again == off and not again.element("W2").active and '"active": false' in dumps(off)
    older = dumps(project).replace('"version": 2', '"version": 1')
    assert loads(older) == project  # a version 1 file has every element active
    comparison = compare(off, "W2")
    deleted = analyse(dataclasses.replace(project, elements=tuple(e for e in project.elements if e.id != "W2")))
    without = comparison.without_element.results
    assert without is not None and comparison.with_element.results is not None
    assert without.periods == pytest.approx(deleted.periods, rel=1e-12)
    for a, b in zip(without.lateral.storeys, deleted.lateral.storeys, strict=True):
        assert a.torsion_ratio == pytest.approx(b.torsion_ratio, rel=1e-12)
        assert a.drift_ratio == pytest.approx(b.drift_ratio, rel=1e-12)
        assert a.rigidity_centre == pytest.approx(b.rigidity_centre, rel=1e-12)
    np.testing.assert_allclose([m.mass_ratio for m in without.modes], [m.mass_ratio for m in deleted.modes], atol=1e-12)
    assert comparison.with_element.results.periods == pytest.approx(analyse(project).periods, rel=1e-12)


def test_switched_off_element_outside_the_outline_does_not_stop_the_analysis() -> None:
    project = symmetric_but_one()
    stray = Element("Z1", (40.0, 0.0), (40.0, 6.0), 0, 3, BracedFrame(), active=False)
    results = analyse(dataclasses.replace(project, elements=(*project.elements, stray)))
    assert results.periods == pytest.approx(analyse(project).periods, rel=1e-12)
    with pytest.raises(AnalysisError, match="switched off"):
        position_map(dataclasses.replace(project, elements=(*project.elements, stray)), "Z1")


def test_loss_ranking_puts_the_most_needed_frames_first() -> None:
    project = with_candidate(symmetric_but_one(), Element("Y2", (28.0, 7.0), (28.0, 13.0), 0, 3, BracedFrame()))
    ranking = loss_ranking(project)
    assert {loss.element_id for loss in ranking} == {e.id for e in project.elements}
    assert ranking[0].element_id in {"X1", "X2"}  # one of only two frames along x: the x drift doubles
    torsion = {loss.element_id: loss.torsion_increase for loss in ranking}
    assert min(torsion["Y1"], torsion["Y2"]) > max(torsion["Y3"], torsion["Y4"])  # edge frames resist torsion most
    for loss in ranking:
        deleted = dataclasses.replace(project, elements=tuple(e for e in project.elements if e.id != loss.element_id))
        assert loss.torsion_ratio == pytest.approx(results_value(analyse(deleted), Measure.TORSION_RATIO), rel=1e-12)


def test_limit_contour_runs_where_the_map_crosses_the_limit() -> None:
    from core.guidance.contour import level_segments

    xs, ys = np.linspace(0.0, 10.0, 11), np.linspace(0.0, 5.0, 6)
    values = np.tile(xs / 10.0, (len(ys), 1))  # 0 … 1 from left to right
    values[0, :] = np.nan
    segments = level_segments(xs, ys, values, 0.35)
    assert len(segments) == 4  # the blank bottom row carries none
    for a, b in segments:
        assert a[0] == pytest.approx(3.5) and b[0] == pytest.approx(3.5)
        assert min(a[1], b[1]) >= 1.0


def test_a_switched_off_element_is_not_in_the_mode_drawings() -> None:
    from core.report.mode_frames import building_geometry

    project = symmetric_but_one()
    off = switch_elements(project, ["Y4"], False)
    floors = analyse(project).floors
    drawn = building_geometry(project, floors).plan_elements
    without = building_geometry(off, floors).plan_elements
    kind = project.element("Y4").kind
    assert len(without[kind]) == len(drawn[kind]) - 2 * 3  # its two ends on each of its three floors
