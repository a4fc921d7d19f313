"""SWR readings without phase -> the dip and advice, with what SWR alone cannot tell (issue 16, part 5).
Owns reading SWR readings: typed ("14.1 MHz=1.8"; or return loss, "14.1 MHz=RL 10 dB"), from a CSV
(the sheet's measurement log under its own column names, or frequency and SWR or return loss:
read_readings) and from the record's latest entry with readings (record_readings); finding the dip
from them and the advice. It changes no file (record.py stores readings).

Method.
1. |rho| from each reading: (SWR - 1)/(SWR + 1), or 10^(-RL/20) for a return loss RL in dB. Readings
   taken at the station end of the feed coax are carried back to the tap first: |rho| times
   10^(A/10), A the coax's one-way matched loss (station.py; exact on a line of real Z0).
2. The dip. Near a match rho is close to linear in frequency, so |rho|^2 is a parabola in f
   (|rho|^2 = |rho_d|^2 + c (f - f_d)^2 for rho = rho_d + a (f - f_d) with a orthogonal to rho_d;
   any offset only shifts f_d): the parabola through the lowest reading and its two neighbours gives
   the dip frequency f_d and its depth |rho_d| (over wider spans |rho|^2 departs from a parabola: five
   readings over +/-1 % put a 1.04 dip at 1.09 on the model's own readings, three at the centre
   within 0.05). Three readings are the least; the dip must lie between the lowest and highest
   reading (else: read further).
3. What the readings say about R and X at the dip, and the advice. The dip's depth alone fits R above
   or below the reference or a reactance X (SWR 1.5 is R 75 or 33 ohm, or 50 ohm with X +/-20 ohm);
   its width tells them apart, because the model knows how fast this antenna's impedance moves with
   frequency (for a given distance of the locus from the match, |rho| rises fast when the impedance
   sweeps through it quickly on a small circle, slowly on a large one). So the model's |rho| is
   fitted to the readings (least squares over the stub and the tap as electrical lengths, the
   radiator as read, from the best points of a grid; fit.py's step 2 with magnitudes only), as
   `fit` does with phase, and the moves are made as `fit` makes them with the radiator left as it
   is (the sheet's rule: the match with the short and the tap first): the stub and the tap matched
   at f0, in the sheet's order, each with the model's SWR after it. On a `construction: tube` build
   the short is fixed: as in `fit` (fit.py's docstring, step 3), the stub stays as fitted and the long
   element's top and the tap make the match (fit.fixed_short_target), the top first. Readings the model cannot follow
   (rms |rho| residual above fit.FIT_GATE) are refused. The old advice here (the dip moved by the
   sheet's rate, the tap by R = 50 SWR or 50/SWR) took a reactance at the dip for a resistance and
   the tap's shift of the dip for the radiator's: NEC-2 readings of the tap 40 % long gave SWR 1.64
   after one round; this gives 1.02 (tests/test_fit_field.py).
   What SWR alone cannot tell: the mirror image of the antenna about the match gives the same
   readings to first order. The best fit with the other sign of X at the dip is kept as the
   alternative; the one reading that settles it is the SWR at the frequency where the two fitted
   antennas differ most (both values printed); without an alternative, an analyzer's R and X at the
   dip.
"""

from __future__ import annotations

import math
import re

import numpy as np
from scipy.optimize import least_squares

from buildsheet import fit as fitmod
from buildsheet import units
from buildsheet.design import Design
from buildsheet.errors import SweepError
from buildsheet.physics.lines import reflection, swr_of
from buildsheet.sheet import LOG_COLUMNS
from buildsheet.solver import solve
from buildsheet.touchstone import FREQUENCY_RANGE_HZ, csv_rows
from buildsheet.valueclass import valueclass

#: readings the parabola passes through: the lowest and its neighbours (module docstring, step 2)
PARABOLA_POINTS = 3
MIN_READINGS = 3


@valueclass
class SwrAdvice:
    """frequency_hz, rho: the readings (|rho| at the tap, after the coax for readings at the station);
    dip_hz, dip_swr: the parabola's dip; built, built_from: the antenna read (fit.as_built);
    electrical: (L, S, T) at which the model's |rho| fits the readings best, fit_rms its rms |rho|
    residual; moves_rounded_m, steps, swr_after: the moves as `fit` gives them (radiator, short, tap;
    DESIGN.md §5 signs) and the model's SWR at f0 after each; alternative: the best fit with the
    opposite sign of X at the dip ({electrical, fit_rms, moves_rounded_m, steps, swr_after}) or None;
    settle: (Hz, SWR if the advice's antenna, SWR if the alternative's) the one further reading that
    tells them apart, or None; measured_at, coax_note: where the readings were taken."""
    design: Design
    frequency_hz: np.ndarray
    rho: np.ndarray
    dip_hz: float
    dip_swr: float
    built: object
    built_from: str
    electrical: tuple
    fit_rms: float
    moves_rounded_m: dict
    steps: tuple
    swr_after: float
    alternative: dict | None
    settle: tuple | None
    measured_at: str = "tap"
    coax_note: str | None = None
    #: a `construction: tube` build: the short is fixed, the long element's top and the tap make the
    #: match (fit.fixed_short_target); target_swr: the model's SWR at f0 at that target
    short_fixed: bool = False
    target_swr: float = 1.0


def parse_reading(text: str, key: str = "--swr") -> tuple[float, float]:
    """'14.1 MHz=1.8' (SWR) or '14.1 MHz=RL 10 dB' (return loss) -> (Hz, |rho|); SweepError."""
    m = re.fullmatch(r"\s*([^=]+?)\s*=\s*(?:(rl)\s*([0-9.eE+-]+)\s*db|([0-9.eE+-]+))\s*", text, re.I)
    if not m:
        raise SweepError(f"'{text}' is not a reading: write FREQUENCY=SWR ('14.1 MHz=1.8') or "
                         "FREQUENCY=RL dB ('14.1 MHz=RL 10 dB')", key=key)
    try:
        f = units.parse_quantity(m.group(1), "frequency")
    except Exception:
        raise SweepError(f"'{m.group(1)}' is not a frequency with a unit", key=key) from None
    value = float(m.group(3) or m.group(4))
    if m.group(2):
        if not value > 0:
            raise SweepError(f"return loss {value:g} dB: it must be above 0 dB", key=key)
        return f, 10.0 ** (-value / 20.0)
    if not value >= 1.0 or not np.isfinite(value):
        raise SweepError(f"SWR {value:g}: an SWR is 1 or more", key=key)
    return f, (value - 1.0) / (value + 1.0)


def advise(design: Design, readings: list[tuple[float, float]], at: str = "tap", built=None,
           source: str | None = None) -> SwrAdvice:
    """The dip and the advice from (Hz, |rho|) readings (module docstring). at="station": |rho| read
    at the station end of the feed coax (station.py). built: the antenna read (default
    fit.as_built). SweepError if they do not show a dip or the model cannot follow them."""
    key = "--swr" if source is None else None
    if len(readings) < MIN_READINGS:
        raise SweepError(f"{len(readings)} reading(s); the dip needs at least {MIN_READINGS}, on both "
                         "sides of the lowest SWR", file=source, key=key)
    readings = sorted(readings)
    f = np.array([r[0] for r in readings])
    rho = np.array([r[1] for r in readings])
    if np.any(np.diff(f) <= 0):
        raise SweepError("two readings at the same frequency; give each frequency once", file=source,
                         key=key)
    if not (FREQUENCY_RANGE_HZ[0] <= f[0] and f[-1] <= FREQUENCY_RANGE_HZ[1]):
        raise SweepError("a reading's frequency is not between 1 Hz and 1 THz (is the unit right?)",
                         file=source, key=key)
    if np.ptp(rho) == 0:
        raise SweepError("the readings are all the same SWR: they show no dip; read around the lowest "
                         "SWR, where it rises on both sides", file=source, key=key)
    coax_note = None
    if at == "station":
        from buildsheet import station
        coax = station.feed_coax(design, solve(design))
        rho = station.rho_to_tap(f, rho, coax, source, key)
        coax_note = station.hidden_text(coax, design.output.units)
    i = int(np.argmin(rho))
    if i == 0 or i == len(f) - 1:
        side = "below" if i == 0 else "above"
        raise SweepError(f"the lowest SWR is the reading at the {'lowest' if i == 0 else 'highest'} "
                         f"frequency: the dip lies {side} your readings; read further {side}",
                         file=source, key=key)
    lo = max(0, min(i - PARABOLA_POINTS // 2, len(f) - PARABOLA_POINTS))
    sel = slice(lo, lo + PARABOLA_POINTS)
    f0 = design.frequency_hz
    x = (f[sel] - f0) / f0
    a, b, c = np.polyfit(x, rho[sel] ** 2, 2)
    if not a > 0:
        raise SweepError("the readings do not show a dip (the SWR does not rise on both sides of the "
                         "lowest); read closer around the lowest SWR", file=source, key=key)
    dip_hz = f0 * (1 - b / (2 * a))
    depth = float(np.sqrt(max(c - b * b / (4 * a), 0.0)))

    if built is None:
        D0, built_from = fitmod.as_built(design)
    else:
        D0, built_from = built, "given"
    model = fitmod._model(design, design.calibration)
    z_ref = design.feed.impedance_ohm
    fits = _magnitude_fits(model, f, rho, z_ref, D0)
    best = fits[0]
    if best["fit_rms"] > fitmod.FIT_GATE:
        raise SweepError(f"do not follow this design's antenna: the model's best fit to them misses by "
                         f"{best['fit_rms']:.2f} in |rho| (rms), more than the {fitmod.FIT_GATE:.2f} the "
                         "model may be off on a J-pole; check that they were read on this antenna, "
                         "where the option says (tap or station)", file=source, key=key)
    _advise_fit(best, model, design, D0, source, key)
    other = next((g for g in fits[1:] if g["x_sign"] != best["x_sign"]), None)
    settle = None
    if other is not None:
        try:
            _advise_fit(other, model, design, D0, source, key)
        except SweepError:
            other = None
    if other is not None:
        # the frequency where the two antennas' SWR differ most: across the readings and half their
        # span beyond each end, away from the frequencies already read (a reading there is in hand)
        span = f[-1] - f[0]
        grid = np.linspace(f[0] - span / 2, f[-1] + span / 2, 401)
        gap = np.min(np.diff(f)) / 2
        grid = grid[np.min(np.abs(grid[:, None] - f[None, :]), axis=1) >= gap]
        # (told apart in |rho|, which a meter's scale resolves about evenly; in SWR a difference
        # between two high readings would look large and be hard to read)
        r1 = np.abs(reflection(model.z_feed(grid, *best["electrical"]), z_ref))
        r2 = np.abs(reflection(model.z_feed(grid, *other["electrical"]), z_ref))
        j = int(np.argmax(np.abs(r1 - r2)))
        settle = (float(grid[j]), float(swr_of(r1[j])), float(swr_of(r2[j])))
    return SwrAdvice(design=design, frequency_hz=f, rho=rho, dip_hz=float(dip_hz),
                     dip_swr=float(swr_of(depth)), built=D0, built_from=built_from,
                     electrical=best["electrical"], fit_rms=best["fit_rms"],
                     moves_rounded_m=best["moves_rounded_m"], steps=best["steps"],
                     swr_after=best["swr_after"], alternative=other, settle=settle,
                     measured_at=at, coax_note=coax_note, short_fixed=design.construction == "tube",
                     target_swr=best["target_swr"])


#: the grid the magnitude fit starts from: stub and tap as fractions of the antenna read, and how
#: many of its best points (and the best of the other sign of X) start a least-squares search
_GRID_STUB = np.linspace(0.9, 1.1, 21)
_GRID_TAP = np.geomspace(0.4, 2.5, 15)
_STARTS = 3


def _x_sign(model, E, f, z_ref) -> float:
    """The sign of X at the model's own dip between the readings' ends."""
    grid = np.linspace(f[0], f[-1], 201)
    z = model.z_feed(grid, *E)
    return float(np.sign(z[int(np.argmin(np.abs(reflection(z, z_ref))))].imag))


def _magnitude_fits(model, f, rho, z_ref, D0) -> list[dict]:
    """Least squares of the model's |rho| against the readings over the stub and the tap (the radiator
    as read), from the best grid points of each sign of X at the dip: [{electrical, fit_rms,
    x_sign}], best first (module docstring, step 3)."""
    lo, hi = fitmod.ELECTRICAL_BOUNDS[1:]

    def residual(x):
        z = model.z_feed(f, D0.radiator, D0.stub * x[0], D0.tap * x[1])
        return np.abs(reflection(z, z_ref)) - rho

    starts = [np.array([s, t]) for s in _GRID_STUB for t in _GRID_TAP]
    with np.errstate(all="ignore"):
        costs = np.array([float(np.sum(residual(x) ** 2)) for x in starts])
    costs = np.where(np.isfinite(costs), costs, np.inf)
    order = list(np.argsort(costs))
    signs = [_x_sign(model, (D0.radiator, D0.stub * starts[k][0], D0.tap * starts[k][1]), f, z_ref)
             for k in order[:40]]
    chosen = order[:_STARTS] + [order[k] for k in range(len(signs)) if signs[k] != signs[0]][:1]
    fits = []
    for k in chosen:
        sol = least_squares(residual, starts[k], bounds=([lo[0], hi[0]], [lo[1], hi[1]]),
                            x_scale=[0.01, 0.1], max_nfev=fitmod.MAX_NFEV)
        E = (D0.radiator, D0.stub * float(sol.x[0]), D0.tap * float(sol.x[1]))
        fits.append({"electrical": E, "fit_rms": float(np.sqrt(np.mean(sol.fun ** 2))),
                     "x_sign": _x_sign(model, E, f, z_ref)})
    fits.sort(key=lambda g: g["fit_rms"])
    return fits


def _advise_fit(g: dict, model, design: Design, D0, source, key) -> None:
    """The moves for one fit, as `fit` makes them with the radiator left as it is (fit.py docstring,
    step 3): the stub and the tap matched to the radiator at f0; added to g."""
    f0, z_ref = design.frequency_hz, design.feed.impedance_ohm
    E = g["electrical"]
    fixed = design.construction == "tube"       # the short is fixed: fit.py's docstring, step 3
    try:
        if fixed:
            target, rho_t = fitmod.fixed_short_target(model, f0, z_ref, E)
        else:
            target, rho_t = (E[0], *model.match(f0, z_ref, E[0])), 0.0
    except ValueError as exc:
        raise SweepError(f"give an antenna the model cannot match ({exc})", file=source, key=key) from None
    advised = np.array([D0.radiator, D0.stub, D0.tap]) + np.array(target) - np.array(E)
    u = design.output.units
    if fixed:
        moves = {"radiator": advised[0] - D0.radiator, "short": 0.0, "tap": advised[2] - D0.tap}
    else:
        moves = {"radiator": 0.0, "short": D0.stub - advised[1],
                 "tap": (D0.stub - D0.tap) - (advised[1] - advised[2])}
    rounded = {k: fitmod._tape_move(m, u) for k, m in moves.items()}
    done = {"radiator": 0.0, "short": 0.0, "tap": 0.0}
    steps = []
    for part in (fitmod.TUBE_STEP_ORDER if fixed else fitmod.STEP_ORDER):
        if rounded[part] == 0:
            continue
        done[part] = rounded[part]
        steps.append((part, rounded[part], fitmod._swr_after(model, f0, z_ref, E, done)))
    g.update(moves_rounded_m=rounded, steps=tuple(steps), target_swr=float(swr_of(rho_t)),
             swr_after=steps[-1][2] if steps else fitmod._swr_after(model, f0, z_ref, E, done))


def advice_text(adv: SwrAdvice) -> str:
    d = adv.design
    u = d.output.units
    fmt = lambda m: units.format_length(abs(m), u)  # noqa: E731
    f0 = units.format_frequency(d.frequency_hz)
    ohm = units.format_impedance(d.feed.impedance_ohm)
    D0 = adv.built
    fixed = adv.short_fixed
    rows = [f"{d.title}  [{d.name}, document {d.document_id}]",
            f"{len(adv.frequency_hz)} SWR readings, {units.format_frequency(adv.frequency_hz[0])} to "
            f"{units.format_frequency(adv.frequency_hz[-1])} (no phase), taken at the {adv.measured_at}"]
    if adv.coax_note:
        rows.append(f"  {adv.coax_note}; the figures below are at the tap")
    rows += [f"dip: SWR about {adv.dip_swr:.2f} at about {units.format_frequency(adv.dip_hz)} "
             f"(a parabola through the lowest reading and its neighbours)",
             f"the antenna read: radiator {fmt(D0.radiator)}, stub {fmt(D0.stub)}, tap {fmt(D0.tap)} "
             f"({adv.built_from}); the moves below are from these",
             f"the model follows the readings (rms {adv.fit_rms:.3f} in |rho|) with stub "
             f"{fmt(adv.electrical[1])} and tap {fmt(adv.electrical[2])}: the dip's width, not only its "
             "depth, says where R and X stand at the dip, because the model knows how fast this "
             "antenna's impedance moves with frequency", ""]
    if not adv.steps:
        rows.append(f"  Nothing to move ({units.length_rounding(u)}): predicted SWR at {f0} "
                    f"{adv.swr_after:.2f}.")
    else:
        rows.append(f"To match at {f0}, in this order ({units.length_rounding(u)}; the short is fixed "
                    "on this build: the long element's top and the tap make the match):"
                    if fixed else
                    f"To match at {f0}, in this order ({units.length_rounding(u)}; the radiator is left "
                    "as it is, as the sheet's rule says until the match is made):")
    stub_now, tap_now = D0.stub, D0.tap
    for n, (part, m, after) in enumerate(adv.steps, 1):
        then = f"; SWR at {f0} then about {after:.2f}"
        if part == "short":
            rows.append(f"  {n}. Short: move it {fmt(m)} {'toward' if m > 0 else 'away from'} the top "
                        f"(stub {fmt(stub_now)} -> {fmt(stub_now - m)}; the tap clamp stays){then}.")
            tap_now, stub_now = tap_now - m, stub_now - m
        elif part == "tap":
            rows.append(f"  {n}. Tap: move the clamp {fmt(m)} {'up' if m > 0 else 'down'}; it then sits "
                        f"{fmt(tap_now + m)} above the short{then}.")
            tap_now += m
        elif part == "radiator":
            rows.append(f"  {n}. {fitmod.long_element_step(m, D0.radiator, u)}{then}.")
    if fixed:
        if adv.target_swr > swr_of(fitmod.MATCH_RHO):
            rows.append(f"  No match at {f0} lies within reach with the short where it is: the moves go to "
                        f"the lowest SWR the model finds, {adv.target_swr:.2f}; check the short's place and "
                        "the stub's spacing against the sheet.")
        rows.append("  The short stays where it is: it is fixed on this build.")
    rows.append(f"SWR alone cannot tell which side of {ohm} R is, nor the sign of X: the readings "
                "are the same for an antenna and its mirror image about the match to first order.")
    if adv.settle is not None:
        fs, s1, s2 = adv.settle
        alt = adv.alternative
        moves = ", ".join(f"{p} {'+' if m > 0 else '-'}{fmt(m)}" for p, m, _ in alt["steps"]) or "none"
        rows.append(f"  Its mirror image (X of the other sign at the dip) fits them less well (rms "
                    f"{alt['fit_rms']:.3f} against {adv.fit_rms:.3f}) and would call for: {moves}.")
        rows.append(f"  One more reading settles it: the SWR at {units.format_frequency(fs)} should be "
                    f"about {s1:.2f} for the advice above, about {s2:.2f} for the other.")
    else:
        rows.append("  One more reading settles it: an analyzer's R and X at the dip (no mirror image "
                    "of the antenna fits these readings).")
    rows.append("Read the SWR again after each move, at the same frequencies.")
    return "\n".join(rows) + "\n"



# ----------------------------------------------------------------------------------------------
# Readings from a file: the sheet's measurement log typed into a CSV, or an analyzer's table of
# frequency and SWR or return loss

#: the columns a readings file may have (lower case, spaces trimmed): the sheet's log's own headings
#: (sheet.LOG_COLUMNS) and the sweep CSV's style of names
_LOG = tuple(c.lower() for c in LOG_COLUMNS)        # #, frequency, swr, r (ω), x (ω), what was changed
_FREQ_WITH_UNIT = (_LOG[1], "freq")
_SWR_COLUMNS = (_LOG[2],)
_RL_COLUMNS = ("return_loss_db", "rl_db", "return loss (db)", "rl (db)")
_R_COLUMNS = (_LOG[3], "r (ohm)", "r_ohm")
_X_COLUMNS = (_LOG[4], "x (ohm)", "x_ohm")
_IGNORED = (_LOG[0], "note")
_CHANGED = (_LOG[5],)


def read_readings(path: str) -> tuple[list, str]:
    """(readings, what was used) from a CSV of readings without phase (README: SWR readings): a header
    naming a frequency column (`frequency`, values with their unit as written in the sheet's log, or
    `frequency_hz`/`_khz`/`_mhz`), `SWR` or a return loss in dB (`return_loss_db`), optionally `R (Ω)`
    and `X (Ω)`, `#` and `what was changed`. Where `what was changed` is filled in, the readings from
    the last such row on are used (the antenna as it stands: write the change on the first reading
    after it). SweepError naming the file and line otherwise. A Touchstone file always carries phase
    and is a SWEEP, not readings."""
    import os

    from buildsheet.design import Reading
    from buildsheet.touchstone import _CSV_FREQUENCY, _read_text

    ext = os.path.splitext(path)[1].lower()
    if ext != ".csv":
        hint = (" (a Touchstone file carries phase: give it as SWEEP, `fit DESIGN FILE`)"
                if ext == ".s1p" else "")
        raise SweepError(f"has the extension '{ext or '(none)'}'; readings are a CSV file (.csv) of "
                         f"frequency and SWR or return loss{hint}", file=path)
    text = _read_text(path)
    header = None
    rows = []
    cols: dict = {}
    for line, fields in csv_rows(text, path):
        if fields[0].lstrip().startswith("#") and fields[0].strip() != "#":
            continue        # a comment line
        if header is None:
            header = [x.strip().lower() for x in fields]
            for i, name in enumerate(header):
                kind = ("f" if name in _FREQ_WITH_UNIT or name in _CSV_FREQUENCY else
                        "swr" if name in _SWR_COLUMNS else "rl" if name in _RL_COLUMNS else
                        "r" if name in _R_COLUMNS else "x" if name in _X_COLUMNS else
                        "changed" if name in _CHANGED else "skip" if name in _IGNORED else None)
                if kind is None:
                    raise SweepError(f"the header's '{fields[i].strip()}' is not a column of readings; "
                                     "expected frequency (or frequency_mhz ...), SWR or return_loss_db, "
                                     "and optionally R (Ω), X (Ω), #, what was changed (the sheet's "
                                     "measurement log)", file=path, line=line)
                if kind in cols and kind != "skip":
                    raise SweepError(f"the header names the column '{name}' twice", file=path, line=line)
                cols[kind] = i
            if "f" not in cols or ("swr" in cols) == ("rl" in cols):
                raise SweepError("the header must name a frequency column and one of SWR or "
                                 "return_loss_db", file=path, line=line)
            continue
        def cell(k, fields=fields):
            return fields[cols[k]].strip() if k in cols and cols[k] < len(fields) else ""
        if not cell("f") and not cell("swr") and not cell("rl"):
            continue        # a row of the log with only a change or a note
        rows.append((line, cell))
    if header is None or not rows:
        raise SweepError("holds no readings (a header, then one line per frequency)", file=path)
    marked = [i for i, (_, cell) in enumerate(rows) if cell("changed")] if "changed" in cols else []
    if marked:
        rows = rows[marked[-1]:]
    readings = []
    fname = header[cols["f"]]
    for line, cell in rows:
        try:
            if fname in _CSV_FREQUENCY:
                f = float(cell("f")) * _CSV_FREQUENCY[fname]
                if not math.isfinite(f):
                    raise ValueError
            else:
                f = units.parse_quantity(cell("f"), "frequency")
        except Exception:
            raise SweepError(f"'{cell('f')}' is not a frequency ({fname}"
                             f"{'' if fname in _CSV_FREQUENCY else ': a number with its unit, 14.1 MHz'})",
                             file=path, line=line) from None
        kind = "swr" if "swr" in cols else "rl"
        try:
            v = float(cell(kind))
        except ValueError:
            raise SweepError(f"'{cell(kind)}' is not a number ({header[cols[kind]]})", file=path,
                             line=line) from None
        if kind == "swr" and not (1.0 <= v <= 100.0):
            raise SweepError(f"SWR {v:g}: an SWR reading is from 1 to 100", file=path, line=line)
        if kind == "rl":
            if not (0.0 < v <= 60.0):
                raise SweepError(f"return loss {v:g} dB: it must be above 0 and at most 60 dB",
                                 file=path, line=line)
            r = 10.0 ** (-v / 20.0)
            v = (1 + r) / (1 - r)
            if v > 100.0:
                raise SweepError(f"return loss {cell(kind)} dB is SWR above 100", file=path, line=line)
        extra = {}
        for k, name in (("r", "r_ohm"), ("x", "x_ohm")):
            if cell(k):
                try:
                    extra[name] = units.parse_quantity(cell(k), "impedance") if not _is_number(cell(k)) \
                        else float(cell(k))
                except Exception:
                    raise SweepError(f"'{cell(k)}' is not an impedance ({header[cols[k]]})", file=path,
                                     line=line) from None
        lo, hi = FREQUENCY_RANGE_HZ
        if not (lo <= f <= hi):
            raise SweepError(f"the frequency {cell('f')} is not between 1 Hz and 1 THz (is the unit "
                             "right?)", file=path, line=line)
        readings.append(Reading(frequency_hz=f, swr=v, **extra))
    used = f"{len(readings)} readings" + (f", from line {rows[0][0]} on (the last row with 'what was "
                                          "changed' filled in)" if marked else "")
    return readings, used


def _is_number(text: str) -> bool:
    try:
        float(text)
        return True
    except ValueError:
        return False


def as_rho(readings) -> list[tuple[float, float]]:
    """(Hz, |rho|) of Reading objects: |rho| = (SWR - 1)/(SWR + 1)."""
    return [(r.frequency_hz, (r.swr - 1.0) / (r.swr + 1.0)) for r in readings]


def record_readings(design: Design):
    """(readings, entry, index) of the latest as-built entry with readings; SweepError when there is
    none, or when a later entry records a change of the antenna (the readings are of the antenna
    before it)."""
    from buildsheet.design import latest_as_built
    with_readings = [(e.date, i, e) for i, e in enumerate(design.record) if e.readings]
    if not with_readings:
        raise SweepError("has no as-built entry with readings (`buildsheet record DESIGN --date D "
                         "--readings FILE`)", file=design.path, key="record")
    _, i, entry = max(with_readings, key=lambda t: t[:2])
    built = latest_as_built(design.record)
    j = next((k for k, e in enumerate(design.record) if e is built), -1)
    if built is not None and built is not entry and (built.date, j) > (entry.date, i):
        raise SweepError(f"the latest readings ({entry.date}) were taken before the change the entry of "
                         f"{built.date} records: read the SWR again and record it", file=design.path,
                         key=f"record.{i}.readings")
    return list(entry.readings), entry, i
