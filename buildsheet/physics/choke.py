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
    f_srf      first self-resonant (parallel) frequency, Hz
    Z          impedance of the coil, ohm
    p          pitch (turn to turn), m; a coax coil is close-wound: p = cable OD
    a          wire radius, m (for coax: the outside radius, OD/2)
"""

from __future__ import annotations

import functools

import numpy as np

from buildsheet.physics import ModelError, union1d
from buildsheet.physics.conductors import surface_resistance
from buildsheet.physics.constants import C0, epsilon_0, inch, mu_0
from buildsheet.physics.special import ellipke
from buildsheet.valueclass import valueclass

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
    with complete elliptic integrals K, E of modulus k (special.ellipke takes m = k^2, as scipy's do).

    d_mean: coil diameter D, m; length: coil length l, m (only D/l matters).
    """
    d = np.asarray(d_mean, dtype=float)
    l = np.asarray(length, dtype=float)
    k2 = d**2 / (d**2 + l**2)
    k = np.sqrt(k2)
    kp = l / np.sqrt(d**2 + l**2)
    big_k, big_e = ellipke(k2)
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


def rosa_correction(d_mean, pitch, wire_diameter, turns):
    """Rosa's round-wire correction to the current sheet, H: L = L_sheet - mu0 r N (A + B).

    E. B. Rosa, "The self and mutual inductances of linear conductors", Bull. Bureau of Standards 4
    (1908), as tabulated by F. W. Grover, "Inductance Calculations" (1946) (both from memory). Each turn
    is a round wire instead of a strip of the sheet one pitch wide; by geometric mean distances (GMD):
      A = ln(GMD of the wire) - ln(GMD of a strip of width p) = ln(a/p) + 3/2 for the current on the
          wire's surface (skin effect; the shield's outside); Rosa's low-frequency A = 5/4 - ln(2p/d)
          is the same with the solid wire's GMD a e^(-1/4);
      B = (2/N) sum_{k=1}^{N-1} (N - k) [ln(k p) - ln(GMD of two strips k pitches apart)], with the
          exact GMD of two collinear strips (Maxwell): ln g = [(k+1)^2 ln(k+1) + (k-1)^2 ln(k-1)
          - 2 k^2 ln k]/2 - 3/2 + ln p; B -> ln(2 pi) - 3/2 = 0.3379 for many turns,
          B(2) = 0.1137 (Grover's table).
    For one turn the corrected sheet is the ring of the loop formula, mu0 r (ln(8 r/a) - 2), to
    O((p/D)^2). Uniform current around each wire is assumed (no proximity effect), as in NEC-2.

    d_mean: D, m; pitch: p, m; wire_diameter: d = 2a, m (here the coax's outside); turns: N.
    """
    n = int(turns)
    r = float(d_mean) / 2.0
    a_term = np.log(float(wire_diameter) / 2.0 / float(pitch)) + 1.5
    k = np.arange(1, n, dtype=float)
    xlogx = lambda x: np.where(x > 0, x**2 * np.log(np.where(x > 0, x, 1.0)), 0.0)  # noqa: E731
    b_k = np.log(k) + 1.5 - (xlogx(k + 1) + xlogx(k - 1) - 2 * xlogx(k)) / 2.0
    b_term = 2.0 / n * float(np.sum((n - k) * b_k))
    return mu_0 * r * n * (a_term + b_term)


def coil_inductance(d_mean, pitch, wire_diameter, turns):
    """Inductance of a single-layer coil of round wire (here coax) at RF, H: the current sheet of
    Nagaoka less Rosa's round-wire correction (`rosa_correction`). Valid from one turn (where it is
    the loop formula of Rosa/Grover) to long coils. d_mean, pitch, wire_diameter in m; turns: N."""
    return (current_sheet_inductance(d_mean, int(turns) * pitch, turns)
            - rosa_correction(d_mean, pitch, wire_diameter, turns))


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


# --- the coiled coax's self-resonance, fitted to NEC-2 -------------------------------------------
#
# NEC-2 reference (tests/necref.py, coil_model): the shield's outside as a wire helix of the coax's
# outer radius, pitch = OD (turns 1 % of the OD apart), driven between its ends through short leads,
# in free space, no jacket; segments about 4 radii long (coil_per_turn). 118 coils of RG-58, RG-8X
# and RG-213 on 30-250 mm forms with 2-34 turns (l/D up to 3.7), their first self-resonance found
# to 0.3 % (the data and the script that made them: tests/data/choke_nec_srf.json). Fitted on the
# 55 coils with N = 2, 4, 9, 18, 34 whose segments are under 4.6 radii; held out the 49 with
# N = 3, 6, 13, 25: SRF error median 0.9 %, 90th percentile 1.4 %, worst 1.8 % (train worst 3.1 %).
# The 14 coils on 250 mm forms with thin cable (segments 5.5-6.7 radii, not in the fit) agree
# within 2.5 % from 4 turns up and read 5-10 % lower in NEC at 2-3 turns, where NEC's coarser mesh
# is the likelier culprit (its few-turn inductance there is 10 % short of the loop formula).
_C_END = (2.7690, 5.8300, 0.59714, 1.0219)   # C_eff/(eps0 D) = c0 + c1 OD/D + c2 l/D + c3/N, N >= 2
# One turn (15 coils, D/OD 3.9-52): within 0.13 %.
_LOOP_K = (0.40185, 0.10228)                 # f_srf 2 pi D / c = k0 + k1 ln(D/OD)
# The range of the NEC-2 data: outside it no SRF (and so no |Z|) is given.
FIT_D_OVER_OD = (3.9, 52.0)
FIT_L_OVER_D = 3.7
FIT_TURNS = 40                               # the data reach 34 turns; 40 where l/D is inside


def coil_self_resonance(d_mean, pitch, cable_od, turns):
    """First self-resonance of a close-wound coil of coax, free space, driven between its ends, Hz.

    N >= 2: the coil's inductance (`coil_inductance`) with an effective end-to-end capacitance
    C_eff = eps0 D [c0 + c1 OD/D + c2 l/D + c3/N]: about 3 eps0 D, nearly independent of N, the
    capacitance between the coil's end turns across it; OD/D adds the close turns' share for thick
    cable on a small form, l/D a long coil's length, 1/N the larger share of neighbouring turns in a
    coil of few. The four constants are fitted to NEC-2 (see _C_END; held-out SRF within 1.8 %).
    Medhurst's formula (`self_capacitance`) gives 2-3x this C: his coils stood on an earthed plane
    with one end grounded (from memory), not a coil floating in a feed line.
    N = 1: a single turn resonates as a loop, somewhat below the frequency where its circumference is
    half a wavelength (the lower the thicker the wire): f_srf = c/(2 pi D) [k0 + k1 ln(D/OD)], fitted
    to NEC-2 on 15 one-turn coils (within 0.13 %), with its leads.
    NEC-2's thin wire has no jacket dielectric and does not see the extra capacitance of touching
    turns, so a real coil of jacketed coax resonates lower than this (not modelled: NEC-2 cannot
    check it); the 20 % margin of the sizing is there for that too.

    d_mean: D, m; pitch: p, m; cable_od: m; turns: N.
    """
    return _self_resonance(d_mean, pitch, cable_od, turns, None)


def _self_resonance(d_mean, pitch, cable_od, turns, inductance):
    """coil_self_resonance with the coil's inductance given (coil_inductance's, or None to work it
    out): the choke sizing has it already."""
    n = int(turns)
    d = float(d_mean)
    if n == 1:
        return C0 / (2.0 * np.pi * d) * (_LOOP_K[0] + _LOOP_K[1] * np.log(d / cable_od))
    if inductance is None:
        inductance = coil_inductance(d, pitch, cable_od, n)
    l_over_d = n * pitch / d
    c_eff = epsilon_0 * d * (_C_END[0] + _C_END[1] * cable_od / d + _C_END[2] * l_over_d + _C_END[3] / n)
    return 1.0 / (2.0 * np.pi * np.sqrt(inductance * c_eff))


@functools.lru_cache(maxsize=64)
def _coils(d_mean, pitch, cable_od, max_turns):
    """(L, f_srf): the inductance (H) and self-resonance (Hz) of 1..max_turns close-wound turns,
    arrays, worked out once per form and coax in a process (a handout's designs and a fit's solves
    share them); read-only."""
    turns = range(1, max_turns + 1)
    L = np.array([coil_inductance(d_mean, pitch, cable_od, n) for n in turns])
    srf = np.array([_self_resonance(d_mean, pitch, cable_od, n, L[n - 1]) for n in turns])
    L.flags.writeable = srf.flags.writeable = False
    return L, srf


def coil_impedance_line(f, L, f_srf, R=0.0):
    """Complex impedance of a coil as a shorted line a quarter wave long at its self-resonance, ohm.

    Z = Zc tanh(gamma), per unit of the line's length: series R + j omega L, shunt j omega C' with
    C' = 1/((4 f_srf)^2 L), Zc = sqrt((R + j omega L)/(j omega C')), gamma = sqrt((R + j omega L)
    j omega C'). Low frequency: R + j omega L; lossless: j omega L tan(x)/x with x = (pi/2) f/f_srf
    (telegrapher's equations). With NEC-2's own L and f_srf it gave NEC-2's |Z| of three coax coils
    (7-23 turns, 0.25-0.42 f_srf) within 1.5 %, where the lumped L parallel C (`coil_impedance`)
    read 2.5-4 % high; the two shapes part further towards resonance (16 % at 0.83 f_srf). The
    tests check the sized chokes' |Z| against NEC-2. f: Hz; L: H; f_srf: Hz; R: total series loss, ohm.
    """
    omega = 2.0 * np.pi * np.asarray(f, dtype=float)
    c_line = 1.0 / ((4.0 * f_srf) ** 2 * L)
    z_series = R + 1j * omega * L
    y_shunt = 1j * omega * c_line
    gamma = np.sqrt(z_series * y_shunt)
    return np.sqrt(z_series / y_shunt) * np.tanh(gamma)


def shield_resistance(f, d_mean, cable_od, turns):
    """Skin-effect resistance of the shield's outside along the coil, ohm: copper surface resistance
    over the coax length N pi D, the current around the cable's circumference pi OD (an upper bound
    on |Z| at resonance: braid and proximity effect lose more)."""
    return surface_resistance(f, SIGMA_COPPER) * turns * np.pi * d_mean / (np.pi * cable_od)


@valueclass
class ChokeDesign:
    """A close-wound coiled-coax choke and what it gives.

    turns: N; form_diameter_m: form OD, m; mean_diameter_m: D = form OD + cable OD, m;
    coil_length_m: l = N x cable OD, m; inductance_h: L (current sheet less Rosa's correction), H;
    capacitance_f: the lumped C that resonates L at f_srf, F; self_resonance_hz: f_srf, Hz, or None
    where the model cannot give it; impedance_ohm: |Z| at the design frequency, ohm;
    impedance_low_edge_ohm: |Z| at the band's low edge (the least in the band below resonance), ohm;
    either None where the model cannot support it; warning: why the target could not be met and
    what to do instead, or None.
    """

    turns: int
    form_diameter_m: float
    mean_diameter_m: float
    coil_length_m: float
    inductance_h: float
    capacitance_f: float
    self_resonance_hz: float | None
    impedance_ohm: float | None
    impedance_low_edge_ohm: float | None
    warning: str | None


# The lumped/line models hold below resonance; above this fraction of f_srf a figure is not given.
_MAX_F_OVER_SRF = 0.9


def design_coax_choke(f_design, f_band_high, form_od, cable_od, z_target=1000.0, srf_margin=1.2,
                      max_turns=40, f_band_low=None) -> ChokeDesign:
    """Size a coiled-coax common-mode choke: the fewest close-wound turns on a form that give
    |Z| >= z_target at every frequency of the band with the self-resonance >= srf_margin x f_band_high.

    Target |Z| >= 1 kohm with the resonance 20 % above the band is common practice. The coil is
    close-wound: D = form OD + cable OD, l = N x cable OD, pitch = cable OD. L is the current sheet
    (Nagaoka) less Rosa's round-wire correction, which is the loop formula for one turn
    (`coil_inductance`); f_srf is `coil_self_resonance` (fitted to NEC-2); |Z| is the coil as a
    quarter-wave line at f_srf with the shield's skin-effect loss (`coil_impedance_line`), computed
    at each frequency, never set from the target.

    When no N meets both conditions, the N with the best least |Z| across the band whose resonance
    still clears the margin is chosen and `warning` says plainly that the target is not reached and
    what to use instead. When not even one turn clears the margin (VHF/UHF on a usual form), a coil
    of this coax is no choke here: one turn is reported, its |Z| figures are None (the band is at or
    above its resonance, where these models do not hold) and `warning` says what to use instead.
    The figures are also None for a form outside the range the model was checked against NEC-2
    (D/OD 3.9-52, l/D <= 3.7).

    f_design: design frequency, Hz; f_band_high: top edge of the band, Hz; form_od: form outside
    diameter, m; cable_od: coax outside diameter, m; z_target: ohm; srf_margin: ratio >= 1;
    max_turns: largest N tried; f_band_low: bottom edge of the band, Hz (default f_design).
    """
    f_low = f_design if f_band_low is None else f_band_low
    if not 0 < f_low <= f_design <= f_band_high:
        raise ModelError(f"choke band must satisfy 0 < low edge <= design frequency <= high edge, "
                          f"got {f_low} Hz, {f_design} Hz, {f_band_high} Hz")
    if not (form_od > 0 and cable_od > 0):
        raise ModelError(f"choke form and cable diameters must be positive, got form {form_od} m, "
                          f"cable {cable_od} m")
    if not (z_target > 0 and srf_margin >= 1 and max_turns >= 1):
        raise ModelError(f"choke target must be positive with a margin >= 1 and at least one turn, "
                          f"got {z_target} ohm, margin {srf_margin}, {max_turns} turns")

    band = union1d(np.linspace(f_low, f_band_high, _BAND_POINTS), [f_design])
    d_mean = form_od + cable_od
    pitch = cable_od
    turns = np.arange(1, int(max_turns) + 1)
    L, srf = _coils(float(d_mean), float(pitch), float(cable_od), int(max_turns))
    # |Z| of every number of turns (rows) at every frequency of the band (columns)
    z = np.abs(coil_impedance_line(band, L[:, None], srf[:, None],
                                   shield_resistance(band, d_mean, cable_od, turns[:, None])))
    z_least = z.min(axis=1)
    clears = srf >= srf_margin * f_band_high
    meets = clears & (z_least >= z_target)

    if meets.any():
        i = int(np.argmax(meets))
    elif clears.any():
        i = int(np.argmax(np.where(clears, z_least, -np.inf)))
    else:
        i = 0
    n_best = i + 1
    in_fit = (FIT_D_OVER_OD[0] <= d_mean / cable_od <= FIT_D_OVER_OD[1]
              and n_best * pitch / d_mean <= FIT_L_OVER_D and n_best <= FIT_TURNS)
    supported = bool(clears[i]) and in_fit and f_band_high <= _MAX_F_OVER_SRF * srf[i]

    warning = None
    if not in_fit:
        bigger = d_mean / cable_od < FIT_D_OVER_OD[0] or n_best * pitch / d_mean > FIT_L_OVER_D
        warning = (f"The coil's mean diameter is {d_mean / cable_od:.1f} x the cable's OD and its length "
                   f"{n_best * pitch / d_mean:.2f} x its diameter: outside the range the choke model was "
                   f"checked over with NEC-2 (diameter {FIT_D_OVER_OD[0]:g}-{FIT_D_OVER_OD[1]:g} x the OD, "
                   f"length up to {FIT_L_OVER_D:g} x the diameter), so no self-resonance or |Z| is given "
                   f"and the turns are a rough guide. Measure the choke's resonance with an antenna "
                   f"analyzer (common practice), or use a {'larger' if bigger else 'smaller'} form.")
    elif not clears.any():
        warning = (f"A coil of this coax cannot work as a choke here: even one turn on this form "
                   f"self-resonates at about {srf[0] / 1e6:.3g} MHz, "
                   + ("below the band" if srf[0] <= f_band_high else
                      f"less than {srf_margin:g} x the band's top edge")
                   + ", so a coil of it would not block the shield current. Use a quarter-wave "
                     "sleeve choke or ferrite sleeves over the coax at the tap instead of the coil "
                     "(common practice).")
    elif not meets.any():
        n_txt = f"{n_best} turn{'s' if i else ''}"
        if n_best == len(turns):     # still short at the most turns tried: more inductance needed
            advice = ("Wind it on a larger form, or add ferrite sleeves over the coax at the tap "
                      "(common practice).")
        elif f_band_high < 30e6:     # limited by the resonance: a smaller form lets more turns clear it
            advice = ("Use a smaller form (more turns then clear the resonance), or ferrite sleeves "
                      "over the coax at the tap (common practice).")
        else:                        # VHF/UHF: a coil of coax is not the tool
            advice = ("Use ferrite sleeves or a quarter-wave sleeve choke over the coax at the tap "
                      "instead (common practice).")
        warning = (f"A coil of this coax on this form cannot reach {z_target:.0f} ohm across the band: "
                   f"with its self-resonance {srf_margin:g} x above the band, the best is {n_txt} "
                   f"giving {z_least[i]:.0f} ohm at the band's low edge. " + advice)
    k_f0 = int(np.argmin(np.abs(band - f_design)))
    return ChokeDesign(turns=i + 1, form_diameter_m=float(form_od), mean_diameter_m=float(d_mean),
                       coil_length_m=float((i + 1) * pitch), inductance_h=float(L[i]),
                       capacitance_f=float(1.0 / ((2 * np.pi * srf[i]) ** 2 * L[i])),
                       self_resonance_hz=float(srf[i]) if in_fit else None,
                       impedance_ohm=float(z[i, k_f0]) if supported else None,
                       impedance_low_edge_ohm=float(z[i, 0]) if supported else None,
                       warning=warning)


# --- the quarter-wave sleeve choke (VHF/UHF) -----------------------------------------------------
#
# Where a coil of coax cannot be a choke (its self-resonance falls below the band), builders slide a
# conducting sleeve over the feed coax at the tap: a tube (or braid over a spacer) bonded to the coax
# braid at the end away from the antenna and open at the end toward it, an electrical quarter wave
# long. The coax's braid (inside) and the sleeve (outside) form a coaxial line shorted at the far end:
# at its open end it presents a high impedance to current on the outside of the braid (the common
# mode), as a shorted quarter-wave stub does (common practice; the "sleeve" or "bazooka" balun).
#
#     d_s    diameter over the coax's braid (under the jacket), m
#     OD     the coax's outer diameter (over the jacket), m
#     D      the sleeve's inner diameter, m (D >= OD; air between the jacket and the sleeve)
#     eps_j  relative permittivity of the jacket; tan_j its loss tangent


def sleeve_line(f, shield_d, cable_od, sleeve_id, jacket_eps, jacket_tan_delta, sigma=SIGMA_COPPER):
    """Characteristic impedance and propagation constant (complex arrays, ohm and 1/m) of the coaxial
    line formed by the coax's braid inside a sleeve, with the jacket and air between them in layers.

    Per unit length (Ramo, Whinnery & Van Duzer, coaxial line; layered dielectric as series
    capacitances; from memory): L' = mu0/(2 pi) ln(D/d_s); 1/C' = [ln(OD/d_s)/eps_j + ln(D/OD)]/(2 pi
    eps0); R' = Rs/(2 pi) (2/d_s + 2/D) (skin effect on both surfaces, smooth copper: braid loses
    more, so |Z| at resonance is an upper bound); G' = omega C' tan_eff, tan_eff = tan_j x the share
    of the electric energy in the jacket, ln(OD/d_s)/eps_j over the sum. Then Z0 = sqrt((R'+j omega
    L')/(G'+j omega C')), gamma = sqrt((R'+j omega L')(G'+j omega C')).
    """
    f = np.asarray(f, dtype=float)
    omega = 2 * np.pi * f
    jacket = np.log(cable_od / shield_d) / jacket_eps
    air = np.log(sleeve_id / cable_od)
    l_per = mu_0 / (2 * np.pi) * np.log(sleeve_id / shield_d)
    c_per = 2 * np.pi * epsilon_0 / (jacket + air)
    r_per = surface_resistance(f, sigma) / (2 * np.pi) * (2 / shield_d + 2 / sleeve_id)
    g_per = omega * c_per * jacket_tan_delta * jacket / (jacket + air)
    z = r_per + 1j * omega * l_per
    y = g_per + 1j * omega * c_per
    return np.sqrt(z / y), np.sqrt(z * y)


def sleeve_velocity_factor(shield_d, cable_od, sleeve_id, jacket_eps) -> float:
    """Velocity factor of the lossless sleeve line, 1/(c0 sqrt(L' C')): sqrt of [ln(OD/d_s)/eps_j +
    ln(D/OD)] over ln(D/d_s) (see sleeve_line)."""
    jacket = np.log(cable_od / shield_d) / jacket_eps
    return float(np.sqrt((jacket + np.log(sleeve_id / cable_od)) / np.log(sleeve_id / shield_d)))


@valueclass
class SleeveChoke:
    """A quarter-wave sleeve choke over the feed coax.

    sleeve_inner_diameter_m: D, m; shield_diameter_m: d_s, m; cable_od_m: OD, m; length_m: from the
    bonded (shorted) end to the open end, an electrical quarter wave at centre_hz; velocity_factor:
    of the sleeve line; z0_ohm: its characteristic impedance (lossless); impedance_ohm: |Z| at the
    open end at the design frequency; impedance_band_min_ohm: the least |Z| across the band;
    z_target: the target, ohm; meets_target: whether the least |Z| reaches it."""
    sleeve_inner_diameter_m: float
    shield_diameter_m: float
    cable_od_m: float
    length_m: float
    centre_hz: float
    velocity_factor: float
    z0_ohm: float
    impedance_ohm: float
    impedance_band_min_ohm: float
    z_target: float
    meets_target: bool


#: sleeve inner diameter over the coax's OD, tried smallest first (a tube a little over the coax up
#: to four times it): the smallest that reaches the target is taken, else the largest
SLEEVE_RATIOS = (1.5, 2.0, 2.5, 3.0, 4.0)


def design_sleeve_choke(f_design, f_band_low, f_band_high, cable_od, shield_d, jacket_eps,
                        jacket_tan_delta, z_target=1000.0, ratios=SLEEVE_RATIOS) -> SleeveChoke:
    """Size a quarter-wave sleeve choke: its length an electrical quarter wave of the sleeve line at
    the band's geometric centre (so both edges are equally far off resonance), its inner diameter
    the smallest of `ratios` x the coax's OD whose least |Z| across the band (open end, the line
    shorted a length away: Z = Z0 tanh(gamma l)) reaches z_target; else the largest ratio, with
    meets_target False. A wider sleeve raises Z0 and with it |Z| off resonance.

    f_design, f_band_low, f_band_high: Hz; cable_od, shield_d: m; jacket_eps, jacket_tan_delta:
    the jacket's dielectric; z_target: ohm.
    """
    if not 0 < f_band_low <= f_design <= f_band_high:
        raise ModelError(f"sleeve band must satisfy 0 < low edge <= design frequency <= high edge, "
                         f"got {f_band_low} Hz, {f_design} Hz, {f_band_high} Hz")
    if not 0 < shield_d < cable_od:
        raise ModelError(f"the braid's diameter {shield_d} m must be positive and under the cable's "
                         f"outer diameter {cable_od} m")
    centre = float(np.sqrt(f_band_low * f_band_high))
    band = union1d(np.linspace(f_band_low, f_band_high, _BAND_POINTS), [f_design])
    best = None
    for ratio in ratios:
        d_sleeve = ratio * cable_od
        vf = sleeve_velocity_factor(shield_d, cable_od, d_sleeve, jacket_eps)
        length = vf * C0 / (4 * centre)
        z0, gamma = sleeve_line(band, shield_d, cable_od, d_sleeve, jacket_eps, jacket_tan_delta)
        z = np.abs(z0 * np.tanh(gamma * length))
        k0 = int(np.argmin(np.abs(band - f_design)))
        z0_lossless = float(60.0 * np.log(d_sleeve / shield_d) * vf)   # sqrt(L'/C') = eta0 ln/(2 pi) x vf
        best = SleeveChoke(sleeve_inner_diameter_m=float(d_sleeve), shield_diameter_m=float(shield_d),
                           cable_od_m=float(cable_od), length_m=float(length), centre_hz=centre,
                           velocity_factor=vf, z0_ohm=z0_lossless, impedance_ohm=float(z[k0]),
                           impedance_band_min_ohm=float(z.min()), z_target=float(z_target),
                           meets_target=bool(z.min() >= z_target))
        if best.meets_target:
            break
    return best
