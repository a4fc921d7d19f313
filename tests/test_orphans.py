"""`handout`'s worker processes die with it (issue 15, finding 10): after SIGTERM or SIGKILL of the
main process (signal(7): neither runs any clean-up of a Python program that does not handle it), no
worker runs on. Linux only (the process table is read from /proc, proc(5))."""

from __future__ import annotations

import os
import pathlib
import signal
import subprocess
import sys
import time

import pytest

ROOT = pathlib.Path(__file__).resolve().parent.parent
DESIGNS = sorted((ROOT / "designs").glob("*.yaml"))

pytestmark = pytest.mark.skipif(not os.path.isdir("/proc/self") or (os.cpu_count() or 1) < 2,
                                reason="needs /proc and two cores (a one-core handout has no workers)")


def _children(pid: int) -> set[int]:
    found = set()
    for entry in os.listdir("/proc"):
        if not entry.isdigit():
            continue
        try:
            stat = pathlib.Path(f"/proc/{entry}/stat").read_text()
        except OSError:
            continue
        ppid = int(stat.rsplit(")", 1)[1].split()[1])
        if ppid == pid:
            found.add(int(entry))
    return found


def _alive(pid: int) -> bool:
    try:
        state = pathlib.Path(f"/proc/{pid}/stat").read_text().rsplit(")", 1)[1].split()[0]
    except OSError:
        return False
    return state != "Z"


@pytest.mark.parametrize("sig", [signal.SIGTERM, signal.SIGKILL])
def test_handout_workers_die_with_the_main_process(tmp_path, sig):
    # enough sheets that the workers are still busy when the main process is killed
    designs = []
    for k in range(4):
        for d in DESIGNS:
            copy = tmp_path / f"{d.stem}-{k}.yaml"
            copy.write_text(d.read_text().replace(f"name: {d.stem}", f"name: {d.stem}-{k}", 1))
            designs.append(str(copy))
    p = subprocess.Popen([sys.executable, "-m", "buildsheet", "handout", *designs, "-o",
                          str(tmp_path / "h.pdf"), "--quiet", "--date", "2025-01-01"],
                         stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    workers: set[int] = set()
    deadline = time.monotonic() + 60
    while time.monotonic() < deadline and len(workers) < 2 and p.poll() is None:
        workers |= _children(p.pid)
        time.sleep(0.05)
    assert workers, "no worker process appeared"
    time.sleep(0.3)
    p.send_signal(sig)
    p.wait(30)
    deadline = time.monotonic() + 10
    while time.monotonic() < deadline and any(_alive(w) for w in workers):
        time.sleep(0.1)
    left = [w for w in workers if _alive(w)]
    for w in left:      # do not leave them running if the test fails
        os.kill(w, signal.SIGKILL)
    assert not left, f"workers {left} ran on after {sig.name} of the main process"
    assert not (tmp_path / "h.pdf").exists()
