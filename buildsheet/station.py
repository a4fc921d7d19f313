"""Readings taken at the station end of the feed coax, carried back to the tap (issue 16, item 4):
owns the coax between the tap and the station as `fit` sees it, the de-embedding of a sweep (or of SWR
readings) through it, what the coax hides, and the loss beyond which a station reading is refused.
It changes no file.

Symbols (SI: Hz, m, ohm, dB where named *_db):
    Z0, gamma    the feed coax's characteristic impedance (real: the catalogue's datasheet figure) and
                 propagation constant alpha + j beta (solver.coax_line_model: Line.nominal from the
                 catalogue's Z0, velocity factor and matched loss)
    l            the coax between the tap and the station: the Solution's cut list's `feed coax` (the run
                 to the station, the turns of the choke and the pigtail at the tap). The choke is a
                 common-mode device: for the signal inside the coax it is only more coax, so its turns
                 count as length and nothing else
    rho_st       reflection coefficient at the station end on Z0; rho_tap the same at the tap end
    A            matched (one-way) loss of the coax, dB: 20 log10(e) alpha l

Method.
1. De-embedding. On a line of real Z0 (Line.nominal is distortionless, so its Z0 is exactly real) a
   load's reflection coefficient is carried to the input as rho_st = rho_tap e^(-2 gamma l) (textbook:
   Ramo, Whinnery & Van Duzer, the reflection form of the input impedance; lines.input_impedance),
   so rho_tap = rho_st e^(2 gamma l) exactly, and z_tap = Z0 (1 + rho_tap)/(1 - rho_tap). For SWR
   readings (no phase) only the magnitude is needed, and it is exact whatever the phase:
   |rho_tap| = |rho_st| e^(2 alpha l) = |rho_st| 10^(A/10).
2. What the coax hides: every reflection comes back 2A dB weaker, so |rho| at the station is
   10^(-A/10) of |rho| at the tap (an SWR of 2 at the tap reads lower at the station; `hidden_text`).
3. The limit. De-embedding multiplies any error of the reading by the same 10^(A/10). An analyzer is
   trusted to |rho| within MAX_REFLECTION - 1 = 0.05 (touchstone.MAX_REFLECTION: common practice, a
   calibrated analyzer reads an open or a short within a few per cent). The fit's gate (fit.FIT_GATE,
   0.276 in |rho|) takes a residual above it for a sweep of something else; the model's own error
   reaches 0.081 at its 90th percentile (fit.HELD_OUT_P90). A station sweep is meaningful only while
   the analyzer's error, carried to the tap, leaves room for the model's error under the gate:
       0.05 * 10^(A/10) + 0.081 <= 0.276   ->   A <= 10 log10(0.195/0.05) = 5.9 dB.
   Beyond that an error the analyzer is allowed to make could by itself decide whether the sweep is
   accepted, and the advice would follow the error, not the antenna: such readings are refused with
   what to do instead (measure at the tap, or through a shorter or better coax). The catalogue's loss
   and velocity factor are taken as exact; a cable that differs from its datasheet turns the
   de-embedded sweep's phase by 2 beta l times the relative error of its velocity factor, which the
   text states per per cent (turn_deg_per_percent). bench/fit_field.py measures what that costs: a
   cable 2 % slow and 20 % lossier than the catalogue's left SWR up to 1.63 after one round on NEC-2's
   mis-cut 20 m antennas (1.22 with the catalogue's cable), 1.11 after two.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from buildsheet import units
from buildsheet.design import Design
from buildsheet.errors import SweepError
from buildsheet.physics.lines import Line, reflection, swr_of
from buildsheet.solver import Solution, coax_line_model
from buildsheet.touchstone import MAX_REFLECTION, Sweep
from buildsheet.valueclass import valueclass

#: where a sweep or readings may be taken: at the tap (through the choke's short pigtail) or at the
#: station end of the feed coax
PLACES = ("tap", "station")
#: the analyzer's allowed |rho| error (module docstring, step 3)
ANALYZER_ERROR = MAX_REFLECTION - 1.0


def max_loss_db() -> float:
    """The largest one-way matched coax loss (dB) through which a station reading is de-embedded
    (module docstring, step 3): 10 log10((FIT_GATE - HELD_OUT_P90) / ANALYZER_ERROR)."""
    from buildsheet.fit import FIT_GATE, HELD_OUT_P90
    return 10.0 * math.log10((FIT_GATE - HELD_OUT_P90) / ANALYZER_ERROR)


@valueclass
class Coax:
    """The coax between the tap and the station: name, line model, length (m), and its one-way
    matched loss (dB) at the design frequency."""
    name: str
    line: Line
    length_m: float
    z0_ohm: float
    loss_db_f0: float
    frequency_hz: float
    #: what the cut list says the length holds (the run, the choke's turns or a sleeve, the pigtail)
    note: str = ""

    def loss_db(self, f) -> np.ndarray:
        """One-way matched loss, dB, at frequencies f (Hz)."""
        return 20.0 * math.log10(math.e) * np.real(self.line.gamma(np.asarray(f, dtype=float))) * self.length_m


def feed_coax(design: Design, solution: Solution) -> Coax:
    """The coax the station sees the antenna through (module docstring, symbols)."""
    item = next(i for i in solution.cut_list if i.part == "feed coax")
    line = coax_line_model(design)
    f0 = design.frequency_hz
    coax = Coax(name=design.feed.coax, line=line, length_m=float(solution.feed_coax_m),
                z0_ohm=float(design.feed.coax_z0_ohm), loss_db_f0=0.0, frequency_hz=f0, note=item.note)
    return dataclasses.replace(coax, loss_db_f0=float(coax.loss_db(f0)))


def check_loss(coax: Coax, f, file: str | None, key: str | None = None) -> None:
    """SweepError when the coax's matched loss at the highest frequency f exceeds max_loss_db()."""
    worst = float(np.max(coax.loss_db(f)))
    limit = max_loss_db()
    if worst > limit:
        raise SweepError(
            f"was taken at the station through {units.format_length(coax.length_m, 'metric')} of "
            f"{coax.name} with {worst:.1f} dB matched loss; beyond {limit:.1f} dB an analyzer's "
            f"allowed error ({ANALYZER_ERROR:g} in |rho|), multiplied by the coax's two-way loss, "
            "could alone decide the fit: measure at the tap, or through a shorter or lower-loss coax",
            file=file, key=key)


def to_tap(sweep: Sweep, coax: Coax) -> Sweep:
    """The sweep carried from the station end of `coax` back to the tap (module docstring, step 1).
    SweepError when the loss is beyond the limit, or when the result reflects more than a passive
    antenna can (the coax loses less than the catalogue says, or the analyzer is not calibrated)."""
    f = sweep.frequency_hz
    check_loss(coax, f, sweep.path)
    with np.errstate(all="ignore"):
        rho = reflection(sweep.z_ohm, coax.z0_ohm) * np.exp(2.0 * coax.line.gamma(f) * coax.length_m)
        mag = np.abs(rho)
    _check_passive_at_tap(mag, f, coax, sweep.path)
    with np.errstate(all="ignore"):
        z = coax.z0_ohm * (1.0 + rho) / (1.0 - rho)
    return Sweep(frequency_hz=f, z_ohm=z.astype(complex), path=sweep.path, lines=sweep.lines)


def rho_to_tap(f, rho_station, coax: Coax, file: str | None = None, key: str | None = None) -> np.ndarray:
    """|rho| at the tap from |rho| read at the station (SWR readings, no phase): exact on a line of
    real Z0 (module docstring, step 1)."""
    f = np.asarray(f, dtype=float)
    check_loss(coax, f, file, key)
    mag = np.asarray(rho_station, dtype=float) * 10.0 ** (coax.loss_db(f) / 10.0)
    _check_passive_at_tap(mag, f, coax, file, key)
    return np.minimum(mag, 1.0)


def _check_passive_at_tap(mag, f, coax: Coax, file, key=None) -> None:
    bad = np.nonzero(~(mag <= MAX_REFLECTION))[0]
    if len(bad):
        i = bad[0]
        raise SweepError(
            f"carried back through {units.format_length(coax.length_m, 'metric')} of {coax.name} "
            f"({coax.loss_db(f[i]):.2f} dB at {units.format_frequency(f[i])}) gives |rho| {mag[i]:.3g} "
            "at the tap, more than a passive antenna reflects: check the design's coax and length, "
            "that it was read at the station end, and the analyzer's calibration", file=file, key=key)


def hidden_text(coax: Coax, u: str = "metric") -> str:
    """One line: the coax, its loss, and how much it hides (module docstring, step 2)."""
    a = coax.loss_db_f0
    shown = lambda s: swr_of(((s - 1) / (s + 1)) * 10 ** (-a / 10))  # noqa: E731
    return (f"measured at the station through {units.format_length(coax.length_m, u)} of "
            f"{coax.name} (the cut list's feed coax: {coax.note}; velocity factor "
            f"{float(coax.line.velocity_factor(coax.frequency_hz)):.3g}, matched loss {a:.2f} dB at "
            f"{units.format_frequency(coax.frequency_hz)}): reflections come back {2 * a:.2f} dB weaker, "
            f"so SWR 1.5, 2 and 3 at the tap read {shown(1.5):.2f}, {shown(2.0):.2f} and {shown(3.0):.2f} "
            f"here; carried back to the tap through the coax (limit {max_loss_db():.1f} dB of loss); a cable "
            f"1 % off its datasheet velocity factor turns what is carried back by about "
            f"{turn_deg_per_percent(coax):.0f}°")


def turn_deg_per_percent(coax: Coax) -> float:
    """How far (degrees of rho's phase at the design frequency) the carried-back sweep turns for a
    cable whose velocity factor is 1 % off the catalogue's: 2 beta l times 0.01 (beta l the coax's
    electrical length in radians; beta is inversely proportional to the velocity factor)."""
    beta = float(np.imag(coax.line.gamma(coax.frequency_hz)))
    return math.degrees(2.0 * beta * coax.length_m * 0.01)
