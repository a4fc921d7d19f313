"""A quick fit of a few constants of jpole.Calibration (the R side of the radiator arm, and the candidate terms
of bench/data/cal-candidates/README.md, c6) on the same residuals as bench/fdtd_fit.py joint_fit (NEC-2
training designs of nec-c1, even seeds, with nec_study's weights and robust loss; the FDTD training sweeps;
the anchor prior on each constant's relative change from jpole.CAL, candidate terms and `loose` ones not
anchored), from jpole.CAL with `set` applied; under a minute, so candidate forms can be screened before a
full `fdtd_fit.py fit-arm`. Judge the output with `fdtd_fit.py judge OUT.json`. Run with the venv's python:

  python bench/quick_fit.py OUT.json free=r_scale,r_w,... [set=r_sr:1,...] [loose=r_rc,...] [nfev=15]
                            [f0w=3] [anchor=1]
"""
import sys, json, time, dataclasses
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent))
sys.path.insert(0, str(Path(__file__).resolve().parent.parent))
import fdtd_fit as ff  # noqa: E402
import nec_study as ns  # noqa: E402
from buildsheet.physics import jpole  # noqa: E402
from scipy.optimize import least_squares  # noqa: E402


def main(argv):
    args = dict(a.split("=", 1) for a in argv[1:])
    out = argv[0]
    free = args["free"].split(",")
    loose = args.get("loose", "").split(",") if args.get("loose") else []
    nfev = int(args.get("nfev", 15)); ff.ANCHOR_WEIGHT = float(args.get("anchor", ff.ANCHOR_WEIGHT))
    ns.F0_WEIGHT = float(args.get("f0w", ns.F0_WEIGHT))
    base = dataclasses.asdict(jpole.CAL)
    if args.get("set"):
        for kv in args["set"].split(","):
            k, v = kv.split(":"); base[k] = float(v)
    runs = [r for r in ff.load_runs() if not r.held]
    train, held = ff.nec_rows()
    x0 = np.array([base[k] for k in free]); scale = np.maximum(np.abs(x0), 0.1)
    anch = np.array([k not in ff.QTERMS and k not in loose for k in free])
    need_clear = any(k in ("r_sr", "r_rp") for k in free)
    make = lambda x: jpole.Calibration(**{**base, **dict(zip(free, x))})
    ns._PREPARED.clear()
    def fun(x):
        cal = make(x)
        if need_clear: ns._PREPARED.clear()
        return np.concatenate([ns.residuals(cal, train), ff.FDTD_WEIGHT * np.concatenate([r.residual(cal) for r in runs]),
                               ff.ANCHOR_WEIGHT * ((x - x0) / scale)[anch]])
    t = time.time()
    sol = least_squares(fun, x0, x_scale=scale, max_nfev=nfev, loss="soft_l1", f_scale=ns.ROBUST_SCALE)
    cal = make(sol.x)
    print(f"{out}: {time.time()-t:.0f} s, nfev {sol.nfev}, cost {sol.cost:.4f}: " + ", ".join(f"{k} {v:.4f}" for k, v in zip(free, sol.x)))
    json.dump(dict(script="bench/quick_fit.py", command=" ".join(argv), date=time.strftime("%Y-%m-%dT%H:%M:%SZ", time.gmtime()), f0_weight=ns.F0_WEIGHT,
                   free=free, loose=loose, set=args.get("set"), cost=sol.cost, calibration=dataclasses.asdict(cal)), open(out, "w"), indent=1)


if __name__ == "__main__":
    main(sys.argv[1:])
