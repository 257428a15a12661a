"""The one-page plan sheet: the CLI on every sample, what the PDF's text layer holds, the page
layout staying inside its margins, the level choice, the sheet's content, printing and PNG export."""

from __future__ import annotations

import dataclasses
import math
import shutil
import subprocess

import numpy as np
import pyqtgraph as pg
import pytest
from pypdf import PdfReader
from PySide6.QtCore import QRectF, QSettings, Qt
from PySide6.QtGui import QColor, QImage, QPainter
from PySide6.QtPrintSupport import QPrinter
from PySide6.QtWidgets import QGraphicsScene, QGraphicsView

from app.cli import main
from app.exchange.png_export import export_png
from app.resources import sample_projects
from app.sheet.content import listed_modes, period_text, sheet_content, worst_torsion_level
from app.sheet.options import SheetOptions
from app.sheet.pdf import export_sheet_pdf, page_layout
from app.sheet.render import render_sheet
from core.analysis import analyse
from core.lateral.records import STATUS_ORDER
from core.model import Element, Level, Project, ShearWall
from core.model.fileio import load_project
from core.report.summary import CAUTION

SAMPLES = sample_projects()
MM_PER_POINT = 25.4 / 72


def _words(text: str) -> str:
    return " ".join(text.split())


def pdf_text(path) -> str:
    """The text layer of a one-page PDF, whitespace folded (pdftotext when installed, else pypdf)."""
    if shutil.which("pdftotext"):
        out = subprocess.run(["pdftotext", str(path), "-"], capture_output=True, text=True, check=True).stdout
        return _words(out)
    return _words(PdfReader(path).pages[0].extract_text())


@pytest.fixture(scope="module")
def analysed():
    """Each sample project with its results, analysed once for the module."""
    return {path.stem: (load_project(path), analyse(load_project(path))) for path in SAMPLES}


def _tower(storeys: int) -> Project:
    """An invented 30 m × 20 m wall building, for pages that must give way to a tall checks table."""
    outline = ((0.0, 0.0), (30.0, 0.0), (30.0, 20.0), (0.0, 20.0))
    levels = tuple(Level(f"Level {j}", 3.5, outline) for j in range(1, storeys + 1))
    walls = {"W1": ((0, 2), (0, 12)), "W2": ((30, 4), (30, 16)), "W3": ((2, 0), (12, 0)), "W4": ((10, 20), (24, 20))}
    elements = tuple(Element(i, a, b, 0, storeys, ShearWall(thickness=0.3)) for i, (a, b) in walls.items())
    return Project(name="Test tower", job_number="T-1", engineer="Tester", levels=levels, elements=elements)


# ---------------------------------------------------------------- the command line


@pytest.mark.parametrize("path", SAMPLES, ids=lambda p: p.stem)
def test_cli_writes_one_page_pdf_with_name_periods_and_caution(path, tmp_path, qapp, capsys):
    out = tmp_path / f"{path.stem}.pdf"
    assert main(["sheet", str(path), "-o", str(out)]) == 0
    assert "wrote" in capsys.readouterr().out
    reader = PdfReader(out)
    assert len(reader.pages) == 1
    width_mm, height_mm = (float(v) * MM_PER_POINT for v in reader.pages[0].mediabox[2:])
    assert (width_mm, height_mm) == pytest.approx((210, 297), abs=0.5)  # A4 portrait by default
    project = load_project(path)
    results = analyse(project)
    text = pdf_text(out)
    assert project.name in text
    assert CAUTION in text
    shown = export_sheet_pdf(project, results, tmp_path / "again.pdf")  # the same page, to learn what it lists
    assert len(shown.modes) >= min(3, len(results.modes))
    for mode in (*shown.modes, *shown.sketched):
        assert f"{period_text(mode.period)}" in text, f"period of mode {mode.number} missing"
        assert mode.period == results.modes[mode.number - 1].period


@pytest.mark.parametrize(
    ("paper", "landscape", "size_mm"),
    [("a4", True, (297, 210)), ("letter", False, (215.9, 279.4)), ("letter", True, (279.4, 215.9))],
)
def test_cli_paper_and_orientation(paper, landscape, size_mm, tmp_path, qapp):
    out = tmp_path / "sheet.pdf"
    argv = ["sheet", str(SAMPLES[0]), "-o", str(out), "--paper", paper] + (["--landscape"] if landscape else [])
    assert main(argv) == 0
    page = PdfReader(out).pages[0]
    assert tuple(float(v) * MM_PER_POINT for v in page.mediabox[2:]) == pytest.approx(size_mm, abs=0.5)


def test_cli_level_option_draws_that_level(tmp_path, qapp, analysed):
    path = next(p for p in SAMPLES if p.stem == "residential_8_storey_walls")
    out = tmp_path / "sheet.pdf"
    assert main(["sheet", str(path), "-o", str(out), "--level", "5", "--revision", "P2"]) == 0
    text = pdf_text(out)
    project, _ = analysed[path.stem]
    assert f"Plan of level 5 · {project.levels[4].name}" in text
    assert "P2" in text


@pytest.mark.parametrize(
    ("argv", "words"),
    [
        (["sheet", "missing.poise", "-o", "{tmp}/x.pdf"], "missing.poise"),
        (["sheet", "{sample}", "-o", "{tmp}/x.pdf", "--level", "0"], "level 0 does not exist"),
        (["sheet", "{sample}", "-o", "{tmp}/x.pdf", "--level", "99"], "level 99 does not exist"),
        (["sheet", "{sample}", "-o", "{tmp}/no/such/folder/x.pdf"], "No such file"),
    ],
)
def test_cli_bad_input_exits_2_with_one_line(argv, words, tmp_path, qapp, capsys):
    argv = [a.format(sample=SAMPLES[0], tmp=tmp_path) for a in argv]
    assert main(argv) == 2
    err = capsys.readouterr().err.strip()
    assert words in err
    assert "\n" not in err and "Traceback" not in err
    assert not (tmp_path / "x.pdf").exists()


def test_cli_refuses_a_broken_project_file(tmp_path, qapp, capsys):
    broken = tmp_path / "broken.poise"
    broken.write_text('{"format": "poise-project", "version": 1, "levels": [', encoding="utf-8")
    assert main(["sheet", str(broken), "-o", str(tmp_path / "x.pdf")]) == 2
    assert capsys.readouterr().err.startswith("poise sheet:")
    assert not (tmp_path / "x.pdf").exists() or (tmp_path / "x.pdf").stat().st_size == 0


# ---------------------------------------------------------------- what the page shows


def test_default_level_is_the_worst_torsion_ratio(analysed):
    for project, results in analysed.values():
        ratios = [max(s.torsion_ratio) for s in results.lateral.storeys]
        expected = int(np.argmax(ratios)) + 1
        assert worst_torsion_level(results)[0] == expected
        assert sheet_content(project, results).level == expected


def test_modes_listed_reach_ninety_percent_or_all(analysed):
    """EN 1998-1 §4.3.3.3.1(3): modes summing to at least 90 % of the mass in each direction."""
    for _, results in analysed.values():
        listed = listed_modes(results.modes)
        assert len(listed) >= min(3, len(results.modes))
        last = listed[-1]
        if len(listed) < len(results.modes):
            assert last.cumulative[0] >= 0.9 and last.cumulative[1] >= 0.9
            before = results.modes[len(listed) - 2]
            assert len(listed) == 3 or before.cumulative[0] < 0.9 or before.cumulative[1] < 0.9
        assert listed_modes(results.modes, capacity=2) == results.modes[:2]


def test_checks_table_holds_every_storey_verdict_at_its_worst(analysed):
    for project, results in analysed.values():
        content = sheet_content(project, results)
        verdicts = [v for v in results.lateral.verdicts if v.storey is not None]
        keys = {(v.name, v.direction) for v in verdicts}
        assert {(c.name, c.direction) for c in content.columns} == keys
        assert [r.storey for r in content.rows] == sorted({f.level for f in results.floors}, reverse=True)
        for row in content.rows:
            for column, cell in zip(content.columns, row.cells, strict=True):
                mine = [v for v in verdicts if v.storey == row.storey and (v.name, v.direction) ==
                        (column.name, column.direction)]
                if not mine:
                    assert cell is None
                    continue
                worst = max(mine, key=lambda v: STATUS_ORDER[v.status])
                assert (cell.value, cell.status) == (worst.value, worst.status)
                assert any(worst.clause in content.clauses[int(n) - 1] for n in column.clauses)
        whole = [v for v in results.lateral.verdicts if v.storey is None]
        assert len(content.building_checks) == len(whole)


def test_assumptions_name_the_spectrum_and_its_parameters(analysed):
    project, results = analysed["office_5_storey_braced"]
    text = " ".join(sheet_content(project, results).assumptions)
    assert "rigid in their plane" in text and "own plane" in text
    settings = project.settings
    if settings.load_method.value == "en1998":
        s = settings.eurocode8
        assert f"ground {s.ground_type}" in text and f"q = {s.behaviour_factor:g}" in text
    assert "Accidental eccentricity" in text


def test_title_block_fields_reach_the_page(tmp_path, qapp, analysed):
    project, results = analysed["pavilion_1_storey"]
    project = dataclasses.replace(project, revision="P4")
    out = tmp_path / "sheet.pdf"
    export_sheet_pdf(project, results, out, file_name="pavilion.poise", date="2031-04-05")
    text = pdf_text(out)
    for word in (project.name, project.job_number, project.engineer, "pavilion.poise", "P4", "2031-04-05"):
        assert word in text
    export_sheet_pdf(project, results, out, file_name="pavilion.poise", revision="C3")  # an override for one print
    assert "C3" in pdf_text(out) and "P4" not in pdf_text(out)


def _render_page_image(project: Project, results, paper: str, landscape: bool, dpi: int = 96) -> tuple:
    """The sheet painted on an image of the full page, as the PDF writer places it."""
    layout = page_layout(paper, landscape)
    full = layout.fullRectPoints()
    scale = dpi / 72
    image = QImage(round(full.width() * scale), round(full.height() * scale), QImage.Format.Format_RGB32)
    image.setDotsPerMeterX(round(dpi / 0.0254))
    image.setDotsPerMeterY(round(dpi / 0.0254))
    image.fill(Qt.GlobalColor.white)
    paint = layout.paintRectPoints()
    rect = QRectF(paint.x() * scale, paint.y() * scale, paint.width() * scale, paint.height() * scale)
    painter = QPainter(image)
    painter.translate(rect.topLeft())
    content = render_sheet(painter, QRectF(0, 0, rect.width(), rect.height()), project, results)
    painter.end()
    return image, rect, content


def _ink_rows_and_columns(image: QImage) -> tuple[np.ndarray, np.ndarray]:
    bits = image.constBits()
    pixels = np.frombuffer(bits, dtype=np.uint8).reshape(image.height(), image.bytesPerLine())
    pixels = pixels[:, : image.width() * 4].reshape(image.height(), image.width(), 4)[:, :, :3]
    ink = (pixels < 250).any(axis=2)
    return ink.any(axis=1), ink.any(axis=0)


@pytest.mark.parametrize("landscape", [False, True], ids=["portrait", "landscape"])
@pytest.mark.parametrize("stem", ["office_5_storey_braced", "residential_8_storey_walls", "pavilion_1_storey",
                                  "tower"])
def test_page_stays_inside_its_margins_and_fills_the_page(stem, landscape, qapp, analysed):
    """Nothing is painted in the 10 mm margins (nothing spills or is cut off at the paper's edge),
    and the page is used from top to bottom (the plan at the top, the title block at the foot)."""
    if stem == "tower":
        project = _tower(30)
        results = analyse(project)
    else:
        project, results = analysed[stem]
    image, rect, content = _render_page_image(project, results, "a4", landscape)
    rows, columns = _ink_rows_and_columns(image)
    top, bottom = int(rect.top()), math.ceil(rect.bottom())
    left, right = int(rect.left()), math.ceil(rect.right())
    assert not rows[: top - 1].any() and not rows[bottom + 1 :].any()
    assert not columns[: left - 1].any() and not columns[right + 1 :].any()
    assert rows[top : top + 20].any() and rows[bottom - 20 : bottom].any()
    if stem == "tower":
        assert content.omitted, "a 30-storey table cannot fit whole beside the plan"
        assert content.level not in content.omitted


def test_tall_building_still_gives_one_page_saying_what_it_left_out(tmp_path, qapp):
    project = _tower(30)
    out = tmp_path / "tower.pdf"
    content = export_sheet_pdf(project, analyse(project), out)
    assert len(PdfReader(out).pages) == 1
    text = pdf_text(out)
    assert "Not listed for want of room" in text and CAUTION in text
    for row in content.rows:
        assert f"{row.storey} · {row.name}" in text


# ---------------------------------------------------------------- print and pictures from the GUI


@pytest.fixture
def window(qtbot, tmp_path):
    """The editor on the office sample; its exchange actions were installed by the window itself."""
    from app.main_window import MainWindow

    settings = QSettings(str(tmp_path / "poise.ini"), QSettings.Format.IniFormat)
    window = MainWindow(settings=settings)
    qtbot.addWidget(window)
    window.document.reset(load_project(SAMPLES[0]), SAMPLES[0])
    window.document.flush_analysis()
    return window


def test_install_adds_the_actions_to_file_and_view(window):
    file_texts = [a.text() for a in window.menu("file").actions()]
    for text in ("&Print sheet…", "Export sheet as P&DF…", "Import DXF &underlay…", "Export layout as D&XF…",
                 "Export results as &CSV…"):
        assert file_texts.count(text) == 1
    assert file_texts.index("&Print sheet…") < file_texts.index("&Quit")
    assert "Save view as P&NG…" in [a.text() for a in window.menu("view").actions()]


def test_print_path_paints_one_page(window, tmp_path):
    """The print dialog's printer, here a PDF printer, gets the same one-page sheet."""
    options = SheetOptions(paper="letter", landscape=True, level=2)
    printer = window.exchange.printer(options)
    printer.setOutputFormat(QPrinter.OutputFormat.PdfFormat)
    out = tmp_path / "printed.pdf"
    printer.setOutputFileName(str(out))
    content = window.exchange.paint_sheet(printer, options)
    assert content.level == 2
    reader = PdfReader(out)
    assert len(reader.pages) == 1
    assert tuple(float(v) * MM_PER_POINT for v in reader.pages[0].mediabox[2:]) == pytest.approx((279.4, 215.9),
                                                                                                    abs=0.5)
    assert CAUTION in pdf_text(out)


def test_export_sheet_action_writes_pdf_and_errors_become_message_boxes(window, tmp_path, monkeypatch):
    content = window.exchange.export_sheet_to(tmp_path / "sheet.pdf", SheetOptions())
    assert (tmp_path / "sheet.pdf").stat().st_size > 0 and content.level >= 1
    shown = []
    monkeypatch.setattr("app.exchange.actions.QMessageBox.warning", lambda *args: shown.append(args[2]))
    monkeypatch.setattr("app.exchange.actions.SheetOptionsDialog.exec", lambda self: 1)
    monkeypatch.setattr("app.exchange.actions.QFileDialog.getSaveFileName",
                        lambda *a, **k: (str(tmp_path / "no" / "such" / "dir" / "x.pdf"), ""))
    window.exchange.pdf_action.trigger()
    assert len(shown) == 1 and "No such file" in shown[0]


def _colour_at(image: QImage, x: int, y: int) -> QColor:
    return image.pixelColor(x, y)


def test_png_of_a_graphics_view_is_the_view_at_twice_its_size(qtbot, tmp_path):
    scene = QGraphicsScene()
    scene.addRect(0, 0, 100, 50, brush=QColor("#c02020"))
    view = QGraphicsView(scene)
    view.resize(200, 120)
    qtbot.addWidget(view)
    view.show()
    view.centerOn(50, 25)
    image = export_png(view, tmp_path / "view.png", scale=2.0)
    saved = QImage(str(tmp_path / "view.png"))
    assert (saved.width(), saved.height()) == (400, 240) == (image.width(), image.height())
    centre = view.mapFromScene(50, 25)
    red = _colour_at(saved, centre.x() * 2, centre.y() * 2)
    assert (red.red(), red.green(), red.blue()) == (0xC0, 0x20, 0x20)
    corner = _colour_at(saved, 2, 2)
    assert corner.red() > 200 and corner.green() > 200


def test_png_of_a_pyqtgraph_plot_goes_through_its_exporter(qtbot, tmp_path):
    plot = pg.PlotWidget()
    plot.resize(300, 200)
    qtbot.addWidget(plot)
    plot.plot([0, 1, 2], [0, 1, 0], pen=pg.mkPen("#1060c0", width=4))
    plot.show()
    image = export_png(plot, tmp_path / "plot.png", scale=2.0)
    assert image.width() == 600
    pixels = [image.pixelColor(x, y) for x in range(0, 600, 3) for y in range(0, image.height(), 3)]
    assert any(p.blue() > 150 and p.red() < 80 for p in pixels), "the blue curve is in the picture"


def test_views_offered_for_png_include_the_canvas_and_mode_views(window, tmp_path):
    window.show()
    labels = [label for label, _ in window.exchange.views()]
    assert labels[0] == "Plan canvas"
    for label, widget in window.exchange.views():
        image = export_png(widget, tmp_path / "v.png", scale=1.0)
        assert not image.isNull(), label


def test_print_preview_opens_renders_a_page_and_closes(window, monkeypatch):
    """File › Preview sheet… opened a dialog whose printer Python had already freed: the first paint
    crashed the process. The preview must paint a page (after a garbage collection) and close."""
    import gc

    from PySide6.QtCore import QTimer
    from PySide6.QtPrintSupport import QPrintPreviewDialog, QPrintPreviewWidget
    from PySide6.QtWidgets import QApplication

    monkeypatch.setattr("app.exchange.actions.SheetOptionsDialog.exec", lambda self: 1)
    seen: dict[str, int] = {}

    def inspect_and_close() -> None:
        dialog = next((w for w in QApplication.topLevelWidgets()
                       if isinstance(w, QPrintPreviewDialog) and w.isVisible()), None)
        if dialog is None:
            QTimer.singleShot(20, inspect_and_close)
            return
        gc.collect()
        preview = dialog.findChild(QPrintPreviewWidget)
        preview.updatePreview()
        QApplication.processEvents()
        seen["pages"] = preview.pageCount()
        dialog.grab()  # paint the page on screen
        dialog.reject()

    QTimer.singleShot(0, inspect_and_close)
    window.exchange.preview_action.trigger()
    assert seen.get("pages") == 1
