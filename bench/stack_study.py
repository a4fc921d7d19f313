"""Study of the stacked (collinear) J-pole model (buildsheet.physics.jpole, Stack and STACK_CAL)
against NEC-2. Prints figures; not a test.

  python3 bench/stack_study.py collect OUT.json N [START]   NEC data on N random stacked designs
  python3 bench/stack_study.py fit DATA.json                 least-squares fit of STACK_CAL: even
                                                             seeds train, odd seeds are held out
  python3 bench/stack_study.py accept OUT.json               the acceptance designs of
                                                             tests/test_stacked_nec.py and the bench's
                                                             own: NEC SWR at f0, 2:1 bands, gain
                                                             over the single version (NEC patterns)
  python3 bench/stack_study.py rates OUT.json                the tuning table's rates of the same
                                                             designs against NEC-2's central
                                                             differences (tests/test_stacked_nec.py)

Data (collect): for each random design (bench/nec_study.py's random_case, slopers made horizontal:
a stacked sloper is not modelled), the model designs the stacked antenna with the constants of that
time (jpole.design_stack, solve_match), and NEC-2 (tests/necref.py stacked_model, meshed per
DESIGN.md §7) gives the feed impedance at those dimensions on 13 frequencies over f0 +/- 3 %. The
fit adjusts only the global constants of jpole.StackCalibration so that the model's feed impedance
at the same dimensions and frequencies matches NEC's (residual: the difference of the 50-ohm
reflection coefficients). Each data file carries its provenance.
"""

from __future__ import annotations

import dataclasses
import gzip
import json
import sys
import time
from multiprocessing import Pool
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT / "tests"))
sys.path.insert(0, str(ROOT / "bench"))
sys.path.insert(0, str(ROOT))

import necref  # noqa: E402
import nec_study  # noqa: E402
import test_jpole_nec as acc  # noqa: E402
from buildsheet.physics import jpole  # noqa: E402
from buildsheet.physics.lines import Line, swr  # noqa: E402

SPAN = 0.03
N_F = 13


def stack_case(seed: int) -> acc.Case:
    """nec_study.random_case with a sloper made a horizontal."""
    case = nec_study.random_case(seed)
    if case.orientation == "sloper":
        case = dataclasses.replace(case, orientation="horizontal", slope=0.0)
    return case


def model_stacked(case: acc.Case):
    """(antenna with its stack, L, S, T) as the solver designs it (the stub's line for the phasing)."""
    ant = case.antenna()
    L = jpole.resonant_radiator_length(case.f0, ant)
    st = jpole.design_stack(case.f0, ant, L, ant.stub_line, case.spacing, case.stub_d, case.stub_sigma)
    L = jpole.stacked_radiator_length(case.f0, dataclasses.replace(ant, stack=st), st)
    st = dataclasses.replace(st, element=L)
    ant2 = dataclasses.replace(ant, stack=st)
    S, T = jpole.solve_match(case.f0, 50.0, ant2, L)
    return ant2, L, S, T


def nec_stack(st: jpole.Stack, sigma) -> necref.StackDims:
    return necref.StackDims(st.element, st.phasing, st.spacing, st.conductor_d, sigma)


def collect_one(seed: int):
    case = stack_case(seed)
    row = dict(seed=seed, case=nec_study._case_dict(case))
    try:
        ant, L, S, T = model_stacked(case)
        st = ant.stack
        f = case.f0 * (1 + np.linspace(-SPAN, SPAN, N_F))
        z = necref.stacked_model(case.nec_dims(L, S, T), nec_stack(st, case.stub_sigma), f).z_feed
        row.update(L=L, S=S, T=T, element=st.element, phasing=st.phasing, f=f.tolist(),
                   z=[[float(v.real), float(v.imag)] for v in z])
    except (ValueError, RuntimeError, jpole.ModelError) as exc:
        row["error"] = f"{type(exc).__name__}: {exc}"
    return row


def collect(out: str, n: int, start: int = 0):
    t0 = time.time()
    with Pool(2) as pool:
        rows = pool.map(collect_one, range(start, start + n))
    prov = nec_study.provenance(command="python bench/stack_study.py " + " ".join(sys.argv[1:]),
                                stack_cal=dataclasses.asdict(jpole.STACK_CAL),
                                seconds=round(time.time() - t0))
    prov["script"] = "bench/stack_study.py"
    data = dict(provenance=prov, rows=rows)
    with gzip.open(out, "wt") if out.endswith(".gz") else open(out, "w") as fh:
        json.dump(data, fh)
    ok = sum("error" not in r for r in rows)
    print(f"{ok}/{n} designs collected in {time.time() - t0:.0f} s -> {out}")


def perturb_one(row):
    """The training row's design with both elements 1 % longer and 1 % shorter (S, T kept), meshed
    like the row's own dimensions: what the dip's rate per element trim depends on."""
    case = nec_study.case_from_dict(row["case"])
    st0 = necref.StackDims(row["element"], row["phasing"], case.spacing, case.stub_d, case.stub_sigma)
    d0 = case.nec_dims(row["L"], row["S"], row["T"])
    out = []
    for k in (1.01, 0.99):
        dl = (k - 1) * row["L"]
        new = dict(row, L=row["L"] + dl, element=row["element"] + dl, perturbed=k)
        try:
            z = necref.stacked_model(case.nec_dims(new["L"], row["S"], row["T"]),
                                     dataclasses.replace(st0, element=new["element"]), row["f"],
                                     f_mesh=max(row["f"]), like=(d0, st0)).z_feed
            new["z"] = [[float(v.real), float(v.imag)] for v in z]
            out.append(new)
        except (ValueError, RuntimeError) as exc:
            out.append(dict(new, error=f"{type(exc).__name__}: {exc}"))
    return out


def perturb(src: str, out: str):
    """perturb_one on the training (even-seed) rows of src, stored as a data file of its own."""
    t0 = time.time()
    rows = [r for r in load(src) if r["seed"] % 2 == 0]
    with Pool(2) as pool:
        new = [r for rs in pool.map(perturb_one, rows) for r in rs]
    prov = nec_study.provenance(command="python bench/stack_study.py " + " ".join(sys.argv[1:]),
                                seconds=round(time.time() - t0), source=src)
    prov["script"] = "bench/stack_study.py"
    with gzip.open(out, "wt") as fh:
        json.dump(dict(provenance=prov, rows=new), fh)
    print(f"{sum('error' not in r for r in new)}/{len(new)} perturbed rows in {time.time() - t0:.0f} s -> {out}")


def load(path: str) -> list:
    with gzip.open(path, "rt") if path.endswith(".gz") else open(path) as fh:
        return [r for r in json.load(fh)["rows"] if "error" not in r]


def row_rho(row, cal=None):
    """(model, NEC) 50-ohm reflection coefficients at the row's dimensions and frequencies."""
    case = nec_study.case_from_dict(row["case"])
    ant = case.antenna()
    st = jpole.Stack(row["element"], row["phasing"], ant.stub_line, case.spacing, case.stub_d,
                     case.stub_sigma)
    ant = dataclasses.replace(ant, stack=st)
    old = jpole.STACK_CAL
    if cal is not None:
        jpole.STACK_CAL = cal
    try:
        zm = jpole.feed_impedance(np.asarray(row["f"]), ant, row["L"], row["S"], row["T"])
    finally:
        jpole.STACK_CAL = old
    zn = np.array([complex(*v) for v in row["z"]])
    rho = lambda z: (z - 50) / (z + 50)
    return rho(zm), rho(zn)


#: the model without correction: the phasing stub's open end as the J-pole's open top (CAL), no
#: gap lengths, the induced-EMF mutual impedance and the common-mode arm as they are
PHYSICAL = jpole.StackCalibration(phasing_top=jpole.CAL.open_top, radiator_end=0.0, element_end=0.0,
                                  mutual_r=1.0, mutual_x=1.0, pc_x=1.0)
FIELDS = ("phasing_top", "radiator_end", "element_end", "mutual_r", "mutual_x", "pc_x")


def errors(cal, rows):
    out = []
    for r in rows:
        m, n = row_rho(r, cal)
        out.append(float(np.sqrt(np.mean(np.abs(m - n) ** 2))))
    return np.array(out)


def fit(*paths: str):
    from scipy.optimize import least_squares
    rows = [r for path in paths for r in load(path)]
    train = [r for r in rows if r["seed"] % 2 == 0]
    held = [r for r in rows if r["seed"] % 2 == 1]
    x0 = np.array([getattr(PHYSICAL, k) for k in FIELDS])

    def resid(x):
        cal = jpole.StackCalibration(*x)
        res = []
        for r in train:
            m, n = row_rho(r, cal)
            res.extend((m - n).real)
            res.extend((m - n).imag)
        return np.array(res)

    sol = least_squares(resid, x0, x_scale=0.3, diff_step=1e-3)
    cal = jpole.StackCalibration(*(round(float(v), 4) for v in sol.x))
    for name, c in (("physical model (start)", PHYSICAL), ("current jpole.STACK_CAL", jpole.STACK_CAL),
                    ("fitted", cal)):
        et, eh = errors(c, train), errors(c, held)
        print(f"{name}: {c}\n  train rms|drho| median {np.median(et):.4f} 90% {np.percentile(et, 90):.4f}"
              f" (n={len(et)});  held-out median {np.median(eh):.4f} 90% {np.percentile(eh, 90):.4f}"
              f" (n={len(eh)})")
    return cal


def report(path: str):
    """NEC-2's SWR at f0 on a collected file (the designs at the model's dimensions of that time)."""
    rows = load(path)
    s = np.array([float(swr(complex(*r["z"][N_F // 2]), 50.0)) for r in rows])
    print(f"{path}: {len(rows)} designs, NEC SWR at f0 median {np.median(s):.3f}, 90th percentile "
          f"{np.percentile(s, 90):.3f}, max {s.max():.3f}; <= 1.2 on {np.sum(s <= 1.2)}")


def accept(out: str):
    """tests/test_stacked_nec.py's designs: NEC SWR at f0, 2:1 bands, gain over the single version;
    stored with the constants and provenance."""
    import test_stacked_nec as tsn
    t0 = time.time()
    rows = []
    for case in tsn.CASES:
        r = tsn.compare(case)
        row = dict(case=case.name, L=r["L"], S=r["S"], T=r["T"], element=r["element"],
                   phasing=r["phasing"], z_nec=[r["z_nec"].real, r["z_nec"].imag], swr_nec=r["swr"],
                   band_nec=r["band_nec"], band_model=r["band_model"], overlap=r["overlap"],
                   gain_over_single_model_db=r["gain_model"], gain_over_single_nec_db=r["gain_nec"],
                   max_gain_model_dbi=r["max_gain_model"], max_gain_nec_dbi=r["max_gain_nec"])
        rows.append(row)
        bands = lambda b: "none" if b is None else f"{b[0] / 1e6:.3f}-{b[1] / 1e6:.3f}"
        print(f"{case.name}: NEC SWR at f0 {r['swr']:.3f}; 2:1 NEC {bands(r['band_nec'])} model "
              f"{bands(r['band_model'])} MHz (overlap {r['overlap']:.2f}); gain over single model "
              f"{r['gain_model']:+.2f} NEC {r['gain_nec']:+.2f} dB")
    prov = nec_study.provenance(command="python bench/stack_study.py " + " ".join(sys.argv[1:]),
                                stack_cal=dataclasses.asdict(jpole.STACK_CAL),
                                seconds=round(time.time() - t0))
    prov["script"] = "bench/stack_study.py"
    with open(out, "w") as fh:
        json.dump(dict(provenance=prov, rows=rows), fh, indent=1)


def rates(out: str):
    """tests/test_stacked_nec.py's tuning-rate comparison (its `rates` fixture: the model's
    jpole.sensitivities against NEC-2 central differences), printed and stored with the constants
    and provenance: the figures the README and the tuning procedure quote."""
    import test_stacked_nec as tsn
    t0 = time.time()
    found = tsn.rates.__wrapped__()
    rows = []
    for name, by_rate in found.items():
        for rate, (model, nec) in by_rate.items():
            rows.append(dict(case=name, rate=rate, model=model, nec=nec))
            print(f"{name:24s} {rate:13s} model {model:11.4g}  NEC-2 {nec:11.4g}  NEC-2/model {nec / model:.3f}")
    prov = nec_study.provenance(command="python bench/stack_study.py " + " ".join(sys.argv[1:]),
                                cal=dataclasses.asdict(jpole.CAL),
                                stack_cal=dataclasses.asdict(jpole.STACK_CAL),
                                seconds=round(time.time() - t0))
    prov["script"] = "bench/stack_study.py"
    with open(out, "w") as fh:
        json.dump(dict(provenance=prov, rows=rows), fh, indent=1)


if __name__ == "__main__":
    cmd = sys.argv[1]
    if cmd == "collect":
        collect(sys.argv[2], int(sys.argv[3]), int(sys.argv[4]) if len(sys.argv) > 4 else 0)
    elif cmd == "fit":
        fit(*sys.argv[2:])
    elif cmd == "perturb":
        perturb(sys.argv[2], sys.argv[3])
    elif cmd == "report":
        report(sys.argv[2])
    elif cmd == "accept":
        accept(sys.argv[2])
    elif cmd == "rates":
        rates(sys.argv[2])
    else:
        raise SystemExit(__doc__)
