"""SWR readings without phase -> the dip and advice, with what SWR alone cannot tell (issue 16, part 5).
Owns reading typed SWR readings ("14.1 MHz=1.8"; or return loss, "14.1 MHz=RL 10 dB"), finding the dip
from them and the advice. It changes no file.

Method.
1. |rho| from each reading: (SWR - 1)/(SWR + 1), or 10^(-RL/20) for a return loss RL in dB.
2. The dip. Near a match rho is close to linear in frequency, so |rho|^2 is a parabola in f
   (|rho|^2 = |rho_d|^2 + c (f - f_d)^2 for rho = rho_d + a (f - f_d) with a orthogonal to rho_d;
   any offset only shifts f_d): the parabola through the lowest reading and its two neighbours gives
   the dip frequency f_d and its depth |rho_d| (over wider spans |rho|^2 departs from a parabola: five
   readings over +/-1 % put a 1.04 dip at 1.09 on the model's own readings, three at the centre
   within 0.05). Three readings are the least; the dip must lie between the lowest and highest
   reading (else: read further).
3. Advice by the sheet's rule (sheet.dip_rule, sheet.dip_tolerance_hz): a dip further than the
   tolerance from f0 is moved with the radiator, or with the short where the sheet offers the short
   as a dip control, by (f0 - f_d) / the solution's dip rate (Solution.sensitivity). A dip deeper than
   sheet.STOP_SWR needs the tap; SWR alone cannot tell whether the resistance at the dip is above
   50 ohm (R = 50 SWR) or below (R = 50/SWR), so both tap moves are given (the solution's ohm-per-m
   rate for each) and the one reading that settles it: the SWR at the dip after a trial move of the
   smaller one upward (lower: R was below; higher: move back and the other way), or R read on any
   analyzer. The sign of X, which side of the dip is which part's doing, is not told either.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

import numpy as np

from buildsheet import units
from buildsheet.design import Design
from buildsheet.errors import SweepError
from buildsheet.physics.lines import swr_of
from buildsheet.sheet import MIN_MOVE_M, STOP_SWR, dip_rule, dip_tolerance_hz
from buildsheet.solver import solve

#: readings the parabola passes through: the lowest and its neighbours (module docstring, step 2)
PARABOLA_POINTS = 3
MIN_READINGS = 3


@dataclass(frozen=True)
class SwrAdvice:
    """frequency_hz, rho: the readings; dip_hz, dip_swr: the parabola's dip; dip_part: 'radiator',
    'short' or None and dip_move_m its move (+ longer / toward the top); tap_if_high_m,
    tap_if_low_m: the tap moves (+ toward the top) if R at the dip is above / below the reference."""
    design: Design
    frequency_hz: np.ndarray
    rho: np.ndarray
    dip_hz: float
    dip_swr: float
    dip_part: str | None
    dip_move_m: float
    tap_if_high_m: float
    tap_if_low_m: float


def parse_reading(text: str) -> tuple[float, float]:
    """'14.1 MHz=1.8' (SWR) or '14.1 MHz=RL 10 dB' (return loss) -> (Hz, |rho|); SweepError."""
    m = re.fullmatch(r"\s*([^=]+?)\s*=\s*(?:(rl)\s*([0-9.eE+-]+)\s*db|([0-9.eE+-]+))\s*", text, re.I)
    if not m:
        raise SweepError(f"'{text}' is not a reading: write FREQUENCY=SWR ('14.1 MHz=1.8') or "
                         "FREQUENCY=RL dB ('14.1 MHz=RL 10 dB')", key="--swr")
    try:
        f = units.parse_quantity(m.group(1), "frequency")
    except Exception:
        raise SweepError(f"'{m.group(1)}' is not a frequency with a unit", key="--swr") from None
    value = float(m.group(3) or m.group(4))
    if m.group(2):
        if not value > 0:
            raise SweepError(f"return loss {value:g} dB: it must be above 0 dB", key="--swr")
        return f, 10.0 ** (-value / 20.0)
    if not value >= 1.0 or not np.isfinite(value):
        raise SweepError(f"SWR {value:g}: an SWR is 1 or more", key="--swr")
    return f, (value - 1.0) / (value + 1.0)


def advise(design: Design, readings: list[tuple[float, float]]) -> SwrAdvice:
    """The dip and the advice from (Hz, |rho|) readings (module docstring). SweepError if they do
    not show a dip."""
    if len(readings) < MIN_READINGS:
        raise SweepError(f"{len(readings)} reading(s); the dip needs at least {MIN_READINGS}, on both "
                         "sides of the lowest SWR", key="--swr")
    readings = sorted(readings)
    f = np.array([r[0] for r in readings])
    rho = np.array([r[1] for r in readings])
    if np.any(np.diff(f) <= 0):
        raise SweepError("two readings at the same frequency; give each frequency once", key="--swr")
    i = int(np.argmin(rho))
    if i == 0 or i == len(f) - 1:
        side = "below" if i == 0 else "above"
        raise SweepError(f"the lowest SWR is the reading at the {'lowest' if i == 0 else 'highest'} "
                         f"frequency: the dip lies {side} your readings; read further {side}",
                         key="--swr")
    lo = max(0, min(i - PARABOLA_POINTS // 2, len(f) - PARABOLA_POINTS))
    sel = slice(lo, lo + PARABOLA_POINTS)
    f0 = design.frequency_hz
    x = (f[sel] - f0) / f0
    a, b, c = np.polyfit(x, rho[sel] ** 2, 2)
    if not a > 0:
        raise SweepError("the readings do not show a dip (the SWR does not rise on both sides of the "
                         "lowest); read closer around the lowest SWR", key="--swr")
    xd = -b / (2 * a)
    dip_hz = f0 * (1 + xd)
    depth = float(np.sqrt(max(c - b * b / (4 * a), 0.0)))
    s = solve(design)
    sens = s.sensitivity
    u = design.output.units
    _, short_moves_dip = dip_rule(s, u)
    part, move = None, 0.0
    if abs(dip_hz - f0) > dip_tolerance_hz(s):
        part = "short" if short_moves_dip else "radiator"
        move = (f0 - dip_hz) / sens[f"dip_hz_per_m_{part}"]
    z_ref = design.feed.impedance_ohm
    dip_swr = float(swr_of(depth))
    tap_high = tap_low = 0.0
    if dip_swr > STOP_SWR:
        # R = z_ref SWR (high) or z_ref/SWR (low) at the dip, X near 0; the tap's rate brings it to z_ref
        tap_high = -(z_ref * dip_swr - z_ref) / sens["ohm_per_m_tap"]
        tap_low = (z_ref - z_ref / dip_swr) / sens["ohm_per_m_tap"]
    return SwrAdvice(design=design, frequency_hz=f, rho=rho, dip_hz=float(dip_hz), dip_swr=dip_swr,
                     dip_part=part, dip_move_m=float(move), tap_if_high_m=float(tap_high),
                     tap_if_low_m=float(tap_low))


def advice_text(adv: SwrAdvice) -> str:
    d = adv.design
    u = d.output.units
    fmt = lambda m: units.format_length(abs(m), u)  # noqa: E731
    f0 = units.format_frequency(d.frequency_hz)
    rows = [f"{d.title}  [{d.name}, document {d.document_id}]",
            f"{len(adv.frequency_hz)} SWR readings, {units.format_frequency(adv.frequency_hz[0])} to "
            f"{units.format_frequency(adv.frequency_hz[-1])} (no phase)",
            f"dip: SWR about {adv.dip_swr:.2f} at about {units.format_frequency(adv.dip_hz)} "
            f"(a parabola through the lowest reading and its neighbours)", ""]
    n = 0
    if adv.dip_part is not None and abs(adv.dip_move_m) >= MIN_MOVE_M[u]:
        n += 1
        if adv.dip_part == "radiator":
            what = f"{'lengthen' if adv.dip_move_m > 0 else 'shorten'} the radiator by {fmt(adv.dip_move_m)}"
        else:
            what = f"move the short {'up' if adv.dip_move_m > 0 else 'down'} by {fmt(adv.dip_move_m)}"
        rows.append(f"  {n}. To put the dip on {f0}: {what} (the sheet's rule and rate); the dip's "
                    f"depth stays about {adv.dip_swr:.2f} to first order.")
    if adv.tap_if_high_m or adv.tap_if_low_m:
        n += 1
        rows.append(f"  {n}. The depth: SWR {adv.dip_swr:.2f} at the dip means R about "
                    f"{d.feed.impedance_ohm * adv.dip_swr:.0f} Ω or about "
                    f"{d.feed.impedance_ohm / adv.dip_swr:.0f} Ω there. If above, move the tap down by "
                    f"{fmt(adv.tap_if_high_m)}; if below, up by {fmt(adv.tap_if_low_m)}.")
        rows.append("     SWR alone cannot tell which side of "
                    f"{units.format_impedance(d.feed.impedance_ohm)} R is, nor the sign of X. One more "
                    f"reading settles it: move the tap up by {fmt(adv.tap_if_low_m)} and read the SWR at "
                    "the dip again; lower means R was below (done), higher means move it back down by "
                    f"{fmt(adv.tap_if_low_m)} and on by {fmt(adv.tap_if_high_m)}. (An analyzer's R reading "
                    "at the dip settles it at once.)")
    if n == 0:
        rows.append(f"  Nothing to move: the dip is on {f0} and SWR {adv.dip_swr:.2f} is below "
                    f"{STOP_SWR:g}.")
    rows.append("Read the SWR again after each move, at the same frequencies.")
    return "\n".join(rows) + "\n"
