"""The sheet as a one-page PDF, at 300 dpi with the page size, orientation and margins in mm."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QMarginsF, QRectF
from PySide6.QtGui import QGuiApplication, QPageLayout, QPageSize, QPainter, QPdfWriter

from app.sheet.content import SheetContent, check_level
from app.sheet.render import render_sheet
from core.model import Project
from core.results import Results

RESOLUTION = 300
"""Dots per inch of the PDF's device (cosmetic 2-px pens are then 0.17 mm)."""
MARGIN_MM = 10.0
PAPER_SIZES = {"a4": QPageSize.PageSizeId.A4, "letter": QPageSize.PageSizeId.Letter}


def page_layout(paper: str = "a4", landscape: bool = False) -> QPageLayout:
    """The sheet's page: A4 or Letter, portrait or landscape, 10 mm margins."""
    if paper not in PAPER_SIZES:
        raise ValueError(f"paper must be one of {', '.join(PAPER_SIZES)}, got {paper!r}")
    orientation = QPageLayout.Orientation.Landscape if landscape else QPageLayout.Orientation.Portrait
    margins = QMarginsF(MARGIN_MM, MARGIN_MM, MARGIN_MM, MARGIN_MM)
    return QPageLayout(QPageSize(PAPER_SIZES[paper]), orientation, margins, QPageLayout.Unit.Millimeter)


def export_sheet_pdf(
    project: Project,
    results: Results,
    path: str | Path,
    paper: str = "a4",
    landscape: bool = False,
    level: int | None = None,
    *,
    file_name: str = "",
    revision: str = "",
    date: str | None = None,
) -> SheetContent:
    """Write the one-page sheet to ``path``; returns what it shows.

    Needs a QGuiApplication (fonts). Raises ValueError for a bad paper or level and OSError when
    the file cannot be written.
    """
    if QGuiApplication.instance() is None:
        raise RuntimeError("export_sheet_pdf needs a QGuiApplication (fonts are laid out by Qt)")
    path = Path(path)
    layout = page_layout(paper, landscape)
    if level is not None:
        check_level(project, level)  # before the file is touched, so a bad level leaves it as it was
    with path.open("wb"):
        pass  # fail early, with the system's reason, if the file cannot be written
    writer = QPdfWriter(str(path))
    writer.setResolution(RESOLUTION)
    writer.setPageLayout(layout)
    writer.setTitle(f"{project.name} — Poise lateral layout sheet")
    writer.setCreator("Poise")
    painter = QPainter()
    if not painter.begin(writer):
        raise OSError(f"cannot write the PDF {path}")
    try:
        page = writer.pageLayout().paintRectPixels(RESOLUTION)
        return render_sheet(painter, QRectF(0, 0, page.width(), page.height()), project, results, level,
                            file_name=file_name, revision=revision, date=date)
    finally:
        painter.end()
