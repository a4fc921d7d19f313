"""Tests of units.py: the quantity grammar (DESIGN.md §4), the sheet's formats and their round trip.

Expected SI values follow from the exact unit definitions (1 in = 25.4 mm and 1 ft = 0.3048 m,
international yard and pound agreement 1959; SI prefixes) and the ASTM B258 gauge law
(CHECK_VALUES §2c); none comes from the code under test.
"""

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from buildsheet.errors import UnitError
from buildsheet.units import (article, awg_diameter, format_angle, format_complex_impedance, format_current,
                              format_distance, format_frequency, format_impedance, format_length,
                              format_percent, format_power, format_voltage, length_rounding,
                              parse_quantity, parse_wire)

IN = 0.0254     # m, exact by definition
FT = 0.3048     # m, exact by definition


@pytest.mark.parametrize("text, kind, expected", [
    ("14.175 MHz", "frequency", 14.175e6),
    ("14175 kHz", "frequency", 14.175e6),
    ("14175kHz", "frequency", 14.175e6),
    ("146 mhz", "frequency", 146e6),
    ("146 MHZ", "frequency", 146e6),
    ("1.296 GHz", "frequency", 1.296e9),
    ("475000 Hz", "frequency", 475e3),
    ("1e3 Hz", "frequency", 1e3),
    ("-3 MHz", "frequency", -3e6),
    ("10 m", "length", 10.0),
    ("10m", "length", 10.0),
    ("10 metres", "length", 10.0),
    ("110 mm", "length", 0.110),
    ("2.5 cm", "length", 0.025),
    ("2.5 in", "length", 2.5 * IN),
    ("1/2 in", "length", 0.5 * IN),
    ("2-3/8 in", "length", 2.375 * IN),
    ("2 3/8 in", "length", 2.375 * IN),
    ("33 ft", "length", 33 * FT),
    ("33'", "length", 33 * FT),
    ("33 ft 2 in", "length", 33 * FT + 2 * IN),
    ("33' 2\"", "length", 33 * FT + 2 * IN),
    ("33'2\"", "length", 33 * FT + 2 * IN),
    ("16' 4-3/8\"", "length", 16 * FT + 4.375 * IN),
    ("-16' 4-3/8\"", "length", -(16 * FT + 4.375 * IN)),
    ("4-1/2\"", "length", 4.5 * IN),
    ("12 feet 6 inches", "length", 12 * FT + 6 * IN),
    ("50 ohm", "impedance", 50.0),
    ("50 Ohm", "impedance", 50.0),
    ("50 OHM", "impedance", 50.0),
    ("50 ohms", "impedance", 50.0),
    ("50 Ω", "impedance", 50.0),
    ("50Ω", "impedance", 50.0),
    ("50 \u2126", "impedance", 50.0),          # the ohm sign is accepted on input, never written
    ("2.5 kΩ", "impedance", 2500.0),
    ("2.5 kohm", "impedance", 2500.0),
    ("100 W", "power", 100.0),
    ("1.5 kW", "power", 1500.0),
    ("1500w", "power", 1500.0),
    ("0.005 S/m", "conductivity", 0.005),
    ("5e-3 S/m", "conductivity", 0.005),
    ("30 deg", "angle", math.pi / 6),
    ("30°", "angle", math.pi / 6),
    ("-5 degrees", "angle", -math.pi / 36),
    ("100 %", "fraction", 1.0),
    ("40%", "fraction", 0.4),
    ("2.5 %", "fraction", 0.025),
])
def test_parse_quantity_table(text, kind, expected):
    assert parse_quantity(text, kind) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("value, kind, message", [
    ("14.175", "frequency", "must be a frequency with a unit (Hz, kHz, MHz, GHz), got '14.175'"),
    (14.175, "frequency", "must be a frequency with a unit (Hz, kHz, MHz, GHz), got '14.175'"),
    (14, "length", "must be a length with a unit"),
    (True, "power", "must be a power with a unit (W, kW), got 'True'"),
    ("0.5", "fraction", "must be a fraction with a unit (%), got '0.5'"),
    ("1/2", "length", "must be a length with a unit"),
    (None, "impedance", "must be an impedance with a unit (ohm, Ω, kohm), got nothing"),
    (["14", "MHz"], "frequency", "must be a frequency with a unit"),
    ("MHz", "frequency", "must be a frequency with a unit"),
    ("14.175 MHzz", "frequency", "'14.175 MHzz' has an unknown unit 'MHzz'; did you mean 'MHz'?"),
    ("10 m", "frequency", "'10 m' is a length, not a frequency"),
    ("14 MHz", "length", "'14 MHz' is a frequency, not a length"),
    ("14 AWG", "length", "'14 AWG' is a wire gauge, not a length"),
    ("50 W", "impedance", "'50 W' is a power, not an impedance"),
    ("10 M", "length", "'10 M' has an unknown unit 'M'; did you mean 'm'?"),
    ("110 MM", "length", "'110 MM' has an unknown unit 'MM'; did you mean 'mm'?"),
    ("0.005 S/M", "conductivity", "did you mean 'S/m'?"),
    ("1 MW", "power", "unknown unit 'MW'"),
    ("5 foo", "power", "'5 foo' has an unknown unit 'foo'; a power needs one of W, kW"),
    ("nan MHz", "frequency", "'nan MHz' is not a finite number"),
    ("-inf m", "length", "'-inf m' is not a finite number"),
    ("1e999 Hz", "frequency", "'1e999 Hz' is too large to be a frequency"),
    ("1 m 20 cm", "length", "only feet followed by inches combine"),
    ("2 in 3 ft", "length", "only feet followed by inches combine"),
    ("33' 2", "length", "the 2 after the feet needs a unit"),
    ("1/0 in", "length", "zero denominator"),
])
def test_parse_quantity_refusals(value, kind, message):
    with pytest.raises(UnitError) as info:
        parse_quantity(value, kind)
    assert message in info.value.problem
    # the caller adds file, key and line
    assert (info.value.file, info.value.key, info.value.line) == (None, None, None)


def test_unknown_kind_is_a_programming_error():
    with pytest.raises(ValueError):
        parse_quantity("1 m", "distance")


# ASTM B258: d = 0.127 mm x 92^((36 - n)/39); CHECK_VALUES §2c table, printed to 4 decimals in mm
# and 5 in inches, so the tolerance is half the last printed digit
AWG_MM = {10: 2.5882, 12: 2.0525, 14: 1.6277, 16: 1.2908, 18: 1.0237, 20: 0.8118, 22: 0.6438}
AWG_IN = {10: 0.10190, 12: 0.08081, 14: 0.06408, 16: 0.05082, 18: 0.04030, 20: 0.03196, 22: 0.02535}


@pytest.mark.parametrize("gauge", sorted(AWG_MM))
def test_awg_diameter_astm_b258(gauge):
    assert awg_diameter(gauge) * 1e3 == pytest.approx(AWG_MM[gauge], abs=0.5e-4)
    assert awg_diameter(gauge) / IN == pytest.approx(AWG_IN[gauge], abs=0.5e-5)


@pytest.mark.parametrize("gauge, table_mm, table_in", [(14, 1.628, 0.0641), (10, 2.588, None)])
def test_awg_against_rounded_table_values(gauge, table_mm, table_in):
    # ASTM B258 tables round to 4 significant digits (CHECK_VALUES §2c): rel 1e-3
    assert awg_diameter(gauge) * 1e3 == pytest.approx(table_mm, rel=1e-3)
    if table_in is not None:
        assert awg_diameter(gauge) / IN == pytest.approx(table_in, rel=1e-3)


def test_awg_defining_points_astm_b258():
    # the gauge law is fixed by #36 = 0.0050 in and 4/0 = 0.4600 in, 39 geometric steps apart
    assert awg_diameter(36) == pytest.approx(0.0050 * IN, rel=1e-12)
    assert awg_diameter(-3) == pytest.approx(0.4600 * IN, rel=1e-12)
    assert awg_diameter(0) / awg_diameter(3) == pytest.approx(92 ** (3 / 39), rel=1e-12)


@pytest.mark.parametrize("text, gauge", [
    ("14 AWG", 14), ("14AWG", 14), ("14 awg", 14), ("#14", 14), ("# 14", 14), ("AWG 12", 12),
    ("1/0 AWG", 0), ("0 AWG", 0), ("2/0 AWG", -1), ("00 AWG", -1), ("4/0 AWG", -3), ("0000 AWG", -3),
    ("40 AWG", 40),
])
def test_parse_wire_gauges(text, gauge):
    assert parse_wire(text) == awg_diameter(gauge)


@pytest.mark.parametrize("text, metres", [("1.6 mm", 1.6e-3), ("0.064 in", 0.064 * IN), ("2 mm", 2e-3)])
def test_parse_wire_diameters(text, metres):
    assert parse_wire(text) == pytest.approx(metres, rel=1e-12)


@pytest.mark.parametrize("value, message", [
    ("14", "must be a wire gauge ('14 AWG') or a diameter with a unit ('1.6 mm'), got '14'"),
    (14, "must be a wire gauge ('14 AWG') or a diameter with a unit ('1.6 mm'), got '14'"),
    (None, "got nothing"),
    ("41 AWG", "'41 AWG' is not a gauge from 4/0 to 40 AWG"),
    ("5/0 AWG", "is not a gauge from 4/0 to 40 AWG"),
    ("14 AWGG", "did you mean 'AWG'?"),
    ("14 MHz", "is a frequency, not a length"),
])
def test_parse_wire_refusals(value, message):
    with pytest.raises(UnitError) as info:
        parse_wire(value)
    assert message in info.value.problem


@pytest.mark.parametrize("gauge", [-4, 41, 14.0, True])
def test_awg_diameter_refuses_outside_the_standard(gauge):
    with pytest.raises(UnitError):
        awg_diameter(gauge)


@pytest.mark.parametrize("metres, imperial", [
    (16 * FT + 4.375 * IN, "16' 4-3/8\""),
    (4.5 * IN, "4-1/2\""),
    (33 * FT, "33' 0\""),
    (33 * FT + 2 * IN, "33' 2\""),
    (16 * FT + 0.375 * IN, "16' 0-3/8\""),       # never "16' 3/8\"", which reads like 16-3/8"
    (1 * FT + 0.75 * IN, "1' 0-3/4\""),
    (152 * FT + 0.5 * IN, "152' 0-1/2\""),
    (0.75 * IN, "3/4\""),
    (-(16 * FT + 4.375 * IN), "-16' 4-3/8\""),
    (11.97 * IN, "1' 0\""),                      # 11.97 in rounds to 12 in: a whole foot
    (4.5 * IN + 0.06 * IN, "4-1/2\""),           # 4.56 in: 4.5 is the nearest eighth
    (4.5 * IN + 0.07 * IN, "4-5/8\""),           # 4.57 in: 4.625 is nearer
    (0.0, "0\""),
    (-0.01 * IN, "0\""),                          # rounds to zero: no sign
])
def test_format_length_imperial(metres, imperial):
    assert format_length(metres, "imperial") == imperial


@pytest.mark.parametrize("metres, metric", [
    (4.872, "4.872 m"), (4.8724, "4.872 m"), (0.434, "434 mm"), (0.4336, "434 mm"), (0.0061, "6.1 mm"),
    (0.00995, "10 mm"), (0.0104, "10 mm"), (0.9996, "1.000 m"), (-4.872, "-4.872 m"), (0.0, "0.0 mm"),
])
def test_format_length_metric(metres, metric):
    assert format_length(metres, "metric") == metric


@pytest.mark.parametrize("metres, units, text", [
    # coax and rope are cut roughly: to the inch or the centimetre (issue 18)
    (82 * FT + 0.25 * IN, "imperial", "82' 0\""),
    (82 * FT + 3.6 * IN, "imperial", "82' 4\""),
    (7.4 * IN, "imperial", "7\""),
    (25.0, "metric", "25.00 m"),
    (25.004, "metric", "25.00 m"),
    (25.006, "metric", "25.01 m"),
    (0.434, "metric", "43 cm"),
    (0.996, "metric", "1.00 m"),
])
def test_format_length_coarse(metres, units, text):
    assert format_length(metres, units, "coarse") == text


@pytest.mark.parametrize("metres, units, text", [
    # diameters and spacings: 0.001 in below 1/4 in, 1/32 in below 2 in, so 20 mm is not "3/4"" nor
    # 4 mm "1/8"" (issue 18)
    (0.020, "imperial", "25/32\""),
    (0.004, "imperial", "0.157\""),
    (0.005, "imperial", "0.197\""),
    (0.3 * IN, "imperial", "5/16\""),
    (0.5 * IN, "imperial", "1/2\""),
    (3.0 * IN, "imperial", "3\""),
    (0.0010236, "imperial", "0.040\""),        # 18 AWG (ASTM B258: 0.0403 in)
    (0.004, "metric", "4 mm"),
    (0.0159, "metric", "15.9 mm"),
    (0.0254, "metric", "25.4 mm"),
    (0.1234, "metric", "123 mm"),
])
def test_format_length_size(metres, units, text):
    assert format_length(metres, units, "size") == text


@given(st.floats(min_value=-2000.0, max_value=2000.0, allow_nan=False),
       st.sampled_from(["fine", "coarse", "size"]), st.sampled_from(["imperial", "metric"]))
def test_every_step_parses_back_within_half_its_resolution(metres, step, units):
    back = parse_quantity(format_length(metres, units, step), "length")
    if units == "imperial":
        res = {"fine": IN / 8, "coarse": IN,
               "size": IN / 1000 if abs(metres) < IN / 4 else IN / 32 if abs(metres) < 2 * IN else IN / 8}[step]
    else:
        size_fine = step == "size" and abs(metres) < 0.09995
        res = 0.01 if step == "coarse" else (1e-4 if abs(metres) < 0.00995 or size_fine else 1e-3)
    assert abs(back - metres) <= res / 2 + 1e-9


def test_imperial_writing_is_ascii_for_the_embedded_font():
    # Vera has no ⅛ ′ ″ (DESIGN.md §8): every imperial length must be plain ASCII
    for eighths in range(0, 96 * 40, 7):
        assert format_length(eighths * IN / 8, "imperial").isascii()


def test_length_rounding_statement():
    assert length_rounding("imperial") == "to the nearest 1/8 in"
    assert length_rounding("metric") == "to the nearest mm"
    assert length_rounding("imperial", "coarse") == "to the nearest inch"
    assert length_rounding("metric", "coarse") == "to the nearest cm"
    with pytest.raises(UnitError):
        length_rounding("furlongs")


@given(st.floats(min_value=-2000.0, max_value=2000.0, allow_nan=False))
def test_imperial_round_trip_within_half_an_eighth(metres):
    back = parse_quantity(format_length(metres, "imperial"), "length")
    assert abs(back - metres) <= IN / 16 + 1e-9


@given(st.floats(min_value=-2000.0, max_value=2000.0, allow_nan=False))
def test_metric_round_trip_within_half_a_step(metres):
    back = parse_quantity(format_length(metres, "metric"), "length")
    step = 1e-4 if abs(metres) < 0.00995 else 1e-3      # 0.1 mm below 10 mm, else 1 mm
    assert abs(back - metres) <= step / 2 + 1e-9


@given(st.integers(min_value=-96 * 200, max_value=96 * 200))
def test_whole_eighths_survive_the_round_trip_exactly(eighths):
    metres = eighths * IN / 8
    assert parse_quantity(format_length(metres, "imperial"), "length") == pytest.approx(metres, abs=1e-12)


@given(st.floats(min_value=1e3, max_value=3e9, allow_nan=False))
def test_frequency_round_trip_within_the_printed_resolution(hz):
    back = parse_quantity(format_frequency(hz), "frequency")
    resolution = 1e3 if hz >= 1e6 else 100.0         # 0.001 MHz or 0.1 kHz
    assert abs(back - hz) <= resolution / 2 * (1 + 1e-9)


@pytest.mark.parametrize("hz, text", [
    (14.175e6, "14.175 MHz"), (146e6, "146.000 MHz"), (7.0e6, "7.000 MHz"), (475.5e3, "475.5 kHz"),
])
def test_format_frequency(hz, text):
    assert format_frequency(hz) == text


@pytest.mark.parametrize("function, value, text", [
    (format_impedance, 50.0, "50 Ω"),
    (format_impedance, 50.04, "50 Ω"),
    (format_impedance, 48.72, "48.7 Ω"),
    (format_impedance, 2437.6, "2.44 kΩ"),
    (format_impedance, 183748.2, "184 kΩ"),
    (format_impedance, 2.5e6, "2500 kΩ"),
    (format_impedance, 0.19, "0.19 Ω"),
    (format_voltage, 707.11, "707 V"),             # CHECK_VALUES §6a: 100 W into 5000 ohm
    (format_voltage, 1936.49, "1.94 kV"),          # CHECK_VALUES §6a: 1500 W into 2500 ohm
    (format_voltage, 999.7, "1 kV"),
    (format_current, 0.2, "200 mA"),               # CHECK_VALUES §6a: 100 W into 2500 ohm
    (format_current, 1.414, "1.41 A"),
    (format_power, 100.0, "100 W"),
    (format_power, 1500.0, "1.5 kW"),
    (format_power, 0.5, "0.5 W"),
    (format_percent, 0.4, "40 %"),
    (format_percent, 0.9123, "91.2 %"),
    (format_percent, 1.0, "100 %"),
    (format_angle, math.radians(30), "30°"),
    (format_angle, math.radians(12.5), "12.5°"),
])
def test_formats(function, value, text):
    assert function(value) == text


def test_ohm_is_the_greek_capital_omega():
    # Vera has U+03A9, not the ohm sign U+2126 (DESIGN.md §8)
    for text in (format_impedance(50.0), format_complex_impedance(50 + 1j)):
        assert "\u03a9" in text and "\u2126" not in text


@pytest.mark.parametrize("z, text", [
    (48.71 + 3.2j, "48.7 + j3.2 Ω"), (48.71 - 3.2j, "48.7 - j3.2 Ω"), (2437 - 150j, "2437 - j150 Ω"),
    (50 - 0.01j, "50 + j0 Ω"),
])
def test_format_complex_impedance(z, text):
    assert format_complex_impedance(z) == text


@pytest.mark.parametrize("metres, units, text", [
    (1.935, "metric", "1.94 m"),      # CHECK_VALUES §5b worked example, 100 W key-down, general
    (1.935, "imperial", "6.3 ft"),
    (87.6, "imperial", "287.4 ft"),   # CHECK_VALUES §5b, 1500 W controlled: 287.4 ft
])
def test_format_distance(metres, units, text):
    assert format_distance(metres, units) == text


@pytest.mark.parametrize("function, unit", [
    (format_impedance, "impedance"), (format_power, "power"), (format_percent, "fraction"),
])
@given(value=st.floats(min_value=1e-2, max_value=1e6, allow_nan=False))
def test_three_figure_formats_parse_back(function, unit, value):
    if unit == "fraction":
        value /= 1e4
    back = parse_quantity(function(value), unit)
    assert back == pytest.approx(value, rel=5e-3)      # 3 significant figures: at most 0.5 % off


@pytest.mark.parametrize("text, expected", [
    ("8", "an"), ("82' 0\"", "an"), ("800 mm", "an"), ("8.5 m", "an"),
    ("11 m", "an"), ("18.6 m", "an"), ("11,000", "an"), ("18000", "an"),
    ("1 m", "a"), ("110 m", "a"), ("1,100", "a"), ("25 m", "a"), ("3.2", "a"), ("1:4", "a"),
    ("length", "a"), ("inductance", "an"),
])
def test_article_follows_the_spoken_number(text, expected):
    # English usage (common practice): the article goes by the sound of the word that follows, so a
    # figure takes 'an' when read aloud it starts with a vowel: eight..., eleven, eighteen (and their
    # thousands); 'an 82 ft run' on the sheet, never 'a 82 ft run'
    assert article(text) == expected
