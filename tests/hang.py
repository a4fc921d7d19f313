"""A time limit for in-process command runs in tests: a command that does not answer within the limit
is a hang, reported as such rather than waited on forever. Test helper only."""

from __future__ import annotations

import contextlib
import signal


class Hang(BaseException):
    """Raised by the alarm; a BaseException, so main()'s catch-all cannot turn it into exit 1."""


@contextlib.contextmanager
def time_limit(seconds: int):
    """Raise Hang in the main thread if the block runs longer than `seconds` (SIGALRM, Unix)."""
    def alarm(signum, frame):
        raise Hang(f"no answer within {seconds} s (a hang)")

    previous = signal.signal(signal.SIGALRM, alarm)
    signal.alarm(seconds)
    try:
        yield
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, previous)
