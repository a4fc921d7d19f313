"""Construction styles (`construction:`, issue 18 item 1): each style's cut list, drawing and tuning
steps read together, as a builder at the bench reads them, agree with each other; what each style must
say and must never say; an old file without the key means what it meant.

The lengths are read back from the printed text (the cut list's table, the drawing's labels, the
tuning procedure's steps) and compared with each other, the sum of a piece's marked parts with the
piece within the printed rounding (half a step per printed figure). The dip's shift per trimming
step is the model's own sensitivity (Solution.sensitivity, DESIGN.md §7). The twin-lead build's NEC-2
figures are checked against the stored run (bench/twinlead_nec.py, bench/data/twinlead-nec.json).
"""

from __future__ import annotations

import dataclasses
import json
import pathlib
import re

import pytest
import yaml

from buildsheet import units
from buildsheet.design import design_from_text, load_design
from buildsheet.drawing.figures import figures
from buildsheet.sheet import TRIM_STEPS_M, Table, build_sheet, trim_step_m
from buildsheet.solver import TWIN_LEAD_NEC_DIP, TWIN_LEAD_NEC_SWR, solve

from test_figures import lengths_in, svg_texts
from test_sheet import plain, texts

ROOT = pathlib.Path(__file__).resolve().parent.parent
DATE = "2026-12-01"
TUBES = ("garden-pipe-2m", "allotment-2m", "tower-70cm")
TWIN_LEADS = ("field-day-ribbon-2m",)
CASES = [(n, u) for n in TUBES + TWIN_LEADS for u in ("imperial", "metric")]


@pytest.fixture(scope="module")
def built():
    out = {}
    for name, system in CASES:
        d = load_design(ROOT / "designs" / f"{name}.yaml")
        d = d.with_changes(output=dataclasses.replace(d.output, units=system))
        s = solve(d)
        sheet = build_sheet(d, s, DATE)
        cut = next(b for b in sheet.section("cut-list").blocks if isinstance(b, Table))
        out[name, system] = dict(
            design=d, solution=s,
            cut={plain(r[0]): plain(r[2]) for r in cut.rows},
            drawing=svg_texts(figures(d, s, DATE)["radiator"]),
            tuning=" ".join(" ".join(texts(sheet.section("tuning").blocks)).split()),
            sheet=" ".join(" ".join(texts([b for sec in sheet.sections for b in sec.blocks])).split()))
    return out


def value(text: str, system: str) -> tuple[float, float]:
    """The one length printed in `text`: (m, half its rounding step)."""
    (_, v, half), = lengths_in(text, system)
    return v, half


def label(drawing: list[str], name: str) -> str:
    """The length of the drawing's label that is `name` followed by one length and nothing else."""
    found = []
    for t in drawing:
        rest = t[len(name) + 1:]
        if t.startswith(name + " ") and [p for p, _, _ in lengths_in(rest, "imperial" if '"' in rest
                                                                    else "metric")] == [rest]:
            found.append(rest)
    assert len(set(found)) == 1, (name, found)       # (the same length may label both views)
    return found[0]


def bare(drawing: list[str], system: str) -> list[str]:
    """The drawing's labels that are a length alone (a short span's unnamed dimension)."""
    return [t for t in drawing if [p for p, _, _ in lengths_in(t, system)] == [t]]


def trim_text(s, system: str) -> str:
    """'1/4" trimmed off raises the dip by about 273 kHz': the step within 1 % of the radiator and
    the model's dip shift for it (the sheet's frequency-span format: kHz below 1 MHz)."""
    step = trim_step_m(s.dimensions.radiator, system)
    assert step <= 0.01 * s.dimensions.radiator or step == TRIM_STEPS_M[system][-1]
    shift = abs(step * s.sensitivity["dip_hz_per_m_radiator"])
    span = f"{shift / 1e3:.0f} kHz" if shift < 1e6 else f"{shift / 1e6:.2f} MHz"
    return f"{units.format_length(step, system)} trimmed off raises the dip by about {span}"


def sums(parts: list[str], total: str, system: str) -> None:
    """The printed parts add up to the printed total within their rounding."""
    values = [value(p, system) for p in parts]
    v_total, h_total = value(total, system)
    slack = sum(h for _, h in values) + h_total + 1e-9
    assert abs(sum(v for v, _ in values) - v_total) <= slack, (parts, total)


@pytest.mark.parametrize("name, system", [c for c in CASES if c[0] in TUBES])
def test_tube_cut_list_drawing_and_tuning_agree(built, name, system):
    b = built[name, system]
    s, cut, drawing, tuning = b["solution"], b["cut"], b["drawing"], b["tuning"]
    # ONE long element: the radiator and its stub conductor in one piece, and the drawing's marks on it
    assert "long element" in cut and "stub line" not in cut and "radiator" not in cut
    assert label(drawing, "long element") == cut["long element"]
    marks = [label(drawing, "top"), label(drawing, "radiator"), label(drawing, "stub")]
    through = bare(drawing, system)                   # through the bar, unnamed
    sums(marks + through, cut["long element"], system)
    assert label(drawing, "short stub conductor") == cut["short stub conductor"]
    assert label(drawing, "mounting section") == cut["mounting section"]
    short = "short section" if "short section" in cut else "short bar"
    assert label(drawing, short) == cut[short]
    # the tuning starts from the pieces as cut: the top above the open top, the short fixed
    as_cut = label(drawing, "top to the open top, as cut")
    sums(marks[:2], as_cut, system)
    assert f"its top {as_cut} above the stub's open top" in tuning
    stub = units.format_length(s.dimensions.stub, system)
    assert label(drawing, "stub") == stub and f"its centre line {stub} below the open top" in tuning
    tap = units.format_length(s.dimensions.tap, system)
    assert label(drawing, "tap") == tap and f"the clamps {tap} above the centre line" in tuning
    # never "move the short": trimming the top and the tap tune a pipe or rod J-pole
    assert "move the short" not in tuning and "move the short" not in b["sheet"]
    assert f"each {trim_text(s, system)}" in tuning
    assert "trim the long element's top by" in tuning


@pytest.mark.parametrize("name, system", [c for c in CASES if c[0] in TWIN_LEADS])
def test_twin_lead_cut_list_drawing_and_tuning_agree(built, name, system):
    b = built[name, system]
    s, cut, drawing, tuning = b["solution"], b["cut"], b["drawing"], b["tuning"]
    d, fc = s.dimensions, s.first_cut
    # one piece of line, marked from the top: tie, radiator to the gap, stub to the short, tail
    assert label(drawing, "line, one piece") == cut["line, one piece"]
    assert "stub line" not in cut and "radiator" not in cut
    radiator, stub = label(drawing, "radiator, first cut"), label(drawing, "stub, first cut")
    tail = bare(drawing, system)
    sums([label(drawing, "tie"), radiator, stub, *tail], cut["line, one piece"], system)
    # the first cut is long by the velocity-factor spreads of the line (0.80-0.82) and the jacket
    assert fc.stub_margin_m > 0 and fc.radiator_margin_m > 0
    assert radiator == units.format_length(d.radiator + fc.radiator_margin_m, system)
    assert stub == units.format_length(d.stub + fc.stub_margin_m, system)
    assert f"Radiator: {radiator} (the" in tuning and "to the gap" in tuning
    assert f"Short: its centre line {stub} below the gap" in tuning
    assert "0.80 to 0.82" in tuning                                # the line's spread, on the sheet
    tap = units.format_length(d.tap, system)
    assert label(drawing, "tap") == tap and f"the clips {tap} above the centre line" in tuning
    assert "let down on its halyard" in tuning and "trims its top" in tuning
    assert f"each {trim_text(s, system)}" in tuning
    # what NEC-2 can and cannot say about it, on the sheet
    assert "cannot be checked by NEC-2 (no dielectric)" in tuning and f"SWR {TWIN_LEAD_NEC_SWR:.2f}" in tuning


def test_twin_lead_nec_figures_are_the_stored_run():
    """The sheet's NEC-2 figures for a twin-lead build are those of the stored run, made at the
    model's present first cut (after a change to the model the run is made again)."""
    data = json.loads((ROOT / "bench" / "data" / "twinlead-nec.json").read_text())
    row, = data["rows"]
    s = solve(load_design(ROOT / row["design"]))
    for k in ("radiator", "stub", "tap"):
        assert row["model_m"][k] == pytest.approx(getattr(s.dimensions, k), rel=1e-6), k
    assert round(row["nec_swr_f0"], 2) == TWIN_LEAD_NEC_SWR
    assert round(row["nec_dip_hz"] / row["f0_hz"] - 1, 3) == TWIN_LEAD_NEC_DIP


def test_without_the_key_a_file_means_what_it_meant():
    """`construction` absent: the pipe or rod parts are inferred from the diameters as before the
    key existed, and the document ID is computed without it."""
    raw = yaml.safe_load((ROOT / "designs" / "allotment-2m.yaml").read_text())
    raw.pop("construction")
    d = design_from_text(yaml.safe_dump(raw))
    assert d.construction is None and "construction" not in d.canonical()
    s = solve(d)
    assert s.parts.construction == "wire" and s.parts.rigid_radiator
    parts = [i.part for i in s.cut_list]
    assert parts[:3] == ["radiator", "stub line", "short bar"]
    tube = solve(load_design(ROOT / "designs" / "allotment-2m.yaml"))
    assert tube.dimensions == s.dimensions            # the style changes the paperwork, not the model
    assert d.document_id != load_design(ROOT / "designs" / "allotment-2m.yaml").document_id
