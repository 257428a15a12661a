"""Continuous lines in the editor: an edit that stacks a piece on a line joins it in the same undo
step, a file holding stacked pieces opens joined, and a transfer is marked on the plan."""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

from core.lateral.records import Check
from core.model import Element, Level, Project, ShearWall
from core.model.fileio import save_project
from tests.helpers import RECTANGLE_36_18, balanced_box, make_window, settle

SCREENSHOTS = Path(__file__).parent / "screenshots"


def four_storeys(*extra: Element) -> Project:
    box = balanced_box()
    levels = tuple(Level(f"L{j}", 3.5, RECTANGLE_36_18) for j in (1, 2, 3, 4))
    elements = tuple(replace(e, top=4) for e in box.elements)
    return replace(box, levels=levels, elements=(*elements, *extra))


LOWER = Element("W1", (6.0, 9.0), (12.0, 9.0), 0, 2, ShearWall(thickness=0.3))
UPPER = Element("W2", (12.0, 9.0), (6.0, 9.0), 2, 4, ShearWall(thickness=0.2))


def test_an_edit_that_stacks_a_piece_joins_it_in_the_same_undo_step(qtbot, tmp_path):
    window = make_window(qtbot, tmp_path, four_storeys(LOWER))
    document = window.document
    document.apply(replace(document.project, elements=(*document.project.elements, UPPER)), "Add W2")
    document.select(["W2"])  # as a placing tool selects what it placed
    settle(window)
    wall = document.project.element("W1")
    assert (wall.bottom, wall.top) == (0, 4) and "W2" not in {e.id for e in document.project.elements}
    assert [s.thickness for s in wall.properties.storeys] == [0.3, 0.3, 0.2, 0.2]
    assert document.selection == ("W1",)
    assert document.undo_stack.count() == 1
    document.undo_stack.undo()
    settle(window)
    assert [e.id for e in document.project.elements][-1] == "W1"
    assert document.project.element("W1").top == 2


def test_a_file_with_stacked_pieces_opens_joined_as_one_undo_step(qtbot, tmp_path):
    path = tmp_path / "stacked.poise"
    save_project(four_storeys(LOWER, UPPER), path)
    window = make_window(qtbot, tmp_path)
    window.document.open(path)
    settle(window)
    assert window.document.project.element("W1").top == 4
    assert window.document.undo_stack.undoText() == "Join stacked elements (W2 into W1)"


def test_a_transfer_is_marked_on_the_plan_and_warned_in_the_checks(qtbot, tmp_path):
    standing = Element("W9", (20.0, 9.0), (26.0, 9.0), 2, 4, ShearWall())
    window = make_window(qtbot, tmp_path, four_storeys(standing))
    window.document.set_current_level(3)
    settle(window)
    items = window.plan_view.scene().element_items
    assert items["W9"].transfer and not items["B1"].transfer
    (verdict,) = [v for v in window.document.results.lateral.verdicts if v.name is Check.CONTINUITY]
    assert "W9 starts on L2 with nothing beneath it" in verdict.note
    SCREENSHOTS.mkdir(exist_ok=True)
    assert window.plan_view.grab().save(str(SCREENSHOTS / "transfer_mark.png"))


def test_the_sheet_lists_a_transfer(qapp, tmp_path):
    """The warning reaches the printed page (its building checks), naming element and level."""
    import subprocess

    from pypdf import PdfReader

    from app.sheet.pdf import export_sheet_pdf
    from core.analysis import analyse

    project = four_storeys(Element("W9", (20.0, 9.0), (26.0, 9.0), 2, 4, ShearWall()))
    out = tmp_path / "transfer.pdf"
    content = export_sheet_pdf(project, analyse(project), out)
    assert any("W9 starts on L2 with nothing beneath it" in c.text for c in content.building_checks)
    text = " ".join(page.extract_text() for page in PdfReader(out).pages).replace("\n", " ")
    assert "W9 starts on L2" in " ".join(text.split())
    SCREENSHOTS.mkdir(exist_ok=True)
    subprocess.run(["pdftoppm", "-png", "-r", "70", "-singlefile", str(out), str(SCREENSHOTS / "transfer_sheet")],
                   check=False)  # fmt: skip
