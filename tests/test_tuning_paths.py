"""The tuning procedure's two paths (issue 16 item 6): the SWR to expect at the station end of the
feed coax, checked against the solver's sweep and against the textbook effect of a lossy line, and the
text of both paths in the built PDF of a horizontal and a vertical demo."""

from __future__ import annotations

import io
import pathlib
import re

import numpy as np
import pypdf
import pytest

from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.physics.lines import DB_PER_NEPER
from buildsheet.sheet import STOP_SWR, Table, _Context, station_matched_loss_db, station_swr
from buildsheet.solver import coax_line_model, solve

DESIGNS = pathlib.Path(__file__).resolve().parent.parent / "designs"
DEMOS = sorted(DESIGNS.glob("*.yaml"))


def _station_table(design):
    d = load_design(design)
    s = solve(d)
    for block in _Context(d, s).tuning():
        if isinstance(block, Table) and block.header[1] == "SWR at the station":
            return d, s, block
    raise AssertionError("no table of the SWR at the station")


def _mhz(cell: str) -> float:
    return float(cell.replace("\u00a0", " ").split()[0]) * 1e6


def _rho(swr):
    return (np.asarray(swr) - 1) / (np.asarray(swr) + 1)


@pytest.mark.parametrize("design", DEMOS, ids=[p.stem for p in DEMOS])
def test_station_table_is_the_solutions_sweep_through_the_coax(design):
    """Each figure is Solution.sweep.swr_transmitter (and .swr at the tap) interpolated at the
    row's frequency, to the two decimals printed; the rows run from the band's low edge through
    the design frequency to the high edge."""
    d, s, table = _station_table(design)
    freqs = [_mhz(row[0]) for row in table.rows]
    assert 3 <= len(freqs) <= 5
    assert freqs == sorted(freqs)
    low, high = s.band_hz
    assert freqs[0] == pytest.approx(low, abs=1e3) and freqs[-1] == pytest.approx(high, abs=1e3)
    assert any(abs(f - s.frequency_hz) < 1e3 for f in freqs)
    sw = s.sweep
    for (f_text, tx, tap), f in zip(table.rows, freqs):
        # the row's frequency is printed to the kHz: the figure is the sweep's somewhere within half
        # a kHz of it, rounded to the two decimals printed
        near = np.linspace(f - 500.0, f + 500.0, 21)
        assert np.min(np.abs(float(tx) - np.interp(near, sw.frequency_hz, sw.swr_transmitter))) <= 0.005 + 1e-9
        assert np.min(np.abs(float(tap) - np.interp(near, sw.frequency_hz, sw.swr))) <= 0.005 + 1e-9


@pytest.mark.parametrize("design", DEMOS, ids=[p.stem for p in DEMOS])
def test_coax_loss_lowers_the_swr_at_the_station(design):
    """A lossy line attenuates the reflected wave on the way to the load and back:
    |rho_in| = |rho_load| x 10^(-A/10), A the matched loss in dB (the relation physics/coax.py's
    total_loss_db rests on: the lossy-line relation of transmission-line textbooks, from memory, and
    checked below against scikit-rf's lossy line). The solver's sweep at the station follows it
    with A taken at each frequency; the residual is the coax model's complex Z0 (from the cable's
    matched loss), under 0.005 of |rho|."""
    d, s, table = _station_table(design)
    for _, tx, tap in table.rows:
        if float(tap) > 1.05:
            assert float(tx) < float(tap)
    sw = s.sweep
    coax = coax_line_model(d)
    # the coax as cut (the run, the choke's turns, the pigtail): the cut list's feed coax
    assert s.feed_coax_m == next(i.length_m for i in s.cut_list if i.part == "feed coax") > d.feed.length_m
    a_db = coax.gamma(sw.frequency_hz).real * DB_PER_NEPER * s.feed_coax_m
    assert d.feed.impedance_ohm == d.feed.coax_z0_ohm      # both SWRs on the same reference
    rho_tap, rho_tx = _rho(sw.swr), _rho(sw.swr_transmitter)
    shown = rho_tap > 0.05
    assert np.all(rho_tx[shown] < rho_tap[shown])
    np.testing.assert_allclose(rho_tx[shown], rho_tap[shown] * 10 ** (-a_db[shown] / 10), atol=0.005)


def test_station_swr_worked_values_and_scikit_rf():
    """station_swr against a worked value and against scikit-rf. Worked: SWR 3:1 at the load is
    |rho| 0.5; through 3 dB of matched loss |rho| 0.5 x 10^(-0.3) = 0.2506, SWR 1.669 (the
    textbook relation above). scikit-rf: a line of that loss (DefinedGammaZ0, real Z0 50 ohm)
    ending in 150 ohm (SWR 3 on 50 ohm)."""
    assert station_swr(3.0, 3.0) == pytest.approx(1.669, abs=0.001)
    assert station_swr(1.0, 2.0) == pytest.approx(1.0)
    assert station_swr(2.0, 0.0) == pytest.approx(2.0)
    skrf = pytest.importorskip("skrf")
    freq = skrf.Frequency(14.0, 14.0, 1, unit="MHz")
    alpha = 3.0 / DB_PER_NEPER / 30.0        # 3 dB over 30 m, Np/m
    beta = 2 * np.pi * 14e6 / (0.66 * 299_792_458.0)
    media = skrf.media.DefinedGammaZ0(frequency=freq, gamma=alpha + 1j * beta, z0=50, z0_port=50)
    ntw = media.line(30.0, unit="m") ** media.load(_rho(3.0))
    swr_in = float(ntw.s_vswr[0, 0, 0])
    assert station_swr(3.0, 3.0) == pytest.approx(swr_in, rel=1e-6)


@pytest.mark.parametrize("design", DEMOS, ids=[p.stem for p in DEMOS])
def test_stop_reading_at_the_station_is_the_tap_target_through_the_coax(design):
    d, s, table = _station_table(design)
    text = " ".join(b.text for b in _Context(d, s).tuning() if hasattr(b, "text"))
    want = f"{station_swr(STOP_SWR, station_matched_loss_db(d, s)):.2f}:1"
    assert want in text.replace("\u00a0", " ")


def _pages(tmp_path, name):
    assert main(["build", str(DESIGNS / f"{name}.yaml"), "-o", str(tmp_path), "--date", "2026-12-01"]) == 0
    pdf = (tmp_path / f"{name}.pdf").read_bytes()
    text = " ".join(p.extract_text() for p in pypdf.PdfReader(io.BytesIO(pdf)).pages)
    return re.sub(r"\s+", " ", text.replace("\u00a0", " "))


@pytest.mark.parametrize("name,ground", [
    ("oak-yard-20m", "lower the stub's open top on its rope"),
    ("tower-70cm", "the mast tilted over or lowered"),
])
def test_both_paths_in_the_pdf(tmp_path, name, ground):
    text = _pages(tmp_path, name)
    for phrase in ("With an SWR meter at the transmitter", "With an analyzer at the tap", ground,
                   "does not hold once the antenna is raised", "Make the final check with everything in place",
                   "SWR at the station", "flat and high everywhere", "the dip is low", "the dip is high",
                   "the match is off"):
        assert phrase in text, phrase
    _, _, table = _station_table(DESIGNS / f"{name}.yaml")
    for f, tx, _ in table.rows:
        assert f"{f.replace(chr(160), ' ')} {tx}" in text
