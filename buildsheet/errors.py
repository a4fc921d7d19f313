"""Exceptions of buildsheet: every expected failure is a BuildsheetError; nothing here does I/O.

The CLI (cli.py) is the one place that turns these into a one-line message and exit status 2.
"""

from __future__ import annotations


class BuildsheetError(Exception):
    """A problem with the user's input that the user can fix.

    file: path of the file concerned (or None); key: dotted key path in the design ("stub.line");
    line: 1-based line number in the file (or None); problem: what is wrong and what is expected.
    """

    def __init__(self, problem: str, *, file: str | None = None, key: str | None = None,
                 line: int | None = None):
        super().__init__(problem)
        self.problem = problem
        self.file = file
        self.key = key
        self.line = line

    def located(self, *, file: str | None = None, key: str | None = None,
                line: int | None = None) -> "BuildsheetError":
        """Return the same error with missing location fields filled in."""
        self.file = self.file or file
        self.key = self.key or key
        self.line = self.line or line
        return self

    def __str__(self) -> str:
        where = ""
        if self.file:
            where = self.file + (f":{self.line}" if self.line else "") + ": "
        elif self.line:
            where = f"line {self.line}: "
        key = f"`{self.key}`: " if self.key else ""
        return f"{where}{key}{self.problem}"


class DesignError(BuildsheetError):
    """The design file is unreadable, malformed or describes an impossible antenna."""


class UnitError(BuildsheetError):
    """A quantity could not be parsed (no unit, wrong dimension, not a number)."""


class SweepError(BuildsheetError):
    """A measured sweep file (Touchstone or CSV) is unreadable or unusable."""


class RecordError(BuildsheetError):
    """An as-built entry or a file update could not be made safely."""
