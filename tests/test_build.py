"""`buildsheet build`: the PDF build sheet and the SVG figures of a design, written atomically.

References: the PDF is read back with pypdf (text extraction; page boxes and font descriptors per
ISO 32000-1: MediaBox in points, an embedded TrueType font has a /FontFile2 stream); paper sizes are
ANSI/ASME Y14.1 Letter (8.5 x 11 in = 612 x 792 pt) and ISO 216 A4 (210 x 297 mm); every page is
rasterised by poppler's pdftoppm (an independent PDF renderer) where it is installed; the SVGs are
parsed with xml.etree (W3C SVG 1.1).
"""

from __future__ import annotations

import functools
import html
import io
import os
import pathlib
import re
import shutil
import subprocess
import sys
import xml.etree.ElementTree as ET

import pypdf
import pytest

from buildsheet import units
from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.drawing.figures import FIGURES
from buildsheet.sheet import Table, build_sheet
from buildsheet.solver import solve
from buildsheet.writers import files

ROOT = pathlib.Path(__file__).resolve().parent.parent
DEMOS = sorted((ROOT / "designs").glob("*.yaml"))
OAK = ROOT / "designs" / "oak-yard-20m.yaml"
DATE = "2025-03-01"
PT_PER_MM = 72 / 25.4
PAPER_PT = {"letter": (612.0, 792.0), "a4": (210 * PT_PER_MM, 297 * PT_PER_MM)}
CAUTION_HEADINGS = ("Overhead power lines", "Ladders, trees and climbing", "High RF voltage at the open ends",
                    "RF burns", "RF exposure", "Lightning, grounding and disconnecting",
                    "Weather and wind load", "Local codes and licensed practice come first")
STANDARD = {"us-fcc": "47 CFR 1.1310", "icnirp-2020": "ICNIRP 2020"}


def _plain(text: str) -> str:
    """Text as a reader sees it: non-breaking spaces and line breaks as single spaces."""
    return " ".join(text.replace("\u00a0", " ").split())


@functools.cache
def _built(design: pathlib.Path, paper: str | None, out: str) -> tuple[bytes, str]:
    """Build once per (design, paper) into `out`; returns the PDF bytes and stdout."""
    args = ["build", str(design), "-o", out, "--date", DATE] + (["--paper", paper] if paper else [])
    code = main(args)
    assert code == 0
    name = load_design(design).name
    return (pathlib.Path(out) / f"{name}.pdf").read_bytes(), name


@pytest.fixture(scope="module")
def outdir(tmp_path_factory) -> pathlib.Path:
    return tmp_path_factory.mktemp("build")


def build(outdir, design, paper=None) -> bytes:
    return _built(design, paper, str(outdir / f"{design.stem}-{paper}"))[0]


def pages_text(pdf: bytes) -> list[str]:
    return [_plain(p.extract_text()) for p in pypdf.PdfReader(io.BytesIO(pdf)).pages]


@pytest.mark.parametrize("design", DEMOS, ids=[p.stem for p in DEMOS])
def test_sheet_text_carries_the_numbers_of_the_solution(outdir, design):
    pdf = build(outdir, design)
    d = load_design(design)
    s = solve(d)
    u = d.output.units
    pages = pages_text(pdf)
    text = " ".join(pages)
    dims = s.dimensions
    for m in (dims.radiator, dims.stub, dims.tap):
        assert units.format_length(m, u) in text
    assert units.format_length(dims.spacing, u, "size") in text
    for item in s.cut_list:      # coax and rope to the inch or the cm (issue 18)
        assert units.format_length(item.length_m, u, "coarse" if item.coarse else "fine") in text, item.part
    for page in pages:                                     # the title block on every page
        assert s.design_id in page and f"revised {DATE}" in page
    assert all(f"page {i} of {len(pages)}" in page for i, page in enumerate(pages, 1))
    for heading in CAUTION_HEADINGS:
        assert heading in text
    assert STANDARD[d.power.exposure_standard] in text
    assert units.format_distance(s.exposure.distance_general_m, u) in text
    # the tuning table: the sheet's rows, each one in the PDF as written
    sheet = build_sheet(d, s, DATE)
    table = next(b for b in sheet.section("tuning").blocks if isinstance(b, Table) and b.header[0] == "you measure")
    for measured, action in table.rows:
        assert _plain(html.unescape(measured)) in text and _plain(html.unescape(action)) in text
    # ... and its numbers are the Solution's sensitivities (DESIGN.md §5 signs)
    df = units.parse_quantity(re.search(r"lowest SWR (\S+ \S?Hz) below", text).group(1), "frequency")
    move = units.format_length(abs(df / s.sensitivity["dip_hz_per_m_radiator"]), u)
    verb = "shorten" if s.sensitivity["dip_hz_per_m_radiator"] < 0 else "lengthen"
    if s.parts.construction == "tube":      # a pipe or rod's radiator is the long element's top
        what = ("trim the long element's top" if verb == "shorten" else
                "lengthen the long element's top (a sliding sleeve)")
        assert f"{what} by {move}" in text
    else:
        assert f"{verb} {'the radiator' if s.stack is None else 'both elements'} by {move}" in text
    dr = float(re.search(r"R (\d+) Ω above", text).group(1))
    tap = units.format_length(dr / abs(s.sensitivity["ohm_per_m_tap"]), u)
    way = "down" if s.sensitivity["ohm_per_m_tap"] > 0 else "up"
    assert f"move the tap {way} by {tap}" in text


@pytest.mark.parametrize("paper", ["letter", "a4"])
def test_page_size_follows_the_paper_option_and_fonts_are_embedded(outdir, paper):
    pdf = build(outdir, OAK, paper)
    reader = pypdf.PdfReader(io.BytesIO(pdf))
    for page in reader.pages:
        box = page.mediabox
        assert (float(box.width), float(box.height)) == pytest.approx(PAPER_PT[paper], abs=0.5)
        for font in page["/Resources"]["/Font"].values():
            font = font.get_object()
            descendant = font["/DescendantFonts"][0].get_object() if "/DescendantFonts" in font else font
            descriptor = descendant["/FontDescriptor"].get_object()
            assert "/FontFile2" in descriptor, font["/BaseFont"]          # embedded TrueType
            assert "Vera" in str(font["/BaseFont"])


@pytest.mark.skipif(shutil.which("pdftoppm") is None, reason="poppler's pdftoppm is not installed")
@pytest.mark.parametrize("design, paper", [(d, None) for d in DEMOS] + [(OAK, "a4")],
                         ids=[d.stem for d in DEMOS] + ["oak-yard-20m-a4"])
def test_every_page_renders_with_poppler(outdir, tmp_path, design, paper):
    pdf = build(outdir, design, paper)
    source = tmp_path / "sheet.pdf"
    source.write_bytes(pdf)
    done = subprocess.run(["pdftoppm", "-r", "20", "-png", str(source), str(tmp_path / "page")],
                          capture_output=True, text=True, timeout=120)
    assert done.returncode == 0 and not done.stderr.strip(), done.stderr
    pages = len(pypdf.PdfReader(io.BytesIO(pdf)).pages)
    assert len(list(tmp_path.glob("page-*.png"))) == pages


def test_svg_figures_are_written_beside_the_pdf(outdir):
    build(outdir, OAK)
    folder = outdir / "oak-yard-20m-None"
    svgs = sorted(folder.glob("*.svg"))
    assert [p.name for p in svgs] == sorted(f"oak-yard-20m-{key}.svg" for key in FIGURES)
    for path in svgs:
        assert ET.parse(path).getroot().tag == "{http://www.w3.org/2000/svg}svg"


def test_same_input_and_date_give_identical_bytes(tmp_path):
    first = build(tmp_path, OAK)
    info = pypdf.PdfReader(io.BytesIO(first)).metadata
    assert info["/CreationDate"].startswith("D:20250301")          # dated by the revision date
    assert main(["build", str(OAK), "-o", str(tmp_path / "again"), "--date", DATE]) == 0
    assert (tmp_path / "again" / "oak-yard-20m.pdf").read_bytes() == first
    # another process, dated through SOURCE_DATE_EPOCH (2025-03-01 00:00 UTC)
    env = {**os.environ, "SOURCE_DATE_EPOCH": "1740787200", "PYTHONPATH": str(ROOT)}
    done = subprocess.run([sys.executable, "-m", "buildsheet", "build", str(OAK), "-o",
                           str(tmp_path / "proc")], capture_output=True, text=True, env=env, timeout=300)
    assert done.returncode == 0, done.stderr
    assert (tmp_path / "proc" / "oak-yard-20m.pdf").read_bytes() == first
    for key in FIGURES:
        name = f"oak-yard-20m-{key}.svg"
        assert (tmp_path / "proc" / name).read_bytes() == (tmp_path / "again" / name).read_bytes()


def test_a_changed_design_prints_a_different_document_id(tmp_path):
    changed = tmp_path / "oak-yard-20m.yaml"
    changed.write_text(OAK.read_text().replace("frequency: 14.175 MHz", "frequency: 14.200 MHz"))
    assert main(["build", str(changed), "-o", str(tmp_path / "out"), "--date", DATE]) == 0
    text = " ".join(pages_text((tmp_path / "out" / "oak-yard-20m.pdf").read_bytes()))
    old, new = load_design(OAK).document_id, load_design(changed).document_id
    assert old != new and new in text and old not in text


def test_default_folder_is_out_name(tmp_path, monkeypatch, capsys):
    monkeypatch.chdir(tmp_path)
    assert main(["build", str(OAK), "--date", DATE, "--units", "metric"]) == 0
    pdf = (tmp_path / "out" / "oak-yard-20m" / "oak-yard-20m.pdf").read_bytes()
    d = load_design(OAK)
    assert units.format_length(solve(d).dimensions.radiator, "metric") in " ".join(pages_text(pdf))
    assert "oak-yard-20m.pdf" in capsys.readouterr().out


@pytest.mark.parametrize("args, key", [
    (["tests/bad_designs/unknown-key.yaml"], None),
    (["designs/oak-yard-20m.yaml", "--date", "2025-13-45"], "--date"),
    (["designs/oak-yard-20m.yaml", "--paper", "a3"], None),
    (["tests/bad_designs/stub-reaches-ground.yaml"], "site.height"),
])
def test_bad_input_exits_2_and_writes_nothing(tmp_path, capsys, args, key):
    out = tmp_path / "out"
    code = main(["build", *[str(ROOT / a) if a.endswith(".yaml") else a for a in args], "-o", str(out)])
    err = capsys.readouterr().err
    assert code == 2 and len(err.strip().splitlines()) == 1
    assert key is None or key in err
    assert not out.exists()


def test_a_title_the_font_cannot_print_is_bad_input(tmp_path, capsys):
    bad = tmp_path / "greek.yaml"
    bad.write_text(OAK.read_text().replace("title: 20 m end-fed between the oaks", "title: 20 m \u03bb/2"))
    assert main(["build", str(bad), "-o", str(tmp_path / "out")]) == 2
    assert "`title`" in capsys.readouterr().err
    assert not (tmp_path / "out").exists()


def test_design_strings_print_literally(tmp_path):
    nasty = "{{ 7*7 }} <b>Tom & Jerry's</b>"
    design = tmp_path / "oak-yard-20m.yaml"
    design.write_text(OAK.read_text().replace("title: 20 m end-fed between the oaks", f'title: "{nasty}"')
                      .replace("output:", f'record:\n  - {{date: 2025-04-02, note: "{nasty}"}}\noutput:'))
    assert main(["build", str(design), "-o", str(tmp_path / "out"), "--date", DATE]) == 0
    pages = pages_text((tmp_path / "out" / "oak-yard-20m.pdf").read_bytes())
    assert all(nasty in page for page in pages)               # the title block
    assert pages[-1].count(nasty) == 2                        # ... and the as-built note


def test_an_interrupted_build_leaves_the_previous_files(tmp_path, monkeypatch, capsys):
    out = tmp_path / "out"
    assert main(["build", str(OAK), "-o", str(out), "--date", DATE]) == 0
    before = {p.name: p.read_bytes() for p in out.iterdir()}
    failing = functools.partial(files.write_many_atomic, _fail_at=("fsync", len(before) - 1))
    monkeypatch.setattr(files, "write_many_atomic", failing)
    assert main(["build", str(OAK), "-o", str(out), "--date", "2025-04-01"]) == 2
    assert "cannot write" in capsys.readouterr().err
    assert {p.name: p.read_bytes() for p in out.iterdir()} == before   # no temporary file left either
