"""Ratings of the parts, and the checks of a design's own figures against them.

Owns the `ratings:` section of data/catalog.yaml (coax power and working voltage, connectors, stub
lines, insulators, the chassis-wiring ampacity of wire) and the checks that compare them with the
voltages, currents and powers of one solved design. Pure functions of a Design and its Solution:
no I/O, nothing refused. Each check returns Findings naming the part, the design's figure, the
rating with where it comes from, and what to change; `solve` prints them, the JSON carries them, the
sheet prints them in its cautions and beside the figure they concern.

Margins and heights used (each said in the warning text):

    VOLTAGE_MARGIN   1.25 on every peak voltage: the voltages are computed at the PEP reaching the
                     tap with the antenna as designed; ALC overshoot on modulation peaks and a wet or
                     detuned antenna raise them. 25 % is this project's choice, not a published figure.
    REACH_M          2.5 m: the "arm's reach" above a standing surface of IEC 60364-4-41 (low-voltage
                     installations, protection by placing out of reach), from memory.
    PERSON_M         2.0 m: the height of a standing person taken for exposure under a low antenna
                     (common practice in exposure screening, from memory).
    COAX_SWR_LIMIT   1.5: above this SWR on the coax many solid-state transmitters reduce power and
                     the extra coax loss grows (common practice, from memory).
"""

from __future__ import annotations

import functools
import math
from typing import TYPE_CHECKING

import numpy as np

from buildsheet import units
from buildsheet.catalog import raw_section
from buildsheet.units import parse_quantity, parse_wire
from buildsheet.valueclass import valueclass

if TYPE_CHECKING:      # only for annotations: the solver imports this module
    from buildsheet.design import Design
    from buildsheet.solver import Solution

VOLTAGE_MARGIN = 1.25
REACH_M = 2.5
PERSON_M = 2.0
COAX_SWR_LIMIT = 1.5
#: impedance ratios of the transformers and baluns builders commonly buy or wind (common practice)
COMMON_RATIOS = (1.0, 4.0, 9.0, 16.0)


# ----------------------------------------------------------------------------------------------
# The ratings (catalogue data)

@valueclass
class CoaxRating:
    """power: ((f_hz, average W matched), ...); working_voltage_rms: V rms."""
    name: str
    power: tuple
    power_source: str
    working_voltage_rms: float
    voltage_source: str

    def power_at(self, f: float) -> float:
        """Average power rating at f, W: interpolated on log-log axes between the catalogue points
        (and extended along the end segments' slope)."""
        fs = np.log([p[0] for p in self.power])
        ps = np.log([p[1] for p in self.power])
        x = math.log(f)
        i = int(np.clip(np.searchsorted(fs, x) - 1, 0, len(fs) - 2))
        slope = (ps[i + 1] - ps[i]) / (fs[i + 1] - fs[i])
        return float(math.exp(ps[i] + slope * (x - fs[i])))


@valueclass
class Rated:
    """A part with a working voltage (V peak), an optional power rating (W average) and a label."""
    name: str
    label: str
    working_voltage_peak: float
    source: str
    power_w: float | None = None
    max_frequency_hz: float | None = None


@valueclass
class Ratings:
    """The catalogue's ratings: coax, connectors, stub lines, insulators, the corona factor and the
    wire current limits, with their sources."""
    coax: dict
    connectors: dict
    stub_lines: dict
    insulators: dict
    corona_factor: float
    corona_source: str
    wire_current: tuple          # ((diameter_m, A at DC), ...) ascending
    wire_current_source: str


def _text(s) -> str:
    return " ".join(str(s).split())


@functools.cache
def ratings() -> Ratings:
    """The catalogue's `ratings:` section, parsed once."""
    raw = raw_section("ratings")
    coax = {n: CoaxRating(n, tuple((parse_quantity(f, "frequency"), parse_quantity(p, "power"))
                                   for f, p in e["power"]), _text(e["power_source"]),
                          float(e["working_voltage_rms"]), _text(e["voltage_source"]))
            for n, e in raw["coax"].items()}
    connectors = {n: Rated(n, e["label"], float(e["working_voltage_peak"]), _text(e["source"]),
                           max_frequency_hz=parse_quantity(e["max_frequency"], "frequency"))
                  for n, e in raw["connectors"].items()}
    lines = {n: Rated(n, n, float(e["working_voltage_peak"]), _text(e["source"]),
                      power_w=parse_quantity(e["power"], "power"))
             for n, e in raw["stub_lines"].items()}
    insulators = {n: Rated(n, e["label"], float(e["working_voltage_peak"]), _text(e["source"]))
                  for n, e in raw["insulators"].items()}
    wires = tuple(sorted((parse_wire(g), float(a)) for g, a in raw["wire_current"]))
    return Ratings(coax, connectors, lines, insulators, float(raw["corona"]["surface_factor"]),
                   _text(raw["corona"]["source"]), wires, _text(raw["wire_current_source"]))


def _how_sure(source: str) -> str:
    """'from memory' or 'published' for a rating's source text."""
    return "from memory" if "from memory" in source.lower() else "a published figure"


def connector_for(frequency_hz: float) -> Rated:
    """The connector a builder fits at this frequency: UHF (PL-259) up to its usual limit, type N
    above (common practice)."""
    c = ratings().connectors
    return c["UHF"] if frequency_hz <= c["UHF"].max_frequency_hz else c["N"]


# ----------------------------------------------------------------------------------------------
# Physics of the ratings

def peek_corona_voltage(spacing_m: float, diameter_m: float, surface_factor: float,
                        air_density: float = 1.0) -> float:
    """Peak voltage between the conductors of an air-spaced two-wire line at which corona starts, V.

    Peek's visual corona gradient for parallel wires, g = 30 m δ (1 + 0.301/sqrt(δ r)) kV/cm peak,
    r in cm (F. W. Peek, Dielectric Phenomena in High-Voltage Engineering, 1929; from memory). The
    surface field of a two-wire line with V between the conductors is V / (2 r acosh(s/d)) for
    s >> r (each conductor at V/2 from the mid plane, charge per length from the line's capacitance,
    field q/(2 pi eps0 r) at the surface; proximity crowding ignored).
    """
    r_cm = diameter_m / 2 * 100
    g_kv_cm = 30.0 * surface_factor * air_density * (1 + 0.301 / math.sqrt(air_density * r_cm))
    return g_kv_cm * 1e3 * 2 * r_cm * math.acosh(spacing_m / diameter_m)


def wire_dc_ampacity(diameter_m: float) -> float:
    """Chassis-wiring ampacity (A at DC) of a round wire of this diameter: the catalogue table
    interpolated on log-log axes and extended along its end segments."""
    table = ratings().wire_current
    ds = np.log([t[0] for t in table])
    amps = np.log([t[1] for t in table])
    x = math.log(diameter_m)
    i = int(np.clip(np.searchsorted(ds, x) - 1, 0, len(ds) - 2))
    slope = (amps[i + 1] - amps[i]) / (ds[i + 1] - ds[i])
    return float(math.exp(amps[i] + slope * (x - ds[i])))


def wire_rf_current_rating(f: float, diameter_m: float, sigma: float) -> float:
    """RF current (A rms) that heats a wire as much as its DC ampacity does: the heat per metre the
    wire can shed, I_dc^2 R_dc, over its resistance per metre at f with the skin effect (R_ac, the
    exact round-wire internal impedance of physics.conductors)."""
    from buildsheet.physics.conductors import dc_resistance, wire_internal_impedance

    i_dc = wire_dc_ampacity(diameter_m)
    heat = i_dc ** 2 * float(dc_resistance(diameter_m, sigma))
    r_ac = float(np.real(wire_internal_impedance(f, diameter_m, sigma)))
    return math.sqrt(heat / r_ac)


def coax_peak_voltage(pep_w: float, z0: float, rho: float) -> float:
    """Highest peak voltage on a coax carrying pep_w (W PEP) forward with reflection |rho| at its
    load: sqrt(2 P Z0) at the envelope peak, times (1 + |rho|) at the standing wave's maxima."""
    return math.sqrt(2 * pep_w * z0) * (1 + rho)


def nearest_ratio(ratio: float) -> tuple[float, float]:
    """The common transformer ratio nearest (on a log scale) to `ratio` (>= 1), and the SWR it
    leaves: ratio / common or its inverse."""
    best = min(COMMON_RATIOS, key=lambda r: abs(math.log(ratio / r)))
    left = ratio / best
    return best, max(left, 1 / left)


# ----------------------------------------------------------------------------------------------
# Findings

@valueclass
class Finding:
    """One warning. part: what it concerns; anchor: where the sheet puts it beside a figure
    (voltages, current, coax, feed, exposure, reach); figure / rating / change: the design's
    figure, the rating (with its source) and what to change, in words; text: the whole sentence."""
    part: str
    anchor: str
    figure: str
    rating: str
    change: str

    def _rest(self) -> str:
        return f"; {self.rating}. {self.change[0].upper()}{self.change[1:]}."

    @property
    def body(self) -> str:
        """The figure, the rating and the change, without the part (a sentence of its own)."""
        return f"{self.figure[0].upper()}{self.figure[1:]}{self._rest()}"

    @property
    def text(self) -> str:
        return f"{self.part}: {self.figure}{self._rest()}"

    def to_dict(self) -> dict:
        return {"part": self.part, "anchor": self.anchor, "figure": self.figure, "rating": self.rating,
                "change": self.change, "text": self.text}


def _v(x: float) -> str:
    return units.format_voltage(x)


def _w(x: float) -> str:
    return units.format_power(x)


def _margin_words() -> str:
    return (f"{_pct(VOLTAGE_MARGIN - 1)} margin for ALC overshoot on modulation peaks and a wet or "
            "detuned antenna")


def _pct(x: float) -> str:
    return f"{100 * x:.0f} %"


def _power_for(pep: float, need: float, rating: float) -> float:
    """The PEP at which a voltage need (∝ sqrt P) comes down to the rating."""
    return pep * (rating / need) ** 2


def check(design: "Design", solution: "Solution") -> tuple[Finding, ...]:
    """Every rating and reach check of one design, in the order the sheet reads them."""
    out: list[Finding] = []
    for fn in (_stub_voltage, _insulators, _short_current, _line_power, _feed_mismatch, _coax_power,
               _coax_voltage, _reach, _exposure_reach):
        out += fn(design, solution)
    return tuple(out)


def stub_voltage_rating(design: "Design") -> Rated | None:
    """The stub line's working voltage between its conductors: the catalogue's for a catalogue
    nominal line, Peek's corona onset for a line of air-spaced conductors (catalogue or given by
    geometry), None where nothing is known (a line given by its measured figures, or solid
    dielectric given by geometry)."""
    st = design.stub
    r = ratings()
    if st.name in r.stub_lines:
        return r.stub_lines[st.name]
    if st.kind == "geometry" and st.eps_r == 1.0:
        v = peek_corona_voltage(st.spacing_m, st.conductor_diameter_m, r.corona_factor)
        return Rated("corona", "corona onset (Peek's law)", v, r.corona_source)
    return None


def _stub_voltage(design, s) -> list[Finding]:
    rated = stub_voltage_rating(design)
    if rated is None:
        return []
    v = s.voltage_open_end_v_peak
    need = v * VOLTAGE_MARGIN
    if need <= rated.working_voltage_peak:
        return []
    pep = design.power.transmitter_w
    what = design.stub.name if design.stub.name != "custom" else "the stub line"
    rating = (f"corona starts near {_v(rated.working_voltage_peak)} peak on these conductors (Peek's "
              "law, from memory)" if rated.name == "corona" else
              f"the line's working rating is {_v(rated.working_voltage_peak)} peak "
              f"({_how_sure(rated.source)})")
    return [Finding(
        part=f"stub line ({what})", anchor="voltages",
        figure=(f"{_v(v)} peak between its conductors at the open top at {_w(pep)} PEP, "
                f"{_v(need)} with the {_margin_words()}"),
        rating=rating,
        change=(f"use open-wire line on wider spacing or thicker conductors, or run at most "
                f"{_w(_power_for(pep, need, rated.working_voltage_peak))} PEP"))]


def _insulators(design, s) -> list[Finding]:
    if design.site.orientation == "vertical" and not design.hung:
        return []        # the only insulators hold the stub below the short, near 0 V
    ins = ratings().insulators["end"]
    v = max(s.voltage_open_end_v_peak, s.voltage_far_end_v_peak)
    where = ("the stub's open top" if s.voltage_open_end_v_peak >= s.voltage_far_end_v_peak
             else "the radiator's far end")
    need = v * VOLTAGE_MARGIN
    if need <= ins.working_voltage_peak:
        return []
    pep = design.power.transmitter_w
    return [Finding(
        part="end insulators", anchor="voltages",
        figure=(f"{_v(v)} peak at {where} at {_w(pep)} PEP, {_v(need)} with the {_margin_words()}"),
        rating=(f"an {ins.label} is taken at {_v(ins.working_voltage_peak)} peak "
                f"({_how_sure(ins.source)})"),
        change=(f"use insulators rated for at least {_v(need)} peak (longer, or two in series), or "
                f"run at most {_w(_power_for(pep, need, ins.working_voltage_peak))} PEP"))]


def _short_current(design, s) -> list[Finding]:
    st = design.stub
    if s.parts.rigid_stub:      # pipe or rod: the wire table does not apply
        return []
    limit = wire_rf_current_rating(design.frequency_hz, st.conductor_diameter_m, st.conductivity_s_m)
    i = s.current_short_a_rms
    if i <= limit:
        return []
    d_mm = st.conductor_diameter_m * 1e3
    pep = design.power.transmitter_w
    return [Finding(
        part="stub conductors at the short", anchor="current",
        figure=f"{units.format_current(i)} rms through the short at {_w(pep)} PEP",
        rating=(f"{d_mm:.2g} mm {st.conductor_material} wire carries about "
                f"{units.format_current(limit)} rms at {units.format_frequency(design.frequency_hz)} for "
                f"the heat of its chassis-wiring rating of {wire_dc_ampacity(st.conductor_diameter_m):.0f} A "
                "at DC (from memory), the skin effect's resistance computed"),
        change=(f"use a line with thicker conductors and a short bar of heavy wire or strap, or run at "
                f"most {_w(pep * (limit / i) ** 2)} PEP"))]


def _line_power(design, s) -> list[Finding]:
    rated = ratings().stub_lines.get(design.stub.name)
    if rated is None or rated.power_w is None:
        return []
    avg = s.power_at_tap_w * design.power.duty_factor
    if avg <= rated.power_w:
        return []
    return [Finding(
        part=f"stub line ({design.stub.name})", anchor="voltages",
        figure=(f"{_w(avg)} average reaches the tap ({_w(s.power_at_tap_w)} PEP at the "
                f"{design.power.mode} duty factor {_pct(design.power.duty_factor)})"),
        rating=f"the line is taken at {_w(rated.power_w)} average ({_how_sure(rated.source)})",
        change="use window or open-wire line, or lower the power")]


def _coax_rho(design, s) -> float:
    z0 = design.feed.coax_z0_ohm
    z = s.feed_impedance
    # a short or an open at the tap (|rho| = 1) would make the SWR infinite: held just below
    return min(float(abs((z - z0) / (z + z0))), 0.999999)


def _feed_mismatch(design, s) -> list[Finding]:
    z0 = design.feed.coax_z0_ohm
    rho = _coax_rho(design, s)
    swr_coax = (1 + rho) / (1 - rho) if rho < 1 else math.inf
    if swr_coax <= COAX_SWR_LIMIT:
        return []
    zf = design.feed.impedance_ohm
    ratio = max(zf, z0) / min(zf, z0)
    best, left = nearest_ratio(ratio)
    fix = (f"a 1:{best:g} current balun at the tap would leave SWR {left:.2f}" if best > 1 else "")
    exact = f"{units.article(f'{ratio:.3g}')} {ratio:.3g}:1 impedance transformer would bring it to 1"
    return [Finding(
        part="feed", anchor="feed",
        figure=(f"the tap is matched to {units.format_impedance(zf)} but the {design.feed.coax} is "
                f"{units.format_impedance(z0)}: SWR {swr_coax:.2f} on the coax at the tap, "
                f"{s.feed_swr_transmitter:.2f} at the transmitter"),
        rating=f"above {COAX_SWR_LIMIT:g}:1 many transmitters reduce power (common practice)",
        change=(f"set `feed.impedance: {z0:g} ohm` (the tap can be matched to the coax directly); or "
                f"keep it and fit a transformer: {exact}" + (f", {fix}" if fix else "")))]


def _next_coax(design, f: float, avg_needed: float) -> str:
    for name, c in ratings().coax.items():
        if name != design.feed.coax and c.power_at(f) >= avg_needed:
            return f"{name} (about {_w(c.power_at(f))} here)"
    return "hardline or a larger cable"


def _coax_power(design, s) -> list[Finding]:
    rated = ratings().coax.get(design.feed.coax)
    if rated is None:
        return []
    f = design.frequency_hz
    pep = design.power.transmitter_w
    duty = design.power.duty_factor
    avg = pep * duty
    rho = _coax_rho(design, s)
    derate = (1 + rho) ** 2
    allowed = rated.power_at(f) / derate
    if avg <= allowed:
        return []
    lost = pep - s.power_at_tap_w
    length = units.format_length(s.feed_coax_m, design.output.units)
    per_m = lost * duty / max(s.feed_coax_m, 1e-9)
    derated = (f", {_w(allowed)} at the SWR {(1 + rho) / (1 - rho):.2f} on the coax (its current "
               f"maxima carry {1 + rho:.2f} x the matched current)" if rho > 0.01 else "")
    return [Finding(
        part=f"coax ({design.feed.coax})", anchor="coax",
        figure=(f"{_w(avg)} average ({_w(pep)} PEP at the {design.power.mode} duty factor "
                f"{_pct(duty)}) at {units.format_frequency(f)}; it would burn {_w(lost)} PEP "
                f"({_w(lost * duty)} average, {_w(per_m)} per metre) in its {length}"),
        rating=(f"rated about {_w(rated.power_at(f))} average there, matched{derated} "
                f"({_how_sure(rated.power_source)})"),
        change=(f"use {_next_coax(design, f, avg * derate)}, or run at most "
                f"{_w(allowed / duty)} PEP"))]


def _coax_voltage(design, s) -> list[Finding]:
    pep = design.power.transmitter_w
    rho = _coax_rho(design, s)
    v = coax_peak_voltage(pep, design.feed.coax_z0_ohm, rho)
    need = v * VOLTAGE_MARGIN
    out = []
    rated = ratings().coax.get(design.feed.coax)
    if rated is not None and need > rated.working_voltage_rms * math.sqrt(2):
        limit = rated.working_voltage_rms * math.sqrt(2)
        out.append(Finding(
            part=f"coax ({design.feed.coax})", anchor="coax",
            figure=f"{_v(v)} peak on the coax at {_w(pep)} PEP, {_v(need)} with the {_margin_words()}",
            rating=(f"its working voltage is {_v(rated.working_voltage_rms)} rms, {_v(limit)} peak "
                    f"({_how_sure(rated.voltage_source)})"),
            change=f"use a larger cable, or run at most {_w(_power_for(pep, need, limit))} PEP"))
    conn = connector_for(design.frequency_hz)
    if need > conn.working_voltage_peak:
        out.append(Finding(
            part=f"coax connectors, {conn.label}", anchor="coax",
            figure=f"{_v(v)} peak on the coax at {_w(pep)} PEP, {_v(need)} with the {_margin_words()}",
            rating=f"rated {_v(conn.working_voltage_peak)} peak ({_how_sure(conn.source)})",
            change=(("use type N connectors" if conn.name != "N" else "use larger connectors (7/16 DIN)")
                    + f", or run at most {_w(_power_for(pep, need, conn.working_voltage_peak))} PEP")))
    return out


def lowest_live_point(design: "Design", s: "Solution") -> tuple[float, str]:
    """Height above ground of the antenna's lowest conductor, m, and what it is: the solution's
    lowest live point (solver.Parts: the bottom of the stub, or a sloper's far end if lower); for a
    vertical, whose short is on the mast, the short's height."""
    if s.parts.lowest_point_m is None:
        return design.site.height_m, "the short at the bottom of the stub"
    return s.parts.lowest_point_m, s.parts.lowest_point


def _reach(design, s) -> list[Finding]:
    low, what = lowest_live_point(design, s)
    if low >= REACH_M:
        return []
    u = design.output.units
    raise_by = REACH_M - low
    key = "site.height"
    inverted = design.site.orientation == "inverted"
    carries = (f"and carries up to {_v(s.voltage_far_end_v_peak)} peak" if inverted else
               f"and the stub above it carries up to {_v(s.voltage_open_end_v_peak)} peak at its open top")
    return [Finding(
        part="lowest live point", anchor="reach",
        figure=f"{what} is {units.format_length(low, u)} above ground, {carries}",
        rating=(f"a standing person reaches {units.format_distance(REACH_M, u)} (the arm's reach of "
                "IEC 60364-4-41, from memory)"),
        change=(f"raise the {'short' if design.site.orientation in ('vertical', 'inverted') else 'open top'} "
                f"({key}) by at least {units.format_length(raise_by, u)} (to "
                f"{units.format_length(design.site.height_m + raise_by, u)}), or fence off the ground "
                f"under {'it' if inverted else 'the stub'} so that nobody can reach it"))]


def _exposure_reach(design, s) -> list[Finding]:
    low, what = lowest_live_point(design, s)
    d = s.exposure.distance_general_m
    if low - PERSON_M >= d:
        return []
    u = design.output.units
    radius = math.sqrt(d ** 2 - (low - PERSON_M) ** 2) if low > PERSON_M else d
    down = (f"down to {units.format_length(low - d, u)} above ground" if low - d > 0 else
            "to the ground")
    return [Finding(
        part="RF exposure", anchor="exposure",
        figure=(f"the general-public distance, {units.format_distance(d, u)} from any part of the "
                f"antenna, reaches from {what} ({units.format_length(low, u)} up) {down}, where "
                "people stand"),
        rating=(f"a standing person is taken as {units.format_distance(PERSON_M, u)} tall (common "
                "practice)"),
        change=(f"keep people off the ground within {units.format_distance(radius, u)} of the "
                f"antenna's low parts while transmitting, or raise the antenna so that its lowest part "
                f"is at least {units.format_length(d + PERSON_M, u)} up, or lower the average power"))]


# ----------------------------------------------------------------------------------------------
# Assumptions the sheet must state

def assumptions(design: "Design", s: "Solution") -> tuple[str, ...]:
    """What the figures assume that the builder may not: a line without a given loss is lossless,
    ratings recalled rather than published, no rating known for a line given by its figures."""
    out = []
    st = design.stub
    if st.kind == "nominal" and st.name == "custom" and not st.loss_db_per_100ft:
        out.append("The stub line is given by its impedance and velocity factor without `loss`, so it "
                   "is treated as lossless: the efficiency is an upper bound (a real line of this kind "
                   "loses some of the power in the stub). Give stub.line.loss as [frequency, dB per "
                   "100 ft] pairs from the maker's sheet or a measurement")
    if stub_voltage_rating(design) is None:
        out.append("No voltage rating is known for this stub line (given by its figures, or with a "
                   "solid dielectric): its voltage is not checked; compare the open-end voltage with "
                   "the maker's rating")
    r = ratings()
    recalled = []
    rated_line = r.stub_lines.get(st.name)
    if rated_line is not None and _how_sure(rated_line.source) == "from memory":
        recalled.append(f"the {st.name} line's voltage and power")
    coax = r.coax.get(design.feed.coax)
    if coax is not None:
        if _how_sure(coax.power_source) == "from memory":
            recalled.append(f"the {design.feed.coax}'s power")
        if _how_sure(coax.voltage_source) == "from memory":
            recalled.append(f"the {design.feed.coax}'s working voltage")
    conn = connector_for(design.frequency_hz)
    if _how_sure(conn.source) == "from memory":
        recalled.append(f"the {conn.name} connector's voltage")
    if design.site.orientation != "vertical" or design.hung:
        recalled.append("the end insulators' voltage")
    if not s.parts.rigid_stub:
        recalled.append("the wire's current")
    if recalled:
        out.append("Ratings from memory, not confirmed in a published table: " + ", ".join(recalled)
                   + "; check the makers' sheets of the parts you buy")
    return tuple(out)
