"""The editor keeps the user's work: autosave after edits, the offer to restore after a crash, one
writer per file, and a warning before overwriting a file that changed on disk."""

from __future__ import annotations

import dataclasses
import os

from app.recovery import RecoveryStore
from core.model.fileio import load_project, save_project
from tests.helpers import balanced_box, make_window
from tests.test_recovery_store import crash


def renamed(window, name: str) -> None:
    document = window.document
    document.apply(dataclasses.replace(document.project, name=name), f"rename to {name}")


def copies(window) -> list:
    return sorted(window.recovery.folder.glob("*.autosave-*.poise"))


def opened(qtbot, tmp_path, name: str = "office.poise"):
    path = tmp_path / name
    if not path.exists():
        save_project(balanced_box(), path)
    window = make_window(qtbot, tmp_path)
    assert window.files.open_file(path, confirm=False)
    return window, path


def test_autosave_writes_after_edits_and_on_its_timer_never_beside_the_file(qtbot, tmp_path):
    window, _ = opened(qtbot, tmp_path)
    autosave = window.files.autosave
    for n in range(autosave.edits - 1):
        renamed(window, f"edit {n}")
    assert copies(window) == []
    renamed(window, "edit last")
    [copy] = copies(window)
    assert load_project(copy).name == "edit last"
    autosave.timer.setInterval(20)
    renamed(window, "after the timer")
    qtbot.waitUntil(lambda: load_project(copy).name == "after the timer", timeout=15000)
    assert sorted(p.name for p in tmp_path.glob("office*")) == ["office.poise"]
    window.files.save()
    assert copies(window) == [], "saved work needs no copy"


def test_a_restart_offers_the_work_a_crashed_session_left(qtbot, tmp_path):
    first, path = opened(qtbot, tmp_path)
    renamed(first, "unsaved rename")
    first.files.autosave.write_now()
    crash(first.recovery)
    second = make_window(qtbot, tmp_path)
    asked, compared = [], []

    def answer(copy, can_restore):
        asked.append(copy.original)
        return "compare" if len(asked) == 1 else "restore"

    second.files.ask_recovery = answer
    second.files.show_difference = lambda copy: compared.append(copy)
    assert second.files.offer_recovery()
    assert asked == [path, path] and len(compared) == 1
    assert second.document.project.name == "unsaved rename"
    assert second.document.file_path == path and second.document.is_modified
    second.document.undo_stack.undo()
    assert second.document.project == load_project(path)
    assert RecoveryStore(second.recovery.folder).leftovers() == []


def test_a_leftover_can_be_discarded(qtbot, tmp_path):
    first, _ = opened(qtbot, tmp_path)
    renamed(first, "let go")
    first.files.autosave.write_now()
    crash(first.recovery)
    second = make_window(qtbot, tmp_path)
    second.files.ask_recovery = lambda copy, can_restore: "discard"
    assert not second.files.offer_recovery()
    assert RecoveryStore(second.recovery.folder).leftovers() == []


def test_two_windows_on_one_file_get_the_lock_prompt(qtbot, tmp_path):
    first, path = opened(qtbot, tmp_path)
    second = make_window(qtbot, tmp_path)
    prompts = []

    def in_use(p, holder):
        prompts.append((p, holder.pid))
        return "read-only"

    second.files.ask_in_use = in_use
    assert second.files.open_file(path, confirm=False)
    assert prompts == [(path, os.getpid())]
    assert second.files.guard.read_only
    save_as = []
    second.files.save_as = lambda p=None: save_as.append(p) or False
    renamed(second, "second's edit")
    assert not second.files.save() and save_as == [None], "a read-only window saves under a new name"
    assert load_project(path) == balanced_box()
    first.close()
    third = make_window(qtbot, tmp_path)
    third.files.ask_in_use = in_use
    assert third.files.open_file(path, confirm=False) and len(prompts) == 1, "no prompt once it is free"


def test_a_file_changed_on_disk_is_not_overwritten_without_asking(qtbot, tmp_path):
    window, path = opened(qtbot, tmp_path)
    renamed(window, "mine")
    save_project(dataclasses.replace(balanced_box(), name="theirs"), path)
    asked = []
    window.files.ask_overwrite_changed = lambda p: asked.append(p) or False
    assert not window.files.save()
    assert asked == [path] and load_project(path).name == "theirs"
    window.files.ask_overwrite_changed = lambda p: asked.append(p) or True
    assert window.files.save()
    assert load_project(path).name == "mine" and len(asked) == 2
    renamed(window, "mine again")
    assert window.files.save() and len(asked) == 2, "our own save is not a change on disk"


def test_a_read_only_file_is_overwritten_only_when_the_user_says_so(qtbot, tmp_path):
    window, path = opened(qtbot, tmp_path)
    os.chmod(path, 0o444)
    renamed(window, "mine")
    answers = [False, True]
    window.files.ask_overwrite_read_only = lambda p: answers.pop(0)
    assert not window.files.save() and load_project(path) == balanced_box()
    assert window.files.save() and load_project(path).name == "mine"
