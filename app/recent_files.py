"""The list of recently opened or saved projects, newest first, kept in QSettings."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QSettings

RECENT_LIMIT = 8
KEY = "recent_files"


class RecentFiles:
    """Recent project paths (absolute, as text) in ``settings``; at most ``RECENT_LIMIT``."""

    def __init__(self, settings: QSettings) -> None:
        self.settings = settings

    def paths(self) -> list[str]:
        return [str(p) for p in self.settings.value(KEY, [], type=list)]

    def remember(self, path: Path) -> None:
        text = str(path.resolve())
        recent = [text] + [p for p in self.paths() if p != text]
        self.settings.setValue(KEY, recent[:RECENT_LIMIT])

    def forget(self, path: Path) -> None:
        text = str(path.resolve())
        self.settings.setValue(KEY, [p for p in self.paths() if p != text])
