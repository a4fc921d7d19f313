"""buildsheet.writers.platypus imports reportlab.platypus with three of its import-time regular
expressions (paragraph.uri_pat, textsplit.rx, PyFontify.matchRE) compiled on first use: each
stand-in must answer exactly as the compiled pattern does, and `re.compile` must be Python's own
again afterwards.

Reference: Python's `re` module (the same pattern compiled by re.compile with the same flags).
"""

import re
import subprocess
import sys

from buildsheet.writers.platypus import OnFirstUse

URIS = ["https://example.org/a/b/c", "HTTP://EXAMPLE.ORG/", "ftp://192.168.0.1:21/x", "mailto:x@y.z",
        "www.example.org/long/path", "not a uri", "", "http://[::1]/", "http://-bad-.org/"]
CJK = ["plain text", "漢字かな交じり文", "mixed 中文 text", "⺀\uffff"]
CODE = ["import os\nx = 'a' # note\n", "def f(): return None", "s = \"\"\"doc\"\"\" and lambda: 0"]


def test_stand_in_answers_as_the_compiled_pattern():
    pattern = r"(^(?:[a-z0-9\.\-\+]*)://)(?:\S+)?\Z"
    lazy = OnFirstUse(re.compile, pattern, re.IGNORECASE)
    real = re.compile(pattern, re.IGNORECASE)
    for uri in URIS:
        a, b = lazy.match(uri), real.match(uri)
        assert (a and a.groups()) == (b and b.groups())
    assert lazy.pattern == real.pattern and lazy.flags == real.flags


def test_build_import_keeps_reportlab_behaviour():
    """In a fresh process: after the PDF writer's import, each deferred pattern answers as reportlab's
    pattern compiled by re itself, and re.compile is the original function."""
    code = """
import re
original = re.compile
import buildsheet.writers.pdf
from reportlab.platypus import paragraph
from reportlab.lib import PyFontify, textsplit
from buildsheet.writers.platypus import OnFirstUse
assert re.compile is original
for lazy in (paragraph.uri_pat, textsplit.rx, PyFontify.matchRE):
    assert isinstance(lazy, OnFirstUse), type(lazy)
uri = re.compile(paragraph.uri_pat.pattern, re.IGNORECASE)
for text in %r:
    a, b = paragraph.uri_pat.match(text), uri.match(text)
    assert (a and a.groups()) == (b and b.groups()), text
cjk = re.compile(textsplit.rx.pattern, re.UNICODE)
for text in %r:
    assert textsplit.rx.sub(r"\\1\\0 ", text) == cjk.sub(r"\\1\\0 ", text), text
py = re.compile(PyFontify.matchRE.pattern)
for text in %r:
    assert [m.span() for m in PyFontify.matchRE.finditer(text)] == [m.span() for m in py.finditer(text)]
print("ok")
""" % (URIS, CJK, CODE)
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip() == "ok"
