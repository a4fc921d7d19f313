"""Skin effect and resistance of round wires; owns conductor formulas only, no I/O, no design keys.

Symbols (SI throughout):

    f          frequency, Hz
    omega      angular frequency 2*pi*f, rad/s
    sigma      conductivity, S/m
    mu_r       relative permeability of the conductor (1 for copper, aluminium)
    delta      skin depth, m
    Rs         surface resistance, ohm (per square)
    d, a       wire diameter and radius, m
    D          centre-to-centre spacing of two parallel wires, m
    k          complex wavenumber in the metal, (1 - j)/delta, 1/m
    R_dc       DC resistance per metre of one wire, ohm/m
    Z_int      internal impedance per metre of one wire, complex ohm/m
"""

from __future__ import annotations

import numpy as np

from buildsheet.physics import ModelError
from buildsheet.physics.constants import mu_0
from buildsheet.physics.special import j1_over_j0

# From this |ka| = sqrt(2) a/delta up, J0(ka)/J1(ka) is computed from Hankel's asymptotic expansion
# (Abramowitz & Stegun 9.2.7-9.2.10; from memory, checked against scipy's jve in the tests): with
# Im(ka) < 0, J_nu = (H1_nu + H2_nu)/2 is H1_nu but for a part e^(-2 a/delta) of it, below 1e-17
# here, and twelve terms of each series leave less than 1e-14 (4e-9 at a/delta = 10). The Bessel
# routines are most of the cost of a sweep's wire impedance; they remain below this |ka|.
_KA_ASYMPTOTIC = 28.0


def _series(nu: int, terms: int = 12) -> list[complex]:
    """Coefficients of H1_nu(z) ~ sqrt(2/(pi z)) e^{j(z - nu pi/2 - pi/4)} sum_k j^k a_k(nu) / z^k,
    a_k = (4nu^2 - 1)(4nu^2 - 9)...(4nu^2 - (2k - 1)^2) / (k! 8^k), highest power first."""
    a = [1.0 + 0j]
    for k in range(1, terms + 1):
        a.append(a[-1] * 1j * (4 * nu * nu - (2 * k - 1) ** 2) / (8 * k))
    return a[::-1]


_H0, _H1 = _series(0), _series(1)


def _j0_over_j1_large(ka):
    """J0(ka)/J1(ka) for |ka| >= _KA_ASYMPTOTIC, Im(ka) < 0: j S0(1/ka)/S1(1/ka) (see above)."""
    w = 1.0 / ka
    s0, s1 = _H0[0], _H1[0]
    for c0, c1 in zip(_H0[1:], _H1[1:]):     # Horner
        s0, s1 = s0 * w + c0, s1 * w + c1
    return 1j * s0 / s1


def skin_depth(f, sigma, mu_r=1.0):
    """Skin depth delta = 1/sqrt(pi f mu0 mu_r sigma), m.

    f: frequency, Hz; sigma: conductivity, S/m; mu_r: relative permeability.
    Source: Ramo, Whinnery & Van Duzer, "Fields and Waves in Communication Electronics" (skin effect).
    """
    return 1.0 / np.sqrt(np.pi * np.asarray(f, dtype=float) * mu_0 * mu_r * sigma)


def surface_resistance(f, sigma, mu_r=1.0):
    """Surface resistance Rs = sqrt(pi f mu0 mu_r / sigma) = 1/(sigma delta), ohm.

    f: frequency, Hz; sigma: conductivity, S/m; mu_r: relative permeability.
    Source: Ramo, Whinnery & Van Duzer (skin effect).
    """
    return np.sqrt(np.pi * np.asarray(f, dtype=float) * mu_0 * mu_r / sigma)


def dc_resistance(d, sigma):
    """DC resistance of one round wire, R_dc = 1/(sigma pi a^2), ohm/m.

    d: wire diameter, m; sigma: conductivity, S/m.
    """
    a = np.asarray(d, dtype=float) / 2.0
    return 1.0 / (sigma * np.pi * a**2)


def wire_internal_impedance(f, d, sigma):
    """Internal impedance per metre of an isolated round wire (non-magnetic), complex ohm/m.

    Z_int = k/(2 pi a sigma) * J0(ka)/J1(ka), k = (1 - j)/delta: the exact solution for a round wire
    with axial current (Ramo, Whinnery & Van Duzer, internal impedance of a round wire).
    Its real part tends to Rs/(pi d) + R_dc/4 when a >> delta and to R_dc when a << delta; its
    imaginary part is omega times the internal inductance (mu0/(8 pi) at low frequency).

    f: frequency, Hz (> 0); d: wire diameter, m; sigma: conductivity, S/m. Broadcasts over all three;
    three floats give a complex (the solves' scalar path, without numpy's array overhead).
    """
    if isinstance(f, float) and isinstance(d, float) and isinstance(sigma, float):
        a = d / 2.0
        k = (1.0 - 1.0j) / float(skin_depth(f, sigma))
        ka = k * a
        ratio = complex(_j0_over_j1_large(ka)) if abs(ka) >= _KA_ASYMPTOTIC \
            else 1.0 / j1_over_j0(complex(ka))
        return k / (2.0 * np.pi * a * sigma) * ratio
    f, d, sigma = np.broadcast_arrays(np.asarray(f, float), np.asarray(d, float),
                                      np.asarray(sigma, float))
    a = d / 2.0
    k = (1.0 - 1.0j) / skin_depth(f, sigma)
    ka = k * a
    small = np.abs(ka) < _KA_ASYMPTOTIC
    if not small.any():
        ratio = _j0_over_j1_large(ka)
    else:
        ka = np.atleast_1d(ka)
        ratio = np.empty(ka.shape, dtype=complex)
        large = ~small.reshape(ka.shape)
        ratio[large] = _j0_over_j1_large(ka[large])
        # the recurrence's continued fraction gives the ratio itself: nothing to overflow
        ratio[~large] = 1.0 / j1_over_j0(ka[~large])
        ratio = ratio.reshape(np.shape(k))
    return k / (2.0 * np.pi * a * sigma) * ratio


def proximity_factor(spacing, d):
    """Resistance multiplier for current crowding in two parallel round wires, (D/d)/sqrt((D/d)^2 - 1).

    spacing: centre-to-centre D, m; d: wire diameter, m; needs D > d (wires not touching).
    Source: Ramo, Whinnery & Van Duzer, two-wire line with skin effect (from memory, CHECK_VALUES 2d).
    """
    ratio = np.asarray(spacing, dtype=float) / np.asarray(d, dtype=float)
    if np.any(ratio <= 1.0):
        raise ModelError(f"two-wire spacing must exceed the wire diameter, got spacing/diameter "
                          f"{np.min(ratio):.4g}")
    return ratio / np.sqrt(ratio**2 - 1.0)
