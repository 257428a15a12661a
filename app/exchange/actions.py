"""Menu actions for the sheet and the exchange formats, added to the main window by ``install``.

File menu: print and preview the sheet, export it as PDF, import a DXF underlay for the current
level, trace the level's outline from one of the underlay's closed polylines, remove the underlay,
export the layout as DXF and the results as CSV. View menu: save a view (the plan canvas or any
mode view or chart) as PNG. Each action asks what it needs in a dialog, then calls a method that
takes plain arguments (``export_sheet_to``, ``import_underlay_from`` …) so tests can drive them.
Every failure ends in a message box that says what went wrong; the project is never touched
except by the outline trace, which is one undo step.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from pathlib import Path
from typing import Any

import pyqtgraph as pg
import shiboken6
from PySide6.QtCore import QObject, QRectF
from PySide6.QtGui import QAction, QKeySequence, QPainter
from PySide6.QtPrintSupport import QPrintDialog, QPrinter, QPrintPreviewDialog
from PySide6.QtWidgets import QDialog, QFileDialog, QInputDialog, QMenu, QMessageBox, QWidget

from app import commands
from app.action_factory import make_action
from app.exchange.csv_export import export_csv
from app.exchange.dxf_export import export_layout_dxf
from app.exchange.dxf_underlay import UNIT_CHOICES, ClosedPolyline, Underlay, read_underlay
from app.exchange.errors import ExchangeError, MissingUnitsError
from app.exchange.png_export import export_png, view_label
from app.sheet.content import SheetContent
from app.sheet.options import PAPER_NAMES, SheetOptions, SheetOptionsDialog
from app.sheet.pdf import export_sheet_pdf, page_layout
from app.sheet.render import render_sheet
from core.model import Project
from core.results import Results

UNIT_WORDS = {"mm": "millimetres", "cm": "centimetres", "dm": "decimetres", "m": "metres", "in": "inches",
              "ft": "feet", "yd": "yards"}
STATUS_SECONDS = 8


class ExchangeActions(QObject):
    """The sheet and exchange actions of one main window."""

    def __init__(self, window: Any) -> None:
        super().__init__(window)
        self.window = window
        self.document = window.document
        self.settings = window.settings
        self._underlays: dict[int, Underlay] = {}
        """The last imported drawing per level (1-based), for tracing an outline from it."""
        self.print_action = self._action("&Print sheet…", self.print_sheet, QKeySequence.StandardKey.Print)
        self.preview_action = self._action("Pre&view sheet…", self.preview_sheet)
        self.pdf_action = self._action("Export sheet as P&DF…", self.export_sheet)
        self.underlay_action = self._action("Import DXF &underlay…", self.import_underlay)
        self.trace_action = self._action("&Trace outline from underlay…", self.trace_outline)
        self.remove_underlay_action = self._action("Remove under&lay", self.remove_underlay)
        self.dxf_action = self._action("Export layout as D&XF…", self.export_dxf)
        self.csv_action = self._action("Export results as &CSV…", self.export_csv)
        self.png_action = self._action("Save view as P&NG…", self.export_png)

    def _action(self, text: str, slot: Callable[[], object], shortcut: Any = None) -> QAction:
        return make_action(self.window, text, lambda: self._guarded(text, slot), shortcut)

    def _guarded(self, title: str, slot: Callable[[], object]) -> None:
        """Run an action; any failure becomes a message box (the GUI boundary: never a crash)."""
        try:
            slot()
        except Exception as error:  # the last line of defence of a menu action
            name = title.replace("&", "").rstrip("…")
            detail = str(error) or type(error).__name__
            QMessageBox.warning(self.window, name, f"{name} did not complete:\n{detail}")

    def _status(self, text: str) -> None:
        self.window.statusBar().showMessage(text, STATUS_SECONDS * 1000)

    # ------------------------------------------------------------------ shared helpers

    def analysed(self) -> tuple[Project, Results]:
        """The project and its results, brought up to date; raises if the analysis failed."""
        self.document.flush_analysis()
        results, project = self.document.results, self.document.analysed_project
        if results is None or project is None:
            reason = self.document.error or "the project has not been analysed"
            raise ExchangeError(f"there are no results to show: {reason}")
        return project, results

    def _file_name(self) -> str:
        path = self.document.file_path
        return Path(path).name if path is not None else ""

    def _stem(self) -> str:
        path = self.document.file_path
        return Path(path).stem if path is not None else "poise"

    def _folder(self) -> str:
        path = self.document.file_path
        fallback = str(Path(path).parent) if path is not None else str(Path.home())
        return str(self.settings.value("exchange/folder", fallback))

    def _remember_folder(self, path: str | Path) -> None:
        folder = Path(path)
        self.settings.setValue("exchange/folder", str(folder if folder.is_dir() else folder.parent))

    def _save_path(self, title: str, suffix: str, kind: str) -> Path | None:
        default = str(Path(self._folder()) / f"{self._stem()}{suffix}")
        path, _ = QFileDialog.getSaveFileName(self.window, title, default, f"{kind} (*{suffix});;All files (*)")
        if not path:
            return None
        if Path(path).suffix.lower() != suffix:
            path += suffix
        self._remember_folder(path)
        return Path(path)

    # ------------------------------------------------------------------ sheet

    def _ask_sheet_options(self) -> SheetOptions | None:
        dialog = SheetOptionsDialog(SheetOptions.load(self.settings), self.document.project, self.window)
        if dialog.exec() != QDialog.DialogCode.Accepted:
            return None
        options = dialog.options()
        options.save(self.settings)
        return options

    def export_sheet(self) -> None:
        options = self._ask_sheet_options()
        if options is None:
            return
        path = self._save_path("Export sheet as PDF", ".pdf", "PDF files")
        if path is not None:
            content = self.export_sheet_to(path, options)
            self._status(f"Sheet written to {path} (level {content.level}, {PAPER_NAMES[options.paper]}).")

    def export_sheet_to(self, path: str | Path, options: SheetOptions) -> SheetContent:
        project, results = self.analysed()
        return export_sheet_pdf(project, results, path, options.paper, options.landscape, options.level,
                                file_name=self._file_name())

    def printer(self, options: SheetOptions) -> QPrinter:
        printer = QPrinter(QPrinter.PrinterMode.HighResolution)
        printer.setPageLayout(page_layout(options.paper, options.landscape))
        printer.setDocName(f"{self.document.project.name} — plan sheet")
        return printer

    def paint_sheet(self, printer: QPrinter, options: SheetOptions) -> SheetContent:
        """Paint the sheet on ``printer`` (a real printer, the preview's or a PDF printer)."""
        project, results = self.analysed()
        painter = QPainter()
        if not painter.begin(printer):
            raise ExchangeError("the printer could not start a page")
        try:
            page = printer.pageLayout().paintRectPixels(printer.resolution())
            return render_sheet(painter, QRectF(0, 0, page.width(), page.height()), project, results,
                                options.level, file_name=self._file_name())
        finally:
            painter.end()

    def print_sheet(self) -> None:
        options = self._ask_sheet_options()
        if options is None:
            return
        self.analysed()  # refuse before the print dialog if there is nothing to print
        printer = self.printer(options)
        dialog = QPrintDialog(printer, self.window)
        try:
            accepted = dialog.exec() == QDialog.DialogCode.Accepted
        finally:
            shiboken6.delete(dialog)  # gone before the printer it refers to
        if accepted:
            self.paint_sheet(printer, options)

    def preview_sheet(self) -> None:
        options = self._ask_sheet_options()
        if options is None:
            return
        self.analysed()
        # The dialog paints on this printer for its whole life; a temporary freed by Python
        # crashes the process at the first paint, so a local that outlives exec() holds it.
        printer = self.printer(options)
        dialog = QPrintPreviewDialog(printer, self.window)
        dialog.paintRequested.connect(
            lambda target: self._guarded("Preview sheet", lambda: self.paint_sheet(target, options))
        )
        try:
            dialog.exec()
        finally:
            shiboken6.delete(dialog)  # gone before the printer it paints on

    # ------------------------------------------------------------------ DXF underlay

    def import_underlay(self) -> None:
        path, _ = QFileDialog.getOpenFileName(self.window, "Import DXF underlay", self._folder(),
                                              "DXF drawings (*.dxf);;All files (*)")
        if path:
            self._remember_folder(path)
            self.import_underlay_from(path)

    def import_underlay_from(self, path: str | Path, metres_per_unit: float | None = None) -> Underlay | None:
        """Read ``path`` onto the current level, asking for the units if the drawing does not say
        them and offering to move a drawing that lies far from the plan. None if the user cancels."""
        try:
            underlay = read_underlay(path, metres_per_unit)
        except MissingUnitsError as missing:
            chosen = self._ask_units(str(missing), missing.suggestion)
            if chosen is None:
                return None
            underlay = read_underlay(path, chosen)
        level = self.document.current_level
        offset = self._offset_to_plan(underlay, level)
        if offset is not None and self._ask_move(underlay, offset):
            underlay = underlay.shifted(*offset)
        self.document.set_underlay(level, underlay.segment_list())
        self._underlays[level] = underlay
        skipped = ", ".join(f"{n} {kind}" for kind, n in underlay.skipped[:4])
        self._status(
            f"Underlay on level {level}: {len(underlay.segments)} lines, {len(underlay.closed)} closed polylines "
            f"from {Path(path).name} in {underlay.units}" + (f"; skipped {skipped}" if skipped else "") + "."
        )
        return underlay

    def _ask_units(self, question: str, suggestion: float) -> float | None:
        names = list(UNIT_CHOICES)
        items = [f"{name} ({UNIT_WORDS.get(name, name)})" for name in names]
        current = min(range(len(names)), key=lambda i: abs(math.log(UNIT_CHOICES[names[i]] / suggestion)))
        item, ok = QInputDialog.getItem(self.window, "Drawing units", question, items, current, False)
        if not ok:
            return None
        return UNIT_CHOICES[names[items.index(item)]]

    def _offset_to_plan(self, underlay: Underlay, level: int) -> tuple[float, float] | None:
        """The move that puts the drawing's lower-left corner on the plan's, if the drawing lies
        wholly away from the plan (more than its own size); None if it already overlaps."""
        x0, y0, x1, y1 = underlay.bounds
        project = self.document.project
        if project.levels:
            outline = project.levels[level - 1].outline
            px0, py0 = min(p[0] for p in outline), min(p[1] for p in outline)
            px1, py1 = max(p[0] for p in outline), max(p[1] for p in outline)
        else:
            px0 = py0 = px1 = py1 = 0.0
        size = max(x1 - x0, y1 - y0, px1 - px0, py1 - py0, 1.0)
        apart = x0 > px1 + size or x1 < px0 - size or y0 > py1 + size or y1 < py0 - size
        return (px0 - x0, py0 - y0) if apart else None

    def _ask_move(self, underlay: Underlay, offset: tuple[float, float]) -> bool:
        x0, y0, _, _ = underlay.bounds
        answer = QMessageBox.question(
            self.window,
            "Move the drawing?",
            f"The drawing starts at ({x0:,.1f}, {y0:,.1f}) m, far from the plan. Move it by "
            f"({offset[0]:,.1f}, {offset[1]:,.1f}) m so that its lower-left corner meets the plan's?",
        )
        return answer == QMessageBox.StandardButton.Yes

    def closed_polylines(self, level: int) -> tuple[ClosedPolyline, ...]:
        """The closed polylines of the underlay shown on ``level`` (empty if none is shown)."""
        underlay = self._underlays.get(level)
        if underlay is None or not self.document.underlay(level):
            return ()
        return underlay.closed

    def trace_outline(self) -> None:
        level = self.document.current_level
        candidates = self.closed_polylines(level)
        if not candidates:
            raise ExchangeError(f"level {level} has no underlay with a closed polyline: import a DXF first")
        items = [_describe(i, c) for i, c in enumerate(candidates, start=1)]
        item, ok = QInputDialog.getItem(self.window, "Trace outline from underlay",
                                        "Closed polyline to use as the outline (largest first):", items, 0, False)
        if ok:
            self.use_as_outline(candidates[items.index(item)])

    def use_as_outline(self, polyline: ClosedPolyline) -> None:
        """Make ``polyline`` the current level's outline: one undo step."""
        level = self.document.current_level
        project, dropped = commands.set_outline(self.document.project, level, polyline.ring)
        self.document.apply(project, "Trace outline from underlay")
        note = f"; {dropped} opening(s) outside it were removed (Undo restores them)" if dropped else ""
        self._status(f"Outline of level {level} traced from the underlay ({polyline.area:,.1f} m²){note}.")

    def remove_underlay(self) -> None:
        level = self.document.current_level
        self.document.set_underlay(level, [])
        self._underlays.pop(level, None)
        self._status(f"Underlay removed from level {level}.")

    # ------------------------------------------------------------------ DXF, CSV, PNG export

    def export_dxf(self) -> None:
        path = self._save_path("Export layout as DXF", ".dxf", "DXF drawings")
        if path is not None:
            self.export_dxf_to(path)
            self._status(f"Layout written to {path} (all levels, metres).")

    def export_dxf_to(self, path: str | Path) -> None:
        project, results = self.analysed()
        export_layout_dxf(project, path, results)

    def export_csv(self) -> None:
        folder = QFileDialog.getExistingDirectory(self.window, "Export results as CSV into folder", self._folder())
        if folder:
            self._remember_folder(folder)
            written = self.export_csv_to(folder)
            self._status(f"{len(written)} CSV tables written to {folder}.")

    def export_csv_to(self, folder: str | Path) -> list[Path]:
        project, results = self.analysed()
        return export_csv(project, results, folder, self._stem())

    def views(self) -> list[tuple[str, QWidget]]:
        """The views that can be saved as pictures: the plan canvas, then the visible plots."""
        found = [("Plan canvas", self.window.plan_view)]
        found += [(view_label(w), w) for w in self.window.findChildren(pg.PlotWidget) if w.isVisible()]
        return found

    def export_png(self) -> None:
        views = self.views()
        labels = [label for label, _ in views]
        label, ok = QInputDialog.getItem(self.window, "Save view as PNG", "View:", labels, 0, False)
        if not ok:
            return
        path = self._save_path("Save view as PNG", ".png", "PNG pictures")
        if path is not None:
            image = export_png(views[labels.index(label)][1], path)
            self._status(f"{label} saved to {path} ({image.width()} × {image.height()} px).")


def _describe(number: int, polyline: ClosedPolyline) -> str:
    xs, ys = [p[0] for p in polyline.ring], [p[1] for p in polyline.ring]
    return (f"{number}: {max(xs) - min(xs):.2f} × {max(ys) - min(ys):.2f} m, {polyline.area:,.1f} m², "
            f"{len(polyline.ring)} corners, layer {polyline.layer}")


def _insert_before_quit(menu: QMenu, actions: list[QAction]) -> None:
    """Add ``actions`` as one group above the menu's Quit entry (or at its end)."""
    quit_key = QKeySequence(QKeySequence.StandardKey.Quit)

    def is_quit(action: QAction) -> bool:
        by_key = not quit_key.isEmpty() and action.shortcut() == quit_key
        return by_key or action.text().replace("&", "").lower() in ("quit", "exit")

    anchor = next((a for a in menu.actions() if is_quit(a)), None)
    if anchor is None:
        menu.addSeparator()
        menu.addActions(actions)
        return
    menu.insertActions(anchor, actions)
    menu.insertSeparator(anchor)


def install(window: Any) -> ExchangeActions:
    """Add the sheet and exchange actions to ``window``'s File and View menus."""
    exchange = ExchangeActions(window)
    file_menu = window.menu("file")
    _insert_before_quit(file_menu, [exchange.print_action, exchange.preview_action, exchange.pdf_action])
    _insert_before_quit(file_menu, [exchange.underlay_action, exchange.trace_action, exchange.remove_underlay_action])
    _insert_before_quit(file_menu, [exchange.dxf_action, exchange.csv_action])
    view_menu = window.menu("view")
    view_menu.addSeparator()
    view_menu.addAction(exchange.png_action)
    return exchange
