"""Atomic file replacement for every output and every update of a user's file (replace_with_backup);
it renders nothing, reads no input and decides no file names.

A file is written to a temporary file in its own directory, flushed and fsynced, then moved over the
target with os.replace (atomic on POSIX and Windows), and the directory is fsynced so the rename itself
survives a crash. On any failure before the rename the temporary file is removed and the old file is
untouched.

Tests simulate a failure at a chosen step with `_fail_at` (see STEPS); it raises OSError there.
"""

from __future__ import annotations

import errno
import json
import os
import re
import stat
from collections.abc import Mapping

STEPS = ("create", "write", "fsync", "replace", "fsync_dir")


def _checkpoint(step: str, index: int, fail_at: tuple[str, int] | None) -> None:
    if fail_at is not None and fail_at == (step, index):
        raise OSError(f"simulated failure at step {step!r} of file {index}")


#: a temporary file of this tool: `.NAME.PID.N.tmp`
_TEMP_RE = re.compile(r"\.(.+)\.(\d+)\.(\d+)\.tmp\Z")


def _temp_name(target: str) -> str:
    """A name beside `target` that no other file has (created exclusively by the caller)."""
    head, tail = os.path.split(target)
    n = 0
    while True:
        candidate = os.path.join(head, f".{tail}.{os.getpid()}.{n}.tmp")
        if not os.path.lexists(candidate):
            return candidate
        n += 1


def _write_temp(target: str, data: bytes, index: int, fail_at) -> str:
    """Write `data` to a new temporary file beside `target`, durable on disk; return its path."""
    _checkpoint("create", index, fail_at)
    while True:
        temp = _temp_name(target)
        try:
            # Mode 0o666 lets the umask decide, as for any newly created file.
            fd = os.open(temp, os.O_WRONLY | os.O_CREAT | os.O_EXCL | getattr(os, "O_BINARY", 0),
                         0o666)
            break
        except FileExistsError:
            continue
    try:
        with os.fdopen(fd, "wb") as f:
            _checkpoint("write", index, fail_at)
            f.write(data)
            f.flush()
            _checkpoint("fsync", index, fail_at)
            os.fsync(f.fileno())
        if os.path.exists(target):
            # A replaced file keeps its permissions (a design file may be group-writable).
            os.chmod(temp, stat.S_IMODE(os.stat(target).st_mode))
    except BaseException:
        os.unlink(temp)
        raise
    return temp


def fsync_dir(directory: str) -> None:
    """Make a rename in `directory` durable (fsync the directory itself)."""
    if os.name != "posix":      # Windows cannot open a directory for fsync; NTFS journals renames
        return
    fd = os.open(directory or ".", os.O_RDONLY)
    try:
        os.fsync(fd)
    finally:
        os.close(fd)


#: the journal of a set of renames in progress, beside the first file of the set
_JOURNAL = ".buildsheet-journal.{pid}.json"
_JOURNAL_RE = re.compile(r"\.buildsheet-journal\.(\d+)\.json\Z")


def _alive(pid: int) -> bool:
    if pid == os.getpid():
        return True
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except (PermissionError, OSError):
        return True
    return True


def _refuse_links(targets: list[str]) -> None:
    for target in targets:
        if os.path.islink(target):
            raise OSError(errno.ELOOP, f"{target} is a symbolic link; outputs are never written through a "
                                       "link (remove it, or choose another output folder)")


def recover(directory: str) -> None:
    """Finish what an interrupted run left in `directory`: a set of renames that a kill stopped
    halfway is completed from its journal (so the set is wholly the new one), and temporary files of
    this tool whose process is gone are removed. A journal or temporary file of a process still
    running is left alone."""
    try:
        names = os.listdir(directory or ".")
    except OSError:
        return
    for name in names:
        m = _JOURNAL_RE.match(name)
        if not m or _alive(int(m.group(1))):
            continue
        journal = os.path.join(directory, name)
        try:
            with open(journal, encoding="utf-8") as f:
                pairs = json.load(f)
            for temp, target in pairs:
                if os.path.lexists(temp) and not os.path.islink(target):
                    os.replace(temp, target)
            fsync_dir(directory)
            os.unlink(journal)
        except (OSError, ValueError, TypeError):
            continue
    for name in names:
        m = _TEMP_RE.match(name)
        if m and not _alive(int(m.group(2))):
            try:
                os.unlink(os.path.join(directory, name))
            except OSError:
                pass


def write_many_atomic(files: Mapping[str | os.PathLike, bytes], *,
                      _fail_at: tuple[str, int] | None = None) -> None:
    """Replace every file of `files` (path -> content) as one set.

    What an earlier run left in the files' directories is first recovered (see recover). All
    temporary files are written first; a failure then leaves every previous file intact and no
    temporary file behind. Before the first rename a journal of the renames is made durable beside
    the first file; if the renames stop (an error, or a kill), the rest are completed (at once, or by
    the next run in that directory), so each file is wholly old or wholly new and the set ends up
    wholly new. A symbolic link is never written through: a target that is a link is refused.

    `_fail_at` = (step, i) raises OSError at `step` (one of STEPS) of the i-th file, for tests.
    """
    if _fail_at is not None and _fail_at[0] not in STEPS:
        raise ValueError(f"_fail_at step must be one of {STEPS}, got {_fail_at[0]!r}")
    targets = [os.path.abspath(os.fspath(p)) for p in files]
    if len(set(os.path.realpath(t) for t in targets)) != len(targets):
        raise ValueError("the same file is listed twice")
    _refuse_links(targets)
    directories = list(dict.fromkeys(os.path.dirname(t) for t in targets))
    for directory in directories:
        recover(directory)
    temps: list[str] = []
    try:
        for i, (target, data) in enumerate(zip(targets, files.values())):
            if not isinstance(data, bytes):
                raise TypeError(f"content of {target} must be bytes, got {type(data).__name__}")
            temps.append(_write_temp(target, data, i, _fail_at))
    except BaseException:
        for temp in temps:
            if os.path.lexists(temp):
                os.unlink(temp)
        raise
    journal = None
    if len(targets) > 1:
        journal = os.path.join(directories[0], _JOURNAL.format(pid=os.getpid()))
        try:
            with open(journal, "w", encoding="utf-8") as f:
                json.dump(list(zip(temps, targets)), f)
                f.flush()
                os.fsync(f.fileno())
            fsync_dir(directories[0])
        except BaseException:
            for temp in temps + [journal]:
                if os.path.lexists(temp):
                    os.unlink(temp)
            raise
    done = 0
    try:
        for i, (temp, target) in enumerate(zip(temps, targets)):
            _checkpoint("replace", i, _fail_at)
            os.replace(temp, target)
            done += 1
    except BaseException:
        if done == 0:       # nothing renamed yet: the old set stands whole
            for temp in temps + ([journal] if journal else []):
                if os.path.lexists(temp):
                    os.unlink(temp)
        else:               # the set is half new: finish it, or leave the journal for the next run
            try:
                for temp, target in zip(temps[done:], targets[done:]):
                    os.replace(temp, target)
                if journal:
                    os.unlink(journal)
            except OSError:
                pass
        raise
    try:
        for i, directory in enumerate(directories):
            _checkpoint("fsync_dir", i, _fail_at)
            fsync_dir(directory)
    finally:
        if journal:     # every rename is done: the journal has nothing left to finish
            os.unlink(journal)


def write_atomic(path: str | os.PathLike, data: bytes, *, _fail_at: str | None = None) -> None:
    """Replace the file at `path` by `data` atomically (see write_many_atomic).

    `_fail_at` = a step of STEPS raises OSError there, for tests.
    """
    write_many_atomic({path: data}, _fail_at=None if _fail_at is None else (_fail_at, 0))


def replace_with_backup(path: str, raw: bytes, before: os.stat_result, data: bytes, backup: str,
                        error) -> None:
    """Replace the user's file `path` (read as `raw`, with stat `before`) by `data`, keeping `raw` at
    `backup`. Both go to temporary files first (durable); the file must then still be what was read
    (stat and bytes), else nothing is renamed; the backup is renamed first (a crash between the two
    renames leaves the old file and its copy), then the new text, then the directory is synced.
    Every failure is `error(problem, file=path)` and leaves the file as it was."""
    mode = stat.S_IMODE(before.st_mode)
    if not mode & (stat.S_IWUSR | stat.S_IWGRP | stat.S_IWOTH):
        raise error("is read-only (no write permission is set on it); nothing was written: make "
                    "it writable if it is meant to be changed", file=path)
    temps: list[str] = []
    try:
        temps.append(_write_temp(path, data, 0, None))
        temps.append(_write_temp(backup, raw, 1, None))
        for temp in temps:
            os.chmod(temp, mode)
        _check_unchanged(path, raw, before, error)
        os.replace(temps[1], backup)
        os.replace(temps[0], path)
    except OSError as exc:
        raise error(f"could not be replaced ({exc.strerror or exc}); the file is unchanged",
                    file=path) from None
    finally:
        for temp in temps:
            if os.path.lexists(temp):
                os.unlink(temp)
    try:
        fsync_dir(os.path.dirname(path))
    except OSError as exc:
        raise error(f"was updated, but its directory could not be synced to disk "
                    f"({exc.strerror or exc}); check the file", file=path) from None


def _check_unchanged(path: str, raw: bytes, before: os.stat_result, error) -> None:
    try:
        with open(path, "rb") as f:
            now = os.fstat(f.fileno())
            current = f.read(len(raw) + 1)
    except FileNotFoundError:
        raise error("was removed while it was being updated; nothing was written", file=path) from None
    same = (before.st_dev, before.st_ino, before.st_size, before.st_mtime_ns) == \
        (now.st_dev, now.st_ino, now.st_size, now.st_mtime_ns)
    if not same or current != raw:
        raise error("changed on disk while it was being updated (saved by an editor?); nothing was "
                    "written: run the command again", file=path)
