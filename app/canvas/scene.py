"""The plan scene: mirrors the document's shown project on the current level.

The scene never changes the model. On every change notice it brings its items in line with
``document.shown_project``: the floor of the current level, faint outlines and elements of the
levels below, the underlay, one item per element of the current storey, and the overlays.
Items are updated in place by element id, so a drag only touches what moved.
"""

from __future__ import annotations

from PySide6.QtCore import QRectF
from PySide6.QtWidgets import QGraphicsItem, QGraphicsScene

from app.canvas import style
from app.canvas.items import ElementItem, FloorItem, UnderlayItem
from app.canvas.overlays import OverlayItem, overlay_data
from app.document import ProjectDocument
from core.model import Element, Level
from core.model.continuity import transfers

SCENE_HALF_SIZE = 20_000.0
"""Half the scene's extent, m: far beyond any building, so zoom about the cursor always works."""

Z_BELOW, Z_UNDERLAY, Z_FLOOR, Z_ELEMENTS, Z_TEMPORARY = 0, 1, 2, 10, 60


class PlanScene(QGraphicsScene):
    """Items of the current level, kept in step with the document."""

    def __init__(self, document: ProjectDocument) -> None:
        super().__init__()
        self.document = document
        self.pixel = 0.05
        """Metres per device pixel at the view's zoom (set by the view)."""
        self.setItemIndexMethod(QGraphicsScene.ItemIndexMethod.NoIndex)
        self.setSceneRect(QRectF(-SCENE_HALF_SIZE, -SCENE_HALF_SIZE, 2 * SCENE_HALF_SIZE, 2 * SCENE_HALF_SIZE))
        self._floor: FloorItem | None = None
        self._below: list[QGraphicsItem] = []
        self._below_key: object = None
        self._underlay: UnderlayItem | None = None
        self._underlay_key: object = None
        self.element_items: dict[str, ElementItem] = {}
        self.overlay = OverlayItem()
        self.addItem(self.overlay)
        document.project_changed.connect(self.sync)
        document.preview_changed.connect(self.sync)
        document.current_level_changed.connect(self.sync)
        document.underlay_changed.connect(self.sync)
        document.selection_changed.connect(self._mark)
        document.results_changed.connect(self._results)
        self.sync()

    # ------------------------------------------------------------------ syncing

    def level(self) -> Level | None:
        levels = self.document.shown_project.levels
        number = self.document.current_level
        return levels[number - 1] if 1 <= number <= len(levels) else None

    def sync(self) -> None:
        project = self.document.shown_project
        number = self.document.current_level
        level = self.level()
        if level is None:
            if self._floor is not None:
                self.removeItem(self._floor)
                self._floor = None
        elif self._floor is None:
            self._floor = FloorItem(level)
            self._floor.setZValue(Z_FLOOR)
            self.addItem(self._floor)
        elif self._floor.level != level:
            self._floor.set_level(level)
        self._sync_below(project.levels[: max(number - 1, 0)], [e for e in project.elements if e.top < number])
        self._sync_underlay(self.document.underlay(number))
        self._sync_elements(project.elements_in_storey(number) if level is not None else ())
        self._mark()
        self._results()

    def _sync_below(self, levels: tuple[Level, ...], elements: list[Element]) -> None:
        outlines = tuple(dict.fromkeys((lv.outline, lv.openings) for lv in levels if lv != self.level()))
        key = (outlines, tuple(elements))
        if key == self._below_key:
            return
        self._below_key = key
        for item in self._below:
            self.removeItem(item)
        self._below = []
        for outline, openings in outlines:
            item = FloorItem(Level("below", 1.0, outline, openings), faint=True)
            self._below.append(item)
        for element in elements:
            self._below.append(ElementItem(element, faint=True))
        for item in self._below:
            item.setZValue(Z_BELOW)
            self.addItem(item)

    def _sync_underlay(self, segments: list) -> None:
        key = tuple(segments)
        if key == self._underlay_key:
            return
        self._underlay_key = key
        if self._underlay is not None:
            self.removeItem(self._underlay)
            self._underlay = None
        if segments:
            self._underlay = UnderlayItem(segments)
            self._underlay.setZValue(Z_UNDERLAY)
            self.addItem(self._underlay)

    def _sync_elements(self, elements: tuple[Element, ...]) -> None:
        wanted = {e.id: e for e in elements}
        for element_id in [i for i in self.element_items if i not in wanted]:
            self.removeItem(self.element_items.pop(element_id))
        for element_id, element in wanted.items():
            item = self.element_items.get(element_id)
            if item is None:
                item = ElementItem(element)
                item.setZValue(Z_ELEMENTS)
                self.element_items[element_id] = item
                self.addItem(item)
            else:
                item.set_element(element)
            item.setOpacity(1.0 if element.active else style.SWITCHED_OFF_OPACITY)

    def _mark(self) -> None:
        selected = set(self.document.selection)
        error = self.document.error
        culprits = set(error.elements) if error is not None else set()
        standing = {t.element for t in transfers(self.document.shown_project)}
        for element_id, item in self.element_items.items():
            item.set_marks(element_id in selected, element_id in culprits, element_id in standing)

    def _results(self) -> None:
        self.overlay.set_data(overlay_data(self.document.results, self.document.current_level))
        self._mark()

    # ------------------------------------------------------------------ zoom

    def set_pixel(self, pixel: float) -> None:
        """Tell the items how many metres one device pixel is, after a zoom."""
        if pixel == self.pixel:
            return
        self.pixel = pixel
        for item in self.items():
            if isinstance(item, ElementItem):
                item.pixel_changed()
        self.overlay.prepareGeometryChange()

    def plan_rect(self) -> QRectF:
        """Bounding box of everything on the plan (all levels), m."""
        project = self.document.shown_project
        points = [p for lv in project.levels for p in lv.outline]
        points += [p for e in project.elements for p in (e.start, e.end)]
        points += [p for seg in self.document.underlay(self.document.current_level) for p in seg]
        if not points:
            return QRectF(-2.0, -2.0, 32.0, 22.0)
        xs, ys = [p[0] for p in points], [p[1] for p in points]
        return QRectF(min(xs), min(ys), max(xs) - min(xs), max(ys) - min(ys))
