"""Ground loss and pattern of J-poles: NEC-2 against physics/pattern.py. Prints figures; not a test.

  python3 bench/ground_loss.py [OUT.json]           J-poles (NEC-2 runs one at a time; about a minute)
  python3 bench/ground_loss.py dipoles [OUT.json]   half-wave dipoles over three grounds (tests/test_pattern.py)

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
         "10m-sloper-30deg-avg", "15m-600ohm-8m-perfect", "2m-wire-vert-3m-avg")
# one thin-wire vertical beside the test's pipe: #10 AWG radiator and stub, 25 mm spacing
EXTRA = (acc.Case("2m-wire-vert-3m-avg", 146.0e6, (144.0e6, 148.0e6), acc.AWG(10), acc.AWG(10), 0.025,
                  "vertical", 3.0, acc.AVERAGE),)


def model_wires(case, ant, L, S, form="line"):
    """The two currents of the line model as pattern.Wire, as jpole.state_at would pass them: the
    radiator (junction at conductor A, along the radiator, length L) and the stub's common mode
    (from the open top on the line's centre line, D/2 from A, straight down to the short, length S).

    Each is the standing wave of its arm of the line model, the radiator's own arm (prep.arms with
    junction=False: the wire cut to resonance, without the lumped junction length c_j D, which
    stands for what the stub's top sees, not for the wire's current): an open-ended line carries
    I(z) = (V_end/z0) sinh(gamma z) from its open end z = 0, so the loop current is
    I_m = j V_end/z0, with V_end = i_rad Z_arm / cosh(gamma l_e) for the current i_rad into the arm.
    form "line": that current itself (gamma, open end at l_e); "sine": the lossless sinusoid
    I_m sin k(l - s) on the physical wire. The common mode flows up the stub into the radiator, so
    along its wire's downward direction it is the negative. The scale i_rad (state_at: 2 i_top) is a
    common factor; 1 here."""
    prep = jpole.at_frequency(case.f0, ant)
    arm_r, arm_c = prep.arms(L, S, junction=False)
    i_rad = 1.0
    p0, t = jpole._radiator_geometry(ant, L, S)
    cm_start = p0 - np.array([ant.spacing / 2, 0.0, 0.0])
    down = (0.0, 0.0, -1.0)
    if form == "line":
        return [P.open_line_wire(p0, t, L, i_rad, arm_r.gamma, arm_r.l_e),
                P.open_line_wire(cm_start, down, S, -i_rad, arm_c.gamma, arm_c.l_e)]
    out = []
    for arm, start, direction, length, sign in ((arm_r, p0, t, L, 1), (arm_c, cm_start, down, S, -1)):
        v_end = i_rad * arm.impedance() / cmath.cosh(arm.gamma * arm.l_e)
        out.append(P.Wire(tuple(start), tuple(direction), length, sign * 1j * v_end / arm.z0))
    return out


def wire_current(w, s, k):
    """The current of pattern.Wire w at distance s (m) from its start, A."""
    if w.gamma is None:
        return w.loop_current * np.sin(k * (w.length - s))
    return -1j * w.loop_current * cmath.sinh(w.gamma * (w.open_length - s))


def nec_sampled(res, wires):
    out = []
    for w in wires:
        pos, seglens, cur = res.currents[w.tag]
        p1, p2 = np.array(w.p1), np.array(w.p2)
        out.append(P.SampledWire(w.p1, tuple((p2 - p1) / np.linalg.norm(p2 - p1)), tuple(pos),
                                 tuple(seglens), tuple(cur)))
    return out


def study(name):
    case = next(c for c in acc.CASES + EXTRA if c.name == name)
    ant, L, S, T = acc.model_design(case)
    g = case.ground
    kind, eps_r, sigma = g["ground_kind"], g.get("ground_eps_r", 13.0), g.get("ground_sigma", 0.005)
    dims = case.nec_dims(L, S, T)
    wires = necref.jpole_wires(dims, case.f0)
    source = (necref.TAG_TAP, (wires[necref.TAG_TAP - 1].nseg + 1) // 2)
    sig_cu = {necref.TAG_RADIATOR: case.wire_sigma, **{t: case.stub_sigma for t in range(2, 8)}}
    t0 = time.perf_counter()
    cu = necref.pattern(wires, case.f0, dims.ground, source, sig_cu, theta_step=1.0, phi_step=5.0)
    lossless = necref.pattern(wires, case.f0, dims.ground, source, None, theta_step=1.0, phi_step=5.0)
    # NEC-2's own energy balance on this structure: lossless, free space, sphere
    free_dims = necref.with_dims(dims, ground=necref.Ground("free-space"))
    free = necref.pattern(necref.jpole_wires(free_dims, case.f0), case.f0, free_dims.ground, source,
                          None, theta_step=2.0, phi_step=5.0)
    t_nec = time.perf_counter() - t0
    p_in = 0.5 * (1.0 / cu.z_in).real          # 1 V peak source: P = |V|^2 Re(Y)/2
    p_struct = 0.0
    for w in wires:
        pos, seglens, cur = cu.currents[w.tag]
        rad = w.tag == necref.TAG_RADIATOR
        r = wire_internal_impedance(case.f0, case.wire_d if rad else case.stub_d,
                                    case.wire_sigma if rad else case.stub_sigma).real
        p_struct += 0.5 * float(np.sum(np.abs(cur) ** 2 * seglens)) * r
    p_upper = cu.radiated_fraction * p_in
    i, j = np.unravel_index(int(np.argmax(cu.gain_dbi)), cu.gain_dbi.shape)
    cur = cu.currents
    pos_r, _, cur_r = cur[necref.TAG_RADIATOR]
    i_peak = cur_r[int(np.argmin(np.abs(pos_r - (L - necref.C0 / case.f0 / 4))))]
    top_nec = (cur[necref.TAG_A_HIGH][2][-1] + cur[necref.TAG_B_HIGH][2][-1]) / i_peak
    nec = dict(z_in=[cu.z_in.real, cu.z_in.imag], p_struct_frac=p_struct / p_in,
               p_upper_frac=p_upper / p_in, ground_loss_frac=(p_in - p_struct - p_upper) / p_in,
               eta_ground=p_upper / (p_in - p_struct), eta_ground_lossless=lossless.radiated_fraction,
               free_space_lossless_fraction=free.radiated_fraction,
               max_gain_dbi=float(cu.gain_dbi[i, j]), takeoff_deg=float(90.0 - cu.theta_deg[i]),
               azimuth_deg=float(cu.phi_deg[j]), cm_top_over_radiator=[top_nec.real, top_nec.imag],
               eta_ground_from_its_currents=P.ground_efficiency(nec_sampled(cu, wires), case.f0, kind,
                                                                eps_r, sigma),
               seconds=t_nec)
    st = jpole.state_at(case.f0, ant, L, S, T, 1.0)
    model = dict(struct_efficiency=st.p_radiated / st.p_delivered)
    for form in ("line", "sine"):
        mw = model_wires(case, ant, L, S, form)
        t1 = time.perf_counter()
        pw = P.powers(mw, case.f0, kind, eps_r, sigma)
        t_model = time.perf_counter() - t1
        # gains relative to the power delivered: P_field over the line model's own efficiency
        pat = P.pattern(mw, case.f0, kind, eps_r, sigma, p_in=pw.p_field * st.p_delivered / st.p_radiated)
        # the common mode flowing up at the open top over the radiator's loop current
        i_top = -wire_current(mw[1], 0.0, 2 * np.pi * case.f0 / necref.C0)
        model[form] = dict(eta_ground=pw.eta_ground, seconds_powers=t_model, max_gain_dbi=pat.max_gain_dbi,
                           takeoff_deg=pat.takeoff_deg, azimuth_deg=pat.azimuth_deg,
                           cm_top_over_radiator=[(i_top / mw[0].loop_current).real,
                                                 (i_top / mw[0].loop_current).imag])
    return dict(name=name, f0_hz=case.f0, dims_m=dict(radiator=L, stub=S, tap=T, spacing=case.spacing),
                ground=dict(kind=kind, eps_r=eps_r, sigma=sigma), nec=nec, model=model)


def dipoles(argv):
    """Thin exact half-wave (radius 1e-5 lambda, 51 segments, lossless, 14.2 MHz), horizontal (centre
    at h) and vertical (lower end at h), over average, poor and very good ground: NEC-2's radiated
    fraction with GN 2 and GN 0, pattern.py's eta_ground from the sinusoid and from NEC's currents,
    and both maximum gains and take-off angles (NEC: RP grid, theta 0.5 deg, phi 5 deg)."""
    import test_pattern as tp
    rows = []
    print(f"{'':10s} {'h/lam':>5s} {'ground':9s} | eta_g: NEC GN2   GN0 | sinusoid  NEC-currents | "
          f"G max dBi @ take-off: NEC GN2 | sinusoid")
    for o in ("horizontal", "vertical"):
        for h in (0.1, 0.25, 0.5, 1.0):
            for g in sorted(tp.GROUNDS):
                eps_r, sigma = tp.GROUNDS[g]
                centre = tp._centre(o, h)
                gn2 = tp._nec(o, h, g, theta_step=0.5)
                gn0 = tp._nec(o, h, g, method="reflection")
                w = necref.dipole_wires(0.5 * tp.LAM, tp.THIN_D, centre, o)
                eta_nec_cur = P.ground_efficiency(nec_sampled(gn2, w), tp.F, "real", eps_r, sigma)
                # gains relative to P_field: the pattern's efficiency is P_upper / P_field, eta_ground
                pat = P.pattern(tp.half_wave(centre, o), tp.F, "real", eps_r, sigma)
                i, j = np.unravel_index(int(np.argmax(gn2.gain_dbi)), gn2.gain_dbi.shape)
                r = dict(orientation=o, h_over_lam=h, ground=g, eta_gn2=gn2.radiated_fraction,
                         eta_gn0=gn0.radiated_fraction, eta_sine=pat.efficiency, eta_nec_currents=eta_nec_cur,
                         gain_nec=float(gn2.gain_dbi[i, j]), takeoff_nec=float(90 - gn2.theta_deg[i]),
                         gain_sine=pat.max_gain_dbi, takeoff_sine=pat.takeoff_deg)
                rows.append(r)
                print(f"{o:10s} {h:5.2f} {g:9s} | {r['eta_gn2']:.4f} {r['eta_gn0']:.4f} | {r['eta_sine']:.4f} "
                      f"{r['eta_nec_currents']:.4f} | {r['gain_nec']:.2f} @ {r['takeoff_nec']:.1f} | "
                      f"{r['gain_sine']:.2f} @ {r['takeoff_sine']:.2f}", flush=True)
    if len(argv) > 2:
        record = dict(script="bench/ground_loss.py dipoles", date=datetime.datetime.now(datetime.timezone.utc)
                      .isoformat(timespec="seconds"), pynec="PyNEC 2.4.6 (pip)", rows=rows)
        Path(argv[2]).write_text(json.dumps(record, indent=1))


def main(argv):
    if len(argv) > 1 and argv[1] == "dipoles":
        return dipoles(argv)
    rows = []
    print(f"{'design':22s} | NEC-2 GN 2: struct  ground  eta_g  (lossless, free-space balance)  "
          f"G dBi @ take-off | eta_g of NEC's currents | model line / sine: eta_g  G @ take-off")
    for name in NAMES:
        r = study(name)
        rows.append(r)
        n, m = r["nec"], r["model"]
        ml, ms = m["line"], m["sine"]
        print(f"{name:22s} | {n['p_struct_frac']:.3f} {n['ground_loss_frac']:.3f} {n['eta_ground']:.3f} "
              f"({n['eta_ground_lossless']:.3f}, {n['free_space_lossless_fraction']:.3f}) "
              f"{n['max_gain_dbi']:.2f} @ {n['takeoff_deg']:.0f} | {n['eta_ground_from_its_currents']:.3f} | "
              f"{ml['eta_ground']:.3f} {ml['max_gain_dbi']:.2f} @ {ml['takeoff_deg']:.1f} / "
              f"{ms['eta_ground']:.3f} {ms['max_gain_dbi']:.2f} @ {ms['takeoff_deg']:.1f} "
              f"({ml['seconds_powers'] * 1e3:.1f} ms); CM top/I_m NEC {complex(*n['cm_top_over_radiator']):.3f} "
              f"model {complex(*ml['cm_top_over_radiator']):.3f}", flush=True)
    if len(argv) > 1:
        record = dict(script="bench/ground_loss.py", date=datetime.datetime.now(datetime.timezone.utc)
                      .isoformat(timespec="seconds"), pynec="PyNEC 2.4.6 (pip)",
                      mesh="necref.MESH (DESIGN.md §7)", rp="theta 1 deg, phi 5 deg, GN 2", rows=rows)
        Path(argv[1]).write_text(json.dumps(record, indent=1))


if __name__ == "__main__":
    main(sys.argv)
