"""The open document: the current project, its file, its undo history, its latest results.

Views never change the model: they call :meth:`ProjectDocument.apply` with a new project (one
undo step), or :meth:`ProjectDocument.preview` while a drag is under way (live results, no undo
step), and redraw on the signals. ``shown_project`` is what the views draw: the preview if one
is active, else the committed project.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

from PySide6.QtCore import QObject, Signal
from PySide6.QtGui import QUndoStack

from app.commands import ReplaceProject
from app.live_analysis import LiveAnalysis
from core.errors import AnalysisError
from core.model import Project
from core.model.continuity import join_stacked
from core.model.fileio import load_project, save_project
from core.results import Results

Segment = tuple[tuple[float, float], tuple[float, float]]


class ProjectDocument(QObject):
    """Controller of one project: model, file path, undo stack, selection, results."""

    project_changed = Signal()
    """The committed project changed (an edit, undo, redo, new or open)."""
    preview_changed = Signal()
    """A drag shows a trial project (or ended one); ``shown_project`` changed."""
    results_changed = Signal()
    """``results`` / ``error`` now describe ``shown_project``."""
    current_level_changed = Signal(int)
    selection_changed = Signal()
    mode_selected = Signal(int)
    underlay_changed = Signal(int)
    file_path_changed = Signal()

    def __init__(self, parent: QObject | None = None) -> None:
        super().__init__(parent)
        self._project = Project()
        self._preview: Project | None = None
        self.file_path: Path | None = None
        self.undo_stack = QUndoStack(self)
        self.results: Results | None = None
        self.error: AnalysisError | None = None
        self.analysed_project: Project | None = None
        """The project ``results``/``error`` belong to."""
        self.analysis_seconds = 0.0
        self._current_level = 1
        self.current_mode = 1
        self._selection: tuple[str, ...] = ()
        self._absorbed: dict[str, str] = {}
        """Upper pieces the last committed edit joined into the element below (upper → lower)."""
        self._underlays: dict[int, list[Segment]] = {}
        self.live = LiveAnalysis(parent=self)
        self.live.computed.connect(self._take_results)
        self.live.request(self._project)

    # ------------------------------------------------------------------ model

    @property
    def project(self) -> Project:
        return self._project

    @property
    def shown_project(self) -> Project:
        return self._preview if self._preview is not None else self._project

    @property
    def previewing(self) -> bool:
        return self._preview is not None

    def apply(self, project: Project, text: str, merge_key: Any = None) -> bool:
        """Make ``project`` current as one undo step; False when nothing changed.

        Elements the edit stacked on one line (same kind, same segment, touching levels) are
        joined into one in the same step (:func:`core.model.continuity.join_stacked`); a selected
        upper piece stays selected as the joined element. A drag's preview ends here without
        analysing the committed project it replaces."""
        project, absorbed = join_stacked(project)
        self._absorbed = absorbed
        if project == self._project:
            self.end_preview()
            return False
        was_previewing = self._preview is not None
        selection = self._selection
        self.undo_stack.push(ReplaceProject(self, self._project, project, text, merge_key))
        if absorbed:
            self.select(selection)
        if was_previewing:
            self.preview_changed.emit()
        return True

    def preview(self, project: Project) -> None:
        """Show and analyse ``project`` without committing it (during a drag)."""
        if project == self._preview:
            return
        self._preview = project
        self.preview_changed.emit()
        self.live.request(project)

    def end_preview(self) -> None:
        if self._preview is None:
            return
        self._preview = None
        self.preview_changed.emit()
        self.live.request(self._project)

    def _replace_project(self, project: Project) -> None:
        """Called by undo commands only."""
        self._preview = None
        self._project = project
        self._prune_selection()
        self._clamp_level()
        self.project_changed.emit()
        self.live.request(project)

    def _take_results(self, project: Project, results: Results | None, error: AnalysisError | None, seconds: float):
        self.analysed_project = project
        self.results, self.error, self.analysis_seconds = results, error, seconds
        self.results_changed.emit()

    def flush_analysis(self) -> None:
        """Bring ``results`` up to date with ``shown_project`` now (tests, export)."""
        self.live.flush()

    # ------------------------------------------------------------------ files

    @property
    def is_modified(self) -> bool:
        return not self.undo_stack.isClean()

    def reset(self, project: Project, path: Path | None = None) -> None:
        """Start afresh with ``project`` (New, Open): empty history, clean state."""
        self.undo_stack.clear()
        self._underlays.clear()
        self._selection = ()
        self._replace_project(project)
        self.set_current_level(1)
        self.file_path = path
        self.file_path_changed.emit()
        self.selection_changed.emit()

    def open(self, path: Path) -> None:
        """Load ``path``; raises ModelError (file unchanged, document unchanged) if it is bad.

        Elements the file holds stacked on one line are joined as the first undo step, so the
        file opens as it will be analysed (and saving keeps the join)."""
        self.reset(load_project(path), Path(path))
        joined, absorbed = join_stacked(self._project)
        if absorbed:
            pieces = ", ".join(f"{upper} into {lower}" for upper, lower in absorbed.items())
            self.apply(joined, f"Join stacked elements ({pieces})")

    def save(self, path: Path | None = None, overwrite_read_only: bool = False) -> None:
        """Save to ``path`` or the current file; raises OSError (ReadOnlyFileError for a read-only
        file unless ``overwrite_read_only``) or ModelError on failure."""
        target = Path(path) if path is not None else self.file_path
        if target is None:
            raise ValueError("no file name given")
        save_project(self._project, target, overwrite_read_only=overwrite_read_only)
        self.undo_stack.setClean()
        if target != self.file_path:
            self.file_path = target
            self.file_path_changed.emit()

    # ------------------------------------------------------------------ levels, selection, modes

    @property
    def current_level(self) -> int:
        """1-based number of the level being edited (1 when the project has no level yet)."""
        return self._current_level

    def set_current_level(self, level: int) -> None:
        level = max(1, min(level, max(1, len(self._project.levels))))
        if level != self._current_level:
            self._current_level = level
            self.current_level_changed.emit(level)

    def _clamp_level(self) -> None:
        self.set_current_level(self._current_level)

    @property
    def selection(self) -> tuple[str, ...]:
        """Ids of the selected elements."""
        return self._selection

    def select(self, ids: tuple[str, ...] | list[str]) -> None:
        """Select ``ids``; a piece the last edit joined into another selects that one, and ids
        not in the project are left out."""
        present = {e.id for e in self._project.elements}
        ids = tuple(i for i in dict.fromkeys(self._absorbed.get(i, i) for i in ids) if i in present)
        if ids != self._selection:
            self._selection = ids
            self.selection_changed.emit()

    def _prune_selection(self) -> None:
        present = {e.id for e in self._project.elements}
        kept = tuple(i for i in self._selection if i in present)
        if kept != self._selection:
            self._selection = kept
            self.selection_changed.emit()

    def select_mode(self, number: int) -> None:
        """Make mode ``number`` (1-based) the one the mode views follow."""
        self.current_mode = number
        self.mode_selected.emit(number)

    # ------------------------------------------------------------------ underlays

    def set_underlay(self, level: int, segments: list[Segment]) -> None:
        """Show ``segments`` as a locked, faint, snappable drawing on ``level`` (1-based)."""
        self._underlays[level] = [((float(a[0]), float(a[1])), (float(b[0]), float(b[1]))) for a, b in segments]
        self.underlay_changed.emit(level)

    def underlay(self, level: int) -> list[Segment]:
        return self._underlays.get(level, [])
