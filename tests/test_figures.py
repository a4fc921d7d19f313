"""The figures of a design (buildsheet/drawing/figures.py): the dimensions printed on them, their
layout, their geometry, and the same drawing through the SVG and the PDF writers.

References, from outside the code under test:
- Lengths printed on a drawing are parsed back from the SVG text and converted with the exact
  definitions 1 ft = 12 in, 1 in = 25.4 mm (international yard and pound agreement, 1959); each
  must lie within half its rounding step (1/16 in, or 0.5 mm / 0.05 mm) of the Solution's value.
- The SWR drawn is checked against SWR = (1 + |S11|) / (1 - |S11|) with S11 of the Solution's
  feed impedance computed by scikit-rf (`skrf.network.z2s`), on the plot's own axis transform.
- The SVG is parsed with xml.etree (W3C SVG 1.1: viewBox, text elements); the PDF text is
  extracted with pypdf.
"""

from __future__ import annotations

import dataclasses
import functools
import io
import math
import pathlib
import re
import xml.etree.ElementTree as ET

import numpy as np
import pypdf
import pytest
import skrf
from hypothesis import HealthCheck, assume, example, given, settings
from hypothesis import strategies as st
from reportlab.pdfgen.canvas import Canvas

from buildsheet import fonts, units
from buildsheet.catalog import catalog
from buildsheet.design import design_from_text, load_design
from buildsheet.drawing import plots
from buildsheet.drawing.figures import (DETAIL_SCALE_RANGE, FIGURES, SMITH_WIDTH, SWR_HEIGHT, WIDTH,
                                        figures)
from buildsheet.drawing.shapes import (Arc, Box, BreakMark, Circle, Dimension, Line, Polyline, Text,
                                       clip_segment)
from buildsheet.errors import DesignError
from buildsheet.layout import TIE_OFF_M, site_layout
from buildsheet.solver import solve
from buildsheet.writers.pdf_shapes import draw_on_canvas
from buildsheet.writers.svg import render_svg

ROOT = pathlib.Path(__file__).resolve().parent.parent
DEMOS = sorted((ROOT / "designs").glob("*.yaml"))
SVG = "{http://www.w3.org/2000/svg}"
DATE = "2024-06-15"
INCH = 0.0254           # m, exact (1959)
FOOT = 12 * INCH
PARTS = ("overview", "radiator", "stub", "short-tap", "choke")   # laid out here (plots: plots.py)


@functools.cache
def solved(path: pathlib.Path):
    design = load_design(path)
    return design, solve(design)


def in_units(design, system: str):
    return design.with_changes(output=dataclasses.replace(design.output, units=system))


@functools.cache
def demo_figures(path: pathlib.Path, system: str):
    design, solution = solved(path)
    design = in_units(design, system)
    return design, solution, figures(design, solution, DATE)


# ---------------------------------------------------------------- reading lengths back

_IMPERIAL = re.compile(r"(?P<dec>\d+\.\d+)\"|(?:(?P<ft>\d+)' )?(?:(?P<inch>\d+)(?:-(?P<n1>\d+)/(?P<d1>\d+))?"
                       r"|(?P<n2>\d+)/(?P<d2>\d+))\"")
_METRIC = re.compile(r"(?P<m>\d+\.\d{2,3}) m(?![A-Za-z])|(?P<mm>\d+(?:\.\d)?) mm(?![A-Za-z])"
                     r"|(?P<cm>\d+) cm(?![A-Za-z])")
#: half the rounding step of each units.format_length step, m (the size step's finest: 1/64 in)
HALF_STEP = {("imperial", "fine"): INCH / 16, ("imperial", "coarse"): INCH / 2,
             ("imperial", "size"): INCH / 16, ("metric", "fine"): 0.0005, ("metric", "coarse"): 0.005,
             ("metric", "size"): 0.0005}


def lengths_in(text: str, system: str) -> list[tuple[str, float, float]]:
    """Every length printed in `text`: (as printed, value in m, half its rounding step in m)."""
    out = []
    if system == "imperial":
        for m in _IMPERIAL.finditer(text):
            inches = float(m["dec"] or m["inch"] or 0)
            if m["n1"]:
                inches += int(m["n1"]) / int(m["d1"])
            if m["n2"]:
                inches += int(m["n2"]) / int(m["d2"])
            out.append((m[0], int(m["ft"] or 0) * FOOT + inches * INCH, INCH / 16))
    else:
        for m in _METRIC.finditer(text):
            if m["cm"]:
                out.append((m[0], float(m["cm"]) / 100, 0.005))
            elif m["m"]:
                out.append((m[0], float(m["m"]), 0.0005 if len(m["m"].split(".")[1]) == 3 else 0.005))
            else:
                half = 0.00005 if "." in m["mm"] else 0.0005
                out.append((m[0], float(m["mm"]) / 1000, half))
    return out


def test_length_reader_reads_the_formats_a_tape_shows():
    assert lengths_in("radiator 33' 4-3/4\"", "imperial") == [("33' 4-3/4\"", 33 * FOOT + 4.75 * INCH,
                                                              INCH / 16)]
    assert [v for _, v, _ in lengths_in("tap 7-5/8\" and 3/8\" and 2\"", "imperial")] == \
        pytest.approx([7.625 * INCH, 0.375 * INCH, 2 * INCH])
    assert [v for _, v, _ in lengths_in("5.129 m, 123 mm, 6.1 mm, 14.175 MHz", "metric")] == \
        pytest.approx([5.129, 0.123, 0.0061])


def svg_texts(drawing) -> list[str]:
    root = ET.fromstring(render_svg(drawing))
    return [el.text for el in root.iter(f"{SVG}text")]


#: lengths not cut to the tape: coax and rope to the inch or cm, diameters and spacings finer
#: (units.format_length's steps; issue 18)
COARSE = ("coax", "rope", "span", "far end height", "far end out", "anchor", "anchor rope", "branch",
          "halyard", "tether")
#: the overview's heights of a hung antenna's ends are coarse too; on a `tube` drawing "top" is the
#: trimming allowance, cut to the tape
COARSE_OVERVIEW = ("top", "bottom")
SIZE = ("spacing", "wire", "gap")


STOCK_NAMES = sorted((s.name for s in catalog().stock), key=len, reverse=True)


def step_of(name: str, key: str = "") -> str:
    coarse = name in COARSE or (key == "overview" and name in COARSE_OVERVIEW)
    return "coarse" if coarse else "size" if name in SIZE else "fine"


def expected_lengths(design, solution) -> dict[str, dict[str, float]]:
    """Per figure, the lengths it must print (name on the drawing -> value in m)."""
    d, c = solution.dimensions, solution.choke
    rigid = design.radiator.diameter_m >= 4e-3
    allowance = "allowance" if rigid else "wrap"
    radiator = {"radiator": d.radiator, "cut length": solution.radiator_cut_m,
                allowance: solution.wrap_allowance_m}
    if solution.first_cut.radiator_margin_m > 0:  # the radiator is cut long by its tuning margin
        radiator["tuning margin"] = solution.first_cut.radiator_margin_m
    label = design.radiator.label.lower()
    stock = catalog().stock_size(design.radiator.diameter_m, design.output.units, design.radiator.material)
    if "awg" not in label and not label.startswith("#") and not (stock and stock.kind == "rod"):
        radiator["wire"] = design.radiator.diameter_m      # a rod of a stock size is named only
    radiator = style_lengths(solution) or radiator
    overview = {"radiator": d.radiator, "stub": d.stub, "tap": d.tap,
                "height": design.site.height_m, "coax": design.feed.length_m}
    if solution.stack is not None:      # the stacked version: the upper element, phasing stub, gap
        k = solution.stack
        overview.update({"element": k.element_m, "phasing stub": k.phasing_m, "gap": k.phasing_spacing_m})
    site = site_layout(design.site.orientation, design.site.height_m, design.site.slope_rad,
                       solution.span_m, design.wavelength_m, d.stub, design.hung)
    if design.site.orientation == "inverted":       # the far end's height, as the dimension shows it
        overview["far end"] = design.site.height_m - d.stub - d.radiator
    if site is not None and site.support_height_m is not None:     # hung: branch, ropes, heights
        overview.update({"rope": site.standoff_m, "branch": site.support_height_m,
                         "halyard": site.ropes[0].length_m, "tether": site.ropes[1].length_m,
                         "top": site.top_m, "bottom": site.bottom_m})
    elif site is not None and site.orientation == "horizontal":
        overview.update({"rope": site.standoff_m, "span": site.span_m})
    elif site is not None:
        overview.update({"rope": site.standoff_m, "far end height": site.far_end_height_m,
                         "far end out": site.far_end_distance_m, "anchor": site.anchor_distance_m,
                         "anchor rope": site.ropes[1].length_m - TIE_OFF_M})
    return {
        "overview": overview,
        "radiator": radiator,
        "stub": {"stub": d.stub, "tap": d.tap, "spacing": d.spacing},
        "short-tap": {"tap": d.tap, "spacing": d.spacing},
        "choke": ({"coil": c.coil_length_m, "form": c.form_diameter_m,
                   "coax in the coil": c.turns * math.pi * c.mean_diameter_m} if solution.sleeve is None
                  else {"sleeve": solution.sleeve.length_m,
                        # diameters print in mm with inches on imperial sheets (not parsed there)
                        **({"inside": solution.sleeve.sleeve_inner_diameter_m,
                            "outside": solution.sleeve.cable_od_m}
                           if design.output.units == "metric" else {})}),
        "swr": {"coax": solution.feed_coax_m},     # the coax as cut: run, choke turns, pigtail
        "smith": {},
    }


def style_lengths(solution) -> dict | None:
    """What a construction style's drawing of its pieces prints (in the radiator figure's place):
    the cut list's pieces and the dimensions they are made of; None for `wire`."""
    d, fc = solution.dimensions, solution.first_cut
    piece = {i.part: i.length_m for i in solution.cut_list}
    if solution.parts.construction == "tube":
        top = solution.radiator_cut_m - d.radiator
        out = {"radiator": d.radiator, "stub": d.stub, "tap": d.tap, "spacing": d.spacing, "top": top,
               "long element": piece["long element"], "as cut": solution.radiator_cut_m,
               "short stub conductor": piece["short stub conductor"],
               "mounting section": piece["mounting section"]}
        through = piece["long element"] - solution.radiator_cut_m - d.stub
        if through > 0:
            out["through the bar"] = through
        out.update({k: piece[k] for k in ("short section", "short bar") if k in piece})
        return out
    if solution.parts.construction == "twin-lead":
        rad, stub = d.radiator + fc.radiator_margin_m, d.stub + fc.stub_margin_m
        line = piece["line, one piece"]
        return {"tie": solution.wrap_allowance_m, "radiator, first cut": rad, "stub, first cut": stub,
                "tail": line - solution.wrap_allowance_m - rad - stub, "line, one piece": line,
                "tap": d.tap, "radiator": d.radiator, "stub": d.stub}
    return None


_NAMED = re.compile(r"^(radiator|stub|tap|height|spacing|cut length|wrap|allowance|tuning margin|coil|form|sleeve)"
                    r" (.+)$")


def check_printed_lengths(design, solution, drawings) -> None:
    system = design.output.units
    for key, expected in expected_lengths(design, solution).items():
        # the design's title is the user's text ("70 cm rod vertical"), not a printed length
        # and a stock size's name ("6 mm rod") is a name, printed beside the diameter
        texts = [functools.reduce(lambda t, name: t.replace(name, ""), STOCK_NAMES, t)
                 for t in svg_texts(drawings[key]) if t not in design.title]
        printed = [t for text in texts for t in lengths_in(text, system)]
        steps = {name: step_of(name, key) for name in expected}
        wanted = {units.format_length(v, system, steps[n]) for n, v in expected.items()}
        assert {p for p, _, _ in printed} == wanted, f"{key}: lengths printed differ from the Solution"
        for shown, value, _ in printed:
            assert any(abs(value - v) <= HALF_STEP[system, steps[n]] + 1e-9
                       for n, v in expected.items()), (key, shown)
        named = {}
        for text in texts:
            m = _NAMED.match(text)
            if m and [p for p, _, _ in lengths_in(m[2], system)] == [m[2]]:
                named.setdefault(m[1], set()).add(m[2])
        for name, values in named.items():
            assert values == {units.format_length(expected[name], system, step_of(name, key))}, (key, name, values)
            (_, value, _), = lengths_in(next(iter(values)), system)
            assert abs(value - expected[name]) <= HALF_STEP[system, step_of(name, key)] + 1e-9, (key, name)
        required = {"overview": {"radiator", "stub", "tap", "height"},
                    "radiator": {"tube": {"radiator", "stub", "tap"}, "twin-lead": {"tap"}}.get(
                        solution.parts.construction, {"radiator", "cut length"}),
                    "stub": {"stub", "tap", "spacing"},
                    "short-tap": {"tap", "spacing"},
                    "choke": {"coil", "form"} if solution.sleeve is None else {"sleeve"}}.get(key, set())
        assert required <= set(named), f"{key}: missing {required - set(named)}"


# ---------------------------------------------------------------- layout checks

def crossings(drawing) -> list[str]:
    """Texts that a drawn line runs through, or that sit on a filled area."""
    prims = drawing.primitives()
    segments, filled = [], []
    for p in prims:
        if isinstance(p, Line):
            segments.append(((p.x1, p.y1), (p.x2, p.y2)))
        elif isinstance(p, Polyline):
            pts = list(p.points) + ([p.points[0]] if p.closed else [])
            segments += list(zip(pts, pts[1:]))
            if p.fill is not None and p.fill < 0.999:
                filled.append(p.bbox())
        elif isinstance(p, (Circle, Arc)):
            filled.append(p.bbox())
    problems = []
    for t in (p for p in prims if isinstance(p, Text)):
        b = t.bbox()
        inner = Box(b.x0 + 0.3, b.y0 + 0.3, b.x1 - 0.3, b.y1 - 0.3)
        if any(clip_segment(p, q, inner) is not None for p, q in segments):
            problems.append(f"a line runs through {t.text!r}")
        elif any(inner.overlaps(f) for f in filled):
            problems.append(f"{t.text!r} sits on a filled shape")
    return problems


def check_layout(drawings, keys=FIGURES) -> None:
    for key in keys:
        d = drawings[key]
        assert d.check_layout() == [], f"{key}: {[str(p) for p in d.check_layout()]}"
        assert d.bbox().within(Box(0, 0, d.width, d.height)), f"{key}: a shape leaves the drawing"
        if key in PARTS:
            assert crossings(d) == [], f"{key}: {crossings(d)}"


# ---------------------------------------------------------------- demo designs

@pytest.mark.parametrize("system", ["imperial", "metric"])
@pytest.mark.parametrize("path", DEMOS, ids=lambda p: p.stem)
def test_printed_lengths_are_the_solutions_in_the_chosen_units(path, system):
    design, solution, drawings = demo_figures(path, system)
    check_printed_lengths(design, solution, drawings)
    rounding = units.length_rounding(system)
    for key in PARTS:
        assert rounding in " ".join(svg_texts(drawings[key])), f"{key}: rounding not stated"


@pytest.mark.parametrize("system", ["imperial", "metric"])
@pytest.mark.parametrize("path", DEMOS, ids=lambda p: p.stem)
def test_parts_are_laid_out_without_overlaps(path, system):
    check_layout(demo_figures(path, system)[2], PARTS)


@pytest.mark.parametrize("path", DEMOS, ids=lambda p: p.stem)
def test_plots_are_laid_out_without_overlaps(path):
    check_layout(demo_figures(path, "imperial")[2], ("swr", "smith"))


@pytest.mark.parametrize("path", DEMOS, ids=lambda p: p.stem)
def test_figures_are_ordered_and_carry_the_title_strip(path):
    design, solution, drawings = demo_figures(path, "imperial")
    assert tuple(drawings) == FIGURES
    for key, d in drawings.items():
        texts = svg_texts(d)
        for field in (design.name, solution.design_id, DATE):
            assert field in texts, f"{key}: {field!r} missing from the title strip"
        title_words = " ".join(t for t in texts)
        assert all(w in title_words for w in design.title.split()), key
        assert d.width == (SMITH_WIDTH if key == "smith" else WIDTH)


def test_overview_shows_the_orientation():
    for path in DEMOS:
        design, _, drawings = demo_figures(path, "imperial")
        texts = svg_texts(drawings["overview"])
        dims = {item.text.split()[0]: item for item in drawings["overview"].items
                if isinstance(item, Dimension)}
        rad = dims["radiator"]
        if design.site.orientation == "inverted":
            assert rad.x1 == rad.x2 and rad.y2 > rad.y1          # hanging down from the open top
            assert dims["stub"].y1 < dims["stub"].y2 == rad.y1   # the stub above it, short at the top
            assert any("far end: high RF voltage" in t for t in texts)
        elif design.site.orientation == "vertical":
            assert rad.x1 == rad.x2 and rad.y2 < rad.y1          # straight up
            # what holds it: a stand-off insulator on the mast; a `tube` build's mounting section in
            # mast clamps; a `twin-lead` build hangs from its halyard, its tail tied down; a `hung`
            # wire from its top insulator
            held = {"tube": "mounting section, mast clamps", "twin-lead": "cord: the tail tied down",
                    "hung": "top insulator"}
            assert any(held.get(design.construction, "stand-off insulator") in t for t in texts)
        elif design.site.orientation == "horizontal":
            assert rad.y1 == rad.y2
            assert "end insulator" in texts
        else:
            drawn = math.atan2(rad.y1 - rad.y2, rad.x2 - rad.x1)
            assert drawn == pytest.approx(min(design.site.slope_rad, math.radians(60)), abs=1e-9)
            assert f"slope {units.format_angle(design.site.slope_rad)}" in texts


def _dims(drawing) -> dict[str, Dimension]:
    return {item.text.split()[0]: item for item in drawing.items if isinstance(item, Dimension)}


def _breaks_between(drawing, y_from: float, y_to: float) -> list[BreakMark]:
    """Break marks on vertical lines whose break lies between page y_from and y_to."""
    lo, hi = sorted((y_from, y_to))
    return [b for b in drawing.items if isinstance(b, BreakMark) and b.x1 == b.x2
            and lo < b.y1 + (b.y2 - b.y1) * b.at < hi]


@pytest.mark.parametrize("key", ["overview", "stub"])
@pytest.mark.parametrize("path", DEMOS, ids=lambda p: p.stem)
def test_tap_drawn_between_short_and_open_top(path, key):
    design, solution, drawings = demo_figures(path, "imperial")
    d = drawings[key]
    dims = _dims(d)
    tap, stub = dims["tap"], dims["stub"]
    y_short, y_tap, y_top = tap.y1, tap.y2, stub.y2
    assert stub.y1 == y_short                       # both measured from the short's centre line
    if key == "overview" and design.site.orientation == "inverted":
        assert y_short < y_tap < y_top               # drawn upside down: the short at the top
    else:
        assert y_top < y_tap < y_short               # page y grows downwards
    # the tap is marked where its dimension ends: clamp or tap point on the conductors
    assert any(isinstance(p, (Circle, Polyline)) and abs(p.bbox().center[1] - y_tap) < 0.01
               for item in d.items for p in item.primitives())
    drawn = (y_short - y_tap) / (y_short - y_top)
    true = solution.dimensions.tap / solution.dimensions.stub
    if _breaks_between(d, y_top, y_tap):
        assert not _breaks_between(d, y_tap, y_short)    # only the long span is shortened
        assert drawn > true                              # so the tap span is drawn larger
    else:
        assert drawn == pytest.approx(true, rel=1e-6)


@pytest.mark.parametrize("ratio", [0.1, 0.6, 1.2, 5.0])
def test_short_tap_detail_to_scale_or_marked(ratio):
    design, solution = solved(DEMOS[0])
    dims = dataclasses.replace(solution.dimensions, tap=ratio * solution.dimensions.spacing)
    changed = dataclasses.replace(solution, dimensions=dims)
    d = figures(design, changed, DATE)["short-tap"]
    tap, spacing = _dims(d)["tap"], _dims(d)["spacing"]
    drawn = (tap.y1 - tap.y2) / (spacing.x2 - spacing.x1)
    texts = svg_texts(d)
    lo, hi = DETAIL_SCALE_RANGE
    if lo <= ratio <= hi:
        assert drawn == pytest.approx(ratio, rel=1e-9)
        assert not _breaks_between(d, tap.y2, tap.y1)
    elif ratio > hi:
        assert _breaks_between(d, tap.y2, tap.y1) and drawn < ratio
        assert any(t.startswith("Not to scale") for t in texts)
    else:
        assert drawn > ratio and any(t.startswith("Not to scale") for t in texts)
    check_layout({"short-tap": d}, ("short-tap",))


@pytest.mark.parametrize("path", DEMOS, ids=lambda p: p.stem)
def test_swr_curve_passes_through_the_solutions_points(path):
    design, solution, drawings = demo_figures(path, "imperial")
    sw = solution.sweep
    # reference: SWR from the feed impedance through scikit-rf's S11
    s11 = skrf.network.z2s((sw.r_ohm + 1j * sw.x_ohm).reshape(-1, 1, 1),
                           z0=design.feed.impedance_ohm)[:, 0, 0]
    swr_ref = (1 + np.abs(s11)) / (1 - np.abs(s11))
    np.testing.assert_allclose(sw.swr, swr_ref, rtol=1e-9)
    ax = plots.swr_axes(sw.frequency_hz, sw.swr, sw.swr_transmitter, solution.band_hz, WIDTH,
                        SWR_HEIGHT)
    curve = [p for p in drawings["swr"].primitives() if isinstance(p, Polyline) and not p.closed
             and p.width == plots.FEED_WIDTH and p.dash is None]
    # the curve's vertices, less those the plot adds where it clips the curve at the frame's top
    drawn = [ax.from_page(x, y) for run in curve for x, y in run.points
             if ax.frame.y0 + 1e-6 < y < ax.frame.y1 - 1e-6]
    page_y = np.array([ax.y(v) for v in swr_ref])
    inside = (page_y > ax.frame.y0 + 1e-6) & (page_y < ax.frame.y1 - 1e-6)
    assert len(drawn) == int(inside.sum())
    # within the SVG's coordinate resolution (1/1000 pt) mapped back to Hz and SWR
    np.testing.assert_allclose([f for f, _ in drawn], sw.frequency_hz[inside], rtol=0,
                               atol=1e-3 * (ax.x_max - ax.x_min) / ax.frame.width)
    np.testing.assert_allclose([s for _, s in drawn], swr_ref[inside], rtol=0,
                               atol=1e-3 * (ax.y_max - ax.y_min) / ax.frame.height)


@pytest.mark.parametrize("path", DEMOS[:2], ids=lambda p: p.stem)
def test_smith_locus_is_the_feed_impedance(path):
    design, solution, drawings = demo_figures(path, "imperial")
    sw = solution.sweep
    s11 = skrf.network.z2s((sw.r_ohm + 1j * sw.x_ohm).reshape(-1, 1, 1),
                           z0=design.feed.impedance_ohm)[:, 0, 0]
    ax = plots.smith_axes(SMITH_WIDTH)
    locus = [p for p in drawings["smith"].primitives() if isinstance(p, Polyline)
             and p.width in (plots.LOCUS_WIDTH, plots.LOCUS_OUT_WIDTH)]
    gammas = np.array([ax.from_page(x, y) for run in locus for x, y in run.points])
    # neighbouring runs share their end points: every drawn point is one of S11, every S11 drawn
    nearest = np.min(np.abs(gammas[:, None] - s11[None, :]), axis=1)
    assert np.max(nearest) < 2e-3 / ax.radius * 2
    assert np.max(np.min(np.abs(s11[:, None] - gammas[None, :]), axis=1)) < 2e-3 / ax.radius * 2


def test_swr_edges_beyond_the_sweep_are_not_marked_as_crossings():
    design, solution = solved(DEMOS[0])
    sw = solution.sweep
    flat = dataclasses.replace(sw, swr=np.full_like(sw.swr, 1.2), swr_transmitter=np.full_like(sw.swr, 1.1))
    changed = dataclasses.replace(solution, sweep=flat,
                                  band_swr2_hz=(float(sw.frequency_hz[0]), float(sw.frequency_hz[-1])))
    texts = svg_texts(figures(design, changed, DATE)["swr"])
    assert not any(t.startswith("2:1 ") for t in texts)
    assert texts.count("under 2:1 to sweep end") == 2


# ---------------------------------------------------------------- SVG, PDF, determinism

class CountingCanvas(Canvas):
    """A reportlab canvas counting the drawing calls of draw_on_canvas, one per primitive."""

    def __init__(self, *args, **kw):
        super().__init__(*args, **kw)
        self.calls = {"line": 0, "path": 0, "circle": 0, "arc": 0, "text": 0}

    def line(self, *a):
        self.calls["line"] += 1
        super().line(*a)

    def drawPath(self, *a, **kw):
        self.calls["path"] += 1
        super().drawPath(*a, **kw)

    def circle(self, *a, **kw):
        self.calls["circle"] += 1
        super().circle(*a, **kw)

    def arc(self, *a, **kw):
        self.calls["arc"] += 1
        super().arc(*a, **kw)

    def _text(self):
        self.calls["text"] += 1

    def drawString(self, *a, **kw):
        self._text()
        super().drawString(*a, **kw)

    def drawCentredString(self, *a, **kw):
        self._text()
        super().drawCentredString(*a, **kw)

    def drawRightString(self, *a, **kw):
        self._text()
        super().drawRightString(*a, **kw)


@pytest.mark.parametrize("path", [DEMOS[0], DEMOS[3]], ids=lambda p: p.stem)
def test_svg_and_pdf_show_the_same_texts_and_primitives(path):
    _, _, drawings = demo_figures(path, "imperial")
    for key, d in drawings.items():
        root = ET.fromstring(render_svg(d))
        assert root.tag == f"{SVG}svg"
        w, h = (float(v) for v in root.get("viewBox").split()[2:])
        assert root.get("viewBox").split()[:2] == ["0", "0"]
        assert (w, h) == pytest.approx((d.width, d.height), abs=1e-3)
        group = root.find(f"{SVG}g")
        svg_counts = {"line": 0, "path": 0, "circle": 0, "arc": 0, "text": 0}
        kind = {"line": "line", "polyline": "path", "polygon": "path", "circle": "circle",
                "path": "arc", "text": "text"}
        for el in group:
            svg_counts[kind[el.tag.removeprefix(SVG)]] += 1
        fonts.register_fonts()
        buf = io.BytesIO()
        canvas = CountingCanvas(buf, pagesize=(d.width, d.height), invariant=1,
                                initialFontName=fonts.FONT)
        draw_on_canvas(canvas, d, 0, 0)
        canvas.showPage()
        canvas.save()
        assert canvas.calls == svg_counts, key
        assert sum(svg_counts.values()) == len(d.primitives())
        found = []
        pypdf.PdfReader(io.BytesIO(buf.getvalue())).pages[0].extract_text(
            visitor_text=lambda t, *_: found.append(t.strip()) if t.strip() else None)
        assert sorted(found) == sorted(svg_texts(d)) == sorted(t.text for t in d.texts()), key


def test_figures_are_deterministic():
    design, solution = solved(DEMOS[0])
    a = {k: render_svg(v) for k, v in figures(design, solution, DATE).items()}
    b = {k: render_svg(v) for k, v in figures(design, solution, DATE).items()}
    assert a == b
    other = {k: render_svg(v) for k, v in figures(design, solution, "2024-06-16").items()}
    assert all(a[k] != other[k] for k in a)          # the date is on every figure


# ---------------------------------------------------------------- random valid designs

BANDS = {"160 m": (1.8e6, 2.0e6), "80 m": (3.5e6, 4.0e6), "40 m": (7.0e6, 7.3e6),
         "20 m": (14.0e6, 14.35e6), "15 m": (21.0e6, 21.45e6), "10 m": (28.0e6, 29.7e6),
         "6 m": (50e6, 54e6), "2 m": (144e6, 148e6), "70 cm": (420e6, 450e6)}   # ITU region 2
LINES = ("window-450", "twinlead-300", "open-wire-600",
         "{spacing: 50 mm, conductor: 14 AWG, dielectric: air}",
         "{spacing: 25 mm, conductor: 6 mm, material: aluminium}",
         "{impedance: 400 ohm, velocity_factor: 0.91, spacing: 25 mm, conductor: 16 AWG}")
WIRES = ("14 AWG", "12 AWG", "18 AWG", "2 mm", "6 mm", "15.9 mm")
WORDS = st.text(alphabet="abcdefghijklmnopqrstuvwxyz", min_size=1, max_size=12)


@st.composite
def design_texts(draw):
    band = draw(st.sampled_from(sorted(BANDS)))
    lo, hi = BANDS[band]
    f = draw(st.floats(lo + 0.02 * (hi - lo), hi - 0.02 * (hi - lo)))
    lam = 299_792_458.0 / f
    orientation = draw(st.sampled_from(["horizontal", "sloper", "vertical"]))
    slope = draw(st.integers(5, 80))
    least = lam / 4 + 0.6
    if orientation == "sloper":
        least = max(least, lam / 2 * math.sin(math.radians(slope)) + 0.6)
    height = least + draw(st.floats(0.0, 15.0)) if orientation != "vertical" else draw(st.floats(1.0, 30.0))
    title = " ".join(draw(st.lists(WORDS, min_size=1, max_size=14)))
    name = "-".join(draw(st.lists(WORDS, min_size=1, max_size=4)))[:64].strip("-")
    lines = [
        "buildsheet: 1", f"name: {name}", f"title: {title}", f"frequency: {f / 1e6:.4f} MHz",
        f"radiator: {{wire: {draw(st.sampled_from(WIRES))}}}",
        f"stub: {{line: {draw(st.sampled_from(LINES))}}}",
        f"feed: {{coax: {draw(st.sampled_from(['RG-58', 'RG-8X', 'RG-213']))}, "
        f"length: {draw(st.integers(3, 60))} m, choke_form: {draw(st.integers(30, 160))} mm}}",
        f"site: {{orientation: {orientation}, height: {height:.2f} m"
        + (f", slope: {slope} deg" if orientation == "sloper" else "") + "}",
        f"output: {{units: {draw(st.sampled_from(['imperial', 'metric']))}}}",
    ]
    return "\n".join(lines) + "\n"


#: share of the profile's max_examples (tests/conftest.py) this test runs: a case solves and lays out
#: an antenna (about half a second), so 25 cases in the "ci" profile
SHARE = 0.25


@settings(max_examples=max(5, int(settings.default.max_examples * SHARE)), deadline=None,
          suppress_health_check=[HealthCheck.filter_too_much])
@given(design_texts())
# found by this test: a coax length of 9' 10-1/8" broken across two lines of the SWR plot's caption
@example(text="buildsheet: 1\nname: aaaaai-aaaaai-aabbbruw-aaaaaaaaaiww\ntitle: a\n"
              "frequency: 28.0340 MHz\nradiator: {wire: 14 AWG}\n"
              "stub: {line: window-450}\nfeed: {coax: RG-58, length: 3 m, choke_form: 30 mm}\n"
              "site: {orientation: horizontal, height: 3.27 m}\noutput: {units: imperial}\n")
def test_random_designs_print_the_solution_and_lay_out_cleanly(text):
    try:
        design = design_from_text(text)
        solution = solve(design)
    except DesignError:
        assume(False)               # an invalid combination (spacing too wide for the band, ...)
    drawings = figures(design, solution, DATE)
    check_printed_lengths(design, solution, drawings)
    check_layout(drawings, PARTS)


def test_shallow_sloper_radiator_label_keeps_clear_of_the_junction():
    """Found by the random-design test: on a 10 deg sloper the radiator's label was placed before
    the junction dot was drawn, and the dot then landed under it."""
    text = ("buildsheet: 1\nname: a\ntitle: a\nfrequency: 28.0340 MHz\nradiator: {wire: 14 AWG}\n"
            "stub: {line: window-450}\nfeed: {coax: RG-58, length: 3 m, choke_form: 30 mm}\n"
            "site: {orientation: sloper, height: 3.27 m, slope: 10 deg}\noutput: {units: imperial}\n")
    design = design_from_text(text)
    drawings = figures(design, solve(design), "2024-06-15")
    check_layout(drawings, PARTS)
