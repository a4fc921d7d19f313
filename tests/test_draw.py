"""`buildsheet draw`: one SVG per figure, named <name>-<figure>.svg, in -o DIR or out/<name>/,
written all or nothing, the same bytes for the same input and date; bad input exits 2 with one line.

References: the SVG files are parsed with xml.etree (W3C SVG 1.1); the revision date rule is
DESIGN.md §4 (--date, else SOURCE_DATE_EPOCH, ...); exit codes are the CLI contract of DESIGN.md §6.
"""

from __future__ import annotations

import os
import pathlib
import xml.etree.ElementTree as ET

import pytest

from buildsheet.cli import main
from buildsheet.drawing.figures import FIGURES

ROOT = pathlib.Path(__file__).resolve().parent.parent
OAK = ROOT / "designs" / "oak-yard-20m.yaml"
RIDGE = ROOT / "designs" / "ridge-camp-10m.yaml"
SVG = "{http://www.w3.org/2000/svg}"


def texts_of(path: pathlib.Path) -> list[str]:
    return [el.text for el in ET.parse(path).getroot().iter(f"{SVG}text")]


def test_draw_writes_one_svg_per_figure_and_lists_them(tmp_path, capsys):
    assert main(["draw", str(OAK), "-o", str(tmp_path), "--date", "2024-05-01"]) == 0
    out = capsys.readouterr().out.splitlines()
    expected = [str(tmp_path / f"oak-yard-20m-{key}.svg") for key in FIGURES]
    assert out == expected
    assert sorted(os.listdir(tmp_path)) == sorted(pathlib.Path(p).name for p in expected)
    for path in map(pathlib.Path, expected):
        root = ET.parse(path).getroot()
        assert root.tag == f"{SVG}svg" and root.get("viewBox").startswith("0 0 ")
        assert "2024-05-01" in texts_of(path)


def test_draw_defaults_to_out_name(tmp_path, monkeypatch, capsys):
    monkeypatch.chdir(tmp_path)
    assert main(["draw", str(OAK), "--date", "2024-05-01"]) == 0
    assert capsys.readouterr().out.splitlines()[0] == os.path.join("out", "oak-yard-20m",
                                                                   "oak-yard-20m-overview.svg")
    assert len(list((tmp_path / "out" / "oak-yard-20m").glob("*.svg"))) == len(FIGURES)


def test_draw_is_deterministic(tmp_path):
    a, b = tmp_path / "a", tmp_path / "b"
    for d in (a, b):
        assert main(["draw", str(RIDGE), "-o", str(d), "--date", "2024-05-01"]) == 0
    for key in FIGURES:
        name = f"ridge-camp-10m-{key}.svg"
        assert (a / name).read_bytes() == (b / name).read_bytes(), name


def test_draw_units_override(tmp_path):
    assert main(["draw", str(OAK), "-o", str(tmp_path), "--date", "2024-05-01", "--units", "metric"]) == 0
    texts = texts_of(tmp_path / "oak-yard-20m-overview.svg")
    assert any(t.startswith("radiator ") and t.endswith(" m") for t in texts)
    assert not any("'" in t or '"' in t for t in texts)
    assert any("to the nearest mm" in t for t in texts)


def test_revision_date_from_source_date_epoch(tmp_path, monkeypatch):
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "1700000000")          # 2023-11-14 22:13:20 UTC
    assert main(["draw", str(OAK), "-o", str(tmp_path)]) == 0
    assert "2023-11-14" in texts_of(tmp_path / "oak-yard-20m-choke.svg")


@pytest.mark.parametrize("args, where", [
    (["--date", "2024-02-30"], "--date"),
    (["--units", "furlongs"], "--units"),
])
def test_bad_options_exit_2_with_one_line(tmp_path, capsys, args, where):
    assert main(["draw", str(OAK), "-o", str(tmp_path), *args]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and where in err
    assert not list(tmp_path.iterdir())


def test_missing_design_exits_2(tmp_path, capsys):
    assert main(["draw", str(tmp_path / "nope.yaml"), "-o", str(tmp_path)]) == 2
    assert "nope.yaml" in capsys.readouterr().err


def test_output_that_is_a_file_exits_2(tmp_path, capsys):
    target = tmp_path / "taken"
    target.write_text("not a folder")
    assert main(["draw", str(OAK), "-o", str(target)]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "taken" in err
    assert target.read_text() == "not a folder"


def test_a_failed_write_leaves_the_previous_files(tmp_path, capsys):
    assert main(["draw", str(OAK), "-o", str(tmp_path), "--date", "2024-05-01"]) == 0
    before = {p.name: p.read_bytes() for p in tmp_path.iterdir()}
    # the first figure's file name is taken by a folder: renaming onto it fails after every
    # temporary file is written and before any other file is replaced, so none may change
    first = tmp_path / f"oak-yard-20m-{FIGURES[0]}.svg"
    first.unlink()
    first.mkdir()
    (first / "keep").write_text("x")
    assert main(["draw", str(OAK), "-o", str(tmp_path), "--date", "2024-05-02"]) == 2
    assert capsys.readouterr().err.count("\n") == 1
    for name, data in before.items():
        if name != first.name:
            assert (tmp_path / name).read_bytes() == data, name
    assert not [p for p in tmp_path.iterdir() if p.name.endswith(".tmp")]
