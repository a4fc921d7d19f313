"""The README's "## Limits" table is enforced at the stated values: for every row, a design just
inside the limit passes `check` (and `solve` ends in a solution or a one-line refusal, never a crash
or NaN: test_fuzz.check_contract), and a design just outside is refused with exit status 2 and one
line naming the key. The numbers are read from the rows schema.py generates for the README (the
text, not the table's numbers), so the table and the code cannot drift apart; every row must have a
case here and every case a row.

Also the YAML hardening of yamlread.py (safe loader, size, depth and node limits, tags, keys,
encodings), tried on hand-made documents: deep nesting, alias bombs of lists and of mappings, long
scalars, keys that are not plain names, anchors on keys, UTF-16, latin-1, a BOM, tabs, CRLF.
"""

from __future__ import annotations

import math
import pathlib
import re

import pytest
import yaml

from buildsheet.cli import main
from buildsheet.design import C0, design_from_text
from buildsheet.schema import limit_rows
from buildsheet.solver import solved_lengths
from buildsheet.errors import DesignError
from buildsheet.yamlread import MAX_BYTES, MAX_DEPTH, MAX_NODES, parse
from test_fuzz import check_contract

ROOT = pathlib.Path(__file__).resolve().parent.parent
README = (ROOT / "README.md").read_text()
DEMO = {p.stem: yaml.safe_load(p.read_text()) for p in (ROOT / "designs").glob("*.yaml")}
OAK_TEXT = (ROOT / "designs" / "oak-yard-20m.yaml").read_text()


#: (key cell, accepted cell) of each row of the Limits table, as schema.py generates it for the README
#: (tests/test_schema.py checks that the README has exactly these rows)
ROWS = [(key, accepted) for key, accepted, _ in limit_rows()]


# ------------------------------------------------------------------------------------------------
# Building designs and reading numbers out of the table

def _design(base: str, changes: dict) -> str:
    """A demo design with dotted keys changed (None deletes the key), as YAML text."""
    data = yaml.safe_load(yaml.safe_dump(DEMO[base]))
    for dotted, value in changes.items():
        *parents, last = dotted.split(".")
        node = data
        for part in parents:
            node = node.setdefault(part, {})
        if value is None:
            node.pop(last, None)
        else:
            node[last] = value
    return yaml.safe_dump(data, sort_keys=False, allow_unicode=True)


_NUM = r"[-+]?\d+(?:\.\d+)?(?:e[-+]?\d+)?"
_UNIT = r"[^\d\s]\S*"
_RANGE = re.compile(rf"(?P<lo>{_NUM})(?: (?P<lo_unit>{_UNIT}))? to (?P<hi>{_NUM})(?: (?P<hi_unit>{_UNIT}))?")


def _range(accepted: str):
    """lo, lo unit, hi, hi unit of "1.8 MHz to 450 MHz" (units None for plain numbers)."""
    m = _RANGE.search(accepted)
    assert m, f"no 'lo to hi' range in the README cell {accepted!r}"
    unit = m["hi_unit"] if m["hi_unit"] not in (None, "dB") else None
    return float(m["lo"]), m["lo_unit"] or unit, float(m["hi"]), unit


def _number_in(accepted: str, pattern: str) -> float:
    m = re.search(pattern, accepted)
    assert m, f"{pattern!r} not found in the README cell {accepted!r}"
    return float(m.group(1))


def _written(value: float, unit: str | None):
    """How a user writes value: '450.45 MHz', or a plain number where the key takes one."""
    return f"{value:.10g} {unit}" if unit else value


def _range_cases(key: str, accepted: str, make, *, inside_low: bool = True):
    """Just inside (both edges, as the README writes them) and just outside (0.1 % beyond)."""
    lo, lo_unit, hi, hi_unit = _range(accepted)
    below = lo * (1 - 1e-3) if lo else -1e-3 * hi
    cases = [(f"{key} at {hi:g}", make(_written(hi, hi_unit)), None),
             (f"{key} below {lo:g}", make(_written(below, lo_unit)), key),
             (f"{key} above {hi:g}", make(_written(hi * (1 + 1e-3), hi_unit)), key)]
    if inside_low:
        cases.append((f"{key} at {lo:g}", make(_written(lo, lo_unit)), None))
    return cases


def _wavelength(frequency_hz: float) -> float:
    return C0 / frequency_hz


# ------------------------------------------------------------------------------------------------
# One builder per README row: accepted cell -> [(label, design text, None or the key refused)]

def _calibration_scales(accepted):
    cases = _range_cases("calibration.end_resistance_scale", accepted,
                         lambda v: _design("harbour-6m", {"calibration.end_resistance_scale": v}))
    cases += _range_cases("calibration.stub_velocity_scale", accepted,
                          lambda v: _design("harbour-6m", {"calibration.stub_velocity_scale": v}))
    cases += _range_cases("calibration.radiator_scale", accepted,
                          lambda v: _design("oak-yard-20m", {"calibration.radiator_scale": v}))
    return cases


def _band_ratio(accepted):
    ratio = _number_in(accepted, r"at most (\S+) ×")
    make = lambda high: _design("oak-yard-20m", {"band": ["14 MHz", f"{high:.10g} MHz"]})  # noqa: E731
    return [("band ratio at the limit", make(14 * ratio), None),
            ("band ratio above", make(14 * ratio * (1 + 1e-3)), "band")]


def _band_edges(accepted):
    lo, unit, hi, _ = _range(accepted)
    assert unit == "MHz"
    low_band = lambda low: _design("oak-yard-20m", {"band": [f"{low:.10g} MHz", "2 MHz"],  # noqa: E731
                                                    "frequency": "1.9 MHz", "site.height": "60 m"})
    high_band = lambda high: _design("tower-70cm", {"band": ["400 MHz", f"{high:.10g} MHz"],  # noqa: E731
                                                    "frequency": "440 MHz"})
    return [("low edge at the limit", low_band(lo), None),
            ("low edge below", low_band(lo * (1 - 1e-3)), "band.0"),
            ("high edge at the limit", high_band(hi), None),
            ("high edge above", high_band(hi * (1 + 1e-3)), "band.1")]


def _wire_vs_wavelength(accepted):
    fraction = 1 / _number_in(accepted, r"1/(\d+) of a wavelength")
    d = fraction * _wavelength(433.5e6)
    # as a wire build: the limit is the radiator's alone (a `tube` build also asks for a stub of
    # the same pipe)
    make = lambda d: _design("tower-70cm", {"radiator.wire": f"{d * 1e3:.10g} mm",  # noqa: E731
                                            "construction": "wire"})
    return [("wire just under the fraction of a wavelength", make(d * (1 - 1e-6)), None),
            ("wire above the fraction of a wavelength", make(d * (1 + 1e-3)), "radiator.wire")]


def _construction_fits(accepted):
    least = _number_in(accepted, r"(\S+) mm or thicker") * 1e-3
    make = lambda d: _design("tower-70cm", {"radiator.wire": f"{d * 1e3:.10g} mm",  # noqa: E731
                                            "stub.line": {"spacing": "25 mm", "conductor": f"{d * 1e3:.10g} mm",
                                                          "material": "aluminium"}})
    return [("tube at the thinnest pipe or rod", make(least), None),
            ("tube thinner than pipe or rod", make(least * (1 - 1e-3)), "construction")]


def _spacing_vs_conductor(accepted):
    factor = _number_in(accepted, r"more than (\S+) × the conductor")
    make = lambda s: _design("ridge-camp-10m", {"stub.line": {"spacing": f"{s:.10g} mm",  # noqa: E731
                                                              "conductor": "10 mm"}})
    return [("spacing just over 1.05 d", make(10 * factor * (1 + 1e-6)), None),
            ("spacing 1.05 d", make(10 * factor), "stub.line")]


def _spacing_vs_wavelength(accepted):
    fraction = 1 / _number_in(accepted, r"1/(\d+) of a wavelength")
    s = fraction * _wavelength(146e6)
    make = lambda s: _design("allotment-2m", {"stub.line.spacing": f"{s * 1e3:.10g} mm"})  # noqa: E731
    return [("spacing just under 1/20 wavelength", make(s * (1 - 1e-6)), None),
            ("spacing above 1/20 wavelength", make(s * (1 + 1e-3)), "stub.line")]


def _solved(text: str) -> tuple:
    """(radiator, stub, tap) the solver gives a design, m."""
    return solved_lengths(design_from_text(text), clearance=False)


def _stub_clears_ground(accepted):
    """The clearance is of the solved stub (calibration included); the stub depends a little on the
    height (the radiator's image), so the height that leaves exactly the clearance is found by
    iteration, and the cases are 1 mm either side of it."""
    clearance = _number_in(accepted, r"at least (\S+) m above ground")
    cases = []
    # a sloper at 5 deg, so that its far end clears the ground however low the top
    for site in ({"site.orientation": "horizontal"}, {"site.orientation": "sloper", "site.slope": "5 deg"},
                 {"site.orientation": "horizontal", "calibration.stub_velocity_scale": 1.3}):
        make = lambda h: _design("oak-yard-20m", {**site, "site.height": f"{h:.10g} m"})  # noqa: E731
        height = 10.0
        for _ in range(8):
            height = _solved(make(height))[1] + clearance
        what = ", ".join(f"{k.split('.')[-1]} {v}" for k, v in site.items())
        cases += [(f"{what}: short just clears the ground", make(height + 1e-3), None),
                  (f"{what}: short 1 mm too low", make(height - 1e-3), "site.height")]
    return cases


def _far_end_clears_ground(accepted):
    """As above, for the solved radiator of a sloper: the slope that leaves exactly the clearance."""
    clearance = _number_in(accepted, r"at least (\S+) m above ground")
    height = 4.0
    make = lambda s: _design("mill-lane-15m", {"site.height": f"{height} m",  # noqa: E731
                                               "site.slope": f"{s:.10g} deg"})
    slope = 40.0
    for _ in range(8):
        slope = math.degrees(math.asin((height - clearance) / _solved(make(slope))[0]))
    return [("far end just clears the ground", make(slope * (1 - 1e-4)), None),
            ("far end too low", make(slope * (1 + 1e-3)), "site.slope")]


def _hanging_end_clears_ground(accepted):
    """As above, for the solved stub and radiator of an inverted antenna: the short's height that
    leaves the far end exactly the clearance (found by iteration; both lengths move a little with
    the height through the radiator's image)."""
    clearance = _number_in(accepted, r"at least (\S+) m above ground")
    make = lambda h: _design("heron-pond-10m", {"site.height": f"{h:.10g} m"})  # noqa: E731
    height = 10.0
    for _ in range(12):
        radiator, stub, _ = _solved(make(height))
        height = stub + radiator + clearance
    return [("inverted: far end just clears the ground", make(height + 1e-3), None),
            ("inverted: far end 1 mm too low", make(height - 1e-3), "site.height")]


def _region(accepted):
    assert accepted == "1, 2 or 3"
    make = lambda r: _design("oak-yard-20m", {"region": r})  # noqa: E731
    return [(f"region {r}", make(r), None) for r in (1, 2, 3)] + \
           [(f"region {r}", make(r), "region") for r in (0, 4, 2.5)]


def _characters(key, base, filler="a"):
    def cases(accepted):
        top = int(_number_in(accepted, r"(\d+) characters"))
        make = lambda n: _design(base, {key: filler * n})  # noqa: E731
        out = [(f"{key} of {top}", make(top), None), (f"{key} of {top + 1}", make(top + 1), key)]
        if key == "name":
            out += [("name of 1", make(1), None), ("empty name", make(0), "name")]
        return out
    return cases


def _any_quantity(accepted):
    top = int(_number_in(accepted, r"at most (\d+) characters"))
    make = lambda n: _design("oak-yard-20m", {"feed.length": "20" + " " * (n - 3) + "m"})  # noqa: E731
    return [("64-character length", make(top), None), ("65-character length", make(top + 1), "feed.length")]


def _record_swr(accepted):
    make = lambda v: _design("oak-yard-20m", {"record": [{"date": "2026-05-01", "swr": v}]})  # noqa: E731
    reading = lambda v: _design("oak-yard-20m", {"record": [  # noqa: E731
        {"date": "2026-05-01", "readings": [{"frequency": "14.1 MHz", "swr": v}]}]})
    return (_range_cases("record.0.swr", accepted, make)
            + _range_cases("record.0.readings.0.swr", accepted, reading))


def _loss(index: int):
    def cases(accepted):
        point = lambda v: [v, 0.5] if index == 0 else ["50 MHz", v]  # noqa: E731
        return _range_cases(f"stub.line.loss.0.{index}", accepted,
                            lambda v: _design("harbour-6m", {"stub.line.loss": [point(v)]}))
    return cases


def _simple(key, base, wrap=lambda v: v, extra=None):
    """Range cases for a key whose value is the quantity itself (wrap puts it in place)."""
    def cases(accepted):
        return _range_cases(key, accepted, lambda v: _design(base, {**(extra or {}), **wrap(v)}))
    return cases


#: (key cell, first words of the accepted cell) -> builder; file-level rows are tested further down
BUILDERS = {
    ("`name`", "1 to 64"): _characters("name", "oak-yard-20m"),
    ("`title`", "at most"): _characters("title", "oak-yard-20m"),
    ("`region`", "1, 2 or 3"): _region,
    ("`frequency`", "1.8 MHz"): _simple("frequency", "oak-yard-20m", lambda v: {
        "frequency": v, "site.height": "60 m",
        # the band of 1 % below the frequency: the range check comes first, the band check after it
        "band": [f"{float(v.split()[0]) * 0.99:.10g} MHz", v]}),
    ("`band`", "high edge"): _band_ratio,
    ("`band.0`, `band.1`", "1.62 MHz"): _band_edges,
    ("`radiator.wire`", "0.2 mm"): _simple("radiator.wire", "oak-yard-20m", lambda v: {"radiator.wire": v}),
    ("`radiator.wire`", "at most 1/60"): _wire_vs_wavelength,
    ("`construction`", "`tube`"): _construction_fits,
    ("`radiator.insulation.velocity_factor`", "0.8 to 1"): _simple(
        "radiator.insulation.velocity_factor", "oak-yard-20m",
        lambda v: {"radiator.insulation": {"velocity_factor": v}}),
    ("`stub.line.spacing`", "1 mm"): _simple("stub.line.spacing", "oak-yard-20m",
                                             lambda v: {"stub.line": {"spacing": v, "conductor": "0.2 mm"}}),
    ("`stub.line.conductor`", "0.2 mm"): _simple("stub.line.conductor", "oak-yard-20m",
                                                 lambda v: {"stub.line": {"spacing": "100 mm",
                                                                          "conductor": v}}),
    ("`stub.line`", "spacing more than"): _spacing_vs_conductor,
    ("`stub.line`", "spacing at most"): _spacing_vs_wavelength,
    ("`stub.line.impedance`", "50 ohm"): _simple("stub.line.impedance", "harbour-6m",
                                                 lambda v: {"stub.line.impedance": v}),
    ("`stub.line.velocity_factor`", "0.5 to 1"): _simple("stub.line.velocity_factor", "harbour-6m",
                                                         lambda v: {"stub.line.velocity_factor": v}),
    ("`stub.line.loss`", "points from"): _loss(0),
    ("`stub.line.loss`", "0 to 100 dB"): _loss(1),
    ("`feed.impedance`", "10 ohm"): _simple("feed.impedance", "oak-yard-20m",
                                            lambda v: {"feed.impedance": v}),
    ("`feed.length`", "0 m"): _simple("feed.length", "oak-yard-20m", lambda v: {"feed.length": v}),
    ("`feed.choke_form`", "10 mm"): _simple("feed.choke_form", "oak-yard-20m",
                                            lambda v: {"feed.choke_form": v}),
    ("`site.height`", "0 m"): _simple("site.height", "allotment-2m", lambda v: {"site.height": v}),
    ("`site.height`", "horizontal and sloper"): _stub_clears_ground,
    ("`site.height`", "inverted"): _hanging_end_clears_ground,
    ("`site.slope`", "5 deg"): _simple("site.slope", "mill-lane-15m", lambda v: {"site.slope": v},
                                       {"site.height": "20 m"}),
    ("`site.slope`", "the radiator's far end"): _far_end_clears_ground,
    ("`site.ground.permittivity`", "1 to 100"): _simple(
        "site.ground.permittivity", "oak-yard-20m",
        lambda v: {"site.ground": {"permittivity": v, "conductivity": "0.005 S/m"}}),
    ("`site.ground.conductivity`", "0.00001 S/m"): _simple(
        "site.ground.conductivity", "oak-yard-20m",
        lambda v: {"site.ground": {"permittivity": 13, "conductivity": v}}),
    ("`power.transmitter`", "0.1 W"): _simple("power.transmitter", "oak-yard-20m",
                                              lambda v: {"power.transmitter": v}),
    ("`power.on_air`", "1 %"): _simple("power.on_air", "oak-yard-20m", lambda v: {"power.on_air": v}),
    ("`calibration.radiator_scale`, `calibration.end_resistance_scale`, `calibration.stub_velocity_scale`",
     "0.5 to 2"): _calibration_scales,
    ("`record.N.swr`, `record.N.readings.N.swr`", "1 to 100"): _record_swr,
    ("(any quantity)", "at most 64"): _any_quantity,
}
#: file-level rows, each tested by its own function below
FILE_ROWS = {"(file size)", "(nesting)", "(values)", "(text)", "(tags and keys)"}


def _builder(key: str, accepted: str):
    found = [b for (k, start), b in BUILDERS.items() if k == key and accepted.startswith(start)]
    return found[0] if len(found) == 1 else None


def test_every_limit_row_has_a_case_and_every_case_a_row():
    assert len(ROWS) >= 30
    keys = [key for key, _ in ROWS]
    assert FILE_ROWS <= set(keys)
    missing = [(k, a) for k, a in ROWS if k not in FILE_ROWS and _builder(k, a) is None]
    assert not missing, f"README limits without a case in this test: {missing}"
    used = {(k, s) for k, a in ROWS for (k2, s) in BUILDERS if k == k2 and a.startswith(s)}
    assert used == set(BUILDERS), f"cases without a README row: {set(BUILDERS) - used}"


def _cases():
    for key, accepted in ROWS:
        if key in FILE_ROWS:
            continue
        builder = _builder(key, accepted)
        for label, text, refused_key in builder(accepted) if builder else ():
            yield pytest.param(text, refused_key, id=f"{key}: {label}")


def _run_check(text: str, tmp_path) -> tuple[int, str]:
    path = tmp_path / "design.yaml"
    path.write_text(text, encoding="utf-8")
    return main(["check", str(path)]), str(path)


@pytest.mark.parametrize("text, refused_key", list(_cases()))
def test_limit_is_enforced_at_the_stated_value(text, refused_key, tmp_path, capsys):
    if refused_key is None:
        # check exits 0, and solve keeps its contract (bugs already reported, test_fuzz.KNOWN_ISSUES,
        # are let through there and pinned there)
        outcome = check_contract(text)
        assert not outcome.startswith("refused"), outcome
    else:
        status, path = _run_check(text, tmp_path)
        err = capsys.readouterr().err
        assert status == 2
        lines = err.strip().splitlines()
        assert len(lines) == 1 and path in lines[0], err
        assert f"`{refused_key}`" in lines[0], lines[0]


# ------------------------------------------------------------------------------------------------
# File-level rows and the YAML hardening of yamlread.py

def _check(tmp_path, capsys, content: str | bytes) -> tuple[int, str]:
    path = tmp_path / "design.yaml"
    if isinstance(content, bytes):
        path.write_bytes(content)
    else:
        path.write_text(content, encoding="utf-8")
    status = main(["check", str(path)])
    err = capsys.readouterr().err
    if status == 2:
        assert len(err.strip().splitlines()) == 1 and str(path) in err, err
    return status, err


def test_file_size_limit_is_1_mib(tmp_path, capsys):
    assert "at most 1 MiB" in dict(ROWS)["(file size)"] and MAX_BYTES == 1024 * 1024
    padding = MAX_BYTES - len(OAK_TEXT.encode()) - 3
    exact = OAK_TEXT + "#" + "x" * padding + "\n"
    assert len(exact.encode()) == MAX_BYTES - 1
    assert _check(tmp_path, capsys, exact + "\n")[0] == 0  # exactly 1 MiB
    status, err = _check(tmp_path, capsys, exact + "\n\n")  # one byte more
    assert status == 2 and "larger than 1 MiB" in err


def _nested(depth: int) -> str:
    """A document with `depth` nested lists under the top mapping (level 0): the innermost value is
    `depth + 1` levels deep."""
    return "record: " + "[" * depth + "1" + "]" * depth + "\n"


def test_nesting_limit(tmp_path, capsys):
    assert f"at most {MAX_DEPTH} levels" in dict(ROWS)["(nesting)"]
    parse(_nested(MAX_DEPTH - 1))  # the top mapping is level 0, its value level 1
    with pytest.raises(DesignError, match="nested more than"):
        parse(_nested(MAX_DEPTH))
    status, err = _check(tmp_path, capsys, OAK_TEXT + _nested(MAX_DEPTH))
    assert status == 2 and "nested more than 32 levels" in err
    # far past Python's recursion limit: still one line, not a RecursionError
    for text in ("a: " + "[" * 5000 + "]" * 5000, "a: " + "{a: " * 3000 + "1" + "}" * 3000,
                 "a:\n" + "".join("  " * i + "- \n" for i in range(1, 600))):
        status, err = _check(tmp_path, capsys, text + "\n")
        assert status == 2 and "nested more than" in err, err


def test_a_recursive_alias_is_refused_by_depth(tmp_path, capsys):
    status, err = _check(tmp_path, capsys, OAK_TEXT + "record: &r [*r]\n")
    assert status == 2 and "nested more than" in err


def _fan(levels: int, fanout: int, mapping: bool) -> str:
    rows = ["a0: &a0 x"]
    for n in range(1, levels + 1):
        body = ", ".join(f"k{i}: *a{n - 1}" if mapping else f"*a{n - 1}" for i in range(fanout))
        rows.append(f"a{n}: &a{n} " + ("{" + body + "}" if mapping else "[" + body + "]"))
    return "\n".join(rows) + "\n"


def test_node_limit_counts_alias_expansions():
    assert f"at most {MAX_NODES} values" in dict(ROWS)["(values)"]
    # root 1 + list a (1 + 99) + list b of k aliases of a (1 + 100 k) + list c of m scalars (1 + m)
    base = "a: &a [" + ", ".join(["x"] * 99) + "]\nb: [" + ", ".join(["*a"] * 198) + "]\n"
    exact = base + "c: [" + ", ".join(["y"] * 97) + "]\n"
    assert 1 + 100 + 1 + 198 * 100 + 1 + 97 == MAX_NODES
    parse(exact)
    with pytest.raises(DesignError, match="expands to more than"):
        parse(exact.replace("[y, ", "[y, y, "))


@pytest.mark.parametrize("mapping", [False, True], ids=["lists", "mappings"])
def test_billion_laughs_is_refused_quickly(mapping, tmp_path, capsys):
    text = "buildsheet: 1\nname: laughs\n" + _fan(9, 10, mapping)  # 10**9 values if expanded
    assert len(text) < 2000
    status, err = _check(tmp_path, capsys, text)
    assert status == 2 and "expands to more than" in err


def test_very_long_scalars(tmp_path, capsys):
    # a title, a quantity and a key of 300 kB: refused by length, not by the reader (which takes a
    # second per megabyte)
    filler = "x" * 300_000
    status, err = _check(tmp_path, capsys, OAK_TEXT.replace("title: 20 m end-fed between the oaks",
                                                            f"title: {filler}"))
    assert status == 2 and "`title`" in err and "characters long" in err and len(err) < 500
    status, err = _check(tmp_path, capsys, OAK_TEXT.replace("length: 20 m", f"length: 2{'0' * 100_000} m"))
    assert status == 2 and "`feed.length`" in err and "characters long" in err
    status, err = _check(tmp_path, capsys, OAK_TEXT + f"? {filler}\n: 1\n")  # an explicit key: any length
    assert status == 2 and "is not a key of a design file" in err


@pytest.mark.parametrize("content, accepted", [
    (OAK_TEXT.encode("utf-8-sig"), True),
    (OAK_TEXT.replace("\n", "\r\n").encode(), True),
    (OAK_TEXT.replace("\n", "\r\n").encode("utf-8-sig"), True),
    (OAK_TEXT.replace("  height: 10 m", "  height: 10 m\t").encode(), False),
    (OAK_TEXT.encode("utf-16"), False),
    (OAK_TEXT.encode("utf-16-le"), False),
    (OAK_TEXT.replace("oaks", "chênes").encode("latin-1"), False),
    (OAK_TEXT.replace("  wire: 14 AWG", "\twire: 14 AWG").encode(), False),
], ids=["bom", "crlf", "bom-crlf", "tab-after-a-value", "utf-16", "utf-16-without-bom", "latin-1",
        "tab-indentation"])
def test_text_encodings_and_line_ends(content, accepted, tmp_path, capsys):
    row = dict(ROWS)["(text)"]
    assert "UTF-8, with or without a byte-order mark" in row and "no tabs" in row
    status, err = _check(tmp_path, capsys, content)
    assert status == (0 if accepted else 2), err


_OAK_TITLE = "title: 20 m end-fed between the oaks"


@pytest.mark.parametrize("text, refusal", [
    (OAK_TEXT.replace(_OAK_TITLE, "title: !!python/object/apply:os.system ['true']"), "tag"),
    (OAK_TEXT.replace(_OAK_TITLE, "title: !!binary aGk="), "tag"),
    (OAK_TEXT.replace(_OAK_TITLE, "title: !!set {a}"), "tag"),
    (OAK_TEXT.replace(_OAK_TITLE, "title: !custom x"), "tag"),
    (OAK_TEXT.replace("site:\n", "defaults: &d {height: 10 m}\nsite:\n  <<: *d\n"), "merge key"),
    (OAK_TEXT.replace("site:\n", "site:\n  <<: {height: 10 m}\n"), "merge key"),
    (OAK_TEXT + "frequency: 14.2 MHz\n", "twice"),
    (OAK_TEXT + "1: x\n", "`1`: is not a key"),
    (OAK_TEXT + "null: x\n", "`null`: is not a key"),
    (OAK_TEXT + "true: x\n", "`true`: is not a key"),
    (OAK_TEXT + "[a]: x\n", "not a plain name"),
    (OAK_TEXT + "? {a: 1}\n: x\n", "not a plain name"),
    (OAK_TEXT.replace(_OAK_TITLE, "&k " + _OAK_TITLE) + "*k : again\n", "twice"),
    (OAK_TEXT.replace(_OAK_TITLE, "title: *nowhere"), "undefined alias"),
    (None, None),  # accepted: harmless anchors, explicit core tags, an alias of a value
], ids=["python-tag", "binary-tag", "set-tag", "local-tag", "merge-alias", "merge-map", "repeated-key",
        "int-key", "null-key", "bool-key", "sequence-key", "mapping-key", "anchored-key-repeated",
        "undefined-alias", "accepted"])
def test_tags_and_keys(text, refusal, tmp_path, capsys):
    if text is None:
        text = (OAK_TEXT.replace(_OAK_TITLE, "&k title: !!str 20 m end-fed")
                .replace("region: 2", "region: !!int 2")
                + "record:\n  - {date: 2026-05-01, note: &n first try}\n  - {date: 2026-05-02, note: *n}\n")
        assert _check(tmp_path, capsys, text)[0] == 0
        return
    status, err = _check(tmp_path, capsys, text)
    assert status == 2 and refusal in err, err
