"""The quick start (`buildsheet start`), the catalogue listing (`buildsheet catalogue`) and the
catalogue's new lines and coax checked against the textbook line formulas (issue 18)."""

import math
import os

import pytest
import yaml
from pypdf import PdfReader

from buildsheet.catalog import catalog
from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.starter import slug

BUILD_DATE = ["--date", "2026-05-01"]


def test_start_writes_a_design_that_check_accepts_and_build_builds(tmp_path, capsys):
    path = tmp_path / "Back Fence 40m.yaml"
    assert main(["start", str(path), "--band", "40 m", "--line", "window-450-14", "--coax", "foam-400",
                 "--orientation", "sloper", "--height", "20 m", "--units", "metric"]) == 0
    text = path.read_text()
    assert text.startswith("# back-fence-40m: written by `buildsheet start`")
    assert "# " in text.splitlines()[6]                     # keys carry comments
    raw = yaml.safe_load(text)
    assert raw["stub"]["line"] == "window-450-14" and raw["feed"]["coax"] == "foam-400"
    assert raw["site"] == {"orientation": "sloper", "height": "20 m", "slope": "30 deg", "ground": "average"}
    # the middle of the 40 m band of region 2 (7000-7300 kHz, catalogue)
    assert load_design(path).frequency_hz == pytest.approx(7.150e6)
    capsys.readouterr()
    assert main(["check", str(path)]) == 0
    out = tmp_path / "out"
    assert main(["build", str(path), "-o", str(out), *BUILD_DATE]) == 0
    assert len(PdfReader(out / "back-fence-40m.pdf").pages) >= 5


@pytest.mark.parametrize("band, orientation", [("2 m", None), ("80m", None), ("70cm", "vertical"),
                                                ("10 m", "horizontal")])
def test_defaults_check_at_once(tmp_path, band, orientation, capsys):
    path = tmp_path / "x.yaml"
    args = ["start", str(path), "--band", band] + (["--orientation", orientation] if orientation else [])
    assert main(args) == 0
    assert main(["check", str(path)]) == 0


def test_frequency_instead_of_a_band(tmp_path):
    path = tmp_path / "f.yaml"
    assert main(["start", str(path), "--frequency", "14.060 MHz"]) == 0
    assert load_design(path).frequency_hz == pytest.approx(14.06e6)


def test_never_overwrites(tmp_path, capsys):
    path = tmp_path / "mine.yaml"
    path.write_text("my own design\n")
    assert main(["start", str(path), "--band", "20 m"]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "already exists" in err and str(path) in err
    assert path.read_text() == "my own design\n"


@pytest.mark.parametrize("args, key", [
    (["--band", "19 m"], "--band"),
    (["--band", "20 m", "--line", "window-451"], "--line"),
    (["--band", "20 m", "--height", "10"], "--height"),
    ([], None),
])
def test_bad_answers_write_nothing(tmp_path, capsys, args, key):
    path = tmp_path / "bad.yaml"
    assert main(["start", str(path), *args]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "Traceback" not in err
    if key:
        assert key in err
    assert os.listdir(tmp_path) == []


def test_answers_the_design_refuses_leave_no_file(tmp_path, capsys):
    # an 80 m horizontal hung 3 m up: the stub's bottom would be below ground (DESIGN.md §4)
    path = tmp_path / "low.yaml"
    assert main(["start", str(path), "--band", "80 m", "--height", "3 m"]) == 2
    err = capsys.readouterr().err
    assert "do not make a valid design" in err and err.count("\n") == 1
    assert os.listdir(tmp_path) == []


def test_slug():
    assert slug("designs/Oak Yard 20m.yaml") == "oak-yard-20m"


def test_catalogue_lists_every_entry_with_its_source(capsys):
    assert main(["catalogue"]) == 0
    out = capsys.readouterr().out
    c = catalog()
    for names in (c.names("coax"), c.names("stub_line"), c.names("material"), c.names("ground")):
        for name in names:
            assert f"  {name} " in out, name
    assert out.count("source:") >= len(c.names("coax")) + len(c.names("stub_line")) + len(c.stock)
    for band in c.bands(2):
        assert band.name in out
    assert "bands of ITU region 2" in out


def test_catalogue_sections_and_region(capsys):
    assert main(["catalogue", "bands", "--region", "1"]) == 0
    out = capsys.readouterr().out
    assert out.startswith("bands of ITU region 1") and "1.25 m" not in out   # region 2 only
    assert main(["catalogue", "rockets"]) == 2


def test_catalogue_holds_the_lines_and_coax_builders_ask_for():
    c = catalog()
    # issue 18: LMR-400-class foam coax, RG-6 (75 ohm), RG-58, RG-213; 300 and 450 ohm window line
    # of two makes each; 300 ohm twin-lead
    assert c.coax("foam-400").z0_ohm == 50 and c.coax("foam-400").velocity_factor > 0.8
    assert c.coax("RG-6").z0_ohm == 75
    assert {"RG-58", "RG-213"} <= set(c.names("coax"))
    assert [n for n in c.names("stub_line") if n.startswith("window-450")] == ["window-450", "window-450-14"]
    assert [n for n in c.names("stub_line") if n.startswith("window-300")] == ["window-300-18", "window-300-20"]
    assert c.stub_line("twinlead-300").z0_ohm == 300
    for name in (*c.names("coax"), *c.names("stub_line")):
        entry = c.coax(name) if name in c.names("coax") else c.stub_line(name)
        assert entry.source.strip()


#: conductors made of 7 strands: the coaxial formula sees a smaller round conductor. The
#: equivalent diameter of a 7-strand conductor is about 0.94 of its overall diameter (from memory)
SEVEN_STRAND = 0.94


@pytest.mark.parametrize("name", [n for n in catalog().names("coax")
                                  if catalog().coax(n).inner_diameter_m is not None])
def test_coax_z0_from_its_construction(name):
    # Z0 = 60/sqrt(eps_r) ln(D/d) (any transmission-line textbook, e.g. Pozar, Microwave Engineering,
    # table 2.1), with eps_r = 1/VF^2. The dimensions are typical constructions from memory, so
    # within 4 %: a 0.1 mm error in a 0.8 mm centre is 3 % of Z0.
    x = catalog().coax(name)
    d = x.inner_diameter_m * (SEVEN_STRAND if name == "RG-213" else 1.0)
    z0 = 60.0 * x.velocity_factor * math.log(x.dielectric_diameter_m / d)
    assert z0 == pytest.approx(x.z0_ohm, rel=0.04)


@pytest.mark.parametrize("name", [n for n in catalog().names("stub_line")
                                  if catalog().stub_line(n).kind == "nominal"])
def test_two_wire_line_z0_from_its_geometry(name):
    # Z0 = (120/sqrt(eps_eff)) acosh(s/d), VF = 1/sqrt(eps_eff) (DESIGN.md §7; quasi-TEM), so
    # Z0 = 120 VF acosh(s/d). Spacings are "about" figures from memory: +-1 mm of 9-25 mm moves Z0
    # by 3-5 %, so within 6 %.
    line = catalog().stub_line(name)
    z0 = 120.0 * line.velocity_factor * math.acosh(line.spacing_m / line.conductor_diameter_m)
    assert z0 == pytest.approx(line.z0_ohm, rel=0.06)


def test_stock_sizes():
    c = catalog()
    # ASTM B88: 3/4 in nominal copper water tube is 7/8 in outside (nominal + 1/8 in), from memory
    assert c.stock_size(0.875 * 0.0254, "imperial", "copper").name == "3/4 in copper pipe"
    assert c.stock_size(0.0222, "imperial", "copper").name == "3/4 in copper pipe"
    assert c.stock_size(0.004, "metric", "copper").name == "4 mm rod"
    assert c.stock_size(0.004, "imperial", "copper") is None   # 4 mm is 0.157 in: between 1/8 and 3/16
    assert c.stock_size(0.0159, "imperial", "aluminium").name == "5/8 in aluminium tube"
    assert c.stock_size(0.0159, "metric", "copper") is None     # no 16 mm copper tube (EN 1057)
    assert c.stock_size(0.0222, "imperial", "bronze") is None
    for s in c.stock:
        assert s.source.strip() and s.system in ("imperial", "metric") and s.kind in ("tube", "rod")


def test_on_a_terminal_it_asks_for_what_the_options_leave_out(tmp_path, monkeypatch, capsys):
    import io
    import sys

    class Terminal(io.StringIO):
        def isatty(self):
            return True

    replies = iter(["", "18.1 MHz", "twinlead-300", "", "sloper", "12 m", "metric"])
    asked: list[str] = []
    monkeypatch.setattr(sys, "stdin", Terminal())
    monkeypatch.setattr(sys, "stdout", Terminal())
    monkeypatch.setattr("builtins.input", lambda question: asked.append(question) or next(replies))
    path = tmp_path / "asked.yaml"
    assert main(["start", str(path)]) == 0
    assert len(asked) == 7 and asked[0].startswith("band") and "window-450" in asked[2]
    d = load_design(path)
    assert d.frequency_hz == pytest.approx(18.1e6) and d.stub.name == "twinlead-300"
    assert d.feed.coax == "RG-8X"                       # the empty reply takes the default
    assert d.site.orientation == "sloper" and d.site.height_m == pytest.approx(12.0)
    assert d.output.units == "metric"


@pytest.mark.parametrize("diameter, system, material, text", [
    # issue 18: "4 mm rod becomes 1/8"": a size is printed as it is sold, in the sheet's system
    # where it is sold in it, else by its own system's name with the sheet's figure
    (0.004, "imperial", "copper", '4 mm rod (0.157")'),
    (0.004, "metric", "aluminium", "4 mm rod"),
    (0.0159, "imperial", "copper", '1/2 in copper pipe (5/8" OD)'),
    (0.0159, "metric", "copper", "1/2 in copper pipe (15.9 mm)"),
    (0.0222, "metric", "copper", "22 mm copper tube (22.2 mm OD)"),
    (0.0035, "imperial", "copper", '0.138" dia.'),
])
def test_conductor_named_by_stock_size(diameter, system, material, text):
    from buildsheet.stock import conductor_size
    assert conductor_size(diameter, system, material) == text
