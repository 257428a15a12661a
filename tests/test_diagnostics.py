"""Stability diagnostics (core/solve/diagnostics.py): each finding from a purpose-built unstable model,
with its message asserted; analyse() stops cleanly with AnalysisError, never a numpy error."""

from __future__ import annotations

import numpy as np
import pytest

from core.analysis import analyse
from core.errors import AnalysisError
from core.model import Element, Level, Project, ShearWall, Spring
from core.solve.assembly import assemble_stiffness, floor_masses
from core.solve.diagnostics import check_stiffness
from tests.builders import rectangle

WALL = ShearWall()


def building(elements: tuple[Element, ...], storeys: int = 1) -> Project:
    levels = tuple(Level(f"L{j + 1}", 3.0, rectangle(20.0, 10.0)) for j in range(storeys))
    return Project(levels=levels, elements=elements)


def stable_walls(storeys: int = 1, bottom: int = 0) -> tuple[Element, ...]:
    return (
        Element("W1", (0.0, 2.0), (0.0, 8.0), bottom, storeys, WALL),
        Element("W2", (20.0, 2.0), (20.0, 8.0), bottom, storeys, WALL),
        Element("W3", (6.0, 0.0), (14.0, 0.0), bottom, storeys, WALL),
    )


def analysis_error(project: Project) -> AnalysisError:
    with pytest.raises(AnalysisError) as caught:
        analyse(project)
    return caught.value


def test_a_stable_layout_passes():
    assert analyse(building(stable_walls())).lateral.storeys


def test_zero_length_element():
    walls = (*stable_walls(), Element("W9", (5.0, 5.0), (5.0, 5.0), 0, 1, WALL))
    error = analysis_error(building(walls))
    assert error.message.startswith("element W9 at (5.00, 5.00) has zero length")
    assert error.elements == ("W9",)
    assert error.levels == (1,)


def test_element_outside_the_outline():
    walls = (*stable_walls(), Element("W9", (18.0, 5.0), (26.0, 5.0), 0, 1, WALL))
    error = analysis_error(building(walls))
    assert error.message.startswith("element W9 leaves the outline of level 'L1'")
    assert "must stand within every floor it connects" in error.message
    assert error.elements == ("W9",) and error.levels == (1,)


def test_an_element_on_the_outline_edge_is_inside():
    # W1 and W2 lie on the short edges, W3 on the long edge: on the boundary is within the floor.
    results = analyse(building(stable_walls()))
    assert [d.element for d in results.lateral.elements] == ["W1", "W2", "W3"]
    # A millimetre further out, the same wall leaves the outline and is named.
    shifted = (*stable_walls()[:2], Element("W3", (6.0, -0.001), (14.0, -0.001), 0, 1, WALL))
    error = analysis_error(building(shifted))
    assert error.message.startswith("element W3 leaves the outline of level 'L1'")
    assert error.elements == ("W3",)


def test_storey_without_elements():
    # Every element starts on level 1, so nothing holds storey 1.
    error = analysis_error(building(stable_walls(storeys=2, bottom=1), storeys=2))
    assert error.message.startswith(
        "storey 1 (below level 'L1') has no lateral elements: level 'L1' and every level above it "
        "can slide and turn freely"
    )
    assert error.levels == (1, 2)
    assert error.elements == ()


def test_all_elements_parallel():
    walls = (
        Element("W1", (2.0, 0.0), (8.0, 0.0), 0, 1, WALL),
        Element("W2", (12.0, 10.0), (18.0, 10.0), 0, 1, WALL),
    )
    error = analysis_error(building(walls))
    assert error.message == (
        "every element of storey 1 (below level 'L1') runs along x (W1, W2): nothing resists movement "
        "along y, so level 'L1' can slide along y. Add an element across them."
    )
    assert error.elements == ("W1", "W2")


def test_all_elements_on_one_line_also_turn():
    walls = (
        Element("W1", (2.0, 5.0), (8.0, 5.0), 0, 2, WALL),
        Element("W2", (12.0, 5.0), (18.0, 5.0), 0, 2, WALL),
    )
    error = analysis_error(building(walls, storeys=2))
    assert "runs along x (W1, W2)" in error.message
    assert "level 'L1' and every level above it can slide along y and, since they lie on one line, turn" in (
        error.message
    )
    assert error.levels == (1, 2)


def test_element_lines_meeting_in_one_point():
    # Two lines along the plan's diagonals and one through their crossing: all meet at (10, 5).
    walls = (
        Element("W1", (2.0, 1.0), (6.0, 3.0), 0, 1, WALL),
        Element("W2", (14.0, 3.0), (18.0, 1.0), 0, 1, WALL),
        Element("W3", (10.0, 6.0), (10.0, 9.0), 0, 1, WALL),
    )
    error = analysis_error(building(walls))
    assert error.message == (
        "the lines of every element of storey 1 (below level 'L1') (W1, W2, W3) pass through one point, "
        "(10.00, 5.00): nothing resists turning about it, so level 'L1' can rotate freely. "
        "Move an element so its line misses that point."
    )
    assert error.elements == ("W1", "W2", "W3")


def test_upper_storey_mechanism_names_its_storey():
    # Storey 2 keeps only the two y-walls (parallel); storey 1 is stable.
    walls = (
        Element("W1", (0.0, 2.0), (0.0, 8.0), 0, 2, WALL),
        Element("W2", (20.0, 2.0), (20.0, 8.0), 0, 2, WALL),
        Element("W3", (6.0, 0.0), (14.0, 0.0), 0, 1, WALL),
    )
    error = analysis_error(building(walls, storeys=2))
    assert error.message.startswith("every element of storey 2 (below level 'L2') runs along y (W1, W2)")
    assert "level 'L2' can slide along x" in error.message
    assert error.levels == (2,)


def test_ill_conditioned_stiffness_names_the_motion():
    # Geometrically stable, but the only y line is a spring of 1e-4 kN/m beside walls of ~1e6 kN/m:
    # the y period would be thousands of seconds.
    elements = (
        Element("W1", (2.0, 0.0), (8.0, 0.0), 0, 1, WALL),
        Element("W2", (12.0, 10.0), (18.0, 10.0), 0, 1, WALL),
        Element("S1", (10.0, 2.0), (10.0, 8.0), 0, 1, Spring((1.0e-4,))),
    )
    error = analysis_error(building(elements))
    assert error.message.startswith("the building is almost unrestrained (its longest period would be")
    assert "level 'L1' slides along y" in error.message
    assert error.message.endswith("Only S1 resists it, and barely. Add or stiffen elements there.")
    assert error.levels == (1,) and error.elements == ("S1",)


def test_singular_stiffness_says_which_level_turns():
    # A K with its torsional stiffness removed (as a broken element matrix would leave it).
    project = building(stable_walls(storeys=2), storeys=2)
    floors = floor_masses(project)
    K = assemble_stiffness(project, floors).copy()
    K[5, :] = K[:, 5] = 0.0
    K[5, 5] = 0.0
    with pytest.raises(AnalysisError) as caught:
        check_stiffness(project, floors, K)
    message = caught.value.message
    assert message.startswith(
        "the building can move without any resistance: level 'L2' turns about (10.00, 5.00)."
    )
    assert caught.value.levels == (2,)
    assert message.endswith(
        "It strains W1, W2, W3, yet they give it no stiffness: check their properties. "
        "Add or stiffen elements there."
    )


def test_non_finite_stiffness():
    project = building(stable_walls())
    floors = floor_masses(project)
    K = assemble_stiffness(project, floors).copy()
    K[0, 0] = np.nan
    with pytest.raises(AnalysisError, match="non-finite"):
        check_stiffness(project, floors, K)
