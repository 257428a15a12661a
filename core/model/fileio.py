"""Reading and writing ``.poise`` project files.

A ``.poise`` file is UTF-8 JSON: a format tag, a version number, the units, then the project.
Keys keep the model's field order and short number lists sit on one line, so files read well
and diff line by line. Floats are written with Python's shortest exact repr, so save → load
returns an equal model. Every problem found while loading raises :class:`ModelError` with the
path of the bad field, e.g. ``levels[2].outline: polygon intersects itself``, or says what is wrong
with the file as a whole (too large, nested too deeply, not JSON); size and nesting are checked
before the JSON is parsed.

Saving never leaves a half-written file: the new text and the backup of the old file each reach
their names by an atomic rename, the file's permissions are kept, a symbolic link is followed
(its target is written, the link stays), and a read-only file is refused unless the caller says
to overwrite it (:class:`ReadOnlyFileError`).
"""

from __future__ import annotations

import dataclasses
import errno
import hashlib
import json
import math
import os
import re
import secrets
import shutil
import stat
import types
import typing
from enum import Enum
from pathlib import Path
from typing import Any

import numpy as np

from core.errors import ModelError
from core.model import Element, Level, Project, Settings, kind_spec
from core.model.bounds import FILE_SIZE, NESTING
from core.model.settings import RETIRED_FIELDS

FORMAT_TAG = "poise-project"
FORMAT_VERSION = 3
"""The format's history, each version reading all older ones:
1 — the first format;
2 — an element may be switched off (``"active": false``); a version 1 file has no such field, so
    every element of it is active (the field's default) and it loads unchanged;
3 — sections per storey and generic steel shapes (``storeys``, ``*_shape`` fields of braced frames,
    walls and moment frames). Older files hold none and need no change: the new fields take
    their defaults (the same section in every storey, areas typed)."""
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
        "kind": str(element.kind),
        "start": list(element.start),
        "end": list(element.end),
        "bottom": element.bottom,
        "top": element.top,
        "properties": _encode(element.properties),
        **({} if element.active else {"active": False}),
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
            raise ModelError(path, f"expected a number, got {_shown(value)}")
        try:
            number = float(value)
        except OverflowError:
            number = math.inf
        if not math.isfinite(number):
            raise ModelError(path, f"expected a finite number, got {_shown(value)}")
        return number
    if kind is int:
        if isinstance(value, bool) or not isinstance(value, int):
            raise ModelError(path, f"expected a whole number, got {_shown(value)}")
        return value
    if kind is str or kind is bool:
        if not isinstance(value, kind):
            raise ModelError(path, f"expected {_type_name(kind)}, got {_shown(value)}")
        return value
    if isinstance(kind, type) and issubclass(kind, Enum):
        try:
            return kind(value)
        except (ValueError, TypeError):
            allowed = ", ".join(repr(m.value) for m in kind)
            raise ModelError(path, f"must be one of {allowed}, got {_shown(value)}") from None
    if origin is tuple:
        if not isinstance(value, list):
            raise ModelError(path, f"expected a list, got {_shown(value)}")
        args = typing.get_args(kind)
        if len(args) == 2 and args[1] is Ellipsis:
            return tuple(_decode(v, args[0], f"{path}[{i}]") for i, v in enumerate(value))
        if len(value) != len(args):
            raise ModelError(path, f"expected {len(args)} values, got {len(value)}")
        return tuple(_decode(v, a, f"{path}[{i}]") for i, (v, a) in enumerate(zip(value, args, strict=True)))
    if dataclasses.is_dataclass(kind):
        return _decode_dataclass(value, kind, path)
    if origin in (typing.Union, types.UnionType):
        options = [a for a in typing.get_args(kind) if a is not type(None)]
        if len(options) == 1 and len(typing.get_args(kind)) == 2:
            return None if value is None else _decode(value, options[0], path)
        raise ModelError(path, "cannot tell which kind of value this is")
    raise ModelError(path, f"unsupported field type {kind!r}")


def _shown(value: Any) -> str:
    """A short readable form of a bad value for a message (never a megabyte of JSON)."""
    if isinstance(value, dict):
        return "an object"
    if isinstance(value, list):
        return f"a list of {len(value)}"
    if isinstance(value, int) and not isinstance(value, bool) and abs(value) > 10**18:
        return "a number too large"
    shown = repr(value)
    return shown if len(shown) <= 40 else shown[:37] + "…"


def _decode_dataclass(value: Any, cls: Any, path: str) -> Any:
    if not isinstance(value, dict):
        raise ModelError(path, f"expected an object, got {_shown(value)}")
    hints = typing.get_type_hints(cls)
    fields = {f.name: f for f in dataclasses.fields(cls)}
    unknown = sorted(set(value) - set(fields) - RETIRED_FIELDS.get(cls, frozenset()))
    if unknown:
        raise ModelError(_join(path, _key(unknown[0])), "unknown field")
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


def _key(name: str) -> str:
    """A key from the file as a path part: quoted unless it is a plain name."""
    return name if name.isidentifier() else json.dumps(name)


def _join(path: str, name: str) -> str:
    return f"{path}.{name}" if path else name


def _decode_element(value: Any, path: str) -> Element:
    if not isinstance(value, dict):
        raise ModelError(path, f"expected an object, got {_shown(value)}")
    name = _decode(value.get("kind"), str, f"{path}.kind")
    try:
        spec = kind_spec(name)
    except ModelError as error:
        raise ModelError(f"{path}.kind", error.message) from None
    rest = {k: v for k, v in value.items() if k != "kind"}
    properties = _decode_dataclass(rest.pop("properties", {}), spec.properties, f"{path}.properties")
    fields = _decode_dataclass(rest, _ElementFields, path)
    element: Element = _construct(Element, {**dataclasses.asdict(fields), "properties": properties}, path)
    return element


@dataclasses.dataclass(frozen=True)
class _ElementFields:
    """Element's plain fields, decoded before its kind-specific properties are attached."""

    id: str
    start: tuple[float, float]
    end: tuple[float, float]
    bottom: int
    top: int
    active: bool = True


def project_from_dict(document: Any) -> Project:
    """The Project held by a decoded ``.poise`` document; raises ModelError naming the bad field."""
    if not isinstance(document, dict) or document.get("format") != FORMAT_TAG:
        raise ModelError("format", f"not a Poise project (expected format {FORMAT_TAG!r})")
    version = document.get("version")
    if not isinstance(version, int) or isinstance(version, bool):
        raise ModelError("version", f"expected a whole number, got {_shown(version)}")
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
        raise ModelError(_key(unknown[0]), "unknown field")

    header = document.get("project", {})
    if not isinstance(header, dict):
        raise ModelError("project", "expected an object")
    unknown = sorted(set(header) - {"name", "job_number", "engineer", "notes", "revision"})
    if unknown:
        raise ModelError(f"project.{_key(unknown[0])}", "unknown field")
    texts = {k: _decode(header[k], str, f"project.{k}") for k in header}

    settings = _decode_dataclass(document.get("settings", {}), Settings, "settings")
    levels_data = document.get("levels", [])
    elements_data = document.get("elements", [])
    for name, data in (("levels", levels_data), ("elements", elements_data)):
        if not isinstance(data, list):
            raise ModelError(name, "expected a list")
    levels = tuple(_decode_dataclass(v, Level, f"levels[{i}]") for i, v in enumerate(levels_data))
    elements = tuple(_decode_element(v, f"elements[{i}]") for i, v in enumerate(elements_data))
    project: Project = _construct(Project, {**texts, "settings": settings, "levels": levels, "elements": elements}, "")
    return project


_STRING = re.compile(r'"(?:[^"\\]|\\.)*"')
_OPENERS = np.frombuffer(b"[{", dtype=np.uint8)
_CLOSERS = np.frombuffer(b"]}", dtype=np.uint8)
_LONGEST_INTEGER = 30
"""Digits beyond which a whole number is read as a float (and then refused by its field's bound)."""


def _nesting(text: str) -> int:
    """Deepest nesting of lists and objects in JSON ``text``, found without parsing it."""
    skeleton = np.frombuffer(_STRING.sub("", text).encode("utf-8", "surrogatepass"), dtype=np.uint8)
    steps = np.isin(skeleton, _OPENERS).astype(np.int64) - np.isin(skeleton, _CLOSERS)
    return int(np.cumsum(steps).max(initial=0))


def _integer(digits: str) -> int | float:
    return int(digits) if len(digits) <= _LONGEST_INTEGER else float(digits)


def loads(text: str, source: str = "") -> Project:
    """The Project in ``.poise`` text; ModelError naming the bad field or the file's problem."""
    where = f"{source}: " if source else ""
    if len(text) > FILE_SIZE:
        raise ModelError("", f"{where}too large for a project file ({len(text):,} characters)")
    if _nesting(text) > NESTING:
        raise ModelError("", f"{where}not a Poise project: lists or objects nested more than {NESTING} deep")
    try:
        document = json.loads(text, parse_int=_integer)
    except json.JSONDecodeError as error:
        message = f"not valid JSON (line {error.lineno}, column {error.colno}: {error.msg})"
        raise ModelError("", where + message) from None
    except (RecursionError, ValueError) as error:
        raise ModelError("", f"{where}not valid JSON ({error})") from None
    return project_from_dict(document)


def load_project(path: str | os.PathLike[str]) -> Project:
    """Read and validate a ``.poise`` file."""
    path = Path(path)
    try:
        with path.open("rb") as stream:
            data = stream.read(FILE_SIZE + 1)
    except OSError as error:
        raise ModelError("", f"cannot read {path}: {error.strerror or error}") from None
    return load_bytes(data, source=str(path))


def load_bytes(data: bytes, source: str = "the file") -> Project:
    """The Project in the bytes of a ``.poise`` file (what :func:`load_project` read)."""
    if len(data) > FILE_SIZE:
        raise ModelError("", f"{source} is too large for a project file (over {FILE_SIZE // 2**20} MB)")
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        raise ModelError("", f"{source} is not a text file") from None
    return loads(text, source=source)


# ---------------------------------------------------------------- saving


class ReadOnlyFileError(PermissionError):
    """The file to be overwritten is read-only; save again with ``overwrite_read_only=True``."""

    def __init__(self, path: Path) -> None:
        self.message = f"{path} is read-only: Poise will not overwrite it without asking"
        super().__init__(errno.EACCES, self.message, str(path))

    def __str__(self) -> str:
        return self.message


NAME_MAX = 255
"""Longest file name, in bytes, on the common file systems (ext4, APFS, NTFS)."""


def temporary_prefix(path: Path) -> str:
    """The short name prefix of ``path``'s temporary files: ``.poise-<8 hex of the name>-``.

    It does not grow with the file's name (so a 251-character name still saves), and it is the
    same for every save of one file, so the next save can remove what a crash left."""
    digest = hashlib.blake2s(path.name.encode("utf-8", "surrogatepass"), digest_size=4).hexdigest()
    return f".poise-{digest}-"


def backup_path(path: Path) -> Path:
    """``<name>.bak`` beside ``path``; a name too long for that keeps its start and a hash."""
    name = path.name + BACKUP_SUFFIX
    if len(name.encode("utf-8", "surrogatepass")) <= NAME_MAX:
        return path.with_name(name)
    keep = path.name.encode("utf-8", "surrogatepass")[: NAME_MAX - 16].decode("utf-8", "ignore")
    return path.with_name(f"{keep}{temporary_prefix(path)[6:]}{BACKUP_SUFFIX}")


def save_project(
    project: Project, path: str | os.PathLike[str], *, overwrite_read_only: bool = False
) -> None:
    """Write ``project`` to ``path`` so that a crash at any moment leaves it whole, old or new.

    The new text goes to a temporary file in the same folder, is fsynced and renamed over the
    file; the file that was there is first kept as ``<name>.bak`` by the same temp-and-rename, so
    the backup is whole too. A symlink is followed, the old file's permissions are kept, stale
    temporary files of this file (from a crash) are removed, and a read-only file raises
    :class:`ReadOnlyFileError` unless ``overwrite_read_only``.
    """
    text = dumps(project)
    target = Path(os.path.realpath(path))
    folder = target.parent
    try:
        old = target.stat()
    except FileNotFoundError:
        old = None
    if old is not None and not old.st_mode & 0o222 and not overwrite_read_only:
        raise ReadOnlyFileError(target)
    mode = stat.S_IMODE(old.st_mode) if old is not None else _default_mode()
    prefix = temporary_prefix(target)
    _remove_stale(folder, prefix)
    temporary = _write_temporary(folder, prefix, text.encode("utf-8"), mode)
    try:
        if old is not None:
            _keep_backup(target, prefix)
        os.replace(temporary, target)
    except BaseException:
        temporary.unlink(missing_ok=True)
        raise
    _sync_folder(folder)


def _default_mode() -> int:
    """Mode of a new file under the process's umask (0o644 under the usual 022)."""
    umask = os.umask(0)
    os.umask(umask)
    return 0o666 & ~umask


def _remove_stale(folder: Path, prefix: str) -> None:
    for stale in folder.glob(f"{prefix}*.tmp"):
        stale.unlink(missing_ok=True)


def _write_temporary(folder: Path, prefix: str, data: bytes, mode: int) -> Path:
    """A new, fsynced file ``<prefix><random>.tmp`` in ``folder`` holding ``data``, with ``mode``."""
    temporary = folder / f"{prefix}{secrets.token_hex(4)}.tmp"
    descriptor = os.open(temporary, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600)
    try:
        with os.fdopen(descriptor, "wb") as stream:
            stream.write(data)
            stream.flush()
            os.fchmod(stream.fileno(), mode | stat.S_IWUSR)
            os.fsync(stream.fileno())
        if not mode & stat.S_IWUSR:
            os.chmod(temporary, mode)
    except BaseException:
        temporary.unlink(missing_ok=True)
        raise
    return temporary


def _keep_backup(target: Path, prefix: str) -> None:
    """Make ``<name>.bak`` the current file, atomically: a hard link (or an fsynced copy where
    links are not supported) under a temporary name, renamed over the old backup."""
    temporary = target.parent / f"{prefix}{secrets.token_hex(4)}.tmp"
    try:
        try:
            os.link(target, temporary)
        except OSError:
            shutil.copy2(target, temporary)
            with temporary.open("rb+") as stream:
                os.fsync(stream.fileno())
        os.replace(temporary, backup_path(target))
    finally:
        # rename() between two links of one file (a crash left the backup linked to the file) does
        # nothing and keeps the temporary name: remove it
        temporary.unlink(missing_ok=True)


def _sync_folder(folder: Path) -> None:
    """fsync the folder so the renames themselves survive a power cut."""
    try:
        directory = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(directory)
    finally:
        os.close(directory)
