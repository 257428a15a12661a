"""Bounds at the door: every number meets its row of core/model/bounds.py, text must encode, and
DEVELOPERS.md shows the same table."""

from __future__ import annotations

import dataclasses
import re
from pathlib import Path

import pytest

from core.errors import ModelError, printable
from core.model import BracedFrame, Element, Level, PointMass, Project, Settings, ShearWall
from core.model.bounds import BOUNDS, OutOfRangeError, within
from tests.builders import square


@pytest.mark.parametrize("name", sorted(BOUNDS))
def test_each_row_refuses_just_outside_and_accepts_its_ends(name):
    bound = BOUNDS[name]
    within(bound.low, name, "x")
    within(bound.high, name, "x")
    for bad in (bound.high * 1.001 + 1e-12, -abs(bound.high) * 2 - 1, float("nan"), float("inf"), 10**400):
        with pytest.raises(OutOfRangeError) as caught:
            within(bad, name, "a.b")
        assert caught.value.path == "a.b" and bound.describe() in caught.value.message


def test_the_table_in_developers_md_is_the_table_in_code():
    text = (Path(__file__).resolve().parent.parent / "DEVELOPERS.md").read_text(encoding="utf-8")
    rows = dict(re.findall(r"^\| `(\w+)` \| [^|]+ \| ([^|]+) \|$", text, flags=re.M))
    assert rows == {name: bound.describe() for name, bound in BOUNDS.items()}


@pytest.mark.parametrize(
    "build, path",
    [
        (lambda: Level("L", 1e308, square(10)), "height"),
        (lambda: Level("L", 3.0, ((0, 0), (1.7e308, 0), (1.7e308, 1.7e308))), "outline[1]"),
        (lambda: Level("L", 3.0, square(10), seismic_weight=1e-306), "seismic_weight"),
        (lambda: PointMass(10.0, (1e308, 0.0)), "position"),
        (lambda: dataclasses.replace(Settings().asce7, response_modification=5e-324), "response_modification"),
        (lambda: ShearWall(stiffness_factor=5e-324), "stiffness_factor"),
        (lambda: BracedFrame(modulus=1e300), "modulus"),
        (lambda: Project(name="A\ud800"), "name"),
        (lambda: Element("B\udfff", (0, 0), (1, 0), 0, 1), "id"),
        (lambda: Level("x" * 10_001, 3.0, square(10)), "name"),
    ],
)
def test_absurd_values_are_refused_with_their_field(build, path):
    with pytest.raises(ModelError) as caught:
        build()
    assert caught.value.path == path


def test_messages_quoting_bad_text_stay_printable_on_one_line():
    error = ModelError('levels[0]."a\ud800\nb"', "unknown field")
    assert str(error) == printable(str(error))
    str(error).encode("utf-8")
    assert "\n" not in str(error)
