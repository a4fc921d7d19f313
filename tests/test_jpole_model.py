"""The compact J-pole model (buildsheet.physics.jpole) on its own: identities, limits, the tap table
of CHECK_VALUES §1b, energy balance, signs of the tuning derivatives, and trade figures.

NEC-2 acceptance is in test_jpole_nec.py; the wire formulas are in test_radiator.py.
"""

import numpy as np
import pytest

from buildsheet.physics import jpole
from buildsheet.physics.lines import Line, swr

C0 = 299_792_458.0
FT = 0.3048
CU = 5.8e7
D14 = 0.127e-3 * 92 ** ((36 - 14) / 39)       # ASTM B258 (CHECK_VALUES §2c)
D12 = 0.127e-3 * 92 ** ((36 - 12) / 39)


def antenna(**kw):
    base = dict(stub_line=Line.two_wire(0.025, D14, CU), spacing=0.025, stub_conductor_d=D14,
                stub_sigma=CU, wire_d=D14, wire_sigma=CU, wire_vf=1.0, orientation="horizontal",
                height=10.0, ground_kind="real", ground_eps_r=13.0, ground_sigma=0.005)
    base.update(kw)
    return jpole.Antenna(**base)


def design(f0, ant, z_feed=50.0):
    L = jpole.resonant_radiator_length(f0, ant)
    S, T = jpole.solve_match(f0, z_feed, ant, L)
    return L, S, T


VARIANTS = {
    "horizontal-real": antenna(),
    "horizontal-free": antenna(ground_kind="free-space", height=20.0),
    "sloper-perfect": antenna(orientation="sloper", slope=np.radians(30), ground_kind="perfect", height=12.0),
    "vertical-free": antenna(orientation="vertical", ground_kind="free-space", height=5.0),
    "window-line": antenna(stub_line=Line.two_wire(0.0254 * 0.75, 0.0013, CU, eps_eff=1.2, tan_delta=0.003),
                           spacing=0.0254 * 0.75, stub_conductor_d=0.0013),
    "insulated-wire": antenna(wire_vf=0.95),
}


@pytest.mark.parametrize("name", list(VARIANTS))
def test_match_is_exact_and_tap_lies_between_short_and_open_end(name):
    ant = VARIANTS[name]
    L, S, T = design(14.175e6, ant)
    z = jpole.feed_impedance(np.array([14.175e6]), ant, L, S, T)[0]
    assert abs(z - 50.0) < 1e-4
    assert 0 < T < S


@pytest.mark.parametrize("name", list(VARIANTS))
def test_swr_at_least_one_and_minimum_near_design_frequency(name):
    ant = VARIANTS[name]
    f0 = 14.175e6
    L, S, T = design(f0, ant)
    f = np.linspace(0.98 * f0, 1.02 * f0, 201)
    s = swr(jpole.feed_impedance(f, ant, L, S, T), 50.0)
    assert np.all(s >= 1.0)
    assert abs(f[np.argmin(s)] - f0) < 0.002 * f0


@pytest.mark.parametrize("name", list(VARIANTS))
def test_energy_balance(name):
    """Delivered = radiated + stub conductor + dielectric + radiator wire, each integrated separately."""
    ant = VARIANTS[name]
    L, S, T = design(14.175e6, ant)
    st = jpole.state_at(14.175e6, ant, L, S, T, 100.0)
    assert st.balance_error < 1e-6
    assert st.p_delivered == pytest.approx(100.0, rel=1e-9)
    assert 0.5 < st.efficiency < 1.0
    if name == "window-line":
        assert st.p_stub_dielectric > 0
    else:
        assert st.p_stub_dielectric == 0


def test_open_end_voltage_carries_the_power_into_the_top():
    """CHECK_VALUES §6a: V_rms = sqrt(P R) at a resistive point, generalised: the open-top voltage
    across the load z_top delivers |V|^2 Re(1/z_top), which must equal what the arms radiate and
    dissipate (integrated separately along the radiator and the common mode); the stub line's own
    radiation (jpole.Calibration r_sr) is part of p_radiated but leaves from the line below the top."""
    ant = VARIANTS["horizontal-free"]
    f0 = 14.175e6
    L, S, T = design(f0, ant)
    st = jpole.state_at(f0, ant, L, S, T, 100.0)
    z_top = jpole.at_frequency(f0, ant).z_top(L, S)
    p_top = st.v_open_end ** 2 * (1 / z_top).real
    assert st.p_stub_radiated > 0
    assert p_top == pytest.approx(st.p_radiated - st.p_stub_radiated + st.p_wire + st.p_common_mode, rel=1e-9)


@pytest.mark.parametrize("orientation", ["horizontal", "vertical"])
def test_lengths_fall_as_frequency_rises(orientation):
    ant = antenna(orientation=orientation, ground_kind="free-space", height=30.0)
    dims = np.array([design(f, ant) for f in (7.1e6, 14.175e6, 21.2e6, 28.5e6)])
    assert np.all(np.diff(dims, axis=0) < 0)


@pytest.mark.parametrize("R, x_450, x_600", [(2500, 63.000, 84.000), (3000, 57.609, 76.811),
                                              (5000, 44.774, 59.699)])
def test_textbook_tap_leaves_inductive_residue(R, x_450, x_600):
    """CHECK_VALUES §1b tap table [C, scikit-rf identity]: a lossless stub 90 deg from short to open
    end, loaded by R, tapped where sin^2(theta) = 50/R, shows Z = 50 + j Z0 sin(theta) cos(theta).
    A hair-thin spacing makes the bar effects vanish so the tap network is the textbook one."""
    f = 14.2e6
    for z0, x in ((450.0, x_450), (600.0, x_600)):
        ant = antenna(stub_line=Line.nominal(z0, 1.0), spacing=1e-7, stub_conductor_d=1e-8)
        quarter = C0 / (4 * f)
        tap = np.arcsin(np.sqrt(50.0 / R)) / (2 * np.pi * f / C0)
        z = jpole.at_frequency(f, ant).z_feed(np.nan, quarter, tap, complex(R))
        assert z.real == pytest.approx(50.0, rel=1e-6)
        assert z.imag == pytest.approx(x, abs=1e-3)


def test_two_d_solve_removes_the_textbook_residue():
    """The textbook tap (quarter-wave stub, sin^2 = 50/R_top) leaves the feed inductive and off 50 ohm;
    the 2-D solve of stub and tap gives 50 + j0."""
    ant = VARIANTS["horizontal-real"]
    f0 = 14.175e6
    L, S, T = design(f0, ant)
    r_top = jpole.at_frequency(f0, ant).z_top(L, S).real
    beta = ant.stub_line.gamma(f0).imag
    quarter = np.pi / 2 / beta
    t_book = np.arcsin(np.sqrt(50.0 / r_top)) / beta
    z_book = jpole.feed_impedance(np.array([f0]), ant, L, quarter, t_book)[0]
    assert z_book.imag > 5.0
    assert swr(z_book, 50.0) > 1.1
    z = jpole.feed_impedance(np.array([f0]), ant, L, S, T)[0]
    assert swr(z, 50.0) < 1.0001


def _dip(ant, L, S, T, f0, z_feed=50.0):
    """Frequency of lowest SWR (Hz) of the model near f0: a fine sweep, then the vertex of the
    parabola through the least |rho|^2 and its neighbours."""
    f = f0 * np.linspace(0.99, 1.01, 801)
    rho2 = np.abs((lambda z: (z - z_feed) / (z + z_feed))(jpole.feed_impedance(f, ant, L, S, T))) ** 2
    i = int(np.argmin(rho2))
    a, b, c = rho2[i - 1:i + 2]
    return f[i] + 0.5 * (a - c) / (a - 2 * b + c) * (f[1] - f[0])


def test_sensitivity_signs_and_values_match_finite_moves():
    """DESIGN.md §5 signs: positive = toward the open top. Radiator longer -> dip lower; short up
    (stub shorter) -> dip higher; tap up -> R up; the derivatives agree with explicit moves of the
    public feed_impedance: 5 mm for R and X, and 0.2 % of the radiator and 2 cm of the short for the
    dip, found as the least SWR of a fine sweep."""
    ant = VARIANTS["horizontal-real"]
    f0 = 14.175e6
    _, S, T = design(f0, ant)
    L = jpole.resonant_radiator_length(f0, ant, S)
    S, T = jpole.solve_match(f0, 50.0, ant, L)
    sens = jpole.sensitivities(f0, ant, L, S, T)
    assert sens.dip_hz_per_m_radiator < 0
    assert sens.dip_hz_per_m_short > 0
    assert sens.ohm_per_m_tap > 0
    f = np.array([f0])
    d = 0.005
    z = lambda S_, T_: jpole.feed_impedance(f, ant, L, S_, T_)[0]
    dr = (z(S, T + d).real - z(S, T - d).real) / (2 * d)
    assert sens.ohm_per_m_tap == pytest.approx(dr, rel=0.02)
    # short moved up by d: stub and tap distance both shorten by d
    dx = (z(S - d, T - d).imag - z(S + d, T + d).imag) / (2 * d)
    assert sens.ohm_per_m_short == pytest.approx(dx, rel=0.02)
    assert _dip(ant, L, S, T, f0) == pytest.approx(f0, rel=2e-5)
    dl = 0.002 * L
    shift = (_dip(ant, L + dl, S, T, f0) - _dip(ant, L - dl, S, T, f0)) / (2 * dl)
    assert sens.dip_hz_per_m_radiator == pytest.approx(shift, rel=0.03)
    ds = 0.02
    shift = (_dip(ant, L, S - ds, T - ds, f0) - _dip(ant, L, S + ds, T + ds, f0)) / (2 * ds)
    assert sens.dip_hz_per_m_short == pytest.approx(shift, rel=0.03)
    # the radiator's own resonance moves more than the dip does (the stub also sets the dip)
    df = 0.002 * f0
    L2 = jpole.resonant_radiator_length(f0 + df, ant, S)
    assert (L2 - L) * sens.hz_per_m_resonance == pytest.approx(df, rel=0.05)
    assert abs(sens.hz_per_m_resonance) > abs(sens.dip_hz_per_m_radiator)


def test_trade_half_wave_20m_length():
    """Common practice (no source): a thin-wire half wave for 14.175 MHz is 32.5-34 ft between
    attachment points."""
    L, _, _ = design(14.175e6, VARIANTS["horizontal-real"])
    assert 32.5 * FT <= L <= 34.0 * FT


def test_trade_quarter_wave_of_vf_095_line():
    """Common practice (no source): a quarter wave of line with VF 0.95 at 14.15 MHz is 16.2-16.8 ft;
    CHECK_VALUES §1b gives VF c/(4f) exactly. The model's stub on such a line stays in the range."""
    f = 14.15e6
    line = Line.nominal(450.0, 0.95)
    quarter = C0 * line.velocity_factor(f) / (4 * f)
    assert quarter == pytest.approx(0.95 * C0 / (4 * f), rel=1e-12)
    assert 16.2 * FT <= quarter <= 16.8 * FT
    ant = antenna(stub_line=line, spacing=0.02, stub_conductor_d=0.0013)
    _, S, _ = design(f, ant)
    assert 16.2 * FT <= S <= 16.8 * FT


@pytest.mark.parametrize("f0, d, s, orientation", [
    (1.84e6, D12, 0.15, "horizontal"), (3.6e6, D14, 0.025, "sloper"), (50.1e6, D14, 0.025, "horizontal"),
    (146e6, 0.0159, 0.05, "vertical"), (446e6, 0.00635, 0.025, "vertical"), (146e6, D12, 0.025, "vertical")])
def test_whole_range_solves(f0, d, s, orientation):
    """1.8-450 MHz, thin wire and pipe/rod, every orientation: a match exists and is exact."""
    lam = C0 / f0
    ant = antenna(stub_line=Line.two_wire(s, d, CU), spacing=s, stub_conductor_d=d, wire_d=d,
                  orientation=orientation, slope=np.radians(30), height=0.3 * lam + lam / 4 + 1.0)
    L, S, T = design(f0, ant)
    # pipes and wide stubs move the resonance well off lam/2 (NEC-2 agrees, test_jpole_nec.py)
    assert 0.40 * lam < L < 0.56 * lam
    assert 0.2 * lam < S < 0.3 * lam
    assert 0 < T < S
    st = jpole.state_at(f0, ant, L, S, T, 100.0)
    assert st.balance_error < 1e-6
