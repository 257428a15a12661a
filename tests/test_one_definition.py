"""One concept, one definition: the caution text, the mode-kind words and the centre marks are each
defined once and used by the canvas, the mode views, the tables, the sheet and the DXF."""

from __future__ import annotations

from pathlib import Path

import pytest
from PySide6.QtWidgets import QLabel

from app.resources import sample_path
from core.model.fileio import load_project
from core.report.summary import CAUTION
from tests.helpers import make_window

ROOT = Path(__file__).resolve().parents[1]


def _sources() -> list[Path]:
    return [p for p in (ROOT / "app").rglob("*.py")] + [p for p in (ROOT / "core").rglob("*.py")]


def test_the_caution_is_written_once_and_every_view_shows_that_text(qtbot, tmp_path):
    written = [p for p in _sources() if "defer to a licensed" in p.read_text() or "Concept-stage estimate" in p.read_text()]
    assert [p.relative_to(ROOT).as_posix() for p in written] == ["core/report/summary.py"]
    window = make_window(qtbot, tmp_path, load_project(sample_path("office_5_storey_braced")))
    cautions = [label.text() for label in window.findChildren(QLabel) if "licensed" in label.text()]
    assert len(cautions) >= 3 and set(cautions) == {CAUTION}
    assert "rigid-floor" in CAUTION
    assert CAUTION in " ".join((ROOT / "README.md").read_text().split())


def test_mode_kind_words_come_from_one_table(qtbot, tmp_path):
    from app.mode_views.palette import mode_label
    from app.panels.results import mode_type
    from core.report.figures import MODE_KIND_WORDS
    from core.results import ModeKind

    tables = [p for p in _sources() if '"x translation"' in p.read_text()]
    assert [p.relative_to(ROOT).as_posix() for p in tables] == ["core/report/figures.py"]
    window = make_window(qtbot, tmp_path, load_project(sample_path("office_5_storey_braced")))
    for mode in window.document.results.modes:
        if mode.kind is not ModeKind.MIXED:
            assert mode_type(mode) == MODE_KIND_WORDS[mode.kind]
            assert mode_label(mode).endswith(MODE_KIND_WORDS[mode.kind])


def test_centre_marks_are_one_painter_on_canvas_and_sheet(qtbot, tmp_path, monkeypatch):
    """The canvas and the sheet paint the centres through app.canvas.centre_marks, whose shapes are
    core.report.mode_frames' segments (the ones the mode views animate and the DXF writes)."""
    from app.canvas import centre_marks, overlays
    from app.sheet import plan_drawing
    from app.sheet.pdf import export_sheet_pdf

    drawn: list[str] = []

    def spy(painter, which, *args):
        drawn.append(which)
        centre_marks.draw_centre_mark(painter, which, *args)

    for module in (overlays, plan_drawing):
        monkeypatch.setattr(module, "draw_centre_mark", spy)
    window = make_window(qtbot, tmp_path, load_project(sample_path("office_5_storey_braced")))
    window.plan_view.grab()
    assert {"mass", "rigidity"} <= set(drawn)
    drawn.clear()
    project = window.document.project
    export_sheet_pdf(project, window.document.results, tmp_path / "s.pdf")
    assert {"mass", "rigidity"} <= set(drawn)


def test_dxf_centre_marks_are_the_core_segments(tmp_path):
    import ezdxf
    import numpy as np

    from app.exchange.dxf_export import SYMBOL_RADIUS, export_layout_dxf
    from core.analysis import analyse
    from core.report.mode_frames import mass_centre_symbol, rigidity_centre_symbol

    project = load_project(sample_path("pavilion_1_storey"))
    results = analyse(project)
    export_layout_dxf(project, tmp_path / "p.dxf", results)
    doc = ezdxf.readfile(tmp_path / "p.dxf")
    lines = [e for e in doc.modelspace() if "CENTRES" in e.dxf.layer and e.dxftype() == "LINE"]
    ends = np.array([[e.dxf.start.x, e.dxf.start.y, e.dxf.end.x, e.dxf.end.y] for e in lines])
    marks = [mass_centre_symbol(results.floors[0].centre, SYMBOL_RADIUS)[-4:].reshape(-1, 4),
             rigidity_centre_symbol(results.lateral.storey(1).rigidity_centre, SYMBOL_RADIUS).reshape(-1, 4)]
    (circle,) = [e for e in doc.modelspace() if "CENTRES" in e.dxf.layer and e.dxftype() == "CIRCLE"]
    assert circle.dxf.radius == pytest.approx(SYMBOL_RADIUS)
    for segment in np.concatenate(marks):
        assert np.min(np.abs(ends - segment).max(axis=1)) == pytest.approx(0.0, abs=1e-6)
