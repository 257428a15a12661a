"""Core's import contract, checked: its stages run one way and it never imports Qt or app
(import-linter, contracts in pyproject.toml), and it works in a Python where Qt cannot be imported."""

from __future__ import annotations

import os
import subprocess
import sys
import textwrap
from pathlib import Path

REPO = Path(__file__).resolve().parent.parent


def test_the_import_contracts_hold():
    from importlinter.cli import lint_imports

    previous = Path.cwd()
    os.chdir(REPO)
    try:
        assert lint_imports(config_filename=str(REPO / "pyproject.toml")) == 0
    finally:
        os.chdir(previous)


BLOCKED_QT = textwrap.dedent(
    """
    import importlib, pkgutil, sys
    from importlib.abc import MetaPathFinder

    class NoQt(MetaPathFinder):
        def find_spec(self, name, path=None, target=None):
            if name.split(".")[0] in ("PySide6", "pyqtgraph", "shiboken6", "app"):
                raise ImportError(f"{name} is blocked: core must work without it")
            return None

    sys.meta_path.insert(0, NoQt())
    import core
    names = [m.name for m in pkgutil.walk_packages(core.__path__, "core.")]
    for name in names:
        importlib.import_module(name)
    from core.analysis import analyse
    from core.model.fileio import load_project
    results = analyse(load_project(sys.argv[1]))
    assert results.modes and results.lateral.verdicts
    assert not any(m.split(".")[0] in ("PySide6", "pyqtgraph", "app") for m in sys.modules)
    print(len(names), "modules")
    """
)


def test_core_imports_and_analyses_with_qt_unimportable():
    sample = REPO / "sample_projects" / "office_5_storey_braced.poise"
    run = subprocess.run(
        [sys.executable, "-c", BLOCKED_QT, str(sample)],
        capture_output=True,
        text=True,
        cwd=REPO,
        env={**os.environ, "PYTHONPATH": str(REPO)},
        timeout=300,
    )
    assert run.returncode == 0, run.stderr
    assert int(run.stdout.split()[0]) > 30


def test_core_type_checks_strictly(tmp_path):
    """mypy --strict over core/ (settings in pyproject.toml) finds nothing."""
    run = subprocess.run(
        [sys.executable, "-m", "mypy", "--cache-dir", str(tmp_path / "mypy"), "--no-error-summary"],
        capture_output=True,
        text=True,
        cwd=REPO,
        env={**os.environ, "PYTHONPATH": str(REPO)},
        timeout=600,
    )
    assert run.returncode == 0, run.stdout[-3000:] + run.stderr[-1000:]
