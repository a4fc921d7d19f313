"""The radiation pattern of a solved J-pole from the line model's own currents: owns the antenna's
far-field figures (maximum gain, take-off angle, the elevation and azimuth cuts); no I/O, no design
keys. The currents come from jpole.py (current_wires: the radiator and the stub's common mode, each
the standing wave of its arm), the far field over the ground from pattern.py (direct field plus the
image weighted by the Fresnel coefficients: the space wave NEC-2's RP card gives).

Gain relative to the power delivered to the tap (the antenna's own losses and the ground's taken
off): the far field's directivity over the space wave's power times the model's efficiency,

    G(theta, phi) = 4 pi |E|^2 / (eta0 P_upper) * eta,   eta = P_radiated / P_delivered

with P_upper the space wave's power of the same currents (pattern.space_wave_power) and eta from
jpole.state_at (radiated = the space wave: the currents' power into the field times the ground
efficiency, pattern.ground_efficiency). So the gain averaged over the upper hemisphere (the sphere
in free space) is the efficiency: the pattern and the loss budget cannot disagree. Both depend on
the currents' ratio only, not their scale.

The maximum is found on a coarse grid (COARSE_EL_DEG by COARSE_AZ_DEG), its elevation scanned again
finely (FINE_EL_DEG, finer where the ground's lobes are narrow) at the best azimuth and its two
neighbours, and refined by a
parabola through the grid maximum and its neighbours in each angle (the gain near a smooth maximum
is quadratic; the refinement moves it by under a grid step).

Angles, degrees: elevation above the horizon (over ground 0..90; in free space -90..90, where "take-
off" is the elevation of the maximum); azimuth in the horizontal plane from +x toward +y, +x being
the direction the radiator runs from the stub (horizontal and sloper; jpole._radiator_geometry) or,
for a vertical, from the stub's centre toward the conductor that carries the radiator. The elevation
cut runs from the horizon toward the maximum's azimuth (0) over the zenith (90) to the opposite
horizon (180), in free space from -90 to 270; the azimuth cut is at the take-off elevation.

Checked against NEC-2 patterns (tests/test_radiation_nec.py) on J-poles of the model's own
dimensions: horizontal, sloper and vertical, HF and VHF, real and perfect ground and free space.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from buildsheet.physics import jpole, pattern
from buildsheet.physics.radiator import C0, ETA0

#: the coarse grid the maximum is first searched on, degrees (elevation, azimuth)
COARSE_EL_DEG, COARSE_AZ_DEG = 3.0, 10.0
#: the fine elevation step of the second scan and the elevation cut, at most, degrees
FINE_EL_DEG = 0.5
#: the azimuth cut's angle step, degrees
CUT_STEP_DEG = 2.0
#: grid points per elevation lobe of the fine scan over ground
LOBE_POINTS = 6
#: gains below this are reported as this, dBi (a null: the pattern's -300 dBi floor is not a figure)
FLOOR_DBI = -99.0


@dataclass(frozen=True)
class Radiation:
    """The far field of the design at its design frequency (angles in degrees, gains in dBi relative
    to the power delivered to the tap): max_gain_dbi, takeoff_deg (the elevation of the maximum),
    azimuth_deg (the maximum's azimuth); elevation_deg and elevation_gain_dbi, the elevation cut in
    the vertical plane through the maximum; azimuth_cut_deg and azimuth_gain_dbi, the azimuth cut at
    the take-off elevation; efficiency, the factor from directivity to gain; ground_kind."""
    max_gain_dbi: float
    takeoff_deg: float
    azimuth_deg: float
    elevation_deg: np.ndarray
    elevation_gain_dbi: np.ndarray
    azimuth_cut_deg: np.ndarray
    azimuth_gain_dbi: np.ndarray
    efficiency: float
    ground_kind: str


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


def _gain_of(wires, f: float, kind: str, eps_r: float, sigma: float, efficiency: float):
    """gain(el_deg, az_deg): the power gain (a ratio) of the wires' currents, relative to the
    power delivered when `efficiency` = radiated / delivered (see the module docstring)."""
    p_upper = pattern.space_wave_power(wires, f, kind, eps_r, sigma)
    scale = 4 * np.pi * efficiency / (ETA0 * p_upper)

    def gain(el_deg, az_deg):
        e_th, e_ph = pattern.far_field(wires, f, np.radians(90.0 - el_deg), np.radians(az_deg),
                                       kind, eps_r, sigma)
        return scale * (np.abs(e_th) ** 2 + np.abs(e_ph) ** 2)
    return gain


def _first_max(g: np.ndarray) -> tuple[int, int]:
    """Index of the largest gain, the first (lowest elevation, then azimuth) of those equal to 9
    digits: the wires lie in one vertical plane, so the pattern is its mirror image across it and
    two azimuths tie exactly but for rounding; which one wins must not depend on the last bit."""
    i, j = np.unravel_index(int(np.argmax(np.round(g / np.max(g), 9))), g.shape)
    return int(i), int(j)


def _maximum(gain, wires, f: float, kind: str) -> tuple[float, float, float, float]:
    """(elevation, azimuth, gain) of the maximum and the fine elevation step used, degrees."""
    lo = -90.0 if kind == "free-space" else 0.0
    az_step = COARSE_AZ_DEG
    el = np.arange(lo, 90.0 + COARSE_EL_DEG / 2, COARSE_EL_DEG)
    az = np.arange(0.0, 360.0, az_step)
    g = gain(el[:, None], az[None, :])
    j = _first_max(g)[1]
    # over ground, the direct and reflected waves make lobes in elevation about lambda / (2 z_top)
    # rad apart (z_top: the highest point): a high VHF antenna's lobes are narrower than the
    # grid, so the elevation is scanned again finely at the best azimuth and its neighbours
    step = min(FINE_EL_DEG, _lobe_spacing_deg(wires, f, kind) / LOBE_POINTS)
    el = np.arange(lo, 90.0 + step / 2, step)
    az = az[[j - 1, j, (j + 1) % len(az)]]
    g = gain(el[:, None], az[None, :])
    i, j = _first_max(g)
    d_az = _parabola_peak(g[i, j - 1], g[i, j], g[i, j + 1]) * az_step if j == 1 else 0.0
    d_el = (_parabola_peak(g[i - 1, j], g[i, j], g[i + 1, j]) * step if 0 < i < len(el) - 1 else 0.0)
    e_max, a_max = round(float(el[i] + d_el), 6), round(float(az[j] + d_az), 6) % 360.0
    g_max = float(gain(np.array(e_max), np.array(a_max)))
    if g_max < g[i, j]:
        e_max, a_max, g_max = float(el[i]), float(az[j]), float(g[i, j])
    return e_max, a_max, g_max, step


def _dbi(x):
    return np.maximum(10 * np.log10(np.maximum(x, 1e-30)), FLOOR_DBI)


def radiation(prep, radiator_length: float, stub_length: float, efficiency: float) -> Radiation:
    """The pattern of the antenna prepared at its design frequency (jpole.at_frequency(f0, ant)),
    radiator and stub lengths in m, with `efficiency` = radiated / delivered (jpole.state_at's): see
    the module docstring."""
    ant = prep.ant
    f = float(prep.f)
    kind = ant.ground_kind
    wires = jpole.current_wires(prep, radiator_length, stub_length, 1.0)
    gain = _gain_of(wires, f, kind, ant.ground_eps_r, ant.ground_sigma, efficiency)
    e_max, a_max, g_max, step = _maximum(gain, wires, f, kind)
    # the elevation cut through the maximum (beyond 90: the far side of the zenith)
    lo = -90.0 if kind == "free-space" else 0.0
    e_cut = np.arange(lo, 180.0 - lo + step / 2, step)
    far = e_cut > 90.0
    g_el = gain(np.where(far, 180.0 - e_cut, e_cut), np.where(far, a_max + 180.0, a_max))
    a_cut = np.arange(0.0, 360.0, CUT_STEP_DEG)
    g_az = gain(np.full_like(a_cut, e_max), a_cut)
    return Radiation(max_gain_dbi=float(_dbi(g_max)), takeoff_deg=e_max, azimuth_deg=a_max,
                     elevation_deg=e_cut, elevation_gain_dbi=_dbi(g_el), azimuth_cut_deg=a_cut,
                     azimuth_gain_dbi=_dbi(g_az), efficiency=float(efficiency), ground_kind=kind)


def free_space_directivity_dbi(prep, radiator_length: float, stub_length: float) -> float:
    """The maximum directivity, dBi, of the antenna's currents (radiator and stub common mode) in
    free space: the exposure estimate's antenna gain where it exceeds a half-wave dipole's."""
    wires = jpole.current_wires(prep, radiator_length, stub_length, 1.0)
    gain = _gain_of(wires, float(prep.f), "free-space", 13.0, 0.005, 1.0)
    return float(_dbi(_maximum(gain, wires, float(prep.f), "free-space")[2]))
