"""SWR readings from a file and from the record (issue 16 item 5): the sheet's measurement log typed
into a CSV under the log's own column names, a table of return loss, `record --readings` storing them
with the as-built entry, `fit --readings` and `fit --from-record` giving the advice of the same
readings typed. Bad input: one line naming the file (and line or key), exit 2, nothing written.

References: the readings are the model's own |rho| (round trips: the same readings typed, read from a
file or stored in the record must give the same advice), and the textbook relations
SWR = (1 + |rho|)/(1 - |rho|), |rho| = 10^(-RL/20) (any transmission-line text).
"""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest

from buildsheet import fit as fitmod
from buildsheet import swronly
from buildsheet.cli import main
from buildsheet.design import load_design
from buildsheet.sheet import LOG_COLUMNS
from buildsheet.solver import solve

DATA = Path(__file__).parent / "data"
FREE = DATA / "fit-20m-free.yaml"
READ_AT = np.array([0.975, 0.985, 0.99, 0.995, 1.0, 1.005, 1.01, 1.015, 1.025])


def readings_of(design, off):
    d = solve(design).dimensions
    built = np.array([d.radiator, d.stub, d.tap]) * np.array(off)
    f = design.frequency_hz * READ_AT
    z = fitmod._model(design, design.calibration).z_feed(f, *built)
    rho = np.abs((z - 50) / (z + 50))
    return f, (1 + rho) / (1 - rho)


def write_log(path: Path, f, swr, earlier=True) -> None:
    """The sheet's measurement log as a builder types it: the log's column names (sheet.LOG_COLUMNS)
    as the header, frequencies with their unit, an earlier round of readings before a change."""
    rows = [",".join(LOG_COLUMNS)]
    n = 0
    if earlier:
        for fi in f[:4]:
            n += 1
            rows.append(f"{n},{fi / 1e6:.4f} MHz,3.1,,,")
    for i, (fi, s) in enumerate(zip(f, swr)):
        n += 1
        changed = "short moved 2 cm up" if i == 0 and earlier else ""
        rows.append(f"{n},{fi / 1e6:.4f} MHz,{s:.3f},,,{changed}")
    path.write_text("\n".join(rows) + "\n", encoding="utf-8")


def test_the_log_read_back_gives_the_advice_of_the_same_readings_typed(tmp_path, capsys):
    design = load_design(FREE)
    f, swr = readings_of(design, (1.0, 1.02, 1.3))
    log = tmp_path / "log.csv"
    write_log(log, f, swr)
    readings, used = swronly.read_readings(str(log))
    assert len(readings) == len(f) and "from line 6 on" in used
    typed = [f"{fi / 1e6:.4f} MHz={s:.3f}" for fi, s in zip(f, swr)]
    assert main(["fit", str(FREE), *sum((["--swr", t] for t in typed), [])]) == 0
    by_hand = capsys.readouterr().out
    assert main(["fit", str(FREE), "--readings", str(log)]) == 0
    from_file = capsys.readouterr().out
    assert from_file == by_hand
    assert "To match at 14.175 MHz" in from_file


def test_return_loss_table_is_the_same_readings(tmp_path):
    """|rho| = 10^(-RL/20) (textbook): a table of return loss in dB gives the SWR readings' advice."""
    design = load_design(FREE)
    f, swr = readings_of(design, (1.0, 0.98, 0.8))
    rho = (swr - 1) / (swr + 1)
    table = tmp_path / "rl.csv"
    table.write_text("frequency_mhz,return_loss_db\n" + "".join(
        f"{fi / 1e6:.6f},{-20 * np.log10(r):.6f}\n" for fi, r in zip(f, rho)))
    readings, _ = swronly.read_readings(str(table))
    np.testing.assert_allclose([r.swr for r in readings], swr, rtol=1e-5)
    a = swronly.advise(design, swronly.as_rho(readings), source=str(table))
    b = swronly.advise(design, list(zip(f, rho)))
    assert a.moves_rounded_m == b.moves_rounded_m


def test_record_stores_readings_and_fit_takes_them_from_the_latest_entry(tmp_path, capsys):
    path = tmp_path / "free.yaml"
    path.write_bytes(FREE.read_bytes())
    design = load_design(path)
    f, swr = readings_of(design, (1.0, 1.02, 1.3))
    log = tmp_path / "log.csv"
    write_log(log, f, swr)
    d = solve(design).dimensions
    assert main(["record", str(path), "--date", "2026-06-01", "--short", f"{d.stub:.4f} m",
                 "--readings", str(log)]) == 0
    capsys.readouterr()
    stored = load_design(path).record[-1].readings
    assert [r.frequency_hz for r in stored] == pytest.approx([float(f'{fi / 1e6:.4f}') * 1e6 for fi in f], abs=1e-3)
    assert [r.swr for r in stored] == pytest.approx(list(np.round(swr, 3)), abs=1e-9)
    assert main(["fit", str(path), "--readings", str(log)]) == 0
    from_file = capsys.readouterr().out
    assert main(["fit", str(path), "--from-record"]) == 0
    assert capsys.readouterr().out == from_file
    # typed readings stored the same way
    assert main(["record", str(path), "--date", "2026-06-02", "--reading", "14.1 MHz=1.5",
                 "--reading", "14.2 MHz=RL 20 dB"]) == 0
    capsys.readouterr()
    got = load_design(path).record[-1].readings
    assert [(r.frequency_hz, r.swr) for r in got] == [(14.1e6, 1.5), (14.2e6, pytest.approx(1.222, abs=1e-3))]
    # a later entry that changes the antenna: the readings are of the antenna before it
    assert main(["record", str(path), "--date", "2026-06-03", "--tap", "30 cm"]) == 0
    capsys.readouterr()
    assert main(["fit", str(path), "--from-record"]) == 2
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and "read the SWR again" in err


BAD = {
    "not-a-column.csv": ("frequency,SWR,phase\n14.1 MHz,1.5,3\n", "'phase' is not a column"),
    "no-swr.csv": ("frequency,R (Ω)\n14.1 MHz,50\n", "one of SWR or return_loss_db"),
    "swr-below-1.csv": ("frequency,SWR\n14.0 MHz,1.5\n14.1 MHz,0.8\n", ":3: SWR 0.8"),
    "no-unit.csv": ("frequency,SWR\n14.1,1.5\n", "not a frequency"),
    "not-a-number.csv": ("frequency_mhz,SWR\n14.1,high\n", "'high' is not a number"),
    "rl-zero.csv": ("frequency_mhz,return_loss_db\n14.1,0\n", "above 0"),
    "empty.csv": ("frequency,SWR\n", "holds no readings"),
    "sweep.s1p": ("# MHz S DB R 50\n14.1 -10 0\n", "carries phase"),
    "huge-frequency.csv": ("frequency_mhz,SWR\n1e300,1.5\n", "between 1 Hz and 1 THz"),
    "nul.csv": ("frequency_mhz,SWR\n14.1,1.5\n14\x00.2,1.6\n", "binary"),
}


@pytest.mark.parametrize("name", list(BAD))
def test_bad_readings_files_are_one_line_exit_2_and_nothing_written(name, tmp_path, capsys):
    text, says = BAD[name]
    bad = tmp_path / name
    bad.write_text(text, encoding="utf-8")
    path = tmp_path / "free.yaml"
    path.write_bytes(FREE.read_bytes())
    assert main(["fit", str(path), "--readings", str(bad)]) == 2
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and says in err and name in err, err
    assert main(["record", str(path), "--date", "2026-06-01", "--readings", str(bad)]) == 2
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and name in err, err
    assert path.read_bytes() == FREE.read_bytes() and not (tmp_path / "free.yaml.bak").exists()


def test_bad_readings_in_the_design_file_name_the_key(tmp_path, capsys):
    path = tmp_path / "free.yaml"
    path.write_text(FREE.read_text() + "record:\n  - date: 2026-06-01\n    readings: [{frequency: 14.1 MHz, "
                    "swr: 1.4}, {frequency: 14.2 MHz, phase: 3}]\n")
    assert main(["check", str(path)]) == 2
    err = capsys.readouterr().err
    assert "record.0.readings.1.phase" in err and len(err.strip().splitlines()) == 1
    assert main(["fit", str(FREE), "--from-record"]) == 2
    assert "no as-built entry with readings" in capsys.readouterr().err


def test_sheet_says_how_the_log_comes_back():
    from buildsheet.sheet import Para, build_sheet
    design = load_design(FREE)
    sheet = build_sheet(design, solve(design), "2026-01-01")
    text = " ".join(b.text for b in sheet.section("log").blocks if isinstance(b, Para))
    assert "--readings FILE" in text and "column names" in text


def test_sheet_as_built_table_shows_the_stored_readings(tmp_path):
    """The record's readings on paper: the entry's row gives their lowest SWR and where, and how
    many are stored (the same readings the design file holds)."""
    import html
    import re

    from buildsheet.design import design_from_text
    from buildsheet.sheet import Table, build_sheet
    text = FREE.read_text() + ("record:\n  - date: 2026-06-01\n    readings: [{frequency: 14.0 MHz, swr: 1.9}, "
                               "{frequency: 14.1 MHz, swr: 1.3}, {frequency: 14.2 MHz, swr: 2.4}]\n")
    design = design_from_text(text, "free.yaml")
    sheet = build_sheet(design, solve(design), "2026-06-02")
    table = next(b for b in sheet.section("as-built").blocks
                 if isinstance(b, Table) and b.header[:2] == ("date", "site"))
    row = [html.unescape(re.sub(r"<[^>]+>", "", c)).replace("\u00a0", " ") for c in table.rows[-1]]
    assert row[0] == "2026-06-01" and row[5].startswith("14.100 MHz") and row[6] == "1.30"
    assert "3 SWR readings stored" in row[7]


def test_readings_without_a_dip_are_refused_with_what_to_read(tmp_path, capsys):
    flat = tmp_path / "flat.csv"
    flat.write_text("frequency_mhz,SWR\n14.0,1.0\n14.1,1.0\n14.2,1.0\n")
    assert main(["fit", str(FREE), "--readings", str(flat)]) == 2
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and "all the same SWR" in err and "flat.csv" in err


def test_a_sweep_sized_table_is_refused_by_record_with_the_limit(tmp_path, capsys):
    from buildsheet.record import MAX_READINGS
    from buildsheet.yamlread import MAX_NODES
    assert 5 * MAX_READINGS < MAX_NODES
    table = tmp_path / "long.csv"
    f = np.linspace(13.0, 15.5, MAX_READINGS + 1)
    table.write_text("frequency_mhz,SWR\n" + "".join(f"{x:.6f},{1.2 + abs(x - 14.2) * 5:.3f}\n" for x in f))
    path = tmp_path / "free.yaml"
    path.write_bytes(FREE.read_bytes())
    assert main(["record", str(path), "--date", "2026-06-01", "--readings", str(table)]) == 2
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and f"at most {MAX_READINGS}" in err
    assert path.read_bytes() == FREE.read_bytes()
