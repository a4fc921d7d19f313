"""Measured sweep -> fitted model -> trim advice and calibration: owns fitting the antenna model to an
impedance sweep measured at the tap, the advice on the short, the tap and the radiator, and writing the
fitted calibration into the design file. It must not change the model (physics/), the schema, or any
file but the design file and its backup (changed through editing.update_design).

Symbols (SI: Hz, m, ohm):
    f, f0        sweep frequencies and the design frequency
    z, z_ref     feed impedance, and the impedance the tap is matched to (feed.impedance)
    rho          reflection coefficient (z - z_ref)/(z + z_ref) (Gamma in most texts)
    w            weight of a point, (1 - |rho_meas|^2)^WEIGHT_POWER: 1 - |rho|^2 is the share of the
                 power the antenna accepts there
    L, S, T      radiator, stub (open top to the short) and tap (short to the tap), DESIGN.md §5
    D0           (L0, S0, T0): the antenna the sweep was taken on: the latest as-built entry of the
                 design's `record:` (its radiator/stub/tap; a length it does not give is taken as
                 designed), or solve(design) when the design has no entry (as_built())
    E            (L_e, S_e, T_e): the antenna's electrical lengths, at which the model reproduces the sweep
    a, k, v      calibration: radiator_scale, end_resistance_scale, stub_velocity_scale

Method.
1. Coverage. A fit needs the antenna's match inside the sweep: the lowest |rho| (on z_ref) must lie
   at least EDGE_POINTS points from either end, with |rho| rising by at least MIN_RISE on both sides
   of it. The sign of X is not used: this antenna's feed reactance is often inductive on both sides
   of the match, so X need not change sign even when the match is in the sweep.
2. Fit. Bounded least squares (scipy.optimize.least_squares, trust-region reflective, at most
   MAX_NFEV evaluations per start, started from the best points of a grid) of the model's feed
   impedance, with the design's calibration, over E. Residual per point: (rho_model - rho_meas) w.
   The reflection coefficient keeps high-impedance points from dominating as ohms would, and w keeps
   the far skirts, where the stub's off-resonance reactance rules, from outweighing the match. First
   with the radiator as built (L_e = L0), then with L_e free as well.
   Gate. A sweep the model cannot reproduce is refused before any advice (explained()): the fit's
   own weighted residual, normalized by the weights, sqrt(sum w |rho_fit - rho_meas|^2 / sum w)
   (an rms |rho| error concentrated on the match, where w is near 1), must not exceed FIT_GATE.
   FIT_GATE comes from the model's held-out error (physics/jpole.py docstring: the model's 50-ohm
   reflection coefficient at the dimensions where NEC-2 matches is 0.034 median, 0.081 at the 90th
   percentile, over held-out designs): taking that error as log-normal through those two
   percentiles (sigma = ln(0.081/0.034)/1.2816 = 0.677), its 99.9th percentile is
   0.034 exp(3.090 * 0.677) = 0.28. The fit moves three lengths, so its residual on a sweep of this
   antenna is no larger than the model's error at fixed lengths; a residual above the 99.9th
   percentile of that error is taken as a sweep of something else (another antenna, this antenna
   through a network, a faulty connection). Measured while building the gate (tests/test_fit_field.py):
   NEC-2 sweeps of mis-cut 20 m J-poles give 0.007-0.016, the demo sweep (NEC-2, real ground) 0.22;
   a sharp loop resonance 0.48-0.55, an end-fed wire through a 1:49 transformer 0.86-0.88.
   A sweep with |rho| above touchstone.MAX_REFLECTION anywhere is refused as from an uncalibrated
   analyzer (the readers refuse such files already; this covers sweeps given to fit_sweep directly).
3. Advice. Target: the model's own match at f0, (L_t, S_t, T_t). The radiator is retuned to
   resonance only if fitting L_e cut the rms residual to RADIATOR_EVIDENCE of the fit without it,
   the two residuals compared only if the fit without it left one an analyzer could show (above
   RESOLVABLE_RMS). Below that (a sweep the model itself made: both residuals at rounding level,
   and comparing them would decide by the last bits of the arithmetic) the sweep says nothing
   about the radiator, and the radiator as built decides: it is retuned if bringing it to
   resonance is a move the tape makes (at least the smallest move, as the steps round them);
   otherwise it is left as it is (L_t = L_e) and the stub and tap are matched to it. At the feed the
   radiator is seen only through the stub, so a model error is easily taken for a radiator error:
   against NEC-2 sweeps of 20 m antennas (tests/test_fit.py, measured while writing this module) the
   fitted L_e came out 5-8 % long even for an antenna cut exactly, and trimming by it left SWR about
   1.6 after the moves, where leaving the radiator and matching the stub to it left 1.03 (cut
   exactly) and 1.22-1.29 (radiator 3 %, stub 5 %, tap 40 % long). The moves are target - E, made on
   the antenna as built, so the advised dimensions are D0 + target - E. swr_after is the fitted
   model's SWR at f0 after the moves as printed (rounded for the tape).
   A design whose calibration names this sweep (calibration.source is the sweep's file name) was
   already corrected by it: solve() gives the dimensions the earlier fit advised. Fitting the same
   sweep again with that calibration would fold the correction in twice, so the advice is then the
   sheet's dimensions themselves, moved to from the antenna as built, and no new calibration is
   offered; the sweep is fitted (and gated) with the model as it was before that calibration (none
   is assumed: an earlier one is not kept in the file) (`fit --write` followed by `fit` on the same sweep asks for nothing beyond the first
   fit's moves; once the moves are recorded with `record`, for nothing at all).
   A `construction: tube` build (rigid pipe or rod: the short is soldered or bolted and stays where it
   is; the sheet tunes it by the long element's top and the tap) is never told to move the short. Its
   target keeps the stub at the fitted electrical stub, S_t = S_e, and solves the 2-D match for the
   radiator and the tap: z_feed(f0; L_t, S_e, T_t) = z_ref (bounded least squares of the reflection
   coefficient on (L, T), from E and from the resonant radiator, within the tube's reach:
   L within ELECTRICAL_BOUNDS[0] of L_e, 0 < T < S_e). Where no match (|rho| <= MATCH_RHO) lies in
   that reach the target is the point of least SWR there, and the text says so. The moves then have no short step,
   the radiator step is trimming the long element's top (a radiator that must grow calls for a
   sliding sleeve or a new long element: pipe cannot be lengthened), and the order is the sheet's:
   the top first, then the tap (TUBE_STEP_ORDER). The calibration is solved for that target with all
   three parameters free, so that `fit --write` then `fit` on the same sweep advises the same moves.
4. Calibration. (a, k, v) with which solve() gives the advised dimensions: a root (scipy.optimize.root,
   hybrid Powell) of solve()'s dimensions minus the advised ones; None, with the reason, when it lies
   outside what the design validator accepts (calibration_bounds), which is typical of a building
   error much larger than a model error: make the moves, sweep again, fit again. `write_calibration`
   stores it, so `solve` and `build` give the corrected sheet.

Why the fit is over E and the calibration follows from the advice, rather than fitting (a, k, v) at
D0 directly: a cut or tap error is not a model error. The stub velocity scale moves the tap's
electrical length together with the stub's, and no calibration parameter moves the tap alone, so a
tap off by 40 % cannot be represented; fitting (a, k, v) directly on sweeps that the model itself
made for such an antenna left rms |rho| residuals of 0.1-0.2 and advice that raised the SWR (measured
while building this module), whereas E is recovered exactly from such sweeps.
"""

from __future__ import annotations

import dataclasses
import math
import os
from dataclasses import dataclass
from datetime import datetime, timezone

import numpy as np
import yaml
from scipy.optimize import brentq, least_squares, root

from buildsheet import units
from buildsheet.editing import after_block, find_key, newline, put_block, scalar, top_level, update_design
from buildsheet.design import DATE_FORMAT, Calibration, Design, latest_as_built, parse_date
from buildsheet.errors import DesignError, RecordError, SweepError, one_line
from buildsheet.physics import jpole
from buildsheet.physics.lines import reflection, swr_of
from buildsheet.schema import CALIBRATION_RANGE
from buildsheet.sheet import MIN_MOVE_M, dip_tolerance_hz
from buildsheet.solver import Dimensions, antenna_model, solve
from buildsheet.touchstone import MAX_REFLECTION, Sweep
from buildsheet.valueclass import valueclass

#: fewest points a sweep may have: three lengths are fitted from it
MIN_POINTS = 7
#: points the lowest |rho| must have beyond it on each side
EDGE_POINTS = 2
#: rise of |rho| from its lowest value to the highest on each side of it: a match, not a ripple
MIN_RISE = 0.1
#: the advice retunes the radiator only if fitting its length makes the rms residual at most this
#: share of the residual with the radiator as built
RADIATOR_EVIDENCE = 0.1
#: a weighted rms |rho| residual below this is no evidence of anything: 100 times below the trace
#: noise of the best calibrated analyzers (about 1e-4 in |rho|, -80 dB; common practice, from
#: memory), 1e-6 is far beyond what a measured sweep resolves, and far above the rounding level
#: (1e-15) that a sweep made by the model itself leaves. Below it the fits' residuals are not
#: compared (step 3 of the module docstring)
RESOLVABLE_RMS = 1e-6
MAX_NFEV = 100
#: the weight of a point is (1 - |rho_meas|^2) to this power. Against NEC-2 sweeps of mis-cut 20 m
#: antennas (free space / perfect ground) 1 left SWR 1.31 / 1.25 after the moves, 2 left 1.29 / 1.22
WEIGHT_POWER = 2
#: largest normalized weighted rms |rho| residual of a fit that is taken as a sweep of this antenna:
#: the 99.9th percentile of a log-normal through the model's held-out error, 0.034 median and 0.081
#: 90th percentile (physics/jpole.py docstring, the constants of CAL; derivation in the module
#: docstring, step 2)
HELD_OUT_MEDIAN, HELD_OUT_P90 = 0.034, 0.081
_Z90, _Z999 = 1.2816, 3.0902          # standard normal quantiles of 0.90 and 0.999
FIT_GATE = HELD_OUT_MEDIAN * math.exp(_Z999 * math.log(HELD_OUT_P90 / HELD_OUT_MEDIAN) / _Z90)
#: bounds of the electrical lengths, as fractions of the built ones (radiator, stub, tap)
ELECTRICAL_BOUNDS = ((0.85, 1.15), (0.85, 1.15), (0.25, 4.0))
#: the grid the fit starts from (stub fractions times tap fractions; the radiator's fit starts from
#: the best fit without it) and how many of its best points start a least-squares search
_GRID_STUB = np.linspace(0.88, 1.12, 13)
_GRID_TAP = (0.5, 1.0, 2.0)
_STARTS = 2
#: a calibration must give the advised dimensions to this, m (well under the tape's 1/8 in or 1 mm)
CALIBRATION_TOLERANCE_M = 0.5e-3
#: calibration values are written to this many significant digits
CALIBRATION_DIGITS = 6


@dataclass(frozen=True, eq=False)
class Fit:
    """A fitted sweep and its advice; lengths in m, frequencies in Hz.

    built: D0; electrical: E; radiator_fitted: whether L_e was fitted (else L_e = L0);
    radiator_retuned: whether the advice brings the radiator to resonance (else it is left as it is,
    but for the small move the calibrated model makes of it); advised: the dimensions to move to;
    moves_m: radiator (+ add wire), short (+ toward the open top), tap (+ the tap clamp toward the
    open top), DESIGN.md §5 signs (on a tube build the short's is 0 and radiator_retuned is True: the
    long element's top is moved to match with the short fixed); moves_rounded_m: the same as printed for the tape;
    calibration: (a, k, v) giving `advised` from solve(), or None with calibration_note saying why;
    z_fit: the fitted model at the sweep's frequencies; fit_rms_ohm = rms |z_fit - z_meas|;
    fit_rms_reflection = rms |rho_fit - rho_meas|; swr_before: measured at f0 (None if f0 lies
    outside the sweep); best_hz, best_swr: the measured point of lowest SWR; swr_after: predicted.
    """
    design: Design
    sweep: Sweep
    units: str
    built: Dimensions
    electrical: tuple
    radiator_fitted: bool
    radiator_retuned: bool
    advised: tuple
    moves_m: dict
    moves_rounded_m: dict
    calibration: Calibration | None
    calibration_note: str | None
    z_fit: np.ndarray
    fit_rms_ohm: float
    fit_rms_reflection: float
    swr_before: float | None
    best_hz: float
    best_swr: float
    swr_after: float
    #: where D0 came from, for the text: "as-built entry of YYYY-MM-DD" or "the design's dimensions"
    built_from: str = "the design's dimensions"
    #: the design's calibration was fitted to this sweep (module docstring, step 3)
    already_calibrated: bool = False
    #: the story: (part, rounded move m, the fitted model's SWR at f0 after it), in STEP_ORDER, parts
    #: with no move left out
    steps: tuple = ()
    #: the sheet's dip tolerance (sheet.dip_tolerance_hz): the radiator is trimmed only for a dip
    #: further than this from f0 once the match is made
    dip_tolerance_hz: float = 0.0
    #: where the sweep was taken: "tap", or "station" (carried back through the feed coax, station.py)
    measured_at: str = "tap"
    #: what the coax hides (station.hidden_text), for a sweep taken at the station
    coax_note: str | None = None
    #: a `construction: tube` build: the short is fixed, the target keeps the fitted stub (module
    #: docstring, step 3)
    short_fixed: bool = False
    #: with the short fixed: the fitted model's SWR at f0 at the target (above swr_of(MATCH_RHO): no
    #: match lies in reach, the target is the least-SWR point there)
    target_swr: float = 1.0

    @property
    def target_matched(self) -> bool:
        return self.target_swr <= swr_of(MATCH_RHO)

    def to_dict(self, written: dict | None = None) -> dict:
        """The JSON of `fit --json` (DESIGN.md §6): SI units; `written` describes a --write."""
        cal = self.calibration
        s = self.sweep
        names = ("radiator", "stub", "tap")
        return {
            "name": self.design.name,
            "design_id": self.design.document_id,
            "frequency_hz": self.design.frequency_hz,
            "sweep": {"file": s.path, "points": len(s.frequency_hz),
                      "frequency_hz": [float(s.frequency_hz[0]), float(s.frequency_hz[-1])],
                      "measured_at": self.measured_at, "coax": self.coax_note},
            "calibration": None if cal is None else {
                "radiator_scale": cal.radiator_scale, "end_resistance_scale": cal.end_resistance_scale,
                "stub_velocity_scale": cal.stub_velocity_scale},
            "calibration_note": self.calibration_note,
            "electrical_m": dict(zip(names, self.electrical)),
            "radiator_fitted": self.radiator_fitted,
            "radiator_retuned": self.radiator_retuned,
            "short_fixed": self.short_fixed,
            "target_swr": self.target_swr,
            "fit_rms_ohm": self.fit_rms_ohm,
            "fit_rms_reflection": self.fit_rms_reflection,
            "built_m": {"radiator": self.built.radiator, "stub": self.built.stub, "tap": self.built.tap},
            "built_from": self.built_from,
            "already_calibrated": self.already_calibrated,
            "dimensions_m": dict(zip(names, self.advised)),
            "moves_m": dict(self.moves_m),
            "swr_before": self.swr_before,
            "best": {"frequency_hz": self.best_hz, "swr": self.best_swr},
            "swr_after": self.swr_after,
            "steps": [{"part": p, "move_m": m, "swr_after": a} for p, m, a in self.steps],
            "points": {"frequency_hz": s.frequency_hz.tolist(), "r_ohm": s.z_ohm.real.tolist(),
                       "x_ohm": s.z_ohm.imag.tolist(), "r_fit_ohm": self.z_fit.real.tolist(),
                       "x_fit_ohm": self.z_fit.imag.tolist()},
            "written": written,
        }


# ----------------------------------------------------------------------------------------------
# The calibrated model: solve.antenna_model with the calibration applied, exactly as `solve` uses it.

@valueclass
class _Model:
    """The antenna model with one calibration: feed impedance, 2-D match, and solve()'s resolve."""
    ant: jpole.Antenna

    def z_feed(self, f, L: float, S: float, T: float) -> np.ndarray:
        """Feed impedance (ohm) at frequencies f (Hz) for radiator L, stub S and tap T (m)."""
        return jpole.feed_impedance(np.atleast_1d(np.asarray(f, dtype=float)), self.ant, L, S, T)

    def match(self, f0: float, z_ref: float, L: float, start=None) -> tuple[float, float]:
        """(S, T), m, with z_feed = z_ref + j0 at f0 for radiator L, found from `start` (S, T) or
        from jpole.solve_match's; ValueError if there is none."""
        k = self.ant.end_resistance_scale
        if start is None:
            S, T = jpole.solve_match(f0, z_ref, self.ant, L)
            if k == 1.0:
                return S, T
            # the feed resistance goes nearly as k sin^2(beta T): start from the tap that undoes k
            start = (S, T / math.sqrt(k))

        def resid(x):
            z = self.z_feed(f0, L, x[0], x[1])[0]
            return [z.real / z_ref - 1.0, z.imag / z_ref]

        sol = root(resid, list(start), method="hybr", options={"maxfev": 60, "xtol": 1e-12})
        S, T = (float(x) for x in sol.x)
        if np.max(np.abs(resid(sol.x))) > 1e-6 or not 0 < T < S:
            raise ValueError(f"no stub/tap match for {z_ref} ohm at {f0:.6g} Hz")
        return S, T

    def resonant_length(self, f0: float, start: float | None = None) -> float:
        """solve()'s radiator: jpole.resonant_radiator_length with its default common-mode arm;
        from `start` (m) by a bracketed root within 2 % of it (the same root, found faster)."""
        if start is None:
            return jpole.resonant_radiator_length(f0, self.ant)
        def reactance(L):
            return float(np.imag(jpole.radiator_own_impedance(np.array([f0]), L, self.ant))[0])

        lo, hi = 0.98 * start, 1.02 * start
        if not reactance(lo) > 0 >= reactance(hi):
            return jpole.resonant_radiator_length(f0, self.ant)
        return float(brentq(reactance, lo, hi, xtol=1e-9 * start))

    def resolve(self, f0: float, z_ref: float, start=None) -> tuple[float, float, float]:
        """(L, S, T) as solve() chooses them: the resonant radiator, then the 2-D match; `start`:
        a nearby (L, S, T) to search from."""
        L = self.resonant_length(f0, None if start is None else start[0])
        return (L, *self.match(f0, z_ref, L, None if start is None else start[1:]))


#: a match with the short fixed: |rho| at f0 at most this (SWR 1.01, the last figure the text prints;
#: where the stub's error leaves a residual below it, e.g. 0.0007 for a 70 cm rod whose stub acts 2 %
#: short, no reading tells it from an exact match)
MATCH_RHO = 0.005


def fixed_short_target(model: _Model, f0: float, z_ref: float, E) -> tuple[tuple[float, float, float], float]:
    """((L_t, S_e, T_t), |rho| there): the radiator and tap with which the antenna E = (L_e, S_e, T_e)
    matches z_ref at f0 with its stub left at S_e (a `tube` build's short is fixed; module docstring,
    step 3). Bounded least squares of the reflection coefficient at f0 on (L, T), L within
    ELECTRICAL_BOUNDS[0] of L_e and 0 < T < S_e, from E and from the model's resonant radiator: the
    match, or where there is none in that reach (|rho| above MATCH_RHO), the point of least |rho|."""
    L_e, S_e, T_e = (float(x) for x in E)

    def residual(x):
        rho = reflection(model.z_feed(f0, x[0], S_e, x[1])[0], z_ref)
        return [rho.real, rho.imag]

    lo = np.array([ELECTRICAL_BOUNDS[0][0] * L_e, 1e-3 * S_e])
    hi = np.array([ELECTRICAL_BOUNDS[0][1] * L_e, 0.999 * S_e])
    starts = [(L_e, T_e)]
    try:
        starts.append((model.resonant_length(f0), T_e))
    except ValueError:
        pass
    best = None
    with np.errstate(all="ignore"):
        for L0, T0 in starts:
            x0 = np.clip([L0, T0], lo * (1 + 1e-9), hi * (1 - 1e-9))
            sol = least_squares(residual, x0, bounds=(lo, hi), method="trf", x_scale=[1e-3 * L_e, 1e-3 * S_e],
                                xtol=1e-12, ftol=1e-14, gtol=1e-14, max_nfev=200)
            if best is None or sol.cost < best.cost:
                best = sol
            if math.sqrt(2.0 * best.cost) <= 1e-9:
                break
    L_t, T_t = (float(v) for v in best.x)
    return (L_t, S_e, T_t), math.sqrt(2.0 * best.cost)


def _model(design: Design, cal: Calibration) -> _Model:
    return _Model(antenna_model(design.with_changes(calibration=cal)))


def calibration_bounds(design: Design) -> tuple[tuple[float, float], ...]:
    """(lo, hi) of radiator_scale, end_resistance_scale, stub_velocity_scale that the design
    validator accepts: CALIBRATION_RANGE for each (schema.py)."""
    return (CALIBRATION_RANGE,) * 3


# ----------------------------------------------------------------------------------------------
# Fitting

def check_coverage(sweep: Sweep, z_ref: float) -> int:
    """Index of the sweep's lowest |rho| on z_ref (ohm); SweepError if the sweep does not show the
    antenna's match with enough of a rise on both sides (module docstring, step 1)."""
    f = sweep.frequency_hz
    n = len(f)
    if n < MIN_POINTS:
        raise SweepError(f"has {n} points; a fit needs at least {MIN_POINTS} across the antenna's "
                         "match", file=sweep.path)
    with np.errstate(all="ignore"):
        mag = np.abs(sweep.reflection(z_ref))
    mag = np.where(np.isfinite(mag), mag, 1.0)     # an impedance too large for the division: an open
    if np.max(mag) > MAX_REFLECTION:
        j = int(np.argmax(mag))
        raise SweepError(f"has |S11| up to {mag[j]:.3g} (at {units.format_frequency(f[j])}), more than 1: "
                         "a passive antenna cannot reflect more than it receives; the analyzer is not "
                         "calibrated (calibrate it with open, short and load at the end of its cable); "
                         "nothing is fitted from it", file=sweep.path)
    i = int(np.argmin(mag))
    if not mag[i] < 1.0:
        raise SweepError(f"reflects all the power at every point (|S11| >= 1 on {z_ref:g} ohm even at "
                         "its best): no antenna is connected there, or the analyzer is not calibrated",
                         file=sweep.path)
    lowest = f"its lowest SWR ({swr_of(mag[i]):.2f}, at {units.format_frequency(f[i])})"
    advice = ("sweep a range with the lowest SWR well inside it, a few points beyond it on each side; "
              "the fit does not guess from a sweep that does not show the match")
    if i < EDGE_POINTS or i > n - 1 - EDGE_POINTS:
        end = "lower" if i < EDGE_POINTS else "upper"
        raise SweepError(f"does not cover the antenna's match: {lowest} is at its {end} end; {advice}",
                         file=sweep.path)
    rise = min(mag[:i].max(), mag[i + 1:].max()) - mag[i]
    if rise < MIN_RISE:
        raise SweepError(f"does not show a clear match: {lowest} is hardly lower than the rest of the "
                         f"sweep (|rho| rises only {rise:.2f} on one side, at least {MIN_RISE} is "
                         f"needed); {advice}", file=sweep.path)
    return i


def _fit_electrical(model: _Model, f, rho_meas, w, z_ref, D0: Dimensions, fit_radiator: bool,
                    start=None):
    """Least squares of the weighted reflection residual over the fractions (S/S0, T/T0) and, if
    fit_radiator, L/L0 (from `start`, the fit without it); else from the grid. Returns (fractions,
    rms weighted residual, names of the lengths that ended at a bound)."""
    def residual(x):
        lf = x[2] if fit_radiator else 1.0
        z = model.z_feed(f, D0.radiator * lf, D0.stub * x[0], D0.tap * x[1])
        r = (reflection(z, z_ref) - rho_meas) * w
        return np.concatenate([r.real, r.imag])

    bounds = [ELECTRICAL_BOUNDS[1], ELECTRICAL_BOUNDS[2]] + ([ELECTRICAL_BOUNDS[0]] if fit_radiator else [])
    lo, hi = np.array([b[0] for b in bounds]), np.array([b[1] for b in bounds])
    if start is None:
        starts = [np.array([s, t]) for s in _GRID_STUB for t in _GRID_TAP]
    else:
        starts = [np.array([start[0], start[1], 1.0])]
    costs = [float(np.sum(residual(x) ** 2)) for x in starts]
    best = None
    for i in np.argsort(costs)[:_STARTS]:
        sol = least_squares(residual, starts[i], bounds=(lo, hi), method="trf",
                            x_scale=np.where(np.arange(len(lo)) == 1, 0.1, 0.01), max_nfev=MAX_NFEV)
        if best is None or sol.cost < best.cost:
            best = sol
    x = best.x
    at_bound = np.nonzero((x - lo < 1e-3 * (hi - lo)) | (hi - x < 1e-3 * (hi - lo)))[0]
    rms = float(np.sqrt(2.0 * best.cost / len(f)))
    return x, rms, [("stub", "tap", "radiator")[j] for j in at_bound]


def as_built(design: Design) -> tuple[Dimensions, str]:
    """(D0, where it came from): the antenna as the latest as-built entry of `record:` gives it
    (design.latest_as_built), a length the entry does not give taken from solve(design);
    solve(design)'s dimensions when there is no entry with a length."""
    dims = solve(design).dimensions
    entry = latest_as_built(design.record)
    if entry is None:
        return dims, "the design's dimensions"
    given = [n for n, v in (("radiator", entry.radiator_m), ("stub", entry.stub_m), ("tap", entry.tap_m))
             if v is not None]
    D0 = dataclasses.replace(dims, **{n: getattr(entry, f"{n}_m") for n in given})
    rest = [n for n in ("radiator", "stub", "tap") if n not in given]
    note = f"; {' and '.join(rest)} as designed" if rest else ""
    return D0, f"as-built entry of {entry.date}{note}"


def calibrated_by(design: Design, sweep: Sweep) -> bool:
    """Whether the design's calibration was fitted to this sweep: its source names the sweep's file."""
    source = design.calibration.source
    return bool(source) and source == os.path.basename(sweep.path)


def fit_sweep(design: Design, sweep: Sweep, built: Dimensions | None = None, at: str = "tap") -> Fit:
    """Fit the model to `sweep`, measured at the tap of the antenna `built` (default: as_built(design),
    the latest as-built entry or the design's dimensions), and work out the moves and the
    calibration (module docstring). at="station": the sweep was taken at the station end of the feed
    coax and is first carried back to the tap through it (station.py). SweepError if the sweep cannot
    be fitted."""
    if design.stack is not None:
        raise design.fail("stack", "`fit` does not model the stacked version yet; tune it by the "
                          "sheet's table (short and tap, both elements alike)")
    f0, z_ref = design.frequency_hz, design.feed.impedance_ohm
    coax_note = None
    if at == "station":
        from buildsheet import station
        coax = station.feed_coax(design, solve(design))
        sweep = station.to_tap(sweep, coax)
        coax_note = station.hidden_text(coax, design.output.units)
    elif at != "tap":
        raise SweepError(f"'{at}' is not where a sweep is taken: tap or station", key="--at")
    f = sweep.frequency_hz
    check_coverage(sweep, z_ref)
    already = calibrated_by(design, sweep)
    if built is None:
        D0, built_from = as_built(design)
        if already and latest_as_built(design.record) is None:
            # no entry: the sweep was taken on the antenna cut to the sheet before this sweep's
            # calibration was written (a calibration before it is not kept in the file)
            D0 = solve(design.with_changes(calibration=Calibration())).dimensions
            built_from = "the design's dimensions before the calibration fitted to this sweep"
    else:
        D0, built_from = built, "given"
    # a sweep the calibration was fitted to is fitted again as it was then: without it (a calibration
    # before it is not kept in the file, so none is assumed)
    model0 = _model(design, Calibration() if already else design.calibration)
    rho_meas = sweep.reflection(z_ref)
    w = np.clip(1.0 - np.abs(rho_meas) ** 2, 0.0, 1.0) ** WEIGHT_POWER

    # the least squares see at most FIT_POINTS of the points (evenly by index, the match kept): the
    # fit's cost does not grow with an analyser's point count
    keep = _thinned(len(f), int(np.argmin(np.abs(rho_meas))))
    f_t, rho_t, w_t = f[keep], rho_meas[keep], w[keep]
    x2, rms2, edge2 = _fit_electrical(model0, f_t, rho_t, w_t, z_ref, D0, False)
    if edge2:
        raise SweepError(f"does not look like a sweep of this design's antenna: the fitted "
                         f"{' and '.join(edge2)} reached the edge of the range the fit allows "
                         f"(stub {ELECTRICAL_BOUNDS[1][0]:g}-{ELECTRICAL_BOUNDS[1][1]:g}, tap "
                         f"{ELECTRICAL_BOUNDS[2][0]:g}-{ELECTRICAL_BOUNDS[2][1]:g} times as built); "
                         "check that the sweep was taken at the tap (not through the coax) on the "
                         "antenna of this design file", file=sweep.path)
    x3, rms3, edge3 = _fit_electrical(model0, f_t, rho_t, w_t, z_ref, D0, True, start=x2)
    # a radiator fitted to the edge of its range is no description: keep it as built
    x = x3 if not edge3 else np.array([x2[0], x2[1], 1.0])
    retune = not edge3 and rms3 <= RADIATOR_EVIDENCE * rms2
    # both residuals below what an analyzer resolves (a sweep the model made): the sweep cannot say
    # whether the radiator is off, and rms3 <= 0.1 rms2 would compare rounding errors; decided below
    # by the radiator as built instead
    unresolved = not edge3 and rms2 <= RESOLVABLE_RMS
    E = (D0.radiator * x[2], D0.stub * x[0], D0.tap * x[1])
    z_fit = model0.z_feed(f, *E)

    explained(sweep, z_ref, rho_meas, reflection(z_fit, z_ref), w)
    # a `tube` build's short is soldered or bolted: the target keeps the fitted stub (docstring, step 3)
    fixed = design.construction == "tube"
    target_swr = 1.0
    try:
        if fixed:
            retune = True
            target, rho_t = fixed_short_target(model0, f0, z_ref, E)
            target_swr = float(swr_of(rho_t))
        else:
            resolved = model0.resolve(f0, z_ref) if retune or unresolved else None
            if unresolved:
                # the radiator as fitted (its length as built: nothing in the sweep moved it) is
                # retuned if bringing it to resonance is a move the tape makes (_tape_move)
                retune = _tape_move(resolved[0] - E[0], design.output.units) != 0.0
            target = resolved if retune else (E[0], *model0.match(f0, z_ref, E[0]))
    except ValueError as exc:
        raise SweepError(f"gives an antenna the model cannot match at "
                         f"{units.format_frequency(f0)} ({exc})", file=sweep.path) from None
    if already:
        sheet = solve(design).dimensions
        calibration, advised = None, (sheet.radiator, sheet.stub, sheet.tap)
        note = (f"already stored from this sweep ({design.calibration.date or 'undated'}): the sheet's "
                "dimensions carry its correction; after the moves, sweep again and fit the new sweep")
    else:
        try:
            calibration, note, advised = _calibrate(design, model0, E, D0, target, retune)
        except ValueError as exc:
            calibration, note = None, f"none found ({exc}); make the moves by hand"
            advised = tuple(np.array([D0.radiator, D0.stub, D0.tap]) + np.array(target) - np.array(E))
    if not 0 < advised[2] < advised[1]:
        raise SweepError("calls for a tap outside the stub; check the sweep and the design",
                         file=sweep.path)

    u = design.output.units
    moves = {"radiator": advised[0] - D0.radiator, "short": D0.stub - advised[1],
             "tap": (D0.stub - D0.tap) - (advised[1] - advised[2])}
    if fixed:
        # the target keeps the stub as built; what is left is the calibration's rounding (under
        # CALIBRATION_TOLERANCE_M, well under the tape's smallest move): not a move of a fixed short,
        # and the tap is measured from where the short is
        moves.update(short=0.0, tap=advised[2] - D0.tap)
    rounded = {key: _tape_move(m, u) for key, m in moves.items()}
    steps = []
    done = {"radiator": 0.0, "short": 0.0, "tap": 0.0}
    for part in (TUBE_STEP_ORDER if fixed else STEP_ORDER):
        if rounded[part] == 0:
            continue
        done[part] = rounded[part]
        steps.append((part, rounded[part], _swr_after(model0, f0, z_ref, E, done)))
    swr_after = steps[-1][2] if steps else _swr_after(model0, f0, z_ref, E, done)
    swr_before = None
    if f[0] <= f0 <= f[-1]:
        rho0 = np.interp(f0, f, rho_meas.real) + 1j * np.interp(f0, f, rho_meas.imag)
        swr_before = float(swr_of(abs(rho0)))
    i_best = int(np.argmin(np.abs(rho_meas)))
    return Fit(
        design=design, sweep=sweep, units=u, built=D0, electrical=tuple(float(e) for e in E),
        radiator_fitted=not edge3, radiator_retuned=bool(retune),
        advised=tuple(float(a) for a in advised), moves_m=moves,
        moves_rounded_m=rounded, calibration=calibration, calibration_note=note, z_fit=z_fit,
        fit_rms_ohm=float(np.sqrt(np.mean(np.abs(z_fit - sweep.z_ohm) ** 2))),
        fit_rms_reflection=float(np.sqrt(np.mean(np.abs(reflection(z_fit, z_ref) - rho_meas) ** 2))),
        swr_before=swr_before, best_hz=float(f[i_best]), best_swr=float(swr_of(abs(rho_meas[i_best]))),
        swr_after=swr_after, built_from=built_from, already_calibrated=already, steps=tuple(steps),
        dip_tolerance_hz=dip_tolerance_hz(solve(design)), measured_at=at, coax_note=coax_note,
        short_fixed=fixed, target_swr=target_swr)


#: the order of the moves (the sheet's tuning procedure: X with the short first, then R with the
#: tap, the radiator only once the match is made)
STEP_ORDER = ("short", "tap", "radiator")
#: the order on a `tube` build (the sheet's: the long element's top for the dip and X, then R with the
#: tap); the short is fixed
TUBE_STEP_ORDER = ("radiator", "tap")


def _tape_move(m: float, u: str) -> float:
    """A move as the tape makes it: rounded as the sheet prints lengths, and 0 below the smallest
    move worth making (sheet.MIN_MOVE_M), so that no step prints a move that rounds to nothing."""
    r = units.parse_quantity(units.format_length(abs(m), u), "length")
    return math.copysign(r, m) if r >= MIN_MOVE_M[u] - 1e-12 else 0.0


def _swr_after(model0: _Model, f0: float, z_ref: float, E, done: dict) -> float:
    """The fitted model's SWR at f0 after the moves `done` (DESIGN.md §5 signs) on the antenna E."""
    after = (E[0] + done["radiator"], E[1] - done["short"], E[2] + done["tap"] - done["short"])
    return float(swr_of(abs(reflection(model0.z_feed(f0, *after)[0], z_ref))))


def gate_residual(rho_meas: np.ndarray, rho_fit: np.ndarray, w: np.ndarray) -> float:
    """The gate's statistic: sqrt(sum w |rho_fit - rho_meas|^2 / sum w) (module docstring, step 2)."""
    total = float(np.sum(w))
    if not total > 0:
        return math.inf
    return float(np.sqrt(np.sum(w * np.abs(rho_fit - rho_meas) ** 2) / total))


def _dip_width(f: np.ndarray, mag: np.ndarray) -> float:
    """Width (Hz) of the frequencies around the lowest |rho| where |rho| stays below the level
    halfway between it and 1 (linear between points; to the sweep's end where it stays low)."""
    i = int(np.argmin(mag))
    level = 0.5 * (mag[i] + 1.0)
    lo = i
    while lo > 0 and mag[lo - 1] < level:
        lo -= 1
    hi = i
    while hi < len(f) - 1 and mag[hi + 1] < level:
        hi += 1
    def cross(a, b):    # frequency between points a (below level) and b (at or above)
        return f[a] + (f[b] - f[a]) * (level - mag[a]) / (mag[b] - mag[a])
    left = cross(lo, lo - 1) if lo > 0 else f[0]
    right = cross(hi, hi + 1) if hi < len(f) - 1 else f[-1]
    return float(right - left)


def explained(sweep: Sweep, z_ref: float, rho_meas, rho_fit, w) -> float:
    """The gate statistic of a fit; SweepError, saying what the sweep looks like and what to check,
    if it exceeds FIT_GATE (module docstring, step 2)."""
    g = gate_residual(rho_meas, rho_fit, w)
    if g <= FIT_GATE:
        return g
    f = sweep.frequency_hz
    width_meas = _dip_width(f, np.abs(rho_meas))
    width_fit = _dip_width(f, np.abs(rho_fit))
    if width_meas < 0.5 * width_fit:
        looks = (f"a much sharper resonance than this antenna's (its dip is {width_meas / width_fit:.2f} "
                 "times as wide as the best fit's), as a small loop or a tuned circuit gives")
    elif width_meas > 2.0 * width_fit:
        looks = (f"a much broader match than this antenna's (its dip is {width_meas / width_fit:.1f} "
                 "times as wide as the best fit's), as an antenna behind a transformer, a tuner or lossy "
                 "coax gives")
    else:
        looks = ("a match of another shape: R and X around the dip do not follow a half-wave fed by a "
                 "shorted stub (another kind of antenna, or this one through a network)")
    raise SweepError(f"is not explained by this design's antenna: the best fit misses it by {g:.2f} "
                     f"in |rho| near the match, where the model is within {FIT_GATE:.2f} of a J-pole "
                     f"(the 99.9th percentile of its own held-out error); the sweep looks like {looks}. "
                     "Check that it was taken at the tap of the antenna this design file describes, with "
                     "nothing between (no transformer, tuner or long coax), and the analyzer calibrated at "
                     "the end of its cable; no advice is given from it", file=sweep.path)


#: most points the least squares of a fit use
FIT_POINTS = 401


def _thinned(n: int, must: int) -> np.ndarray:
    """Indices of at most FIT_POINTS (+1) of n points, evenly spread, always holding `must`."""
    if n <= FIT_POINTS:
        return np.arange(n)
    return np.union1d(np.round(np.linspace(0, n - 1, FIT_POINTS)).astype(int), [must])


def _calibrate(design: Design, model0: _Model, E, D0: Dimensions, target, retune: bool):
    """(calibration or None, note or None, advised (L, S, T)): the calibration with which the
    calibrated model's resolve() gives D0 + target - E, and the dimensions it gives. target: the
    electrical (L, S, T) to move to. retune: the radiator goes to resonance (target is the design
    model's own resolve()); else it is left as it is, moved only as far as the calibrated model's
    resonance moves it (a change of the stub's velocity moves the common-mode arm the radiator works
    against), and the target is re-matched for that.
    The calibration is a root of three equations (two with the radiator left: radiator_scale is
    kept); None when the root lies outside calibration_bounds, with the reason."""
    f0, z_ref = design.frequency_hz, design.feed.impedance_ohm
    cal0 = design.calibration
    names = ("radiator_scale", "end_resistance_scale", "stub_velocity_scale")
    free = np.array([retune, True, True])
    x0 = np.array([getattr(cal0, n) for n in names])
    D0v = np.array([D0.radiator, D0.stub, D0.tap])
    warm = {"got": None, "target": None}

    def calibration(p) -> Calibration:
        x = x0.copy()
        x[free] = p
        return Calibration(**{n: float(v) for n, v in zip(names, x)})

    def state(p, exact=False):
        got = np.array(_model(design, calibration(p)).resolve(f0, z_ref, None if exact else warm["got"]))
        if not np.all(np.isfinite(got)):
            raise ValueError("the calibrated model gives no dimensions")
        if not retune:
            t_l = E[0] + got[0] - D0.radiator
            t = (t_l, *model0.match(f0, z_ref, t_l, None if exact else warm["target"]))
            warm["target"] = t[1:]
        else:
            t = target
        warm["got"] = got
        return got, D0v + np.array(t) - np.array(E)

    def residual(p):
        if np.any(p < 0.1 * CALIBRATION_RANGE[0]) or np.any(p > 10 * CALIBRATION_RANGE[1]):
            return np.full(int(free.sum()), 1.0)     # far outside any calibration: steer back
        try:
            got, want = state(p)
        except ValueError:
            return np.full(int(free.sum()), 1.0)     # no match for this trial calibration
        return ((got - want) / D0v)[free]

    with np.errstate(all="ignore"):
        sol = root(residual, x0[free], method="hybr", options={"maxfev": 40, "xtol": 1e-12})
    cal = calibration(sol.x)
    rounded = Calibration(**{n: float(f"{getattr(cal, n):.{CALIBRATION_DIGITS}g}") for n in names})
    got, want = state(np.array([getattr(rounded, n) for n in names])[free], exact=True)
    reasons = [_bound_reason(design, n, getattr(rounded, n), lo, hi)
               for n, (lo, hi) in zip(names, calibration_bounds(design))
               if not lo <= getattr(rounded, n) <= hi]
    if not reasons and np.max(np.abs(got - want)) <= CALIBRATION_TOLERANCE_M:
        return rounded, None, tuple(want)
    reason = "; ".join(reasons) or "no calibration gives these dimensions"
    return None, f"none stored: {reason}; make the moves by hand", tuple(want)


def _bound_reason(design: Design, name: str, value: float, lo: float, hi: float) -> str:
    """Why a calibration value outside calibration_bounds cannot be stored."""
    low, high = CALIBRATION_RANGE
    if not low <= value <= high:
        return (f"{name} would have to be {value:.4g}, outside the {low:g}-{high:g} a calibration may "
                "have (more like a building error than a model error: sweep again after the moves "
                "and fit again)")
    part = "radiator" if name == "radiator_scale" else "stub"
    return (f"{name} would have to be {value:.4g}, {'below' if value < lo else 'above'} "
            f"{lo if value < lo else hi:.4g}, which would make the {part}'s velocity factor exceed 1 "
            "(design files refuse that)")


# ----------------------------------------------------------------------------------------------
# Text

def fit_text(fit: Fit, written: dict | None = None) -> str:
    """The terminal report of `buildsheet fit`: the fit, the moves in the design's units, the SWR
    predicted after them, and what --write does or did."""
    u = fit.units
    fmt = lambda m: units.format_length(m, u)  # noqa: E731 - a local shorthand
    d, s = fit.design, fit.sweep
    D0, E, mv = fit.built, fit.electrical, fit.moves_rounded_m
    f0 = units.format_frequency(d.frequency_hz)
    rows: list[str] = []
    add = rows.append
    add(f"{d.title}  [{d.name}, document {d.document_id}]")
    add(f"sweep {os.path.basename(s.path)}: {len(s.frequency_hz)} points, "
        f"{units.format_frequency(s.frequency_hz[0])} to {units.format_frequency(s.frequency_hz[-1])}, "
        f"measured at the {fit.measured_at}")
    if fit.coax_note:
        add(f"  {fit.coax_note}; the figures below are at the tap")
    before = "outside the sweep" if fit.swr_before is None else f"{fit.swr_before:.2f}"
    add(f"measured: best SWR {fit.best_swr:.2f} at {units.format_frequency(fit.best_hz)}; "
        f"SWR at {f0}: {before}")
    add(f"the antenna measured: radiator {fmt(D0.radiator)}, stub {fmt(D0.stub)}, tap {fmt(D0.tap)} "
        f"({fit.built_from}); the moves below are from these")
    if fit.already_calibrated:
        add(f"the design's calibration was fitted to this sweep ({d.calibration.date or 'undated'}): the "
            "sheet's dimensions already carry its correction, so they are the target and nothing is "
            "added to them")
    add(f"fit: rms {units.format_impedance(fit.fit_rms_ohm)} (reflection {fit.fit_rms_reflection:.3f}) "
        "over the sweep, weighted to the match")
    radiator = f"radiator {fmt(E[0])}, " if fit.radiator_fitted else ""
    add(f"  the antenna behaves as the model with {radiator}stub {fmt(E[1])} and tap {fmt(E[2])}")
    if fit.short_fixed:
        add("  the short is fixed on this build (soldered or bolted; construction: tube): the long "
            "element's top and the tap do the matching, with the stub as it is")
        if not fit.target_matched:
            add(f"  no match at {f0} lies within reach with the short where it is (the long element "
                f"within {100 * (1 - ELECTRICAL_BOUNDS[0][0]):.0f} % of its fitted length, the tap on the "
                f"stub): the moves below go to the lowest SWR the model finds there, {fit.target_swr:.2f}; "
                "check the short's place and the stub's spacing against the sheet")
    if not fit.radiator_retuned:
        follow = ("; it moves only as far as the stub's correction moves its resonance (step below)"
                  if mv["radiator"] != 0 else "")
        add("  the radiator is not retuned: the sweep does not tell its length apart from the model's "
            f"own error, so the short and the tap do the matching{follow}")
    off = fit.best_hz - d.frequency_hz
    if not fit.radiator_retuned and abs(off) > fit.dip_tolerance_hz:
        add(f"  the measured dip is {units.format_frequency(abs(off))} {'below' if off < 0 else 'above'} "
            f"{f0}: the sheet's rule (tuning procedure) is to make the match with the short and the tap "
            f"first and to move the radiator only if the dip then stays more than "
            f"{units.format_frequency(fit.dip_tolerance_hz)} away; after the moves below the fitted model's "
            f"match is at {f0}, so the radiator is not moved for the dip")
    add("")
    before_swr = "" if fit.swr_before is None else f" (SWR there now {fit.swr_before:.2f})"
    if not fit.steps:
        add(f"At {f0}{before_swr}: nothing to move ({units.length_rounding(u)}, smallest move "
            f"{fmt(MIN_MOVE_M[u])}). Predicted SWR at {f0}: {fit.swr_after:.2f}.")
    else:
        add(f"To match at {f0}{before_swr}, in this order ({units.length_rounding(u)}):")
    # the tape's positions: each from the printed length, so that "from -> to" is the printed move
    tape = lambda m: units.parse_quantity(fmt(m), "length")  # noqa: E731
    stub_now, tap_now = tape(D0.stub), tape(D0.tap)
    for n, (part, m, swr_step) in enumerate(fit.steps, 1):
        then = f"; SWR at {f0} then about {swr_step:.2f}"
        if part == "short":
            passes = " Take the tap off first: the short passes its place." if m >= D0.tap else ""
            new_stub = stub_now - m
            add(f"  {n}. Short: move it {fmt(abs(m))} {'toward' if m > 0 else 'away from'} the top "
                f"(stub {fmt(stub_now)} -> {fmt(new_stub)}; the tap clamp stays where it is){then}."
                f"{passes}")
            tap_now, stub_now = tap_now - m, new_stub
        elif part == "tap":
            was = "after the short's move" if mv["short"] != 0 else "now"
            add(f"  {n}. Tap: move the clamp {fmt(abs(m))} {'up, toward' if m > 0 else 'down, away from'} "
                f"the top; it then sits {fmt(tap_now + m)} above the short ({fmt(tap_now)} {was}){then}.")
            tap_now += m
        elif fit.short_fixed:
            add(f"  {n}. {long_element_step(m, tape(D0.radiator), u)}{then}.")
        else:
            why = "" if fit.radiator_retuned else (", a small change that follows the stub's correction "
                                                   "(the radiator works against the stub's common mode)")
            add(f"  {n}. Radiator: {'add' if m > 0 else 'trim'} {fmt(abs(m))} "
                f"({fmt(tape(D0.radiator))} -> {fmt(tape(D0.radiator) + m)}){why}{then}.")
    left = [p for p in (TUBE_STEP_ORDER if fit.short_fixed else STEP_ORDER) if mv[p] == 0]
    if fit.steps and left:
        names = {"short": "the short", "tap": "the tap", "radiator": "the long element's top"
                 if fit.short_fixed else "the radiator"}
        add(f"  Leave {' and '.join(names[p] for p in left)} as {'it is' if len(left) == 1 else 'they are'}.")
    if fit.short_fixed:
        add("  The short stays where it is: it is fixed on this build.")
    if fit.steps:
        add(f"Predicted SWR at {f0} after these moves: {fit.swr_after:.2f}. Sweep again to check.")
    add("")
    cal = fit.calibration
    if written:
        add(f"Calibration written to {written['design']} (previous file: {written['backup']}); "
            f"document {written['design_id']}. `buildsheet solve` now gives these dimensions.")
    elif cal is not None:
        add(f"Calibration: radiator_scale {cal.radiator_scale:g}, end_resistance_scale "
            f"{cal.end_resistance_scale:g}, stub_velocity_scale {cal.stub_velocity_scale:g}; "
            "--write stores it so that `solve` gives these dimensions.")
    else:
        add(f"Calibration: {fit.calibration_note}.")
    return "\n".join(rows) + "\n"


def long_element_step(m: float, radiator: float, u: str) -> str:
    """The radiator's move on a `tube` build, the sheet's words: trim the long element's top, or, when
    it must grow, a sliding sleeve or a new long element (pipe or rod cannot be lengthened)."""
    fmt = lambda x: units.format_length(x, u)  # noqa: E731
    top = f"(radiator {fmt(radiator)} -> {fmt(radiator + m)})"
    if m < 0:
        return f"Long element: trim its top by {fmt(abs(m))} {top}"
    return (f"Long element: its top must be {fmt(m)} longer {top}: pipe or rod cannot be lengthened, "
            "so fit a sliding sleeve over its top or cut a new long element")


# ----------------------------------------------------------------------------------------------
# Writing the calibration into the design file (editing.py's splice helpers and update)

def sweep_date(path: str) -> str:
    """The sweep file's modification date, YYYY-MM-DD (UTC): when it was measured, as far as a file
    can say."""
    try:
        return datetime.fromtimestamp(os.path.getmtime(path), tz=timezone.utc).strftime("%Y-%m-%d")
    except OSError as exc:
        raise SweepError(f"cannot be read ({exc.strerror})", file=path) from None


def splice_calibration(text: str, cal: Calibration) -> str:
    """`text` with its `calibration:` value replaced by `cal` (a block mapping); every character
    outside that value is kept. No `calibration:` key: one is added at the end of the top-level
    mapping. Raises RecordError for a document written as one flow mapping."""
    root = top_level(text, "store the calibration by hand")
    nl = newline(text)
    entries = [("radiator_scale", repr(cal.radiator_scale)),
               ("end_resistance_scale", repr(cal.end_resistance_scale)),
               ("stub_velocity_scale", repr(cal.stub_velocity_scale)),
               ("source", scalar(cal.source)), ("date", scalar(cal.date))]

    def block(column: int) -> str:
        return "".join(f"{' ' * column}{key}: {value}{nl}" for key, value in entries)

    found = find_key(root, "calibration")
    value = found[1] if found else None
    if isinstance(value, yaml.MappingNode) and value.value:
        if value.flow_style:
            flow = "{" + ", ".join(f"{k}: {v}" for k, v in entries) + "}"
            return text[:value.start_mark.index] + flow + text[value.end_mark.index:]
        column = value.start_mark.column
        return text[:value.start_mark.index - column] + block(column) + text[after_block(text, value):]
    return put_block(text, root, "calibration", block)


def write_calibration(path: str, fit: Fit, date: str | None = None) -> dict:
    """Store fit.calibration (with the sweep's file name and `date`, default the sweep file's date) in
    the design file at `path`, which must still hold the design that was fitted. The result is read
    back and must equal the old design with the new calibration, and solve() of it must give the
    advised dimensions; only then is the file replaced (atomically, the old bytes kept as the
    backup). Returns {design, backup, design_id}. RecordError (nothing written) otherwise."""
    if fit.calibration is None:
        raise RecordError(f"no calibration written: {fit.calibration_note}", file=path)
    when = parse_date(date) if date is not None else sweep_date(fit.sweep.path)
    if when is None:
        raise RecordError(f"must be {DATE_FORMAT}, got '{one_line(str(date))}'", key="--date")
    cal = dataclasses.replace(fit.calibration, source=os.path.basename(fit.sweep.path), date=when)

    def change(text: str, old: Design):
        if old.with_changes(output=fit.design.output) != fit.design:
            raise RecordError("changed since it was read for the fit; nothing was written: run the "
                              "command again", file=path)
        return splice_calibration(text, cal), old.with_changes(calibration=cal)

    def refused(exc: DesignError, old: Design):
        return RecordError(f"the calibration cannot be stored ({exc.problem}); nothing was written",
                           file=path, key=exc.key)

    def verify(old: Design, new: Design) -> None:
        got = solve(new).dimensions
        diff = np.abs(np.array([got.radiator, got.stub, got.tap]) - np.array(fit.advised))
        if np.max(diff) > CALIBRATION_TOLERANCE_M:
            raise RecordError("`solve` with this calibration would not give the advised dimensions (off "
                              f"by {np.max(diff) * 1e3:.1f} mm: this version of the model does not apply "
                              "every calibration parameter yet); nothing was written: make the moves by "
                              "hand", file=path)

    done = update_design(path, change, refused=refused, verify=verify, what="the calibration")
    return {"design": path, "backup": done.backup, "design_id": done.new.document_id}
