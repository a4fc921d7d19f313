"""NEC-2 sweeps of a design's antenna for the fit tests, and the script that makes the demo sweep
designs/oak-yard-20m-sweep.s1p (run `python3 tests/data/nec_sweep.py`); test/bench only.

The wire model is tests/necref.py's (meshed per DESIGN.md §7). A design is turned into NEC-2 wires
here: radiator wire, stub conductors, spacing, orientation, height and ground from the design; the
conductivities of its materials. NEC-2 wires carry no dielectric, so a stub of a line with a velocity
factor vf below 1 (window line) is modelled as bare wires of the design's spacing and conductor whose
stub and tap lengths are the physical ones divided by vf, the electrical equivalent for the
differential mode (the rule DESIGN.md §7 gives for NEC transmission-line elements). That keeps the
stub's electrical length; NEC's line impedance is then that of the bare wires, and its common-mode
arm is longer by 1/vf: an approximation, said so in the header of every file made with it.
"""

from __future__ import annotations

import math
import os
import sys
from datetime import datetime, timezone
from importlib.metadata import version
from pathlib import Path

import numpy as np

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent.parent
sys.path.insert(0, str(HERE.parent))
sys.path.insert(0, str(ROOT))

import necref  # noqa: E402

from buildsheet.design import Design, load_design  # noqa: E402
from buildsheet.solver import solve  # noqa: E402

DEMO_DESIGN = ROOT / "designs" / "oak-yard-20m.yaml"
DEMO_SWEEP = ROOT / "designs" / "oak-yard-20m-sweep.s1p"
#: the demo antenna's cutting errors, as fractions of the solved dimensions (radiator, stub, tap)
DEMO_MISCUT = (1.02, 1.03, 1.25)
#: the demo sweep: 13.30-15.05 MHz in 50 kHz steps, as an analyser would be set for a 20 m antenna
DEMO_F_HZ = np.arange(13.30e6, 15.05e6 + 1.0, 50e3)


def stub_velocity_factor(design: Design) -> float:
    """The stub line's velocity factor as the design gives it (measured, or 1/sqrt(eps_r))."""
    return design.stub.velocity_factor or 1.0 / math.sqrt(design.stub.eps_r)


def nec_dims(design: Design, radiator: float, stub: float, tap: float) -> necref.JPoleDims:
    """The NEC-2 wire model of the design's antenna with these lengths (m), see the module docstring."""
    site = design.site
    ground = necref.Ground(site.ground_kind, site.permittivity, site.conductivity_s_m)
    vf = stub_velocity_factor(design)
    return necref.JPoleDims(
        radiator=radiator, stub=stub / vf, tap=tap / vf, spacing=design.stub.spacing_m,
        wire_d=design.radiator.diameter_m, stub_d=design.stub.conductor_diameter_m,
        orientation=site.orientation, height=site.height_m, slope=site.slope_rad, ground=ground,
        wire_sigma=design.radiator.conductivity_s_m, stub_sigma=design.stub.conductivity_s_m)


def nec_impedance(design: Design, radiator: float, stub: float, tap: float, f_hz) -> np.ndarray:
    """NEC-2 feed impedance (ohm) at frequencies f_hz (Hz) of the design's antenna with these lengths."""
    return necref.jpole_model(nec_dims(design, radiator, stub, tap), f_hz).z_feed


def write_s1p(path, f_hz, z_ohm, comments: list[str]) -> None:
    """A Touchstone 1.1 1-port file: `comments` as '!' lines, then MHz S MA R 50 data."""
    rho = (np.asarray(z_ohm) - 50.0) / (np.asarray(z_ohm) + 50.0)
    lines = [f"! {c}" if c else "!" for c in comments] + ["# MHz S MA R 50"]
    lines += [f"{f / 1e6:.4f} {abs(r):.6f} {math.degrees(np.angle(r)):.3f}" for f, r in zip(f_hz, rho)]
    Path(path).write_text("\n".join(lines) + "\n", encoding="ascii")


def main() -> None:
    design = load_design(DEMO_DESIGN)
    d = solve(design).dimensions
    built = tuple(x * m for x, m in zip((d.radiator, d.stub, d.tap), DEMO_MISCUT))
    z = nec_impedance(design, *built, DEMO_F_HZ)
    epoch = os.environ.get("SOURCE_DATE_EPOCH")
    now = datetime.fromtimestamp(int(epoch), tz=timezone.utc) if epoch else datetime.now(timezone.utc)
    vf = stub_velocity_factor(design)
    pct = [f"{100 * (m - 1):+.0f} %" for m in DEMO_MISCUT]
    comments = [
        "oak-yard-20m-sweep.s1p: an EXAMPLE sweep for designs/oak-yard-20m.yaml, computed by NEC-2,",
        "not measured. It stands for a sweep taken at the tap of that antenna, deliberately mis-cut",
        f"from the dimensions `buildsheet solve` gave on {now:%Y-%m-%d} (radiator {d.radiator:.4f} m,",
        f"stub {d.stub:.4f} m, tap {d.tap:.4f} m): radiator {pct[0]} ({built[0]:.4f} m), stub {pct[1]}",
        f"(the short {built[1] - d.stub:.3f} m too far from the top: {built[1]:.4f} m), tap {pct[2]} "
        f"({built[2]:.4f} m).",
        f"Tool: NEC-2 via PyNEC {version('PyNEC')}, wire model of "
        "tests/necref.py (meshing of DESIGN.md section 7),",
        f"{design.site.ground} ground ({design.site.ground_kind}: Sommerfeld-Norton, eps_r "
        f"{design.site.permittivity:g}, {design.site.conductivity_s_m:g} S/m), open top "
        f"{design.site.height_m:g} m high, {design.site.orientation}.",
        "NEC-2 wires carry no dielectric: the window line is modelled as its bare wires "
        f"({design.stub.conductor_diameter_m * 1e3:.2f} mm at",
        f"{design.stub.spacing_m * 1e3:.0f} mm) with the stub and tap lengths divided by its velocity "
        f"factor {vf:g}, the electrical equivalent",
        "(so NEC's line impedance is the bare wires', not the line's, and its common-mode arm is longer).",
        f"Made {now:%Y-%m-%d} by tests/data/nec_sweep.py; run `python3 tests/data/nec_sweep.py` to make "
        "it again.",
    ]
    write_s1p(DEMO_SWEEP, DEMO_F_HZ, z, comments)
    print(f"{DEMO_SWEEP}: {len(DEMO_F_HZ)} points")


if __name__ == "__main__":
    main()
