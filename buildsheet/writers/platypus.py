"""reportlab.platypus, imported for the PDF writers (pdf.py, pdf_shapes.py) with three of the regular
expressions it compiles at import compiled on first use instead.

Importing platypus compiles, among others, three patterns that a sheet's layout never uses: in
paragraph.py a case-insensitive URI pattern over the whole Basic Multilingual Plane (`uri_pat`,
about 40 ms, a tenth of a build: it serves only the hyphenation of long URIs, `uriWasteReduce`,
which the sheets do not ask for), in lib/textsplit.py the CJK range of `cjkwrap` (`rx`, 3 ms) and in
lib/PyFontify.py the Python syntax colouring of code listings (`matchRE`, 1 ms). While platypus is
imported here, `re.compile` of those patterns returns a stand-in that compiles the pattern when
first used, so what reportlab does with them is unchanged. A pattern that reportlab changes is
compiled at import as before (only the time is lost). If platypus is already imported, this
changes nothing.
"""

from __future__ import annotations

import re
import sys

#: (start of the pattern, flags) of the patterns compiled on first use (reportlab 4-5):
#: paragraph.uri_pat, textsplit.rx, PyFontify.matchRE
DEFERRED = ((r"(^(?:[a-z0-9\.\-\+]*)://)", re.IGNORECASE),
            ("([\u2e80-\uffff])", re.UNICODE),
            (r"#[^\n]*|(^|[^a-zA-Z0-9_.\"'])(", 0))


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
        if isinstance(pattern, str) and any(flags == f and pattern.startswith(start) for start, f in DEFERRED):
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
