"""DXF exchange: the layout export read back, an architect-style underlay in millimetres, units,
broken files, and the editor actions that import an underlay and trace an outline from it."""

from __future__ import annotations

import math

import ezdxf
import numpy as np
import pytest
from PySide6.QtCore import QSettings

from app.exchange.dxf_export import APP_ID, export_layout_dxf, layer_name
from app.exchange.dxf_underlay import CHORD_TOLERANCE, read_underlay
from app.exchange.errors import ExchangeError, MissingUnitsError
from app.kinds import app_kind
from app.resources import sample_projects
from core.analysis import analyse
from core.model.fileio import load_project

SAMPLES = sample_projects()
TOLERANCE = 1e-6  # m, the acceptance tolerance of the round trip


def _same_ring(a, b, tol: float = TOLERANCE) -> bool:
    """Rings equal up to the starting vertex and the direction of travel."""
    a, b = np.asarray(a, dtype=float), np.asarray(b, dtype=float)
    if a.shape != b.shape:
        return False
    for candidate in (b, b[::-1]):
        for shift in range(len(candidate)):
            if np.allclose(a, np.roll(candidate, shift, axis=0), rtol=0.0, atol=tol):
                return True
    return False


def _matching_segment(segments: np.ndarray, start, end, tol: float = TOLERANCE) -> bool:
    forward = np.abs(segments - np.array([start, end])).max(axis=(1, 2))
    backward = np.abs(segments - np.array([end, start])).max(axis=(1, 2))
    return bool(min(forward.min(), backward.min()) <= tol)


# ---------------------------------------------------------------- export, then read back


@pytest.mark.parametrize("unit", ["m", "mm"])
@pytest.mark.parametrize("path", SAMPLES, ids=lambda p: p.stem)
def test_layout_round_trip_keeps_outlines_and_element_ends(path, unit, tmp_path):
    project = load_project(path)
    results = analyse(project)
    out = tmp_path / "layout.dxf"
    export_layout_dxf(project, out, results, unit=unit)
    underlay = read_underlay(out)
    assert underlay.units == unit and underlay.units_from_header
    layers = np.array(underlay.layers)
    for number, level in enumerate(project.levels, start=1):
        outlines = [c.ring for c in underlay.closed if c.layer == layer_name(number, "OUTLINE")]
        assert len(outlines) == 1 and _same_ring(outlines[0], level.outline)
        openings = [c.ring for c in underlay.closed if c.layer == layer_name(number, "OPENINGS")]
        assert len(openings) == len(level.openings)
        for opening in level.openings:
            assert any(_same_ring(o, opening) for o in openings)
        for element in project.elements_in_storey(number):
            on_layer = underlay.segments[layers == layer_name(number, app_kind(element.kind).dxf_role)]
            assert _matching_segment(on_layer, element.start, element.end), f"{element.id} on level {number}"


def test_exported_lines_carry_their_element_ids(tmp_path):
    project = load_project(SAMPLES[0])
    out = tmp_path / "layout.dxf"
    export_layout_dxf(project, out, analyse(project), levels=(1,))
    doc = ezdxf.readfile(out)
    ids = {line.get_xdata(APP_ID)[0].value for line in doc.modelspace().query("LINE") if line.has_xdata(APP_ID)}
    assert ids == {e.id for e in project.elements_in_storey(1)}
    labels = {t.dxf.text for t in doc.modelspace().query("TEXT")}
    assert ids <= labels and {"CM", "CR"} <= labels
    ours = {layer.dxf.name for layer in doc.layers} - {"0", "Defpoints"}
    roles = ("OUTLINE", "OPENINGS", "BRACED", "WALLS", "MOMENT", "SPRINGS", "CENTRES", "LABELS")
    assert ours == {layer_name(1, role) for role in roles}


def test_centres_are_drawn_where_the_results_put_them(tmp_path):
    project = load_project(SAMPLES[0])
    results = analyse(project)
    out = tmp_path / "layout.dxf"
    export_layout_dxf(project, out, results)
    doc = ezdxf.readfile(out)
    for number, floor in enumerate(results.floors, start=1):
        circles = doc.modelspace().query(f'CIRCLE[layer=="{layer_name(number, "CENTRES")}"]')
        assert len(circles) == 1
        assert tuple(circles[0].dxf.center)[:2] == pytest.approx(floor.centre, abs=TOLERANCE)


def test_export_refuses_unknown_levels_and_units(tmp_path):
    project = load_project(SAMPLES[0])
    with pytest.raises(ExchangeError, match="level 9 does not exist"):
        export_layout_dxf(project, tmp_path / "x.dxf", levels=(9,))
    with pytest.raises(ExchangeError, match="unit"):
        export_layout_dxf(project, tmp_path / "x.dxf", unit="ft")  # type: ignore[arg-type]
    with pytest.raises(ExchangeError, match="cannot write"):
        export_layout_dxf(project, tmp_path / "no" / "folder" / "x.dxf")


# ---------------------------------------------------------------- an architect's drawing in mm


@pytest.fixture
def architect_dxf(tmp_path):
    """An invented 12 m × 8 m plan in millimetres: lines, a closed polyline with one bulged edge,
    an arc, a column block inserted twice (one nested inside a grid block), a hidden layer, text."""
    doc = ezdxf.new("R2010", units=4)  # $INSUNITS 4 = millimetres
    doc.layers.add("A-WALL")
    doc.layers.add("A-HIDDEN").off()
    msp = doc.modelspace()
    msp.add_line((0, 0), (12000, 0), dxfattribs={"layer": "A-WALL"})
    msp.add_line((12000, 0), (12000, 8000), dxfattribs={"layer": "A-WALL"})
    # outline with a bow: the edge from (12000, 8000) to (0, 8000) bulges outwards by 1 m
    chord, sagitta = 12000.0, 1000.0
    bulge = 2 * sagitta / chord
    msp.add_lwpolyline([(0, 0, 0), (12000, 0, 0), (12000, 8000, bulge), (0, 8000, 0)], format="xyb", close=True,
                       dxfattribs={"layer": "A-OUTLINE"})
    msp.add_arc((6000, 4000), 2000, 0, 180, dxfattribs={"layer": "A-STAIR"})
    column = doc.blocks.new("COLUMN")
    column.add_lwpolyline([(-200, -200), (200, -200), (200, 200), (-200, 200)], close=True)
    grid = doc.blocks.new("GRID")
    grid.add_blockref("COLUMN", (0, 0))
    msp.add_blockref("COLUMN", (3000, 2000), dxfattribs={"layer": "S-COLS", "rotation": 45})
    msp.add_blockref("GRID", (9000, 2000), dxfattribs={"layer": "S-COLS"})
    msp.add_line((0, 0), (99000, 99000), dxfattribs={"layer": "A-HIDDEN"})
    msp.add_text("LOBBY", dxfattribs={"layer": "A-TEXT"})
    path = tmp_path / "architect.dxf"
    doc.saveas(path)
    return path, (chord, sagitta)


def test_underlay_in_mm_imports_at_metre_scale(architect_dxf):
    path, _ = architect_dxf
    underlay = read_underlay(path)
    assert underlay.units == "mm" and underlay.metres_per_unit == 0.001 and underlay.units_from_header
    assert underlay.bounds == pytest.approx((0.0, 0.0, 12.0, 9.0), abs=1e-6)  # the bow reaches y = 9 m
    lines = underlay.segments[np.array(underlay.layers) == "A-WALL"]
    assert _matching_segment(lines, (0, 0), (12, 0)) and _matching_segment(lines, (12, 0), (12, 8))
    assert "A-HIDDEN" not in underlay.layers
    assert dict(underlay.skipped) == {"TEXT": 1}


def test_bulged_polyline_becomes_a_ring_with_the_arc_area(architect_dxf):
    path, (chord, sagitta) = architect_dxf
    outline = next(c for c in read_underlay(path).closed if c.layer == "A-OUTLINE")
    # circular segment of chord c and sagitta s: r = (c²/4 + s²)/(2s), area r²(θ − sin θ)/2
    c, s = chord / 1000, sagitta / 1000
    r = (c * c / 4 + s * s) / (2 * s)
    theta = 2 * math.asin(c / (2 * r))
    exact = 12 * 8 + r * r * (theta - math.sin(theta)) / 2
    assert outline.area == pytest.approx(exact, rel=2e-3)  # chords lie inside the arc by ≤ 5 mm
    assert outline.area < exact


def test_arc_is_cut_into_chords_on_the_circle(architect_dxf):
    path, _ = architect_dxf
    underlay = read_underlay(path)
    arc = underlay.segments[np.array(underlay.layers) == "A-STAIR"]
    points = arc.reshape(-1, 2)
    radii = np.hypot(points[:, 0] - 6.0, points[:, 1] - 4.0)
    assert radii == pytest.approx(2.0, abs=1e-3)
    mids = arc.mean(axis=1)
    gap = 2.0 - np.hypot(mids[:, 0] - 6.0, mids[:, 1] - 4.0)
    assert gap.max() <= CHORD_TOLERANCE * 1.01
    assert points[:, 1].min() == pytest.approx(4.0, abs=1e-6)  # 0° to 180°: the upper half only
    assert len(arc) >= 8


def test_blocks_are_flattened_with_their_placement(architect_dxf):
    path, _ = architect_dxf
    columns = [c for c in read_underlay(path).closed if c.layer == "S-COLS"]
    assert len(columns) == 2
    centres = sorted(tuple(np.mean(c.ring, axis=0).round(9)) for c in columns)
    assert centres == [pytest.approx((3.0, 2.0), abs=1e-9), pytest.approx((9.0, 2.0), abs=1e-9)]
    for c in columns:
        assert c.area == pytest.approx(0.16, abs=1e-9)
    rotated = next(c for c in columns if np.mean(c.ring, axis=0)[0] < 5)
    assert max(p[1] for p in rotated.ring) == pytest.approx(2.0 + 0.2 * math.sqrt(2), abs=1e-9)


def test_closed_polylines_come_largest_first(architect_dxf):
    path, _ = architect_dxf
    areas = [c.area for c in read_underlay(path).closed]
    assert areas == sorted(areas, reverse=True)


# ---------------------------------------------------------------- units and bad files


def test_unitless_drawing_asks_for_units_with_a_guess(tmp_path):
    doc = ezdxf.new("R2010", units=0)
    doc.modelspace().add_lwpolyline([(0, 0), (24000, 0), (24000, 15000), (0, 15000)], close=True)
    path = tmp_path / "unitless.dxf"
    doc.saveas(path)
    with pytest.raises(MissingUnitsError) as caught:
        read_underlay(path)
    assert "units" in str(caught.value) and caught.value.suggestion == 0.001
    underlay = read_underlay(path, metres_per_unit=0.001)
    assert underlay.closed[0].area == pytest.approx(24 * 15)
    assert underlay.units == "mm" and not underlay.units_from_header
    with pytest.raises(ExchangeError, match="positive"):
        read_underlay(path, metres_per_unit=-1.0)


@pytest.mark.parametrize(
    ("content", "words"),
    [
        (b"\x00\x01\x02 not a drawing \xff\xfe", "not a readable DXF file"),
        (b"0\nSECTION\n2\nENTITIES\n0\nLINE\n8\n0\n10\nabc\n", "not a readable DXF file"),
        (b"", "not a readable DXF file"),
    ],
    ids=["binary-garbage", "bad-number", "empty"],
)
def test_broken_dxf_gives_one_clear_error(content, words, tmp_path):
    path = tmp_path / "broken.dxf"
    path.write_bytes(content)
    with pytest.raises(ExchangeError) as caught:
        read_underlay(path, metres_per_unit=1.0)
    assert words in str(caught.value) and "broken.dxf" in str(caught.value)
    assert "\n" not in str(caught.value)


def test_missing_file_and_drawing_without_lines(tmp_path):
    with pytest.raises(ExchangeError, match="no such file"):
        read_underlay(tmp_path / "nowhere.dxf")
    doc = ezdxf.new("R2010", units=6)
    doc.modelspace().add_text("only words")
    path = tmp_path / "words.dxf"
    doc.saveas(path)
    with pytest.raises(ExchangeError, match=r"no visible lines.*1 TEXT"):
        read_underlay(path)


def test_shifted_underlay_moves_segments_and_rings(architect_dxf):
    path, _ = architect_dxf
    underlay = read_underlay(path)
    moved = underlay.shifted(-100.0, 50.0)
    assert moved.segments == pytest.approx(underlay.segments + np.array([-100.0, 50.0]))
    assert moved.closed[0].area == pytest.approx(underlay.closed[0].area)
    assert moved.closed[0].ring[0] == pytest.approx((underlay.closed[0].ring[0][0] - 100,
                                                     underlay.closed[0].ring[0][1] + 50))


# ---------------------------------------------------------------- the editor actions


@pytest.fixture
def window(qtbot, tmp_path):
    from app.main_window import MainWindow

    window = MainWindow(settings=QSettings(str(tmp_path / "poise.ini"), QSettings.Format.IniFormat))
    qtbot.addWidget(window)
    window.document.reset(load_project(SAMPLES[0]), SAMPLES[0])
    window.document.flush_analysis()
    return window


def test_import_underlay_then_trace_outline_is_one_undo_step(window, architect_dxf, monkeypatch):
    path, _ = architect_dxf
    document = window.document
    monkeypatch.setattr("app.exchange.actions.QMessageBox.question", lambda *a, **k: pytest.fail("not far away"))
    underlay = window.exchange.import_underlay_from(path)
    level = document.current_level
    assert len(document.underlay(level)) == len(underlay.segments)
    before = document.project
    largest = window.exchange.closed_polylines(level)[0]
    assert largest.layer == "A-OUTLINE"
    window.exchange.use_as_outline(largest)
    assert document.project.levels[level - 1].outline == largest.ring
    document.undo_stack.undo()
    assert document.project == before


def test_far_away_drawing_is_offered_a_move_to_the_plan(window, tmp_path, monkeypatch):
    doc = ezdxf.new("R2010", units=6)
    doc.modelspace().add_lwpolyline([(500000, 200000), (500010, 200000), (500010, 200005)], close=True)
    path = tmp_path / "survey.dxf"
    doc.saveas(path)
    from PySide6.QtWidgets import QMessageBox

    monkeypatch.setattr("app.exchange.actions.QMessageBox.question",
                        lambda *a, **k: QMessageBox.StandardButton.Yes)
    underlay = window.exchange.import_underlay_from(path)
    outline = window.document.project.levels[0].outline
    assert underlay.bounds[:2] == pytest.approx((min(p[0] for p in outline), min(p[1] for p in outline)))


def test_unitless_import_asks_and_cancel_leaves_no_underlay(window, tmp_path, monkeypatch):
    doc = ezdxf.new("R2010", units=0)
    doc.modelspace().add_line((0, 0), (30000, 0))
    path = tmp_path / "unitless.dxf"
    doc.saveas(path)
    asked = []

    def answer(parent, title, question, items, current, editable):
        asked.append((items[current], question))
        return items[current], bool(len(asked) > 1)

    monkeypatch.setattr("app.exchange.actions.QInputDialog.getItem", answer)
    assert window.exchange.import_underlay_from(path) is None
    assert window.document.underlay(window.document.current_level) == []
    underlay = window.exchange.import_underlay_from(path)
    assert asked[0][0].startswith("mm") and "units" in asked[0][1]
    assert underlay.segments.max() == pytest.approx(30.0)


def test_broken_dxf_from_the_menu_is_a_message_box(window, tmp_path, monkeypatch):
    path = tmp_path / "broken.dxf"
    path.write_bytes(b"\x00garbage")
    shown = []
    monkeypatch.setattr("app.exchange.actions.QFileDialog.getOpenFileName", lambda *a, **k: (str(path), ""))
    monkeypatch.setattr("app.exchange.actions.QMessageBox.warning", lambda *a: shown.append(a[2]))
    window.exchange.underlay_action.trigger()
    assert len(shown) == 1 and "broken.dxf" in shown[0] and "not a readable DXF file" in shown[0]
    window.exchange.trace_action.trigger()
    assert "no underlay" in shown[1]


def test_export_dxf_action_writes_every_level(window, tmp_path):
    out = tmp_path / "layout.dxf"
    window.exchange.export_dxf_to(out)
    layers = {layer.dxf.name for layer in ezdxf.readfile(out).layers}
    count = len(window.document.project.levels)
    assert {layer_name(n, "OUTLINE") for n in range(1, count + 1)} <= layers
