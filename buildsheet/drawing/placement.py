"""Label placement for the figures: owns where texts and callouts go on a drawing so that they keep
clear of each other and of the drawn lines (measured with fonts.text_width, the one text-measuring
function), and the text helpers it needs (width, wrapping, line height). It knows nothing of
antennas: drawing/figures.py draws the parts and asks it where their labels fit.
"""

from __future__ import annotations

import functools
import math

from buildsheet import fonts
from buildsheet.drawing.shapes import (TEXT_GAP, TEXT_SIZE, Arc, Box, Circle, Leader, Line, Polyline, Text,
                                       segment_meets)

LABEL = 7.5            # size of callout texts
PAD = 6.0              # clearance to the drawing's edge


# ---------------------------------------------------------------- text helpers

def line_height(size: float) -> float:
    return fonts.ascent(size) + fonts.descent(size) + 1.0


@functools.lru_cache(maxsize=4096)
def text_width(text: str, size: float = TEXT_SIZE, bold: bool = False) -> float:
    return fonts.text_width(text, size, bold)


def wrap_text(text: str, width: float, size: float, bold: bool = False) -> list[str]:
    """Words of `text` in lines no wider than `width` points (a single word wider than that stands
    alone on its line)."""
    lines: list[str] = []
    current = ""
    for word in _words(text):
        trial = f"{current} {word}" if current else word
        if current and text_width(trial, size, bold) > width:
            lines.append(current)
            current = word
        else:
            current = trial
    if current:
        lines.append(current)
    return lines


_UNITS = {"m", "mm", "cm", "km", "ft", "in", "Hz", "kHz", "MHz", "GHz", "Ω", "ohm", "W", "V", "A", "dB"}


def _words(text: str) -> list[str]:
    """The words of `text`, a quantity kept in one piece: feet with their inches (9' 10-1/8") and a
    number with its unit (3.000 m), so a line never breaks inside one."""
    words: list[str] = []
    for word in text.split():
        if words and ((words[-1].endswith("'") and word[:1].isdigit())
                      or (words[-1][-1:].isdigit() and word.rstrip(".,;:)") in _UNITS)):
            words[-1] = f"{words[-1]} {word}"
        else:
            words.append(word)
    return words


def fitted_size(text: str, width: float, size: float, bold: bool = False) -> float:
    """`size`, or smaller so that `text` fits `width` points (for words that cannot wrap)."""
    w = text_width(text, size, bold)
    return size if w <= width else size * width / w * 0.999


# ---------------------------------------------------------------- label placement

def _segments_of(p) -> list[tuple]:
    """Straight pieces of a primitive's outline (circles and arcs as polygons)."""
    if isinstance(p, Line):
        return [((p.x1, p.y1), (p.x2, p.y2))]
    if isinstance(p, Polyline):
        pts = list(p.points) + ([p.points[0]] if p.closed else [])
        return list(zip(pts, pts[1:]))
    if isinstance(p, (Circle, Arc)):
        start, extent = (0.0, 360.0) if isinstance(p, Circle) else (p.start, p.extent)
        n = 24
        pts = [(p.cx + p.r * math.cos(math.radians(start + extent * k / n)),
                p.cy - p.r * math.sin(math.radians(start + extent * k / n))) for k in range(n + 1)]
        return list(zip(pts, pts[1:]))
    return []


def _runs_along(p1, p2, q1, q2) -> bool:
    """True when segment q1-q2 runs within 1.5 points of segment p1-p2 and nearly parallel to it
    for more than 2 points (a leader drawn along a line would be lost in it)."""
    dx, dy = p2[0] - p1[0], p2[1] - p1[1]
    n = math.hypot(dx, dy)
    ex, ey = q2[0] - q1[0], q2[1] - q1[1]
    m = math.hypot(ex, ey)
    if n < 1e-9 or m < 1e-9 or abs(dx * ey - dy * ex) / (n * m) > 0.1:
        return False
    ux, uy = dx / n, dy / n
    if abs((q1[0] - p1[0]) * uy - (q1[1] - p1[1]) * ux) > 1.5:
        return False
    t = sorted(((q[0] - p1[0]) * ux + (q[1] - p1[1]) * uy) for q in (q1, q2))
    return min(t[1], n) - max(t[0], 0.0) > 2.0


def _any_overlap(box, boxes, tol: float = 0.01) -> bool:
    """True when `box` overlaps any of `boxes` by more than `tol`, as Box.overlaps (boxes as
    (x0, y0, x1, y1) tuples; in Python: a figure has a few dozen boxes, fewer than numpy's overhead
    pays for)."""
    x0, y0, x1, y1 = box
    for bx0, by0, bx1, by1 in boxes:
        if (min(bx1, x1) - max(bx0, x0) > tol) and (min(by1, y1) - max(by0, y0) > tol):
            return True
    return False


def _cross(p1, p2, q1, q2) -> bool:
    """True when segments p1-p2 and q1-q2 cross each other (touching does not count)."""
    def orient(a, b, c):
        return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
    d1, d2 = orient(q1, q2, p1), orient(q1, q2, p2)
    d3, d4 = orient(p1, p2, q1), orient(p1, p2, q2)
    return d1 * d2 < 0 and d3 * d4 < 0


#: side of the cells of the grids that index a figure's segments and boxes, points (a label's box
#: spans one to three)
_CELL = 24.0


def _tuple(box: Box) -> tuple[float, float, float, float]:
    return box.x0, box.y0, box.x1, box.y1


class _Grid:
    """Items, each with its bounding box (x0, y0, x1, y1), kept in every _CELL-point cell the box
    touches: `near(box)` gives those whose boxes meet `box` (touching counts), in the order they
    were added, from the cells `box` touches instead of from all of them."""

    def __init__(self):
        self.items: list = []
        self.boxes: list = []
        self._cells: dict = {}      # (column, row) -> indices of the items in that cell, ascending

    def add(self, box, item) -> None:
        i = len(self.items)
        self.items.append(item)
        self.boxes.append(box)
        cells = self._cells
        rows = range(math.floor(box[1] / _CELL), math.floor(box[3] / _CELL) + 1)
        for cx in range(math.floor(box[0] / _CELL), math.floor(box[2] / _CELL) + 1):
            for cy in rows:
                cells.setdefault((cx, cy), []).append(i)

    def near(self, box) -> list:
        if not self.items:
            return []
        bx0, by0, bx1, by1 = box
        cells = self._cells
        cx0, cx1 = math.floor(bx0 / _CELL), math.floor(bx1 / _CELL)
        cy0, cy1 = math.floor(by0 / _CELL), math.floor(by1 / _CELL)
        if cx0 == cx1 and cy0 == cy1:
            found = cells.get((cx0, cy0), ())       # one cell: already in order, once each
        else:
            merged: set = set()
            for cx in range(cx0, cx1 + 1):
                for cy in range(cy0, cy1 + 1):
                    merged.update(cells.get((cx, cy), ()))
            found = sorted(merged)
        boxes, items = self.boxes, self.items
        out = []
        for i in found:
            x0, y0, x1, y1 = boxes[i]
            if x0 <= bx1 and x1 >= bx0 and y0 <= by1 and y1 >= by0:
                out.append(items[i])
        return out


class Layout:
    """The items of one figure body, with what they occupy, so that callouts can be put where they
    cross nothing already drawn.

    The drawn segments, texts and filled areas are kept in grids of _CELL-point cells (_Grid), so
    that the boxes tried for a label are tested against the few things near them, not all of a
    figure's hundreds; boxes are kept as (x0, y0, x1, y1) tuples (the placement tries thousands of
    them a build)."""

    def __init__(self, width: float, height: float):
        self.items: list = []
        self.area = Box(PAD / 2, PAD / 2, width - PAD / 2, height - PAD / 2)
        self._area = _tuple(self.area)
        self._segments = _Grid()    # segments ((x, y), (x, y))
        self._texts = _Grid()       # text boxes (x0, y0, x1, y1)
        self._solids = _Grid()      # boxes of filled primitives
        self._leaders: list = []

    def add(self, *items) -> None:
        for item in items:
            self.items.append(item)
            for p in item.primitives():
                if isinstance(p, Text):
                    box = _tuple(p.bbox())
                    self._texts.add(box, box)
                    continue
                for seg in _segments_of(p):
                    (px, py), (qx, qy) = seg
                    self._segments.add((min(px, qx), min(py, qy), max(px, qx), max(py, qy)), seg)
                fill = getattr(p, "fill", None)
                if fill is not None and fill < 0.999:
                    box = _tuple(p.bbox())
                    self._solids.add(box, box)

    def _near(self, box) -> list:
        """The segments whose bounding boxes meet `box` (x0, y0, x1, y1), in the order they were
        added (a quick filter before exact tests)."""
        return self._segments.near(box)

    def free(self, box: Box, strict: bool = True) -> bool:
        """True when `box` lies in the body, overlaps no text or filled area, and (strict) no line
        passes within 1 point of it."""
        return self._free(_tuple(box), strict)

    def _free(self, box, strict: bool = True) -> bool:
        x0, y0, x1, y1 = box
        ax0, ay0, ax1, ay1 = self._area
        if not (x0 >= ax0 - 0.01 and y0 >= ay0 - 0.01 and x1 <= ax1 + 0.01 and y1 <= ay1 + 0.01):
            return False
        grown = (x0 - 1, y0 - 1, x1 + 1, y1 + 1)
        if _any_overlap(grown, self._texts.near(grown)) or _any_overlap(box, self._solids.near(box)):
            return False
        if not strict:
            return True
        gbox = Box(*grown)
        return not any(segment_meets(p, q, gbox) for p, q in self._near(grown))

    def _leader_ok(self, p, q) -> bool:
        """A leader p-q crosses no text, runs along no line and crosses no other leader."""
        reach = (min(p[0], q[0]) - 2, min(p[1], q[1]) - 2, max(p[0], q[0]) + 2, max(p[1], q[1]) + 2)
        if any(segment_meets(p, q, Box(*b)) for b in self._texts.near(reach)):
            return False
        if any(_runs_along(p, q, a, b) for a, b in self._near(reach)):
            return False
        return not any(_cross(p, q, a, b) for a, b in self._leaders)

    def _crossings(self, p, q) -> int:
        u = (q[0] - p[0], q[1] - p[1])
        n = math.hypot(*u) or 1.0
        start = (p[0] + u[0] / n * 2.5, p[1] + u[1] / n * 2.5)    # past the target's own line
        reach = (min(p[0], q[0]), min(p[1], q[1]), max(p[0], q[0]), max(p[1], q[1]))
        return sum(1 for a, b in self._near(reach) if _cross(start, q, a, b))

    def callout(self, x: float, y: float, lines, angles=(135, 225, 45, 315, 180, 0, 90, 270),
                radii=(20, 30, 42, 56, 72, 90), size: float = LABEL, end: str = "arrow") -> None:
        """Add a leader from the point (x, y) to a label of one or more lines, at the first of the
        candidate positions (radius-major; angles in degrees counter-clockwise from the right) whose
        text crosses nothing, preferring leaders that cross the fewest lines."""
        lines = [lines] if isinstance(lines, str) else list(lines)
        angles = tuple(angles) + tuple(a for a in range(0, 360, 30) if a not in angles)
        widths = [text_width(t, size) for t in lines]
        for strict in (True, False):
            best = None
            for r in radii:
                for a in angles:
                    tx = x + r * math.cos(math.radians(a))
                    ty = y - r * math.sin(math.radians(a))
                    boxes = _callout_boxes(tx, ty, tx >= x, widths, size)
                    if not all(self._free(b, strict) for b in boxes):
                        continue
                    if not self._leader_ok((x, y), (tx, ty)):
                        continue
                    n = self._crossings((x, y), (tx, ty))
                    if best is None or n < best[0]:
                        best = (n, (tx, ty))
                        if n == 0:      # none after it can cross fewer: it is the one taken
                            break
                if best is not None and best[0] == 0:
                    break
            if best is not None:
                self.add(*_callout_items(x, y, *best[1], lines, size, end))
                self._leaders.append(((x, y), best[1]))
                return
        raise ValueError(f"no room for the label {lines[0]!r} near ({x:.0f}, {y:.0f})")

    def place_group(self, candidates: list[list], what: str) -> None:
        """Add the first of the candidate groups of shapes whose box, with 4 points around it,
        crosses nothing already drawn."""
        for group in candidates:
            box = group[0].bbox()
            for item in group[1:]:
                box = box.union(item.bbox())
            if self.free(Box(box.x0 - 4, box.y0 - 4, box.x1 + 4, box.y1 + 4)):
                self.add(*group)
                return
        raise ValueError(f"no room for {what}")

    def place_text(self, candidates, lines, size: float = LABEL, bold: bool = False) -> None:
        """Add a block of left-aligned lines at the first candidate top-left corner where it
        crosses nothing."""
        lines = [lines] if isinstance(lines, str) else list(lines)
        for strict in (True, False):
            for x, y in candidates:
                block = text_block(x, y, lines, size, bold)
                if all(self.free(t.bbox(), strict) for t in block):
                    self.add(*block)
                    return
        raise ValueError(f"no room for the text {lines[0]!r}")


def _callout_boxes(tx: float, ty: float, rightward: bool, widths, size: float) -> list[tuple]:
    """The text boxes, (x0, y0, x1, y1), of _callout_items for lines of the given widths (computed
    without building the shapes, for trying many positions quickly)."""
    asc, desc = fonts.ascent(size), fonts.descent(size)
    base = ty + (asc - desc) / 2
    out = []
    for k, w in enumerate(widths):
        x0 = tx + TEXT_GAP if rightward else tx - TEXT_GAP - w
        yk = base + k * line_height(size)
        out.append((x0, yk - asc, x0 + w, yk + desc))
    return out


def _callout_items(x, y, tx, ty, lines, size, end) -> list:
    items: list = [Leader(x, y, tx, ty, lines[0], size, end)]
    rightward = tx >= x
    base = ty + (fonts.ascent(size) - fonts.descent(size)) / 2
    for k, text in enumerate(lines[1:], 1):
        yk = base + k * line_height(size)
        items.append(Text(tx + TEXT_GAP, yk, text, size) if rightward
                     else Text(tx - TEXT_GAP, yk, text, size, "end"))
    return items


def text_block(x: float, y: float, lines, size: float, bold: bool = False) -> list[Text]:
    """Left-aligned lines of text starting at x, the first line's box top at y."""
    first = y + fonts.ascent(size, bold)
    return [Text(x, first + k * line_height(size), t, size, bold=bold) for k, t in enumerate(lines)]
