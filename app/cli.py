"""The ``poise`` command: open the editor, or analyse a project file in the terminal.

``poise [FILE]`` opens the editor (on a bundled sample without FILE); ``poise analyse FILE`` prints a
readable summary, ``--json`` the documented JSON of :mod:`core.report.summary`; ``map`` and
``suggest`` are in :mod:`app.guidance.cli`. Bad input ends with exit
status 2 and a one-line message on standard error, never a traceback.
"""

from __future__ import annotations

import argparse
import json
import sys
from collections.abc import Sequence
from pathlib import Path

from core.errors import AnalysisError, ModelError, printable

BAD_INPUT = 2


def _analyse_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="poise analyse", description="Analyse a .poise project and print the results."
    )
    parser.add_argument("file", type=Path, help="the .poise project file")
    parser.add_argument(
        "--json", action="store_true", help="print the results as JSON (layout in core/report/summary.py)"
    )
    return parser


COMMANDS = {
    "analyse": "analyse FILE [--json]: print the results of a project (or their JSON)",
    "sheet": "sheet FILE -o OUT.pdf [--level N] [--paper a4|letter] [--landscape]: write the one-page sheet",
    "map": "map FILE --element ID [--measure M] [--csv OUT.csv | --png OUT.png]: where the element could stand",
    "suggest": "suggest FILE --element ID [--measure M] [--on outline|edges|grid]: where to move the element",
}
"""The commands besides opening the editor, with the help line of each (``poise COMMAND --help`` tells more)."""


def _editor_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="poise",
        description="Concept-stage lateral layout: open the editor on FILE, or run one of the commands below.",
        epilog="commands:\n" + "\n".join(f"  poise {line}" for line in COMMANDS.values())
        + "\n\n'poise COMMAND --help' describes a command's options.",
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("file", nargs="?", type=Path, help="a .poise project to open (default: a bundled sample)")
    return parser


def run_analyse(arguments: argparse.Namespace) -> int:
    """Print the summary or JSON of one project file."""
    from core.analysis import analyse
    from core.model.fileio import load_project
    from core.report.summary import format_summary, results_to_dict

    project = load_project(arguments.file)
    results = analyse(project)
    if arguments.json:
        print(json.dumps(results_to_dict(project, results), indent=2, ensure_ascii=False))
    else:
        print(format_summary(project, results))
    return 0


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the ``poise`` script."""
    args = list(sys.argv[1:] if argv is None else argv)
    try:
        if args and args[0] == "analyse":
            return run_analyse(_analyse_parser().parse_args(args[1:]))
        if args and args[0] == "sheet":
            from app.sheet_cli import run_sheet, sheet_parser

            return run_sheet(sheet_parser().parse_args(args[1:]))
        if args and args[0] in ("map", "suggest"):
            from app.guidance import cli as guidance_cli

            if args[0] == "map":
                return guidance_cli.run_map(guidance_cli.map_parser().parse_args(args[1:]))
            return guidance_cli.run_suggest(guidance_cli.suggest_parser().parse_args(args[1:]))
        arguments = _editor_parser().parse_args(args)
        if arguments.file is not None and not arguments.file.is_file():
            raise ModelError("", f"no such project file: {arguments.file}")
        from app.main_window import run

        return run(arguments.file)
    except (ModelError, AnalysisError) as error:
        return _refuse(str(error))
    except OSError as error:
        return _refuse(f"{error.strerror or error}: {error.filename or ''}".rstrip(": "))
    except Exception as error:  # a defect of Poise: still one line, never a traceback
        return _refuse(f"unexpected {type(error).__name__}: {error} (a defect of Poise; please report it)")


def _refuse(message: str) -> int:
    """One line on standard error, whatever it holds and whatever the terminal's encoding."""
    line = printable(message)
    encoding = getattr(sys.stderr, "encoding", None) or "utf-8"
    print("poise: " + line.encode(encoding, "backslashreplace").decode(encoding), file=sys.stderr)
    return BAD_INPUT


if __name__ == "__main__":
    sys.exit(main())
