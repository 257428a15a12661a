"""Icons and sample projects are found from an installed (non-editable) copy too."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

from app.resources import icons_folder, sample_projects

REPO = Path(__file__).resolve().parent.parent

PROBE = """
import sys, app.resources as r
print(r.__file__)
print(len(list(r.icons_folder().glob('*.svg'))))
print(len(r.sample_projects()))
"""


def test_every_package_is_listed_for_installation():
    """setuptools is given an explicit package list (two top-level packages); a package missing from
    it would be left out of an installed copy."""
    import tomllib

    listed = set(tomllib.loads((REPO / "pyproject.toml").read_text())["tool"]["setuptools"]["packages"])
    found = {
        ".".join(p.parent.relative_to(REPO).parts) for top in ("app", "core") for p in (REPO / top).rglob("__init__.py")
    }
    assert found <= listed


def test_resources_found_from_the_source_tree():
    assert any(icons_folder().glob("*.svg"))
    assert len(sample_projects()) >= 3


def test_resources_found_from_an_installed_copy(tmp_path):
    completed = subprocess.run(
        [sys.executable, "-I", "-c", PROBE], capture_output=True, text=True, cwd=tmp_path
    )
    if completed.returncode != 0:
        pytest.skip("Poise is not installed in this environment (source-tree run)")
    module, icons, samples = completed.stdout.split()
    if Path(module).resolve().is_relative_to(REPO / "app"):
        pytest.skip("Poise is installed in editable mode; the source tree was checked above")
    assert int(icons) > 0 and int(samples) >= 3
