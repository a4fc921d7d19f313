"""Hostile and broken sweeps for `fit` (issue 15, findings 6 and 13).

The oracle: a passive one-port reflects no more than it receives, |S11| <= 1, which is R >= 0 on any
real positive reference (Pozar, Microwave Engineering, 4th ed., §4.3: a passive network's reflection
coefficient has magnitude at most 1); a frequency of 1e300 GHz or 1e-300 Hz is a wrong unit, not a
sweep; CSV line ends may be CR, LF or CRLF (RFC 4180 names CRLF; files saved on old Macs use CR).
Each such file ends in exit 2 with one line naming it, no warning, for `fit` and `fit --json`, and
never advice from a sweep that cannot be an antenna.
"""

from __future__ import annotations

import contextlib
import io
import pathlib
import time
import warnings

import numpy as np
import pytest

from buildsheet import touchstone
from buildsheet.cli import main

ROOT = pathlib.Path(__file__).resolve().parent.parent
OAK = ROOT / "designs" / "oak-yard-20m.yaml"
SWEEP = ROOT / "designs" / "oak-yard-20m-sweep.s1p"


def _run(argv):
    out, err = io.StringIO(), io.StringIO()
    with warnings.catch_warnings(record=True) as caught, contextlib.redirect_stdout(out), \
            contextlib.redirect_stderr(err):
        warnings.simplefilter("always")
        status = main([str(a) for a in argv])
    return status, out.getvalue(), err.getvalue(), caught


def _refused_by_fit(path, fragment=None):
    for extra in ([], ["--json"]):
        status, out, err, caught = _run(["fit", OAK, path, *extra])
        assert status == 2, (extra, status, out[-300:], err)
        assert len(err.strip().splitlines()) == 1 and str(path) in err, err
        assert not caught, [str(w.message) for w in caught]
        assert out == ""
        if fragment:
            assert fragment in err, err
    return err


def _points(n=41, r=None, x=None):
    f = np.linspace(13.9e6, 14.5e6, n)
    r = np.full(n, 50.0) if r is None else r
    x = np.linspace(-80, 80, n) if x is None else x
    return f, r, x


def _csv(f, r, x, end="\n"):
    return "frequency_hz,r_ohm,x_ohm" + end + end.join(f"{float(a)!r},{float(b)!r},{float(c)!r}" for a, b, c in zip(f, r, x)) + end


@pytest.mark.parametrize("end", ["\n", "\r\n", "\r"])
def test_csv_line_ends_of_every_kind_read_alike(tmp_path, end):
    f, r, x = _points()
    path = tmp_path / "s.csv"
    path.write_bytes(_csv(f, r, x, end).encode())
    sweep = touchstone.read_sweep(path)
    np.testing.assert_allclose(sweep.frequency_hz, f)
    np.testing.assert_allclose(sweep.z_ohm, r + 1j * x)


@pytest.mark.parametrize("field", ["1" * (200 * 1024), '"' + "a" * (140 * 1024) + '"', '"unclosed\r\n1,2'])
def test_a_csv_the_csv_reader_rejects_is_one_line(tmp_path, field):
    path = tmp_path / "s.csv"
    path.write_text(f"frequency_hz,r_ohm,x_ohm\n14e6,{field},0\n")
    _refused_by_fit(path)


@pytest.mark.parametrize("unit,value", [("GHz", "1e300"), ("Hz", "1e-300"), ("MHz", "1e306"), ("Hz", "1e-30"),
                                        ("GHz", "1e5")])
def test_frequencies_no_analyser_gives_are_refused(tmp_path, unit, value):
    s1p = tmp_path / "s.s1p"
    s1p.write_text(f"# {unit} S RI R 50\n" + "".join(f"{float(value) * (1 + k * 1e-3)!r} 0.1 0.1\n"
                                                     for k in range(9)))
    _refused_by_fit(s1p, "1 THz")
    csv_path = tmp_path / "s.csv"
    header = {"GHz": "frequency_ghz", "MHz": "frequency_mhz", "Hz": "frequency_hz"}[unit]
    csv_path.write_text(f"{header},r_ohm,x_ohm\n" + "".join(f"{float(value) * (1 + k * 1e-3)!r},50,{k}\n"
                                                           for k in range(9)))
    _refused_by_fit(csv_path, "1 THz")


def _s1p(path, fmt, values, f=None):
    f = np.linspace(13.9e6, 14.5e6, len(values)) if f is None else f
    path.write_text(f"# Hz {fmt} R 50\n" + "".join(f"{float(a)!r} {float(b)!r} {float(c)!r}\n" for a, (b, c) in zip(f, values)))
    return path


@pytest.mark.parametrize("case", ["negative R at one point", "negative R everywhere", "S MA above 1",
                                  "S DB above 0", "S RI above 1", "Y negative conductance", "huge Z"])
def test_a_sweep_no_passive_antenna_gives_is_refused(tmp_path, case):
    n = 41
    good = list(zip(np.linspace(0.8, 0.1, n), np.linspace(-60, 60, n)))     # MA pairs, |S| < 1
    if case == "negative R at one point":
        f, r, x = _points(n)
        r[20] = -50.0
        path = tmp_path / "s.csv"
        path.write_text(_csv(f, r, x))
    elif case == "negative R everywhere":
        f, r, x = _points(n, r=np.full(n, -50.0))
        path = tmp_path / "s.csv"
        path.write_text(_csv(f, r, x))
    elif case == "S MA above 1":
        path = _s1p(tmp_path / "s.s1p", "S MA", [(1.2, a) for _, a in good])
    elif case == "S DB above 0":
        path = _s1p(tmp_path / "s.s1p", "S DB", [(3.0, a) for _, a in good])
    elif case == "S RI above 1":
        path = _s1p(tmp_path / "s.s1p", "S RI", [(1.1, 0.2)] * n)
    elif case == "Y negative conductance":
        path = _s1p(tmp_path / "s.s1p", "Y RI", [(-0.5, 0.1)] * n)
    else:
        path = _s1p(tmp_path / "s.s1p", "Z RI", [(1e300, 1e300)] * n)
    err = _refused_by_fit(path)
    assert ("not calibrated" in err) or ("too large" in err), err


def test_a_reflection_within_the_calibration_tolerance_is_read(tmp_path):
    # |S11| = 1.02 at one point: an analyser's error near a short or an open, not a refusal
    values = [(0.9 - 0.8 * min(k, 40 - k) / 20, 30.0) for k in range(41)]
    values[0] = (1.02, 30.0)
    path = _s1p(tmp_path / "s.s1p", "S MA", values)
    sweep = touchstone.read_sweep(path)
    assert len(sweep.frequency_hz) == 41


@pytest.mark.parametrize("kind", ["s1p", "csv"])
def test_the_point_count_is_capped_before_the_fit_cost_grows(tmp_path, kind):
    n = touchstone.MAX_POINTS + 1
    f = np.linspace(13e6, 15e6, n)
    path = tmp_path / f"s.{kind}"
    if kind == "s1p":
        path.write_text("# Hz S RI R 50\n" + "".join(f"{v:.6f} 0.1 0.1\n" for v in f))
    else:
        path.write_text("frequency_hz,r_ohm,x_ohm\n" + "".join(f"{v:.6f},50,1\n" for v in f))
    start = time.perf_counter()
    _refused_by_fit(path, f"more than {touchstone.MAX_POINTS} points")
    assert time.perf_counter() - start < 20


def test_the_demo_sweep_still_fits():
    status, out, err, caught = _run(["fit", OAK, SWEEP, "--json"])
    assert status == 0 and not caught, err


def test_the_fit_cost_does_not_grow_with_the_point_count(tmp_path, monkeypatch):
    # the demo sweep resampled to the cap: the least squares see at most FIT_POINTS (+ the match),
    # and the advice agrees with the fit of the demo's own 36 points to a millimetre
    from buildsheet import fit as fit_module
    rows = [line.split() for line in SWEEP.read_text().splitlines() if line[:1].isdigit()]
    f = np.array([float(r[0]) for r in rows])
    mag = np.array([float(r[1]) for r in rows])
    ang = np.unwrap(np.radians([float(r[2]) for r in rows]))
    dense = np.linspace(f[0], f[-1], touchstone.MAX_POINTS)
    path = tmp_path / "dense.s1p"
    path.write_text("# MHz S MA R 50\n" + "".join(
        f"{a:.7f} {b:.7f} {np.degrees(c):.4f}\n"
        for a, b, c in zip(dense, np.interp(dense, f, mag), np.interp(dense, f, ang))))
    seen = []
    real = fit_module._fit_electrical

    def spy(model, freqs, *args, **kwargs):
        seen.append(len(freqs))
        return real(model, freqs, *args, **kwargs)

    monkeypatch.setattr(fit_module, "_fit_electrical", spy)
    from buildsheet.design import load_design
    design = load_design(OAK)
    dense_fit = fit_module.fit_sweep(design, touchstone.read_sweep(path))
    assert seen and max(seen) <= fit_module.FIT_POINTS + 1, seen
    demo_fit = fit_module.fit_sweep(design, touchstone.read_sweep(SWEEP))
    np.testing.assert_allclose(dense_fit.advised, demo_fit.advised, atol=1e-3)
