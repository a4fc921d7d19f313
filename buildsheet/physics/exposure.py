"""RF-exposure screening: limits and far-field power density; owns those formulas, no I/O, no design keys.

These are screening estimates. At HF the distances they give usually fall inside the reactive near
field (lambda/(2 pi)), where the far-field formula is not a measurement of truth; the local regulator's
rules decide.

Symbols (SI throughout; conversions only where a limit table is defined in other units):

    f          frequency, Hz (limit tables are written with f_MHz = f/1e6)
    S          power density, W/m^2 (1 mW/cm^2 = 10 W/m^2)
    E          electric field strength, V/m (rms)
    eta0       impedance of free space, ohm
    eirp       effective isotropic radiated power (average), W
    r          distance from the antenna, m
    pep        peak envelope power, W
    lambda     free-space wavelength c/f, m
"""

from __future__ import annotations

import numpy as np

from buildsheet.physics import ModelError
from buildsheet.physics.constants import C0, epsilon_0, mu_0

ETA0 = float(np.sqrt(mu_0 / epsilon_0))

# EPA field-reflection factor 1.6 on field strength, i.e. 1.6^2 = 2.56 on power density, as used by
# FCC OET Bulletin 65 and its Supplement B for amateur stations.
GROUND_REFLECTION_POWER = 2.56

_MW_CM2 = 10.0   # W/m^2 per mW/cm^2


def _check_range(f_mhz, low, high, table):
    if np.any(f_mhz < low) or np.any(f_mhz > high) or np.any(np.isnan(f_mhz)):
        raise ModelError(f"{table} covers {low:g} MHz to {high:g} MHz, got {f_mhz} MHz")


def _table(f_mhz, upper_edges, values, above):
    """A limit table: values[i] where f_mhz <= upper_edges[i] (the first such row), `above` beyond the
    last edge (np.select's rule, written as nested np.where: the same numbers, less overhead)."""
    out = np.asarray(above, dtype=float)
    for edge, value in zip(reversed(upper_edges), reversed(values)):
        out = np.where(f_mhz <= edge, value, out)
    return out


def fcc_mpe(f):
    """US maximum permissible exposure, 47 CFR 1.1310 Table 1, as power density (W/m^2).

    Returns (controlled, general_population). Below 300 MHz Table 1 gives a plane-wave-equivalent S:
    controlled 100 (0.3-3 MHz), 900/f^2 (3-30 MHz), 1.0 (30-300 MHz); general population 100
    (0.3-1.34 MHz), 180/f^2 (1.34-30 MHz), 0.2 (30-300 MHz); then f/300 and f/1500 (300-1500 MHz),
    5 and 1.0 (1.5-100 GHz), all in mW/cm^2 with f in MHz. Averaging: 6 min controlled, 30 min
    general population. That the numbers are unchanged since the 2019-2020 revision (now
    §1.1310(e)(1)) is from memory. f: Hz, 0.3 MHz to 100 GHz.
    """
    f_mhz = np.asarray(f, dtype=float) / 1e6
    _check_range(f_mhz, 0.3, 100_000.0, "47 CFR 1.1310 Table 1")
    controlled = _table(f_mhz, [3.0, 30.0, 300.0, 1500.0],
                        [100.0, 900.0 / f_mhz**2, 1.0, f_mhz / 300.0], above=5.0)
    general = _table(f_mhz, [1.34, 30.0, 300.0, 1500.0],
                     [100.0, 180.0 / f_mhz**2, 0.2, f_mhz / 1500.0], above=1.0)
    return controlled * _MW_CM2, general * _MW_CM2


def icnirp2020_reference(f):
    """ICNIRP 2020 whole-body reference levels (Table 5, 30-min average) as power density (W/m^2).

    Returns (occupational, general_public). Where Table 5 gives no S (0.1-30 MHz) the E-equivalent
    S = E_inc^2/eta0 is used, with E_inc = 660/f^0.7 (occupational) and 300/f^0.7 (general) V/m;
    above 30 MHz the tabulated S: 10 and 2 (30-400 MHz), f/40 and f/200 (400-2000 MHz), 50 and 10
    (2-300 GHz), f in MHz (ICNIRP, Health Physics 118:483-524, 2020). These Table 5 values are from
    memory (CHECK_VALUES §5c gives the general-public ones, also from memory, consistent with the
    published local Table 6). Occupational is 5x general wherever S is tabulated; below 30 MHz the
    E-equivalent ratio is (660/300)^2 = 4.84. Below 30 MHz ICNIRP also limits H separately; S from
    H is the larger there, so E governs. f: Hz, 0.1 MHz to 300 GHz.
    """
    f_mhz = np.asarray(f, dtype=float) / 1e6
    _check_range(f_mhz, 0.1, 300_000.0, "ICNIRP 2020 Table 5")
    occupational = _table(f_mhz, [30.0, 400.0, 2000.0],
                          [(660.0 / f_mhz**0.7) ** 2 / ETA0, 10.0, f_mhz / 40.0], above=50.0)
    general = _table(f_mhz, [30.0, 400.0, 2000.0],
                     [(300.0 / f_mhz**0.7) ** 2 / ETA0, 2.0, f_mhz / 200.0], above=10.0)
    return occupational, general


def power_density(eirp_w, r_m, ground_reflection=True):
    """Far-field power density S = k EIRP/(4 pi r^2), W/m^2, k = 2.56 with ground reflection, else 1.

    FCC OET Bulletin 65 (1997) and Supplement B (amateur stations), with the EPA reflection factor.
    eirp_w: average EIRP, W; r_m: distance, m (> 0).
    """
    k = GROUND_REFLECTION_POWER if ground_reflection else 1.0
    r = np.asarray(r_m, dtype=float)
    if np.any(r <= 0):
        raise ModelError(f"exposure distance must be positive, got {r} m")
    return k * np.asarray(eirp_w, dtype=float) / (4.0 * np.pi * r**2)


def compliance_distance(eirp_w, s_limit_w_m2, ground_reflection=True):
    """Distance at which the far-field S falls to s_limit: r = sqrt(k EIRP/(4 pi S)), m (OET 65).

    eirp_w: average EIRP, W; s_limit_w_m2: limit, W/m^2 (> 0); k as in power_density.
    """
    k = GROUND_REFLECTION_POWER if ground_reflection else 1.0
    s = np.asarray(s_limit_w_m2, dtype=float)
    if np.any(s <= 0):
        raise ModelError(f"power-density limit must be positive, got {s} W/m^2")
    return np.sqrt(k * np.asarray(eirp_w, dtype=float) / (4.0 * np.pi * s))


def average_power(pep_w, duty_factor, on_air_fraction):
    """Time-averaged power = PEP x mode duty factor x fraction of the averaging time on the air, W.

    The amateur-practice method of OET Bulletin 65 Supplement B (mode duty factors such as 20 % for
    SSB without processing are handbook common practice). pep_w: W; duty_factor, on_air_fraction: 0..1.
    """
    duty = np.asarray(duty_factor, dtype=float)
    on_air = np.asarray(on_air_fraction, dtype=float)
    if np.any((duty < 0) | (duty > 1)) or np.any((on_air < 0) | (on_air > 1)):
        raise ModelError(f"duty factor and on-air fraction must be between 0 and 1, got {duty} and "
                          f"{on_air}")
    return np.asarray(pep_w, dtype=float) * duty * on_air


def reactive_near_field_limit(f):
    """Outer edge of the reactive near field of a small antenna, lambda/(2 pi), m (Balanis, field
    regions); f in Hz."""
    return C0 / (2.0 * np.pi * np.asarray(f, dtype=float))
