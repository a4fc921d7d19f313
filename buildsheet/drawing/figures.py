"""Figures of one antenna: turns a Design and its Solution into format-neutral Drawings (overview,
radiator, stub, short and tap, choke, SWR, Smith chart); owns their layout and wording, computes no
physics, renders and writes nothing.

Every length printed comes from the Solution (or, for the site, the Design) through
units.format_length in the design's units; the rounding is stated in the title strip of each figure
that prints a length.
Drawing coordinates are points with y down (shapes.py). Symbols used in the layout code:
  x_j, x_o   page x of the stub's radiator-side conductor and of the other conductor
  y_top      page y of the stub's open top (the junction)
  y_tap, y_short, y_g   page y of the tap point, the short's centre line, the ground line
  theta      drawn slope of a sloper's radiator below horizontal, rad
"""

from __future__ import annotations

import math

import numpy as np

from buildsheet import fonts, units
from buildsheet.design import Design
from buildsheet.drawing import plots, polar
from buildsheet.drawing.placement import LABEL, PAD, Layout, fitted_size, line_height, text_width, wrap_text
from buildsheet.drawing.shapes import (THIN, Arc, BreakMark, Circle, Dimension, Drawing, Hatch, Line,
                                       Polyline, Rect, Text)
from buildsheet.layout import TIE_OFF_M, describe
from buildsheet.solver import Solution
from buildsheet.stock import conductor_name
from buildsheet.valueclass import valueclass

#: figure keys in the order a builder reads them (also the order of the SVG files)
FIGURES = ("overview", "radiator", "stub", "short-tap", "choke", "swr", "smith", "pattern")

WIDTH = 500.0          # figure width, points: fits the text width of letter and A4 pages unscaled
SMITH_WIDTH = 380.0
SWR_HEIGHT = 270.0
CAPTION = 10.0
CONDUCTOR = 1.3        # radiator wire and stub conductors
COAX = 2.6
LEAD = 0.9             # tap leads
ROPE = 0.6
ROPE_DASH = (3.0, 1.8)
CENTRE_DASH = (8.0, 2.0, 2.0, 2.0)   # centre lines (long dash, dot)
INSULATOR_GREY = 0.78
SUPPORT_GREY = 0.9
WEB_GREY = 0.86
COAX_GREY = 0.8        # the coax jacket where the coax is drawn as a band
MAX_DRAWN_SLOPE = math.radians(60)   # steeper slopers are drawn at this angle (labelled true)


# ---------------------------------------------------------------- parts

def _vdim(x: float, y_low: float, y_high: float, text: str, right: float) -> Dimension:
    """Vertical dimension of the points (x, y_low) below and (x, y_high) above, its dimension line
    `right` points to the right of x."""
    return Dimension(x, y_low, x, y_high, text, -right)


def _ground(x0: float, x1: float, y: float) -> list:
    return [Hatch(x0, y, x1 - x0, 5.0, spacing=4.0, angle=-45.0), Line(x0, y, x1, y, width=1.0)]


def _pole(x: float, y_top: float, y_ground: float, w: float = 7.0) -> Rect:
    return Rect(x - w / 2, y_top, w, y_ground - y_top, width=0.75, fill=SUPPORT_GREY)


def _along(p, u, d):
    return (p[0] + u[0] * d, p[1] + u[1] * d)


def _insulator(p, u, length: float = 16.0, half: float = 3.2) -> Polyline:
    """An insulator from point p along unit direction u."""
    n = (u[1], -u[0])
    q = _along(p, u, length)
    return Polyline(((p[0] + n[0] * half, p[1] + n[1] * half), (q[0] + n[0] * half, q[1] + n[1] * half),
                     (q[0] - n[0] * half, q[1] - n[1] * half), (p[0] - n[0] * half, p[1] - n[1] * half)),
                    closed=True, fill=INSULATOR_GREY, width=0.75)


def _coil_symbol(cx: float, y0: float, length: float, turns: int, w: float = 11.0) -> list:
    """A small coil of coax on a form, axis vertical from y0 down `length` points (overview and
    stub figures): the form and slanted turns."""
    out: list = [Rect(cx - w / 2 + 1.5, y0, w - 3, length, width=0.6, fill=SUPPORT_GREY)]
    k = max(1, min(turns, 7))      # a symbol: up to 7 turns drawn, the count is in a label
    pitch = length / (k + 0.5)
    for i in range(k):
        ya = y0 + pitch * (i + 0.5)
        out.append(Line(cx - w / 2, ya + pitch / 2, cx + w / 2, ya, width=1.6))
    return out


def _choke_symbol(solution, cx: float, y0: float, length: float, w: float = 11.0) -> list:
    """The choke as a symbol (overview and stub figures): the coil, or where a quarter-wave sleeve
    is built instead (Solution.sleeve), the sleeve as a tube around the coax, its bonded end at the
    bottom hatched."""
    if solution.sleeve is None:
        return _coil_symbol(cx, y0, length, solution.choke.turns, w)
    return [Line(cx, y0, cx, y0 + length, width=COAX),
            Rect(cx - w / 2, y0, w, length, width=0.9, fill=SUPPORT_GREY),
            Hatch(cx - w / 2, y0 + length - 4.0, w, 4.0, spacing=2.0)]


def _station(x0: float, y_g: float, w: float = 46.0, h: float = 24.0) -> list:
    """A small house standing on the ground at y_g, left wall at x0, with its name inside."""
    roof = 12.0
    house = Polyline(((x0, y_g), (x0, y_g - h), (x0 + w / 2, y_g - h - roof), (x0 + w, y_g - h),
                      (x0 + w, y_g)), width=0.75)
    label = Text(x0 + w / 2, y_g - h / 2 + 3, "station", LABEL, "middle")
    return [house, label]


# ---------------------------------------------------------------- context and title strip

@valueclass
class _Context:
    """The design, its solution and the revision date a figure is drawn for."""
    design: Design
    solution: Solution
    date: str

    @property
    def units(self) -> str:
        return self.design.output.units

    def length(self, m: float) -> str:
        return units.format_length(m, self.units)

    def paced(self, m: float) -> str:
        """A distance paced out on the site or a rope's length: to the inch or the cm."""
        return units.format_length(m, self.units, "coarse")

    def layout(self):
        """The site layout (Solution.site): supports, ropes and span, or None on a mast."""
        return self.solution.site

    def rounding_note(self) -> str:
        system = "feet and inches" if self.units == "imperial" else "metres and millimetres"
        return f"Dimensions in {system}, {units.length_rounding(self.units)}."

    def wire_text(self) -> str:
        """The radiator wire as a builder buys it: the gauge as written, else its diameter."""
        r = self.design.radiator
        label = r.label.strip()
        insulation = "" if r.insulation == "bare" else f", {r.insulation} insulated"
        if "awg" in label.lower() or label.startswith("#"):
            return f"{label} {r.material}{insulation}"
        return conductor_name(r.diameter_m, self.units, r.material) + insulation


def _strip(ctx: _Context, caption: str, notes: list[str], width: float, top: float) -> tuple[list, float]:
    """Title strip across the bottom of a figure: caption, design title and notes on the left;
    name, document ID and revision date on the right (below, when the figure is too narrow)."""
    x0, inner = PAD, width - 2 * PAD
    pad = 5.0
    value_size, key_size = 8.0, 6.5
    rows = [("name", ctx.design.name), ("document", ctx.solution.design_id), ("revised", ctx.date)]
    key_w = max(text_width(k, key_size) for k, _ in rows)
    value_sizes = [fitted_size(v, inner - 2 * pad - key_w - 4, value_size, True) for _, v in rows]
    right_w = key_w + 4 + max(text_width(v, s, True) for (_, v), s in zip(rows, value_sizes))
    side_by_side = inner - 2 * pad - right_w - 3 * pad >= 0.5 * inner
    left_w = inner - 2 * pad - (right_w + 3 * pad if side_by_side else 0)

    items: list = []
    y = top + pad
    cap_lines = wrap_text(caption, left_w, CAPTION, True)
    title_lines = wrap_text(ctx.design.title, left_w, value_size)
    note_lines = [line for note in notes for line in wrap_text(note, left_w, 7.0)]
    for lines, size, bold in ((cap_lines, CAPTION, True), (title_lines, value_size, False),
                              (note_lines, 7.0, False)):
        for line in lines:
            s = fitted_size(line, left_w, size, bold)
            items.append(Text(x0 + pad, y + fonts.ascent(s, bold), line, s, bold=bold))
            y += line_height(size)
        y += 1.0
    left_bottom = y

    row_h = line_height(value_size) + 1.0
    if side_by_side:
        xr = x0 + inner - pad - right_w
        ry = top + pad
    else:
        xr = x0 + pad
        ry = left_bottom + 2.0
    for (key, value), s in zip(rows, value_sizes):
        base = ry + fonts.ascent(value_size, True)
        items.append(Text(xr, base, key, key_size))
        items.append(Text(xr + key_w + 4, base, value, s, bold=True))
        ry += row_h
    bottom = max(left_bottom, ry) + pad - 1.0
    height = bottom - top
    items.insert(0, Rect(x0, top, inner, height, width=0.75))
    if side_by_side:
        xd = xr - 1.5 * pad
        items.insert(1, Line(xd, top, xd, bottom, width=THIN))
    return items, height + PAD


def _finish(ctx: _Context, caption: str, body: list, body_height: float, notes: list[str],
            width: float = WIDTH) -> Drawing:
    strip, strip_height = _strip(ctx, caption, notes, width, body_height)
    return Drawing(width, body_height + strip_height, [*body, *strip],
                   f"{ctx.design.name}: {caption}")


# ---------------------------------------------------------------- overview

def _overview(ctx: _Context) -> Drawing:
    if ctx.design.site.orientation == "inverted" or ctx.design.hung:
        sheet, h = _overview_hung(ctx)
    elif ctx.design.site.orientation == "vertical":
        sheet, h = _overview_vertical(ctx)
    else:
        sheet, h = _overview_hanging(ctx)
    notes = ["Not to scale: long spans are drawn shortened (break marks).", ctx.rounding_note()]
    site = ctx.layout()
    if site is not None:
        notes.append("Site: " + describe(site, ctx.paced))
    slope = ctx.design.site.slope_rad
    if ctx.design.site.orientation == "sloper" and slope > MAX_DRAWN_SLOPE:
        notes.insert(1, f"The slope is drawn at {units.format_angle(MAX_DRAWN_SLOPE)}; "
                        f"it is {units.format_angle(slope)}.")
    return _finish(ctx, "Overview: the antenna as installed", sheet.items, h, notes)


@valueclass
class StubAnchors:
    """Where the stub's parts are drawn: page x of its radiator-side and other conductor, page y of
    its open top, tap, short and lower end; the overviews draw the stub, the feed and their labels
    from these."""
    x_j: float
    x_o: float
    top: float
    tap: float
    short: float
    end: float

    @property
    def mid(self) -> float:
        return (self.x_j + self.x_o) / 2

    @classmethod
    def hanging(cls, x_j: float, x_o: float, top: float, stub_span: float, tap_span: float,
                tail: float) -> "StubAnchors":
        """A stub drawn `stub_span` points from the open top down to the short, the tap `tap_span`
        above the short, the conductors `tail` below it."""
        short = top + stub_span
        return cls(x_j, x_o, top, short - tap_span, short, short + tail)


#: the tap is drawn this far above the short at least, and far enough for its dimension's text
TAP_SPAN_MIN = 48.0
TAP_SPAN_TEXT_MARGIN = 18.0


def _tap_span(text: str) -> float:
    return max(TAP_SPAN_MIN, text_width(text) + TAP_SPAN_TEXT_MARGIN)


def _stub_and_feed(sheet: Layout, ctx: _Context, a: StubAnchors, coax_to: tuple) -> float:
    """Stub conductors (broken between the open top and the tap), short, tap, and the coax from the
    tap down past the short through the choke, then along `coax_to` (points); returns the page y of
    the choke's top."""
    x_j, x_o, y_top, y_tap, y_short, y_end = a.x_j, a.x_o, a.top, a.tap, a.short, a.end
    y_break = (y_top + y_tap) / 2
    at = (y_break - y_top) / (y_end - y_top)
    for x in (x_j, x_o):
        sheet.add(BreakMark(x, y_top, x, y_end, at=at, size=3.5, width=CONDUCTOR))
    x_mid = (x_j + x_o) / 2
    y_choke = y_end + 8.0
    sheet.add(Line(x_j, y_short, x_o, y_short, width=2.4))
    sheet.add(Line(x_mid, y_tap + 2.0, x_mid, y_short - 3.0, width=COAX))
    sheet.add(Line(x_mid, y_short + 3.0, x_mid, y_choke, width=COAX))
    sheet.add(Line(x_j + 1.0, y_tap, x_mid, y_tap + 2.0, width=LEAD),
              Line(x_o - 1.0, y_tap, x_mid, y_tap + 2.0, width=LEAD))
    sheet.add(Circle(x_j, y_tap, 1.8, width=0, fill=0.0), Circle(x_o, y_tap, 1.8, width=0, fill=0.0))
    sheet.add(Circle(x_j, y_top, 2.0, width=0, fill=0.0))
    sheet.add(*_choke_symbol(ctx.solution, x_mid, y_choke, 26.0))
    sheet.add(Polyline(((x_mid, y_choke + 26.0), *coax_to), width=COAX))
    return y_choke


def _feed_callouts(sheet: Layout, ctx: _Context, a: StubAnchors, y_choke: float, y_coax: float) -> None:
    x_j, x_mid, y_tap, y_short = a.x_j, a.mid, a.tap, a.short
    sheet.callout(x_j, y_short, ["short"], angles=(200, 180, 225, 160))
    sheet.callout(x_j, y_tap, ["tap"], angles=(160, 180, 135, 200))
    sheet.callout(x_mid - 5.5, y_choke + 13.0, ["choke at the tap"], angles=(180, 200, 160, 225))
    d = ctx.design
    sheet.callout(x_mid, (y_choke + 26.0 + y_coax) / 2,
                  [f"coax {d.feed.coax}, {ctx.paced(d.feed.length_m)}", "to the station"],
                  angles=(180, 200, 160, 135, 225))


def _overview_hanging(ctx: _Context) -> tuple[Layout, float]:
    """Horizontal or sloper: far support, rope, end insulator, radiator (broken), stub hanging from
    the open top, coax down from the tap through the choke to the ground and the station."""
    d, s = ctx.design, ctx.solution
    dims = s.dimensions
    fmt = ctx.length
    sloper = d.site.orientation == "sloper"
    tap_text = f"tap {fmt(dims.tap)}"
    a = StubAnchors.hanging(318.0, 330.0, top=78.0, stub_span=176.0, tap_span=_tap_span(tap_text), tail=7.0)
    x_j, x_o, y_top, y_tap, y_short, y_end = a.x_j, a.x_o, a.top, a.tap, a.short, a.end
    y_g = y_end + 8.0 + 62.0
    body_h = y_g + 26.0
    sheet = Layout(WIDTH, body_h)
    sheet.add(*_ground(PAD, WIDTH - PAD, y_g))

    # far end: insulator, rope, support
    if sloper:
        theta = min(d.site.slope_rad, MAX_DRAWN_SLOPE)
        u = (-math.cos(theta), math.sin(theta))
        reach = min((x_j - 130.0) / math.cos(theta), (y_g - 64.0 - y_top) / math.sin(theta))
        far = _along((x_j, y_top), u, reach)
        ins_end = _along(far, u, 16.0)
        # the anchor rope runs on down the radiator's line to a stake in the ground; where that point
        # is off the drawing it is drawn steeper (the overview is not to scale)
        to_ground = (y_g - ins_end[1]) / math.sin(theta)
        support = (max(PAD + 14.0, ins_end[0] + u[0] * to_ground), y_g)
        rope_mid = ((ins_end[0] + support[0]) / 2, (ins_end[1] + support[1]) / 2)
        sheet.add(Line(*ins_end, *support, width=ROPE, dash=ROPE_DASH))
        sheet.add(_pole(support[0], y_g - 9.0, y_g + 4.0, 3.0))
        site = ctx.layout()
        support_name = [f"anchor rope {ctx.paced(site.ropes[1].length_m - TIE_OFF_M)}",
                        f"to a ground anchor {ctx.paced(site.anchor_distance_m)}",
                        "from the high support"]
    else:
        u = (-1.0, 0.0)
        far = (100.0, y_top)
        if s.stack is not None:
            # stacked: the radiator ends at the gap; the upper element runs on to the insulator and
            # the phasing stub hangs from the gap
            k, gap = s.stack, 8.0
            x_gap = 206.0
            x_el = x_gap - gap
            sheet.add(BreakMark(x_el, y_top, far[0], far[1], at=0.5, width=CONDUCTOR))
            sheet.add(Dimension(far[0], far[1], x_el, y_top, f"element {fmt(k.element_m)}", 22.0))
            y_ph = y_top + 96.0
            for x in (x_gap, x_el):
                sheet.add(BreakMark(x, y_top, x, y_ph, at=0.5, size=3.5, width=CONDUCTOR))
            sheet.add(Line(x_el, y_ph, x_gap, y_ph, width=2.4))
            sheet.add(Rect(x_el + 1.0, y_top - 2.5, gap - 2.0, 5.0, width=0.6, fill=INSULATOR_GREY))
            sheet.add(_vdim(x_gap, y_ph, y_top, f"phasing stub {fmt(k.phasing_m)}", 16.0))
            sheet.callout(x_el, y_ph, ["phasing short"], angles=(200, 180, 225, 160))
            # the gap's label below the radiator, right of the phasing stub's dimension, with a leader
            x_t, y_t = x_gap + 34.0, y_top + 52.0
            sheet.add(Line(x_t - 2.0, y_t - 8.0, x_el + gap / 2 + 2.0, y_top + 3.0, width=THIN))
            sheet.add(Text(x_t, y_t, f"gap {units.format_length(k.phasing_spacing_m, ctx.units, 'size')}: "
                           "insulator", LABEL))
            sheet.add(Text(x_t, y_t + 9.0, "(high RF voltage)", LABEL))
            gap_end = (x_gap, y_top)
        ins_end = _along(far, u, 16.0)
        support = (30.0, y_top - 30.0)
        rope_mid = ((ins_end[0] + support[0]) / 2, (ins_end[1] + support[1] + 4.0) / 2)
        sheet.add(Line(*ins_end, support[0], support[1] + 4.0, width=ROPE, dash=ROPE_DASH))
        sheet.add(_pole(support[0], support[1], y_g))
        support_name = ["support"]
    sheet.add(_insulator(far, u))
    rad_end = far if s.stack is None or sloper else gap_end
    sheet.add(BreakMark(rad_end[0], rad_end[1], x_j, y_top, at=0.5, width=CONDUCTOR))
    sheet.add(Dimension(rad_end[0], rad_end[1], x_j, y_top, f"radiator {fmt(dims.radiator)}", 22.0))

    # near support: rope from the other conductor's open top, up to the right-hand pole
    pole_r = WIDTH - 22.0
    pole_top = y_top - 52.0
    dx, dy = pole_r - x_o, pole_top - y_top
    ur = (dx / math.hypot(dx, dy), dy / math.hypot(dx, dy))
    tie = _along((x_o, y_top), ur, 9.0)
    sheet.add(Line(x_o, y_top, *tie, width=ROPE))
    sheet.add(_insulator(tie, ur))
    sheet.add(Line(*_along(tie, ur, 16.0), pole_r, pole_top + 3.0, width=ROPE, dash=ROPE_DASH))
    sheet.add(_pole(pole_r, pole_top, y_g))

    # stub and feed: the coax runs to a station beside the right-hand support
    x_h = pole_r - 22.0
    station_x = x_h - 74.0
    y_coax = y_g - 4.0
    y_choke = _stub_and_feed(sheet, ctx, a, ((a.mid, y_coax), (station_x, y_coax)))
    sheet.add(*_station(station_x, y_g))

    # dimensions right of the stub, the height at the far right
    sheet.add(_vdim(x_o, y_short, y_tap, tap_text, 16.0))
    sheet.add(_vdim(x_o, y_short, y_top, f"stub {fmt(dims.stub)}", 38.0))
    sheet.add(Line(x_o + 1.5, y_top, x_h + 2.0, y_top, width=THIN))
    sheet.add(Dimension(x_h, y_g, x_h, y_top, f"height {fmt(d.site.height_m)}", 0.0))

    # callouts
    sheet.add(Text(pole_r, pole_top - 4.0, "support", LABEL, "end"))
    if sloper:
        _slope_mark(sheet, ctx, far, theta)
        sheet.callout(*rope_mid, support_name, angles=(200, 180, 225, 160, 135, 250))
    else:
        sheet.add(Text(support[0], support[1] - 4.0, support_name[0], LABEL, "middle"))
        sheet.callout(*rope_mid, [f"rope {ctx.paced(ctx.layout().standoff_m)}"],
                      angles=(270, 240, 300, 200, 90), radii=(16, 24, 34, 46))
    sheet.callout(*_along(far, u, 8.0), ["end insulator"], angles=(250, 270, 225, 290, 135))
    sheet.callout(x_j, y_top, ["open top: radiator on", "one conductor only"],
                  angles=(225, 200, 250, 135, 160))
    _feed_callouts(sheet, ctx, a, y_choke, y_coax)
    sheet.add(Text(PAD + 2.0, y_g + 16.0, "ground", LABEL))
    return sheet, body_h


def _slope_mark(sheet: Layout, ctx: _Context, far, theta: float) -> None:
    """Horizontal reference, arc and the true slope angle at the far end of a sloper."""
    r = 40.0
    x, y = far
    sheet.add(Line(x + 2.0, y, x + r + 12.0, y, width=THIN, dash=(2.0, 2.0)))
    sheet.add(Arc(x, y, r, 0.0, math.degrees(theta), width=THIN))
    label = f"slope {units.format_angle(ctx.design.site.slope_rad)}"
    mid = math.radians(math.degrees(theta) / 2)
    sheet.callout(x + r * math.cos(mid), y - r * math.sin(mid), [label],
                  angles=(330, 0, 300, 30), radii=(14, 22, 32, 44), end="dot")


def _overview_vertical(ctx: _Context) -> tuple[Layout, float]:
    """Vertical: the stub on a stand-off insulator beside the top of a mast, the radiator straight up
    from one conductor, the coax down from the tap through the choke and along the mast."""
    d, s = ctx.design, ctx.solution
    dims = s.dimensions
    fmt = ctx.length
    wire = not s.parts.rigid_radiator
    y_end_top = 62.0 if wire else 40.0
    k = s.stack
    # the spans drawn (break marks: not to scale): radiator, stub, short to ground; a stacked
    # antenna draws them shorter so that the figure keeps about the single one's height
    rad_span, stub_span, mast_span = (96.0, 130.0, 66.0) if k is None else (74.0, 122.0, 64.0)
    if k is not None:
        # stacked: the upper element on top, the gap and the phasing stub out to the left below it
        y_el_top, gap = y_end_top, 8.0
        y_el_bot = y_el_top + 74.0
        y_end_top = y_el_bot + gap
    tap_text = f"tap {fmt(dims.tap)}"
    a = StubAnchors.hanging(200.0, 212.0, top=y_end_top + rad_span, stub_span=stub_span,
                            tap_span=_tap_span(tap_text), tail=22.0)
    x_j, x_o, x_mid, y_top, y_tap, y_short, y_end = a.x_j, a.x_o, a.mid, a.top, a.tap, a.short, a.end
    y_g = y_end + 8.0 + mast_span
    body_h = y_g + 26.0
    sheet = Layout(WIDTH, body_h)
    sheet.add(*_ground(PAD, WIDTH - PAD, y_g))

    # mast beside the stub, stand-off insulator below the short (a `tube`: the mounting section's
    # mast clamps; a `twin-lead` hangs from its halyard, its tail tied down with a cord)
    style = s.parts.construction
    x_m = x_o + 16.0
    y_so = y_short + 15.0
    if style == "twin-lead":
        sheet.add(Line(x_o, y_end, x_m + 30.0, y_g, width=ROPE, dash=ROPE_DASH))
    else:
        sheet.add(BreakMark(x_m, y_short + 4.0, x_m, y_g, at=0.55, width=3.0))
        sheet.add(Rect(x_o + 1.5, y_so - 2.5, x_m - x_o - 3.0, 5.0, width=0.6,
                       fill=0.45 if style == "tube" else INSULATOR_GREY))

    # radiator straight up from the radiator-side conductor
    sheet.add(BreakMark(x_j, y_top, x_j, y_end_top, at=0.5, width=CONDUCTOR))
    y_free = y_end_top          # the top end of the whole antenna
    if k is not None:
        y_free = y_el_top
        sheet.add(BreakMark(x_j, y_el_bot, x_j, y_el_top, at=0.5, width=CONDUCTOR))
        x_p = x_j - 118.0
        for y in (y_end_top, y_el_bot):
            sheet.add(BreakMark(x_j, y, x_p, y, at=0.5, size=3.5, width=CONDUCTOR))
        sheet.add(Line(x_p, y_el_bot, x_p, y_end_top, width=2.4))
        sheet.add(Rect(x_j - 2.5, y_el_bot + 1.0, 5.0, gap - 2.0, width=0.6, fill=INSULATOR_GREY))
        sheet.add(Dimension(x_p, y_el_bot, x_j, y_el_bot, f"phasing stub {fmt(k.phasing_m)}", 10.0))
    if wire:
        sheet.add(_insulator((x_j, y_free), (0.0, -1.0)))
        sheet.add(Line(x_j, y_free - 16.0, x_j, PAD + 4.0, width=ROPE, dash=ROPE_DASH))
    station_x = 70.0
    y_coax = y_g - 4.0
    y_choke = _stub_and_feed(sheet, ctx, a, ((x_mid, y_coax), (station_x + 46.0, y_coax)))
    sheet.add(*_station(station_x, y_g))

    # dimensions: the tap beside the stub; radiator, stub and height chained further out, leaving
    # room between for the callouts of the open top
    sheet.add(_vdim(x_o, y_short, y_tap, tap_text, 34.0))
    x_c = x_o + 160.0
    ends = ((y_end_top, x_j), (y_top, x_o), (y_short, x_o))
    if k is not None:
        ends += ((y_el_bot, x_j), (y_el_top, x_j))
        sheet.add(Dimension(x_c, y_el_bot, x_c, y_el_top, f"element {fmt(k.element_m)}", 0.0))
    for y, x_from in ends:
        sheet.add(Line(x_from + 1.5, y, x_c + 2.0, y, width=THIN))
    sheet.add(Dimension(x_c, y_top, x_c, y_end_top, f"radiator {fmt(dims.radiator)}", 0.0))
    sheet.add(Dimension(x_c, y_short, x_c, y_top, f"stub {fmt(dims.stub)}", 0.0))
    sheet.add(Dimension(x_c, y_g, x_c, y_short, f"height {fmt(d.site.height_m)}", 0.0))

    if wire:
        sheet.callout(x_j, y_free - 8.0, ["top insulator"], angles=(180, 160, 200))
        sheet.callout(x_j, (y_free - 16.0 + PAD + 4.0) / 2, ["rope up to a support"],
                      angles=(180, 200, 160))
    else:
        sheet.callout(x_j, y_free, ["top end, free"], angles=(180, 200, 160))
    if k is not None:
        sheet.callout(x_j + 2.5, (y_el_bot + y_end_top) / 2,
                      [f"gap {units.format_length(k.phasing_spacing_m, ctx.units, 'size')}: insulator", "(high RF voltage)"],
                      angles=(0, 20, 340, 40))
        sheet.callout(x_p, (y_el_bot + y_end_top) / 2, ["phasing short"], angles=(200, 180, 225, 160))
        sheet.callout(x_j, y_el_bot - 24.0, ["upper element"], angles=(200, 180, 160, 225))
    sheet.callout(x_o, y_top + 2.0, ["open top: this conductor", "ends here (RF voltage)"],
                  angles=(330, 345, 315, 30, 0))
    sheet.callout(x_j, y_top - 30.0, ["the radiator continues", "from this conductor"],
                  angles=(200, 180, 225, 160))
    if style == "twin-lead":
        sheet.callout((x_o + x_m + 30.0) / 2, (y_end + y_g) / 2, ["cord: the tail tied down"],
                      angles=(0, 330, 30), radii=(20, 30, 42, 56))
    else:
        sheet.callout(x_o + 5.0, y_so + 2.5, ["mounting section, mast clamps" if style == "tube"
                                              else "stand-off insulator"], angles=(330, 315, 345, 300),
                      radii=(30, 42, 56, 72))
        sheet.callout(x_m, y_g - 24.0, ["mast"], angles=(20, 0, 40, 340), radii=(20, 30, 42, 56))
    _feed_callouts(sheet, ctx, a, y_choke, y_coax)
    sheet.add(Text(PAD + 2.0, y_g + 16.0, "ground", LABEL))
    return sheet, body_h


def _tree(sheet: Layout, x_trunk: float, y_branch: float, x_branch_end: float, y_g: float) -> None:
    """A tree trunk standing on the ground at y_g with a branch out to x_branch_end at y_branch."""
    sheet.add(Rect(x_trunk - 7.0, y_branch - 14.0, 14.0, y_g - y_branch + 14.0, width=0.75,
                   fill=SUPPORT_GREY))
    sheet.add(Polyline(((x_trunk + 7.0, y_branch + 4.0), (x_branch_end, y_branch - 1.0),
                        (x_branch_end, y_branch - 4.0), (x_trunk + 7.0, y_branch - 6.0)), closed=True,
                       width=0.75, fill=SUPPORT_GREY))


def _overview_hung(ctx: _Context) -> tuple[Layout, float]:
    """A wire vertical hung on a rope (construction: hung) or any inverted antenna. Hung: a branch
    (or a halyard pulley) with the halyard down to the top insulator and back to a cleat on the trunk;
    the bottom insulator's tether to a ground stake. Upright: the radiator from the top insulator
    down to the open top, the stub below with the short at the bottom, the coax down from the tap
    through the choke. Inverted: the short at the top (from the halyard by a bridle, or on a mast's
    stand-off insulator), the tap below it, the coax out sideways from the tap through the choke and
    down, the stub's open top below, the radiator hanging from it to its far end insulator."""
    d, s = ctx.design, ctx.solution
    dims = s.dimensions
    fmt = ctx.length
    site = ctx.layout()
    inverted = d.site.orientation == "inverted"
    tap_text = f"tap {fmt(dims.tap)}"
    tap_span = _tap_span(tap_text)
    x_j, x_o = 230.0, 242.0
    x_mid = (x_j + x_o) / 2
    x_trunk = 46.0
    hung = site is not None
    y_branch = 34.0 if hung else 10.0
    y_ins = y_branch + 22.0                   # the top insulator's upper end
    stub_span, rad_span = 128.0, 96.0
    if inverted:
        y_short = y_ins + 16.0 + 12.0
        y_tap = y_short + tap_span
        y_top = y_short + stub_span          # the open top, at the bottom of the stub
        y_far = y_top + rad_span
        y_bottom = y_far
    else:
        y_rt = y_ins + 16.0                   # the radiator's top attachment point
        y_top = y_rt + rad_span
        y_short = y_top + stub_span
        y_tap = y_short - tap_span
        y_bottom = y_short + 7.0
    y_g = y_bottom + 16.0 + (72.0 if inverted else 58.0)
    body_h = y_g + 26.0
    sheet = Layout(WIDTH, body_h)
    sheet.add(*_ground(PAD, WIDTH - PAD, y_g))
    x_top = x_mid if inverted else x_j       # where the halyard meets the antenna

    # support: a branch and the halyard, or (inverted, not hung) a mast beside the short
    if hung:
        _tree(sheet, x_trunk, y_branch, x_top + 28.0, y_g)
        sheet.add(Circle(x_top, y_branch + 2.5, 2.5, width=0.75))
        sheet.add(Line(x_top, y_branch + 5.0, x_top, y_ins, width=ROPE, dash=ROPE_DASH))
        sheet.add(_insulator((x_top, y_ins), (0.0, 1.0)))
        # the halyard's other end back along the branch and down the trunk to a cleat
        sheet.add(Polyline(((x_top - 2.5, y_branch + 2.5), (x_trunk + 10.0, y_branch + 10.0),
                            (x_trunk + 10.0, y_g - 40.0)), width=ROPE, dash=ROPE_DASH))
        sheet.add(Rect(x_trunk + 7.0, y_g - 42.0, 6.0, 4.0, width=0.6, fill=0.0))
    else:
        # the mast stands clear of the radiator, the stub held out on an arm with a stand-off insulator
        x_m = x_o + 52.0
        sheet.add(BreakMark(x_m, y_short - 24.0, x_m, y_g, at=0.6, width=3.0))
        y_so = y_short + 15.0
        sheet.add(Rect(x_o + 1.5, y_so - 2.5, 18.0, 5.0, width=0.6, fill=INSULATOR_GREY))
        sheet.add(Line(x_o + 19.5, y_so, x_m, y_so, width=2.0))

    # the stub: conductors broken between the tap and the open top, the short, the tap
    if inverted:
        y_from, y_to = y_short - 4.0, y_top
        at = ((y_tap + y_top) / 2 - y_from) / (y_to - y_from)
        if hung:     # a bridle from the top insulator to both conductors above the short
            sheet.add(Line(x_mid, y_ins + 16.0, x_j, y_from, width=ROPE),
                      Line(x_mid, y_ins + 16.0, x_o, y_from, width=ROPE))
    else:
        y_from, y_to = y_top, y_bottom
        at = ((y_top + y_tap) / 2 - y_from) / (y_to - y_from)
    for x in (x_j, x_o):
        sheet.add(BreakMark(x, y_from, x, y_to, at=at, size=3.5, width=CONDUCTOR))
    sheet.add(Line(x_j, y_short, x_o, y_short, width=2.4))
    sheet.add(Line(x_j + 1.0, y_tap, x_mid, y_tap + 2.0, width=LEAD),
              Line(x_o - 1.0, y_tap, x_mid, y_tap + 2.0, width=LEAD))
    sheet.add(Circle(x_j, y_tap, 1.8, width=0, fill=0.0), Circle(x_o, y_tap, 1.8, width=0, fill=0.0))
    sheet.add(Circle(x_j, y_top, 2.0, width=0, fill=0.0))

    # the radiator: from the top insulator down to the open top, or from the open top down
    if inverted:
        sheet.add(BreakMark(x_j, y_top, x_j, y_far, at=0.5, width=CONDUCTOR))
        sheet.add(_insulator((x_j, y_far), (0.0, 1.0)))
    else:
        sheet.add(BreakMark(x_j, y_rt, x_j, y_top, at=0.5, width=CONDUCTOR))
    # the bottom: an insulator and the tether to a stake (hung), or the free far end (mast)
    y_low_ins = y_far + 16.0 if inverted else y_bottom
    x_stake = x_j - 58.0
    if hung:
        if not inverted:
            sheet.add(Line(x_j, y_short, x_j, y_bottom, width=CONDUCTOR))
            sheet.add(_insulator((x_j, y_bottom), (0.0, 1.0), length=12.0))
            y_low_ins = y_bottom + 12.0
        sheet.add(Line(x_j, y_low_ins, x_stake, y_g, width=ROPE, dash=ROPE_DASH))
        sheet.add(_pole(x_stake, y_g - 9.0, y_g + 4.0, 3.0))

    # the feed: the coax from the tap through the choke to the station on the right
    station_x = x_o + (66.0 if hung else 72.0)
    y_coax = y_g - 4.0
    if inverted:
        x_c = x_o + 30.0
        y_choke = y_tap + 8.0
        sheet.add(Polyline(((x_mid, y_tap + 2.0), (x_c, y_tap + 2.0), (x_c, y_choke)), width=COAX))
        sheet.add(*_choke_symbol(s, x_c, y_choke, 26.0))
        sheet.add(Polyline(((x_c, y_choke + 26.0), (x_c, y_coax), (station_x, y_coax)), width=COAX))
        choke_at, coax_at = (x_c + 5.5, y_choke + 13.0), (x_c, (y_choke + 26.0 + y_coax) / 2)
    else:
        y_choke = y_bottom + 18.0
        sheet.add(Line(x_mid, y_tap + 2.0, x_mid, y_short - 3.0, width=COAX))
        sheet.add(Polyline(((x_mid, y_short + 3.0), (x_mid, y_choke)), width=COAX))
        sheet.add(*_choke_symbol(s, x_mid, y_choke, 26.0))
        sheet.add(Polyline(((x_mid, y_choke + 26.0), (x_mid, y_coax), (station_x, y_coax)), width=COAX))
        choke_at, coax_at = (x_mid + 5.5, y_choke + 13.0), ((x_mid + station_x) / 2, y_coax)
    sheet.add(*_station(station_x, y_g))

    # dimensions: the tap beside the stub; the parts and the heights chained on the right
    if inverted:
        # measured from the short's centre line, as on the upright drawings (here downward)
        sheet.add(Dimension(x_j, y_short, x_j, y_tap, tap_text, -34.0))
    else:
        sheet.add(_vdim(x_o, y_short, y_tap, tap_text, 34.0))
    x_d = 392.0
    if inverted:
        marks = ((y_short, x_o), (y_top, x_o), (y_far, x_j))
        chain = ((y_g, y_short, f"height {fmt(d.site.height_m)}", 36.0),
                 (y_short, y_top, f"stub {fmt(dims.stub)}", 0.0),
                 (y_top, y_far, f"radiator {fmt(dims.radiator)}", 0.0),
                 (y_g, y_far, f"far end at {fmt(d.site.height_m - dims.stub - dims.radiator)}", 0.0))
    else:
        marks = ((y_rt, x_j), (y_top, x_o), (y_short, x_o))
        chain = ((y_top, y_rt, f"radiator {fmt(dims.radiator)}", 0.0),
                 (y_short, y_top, f"stub {fmt(dims.stub)}", 0.0),
                 (y_g, y_short, f"height {fmt(d.site.height_m)}", 0.0))
    for y, x_from in marks:
        sheet.add(Line(x_from + 1.5, y, x_d + 2.0, y, width=THIN))
    for y_a, y_b, text, extra in chain:
        sheet.add(Dimension(x_d + extra, y_a, x_d + extra, y_b, text, 0.0))
    if hung:
        x_s = 470.0
        sheet.add(Line(x_top + 30.0, y_branch, x_s + 2.0, y_branch, width=THIN))
        sheet.add(Dimension(x_s, y_g, x_s, y_branch, f"branch at least {ctx.paced(site.support_height_m)}",
                            0.0))

    # callouts
    if hung:
        sheet.callout(x_top + 2.0, y_branch - 3.0, ["branch or halyard pulley"], angles=(20, 0, 40, 340))
        sheet.callout(x_trunk + 10.0, y_g - 80.0,
                      [f"halyard {ctx.paced(site.ropes[0].length_m)}", "to a cleat on the trunk"],
                      angles=(0, 20, 340, 40), radii=(20, 30, 42))
        sheet.callout(x_top, y_ins + 8.0, ["top insulator"], angles=(0, 20, 340, 160, 200))
        sheet.callout((x_j + x_stake) / 2, (y_low_ins + y_g) / 2,
                      [f"tether {ctx.paced(site.ropes[1].length_m)}", "to a ground stake"],
                      angles=(200, 180, 225, 160))
        sheet.callout(x_j, y_low_ins - 6.0, ["bottom insulator"], angles=(200, 180, 160, 225))
    else:
        sheet.callout(x_o + 5.0, y_short + 17.5, ["stand-off insulator"], angles=(330, 315, 345, 300),
                      radii=(30, 42, 56, 72))
        sheet.callout(x_o + 52.0, y_g - 24.0, ["mast"], angles=(20, 0, 40, 340), radii=(20, 30, 42, 56))
        sheet.callout(x_o + 36.0, y_short + 15.0, ["arm"], angles=(30, 0, 60), radii=(20, 30, 42))
        sheet.callout(x_j, y_far + 8.0, ["far end insulator"], angles=(200, 180, 160, 225))
    sheet.callout(x_j, y_short, ["short"], angles=(200, 180, 225, 160))
    sheet.callout(x_j, y_tap, ["tap"], angles=(160, 180, 135, 200) if not inverted else (200, 180, 225))
    sheet.callout(x_o, y_top + 2.0, ["open top: this conductor", "ends here (RF voltage)"],
                  angles=(330, 345, 315, 30, 0), radii=(62, 74, 90) if inverted else (20, 30, 42, 56))
    if inverted:
        far = d.site.height_m - dims.stub - dims.radiator
        sheet.callout(x_j, y_far, ["far end: high RF voltage,", f"{fmt(far)} above ground"],
                      angles=(200, 180, 160, 225, 250))
    sheet.callout(*choke_at, ["choke at the tap"], angles=(0, 20, 340, 200))
    sheet.callout(*coax_at, [f"coax {d.feed.coax}, {ctx.paced(d.feed.length_m)}",
                             "down to the station" if inverted else "to the station"],
                  angles=(0, 20, 340, 200, 160))
    sheet.add(Text(PAD + 2.0, y_g + 16.0, "ground", LABEL))
    return sheet, body_h


# ---------------------------------------------------------------- radiator

#: pitch of a drawn wire wrap (the zig-zag of a wire wound round a conductor or twisted back), points
WRAP_PITCH = 2.5


def _wrap_mark(x: float, y: float, count: int, along: str, amplitude: float = 2.2,
               end: float | None = None) -> Polyline:
    """A wire wrapped round a conductor or twisted back on itself: a tight zig-zag of `count` points
    from (x, y) along `along` ('x' to the right, 'y' down), `amplitude` to either side of the axis;
    `end`: a last point on the axis that far along."""
    pts = []
    for i in range(count):
        side = amplitude if i % 2 else -amplitude
        pts.append((x + i * WRAP_PITCH, y + side) if along == "x" else (x + side, y + i * WRAP_PITCH))
    if end is not None:
        pts.append((x + end, y) if along == "x" else (x, y + end))
    return Polyline(pts, width=0.6)


def _radiator(ctx: _Context) -> Drawing:
    """Radiator as installed (attachment point to attachment point) and as cut (with the wrap or
    cutting allowance at each end)."""
    d, s = ctx.design, ctx.solution
    fmt = ctx.length
    rigid = s.parts.rigid_radiator
    vertical = d.site.orientation == "vertical"
    inverted = d.site.orientation == "inverted"
    allowance = "allowance" if rigid else "wrap"
    body_h = 262.0
    sheet = Layout(WIDTH, body_h)

    # as installed
    y1 = 70.0
    x_a, x_b = 96.0, 372.0
    sheet.add(Text(PAD + 2.0, 20.0, "As installed", 9.0, bold=True))
    sheet.add(BreakMark(x_a, y1, x_b, y1, at=0.5, width=CONDUCTOR))
    if vertical and rigid:
        sheet.add(Line(x_a, y1 - 4.0, x_a, y1 + 4.0, width=CONDUCTOR))
        sheet.callout(x_a, y1, ["top end, free"] if s.stack is None else
                      ["top end: the gap insulator,", "the phasing stub and the", "upper element (the same cut)"],
                      angles=(225, 200, 250))
    else:
        sheet.add(Rect(x_a - 34.0, y1 - 5.0, 32.0, 10.0, width=0.75, fill=INSULATOR_GREY))
        sheet.add(Circle(x_a - 5.0, y1, 2.6, width=0.6, fill=1.0))
        sheet.add(Circle(x_a, y1, 1.8, width=0, fill=0.0))
        if not rigid:
            sheet.add(_wrap_mark(x_a + 2.0, y1, int(30.0 / WRAP_PITCH), "x", end=30.0))
        end_name = ("top end insulator" if vertical else "bottom end insulator" if inverted else
                    "end insulator") if s.stack is None else \
            "gap insulator (the phasing stub and the upper element beyond)"
        sheet.callout(x_a - 18.0, y1 + 5.0, [end_name], angles=(250, 270, 225, 290))
        sheet.callout(x_a, y1 - 2.0, ["attachment point"], angles=(110, 135, 90), radii=(30, 40, 52))
    # the stub's two conductors at its open top
    x_other = x_b + 18.0
    sheet.add(Line(x_b, y1, x_b, y1 + 44.0, width=CONDUCTOR),
              Line(x_other, y1, x_other, y1 + 44.0, width=CONDUCTOR))
    sheet.add(Circle(x_b, y1, 2.0, width=0, fill=0.0))
    if not rigid:
        sheet.add(_wrap_mark(x_b, y1 + 2.0, 10, "y"))
    sheet.add(Dimension(x_a, y1, x_b, y1, f"radiator {fmt(s.dimensions.radiator)}", 22.0))
    sheet.callout(x_other, y1 + 22.0, ["the stub's open top:", "the radiator joins",
                                       "one conductor only"], angles=(0, 330, 30), radii=(16, 24, 34))
    if rigid:
        join = "pipe or rod joined or clamped to it"
    elif s.parts.rigid_stub:
        join = "wire clamped to it"
    else:
        join = "wire wrapped round it and soldered"
    sheet.callout(x_b, y1 + 14.0, [join], angles=(200, 225, 180), radii=(30, 42, 56, 72))

    # as cut
    y2 = 184.0
    sheet.add(Text(PAD + 2.0, 140.0, "As cut", 9.0, bold=True))
    wrap_text = f"{allowance} {fmt(s.wrap_allowance_m)}"
    w_d = max(60.0, text_width(wrap_text) + 14.0)
    x_c0, x_c1 = 60.0, 440.0
    margin = s.first_cut.radiator_margin_m
    margin_text = f"tuning margin {fmt(margin)}"
    w_t = max(60.0, text_width(margin_text) + 14.0) if margin > 0 else 0.0
    # the far end (the wire's left end) gets the tuning margin: the radiator is first hung long
    x_m0, x_m1 = x_c0 + w_d + w_t, x_c1 - w_d
    x_t = x_c0 + w_d
    sheet.add(BreakMark(x_c0, y2, x_c1, y2, at=0.5, width=CONDUCTOR))
    for x in (x_m0, x_m1) + ((x_t,) if margin > 0 else ()):
        sheet.add(Line(x, y2 - 5.0, x, y2 + 5.0, width=0.9))
    sheet.add(Dimension(x_c0, y2, x_t, y2, wrap_text, 14.0))
    if margin > 0:
        sheet.add(Dimension(x_t, y2, x_m0, y2, margin_text, 14.0))
    sheet.add(Dimension(x_m0, y2, x_m1, y2, f"radiator {fmt(s.dimensions.radiator)}", 14.0))
    sheet.add(Dimension(x_m1, y2, x_c1, y2, wrap_text, 14.0))
    sheet.add(Dimension(x_c0, y2, x_c1, y2, f"cut length {fmt(s.radiator_cut_m)}", -16.0))
    sheet.callout(x_m1, y2 + 5.0, ["mark the attachment points"], angles=(315, 290, 340),
                  radii=(30, 42, 56))
    sheet.place_text([(x_c0, y2 + 40.0), (PAD + 2.0, y2 + 40.0)],
                     [f"{'material' if rigid else 'wire'}: {ctx.wire_text()}"], size=LABEL)
    if margin > 0:
        sheet.callout(x_t, y2 + 5.0, ["first attachment point (long):", "take up wire from here to tune"],
                      angles=(300, 280, 320, 260), radii=(30, 42, 56))
    notes = ["Not to scale: the radiator is drawn shortened (break marks).", ctx.rounding_note()]
    if vertical:
        notes.insert(0, "Drawn lying down: the left end is the top of the vertical.")
    elif inverted:
        notes.insert(0, "Drawn lying down: the left end is the bottom of the upside-down antenna, "
                        "the right end joins the stub above it.")
    return _finish(ctx, "Radiator: length and cut", sheet.items, body_h, notes)


# ---------------------------------------------------------------- construction styles

def _piece(solution: Solution, part: str):
    """The cut list's item `part` (solver.CutItem)."""
    return next(i for i in solution.cut_list if i.part == part)


def _chain(sheet: Layout, y: float, marks: list, offset: float) -> None:
    """Dimensions along y between consecutive (x, label) marks; a label None leaves a gap."""
    for (x0, text), (x1, _) in zip(marks, marks[1:]):
        if text is not None:
            sheet.add(Dimension(x0, y, x1, y, text, offset))


def _tube(ctx: _Context) -> Drawing:
    """`construction: tube`: the pieces as cut and the J-pole assembled (lying down, its top at the
    left): ONE long element (radiator and stub conductor in one continuous pipe or rod), the short
    stub conductor, the short and the mounting section. The printed lengths are the cut list's."""
    s = ctx.solution
    dims, parts = s.dimensions, s.parts
    fmt = ctx.length
    long_el = _piece(s, "long element")
    short_el = _piece(s, "short stub conductor")
    mount = _piece(s, "mounting section")
    m_rad = s.first_cut.radiator_margin_m
    top = s.radiator_cut_m - dims.radiator            # trimming allowance (and any tuning margin)
    through = long_el.length_m - s.radiator_cut_m - dims.stub
    pipe = 6.0
    grey = 0.45
    body_h = 420.0
    sheet = Layout(WIDTH, body_h)

    # -- as cut
    sheet.add(Text(PAD + 2.0, 20.0, "As cut", 9.0, bold=True))
    top_text = f"top {fmt(top)}"
    x_a = 24.0
    x_t = x_a + max(46.0, text_width(top_text) + 12.0)
    x_open = x_t + 150.0
    x_short = x_open + 134.0
    x_end = x_short + (34.0 if through > 0 else 0.0)
    y1 = 62.0
    sheet.add(BreakMark(x_a, y1, x_open, y1, at=0.55, size=10.0, width=pipe))
    sheet.add(BreakMark(x_open, y1, x_end, y1, at=0.45, size=10.0, width=pipe))
    for x in (x_t, x_open, x_short):
        sheet.add(Line(x, y1 - 7.0, x, y1 + 7.0, width=0.9))
    marks = [(x_a, top_text), (x_t, f"radiator {fmt(dims.radiator)}"), (x_open, f"stub {fmt(dims.stub)}"),
             (x_short, f"{fmt(through)}" if through > 0 else None)]
    if through > 0:
        marks.append((x_end, None))
    _chain(sheet, y1, marks, 14.0)
    sheet.add(Dimension(x_a, y1, x_end, y1, f"long element {fmt(long_el.length_m)}", -24.0))
    y2 = 122.0
    sheet.add(BreakMark(x_open, y2, x_end, y2, at=0.45, size=10.0, width=pipe))
    sheet.add(Line(x_short, y2 - 7.0, x_short, y2 + 7.0, width=0.9))
    sheet.add(Dimension(x_open, y2, x_end, y2, f"short stub conductor {fmt(short_el.length_m)}", -24.0))
    y3 = 178.0
    x_m = 250.0
    if parts.fittings:
        sec = _piece(s, "short section")
        sheet.add(Line(x_a + 20.0, y3, x_a + 70.0, y3, width=pipe))
        sheet.add(Dimension(x_a + 20.0, y3, x_a + 70.0, y3, f"short section {fmt(sec.length_m)}", -14.0,
                            beside="end"))
    else:
        bar = _piece(s, "short bar")
        sheet.add(Rect(x_a + 20.0, y3 - 4.0, 60.0, 8.0, width=0.75, fill=grey))
        for x in (x_a + 34.0, x_a + 66.0):
            sheet.add(Circle(x, y3, 2.2, width=0.6, fill=1.0))
        sheet.add(Dimension(x_a + 20.0, y3, x_a + 80.0, y3, f"short bar {fmt(bar.length_m)}", -14.0,
                            beside="end"))
    sheet.add(BreakMark(x_m, y3, x_m + 150.0, y3, at=0.5, size=10.0, width=pipe))
    sheet.add(Dimension(x_m, y3, x_m + 150.0, y3, f"mounting section {fmt(mount.length_m)}", -24.0))
    sheet.callout(x_a + 4.0, y1 + 3.0, ["free top: trim here to tune"], angles=(250, 270, 235),
                  radii=(44, 56, 72))
    sheet.callout(x_open + 30.0, y1 + 3.0, ["ONE piece: radiator and stub conductor"],
                  angles=(290, 270, 310), radii=(44, 56, 72))

    # -- assembled
    y_l = 262.0
    y_s = y_l + 70.0
    sheet.add(Text(PAD + 2.0, 222.0, "Assembled", 9.0, bold=True))
    sheet.add(BreakMark(x_a, y_l, x_open, y_l, at=0.55, size=10.0, width=pipe))
    sheet.add(BreakMark(x_open, y_l, x_short, y_l, at=0.35, size=10.0, width=pipe))
    sheet.add(BreakMark(x_open, y_s, x_short, y_s, at=0.35, size=10.0, width=pipe))
    if parts.fittings:
        sheet.add(Line(x_short, y_l, x_short, y_s, width=pipe))
        sheet.add(Rect(x_short - 7.0, y_l - 7.0, 14.0, 14.0, width=0.9, fill=grey))       # tee
        sheet.add(Rect(x_short - 7.0, y_s - 7.0, 14.0, 14.0, width=0.9, fill=grey))       # elbow
        sheet.add(BreakMark(x_short + 7.0, y_l, x_short + 60.0, y_l, at=0.5, size=10.0, width=pipe))
        x_mount_end = x_short + 60.0
        sheet.callout(x_short + 4.0, y_l - 7.0, ["tee"], angles=(60, 45, 90), radii=(16, 24))
        sheet.callout(x_short + 4.0, y_s + 7.0, ["elbow"], angles=(315, 300, 330), radii=(16, 24))
    else:
        for y in (y_l, y_s):
            sheet.add(Line(x_short, y, x_short + through / max(through, 1e-9) * 10.0, y, width=pipe))
        sheet.add(Rect(x_short - 4.0, y_l - 9.0, 8.0, y_s - y_l + 18.0, width=0.9, fill=grey))
        sheet.add(BreakMark(x_short + 4.0, (y_l + y_s) / 2, x_short + 60.0, (y_l + y_s) / 2, at=0.5,
                            size=10.0, width=pipe))
        x_mount_end = x_short + 60.0
        sheet.callout(x_short, y_s + 9.0, ["short bar, bolted"], angles=(240, 225, 255), radii=(24, 32))
    sheet.callout(x_mount_end - 16.0, y_l + 3.0 if parts.fittings else (y_l + y_s) / 2 + 3.0,
                  ["mounting section:", "mast clamps here"], angles=(315, 330, 300, 270), radii=(20, 30, 42, 56))
    tap_d = 60.0
    x_tap = x_short - tap_d
    for y in (y_l, y_s):
        sheet.add(Rect(x_tap - 3.0, y - 5.0, 6.0, 10.0, width=0.9, fill=1.0))
    sheet.add(Dimension(x_tap, y_s, x_short, y_s, f"tap {fmt(dims.tap)}", -16.0, beside="start"))
    sheet.add(Dimension(x_open, y_l, x_short, y_l, f"stub {fmt(dims.stub)}", 14.0))
    sheet.add(Dimension(x_a, y_l, x_open, y_l, f"top to the open top, as cut {fmt(s.radiator_cut_m)}", 14.0))
    sheet.add(Dimension(x_open + 20.0, y_l, x_open + 20.0, y_s,
                        f"spacing {units.format_length(dims.spacing, ctx.units, 'size')}", 0.0))
    sheet.callout(x_open, y_s, ["open top: the short conductor", "ends here (high RF voltage)"],
                  angles=(225, 240, 210), radii=(20, 30, 42))
    sheet.callout(x_tap + 3.0, y_s - 3.0, ["tap clamps"], angles=(45, 60, 30), radii=(20, 24, 32))
    notes = ["Drawn lying down: the left end is the top of the vertical. Not to scale (break marks).",
             "Lengths to the centre line of the short; " +
             ("the tee and the elbow take up their own take-off: cut the pipes that much shorter, "
              "measured on your fittings." if parts.fittings else
              "the conductors pass through the short bar by the length shown."),
             "Tuning: the tap and the long element's top; the short stays where it is."
             + (f" The top includes {units.article(fmt(m_rad))} {fmt(m_rad)} tuning margin."
                if m_rad > 0 else ""),
             ctx.rounding_note()]
    return _finish(ctx, "Long element and pieces: as cut and assembled", sheet.items, body_h, notes)


def _twin_lead(ctx: _Context) -> Drawing:
    """`construction: twin-lead`: the one piece of line as marked and cut (lying down, its top at the
    left): the tie allowance, the radiator (one conductor; the other cut at the gap and stripped off
    above it), the stub from the gap to the short, the tail; the short link and the tap. The printed
    lengths are the cut list's and the tuning procedure's first cut."""
    s = ctx.solution
    dims = s.dimensions
    fc = s.first_cut
    fmt = ctx.length
    line = _piece(s, "line, one piece")
    tie = s.wrap_allowance_m
    rad = dims.radiator + fc.radiator_margin_m
    stub = dims.stub + fc.stub_margin_m
    tail = line.length_m - tie - rad - stub
    body_h = 270.0
    sheet = Layout(WIDTH, body_h)
    sheet.add(Text(PAD + 2.0, 20.0, "One piece of line, as marked and cut", 9.0, bold=True))
    tie_text = f"tie {fmt(tie)}"
    x_a = 40.0
    x_r = x_a + max(40.0, text_width(tie_text) + 12.0)
    x_gap = x_r + 186.0
    x_short = x_gap + 150.0
    x_end = x_short + max(40.0, text_width(fmt(tail)) + 12.0)
    y_r, y_o = 110.0, 128.0
    # the web: between the conductors from the gap down; above it the radiator keeps its half
    sheet.add(Hatch(x_gap, y_r, x_end - x_gap, y_o - y_r, grey=WEB_GREY))
    sheet.add(Hatch(x_a, y_r, x_gap - x_a, 4.0, grey=WEB_GREY))
    sheet.add(BreakMark(x_a, y_r, x_gap, y_r, at=0.55, size=9.0, width=CONDUCTOR + 0.3))
    sheet.add(BreakMark(x_gap, y_r, x_end, y_r, at=0.2, size=9.0, width=CONDUCTOR + 0.3))
    sheet.add(BreakMark(x_gap + 3.0, y_o, x_end, y_o, at=0.2, size=9.0, width=CONDUCTOR + 0.3))
    sheet.add(Line(x_gap - 3.0, y_o - 4.0, x_gap + 1.0, y_o + 4.0, width=0.9))
    sheet.add(Circle((x_a + x_r) / 2, y_r + 2.0, 2.4, width=0.6, fill=1.0))
    for x in (x_r, x_gap, x_short):
        sheet.add(Line(x, y_r - 8.0, x, y_r - 2.0, width=0.9))
    sheet.add(Line(x_short, y_r, x_short, y_o, width=3.0))
    tap_d = 60.0
    x_tap = x_short - tap_d
    for y in (y_r, y_o):
        sheet.add(Rect(x_tap - 3.0, y - 4.0, 6.0, 8.0, width=0.9, fill=1.0))
    sheet.add(Line(x_tap, y_o + 4.0, x_tap, y_o + 90.0, width=COAX))
    _chain(sheet, y_r, [(x_a, tie_text), (x_r, f"radiator, first cut {fmt(rad)}"),
                        (x_gap, f"stub, first cut {fmt(stub)}"), (x_short, fmt(tail)), (x_end, None)], 16.0)
    sheet.add(Dimension(x_a, y_r, x_end, y_r, f"line, one piece {fmt(line.length_m)}", 44.0))
    sheet.add(Dimension(x_tap, y_o, x_short, y_o, f"tap {fmt(dims.tap)}", -24.0, beside="start"))
    sheet.callout((x_a + x_r) / 2, y_r + 2.0, ["tie hole: end insulator", "and halyard"],
                  angles=(270, 240, 300), radii=(30, 42, 56))
    sheet.callout(x_gap, y_o + 2.0, ["gap: the other conductor cut", "here and stripped off above"],
                  angles=(250, 270, 230), radii=(42, 56, 72))
    sheet.callout(x_short, y_o + 2.0, ["short: wire link,", "soldered"], angles=(300, 315, 330, 285),
                  radii=(24, 32, 42, 56))
    sheet.callout(x_tap, y_o + 4.0, ["tap: clips to find it,", "then soldered"], angles=(210, 225, 240, 195),
                  radii=(30, 42, 56, 72))
    sheet.callout(x_tap, y_o + 80.0, [f"coax {ctx.design.feed.coax}, through", "the choke to the station"],
                  angles=(0, 20, 340), radii=(16, 24, 32))
    notes = ["Drawn lying down: the left end is the top of the vertical. Not to scale (break marks).",
             f"Solved: radiator {fmt(dims.radiator)} (top end to the gap), stub {fmt(dims.stub)} (gap "
             "to the short's centre line); the first cut is long by the tuning margins (see the tuning "
             "procedure): trim the top and move the short up to tune.",
             ctx.rounding_note()]
    return _finish(ctx, "The line: radiator, gap, stub and short in one piece", sheet.items, body_h, notes)


STYLE_FIGURES = {"tube": _tube, "twin-lead": _twin_lead}


# ---------------------------------------------------------------- stub

def _web(sheet: Layout, ctx: _Context, x_j: float, x_o: float, spans, keep_clear) -> None:
    """What holds the stub's conductors apart, over the drawn spans (y0, y1): the web of a line
    with a solid dielectric (grey, with windows for window line), spreaders for open-wire line
    (none within 12 points of the page y values in `keep_clear`), nothing for self-supporting pipe
    or rod."""
    line = ctx.design.stub
    for y0, y1 in spans:
        if line.dielectric != "air":
            sheet.add(Hatch(x_j + 1.0, y0, x_o - x_j - 2.0, y1 - y0, grey=WEB_GREY))
            if "window" in line.name:
                y = y0 + 6.0
                while y + 18.0 <= y1 - 4.0:
                    sheet.add(Hatch(x_j + 7.0, y, x_o - x_j - 14.0, 18.0, grey=1.0))
                    y += 28.0
        elif not ctx.solution.parts.rigid_stub:
            y = y0 + 16.0
            while y + 4.0 <= y1 - 6.0:
                if all(abs(y + 2.0 - k) > 12.0 for k in keep_clear):
                    sheet.add(Rect(x_j - 3.0, y, x_o - x_j + 6.0, 4.0, width=0.5, fill=INSULATOR_GREY))
                y += 46.0


def _section(ctx: _Context, cx: float, cy: float) -> list:
    """Section through the stub centred at (cx, cy): the two conductors and the spacing, centre to
    centre."""
    line = ctx.design.stub
    text = f"spacing {units.format_length(line.spacing_m, ctx.units, 'size')}"
    gap = max(56.0, text_width(text) + 14.0)
    r = 5.0
    x1, x2 = cx - gap / 2, cx + gap / 2
    out: list = []
    if line.dielectric != "air":
        out.append(Hatch(x1, cy - 2.0, gap, 4.0, grey=WEB_GREY))
    out += [Circle(x, cy, r, width=0.9, fill=0.45) for x in (x1, x2)]
    out.append(Dimension(x1, cy, x2, cy, text, 16.0))
    out.append(Text(cx, cy + r + 12.0, "section through the stub", LABEL, "middle"))
    return out


def _stub(ctx: _Context) -> Drawing:
    """The stub from the open top to below the short: junction, spacing, short, tap, leads, coax
    and the choke at the tap."""
    d, s = ctx.design, ctx.solution
    dims = s.dimensions
    fmt = ctx.length
    orientation = d.site.orientation
    a = StubAnchors.hanging(236.0, 296.0, top=92.0, stub_span=238.0, tap_span=88.0, tail=16.0)
    x_j, x_o, x_mid, y_top, y_tap, y_short, y_end = a.x_j, a.x_o, a.mid, a.top, a.tap, a.short, a.end
    y_choke = y_end + 10.0
    body_h = y_choke + 74.0
    sheet = Layout(WIDTH, body_h)

    y_b = (y_top + 40.0 + y_tap - 44.0) / 2
    _web(sheet, ctx, x_j, x_o, ((y_top, y_b - 7.0), (y_b + 7.0, y_end)), (y_tap, y_tap - 9.0, y_short))
    at = (y_b - y_top) / (y_end - y_top)
    for x in (x_j, x_o):
        sheet.add(BreakMark(x, y_top, x, y_end, at=at, size=8.0, width=CONDUCTOR + 0.3))

    # open top: the junction first, so that the callouts placed after it keep clear of it
    sheet.add(Circle(x_j, y_top, 2.4, width=0, fill=0.0))
    style = s.parts.construction
    if not s.parts.rigid_radiator and style != "twin-lead":
        sheet.add(_wrap_mark(x_j, y_top + 2.0, 7, "y", amplitude=2.4))
    if orientation in ("vertical", "inverted"):
        sheet.add(Line(x_j, y_top, x_j, PAD + 8.0, width=CONDUCTOR + 0.3))
        sheet.callout(x_j, (y_top + PAD + 8.0) / 2, ["radiator, straight up"] if orientation == "vertical"
                      else ["radiator (installed: hanging", "straight down from here)"],
                      angles=(180, 200, 160))
    else:
        theta = 0.0 if orientation == "horizontal" else min(d.site.slope_rad, MAX_DRAWN_SLOPE)
        reach = 150.0
        end = (x_j - reach * math.cos(theta), y_top + reach * math.sin(theta))
        sheet.add(Line(x_j, y_top, *end, width=CONDUCTOR + 0.3))
        sheet.callout(*_along((x_j, y_top), (-math.cos(theta), math.sin(theta)), reach * 0.55),
                      ["radiator, to the far end"], angles=(90, 120, 270, 240, 60))
        # the rope from the open top to the support
        u = (math.cos(math.radians(70)), -math.sin(math.radians(70)))
        tie = _along((x_o, y_top), u, 10.0)
        sheet.add(Line(x_o, y_top, *tie, width=ROPE))
        sheet.add(_insulator(tie, u, 18.0, 3.5))
        far = _along(tie, u, 18.0)
        top_end = _along(far, u, (far[1] - PAD - 4.0) / -u[1])
        sheet.add(Line(*far, *top_end, width=ROPE, dash=ROPE_DASH))
        sheet.callout(*_along(far, u, 14.0), ["rope to the support"], angles=(0, 340, 20),
                      radii=(12, 20, 30, 42))

    # short and tap
    sheet.add(Line(x_j, y_short, x_o, y_short, width=3.0))
    for x in (x_j, x_o):
        sheet.add(Circle(x, y_short, 2.6, width=0, fill=0.0))
        sheet.add(Rect(x - 4.0, y_tap - 4.0, 8.0, 8.0, width=0.9, fill=1.0))
    e_y = y_tap - 9.0
    sheet.add(Line(x_mid - 2.0, e_y, x_j + 4.0, y_tap, width=LEAD))
    sheet.add(Line(x_mid + 3.0, e_y + 6.0, x_o - 4.0, y_tap, width=LEAD))
    sheet.add(Line(x_mid, e_y, x_mid, y_short - 4.0, width=COAX))
    sheet.add(Line(x_mid, y_short + 4.0, x_mid, y_choke, width=COAX))
    sheet.add(*_choke_symbol(s, x_mid, y_choke, 34.0, 14.0))
    coax_end_y = y_choke + 50.0
    sheet.add(Polyline(((x_mid, y_choke + 34.0), (x_mid, coax_end_y), (PAD + 60.0, coax_end_y)),
                       width=COAX))

    # dimensions right of the stub
    sheet.add(_vdim(x_o, y_short, y_tap, f"tap {fmt(dims.tap)}", 20.0))
    sheet.add(_vdim(x_o, y_short, y_top, f"stub {fmt(dims.stub)}", 46.0))

    sheet.callout(x_o, y_top, ["open end: this conductor", "ends here (high RF voltage)"],
                  angles=(45, 30, 60), radii=(56, 72, 90, 110))
    sheet.callout(x_j, y_top + 6.0, ["one piece: the long element", "goes on up as the radiator"]
                  if style == "tube" else ["this conductor goes on up", "as the radiator (the gap)"]
                  if style == "twin-lead" else ["junction: the radiator", "on this conductor only"],
                  angles=(225, 240, 200, 135), radii=(30, 42, 56, 72))
    sheet.place_group([_section(ctx, 104.0, cy) for cy in (y_b + 8.0, y_tap + 10.0, y_b - 40.0,
                                                            y_short + 40.0)], "the stub's section")
    short_text = ["short: bar or pipe across,", "clamped or soldered"] if s.parts.rigid_stub else ["short: wire across both", "conductors, soldered"]
    sheet.callout(x_j, y_short, short_text, angles=(200, 225, 180), radii=(30, 42, 56, 72))
    sheet.callout(x_j - 4.0, y_tap, ["tap: clips to find it,", "then soldered"] if style == "twin-lead"
                  else ["tap clamps: they slide", "along the stub to tune"],
                  angles=(160, 180, 135, 200), radii=(30, 42, 56, 72))
    sheet.callout(x_mid - 2.0, e_y, ["coax centre to the radiator", "side, braid to the other"],
                  angles=(150, 135, 165), radii=(56, 72, 90))
    choke_text = ([f"choke: {_turns(s.choke.turns)} of the coax,", "right at the tap"] if s.sleeve is None
                  else ["choke: quarter-wave sleeve", "over the coax, right at the tap"])
    if s.choke.warning and s.sleeve is None:
        choke_text.append("(not enough here: see the choke figure)")
    sheet.callout(x_mid + 7.0, y_choke + 17.0, choke_text, angles=(0, 20, 340), radii=(30, 42, 56))
    sheet.callout(PAD + 60.0, coax_end_y, [f"coax {d.feed.coax} to the station"],
                  angles=(90, 60, 120), radii=(12, 18, 26))
    notes = ["Not to scale: the stub is drawn shortened (break marks).",
             "Stub: open top to the centre line of the short. Tap: centre line of the short to the "
             "tap point.", ctx.rounding_note()]
    if orientation == "inverted":
        notes.insert(0, "Drawn the right way up for the bench; installed, this antenna is upside down: "
                        "the short at the top, the open top below, the radiator hanging from it. Lead "
                        "the coax out sideways from the tap through the choke, then down (overview).")
    return _finish(ctx, "Stub: open top, short and tap", sheet.items, body_h, notes)


def _turns(n: int) -> str:
    return f"{n} turn" if n == 1 else f"{n} turns"


# ---------------------------------------------------------------- short and tap detail

#: ratio tap / spacing drawn to scale in the detail; outside it the tap span is shortened (break
#: marks) or lengthened (stated in the notes)
DETAIL_SCALE_RANGE = (0.25, 1.5)


def _short_tap(ctx: _Context) -> Drawing:
    """Close view of the short and the tap: how the short is made and how the coax connects."""
    d, s = ctx.design, ctx.solution
    dims = s.dimensions
    fmt = ctx.length
    rigid = s.parts.rigid_stub
    x_j, x_o = 180.0, 320.0
    x_mid = (x_j + x_o) / 2
    gap = x_o - x_j
    cw = 9.0 if rigid else 4.0
    ratio = dims.tap / dims.spacing
    lo, hi = DETAIL_SCALE_RANGE
    breaks = ratio > hi
    if breaks:
        tap_d, scale_note = 200.0, ("Not to scale: the tap span is drawn shortened (break marks) "
                                    "against the spacing.")
    elif ratio < lo:
        tap_d, scale_note = lo * gap, "Not to scale: the tap span is drawn longer than it is."
    else:
        tap_d, scale_note = ratio * gap, "Tap span and spacing drawn to scale (the parts are not)."
    y_a = 48.0
    y_tap = y_a + 86.0
    y_short = y_tap + tap_d
    y_end = y_short + 26.0
    y_bottom = y_end + 30.0
    body_h = y_bottom + 36.0
    sheet = Layout(WIDTH, body_h)

    conductor_grey = 0.35
    y_b = (y_tap + y_short) / 2

    def run(x0: float, y0: float, y1: float, piece) -> None:
        """A vertical run drawn by `piece(y0, y1)`, broken at y_b when the tap span is shortened."""
        if breaks and y0 < y_b < y1:
            sheet.add(piece(y0, y_b - 7.0), piece(y_b + 7.0, y1))
            sheet.add(BreakMark(x0, y_b - 7.0, x0, y_b + 7.0, size=max(10.0, cw + 4.0), width=0.75))
        else:
            sheet.add(piece(y0, y1))

    if d.stub.dielectric != "air":
        # the web, lighter than in the stub figure: here it is a large area behind the coax
        run(x_mid, y_a, y_end, lambda y0, y1: Hatch(x_j, y0, gap, y1 - y0, grey=0.94))
    for x in (x_j, x_o):
        run(x, y_a, y_end, lambda y0, y1, x=x: Line(x, y0, x, y1, width=cw, stroke=conductor_grey))
    sheet.add(Dimension(x_j, y_a, x_o, y_a, f"spacing {units.format_length(dims.spacing, ctx.units, 'size')}",
                        14.0))

    # short: bar across, joints at both conductors; its centre line
    sheet.add(Rect(x_j - cw / 2 - 4.0, y_short - 3.5, gap + cw + 8.0, 7.0, width=0.75, fill=0.55))
    for x in (x_j, x_o):
        sheet.add(Circle(x, y_short, cw / 2 + 3.0, width=0.9))
    sheet.add(Line(x_j - 46.0, y_short, x_o + 20.0, y_short, width=THIN, dash=CENTRE_DASH))
    # tap clamps and their centre line
    for x in (x_j, x_o):
        sheet.add(Rect(x - cw / 2 - 3.0, y_tap - 6.0, cw + 6.0, 12.0, width=0.9, fill=1.0))
    sheet.add(Line(x_j - 46.0, y_tap, x_o + 20.0, y_tap, width=THIN, dash=CENTRE_DASH))

    # coax up between the conductors (behind the short): jacket, braid, centre insulation, leads
    jacket_top = y_tap + 9.0
    def jacket(y0: float, y1: float) -> Rect:
        return Rect(x_mid - 6.0, y0, 12.0, y1 - y0, width=0.75, fill=COAX_GREY)
    run(x_mid, jacket_top, y_short - 5.0, jacket)
    sheet.add(jacket(y_short + 5.0, y_bottom))
    sheet.add(Rect(x_mid - 6.0, jacket_top - 8.0, 12.0, 8.0, width=0.75))
    sheet.add(Hatch(x_mid - 6.0, jacket_top - 8.0, 12.0, 8.0, spacing=2.0))
    sheet.add(Rect(x_mid - 2.5, jacket_top - 14.0, 5.0, 6.0, width=0.6, fill=1.0))
    tip = (x_mid, jacket_top - 14.0)
    sheet.add(Polyline((tip, (x_mid, tip[1] - 4.0), (x_j + cw / 2 + 3.0, y_tap - 2.0)), width=1.1))
    sheet.add(Line(x_mid + 6.0, jacket_top - 4.0, x_o - cw / 2 - 3.0, y_tap + 2.0, width=1.1))

    sheet.add(_vdim(x_o, y_short, y_tap, f"tap {fmt(dims.tap)}", 44.0))

    style = s.parts.construction
    sheet.callout(x_j, y_a + 4.0, ["radiator-side conductor:", {
        "tube": "the long element, the radiator above", "twin-lead": "it goes on up as the radiator"}.get(
            style, "the radiator joins it at the top")], angles=(180, 160, 200), radii=(20, 30, 42))
    sheet.callout(x_o, y_a + 4.0, ["other conductor:", "cut at the gap" if style == "twin-lead"
                                   else "ends open at the top"],
                  angles=(0, 20, 340), radii=(60, 72, 90))
    if rigid:
        short_text = ["short: bar or pipe across,", "clamped or soldered"]
    else:
        short_text = ["short: bare copper wire across,", "wrapped and soldered"]
    sheet.callout(x_j - cw / 2 - 4.0, y_short + 2.0, short_text, angles=(225, 200, 250, 180),
                  radii=(30, 42, 56))
    sheet.callout(x_j - 46.0, y_short, ["centre line of the short:", "measure from here"],
                  angles=(160, 180, 135, 200), radii=(10, 16, 24), end="dot")
    sheet.callout(x_j - 46.0, y_tap, ["tap point: centre", "of the clamps"],
                  angles=(180, 160, 200), radii=(10, 16, 24), end="dot")
    sheet.callout((x_mid + x_j) / 2 + 6.0, (tip[1] - 4.0 + y_tap) / 2,
                  ["coax centre to the radiator-side conductor"], angles=(90, 70, 110),
                  radii=(42, 56, 72))
    sheet.callout((x_mid + x_o) / 2 + 4.0, (jacket_top - 4.0 + y_tap) / 2 + 1.0,
                  ["coax braid to the other conductor"], angles=(60, 45, 75, 30), radii=(56, 72, 90))
    sheet.callout(x_j + cw / 2 + 3.0, y_tap - 6.0, ["tap clip: soldered", "once the match is made"]
                  if style == "twin-lead" else ["tap clamp: slides", "along to tune"],
                  angles=(135, 150, 120, 200), radii=(30, 42, 56))
    sheet.callout(x_mid + 6.0, y_end - 4.0, ["coax passes behind the short,", "down to the choke"],
                  angles=(340, 0, 320), radii=(30, 42, 56))
    sheet.place_text([(PAD + 2.0, y_bottom - 4.0), (PAD + 2.0, y_bottom + 8.0)],
                     ["Keep the leads short. Weatherproof the coax end", "with self-amalgamating tape."],
                     size=LABEL)
    notes = [scale_note, ctx.rounding_note()]
    if ctx.design.site.orientation == "inverted":
        notes.insert(0, "Drawn the right way up for the bench; installed, upside down: the short at the "
                        "top, the open top and the radiator below. Lead the coax out sideways from "
                        "the tap through the choke, then down (overview).")
    return _finish(ctx, "Short and tap: how they are made", sheet.items, body_h, notes)


# ---------------------------------------------------------------- choke

def _mm_in(m: float, system: str) -> str:
    """A small diameter: the metric sheet's length, or 0.1 mm with inches to 0.01 in on imperial
    sheets (an eighth of an inch is too coarse for a cable)."""
    return units.format_length(m, "metric") if system == "metric" else f"{m * 1e3:.1f} mm ({m / 0.0254:.2f} in)"


def _sleeve(ctx: _Context) -> Drawing:
    """The quarter-wave sleeve choke (built instead of a coil above HF): the sleeve over the feed
    coax in a side view (length to scale, diameters enlarged) and an end view to scale; which end is
    bonded to the braid and which end faces the tap."""
    d, sl = ctx.design, ctx.solution.sleeve
    L = ctx.length
    y_ax = 78.0
    x_open, x_closed = 120.0, 380.0          # open end toward the tap (left), bonded end (right)
    tube_h, coax_h = 30.0, 14.0
    body_h = 205.0
    sheet = Layout(WIDTH, body_h)
    sheet.add(Rect(PAD + 30.0, y_ax - coax_h / 2, WIDTH - 2 * PAD - 120.0, coax_h, width=0.6,
                   fill=COAX_GREY))
    sheet.add(Rect(x_open, y_ax - tube_h / 2, x_closed - x_open, tube_h, width=0.9, fill=SUPPORT_GREY))
    sheet.add(Rect(PAD + 30.0, y_ax - coax_h / 2, x_open - PAD - 30.0, coax_h, width=0.6,
                   fill=COAX_GREY))
    # the bond at the closed end: a hose clamp over the sleeve's end and the bared braid
    sheet.add(Hatch(x_closed - 10.0, y_ax - tube_h / 2, 10.0, tube_h, spacing=2.0))
    sheet.add(Rect(x_closed, y_ax - coax_h / 2 - 1.0, 12.0, coax_h + 2.0, width=0.6))
    sheet.add(Hatch(x_closed, y_ax - coax_h / 2 - 1.0, 12.0, coax_h + 2.0, spacing=2.0))
    for x in (x_open + 2.0, x_closed - 16.0):       # spacers
        sheet.add(Rect(x, y_ax - tube_h / 2 + 1.0, 4.0, (tube_h - coax_h) / 2 - 1.0, width=0.5, fill=1.0))
        sheet.add(Rect(x, y_ax + coax_h / 2, 4.0, (tube_h - coax_h) / 2 - 1.0, width=0.5, fill=1.0))
    sheet.add(Line(PAD + 24.0, y_ax, WIDTH - PAD - 84.0, y_ax, width=THIN, dash=CENTRE_DASH))
    sheet.add(Dimension(x_open, y_ax - tube_h / 2, x_closed, y_ax - tube_h / 2,
                        f"sleeve {L(sl.length_m)}", 16.0))
    sheet.callout(PAD + 34.0, y_ax + coax_h / 2, ["from the tap"], angles=(270, 250, 290),
                  radii=(14, 22, 30))
    sheet.callout(x_open, y_ax + tube_h / 2, ["open end: toward the tap,", "as close to it as it goes"],
                  angles=(250, 270, 230), radii=(22, 32, 44))
    sheet.callout(x_closed + 6.0, y_ax + coax_h / 2 + 1.0,
                  ["bonded end: hose clamp over the sleeve", "and the braid, bared through a window",
                   "cut in the jacket; tape it over"], angles=(290, 310, 270), radii=(22, 32, 44))
    sheet.callout(x_open + 4.0, y_ax - tube_h / 2 + 2.0, ["plastic spacers centre the sleeve"],
                  angles=(120, 100, 140), radii=(30, 40, 52))
    sheet.callout(WIDTH - PAD - 90.0, y_ax - coax_h / 2, ["to the station"], angles=(60, 80, 40),
                  radii=(16, 24, 32))
    # end view, to scale (enlarged so the tube is 60 points across)
    k = 60.0 / sl.sleeve_inner_diameter_m
    xe, ye = WIDTH - PAD - 40.0, 162.0
    sheet.add(Circle(xe, ye, sl.sleeve_inner_diameter_m / 2 * k + 2.0, width=0.9, fill=SUPPORT_GREY))
    sheet.add(Circle(xe, ye, sl.sleeve_inner_diameter_m / 2 * k, width=0.6, fill=1.0))
    sheet.add(Circle(xe, ye, sl.cable_od_m / 2 * k, width=0.6, fill=COAX_GREY))
    sheet.add(Circle(xe, ye, sl.shield_diameter_m / 2 * k, width=THIN))
    sheet.add(Text(xe, ye - sl.sleeve_inner_diameter_m / 2 * k - 8.0, "end view", LABEL, "middle"))
    sheet.place_text([(PAD + 2.0, 150.0), (PAD + 2.0, 160.0)],
                     [f"Sleeve: {_mm_in(sl.sleeve_inner_diameter_m, ctx.units)} inside (or a little "
                      f"more), over the {d.feed.coax} ({_mm_in(sl.cable_od_m, ctx.units)} outside).",
                      f"A quarter wave at {units.format_frequency(sl.centre_hz)} with velocity factor "
                      f"{sl.velocity_factor:.3f} (air and the jacket between braid and sleeve).",
                      "Cut it long; check its resonance with an analyzer or dip meter loosely coupled",
                      "at the open end, and trim the open end until it dips at that frequency."],
                     size=LABEL)
    notes = ["Side view: length to scale, diameters enlarged; end view to scale.", ctx.rounding_note()]
    return _finish(ctx, "Choke: quarter-wave sleeve over the feed coax at the tap", sheet.items, body_h,
                   notes)


def _choke(ctx: _Context) -> Drawing:
    """The choke to scale: the feed coax close-wound on its form (side and end views), turns,
    form diameter, coil length, which end goes to the tap."""
    d, s = ctx.design, ctx.solution
    if s.sleeve is not None:
        return _sleeve(ctx)
    c = s.choke
    fmt = ctx.length
    od = d.feed.coax_outer_diameter_m
    form_len = s.parts.choke_form_m
    scale = min(230.0 / form_len, 128.0 / (c.form_diameter_m + 2 * od))
    fd, odp, fl = c.form_diameter_m * scale, od * scale, form_len * scale
    y_ax = 120.0
    x0 = 110.0
    body_h = y_ax + (c.form_diameter_m / 2 + od) * scale + 78.0
    warning_lines = wrap_text(f"Warning: {c.warning}", WIDTH - 2 * PAD - 4.0, LABEL) if c.warning else []
    body_h += len(warning_lines) * line_height(LABEL)
    sheet = Layout(WIDTH, body_h)

    top, bottom = y_ax - fd / 2 - odp, y_ax + fd / 2 + odp
    sheet.add(Rect(x0, y_ax - fd / 2, fl, fd, width=0.75, fill=SUPPORT_GREY))
    sheet.add(Line(x0 - 6.0, y_ax, x0 + fl + 6.0, y_ax, width=THIN, dash=CENTRE_DASH))
    xs = x0 + (fl - c.coil_length_m * scale) / 2
    pitch = c.coil_length_m * scale / c.turns
    band = max(odp, 2.5)       # the coax as a band of its own diameter (or visibly thick)
    sheet.add(Rect(PAD + 30.0, bottom - band, xs + pitch / 2 - PAD - 30.0, band, width=0.6,
                   fill=COAX_GREY))
    for k in range(c.turns):
        xa = xs + k * pitch
        sheet.add(Polyline(((xa, bottom), (xa + pitch, bottom), (xa + 1.5 * pitch, top),
                            (xa + 0.5 * pitch, top)), closed=True, fill=COAX_GREY, width=0.6))
    x_last = xs + c.turns * pitch + pitch / 2
    sheet.add(Rect(x_last, top, x0 + fl + 70.0 - x_last, band, width=0.6, fill=COAX_GREY))
    sheet.add(Dimension(xs, top, xs + c.coil_length_m * scale, top, f"coil {fmt(c.coil_length_m)}",
                        18.0, beside="start"))

    # end view
    xe = 400.0
    r_out = (c.form_diameter_m / 2 + od) * scale
    sheet.add(Circle(xe, y_ax, r_out, width=0.75, fill=COAX_GREY))
    sheet.add(Circle(xe, y_ax, fd / 2, width=0.75, fill=SUPPORT_GREY))
    sheet.add(_vdim(xe, y_ax + fd / 2, y_ax - fd / 2, f"form {fmt(c.form_diameter_m)}", r_out + 16.0))
    sheet.add(Text(xe, y_ax + r_out + 14.0, "end view", LABEL, "middle"))

    coax_in_coil = c.turns * math.pi * c.mean_diameter_m
    sheet.callout(PAD + 34.0, bottom, ["from the tap: this end", "goes right at the tap"],
                  angles=(270, 250, 290), radii=(16, 24, 34))
    sheet.callout(x0 + fl + 66.0, top, ["to the station"], angles=(90, 70, 110),
                  radii=(14, 22, 30))
    sheet.callout(xs + pitch, bottom, [f"{_turns(c.turns)} of {d.feed.coax}, close-wound",
                                       f"about {fmt(coax_in_coil)} of the coax",
                                       "cable ties hold the turns"],
                  angles=(290, 270, 315, 250), radii=(30, 42, 56))
    if warning_lines:
        sheet.place_text([(PAD + 2.0, body_h - PAD - len(warning_lines) * line_height(LABEL))],
                         warning_lines, size=LABEL)
    notes = ["Coil and form drawn to scale (side and end views).", ctx.rounding_note()]
    return _finish(ctx, "Choke: the feed coax wound at the tap", sheet.items, body_h, notes)


# ---------------------------------------------------------------- plots

def _with_strip(ctx: _Context, plot: Drawing, caption: str, notes: list[str]) -> Drawing:
    return _finish(ctx, caption, list(plot.items), plot.height + 4.0, notes, plot.width)


def _swr(ctx: _Context) -> Drawing:
    s = ctx.solution
    sw = s.sweep
    # The Solution reports a 2:1 edge beyond the sweep at the sweep's end; the plot marks only edges
    # where the curve crosses 2:1 inside the sweep.
    f = np.asarray(sw.frequency_hz)
    edges = s.band_swr2_hz or (None, None)
    edges = tuple(None if e is None or ((e <= f[0] or e >= f[-1]) and
                                         np.interp(e, f, sw.swr) < 2.0) else e for e in edges)
    plot = plots.swr_plot(sw.frequency_hz, sw.swr, sw.swr_transmitter, s.band_hz, s.frequency_hz,
                          edges, WIDTH, SWR_HEIGHT, "SWR across the band (predicted)")
    notes = [f"At the feed point: SWR on {units.format_impedance(ctx.design.feed.impedance_ohm)}. "
             f"At the transmitter: through {units.format_length(ctx.solution.feed_coax_m, ctx.units, 'coarse')}"
             f" of {ctx.design.feed.coax}.", ctx.rounding_note()]
    return _with_strip(ctx, plot, "SWR across the band", notes)


def _smith(ctx: _Context) -> Drawing:
    s = ctx.solution
    sw = s.sweep
    z = np.asarray(sw.r_ohm) + 1j * np.asarray(sw.x_ohm)
    plot = plots.smith_chart(sw.frequency_hz, z, ctx.design.feed.impedance_ohm, s.band_hz,
                             s.frequency_hz, SMITH_WIDTH, "Feed impedance at the tap (predicted)")
    return _with_strip(ctx, plot, "Smith chart of the feed impedance", [])


def _pattern(ctx: _Context) -> Drawing:
    r = ctx.solution.radiation
    free = r.ground_kind == "free-space"
    plot = polar.pattern_plot(r.elevation_deg, r.elevation_gain_dbi, r.azimuth_cut_deg,
                              r.azimuth_gain_dbi, r.max_gain_dbi, r.takeoff_deg, r.azimuth_deg, free,
                              WIDTH, "Radiation pattern (predicted), gain in dBi")
    site = ctx.design.site
    zero = ("the direction the radiator runs from the stub"
            if site.orientation not in ("vertical", "inverted") else
            "from the stub toward the conductor that carries the radiator")
    where = "in free space" if free else "over the site's ground (direct and ground-reflected wave)"
    notes = [f"Gain relative to the power delivered to the tap: the antenna's losses"
             f"{'' if free else ' and the ground loss'} taken off. Computed {where} from the model's "
             f"currents on the radiator and the stub"
             f"{'' if ctx.solution.stack is None else ', the upper element and the phasing stub'} at "
             f"{units.format_frequency(ctx.solution.frequency_hz)}; rings 10 dB apart. Azimuth 0\u00b0: {zero}."]
    k = ctx.solution.stack
    if k is not None:
        notes.append(f"Stacked: maximum gain {r.max_gain_dbi:.1f} dBi, {k.gain_over_single_db:+.1f} dB over "
                     f"the single half-wave of the same design ({k.single_max_gain_dbi:.1f} dBi).")
    return _with_strip(ctx, plot, "Radiation pattern", notes)


# ---------------------------------------------------------------- all figures

def figures(design: Design, solution: Solution, date: str) -> dict[str, Drawing]:
    """The figures of a solved design, keyed and ordered as FIGURES; `date` is the revision date
    printed in each title strip (YYYY-MM-DD)."""
    ctx = _Context(design, solution, date)
    builders = {"overview": _overview, "radiator": _radiator, "stub": _stub, "short-tap": _short_tap,
                "choke": _choke, "swr": _swr, "smith": _smith, "pattern": _pattern}
    # a construction style's own drawing of its pieces takes the radiator's place
    builders["radiator"] = STYLE_FIGURES.get(solution.parts.construction, _radiator)
    return {key: builders[key](ctx) for key in FIGURES}
