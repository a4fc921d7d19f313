"""Reading a user's input file (a design, a sweep): owns the size cap, the refusal of anything that is
not a regular file, and the decoding to text. It writes nothing (writing is writers/files.py's).
"""

from __future__ import annotations

import os
import stat


def read_capped(path: str, limit: int, error, what: str) -> tuple[bytes, os.stat_result]:
    """The bytes of the file at `path` and the stat of the same open file, refusing files larger
    than `limit` bytes; every failure is `error(problem, file=path)`, with `what` naming the kind of
    file in the messages ("a design file", "a sweep file")."""
    try:
        # O_NONBLOCK: opening a FIFO for reading would otherwise wait for a writer forever; anything
        # that is not a regular file is refused before a byte is read
        fd = os.open(path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_BINARY", 0))
        with os.fdopen(fd, "rb") as fh:
            info = os.fstat(fh.fileno())
            if stat.S_ISDIR(info.st_mode):
                raise IsADirectoryError
            if not stat.S_ISREG(info.st_mode):
                raise error(f"is {_special_kind(info.st_mode)}, not {what} (only a regular file is read)",
                            file=path)
            raw = fh.read(limit + 1)
    except FileNotFoundError:
        raise error("no such file", file=path) from None
    except IsADirectoryError:
        raise error(f"is a directory, not {what}", file=path) from None
    except OSError as exc:
        raise error(f"cannot be read ({exc.strerror})", file=path) from None
    if len(raw) > limit:
        size = f"{limit // (1024 * 1024)} MiB" if limit % (1024 * 1024) == 0 else f"{limit // 1024} KiB"
        raise error(f"is larger than {size}; {what} is a few hundred lines at most", file=path)
    return raw, info


def _special_kind(mode: int) -> str:
    if stat.S_ISFIFO(mode):
        return "a named pipe (FIFO)"
    if stat.S_ISSOCK(mode):
        return "a socket"
    if stat.S_ISCHR(mode) or stat.S_ISBLK(mode):
        return "a device"
    return "a special file"


def decode_text(raw: bytes, path: str, error, what: str) -> str:
    """`raw` as UTF-8 text (a byte-order mark allowed); UTF-16, binary or other encodings refused."""
    if raw[:2] in (b"\xff\xfe", b"\xfe\xff"):
        raise error("is UTF-16 text; save it as UTF-8", file=path)
    if b"\x00" in raw:
        raise error(f"is a binary file, not {what}", file=path)
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise error(f"is not UTF-8 text (byte {exc.start})", file=path) from None
