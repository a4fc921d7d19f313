"""The sheet's content (buildsheet/sheet.py): sections in the order of DESIGN.md §8, numbers formatted
from the Solution, the tuning moves checked against the model itself, design strings escaped and
never read as template source, templates strict.

References: the order and contents of a build sheet are DESIGN.md §8; the signs of the moves are
DESIGN.md §5 (positive = toward the open top); the tuning moves are checked by making the move in the
model (a finite step of buildsheet.physics.jpole, not the derivative the sheet used); the exposure
standards' names are those of the documents themselves ("47 CFR 1.1310", "ICNIRP 2020").
"""

from __future__ import annotations

import dataclasses
import html
import pathlib
import re

import jinja2
import numpy as np
import pytest

from buildsheet import units
from buildsheet.design import design_from_text, load_design
from buildsheet.physics import jpole
from buildsheet.sheet import (Facts, Figures, Heading, KeyFigures, Para, Steps, Table, WriteIn, build_sheet,
                              render_blocks)
from buildsheet.solver import solve, solved_antenna

ROOT = pathlib.Path(__file__).resolve().parent.parent
DEMOS = sorted((ROOT / "designs").glob("*.yaml"))
OAK = (ROOT / "designs" / "oak-yard-20m.yaml").read_text()
DATE = "2025-03-01"

#: DESIGN.md §8, in order
ORDER = ("summary", "overview", "cut-list", "details", "performance", "tuning", "log", "cautions",
         "as-built")
#: the caution topics DESIGN.md §8 and the issue ask for, each as words its heading must contain
CAUTION_TOPICS = (("power lines",), ("ladders", "climbing"), ("rf voltage",), ("rf burns",),
                  ("rf exposure",), ("lightning", "grounding", "disconnecting"), ("weather", "wind"),
                  ("local codes", "licensed practice"))


@pytest.fixture(scope="module")
def solved():
    return {p.stem: (d := load_design(p), solve(d)) for p in DEMOS}


def texts(blocks) -> list[str]:
    """Every string of the blocks, unescaped."""
    out = []
    for b in blocks:
        if isinstance(b, (Heading, Para)):
            out.append(b.text)
        elif isinstance(b, KeyFigures):
            out += [x for f in b.figures for x in (f.label, f.value, f.meaning)]
        elif isinstance(b, Facts):
            out += [x for row in b.rows for x in row]
        elif isinstance(b, Table):
            out += list(b.header) + [x for row in b.rows for x in row]
        elif isinstance(b, Steps):
            out += list(b.items)
    return [plain(t) for t in out]


def plain(markup: str) -> str:
    """Paragraph markup as the text it prints, non-breaking spaces as spaces."""
    return html.unescape(re.sub(r"<[^>]+>", "", markup)).replace("\u00a0", " ")


def tuning_rows(sheet) -> dict[str, str]:
    table = next(b for b in sheet.section("tuning").blocks
                 if isinstance(b, Table) and b.header == ("you measure", "do this"))
    return {plain(a): plain(b) for a, b in table.rows}


def test_sections_follow_design_md_8(solved):
    d, s = solved["oak-yard-20m"]
    sheet = build_sheet(d, s, DATE)
    assert tuple(sec.key for sec in sheet.sections) == ORDER
    assert sheet.section("overview").blocks == (Figures(("overview",)),)
    details = [b for b in sheet.section("details").blocks if isinstance(b, Figures)]
    assert [k for b in details for k in b.keys] == ["radiator", "stub", "short-tap", "choke"]
    perf = [k for b in sheet.section("performance").blocks if isinstance(b, Figures) for k in b.keys]
    assert perf == ["swr", "smith", "pattern"]
    log = [b for b in sheet.section("log").blocks if isinstance(b, WriteIn)]
    assert log and log[0].min_rows >= 10
    assert [h.lower() for h in log[0].header] == ["#", "frequency", "swr", "r (ω)", "x (ω)",
                                                   "what was changed"]


@pytest.mark.parametrize("name", [p.stem for p in DEMOS])
def test_key_dimensions_and_cut_list_are_the_solution_formatted(solved, name):
    d, s = solved[name]
    sheet = build_sheet(d, s, DATE)
    key = next(b for b in sheet.section("summary").blocks if isinstance(b, KeyFigures))
    u = d.output.units
    dims = s.dimensions
    stacked = [] if s.stack is None else [("element", units.format_length(s.stack.element_m, u)),
                                          ("phasing stub", units.format_length(s.stack.phasing_m, u))]
    assert [(f.label, plain(f.value)) for f in key.figures] == [
        ("radiator", units.format_length(dims.radiator, u)), ("stub", units.format_length(dims.stub, u)),
        ("tap", units.format_length(dims.tap, u)), ("spacing", units.format_length(dims.spacing, u, "size")),
        *stacked]
    cut = next(b for b in sheet.section("cut-list").blocks if isinstance(b, Table))
    assert cut.boxes == tuple(i.quantity for i in s.cut_list)      # one drawn box per piece
    # coax and rope to the inch or cm, the rest to 1/8 in or 1 mm (issue 18)
    assert [plain(r[2]) for r in cut.rows] == [
        units.format_length(i.length_m, u, "coarse" if i.part == "feed coax" or "rope" in i.part else "fine")
        for i in s.cut_list]
    summary = " ".join(texts(sheet.section("summary").blocks))
    assert units.format_frequency(s.frequency_hz) in summary
    assert units.format_frequency(s.band_hz[0]) in summary and units.format_frequency(s.band_hz[1]) in summary
    if s.band_swr2_hz:
        assert all(units.format_frequency(f) in summary for f in s.band_swr2_hz)


def _dip(ant, L, S, T, f0, z_feed):
    """The model's SWR dip near f0 (Hz): the least |rho|^2 of a fine sweep, refined by bounded search."""
    from scipy.optimize import minimize_scalar
    rho2 = lambda f: float(np.abs((lambda z: (z - z_feed) / (z + z_feed))(
        jpole.feed_impedance(np.atleast_1d(f), ant, L, S, T)))[0] ** 2)
    f = f0 * np.linspace(0.95, 1.05, 1001)
    i = int(np.argmin([rho2(x) for x in f]))
    return minimize_scalar(rho2, bounds=(f[max(i - 1, 0)], f[min(i + 1, 1000)]), method="bounded",
                           options={"xatol": 1e-3 * (f[1] - f[0])}).x


@pytest.mark.parametrize("name", [p.stem for p in DEMOS])
def test_tuning_moves_do_what_they_say_in_the_model(solved, name):
    """Each row of the tuning table, parsed back from its text, is made in the model (a finite move,
    not the derivative): the reading must change by the stated error, in the stated direction, to
    within the rounding of the move (1/8 in or 1 mm) and the model's curvature (25 %)."""
    d, s = solved[name]
    rows = tuning_rows(build_sheet(d, s, DATE))
    ant = solved_antenna(d)
    dims = s.dimensions
    # a stacked antenna's radiator move is made on both elements (the sheet says "both elements")
    with_radiator = (lambda L: ant) if ant.stack is None else (lambda L: dataclasses.replace(
        ant, stack=dataclasses.replace(ant.stack, element=L)))
    f0 = s.frequency_hz
    u = d.output.units
    rounding = 0.0254 / 16 if u == "imperial" else 0.0005       # half of 1/8 in; half a mm

    def move(text: str) -> float:
        return units.parse_quantity(re.search(r"by (.+?)(,|$)", text).group(1), "length")

    def within(actual, expected, delta_m, per_m):
        slack = abs(per_m) * rounding + 0.25 * abs(expected)
        assert actual == pytest.approx(expected, abs=slack), (actual, expected, delta_m)

    (low_key, low), = [(k, v) for k, v in rows.items() if k.startswith("lowest SWR") and " below " in k]
    df = units.parse_quantity(re.search(r"lowest SWR (.+?) below", low_key).group(1), "frequency")
    dl = move(low) * (-1 if low.startswith(("shorten", "trim")) else 1)
    zf = d.feed.impedance_ohm
    dip0 = _dip(ant, dims.radiator, dims.stub, dims.tap, f0, zf)
    shift = _dip(with_radiator(dims.radiator + dl), dims.radiator + dl, dims.stub, dims.tap, f0, zf) - dip0
    within(shift, df, dl, s.sensitivity["dip_hz_per_m_radiator"])
    # the same dip error by the short, where the sheet offers it: "or move the short up/down by ..."
    alt = re.search(r"or move the short \w+ by (.+?)$", low)
    if alt:
        ds = units.parse_quantity(alt.group(1), "length") * (1 if "short up" in low else -1)
        shift = _dip(ant, dims.radiator, dims.stub - ds, dims.tap - ds, f0, zf) - dip0
        within(shift, df, ds, s.sensitivity["dip_hz_per_m_short"])

    (r_key, r_row), = [(k, v) for k, v in rows.items() if k.startswith("R ") and " above " in k]
    dr = units.parse_quantity(r_key.split()[1] + " ohm", "impedance")
    dt = move(r_row) * (1 if "tap up" in r_row else -1)
    z = lambda L, S, T: complex(jpole.feed_impedance(np.array([f0]), ant, L, S, T)[0])
    z_now = z(dims.radiator, dims.stub, dims.tap)
    within(z(dims.radiator, dims.stub, dims.tap + dt).real - z_now.real, -dr, dt,
           s.sensitivity["ohm_per_m_tap"])

    if s.parts.construction == "tube":
        # the short is soldered or bolted on a pipe or rod build: no row moves it
        assert not any("short" in v for v in rows.values()), rows
        return
    (x_key, x_row), = [(k, v) for k, v in rows.items() if k.startswith("X = +")]
    dx = units.parse_quantity(x_key.split("+")[1].split(" at ")[0], "impedance")
    ds = move(x_row) * (1 if "short up" in x_row else -1)
    # the short moved up by ds with the tap clamps left in place: stub and tap distance both shorten
    changed = z(dims.radiator, dims.stub - ds, dims.tap - ds)
    within(changed.imag - z_now.imag, -dx, ds, s.sensitivity["ohm_per_m_short"])


def test_tuning_rows_are_the_sensitivities_formatted(solved):
    """The moves are the Solution's sensitivities divided into the stated errors, formatted."""
    d, s = solved["oak-yard-20m"]
    rows = tuning_rows(build_sheet(d, s, DATE))
    sens = s.sensitivity
    for key, row in rows.items():
        if key.startswith("lowest SWR"):
            df = units.parse_quantity(key.split()[2] + " " + key.split()[3], "frequency")
            expected = units.format_length(abs(df / sens["dip_hz_per_m_radiator"]), "imperial")
            also = units.format_length(abs(df / sens["dip_hz_per_m_short"]), "imperial")
            assert row.endswith(f"by {also}") or "move the short" not in row, (key, row, also)
        elif key.startswith("R "):
            expected = units.format_length(abs(float(key.split()[1]) / sens["ohm_per_m_tap"]), "imperial")
        else:
            dx = float(re.search(r"X = [+-](\d+(?:\.\d+)?)", key).group(1))
            expected = units.format_length(abs(dx / sens["ohm_per_m_short"]), "imperial")
        assert f"by {expected}" in row, (key, row, expected)


def test_exposure_names_the_standard_and_the_near_field(solved):
    for name, standard in (("oak-yard-20m", "47 CFR 1.1310"), ("tower-70cm", "ICNIRP 2020")):
        d, s = solved[name]
        text = " ".join(texts(build_sheet(d, s, DATE).section("performance").blocks))
        assert standard in text
        assert "screening estimate" in text and "regulator" in text
        assert units.format_distance(s.exposure.distance_general_m, d.output.units) in text
    d, s = solved["oak-yard-20m"]
    assert s.exposure.distance_general_m < s.exposure.near_field_m     # HF: inside λ/2π
    text = " ".join(texts(build_sheet(d, s, DATE).section("performance").blocks))
    assert "reactive near field" in text


def test_cautions_cover_every_topic_with_this_designs_figures(solved):
    d, s = solved["oak-yard-20m"]
    blocks = build_sheet(d, s, DATE).section("cautions").blocks
    headings = [html.unescape(b.text).lower() for b in blocks if isinstance(b, Heading)]
    for words in CAUTION_TOPICS:
        assert any(all(w in h for w in words) for h in headings), (words, headings)
    assert headings[-1].startswith("local codes")                       # the deferral closes them
    text = " ".join(texts(blocks))
    assert units.format_voltage(s.voltage_open_end_v_rms) in text
    assert units.format_voltage(s.voltage_far_end_v_rms) in text
    assert units.format_distance(s.exposure.distance_general_m, "imperial") in text


def test_choke_warning_is_printed_when_the_solution_has_one(solved):
    for name, (d, s) in solved.items():
        text = " ".join(texts(build_sheet(d, s, DATE).section("performance").blocks))
        # with a sleeve choke built instead (above HF) the coil's warning gives way to the sleeve's note
        assert ("Choke warning" in text) == bool(s.choke.warning and s.sleeve is None), name
        assert ("so the sheet gives a quarter-wave sleeve choke instead" in text) == (
            s.sleeve is not None), name


NASTY = "{{ 7*7 }} <b>Tom & Jerry's</b> {% if x %}"


def test_design_strings_are_escaped_data_never_template_source():
    """A record note with markup and template syntax reaches the sheet escaped (reportlab paragraph
    markup is XML: &, < and > must be entities) and is not rendered as a template."""
    text = OAK.replace("output:", f'record:\n  - {{date: 2025-04-02, note: "{NASTY}"}}\noutput:')
    d = design_from_text(text.replace("title: 20 m end-fed between the oaks", f'title: "{NASTY}"'))
    sheet = build_sheet(d, solve(d), DATE)
    assert sheet.title == NASTY                                # page furniture: plain text
    table = next(b for b in sheet.section("as-built").blocks if isinstance(b, Table))
    note = table.rows[1][7]
    assert note == "{{ 7*7 }} &lt;b&gt;Tom &amp; Jerry&#39;s&lt;/b&gt; {% if x %}"
    assert html.unescape(note) == NASTY


def test_templates_are_strict():
    with pytest.raises(jinja2.UndefinedError):
        render_blocks("asbuilt.j2")


def test_as_built_entries_sit_beside_the_prediction():
    text = OAK.replace("output:", "record:\n  - {date: 2025-04-02, radiator: 33 ft 6 in, stub: 15 ft 10 in, "
                       "tap: 9 in, resonance: 14.150 MHz, swr: 1.3, note: after the storm}\noutput:")
    d = design_from_text(text)
    s = solve(d)
    table = next(b for b in build_sheet(d, s, DATE).section("as-built").blocks if isinstance(b, Table))
    designed, entry = (tuple(plain(c) for c in row) for row in table.rows)
    assert table.blank_rows == 0
    assert designed[2] == units.format_length(s.dimensions.radiator, "imperial")
    built = 33 * 0.3048 + 6 * 0.0254
    assert entry[0] == "2025-04-02"
    assert entry[2].startswith(units.format_length(built, "imperial"))
    diff = built - s.dimensions.radiator
    assert f"({'+' if diff >= 0 else '-'}{units.format_length(abs(diff), 'imperial')})" in entry[2]
    assert entry[5] == "14.150 MHz (-25 kHz)" and entry[6] == "1.30" and entry[7] == "after the storm"
    empty = next(b for b in build_sheet(design_from_text(OAK), s, DATE).section("as-built").blocks
                 if isinstance(b, Table))
    assert len(empty.rows) == 1 and empty.blank_rows >= 3
