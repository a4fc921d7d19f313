"""The Python API of DESIGN.md §6: `from buildsheet import load_design, solve`, and
`solution.to_dict()` is what `buildsheet solve --json` prints."""

from __future__ import annotations

import json
import pathlib

from buildsheet import load_design, solve
from buildsheet.cli import main

DEMO = pathlib.Path(__file__).resolve().parent.parent / "designs" / "oak-yard-20m.yaml"


def test_api_and_json_command_agree(capsys):
    solution = solve(load_design(DEMO))
    assert main(["solve", "--json", str(DEMO)]) == 0
    printed = json.loads(capsys.readouterr().out)
    assert printed == json.loads(json.dumps(solution.to_dict()))
    keys = {"name", "design_id", "frequency_hz", "band_hz", "dimensions_m", "cut_list", "hardware", "feed",
            "sweep", "band_swr2_hz", "band_swr15_hz", "voltage_open_end_v_rms", "voltage_open_end_v_peak",
            "current_short_a_rms", "efficiency", "sensitivity", "choke", "exposure"}
    assert keys <= set(printed)
    assert len(printed["sweep"]["frequency_hz"]) >= 201
