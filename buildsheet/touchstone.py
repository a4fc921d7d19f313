"""Measured one-port sweeps: owns reading Touchstone 1-port (.s1p) and R/X CSV files into a Sweep of
frequency (Hz) and impedance (ohm); it knows nothing of designs, the antenna model or the fit.

Symbols (SI): f frequency, Hz; z impedance R + jX, ohm; rho reflection coefficient (Gamma in most
texts; gamma is kept for propagation elsewhere); z_ref reference resistance of the file, ohm.

Touchstone 1.1 (EIA/IBIS Open Forum, "Touchstone File Format Specification", version 1.1, 2002):
  - `!` starts a comment, to the end of the line; blank lines are ignored; case does not matter.
  - The option line `# [Hz|kHz|MHz|GHz] [S|Y|Z] [RI|MA|DB] [R n]` comes before the data, its fields in
    any order, each optional; the defaults are GHz, S, MA, R 50. Only the first option line counts
    (the specification says later ones are ignored). Without an option line every default applies.
  - A 1-port record is a frequency and one value as a pair of numbers: RI real and imaginary part;
    MA magnitude and angle (degrees); DB 20 log10 of the magnitude and angle (degrees). Records
    stay on one line; this reader also accepts several records on one line (3, 6, 9 ... numbers).
  - Frequencies increase strictly.
  - Version 1.x Z and Y data are normalised: Z = R z, Y = y / R (z, y the numbers in the file).
    S data are reflection coefficients on R: Z = R (1 + S)/(1 - S).
  H and G parameters exist only for 2-ports; Touchstone 2 keywords ([Version] ...) are refused with
  a hint to save the sweep as Touchstone 1.1.

CSV (this project's own small grammar):
  - UTF-8 text, comma-separated; lines starting with `#` and blank lines are ignored.
  - The first other line is the header: exactly three names, in any order, case and surrounding
    spaces ignored: the frequency `frequency_<unit>` or `freq_<unit>` with <unit> one of hz, khz,
    mhz, ghz; the resistance `r_ohm` or `resistance_ohm`; the reactance `x_ohm` or `reactance_ohm`.
  - Each further line: three plain numbers (a '.' decimal point, no thousands separators).
  - Frequencies increase strictly.
    Example:  frequency_mhz,r_ohm,x_ohm
              14.000,38.2,-21.5

Every problem raises SweepError naming the file, the line and what is wrong.
"""

from __future__ import annotations

import csv
import io
import math
import os
from dataclasses import dataclass

import numpy as np

from buildsheet.errors import SweepError
from buildsheet.physics.lines import reflection
from buildsheet.reading import decode_text, read_capped
from buildsheet.valueclass import valueclass

MAX_BYTES = 8 * 1024 * 1024
#: most points a sweep may hold: a fit's cost grows with the points, and analysers give at most a
#: few thousand (common practice: 101 to 10,001 points per sweep)
MAX_POINTS = 20001
#: frequencies a sweep can hold, Hz: wide (the designs are 1.8 to 450 MHz), it only catches a wrong unit
FREQUENCY_RANGE_HZ = (1.0, 1e12)
#: |rho| a passive antenna cannot exceed; a little above 1 is left to the analyser's calibration
#: error (common practice: a calibrated analyser reads an open or a short within a few per cent)
MAX_REFLECTION = 1.05
FREQUENCY_UNITS = {"hz": 1.0, "khz": 1e3, "mhz": 1e6, "ghz": 1e9}
PARAMETERS = ("s", "y", "z")
FORMATS = ("ri", "ma", "db")
EXTENSIONS = (".s1p", ".csv")
#: the reference on which a CSV's R and X are checked for |rho| (the passivity check does not depend
#: on it: R < 0 gives |rho| > 1 on every positive reference)
CSV_REFERENCE_OHM = 50.0

_CSV_FREQUENCY = {f"{stem}_{unit}": factor for stem in ("frequency", "freq")
                  for unit, factor in FREQUENCY_UNITS.items()}
_CSV_R = ("r_ohm", "resistance_ohm")
_CSV_X = ("x_ohm", "reactance_ohm")


@dataclass(frozen=True, eq=False)
class Sweep:
    """A measured one-port sweep: frequency_hz (strictly increasing, Hz), z_ohm (complex impedance at
    each frequency, ohm), path (the file it was read from), lines (1-based line of each point)."""
    frequency_hz: np.ndarray
    z_ohm: np.ndarray
    path: str
    lines: tuple

    def reflection(self, z_ref: float) -> np.ndarray:
        """rho = (z - z_ref)/(z + z_ref) on a real reference z_ref (ohm)."""
        return reflection(self.z_ohm, z_ref)


@valueclass
class Options:
    """The Touchstone option line: frequency factor to Hz, parameter s|y|z, format ri|ma|db, R (ohm)."""
    frequency_factor: float = 1e9
    parameter: str = "s"
    format: str = "ma"
    resistance_ohm: float = 50.0


def read_sweep(path: str | os.PathLike) -> Sweep:
    """Read a sweep file; the extension chooses the grammar (.s1p Touchstone, .csv R/X table)."""
    path = os.fspath(path)
    ext = os.path.splitext(path)[1].lower()
    if ext not in EXTENSIONS:
        hint = " (a multi-port file: measure the antenna as a 1-port, .s1p)" if \
            ext[:2] == ".s" and ext.endswith("p") else ""
        raise SweepError(f"has the extension '{ext or '(none)'}'; a sweep is a Touchstone 1-port file "
                         f"(.s1p) or a CSV of frequency, R and X (.csv){hint}", file=path)
    text = _read_text(path)
    return parse_touchstone(text, path) if ext == ".s1p" else parse_csv(text, path)


def _read_text(path: str) -> str:
    raw, _ = read_capped(path, MAX_BYTES, SweepError, "a sweep file")
    return decode_text(raw, path, SweepError, "a text sweep")


# ----------------------------------------------------------------------------------------------
# Touchstone 1.1

def parse_options(line: str, file: str | None = None, line_no: int | None = None) -> Options:
    """The option line's fields (text after '#', comment removed), defaults per Touchstone 1.1."""
    tokens = line.split()
    values: dict = {}
    i = 0
    while i < len(tokens):
        tok = tokens[i].lower()
        if tok in FREQUENCY_UNITS:
            key, value = "frequency_factor", FREQUENCY_UNITS[tok]
        elif tok in PARAMETERS:
            key, value = "parameter", tok
        elif tok in ("h", "g"):
            raise SweepError(f"the option line names {tok.upper()} parameters, which exist only for "
                             "2-ports; a 1-port sweep holds S, Y or Z", file=file, line=line_no)
        elif tok in FORMATS:
            key, value = "format", tok
        elif tok == "r":
            if i + 1 >= len(tokens):
                raise SweepError("the option line's R needs the reference resistance after it "
                                 "('R 50')", file=file, line=line_no)
            i += 1
            value = _number(tokens[i], file, line_no, "the reference resistance")
            if not value > 0:
                raise SweepError(f"the reference resistance must be above 0 ohm, got {tokens[i]}",
                                 file=file, line=line_no)
            key = "resistance_ohm"
        else:
            raise SweepError(f"the option line has '{tokens[i]}', which is none of Hz kHz MHz GHz, "
                             "S Y Z, RI MA DB or R n", file=file, line=line_no)
        if key in values:
            raise SweepError(f"the option line gives the {key.split('_')[0]} twice", file=file,
                             line=line_no)
        values[key] = value
        i += 1
    return Options(**values)


def _number(token: str, file, line_no, what: str) -> float:
    try:
        value = float(token)
    except ValueError:
        raise SweepError(f"'{token}' is not a number ({what})", file=file, line=line_no) from None
    if not math.isfinite(value):
        raise SweepError(f"'{token}' is not a finite number ({what})", file=file, line=line_no)
    return value


def parse_touchstone(text: str, file: str | None = None) -> Sweep:
    """A Sweep from Touchstone 1.1 1-port text (grammar in the module docstring)."""
    options: Options | None = None
    records: list[tuple[int, float, float, float]] = []
    for line_no, raw in enumerate(text.splitlines(), start=1):
        line = raw.partition("!")[0].strip()
        if not line:
            continue
        if line.startswith("#"):
            if records and options is None:
                raise SweepError("the option line must come before the data", file=file, line=line_no)
            if options is None:
                options = parse_options(line[1:], file, line_no)
            continue
        if line.startswith("["):
            raise SweepError(f"'{line.split(']')[0]}]' is a Touchstone 2 keyword; save the sweep as "
                             "Touchstone 1.1 (.s1p)", file=file, line=line_no)
        tokens = line.split()
        if len(tokens) % 3:
            raise SweepError(f"has {len(tokens)} numbers; a 1-port record is a frequency and two "
                             "numbers (3 per record)", file=file, line=line_no)
        numbers = [_number(t, file, line_no, "data") for t in tokens]
        for k in range(0, len(numbers), 3):
            records.append((line_no, *numbers[k:k + 3]))
    options = options or Options()
    if not records:
        raise SweepError("holds no data (frequency and value lines)", file=file)
    lines = tuple(r[0] for r in records)
    _check_count(len(records), file)
    data = np.array([r[1:] for r in records], dtype=float)
    with np.errstate(all="ignore"):
        f = data[:, 0] * options.frequency_factor
        value = _complex_values(data[:, 1], data[:, 2], options.format)
    _check_frequencies(f, lines, file)
    bad = np.nonzero(~np.isfinite(value))[0]
    if len(bad):
        raise SweepError("has a value too large to be a measurement", file=file, line=lines[bad[0]])
    z_ref = options.resistance_ohm
    with np.errstate(all="ignore"):
        if options.parameter == "s":
            z = z_ref * (1 + value) / (1 - value)
        elif options.parameter == "z":
            z = z_ref * value
        else:
            z = z_ref / value
    bad = np.nonzero(~np.isfinite(z))[0]
    if len(bad):
        what = {"s": "a reflection coefficient of 1 (an open)", "y": "an admittance of 0 (an open)",
                "z": "an infinite impedance"}[options.parameter]
        raise SweepError(f"gives {what}: the impedance is infinite there", file=file, line=lines[bad[0]])
    z = z.astype(complex)
    _check_passive(z, z_ref, lines, file)
    return Sweep(frequency_hz=f, z_ohm=z, path=file or "", lines=lines)


def _check_count(n: int, file) -> None:
    if n > MAX_POINTS:
        raise SweepError(f"has more than {MAX_POINTS} points; sweep the antenna's band with fewer "
                         "(a few hundred are plenty for a fit)", file=file)


def _check_passive(z: np.ndarray, z_ref: float, lines: tuple, file) -> None:
    """An antenna is passive: |rho| <= 1 on any real reference (R >= 0). A point beyond
    MAX_REFLECTION is a measurement error, not an antenna."""
    with np.errstate(all="ignore"):
        mag = np.abs((z - z_ref) / (z + z_ref))
    bad = np.nonzero(~(mag <= MAX_REFLECTION))[0]
    if len(bad):
        i = bad[0]
        raise SweepError(f"has |S11| = {mag[i]:.3g} (R = {z[i].real:.4g} ohm), more than 1: a passive "
                         "antenna cannot reflect more than it receives; the analyzer is not calibrated "
                         "(calibrate it with open, short and load at the end of its cable)",
                         file=file, line=lines[i])


def _complex_values(a: np.ndarray, b: np.ndarray, fmt: str) -> np.ndarray:
    """Complex numbers from the pair (a, b): RI a + jb; MA a e^{jb deg}; DB 10^(a/20) e^{jb deg}."""
    if fmt == "ri":
        return a + 1j * b
    magnitude = a if fmt == "ma" else 10.0 ** (a / 20.0)
    return magnitude * np.exp(1j * np.radians(b))


def _check_frequencies(f: np.ndarray, lines: tuple, file: str | None) -> None:
    if not f[0] > 0:
        raise SweepError(f"has the frequency {f[0]:g} Hz; frequencies must be above 0", file=file,
                         line=lines[0])
    lo, hi = FREQUENCY_RANGE_HZ
    outside = np.nonzero(~((f >= lo) & (f <= hi)))[0]
    if len(outside):
        i = outside[0]
        shown = f"{f[i]:.3g} Hz" if np.isfinite(f[i]) else "a frequency too large for a number"
        raise SweepError(f"has {shown}; a sweep lies between 1 Hz and 1 THz (is the "
                         "frequency unit right?)", file=file, line=lines[i])
    steps = np.nonzero(np.diff(f) <= 0)[0]
    if len(steps):
        i = steps[0] + 1
        raise SweepError(f"has the frequency {f[i]:.9g} Hz after {f[i - 1]:.9g} Hz; frequencies must "
                         "increase from line to line", file=file, line=lines[i])


# ----------------------------------------------------------------------------------------------
# CSV

def parse_csv(text: str, file: str | None = None) -> Sweep:
    """A Sweep from CSV text of frequency, R and X (grammar in the module docstring)."""
    header: list[str] | None = None
    columns: tuple[int, int, int] = (0, 1, 2)
    factor = 1.0
    rows: list[tuple[int, float, float, float]] = []
    for line_no, fields in csv_rows(text, file):
        if fields[0].lstrip().startswith("#"):
            continue
        if header is None:
            header = [s.strip().lower() for s in fields]
            columns, factor = _csv_columns(header, file, line_no)
            continue
        if len(fields) != 3:
            raise SweepError(f"has {len(fields)} fields; each line after the header has three "
                             f"({', '.join(header)})", file=file, line=line_no)
        values = [_number(fields[c].strip(), file, line_no, header[c]) for c in columns]
        rows.append((line_no, *values))
        _check_count(len(rows), file)
    if header is None:
        raise SweepError("is empty; a CSV sweep starts with a header such as "
                         "'frequency_mhz,r_ohm,x_ohm'", file=file)
    if not rows:
        raise SweepError("holds a header but no data lines", file=file)
    lines = tuple(r[0] for r in rows)
    data = np.array([r[1:] for r in rows], dtype=float)
    with np.errstate(all="ignore"):
        f = data[:, 0] * factor
    _check_frequencies(f, lines, file)
    z = data[:, 1] + 1j * data[:, 2]
    _check_passive(z, CSV_REFERENCE_OHM, lines, file)
    return Sweep(frequency_hz=f, z_ohm=z, path=file or "", lines=lines)


def csv_rows(text: str, file):
    """(line number, fields) of each non-blank row of a CSV text; a text the csv module cannot
    take is a SweepError naming the line. CR, LF and CRLF line ends all end a line (newline=None;
    csv refuses a bare CR inside a field)."""
    reader = csv.reader(io.StringIO(text, newline=None))
    while True:
        try:
            fields = next(reader)
        except StopIteration:
            return
        except csv.Error as exc:
            raise SweepError(f"is not a CSV table the reader can take ({exc})", file=file,
                             line=reader.line_num or None) from None
        if fields and any(s.strip() for s in fields):
            yield reader.line_num, fields


def _csv_columns(header: list[str], file, line_no) -> tuple[tuple[int, int, int], float]:
    """Indices of (frequency, R, X) in the header, and the frequency's factor to Hz."""
    expected = "a frequency (frequency_hz, _khz, _mhz or _ghz; or freq_...), r_ohm and x_ohm"
    if len(header) != 3:
        raise SweepError(f"the header has {len(header)} columns; it names three: {expected}",
                         file=file, line=line_no)
    found: dict[str, int] = {}
    factor = 1.0
    for i, name in enumerate(header):
        if name in _CSV_FREQUENCY:
            kind = "frequency"
            factor = _CSV_FREQUENCY[name]
        elif name in _CSV_R:
            kind = "resistance"
        elif name in _CSV_X:
            kind = "reactance"
        elif name in ("frequency", "freq", "r", "x", "resistance", "reactance"):
            raise SweepError(f"the header's '{name}' needs its unit ('{name}_mhz' or '{name}_ohm' "
                             f"style); expected {expected}", file=file, line=line_no)
        else:
            raise SweepError(f"the header's '{name}' is not a column name; expected {expected}",
                             file=file, line=line_no)
        if kind in found:
            raise SweepError(f"the header names the {kind} twice", file=file, line=line_no)
        found[kind] = i
    return (found["frequency"], found["resistance"], found["reactance"]), factor
