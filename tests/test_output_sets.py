"""Outputs are written as a set and never through a link (issue 15, findings 8 and 9).

- A planted symbolic link in the output folder (to the design, or anywhere) is refused by `build`,
  `draw` and `handout` with one line before anything is written; the design is untouched.
- A kill at any point of a build (while the temporary files are written, or between the renames)
  leaves no mixed set once the folder is next written: the journal of the interrupted renames is
  completed, so the PDF and the SVGs are all of the same run (compared byte for byte with a clean
  build of that run; builds are reproducible for a given --date), and no temporary file of this tool
  is left.
"""

from __future__ import annotations

import contextlib
import io
import multiprocessing
import os
import pathlib

import pytest

from buildsheet.cli import main
from buildsheet.drawing.figures import FIGURES
from buildsheet.writers import files

ROOT = pathlib.Path(__file__).resolve().parent.parent
OAK = ROOT / "designs" / "oak-yard-20m.yaml"
NAME = "oak-yard-20m"


def _run(argv):
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        status = main([str(a) for a in argv])
    return status, out.getvalue(), err.getvalue()


def _snapshot(folder: pathlib.Path) -> dict:
    return {p.name: p.read_bytes() for p in sorted(folder.iterdir()) if not p.is_dir()}


@pytest.fixture(scope="module")
def reference(tmp_path_factory):
    """Clean builds dated A and B."""
    refs = {}
    for date in ("2025-01-01", "2025-02-02"):
        out = tmp_path_factory.mktemp("ref") / "out"
        assert _run(["build", OAK, "-o", out, "--date", date])[0] == 0
        refs[date] = _snapshot(out)
    assert refs["2025-01-01"] != refs["2025-02-02"]
    return refs


@pytest.mark.parametrize("command", ["build", "draw", "handout"])
@pytest.mark.parametrize("link_to", ["design", "elsewhere"])
def test_a_planted_link_is_never_written_through(tmp_path, reference, command, link_to):
    design = tmp_path / f"{NAME}.yaml"
    design.write_bytes(OAK.read_bytes())
    other = tmp_path / "notes.txt"
    other.write_bytes(b"keep me")
    victim = design if link_to == "design" else other
    out = tmp_path / "out"
    out.mkdir()
    names = sorted(reference["2025-01-01"])
    if command == "draw":
        names = [n for n in names if n.endswith(".svg")]
    if command == "handout":
        names = ["h.pdf"]
    for name in names:        # each output name in turn is the planted link
        for p in out.iterdir():
            p.unlink()
        (out / name).symlink_to(victim)
        argv = {"build": ["build", design, "-o", out], "draw": ["draw", design, "-o", out],
                "handout": ["handout", design, "-o", out / "h.pdf"]}[command]
        status, stdout, err = _run(argv + ["--date", "2025-01-01"])
        assert status == 2 and len(err.strip().splitlines()) == 1, (name, err)
        assert "link" in err, err
        assert design.read_bytes() == OAK.read_bytes() and other.read_bytes() == b"keep me"
        assert sorted(os.listdir(out)) == [name] and (out / name).is_symlink(), os.listdir(out)


def _killed_build(out, date, die_at: tuple[str, int]):
    """Run `build` in a forked child that dies (os._exit, no clean-up) at the die_at[1]-th call of
    os.<die_at[0]> inside the writer."""
    name, nth = die_at
    real = getattr(os, name)
    calls = {"n": 0}

    def dying(*args, **kwargs):
        calls["n"] += 1
        if calls["n"] == nth:
            os._exit(9)
        return real(*args, **kwargs)

    def child():
        setattr(files.os, name, dying)
        with contextlib.redirect_stdout(io.StringIO()):
            main(["build", str(OAK), "-o", str(out), "--date", date])
        os._exit(0)

    p = multiprocessing.get_context("fork").Process(target=child)
    p.start()
    p.join(120)
    return p.exitcode


N_FILES = 1 + len(FIGURES)     # the PDF and the SVGs of a build


# a kill before the first rename, after the first, in the middle, before the last; while writing
@pytest.mark.parametrize("die_at", [("replace", k) for k in (1, 2, 5, N_FILES)] +
                         [("fsync", k) for k in (1, N_FILES)])
def test_a_kill_anywhere_in_a_build_leaves_one_set_and_no_temporary_file(tmp_path, reference, die_at):
    old, new = reference["2025-01-01"], reference["2025-02-02"]
    assert len(old) == N_FILES
    out = tmp_path / "out"
    assert _run(["build", OAK, "-o", out, "--date", "2025-01-01"])[0] == 0
    assert _killed_build(out, "2025-02-02", die_at) == 9
    # the next run in this folder (here: `draw`, which writes the SVGs only) finds what was left
    files.recover(str(out))
    after = _snapshot(out)
    assert set(after) == set(old), sorted(set(after) - set(old))     # no temporary file, no journal
    if die_at[0] == "replace" and die_at[1] > 1:
        assert after == new, "a rename had happened: the set is completed to the new build"
    elif die_at[0] == "replace":
        # killed before the first rename (the journal was written): completed to the new set too
        assert after in (old, new)
    else:
        assert after == old, "killed while writing the temporary files: the old set stands"


def test_the_next_build_cleans_what_a_kill_left(tmp_path, reference):
    out = tmp_path / "out"
    assert _run(["build", OAK, "-o", out, "--date", "2025-01-01"])[0] == 0
    assert _killed_build(out, "2025-02-02", ("replace", 3)) == 9
    assert any(n.startswith(".") for n in os.listdir(out))         # temporary files and the journal
    assert _run(["draw", OAK, "-o", out, "--date", "2025-02-02"])[0] == 0
    assert _snapshot(out) == reference["2025-02-02"]
    assert not any(n.startswith(".") for n in os.listdir(out))


def test_a_running_writers_files_are_left_alone(tmp_path):
    # a temporary file or journal of a live process (this one) is not touched by recover
    live = tmp_path / f".a.svg.{os.getpid()}.0.tmp"
    live.write_bytes(b"x")
    journal = tmp_path / f".buildsheet-journal.{os.getpid()}.json"
    journal.write_text("[]")
    files.recover(str(tmp_path))
    assert live.exists() and journal.exists()
