"""Far field, radiated power and ground loss of wire currents (buildsheet.physics.pattern) against
outside sources: Carter's induced-EMF values (CHECK_VALUES §3a-3c), Balanis's dipole directivity,
and NEC-2 (PyNEC 2.4.6 through tests/necref.py: GN 2 Sommerfeld-Norton and GN 0 reflection
coefficient, RP-card average gain and pattern) for half-wave dipoles over real grounds.

The NEC runs use a thin exact half-wave (radius 1e-5 lambda, 51 segments, lossless, 14.2 MHz), as
CHECK_VALUES §3c does, so NEC's radiated fraction (average power gain over the upper hemisphere
times 2 pi / 4 pi) is the ground efficiency P_upper / P_in with no wire loss.
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np
import pytest

sys.path.insert(0, str(Path(__file__).parent))
import necref  # noqa: E402

from buildsheet.physics import pattern as P  # noqa: E402
from buildsheet.physics.radiator import ETA0  # noqa: E402

F = 14.2e6
LAM = necref.C0 / F
K = 2 * np.pi / LAM
ETA_30 = 120 * np.pi / ETA0     # CHECK_VALUES uses eta = 120 pi (eta/4 pi = 30)

# Grounds (ITU-R P.527 classes as commonly quoted; "average" and "poor" are the brief's values,
# "very good" eps_r 30, sigma 0.03 S/m: wet ground, common practice)
GROUNDS = {"average": (13.0, 0.005), "poor": (5.0, 0.001), "very good": (30.0, 0.03)}


def half_wave(h, orientation="horizontal", i_m=1.0, length=0.5 * LAM):
    """A centre-fed dipole as two sinusoidal arms open at their ends, centre at height h (m)."""
    t = np.array((1.0, 0.0, 0.0) if orientation == "horizontal" else (0.0, 0.0, 1.0))
    c = (0.0, 0.0, h)
    return [P.Wire(c, tuple(t), length / 2, i_m), P.Wire(c, tuple(-t), length / 2, -i_m)]


# ---- free space and perfect ground: closed forms ----

def test_free_space_half_wave_radiates_73_13_ohm():
    """CHECK_VALUES §3a (Carter 1932): R = 73.1296 ohm with eta = 120 pi, 73.079 with eta0."""
    pw = P.powers(half_wave(0.0), F)
    assert pw.p_free == pytest.approx(73.079, abs=2e-3)            # |I_m| = 1 A rms: P = R
    assert pw.p_free * ETA_30 == pytest.approx(73.1296, abs=0.01)
    assert pw.eta_ground == 1.0


def test_free_space_half_wave_directivity_is_2_15_dbi():
    """Balanis, Antenna Theory, eq. 4-91: D0 = 4/Cin(2 pi) for the sinusoidal half-wave, 1.643 there
    with Cin rounded to 2.435; with Cin(2 pi) = 2.437653 (CHECK_VALUES §3a) D0 = 1.6409, 2.151 dBi."""
    p = P.pattern(half_wave(0.0), F)
    assert p.max_gain_dbi == pytest.approx(10 * np.log10(4 / 2.437653), abs=0.002)
    # broadside to the wire (along x): any direction in the y-z plane
    el, az = np.radians(p.takeoff_deg), np.radians(p.azimuth_deg)
    assert abs(np.cos(el) * np.cos(az)) < 0.01


@pytest.mark.parametrize("orientation", ["horizontal", "vertical"])
def test_average_gain_of_a_lossless_dipole_is_one(orientation):
    """Energy conservation (Poynting): the gain relative to the power put into the field averages
    to 1 over the sphere; here integrated independently of powers() on a 1-degree midpoint grid."""
    wires = half_wave(0.0, orientation, i_m=0.3 - 0.2j, length=0.7 * LAM)
    p_in = P.powers(wires, F).p_field
    th = np.radians(np.arange(0.5, 180, 1.0))[:, None]
    ph = np.radians(np.arange(0.5, 360, 1.0))[None, :]
    g = 10 ** (P.gain_dbi(wires, F, th, ph, p_in) / 10)
    avg = np.sum(g * np.sin(th)) * np.radians(1.0) ** 2 / (4 * np.pi)
    assert avg == pytest.approx(1.0, abs=2e-4)


# CHECK_VALUES §3c, image method R_in = R11 - R12(2h) with eta = 120 pi [C]
R_IMAGE = {0.10: 21.73, 0.125: 32.34, 0.15: 43.87, 0.20: 66.91, 0.25: 85.66, 0.30: 96.44,
           0.375: 95.63, 0.50: 69.12, 0.75: 75.02, 1.00: 72.05}


@pytest.mark.parametrize("h_over_lam", sorted(R_IMAGE))
def test_horizontal_half_wave_over_perfect_ground_is_r11_minus_r12(h_over_lam):
    """CHECK_VALUES §3c (image theory with Carter's mutual impedance): the spectral (Sommerfeld)
    power into the field with R_TE = -1, R_TM = 1 equals R11 - R12(2h); the Poynting flux over the
    upper hemisphere (the far field) equals it too; eta_ground = 1 over perfect ground."""
    pw = P.powers(half_wave(h_over_lam * LAM), F, "perfect")
    assert pw.p_field * ETA_30 == pytest.approx(R_IMAGE[h_over_lam], rel=1e-3, abs=0.006)
    assert pw.p_upper == pytest.approx(pw.p_field, rel=1e-9)
    assert pw.eta_ground == pytest.approx(1.0, abs=1e-9)


@pytest.mark.parametrize("ground", sorted(GROUNDS))
@pytest.mark.parametrize("orientation", ["horizontal", "vertical"])
def test_ground_loss_is_what_the_ground_does_not_reflect(ground, orientation):
    """Energy bookkeeping of the two independent computations (Sommerfeld 1909; Fresnel): the power
    into the field less the space wave, P_field - P_upper, equals the downward plane waves the
    ground transmits, integral (1 - |R|^2)|E_image|^2, plus the evanescent (near-field) term."""
    eps_r, sigma = GROUNDS[ground]
    h = 0.15 * LAM + (0.25 * LAM if orientation == "vertical" else 0.0)
    pw = P.powers(half_wave(h, orientation), F, "real", eps_r, sigma)
    assert pw.p_field - pw.p_upper == pytest.approx(pw.p_transmitted + pw.p_refl_evan, rel=1e-9)
    assert pw.p_refl_evan > 0 and pw.p_transmitted > 0
    assert 0 < pw.eta_ground < 1


def test_quadrature_is_converged():
    """The fixed quadrature against a finer one (theta and kappa nodes doubled, azimuth points
    doubled) for low half-waves (0.05 lambda: the evanescent term is largest): a horizontal one over
    poor ground and a vertical one over very good ground. Measured over 0.02-0.3 lambda and the
    grounds of this file, and lossless eps_r 13: at most 1.3e-4 in eta_ground (verticals over very
    good ground), 1e-9 on the horizontal here."""
    cases = ((half_wave(0.05 * LAM), GROUNDS["poor"], 1e-6),
             (half_wave(0.30 * LAM, "vertical"), GROUNDS["very good"], 2e-4))
    for wires, (eps_r, sigma), tol in cases:
        eta = P.powers(wires, F, "real", eps_r, sigma).eta_ground
        saved = P._TH_LOW, P._TH_HIGH, P._KAPPA, P._n_azimuth
        try:
            P._TH_LOW, P._TH_HIGH, P._KAPPA = P._gl01(48), P._gl01(64), P._gl01(64)
            P._n_azimuth = lambda kr, ext: int(4 * np.ceil(kr * ext + 12))
            eta_fine = P.powers(wires, F, "real", eps_r, sigma).eta_ground
        finally:
            P._TH_LOW, P._TH_HIGH, P._KAPPA, P._n_azimuth = saved
        assert eta == pytest.approx(eta_fine, abs=tol)


# ---- real ground against NEC-2 ----

THIN_D = 2e-5 * LAM
CASES = [(o, h, g) for o in ("horizontal", "vertical") for h in (0.1, 0.25, 0.5, 1.0) for g in sorted(GROUNDS)]


def _centre(orientation, h_over_lam):
    """Centre height, m: h is the height of the lowest point (the wire's end for a vertical)."""
    return h_over_lam * LAM + (0.25 * LAM if orientation == "vertical" else 0.0)


def _nec(orientation, h_over_lam, ground, method="sommerfeld", theta_step=1.0):
    eps_r, sigma = GROUNDS[ground]
    wires = necref.dipole_wires(0.5 * LAM, THIN_D, _centre(orientation, h_over_lam), orientation)
    return necref.pattern(wires, F, necref.Ground("real", eps_r, sigma, method), (1, 26),
                          theta_step=theta_step, phi_step=5.0)


@pytest.mark.parametrize("orientation, h_over_lam, ground", CASES)
def test_ground_efficiency_against_nec_sommerfeld(orientation, h_over_lam, ground):
    """NEC-2 GN 2 (Sommerfeld-Norton): radiated fraction over the upper hemisphere of a lossless
    half-wave = eta_ground. Measured over these 24 cases: |difference| at most 0.010 (largest at a
    horizontal 0.5 lambda high, where NEC's GN 0 agrees with this method to 0.001 instead: NEC-2's
    own Sommerfeld interpolation at a distance of 1 lambda to the image), median 0.001. The
    sinusoid is not NEC's current exactly; radiating NEC's own segment currents instead moves the
    result by under 0.002. Tolerance 0.015."""
    eps_r, sigma = GROUNDS[ground]
    nec = _nec(orientation, h_over_lam, ground)
    eta = P.ground_efficiency(half_wave(_centre(orientation, h_over_lam), orientation), F, "real",
                              eps_r, sigma)
    assert eta == pytest.approx(nec.radiated_fraction, abs=0.015)


@pytest.mark.parametrize("orientation, h_over_lam, ground",
                         [c for c in CASES if c[1] >= 0.25])
def test_ground_efficiency_against_nec_reflection_coefficient(orientation, h_over_lam, ground):
    """NEC-2 GN 0 (Fresnel reflection-coefficient approximation for the near field too) from 0.25
    lambda up, where that approximation holds: within 0.015 (measured at most 0.005). Lower, GN 0
    misses the evanescent coupling into the ground: a horizontal half-wave at 0.1 lambda reads
    0.44 with GN 0 against 0.38 with GN 2 and here (over average ground), see the next test."""
    eps_r, sigma = GROUNDS[ground]
    nec = _nec(orientation, h_over_lam, ground, method="reflection")
    eta = P.ground_efficiency(half_wave(_centre(orientation, h_over_lam), orientation), F, "real",
                              eps_r, sigma)
    assert eta == pytest.approx(nec.radiated_fraction, abs=0.015)


def test_low_horizontal_dipole_follows_sommerfeld_not_the_reflection_approximation():
    """At 0.1 lambda over average ground the near-field (evanescent) loss is large: this method,
    like NEC-2's GN 2, gives eta about 0.38; NEC-2's GN 0 about 0.44 (measured 0.3816 / 0.4422)."""
    eta = P.ground_efficiency(half_wave(0.1 * LAM), F, "real", *GROUNDS["average"])
    gn2 = _nec("horizontal", 0.1, "average").radiated_fraction
    gn0 = _nec("horizontal", 0.1, "average", method="reflection").radiated_fraction
    assert abs(eta - gn2) < 0.01 < abs(eta - gn0)


def test_nec_segment_currents_give_nec_ground_efficiency():
    """Radiating NEC-2's own segment currents (SampledWire) with this module's method reproduces
    NEC-2 GN 2's radiated fraction: the method, separated from the sinusoidal-current assumption
    (horizontal at 0.25 lambda, vertical at 0.1 lambda, average ground: measured within 0.0005)."""
    eps_r, sigma = GROUNDS["average"]
    for orientation, h in (("horizontal", 0.25), ("vertical", 0.1)):
        nec = _nec(orientation, h, "average")
        w = necref.dipole_wires(0.5 * LAM, THIN_D, _centre(orientation, h), orientation)[0]
        pos, seglens, cur = nec.currents[1]
        p1, p2 = np.array(w.p1), np.array(w.p2)
        sampled = [P.SampledWire(w.p1, tuple((p2 - p1) / np.linalg.norm(p2 - p1)), tuple(pos),
                                 tuple(seglens), tuple(cur))]
        eta = P.ground_efficiency(sampled, F, "real", eps_r, sigma)
        assert eta == pytest.approx(nec.radiated_fraction, abs=0.002)


# Issue 19's target: max gain within 1 dB, take-off angle within 3 degrees of NEC-2's pattern.
PATTERN_CASES = [("horizontal", 0.25, "average"), ("horizontal", 0.5, "average"),
                 ("horizontal", 1.0, "average"), ("horizontal", 0.5, "poor"),
                 ("vertical", 0.1, "average"), ("vertical", 0.25, "average"),
                 ("vertical", 0.5, "poor"), ("vertical", 1.0, "very good")]


@pytest.mark.parametrize("orientation, h_over_lam, ground", PATTERN_CASES)
def test_max_gain_and_takeoff_against_nec(orientation, h_over_lam, ground):
    """NEC-2 GN 2 pattern (RP card, theta every 0.5 deg, phi every 5 deg), power gain of the
    lossless dipole: its grid maximum against pattern()'s maximum relative to P_field. Measured:
    gain within 0.08 dB, take-off within 0.2 deg. Tolerances 0.15 dB (the 1 % of power by which the
    sinusoid and NEC's GN 2 differ, with margin) and 0.5 deg (NEC's grid step)."""
    eps_r, sigma = GROUNDS[ground]
    nec = _nec(orientation, h_over_lam, ground, theta_step=0.5)
    i, j = np.unravel_index(int(np.argmax(nec.gain_dbi)), nec.gain_dbi.shape)
    p = P.pattern(half_wave(_centre(orientation, h_over_lam), orientation), F, "real", eps_r, sigma)
    assert p.max_gain_dbi == pytest.approx(nec.gain_dbi[i, j], abs=0.15)
    assert p.takeoff_deg == pytest.approx(90.0 - nec.theta_deg[i], abs=0.5)


def test_pattern_cuts_pass_through_the_maximum():
    """The elevation cut contains the maximum at the take-off angle and the azimuth cut's maximum is
    the maximum gain (consistency of the returned cuts, on the finder's grids)."""
    p = P.pattern(half_wave(0.5 * LAM), F, "real", *GROUNDS["average"])
    k = int(np.argmin(np.abs(p.elevation_deg - p.takeoff_deg)))
    assert p.elevation_gain_dbi[k] == pytest.approx(p.max_gain_dbi, abs=0.01)
    assert np.max(p.azimuth_gain_dbi) == pytest.approx(p.max_gain_dbi, abs=0.01)
    assert np.max(p.elevation_gain_dbi) <= p.max_gain_dbi + 1e-6


def test_refuses_wires_below_ground():
    with pytest.raises(ValueError, match="above the ground"):
        P.powers(half_wave(-1.0), F, "real")
    with pytest.raises(ValueError, match="ground_kind"):
        P.powers(half_wave(5.0), F, "lossy")


# ---- J-poles: the method on NEC-2's own currents ----

JPOLES = {
    # dimensions the model gave the acceptance designs of tests/test_jpole_nec.py (bench/ground_loss.py)
    "20m-horiz-10m-avg": necref.JPoleDims(radiator=10.33, stub=5.358, tap=0.2615, spacing=0.025,
                                          wire_d=necref.awg_diameter(14), stub_d=necref.awg_diameter(14),
                                          height=10.0, ground=necref.Ground("real", 13.0, 0.005)),
    "2m-wire-vert-3m-avg": necref.JPoleDims(radiator=1.0032, stub=0.5135, tap=0.0372, spacing=0.025,
                                            wire_d=necref.awg_diameter(10), stub_d=necref.awg_diameter(10),
                                            orientation="vertical", height=3.0,
                                            ground=necref.Ground("real", 13.0, 0.005)),
}
F_JPOLE = {"20m-horiz-10m-avg": 14.175e6, "2m-wire-vert-3m-avg": 146.0e6}


@pytest.mark.parametrize("name", sorted(JPOLES))
def test_jpole_nec_currents_give_nec_ground_efficiency(name):
    """NEC-2 GN 2 on a lossless J-pole: its radiated fraction over the upper hemisphere is the ground
    efficiency times NEC-2's own energy balance on the structure, which is not 1: in free space the
    same lossless J-pole radiates only 0.955 of NEC's input power (tests/test_nec_harness.py: 0.956;
    the source in the closely spaced tap bar). Radiating NEC's segment currents on all seven wires
    with this module gives the ground efficiency without that factor: NEC's fraction over its
    free-space fraction, within 0.005 (measured within 0.0025 on the seven designs of
    bench/ground_loss.py)."""
    d, f = JPOLES[name], F_JPOLE[name]
    wires = necref.jpole_wires(d, f)
    source = (necref.TAG_TAP, (wires[necref.TAG_TAP - 1].nseg + 1) // 2)
    nec = necref.pattern(wires, f, d.ground, source, theta_step=1.0, phi_step=5.0)
    free_d = necref.with_dims(d, ground=necref.Ground("free-space"))
    free = necref.pattern(necref.jpole_wires(free_d, f), f, free_d.ground, source, theta_step=2.0,
                          phi_step=5.0)
    sampled = []
    for w in wires:
        pos, seglens, cur = nec.currents[w.tag]
        p1, p2 = np.array(w.p1), np.array(w.p2)
        sampled.append(P.SampledWire(w.p1, tuple((p2 - p1) / np.linalg.norm(p2 - p1)), tuple(pos),
                                     tuple(seglens), tuple(cur)))
    eta = P.ground_efficiency(sampled, f, "real", d.ground.eps_r, d.ground.sigma)
    assert eta == pytest.approx(nec.radiated_fraction / free.radiated_fraction, abs=0.005)
    assert free.radiated_fraction < 0.97      # the balance this divides out is real, not rounding


def test_lossy_line_current_reduces_to_the_sinusoid():
    """Wire with gamma = jk and the open end at its end is the sinusoid (identity of the two closed
    forms), and a lossy standing wave's far field matches its segment-sampled version (the closed
    form against a 2000-segment midpoint sum)."""
    w_sin = half_wave(0.3 * LAM)
    w_line = [P.Wire(w.start, w.direction, w.length, w.loop_current, gamma=1j * K) for w in w_sin]
    a, b = P.powers(w_sin, F, "real"), P.powers(w_line, F, "real")
    assert b.p_field == pytest.approx(a.p_field, rel=1e-12)
    gamma, l, l_o = 0.02 + 1.03j * K, 0.45 * LAM, 0.47 * LAM
    line = P.Wire((0.0, 0.0, 5.0), (0.6, 0.0, -0.8), l, 0.7 + 0.2j, gamma=gamma, open_length=l_o)
    n = 2000
    s = (np.arange(n) + 0.5) * l / n
    cur = -1j * (0.7 + 0.2j) * np.sinh(gamma * (l_o - s))
    sampled = P.SampledWire(line.start, line.direction, tuple(s), (l / n,) * n, tuple(cur))
    th, ph = np.radians([10.0, 40.0, 70.0, 89.0]), np.radians([0.0, 30.0, 100.0, 250.0])
    for x, y in zip(P.far_field([line], F, th, ph, "real"), P.far_field([sampled], F, th, ph, "real")):
        assert np.allclose(x, y, rtol=1e-5, atol=1e-9 * np.max(np.abs(y)))


def test_open_line_wire_carries_its_input_current():
    """open_line_wire: I(0) = i_in (the current into the arm), and the current vanishes at l_e
    (telegrapher's equations for an open-ended line: I(z) ~ sinh(gamma z) from the open end)."""
    gamma, l_e = 0.01 + 1.02j * K, 0.48 * LAM
    w = P.open_line_wire((0.0, 0.0, 8.0), (1.0, 0.0, 0.0), 0.46 * LAM, 0.3 - 0.1j, gamma, l_e)
    current = lambda s: -1j * w.loop_current * np.sinh(w.gamma * (w.open_length - s))
    assert current(0.0) == pytest.approx(0.3 - 0.1j, abs=1e-12)
    assert abs(current(l_e)) < 1e-12
