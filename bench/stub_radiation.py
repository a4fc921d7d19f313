"""The radiation resistance of a shorted two-wire stub (differential mode), by far-field integration;
the derivation of the candidate term jpole.Calibration r_sr (bench/data/cal-candidates/README.md).
Prints figures, not a test. Run with the venv's python:

  python bench/stub_radiation.py

Geometry: conductors at x = +-D/2 carrying I cos(k z) (A up, B down), z from the short (z = 0) to
S, and the short bar at z = 0 carrying I across. Radiated power from the radiation vector
N = sum of I dl exp(j k r.r') over the sphere (Balanis, Antenna Theory, ch. 4: P = eta k^2 /
(32 pi^2) int |N_perp|^2 dOmega for peak I), as a resistance referred to the current at the short,
R = 2 P / I^2. Checked first on a short dipole (the bar alone), R = 80 pi^2 (l / lambda)^2
(Balanis eq. 4-19). Result: R = (eta / 4 pi) (k D)^2 within 0.3 % for a quarter-wave stub and k D
up to 0.3 (4.5 % less at k S = 1.2): the form jpole._Prepared uses, spread over the stub's cos^2
current as a series resistance per metre eta k^3 D^2 / pi^2.
"""

import sys
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))
from buildsheet.physics.constants import C0, mu_0  # noqa: E402

ETA = mu_0 * C0   # free-space wave impedance, ohm


def stub_radiation_resistance(kD, kS, bar_only=False, n=200, nth=90, nph=180):
    """R (ohm) referred to the peak current at the short, k D and k S in radians (k = 1 units)."""
    th = (np.arange(nth) + 0.5) * np.pi / nth
    ph = (np.arange(nph) + 0.5) * 2 * np.pi / nph
    TH, PH = np.meshgrid(th, ph, indexing="ij")
    r = np.stack([np.sin(TH) * np.cos(PH), np.sin(TH) * np.sin(PH), np.cos(TH)], -1)
    zg, zw = np.polynomial.legendre.leggauss(n)
    z, zw = (zg + 1) * kS / 2, zw * kS / 2
    xg, xw = np.polynomial.legendre.leggauss(16)
    x, xw = xg * kD / 2, xw * kD / 2
    N = np.zeros(TH.shape + (3,), complex)
    if not bar_only:
        pa = np.exp(1j * (r[..., 0:1] * kD / 2 + r[..., 2:3] * z))
        pb = np.exp(1j * (-r[..., 0:1] * kD / 2 + r[..., 2:3] * z))
        N[..., 2] = ((pa - pb) * np.cos(z) * zw).sum(-1)
    N[..., 0] = (np.exp(1j * r[..., 0:1] * x) * xw).sum(-1)
    n_perp = N - (N * r).sum(-1)[..., None] * r
    d_omega = np.sin(TH) * (np.pi / nth) * (2 * np.pi / nph)
    return ETA / (16 * np.pi ** 2) * ((np.abs(n_perp) ** 2).sum(-1) * d_omega).sum()


def main():
    for kl in (0.05, 0.2):
        r = stub_radiation_resistance(kl, 1.0, bar_only=True)
        print(f"short dipole k l = {kl}: R {r:.5g} ohm, 80 pi^2 (l/lambda)^2 = {80 * np.pi ** 2 * (kl / 2 / np.pi) ** 2:.5g}")
    for kD in (0.01, 0.05, 0.157, 0.3):
        for kS in (1.2, 1.4, np.pi / 2):
            r = stub_radiation_resistance(kD, kS)
            print(f"stub k D {kD:.3f}, k S {kS:.3f}: R {r:.4g} ohm = {r / (ETA / 4 / np.pi * kD ** 2):.4f} (eta/4pi)(kD)^2")


if __name__ == "__main__":
    main()
