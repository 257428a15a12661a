"""What first users misread: a figure coloured by another figure's check, drift figures without
saying which drift, and a verdict printed as "0.005 vs 0.005 · fail"."""

from __future__ import annotations

import dataclasses

import pytest

from app.panels.verdicts import storey_state
from app.resources import sample_path
from core.analysis import analyse
from core.lateral.records import Check, Status, Verdict
from core.model.fileio import load_project
from core.model.settings import RuleSet
from core.report.figures import verdict_figures
from tests.helpers import make_window


def _verdict(name: str, value: float, limit: float, status: Status = Status.FAIL) -> Verdict:
    return Verdict(name=Check(name), value=value, limit=limit, status=status, clause="c", storey=1, direction="x", note="")


@pytest.mark.parametrize("stem", ["residential_8_storey_walls", "office_5_storey_braced", "pavilion_1_storey"])
def test_the_torsion_chip_is_coloured_only_by_the_torsion_ratio_check(stem):
    lateral = analyse(load_project(sample_path(stem))).lateral
    for storey in lateral.storeys:
        judged = [v for v in lateral.verdicts if v.storey == storey.storey and v.name is Check.TORSION_RATIO]
        state = storey_state(lateral, storey.storey)
        if not judged:
            assert state.torsion_status is None  # grey: these limits do not judge this figure
        else:
            assert state.torsion_status is max((v.status for v in judged), key=lambda s: list(Status).index(s))


def test_en1998_strip_shows_grey_torsion_chips():
    project = load_project(sample_path("residential_8_storey_walls"))
    project = dataclasses.replace(project, settings=dataclasses.replace(project.settings, rule_set=RuleSet.EN1998))
    lateral = analyse(project).lateral
    assert not any(v.name is Check.TORSION_RATIO for v in lateral.verdicts)
    assert all(storey_state(lateral, s.storey).torsion_status is None for s in lateral.storeys)


def test_a_failing_value_never_reads_the_same_as_its_limit():
    value, limit = verdict_figures(_verdict("storey drift ratio", 0.0050004, 0.005))
    assert value != limit
    value, limit = verdict_figures(_verdict("torsion ratio", 1.40004, 1.4))
    assert value != limit


def test_drift_figures_are_percentages_with_two_decimals_and_mode_numbers_integers():
    assert verdict_figures(_verdict("storey drift ratio", 0.000791, 0.005, Status.PASS)) == ("0.08 %", "0.50 %")
    assert verdict_figures(_verdict("first rotational mode", 3.0, 3.0, Status.PASS)) == ("3", "3")
    assert verdict_figures(_verdict("torsion ratio", 1.234567, 1.2)) == ("1.235", "1.2")


def test_every_drift_figure_on_screen_says_which_drift(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, load_project(sample_path("residential_8_storey_walls")))
    headers = window.tables.storeys.rows_model.headers
    drift_headers = [h for h in headers if "drift" in h]
    assert drift_headers and all("design" in h or "elastic" in h for h in drift_headers)
    tip = window.levels_panel.strip._tooltip(1)
    drift_line = next(line for line in tip.split("<br>") if line.startswith("design drift"))
    assert "%" in drift_line and "elastic" in tip
    board = window.readouts.text()
    drift_lines = [line for line in board.splitlines() if "drift" in line and " vs " in line]
    assert drift_lines and all("%" in line for line in drift_lines)


def test_the_rule_set_setting_has_one_name_everywhere(qtbot, tmp_path):
    from app.panels.properties import project_rows
    from app.sheet.content import sheet_content
    from core.report.figures import CODE_LIMITS
    from core.report.summary import format_summary

    project = load_project(sample_path("residential_8_storey_walls"))
    results = analyse(project)
    labels = [row.label for row in project_rows(project)]
    assert CODE_LIMITS in labels and not any("judge" in label.lower() for label in labels)
    window = make_window(qtbot, tmp_path, project)
    board = window.readouts.text()
    assert f"{CODE_LIMITS} EN 1998-1" in board and "EN1998 limits" not in board
    content = sheet_content(project, results)
    assert f"{CODE_LIMITS}: EN 1998-1." in " ".join(content.assumptions)
    text = format_summary(project, results)
    assert "code limits EN 1998-1" in text and "rule set" not in text


def test_plain_trade_words_on_screen(qtbot, tmp_path, monkeypatch):
    from app.canvas import overlays
    from app.kinds import app_kind
    from core.model import ElementKind

    labels: list[str] = []
    original = overlays._label
    monkeypatch.setattr(overlays, "_label", lambda painter, at, u, text, colour: (labels.append(text),
                                                                                original(painter, at, u, text, colour)))
    window = make_window(qtbot, tmp_path, load_project(sample_path("office_5_storey_braced")))
    window.plan_view.grab()
    assert "CM" in labels and any(text.startswith("CR ") for text in labels)
    assert app_kind(ElementKind.SPRING).label == "Storey spring"
    from app.mode_views.panel import ModeViewsPanel

    panel = window.findChild(ModeViewsPanel)
    qtbot.waitUntil(lambda: bool(panel.plan.getPlotItem().titleLabel.text))
    title = panel.plan.getPlotItem().titleLabel.text
    assert "highlighted" in title and "bold" not in title
