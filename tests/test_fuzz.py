"""Fuzzing the loader and the analysis: a bounded hypothesis run in every test run, and a saved
corpus of minimal reproducers, each of which must give a named error (and exit 2 with one line on
the command line), or, for files that once carried NaN into the results, finite results.
tools/fuzz_files.py runs the same engine over 100,000+ files by hand."""

from __future__ import annotations

import json
import subprocess
import sys
import warnings
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from app.cli import main
from core.analysis import analyse
from core.errors import AnalysisError, ModelError
from core.model.fileio import load_bytes
from tests.fuzzing import mutated_bytes, non_finite_floats, outcome, seeds

CORPUS = Path(__file__).resolve().parent / "fixtures" / "fuzz_corpus"
EXPECTED = json.loads((CORPUS / "expected.json").read_text(encoding="utf-8"))
BASE = seeds()


@pytest.mark.parametrize("name", sorted(EXPECTED))
def test_every_reproducer_gives_a_named_error(name):
    expected = EXPECTED[name]
    data = (CORPUS / name).read_bytes()
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        if expected["kind"] == "refused":
            with pytest.raises(ModelError) as refused:
                load_bytes(data)
            assert refused.value.path == expected["path"]
            assert expected["contains"] in refused.value.message
        elif expected["kind"] == "cannot stand":
            with pytest.raises(AnalysisError) as failed:
                analyse(load_bytes(data))
            assert expected["contains"] in failed.value.message and failed.value.elements
        else:  # once gave NaN in its results: now a ratio that does not apply is None
            results = analyse(load_bytes(data))
            assert non_finite_floats(results) == []
            assert any(None in s.storey_stiffness for s in results.lateral.storeys)


@pytest.mark.parametrize("name", sorted(n for n, e in EXPECTED.items() if e["kind"] != "analysed"))
def test_the_command_line_exits_2_with_one_line(name, capsys):
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        status = main(["analyse", str(CORPUS / name)])
    out, err = capsys.readouterr()
    assert status == 2 and out == ""
    assert err.count("\n") == 1 and err.startswith("poise: ")


def test_the_command_line_prints_no_traceback_or_warning_in_a_real_process():
    files = [str(CORPUS / n) for n in ("deep_nesting.poise", "name_with_lone_surrogate.poise", "not_utf8.poise")]
    script = "import sys; from app.cli import main; sys.exit(max(main(['analyse', f]) for f in sys.argv[1:]))"
    done = subprocess.run([sys.executable, "-c", script, *files], capture_output=True, text=True, timeout=120)
    assert done.returncode == 2 and done.stdout == ""
    lines = done.stderr.splitlines()
    assert len(lines) == len(files) and all(line.startswith("poise: ") for line in lines), done.stderr


@settings(max_examples=250, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(rng=st.randoms(use_true_random=False))
def test_mutated_files_are_refused_by_name_or_analysed_to_finite_results(rng):
    result = outcome(mutated_bytes(rng, BASE))
    assert result.kind != "unhandled", result.message
    assert result.named, result.message
    assert result.non_finite == (), result.non_finite
