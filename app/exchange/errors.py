"""The one error type for files Poise cannot read or write in exchange formats (DXF, CSV, PNG)."""

from __future__ import annotations


class ExchangeError(ValueError):
    """A drawing or export file that cannot be read or written; ``str(error)`` is one clear line."""


class MissingUnitsError(ExchangeError):
    """The drawing does not say its units ($INSUNITS unitless or unusual): the caller must ask.

    ``suggestion`` is a guess (metres per drawing unit) from the drawing's extent, for the question.
    """

    def __init__(self, message: str, suggestion: float) -> None:
        super().__init__(message)
        self.suggestion = suggestion
