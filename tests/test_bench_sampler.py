"""The acceptance sampler of bench/nec_study.py (`accept OUT N START envelope`) draws only designs that
`solve` itself takes without an envelope warning (solver.envelope_warnings), so the sample judged
against NEC-2 and the envelope the product claims cannot differ (issue 13: envelope_case alone had put
D/d = 4 UHF stubs at 0.028 wavelength, beyond the lambda/40 the solver warns about)."""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT / "bench"))

ns = pytest.importorskip("nec_study")

from buildsheet import solve  # noqa: E402
from buildsheet.design import design_from_text  # noqa: E402


def test_design_text_is_the_bench_design():
    """The design file the sampler asks `solve` about carries the bench design's own numbers."""
    case = ns.envelope_case(12003)
    d = design_from_text(ns.design_text(case))
    assert d.frequency_hz == pytest.approx(case.f0, rel=1e-9)
    assert d.stub.spacing_m == pytest.approx(case.spacing, rel=1e-6)
    assert d.stub.conductor_diameter_m == pytest.approx(case.stub_d, rel=1e-6)
    assert d.radiator.diameter_m == pytest.approx(case.wire_d, rel=1e-6)
    assert d.site.orientation == case.orientation


def test_a_design_beyond_the_envelope_is_drawn_again():
    """Seed 11004: 432 MHz, 4.8 mm stub conductors widened to 4 diameters, 19.2 mm = 0.028 wavelength;
    the solver warns, so the sampler draws again (deterministically)."""
    first = ns.envelope_case(11004)
    assert solve(design_from_text(ns.design_text(first))).warnings
    case, attempt = ns.accepted_case(11004)
    assert attempt >= 1 and ns.accepted_case(11004) == (case, attempt)
    assert solve(design_from_text(ns.design_text(case))).warnings == ()


def test_sample_is_inside_the_solver_envelope():
    for seed in range(12000, 12040):
        case, _ = ns.accepted_case(seed)
        assert solve(design_from_text(ns.design_text(case))).warnings == (), seed
