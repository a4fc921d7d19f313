"""SVG writer of drawings: renders the primitives of a shapes.Drawing with svgwrite (the only svgwrite
importer); it lays nothing out and writes no files (writers/files.py does).

The output is deterministic: no generated ids, floats in one fixed format, attributes in a fixed order.
The viewBox is the drawing's point grid (y down, as in shapes.py); width and height carry the
physical size in millimetres.
"""

from __future__ import annotations

import io
import math

import svgwrite

from buildsheet.drawing.shapes import Arc, Circle, Drawing, Line, Polyline, Text

# Vera first; DejaVu is derived from Vera with the same Latin metrics, so text measured with Vera fits.
FONT_FAMILY = "Bitstream Vera Sans, Vera Sans, DejaVu Sans, Verdana, sans-serif"
MM_PER_PT = 25.4 / 72.0


def fmt(value: float) -> str:
    """Fixed float format: at most 3 decimals (1/1000 pt), no trailing zeros, no negative zero."""
    text = f"{value:.3f}".rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text


def _grey(level: float) -> str:
    g = round(level * 255)
    return f"#{g:02x}{g:02x}{g:02x}"


def _stroke_attrs(width: float, stroke: float, dash) -> dict[str, str]:
    if width == 0:
        return {"stroke": "none"}
    attrs = {"stroke-width": fmt(width)}
    if stroke != 0.0:
        attrs["stroke"] = _grey(stroke)
    if dash:
        attrs["stroke-dasharray"] = " ".join(fmt(d) for d in dash)
    return attrs


def _points(points) -> list[tuple[str, str]]:
    return [(fmt(x), fmt(y)) for x, y in points]


def _element(dwg: svgwrite.Drawing, p):
    if isinstance(p, Line):
        el = dwg.line()
        attrs = {"x1": fmt(p.x1), "y1": fmt(p.y1), "x2": fmt(p.x2), "y2": fmt(p.y2),
                 **_stroke_attrs(p.width, p.stroke, p.dash)}
    elif isinstance(p, Polyline):
        # svgwrite keeps points (and path data) apart from the attributes and writes them itself.
        el = (dwg.polygon if p.closed else dwg.polyline)(points=_points(p.points))
        attrs = _stroke_attrs(p.width, p.stroke, p.dash)
        if p.fill is not None:
            attrs["fill"] = _grey(p.fill)
    elif isinstance(p, Circle):
        el = dwg.circle()
        attrs = {"cx": fmt(p.cx), "cy": fmt(p.cy), "r": fmt(p.r),
                 **_stroke_attrs(p.width, p.stroke, None)}
        if p.fill is not None:
            attrs["fill"] = _grey(p.fill)
    elif isinstance(p, Arc):
        (sx, sy), (ex, ey) = p.end_points
        large = 1 if abs(p.extent) > 180 else 0
        # SVG's positive sweep is clockwise on a y-down page; ours is counter-clockwise.
        sweep = 0 if p.extent > 0 else 1
        el = dwg.path(d=f"M{fmt(sx)},{fmt(sy)} A{fmt(p.r)},{fmt(p.r)} 0 {large} {sweep} "
                        f"{fmt(ex)},{fmt(ey)}")
        attrs = _stroke_attrs(p.width, p.stroke, p.dash)
    elif isinstance(p, Text):
        el = dwg.text(p.text)
        attrs = {"x": fmt(p.x), "y": fmt(p.y), "font-size": fmt(p.size), "stroke": "none",
                 "fill": "black"}
        if p.anchor != "start":
            attrs["text-anchor"] = p.anchor
        if p.bold:
            attrs["font-weight"] = "bold"
        if p.rotation:
            # SVG rotates clockwise on the y-down page; our rotation is counter-clockwise.
            attrs["transform"] = f"rotate({-p.rotation} {fmt(p.x)} {fmt(p.y)})"
    else:
        raise TypeError(f"not a drawing primitive: {p!r}")
    el.attribs.update(attrs)
    return el


def render_svg(drawing: Drawing, *, physical_width_mm: float | None = None) -> bytes:
    """SVG document (UTF-8 bytes) of `drawing`; printed `physical_width_mm` wide (default: true
    scale, 1 pt = 25.4/72 mm), the height in proportion."""
    width_mm = drawing.width * MM_PER_PT if physical_width_mm is None else physical_width_mm
    if not (width_mm > 0 and math.isfinite(width_mm)):
        raise ValueError(f"physical width must be a positive number of mm, got {physical_width_mm}")
    height_mm = width_mm * drawing.height / drawing.width
    dwg = svgwrite.Drawing(size=(f"{fmt(width_mm)}mm", f"{fmt(height_mm)}mm"), profile="full",
                           debug=False)
    dwg.attribs["viewBox"] = f"0 0 {fmt(drawing.width)} {fmt(drawing.height)}"
    if drawing.title:
        dwg.set_desc(title=drawing.title)
    background = dwg.rect()
    background.attribs.update({"x": "0", "y": "0", "width": fmt(drawing.width),
                               "height": fmt(drawing.height), "fill": "white"})
    dwg.add(background)
    group = dwg.g()
    group.attribs.update({"class": "shapes", "fill": "none", "stroke": "black",
                          "stroke-linecap": "butt", "stroke-linejoin": "round",
                          "stroke-miterlimit": "10", "font-family": FONT_FAMILY,
                          # Keep runs of spaces as the PDF does, so both show the same text.
                          "xml:space": "preserve"})
    for p in drawing.primitives():
        group.add(_element(dwg, p))
    dwg.add(group)
    out = io.StringIO()
    dwg.write(out, pretty=False)
    return out.getvalue().encode("utf-8")
