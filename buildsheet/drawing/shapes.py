"""Format-neutral drawing shapes and their boxes; knows no antenna and no output format, writes nothing.

One coordinate system for every shape: points (1/72 in), origin at the top left of the drawing,
x to the right, y DOWN (as in SVG); the PDF writer flips y.
Angles: degrees, counter-clockwise as seen on the page (the usual maths sense, although y points down).
Grey levels: 0 = black ... 1 = white.

Primitives, the only shapes the writers render: Line, Polyline, Circle, Arc, Text.
Composites, each expanding into primitives through `primitives()`: Rect, Arrowhead, Dimension,
BreakMark, Leader, Hatch. Every shape has `bbox()` (geometry only, stroke width not included; text
from the font's advance width, ascent and descent as measured by buildsheet.fonts).

Symbols: u = unit vector along a line, n = unit normal to its left as seen on the page,
v = "up" direction of a text's glyphs.
"""

from __future__ import annotations

import math
from dataclasses import field
from typing import Iterable, Union

from buildsheet import fonts
from buildsheet.valueclass import valueclass

Point = tuple[float, float]
Dash = Union[tuple[float, ...], None]

# House style (immutable constants, not a current style: every shape carries its own values).
LINE_WIDTH = 0.75       # outlines of parts
THIN = 0.35             # dimension, extension and hatch lines
TEXT_SIZE = 8.0
ARROW_LENGTH = 5.0
ARROW_HALF_WIDTH = 1.6
TEXT_GAP = 1.5          # clearance between a text's box and the line it labels
EXT_GAP = 1.5           # gap between the object and the start of an extension line
EXT_OVERSHOOT = 2.0     # extension line continues this far past the dimension line
DOT_RADIUS = 1.2

_EPS = 1e-9


@valueclass
class Box:
    """Axis-parallel rectangle x0 <= x1, y0 <= y1 (points)."""
    x0: float
    y0: float
    x1: float
    y1: float

    @staticmethod
    def around(points: Iterable[Point]) -> "Box":
        xs, ys = zip(*points)
        return Box(min(xs), min(ys), max(xs), max(ys))

    @property
    def width(self) -> float:
        return self.x1 - self.x0

    @property
    def height(self) -> float:
        return self.y1 - self.y0

    @property
    def center(self) -> Point:
        return ((self.x0 + self.x1) / 2, (self.y0 + self.y1) / 2)

    def union(self, other: "Box") -> "Box":
        return Box(min(self.x0, other.x0), min(self.y0, other.y0),
                   max(self.x1, other.x1), max(self.y1, other.y1))

    def overlaps(self, other: "Box", tol: float = 0.01) -> bool:
        """True when the two boxes share an area deeper than `tol` in both directions (touching is
        not overlapping)."""
        return (min(self.x1, other.x1) - max(self.x0, other.x0) > tol
                and min(self.y1, other.y1) - max(self.y0, other.y0) > tol)

    def within(self, other: "Box", tol: float = 0.01) -> bool:
        """True when this box lies inside `other` (allowing `tol` points of excess)."""
        return (self.x0 >= other.x0 - tol and self.y0 >= other.y0 - tol
                and self.x1 <= other.x1 + tol and self.y1 <= other.y1 + tol)


def _grey(value: float | None, what: str) -> None:
    if value is not None and not 0.0 <= value <= 1.0:
        raise ValueError(f"{what} must be a grey level 0..1, got {value}")


def _check_stroke(width: float, stroke: float, dash: Dash) -> None:
    if width < 0:
        raise ValueError(f"line width must be >= 0, got {width}")
    _grey(stroke, "stroke")
    if dash is not None and (not dash or any(d <= 0 for d in dash)):
        raise ValueError(f"dash must be a non-empty tuple of positive lengths, got {dash}")


def _unit(dx: float, dy: float) -> Point:
    length = math.hypot(dx, dy)
    if length < _EPS:
        raise ValueError("direction of zero length")
    return dx / length, dy / length


def _left_normal(u: Point) -> Point:
    """Normal pointing to the left of direction u as seen on the page (y down)."""
    return u[1], -u[0]


# ---------------------------------------------------------------- primitives

@valueclass
class Line:
    """A straight line from (x1, y1) to (x2, y2)."""
    x1: float
    y1: float
    x2: float
    y2: float
    width: float = LINE_WIDTH
    stroke: float = 0.0
    dash: Dash = None

    def __post_init__(self):
        _check_stroke(self.width, self.stroke, self.dash)

    def bbox(self) -> Box:
        return Box.around(((self.x1, self.y1), (self.x2, self.y2)))

    def primitives(self) -> tuple:
        return (self,)


@valueclass
class Polyline:
    """Open or closed chain of straight segments; a closed one may be filled (fill = grey level).
    width 0 draws no outline (a filled area only)."""
    points: tuple[Point, ...]
    closed: bool = False
    fill: float | None = None
    width: float = LINE_WIDTH
    stroke: float = 0.0
    dash: Dash = None

    def __post_init__(self):
        object.__setattr__(self, "points", tuple((float(x), float(y)) for x, y in self.points))
        if len(self.points) < 2:
            raise ValueError(f"a polyline needs at least 2 points, got {len(self.points)}")
        if self.fill is not None and not self.closed:
            raise ValueError("only a closed polyline can be filled")
        if self.fill is None and self.width == 0:
            raise ValueError("a polyline with no fill and no outline draws nothing")
        _grey(self.fill, "fill")
        _check_stroke(self.width, self.stroke, self.dash)

    def bbox(self) -> Box:
        return Box.around(self.points)

    def primitives(self) -> tuple:
        return (self,)


@valueclass
class Circle:
    """A circle of radius r about (cx, cy), stroked and/or filled."""
    cx: float
    cy: float
    r: float
    width: float = LINE_WIDTH
    stroke: float = 0.0
    fill: float | None = None

    def __post_init__(self):
        if self.r <= 0:
            raise ValueError(f"circle radius must be > 0, got {self.r}")
        if self.fill is None and self.width == 0:
            raise ValueError("a circle with no fill and no outline draws nothing")
        _grey(self.fill, "fill")
        _check_stroke(self.width, self.stroke, None)

    def bbox(self) -> Box:
        return Box(self.cx - self.r, self.cy - self.r, self.cx + self.r, self.cy + self.r)

    def primitives(self) -> tuple:
        return (self,)


@valueclass
class Arc:
    """Part of a circle from angle `start` through `extent` degrees (positive: counter-clockwise on
    the page). The point at angle a is (cx + r cos a, cy - r sin a)."""
    cx: float
    cy: float
    r: float
    start: float
    extent: float
    width: float = LINE_WIDTH
    stroke: float = 0.0
    dash: Dash = None

    def __post_init__(self):
        if self.r <= 0:
            raise ValueError(f"arc radius must be > 0, got {self.r}")
        if not 0 < abs(self.extent) < 360:
            raise ValueError(f"arc extent must be between 0 and 360 degrees, got {self.extent} "
                             "(use Circle for a full circle)")
        _check_stroke(self.width, self.stroke, self.dash)

    def point(self, angle_deg: float) -> Point:
        a = math.radians(angle_deg)
        return self.cx + self.r * math.cos(a), self.cy - self.r * math.sin(a)

    @property
    def end_points(self) -> tuple[Point, Point]:
        return self.point(self.start), self.point(self.start + self.extent)

    def bbox(self) -> Box:
        lo = min(self.start, self.start + self.extent)
        hi = max(self.start, self.start + self.extent)
        points = list(self.end_points)
        # The arc reaches the circle's extreme in a direction k*90 degrees when it sweeps over it.
        for k in range(math.ceil(lo / 90.0), math.floor(hi / 90.0) + 1):
            points.append(self.point(90.0 * k))
        return Box.around(points)

    def primitives(self) -> tuple:
        return (self,)


_ANCHORS = ("start", "middle", "end")
_ROTATIONS = (0, 90, -90)


@valueclass
class Text:
    """One line of text; (x, y) is the anchor point on the baseline. `anchor` says which part of the
    text sits at x: start, middle or end. rotation 90 reads bottom to top, -90 top to bottom."""
    x: float
    y: float
    text: str
    size: float = TEXT_SIZE
    anchor: str = "start"
    bold: bool = False
    rotation: int = 0

    def __post_init__(self):
        if not self.text or "\n" in self.text:
            raise ValueError(f"text must be one non-empty line, got {self.text!r}")
        if self.anchor not in _ANCHORS:
            raise ValueError(f"anchor must be one of {_ANCHORS}, got {self.anchor!r}")
        if self.rotation not in _ROTATIONS:
            raise ValueError(f"rotation must be one of {_ROTATIONS}, got {self.rotation!r}")
        if self.size <= 0:
            raise ValueError(f"text size must be > 0, got {self.size}")
        fonts.check_glyphs(self.text, self.bold)

    @property
    def advance(self) -> float:
        """Width of the text along its baseline (points)."""
        return fonts.text_width(self.text, self.size, self.bold)

    def corners(self) -> tuple[Point, Point, Point, Point]:
        """Corners of the text's box (advance x ascent+descent) on the page."""
        u, v = text_axes(self.rotation)
        w = self.advance
        s0 = {"start": 0.0, "middle": -w / 2, "end": -w}[self.anchor]
        t0, t1 = -fonts.descent(self.size, self.bold), fonts.ascent(self.size, self.bold)
        return tuple((self.x + u[0] * s + v[0] * t, self.y + u[1] * s + v[1] * t)
                     for s in (s0, s0 + w) for t in (t0, t1))

    def bbox(self) -> Box:
        return Box.around(self.corners())

    def primitives(self) -> tuple:
        return (self,)


def text_axes(rotation: int) -> tuple[Point, Point]:
    """(u, v) of a text rotated by `rotation` degrees: u along the baseline in reading direction,
    v toward the tops of the glyphs (page coordinates, y down)."""
    a = math.radians(rotation)
    c, s = round(math.cos(a)), round(math.sin(a))   # rotations are multiples of 90 degrees
    return (c, -s), (-s, -c)


def text_centered_at(cx: float, cy: float, text: str, size: float = TEXT_SIZE, bold: bool = False,
                     rotation: int = 0) -> Text:
    """A middle-anchored Text whose box is centred on (cx, cy)."""
    _, v = text_axes(rotation)
    half = (fonts.ascent(size, bold) - fonts.descent(size, bold)) / 2
    return Text(cx - v[0] * half, cy - v[1] * half, text, size, "middle", bold, rotation)


# ---------------------------------------------------------------- composites

def _union_bbox(shapes: Iterable) -> Box:
    boxes = [s.bbox() for s in shapes]
    box = boxes[0]
    for b in boxes[1:]:
        box = box.union(b)
    return box


class _Composite:
    """Shared bbox of composites: the union of their primitives' boxes."""

    def bbox(self) -> Box:
        return _union_bbox(self.primitives())


@valueclass
class Rect(_Composite):
    """A rectangle, top left corner (x, y), w wide and h high."""
    x: float
    y: float
    w: float
    h: float
    width: float = LINE_WIDTH
    fill: float | None = None
    dash: Dash = None

    def __post_init__(self):
        if self.w <= 0 or self.h <= 0:
            raise ValueError(f"rect size must be > 0, got {self.w} x {self.h}")

    def primitives(self) -> tuple:
        x0, y0, x1, y1 = self.x, self.y, self.x + self.w, self.y + self.h
        return (Polyline(((x0, y0), (x1, y0), (x1, y1), (x0, y1)), closed=True, fill=self.fill,
                         width=self.width, dash=self.dash),)


@valueclass
class Arrowhead(_Composite):
    """Filled triangle with its tip at (x, y), pointing along direction (dx, dy)."""
    x: float
    y: float
    dx: float
    dy: float
    length: float = ARROW_LENGTH
    half_width: float = ARROW_HALF_WIDTH

    def primitives(self) -> tuple:
        u = _unit(self.dx, self.dy)
        n = _left_normal(u)
        bx, by = self.x - u[0] * self.length, self.y - u[1] * self.length
        hw = self.half_width
        return (Polyline(((self.x, self.y), (bx + n[0] * hw, by + n[1] * hw),
                          (bx - n[0] * hw, by - n[1] * hw)), closed=True, fill=0.0, width=0),)


@valueclass
class Dimension(_Composite):
    """Dimension of the distance between (x1, y1) and (x2, y2), drawn `offset` points to the left of
    the direction 1 -> 2 (negative: to the right); for 1 -> 2 running left to right, positive is
    above. Extension lines, a dimension line with arrowheads at both ends, and `text` centred above
    the dimension line (text reads along the line's dominant direction, rotated 90 for a vertical
    one). When the span is too short for the text and the arrows, the arrows point in from outside
    and the text stands beside the line, past point 2 (`beside`="end") or point 1 ("start")."""
    x1: float
    y1: float
    x2: float
    y2: float
    text: str
    offset: float
    size: float = TEXT_SIZE
    beside: str = "end"

    def __post_init__(self):
        if self.beside not in ("start", "end"):
            raise ValueError(f"beside must be 'start' or 'end', got {self.beside!r}")
        _unit(self.x2 - self.x1, self.y2 - self.y1)

    @property
    def rotation(self) -> int:
        return 0 if abs(self.x2 - self.x1) >= abs(self.y2 - self.y1) else 90

    def line_points(self) -> tuple[Point, Point]:
        """Ends of the dimension line (where the arrow tips are)."""
        u = _unit(self.x2 - self.x1, self.y2 - self.y1)
        n = _left_normal(u)
        o = self.offset
        return ((self.x1 + n[0] * o, self.y1 + n[1] * o), (self.x2 + n[0] * o, self.y2 + n[1] * o))

    def _text_extents(self) -> tuple[float, float]:
        """Page width and height of the text's box."""
        box = Text(0.0, 0.0, self.text, self.size, "middle", False, self.rotation).bbox()
        return box.width, box.height

    def fits(self) -> bool:
        """True when text and arrows fit between the extension lines."""
        (ax, ay), (bx, by) = self.line_points()
        span = math.hypot(bx - ax, by - ay)
        u = _unit(bx - ax, by - ay)
        bw, bh = self._text_extents()
        along = bw * abs(u[0]) + bh * abs(u[1])
        return span >= along + 2 * TEXT_GAP and span >= 2 * ARROW_LENGTH + 2.0

    def primitives(self) -> tuple:
        (ax, ay), (bx, by) = self.line_points()
        u = _unit(bx - ax, by - ay)
        n = _left_normal(u)
        out: list = []
        side = 1.0 if self.offset >= 0 else -1.0
        if abs(self.offset) > EXT_GAP:
            for (px, py), (qx, qy) in (((self.x1, self.y1), (ax, ay)), ((self.x2, self.y2), (bx, by))):
                out.append(Line(px + n[0] * side * EXT_GAP, py + n[1] * side * EXT_GAP,
                                qx + n[0] * side * EXT_OVERSHOOT, qy + n[1] * side * EXT_OVERSHOOT,
                                width=THIN))
        bw, bh = self._text_extents()
        if self.fits():
            out.append(Line(ax + u[0] * ARROW_LENGTH, ay + u[1] * ARROW_LENGTH,
                            bx - u[0] * ARROW_LENGTH, by - u[1] * ARROW_LENGTH, width=THIN))
            out += [Arrowhead(ax, ay, -u[0], -u[1]).primitives()[0],
                    Arrowhead(bx, by, u[0], u[1]).primitives()[0]]
            # Move along the text's up direction v until the box clears the line by TEXT_GAP.
            _, v = text_axes(self.rotation)
            v_n = v[0] * n[0] + v[1] * n[1]
            half_n = bw / 2 * abs(n[0]) + bh / 2 * abs(n[1])
            d = (TEXT_GAP + half_n) / abs(v_n)
            cx, cy = (ax + bx) / 2 + v[0] * d, (ay + by) / 2 + v[1] * d
        else:
            tail = ARROW_LENGTH + 4.0
            out.append(Line(ax - u[0] * tail, ay - u[1] * tail, bx + u[0] * tail, by + u[1] * tail,
                            width=THIN))
            out += [Arrowhead(ax, ay, u[0], u[1]).primitives()[0],
                    Arrowhead(bx, by, -u[0], -u[1]).primitives()[0]]
            along = bw * abs(u[0]) + bh * abs(u[1])
            reach = tail + TEXT_GAP + along / 2
            if self.beside == "end":
                cx, cy = bx + u[0] * reach, by + u[1] * reach
            else:
                cx, cy = ax - u[0] * reach, ay - u[1] * reach
        out.append(text_centered_at(cx, cy, self.text, self.size, rotation=self.rotation))
        return tuple(out)

    def value_text(self) -> Text:
        """The dimension's value text as placed."""
        return self.primitives()[-1]


@valueclass
class BreakMark(_Composite):
    """Line from (x1, y1) to (x2, y2) with a zig-zag break at fraction `at` of its length: the span is
    drawn shorter than to scale."""
    x1: float
    y1: float
    x2: float
    y2: float
    at: float = 0.5
    size: float = 6.0
    width: float = LINE_WIDTH

    def __post_init__(self):
        if not 0 < self.at < 1:
            raise ValueError(f"break position must be a fraction 0..1 of the line, got {self.at}")
        if math.hypot(self.x2 - self.x1, self.y2 - self.y1) <= self.size:
            raise ValueError("line too short for a break mark")

    def primitives(self) -> tuple:
        u = _unit(self.x2 - self.x1, self.y2 - self.y1)
        n = _left_normal(u)
        cx = self.x1 + (self.x2 - self.x1) * self.at
        cy = self.y1 + (self.y2 - self.y1) * self.at
        g, h = self.size / 2, self.size
        a = (cx - u[0] * g, cy - u[1] * g)
        b = (cx + u[0] * g, cy + u[1] * g)
        zig = (a, (cx - u[0] * g / 3 + n[0] * h, cy - u[1] * g / 3 + n[1] * h),
               (cx + u[0] * g / 3 - n[0] * h, cy + u[1] * g / 3 - n[1] * h), b)
        return (Line(self.x1, self.y1, a[0], a[1], width=self.width),
                Polyline(zig, width=self.width),
                Line(b[0], b[1], self.x2, self.y2, width=self.width))


@valueclass
class Leader(_Composite):
    """Line from the point (x, y) it labels to the label point (tx, ty), with an arrowhead or a dot at
    (x, y); the text starts just past (tx, ty), on the side away from (x, y), centred on ty."""
    x: float
    y: float
    tx: float
    ty: float
    text: str
    size: float = TEXT_SIZE
    end: str = "arrow"

    def __post_init__(self):
        if self.end not in ("arrow", "dot"):
            raise ValueError(f"leader end must be 'arrow' or 'dot', got {self.end!r}")
        _unit(self.x - self.tx, self.y - self.ty)

    def primitives(self) -> tuple:
        u = _unit(self.x - self.tx, self.y - self.ty)
        if self.end == "arrow":
            mark = Arrowhead(self.x, self.y, u[0], u[1]).primitives()[0]
            sx, sy = self.x - u[0] * ARROW_LENGTH, self.y - u[1] * ARROW_LENGTH
        else:
            mark = Circle(self.x, self.y, DOT_RADIUS, width=0, fill=0.0)
            sx, sy = self.x, self.y
        rightward = self.tx >= self.x
        lx = self.tx + (TEXT_GAP if rightward else -TEXT_GAP - fonts.text_width(self.text, self.size))
        ly = self.ty + (fonts.ascent(self.size) - fonts.descent(self.size)) / 2
        return (Line(sx, sy, self.tx, self.ty, width=THIN), mark, Text(lx, ly, self.text, self.size))


@valueclass
class Hatch(_Composite):
    """Insulator fill of the rectangle (x, y, w, h): parallel lines at `angle` degrees, `spacing`
    points apart, clipped to the rectangle; or, with `grey` set, a grey area. The outline is not part
    of the hatch (draw a Rect for it)."""
    x: float
    y: float
    w: float
    h: float
    spacing: float = 2.5
    angle: float = 45.0
    grey: float | None = None

    def __post_init__(self):
        if self.w <= 0 or self.h <= 0:
            raise ValueError(f"hatch size must be > 0, got {self.w} x {self.h}")
        if self.spacing <= 0:
            raise ValueError(f"hatch spacing must be > 0, got {self.spacing}")
        _grey(self.grey, "hatch grey")

    def primitives(self) -> tuple:
        box = Box(self.x, self.y, self.x + self.w, self.y + self.h)
        if self.grey is not None:
            return (Polyline(((box.x0, box.y0), (box.x1, box.y0), (box.x1, box.y1), (box.x0, box.y1)),
                             closed=True, fill=self.grey, width=0),)
        a = math.radians(self.angle)
        d = (math.cos(a), -math.sin(a))
        m = (-d[1], d[0])
        corners = ((box.x0, box.y0), (box.x1, box.y0), (box.x1, box.y1), (box.x0, box.y1))
        offsets = [px * m[0] + py * m[1] for px, py in corners]
        reach = self.w + self.h
        out = []
        # Lines sit on a grid of the page (c = k * spacing), so adjacent hatches line up.
        for k in range(math.floor(min(offsets) / self.spacing) + 1,
                       math.ceil(max(offsets) / self.spacing)):
            c = k * self.spacing
            ox, oy = box.center
            base = c - (ox * m[0] + oy * m[1])
            p = (ox + m[0] * base - d[0] * reach, oy + m[1] * base - d[1] * reach)
            q = (ox + m[0] * base + d[0] * reach, oy + m[1] * base + d[1] * reach)
            seg = clip_segment(p, q, box)
            if seg is not None and math.dist(*seg) > 0.05:
                out.append(Line(seg[0][0], seg[0][1], seg[1][0], seg[1][1], width=THIN))
        return tuple(out)


# ---------------------------------------------------------------- geometry helpers

def _clip_range(p: Point, q: Point, box: Box) -> tuple[float, float] | None:
    """The parameters (t0, t1) of the part of segment p-q inside `box` (Liang-Barsky 1984), or None
    if none (the label placement asks this thousands of times a build: plain comparisons)."""
    dx, dy = q[0] - p[0], q[1] - p[1]
    t0, t1 = 0.0, 1.0
    for den, num in ((-dx, p[0] - box.x0), (dx, box.x1 - p[0]), (-dy, p[1] - box.y0), (dy, box.y1 - p[1])):
        if abs(den) < _EPS:
            if num < 0:
                return None
            continue
        t = num / den
        if den < 0:
            if t > t0:
                t0 = t
        elif t < t1:
            t1 = t
        if t0 > t1:
            return None
    return t0, t1


def clip_segment(p: Point, q: Point, box: Box) -> tuple[Point, Point] | None:
    """Part of segment p-q inside `box` (Liang-Barsky 1984), or None if none."""
    span = _clip_range(p, q, box)
    if span is None:
        return None
    (t0, t1), dx, dy = span, q[0] - p[0], q[1] - p[1]
    return ((p[0] + t0 * dx, p[1] + t0 * dy), (p[0] + t1 * dx, p[1] + t1 * dy))


def segment_meets(p: Point, q: Point, box: Box) -> bool:
    """Whether segment p-q has a part inside `box`: clip_segment(p, q, box) is not None, without
    building the clipped segment."""
    return _clip_range(p, q, box) is not None


def clip_polyline(points: Iterable[Point], box: Box) -> list[tuple[Point, ...]]:
    """Runs of an open polyline that lie inside `box`: points inside are kept as they are, and a point
    is added where the line crosses the box edge."""
    runs: list[list[Point]] = []
    current: list[Point] = []
    pts = list(points)
    for p, q in zip(pts, pts[1:]):
        seg = clip_segment(p, q, box)
        if seg is None:
            if current:
                runs.append(current)
                current = []
            continue
        a, b = seg
        if not current:
            current = [a]
        elif math.dist(current[-1], a) > 1e-6:
            runs.append(current)
            current = [a]
        current.append(b)
        if math.dist(b, q) > 1e-6:
            runs.append(current)
            current = []
    if current:
        runs.append(current)
    return [tuple(r) for r in runs if len(r) >= 2]


# ---------------------------------------------------------------- drawing

@valueclass
class LayoutProblem:
    """A text that overlaps another (kind "overlap") or leaves the drawing (kind "outside")."""
    kind: str
    text: Text
    other: Text | None = None

    def __str__(self) -> str:
        if self.kind == "overlap":
            return f"texts {self.text.text!r} and {self.other.text!r} overlap"
        return f"text {self.text.text!r} at ({self.text.x:.1f}, {self.text.y:.1f}) leaves the drawing"


@valueclass
class Drawing:
    """A figure: `width` x `height` points, the shapes in drawing order, a title (metadata)."""
    width: float
    height: float
    items: tuple = field(default_factory=tuple)
    title: str = ""

    def __post_init__(self):
        object.__setattr__(self, "items", tuple(self.items))
        if self.width <= 0 or self.height <= 0:
            raise ValueError(f"drawing size must be > 0, got {self.width} x {self.height}")

    def primitives(self) -> tuple:
        """Every primitive in drawing order."""
        return tuple(p for item in self.items for p in item.primitives())

    def bbox(self) -> Box | None:
        """Union of the items' boxes, or None for an empty drawing."""
        return _union_bbox(self.items) if self.items else None

    def texts(self) -> tuple[Text, ...]:
        return tuple(p for p in self.primitives() if isinstance(p, Text))

    def check_layout(self, tol: float = 0.01) -> list[LayoutProblem]:
        """Pairs of texts whose boxes overlap by more than `tol` points, and texts whose boxes leave
        the drawing's 0..width x 0..height area."""
        texts = self.texts()
        boxes = [t.bbox() for t in texts]
        frame = Box(0.0, 0.0, self.width, self.height)
        problems = [LayoutProblem("outside", t) for t, b in zip(texts, boxes)
                    if not b.within(frame, tol)]
        for i in range(len(texts)):
            for j in range(i + 1, len(texts)):
                if boxes[i].overlaps(boxes[j], tol):
                    problems.append(LayoutProblem("overlap", texts[i], texts[j]))
        return problems
