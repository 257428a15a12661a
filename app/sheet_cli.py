"""``poise sheet FILE -o OUT.pdf``: the one-page plan sheet from the command line, offscreen.

Wired into :mod:`app.cli` with :func:`add_sheet_command` and :func:`run_sheet`. Bad input (a
missing or invalid project, a model that cannot be analysed, a level the project does not have,
an output file that cannot be written) ends with exit status 2 and a one-line message.
"""

from __future__ import annotations

import argparse
import os
import sys
from pathlib import Path

from app.cli import BAD_INPUT
from core.errors import AnalysisError, ModelError


def add_sheet_command(subparsers: argparse._SubParsersAction) -> argparse.ArgumentParser:
    """Add the ``sheet`` command to an argparse ``subparsers`` group; returns its parser."""
    parser = subparsers.add_parser(
        "sheet",
        help="write the one-page plan sheet as PDF",
        description="Write the one-page plan sheet of a .poise project as a PDF (no display needed).",
    )
    parser.add_argument("file", type=Path, help="the .poise project file")
    parser.add_argument("-o", "--output", type=Path, required=True, metavar="OUT.pdf", help="the PDF to write")
    parser.add_argument("--level", type=int, metavar="N",
                        help="level drawn in plan, 1 = lowest floor above the base (default: the worst torsion ratio)")
    parser.add_argument("--paper", choices=("a4", "letter"), default="a4", help="paper size (default a4)")
    parser.add_argument("--landscape", action="store_true", help="landscape page (default portrait)")
    parser.add_argument("--revision", default="", help="revision for this print (default: the project's revision)")
    parser.add_argument("--date", help="date shown in the title block (default today, YYYY-MM-DD)")
    parser.set_defaults(command="sheet")
    return parser


def sheet_parser() -> argparse.ArgumentParser:
    """A stand-alone parser of ``poise sheet``'s arguments (for a CLI without subparsers)."""
    root = argparse.ArgumentParser(prog="poise")
    return add_sheet_command(root.add_subparsers())


def _gui_application() -> object:
    """The running QGuiApplication, or a new offscreen one (fonts need Qt, a display does not)."""
    from PySide6.QtGui import QGuiApplication

    app = QGuiApplication.instance()
    if app is None:
        os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
        app = QGuiApplication(["poise"])
    return app


def run_sheet(args: argparse.Namespace) -> int:
    """Write the sheet; prints one line saying what was written. Returns the exit status."""
    from app.sheet.pdf import export_sheet_pdf
    from core.analysis import analyse
    from core.model.fileio import load_project

    try:
        project = load_project(args.file)
        results = analyse(project)
        _app = _gui_application()
        content = export_sheet_pdf(project, results, args.output, args.paper, args.landscape, args.level,
                                   file_name=Path(args.file).name, revision=args.revision, date=args.date)
    except (ModelError, AnalysisError, ValueError) as error:
        print(f"poise sheet: {error}", file=sys.stderr)
        return BAD_INPUT
    except OSError as error:
        print(f"poise sheet: {error.strerror or error}: {error.filename or args.output}", file=sys.stderr)
        return BAD_INPUT
    orientation = "landscape" if args.landscape else "portrait"
    print(f"wrote {args.output}: {project.name}, level {content.level} in plan, {args.paper} {orientation}")
    return 0
