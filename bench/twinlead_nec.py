"""A sanity check of the `construction: twin-lead` first cut against NEC-2 (issue 18), as far as NEC-2
can give one: NEC-2 wires have no dielectric, so the line and the radiator's jacket enter as effective
velocity factors only.

The model's first cut of a twin-lead design (radiator L of the line's conductor in its jacket, stub S
and tap T of the line) is meshed by tests/necref.py (DESIGN.md §7 rules) as bare wires in air with
every length divided by the velocity factor the model took for it (radiator L / VF_jacket; stub
S / VF_line, tap T / VF_line) and the stub spaced so that 120 acosh(s/d) equals the line's Z0 in the
model: the same electrical lengths and the same Z0, without the dielectric. NEC-2 sweeps it
(f0 +/- 4 %, 81 points) and the script prints the SWR at f0 and where the dip lies.

What this shows and what it does not: it checks that the model's electrical solution (stub, tap and
radiator together, with the radiator's end impedance and the stub's common mode) matches a full-wave
solution of the same electrical lengths; it cannot check the velocity factors themselves (0.81 for the
line, 0.97 for the jacket: catalogue figures from memory), nor that the stub's common mode and
radiation run on a structure 1/VF longer than the real one. Those stay the first cut's uncertainty.

Writes bench/data/twinlead-nec.json with the settings. Run under the heavy lock:
    flock /work/heavy.lock nice -n 10 .venv/bin/python bench/twinlead_nec.py [DESIGN.yaml ...]
"""

from __future__ import annotations

import json
import math
import subprocess
import sys
from datetime import datetime, timezone
from importlib.metadata import version
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT / "tests"))
sys.path.insert(0, str(ROOT))

import necref  # noqa: E402

from buildsheet.design import load_design  # noqa: E402
from buildsheet.physics.lines import swr  # noqa: E402
from buildsheet.solver import solve  # noqa: E402

DESIGNS = ("designs/field-day-ribbon-2m.yaml",)
SPAN, POINTS = 0.04, 81


def check(path: str) -> dict:
    design = load_design(ROOT / path)
    s = solve(design)
    d = s.dimensions
    vf_line, vf_rad = s.stub_line.velocity_factor, design.radiator.velocity_factor
    z0 = s.stub_line.z0_ohm
    wire = design.radiator.diameter_m
    spacing = wire * math.cosh(z0 / 120.0)
    site = design.site
    ground = (necref.Ground() if site.ground_kind == "free-space" else
              necref.Ground("perfect") if site.ground_kind == "perfect" else
              necref.Ground("real", site.permittivity, site.conductivity_s_m))
    dims = necref.JPoleDims(d.radiator / vf_rad, d.stub / vf_line, d.tap / vf_line, spacing, wire, wire,
                            site.orientation, site.height_m, site.slope_rad, ground,
                            wire_sigma=design.radiator.conductivity_s_m,
                            stub_sigma=design.stub.conductivity_s_m)
    f0 = design.frequency_hz
    f = np.linspace(f0 * (1 - SPAN), f0 * (1 + SPAN), POINTS)
    f = np.union1d(f, [f0])
    z = necref.jpole_model(dims, f, f_mesh=f[-1]).z_feed
    rho = swr(z, design.feed.impedance_ohm)
    i0 = int(np.argmin(np.abs(f - f0)))
    best = int(np.argmin(rho))
    below2 = f[rho <= 2.0]
    row = {"design": path, "f0_hz": f0, "model_m": {"radiator": d.radiator, "stub": d.stub, "tap": d.tap},
           "velocity_factor": {"line": vf_line, "jacket": vf_rad}, "z0_ohm": z0,
           "nec_m": {"radiator": dims.radiator, "stub": dims.stub, "tap": dims.tap, "spacing": spacing,
                     "wire_d": wire},
           "nec_z_f0_ohm": [float(z[i0].real), float(z[i0].imag)], "nec_swr_f0": float(rho[i0]),
           "nec_dip_hz": float(f[best]), "nec_dip_swr": float(rho[best]),
           "nec_swr2_hz": [float(below2.min()), float(below2.max())] if below2.size else None,
           "model_swr2_hz": list(s.band_swr2_hz) if s.band_swr2_hz else None}
    print(f"{path}: NEC-2 SWR {row['nec_swr_f0']:.2f} at f0 (Z {z[i0].real:.1f}{z[i0].imag:+.1f}j ohm), "
          f"dip {(f[best] / f0 - 1) * 100:+.2f} % at SWR {rho[best]:.2f}; "
          f"2:1 NEC {row['nec_swr2_hz']}, model {row['model_swr2_hz']}")
    return row


def main(argv: list[str]) -> int:
    rows = [check(p) for p in (argv or DESIGNS)]
    commit = subprocess.run(["git", "rev-parse", "HEAD"], cwd=ROOT, capture_output=True, text=True).stdout.strip()
    out = {"script": "bench/twinlead_nec.py", "commit": commit, "pynec": version("PyNEC"),
           "mesh": "tests/necref.py MESH (DESIGN.md §7)", "span": SPAN, "points": POINTS,
           "date": datetime.now(timezone.utc).isoformat(timespec="seconds"),
           "command": " ".join(["bench/twinlead_nec.py", *argv]), "rows": rows}
    (ROOT / "bench" / "data" / "twinlead-nec.json").write_text(json.dumps(out, indent=1) + "\n")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
