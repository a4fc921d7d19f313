"""The stacked (collinear) version end to end, without NEC (tests/test_stacked_nec.py has the NEC-2
acceptance): the demo design solves, its JSON carries the stacked figures, the line limit is refused
in one line, and designs without `stack:` keep their document IDs and dimensions."""

from __future__ import annotations

import json
import math
import pathlib

import pytest

from buildsheet import load_design, solve
from buildsheet.cli import main
from buildsheet.errors import DesignError

ROOT = pathlib.Path(__file__).resolve().parent.parent
DEMO = ROOT / "designs" / "water-tower-2m-stacked.yaml"


@pytest.fixture(scope="module")
def demo():
    return solve(load_design(str(DEMO)))


def test_demo_json_has_the_stacked_figures(demo, capsys):
    assert main(["solve", str(DEMO), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    k = data["stack"]
    assert k["phasing"] == "stub"
    # the phasing stub is a quarter wave of its air line less the bars' effects (jpole.design_stack):
    # c/(4 f) = 0.513 m at 146 MHz (air line, velocity factor about 1)
    assert 0.45 < k["phasing_m"] < 0.513
    assert k["element_m"] == pytest.approx(data["dimensions_m"]["radiator"])
    assert k["voltage_phasing_open_v_peak"] == pytest.approx(math.sqrt(2) * k["voltage_phasing_open_v_rms"])
    assert k["voltage_phasing_open_v_rms"] > 0 and k["current_phasing_short_a_rms"] > 0
    assert 0.5 < k["gain_over_single_db"] < 3.0
    assert data["radiation"]["max_gain_dbi"] == pytest.approx(k["single_max_gain_dbi"]
                                                              + k["gain_over_single_db"])
    cut = {c["part"]: c for c in data["cut_list"]}
    assert cut["radiator"]["quantity"] == 2 and cut["short bar"]["quantity"] == 2
    assert cut["phasing stub"]["length_m"] > k["phasing_m"]
    assert any(h["item"].startswith("gap insulator") for h in data["hardware"])


def test_single_designs_keep_their_ids_and_have_no_stack():
    d = load_design(str(ROOT / "designs" / "oak-yard-20m.yaml"))
    assert d.stack is None and "stack" not in d.canonical()
    assert solve(d).to_dict()["stack"] is None


def test_a_high_impedance_line_is_refused_with_the_reason(tmp_path):
    text = DEMO.read_text().replace("{spacing: 20 mm, conductor: 4 mm, dielectric: air}",
                                    "{spacing: 50 mm, conductor: 14 AWG, dielectric: air}")
    path = tmp_path / "wide.yaml"
    path.write_text(text)
    with pytest.raises(DesignError) as exc:
        solve(load_design(str(path)))
    assert exc.value.key == "stub.line" and "Z0^2/50" in str(exc.value)


def test_fit_refuses_a_stacked_design_in_one_line(capsys):
    """`fit` models the single version only: a stacked design is refused, naming `stack`."""
    sweep = ROOT / "designs" / "oak-yard-20m-sweep.s1p"
    assert main(["fit", str(DEMO), str(sweep)]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and "`stack`" in err[0]
