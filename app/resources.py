"""Where the bundled icons and sample projects are, in a source checkout or an installed copy."""

from __future__ import annotations

from importlib import resources
from pathlib import Path

_SOURCE_ROOT = Path(__file__).resolve().parent.parent


def _bundled_folder(package: str, source_name: str) -> Path:
    """The folder shipped as ``package`` when installed, else ``source_name`` beside app/."""
    try:
        folder = Path(str(resources.files(package)))
        if folder.is_dir():
            return folder
    except ModuleNotFoundError:
        pass
    return _SOURCE_ROOT / source_name


def icons_folder() -> Path:
    return _bundled_folder("app.icons", "icons")


def samples_folder() -> Path:
    return _bundled_folder("app.sample_projects", "sample_projects")


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
