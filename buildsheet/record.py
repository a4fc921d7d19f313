"""As-built entries: owns appending one entry to a design file's `record:` list without disturbing a
byte of what the user wrote; it must not re-dump YAML, change any other key, or touch any file but the
design file, its backup and, while it works, the lock file `DESIGN.lock` (see design_lock).

How an entry is added (DESIGN.md §3):
1. The file is read once as bytes (with its stat); the old Design is validated from that text.
2. The entry's values are checked at the edge: the date with design.parse_date, lengths and the
   resonance with units.parse_quantity, SWR as a plain number; site and note are escaped as needed
   and the validator's text rules apply to them when the result is read back (step 4).
   Values are kept as the user typed them (trimmed) and written with their units.
3. The entry's text is spliced in at the position PyYAML's marks give, in the file's own line ending
   (LF, CRLF or CR), indentation and byte-order mark:
   - a block list `record:` gets a new item after its last item, at the same column;
   - a flow list `record: [{...}]` gets `, {...}` after its last item;
   - `record: []`, `record:` and `record: ~` lose the empty value and get a block list below the key
     (a comment on that line stays where it is);
   - no `record:` key: `record:` and a block list are added at the end of the top-level mapping.
4. The result is read back and must equal the old design plus exactly the new entry (the Design with
   `record` left out is equal, and the record tuple is the old one plus the entry built in step 2).
5. The file is replaced atomically: the new text and a copy of the old bytes go to temporary files in
   the design's directory (fsynced), the file is checked to be unchanged on disk since step 1 (stat
   and bytes, just before the renames), the copy is renamed to the backup, the new text is renamed
   over the design file, and the directory is fsynced.

Backup: one file, `DESIGN.bak` beside the design (`oak.yaml` -> `oak.yaml.bak`), holding the bytes
of the file as it was before the latest `record`; each `record` replaces it. The history before that
lives in git (see history.py). A symbolic link is followed: the real file is replaced and the backup
sits beside it.

files.write_atomic is not used because an update of a user's file needs two things it has no place
for: the unchanged-on-disk check between the temporary write and the rename, and the backup.
"""

from __future__ import annotations

import contextlib
import os
import re
import stat
import tempfile
import time

try:
    import fcntl
except ImportError:     # Windows: the lock file itself is the lock (created exclusively)
    fcntl = None
from collections.abc import Mapping
from dataclasses import dataclass

import yaml

from buildsheet import units
from buildsheet.design import DATE_FORMAT, Design, RecordEntry, design_from_text, parse_date
from buildsheet.schema import ENTRY_KEYS
from buildsheet.solver import check_geometry
from buildsheet.errors import BuildsheetError, DesignError, RecordError, one_line
from buildsheet.yamlread import MAX_BYTES
from buildsheet.writers.files import fsync_dir, read_capped

BACKUP_SUFFIX = ".bak"

#: the command-line option of each key, so that a refusal names what the user typed
OPTIONS = {**{k: f"--{k}" for k in ENTRY_KEYS}, "stub": "--short"}

_QUANTITY_KEYS = {"radiator": ("length", "radiator_m"), "stub": ("length", "stub_m"),
                  "tap": ("length", "tap_m"), "resonance": ("frequency", "resonance_hz")}
_BOM = b"\xef\xbb\xbf"
#: what YAML (and so PyYAML's scanner) takes for a line break
_BREAKS = "\r\n\x85\u2028\u2029"
#: text that YAML reads back unchanged as a plain (unquoted) string, also inside a flow mapping
_PLAIN = re.compile(r"[A-Za-z0-9](?:[A-Za-z0-9 ._/+-]*[A-Za-z0-9._/+-])?\Z")
#: numbers as YAML 1.2 reads them (PyYAML, a YAML 1.1 reader, takes "1e3" for text; others do not)
_NUMBER = re.compile(r"[-+]?(?:\.\d+|\d+(?:\.\d*)?)(?:[eE][-+]?\d+)?\Z")
_SWR = re.compile(r"\d+(?:\.\d+)?\Z")
_ESCAPES = {'"': '\\"', "\\": "\\\\", "\t": "\\t", "\n": "\\n", "\r": "\\r"}


@dataclass(frozen=True)
class Added:
    """What `add_entry` did: the entry as read back, its position in `record`, the backup's path and
    the document ID (the same before and after: a record does not change the antenna)."""
    path: str
    backup: str
    index: int
    entry: RecordEntry
    document_id: str


def add_entry(path: str | os.PathLike, fields: Mapping[str, str]) -> Added:
    """Append an as-built entry to the design file at `path`.

    fields: entry key (ENTRY_KEYS) -> value as typed, e.g. {"date": "2026-05-01", "tap": "7 5/8 in",
    "swr": "1.3"}; `date` is required. Raises RecordError (or DesignError for a design that does not
    validate) naming the option; the file is then untouched.
    """
    path = os.fspath(path)
    written, expected = _entry(fields, path)
    with design_lock(path):
        raw, before = _read(path)
        bom = _BOM if raw.startswith(_BOM) else b""
        try:
            text = raw[len(bom):].decode("utf-8")
        except UnicodeDecodeError as exc:
            raise DesignError(f"is not UTF-8 text (byte {exc.start + len(bom)})", file=path) from None
        old = design_from_text(text, path)
        check_geometry(old)
        new_text = splice(text, written)
        new = _read_back(new_text, old, expected, path)
        backup = _replace(path, raw, before, bom + new_text.encode("utf-8"))
    return Added(path=path, backup=backup, index=len(new.record) - 1, entry=new.record[-1],
                 document_id=new.document_id)


# ----------------------------------------------------------------------------------------------
# The entry: values checked at the edge and written as YAML scalars

def _entry(fields: Mapping[str, str], path: str) -> tuple[dict[str, str], RecordEntry]:
    """(key -> YAML scalar text, the RecordEntry the file must read back as)."""
    def fail(key: str, problem: str) -> RecordError:
        return RecordError(f"{problem} (nothing was written)", file=path, key=OPTIONS.get(key, key))

    unknown = [k for k in fields if k not in ENTRY_KEYS]
    if unknown:
        raise fail(unknown[0], f"is not a key of an as-built entry ({', '.join(ENTRY_KEYS)})")
    if fields.get("date") is None:
        raise fail("date", "is required (every as-built entry is dated)")
    written: dict[str, str] = {}
    values: dict[str, object] = {}
    for key in ENTRY_KEYS:
        if fields.get(key) is None:
            continue
        typed = str(fields[key]).strip()
        if key == "date":
            when = parse_date(typed)
            if when is None:
                raise fail(key, f"must be {DATE_FORMAT}, got '{one_line(typed)}'")
            written[key], values["date"] = when, when
        elif key in _QUANTITY_KEYS:
            kind, attribute = _QUANTITY_KEYS[key]
            try:
                values[attribute] = units.parse_quantity(typed, kind)
            except BuildsheetError as exc:
                raise fail(key, exc.problem) from None
            written[key] = scalar(typed)
        elif key == "swr":
            if not _SWR.match(typed):
                raise fail(key, f"must be a plain number such as 1.3, got '{one_line(typed)}'")
            written[key], values["swr"] = typed, float(typed)
        else:
            # text rules (one line, printable in the sheet's font) are the validator's, on read-back
            written[key], values[key] = scalar(typed), typed
    return written, RecordEntry(**values)


def scalar(text: str) -> str:
    """`text` as a YAML scalar that reads back as exactly that string: plain where that is safe
    (letters, digits, spaces and ._/+- that YAML would not take for a number, date or boolean),
    else double-quoted with YAML escapes (YAML 1.1 §5.7; PyYAML reads \\x, \\u and \\U)."""
    if _PLAIN.match(text) and not _NUMBER.match(text) and yaml.safe_load(text) == text:
        return text
    out = []
    for ch in text:
        code = ord(ch)
        if ch in _ESCAPES:
            out.append(_ESCAPES[ch])
        elif (0x20 <= code <= 0x7E or 0xA0 <= code <= 0xD7FF or 0xE000 <= code <= 0xFFFD
              or code >= 0x10000) and ch not in "\u2028\u2029\ufeff":
            out.append(ch)
        elif code <= 0xFF:
            out.append(f"\\x{code:02X}")
        elif code <= 0xFFFF:
            out.append(f"\\u{code:04X}")
        else:
            out.append(f"\\U{code:08X}")
    return '"' + "".join(out) + '"'


# ----------------------------------------------------------------------------------------------
# Splicing

def splice(text: str, written: Mapping[str, str]) -> str:
    """`text` with the entry `written` (key -> YAML scalar text, in order) appended to its `record:`
    list; every other character of `text` is kept. Raises RecordError where the layout is one this
    function does not edit (the whole document as one flow mapping)."""
    root = yaml.compose(text, Loader=yaml.SafeLoader)
    if not isinstance(root, yaml.MappingNode) or root.flow_style:
        raise RecordError("is written as one flow mapping {...}; add the entry by hand or write the "
                          "file as a block mapping (one key per line)")
    nl = _newline(text)
    base = root.start_mark.column
    for key, value in root.value:
        if key.value == "record":
            break
    else:
        end = root.end_mark.index
        block = " " * base + "record:" + nl + _block(written, base + _indent(root), 2, nl)
        return text[:end] + _lead(text, end, nl) + block + text[end:]
    if isinstance(value, yaml.SequenceNode) and value.value:
        if value.flow_style:
            end = value.value[-1].end_mark.index
            return text[:end] + ", " + _flow(written) + text[end:]
        first = value.value[0]
        dash = value.start_mark.column
        offset = 2
        if (isinstance(first, yaml.MappingNode) and not first.flow_style
                and first.start_mark.line == value.start_mark.line):
            offset = first.start_mark.column - dash
        end = _last_leaf(value).end_mark
        at = end.index if end.column == 0 else _line_end(text, end.index)
        return text[:at] + _lead(text, at, nl) + _block(written, dash, offset, nl) + text[at:]
    # An empty value ([], ~, null or nothing): drop it and put a block list under the key.
    start, end = value.start_mark.index, value.end_mark.index
    while start > key.end_mark.index and text[start - 1] in " \t":
        start -= 1
    at = _line_end(text, end)
    block = _block(written, base + _indent(root), 2, nl)
    return text[:start] + text[end:at] + _lead(text, at, nl) + block + text[at:]


def _block(written: Mapping[str, str], dash: int, offset: int, nl: str) -> str:
    """A block-sequence item: '- key: value' at column `dash`, its keys `offset` columns further."""
    lines = []
    for i, (key, value) in enumerate(written.items()):
        head = " " * dash + "-" + " " * (offset - 1) if i == 0 else " " * (dash + offset)
        lines.append(f"{head}{key}: {value}{nl}")
    return "".join(lines)


def _flow(written: Mapping[str, str]) -> str:
    return "{" + ", ".join(f"{key}: {value}" for key, value in written.items()) + "}"


def _last_leaf(node: yaml.Node) -> yaml.Node:
    """The node whose end is the end of `node`'s text (its last value, all the way down)."""
    while isinstance(node, (yaml.MappingNode, yaml.SequenceNode)) and not node.flow_style and node.value:
        node = node.value[-1][1] if isinstance(node, yaml.MappingNode) else node.value[-1]
    return node


def _indent(root: yaml.MappingNode) -> int:
    """The file's indentation step: how far its first nested block mapping is indented (else 2)."""
    for _, value in root.value:
        if isinstance(value, yaml.MappingNode) and not value.flow_style and value.value:
            step = value.start_mark.column - root.start_mark.column
            if step > 0:
                return step
    return 2


def _newline(text: str) -> str:
    """The file's line ending: that of its first line (LF if it has only one line)."""
    for i, ch in enumerate(text):
        if ch == "\r":
            return "\r\n" if text[i + 1:i + 2] == "\n" else "\r"
        if ch in _BREAKS:
            return "\n" if ch == "\n" else ch
    return "\n"


def _line_end(text: str, i: int) -> int:
    """The index just after the line break that ends the line containing index `i` (or the end)."""
    while i < len(text) and text[i] not in _BREAKS:
        i += 1
    if text[i:i + 2] == "\r\n":
        return i + 2
    return min(i + 1, len(text))


def _lead(text: str, at: int, nl: str) -> str:
    """A line break to put before text inserted at `at`, if `at` is not at the start of a line (the
    last line of a file without a final line break)."""
    return "" if at == 0 or text[at - 1] in _BREAKS else nl


# ----------------------------------------------------------------------------------------------
# Checking the result

def _read_back(new_text: str, old: Design, expected: RecordEntry, path: str) -> Design:
    """The spliced text as a Design, which must be `old` plus exactly `expected`."""
    prefix = f"record.{len(old.record)}."
    try:
        new = design_from_text(new_text, path)
    except DesignError as exc:
        if exc.key and exc.key.startswith(prefix):
            key = exc.key[len(prefix):]
            raise RecordError(f"{exc.problem} (nothing was written)", file=path,
                              key=OPTIONS.get(key, key)) from None
        raise RecordError(f"the file with the entry added does not read back ({exc}); nothing was "
                          "written", file=path) from None
    if (new.with_changes(record=()) != old.with_changes(record=())
            or new.record != old.record + (expected,)):
        raise RecordError("the file with the entry added does not read back as the old design plus "
                          "the entry; nothing was written (please report this file)", file=path)
    return new


# ----------------------------------------------------------------------------------------------
# Reading and replacing the file

#: how long a command waits for another buildsheet command to finish with the same design, s
LOCK_WAIT_S = 10.0
LOCK_SUFFIX = ".lock"


def _lock_path(path: str) -> str:
    target = os.path.realpath(path)
    return target + LOCK_SUFFIX


@contextlib.contextmanager
def design_lock(path: str, wait_s: float | None = None):
    """Hold the lock of the design at `path` (an advisory lock on `DESIGN.lock` beside the real file)
    for an update: read, check, replace. `record` and `fit --write` take it, so that two of them on
    the same file run one after the other and each sees the other's entry; one that cannot get it
    within `wait_s` (default LOCK_WAIT_S) is refused with RecordError and writes nothing. The lock
    file is removed on release; the kernel drops the lock of a killed process, so a left-over lock
    file never blocks."""
    wait_s = LOCK_WAIT_S if wait_s is None else wait_s
    lock = _lock_path(path)
    deadline = time.monotonic() + wait_s
    while True:
        try:
            fd = os.open(lock, os.O_RDWR | os.O_CREAT | (os.O_EXCL if fcntl is None else 0), 0o644)
        except FileExistsError:
            fd = None
        except OSError as exc:
            raise RecordError(f"cannot create the lock file {lock} ({exc.strerror or exc}); nothing was "
                              "written", file=path) from None
        try:
            if fd is None:
                raise OSError("held")
            if fcntl is not None:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
        except OSError:
            if fd is not None:
                os.close(fd)
            if time.monotonic() >= deadline:
                raise RecordError(f"is being changed by another buildsheet command (it holds {lock}); "
                                  "nothing was written: run the command again when it has finished",
                                  file=path) from None
            time.sleep(0.02)
            continue
        # the holder before us may have removed the file we locked: then lock the new one
        try:
            same = os.path.samestat(os.fstat(fd), os.stat(lock))
        except FileNotFoundError:
            same = False
        if same:
            break
        os.close(fd)
    try:
        yield lock
    finally:
        try:
            os.unlink(lock)
        except OSError:
            pass
        os.close(fd)


def _read(path: str) -> tuple[bytes, os.stat_result]:
    """The file's bytes and the stat of the same open file."""
    return read_capped(path, MAX_BYTES, DesignError, "a design file")


def _same_file(a: os.stat_result, b: os.stat_result) -> bool:
    return (a.st_dev, a.st_ino, a.st_size, a.st_mtime_ns) == (b.st_dev, b.st_ino, b.st_size, b.st_mtime_ns)


def _check_unchanged(target: str, raw: bytes, before: os.stat_result, path: str) -> None:
    try:
        with open(target, "rb") as f:
            now = os.fstat(f.fileno())
            current = f.read(MAX_BYTES + 1)
    except FileNotFoundError:
        raise RecordError("was removed while the entry was being added; nothing was written",
                          file=path) from None
    if not _same_file(before, now) or current != raw:
        raise RecordError("changed on disk while the entry was being added (saved by an editor?); "
                          "nothing was written: run the command again", file=path)


def _write_temp(beside: str, data: bytes, mode: int) -> str:
    """A new temporary file in the directory of `beside` holding `data`, fsynced; its path."""
    directory, name = os.path.split(beside)
    fd, temp = tempfile.mkstemp(prefix=f".{name}.", suffix=".tmp", dir=directory or ".")
    try:
        with os.fdopen(fd, "wb") as f:
            f.write(data)
            f.flush()
            os.fsync(f.fileno())
        os.chmod(temp, mode)
    except BaseException:
        os.unlink(temp)
        raise
    return temp


def _replace(path: str, raw: bytes, before: os.stat_result, data: bytes) -> str:
    """Replace the file at `path` (read as `raw` with stat `before`) by `data`, keeping `raw` as the
    backup; return the backup's path. Nothing is renamed unless both temporary files are on disk and
    the file is unchanged since it was read."""
    target = os.path.realpath(path) if os.path.islink(path) else path
    backup = target + BACKUP_SUFFIX
    mode = stat.S_IMODE(before.st_mode)
    if not mode & (stat.S_IWUSR | stat.S_IWGRP | stat.S_IWOTH):
        raise RecordError("is read-only (no write permission is set on it); nothing was written: make "
                          "it writable if it is meant to be changed", file=path)
    temps: list[str] = []
    try:
        temps.append(_write_temp(target, data, mode))
        temps.append(_write_temp(backup, raw, mode))
        _check_unchanged(target, raw, before, path)
        # The backup first: a crash between the renames leaves the old file and its copy.
        os.replace(temps[1], backup)
        os.replace(temps[0], target)
    except OSError as exc:
        raise RecordError(f"could not be replaced ({exc.strerror or exc}); the file is unchanged",
                          file=path) from None
    finally:
        for temp in temps:
            if os.path.lexists(temp):
                os.unlink(temp)
    try:
        fsync_dir(os.path.dirname(target))
    except OSError as exc:
        raise RecordError(f"was updated, but its directory could not be synced to disk "
                          f"({exc.strerror or exc}); check the file", file=path) from None
    return backup
