"""The PDF build sheet: owns the page layout of a sheet.Sheet with reportlab platypus (page template,
the one stylesheet, flowables for each kind of block); it decides no wording and no rounding
(sheet.py does) and writes no files (writers/files.py does).

Pages: Letter or A4, margins of half an inch. The page template draws the furniture on every page: the
title block at the top (title, name, document ID, revision date, page n of m) and a short caution at
the bottom; the story holds the sections. The sheet is built twice, the first time only to count the
pages for "page n of m" (the furniture has a fixed size, so the count cannot change).
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
from collections.abc import Mapping

from reportlab.lib import colors
from reportlab.lib.enums import TA_RIGHT
from reportlab.lib.pagesizes import A4, LETTER
from reportlab.lib.styles import ParagraphStyle
from reportlab.lib.utils import simpleSplit
from reportlab.platypus import (BaseDocTemplate, CondPageBreak, Flowable, Frame, ListFlowable, ListItem,
                                PageBreak, PageTemplate, Paragraph, Table, TableStyle)

from buildsheet import fonts
from buildsheet.drawing.shapes import Drawing
from buildsheet.sheet import (Facts, Figures, Heading, KeyFigures, Para, Section, Sheet, Steps,
                              Table as TableBlock, WriteIn)
from buildsheet.writers.pdf_shapes import DrawingFlowable

PAGE_SIZES = {"letter": LETTER, "a4": A4}
MARGIN = 36.0
TITLE_BLOCK_HEIGHT = 46.0
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

BLACK = colors.black
RULE = colors.Color(0.45, 0.45, 0.45)
SHADE = colors.Color(0.88, 0.88, 0.88)
LIGHT = colors.Color(0.94, 0.94, 0.94)


@functools.cache
def stylesheet() -> dict[str, ParagraphStyle]:
    """The one stylesheet of the sheet: every paragraph style, by name."""
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
    }


def _table_style(commands: list) -> TableStyle:
    """A table's style; its cells' own font is Vera too (reportlab's default would name Helvetica,
    which is not embedded, even where every cell holds a paragraph)."""
    return TableStyle([("FONT", (0, 0), (-1, -1), fonts.FONT, 8)] + commands)


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
        data = [[Paragraph(h, st["head"]) for h in self.block.header]] + [[""] * len(widths)] * rows
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


class _Layout:
    """Turns sheet blocks into flowables for one page size."""

    def __init__(self, sheet: Sheet, drawings: Mapping[str, Drawing]):
        self.sheet = sheet
        self.drawings = drawings
        self.page_width, self.page_height = PAGE_SIZES[sheet.paper]
        self.frame_width = self.page_width - 2 * MARGIN
        self.frame_height = (self.page_height - 2 * MARGIN - TITLE_BLOCK_HEIGHT - TITLE_GAP
                             - FOOTER_HEIGHT)
        self.st = stylesheet()

    # -- story ------------------------------------------------------------------------------
    def story(self) -> list:
        out: list = []
        for i, section in enumerate(self.sheet.sections):
            if section.new_page and i:
                out.append(PageBreak())
            out += self.section(section)
        return out

    def section(self, section: Section) -> list:
        """The section's flowables, each heading and note kept with the start of what follows it
        (a CondPageBreak asks for the room they need together), and every table and figure
        started only where its first rows, or the figure at its smallest, fit."""
        parts = [(True, [Paragraph(section.title, self.st["section"])])]
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
            return [Paragraph(block.text, self.st["subheading"])]
        if isinstance(block, Para):
            return [Paragraph(block.text, self.st[block.style])]
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
        raise TypeError(f"not a sheet block: {block!r}")

    def steps(self, block: Steps) -> ListFlowable:
        st = self.st["item"]
        return ListFlowable([ListItem(Paragraph(text, st)) for text in block.items], bulletType="1",
                            bulletFormat="%s.", bulletFontName=fonts.FONT_BOLD,
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
        value_style = row_style if in_a_row else st["key-value"]
        cells = [[Paragraph(f.label, st["key-label"]), Paragraph(f.value, value_style),
                  Paragraph(f.meaning, st["key-meaning"])] for f in block.figures]
        columns = len(cells) if in_a_row else 2
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
        data = [[Paragraph(label, st["fact-label"]), Paragraph(value, st["fact"])]
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

    def table(self, block: TableBlock) -> Table:
        st = self.st
        head = [Paragraph(h, st["head-right" if a == "right" else "head"])
                for h, a in zip(block.header, block.align)]
        body = [[Paragraph(c, st["cell-right" if a == "right" else "cell"]) for c, a in zip(row, block.align)]
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

    # -- page furniture ---------------------------------------------------------------------
    def furniture(self, canvas, page: int, pages: int | None) -> None:
        """Title block and caution footer of one page (plain text, drawn as given)."""
        sheet = self.sheet
        x0, x1 = MARGIN, self.page_width - MARGIN
        top = self.page_height - MARGIN
        bottom = top - TITLE_BLOCK_HEIGHT
        right_w = 150.0
        canvas.saveState()
        canvas.setStrokeColor(BLACK)
        canvas.setFillColor(BLACK)
        canvas.setLineWidth(1.2)
        canvas.rect(x0, bottom, x1 - x0, TITLE_BLOCK_HEIGHT, stroke=1, fill=0)
        canvas.setLineWidth(0.6)
        canvas.line(x1 - right_w, bottom, x1 - right_w, top)
        # title: one line as large as fits, else two lines
        room = x1 - right_w - x0 - 16
        lines, size = _fit_title(sheet.title, room)
        y = top - 8 - size if len(lines) == 1 else top - 6 - size
        for line in lines:
            canvas.setFont(fonts.FONT_BOLD, size)
            canvas.drawString(x0 + 8, y, line)
            y -= size * 1.15
        canvas.setFont(fonts.FONT, 7.5)
        canvas.drawString(x0 + 8, bottom + 6, _clip(sheet.subtitle, 7.5, room, bold=False))
        lines = list(sheet.furniture) + [sheet.page_label.format(page=page, pages=pages or "?")]
        y = top - 11
        for i, line in enumerate(lines):
            bold = i == 1                       # the document ID
            canvas.setFont(fonts.FONT_BOLD if bold else fonts.FONT, 8)
            canvas.drawString(x1 - right_w + 7, y, _clip(line, 8, right_w - 12, bold))
            y -= 10
        # footer: a rule and the caution
        canvas.setLineWidth(0.5)
        canvas.line(x0, MARGIN + FOOTER_HEIGHT - 4, x1, MARGIN + FOOTER_HEIGHT - 4)
        canvas.setFont(fonts.FONT, 7)
        y = MARGIN + FOOTER_HEIGHT - 13
        for line in simpleSplit(sheet.footer, fonts.FONT, 7, x1 - x0):
            canvas.drawString(x0, y, line)
            y -= 8.5
        canvas.restoreState()

    def build(self, pages: int | None) -> tuple[bytes, int]:
        out = io.BytesIO()
        counted = {"pages": 0}

        def on_page(canvas, doc):
            counted["pages"] = doc.page
            self.furniture(canvas, doc.page, pages)

        doc = BaseDocTemplate(
            out, pagesize=(self.page_width, self.page_height), leftMargin=MARGIN, rightMargin=MARGIN,
            topMargin=MARGIN + TITLE_BLOCK_HEIGHT + TITLE_GAP, bottomMargin=MARGIN + FOOTER_HEIGHT,
            title=self.sheet.title, author="buildsheet", subject=self.sheet.subject,
            creator="buildsheet", keywords=f"{self.sheet.name} {self.sheet.document_id}",
            invariant=1, pageCompression=1,
            # the canvas opens every page in this font: Vera, so that no unembedded font is named
            initialFontName=fonts.FONT, initialFontSize=9)
        frame = Frame(MARGIN, MARGIN + FOOTER_HEIGHT, self.frame_width, self.frame_height,
                      leftPadding=0, rightPadding=0, topPadding=0, bottomPadding=0, id="story")
        doc.addPageTemplates([PageTemplate(id="page", frames=[frame], onPage=on_page)])
        doc.build(self.story())
        return out.getvalue(), counted["pages"]


def _leads_in(block) -> bool:
    """Headings and notes introduce what follows them: they never end a page alone."""
    return isinstance(block, Heading) or (isinstance(block, Para) and block.style == "note")


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


@contextlib.contextmanager
def _source_date(date: str):
    """reportlab dates an invariant PDF (its CreationDate, ModDate and the /ID derived from them) by
    SOURCE_DATE_EPOCH when set (the reproducible-builds convention), else by 2000-01-01. Set it to
    the sheet's revision date for the build, so the PDF carries that date whatever the environment
    holds, and restore it afterwards."""
    saved = os.environ.get("SOURCE_DATE_EPOCH")
    day = datetime.datetime.strptime(date, "%Y-%m-%d").replace(tzinfo=datetime.timezone.utc)
    os.environ["SOURCE_DATE_EPOCH"] = str(int(day.timestamp()))
    try:
        yield
    finally:
        if saved is None:
            del os.environ["SOURCE_DATE_EPOCH"]
        else:
            os.environ["SOURCE_DATE_EPOCH"] = saved


def render_pdf(sheet: Sheet, drawings: Mapping[str, Drawing]) -> bytes:
    """The PDF of `sheet` with its figures from `drawings` (key -> Drawing), as bytes."""
    layout = _Layout(sheet, drawings)
    with _source_date(sheet.date):
        _, pages = layout.build(None)
        data, _ = layout.build(pages)
    return data
