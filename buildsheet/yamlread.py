"""Safe YAML reading with line numbers: owns turning design-file text into plain values plus a map of
key paths to line numbers. It knows nothing of the design schema.

Only PyYAML's safe loader is used, and only to compose the node tree; the tree is then walked here so
that alias expansion is counted (a document may not expand to more than MAX_NODES values), nesting is
bounded (MAX_DEPTH) and any tag outside YAML's core schema (for example a Python object tag) is refused
instead of constructed. Nesting is counted while composing, so a deeply nested document is refused
before Python's recursion limit is reached, and every message is kept to one printable line.
"""

from __future__ import annotations

import math

import yaml

from buildsheet.errors import DesignError, one_line
from buildsheet.reading import decode_text, read_capped
from buildsheet.valueclass import valueclass

MAX_BYTES = 1024 * 1024
MAX_NODES = 20_000
MAX_DEPTH = 32

_TIMESTAMP_TAG = "tag:yaml.org,2002:timestamp"
_MERGE_TAG = "tag:yaml.org,2002:merge"
_CORE_TAGS = {
    "tag:yaml.org,2002:str", "tag:yaml.org,2002:int", "tag:yaml.org,2002:float",
    "tag:yaml.org,2002:bool", "tag:yaml.org,2002:null", "tag:yaml.org,2002:seq",
    "tag:yaml.org,2002:map", "tag:yaml.org,2002:timestamp",
}


@valueclass
class Document:
    """A read YAML document: `data` as plain dict/list/str/int/float/bool/None values, and `lines`,
    mapping each key path (tuple of str keys and int indices) to the 1-based line of its value."""

    data: object
    lines: dict
    text: str

    def line_of(self, path: tuple) -> int | None:
        """The line of `path`, or of its nearest ancestor that has one."""
        path = tuple(path)
        while path:
            if path in self.lines:
                return self.lines[path]
            path = path[:-1]
        return self.lines.get((), None)


def read_text(path: str) -> str:
    """Read a design file as UTF-8 text, refusing files that are too large or not text."""
    raw, _ = read_capped(path, MAX_BYTES, DesignError, "a design file")
    return decode_text(raw, path, DesignError, "a YAML design file")


def parse(text: str, file: str | None = None) -> Document:
    """Parse YAML text into a Document; every failure is a DesignError naming file and line."""
    loader = None
    try:
        # the reader checks the whole text for unprintable characters as soon as it is built
        loader = _Loader(text, file)
        node = loader.get_single_node()
    except yaml.reader.ReaderError as exc:
        line = text.count("\n", 0, exc.position) + 1
        raise DesignError(f"is not valid YAML: character U+{exc.character:04X} ({exc.reason})",
                          file=file, line=line) from None
    except yaml.MarkedYAMLError as exc:
        mark = exc.problem_mark or exc.context_mark
        line = mark.line + 1 if mark is not None else None
        problem = exc.problem or exc.context or "malformed YAML"
        raise DesignError(f"is not valid YAML: {one_line(problem)}", file=file, line=line) from None
    except yaml.YAMLError as exc:
        raise DesignError(f"is not valid YAML: {one_line(exc)}", file=file) from None
    finally:
        if loader is not None:
            loader.dispose()
    if node is None:
        raise DesignError("is empty; a design file starts with `buildsheet: 1`", file=file, line=1)
    walker = _Walker(loader, file)
    data = walker.value(node, (), 0)
    return Document(data=data, lines=walker.lines, text=text)


class _Loader(yaml.SafeLoader):
    """The safe loader, refusing documents nested more than MAX_DEPTH levels while composing them
    (PyYAML composes recursively: a few thousand '[' would otherwise end in a RecursionError)."""

    def __init__(self, text: str, file: str | None):
        super().__init__(text)
        self.file = file
        self.depth = 0
        self.nodes = 0

    def compose_node(self, parent, index):
        self.depth += 1
        self.nodes += 1
        try:
            if self.nodes > MAX_NODES:
                # counted while composing: a 1 MiB flow list is refused before its tree is built
                mark = self.peek_event().start_mark
                raise DesignError(f"holds more than {MAX_NODES} values; refused", file=self.file,
                                  line=mark.line + 1)
            if self.depth > MAX_DEPTH + 1:
                mark = self.peek_event().start_mark
                raise DesignError(f"is nested more than {MAX_DEPTH} levels deep; refused",
                                  file=self.file, line=mark.line + 1)
            return super().compose_node(parent, index)
        finally:
            self.depth -= 1


class _Walker:
    def __init__(self, loader: yaml.SafeLoader, file: str | None):
        self.loader = loader
        self.file = file
        self.lines: dict = {}
        self.count = 0

    def _fail(self, problem: str, node: yaml.Node, path: tuple) -> DesignError:
        key = one_line(".".join(str(p) for p in path)) or None
        return DesignError(one_line(problem), file=self.file, line=node.start_mark.line + 1, key=key)

    def value(self, node: yaml.Node, path: tuple, depth: int):
        self.count += 1
        if self.count > MAX_NODES:
            raise self._fail(f"expands to more than {MAX_NODES} values (an alias bomb?); refused",
                             node, path)
        if depth > MAX_DEPTH:
            raise self._fail(f"is nested more than {MAX_DEPTH} levels deep; refused", node, path)
        if node.tag not in _CORE_TAGS:
            raise self._fail(f"uses the YAML tag '{node.tag}', which design files may not use", node, path)
        self.lines.setdefault(path, node.start_mark.line + 1)
        if isinstance(node, yaml.MappingNode):
            out: dict = {}
            for key_node, value_node in node.value:
                # the resolver tags a plain << as a merge key (a quoted "<<" is an ordinary name)
                if key_node.tag == _MERGE_TAG:
                    raise self._fail("uses a YAML merge key '<<', which design files may not use",
                                     key_node, path)
                if not isinstance(key_node, yaml.ScalarNode) or key_node.tag not in _CORE_TAGS:
                    raise self._fail("has a key that is not a plain name", key_node, path)
                key = str(key_node.value)
                if key in out:
                    raise self._fail(f"has the key '{key}' twice", key_node, path + (key,))
                self.lines[path + (key,)] = key_node.start_mark.line + 1
                out[key] = self.value(value_node, path + (key,), depth + 1)
            return out
        if isinstance(node, yaml.SequenceNode):
            items = []
            for i, item in enumerate(node.value):
                items.append(self.value(item, path + (i,), depth + 1))
            return items
        if node.tag == _TIMESTAMP_TAG:
            # dates are kept as the text the user wrote (a record's date is checked by the schema)
            return node.value
        try:
            scalar = self.loader.construct_object(node, deep=True)
        except yaml.MarkedYAMLError as exc:
            raise self._fail(f"has a value YAML cannot read: {exc.problem or exc.context}", node,
                             path) from None
        except (yaml.YAMLError, ValueError, LookupError, AttributeError, TypeError) as exc:
            # PyYAML's constructors for an explicit tag (`!!int abc`, `!!bool maybe`) fail with
            # Python's own exceptions, and so does an integer of more than 4300 digits
            if "integer string conversion" in str(exc):
                raise self._fail(_HUGE_INT.format(n=len(node.value)), node, path) from None
            raise self._fail(f"has a value YAML cannot read: {exc}", node, path) from None
        if isinstance(scalar, float) and not math.isfinite(scalar):
            raise self._fail(f"is '{node.value}', which is not a finite number", node, path)
        if isinstance(scalar, int) and not isinstance(scalar, bool) and scalar.bit_length() > MAX_INT_BITS:
            # in any base (0x, 0b, 0o, base 60): refused before anything formats it (Python refuses
            # to write an integer of more than 4300 digits as text)
            raise self._fail(_HUGE_INT.format(n=len(node.value)), node, path)
        return scalar


#: the largest integer a design may hold, in bits (about 30 decimal digits: no key needs more)
MAX_INT_BITS = 100
_HUGE_INT = "is an integer written with {n} characters, far too large for any key of a design"
