"""Exceptions of buildsheet: every expected failure is a BuildsheetError; nothing here does I/O.

The CLI (cli.py) is the one place that turns these into a one-line message and exit status 2.
"""

from __future__ import annotations

import unicodedata

#: a key or problem longer than these is cut (a user's 300 kB value must not become a 300 kB line)
MAX_KEY_CHARS = 60
MAX_PROBLEM_CHARS = 300


def _cut(text: str, limit: int) -> str:
    return text if len(text) <= limit else text[:limit - 3] + "..."


def one_line(text: str) -> str:
    """`text` with control characters and line breaks written as escapes (\\n, \\x1b, \\u2028), so
    that a message quoting a user's value stays one line on the terminal and cannot move the cursor."""
    return "".join(ch.encode("unicode_escape").decode("ascii")
                   if unicodedata.category(ch) in ("Cc", "Cf", "Cs", "Zl", "Zp") else ch
                   for ch in str(text))


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
        key = f"`{_cut(one_line(self.key), MAX_KEY_CHARS)}`: " if self.key else ""
        return one_line(where) + key + _cut(one_line(self.problem), MAX_PROBLEM_CHARS)


class DesignError(BuildsheetError):
    """The design file is unreadable, malformed or describes an impossible antenna."""


class UnitError(BuildsheetError):
    """A quantity could not be parsed (no unit, wrong dimension, not a number)."""


class SweepError(BuildsheetError):
    """A measured sweep file (Touchstone or CSV) is unreadable or unusable."""


class RecordError(BuildsheetError):
    """An as-built entry or a file update could not be made safely."""
