"""Design files: demo designs validate, the document ID follows DESIGN.md §4, defaults are listed in
the README, and every kind of mistake in tests/bad_designs/ gives exit 2 and one line naming the file,
the line and the key."""

from __future__ import annotations

import pathlib
import re

import pytest

from buildsheet.cli import main
from buildsheet.design import DEFAULTS, design_from_text, load_design

ROOT = pathlib.Path(__file__).resolve().parent.parent
DEMOS = sorted((ROOT / "designs").glob("*.yaml"))
BAD = sorted((ROOT / "tests" / "bad_designs").glob("*.yaml"))
OAK = (ROOT / "designs" / "oak-yard-20m.yaml").read_text()


def test_there_are_six_demo_designs_and_all_pass_check(capsys):
    assert len(DEMOS) >= 6
    assert main(["check", *map(str, DEMOS)]) == 0
    out = capsys.readouterr().out.splitlines()
    assert len(out) == len(DEMOS)
    assert all(re.search(r": OK [0-9A-F]{4}-[0-9A-F]{4} ", line) for line in out)


def test_demo_designs_cover_the_orientations_and_line_kinds():
    designs = [load_design(p) for p in DEMOS]
    assert {d.site.orientation for d in designs} >= {"horizontal", "sloper", "vertical"}
    assert {d.stub.kind for d in designs} >= {"nominal", "geometry"}
    assert {d.band_name for d in designs} >= {"20 m", "15 m", "10 m", "6 m", "2 m", "70 cm"}


def test_design_is_in_si_units():
    d = design_from_text(OAK)
    assert d.frequency_hz == pytest.approx(14.175e6)
    assert d.site.height_m == pytest.approx(10.0)
    assert d.feed.length_m == pytest.approx(20.0)
    # ASTM B258: d = 0.127 mm x 92^((36-n)/39); #14 = 1.6277 mm (CHECK_VALUES §2c)
    assert d.radiator.diameter_m == pytest.approx(1.6277e-3, rel=1e-4)
    assert d.band_hz == pytest.approx((14.0e6, 14.35e6))


# --- document ID (DESIGN.md §4) -----------------------------------------------------------------

def _id(text: str) -> str:
    return design_from_text(text).document_id


def test_id_ignores_comments_key_order_units_of_writing_title_output_and_record():
    reference = _id(OAK)
    reordered = OAK.replace("frequency: 14.175 MHz\nregion: 2\n", "region: 2\nfrequency: 14.175 MHz\n")
    assert reordered != OAK
    assert _id(reordered) == reference
    assert _id(OAK.replace("# Demo design", "# Another comment about the design")) == reference
    assert _id(OAK.replace("14.175 MHz", "14175 kHz")) == reference
    assert _id(OAK.replace("length: 20 m", "length: 2000 cm")) == reference
    assert _id(OAK.replace("title: 20 m end-fed between the oaks", "title: Something else")) == reference
    assert _id(OAK.replace("units: imperial", "units: metric")) == reference
    assert _id(OAK.replace("paper: letter", "paper: a4")) == reference
    with_record = OAK + "record:\n  - {date: 2026-05-01, swr: 1.2, note: first try}\n"
    assert _id(with_record) == reference
    # a default written out explicitly is the same antenna
    assert _id(OAK.replace("  insulation: bare\n", "")) == reference


@pytest.mark.parametrize("old, new", [
    ("14.175 MHz", "14.200 MHz"),
    ("wire: 14 AWG", "wire: 12 AWG"),
    ("material: copper", "material: aluminium"),
    ("insulation: bare", "insulation: pvc"),
    ("line: window-450", "line: twinlead-300"),
    ("coax: RG-8X", "coax: RG-213"),
    ("length: 20 m", "length: 21 m"),
    ("choke_form: 110 mm", "choke_form: 100 mm"),
    ("height: 10 m", "height: 11 m"),
    ("ground: average", "ground: poor"),
    ("transmitter: 100 W", "transmitter: 500 W"),
    ("mode: ssb", "mode: cw"),
    ("exposure_standard: us-fcc", "exposure_standard: icnirp-2020"),
])
def test_id_changes_with_anything_that_changes_the_antenna(old, new):
    assert old in OAK
    assert _id(OAK.replace(old, new)) != _id(OAK)


def test_id_changes_with_calibration():
    calibrated = OAK + "calibration: {radiator_scale: 1.01, source: sweep.s1p, date: 2026-05-02}\n"
    assert _id(calibrated) != _id(OAK)


# --- defaults ------------------------------------------------------------------------------------

def test_every_default_is_listed_in_the_readme():
    readme = (ROOT / "README.md").read_text()
    for key in DEFAULTS:
        assert f"`{key}`" in readme, f"README does not list the default of `{key}`"


def test_region_sets_units_paper_and_exposure_defaults():
    text = OAK.replace("region: 2", "region: 1").replace("output:\n  units: imperial\n  paper: letter\n", "")
    text = text.replace("  exposure_standard: us-fcc\n", "")
    d = design_from_text(text)
    assert (d.output.units, d.output.paper, d.power.exposure_standard) == ("metric", "a4", "icnirp-2020")


# --- bad input (tests/bad_designs) -----------------------------------------------------------------

def _expected_key(path: pathlib.Path) -> str | None:
    m = re.search(r"^# expect-key: (\S+)", path.read_text(), re.M)
    return None if m is None or m.group(1) == "-" else m.group(1)


def test_bad_design_catalogue_is_large_enough():
    assert len(BAD) >= 25


@pytest.mark.parametrize("path", BAD, ids=[p.stem for p in BAD])
def test_bad_design_gives_exit_2_and_one_line(path, capsys, tmp_path):
    before = sorted(tmp_path.iterdir())
    assert main(["check", str(path)]) == 2
    captured = capsys.readouterr()
    lines = captured.err.strip().splitlines()
    assert len(lines) == 1, captured.err
    line = lines[0]
    assert "Traceback" not in captured.err
    assert str(path) in line
    key = _expected_key(path)
    if key is not None:
        assert f"`{key}`" in line, line
    if path.read_text().strip():
        assert re.search(re.escape(str(path)) + r":\d+: ", line), f"no line number in: {line}"
    assert sorted(tmp_path.iterdir()) == before


def test_huge_file_is_refused(tmp_path, capsys):
    big = tmp_path / "huge.yaml"
    big.write_text(OAK + "# " + "x" * (1024 * 1024) + "\n")
    assert main(["check", str(big)]) == 2
    assert "larger than" in capsys.readouterr().err


def test_missing_file_is_one_line(capsys):
    assert main(["check", "no/such/design.yaml"]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert err == ["error: no/such/design.yaml: no such file"]


def test_did_you_mean_for_unknown_key(capsys):
    path = ROOT / "tests" / "bad_designs" / "unknown-key.yaml"
    main(["check", str(path)])
    assert "did you mean `site.height`?" in capsys.readouterr().err


def test_stub_reaching_ground_gives_the_numbers_and_the_fix(capsys):
    path = ROOT / "tests" / "bad_designs" / "stub-reaches-ground.yaml"
    main(["check", str(path)])
    err = capsys.readouterr().err
    assert "above ground" in err and "raise the open top to at least" in err


def test_usage_errors_exit_2_with_one_line(capsys):
    assert main(["frobnicate"]) == 2
    assert len(capsys.readouterr().err.strip().splitlines()) == 1
    assert main([]) == 2
