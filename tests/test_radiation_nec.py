"""The radiation figures of the compact model (buildsheet.physics.radiation: the pattern of the line
model's own currents, gain relative to the power delivered to the tap) against NEC-2 (PyNEC through
tests/necref.py, the converged mesh of DESIGN.md §7, copper wires by LD 5, GN 2 Sommerfeld-Norton
ground, RP card power gain relative to the power NEC-2 puts in).

For each design the model chooses radiator, stub and tap (tests/test_jpole_nec.model_design); NEC-2
analyses a wire model of those dimensions at the design frequency. Issue 19's acceptance: the model's
maximum gain within 1 dB of NEC-2's and its take-off angle (the elevation of the maximum) within 3
degrees. NEC's maximum is its RP grid's (theta every 0.5 degree, phi every 5: its gain within a grid
step of the maximum is within about 0.05 dB of it on these broad lobes), its elevation refined by a
parabola through the grid's neighbours in theta, as the model's own is (pattern.maximum).

NEC-2's own energy balance on a J-pole is about 0.955, not 1 (tests/test_nec_harness.py: the source
in the closely spaced tap bar), so its gains read about 0.2 dB low; it is not divided out here (the
comparison is with NEC's figure as it prints it).

Free space: only a vertical, whose maximum has a definite elevation (a horizontal's maximum lies on a
ring around the wire, and where on it is decided by the small common mode: no figure to compare).
Even the vertical's lobe is flat on top: NEC-2's gain varies by under 0.05 dB from 8 to 16 degrees,
so its take-off angle is the weakest of these checks (measured: model 10.0, NEC-2 12.8 degrees; the
stub's common mode tilts the lobe, and the model's common mode is a few degrees off NEC-2's in phase,
see jpole.current_wires).

Measured (PyNEC 2.3.4, jpole.CAL c5; model - NEC): gain +0.27, +0.22, +0.38, +0.21, +0.57, +0.09,
-0.02 dB; take-off -0.1, 0.0, +0.3, 0.0, +0.1, 0.0, -2.8 degrees (in the order of CASES). About 6 s
in all.
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np
import pytest

sys.path.insert(0, str(Path(__file__).parent))
import necref  # noqa: E402
import test_jpole_nec as acc  # noqa: E402

from buildsheet.physics import jpole, pattern, radiation  # noqa: E402

AWG = necref.awg_diameter
_BY_NAME = {c.name: c for c in acc.CASES}
CASES = (
    _BY_NAME["40m-horiz-12m-avg"],
    _BY_NAME["20m-horiz-10m-avg"],
    _BY_NAME["15m-600ohm-8m-perfect"],
    _BY_NAME["10m-sloper-30deg-avg"],
    _BY_NAME["6m-horiz-6m-avg"],
    # thin-wire 2 m verticals (#10 AWG, 25 mm spacing: NEC-2 meshes them validly, unlike pipe)
    acc.Case("2m-wire-vert-3m-avg", 146.0e6, (144.0e6, 148.0e6), AWG(10), AWG(10), 0.025,
             "vertical", 3.0, acc.AVERAGE),
    acc.Case("2m-wire-vert-free", 146.0e6, (144.0e6, 148.0e6), AWG(10), AWG(10), 0.025,
             "vertical", 3.0, acc.FREE),
)


def compare(case) -> dict:
    """The model's and NEC-2's maximum gain (dBi) and take-off angle (deg) for one design."""
    ant, L, S, T = acc.model_design(case)
    prep = jpole.at_frequency(case.f0, ant)
    eff = jpole.state_at(case.f0, ant, L, S, T, 1.0, prepared=prep).efficiency
    model = radiation.radiation(prep, L, S, eff)
    dims = case.nec_dims(L, S, T)
    wires = necref.jpole_wires(dims, case.f0)
    source = (necref.TAG_TAP, (wires[necref.TAG_TAP - 1].nseg + 1) // 2)
    sigma = {necref.TAG_RADIATOR: case.wire_sigma, **{t: case.stub_sigma for t in range(2, 8)}}
    nec = necref.pattern(wires, case.f0, dims.ground, source, sigma, theta_step=0.5, phi_step=5.0)
    g = nec.gain_dbi
    i, j = np.unravel_index(int(np.argmax(g)), g.shape)
    theta = float(nec.theta_deg[i])
    if 0 < i < len(nec.theta_deg) - 1:
        # the grid's maximum refined by a parabola through its neighbours in theta, as the model's
        # own (pattern.maximum): on a flat-topped lobe the grid alone is off by up to half a step
        step = float(nec.theta_deg[i + 1] - nec.theta_deg[i])
        theta += pattern._parabola_peak(g[i - 1, j], g[i, j], g[i + 1, j]) * step
    return dict(model_gain=model.max_gain_dbi, model_takeoff=model.takeoff_deg,
                nec_gain=float(g[i, j]), nec_takeoff=90.0 - theta,
                efficiency=eff)


@pytest.fixture(scope="module")
def results():
    return {c.name: compare(c) for c in CASES}


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_max_gain_and_takeoff_match_nec(case, results):
    """Issue 19: maximum gain within 1 dB, take-off angle within 3 degrees of NEC-2's."""
    r = results[case.name]
    why = (f"model {r['model_gain']:.2f} dBi at {r['model_takeoff']:.1f} deg, "
           f"NEC-2 {r['nec_gain']:.2f} dBi at {r['nec_takeoff']:.1f} deg")
    assert r["model_gain"] == pytest.approx(r["nec_gain"], abs=1.0), why
    assert r["model_takeoff"] == pytest.approx(r["nec_takeoff"], abs=3.0), why



# The exposure estimate's antenna gain (solver.exposure_gain): the larger of a half-wave dipole's 2.15
# dBi and the model's free-space directivity. NEC-2's directivity is its maximum gain over its
# radiated fraction (lossless wires, free space: what NEC-2 puts in and does not radiate is its own
# imbalance, above). Measured (model - NEC): 20m-free +0.04, 6m-horiz-free -0.02, 2m-wire-vert-free
# -0.22 dB: the model's vertical is 0.22 dB under NEC-2's 2.67 dBi, the fixed 2.15 dBi 0.52 dB.
FREE_CASES = (
    _BY_NAME["20m-free"],
    acc.Case("6m-horiz-free", 50.125e6, (50.0e6, 54.0e6), AWG(12), AWG(14), 0.025, "horizontal", 6.0,
             acc.FREE),
    CASES[-1],
)


@pytest.mark.parametrize("case", FREE_CASES, ids=[c.name for c in FREE_CASES])
def test_free_space_directivity_matches_nec(case):
    """The model's free-space directivity (the exposure gain where it exceeds 2.15 dBi) within 0.3 dB
    of NEC-2's."""
    ant, L, S, T = acc.model_design(case)
    model = radiation.free_space_directivity_dbi(jpole.at_frequency(case.f0, ant), L, S)
    dims = case.nec_dims(L, S, T)
    wires = necref.jpole_wires(dims, case.f0)
    source = (necref.TAG_TAP, (wires[necref.TAG_TAP - 1].nseg + 1) // 2)
    nec = necref.pattern(wires, case.f0, dims.ground, source, None, theta_step=1.0, phi_step=5.0)
    nec_d = float(np.max(nec.gain_dbi)) - 10 * np.log10(nec.radiated_fraction)
    assert model == pytest.approx(nec_d, abs=0.3), f"model {model:.2f} dBi, NEC-2 {nec_d:.2f} dBi"

if __name__ == "__main__":      # the table of the report: python tests/test_radiation_nec.py
    print(f"{'design':24s} {'model dBi':>9s} {'NEC dBi':>8s} {'diff':>6s} | {'model TO':>8s} "
          f"{'NEC TO':>6s} {'diff':>5s}")
    for c in CASES:
        r = compare(c)
        print(f"{c.name:24s} {r['model_gain']:9.2f} {r['nec_gain']:8.2f} "
              f"{r['model_gain'] - r['nec_gain']:+6.2f} | {r['model_takeoff']:8.1f} {r['nec_takeoff']:6.1f} "
              f"{r['model_takeoff'] - r['nec_takeoff']:+5.1f}", flush=True)
