"""The position what-if equals full analyses of the moved layouts (1e-9 relative)."""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from benchmarks.buildings import generated_building
from core.engine import AnalysisSession
from core.engine.whatif import element_positions
from core.errors import AnalysisError
from core.model import LoadMethod, Project, RuleSet, SystemType

TOLERANCE = 1e-9


def moved(project: Project, index: int, midpoint: tuple[float, float]) -> Project:
    element = project.elements[index]
    dx, dy = midpoint[0] - element.midpoint[0], midpoint[1] - element.midpoint[1]
    elements = list(project.elements)
    elements[index] = dataclasses.replace(
        element,
        start=(element.start[0] + dx, element.start[1] + dy),
        end=(element.end[0] + dx, element.end[1] + dy),
    )
    return dataclasses.replace(project, elements=tuple(elements))


def close(a: float, b: float) -> bool:
    return (math.isinf(a) and a == b) or math.isclose(a, b, rel_tol=TOLERANCE, abs_tol=TOLERANCE)


@pytest.mark.parametrize(
    "method, system",
    [
        (LoadMethod.EN1998, SystemType.OTHER),
        (LoadMethod.ASCE7, SystemType.OTHER),  # the period is capped at C_u·T_a: one pattern
        (LoadMethod.ASCE7, SystemType.STEEL_MOMENT),  # k of §12.8.3 follows each position's period
    ],
    ids=["en1998", "asce7-capped", "asce7-k-varies"],
)
@pytest.mark.parametrize("size", [(3, 12), (5, 20)])
def test_positions_equal_full_analyses(method: LoadMethod, system: SystemType, size: tuple[int, int]) -> None:
    project = generated_building(*size, seed=4)
    rule_set = RuleSet.EN1998 if method is LoadMethod.EN1998 else RuleSet.ASCE7
    project = dataclasses.replace(
        project,
        settings=dataclasses.replace(project.settings, load_method=method, rule_set=rule_set, system_type=system),
    )
    rng = np.random.default_rng(11)
    index = 1
    # Random points, a few outside the outline, and two on one line along the element (same offset).
    points = np.column_stack([rng.uniform(-2.0, 50.0, 14), rng.uniform(-2.0, 34.0, 14)])
    points = np.vstack([points, points[:1] + np.array(project.elements[index].direction) * 0.7])
    figures = element_positions(project, project.elements[index].id, points, AnalysisSession())
    checked = 0
    for p, point in enumerate(points):
        layout = moved(project, index, (float(point[0]), float(point[1])))
        try:
            results = AnalysisSession().analyse(layout)
        except AnalysisError:
            assert not figures.stands[p]
            assert np.all(np.isnan(figures.periods[p]))
            continue
        assert figures.stands[p]
        checked += 1
        np.testing.assert_allclose(figures.periods[p], results.periods, rtol=TOLERANCE)
        shares = [m.shares[2] for m in results.modes]
        np.testing.assert_allclose(figures.rotation_share[p], shares, rtol=0, atol=TOLERANCE)
        for a, d in enumerate(("x", "y")):
            assert close(float(figures.torsion_ratio[p, a]), results.lateral.worst_torsion_ratio(d)), (p, d)
        for j, storey in enumerate(results.lateral.storeys):
            for a in range(2):
                assert close(float(figures.eccentricity_ratio[p, j, a]), storey.eccentricity_ratio[a]), (p, j, a)
    assert checked >= 8
    assert not figures.stands.all()  # the points outside the outline are marked
