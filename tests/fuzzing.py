"""Mutated project files and what Poise does with them: the engine behind tests/test_fuzz.py and
tools/fuzz_files.py.

A mutation starts from a bundled sample and changes its structure (drop, add, duplicate or retype
a field; shorten or lengthen a list), puts an extreme number or hostile text somewhere, scales a
number by a large power of ten (valid-looking but extreme buildings), or damages the text itself
(truncation, a flipped byte, deep nesting). :func:`outcome` loads the bytes, analyses what loads,
and walks every float of the results, the summary and the JSON the command line prints.
"""

from __future__ import annotations

import copy
import dataclasses
import json
import math
import random
import traceback
import warnings
from collections.abc import Iterator
from dataclasses import dataclass
from enum import Enum
from pathlib import Path
from typing import Any

import numpy as np

from core.analysis import analyse
from core.errors import AnalysisError, ModelError
from core.model.fileio import load_bytes
from core.report.summary import format_summary, results_to_dict
from core.results import Results

SAMPLES = sorted((Path(__file__).resolve().parent.parent / "sample_projects").glob("*.poise"))

EXTREME_NUMBERS: tuple[Any, ...] = (
    0, -0.0, -1, 1, 2, 0.5, 1e-300, 5e-324, 1e-306, 1e-9, 1e16, 1e308, -1e308, 1.7e308, 2**63, 10**25,
    10**400, math.nan, math.inf, -math.inf, 3.0e5, -3.0e5, 1e5, 99999.9, 0.1, 200.0, 1e13, 1e-6,
)
HOSTILE_TEXT: tuple[str, ...] = (
    "", " ", "A\ud800", "\udfff", "\x00", "line\nbreak", "\u202eevil", "☃", "𝔘𝔫𝔦", "a" * 20_000,
    "NaN", "[", "{}", "\\", '"', "level 1", "B1", "en1998", "cross", "shear_wall",
)
FILE_PROBLEMS = ("not valid JSON", "not a Poise project", "too large", "is not a text file")
"""How a refusal of the whole file (rather than of one field) starts its message."""


def seeds() -> list[dict[str, Any]]:
    return [json.loads(p.read_text(encoding="utf-8")) for p in SAMPLES]


# ------------------------------------------------------------------ mutations


def _nodes(value: Any, path: tuple[Any, ...] = ()) -> Iterator[tuple[tuple[Any, ...], Any]]:
    yield path, value
    if isinstance(value, dict):
        for k, v in value.items():
            yield from _nodes(v, (*path, k))
    elif isinstance(value, list):
        for i, v in enumerate(value):
            yield from _nodes(v, (*path, i))


def _parent(document: Any, path: tuple[Any, ...]) -> Any:
    for key in path[:-1]:
        document = document[key]
    return document


def _extreme(rng: random.Random) -> Any:
    choice = rng.random()
    if choice < 0.55:
        return rng.choice(EXTREME_NUMBERS)
    if choice < 0.8:
        return rng.choice(HOSTILE_TEXT)
    return rng.choice([None, True, False, [], {}, [0, 0], [[0, 0]], {"x": 1}])


def mutate(document: dict[str, Any], rng: random.Random) -> dict[str, Any]:
    """A copy of ``document`` with one to three structural or value mutations."""
    document = copy.deepcopy(document)
    for _ in range(rng.randint(1, 3)):
        nodes = list(_nodes(document))[1:]
        path, value = rng.choice(nodes)
        parent = _parent(document, path)
        key = path[-1]
        kind = rng.random()
        if kind < 0.3:
            parent[key] = _extreme(rng)
        elif kind < 0.5 and isinstance(value, int | float) and not isinstance(value, bool) and abs(value) < 1e300:
            parent[key] = value * 10.0 ** rng.randint(-12, 12) if value else rng.choice((1e-9, 1e9))
        elif kind < 0.6:
            del parent[key]
        elif kind < 0.7 and isinstance(parent, list):
            parent.insert(rng.randrange(len(parent) + 1), copy.deepcopy(value))
        elif kind < 0.78 and isinstance(parent, dict):
            parent[rng.choice(HOSTILE_TEXT[:12])] = _extreme(rng)
        elif kind < 0.86 and isinstance(value, list) and value:
            del value[rng.randrange(len(value)):]
        elif kind < 0.93:
            parent[key] = [value] if rng.random() < 0.5 else {"value": value}
        else:
            parent[key] = copy.deepcopy(rng.choice(nodes)[1])
    return document


def mutated_bytes(rng: random.Random, base: list[dict[str, Any]]) -> bytes:
    """One mutated ``.poise`` file: a structure/value mutation, then sometimes damage to its text."""
    document = mutate(rng.choice(base), rng)
    text = json.dumps(document, indent=2 if rng.random() < 0.5 else None, ensure_ascii=rng.random() < 0.5)
    data = text.encode("utf-8", "surrogatepass")
    damage = rng.random()
    if damage < 0.06:
        data = data[: rng.randrange(len(data) + 1)]
    elif damage < 0.1:
        at = rng.randrange(len(data))
        data = data[:at] + bytes([rng.randrange(256)]) + data[at + 1 :]
    elif damage < 0.12:
        depth = rng.choice((20, 990, 5000, 100_000))
        at = rng.randrange(len(data))
        data = data[:at] + b"[" * depth + data[at:]
    elif damage < 0.13:
        data = b'{"format": "poise-project", "version": 1, "levels": [' + b"9" * rng.choice((400, 5000)) + b"]}"
    return data


# ------------------------------------------------------------------ outcomes


@dataclass
class Outcome:
    """What one file did: loaded and analysed, refused (with or without a field), or crashed."""

    kind: str
    """'analysed', 'cannot stand' (AnalysisError), 'refused' (ModelError) or 'unhandled'."""
    message: str = ""
    named: bool = True
    """A refusal names a field path, or says what is wrong with the file as a whole."""
    non_finite: tuple[str, ...] = ()
    """Where non-finite floats sit in the results (attribute paths)."""


def non_finite_floats(results: Results) -> list[str]:
    """Attribute paths of every NaN or infinite float in ``results`` (arrays included)."""
    found: list[str] = []

    def walk(value: Any, path: str) -> None:
        if isinstance(value, bool | int | str | Enum) or value is None:
            return
        if isinstance(value, float):
            if not math.isfinite(value):
                found.append(path)
        elif isinstance(value, np.ndarray):
            if value.dtype.kind == "f" and not np.all(np.isfinite(value)):
                found.append(path)
        elif dataclasses.is_dataclass(value):
            for f in dataclasses.fields(value):
                walk(getattr(value, f.name), f"{path}.{f.name}")
        elif isinstance(value, dict):
            for k, v in value.items():
                walk(v, f"{path}[{k!r}]")
        elif hasattr(value, "__iter__"):
            for i, v in enumerate(value):
                walk(v, f"{path}[{i}]")

    walk(results, "results")
    return found


def outcome(data: bytes) -> Outcome:
    """Load, analyse and print the summary of one file; never raises. A warning (numpy's
    overflow or division warnings, say) counts as unhandled: the command line must print one line."""
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        return _outcome(data)


def _outcome(data: bytes) -> Outcome:
    try:
        project = load_bytes(data)
    except ModelError as error:
        named = bool(error.path) or any(p in error.message for p in FILE_PROBLEMS)
        return Outcome("refused", str(error), named=named and "\n" not in str(error))
    except Exception:  # the fuzzer's whole point: count what escapes
        return Outcome("unhandled", traceback.format_exc(limit=-3))
    try:
        results = analyse(project)
    except AnalysisError as error:
        return Outcome("cannot stand", error.message, named=bool(error.message) and "\n" not in error.message)
    except Exception:
        return Outcome("unhandled", traceback.format_exc(limit=-3))
    try:
        non_finite = non_finite_floats(results)
        json.dumps(results_to_dict(project, results), allow_nan=False)
        format_summary(project, results)
    except Exception:
        return Outcome("unhandled", traceback.format_exc(limit=-3))
    return Outcome("analysed", non_finite=tuple(non_finite))
