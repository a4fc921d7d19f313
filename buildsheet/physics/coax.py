"""Feed-line loss and SWR of a coaxial feeder; owns coax-loss formulas only, no I/O, no design keys.

Symbols (SI, decibels where named *_db; every function broadcasts over numpy arrays):

    alpha_db_per_m   matched (flat) attenuation of the line, dB/m
    l                line length, m
    A                matched loss of the whole length, dB
    a                matched loss as a power ratio, 10^(A/10)
    rho_load         |reflection coefficient| at the load end, on the line's z0
    rho_in           |reflection coefficient| at the input (transmitter) end
"""

from __future__ import annotations

import numpy as np

from buildsheet.physics import ModelError
from buildsheet.physics.lines import Line, input_impedance


def _check_rho(rho):
    rho = np.asarray(rho, dtype=float)
    if np.any((rho < 0) | (rho > 1)) or np.any(np.isnan(rho)):
        raise ModelError(f"a passive load's |reflection coefficient| must be in [0, 1], got {rho}")
    return rho


def matched_loss_db(alpha_db_per_m, length):
    """Matched loss A = alpha l, dB: alpha_db_per_m in dB/m, length in m."""
    return np.asarray(alpha_db_per_m, dtype=float) * np.asarray(length, dtype=float)


def total_loss_db(matched_db, gamma_load_mag):
    """Total loss of a line with a mismatched load, dB (power in at the input over power into the load).

    loss = 10 log10[(a^2 - |rho_load|^2)/(a (1 - |rho_load|^2))], a = 10^(A/10): the amateur-radio
    handbook / Antenna Book formula (as printed there: from memory, CHECK_VALUES §6b). It is exact for a
    line with real z0, whatever the load's phase; for real lines with complex z0 it is approximate.

    matched_db: A, dB (>= 0); gamma_load_mag: |rho_load| on the line's z0, 0..1 (1 gives inf).
    """
    a = 10.0 ** (np.asarray(matched_db, dtype=float) / 10.0)
    rho2 = _check_rho(gamma_load_mag) ** 2
    with np.errstate(divide="ignore"):
        return 10.0 * np.log10((a**2 - rho2) / (a * (1.0 - rho2)))


def through_coax(z_load, line: Line, f, length) -> np.ndarray:
    """Impedance seen at the transmitter end of `length` of coax ending in z_load, complex ohm.

    The exact transformation of lines.input_impedance on the coax model (usually Line.nominal from
    the cable's datasheet z0, vf and matched loss). z_load: ohm; f: Hz; length: m; broadcast.
    """
    return input_impedance(line, f, length, z_load)
