"""Screenshots of the main window on each sample project, written to tests/screenshots/ (ignored by
git) for a person to look at. The test also checks that each sample opens, is analysed without a
diagnostic, and shows its overlays and readouts, so a picture of an empty window cannot pass."""

from __future__ import annotations

from pathlib import Path

import pytest

from app.resources import sample_projects
from tests.helpers import make_window, settle

SCREENSHOTS = Path(__file__).parent / "screenshots"


@pytest.mark.parametrize("path", sample_projects(), ids=lambda p: p.stem)
def test_screenshot_of_each_sample(qtbot, tmp_path, path):
    window = make_window(qtbot, tmp_path)
    window.resize(1600, 1000)
    assert window.files.open_sample(path, confirm=False)
    settle(window)
    window.plan_view.fit()
    settle(window)
    assert window.document.error is None
    assert window.scene.overlay.data is not None and window.scene.overlay.data.rigidity_centre is not None
    assert window.readouts.torsion_values() is not None
    assert set(window.scene.element_items) == {e.id for e in window.document.project.elements_in_storey(1)}
    SCREENSHOTS.mkdir(exist_ok=True)
    target = SCREENSHOTS / f"{path.stem}.png"
    assert window.grab().save(str(target))
    assert target.stat().st_size > 20_000
