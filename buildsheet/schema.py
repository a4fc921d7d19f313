"""The design file's schema (schema 1) as one table: every key with its kind, default, accepted range
and the reason for it, plus the cross-checks that are not one key's range. It owns the facts only:
design.py's validator walks this table, and the README's "design file" and "Limits" tables are
generated from it (`python -m buildsheet.schema README.md` rewrites them; a test checks they match).

Adding a key: add a `Key` row here (in the place the README should list it), add its field to the
dataclass in design.py that carries it, and read it there with `self.value("the.key")`.

This module imports nothing of buildsheet but units and yamlread's limits: it is read by the
validator, the record and fit modules and the README generator alike.
"""

from __future__ import annotations

import math
import re
import sys
from dataclasses import dataclass
from typing import Callable

from buildsheet import units
from buildsheet.valueclass import valueclass
from buildsheet.yamlread import MAX_BYTES, MAX_DEPTH, MAX_NODES

SCHEMA = 1
#: the design frequencies the model is built and tested for: the amateur bands 160 m to 70 cm
F_MIN_HZ = 1.8e6
F_MAX_HZ = 450e6
#: longest text read as a quantity; "16' 4-3/8\"" or "1.6277 mm" are far shorter, and the number
#: parsers are not handed thousands of digits
MAX_QUANTITY_CHARS = 64

#: no default: the key is required
REQUIRED = object()
#: no default: the key is optional and its absence means something (see `shown`)
ABSENT = None


@valueclass
class Key:
    """One key of the design file.

    path: dotted; `N` stands for a list index (`record.N.swr`).
    kind: a units kind (frequency, length, impedance, power, fraction, angle, conductivity) read as
      a quantity with a unit; `wire` (gauge or diameter); `number` (bare); `choice` (of `choices`);
      `catalogue` (a name of catalogue kind `choices`; a `choice` whose `choices` is a catalogue kind
      takes the catalogue's names); `text` (at most `hi` characters); `mapping`
      (keys are the rows below it); `form` (a name or a mapping; the mapping's keys are the rows below
      it, `forms` tells which belong to which variant); `list` (of mappings: the rows `path.N.*`).
    default: REQUIRED, ABSENT, a value as a user writes it, or a function of the ITU region.
    shown: the default as the README shows it, where it is not the plain value.
    lo, hi: the accepted range in SI units (inclusive), with `why` the rest is refused; `show` formats
      a value for error messages, `readme` for the README (default: `show`).
    unit, meaning: the README's columns; a row without meaning is not listed in the defaults table
      (the keys of a form or an entry, described in their parent's row).
    forms: for a form's keys, the variants the key belongs to (`required_in`: where it is required).
    unknown: for a mapping, form or list, how an unknown key below it is described.
    """
    path: str
    kind: str
    default: object = ABSENT
    shown: str | None = None
    lo: float | None = None
    hi: float | None = None
    why: str = ""
    show: Callable | None = None
    readme: Callable | None = None
    unit: str | None = None
    meaning: str = ""
    choices: object = None
    forms: tuple = ()
    required_in: tuple = ()
    unknown: str = ""
    accepted: str = "{lo} to {hi}"
    cell: str | None = None

    @property
    def name(self) -> str:
        return self.path.rpartition(".")[2]

    @property
    def parent(self) -> str:
        return self.path.rpartition(".")[0]

    @property
    def required(self) -> bool:
        return self.default is REQUIRED

    def default_for(self, region: int | None = None):
        """The default as a user would write it (None for a required or absent-able key)."""
        if self.default is REQUIRED:
            return None
        return self.default(region) if callable(self.default) else self.default

    def accepted_text(self) -> str:
        fmt = self.readme or self.show or (lambda v: f"{v:g}")
        return self.accepted.format(lo=fmt(self.lo), hi=fmt(self.hi))


@valueclass
class Rule:
    """A limit that is not one key's own range: a cross-check between keys, a check on the solved
    geometry, or a limit on the whole file. `value` is the number the code checks against, and
    `accepted` shows it ({value})."""
    name: str
    cell: str
    accepted: str
    why: str
    value: float | None = None

    def accepted_text(self) -> str:
        return self.accepted.format(value=f"{self.value:g}" if self.value is not None else "")


# -- formatters of SI values, for messages and the README ------------------------------------------

def mm(m: float) -> str:
    return f"{m * 1e3:.3g} mm"


def metres(m: float) -> str:
    return f"{m:.2f} m"


def ohm(r: float) -> str:
    return f"{r:g} ohm"


def deg(rad: float) -> str:
    return f"{math.degrees(rad):.3g} deg"


def _g(unit: str, scale: float = 1.0) -> Callable:
    return lambda v: f"{v * scale:g} {unit}"


def _loss_frequency(hz: float) -> str:
    return units.format_frequency(hz) if hz >= 1e3 else f"{hz:g} Hz"


def _power(w: float) -> str:
    return f"{w / 1e3:g} kW" if w >= 1e3 else f"{w:g} W"


def _by_region(region_2, elsewhere) -> Callable:
    return lambda region: region_2 if region == 2 else elsewhere


_WIRE = dict(kind="wire", lo=0.2e-3, hi=60e-3, show=mm)
_CALIBRATION = dict(kind="number", lo=0.5, hi=2.0,
                    why="a fit that moves a parameter by more than a factor 2 fitted something else")
_ENTRY_LENGTH = dict(kind="length", lo=0.0)     # as-built lengths: greater than zero (see design.py)

TABLE: tuple = (
    Rule("file_size", "(file size)", f"at most {MAX_BYTES // 2**20} MiB",
         "a design is a few lines of YAML; a larger file is a mistake (or an attack on the reader)"),
    Rule("nesting", "(nesting)", f"at most {MAX_DEPTH} levels deep",
         "the schema nests four levels; deeper documents only exhaust the reader"),
    Rule("values", "(values)", f"at most {MAX_NODES} values, each alias expansion counted",
         "an alias bomb (\"billion laughs\") expands a small file into millions of values"),
    Rule("text", "(text)", "UTF-8, with or without a byte-order mark, LF or CRLF line ends; no tabs",
         "YAML forbids tabs in indentation (PyYAML also between tokens); other encodings would be misread"),
    Rule("tags", "(tags and keys)", "YAML's core tags only; keys are plain names, each given once; no "
         "merge key `<<`", "other tags construct objects; a repeated or merged key hides which value counts"),
    Rule("quantity", "(any quantity)", "at most {value} characters",
         "a number and a unit are a few characters; thousands of digits only load the parser",
         MAX_QUANTITY_CHARS),

    Key("buildsheet", "number", REQUIRED, unit="number", meaning=f"schema version, `{SCHEMA}`"),
    Key("name", "text", REQUIRED, lo=1, hi=64, accepted="{lo} to {hi} characters",
        why="a slug `[a-z0-9-]` used in file names",
        meaning="slug `[a-z0-9-]`, 1-64 characters, used in file names"),
    Key("title", "text", ABSENT, "the name", lo=0, hi=120, accepted="at most {hi} characters",
        why="it has to fit the title block of every page", meaning="title printed on every page"),
    Key("region", "number", 2, lo=1, hi=3, accepted="1, 2 or 3", why="the ITU regions",
        meaning="ITU region 1, 2 or 3 (chooses the band edges)"),
    Key("country", "text", ABSENT, "(none: the ITU table of `region`)", unit="code",
        meaning="`US`: national band edges where they differ from the ITU table (70 cm 420-450 MHz, "
                "1.25 m 222-225 MHz; 47 CFR 97.301)"),
    Key("frequency", "frequency", REQUIRED, lo=F_MIN_HZ, hi=F_MAX_HZ, show=units.format_frequency,
        readme=_g("MHz", 1e-6),
        why="the amateur bands from 160 m to 70 cm, the range the model is tested over",
        meaning="design frequency (1.8-450 MHz): the feed is matched here"),
    Key("band", "list", ABSENT, "the amateur band containing `frequency` in `region`",
        unit="[frequency, frequency]", meaning="the band the sheet predicts SWR over"),
    Rule("band_ratio", "`band`", "high edge at most {value} × the low edge",
         "a single-band antenna covers one band", 1.5),
    Key("band.0", "frequency", lo=F_MIN_HZ * 0.9, hi=F_MAX_HZ * 1.1, show=units.format_frequency,
        readme=_g("MHz", 1e-6), why="10 % around the frequency range"),
    Key("band.1", "frequency", lo=F_MIN_HZ * 0.9, hi=F_MAX_HZ * 1.1, show=units.format_frequency,
        readme=_g("MHz", 1e-6), why="10 % around the frequency range"),

    Key("construction", "choice", ABSENT,
        "inferred: `wire`, with pipe or rod parts where a conductor is 4 mm or thicker",
        choices=("wire", "tube", "twin-lead", "hung"),
        meaning="how it is built: `wire` (wire radiator on a two-wire line stub, on a mast or between "
                "supports), `tube` (rigid pipe or rod: one long element is the radiator and one stub "
                "conductor), `twin-lead` (one piece of twin-lead or window line: the radiator is one of "
                "its conductors above a gap), `hung` (a wire vertical hung by a rope from a tree or a "
                "halyard: rope and insulators, no mast hardware; `site.orientation` vertical or "
                "inverted)"),
    Rule("construction_fits", "`construction`",
         "`tube`: radiator and stub conductors of one pipe or rod size, {value} mm or thicker, vertical; "
         "`twin-lead`: a catalogue twin-lead or window line, the radiator its own conductor in its "
         "jacket, vertical; `hung`: a wire radiator (thinner than {value} mm), vertical or inverted",
         "what can be built that way: one continuous pipe is the radiator and a stub conductor; a "
         "bent piece of twin-lead takes the radiator's pull on one peeled conductor", 4),

    Key("radiator", "mapping", unknown="is not a key of a design file"),
    Key("radiator.wire", default=REQUIRED, unit="gauge or length",
        why="finer wire cannot carry its own weight; thicker is not wire, pipe or rod",
        meaning="radiator conductor: `14 AWG`, `1.6 mm`, `15.9 mm` pipe", **_WIRE),
    Rule("wire_vs_wavelength", "`radiator.wire`", "at most 1/{value} of a wavelength",
         "the thickest conductor the model is proven to: the FDTD reference's 1.25 m 3/4-in pipe "
         "(22.2 mm at 223.5 MHz, bench/data/fdtd-jpoles-c3.json)", 60),
    Key("radiator.material", "catalogue", "copper", choices="material",
        meaning="copper, copper-clad-steel, aluminium, bronze"),
    Key("radiator.insulation", "form", "bare", choices="insulation", unit="name or mapping",
        unknown="is not a key of `radiator.insulation`; write `{velocity_factor: 0.95}` or a name "
                "(bare, pvc, polyethylene)",
        meaning="bare, pvc, polyethylene, or `{velocity_factor: 0.95}`"),
    Key("radiator.insulation.velocity_factor", "number", lo=0.80, hi=1.0, forms=("custom",),
        required_in=("custom",), why="a jacket slows a wire by a few percent, never more than 20 %"),

    Key("stub", "mapping", unknown="is not a key of a design file"),
    Key("stub.line", "form", REQUIRED, choices="stub_line", unit="name or mapping",
        unknown="is not a key of this kind of line",
        meaning="catalogue line (`window-450`, `twinlead-300`, `open-wire-600`, ...), or "
                "`{spacing, conductor, dielectric, material}` by geometry, or "
                "`{impedance, velocity_factor, loss, spacing, conductor}` as measured"),
    # a measured line's spacing and conductor are only drawn: typical window line's (common practice)
    Key("stub.line.spacing", "length", "25 mm", lo=1e-3, hi=1.0, show=mm,
        readme=lambda m: f"{m * 1e3:g} mm" if m < 1 else f"{m:g} m", forms=("geometry", "nominal"),
        required_in=("geometry",), why="the range of home-made and manufactured two-wire lines"),
    Key("stub.line.conductor", default="16 AWG", forms=("geometry", "nominal"), required_in=("geometry",),
        why="as for the radiator", **_WIRE),
    Key("stub.line.dielectric", "catalogue", "air", choices="dielectric", forms=("geometry",)),
    Key("stub.line.material", "catalogue", choices="material", forms=("geometry",)),
    Rule("spacing_vs_conductor", "`stub.line`", "spacing more than {value} × the conductor diameter",
         "the conductors would touch", 1.05),
    Rule("spacing_vs_wavelength", "`stub.line`", "spacing at most 1/{value} of a wavelength",
         "a wider line radiates instead of acting as a stub", 20),
    Key("stub.line.impedance", "impedance", lo=50.0, hi=1000.0, show=ohm, forms=("nominal",),
        required_in=("nominal",), why="the impedances two-wire lines can have"),
    Key("stub.line.velocity_factor", "number", lo=0.5, hi=1.0, forms=("nominal",),
        required_in=("nominal",), why="no two-wire line is slower; nothing is faster than light"),
    Key("stub.line.loss", "list", forms=("nominal",)),
    Key("stub.line.loss.N.0", "frequency", lo=1e6, hi=3e9, show=_loss_frequency,
        readme=lambda hz: f"{hz / 1e9:g} GHz" if hz >= 1e9 else f"{hz / 1e6:g} MHz",
        accepted="points from {lo} to {hi}", cell="`stub.line.loss`",
        why="the range cable data cover; the loss law is not extrapolated from elsewhere"),
    Key("stub.line.loss.N.1", "number", lo=0.0, hi=100.0, accepted="{lo} to {hi} dB per 100 ft",
        cell="`stub.line.loss`", why="matched loss of a real line"),
    Key("stub.conductor_material", "catalogue", "copper", choices="material",
        meaning="conductor material of the stub line"),

    Key("feed", "mapping", unknown="is not a key of a design file"),
    Key("feed.coax", "catalogue", "RG-8X", choices="coax",
        meaning="coax from the tap to the transmitter (RG-58, RG-8X, RG-213, ...)"),
    Key("feed.impedance", "impedance", ABSENT, "the coax's impedance", lo=10.0, hi=600.0, show=ohm,
        why="what a coax or balun feed can present", meaning="the impedance the tap is matched to"),
    Key("feed.length", "length", "15 m", lo=0.0, hi=500.0, show=metres, readme=_g("m"),
        why="a run to the station, not a cable drum", meaning="the coax's run from the tap to the transmitter (the cut list adds the choke's turns "
                "and a pigtail; the station-end figures go through all of it)"),
    Key("feed.choke_form", "length", "110 mm", lo=10e-3, hi=0.6, show=mm,
        why="something coax can be wound on",
        meaning="outer diameter of the form the choke's coax is wound on"),

    Key("site", "mapping", unknown="is not a key of a design file"),
    Key("site.orientation", "choice", REQUIRED, choices=("horizontal", "sloper", "vertical", "inverted"),
        meaning="horizontal, sloper, vertical, or inverted (upside down: the short at the top, the "
                "stub above, the radiator hanging below it)"),
    Key("site.height", "length", REQUIRED, lo=0.0, hi=300.0, show=metres, readme=_g("m"),
        why="a mast or a tree, not an aircraft",
        meaning="horizontal/sloper: height of the stub's open top; vertical and inverted: height of "
                "the short (inverted: the top of the antenna)"),
    Rule("stub_clears_ground", "`site.height`",
         "horizontal and sloper: the stub's short at least {value} m above ground",
         "the stub hangs from the open top; its short must clear the ground (checked on the solved "
         "stub, calibration included)", 0.3),
    Key("site.slope", "angle", "30 deg", "`30 deg` (sloper only)", lo=math.radians(5),
        hi=math.radians(80), show=deg, why="flatter is horizontal, steeper is vertical",
        meaning="sloper: radiator angle below horizontal"),
    Rule("far_end_clears_ground", "`site.slope`", "the radiator's far end at least {value} m above ground",
         "the wire must clear the ground (checked on the solved radiator)", 0.3),
    Rule("hanging_end_clears_ground", "`site.height`",
         "inverted: the radiator's far end (the short's height less the stub and the radiator) at least "
         "{value} m above ground",
         "the radiator hangs below the stub; its far end must clear the ground (checked on the solved "
         "stub and radiator; NEC-2 SWR 1.08 with the far end 0.37 m up on 10 m, bench/inverted_nec.py)", 0.3),
    Key("site.ground", "form", "average", choices="ground", unit="name or mapping",
        unknown="is not a key of a ground",
        meaning="free-space, perfect, poor, average, very-good, sea-water, or "
                "`{permittivity: 13, conductivity: 0.005 S/m}`"),
    Key("site.ground.permittivity", "number", lo=1.0, hi=100.0, forms=("custom",), required_in=("custom",),
        why="from dry sand to sea water"),
    Key("site.ground.conductivity", "conductivity", lo=1e-5, hi=10.0, show=_g("S/m"),
        readme=lambda v: f"{v:.5f}".rstrip("0").rstrip(".") + " S/m", forms=("custom",),
        required_in=("custom",), why="from rock to sea water"),

    Key("stack", "mapping", ABSENT, "(none: a single half-wave)", unknown="is not a key of `stack`",
        meaning="a second half-wave stacked beyond the radiator's far end, fed in phase through a "
                "phasing section (the collinear version); horizontal or vertical"),
    Key("stack.phasing", "choice", "stub", choices=("stub", "coil"),
        meaning="`stub`: a shorted quarter wave of the stub's line; `coil` is refused for now "
                "(not yet modelled and proven)"),

    Key("power", "mapping", unknown="is not a key of a design file"),
    Key("power.transmitter", "power", "100 W", lo=0.1, hi=10_000.0, show=_g("W"), readme=_power,
        why="low-power to the largest amateur licences", meaning="PEP at the transmitter"),
    Key("power.mode", "choice", "ssb", choices="mode",
        meaning="ssb, cw, fm or digital: the duty factor for exposure"),
    Key("power.on_air", "fraction", "100 %", lo=0.01, hi=1.0, show=_g("%", 100), unit="percent",
        why="a share of the averaging time",
        meaning="share of the averaging time spent transmitting (100 % is conservative)"),
    Key("power.exposure_standard", "choice", _by_region("us-fcc", "icnirp-2020"),
        "us-fcc in region 2, icnirp-2020 elsewhere", choices=("us-fcc", "icnirp-2020"),
        meaning="`us-fcc` (47 CFR 1.1310) or `icnirp-2020`"),

    Key("output", "mapping", unknown="is not a key of a design file"),
    Key("output.units", "choice", _by_region("imperial", "metric"), "imperial in region 2, metric elsewhere",
        choices=("imperial", "metric"),
        meaning="imperial (feet and inches to 1/8 in) or metric (to the mm)"),
    Key("output.paper", "choice", _by_region("letter", "a4"), "letter in region 2, a4 elsewhere",
        choices=("letter", "a4"), meaning="letter or a4"),

    Key("calibration", "mapping", {}, "`{}` (none)", unknown="is not a calibration parameter",
        meaning="fitted model parameters, written by `buildsheet fit --write`"),
    Key("calibration.radiator_scale", default=1.0, **_CALIBRATION),
    Key("calibration.end_resistance_scale", default=1.0, **_CALIBRATION),
    Key("calibration.stub_velocity_scale", default=1.0, **_CALIBRATION),
    Key("calibration.source", "text", hi=200),
    Key("calibration.date", "text", hi=200),

    Key("record", "list", [], "`[]` (none)", unknown="is not a key of an as-built entry",
        meaning="as-built entries `{date, site, radiator, stub, tap, resonance, swr, note, readings}`; "
                "`readings` is a list of `{frequency, swr, r, x}` (r and x optional), as the sheet's "
                "measurement log has them"),
    Key("record.N.date", "date", REQUIRED),
    Key("record.N.site", "text", hi=500),
    Key("record.N.radiator", **_ENTRY_LENGTH),
    Key("record.N.stub", **_ENTRY_LENGTH),
    Key("record.N.tap", **_ENTRY_LENGTH),
    Key("record.N.resonance", "frequency", lo=0.0),
    Key("record.N.swr", "number", lo=1.0, hi=100.0, why="an SWR reading"),
    Key("record.N.note", "text", hi=500),
    Key("record.N.readings", "list", [], unknown="is not a key of a reading (frequency, swr, r, x)"),
    Key("record.N.readings.N.frequency", "frequency", REQUIRED, lo=0.0),
    Key("record.N.readings.N.swr", "number", REQUIRED, lo=1.0, hi=100.0, why="an SWR reading"),
    Key("record.N.readings.N.r", "impedance"),
    Key("record.N.readings.N.x", "impedance"),
)

KEYS: dict[str, Key] = {row.path: row for row in TABLE if isinstance(row, Key)}
RULES: dict[str, Rule] = {row.name: row for row in TABLE if isinstance(row, Rule)}


def row(path: str) -> Key:
    """The row of a concrete key path (`record.3.swr` -> `record.N.swr`)."""
    if path in KEYS:
        return KEYS[path]
    return KEYS[re.sub(r"(?<=\.)\d+(?=\.)", "N", path)]


def children(path: str, form: str | None = None) -> tuple:
    """The rows directly below `path` (`path.N.*` for a list), of variant `form` if given."""
    prefix = path + (".N." if KEYS.get(path) and KEYS[path].kind == "list" else ".")
    return tuple(r for r in KEYS.values() if r.path.startswith(prefix) and "." not in r.path[len(prefix):]
                 and (form is None or form in r.forms))


def top_level() -> tuple:
    return tuple(r for r in KEYS.values() if "." not in r.path)


#: the defaults as the README shows them, key -> text
DEFAULTS: dict[str, str] = {r.path: r.shown or str(r.default_for(2))
                            for r in KEYS.values() if r.meaning and not r.required
                            and (r.default is not ABSENT or r.shown)}
#: the keys of an as-built entry, in the order `record` writes them
ENTRY_KEYS: tuple = tuple(r.name for r in children("record"))
#: the fitted model parameters and their accepted range
CALIBRATION_PARAMETERS: tuple = tuple(r.name for r in children("calibration") if r.kind == "number")
CALIBRATION_RANGE: tuple = (KEYS["calibration.radiator_scale"].lo, KEYS["calibration.radiator_scale"].hi)
assert all((KEYS[f"calibration.{p}"].lo, KEYS[f"calibration.{p}"].hi) == CALIBRATION_RANGE
           for p in CALIBRATION_PARAMETERS)


# -- the README's tables -----------------------------------------------------------------------------

_UNIT_OF_KIND = {"number": "number", "text": "text", "choice": "name", "catalogue": "name",
                 "mapping": "mapping", "list": "list"}


def defaults_table() -> str:
    lines = ["| key | unit | default | meaning |", "| --- | --- | --- | --- |"]
    for r in KEYS.values():
        if not r.meaning:
            continue
        if r.required:
            default = "required"
        elif r.shown:
            default = r.shown
        else:
            default = f"`{r.default_for(2)}`"
        unit = r.unit or _UNIT_OF_KIND.get(r.kind, r.kind)
        lines.append(f"| `{r.path}` | {unit} | {default} | {r.meaning} |")
    return "\n".join(lines)


def limit_rows() -> list[tuple[str, str, str]]:
    """(key cell, accepted, why) of each limit, in the table's order; keys with the same range and
    reason share a row."""
    rows: list[list[str]] = []
    for r in TABLE:
        if isinstance(r, Rule):
            rows.append([r.cell, r.accepted_text(), r.why])
        elif r.why:
            cell, accepted = r.cell or f"`{r.path}`", r.accepted_text()
            if rows and rows[-1][1:] == [accepted, r.why] and cell not in rows[-1][0]:
                rows[-1][0] += f", {cell}"
            else:
                rows.append([cell, accepted, r.why])
    return [tuple(x) for x in rows]


def limits_table() -> str:
    lines = ["| key | accepted | why the rest is refused |", "| --- | --- | --- |"]
    lines += [f"| {k} | {a} | {w} |" for k, a, w in limit_rows()]
    return "\n".join(lines)


_MARKS = {"defaults": defaults_table, "limits": limits_table}


def readme_with_tables(text: str) -> str:
    """`text` with each block between `<!-- schema:NAME -->` and `<!-- /schema:NAME -->` replaced by
    the table generated from the schema."""
    for name, table in _MARKS.items():
        pattern = re.compile(rf"(<!-- schema:{name} -->\n).*?(\n<!-- /schema:{name} -->)", re.S)
        if not pattern.search(text):
            raise ValueError(f"no `<!-- schema:{name} -->` ... `<!-- /schema:{name} -->` block")
        text = pattern.sub(lambda m: m.group(1) + table() + m.group(2), text, count=1)
    return text


def main(argv: list[str]) -> int:
    """`python -m buildsheet.schema README.md`: rewrite the README's schema tables in place."""
    if len(argv) != 1:
        print("usage: python -m buildsheet.schema README.md", file=sys.stderr)
        return 2
    with open(argv[0], encoding="utf-8") as f:
        old = f.read()
    new = readme_with_tables(old)
    if new != old:
        with open(argv[0], "w", encoding="utf-8") as f:
            f.write(new)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
