"""Quantities: parse "number + unit" text into SI and format SI numbers for the sheet; no design keys, no I/O.

Owns the quantity grammar of DESIGN.md §4 and the sheet's rounding of lengths. Raises UnitError with
the problem only: the caller (design.py) adds file, key and line.

SI inside: Hz, m, ohm, W, S/m, rad; a fraction is 0..1 ("40 %" -> 0.4).

Grammar. A number (sign, decimals and exponent allowed: "-1.5e3"), an optional space, a unit:

    frequency     Hz kHz MHz GHz
    length        m cm mm in ft, and feet then inches: "33 ft 2 in", "33' 2\"", "16' 4-3/8\"";
                  inches and feet may be whole, decimal, fractional ("1/2 in") or mixed
                  ("2-3/8 in", "2 3/8 in"); a leading sign applies to the whole length
    impedance     ohm Ω kohm kΩ
    power         W kW
    conductivity  S/m
    angle         deg °            (returned in radians)
    fraction      %
    wire (parse_wire)  "14 AWG", "#14", "4/0 AWG", "0000 AWG", or a diameter as a length

Case is forgiven where no other unit could be meant ("mhz", "OHM", "kw"), but never for the m of
metre and milli: "M", "MM" and "S/M" are refused with a hint, so a metre is never read as mega.
(There is no mW or MW, so "mhz" and "kw" cannot mean anything else.)

Formatting writes what the embedded font (Vera) can print: ASCII feet and inches (' and " and
4-3/8; Vera has no ⅛, ′ or ″) and Ω as U+03A9 (Vera has no U+2126). Everything written by
format_length parses back with parse_quantity(..., "length") to within half the rounding step.
"""

from __future__ import annotations

import math
import re

from buildsheet.errors import UnitError

INCH_M = 0.0254
FOOT_M = 0.3048

#: canonical unit -> (kind, factor to SI). AWG is listed only so that "14 AWG" given where a
#: length is expected is named as a gauge; parse_wire reads gauges.
_UNITS: dict[str, tuple[str, float]] = {
    "Hz": ("frequency", 1.0),
    "kHz": ("frequency", 1e3),
    "MHz": ("frequency", 1e6),
    "GHz": ("frequency", 1e9),
    "m": ("length", 1.0),
    "cm": ("length", 1e-2),
    "mm": ("length", 1e-3),
    "in": ("length", INCH_M),
    "ft": ("length", FOOT_M),
    "ohm": ("impedance", 1.0),
    "kohm": ("impedance", 1e3),
    "W": ("power", 1.0),
    "kW": ("power", 1e3),
    "S/m": ("conductivity", 1.0),
    "deg": ("angle", math.pi / 180.0),
    "%": ("fraction", 0.01),
    "AWG": ("wire gauge", math.nan),
}

_ALIASES = {
    "Ω": "ohm", "\u2126": "ohm", "ohms": "ohm", "kΩ": "kohm", "k\u2126": "kohm", "kohms": "kohm",
    "°": "deg", "degree": "deg", "degrees": "deg",
    "'": "ft", "\u2032": "ft", "foot": "ft", "feet": "ft",
    '"': "in", "\u2033": "in", "inch": "in", "inches": "in",
    "metre": "m", "metres": "m", "meter": "m", "meters": "m",
}

_SPELLINGS = {**{u: u for u in _UNITS}, **_ALIASES}

#: kinds whose units contain m for metre or milli: the case of that m must be exact
_STRICT_M_KINDS = ("length", "conductivity")

_HINTS = {
    "frequency": "Hz, kHz, MHz, GHz",
    "length": "m, cm, mm, in, ft, or feet and inches like 33' 2\"",
    "impedance": "ohm, Ω, kohm",
    "power": "W, kW",
    "conductivity": "S/m",
    "angle": "deg or °",
    "fraction": "%",
}
KINDS = tuple(_HINTS)

_UNSIGNED = r"(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?"
_BARE_NUMBER = re.compile(rf"[+-]?{_UNSIGNED}")
_SIMPLE = re.compile(rf"(?P<num>{_UNSIGNED})\s*(?P<unit>.*)", re.S)
# mixed number first ("4-3/8", "2 3/8"), then a fraction, then a decimal: the first alternative
# that lets the rest match wins, so "33 ft" is still read as 33 and ft
_LENGTH_TERM = re.compile(
    rf"\s*(?P<num>\d+(?:-|\s+)\d+/\d+|\d+/\d+|{_UNSIGNED})\s*(?P<unit>[^\s\d.]*)\s*")
_MIXED = re.compile(r"(?:(?P<whole>\d+)(?:-|\s+))?(?P<top>\d+)/(?P<bottom>\d+)")
_AWG = re.compile(r"#\s*(?P<a>\d+(?:/0)?)\s*(?:awg)?|(?P<b>\d+(?:/0)?)\s*awg|awg\s*#?\s*(?P<c>\d+(?:/0)?)",
                  re.I)


def article(text: str) -> str:
    """'a' or 'an' before `text` as it is read aloud: a word by its first letter, a number by how it
    is spoken (an 8, an 11, an 18, an 82' 0", an 18.6 m; a 1, a 110, a 25 m)."""
    digits = re.match(r"\d[\d,]*", text)
    if digits is None:
        return "an" if text[:1].lower() in tuple("aeiou") else "a"
    whole = digits.group().replace(",", "")
    # eight..., or eleven/eighteen (thousand, million ...): a group of two leading digits
    return "an" if whole[0] == "8" or (len(whole) % 3 == 2 and whole[:2] in ("11", "18")) else "a"


def _needs_unit(kind: str, text: str) -> str:
    return _needs_unit_got(kind, f"'{text}'")


def _needs_unit_got(kind: str, got: str) -> str:
    return f"must be {article(kind)} {kind} with a unit ({_HINTS[kind]}), got {got}"


def _text_of(value, kind: str) -> str:
    """The quantity's text, refusing bare numbers and non-text with a message that asks for a unit."""
    if isinstance(value, (bool, int, float)):
        raise UnitError(_needs_unit(kind, str(value)))
    if not isinstance(value, str):
        raise UnitError(_needs_unit_got(kind, "nothing" if value is None else repr(value)))
    text = value.strip().replace("\u2212", "-")
    if _BARE_NUMBER.fullmatch(text):
        raise UnitError(_needs_unit(kind, text))
    return text


def _canonical(spelling: str) -> str | None:
    """The canonical unit a spelling names, or None. Case is forgiven except for metre's/milli's m."""
    if spelling in _SPELLINGS:
        return _SPELLINGS[spelling]
    folded = spelling.casefold()
    for known, canon in _SPELLINGS.items():
        if known.casefold() != folded or len(known) != len(spelling):
            continue
        if _UNITS[canon][0] in _STRICT_M_KINDS and any(
                k == "m" and s != "m" for k, s in zip(known, spelling)):
            continue
        return canon
    return None


def _suggest(spelling: str, kinds: tuple[str, ...]) -> str | None:
    """Closest known spelling among units of `kinds`, ignoring case."""
    import difflib      # only on a mistake

    folded = {s.casefold(): s for s, c in _SPELLINGS.items() if _UNITS[c][0] in kinds}
    best = difflib.get_close_matches(spelling.casefold(), list(folded), n=1, cutoff=0.5)
    return folded[best[0]] if best else None


def _unit_factor(unit: str, kind: str, text: str, hint_kinds: tuple[str, ...]) -> float:
    """SI factor of `unit` for a quantity of `kind`; UnitError naming the unit if unknown or wrong.

    hint_kinds: the kinds of unit a "did you mean" may suggest.
    """
    canon = _canonical(unit)
    if canon is None:
        best = _suggest(unit, hint_kinds)
        if best is None:
            raise UnitError(f"'{text}' has an unknown unit '{unit}'; {article(kind)} {kind} needs one of "
                            f"{_HINTS[kind]}")
        note = " (m is metre or milli, M is mega)" if best.casefold() == unit.casefold() else ""
        raise UnitError(f"'{text}' has an unknown unit '{unit}'; did you mean '{best}'?{note}")
    unit_kind, factor = _UNITS[canon]
    if unit_kind != kind:
        raise UnitError(f"'{text}' is {article(unit_kind)} {unit_kind}, not {article(kind)} {kind}")
    return factor


def _number(num: str, text: str) -> float:
    """Value of a decimal, a fraction ("3/8") or a mixed number ("4-3/8", "4 3/8")."""
    mixed = _MIXED.fullmatch(num)
    if mixed is None:
        return float(num)
    if int(mixed["bottom"]) == 0:
        raise UnitError(f"'{text}' has a fraction with a zero denominator")
    return int(mixed["whole"] or 0) + int(mixed["top"]) / int(mixed["bottom"])


def _parse_length(text: str, body: str, hint_kinds: tuple[str, ...]) -> float:
    terms = []
    pos = 0
    while pos < len(body):
        match = _LENGTH_TERM.match(body, pos)
        if match is None:
            raise UnitError(_needs_unit("length", text))
        terms.append((match["num"], match["unit"]))
        pos = match.end()
    if not terms:
        raise UnitError(_needs_unit("length", text))
    if len(terms) == 1:
        num, unit = terms[0]
        if not unit:
            raise UnitError(_needs_unit("length", text))
        return _number(num, text) * _unit_factor(unit, "length", text, hint_kinds)
    for _, unit in terms:
        if unit:
            _unit_factor(unit, "length", text, hint_kinds)
    if len(terms) == 2 and [_canonical(u) for _, u in terms] == ["ft", "in"]:
        return _number(terms[0][0], text) * FOOT_M + _number(terms[1][0], text) * INCH_M
    if len(terms) == 2 and _canonical(terms[0][1]) == "ft" and not terms[1][1]:
        raise UnitError(f"'{text}': the {terms[1][0]} after the feet needs a unit (in or \")")
    raise UnitError(f"'{text}' is not a length I can read: only feet followed by inches combine, "
                    "as in '33 ft 2 in' or '33' 2\"'")


def parse_quantity(value, kind: str) -> float:
    """The SI value of a quantity written as number + unit (grammar in the module docstring).

    value: the text from the design file (str; numbers without a unit are refused); kind: one of
    KINDS. Returns Hz, m, ohm, W, S/m, rad or a fraction 0..1, with the sign as written. Raises
    UnitError for a missing, unknown or wrong-dimension unit, or a value that is not finite.
    """
    return _parse(value, kind, (kind,))


def _parse(value, kind: str, hint_kinds: tuple[str, ...]) -> float:
    if kind not in _HINTS:
        raise ValueError(f"unknown quantity kind {kind!r}; expected one of {KINDS}")
    text = _text_of(value, kind)
    sign = -1.0 if text[:1] == "-" else 1.0
    body = text[1:].lstrip() if text[:1] in "+-" else text
    if body[:3].casefold() in ("nan", "inf"):
        raise UnitError(f"'{text}' is not a finite number")
    if kind == "length":
        magnitude = _parse_length(text, body, hint_kinds)
    else:
        match = _SIMPLE.fullmatch(body)
        if match is None:
            raise UnitError(_needs_unit(kind, text))
        magnitude = float(match["num"]) * _unit_factor(match["unit"].strip(), kind, text, hint_kinds)
    if not math.isfinite(magnitude):
        raise UnitError(f"'{text}' is too large to be a {kind}")
    return sign * magnitude


def awg_diameter(n: int) -> float:
    """Diameter in m of American Wire Gauge n (ASTM B258): d = 0.127 mm × 92^((36 − n)/39).

    n: gauge number 0..40, with 00, 000, 0000 (2/0..4/0) as −1, −2, −3. The formula makes #36 exactly
    0.0050 in and 4/0 exactly 0.4600 in, with 39 geometric steps between.
    """
    if isinstance(n, bool) or not isinstance(n, int) or not -3 <= n <= 40:
        raise UnitError(f"AWG gauge must be a whole number from 4/0 to 40, got {n!r}")
    return 0.127e-3 * 92.0 ** ((36 - n) / 39)


def _gauge_number(g: str) -> int:
    """'14' -> 14; '1/0' -> 0 ... '4/0' -> -3; '0', '00', '000', '0000' -> 0 .. -3."""
    if g.endswith("/0"):
        return 1 - int(g[:-2])
    if set(g) == {"0"}:
        return 1 - len(g)
    return int(g)


def parse_wire(value) -> float:
    """Wire diameter in m from a gauge ("14 AWG", "#14", "4/0 AWG", "0000 AWG") or a length ("1.6 mm").

    Gauges follow ASTM B258 (awg_diameter). Raises UnitError for bare numbers, unknown units and
    gauges outside 4/0..40.
    """
    if isinstance(value, str):
        match = _AWG.fullmatch(value.strip())
        if match:
            g = match["a"] or match["b"] or match["c"]
            try:
                return awg_diameter(_gauge_number(g))
            except UnitError:
                raise UnitError(f"'{value.strip()}' is not a gauge from 4/0 to 40 AWG") from None
    try:
        return _parse(value, "length", ("length", "wire gauge"))
    except UnitError as exc:
        if "with a unit" in exc.problem:
            shown = "nothing" if value is None else f"'{str(value).strip()}'"
            raise UnitError("must be a wire gauge ('14 AWG') or a diameter with a unit ('1.6 mm'), "
                            f"got {shown}") from None
        raise


def _check_units(units: str) -> None:
    if units not in ("imperial", "metric"):
        raise UnitError(f"units must be 'imperial' or 'metric', got '{units}'")


#: how finely a length is written (format_length's `step`): "fine" for what is cut and set to the
#: tape (radiator, stub, tap, short: 1/8 in or 1 mm), "coarse" for what is only cut roughly to
#: length (coax, rope: the inch or the centimetre), "size" for small hardware dimensions
#: (diameters, spacings: 1/32 in under 2 in, 0.1 mm under 10 mm)
STEPS = ("fine", "coarse", "size")


def length_rounding(units: str, step: str = "fine") -> str:
    """How format_length rounds, for the sheet's notes: "to the nearest 1/8 in" or "to the nearest mm"
    (step "fine"), "to the nearest inch" or "to the nearest cm" (step "coarse")."""
    _check_units(units)
    if step == "coarse":
        return "to the nearest inch" if units == "imperial" else "to the nearest cm"
    return "to the nearest 1/8 in" if units == "imperial" else "to the nearest mm"


def _inches_text(parts: int, per_inch: int) -> str:
    """Whole inches and a reduced fraction from a count of 1/per_inch inch: "4-3/8", "3/4", "12"."""
    inches, frac = divmod(parts, per_inch)
    if not frac:
        return str(inches)
    g = math.gcd(frac, per_inch)
    frac_text = f"{frac // g}/{per_inch // g}"
    return f"{inches}-{frac_text}" if inches else frac_text


def format_length(m: float, units: str, step: str = "fine") -> str:
    """A length in m for a builder's tape.

    step "fine" (what is cut and set exactly). imperial: nearest 1/8 in with reduced fractions,
    ASCII: 16' 4-3/8", 4-1/2" under a foot, 33' 0" for whole feet, 1' 0-3/4" (never 1' 3/4", which
    reads like 1-3/4"), a leading '-' when negative. metric: nearest mm, "4.872 m" from 1 m up,
    "434 mm" below 1 m, "6.1 mm" (0.1 mm) below 10 mm.
    step "coarse" (coax, rope): imperial to the inch, 82' 3"; metric to the cm, "25.00 m", "43 cm".
    step "size" (diameters, spacings): imperial to 0.001 in below 1/4 in ("0.040\"", as wire and
    small rod are measured), to 1/32 in below 2 in, else as "fine"; metric to 0.1 mm below 100 mm
    ("15.9 mm", "22 mm"), else as "fine".
    """
    _check_units(units)
    if step not in STEPS:
        raise ValueError(f"unknown length step {step!r}; expected one of {STEPS}")
    if not math.isfinite(m):
        raise ValueError(f"cannot format a length of {m}")
    if units == "imperial":
        if step == "size" and abs(m) < INCH_M / 4:
            # wire and thin conductors are measured in thousandths (a 1/32 step is 20 % of 18 AWG)
            thou = math.floor(abs(m) / INCH_M * 1000 + 0.5)
            return f"{'-' if m < 0 and thou else ''}{thou / 1000:.3f}\""
        per_inch = 1 if step == "coarse" else 32 if step == "size" and abs(m) < 2 * INCH_M else 8
        parts = math.floor(abs(m) / INCH_M * per_inch + 0.5)
        sign = "-" if m < 0 and parts else ""
        feet, rest = divmod(parts, 12 * per_inch)
        inch_text = _inches_text(rest, per_inch)
        if feet and rest < per_inch and rest:
            inch_text = "0-" + inch_text      # 1' 0-3/4": the zero keeps the fraction with the inches
        return f"{sign}{feet}' {inch_text}\"" if feet else f"{sign}{inch_text}\""
    mm = abs(m) * 1000.0
    sign = "-" if m < 0 else ""
    if step == "coarse":
        cm = math.floor(mm / 10 + 0.5)
        if cm < 100:
            return f"{sign if cm else ''}{cm} cm"
        return f"{sign}{cm / 100:.2f} m"
    tenths = math.floor(mm * 10 + 0.5)
    if step == "size" and tenths < 1000:
        text = f"{tenths / 10:.1f}".removesuffix(".0")
        return f"{sign if tenths else ''}{text} mm"
    if tenths < 100:
        return f"{sign if tenths else ''}{tenths / 10:.1f} mm"
    whole_mm = math.floor(mm + 0.5)
    if whole_mm < 1000:
        return f"{sign}{whole_mm} mm"
    return f"{sign}{whole_mm / 1000:.3f} m"


def format_distance(m: float, units: str) -> str:
    """An exposure or clearance distance in m: "6.3 ft" (0.1 ft) or "1.94 m" (0.01 m)."""
    _check_units(units)
    return f"{m / FOOT_M:.1f} ft" if units == "imperial" else f"{m:.2f} m"


def format_frequency(hz: float) -> str:
    """A frequency in Hz: "14.175 MHz" (3 decimals, 1 kHz) from 1 MHz up, else "475.0 kHz"."""
    if abs(hz) >= 1e6:
        return f"{hz / 1e6:.3f} MHz"
    return f"{hz / 1e3:.1f} kHz"


def _trimmed(x: float, decimals: int) -> str:
    text = f"{x:.{max(decimals, 0)}f}"
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text


def _scaled(x: float, unit: str, prefixes: tuple[tuple[str, float], ...], sig: int = 3) -> str:
    """x with `sig` significant figures (trailing zeros dropped) and the largest SI prefix it fills."""
    if not math.isfinite(x):
        raise ValueError(f"cannot format {x} {unit}")
    if x == 0:
        return f"0 {unit}"
    i = 0
    while i + 1 < len(prefixes) and abs(x) >= prefixes[i + 1][1]:
        i += 1
    while True:
        mantissa = x / prefixes[i][1]
        decimals = sig - 1 - math.floor(math.log10(abs(mantissa)))
        rounded = round(mantissa, decimals)
        # 999.7 V rounds to 1000 V: say 1 kV instead
        if abs(rounded) >= 1000 and i + 1 < len(prefixes):
            i += 1
            continue
        return f"{_trimmed(rounded, decimals)} {prefixes[i][0]}{unit}"


def format_impedance(ohm: float) -> str:
    """A resistance or reactance in ohm, 3 significant figures: "50 Ω", "2.44 kΩ" (Ω is U+03A9)."""
    return _scaled(ohm, "Ω", (("", 1.0), ("k", 1e3)))


def format_complex_impedance(z: complex) -> str:
    """A complex impedance in ohm as "48.7 + j3.2 Ω" (ASCII sign), resolution from |z|: 3 figures."""
    size = max(abs(z), 1e-12)
    decimals = max(0, 2 - math.floor(math.log10(size)))
    sign = "-" if z.imag < 0 and round(abs(z.imag), decimals) else "+"
    return f"{_trimmed(z.real, decimals)} {sign} j{_trimmed(abs(z.imag), decimals)} Ω"


def format_power(w: float) -> str:
    """A power in W, 3 significant figures: "100 W", "1.5 kW", "0.5 W"."""
    return _scaled(w, "W", (("", 1.0), ("k", 1e3)))


def format_voltage(v: float) -> str:
    """A voltage in V, 3 significant figures: "707 V", "1.93 kV"."""
    return _scaled(v, "V", (("", 1.0), ("k", 1e3)))


def format_current(a: float) -> str:
    """A current in A, 3 significant figures: "1.41 A", "200 mA"."""
    return _scaled(a, "A", (("m", 1e-3), ("", 1.0)))


def format_percent(fraction: float) -> str:
    """A fraction 0..1 as a percentage, 3 significant figures: 0.4 -> "40 %", 0.9123 -> "91.2 %"."""
    return _scaled(fraction * 100.0, "%", (("", 1.0),))


def format_angle(rad: float) -> str:
    """An angle in rad as degrees to 0.1°, trailing zero dropped: "30°", "12.5°"."""
    return f"{_trimmed(math.degrees(rad), 1)}°"
