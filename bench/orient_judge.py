"""Figures for candidate constant sets of the model's resistance bias by orientation (issue 13's 2:1
edges; bench/data/cal-candidates/README.md, c6), beyond `fdtd_fit.py judge`: one markdown row per
candidate. Held out unless said; no fitting. Run with the venv's python (with `rates` it runs NEC-2:
the tuning rates of tests/test_jpole_nec.py, about 20 s a candidate; start it under the heavy lock):

  python bench/orient_judge.py CAL|CAND.json|key=value,... [...] [rates] [oracle=H,S,VHF,VVHF]

oracle: a diagnostic, not a model: the radiator arm's resistance R_ant multiplied by a factor per
orientation class (horizontal, sloper, vertical under / above 100 MHz; Antenna.end_resistance_scale)
on the stored NEC-2 designs only (the rates, first cuts and FDTD columns do not see it): what
removing the class offsets exactly would give, the upper bound of any orientation term.

Columns: nec-c1 training |rho| at NEC's match (median / 90th); the same held out on nec-c1's and on
nec-c2-envelope's odd seeds; FDTD held-out rms; acceptance-style 2:1 edges within 10 % of NEC's width
inside the envelope (fdtd_fit.heldout_accept: nec-c1 of 80, nec-c2 of 53), and of those the designs
with the stub spaced at most lambda/50 (the envelope of solver.ENVELOPE_EDGE_SPACING_WAVELENGTHS);
NEC-2's SWR at f0 of the model's cut, emulated (median, nec-c1 / nec-c2); the median Re rho at NEC's
match by orientation (horizontal / sloper / vertical under 100 MHz / vertical above), nec-c1 then
nec-c2; the largest move of a rigid design's first cut from fdtd-jpoles-c5.json (mm;
tests/test_jpole_fdtd.py allows 0.2 mm before the FDTD runs must be made again); the largest move of
the first cut of the eight designs of tests/test_jpole_nec.py from jpole.CAL's (mm); with `rates`,
the 6 m design's dX per short move against NEC-2 and every rate of tests/test_jpole_nec.py past its
15 % (that test's rule for the dip per short move included).
"""

from __future__ import annotations

import collections
import contextlib
import dataclasses
import io
import json
import sys
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT / "bench"))
sys.path.insert(0, str(ROOT / "tests"))
sys.path.insert(0, str(ROOT))

import fdtd_fit as ff  # noqa: E402
import nec_study as ns  # noqa: E402
import test_jpole_nec as acc  # noqa: E402
from buildsheet.physics import jpole  # noqa: E402


def load(p):
    """jpole.CAL, a stored candidate (a fit's output or bare constants) or `key=value,...` on CAL."""
    if p in (None, "CAL"):
        return jpole.CAL
    if "=" in p and not p.endswith(".json"):
        return dataclasses.replace(jpole.CAL, **{k: float(v) for k, v in (a.split("=") for a in p.split(","))})
    st = json.loads(Path(p).read_text())
    return jpole.Calibration(**{**dataclasses.asdict(jpole.CAL), **st.get("calibration", st)})


def classes(cal, rows):
    """Median Re rho of the model at NEC's match per orientation class."""
    g = collections.defaultdict(list)
    for r in rows:
        c = r["case"]
        o = c["orientation"]
        k = o if o != "vertical" else ("vert-VHF" if c["f0"] > 100e6 else "vert-HF")
        ns._PREPARED.pop((r["seed"], c["f0"]), None)
        z = ns._prepared(r, 2, c["f0"], cal).z_feed(r["L_model"], r["S_nec"], r["T_nec"])[0]
        g[k].append(((z - 50) / (z + 50)).real)
    return {k: float(np.median(v)) for k, v in g.items()}


def with_cal(cal, fn, *args):
    saved = jpole.CAL
    jpole.CAL = cal
    try:
        return fn(*args)
    finally:
        jpole.CAL = saved


def edges(cal, rows):
    """Per design (seed): the model's and NEC-2's 2:1 edges as fdtd_fit.heldout_accept takes them
    (lower and upper edge offsets in NEC's widths), None where that function leaves it out."""
    out = {}
    for r in rows:
        bands = with_cal(cal, ff.emulated_bands, r)
        if bands is None or bands[0] is None:
            out[r["seed"]] = None
            continue
        bn, bm, _ = bands
        w = bn[1] - bn[0]
        out[r["seed"]] = ((bm[0] - bn[0]) / w, (bm[1] - bn[1]) / w)
    return out


def first_cut(case, cal):
    return np.array(with_cal(cal, acc.model_design, case)[1:])


def row(p, rates, train, held, h2, runs, fdtd_rows, base8):
    cal = load(p)
    ns._PREPARED.clear()
    tr = ff.thin_heldout(cal, train)
    with contextlib.redirect_stdout(io.StringIO()):
        rep = ff.heldout_report(cal, held)
    fd = ff.fdtd_rms(cal, [r for r in runs if r.held])
    d50 = []
    for rows in (held, h2):
        env = [r for r in rows if ns.inside_envelope(r)]
        res = edges(cal, env)
        near = {r["seed"] for r in env if r["case"]["spacing"] * r["case"]["f0"] / ns.necref.C0 <= 1 / 50 * (1 + 1e-9)}
        n = [s for s in res if res[s] is not None and s in near]
        d50.append(f"{sum(max(map(abs, res[s])) <= 0.1 for s in n)}/{len(n)}")
    ns._PREPARED.clear()
    a = classes(cal, held)
    ns._PREPARED.clear()
    b = classes(cal, h2)
    o = " / ".join(f"{a[k]:+.3f} {b[k]:+.3f}" for k in ("horizontal", "sloper", "vert-HF", "vert-VHF"))
    rig = max(np.abs(first_cut(acc.Case(**{**r["case"], "band": tuple(r["case"]["band"])}), cal)
                     - np.asarray(r["points"])[0, :3]).max() for r in fdtd_rows)
    m8 = max(np.abs(first_cut(c, cal) - base8[c.name]).max() for c in acc.CASES)
    rt = ""
    if rates:
        out = with_cal(cal, acc.tuning_rates)
        cases = {c.name: c for c in acc.CASES}

        def fails(n, k, m, v):
            if k == "dip_short":
                T = with_cal(cal, acc.model_design, cases[n])[3]
                if abs(v) * 0.3 * T < 1e-3 * cases[n].f0:
                    return abs(m) * 0.3 * T >= 2e-3 * cases[n].f0
            return abs(m / v - 1) > 0.15
        bad = [f"{n.split('-')[0]} {k} {m / v - 1:+.1%}" for n, d in out.items() for k, (m, v) in d.items()
               if fails(n, k, m, v)]
        x6 = out["6m-horiz-6m-avg"]["x_short"]
        rt = f" | {x6[0] / x6[1] - 1:+.1%} | {'; '.join(bad) or 'none'}"
    c1, c2 = rep["nec-c1"], rep["nec-c2"]
    name = Path(p).stem if p.endswith(".json") else p
    return (f"| {name} | {tr[0]:.4f} / {tr[1]:.3f} | {c1['rho_median']:.4f} / {c1['rho_q90']:.3f} | "
            f"{c2['rho_median']:.4f} / {c2['rho_q90']:.3f} | {fd:.3f} | {c1['edges_within_10']} / "
            f"{c2['edges_within_10']} | {d50[0]} / {d50[1]} | {c1['swr_median']:.3f} / {c2['swr_median']:.3f} | "
            f"{o} | {rig * 1e3:.2f} | {m8 * 1e3:.1f}{rt} |")


def _oracle(factors):
    """Wrap nec_study.case_from_dict so that each stored design's antenna carries its class's factor."""
    plain = ns.case_from_dict

    def patched(d):
        case = plain(d)
        o = d["orientation"]
        k = {"horizontal": 0, "sloper": 1}.get(o, 2 if d["f0"] <= 100e6 else 3)
        return _Scaled(case, factors[k])
    ns.case_from_dict = patched


class _Scaled:
    """A design whose antenna() has end_resistance_scale set (oracle)."""

    def __init__(self, case, factor):
        self.case, self.factor = case, factor

    def __getattr__(self, name):
        return getattr(self.case, name)

    def antenna(self):
        return dataclasses.replace(self.case.antenna(), end_resistance_scale=self.factor)


def main(argv):
    rates = "rates" in argv
    for a in [a for a in argv if a.startswith("oracle=")]:
        _oracle([float(v) for v in a[7:].split(",")])
        argv = [b for b in argv if b != a]
    train, held = ff.nec_rows()
    _, h2 = ff.nec_rows(ff.HELD_EXTRA)
    runs = ff.load_runs()
    fdtd_rows = json.loads((ff.DATA / "fdtd-jpoles-c5.json").read_text())
    base8 = {c.name: first_cut(c, jpole.CAL) for c in acc.CASES}
    for p in [a for a in argv if a != "rates"]:
        print(row(p, rates, train, held, h2, runs, fdtd_rows, base8), flush=True)


if __name__ == "__main__":
    main(sys.argv[1:])
