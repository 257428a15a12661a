"""Test set-up: Qt runs offscreen, before anything imports it, and Qt's standard folders point at
its test locations, so no test writes recovery copies into the user's real data folder."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from PySide6.QtCore import QStandardPaths

QStandardPaths.setTestModeEnabled(True)
