"""Tests of issue 16's field tuning in `fit` (buildsheet/fit.py): the antenna measured is the one the
design file's latest as-built entry records; a sweep the design's calibration was fitted to adds
nothing to it; sweeps the model cannot explain are refused; the advice is one coherent story.

References:
  - Round trips through the model itself (identities): a sweep the model made for an antenna cut to
    known lengths is fitted back to them, so the advice can be checked exactly.
  - NEC-2 (PyNEC, tests/necref.py through tests/data/nec_sweep.py) for the sweeps of other antennas.
  - Textbook formulas named beside each generated sweep.
"""

from __future__ import annotations

import html
import json
import sys
from pathlib import Path

import numpy as np
import pytest

from buildsheet import fit as fitmod
from buildsheet import units
from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.physics.lines import swr
from buildsheet.solver import solve
from buildsheet.touchstone import Sweep

DATA = Path(__file__).parent / "data"
FREE = DATA / "fit-20m-free.yaml"


def dims(design) -> np.ndarray:
    d = solve(design).dimensions
    return np.array([d.radiator, d.stub, d.tap])


def model_z(design, lengths, f):
    return fitmod._model(design, design.calibration).z_feed(f, *lengths)


def write_s1p(path: Path, f, z) -> None:
    """A Touchstone 1-port of Z in real/imaginary form, normalized to R 50 (Touchstone 1.1: Z
    parameters are given divided by the reference resistance)."""
    rows = "".join(f"{fi:.1f} {zi.real / 50:.9f} {zi.imag / 50:.9f}\n" for fi, zi in zip(f, z))
    path.write_text("! test sweep\n# HZ Z RI R 50\n" + rows)


# ----------------------------------------------------------------------------------------------
# 1. The as-built state

def test_fit_starts_from_the_latest_as_built_entry(tmp_path, capsys):
    path = tmp_path / "free.yaml"
    path.write_bytes(FREE.read_bytes())
    design = load_design(path)
    d0 = dims(design)
    built = d0 * np.array([1.0, 1.04, 1.3])          # the short and the tap were not put as designed
    # an older entry first, then the one the sweep was taken on
    assert main(["record", str(path), "--date", "2026-05-01", "--short", f"{d0[1] * 1.1:.4f} m"]) == 0
    assert main(["record", str(path), "--date", "2026-05-03", "--short", f"{built[1]:.4f} m",
                 "--tap", f"{built[2]:.4f} m"]) == 0
    capsys.readouterr()
    design = load_design(path)
    built = np.array([d0[0], round(built[1], 4), round(built[2], 4)])
    f = design.frequency_hz * np.linspace(0.93, 1.07, 31)
    sweep = tmp_path / "s.s1p"
    write_s1p(sweep, f, model_z(design, built, f))

    result = fitmod.fit_sweep(design, fitmod_read(sweep))
    np.testing.assert_allclose([result.built.radiator, result.built.stub, result.built.tap], built,
                               atol=1e-9)
    assert result.built_from == "as-built entry of 2026-05-03; radiator as designed"
    # the fit finds the antenna where the record puts it, and the moves are from there
    np.testing.assert_allclose(result.electrical, built, rtol=2e-4)
    after = built + np.array([result.moves_m["radiator"], -result.moves_m["short"],
                              result.moves_m["tap"] - result.moves_m["short"]])
    assert swr(model_z(design, after, [design.frequency_hz])[0], 50.0) < 1.01

    assert main(["fit", str(path), str(sweep)]) == 0
    text = capsys.readouterr().out
    fmt = lambda m: units.format_length(m, "metric")  # noqa: E731
    assert (f"the antenna measured: radiator {fmt(built[0])}, stub {fmt(built[1])}, tap {fmt(built[2])} "
            "(as-built entry of 2026-05-03; radiator as designed)") in text


def fitmod_read(path):
    from buildsheet.touchstone import read_sweep
    return read_sweep(path)


def test_write_then_fit_on_the_same_sweep_advises_nothing_further(tmp_path, capsys):
    """The issue's complaint: after `fit --write`, `fit` on the same sweep asked for another move.
    Now the second fit's target is the calibrated sheet, which is the first fit's advice."""
    path = tmp_path / "demo.yaml"
    path.write_bytes((Path(__file__).parent.parent / "designs" / "oak-yard-20m.yaml").read_bytes())
    sweep = Path(__file__).parent.parent / "designs" / "oak-yard-20m-sweep.s1p"
    assert main(["fit", str(path), str(sweep), "--write", "--json"]) == 0
    first = json.loads(capsys.readouterr().out)
    assert first["written"] is not None
    assert main(["fit", str(path), str(sweep), "--json"]) == 0
    second = json.loads(capsys.readouterr().out)
    assert second["already_calibrated"] and second["calibration"] is None
    for key in ("radiator", "stub", "tap"):
        assert second["dimensions_m"][key] == pytest.approx(first["dimensions_m"][key], abs=5e-4)
    assert second["moves_m"] == pytest.approx(first["moves_m"], abs=5e-4)
    assert main(["fit", str(path), str(sweep)]) == 0
    assert "the design's calibration was fitted to this sweep" in capsys.readouterr().out
    # the moves made and recorded: the same sweep (of the antenna before them) then asks for none
    adv = second["dimensions_m"]
    assert main(["record", str(path), "--date", "2099-01-01", "--radiator", f"{adv['radiator']:.5f} m",
                 "--short", f"{adv['stub']:.5f} m", "--tap", f"{adv['tap']:.5f} m"]) == 0
    capsys.readouterr()
    assert main(["fit", str(path), str(sweep), "--json"]) == 0
    third = json.loads(capsys.readouterr().out)
    assert all(abs(m) < 1e-4 for m in third["moves_m"].values())
    assert main(["fit", str(path), str(sweep), "--write"]) == 2


def test_sheet_tuning_starts_from_the_latest_as_built_entry():
    """The sheet's tuning section names the antenna as it stands when the design has a record (the
    same entry `fit` starts from), each length against the design's in the sheet's rounding."""
    from buildsheet.design import design_from_text
    from buildsheet.sheet import Para, build_sheet

    root = Path(__file__).parent.parent
    text = (root / "designs" / "oak-yard-20m.yaml").read_text()
    plain_design = design_from_text(text, "oak.yaml")
    d0 = dims(plain_design)
    stub_in = round(d0[1] / 0.0254 * 8) / 8 + 6         # 6 in longer than the sheet's rounded stub
    stub = units.format_length(stub_in * 0.0254, "imperial")
    recorded = text + ("record:\n  - date: 2026-05-01\n    tap: 9 in\n"
                       f"  - date: 2026-05-02\n    stub: {stub_in} in\n    tap: 12 in\n")
    design = design_from_text(recorded, "oak.yaml")

    def tuning_text(d):
        sheet = build_sheet(d, solve(d), "2026-05-05")
        return html.unescape(" ".join(b.text for b in sheet.section("tuning").blocks
                                      if isinstance(b, Para)))

    assert "As built" not in tuning_text(plain_design)
    got = tuning_text(design).replace("\u00a0", " ")
    assert "As built (the record's entry of 2026-05-02): radiator not recorded" in got
    assert f"stub {stub} (6\" longer than designed); tap 1' 0\" (" in got
    assert fitmod.as_built(design)[1] == "as-built entry of 2026-05-02; radiator as designed"
