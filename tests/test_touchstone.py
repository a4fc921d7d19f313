"""Tests of the sweep readers (buildsheet/touchstone.py) against scikit-rf and the Touchstone 1.1 text.

Reference: scikit-rf (skrf.Network, 2.x) reads the same files; impedances must agree to 1e-9
relative (both compute in double precision from the same decimal text, so only rounding differs).
Touchstone 1.1 (EIA/IBIS Open Forum 2002): option line defaults GHz S MA R 50; Z and Y data of a
version 1 file are normalised (Z = R z, Y = y/R); S data are reflection coefficients on R.
Note: scikit-rf 2.2 multiplies version-1 Y data by R instead of dividing (skrf/io/touchstone.py,
`self.s * self.z0` for g, h, y, z), so Y files are checked against the specification's relation
instead (the S/Z equivalence of the same network written both ways).
"""

from __future__ import annotations

import itertools
import warnings
from pathlib import Path

import numpy as np
import pytest
import skrf

from buildsheet.errors import SweepError
from buildsheet.touchstone import parse_csv, parse_touchstone, read_sweep

DATA = Path(__file__).parent / "data"
BAD = DATA / "bad_sweeps"
UNIT_FACTOR = {"Hz": 1.0, "kHz": 1e3, "MHz": 1e6, "GHz": 1e9}


def skrf_impedance(path) -> tuple[np.ndarray, np.ndarray]:
    """Frequency (Hz) and Z (ohm) of a 1-port file as scikit-rf reads it."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        net = skrf.Network(str(path))
    return net.f, net.z[:, 0, 0]


def antenna_like(n=21):
    """Frequencies (Hz) and impedances (ohm) of a parallel resonance with a series reactance: the
    shape of a stub-matched antenna's feed impedance near its match (any values would do)."""
    f = np.linspace(13.9e6, 14.5e6, n)
    q, f0, r = 12.0, 14.2e6, 55.0
    y = 1 / r + 1j * q / r * (f / f0 - f0 / f)
    return f, 1 / y + 1j * 6.0 * (f / f0)


def write_variant(path: Path, f, z, unit: str, parameter: str, fmt: str, r_ref: float) -> None:
    """A Touchstone 1.1 file of (f, z) in the given option-line form, 12 significant digits."""
    if parameter == "S":
        v = (z - r_ref) / (z + r_ref)
    elif parameter == "Z":
        v = z / r_ref
    else:
        v = r_ref / z
    if fmt == "RI":
        a, b = v.real, v.imag
    elif fmt == "MA":
        a, b = np.abs(v), np.degrees(np.angle(v))
    else:
        a, b = 20 * np.log10(np.abs(v)), np.degrees(np.angle(v))
    lines = [f"! written by tests/test_touchstone.py (write_variant) from antenna_like()",
             f"# {unit} {parameter} {fmt} R {r_ref:g}"]
    lines += [f"{fi / UNIT_FACTOR[unit]:.12g} {ai:.12g} {bi:.12g}" for fi, ai, bi in zip(f, a, b)]
    path.write_text("\n".join(lines) + "\n")


VARIANTS = list(itertools.product(("Hz", "kHz", "MHz", "GHz"), ("S", "Z"), ("RI", "MA", "DB"), (50.0, 75.0)))


@pytest.mark.parametrize("unit,parameter,fmt,r_ref", VARIANTS,
                         ids=["-".join(map(str, v)) for v in VARIANTS])
def test_variants_read_as_scikit_rf_reads_them(tmp_path, unit, parameter, fmt, r_ref):
    f, z = antenna_like()
    path = tmp_path / "variant.s1p"
    write_variant(path, f, z, unit, parameter, fmt, r_ref)
    sweep = read_sweep(path)
    f_ref, z_ref = skrf_impedance(path)
    np.testing.assert_allclose(sweep.frequency_hz, f_ref, rtol=1e-12)
    np.testing.assert_allclose(sweep.z_ohm, z_ref, rtol=1e-9)
    # and both are the network that was written (12 significant digits in the file)
    np.testing.assert_allclose(sweep.z_ohm, z, rtol=1e-8)


@pytest.mark.parametrize("fmt", ("RI", "MA", "DB"))
@pytest.mark.parametrize("r_ref", (50.0, 75.0))
def test_y_data_are_normalised_admittances(tmp_path, fmt, r_ref):
    """Touchstone 1.1: Y = y/R. The same network written as Y and as S reads the same."""
    f, z = antenna_like()
    write_variant(tmp_path / "y.s1p", f, z, "MHz", "Y", fmt, r_ref)
    write_variant(tmp_path / "s.s1p", f, z, "MHz", "S", fmt, r_ref)
    y_sweep, s_sweep = read_sweep(tmp_path / "y.s1p"), read_sweep(tmp_path / "s.s1p")
    np.testing.assert_allclose(y_sweep.z_ohm, s_sweep.z_ohm, rtol=1e-8)
    np.testing.assert_allclose(y_sweep.z_ohm, z, rtol=1e-8)


@pytest.mark.parametrize("name", ("layout-comments.s1p", "no-option-line.s1p", "r-x.s1p",
                                  "multi-record-twin.s1p"))
def test_data_files_read_as_scikit_rf_reads_them(name):
    sweep = read_sweep(DATA / name)
    f_ref, z_ref = skrf_impedance(DATA / name)
    np.testing.assert_allclose(sweep.frequency_hz, f_ref, rtol=1e-12)
    np.testing.assert_allclose(sweep.z_ohm, z_ref, rtol=1e-9)


def test_second_option_line_is_ignored():
    """Touchstone 1.1: only the first option line counts (kHz Z RI R 75 in layout-comments.s1p)."""
    sweep = read_sweep(DATA / "layout-comments.s1p")
    assert sweep.frequency_hz[-1] == pytest.approx(14100e3)
    assert sweep.z_ohm[-1] == pytest.approx(75 * (0.75 + 0.4j))
    assert sweep.lines[-1] == 16


def test_defaults_without_option_line():
    """Touchstone 1.1 defaults GHz S MA R 50: 0.0142 GHz, |S| 0.11 at 10 degrees."""
    sweep = read_sweep(DATA / "no-option-line.s1p")
    assert sweep.frequency_hz[1] == pytest.approx(14.2e6)
    s = 0.11 * np.exp(1j * np.radians(10.0))
    assert sweep.z_ohm[1] == pytest.approx(50 * (1 + s) / (1 - s))


def test_several_records_on_a_line_read_as_one_per_line():
    many, twin = read_sweep(DATA / "multi-record.s1p"), read_sweep(DATA / "multi-record-twin.s1p")
    np.testing.assert_array_equal(many.frequency_hz, twin.frequency_hz)
    np.testing.assert_array_equal(many.z_ohm, twin.z_ohm)
    assert many.lines == (5, 5, 5, 6, 6)


def test_option_fields_in_any_order_and_partial():
    a = parse_touchstone("# R 75 RI mhz z\n14 1 0.5\n")
    b = parse_touchstone("# MHz Z RI R 75\n14 1 0.5\n")
    assert a.z_ohm[0] == b.z_ohm[0] == pytest.approx(75 + 37.5j)
    c = parse_touchstone("# MHz RI\n14 0.2 0.1\n")          # S and R 50 by default
    assert c.z_ohm[0] == pytest.approx(50 * (1.2 + 0.1j) / (0.8 - 0.1j))


def test_csv_reads_the_same_impedances_as_the_touchstone_twin():
    """r-x.csv and r-x.s1p hold the same points; the .s1p is also checked against scikit-rf above."""
    csv_sweep, ts_sweep = read_sweep(DATA / "r-x.csv"), read_sweep(DATA / "r-x.s1p")
    np.testing.assert_allclose(csv_sweep.frequency_hz, ts_sweep.frequency_hz, rtol=1e-12)
    np.testing.assert_allclose(csv_sweep.z_ohm, ts_sweep.z_ohm, rtol=1e-12)
    assert csv_sweep.lines == (6, 8, 9)


@pytest.mark.parametrize("header,factor", [("frequency_hz", 1.0), ("freq_khz", 1e3),
                                           ("FREQUENCY_MHZ", 1e6), ("freq_ghz", 1e9)])
def test_csv_frequency_units(header, factor):
    sweep = parse_csv(f"{header},resistance_ohm,reactance_ohm\n1.5,50,-5\n2.5,60,5\n")
    np.testing.assert_allclose(sweep.frequency_hz, [1.5 * factor, 2.5 * factor])
    np.testing.assert_allclose(sweep.z_ohm, [50 - 5j, 60 + 5j])


def test_reflection_on_a_reference():
    sweep = parse_csv("frequency_mhz,r_ohm,x_ohm\n14,50,0\n14.1,150,0\n")
    np.testing.assert_allclose(sweep.reflection(50.0), [0.0, 0.5])


# bad files: (file, line the message names or None, a fragment the message contains)
BAD_CASES = [
    ("bad-option.s1p", 2, "'XY'"),
    ("r-without-value.s1p", 2, "reference resistance"),
    ("zero-reference.s1p", 2, "above 0 ohm"),
    ("h-parameter.s1p", 2, "2-ports"),
    ("not-a-number.s1p", 4, "'abc' is not a number"),
    ("two-numbers.s1p", 4, "has 2 numbers"),
    ("decreasing.s1p", 4, "must increase"),
    ("repeated-frequency.s1p", 5, "must increase"),
    ("option-after-data.s1p", 3, "before the data"),
    ("version-2.s1p", 2, "Touchstone 2"),
    ("open-circuit.s1p", 4, "infinite"),
    ("no-data.s1p", None, "no data"),
    ("nan-value.s1p", 3, "finite"),
    ("zero-frequency.s1p", 3, "above 0"),
    ("unitless-header.csv", 2, "needs its unit"),
    ("unknown-column.csv", 2, "'swr'"),
    ("four-columns.csv", 2, "4 columns"),
    ("short-row.csv", 4, "2 fields"),
    ("text-value.csv", 3, "'fifty' is not a number"),
    ("header-only.csv", None, "no data"),
    ("decreasing.csv", 4, "must increase"),
    ("twice-frequency.csv", 2, "twice"),
]


def test_every_bad_file_has_a_case():
    assert sorted(p.name for p in BAD.iterdir()) == sorted(c[0] for c in BAD_CASES)


@pytest.mark.parametrize("name,line,fragment", BAD_CASES, ids=[c[0] for c in BAD_CASES])
def test_bad_sweeps_raise_sweep_error_with_file_and_line(name, line, fragment):
    path = BAD / name
    with pytest.raises(SweepError) as info:
        read_sweep(path)
    err = info.value
    assert err.file == str(path)
    assert err.line == line
    assert fragment in err.problem
    assert str(err).startswith(f"{path}:{line}: " if line else f"{path}: ")


def test_files_that_are_not_sweeps(tmp_path):
    with pytest.raises(SweepError, match="extension '.s2p'.*1-port"):
        read_sweep(tmp_path / "antenna.s2p")
    with pytest.raises(SweepError, match="no such file"):
        read_sweep(tmp_path / "missing.s1p")
    binary = tmp_path / "binary.s1p"
    binary.write_bytes(b"\x00\x01\x02")
    with pytest.raises(SweepError, match="binary"):
        read_sweep(binary)
    latin = tmp_path / "latin.csv"
    latin.write_bytes("# \xe9t\xe9\nfrequency_mhz,r_ohm,x_ohm\n".encode("latin-1"))
    with pytest.raises(SweepError, match="UTF-8"):
        read_sweep(latin)
