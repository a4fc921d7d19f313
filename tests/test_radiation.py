"""The radiation figures of a solved design (buildsheet.physics.radiation) and where they appear: the
Solution, `solve`, the JSON and the pattern figure. Their accuracy against NEC-2 is in
tests/test_radiation_nec.py; here: energy conservation (Poynting's theorem: the gain, relative to
the power delivered, integrates over the space wave's hemisphere to the radiated share of that
power, the efficiency) and the consistency of the reported figures."""

from __future__ import annotations

import json
import math
from pathlib import Path

import numpy as np
import pytest

from buildsheet import load_design
from buildsheet.cli import main
from buildsheet.drawing import polar
from buildsheet.physics import jpole, pattern, radiation
from buildsheet.solver import antenna_model, solve, solved_antenna

ROOT = Path(__file__).resolve().parent.parent
DEMOS = sorted((ROOT / "designs").glob("*.yaml"))


@pytest.fixture(scope="module")
def solved():
    return {p.stem: (load_design(str(p)), solve(load_design(str(p)))) for p in DEMOS}


@pytest.mark.parametrize("name", [p.stem for p in DEMOS])
def test_gain_integrates_to_the_efficiency(solved, name):
    """Poynting: (1/4 pi) times the gain integrated over the upper hemisphere (a 1-degree midpoint
    grid, independent of the Gauss-Legendre quadrature the module normalises with) is the
    efficiency, radiated / delivered. Within 1 % of it."""
    d, s = solved[name]
    ant = solved_antenna(d)         # with its stack, for the stacked version
    prep = jpole.at_frequency(d.frequency_hz, ant)
    r = s.radiation
    wires = jpole.current_wires(prep, s.dimensions.radiator, s.dimensions.stub, 1.0)
    th = np.radians(np.arange(0.25, 90, 0.5))[:, None]
    ph = np.radians(np.arange(0.5, 360, 1.0))[None, :]
    # the gain relative to p_in = the power that makes the module's maximum its gain
    el, az = np.radians(r.takeoff_deg), np.radians(r.azimuth_deg)
    e_th, e_ph = pattern.far_field(wires, d.frequency_hz, np.pi / 2 - el, az, ant.ground_kind,
                                   ant.ground_eps_r, ant.ground_sigma)
    u_max = float(np.abs(e_th) ** 2 + np.abs(e_ph) ** 2)
    e_th, e_ph = pattern.far_field(wires, d.frequency_hz, th, ph, ant.ground_kind, ant.ground_eps_r,
                                   ant.ground_sigma)
    g = (np.abs(e_th) ** 2 + np.abs(e_ph) ** 2) / u_max * 10 ** (r.max_gain_dbi / 10)
    avg = float(np.sum(g * np.sin(th)) * np.radians(0.5) * np.radians(1.0) / (4 * np.pi))
    assert avg == pytest.approx(s.efficiency, rel=0.01)


@pytest.mark.parametrize("name", [p.stem for p in DEMOS])
def test_cuts_pass_through_the_maximum(solved, name):
    """The elevation cut at the take-off angle and the azimuth cut's largest value are the maximum
    gain (within the cuts' steps: 0.1 dB), and nothing in either cut exceeds it."""
    _, s = solved[name]
    r = s.radiation
    k = int(np.argmin(np.abs(r.elevation_deg - r.takeoff_deg)))
    assert r.elevation_gain_dbi[k] == pytest.approx(r.max_gain_dbi, abs=0.1)
    assert np.max(r.azimuth_gain_dbi) == pytest.approx(r.max_gain_dbi, abs=0.1)
    assert np.max(r.elevation_gain_dbi) <= r.max_gain_dbi + 0.01
    assert 0.0 <= r.takeoff_deg <= 90.0


def test_a_radiator_twice_as_lossy_has_1_5_db_less_gain(solved):
    """Gain = directivity x efficiency (IEEE Std 145-2013, 2.174): the same currents with half the
    efficiency give 10 log10(2) = 3.01 dB less gain, the same take-off angle."""
    d, s = solved["oak-yard-20m"]
    prep = jpole.at_frequency(d.frequency_hz, antenna_model(d))
    a = radiation.radiation(prep, s.dimensions.radiator, s.dimensions.stub, s.efficiency)
    b = radiation.radiation(prep, s.dimensions.radiator, s.dimensions.stub, s.efficiency / 2)
    assert a.max_gain_dbi - b.max_gain_dbi == pytest.approx(10 * math.log10(2), abs=1e-6)
    assert a.takeoff_deg == pytest.approx(b.takeoff_deg, abs=1e-9)


def test_solve_prints_and_json_carries_the_radiation(capsys):
    path = str(ROOT / "designs" / "oak-yard-20m.yaml")
    assert main(["solve", "--json", path]) == 0
    data = json.loads(capsys.readouterr().out)["radiation"]
    assert data["gain_reference"] == "power delivered to the tap"
    assert len(data["elevation_cut"]["elevation_deg"]) == len(data["elevation_cut"]["gain_dbi"]) > 90
    assert len(data["azimuth_cut"]["azimuth_deg"]) == len(data["azimuth_cut"]["gain_dbi"]) >= 180
    assert main(["solve", path]) == 0
    out = capsys.readouterr().out
    assert f"maximum gain {data['max_gain_dbi']:.1f} dBi" in out
    assert f"take-off angle {data['takeoff_deg']:.0f}\u00b0" in out


def test_plot_puts_the_maximum_on_the_outer_rings_scale():
    """The polar plot's radius is linear in dB: a cut whose gain is the outer ring's value at one
    angle reaches the outer ring there, and one 30 dB lower sits at the centre."""
    el = np.arange(0.0, 181.0, 1.0)
    g = np.where(el == 30.0, 5.0, -25.0)
    az = np.arange(0.0, 360.0, 2.0)
    d = polar.pattern_plot(el, g, az, np.full_like(az, -25.0), 5.0, 30.0, 0.0, False, 500.0, "t")
    curve = next(p for p in d.primitives() if getattr(p, "width", None) == polar.CURVE_WIDTH)
    pts = np.array(curve.points)
    centre = pts[0]                             # elevation 0 is at the centre (-25 dBi)
    r = np.hypot(*(pts - centre).T)
    r_max = (500.0 - 3 * polar.PAD) / 4 - polar.LABEL_ROOM - 4.0
    assert r[30] == pytest.approx(r.max())
    assert r[30] == pytest.approx(r_max, rel=0.01)
    assert np.degrees(np.arctan2(centre[1] - pts[30][1], pts[30][0] - centre[0])) == pytest.approx(30.0)


@pytest.mark.parametrize("name", [p.stem for p in DEMOS])
def test_exposure_gain_is_never_below_a_half_wave_dipole(solved, name):
    """The exposure estimate uses the antenna's own free-space directivity where it exceeds the
    2.15 dBi of a half-wave dipole (OET Bulletin 65's usual figure), never less, and names which it
    used; the distance grows as the square root of the gain (far-field formula, OET 65 eq. 3)."""
    from buildsheet.physics import exposure as exposure_physics
    from buildsheet.solver import HALF_WAVE_GAIN_DBI

    d, s = solved[name]
    e = s.exposure
    prep = jpole.at_frequency(d.frequency_hz, solved_antenna(d))
    directivity = radiation.free_space_directivity_dbi(prep, s.dimensions.radiator, s.dimensions.stub)
    assert e.gain_dbi == pytest.approx(max(HALF_WAVE_GAIN_DBI, directivity), abs=1e-12)
    assert e.gain_source == ("the antenna's free-space directivity" if directivity > HALF_WAVE_GAIN_DBI
                             else "a half-wave dipole's gain")
    dipole_eirp = e.eirp_w / 10 ** ((e.gain_dbi - HALF_WAVE_GAIN_DBI) / 10)
    dipole = float(exposure_physics.compliance_distance(dipole_eirp, e.limit_general_w_m2))
    assert e.distance_general_m == pytest.approx(dipole * 10 ** ((e.gain_dbi - HALF_WAVE_GAIN_DBI) / 20),
                                                 rel=1e-9)


def test_mirror_image_tie_does_not_depend_on_the_last_bit(solved):
    """The wires lie in the x-z plane, so the gain at azimuths a and -a is the same but for rounding:
    the maximum is taken at the lower azimuth whichever of the two rounds higher (a result that
    flipped with the last bit made the sheet's bytes depend on memory alignment)."""
    g = np.array([[0.5, 1.0, 0.7, 1.0 + 4e-16]])
    assert pattern.first_max(g) == (0, 1)
    assert pattern.first_max(g[:, ::-1]) == (0, 0)
    for name in ("oak-yard-20m", "ridge-camp-10m"):       # horizontal: broadside at 90 or 270
        assert 0.0 < solved[name][1].radiation.azimuth_deg < 180.0
