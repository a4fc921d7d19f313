"""The quick start (`buildsheet start`): owns turning a few answers (band or frequency, stub line,
coax, orientation, height, units) into the text of a commented schema-1 design file that `check`
accepts as it is. It asks nothing itself (cli.py prompts on a terminal) and writes nothing: the text
is validated by design.py before cli.py writes it, so a refused answer leaves no file behind.
"""

from __future__ import annotations

import math
import os
import re
import tempfile

from buildsheet import units
from buildsheet.catalog import catalog
from buildsheet.errors import BuildsheetError, DesignError
from buildsheet.valueclass import valueclass

C0 = 299_792_458.0
#: the slope a new sloper starts from (common practice: 30-45 degrees below horizontal)
SLOPE_DEG = 30
#: the stub's bottom is kept at least this far above ground on a new horizontal or sloper, m
#: (common practice: out of reach of a person standing under it)
CLEAR_M = 2.5
#: a new inverted antenna's far end is kept this far above ground, m (the same reach, and room for the
#: stub and radiator to come out a little longer than three quarters of a wavelength of air)
INVERTED_CLEAR_M = 3.0


@valueclass
class Answers:
    """What the builder told the quick start; None where they said nothing (defaults apply)."""
    name: str
    band: str | None = None
    frequency: str | None = None
    line: str | None = None
    coax: str | None = None
    orientation: str | None = None
    height: str | None = None
    units: str | None = None
    region: int = 2
    title: str | None = None


def slug(path: str) -> str:
    """The design name from the file name: 'Oak Yard 20m.yaml' -> 'oak-yard-20m'."""
    stem = os.path.splitext(os.path.basename(path))[0].lower()
    name = re.sub(r"[^a-z0-9]+", "-", stem).strip("-")[:64]
    if not name:
        raise BuildsheetError("the file name gives no design name (letters or digits)", file=path)
    return name


def _frequency(a: Answers) -> tuple[float, str]:
    """The design frequency in Hz and how it was chosen (for the file's comment)."""
    c = catalog()
    if a.frequency:
        try:
            f = units.parse_quantity(a.frequency, "frequency")
        except BuildsheetError as exc:
            raise BuildsheetError(exc.problem, key="--frequency") from None
        return f, "as given"
    if not a.band:
        raise BuildsheetError("give --band (such as '20 m') or --frequency (such as '14.2 MHz')")
    try:
        band = c.band_named(a.band, a.region)      # "20 m", "20m", "70cm": spaces do not matter
    except DesignError as exc:
        raise BuildsheetError(exc.problem, key="--band") from None
    # the middle of the band, to the kHz
    f = round((band.low_hz + band.high_hz) / 2 / 1e3) * 1e3
    return f, f"the middle of the {band.name} band, ITU region {a.region}"


def _check_choice(value: str, names, option: str) -> str:
    folded = {n.casefold(): n for n in names}
    if value.casefold() in folded:
        return folded[value.casefold()]
    raise BuildsheetError(f"must be one of {', '.join(names)}, got '{value}'", key=option)


def design_text(a: Answers) -> str:
    """The commented design file for the answers (schema 1, DESIGN.md §4)."""
    c = catalog()
    f, why = _frequency(a)
    line = _check_choice(a.line, c.names("stub_line"), "--line") if a.line else "window-450"
    coax = _check_choice(a.coax, c.names("coax"), "--coax") if a.coax else "RG-8X"
    orientation = _check_choice(a.orientation, ("horizontal", "sloper", "vertical", "inverted"),
                                "--orientation") \
        if a.orientation else ("horizontal" if f < 30e6 else "vertical")
    unit_system = _check_choice(a.units, ("imperial", "metric"), "--units") if a.units else (
        "imperial" if a.region == 2 else "metric")
    lam = C0 / f
    if a.height:
        try:
            height = units.parse_quantity(a.height, "length")
        except BuildsheetError as exc:
            raise BuildsheetError(exc.problem, key="--height") from None
        height_text = a.height.strip()
    else:
        if orientation == "vertical":
            height = 3.0
        elif orientation == "inverted":   # the short at the top: stub and radiator (3/4 wave) below it,
            height = math.ceil(0.75 * lam + INVERTED_CLEAR_M)       # the far end above heads
        else:   # the stub (a quarter wave of line at most) hangs below the open top, clear of heads
            height = max(10.0, math.ceil(lam / 4 + CLEAR_M))
        height_text = (f"{math.ceil(height / units.FOOT_M)} ft" if unit_system == "imperial"
                       else f"{height:g} m")
    del height   # checked by design.py with the solved stub
    low_band = f < 30e6
    mode = "ssb" if low_band else "fm"
    form = "110 mm" if low_band else "60 mm"
    title = a.title or f"{units.format_frequency(f)} {orientation} end-fed, first draft"
    where = {"horizontal": "the stub's open top (the end of the radiator at the support)",
             "sloper": "the stub's open top, at the high support",
             "vertical": "the short, at the bottom of the stub",
             "inverted": "the short, at the top (the stub and the radiator hang below it)"}[orientation]
    out = [
        f"# {a.name}: written by `buildsheet start`. Edit it, then `buildsheet check` and `buildsheet build`.",
        "# `buildsheet catalogue` lists the wires, lines, coax, grounds and bands this file may name.",
        "buildsheet: 1",
        f"name: {a.name}",
        f"title: {_yaml_text(title)}",
        _kv("frequency", f"{f / 1e6:.3f} MHz", f"{why}; the tap is matched here"),
        _kv("region", str(a.region), "ITU region: sets the band edges"),
        "radiator:",
        _kv("  wire", "14 AWG", "a gauge, or a diameter such as '15.9 mm' for pipe"),
        _kv("  material", "copper", "copper | copper-clad-steel | aluminium | bronze"),
        _kv("  insulation", "bare", "bare | pvc | polyethylene"),
        "stub:",
        _kv("  line", line, f"{' | '.join(c.names('stub_line'))}, or {{spacing, conductor, dielectric}}"),
        "feed:",
        _kv("  coax", coax, " | ".join(c.names("coax"))),
        _kv("  length", "15 m", "coax from the tap to the transmitter"),
        _kv("  choke_form", form, "outside diameter of the form the coax is wound on"),
        "site:",
        _kv("  orientation", orientation, "horizontal | sloper | vertical | inverted"),
        _kv("  height", height_text, where),
    ]
    if orientation == "sloper":
        out.append(_kv("  slope", f"{SLOPE_DEG} deg", "the radiator's angle below horizontal"))
    out += [
        _kv("  ground", "average", "free-space | perfect | poor | average | very-good | sea-water"),
        "power:",
        _kv("  transmitter", "100 W", "PEP at the transmitter"),
        _kv("  mode", mode, "ssb | cw | fm | digital (for the RF-exposure average)"),
        "output:",
        _kv("  units", unit_system, "imperial | metric"),
        _kv("  paper", "letter" if a.region == 2 else "a4", "letter | a4"),
        "",
    ]
    return "\n".join(out)


def _kv(key: str, value: str, comment: str) -> str:
    """One `key: value  # comment` line, the comments of a file in one column."""
    return f"{key}: {value}".ljust(28) + f"# {comment}"



def _yaml_text(text: str) -> str:
    return '"' + text.replace("\\", "\\\\").replace('"', '\\"') + '"'


def write_new(path: str, text: str) -> None:
    """Write `text` to `path`, which must not exist: validated first as `check` validates
    (design.load_design and the solved geometry's ground clearance, on a temporary file beside
    it), then linked into place so that an existing file is never replaced, not even one created
    meanwhile, and a reader never sees half a file."""
    from buildsheet.design import load_design
    from buildsheet.solver import check_geometry

    if os.path.lexists(path):
        raise BuildsheetError("already exists; the quick start never overwrites a file: choose another "
                              "name or remove it", file=path)
    folder = os.path.dirname(os.path.abspath(path))
    try:
        fd, tmp = tempfile.mkstemp(prefix=".start-", suffix=".yaml", dir=folder)
    except OSError as exc:
        raise BuildsheetError(f"cannot write the design: {exc.strerror or exc}", file=path) from None
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as out:
            out.write(text)
            out.flush()
            os.fsync(out.fileno())
        try:
            check_geometry(load_design(tmp))    # what `check` accepts, solved clearance included
        except BuildsheetError as exc:
            raise BuildsheetError(f"these answers do not make a valid design: {exc.problem}"
                                  + (f" (key {exc.key})" if exc.key else ""), file=path) from None
        try:
            os.link(tmp, path)
        except FileExistsError:
            raise BuildsheetError("already exists; the quick start never overwrites a file", file=path) from None
        except OSError as exc:
            raise BuildsheetError(f"cannot write the design: {exc.strerror or exc}", file=path) from None
    finally:
        try:
            os.unlink(tmp)
        except OSError:
            pass
