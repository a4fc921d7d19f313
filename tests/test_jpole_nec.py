"""Acceptance of the compact J-pole model (buildsheet.physics.jpole) against NEC-2 (PyNEC 2.3.4).

For designs spread over 1.8-450 MHz (HF bands, heights, free-space / perfect / real average ground,
a sloper, a 600-ohm-class open-wire stub, 6 m, 2 m and 70 cm pipe/rod verticals; stubs air-insulated,
since NEC-2 wires carry no dielectric) the model chooses the radiator, stub and tap; NEC-2 then
analyses a wire model built from those dimensions (tests/necref.py, meshed per DESIGN.md §7) and:
  - SWR (50 ohm) at the design frequency <= 1.15 for thin-wire designs (the issue's acceptance),
    <= 2.0 for pipe/rod designs (spacing under ~10 conductor radii: NEC-2 itself is only indicative
    there, DESIGN.md §7; their reference is bench/fdtd_ref.py);
  - thin wire: the 2:1 bands of NEC and of the model overlap with intersection/union >= 0.85, and
    each 2:1 edge lies within 10 % of NEC's 2:1 width of NEC's edge.
The NEC-2 mesh is the corrected one of DESIGN.md §7, proven by tests/test_nec_harness.py.
"""

from __future__ import annotations

import sys
from dataclasses import dataclass
from pathlib import Path

import numpy as np
import pytest

sys.path.insert(0, str(Path(__file__).parent))
import necref  # noqa: E402

from buildsheet.physics import jpole  # noqa: E402
from buildsheet.physics.lines import Line, swr  # noqa: E402

CU = 5.8e7          # annealed copper, S/m (CHECK_VALUES constants, [M])
AVERAGE = dict(ground_kind="real", ground_eps_r=13.0, ground_sigma=0.005)
PIPE_HALF_IN = 0.0159   # 1/2-in copper pipe OD, m (CHECK_VALUES §1a)


@dataclass(frozen=True)
class Case:
    name: str
    f0: float
    band: tuple[float, float]
    wire_d: float
    stub_d: float
    spacing: float
    orientation: str
    height: float
    ground: dict
    slope: float = 0.0
    wire_sigma: float = CU
    stub_sigma: float = CU

    @property
    def pipe(self) -> bool:
        """Spacing under ~10 conductor radii: NEC-2 is indicative only (DESIGN.md §7)."""
        return self.spacing < 10 * self.stub_d / 2

    def antenna(self) -> jpole.Antenna:
        return jpole.Antenna(
            stub_line=Line.two_wire(self.spacing, self.stub_d, self.stub_sigma),
            spacing=self.spacing, stub_conductor_d=self.stub_d, stub_sigma=self.stub_sigma,
            wire_d=self.wire_d, wire_sigma=self.wire_sigma, wire_vf=1.0,
            orientation=self.orientation, height=self.height, slope=self.slope, **self.ground)

    def nec_dims(self, L, S, T) -> necref.JPoleDims:
        g = self.ground
        ground = necref.Ground(g["ground_kind"], g.get("ground_eps_r", 13.0), g.get("ground_sigma", 0.005))
        return necref.JPoleDims(L, S, T, self.spacing, self.wire_d, self.stub_d, self.orientation,
                                self.height, self.slope, ground, self.wire_sigma, self.stub_sigma)


AWG = necref.awg_diameter
FREE = dict(ground_kind="free-space")
PERFECT = dict(ground_kind="perfect")

# Held out: none of these designs was used to fit jpole.CAL (bench/nec_study.py fits random designs).
CASES = (
    Case("40m-horiz-12m-avg", 7.150e6, (7.0e6, 7.3e6), AWG(14), AWG(14), 0.025,
         "horizontal", 12.0, AVERAGE),
    Case("20m-horiz-10m-avg", 14.175e6, (14.0e6, 14.35e6), AWG(14), AWG(14), 0.025,
         "horizontal", 10.0, AVERAGE),
    Case("20m-free", 14.175e6, (14.0e6, 14.35e6), AWG(14), AWG(14), 0.025,
         "horizontal", 20.0, FREE),
    Case("15m-600ohm-8m-perfect", 21.200e6, (21.0e6, 21.45e6), AWG(12), AWG(12), 0.1524,
         "horizontal", 8.0, PERFECT),
    Case("10m-sloper-30deg-avg", 28.400e6, (28.0e6, 29.7e6), AWG(14), AWG(14), 0.025,
         "sloper", 10.0, AVERAGE, slope=np.radians(30)),
    Case("6m-horiz-6m-avg", 50.125e6, (50.0e6, 54.0e6), AWG(12), AWG(14), 0.025,
         "horizontal", 6.0, AVERAGE),
    Case("2m-pipe-vert-3m-avg", 146.0e6, (144.0e6, 148.0e6), PIPE_HALF_IN, PIPE_HALF_IN, 0.050,
         "vertical", 3.0, AVERAGE),
    Case("70cm-rod-vert-free", 446.0e6, (420.0e6, 450.0e6), 0.00635, 0.00635, 0.025,
         "vertical", 5.0, FREE),
)


def model_design(case: Case):
    ant = case.antenna()
    L = jpole.resonant_radiator_length(case.f0, ant)
    S, T = jpole.solve_match(case.f0, 50.0, ant, L)
    return ant, L, S, T


def band_2to1(f, s):
    """[low, high] where SWR <= 2 around the minimum (linear interpolation), or None."""
    i = int(np.argmin(s))
    if s[i] > 2:
        return None
    lo, hi = i, i
    while lo > 0 and s[lo - 1] <= 2:
        lo -= 1
    while hi < len(s) - 1 and s[hi + 1] <= 2:
        hi += 1
    f_lo = f[lo] if lo == 0 else np.interp(2.0, [s[lo], s[lo - 1]], [f[lo], f[lo - 1]])
    f_hi = f[hi] if hi == len(s) - 1 else np.interp(2.0, [s[hi], s[hi + 1]], [f[hi], f[hi + 1]])
    return float(f_lo), float(f_hi)


def edge_error(nec, model):
    """The larger distance of the model's 2:1 edges from NEC's, in NEC's 2:1 widths (the acceptance's
    edge figure; assert_bands_agree holds each edge to 0.1)."""
    return max(abs(nec[0] - model[0]), abs(nec[1] - model[1])) / (nec[1] - nec[0])


def overlap(a, b):
    if a is None or b is None:
        return 0.0
    inter = max(0.0, min(a[1], b[1]) - max(a[0], b[0]))
    union = max(a[1], b[1]) - min(a[0], b[0])
    return inter / union


def compare(case: Case, n_nec: int = 41):
    """Model dimensions -> NEC SWR at f0, both 2:1 bands and their overlap."""
    ant, L, S, T = model_design(case)
    span = 0.06 if case.pipe or case.f0 > 100e6 else 0.035
    f_nec = case.f0 * np.linspace(1 - span, 1 + span, n_nec)
    f_all = np.concatenate([[case.f0], f_nec])
    nec = necref.jpole_model(case.nec_dims(L, S, T), f_all)
    swr_nec = swr(nec.z_feed, 50.0)
    f_mod = case.f0 * np.linspace(1 - span, 1 + span, 401)
    swr_mod = swr(jpole.feed_impedance(f_mod, ant, L, S, T), 50.0)
    b_nec, b_mod = band_2to1(f_nec, swr_nec[1:]), band_2to1(f_mod, swr_mod)
    return dict(L=L, S=S, T=T, z_nec=nec.z_feed[0], swr=float(swr_nec[0]),
                band_nec=b_nec, band_model=b_mod, overlap=overlap(b_nec, b_mod))


THIN_CASES = [c for c in CASES if not c.pipe]


@pytest.fixture(scope="module")
def results():
    return {c.name: compare(c) for c in CASES}


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_nec_swr_at_design_frequency(case, results):
    r = results[case.name]
    limit = 2.0 if case.pipe else 1.15
    assert r["swr"] <= limit, f"{case.name}: NEC SWR {r['swr']:.3f} (Z {r['z_nec']:.1f}) for {r}"


@pytest.mark.parametrize("case", THIN_CASES, ids=[c.name for c in THIN_CASES])
def test_nec_and_model_2to1_bands_overlap(case, results):
    """Thin wire only: for pipe and rod (spacing under ~10 radii) NEC-2 is no reference for the band
    (DESIGN.md §7: for fat lines it reads the 2:1 band about 30 % wider than a full-wave method);
    bench/fdtd_ref.py is their reference."""
    assert_bands_agree(case.name, results[case.name])


def assert_bands_agree(name: str, r: dict) -> None:
    """The thin-wire band acceptance on a compare() result: the 2:1 bands overlap with
    intersection/union >= 0.85 and each model edge lies within 10 % of NEC's 2:1 width of NEC's."""
    assert r["overlap"] >= 0.85, f"{name}: bands NEC {r['band_nec']} model {r['band_model']}"
    (n_lo, n_hi), (m_lo, m_hi) = r["band_nec"], r["band_model"]
    width = n_hi - n_lo
    assert abs(m_lo - n_lo) <= 0.1 * width and abs(m_hi - n_hi) <= 0.1 * width, \
        f"{name}: bands NEC {r['band_nec']} model {r['band_model']}"


HORIZONTAL = [c for c in CASES if c.orientation == "horizontal"]


@pytest.mark.parametrize("case", HORIZONTAL, ids=[c.name for c in HORIZONTAL])
def test_radiator_is_cut_where_nec_puts_the_dipole_resonance(case):
    """The radiator is cut to its natural resonance as a free half-wave wire: where the same wire,
    centre-fed at the same height over the same ground, has X = 0 (the model: induced-EMF end
    effect plus its image). NEC-2 finds that length (the method of CHECK_VALUES §3d, here at
    height) within 0.5 % of the model's radiator. (The end-fed radiator's load on the stub is not
    resistive there, CHECK_VALUES §3d and DESIGN.md §7; the 2-D stub/tap solve takes that up, and
    the SWR tests above check the result.)"""
    from scipy.optimize import brentq
    L = jpole.resonant_radiator_length(case.f0, case.antenna())
    g = case.ground
    ground = necref.Ground(g["ground_kind"], g.get("ground_eps_r", 13.0), g.get("ground_sigma", 0.005))
    x = lambda length: necref.dipole(length, case.wire_d, [case.f0], height=case.height, ground=ground,
                                     sigma=case.wire_sigma).z_feed[0].imag
    l_nec = brentq(x, 0.95 * L, 1.05 * L, xtol=1e-5 * L)
    assert L == pytest.approx(l_nec, rel=0.005), f"{case.name}: model {L:.4f} m, NEC dipole {l_nec:.4f} m"


# --- Tuning rates against NEC-2 finite differences (DESIGN.md §7, "Sensitivities for tuning") ---

THIN = [c for c in CASES if not c.pipe]


def _nec_dip(case: Case, L, S, T, centre, width, like):
    """NEC-2's SWR dip (Hz): |rho|^2 on 9 frequencies over centre +/- width/2, then the vertex of
    the parabola through the least and its neighbours (a smooth minimum is quadratic near its
    bottom). Meshed like the dimensions `like`, at 1.05 f0 (necref.jpole_wires: a finite
    difference needs the same mesh on both sides)."""
    f = centre + width * np.linspace(-0.5, 0.5, 9)
    z = necref.jpole_model(case.nec_dims(L, S, T), f, f_mesh=1.05 * case.f0,
                           like=case.nec_dims(*like)).z_feed
    rho2 = np.abs((z - 50) / (z + 50)) ** 2
    i = int(np.clip(np.argmin(rho2), 1, len(f) - 2))
    a, b, c = rho2[i - 1:i + 2]
    return f[i] + 0.5 * (a - c) / (a - 2 * b + c) * (f[1] - f[0])


def tuning_rates(cases=None):
    """Model rates and NEC-2 central differences on the thin-wire acceptance designs: the dip per
    metre of radiator (moves of 1 % of it) and per move of the short (tap clamps in place; 20 % of
    the tap distance), R per tap move and X per short move (5 % of the tap distance)."""
    out = {}
    for case in THIN if cases is None else cases:
        ant, L, S, T = model_design(case)
        sens = jpole.sensitivities(case.f0, ant, L, S, T)
        width = 0.012 * case.f0
        dip = lambda L_, S_, T_: _nec_dip(case, L_, S_, T_, case.f0, width, (L, S, T))
        dl, ds = 0.01 * L, 0.2 * T
        nec_dip_l = (dip(L + dl, S, T) - dip(L - dl, S, T)) / (2 * dl)
        nec_dip_s = (dip(L, S - ds, T - ds) - dip(L, S + ds, T + ds)) / (2 * ds)
        h = 0.05 * T
        z = lambda S_, T_: necref.jpole_model(case.nec_dims(L, S_, T_), [case.f0], f_mesh=1.05 * case.f0,
                                              like=case.nec_dims(L, S, T)).z_feed[0]
        nec_r_tap = (z(S, T + h).real - z(S, T - h).real) / (2 * h)
        nec_x_short = (z(S - h, T - h).imag - z(S + h, T + h).imag) / (2 * h)
        out[case.name] = dict(
            dip_radiator=(sens.dip_hz_per_m_radiator, nec_dip_l),
            dip_short=(sens.dip_hz_per_m_short, nec_dip_s),
            r_tap=(sens.ohm_per_m_tap, nec_r_tap),
            x_short=(sens.ohm_per_m_short, nec_x_short))
    return out


@pytest.fixture(scope="module")
def rates():
    return tuning_rates()


@pytest.mark.parametrize("case", THIN, ids=[c.name for c in THIN])
@pytest.mark.parametrize("rate", ["dip_radiator", "dip_short", "r_tap", "x_short"])
def test_tuning_rates_match_nec_finite_differences(case, rate, rates):
    """Issue acceptance: the rates the tuning table prints are within 15 % of NEC-2's. The dip's
    shift per move of the short is printed only where the short moves the dip usefully
    (sheet.SHORT_DIP_FRACTION); where NEC's rate moves the dip by under 0.1 % of f0 over 30 % of
    the tap distance (the 600-ohm line here: the short mostly spoils the match there), the model
    need only agree that it is small."""
    model, nec = rates[case.name][rate]
    if rate == "dip_short":
        _, _, _, T = model_design(case)
        if abs(nec) * 0.3 * T < 1e-3 * case.f0:
            assert abs(model) * 0.3 * T < 2e-3 * case.f0, f"{case.name}: model {model:.4g}, NEC {nec:.4g}"
            return
    assert model == pytest.approx(nec, rel=0.15), f"{case.name} {rate}: model {model:.4g}, NEC {nec:.4g}"


# --- Efficiency with ground loss against NEC-2 (DESIGN.md §7, loss budget) ---

@pytest.mark.parametrize("case", THIN, ids=[c.name for c in THIN])
def test_efficiency_with_ground_loss_matches_nec(case):
    """Efficiency = radiated (space wave) / delivered to the tap, ground loss included, against
    NEC-2 (Sommerfeld-Norton ground, copper wires, the model's dimensions): NEC's radiated fraction
    from its average gain over the upper hemisphere, divided by its own energy balance on the same
    structure with lossless wires in free space (0.955 on these designs where it should be 1,
    tests/test_nec_harness.py: the power NEC-2 loses in its own accounting is not the antenna's).
    Within 5 points (issue acceptance)."""
    from dataclasses import replace
    ant, L, S, T = model_design(case)
    model = jpole.state_at(case.f0, ant, L, S, T, 100.0).efficiency
    d = case.nec_dims(L, S, T)
    raw = necref.jpole_model(d, [case.f0], pattern_step_deg=5.0).average_gain[0]
    balance = necref.jpole_model(replace(d, ground=necref.Ground(), wire_sigma=None, stub_sigma=None),
                                 [case.f0], pattern_step_deg=5.0).average_gain[0]
    assert model == pytest.approx(raw / balance, abs=0.05), f"model {model:.3f}, NEC {raw:.3f} / {balance:.3f}"


@pytest.mark.parametrize("case", THIN, ids=[c.name for c in THIN])
def test_loss_budget_parts_match_nec(case):
    """The loss budget's parts against NEC-2 in free space (copper, the model's dimensions): NEC's
    loss in the radiator wire or the stub is the radiated fraction lost when only that part is made
    of copper (LD 5), against NEC's own lossless balance (see above). Stub conductors within 15 %
    (measured 0.1-12 % with CAL c5); the radiator wire, a 0.6-2 % item, within 0.7 points (measured up
    to 0.34)."""
    from dataclasses import replace
    ant, L, S, T = model_design(case)
    ant = replace(ant, ground_kind="free-space")
    st = jpole.state_at(case.f0, ant, L, S, T, 100.0)
    d = replace(case.nec_dims(L, S, T), ground=necref.Ground())
    gain = lambda **kw: necref.jpole_model(replace(d, **kw), [case.f0], pattern_step_deg=5.0).average_gain[0]
    balance = gain(wire_sigma=None, stub_sigma=None)
    nec_wire = 1 - gain(stub_sigma=None) / balance
    nec_stub = 1 - gain(wire_sigma=None) / balance
    assert st.p_stub_conductor / st.p_delivered == pytest.approx(nec_stub, rel=0.15)
    assert st.p_wire / st.p_delivered == pytest.approx(nec_wire, abs=0.007)
