"""Revisions of a design file from git: owns asking git for the commits that changed the file and
solving each revision; it only reads (git log, git cat-file) and never changes the repository or the
working copy.

Each revision's text is read from git's object store (not the working copy), validated and solved with
the model as it is now, so a row shows what a sheet built from that commit today would say: its
document ID and the four key dimensions (DESIGN.md §5) in that revision's own units. A revision that
does not validate or cannot be solved gets a row saying why. Renames are followed (`git log --follow`).
Solutions are shared between revisions with the same document ID: the ID covers everything that
changes the antenna (DESIGN.md §4). The date of a row is the commit date, the same date
design.revision_date puts on a sheet.
"""

from __future__ import annotations

import dataclasses
import os
import subprocess

from buildsheet import units
from buildsheet.design import design_from_text
from buildsheet.errors import BuildsheetError, DesignError
from buildsheet.errors import one_line
from buildsheet.valueclass import valueclass
from buildsheet.yamlread import MAX_BYTES

GIT_TIMEOUT_S = 30
_COLUMNS = ("date", "commit", "document ID", "radiator", "stub", "tap", "spacing", "subject")


@valueclass
class Revision:
    """One commit that changed the file. dimensions_m: (radiator, stub, tap, spacing) in m, None if
    the revision could not be solved, and then `problem` says why."""
    commit: str
    date: str
    subject: str
    document_id: str | None = None
    units: str | None = None
    dimensions_m: tuple | None = None
    problem: str | None = None


@valueclass
class History:
    """The revisions of `path`, newest first. `note` is a line to show instead of (or below) them:
    why there is no history, or that the working copy has uncommitted changes."""
    path: str
    revisions: tuple = ()
    note: str | None = None


def history(path: str | os.PathLike) -> History:
    """The git history of the design file at `path`; a History with a note (never an error) when the
    file is not in a git repository or git is not installed."""
    path = os.fspath(path)
    if not os.path.isfile(path):
        if os.path.isdir(path):
            raise DesignError("is a directory, not a design file", file=path)
        if os.path.exists(path):
            raise DesignError("is not a regular file (a named pipe, device or socket), not a design file",
                              file=path)
        raise DesignError("no such file", file=path)
    directory = os.path.dirname(os.path.abspath(path))
    name = os.path.basename(path)
    try:
        inside = _git(directory, "rev-parse", "--is-inside-work-tree")
    except FileNotFoundError:
        return History(path, note=f"{path}: git is not installed, so there is no history to show")
    if inside.returncode != 0 or inside.stdout.strip() != b"true":
        reason = _first_line(inside.stderr)
        if inside.returncode == 0 or "not a git repository" in reason.lower():
            reason = "not in a git repository"
        else:
            reason = f"git cannot read the repository ({reason})"
        return History(path, note=f"{path}: {reason}, so there is no history to show")
    not_yet = History(path, note=f"{path}: not committed to git yet, so there is no history to show")
    if _git(directory, "rev-parse", "--verify", "--quiet", "HEAD").returncode != 0:
        return not_yet      # a repository without any commit: git log would fail
    log = _git(directory, "log", "--follow", "--no-color", "--name-status", "-z",
               "--format=%x1e%H%x1f%h%x1f%cs%x1f%s", "--", name)
    if log.returncode != 0:
        raise BuildsheetError(f"git log failed: {_first_line(log.stderr)}", file=path)
    commits = _parse_log(log.stdout)
    if not commits:
        return not_yet
    solved: dict = {}
    revisions = tuple(_revision(directory, commit, solved) for commit in commits)
    status = _git(directory, "status", "--porcelain", "--", name)
    note = None
    if status.returncode == 0 and status.stdout.strip():
        note = f"{path}: the working copy has changes not yet committed (not shown above)"
    return History(path, revisions=revisions, note=note)


@valueclass
class _Commit:
    sha: str
    short: str
    date: str
    subject: str
    status: str | None
    path: str | None


def _parse_log(out: bytes) -> list[_Commit]:
    """Commits from `git log -z --name-status --format=%x1e%H%x1f%h%x1f%cs%x1f%s`: each record is
    the header, NUL, a line break, then the status letters and the path(s) NUL-separated (a rename
    gives the old path, then the new one). A merge shows no status; it keeps the path of the newer
    commit before it (the log is newest first)."""
    commits = []
    path = None
    for record in out.split(b"\x1e")[1:]:
        header, _, changes = record.partition(b"\x00")
        parts = header.decode("utf-8", "replace").split("\x1f", 3)
        if len(parts) != 4:     # not the format asked for: skip rather than fail
            continue
        sha, short, date, subject = parts
        fields = [f for f in changes.strip(b"\n").split(b"\x00") if f]
        status = None
        if fields:
            status = fields[0].decode("ascii", "replace")[:1]
            path = fields[-1].decode("utf-8", "surrogateescape")
        # a subject is shown on the terminal: control characters are written as escapes
        commits.append(_Commit(sha, short, date, one_line(subject), status, path))
    return commits


def _revision(directory: str, c: _Commit, solved: dict) -> Revision:
    row = Revision(commit=c.short, date=c.date, subject=c.subject)
    if c.status == "D" or c.path is None:
        return _with(row, problem="the file was deleted in this commit")
    size = _git(directory, "cat-file", "-s", f"{c.sha}:{c.path}")
    if size.returncode != 0:
        return _with(row, problem=f"git could not read it: {_first_line(size.stderr)}")
    try:
        n = int(size.stdout.strip())
    except ValueError:
        return _with(row, problem="git gave no size for it")
    if n > MAX_BYTES:
        return _with(row, problem=f"does not validate: is larger than {MAX_BYTES // (1024 * 1024)} MiB; "
                                  "a design file is a few hundred lines at most")
    blob = _git(directory, "cat-file", "blob", f"{c.sha}:{c.path}")
    if blob.returncode != 0:
        return _with(row, problem=f"git could not read it: {_first_line(blob.stderr)}")
    raw = blob.stdout
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        return _with(row, problem=f"does not validate: is not UTF-8 text (byte {exc.start})")
    try:
        design = design_from_text(text)
    except BuildsheetError as exc:
        return _with(row, problem=f"does not validate: {exc}")
    row = _with(row, document_id=design.document_id, units=design.output.units)
    if design.document_id not in solved:
        # solve pulls in numpy and scipy; imported here so an empty history stays quick
        from buildsheet.solver import solve
        try:
            d = solve(design).dimensions
            solved[design.document_id] = (d.radiator, d.stub, d.tap, d.spacing)
        except BuildsheetError as exc:
            solved[design.document_id] = str(exc)
    result = solved[design.document_id]
    if isinstance(result, str):
        return _with(row, problem=f"cannot be solved: {result}")
    return _with(row, dimensions_m=result)


def _with(row: Revision, **changes) -> Revision:
    return dataclasses.replace(row, **changes)


#: settings that override the repository's: the output's format (signatures, colours, quoted paths,
#: the log's encoding) and anything that would run a program the repository names (a file-system
#: monitor, hooks, a pager, external diff or text conversion)
_GIT_SAFE = ("-c", "log.showSignature=false", "-c", "core.quotePath=false", "-c", "core.fsmonitor=false",
             "-c", "core.hooksPath=/dev/null", "-c", "i18n.logOutputEncoding=UTF-8", "-c", "core.pager=cat",
             "-c", "diff.external=", "-c", "core.untrackedCache=false", "--no-pager", "--no-optional-locks")


def _git(directory: str, *args: str) -> subprocess.CompletedProcess:
    """Run git in `directory` with the user's own configuration, except _GIT_SAFE; path arguments are
    literal (GIT_LITERAL_PATHSPECS: a file named `[o]ak.yaml` or `*.yaml` is that file, not a
    pattern)."""
    env = dict(os.environ, GIT_LITERAL_PATHSPECS="1", GIT_TERMINAL_PROMPT="0", GIT_OPTIONAL_LOCKS="0")
    try:
        return subprocess.run(["git", *_GIT_SAFE, *args], cwd=directory, capture_output=True,
                              timeout=GIT_TIMEOUT_S, env=env, stdin=subprocess.DEVNULL)
    except subprocess.TimeoutExpired:
        raise BuildsheetError(f"git {args[0]} did not finish within {GIT_TIMEOUT_S} s",
                              file=directory) from None


def _first_line(data: bytes) -> str:
    lines = data.decode("utf-8", "replace").strip().splitlines()
    return lines[0] if lines else "no message"


def format_history(h: History) -> list[str]:
    """The history as lines of a plain-text table (newest first), then the note if any."""
    rows = [_COLUMNS]
    for r in h.revisions:
        if r.dimensions_m is not None:
            lengths = tuple(units.format_length(m, r.units) for m in r.dimensions_m)
            rows.append((r.date, r.commit, r.document_id, *lengths, r.subject))
        else:
            rows.append((r.date, r.commit, r.document_id or "-", "-", "-", "-", "-",
                         f"{r.subject} [{r.problem}]"))
    lines = []
    if h.revisions:
        widths = [max(len(row[i]) for row in rows) for i in range(len(_COLUMNS) - 1)]
        for row in rows:
            cells = [cell.ljust(w) for cell, w in zip(row, widths)]
            lines.append("  ".join(cells + [row[-1]]).rstrip())
    if h.note:
        lines.append(h.note)
    return lines
