"""The catalogue of materials, insulation, dielectrics, stub lines, coax, grounds, duty factors and bands.

Owns buildsheet/data/catalog.yaml (the one data file, read once) and its frozen entries; knows no
design keys, does no other I/O and has no formulas of its own (a cable's loss law is physics.lines'
Line.nominal). Every entry carries `source`: where its numbers come from.
Quantities in the file are written with units (units.py grammar) and held here in SI:

    conductivity_s_m   conductor or ground conductivity, S/m
    eps_r, tan_delta   relative permittivity and loss tangent of a dielectric
    permittivity       relative permittivity of a ground
    z0_ohm             characteristic impedance, ohm
    velocity_factor    phase velocity as a fraction of c (for insulation: of the wire antenna)
    velocity_factor_spread  (low, high): the range of published velocity factors of a stub line or
                       jacket (spread_source says where from); None where there is no dielectric
    loss_db_per_100ft  matched loss as ((f_hz, dB per 100 ft), ...), the unit cable data use
    *_m, *_hz          lengths in m, frequencies in Hz

Names are matched forgiving case, spaces, hyphens and underscores ("rg-8x", "Window 450"); an
unknown name raises DesignError with a "did you mean" hint (the design loader adds file, key, line).
"""

from __future__ import annotations

import functools
import hashlib
import math
import pathlib
from collections.abc import Mapping
from functools import cached_property
from types import MappingProxyType

import numpy as np
import yaml

from buildsheet.errors import DesignError
from buildsheet.units import FOOT_M, parse_quantity, parse_wire
from buildsheet.valueclass import valueclass

#: kind of entry -> the words used for it in messages
_LABELS = {
    "material": "material",
    "insulation": "insulation",
    "dielectric": "dielectric",
    "stub_line": "stub line",
    "coax": "coax",
    "ground": "ground",
    "mode": "mode",
}
REGIONS = (1, 2, 3)


@valueclass
class Material:
    """A conductor material: conductivity_s_m in S/m."""

    name: str
    conductivity_s_m: float
    source: str


@valueclass
class Insulation:
    """A wire jacket: velocity_factor is the shortening it causes on a wire antenna (1.0 = bare);
    velocity_factor_spread (low, high) the range the sources give (None for bare wire), with
    spread_source saying where it comes from."""

    name: str
    velocity_factor: float
    source: str
    velocity_factor_spread: tuple[float, float] | None = None
    spread_source: str = ""


@valueclass
class Dielectric:
    """A line dielectric: relative permittivity eps_r and loss tangent tan_delta (both dimensionless)."""

    name: str
    eps_r: float
    tan_delta: float
    source: str


@valueclass
class StubLine:
    """A two-wire line for the stub.

    kind 'nominal': a manufactured line given by what it measures: z0_ohm (ohm), velocity_factor and
    loss_db_per_100ft ((f_hz, dB/100 ft), ...); spacing_m and conductor_diameter_m (m) are typical,
    for drawings and the wire model. kind 'geometry': z0_ohm and velocity_factor are None and
    loss_db_per_100ft is empty; the line is computed from spacing_m, conductor_diameter_m,
    conductor_material and dielectric (catalogue names). note: what a builder should know.
    velocity_factor_spread (low, high): the range of velocity factors the sources give for this
    kind of line (None: no spread known), spread_source: where it comes from.
    """

    name: str
    kind: str
    z0_ohm: float | None
    velocity_factor: float | None
    loss_db_per_100ft: tuple[tuple[float, float], ...]
    spacing_m: float
    conductor_diameter_m: float
    conductor_material: str
    dielectric: str
    source: str
    note: str
    velocity_factor_spread: tuple[float, float] | None = None
    spread_source: str = ""


@valueclass
class Coax:
    """A coaxial cable: z0_ohm (ohm), velocity_factor, outer_diameter_m (m, over the jacket) and
    loss_db_per_100ft ((f_hz, dB per 100 ft), ...) as the cable data give it; inner_diameter_m and
    dielectric_diameter_m (m) where the construction is known (None otherwise), for checking z0."""

    name: str
    z0_ohm: float
    velocity_factor: float
    outer_diameter_m: float
    loss_db_per_100ft: tuple[tuple[float, float], ...]
    source: str
    inner_diameter_m: float | None = None
    dielectric_diameter_m: float | None = None
    note: str = ""

    @cached_property
    def line(self):
        """The cable as a physics Line: Line.nominal from z0, VF and the loss points (in dB/m)."""
        from buildsheet.physics.lines import Line  # scipy: only when a loss is asked for, not on `check`

        points = tuple((f, db / (100.0 * FOOT_M)) for f, db in self.loss_db_per_100ft)
        return Line.nominal(self.z0_ohm, self.velocity_factor, points)

    def matched_loss_db_per_m(self, f):
        """Matched loss in dB/m at f (Hz, scalar or numpy array).

        A(f) = k1·√f + k2·f (conductor loss grows as √f by the skin effect, dielectric loss as f),
        fitted through the cable's loss points: exactly through two, by least squares through more
        (Line.nominal; CHECK_VALUES §6c). Meant for 1.8-450 MHz.
        """
        from buildsheet.physics.lines import DB_PER_NEPER

        alpha = self.line.gamma(f).real * DB_PER_NEPER
        return alpha if np.ndim(alpha) else float(alpha)


@valueclass
class Ground:
    """A ground under the antenna. kind: 'free-space' (none), 'perfect' (conductivity_s_m = inf) or
    'real' (relative permittivity and conductivity_s_m in S/m)."""

    name: str
    permittivity: float
    conductivity_s_m: float
    kind: str
    source: str


@valueclass
class Mode:
    """An operating mode: duty_factor is average over peak envelope power while transmitting (0..1)."""

    name: str
    duty_factor: float
    source: str


@valueclass
class StockSize:
    """A tube or rod size sold in shops: kind 'tube' | 'rod', system 'imperial' | 'metric' (how it
    is sold), outer_diameter_m in m."""

    name: str
    kind: str
    system: str
    outer_diameter_m: float
    source: str


#: a conductor is named by a stock size within this share of its diameter (tube walls and rod
#: tolerances are a few per cent; a closer size is the one meant)
STOCK_MATCH = 0.03


@valueclass
class Band:
    """An amateur band in one ITU region: edges low_hz, high_hz in Hz."""

    name: str
    low_hz: float
    high_hz: float
    source: str


def _fold(name: str) -> str:
    """The matching key of a name: case, spaces, hyphens and underscores do not matter."""
    return "".join(ch for ch in name.casefold() if ch not in " -_")


def _closest(name, names) -> str | None:
    import difflib      # only for a name not in the catalogue

    folded = {_fold(n): n for n in names}
    best = difflib.get_close_matches(_fold(str(name)), list(folded), n=1, cutoff=0.5)
    return folded[best[0]] if best else None


def _plain_number(raw, where: str) -> float:
    """A dimensionless number from the data file (YAML reads 2e-4 as text: catch that here)."""
    if isinstance(raw, bool) or not isinstance(raw, (int, float)) or not math.isfinite(raw):
        raise ValueError(f"catalog.yaml: {where} must be a plain number, got {raw!r}")
    return float(raw)


@valueclass
class Catalog:
    """All catalogue entries by kind (mappings name -> entry, in file order) and bands by region."""

    materials: Mapping[str, Material]
    insulations: Mapping[str, Insulation]
    dielectrics: Mapping[str, Dielectric]
    stub_lines: Mapping[str, StubLine]
    coaxes: Mapping[str, Coax]
    grounds: Mapping[str, Ground]
    modes: Mapping[str, Mode]
    band_plan: Mapping[int, tuple[Band, ...]]
    stock: tuple[StockSize, ...] = ()

    def stock_size(self, diameter_m: float, system: str, material: str = "") -> StockSize | None:
        """The stock tube or rod sold in `system` (imperial | metric) whose outer diameter is within
        STOCK_MATCH of diameter_m (m), the nearest of them; a tube named by its metal only for that
        `material` (a rod of any); None if no such size is sold."""
        def sold_as(s: StockSize) -> bool:      # a tube named by its metal is that metal only
            metals = [m for m in ("copper", "aluminium") if m in s.name]
            return not metals or any(m in material for m in metals)

        near = [s for s in self.stock if s.system == system and sold_as(s)
                and abs(s.outer_diameter_m - diameter_m) <= STOCK_MATCH * diameter_m]
        return min(near, key=lambda s: abs(s.outer_diameter_m - diameter_m), default=None)

    def _table(self, kind: str) -> Mapping:
        tables = {"material": self.materials, "insulation": self.insulations,
                  "dielectric": self.dielectrics, "stub_line": self.stub_lines, "coax": self.coaxes,
                  "ground": self.grounds, "mode": self.modes}
        if kind not in tables:
            raise ValueError(f"unknown catalogue kind {kind!r}; expected one of {tuple(tables)}")
        return tables[kind]

    def names(self, kind: str) -> tuple[str, ...]:
        """Names of all entries of a kind (material, insulation, dielectric, stub_line, coax,
        ground, mode), in catalogue order."""
        return tuple(self._table(kind))

    def lookup(self, kind: str, name):
        """The entry `name` of `kind`, matched forgiving case, spaces, hyphens and underscores.

        Raises DesignError "unknown coax 'RG-8'; did you mean 'RG-8X'? (known: ...)".
        """
        table = self._table(kind)
        if isinstance(name, str):
            key = _fold(name)
            for entry_name, entry in table.items():
                if _fold(entry_name) == key:
                    return entry
        best = _closest(name, table)
        hint = f"; did you mean '{best}'?" if best else ""
        raise DesignError(f"unknown {_LABELS[kind]} '{name}'{hint} (known: {', '.join(table)})")

    def material(self, name: str) -> Material:
        return self.lookup("material", name)

    def insulation(self, name: str) -> Insulation:
        return self.lookup("insulation", name)

    def dielectric(self, name: str) -> Dielectric:
        return self.lookup("dielectric", name)

    def stub_line(self, name: str) -> StubLine:
        return self.lookup("stub_line", name)

    def coax(self, name: str) -> Coax:
        return self.lookup("coax", name)

    def ground(self, name: str) -> Ground:
        return self.lookup("ground", name)

    def mode(self, name: str) -> Mode:
        return self.lookup("mode", name)

    def duty_factor(self, mode: str) -> float:
        """Duty factor (0..1) of an operating mode, for average exposure power (CHECK_VALUES §5b)."""
        return self.mode(mode).duty_factor

    def bands(self, region: int) -> tuple[Band, ...]:
        """The amateur bands of ITU region 1, 2 or 3, lowest first."""
        if isinstance(region, bool) or region not in self.band_plan:
            raise DesignError(f"ITU region must be 1, 2 or 3, got {region!r}")
        return self.band_plan[region]

    def band_containing(self, f_hz: float, region: int) -> Band | None:
        """The band of `region` whose edges (inclusive) contain f_hz (Hz), or None."""
        return next((b for b in self.bands(region) if b.low_hz <= f_hz <= b.high_hz), None)

    def band_named(self, name: str, region: int) -> Band:
        """The band called `name` ("20 m", "70cm") in `region`; DesignError with a hint if none."""
        bands = self.bands(region)
        if isinstance(name, str):
            for band in bands:
                if _fold(band.name) == _fold(name):
                    return band
            elsewhere = [r for r in REGIONS if any(_fold(b.name) == _fold(name) for b in self.bands(r))]
            if elsewhere:
                raise DesignError(f"there is no {name} band in ITU region {region} (the catalogue has "
                                  f"it in region {' and '.join(map(str, elsewhere))})")
        known = [b.name for b in bands]
        best = _closest(name, known)
        hint = f"; did you mean '{best}'?" if best else ""
        raise DesignError(f"no band '{name}' in ITU region {region}{hint} (known: {', '.join(known)})")


def _loss_points(raw) -> tuple[tuple[float, float], ...]:
    return tuple((parse_quantity(f, "frequency"), _plain_number(db, "loss_db_per_100ft"))
                 for f, db in raw)


def _spread(name: str, e: dict, vf: float | None) -> tuple[tuple[float, float] | None, str]:
    """An entry's velocity_factor_spread and spread_source, checked: 0 < low <= high <= 1, the
    entry's own velocity factor inside, and a source beside it."""
    raw = e.get("velocity_factor_spread")
    if raw is None:
        return None, ""
    if not isinstance(raw, list) or len(raw) != 2:
        raise ValueError(f"catalog.yaml: {name}.velocity_factor_spread must be [low, high]")
    low, high = (_plain_number(v, f"{name}.velocity_factor_spread") for v in raw)
    if not 0.0 < low <= high <= 1.0 or (vf is not None and not low <= vf <= high):
        raise ValueError(f"catalog.yaml: {name}.velocity_factor_spread [{low}, {high}] must hold "
                         f"0 < low <= high <= 1 and the velocity factor {vf}")
    if not str(e.get("spread_source", "")).strip():
        raise ValueError(f"catalog.yaml: {name}.velocity_factor_spread needs a spread_source")
    return (low, high), " ".join(str(e["spread_source"]).split())


def _insulation(name: str, e: dict) -> Insulation:
    vf = _plain_number(e["velocity_factor"], name)
    spread, spread_source = _spread(name, e, vf)
    return Insulation(name, vf, e["source"], spread, spread_source)


def _stub_line(name: str, e: dict) -> StubLine:
    nominal = e["kind"] == "nominal"
    vf = _plain_number(e["velocity_factor"], f"{name}.velocity_factor") if nominal else None
    spread, spread_source = _spread(name, e, vf)
    return StubLine(
        name=name, kind=e["kind"],
        z0_ohm=parse_quantity(e["z0"], "impedance") if nominal else None,
        velocity_factor=vf,
        loss_db_per_100ft=_loss_points(e["loss_db_per_100ft"]) if nominal else (),
        spacing_m=parse_quantity(e["spacing"], "length"),
        conductor_diameter_m=parse_wire(e["conductor"]),
        conductor_material=e["conductor_material"], dielectric=e["dielectric"],
        source=e["source"], note=e.get("note", ""), velocity_factor_spread=spread,
        spread_source=spread_source)


def _coax(name: str, e: dict) -> Coax:
    def length(key):
        return parse_quantity(e[key], "length") if key in e else None

    return Coax(name, parse_quantity(e["z0"], "impedance"), _plain_number(e["velocity_factor"], name),
                parse_quantity(e["outer_diameter"], "length"), _loss_points(e["loss_db_per_100ft"]),
                e["source"], inner_diameter_m=length("inner_diameter"),
                dielectric_diameter_m=length("dielectric_diameter"), note=e.get("note", ""))


def _ground(name: str, e: dict) -> Ground:
    kind = e["kind"]
    if kind == "real":
        eps = _plain_number(e["permittivity"], f"{name}.permittivity")
        sigma = parse_quantity(e["conductivity"], "conductivity")
    else:
        # free space has no ground; a perfect ground conducts infinitely by definition
        eps, sigma = 1.0, (math.inf if kind == "perfect" else 0.0)
    return Ground(name=name, permittivity=eps, conductivity_s_m=sigma, kind=kind, source=e["source"])


def _bands(raw: list) -> dict[int, tuple[Band, ...]]:
    plan: dict[int, list[Band]] = {r: [] for r in REGIONS}
    for e in raw:
        for region, (low, high) in e["regions"].items():
            plan[region].append(Band(e["name"], parse_quantity(low, "frequency"),
                                     parse_quantity(high, "frequency"), e["source"]))
    return {r: tuple(sorted(bands, key=lambda b: b.low_hz)) for r, bands in plan.items()}


def _build(raw: dict) -> Catalog:
    frozen = MappingProxyType
    return Catalog(
        materials=frozen({n: Material(n, parse_quantity(e["conductivity"], "conductivity"), e["source"])
                          for n, e in raw["materials"].items()}),
        insulations=frozen({n: _insulation(n, e) for n, e in raw["insulation"].items()}),
        dielectrics=frozen({n: Dielectric(n, _plain_number(e["eps_r"], n), _plain_number(e["tan_delta"], n),
                                          e["source"])
                            for n, e in raw["dielectrics"].items()}),
        stub_lines=frozen({n: _stub_line(n, e) for n, e in raw["stub_lines"].items()}),
        coaxes=frozen({n: _coax(n, e) for n, e in raw["coax"].items()}),
        grounds=frozen({n: _ground(n, e) for n, e in raw["grounds"].items()}),
        modes=frozen({n: Mode(n, parse_quantity(e["duty_factor"], "fraction"), e["source"])
                      for n, e in raw["modes"].items()}),
        band_plan=frozen(_bands(raw["bands"])),
        stock=tuple(StockSize(e["name"], e["kind"], e["system"], parse_quantity(e["outer_diameter"], "length"),
                              e["source"]) for e in raw.get("stock", ())),
    )


def _text() -> str:
    path = pathlib.Path(__file__).with_name("data") / "catalog.yaml"
    if path.is_file():      # installed as files: read it without importlib.resources (2-6 ms to import)
        return path.read_text(encoding="utf-8")
    import importlib.resources

    return importlib.resources.files("buildsheet").joinpath("data/catalog.yaml").read_text(encoding="utf-8")


def _read(text: str) -> dict:
    # libyaml's parser where PyYAML has it: the same safe constructors, a tenth of the time (the
    # catalogue was 0.08 s of every build); tests/test_catalog.py checks both read it alike
    return yaml.load(text, Loader=getattr(yaml, "CSafeLoader", yaml.SafeLoader))


@functools.cache
def _raw() -> dict:
    """data/catalog.yaml as read: from catalog_data.py (the same data as Python literals, written by
    write_catalog_data) when that was written from this very text, else by the YAML reader (reading
    the YAML was about 8 ms of every build; tests/test_catalog.py checks the two alike)."""
    text = _text()
    from buildsheet import catalog_data

    if catalog_data.SHA256 == hashlib.sha256(text.encode("utf-8")).hexdigest():
        return catalog_data.DATA
    return _read(text)


def write_catalog_data(path=None) -> None:
    """Write buildsheet/catalog_data.py: data/catalog.yaml as the YAML reader gives it, as Python
    literals (pprint: repr of every value, so floats and strings come back exactly), with the
    SHA-256 of the text it was read from. Run after editing data/catalog.yaml (tests fail until)."""
    import pathlib
    import pprint

    text = _text()
    data = _read(text)
    body = pprint.pformat(data, width=100, sort_dicts=False)
    out = pathlib.Path(__file__).with_name("catalog_data.py") if path is None else pathlib.Path(path)
    out.write_text('"""data/catalog.yaml as read by catalog._read, as Python literals: written by '
                   'catalog.write_catalog_data()\n(do not edit; used only while SHA256 is that of '
                   'data/catalog.yaml)."""\n\n'
                   f"SHA256 = {hashlib.sha256(text.encode('utf-8')).hexdigest()!r}\n\nDATA = {body}\n",
                   encoding="utf-8")


@functools.cache
def catalog() -> Catalog:
    """The catalogue, read once from the package's data/catalog.yaml."""
    return _build(_raw())


def raw_section(name: str):
    """One top-level section of data/catalog.yaml as read (for modules that own its meaning, such as
    buildsheet/ratings.py); callers must not change it."""
    return _raw()[name]


@functools.cache
def national_bands(country: str) -> tuple[Band, ...]:
    """Bands where a national table differs from the ITU table (`national:` under a band), for a
    country code such as 'US' (case-insensitive), lowest first; () for a country with none."""
    out = []
    for e in _raw()["bands"]:
        for code, nat in (e.get("national") or {}).items():
            if code.casefold() == str(country).casefold():
                low, high = (parse_quantity(v, "frequency") for v in nat["edges"])
                out.append(Band(nat.get("name", e["name"]), low, high, " ".join(nat["source"].split())))
    return tuple(sorted(out, key=lambda b: b.low_hz))


def countries() -> tuple[str, ...]:
    """The country codes that have national band edges in the catalogue."""
    return tuple(sorted({code for e in _raw()["bands"] for code in (e.get("national") or {})}))
