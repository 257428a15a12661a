"""The sheet's settings (paper, orientation, level) and the small dialog that sets them.

They are remembered between sessions in QSettings under ``sheet/``; the level is not, because it
belongs to one project (None: the level with the worst torsion ratio).
"""

from __future__ import annotations

from dataclasses import dataclass

from PySide6.QtCore import QSettings
from PySide6.QtWidgets import QComboBox, QDialog, QDialogButtonBox, QFormLayout, QWidget

from app.sheet.pdf import PAPER_SIZES
from core.model import Project

PAPER_NAMES = {"a4": "A4", "letter": "Letter"}


@dataclass(frozen=True)
class SheetOptions:
    paper: str = "a4"
    landscape: bool = False
    level: int | None = None
    """1-based; None picks the level with the worst torsion ratio."""

    @staticmethod
    def load(settings: QSettings) -> SheetOptions:
        paper = str(settings.value("sheet/paper", "a4"))
        return SheetOptions(
            paper=paper if paper in PAPER_SIZES else "a4",
            landscape=settings.value("sheet/landscape", False, type=bool),
        )

    def save(self, settings: QSettings) -> None:
        settings.setValue("sheet/paper", self.paper)
        settings.setValue("sheet/landscape", self.landscape)


class SheetOptionsDialog(QDialog):
    """Paper, orientation and level drawn, asked before a PDF export (the revision is the project's)."""

    def __init__(self, options: SheetOptions, project: Project, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.setWindowTitle("Plan sheet")
        self.paper = QComboBox()
        for key, name in PAPER_NAMES.items():
            self.paper.addItem(name, key)
        self.paper.setCurrentIndex(max(0, self.paper.findData(options.paper)))
        self.orientation = QComboBox()
        self.orientation.addItem("Portrait", False)
        self.orientation.addItem("Landscape", True)
        self.orientation.setCurrentIndex(1 if options.landscape else 0)
        self.level = QComboBox()
        self.level.addItem("Worst torsion ratio", None)
        for number, level in enumerate(project.levels, start=1):
            self.level.addItem(f"{number} · {level.name}", number)
        self.level.setCurrentIndex(max(0, self.level.findData(options.level)) if options.level else 0)
        form = QFormLayout(self)
        form.addRow("Paper", self.paper)
        form.addRow("Orientation", self.orientation)
        form.addRow("Level in plan", self.level)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        form.addRow(buttons)

    def options(self) -> SheetOptions:
        return SheetOptions(
            paper=self.paper.currentData(),
            landscape=bool(self.orientation.currentData()),
            level=self.level.currentData(),
        )
