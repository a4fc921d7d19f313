"""The yard card (`build --card`, `handout --cards`; buildsheet/card.py) and the site layout
(buildsheet/layout.py) on the sheet, the card and the overview drawing (issue 18).

References: pages counted and text extracted with pypdf (ISO 32000-1 page tree); the site geometry
is checked against plane trigonometry (a straight line from the open top at height h descending at
the slope angle meets the ground at h / tan(slope)); the card's numbers against the full sheet of
the same design, which the other tests check against the solution.
"""

from __future__ import annotations

import math
import pathlib
import shutil

import pypdf
import pytest

from buildsheet import units
from buildsheet.card import build_card
from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.layout import INSULATOR_M, TIE_OFF_M, site_layout, standoff
from buildsheet.sheet import build_sheet
from buildsheet.solver import solve

ROOT = pathlib.Path(__file__).resolve().parent.parent
DEMOS = sorted((ROOT / "designs").glob("*.yaml"))
DATE = "2026-05-01"


def _plain(text: str) -> str:
    return " ".join(text.replace("\u00a0", " ").split())


def _pages(path) -> list[str]:
    return [_plain(p.extract_text()) for p in pypdf.PdfReader(path).pages]


@pytest.fixture(scope="module")
def cards(tmp_path_factory):
    """Every demo built with --card, on its own paper and on the other, in both unit systems."""
    out = tmp_path_factory.mktemp("cards")
    built = {}
    for path in DEMOS:
        for paper, system in (("letter", "imperial"), ("a4", "metric")):
            folder = out / f"{path.stem}-{paper}"
            assert main(["build", str(path), "--card", "-o", str(folder), "--date", DATE,
                         "--paper", paper, "--units", system]) == 0
            built[path.stem, paper] = folder
    return built


@pytest.mark.parametrize("path", DEMOS, ids=lambda p: p.stem)
@pytest.mark.parametrize("paper", ["letter", "a4"])
def test_card_is_one_or_two_pages_with_what_the_yard_needs(cards, path, paper):
    folder = cards[path.stem, paper]
    pages = _pages(folder / f"{path.stem}-card.pdf")
    assert 1 <= len(pages) <= 2
    text = " ".join(pages)
    design = load_design(path)
    s = solve(design)
    system = "imperial" if paper == "letter" else "metric"
    for heading in ("Key dimensions", "Overview", "Cut list and hardware", "Tuning at the antenna",
                    "The two cautions that matter most", "Stop"):
        assert heading in text, heading
    for m in (s.dimensions.radiator, s.dimensions.stub, s.dimensions.tap):
        assert units.format_length(m, system) in text
    for page in pages:      # the document ID and the page count on every page
        assert f"document {s.design_id}" in page and f"of {len(pages)}" in page
    assert "Power lines kill" in text and "High RF voltage at the open ends" in text
    assert _plain(units.format_voltage(s.voltage_open_end_v_peak)) in text
    # the full sheet is still written beside the card, and stays longer (the record copy)
    assert len(_pages(folder / f"{path.stem}.pdf")) > len(pages)


def test_card_cut_list_matches_the_sheet():
    design = load_design(ROOT / "designs" / "oak-yard-20m.yaml")
    s = solve(design)
    card, sheet = build_card(design, s, DATE), build_sheet(design, s, DATE)
    from buildsheet.sheet import Table
    card_cut = next(b for b in card.section("cut-list").blocks if isinstance(b, Table))
    sheet_cut = next(b for b in sheet.section("cut-list").blocks if isinstance(b, Table))
    assert [r[:3] for r in card_cut.rows] == [r[:3] for r in sheet_cut.rows]
    assert card_cut.boxes == sheet_cut.boxes
    assert card.document_id == sheet.document_id


def test_without_the_option_build_writes_no_card(tmp_path):
    assert main(["build", str(ROOT / "designs" / "oak-yard-20m.yaml"), "-o", str(tmp_path), "--date", DATE]) == 0
    assert not (tmp_path / "oak-yard-20m-card.pdf").exists()


def test_seven_design_card_handout_is_at_most_20_pages(tmp_path, capsys):
    # a club's antenna day (issue 18): the six demos and a design from the quick start
    folder = tmp_path / "designs"
    folder.mkdir()
    for path in DEMOS[:6]:      # six demos (there may be more now) and the quick start's design
        shutil.copy(path, folder / path.name)
    assert main(["start", str(folder / "club-2m.yaml"), "--band", "2 m", "--line", "twinlead-300"]) == 0
    assert len(list(folder.glob("*.yaml"))) == 7
    out = tmp_path / "cards.pdf"
    assert main(["handout", str(folder), "-o", str(out), "--cards", "--date", DATE, "--quiet"]) == 0
    pages = _pages(out)
    assert len(pages) <= 20
    assert f"7 yard cards, {len(pages)} pages" in capsys.readouterr().out
    # one shared safety page set, not one per design
    assert sum("Safety first" in p for p in pages[:3]) >= 1
    assert sum("Overhead power lines" in p for p in pages) == 1
    for path in folder.glob("*.yaml"):
        assert sum(f"document {load_design(path).document_id}" in p for p in pages) in (1, 2)


# ---------------------------------------------------------------- site layout

@pytest.mark.parametrize("slope_deg", [10, 30, 45, 70])
def test_sloper_anchor_lies_on_the_radiator_line(slope_deg):
    h, radiator, lam = 12.0, 10.5, 21.1
    t = math.radians(slope_deg)
    site = site_layout("sloper", h, t, radiator, lam)
    # plane trigonometry: the far end is radiator*sin(t) lower and radiator*cos(t) out
    assert site.far_end_height_m == pytest.approx(h - radiator * math.sin(t))
    assert site.far_end_distance_m == pytest.approx(radiator * math.cos(t))
    # the line meets the ground at h/tan(t) from below the open top, which hangs a stand-off out
    assert site.anchor_distance_m == pytest.approx(h / math.tan(t) + standoff(lam))
    anchor_rope = site.ropes[1].length_m - TIE_OFF_M
    # far end insulator to the ground along the line: far end height / sin(t), less the insulator
    assert anchor_rope == pytest.approx(site.far_end_height_m / math.sin(t) - INSULATOR_M)
    assert site.span_m is None


def test_horizontal_span_is_the_radiator_and_both_end_fittings():
    site = site_layout("horizontal", 10.0, 0.0, 10.3, 21.15)
    assert site.span_m == pytest.approx(10.3 + 2 * (INSULATOR_M + 1.0))     # standoff 1 m at 20 m
    # halyards over a pulley at each support: up and back down, plus the stand-off and the tie-off
    assert [r.length_m for r in site.ropes] == pytest.approx([2 * 10.0 + 1.0 + TIE_OFF_M] * 2)
    assert site_layout("vertical", 4.0, 0.0, 1.0, 2.0) is None


def test_standoff_follows_the_wavelength_within_bounds():
    assert standoff(2.05) == 1.0 and standoff(80.0) == pytest.approx(1.6) and standoff(160.0) == 3.0


@pytest.mark.parametrize("name", ["oak-yard-20m", "mill-lane-15m"])
def test_site_layout_is_on_the_sheet_the_cut_list_and_the_overview(name, tmp_path):
    design = load_design(ROOT / "designs" / f"{name}.yaml")
    s = solve(design)
    site = site_layout(design.site.orientation, design.site.height_m, design.site.slope_rad,
                       s.dimensions.radiator, design.wavelength_m)
    u = design.output.units
    coarse = [units.format_length(m, u, "coarse") for m in
              ((site.span_m,) if site.span_m else (site.anchor_distance_m, site.far_end_height_m))]
    ropes = [i for i in s.cut_list if "rope" in i.part]
    assert [i.length_m for i in ropes] == pytest.approx([r.length_m for r in site.ropes])
    assert assert_all_coarse(ropes, u)
    assert main(["build", str(ROOT / "designs" / f"{name}.yaml"), "-o", str(tmp_path), "--date", DATE]) == 0
    sheet_text = " ".join(_pages(tmp_path / f"{name}.pdf"))
    overview = (tmp_path / f"{name}-overview.svg").read_text()
    for text in coarse:
        assert text in sheet_text
        assert text.replace('"', "&quot;") in overview or text in overview


def assert_all_coarse(items, u) -> bool:
    """Rope lengths are printed to the inch or the cm (issue 18): whole inches, or 2 decimals of m."""
    for i in items:
        text = units.format_length(i.length_m, u, "coarse")
        assert "/" not in text and (u == "imperial" or text.endswith((" cm", " m")))
        assert i.coarse
    return True


def test_card_bytes_are_reproducible(tmp_path):
    design = str(ROOT / "designs" / "mill-lane-15m.yaml")
    for out in ("a", "b"):
        assert main(["build", design, "--card", "-o", str(tmp_path / out), "--date", DATE]) == 0
    assert (tmp_path / "a" / "mill-lane-15m-card.pdf").read_bytes() == \
        (tmp_path / "b" / "mill-lane-15m-card.pdf").read_bytes()
