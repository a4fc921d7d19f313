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


def test_json_site_layout_is_the_cut_lists_ropes_and_the_feed_coax_as_cut():
    """The JSON's `site_layout` (supports, anchor, span, ropes: issue 18) carries the same ropes the
    cut list cuts, a vertical on a mast has none; `feed.coax_length_m` is the cut list's feed coax
    (the run, the choke's turns and the pigtail), longer than the design's run."""
    seen = set()
    for path in sorted(DEMO.parent.glob("*.yaml")):
        design = load_design(path)
        data = json.loads(json.dumps(solve(design).to_dict()))
        layout, cut = data["site_layout"], {i["part"]: i["length_m"] for i in data["cut_list"]}
        if layout is None:
            assert design.site.orientation in ("vertical", "inverted") and not design.hung
        else:
            seen.add(layout["orientation"] + (" hung" if design.hung else ""))
            assert layout["orientation"] == design.site.orientation
            assert layout["ropes"] and all(cut[r["what"]] == r["length_m"] for r in layout["ropes"])
        assert data["feed"]["coax_length_m"] == cut["feed coax"] > design.feed.length_m
    assert {"horizontal", "sloper", "vertical hung"} <= seen
