"""The error types core raises: one for bad input, one for models that cannot be analysed."""

from __future__ import annotations


class ModelError(ValueError):
    """Bad input, located by a field path such as ``levels[2].outline``.

    Every validation failure in the model and every problem in a ``.poise`` file raises this one
    type, so callers (GUI, CLI) can show ``str(error)`` as a one-line message.
    """

    def __init__(self, path: str, message: str) -> None:
        self.path = printable(path)
        self.message = printable(message)
        super().__init__(f"{self.path}: {self.message}" if self.path else self.message)

    def within(self, prefix: str) -> ModelError:
        """The same error with its path placed under ``prefix`` (``levels[2]`` + ``outline``)."""
        if not self.path or not prefix:
            return ModelError(prefix or self.path, self.message)
        joiner = "" if self.path.startswith("[") else "."
        return ModelError(f"{prefix}{joiner}{self.path}", self.message)


def printable(text: str) -> str:
    """``text`` on one line with characters that cannot be shown (line breaks, control codes, lone
    surrogates from a bad file) escaped, so a message quoting a bad name can always be printed,
    logged and saved."""
    if text.isprintable():
        return text
    return "".join(c if c.isprintable() else repr(c)[1:-1] for c in text)


class AnalysisError(RuntimeError):
    """A valid model that cannot be analysed (a mechanism, a missing direction, …).

    ``message`` says in words which level moves how and which elements are involved;
    ``levels`` and ``elements`` name them for views that highlight the culprits.
    """

    def __init__(
        self,
        message: str,
        levels: tuple[int, ...] = (),
        elements: tuple[str, ...] = (),
    ) -> None:
        self.message = printable(message)
        self.levels = levels
        self.elements = elements
        super().__init__(self.message)
