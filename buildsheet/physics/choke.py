"""Single-layer coils and coiled-coax choke sizing; owns coil formulas only, no I/O, no design keys.

Symbols (SI throughout unless a formula says otherwise):

    D          mean coil diameter (centre of the winding), m
    r          mean coil radius D/2, m
    l          coil length (winding length), m
    N          number of turns
    k, k'      Nagaoka's modulus D/sqrt(D^2 + l^2) and complementary modulus l/sqrt(D^2 + l^2)
    K_N        Nagaoka coefficient
    L          inductance, H
    C          self-capacitance, F
    H          Medhurst's coefficient, pF per cm of diameter
    R          series loss resistance of the winding, ohm
    f, omega   frequency (Hz) and 2*pi*f
    f_srf      self-resonant frequency 1/(2 pi sqrt(L C)), Hz
    Z          impedance of the coil, ohm
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from scipy.constants import inch, mu_0
from scipy.special import ellipe, ellipk

from buildsheet.errors import DesignError
from buildsheet.physics.conductors import surface_resistance

# Copper: the shield's outer surface taken as a smooth copper tube. Real braid loses more, so the
# resulting |Z| near self-resonance is an upper bound; sizing keeps the band well below resonance.
SIGMA_COPPER = 5.8e7

# Frequencies sampled across the band when checking |Z| everywhere in it.
_BAND_POINTS = 33


def wheeler_inductance(d_mean, length, turns):
    """Inductance of a single-layer solenoid by Wheeler's formula, H.

    L(uH) = r^2 N^2/(9 r + 10 l), r and l in inches (H. A. Wheeler, "Simple inductance formulas for
    radio coils", Proc. IRE 16, 1928; journal details from memory). Stated valid for l >= 0.4 D; about
    1 % for l > 0.8 r (that accuracy claim is from memory).

    d_mean: mean diameter D, m; length: winding length l, m; turns: N.
    """
    r_in = np.asarray(d_mean, dtype=float) / 2.0 / inch
    l_in = np.asarray(length, dtype=float) / inch
    return r_in**2 * np.asarray(turns, dtype=float) ** 2 / (9.0 * r_in + 10.0 * l_in) * 1e-6


def nagaoka_coefficient(d_mean, length):
    """Nagaoka's coefficient K_N of a uniform current sheet (H. Nagaoka 1909; journal from memory).

    K_N = 4/(3 pi k') [(k'^2/k^2)(K(k) - E(k)) + E(k) - k], k^2 = D^2/(D^2 + l^2), k' = l/sqrt(D^2 + l^2),
    with complete elliptic integrals K, E of modulus k (scipy's ellipk/ellipe take m = k^2).

    d_mean: coil diameter D, m; length: coil length l, m (only D/l matters).
    """
    d = np.asarray(d_mean, dtype=float)
    l = np.asarray(length, dtype=float)
    k2 = d**2 / (d**2 + l**2)
    k = np.sqrt(k2)
    kp = l / np.sqrt(d**2 + l**2)
    big_k, big_e = ellipk(k2), ellipe(k2)
    return 4.0 / (3.0 * np.pi * kp) * ((kp**2 / k2) * (big_k - big_e) + big_e - k)


def current_sheet_inductance(d_mean, length, turns):
    """Inductance of a single-layer solenoid as a current sheet, L = mu0 pi r^2 N^2 K_N / l, H.

    Exact for a uniform current sheet at any length-to-diameter ratio (Nagaoka 1909); round-wire
    spacing corrections (Rosa) are not applied. d_mean: D, m; length: l, m; turns: N.
    """
    r = np.asarray(d_mean, dtype=float) / 2.0
    l = np.asarray(length, dtype=float)
    n = np.asarray(turns, dtype=float)
    return mu_0 * np.pi * r**2 * n**2 * nagaoka_coefficient(d_mean, length) / l


def self_capacitance(d_mean, length):
    """Self-capacitance of a single-layer solenoid by Medhurst's empirical fit, F.

    C(pF) = H D(cm), H = 0.1126 (l/D) + 0.08 + 0.27/sqrt(l/D) (R. G. Medhurst, "H.F. resistance and
    self-capacitance of single-layer solenoids", Wireless Engineer, 1947; the constants of this usual
    fit and the journal details are from memory, about +-5 %). Fitted to wire solenoids, not jacketed coax.

    d_mean: coil diameter D, m; length: coil length l, m.
    """
    d = np.asarray(d_mean, dtype=float)
    ratio = np.asarray(length, dtype=float) / d
    h = 0.1126 * ratio + 0.08 + 0.27 / np.sqrt(ratio)
    return h * (d * 100.0) * 1e-12


def coil_impedance(f, L, C, R=0.0):
    """|Z| of a coil: (R + j omega L) in parallel with its self-capacitance C, ohm.

    Z = (R + j omega L)/(1 - omega^2 L C + j omega R C) (lumped model of a self-resonant coil). R > 0
    keeps |Z| finite at f_srf (peak L/(R C)); with R = 0 the exact resonance gives inf.
    f: Hz; L: H; C: F; R: ohm.
    """
    omega = 2.0 * np.pi * np.asarray(f, dtype=float)
    # |num / den| from the squared magnitudes, in real arithmetic (the choke sizing evaluates it
    # on a grid of turns x frequencies)
    num2 = R**2 + (omega * L) ** 2
    den2 = (1.0 - omega**2 * L * C) ** 2 + (omega * R * C) ** 2
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(den2 == 0, np.inf, np.sqrt(num2 / den2))


@dataclass(frozen=True)
class ChokeDesign:
    """A close-wound coiled-coax choke and what it gives.

    turns: N; form_diameter_m: form OD, m; mean_diameter_m: D = form OD + cable OD, m;
    coil_length_m: l = N x cable OD, m; inductance_h: L (current sheet), H; capacitance_f: C
    (Medhurst), F; self_resonance_hz: f_srf, Hz; impedance_ohm: the least |Z| over the band, ohm;
    warning: why the target could not be met and what would help, or None.
    """

    turns: int
    form_diameter_m: float
    mean_diameter_m: float
    coil_length_m: float
    inductance_h: float
    capacitance_f: float
    self_resonance_hz: float
    impedance_ohm: float
    warning: str | None


def design_coax_choke(f_design, f_band_high, form_od, cable_od, z_target=1000.0, srf_margin=1.2,
                      max_turns=40, f_band_low=None) -> ChokeDesign:
    """Size a coiled-coax common-mode choke: the fewest close-wound turns on a form that give
    |Z| >= z_target at every frequency of the band with the self-resonance >= srf_margin x f_band_high.

    Target |Z| >= 1 kohm with the resonance 20 % above the band is common practice. The coil is
    close-wound: D = form OD + cable OD, l = N x cable OD. L is the current-sheet value (Nagaoka),
    which holds for the short, wide coils of few turns where Wheeler's formula (l >= 0.4 D) does not;
    C is Medhurst's; the loss R is the skin-effect resistance of the shield's outer surface. |Z| is
    computed from L, C and R at each frequency, never set from the target.

    When no N meets both conditions (always at VHF/UHF for an air coil of coax), the N with the best
    least |Z| across the band whose resonance still clears the margin is chosen (N = 1 if none does)
    and `warning` says so.

    f_design: design frequency, Hz; f_band_high: top edge of the band, Hz; form_od: form outside
    diameter, m; cable_od: coax outside diameter, m; z_target: ohm; srf_margin: ratio >= 1;
    max_turns: largest N tried; f_band_low: bottom edge of the band, Hz (default f_design).
    """
    f_low = f_design if f_band_low is None else f_band_low
    if not 0 < f_low <= f_design <= f_band_high:
        raise DesignError(f"choke band must satisfy 0 < low edge <= design frequency <= high edge, "
                          f"got {f_low} Hz, {f_design} Hz, {f_band_high} Hz")
    if not (form_od > 0 and cable_od > 0):
        raise DesignError(f"choke form and cable diameters must be positive, got form {form_od} m, "
                          f"cable {cable_od} m")
    if not (z_target > 0 and srf_margin >= 1 and max_turns >= 1):
        raise DesignError(f"choke target must be positive with a margin >= 1 and at least one turn, "
                          f"got {z_target} ohm, margin {srf_margin}, {max_turns} turns")

    n = np.arange(1, int(max_turns) + 1, dtype=float)[:, None]
    band = np.union1d(np.linspace(f_low, f_band_high, _BAND_POINTS), [f_design])[None, :]
    d_mean = form_od + cable_od
    length = n * cable_od
    L = current_sheet_inductance(d_mean, length, n)
    C = self_capacitance(d_mean, length)
    # shield surface over the coax length N pi D, current around the cable's circumference pi OD
    R = surface_resistance(band, SIGMA_COPPER) * n * np.pi * d_mean / (np.pi * cable_od)
    z_least = coil_impedance(band, L, C, R).min(axis=1)
    srf = 1.0 / (2.0 * np.pi * np.sqrt(L * C))[:, 0]
    clears = srf >= srf_margin * f_band_high
    meets = clears & (z_least >= z_target)

    warning = None
    if meets.any():
        i = int(np.argmax(meets))
    elif clears.any():
        i = int(np.argmax(np.where(clears, z_least, -np.inf)))
        turns = f"{i + 1} turn{'s' if i else ''}"
        warning = (f"No coil of up to {int(max_turns)} turns on this form reaches {z_target:.0f} ohm "
                   f"across the band with its self-resonance {srf_margin:g} x above the band; the best "
                   f"is {turns} giving {z_least[i]:.0f} ohm. A smaller form or a ferrite sleeve choke "
                   f"over the coax (common practice) would help.")
    else:
        i = 0
        warning = (f"Even one turn on this form self-resonates at {srf[0] / 1e6:.3g} MHz, below "
                   f"{srf_margin:g} x the band top, so an air coil of this coax cannot reach "
                   f"{z_target:.0f} ohm here (one turn gives {z_least[0]:.0f} ohm). Use a ferrite sleeve "
                   f"choke over the coax (common practice) or a much smaller form.")
    return ChokeDesign(turns=i + 1, form_diameter_m=float(form_od), mean_diameter_m=float(d_mean),
                       coil_length_m=float(length[i, 0]), inductance_h=float(L[i, 0]),
                       capacitance_f=float(C[i, 0]), self_resonance_hz=float(srf[i]),
                       impedance_ohm=float(z_least[i]), warning=warning)
