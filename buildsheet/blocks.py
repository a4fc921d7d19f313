"""The block types of the build sheet and of the club booklet: format-neutral content that
writers/pdf.py lays out (the reportlab platypus idea of a story of blocks). sheet.py and handout.py
fill them with words and numbers; this module holds only the types, so that the writer needs neither.
Strings in blocks are paragraph markup; page furniture is plain text.
"""

from __future__ import annotations

from collections.abc import Mapping

from buildsheet.drawing.shapes import Drawing
from buildsheet.valueclass import valueclass


# ----------------------------------------------------------------------------------------------
# The build sheet's blocks (sheet.py fills them)

@valueclass
class Heading:
    """A subheading inside a section."""
    text: str


@valueclass
class Para:
    """A paragraph; style: body | note | caution."""
    text: str
    style: str = "body"


@valueclass
class Steps:
    """Numbered steps."""
    items: tuple


@valueclass
class KeyFigure:
    """One key dimension: its label, value and what it means."""
    label: str
    value: str
    meaning: str


@valueclass
class KeyFigures:
    """The key dimensions, printed large."""
    figures: tuple


@valueclass
class Facts:
    """Label and value rows."""
    rows: tuple


@valueclass
class Table:
    """A table: header, rows, relative column widths, alignment per column (left | right).
    boxes: per row, how many check boxes to draw in an extra first column (None: no such column);
    blank_rows: ruled empty rows after the rows, tall enough to write in by hand."""
    header: tuple
    rows: tuple
    widths: tuple
    align: tuple
    boxes: tuple | None = None
    blank_rows: int = 0


@valueclass
class WriteIn:
    """Blank ruled rows to fill in by hand: at least min_rows, more if the page has room."""
    header: tuple
    widths: tuple
    min_rows: int


@valueclass
class Figures:
    """Drawings by their key in figures(); set side by side where they fit."""
    keys: tuple


@valueclass
class Section:
    """A titled section of blocks, optionally starting a new page."""
    key: str
    title: str
    blocks: tuple
    new_page: bool = False


@valueclass
class Sheet:
    """The whole sheet: page furniture (plain text) and sections in order (markup)."""
    title: str
    name: str
    document_id: str
    date: str
    paper: str
    units: str
    subtitle: str             # under the title in the title block
    furniture: tuple          # the title block's right-hand lines: name, document ID (bold), date
    page_label: str           # with {page} and {pages}
    footer: str
    subject: str              # PDF metadata
    sections: tuple

    def section(self, key: str) -> Section:
        return next(s for s in self.sections if s.key == key)


# ----------------------------------------------------------------------------------------------
# Blocks of the booklet's own pages (handout.py fills them)

@valueclass
class PageRef:
    """The booklet page on which the part named `key` starts (a table cell; the writer fills it in)."""
    key: str


@valueclass
class ContentsEntry:
    """One line of the contents: a part's title, its detail and its key."""
    title: str
    detail: str
    key: str


@valueclass
class Contents:
    """The contents: one entry per part, each with the page its part starts on."""
    entries: tuple


@valueclass
class Cover:
    """The cover page: title, event (may be empty), date, label and value rows, a caution."""
    title: str
    event: str
    date: str
    facts: tuple
    note: str


@valueclass
class Part:
    """One design prepared for the booklet: its sheet and figures, and its row of the summary."""
    key: str
    sheet: Sheet
    drawings: Mapping[str, Drawing]
    band: str                  # the band's name, or its edges, plain text
    frequency_hz: float
    v_peak_v: float            # the highest voltage of the design, at either open end, V peak
    power_w: float             # the transmitter's PEP those voltages are for, W
    row: tuple


@valueclass
class Booklet:
    """The whole handout: page furniture of its own pages (plain text), the cover, the front
    sections (safety, contents, summary) and the sheets, in order."""
    title: str
    event: str
    date: str
    paper: str
    subtitle: str
    furniture: tuple
    page_label: str
    footer: str
    subject: str
    cover: Cover
    front: tuple
    sheets: tuple
