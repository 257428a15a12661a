"""Reading and writing ``.poise`` project files.

A ``.poise`` file is UTF-8 JSON: a format tag, a version number, the units, then the project.
Keys keep the model's field order and short number lists sit on one line, so files read well
and diff line by line. Floats are written with Python's shortest exact repr, so save → load
returns an equal model. Every problem found while loading raises :class:`ModelError` with the
path of the bad field, e.g. ``levels[2].outline: polygon intersects itself``.
"""

from __future__ import annotations

import dataclasses
import json
import math
import os
import re
import shutil
import tempfile
import types
import typing
from enum import Enum
from pathlib import Path
from typing import Any

from core.errors import ModelError
from core.model import PROPERTY_TYPES, Element, ElementKind, Level, Project, Settings

FORMAT_TAG = "poise-project"
FORMAT_VERSION = 1
UNITS = {"length": "m", "force": "kN", "mass": "t", "time": "s", "area load": "kPa", "modulus": "kPa"}
BACKUP_SUFFIX = ".bak"


# ---------------------------------------------------------------- encoding


def _encode(value: Any) -> Any:
    if dataclasses.is_dataclass(value) and not isinstance(value, type):
        return {f.name: _encode(getattr(value, f.name)) for f in dataclasses.fields(value)}
    if isinstance(value, Enum):
        return value.value
    if isinstance(value, tuple | list):
        return [_encode(v) for v in value]
    return value


def _encode_element(element: Element) -> dict[str, Any]:
    return {
        "id": element.id,
        "kind": element.kind.value,
        "start": list(element.start),
        "end": list(element.end),
        "bottom": element.bottom,
        "top": element.top,
        "properties": _encode(element.properties),
    }


def project_to_dict(project: Project) -> dict[str, Any]:
    """The JSON-ready document of ``project``, with format tag, version and units."""
    return {
        "format": FORMAT_TAG,
        "version": FORMAT_VERSION,
        "units": UNITS,
        "project": {
            "name": project.name,
            "job_number": project.job_number,
            "engineer": project.engineer,
            "notes": project.notes,
            "revision": project.revision,
        },
        "settings": _encode(project.settings),
        "levels": [_encode(level) for level in project.levels],
        "elements": [_encode_element(e) for e in project.elements],
    }


_SCALAR_LIST = re.compile(r"\[\s*([-\d.eE+]+(?:,\s*[-\d.eE+]+)*)\s*\]")


def dumps(project: Project) -> str:
    """``project`` as ``.poise`` text: indented JSON with number lists kept on one line."""
    text = json.dumps(project_to_dict(project), indent=2, ensure_ascii=False, allow_nan=False)
    return _SCALAR_LIST.sub(lambda m: "[" + ", ".join(p.strip() for p in m.group(1).split(",")) + "]", text) + "\n"


# ---------------------------------------------------------------- decoding


def _type_name(kind: Any) -> str:
    return {float: "a number", int: "a whole number", str: "text", bool: "true or false"}.get(kind, str(kind))


def _decode(value: Any, kind: Any, path: str) -> Any:
    """``value`` from JSON turned into an instance of type annotation ``kind``."""
    origin = typing.get_origin(kind)
    if kind is float:
        if isinstance(value, bool) or not isinstance(value, int | float):
            raise ModelError(path, f"expected a number, got {value!r}")
        if not math.isfinite(value):
            raise ModelError(path, f"expected a finite number, got {value!r}")
        return float(value)
    if kind is int:
        if isinstance(value, bool) or not isinstance(value, int):
            raise ModelError(path, f"expected a whole number, got {value!r}")
        return value
    if kind is str or kind is bool:
        if not isinstance(value, kind):
            raise ModelError(path, f"expected {_type_name(kind)}, got {value!r}")
        return value
    if isinstance(kind, type) and issubclass(kind, Enum):
        try:
            return kind(value)
        except ValueError:
            allowed = ", ".join(repr(m.value) for m in kind)
            raise ModelError(path, f"must be one of {allowed}, got {value!r}") from None
    if origin is tuple:
        if not isinstance(value, list):
            raise ModelError(path, f"expected a list, got {value!r}")
        args = typing.get_args(kind)
        if len(args) == 2 and args[1] is Ellipsis:
            return tuple(_decode(v, args[0], f"{path}[{i}]") for i, v in enumerate(value))
        if len(value) != len(args):
            raise ModelError(path, f"expected {len(args)} values, got {len(value)}")
        return tuple(_decode(v, a, f"{path}[{i}]") for i, (v, a) in enumerate(zip(value, args, strict=True)))
    if dataclasses.is_dataclass(kind):
        return _decode_dataclass(value, kind, path)
    if origin in (typing.Union, types.UnionType):
        raise ModelError(path, "cannot tell which kind of value this is")
    raise ModelError(path, f"unsupported field type {kind!r}")


def _decode_dataclass(value: Any, cls: Any, path: str) -> Any:
    if not isinstance(value, dict):
        raise ModelError(path, f"expected an object, got {value!r}")
    hints = typing.get_type_hints(cls)
    fields = {f.name: f for f in dataclasses.fields(cls)}
    unknown = sorted(set(value) - set(fields))
    if unknown:
        raise ModelError(_join(path, unknown[0]), "unknown field")
    arguments = {}
    for name, f in fields.items():
        if name not in value:
            if f.default is dataclasses.MISSING and f.default_factory is dataclasses.MISSING:
                raise ModelError(_join(path, name), "missing")
            continue
        arguments[name] = _decode(value[name], hints[name], _join(path, name))
    return _construct(cls, arguments, path)


def _construct(cls: Any, arguments: dict[str, Any], path: str) -> Any:
    try:
        return cls(**arguments)
    except ModelError as error:
        raise error.within(path) from None


def _join(path: str, name: str) -> str:
    return f"{path}.{name}" if path else name


def _decode_element(value: Any, path: str) -> Element:
    if not isinstance(value, dict):
        raise ModelError(path, f"expected an object, got {value!r}")
    kind = _decode(value.get("kind"), ElementKind, f"{path}.kind")
    rest = {k: v for k, v in value.items() if k != "kind"}
    properties = _decode_dataclass(rest.pop("properties", {}), PROPERTY_TYPES[kind], f"{path}.properties")
    fields = _decode_dataclass(rest, _ElementFields, path)
    return _construct(Element, {**dataclasses.asdict(fields), "properties": properties}, path)


@dataclasses.dataclass(frozen=True)
class _ElementFields:
    """Element's plain fields, decoded before its kind-specific properties are attached."""

    id: str
    start: tuple[float, float]
    end: tuple[float, float]
    bottom: int
    top: int


def project_from_dict(document: Any) -> Project:
    """The Project held by a decoded ``.poise`` document; raises ModelError naming the bad field."""
    if not isinstance(document, dict) or document.get("format") != FORMAT_TAG:
        raise ModelError("format", f"not a Poise project (expected format {FORMAT_TAG!r})")
    version = document.get("version")
    if not isinstance(version, int) or isinstance(version, bool):
        raise ModelError("version", f"expected a whole number, got {version!r}")
    if version > FORMAT_VERSION:
        raise ModelError(
            "version",
            f"file is format version {version}, this Poise reads up to {FORMAT_VERSION}: update Poise to open it",
        )
    if version < 1:
        raise ModelError("version", f"unknown format version {version}")
    if document.get("units", UNITS) != UNITS:
        raise ModelError("units", f"expected the units {UNITS}")
    unknown = sorted(set(document) - {"format", "version", "units", "project", "settings", "levels", "elements"})
    if unknown:
        raise ModelError(unknown[0], "unknown field")

    header = document.get("project", {})
    if not isinstance(header, dict):
        raise ModelError("project", "expected an object")
    unknown = sorted(set(header) - {"name", "job_number", "engineer", "notes", "revision"})
    if unknown:
        raise ModelError(f"project.{unknown[0]}", "unknown field")
    texts = {k: _decode(header[k], str, f"project.{k}") for k in header}

    settings = _decode_dataclass(document.get("settings", {}), Settings, "settings")
    levels_data = document.get("levels", [])
    elements_data = document.get("elements", [])
    for name, data in (("levels", levels_data), ("elements", elements_data)):
        if not isinstance(data, list):
            raise ModelError(name, "expected a list")
    levels = tuple(_decode_dataclass(v, Level, f"levels[{i}]") for i, v in enumerate(levels_data))
    elements = tuple(_decode_element(v, f"elements[{i}]") for i, v in enumerate(elements_data))
    return _construct(Project, {**texts, "settings": settings, "levels": levels, "elements": elements}, "")


def loads(text: str, source: str = "") -> Project:
    """The Project in ``.poise`` text."""
    try:
        document = json.loads(text)
    except json.JSONDecodeError as error:
        where = f"{source}: " if source else ""
        message = f"not valid JSON (line {error.lineno}, column {error.colno}: {error.msg})"
        raise ModelError("", where + message) from None
    return project_from_dict(document)


def load_project(path: str | os.PathLike[str]) -> Project:
    """Read and validate a ``.poise`` file."""
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8")
    except OSError as error:
        raise ModelError("", f"cannot read {path}: {error.strerror or error}") from None
    except UnicodeDecodeError:
        raise ModelError("", f"{path} is not a text file") from None
    return loads(text, source=str(path))


def save_project(project: Project, path: str | os.PathLike[str]) -> None:
    """Write ``project`` atomically: a temporary file in the same folder, fsync, then replace.

    The file that was there before is kept beside it as ``<name>.poise.bak``.
    """
    path = Path(path)
    text = dumps(project)
    folder = path.parent if str(path.parent) else Path(".")
    descriptor, temporary = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    try:
        with os.fdopen(descriptor, "w", encoding="utf-8", newline="\n") as stream:
            stream.write(text)
            stream.flush()
            os.fsync(stream.fileno())
        if path.exists():
            shutil.copy2(path, path.with_name(path.name + BACKUP_SUFFIX))
        os.replace(temporary, path)
    except BaseException:
        Path(temporary).unlink(missing_ok=True)
        raise
    try:
        directory = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(directory)
    finally:
        os.close(directory)

