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

The maximum and the cuts are found by pattern.pattern_of, the one finder of the package (a coarse
grid, a fine elevation scan, a parabola through the grid maximum; see pattern.maximum).

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

import numpy as np

from buildsheet.physics import jpole, pattern
from buildsheet.physics.radiator import ETA0

#: the design's pattern: pattern.py's one Pattern (the name the Solution and its readers use)
Radiation = pattern.Pattern


def _gain_of(wires, f: float, kind: str, eps_r: float, sigma: float, efficiency: float):
    """gain(el_deg, az_deg): the power gain (a ratio) of the wires' currents, relative to the
    power delivered when `efficiency` = radiated / delivered (see the module docstring)."""
    p_upper = pattern.space_wave_power(wires, f, kind, eps_r, sigma)
    return pattern.power_gain(wires, f, kind, eps_r, sigma, 4 * np.pi * efficiency / (ETA0 * p_upper))


def radiation(prep, radiator_length: float, stub_length: float, efficiency: float) -> Radiation:
    """The pattern of the antenna prepared at its design frequency (jpole.at_frequency(f0, ant)),
    radiator and stub lengths in m, with `efficiency` = radiated / delivered (jpole.state_at's): see
    the module docstring."""
    ant = prep.ant
    f = float(prep.f)
    kind = ant.ground_kind
    wires = jpole.current_wires(prep, radiator_length, stub_length, 1.0)
    gain = _gain_of(wires, f, kind, ant.ground_eps_r, ant.ground_sigma, efficiency)
    return pattern.pattern_of(gain, wires, f, kind, efficiency)


def free_space_directivity_dbi(prep, radiator_length: float, stub_length: float) -> float:
    """The maximum directivity, dBi, of the antenna's currents (radiator and stub common mode) in
    free space: the exposure estimate's antenna gain where it exceeds a half-wave dipole's."""
    wires = jpole.current_wires(prep, radiator_length, stub_length, 1.0)
    gain = _gain_of(wires, float(prep.f), "free-space", 13.0, 0.005, 1.0)
    return float(pattern.dbi(pattern.maximum(gain, wires, float(prep.f), "free-space")[2]))
