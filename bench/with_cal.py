"""Run pytest with a candidate's constants in jpole.CAL (bench/data/cal-candidates), for the tests
that judge a candidate before it is adopted (tests/test_jpole_nec.py: SWR at f0, 2:1 overlap,
tuning rates and losses against NEC-2; it runs NEC-2, about 40 s). Run with the venv's python:

  python bench/with_cal.py CAND.json [pytest arguments, default tests/test_jpole_nec.py]

The constants are set before the tests are collected; the functions of jpole read CAL when called.
"""

import dataclasses
import json
import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

import pytest  # noqa: E402

from buildsheet.physics import jpole  # noqa: E402


def main(argv):
    stored = json.loads(Path(argv[0]).read_text())
    jpole.CAL = jpole.Calibration(**{**dataclasses.asdict(jpole.CAL), **stored.get("calibration", stored)})
    print("jpole.CAL =", jpole.CAL)
    return pytest.main(["-q", "-p", "no:cacheprovider"] + (argv[1:] or ["tests/test_jpole_nec.py"]))


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
