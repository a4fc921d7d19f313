"""Data plots as drawings: SWR across the band and the Smith chart of the feed impedance; takes plain
arrays (imports no Solution, computes no physics beyond the reflection coefficient), renders nothing.

Symbols and units:
  f        frequency, Hz (tick labels in MHz, converted only when formatting)
  swr      voltage standing wave ratio, >= 1 (dimensionless)
  z        complex impedance, ohm; z_ref reference impedance of the chart, ohm
  rho      reflection coefficient (z - z_ref) / (z + z_ref), |rho| <= 1 for a passive load (Gamma in
           most texts; rho as in physics/, where gamma is the propagation constant)
  r, x     normalised resistance and reactance, z / z_ref = r + jx

Each plot exposes its axis transform (`swr_axes`, `smith_axes`) so tests and callers can map page
points back to data.
"""

from __future__ import annotations

import math
from typing import Sequence

import numpy as np

from buildsheet import fonts
from buildsheet.physics.lines import reflection
from buildsheet.drawing.shapes import (Arc, Box, Circle, Drawing, Line, Polyline, Text, clip_polyline,
                                       segment_meets, text_centered_at)
from buildsheet.valueclass import valueclass

TICK_SIZE = 7.0
TITLE_SIZE = 9.0
NOTE_SIZE = 7.0
TICK_LENGTH = 3.0
PAD = 2.0

FEED_WIDTH = 1.2              # the SWR curve at the feed point (solid)
TX_WIDTH = 0.9                # the SWR curve at the transmitter end of the coax (dashed)
TX_DASH = (4.0, 2.0)
REF_DASH = (1.0, 1.5)         # the 1.5:1 and 2:1 reference lines (dotted)
DESIGN_DASH = (5.0, 1.5, 1.0, 1.5)
GRID_GREY = 0.7
BAND_GREY = 0.9
BAND_EDGE_WIDTH = 0.6
SWR_LEVELS = (1.5, 2.0)

SMITH_GRID_GREY = 0.55
SMITH_R = (0.2, 0.5, 1.0, 2.0, 5.0)
SMITH_X = (0.2, 0.5, 1.0, 2.0, 5.0)
LOCUS_WIDTH = 1.4             # impedance locus inside the band
LOCUS_OUT_WIDTH = 0.6         # impedance locus outside the band
MARKER_RADIUS = 2.2


def _mhz(f_hz: float) -> str:
    """A frequency in MHz to 1 kHz."""
    return f"{f_hz / 1e6:.3f}"


def _as_array(values: Sequence[float], name: str) -> np.ndarray:
    a = np.asarray(values, dtype=float)
    if a.ndim != 1 or a.size < 2 or not np.all(np.isfinite(a)):
        raise ValueError(f"{name} must be a 1-D array of at least 2 finite numbers")
    return a


def _check_freq(freq_hz: Sequence[float]) -> np.ndarray:
    f = _as_array(freq_hz, "freq_hz")
    if not np.all(np.diff(f) > 0):
        raise ValueError("freq_hz must increase strictly")
    return f


def _check_band(band_hz: Sequence[float]) -> None:
    if len(band_hz) != 2 or not band_hz[0] < band_hz[1]:
        raise ValueError(f"band_hz must be (low, high) with low < high, got {band_hz}")


def _title(title: str) -> Text:
    return Text(PAD, PAD + fonts.ascent(TITLE_SIZE, True), title, TITLE_SIZE, bold=True)


@valueclass
class Axes:
    """Linear map of data (x_value, y_value) onto the page rectangle `frame` (y up on the page)."""
    frame: Box
    x_min: float
    x_max: float
    y_min: float
    y_max: float

    def x(self, value: float) -> float:
        return self.frame.x0 + (value - self.x_min) / (self.x_max - self.x_min) * self.frame.width

    def y(self, value: float) -> float:
        return self.frame.y1 - (value - self.y_min) / (self.y_max - self.y_min) * self.frame.height

    def to_page(self, x_value: float, y_value: float) -> tuple[float, float]:
        return self.x(x_value), self.y(y_value)

    def from_page(self, px: float, py: float) -> tuple[float, float]:
        return (self.x_min + (px - self.frame.x0) / self.frame.width * (self.x_max - self.x_min),
                self.y_min + (self.frame.y1 - py) / self.frame.height * (self.y_max - self.y_min))


def _nice_ticks(lo: float, hi: float, room: float, size: float) -> tuple[list[float], int]:
    """Ticks (in the unit of lo, hi) at 1, 2 or 5 x 10^k spacing, the finest whose labels stay
    apart within `room` points; returns (ticks, decimals)."""
    span = hi - lo
    exponent = math.floor(math.log10(span)) - 2
    while True:
        for mantissa in (1, 2, 5):
            step = mantissa * 10.0 ** exponent
            decimals = max(0, -exponent)
            ticks = [k * step for k in range(math.ceil(lo / step - 1e-9),
                                             math.floor(hi / step + 1e-9) + 1)]
            if len(ticks) <= 2:
                return ticks, decimals
            # one label's width is at most the widest: a spacing too narrow for it is too narrow
            if step / span * room < fonts.text_width(f"{ticks[0]:.{decimals}f}", size) + 6.0:
                continue
            widest = max(fonts.text_width(f"{t:.{decimals}f}", size) for t in ticks)
            if step / span * room >= widest + 6.0:
                return ticks, decimals
        exponent += 1


def _swr_top(f: np.ndarray, curves: Sequence[np.ndarray], band_hz: Sequence[float]) -> float:
    """Upper end of the SWR axis: 4, or 6 when either curve rises above 4 inside the band."""
    in_band = (f >= band_hz[0]) & (f <= band_hz[1])
    peak = max(float(np.max(c[in_band])) if in_band.any() else float(np.max(c)) for c in curves)
    return 4.0 if peak <= 4.0 else 6.0


_LEGEND = (("at feed point", "feed"), ("at transmitter", "tx"), ("band", "band"))
_LEGEND_SAMPLE = 14.0       # length of a legend's line sample, points
_LEGEND_SPACE = 10.0        # between legend entries, points
_AXIS_TITLE = "frequency, MHz"


def _legend_rows(frame_width: float) -> int:
    """1 when legend and axis title share the bottom row within the frame's width, else 2."""
    legend = sum(_LEGEND_SAMPLE + PAD + fonts.text_width(label, TICK_SIZE) for label, _ in _LEGEND)
    legend += _LEGEND_SPACE * len(_LEGEND)
    return 1 if legend + fonts.text_width(_AXIS_TITLE, TICK_SIZE) <= frame_width else 2


def _swr_margins(top: float, width: float) -> tuple[float, float, float, float]:
    """(left, top, right, bottom) margins of the SWR frame, in points."""
    tick_label_w = max(fonts.text_width(f"{v:.1f}", TICK_SIZE) for v in (1.0, top))
    line_h = fonts.ascent(TICK_SIZE) + fonts.descent(TICK_SIZE)
    left = PAD + line_h + PAD + tick_label_w + PAD + TICK_LENGTH
    right = PAD + max(fonts.text_width(f"{_ratio(v)}", TICK_SIZE) for v in SWR_LEVELS) + PAD
    title_h = fonts.ascent(TITLE_SIZE, True) + fonts.descent(TITLE_SIZE, True)
    upper = PAD + title_h + PAD + line_h + PAD
    rows = _legend_rows(width - left - right)
    bottom = TICK_LENGTH + PAD + line_h + rows * (PAD + line_h) + PAD
    return left, upper, right, bottom


def _ratio(level: float) -> str:
    return f"{level:g}:1"


def swr_axes(freq_hz: Sequence[float], swr_feed: Sequence[float], swr_tx: Sequence[float],
             band_hz: Sequence[float], width: float, height: float) -> Axes:
    """Axis transform of swr_plot for the same arguments: x in Hz over the sweep, y in SWR from 1 to
    4 (or 6 when a curve exceeds 4 inside the band)."""
    f = _check_freq(freq_hz)
    curves = [_as_array(swr_feed, "swr_feed"), _as_array(swr_tx, "swr_tx")]
    for c, name in zip(curves, ("swr_feed", "swr_tx")):
        if c.shape != f.shape or np.any(c < 1.0 - 1e-9):
            raise ValueError(f"{name} must hold one SWR >= 1 per frequency")
    _check_band(band_hz)
    top = _swr_top(f, curves, band_hz)
    left, upper, right, bottom = _swr_margins(top, width)
    frame = Box(left, upper, width - right, height - bottom)
    if frame.width < 100 or frame.height < 60:
        raise ValueError(f"SWR plot of {width} x {height} pt leaves too small a frame")
    return Axes(frame, float(f[0]), float(f[-1]), 1.0, top)


def swr_plot(freq_hz: Sequence[float], swr_feed: Sequence[float], swr_tx: Sequence[float],
             band_hz: Sequence[float], design_hz: float,
             swr2_edges: Sequence[float | None], width: float, height: float,
             title: str) -> Drawing:
    """SWR against frequency: at the feed point (solid) and at the transmitter (dashed), the band
    shaded between its edges, the design frequency, 1.5:1 and 2:1 lines, and the 2:1 edges
    (`swr2_edges` = (low, high) in Hz, None where the curve does not cross 2:1 on that side within
    the sweep). Curves above the axis top are clipped at the frame. All frequencies in Hz; width and
    height in points."""
    ax = swr_axes(freq_hz, swr_feed, swr_tx, band_hz, width, height)
    if len(swr2_edges) != 2:
        raise ValueError(f"swr2_edges must be (low, high), each in Hz or None, got {swr2_edges}")
    f = np.asarray(freq_hz, dtype=float)
    feed = np.asarray(swr_feed, dtype=float)
    fr = ax.frame
    line_h = fonts.ascent(TICK_SIZE) + fonts.descent(TICK_SIZE)
    items: list = []

    def in_sweep(value: float) -> bool:
        return ax.x_min <= value <= ax.x_max

    band_x0, band_x1 = (min(max(ax.x(b), fr.x0), fr.x1) for b in band_hz)
    if band_x1 - band_x0 > 0.1:
        items.append(Polyline(((band_x0, fr.y0), (band_x1, fr.y0), (band_x1, fr.y1),
                               (band_x0, fr.y1)), closed=True, fill=BAND_GREY, width=0))

    x_ticks, decimals = _nice_ticks(ax.x_min / 1e6, ax.x_max / 1e6, fr.width, TICK_SIZE)
    for t in x_ticks:
        px = ax.x(t * 1e6)
        if fr.x0 + 0.5 < px < fr.x1 - 0.5:
            items.append(Line(px, fr.y0, px, fr.y1, width=0.3, stroke=GRID_GREY))
        items.append(Line(px, fr.y1, px, fr.y1 + TICK_LENGTH, width=0.5))
        items.append(Text(px, fr.y1 + TICK_LENGTH + PAD + fonts.ascent(TICK_SIZE),
                          f"{t:.{decimals}f}", TICK_SIZE, "middle"))
    y_step = 0.5 if ax.y_max <= 4.0 else 1.0
    for k in range(int(round((ax.y_max - 1.0) / y_step)) + 1):
        level = 1.0 + k * y_step
        py = ax.y(level)
        if 0 < k < round((ax.y_max - 1.0) / y_step):
            items.append(Line(fr.x0, py, fr.x1, py, width=0.3, stroke=GRID_GREY))
        items.append(Line(fr.x0 - TICK_LENGTH, py, fr.x0, py, width=0.5))
        items.append(text_centered_at(fr.x0 - TICK_LENGTH - PAD
                                      - fonts.text_width(f"{level:.1f}", TICK_SIZE) / 2,
                                      py, f"{level:.1f}", TICK_SIZE))
    items.append(text_centered_at(PAD + line_h / 2, (fr.y0 + fr.y1) / 2, "SWR", TICK_SIZE,
                                  rotation=90))

    for level in SWR_LEVELS:
        py = ax.y(level)
        items.append(Line(fr.x0, py, fr.x1, py, width=0.5, dash=REF_DASH))
        items.append(text_centered_at(fr.x1 + PAD + fonts.text_width(_ratio(level), TICK_SIZE) / 2,
                                      py, _ratio(level), TICK_SIZE))
    for b in band_hz:
        if in_sweep(b):
            items.append(Line(ax.x(b), fr.y0, ax.x(b), fr.y1, width=BAND_EDGE_WIDTH))

    if in_sweep(design_hz):
        px = ax.x(design_hz)
        items.append(Line(px, fr.y0, px, fr.y1, width=0.6, dash=DESIGN_DASH))
        # Read upward along the line from the frame top, where the curve (low near the design
        # frequency) leaves room, and narrow enough to stay clear of the 2:1 and band-edge lines.
        label = f"design {_mhz(design_hz)}"
        top = fr.y0 + PAD + fonts.text_width(label, TICK_SIZE)
        items.append(Text(px + PAD + fonts.ascent(TICK_SIZE), top, label, TICK_SIZE, "start",
                          rotation=90))

    for curve, line_width, dash in ((swr_tx, TX_WIDTH, TX_DASH), (swr_feed, FEED_WIDTH, None)):
        points = [ax.to_page(fi, si) for fi, si in zip(f, np.asarray(curve, dtype=float))]
        for run in clip_polyline(points, fr):
            items.append(Polyline(run, width=line_width, dash=dash))

    items += _swr2_marks(ax, swr2_edges, float(np.min(feed)), width)
    items += _swr_legend(ax, height, line_h)
    items.append(_title(title))
    return Drawing(width, height, items, title)


def _swr2_marks(ax: Axes, edges: Sequence[float | None], feed_min: float, width: float) -> list:
    """Markers on the 2:1 line at the 2:1 edges, and their labels in the row above the frame."""
    fr = ax.frame
    baseline = fr.y0 - PAD - fonts.descent(TICK_SIZE)
    if feed_min >= 2.0:
        return [Text((fr.x0 + fr.x1) / 2, baseline, "SWR above 2:1 across the sweep", TICK_SIZE,
                     "middle")]
    out: list = []
    for edge, side in zip(edges, ("low", "high")):
        if edge is None or not ax.x_min <= edge <= ax.x_max:
            text = "under 2:1 to sweep end"
            if side == "low":
                out.append(Text(fr.x0, baseline, text, TICK_SIZE))
            else:
                out.append(Text(fr.x1, baseline, text, TICK_SIZE, "end"))
            continue
        px, py = ax.to_page(edge, 2.0)
        out.append(Line(px, fr.y0 - PAD, px, py, width=0.35, dash=REF_DASH))
        out.append(Circle(px, py, 1.8, width=0.7, fill=1.0))
        text = f"2:1 {_mhz(edge)}"
        w = fonts.text_width(text, TICK_SIZE)
        # Low edge label to the left of its marker, high to the right, so they never collide;
        # the low one kept clear of the SWR tick labels left of the frame's top corner.
        if side == "low":
            x = max(px - PAD, fr.x0 - TICK_LENGTH + w)
            out.append(Text(x, baseline, text, TICK_SIZE, "end"))
        else:
            x = min(px + PAD, width - PAD - w)
            out.append(Text(x, baseline, text, TICK_SIZE))
    return out


def _swr_legend(ax: Axes, height: float, line_h: float) -> list:
    """Legend (line samples) at the bottom left and the axis title at the bottom right; on two rows
    (title above, right under the tick labels) when one row is too narrow for both."""
    fr = ax.frame
    legend_cy = height - PAD - line_h / 2
    title_cy = legend_cy - (line_h + PAD if _legend_rows(fr.width) == 2 else 0.0)
    shift = (fonts.ascent(TICK_SIZE) - fonts.descent(TICK_SIZE)) / 2
    out: list = []
    x = fr.x0
    cy = legend_cy
    for label, kind in _LEGEND:
        end = x + _LEGEND_SAMPLE
        if kind == "band":
            out.append(Polyline(((x, cy - 3), (end, cy - 3), (end, cy + 3), (x, cy + 3)),
                                closed=True, fill=BAND_GREY, width=0.35))
        else:
            out.append(Line(x, cy, end, cy, width=FEED_WIDTH if kind == "feed" else TX_WIDTH,
                            dash=None if kind == "feed" else TX_DASH))
        out.append(Text(end + PAD, cy + shift, label, TICK_SIZE))
        x = end + PAD + fonts.text_width(label, TICK_SIZE) + _LEGEND_SPACE
    out.append(Text(fr.x1, title_cy + shift, _AXIS_TITLE, TICK_SIZE, "end"))
    return out


# ---------------------------------------------------------------- Smith chart

@valueclass
class SmithAxes:
    """Map of the reflection-coefficient plane onto the page: rho = 0 at (cx, cy), |rho| = 1 on
    the circle of `radius` points, Im(rho) up the page."""
    cx: float
    cy: float
    radius: float

    def to_page(self, rho: complex) -> tuple[float, float]:
        return self.cx + self.radius * rho.real, self.cy - self.radius * rho.imag

    def from_page(self, px: float, py: float) -> complex:
        return complex((px - self.cx) / self.radius, (self.cy - py) / self.radius)


def rho_of(z_ohm: complex | np.ndarray, z_ref: float) -> complex | np.ndarray:
    """Reflection coefficient rho = (z - z_ref) / (z + z_ref) (Pozar, Microwave Engineering, 4th ed.,
    eq. 2.35); z_ohm and z_ref in ohm."""
    return reflection(z_ohm, z_ref)[()]


_SMITH_LABEL_W = 22.0   # room outside the unit circle for the reactance labels, points


def _smith_layout(width: float) -> tuple[SmithAxes, float]:
    """(axes, top of the legend area) for a chart `width` points wide."""
    title_h = fonts.ascent(TITLE_SIZE, True) + fonts.descent(TITLE_SIZE, True)
    radius = (width - 2 * (_SMITH_LABEL_W + PAD)) / 2
    if radius < 60:
        raise ValueError(f"Smith chart {width} pt wide is too small")
    cy = PAD + title_h + PAD + _SMITH_LABEL_W / 2 + radius
    return SmithAxes(width / 2, cy, radius), cy + radius + _SMITH_LABEL_W / 2


def smith_axes(width: float) -> SmithAxes:
    """Axis transform of smith_chart for a chart `width` points wide."""
    return _smith_layout(width)[0]


def _x_arc(ax: SmithAxes, x: float) -> Arc:
    """Constant-reactance circle x (normalised) inside the unit circle: centre 1 + j/x, radius 1/|x|,
    from rho = 1 to its second crossing of |rho| = 1 (both circles are orthogonal, so the inside
    part is the shorter arc)."""
    centre = complex(1.0, 1.0 / x)
    crossing = complex((x * x - 1) / (x * x + 1), 2 * x / (x * x + 1))
    a_one = math.degrees(math.atan2(-centre.imag, 0.0))
    a_cross = math.degrees(math.atan2(crossing.imag - centre.imag, crossing.real - centre.real))
    extent = (a_cross - a_one + 540.0) % 360.0 - 180.0
    cx, cy = ax.to_page(centre)
    return Arc(cx, cy, ax.radius / abs(x), a_one, extent, width=0.4, stroke=SMITH_GRID_GREY)


def _smith_grid(ax: SmithAxes) -> list:
    small = 6.0
    out: list = [Line(ax.cx - ax.radius, ax.cy, ax.cx + ax.radius, ax.cy, width=0.4,
                      stroke=SMITH_GRID_GREY)]
    for r in SMITH_R:
        cx, cy = ax.to_page(complex(r / (1 + r), 0.0))
        out.append(Circle(cx, cy, ax.radius / (1 + r), width=0.4, stroke=SMITH_GRID_GREY))
        lx, _ = ax.to_page(complex((r - 1) / (r + 1), 0.0))
        out.append(Text(lx + 1.0, ax.cy - 1.5, f"{r:g}", small))
    for x in SMITH_X:
        for sign in (1.0, -1.0):
            out.append(_x_arc(ax, sign * x))
            g = complex((x * x - 1) / (x * x + 1), sign * 2 * x / (x * x + 1))
            label = ("+j" if sign > 0 else "\u2212j") + f"{x:g}"
            out.append(_outside_label(ax, g, label, small))
    out.append(Circle(ax.cx, ax.cy, ax.radius, width=0.8))
    return out


def _outside_label(ax: SmithAxes, rho_on_circle: complex, label: str, size: float) -> Text:
    """Label centred just outside the unit circle at the given point, along the radius."""
    probe = Text(0.0, 0.0, label, size, "middle").bbox()
    ux, uy = rho_on_circle.real, -rho_on_circle.imag
    reach = ax.radius + PAD + probe.width / 2 * abs(ux) + probe.height / 2 * abs(uy)
    return text_centered_at(ax.cx + ux * reach, ax.cy + uy * reach, label, size)


def _near(segments: list, box: Box) -> list:
    """The segments that may meet `box`: those whose bounding box comes within 1e-6 pt of it (one
    farther off cannot meet it; a quick filter before the exact test, as the locus has hundreds)."""
    x0, y0, x1, y1 = box.x0 - 1e-6, box.y0 - 1e-6, box.x1 + 1e-6, box.y1 + 1e-6
    return [(p, q) for p, q in segments
            if min(p[0], q[0]) <= x1 and max(p[0], q[0]) >= x0
            and min(p[1], q[1]) <= y1 and max(p[1], q[1]) >= y0]


def _covered(box: Box, segments: list, boxes: list[Box]) -> bool:
    """True when any segment crosses `box` (grown by 1 pt) or any of `boxes` overlaps it."""
    grown = Box(box.x0 - 1, box.y0 - 1, box.x1 + 1, box.y1 + 1)
    return (any(b.overlaps(grown) for b in boxes)
            or any(segment_meets(p, q, grown) for p, q in _near(segments, grown)))


def _place_label(x: float, y: float, label: str, taken: list[Box], segments: list, area: Box) -> Text:
    """Label for the marker at (x, y): the first of eight positions around it that overlaps no box
    in `taken` and stays in `area`, preferring the one crossed by the fewest `segments`."""
    probe = Text(0.0, 0.0, label, TICK_SIZE, "middle").bbox()
    best = None
    for k in range(8):
        a = math.radians(45.0 * k + 22.5)
        ux, uy = math.cos(a), -math.sin(a)
        reach = MARKER_RADIUS + PAD + probe.width / 2 * abs(ux) + probe.height / 2 * abs(uy)
        text = text_centered_at(x + ux * reach, y + uy * reach, label, TICK_SIZE)
        box = text.bbox()
        if not box.within(area) or any(box.overlaps(t) for t in taken):
            continue
        grown = Box(box.x0 - 1, box.y0 - 1, box.x1 + 1, box.y1 + 1)
        crossings = sum(1 for p, q in _near(segments, grown) if segment_meets(p, q, grown))
        if best is None or crossings < best[0]:
            best = (crossings, text)
            if crossings == 0:      # none after it can be crossed less: it is the one taken
                break
    if best is None:
        raise ValueError(f"no room for the Smith chart label {label!r}")
    return best[1]


def smith_chart(freq_hz: Sequence[float], z_ohm: Sequence[complex], z_ref: float,
                band_hz: Sequence[float], design_hz: float, width: float, title: str) -> Drawing:
    """Smith chart (normalised to z_ref ohm) of the impedance locus z_ohm(freq_hz): constant
    resistance circles and constant reactance arcs, the locus (heavy inside the band), markers at the
    band edges (open) and at the design frequency (filled) with their frequencies in MHz."""
    f = _check_freq(freq_hz)
    z = np.asarray(z_ohm, dtype=complex)
    if z.shape != f.shape or not np.all(np.isfinite(z)):
        raise ValueError("z_ohm must hold one finite impedance per frequency")
    _check_band(band_hz)
    if np.any(z.real < 0) or z_ref <= 0:
        raise ValueError("a passive load (resistance >= 0) and z_ref > 0 are required")
    ax, legend_top = _smith_layout(width)
    rho = rho_of(z, z_ref)
    items: list = _smith_grid(ax)

    pts = [ax.to_page(g) for g in rho]
    in_band = (f >= band_hz[0]) & (f <= band_hz[1])
    # Split the locus where it enters and leaves the band; neighbouring runs share their end point.
    start = 0
    for i in range(1, len(f) + 1):
        if i == len(f) or in_band[i] != in_band[start]:
            run = pts[start:min(i + 1, len(f))]
            if len(run) >= 2:
                items.append(Polyline(run, width=LOCUS_WIDTH if in_band[start] else LOCUS_OUT_WIDTH))
            start = i

    segments = list(zip(pts, pts[1:]))
    marks = [(b, False) for b in band_hz if f[0] <= b <= f[-1]]
    if f[0] <= design_hz <= f[-1]:
        marks.append((design_hz, True))
    centres = [ax.to_page(rho_of(complex(np.interp(fm, f, z.real), np.interp(fm, f, z.imag)),
                                   z_ref)) for fm, _ in marks]
    marker_boxes = [Box(mx - MARKER_RADIUS, my - MARKER_RADIUS, mx + MARKER_RADIUS,
                        my + MARKER_RADIUS) for mx, my in centres]
    # A grid label that the locus or a marker would cover is left out rather than overprinted.
    items = [t for t in items if not isinstance(t, Text)
             or not _covered(t.bbox(), segments, marker_boxes)]
    items += [Circle(mx, my, MARKER_RADIUS, width=0.8, fill=0.0 if filled else 1.0)
              for (mx, my), (_, filled) in zip(centres, marks)]
    taken = [t.bbox() for t in items if isinstance(t, Text)] + marker_boxes
    area = Box(0.0, 0.0, width, legend_top)
    for (mx, my), (fm, _) in zip(centres, marks):
        text = _place_label(mx, my, _mhz(fm), taken, segments, area)
        taken.append(text.bbox())
        items.append(text)
    items += _smith_legend(width, legend_top, z_ref)
    items.append(_title(title))
    height = legend_top + 3 * (fonts.ascent(NOTE_SIZE) + fonts.descent(NOTE_SIZE) + PAD) + PAD
    return Drawing(width, height, items, title)


def _smith_legend(width: float, top: float, z_ref: float) -> list:
    line_h = fonts.ascent(NOTE_SIZE) + fonts.descent(NOTE_SIZE)
    out: list = []
    x = PAD + 4.0
    rows = (("design", "design frequency, MHz"), ("edge", "band edges, MHz"),
            ("locus", f"impedance, heavy in the band; normalised to {z_ref:g} \u03a9"))
    for k, (kind, label) in enumerate(rows):
        cy = top + PAD + line_h / 2 + k * (line_h + PAD)
        if kind == "locus":
            out.append(Line(x - 4.0, cy, x + 4.0, cy, width=LOCUS_WIDTH))
        else:
            out.append(Circle(x, cy, MARKER_RADIUS, width=0.8, fill=0.0 if kind == "design" else 1.0))
        out.append(text_centered_at(x + 8.0 + fonts.text_width(label, NOTE_SIZE) / 2, cy, label,
                                    NOTE_SIZE))
    return out
