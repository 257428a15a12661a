"""The one-page plan sheet: content (Qt-free), painting with QPainter, PDF export."""
