"""Uniform TEM transmission lines (telegrapher's equations); owns line formulas only, no I/O, no design keys.

A `Line` is defined by its per-metre constants; z0(f) and gamma(f) are derived from them in one place,
and every other quantity here (input impedance, stubs, ABCD matrices) is derived from z0 and gamma.

Symbols (SI throughout; every function broadcasts over numpy arrays):

    f          frequency, Hz
    omega      angular frequency 2*pi*f, rad/s
    L, C       external inductance (H/m) and capacitance (F/m) per metre
    z_int(f)   series impedance per metre beyond j*omega*L: conductor resistance R(f) plus the
               internal reactance of the conductors, complex ohm/m
    G(f)       shunt conductance per metre, S/m
    Z, Y       series impedance Z = z_int + j*omega*L and shunt admittance Y = G + j*omega*C per metre
    z0         characteristic impedance sqrt(Z/Y), complex ohm
    gamma      propagation constant sqrt(Z*Y) = alpha + j*beta; alpha in Np/m, beta in rad/m
    vf         velocity factor omega/(beta*c)
    theta      electrical length beta*l, rad
    l          physical length, m
    z_load     load impedance, ohm (0 = short, np.inf = open)
    rho        reflection coefficient (named `Gamma` in most texts; renamed to keep gamma for propagation)
    eps_eff    effective relative permittivity of the space around a two-wire line
    tan_delta  dielectric loss tangent
    D, d       two-wire centre-to-centre spacing and wire diameter, m
"""

from __future__ import annotations

from typing import Callable

import numpy as np

from buildsheet.physics import ModelError
from buildsheet.physics.conductors import proximity_factor, wire_internal_impedance
from buildsheet.physics.constants import C0, epsilon_0, mu_0
from buildsheet.valueclass import valueclass

#: decibels per neper, 20/ln(10)
DB_PER_NEPER = 20.0 / np.log(10.0)


@valueclass
class _TwoWireConductorLoss:
    """z_int(f) of a two-wire line: two wires' internal impedance, times the proximity factor."""

    d: float
    sigma: float
    proximity: float

    def __call__(self, f):
        return 2.0 * self.proximity * wire_internal_impedance(f, self.d, self.sigma)


@valueclass
class _DielectricConductance:
    """G(f) = omega C tan_delta of a dielectric with a frequency-independent loss tangent."""

    C: float
    tan_delta: float

    def __call__(self, f):
        return 2.0 * np.pi * np.asarray(f, dtype=float) * self.C * self.tan_delta


@valueclass
class _ScaledAttenuation:
    """scale * alpha(f) with alpha(f) = k1 sqrt(f) + k2 f (Np/m); used for R(f) and G(f) of a nominal line."""

    k1: float
    k2: float
    scale: float

    def __call__(self, f):
        f = np.asarray(f, dtype=float)
        return self.scale * (self.k1 * np.sqrt(f) + self.k2 * f)


@valueclass
class Line:
    """Uniform TEM line defined by per-metre R(f), L, G(f), C; z0(f) and gamma(f) derived in one place.

    L: external inductance, H/m; C: capacitance, F/m; z_int: f (Hz) -> R(f) + jX_int(f), complex ohm/m;
    G: f (Hz) -> shunt conductance, S/m. Build one with `two_wire` (from geometry) or `nominal`
    (from datasheet or measured figures).
    """

    L: float
    C: float
    z_int: Callable[[np.ndarray], np.ndarray]
    G: Callable[[np.ndarray], np.ndarray]

    def series_impedance(self, f) -> np.ndarray:
        """Z = z_int(f) + j omega L, complex ohm/m; f in Hz (a float stays one: the solves' scalar
        path, where z_int can skip numpy)."""
        f = f if isinstance(f, float) else np.asarray(f, dtype=float)
        return self.z_int(f) + 2j * np.pi * f * self.L

    def shunt_admittance(self, f) -> np.ndarray:
        """Y = G(f) + j omega C, complex S/m; f in Hz (a float stays one, as in series_impedance)."""
        f = f if isinstance(f, float) else np.asarray(f, dtype=float)
        return self.G(f) + 2j * np.pi * f * self.C

    def z0_gamma(self, f) -> tuple[np.ndarray, np.ndarray]:
        """(z0, gamma): characteristic impedance z0 = sqrt(Z/Y), complex ohm, and propagation
        constant gamma = sqrt(Z Y) = alpha + j beta (Np/m, rad/m), from one evaluation of Z and Y;
        f in Hz (telegrapher's equations).

        Z and Y both lie in the first quadrant, so the principal square root gives alpha, beta >= 0.
        """
        z, y = self.series_impedance(f), self.shunt_admittance(f)
        return np.sqrt(z / y), np.sqrt(z * y)

    def z0(self, f) -> np.ndarray:
        """Characteristic impedance z0 = sqrt(Z/Y), complex ohm; f in Hz (see z0_gamma)."""
        return self.z0_gamma(f)[0]

    def gamma(self, f) -> np.ndarray:
        """Propagation constant gamma = sqrt(Z Y) = alpha + j beta (Np/m, rad/m); f in Hz (see z0_gamma)."""
        return self.z0_gamma(f)[1]

    def velocity_factor(self, f) -> np.ndarray:
        """vf = omega/(beta c), the phase velocity as a fraction of c; f in Hz."""
        f = np.asarray(f, dtype=float)
        return 2.0 * np.pi * f / (self.gamma(f).imag * C0)

    @property
    def z0_lossless(self) -> float:
        """sqrt(L/C), ohm: the nominal (high-frequency, lossless) characteristic impedance."""
        return float(np.sqrt(self.L / self.C))

    @classmethod
    def two_wire(cls, spacing, diameter, sigma, eps_eff=1.0, tan_delta=0.0) -> "Line":
        """Parallel round wires in a uniform medium (open-wire or window line).

        L = (mu0/pi) acosh(D/d), C = pi eps0 eps_eff / acosh(D/d), so the lossless
        z0 = (eta0/pi)/sqrt(eps_eff) acosh(D/d) and vf = 1/sqrt(eps_eff) (Ramo, Whinnery & Van Duzer,
        two-wire line; the handbook form uses 120 for eta0/pi = 119.917). Conductor loss: the exact
        round-wire internal impedance of both wires times the proximity factor (D/d)/sqrt((D/d)^2 - 1),
        so alpha ~ R/(2 z0) with R the loop resistance. Dielectric loss: G = omega C tan_delta.

        spacing: centre-to-centre D, m; diameter: d, m (D > d); sigma: conductor conductivity, S/m;
        eps_eff: effective relative permittivity (>= 1); tan_delta: loss tangent (>= 0).
        """
        if not (diameter > 0 and spacing > 0):
            raise ModelError(f"two-wire spacing and wire diameter must be positive, got spacing "
                              f"{spacing} m, diameter {diameter} m")
        if not sigma > 0:
            raise ModelError(f"conductor conductivity must be positive, got {sigma} S/m")
        if not eps_eff >= 1.0:
            raise ModelError(f"effective permittivity of a line must be at least 1, got {eps_eff}")
        if not tan_delta >= 0.0:
            raise ModelError(f"loss tangent must not be negative, got {tan_delta}")
        prox = float(proximity_factor(spacing, diameter))
        acosh_ratio = float(np.arccosh(spacing / diameter))
        L = mu_0 / np.pi * acosh_ratio
        C = np.pi * epsilon_0 * eps_eff / acosh_ratio
        return cls(L=L, C=C, z_int=_TwoWireConductorLoss(float(diameter), float(sigma), prox),
                   G=_DielectricConductance(C, float(tan_delta)))

    @classmethod
    def nominal(cls, z0, vf, loss_points=(), law="sqrt+linear") -> "Line":
        """A manufactured line from datasheet or measured figures: z0, vf and matched loss.

        z0: characteristic impedance, ohm (real, as datasheets give it); vf: velocity factor (0, 1];
        loss_points: ((f_hz, loss_db_per_m), ...) matched loss; law: "sqrt+linear" fits
        alpha(f) = k1 sqrt(f) + k2 f (conductor plus dielectric law) by non-negative least squares,
        "sqrt" fits k1 sqrt(f) only; a single point always uses the sqrt(f) conductor law. No points
        gives a lossless line.

        R(f) = z0 alpha(f) and G(f) = alpha(f)/z0 make R/L = G/C (Heaviside's distortionless
        condition), so the derived z0() is exactly the real datasheet value, gamma() is exactly
        alpha(f) + j omega/(vf c), and the datasheet loss and vf are reproduced exactly. Only the
        terminal behaviour (z0, gamma) is meant; the split of loss between R and G is not physical.
        """
        if not z0 > 0:
            raise ModelError(f"line impedance must be positive, got {z0} ohm")
        if not 0 < vf <= 1:
            raise ModelError(f"velocity factor must be in (0, 1], got {vf}")
        if law not in ("sqrt+linear", "sqrt"):
            raise ModelError(f"loss law must be 'sqrt+linear' or 'sqrt', got {law!r}")
        points = np.asarray(loss_points, dtype=float)
        if points.size and (points.ndim != 2 or points.shape[1] != 2):
            raise ModelError(f"loss points must be (frequency Hz, loss dB/m) pairs, got {loss_points}")
        points = points.reshape(-1, 2)
        if np.any(points[:, 0] <= 0) or np.any(points[:, 1] < 0):
            raise ModelError("loss points must be (frequency > 0 Hz, loss >= 0 dB/m) pairs, got "
                              f"{[tuple(p) for p in points]}")
        k1 = k2 = 0.0
        if len(points):
            f_pts, alpha_pts = points[:, 0], points[:, 1] / DB_PER_NEPER
            if law == "sqrt" or len(points) == 1:
                # least squares through the origin for the single sqrt(f) column
                k1 = float(np.dot(np.sqrt(f_pts), alpha_pts) / np.sum(f_pts))
            else:
                # scale the columns so nnls sees a well-conditioned matrix (sqrt(f) ~ 1e4, f ~ 1e8)
                f_ref = float(np.max(f_pts))
                basis = np.column_stack([np.sqrt(f_pts / f_ref), f_pts / f_ref])
                c1, c2 = _nnls_two_columns(basis, alpha_pts)
                k1, k2 = float(c1 / np.sqrt(f_ref)), float(c2 / f_ref)
        L = z0 / (vf * C0)
        C = 1.0 / (z0 * vf * C0)
        return cls(L=L, C=C, z_int=_ScaledAttenuation(k1, k2, float(z0)),
                   G=_ScaledAttenuation(k1, k2, 1.0 / z0))


def _nnls_two_columns(a: np.ndarray, b: np.ndarray) -> tuple[float, float]:
    """argmin |a x - b| over x >= 0 for a matrix a of two columns (non-negative least squares,
    exactly: the problem is convex, so its minimum is the least-squares solution on one face of the
    quadrant, x1 = 0, x2 = 0, both free or both 0, whichever is feasible and leaves the least
    residual). Replaces scipy.optimize.nnls here (tests/test_lines.py checks it against that), whose
    module costs a build about 0.3 s to import."""
    a = np.asarray(a, dtype=float)
    b = np.asarray(b, dtype=float)
    candidates = [np.zeros(2)]
    x, *_ = np.linalg.lstsq(a, b, rcond=None)
    if np.all(x >= 0):
        candidates.append(x)
    for j in (0, 1):
        col = a[:, j]
        norm2 = float(col @ col)
        if norm2 > 0:
            one = np.zeros(2)
            one[j] = max(0.0, float(col @ b) / norm2)
            candidates.append(one)
    best = min(candidates, key=lambda c: float(np.sum((a @ c - b) ** 2)))
    return float(best[0]), float(best[1])


def reflection(z, z_ref=50.0) -> np.ndarray:
    """Reflection coefficient rho = (z - z_ref)/(z + z_ref), complex; z, z_ref in ohm.

    z = np.inf (open) gives +1; z = -z_ref gives complex infinity rather than NaN. z_ref may be
    complex (a line's z0): this is then the voltage-wave ratio of the telegrapher's solution.
    """
    z = np.asarray(z, dtype=complex)
    z_ref = np.asarray(z_ref, dtype=complex)
    with np.errstate(divide="ignore", invalid="ignore"):
        rho = (z - z_ref) / (z + z_ref)
    rho = np.where((z + z_ref) == 0, complex(np.inf, 0.0), rho)
    return np.where(np.isinf(z), 1.0 + 0j, rho)


def swr(z, z_ref=50.0) -> np.ndarray:
    """Standing-wave ratio (1 + |rho|)/(1 - |rho|) of z on z_ref (ohm); |rho| >= 1 gives inf."""
    return swr_of(np.abs(reflection(z, z_ref)))


def swr_of(mag) -> np.ndarray:
    """Standing-wave ratio (1 + |rho|)/(1 - |rho|) from the reflection's magnitude |rho|; inf from
    |rho| = 1 up (a total reflection, or a sweep of a faulty analyser)."""
    mag = np.asarray(mag, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        s = (1.0 + mag) / (1.0 - mag)
    return np.where(mag >= 1.0, np.inf, s)


def input_impedance(line: Line, f, length, z_load) -> np.ndarray:
    """Impedance looking into `length` of `line` terminated in z_load, complex ohm.

    Z_in = z0 (z_load + z0 tanh(gamma l))/(z0 + z_load tanh(gamma l)), evaluated in the equivalent
    reflection form Z_in = z0 (1 + rho e^(-2 gamma l))/(1 - rho e^(-2 gamma l)), rho = (z_load - z0)/
    (z_load + z0), which has no 0/0 or inf/inf near the lossless quarter wave (textbook, e.g. Ramo,
    Whinnery & Van Duzer, transmission-line input impedance).

    f: Hz; length: m; z_load: ohm, 0 for a short, np.inf for an open; all broadcast together.
    """
    z0, gamma = line.z0_gamma(f)
    rho_in = reflection(z_load, z0) * np.exp(-2.0 * gamma * np.asarray(length, dtype=float))
    with np.errstate(divide="ignore", invalid="ignore"):
        z_in = z0 * (1.0 + rho_in) / (1.0 - rho_in)
    return np.where(rho_in == 1.0, complex(np.inf, 0.0), z_in)


def shorted_stub(line: Line, f, length) -> np.ndarray:
    """Input impedance z0 tanh(gamma l) of a stub shorted at the far end, complex ohm; f Hz, length m."""
    return input_impedance(line, f, length, 0.0)


def open_stub(line: Line, f, length) -> np.ndarray:
    """Input impedance z0 coth(gamma l) of a stub open at the far end, complex ohm; f Hz, length m."""
    return input_impedance(line, f, length, np.inf)


def abcd(line: Line, f, length):
    """Chain (ABCD) matrix of a line section: A = D = cosh(gamma l), B = z0 sinh(gamma l),
    C = sinh(gamma l)/z0 (textbook two-port form; AD - BC = 1 by reciprocity).

    [V_in, I_in] = [[A, B], [C, D]] @ [V_out, I_out], I_out flowing out into the load.
    f: Hz; length: m (broadcast). Returns the tuple (A, B, C, D) of complex arrays.
    """
    z0, gamma = line.z0_gamma(f)
    gl = gamma * np.asarray(length, dtype=float)
    cosh, sinh = np.cosh(gl), np.sinh(gl)
    return cosh, z0 * sinh, sinh / z0, cosh


def voltage_current_along(line: Line, f, length, v_load, i_load):
    """Voltage and current at distance `length` from the load, given the load's V and I (ABCD form).

    f: Hz; length: m from the load towards the source (an array gives the profile along the line);
    v_load: V (complex phasor); i_load: A, flowing into the load. Returns (V, I) complex arrays.
    """
    a, b, c, d = abcd(line, f, length)
    return a * v_load + b * i_load, c * v_load + d * i_load
