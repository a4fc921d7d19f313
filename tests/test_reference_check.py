"""What the sheet says of the model's own accuracy (solver.REFERENCE_CHECK, the "checked in NEC-2" line
beside the predicted 2:1 band): the figures are those of the stored NEC-2 acceptance runs at the
model's current constants (bench/nec_study.py `accept ... envelope`; the reference is NEC-2 on the
converged mesh of tests/necref.py, DESIGN.md §7), each design judged in the kind `solve` gives it, and
the line appears only on designs like the ones those runs draw."""

from __future__ import annotations

import html
import json
import math
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT / "bench"))

ns = pytest.importorskip("nec_study")
sys.path.insert(0, str(ROOT / "tests"))

from buildsheet import solve, solver  # noqa: E402
from buildsheet.blocks import Facts  # noqa: E402
from buildsheet.cli import main  # noqa: E402
from buildsheet.design import design_from_text  # noqa: E402
from buildsheet.sheet import build_sheet  # noqa: E402
from test_envelope import design, design_text  # noqa: E402  (the same design files)

DATA = ROOT / "bench" / "data"
RUNS = [str(DATA / name) for name in solver.REFERENCE_RUNS]


def test_figures_are_the_stored_nec_runs():
    """Every figure of REFERENCE_CHECK as nec_study.reference_stats computes it from the stored runs
    (which refuses runs made at other constants than jpole.CAL: a refit must run them again)."""
    stats = ns.reference_stats(RUNS)
    assert set(stats) == set(solver.REFERENCE_CHECK)
    for kind, r in solver.REFERENCE_CHECK.items():
        got = stats[kind]
        assert (r.kind, r.designs) == (kind, got["designs"])
        assert (r.swr_q90, r.swr_max, r.edge_q90, r.edge_max) == pytest.approx(
            (got["swr_q90"], got["swr_max"], got["edge_q90"], got["edge_max"]), abs=1e-12)


def test_stored_runs_are_at_the_current_constants():
    for path in RUNS:
        meta = json.loads(ns._read(path))["meta"]
        assert ns.made_at_cal(meta["cal"]) and meta["envelope"], path


def test_the_quoted_figures_are_upper_bounds_of_the_runs():
    """The rounding is upward: 'at most' and '9 in 10 at or below' stay true of the runs."""
    rows = [r for p in RUNS for r in ns.load_rows(p) if "swr" in r]
    for kind, ref in solver.REFERENCE_CHECK.items():
        mine = [r for r in rows if solver.reference_kind(r["case"]["orientation"],
                                                         math.degrees(r["case"]["slope"]),
                                                         r["case"]["f0"]) == kind]
        swr = [r["swr"] for r in mine]
        edge = [1.0 if r["edge_error"] is None else r["edge_error"] for r in mine]
        assert max(swr) <= ref.swr_max and max(edge) <= ref.edge_max
        assert sum(s <= ref.swr_q90 for s in swr) >= 0.9 * len(swr)
        assert sum(e <= ref.edge_q90 for e in edge) >= 0.9 * len(edge)


@pytest.mark.parametrize("path", RUNS)
def test_solve_gives_each_stored_design_its_kind(path):
    """Every tenth design of the runs, written as a design file and solved: no warning, and the
    Solution carries the figures of the kind the run was counted in."""
    rows = [r for r in ns.load_rows(path) if "swr" in r][::10]
    assert len(rows) >= 20
    for r in rows:
        c = r["case"]
        s = solve(design_from_text(ns.design_text(ns.case_from_dict(c))))
        kind = solver.reference_kind(c["orientation"], math.degrees(c["slope"]), c["f0"])
        assert s.warnings == () and s.reference is solver.REFERENCE_CHECK[kind], r["seed"]


@pytest.mark.parametrize("kwargs, kind", [
    (dict(), "horizontal"),
    (dict(orientation="sloper", height="14 m", slope="45 deg"), "sloper"),
    (dict(orientation="sloper", height="14 m", slope="50 deg"), "steep sloper"),
    (dict(f="7.1 MHz", orientation="vertical", height="2 m"), "vertical HF"),
    (dict(f="146 MHz", wire="12 AWG", conductor="12 AWG", orientation="vertical", height="3 m"),
     "vertical VHF/UHF"),
])
def test_kinds(kwargs, kind):
    s = solve(design(**kwargs))
    assert s.warnings == () and s.reference.kind == kind


@pytest.mark.parametrize("kwargs", [
    # a model-limit warning (60 deg is past the 55 deg slopers are proven to)
    dict(orientation="sloper", height="8 m", f="28.4 MHz", slope="60 deg"),
    # inverted: a kind the runs do not draw
    dict(f="146 MHz", wire="12 AWG", conductor="12 AWG", orientation="inverted", height="6 m"),
    # the 70 cm rod of its own tube at 0.036 wavelength: FDTD's, no warning, beyond the runs' lambda/50
    dict(f="433.5 MHz", wire="6 mm", spacing="25 mm", conductor="6 mm", orientation="vertical",
         height="3 m"),
    # calibrated to a measured sweep
    dict(extra="calibration: {radiator_scale: 1.01, source: sweep.s1p, date: 2026-05-02}\n"),
])
def test_no_figures_where_the_runs_do_not_reach(kwargs):
    d = design(**kwargs)
    assert solve(d).reference is None


def test_the_line_on_the_sheet_in_json_and_in_the_summary(tmp_path, capsys):
    """The sheet scales the edge fractions to the design's own predicted 2:1 width."""
    d = design()
    s = solve(d)
    r = s.reference
    low, high = s.band_swr2_hz
    blocks = build_sheet(d, s, "2026-01-01").section("performance").blocks
    facts = dict(next(b for b in blocks if isinstance(b, Facts) and "2:1 band" in dict(b.rows)).rows)
    text = html.unescape(facts["checked in NEC-2"]).replace("\u00a0", " ")
    assert f"model's dimensions for {r.designs} unseen bare-wire horizontal J-poles" in text
    assert f"SWR {r.swr_q90:.2f}:1 or lower" in text and f"at most {r.swr_max:.2f}:1" in text
    assert f"where the model predicts {s.feed_swr:.2f}:1" in text
    assert f"within {r.edge_q90 * (high - low) / 1e3:.0f} kHz" in text
    assert f"at most {r.edge_max * (high - low) / 1e3:.0f} kHz" in text
    assert "adds its own spread" not in text     # bare wire on an air-spaced line: no margin
    # window line: the sources' spread of its velocity factor makes the first cut long (solver.FirstCut)
    from buildsheet import load_design
    oak = load_design(str(ROOT / "designs" / "oak-yard-20m.yaml"))
    oak_s = solve(oak)
    assert oak_s.first_cut.stub_margin_m > 0
    oak_blocks = build_sheet(oak, oak_s, "2026-01-01").section("performance").blocks
    oak_facts = dict(next(b for b in oak_blocks if isinstance(b, Facts) and "2:1 band" in dict(b.rows)).rows)
    assert "adds its own spread, for which the first cut starts long" in html.unescape(oak_facts["checked in NEC-2"])
    path = tmp_path / "d.yaml"
    path.write_text(design_text())
    assert main(["solve", str(path), "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["reference_check"] == r.to_dict()
    assert main(["solve", str(path)]) == 0
    assert f"checked in NEC-2 on {r.designs} unseen bare-wire horizontal J-poles" in capsys.readouterr().out


def test_readme_table_is_the_solvers():
    """README, "Where the model is proven": the table of kinds quotes REFERENCE_CHECK."""
    readme = (ROOT / "README.md").read_text()
    for r in solver.REFERENCE_CHECK.values():
        row = (f"| {r.label} | {r.designs} | {r.swr_q90:.2f} | {r.swr_max:.2f} | {r.edge_q90 * 100:.0f} % | "
               f"{r.edge_max * 100:.0f} % |")
        assert row in readme, row
    total = sum(r.designs for r in solver.REFERENCE_CHECK.values())
    assert f"| kind ({total} designs) |" in readme
