"""The one entry point the GUI and the command line call: ``analyse(project) -> Results``.

It runs through one module-level :class:`core.engine.AnalysisSession`, so any caller that
analyses a sequence of related projects (a drag, the what-if map, a script) gets the session's
reuse; an unrelated project is simply analysed from scratch.
"""

from __future__ import annotations

from core.engine import AnalysisSession
from core.model import Project
from core.results import Results

_SESSION = AnalysisSession()


def analyse(project: Project) -> Results:
    """Masses, stiffness and modes of ``project``; raises AnalysisError if it cannot stand."""
    return _SESSION.analyse(project)
