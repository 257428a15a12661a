"""The undo command that applies a model edit; the edits themselves are core's (core.model.edits).

Every edit is a pure function ``Project → Project`` (:mod:`core.model.edits`, re-exported here for
the editor's modules); :class:`ReplaceProject` swaps the document's project between the one before
and the one after. Holding both whole projects keeps undo exact and cheap.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Any

from PySide6.QtGui import QUndoCommand

from core.model import Project
from core.model.edits import (
    DEFAULT_STOREY_HEIGHT,
    add_elements,
    add_level_on_top,
    add_opening,
    copy_elements_to,
    delete_level,
    duplicate_level,
    get_path,
    insert_level,
    insert_level_below,
    move_elements,
    new_element,
    new_level_like,
    remove_elements,
    replace_elements,
    replace_level,
    respan,
    rotate_elements,
    set_element_end,
    set_length_and_angle,
    set_outline,
    set_path,
    unique_level_name,
)

if TYPE_CHECKING:
    from app.document import ProjectDocument


class ReplaceProject(QUndoCommand):
    """One undo step: the document's project before and after an edit.

    Commands with the same non-empty ``merge_key`` pushed one after another merge into one step
    (arrow-key nudges of the same selection); a merge back to the start drops the step.
    """

    _MERGE_ID = 4701

    def __init__(
        self, document: ProjectDocument, before: Project, after: Project, text: str, merge_key: Any = None
    ) -> None:
        super().__init__(text)
        self._document = document
        self.before = before
        self.after = after
        self.merge_key = merge_key

    def redo(self) -> None:
        self._document._replace_project(self.after)

    def undo(self) -> None:
        self._document._replace_project(self.before)

    def id(self) -> int:
        return self._MERGE_ID if self.merge_key is not None else -1

    def mergeWith(self, other: QUndoCommand) -> bool:
        if not isinstance(other, ReplaceProject) or other.merge_key != self.merge_key:
            return False
        self.after = other.after
        self.setObsolete(self.after == self.before)
        return True


__all__ = [
    "DEFAULT_STOREY_HEIGHT",
    "ReplaceProject",
    "add_elements",
    "add_level_on_top",
    "add_opening",
    "copy_elements_to",
    "delete_level",
    "duplicate_level",
    "get_path",
    "insert_level",
    "insert_level_below",
    "move_elements",
    "new_element",
    "new_level_like",
    "remove_elements",
    "replace_elements",
    "replace_level",
    "respan",
    "rotate_elements",
    "set_element_end",
    "set_length_and_angle",
    "set_outline",
    "set_path",
    "unique_level_name",
]
