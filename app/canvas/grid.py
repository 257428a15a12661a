"""The plan grid: lines at the user's spacing, every fifth one stronger, thinned when zoomed out."""

from __future__ import annotations

import math

from PySide6.QtCore import QLineF, QRectF
from PySide6.QtGui import QPainter

from app.canvas import style

MIN_GAP_PIXELS = 7.0
"""Closest two drawn grid lines may be on screen; coarser multiples are drawn below that."""
MAJOR_EVERY = 5


def visible_spacing(spacing: float, pixel: float) -> float:
    """The grid spacing actually drawn: ``spacing`` times 5, 10, 50 … until lines are far enough apart."""
    drawn = spacing
    factors = (5, 2)
    i = 0
    while drawn / pixel < MIN_GAP_PIXELS:
        drawn *= factors[i % 2]
        i += 1
    return drawn


def draw_grid(painter: QPainter, rect: QRectF, spacing: float, pixel: float) -> None:
    """Grid lines over ``rect`` (scene units) with ``spacing`` m; ``pixel`` is metres per pixel."""
    step = visible_spacing(spacing, pixel)
    minor, major = [], []
    first_x, last_x = math.floor(rect.left() / step), math.ceil(rect.right() / step)
    first_y, last_y = math.floor(rect.top() / step), math.ceil(rect.bottom() / step)
    for i in range(first_x, last_x + 1):
        x = i * step
        (major if i % MAJOR_EVERY == 0 else minor).append(QLineF(x, rect.top(), x, rect.bottom()))
    for j in range(first_y, last_y + 1):
        y = j * step
        (major if j % MAJOR_EVERY == 0 else minor).append(QLineF(rect.left(), y, rect.right(), y))
    painter.setPen(style.pen(style.GRID_MINOR, 1.0))
    painter.drawLines(minor)
    painter.setPen(style.pen(style.GRID_MAJOR, 1.0))
    painter.drawLines(major)
    painter.setPen(style.pen(style.AXIS, 1.4))
    if rect.left() <= 0 <= rect.right():
        painter.drawLine(QLineF(0, rect.top(), 0, rect.bottom()))
    if rect.top() <= 0 <= rect.bottom():
        painter.drawLine(QLineF(rect.left(), 0, rect.right(), 0))
