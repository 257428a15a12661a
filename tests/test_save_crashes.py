"""A few kill -9s during saves (tools/kill_saves.py runs hundreds): the file and its backup stay
whole, and the next save removes what the killed one left."""

from __future__ import annotations

from tests.save_crashes import crash_saves


def test_killed_saves_leave_whole_files_and_no_temporaries(tmp_path):
    tally = crash_saves(8, tmp_path, seed=3)
    assert tally.kills == 8
    assert (tally.torn_files, tally.torn_backups, tally.stray_temporaries) == (0, 0, 0)
