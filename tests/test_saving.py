"""Saves that keep everything: atomic backup, no stray temporaries, permissions, links, read-only
files and long names (core/model/fileio.py)."""

from __future__ import annotations

import os
import stat

import pytest

from core.model import Project
from core.model.fileio import (
    ReadOnlyFileError,
    backup_path,
    dumps,
    load_project,
    save_project,
    temporary_prefix,
)


def strays(folder) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if p.name.endswith(".tmp"))


def test_second_save_keeps_the_first_as_backup_and_no_temporary(tmp_path):
    path = tmp_path / "a.poise"
    save_project(Project(name="one"), path)
    save_project(Project(name="two"), path)
    assert load_project(path).name == "two"
    assert load_project(backup_path(path)).name == "one"
    assert strays(tmp_path) == []


def test_stale_temporaries_of_a_crashed_save_are_removed(tmp_path):
    path = tmp_path / "a.poise"
    stale = tmp_path / f"{temporary_prefix(path)}deadbeef.tmp"
    stale.write_text("half a file")
    other = tmp_path / f"{temporary_prefix(tmp_path / 'b.poise')}deadbeef.tmp"
    other.write_text("another file's save in progress")
    save_project(Project(), path)
    assert strays(tmp_path) == [other.name]


def test_permissions_are_kept(tmp_path):
    path = tmp_path / "a.poise"
    save_project(Project(), path)
    os.chmod(path, 0o640)
    save_project(Project(name="again"), path)
    assert stat.S_IMODE(path.stat().st_mode) == 0o640


def test_a_new_file_follows_the_umask_not_0600(tmp_path):
    old = os.umask(0o022)
    try:
        save_project(Project(), tmp_path / "a.poise")
    finally:
        os.umask(old)
    assert stat.S_IMODE((tmp_path / "a.poise").stat().st_mode) == 0o644


def test_saving_through_a_symlink_writes_its_target(tmp_path):
    target = tmp_path / "real" / "a.poise"
    target.parent.mkdir()
    save_project(Project(name="one"), target)
    link = tmp_path / "link.poise"
    link.symlink_to(target)
    save_project(Project(name="two"), link)
    assert link.is_symlink()
    assert load_project(target).name == "two"
    assert load_project(backup_path(target)).name == "one"


def test_a_read_only_file_is_refused_unless_asked(tmp_path):
    path = tmp_path / "a.poise"
    save_project(Project(name="one"), path)
    os.chmod(path, 0o444)
    with pytest.raises(ReadOnlyFileError, match="read-only"):
        save_project(Project(name="two"), path)
    assert load_project(path).name == "one"
    save_project(Project(name="two"), path, overwrite_read_only=True)
    assert load_project(path).name == "two"
    assert stat.S_IMODE(path.stat().st_mode) == 0o444


@pytest.mark.parametrize("length", [251, 255])
def test_a_long_name_saves_with_its_backup(tmp_path, length):
    path = tmp_path / ("n" * (length - len(".poise")) + ".poise")
    assert len(path.name) == length
    save_project(Project(name="one"), path)
    save_project(Project(name="two"), path)
    assert load_project(path).name == "two"
    assert load_project(backup_path(path)).name == "one"
    assert strays(tmp_path) == []


def test_a_name_that_cannot_encode_saves(tmp_path):
    """A file name holding bytes that are not UTF-8 (surrogate-escaped by Python) still saves."""
    path = tmp_path / os.fsdecode(b"caf\xe9.poise")
    save_project(Project(), path)
    save_project(Project(name="again"), path)
    assert load_project(path).name == "again"


def test_saved_text_is_the_dumped_text(tmp_path):
    path = tmp_path / "a.poise"
    save_project(Project(name="x"), path)
    assert path.read_text(encoding="utf-8") == dumps(Project(name="x"))


def test_a_backup_left_linked_to_the_file_by_a_crash_leaves_no_temporary(tmp_path):
    """A save killed after linking the backup leaves file and backup as one inode; the next save
    must still end with no temporary (rename between two links of one file does nothing)."""
    path = tmp_path / "a.poise"
    save_project(Project(name="one"), path)
    os.link(path, backup_path(path))
    save_project(Project(name="two"), path)
    assert strays(tmp_path) == []
    assert load_project(backup_path(path)).name == "one"
