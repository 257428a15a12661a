"""Continuous lines: a wall built in stacked pieces is one cantilever, not two with a fixed base.

Source of the reference periods: OpenSeesPy 3D (tests/reference/opensees_building.py: real
Timoshenko wall members storey by storey, each with its own thickness, rigid diaphragms, lumped
floor masses, ``eigen -fullGenLapack``), an independent general finite-element library, checked
with openseespy 3.7.1.2.

The two situations measured when the problem was found (on another building: a wall split at
level 3, 0.418 s against 0.496 s for the continuous wall; a wall stepping from 0.35 m to 0.20 m,
0.414 s against 0.466 s) are rebuilt here on an invented 8-storey block, and measured again: left
as two elements, the x period is about 40 % short of the continuous one (the upper piece's fixed
base at level 3 carries its moment), while the joined element equals the one-piece element to
1e-9 and OpenSees to 1e-6.
"""

from __future__ import annotations

from dataclasses import replace
from importlib.metadata import version

import numpy as np
import pytest

from core.analysis import analyse
from core.lateral.records import Check
from core.model import Element, Level, Project, ShearWall, Spring
from core.model.continuity import join_stacked, transfers
from core.model.properties import WallStorey
from tests.reference.opensees_building import opensees_modes

PLATE = ((0.0, 0.0), (24.0, 0.0), (24.0, 16.0), (0.0, 16.0))
LEVELS = tuple(Level(f"L{j}", 4.0 if j == 1 else 3.1, PLATE, seismic_weight=8.0) for j in range(1, 9))
SPLIT = 3
"""The pieces meet at level 3."""


def block(walls_x: tuple[Element, ...]) -> Project:
    """8 storeys on a 24 m × 16 m plate: the given walls along x, two uniform walls along y."""
    y_walls = (
        Element("WY1", (0.0, 5.0), (0.0, 11.0), 0, 8, ShearWall(thickness=0.25)),
        Element("WY2", (24.0, 5.0), (24.0, 11.0), 0, 8, ShearWall(thickness=0.25)),
    )
    return Project(name="stacked walls", levels=LEVELS, elements=(*walls_x, *y_walls))


def one_piece(wall: ShearWall) -> tuple[Element, ...]:
    return (
        Element("W1", (2.0, 0.0), (8.0, 0.0), 0, 8, wall),
        Element("W2", (16.0, 16.0), (22.0, 16.0), 0, 8, wall),
    )


def two_pieces(lower: ShearWall, upper: ShearWall) -> tuple[Element, ...]:
    """The same walls drawn as a lower and an upper piece each (one of them end to start)."""
    return (
        Element("W1", (2.0, 0.0), (8.0, 0.0), 0, SPLIT, lower),
        Element("W3", (8.0, 0.0), (2.0, 0.0), SPLIT, 8, upper),
        Element("W2", (16.0, 16.0), (22.0, 16.0), 0, SPLIT, lower),
        Element("W4", (16.0, 16.0), (22.0, 16.0), SPLIT, 8, upper),
    )


def periods(project: Project, count: int = 6) -> np.ndarray:
    return np.array([m.period for m in analyse(project).modes[:count]])


def x_period(project: Project) -> float:
    """The period of the mode with the largest effective mass along x (the walls' direction)."""
    return max(analyse(project).modes, key=lambda m: m.mass_ratio[0]).period


STEPPED = ShearWall(storeys=(*(WallStorey(0.35),) * SPLIT, *(WallStorey(0.20),) * (8 - SPLIT)))
CASES = {
    "uniform wall split at level 3": (ShearWall(thickness=0.25), ShearWall(thickness=0.25), ShearWall(thickness=0.25)),
    "0.35 m stepping to 0.20 m at level 3": (STEPPED, ShearWall(thickness=0.35), ShearWall(thickness=0.20)),
}


@pytest.mark.parametrize("case", CASES)
def test_stacked_pieces_joined_equal_one_element_and_opensees(case: str) -> None:
    whole, lower, upper = CASES[case]
    single = block(one_piece(whole))
    stacked = block(two_pieces(lower, upper))
    joined, absorbed = join_stacked(stacked)
    assert absorbed == {"W3": "W1", "W4": "W2"}
    np.testing.assert_allclose(periods(joined), periods(single), rtol=1e-9)
    reference = opensees_modes(single, 6).periods
    np.testing.assert_allclose(periods(joined), reference, rtol=1e-6, err_msg=f"OpenSeesPy {version('openseespy')}")


@pytest.mark.parametrize("case", CASES)
def test_the_pieces_left_apart_are_too_stiff_and_say_so(case: str) -> None:
    """Measured on this block, the period of the x mode: 1.121 s continuous against 0.622 s split
    (−45 %) for the uniform wall, 1.000 s against 0.612 s (−39 %) for the stepped one."""
    whole, lower, upper = CASES[case]
    apart = block(two_pieces(lower, upper))
    continuous = x_period(block(one_piece(whole)))
    split = x_period(apart)
    assert split < 0.95 * continuous, "a fixed base at the split makes the line stiffer"
    warnings = [v for v in analyse(apart).lateral.verdicts if v.name is Check.CONTINUITY]
    assert [v.note for v in warnings] == [
        "W3 is stacked on W1 as a separate element, analysed with its base fixed on L3 (too stiff): "
        "join them into one element.",
        "W4 is stacked on W2 as a separate element, analysed with its base fixed on L3 (too stiff): "
        "join them into one element.",
    ]


def test_a_wall_with_nothing_beneath_is_a_named_transfer() -> None:
    """A wall from level 5 to the roof standing on nothing: analysed with its base fixed on L5
    (the documented model) and warned about with its id and level, in the checks."""
    project = block((*one_piece(ShearWall()), Element("W9", (10.0, 8.0), (14.0, 8.0), 5, 8, ShearWall())))
    found = transfers(project)
    assert [(t.element, t.level, t.level_name, t.beneath) for t in found] == [("W9", 5, "L5", ())]
    results = analyse(project)
    (verdict,) = [v for v in results.lateral.verdicts if v.name is Check.CONTINUITY]
    assert verdict.note == "W9 starts on L5 with nothing beneath it: a transfer, analysed with its base fixed on L5."
    assert verdict.value == 0.0 and verdict.status == "warn"
    assert verdict.clause.startswith("EN 1998-1 §4.2.3.3")


def test_what_stands_on_a_shorter_or_other_element_is_named_with_it() -> None:
    below = Element("W5", (10.0, 8.0), (13.0, 8.0), 0, 4, ShearWall())
    spring = Element("S1", (12.0, 8.0), (14.0, 8.0), 0, 4, Spring((1e5,) * 4))
    upper = Element("W9", (10.0, 8.0), (14.0, 8.0), 4, 8, ShearWall())
    project = block((*one_piece(ShearWall()), below, spring, upper))
    assert join_stacked(project)[1] == {}, "a different length of line is not the same line"
    (found,) = transfers(project)
    assert found.beneath == ("W5", "S1")
    (verdict,) = [v for v in analyse(project).lateral.verdicts if v.name is Check.CONTINUITY]
    assert verdict.value == pytest.approx(1.0), "all of its length stands on something"
    assert "only W5, S1 beneath it" in verdict.note


def test_joining_keeps_what_is_not_per_storey_and_refuses_what_differs() -> None:
    lower = Element("W1", (2.0, 0.0), (8.0, 0.0), 0, 3, ShearWall(thickness=0.3))
    upper = Element("W3", (2.02, 0.01), (8.0, 0.0), 3, 8, ShearWall(thickness=0.3))
    joined, _ = join_stacked(block((lower, upper)))
    wall = joined.element("W1")
    assert (wall.bottom, wall.top, wall.properties) == (0, 8, ShearWall(thickness=0.3)), "same for all stays"
    other = replace(upper, properties=ShearWall(thickness=0.3, modulus=3.0e7))
    project = block((lower, other))
    assert join_stacked(project)[1] == {}
    (found,) = transfers(project)
    assert (found.stacked_on, found.joinable) == ("W1", False)
    assert "they differ in more than their sections" in found.message
    far = replace(upper, start=(2.2, 0.0))
    assert join_stacked(block((lower, far)))[1] == {}, "ends 0.2 m apart are another line"


def test_a_stack_of_three_springs_becomes_one_chain() -> None:
    pieces = (
        Element("S1", (12.0, 4.0), (12.0, 12.0), 0, 2, Spring((3e5, 2e5))),
        Element("S2", (12.0, 4.0), (12.0, 12.0), 2, 5, Spring((2e5, 2e5, 1e5))),
        Element("S3", (12.0, 12.0), (12.0, 4.0), 5, 8, Spring((1e5, 1e5, 5e4))),
    )
    joined, absorbed = join_stacked(block((*one_piece(ShearWall()), *pieces)))
    assert absorbed == {"S2": "S1", "S3": "S1"}
    assert joined.element("S1").properties.storey_stiffness == (3e5, 2e5, 2e5, 2e5, 1e5, 1e5, 1e5, 5e4)
    assert transfers(joined) == ()


def test_a_switched_off_piece_is_not_joined_to_a_switched_on_one() -> None:
    lower = Element("W1", (2.0, 0.0), (8.0, 0.0), 0, 3, ShearWall())
    upper = Element("W3", (2.0, 0.0), (8.0, 0.0), 3, 8, ShearWall(), active=False)
    assert join_stacked(block((lower, upper)))[1] == {}
