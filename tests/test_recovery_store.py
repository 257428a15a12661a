"""Recovery copies and the file guard, below the window: unique names, leftovers of dead sessions
only, locks seen by a second holder, changes on disk told from a mere touch."""

from __future__ import annotations

import os
import subprocess
import sys

from PySide6.QtCore import QLockFile

from app.file_guard import FileGuard, lock_path
from app.recovery import RecoveryStore, safe_stem
from core.model import Project
from core.model.fileio import save_project


def lock_in_a_killed_process(path) -> None:
    """``path`` locked by a process that was then killed with SIGKILL (it never unlocked)."""
    script = (
        "import os, sys; from PySide6.QtCore import QLockFile; "
        "lock = QLockFile(sys.argv[1]); assert lock.tryLock(0); os.kill(os.getpid(), 9)"
    )
    subprocess.run([sys.executable, "-c", script, str(path)], timeout=60)
    assert path.exists()


def crash(store: RecoveryStore) -> None:
    """Leave the store's copy as a killed process would: the copy stays, its lock's owner is dead."""
    lock = store._own.copy.with_suffix(".lock")
    store._lock.unlock()
    store._lock, store._own = None, None
    lock_in_a_killed_process(lock)


def test_a_dead_sessions_copy_is_a_leftover_and_a_live_one_is_not(tmp_path):
    live, dead, later = RecoveryStore(tmp_path), RecoveryStore(tmp_path), RecoveryStore(tmp_path)
    live.autosave(Project(name="live"), None)
    dead.autosave(Project(name="dead"), tmp_path / "a.poise")
    crash(dead)
    found = later.leftovers()
    assert [c.load().name for c in found] == ["dead"]
    assert found[0].original == tmp_path / "a.poise" and found[0].reason == "autosave"
    found[0].remove()
    assert later.leftovers() == []


def test_copies_never_share_a_name_or_overwrite_each_other(tmp_path):
    store = RecoveryStore(tmp_path)
    names = {store.save_error_copy(Project(name=str(n)), tmp_path / "a.poise").copy for n in range(5)}
    names.add(store.autosave(Project(name="auto"), tmp_path / "a.poise").copy)
    assert len(names) == 6 and all(p.exists() for p in names)
    assert all(p.parent == tmp_path for p in names)


def test_a_name_that_cannot_encode_still_gets_a_copy(tmp_path):
    original = tmp_path / os.fsdecode(b"b\xffad\xfe.poise")
    assert safe_stem(original) == "bad"
    copy = RecoveryStore(tmp_path / "store").save_error_copy(Project(), original)
    assert copy.copy.exists()
    assert RecoveryStore(tmp_path / "store").leftovers()[0].original == original


def test_discard_removes_the_sessions_copy(tmp_path):
    store = RecoveryStore(tmp_path)
    copy = store.autosave(Project(), None).copy
    store.discard()
    assert not copy.exists() and list(tmp_path.iterdir()) == []


def test_a_second_guard_sees_the_holder(tmp_path):
    path = tmp_path / "a.poise"
    save_project(Project(), path)
    first, second = FileGuard(), FileGuard()
    assert second.holder(path) is None
    first.take(path)
    holder = second.holder(path)
    assert holder is not None and holder.pid == os.getpid()
    first.release()
    assert second.holder(path) is None and not lock_path(path).exists()


def test_a_stale_lock_of_a_dead_process_holds_nobody(tmp_path):
    path = tmp_path / "a.poise"
    save_project(Project(), path)
    lock_in_a_killed_process(lock_path(path))
    assert FileGuard().holder(path) is None
    assert QLockFile(str(lock_path(path))).tryLock(0)


def test_a_change_on_disk_is_seen_and_a_touch_is_not(tmp_path):
    path = tmp_path / "a.poise"
    save_project(Project(name="one"), path)
    guard = FileGuard()
    guard.take(path)
    os.utime(path, ns=(1, 1))
    assert not guard.changed_on_disk()
    save_project(Project(name="someone else's"), path)
    assert guard.changed_on_disk()
    guard.remember()
    assert not guard.changed_on_disk()
