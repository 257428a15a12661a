"""The small dialog that asks which span of levels copies of the selected elements take."""

from __future__ import annotations

from PySide6.QtWidgets import QComboBox, QDialog, QDialogButtonBox, QFormLayout, QWidget

from core.model import Project


def ask_copy_span(parent: QWidget, project: Project) -> tuple[int, int] | None:
    """The (bottom, top) level numbers the copies stand on and reach (0 = base), or None if cancelled."""
    dialog = QDialog(parent)
    dialog.setWindowTitle("Copy to levels")
    bottom, top = QComboBox(), QComboBox()
    bottom.addItem("Base", 0)
    for i, level in enumerate(project.levels, start=1):
        top.addItem(level.name, i)
        if i < len(project.levels):
            bottom.addItem(level.name, i)
    form = QFormLayout(dialog)
    form.addRow("Copies stand on", bottom)
    form.addRow("and reach", top)
    buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
    buttons.accepted.connect(dialog.accept)
    buttons.rejected.connect(dialog.reject)
    form.addRow(buttons)
    if dialog.exec() != QDialog.DialogCode.Accepted:
        return None
    return bottom.currentData(), top.currentData()
