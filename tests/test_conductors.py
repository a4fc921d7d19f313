"""Tests of physics/conductors.py against published formulas and the values in CHECK_VALUES §2."""

import numpy as np
import pytest
from scipy.constants import mu_0

from buildsheet.physics import ModelError
from buildsheet.physics.conductors import (dc_resistance, proximity_factor, skin_depth,
                                           surface_resistance, wire_internal_impedance)

# Annealed copper, IACS 100 % (1/1.7241e-8 S/m): value from memory, CHECK_VALUES constants table.
SIGMA_CU = 1.0 / 1.7241e-8


def awg_diameter(n):
    """ASTM B258 gauge law d = 0.127 mm x 92^((36 - n)/39), m (CHECK_VALUES §2c)."""
    return 0.127e-3 * 92.0 ** ((36 - n) / 39)


# CHECK_VALUES §2a [C] (formula delta = 1/sqrt(pi f mu0 sigma), Rs = 1/(sigma delta), Ramo-Whinnery-
# Van Duzer); rel 1e-3 absorbs the 5.80e7 vs 5.8001e7 choice of sigma.
@pytest.mark.parametrize("f, delta, rs", [
    (14.0e6, 17.662e-6, 9.7617e-4),
    (14.2e6, 17.537e-6, 9.8312e-4),
    (146e6, 5.4692e-6, 3.1524e-3),
])
def test_skin_depth_and_surface_resistance(f, delta, rs):
    assert skin_depth(f, SIGMA_CU) == pytest.approx(delta, rel=1e-3)
    assert surface_resistance(f, SIGMA_CU) == pytest.approx(rs, rel=1e-3)


def test_skin_depth_copper_60_hz_published_table():
    # 8.5 mm at 60 Hz for copper, stored public skin-depth table quoted in CHECK_VALUES §2a.
    assert skin_depth(60.0, SIGMA_CU) == pytest.approx(8.5e-3, abs=0.05e-3)


def test_skin_depth_scales_with_permeability_and_is_vectorised():
    f = np.array([1e6, 4e6, 16e6])
    delta = skin_depth(f, SIGMA_CU, mu_r=4.0)
    # delta ~ 1/sqrt(f mu): quadrupling f or mu halves it (definition, Ramo-Whinnery-Van Duzer).
    assert delta[1] / delta[0] == pytest.approx(0.5, rel=1e-12)
    assert delta[0] == pytest.approx(skin_depth(1e6, SIGMA_CU) / 2.0, rel=1e-12)
    assert surface_resistance(f, SIGMA_CU) * skin_depth(f, SIGMA_CU) * SIGMA_CU == pytest.approx(1.0)


# CHECK_VALUES §2b [C]: Rs/(pi d), exact Bessel Re Z_int (scipy.special.jv at complex argument) and R_dc.
@pytest.mark.parametrize("gauge, f, rs_over_pi_d, re_exact", [
    (14, 14.0e6, 0.19089, 0.19298),
    (14, 14.2e6, 0.19225, 0.19434),
    (14, 146e6, 0.61646, 0.61854),
    (12, 14.0e6, 0.15139, 0.15270),
    (10, 14.0e6, 0.12005, 0.12088),
    (18, 14.0e6, 0.30353, 0.30884),
])
def test_wire_resistance_per_metre(gauge, f, rs_over_pi_d, re_exact):
    d = awg_diameter(gauge)
    z = wire_internal_impedance(f, d, SIGMA_CU)
    assert surface_resistance(f, SIGMA_CU) / (np.pi * d) == pytest.approx(rs_over_pi_d, rel=1e-4)
    assert z.real == pytest.approx(re_exact, rel=1e-4)
    # the thick-wire approximation Rs/(pi d) + R_dc/4 (CHECK_VALUES §2b, rel 2e-3)
    assert z.real == pytest.approx(rs_over_pi_d + dc_resistance(d, SIGMA_CU) / 4, rel=2e-3)


@pytest.mark.parametrize("gauge, r_dc", [(14, 8.285e-3), (12, 5.211e-3), (10, 3.277e-3),
                                         (18, 2.095e-2)])
def test_dc_resistance(gauge, r_dc):
    # CHECK_VALUES §2b R_dc = 1/(sigma pi a^2); #14 agrees with the usual 2.525 ohm/1000 ft table value.
    assert dc_resistance(awg_diameter(gauge), SIGMA_CU) == pytest.approx(r_dc, rel=1e-3)


def test_internal_impedance_low_frequency_limit():
    # a << delta: Z_int -> R_dc + j omega mu0/(8 pi), the DC internal inductance of a round wire
    # (Ramo-Whinnery-Van Duzer, internal impedance of a round wire).
    d, f = awg_diameter(14), 10.0
    z = wire_internal_impedance(f, d, SIGMA_CU)
    assert z.real == pytest.approx(dc_resistance(d, SIGMA_CU), rel=1e-6)
    assert z.imag == pytest.approx(2 * np.pi * f * mu_0 / (8 * np.pi), rel=1e-4)


@pytest.mark.parametrize("f", [1e9, 1e12, 1e15])
def test_internal_impedance_high_frequency_limit(f):
    # a >> delta: Z_int -> (1 + j) Rs/(pi d) + R_dc/4 (CHECK_VALUES §2b); no overflow at huge ka.
    d = awg_diameter(14)
    z = wire_internal_impedance(f, d, SIGMA_CU)
    rs_term = surface_resistance(f, SIGMA_CU) / (np.pi * d)
    assert np.isfinite(z)
    assert z.real == pytest.approx(rs_term + dc_resistance(d, SIGMA_CU) / 4, rel=1e-5)
    assert z.imag == pytest.approx(rs_term, rel=1e-5)


def test_internal_impedance_continuous_across_asymptotic_switch():
    # The exact and asymptotic branches must meet: |ka| = a sqrt(2)/delta crosses 1e6 near this f.
    d = 0.05
    delta_switch = d / 2 * np.sqrt(2) / 1e6
    f_switch = 1 / (np.pi * mu_0 * SIGMA_CU * delta_switch**2)
    z = wire_internal_impedance(np.array([f_switch * 0.999, f_switch * 1.001]), d, SIGMA_CU)
    expected_ratio = np.sqrt(1.001 / 0.999)   # both parts scale as sqrt(f) up to ~1e-6 here
    assert z[1].real / z[0].real == pytest.approx(expected_ratio, rel=1e-8)


@pytest.mark.parametrize("a_over_delta", [19.7, 20.0, 25.0, 60.0, 400.0, 3e3, 1e5])
def test_bessel_ratio_from_the_asymptotic_series_matches_scipy(a_over_delta):
    """Where the wire impedance uses Hankel's asymptotic series for J0/J1 (|ka| >= 28, a/delta about
    20 and up), it agrees with scipy.special's Bessel functions (an outside reference) to 1e-13;
    just below, scipy's own value is used."""
    from scipy.constants import mu_0
    from scipy.special import jve
    from buildsheet.physics import conductors
    delta = 1e-5
    d = 2 * a_over_delta * delta
    sigma = 1.0 / (np.pi * 1e7 * mu_0 * delta ** 2)     # the sigma giving that delta at 10 MHz
    ka = (1 - 1j) * a_over_delta
    exact = (1 - 1j) / delta / (2 * np.pi * d / 2 * sigma) * (jve(0, ka) / jve(1, ka))
    for z in (wire_internal_impedance(1e7, d, sigma), wire_internal_impedance(np.array([1e7]), d, sigma)[0]):
        assert complex(z) == pytest.approx(complex(exact), rel=1e-13)
    assert (abs(ka) >= conductors._KA_ASYMPTOTIC) == (a_over_delta >= 28 / np.sqrt(2))


def test_internal_impedance_broadcasts():
    f = np.array([[1e6], [1e7]])
    d = np.array([1e-3, 2e-3, 4e-3])
    z = wire_internal_impedance(f, d, SIGMA_CU)
    assert z.shape == (2, 3)
    # the scalar path (Python complex arithmetic) agrees with the array path to rounding
    assert z[1, 2] == pytest.approx(wire_internal_impedance(1e7, 4e-3, SIGMA_CU), rel=1e-14)


# CHECK_VALUES §2d proximity factor (Ramo-Whinnery-Van Duzer form, from memory there).
@pytest.mark.parametrize("spacing, d, factor", [
    (25.4e-3, awg_diameter(14), 1.00206),
    (152.4e-3, awg_diameter(12), 1.00009),
    (50e-3, 15.9e-3, 1.0548),
])
def test_proximity_factor(spacing, d, factor):
    assert proximity_factor(spacing, d) == pytest.approx(factor, rel=1e-4)   # table: 5-6 digits


def test_proximity_factor_rejects_touching_wires():
    with pytest.raises(ModelError, match="spacing must exceed"):
        proximity_factor(2e-3, 2e-3)
