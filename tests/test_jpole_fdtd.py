"""The model against the full-wave FDTD reference for rigid (pipe and rod) J-poles, which NEC-2 cannot
check (DESIGN.md §7). Source: openEMS FDTD runs of bench/fdtd_ref.py (conductors of whole cells
calibrated to the two-wire Z0 = 120 acosh(s/d), 50-ohm port in the tap bar, m = 2 cells across a
conductor; proven on a fat dipole against NEC-2 and on plain shorted stubs against line theory,
bench/data/fdtd-proofs.json), stored with their mesh, command and date in bench/data: runs take
minutes, so they never run here. Verticals in free space, the radiator of the stub's own tube.

Held out: the designs not in bench/fdtd_fit.py TRAIN_DESIGNS were never used to fit jpole.CAL.
"""

from __future__ import annotations

import json
from pathlib import Path

import numpy as np
import pytest

import test_jpole_nec as acc
from buildsheet.physics import jpole

DATA = Path(__file__).resolve().parent.parent / "bench" / "data"
# the designs the joint fit saw (bench/fdtd_fit.py TRAIN_DESIGNS); every other design is held out
TRAINING = {"2m-pipe-15.9-s50-free", "2m-pipe-22.2-s60-free", "70cm-rod-6.35-s25-free",
            "2m-rod-9.5-s40-free", "1.25m-pipe-15.9-s50-free", "6m-tube-12.7-s75-free"}


def _rows(name):
    return json.loads((DATA / name).read_text())


def _case(row):
    return acc.Case(**{**row["case"], "band": tuple(row["case"]["band"])})


def _sweep(row):
    p = np.asarray(row["points"])
    return p[0, :3], p[:, 3], p[:, 4] + 1j * p[:, 5]


def _rho(z):
    return (z - 50.0) / (z + 50.0)


VERIFY = _rows("fdtd-jpoles-c5.json")
# every sweep of a held-out design: at the earlier constants' dimensions (c1), at an intermediate
# fit's (c2), at the joint fit's before q_rc (c3), at the fit with q_rc (c4) and at this model's own
# (c5); none of them was fitted
HELD_SWEEPS = [r for name in ("fdtd-jpoles-heldout-c1.json", "fdtd-jpoles-c2.json", "fdtd-jpoles-c3.json",
                              "fdtd-jpoles-c4.json", "fdtd-jpoles-c5.json")
               for r in _rows(name) if r["name"] not in TRAINING]


def test_the_held_out_set_is_real():
    """At least five whole designs, spacing 2.5 to 4.7 conductor diameters, none of them fitted."""
    names = {r["name"] for r in HELD_SWEEPS}
    ratios = [r["case"]["spacing"] / r["case"]["stub_d"] for r in HELD_SWEEPS]
    assert len(names) >= 5 and not names & TRAINING
    assert min(ratios) < 2.6 and max(ratios) > 4.5


@pytest.mark.parametrize("row", HELD_SWEEPS, ids=lambda r: r["name"])
def test_model_feed_impedance_matches_fdtd_on_held_out_designs(row):
    """At the stored dimensions, the model's 50-ohm reflection coefficient is within 0.13 of the
    FDTD's (the SWR 1.3 budget of issue 13's acceptance) at f0 and rms over f0 +/- 3 %. Measured
    with jpole.CAL (c5): at most 0.097 at f0 and 0.092 rms (1.25 m 3/4-in pipe, D/d 2.52, at four of the
    five sets of dimensions it was run at; with c4, 0.065 and 0.067); the other held-out sweeps within
    0.049 at f0. Source: openEMS FDTD,
    bench/data/fdtd-jpoles-heldout-c1.json, fdtd-jpoles-c2.json, fdtd-jpoles-c3.json,
    fdtd-jpoles-c4.json and fdtd-jpoles-c5.json (the held-out designs' rows)."""
    (L, S, T), f, z = _sweep(row)
    case = _case(row)
    near = np.abs(f / case.f0 - 1) <= 0.03 + 1e-9
    zm = jpole.feed_impedance(f[near], case.antenna(), L, S, T)
    d = np.abs(_rho(zm) - _rho(z[near]))
    i0 = int(np.argmin(np.abs(f[near] - case.f0)))
    assert d[i0] <= 0.13, (row["name"], z[near][i0], zm[i0])
    assert np.sqrt(np.mean(d ** 2)) <= 0.13


@pytest.mark.parametrize("row", VERIFY, ids=lambda r: r["name"])
def test_first_cut_of_rigid_designs_meets_swr_1_3_in_fdtd(row):
    """The model's own dimensions for each rigid design are those the stored FDTD run was made at
    (so the run speaks for this model: change jpole.CAL and this fails until the FDTD runs are made
    again, bench/fdtd_ref.py plan + jpole), and there the FDTD SWR at the design frequency is at most
    1.3 (issue 13's acceptance). Source: openEMS FDTD, bench/data/fdtd-jpoles-c5.json."""
    case = _case(row)
    _, L, S, T = acc.model_design(case)
    (L_f, S_f, T_f), f, z = _sweep(row)
    assert abs(L - L_f) < 2e-4 and abs(S - S_f) < 2e-4 and abs(T - T_f) < 2e-4, (L, S, T, L_f, S_f, T_f)
    i0 = int(np.argmin(np.abs(f - case.f0)))
    g = abs(_rho(z[i0]))
    assert (1 + g) / (1 - g) <= 1.3, (row["name"], z[i0])


def test_every_rigid_design_is_verified():
    """Each design of the FDTD plan has its verification run, training and held-out alike."""
    planned = {r["name"] for r in _rows("fdtd-plan-c5.json")}
    assert planned == {r["name"] for r in VERIFY}
    assert planned & TRAINING and planned - TRAINING


def _swr_f0(row):
    _, f, z = _sweep(row)
    g = abs(_rho(z[int(np.argmin(np.abs(f - row["case"]["f0"])))]))
    return (1 + g) / (1 - g)


def test_the_sheet_quotes_the_stored_fdtd_figures():
    """solver's pipe/rod statement (envelope_warnings) quotes the stored runs: the number of designs,
    their spacing/diameter range and thickest radiator, and the FDTD SWR range of the model's first
    cut, all and held out. Source: bench/data/fdtd-jpoles-c5.json."""
    from buildsheet import solver
    ratios = [r["case"]["spacing"] / r["case"]["stub_d"] for r in VERIFY]
    fractions = [r["case"]["wire_d"] / r["case"]["spacing"] for r in VERIFY]
    held = [r for r in VERIFY if r["name"] not in TRAINING]
    assert solver.FDTD_DESIGNS == (len(VERIFY), len(held))
    assert solver.FDTD_SPACING_RATIO == (round(min(ratios), 1), round(max(ratios), 1))
    assert max(fractions) <= solver.FDTD_RADIATOR_FRACTION < max(fractions) + 0.01
    widest = max(r["case"]["spacing"] * r["case"]["f0"] / 299_792_458.0 for r in VERIFY)
    assert solver.FDTD_SPACING_WAVELENGTHS == round(widest, 3)
    for quoted, rows in ((solver.FDTD_FIRST_CUT_SWR, VERIFY), (solver.FDTD_FIRST_CUT_SWR_HELD_OUT, held)):
        swrs = [_swr_f0(r) for r in rows]
        assert quoted == (round(min(swrs), 2), round(max(swrs), 2))
