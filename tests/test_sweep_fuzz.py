"""Fuzzing the sweep readers and `fit` (issue 15, finding 6): whatever a sweep file holds, `fit` and
`fit --json` on a demo design end in exit 0 with finite numbers (the JSON parses without NaN or
Infinity, the text prints no "nan" or "inf") or exit 2 with one line naming a file; never exit 1,
a traceback or a Python warning. The oracle is that contract (DESIGN.md §6), not numbers.

Inputs: the demo sweep (Touchstone) and the same points as a CSV, with one to three mutations: line
ends, frequency unit or scale, a value replaced (negative, zero, huge, tiny, NaN text), |S11| pushed
above 1, a line dropped, duplicated or swapped, a very long field, random text spliced in, the option
line changed. The ci profile runs SWEEP_SHARE of the profile's examples; the long profile
(bench/fuzz_long.py) runs 500 or more.
"""

from __future__ import annotations

import json
import math
import pathlib
import re
import tempfile

from hypothesis import event, given, settings
from hypothesis import strategies as st

from tests.test_fuzz import _finite_numbers, _reject_constant, _run

ROOT = pathlib.Path(__file__).resolve().parent.parent
OAK = ROOT / "designs" / "oak-yard-20m.yaml"
DEMO_SWEEP = (ROOT / "designs" / "oak-yard-20m-sweep.s1p").read_text()

#: a fit takes about a second: a small share of the profile's examples
SWEEP_SHARE = 0.08
SWEEP_FUZZ = settings(max_examples=max(3, int(settings.default.max_examples * SWEEP_SHARE)))


def _demo_records() -> list[tuple[float, float, float]]:
    rows = []
    for line in DEMO_SWEEP.splitlines():
        line = line.partition("!")[0].strip()
        if line and not line.startswith("#"):
            rows.append(tuple(float(t) for t in line.split()))
    return rows


_RECORDS = _demo_records()
_NUMBERS = st.sampled_from(["0", "-0", "-50", "-1e-3", "1e300", "-1e300", "1e-300", "nan", "inf", "-inf",
                            "1e308", "2", "1.0000001", "1e5", "x", "", "1,5", "0x10", "1e", "+", "50"])


def _csv_text(rows, factor_name, factor, end, option) -> str:
    head = f"{factor_name},r_ohm,x_ohm"
    lines = [head]
    for f, a, b in rows:
        z = 50 * (1 + a * complex(math.cos(math.radians(b)), math.sin(math.radians(b)))) / (
            1 - a * complex(math.cos(math.radians(b)), math.sin(math.radians(b))))
        lines.append(f"{f * 1e6 / factor!r},{z.real!r},{z.imag!r}")
    return end.join(lines) + end


@st.composite
def sweep_files(draw):
    """(extension, bytes) of a sweep: the demo's points, mutated."""
    rows = [list(r) for r in _RECORDS]
    kind = draw(st.sampled_from(["s1p", "csv"]))
    option = "# MHz S MA R 50"
    for _ in range(draw(st.sampled_from([1, 1, 2, 3]))):
        op = draw(st.sampled_from(["value", "value", "scale", "above one", "drop", "duplicate", "swap",
                                   "option", "few", "unit"]))
        i = draw(st.integers(0, len(rows) - 1)) if rows else 0
        if op == "value" and rows:
            rows[i][draw(st.integers(0, 2))] = draw(_NUMBERS)
        elif op == "scale":
            factor = draw(st.sampled_from([1e-300, 1e-9, -1.0, 0.0, 1e3, 1e9, 1e300]))
            col = draw(st.integers(0, 2))
            rows = [[r[0], r[1], r[2]] for r in rows]
            for r in rows:
                try:
                    r[col] = float(r[col]) * factor
                except (TypeError, ValueError):
                    pass
        elif op == "above one":
            for r in rows[draw(st.integers(0, len(rows))):]:
                r[1] = draw(st.sampled_from([1.0, 1.01, 1.2, 5.0, 1e6]))
        elif op == "drop" and rows:
            del rows[i]
        elif op == "duplicate" and rows:
            rows.insert(i, list(rows[i]))
        elif op == "swap" and len(rows) > 1:
            rows[i], rows[i - 1] = rows[i - 1], rows[i]
        elif op == "few":
            rows = rows[:draw(st.integers(0, 8))]
        elif op == "option":
            option = draw(st.sampled_from(["# GHz S MA R 50", "# Hz S MA R 50", "# MHz S DB R 50",
                                           "# MHz S RI R 50", "# MHz Z RI R 50", "# MHz Y RI R 50",
                                           "# MHz S MA R 0", "# MHz S MA R -50", "# MHz S MA R 1e300",
                                           "# kHz S MA", "# MHz H MA", "", "[Version] 2.0",
                                           "# MHz S MA R 50 R 75"]))
        else:
            option = option.replace("MHz", draw(st.sampled_from(["GHz", "Hz", "kHz"])))
    end = draw(st.sampled_from(["\n", "\r\n", "\r"]))
    if kind == "s1p":
        text = option + end + end.join(" ".join(str(v) for v in r) for r in rows) + end
    else:
        try:
            numeric = [tuple(float(v) for v in r) for r in rows]
            text = _csv_text(numeric, "frequency_hz", 1.0, end, option)
        except (TypeError, ValueError, ZeroDivisionError, OverflowError):
            text = "frequency_mhz,r_ohm,x_ohm" + end + end.join(",".join(str(v) for v in r) for r in rows) + end
    if draw(st.integers(0, 9)) == 0:
        at = draw(st.integers(0, len(text)))
        text = text[:at] + draw(st.sampled_from(["\x00", "\ufeff", "\"", ",,,", "1" * 140000, "é", "\t"])) + \
            text[at:]
    return kind, text.encode("utf-8", "surrogatepass")


def fit_contract(kind: str, content: bytes) -> str:
    """Run fit --json and fit on the oak design with `content` as the sweep and assert the contract;
    returns how the case ended."""
    with tempfile.TemporaryDirectory() as tmp:
        path = pathlib.Path(tmp) / f"sweep.{kind}"
        path.write_bytes(content)
        ends = []
        for extra in (["--json"], []):
            status, out, err, caught = _run(["fit", str(OAK), str(path), *extra])
            assert not caught, f"fit {extra} raised warnings: {caught[:3]}"
            assert status in (0, 2), f"fit {extra} gave exit {status}: {err}"
            if status == 2:
                lines = err.strip().splitlines()
                assert len(lines) == 1 and lines[0].startswith("error: ") and "Traceback" not in err, err
                ends.append("refused")
                continue
            if extra:
                _finite_numbers(json.loads(out, parse_constant=_reject_constant))
            else:
                assert not re.search(r"\b(nan|inf)\b", out, re.I), out
            ends.append("fitted")
        assert ends[0] == ends[1], ends
        return ends[0]


@given(sweep_files())
@SWEEP_FUZZ
def test_random_sweeps_fit_or_are_refused(case):
    event(fit_contract(*case))
