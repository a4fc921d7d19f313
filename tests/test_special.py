"""physics/special.py (Si/Ci, J1/J0, K/E without scipy at run time) against scipy.special (a reference
library: cephes sici, AMOS jve, cephes ellpk/ellpe) across the ranges the model uses, and against
published table values (Abramowitz & Stegun, Handbook of Mathematical Functions, tables 5.1, 9.1,
17.1: the digits here are from memory, and agree with scipy to the digits given)."""

from __future__ import annotations

import math

import numpy as np
import pytest
import scipy.special as sp
from hypothesis import given, settings
from hypothesis import strategies as st

from buildsheet.physics import special

# --- Si, Ci -------------------------------------------------------------------------------------

# the arguments the model gives sici: kl and 2kl near pi (dipole arms), 2(ka)^2/kl down to 1e-14
# (thin wires at low frequency), the induced-EMF integrands' k(r +- z) from ~1e-6 to a few thousand
X_RANGE = np.concatenate([np.geomspace(1e-14, 4.0, 3000), np.geomspace(4.0, 5e3, 3000)])


def test_sici_against_scipy_across_the_range():
    si, ci = special.sici(X_RANGE)
    si_ref, ci_ref = sp.sici(X_RANGE)
    # Si > 0 for x > 0: relative; Ci has zeros (0.6165, 3.384, 6.427 ...): absolute below 1 in size
    assert np.max(np.abs(si - si_ref) / si_ref) < 1e-15
    assert np.max(np.abs(ci - ci_ref) / np.maximum(np.abs(ci_ref), 1.0)) < 2e-15


@settings(max_examples=300, deadline=None)
@given(st.floats(min_value=1e-12, max_value=1e4, allow_nan=False))
def test_sici_scalar_path_matches_scipy(x):
    si, ci = special.sici(x)
    assert isinstance(si, float) and isinstance(ci, float)
    si_ref, ci_ref = (float(v) for v in sp.sici(x))
    assert abs(si - si_ref) <= 1e-15 * abs(si_ref)
    assert abs(ci - ci_ref) <= 2e-15 * max(abs(ci_ref), 1.0)


def test_sici_scalar_and_array_paths_agree():
    x = np.geomspace(1e-6, 1e3, 257)
    si, ci = special.sici(x)
    pairs = [special.sici(float(v)) for v in x]
    assert np.allclose(si, [p[0] for p in pairs], rtol=1e-15, atol=0)
    assert np.allclose(ci, [p[1] for p in pairs], rtol=0, atol=1e-15)


def test_sici_published_values():
    # A&S table 5.1 (from memory): Si(1) = 0.946083070367, Ci(1) = 0.337403922901;
    # Si(pi) = 1.851937051982 (the Wilbraham-Gibbs integral, from memory)
    si, ci = special.sici(1.0)
    assert si == pytest.approx(0.946083070367, abs=1e-12)
    assert ci == pytest.approx(0.337403922901, abs=1e-12)
    assert special.sici(math.pi)[0] == pytest.approx(1.851937051982, abs=1e-12)
    # the large-x limits (A&S 5.2.8, 5.2.9): Si -> pi/2 - cos x / x, Ci -> sin x / x
    x = 1e4
    si, ci = special.sici(x)
    assert si == pytest.approx(math.pi / 2 - math.cos(x) / x, abs=1e-8)
    assert ci == pytest.approx(math.sin(x) / x, abs=1e-8)


def test_sici_edges_as_scipy():
    x = np.array([0.0, -2.5, 7.0, np.nan])
    si, ci = special.sici(x)
    si_ref, ci_ref = sp.sici(x)
    assert si[0] == 0.0 and ci[0] == -np.inf
    assert si[1] == pytest.approx(float(si_ref[1]), rel=1e-15)
    assert np.isnan(ci[1])          # Ci of x < 0 is complex (scipy's real sici gives Ci(|x|))
    assert si[2] == pytest.approx(float(si_ref[2]), rel=1e-15)
    assert np.isnan(si[3]) and np.isnan(ci[3])


# --- J1/J0 --------------------------------------------------------------------------------------

def _ratio_ref(z):
    return sp.jve(1, z) / sp.jve(0, z)


def test_bessel_ratio_on_the_skin_effect_argument():
    # wire_internal_impedance uses it for ka = (1 - j) a/delta, |ka| below 28 (a/delta < 19.8)
    t = np.geomspace(1e-4, 19.8, 4000)
    z = (1 - 1j) * t
    ratio = special.j1_over_j0(z)
    assert np.max(np.abs(ratio - _ratio_ref(z)) / np.abs(_ratio_ref(z))) < 1e-14


@settings(max_examples=300, deadline=None)
@given(st.floats(min_value=1e-4, max_value=19.8), st.floats(min_value=-3.0, max_value=3.0))
def test_bessel_ratio_scalar_off_the_diagonal(t, phase):
    # a complex argument of the right half-plane near the skin-effect diagonal (any conductor
    # permeability or a lossy dielectric would move it): |arg z| up to 3 rad from -pi/4
    z = complex(t * math.cos(-math.pi / 4 + phase / 4), t * math.sin(-math.pi / 4 + phase / 4))
    ref = complex(_ratio_ref(z))
    if abs(sp.jve(0, z)) < 1e-3 * abs(sp.jve(1, z)):
        return          # next to a zero of J0 (real axis): the ratio itself is ill-conditioned
    assert abs(special.j1_over_j0(z) - ref) <= 1e-13 * abs(ref)


def test_bessel_ratio_published_values():
    # A&S table 9.1 (from memory): J0(1) = 0.765197686558, J1(1) = 0.440050585745;
    # J0(2) = 0.223890779141, J1(2) = 0.576724807757
    assert special.j1_over_j0(1.0 + 0j) == pytest.approx(0.440050585745 / 0.765197686558, rel=1e-11)
    assert special.j1_over_j0(2.0 + 0j) == pytest.approx(0.576724807757 / 0.223890779141, rel=1e-11)
    # small z: J1/J0 -> z/2 (A&S 9.1.10)
    assert special.j1_over_j0(1e-6 * (1 - 1j)) == pytest.approx(0.5e-6 * (1 - 1j), rel=1e-12)


# --- K, E ---------------------------------------------------------------------------------------

M_RANGE = np.concatenate([np.linspace(0.0, 0.999, 4000), 1.0 - np.geomspace(1e-3, 1e-12, 200)])


def test_elliptic_against_scipy():
    k, e = special.ellipke(M_RANGE)
    assert np.max(np.abs(k - sp.ellipk(M_RANGE)) / sp.ellipk(M_RANGE)) < 2e-15
    # E = K (1 - sum ...) loses about log10(K) digits as m -> 1 (K grows like ln(4/sqrt(1 - m)))
    assert np.max(np.abs(e - sp.ellipe(M_RANGE)) / sp.ellipe(M_RANGE)) < 1e-14


@settings(max_examples=300, deadline=None)
@given(st.floats(min_value=0.0, max_value=0.9999))
def test_elliptic_scalar_matches_scipy(m):
    k, e = special.ellipke(m)
    assert k == pytest.approx(float(sp.ellipk(m)), rel=2e-15)
    assert e == pytest.approx(float(sp.ellipe(m)), rel=1e-14)


def test_elliptic_published_values():
    # A&S table 17.1 (from memory): K(m = 0.5) = 1.854074677301, E(m = 0.5) = 1.350643881048;
    # K(0) = E(0) = pi/2 (A&S 17.3.11, 17.3.12)
    k, e = special.ellipke(0.5)
    assert k == pytest.approx(1.854074677301, abs=1e-12)
    assert e == pytest.approx(1.350643881048, abs=1e-12)
    assert special.ellipke(0.0)[0] == special.ellipke(0.0)[1] == pytest.approx(math.pi / 2, rel=1e-16)


def test_elliptic_refuses_outside_zero_to_one():
    for m in (-0.1, 1.0, 1.5):
        with pytest.raises(ValueError):
            special.ellipke(m)


@settings(max_examples=200, deadline=None)
@given(st.lists(st.floats(-1e9, 1e9), max_size=40), st.lists(st.floats(-1e9, 1e9), max_size=5))
def test_union1d_as_numpy(a, b):
    """physics.union1d (the sweep's grid with f0 added) against numpy.union1d."""
    from buildsheet.physics import union1d

    got, ref = union1d(a, b), np.union1d(np.array(a, dtype=float), np.array(b, dtype=float))
    assert got.dtype == ref.dtype and np.array_equal(got, ref)
