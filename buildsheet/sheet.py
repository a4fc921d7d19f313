"""The build sheet's content (DESIGN.md §8): owns turning a Design and its Solution into ordered blocks
of formatted strings and tables: every rounding, unit and word of the sheet, the longer texts rendered
from templates/. It lays out nothing, draws nothing and writes no files (writers/pdf.py sets the
blocks, drawing/figures.py draws the figures the blocks name).

Strings inside blocks are paragraph markup (the XML-like markup reportlab's Paragraph reads): design
strings are data, escaped here or by the templates' autoescape, and never used as template source.
The page furniture (title block, footer) is plain text, drawn as it is.

Templates are jinja2 with StrictUndefined and autoescape, read from the installed package's
buildsheet/templates (pyproject maps the checkout's top-level templates/ there) or, in a source
checkout, from templates/; each one's Python code, as jinja2 compiles it, is stored in
buildsheet/compiled_templates/ (write_compiled_templates) and used where it was made from the very
same source by the same jinja2 version (compiling the templates was 25 ms of every build); any other
template is compiled as before. A template renders a small block syntax, blocks separated by blank lines:

    ## text            a subheading
    1. text            numbered steps (one per line; indented lines continue the step)
    | a | b |          a table, one row per line, the first row the header
    ! text             a caution paragraph
    text               a paragraph (its lines joined)
"""

from __future__ import annotations

import hashlib
import importlib
import math
import re
from pathlib import Path

import jinja2
import numpy as np
from markupsafe import escape

from buildsheet import units
from buildsheet.blocks import (Facts, Figures, Heading, KeyFigure, KeyFigures, Para, Section, Sheet,  # noqa: F401
                               Steps, Table, WriteIn)
from buildsheet.catalog import national_bands
from buildsheet.design import Design, latest_as_built
from buildsheet.layout import describe
from buildsheet.physics.coax import matched_loss_db
from buildsheet.physics.lines import DB_PER_NEPER
from buildsheet.solver import Solution, coax_line_model, velocity_factor_text
from buildsheet.stock import conductor_name, conductor_size

#: the measurement log's columns: what the builder writes by hand
LOG_COLUMNS = ("#", "frequency", "SWR", "R (Ω)", "X (Ω)", "what was changed")
#: smallest move worth making, m: what a tape in the sheet's units resolves (1/8 in; 2 mm)
MIN_MOVE_M = {"imperial": 0.0254 / 8, "metric": 0.002}
#: where a construction style's radiator ends at the stub (DESIGN.md §5's junction), as the summary
#: names it
JUNCTION = {"tube": "the stub's open top, on the long element", "twin-lead": "the gap in the other conductor"}
#: the trimming steps the tuning procedure may quote the dip's shift for (`tube`, `twin-lead`), m,
#: largest first: the largest within 1 % of the radiator (trim_step_m)
TRIM_STEPS_M = {"imperial": (0.0254 / 4, 0.0254 / 8), "metric": (0.01, 0.005, 0.002)}


def trim_step_m(radiator_m: float, system: str) -> float:
    """The trimming step the tuning procedure quotes: the largest of TRIM_STEPS_M within 1 % of the
    radiator (a cut a builder makes in one go), else the smallest."""
    steps = TRIM_STEPS_M[system]
    return next((x for x in steps if x <= 0.01 * radiator_m), steps[-1])
#: SWR at the design frequency at which tuning may stop (common practice)
STOP_SWR = 1.3
#: the impedance error the tuning table starts from, ohm (see _error_step)
IMPEDANCE_STEP_OHM = 10.0
#: a tuning move longer than this share of the length it changes (tap distance, radiator) is too far
#: for the model's slope to hold; the table then quotes a smaller error
LINEAR_FRACTION = 0.3
#: the resonance error the tuning table starts from, as a fraction of the design frequency
FREQUENCY_STEP = 0.007
#: the short is offered as a dip control where, within its linear range, it corrects at least this
#: share of the dip error the radiator's row is written for
SHORT_DIP_FRACTION = 0.2
#: the short's move for the dip, as a fraction of the tap distance, within which the dip's shift
#: stays near linear (moving the short also shortens the tap distance, which spoils the match
#: faster than it moves the dip: the model's finite moves depart from the rate by 40 % at 0.2 of the
#: tap distance on the 6 m demo, under 15 % at 0.1)
SHORT_DIP_LINEAR_FRACTION = 0.1
#: a move larger than this share of the stub means something other than the dimensions is wrong
BIG_MOVE_FRACTION = 0.1
#: most frequencies in the table of the SWR to expect at the station end of the feed coax
STATION_POINTS = 5
#: blank rows in the as-built record when there are no entries, for writing by hand
BLANK_RECORD_ROWS = 3

JACKET_NAMES = {"pvc": "PVC"}
MODE_NAMES = {"ssb": "SSB", "cw": "CW", "fm": "FM", "digital": "digital modes"}
STANDARD_NAMES = {"us-fcc": "47 CFR 1.1310", "icnirp-2020": "ICNIRP 2020"}
#: the exposure categories in each standard's own words: (controlled, general)
CATEGORY_NAMES = {"us-fcc": ("occupational/controlled", "general population/uncontrolled"),
                  "icnirp-2020": ("occupational", "general public")}


# ----------------------------------------------------------------------------------------------
# Templates

def dip_tolerance_hz(s: Solution) -> float:
    """How far the dip may stay from the design frequency once the match is made before the
    radiator is trimmed (the tuning procedure's rule, also `fit`'s): a tenth of the predicted 2:1 SWR
    bandwidth, or 0.2 % of the frequency when there is none; rounded to 1-2-5."""
    swr2 = s.band_swr2_hz
    return _nice(0.1 * (swr2[1] - swr2[0])) if swr2 else _nice(0.002 * s.frequency_hz)


def dip_rule(s: Solution, u: str) -> tuple[float, bool]:
    """(df, short_moves_dip): the dip error (Hz) the tuning table's dip rows are written for, and
    whether the short is offered as a dip control beside the radiator: one dip error for both moves,
    each within its part's linear range; where the short cannot move the dip far without spoiling
    the match (it also shortens the tap distance), the radiator alone. Used by the sheet and by
    `fit`'s SWR-only advice."""
    sens, dims, f0 = s.sensitivity, s.dimensions, s.frequency_hz
    least = MIN_MOVE_M[u]
    df = _error_step(_nice(FREQUENCY_STEP * f0), sens["dip_hz_per_m_radiator"],
                     LINEAR_FRACTION * dims.radiator, least)
    df_short = _error_step(_nice(FREQUENCY_STEP * f0), sens["dip_hz_per_m_short"],
                           SHORT_DIP_LINEAR_FRACTION * dims.tap, least)
    # a `tube` build's short is soldered or bolted: never a tuning move
    short_moves_dip = df_short >= SHORT_DIP_FRACTION * df and s.parts.construction != "tube"
    return (min(df, df_short) if short_moves_dip else df), short_moves_dip


def station_matched_loss_db(d: Design, s: Solution) -> float:
    """The matched loss of the design's feed coax at the design frequency, dB (as the solver takes it:
    solver.coax_line_model over the coax as cut, Solution.feed_coax_m)."""
    coax = coax_line_model(d)
    return float(matched_loss_db(coax.gamma(d.frequency_hz).real * DB_PER_NEPER, s.feed_coax_m))


def station_swr(swr_tap: float, matched_db: float) -> float:
    """The SWR at the station end of a coax of matched loss `matched_db` whose far end sees
    `swr_tap`: the reflected wave is attenuated on the way up and on the way back, so
    |rho_station| = |rho_tap| x 10^(-A/10) (A in dB, power; the amplitude falls 10^(-A/20) each way)."""
    rho = (swr_tap - 1.0) / (swr_tap + 1.0) * 10 ** (-matched_db / 10)
    return (1.0 + rho) / (1.0 - rho)


def _template_text(name: str) -> str:
    """A template's source: from the installed package's templates, else the checkout's templates/
    (files on disk read as files: importlib.resources costs a build 2-3 ms to import; it reads a
    package installed in a zip archive)."""
    here = Path(__file__).resolve().parent
    for path in (here / "templates" / name, here.parent / "templates" / name):
        if path.is_file():
            return path.read_text(encoding="utf-8")
    import importlib.resources

    return (importlib.resources.files("buildsheet") / "templates" / name).read_text(encoding="utf-8")


#: the package of the stored compiled templates (write_compiled_templates)
COMPILED = "buildsheet.compiled_templates"


def _module_name(template: str) -> str:
    """The stored module of a template: 'card-cautions.j2' -> 't_card_cautions'."""
    return "t_" + template.removesuffix(".j2").replace("-", "_").replace(".", "_")


def _source_hash(source: str) -> str:
    return hashlib.sha256(source.encode("utf-8")).hexdigest()


class _Loader(jinja2.BaseLoader):
    """The templates' sources (_template_text); a template whose stored compiled module was made
    from this very source by this jinja2 version is taken from it (as jinja2's ModuleLoader does),
    any other is compiled from its source."""

    def get_source(self, environment, template):
        return _template_text(template), None, None

    def load(self, environment, name, globals=None):
        source = _template_text(name)
        stored = importlib.import_module(COMPILED)
        if stored.JINJA2 != jinja2.__version__ or stored.SOURCES.get(name) != _source_hash(source):
            return super().load(environment, name, globals)
        module = importlib.import_module(f"{COMPILED}.{_module_name(name)}")
        return environment.template_class.from_module_dict(environment, module.__dict__,
                                                           globals if globals is not None else {})


_ENV = jinja2.Environment(loader=_Loader(), autoescape=True, undefined=jinja2.StrictUndefined)


def write_compiled_templates(folder: Path | None = None) -> None:
    """Write buildsheet/compiled_templates/ (or `folder`): one module per template of the checkout's
    templates/, its Python code as jinja2 compiles it for _ENV (jinja2's own ModuleLoader form), and
    __init__.py naming the jinja2 version and each source's SHA-256. Run after editing a template:
    `python -c "from buildsheet.sheet import write_compiled_templates; write_compiled_templates()"`
    (tests/test_compiled_templates.py fails until then)."""
    folder = Path(__file__).resolve().parent / "compiled_templates" if folder is None else Path(folder)
    folder.mkdir(exist_ok=True)
    for old in folder.glob("t_*.py"):
        old.unlink()
    sources = {}
    for path in sorted((Path(__file__).resolve().parent.parent / "templates").glob("*.j2")):
        source = _template_text(path.name)
        sources[path.name] = _source_hash(source)
        code = _ENV.compile(source, path.name, None, raw=True, defer_init=True)
        (folder / f"{_module_name(path.name)}.py").write_text(
            f"# {path.name} compiled by jinja2 {jinja2.__version__}: written by "
            "sheet.write_compiled_templates(), do not edit\n" + code + "\n", encoding="utf-8")
    lines = ['"""The templates of templates/ compiled by jinja2 (sheet.write_compiled_templates(); do not',
             'edit): used only for a template whose source has the SHA-256 given here, by this jinja2."""',
             "", f"JINJA2 = {jinja2.__version__!r}", "SOURCES = {"]
    lines += [f"    {name!r}: {digest!r}," for name, digest in sources.items()]
    lines.append("}")
    (folder / "__init__.py").write_text("\n".join(lines) + "\n", encoding="utf-8")

_STEP = re.compile(r"\d+\.\s+(.*)")


def render_blocks(template: str, **values) -> tuple:
    """Render a template (the block syntax of the module docstring) into blocks."""
    text = _ENV.get_template(template).render(**values)
    blocks: list = []
    for chunk in re.split(r"\n\s*\n", text.strip()):
        lines = chunk.split("\n")
        first = lines[0]
        if first.startswith("## "):
            blocks.append(Heading(" ".join(line.strip() for line in lines)[3:]))
        elif first.startswith("| "):
            rows = tuple(tuple(cell.strip() for cell in line.strip().strip("|").split(" | "))
                         for line in lines)
            n = len(rows[0])
            blocks.append(Table(header=rows[0], rows=rows[1:], widths=(1.0,) * n, align=("left",) * n))
        elif _STEP.match(first):
            items: list[str] = []
            for line in lines:
                step = _STEP.match(line)
                if step:
                    items.append(step.group(1))
                else:
                    items[-1] += " " + line.strip()
            blocks.append(Steps(tuple(items)))
        elif first.startswith("! "):
            blocks.append(Para(" ".join(line.strip() for line in lines)[2:], "caution"))
        else:
            blocks.append(Para(" ".join(line.strip() for line in lines)))
    return tuple(blocks)


# ----------------------------------------------------------------------------------------------
# Formatting helpers (all rounding of the sheet)

def _e(text: str) -> str:
    """A plain string as paragraph markup."""
    return str(escape(text))


def _nb(text: str) -> str:
    """A quantity that must not break across lines: its spaces made non-breaking (U+00A0)."""
    return text.replace(" ", "\u00a0")


def _freq(hz: float) -> str:
    return _nb(units.format_frequency(hz))


def _ohm(ohm: float) -> str:
    return _nb(units.format_impedance(ohm))


def _z(z: complex) -> str:
    return _nb(units.format_complex_impedance(z))


def _volts(v: float) -> str:
    return _nb(units.format_voltage(v))


def _amps(a: float) -> str:
    return _nb(units.format_current(a))


def _watts(w: float) -> str:
    return _nb(units.format_power(w))


def _percent(fraction: float) -> str:
    return _nb(units.format_percent(fraction))


def _band(edges) -> str:
    if edges is None:
        return "none: the predicted SWR never gets that low"
    low, high = edges
    return f"{_freq(low)} to {_freq(high)} ({_span(high - low)})"


def _span(hz: float) -> str:
    """A frequency span: "261 kHz" below 1 MHz, else "17.55 MHz"."""
    return _nb(f"{hz / 1e3:.0f} kHz" if hz < 1e6 else f"{hz / 1e6:.2f} MHz")


def _offset(hz: float) -> str:
    """How far a band edge may lie off: _span, with a decimal below 10 kHz (a 160 m band's edges)."""
    return _nb(f"{hz / 1e3:.1f} kHz") if hz < 10e3 else _span(hz)


def _step(hz: float) -> str:
    """A round frequency error from the 1-2-5 series: "100 kHz", "5 MHz"."""
    return _nb(f"{hz / 1e3:g} kHz" if hz < 1e6 else f"{hz / 1e6:g} MHz")


def _swr(value: float) -> str:
    return f"{value:.2f}"


def _nice(x: float) -> float:
    """The value of the 1-2-5 series nearest to x (> 0) on a log scale."""
    decade = 10.0 ** math.floor(math.log10(x))
    return min((m * decade for m in (1, 2, 5, 10)), key=lambda v: abs(math.log(v / x)))


def _series_step(x: float, up: bool) -> float:
    """The next value of the 1-2-5 series above (up) or below x."""
    values = [m * 10.0 ** e for e in range(math.floor(math.log10(x)) - 1, math.floor(math.log10(x)) + 2)
              for m in (1, 2, 5)]
    return min(v for v in values if v > x * (1 + 1e-9)) if up else max(v for v in values
                                                                         if v < x * (1 - 1e-9))


def _error_step(start: float, per_m: float, limit_m: float, min_move_m: float) -> float:
    """The measured error a tuning row is written for: `start`, moved along the 1-2-5 series up
    while the move it asks for (error / |per_m|, m) is under `min_move_m` (too small to make), and
    down while the move is over `limit_m` (too far for the model's slope to hold) as long as the
    smaller move can still be made."""
    step = start
    while step / abs(per_m) < min_move_m:
        step = _series_step(step, up=True)
    while step / abs(per_m) > limit_m and _series_step(step, up=False) / abs(per_m) >= min_move_m:
        step = _series_step(step, up=False)
    return step


def _source_tag(source: str) -> str:
    """How sure a catalogue spread is, in a few words: measured and stored, or from memory."""
    if source.startswith("[S]"):
        return "published measurements"
    if "common practice" in source.lower():
        return "common practice, from memory"
    return "from memory, not confirmed"


def _diameter(m: float, system: str) -> str:
    """A small diameter (a tube, a cable): to 0.1 mm, with inches to 0.01 in on imperial sheets
    (an eighth of an inch is too coarse for a cable)."""
    if system == "metric":
        return _nb(units.format_length(m, system))
    return _nb(f"{m * 1e3:.1f} mm ({m / 0.0254:.2f} in)")


def _capital(text: str) -> str:
    """The first letter in upper case ("RF exposure" stays as it is)."""
    return text[:1].upper() + text[1:]


def _direction(move_m: float) -> str:
    """DESIGN.md §5: positive = toward the open top ("up")."""
    return "up" if move_m > 0 else "down"


# ----------------------------------------------------------------------------------------------
# The sheet

#: how far the stacked version's phasing-stub figures may be low (tests/test_stacked_nec.py checks it)
PHASING_NOTE = ("the model's figure: NEC-2 puts the phasing stub's current up to 30 % higher on the "
                "designs checked; allow for that")

#: what the antenna is, for the subtitles: single (False) and stacked (True)
KIND = {False: "end-fed half-wave antenna matched by a shorted quarter-wave stub",
        True: "two stacked half-waves fed in phase, matched by a quarter-wave stub"}


def build_sheet(design: Design, solution: Solution, date: str) -> Sheet:
    """The build sheet of `design` solved as `solution`, dated `date` (YYYY-MM-DD, the revision date).
    Design strings are printable in Vera: design.py refuses any character the font lacks."""
    ctx = _Context(design, solution)
    sections = (
        Section("summary", "Summary", ctx.summary()),
        Section("overview", "Overview", (Figures(("overview",)),)),
        Section("cut-list", "Cut list and hardware", ctx.cut_list()),
        Section("details", "Details", (Figures(("radiator", "stub", "short-tap", "choke")),)),
        Section("performance", "Predicted performance", ctx.performance()),
        Section("tuning", "Tuning procedure", ctx.tuning(), new_page=True),
        Section("log", "Measurement log", ctx.log()),   # beside the tuning's tail where it fits
        Section("cautions", "Safety cautions", ctx.cautions(), new_page=True),
        Section("as-built", "As-built record", ctx.as_built()),
    )
    return Sheet(
        title=design.title, name=design.name, document_id=solution.design_id, date=date,
        paper=design.output.paper, units=design.output.units,
        subtitle="Build sheet: " + KIND[solution.stack is not None],
        furniture=(design.name, f"document {solution.design_id}", f"revised {date}"),
        page_label="page {page} of {pages}",
        footer="Caution: high RF voltage at the stub's open end" + (
            " and the radiator's far end" if solution.stack is None else
            ", the phasing stub's open end and the elements' far ends") + ". Never touch "
               "the antenna while transmitting; keep it clear of power lines. See the safety cautions.",
        subject=f"Build sheet of {design.name}, document {solution.design_id}, revised {date}",
        sections=sections,
    )


def line_text(design: Design, solution: Solution, brief: bool = False) -> str:
    """The stub line as the sheet and the booklet name it: the cut list's name (solver.Parts), with
    what a line from the design file was given by (in the design's units); `brief`: as short as the
    booklet's summary column needs."""
    st, u = design.stub, design.output.units
    if st.name != "custom":
        return solution.parts.line_name
    if st.kind == "geometry":
        spacing = _nb(units.format_length(st.spacing_m, u, "size"))
        if brief:
            return f"two-wire, {spacing} spacing, {st.dielectric}"
        return (f"two-wire line, {spacing} spacing, "
                f"{_nb(units.format_length(st.conductor_diameter_m, u, 'size'))} conductors in {st.dielectric}")
    return f"two-wire, {_nb(units.format_impedance(st.z0_ohm))} as measured" if brief else \
        solution.parts.line_name


class _Context:
    """The design, its solution and the shorthands every section uses."""

    def __init__(self, design: Design, solution: Solution):
        self.d = design
        self.s = solution
        self.u = design.output.units

    def length(self, m: float, coarse: bool = False) -> str:
        return _nb(units.format_length(m, self.u, "coarse" if coarse else "fine"))

    def size(self, m: float) -> str:
        """A diameter or spacing: finer than a length (units.format_length's "size" step)."""
        return _nb(units.format_length(m, self.u, "size"))

    def distance(self, m: float) -> str:
        return _nb(units.format_distance(m, self.u))

    @property
    def f0(self) -> str:
        return _freq(self.s.frequency_hz)

    @property
    def pep(self) -> str:
        return f"{_watts(self.d.power.transmitter_w)} PEP"

    # -- 2. summary --------------------------------------------------------------------------
    def summary(self) -> tuple:
        d, s = self.d, self.s
        low, high = s.band_hz
        band = f"{_freq(low)} to {_freq(high)}"
        band += (f" ({d.band_name} band, {self.band_table()})" if d.band_name else
                 " (as given in the design)")
        dims = s.dimensions
        rounding = units.length_rounding(self.u)
        return (
            Facts((
                ("band", _e(band)),
                ("design frequency", _e(f"{self.f0}: the tap is matched to "
                                        f"{_ohm(d.feed.impedance_ohm)} here")),
                ("predicted 2:1 band", _e(f"{_band(s.band_swr2_hz)} at the tap")),
            )),
            KeyFigures((
                KeyFigure("radiator", _e(self.length(dims.radiator)),
                          f"{self.radiator_end()} to " + JUNCTION.get(s.parts.construction,
                                                                     "the junction at the stub's open top")),
                KeyFigure("stub", _e(self.length(dims.stub)),
                          ("the gap" if s.parts.construction == "twin-lead" else "open top (the junction)")
                          + " to the centre line of the short"),
                KeyFigure("tap", _e(self.length(dims.tap)),
                          "centre line of the short to the tap, measured along the stub"),
                KeyFigure("spacing", _e(self.size(dims.spacing)),
                          "centre to centre of the stub conductors"),
                *self.stack_figures(),
            )),
            Para(_e(f"Dimensions as built, {rounding}; the pieces are cut longer (see the cut list)."
                    + self.margin_summary()), "note"),
            *(Para(_e(f"Model limit: {w[0].upper()}{w[1:]}."), "caution") for w in s.warnings),
            *((Para(_e("Warnings, this design's figures against the parts' ratings (see the safety "
                       "cautions and the performance section): "
                       + "; ".join(dict.fromkeys(f.part for f in s.findings)) + "."), "caution"),)
              if s.findings else ()),
        )

    def stack_figures(self) -> tuple:
        """The stacked version's key dimensions: the upper element and the phasing stub."""
        k = self.s.stack
        if k is None:
            return ()
        return (KeyFigure("element", _e(self.length(k.element_m)),
                          "the upper element, as the radiator: end to end"),
                KeyFigure("phasing stub", _e(self.length(k.phasing_m)),
                          f"from the {self.size(k.phasing_spacing_m)} gap below the element to the "
                          "centre line of its short"))

    def band_table(self) -> str:
        """Which table the band edges come from: a country's national table (catalog
        national_bands, with its rule) or the ITU table of the region."""
        d = self.d
        if d.country:
            for b in national_bands(d.country):
                if (b.low_hz, b.high_hz) == tuple(d.band_hz):
                    rule = b.source.split(",")[0].split(":")[0]
                    return f"{d.country} national table, {rule}"
        return f"ITU region {d.region}"

    def margin_summary(self) -> str:
        """One sentence on the tuning margins (solver.FirstCut), or '' when there are none."""
        fc = self.s.first_cut
        parts = [f"the {what} by {self.length(m)} ({self.off_range(span)} than solved)"
                 for what, m, span in (("stub line", fc.stub_margin_m, fc.stub_m),
                                       ("radiator", fc.radiator_margin_m, fc.radiator_m))
                 if self.shown(m)]
        if not parts:
            return ""
        jacket = JACKET_NAMES.get(self.d.radiator.insulation, self.d.radiator.insulation)
        why = [what for what, m in ((f"the {self.d.stub.name} line's", fc.stub_margin_m),
                                    (f"the {jacket} jacket's", fc.radiator_margin_m)) if self.shown(m)]
        return (f" The first cut starts long, {' and '.join(parts)}: {' and '.join(why)} velocity "
                f"factor{'s are' if len(why) > 1 else ' is'} only known to the spread between the "
                "sources (see the tuning procedure).")

    def radiator_end(self) -> str:
        """Where the radiator's length starts (DESIGN.md §5): the far end insulator's attachment
        point, or the free top of a vertical."""
        if self.s.stack is not None:
            return "end at the gap" if self.d.site.orientation == "vertical" else "far end at the gap"
        if self.d.site.orientation == "vertical":
            return "top insulator's attachment point" if self.d.hung else "free top end"
        return "far end insulator's attachment point"

    def line_name(self) -> str:
        return line_text(self.d, self.s)

    def radiator_text(self) -> str:
        r, name = self.d.radiator, self.s.parts.radiator_name
        if self.s.parts.construction == "twin-lead":
            return (f"one conductor of the line ({r.label} {r.material}) in its own {r.insulation} "
                    f"jacket, the other conductor cut at the gap and stripped off above it, so that "
                    f"the radiator runs alone, outside the line's field: velocity factor "
                    f"{r.velocity_factor:.2f} taken, the catalogue's figure for a thin {r.insulation} "
                    f"jacket on wire ({_source_tag(r.spread_source)})")
        if self.s.parts.construction == "tube":
            return (f"{conductor_name(r.diameter_m, self.u, r.material)}, bare: one long element with "
                    "the stub conductor below it")
        if self.s.parts.rigid_radiator and r.insulation == "bare":
            return f"{conductor_name(r.diameter_m, self.u, r.material)}, bare"
        if r.insulation == "bare":
            return f"{name}, bare"
        spread = (f"; sources {velocity_factor_text(*r.velocity_factor_spread)}"
                  if r.velocity_factor_spread is not None else "")
        return f"{name} (velocity factor {r.velocity_factor:.2f}{spread})"

    def ground(self) -> str:
        site = self.d.site
        if site.ground == "custom":
            return (f"ground of permittivity {site.permittivity:g} and conductivity "
                    f"{site.conductivity_s_m:g} S/m")
        if site.ground == "free-space":
            return "no ground (free space)"
        return f"{site.ground} ground"

    def mounting(self) -> str:
        site = self.d.site
        h = self.length(site.height_m)
        if site.orientation == "horizontal":
            return f"horizontal; the stub's open top {h} above {self.ground()}, the stub hanging down"
        if site.orientation == "sloper":
            return (f"sloper, the radiator {units.format_angle(site.slope_rad)} below horizontal; the "
                    f"stub's open top {h} above {self.ground()}")
        rope = ", hung on a rope" if self.d.hung else ""
        if site.orientation == "inverted":
            dims = self.s.dimensions
            far = self.length(site.height_m - dims.stub - dims.radiator)
            return (f"inverted (upside down){rope}; the short {h} above {self.ground()} at the top, the "
                    f"stub below it and the radiator hanging below the stub, its far end {far} up")
        if self.s.parts.construction == "twin-lead":
            return (f"vertical; the short {h} above {self.ground()}, the line hung from its top on a "
                    "halyard")
        return f"vertical{rope}; the short {h} above {self.ground()}, the stub and radiator standing above it"

    def layout(self):
        """The site layout of a horizontal, sloper or hung antenna (Solution.site), None on a mast."""
        return self.s.site

    def top_height(self) -> float:
        site, dims = self.d.site, self.s.dimensions
        if site.orientation == "vertical":
            return site.height_m + dims.stub + self.s.span_m
        return site.height_m

    # -- 4. cut list and hardware ------------------------------------------------------------
    def cut_list(self) -> tuple:
        cut_rows = tuple((_e(i.part), str(i.quantity), _e(self.length(i.length_m, i.coarse)),
                          _e(self.length(i.allowance_m, i.coarse)) if i.allowance_m > 0 else "none",
                          _e(self.cut_material(i)), _e(self.cut_note(i))) for i in self.s.cut_list)
        hardware_rows = tuple((str(h.quantity), _e(h.item), _e(self.hardware_note(h))) for h in self.s.hardware)
        d, s = self.d, self.s
        return (
            Facts((
                ("mounting", _e(self.mounting())),
                *((("site", _e(describe(site, lambda m: self.length(m, coarse=True)))),)
                  if (site := self.layout()) else ()),
                ("radiator", _e(self.radiator_text())),
                ("stub line", _e(f"{self.line_name()}: {_ohm(s.stub_line.z0_ohm)}, "
                                 f"velocity factor {s.stub_line.velocity_factor:.3f}" +
                                 (f" (sources {velocity_factor_text(*d.stub.velocity_factor_spread)})"
                                  if d.stub.velocity_factor_spread is not None else ""))),
                ("feed", _e(f"{d.feed.coax}, "
                            f"{units.article(run := self.length(d.feed.length_m, coarse=True))} {run} run from the tap "
                            f"to the station, choked at the tap ({self.length(s.feed_coax_m, coarse=True)} "
                            "cut, the choke's turns and a pigtail included)")),
                ("power", _e(f"{self.pep}, {MODE_NAMES.get(d.power.mode, d.power.mode)}")),
            )),
            Para(_e(f"Cut lengths include the allowances ({units.length_rounding(self.u)}; coax and rope "
                    f"{units.length_rounding(self.u, 'coarse')}). Tick a box for each piece as it is "
                    "cut."), "note"),
            Table(header=("part", "qty", "cut length", "of which allowance", "material", "note"),
                  rows=cut_rows, widths=(1.1, 0.45, 1.0, 0.95, 1.7, 2.8),
                  align=("left", "right", "right", "right", "left", "left"),
                  boxes=tuple(i.quantity for i in self.s.cut_list)),
            Heading("Hardware"),
            Table(header=("qty", "item", "note"), rows=hardware_rows, widths=(0.45, 2.6, 4.9),
                  align=("right", "left", "left"), boxes=(1,) * len(hardware_rows)),
        )

    def hardware_note(self, item) -> str:
        """A hardware item's note, with the stock size it must fit where its size matters."""
        if item.fits_m is None:
            return item.note
        material = self.d.stub.conductor_material
        return f"{item.note}; to fit {conductor_size(item.fits_m, self.u, material)}"

    def cut_material(self, item) -> str:
        """What a piece is cut from; a pipe or rod radiator given by its diameter is named by the
        stock size a shop sells (stock.py) rather than by the bare diameter."""
        r = self.d.radiator
        label = r.label.lower()
        if self.s.parts.construction == "tube" and item.material == f"{r.material} {self.s.parts.rigid_kind}":
            return conductor_name(r.diameter_m, self.u, r.material)
        if (item.part in ("radiator", "upper element") and self.s.parts.rigid_radiator and "awg" not in label
                and not label.startswith("#") and r.insulation == "bare"):
            return conductor_name(r.diameter_m, self.u, r.material)
        return item.material_text(self.length)

    def cut_list_margin(self) -> str:
        """One sentence on the pieces cut long for tuning (solver.FirstCut), or ''."""
        fc = self.s.first_cut
        long = [f"the {what} by {self.length(m)}" for what, m in (("stub line", fc.stub_margin_m),
                                                                 ("radiator", fc.radiator_margin_m))
                if self.shown(m)]
        return f"Cut long for tuning (included): {' and '.join(long)}. " if long else ""

    def cut_note(self, item) -> str:
        """A cut item's note, with its tuning margin (solver.FirstCut) where it has one."""
        if not self.shown(item.margin_m):
            return item.note
        margin = self.length(item.margin_m)
        return (f"{item.note}, and {units.article(margin)} {margin} tuning margin: the first cut starts "
                "long (see the tuning procedure)")

    def reference_fact(self) -> tuple:
        """How the model's first cut did in NEC-2 on unseen designs of this kind (solver.ReferenceCheck),
        the edges scaled to this design's predicted 2:1 width: the sheet's SWR and band are the
        model's, matched at the design frequency by construction; this is what the first reading may
        show instead. Empty where the figures do not apply (solver.reference_check)."""
        r = self.s.reference
        if r is None:
            return ()
        text = (f"NEC-2, run at the model's dimensions for {r.designs} unseen bare-wire {r.label}, read "
                f"SWR {r.swr_q90:.2f}:1 or lower at the design frequency on 9 in 10 (at most {r.swr_max:.2f}:1) "
                f"where the model predicts {_swr(self.s.feed_swr)}:1")
        if self.s.band_swr2_hz is not None:
            low, high = self.s.band_swr2_hz
            text += (f"; their 2:1 edges lay within {_offset(r.edge_q90 * (high - low))} of the model's on 9 "
                     f"in 10 (at most {_offset(r.edge_max * (high - low))}, scaled to this band's width)")
        fc = self.s.first_cut
        if self.shown(fc.stub_margin_m) or self.shown(fc.radiator_margin_m):
            text += (". The velocity factor of this design's insulated parts adds its own spread, for which "
                     "the first cut starts long")
        return (("checked in NEC-2", _e(text + ". The tuning procedure takes up the difference.")),)

    # -- 6. predicted performance ------------------------------------------------------------
    def performance(self) -> tuple:
        d, s = self.d, self.s
        c, e = s.choke, s.exposure
        blocks: list = [
            Figures(("swr", "smith")),
            Heading("At the tap"),
            Facts((
                ("feed impedance", _e(f"{_z(s.feed_impedance)} at {self.f0}")),
                ("SWR", _e(f"{_swr(s.feed_swr)}:1 at the tap, {_swr(s.feed_swr_transmitter)}:1 at the "
                           f"transmitter (through {self.length(s.feed_coax_m, coarse=True)} of {d.feed.coax}, "
                           "the choke's turns included)")),
                ("2:1 band", _e(_band(s.band_swr2_hz))),
                ("1.5:1 band", _e(_band(s.band_swr15_hz))),
                *self.reference_fact(),
                ("coax loss", _e(f"{s.coax_loss_db:.2f} dB; {_watts(s.power_at_tap_w)} PEP "
                                 f"of {self.pep} reaches the tap")),
            )),
            *self.findings_at("feed", "coax"),
            Heading(f"Voltages and current at {self.pep}"),
            Facts((
                ("stub's open end", _e(f"{_volts(s.voltage_open_end_v_rms)} rms, "
                                       f"{_volts(s.voltage_open_end_v_peak)} peak")),
                ("radiator's far end", _e(f"{_volts(s.voltage_far_end_v_rms)} rms, "
                                          f"{_volts(s.voltage_far_end_v_peak)} peak")),
                ("current in the short", _e(f"{_amps(s.current_short_a_rms)} rms")),
                *((("phasing stub's open end", _e(f"{_volts(s.stack.voltage_phasing_open_v_rms)} rms, "
                                                  f"{_volts(s.stack.voltage_phasing_open_v_peak)} peak, "
                                                  f"across the gap ({PHASING_NOTE})")),
                   ("element's far end", _e(f"{_volts(s.stack.voltage_element_end_v_rms)} rms, "
                                            f"{_volts(s.stack.voltage_element_end_v_peak)} peak")),
                   ("current in the phasing short",
                    _e(f"{_amps(s.stack.current_phasing_short_a_rms)} rms")))
                  if s.stack is not None else ()),
            )),
            *self.findings_at("voltages", "current", "reach"),
            Heading("Efficiency"),
            Facts((
                ("efficiency", _e(f"{_percent(s.efficiency)} (radiated / delivered to the tap)")),
                ("radiated", _e(f"{_watts(s.power_radiated_w)} of the "
                                f"{_watts(s.power_at_tap_w)} PEP at the tap")),
                ("lost", _e(self.losses())),
            )),
            *self.radiation(),
            Heading("Choke"),
            *self.sleeve_facts(),
            Facts((
                ("coil", _e(f"{c.turns} turn{'s' if c.turns != 1 else ''} of {d.feed.coax} close-wound "
                            f"on {units.article(form := self.length(c.form_diameter_m))} {form} form, "
                            f"{self.length(c.coil_length_m)} "
                            "long")),
                ("inductance", _e(f"{c.inductance_h * 1e6:.3g} µH")),
                ("self-resonance", _e(f"{_freq(c.self_resonance_hz)} "
                                      f"({c.self_resonance_hz / s.band_hz[1]:.2f} × the band's top edge)"
                                      if c.self_resonance_hz is not None else
                                      "not given: see the choke warning")),
                ("impedance", _e(f"|Z| {_ohm(c.impedance_ohm)} at {self.f0}, "
                                 f"{_ohm(c.impedance_low_edge_ohm)} at the band's low edge"
                                 if c.impedance_ohm is not None else "not given: see the choke warning")),
            )),
        ]
        if c.warning and s.sleeve is None:
            blocks.append(Para(_e(f"Choke warning: {c.warning}"), "caution"))
        controlled, general = CATEGORY_NAMES[e.standard]
        blocks += [
            Heading("RF exposure"),
            Facts((
                ("standard", _e(STANDARD_NAMES[e.standard])),
                ("average power", _e(f"{_watts(e.average_power_w)}; EIRP "
                                     f"{_watts(e.eirp_w)} with {e.gain_dbi:.2f} dBi ({e.gain_source})")),
                (general, _e(f"keep people {self.distance(e.distance_general_m)} away "
                             f"(limit {e.limit_general_w_m2:.3g} W/m²)")),
                (controlled, _e(f"{self.distance(e.distance_controlled_m)} "
                                f"(limit {e.limit_controlled_w_m2:.3g} W/m²)")),
            )),
            *render_blocks(
                "exposure.j2", average=_watts(e.average_power_w), pep=self.pep,
                mode=MODE_NAMES.get(d.power.mode, d.power.mode), duty=_percent(d.power.duty_factor),
                on_air=_percent(d.power.on_air), standard=STANDARD_NAMES[e.standard],
                in_near_field=e.distance_general_m < e.near_field_m,
                near_field=self.distance(e.near_field_m), f0=self.f0),
            *self.findings_at("exposure"),
        ]
        if s.assumptions:
            blocks += [Heading("Assumptions"), *(Para(_e(f"{a}."), "note") for a in s.assumptions)]
        return tuple(blocks)

    def sleeve_facts(self) -> tuple:
        """The quarter-wave sleeve choke built instead of the coil (solver.Solution.sleeve), and why;
        () where the coil is the choke."""
        sl, c = self.s.sleeve, self.s.choke
        if sl is None:
            return ()
        coil = (f"best {c.turns} turn{'s' if c.turns != 1 else ''}, "
                f"{_ohm(c.impedance_low_edge_ohm)} at the band's low edge" if c.impedance_low_edge_ohm
                is not None else "no coil of it works as a choke here")
        return (
            Para(_e(f"A coil of {self.d.feed.coax} cannot reach {_ohm(sl.z_target)} in this band "
                    f"({coil}), so the sheet gives a quarter-wave sleeve choke instead (common "
                    "practice); the coil below is not built."), "note"),
            Facts((
                ("sleeve", _e(f"tube of inside diameter {_diameter(sl.sleeve_inner_diameter_m, self.u)} "
                              f"over the {self.d.feed.coax} ({_diameter(sl.cable_od_m, self.u)} outside, "
                              f"{_diameter(sl.shield_diameter_m, self.u)} over the braid)")),
                ("length", _e(f"{self.length(sl.length_m)} from the bonded end to the open end: a "
                              f"quarter wave at {_freq(sl.centre_hz)} on the sleeve line (velocity "
                              f"factor {sl.velocity_factor:.3f}, {_ohm(sl.z0_ohm)})")),
                ("impedance", _e(f"|Z| {_ohm(sl.impedance_ohm)} at {self.f0}, at least "
                                 f"{_ohm(sl.impedance_band_min_ohm)} across the band"
                                 + ("" if sl.meets_target else
                                    f" (short of {_ohm(sl.z_target)}: add ferrite sleeves)"))),
            )),
            Heading("The coil of coax (not built)"),
        )

    def findings_at(self, *anchors: str) -> tuple:
        """The rating warnings (ratings.Finding) that concern the figures of these anchors, as
        caution paragraphs to set beside them."""
        return tuple(Para(f"<b>{_e(_capital(f.part))}.</b> {_e(f.body)}", "caution")
                     for f in self.s.findings if f.anchor in anchors)

    def radiation(self) -> tuple:
        """The pattern's figure and its two figures (gain relative to the power delivered to the tap)."""
        r = self.s.radiation
        if r is None:
            return ()
        free = r.ground_kind == "free-space"
        return (
            Heading("Radiation"),
            Figures(("pattern",)),
            Facts((
                ("maximum gain", _e(f"{r.max_gain_dbi:.1f} dBi (relative to the power delivered to the tap: "
                                    f"the antenna's{'' if free else ' and the ground'} losses included)")),
                ("elevation of the maximum" if free else "take-off angle",
                 _e(f"{r.takeoff_deg:.0f}° above the horizon, toward azimuth {r.azimuth_deg:.0f}°")),
                *((("over the single half-wave",
                    _e(f"{k.gain_over_single_db:+.1f} dB: the same design without the upper element "
                       f"gives {k.single_max_gain_dbi:.1f} dBi and a 2:1 band of "
                       f"{_band(k.single_band_swr2_hz)}")),)
                  if (k := self.s.stack) is not None else ()),
            )),
        )

    def losses(self) -> str:
        """Where the power is lost. A line given by its measured loss has no physical split between
        conductor and dielectric loss (physics/lines.py), so its two parts are given as one."""
        lost = self.s.power_lost_w
        wire = f"radiator wire {_watts(lost['radiator_wire'])}"
        ground = f", ground {_watts(lost['ground'])}" if lost["ground"] > 0 else ""
        if self.d.stub.kind == "nominal":
            return f"stub line {_watts(lost['stub_conductors'] + lost['stub_dielectric'])}, {wire}{ground}"
        return (f"stub conductors {_watts(lost['stub_conductors'])}, stub dielectric "
                f"{_watts(lost['stub_dielectric'])}, {wire}{ground}")

    # -- 7. tuning procedure and log ---------------------------------------------------------
    def tuning_values(self) -> dict:
        """The numbers of the tuning procedure, formatted. Moves follow DESIGN.md §5 signs."""
        d, s = self.d, self.s
        sens = s.sensitivity
        f0 = s.frequency_hz
        z0 = d.feed.impedance_ohm
        dims = s.dimensions
        least = MIN_MOVE_M[self.u]
        # one dip error for both moves that correct it, each move within its part's linear range;
        # where the short cannot move the dip far without spoiling the match (it also shortens the tap
        # distance), the radiator alone
        df, short_moves_dip = dip_rule(s, self.u)
        dr = _error_step(IMPEDANCE_STEP_OHM, sens["ohm_per_m_tap"], LINEAR_FRACTION * dims.tap, least)
        dx = _error_step(IMPEDANCE_STEP_OHM, sens["ohm_per_m_short"], LINEAR_FRACTION * dims.tap, least)
        # the dip df below f0 asks for +df of dip; R dr high for -dr; X +dx for -dx
        radiator_move = df / sens["dip_hz_per_m_radiator"]
        short_dip_move = df / sens["dip_hz_per_m_short"]
        tap_move = -dr / sens["ohm_per_m_tap"]
        short_move = -dx / sens["ohm_per_m_short"]
        sw = s.sweep
        i0 = int(np.argmin(np.abs(sw.frequency_hz - f0)))
        lo, hi = max(i0 - 1, 0), min(i0 + 1, len(sw.frequency_hz) - 1)
        x_slope = (sw.x_ohm[hi] - sw.x_ohm[lo]) / (sw.frequency_hz[hi] - sw.frequency_hz[lo])
        best = int(np.argmin(sw.swr))
        tolerance = dip_tolerance_hz(s)
        rigid = s.parts.rigid_radiator
        fc = s.first_cut
        k = s.stack
        return dict(
            stack=k is not None, element=self.length(k.element_m) if k else "",
            radiator_noun="the radiator" if k is None else "both elements",
            radiator_is="the radiator is" if k is None else "the elements are",
            phasing=self.length(k.phasing_m) if k else "",
            gap=self.size(k.phasing_spacing_m) if k else "",
            stub_margin=self.length(fc.stub_margin_m), has_stub_margin=self.shown(fc.stub_margin_m),
            radiator_margin=self.length(fc.radiator_margin_m),
            has_radiator_margin=self.shown(fc.radiator_margin_m),
            stub_start=self.length(dims.stub + fc.stub_margin_m),
            radiator_start=self.length(dims.radiator + fc.radiator_margin_m),
            # from the long end the whole spread may have to be taken up
            stub_travel=self.length(fc.stub_margin_m - min(fc.stub_m[0], 0.0)),
            radiator_travel=self.length(fc.radiator_margin_m - min(fc.radiator_m[0], 0.0)),
            stub_off=self.off_range(fc.stub_m), radiator_off=self.off_range(fc.radiator_m),
            stub_why=self.stub_why(), radiator_why=self.radiator_why(),
            model_limits=tuple(f"{w[0].upper()}{w[1:]}." for w in s.warnings),
            height=self.length(d.site.height_m), radiator=self.length(dims.radiator),
            radiator_end=self.radiator_end(), vertical=d.site.orientation == "vertical",
            inverted=d.site.orientation == "inverted", hung=d.hung,
            short_side="above" if d.site.orientation == "inverted" else "below",
            tap_side="below" if d.site.orientation == "inverted" else "above",
            stub=self.length(dims.stub), tap=self.length(dims.tap),
            wrap=self.length(s.wrap_allowance_m), rigid=rigid,
            f0=self.f0, best_swr=_swr(float(sw.swr[best])),
            best_f=_freq(float(sw.frequency_hz[best])),
            swr2_band=_band(s.band_swr2_hz), z_feed=_ohm(z0),
            x_slope="rises" if x_slope > 0 else "falls",
            x_if_grows="positive" if x_slope > 0 else "negative",
            x_if_shrinks="negative" if x_slope > 0 else "positive",
            rounding=units.length_rounding(self.u),
            df=_step(df), radiator_move=self.length(abs(radiator_move)),
            radiator_shorten=radiator_move < 0,
            dr=_ohm(dr), tap_move=self.length(abs(tap_move)),
            tap_dir_high=_direction(tap_move), tap_dir_low=_direction(-tap_move),
            dx=_ohm(dx), short_move=self.length(abs(short_move)),
            short_dir_high=_direction(short_move), short_dir_low=_direction(-short_move),
            short_moves_dip=short_moves_dip, short_dip_move=self.length(abs(short_dip_move)),
            short_dip_dir_low=_direction(short_dip_move), short_dip_dir_high=_direction(-short_dip_move),
            dip_tolerance=_step(tolerance), stop_swr=f"{STOP_SWR:g}",
            min_move=self.length(least),
            big_move=self.length(BIG_MOVE_FRACTION * dims.stub),
            sleeve=s.sleeve is not None,
            style=s.parts.construction, radiator_as_cut=self.length(s.radiator_cut_m),
            shorten_radiator=("trim the long element's top" if s.parts.construction == "tube"
                              else "shorten the radiator" if k is None else "shorten both elements"),
            lengthen_radiator=("lengthen the long element's top (a sliding sleeve)"
                               if s.parts.construction == "tube" else
                               "lengthen the radiator" if k is None else "lengthen both elements"),
            open_top="gap" if s.parts.construction == "twin-lead" else "open top",
            trim=self.length(s.radiator_cut_m - dims.radiator - fc.radiator_margin_m),
            trim_df=_span(abs((s.radiator_cut_m - dims.radiator) * sens["dip_hz_per_m_radiator"])),
            trim_step=self.length(trim_step_m(dims.radiator, self.u)),
            trim_step_df=_span(abs(trim_step_m(dims.radiator, self.u) * sens["dip_hz_per_m_radiator"])),
            sloper=d.site.orientation == "sloper",
            **self.station_values(),
            **self.as_built_values(),
        )

    def station_values(self) -> dict:
        """The SWR-meter path of the tuning procedure: the SWR to expect at the station end of the
        feed coax for the design as cut, at the band's edges, the design frequency and half-way
        between them (interpolated in the solver's sweep, Solution.sweep.swr_transmitter), beside the
        SWR at the tap; the coax's matched loss at the design frequency; and the station reading at
        which tuning may stop, STOP_SWR at the tap carried through that loss (|rho| at the station
        = |rho| at the tap x 10^(-A/10), the reflected wave crossing the coax twice)."""
        d, s = self.d, self.s
        f0 = s.frequency_hz
        low, high = s.band_hz
        sw = s.sweep
        marks = []
        for f in (low, 0.5 * (low + f0), f0, 0.5 * (f0 + high), high):
            if all(abs(f - g) > 1e-6 * f0 for g in marks):
                marks.append(f)
        marks = sorted(marks)[:STATION_POINTS]
        rows = tuple((_freq(f), _swr(float(np.interp(f, sw.frequency_hz, sw.swr_transmitter))),
                      _swr(float(np.interp(f, sw.frequency_hz, sw.swr)))) for f in marks)
        matched_db = station_matched_loss_db(d, s)
        return dict(station_rows=rows, coax_matched_loss=f"{matched_db:.1f}",
                    feed_length=self.length(s.feed_coax_m, coarse=True),
                    stop_swr_station=_swr(station_swr(STOP_SWR, matched_db)))

    def as_built_values(self) -> dict:
        """The antenna as it stands, for the tuning procedure: the latest as-built entry
        (design.latest_as_built), each length against the design's; has_as_built False without one."""
        entry = latest_as_built(self.d.record)
        if entry is None:
            return dict(has_as_built=False)
        dims = self.s.dimensions
        parts = []
        for name, got, want in (("radiator", entry.radiator_m, dims.radiator),
                                ("stub", entry.stub_m, dims.stub), ("tap", entry.tap_m, dims.tap)):
            if got is None:
                parts.append(f"{name} not recorded (taken as designed, {self.length(want)})")
                continue
            diff = units.parse_quantity(self.length(got), "length") - units.parse_quantity(
                self.length(want), "length")
            rel = ("as designed" if diff == 0 else
                   f"{self.length(abs(diff))} {'longer' if diff > 0 else 'shorter'} than designed")
            parts.append(f"{name} {self.length(got)} ({rel})")
        return dict(has_as_built=True, as_built_date=entry.date, as_built_parts="; ".join(parts))

    def tuning(self) -> tuple:
        return render_blocks("tuning.j2", **self.tuning_values())

    # -- the first cut's uncertainty (solver.FirstCut) -----------------------------------------
    def shown(self, m: float) -> bool:
        """Whether a length rounds to something in the sheet's units (more than half the least
        move a tape resolves)."""
        return m >= 0.5 * MIN_MOVE_M[self.u]

    def off_range(self, span: tuple) -> str:
        """How far a first cut may be off, in words: '1-3/8" shorter to 1-3/8" longer', 'up to 5-7/8"
        longer', or '' where the range rounds to nothing."""
        low, high = span
        short, long_ = self.shown(-low), self.shown(high)
        if short and long_:
            return f"{self.length(-low)} shorter to {self.length(high)} longer"
        if long_:
            return f"up to {self.length(high)} longer"
        if short:
            return f"up to {self.length(-low)} shorter"
        return ""

    def may_need(self, span: tuple, solved_m: float) -> str:
        """'may need to be up to 5-7/8" longer than the 15' 9-1/8" solved.', or that the spread is
        below the sheet's rounding."""
        off = self.off_range(span)
        if not off:
            return f"the spread moves it by less than {self.length(MIN_MOVE_M[self.u])}."
        return f"may need to be {off} than the {self.length(solved_m)} solved."

    def stub_why(self) -> str:
        """Why the stub's first cut is as sure as it is: the line's velocity factor and its spread."""
        st, fc = self.d.stub, self.s.first_cut
        if self.d.calibration.stub_velocity_scale != 1.0:
            return ("The stub line's velocity factor was corrected by a fit to your measured sweep, so "
                    "the stub is cut to the design with no tuning margin.")
        if st.velocity_factor_spread is not None:
            low, high = st.velocity_factor_spread
            vf = st.velocity_factor if st.velocity_factor is not None else self.s.stub_line.velocity_factor
            spread = velocity_factor_text(low, high).replace("-", " to ")
            return (f"The stub line ({st.name}) is taken at velocity factor {velocity_factor_text(vf)}, "
                    f"but the sources give {spread} for this kind of line "
                    f"({_source_tag(st.spread_source)}), and the reference this model is checked against "
                    "(NEC-2) has no dielectric to settle it. The match needs the stub's electrical "
                    "length, so the physical stub scales with the velocity factor: it "
                    + self.may_need(fc.stub_m, self.s.dimensions.stub))
        if st.kind == "nominal":
            return (f"The stub line's velocity factor {st.velocity_factor:g} is your own figure from the "
                    "design file; the stub is cut to it with no tuning margin. If it was not measured on "
                    "this roll of line, the short may have to move further than the table expects.")
        if st.eps_r == 1.0:
            return ("The stub line is air-spaced and computed from its geometry: no dielectric, so no "
                    "velocity-factor spread and no tuning margin.")
        return (f"The stub line is computed from its geometry in {st.dielectric}; no published spread is "
                "known for it, so no tuning margin is added. Measure its velocity factor if the short "
                "will not bring X to 0.")

    def radiator_why(self) -> str:
        r, fc = self.d.radiator, self.s.first_cut
        if self.d.calibration.radiator_scale != 1.0:
            return ("The radiator was corrected by a fit to your measured sweep, so it is cut to the "
                    "design with no tuning margin.")
        if r.velocity_factor_spread is not None:
            low, high = r.velocity_factor_spread
            spread = velocity_factor_text(low, high).replace("-", " to ")
            jacket = JACKET_NAMES.get(r.insulation, r.insulation)
            return (f"The radiator's {jacket} jacket is taken at velocity factor "
                    f"{velocity_factor_text(r.velocity_factor)}, but jackets range from {spread} "
                    f"({_source_tag(r.spread_source)}), which NEC-2 cannot check either: the radiator "
                    + self.may_need(fc.radiator_m, self.s.dimensions.radiator))
        if r.insulation == "custom":
            return (f"The jacket's velocity factor {r.velocity_factor:g} is your own figure from the design "
                    "file; the radiator is cut to it with no tuning margin.")
        what = "pipe or rod" if self.s.parts.rigid_radiator else "wire"
        return f"The radiator is bare {what}: no jacket, so no velocity-factor spread and no tuning margin."

    def log(self) -> tuple:
        return (
            Para(_e(f"Readings at the tap. Target at {self.f0}: R = "
                    f"{_ohm(self.d.feed.impedance_ohm)}, X = 0 Ω, SWR {STOP_SWR:g}:1 or "
                    "lower."), "note"),
            Para(_e("Back into the tool: type the log into a CSV file whose first line holds these "
                    "column names (the frequency with its unit, as written here; R and X may stay "
                    "empty) and run `buildsheet fit DESIGN --readings FILE` for the next moves (add "
                    "`--at station` for SWR read at the station end of the coax), or store it with "
                    "the as-built entry: `buildsheet record DESIGN --date YYYY-MM-DD --readings "
                    "FILE`. Write what you changed on the first reading after the change: only the "
                    "readings from there on are used."), "note"),
            WriteIn(header=LOG_COLUMNS, widths=(0.35, 1.2, 0.7, 0.8, 0.8, 4.2), min_rows=12),
        )

    # -- 8. safety cautions ------------------------------------------------------------------
    def cautions(self) -> tuple:
        d, s = self.d, self.s
        e = s.exposure
        controlled, general = CATEGORY_NAMES[e.standard]
        low_point, low_what = s.parts.lowest_point_m, s.parts.lowest_point
        return render_blocks(
            "cautions.j2", top_height=self.length(self.top_height()), power=self.pep,
            v_open_rms=_volts(s.voltage_open_end_v_rms),
            v_open_pk=_volts(s.voltage_open_end_v_peak),
            v_far_rms=_volts(s.voltage_far_end_v_rms),
            v_far_pk=_volts(s.voltage_far_end_v_peak),
            i_short=_amps(s.current_short_a_rms),
            stack=s.stack is not None,
            v_phasing_rms=_volts(s.stack.voltage_phasing_open_v_rms) if s.stack else "",
            phasing_note=PHASING_NOTE,
            v_phasing_pk=_volts(s.stack.voltage_phasing_open_v_peak) if s.stack else "",
            v_element_rms=_volts(s.stack.voltage_element_end_v_rms) if s.stack else "",
            v_element_pk=_volts(s.stack.voltage_element_end_v_peak) if s.stack else "",
            low_point=self.length(low_point) if low_point is not None else "", low_point_what=low_what,
            # within 3 m of the ground: a standing person's reach (2.5 m, ratings.py) and a little more
            low_point_near=low_point is not None and low_point < 3.0,
            d_general=self.distance(e.distance_general_m),
            d_controlled=self.distance(e.distance_controlled_m),
            general_name=general, controlled_name=controlled, standard=STANDARD_NAMES[e.standard],
            vertical=d.site.orientation in ("vertical", "inverted"), hung=d.hung,
            inverted=d.site.orientation == "inverted",
            in_near_field=e.distance_general_m < e.near_field_m,
            near_field=self.distance(e.near_field_m), f0=self.f0,
            findings=[(_capital(f.part), f.body) for f in s.findings])

    # -- 9. as-built record ------------------------------------------------------------------
    def as_built(self) -> tuple:
        d, s = self.d, self.s
        dims = s.dimensions
        sw = s.sweep
        best = int(np.argmin(sw.swr))
        designed = (_e("as designed (predicted)"), "", _e(self.length(dims.radiator)),
                    _e(self.length(dims.stub)), _e(self.length(dims.tap)),
                    _e(_freq(float(sw.frequency_hz[best]))),
                    _e(_swr(float(sw.swr[best]))), "")
        rows = [designed]
        for entry in d.record:
            resonance, swr_read, note = entry.resonance_hz, entry.swr, entry.note or ""
            if entry.readings:
                # the entry's SWR readings (record --readings): their lowest where the entry gives
                # no resonance of its own, and how many there are beside the note
                low = min(entry.readings, key=lambda r: r.swr)
                if resonance is None:
                    resonance, swr_read = low.frequency_hz, low.swr
                n = len(entry.readings)
                note = f"{note} ({n} SWR reading{'s' if n != 1 else ''} stored)".strip()
            rows.append((
                _e(entry.date), _e(entry.site or ""),
                self.built(entry.radiator_m, dims.radiator), self.built(entry.stub_m, dims.stub),
                self.built(entry.tap_m, dims.tap),
                _e(_freq(resonance)) + _e(f" ({(resonance - s.frequency_hz) / 1e3:+.0f} kHz)")
                if resonance is not None else "",
                _e(f"{swr_read:.2f}") if swr_read is not None else "",
                _e(note)))
        return (
            *render_blocks("asbuilt.j2", entries=len(d.record)),
            Table(header=("date", "site", "radiator", "stub", "tap", "lowest SWR at", "SWR", "note"),
                  rows=tuple(rows), widths=(1.1, 0.9, 1.2, 1.2, 1.0, 1.5, 0.5, 1.6),
                  align=("left", "left", "right", "right", "right", "right", "right", "left"),
                  blank_rows=0 if d.record else BLANK_RECORD_ROWS),
        )

    def built(self, built_m: float | None, designed_m: float) -> str:
        if built_m is None:
            return ""
        diff = built_m - designed_m
        sign = "+" if diff >= 0 else "-"
        return _e(f"{self.length(built_m)} ({sign}{self.length(abs(diff))})")
