"""Sweeps and SWR readings taken at the station end of the feed coax (buildsheet/station.py, issue 16
item 4): carried back to the tap, they must give what the tap gives.

References:
  - NEC-2 (PyNEC, tests/necref.py through tests/data/nec_sweep.py): the J-pole's impedance at the tap.
  - scikit-rf (skrf.media.DefinedGammaZ0 line cascaded with a one-port load, Network `**`): an
    independent implementation of the coax between the tap and the station. It is given the coax's
    Z0 and propagation constant (the catalogue's figures through solver.coax_line_model) and the
    length of the cut list's feed coax; the transmission through the line is its own.
"""

from __future__ import annotations

import json
import math
import sys
from pathlib import Path

import numpy as np
import pytest
import skrf

from buildsheet import fit as fitmod
from buildsheet import station
from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.errors import SweepError
from buildsheet.solver import Dimensions, solve
from buildsheet.touchstone import Sweep

DATA = Path(__file__).parent / "data"
FREE = DATA / "fit-20m-free.yaml"
sys.path.insert(0, str(DATA))
import nec_sweep  # noqa: E402


def dims(design):
    d = solve(design).dimensions
    return np.array([d.radiator, d.stub, d.tap])


def skrf_station(f, z_tap, coax: station.Coax) -> np.ndarray:
    """The impedance at the station end: scikit-rf's line of the coax's Z0 and gamma, `length_m`
    long, cascaded with the tap's impedance as a one-port load."""
    freq = skrf.Frequency.from_f(f, unit="hz")
    media = skrf.media.DefinedGammaZ0(freq, z0=coax.z0_ohm, gamma=coax.line.gamma(f))
    line = media.line(coax.length_m, unit="m")
    load = skrf.Network(frequency=freq, s=((z_tap - coax.z0_ohm) / (z_tap + coax.z0_ohm)).reshape(-1, 1, 1),
                        z0=coax.z0_ohm)
    return (line ** load).z[:, 0, 0]


def as_sweep(f, z, name="s.s1p"):
    return Sweep(frequency_hz=np.asarray(f, float), z_ohm=np.asarray(z, complex), path=name,
                 lines=tuple(range(1, len(f) + 1)))


@pytest.fixture(scope="module")
def nec_case():
    design = load_design(FREE)
    built = dims(design) * np.array([1.0, 1.0, 1.4])       # the tap 40 % long
    f = design.frequency_hz * np.linspace(0.92, 1.08, 31)
    z_tap = nec_sweep.nec_impedance(design, *built, f)
    coax = station.feed_coax(design, solve(design))
    return design, built, f, z_tap, coax, skrf_station(f, z_tap, coax)


def test_coax_is_the_cut_lists_feed_coax(nec_case):
    design, _, _, _, coax, _ = nec_case
    item = next(i for i in solve(design).cut_list if i.part == "feed coax")
    assert coax.length_m == item.length_m > design.feed.length_m     # the choke's turns and pigtail
    assert coax.z0_ohm == 50.0 and coax.name == "RG-8X"


def test_station_sweep_carried_back_recovers_the_nec_tap_sweep(nec_case):
    """De-embedding of the scikit-rf station sweep gives NEC-2's tap sweep back: |rho| within 1e-9
    (both are exact line formulas; what remains is rounding)."""
    design, _, f, z_tap, coax, z_st = nec_case
    back = station.to_tap(as_sweep(f, z_st), coax).z_ohm
    rho = lambda z: (z - 50) / (z + 50)  # noqa: E731
    assert np.max(np.abs(rho(back) - rho(z_tap))) < 1e-9
    # the coax does change what is seen: the station sweep is not the tap sweep
    assert np.max(np.abs(rho(z_st) - rho(z_tap))) > 0.1


def test_fit_at_the_station_gives_the_advice_of_the_tap(nec_case, tmp_path, capsys):
    design, built, f, z_tap, coax, z_st = nec_case
    b = Dimensions(*built, design.stub.spacing_m)
    at_tap = fitmod.fit_sweep(design, as_sweep(f, z_tap), built=b)
    at_station = fitmod.fit_sweep(design, as_sweep(f, z_st), built=b, at="station")
    assert at_station.moves_rounded_m == at_tap.moves_rounded_m
    assert [s[0] for s in at_station.steps] == [s[0] for s in at_tap.steps]
    assert at_station.swr_after == pytest.approx(at_tap.swr_after, abs=1e-6)
    # the station sweep fitted as if taken at the tap: another antenna, or refused
    try:
        wrong = fitmod.fit_sweep(design, as_sweep(f, z_st), built=b)
        assert wrong.moves_rounded_m != at_tap.moves_rounded_m
    except SweepError:
        pass
    # through the command line: the text says where and how much the coax hides
    sweep = tmp_path / "station.s1p"
    rho = (z_st - 50) / (z_st + 50)
    sweep.write_text("# HZ S RI R 50\n" + "".join(f"{fi:.1f} {r.real:.12f} {r.imag:.12f}\n"
                                                  for fi, r in zip(f, rho)))
    assert main(["fit", str(FREE), str(sweep), "--at", "station"]) == 0
    out = capsys.readouterr().out
    assert "measured at the station" in out and "reflections come back" in out
    assert main(["fit", str(FREE), str(sweep), "--at", "station", "--json"]) == 0
    got = json.loads(capsys.readouterr().out)
    assert got["sweep"]["measured_at"] == "station"


def test_what_the_coax_hides_is_the_textbook_lossy_line_relation(nec_case):
    """|rho| at the station = |rho| at the tap times e^(-2 alpha l) = 10^(-A/10), A the one-way matched
    loss in dB (textbook lossy line, e.g. Ramo, Whinnery & Van Duzer), on the scikit-rf cascade."""
    design, _, f, z_tap, coax, z_st = nec_case
    rho = lambda z: np.abs((z - 50) / (z + 50))  # noqa: E731
    np.testing.assert_allclose(rho(z_st), rho(z_tap) * 10 ** (-coax.loss_db(f) / 10), rtol=1e-9)
    np.testing.assert_allclose(station.rho_to_tap(f, rho(z_st), coax), rho(z_tap), rtol=1e-9)
    assert f"{2 * coax.loss_db_f0:.2f} dB weaker" in station.hidden_text(coax)


def test_loss_limit_is_derived_from_the_gate_and_the_analyzer():
    """5.9 dB: 10 log10((0.276 - 0.081)/0.05) (station.py docstring, step 3)."""
    assert station.max_loss_db() == pytest.approx(
        10 * math.log10((fitmod.FIT_GATE - fitmod.HELD_OUT_P90) / 0.05), rel=1e-12)
    assert station.max_loss_db() == pytest.approx(5.9, abs=0.05)


def test_long_lossy_coax_is_refused_and_nothing_written(tmp_path, capsys):
    """A 2 m design at the end of 60 m of RG-58-like coax: several dB of loss. Refused, one line."""
    text = FREE.read_text().replace("coax: RG-8X", "coax: RG-8X\n  length: 150 m")
    path = tmp_path / "long.yaml"
    path.write_text(text)
    design = load_design(path)
    coax = station.feed_coax(design, solve(design))
    assert coax.loss_db_f0 > station.max_loss_db()
    f = design.frequency_hz * np.linspace(0.92, 1.08, 31)
    sweep = tmp_path / "st.s1p"
    sweep.write_text("# HZ S MA R 50\n" + "".join(f"{fi:.1f} 0.05 10\n" for fi in f))
    before = path.read_bytes()
    assert main(["fit", str(path), str(sweep), "--at", "station", "--write"]) == 2
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and "dB matched loss" in err and "measure at the tap" in err
    assert path.read_bytes() == before and not (tmp_path / "long.yaml.bak").exists()


def test_station_reading_above_what_the_coax_allows_is_refused(nec_case):
    design, _, f, _, coax, _ = nec_case
    near_open = np.full(len(f), 0.99)       # through 0.6 dB of coax a station can never read this
    with pytest.raises(SweepError, match="more than a passive antenna reflects"):
        station.rho_to_tap(f, near_open, coax)


def test_swr_readings_at_the_station_give_the_advice_of_the_tap(nec_case, capsys):
    """SWR read at the station is lower than at the tap (the coax's two-way loss); carried back, the
    NEC-2 readings (through the scikit-rf line) give the tap's advice, and read as if at the tap they
    would not."""
    from buildsheet import swronly
    design, built, _, _, coax, _ = nec_case
    f = design.frequency_hz * np.array([0.975, 0.985, 0.99, 0.995, 1.0, 1.005, 1.01, 1.015, 1.025])
    z_tap = nec_sweep.nec_impedance(design, *built, f)
    z_st = skrf_station(f, z_tap, coax)
    rho = lambda z: np.abs((z - 50) / (z + 50))  # noqa: E731
    assert np.all(rho(z_st) < rho(z_tap))
    b = Dimensions(*built, design.stub.spacing_m)
    at_tap = swronly.advise(design, list(zip(f, rho(z_tap))), built=b)
    at_station = swronly.advise(design, list(zip(f, rho(z_st))), at="station", built=b)
    assert at_station.moves_rounded_m == at_tap.moves_rounded_m
    naive = swronly.advise(design, list(zip(f, rho(z_st))), built=b)
    assert naive.moves_rounded_m != at_tap.moves_rounded_m
    typed = sum((["--swr", f"{fi / 1e6:.4f} MHz={(1 + r) / (1 - r):.3f}"] for fi, r in zip(f, rho(z_st))), [])
    assert main(["fit", str(FREE), *typed, "--at", "station"]) == 0
    out = capsys.readouterr().out
    assert "taken at the station" in out and "reflections come back" in out


def test_turn_per_percent_of_velocity_factor(nec_case):
    """beta = 2 pi f/(vf c) (lossless phase constant, textbook; the catalogue's line is distortionless
    so its beta is exactly that): a 1 % error of vf turns rho by 2 beta l 0.01 rad."""
    design, _, _, _, coax, _ = nec_case
    beta = 2 * math.pi * design.frequency_hz / (design.feed.coax_velocity_factor * 299_792_458.0)
    assert station.turn_deg_per_percent(coax) == pytest.approx(
        math.degrees(2 * beta * coax.length_m * 0.01), rel=1e-9)
    assert f"about {station.turn_deg_per_percent(coax):.0f}°" in station.hidden_text(coax)
