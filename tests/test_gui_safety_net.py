"""An unexpected error inside the editor saves a recovery copy and says so; the window stays."""

from __future__ import annotations

import sys

from PySide6.QtWidgets import QMessageBox

from app import safety_net
from core.model.fileio import load_project, save_project
from tests.helpers import make_window


def test_an_unexpected_error_saves_the_work_and_keeps_the_window(qtbot, tmp_path, monkeypatch):
    window = make_window(qtbot, tmp_path)
    path = tmp_path / "office.poise"
    save_project(window.document.project, path)
    window.files.open_file(path, confirm=False)
    shown = []
    monkeypatch.setattr(QMessageBox, "critical", lambda parent, title, text: shown.append(text))
    monkeypatch.setattr(sys, "excepthook", sys.excepthook)  # restored after the test
    safety_net.install(window, window.document, window.recovery)
    for _ in range(2):
        try:
            raise RuntimeError("a slot went wrong")
        except RuntimeError:
            sys.excepthook(*sys.exc_info())
    copies = sorted(window.recovery.folder.glob("office.recovered-*.poise"))
    assert len(copies) == 2, "a second error never overwrites the first copy"
    assert all(load_project(c) == window.document.project for c in copies)
    assert not (tmp_path / "office.recovered.poise").exists(), "never beside the user's file"
    assert len(shown) == 2 and "a slot went wrong" in shown[0] and any(str(c) in shown[0] for c in copies)
    assert window.isVisible()
