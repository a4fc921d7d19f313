"""Files that are not what they seem (issue 15, findings 4, 5 and 14).

- Anything that is not a regular file (a named pipe, a character device, a socket, a folder) given as
  the design or the sweep is refused at once with one line naming it, by every command that reads a
  file; a FIFO used to block `check`, `solve`, `record` and `fit` forever (POSIX open(2): opening a
  FIFO for reading blocks until a writer opens it).
- `record` and `fit --write` do not replace a design the user made read-only.
- `history` reads a repository safely: literal path names (git's glob pathspecs would take
  `[o]ak.yaml` for `oak.yaml`), no repository-chosen program run (core.fsmonitor), a UTF-16
  i18n.logOutputEncoding ignored, each revision's size checked before it is read.
"""

from __future__ import annotations

import contextlib
import io
import os
import pathlib
import shutil
import sys
import socket
import stat
import subprocess

import pytest

from buildsheet.cli import main

sys.path.insert(0, str(pathlib.Path(__file__).parent))
from hang import time_limit  # noqa: E402

ROOT = pathlib.Path(__file__).resolve().parent.parent
OAK = ROOT / "designs" / "oak-yard-20m.yaml"
SWEEP = ROOT / "designs" / "oak-yard-20m-sweep.s1p"
SECONDS = 20




def _run(argv):
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err), time_limit(SECONDS):
        status = main([str(a) for a in argv])
    return status, out.getvalue(), err.getvalue()


def _special(kind: str, where: pathlib.Path) -> pathlib.Path:
    if kind == "fifo":
        path = where / "design.yaml"
        os.mkfifo(path)
    elif kind == "device":
        path = pathlib.Path("/dev/zero")      # endless: a reader without a size check never ends
    elif kind == "socket":
        path = where / "s.yaml"
        sock = socket.socket(socket.AF_UNIX)
        sock.bind(str(path))
        where.joinpath(".keep").write_text("")
        _SOCKETS.append(sock)
    else:
        path = where / "folder.yaml"
        path.mkdir()
    return path


_SOCKETS: list = []


def _commands(design, sweep, out):
    return [["check", design], ["solve", design], ["solve", "--json", design],
            ["record", design, "--date", "2025-01-01"], ["fit", design, sweep], ["fit", design, sweep, "--write"],
            ["build", design, "-o", out], ["draw", design, "-o", out], ["handout", design, "-o", out / "h.pdf"],
            ["history", design]]


@pytest.mark.parametrize("kind", ["fifo", "device", "socket", "folder"])
@pytest.mark.parametrize("role", ["design", "sweep"])
def test_a_special_file_is_refused_at_once_by_every_command(tmp_path, kind, role):
    special = _special(kind, tmp_path)
    design, sweep = (special, SWEEP) if role == "design" else (OAK, special)
    out = tmp_path / "out"
    for argv in _commands(design, sweep, out):
        if role == "sweep" and argv[0] != "fit":
            continue
        if kind == "folder" and role == "design" and argv[0] == "handout":
            continue        # a folder given to handout stands for its designs (none here)
        status, _, err = _run(argv)
        assert status == 2, (argv, status, err)
        assert len(err.strip().splitlines()) == 1 and str(special) in err, (argv, err)
        assert "no such file" not in err, (argv, err)
    assert not out.exists()
    for s in _SOCKETS:
        s.close()
    _SOCKETS.clear()


@pytest.mark.parametrize("command", ["record", "fit"])
def test_a_read_only_design_is_not_replaced(tmp_path, command):
    for mode in (0o444, 0o400, 0o440):
        design = tmp_path / f"oak{mode:o}.yaml"
        shutil.copyfile(OAK, design)
        design.chmod(mode)
        before = design.read_bytes()
        argv = (["record", design, "--date", "2025-01-01"] if command == "record"
                else ["fit", design, SWEEP, "--write", "--date", "2025-01-01"])
        status, _, err = _run(argv)
        assert status == 2 and "read-only" in err and len(err.strip().splitlines()) == 1, err
        assert design.read_bytes() == before and stat.S_IMODE(design.stat().st_mode) == mode
        assert not pathlib.Path(str(design) + ".bak").exists()


def _git(cwd, *args, env=None):
    subprocess.run(["git", *args], cwd=cwd, check=True, capture_output=True,
                   env={**os.environ, "GIT_AUTHOR_NAME": "t", "GIT_AUTHOR_EMAIL": "t@example.org",
                        "GIT_COMMITTER_NAME": "t", "GIT_COMMITTER_EMAIL": "t@example.org", **(env or {})})


@pytest.fixture
def repo(tmp_path):
    if shutil.which("git") is None:
        pytest.skip("git is not installed")
    _git(tmp_path, "init", "-q")
    return tmp_path


@pytest.mark.parametrize("name", ["[o]ak.yaml", "*.yaml", "?ak.yaml", "oa[k].yaml", ":(glob)x.yaml"])
def test_history_takes_a_file_name_literally(repo, name):
    # another design (different text, so that `git log --follow` cannot take one for a copy of the other)
    (repo / "oak.yaml").write_bytes((ROOT / "designs" / "harbour-6m.yaml").read_bytes())
    _git(repo, "add", "oak.yaml")
    _git(repo, "commit", "-qm", "the other file")
    (repo / name).write_bytes(OAK.read_bytes())
    _git(repo, "add", "--", f":(literal){name}")
    _git(repo, "commit", "-qm", "this file")
    status, out, err = _run(["history", repo / name])
    assert status == 0, err
    assert "this file" in out and "the other file" not in out, out


def test_history_runs_no_program_of_the_repository_and_ignores_its_log_encoding(repo):
    design = repo / "oak.yaml"
    design.write_bytes(OAK.read_bytes())
    _git(repo, "add", "oak.yaml")
    _git(repo, "commit", "-qm", "first")
    marker = repo.parent / "fsmonitor-ran"
    script = repo.parent / "monitor.sh"
    script.write_text(f"#!/bin/sh\ntouch {marker}\n")
    script.chmod(0o755)
    _git(repo, "config", "core.fsmonitor", str(script))
    _git(repo, "config", "i18n.logOutputEncoding", "UTF-16")
    design.write_text(design.read_text() + "\n# changed\n")
    status, out, err = _run(["history", design])
    assert status == 0, err
    assert "first" in out and "not yet committed" in out, out
    assert not marker.exists()


def test_history_caps_each_revision_before_reading_it(repo, monkeypatch):
    from buildsheet import history
    design = repo / "oak.yaml"
    design.write_bytes(OAK.read_bytes())
    _git(repo, "add", "oak.yaml")
    _git(repo, "commit", "-qm", "small")
    design.write_bytes(OAK.read_bytes() + b"#" * 5000 + b"\n")
    _git(repo, "commit", "-qam", "large")
    monkeypatch.setattr(history, "MAX_BYTES", 4096)
    read = []
    real = history._git

    def spy(directory, *args):
        if args[:2] == ("cat-file", "blob"):
            read.append(args[2])
        return real(directory, *args)

    monkeypatch.setattr(history, "_git", spy)
    status, out, err = _run(["history", design])
    assert status == 0, err
    assert "larger than" in out and len(read) == 1, (out, read)
