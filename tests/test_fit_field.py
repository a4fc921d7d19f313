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


# ----------------------------------------------------------------------------------------------
# 2. Refusing what the model cannot explain
#
# Sweeps of other antennas against the 20 m free-space fit design (tests/data/fit-20m-free.yaml),
# each at 31-49 points around 14.175 MHz; NEC-2 runs take well under a second each.

sys.path.insert(0, str(DATA))
import nec_sweep  # noqa: E402

import necref  # noqa: E402  (tests/ is on sys.path under pytest's rootdir conftest)

C = 299_792_458.0
WIRE_14AWG_M = 1.628e-3     # 14 AWG diameter, ASTM B258 (0.0641 in)


def free_design():
    return load_design(FREE)


def as_sweep(f, z, name) -> Sweep:
    return Sweep(frequency_hz=np.asarray(f, float), z_ohm=np.asarray(z, complex), path=name,
                 lines=tuple(range(1, len(f) + 1)))


def series_rlc(f, f_r, r, q):
    """A series-resonant circuit near its resonance, Z = R (1 + j Q (f/f_r - f_r/f)) (any circuits
    textbook, e.g. Hayt & Kemmerly, 'series resonance'): a small transmitting loop tuned by its
    capacitor and matched to R by its coupling loop behaves so near its sharp resonance."""
    f = np.asarray(f, float)
    return r * (1 + 1j * q * (f / f_r - f_r / f))


def other_antennas() -> dict:
    """name -> (sweep, what its refusal must say)."""
    design = free_design()
    f0 = design.frequency_hz
    lam = C / f0
    f = f0 * np.linspace(0.92, 1.08, 31)
    sweeps = {}
    # a centre-fed half-wave dipole in free space (NEC-2): about 70 ohm at resonance
    for share in (0.48, 0.47):
        z = necref.dipole(share * lam, WIRE_14AWG_M, f).z_feed
        sweeps[f"dipole {share} lambda"] = (as_sweep(f, z, "dipole.s1p"), "another shape")
    # an end-fed wire about a half wave long, fed 1 m from its end (a short counterpoise), through an
    # ideal 1:49 transformer (impedance divided by 49): NEC-2
    for share in (0.485, 0.475):
        length = share * lam + 1.0
        n = 81
        wires = (necref.Wire(1, n, (0.0, 0.0, 0.0), (length, 0.0, 0.0), WIRE_14AWG_M / 2),)
        seg = int(round(1.0 / length * n)) + 1
        z = necref.run(wires, f, necref.Ground(), (1, seg), {1: None}).z_feed / 49.0
        sweeps[f"end-fed wire {share} lambda, 1:49"] = (as_sweep(f, z, "efw.s1p"), "much broader")
    # a small loop's sharp resonance at 13.99 MHz (the issue's), loaded Q 400 and 150, matched to 50 ohm
    for q, span, n in ((400, 0.2e6, 41), (400, 1.0e6, 101), (150, 0.6e6, 61)):
        fl = np.linspace(13.99e6 - span / 2, 13.99e6 + span / 2, n)
        sweeps[f"loop Q {q}, {span / 1e6:g} MHz"] = (as_sweep(fl, series_rlc(fl, 13.99e6, 50.0, q),
                                                              "loop.s1p"), "much sharper")
    # J-poles of this design with a badly wrong stub (20 % short, 20 % long), swept wide enough that
    # the dip is inside (NEC-2)
    d = dims(design)
    fw = f0 * np.linspace(0.7, 1.3, 49)
    for m in (0.8, 1.2):
        z = nec_sweep.nec_impedance(design, d[0], d[1] * m, d[2], fw)
        sweeps[f"J-pole stub x{m}"] = (as_sweep(fw, z, "badstub.s1p"), "edge of the range")
    return sweeps


@pytest.fixture(scope="module")
def others():
    return other_antennas()


def test_every_other_antenna_is_refused(others):
    from buildsheet.errors import SweepError

    design = free_design()
    refused = []
    for name, (sweep, says) in others.items():
        with pytest.raises(SweepError) as info:
            fitmod.fit_sweep(design, sweep)
        assert says in str(info.value), (name, str(info.value))
        refused.append(name)
    print(f"other-antenna sweeps refused: {len(refused)} of {len(others)}")
    assert len(refused) == len(others) == 9


MISCUTS = {"radiator 3 % long": (1.03, 1.0, 1.0), "stub 5 % short": (1.0, 0.95, 1.0),
           "tap 40 % long": (1.0, 1.0, 1.4), "all three off": (1.03, 1.05, 1.4)}


@pytest.mark.parametrize("name", list(MISCUTS))
def test_mis_cut_j_poles_are_accepted_well_inside_the_gate(name):
    """NEC-2 sweeps of this design cut wrong are explained: the gate statistic stays far below
    FIT_GATE (measured 0.007-0.016 while building the gate)."""
    design = free_design()
    built = dims(design) * np.array(MISCUTS[name])
    f = design.frequency_hz * np.linspace(0.92, 1.08, 31)
    z = nec_sweep.nec_impedance(design, *built, f)
    from buildsheet.solver import Dimensions
    result = fitmod.fit_sweep(design, as_sweep(f, z, "jpole.s1p"),
                              built=Dimensions(*built, design.stub.spacing_m))
    rho = (z - 50) / (z + 50)
    w = np.clip(1 - np.abs(rho) ** 2, 0, 1) ** fitmod.WEIGHT_POWER
    g = fitmod.gate_residual(rho, (result.z_fit - 50) / (result.z_fit + 50), w)
    assert g < 0.2 * fitmod.FIT_GATE


def test_the_demo_sweep_is_accepted():
    """The demo sweep (NEC-2 over real ground, designs/oak-yard-20m-sweep.s1p) is a J-pole of the demo
    design: the gate must let it through (its statistic was 0.22 when the gate was set)."""
    from buildsheet.touchstone import read_sweep

    root = Path(__file__).parent.parent
    fitmod.fit_sweep(load_design(root / "designs" / "oak-yard-20m.yaml"),
                     read_sweep(root / "designs" / "oak-yard-20m-sweep.s1p"))


def test_gate_is_the_999th_percentile_of_the_held_out_error():
    """FIT_GATE from the jpole.py docstring's figures: a log-normal through median 0.034 and 90th
    percentile 0.081 (normal quantiles 1.2816 and 3.0902, any statistics table)."""
    sigma = np.log(0.081 / 0.034) / 1.2816
    assert fitmod.FIT_GATE == pytest.approx(0.034 * np.exp(3.0902 * sigma), rel=1e-9)
    assert fitmod.FIT_GATE == pytest.approx(0.276, abs=0.001)


def test_uncalibrated_sweep_is_refused_and_nothing_written(tmp_path, capsys):
    """|S11| up to about 50 (the issue's): refused by `fit` and by `fit --write`, the file untouched."""
    design = free_design()
    f = design.frequency_hz * np.linspace(0.92, 1.08, 31)
    rho = np.linspace(0.5, 50.0, 31) * np.exp(1j * np.linspace(0, 3, 31))
    sweep = tmp_path / "bad.s1p"
    sweep.write_text("# HZ S MA R 50\n" + "".join(
        f"{fi:.1f} {abs(r):.6f} {np.degrees(np.angle(r)):.4f}\n" for fi, r in zip(f, rho)))
    path = tmp_path / "free.yaml"
    path.write_bytes(FREE.read_bytes())
    assert main(["fit", str(path), str(sweep), "--write"]) == 2
    err = capsys.readouterr().err
    assert "not calibrated" in err and len(err.strip().splitlines()) == 1
    assert path.read_bytes() == FREE.read_bytes() and not (tmp_path / "free.yaml.bak").exists()
    # handed to fit_sweep directly (not through a reader), the same refusal
    from buildsheet.errors import SweepError
    z = 50 * (1 + rho) / (1 - rho)
    with pytest.raises(SweepError, match="not calibrated"):
        fitmod.fit_sweep(design, as_sweep(f, z, "bad.s1p"))


# ----------------------------------------------------------------------------------------------
# 3. One story per fit, by the sheet's rule

def story(design, built, f=None):
    f = design.frequency_hz * np.linspace(0.93, 1.07, 31) if f is None else f
    return fitmod.fit_sweep(design, as_sweep(f, model_z(design, built, f), "m.s1p"),
                            built=_dims(design, built))


def _dims(design, v):
    from buildsheet.solver import Dimensions
    return Dimensions(*v, design.stub.spacing_m)


def sheet_rows(design) -> dict:
    """The sheet's tuning table for the design, as printed: {what you measure: what to do}."""
    import re

    from buildsheet.sheet import Table, build_sheet
    sheet = build_sheet(design, solve(design), "2026-01-01")
    table = next(b for b in sheet.section("tuning").blocks
                 if isinstance(b, Table) and b.header == ("you measure", "do this"))
    clean = lambda t: html.unescape(re.sub(r"<[^>]+>", "", t)).replace("\u00a0", " ")  # noqa: E731
    return {clean(a): clean(b) for a, b in table.rows}


def row_move(text: str, part: str) -> float:
    """The signed move (m, + toward the top / + longer) a table cell gives for `part`."""
    import re
    if part == "radiator":
        m = re.search(r"(shorten|lengthen) the radiator by ([^,]+)", text)
        return (1 if m.group(1) == "lengthen" else -1) * units.parse_quantity(m.group(2), "length")
    m = re.search(rf"move the {part} (up|down) by ([^,]+)", text)
    return (1 if m.group(1) == "up" else -1) * units.parse_quantity(m.group(2), "length")


def step_of(result, part):
    got = [s for s in result.steps if s[0] == part]
    return got[0] if got else None


def test_story_follows_the_sheets_table_on_the_same_case():
    """The antenna is built off by exactly what a row of the sheet's table corrects (the row's move,
    undone); the fit's story must move the same part the same way by about as much (the table is the
    model's slope, the fit the model's finite move: within 25 %), in the sheet's order (short, then
    tap, then radiator)."""
    design = free_design()
    d0 = dims(design)
    rows = sheet_rows(design)
    f0 = "14.175 MHz"
    x_row = next(v for k, v in rows.items() if k.startswith("X = +"))
    r_row = next(v for k, v in rows.items() if k.startswith("R ") and "above" in k)
    dip_row = next(v for k, v in rows.items() if k.startswith("lowest SWR") and "below" in k)
    assert f0 in next(iter(rows))

    # X too high: the short is off by the opposite of the row's move (its clamp left: tap distance too)
    short = row_move(x_row, "short")
    built = d0 + np.array([0.0, short, short])
    result = story(design, built)
    part, move, _ = result.steps[0]
    assert part == "short" and np.sign(move) == np.sign(short)
    assert abs(move) == pytest.approx(abs(short), rel=0.25)

    # R too high: the tap clamp is off by the opposite of the row's move
    tap = row_move(r_row, "tap")
    result = story(design, d0 + np.array([0.0, 0.0, -tap]))
    step = step_of(result, "tap")
    assert step is not None and np.sign(step[1]) == np.sign(tap)
    assert abs(step[1]) == pytest.approx(abs(tap), rel=0.25)
    assert [s[0] for s in result.steps] == [p for p in fitmod.STEP_ORDER if step_of(result, p)]

    # the dip low: the radiator is longer than designed by what the row trims
    trim = row_move(dip_row, "radiator")
    assert trim < 0
    result = story(design, d0 + np.array([-trim, 0.0, 0.0]))
    step = step_of(result, "radiator")
    assert result.radiator_retuned and step is not None and step[1] < 0
    assert abs(step[1]) == pytest.approx(abs(trim), rel=0.25)
    assert result.steps[-1][0] == "radiator"


@pytest.mark.parametrize("off", [(1.0, 1.0, 1.0), (1.0002, 1.0001, 1.0), (1.0, 1.03, 1.2),
                                 (1.03, 1.0, 1.0), (1.0, 0.97, 0.8), (1.01, 1.02, 1.4)])
@pytest.mark.parametrize("unit", ["metric", "imperial"])
def test_no_step_rounds_to_nothing_and_swr_is_given_after_each(off, unit):
    design = free_design().with_changes(output=dataclasses_replace_units(unit))
    d0 = dims(design)
    result = story(design, d0 * np.array(off))
    text = fitmod.fit_text(result)
    least = fitmod.MIN_MOVE_M[unit]
    for part, move, swr_step in result.steps:
        assert abs(move) >= least - 1e-12 and np.isfinite(swr_step)
    import re
    # every printed "a -> b" changes something
    for a, b in re.findall(r"\((?:stub )?([^()]*?) -> ([^;()]*?)[;)]", text):
        assert a.strip() != b.strip(), text
    assert text.count("SWR at 14.175 MHz then about") == len(result.steps)
    if not result.steps:
        assert "nothing to move" in text
    else:
        # the last step's SWR is the prediction, and it is a match (model round trip)
        assert result.steps[-1][2] == result.swr_after < 1.1
    assert "left as it is" not in text


def dataclasses_replace_units(unit):
    import dataclasses
    return dataclasses.replace(free_design().output, units=unit)


# ----------------------------------------------------------------------------------------------
# 5. SWR readings only

READ_AT = np.array([0.975, 0.985, 0.99, 0.995, 1.0, 1.005, 1.01, 1.015, 1.025])


def test_swr_readings_find_the_dip_the_model_has():
    """Readings the model made (|rho| only) at nine frequencies: the parabola's dip lies within 10 kHz
    and 0.05 in SWR of the model's own (a 1 kHz grid)."""
    from buildsheet import swronly
    design = free_design()
    f0 = design.frequency_hz
    for off in ((1.02, 1.0, 1.0), (1.0, 1.0, 0.7), (0.98, 1.01, 1.2)):
        built = dims(design) * np.array(off)
        f = f0 * READ_AT
        rho = np.abs((model_z(design, built, f) - 50) / (model_z(design, built, f) + 50))
        adv = swronly.advise(design, list(zip(f, rho)))
        grid = np.arange(f[0], f[-1], 1e3)
        zg = model_z(design, built, grid)
        rg = np.abs((zg - 50) / (zg + 50))
        assert adv.dip_hz == pytest.approx(grid[np.argmin(rg)], abs=10e3)
        assert adv.dip_swr == pytest.approx(swr(zg[np.argmin(rg)], 50.0), abs=0.05)


def nec_swr_round(design, built):
    """One round of SWR-only advice on NEC-2 readings, the moves applied as printed. Returns (SWR at
    f0 before, after, advice)."""
    from buildsheet import swronly
    from buildsheet.solver import Dimensions
    f0 = design.frequency_hz
    f = f0 * READ_AT
    z = nec_sweep.nec_impedance(design, *built, np.concatenate([[f0], f]))
    rho = np.abs((z[1:] - 50) / (z[1:] + 50))
    adv = swronly.advise(design, list(zip(f, rho)), built=Dimensions(*built, design.stub.spacing_m))
    mv = adv.moves_rounded_m
    after = built + np.array([mv["radiator"], -mv["short"], mv["tap"] - mv["short"]])
    return float(swr(z[0], 50.0)), float(swr(nec_sweep.nec_impedance(design, *after, [f0])[0], 50.0)), adv


@pytest.mark.parametrize("off", [(1.03, 1.0, 1.0), (1.0, 1.0, 0.7), (1.0, 1.0, 1.4)])
def test_swr_only_round_on_nec_readings(off):
    """NEC-2 readings of a mis-cut antenna (SWR only, nine readings over +/-2.5 %), one round of the
    advice: the issue's target is SWR 1.5 or lower. Measured while writing this (the model's |rho|
    fitted to the readings): radiator 3 % long 1.89 -> 1.04, tap 30 % short 2.17 -> 1.03, tap 40 %
    long 1.87 -> 1.02 (with the earlier parabola-and-rates advice the last was 1.64)."""
    design = free_design()
    before, after, adv = nec_swr_round(design, dims(design) * np.array(off))
    print(f"SWR only, {off}: NEC SWR at f0 {before:.2f} -> {after:.2f}")
    assert after < before and after <= 1.5


@pytest.mark.parametrize("off", [(1.0, 1.0, 0.7), (0.98, 1.0, 0.8)])
def test_the_reading_that_settles_it_picks_the_antenna_nec_has(off):
    """Where the readings leave a mirror-image alternative, the one further reading the advice names
    must tell them apart on the real thing: NEC-2's SWR at that frequency lies nearer (in |rho|) to
    the advice's antenna than to the alternative's."""
    design = free_design()
    built = dims(design) * np.array(off)
    _, _, adv = nec_swr_round(design, built)
    assert adv.settle is not None
    fs, s1, s2 = adv.settle
    assert not np.any(np.isclose(fs, adv.frequency_hz))
    rho = lambda s: (s - 1) / (s + 1)  # noqa: E731
    got = rho(float(swr(nec_sweep.nec_impedance(design, *built, [fs])[0], 50.0)))
    assert abs(got - rho(s1)) < abs(got - rho(s2))


def test_swr_only_cli_says_what_swr_cannot_tell(capsys):
    args = ["fit", str(FREE), "--swr", "13.9 MHz=2.5", "--swr", "14.0 MHz=1.6", "--swr",
            "14.1 MHz=RL 14 dB", "--swr", "14.2 MHz=2.2", "--swr", "14.3 MHz=3.5"]
    assert main(args) == 0
    out = capsys.readouterr().out
    assert "SWR alone cannot tell which side of 50 Ω R is, nor the sign of X" in out
    assert "One more reading settles it" in out
    assert main(["fit", str(FREE), "--swr", "13.9 MHz=2.5", "--swr", "14.0 MHz=1.6"]) == 2
    assert "at least 3" in capsys.readouterr().err
    assert main(["fit", str(FREE), "--swr", "13.9 MHz=0.5", "--swr", "14.0 MHz=1.6",
                 "--swr", "14.1 MHz=2"]) == 2
    err = capsys.readouterr().err
    assert "an SWR is 1 or more" in err and len(err.strip().splitlines()) == 1
    # the dip at the end of the readings: read further, no advice
    assert main(["fit", str(FREE), "--swr", "14.0 MHz=1.2", "--swr", "14.1 MHz=1.6",
                 "--swr", "14.2 MHz=2"]) == 2
    assert "read further below" in capsys.readouterr().err
