"""The small dialog that asks which span of levels copies of the selected elements take: from a
bottom (the base or a floor) to a top floor above it; the top list offers only floors above the
chosen bottom."""

from __future__ import annotations

from PySide6.QtWidgets import QComboBox, QDialog, QDialogButtonBox, QFormLayout, QWidget

from core.model import Project


class CopySpanDialog(QDialog):
    """From (0 = the base) and to (a floor above it) for the copies."""

    def __init__(self, parent: QWidget | None, project: Project) -> None:
        super().__init__(parent)
        self.project = project
        self.setWindowTitle("Copy to levels")
        self.bottom, self.top = QComboBox(), QComboBox()
        self.bottom.addItem("Base", 0)
        for i, level in enumerate(project.levels[:-1], start=1):
            self.bottom.addItem(level.name, i)
        self.bottom.currentIndexChanged.connect(self._fill_tops)
        self._fill_tops()
        form = QFormLayout(self)
        form.addRow("Copies span from", self.bottom)
        form.addRow("to", self.top)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        form.addRow(buttons)

    def _fill_tops(self) -> None:
        """Only floors above the chosen bottom; the top chosen before stays if it still fits."""
        kept = self.top.currentData()
        bottom = self.bottom.currentData() or 0
        self.top.clear()
        for i, level in enumerate(self.project.levels, start=1):
            if i > bottom:
                self.top.addItem(level.name, i)
        index = self.top.findData(kept)
        self.top.setCurrentIndex(index if index >= 0 else 0)

    def span(self) -> tuple[int, int]:
        return self.bottom.currentData(), self.top.currentData()


def ask_copy_span(parent: QWidget, project: Project) -> tuple[int, int] | None:
    """The (bottom, top) level numbers of the copies (0 = base), or None if cancelled."""
    dialog = CopySpanDialog(parent, project)
    if dialog.exec() != QDialog.DialogCode.Accepted:
        return None
    return dialog.span()
