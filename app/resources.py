"""Where the bundled icons and sample projects are, in a source checkout or an installed copy."""

from __future__ import annotations

from pathlib import Path

_PACKAGE = Path(__file__).resolve().parent


def _bundled_folder(name: str) -> Path:
    """``app/<name>`` in an installed copy (package data), else ``<name>/`` beside app/ in a checkout."""
    installed = _PACKAGE / name
    return installed if installed.is_dir() else _PACKAGE.parent / name


def icons_folder() -> Path:
    return _bundled_folder("icons")


def samples_folder() -> Path:
    return _bundled_folder("sample_projects")


def icon_path(name: str) -> Path:
    """Path of icon ``name`` (without ``.svg``)."""
    return icons_folder() / f"{name}.svg"


def sample_path(name: str) -> Path:
    """Path of bundled sample project ``name`` (without ``.poise``)."""
    return samples_folder() / f"{name}.poise"


def sample_projects() -> list[Path]:
    return sorted(samples_folder().glob("*.poise"))


DEFAULT_SAMPLE = "office_5_storey_braced"
"""The sample ``poise`` opens when started without a file: the unbalanced steel office."""
