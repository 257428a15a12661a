"""Kills a saving process with SIGKILL at random moments and checks what is left on disk.

    nice python tools/kill_saves.py --count 500 [--folder /tmp/kills]

Prints how many kills left a torn project file, a torn backup, or temporary files after the next
save (all three must be 0). tests/test_save_crashes.py runs a few of the same kills.
"""

from __future__ import annotations

import argparse
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from tests.save_crashes import crash_saves


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--count", type=int, default=500)
    parser.add_argument("--folder", type=Path, help="where to save (default: a new temporary folder)")
    parser.add_argument("--seed", type=int, default=1)
    args = parser.parse_args()
    folder = args.folder or Path(tempfile.mkdtemp(prefix="poise-kills-"))
    folder.mkdir(parents=True, exist_ok=True)
    start = time.perf_counter()
    tally = crash_saves(args.count, folder, args.seed)
    print(f"kills                          {tally.kills}")
    print(f"kills that left a temporary    {tally.hit_mid_save}")
    print(f"torn project files             {tally.torn_files}")
    print(f"torn backups                   {tally.torn_backups}")
    print(f"temporaries after next save    {tally.stray_temporaries}")
    print(f"time                           {time.perf_counter() - start:.0f} s in {folder}")
    return 1 if tally.torn_files or tally.torn_backups or tally.stray_temporaries else 0


if __name__ == "__main__":
    sys.exit(main())
