"""The editor in a real X window (Qt's xcb platform under Xvfb), not only offscreen: this is what
tests the README's list of system libraries. Skipped, with the reason, only where Xvfb is not
installed; CI (.ci/run sets POISE_REQUIRE_XVFB=1) installs it and this test must run there."""

from __future__ import annotations

import os
import shutil
import subprocess
import sys
import time
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
CHILD = """
import sys
from PySide6.QtCore import QSettings, QTimer
from PySide6.QtWidgets import QApplication
from app.main_window import MainWindow
from app.resources import sample_path

app = QApplication(sys.argv)
window = MainWindow(settings=QSettings(sys.argv[1], QSettings.Format.IniFormat))
window.ask_unsaved = lambda: "discard"
window.files.open_sample(sample_path("office_5_storey_braced"), confirm=False)
window.resize(1200, 800)
window.show()
seen = {}


def look():
    seen["visible"] = window.isVisible() and window.windowHandle().isExposed()
    seen["image"] = window.grab().toImage()
    app.quit()


QTimer.singleShot(1500, look)
app.exec()
image = seen["image"]
dark = sum(image.pixelColor(x, y).lightness() < 128 for x in range(0, image.width(), 7) for y in range(0, image.height(), 7))
print("platform", app.platformName(), "visible", seen["visible"], "size", image.width(), image.height(), "dark", dark)
"""


def _free_display() -> str:
    """POISE_XVFB_DISPLAY if set, else the first display number from 90 up with no server's lock
    (the low numbers are where other sessions' servers live)."""
    wanted = os.environ.get("POISE_XVFB_DISPLAY")
    if wanted:
        return wanted
    return next(str(n) for n in range(90, 400) if not Path(f"/tmp/.X{n}-lock").exists())


def _start_xvfb() -> tuple[subprocess.Popen, str]:
    """An Xvfb server on a free display, returned once its socket accepts connections."""
    number = _free_display()
    screen = ["-screen", "0", "1280x900x24", "-nolisten", "tcp"]
    server = subprocess.Popen(["Xvfb", f":{number}", *screen], stderr=subprocess.DEVNULL)
    socket = Path(f"/tmp/.X11-unix/X{number}")
    deadline = time.monotonic() + 15
    while not socket.exists() and time.monotonic() < deadline and server.poll() is None:
        time.sleep(0.05)
    time.sleep(0.3)  # the socket file appears a moment before the server accepts on it
    return server, f":{number}"


def test_the_editor_opens_a_real_window_under_xvfb(tmp_path):
    if shutil.which("Xvfb") is None:
        if os.environ.get("POISE_REQUIRE_XVFB"):
            pytest.fail("Xvfb is not installed, but CI requires the real-window test (apt-get install xvfb)")
        pytest.skip("Xvfb is not installed (Debian: apt-get install xvfb); the real-window test needs it")
    server, display = _start_xvfb()
    try:
        assert server.poll() is None and display != ":", "Xvfb did not start"
        env = {k: v for k, v in os.environ.items() if k != "QT_QPA_PLATFORM"}
        env.update(DISPLAY=display, QT_QPA_PLATFORM="xcb", PYTHONPATH=str(ROOT))
        done = subprocess.run([sys.executable, "-c", CHILD, str(tmp_path / "poise.ini")], env=env, cwd=ROOT,
                              capture_output=True, text=True, timeout=120)
    finally:
        server.terminate()
        server.wait(timeout=10)
    assert done.returncode == 0, done.stderr[-2000:]
    words = done.stdout.split()
    assert words[:4] == ["platform", "xcb", "visible", "True"], done.stdout + done.stderr[-2000:]
    assert int(words[words.index("dark") + 1]) > 200, "the window drew its plan, panels and text"
