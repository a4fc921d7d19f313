"""The user's environment is not a bug (issue 15, findings 11 and 12).

An output encoding that cannot show a character, a reader that goes away, a full device, a closed
stdout and a SOURCE_DATE_EPOCH that is not seconds since 1970 (the reproducible-builds specification,
https://reproducible-builds.org/specs/source-date-epoch/: "an integer ... number of seconds since
1970") each end in one line and exit 2, never "a bug" (exit 1) or a traceback; a closed pipe ends
quietly with 141 = 128 + SIGPIPE, the status POSIX shells give a tool killed by a closed pipe.
Dates are written with four-digit years (ISO 8601) and refused before 1900.

These run the console entry in real processes (the stream and the environment belong to the process).
"""

from __future__ import annotations

import os
import pathlib
import subprocess
import sys

import pytest

ROOT = pathlib.Path(__file__).resolve().parent.parent
OAK = ROOT / "designs" / "oak-yard-20m.yaml"


def _buildsheet(args, env=None, **kw):
    return subprocess.run([sys.executable, "-m", "buildsheet", *map(str, args)], capture_output=True,
                          env={**os.environ, **(env or {})}, timeout=120, **kw)


@pytest.mark.parametrize("encoding", ["cp1252", "ascii", "latin-1"])
def test_an_output_encoding_without_a_character_is_one_line_exit_2(encoding):
    # the summary prints the choke's impedance in kilo-ohms with the sign Ω (not in any of these)
    p = _buildsheet(["solve", OAK], env={"PYTHONIOENCODING": encoding})
    err = p.stderr.decode("ascii")
    assert p.returncode == 2, err
    assert len(err.strip().splitlines()) == 1 and "PYTHONIOENCODING" in err and "Traceback" not in err


@pytest.mark.parametrize("command", [["solve", OAK], ["solve", "--json", OAK]])
def test_a_reader_that_goes_away_ends_quietly(command):
    p = subprocess.Popen([sys.executable, "-m", "buildsheet", *map(str, command)], stdout=subprocess.PIPE,
                         stderr=subprocess.PIPE)
    p.stdout.close()        # before the command has written anything (it takes a while to start)
    err = p.stderr.read()
    p.wait(120)
    p.stderr.close()
    assert p.returncode == 141 and err == b"", err


@pytest.mark.skipif(not os.path.exists("/dev/full"), reason="no /dev/full")
@pytest.mark.parametrize("command", [["check", OAK], ["solve", OAK], ["history", OAK]])
def test_a_full_device_on_stdout_is_one_line_exit_2(command):
    with open("/dev/full", "wb") as full:
        p = subprocess.run(
            [sys.executable, "-m", "buildsheet", *map(str, command)], stdout=full, stderr=subprocess.PIPE,
            timeout=120)
    err = p.stderr.decode()
    assert p.returncode == 2 and len(err.strip().splitlines()) == 1 and "No space left" in err, err


def test_a_closed_stdout_is_one_line_exit_2():
    p = subprocess.run([sys.executable, "-c", "import os, sys; os.close(1); sys.argv[1:] = ['check', "
                        f"{str(OAK)!r}]; import runpy; runpy.run_module('buildsheet', run_name='__main__')"],
                       stderr=subprocess.PIPE, timeout=120)
    err = p.stderr.decode()
    assert p.returncode == 2 and len(err.strip().splitlines()) == 1 and "closed" in err, err


@pytest.mark.parametrize("epoch", ["99999999999999999999", "1e5", "253402300800", "-1", "12.5", " ", "0x10"])
def test_a_bad_source_date_epoch_is_one_line_exit_2(tmp_path, epoch):
    p = _buildsheet(["build", OAK, "-o", tmp_path / "out"], env={"SOURCE_DATE_EPOCH": epoch})
    err = p.stderr.decode()
    assert p.returncode == 2 and len(err.strip().splitlines()) == 1, err
    assert "SOURCE_DATE_EPOCH" in err and not (tmp_path / "out").exists()


def test_the_largest_source_date_epoch_is_taken(tmp_path):
    from buildsheet.cli import _MAX_EPOCH
    from buildsheet.design import revision_date
    os.environ["SOURCE_DATE_EPOCH"] = str(_MAX_EPOCH)
    try:
        assert revision_date(None) == "9999-12-31"
    finally:
        del os.environ["SOURCE_DATE_EPOCH"]


@pytest.mark.parametrize("typed", ["0999-01-01", "0001-01-01", "1899-12-31", "0000-01-01"])
def test_dates_before_1900_are_refused_by_every_dated_command(tmp_path, typed):
    from tests.test_solution_gate import _run
    design = tmp_path / "oak.yaml"
    design.write_bytes(OAK.read_bytes())
    for argv in (["build", design, "-o", tmp_path / "out", "--date", typed],
                 ["draw", design, "-o", tmp_path / "out", "--date", typed],
                 ["handout", design, "-o", tmp_path / "h.pdf", "--date", typed],
                 ["record", design, "--date", typed]):
        status, _, err = _run(argv)
        assert status == 2 and "1900" in err and typed in err and len(err.strip().splitlines()) == 1, err
    assert design.read_bytes() == OAK.read_bytes() and not (tmp_path / "out").exists()


@pytest.mark.parametrize("typed", ["1900-01-01", "1969-12-31", "2025-03-01", "9999-12-31"])
def test_dates_are_written_as_typed(tmp_path, typed):
    from tests.test_solution_gate import _run
    design = tmp_path / "oak.yaml"
    design.write_bytes(OAK.read_bytes())
    status, out, err = _run(["record", design, "--date", typed])
    assert status == 0 and f"({typed})" in out, err
    assert f"date: {typed}" in design.read_text()
