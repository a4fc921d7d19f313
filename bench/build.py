"""Benchmark: the whole `build` of one demo design and a 48-design handout, each timed as its own
process, against their floors, and the whole solve against a NEC-2 sweep of the same design.

Prints one table, everything measured in this run on this machine:
  build    `python -m buildsheet build DEMO` (PDF and SVGs), median of --repeats runs taken in
           turn with the floors' (build, floor, floor, build, ...), against the floor: a process
           that imports the same modules as that build, in the same order, and writes a one-page
           PDF with reportlab. Target ratio <= 2.0. A second floor imports only
           the top-level libraries the build loaded (`import scipy` loads none of its subpackages)
           and writes the same PDF: what a build costs beyond its libraries' start-up.
  handout  `python -m buildsheet handout DIR` of 48 designs (variations of the demos: frequency
           within the band, height, wire; written to a temporary folder), median of
           --handout-repeats runs, against 48 x the single build. Target ratio <= 0.35 on 2 cores.
  solve    the whole solve of DEMO in this process (median of --repeats), against a NEC-2 sweep of
           the same design at the same frequencies, meshed as in the tests (bench/solve.py).
           Target ratio >= 1000x.
Every process runs with its bytecode cached (PYTHONPYCACHEPREFIX, a temporary folder, written by one
untimed run first), as an installed package runs (pip compiles it; an editable install caches it on
the first run), whatever PYTHONDONTWRITEBYTECODE says: otherwise the build alone would compile its
own modules on every run while the floors read the libraries' compiled files (`--no-bytecode-cache`:
as the environment has it).
Not a test: run `python bench/build.py` (`--build-only`: the build rows alone).
"""

from __future__ import annotations

import argparse
import importlib.util
import json
import os
import pathlib
import statistics
import subprocess
import sys
import tempfile
import time

ROOT = pathlib.Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

import yaml  # noqa: E402

from buildsheet import load_design  # noqa: E402
from buildsheet.solver import solve  # noqa: E402

DEMO = ROOT / "designs" / "oak-yard-20m.yaml"
DATE = "2025-03-01"
VARIANTS = 8                 # per demo design: 6 demos x 8 = 48 designs
HEIGHT_FACTORS = (0.9, 1.0, 1.15, 1.3)
GAUGES = ("12 AWG", "14 AWG", "16 AWG")
DIAMETER_FACTORS = (0.8, 1.0, 1.1)    # pipe and rod given in mm: stays under 1/100 wavelength

# Runs the build in-process and prints, as JSON, the modules it loaded beyond the interpreter's
# own start-up, in the order they were loaded (sys.modules keeps insertion order).
_LIST_MODULES = """
import json, sys
before = set(sys.modules)
from buildsheet.cli import main
assert main(sys.argv[2:]) == 0
with open(sys.argv[1], "w") as f:
    json.dump([m for m in sys.modules if m not in before and m != "__main__"
               and m.split(".")[0] != "buildsheet"], f)
"""

# The floor: import those modules in that order, then write a one-page PDF.
_FLOOR = """
import importlib, json, sys
for name in json.load(open(sys.argv[1])):
    importlib.import_module(name)
from reportlab.pdfgen.canvas import Canvas
canvas = Canvas(sys.argv[2])
canvas.drawString(72, 720, "floor")
canvas.showPage()
canvas.save()
"""


#: the third-party libraries a build may use; the second floor imports those the build loaded (the
#: top-level packages only, as `import numpy` does), then writes the same one-page PDF
LIBRARIES = ("jinja2", "markupsafe", "numpy", "reportlab", "scipy", "svgwrite", "yaml")
_FLOOR_LIBRARIES = """
import importlib, sys
for name in sys.argv[2:]:
    importlib.import_module(name)
from reportlab.pdfgen.canvas import Canvas
canvas = Canvas(sys.argv[1])
canvas.drawString(72, 720, "floor")
canvas.showPage()
canvas.save()
"""


#: the folder of the timed processes' cached bytecode (PYTHONPYCACHEPREFIX), or None: as the
#: environment has it (main sets it)
BYTECODE: str | None = None


def _env() -> dict:
    env = {k: v for k, v in os.environ.items() if k != "SOURCE_DATE_EPOCH"}
    env["PYTHONPATH"] = str(ROOT)
    if BYTECODE is not None:
        env.pop("PYTHONDONTWRITEBYTECODE", None)
        env["PYTHONPYCACHEPREFIX"] = BYTECODE
    return env


def run_process(args: list[str], repeats: int) -> float:
    """Median wall time, s, of running `python args...` to completion (it must succeed), after one
    untimed run that writes the bytecode cache (when there is one)."""
    return run_processes([args], repeats)[0]


def run_processes(commands: list[list[str]], repeats: int) -> list[float]:
    """Median wall time, s, of each `python args...` in `commands`, run in turn `repeats` times
    (one of each, then again), after one untimed run of each that writes the bytecode cache (when
    there is one). Taking the commands in turn, not each `repeats` times in a row, lets a change in
    the machine's speed during the run (other work on a shared machine) fall on all of them alike,
    so their ratios hold where the times drift."""
    if BYTECODE is not None:
        for args in commands:
            subprocess.run([sys.executable, *args], capture_output=True, env=_env(), cwd=ROOT)
    times: list[list[float]] = [[] for _ in commands]
    for _ in range(repeats):
        for args, runs in zip(commands, times):
            t = time.perf_counter()
            done = subprocess.run([sys.executable, *args], capture_output=True, text=True, env=_env(),
                                  cwd=ROOT)
            runs.append(time.perf_counter() - t)
            if done.returncode != 0:
                raise SystemExit(f"{' '.join(args[:3])} failed: {done.stderr.strip()}")
    return [statistics.median(runs) for runs in times]


def variants(folder: pathlib.Path) -> list[pathlib.Path]:
    """48 designs: each demo with its frequency moved across its band, its height and its wire
    varied; each one checked to solve before it is timed."""
    paths = []
    for demo in sorted((ROOT / "designs").glob("*.yaml")):
        base = yaml.safe_load(demo.read_text())
        low, high = load_design(demo).band_hz
        wire = str(base["radiator"]["wire"])
        height = load_design(demo).site.height_m
        for k in range(VARIANTS):
            data = json.loads(json.dumps(base))
            data["name"] = f"{base['name']}-v{k + 1}"
            data["title"] = f"{base.get('title', base['name'])} (variant {k + 1})"
            data["frequency"] = f"{(low + (k + 0.5) / VARIANTS * (high - low)) / 1e6:.3f} MHz"
            data["site"]["height"] = f"{height * HEIGHT_FACTORS[k % len(HEIGHT_FACTORS)]:.2f} m"
            if wire.endswith("AWG"):
                data["radiator"]["wire"] = GAUGES[k % len(GAUGES)]
            else:
                mm = float(wire.split()[0]) * DIAMETER_FACTORS[k % len(DIAMETER_FACTORS)]
                data["radiator"]["wire"] = f"{mm:.1f} mm"
            path = folder / f"{data['name']}.yaml"
            path.write_text(yaml.safe_dump(data, sort_keys=False))
            solve(load_design(path))        # a variant the model refuses would end the handout
            paths.append(path)
    return paths


def _bench_solve():
    """bench/solve.py as a module (its NEC harness and timing helpers)."""
    spec = importlib.util.spec_from_file_location("bench_solve", ROOT / "bench" / "solve.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeats", type=int, default=5, help="runs of the build, floor and solve (median)")
    parser.add_argument("--handout-repeats", type=int, default=3, help="runs of the handout (median)")
    parser.add_argument("--build-only", action="store_true",
                        help="time only the single build against its floors (no handout, no NEC-2)")
    parser.add_argument("--no-bytecode-cache", action="store_true",
                        help="run the processes as the environment says (PYTHONDONTWRITEBYTECODE)")
    args = parser.parse_args(argv)
    rows = []
    global BYTECODE
    print(f"machine: {os.cpu_count()} cores, load average {os.getloadavg()[0]:.2f} at the start; "
          f"python {sys.version.split()[0]}; bytecode "
          + ("as the environment has it (PYTHONDONTWRITEBYTECODE="
             f"{os.environ.get('PYTHONDONTWRITEBYTECODE', '')!r})" if args.no_bytecode_cache else
             "cached (PYTHONPYCACHEPREFIX in a temporary folder)"), flush=True)
    with tempfile.TemporaryDirectory() as tmp:
        tmp = pathlib.Path(tmp)
        if not args.no_bytecode_cache:
            BYTECODE = str(tmp / "pycache")
        build = ["-m", "buildsheet", "build", str(DEMO), "-o", str(tmp / "one"), "--date", DATE]
        modules = tmp / "modules.json"
        run_process(["-c", _LIST_MODULES, str(modules), *build[2:]], 1)
        n_modules = len(json.loads(modules.read_text()))
        libraries = sorted({m.split(".")[0] for m in json.loads(modules.read_text())} & set(LIBRARIES))
        t_build, t_floor, t_libs = run_processes(
            [build, ["-c", _FLOOR, str(modules), str(tmp / "floor.pdf")],
             ["-c", _FLOOR_LIBRARIES, str(tmp / "floor2.pdf"), *libraries]], args.repeats)
        rows.append((f"build {DEMO.stem} (process)", t_build,
                     f"floor: {n_modules} modules + 1-page PDF", t_floor, t_build / t_floor, "<= 2.0"))
        rows.append((f"build {DEMO.stem} (process)", t_build,
                     f"floor: import {', '.join(libraries)}", t_libs, t_build / t_libs, "(issue 14)"))
        if args.build_only:
            _print(rows)
            return 0

        folder = tmp / "designs"
        folder.mkdir()
        n = len(variants(folder))
        t_handout = run_process(["-m", "buildsheet", "handout", str(folder), "-o", str(tmp / "h.pdf"),
                                 "--date", DATE, "--quiet"], args.handout_repeats)
        rows.append((f"handout of {n} designs (process)", t_handout, f"{n} x the single build",
                     n * t_build, t_handout / (n * t_build), "<= 0.35"))

    bench_solve = _bench_solve()
    design = load_design(DEMO)
    t_solve = bench_solve.time_solve(design, args.repeats)
    solution = solve(design)
    f = solution.sweep.frequency_hz
    t = time.perf_counter()
    bench_solve.necref.jpole_model(bench_solve.nec_dims(design, solution), f)
    t_nec = time.perf_counter() - t
    rows.append((f"solve {DEMO.stem} (in process)", t_solve, f"NEC-2 sweep, {len(f)} points", t_nec,
                 t_nec / t_solve, ">= 1000x"))

    _print(rows)
    return 0


def _print(rows) -> None:
    print(f"{'measure':<34} {'time':>9}  {'against':<44} {'time':>9} {'ratio':>8}  target")
    for what, t_what, against, t_against, ratio, target in rows:
        shown = f"{ratio:.0f}x" if ratio >= 100 else f"{ratio:.2f}"
        print(f"{what:<34} {_t(t_what):>9}  {against:<44} {_t(t_against):>9} {shown:>8}  {target}")
    print(f"load average {os.getloadavg()[0]:.2f} at the end")


def _t(seconds: float) -> str:
    return f"{seconds * 1e3:.1f} ms" if seconds < 1 else f"{seconds:.2f} s"


if __name__ == "__main__":
    sys.exit(main())
