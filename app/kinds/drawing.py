"""Small geometry shared by the kinds' sheet symbols."""

from __future__ import annotations

from PySide6.QtCore import QPointF


def bay_nodes(a: QPointF, b: QPointF, bays: int) -> list[QPointF]:
    """The ``bays + 1`` points dividing the line ``a``–``b`` into equal bays."""
    return [QPointF(a.x() + (b.x() - a.x()) * t / bays, a.y() + (b.y() - a.y()) * t / bays) for t in range(bays + 1)]
