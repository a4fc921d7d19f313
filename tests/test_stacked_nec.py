"""Acceptance of the stacked (collinear) version of the compact model (buildsheet.physics.jpole,
Stack, design_stack, stacked_radiator_length) against NEC-2 (PyNEC through tests/necref.py,
stacked_wires: the J-pole's converged mesh of DESIGN.md §7 with the phasing stub meshed as a stub,
copper or aluminium wires by LD 5, GN 2 Sommerfeld-Norton ground).

For each design the model chooses the elements, the phasing stub, the J-pole stub and the tap as the
solver does (bench/stack_study.py model_stacked); NEC-2 analyses a wire model of those dimensions:
  - SWR (50 ohm) at the design frequency <= 1.2 (the brief's target, as for the single version);
  - the 2:1 bands of NEC and of the model overlap with intersection/union >= 0.8;
  - the gain the second element adds over the single version (each solved by the model, each
    analysed by NEC at its own dimensions; maximum gain of NEC's RP grid, theta every 0.5 degree
    over ground, 1 degree in free space, phi every 10) within 1 dB of the model's (the single version's pattern
    checks of tests/test_radiation_nec.py use 1 dB for the maximum gain).
The designs are thin wire or rod that NEC-2 can mesh (spacing at least 5 conductor diameters) on
lines near 270-300 ohm: a stacked pair's end impedance is about half a single radiator's, which a
line of 450 ohm and more cannot transform to 50 ohm (the solver refuses those, saying so). None of
these designs was used to fit jpole.STACK_CAL (bench/stack_study.py fits random designs).
Measured (PyNEC, bench/data/stack-accept-c1.json, `bench/stack_study.py accept`; in the order of
CASES): NEC SWR at f0 1.065, 1.066, 1.050, 1.126; 2:1 band overlap 0.93, 0.93, 0.93, 0.92 (NEC
142.39-149.56, 142.39-149.57, 432.89-460.74, 28.085-28.752 MHz; model 142.23-149.97, 142.23-149.97,
431.20-461.07, 28.041-28.765 MHz); gain over the single version model +1.65, +1.81, +1.64, +1.67 dB,
NEC +1.64, +1.77, +1.78, +1.61 dB. NEC's RP grid: phi every 10 degrees (the maximum of these
patterns varies by under 0.1 dB in azimuth).
"""

from __future__ import annotations

import dataclasses
import sys
from pathlib import Path

import numpy as np
import pytest

sys.path.insert(0, str(Path(__file__).parent))
import necref  # noqa: E402
import test_jpole_nec as acc  # noqa: E402

from buildsheet.physics import jpole, radiation  # noqa: E402
from buildsheet.physics.lines import swr  # noqa: E402

AWG = necref.awg_diameter
AL = 3.5e7      # aluminium, S/m (from memory; CHECK_VALUES lists 3.5e7 to 3.8e7 for the alloys)

CASES = (
    acc.Case("2m-rod-vert-free", 146.0e6, (144.0e6, 148.0e6), 0.004, 0.004, 0.020,
             "vertical", 3.0, acc.FREE, wire_sigma=AL, stub_sigma=AL),
    acc.Case("2m-rod-vert-6m-avg", 146.0e6, (144.0e6, 148.0e6), 0.004, 0.004, 0.020,
             "vertical", 6.0, acc.AVERAGE, wire_sigma=AL, stub_sigma=AL),
    acc.Case("70cm-rod-vert-free", 446.0e6, (420.0e6, 450.0e6), 0.0024, 0.0024, 0.012,
             "vertical", 2.0, acc.FREE),
    acc.Case("10m-wire-horiz-12m-avg", 28.4e6, (28.0e6, 29.7e6), AWG(14), AWG(14), 0.010,
             "horizontal", 12.0, acc.AVERAGE),
)


def model_stacked(case):
    """(antenna with its stack, L, S, T) as the solver designs the stacked version."""
    ant = case.antenna()
    L = jpole.resonant_radiator_length(case.f0, ant)
    st = jpole.design_stack(case.f0, ant, L, ant.stub_line, case.spacing, case.stub_d, case.stub_sigma)
    L = jpole.stacked_radiator_length(case.f0, dataclasses.replace(ant, stack=st), st)
    ant = dataclasses.replace(ant, stack=dataclasses.replace(st, element=L))
    S, T = jpole.solve_match(case.f0, 50.0, ant, L)
    return ant, L, S, T


def nec_stack(ant):
    st = ant.stack
    return necref.StackDims(st.element, st.phasing, st.spacing, st.conductor_d, st.sigma)


def _max_gain(pat) -> float:
    return float(np.max(pat.gain_dbi))


def compare(case, n_nec: int = 25) -> dict:
    """Model dimensions -> NEC SWR at f0, both 2:1 bands, and the gain over the single version."""
    ant, L, S, T = model_stacked(case)
    span = 0.06
    f_nec = case.f0 * np.linspace(1 - span, 1 + span, n_nec)
    dims = case.nec_dims(L, S, T)
    nec = necref.stacked_model(dims, nec_stack(ant), np.concatenate([[case.f0], f_nec]))
    swr_nec = swr(nec.z_feed, 50.0)
    f_mod = case.f0 * np.linspace(1 - span, 1 + span, 401)
    swr_mod = swr(jpole.feed_impedance(f_mod, ant, L, S, T), 50.0)
    b_nec, b_mod = acc.band_2to1(f_nec, swr_nec[1:]), acc.band_2to1(f_mod, swr_mod)
    # gain over the single version: the model's patterns, and NEC's at each version's dimensions
    single, L1, S1, T1 = acc.model_design(case)
    g_mod = {}
    for name, a, dl, ds, dt in (("stacked", ant, L, S, T), ("single", single, L1, S1, T1)):
        eff = jpole.state_at(case.f0, a, dl, ds, dt, 1.0).efficiency
        g_mod[name] = radiation.radiation(jpole.at_frequency(case.f0, a), dl, ds, eff).max_gain_dbi
    step = 1.0 if case.ground["ground_kind"] == "free-space" else 0.5
    g_nec_stacked = _max_gain(necref.stacked_pattern(dims, nec_stack(ant), case.f0, step, 10.0))
    d1 = case.nec_dims(L1, S1, T1)
    wires = necref.jpole_wires(d1, case.f0)
    sigma = {necref.TAG_RADIATOR: d1.wire_sigma, **{t: d1.stub_sigma for t in range(2, 8)}}
    bar = wires[necref.TAG_TAP - 1]
    g_nec_single = _max_gain(necref.pattern(wires, case.f0, d1.ground, (necref.TAG_TAP, (bar.nseg + 1) // 2),
                                            sigma, step, 10.0))
    return dict(L=L, S=S, T=T, element=ant.stack.element, phasing=ant.stack.phasing,
                z_nec=complex(nec.z_feed[0]), swr=float(swr_nec[0]), band_nec=b_nec, band_model=b_mod,
                overlap=acc.overlap(b_nec, b_mod),
                gain_model=g_mod["stacked"] - g_mod["single"], gain_nec=g_nec_stacked - g_nec_single,
                max_gain_model=g_mod["stacked"], max_gain_nec=g_nec_stacked)


@pytest.fixture(scope="module")
def results():
    return {c.name: compare(c) for c in CASES}


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_nec_swr_at_design_frequency(case, results):
    r = results[case.name]
    assert r["swr"] <= 1.2, f"{case.name}: NEC SWR {r['swr']:.3f} (Z {r['z_nec']:.1f}) for {r}"


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_nec_and_model_2to1_bands_overlap(case, results):
    r = results[case.name]
    assert r["overlap"] >= 0.8, f"{case.name}: bands NEC {r['band_nec']} model {r['band_model']}"


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_gain_over_single_matches_nec(case, results):
    r = results[case.name]
    assert r["gain_model"] == pytest.approx(r["gain_nec"], abs=1.0), \
        f"{case.name}: model +{r['gain_model']:.2f} dB, NEC +{r['gain_nec']:.2f} dB"
    assert r["gain_nec"] > 0.5, f"{case.name}: NEC sees no gain from the second element ({r})"


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_phasing_short_current_is_within_what_the_sheet_says(case):
    """The sheet prints the phasing stub's voltage and current with the note that NEC-2 puts the
    current up to 30 % higher (sheet.PHASING_NOTE): NEC-2's current in the phasing short bar (its
    largest segment current, rms) over the model's (jpole.state_at at NEC's input power) lies in
    1.0-1.3 on these designs (measured 1.08-1.25 with CAL c5, 1.05-1.29 with c4)."""
    ant, L, S, T = model_stacked(case)
    r = necref.stacked_model(case.nec_dims(L, S, T), nec_stack(ant), [case.f0], currents=True)
    p_in = 0.5 * (1.0 / r.z_feed[0]).real          # 1 V peak source: P = Re(V I*)/2
    nec = np.max(np.abs(r.currents[0][necref.TAG_PH_SHORT][1])) / np.sqrt(2)
    model = jpole.state_at(case.f0, ant, L, S, T, p_in).i_phasing_short
    assert 1.0 <= nec / model <= 1.3, f"{case.name}: NEC {nec:.4g} A, model {model:.4g} A"


def _nec_z(case, ant, L, S, T, d_el, f, like):
    """NEC-2 feed impedance with both elements d_el (m) longer, meshed like `like`."""
    st = dataclasses.replace(nec_stack(ant), element=ant.stack.element + d_el)
    return necref.stacked_model(case.nec_dims(L + d_el, S, T), st, f, f_mesh=1.05 * case.f0,
                                like=like).z_feed


def _nec_dip(case, ant, L, S, T, d_el, like):
    """NEC-2's SWR dip (Hz), as tests/test_jpole_nec._nec_dip: |rho|^2 on 9 frequencies over f0
    +/- 0.6 %, the vertex of the parabola through the least and its neighbours."""
    f = case.f0 + 0.012 * case.f0 * np.linspace(-0.5, 0.5, 9)
    z = _nec_z(case, ant, L, S, T, d_el, f, like)
    rho2 = np.abs((z - 50) / (z + 50)) ** 2
    i = int(np.clip(np.argmin(rho2), 1, len(f) - 2))
    a, b, c = rho2[i - 1:i + 2]
    return f[i] + 0.5 * (a - c) / (a - 2 * b + c) * (f[1] - f[0])


@pytest.fixture(scope="module")
def rates():
    """Model rates (jpole.sensitivities, both elements moved together) and NEC-2 central
    differences: the dip per metre of both elements (moves of 1 %), R per tap move and X per short
    move (5 % of the tap distance, tap clamps in place)."""
    out = {}
    for case in CASES:
        ant, L, S, T = model_stacked(case)
        like = (case.nec_dims(L, S, T), nec_stack(ant))
        sens = jpole.sensitivities(case.f0, ant, L, S, T)
        dl, h = 0.01 * L, 0.05 * T
        dip = (_nec_dip(case, ant, L, S, T, dl, like) - _nec_dip(case, ant, L, S, T, -dl, like)) / (2 * dl)
        z = lambda S_, T_: _nec_z(case, ant, L, S_, T_, 0.0, [case.f0], like)[0]
        out[case.name] = dict(
            dip_elements=(sens.dip_hz_per_m_radiator, dip),
            r_tap=(sens.ohm_per_m_tap, (z(S, T + h).real - z(S, T - h).real) / (2 * h)),
            x_short=(sens.ohm_per_m_short, (z(S - h, T - h).imag - z(S + h, T + h).imag) / (2 * h)))
    return out


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
@pytest.mark.parametrize("rate", ["r_tap", "x_short"])
def test_tap_and_short_rates_match_nec(case, rate, rates):
    """The tuning table's tap and short rates within 15 % of NEC-2's (as for the single version,
    tests/test_jpole_nec.py; measured within 6 %, bench/data/stack-rates-c5.json)."""
    model, nec = rates[case.name][rate]
    assert model == pytest.approx(nec, rel=0.15), f"{case.name} {rate}: model {model:.4g}, NEC {nec:.4g}"


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_element_trim_rate_is_as_the_sheet_says(case, rates):
    """The element trim's dip rate is NOT within 15 % of NEC-2's: NEC-2 moves the dip 1.25-1.73
    times as far per trim as the model (measured, bench/data/stack-rates-c5.json), and the sheet's
    tuning procedure says so ("1.3 to 1.8 times", trim half the move first). This checks that statement: the ratio lies in
    1.2-1.8 and has the model's sign."""
    model, nec = rates[case.name]["dip_elements"]
    assert 1.2 <= nec / model <= 1.8, f"{case.name}: model {model:.4g}, NEC {nec:.4g} Hz/m"


REAL_GROUND = [c for c in CASES if c.ground["ground_kind"] == "real"]


@pytest.mark.parametrize("case", REAL_GROUND, ids=[c.name for c in REAL_GROUND])
def test_efficiency_with_ground_loss_matches_nec(case):
    """Efficiency = radiated (space wave) / delivered to the tap, ground loss included, against
    NEC-2 as for the single version (tests/test_jpole_nec.py): NEC's radiated fraction from its
    average gain over the upper hemisphere, divided by its own energy balance on the same structure
    with lossless wires in free space. Within 5 points (measured: 0.665 vs 0.681, 0.652 vs 0.653)."""
    ant, L, S, T = model_stacked(case)
    model = jpole.state_at(case.f0, ant, L, S, T, 100.0).efficiency
    d, st = case.nec_dims(L, S, T), nec_stack(ant)
    raw = necref.stacked_model(d, st, [case.f0], pattern_step_deg=5.0).average_gain[0]
    lossless = dataclasses.replace(d, ground=necref.Ground(), wire_sigma=None, stub_sigma=None)
    balance = necref.stacked_model(lossless, dataclasses.replace(st, sigma=None), [case.f0],
                                   pattern_step_deg=5.0).average_gain[0]
    assert model == pytest.approx(raw / balance, abs=0.05), f"model {model:.3f}, NEC {raw:.3f} / {balance:.3f}"


def test_energy_balance_of_the_stacked_line_solution():
    """Power in = radiated + every loss, each integrated separately from the currents (jpole.state_at
    on the stacked version): a real check of the junction's currents, not a definition."""
    case = CASES[1]
    ant, L, S, T = model_stacked(case)
    st = jpole.state_at(case.f0, ant, L, S, T, 100.0)
    assert st.balance_error < 1e-9
    assert st.p_field > 0 and st.v_phasing_open > 0


if __name__ == "__main__":
    import time
    for c in CASES:
        t = time.time()
        r = compare(c)
        print(f"{c.name}: NEC SWR at f0 {r['swr']:.3f} (Z {r['z_nec']:.1f}); 2:1 NEC "
              f"{np.round(np.array(r['band_nec']) / 1e6, 3) if r['band_nec'] else None} model "
              f"{np.round(np.array(r['band_model']) / 1e6, 3) if r['band_model'] else None} overlap "
              f"{r['overlap']:.2f}; gain over single model {r['gain_model']:+.2f} NEC {r['gain_nec']:+.2f} dB "
              f"(max model {r['max_gain_model']:.2f} NEC {r['max_gain_nec']:.2f} dBi) [{time.time() - t:.1f} s]")
