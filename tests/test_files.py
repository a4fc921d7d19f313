"""Tests of atomic file replacement (buildsheet/writers/files.py).

Reference: POSIX rename(2) semantics (IEEE Std 1003.1, rename: "If the link named by the new argument
exists, it shall be removed and old renamed to new ... a link named new shall remain visible to other
threads throughout the renaming operation", quoted from memory), which os.replace uses; the tests check
the promises built on it: old-or-new content, never a half file, no temporary left behind, durability
calls made.
"""

import os
import stat

import pytest

from buildsheet.writers import files
from buildsheet.writers.files import STEPS, write_atomic, write_many_atomic


def _listing(directory):
    return sorted(os.listdir(directory))


def test_write_creates_and_replaces(tmp_path):
    target = tmp_path / "oak-yard-20m.svg"
    write_atomic(target, b"first")
    assert target.read_bytes() == b"first"
    write_atomic(str(target), b"second, longer content")
    assert target.read_bytes() == b"second, longer content"
    assert _listing(tmp_path) == ["oak-yard-20m.svg"]


@pytest.mark.parametrize("step", [s for s in STEPS if s != "fsync_dir"])
def test_failure_before_the_rename_leaves_the_old_file(tmp_path, step):
    target = tmp_path / "sheet.pdf"
    target.write_bytes(b"old sheet")
    with pytest.raises(OSError, match=step):
        write_atomic(target, b"new sheet", _fail_at=step)
    assert target.read_bytes() == b"old sheet"
    assert _listing(tmp_path) == ["sheet.pdf"]


@pytest.mark.parametrize("step", [s for s in STEPS if s != "fsync_dir"])
def test_failure_on_a_new_file_leaves_nothing(tmp_path, step):
    with pytest.raises(OSError):
        write_atomic(tmp_path / "new.svg", b"x", _fail_at=step)
    assert _listing(tmp_path) == []


def test_failure_after_the_rename_keeps_the_new_file(tmp_path):
    target = tmp_path / "sheet.pdf"
    target.write_bytes(b"old")
    with pytest.raises(OSError, match="fsync_dir"):
        write_atomic(target, b"new", _fail_at="fsync_dir")
    assert target.read_bytes() == b"new"
    assert _listing(tmp_path) == ["sheet.pdf"]


def test_unknown_step_is_refused(tmp_path):
    with pytest.raises(ValueError, match="_fail_at"):
        write_atomic(tmp_path / "a", b"x", _fail_at="rename")
    assert _listing(tmp_path) == []


def test_file_and_directory_are_fsynced(tmp_path, monkeypatch):
    synced = []
    real_fsync = os.fsync

    def recording_fsync(fd):
        synced.append(stat.S_ISDIR(os.fstat(fd).st_mode))
        real_fsync(fd)

    monkeypatch.setattr(files.os, "fsync", recording_fsync)
    write_atomic(tmp_path / "a.svg", b"data")
    assert synced == [False, True]          # the file's data first, then the directory entry


def test_a_real_write_error_removes_the_temporary(tmp_path, monkeypatch):
    target = tmp_path / "design.yaml"
    target.write_bytes(b"name: old\n")

    def full_disk(fd):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(files.os, "fsync", full_disk)
    with pytest.raises(OSError, match="No space"):
        write_atomic(target, b"name: new\n")
    assert target.read_bytes() == b"name: old\n"
    assert _listing(tmp_path) == ["design.yaml"]


def test_permissions_of_a_replaced_file_are_kept(tmp_path):
    target = tmp_path / "design.yaml"
    target.write_bytes(b"old")
    os.chmod(target, 0o640)
    write_atomic(target, b"new")
    assert stat.S_IMODE(os.stat(target).st_mode) == 0o640


def test_new_file_gets_the_umask_default(tmp_path):
    umask = os.umask(0o022)
    try:
        write_atomic(tmp_path / "a.svg", b"x")
    finally:
        os.umask(umask)
    assert stat.S_IMODE(os.stat(tmp_path / "a.svg").st_mode) == 0o644


def test_an_output_is_never_written_through_a_link(tmp_path):
    # issue 15: a planted link out/NAME.pdf -> the design made `build` replace the design
    real = tmp_path / "real.yaml"
    real.write_bytes(b"old")
    link = tmp_path / "link.yaml"
    link.symlink_to(real)
    with pytest.raises(OSError, match="symbolic link"):
        write_atomic(link, b"new")
    with pytest.raises(OSError, match="symbolic link"):
        write_many_atomic({tmp_path / "other.svg": b"x", link: b"new"})
    assert link.is_symlink() and real.read_bytes() == b"old"
    assert _listing(tmp_path) == ["link.yaml", "real.yaml"]


# ---------------------------------------------------------------- several files

def _three(tmp_path):
    paths = [tmp_path / n for n in ("overview.svg", "stub.svg", "sheet.pdf")]
    for p in paths:
        p.write_bytes(b"old " + p.name.encode())
    return paths


@pytest.mark.parametrize("index", [0, 1, 2])
@pytest.mark.parametrize("step", ["create", "write", "fsync"])
def test_many_failure_while_writing_leaves_every_old_file(tmp_path, step, index):
    paths = _three(tmp_path)
    with pytest.raises(OSError):
        write_many_atomic({p: b"new " + p.name.encode() for p in paths}, _fail_at=(step, index))
    for p in paths:
        assert p.read_bytes() == b"old " + p.name.encode()
    assert _listing(tmp_path) == sorted(p.name for p in paths)


def test_many_failure_before_the_first_rename_leaves_every_old_file(tmp_path):
    paths = _three(tmp_path)
    with pytest.raises(OSError):
        write_many_atomic({p: b"new" for p in paths}, _fail_at=("replace", 0))
    assert [p.read_bytes() for p in paths] == [b"old " + p.name.encode() for p in paths]
    assert _listing(tmp_path) == sorted(p.name for p in paths)


@pytest.mark.parametrize("index", [1, 2])
def test_many_failure_during_the_renames_finishes_the_set(tmp_path, index):
    # issue 15: once one file of the set is new, the rest are renamed too (the set replaces together)
    paths = _three(tmp_path)
    with pytest.raises(OSError):
        write_many_atomic({p: b"new " + p.name.encode() for p in paths}, _fail_at=("replace", index))
    assert [p.read_bytes() for p in paths] == [b"new " + p.name.encode() for p in paths]
    assert _listing(tmp_path) == sorted(p.name for p in paths)


def test_many_writes_all(tmp_path):
    sub = tmp_path / "out"
    sub.mkdir()
    paths = [tmp_path / "a.svg", sub / "b.pdf"]
    write_many_atomic({paths[0]: b"A", paths[1]: b"B"})
    assert [p.read_bytes() for p in paths] == [b"A", b"B"]
    assert _listing(sub) == ["b.pdf"]


def test_many_refuses_text_and_duplicates_before_touching_anything(tmp_path):
    paths = _three(tmp_path)
    with pytest.raises(TypeError, match="bytes"):
        write_many_atomic({paths[0]: b"new", paths[1]: "not bytes"})
    assert paths[0].read_bytes() == b"old overview.svg"
    assert _listing(tmp_path) == sorted(p.name for p in paths)
    with pytest.raises(ValueError, match="twice"):
        write_many_atomic({paths[0]: b"a", str(paths[0]): b"b"})
    assert paths[0].read_bytes() == b"old overview.svg"
