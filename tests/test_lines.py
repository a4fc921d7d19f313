"""Tests of physics/lines.py against scikit-rf, CHECK_VALUES §1-§2 and transmission-line identities."""

import numpy as np
import pytest
import skrf
from hypothesis import given
from hypothesis import strategies as st
from scipy.constants import c as C0
from scipy.constants import epsilon_0, mu_0
from skrf.media import DefinedGammaZ0

from buildsheet.physics import ModelError
from buildsheet.physics.lines import (DB_PER_NEPER, Line, abcd, input_impedance, open_stub,
                                      reflection, shorted_stub, swr, voltage_current_along)

F = 14.2e6                                   # CHECK_VALUES default frequency, Hz
SIGMA_CU = 1.0 / 1.7241e-8                   # annealed copper, IACS (from memory, CHECK_VALUES)
ETA0 = np.sqrt(mu_0 / epsilon_0)
BETA0 = 2 * np.pi * F / C0                   # VF = 1
QUARTER = np.pi / 2 / BETA0                  # 5.27804 m


def awg_diameter(n):
    """ASTM B258 gauge law d = 0.127 mm x 92^((36 - n)/39), m (CHECK_VALUES §2c)."""
    return 0.127e-3 * 92.0 ** ((36 - n) / 39)


def line_450(alpha=0.0):
    """450 ohm line, VF 1, with exactly alpha Np/m at 14.2 MHz (CHECK_VALUES §1b set-up)."""
    return Line.nominal(450.0, 1.0, ((F, alpha * DB_PER_NEPER),) if alpha else ())


def skrf_zin(z0, gamma, length, z_load, f=F):
    """Input impedance from scikit-rf 2.2 DefinedGammaZ0 (calls as in CHECK_VALUES §1b)."""
    freq = skrf.Frequency(f / 1e6, f / 1e6, 1, unit="MHz")
    med = DefinedGammaZ0(frequency=freq, z0=z0, gamma=gamma)
    if z_load == 0:
        term = med.short()
    elif np.isinf(z_load):
        term = med.open()
    else:
        # let scikit-rf define the load's reflection in its own wave convention for complex z0
        term = med.load(skrf.network.z2s(np.array([[[z_load]]]), z0=z0)[0, 0, 0])
    return (med.line(length, unit="m") ** term).z[0, 0, 0]


# --- scikit-rf reproduces input_impedance (rel 1e-6) -------------------------------------------

# the lossless exact quarter wave into a short or open is left out: both sides give a numerical
# infinity (~1e13 to 1e18 ohm) or zero there (CHECK_VALUES §1b)
SKRF_CASES = [(length, z_load, alpha)
              for length in (0.7, 2.63902, 5.2, 5.27804, 7.9, 12.3)
              for z_load in (0.0, np.inf, 2500.0, 2500 + 300j, 30 - 80j)
              for alpha in (0.0, 1e-3, 2e-2)
              if not (alpha == 0.0 and length == 5.27804 and z_load in (0.0, np.inf))]


@pytest.mark.parametrize("length, z_load, alpha", SKRF_CASES)
def test_input_impedance_matches_scikit_rf_nominal(length, z_load, alpha):
    line = line_450(alpha)
    expected = skrf_zin(450.0, alpha + 1j * BETA0, length, z_load)
    assert input_impedance(line, F, length, z_load) == pytest.approx(expected, rel=1e-6)


@pytest.mark.parametrize("f", [3.6e6, 14.2e6, 146e6])
@pytest.mark.parametrize("length", [1.0, 5.2, 12.3])
@pytest.mark.parametrize("z_load", [0.0, np.inf, 2500 + 300j])
def test_input_impedance_matches_scikit_rf_two_wire(f, length, z_load):
    # complex z0 and gamma of a lossy geometric line (#14 at 1 in, window-line dielectric)
    line = Line.two_wire(25.4e-3, awg_diameter(14), SIGMA_CU, eps_eff=1.2, tan_delta=1e-3)
    expected = skrf_zin(line.z0(f), line.gamma(f), length, z_load, f)
    assert input_impedance(line, f, length, z_load) == pytest.approx(expected, rel=1e-6)


def test_input_impedance_vectorised_over_frequency():
    line = Line.two_wire(25.4e-3, awg_diameter(14), SIGMA_CU)
    f = np.linspace(13e6, 15e6, 7)
    z = input_impedance(line, f, 5.0, 2500.0)
    assert z.shape == f.shape
    assert z[3] == pytest.approx(input_impedance(line, f[3], 5.0, 2500.0), rel=1e-14)


# --- CHECK_VALUES §1b tables (scikit-rf [C]) -------------------------------------------------------

def printed(value, decimals):
    """pytest.approx allowing rel 1e-6 plus half a unit in the last printed decimal of a table value."""
    return pytest.approx(value, rel=1e-6, abs=0.5 * 10.0**-decimals)


@pytest.mark.parametrize("theta_deg, x_short, decimals", [
    (30, 259.808, 3), (45, 450.000, 3), (60, 779.423, 3), (80, 2552.08, 2), (89, 25780.5, 1),
    (120, -779.423, 3), (135, -450.000, 3),
])
def test_lossless_shorted_stub_table(theta_deg, x_short, decimals):
    z = shorted_stub(line_450(), F, np.deg2rad(theta_deg) / BETA0)
    assert z.imag == printed(x_short, decimals)
    assert abs(z.real) < 1e-6 * abs(x_short)


@pytest.mark.parametrize("theta_deg, x_open, decimals", [
    (30, -779.423, 3), (45, -450.000, 3), (60, -259.808, 3), (80, -79.3471, 4), (89, -7.85478, 5)])
def test_lossless_open_stub_table(theta_deg, x_open, decimals):
    z = open_stub(line_450(), F, np.deg2rad(theta_deg) / BETA0)
    assert z.imag == printed(x_open, decimals)


@pytest.mark.parametrize("stub, theta_deg, alpha, expected", [
    ("short", 45, 1e-3, 2.375 + 449.994j),
    ("short", 90, 1e-3, 85259.77),
    ("open", 90, 1e-3, 2.37509),
    # CHECK_VALUES prints 4.7502 here; the exact Z0 tanh(alpha l) and scikit-rf both give 4.75006
    ("short", 180, 1e-3, 4.75006),
    ("open", 180, 1e-3, 42631.07),
    ("short", 90, 4.64e-4, 183748.2),
])
def test_lossy_stub_table(stub, theta_deg, alpha, expected):
    length = np.deg2rad(theta_deg) / BETA0
    fn = shorted_stub if stub == "short" else open_stub
    z = fn(line_450(alpha), F, length)
    # the table's 45 deg row is printed to 4 significant digits in R
    assert z == pytest.approx(expected, rel=1e-5 if theta_deg != 45 else 2e-4)


def test_lossy_quarter_wave_textbook_approximations():
    # Z0 coth(alpha l) ~ Z0/(alpha l) shorted, Z0 alpha l open (textbook, CHECK_VALUES §1b)
    alpha = 1e-3
    assert shorted_stub(line_450(alpha), F, QUARTER).real == pytest.approx(
        450 / np.tanh(alpha * QUARTER), rel=1e-9)
    assert open_stub(line_450(alpha), F, QUARTER).real == pytest.approx(
        450 * np.tanh(alpha * QUARTER), rel=1e-9)


@pytest.mark.parametrize("z_load, expected", [(2500.0, 81.0), (3000.0, 67.5), (5000.0, 40.5)])
def test_lossless_quarter_wave_inverts(z_load, expected):
    # Z_in = Z0^2/Z_L on a lossless quarter wave (textbook; CHECK_VALUES §1b table rows)
    assert input_impedance(line_450(), F, QUARTER, z_load) == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize("vf, quarter", [(1.00, 5.2780), (0.95, 5.0141), (0.91, 4.8030),
                                         (0.82, 4.3280), (0.66, 3.4835)])
def test_quarter_wave_length_scales_with_vf(vf, quarter):
    # CHECK_VALUES §1b physical quarter wave VF c/(4f); the stub is 90 deg there (open -> ~0 ohm)
    line = Line.nominal(450.0, vf)
    beta = line.gamma(F).imag
    assert np.pi / 2 / beta == pytest.approx(quarter, abs=6e-5)
    assert line.velocity_factor(F) == pytest.approx(vf, rel=1e-12)


# --- tap on a resonant shorted stub (CHECK_VALUES §1b, derived identity) ---------------------------

@pytest.mark.parametrize("z0", [450.0, 600.0])
@pytest.mark.parametrize("r_end", [2500.0, 3000.0, 5000.0])
def test_tap_identity(z0, r_end):
    line = Line.nominal(z0, 0.91)
    beta = line.gamma(F).imag
    quarter = np.pi / 2 / beta
    theta = np.arcsin(np.sqrt(50.0 / r_end))          # the rule-of-thumb tap (common practice)
    tap = theta / beta
    y = 1 / shorted_stub(line, F, tap) + 1 / input_impedance(line, F, quarter - tap, r_end)
    expected = r_end * np.sin(theta) ** 2 + 1j * z0 * np.sin(theta) * np.cos(theta)
    assert 1 / y == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize("z0, r_end, x_tap, tap_m", [
    (450.0, 2500.0, 63.000, 0.4339), (450.0, 3000.0, 57.609, 0.3959), (450.0, 5000.0, 44.774, 0.3063),
    (600.0, 2500.0, 84.000, 0.4339), (600.0, 3000.0, 76.811, 0.3959), (600.0, 5000.0, 59.699, 0.3063),
])
def test_tap_table(z0, r_end, x_tap, tap_m):
    line = Line.nominal(z0, 0.91)
    beta = line.gamma(F).imag
    tap = np.arcsin(np.sqrt(50.0 / r_end)) / beta
    y = 1 / shorted_stub(line, F, tap) + 1 / input_impedance(line, F, np.pi / 2 / beta - tap, r_end)
    assert tap == pytest.approx(tap_m, abs=6e-5)
    assert 1 / y == pytest.approx(50.0 + 1j * x_tap, rel=1e-5)


# --- two-wire geometry (CHECK_VALUES §1a, §2d) -----------------------------------------------------

@pytest.mark.parametrize("spacing, d, z0_120, z0_eta", [
    (25.4e-3, awg_diameter(14), 412.76, 412.48),
    (152.4e-3, awg_diameter(12), 600.07, 599.65),
    (50e-3, 15.9e-3, 217.51, 217.36),
    (152.4e-3, awg_diameter(14), 627.89, 627.46),
    (50.8e-3, awg_diameter(12), 468.19, 467.86),
])
def test_two_wire_characteristic_impedance(spacing, d, z0_120, z0_eta):
    line = Line.two_wire(spacing, d, SIGMA_CU)
    # the code uses eta0/pi (119.917); the handbook column uses 120: the ratio is eta0/(120 pi)
    assert line.z0_lossless == pytest.approx(z0_eta, rel=1e-4)
    assert line.z0_lossless == pytest.approx(z0_120 * ETA0 / (120 * np.pi), rel=1e-4)
    assert line.z0_lossless == pytest.approx(ETA0 / np.pi * np.arccosh(spacing / d), rel=1e-12)


def test_two_wire_dielectric_scales_z0_and_vf():
    # z0 = (eta0/pi)/sqrt(eps_eff) acosh(D/d), vf = 1/sqrt(eps_eff) (Ramo-Whinnery-Van Duzer)
    air = Line.two_wire(25.4e-3, awg_diameter(14), SIGMA_CU)
    filled = Line.two_wire(25.4e-3, awg_diameter(14), SIGMA_CU, eps_eff=1.21)
    assert filled.z0_lossless == pytest.approx(air.z0_lossless / 1.1, rel=1e-12)
    # at 10 GHz the conductors' internal reactance is ~0.006 % of omega L
    assert filled.velocity_factor(10e9) == pytest.approx(1 / 1.1, rel=1e-4)


def test_two_wire_lossy_z0_approaches_lossless_at_high_frequency():
    # internal inductance and R raise |z0| by ~R/(2 omega L), falling as 1/sqrt(f) (skin effect)
    line = Line.two_wire(25.4e-3, awg_diameter(14), SIGMA_CU)
    dev = np.abs(line.z0(np.array([1.4e6, 14e6, 140e6])) / line.z0_lossless - 1)
    assert dev[0] > dev[1] > dev[2] > 0
    assert dev[0] / dev[1] == pytest.approx(np.sqrt(10), rel=0.05)
    assert dev[1] < 3e-3


@pytest.mark.parametrize("spacing, d, re_z_int_one_wire, prox, z0_eta", [
    # R from CHECK_VALUES §2b exact Bessel column, proximity from §2d, z0 from §1a (eta0/pi)
    (25.4e-3, awg_diameter(14), 0.19298, 1.00206, 412.48),
    (152.4e-3, awg_diameter(12), 0.15270, 1.00009, 599.65),
])
def test_two_wire_conductor_attenuation(spacing, d, re_z_int_one_wire, prox, z0_eta):
    # alpha_c = R/(2 z0), R = loop resistance of both wires (CHECK_VALUES §2d). The model's |z0| is
    # 0.16 % (#14) / 0.09 % (#12) above sqrt(L/C) at 14 MHz because it includes the wires' internal
    # inductance, hence rel 2e-3 rather than 1e-3.
    line = Line.two_wire(spacing, d, SIGMA_CU)
    r_loop = 2 * prox * re_z_int_one_wire
    assert line.z_int(14.0e6).real == pytest.approx(r_loop, rel=1e-4)
    assert line.gamma(14.0e6).real == pytest.approx(r_loop / (2 * z0_eta), rel=2e-3)


def test_two_wire_attenuation_pipe_includes_proximity():
    # CHECK_VALUES §2d: 15.9 mm pipe at 50 mm, 9.477e-5 Np/m with proximity (6 % lower without);
    # exact Bessel R adds R_dc/4 (+0.11 %), eta0/pi vs 120 (+0.07 %).
    line = Line.two_wire(50e-3, 15.9e-3, SIGMA_CU)
    assert line.gamma(14.0e6).real == pytest.approx(9.477e-5, rel=2e-3)


def test_two_wire_dielectric_loss():
    # G = omega C tan_delta adds alpha_d = G z0/2 (low-loss textbook form)
    dry = Line.two_wire(25.4e-3, awg_diameter(14), SIGMA_CU, eps_eff=1.2)
    wet = Line.two_wire(25.4e-3, awg_diameter(14), SIGMA_CU, eps_eff=1.2, tan_delta=0.01)
    alpha_d = wet.gamma(F).real - dry.gamma(F).real
    beta = dry.gamma(F).imag
    assert alpha_d == pytest.approx(beta * 0.01 / 2, rel=2e-3)


@pytest.mark.parametrize("kwargs", [
    dict(spacing=1e-3, diameter=2e-3, sigma=SIGMA_CU),
    dict(spacing=0.02, diameter=0.0, sigma=SIGMA_CU),
    dict(spacing=0.02, diameter=2e-3, sigma=0.0),
    dict(spacing=0.02, diameter=2e-3, sigma=SIGMA_CU, eps_eff=0.5),
    dict(spacing=0.02, diameter=2e-3, sigma=SIGMA_CU, tan_delta=-0.1),
])
def test_two_wire_rejects_impossible_geometry(kwargs):
    with pytest.raises(ModelError):
        Line.two_wire(**kwargs)


# --- nominal (datasheet) lines ----------------------------------------------------------------------

def test_nominal_reproduces_datasheet_points_and_real_z0():
    # RG-58 handbook points 2.47 dB/100 ft at 30 MHz, 5.63 at 150 MHz; fit interpolates 1.68 at 14 MHz
    # (CHECK_VALUES §6c, ±0.01 printed); z0 stays exactly real (distortionless R/L = G/C).
    per_100ft = 30.48
    line = Line.nominal(50.0, 0.66, ((30e6, 2.47 / per_100ft), (150e6, 5.63 / per_100ft)))
    f = np.array([14e6, 30e6, 150e6])
    loss = line.gamma(f).real * DB_PER_NEPER * per_100ft
    assert loss[1:] == pytest.approx([2.47, 5.63], rel=1e-9)
    assert loss[0] == pytest.approx(1.68, abs=0.006)
    assert np.all(line.z0(f) == pytest.approx(50.0, rel=1e-12))
    assert np.all(np.abs(line.z0(f).imag) < 1e-9)
    assert line.velocity_factor(f) == pytest.approx(0.66, rel=1e-12)


def test_nominal_single_point_uses_sqrt_law():
    line = Line.nominal(75.0, 0.8, ((10e6, 0.02),))
    alpha = line.gamma(np.array([10e6, 40e6])).real * DB_PER_NEPER
    assert alpha == pytest.approx([0.02, 0.04], rel=1e-12)


def test_nominal_fit_never_gives_negative_loss():
    # inconsistent points (loss falling with f) must not produce a negative k2 (non-negative fit)
    line = Line.nominal(50.0, 0.66, ((10e6, 0.05), (100e6, 0.04), (400e6, 0.03)))
    assert np.all(line.gamma(np.geomspace(1e6, 3e9, 20)).real >= 0)


@pytest.mark.parametrize("args", [(0.0, 0.66), (50.0, 0.0), (50.0, 1.2),
                                  (50.0, 0.66, ((-1e6, 0.1),)), (50.0, 0.66, ((1e6, -0.1),)),
                                  (50.0, 0.66, ((1e6, 0.1),), "cubic"), (50.0, 0.66, ((1e6, 0.1, 3.0),))])
def test_nominal_rejects_bad_figures(args):
    with pytest.raises(ModelError):
        Line.nominal(*args)


# --- identities ---------------------------------------------------------------------------------------

LINES = [Line.two_wire(25.4e-3, awg_diameter(14), SIGMA_CU, eps_eff=1.1, tan_delta=5e-4),
         Line.nominal(50.0, 0.66, ((30e6, 0.08), (150e6, 0.18)))]


@pytest.mark.parametrize("line", LINES)
def test_abcd_reciprocity(line):
    f = np.linspace(1e6, 450e6, 11)
    a, b, c, d = abcd(line, f, 7.3)
    assert np.allclose(a * d - b * c, 1.0, rtol=0, atol=1e-12)


@pytest.mark.parametrize("line", LINES)
@pytest.mark.parametrize("z_load", [0.0, 37 - 12j, 2500.0])
def test_zero_length_returns_load(line, z_load):
    assert input_impedance(line, F, 0.0, z_load) == pytest.approx(z_load, rel=1e-12, abs=1e-12)


def test_zero_length_open_stays_open():
    assert np.isinf(open_stub(LINES[0], F, 0.0))


@pytest.mark.parametrize("line", LINES)
def test_cascaded_halves_equal_whole(line):
    f, length, z_load = np.array([3.5e6, 14.2e6, 146e6]), 9.1, 1800 - 400j
    a1, b1, c1, d1 = abcd(line, f, length / 2)
    a, b, c, d = abcd(line, f, length)
    assert a1 * a1 + b1 * c1 == pytest.approx(a, rel=1e-12)
    assert a1 * b1 + b1 * d1 == pytest.approx(b, rel=1e-12)
    half = input_impedance(line, f, length / 2, z_load)
    assert input_impedance(line, f, length / 2, half) == pytest.approx(
        input_impedance(line, f, length, z_load), rel=1e-10)


@pytest.mark.parametrize("line", LINES)
def test_voltage_current_along_agrees_with_input_impedance(line):
    z_load = 2500.0 + 200j
    i_load = 0.2
    positions = np.linspace(0.0, 6.0, 13)
    v, i = voltage_current_along(line, F, positions, z_load * i_load, i_load)
    assert v / i == pytest.approx(input_impedance(line, F, positions, z_load), rel=1e-10)
    assert v[0] == pytest.approx(z_load * i_load)


def test_power_decreases_towards_load_on_lossy_line():
    # conservation: power entering each section >= power leaving it (passive line)
    line = LINES[0]
    positions = np.linspace(0.0, 20.0, 41)
    v, i = voltage_current_along(line, F, positions, 500.0, 0.2)
    p = 0.5 * np.real(v * np.conj(i))
    assert np.all(np.diff(p) > 0)


# --- reflection and SWR (CHECK_VALUES §1c, scikit-rf s_vswr [C]) ----------------------------------------

@pytest.mark.parametrize("z, rho, vswr", [
    (100, 1 / 3, 2.0), (25, -1 / 3, 2.0), (75, 0.2, 1.5), (150, 0.5, 3.0),
    (50 + 50j, 0.2 + 0.4j, 2.6180), (50 - 50j, 0.2 - 0.4j, 2.6180),
    (2500, 0.96078, 50.0), (5000, 0.98020, 100.0),
])
def test_reflection_and_swr_table(z, rho, vswr):
    assert reflection(z) == pytest.approx(rho, rel=1e-4)
    assert swr(z) == pytest.approx(vswr, rel=1e-4)


def test_swr_against_scikit_rf():
    z = np.array([10 + 0j, 50, 73 + 42.5j, 300 - 900j])
    freq = skrf.Frequency(14.2, 14.2, 1, unit="MHz")
    for zi in z:
        net = skrf.Network(frequency=freq, s=np.array([[[reflection(zi)]]]), z0=50)
        assert swr(zi) == pytest.approx(net.s_vswr[0, 0, 0], rel=1e-9)


def test_swr_edge_cases():
    assert reflection(np.inf) == 1.0
    assert swr(np.inf) == np.inf
    assert swr(0.0) == np.inf
    assert swr(-50.0) == np.inf          # z = -z_ref: denominator zero, no NaN
    assert swr(-10 + 5j) == np.inf       # negative resistance: |rho| > 1
    assert swr(50.0) == pytest.approx(1.0)
    assert swr(100.0, z_ref=450.0) == pytest.approx(4.5)


@given(st.complex_numbers(allow_nan=False, allow_infinity=False, max_magnitude=1e12))
def test_swr_never_nan_for_finite_z(z):
    s = swr(z)
    assert not np.isnan(s)
    assert s >= 1.0


def test_two_column_nnls_as_scipy_nnls():
    """lines._nnls_two_columns (the loss law's sqrt(f) + f fit) against scipy.optimize.nnls (the
    reference library, Lawson & Hanson's active-set method) on random problems, both signs of data."""
    from scipy.optimize import nnls

    from buildsheet.physics.lines import _nnls_two_columns

    rng = np.random.default_rng(14)
    for _ in range(500):
        n = int(rng.integers(2, 8))
        f = np.sort(rng.uniform(0.01, 1.0, n))
        a = np.column_stack([np.sqrt(f), f])
        b = rng.normal(size=n) * rng.choice([0.01, 1.0, 100.0])
        ours = np.array(_nnls_two_columns(a, b))
        ref, _ = nnls(a, b)
        assert np.all(ours >= 0)
        # same minimum; the same point where the minimum is unique (a has full rank here)
        floor = n * (1e-14 * np.max(np.abs(b))) ** 2     # rounding level of a residual
        assert np.sum((a @ ours - b) ** 2) <= np.sum((a @ ref - b) ** 2) * (1 + 1e-12) + floor
        np.testing.assert_allclose(ours, ref, rtol=1e-9, atol=1e-12 * np.max(np.abs(b)))
