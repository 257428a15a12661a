"""A new element kind is one registration: a throw-away kind is analysed, saved and loaded."""

from __future__ import annotations

import json
import math

import pytest

from core.analysis import analyse
from core.errors import ModelError
from core.model import GRAVITY, Element, ElementKind, Level, Project, Spring, default_properties, registered_kinds
from core.model.fileio import dumps, loads
from core.model.kinds import resized, storey_inserted, storey_removed
from tests.builders import square
from tests.throwaway_kind import STRUT_KIND, StrutLine, strut_kind_registered

MASS = 50.0
"""t on the one floor of the test building."""


def _strut_building(stiffness: float) -> Project:
    """One storey, 10 m square: two strut lines along x on the edges y = 0 and y = 10 (symmetric),
    two springs along y on x = 0 and x = 10."""
    level = Level("L1", 3.0, square(10.0), seismic_weight=MASS * GRAVITY / 100.0)
    elements = (
        Element("Q1", (0.0, 0.0), (10.0, 0.0), 0, 1, StrutLine(stiffness)),
        Element("Q2", (0.0, 10.0), (10.0, 10.0), 0, 1, StrutLine(stiffness)),
        Element("S1", (0.0, 0.0), (0.0, 10.0), 0, 1, Spring((3.0e4,))),
        Element("S2", (10.0, 0.0), (10.0, 10.0), 0, 1, Spring((3.0e4,))),
    )
    return Project(name="strut test", levels=(level,), elements=elements)


def test_a_registered_kind_is_analysed_by_its_own_model() -> None:
    with strut_kind_registered():
        results = analyse(_strut_building(4.0e4))
    # A one-storey rigid floor on two parallel lines of stiffness k each is a single-degree-of-
    # freedom oscillator along x: T = 2π √(m / 2k) (closed form, any dynamics textbook).
    x_mode = max(results.modes, key=lambda m: m.shares[0])
    assert x_mode.period == pytest.approx(2 * math.pi * math.sqrt(MASS / 8.0e4), rel=1e-9)
    y_mode = max(results.modes, key=lambda m: m.shares[1])
    assert y_mode.period == pytest.approx(2 * math.pi * math.sqrt(MASS / 6.0e4), rel=1e-9)


def test_a_registered_kind_is_saved_and_loaded_unchanged() -> None:
    with strut_kind_registered():
        project = _strut_building(2.5e4)
        text = dumps(project)
        assert [e["kind"] for e in json.loads(text)["elements"]] == [STRUT_KIND, STRUT_KIND, "spring", "spring"]
        assert loads(text) == project
        assert project.next_element_id(STRUT_KIND) == "Q3"
        assert default_properties(STRUT_KIND) == StrutLine()
        assert STRUT_KIND in list(registered_kinds())
    with pytest.raises(ModelError, match="unknown element kind 'test_strut'"):
        loads(text)
    assert STRUT_KIND not in list(registered_kinds())


def test_a_kind_name_prefix_or_type_is_registered_once() -> None:
    with strut_kind_registered() as spec, pytest.raises(ValueError, match="registered already"):
        from core.elements import register_element_kind
        from tests.throwaway_kind import condense_strut

        register_element_kind(spec, condense_strut)


def test_built_in_kinds_keep_their_file_names_and_prefixes() -> None:
    project = Project(levels=(Level("L1", 3.0, square(10.0)),))
    assert [str(k) for k in registered_kinds()][:4] == ["braced_frame", "shear_wall", "moment_frame", "spring"]
    assert [project.next_element_id(k) for k in ElementKind] == ["B1", "W1", "M1", "S1"]


def test_per_storey_values_follow_a_span_change() -> None:
    spring = Spring((1.0, 2.0, 3.0))
    assert resized(spring, 5) == Spring((1.0, 2.0, 3.0, 3.0, 3.0))
    assert resized(spring, 2) == Spring((1.0, 2.0))
    assert storey_inserted(spring, 1) == Spring((1.0, 2.0, 2.0, 3.0))
    assert storey_inserted(spring, 7) == Spring((1.0, 2.0, 3.0, 3.0))
    assert storey_removed(spring, 0) == Spring((2.0, 3.0))
    assert default_properties(ElementKind.SPRING, storeys=3) == Spring((1.0e5,) * 3)
    wall = default_properties(ElementKind.SHEAR_WALL)
    assert resized(wall, 4) is wall
