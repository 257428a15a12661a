"""The one-page plan sheet: content (Qt-free), painting with QPainter, PDF export."""

from app.sheet.pdf import export_sheet_pdf, page_layout
from app.sheet.render import render_sheet

__all__ = ["export_sheet_pdf", "page_layout", "render_sheet"]
