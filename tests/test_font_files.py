"""fonts.py registers the Vera files reportlab ships (its fonts folder), by full path: a bare name
would be tried in the current folder first (a stray Vera.ttf there would be embedded) and then as a
URL. Source of the files: reportlab's package data (Bitstream Vera, bitstream-vera-license.txt)."""

import os

import reportlab
from reportlab.pdfbase import pdfmetrics

from buildsheet import fonts


def test_vera_files_are_reportlabs_own(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    (tmp_path / "Vera.ttf").write_bytes(b"not a font")     # must not be picked up
    folder = os.path.join(os.path.dirname(reportlab.__file__), "fonts")
    for file in fonts._FILES.values():
        path = fonts._font_file(file)
        assert os.path.isabs(path) and os.path.dirname(path) == folder and os.path.isfile(path)
    fonts.register_fonts()
    assert pdfmetrics.getFont(fonts.FONT).face.filename == fonts._font_file("Vera.ttf")
