"""The design file: owns its schema (schema 1), validation, defaults, the frozen Design in SI units,
the canonical form and the document ID. It does no physics and no output.

Data flow: text --yamlread.parse--> Document (values + line numbers) --validate--> Design.
Every problem is a DesignError naming the file, the key, its line and what is wrong.
"""

from __future__ import annotations

import dataclasses
import difflib
import functools
import hashlib
import json
import math
import os
import re
import subprocess
import unicodedata
from dataclasses import dataclass, field
from datetime import date, datetime, timezone

from buildsheet import units
from buildsheet.catalog import catalog, countries, national_bands
from buildsheet.errors import BuildsheetError, DesignError, one_line
from buildsheet.yamlread import Document, parse, read_text

SCHEMA = 1
C0 = 299_792_458.0

F_MIN_HZ = 1.8e6
F_MAX_HZ = 450e6
#: frequencies a measured or datasheet loss point may be given at
LOSS_F_MIN_HZ = 1e6
LOSS_F_MAX_HZ = 3e9

# Defaults, written as a user would write them, applied in one place (_with_defaults) and listed in the
# README (a test checks the README table against this mapping).  Region-dependent defaults are
# functions of the region.
DEFAULTS: dict[str, object] = {
    "title": "(the name)",
    "band": "(the amateur band containing `frequency` in `region`)",
    "region": 2,
    "country": "(none: the ITU table of `region`)",
    "radiator.material": "copper",
    "radiator.insulation": "bare",
    "stub.conductor_material": "copper",
    "feed.coax": "RG-8X",
    "feed.impedance": "(the coax's impedance)",
    "feed.length": "15 m",
    "feed.choke_form": "110 mm",
    "site.slope": "30 deg (sloper only)",
    "site.ground": "average",
    "power.transmitter": "100 W",
    "power.mode": "ssb",
    "power.on_air": "100 %",
    "power.exposure_standard": "us-fcc in region 2, icnirp-2020 elsewhere",
    "output.units": "imperial in region 2, metric elsewhere",
    "output.paper": "letter in region 2, a4 elsewhere",
    "calibration": "{} (none)",
    "record": "[] (none)",
}

ORIENTATIONS = ("horizontal", "sloper", "vertical")
EXPOSURE_STANDARDS = ("us-fcc", "icnirp-2020")
UNIT_SYSTEMS = ("imperial", "metric")
PAPERS = ("letter", "a4")
CALIBRATION_PARAMETERS = ("radiator_scale", "end_resistance_scale", "stub_velocity_scale")

# The schema: for each mapping, its keys.  Nested mappings are dicts; leaves are None.
_SCHEMA: dict = {
    "buildsheet": None, "name": None, "title": None, "frequency": None, "band": None, "region": None,
    "country": None,
    "radiator": {"wire": None, "material": None, "insulation": None},
    "stub": {"line": None, "conductor_material": None},
    "feed": {"coax": None, "impedance": None, "length": None, "choke_form": None},
    "site": {"orientation": None, "height": None, "slope": None, "ground": None},
    "power": {"transmitter": None, "mode": None, "on_air": None, "exposure_standard": None},
    "output": {"units": None, "paper": None},
    "calibration": None,
    "record": None,
}
_REQUIRED = ("buildsheet", "name", "frequency", "radiator.wire", "stub.line", "site.orientation",
             "site.height")
_LINE_GEOMETRY_KEYS = ("spacing", "conductor", "dielectric", "material")
_LINE_NOMINAL_KEYS = ("impedance", "velocity_factor", "loss", "spacing", "conductor")
_RECORD_KEYS = ("date", "site", "radiator", "stub", "tap", "resonance", "swr", "note")
_NAME_RE = re.compile(r"[a-z0-9](?:[a-z0-9-]{0,62}[a-z0-9])?\Z")
#: longest text read as a quantity; "16' 4-3/8\"" or "1.6277 mm" are far shorter, and the number
#: parsers are not handed thousands of digits
MAX_QUANTITY_CHARS = 64
#: Unicode categories refused in text printed on the sheet: control characters (tab excepted),
#: lone surrogates (not encodable), line and paragraph separators
_BAD_TEXT_CATEGORIES = ("Cc", "Cs", "Zl", "Zp")


# ----------------------------------------------------------------------------------------------
# The validated design (SI units, defaults filled)

@dataclass(frozen=True)
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


@dataclass(frozen=True)
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


@dataclass(frozen=True)
class Feed:
    coax: str
    coax_z0_ohm: float
    coax_velocity_factor: float
    coax_outer_diameter_m: float
    coax_loss_db_per_100ft: tuple
    impedance_ohm: float
    length_m: float
    choke_form_m: float


@dataclass(frozen=True)
class Site:
    orientation: str
    height_m: float
    slope_rad: float
    ground: str
    ground_kind: str
    permittivity: float
    conductivity_s_m: float


@dataclass(frozen=True)
class Power:
    transmitter_w: float
    mode: str
    duty_factor: float
    on_air: float
    exposure_standard: str


@dataclass(frozen=True)
class Output:
    units: str
    paper: str


@dataclass(frozen=True)
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


@dataclass(frozen=True)
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


@dataclass(frozen=True)
class Design:
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
    #: the `country` whose national band edges were asked for (None: the ITU table of the region);
    #: not part of the canonical form: the band edges it chose are
    country: str | None = None

    @property
    def wavelength_m(self) -> float:
        return C0 / self.frequency_hz

    def canonical(self) -> dict:
        """The design in canonical SI form with defaults filled, leaving out what does not change
        the antenna (title, output, record, the file path).  Floats are written to 9 significant
        digits, so '14175 kHz' and '14.175 MHz' give the same form."""
        data = dataclasses.asdict(self)
        for key in ("title", "output", "record", "path", "country"):
            data.pop(key)
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
    choices = list(choices)
    lowered = {c.lower(): c for c in choices}
    match = difflib.get_close_matches(str(word).lower(), list(lowered), n=1, cutoff=0.5)
    return lowered[match[0]] if match else None


class _Validator:
    def __init__(self, doc: Document, path: str | None):
        self.doc = doc
        self.path = path
        self.data = doc.data

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

    # -- structure ---------------------------------------------------------------------------
    def check_structure(self) -> None:
        if not isinstance(self.data, dict):
            raise DesignError(f"must be a YAML mapping of keys (`buildsheet: 1`, `name:` ...), "
                              f"got {_describe(self.data)}", file=self.path, line=1)
        self._check_keys(self.data, _SCHEMA, "")
        for key in _REQUIRED:
            if not self.has(key):
                parent = key.rpartition(".")[0]
                raise self.fail(parent, f"is missing the required key `{key}`") if parent else \
                    DesignError(f"is missing the required key `{key}`", file=self.path, key=key, line=1)

    def _check_keys(self, mapping: dict, schema: dict, prefix: str) -> None:
        for key, value in mapping.items():
            dotted = f"{prefix}{key}"
            if key not in schema:
                hint = closest(key, schema)
                hint = f"; did you mean `{prefix}{hint}`?" if hint else ""
                raise self.fail(dotted, f"is not a key of a design file{hint}")
            sub = schema[key]
            if isinstance(sub, dict):
                if not isinstance(value, dict):
                    raise self.fail(dotted, f"must be a mapping of keys ({', '.join(sub)}), "
                                    f"got {_describe(value)}")
                self._check_keys(value, sub, dotted + ".")

    # -- the design --------------------------------------------------------------------------
    def design(self) -> Design:
        self.check_structure()
        schema = self.get("buildsheet")
        if schema != SCHEMA or isinstance(schema, bool):
            raise self.fail("buildsheet", f"must be {SCHEMA} (the schema version this buildsheet reads), "
                            f"got {schema!r}")
        name = self.get("name")
        if not isinstance(name, str) or not _NAME_RE.match(name):
            raise self.fail("name", "must be a slug of 1-64 lower-case letters, digits and '-' "
                            f"(used in file names), got {_describe(name)}")
        title = self.text("title", name, max_len=120)
        region = int(self.number("region", DEFAULTS["region"], lo=1, hi=3))
        if self.get("region") not in (None, 1, 2, 3):
            raise self.fail("region", f"must be the ITU region 1, 2 or 3, got {self.get('region')!r}")
        frequency = self.quantity("frequency", "frequency")
        self.in_range("frequency", frequency, F_MIN_HZ, F_MAX_HZ, units.format_frequency)
        country = self.country(region)
        band, band_name = self.band(frequency, region, country)
        radiator = self.radiator(frequency)
        stub = self.stub_line(frequency)
        feed = self.feed()
        site = self.site()
        power = self.power(region)
        output = Output(
            units=self.choice("output.units", UNIT_SYSTEMS, "imperial" if region == 2 else "metric"),
            paper=self.choice("output.paper", PAPERS, "letter" if region == 2 else "a4"),
        )
        calibration = self.calibration()
        record = self.record()
        design = Design(schema=SCHEMA, name=name, title=title, frequency_hz=frequency, band_hz=band,
                        band_name=band_name, region=region, radiator=radiator, stub=stub, feed=feed,
                        site=site, power=power, output=output, calibration=calibration, record=record,
                        path=self.path, country=country)
        self.cross_checks(design)
        return design

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
            low = self.quantity("band.0", "frequency")
            high = self.quantity("band.1", "frequency")
            if not low < high:
                raise self.fail("band", f"must be [low, high] with low below high, got "
                                f"{units.format_frequency(low)} and {units.format_frequency(high)}")
            if high / low > 1.5:
                raise self.fail("band", "is wider than 1.5:1; a single-band antenna covers one band")
            if not low <= frequency <= high:
                raise self.fail("frequency", f"{units.format_frequency(frequency)} is outside `band` "
                                f"{units.format_frequency(low)} to {units.format_frequency(high)}")
            for edge, key in ((low, "band.0"), (high, "band.1")):
                self.in_range(key, edge, F_MIN_HZ * 0.9, F_MAX_HZ * 1.1, units.format_frequency)
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

    def radiator(self, frequency: float) -> Radiator:
        raw = self.get("radiator.wire")
        diameter = self.wire("radiator.wire")
        material = self.catalogue("radiator.material", "material", DEFAULTS["radiator.material"])
        insulation_raw = self.get("radiator.insulation", DEFAULTS["radiator.insulation"])
        if isinstance(insulation_raw, dict):
            unknown = set(insulation_raw) - {"velocity_factor"}
            if unknown:
                key = sorted(unknown)[0]
                raise self.fail(f"radiator.insulation.{key}", "is not a key of `radiator.insulation`; "
                                "write `{velocity_factor: 0.95}` or a name (bare, pvc, polyethylene)")
            vf = self.number("radiator.insulation.velocity_factor", None, lo=0.80, hi=1.0)
            insulation = "custom"
        else:
            entry = self.catalogue("radiator.insulation", "insulation", DEFAULTS["radiator.insulation"])
            return Radiator(diameter_m=diameter, label=str(raw).strip(), material=material.name,
                            conductivity_s_m=material.conductivity_s_m, insulation=entry.name,
                            velocity_factor=entry.velocity_factor,
                            velocity_factor_spread=entry.velocity_factor_spread,
                            spread_source=entry.spread_source)
        return Radiator(diameter_m=diameter, label=str(raw).strip(), material=material.name,
                        conductivity_s_m=material.conductivity_s_m, insulation=insulation,
                        velocity_factor=vf)

    def stub_line(self, frequency: float) -> StubLine:
        raw = self.get("stub.line")
        conductor_material = self.catalogue("stub.conductor_material", "material",
                                            DEFAULTS["stub.conductor_material"])
        if isinstance(raw, str):
            entry = self.catalogue("stub.line", "stub_line")
            material = catalog().lookup("material", entry.conductor_material or "copper")
            if self.has("stub.conductor_material"):
                material = conductor_material
            dielectric = catalog().lookup("dielectric", entry.dielectric or "air")
            return StubLine(kind=entry.kind, name=entry.name, spacing_m=entry.spacing_m,
                            conductor_diameter_m=entry.conductor_diameter_m,
                            conductor_material=material.name, conductivity_s_m=material.conductivity_s_m,
                            z0_ohm=entry.z0_ohm, velocity_factor=entry.velocity_factor,
                            loss_db_per_100ft=tuple(entry.loss_db_per_100ft), dielectric=dielectric.name,
                            eps_r=dielectric.eps_r, tan_delta=dielectric.tan_delta, source=entry.source,
                            velocity_factor_spread=entry.velocity_factor_spread,
                            spread_source=entry.spread_source)
        if not isinstance(raw, dict):
            raise self.fail("stub.line", "must be a catalogue line name (e.g. window-450) or a mapping "
                            "{spacing, conductor, dielectric} or {impedance, velocity_factor}, got "
                            f"{_describe(raw)}")
        if "impedance" in raw or "velocity_factor" in raw:
            allowed = _LINE_NOMINAL_KEYS
        else:
            allowed = _LINE_GEOMETRY_KEYS
        for key in raw:
            if key not in allowed:
                hint = closest(key, allowed)
                hint = f"; did you mean `stub.line.{hint}`?" if hint else ""
                raise self.fail(f"stub.line.{key}", f"is not a key of this kind of line{hint}")
        if allowed is _LINE_NOMINAL_KEYS:
            for key in ("impedance", "velocity_factor"):
                if key not in raw:
                    raise self.fail("stub.line", f"is missing `stub.line.{key}` (a line given by its "
                                    "impedance needs both impedance and velocity_factor)")
            z0 = self.quantity("stub.line.impedance", "impedance")
            self.in_range("stub.line.impedance", z0, 50.0, 1000.0, _ohm)
            vf = self.number("stub.line.velocity_factor", lo=0.5, hi=1.0)
            loss = ()
            if "loss" in raw:
                loss = self.loss_points("stub.line.loss")
            spacing = self.quantity("stub.line.spacing", "length", "25 mm")
            conductor = self.wire("stub.line.conductor", "16 AWG")
            return StubLine(kind="nominal", name="custom", spacing_m=spacing,
                            conductor_diameter_m=conductor, conductor_material=conductor_material.name,
                            conductivity_s_m=conductor_material.conductivity_s_m, z0_ohm=z0,
                            velocity_factor=vf, loss_db_per_100ft=loss, dielectric="polyethylene",
                            eps_r=1.0 / vf ** 2, tan_delta=0.0, source="given in the design file")
        for key in ("spacing", "conductor"):
            if key not in raw:
                raise self.fail("stub.line", f"is missing `stub.line.{key}` (a line given by geometry "
                                "needs spacing and conductor)")
        spacing = self.quantity("stub.line.spacing", "length")
        conductor = self.wire("stub.line.conductor")
        self.in_range("stub.line.spacing", spacing, 1e-3, 1.0, _mm)
        if "material" in raw:
            conductor_material = self.catalogue("stub.line.material", "material")
        dielectric = self.catalogue("stub.line.dielectric", "dielectric", "air")
        return StubLine(kind="geometry", name="custom", spacing_m=spacing, conductor_diameter_m=conductor,
                        conductor_material=conductor_material.name,
                        conductivity_s_m=conductor_material.conductivity_s_m, z0_ohm=None,
                        velocity_factor=None, loss_db_per_100ft=(), dielectric=dielectric.name,
                        eps_r=dielectric.eps_r, tan_delta=dielectric.tan_delta,
                        source="computed from the geometry given in the design file")

    def wire(self, key: str, default: str | None = None) -> float:
        raw = self.get(key, default)
        self._short_enough(key, raw)
        try:
            d = units.parse_wire(raw)
        except BuildsheetError as exc:
            raise self.fail(key, exc.problem) from None
        return self.in_range(key, d, 0.2e-3, 60e-3, _mm)

    def loss_points(self, key: str) -> tuple:
        raw = self.get(key)
        if not isinstance(raw, list) or not raw:
            raise self.fail(key, "must be a list of [frequency, dB per 100 ft] pairs")
        points = []
        for i, pair in enumerate(raw):
            if not isinstance(pair, list) or len(pair) != 2:
                raise self.fail(f"{key}.{i}", "must be a pair [frequency, dB per 100 ft]")
            f = self.quantity(f"{key}.{i}.0", "frequency")
            # the skin-effect and dielectric loss law is fitted over the range cable data cover
            self.in_range(f"{key}.{i}.0", f, LOSS_F_MIN_HZ, LOSS_F_MAX_HZ,
                          lambda hz: units.format_frequency(hz) if hz >= 1e3 else f"{hz:g} Hz")
            db = self.number(f"{key}.{i}.1", lo=0.0, hi=100.0)
            points.append((f, db))
        return tuple(points)

    def feed(self) -> Feed:
        coax = self.catalogue("feed.coax", "coax", DEFAULTS["feed.coax"])
        impedance = self.quantity("feed.impedance", "impedance", f"{coax.z0_ohm:g} ohm")
        self.in_range("feed.impedance", impedance, 10.0, 600.0, _ohm)
        length = self.quantity("feed.length", "length", DEFAULTS["feed.length"])
        self.in_range("feed.length", length, 0.0, 500.0, _metres)
        form = self.quantity("feed.choke_form", "length", DEFAULTS["feed.choke_form"])
        self.in_range("feed.choke_form", form, 10e-3, 0.6, _mm)
        return Feed(coax=coax.name, coax_z0_ohm=coax.z0_ohm, coax_velocity_factor=coax.velocity_factor,
                    coax_outer_diameter_m=coax.outer_diameter_m,
                    coax_loss_db_per_100ft=tuple(coax.loss_db_per_100ft), impedance_ohm=impedance,
                    length_m=length, choke_form_m=form)

    def site(self) -> Site:
        orientation = self.choice("site.orientation", ORIENTATIONS)
        height = self.quantity("site.height", "length")
        self.in_range("site.height", height, 0.0, 300.0, _metres)
        if orientation != "vertical" and height <= 0.0:
            raise self.fail("site.height", "must be above ground (the stub's open top hangs from it)")
        if self.has("site.slope") and orientation != "sloper":
            raise self.fail("site.slope", f"applies only to a sloper; this design is {orientation}")
        slope = 0.0
        if orientation == "sloper":
            slope = self.quantity("site.slope", "angle", "30 deg")
            self.in_range("site.slope", slope, math.radians(5), math.radians(80), _deg)
        raw = self.get("site.ground", DEFAULTS["site.ground"])
        if isinstance(raw, dict):
            for key in raw:
                if key not in ("permittivity", "conductivity"):
                    hint = closest(key, ("permittivity", "conductivity"))
                    hint = f"; did you mean `site.ground.{hint}`?" if hint else ""
                    raise self.fail(f"site.ground.{key}", f"is not a key of a ground{hint}")
            for key in ("permittivity", "conductivity"):
                if key not in raw:
                    raise self.fail("site.ground", f"is missing `site.ground.{key}`")
            eps = self.number("site.ground.permittivity", lo=1.0, hi=100.0)
            sigma = self.quantity("site.ground.conductivity", "conductivity")
            self.in_range("site.ground.conductivity", sigma, 1e-5, 10.0, lambda v: f"{v:g} S/m")
            return Site(orientation=orientation, height_m=height, slope_rad=slope, ground="custom",
                        ground_kind="real", permittivity=eps, conductivity_s_m=sigma)
        ground = self.catalogue("site.ground", "ground", DEFAULTS["site.ground"])
        return Site(orientation=orientation, height_m=height, slope_rad=slope, ground=ground.name,
                    ground_kind=ground.kind, permittivity=ground.permittivity,
                    conductivity_s_m=ground.conductivity_s_m)

    def power(self, region: int) -> Power:
        transmitter = self.quantity("power.transmitter", "power", DEFAULTS["power.transmitter"])
        self.in_range("power.transmitter", transmitter, 0.1, 10_000.0, lambda w: f"{w:g} W")
        mode_names = catalog().names("mode")
        mode = self.choice("power.mode", mode_names, DEFAULTS["power.mode"])
        on_air = self.quantity("power.on_air", "fraction", DEFAULTS["power.on_air"])
        self.in_range("power.on_air", on_air, 0.01, 1.0, lambda v: f"{100 * v:g} %")
        standard = self.choice("power.exposure_standard", EXPOSURE_STANDARDS,
                               "us-fcc" if region == 2 else "icnirp-2020")
        return Power(transmitter_w=transmitter, mode=mode, duty_factor=catalog().duty_factor(mode),
                     on_air=on_air, exposure_standard=standard)

    def calibration(self) -> Calibration:
        raw = self.get("calibration", {})
        if raw is None:
            raw = {}
        if not isinstance(raw, dict):
            raise self.fail("calibration", f"must be a mapping (written by `buildsheet fit --write`), "
                            f"got {_describe(raw)}")
        allowed = CALIBRATION_PARAMETERS + ("source", "date")
        values = {}
        for key in raw:
            if key not in allowed:
                hint = closest(key, allowed)
                hint = f"; did you mean `calibration.{hint}`?" if hint else ""
                raise self.fail(f"calibration.{key}", f"is not a calibration parameter{hint}")
        for key in CALIBRATION_PARAMETERS:
            if key in raw:
                values[key] = self.number(f"calibration.{key}", lo=0.5, hi=2.0)
        for key in ("source", "date"):
            if key in raw:
                values[key] = self.text(f"calibration.{key}", max_len=200)
        return Calibration(**values)

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
        for k in entry:
            if k not in _RECORD_KEYS:
                hint = closest(k, _RECORD_KEYS)
                hint = f"; did you mean `{key}.{hint}`?" if hint else ""
                raise self.fail(f"{key}.{k}", f"is not a key of an as-built entry{hint}")
        if "date" not in entry:
            raise self.fail(key, "is missing `date` (every as-built entry is dated)")
        when = parse_date(entry["date"])
        if when is None:
            raise self.fail(f"{key}.date", f"must be {DATE_FORMAT}, got {_describe(entry['date'])}")
        values: dict = {"date": when}
        for k, kind, out in (("radiator", "length", "radiator_m"), ("stub", "length", "stub_m"),
                             ("tap", "length", "tap_m"), ("resonance", "frequency", "resonance_hz")):
            if k in entry:
                v = self.quantity(f"{key}.{k}", kind)
                if v <= 0:
                    raise self.fail(f"{key}.{k}", "must be greater than zero")
                values[out] = v
        if "swr" in entry:
            values["swr"] = self.number(f"{key}.swr", lo=1.0, hi=100.0)
        for k in ("site", "note"):
            if k in entry:
                values[k] = self.text(f"{key}.{k}", max_len=500)
        return RecordEntry(**values)

    # -- cross checks ------------------------------------------------------------------------
    def cross_checks(self, d: Design) -> None:
        stub = d.stub
        if stub.spacing_m <= stub.conductor_diameter_m * 1.05:
            raise self.fail("stub.line", f"spacing {_mm(stub.spacing_m)} must be larger than the "
                            f"conductor diameter {_mm(stub.conductor_diameter_m)} (centre to centre, "
                            "with a gap between the conductors)")
        lam = d.wavelength_m
        if stub.spacing_m > lam / 20:
            raise self.fail("stub.line", f"spacing {_mm(stub.spacing_m)} is more than 1/20 of a "
                            f"wavelength ({_mm(lam / 20)}) at {units.format_frequency(d.frequency_hz)}; "
                            "the line would radiate rather than act as a stub")
        if d.radiator.diameter_m > lam / 100:
            raise self.fail("radiator.wire", f"diameter {_mm(d.radiator.diameter_m)} is more than 1/100 "
                            f"of a wavelength at {units.format_frequency(d.frequency_hz)}; a thin-wire "
                            "model does not apply")
        vf = stub.velocity_factor or 1.0 / math.sqrt(stub.eps_r)
        # the calibration scales the lengths the solver cuts (solver.antenna_model divides the wire's
        # velocity factor by radiator_scale and multiplies the stub's by stub_velocity_scale): a
        # radiator_scale of 0.5 doubles the radiator, and the estimate must see that
        cal = d.calibration
        stub_estimate = vf * cal.stub_velocity_scale * lam / 4
        radiator_estimate = d.radiator.velocity_factor / cal.radiator_scale * lam / 2
        if d.site.orientation in ("horizontal", "sloper"):
            bottom = d.site.height_m - stub_estimate
            if bottom < 0.3:
                raise self.fail("site.height", f"{_metres(d.site.height_m)} leaves the stub's short "
                                f"{_metres(bottom)} above ground (the stub is about "
                                f"{_metres(stub_estimate)} long); raise the open top to at least "
                                f"{_metres(stub_estimate + 0.3)} or hang the antenna as a sloper with a "
                                "higher top")
            if d.site.orientation == "sloper":
                far = d.site.height_m - radiator_estimate * math.sin(d.site.slope_rad)
                if far < 0.3:
                    raise self.fail("site.slope", f"a {_deg(d.site.slope_rad)} slope from "
                                    f"{_metres(d.site.height_m)} puts the radiator's far end "
                                    f"{_metres(far)} above ground (the radiator is about "
                                    f"{_metres(radiator_estimate)}); use a smaller slope or a higher top")


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


def _mm(m: float) -> str:
    return f"{m * 1e3:.3g} mm"


def _metres(m: float) -> str:
    return f"{m:.2f} m"


def _ohm(r: float) -> str:
    return f"{r:g} ohm"


def _deg(rad: float) -> str:
    return f"{math.degrees(rad):.3g} deg"


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
        try:
            day = datetime.strptime(value.strip(), "%Y-%m-%d").date()
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
