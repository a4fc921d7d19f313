"""Benchmark: the whole `solve` of each demo design against a NEC-2 wire-model sweep at the same
frequencies, meshed by the same rules as the tests (tests/necref.py; a stacked design with its second
element and phasing stub, necref.stacked_model).

Prints, per design: solve time (median and best of repeated runs), NEC sweep time, their ratios,
and the NEC SWR at the design frequency on the feed impedance. Stub lines with a solid dielectric
cannot be represented by NEC-2 wires (no dielectric): NEC models them as bare wires with the stub
and tap divided by the velocity factor (tests/data/nec_sweep.py), marked "(equivalent)": an
approximation (the bare wires' line impedance, a longer common mode), not a check of the model.
Not a test: run `python bench/solve.py`.
Target: ratio >= 1000x, aim 3000x.
"""

from __future__ import annotations

import argparse
import pathlib
import statistics
import sys
import time

ROOT = pathlib.Path(__file__).resolve().parent.parent
sys.path[:0] = [str(ROOT), str(ROOT / "tests"), str(ROOT / "tests" / "data")]

import numpy as np  # noqa: E402

import necref  # noqa: E402
import nec_sweep  # noqa: E402
from buildsheet import load_design  # noqa: E402
from buildsheet.physics.lines import swr  # noqa: E402
from buildsheet.solver import solve  # noqa: E402


def nec_dims(design, solution) -> necref.JPoleDims:
    """The NEC-2 wire model of the solved design (tests/data/nec_sweep.py): a stub of a line with a
    solid dielectric becomes bare wires with its lengths divided by the velocity factor, the
    electrical equivalent for the differential mode (its line impedance is then the bare wires')."""
    d = solution.dimensions
    return nec_sweep.nec_dims(design, d.radiator, d.stub, d.tap)


def time_solve(design, repeats: int) -> tuple[float, float]:
    """(median, best) wall time of solve(design), s. On a shared machine the median carries the
    other load; the best is the code's own cost (the usual reading of repeated timings)."""
    solve(design)  # warm caches (imports, catalogue)
    times = []
    for _ in range(repeats):
        t = time.perf_counter()
        solve(design)
        times.append(time.perf_counter() - t)
    return statistics.median(times), min(times)


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("designs", nargs="*", help="design files (default: designs/*.yaml)")
    parser.add_argument("--repeats", type=int, default=20, help="solve runs per design (median)")
    args = parser.parse_args(argv)
    paths = args.designs or sorted(str(p) for p in (ROOT / "designs").glob("*.yaml"))
    print(f"{'design':<16} {'points':>6} {'solve ms':>9} {'(best)':>7} {'NEC s':>8} {'ratio':>8} "
          f"{'(best)':>7}  NEC SWR at f0")
    ratios, best_ratios = [], []
    for path in paths:
        design = load_design(path)
        t_solve, t_best = time_solve(design, args.repeats)
        solution = solve(design)
        f = solution.sweep.frequency_hz
        dims = nec_dims(design, solution)
        t = time.perf_counter()
        if solution.stack is None:
            result = necref.jpole_model(dims, f)
        else:       # the stacked version: its element and phasing stub (of the stub's line) as well
            st = solution.stack
            result = necref.stacked_model(dims, necref.StackDims(
                st.element_m, st.phasing_m, st.phasing_spacing_m, design.stub.conductor_diameter_m,
                design.stub.conductivity_s_m), f)
        t_nec = time.perf_counter() - t
        i0 = int(np.argmin(np.abs(f - design.frequency_hz)))
        nec_swr = float(swr(result.z_feed[i0], design.feed.impedance_ohm))
        air = "" if nec_sweep.stub_velocity_factor(design) == 1.0 else " (equivalent)"
        ratio = t_nec / t_solve
        ratios.append(ratio)
        best_ratios.append(t_nec / t_best)
        print(f"{design.name:<16} {len(f):>6} {t_solve * 1e3:>9.2f} {t_best * 1e3:>7.2f} {t_nec:>8.2f} "
              f"{ratio:>7.0f}x {t_nec / t_best:>6.0f}x  {nec_swr:.2f}{air}")
    gmean = lambda r: float(np.exp(np.mean(np.log(r))))
    print(f"geometric mean ratio: {gmean(ratios):.0f}x on the median solve, {gmean(best_ratios):.0f}x on "
          f"the best (target >= 1000x, aim 3000x)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
