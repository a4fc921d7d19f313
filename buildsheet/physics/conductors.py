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
from scipy.constants import mu_0
from scipy.special import jve

from buildsheet.errors import DesignError

# Above this |ka| the two-term asymptotic ratio J0/J1 = j + 1/(2ka) is exact to ~1e-12 relative and
# avoids relying on the Bessel routine where it loses precision for very large arguments.
_KA_ASYMPTOTIC = 1e6


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
        ratio = 1.0j + 1.0 / (2.0 * ka) if abs(ka) > _KA_ASYMPTOTIC else complex(jve(0, ka) / jve(1, ka))
        return k / (2.0 * np.pi * a * sigma) * ratio
    f, d, sigma = np.broadcast_arrays(np.asarray(f, float), np.asarray(d, float),
                                      np.asarray(sigma, float))
    a = d / 2.0
    k = (1.0 - 1.0j) / skin_depth(f, sigma)
    ka = k * a
    # jve is J scaled by exp(-|Im z|); the scale cancels in the ratio and J0, J1 cannot overflow.
    ratio_exact = jve(0, ka) / jve(1, ka)
    ratio_asymptotic = 1.0j + 1.0 / (2.0 * ka)
    ratio = np.where(np.abs(ka) > _KA_ASYMPTOTIC, ratio_asymptotic, ratio_exact)
    return k / (2.0 * np.pi * a * sigma) * ratio


def proximity_factor(spacing, d):
    """Resistance multiplier for current crowding in two parallel round wires, (D/d)/sqrt((D/d)^2 - 1).

    spacing: centre-to-centre D, m; d: wire diameter, m; needs D > d (wires not touching).
    Source: Ramo, Whinnery & Van Duzer, two-wire line with skin effect (from memory, CHECK_VALUES 2d).
    """
    ratio = np.asarray(spacing, dtype=float) / np.asarray(d, dtype=float)
    if np.any(ratio <= 1.0):
        raise DesignError(f"two-wire spacing must exceed the wire diameter, got spacing/diameter "
                          f"{np.min(ratio):.4g}")
    return ratio / np.sqrt(ratio**2 - 1.0)
