"""The built sheet reads consistently: its cautions agree with the figures printed on the same sheet.

The PDF is read back with pypdf (text extraction), as a builder would read it, and checked for the
contradictions issue 17 found: doubled units ("100 W PEP PEP"), HF near-field wording on VHF/UHF
sheets or a near-field claim the printed distances contradict, "1 turns", a coil's form and cable
ties listed for a coil that is not built, a choke warning that names a figure above its own target,
and a lowest live point within reach (2.5 m, IEC 60364-4-41 arm's reach, from memory) or an exposure
distance reaching a standing person (2 m, common practice) with no warning.
"""

from __future__ import annotations

import functools
import io
import pathlib
import re

import pypdf
import pytest

from buildsheet import units
from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.ratings import PERSON_M, REACH_M, lowest_live_point
from buildsheet.solver import solve

ROOT = pathlib.Path(__file__).resolve().parent.parent
DESIGNS = sorted((ROOT / "designs").glob("*.yaml")) + sorted((ROOT / "tests/data/ratings").glob("*.yaml"))
DATE = "2026-12-01"


@functools.cache
def _sheet(path: str, out: str) -> str:
    assert main(["build", path, "-o", out, "--date", DATE]) == 0
    name = load_design(path).name
    pdf = (pathlib.Path(out) / f"{name}.pdf").read_bytes()
    pages = pypdf.PdfReader(io.BytesIO(pdf)).pages
    return " ".join(" ".join(p.extract_text().replace("\u00a0", " ").split()) for p in pages)


@pytest.fixture(scope="module")
def outdir(tmp_path_factory):
    return tmp_path_factory.mktemp("consistency")


@pytest.mark.parametrize("path", DESIGNS, ids=[p.stem for p in DESIGNS])
def test_sheet_has_no_contradiction(outdir, path):
    text = _sheet(str(path), str(outdir / path.stem))
    design = load_design(path)
    s = solve(design)
    u = design.output.units

    # doubled units and plurals of one
    assert "PEP PEP" not in text
    assert not re.search(r"\b1 turns\b", text)

    # near-field wording by band and by the printed figures
    near = units.format_distance(s.exposure.near_field_m, u)
    if design.band_hz[0] > 30e6:
        assert "at HF" not in text
    inside = s.exposure.distance_general_m < s.exposure.near_field_m
    assert ("inside the antenna's reactive near field" in text) is inside
    assert ("beyond the antenna's reactive near field" in text) is (not inside)
    assert near in text

    # the choke the sheet describes is the one it lists
    if s.sleeve is not None:
        assert "choke form" not in text and "cable ties" not in text
        assert "choke sleeve" in text and "quarter-wave sleeve" in text
        assert "Choke warning" not in text
    for m in re.finditer(r"cannot reach (\d+) ohm[^.]*?giving (\d+) ohm", text):
        assert int(m[2]) < int(m[1]), m[0]

    # the cautions' figures against the warnings on the same sheet
    low, _ = lowest_live_point(design, s)
    if design.site.orientation != "vertical":
        assert units.format_length(low, u) in text
    assert ("Lowest live point." in text) is (low < REACH_M)
    assert f"keep people {units.format_distance(s.exposure.distance_general_m, u)} away" in text
    assert ("RF exposure." in text) is (low - PERSON_M < s.exposure.distance_general_m)
    for finding in s.findings:
        assert finding.part[:1].upper() + finding.part[1:] + "." in text
