"""Compact transmission-line model of the whole antenna (radiator, stub, short, tap); owns the match,
the line solution, powers and sensitivities. No I/O, no design keys; line formulas live in lines.py,
wire-antenna formulas in radiator.py.

Picture (DESIGN.md §7, what NEC-2 shows). The radiator hangs on ONE conductor (A) of the stub's open
top; the other (B) ends there. With differential current I_d and common-mode current I_c on the stub,
I_A = I_d + I_c/2 and I_B = -I_d + I_c/2; B open at the top gives I_d = I_c/2, so the radiator current
is I_rad = I_A = 2 I_d. The radiator is driven by V_A minus the common-mode potential, V_d/2. So the
antenna port "radiator against the stub's common mode" (impedance z_ant) loads the differential line
with z_top = V_d/I_d = 4 z_ant. z_ant is an asymmetric dipole: arm 1 the radiator, arm 2 the stub's
common mode, a fat wire of equivalent radius sqrt(a D) ending at the short. Each arm is an open-ended
lossy line (Schelkunoff's transmission-line model of a wire antenna) whose series resistance carries
the arm's radiation resistance from the induced-EMF method (Carter 1932), so z_ant = z_arm1 + z_arm2.

Symbols (SI; frequency arrays broadcast):
    f, f0      frequency and design frequency, Hz;  k = 2 pi f/c, rad/m;  beta = k/vf, rad/m
    L          radiator length (junction to far-end attachment), m
    S          stub length (open top to the short's centre line), m
    T          tap distance (short's centre line to the tap), m
    D, a_s     stub spacing (centre to centre) and conductor radius, m;  a_eq = sqrt(a_s D)
    a_w        radiator wire radius, m;  vf_w radiator velocity factor (insulation; 1 bare)
    z0, gamma  characteristic impedance (ohm) and propagation constant (1/m) of a line or arm
    l_e        electrical length of an arm including its end effects, m
    z_top      differential load at the stub's open top (V_d/I_d), ohm
    z_ant      impedance of the radiator against the stub's common mode, ohm (z_top = 4 z_ant)
    R_loop     radiation resistance of an arm referred to its current maximum, ohm
    rho_g      ground reflection coefficient (radiator.ground_reflection)
    P          power, W (rms phasors throughout: V and I are rms)
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import NamedTuple

import numpy as np
from scipy.constants import c as C0
from scipy.optimize import brentq, root

from buildsheet.physics import radiator as rad
from buildsheet.physics.conductors import wire_internal_impedance
from buildsheet.physics.lines import Line, input_impedance

#: Each bar (short, tap) adds about a third of the spacing to the stub's electrical length
#: (DESIGN.md §7, NEC-2 studies of this antenna).
BAR_LENGTH_PER_SPACING = 1.0 / 3.0

#: Extra electrical length at the radiator's junction end, per metre of stub spacing: the open end of
#: conductor B beside the start of the radiator (junction effect; see DESIGN.md §7).
JUNCTION_LENGTH_PER_SPACING = 0.0

ORIENTATIONS = ("horizontal", "sloper", "vertical")
GROUND_KINDS = ("free-space", "perfect", "real")


@dataclass(frozen=True)
class Antenna:
    """Everything physical the model needs, SI. stub_line: the stub's line (differential mode);
    spacing: D, m; stub_conductor_d: 2 a_s, m; stub_sigma: S/m; wire_d: 2 a_w, m; wire_sigma: S/m;
    wire_vf: velocity factor of the (insulated) radiator wire, 1.0 bare; orientation: 'horizontal' |
    'sloper' | 'vertical'; height: horizontal/sloper the stub's open top above ground, vertical the
    short, m; slope: radiator angle below horizontal, rad (sloper only); ground_kind: 'free-space' |
    'perfect' | 'real'; ground_eps_r, ground_sigma (S/m): the real ground."""
    stub_line: Line
    spacing: float
    stub_conductor_d: float
    stub_sigma: float
    wire_d: float
    wire_sigma: float
    wire_vf: float = 1.0
    orientation: str = "horizontal"
    height: float = 10.0
    slope: float = 0.0
    ground_kind: str = "free-space"
    ground_eps_r: float = 13.0
    ground_sigma: float = 0.005

    def __post_init__(self):
        if self.orientation not in ORIENTATIONS:
            raise ValueError(f"orientation {self.orientation!r}: expected one of {ORIENTATIONS}")
        if self.ground_kind not in GROUND_KINDS:
            raise ValueError(f"ground_kind {self.ground_kind!r}: expected one of {GROUND_KINDS}")
        if not (self.spacing > self.stub_conductor_d > 0 and self.wire_d > 0):
            raise ValueError(f"need spacing > stub conductor diameter > 0 and wire diameter > 0, got "
                             f"{self.spacing}, {self.stub_conductor_d}, {self.wire_d} m")
        if not 0 < self.wire_vf <= 1:
            raise ValueError(f"wire velocity factor must be in (0, 1], got {self.wire_vf}")


@dataclass(frozen=True)
class _Arm:
    """One arm of the asymmetric dipole as an open-ended lossy line: series impedance per metre
    z_series = r_rad + z_wire + j omega L', shunt j omega C'; length l_e (m)."""
    z0: np.ndarray
    gamma: np.ndarray
    l_e: np.ndarray
    r_rad: np.ndarray      # radiation resistance per metre, ohm/m
    r_loss: np.ndarray     # conductor resistance per metre, ohm/m

    def impedance(self):
        """z0 coth(gamma l_e): input impedance of the open-ended arm, ohm."""
        return self.z0 / np.tanh(self.gamma * self.l_e)


def _quarter_wave(line: Line, f0: float) -> float:
    return float(C0 * line.velocity_factor(f0) / (4.0 * f0))


def _radiator_geometry(ant: Antenna, L: float, S: float):
    """Junction point and unit vector of the radiator (m), axes as the NEC harness: stub in the x-z
    plane, radiator along +x (horizontal/sloper) or +z (vertical)."""
    if ant.orientation == "vertical":
        return np.array([0.0, 0.0, ant.height + S]), np.array([0.0, 0.0, 1.0])
    psi = ant.slope if ant.orientation == "sloper" else 0.0
    return np.array([0.0, 0.0, ant.height]), np.array([np.cos(psi), 0.0, -np.sin(psi)])


def _image_impedance(f, ant: Antenna, L: float, S: float):
    """Mutual impedance of the radiator with its ground image, times the image factor -rho_g,
    referred to the loop current, ohm (image theory; Carter 1932 induced EMF). 0 in free space."""
    f = np.asarray(f, dtype=float)
    if ant.ground_kind == "free-space":
        return np.zeros_like(f, dtype=complex)
    p0, t = _radiator_geometry(ant, L, S)
    centre = p0 + t * L / 2
    mirror = np.array([1.0, 1.0, -1.0])
    rho_g = 1.0 if ant.ground_kind == "perfect" else rad.ground_reflection(f, ant.ground_eps_r,
                                                                          ant.ground_sigma)
    z12 = rad.mutual_impedance(centre, t, L / 2, centre * mirror, t * mirror, L / 2, rad.wavenumber(f))
    return -rho_g * z12


def _arm(f, length, radius, vf, z_wire, r_loop_of, extra_length, x_loop_add=0.0):
    """Open-ended lossy line for one arm (Schelkunoff's transmission-line model of a wire antenna).

    z0 = schelkunoff_z0(length, radius); beta = k/vf; end effect at the free end from the dipole
    resonance factor K (induced EMF with finite radius): (1 - K) lam_el/4 per end; extra_length (m)
    at the driven end; a reactance x_loop_add at the current maximum shifts the resonance like the
    dipole's d X_m/d(kl). The radiation resistance R_loop = r_loop_of(beta l_e) becomes a series
    resistance 2 R_loop/l_e, which radiates R_loop |I_max|^2 for a standing wave sin(beta (l_e - z)).
    """
    f = np.asarray(f, dtype=float)
    omega = 2 * np.pi * f
    k = rad.wavenumber(f)
    beta = k / vf
    ka = k * radius
    big_k = rad.resonance_factor(ka)
    end = (1.0 - big_k) * (np.pi / 2) / beta
    shift = -np.real(x_loop_add) / rad.loop_reactance_slope(np.pi * big_k, ka) / beta
    l_e = length + end + extra_length + shift
    r_loop = r_loop_of(beta * l_e)
    r_rad = 2.0 * r_loop / l_e
    z0_avg = rad.schelkunoff_z0(length, radius)
    l_per_m = z0_avg / (vf * C0)
    c_per_m = 1.0 / (z0_avg * vf * C0)
    z_series = r_rad + z_wire + 1j * omega * l_per_m
    y_shunt = 1j * omega * c_per_m
    return _Arm(np.sqrt(z_series / y_shunt), np.sqrt(z_series * y_shunt), l_e, r_rad, np.real(z_wire))


def _arms(f, L: float, S: float, ant: Antenna):
    """(radiator arm, common-mode arm) at frequencies f for radiator L and stub S (m)."""
    f = np.asarray(f, dtype=float)
    a_w = ant.wire_d / 2
    z_img = _image_impedance(f, ant, L, S)
    k = rad.wavenumber(f)
    ka_w = k * a_w
    # end effect of the free far end plus the same at the junction end, plus the junction effect
    junction = JUNCTION_LENGTH_PER_SPACING * ant.spacing + \
        (1.0 - rad.resonance_factor(ka_w)) * (np.pi / 2) / (k / ant.wire_vf)
    arm_r = _arm(f, L, a_w, ant.wire_vf, wire_internal_impedance(f, ant.wire_d, ant.wire_sigma),
                 lambda kl: rad.loop_radiation_resistance(kl) + np.real(z_img), junction,
                 np.imag(z_img))
    a_eq = np.sqrt(ant.stub_conductor_d / 2 * ant.spacing)
    # common mode: both conductors in parallel; its field is mostly in air (vf 1); a quarter-wave
    # arm radiates half a half-wave dipole's loop resistance
    z_cm_wire = wire_internal_impedance(f, ant.stub_conductor_d, ant.stub_sigma) / 2
    arm_c = _arm(f, S, a_eq, 1.0, z_cm_wire, lambda kl: rad.loop_radiation_resistance(2 * kl) / 2, 0.0)
    return arm_r, arm_c


def radiator_end_impedance(f, length, ant: Antenna, stub_length: float | None = None) -> np.ndarray:
    """z_top = 4 z_ant: the differential load (V_d/I_d) that the stub's open top sees, ohm.

    f: Hz (array); length: radiator L, m; stub_length: S, m, the common-mode arm (default: a
    quarter wave of the stub line at the mean of f). See the module docstring for the picture.
    """
    f = np.asarray(f, dtype=float)
    S = _quarter_wave(ant.stub_line, float(np.mean(f))) if stub_length is None else stub_length
    arm_r, arm_c = _arms(f, length, S, ant)
    return 4.0 * (arm_r.impedance() + arm_c.impedance())


def resonant_radiator_length(f0: float, ant: Antenna, stub_length: float | None = None) -> float:
    """Radiator length L (m) whose end impedance z_top is purely resistive at f0 (Hz), at the
    high-impedance (anti-)resonance near half an electrical wavelength. Raises ValueError if none."""
    lam_el = C0 * ant.wire_vf / f0
    g = lambda L: float(np.imag(radiator_end_impedance(np.array([f0]), L, ant, stub_length))[0])
    lo, hi = 0.40 * lam_el, 0.52 * lam_el
    # X falls through zero at the anti-resonance (inductive below, capacitive above)
    grid = np.linspace(lo, hi, 25)
    x = np.array([g(L) for L in grid])
    idx = np.nonzero((x[:-1] > 0) & (x[1:] <= 0))[0]
    if len(idx) == 0:
        raise ValueError(f"no radiator length in {lo:.3f}..{hi:.3f} m is resonant at {f0:.6g} Hz")
    i = idx[np.argmax(np.abs(x[idx]) + np.abs(x[idx + 1]))]
    return float(brentq(g, grid[i], grid[i + 1], xtol=1e-7))


def _tap_bar_impedance(f, ant: Antenna):
    """Series reactance of the tap bar in which the feed sits: its inductance, the line's L' times
    BAR_LENGTH_PER_SPACING * D, ohm."""
    return 2j * np.pi * np.asarray(f, dtype=float) * ant.stub_line.L * BAR_LENGTH_PER_SPACING * ant.spacing


def _sections(f, ant: Antenna, L, S, T):
    """Lower (shorted) section length, upper section length and z_top for the stub."""
    lower = T + BAR_LENGTH_PER_SPACING * ant.spacing
    return lower, S - T, radiator_end_impedance(f, L, ant, S)


def feed_impedance(f, ant: Antenna, radiator_length, stub_length, tap_length) -> np.ndarray:
    """Impedance at the feed on the tap bar, ohm, vectorised over f (Hz): the tap bar's series
    reactance plus the shorted lower section (tap + short bar) in parallel with the upper section
    (stub - tap) loaded by z_top = 4 z_ant (DESIGN.md §7 tap model). Lengths in m."""
    f = np.asarray(f, dtype=float)
    line = ant.stub_line
    lower, upper, z_top = _sections(f, ant, radiator_length, stub_length, tap_length)
    z_low = input_impedance(line, f, lower, 0.0)
    z_up = input_impedance(line, f, upper, z_top)
    return _tap_bar_impedance(f, ant) + 1.0 / (1.0 / z_low + 1.0 / z_up)


def solve_match(f0: float, z_feed: float, ant: Antenna, radiator_length: float,
                max_iter: int = 60) -> tuple[float, float]:
    """Stub and tap lengths (S, T) in m so that the feed sees z_feed + j0 ohm at f0 (Hz): a 2-D
    root (scipy.optimize.root, hybrid Powell, bounded evaluations) started from the quarter wave and
    the textbook tap sin^2(beta T) = z_feed/R_top. Raises ValueError if no solution is found."""
    line = ant.stub_line
    f = np.array([float(f0)])
    beta = float(line.gamma(f0).imag)
    s0 = _quarter_wave(line, f0) - BAR_LENGTH_PER_SPACING * ant.spacing
    r_top = float(np.real(radiator_end_impedance(f, radiator_length, ant, s0))[0])
    if not r_top > z_feed:
        raise ValueError(f"end impedance {r_top:.0f} ohm is not above the feed impedance {z_feed} ohm")
    t0 = float(np.arcsin(np.sqrt(z_feed / r_top)) / beta)

    def resid(x):
        z = feed_impedance(f, ant, radiator_length, x[0], x[1])[0]
        return [z.real / z_feed - 1.0, z.imag / z_feed]

    sol = root(resid, [s0, t0], method="hybr", options={"maxfev": max_iter, "xtol": 1e-10})
    S, T = (float(v) for v in sol.x)
    if not (sol.success or np.max(np.abs(resid(sol.x))) < 1e-6) or not 0 < T < S:
        raise ValueError(f"no stub/tap match for {z_feed} ohm at {f0:.6g} Hz "
                         f"(last try stub {S:.4f} m, tap {T:.4f} m: {sol.message})")
    return S, T


def _int_abs2(A, B, gamma, l):
    """Integral over 0..l of |A e^{gamma z} + B e^{-gamma z}|^2 dz, exact (for the I^2 R and V^2 G
    integrals of a line section)."""
    alpha, beta = np.real(gamma), np.imag(gamma)
    two_a = 2 * alpha * l
    grow = np.where(np.abs(two_a) > 1e-12, np.expm1(two_a) / np.where(alpha == 0, 1, 2 * alpha), l)
    decay = np.where(np.abs(two_a) > 1e-12, -np.expm1(-two_a) / np.where(alpha == 0, 1, 2 * alpha), l)
    cross = np.where(np.abs(beta * l) > 1e-12,
                     np.expm1(2j * beta * l) / np.where(beta == 0, 1, 2j * beta), l)
    return np.abs(A) ** 2 * grow + np.abs(B) ** 2 * decay + 2 * np.real(A * np.conj(B) * cross)


def _section_loss(z_series, y_shunt, z0, gamma, l, v_end, i_end):
    """Power (W) dissipated in a line section of length l (m) with V, I (rms) given at its end z = 0,
    I flowing toward that end: integral of Re(Z')|I|^2 + Re(Y')|V|^2 (telegrapher's equations)."""
    a = (i_end + v_end / z0) / 2
    b = (i_end - v_end / z0) / 2
    p_r = np.real(z_series) * _int_abs2(a, b, gamma, l)
    # V(z) = z0 (a e^{gz} - b e^{-gz})
    p_g = np.real(y_shunt) * np.abs(z0) ** 2 * _int_abs2(a, -b, gamma, l)
    return p_r + p_g, p_r, p_g


@dataclass(frozen=True)
class State:
    """Voltages (V rms), currents (A rms) and powers (W) at f0 for a given power delivered to the tap.

    v_open_end: across the stub conductors at the open top; v_radiator_end: at the radiator's far end
    (arm voltage of the line model); i_short: differential current through the short;
    p_delivered: power into the feed; p_radiated: radiation from the radiator and the stub's common
    mode (each arm's R' |I|^2 integrated along it); p_stub_conductor, p_stub_dielectric: the stub's
    differential line plus the common-mode current in the stub conductors; p_wire: radiator wire;
    efficiency = p_radiated / p_delivered; balance_error = |delivered - radiated - losses| / delivered
    (all terms computed independently: a real check)."""
    v_open_end: float
    v_radiator_end: float
    i_short: float
    p_delivered: float
    p_radiated: float
    p_stub_conductor: float
    p_stub_dielectric: float
    p_wire: float
    efficiency: float
    balance_error: float


def state_at(f0: float, ant: Antenna, radiator_length: float, stub_length: float, tap_length: float,
             power_w: float) -> State:
    """Line solution at f0 (Hz) with power_w (W) delivered to the feed: voltages, currents, every
    power term integrated along the structure (rms phasors). Lengths in m."""
    f = np.array([float(f0)])
    line = ant.stub_line
    L, S, T = radiator_length, stub_length, tap_length
    lower, upper, z_top = _sections(f, ant, L, S, T)
    z_low = input_impedance(line, f, lower, 0.0)
    z_up = input_impedance(line, f, upper, z_top)
    z_in = feed_impedance(f, ant, L, S, T)
    i_in = np.sqrt(power_w / np.real(z_in))              # reference phase: feed current real
    v_tap = i_in * (z_in - _tap_bar_impedance(f, ant))
    z0, gamma = line.z0(f), line.gamma(f)
    zs, ys = line.series_impedance(f), line.shunt_admittance(f)
    # upper section: from V_tap find the top's V and I (open-top load z_top)
    gl = gamma * upper
    v_top = v_tap / (np.cosh(gl) + z0 / z_top * np.sinh(gl))
    i_top = v_top / z_top
    p_up, pr_up, pg_up = _section_loss(zs, ys, z0, gamma, upper, v_top, i_top)
    # lower section: shorted end, V = 0; current at the short from the tap voltage
    i_short = v_tap / (z0 * np.sinh(gamma * lower))
    p_low, pr_low, pg_low = _section_loss(zs, ys, z0, gamma, lower, 0.0 * v_tap, i_short)
    # antenna port: I_rad = 2 I_d through both arms in series
    arm_r, arm_c = _arms(f, L, S, ant)
    i_rad = 2 * i_top
    p_rad = 0.0
    p_wire = p_cm_cond = 0.0
    v_far = None
    for arm, which in ((arm_r, "r"), (arm_c, "c")):
        v_arm = i_rad * arm.impedance()
        v_end = v_arm / np.cosh(arm.gamma * arm.l_e)        # open end, I = 0
        i2 = _int_abs2(v_end / arm.z0 / 2, -v_end / arm.z0 / 2, arm.gamma, arm.l_e)
        p_rad = p_rad + arm.r_rad * i2
        if which == "r":
            p_wire = arm.r_loss * i2
            v_far = v_end
        else:
            p_cm_cond = arm.r_loss * i2
    p_in = float(np.real(v_tap * np.conj(i_in))[0])
    p_cond = float((pr_up + pr_low + p_cm_cond)[0])
    p_diel = float((pg_up + pg_low)[0])
    p_rad = float(p_rad[0])
    p_wire = float(p_wire[0])
    balance = abs(p_in - (p_rad + p_cond + p_diel + p_wire)) / p_in
    return State(v_open_end=float(np.abs(v_top)[0]), v_radiator_end=float(np.abs(v_far)[0]),
                 i_short=float(np.abs(i_short)[0]), p_delivered=p_in, p_radiated=p_rad,
                 p_stub_conductor=p_cond, p_stub_dielectric=p_diel, p_wire=p_wire,
                 efficiency=p_rad / p_in, balance_error=float(balance))


class Sensitivities(NamedTuple):
    """Tuning derivatives (DESIGN.md §5 signs: positive = toward the open top).
    hz_per_m_radiator: shift of the radiator's resonance (z_top resistive) per metre added to it;
    ohm_per_m_tap: d R_feed / d tap (tap moved up); ohm_per_m_short: d X_feed / d (short moved up,
    the tap clamp left in place, so stub and tap both shorten)."""
    hz_per_m_radiator: float
    ohm_per_m_tap: float
    ohm_per_m_short: float


def sensitivities(f0: float, ant: Antenna, radiator_length: float, stub_length: float,
                  tap_length: float) -> Sensitivities:
    """Central-difference derivatives of the model at f0 (Hz); lengths in m."""
    L, S, T = radiator_length, stub_length, tap_length
    f = np.array([float(f0)])
    dl = 1e-4 * L
    df = 1e-5 * f0
    x_top = lambda L_, f_: float(np.imag(radiator_end_impedance(np.array([f_]), L_, ant, S))[0])
    dx_dl = (x_top(L + dl, f0) - x_top(L - dl, f0)) / (2 * dl)
    dx_df = (x_top(L, f0 + df) - x_top(L, f0 - df)) / (2 * df)
    hz_per_m = -dx_dl / dx_df
    dt = 1e-4 * S
    zf = lambda S_, T_: feed_impedance(f, ant, L, S_, T_)[0]
    ohm_tap = (zf(S, T + dt).real - zf(S, T - dt).real) / (2 * dt)
    ohm_short = (zf(S - dt, T - dt).imag - zf(S + dt, T + dt).imag) / (2 * dt)
    return Sensitivities(float(hz_per_m), float(ohm_tap), float(ohm_short))
