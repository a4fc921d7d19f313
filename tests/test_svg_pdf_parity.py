"""The SVG writer (writers/svg.py) and the PDF shape renderer (writers/pdf_shapes.py) render the same
primitives of the same drawing: same elements in the same order, same geometry, same texts.

References: the SVG is parsed back with xml.etree (W3C SVG 1.1 attribute meanings: viewBox, points,
path arc flags, text-anchor, rotate()); the PDF with pypdf (text extraction, font descriptors per
ISO 32000-1 §9.8: an embedded TrueType font has a /FontFile2 stream). The PDF calls are recorded by
instrumenting reportlab's canvas.
"""

import io
import math
import re
import xml.etree.ElementTree as ET

import numpy as np
import pypdf
import pytest
from reportlab.lib.pagesizes import A4
from reportlab.platypus import SimpleDocTemplate
from reportlab.platypus.doctemplate import LayoutError
from reportlab.pdfgen.canvas import Canvas

from buildsheet import fonts
from buildsheet.drawing.plots import smith_chart, swr_plot
from buildsheet.drawing.shapes import (Arc, BreakMark, Circle, Dimension, Drawing, Hatch, Leader,
                                       Line, Polyline, Rect, Text)
from buildsheet.writers.pdf_shapes import DrawingFlowable, draw_on_canvas
from buildsheet.writers.svg import render_svg

SVG = "{http://www.w3.org/2000/svg}"
TOL = 2e-3          # the SVG writes coordinates to 1/1000 pt


def sample_part() -> Drawing:
    """A dimensioned part using every primitive and composite, with dashes, greys and rotations."""
    return Drawing(300, 220, [
        Rect(40, 60, 200, 40),
        Hatch(40, 60, 30, 40),
        Hatch(210, 60, 30, 40, grey=0.8),
        Rect(210, 60, 30, 40),
        Circle(140, 80, 8),
        Circle(100, 80, 3, width=0, fill=0.3),
        Arc(140, 80, 14, 30, 120, dash=(2, 1.5)),
        Arc(140, 80, 20, 200, -250, stroke=0.5),
        Dimension(40, 100, 240, 100, "1.234 m", -18),
        Dimension(240, 100, 240, 60, "40 mm", -16),
        Dimension(70, 60, 80, 60, "10 mm", 14),
        BreakMark(20, 150, 260, 150, at=0.4),
        Leader(140, 72, 190, 30, "hole \u00d8 6 mm, \u00b10.1"),
        Leader(55, 80, 20, 30, "ins.", end="dot"),
        Text(150, 160, "rotated -90", rotation=-90),
        Text(290, 185, "end anchored, bold", anchor="end", bold=True),
        Text(200, 140, "two  spaces & <escapes>", size=6),
        Polyline(((20, 200), (60, 190), (100, 205), (140, 195)), dash=(3, 2), stroke=0.5),
    ], "sample part")


def sample_plots() -> list[Drawing]:
    """SWR plot and Smith chart of a made-up smooth series-resonant load (not a model)."""
    f = np.linspace(13.9e6, 14.45e6, 111)
    z = 55 + 1j * 50 * 30 * (f / 14.175e6 - 14.175e6 / f)
    g = np.abs((z - 50) / (z + 50))
    swr = (1 + g) / (1 - g)
    swr_tx = (1 + 0.8 * g) / (1 - 0.8 * g)
    lo, hi = np.flatnonzero(swr < 2)[[0, -1]]
    edges = (float(np.interp(2, [swr[lo], swr[lo - 1]], [f[lo], f[lo - 1]])),
             float(np.interp(2, [swr[hi], swr[hi + 1]], [f[hi], f[hi + 1]])))
    return [swr_plot(f, swr, swr_tx, (14.0e6, 14.35e6), 14.175e6, edges, 480, 230, "SWR"),
            smith_chart(f, z, 50.0, (14.0e6, 14.35e6), 14.175e6, 300, "Feed impedance")]


DRAWINGS = [sample_part(), *sample_plots()]


# ---------------------------------------------------------------- SVG trace

def _f(s: str) -> float:
    return float(s)


def _grey_of(colour: str | None) -> float:
    # "none" goes with a width of 0 in the trace; the PDF side records black for it.
    if colour in (None, "black", "none"):
        return 0.0
    return int(colour[1:3], 16) / 255


def _dash_of(attr: str | None):
    return tuple(float(v) for v in attr.split()) if attr else None


def _fill_of(el):
    fill = el.get("fill")
    return None if fill is None else _grey_of(fill)


def _width_of(el) -> float:
    return 0.0 if el.get("stroke") == "none" else _f(el.get("stroke-width"))


def svg_trace(svg: bytes) -> list[tuple]:
    root = ET.fromstring(svg)
    group = root.find(f"{SVG}g")
    out = []
    for el in group:
        tag = el.tag.removeprefix(SVG)
        if tag == "line":
            out.append(("line", _f(el.get("x1")), _f(el.get("y1")), _f(el.get("x2")),
                        _f(el.get("y2")), _width_of(el), _grey_of(el.get("stroke")),
                        _dash_of(el.get("stroke-dasharray"))))
        elif tag in ("polyline", "polygon"):
            pts = tuple(tuple(map(float, p.split(","))) for p in el.get("points").split())
            out.append(("poly", tag == "polygon", pts, _fill_of(el), _width_of(el),
                        _dash_of(el.get("stroke-dasharray"))))
        elif tag == "circle":
            out.append(("circle", _f(el.get("cx")), _f(el.get("cy")), _f(el.get("r")),
                        _fill_of(el), _width_of(el), _grey_of(el.get("stroke"))))
        elif tag == "path":
            m = re.fullmatch(r"M([-\d.]+),([-\d.]+) A([-\d.]+),([-\d.]+) 0 ([01]) ([01]) "
                             r"([-\d.]+),([-\d.]+)", el.get("d"))
            sx, sy, r, _, large, sweep, ex, ey = m.groups()
            out.append(("arc", _f(sx), _f(sy), _f(ex), _f(ey), _f(r), int(large), int(sweep),
                        _dash_of(el.get("stroke-dasharray")), _grey_of(el.get("stroke"))))
        elif tag == "text":
            rot = 0
            if el.get("transform"):
                rot = -int(re.match(r"rotate\((-?\d+) ", el.get("transform")).group(1))
            out.append(("text", el.text, _f(el.get("x")), _f(el.get("y")), _f(el.get("font-size")),
                        el.get("font-weight") == "bold", el.get("text-anchor", "start"), rot))
        else:
            raise AssertionError(f"unexpected SVG element {tag}")
    return out


# ---------------------------------------------------------------- PDF trace

class RecordingCanvas(Canvas):
    """A reportlab canvas that also records every drawing call, mapped back to drawing points."""

    def __init__(self, *args, drawing_height, origin=(0.0, 0.0), scale=1.0, **kw):
        super().__init__(*args, **kw)
        self.trace: list[tuple] = []
        self._h, self._o, self._s = drawing_height, origin, scale
        self._state = {"width": 1.0, "stroke": 0.0, "fill": 0.0, "dash": None, "font": None,
                       "shift": None, "rot": 0}
        self._stack = []

    def _back(self, x, y):
        return (x - self._o[0]) / self._s, self._h - (y - self._o[1]) / self._s

    def saveState(self):
        self._stack.append(dict(self._state))
        super().saveState()

    def restoreState(self):
        self._state = self._stack.pop()
        super().restoreState()

    def setLineWidth(self, width):
        self._state["width"] = width / self._s
        super().setLineWidth(width)

    def setStrokeGray(self, gray, alpha=None):
        self._state["stroke"] = gray
        super().setStrokeGray(gray, alpha)

    def setFillGray(self, gray, alpha=None):
        self._state["fill"] = gray
        super().setFillGray(gray, alpha)

    def setDash(self, array=[], phase=0):
        self._state["dash"] = tuple(a / self._s for a in array) or None
        super().setDash(array, phase)

    def setFont(self, psfontname, size, leading=None):
        self._state["font"] = (psfontname, size / self._s)
        super().setFont(psfontname, size, leading)

    def translate(self, dx, dy):
        self._state["shift"] = (dx, dy)
        super().translate(dx, dy)

    def rotate(self, theta):
        self._state["rot"] = theta
        super().rotate(theta)

    def line(self, x1, y1, x2, y2):
        s = self._state
        self.trace.append(("line", *self._back(x1, y1), *self._back(x2, y2), s["width"],
                           s["stroke"], s["dash"]))
        super().line(x1, y1, x2, y2)

    def drawPath(self, path, stroke=1, fill=0, fillMode=None):
        ops = path.getCode().split()
        pts, closed, i = [], False, 0
        while i < len(ops):
            if ops[i] in ("m", "l"):
                pts.append(self._back(float(ops[i - 2]), float(ops[i - 1])))
            closed = closed or ops[i] == "h"
            i += 1
        s = self._state
        self.trace.append(("poly", closed, tuple(pts), s["fill"] if fill else None,
                           s["width"] if stroke else 0.0, s["dash"] if stroke else None))
        super().drawPath(path, stroke, fill, fillMode)

    def circle(self, x_cen, y_cen, r, stroke=1, fill=0):
        s = self._state
        self.trace.append(("circle", *self._back(x_cen, y_cen), r / self._s,
                           s["fill"] if fill else None, s["width"] if stroke else 0.0,
                           s["stroke"] if stroke else 0.0))
        super().circle(x_cen, y_cen, r, stroke, fill)

    def arc(self, x1, y1, x2, y2, startAng=0, extent=90):
        cx, cy = self._back((x1 + x2) / 2, (y1 + y2) / 2)
        r = (x2 - x1) / 2 / self._s
        end = startAng + extent
        sx, sy = cx + r * math.cos(math.radians(startAng)), cy - r * math.sin(math.radians(startAng))
        ex, ey = cx + r * math.cos(math.radians(end)), cy - r * math.sin(math.radians(end))
        s = self._state
        self.trace.append(("arc", sx, sy, ex, ey, r, int(abs(extent) > 180), int(extent < 0),
                           s["dash"], s["stroke"]))
        super().arc(x1, y1, x2, y2, startAng, extent)

    def _text(self, anchor, x, y, text):
        s = self._state
        if s["shift"] is not None:
            x, y = s["shift"][0] + x, s["shift"][1] + y
        font, size = s["font"]
        self.trace.append(("text", text, *self._back(x, y), size, font == fonts.FONT_BOLD, anchor,
                           int(round(s["rot"]))))

    def drawString(self, x, y, text, *a, **kw):
        self._text("start", x, y, text)
        super().drawString(x, y, text, *a, **kw)

    def drawCentredString(self, x, y, text, *a, **kw):
        self._text("middle", x, y, text)
        super().drawCentredString(x, y, text, *a, **kw)

    def drawRightString(self, x, y, text, *a, **kw):
        self._text("end", x, y, text)
        super().drawRightString(x, y, text, *a, **kw)


def pdf_of(drawing: Drawing, origin=(36.0, 50.0), scale=1.0) -> tuple[bytes, list[tuple]]:
    fonts.register_fonts()
    buf = io.BytesIO()
    c = RecordingCanvas(buf, pagesize=(drawing.width * scale + 72, drawing.height * scale + 100),
                        invariant=1, initialFontName=fonts.FONT, drawing_height=drawing.height,
                        origin=origin, scale=scale)
    draw_on_canvas(c, drawing, origin[0], origin[1], scale)
    c.showPage()
    c.save()
    return buf.getvalue(), c.trace


def _same(a, b) -> bool:
    if isinstance(a, tuple) and isinstance(b, tuple):
        return len(a) == len(b) and all(_same(x, y) for x, y in zip(a, b))
    if isinstance(a, float) or isinstance(b, float):
        return a is not None and b is not None and abs(a - b) <= TOL
    return a == b


# ---------------------------------------------------------------- tests

@pytest.mark.parametrize("drawing", DRAWINGS, ids=lambda d: d.title)
@pytest.mark.parametrize("scale", [1.0, 0.7])
def test_svg_and_pdf_render_the_same_primitives(drawing, scale):
    svg = svg_trace(render_svg(drawing))
    _, pdf = pdf_of(drawing, scale=scale)
    prims = drawing.primitives()
    assert len(svg) == len(pdf) == len(prims)
    kind = {Line: "line", Polyline: "poly", Circle: "circle", Arc: "arc", Text: "text"}
    assert [t[0] for t in svg] == [t[0] for t in pdf] == [kind[type(p)] for p in prims]
    for i, (s, p) in enumerate(zip(svg, pdf)):
        assert _same(s, p), f"primitive {i} ({prims[i]!r}) differs:\n svg {s}\n pdf {p}"


@pytest.mark.parametrize("drawing", DRAWINGS, ids=lambda d: d.title)
def test_pdf_text_extracts_to_the_drawings_texts(drawing):
    data, _ = pdf_of(drawing)
    page = pypdf.PdfReader(io.BytesIO(data)).pages[0]
    found = []
    page.extract_text(visitor_text=lambda t, *_: found.append(t.strip()) if t.strip() else None)
    want = [t.text for t in drawing.texts()]
    assert sorted(found) == sorted(want)
    svg_texts = [el.text for el in ET.fromstring(render_svg(drawing)).iter(f"{SVG}text")]
    assert svg_texts == want


def test_pdf_embeds_vera_and_nothing_else():
    data, _ = pdf_of(sample_part())
    page = pypdf.PdfReader(io.BytesIO(data)).pages[0]
    names = []
    for ref in page["/Resources"]["/Font"].values():
        font = ref.get_object()
        names.append(str(font["/BaseFont"]))
        assert "/FontFile2" in font["/FontDescriptor"], f"{font['/BaseFont']} is not embedded"
    assert sorted(n.split("+", 1)[1] for n in names) == ["BitstreamVeraSans-Bold",
                                                        "BitstreamVeraSans-Roman"]


def test_svg_is_xml_with_viewbox_and_physical_size():
    d = sample_part()
    root = ET.fromstring(render_svg(d))
    assert root.tag == f"{SVG}svg"
    assert root.get("viewBox") == "0 0 300 220"
    assert root.get("width") == "105.833mm"                 # 300 pt * 25.4 / 72
    assert root.get("height") == "77.611mm"
    scaled = ET.fromstring(render_svg(d, physical_width_mm=150))
    assert scaled.get("width") == "150mm" and scaled.get("height") == "110mm"
    assert root.find(f"{SVG}title").text == "sample part"
    background = root.find(f"{SVG}rect")
    assert background.get("fill") == "white" and background.get("width") == "300"
    group = root.find(f"{SVG}g")
    assert group.get("stroke") == "black" and "sans-serif" in group.get("font-family")
    assert "Vera" in group.get("font-family")


def test_outputs_are_deterministic():
    for d in DRAWINGS:
        assert render_svg(d) == render_svg(d)
        assert pdf_of(d)[0] == pdf_of(d)[0]
    svg = render_svg(sample_part()).decode()
    assert " id=" not in svg
    assert not re.search(r"\d\.\d{4,}", svg)                # fixed 3-decimal format
    assert "e-" not in re.sub(r"[a-z]+-[a-z]+", "", svg)    # no exponent notation


def test_flowable_knows_its_size_and_scales_down_to_fit():
    d = sample_plots()[0]                                   # 480 pt wide
    small = DrawingFlowable(d, max_width=300)
    assert small.wrap(500, 800) == pytest.approx((300, 230 * 300 / 480))
    assert small.wrap(240, 800) == pytest.approx((240, 230 * 240 / 480))
    large = DrawingFlowable(d, max_width=1000)
    assert large.wrap(1000, 800) == pytest.approx((480, 230))   # never scaled up
    buf = io.BytesIO()
    doc = SimpleDocTemplate(buf, pagesize=A4, invariant=1, initialFontName=fonts.FONT)
    doc.build([DrawingFlowable(d, max_width=doc.width)])
    page = pypdf.PdfReader(io.BytesIO(buf.getvalue())).pages[0]
    found = []
    page.extract_text(visitor_text=lambda t, *_: found.append(t.strip()) if t.strip() else None)
    assert sorted(found) == sorted(t.text for t in d.texts())


def test_flowable_too_tall_names_the_drawing():
    tall = Drawing(100, 2000, [Line(0, 0, 100, 2000)], "very tall figure")
    doc = SimpleDocTemplate(io.BytesIO(), pagesize=A4)
    with pytest.raises(LayoutError, match="very tall figure"):
        doc.build([DrawingFlowable(tall, max_width=doc.width)])
