"""The hung-wire style (construction: hung) and the upside-down antenna (site.orientation: inverted):
the cut list, the hardware, the overview drawing, the tuning steps and the cautions read together
(issue 18 item 1, issue 19 item 2), on the two demos and on variants of them.

The rope lengths are geometry (layout.py's rule, common practice for the stand-off and tie-off):
here they are recomputed from the solved dimensions and the design's height, and each output must
print the same number."""

from __future__ import annotations

import pathlib
import re
import sys

import pytest
import yaml

from buildsheet import units
from buildsheet.design import design_from_text, load_design
from buildsheet.drawing.figures import figures
from buildsheet.layout import INSULATOR_M, TIE_OFF_M, standoff
from buildsheet.sheet import build_sheet
from buildsheet.solver import solve

sys.path.insert(0, str(pathlib.Path(__file__).parent))
from test_figures import svg_texts  # noqa: E402
from test_sheet import plain, texts  # noqa: E402

ROOT = pathlib.Path(__file__).resolve().parent.parent
DATE = "2026-05-01"
HUNG = ("larch-hollow-12m", "heron-pond-10m")


def _variant(demo: str, **changes) -> str:
    data = yaml.safe_load((ROOT / "designs" / f"{demo}.yaml").read_text())
    for dotted, value in changes.items():
        *parents, last = dotted.split("__")
        node = data
        for p in parents:
            node = node[p]
        if value is None:
            node.pop(last)
        else:
            node[last] = value
    return yaml.safe_dump(data, sort_keys=False)


@pytest.fixture(scope="module", params=HUNG)
def hung(request):
    d = load_design(ROOT / "designs" / f"{request.param}.yaml")
    s = solve(d)
    return d, s, build_sheet(d, s, DATE), figures(d, s, DATE)


def test_hung_ropes_are_the_geometry_in_every_output(hung):
    d, s, sheet, figs = hung
    dims, h, lam = s.dimensions, d.site.height_m, d.wavelength_m
    if d.site.orientation == "vertical":
        top, bottom = h + dims.stub + dims.radiator, h
    else:
        top, bottom = h, h - dims.stub - dims.radiator
    gap = standoff(lam)
    branch = top + INSULATOR_M + gap
    halyard = gap + branch + TIE_OFF_M                 # insulator up to the branch, down to a cleat
    tether = bottom - INSULATOR_M + TIE_OFF_M          # bottom insulator down to a stake
    cut = {i.part: i for i in s.cut_list}
    assert cut["halyard rope"].length_m == pytest.approx(halyard, abs=1e-9)
    assert cut["tether rope"].length_m == pytest.approx(tether, abs=1e-9)
    u = d.output.units
    coarse = lambda m: units.format_length(m, u, "coarse")  # noqa: E731
    overview = " ".join(svg_texts(figs["overview"]))
    for shown in (f"halyard {coarse(halyard)}", f"tether {coarse(tether)}",
                  f"branch at least {coarse(branch)}", f"height {units.format_length(h, u)}"):
        assert shown in overview
    cut_rows = {plain(r[0]): plain(r[2]) for r in next(
        b for b in sheet.section("cut-list").blocks if hasattr(b, "boxes") and b.boxes).rows}
    assert cut_rows["halyard rope"] == coarse(halyard) and cut_rows["tether rope"] == coarse(tether)


def test_hung_hardware_has_rope_and_insulators_no_mast(hung):
    d, s, sheet, figs = hung
    items = {h.item: h for h in s.hardware}
    assert not any("mast" in i or "stand-off" in i for i in items)
    assert items["end insulators"].quantity == 2
    overview = " ".join(svg_texts(figs["overview"]))
    assert "mast" not in overview and "stand-off" not in overview
    assert "top insulator" in overview and "bottom insulator" in overview


def test_hung_tuning_lowers_it_on_the_halyard_and_hoists_it_back(hung):
    d, s, sheet, _ = hung
    tuning = " ".join(texts(sheet.section("tuning").blocks))
    assert "lower the antenna on its halyard" in tuning
    assert f"hoist it back to the same mark ({units.format_length(d.site.height_m, d.output.units)}" \
        in tuning
    assert "a reading taken low does not hold once the antenna is raised" in tuning
    if d.site.orientation == "inverted":
        assert "above the open top" in tuning and "below the centre line of the short" in tuning


def test_inverted_far_end_is_the_lowest_point_with_its_voltage_in_the_cautions():
    d = load_design(ROOT / "designs" / "heron-pond-10m.yaml")
    s = solve(d)
    far = d.site.height_m - s.dimensions.stub - s.dimensions.radiator
    assert s.parts.lowest_point_m == pytest.approx(far, abs=1e-12)
    assert s.parts.lowest_point == "the radiator's far end"
    cautions = " ".join(texts(build_sheet(d, s, DATE).section("cautions").blocks))
    m = re.search(r"Upside down, the high-voltage end hangs low\. The radiator's far end is the bottom "
                  r"of this antenna, about (\S+ m) above ground, near head height, at about (\S+ V) rms",
                  cautions)
    assert m, cautions
    assert m[1] == units.format_length(far, "metric")
    assert m[2] == f"{s.voltage_far_end_v_rms:.0f} V"


def test_inverted_on_a_mast_keeps_mast_hardware_and_draws_the_mast():
    d = design_from_text(_variant("heron-pond-10m", construction="wire", name="mast-inverted-10m"))
    s = solve(d)
    items = {h.item: h.quantity for h in s.hardware}
    assert items["mast clamps and stand-off insulators"] == 3 and items["end insulator"] == 1
    assert not any("rope" in i.part for i in s.cut_list)
    overview = svg_texts(figures(d, s, DATE)["overview"])
    assert "mast" in overview and any("stand-off insulator" in t for t in overview)
    assert not any("halyard" in t for t in overview)


def test_construction_defaults_to_wire_and_keeps_old_document_ids():
    """A file without the `construction` key (wire, pipe or rod inferred as before) keeps its
    canonical form (and so its document ID) as it was before the key existed; hung changes it."""
    text = (ROOT / "designs" / "oak-yard-20m.yaml").read_text()
    d = design_from_text(text)
    assert d.construction is None and not d.hung and "construction" not in d.canonical()
    hung = design_from_text(_variant("larch-hollow-12m"))
    wire = design_from_text(_variant("larch-hollow-12m", construction=None))
    assert hung.document_id != wire.document_id
