"""`fit` on a `construction: tube` build (rigid pipe or rod J-pole: one long element is the radiator and
a stub conductor, the short soldered or bolted and fixed): the advice never moves the short; the long
element's top and the tap make the match (buildsheet/fit.py, module docstring step 3).

References:
  - Round trips through the model itself (identities, not numbers): a sweep the model made for a
    mis-cut tube is fitted back, and the model's SWR at f0 after the printed (rounded) moves is read.
  - NEC-2 (PyNEC, tests/necref.py through tests/data/nec_sweep.py): a 2 m J-pole of 6 mm rod at 40 mm
    spacing (6.7 diameters: NEC-2 meshes it validly, DESIGN.md section 7: spacing/diameter >= 6), in
    free space, mis-cut; the advice is applied to the NEC-2 model and NEC-2 reads the SWR at f0 after
    one round. Acceptance as for wire antennas (tests/test_fit.py): SWR <= 1.3 after one fit.
  - The same sweeps fitted as a `wire` build (the short free) show what the tube advice replaces: a
    short move (measured while writing this: 12 mm and 8 mm toward the top on the two NEC-2 sweeps).
"""

from __future__ import annotations

import json
import shutil
import sys
from pathlib import Path

import numpy as np
import pytest

from buildsheet import fit as fitmod
from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.physics.lines import reflection, swr
from buildsheet.solver import solve

DATA = Path(__file__).parent / "data"
ROOT = Path(__file__).parent.parent
sys.path.insert(0, str(DATA))
import nec_sweep  # noqa: E402

from test_fit import after_moves, dims, sweep_of  # noqa: E402

PIPE = ROOT / "designs" / "allotment-2m.yaml"
ROD = DATA / "fit-2m-rod-free.yaml"
SPAN, POINTS = 0.08, 31


def model_case(design, miscut):
    """(built, f, z): the model's sweep of the design's antenna cut to `miscut` times its dimensions."""
    built = dims(design) * np.array(miscut)
    f = design.frequency_hz * np.linspace(1 - SPAN, 1 + SPAN, POINTS)
    return built, f, fitmod._model(design, design.calibration).z_feed(f, *built)


def model_swr(design, lengths) -> float:
    return float(swr(fitmod._model(design, design.calibration).z_feed(design.frequency_hz, *lengths)[0], 50.0))


#: the long element's top 3 % long and the tap 30 % long (the brief's mis-cut); the same with the stub
#: acting 2 % long (a stub whose velocity differs from the model's: what a free short would correct)
MISCUTS = [(1.03, 1.0, 1.3), (1.03, 1.02, 1.3)]


@pytest.mark.parametrize("miscut", MISCUTS)
def test_model_miscut_tube_gives_no_short_move(miscut):
    design = load_design(PIPE)
    assert design.construction == "tube"
    built, f, z = model_case(design, miscut)
    result = fitmod.fit_sweep(design, sweep_of(f, z))
    assert result.short_fixed and result.target_matched
    assert result.moves_rounded_m["short"] == 0 and result.moves_m["short"] == 0
    assert [p for p, _, _ in result.steps] == ["radiator", "tap"]      # the sheet's order for a tube
    after = model_swr(design, after_moves(built, result.moves_rounded_m))
    print(f"{miscut}: model SWR at f0 {model_swr(design, built):.2f} -> {after:.3f} after the moves "
          f"{result.moves_rounded_m}")
    assert after == pytest.approx(result.swr_after, abs=1e-9)
    assert after <= 1.1
    assert result.moves_rounded_m["radiator"] < 0                      # the top was cut long: trim it
    text = fitmod.fit_text(result)
    assert "the short is fixed on this build" in text and "Short:" not in text
    assert "Long element: trim its top by" in text


def test_the_same_sweep_as_a_wire_build_moves_the_short():
    """What the tube advice replaces: with the short free (construction: wire) the stub acting 2 % long
    is corrected by moving the short."""
    design = load_design(PIPE)
    built, f, z = model_case(design, MISCUTS[1])
    wire = fitmod.fit_sweep(design.with_changes(construction="wire"), sweep_of(f, z))
    assert wire.moves_rounded_m["short"] > 0


def test_a_radiator_cut_short_calls_for_a_sleeve_or_a_new_long_element():
    design = load_design(PIPE)
    built, f, z = model_case(design, (0.97, 1.0, 1.2))
    result = fitmod.fit_sweep(design, sweep_of(f, z))
    assert result.moves_rounded_m["short"] == 0 and result.moves_rounded_m["radiator"] > 0
    text = fitmod.fit_text(result)
    assert "cannot be lengthened" in text and "sliding sleeve" in text and "new long element" in text
    assert model_swr(design, after_moves(built, result.moves_rounded_m)) <= 1.1


def test_no_match_within_reach_gives_the_least_swr_and_says_so():
    """A stub acting 5 % short: with the short fixed, no radiator within 15 % of its length and no tap
    matches (measured on a grid while writing this: least |rho| 0.140 at the radiator's +15 % bound);
    the target is that least-SWR point and the text says so."""
    design = load_design(PIPE)
    model = fitmod._model(design, design.calibration)
    E = dims(design) * np.array([1.0, 0.95, 1.0])
    target, rho = fitmod.fixed_short_target(model, design.frequency_hz, 50.0, E)
    assert target[1] == E[1]
    # a grid over the reach finds nothing better (to its resolution)
    grid = min(float(abs(reflection(model.z_feed(design.frequency_hz, L, E[1], T)[0], 50.0)))
               for L in np.linspace(0.85, 1.15, 16) * E[0] for T in np.linspace(0.01, 0.99, 99) * E[1])
    assert fitmod.MATCH_RHO < rho <= grid + 1e-9
    built, f, z = model_case(design, (1.0, 0.95, 1.0))
    result = fitmod.fit_sweep(design, sweep_of(f, z))
    assert not result.target_matched and result.moves_rounded_m["short"] == 0
    assert f"the lowest SWR the model finds there, {result.target_swr:.2f}" in fitmod.fit_text(result)


def test_write_then_fit_advises_nothing_further(tmp_path, capsys):
    """`fit --write` stores a calibration with which `solve` gives the advised dimensions (the stub as
    built); `fit` on the same sweep then gives the same moves, none of them of the short."""
    design_path = tmp_path / PIPE.name
    shutil.copy(PIPE, design_path)
    design = load_design(design_path)
    # a smaller mis-cut than MISCUTS[1]: with the tap 30 % long the calibration would need
    # end_resistance_scale 2.26, outside the 0.5-2 a calibration may have (a building error, refused)
    built, f, z = model_case(design, (1.02, 1.02, 1.1))
    sweep = tmp_path / "tube-sweep.s1p"
    nec_sweep.write_s1p(sweep, f, z, ["model sweep of a mis-cut tube build (test)"])
    assert main(["fit", str(design_path), str(sweep), "--write", "--json"]) == 0
    first = json.loads(capsys.readouterr().out)
    assert first["written"] is not None and first["short_fixed"]
    calibrated = solve(load_design(design_path)).dimensions
    assert calibrated.stub == pytest.approx(first["built_m"]["stub"], abs=fitmod.CALIBRATION_TOLERANCE_M)
    assert main(["fit", str(design_path), str(sweep), "--json"]) == 0
    second = json.loads(capsys.readouterr().out)
    assert second["already_calibrated"] and second["calibration"] is None
    assert [s["part"] for s in second["steps"]] == [s["part"] for s in first["steps"]] == ["radiator", "tap"]
    for a, b in zip(first["steps"], second["steps"]):
        assert a["move_m"] == pytest.approx(b["move_m"], abs=1e-9)


@pytest.mark.parametrize("miscut", MISCUTS)
def test_swr_readings_on_a_tube_give_no_short_move(miscut):
    """`fit --swr` (swronly.py) on the same model-made antennas, eight SWR readings without phase: no
    short step, the long element's top then the tap. Its magnitude fit keeps the radiator as read, so
    the round trip is not exact (model SWR at f0 after the moves, measured while writing this: 1.06
    for the first mis-cut, 1.15 for the second); it must at least take the SWR well down."""
    from buildsheet import swronly
    design = load_design(PIPE)
    built, f, z = model_case(design, miscut)
    rho = np.abs(reflection(z, 50.0))
    adv = swronly.advise(design, list(zip(f[8:23:2], rho[8:23:2])))
    assert adv.short_fixed and adv.moves_rounded_m["short"] == 0
    assert [p for p, _, _ in adv.steps] == ["radiator", "tap"]
    before, after = model_swr(design, built), model_swr(design, after_moves(built, adv.moves_rounded_m))
    print(f"{miscut}: SWR readings only: model SWR at f0 {before:.2f} -> {after:.3f}")
    assert after <= 1.2 and after < before
    text = swronly.advice_text(adv)
    assert "the short is fixed on this build" in text and "Short:" not in text


# ----------------------------------------------------------------------------------------------
# NEC-2

@pytest.mark.parametrize("miscut", [(1.04, 1.0, 1.35), (1.03, 1.0, 0.7)])
def test_nec_rod_tube_one_round_with_the_short_fixed(miscut):
    """A NEC-2 sweep of the mis-cut rod J-pole; the advice (no short move) applied in NEC-2. The first
    mis-cut's tap is 35 % long: from the constants c5 on, the first cut is nearer NEC-2's match, and
    30 % read SWR 1.29, under the 1.3 asked of a real mis-cut (measured: 1.37 -> 1.10 and 2.75 -> 1.07
    after one round)."""
    design = load_design(ROD)
    f0 = design.frequency_hz
    built = dims(design) * np.array(miscut)
    f = f0 * np.linspace(1 - SPAN, 1 + SPAN, POINTS)
    z = nec_sweep.nec_impedance(design, *built, np.concatenate([[f0], f]))
    result = fitmod.fit_sweep(design, sweep_of(f, z[1:], "nec-rod"))
    assert result.moves_rounded_m["short"] == 0
    after = after_moves(built, result.moves_rounded_m)
    nec_after = float(swr(nec_sweep.nec_impedance(design, *after, [f0])[0], 50.0))
    print(f"{miscut}: NEC-2 SWR at f0 {float(swr(z[0], 50.0)):.2f} -> {nec_after:.3f} after one round "
          f"(predicted {result.swr_after:.3f}), moves {result.moves_rounded_m}")
    assert float(swr(z[0], 50.0)) > 1.3          # the mis-cut is real
    assert nec_after <= 1.3
