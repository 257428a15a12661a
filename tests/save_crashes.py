"""Kill -9 during saves: the engine behind tests/test_save_crashes.py and tools/kill_saves.py.

A child process saves two alternating versions of a project to one file as fast as it can; the
parent kills it with SIGKILL at a random moment, then checks that the file and its backup each
load whole (an old or a new version, never a torn one), and that the next save leaves no
temporary file behind.
"""

from __future__ import annotations

import dataclasses
import os
import random
import signal
import subprocess
import sys
import time
from dataclasses import dataclass
from pathlib import Path

from core.errors import ModelError
from core.model.fileio import backup_path, load_project, save_project

ROOT = Path(__file__).resolve().parent.parent
SAMPLE = ROOT / "sample_projects" / "residential_8_storey_walls.poise"
NOTES = 9_000
"""Characters of notes in the saved versions (a larger file widens the window a kill can hit)."""

CHILD = """
import sys
from pathlib import Path
sys.path.insert(0, sys.argv[2])
from tests.save_crashes import version
from core.model.fileio import save_project
path = Path(sys.argv[1])
versions = [version(n) for n in range(2)]
print("ready", flush=True)
n = 0
while True:
    save_project(versions[n % 2], path)
    n += 1
"""


def version(n: int):
    """Version ``n`` of the test project: the sample with its name and long notes marking ``n``."""
    project = load_project(SAMPLE)
    return dataclasses.replace(project, name=f"version {n}", notes=str(n) * NOTES)


@dataclass
class Tally:
    kills: int = 0
    torn_files: int = 0
    torn_backups: int = 0
    stray_temporaries: int = 0
    hit_mid_save: int = 0
    """Kills that left a temporary file behind: evidence they landed inside a save."""


def crash_saves(count: int, folder: Path, seed: int = 1) -> Tally:
    """``count`` saves killed at random moments in ``folder``; what was found after each."""
    rng = random.Random(seed)
    path = folder / "crash.poise"
    save_project(version(0), path)
    save_project(version(1), path)
    known = {"version 0", "version 1"}
    tally = Tally()
    for _ in range(count):
        child = subprocess.Popen(
            [sys.executable, "-c", CHILD, str(path), str(ROOT)], stdout=subprocess.PIPE, text=True
        )
        assert child.stdout is not None and child.stdout.readline().strip() == "ready"
        time.sleep(rng.uniform(0.0, 0.03))
        os.kill(child.pid, signal.SIGKILL)
        child.wait()
        tally.kills += 1
        for target, counter in ((path, "torn_files"), (backup_path(path), "torn_backups")):
            try:
                whole = load_project(target).name in known
            except ModelError:
                whole = False
            if not whole:
                setattr(tally, counter, getattr(tally, counter) + 1)
        tally.hit_mid_save += any(p.name.endswith(".tmp") for p in folder.iterdir())
        save_project(version(0), path)
        tally.stray_temporaries += sum(1 for p in folder.iterdir() if p.name.endswith(".tmp"))
    return tally
