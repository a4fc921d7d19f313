"""Kill-during-write: a failure at every step of writing leaves the previous files intact and no
temporary file behind, for `build` (PDF + SVGs), `record` and `fit --write` (the design file and its
backup). Failures are simulated where the operating system would report them (OSError from open,
write, fsync or rename), at each step in turn."""

from __future__ import annotations

import functools
import os
import pathlib

import pytest

from buildsheet.cli import main
from buildsheet.writers import files

ROOT = pathlib.Path(__file__).resolve().parent.parent
OAK = ROOT / "designs" / "oak-yard-20m.yaml"
SWEEP = ROOT / "designs" / "oak-yard-20m-sweep.s1p"
DATE = "2025-03-01"


def _snapshot(folder: pathlib.Path) -> dict:
    return {p.name: p.read_bytes() for p in sorted(folder.iterdir())}


@pytest.fixture(scope="module")
def built(tmp_path_factory):
    out = tmp_path_factory.mktemp("build") / "out"
    assert main(["build", str(OAK), "-o", str(out), "--date", DATE]) == 0
    return out


@pytest.mark.parametrize("step", files.STEPS)
@pytest.mark.parametrize("which", ["first", "last"])
def test_build_failing_at_each_step_leaves_the_previous_sheet(built, tmp_path, monkeypatch, capsys,
                                                              step, which):
    out = tmp_path / "out"
    out.mkdir()
    for name, data in _snapshot(built).items():
        (out / name).write_bytes(data)
    before = _snapshot(out)
    # fsync_dir counts directories, not files: all the files go to one directory
    index = 0 if which == "first" or step == "fsync_dir" else len(before) - 1
    monkeypatch.setattr(files, "write_many_atomic",
                        functools.partial(files.write_many_atomic, _fail_at=(step, index)))
    status = main(["build", str(OAK), "-o", str(out), "--date", "2025-04-01"])
    err = capsys.readouterr().err
    after = _snapshot(out)
    assert status == 2 and len(err.strip().splitlines()) == 1, err
    assert set(after) == set(before), "a temporary file was left behind"
    if step == "fsync_dir" or (step == "replace" and which == "last"):
        # renames done (all, or all but the last): every file is wholly old or wholly new
        for name, data in after.items():
            end = b"%%EOF\n" if name.endswith(".pdf") else b"</svg>"
            assert data == before[name] or data.rstrip().endswith(end.rstrip()), name
    else:
        assert after == before


def _failing(monkeypatch, name: str, on_call: int):
    """Make os.<name> raise OSError on its `on_call`-th call (1-based)."""
    real = getattr(os, name)
    calls = {"n": 0}

    def fake(*args, **kwargs):
        calls["n"] += 1
        if calls["n"] == on_call:
            raise OSError(5, "Input/output error (simulated)")
        return real(*args, **kwargs)

    monkeypatch.setattr(os, name, fake)


def _design_copy(tmp_path) -> pathlib.Path:
    path = tmp_path / "oak-yard-20m.yaml"
    path.write_bytes(OAK.read_bytes())
    return path


COMMANDS = {
    "record": lambda p: ["record", str(p), "--date", "2026-05-01", "--swr", "1.3", "--note", "test"],
    "fit --write": lambda p: ["fit", str(p), str(SWEEP), "--write"],
}


@pytest.mark.parametrize("command", COMMANDS)
@pytest.mark.parametrize("name, on_call", [("replace", 1), ("replace", 2), ("fsync", 1), ("fsync", 2)])
def test_design_file_update_failing_leaves_the_original(tmp_path, monkeypatch, capsys, command, name,
                                                        on_call):
    path = _design_copy(tmp_path)
    original = path.read_bytes()
    _failing(monkeypatch, name, on_call)
    status = main(COMMANDS[command](path))
    capsys.readouterr()
    monkeypatch.undo()
    leftovers = [p.name for p in tmp_path.iterdir() if p.name.endswith(".tmp")]
    assert leftovers == []
    if status == 0:
        # the failure hit after both renames (the directory's fsync): the new file is whole
        assert path.read_bytes().startswith(original[:100])
        return
    assert status == 2
    assert path.read_bytes() == original
