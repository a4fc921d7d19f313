"""Upside-down J-poles (site.orientation: inverted) against NEC-2. Prints figures; not a test.

  python3 bench/inverted_nec.py [OUT.json]     (about a minute; a heavy job: run it under
                                                flock /work/heavy.lock nice -n 10)

Inverted: the short at the top (site.height), the stub hanging from it, the radiator hanging below
the open top, its far end the lowest point (physics/jpole.py _radiator_geometry, tests/necref.py).
For each design the model chooses radiator, stub and tap (tests/test_jpole_nec.py model_design);
NEC-2 (tests/necref.py, the DESIGN.md §7 mesh, Sommerfeld-Norton ground) analyses the wires built
to those dimensions, turned over. Printed and stored: NEC SWR (50 ohm) at f0, NEC's and the
model's 2:1 bands and their overlap (intersection/union), each edge's distance from NEC's in parts
of NEC's 2:1 width; and, as "before", NEC's SWR at f0 for the dimensions the model gives when it is
not told the antenna is turned over (orientation vertical at the same short height: the image
and coupling terms of the upright antenna). No constant was fitted to any of these designs
(jpole.CAL is as bench/fdtd_fit.py fitted it on upright and horizontal designs).
Also, from the same dimensions: the maximum gain (dBi, relative to the power in) and the take-off
angle of the model's radiation (physics/radiation.py) and of NEC-2's RP grid
(tests/test_radiation_nec.py compare), and over real ground the efficiency with the ground loss
(model: jpole.state_at; NEC-2: its radiated fraction over its own lossless balance, as
tests/test_jpole_nec.py measures it).
"""

from __future__ import annotations

import datetime
import json
import subprocess
import sys
import time
from dataclasses import asdict, replace
from importlib.metadata import version
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT / "tests"))
import necref  # noqa: E402
import test_jpole_nec as acc  # noqa: E402
import test_radiation_nec as rad_nec  # noqa: E402

from buildsheet.physics import jpole  # noqa: E402
from buildsheet.physics.lines import swr  # noqa: E402

AWG = acc.AWG
AVG, PERFECT = acc.AVERAGE, acc.PERFECT
POOR = dict(ground_kind="real", ground_eps_r=5.0, ground_sigma=0.001)
B12, B10, B20 = (24.89e6, 24.99e6), (28.0e6, 29.7e6), (14.0e6, 14.35e6)
B2 = (144.0e6, 148.0e6)

#: HF wire and VHF wire/thin-rod designs, a few heights of the top (the short), three grounds.
CASES = (
    acc.Case("12m-wire-inv-top9.5-avg", 24.94e6, B12, AWG(14), AWG(14), 0.025, "inverted", 9.5, AVG),
    acc.Case("12m-wire-inv-top12-avg", 24.94e6, B12, AWG(14), AWG(14), 0.025, "inverted", 12.0, AVG),
    acc.Case("12m-wire-inv-top15-avg", 24.94e6, B12, AWG(14), AWG(14), 0.025, "inverted", 15.0, AVG),
    acc.Case("12m-wire-inv-top12-perfect", 24.94e6, B12, AWG(14), AWG(14), 0.025, "inverted", 12.0,
             PERFECT),
    acc.Case("10m-wire-inv-top10-poor", 28.4e6, B10, AWG(14), AWG(14), 0.025, "inverted", 10.0, POOR),
    acc.Case("10m-wire-inv-top8.2-avg", 28.4e6, B10, AWG(14), AWG(14), 0.025, "inverted", 8.2, AVG),
    acc.Case("20m-wire-inv-top18-avg", 14.175e6, B20, AWG(14), AWG(14), 0.025, "inverted", 18.0, AVG),
    acc.Case("2m-wire-inv-top2.2-avg", 146.0e6, B2, 0.002, 0.002, 0.025, "inverted", 2.2, AVG),
    acc.Case("2m-wire-inv-top3-avg", 146.0e6, B2, 0.002, 0.002, 0.025, "inverted", 3.0, AVG),
    acc.Case("2m-rod4-inv-top5-avg", 146.0e6, B2, 0.004, 0.004, 0.025, "inverted", 5.0, AVG),
)


def edges(r) -> tuple[float, float] | None:
    """Each model 2:1 edge's distance from NEC's, in parts of NEC's 2:1 width."""
    if r["band_nec"] is None or r["band_model"] is None:
        return None
    (n_lo, n_hi), (m_lo, m_hi) = r["band_nec"], r["band_model"]
    return abs(m_lo - n_lo) / (n_hi - n_lo), abs(m_hi - n_hi) / (n_hi - n_lo)


def efficiency(case: acc.Case) -> tuple[float, float]:
    """(model, NEC-2) efficiency, radiated / delivered with the ground loss, as
    tests/test_jpole_nec.py test_efficiency_with_ground_loss_matches_nec measures it: NEC's average
    gain over the upper hemisphere over its own lossless free-space balance."""
    ant, L, S, T = acc.model_design(case)
    model = jpole.state_at(case.f0, ant, L, S, T, 100.0).efficiency
    d = case.nec_dims(L, S, T)
    raw = necref.jpole_model(d, [case.f0], pattern_step_deg=5.0).average_gain[0]
    balance = necref.jpole_model(replace(d, ground=necref.Ground(), wire_sigma=None, stub_sigma=None),
                                 [case.f0], pattern_step_deg=5.0).average_gain[0]
    return float(model), float(raw / balance)


def run_case(case: acc.Case) -> dict:
    r = acc.compare(case)
    pat = rad_nec.compare(case)
    eff = efficiency(case) if case.ground["ground_kind"] == "real" else None
    _, L0, S0, T0 = acc.model_design(replace(case, orientation="vertical"))
    z0 = necref.jpole_model(case.nec_dims(L0, S0, T0), [case.f0]).z_feed[0]
    return dict(case=case.name, f0=case.f0, height_top=case.height, ground=case.ground,
                wire_d=case.wire_d, spacing=case.spacing,
                L=r["L"], S=r["S"], T=r["T"], far_end_height=case.height - r["S"] - r["L"],
                z_nec=[r["z_nec"].real, r["z_nec"].imag], swr_nec=r["swr"],
                band_nec=r["band_nec"], band_model=r["band_model"], overlap=r["overlap"],
                edge_error=edges(r),
                before=dict(L=L0, S=S0, T=T0, z_nec=[z0.real, z0.imag], swr_nec=float(swr(z0, 50.0))),
                max_gain_dbi=dict(model=pat["model_gain"], nec=pat["nec_gain"]),
                takeoff_deg=dict(model=pat["model_takeoff"], nec=pat["nec_takeoff"]),
                efficiency=None if eff is None else dict(model=eff[0], nec=eff[1]))


def main(argv) -> int:
    out = Path(argv[0]) if argv else None
    rows = []
    for case in CASES:
        t = time.time()
        row = run_case(case)
        rows.append(row)
        e = row["edge_error"]
        print(f"{row['case']:30s} far end {row['far_end_height']:5.2f} m  NEC SWR {row['swr_nec']:.3f}"
              f"  overlap {row['overlap']:.3f}  edges {e[0]:.3f} {e[1]:.3f}"
              f"  | not told it is inverted: SWR {row['before']['swr_nec']:.3f}", flush=True)
        g, a, ef = row["max_gain_dbi"], row["takeoff_deg"], row["efficiency"]
        print(f"{'':30s} gain model {g['model']:.2f} NEC {g['nec']:.2f} dBi, take-off model "
              f"{a['model']:.1f} NEC {a['nec']:.1f} deg"
              + (f", efficiency model {ef['model']:.3f} NEC {ef['nec']:.3f}" if ef else "")
              + f"  ({time.time() - t:.1f} s)", flush=True)
    if out:
        try:
            commit = subprocess.run(["git", "-C", str(ROOT), "rev-parse", "HEAD"], capture_output=True,
                                    text=True, check=True).stdout.strip()
        except (OSError, subprocess.CalledProcessError):
            commit = None
        meta = dict(script="bench/inverted_nec.py", commit=commit, pynec=version("PyNEC"),
                    mesh=asdict(necref.MESH), mesh_rule="tests/necref.py, DESIGN.md §7 (corrected)",
                    date=datetime.date.today().isoformat(), command=f"inverted_nec.py {out}")
        out.write_text(json.dumps(dict(meta=meta, rows=rows), indent=1))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
