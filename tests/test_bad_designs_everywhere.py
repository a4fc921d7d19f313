"""Every file of tests/bad_designs/ through every command that reads a design: exit 2, one line on
stderr naming the file and (where the file says so) the key, and nothing written."""

from __future__ import annotations

import pathlib
import re
import shutil

import pytest

from buildsheet.cli import main

ROOT = pathlib.Path(__file__).resolve().parent.parent
BAD = sorted((ROOT / "tests" / "bad_designs").glob("*.yaml"))
SWEEP = ROOT / "designs" / "oak-yard-20m-sweep.s1p"

COMMANDS = {
    "solve": lambda d, out: ["solve", d],
    "solve --json": lambda d, out: ["solve", "--json", d],
    "draw": lambda d, out: ["draw", d, "-o", out],
    "build": lambda d, out: ["build", d, "-o", out],
    "record": lambda d, out: ["record", d, "--date", "2026-05-01", "--swr", "1.2"],
    "fit": lambda d, out: ["fit", d, str(SWEEP)],
    "fit --write": lambda d, out: ["fit", d, str(SWEEP), "--write"],
    "handout": lambda d, out: ["handout", d, "-o", out + "/booklet.pdf", "--quiet"],
}


def _expected_key(path: pathlib.Path) -> str | None:
    m = re.search(r"^# expect-key: (\S+)", path.read_text(), re.M)
    return None if m is None or m.group(1) == "-" else m.group(1)


@pytest.mark.parametrize("command", COMMANDS)
@pytest.mark.parametrize("path", BAD, ids=[p.stem for p in BAD])
def test_bad_design_through_every_command(path, command, tmp_path, capsys):
    design = tmp_path / path.name
    shutil.copyfile(path, design)
    original = design.read_bytes()
    out = tmp_path / "out"
    assert main(COMMANDS[command](str(design), str(out))) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and str(design) in err[0], err
    key = _expected_key(path)
    if key is not None:
        assert f"`{key}`" in err[0], err[0]
    assert not out.exists()
    assert design.read_bytes() == original
    assert sorted(p.name for p in tmp_path.iterdir()) == [path.name]
