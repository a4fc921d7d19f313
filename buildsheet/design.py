"""The design file: validation against the schema (buildsheet/schema.py), defaults, the frozen Design
in SI units, the canonical form and the document ID. It does no physics and no output.

Data flow: text --yamlread.parse--> Document (values + line numbers) --validate--> Design.
Every problem is a DesignError naming the file, the key, its line and what is wrong. The validator
walks schema.TABLE: unknown and missing keys, each key's kind, default and range; what stays code here
is only what the table cannot say (the forms of `stub.line`, `site.ground` and `radiator.insulation`,
the as-built entries, and the cross-checks between keys). Checks that need the solved geometry (the
ground clearance of the stub and of the radiator's far end) are in solver.py.
"""

from __future__ import annotations

import dataclasses
import functools
import hashlib
import json
import os
import re
import unicodedata
from dataclasses import field
from datetime import date, datetime, timezone

from buildsheet import schema, units
from buildsheet.catalog import catalog, countries, national_bands
from buildsheet.errors import BuildsheetError, DesignError, one_line
from buildsheet.schema import CALIBRATION_PARAMETERS, DEFAULTS, MAX_QUANTITY_CHARS, RULES, SCHEMA, mm
from buildsheet.valueclass import valueclass
from buildsheet.yamlread import Document, parse, read_text

__all__ = ["DEFAULTS", "CALIBRATION_PARAMETERS", "Design", "design_from_text", "load_design"]

#: the speed of light in vacuum, m/s (exact: SI definition of the metre, 1983)
C0 = 299_792_458.0

_NAME_RE = re.compile(r"[a-z0-9](?:[a-z0-9-]{0,62}[a-z0-9])?\Z")
#: Unicode categories refused in text printed on the sheet: control characters (tab excepted),
#: lone surrogates (not encodable), line and paragraph separators
_BAD_TEXT_CATEGORIES = ("Cc", "Cs", "Zl", "Zp")
#: what a form's missing key needs, by (form, variant)
_MISSING_WHY = {
    ("stub.line", "nominal"): " (a line given by its impedance needs both impedance and velocity_factor)",
    ("stub.line", "geometry"): " (a line given by geometry needs spacing and conductor)",
}
_FROM_TABLE = object()


# ----------------------------------------------------------------------------------------------
# The validated design (SI units, defaults filled)

@valueclass
class Radiator:
    """The radiator wire: diameter_m, the gauge as written (label), conductor and insulation.
    velocity_factor_spread (low, high) and spread_source: the catalogue jacket's range of velocity
    factors and where it comes from; None for bare wire and for a figure given in the design file
    (insulation 'custom': the builder's own)."""
    diameter_m: float
    label: str
    material: str
    conductivity_s_m: float
    insulation: str
    velocity_factor: float
    velocity_factor_spread: tuple | None = None
    spread_source: str = ""


@valueclass
class StubLine:
    """The stub's two-wire line.  kind 'nominal': a manufactured line given by measured Z0, VF and
    loss; kind 'geometry': computed from spacing, conductor and dielectric.  spacing_m and
    conductor_diameter_m are known for both (typical values for catalogue lines).
    velocity_factor_spread (low, high) and spread_source: a catalogue line's range of velocity
    factors and where it comes from; None for a line given in the design file (by measured figures:
    the builder's own; by geometry: computed)."""
    kind: str
    name: str
    spacing_m: float
    conductor_diameter_m: float
    conductor_material: str
    conductivity_s_m: float
    z0_ohm: float | None
    velocity_factor: float | None
    loss_db_per_100ft: tuple
    dielectric: str
    eps_r: float
    tan_delta: float
    source: str
    velocity_factor_spread: tuple | None = None
    spread_source: str = ""


@valueclass
class Feed:
    """The feed: the coax (name, Z0, velocity factor, outer diameter, matched loss), the feed
    impedance, the coax length and the choke form, SI."""
    coax: str
    coax_z0_ohm: float
    coax_velocity_factor: float
    coax_outer_diameter_m: float
    coax_loss_db_per_100ft: tuple
    impedance_ohm: float
    length_m: float
    choke_form_m: float


@valueclass
class Site:
    """Where the antenna goes: orientation, height and slope, and the ground (name, kind,
    permittivity, conductivity)."""
    orientation: str
    height_m: float
    slope_rad: float
    ground: str
    ground_kind: str
    permittivity: float
    conductivity_s_m: float


@valueclass
class Power:
    """The transmitter power, mode, duty factor, time on the air and the exposure standard."""
    transmitter_w: float
    mode: str
    duty_factor: float
    on_air: float
    exposure_standard: str


@valueclass
class Output:
    """The sheet's units and paper."""
    units: str
    paper: str


@valueclass
class Calibration:
    """Fitted model parameters written by `fit --write` (empty: the model as published)."""
    radiator_scale: float = 1.0
    end_resistance_scale: float = 1.0
    stub_velocity_scale: float = 1.0
    source: str = ""
    date: str = ""

    @property
    def is_empty(self) -> bool:
        return (self.radiator_scale, self.end_resistance_scale, self.stub_velocity_scale) == (1.0, 1.0, 1.0)


@valueclass
class Reading:
    """One reading of the sheet's measurement log: frequency (Hz), SWR, and R and X (ohm) if read."""
    frequency_hz: float
    swr: float
    r_ohm: float | None = None
    x_ohm: float | None = None


@valueclass
class RecordEntry:
    """One as-built entry; lengths in m, resonance in Hz, None where not measured."""
    date: str
    site: str | None = None
    radiator_m: float | None = None
    stub_m: float | None = None
    tap_m: float | None = None
    resonance_hz: float | None = None
    swr: float | None = None
    note: str | None = None
    #: the readings of the measurement log taken on the antenna as this entry records it (Reading)
    readings: tuple = ()


def latest_as_built(record: tuple) -> RecordEntry | None:
    """The as-built entry that describes the antenna as it stands: of the entries giving a radiator,
    stub or tap length, the one with the latest date (the last written of equal dates); None if none."""
    entries = [(e.date, i, e) for i, e in enumerate(record)
               if (e.radiator_m, e.stub_m, e.tap_m) != (None, None, None)]
    return max(entries, key=lambda t: t[:2])[2] if entries else None


@valueclass
class Stack:
    """The stacked version: phasing 'stub' (a shorted quarter wave of the stub's line)."""
    phasing: str = "stub"


@valueclass
class Design:
    """A validated design file in SI units (frozen): what the solver and the outputs read."""
    schema: int
    name: str
    title: str
    frequency_hz: float
    band_hz: tuple
    band_name: str | None
    region: int
    radiator: Radiator
    stub: StubLine
    feed: Feed
    site: Site
    power: Power
    output: Output
    calibration: Calibration = field(default_factory=Calibration)
    record: tuple = ()
    path: str | None = field(default=None, compare=False)
    #: the line of each key in the file, {dotted key: line}, for messages about the solved design
    lines: dict = field(default_factory=dict, compare=False, repr=False)
    #: the `country` whose national band edges were asked for (None: the ITU table of the region);
    #: not part of the canonical form: the band edges it chose are
    country: str | None = None
    #: `construction`: wire, tube, twin-lead or hung; None where the file does not say (pipe or rod
    #: parts are then inferred from the conductors' diameters, as before the key existed)
    construction: str | None = None
    #: the stacked version (`stack:`), or None: a single half-wave
    stack: "Stack | None" = None

    @property
    def hung(self) -> bool:
        """A wire vertical hung by a rope (construction: hung): rope and insulators, no mast."""
        return self.construction == "hung"

    @property
    def wavelength_m(self) -> float:
        return C0 / self.frequency_hz

    def canonical(self) -> dict:
        """The design in canonical SI form with defaults filled, leaving out what does not change
        the antenna (title, output, record, the file path).  Floats are written to 9 significant
        digits, so '14175 kHz' and '14.175 MHz' give the same form."""
        data = dataclasses.asdict(self)
        for key in ("title", "output", "record", "path", "lines", "country"):
            data.pop(key)
        if data["construction"] is None:   # an older file without the key keeps its ID
            data.pop("construction")
        if data["stack"] is None:   # a single half-wave: the document IDs of before `stack:`
            data.pop("stack")
        data["stub"].pop("source")  # where the catalogue's numbers come from is not the antenna
        for part in ("stub", "radiator"):  # nor the range the sources give for a velocity factor
            data[part].pop("velocity_factor_spread")
            data[part].pop("spread_source")
        if self.calibration.is_empty:
            data["calibration"] = {}
        else:
            data["calibration"] = {k: v for k, v in data["calibration"].items()
                                   if k in CALIBRATION_PARAMETERS}
        return _canonical_numbers(data)

    @functools.cached_property
    def document_id(self) -> str:
        """A short hash of the canonical form: 'XXXX-XXXX' (hex, upper case); computed once per
        Design (frozen, so it cannot go stale; with_changes makes a new one)."""
        text = json.dumps(self.canonical(), sort_keys=True, separators=(",", ":"), ensure_ascii=True)
        digest = hashlib.sha256(text.encode("ascii")).hexdigest()[:8].upper()
        return f"{digest[:4]}-{digest[4:]}"

    def fail(self, key: str, problem: str) -> DesignError:
        """A DesignError about `key` of this design's file (for checks on the solved design)."""
        return DesignError(problem, file=self.path, key=key, line=self.lines.get(key))

    def with_changes(self, **changes) -> "Design":
        return dataclasses.replace(self, **changes)


def _canonical_numbers(value):
    if isinstance(value, dict):
        return {k: _canonical_numbers(v) for k, v in value.items()}
    if isinstance(value, (list, tuple)):
        return [_canonical_numbers(v) for v in value]
    if isinstance(value, float):
        return float(f"{value:.9g}")
    return value


# ----------------------------------------------------------------------------------------------
# Loading

def load_design(path: str | os.PathLike) -> Design:
    """Read, parse and validate a design file; raise DesignError naming file, key and line."""
    path = os.fspath(path)
    text = read_text(path)
    return design_from_text(text, path)


def design_from_text(text: str, path: str | None = None) -> Design:
    doc = parse(text, file=path)
    return _Validator(doc, path).design()


def closest(word: str, choices) -> str | None:
    """The closest of `choices` to `word`, for "did you mean" hints."""
    import difflib      # only on a mistake

    choices = list(choices)
    lowered = {c.lower(): c for c in choices}
    match = difflib.get_close_matches(str(word).lower(), list(lowered), n=1, cutoff=0.5)
    return lowered[match[0]] if match else None


class _Validator:
    def __init__(self, doc: Document, path: str | None):
        self.doc = doc
        self.path = path
        self.data = doc.data
        self.region = 2

    # -- error helpers -----------------------------------------------------------------------
    def fail(self, key: str, problem: str) -> DesignError:
        return DesignError(one_line(problem), file=self.path, key=one_line(key) or None,
                           line=self.doc.line_of(self._path(key)))

    def _path(self, key: str) -> tuple:
        """The key path of a dotted key: a digit is a list index only where the value is a list
        (a mapping may have the key '1')."""
        node, parts = self.data, []
        for part in key.split(".") if key else ():
            if isinstance(node, list) and part.isdigit():
                part = int(part)
                node = node[part] if part < len(node) else None
            else:
                node = node.get(part) if isinstance(node, dict) else None
            parts.append(part)
        return tuple(parts)

    def get(self, key: str, default=None):
        node = self.data
        for part in key.split("."):
            if isinstance(node, dict) and part in node:
                node = node[part]
            elif isinstance(node, list) and part.isdigit() and int(part) < len(node):
                node = node[int(part)]
            else:
                return default
        return node

    def has(self, key: str) -> bool:
        sentinel = object()
        return self.get(key, sentinel) is not sentinel

    def quantity(self, key: str, kind: str, default: str | None = None) -> float:
        raw = self.get(key, default)
        if raw is None:
            raise self.fail(key, f"must be a {kind} with a unit")
        self._short_enough(key, raw)
        try:
            return units.parse_quantity(raw, kind)
        except BuildsheetError as exc:
            raise self.fail(key, exc.problem) from None

    def _short_enough(self, key: str, raw) -> None:
        if isinstance(raw, str) and len(raw) > MAX_QUANTITY_CHARS:
            raise self.fail(key, f"is {len(raw)} characters long; a quantity is a number and a unit "
                            f"of at most {MAX_QUANTITY_CHARS} characters")

    def number(self, key: str, default=None, *, lo: float, hi: float) -> float:
        raw = self.get(key, default)
        if isinstance(raw, bool) or not isinstance(raw, (int, float)):
            raise self.fail(key, f"must be a plain number from {lo:g} to {hi:g}, got {_describe(raw)}")
        if not (lo <= raw <= hi):
            # an integer may be too large for a float: describe it rather than format it
            raise self.fail(key, f"must be from {lo:g} to {hi:g}, got {_describe(raw)}")
        return float(raw)

    def text(self, key: str, default: str | None = None, *, max_len: int = 200) -> str:
        raw = self.get(key, default)
        if not isinstance(raw, str):
            raise self.fail(key, f"must be text, got {_describe(raw)}")
        if len(raw) > max_len:
            raise self.fail(key, f"is {len(raw)} characters long; at most {max_len} are allowed")
        if any(unicodedata.category(ch) in _BAD_TEXT_CATEGORIES and ch != "\t" for ch in raw):
            raise self.fail(key, "contains control characters or line breaks")
        bad = next((ch for ch in raw if not _printable(ch)), None)
        if bad is not None:  # text is printed in Vera: refuse what it has no glyph for
            raise self.fail(key, f"contains the character U+{ord(bad):04X} ({bad!r}), which the "
                            "sheet's font cannot print; write it in plain Latin letters")
        return raw

    def choice(self, key: str, choices, default: str | None = None) -> str:
        raw = self.get(key, default)
        if not isinstance(raw, str):
            raise self.fail(key, f"must be one of {', '.join(choices)}, got {_describe(raw)}")
        if raw not in choices:
            hint = closest(raw, choices)
            hint = f"; did you mean '{hint}'?" if hint else ""
            raise self.fail(key, f"must be one of {', '.join(choices)}, got '{raw}'{hint}")
        return raw

    def in_range(self, key: str, value: float, lo: float, hi: float, shown) -> float:
        if not (lo <= value <= hi):
            got = shown(value)
            # a value rounded onto the limit would look inside it ("got 0.2 mm" for 0.19999 mm)
            if value < lo and got == shown(lo):
                got = f"just under {got} ({value:.6g} in SI units)"
            elif value > hi and got == shown(hi):
                got = f"just over {got} ({value:.6g} in SI units)"
            raise self.fail(key, f"must be from {shown(lo)} to {shown(hi)}, got {got}")
        return value

    def catalogue(self, key: str, kind: str, default: str | None = None):
        raw = self.get(key, default)
        if not isinstance(raw, str):
            raise self.fail(key, f"must be a {kind.replace('_', ' ')} name, got {_describe(raw)}")
        try:
            return catalog().lookup(kind, raw)
        except BuildsheetError as exc:
            raise self.fail(key, exc.problem) from None

    def value(self, key: str, default=_FROM_TABLE):
        """The value of `key` read as its schema row says (kind, default, range)."""
        row = schema.row(key)
        if default is _FROM_TABLE:
            default = row.default_for(self.region)
        kind = row.kind
        if kind == "number":
            return self.number(key, default, lo=row.lo, hi=row.hi)
        if kind == "text":
            return self.text(key, default, max_len=row.hi)
        if kind == "choice":
            choices = catalog().names(row.choices) if isinstance(row.choices, str) else row.choices
            return self.choice(key, choices, default)
        if kind in ("catalogue", "form"):
            return self.catalogue(key, row.choices, default)
        value = self.wire(key, default) if kind == "wire" else self.quantity(key, kind, default)
        if row.hi is not None:
            self.in_range(key, value, row.lo, row.hi, row.show)
        return value

    # -- structure ---------------------------------------------------------------------------
    def refuse_unknown(self, mapping: dict, prefix: str, allowed, problem: str) -> None:
        """The one "unknown key / did you mean" check: `prefix` is the concrete dotted path with a
        trailing dot ('' at the top)."""
        for key in mapping:
            if key not in allowed:
                hint = closest(key, allowed)
                hint = f"; did you mean `{prefix}{hint}`?" if hint else ""
                raise self.fail(f"{prefix}{key}", f"{problem}{hint}")

    def check_structure(self) -> None:
        if not isinstance(self.data, dict):
            raise DesignError(f"must be a YAML mapping of keys (`buildsheet: 1`, `name:` ...), "
                              f"got {_describe(self.data)}", file=self.path, line=1)
        self._walk(self.data, "")
        for row in schema.KEYS.values():
            parent = schema.KEYS.get(row.parent)
            top = not row.parent
            if row.required and (top or parent and parent.kind == "mapping") and not self.has(row.path):
                if row.parent:
                    raise self.fail(row.parent, f"is missing the required key `{row.path}`")
                raise DesignError(f"is missing the required key `{row.path}`", file=self.path,
                                  key=row.path, line=1)

    def _walk(self, mapping: dict, prefix: str) -> None:
        """Unknown keys and mappings that are not mappings, down through the plain mappings (forms and
        lists are checked where they are read)."""
        rows = {r.name: r for r in (schema.children(prefix[:-1]) if prefix else schema.top_level())}
        problem = schema.KEYS[prefix[:-1]].unknown if prefix else "is not a key of a design file"
        self.refuse_unknown(mapping, prefix, rows, problem)
        for key, value in mapping.items():
            row = rows[key]
            if row.kind != "mapping" or (value is None and row.default is not None):
                continue
            if not isinstance(value, dict):
                keys = ", ".join(r.name for r in schema.children(row.path))
                raise self.fail(row.path, f"must be a mapping of keys ({keys}), got {_describe(value)}")
            self._walk(value, row.path + ".")

    def form(self, key: str, raw: dict, variant: str) -> None:
        """The keys of a form given as a mapping (variant: which of its mappings)."""
        rows = schema.children(key, variant)
        self.refuse_unknown(raw, key + ".", [r.name for r in rows], schema.KEYS[key].unknown)
        for row in rows:
            if variant in row.required_in and row.name not in raw:
                raise self.fail(key, f"is missing `{row.path}`{_MISSING_WHY.get((key, variant), '')}")

    # -- the design --------------------------------------------------------------------------
    def design(self) -> Design:
        self.check_structure()
        version = self.get("buildsheet")
        if version != SCHEMA or isinstance(version, bool):
            raise self.fail("buildsheet", f"must be {SCHEMA} (the schema version this buildsheet reads), "
                            f"got {version!r}")
        name = self.get("name")
        if not isinstance(name, str) or not _NAME_RE.match(name):
            raise self.fail("name", "must be a slug of 1-64 lower-case letters, digits and '-' "
                            f"(used in file names), got {_describe(name)}")
        title = self.value("title", name)
        region = int(self.value("region"))
        if self.get("region") not in (None, 1, 2, 3):
            raise self.fail("region", f"must be the ITU region 1, 2 or 3, got {self.get('region')!r}")
        self.region = region
        frequency = self.value("frequency")
        country = self.country(region)
        band, band_name = self.band(frequency, region, country)
        design = Design(schema=SCHEMA, name=name, title=title, frequency_hz=frequency, band_hz=band,
                        band_name=band_name, region=region, radiator=self.radiator(),
                        stub=self.stub_line(), feed=self.feed(), site=self.site(), power=self.power(),
                        output=Output(units=self.value("output.units"), paper=self.value("output.paper")),
                        calibration=self.calibration(), record=self.record(), path=self.path,
                        country=country, construction=self.construction(), stack=self.stack(),
                        lines={key: self.doc.line_of(self._path(key)) for key in schema.KEYS
                               if ".N." not in key and self.has(key)})
        self.cross_checks(design)
        return design

    def stack(self) -> "Stack | None":
        """The `stack` key: the stacked version, or None."""
        if not self.has("stack"):
            return None
        phasing = self.value("stack.phasing")
        if phasing == "coil":
            raise self.fail("stack.phasing", "`coil` is not modelled and proven yet; use `stub` "
                            "(a shorted quarter wave of the stub's line)")
        orientation = self.get("site.orientation")
        if orientation in ("sloper", "inverted"):
            raise self.fail("stack", f"the stacked version is not modelled and proven as "
                            f"{'a sloper' if orientation == 'sloper' else 'an inverted antenna'}; "
                            "stack a horizontal or a vertical")
        if self.has("construction") and self.get("construction") != "wire":
            raise self.fail("stack", f"the stacked version is modelled and proven as wire on a two-wire "
                            f"line (`construction: wire`), not `{self.get('construction')}`")
        return Stack(phasing=phasing)

    def country(self, region: int) -> str | None:
        """The `country` key: a code with national band edges in the catalogue (catalog.countries),
        upper case, or None."""
        if not self.has("country"):
            return None
        raw = self.get("country")
        known = countries()
        if not isinstance(raw, str) or raw.strip().upper() not in known:
            raise self.fail("country", f"must be a country code with national band edges in the "
                            f"catalogue ({', '.join(known)}), got {_describe(raw)}; for another "
                            "country give `band: [low, high]` from its national table")
        if raw.strip().upper() == "US" and region != 2:
            raise self.fail("country", f"US band edges are those of ITU region 2, but `region` is {region}; "
                            "set `region: 2`, or give `band: [low, high]` instead of `country`")
        return raw.strip().upper()

    def _found_band(self, frequency: float, region: int, country: str | None):
        """The band containing `frequency`: the country's national edges first, else the ITU
        table of the region."""
        if country is not None:
            found = next((b for b in national_bands(country)
                          if b.low_hz <= frequency <= b.high_hz), None)
            if found is not None:
                return found
        return catalog().band_containing(frequency, region)

    def band(self, frequency: float, region: int, country: str | None = None) -> tuple[tuple, str | None]:
        if self.has("band"):
            raw = self.get("band")
            if not isinstance(raw, list) or len(raw) != 2:
                raise self.fail("band", f"must be a list of two frequencies [low, high], got {_describe(raw)}")
            low, high = self.quantity("band.0", "frequency"), self.quantity("band.1", "frequency")
            if not low < high:
                raise self.fail("band", f"must be [low, high] with low below high, got "
                                f"{units.format_frequency(low)} and {units.format_frequency(high)}")
            if high / low > RULES["band_ratio"].value:
                raise self.fail("band", f"is wider than {RULES['band_ratio'].value:g}:1; a single-band "
                                "antenna covers one band")
            if not low <= frequency <= high:
                raise self.fail("frequency", f"{units.format_frequency(frequency)} is outside `band` "
                                f"{units.format_frequency(low)} to {units.format_frequency(high)}")
            self.value("band.0")
            self.value("band.1")
            found = self._found_band(frequency, region, country)
            name = found.name if found and found.low_hz <= low and high <= found.high_hz else None
            return (low, high), name
        found = self._found_band(frequency, region, country)
        if found is None:
            raise self.fail("frequency", self.outside_band(frequency, region, country))
        return (found.low_hz, found.high_hz), found.name

    def outside_band(self, frequency: float, region: int, country: str | None) -> str:
        """Why `frequency` is refused, and how to proceed: the nearest band's edges in the table
        used, the national edges that would admit it, and the `band:` key."""
        bands = catalog().bands(region)
        near = min(bands, key=lambda b: min(abs(frequency - b.low_hz), abs(frequency - b.high_hz)))
        where = f"ITU region {region}" + (f" and the {country} table" if country else "")
        text = (f"{units.format_frequency(frequency)} is not inside an amateur band of {where} (the "
                f"nearest, {near.name}, is {units.format_frequency(near.low_hz)} to "
                f"{units.format_frequency(near.high_hz)} there); ")
        admits = [c for c in countries() if c != country and any(
            b.low_hz <= frequency <= b.high_hz for b in national_bands(c))]
        if admits:
            text += f"add `country: {admits[0]}` if you operate under that national table, or "
        return text + "give `band: [low, high]` with the edges your licence allows"

    def radiator(self) -> Radiator:
        label = str(self.get("radiator.wire")).strip()
        diameter = self.value("radiator.wire")
        material = self.value("radiator.material")
        common = dict(diameter_m=diameter, label=label, material=material.name,
                      conductivity_s_m=material.conductivity_s_m)
        raw = self.get("radiator.insulation")
        if isinstance(raw, dict):
            self.form("radiator.insulation", raw, "custom")
            return Radiator(**common, insulation="custom",
                            velocity_factor=self.value("radiator.insulation.velocity_factor"))
        entry = self.value("radiator.insulation")
        return Radiator(**common, insulation=entry.name, velocity_factor=entry.velocity_factor,
                        velocity_factor_spread=entry.velocity_factor_spread,
                        spread_source=entry.spread_source)

    def stub_line(self) -> StubLine:
        raw = self.get("stub.line")
        material = self.value("stub.conductor_material")
        if isinstance(raw, str):
            entry = self.value("stub.line")
            if not self.has("stub.conductor_material"):
                material = catalog().lookup("material", entry.conductor_material or "copper")
            dielectric = catalog().lookup("dielectric", entry.dielectric or "air")
            return _line(entry.kind, entry.name, entry.spacing_m, entry.conductor_diameter_m, material,
                         dielectric.name, dielectric.eps_r, dielectric.tan_delta, entry.source,
                         z0_ohm=entry.z0_ohm, velocity_factor=entry.velocity_factor,
                         loss_db_per_100ft=tuple(entry.loss_db_per_100ft),
                         velocity_factor_spread=entry.velocity_factor_spread,
                         spread_source=entry.spread_source)
        if not isinstance(raw, dict):
            raise self.fail("stub.line", "must be a catalogue line name (e.g. window-450) or a mapping "
                            "{spacing, conductor, dielectric} or {impedance, velocity_factor}, got "
                            f"{_describe(raw)}")
        nominal = "impedance" in raw or "velocity_factor" in raw
        self.form("stub.line", raw, "nominal" if nominal else "geometry")
        if nominal:
            z0 = self.value("stub.line.impedance")
            vf = self.value("stub.line.velocity_factor")
            loss = self.loss_points("stub.line.loss") if "loss" in raw else ()
            spacing = self.value("stub.line.spacing")
            conductor = self.value("stub.line.conductor")
            return _line("nominal", "custom", spacing, conductor, material, "polyethylene",
                         1.0 / vf ** 2, 0.0, "given in the design file", z0_ohm=z0, velocity_factor=vf,
                         loss_db_per_100ft=loss)
        spacing = self.quantity("stub.line.spacing", "length")
        conductor = self.value("stub.line.conductor")
        self.value("stub.line.spacing")
        if "material" in raw:
            material = self.value("stub.line.material")
        dielectric = self.value("stub.line.dielectric")
        return _line("geometry", "custom", spacing, conductor, material, dielectric.name,
                     dielectric.eps_r, dielectric.tan_delta,
                     "computed from the geometry given in the design file")

    def wire(self, key: str, default: str | None = None) -> float:
        raw = self.get(key, default)
        self._short_enough(key, raw)
        try:
            return units.parse_wire(raw)
        except BuildsheetError as exc:
            raise self.fail(key, exc.problem) from None

    def loss_points(self, key: str) -> tuple:
        raw = self.get(key)
        if not isinstance(raw, list) or not raw:
            raise self.fail(key, "must be a list of [frequency, dB per 100 ft] pairs")
        points = []
        for i, pair in enumerate(raw):
            if not isinstance(pair, list) or len(pair) != 2:
                raise self.fail(f"{key}.{i}", "must be a pair [frequency, dB per 100 ft]")
            points.append((self.value(f"{key}.{i}.0"), self.value(f"{key}.{i}.1")))
        return tuple(points)

    def feed(self) -> Feed:
        coax = self.value("feed.coax")
        return Feed(coax=coax.name, coax_z0_ohm=coax.z0_ohm, coax_velocity_factor=coax.velocity_factor,
                    coax_outer_diameter_m=coax.outer_diameter_m,
                    coax_loss_db_per_100ft=tuple(coax.loss_db_per_100ft),
                    impedance_ohm=self.value("feed.impedance", f"{coax.z0_ohm:g} ohm"),
                    length_m=self.value("feed.length"), choke_form_m=self.value("feed.choke_form"))

    def construction(self) -> str | None:
        if not self.has("construction"):
            return None
        construction = self.value("construction")
        orientation = self.get("site.orientation")
        if construction == "hung" and orientation not in ("vertical", "inverted"):
            raise self.fail("construction", f"hung is a wire vertical hung by a rope; this design's "
                            f"site.orientation is {orientation}: use vertical or inverted, or "
                            "construction: wire")
        return construction

    def site(self) -> Site:
        orientation = self.value("site.orientation")
        height = self.value("site.height")
        if orientation == "inverted" and height <= 0.0:
            raise self.fail("site.height", "must be above ground (an inverted antenna hangs from its "
                            "short at this height)")
        if orientation not in ("vertical", "inverted") and height <= 0.0:
            raise self.fail("site.height", "must be above ground (the stub's open top hangs from it)")
        if self.has("site.slope") and orientation != "sloper":
            raise self.fail("site.slope", f"applies only to a sloper; this design is {orientation}")
        slope = self.value("site.slope") if orientation == "sloper" else 0.0
        common = dict(orientation=orientation, height_m=height, slope_rad=slope)
        raw = self.get("site.ground")
        if isinstance(raw, dict):
            self.form("site.ground", raw, "custom")
            return Site(**common, ground="custom", ground_kind="real",
                        permittivity=self.value("site.ground.permittivity"),
                        conductivity_s_m=self.value("site.ground.conductivity"))
        ground = self.value("site.ground")
        return Site(**common, ground=ground.name, ground_kind=ground.kind, permittivity=ground.permittivity,
                    conductivity_s_m=ground.conductivity_s_m)

    def power(self) -> Power:
        transmitter = self.value("power.transmitter")
        mode = self.value("power.mode")
        return Power(transmitter_w=transmitter, mode=mode, duty_factor=catalog().duty_factor(mode),
                     on_air=self.value("power.on_air"),
                     exposure_standard=self.value("power.exposure_standard"))

    def calibration(self) -> Calibration:
        raw = self.get("calibration") or {}
        return Calibration(**{key: self.value(f"calibration.{key}") for key in raw})

    def record(self) -> tuple:
        raw = self.get("record", [])
        if raw is None:
            return ()
        if not isinstance(raw, list):
            raise self.fail("record", f"must be a list of as-built entries, got {_describe(raw)}")
        return tuple(self.record_entry(f"record.{i}", entry) for i, entry in enumerate(raw))

    def record_entry(self, key: str, entry) -> RecordEntry:
        if not isinstance(entry, dict):
            raise self.fail(key, f"must be a mapping (date, site, radiator, ...), got {_describe(entry)}")
        self.refuse_unknown(entry, f"{key}.", schema.ENTRY_KEYS, schema.KEYS["record"].unknown)
        if "date" not in entry:
            raise self.fail(key, "is missing `date` (every as-built entry is dated)")
        when = parse_date(entry["date"])
        if when is None:
            raise self.fail(f"{key}.date", f"must be {DATE_FORMAT}, got {_describe(entry['date'])}")
        values: dict = {"date": when}
        for k in entry:
            row = schema.row(f"{key}.{k}")
            if k == "readings":
                values["readings"] = self.readings(f"{key}.readings", entry[k])
            elif row.kind in ("length", "frequency"):
                v = self.quantity(f"{key}.{k}", row.kind)
                if v <= row.lo:
                    raise self.fail(f"{key}.{k}", "must be greater than zero")
                values[f"{k}_{'m' if row.kind == 'length' else 'hz'}"] = v
            elif k != "date":
                values[k] = self.value(f"{key}.{k}")
        return RecordEntry(**values)

    def readings(self, key: str, raw) -> tuple:
        """The readings of an as-built entry: a list of {frequency, swr, r, x} (r and x optional)."""
        if raw is None:
            return ()
        if not isinstance(raw, list):
            raise self.fail(key, f"must be a list of readings {{frequency, swr, r, x}}, got {_describe(raw)}")
        allowed = ("frequency", "swr", "r", "x")
        out = []
        for i, item in enumerate(raw):
            k = f"{key}.{i}"
            if not isinstance(item, dict):
                raise self.fail(k, f"must be a mapping {{frequency, swr, r, x}}, got {_describe(item)}")
            self.refuse_unknown(item, f"{k}.", allowed, schema.KEYS["record.N.readings"].unknown)
            for need in ("frequency", "swr"):
                if need not in item:
                    raise self.fail(k, f"is missing `{need}` (a reading is a frequency and an SWR)")
            f = self.quantity(f"{k}.frequency", "frequency")
            if not f > 0:
                raise self.fail(f"{k}.frequency", "must be greater than zero")
            out.append(Reading(frequency_hz=f, swr=self.value(f"{k}.swr"),
                               r_ohm=self.quantity(f"{k}.r", "impedance") if "r" in item else None,
                               x_ohm=self.quantity(f"{k}.x", "impedance") if "x" in item else None))
        return tuple(out)

    # -- cross checks (those on the solved geometry are in solver.py: check_*_clearance) --
    def cross_checks(self, d: Design) -> None:
        stub, lam = d.stub, d.wavelength_m
        if d.hung:
            from buildsheet.solver import is_rigid     # the one threshold of pipe and rod (lazy: the
            if is_rigid(d.radiator.diameter_m):        # solver imports this module)
                raise self.fail("construction", f"hung is a wire hung by a rope; a "
                                f"{mm(d.radiator.diameter_m)} radiator is pipe or rod: use construction: "
                                "wire on a mast, or a wire radiator")
        touching = RULES["spacing_vs_conductor"].value
        if stub.spacing_m <= stub.conductor_diameter_m * touching:
            raise self.fail("stub.line", f"spacing {mm(stub.spacing_m)} must be larger than the "
                            f"conductor diameter {mm(stub.conductor_diameter_m)} (centre to centre, "
                            "with a gap between the conductors)")
        fraction = RULES["spacing_vs_wavelength"].value
        if stub.spacing_m > lam / fraction:
            raise self.fail("stub.line", f"spacing {mm(stub.spacing_m)} is more than 1/{fraction:g} of a "
                            f"wavelength ({mm(lam / fraction)}) at {units.format_frequency(d.frequency_hz)}; "
                            "the line would radiate rather than act as a stub")
        fraction = RULES["wire_vs_wavelength"].value
        if d.radiator.diameter_m > lam / fraction:
            raise self.fail("radiator.wire", f"diameter {mm(d.radiator.diameter_m)} is more than "
                            f"1/{fraction:g} of a wavelength at {units.format_frequency(d.frequency_hz)}; "
                            "the model is not proven for a thicker conductor (README, Limits)")
        self.construction_fits(d)

    def construction_fits(self, d: Design) -> None:
        """`construction` against the parts and the site (schema rule construction_fits): what can
        be built that way, one line naming what does not fit."""
        style, r, st = d.construction, d.radiator, d.stub
        if style in (None, "wire", "hung"):     # hung: checked in construction() and cross_checks
            return
        orientation = d.site.orientation
        if style == "tube":
            least = RULES["construction_fits"].value * 1e-3
            if r.diameter_m < least:
                raise self.fail("construction", f"`tube` is pipe or rod, but `radiator.wire` is "
                                f"{mm(r.diameter_m)}: use {mm(least)} or thicker, or `construction: wire`")
            if st.kind != "geometry":
                raise self.fail("construction", f"`tube` needs a stub of the same pipe or rod, given by "
                                f"its geometry (`stub.line: {{spacing, conductor}}`), not the line "
                                f"'{st.name}'")
            if abs(st.conductor_diameter_m - r.diameter_m) > 0.03 * r.diameter_m:
                raise self.fail("construction", f"`tube` cuts the radiator and one stub conductor as "
                                f"one continuous pipe or rod, but `radiator.wire` is {mm(r.diameter_m)} "
                                f"and `stub.line.conductor` {mm(st.conductor_diameter_m)}: make them "
                                "one size")
            if orientation != "vertical":
                raise self.fail("construction", f"`tube` stands vertical (the long element is one "
                                f"straight pipe or rod), but `site.orientation` is {orientation}")
            return
        # twin-lead: the radiator is one conductor of the stub's own line, peeled off above the gap
        if st.kind != "nominal":
            raise self.fail("construction", "`twin-lead` needs a manufactured twin-lead or window "
                            "line (`stub.line: twinlead-300`, `window-450`, ...); a line given by "
                            "its geometry is open-wire line, which cannot carry the radiator")
        if abs(st.conductor_diameter_m - r.diameter_m) > 0.05 * st.conductor_diameter_m:
            raise self.fail("construction", f"`twin-lead` makes the radiator of the line's own "
                            f"conductor ({mm(st.conductor_diameter_m)}), but `radiator.wire` is "
                            f"{mm(r.diameter_m)}: give the line's conductor")
        if r.material != st.conductor_material:
            raise self.fail("construction", f"`twin-lead` makes the radiator of the line's own "
                            f"conductor ({st.conductor_material}), but `radiator.material` is "
                            f"{r.material}")
        if r.insulation == "bare":
            raise self.fail("construction", f"`twin-lead` makes the radiator of the line's conductor in "
                            f"its jacket, but `radiator.insulation` is bare: give `{st.dielectric}` "
                            "(the line's dielectric) or the jacket's `{velocity_factor: ...}`")
        if orientation != "vertical":
            raise self.fail("construction", f"`twin-lead` hangs vertical from its top (bent at the gap, "
                            f"the peeled conductor would take the radiator's pull); for a "
                            f"{orientation} build use `construction: wire` with this line as the stub")


def _line(kind: str, name: str, spacing_m: float, conductor_m: float, material, dielectric: str,
          eps_r: float, tan_delta: float, source: str, **nominal) -> StubLine:
    """The StubLine of any form: geometry, conductor material, dielectric, source; `nominal`: the
    measured z0_ohm, velocity_factor, loss_db_per_100ft and the velocity-factor spread, if any."""
    nominal = {"z0_ohm": None, "velocity_factor": None, "loss_db_per_100ft": (), **nominal}
    return StubLine(kind=kind, name=name, spacing_m=spacing_m, conductor_diameter_m=conductor_m,
                    conductor_material=material.name, conductivity_s_m=material.conductivity_s_m,
                    dielectric=dielectric, eps_r=eps_r, tan_delta=tan_delta, source=source, **nominal)


def _describe(value) -> str:
    if value is None:
        return "nothing"
    if isinstance(value, bool):
        return f"the boolean {str(value).lower()}"
    if isinstance(value, dict):
        return "a mapping"
    if isinstance(value, list):
        return "a list"
    if isinstance(value, (int, float)):
        text = repr(value)
        return f"the bare number {text if len(text) <= 20 else text[:17] + '...'}"
    text = str(value)
    return repr(text if len(text) <= 40 else text[:37] + "...")




#: dates before this year are refused: no build sheet or measurement is older, and a PDF's dates
#: (seconds since 1970 in reportlab) and strftime's unpadded years below 1000 would go wrong
FIRST_YEAR = 1900
DATE_FORMAT = f"a date YYYY-MM-DD from {FIRST_YEAR} on"


def parse_date(value) -> str | None:
    """An ISO date 'YYYY-MM-DD' from YAML (text or date), or None if it is not one (or is before
    FIRST_YEAR). Written with isoformat: four digits for every year, as typed."""
    if isinstance(value, datetime):
        value = value.date()
    if isinstance(value, date):
        return value.isoformat() if value.year >= FIRST_YEAR else None
    if isinstance(value, str) and re.fullmatch(r"\d{4}-\d{2}-\d{2}", value.strip()):
        text = value.strip()
        try:    # as strptime(text, "%Y-%m-%d") reads it (ASCII digits), without importing _strptime
            if not text.isascii():
                raise ValueError(text)
            day = date(int(text[:4]), int(text[5:7]), int(text[8:]))
        except ValueError:
            return None
        return day.isoformat() if day.year >= FIRST_YEAR else None
    return None


# ----------------------------------------------------------------------------------------------
# Revision date (DESIGN.md §4): --date, else SOURCE_DATE_EPOCH, else the file's last git commit,
# else its modification time.

def revision_date(path: str | None, override: str | None = None) -> str:
    if override:
        parsed = parse_date(override)
        if parsed is None:
            raise BuildsheetError(f"must be {DATE_FORMAT}, got '{one_line(override)}'", key="--date")
        return parsed
    epoch = os.environ.get("SOURCE_DATE_EPOCH")
    if epoch:
        try:
            day = datetime.fromtimestamp(int(epoch), tz=timezone.utc).date()
            if day.year < FIRST_YEAR:
                raise ValueError(epoch)
            return day.isoformat()
        except (ValueError, OverflowError, OSError):
            raise BuildsheetError(f"must be seconds since 1970, got '{epoch}'",
                                  key="SOURCE_DATE_EPOCH") from None
    if path:
        import subprocess

        directory = os.path.dirname(os.path.abspath(path))
        try:
            out = subprocess.run(["git", "log", "-1", "--format=%cs", "--", os.path.basename(path)],
                                 cwd=directory, capture_output=True, text=True, timeout=10)
            if out.returncode == 0 and parse_date(out.stdout.strip()):
                return out.stdout.strip()
        except (OSError, subprocess.SubprocessError):
            pass
        try:
            return datetime.fromtimestamp(os.path.getmtime(path), tz=timezone.utc).strftime("%Y-%m-%d")
        except OSError:
            pass
    return datetime.now(tz=timezone.utc).strftime("%Y-%m-%d")


def _printable(ch: str) -> bool:
    """True if the sheet's fonts (Vera and Vera Bold) have a glyph for `ch`."""
    from buildsheet.fonts import check_glyphs

    try:
        check_glyphs(ch)
        check_glyphs(ch, bold=True)
    except ValueError:
        return False
    return True
