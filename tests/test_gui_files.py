"""Files from the editor: save and reopen, bad files, unsaved-work prompts, recent files, layout."""

from __future__ import annotations

import json

import pytest
from PySide6.QtCore import QSettings

from app.main_window import MainWindow
from app.resources import sample_path
from core.model import Project
from core.model.fileio import load_project
from tests.helpers import balanced_box, drag, make_window, settle


@pytest.fixture
def window(qtbot, tmp_path):
    return make_window(qtbot, tmp_path, balanced_box())


@pytest.fixture
def problems(window, monkeypatch):
    """Messages the window would show in a message box."""
    shown: list[tuple[str, str]] = []
    monkeypatch.setattr(window.files, "show_problem", lambda title, text: shown.append((title, text)))
    return shown


def test_save_then_reopen_gives_the_same_project(window, tmp_path, qtbot):
    drag(window, (0.0, 9.0), (3.0, 9.0))
    edited = window.document.project
    path = tmp_path / "box.poise"
    assert window.files.save_as(path)
    assert not window.isWindowModified() and "box.poise" in window.windowTitle()
    assert load_project(path) == edited
    window.close()  # it holds the file's lock while open (tests/test_gui_recovery.py)
    other = make_window(qtbot, tmp_path / "..", None)
    assert other.files.open_file(path, confirm=False)
    assert other.document.project == edited
    assert other.document.file_path == path


def test_save_again_keeps_a_backup(window, tmp_path):
    path = tmp_path / "box.poise"
    window.files.save_as(path)
    window.document.select(["B1"])
    window.edits.delete_action.trigger()
    assert window.files.save()
    assert (tmp_path / "box.poise.bak").exists()
    assert len(load_project(path).elements) == 3


@pytest.mark.parametrize(
    "text, expected",
    [
        ("{ not json", "not valid JSON"),
        (json.dumps({"format": "something-else"}), ""),
        ("", "JSON"),
    ],
)
def test_a_bad_file_gives_a_message_and_keeps_the_work(window, problems, tmp_path, text, expected):
    before = window.document.project
    path = tmp_path / "bad.poise"
    path.write_text(text, encoding="utf-8")
    assert not window.files.open_file(path, confirm=False)
    assert window.document.project == before
    assert len(problems) == 1 and expected in problems[0][1]


def test_a_file_with_an_invalid_field_names_the_field(window, problems, tmp_path):
    document = json.loads((sample_path("pavilion_1_storey")).read_text(encoding="utf-8"))
    document["levels"][0]["height"] = -3
    path = tmp_path / "negative.poise"
    path.write_text(json.dumps(document), encoding="utf-8")
    window.files.open_file(path, confirm=False)
    assert "levels[0].height" in problems[0][1]


def test_a_missing_file_and_an_unwritable_place_give_messages(window, problems, tmp_path):
    assert not window.files.open_file(tmp_path / "nowhere.poise", confirm=False)
    assert not window.files.save_as(tmp_path / "no-such-folder" / "x.poise")
    assert len(problems) == 2


def test_unsaved_work_is_not_lost_without_asking(window, tmp_path):
    window.document.select(["B1"])
    window.edits.delete_action.trigger()
    edited = window.document.project
    asked = []

    def answer(reply):
        def ask():
            asked.append(reply)
            return reply

        return ask

    window.files.ask_unsaved = answer("cancel")
    window.files.new_project()
    assert window.document.project == edited
    window.files.ask_unsaved = answer("discard")
    window.files.new_project()
    assert window.document.project == Project()
    assert asked == ["cancel", "discard"]
    # Unmodified work is replaced without a question.
    window.files.ask_unsaved = answer("cancel")
    window.files.open_sample(sample_path("pavilion_1_storey"))
    assert asked == ["cancel", "discard"]
    assert window.document.file_path is None, "a sample opens as an unsaved copy"


def test_closing_with_unsaved_work_can_be_cancelled(window):
    window.document.select(["B1"])
    window.edits.delete_action.trigger()
    window.files.ask_unsaved = lambda: "cancel"
    assert not window.close()
    assert window.isVisible()
    window.files.ask_unsaved = lambda: "discard"
    assert window.close()


def test_recent_files_and_layout_are_remembered(window, tmp_path, qtbot):
    path = tmp_path / "box.poise"
    window.files.save_as(path)
    window.tables_dock.hide()
    window.tool_options.grid.setValue(0.5)
    window.save_settings()
    settings = QSettings(str(tmp_path / "poise-test.ini"), QSettings.Format.IniFormat)
    assert settings.value("recent_files", [], type=list) == [str(path.resolve())]
    again = MainWindow(settings=settings)
    qtbot.addWidget(again)
    again.show()
    settle(again)
    assert again.files.recent.paths() == [str(path.resolve())]
    assert not again.tables_dock.isVisible()
    assert again.plan_view.grid_spacing == 0.5


def test_views_show_only_the_current_document_after_new_open_and_delete(qtbot, tmp_path):
    """No old project's modes after File › New, no snap label naming a deleted element, no
    "Saved …" after opening another file."""

    from app.canvas.snapping import Snap, SnapKind
    from app.mode_views.panel import ModeViewsPanel
    from app.resources import sample_path
    from core.model.fileio import load_project
    from tests.helpers import make_window, settle

    window = make_window(qtbot, tmp_path, load_project(sample_path("office_5_storey_braced")))
    panel = window.findChild(ModeViewsPanel)
    panel.set_on_screen(True)
    settle(window)
    assert panel.mode_box.count() > 0
    window.status.show_snap(Snap((0.0, 0.0), SnapKind.END, "end of B1"))
    window.document.select(["B1"])
    window.edits.delete_action.trigger()
    settle(window)
    assert "B1" not in window.status.snap.text()
    assert window.files.save_as(tmp_path / "a.poise")
    assert window.status.hint.text().startswith("Saved")
    assert window.files.open_file(sample_path("pavilion_1_storey"), confirm=False)
    settle(window)
    assert not window.status.hint.text().startswith("Saved")
    window.files.new_project()
    settle(window)
    assert panel.mode_box.count() == 0 and panel.floor_box.count() == 0
