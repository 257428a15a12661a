"""One writer per file, and no silent overwrite of a file that changed on disk.

:class:`FileGuard` holds a QLockFile beside the open project (``.<name>.lock``) while a window
edits it, so a second window or a second Poise sees the file is in use; it also remembers the
file's size, modification time and content hash as it was opened or last saved, so a save can
tell that someone else changed the file in the meantime.
"""

from __future__ import annotations

import hashlib
import os
from dataclasses import dataclass
from pathlib import Path

from PySide6.QtCore import QLockFile


@dataclass(frozen=True)
class DiskState:
    """What the file looked like: size, modification time (ns) and a hash of its bytes."""

    size: int
    mtime_ns: int
    digest: str

    @staticmethod
    def of(path: Path) -> DiskState | None:
        try:
            with path.open("rb") as stream:
                data = stream.read()
                stat = os.fstat(stream.fileno())
        except OSError:
            return None
        return DiskState(stat.st_size, stat.st_mtime_ns, hashlib.blake2b(data, digest_size=16).hexdigest())


@dataclass(frozen=True)
class LockHolder:
    """Who holds a file's lock, as the lock file tells it."""

    pid: int
    host: str
    application: str

    def describe(self) -> str:
        app = self.application or "a program"
        return f"{app} (process {self.pid} on {self.host or 'this computer'})"


def lock_path(path: Path) -> Path:
    """``.<name>.lock`` beside ``path``; a hashed short name where that would be too long."""
    name = f".{path.name}.lock"
    if len(name.encode("utf-8", "surrogatepass")) > 255:
        digest = hashlib.blake2s(path.name.encode("utf-8", "surrogatepass"), digest_size=6).hexdigest()
        name = f".poise-{digest}.lock"
    return path.with_name(name)


class FileGuard:
    """The lock and the remembered disk state of the one file a window has open."""

    def __init__(self) -> None:
        self.path: Path | None = None
        self._lock: QLockFile | None = None
        self.state: DiskState | None = None
        self.read_only = False
        """Opened read-only because another writer holds the file (Save asks for a new name)."""

    def holder(self, path: Path) -> LockHolder | None:
        """Who holds ``path`` now (None if nobody, or the holder has died)."""
        lock = QLockFile(str(lock_path(Path(os.path.realpath(path)))))
        lock.setStaleLockTime(0)
        if lock.tryLock(0):
            lock.unlock()
            return None
        if lock.error() != QLockFile.LockError.LockFailedError:
            return None  # no lock can be made there (a read-only folder): nobody can hold one
        pid, host, application = lock.getLockInfo()
        return LockHolder(int(pid), str(host), str(application))

    def take(self, path: Path, read_only: bool = False) -> None:
        """Start guarding ``path``: lock it (unless ``read_only``) and remember its disk state."""
        self.release()
        self.path = Path(path)
        self.read_only = read_only
        if not read_only:
            lock = QLockFile(str(lock_path(Path(os.path.realpath(path)))))
            lock.setStaleLockTime(0)
            if lock.tryLock(0):
                self._lock = lock
        self.remember()

    def remember(self) -> None:
        """The file as it is now is the one the window knows (after open and after save)."""
        self.state = DiskState.of(self.path) if self.path is not None else None

    def changed_on_disk(self) -> bool:
        """True if the file's bytes differ from those opened or last saved (a touch alone is not a
        change: size and time are compared first, the hash decides)."""
        if self.path is None or self.state is None:
            return False
        now = DiskState.of(self.path)
        if now is None:
            return False  # gone: saving recreates it, nothing to overwrite
        if (now.size, now.mtime_ns) == (self.state.size, self.state.mtime_ns):
            return False
        return now.digest != self.state.digest

    def release(self) -> None:
        if self._lock is not None:
            self._lock.unlock()
            self._lock = None
        self.path = None
        self.state = None
        self.read_only = False
