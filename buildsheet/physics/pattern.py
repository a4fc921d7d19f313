"""Far field, radiated power and ground loss of straight wires with given currents; owns radiation
patterns and the ground-loss fraction only: no I/O, no design keys, nothing about the line model
(jpole.py decides the currents, this module radiates them).

Picture. Each wire is a straight filament carrying a given current (phasor, rms amperes). The
standing-wave form the antenna model uses is a sinusoid open at the far end,

    I(s) = I_m sin k(l - s),   0 <= s <= l,   flowing along the wire's direction,

(the induced-EMF assumption of Carter 1932); a wire with sampled segment currents (NEC-2's) can be
radiated too, for checks. The ground is the plane z = 0 with complex permittivity
eps_c = eps_r - j sigma/(omega eps0).

Far field (free space: Stratton, Electromagnetic Theory 1941, the radiation vector; Balanis,
Antenna Theory, ch. 12):

    E(r) = -j (eta0 k / 4 pi) (e^{-jkr}/r) [N - r_hat (r_hat . N)],  N(k_vec) = integral J(r') e^{j k_vec . r'} dV'

Over ground, the space wave at elevation psi = 90 deg - theta is the direct field plus the field of
the perfect-ground image (horizontal currents reversed, vertical kept) weighted by the plane-wave
Fresnel coefficients of the ground at that angle, R_v (theta component, TM) and -R_h (phi
component, TE; both 1 over perfect ground). This is the asymptotic far field of a source over a
half-space (Sommerfeld 1909; Norton 1937: the space wave; the surface wave decays faster than 1/r
and carries no power to infinity over lossy ground) and is what NEC-2 computes for its RP card over
a ground of GN 0 or GN 2 (Burke & Poggio, NEC-2 manual part I, sec. "radiated fields"):

    R_v = (eps_c cos th - sqrt(eps_c - sin^2 th)) / (eps_c cos th + sqrt(eps_c - sin^2 th))
    R_h = (cos th - sqrt(eps_c - sin^2 th)) / (cos th + sqrt(eps_c - sin^2 th))

Radiated power P = integral |E|^2/eta0 r^2 dOmega (rms) over the sphere (free space) or the upper
hemisphere (over ground); directive gain 4 pi r^2 |E|^2 / (eta0 P_in).

Power the currents put into the field, P_field = -Re integral E . J* dV (rms; the induced-EMF
power of Carter 1932, i.e. Re of sum I_i* I_j Z_ij with the self and mutual impedances, including
the ground's reflected field). Over ground the reflected field is written as Sommerfeld's
plane-wave (Weyl) spectrum: every plane wave of the source's spectrum, propagating or evanescent,
reflects with the Fresnel coefficient of its own transverse wavenumber k_rho,

    R_TE = (k_z - k_z2)/(k_z + k_z2),   R_TM = (eps_c k_z - k_z2)/(eps_c k_z + k_z2)   (H-field),
    k_z = sqrt(k^2 - k_rho^2),  k_z2 = sqrt(eps_c k^2 - k_rho^2)   (Im <= 0)

(Sommerfeld 1909; Banos, Dipole Radiation in the Presence of a Conducting Half-Space, 1966; Chew,
Waves and Fields in Inhomogeneous Media, ch. 2). This is the image method made exact: over
perfect ground R_TE = -1, R_TM = 1 for every k_rho and the sum is the image's mutual impedance
(P_field = R11 - R12(2h) for a horizontal half-wave, CHECK_VALUES §3c). Over real ground the
image is weighted plane wave by plane wave, not by one coefficient, so the near field's coupling
into the ground (the evanescent waves, k_rho > k, which carry the loss of a low antenna and which
a single normal-incidence coefficient gets wrong) is included: it is the same physics as NEC-2's
GN 2 (Sommerfeld-Norton) for the given currents. (A horizontal half-wave 0.1 lambda over average
ground: eta_ground 0.380 here, 0.382 from NEC-2 GN 2; the image weighted by the one normal-incidence
coefficient of radiator.ground_reflection gives 0.47, NEC-2's GN 0 0.44; from 0.25 lambda up all
agree within 0.01. tests/test_pattern.py.) With the spectrum N^- = N(k_rho, -k_z) of the
downward waves, s_hat = z_hat x rho_hat and p^- = (k_z rho_hat + k_rho z_hat)/k:

    P_field = P_free + P_refl,prop + P_refl,evan
    P_refl,prop = (eta0 k^2/8 pi^2) Re  integral_0^{pi/2} sin th dth integral dalpha
                                      [R_TE (N^- . s)(N^+ . s)* + R_TM (N^- . p^-)(N^+ . p^+)*]
    P_refl,evan = -(eta0 k/8 pi^2) integral_0^inf dkappa integral dalpha
                                      Im[R_TE |N^- . s|^2 + R_TM |N^- . p^-|^2],   kappa = |k_z|

with P_free the free-space power (the Poynting flux over the whole sphere, equal to the induced-EMF
resistance by Carter's theorem; tested against 73.13 ohm). So P_ground = P_field - P_upper and
eta_ground = P_upper / P_field. Energy bookkeeping (tested): P_ground equals the power of the
downward plane waves that the ground does not reflect, integral (1 - |R|^2) |E_image|^2, plus the
evanescent term; over perfect ground it is 0 and eta_ground = 1.

What this cannot know: how the currents themselves change over the ground (that is the antenna
model's business, jpole.py), and the surface wave's share at grazing angles, which counts as
ground loss here as it does in NEC-2's power budget (its RP card sees only the space wave).

Quadrature (fixed, for speed: a J-pole's two wires cost a few ms): Gauss-Legendre in theta (the
upper hemisphere split at 60 deg, where the Fresnel coefficients vary fast near grazing), the
trapezoid rule in azimuth (exact for the trigonometric polynomials the far field is in phi), and
Gauss-Legendre in kappa up to where e^{-2 kappa z_min} has fallen below e^{-24}.

Use by the antenna model (jpole.state_at). The currents are the line model's two arms, radiator
and stub common mode, each as the standing wave of its open-ended line (open_line_wire), driven by
the radiator current i_rad at the junction (the common mode flows up the stub into the radiator, so
along its wire, which points down from the open top, it is -i_rad):

    arm_r, arm_c = prep.arms(L, S, junction=False)     # the radiator's own arm: its current
    p0, t = _radiator_geometry(ant, L, S)
    wires = [pattern.open_line_wire(p0, t, L, i_rad, arm_r.gamma, arm_r.l_e),
             pattern.open_line_wire(p0 - (D/2, 0, 0), (0, 0, -1), S, -i_rad, arm_c.gamma, arm_c.l_e)]
    pw = pattern.powers(wires, f0, ground_kind, eps_r, sigma)
    p_space = p_radiated * pw.eta_ground;  p_ground = p_radiated * (1 - pw.eta_ground)
    efficiency = p_space / p_delivered
    pat = pattern.pattern(wires, f0, ground_kind, eps_r, sigma, p_in=pw.p_field * p_delivered / p_radiated)

eta_ground and the gains depend only on the two currents' ratio, not their scale. Measured against
NEC-2 GN 2 on seven J-poles (bench/ground_loss.py): eta_ground within 0.008 of NEC-2's once NEC-2's
own free-space energy balance is divided out; maximum gain within 0.6 dB, take-off within 0.6 deg.

Symbols (SI; rms phasors):
    f, k, eta0   frequency (Hz), wavenumber 2 pi f/c (rad/m), free-space wave impedance (ohm)
    theta, phi   polar angle from the zenith and azimuth from +x, rad; elevation = 90 deg - theta
    I_m          loop current: the amplitude of the sinusoid, A rms
    N            radiation vector (the current's spatial Fourier transform), A m
    eps_c        complex relative permittivity of the ground
    P            power, W;  eta_ground = P_upper / P_field
"""

from __future__ import annotations


import numpy as np

from buildsheet.physics import ModelError
from buildsheet.physics.constants import C0, epsilon_0
from buildsheet.physics.quadrature import gauss_legendre
from buildsheet.physics.radiator import ETA0, wavenumber
from buildsheet.valueclass import valueclass

GROUND_KINDS = ("free-space", "perfect", "real")


@valueclass
class Wire:
    """A straight wire with a standing-wave current, open at its far end.

    start: (x, y, z) of its start, m; direction: unit vector along it; length: l, m;
    loop_current: I_m, A rms, complex. The current flowing along `direction` at distance s from the
    start is I_m sin k(l - s): zero at the far (open) end, I_m a quarter wave from it.

    gamma, open_length (optional): the standing wave of an open-ended lossy line instead,
    I(s) = -j I_m sinh(gamma (l_o - s)) on 0 <= s <= l, with propagation constant gamma (1/m,
    complex, alpha + j beta) and its open end at l_o = open_length (m; default l), as the antenna
    model's arms carry it (its electrical length l_o includes the end effect, so the current at the
    wire's physical end need not vanish). gamma = jk and l_o = l give the sinusoid above."""
    start: tuple[float, float, float]
    direction: tuple[float, float, float]
    length: float
    loop_current: complex
    gamma: complex | None = None
    open_length: float | None = None


@valueclass
class SampledWire:
    """A straight wire with piecewise-constant segment currents (as NEC-2 reports them).

    start, direction as Wire; centres: segment centres as distances from start, m; seglens: segment
    lengths, m; currents: segment currents along `direction`, A rms (complex arrays)."""
    start: tuple[float, float, float]
    direction: tuple[float, float, float]
    centres: tuple[float, ...]
    seglens: tuple[float, ...]
    currents: tuple[complex, ...]


def open_line_wire(start, direction, length: float, i_in: complex, gamma: complex,
                   l_e: float) -> Wire:
    """The Wire of an arm modelled as an open-ended lossy line (jpole's arms): current i_in (A rms)
    flowing into the arm at its start along `direction`, propagation constant gamma (1/m) and
    electrical length l_e (m, the open end), on the physical wire of `length` (m):
    I(s) = i_in sinh(gamma (l_e - s)) / sinh(gamma l_e), i.e. loop current I_m = j i_in / sinh(gamma l_e)."""
    return Wire(tuple(float(x) for x in start), tuple(float(x) for x in direction), float(length),
                1j * complex(i_in) / np.sinh(complex(gamma) * l_e), complex(gamma), float(l_e))


@valueclass
class Pattern:
    """The far-field pattern over the ground (angles in degrees, gains in dBi relative to the power
    the gains refer to): max_gain_dbi, takeoff_deg (the elevation of the maximum, above the horizon;
    over ground 0..90, in free space -90..90), azimuth_deg (the maximum's azimuth, from +x toward
    +y); elevation_deg and elevation_gain_dbi, the elevation cut in the vertical plane through the
    maximum, from 0 (the horizon toward the maximum) over the zenith to 180 (the opposite horizon),
    -90..270 in free space; azimuth_cut_deg and azimuth_gain_dbi, the azimuth cut at the take-off
    elevation, 0..360; efficiency, the factor from directivity to gain (the space wave's power over
    the power the gains refer to); ground_kind. Found by pattern_of (see there)."""
    max_gain_dbi: float
    takeoff_deg: float
    azimuth_deg: float
    elevation_deg: np.ndarray
    elevation_gain_dbi: np.ndarray
    azimuth_cut_deg: np.ndarray
    azimuth_gain_dbi: np.ndarray
    efficiency: float
    ground_kind: str


def _check_ground(ground_kind: str):
    if ground_kind not in GROUND_KINDS:
        raise ModelError(f"ground_kind {ground_kind!r}: expected one of {GROUND_KINDS}")


def _eps_c(f: float, eps_r: float, sigma: float) -> complex:
    """Complex relative permittivity eps_r - j sigma/(omega eps0) of the ground."""
    return complex(eps_r, -sigma / (2 * np.pi * f * epsilon_0))


def _geometry(wires):
    """Per wire: start (shifted so the centre of the wires' horizontal extent is at the origin: the
    powers do not depend on a horizontal shift, and the spectrum's phases stay small), unit
    direction, length; the largest horizontal distance of any wire end from that centre, m; the
    lowest z, m."""
    pts = []
    for w in wires:
        p0, t = np.asarray(w.start, dtype=float), np.asarray(w.direction, dtype=float)
        t = t / np.linalg.norm(t)
        l = w.length if isinstance(w, Wire) else float(np.sum(w.seglens))
        pts.append((p0, t, l))
    ends = np.array([p for p0, t, l in pts for p in (p0, p0 + l * t)])
    centre = np.array([(ends[:, 0].min() + ends[:, 0].max()) / 2,
                       (ends[:, 1].min() + ends[:, 1].max()) / 2, 0.0])
    extent = float(np.max(np.hypot(ends[:, 0] - centre[0], ends[:, 1] - centre[1])))
    z_min = float(ends[:, 2].min())
    return [(p0 - centre, t, l) for p0, t, l in pts], extent, z_min


def _sinusoid_transform(q, k, l):
    """integral_0^l sin k(l - s) e^{j q s} ds for complex q (closed form; the removable
    singularity at q^2 = k^2 taken as the mean of q +- 1e-3 k, error ~1e-6 relative)."""
    def closed(q):
        return (-1j * q * np.sin(k * l) - k * np.cos(k * l) + k * np.exp(1j * q * l)) / (k * k - q * q)
    return _removable(closed, q, k * k - q * q, k)


def _line_transform(q, gamma, l, l_o, k):
    """integral_0^l -j sinh(gamma (l_o - s)) e^{j q s} ds for complex q (closed form; the removable
    singularities at j q = +-gamma as in _sinusoid_transform)."""
    def closed(q):
        jq = 1j * q
        e = np.exp(jq * l)
        up = np.exp(gamma * l_o) * (e * np.exp(-gamma * l) - 1) / (jq - gamma)
        down = np.exp(-gamma * l_o) * (e * np.exp(gamma * l) - 1) / (jq + gamma)
        return -0.5j * (up - down)
    return _removable(closed, q, (gamma - 1j * q) * (gamma + 1j * q), k)


def _removable(closed, q, denominator, k):
    """closed(q), with the points where `denominator` nearly vanishes (relative to k^2) taken as
    the mean of closed(q +- 1e-3 k): the singularity there is removable."""
    near = np.abs(denominator) < 1e-4 * k * k
    if not np.any(near):
        return closed(q)
    d = 1e-3 * k
    out = closed(np.where(near, q + 10 * d, q))
    out[near] = 0.5 * (closed(q[near] + d) + closed(q[near] - d))
    return out


def _sampled_transform(q, centres, seglens, currents):
    """sum_i I_i integral over segment i of e^{j q s} ds (piecewise-constant current)."""
    x = q[..., None] * (seglens / 2)
    small = np.abs(x) < 1e-4
    sinc = np.where(small, 1 - x * x / 6, np.sin(np.where(small, 1.0, x)) / np.where(small, 1.0, x))
    return np.add.reduce(currents * seglens * sinc * np.exp(1j * q[..., None] * centres), axis=-1)


def _radiation_vector(wires, geo, kvec, k):
    """N(kvec) = integral J(r') e^{j kvec . r'} dV', A m, for complex wave vectors kvec (..., 3)."""
    n = np.zeros(kvec.shape, dtype=complex)
    for w, (p0, t, l) in zip(wires, geo):
        q = kvec @ t
        phase = np.exp(1j * (kvec @ p0))
        if isinstance(w, Wire):
            if w.gamma is None and w.open_length is None:
                s = complex(w.loop_current) * _sinusoid_transform(q, k, l)
            else:
                gamma = 1j * k if w.gamma is None else complex(w.gamma)
                l_o = l if w.open_length is None else float(w.open_length)
                s = complex(w.loop_current) * _line_transform(q, gamma, l, l_o, k)
        else:
            s = _sampled_transform(q, np.asarray(w.centres, dtype=float),
                                   np.asarray(w.seglens, dtype=float), np.asarray(w.currents, dtype=complex))
        n = n + (phase * s)[..., None] * t
    return n


def _fresnel_far(cos_th, eps_c):
    """(R_v, R_h) of the ground for the space wave at polar angle theta (cos_th = sin(elevation))."""
    root = np.sqrt(eps_c - (1 - cos_th ** 2))
    r_v = (eps_c * cos_th - root) / (eps_c * cos_th + root)
    r_h = (cos_th - root) / (cos_th + root)
    return r_v, r_h


def _ground_factors(ground_kind, cos_th, eps_c):
    if ground_kind == "perfect":
        one = np.ones_like(cos_th)
        return one, -one
    return _fresnel_far(cos_th, eps_c)


def _unit_vectors(theta, phi):
    st, ct, sp, cp = np.sin(theta), np.cos(theta), np.sin(phi), np.cos(phi)
    r_hat = np.stack([st * cp, st * sp, ct], axis=-1)
    th_hat = np.stack([ct * cp, ct * sp, -st], axis=-1)
    ph_hat = np.stack([-sp, cp, np.zeros_like(phi)], axis=-1)
    return r_hat, th_hat, ph_hat


_MIRROR = np.array([1.0, 1.0, -1.0])


def _fields(wires, geo, k, theta, phi, ground_kind, eps_c):
    """(E_theta, E_phi) times r e^{jkr}, V rms, at directions (theta, phi) (broadcast arrays);
    over ground only theta <= pi/2 is meaningful. Also returns N^+ and N^- (the radiation vector
    toward the direction and toward its mirror image below the horizon)."""
    r_hat, th_hat, ph_hat = _unit_vectors(theta, phi)
    n_up = _radiation_vector(wires, geo, k * r_hat, k)
    c = -1j * ETA0 * k / (4 * np.pi)
    e_th = c * np.sum(n_up * th_hat, axis=-1)
    e_ph = c * np.sum(n_up * ph_hat, axis=-1)
    if ground_kind == "free-space":
        return e_th, e_ph, n_up, None
    n_dn = _radiation_vector(wires, geo, k * r_hat * _MIRROR, k)
    r_v, r_h = _ground_factors(ground_kind, np.cos(theta), eps_c)
    # the perfect-ground image radiates -M N^- (M: mirror in z); weighted by R_v and -R_h
    e_th = e_th - c * r_v * np.sum(n_dn * (th_hat * _MIRROR), axis=-1)
    e_ph = e_ph + c * r_h * np.sum(n_dn * ph_hat, axis=-1)
    return e_th, e_ph, n_up, n_dn


def far_field(wires, f: float, theta, phi, ground_kind: str = "free-space", eps_r: float = 13.0,
              sigma: float = 0.005):
    """(E_theta, E_phi): the far field times r e^{jkr}, V rms, at polar angle theta and azimuth phi
    (rad, broadcast arrays; over ground theta <= pi/2). wires: Wire or SampledWire; f: Hz;
    ground_kind 'free-space' | 'perfect' | 'real' with eps_r, sigma (S/m)."""
    _check_ground(ground_kind)
    geo, _, _ = _geometry(wires)
    theta, phi = np.broadcast_arrays(np.asarray(theta, dtype=float), np.asarray(phi, dtype=float))
    e_th, e_ph, _, _ = _fields(wires, geo, wavenumber(float(f)), theta, phi, ground_kind,
                               _eps_c(f, eps_r, sigma))
    return e_th, e_ph


# Gauss-Legendre nodes on [0, 1] for the polar angle and for kappa (the stored rules of quadrature.py)
def _gl01(n):
    x, w = gauss_legendre(n)
    return (x + 1) / 2, w / 2


_TH_LOW = _gl01(24)     # theta in [0, 60 deg]
_TH_HIGH = _gl01(32)    # theta in [60, 90 deg]: grazing, where the Fresnel coefficients turn fast
_KAPPA = _gl01(32)      # kappa: each of [0, kappa_b] and [kappa_b, kappa_max]


def _theta_nodes():
    """Gauss-Legendre nodes and weights (sin theta included) over the upper hemisphere."""
    a, b = np.pi / 3, np.pi / 2
    th = np.concatenate([a * _TH_LOW[0], a + (b - a) * _TH_HIGH[0]])
    w = np.concatenate([a * _TH_LOW[1], (b - a) * _TH_HIGH[1]]) * np.sin(th)
    return th, w


def _n_azimuth(k_rho_max, extent):
    """Trapezoid points in azimuth: exact for e^{j m alpha} up to |m| ~ k_rho extent, plus margin."""
    return int(2 * np.ceil(k_rho_max * extent + 12))


@valueclass
class Powers:
    """Powers of the given currents, W (rms): p_free, the free-space radiated power (whole sphere);
    p_upper, the space wave over the upper hemisphere (= p_free in free space); p_field, the power
    the currents put into the field, including the ground's reflected field; p_refl_prop and
    p_refl_evan, its propagating and evanescent parts of the reflection; p_transmitted, the power of
    the downward plane waves the ground does not reflect (a check: p_field - p_upper =
    p_transmitted + p_refl_evan); eta_ground = p_upper / p_field."""
    p_free: float
    p_upper: float
    p_field: float
    p_refl_prop: float
    p_refl_evan: float
    p_transmitted: float
    eta_ground: float


def powers(wires, f: float, ground_kind: str = "free-space", eps_r: float = 13.0,
           sigma: float = 0.005) -> Powers:
    """Radiated and field powers of the wires' currents at f (Hz) over the ground (see the module
    docstring for the method and its sources). Returns Powers."""
    _check_ground(ground_kind)
    f = float(f)
    k = wavenumber(f)
    eps_c = _eps_c(f, eps_r, sigma)
    geo, extent, z_min = _geometry(wires)
    if ground_kind != "free-space" and z_min <= 0:
        raise ModelError(f"a wire reaches z = {z_min:.4g} m: the wires must stay above the ground")
    th, w_th = _theta_nodes()
    n_az = _n_azimuth(k, extent)
    phi = 2 * np.pi * np.arange(n_az) / n_az
    w = w_th[:, None] * (2 * np.pi / n_az)
    TH, PH = np.meshgrid(th, phi, indexing="ij")
    c = ETA0 * k ** 2 / (16 * np.pi ** 2)
    r_hat, th_hat, ph_hat = _unit_vectors(TH, PH)
    n_up = _radiation_vector(wires, geo, k * r_hat, k)
    n_dn = _radiation_vector(wires, geo, k * r_hat * _MIRROR, k)

    def perp2(n, r):
        """|N x r_hat|^2: the transverse part that radiates."""
        return np.sum(np.abs(n) ** 2, axis=-1) - np.abs(np.sum(n * r, axis=-1)) ** 2

    p_free = float(c * np.sum(w * (perp2(n_up, r_hat) + perp2(n_dn, r_hat * _MIRROR))))
    if ground_kind == "free-space":
        return Powers(p_free, p_free, p_free, 0.0, 0.0, 0.0, 1.0)

    r_v, r_h = _ground_factors(ground_kind, np.cos(TH), eps_c)
    # components along s_hat (= phi_hat) and p (p^+ = -theta_hat, p^- = M theta_hat)
    a_s_up, a_s_dn = np.sum(n_up * ph_hat, axis=-1), np.sum(n_dn * ph_hat, axis=-1)
    a_p_up, a_p_dn = -np.sum(n_up * th_hat, axis=-1), np.sum(n_dn * (th_hat * _MIRROR), axis=-1)
    # in the spectral formula R_TE = R_h, R_TM = R_v (the far field's coefficients at k_rho = k sin th)
    cross = r_h * a_s_dn * np.conj(a_s_up) + r_v * a_p_dn * np.conj(a_p_up)
    p_refl_prop = float(2 * c * np.sum(w * cross.real))
    e_th = a_p_up + r_v * a_p_dn          # E over -j eta0 k/4 pi, up to sign
    e_ph = a_s_up + r_h * a_s_dn
    p_upper = float(c * np.sum(w * (np.abs(e_th) ** 2 + np.abs(e_ph) ** 2)))
    p_trans = float(c * np.sum(w * ((1 - np.abs(r_v) ** 2) * np.abs(a_p_dn) ** 2
                                    + (1 - np.abs(r_h) ** 2) * np.abs(a_s_dn) ** 2)))
    p_evan = 0.0 if ground_kind == "perfect" else _evanescent(wires, geo, k, eps_c, extent, z_min)
    p_field = p_free + p_refl_prop + p_evan
    return Powers(p_free, p_upper, p_field, p_refl_prop, p_evan, p_trans, p_upper / p_field)


def _extent_below(geo, z_cut):
    """The largest horizontal distance from the centre of any wire point at or below z_cut, m (the
    wires' parts that the evanescent waves of a given kappa still see)."""
    ext = 0.0
    for p0, t, l in geo:
        if abs(t[2]) < 1e-12:
            ends = (0.0, l) if p0[2] <= z_cut else ()
        else:
            s_cut = (z_cut - p0[2]) / t[2]
            lo, hi = (0.0, min(l, s_cut)) if t[2] > 0 else (max(0.0, s_cut), l)
            ends = (lo, hi) if lo <= hi else ()
        for s in ends:
            ext = max(ext, float(np.hypot(p0[0] + s * t[0], p0[1] + s * t[1])))
    return ext


def _evanescent(wires, geo, k, eps_c, extent, z_min):
    """P_refl,evan, W: the evanescent part (k_rho > k) of the reflected field's power, kappa = |k_z|
    from 0 to 12/z_min (e^{-2 kappa z_min} < e^{-24}), split at kappa_b = 1.5 k |sqrt(eps_c - 1)|
    (past the waves that still propagate in the ground, k_rho < k |n|, where the Fresnel
    coefficients turn) when that is shorter. The kappa nodes go in groups of 16, each with its own
    azimuth count, from the horizontal extent of the wires' parts within 16/kappa of the lowest
    point (higher parts are weighted by e^{-2 kappa dz} < e^{-32} there)."""
    kappa_max = 12.0 / z_min
    kappa_b = min(1.5 * k * abs(np.sqrt(eps_c - 1)), kappa_max / 2)
    kap = np.concatenate([kappa_b * _KAPPA[0], kappa_b + (kappa_max - kappa_b) * _KAPPA[0]])
    w_k = np.concatenate([kappa_b * _KAPPA[1], (kappa_max - kappa_b) * _KAPPA[1]])
    total = 0.0
    for g in range(0, len(kap), 16):
        kap_g, w_g = kap[g:g + 16], w_k[g:g + 16]
        ext = extent if kap_g[0] <= 0 else min(extent, _extent_below(geo, z_min + 16.0 / kap_g[0]))
        k_rho = np.sqrt(k * k + kap_g * kap_g)
        n_az = _n_azimuth(float(k_rho[-1]), ext)
        al = 2 * np.pi * np.arange(n_az) / n_az
        KR, AL = np.meshgrid(k_rho, al, indexing="ij")
        KA = np.broadcast_to(kap_g[:, None], KR.shape)
        ca, sa = np.cos(AL), np.sin(AL)
        kvec = np.stack([KR * ca, KR * sa, 1j * KA], axis=-1)   # k^- = (k_rho rho_hat, -k_z), k_z = -j kappa
        n_dn = _radiation_vector(wires, geo, kvec, k)
        a_s = -n_dn[..., 0] * sa + n_dn[..., 1] * ca
        a_p = (-1j * KA * (n_dn[..., 0] * ca + n_dn[..., 1] * sa) + KR * n_dn[..., 2]) / k
        k_z = -1j * KA
        k_z2 = np.sqrt(eps_c * k * k - KR * KR + 0j)
        k_z2 = np.where(k_z2.imag > 0, -k_z2, k_z2)
        r_te = (k_z - k_z2) / (k_z + k_z2)
        r_tm = (eps_c * k_z - k_z2) / (eps_c * k_z + k_z2)
        integrand = (r_te * np.abs(a_s) ** 2 + r_tm * np.abs(a_p) ** 2).imag
        total += float(np.sum(w_g[:, None] * integrand)) * (2 * np.pi / n_az)
    return -ETA0 * k / (8 * np.pi ** 2) * total


def ground_efficiency(wires, f: float, ground_kind: str = "free-space", eps_r: float = 13.0,
                      sigma: float = 0.005) -> float:
    """eta_ground = P_upper / P_field of the wires' currents at f (Hz): the share of the power the
    currents put into the field that leaves as the space wave over the upper hemisphere (1 in free
    space and over perfect ground). See powers() and the module docstring."""
    return powers(wires, f, ground_kind, eps_r, sigma).eta_ground


def gain_dbi(wires, f: float, theta, phi, p_in: float, ground_kind: str = "free-space",
             eps_r: float = 13.0, sigma: float = 0.005):
    """Gain in dBi at polar angle theta and azimuth phi (rad, broadcast arrays; over ground theta <=
    pi/2) relative to the input power p_in (W rms, for the wires' rms currents):
    G = 4 pi r^2 |E|^2 / (eta0 p_in). -300 dBi where the field vanishes."""
    e_th, e_ph = far_field(wires, f, theta, phi, ground_kind, eps_r, sigma)
    g = 4 * np.pi * (np.abs(e_th) ** 2 + np.abs(e_ph) ** 2) / (ETA0 * p_in)
    return 10 * np.log10(np.maximum(g, 1e-30))


#: the coarse grid the maximum is first searched on, degrees (elevation, azimuth)
COARSE_EL_DEG, COARSE_AZ_DEG = 3.0, 10.0
#: the fine elevation step of the second scan and the elevation cut, at most, degrees
FINE_EL_DEG = 0.5
#: the azimuth cut's angle step, degrees
CUT_STEP_DEG = 2.0
#: grid points per elevation lobe of the fine scan over ground
LOBE_POINTS = 6
#: gains below this are reported as this, dBi (a null: the -300 dBi floor of gain_dbi is not a figure)
FLOOR_DBI = -99.0


def _parabola_peak(y_minus: float, y0: float, y_plus: float) -> float:
    """Offset (in grid steps, -0.5..0.5) of the vertex of the parabola through three equally spaced
    points around a grid maximum."""
    den = y_minus - 2 * y0 + y_plus
    if den >= 0:
        return 0.0
    return float(np.clip(0.5 * (y_minus - y_plus) / den, -0.5, 0.5))


def _lobe_spacing_deg(wires, f: float, ground_kind: str) -> float:
    """The elevation lobes' spacing over ground, lambda / (2 z_top) rad, in degrees (z_top: the
    wires' highest point, at least a quarter wave); in free space there are none (180)."""
    if ground_kind == "free-space":
        return 180.0
    z_top = max(max(w.start[2], w.start[2] + w.length * w.direction[2]) for w in wires)
    lam = C0 / f
    return float(np.degrees(lam / (2 * max(z_top, lam / 4))))


def first_max(g: np.ndarray) -> tuple[int, int]:
    """Index of the largest gain, the first (lowest elevation, then azimuth) of those equal to 9
    digits: the wires lie in one vertical plane, so the pattern is its mirror image across it and
    two azimuths tie exactly but for rounding; which one wins must not depend on the last bit."""
    i, j = np.unravel_index(int(np.argmax(np.round(g / np.max(g), 9))), g.shape)
    return int(i), int(j)


def maximum(gain, wires, f: float, kind: str) -> tuple[float, float, float, float]:
    """(elevation, azimuth, gain) of the maximum of gain(el_deg, az_deg) (a ratio, broadcast
    arrays) and the fine elevation step used, degrees. The maximum is found on a coarse grid
    (COARSE_EL_DEG by COARSE_AZ_DEG), its elevation scanned again finely (FINE_EL_DEG, finer where
    the ground's lobes are narrow) at the best azimuth and its two neighbours, and refined by a
    parabola through the grid maximum and its neighbours in each angle (the gain near a smooth
    maximum is quadratic; the refinement moves it by under a grid step)."""
    lo = -90.0 if kind == "free-space" else 0.0
    az_step = COARSE_AZ_DEG
    el = np.arange(lo, 90.0 + COARSE_EL_DEG / 2, COARSE_EL_DEG)
    az = np.arange(0.0, 360.0, az_step)
    g = gain(el[:, None], az[None, :])
    j = first_max(g)[1]
    # over ground, the direct and reflected waves make lobes in elevation about lambda / (2 z_top)
    # rad apart (z_top: the highest point): a high VHF antenna's lobes are narrower than the
    # grid, so the elevation is scanned again finely at the best azimuth and its neighbours
    step = min(FINE_EL_DEG, _lobe_spacing_deg(wires, f, kind) / LOBE_POINTS)
    el = np.arange(lo, 90.0 + step / 2, step)
    az = az[[j - 1, j, (j + 1) % len(az)]]
    g = gain(el[:, None], az[None, :])
    i, j = first_max(g)
    d_az = _parabola_peak(g[i, j - 1], g[i, j], g[i, j + 1]) * az_step if j == 1 else 0.0
    d_el = (_parabola_peak(g[i - 1, j], g[i, j], g[i + 1, j]) * step if 0 < i < len(el) - 1 else 0.0)
    e_max, a_max = round(float(el[i] + d_el), 6), round(float(az[j] + d_az), 6) % 360.0
    g_max = float(gain(np.array(e_max), np.array(a_max)))
    if g_max < g[i, j]:
        e_max, a_max, g_max = float(el[i]), float(az[j]), float(g[i, j])
    return e_max, a_max, g_max, step


def dbi(x):
    """A gain ratio in dBi, floored at FLOOR_DBI."""
    return np.maximum(10 * np.log10(np.maximum(x, 1e-30)), FLOOR_DBI)


def power_gain(wires, f: float, ground_kind: str, eps_r: float, sigma: float, scale: float):
    """gain(el_deg, az_deg) = scale |E|^2 (E: far_field, V rms times r e^{jkr}), a ratio, at
    elevation and azimuth in degrees (broadcast arrays); scale = 4 pi / (eta0 P) gives the gain
    relative to the power P."""
    def gain(el_deg, az_deg):
        e_th, e_ph = far_field(wires, f, np.radians(90.0 - el_deg), np.radians(az_deg), ground_kind,
                               eps_r, sigma)
        return scale * (np.abs(e_th) ** 2 + np.abs(e_ph) ** 2)
    return gain


def pattern_of(gain, wires, f: float, kind: str, efficiency: float) -> Pattern:
    """The Pattern of gain(el_deg, az_deg) (a ratio, broadcast arrays; the wires' far field over
    the ground `kind`, with `efficiency` its factor from directivity to gain): the maximum
    (maximum()), the elevation cut through it every fine step (beyond 90: the far side of the
    zenith) and the azimuth cut at its elevation every CUT_STEP_DEG."""
    e_max, a_max, g_max, step = maximum(gain, wires, f, kind)
    lo = -90.0 if kind == "free-space" else 0.0
    e_cut = np.arange(lo, 180.0 - lo + step / 2, step)
    far = e_cut > 90.0
    g_el = gain(np.where(far, 180.0 - e_cut, e_cut), np.where(far, a_max + 180.0, a_max))
    a_cut = np.arange(0.0, 360.0, CUT_STEP_DEG)
    g_az = gain(np.full_like(a_cut, e_max), a_cut)
    return Pattern(max_gain_dbi=float(dbi(g_max)), takeoff_deg=e_max, azimuth_deg=a_max,
                   elevation_deg=e_cut, elevation_gain_dbi=dbi(g_el), azimuth_cut_deg=a_cut,
                   azimuth_gain_dbi=dbi(g_az), efficiency=float(efficiency), ground_kind=kind)


def pattern(wires, f: float, ground_kind: str = "free-space", eps_r: float = 13.0,
            sigma: float = 0.005, p_in: float | None = None) -> Pattern:
    """The pattern of the wires' currents at f (Hz) over the ground, gains relative to p_in (W;
    default the power the currents put into the field, P_field, so lossless): pattern_of with
    efficiency P_upper / p_in (powers())."""
    _check_ground(ground_kind)
    pw = powers(wires, f, ground_kind, eps_r, sigma)
    p_in = pw.p_field if p_in is None else float(p_in)
    gain = power_gain(wires, f, ground_kind, eps_r, sigma, 4 * np.pi / (ETA0 * p_in))
    with np.errstate(divide="ignore"):      # a null's log is floored
        return pattern_of(gain, wires, float(f), ground_kind, pw.p_upper / p_in)


#: largest phase k z_top (rad) the fixed theta nodes integrate the space wave of a high antenna over
#: ground with (measured: within 1e-4 of the panels below it)
_PANEL_PHASE = 6.0


def space_wave_power(wires, f: float, ground_kind: str = "free-space", eps_r: float = 13.0,
                     sigma: float = 0.005) -> float:
    """P_upper, W (rms): the space wave's power, the Poynting flux of the far field over the upper
    hemisphere (over the whole sphere in free space), by the quadrature of powers() but without
    the reflected spectrum, so it needs no gap between the wires and the ground (the far field of a
    wire resting on the ground is the direct field plus its Fresnel-weighted image, finite)."""
    _check_ground(ground_kind)
    f = float(f)
    k = wavenumber(f)
    geo, extent, _ = _geometry(wires)
    th, w_th = _theta_nodes()
    z_top = max(max(p0[2], p0[2] + l * t[2]) for p0, t, l in geo)
    if ground_kind != "free-space" and k * z_top > _PANEL_PHASE:
        # direct and reflected waves beat as cos(2 k z cos theta): a high antenna has many lobes in
        # elevation, more than the fixed nodes resolve; then Gauss-Legendre panels of 16 nodes,
        # each spanning under _PANEL_PHASE / k z_top in cos theta (about one lobe)
        n = int(np.ceil(k * z_top / _PANEL_PHASE))
        x, w = _gl01(16)
        u = (np.arange(n)[:, None] + x[None, :]).ravel() / n        # u = cos theta in (0, 1)
        th, w_th = np.arccos(u), np.tile(w, n) / n
    if ground_kind == "free-space":
        th, w_th = np.concatenate([th, np.pi - th]), np.concatenate([w_th, w_th])
    n_az = _n_azimuth(k, extent)
    phi = 2 * np.pi * np.arange(n_az) / n_az
    TH, PH = np.meshgrid(th, phi, indexing="ij")
    e_th, e_ph, _, _ = _fields(wires, geo, k, TH, PH, ground_kind, _eps_c(f, eps_r, sigma))
    flux = (np.abs(e_th) ** 2 + np.abs(e_ph) ** 2) / ETA0
    return float(np.sum(w_th[:, None] * flux) * (2 * np.pi / n_az))
