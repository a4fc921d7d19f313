"""Polar plots of a radiation pattern as drawings: the elevation cut and the azimuth cut side by side,
gain in dBi on rings 10 dB apart, the take-off angle marked; takes plain arrays (imports no
Solution, computes no physics), renders nothing.

Angles in degrees. Elevation cut: elevation e from 0 (the horizon toward the maximum, drawn to the
right) over 90 (the zenith, up) to 180 (the opposite horizon, left); in free space -90..270, a full
circle. Azimuth cut: azimuth a counter-clockwise from 0 (drawn to the right), seen from above.
Radius: linear in dB, the outer ring at `top` dBi (the maximum rounded up to a whole dB), the
centre at top - RANGE_DB; gains below that are drawn at the centre.
"""

from __future__ import annotations

import math
from typing import Sequence

import numpy as np

from buildsheet import fonts
from buildsheet.drawing.shapes import (THIN, Arc, Circle, Drawing, Line, Polyline, Text,
                                       text_centered_at)

TITLE_SIZE = 9.0
PANEL_TITLE_SIZE = 8.0
TICK_SIZE = 7.0
RANGE_DB = 30.0
RING_STEP_DB = 10.0
GRID_GREY = 0.6
CURVE_WIDTH = 1.4
MARK_DASH = (4.0, 2.0)
PAD = 2.0
LABEL_ROOM = 16.0      # between the outer ring and the panel's edge, for the angle labels


def _title(x: float, y: float, text: str, size: float) -> Text:
    return Text(x, y + fonts.ascent(size, True), text, size, bold=True)


def _radius(gain_dbi: np.ndarray, top: float, r_max: float) -> np.ndarray:
    return r_max * np.clip((np.asarray(gain_dbi, dtype=float) - (top - RANGE_DB)) / RANGE_DB, 0.0, 1.0)


def _point(cx: float, cy: float, r: float, angle_deg: float) -> tuple[float, float]:
    a = math.radians(angle_deg)
    return cx + r * math.cos(a), cy - r * math.sin(a)


def _grid(cx: float, cy: float, r_max: float, start: float, extent: float, spokes: Sequence[float],
          labels: Sequence[str]) -> list:
    """Rings (arcs over start..start+extent, or circles), spokes and angle labels outside the ring."""
    items: list = []
    n = int(RANGE_DB / RING_STEP_DB)
    for k in range(1, n + 1):
        r = r_max * k / n
        if extent >= 360:
            items.append(Circle(cx, cy, r, width=THIN, stroke=GRID_GREY))
        else:
            items.append(Arc(cx, cy, r, start, extent, width=THIN, stroke=GRID_GREY))
    for angle, label in zip(spokes, labels):
        x, y = _point(cx, cy, r_max, angle)
        items.append(Line(cx, cy, x, y, width=THIN, stroke=GRID_GREY))
        lx, ly = _point(cx, cy, r_max + LABEL_ROOM / 2, angle)
        items.append(text_centered_at(lx, ly, label, TICK_SIZE))
    return items


def _ring_labels(cx: float, cy: float, r_max: float, top: float, angle_deg: float) -> list:
    """The rings' values (dBi) along the ray at angle_deg, each just beside its ring."""
    n = int(RANGE_DB / RING_STEP_DB)
    out = []
    for k in range(1, n + 1):
        r = r_max * k / n
        value = top - RANGE_DB + k * RING_STEP_DB
        x, y = _point(cx, cy, r - 2.0 - fonts.text_width("-00 dBi", TICK_SIZE) / 2, angle_deg)
        out.append(text_centered_at(x, y, f"{value:g} dBi" if k == n else f"{value:g}", TICK_SIZE))
    return out


def _ring_labels_clear_of(cx: float, cy: float, r_max: float, top: float, points: np.ndarray,
                          candidates: Sequence[float]) -> list:
    """The ring labels along the candidate ray whose labels the curve (page points) crosses least:
    the number of curve points inside the labels' boxes (grown by 1.5 points), then the fewest
    points near the ray's labels at all."""
    def cost(angle):
        hits = 0
        for text in _ring_labels(cx, cy, r_max, top, angle):
            b = text.bbox()
            inside = ((points[:, 0] > b.x0 - 1.5) & (points[:, 0] < b.x1 + 1.5)
                      & (points[:, 1] > b.y0 - 1.5) & (points[:, 1] < b.y1 + 1.5))
            hits += int(np.count_nonzero(inside))
        return hits
    best, least = None, None
    for angle in candidates:        # the first of the least crossed, as min() takes it
        hits = cost(angle)
        if least is None or hits < least:
            best, least = angle, hits
            if hits == 0:           # none after it can be crossed less
                break
    return _ring_labels(cx, cy, r_max, top, best)


def _spoke(cx: float, cy: float, r_max: float, angle_deg: float) -> np.ndarray:
    """Points every 2 points along the marked spoke at angle_deg (for keeping labels off it)."""
    return np.array([_point(cx, cy, r, angle_deg) for r in np.arange(0.0, r_max, 2.0)])


def _curve(cx: float, cy: float, r: np.ndarray, angles: np.ndarray, closed: bool) -> Polyline:
    pts = tuple(_point(cx, cy, float(ri), float(a)) for ri, a in zip(r, angles))
    return Polyline(pts, closed=closed, width=CURVE_WIDTH)


def pattern_plot(elevation_deg: Sequence[float], elevation_gain_dbi: Sequence[float],
                 azimuth_deg: Sequence[float], azimuth_gain_dbi: Sequence[float],
                 max_gain_dbi: float, takeoff_deg: float, max_azimuth_deg: float, free_space: bool,
                 width: float, title: str) -> Drawing:
    """The elevation cut (left) and the azimuth cut at the take-off elevation (right), gains in dBi
    (see the module docstring for the angles); the take-off angle marked by a dashed spoke in the
    elevation cut and the maximum's azimuth in the azimuth cut, both named in a legend under the
    elevation cut with the maximum gain."""
    el, g_el = np.asarray(elevation_deg, dtype=float), np.asarray(elevation_gain_dbi, dtype=float)
    az, g_az = np.asarray(azimuth_deg, dtype=float), np.asarray(azimuth_gain_dbi, dtype=float)
    if el.shape != g_el.shape or az.shape != g_az.shape or el.size < 3 or az.size < 3:
        raise ValueError("each cut needs one gain per angle, at least 3 angles")
    if not (np.all(np.isfinite(g_el)) and np.all(np.isfinite(g_az)) and math.isfinite(max_gain_dbi)):
        raise ValueError("gains must be finite")
    top = math.ceil(max_gain_dbi)
    items: list = [_title(PAD, PAD, title, TITLE_SIZE)]
    y0 = PAD + fonts.ascent(TITLE_SIZE, True) + fonts.descent(TITLE_SIZE, True) + 2 * PAD
    panel_w = (width - 3 * PAD) / 2
    r_max = panel_w / 2 - LABEL_ROOM - 4.0
    head = fonts.ascent(PANEL_TITLE_SIZE, True) + fonts.descent(PANEL_TITLE_SIZE, True) + PAD
    az_label = f"{max_azimuth_deg:.0f}\u00b0"

    # elevation cut
    xl = PAD
    items.append(_title(xl, y0, f"Elevation, toward azimuth {az_label}", PANEL_TITLE_SIZE))
    cx = xl + panel_w / 2
    if free_space:
        cy = y0 + head + LABEL_ROOM + r_max
        spokes = list(range(-90, 270, 30))
        labels = [f"{(e if e <= 90 else 180 - e):g}\u00b0" for e in spokes]
        items += _grid(cx, cy, r_max, 0.0, 360.0, spokes, labels)
        bottom_el = cy + r_max + LABEL_ROOM
    else:
        cy = y0 + head + LABEL_ROOM + r_max
        spokes = list(range(0, 181, 30))
        labels = [f"{(e if e <= 90 else 180 - e):g}\u00b0" for e in spokes]
        items += _grid(cx, cy, r_max, 0.0, 180.0, spokes, labels)
        items.append(Line(cx - r_max - 6.0, cy, cx + r_max + 6.0, cy, width=0.9))
        items.append(text_centered_at(cx, cy + 5.0 + fonts.ascent(TICK_SIZE) / 2, "ground", TICK_SIZE))
        bottom_el = cy + 2 * fonts.ascent(TICK_SIZE) + 6.0
    curve = _curve(cx, cy, _radius(g_el, top, r_max), el, closed=free_space)
    rays = np.arange(-80.0, 261.0, 10.0) if free_space else np.arange(10.0, 171.0, 10.0)
    items += _ring_labels_clear_of(cx, cy, r_max, top,
                                   np.vstack([curve.points, _spoke(cx, cy, r_max, takeoff_deg)]),
                                   [float(a) for a in rays if a % 30])
    items.append(curve)
    tx, ty = _point(cx, cy, r_max, takeoff_deg)
    items.append(Line(cx, cy, tx, ty, width=0.8, dash=MARK_DASH))
    angle = "take-off angle" if not free_space else "elevation of the maximum"
    legend = [(True, f"{angle} {takeoff_deg:.0f}\u00b0 (left), azimuth of the maximum {az_label} (right)"),
              (False, f"maximum gain {max_gain_dbi:.1f} dBi")]
    line_h = fonts.ascent(TICK_SIZE) + fonts.descent(TICK_SIZE) + PAD
    y = bottom_el + PAD
    for dashed, text in legend:
        size = TICK_SIZE
        while fonts.text_width(text, size, True) > width - 30.0 and size > 5.0:
            size -= 0.5
        if dashed:
            items.append(Line(xl + 4.0, y + line_h / 2, xl + 20.0, y + line_h / 2, width=0.8, dash=MARK_DASH))
        items.append(Text(xl + 24.0, y + fonts.ascent(size), text, size, bold=True))
        y += line_h
    bottom_el = y

    # azimuth cut
    xr = 2 * PAD + panel_w
    items.append(_title(xr, y0, f"Azimuth at {takeoff_deg:.0f}\u00b0 elevation (from above)",
                        PANEL_TITLE_SIZE))
    cx2 = xr + panel_w / 2
    cy2 = y0 + head + LABEL_ROOM + r_max
    spokes2 = list(range(0, 360, 30))
    items += _grid(cx2, cy2, r_max, 0.0, 360.0, spokes2, [f"{a}\u00b0" for a in spokes2])
    curve2 = _curve(cx2, cy2, _radius(g_az, top, r_max), az, closed=True)
    items += _ring_labels_clear_of(cx2, cy2, r_max, top,
                                   np.vstack([curve2.points, _spoke(cx2, cy2, r_max, max_azimuth_deg)]),
                                   [float(a) for a in range(10, 360, 10) if a % 30])
    items.append(curve2)
    mx, my = _point(cx2, cy2, r_max, max_azimuth_deg)
    items.append(Line(cx2, cy2, mx, my, width=0.8, dash=MARK_DASH))
    height = max(bottom_el, cy2 + r_max + LABEL_ROOM) + PAD
    return Drawing(width, height, items, title)

