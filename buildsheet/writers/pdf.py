"""The PDF build sheet and the club handout booklet: owns the page layout of a sheet.Sheet and of a
handout.Booklet with reportlab platypus (page templates, the one stylesheet, flowables for each kind
of block); it decides no wording and no rounding (sheet.py and handout.py do) and writes no files
(writers/files.py does).

Pages: Letter or A4, margins of half an inch. A page template draws the furniture on every page: the
title block at the top (title, name, document ID, revision date, page n of m) and a short caution at
the bottom; the story holds the sections. In a booklet every build sheet keeps its own title block,
its pages numbered across the booklet; the booklet's own pages carry the booklet's title block.
Each document is laid out once: the numbers known only at its end (the page count m, the first page
of each part of a booklet) are PDF form XObjects (ISO 32000-1 §8.10) that the pages use by name and
that are drawn just before the file is written.
Black and white only (greys); every text in the embedded Vera; built with invariant=1 and dated by
the sheet's revision date, so the same sheet and drawings give the same bytes.

Units: points (1/72 in).
"""

from __future__ import annotations

import contextlib
import datetime
import functools
import html
import io
import os
from collections.abc import Callable, Mapping

from reportlab import rl_config
from reportlab.lib import colors
from reportlab.lib.enums import TA_RIGHT
from reportlab.lib.pagesizes import A4, LETTER
from reportlab.lib.styles import ParagraphStyle
from reportlab.lib.utils import simpleSplit
from reportlab.pdfgen.canvas import Canvas

from buildsheet import fonts
from buildsheet.drawing.shapes import Drawing
from buildsheet.blocks import Booklet, Contents, Cover, PageRef
from buildsheet.blocks import (Facts, Figures, Heading, KeyFigures, Para, Section, Sheet, Steps,
                              Table as TableBlock, WriteIn)
from buildsheet.writers.pdf_shapes import DrawingFlowable
from buildsheet.writers.platypus import (BaseDocTemplate, CondPageBreak, Flowable, Frame, ListFlowable,
                                         ListItem, NextPageTemplate, PageBreak, PageTemplate, Paragraph,
                                         Spacer, Table, TableStyle)

PAGE_SIZES = {"letter": LETTER, "a4": A4}
MARGIN = 36.0
TITLE_BLOCK_HEIGHT = 46.0
TITLE_RIGHT_WIDTH = 150.0   # the title block's right-hand box: name, document ID, date, page
TITLE_GAP = 10.0            # between the title block and the story
FOOTER_HEIGHT = 22.0
FIGURE_GAP = 12.0           # below a figure
BOX_SIZE = 8.0              # drawn check box
BOX_GAP = 3.0
CELL_PAD = 3.0
KEY_PAD = 5.0               # inside the key dimensions' cells
LOG_HEADER_HEIGHT = 16.0
LOG_ROW_HEIGHT = 24.0       # room to write by hand
MIN_FIGURE_SCALE = 0.8      # figures' 7.5 pt labels stay at 6 pt or more
COVER_TOP_GAP = 150.0       # above the cover's title
PAGE_NUMBER_ROOM = 60.0     # width of a late page number's form: "page 1234" fits at 9 pt

#: the form holding the document's page count, drawn after the last page
PAGES_FORM = "pages-total"

BLACK = colors.black
RULE = colors.Color(0.45, 0.45, 0.45)
SHADE = colors.Color(0.88, 0.88, 0.88)
LIGHT = colors.Color(0.94, 0.94, 0.94)


@functools.cache
def stylesheet() -> dict[str, ParagraphStyle]:
    """The one stylesheet of the sheet and the booklet: every paragraph style, by name."""
    fonts.register_fonts()
    base = ParagraphStyle("body", fontName=fonts.FONT, fontSize=9, leading=11.5, spaceAfter=4,
                          textColor=BLACK)
    return {
        "body": base,
        "note": ParagraphStyle("note", base, fontName=fonts.FONT_ITALIC, fontSize=8, leading=10),
        "caution": ParagraphStyle("caution", base, borderWidth=1.2,
                                  borderColor=BLACK, borderPadding=5, backColor=LIGHT, leftIndent=5,
                                  rightIndent=5, spaceBefore=6, spaceAfter=10),
        "section": ParagraphStyle("section", base, fontName=fonts.FONT_BOLD, fontSize=14, leading=17,
                                  spaceBefore=6, spaceAfter=6),
        "subheading": ParagraphStyle("subheading", base, fontName=fonts.FONT_BOLD, fontSize=10.5,
                                     leading=13, spaceBefore=8, spaceAfter=3),
        "item": ParagraphStyle("item", base, spaceAfter=2),
        "cell": ParagraphStyle("cell", base, fontSize=8, leading=9.8, spaceAfter=0),
        "cell-right": ParagraphStyle("cell-right", base, fontSize=8, leading=9.8, spaceAfter=0,
                                     alignment=TA_RIGHT),
        "head": ParagraphStyle("head", base, fontName=fonts.FONT_BOLD, fontSize=8, leading=9.8,
                               spaceAfter=0),
        "head-right": ParagraphStyle("head-right", base, fontName=fonts.FONT_BOLD, fontSize=8,
                                     leading=9.8, spaceAfter=0, alignment=TA_RIGHT),
        "fact-label": ParagraphStyle("fact-label", base, fontName=fonts.FONT_BOLD, fontSize=8.5,
                                     leading=10.5, spaceAfter=0),
        "fact": ParagraphStyle("fact", base, fontSize=8.5, leading=10.5, spaceAfter=0),
        "key-label": ParagraphStyle("key-label", base, fontName=fonts.FONT_BOLD, fontSize=9,
                                    leading=11, spaceAfter=0),
        "key-value": ParagraphStyle("key-value", base, fontName=fonts.FONT_BOLD, fontSize=24,
                                    leading=29, spaceAfter=0),
        "key-row": ParagraphStyle("key-row", base, fontName=fonts.FONT_BOLD, fontSize=19, leading=24,
                                  spaceAfter=0),
        "key-meaning": ParagraphStyle("key-meaning", base, fontSize=7.5, leading=9, spaceAfter=0),
        "contents": ParagraphStyle("contents", base, fontSize=9.5, leading=12, spaceAfter=0),
        "contents-detail": ParagraphStyle("contents-detail", base, fontSize=8, leading=10,
                                          spaceAfter=0),
        "cover-title": ParagraphStyle("cover-title", base, fontName=fonts.FONT_BOLD, fontSize=28,
                                      leading=34, spaceAfter=14),
        "cover-event": ParagraphStyle("cover-event", base, fontSize=16, leading=20, spaceAfter=6),
        "cover-date": ParagraphStyle("cover-date", base, fontSize=12, leading=15, spaceAfter=30),
    }


def _table_style(commands: list) -> TableStyle:
    """A table's style; its cells' own font is Vera too (reportlab's default would name Helvetica,
    which is not embedded, even where every cell holds a paragraph)."""
    return TableStyle([("FONT", (0, 0), (-1, -1), fonts.FONT, 8)] + commands)


def _frame_height(paper: str) -> float:
    return PAGE_SIZES[paper][1] - 2 * MARGIN - TITLE_BLOCK_HEIGHT - TITLE_GAP - FOOTER_HEIGHT


class _CachedParagraph(Paragraph):
    """A paragraph that breaks its lines once per width: platypus wraps a block several times at
    the same width (the room a section needs, the table around it, the frame), and breaking lines
    is the costliest step of the layout."""

    def wrap(self, availWidth, availHeight):
        cache = self.__dict__.setdefault("_wrapped", {})
        if availWidth not in cache:
            size = super().wrap(availWidth, availHeight)
            cache[availWidth] = (size, self.blPara, self._wrapWidths)
        (self.width, self.height), self.blPara, self._wrapWidths = cache[availWidth]
        return self.width, self.height


class _CheckBoxes(Flowable):
    """`count` drawn check boxes in a row (Vera has no ballot-box glyph)."""

    def __init__(self, count: int):
        super().__init__()
        self.count = count
        self.width = count * BOX_SIZE + (count - 1) * BOX_GAP
        self.height = BOX_SIZE

    def wrap(self, availWidth, availHeight):
        return self.width, self.height

    def draw(self):
        self.canv.setLineWidth(0.7)
        self.canv.setStrokeColor(BLACK)
        for i in range(self.count):
            self.canv.rect(i * (BOX_SIZE + BOX_GAP), 0, BOX_SIZE, BOX_SIZE, stroke=1, fill=0)


class _WriteIn(Flowable):
    """Ruled blank rows with a header: at least `min_rows`, as many as the frame has room for."""

    def __init__(self, block: WriteIn, width: float):
        super().__init__()
        self.block = block
        self.avail_width = width

    def _table(self, rows: int) -> Table:
        st = stylesheet()
        total = sum(self.block.widths)
        widths = [self.avail_width * w / total for w in self.block.widths]
        data = [[_CachedParagraph(h, st["head"]) for h in self.block.header]] + [[""] * len(widths)] * rows
        table = Table(data, colWidths=widths, rowHeights=[LOG_HEADER_HEIGHT] + [LOG_ROW_HEIGHT] * rows)
        table.setStyle(_table_style([
            ("GRID", (0, 0), (-1, -1), 0.5, BLACK),
            ("BACKGROUND", (0, 0), (-1, 0), SHADE),
            ("VALIGN", (0, 0), (-1, 0), "MIDDLE"),
        ]))
        return table

    def wrap(self, availWidth, availHeight):
        rows = max(self.block.min_rows, int((availHeight - LOG_HEADER_HEIGHT - 1) // LOG_ROW_HEIGHT))
        self.table = self._table(rows)
        self.width, self.height = self.table.wrap(availWidth, availHeight)
        return self.width, self.height

    def split(self, availWidth, availHeight):
        return []       # the log is never split: it moves to the next page whole

    def draw(self):
        self.table.drawOn(self.canv, 0, 0)


class _FitDrawing(DrawingFlowable):
    """A drawing that shrinks, down to MIN_FIGURE_SCALE of its size, into the room left on the page,
    so that a page holds two figures instead of one figure and a gap; with less room it moves on to
    the next page."""

    def wrap(self, availWidth, availHeight):
        width, height = super().wrap(availWidth, availHeight)
        if height > availHeight >= MIN_FIGURE_SCALE * self.drawing.height:
            self.scale = availHeight / self.drawing.height
            self.width, self.height = self.drawing.width * self.scale, self.drawing.height * self.scale
        return self.width, self.height


class _PageNumber(Flowable):
    """The first page of a booklet's part (a PageRef), right-aligned in the room given: a form
    drawn once the booklet is laid out (see _Document)."""

    def __init__(self, form: str, style: ParagraphStyle):
        super().__init__()
        self.form = form
        self.style = style

    def wrap(self, availWidth, availHeight):
        self.width, self.height = availWidth, self.style.leading
        return self.width, self.height

    def draw(self):
        self.canv.saveState()
        self.canv.translate(self.width, self.style.leading - self.style.fontSize)
        self.canv.doForm(self.form)
        self.canv.restoreState()


class _Anchor(Flowable):
    """Takes no room: marks where a part of a booklet starts, as a PDF destination and an outline
    entry, and tells `on_page(key, page)` the page it lands on."""

    def __init__(self, key: str, title: str, on_page: Callable[[str, int], None]):
        super().__init__()
        self.key = key
        self.title = title
        self.on_page = on_page

    def wrap(self, availWidth, availHeight):
        return 0, 0

    def draw(self):
        self.canv.bookmarkPage(self.key)
        self.canv.addOutlineEntry(self.title, self.key, level=0)
        self.on_page(self.key, self.canv.getPageNumber())


class _Blocks:
    """Turns sheet blocks into flowables for one page size; `page_form(key, style)` names the form
    of a PageRef's number (booklets only)."""

    def __init__(self, paper: str, drawings: Mapping[str, Drawing],
                 page_form: Callable[[str, str], str] | None = None):
        self.drawings = drawings
        self.page_form = page_form
        self.frame_width = PAGE_SIZES[paper][0] - 2 * MARGIN
        self.frame_height = _frame_height(paper)
        self.st = stylesheet()

    # -- story ------------------------------------------------------------------------------
    def story(self, sections) -> list:
        out: list = []
        for i, section in enumerate(sections):
            if section.new_page and i:
                out.append(PageBreak())
            out += self.section(section)
        return out

    def section(self, section: Section) -> list:
        """The section's flowables, each heading and note kept with the start of what follows it
        (a CondPageBreak asks for the room they need together), and every table and figure
        started only where its first rows, or the figure at its smallest, fit."""
        parts = [(True, [_CachedParagraph(section.title, self.st["section"])])]
        parts += [(_leads_in(block), self.block(block)) for block in section.blocks]
        needs: list[float] = []
        after = 0.0
        for leads, flowables in reversed(parts):
            after = self.height(flowables) + after if leads else self.start_height(flowables)
            needs.append(min(after, self.frame_height))
        out: list = []
        for (leads, flowables), need in zip(parts, reversed(needs)):
            if leads or isinstance(flowables[0], (Table, _FitDrawing)):
                out.append(CondPageBreak(need))
            out += flowables
        return out

    def height(self, flowables: list) -> float:
        """Height of the flowables at their natural size, with the space around them, points."""
        total = 0.0
        for f in flowables:
            total += f.wrap(self.frame_width, self.frame_height)[1] + f.getSpaceBefore() + f.getSpaceAfter()
        return total

    def start_height(self, flowables: list) -> float:
        """The least room the first flowable may start in: a table's header and first three rows, a
        figure at its smallest, the log at its least number of rows, three lines of text."""
        f = flowables[0]
        lines = 3 * self.st["body"].leading
        if isinstance(f, _WriteIn):
            return LOG_HEADER_HEIGHT + f.block.min_rows * LOG_ROW_HEIGHT
        if isinstance(f, ListFlowable):
            return lines
        height = f.wrap(self.frame_width, self.frame_height)[1]
        if isinstance(f, _FitDrawing):
            return height * MIN_FIGURE_SCALE
        if isinstance(f, Table):
            return sum(f._rowHeights[:4])
        return min(height, lines)

    def block(self, block) -> list:
        if isinstance(block, Heading):
            return [_CachedParagraph(block.text, self.st["subheading"])]
        if isinstance(block, Para):
            return [_CachedParagraph(block.text, self.st[block.style])]
        if isinstance(block, Steps):
            return [self.steps(block)]
        if isinstance(block, KeyFigures):
            return [self.key_figures(block)]
        if isinstance(block, Facts):
            return [self.facts(block)]
        if isinstance(block, TableBlock):
            return [self.table(block)]
        if isinstance(block, WriteIn):
            return [_WriteIn(block, self.frame_width)]
        if isinstance(block, Figures):
            return self.figures(block)
        if isinstance(block, Contents):
            return [self.contents(block)]
        raise TypeError(f"not a sheet block: {block!r}")

    def steps(self, block: Steps) -> ListFlowable:
        st = self.st["item"]
        return ListFlowable([ListItem(_CachedParagraph(text, st)) for text in block.items],
                            bulletType="1", bulletFormat="%s.", bulletFontName=fonts.FONT_BOLD,
                            bulletFontSize=st.fontSize, leftIndent=16, spaceAfter=4)

    def key_figures(self, block: KeyFigures) -> Table:
        """The key dimensions in one row when every value fits its quarter of the frame in the
        "key-row" style, else two by two in the larger "key-value" (leaving the overview room on
        the first page when it can)."""
        st = self.st
        row_style = st["key-row"]
        room = self.frame_width / len(block.figures) - 2 * KEY_PAD
        in_a_row = all(fonts.text_width(html.unescape(f.value), row_style.fontSize, bold=True) <= room
                       for f in block.figures)
        # more than four (a stacked antenna's six): three to a row in the row style where they fit
        room3 = self.frame_width / 3 - 2 * KEY_PAD
        in_threes = not in_a_row and len(block.figures) > 4 and all(
            fonts.text_width(html.unescape(f.value), row_style.fontSize, bold=True) <= room3
            for f in block.figures)
        value_style = row_style if in_a_row or in_threes else st["key-value"]
        cells = [[_CachedParagraph(f.label, st["key-label"]), _CachedParagraph(f.value, value_style),
                  _CachedParagraph(f.meaning, st["key-meaning"])] for f in block.figures]
        columns = len(cells) if in_a_row else 3 if in_threes else 2
        rows = [cells[i:i + columns] for i in range(0, len(cells), columns)]
        width = self.frame_width / columns
        table = Table(rows, colWidths=[width] * columns, spaceAfter=6)
        table.setStyle(_table_style([
            ("BOX", (0, 0), (-1, -1), 1.2, BLACK),
            ("INNERGRID", (0, 0), (-1, -1), 0.6, BLACK),
            ("VALIGN", (0, 0), (-1, -1), "TOP"),
            ("LEFTPADDING", (0, 0), (-1, -1), KEY_PAD),
            ("RIGHTPADDING", (0, 0), (-1, -1), KEY_PAD),
            ("TOPPADDING", (0, 0), (-1, -1), 5),
            ("BOTTOMPADDING", (0, 0), (-1, -1), 6),
        ]))
        return table

    def facts(self, block: Facts) -> Table:
        st = self.st
        data = [[_CachedParagraph(label, st["fact-label"]), _CachedParagraph(value, st["fact"])]
                for label, value in block.rows]
        table = Table(data, colWidths=[0.26 * self.frame_width, 0.74 * self.frame_width], spaceAfter=4)
        table.setStyle(_table_style([
            ("LINEBELOW", (0, 0), (-1, -1), 0.3, RULE),
            ("VALIGN", (0, 0), (-1, -1), "TOP"),
            ("LEFTPADDING", (0, 0), (-1, -1), CELL_PAD),
            ("TOPPADDING", (0, 0), (-1, -1), 2),
            ("BOTTOMPADDING", (0, 0), (-1, -1), 3),
        ]))
        return table

    def cell(self, content, style: str):
        """A table cell: paragraph markup, or a PageRef's number."""
        if isinstance(content, PageRef):
            return _PageNumber(self.page_form(content.key, style), self.st[style])
        return _CachedParagraph(content, self.st[style])

    def table(self, block: TableBlock) -> Table:
        head = [self.cell(h, "head-right" if a == "right" else "head")
                for h, a in zip(block.header, block.align)]
        body = [[self.cell(c, "cell-right" if a == "right" else "cell") for c, a in zip(row, block.align)]
                for row in block.rows]
        total = sum(block.widths)
        room = self.frame_width
        if block.boxes is not None:
            box_col = max(block.boxes) * (BOX_SIZE + BOX_GAP) - BOX_GAP + 2 * CELL_PAD + 2
            room -= box_col
            head = [""] + head
            body = [[_CheckBoxes(n)] + row for n, row in zip(block.boxes, body)]
        widths = [room * w / total for w in block.widths]
        if block.boxes is not None:
            widths = [box_col] + widths
        n = len(block.header) + (block.boxes is not None)
        blank = [[""] * n] * block.blank_rows
        heights = [None] * (1 + len(body)) + [LOG_ROW_HEIGHT] * block.blank_rows
        table = Table([head] + body + blank, colWidths=widths, rowHeights=heights, repeatRows=1,
                      spaceAfter=6)
        table.setStyle(_table_style([
            ("GRID", (0, 0), (-1, -1), 0.4, RULE),
            ("BOX", (0, 0), (-1, -1), 0.8, BLACK),
            ("BACKGROUND", (0, 0), (-1, 0), SHADE),
            ("VALIGN", (0, 0), (-1, -1), "TOP"),
            ("LEFTPADDING", (0, 0), (-1, -1), CELL_PAD),
            ("RIGHTPADDING", (0, 0), (-1, -1), CELL_PAD),
            ("TOPPADDING", (0, 0), (-1, -1), 3),
            ("BOTTOMPADDING", (0, 0), (-1, -1), 3),
        ]))
        return table

    def contents(self, block: Contents) -> Table:
        """The contents: each entry's title (a link to its page) and detail, its page number at the
        right edge; ruled, no grid."""
        st = self.st
        rows = [[[_CachedParagraph(f'<a href="#{e.key}">{e.title}</a>', st["contents"]),
                  _CachedParagraph(e.detail, st["contents-detail"])],
                 _PageNumber(self.page_form(e.key, "contents"), st["contents"])]
                for e in block.entries]
        table = Table(rows, colWidths=[self.frame_width - PAGE_NUMBER_ROOM, PAGE_NUMBER_ROOM],
                      repeatRows=0, spaceAfter=6)
        table.setStyle(_table_style([
            ("LINEBELOW", (0, 0), (-1, -1), 0.3, RULE),
            ("VALIGN", (0, 0), (-1, -1), "TOP"),
            ("LEFTPADDING", (0, 0), (-1, -1), CELL_PAD),
            ("RIGHTPADDING", (0, 0), (-1, -1), CELL_PAD),
            ("TOPPADDING", (0, 0), (-1, -1), 4),
            ("BOTTOMPADDING", (0, 0), (-1, -1), 4),
        ]))
        return table

    def cover(self, cover: Cover) -> list:
        """The cover: title, event and date large, then its facts and a caution."""
        st = self.st
        out: list = [Spacer(self.frame_width, COVER_TOP_GAP),
                     _CachedParagraph(cover.title, st["cover-title"])]
        if cover.event:
            out.append(_CachedParagraph(cover.event, st["cover-event"]))
        out.append(_CachedParagraph(cover.date, st["cover-date"]))
        out.append(self.facts(Facts(cover.facts)))
        out.append(_CachedParagraph(cover.note, st["caution"]))
        return out

    def figure(self, key: str) -> DrawingFlowable:
        drawing = self.drawings[key]
        # never taller than an empty page's frame: a figure cannot be split
        fit = self.frame_height * 0.98 * drawing.width / drawing.height
        flowable = _FitDrawing(drawing, max_width=min(self.frame_width, fit))
        flowable.spaceAfter = FIGURE_GAP
        return flowable

    def figures(self, block: Figures) -> list:
        """Figures in order, one below the other (each is the frame's width or less)."""
        return [self.figure(key) for key in block.keys]


def _leads_in(block) -> bool:
    """Headings and notes introduce what follows them: they never end a page alone."""
    return isinstance(block, Heading) or (isinstance(block, Para) and block.style == "note")


# ----------------------------------------------------------------------------------------------
# Page furniture

class _Furniture:
    """The title block and caution footer of a page (plain text, drawn as given): `title` and
    `subtitle` at the left, `lines` and the page label at the right (`bold` the index of the line
    set in bold, or None); the page count comes from the PAGES_FORM form. Every text is fitted to
    its room once, not on every page."""

    def __init__(self, paper: str, title: str, subtitle: str, lines: tuple, bold: int | None,
                 page_label: str, footer: str, title_block: bool = True):
        self.page_width, self.page_height = PAGE_SIZES[paper]
        self.x0, self.x1 = MARGIN, self.page_width - MARGIN
        room = self.x1 - TITLE_RIGHT_WIDTH - self.x0 - 16
        self.title_lines, self.title_size = _fit_title(title, room)
        self.subtitle = _clip(subtitle, 7.5, room, bold=False)
        self.lines = [(_clip(line, 8, TITLE_RIGHT_WIDTH - 12, i == bold), i == bold)
                      for i, line in enumerate(lines)]
        self.page_label = page_label.partition("{pages}")[0]    # the count m comes from the form
        self.footer = simpleSplit(footer, fonts.FONT, 7, self.x1 - self.x0)
        self.title_block = title_block

    @classmethod
    def of_sheet(cls, sheet: Sheet) -> "_Furniture":
        return cls(sheet.paper, sheet.title, sheet.subtitle, sheet.furniture, 1, sheet.page_label,
                   sheet.footer)

    def draw(self, canvas, page: int) -> None:
        x0, x1 = self.x0, self.x1
        canvas.saveState()
        canvas.setStrokeColor(BLACK)
        canvas.setFillColor(BLACK)
        if self.title_block:
            self._title_block(canvas, page)
        # footer: a rule and the caution
        canvas.setLineWidth(0.5)
        canvas.line(x0, MARGIN + FOOTER_HEIGHT - 4, x1, MARGIN + FOOTER_HEIGHT - 4)
        canvas.setFont(fonts.FONT, 7)
        y = MARGIN + FOOTER_HEIGHT - 13
        for line in self.footer:
            canvas.drawString(x0, y, line)
            y -= 8.5
        canvas.restoreState()

    def _title_block(self, canvas, page: int) -> None:
        x0, x1 = self.x0, self.x1
        right_w = TITLE_RIGHT_WIDTH
        top = self.page_height - MARGIN
        bottom = top - TITLE_BLOCK_HEIGHT
        canvas.setLineWidth(1.2)
        canvas.rect(x0, bottom, x1 - x0, TITLE_BLOCK_HEIGHT, stroke=1, fill=0)
        canvas.setLineWidth(0.6)
        canvas.line(x1 - right_w, bottom, x1 - right_w, top)
        # title: one line as large as fits, else two lines
        size = self.title_size
        y = top - 8 - size if len(self.title_lines) == 1 else top - 6 - size
        for line in self.title_lines:
            canvas.setFont(fonts.FONT_BOLD, size)
            canvas.drawString(x0 + 8, y, line)
            y -= size * 1.15
        canvas.setFont(fonts.FONT, 7.5)
        canvas.drawString(x0 + 8, bottom + 6, self.subtitle)
        x = x1 - right_w + 7
        y = top - 11
        for line, bold in self.lines:
            canvas.setFont(fonts.FONT_BOLD if bold else fonts.FONT, 8)
            canvas.drawString(x, y, line)
            y -= 10
        # "page n of " now, the count m from the form drawn at the end
        before = self.page_label.format(page=page)
        canvas.setFont(fonts.FONT, 8)
        canvas.drawString(x, y, before)
        canvas.saveState()
        canvas.translate(x + fonts.text_width(before, 8), y)
        canvas.doForm(PAGES_FORM)
        canvas.restoreState()


def _fit_title(title: str, room: float) -> tuple[list[str], float]:
    """The title as one line at the largest size from 13 to 10 pt that fits `room` points, else up to
    two lines at 9.5 pt, a line still too long (more text, or one long word) cut short with '...'."""
    for size in (13.0, 12.0, 11.0, 10.0):
        if fonts.text_width(title, size, bold=True) <= room:
            return [title], size
    size = 9.5
    lines = simpleSplit(title, fonts.FONT_BOLD, size, room)
    lines = [lines[0], " ".join(lines[1:])] if len(lines) > 1 else lines
    return [_clip(line, size, room) for line in lines], size


def _clip(text: str, size: float, room: float, bold: bool = True) -> str:
    """`text` at `size` pt, shortened with '...' until it fits `room` points."""
    if fonts.text_width(text, size, bold) <= room:
        return text
    while fonts.text_width(text + "...", size, bold) > room:
        text = text[:-1]
    return text.rstrip() + "..."


# ----------------------------------------------------------------------------------------------
# Documents

class _LateCanvas(Canvas):
    """A canvas that calls `before_save(canvas)` after the last page and before the file is
    written, to draw the forms the pages refer to by name."""

    def __init__(self, *args, before_save: Callable[[Canvas], None], **kwargs):
        super().__init__(*args, **kwargs)
        self._before_save = before_save

    def save(self):
        self._before_save(self)
        super().save()


class _Document:
    """One PDF laid out in one pass: page templates by id (each with its furniture), the story, and
    the late forms: the page count (PAGES_FORM, after the label's "of ") and the first page of each
    anchored part (right-aligned, one form per part and paragraph style)."""

    def __init__(self, paper: str, *, title: str, subject: str, keywords: str,
                 on_anchor: Callable[[str], None] | None = None):
        self.paper = paper
        self.meta = dict(title=title, subject=subject, keywords=keywords)
        self.on_anchor = on_anchor
        self.templates: list[PageTemplate] = []
        self.pages = 0
        self.anchors: dict[str, int] = {}
        self.page_forms: dict[str, tuple[str, str]] = {}    # form name -> (part key, style)

    def add_template(self, template_id: str, furniture: _Furniture, frame_height: float) -> None:
        width, _ = PAGE_SIZES[self.paper]
        frame = Frame(MARGIN, MARGIN + FOOTER_HEIGHT, width - 2 * MARGIN, frame_height,
                      leftPadding=0, rightPadding=0, topPadding=0, bottomPadding=0, id="story")

        def draw(canvas, doc):
            self.pages = doc.page
            furniture.draw(canvas, doc.page)

        self.templates.append(PageTemplate(id=template_id, frames=[frame], onPage=draw))

    def anchor(self, key: str, title: str) -> _Anchor:
        return _Anchor(key, title, self._landed)

    def _landed(self, key: str, page: int) -> None:
        self.anchors[key] = page
        if self.on_anchor:
            self.on_anchor(key)

    def page_form(self, key: str, style: str) -> str:
        """The name of the form that prints the first page of part `key` in paragraph `style`."""
        name = f"page-of-{key}-{style}"
        self.page_forms[name] = (key, style)
        return name

    def _late_forms(self, canvas: Canvas) -> None:
        canvas.beginForm(PAGES_FORM, 0, -3, PAGE_NUMBER_ROOM, 12)
        canvas.setFillColor(BLACK)
        canvas.setFont(fonts.FONT, 8)
        canvas.drawString(0, 0, str(self.pages))
        canvas.endForm()
        st = stylesheet()
        for name, (key, style) in sorted(self.page_forms.items()):
            s = st[style]
            canvas.beginForm(name, -PAGE_NUMBER_ROOM, -s.fontSize, 0, s.leading)
            canvas.setFillColor(BLACK)
            canvas.setFont(s.fontName, s.fontSize)
            canvas.drawRightString(0, 0, str(self.anchors[key]))
            canvas.endForm()

    def build(self, story: list, date: str) -> tuple[bytes, int]:
        """The PDF of `story` dated `date` (YYYY-MM-DD), and its number of pages."""
        out = io.BytesIO()
        width, height = PAGE_SIZES[self.paper]
        doc = BaseDocTemplate(
            out, pagesize=(width, height), leftMargin=MARGIN, rightMargin=MARGIN,
            topMargin=MARGIN + TITLE_BLOCK_HEIGHT + TITLE_GAP, bottomMargin=MARGIN + FOOTER_HEIGHT,
            author="buildsheet", creator="buildsheet", invariant=1, pageCompression=1,
            # the canvas opens every page in this font: Vera, so that no unembedded font is named
            initialFontName=fonts.FONT, initialFontSize=9, **self.meta)
        doc.addPageTemplates(self.templates)
        with _reproducible(date):
            doc.build(story, canvasmaker=functools.partial(_LateCanvas, before_save=self._late_forms))
        return out.getvalue(), self.pages


@contextlib.contextmanager
def _reproducible(date: str):
    """reportlab dates an invariant PDF (its CreationDate, ModDate and the /ID derived from them) by
    SOURCE_DATE_EPOCH when set (the reproducible-builds convention), else by 2000-01-01. Set it to
    the document's date for the build, so the PDF carries that date whatever the environment
    holds. Streams are written Flate-compressed only, without reportlab's default ASCII85 layer
    over them (a quarter larger and slower to write, and needless in a binary file). Both are
    restored afterwards."""
    saved = os.environ.get("SOURCE_DATE_EPOCH")
    saved_a85 = rl_config.useA85
    day = datetime.datetime(*(int(part) for part in date.split("-")), tzinfo=datetime.timezone.utc)
    os.environ["SOURCE_DATE_EPOCH"] = str(int(day.timestamp()))
    rl_config.useA85 = 0
    try:
        yield
    finally:
        rl_config.useA85 = saved_a85
        if saved is None:
            del os.environ["SOURCE_DATE_EPOCH"]
        else:
            os.environ["SOURCE_DATE_EPOCH"] = saved


def render_pdf(sheet: Sheet, drawings: Mapping[str, Drawing]) -> bytes:
    """The PDF of `sheet` with its figures from `drawings` (key -> Drawing), as bytes."""
    document = _Document(sheet.paper, title=sheet.title, subject=sheet.subject,
                         keywords=f"{sheet.name} {sheet.document_id}")
    document.add_template("page", _Furniture.of_sheet(sheet), _frame_height(sheet.paper))
    return document.build(_Blocks(sheet.paper, drawings).story(sheet.sections), sheet.date)[0]


def render_booklet(booklet: Booklet, on_sheet: Callable[[int], None] | None = None
                   ) -> tuple[bytes, int]:
    """The PDF of `booklet` and its number of pages. Every sheet is laid out on the booklet's paper;
    `on_sheet(i)` is called as the i-th sheet (from 0) starts."""
    paper = booklet.paper
    order = {part.key: i for i, part in enumerate(booklet.sheets)}

    def anchored(key: str) -> None:
        if on_sheet and key in order:
            on_sheet(order[key])

    document = _Document(paper, title=booklet.title, subject=booklet.subject,
                         keywords=" ".join(f"{s.sheet.name} {s.sheet.document_id}"
                                           for s in booklet.sheets),
                         on_anchor=anchored)
    cover = _Furniture(paper, booklet.title, booklet.subtitle, (), None, booklet.page_label,
                       booklet.footer, title_block=False)
    front = _Furniture(paper, booklet.title, booklet.subtitle, booklet.furniture, None,
                       booklet.page_label, booklet.footer)
    document.add_template("cover", cover, PAGE_SIZES[paper][1] - 2 * MARGIN - FOOTER_HEIGHT)
    document.add_template("front", front, _frame_height(paper))
    blocks = _Blocks(paper, {}, document.page_form)
    story: list = [*blocks.cover(booklet.cover), NextPageTemplate("front")]
    for section in booklet.front:
        story += [PageBreak(), document.anchor(section.key, section.title), *blocks.section(section)]
    for part in booklet.sheets:
        document.add_template(part.key, _Furniture.of_sheet(part.sheet), _frame_height(paper))
        story += [NextPageTemplate(part.key), PageBreak(),
                  document.anchor(part.key, f"{part.sheet.title} ({part.sheet.document_id})"),
                  *_Blocks(paper, part.drawings).story(part.sheet.sections)]
    return document.build(story, booklet.date)
