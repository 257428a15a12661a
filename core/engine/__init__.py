"""The analysis engine: sessions that analyse a sequence of related project states, recomputing
only what each edit touches, and the vectorised what-if of one element's position."""

from core.engine.session import AnalysisSession

__all__ = ["AnalysisSession"]
