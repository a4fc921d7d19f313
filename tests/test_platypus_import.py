"""buildsheet.writers.platypus imports reportlab.platypus with paragraph's URI pattern compiled on
first use: the stand-in must answer exactly as the compiled pattern does, and `re.compile` must be
reportlab's and Python's own again afterwards.

Reference: Python's `re` module (the same pattern compiled with re.compile, re.IGNORECASE).
"""

import re
import subprocess
import sys

from buildsheet.writers.platypus import OnFirstUse

URIS = ["https://example.org/a/b/c", "HTTP://EXAMPLE.ORG/", "ftp://192.168.0.1:21/x", "mailto:x@y.z",
        "www.example.org/long/path", "not a uri", "", "http://[::1]/", "http://-bad-.org/"]


def test_stand_in_answers_as_the_compiled_pattern():
    pattern = r"(^(?:[a-z0-9\.\-\+]*)://)(?:\S+)?\Z"
    lazy = OnFirstUse(re.compile, pattern, re.IGNORECASE)
    real = re.compile(pattern, re.IGNORECASE)
    for uri in URIS:
        a, b = lazy.match(uri), real.match(uri)
        assert (a and a.groups()) == (b and b.groups())
    assert lazy.pattern == real.pattern and lazy.flags == real.flags


def test_build_import_keeps_reportlab_behaviour():
    """In a fresh process: after the PDF writer's import, paragraph.uri_pat matches as reportlab's
    pattern compiled by re itself, and re.compile is the original function."""
    code = """
import re
original = re.compile
import buildsheet.writers.pdf
from reportlab.platypus import paragraph
from buildsheet.writers.platypus import OnFirstUse
assert re.compile is original
assert isinstance(paragraph.uri_pat, OnFirstUse), type(paragraph.uri_pat)
real = re.compile(paragraph.uri_pat.pattern, re.IGNORECASE)
for uri in %r:
    a, b = paragraph.uri_pat.match(uri), real.match(uri)
    assert (a and a.groups()) == (b and b.groups()), uri
print("ok")
""" % (URIS,)
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip() == "ok"
