"""Live results while editing: readouts and overlays follow every mouse move of a drag, agree with
``core.analysis.analyse`` on the same layout, and an unstable layout shows its diagnostic."""

from __future__ import annotations

import pytest

from app.panels.results import mode_type
from app.resources import sample_path
from core.analysis import analyse
from core.errors import AnalysisError
from core.model.edits import move_elements
from core.model.fileio import load_project
from tests.helpers import drag, frame, make_window, one_storey, settle


@pytest.fixture
def office(qtbot, tmp_path):
    """The unbalanced 5-storey braced office: its frames sit toward the left (−x) of the plate."""
    return make_window(qtbot, tmp_path, load_project(sample_path("office_5_storey_braced")))


def worst_torsion(project):
    lateral = analyse(project).lateral
    return lateral.worst_torsion_ratio("x"), lateral.worst_torsion_ratio("y")


def test_dragging_a_frame_toward_balance_lowers_the_torsion_readout_as_the_core_predicts(office):
    document = office.document
    start = document.project
    before = office.readouts.torsion_values()
    assert before == pytest.approx(worst_torsion(start))

    # B2 runs along x = 12 from y = 6 to 12; drag its middle 9 m toward the mass centre (x ≈ 18).
    drag(office, (12.0, 9.0), (16.0, 9.0), steps=4, release=False)
    halfway = office.readouts.torsion_values()
    assert document.previewing and document.undo_stack.count() == 0, "a drag in progress is not an edit yet"
    assert document.shown_project.element("B2").start == (16.0, 6.0)
    assert halfway == pytest.approx(worst_torsion(move_elements(start, ["B2"], 4.0, 0.0)))

    drag(office, (16.0, 9.0), (21.0, 9.0), steps=4, press=False)
    after = office.readouts.torsion_values()
    predicted = worst_torsion(move_elements(start, ["B2"], 9.0, 0.0))
    assert document.project.element("B2").start == (21.0, 6.0)
    assert after == pytest.approx(predicted)
    # The core predicts less twist under the y load as the frame moves under the mass centre …
    assert predicted[1] < worst_torsion(start)[1]
    # … and the readout went the same way, through the halfway value.
    assert after[1] < halfway[1] < before[1]
    assert document.undo_stack.count() == 1, "the whole drag is one undo step"


def test_overlays_show_the_core_centres_and_move_with_the_frame(office):
    scene = office.scene
    lateral = office.document.results.lateral
    data = scene.overlay.data
    assert data.mass_centre == pytest.approx(lateral.storey(1).mass_centre)
    assert data.rigidity_centre == pytest.approx(lateral.storey(1).rigidity_centre)
    assert data.accidental == pytest.approx(tuple(lateral.accidental_eccentricity[0][::-1]))
    x_before = data.rigidity_centre[0]
    drag(office, (12.0, 9.0), (18.0, 9.0), steps=3, release=False)
    assert scene.overlay.data.rigidity_centre[0] > x_before
    office.plan_view.tool.cancel()
    settle(office)
    assert scene.overlay.data.rigidity_centre[0] == pytest.approx(x_before)
    assert office.document.undo_stack.count() == 0


def test_readouts_show_three_periods_with_their_type_and_a_line_per_check(office):
    results = office.document.results
    text = office.readouts.text()
    for mode in results.modes[:3]:
        assert f"T{mode.number} {mode.period:.3f} s {mode_type(mode)}" in text
    for name in {v.name for v in results.lateral.verdicts}:
        assert name in text
    assert "licensed engineer" in office.readouts.caution.text()


def test_an_unstable_layout_shows_its_diagnostic_on_the_canvas(qtbot, tmp_path):
    # Two parallel frames in y and nothing in x: the floor slides freely along x.
    project = one_storey((frame("B1", (0.0, 6.0), (0.0, 12.0)), frame("B2", (36.0, 6.0), (36.0, 12.0))))
    with pytest.raises(AnalysisError) as raised:
        analyse(project)
    window = make_window(qtbot, tmp_path, project)
    text = window.plan_view.diagnostic_text()
    assert text is not None and raised.value.message in text
    # The banner sits in a strip above the plan: the plan's viewport starts below it.
    banner = window.plan_view.banner
    assert banner.isVisible() and raised.value.message in banner.text()
    assert window.plan_view.viewport().geometry().top() >= banner.geometry().bottom()
    if raised.value.levels:
        assert "Level 1" in text
    assert window.readouts.torsion_values() is None
    assert "Cannot analyse" in window.readouts.text() and raised.value.message in window.readouts.text()
    assert window.scene.overlay.data is None
    for element_id in raised.value.elements:
        assert window.scene.element_items[element_id].culprit
    assert window.status.analysis.text().startswith("Unstable")

    # Adding a frame in x makes it stable again, and the diagnostic goes away.
    window.drawing.set_tool("place-braced_frame")
    drag(window, (15.0, 0.0), (21.0, 0.0))
    assert window.plan_view.diagnostic_text() is None
    assert not window.plan_view.banner.isVisible()
    assert window.plan_view.viewport().geometry().top() == 0
    assert window.readouts.torsion_values() is not None


def test_an_empty_project_asks_for_an_outline(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path)
    settle(window)
    assert "outline" in window.plan_view.diagnostic_text()
