"""The samples' results stay what they were when the baseline was saved (tests/fixtures/baseline/).

The baseline is the JSON of ``poise analyse --json`` taken before core was reorganised into stages;
a change that moves code must leave every number equal to 1e-9 relative (the engine's exactness
standard; a tighter tolerance fails on another numpy/BLAS build: mode participations of close modes
differ in the twelfth digit). A change that means to alter a result regenerates the baseline in the
same commit and says why.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from app.resources import sample_projects
from core.analysis import analyse
from core.model.fileio import load_project
from core.report.summary import results_to_dict
from tests.builders import numbers

BASELINE = Path(__file__).parent / "fixtures" / "baseline"
FORMAT_V1 = sorted((Path(__file__).parent / "fixtures" / "format_v1").glob("*.poise"))
"""The samples as format version 1 wrote them: older files must load with the same results."""


@pytest.mark.parametrize(
    "sample", [*sample_projects(), *FORMAT_V1], ids=lambda p: f"{p.parent.name}/{p.stem}"
)
def test_sample_results_equal_the_saved_baseline(sample: Path) -> None:
    project = load_project(sample)
    now = numbers(json.loads(json.dumps(results_to_dict(project, analyse(project)))))
    saved = numbers(json.loads((BASELINE / f"{sample.stem}.json").read_text()))
    assert now.keys() == saved.keys()
    for key, value in saved.items():
        assert math.isclose(now[key], value, rel_tol=1e-9, abs_tol=1e-12), key
