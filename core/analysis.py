"""The one entry point the GUI and the command line call: ``analyse(project) -> Results``.

It runs through one module-level :class:`core.engine.AnalysisSession`, so any caller that
analyses a sequence of related projects (a drag, the what-if map, a script) gets the session's
reuse; an unrelated project is simply analysed from scratch.

A validated project stays inside the model's bounds (core/model/bounds.py), so nothing here
should overflow or meet a non-finite number; should a stage still fail with a numeric or input
error, the caller gets an AnalysisError in words, never a numpy or scipy exception.
"""

from __future__ import annotations

from core.engine import AnalysisSession
from core.errors import AnalysisError, ModelError
from core.model import Project
from core.results import Results

_SESSION = AnalysisSession()


def analyse(project: Project) -> Results:
    """Masses, stiffness and modes of ``project``; raises AnalysisError if it cannot stand."""
    try:
        return _SESSION.analyse(project)
    except AnalysisError:
        raise
    except ModelError as error:
        raise AnalysisError(f"the project cannot be analysed: {error.message}") from error
    except (ArithmeticError, ValueError) as error:
        raise AnalysisError(
            "the project's numbers are out of the range Poise can compute with "
            f"({type(error).__name__}): check the sizes, masses and stiffnesses"
        ) from error
