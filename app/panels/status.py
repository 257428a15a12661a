"""The status bar: the tool's instruction, cursor coordinates, snap state, analysis state."""

from __future__ import annotations

from PySide6.QtWidgets import QLabel, QStatusBar, QWidget

from app.canvas.snapping import Snap, SnapKind
from app.document import ProjectDocument


class StatusPanel(QStatusBar):
    def __init__(self, document: ProjectDocument, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.document = document
        self.hint = QLabel()
        self.cursor = QLabel("x —  y —")
        self.snap = QLabel()
        self.analysis = QLabel()
        for label, width in ((self.cursor, 170), (self.snap, 190), (self.analysis, 230)):
            label.setMinimumWidth(width)
        self.cursor.setObjectName("cursor")
        self.snap.setObjectName("snap")
        self.analysis.setObjectName("analysis")
        self.addWidget(self.hint, 1)
        self.addPermanentWidget(self.cursor)
        self.addPermanentWidget(self.snap)
        self.addPermanentWidget(self.analysis)
        self.snap_enabled = True
        document.results_changed.connect(self.show_analysis)
        document.preview_changed.connect(self.show_analysis)
        self.show_analysis()
        self.show_snap(None)
        self._file_note = ""
        document.project_changed.connect(lambda: self.show_snap(None))  # it may name a deleted element
        document.file_path_changed.connect(self._forget_file_note)

    def show_hint(self, text: str) -> None:
        self.hint.setText(text)

    def show_file_note(self, text: str) -> None:
        """A hint about the open file ("Saved …"), dropped when another file is opened or made."""
        self.show_hint(text)
        self._file_note = text

    def _forget_file_note(self) -> None:
        if self._file_note and self.hint.text() == self._file_note:
            self.hint.clear()
        self._file_note = ""

    def show_cursor(self, x: float, y: float) -> None:
        self.cursor.setText(f"x {x:9.3f}  y {y:9.3f} m")

    def show_snap(self, snap: Snap | None) -> None:
        if not self.snap_enabled:
            self.snap.setText("Snap off")
        elif snap is None or snap.kind is SnapKind.FREE:
            self.snap.setText("Snap on")
        else:
            self.snap.setText(f"Snap: {snap.label}")

    def show_analysis(self) -> None:
        document = self.document
        if document.live.pending:
            text = "Analysing…"
        elif document.error is not None:
            text = "No floor yet" if not document.shown_project.levels else "Unstable: see the plan"
        elif document.results is not None:
            text = f"Analysed in {1000 * document.analysis_seconds:.1f} ms"
            if document.previewing:
                text += " (trial)"
        else:
            text = ""
        self.analysis.setText(text)
