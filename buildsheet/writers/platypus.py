"""reportlab.platypus, imported for the PDF writers (pdf.py, pdf_shapes.py) with one of its regular
expressions compiled on first use instead of at import.

reportlab.platypus.paragraph compiles at import a case-insensitive URI pattern over the whole Basic
Multilingual Plane (`uri_pat`), which takes about 40 ms, a tenth of a build; it serves only the
splitting of long URIs at hyphenation (`uriWasteReduce`), which the sheets never ask for. While
platypus is imported here, `re.compile` of that one pattern returns a stand-in that compiles it when
first used, so what reportlab does with it is unchanged. If reportlab's pattern changes, the
stand-in is not made and the pattern is compiled at import as before (only the time is lost).
If platypus is already imported, this changes nothing.
"""

from __future__ import annotations

import re
import sys

#: the start of reportlab.platypus.paragraph.uri_pat (reportlab 4-5), compiled with re.I
_URI_PATTERN_START = r"(^(?:[a-z0-9\.\-\+]*)://)"


class OnFirstUse:
    """A regular expression compiled by `compile_(pattern, flags)` when one of its attributes is
    first asked for (match, search, pattern, ...)."""

    __slots__ = ("_compile", "_args", "_compiled")

    def __init__(self, compile_, pattern: str, flags: int):
        self._compile = compile_
        self._args = (pattern, flags)
        self._compiled = None

    def __getattr__(self, name: str):
        if self._compiled is None:
            self._compiled = self._compile(*self._args)
        return getattr(self._compiled, name)


def _import_platypus() -> None:
    if "reportlab.platypus" in sys.modules:
        return
    compile_ = re.compile

    def deferring(pattern, flags=0):
        if flags == re.IGNORECASE and isinstance(pattern, str) and pattern.startswith(_URI_PATTERN_START):
            return OnFirstUse(compile_, pattern, flags)
        return compile_(pattern, flags)

    re.compile = deferring
    try:
        import reportlab.platypus  # noqa: F401
    finally:
        re.compile = compile_


_import_platypus()

from reportlab.platypus import (BaseDocTemplate, CondPageBreak, Flowable, Frame, ListFlowable,  # noqa: E402
                                ListItem, NextPageTemplate, PageBreak, PageTemplate, Paragraph,
                                Spacer, Table, TableStyle)

__all__ = ["BaseDocTemplate", "CondPageBreak", "Flowable", "Frame", "ListFlowable", "ListItem",
           "NextPageTemplate", "PageBreak", "PageTemplate", "Paragraph", "Spacer", "Table", "TableStyle"]
