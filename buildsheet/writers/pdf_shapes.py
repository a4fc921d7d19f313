"""PDF rendering of drawings: draws a shapes.Drawing's primitives on a reportlab canvas and wraps a
drawing as a platypus Flowable; it lays out no sheet (writers/pdf.py does) and writes no files.

It draws exactly what writers/svg.py draws, primitive for primitive: the drawing's y-down point grid is
mapped onto the canvas with y flipped, and texts are set in the embedded Vera measured by fonts.py.
"""

from __future__ import annotations

from reportlab.pdfgen.canvas import FILL_NON_ZERO

from buildsheet import fonts
from buildsheet.drawing.shapes import Arc, Circle, Drawing, Line, Polyline, Text
from buildsheet.writers.platypus import Flowable


class _State:
    """The stroke and fill settings last written to the canvas by draw_on_canvas, so that each is
    written only when it changes (a figure's primitives mostly share them; writing them again
    changes nothing drawn and was a fifth of the figures' drawing time)."""

    def __init__(self, canvas, scale: float):
        self.canvas = canvas
        self.scale = scale
        self.width = self.stroke = self.dash = self.fill = None     # not yet written

    def stroke_style(self, width: float, stroke: float, dash) -> None:
        canvas, scale = self.canvas, self.scale
        if width != self.width:
            canvas.setLineWidth(width * scale)
            self.width = width
        if stroke != self.stroke:
            canvas.setStrokeGray(stroke)
            self.stroke = stroke
        dash = tuple(dash) if dash else ()
        if dash != self.dash:
            canvas.setDash([d * scale for d in dash] if dash else [], 0)
            self.dash = dash

    def fill_grey(self, grey: float) -> None:
        if grey != self.fill:
            self.canvas.setFillGray(grey)
            self.fill = grey


def draw_on_canvas(canvas, drawing: Drawing, x: float, y: float, scale: float = 1.0) -> None:
    """Draw `drawing` on a reportlab `canvas` with its lower left corner at canvas point (x, y),
    scaled by `scale` (1 = drawing points are canvas points)."""
    fonts.register_fonts()

    def to_canvas(px: float, py: float) -> tuple[float, float]:
        return x + px * scale, y + (drawing.height - py) * scale

    state = _State(canvas, scale)
    canvas.saveState()
    canvas.setLineCap(0)
    canvas.setLineJoin(1)
    canvas.setMiterLimit(10)
    for p in drawing.primitives():
        if isinstance(p, Line):
            state.stroke_style(p.width, p.stroke, p.dash)
            canvas.line(*to_canvas(p.x1, p.y1), *to_canvas(p.x2, p.y2))
        elif isinstance(p, Polyline):
            path = canvas.beginPath()
            path.moveTo(*to_canvas(*p.points[0]))
            for q in p.points[1:]:
                path.lineTo(*to_canvas(*q))
            if p.closed:
                path.close()
            if p.width:
                state.stroke_style(p.width, p.stroke, p.dash)
            if p.fill is not None:
                state.fill_grey(p.fill)
            canvas.drawPath(path, stroke=1 if p.width else 0, fill=0 if p.fill is None else 1,
                            fillMode=FILL_NON_ZERO)   # SVG's default fill rule
        elif isinstance(p, Circle):
            if p.width:
                state.stroke_style(p.width, p.stroke, None)
            if p.fill is not None:
                state.fill_grey(p.fill)
            canvas.circle(*to_canvas(p.cx, p.cy), p.r * scale, stroke=1 if p.width else 0,
                          fill=0 if p.fill is None else 1)
        elif isinstance(p, Arc):
            state.stroke_style(p.width, p.stroke, p.dash)
            cx, cy = to_canvas(p.cx, p.cy)
            r = p.r * scale
            # The canvas is y-up, so our counter-clockwise-on-the-page angles carry over unchanged.
            canvas.arc(cx - r, cy - r, cx + r, cy + r, startAng=p.start, extent=p.extent)
        elif isinstance(p, Text):
            state.fill_grey(0)
            canvas.setFont(fonts.FONT_BOLD if p.bold else fonts.FONT, p.size * scale)
            draw = {"start": canvas.drawString, "middle": canvas.drawCentredString,
                    "end": canvas.drawRightString}[p.anchor]
            tx, ty = to_canvas(p.x, p.y)
            if p.rotation:
                canvas.saveState()
                canvas.translate(tx, ty)
                canvas.rotate(p.rotation)
                draw(0, 0, p.text)
                canvas.restoreState()
            else:
                draw(tx, ty, p.text)
        else:
            raise TypeError(f"not a drawing primitive: {p!r}")
    canvas.restoreState()


class DrawingFlowable(Flowable):
    """A drawing as a platypus block: drawn at its own size, or scaled down to fit `max_width` points
    (and the frame's available width) when wider. Never scaled up, so text sizes stay as laid out."""

    def __init__(self, drawing: Drawing, max_width: float):
        super().__init__()
        if max_width <= 0:
            raise ValueError(f"max_width must be > 0 points, got {max_width}")
        self.drawing = drawing
        self.max_width = max_width
        self._fit(max_width)

    def _fit(self, avail_width: float) -> None:
        self.scale = min(1.0, min(self.max_width, avail_width) / self.drawing.width)
        self.width = self.drawing.width * self.scale
        self.height = self.drawing.height * self.scale

    def wrap(self, availWidth, availHeight):
        self._fit(availWidth)
        return self.width, self.height

    def draw(self):
        draw_on_canvas(self.canv, self.drawing, 0, 0, self.scale)

    def identity(self, maxLen=None):
        return (f"drawing {self.drawing.title!r} ({self.width:.0f} x {self.height:.0f} pt "
                f"at scale {self.scale:.2f})")
