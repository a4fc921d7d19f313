"""The long profile of the fuzz suite (issue 15): many designs and sweeps through the command line,
counted rather than asserted, so one run reports every kind of breach at once.

    nice -n 10 python bench/fuzz_long.py [--designs 20000] [--sweeps 500] [--workers 2] [--seed 1]

Designs come from the strategies of tests/test_fuzz.py (random designs across the limits, mutated
demos, random structures, random YAML text, deep/long/aliased files); each goes through `check`,
`solve --json` and `solve` (the last two only when `check` accepts it). Sweeps come from
tests/test_sweep_fuzz.py and go through `fit --json` and `fit` on the oak demo. Counted: exit
statuses, exit 1 (a bug), warning lines (Python warnings raised, or more than one line on stderr),
non-finite numbers in any output (NaN/Infinity in the JSON, "nan"/"inf" in the text), and numbers a
solution cannot have (efficiency outside 0..1, SWR below 1). The first few cases of each breach are
printed in full. The counts go to stdout as JSON and, with --save, to bench/data/ with the settings.

The race test of 200 `record` process pairs is in tests/test_races.py (BUILDSHEET_LONG=1).
"""

from __future__ import annotations

import argparse
import collections
import json
import multiprocessing
import pathlib
import platform
import re
import sys
import tempfile
import time

ROOT = pathlib.Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

#: share of the designs each strategy makes (random designs reach the solver most often)
SHARES = {"random_designs": 0.4, "mutated_demo": 0.3, "random_structures": 0.1, "yaml_texts": 0.1,
          "extremes": 0.1}
SHOW = 3


def _nonfinite_json(out: str) -> list[str]:
    found = []
    try:
        data = json.loads(out, parse_constant=lambda name: found.append(name) or 0.0)
    except ValueError as exc:
        return [f"unparsable JSON: {exc}"]
    from tests.test_fuzz import _finite_numbers
    try:
        _finite_numbers(data)
    except AssertionError as exc:
        found.append(str(exc))
    return found


def _impossible(out: str) -> list[str]:
    data = json.loads(out)
    bad = []
    if "efficiency" in data and not 0.0 <= data["efficiency"] <= 1.0:
        bad.append(f"efficiency {data['efficiency']}")
    swr = data.get("sweep", {}).get("swr", [])
    if swr and min(swr) < 1.0 - 1e-9:
        bad.append(f"SWR {min(swr)}")
    return bad


class Tally:
    def __init__(self):
        self.counts = collections.Counter()
        self.examples = collections.defaultdict(list)

    def breach(self, kind: str, detail: str):
        self.counts[kind] += 1
        if len(self.examples[kind]) < SHOW:
            self.examples[kind].append(detail[:4000])

    def run(self, argv, case_text):
        from tests.hang import Hang
        from tests.test_fuzz import _run
        try:
            status, out, err, caught = _run(argv)
        except Hang as exc:
            self.breach("hang", f"{argv[0]}: {exc}\n{case_text[:2000]}")
            return None, "", ""
        self.counts[f"{argv[0]}{' --json' if '--json' in argv else ''} exit {status}"] += 1
        if status == 1 or status not in (0, 2):
            self.breach("exit 1", f"{argv}: {err}\n--- case ---\n{case_text[:3000]}")
        if caught:
            self.breach("warning lines", f"{argv}: {caught[:3]}\n--- case ---\n{case_text[:3000]}")
        if status == 2 and len(err.strip().splitlines()) != 1:
            self.breach("warning lines", f"{argv}: stderr has {len(err.strip().splitlines())} lines: "
                                         f"{err[:500]}\n--- case ---\n{case_text[:3000]}")
        if status == 0:
            if "--json" in argv:
                bad = _nonfinite_json(out)
                if bad:
                    self.breach("non-finite output", f"{argv}: {bad[:3]}\n--- case ---\n{case_text[:3000]}")
                elif argv[0] == "solve":
                    imp = _impossible(out)
                    if imp:
                        self.breach("impossible number", f"{argv}: {imp}\n--- case ---\n{case_text[:3000]}")
            else:
                numbers = out
                if argv[0] == "solve":
                    try:
                        from buildsheet import load_design
                        title = load_design(argv[-1]).title
                        numbers = "\n".join(l for l in out.splitlines() if not title or title not in l)
                    except Exception:       # noqa: BLE001 - the title is only to skip its line
                        pass
                if re.search(r"\b(nan|inf)\b", numbers, re.I):
                    self.breach("non-finite output", f"{argv}: {out[:1500]}\n--- case ---\n{case_text[:3000]}")
        return status, out, err


def _design_case(tally: Tally, content):
    tally.counts["designs"] += 1
    with tempfile.TemporaryDirectory() as tmp:
        path = pathlib.Path(tmp) / "design.yaml"
        if isinstance(content, bytes):
            path.write_bytes(content)
            text = content.decode("utf-8", "replace")
        else:
            path.write_text(content, encoding="utf-8", errors="surrogatepass")
            text = content
        status, _, _ = tally.run(["check", str(path)], text)
        if status == 0:
            tally.run(["solve", "--json", str(path)], text)
            tally.run(["solve", str(path)], text)


def _sweep_case(tally: Tally, kind, content):
    from tests.test_sweep_fuzz import OAK
    tally.counts["sweeps"] += 1
    with tempfile.TemporaryDirectory() as tmp:
        path = pathlib.Path(tmp) / f"sweep.{kind}"
        path.write_bytes(content)
        text = content[:3000].decode("utf-8", "replace")
        tally.run(["fit", str(OAK), str(path), "--json"], text)
        tally.run(["fit", str(OAK), str(path)], text)


def _drive(strategy, n: int, seed: int, body):
    from hypothesis import HealthCheck, Phase, given, settings
    from hypothesis import seed as hseed

    @hseed(seed)
    @settings(max_examples=n, database=None, deadline=None, phases=[Phase.generate],
              suppress_health_check=list(HealthCheck))
    @given(strategy)
    def run(case):
        body(case)

    run()


def worker(job):
    designs, sweeps, seed = job
    import warnings
    warnings.filterwarnings("ignore", module="hypothesis")
    from tests import test_fuzz, test_sweep_fuzz
    tally = Tally()
    for name, share in SHARES.items():
        n = int(round(designs * share))
        if n:
            _drive(getattr(test_fuzz, name)(), n, seed, lambda case: _design_case(tally, case))
    if sweeps:
        _drive(test_sweep_fuzz.sweep_files(), sweeps, seed, lambda case: _sweep_case(tally, *case))
    return tally.counts, dict(tally.examples)


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--designs", type=int, default=20000)
    parser.add_argument("--sweeps", type=int, default=500)
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--seed", type=int, default=1)
    parser.add_argument("--save", action="store_true", help="store the counts in bench/data/")
    args = parser.parse_args()
    start = time.time()
    w = max(1, args.workers)
    # each worker draws its own cases (its own seed); the counts add up to at least the asked numbers
    jobs = [(-(-args.designs // w), -(-args.sweeps // w), args.seed * 1000 + k) for k in range(w)]
    with multiprocessing.get_context("fork").Pool(w) as pool:
        results = pool.map(worker, jobs)
    counts = collections.Counter()
    examples = collections.defaultdict(list)
    for c, ex in results:
        counts.update(c)
        for k, v in ex.items():
            examples[k].extend(v)
    report = {
        "settings": {"designs": args.designs, "sweeps": args.sweeps, "workers": w, "seed": args.seed,
                     "script": "bench/fuzz_long.py", "python": platform.python_version()},
        "seconds": round(time.time() - start, 1),
        "designs run": counts.pop("designs", 0), "sweeps run": counts.pop("sweeps", 0),
        "exit 1": counts.get("exit 1", 0), "warning lines": counts.get("warning lines", 0),
        "non-finite outputs": counts.get("non-finite output", 0),
        "impossible numbers": counts.get("impossible number", 0), "hangs": counts.get("hang", 0),
        "outcomes": dict(sorted(counts.items())),
    }
    for kind, cases in examples.items():
        for case in cases:
            print(f"=== {kind} ===\n{case}\n", file=sys.stderr)
    print(json.dumps(report, indent=1))
    if args.save:
        out = ROOT / "bench" / "data" / f"fuzz_long-{time.strftime('%Y%m%d-%H%M', time.gmtime())}.json"
        out.write_text(json.dumps({**report, "examples": examples}, indent=1) + "\n")
        print(f"saved {out}", file=sys.stderr)
    breaches = report["exit 1"] + report["warning lines"] + report["non-finite outputs"] + \
        report["impossible numbers"] + report["hangs"]
    return 1 if breaches else 0


if __name__ == "__main__":
    sys.exit(main())
