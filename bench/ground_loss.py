"""Ground loss and pattern of J-poles: NEC-2 against physics/pattern.py. Prints figures; not a test.

  python3 bench/ground_loss.py [OUT.json]     (NEC-2 runs one at a time; about a minute)

For each design (the acceptance designs of tests/test_jpole_nec.py over real ground, at the
dimensions the current model gives them, model_design) NEC-2 (tests/necref.py, DESIGN.md §7 mesh,
GN 2 Sommerfeld-Norton, copper wires by LD 5, and again with lossless wires) gives:
  - P_in (the 1 V source), P_struct (sum of |I|^2 Re Z_int dl over the segments, with the round-wire
    internal impedance of buildsheet.physics.conductors, the formula LD 5 uses), P_upper (RP card:
    average power gain over the upper hemisphere times 2 pi / 4 pi, theta and phi every 1 and 5 deg);
  - the ground loss (P_in - P_struct - P_upper) / P_in, and eta_ground = P_upper / (P_in - P_struct);
  - its maximum gain (dBi, relative to P_in) and take-off angle from the same RP grid.
physics/pattern.py then gives eta_ground
  (a) from NEC's own segment currents on all seven wires (SampledWire): the method alone;
  (b) from the model's two currents (radiator and stub common mode as sinusoids, amplitudes from the
      line model's arms, as jpole.state_at would pass them; see model_wires): what the product
      would print;
and the model's maximum gain and take-off angle with p_in = P_field / (p_radiated / p_delivered)
(the line model's own structural efficiency).
"""

from __future__ import annotations

import cmath
import datetime
import json
import sys
import time
from pathlib import Path

import numpy as np
import PyNEC  # noqa: F401  (version in the record)

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT / "tests"))
sys.path.insert(0, str(ROOT))

import necref  # noqa: E402
import test_jpole_nec as acc  # noqa: E402
from buildsheet.physics import jpole  # noqa: E402
from buildsheet.physics import pattern as P  # noqa: E402
from buildsheet.physics.conductors import wire_internal_impedance  # noqa: E402

NAMES = ("20m-horiz-10m-avg", "40m-horiz-12m-avg", "2m-pipe-vert-3m-avg", "6m-horiz-6m-avg",
         "10m-sloper-30deg-avg")


def model_wires(case, ant, L, S, T):
    """The two currents of the line model as pattern.Wire: the radiator arm (junction at conductor A,
    along the radiator, length L, open at the far end) and the stub's common mode (from the open top
    on the line's centre line, D/2 from A, straight down to the short, length S). Loop currents from
    the arms of jpole (an open-ended line: I(z) = (V_end/z0) sinh(gamma z) from the open end, so the
    loop current is j V_end/z0); the common mode flows up the stub into the radiator, so along its
    wire's downward direction it is the negative. Scaled by the radiator current at the junction
    i_rad of state_at; for eta_ground any common factor will do, so i_rad = 1 here."""
    prep = jpole.at_frequency(case.f0, ant)
    arm_r, arm_c = prep.arms(L, S)
    i_rad = 1.0
    v_end_r = i_rad * arm_r.impedance() / cmath.cosh(arm_r.gamma * arm_r.l_e)
    v_end_c = i_rad * arm_c.impedance() / cmath.cosh(arm_c.gamma * arm_c.l_e)
    p0, t = jpole._radiator_geometry(ant, L, S)
    cm_start = p0 - np.array([ant.spacing / 2, 0.0, 0.0])
    return [P.Wire(tuple(p0), tuple(t), L, 1j * v_end_r / arm_r.z0),
            P.Wire(tuple(cm_start), (0.0, 0.0, -1.0), S, -1j * v_end_c / arm_c.z0)]


def nec_sampled(res, wires):
    out = []
    for w in wires:
        pos, seglens, cur = res.currents[w.tag]
        p1, p2 = np.array(w.p1), np.array(w.p2)
        out.append(P.SampledWire(w.p1, tuple((p2 - p1) / np.linalg.norm(p2 - p1)), tuple(pos),
                                 tuple(seglens), tuple(cur)))
    return out


def study(name):
    case = next(c for c in acc.CASES if c.name == name)
    ant, L, S, T = acc.model_design(case)
    g = case.ground
    ground = necref.Ground("real", g["ground_eps_r"], g["ground_sigma"])
    dims = case.nec_dims(L, S, T)
    wires = necref.jpole_wires(dims, case.f0)
    source = (necref.TAG_TAP, (wires[necref.TAG_TAP - 1].nseg + 1) // 2)
    sig_cu = {necref.TAG_RADIATOR: case.wire_sigma, **{t: case.stub_sigma for t in range(2, 8)}}
    t0 = time.perf_counter()
    cu = necref.pattern(wires, case.f0, ground, source, sig_cu, theta_step=1.0, phi_step=5.0)
    lossless = necref.pattern(wires, case.f0, ground, source, None, theta_step=1.0, phi_step=5.0)
    # NEC-2's own energy balance on this structure: lossless, free space, sphere
    free_dims = necref.with_dims(dims, ground=necref.Ground("free-space"))
    free = necref.pattern(necref.jpole_wires(free_dims, case.f0), case.f0, free_dims.ground, source,
                          None, theta_step=2.0, phi_step=5.0)
    t_nec = time.perf_counter() - t0
    p_in = 0.5 * (1.0 / cu.z_in).real          # 1 V peak source: P = |V|^2 Re(Y)/2
    p_struct = 0.0
    for w in wires:
        pos, seglens, cur = cu.currents[w.tag]
        d = case.wire_d if w.tag == necref.TAG_RADIATOR else case.stub_d
        s = case.wire_sigma if w.tag == necref.TAG_RADIATOR else case.stub_sigma
        r = wire_internal_impedance(case.f0, d, s).real
        p_struct += 0.5 * float(np.sum(np.abs(cur) ** 2 * seglens)) * r
    p_upper = cu.radiated_fraction * p_in
    i, j = np.unravel_index(int(np.argmax(cu.gain_dbi)), cu.gain_dbi.shape)

    eps_r, sigma = g["ground_eps_r"], g["ground_sigma"]
    eta_nec_currents = P.ground_efficiency(nec_sampled(cu, wires), case.f0, "real", eps_r, sigma)
    mw = model_wires(case, ant, L, S, T)
    t1 = time.perf_counter()
    pw = P.powers(mw, case.f0, "real", eps_r, sigma)
    t_model = time.perf_counter() - t1
    st = jpole.state_at(case.f0, ant, L, S, T, 1.0)
    pat = P.pattern(mw, case.f0, "real", eps_r, sigma, p_in=pw.p_field * st.p_delivered / st.p_radiated)
    # the common mode against the radiator in NEC: peak of I_A + I_B over the radiator's peak
    cur = cu.currents
    i_cm = np.concatenate([cur[necref.TAG_A_LOW][2] + cur[necref.TAG_B_LOW][2],
                           cur[necref.TAG_A_HIGH][2] + cur[necref.TAG_B_HIGH][2]])
    cm_nec = float(np.max(np.abs(i_cm)) / np.max(np.abs(cur[necref.TAG_RADIATOR][2])))
    k_s = 2 * np.pi * case.f0 / necref.C0 * S       # the common mode's peak: at the open top if kS < pi/2
    cm_model = float(abs(mw[1].loop_current) * (np.sin(k_s) if k_s < np.pi / 2 else 1.0)
                     / abs(mw[0].loop_current))
    # complex ratio: common mode flowing up at the open top over the radiator's current a quarter
    # wave from its far end (NEC: nearest segment; model: -I_m,c sin kS / I_m,r)
    pos_r, _, cur_r = cur[necref.TAG_RADIATOR]
    i_peak = cur_r[int(np.argmin(np.abs(pos_r - (L - necref.C0 / case.f0 / 4))))]
    top_nec = (cur[necref.TAG_A_HIGH][2][-1] + cur[necref.TAG_B_HIGH][2][-1]) / i_peak
    top_model = -mw[1].loop_current * np.sin(k_s) / mw[0].loop_current
    return dict(
        name=name, f0_hz=case.f0, dims_m=dict(radiator=L, stub=S, tap=T, spacing=case.spacing),
        ground=dict(eps_r=eps_r, sigma=sigma),
        nec=dict(z_in=[cu.z_in.real, cu.z_in.imag], p_struct_frac=p_struct / p_in,
                 p_upper_frac=p_upper / p_in, ground_loss_frac=(p_in - p_struct - p_upper) / p_in,
                 eta_ground=p_upper / (p_in - p_struct), eta_ground_lossless=lossless.radiated_fraction,
                 max_gain_dbi=float(cu.gain_dbi[i, j]), takeoff_deg=float(90.0 - cu.theta_deg[i]),
                 azimuth_deg=float(cu.phi_deg[j]), common_mode_ratio=cm_nec, seconds=t_nec,
                 free_space_lossless_fraction=free.radiated_fraction,
                 cm_top_over_radiator=[top_nec.real, top_nec.imag]),
        pattern_nec_currents=dict(eta_ground=eta_nec_currents),
        model=dict(eta_ground=pw.eta_ground, seconds_powers=t_model,
                   struct_efficiency=st.p_radiated / st.p_delivered,
                   max_gain_dbi=pat.max_gain_dbi, takeoff_deg=pat.takeoff_deg, azimuth_deg=pat.azimuth_deg,
                   common_mode_ratio=cm_model, cm_top_over_radiator=[top_model.real, top_model.imag],
                   loop_currents=[[complex(w.loop_current).real, complex(w.loop_current).imag] for w in mw]),
    )


def main(argv):
    rows = []
    for name in NAMES:
        r = study(name)
        rows.append(r)
        n, m = r["nec"], r["model"]
        print(f"{name:22s} NEC: loss struct {n['p_struct_frac']:.3f} ground {n['ground_loss_frac']:.3f} "
              f"eta_g {n['eta_ground']:.3f} (lossless {n['eta_ground_lossless']:.3f}) "
              f"G {n['max_gain_dbi']:.2f} dBi @ {n['takeoff_deg']:.0f} deg az {n['azimuth_deg']:.0f}, "
              f"CM {n['common_mode_ratio']:.2f} | NEC currents eta_g {r['pattern_nec_currents']['eta_ground']:.3f} "
              f"| model eta_g {m['eta_ground']:.3f} G {m['max_gain_dbi']:.2f} dBi @ {m['takeoff_deg']:.1f} "
              f"az {m['azimuth_deg']:.0f}, CM {m['common_mode_ratio']:.2f} ({m['seconds_powers'] * 1e3:.1f} ms)\n"
              f"{'':22s} NEC free-space lossless fraction {n['free_space_lossless_fraction']:.3f}; "
              f"CM top/radiator NEC {complex(*n['cm_top_over_radiator']):.3f} model "
              f"{complex(*m['cm_top_over_radiator']):.3f}; model struct eff {m['struct_efficiency']:.3f}",
              flush=True)
    if len(argv) > 1:
        record = dict(script="bench/ground_loss.py", date=datetime.datetime.now(datetime.timezone.utc)
                      .isoformat(timespec="seconds"), pynec=getattr(PyNEC, "__version__", "2.4.6 (pip)"),
                      mesh="necref.MESH (DESIGN.md §7)", rp="theta 1 deg, phi 5 deg, GN 2", rows=rows)
        Path(argv[1]).write_text(json.dumps(record, indent=1))


if __name__ == "__main__":
    main(sys.argv)
