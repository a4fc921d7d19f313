"""`buildsheet history`: one row per commit that changed the design file, with the document ID and the
key dimensions of that revision, read from a temporary git repository made by the test.

Checked against: git itself (the commits' short hashes and subjects as `git rev-parse`/`git log` give
them), the document ID of each revision's text loaded independently, and the half-wave scaling of a
resonant wire with frequency (a lower design frequency needs a longer radiator and stub; Kraus,
Antennas, ch. 2: resonant length proportional to the wavelength c/f).
"""

from __future__ import annotations

import os
import pathlib
import shutil
import subprocess

import pytest

from buildsheet import units
from buildsheet.cli import main
from buildsheet.design import design_from_text
from buildsheet.history import format_history, history

ROOT = pathlib.Path(__file__).resolve().parent.parent
OAK = (ROOT / "designs" / "oak-yard-20m.yaml").read_text()

pytestmark = pytest.mark.skipif(shutil.which("git") is None, reason="git is not installed")


@pytest.fixture
def git_env(monkeypatch, tmp_path):
    """A git identity and configuration of the test's own, so the user's settings cannot leak in."""
    for who in ("AUTHOR", "COMMITTER"):
        monkeypatch.setenv(f"GIT_{who}_NAME", "Test Builder")
        monkeypatch.setenv(f"GIT_{who}_EMAIL", "builder@example.invalid")
    monkeypatch.setenv("GIT_CONFIG_GLOBAL", os.devnull)
    monkeypatch.setenv("GIT_CONFIG_NOSYSTEM", "1")
    monkeypatch.setenv("GIT_CEILING_DIRECTORIES", str(tmp_path.parent))
    return tmp_path


def _git(repo: pathlib.Path, *args: str, date: str | None = None) -> str:
    env = dict(os.environ)
    if date:
        env["GIT_AUTHOR_DATE"] = env["GIT_COMMITTER_DATE"] = f"{date}T12:00:00+00:00"
    out = subprocess.run(["git", "-c", "init.defaultBranch=main", *args], cwd=repo, env=env,
                         capture_output=True, text=True, check=True)
    return out.stdout.strip()


def _commit(repo: pathlib.Path, path: pathlib.Path, text: str | None, message: str, date: str) -> str:
    if text is not None:
        path.write_text(text)
    _git(repo, "add", "-A")
    _git(repo, "commit", "-q", "-m", message, date=date)
    return _git(repo, "rev-parse", "--short", "HEAD")


def test_three_revisions_give_three_rows(git_env, capsys):
    repo = git_env / "station"
    (repo / "designs").mkdir(parents=True)
    _git(repo, "init", "-q")
    path = repo / "designs" / "oak.yaml"
    texts, commits = [], []

    texts.append(OAK)
    commits.append(_commit(repo, path, OAK, "First design for the oaks", "2026-03-01"))
    texts.append(OAK.replace("frequency: 14.175 MHz", "frequency: 14.300 MHz"))
    commits.append(_commit(repo, path, texts[-1], "Move up to the phone band", "2026-03-08"))
    # the third revision is an as-built entry added by `record`: it must not change the ID
    assert main(["record", str(path), "--date", "2026-03-15", "--swr", "1.4", "--tap", "7 in"]) == 0
    os.remove(str(path) + ".bak")
    texts.append(path.read_text())
    commits.append(_commit(repo, path, None, "As built on the 15th", "2026-03-15"))
    capsys.readouterr()

    ids = [design_from_text(t).document_id for t in texts]
    assert ids[0] != ids[1] == ids[2]

    assert main(["history", str(path)]) == 0
    out = capsys.readouterr().out.splitlines()
    assert len(out) == 1 + 3, out        # the header and one row per commit, no note
    rows = out[1:]
    subjects = ["As built on the 15th", "Move up to the phone band", "First design for the oaks"]
    dates = ["2026-03-15", "2026-03-08", "2026-03-01"]
    for row, commit, doc_id, subject, date in zip(rows, reversed(commits), reversed(ids), subjects, dates):
        assert row.split()[:3] == [date, commit, doc_id]
        assert row.endswith(subject)

    revisions = history(path).revisions
    assert [r.commit for r in revisions] == commits[::-1]
    assert [r.document_id for r in revisions] == ids[::-1]
    assert revisions[0].dimensions_m == revisions[1].dimensions_m     # same ID, same antenna
    lower, higher = revisions[2].dimensions_m, revisions[1].dimensions_m
    assert lower[0] > higher[0] and lower[1] > higher[1]
    # the printed lengths are the revision's dimensions in its own units (imperial here)
    assert all(units.format_length(m, "imperial") in rows[2] for m in lower)


def test_revision_that_does_not_validate_gets_a_row(git_env, capsys):
    repo = git_env / "station"
    repo.mkdir()
    _git(repo, "init", "-q")
    path = repo / "oak.yaml"
    _commit(repo, path, OAK, "good", "2026-03-01")
    broken = _commit(repo, path, OAK.replace("frequency: 14.175 MHz", "frequency: 14.175"),
                     "forgot the unit", "2026-03-02")
    _commit(repo, path, OAK, "fixed", "2026-03-03")
    assert main(["history", str(path)]) == 0
    rows = capsys.readouterr().out.splitlines()[1:]
    assert len(rows) == 3
    assert broken in rows[1] and "does not validate" in rows[1] and "`frequency`" in rows[1]
    assert design_from_text(OAK).document_id in rows[0] and design_from_text(OAK).document_id in rows[2]


def test_renamed_file_is_followed(git_env, capsys):
    repo = git_env / "station"
    repo.mkdir()
    _git(repo, "init", "-q")
    _commit(repo, repo / "old-name.yaml", OAK, "first", "2026-03-01")
    _git(repo, "mv", "old-name.yaml", "oak.yaml")
    _commit(repo, repo / "oak.yaml", None, "renamed", "2026-03-02")
    assert main(["history", str(repo / "oak.yaml")]) == 0
    rows = capsys.readouterr().out.splitlines()[1:]
    assert [r.split()[-1] for r in rows] == ["renamed", "first"]
    assert all(design_from_text(OAK).document_id in r for r in rows)


def test_uncommitted_changes_are_mentioned(git_env, capsys):
    repo = git_env / "station"
    repo.mkdir()
    _git(repo, "init", "-q")
    path = repo / "oak.yaml"
    _commit(repo, path, OAK, "first", "2026-03-01")
    path.write_text(OAK + "# edited\n")
    assert main(["history", str(path)]) == 0
    out = capsys.readouterr().out.splitlines()
    assert len(out) == 3 and "not yet committed" in out[-1]


def test_outside_git_is_one_line_and_exit_0(git_env, capsys):
    path = git_env / "oak.yaml"
    path.write_text(OAK)
    assert main(["history", str(path)]) == 0
    captured = capsys.readouterr()
    assert captured.out.count("\n") == 1 and "not in a git repository" in captured.out
    assert captured.err == ""


def test_file_never_committed_is_one_line_and_exit_0(git_env, capsys):
    repo = git_env / "station"
    repo.mkdir()
    _git(repo, "init", "-q")
    path = repo / "oak.yaml"
    path.write_text(OAK)
    assert main(["history", str(path)]) == 0
    out = capsys.readouterr().out
    assert out.count("\n") == 1 and "not committed" in out


def test_without_git_is_one_line_and_exit_0(git_env, monkeypatch, capsys):
    path = git_env / "oak.yaml"
    path.write_text(OAK)
    empty = git_env / "no-programs"
    empty.mkdir()
    monkeypatch.setenv("PATH", str(empty))
    assert main(["history", str(path)]) == 0
    out = capsys.readouterr().out
    assert out.count("\n") == 1 and "git is not installed" in out


def test_missing_file_is_bad_input(git_env, capsys):
    assert main(["history", str(git_env / "nowhere.yaml")]) == 2
    assert "no such file" in capsys.readouterr().err


def test_format_history_without_revisions_is_only_the_note(git_env):
    path = git_env / "oak.yaml"
    path.write_text(OAK)
    lines = format_history(history(path))
    assert len(lines) == 1 and lines[0].startswith(str(path))
