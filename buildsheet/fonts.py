"""Fonts of every drawing and sheet: registers reportlab's bundled Vera and owns the one text-measuring
function; it draws nothing and knows no design.

Both writers use the metrics measured here, so a label placed without overlap in the layout stays
without overlap in the SVG and in the PDF. The SVG names a Vera-compatible family; the PDF embeds Vera.

Units: text sizes and widths in points (1/72 in).
"""

from __future__ import annotations

import functools
import unicodedata

from reportlab.pdfbase import pdfmetrics
from reportlab.pdfbase.ttfonts import TTFont

FONT = "Vera"
FONT_BOLD = "VeraBd"
FONT_ITALIC = "VeraIt"

# the files of reportlab's own fonts folder (the package ships Vera), found by _font_file
_FILES = {FONT: "Vera.ttf", FONT_BOLD: "VeraBd.ttf", FONT_ITALIC: "VeraIt.ttf"}


def _font_file(file: str) -> str:
    """The full path of `file` in reportlab's fonts folder, or the bare name if it is not there
    (reportlab then searches rl_config.TTFSearchPath, which includes that folder). Given a bare
    name, reportlab first tries it as a file in the current folder and then as a URL, importing
    urllib.request, http.client and ssl on the way (about 25 ms of every build), and a Vera.ttf in
    the user's current folder would be taken before its own."""
    import os

    import reportlab

    path = os.path.join(os.path.dirname(reportlab.__file__), "fonts", file)
    return path if os.path.isfile(path) else file


@functools.cache
def register_fonts() -> None:
    """Register Vera, Vera Bold and Vera Italic with reportlab (once per process)."""
    for name, file in _FILES.items():
        pdfmetrics.registerFont(TTFont(name, _font_file(file)))
    pdfmetrics.registerFontFamily(FONT, normal=FONT, bold=FONT_BOLD, italic=FONT_ITALIC,
                                  boldItalic=FONT_BOLD)


def _face(bold: bool):
    register_fonts()
    return pdfmetrics.getFont(FONT_BOLD if bold else FONT).face


@functools.lru_cache(maxsize=8192)
def text_width(text: str, size: float, bold: bool = False) -> float:
    """Advance width in points of `text` set in Vera (bold: Vera Bold) at `size` points (kept per
    text: the placement of labels and the sheet's tables ask for the same texts many times, and
    reportlab measures in Python, glyph by glyph)."""
    register_fonts()
    return pdfmetrics.stringWidth(text, FONT_BOLD if bold else FONT, size)


def ascent(size: float, bold: bool = False) -> float:
    """Height in points of the font's ascender above the baseline at `size` points."""
    return _face(bold).ascent / 1000.0 * size


def descent(size: float, bold: bool = False) -> float:
    """Depth in points of the font's descender below the baseline at `size` points (positive)."""
    return -_face(bold).descent / 1000.0 * size


def check_glyphs(text: str, bold: bool = False) -> None:
    """Raise ValueError naming the first character of `text` that Vera has no glyph for.

    Without this a missing glyph prints as an empty box (tofu) in the PDF and as whatever fallback
    font the SVG viewer picks, so the two outputs would disagree.
    """
    cmap = _face(bold).charToGlyph
    for ch in text:
        if ord(ch) not in cmap:
            name = unicodedata.name(ch, "unnamed character")
            raise ValueError(f"text {text!r} contains U+{ord(ch):04X} {name} ({ch!r}), "
                             f"which the Vera font has no glyph for")
