"""Tests of the drawing kernel (buildsheet/drawing/shapes.py) and text metrics (buildsheet/fonts.py).

References: text widths against reportlab's pdfmetrics.stringWidth on the bundled Vera TTF (the
reference library for the font); Vera's glyph coverage as listed in DESIGN.md §8 (reportlab's bundled
Bitstream Vera 1.10); arc extents against dense sampling of the circle (plain trigonometry); line
clipping against the segment's own parametric equation.
"""

import dataclasses
import math
import re

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from reportlab.pdfbase import pdfmetrics

from buildsheet import fonts
from buildsheet.drawing.shapes import (ARROW_LENGTH, EXT_GAP, EXT_OVERSHOOT, TEXT_GAP, Arc,
                                       Arrowhead, Box, BreakMark, Circle, Dimension, Drawing,
                                       Hatch, Leader, Line, Polyline, Rect, Text, clip_polyline,
                                       clip_segment, text_axes, text_centered_at)

PRIMITIVES = (Line, Polyline, Circle, Arc, Text)


# ---------------------------------------------------------------- fonts

def test_text_width_is_reportlab_string_width_on_vera():
    fonts.register_fonts()
    for text in ("1.234 m", "Stub 2-1/8\" \u03a9 \u00b1 \u00b0 \u2248 \u2264", "W"):
        assert fonts.text_width(text, 9.0) == pytest.approx(pdfmetrics.stringWidth(text, "Vera", 9.0))
        assert fonts.text_width(text, 9.0, bold=True) == pytest.approx(
            pdfmetrics.stringWidth(text, "VeraBd", 9.0))
    # Bold Vera is wider than regular for the same string (a sanity check that the two differ).
    assert fonts.text_width("radiator", 10, bold=True) > fonts.text_width("radiator", 10)


def test_fonts_registered_once_from_reportlab_search_path():
    fonts.register_fonts()
    fonts.register_fonts()
    for name in (fonts.FONT, fonts.FONT_BOLD, fonts.FONT_ITALIC):
        face = pdfmetrics.getFont(name).face
        assert face.filename.endswith((".ttf", ".TTF"))
    assert "Vera" in pdfmetrics.getFont(fonts.FONT).face.name.decode()


@pytest.mark.parametrize("ch", ["\u03a9", "\u00b1", "\u00b0", "\u2248", "\u2264"])
def test_vera_has_the_symbols_the_sheet_uses(ch):
    # DESIGN.md §8: Vera has Ω (U+03A9), ±, °, ≈, ≤.
    fonts.check_glyphs(f"50 {ch} 2", bold=False)
    fonts.check_glyphs(f"50 {ch} 2", bold=True)


@pytest.mark.parametrize("ch, code", [("\u2126", "U+2126"), ("\u215b", "U+215B"),
                                      ("\u2032", "U+2032"), ("\u2033", "U+2033"),
                                      ("\u2610", "U+2610")])
def test_missing_glyph_is_refused_and_named(ch, code):
    # DESIGN.md §8: Vera lacks U+2126 OHM SIGN, ⅛, ′, ″ and ☐.
    with pytest.raises(ValueError, match=re.escape(code)):
        fonts.check_glyphs(f"length 2{ch}")
    with pytest.raises(ValueError, match=re.escape(code)):
        Text(0, 0, f"length 2{ch}")


# ---------------------------------------------------------------- text boxes

def test_text_box_from_metrics_and_anchor():
    size = 10.0
    w = pdfmetrics.stringWidth("tap 0.412 m", "Vera", size)
    asc, desc = fonts.ascent(size), fonts.descent(size)
    assert asc > 0 and desc > 0 and asc + desc == pytest.approx(size, rel=0.05)
    start = Text(100, 50, "tap 0.412 m", size).bbox()
    assert (start.x0, start.x1) == pytest.approx((100, 100 + w))
    assert (start.y0, start.y1) == pytest.approx((50 - asc, 50 + desc))
    middle = Text(100, 50, "tap 0.412 m", size, "middle").bbox()
    assert middle.center[0] == pytest.approx(100)
    end = Text(100, 50, "tap 0.412 m", size, "end").bbox()
    assert end.x1 == pytest.approx(100)


def test_rotated_text_box():
    size = 8.0
    w = fonts.text_width("stub 4.97 m", size)
    asc, desc = fonts.ascent(size), fonts.descent(size)
    up = Text(20, 200, "stub 4.97 m", size, rotation=90).bbox()     # reads bottom to top
    assert (up.y0, up.y1) == pytest.approx((200 - w, 200))
    assert (up.x0, up.x1) == pytest.approx((20 - asc, 20 + desc))    # glyph tops face left
    down = Text(20, 200, "stub 4.97 m", size, rotation=-90).bbox()  # reads top to bottom
    assert (down.y0, down.y1) == pytest.approx((200, 200 + w))
    assert (down.x0, down.x1) == pytest.approx((20 - desc, 20 + asc))


@pytest.mark.parametrize("rotation", [0, 90, -90])
def test_text_centered_at_centres_the_box(rotation):
    t = text_centered_at(50, 60, "2:1 14.038", 7.0, rotation=rotation)
    assert t.bbox().center == pytest.approx((50, 60))
    u, v = text_axes(rotation)
    assert u[0] * v[0] + u[1] * v[1] == 0


def test_text_refuses_bad_values():
    with pytest.raises(ValueError, match="anchor"):
        Text(0, 0, "x", anchor="left")
    with pytest.raises(ValueError, match="rotation"):
        Text(0, 0, "x", rotation=45)
    with pytest.raises(ValueError, match="one non-empty line"):
        Text(0, 0, "two\nlines")


# ---------------------------------------------------------------- primitive boxes

@settings(max_examples=60, deadline=None)
@given(start=st.floats(-720, 720), extent=st.floats(1, 359) | st.floats(-359, -1),
       r=st.floats(1, 200))
def test_arc_bbox_matches_dense_sampling(start, extent, r):
    arc = Arc(10, 20, r, start, extent)
    samples = [arc.point(start + extent * k / 2000) for k in range(2001)]
    ref = Box.around(samples)
    box = arc.bbox()
    tol = r * (1 - math.cos(math.radians(abs(extent) / 2000))) + 1e-9
    assert box.x0 == pytest.approx(ref.x0, abs=tol + 1e-9)
    assert box.x1 == pytest.approx(ref.x1, abs=tol + 1e-9)
    assert box.y0 == pytest.approx(ref.y0, abs=tol + 1e-9)
    assert box.y1 == pytest.approx(ref.y1, abs=tol + 1e-9)


def test_arc_angles_are_counter_clockwise_on_the_page():
    # y points down, so a point at +90 degrees is above the centre.
    arc = Arc(0, 0, 10, 0, 90)
    assert arc.point(90) == pytest.approx((0, -10))
    assert arc.bbox() == Box(pytest.approx(0), -10, 10, pytest.approx(0))


def test_basic_boxes():
    assert Line(5, 9, 1, 3).bbox() == Box(1, 3, 5, 9)
    assert Circle(10, 10, 4).bbox() == Box(6, 6, 14, 14)
    assert Polyline(((0, 5), (3, -2), (7, 1))).bbox() == Box(0, -2, 7, 5)
    assert Rect(1, 2, 3, 4).bbox() == Box(1, 2, 4, 6)


def test_shapes_are_frozen_and_validated():
    line = Line(0, 0, 1, 1)
    with pytest.raises(dataclasses.FrozenInstanceError):
        line.x1 = 5
    with pytest.raises(ValueError, match="grey"):
        Polyline(((0, 0), (1, 1), (1, 0)), closed=True, fill=1.5)
    with pytest.raises(ValueError, match="closed"):
        Polyline(((0, 0), (1, 1)), fill=0.5)
    with pytest.raises(ValueError, match="dash"):
        Line(0, 0, 1, 1, dash=(2.0, 0.0))
    with pytest.raises(ValueError, match="Circle"):
        Arc(0, 0, 1, 0, 360)


# ---------------------------------------------------------------- composites

def _all_primitive(shape):
    prims = shape.primitives()
    assert prims and all(isinstance(p, PRIMITIVES) for p in prims)
    return prims


def test_arrowhead_tip_and_direction():
    tri = _all_primitive(Arrowhead(10, 10, 1, 0))[0]
    assert tri.closed and tri.fill == 0.0
    assert tri.points[0] == (10, 10)
    base_x = [p[0] for p in tri.points[1:]]
    assert base_x == pytest.approx([10 - ARROW_LENGTH] * 2)


def _by_type(prims, kind):
    return [p for p in prims if isinstance(p, kind)]


def test_horizontal_dimension_text_centred_above_its_line():
    dim = Dimension(40, 100, 240, 100, "1.234 m", -18)     # offset to the right of travel: below
    prims = _all_primitive(dim)
    (ax, ay), (bx, by) = dim.line_points()
    assert ay == by == pytest.approx(118)
    text = dim.value_text()
    box = text.bbox()
    assert box.center[0] == pytest.approx((ax + bx) / 2)
    assert box.y1 == pytest.approx(ay - TEXT_GAP)           # above the line, clear by the gap
    assert text.rotation == 0
    # Arrow tips at the two ends of the dimension line, pointing outward.
    tips = sorted(p.points[0] for p in _by_type(prims, Polyline))
    assert tips == [pytest.approx((40, 118)), pytest.approx((240, 118))]
    left_tri = min(_by_type(prims, Polyline), key=lambda p: p.points[0][0])
    assert all(q[0] > 40 for q in left_tri.points[1:])
    # Extension lines run from EXT_GAP off the object to EXT_OVERSHOOT past the dimension line.
    ext = [ln for ln in _by_type(prims, Line) if ln.x1 == ln.x2]
    assert sorted((ln.x1, ln.y1, ln.y2) for ln in ext) == [
        pytest.approx((40, 100 + EXT_GAP, 118 + EXT_OVERSHOOT)),
        pytest.approx((240, 100 + EXT_GAP, 118 + EXT_OVERSHOOT))]


def test_vertical_dimension_text_rotated_and_beside_its_line():
    dim = Dimension(240, 100, 240, 60, "40 mm", -16)        # upward travel, offset to the right
    (ax, ay), (bx, by) = dim.line_points()
    assert ax == bx == pytest.approx(256)
    text = dim.value_text()
    assert text.rotation == 90
    box = text.bbox()
    assert box.center[1] == pytest.approx((ay + by) / 2)
    assert box.x1 == pytest.approx(ax - TEXT_GAP)           # "above" the rotated text's baseline


def test_oblique_dimension_text_clears_its_line():
    # A sloping span (sloper radiator): text upright, straight above the line's midpoint, its box
    # clear of the dimension line by the gap measured perpendicular to the line.
    dim = Dimension(20, 200, 220, 60, "10.06 m", 12)
    (ax, ay), (bx, by) = dim.line_points()
    text = dim.value_text()
    assert text.rotation == 0
    box = text.bbox()
    mid = ((ax + bx) / 2, (ay + by) / 2)
    assert box.center[0] == pytest.approx(mid[0])
    assert box.y1 < mid[1]
    length = math.dist((ax, ay), (bx, by))
    nx, ny = (by - ay) / length, -(bx - ax) / length
    nearest = min((cx - ax) * nx + (cy - ay) * ny
                  for cx in (box.x0, box.x1) for cy in (box.y0, box.y1))
    assert nearest == pytest.approx(TEXT_GAP)


def test_short_dimension_puts_arrows_outside_and_text_beside():
    dim = Dimension(70, 60, 80, 60, "10 mm", 14)
    assert not dim.fits()
    prims = _all_primitive(dim)
    (ax, ay), (bx, by) = dim.line_points()
    tris = sorted(_by_type(prims, Polyline), key=lambda p: p.points[0][0])
    assert tris[0].points[0] == pytest.approx((ax, ay))
    assert all(q[0] < ax for q in tris[0].points[1:])      # left arrow comes in from the left
    assert all(q[0] > bx for q in tris[1].points[1:])
    box = dim.value_text().bbox()
    assert box.x0 > bx + ARROW_LENGTH                       # past point 2, clear of the arrow
    assert box.y0 < ay < box.y1                             # on the line's level
    before = Dimension(70, 60, 80, 60, "10 mm", 14, beside="start").value_text().bbox()
    assert before.x1 < ax - ARROW_LENGTH


def test_long_dimension_fits():
    assert Dimension(0, 0, 200, 0, "10.123 m", 10).fits()
    assert not Dimension(0, 0, 20, 0, "10.123 m", 10).fits()


def test_breakmark_keeps_the_ends_and_breaks_in_between():
    bm = BreakMark(20, 150, 260, 150, at=0.4, size=6)
    prims = _all_primitive(bm)
    first, zig, last = prims
    assert (first.x1, first.y1) == (20, 150) and (last.x2, last.y2) == (260, 150)
    assert zig.points[0] == pytest.approx((first.x2, first.y2))
    assert zig.points[-1] == pytest.approx((last.x1, last.y1))
    assert (first.x2 + last.x1) / 2 == pytest.approx(20 + 0.4 * 240)
    ys = [p[1] for p in zig.points]
    assert max(ys) - min(ys) == pytest.approx(12)


def test_leader_marks_the_point_and_labels_past_the_end():
    leader = Leader(140, 72, 190, 30, "hole 6 mm")
    prims = _all_primitive(leader)
    tri = _by_type(prims, Polyline)[0]
    assert tri.points[0] == (140, 72)
    box = _by_type(prims, Text)[0].bbox()
    assert box.x0 == pytest.approx(190 + TEXT_GAP)
    assert box.center[1] == pytest.approx(30)
    left = Leader(55, 80, 20, 30, "insulator", end="dot")
    dot = _by_type(left.primitives(), Circle)[0]
    assert (dot.cx, dot.cy) == (55, 80) and dot.fill == 0.0
    assert _by_type(left.primitives(), Text)[0].bbox().x1 == pytest.approx(20 - TEXT_GAP)


def test_hatch_lines_are_clipped_and_evenly_spaced():
    hatch = Hatch(40, 60, 30, 40, spacing=2.5, angle=45)
    lines = _all_primitive(hatch)
    box = Box(40, 60, 70, 100)
    assert all(Box.around(((ln.x1, ln.y1), (ln.x2, ln.y2))).within(box, 1e-9) for ln in lines)
    # Perpendicular offset of each line (all at 45 degrees): consecutive ones `spacing` apart.
    offsets = sorted((ln.x1 + ln.y1) / math.sqrt(2) for ln in lines)
    gaps = [b - a for a, b in zip(offsets, offsets[1:])]
    assert gaps == pytest.approx([2.5] * len(gaps))
    # The lines cover the rectangle: the span of offsets is the rectangle's diagonal extent.
    assert offsets[-1] - offsets[0] == pytest.approx((30 + 40) / math.sqrt(2), abs=2 * 2.5)
    grey = Hatch(0, 0, 10, 5, grey=0.8).primitives()
    assert len(grey) == 1 and grey[0].fill == 0.8 and grey[0].width == 0


# ---------------------------------------------------------------- clipping

@settings(max_examples=100, deadline=None)
@given(st.tuples(st.floats(-50, 150), st.floats(-50, 150)),
       st.tuples(st.floats(-50, 150), st.floats(-50, 150)))
def test_clip_segment_stays_on_segment_and_in_box(p, q):
    box = Box(0, 0, 100, 80)
    seg = clip_segment(p, q, box)
    both_inside = all(Box(x, y, x, y).within(box, 0) for x, y in (p, q))
    if seg is None:
        assert not both_inside
        return
    for pt in seg:
        assert Box(pt[0], pt[1], pt[0], pt[1]).within(box, 1e-6)
        # On the line through p and q: the cross product vanishes.
        cross = (q[0] - p[0]) * (pt[1] - p[1]) - (q[1] - p[1]) * (pt[0] - p[0])
        assert abs(cross) <= 1e-6 * (1 + math.dist(p, q) ** 2)
    if both_inside:
        assert seg == (pytest.approx(p), pytest.approx(q))


def test_clip_polyline_splits_where_it_leaves():
    box = Box(0, 0, 10, 10)
    runs = clip_polyline([(1, 5), (5, 15), (9, 5)], box)
    assert len(runs) == 2
    assert runs[0] == (pytest.approx((1, 5)), pytest.approx((3, 10)))
    assert runs[1] == (pytest.approx((7, 10)), pytest.approx((9, 5)))
    assert clip_polyline([(1, 1), (2, 2), (3, 1)], box) == [((1, 1), (2, 2), (3, 1))]


# ---------------------------------------------------------------- drawing and layout check

def test_drawing_bbox_and_texts():
    d = Drawing(100, 50, [Line(10, 10, 20, 40), Circle(60, 20, 5), Text(70, 30, "a"),
                          Dimension(10, 45, 90, 45, "80", 0)])
    assert [t.text for t in d.texts()] == ["a", "80"]
    box = d.bbox()
    for item in d.items:
        assert item.bbox().within(box, 0)
    assert box.x0 == 10 and box.x1 == pytest.approx(90)
    assert Drawing(10, 10).bbox() is None


def test_check_layout_finds_overlaps_and_texts_outside():
    a = Text(10, 20, "radiator 10.06 m")
    b = Text(30, 22, "stub 5.05 m")                 # starts inside a's box
    c = Text(10, 60, "tap 0.41 m")
    outside = Text(95, 40, "short")                 # runs past the right edge
    d = Drawing(100, 80, [a, b, c, outside])
    problems = d.check_layout()
    kinds = sorted((p.kind, p.text.text, p.other.text if p.other else None) for p in problems)
    assert kinds == [("outside", "short", None), ("overlap", "radiator 10.06 m", "stub 5.05 m")]
    assert "overlap" in str([str(p) for p in problems])
    assert Drawing(100, 80, [a, c]).check_layout() == []


def test_touching_text_boxes_do_not_count_as_overlap():
    a = Text(10, 20, "ab")
    b = Text(10 + a.advance, 20, "cd")
    assert Drawing(100, 40, [a, b]).check_layout() == []
    c = Text(10 + a.advance - 0.5, 20, "cd")
    assert [p.kind for p in Drawing(100, 40, [a, c]).check_layout()] == ["overlap"]


def test_segment_meets_is_clip_segment_not_none():
    """shapes.segment_meets (the placement's quick test) decides as clip_segment (Liang-Barsky 1984)
    on random segments and boxes, axis-parallel and touching ones included."""
    import random

    from buildsheet.drawing.shapes import Box, clip_segment, segment_meets

    rng = random.Random(5)
    for _ in range(20000):
        x0, y0 = rng.choice([0.0, rng.uniform(-5, 5)]), rng.uniform(-5, 5)
        box = Box(x0, y0, x0 + rng.choice([0.0, 1.0, rng.uniform(0, 4)]), y0 + rng.uniform(0, 4))
        p = (rng.choice([box.x0, box.x1, rng.uniform(-8, 8)]), rng.uniform(-8, 8))
        q = rng.choice([(p[0], rng.uniform(-8, 8)), (rng.uniform(-8, 8), p[1]),
                        (rng.uniform(-8, 8), rng.uniform(-8, 8)), p])
        assert segment_meets(p, q, box) == (clip_segment(p, q, box) is not None)
