"""`buildsheet record`: an as-built entry is spliced into the design file, every other byte kept; the
entry reads back with the values typed; the file is replaced atomically with a backup, or not at all.

Checked against: the file's own bytes (everything but the inserted entry is compared byte for byte),
an independent YAML read (yaml.safe_load) of the result, and the definition of the inch
(25.4 mm exactly, international yard and pound agreement of 1959; NIST SP 811 appendix B).
"""

from __future__ import annotations

import os
import pathlib

import pytest
import yaml
from hypothesis import given, settings
from hypothesis import strategies as st

from buildsheet import editing
from buildsheet import record as record_module
from buildsheet.cli import main
from buildsheet.design import RecordEntry, design_from_text, load_design

ROOT = pathlib.Path(__file__).resolve().parent.parent
INCH = 0.0254
FOOT = 12 * INCH

# A design with comments everywhere: before keys, after values, between list items, at the end.
COMMENTED = """\
# Invented scenario: a 20 m end-fed for the Okonkwo garden, by the shed.
buildsheet: 1   # schema
name: shed-garden-20m
title: "20 m: shed to the ash"   # quoted on purpose
frequency: 14.175 MHz
radiator:
  wire: 14 AWG      # hard-drawn
  material: copper
stub:
  line: window-450
site:
  orientation: horizontal
  height: 10 m      # rope over the ash limb
output:
  units: imperial
"""

ENTRY_ARGS = ["--date", "2026-05-01", "--site", "shed garden", "--short", "15' 9-1/2\"",
              "--tap", "7 5/8 in", "--resonance", "14.21 MHz", "--swr", "1.3",
              "--note", "after trimming 2 in"]
ENTRY = RecordEntry(date="2026-05-01", site="shed garden", stub_m=15 * FOOT + 9.5 * INCH,
                    tap_m=7.625 * INCH, resonance_hz=14.21e6, swr=1.3, note="after trimming 2 in")
ENTRY_BLOCK = ("- date: 2026-05-01\n"
               "  site: shed garden\n"
               "  stub: \"15' 9-1/2\\\"\"\n"
               "  tap: 7 5/8 in\n"
               "  resonance: 14.21 MHz\n"
               "  swr: 1.3\n"
               "  note: after trimming 2 in\n")


def _indented(block: str, dash: int, newline: str = "\n") -> bytes:
    lines = block.splitlines()
    return "".join(" " * dash + line + newline for line in lines).encode()


def _listing(directory: pathlib.Path) -> list[str]:
    return sorted(p.name for p in directory.iterdir())


def _write(tmp_path: pathlib.Path, text: str | bytes, name: str = "design.yaml") -> pathlib.Path:
    path = tmp_path / name
    path.write_bytes(text if isinstance(text, bytes) else text.encode())
    return path


def _one_insertion(old: bytes, new: bytes) -> bytes:
    """The bytes inserted into `old` to give `new`, asserting that nothing else changed."""
    prefix = 0
    while prefix < min(len(old), len(new)) and old[prefix] == new[prefix]:
        prefix += 1
    suffix = 0
    while suffix < len(old) - prefix and old[-1 - suffix] == new[-1 - suffix]:
        suffix += 1
    assert prefix + suffix == len(old), "bytes of the original file were changed, not only added to"
    return new[prefix:len(new) - suffix]


def _record(path, *args) -> int:
    return main(["record", str(path), *args])


def _check_entry(path: pathlib.Path, before_count: int) -> None:
    design = load_design(path)
    assert len(design.record) == before_count + 1
    got = design.record[-1]
    assert got.stub_m == pytest.approx(ENTRY.stub_m, abs=1e-12)
    assert got.tap_m == pytest.approx(ENTRY.tap_m, abs=1e-12)
    assert got.resonance_hz == pytest.approx(ENTRY.resonance_hz)
    assert (got.date, got.site, got.swr, got.note) == (ENTRY.date, ENTRY.site, ENTRY.swr, ENTRY.note)
    # an independent reader sees the values as the user typed them, with their units
    raw = yaml.safe_load(path.read_bytes())["record"][-1]
    assert raw["stub"] == "15' 9-1/2\"" and raw["tap"] == "7 5/8 in" and raw["swr"] == 1.3


# --- splicing keeps the file ---------------------------------------------------------------------

def test_block_list_gets_a_new_item_after_the_last(tmp_path, capsys):
    text = COMMENTED + ("record:\n"
                        "  # first time up\n"
                        "  - date: 2026-04-20\n"
                        "    swr: 2.1   # before trimming\n"
                        "calibration: {}  # nothing fitted yet\n"
                        "# end of file\n")
    path = _write(tmp_path, text)
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 0
    new = path.read_bytes()
    assert _one_insertion(old, new) == _indented(ENTRY_BLOCK, 2)
    assert new.index(_indented(ENTRY_BLOCK, 2)) == old.index(b"calibration:")
    _check_entry(path, 1)
    assert "entry 2 (2026-05-01) added" in capsys.readouterr().out


def test_empty_flow_list_becomes_a_block_list_keeping_its_comment(tmp_path):
    text = COMMENTED + "record: []   # as-built entries\npower:\n  transmitter: 100 W\n"
    path = _write(tmp_path, text)
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 0
    new = path.read_bytes()
    # the empty list (and the space before it) is the only thing taken away
    base = old.replace(b"record: []   #", b"record:   #", 1)
    assert _one_insertion(base, new) == _indented(ENTRY_BLOCK, 2)
    assert b"record:   # as-built entries\n  - date: 2026-05-01\n" in new
    _check_entry(path, 0)


def test_absent_record_is_added_at_the_end(tmp_path):
    path = _write(tmp_path, COMMENTED + "# trailing comment\n")
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 0
    new = path.read_bytes()
    assert new.startswith(old)
    assert _one_insertion(old, new) == b"record:\n" + _indented(ENTRY_BLOCK, 2)
    _check_entry(path, 0)


def test_file_without_a_final_line_break(tmp_path):
    path = _write(tmp_path, COMMENTED.rstrip("\n"))
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 0
    assert _one_insertion(old, path.read_bytes()) == b"\nrecord:\n" + _indented(ENTRY_BLOCK, 2)
    _check_entry(path, 0)


def test_crlf_file_stays_crlf(tmp_path):
    text = (COMMENTED + "record:\n- date: 2026-04-20   # indentless list\n").replace("\n", "\r\n")
    path = _write(tmp_path, text)
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 0
    new = path.read_bytes()
    assert _one_insertion(old, new) == _indented(ENTRY_BLOCK, 0, "\r\n")
    assert new.count(b"\n") == new.count(b"\r\n")
    _check_entry(path, 1)


def test_byte_order_mark_and_four_space_indentation_are_kept(tmp_path):
    text = "\ufeff" + COMMENTED.replace("\n  ", "\n    ")
    path = _write(tmp_path, text)
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 0
    new = path.read_bytes()
    assert new.startswith(b"\xef\xbb\xbf")
    assert _one_insertion(old, new) == b"record:\n" + _indented(ENTRY_BLOCK, 4)
    _check_entry(path, 0)


def test_flow_list_gets_a_flow_item(tmp_path):
    path = _write(tmp_path, COMMENTED + "record: [{date: 2026-04-20, swr: 2.1}]  # short form\n")
    old = path.read_bytes()
    assert _record(path, "--date", "2026-05-01", "--tap", "7 5/8 in", "--swr", "1.3") == 0
    assert _one_insertion(old, path.read_bytes()) == b", {date: 2026-05-01, tap: 7 5/8 in, swr: 1.3}"
    design = load_design(path)
    assert [e.swr for e in design.record] == [2.1, 1.3]


def test_record_null_value_becomes_a_block_list(tmp_path):
    path = _write(tmp_path, COMMENTED + "record:\n# measurements go above\n")
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 0
    assert _one_insertion(old, path.read_bytes()) == _indented(ENTRY_BLOCK, 2)
    assert path.read_bytes().endswith(b"note: after trimming 2 in\n# measurements go above\n")
    _check_entry(path, 0)


def test_demo_design_keeps_its_bytes_and_document_id(tmp_path):
    demo = (ROOT / "designs" / "oak-yard-20m.yaml").read_bytes()
    path = _write(tmp_path, demo)
    before = load_design(path)
    assert _record(path, *ENTRY_ARGS) == 0
    after = load_design(path)
    assert path.read_bytes().startswith(demo)
    # DESIGN.md §4: the as-built record is not part of the document ID
    assert after.document_id == before.document_id
    assert after.with_changes(record=()) == before.with_changes(record=())
    assert after.record == before.record + (after.record[-1],)


@pytest.mark.parametrize("site, note", [
    ('Birch Row: "far oak" # 2', "café, 50 Ω, 1/2 wave"),
    ("yes", "null"),
    ("3", "2026-01-01"),
    ("- dash [brackets] {braces}", "back\\slash and 'single' quotes"),
    ("  padded  ", "&anchor *alias !tag %directive @at `tick`"),
])
def test_text_reads_back_exactly(tmp_path, site, note):
    path = _write(tmp_path, COMMENTED + "record: [{date: 2026-04-20}]\n")
    assert _record(path, "--date", "2026-05-01", "--site", site, "--note", note) == 0
    entry = load_design(path).record[-1]
    assert (entry.site, entry.note) == (site.strip(), note.strip())
    raw = yaml.safe_load(path.read_bytes())["record"][-1]
    assert (raw["site"], raw["note"]) == (site.strip(), note.strip())


# --- refusals leave the file untouched -----------------------------------------------------------

@pytest.mark.parametrize("option, args, expect", [
    ("--swr", ["--swr", "0.5"], "1 to 100"),
    ("--tap", ["--tap", "3"], "with a unit"),
    ("--date", ["--date", "2026-13-01"], "YYYY-MM-DD"),
    ("--short", ["--short", "15 M"], "M"),
    ("--resonance", ["--resonance", "14.2 mhz extra"], "unknown unit"),
    ("--radiator", ["--radiator=-10 m"], "greater than zero"),
    ("--swr", ["--swr", "1,3"], "plain number"),
    ("--note", ["--note", "two\nlines"], "line breaks"),
    ("--site", ["--site", "separator\u2028here"], "line breaks"),
    ("--note", ["--note", "bell\x07"], "control characters"),
    ("--note", ["--note", "smile \U0001F600"], "font cannot print"),
    ("--date", ["--date", "2026-05-01\x1b[2J"], "\\x1b"),
])
def test_bad_value_exits_2_with_one_line_and_touches_nothing(tmp_path, capsys, option, args, expect):
    path = _write(tmp_path, COMMENTED + "record: []\n")
    old = path.read_bytes()
    if option != "--date":
        args = ["--date", "2026-05-01", *args]
    assert _record(path, *args) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and err.startswith("error: ")
    assert f"`{option}`" in err and expect in err
    assert path.read_bytes() == old
    assert _listing(tmp_path) == ["design.yaml"]


def test_design_that_does_not_validate_is_refused(tmp_path, capsys):
    path = _write(tmp_path, COMMENTED.replace("14.175 MHz", "14.175"))
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 2
    assert "`frequency`" in capsys.readouterr().err
    assert path.read_bytes() == old and _listing(tmp_path) == ["design.yaml"]


def test_date_is_required(tmp_path, capsys):
    path = _write(tmp_path, COMMENTED)
    assert _record(path, "--swr", "1.2") == 2
    assert "--date" in capsys.readouterr().err
    assert path.read_bytes() == COMMENTED.encode()


def test_whole_document_in_flow_style_is_refused(tmp_path, capsys):
    path = _write(tmp_path, "{buildsheet: 1, name: a, frequency: 14.175 MHz, radiator: {wire: 14 AWG}, "
                  "stub: {line: window-450}, site: {orientation: horizontal, height: 10 m}}\n")
    old = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 2
    assert "flow mapping" in capsys.readouterr().err
    assert path.read_bytes() == old and _listing(tmp_path) == ["design.yaml"]


# --- atomic replacement and the backup -----------------------------------------------------------

def test_backup_holds_the_previous_bytes(tmp_path, capsys):
    path = _write(tmp_path, COMMENTED)
    first = path.read_bytes()
    assert _record(path, "--date", "2026-04-20", "--swr", "2.1") == 0
    assert (tmp_path / "design.yaml.bak").read_bytes() == first
    second = path.read_bytes()
    assert _record(path, *ENTRY_ARGS) == 0
    assert (tmp_path / "design.yaml.bak").read_bytes() == second
    assert _listing(tmp_path) == ["design.yaml", "design.yaml.bak"]
    assert "design.yaml.bak" in capsys.readouterr().out


@pytest.mark.parametrize("failing_call", [1, 2])
def test_failed_rename_leaves_the_original_and_no_temporary(tmp_path, monkeypatch, capsys, failing_call):
    path = _write(tmp_path, COMMENTED)
    old = path.read_bytes()
    real_replace = os.replace
    calls = []

    def replace(src, dst):
        calls.append(dst)
        if len(calls) == failing_call:
            raise OSError(28, "No space left on device")
        return real_replace(src, dst)

    monkeypatch.setattr(os, "replace", replace)
    assert _record(path, *ENTRY_ARGS) == 2
    assert "unchanged" in capsys.readouterr().err
    assert path.read_bytes() == old
    leftover = [n for n in _listing(tmp_path) if n != "design.yaml"]
    # the backup is renamed first; if only that succeeded it is a copy of the unchanged file
    assert leftover in ([], ["design.yaml.bak"])
    if leftover:
        assert (tmp_path / "design.yaml.bak").read_bytes() == old


def test_failed_fsync_leaves_the_original_and_no_temporary(tmp_path, monkeypatch, capsys):
    path = _write(tmp_path, COMMENTED)
    old = path.read_bytes()

    def fsync(fd):
        raise OSError(5, "Input/output error")

    monkeypatch.setattr(os, "fsync", fsync)
    assert _record(path, *ENTRY_ARGS) == 2
    assert "Input/output error" in capsys.readouterr().err
    assert path.read_bytes() == old
    assert _listing(tmp_path) == ["design.yaml"]


def test_file_and_directory_are_fsynced(tmp_path, monkeypatch):
    path = _write(tmp_path, COMMENTED)
    synced = []
    real_fsync = os.fsync

    def fsync(fd):
        synced.append(os.path.realpath(f"/proc/self/fd/{fd}") if os.path.exists("/proc/self/fd")
                      else fd)
        return real_fsync(fd)

    monkeypatch.setattr(os, "fsync", fsync)
    assert _record(path, *ENTRY_ARGS) == 0
    assert len(synced) == 3         # the new text, the backup copy, the directory
    if os.path.exists("/proc/self/fd"):
        assert synced[-1] == os.path.realpath(tmp_path)


def test_file_changed_between_read_and_write_is_refused(tmp_path, monkeypatch, capsys):
    path = _write(tmp_path, COMMENTED)
    other = COMMENTED.replace("height: 10 m ", "height: 12 m ").encode()
    assert len(other) == len(COMMENTED.encode())
    real = editing.design_from_text
    calls = []

    def design_from_text(text, file=None):
        calls.append(file)
        if len(calls) == 2:     # the read-back of the spliced text: another editor saves meanwhile
            stat = os.stat(path)
            path.write_bytes(other)
            os.utime(path, ns=(stat.st_atime_ns, stat.st_mtime_ns))     # even with the same mtime
        return real(text, file)

    monkeypatch.setattr(editing, "design_from_text", design_from_text)
    assert _record(path, *ENTRY_ARGS) == 2
    assert "changed on disk" in capsys.readouterr().err
    assert path.read_bytes() == other
    assert _listing(tmp_path) == ["design.yaml"]


def test_symbolic_link_is_followed_and_kept(tmp_path):
    real = _write(tmp_path, COMMENTED, "real.yaml")
    link = tmp_path / "design.yaml"
    link.symlink_to("real.yaml")
    assert _record(link, *ENTRY_ARGS) == 0
    assert link.is_symlink()
    assert (tmp_path / "real.yaml.bak").read_bytes() == COMMENTED.encode()
    _check_entry(real, 0)


def test_permissions_are_kept(tmp_path):
    path = _write(tmp_path, COMMENTED)
    os.chmod(path, 0o640)
    assert _record(path, *ENTRY_ARGS) == 0
    assert os.stat(path).st_mode & 0o777 == 0o640


def test_splice_output_matches_its_read_back_for_the_entry_keys():
    # every key of DESIGN.md §4 is written, in that order, and the validator accepts each
    written = {"date": "2026-05-01", "site": "yard", "radiator": "33 ft 4 in", "stub": "4.8 m",
               "tap": "190 mm", "resonance": "14175 kHz", "swr": "1.15", "note": "ok",
               "readings": "[{frequency: 14.1 MHz, swr: 1.4}, {frequency: 14.2 MHz, swr: 1.2, r: 55 ohm, "
                           "x: -3 ohm}]"}
    text = record_module.splice(COMMENTED, written)
    entry = design_from_text(text).record[-1]
    assert list(yaml.safe_load(text)["record"][-1]) == list(record_module.ENTRY_KEYS)
    assert [(r.frequency_hz, r.swr, r.r_ohm, r.x_ohm) for r in entry.readings] == [
        (14.1e6, 1.4, None, None), (14.2e6, 1.2, 55.0, -3.0)]
    assert entry.radiator_m == pytest.approx(33 * FOOT + 4 * INCH, abs=1e-12)
    assert (entry.stub_m, entry.tap_m, entry.resonance_hz) == pytest.approx((4.8, 0.19, 14.175e6))


@settings(max_examples=200, deadline=None)
@given(st.text(alphabet=st.characters(blacklist_categories=("Cs",)), max_size=40))
def test_any_text_is_written_as_a_scalar_yaml_reads_back_exactly(text):
    # YAML 1.1 §5.7 (escapes) and §7.3.3 (plain scalars), read by PyYAML, block and flow context
    written = record_module.scalar(text)
    assert yaml.safe_load(f"key: {written}\n") == {"key": text}
    assert yaml.safe_load(f"[{{key: {written}, other: 1}}]\n") == [{"key": text, "other": 1}]
