"""Thin-wire antenna formulas for the radiator (induced EMF, average characteristic impedance, images);
owns wire-antenna physics only: no I/O, no design keys, nothing about the stub or the match (jpole.py).

Symbols (SI throughout; functions broadcast over numpy arrays of f; loop_radiation_resistance,
loop_reactance(_slope), schelkunoff_z0 and wavenumber also take plain floats > 0 and then return
floats, computed with math alone: the solves' scalar path, see jpole._Prepared):

    f        frequency, Hz;  lam = c/f free-space wavelength, m;  k = 2 pi/lam, rad/m
    eta0     free-space wave impedance, ohm (eta0/(4 pi) = 29.98 ohm)
    l        total length of a straight wire (dipole), m;  h = l/2 half-length, m
    a, d     wire radius and diameter, m
    kl, ka   electrical length and electrical radius, rad
    R_r      radiation resistance referred to the current maximum (loop), ohm
    z_in     input impedance of a centre-fed dipole, referred to the feed current, ohm
    K        resonant length of a centre-fed dipole over lam/2 (X_in = 0)
    z0_avg   Schelkunoff's average characteristic impedance of one arm, ohm
    z12      mutual impedance of two wires with sinusoidal currents, referred to their loop currents
    rho_g    plane-wave reflection coefficient of the ground at normal incidence
    eps_c    complex relative permittivity of the ground, eps_r - j sigma/(omega eps0)
"""

from __future__ import annotations

import math

import numpy as np

from buildsheet.physics import resonance_table
from buildsheet.physics.constants import C0, epsilon_0, mu_0
from buildsheet.physics.quadrature import gauss_legendre
from buildsheet.physics.special import sici

ETA0 = float(np.sqrt(mu_0 / epsilon_0))
_ETA_4PI = ETA0 / (4.0 * np.pi)

# Gauss-Legendre nodes for the induced-EMF integral along the second wire. Wires that meet (the
# common-mode coupling at the junction): the near field varies over the spacing D, so the nodes
# needed grow with the second wire's length over D; 48 agree with 192 to 1e-5 ohm up to h2 = 30 D
# (VHF/UHF stubs), 96 to ~0.01 ohm at D/2 = 12 mm on HF stubs. Images (clear of the wire by twice
# its height): 32, 1e-3 ohm.
# Stored (quadrature.py), as numpy.polynomial.legendre.leggauss gives them.
_GL = {n: gauss_legendre(n) for n in (32, 48, 96)}


def _ci(x):
    return sici(x)[1]


def _si(x):
    return sici(x)[0]


def _scalar(x) -> bool:
    """Whether x takes the scalar path: a finite float > 0 (math functions and special.sici)."""
    return isinstance(x, float) and 0.0 < x < math.inf


def _sici_pair(x):
    """(Si(x), Ci(x), Si(2x), Ci(2x)): floats for a scalar x (_scalar), else arrays."""
    if _scalar(x):
        (si1, ci1), (si2, ci2) = sici(x), sici(2.0 * x)
        return si1, ci1, si2, ci2
    x = np.asarray(x, dtype=float)
    return (*sici(x), *sici(2 * x))


def loop_radiation_resistance(kl):
    """Radiation resistance of a thin centre-fed dipole of electrical length kl, referred to the
    current maximum, ohm (induced EMF, Carter 1932; Balanis eq. 4-70):

        R_r = (eta/2 pi) {C + ln kl - Ci(kl) + 1/2 sin kl [Si(2kl) - 2 Si(kl)]
                          + 1/2 cos kl [C + ln(kl/2) + Ci(2kl) - 2 Ci(kl)]}

    kl: k times the total length, rad. Gives 73.08 ohm at kl = pi (73.13 with eta = 120 pi).
    """
    if _scalar(kl):
        m = math
    else:
        m, kl = np, np.asarray(kl, dtype=float)
    si1, ci1, si2, ci2 = _sici_pair(kl)
    g = np.euler_gamma
    return 2.0 * _ETA_4PI * (g + m.log(kl) - ci1
                             + 0.5 * m.sin(kl) * (si2 - 2 * si1)
                             + 0.5 * m.cos(kl) * (g + m.log(kl / 2) + ci2 - 2 * ci1))


def loop_reactance(kl, ka):
    """Reactance of a thin centre-fed dipole referred to the current maximum, ohm (induced EMF with
    the finite radius, Carter 1932; Balanis eq. 4-71):

        X_m = (eta/4 pi) {2 Si(kl) + cos kl [2 Si(kl) - Si(2kl)]
                          - sin kl [2 Ci(kl) - Ci(2kl) - Ci(2 (ka)^2/kl)]}

    kl: electrical total length, rad; ka: electrical radius, rad. X_m = 42.52 ohm at kl = pi.
    The input reactance is X_m / sin^2(kl/2).
    """
    if _scalar(kl) and _scalar(ka):
        m = math
        (si1, ci1), (si2, ci2), (_, ci_a) = sici(kl), sici(2 * kl), sici(2 * ka**2 / kl)
    else:
        m = np
        kl = np.asarray(kl, dtype=float)
        ka = np.asarray(ka, dtype=float)
        si1, ci1, si2, ci2 = _sici_pair(kl)
        ci_a = _ci(2 * ka**2 / kl)
    return _ETA_4PI * (2 * si1 + m.cos(kl) * (2 * si1 - si2) - m.sin(kl) * (2 * ci1 - ci2 - ci_a))


def dipole_input_impedance(kl, ka):
    """Input impedance of a thin centre-fed dipole, ohm: (R_r + j X_m)/sin^2(kl/2) (Carter 1932;
    Balanis eqs. 4-70, 4-71). kl: electrical total length, ka: electrical radius (rad)."""
    s2 = np.sin(np.asarray(kl, dtype=float) / 2.0) ** 2
    return (loop_radiation_resistance(kl) + 1j * loop_reactance(kl, ka)) / s2


def _resonance_factor_newton(ka):
    ka = np.asarray(ka, dtype=float)
    kl = np.full_like(ka, 0.97 * np.pi)
    h = 1e-6
    for _ in range(6):      # from kl = 0.97 pi the table is exact to the last bit after 6 (as after 10)
        x = loop_reactance(kl, ka)
        dx = (loop_reactance(kl + h, ka) - x) / h
        kl = kl - x / dx
    return kl / np.pi


# K depends on ka alone and smoothly on ln(ka): the Newton root tabulated once, interpolated after.
# The table is stored as literals in resonance_table.py (written by write_resonance_table(); working
# it out at import cost a build about 20 ms); tests/test_radiator_table.py checks that it is what
# _resonance_factor_newton gives.
_LN_KA_TABLE = np.linspace(np.log(1e-7), np.log(0.2), 2000)
_K_TABLE = np.array(resonance_table.K)


def write_resonance_table(path=None) -> None:
    """Write physics/resonance_table.py: K at the nodes _LN_KA_TABLE, as _resonance_factor_newton
    gives it (repr round-trips a float exactly)."""
    import pathlib

    k = _resonance_factor_newton(np.exp(_LN_KA_TABLE))
    lines = ['"""K = (resonant length of a thin centre-fed dipole)/(lam/2) at ka = exp(radiator._LN_KA_TABLE):',
             "radiator._resonance_factor_newton's roots, written by radiator.write_resonance_table() (do not",
             'edit; tests/test_radiator_table.py checks them)."""', "", "K = ("]
    lines += [f"    {v!r}," for v in k.tolist()]
    lines.append(")")
    path = pathlib.Path(__file__).with_name("resonance_table.py") if path is None else path
    pathlib.Path(path).write_text("\n".join(lines) + "\n")


def resonance_factor(ka):
    """K = (resonant length of a centre-fed dipole)/(lam/2): the root of the induced-EMF input
    reactance (Carter 1932; Balanis eq. 4-71) near kl = pi (vectorised; tabulated in ln(ka),
    resonance_table.py; linear interpolation between nodes is good to 1e-6 in K).

    ka: electrical radius k a, rad, 1e-7..0.2. Gives K = 0.9728 for (lam/2)/d = 6485, against
    0.9712 from NEC-2 (CHECK_VALUES §3d): the induced-EMF end effect from the length-to-diameter ratio.
    """
    ln_ka = np.log(np.asarray(ka, dtype=float))
    return np.interp(ln_ka, _LN_KA_TABLE, _K_TABLE)


def loop_reactance_slope(kl, ka):
    """d X_m / d(kl) of the centre-fed dipole (ohm per radian of electrical length), by central
    difference of loop_reactance; used to turn a reactance added at the current maximum into the
    equivalent change of resonant length."""
    h = 1e-5
    if _scalar(kl):
        return (loop_reactance(kl + h, ka) - loop_reactance(kl - h, ka)) / (2 * h)
    x_hi, x_lo = loop_reactance(np.array([kl + h, kl - h]), ka)   # one evaluation for both
    return (x_hi - x_lo) / (2 * h)


def side_by_side_mutual(d_over_lam, l_over_lam=0.5):
    """Mutual impedance of two parallel side-by-side dipoles of length l at spacing d, referred to
    their loop currents, ohm (Carter 1932; Balanis eqs. 8-68, 8-69 for l = lam/2 generalised):

        R12 = (eta/4 pi) [2 Ci(u0) - Ci(u1) - Ci(u2)],  X12 = -(eta/4 pi) [2 Si(u0) - Si(u1) - Si(u2)]
        u0 = kd, u1 = k(sqrt(d^2 + l^2) + l), u2 = k(sqrt(d^2 + l^2) - l)

    d_over_lam, l_over_lam: spacing and length in wavelengths. Exact for l = lam/2 only.
    """
    k = 2 * np.pi
    d = np.asarray(d_over_lam, dtype=float)
    u0 = k * d
    u1 = k * (np.hypot(d, l_over_lam) + l_over_lam)
    u2 = k * (np.hypot(d, l_over_lam) - l_over_lam)
    return _ETA_4PI * ((2 * _ci(u0) - _ci(u1) - _ci(u2)) - 1j * (2 * _si(u0) - _si(u1) - _si(u2)))


def mutual_impedance(c1, t1, h1, c2, t2, h2, k, one_sided=False, nodes=96):
    """Mutual impedance of two straight thin wires carrying sinusoidal currents I_m sin k(h - |u|),
    referred to the two loop currents I_m, ohm (induced-EMF method, Carter 1932):

        z12 = -1/(I_m1 I_m2) * integral over wire 2 of E_1 . t2 I_2(u) du

    with the exact near field of a sinusoidal-current filament (Schelkunoff; Jordan & Balmain,
    "Electromagnetic Waves and Radiating Systems", near fields of a linear antenna):

        E_z   = -j (eta/4 pi) I_m [e^{-jkR1}/R1 + e^{-jkR2}/R2 - 2 cos(kh) e^{-jkr}/r]
        E_rho =  j (eta/4 pi) I_m / rho [(z - h) e^{-jkR1}/R1 + (z + h) e^{-jkR2}/R2
                                         - 2 z cos(kh) e^{-jkr}/r]

    c1, c2: centres (3-vectors, m); t1, t2: unit vectors along the wires; h1, h2: half-lengths, m;
    k: wavenumber(s), rad/m, any shape (the result has that shape). one_sided: wire 2 is only the
    arm from c2 along +t2 (length h2, current maximum at c2), as a counterpoise fed at c2.
    Reproduces side_by_side_mutual for parallel half-waves; valid while wire 2 keeps clear of wire 1
    (no self term). nodes: Gauss-Legendre points along wire 2, 32, 48 or 96. c1 and t1 may also be
    stacks of shape (m, 3), m first wires of half-length h1 against the same second wire, evaluated
    together (numpy's per-call cost is most of the time): the result then has a last axis of m.
    """
    return mutual_impedances(c1, t1, h1, ((c2, t2, h2, one_sided, nodes),), k)[0]


def mutual_impedances(c1, t1, h1, seconds, k):
    """mutual_impedance of wire 1 (c1, t1, h1, as there, stacks allowed) against several second
    wires at once, one vectorised pass over all their Gauss nodes: seconds is a sequence of
    (c2, t2, h2, one_sided, nodes); returns a tuple, one result per second wire, each what
    mutual_impedance(c1, t1, h1, c2, t2, h2, k, one_sided, nodes) gives."""
    k = np.asarray(k, dtype=float)
    c1, t1 = np.asarray(c1, dtype=float), np.asarray(t1, dtype=float)
    pts, dirs, us, wts, starts = [], [], [], [], []
    n = 0
    for c2, t2, h2, one_sided, nodes in seconds:
        gl_x, gl_w = _GL[nodes]
        c2, t2 = np.asarray(c2, dtype=float), np.asarray(t2, dtype=float)
        u = h2 * (gl_x + 1) / 2 if one_sided else h2 * gl_x
        pts.append(c2 + u[:, None] * t2)
        dirs.append(np.repeat(t2[None, :], nodes, axis=0))
        us.append(h2 - np.abs(u))                      # k (h2 - |u|): the current's phase
        wts.append(gl_w * (h2 / 2 if one_sided else h2))
        starts.append(n)
        n += nodes
    pts, dirs, us, wts = (np.concatenate(v) for v in (pts, dirs, us, wts))
    rel = pts - c1[..., None, :]
    z = (rel @ t1[..., :, None])[..., 0]
    rho_vec = rel - z[..., None] * t1[..., None, :]
    rho = np.maximum(np.sqrt(np.add.reduce(rho_vec * rho_vec, axis=-1)), 1e-12)
    # last axis: the distances R1, R2, r to wire 1's ends and centre, and the weights
    # w = t1.t2 - (z - h, z + h, z) (rho_hat.t2)/rho that give both field components at once:
    # E . t2 = -j (eta/4 pi) I_m [w1 e^{-jkR1}/R1 + w2 e^{-jkR2}/R2 - 2 cos(kh) w0 e^{-jkr}/r]
    dz = z[..., None] + np.array([-h1, h1, 0.0])
    r = np.sqrt(rho[..., None] ** 2 + dz**2)
    w = (dirs @ t1[..., :, None]) - dz * (np.add.reduce(rho_vec * dirs, axis=-1) / rho**2)[..., None]
    k = k.reshape(k.shape + (1,) * r.ndim)
    e = np.exp(-1j * (k * r)) * (w / r)
    field = e[..., 0] + e[..., 1] - 2 * np.cos(k[..., 0] * h1) * e[..., 2]
    terms = field * (np.sin(k[..., 0] * us) * wts)
    sums = np.add.reduceat(terms, starts, axis=-1)
    return tuple(1j * _ETA_4PI * sums[..., i] for i in range(len(starts)))


def ground_reflection(f, eps_r, sigma):
    """Plane-wave reflection coefficient of a flat lossy ground at normal incidence, for the image
    of a wire above it: rho_g = (n - 1)/(n + 1), n = sqrt(eps_c), eps_c = eps_r - j sigma/(omega eps0)
    (Fresnel; the image of perfect ground has rho_g = 1). f: Hz; eps_r: relative permittivity;
    sigma: conductivity, S/m. The image current is -rho_g times the mirrored current."""
    omega = 2 * np.pi * np.asarray(f, dtype=float)
    n = np.sqrt(eps_r - 1j * sigma / (omega * epsilon_0))
    return (n - 1) / (n + 1)


def schelkunoff_z0(length, radius):
    """Average characteristic impedance of one arm of a thin wire antenna, ohm (Schelkunoff 1941;
    Jordan & Balmain: dipole z0_avg = 120 [ln(2h/a) - 1], one arm against the other half that):

        z0_avg = 60 [ln(2 l/a) - 1]

    length: arm length l, m; radius: a, m."""
    if _scalar(length) and _scalar(radius):
        return 60.0 * (math.log(2.0 * length / radius) - 1.0)
    return 60.0 * (np.log(2.0 * np.asarray(length, dtype=float) / radius) - 1.0)


def wavenumber(f):
    """k = 2 pi f / c, rad/m; f in Hz."""
    return 2 * np.pi * (f if isinstance(f, float) else np.asarray(f, dtype=float)) / C0
