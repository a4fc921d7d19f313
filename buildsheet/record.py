"""As-built entries: owns the entry `record` appends to a design file's `record:` list (its values
checked at the edge and written as YAML scalars) and where in the list it goes; the file itself is
changed by editing.update_design (lock, read back and compare, atomic replace with a backup).

How an entry is added (DESIGN.md §3):
1. The entry's values are checked at the edge: the date with design.parse_date, lengths and the
   resonance with units.parse_quantity, SWR as a plain number; site and note are escaped as needed
   and the validator's text rules apply to them when the result is read back.
   Values are kept as the user typed them (trimmed) and written with their units.
2. The entry's text is spliced in at the position PyYAML's marks give:
   - a block list `record:` gets a new item after its last item, at the same column;
   - a flow list `record: [{...}]` gets `, {...}` after its last item;
   - `record: []`, `record:` and `record: ~` lose the empty value and get a block list below the key
     (a comment on that line stays where it is);
   - no `record:` key: `record:` and a block list are added at the end of the top-level mapping.
3. The result must read back as the old design plus exactly the new entry.
"""

from __future__ import annotations

import os
import re
from collections.abc import Mapping

import yaml

from buildsheet import units
from buildsheet.design import DATE_FORMAT, Reading, RecordEntry, parse_date
from buildsheet.editing import after_block, lead, newline, put_block, scalar, top_level, update_design
from buildsheet.errors import BuildsheetError, DesignError, RecordError, one_line
from buildsheet.schema import ENTRY_KEYS
from buildsheet.solver import check_geometry
from buildsheet.valueclass import valueclass

#: the command-line option of each key, so that a refusal names what the user typed
OPTIONS = {**{k: f"--{k}" for k in ENTRY_KEYS}, "stub": "--short"}

_QUANTITY_KEYS = {"radiator": ("length", "radiator_m"), "stub": ("length", "stub_m"),
                  "tap": ("length", "tap_m"), "resonance": ("frequency", "resonance_hz")}
_SWR = re.compile(r"\d+(?:\.\d+)?\Z")
#: most readings an entry keeps: an analyzer's longest common sweep (common practice: 101 to 1001
#: points), well inside the design file's value limit (yamlread.MAX_NODES, 5 values a reading)
MAX_READINGS = 1001


@valueclass
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

    def change(text: str, old):
        check_geometry(old)
        return splice(text, written), old.with_changes(record=old.record + (expected,))

    def refused(exc: DesignError, old):
        prefix = f"record.{len(old.record)}."
        if exc.key and exc.key.startswith(prefix):
            key = exc.key[len(prefix):]
            return RecordError(f"{exc.problem} (nothing was written)", file=path, key=OPTIONS.get(key, key))
        return None

    done = update_design(path, change, refused=refused, what="the entry added")
    new = done.new
    return Added(path=path, backup=done.backup, index=len(new.record) - 1, entry=new.record[-1],
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
        typed = str(fields[key]).strip() if key != "readings" else ""
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
        elif key == "readings":
            written[key], values[key] = _readings(fields[key], fail)
        elif key == "swr":
            if not _SWR.match(typed):
                raise fail(key, f"must be a plain number such as 1.3, got '{one_line(typed)}'")
            written[key], values["swr"] = typed, float(typed)
        else:
            # text rules (one line, printable in the sheet's font) are the validator's, on read-back
            written[key], values[key] = scalar(typed), typed
    return written, RecordEntry(**values)


def _readings(readings, fail) -> tuple[str, tuple]:
    """(a YAML flow list of {frequency, swr, r, x}, the Reading tuple it reads back as) from
    design.Reading objects (swronly.read_readings or typed readings). Values are written to 9
    significant digits, the frequency in MHz: what reads back is what is stored."""
    if not readings:
        raise fail("readings", "holds no readings")
    if len(readings) > MAX_READINGS:
        raise fail("readings", f"holds {len(readings)} readings; an as-built entry keeps at most "
                   f"{MAX_READINGS} (a log, not a sweep: keep the analyzer's file beside the design)")
    items, back = [], []
    for r in readings:
        parts = [f"frequency: {r.frequency_hz / 1e6:.9g} MHz", f"swr: {r.swr:.9g}"]
        extra = {}
        for name, attr in (("r", "r_ohm"), ("x", "x_ohm")):
            v = getattr(r, attr)
            if v is not None:
                parts.append(f"{name}: {v:.9g} ohm")
                extra[attr] = float(f"{v:.9g}")
        items.append("{" + ", ".join(parts) + "}")
        back.append(Reading(frequency_hz=units.parse_quantity(f"{r.frequency_hz / 1e6:.9g} MHz", "frequency"),
                            swr=float(f"{r.swr:.9g}"), **extra))
    return "[" + ", ".join(items) + "]", tuple(back)


# ----------------------------------------------------------------------------------------------
# Splicing

def splice(text: str, written: Mapping[str, str]) -> str:
    """`text` with the entry `written` (key -> YAML scalar text, in order) appended to its `record:`
    list; every other character of `text` is kept. Raises RecordError where the layout is one this
    function does not edit (the whole document as one flow mapping)."""
    root = top_level(text, "add the entry by hand")
    nl = newline(text)
    value = next((v for k, v in root.value if k.value == "record"), None)
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
        at = after_block(text, value)
        return text[:at] + lead(text, at, nl) + _block(written, dash, offset, nl) + text[at:]
    return put_block(text, root, "record", lambda column: _block(written, column, 2, nl))


def _block(written: Mapping[str, str], dash: int, offset: int, nl: str) -> str:
    """A block-sequence item: '- key: value' at column `dash`, its keys `offset` columns further."""
    lines = []
    for i, (key, value) in enumerate(written.items()):
        head = " " * dash + "-" + " " * (offset - 1) if i == 0 else " " * (dash + offset)
        lines.append(f"{head}{key}: {value}{nl}")
    return "".join(lines)


def _flow(written: Mapping[str, str]) -> str:
    return "{" + ", ".join(f"{key}: {value}" for key, value in written.items()) + "}"


