"""Benchmark: the whole `solve` of each demo design against a NEC-2 wire-model sweep at the same
frequencies, meshed by the same rules as the tests (tests/necref.py).

Prints, per design: solve time (median of repeated runs), NEC sweep time, their ratio, and the NEC
SWR at the design frequency on the feed impedance. Stub lines with a solid dielectric cannot be
represented by NEC-2 wires (no dielectric), so NEC models them in air: their NEC SWR is marked
"(air)" and is not a check of the model.  Not a test: run `python bench/solve.py`.
Target: ratio >= 1000x, aim 3000x.
"""

from __future__ import annotations

import argparse
import pathlib
import statistics
import sys
import time

ROOT = pathlib.Path(__file__).resolve().parent.parent
sys.path[:0] = [str(ROOT), str(ROOT / "tests")]

import numpy as np  # noqa: E402

import necref  # noqa: E402
from buildsheet import load_design  # noqa: E402
from buildsheet.physics.lines import swr  # noqa: E402
from buildsheet.solver import solve  # noqa: E402


def nec_dims(design, solution) -> necref.JPoleDims:
    site = design.site
    if site.ground_kind == "real":
        ground = necref.Ground("real", site.permittivity, site.conductivity_s_m, "sommerfeld")
    else:
        ground = necref.Ground(site.ground_kind)
    d = solution.dimensions
    return necref.JPoleDims(radiator=d.radiator, stub=d.stub, tap=d.tap, spacing=d.spacing,
                            wire_d=design.radiator.diameter_m, stub_d=design.stub.conductor_diameter_m,
                            orientation=site.orientation, height=site.height_m, slope=site.slope_rad,
                            ground=ground, wire_sigma=design.radiator.conductivity_s_m,
                            stub_sigma=design.stub.conductivity_s_m)


def time_solve(design, repeats: int) -> float:
    solve(design)  # warm caches (imports, catalogue)
    times = []
    for _ in range(repeats):
        t = time.perf_counter()
        solve(design)
        times.append(time.perf_counter() - t)
    return statistics.median(times)


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("designs", nargs="*", help="design files (default: designs/*.yaml)")
    parser.add_argument("--repeats", type=int, default=20, help="solve runs per design (median)")
    args = parser.parse_args(argv)
    paths = args.designs or sorted(str(p) for p in (ROOT / "designs").glob("*.yaml"))
    print(f"{'design':<16} {'points':>6} {'solve ms':>9} {'NEC s':>8} {'ratio':>8}  NEC SWR at f0")
    ratios = []
    for path in paths:
        design = load_design(path)
        t_solve = time_solve(design, args.repeats)
        solution = solve(design)
        f = solution.sweep.frequency_hz
        dims = nec_dims(design, solution)
        t = time.perf_counter()
        result = necref.jpole_model(dims, f)
        t_nec = time.perf_counter() - t
        i0 = int(np.argmin(np.abs(f - design.frequency_hz)))
        nec_swr = float(swr(result.z_feed[i0], design.feed.impedance_ohm))
        air = "" if design.stub.eps_r == 1.0 else " (air)"
        ratio = t_nec / t_solve
        ratios.append(ratio)
        print(f"{design.name:<16} {len(f):>6} {t_solve * 1e3:>9.2f} {t_nec:>8.2f} {ratio:>7.0f}x  "
              f"{nec_swr:.2f}{air}")
    print(f"geometric mean ratio: {float(np.exp(np.mean(np.log(ratios)))):.0f}x (target >= 1000x)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
