"""Editing a design file in place: owns every change `record` and `fit --write` make to a user's
design file. It never re-dumps YAML: the new text is spliced in at the position PyYAML's marks give,
in the file's own line ending, indentation and byte-order mark, so comments and layout survive byte
for byte (DESIGN.md §3). It must not touch any file but the design file, its backup and, while it
works, the lock file `DESIGN.lock` (see design_lock).

How a file is updated (update_design):
1. The lock is taken; the file is read once as bytes (with its stat); the old Design is validated
   from that text.
2. The caller's change gives the new text (spliced with the helpers here) and the Design it must
   read back as.
3. The new text is read back and must equal that Design (and pass the caller's own checks).
4. The file is replaced atomically with a backup by writers.files.replace_with_backup, which refuses
   a file changed on disk since step 1.

Backup: one file, `DESIGN.bak` beside the design (`oak.yaml` -> `oak.yaml.bak`), holding the bytes
of the file as it was before the latest update; each update replaces it. The history before that
lives in git (see history.py). A symbolic link is followed: the real file is replaced and the backup
sits beside it.
"""

from __future__ import annotations

import contextlib
import os
import re
import time

try:
    import fcntl
except ImportError:     # Windows: the lock file itself is the lock (created exclusively)
    fcntl = None
from collections.abc import Callable

import yaml

from buildsheet.design import Design, design_from_text
from buildsheet.errors import BuildsheetError, DesignError, RecordError
from buildsheet.reading import read_capped
from buildsheet.writers.files import replace_with_backup
from buildsheet.valueclass import valueclass
from buildsheet.yamlread import MAX_BYTES

BACKUP_SUFFIX = ".bak"
BOM = b"\xef\xbb\xbf"
#: what YAML (and so PyYAML's scanner) takes for a line break
BREAKS = "\r\n\x85\u2028\u2029"
#: text that YAML reads back unchanged as a plain (unquoted) string, also inside a flow mapping
_PLAIN = re.compile(r"[A-Za-z0-9](?:[A-Za-z0-9 ._/+-]*[A-Za-z0-9._/+-])?\Z")
#: numbers as YAML 1.2 reads them (PyYAML, a YAML 1.1 reader, takes "1e3" for text; others do not)
_NUMBER = re.compile(r"[-+]?(?:\.\d+|\d+(?:\.\d*)?)(?:[eE][-+]?\d+)?\Z")
_ESCAPES = {'"': '\\"', "\\": "\\\\", "\t": "\\t", "\n": "\\n", "\r": "\\r"}


@valueclass
class Updated:
    """What update_design did: the design as read back and the backup's path."""
    path: str
    backup: str
    old: Design
    new: Design


def update_design(path: str, change: Callable, *, refused: Callable | None = None,
                  verify: Callable | None = None, what: str = "the change") -> Updated:
    """Change the design file at `path` in place (see the module docstring).

    change(text, old Design) -> (new text, the Design it must read back as); it may raise to refuse.
    refused(DesignError, old) -> the error to raise when the new text does not validate (default: a
      RecordError naming `what`).
    verify(old, new) -> None: further checks before the file is replaced (raise to refuse).
    Raises RecordError or DesignError, the file then untouched."""
    with design_lock(path):
        raw, before = read_capped(path, MAX_BYTES, DesignError, "a design file")
        bom = BOM if raw.startswith(BOM) else b""
        try:
            text = raw[len(bom):].decode("utf-8")
        except UnicodeDecodeError as exc:
            raise DesignError(f"is not UTF-8 text (byte {exc.start + len(bom)})", file=path) from None
        old = design_from_text(text, path)
        new_text, expected = change(text, old)
        try:
            new = design_from_text(new_text, path)
        except DesignError as exc:
            error = refused(exc, old) if refused else None
            raise error or RecordError(f"the file with {what} does not read back ({exc}); nothing was "
                                       "written", file=path) from None
        if new != expected:
            raise RecordError(f"the file with {what} does not read back as the old design with that "
                              "change; nothing was written (please report this file)", file=path)
        if verify is not None:
            verify(old, new)
        target = os.path.realpath(path) if os.path.islink(path) else path
        backup = target + BACKUP_SUFFIX
        replace_with_backup(target, raw, before, bom + new_text.encode("utf-8"), backup, _named(path))
    return Updated(path=path, backup=backup, old=old, new=new)


def _named(path: str):
    """RecordError naming the path the user gave (not the link's target)."""
    def error(problem: str, file: str | None = None) -> BuildsheetError:
        return RecordError(problem, file=path)
    return error


# ----------------------------------------------------------------------------------------------
# Splicing

def top_level(text: str, purpose: str) -> yaml.MappingNode:
    """The document's top-level block mapping; RecordError for one flow mapping {...} (`purpose`:
    what the user should do instead, e.g. "add the entry by hand")."""
    root = yaml.compose(text, Loader=yaml.SafeLoader)
    if not isinstance(root, yaml.MappingNode) or root.flow_style:
        raise RecordError(f"is written as one flow mapping {{...}}; {purpose} or write the file as a "
                          "block mapping (one key per line)")
    return root


def find_key(root: yaml.MappingNode, name: str):
    """(key node, value node) of the top-level key `name`, or None."""
    return next(((k, v) for k, v in root.value if k.value == name), None)


def put_block(text: str, root: yaml.MappingNode, name: str, block: Callable[[int], str]) -> str:
    """`text` with the top-level key `name` given the block value `block(column)` (lines in the
    file's line ending, each starting at `column`), where the key is missing (added at the end of
    the top-level mapping) or its value is empty ({}, [], ~, null or nothing: dropped, a comment
    after it kept)."""
    nl = newline(text)
    base = root.start_mark.column
    found = find_key(root, name)
    if found is None:
        end = root.end_mark.index
        return text[:end] + lead(text, end, nl) + " " * base + f"{name}:" + nl + \
            block(base + indent(root)) + text[end:]
    key, value = found
    start, end = value.start_mark.index, value.end_mark.index
    while start > key.end_mark.index and text[start - 1] in " \t":
        start -= 1
    at = line_end(text, end)
    return text[:start] + text[end:at] + lead(text, at, nl) + block(base + indent(root)) + text[at:]


def after_block(text: str, node: yaml.Node) -> int:
    """The index just after the last line of the block node `node` (where text after it goes)."""
    end = last_leaf(node).end_mark
    return end.index if end.column == 0 else line_end(text, end.index)


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


def last_leaf(node: yaml.Node) -> yaml.Node:
    """The node whose end is the end of `node`'s text (its last value, all the way down)."""
    while isinstance(node, (yaml.MappingNode, yaml.SequenceNode)) and not node.flow_style and node.value:
        node = node.value[-1][1] if isinstance(node, yaml.MappingNode) else node.value[-1]
    return node


def indent(root: yaml.MappingNode) -> int:
    """The file's indentation step: how far its first nested block mapping is indented (else 2)."""
    for _, value in root.value:
        if isinstance(value, yaml.MappingNode) and not value.flow_style and value.value:
            step = value.start_mark.column - root.start_mark.column
            if step > 0:
                return step
    return 2


def newline(text: str) -> str:
    """The file's line ending: that of its first line (LF if it has only one line)."""
    for i, ch in enumerate(text):
        if ch == "\r":
            return "\r\n" if text[i + 1:i + 2] == "\n" else "\r"
        if ch in BREAKS:
            return "\n" if ch == "\n" else ch
    return "\n"


def line_end(text: str, i: int) -> int:
    """The index just after the line break that ends the line containing index `i` (or the end)."""
    while i < len(text) and text[i] not in BREAKS:
        i += 1
    if text[i:i + 2] == "\r\n":
        return i + 2
    return min(i + 1, len(text))


def lead(text: str, at: int, nl: str) -> str:
    """A line break to put before text inserted at `at`, if `at` is not at the start of a line (the
    last line of a file without a final line break)."""
    return "" if at == 0 or text[at - 1] in BREAKS else nl



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


