"""Special functions of the model, computed here with numpy and math so that a solve does not import
scipy.special (whose import alone loads numpy.f2py, numpy.testing, numpy.ma ... through its array-API
layer: about 0.15-0.25 s of a build's start-up). Owns numerics only: no physics, no I/O.

    sici(x)              Si(x), Ci(x) of real x > 0 (sine and cosine integrals)
    j1_over_j0(z)        J1(z)/J0(z) of a complex z (Bessel functions of the first kind)
    ellipke(m)           complete elliptic integrals (K, E) of parameter m = k^2, 0 <= m < 1

Each takes a Python float (or complex) and returns one, or takes an array and broadcasts. They are
checked against scipy.special on many points across the ranges the model uses and against values of
Abramowitz & Stegun's tables (tests/test_special.py).
"""

from __future__ import annotations

import math

import numpy as np

#: Euler's constant (Abramowitz & Stegun 6.1.3; the digits as numpy.euler_gamma gives them)
EULER_GAMMA = 0.5772156649015329

# Si/Ci: the power series below this x, the continued fraction of E1(ix) above it (Abramowitz &
# Stegun 5.2.14 for the series; 5.1.22 for the fraction, evaluated from its tail: _e1_cf).
# At x = 4 the series' largest term is 2.7 (Ci) against a result of order 0.1-1: about one digit
# lost to cancellation, and 17 terms reach 1e-19; the fraction needs at most 62 terms from x = 4 up.
_SICI_SERIES_MAX = 4.0
_SICI_TERMS = 18
_EPS = 2.0 ** -51     # J1/J0's fraction has converged when a step changes it by under 2 ulp
_TINY = 1e-300

# Series coefficients: Si(x) = sum_n (-1)^n x^(2n+1) / ((2n+1) (2n+1)!),
# Ci(x) = gamma + ln x + sum_{n>=1} (-1)^n x^(2n) / (2n (2n)!)  (A&S 5.2.14, 5.2.16)
_SI_COEF = [(-1) ** n / ((2 * n + 1) * math.factorial(2 * n + 1)) for n in range(_SICI_TERMS)]
_CI_COEF = [0.0] + [(-1) ** n / (2 * n * math.factorial(2 * n)) for n in range(1, _SICI_TERMS)]


def _horner(coef, t):
    s = coef[-1]
    for c in reversed(coef[:-1]):
        s = s * t + c
    return s


def _e1_terms(x_min: float) -> int:
    """Terms of the E1(ix) continued fraction that reach 1e-16 relative for every x >= x_min >= 4:
    about 200/x (found by evaluating it against 2000 terms from x = 2 to 200), with a margin."""
    return math.ceil(260.0 / x_min) + 6


def _e1_cf(z, x_min: float):
    """E1(z) e^z for z = ix, x >= x_min >= 4, by the continued fraction
    E1(z) = e^-z (1/(z+1-) 1/(z+3-) 4/(z+5-) 9/(z+7-) ...) (A&S 5.1.22, even form), evaluated from
    its tail backwards over _e1_terms(x_min) terms (a fixed count, so that an array is done in one
    pass). z: a Python complex or a complex array."""
    t = 0.0
    for i in range(_e1_terms(x_min), 0, -1):
        t = (i * i) / (z + (2 * i + 1) - t)
    return 1.0 / (z + 1.0 - t)


def _sici_scalar(x: float) -> tuple[float, float]:
    if not x > 0.0:
        return _sici_edge(x)
    if x <= _SICI_SERIES_MAX:
        t = x * x
        return x * _horner(_SI_COEF, t), EULER_GAMMA + math.log(x) + t * _horner(_CI_COEF[1:], t)
    if x == math.inf:
        return math.pi / 2, 0.0
    # -E1(ix) = Ci(x) - j (Si(x) - pi/2)  (A&S 5.2.23)
    e1 = _e1_cf(complex(0.0, x), x) * complex(math.cos(x), -math.sin(x))
    return math.pi / 2 + e1.imag, -e1.real


def _sici_edge(x: float) -> tuple[float, float]:
    """Si, Ci where x > 0 does not hold, as scipy.special.sici gives them: x = 0 gives (0, -inf),
    x < 0 (Ci complex) and NaN give NaN for Ci (Si is odd)."""
    if x == 0.0:
        return 0.0, -math.inf
    if x < 0.0:
        return -_sici_scalar(-x)[0], math.nan
    return math.nan, math.nan


def sici(x):
    """(Si(x), Ci(x)), the sine and cosine integrals of real x > 0 (A&S 5.2.1, 5.2.2): the power
    series (A&S 5.2.14, 5.2.16) up to x = 4, the continued fraction of E1(ix) (A&S 5.1.22, 5.2.23)
    above, to about 1e-15 relative (absolute near Ci's zeros). x: a float (gives floats) or an
    array (gives two arrays of its shape); x = 0, x < 0 and NaN as scipy.special.sici (_sici_edge)."""
    if isinstance(x, float):
        return _sici_scalar(x)
    x = np.asarray(x, dtype=float)
    if np.any(~(x > 0.0)):      # rare: element by element, as scipy gives them (_sici_edge)
        pairs = [_sici_scalar(float(v)) for v in x.ravel()]
        return (np.array([p[0] for p in pairs]).reshape(x.shape),
                np.array([p[1] for p in pairs]).reshape(x.shape))
    flat = x.ravel()
    si = np.empty_like(flat)
    ci = np.empty_like(flat)
    small = flat <= _SICI_SERIES_MAX
    if small.any():
        xs = flat[small]
        t = xs * xs
        si[small] = xs * _horner(_SI_COEF, t)
        ci[small] = EULER_GAMMA + np.log(xs) + t * _horner(_CI_COEF[1:], t)
    large = ~small
    if large.any():
        xl = flat[large]
        finite = np.isfinite(xl)
        xf = np.where(finite, xl, 1.0e3)
        e1 = _e1_cf(1j * xf, float(np.min(xf))) * (np.cos(xf) - 1j * np.sin(xf))
        si[large] = np.where(finite, np.pi / 2 + e1.imag, np.pi / 2)
        ci[large] = np.where(finite, -e1.real, 0.0)
    return si.reshape(x.shape), ci.reshape(x.shape)


def _ratio_cf(z):
    """J1(z)/J0(z) by the continued fraction of the Bessel recurrence,
    J1/J0 = 1/(2/z -) 1/(4/z -) 1/(6/z - ...) (A&S 9.1.73; the minimal solution of 9.1.27),
    modified Lentz; z a Python complex or a complex array, z != 0."""
    # f = a1/(b1 + a2/(b2 + ...)) with a1 = 1, a_n = -1 (n >= 2), b_n = 2n/z: after the first
    # term f_1 = D_1 = 1/b1 and C_1 is infinite (Lentz's start with b0 = 0)
    inv = 1.0 / z
    if isinstance(z, complex):
        d = 1.0 / (2.0 * inv)
        h = d
        c = 1.0 / _TINY
        for n in range(2, 10_000):
            b = 2.0 * n * inv
            d = 1.0 / (b - d)
            c = b - 1.0 / c
            delta = c * d
            h *= delta
            if abs(delta - 1.0) < _EPS:
                return h
        raise ArithmeticError(f"J1/J0 continued fraction did not converge at {z}")
    d = 1.0 / (2.0 * inv)
    h = d.copy()
    c = np.full_like(z, 1.0 / _TINY)
    for n in range(2, 10_000):
        b = 2.0 * n * inv
        d = 1.0 / (b - d)
        c = b - 1.0 / c
        delta = c * d
        h = h * delta
        if np.all(np.abs(delta - 1.0) < _EPS):
            return h
    raise ArithmeticError("J1/J0 continued fraction did not converge")


def j1_over_j0(z):
    """J1(z)/J0(z) of a complex z != 0 (the continued fraction of the recurrence, A&S 9.1.73),
    to about 1e-14 relative where J0(z) has no zero nearby (on the skin-effect argument
    z = (1 - j) a/delta it has none). z: a complex (gives a complex) or a complex array."""
    if isinstance(z, (complex, float)):
        return _ratio_cf(complex(z))
    z = np.asarray(z, dtype=complex)
    return _ratio_cf(z.ravel()).reshape(z.shape)


def _agm_k_e(m):
    """(K(m), E(m)) by the arithmetic-geometric mean (A&S 17.6.1-17.6.4):
    a0 = 1, b0 = sqrt(1 - m), c0 = sqrt(m); a_{n+1} = (a_n + b_n)/2, b_{n+1} = sqrt(a_n b_n),
    c_{n+1} = c_n^2 / (4 a_{n+1}); K = pi/(2 a_N), E = K (1 - sum_n 2^(n-1) c_n^2).
    m: a float or an array in [0, 1)."""
    xp = math if isinstance(m, float) else np
    a = 1.0
    b = xp.sqrt(1.0 - m)
    c2 = m                 # c_n^2
    s = 0.5 * c2           # sum of 2^(n-1) c_n^2
    power = 0.5
    for _ in range(64):
        a_next = (a + b) / 2.0
        c2 = c2 * c2 / (16.0 * a_next * a_next)   # c_{n+1}^2; (a_n - b_n)^2/4 would stall at an ulp
        b = xp.sqrt(a * b)
        a = a_next
        power *= 2.0
        s = s + power * c2
        if xp is math:
            if c2 <= 1e-33:
                break
        elif np.all(c2 <= 1e-33):
            break
    big_k = math.pi / (2.0 * a)
    return big_k, big_k * (1.0 - s)


def _check_m(m):
    if isinstance(m, float):
        if not 0.0 <= m < 1.0:
            raise ValueError(f"elliptic integrals need 0 <= m < 1, got {m}")
        return m
    m = np.asarray(m, dtype=float)
    if np.any(~((m >= 0.0) & (m < 1.0))):
        raise ValueError("elliptic integrals need 0 <= m < 1")
    return m


def ellipke(m):
    """(K(m), E(m)), the complete elliptic integrals of the first and second kind of parameter
    m = k^2 in [0, 1) (as scipy.special.ellipk and ellipe take it), by one arithmetic-geometric mean
    (A&S 17.6.1, 17.6.3, 17.6.4)."""
    return _agm_k_e(_check_m(m))
