"""buildsheet/compiled_templates/: the templates as jinja2 compiles them, stored so that a build does
not compile them. They must be what jinja2 makes of today's templates/ (else a template edit would
be ignored where the hash check were wrong), and a sheet made from them must be the sheet made by
compiling the sources (jinja2 itself is the reference: its own compiler on the same sources)."""

import filecmp
import pathlib

import jinja2
import pytest

from buildsheet import compiled_templates, load_design, sheet
from buildsheet.solver import solve

ROOT = pathlib.Path(__file__).resolve().parent.parent
STORED = ROOT / "buildsheet" / "compiled_templates"


def test_stored_modules_are_todays_templates(tmp_path):
    sheet.write_compiled_templates(tmp_path)
    names = sorted(p.name for p in tmp_path.iterdir() if p.suffix == ".py")
    assert names == sorted(p.name for p in STORED.glob("*.py"))
    for name in names:
        assert filecmp.cmp(tmp_path / name, STORED / name, shallow=False), (
            f"{name} is stale: run sheet.write_compiled_templates()")
    assert compiled_templates.JINJA2 == jinja2.__version__
    assert set(compiled_templates.SOURCES) == {p.name for p in (ROOT / "templates").glob("*.j2")}


@pytest.mark.parametrize("path", sorted((ROOT / "designs").glob("*.yaml")), ids=lambda p: p.stem)
def test_sheet_from_stored_templates_is_the_sheet_from_sources(monkeypatch, path):
    design = load_design(path)
    solution = solve(design)
    stored = sheet.build_sheet(design, solution, "2026-01-01")
    plain = jinja2.Environment(loader=jinja2.FunctionLoader(sheet._template_text), autoescape=True,
                               undefined=jinja2.StrictUndefined)
    monkeypatch.setattr(sheet, "_ENV", plain)
    assert sheet.build_sheet(design, solution, "2026-01-01") == stored


def test_an_edited_template_is_compiled_from_its_source(monkeypatch):
    original = sheet._template_text
    monkeypatch.setattr(sheet, "_template_text",
                        lambda name: original(name) + "\n\nedited after the store was written\n")
    env = jinja2.Environment(loader=sheet._Loader(), autoescape=True)    # its values left empty
    text = env.get_template("handout-safety.j2").render()
    assert "edited after the store was written" in text
