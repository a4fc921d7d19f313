"""Full-wave FDTD reference (openEMS) for rigid pipe/rod J-poles, where NEC-2's thin-wire method
cannot be meshed validly (DESIGN.md §7). Bench only: runs take minutes and never belong in tests/CI.

Two interpreters, because openEMS comes from Debian and PyNEC/buildsheet live in the venv:
  .venv/bin/python bench/fdtd_ref.py plan                  the model's dimensions -> fdtd-plan.json
  /usr/bin/python3 bench/fdtd_ref.py dipole-proof NAME LENGTH D F0 M
  /usr/bin/python3 bench/fdtd_ref.py stub-proof NAME L S D F0 M      -> bench/data/fdtd-proofs.json
  /usr/bin/python3 bench/fdtd_ref.py jpole NAME M [SCALE_S SCALE_T]  -> bench/data/fdtd-jpoles.json
  .venv/bin/python bench/fdtd_ref.py report                 proof figures and FDTD vs NEC-2 table
                                                           -> bench/data/fdtd-summary.json
M is the number of cells across a conductor (the mesh study varies it). Each FDTD command runs
one openEMS simulation and appends its row (mesh, command, date) to the data file.

Geometry (SI, metres) follows tests/necref.py: z up; stub conductor A at x = 0, B at x = -spacing;
vertical J-pole: short at z = z_short, tap bar at z_short + tap, open top at z_short + stub, the
radiator continues straight up from A for `radiator` metres; B ends at the open top.

Method (DESIGN.md §7, "Lessons from a first FDTD study"):
  - every conductor is a box of whole cells (square cross-section w x w, m cells across) on a
    rectilinear grid; no cylinders, so no one-cell "whiskers" that move with the grid;
  - w is chosen so that a 2-D electrostatic solve on the very same x-y grid (the FDTD's static
    limit: finite integration on the grid nodes, metal nodes at one potential) gives the two-wire
    Z0 = 120 acosh(s/d) of the round conductors (Wheeler/Ramo, air line); a lone wire (dipole) is
    calibrated the same way as one conductor of a pair 10 d apart, where proximity is negligible;
  - the whole antenna is simulated. The plane y = 0 holds every conductor and could be a magnetic
    wall (PMC; `half=True` builds that model), but openEMS's current probe runs on the dual grid
    and cannot close its loop on the symmetry face: it misses the current of the conductor's
    node row at y = 0 (a half model read a zero or partial current), so the runs use the full
    model at twice the cost;
  - a lumped port (50 ohm) in a one-cell gap in the middle of the tap bar (dipole: centre gap),
    its voltage read along the gap, its current by an H loop half a cell outside the bar;
    Gaussian excitation f0 +/- 50 %; stop at -50 dB energy; PML (8 cells) on all faces (a perfect
    ground: PEC at z = 0 instead). The one-cell gap is a small capacitor (about 0.5 pF for the
    2 m pipe, fitted from the plain stubs) that a NEC-2 delta gap does not have; at a 50-ohm feed
    it moves Z by under 1 ohm, and the stored impedances include it;
  - openEMS runs with one thread under `nice` (shared 2-core machine).
"""

from __future__ import annotations

import json
import math
import os
import shutil
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
DATA = ROOT / "bench" / "data"
C0 = 299_792_458.0
ETA0 = 376.730313668
RUN_DIR = Path(os.environ.get("FDTD_RUN_DIR", tempfile.gettempdir())) / "fdtd-runs"


# ----------------------------------------------------------------------------------------------
# mesh
# ----------------------------------------------------------------------------------------------
def grade(fixed, regions, hmax, ratio=1.3):
    """Mesh lines through every line in `fixed` (sorted ends included): cells no larger than h inside
    each region (lo, hi, h), growing by about `ratio` per cell away from the regions, never above
    hmax. Lines between two fixed lines follow the local size (inverse cumulative density)."""
    fixed = np.sort(np.asarray(fixed, dtype=float))
    fixed = fixed[np.concatenate([[True], np.diff(fixed) > 1e-9])]   # exact values kept

    def size(x):
        s = np.full_like(x, hmax)
        for lo, hi, h in regions:
            d = np.maximum(0.0, np.maximum(lo - x, x - hi))
            s = np.minimum(s, h + (ratio - 1.0) * d)
        return s

    lines = [fixed[0]]
    for a, b in zip(fixed[:-1], fixed[1:]):
        xs = np.linspace(a, b, 4001)
        dens = 1.0 / size(xs)
        cum = np.concatenate([[0.0], np.cumsum(0.5 * (dens[1:] + dens[:-1]) * np.diff(xs))])
        n = max(1, int(math.ceil(cum[-1] - 1e-6)))
        lines.extend(np.interp(np.linspace(0.0, cum[-1], n + 1)[1:], cum, xs))
    return np.array(lines)


class Grid:
    """Cross-section (x, y) mesh of one pair of square conductors of width w, m cells across,
    centred at x = 0 (A) and x = -s (B), y in [0, w/2] (half model); with a port gap of one cell at
    x = -s/2 (the tap bar's middle) when `gap`."""

    def __init__(self, s, w, m, extent, hmax, gap=True, ratio=1.3):
        self.s, self.w, self.m = s, w, m
        self.h = w / m
        self.my = max(1, int(round(m / 2)))
        hy = 0.5 * w / self.my
        xf = [-s - w / 2 - extent, -s - w / 2, -s + w / 2, -w / 2, w / 2, w / 2 + extent]
        if gap:
            xf += [-s / 2 - self.h / 2, -s / 2 + self.h / 2]
        self.x = grade(sorted(xf), [(-s - w / 2, w / 2, self.h)], hmax, ratio)
        self.y = grade([0.0, w / 2, extent], [(0.0, w / 2, hy)], hmax, ratio)


def z0_static(grid: Grid) -> float:
    """Two-wire Z0 (ohm) of the grid's two conductors from a 2-D finite-integration electrostatic
    solve on the grid nodes (the FDTD's static limit): A at +1 V, B at -1 V, outer faces at 0 V,
    y = 0 a symmetry plane (Neumann). C from the field energy; air line Z0 = 1/(c C)."""
    import scipy.sparse as sp
    import scipy.sparse.linalg as spl
    x, y = grid.x, grid.y
    nx, ny = len(x), len(y)
    dx, dy = np.diff(x), np.diff(y)
    dual_x = np.concatenate([[dx[0] / 2], (dx[:-1] + dx[1:]) / 2, [dx[-1] / 2]])
    dual_y = np.concatenate([[dy[0] / 2], (dy[:-1] + dy[1:]) / 2, [dy[-1] / 2]])
    idx = np.arange(nx * ny).reshape(nx, ny)
    # edges along x: between (i, j) and (i+1, j); conductance dual_y[j] / dx[i]
    ea = idx[:-1, :].ravel()
    eb = idx[1:, :].ravel()
    g = (dual_y[None, :] / dx[:, None]).ravel()
    fa = idx[:, :-1].ravel()
    fb = idx[:, 1:].ravel()
    gf = (dual_x[:, None] / dy[None, :]).ravel()
    a = np.concatenate([ea, fa])
    b = np.concatenate([eb, fb])
    gg = np.concatenate([g, gf])
    n = nx * ny
    lap = sp.coo_matrix((np.concatenate([gg, gg, -gg, -gg]),
                         (np.concatenate([a, b, a, b]), np.concatenate([a, b, b, a]))), shape=(n, n)).tocsr()
    X, Y = np.meshgrid(x, y, indexing="ij")
    tol = 1e-9
    w, s = grid.w, grid.s
    in_y = Y <= w / 2 + tol
    mA = (np.abs(X) <= w / 2 + tol) & in_y
    mB = (np.abs(X + s) <= w / 2 + tol) & in_y
    outer = np.zeros_like(mA)
    outer[0, :] = outer[-1, :] = outer[:, -1] = True
    phi = np.zeros(n)
    fixed = (mA | mB | outer).ravel()
    phi[mA.ravel()] = 1.0
    phi[mB.ravel()] = -1.0
    free = ~fixed
    rhs = -lap[free][:, fixed] @ phi[fixed]
    phi[free] = spl.spsolve(lap[free][:, free].tocsc(), rhs)
    energy_half = 0.5 * np.sum(gg * (phi[a] - phi[b]) ** 2)   # per eps0, y >= 0 only
    c_line = 2 * energy_half * 2 / 2.0 ** 2 * 8.8541878128e-12   # W = C V^2 / 2, V = 2, both halves
    return 1.0 / (C0 * c_line)


def calibrate_width(s, d, m, extent, hmax, gap=True) -> tuple[float, float]:
    """Square width w (m cells across) whose pair on the FDTD grid has Z0 = 120 acosh(s/d)."""
    target = 120.0 * math.acosh(s / d)
    # a far zero-potential boundary (the FDTD has PML there); cells beyond the FDTD's largest may
    # grow further, far from the conductors where the static field hardly varies
    extent, hmax = max(extent, 100.0 * s), max(hmax, 4.0 * s)
    lo, hi = 0.3 * d, min(1.3 * d, 0.95 * s)
    for _ in range(40):
        w = 0.5 * (lo + hi)
        z = z0_static(Grid(s, w, m, extent, hmax, gap))
        if z > target:
            lo = w
        else:
            hi = w
        if hi - lo < 1e-6 * d:
            break
    w = 0.5 * (lo + hi)
    return w, z0_static(Grid(s, w, m, extent, hmax, gap))


# ----------------------------------------------------------------------------------------------
# FDTD
# ----------------------------------------------------------------------------------------------
def _openems():
    for name, typ in (("float", float), ("int", int), ("complex", complex)):
        if name not in np.__dict__:
            setattr(np, name, typ)   # the Debian wrappers still use the removed aliases
    from CSXCAD import ContinuousStructure
    from openEMS import openEMS
    from openEMS.ports import LumpedPort
    return ContinuousStructure, openEMS, LumpedPort


def _outside(lines, lo, hi):
    """Coordinates half a cell outside [lo, hi] on the given mesh lines (a current probe's loop
    then runs on the dual grid around the whole conductor), or just below a symmetry face."""
    lines = np.asarray(lines)
    below = lines[lines < lo - 1e-12]
    above = lines[lines > hi + 1e-12]
    a = 0.5 * (lo + below[-1]) if len(below) else lo - 1e-6
    b = 0.5 * (hi + above[0]) if len(above) else hi + 1e-6
    return a, b


def run_fdtd(name, boxes, port, lines, f0, freqs, half=False, ground="free-space",
             end_db=-50.0, max_steps=400_000):
    """Run one openEMS simulation: PEC `boxes` [(start, stop)], a lumped port (start, stop, axis)
    of 50 ohm for the whole antenna (100 ohm in a half model), excitation f0 +/- 50 %. The port
    voltage is read along the gap at the port's centre line, its current by an H loop half a cell
    outside the port's cross-section in the middle of the gap. Returns (complex Z of the whole
    antenna at freqs, run info)."""
    ContinuousStructure, openEMS, LumpedPort = _openems()
    from openEMS import utilities
    fdtd = openEMS(NrTS=max_steps, EndCriteria=10 ** (end_db / 10))
    fdtd.SetGaussExcite(f0, 0.5 * f0)
    bc = ["PML_8", "PML_8", "PMC" if half else "PML_8", "PML_8",
          "PEC" if ground == "perfect" else "PML_8", "PML_8"]
    fdtd.SetBoundaryCond(bc)
    csx = ContinuousStructure()
    fdtd.SetCSX(csx)
    mesh = csx.GetGrid()
    mesh.SetDeltaUnit(1.0)
    for ax, ln in zip("xyz", lines):
        mesh.SetLines(ax, list(ln))
    metal = csx.AddMetal("pec")
    eps = 1e-9   # m: every box reaches its bounding mesh lines despite rounding
    for start, stop in boxes:
        metal.AddBox([v - eps for v in start], [v + eps for v in stop], priority=10)
    p_start, p_stop, axis = port
    k = "xyz".index(axis)
    LumpedPort(csx, 1, 100.0 if half else 50.0, list(p_start), list(p_stop), axis, excite=1.0,
               priority=5)
    # probes of our own (LumpedPort's current loop would cut through a thin port's cross-section)
    centre = [0.5 * (a + b) for a, b in zip(p_start, p_stop)]
    if half:
        centre[1] = 0.0
    u0, u1 = list(centre), list(centre)
    u0[k], u1[k] = p_start[k], p_stop[k]
    csx.AddProbe("u", p_type=0, weight=-1).AddBox(u0, u1)
    i0, i1 = list(p_start), list(p_stop)
    i0[k] = i1[k] = 0.5 * (p_start[k] + p_stop[k])
    for j in range(3):
        if j != k:
            i0[j], i1[j] = _outside(lines[j], p_start[j], p_stop[j])
    csx.AddProbe("i", p_type=1, weight=1, norm_dir=k).AddBox(i0, i1)
    path = RUN_DIR / f"{name}-{os.getpid()}"   # several sessions may share the temporary directory
    path.mkdir(parents=True, exist_ok=True)
    t = time.time()
    fdtd.Run(str(path), cleanup=True, verbose=int(os.environ.get("FDTD_VERBOSE", 0)), numThreads=1)
    dt = time.time() - t
    u = np.loadtxt(path / "u", comments="%")
    i = np.loadtxt(path / "i", comments="%")
    uf = utilities.DFT_time2freq(u[:, 0], u[:, 1], np.asarray(freqs))
    jf = utilities.DFT_time2freq(i[:, 0], i[:, 1], np.asarray(freqs))
    z = uf / jf * (0.5 if half else 1.0)
    xl, yl, zl = lines
    ncells = (len(xl) - 1) * (len(yl) - 1) * (len(zl) - 1)
    if not os.environ.get("FDTD_KEEP"):
        shutil.rmtree(path, ignore_errors=True)
    return np.asarray(z), dict(run_s=round(dt, 1), t_end_s=float(u[-1, 0]), cells=int(ncells),
                               min_cell_m=float(min(np.diff(ln).min() for ln in lines)),
                               nx=len(xl), ny=len(yl), nz=len(zl), half=half, ground=ground,
                               end_db=end_db, excitation="gauss f0 +/- 0.5 f0")


def _settings(f0, margin_lam=None, xy_lam=None, z_lam=None):
    """Mesh sizes as fractions of the wavelength at f0 (environment FDTD_MARGIN, FDTD_XY, FDTD_Z
    override the defaults 0.3, 30, 60 for mesh studies)."""
    margin_lam = margin_lam or float(os.environ.get("FDTD_MARGIN", 0.3))
    xy_lam = xy_lam or float(os.environ.get("FDTD_XY", 30.0))
    z_lam = z_lam or float(os.environ.get("FDTD_Z", 60.0))
    lam = C0 / f0
    return dict(lam=lam, margin=margin_lam * lam, hmax_xy=lam / xy_lam, hz=lam / z_lam)


def _zgrid(fixed, fine, h, hz, hmax, lo, hi, ratio=1.3):
    """z lines: fine (h) around the given intervals, hz along conductors, hmax beyond the ends."""
    regions = [(a, b, h) for a, b in fine]
    fixed = sorted(set([lo, hi] + list(fixed)))
    # conductors span [fixed min, fixed max] (without domain ends): cells <= hz there
    body = (min(f for f in fixed if f > lo), max(f for f in fixed if f < hi))
    return grade(fixed, regions + [(body[0], body[1], hz)], hmax, ratio)


def _ylines(w, m, ext, hmax, half):
    """y lines: the conductors span [0, w/2] (half model, PMC at y = 0) or [-w/2, w/2]."""
    my = max(1, int(round(m / 2)))
    if half:
        return grade([0.0, w / 2, ext], [(0.0, w / 2, 0.5 * w / my)], hmax)
    return grade([-ext, -w / 2, w / 2, ext], [(-w / 2, w / 2, 0.5 * w / my)], hmax)


def _pair(s, d, m, st):
    """Calibrated width and x lines of a pair (A at 0, B at -s) with a port gap at -s/2."""
    w, z0g = calibrate_width(s, d, m, st["margin"], st["hmax_xy"])
    grid = Grid(s, w, m, st["margin"] + 8 * st["hmax_xy"], st["hmax_xy"])
    return w, z0g, grid


def jpole_fdtd(name, L, S, T, s, d, f0, freqs, m=3, ground="free-space", height=0.0, wire_d=None,
               settings=None, half=False):
    """FDTD feed impedance of a vertical J-pole (dimensions as tests/necref.py). wire_d must equal d
    here (one square section for the stub and radiator). Returns (Z, info)."""
    if wire_d is not None and abs(wire_d - d) > 1e-9:
        raise ValueError("the FDTD harness uses one conductor section: wire_d must equal stub_d")
    st = settings or _settings(f0)
    w, z0g, grid = _pair(s, d, m, st)
    h = grid.h
    ext = st["margin"] + 8 * st["hmax_xy"]
    zs = height if ground == "perfect" else 0.0
    zt, ztop, ztip = zs + T, zs + S, zs + S + L
    if ground == "perfect" and zs - w / 2 <= 0:
        raise ValueError("the short must stand above the ground plane")
    lo = 0.0 if ground == "perfect" else zs - w / 2 - ext
    hi = ztip + ext
    fixed = [zs - w / 2, zs + w / 2, zt - w / 2, zt + w / 2, ztop, ztip]
    fine = [(zs - w / 2, zt + w / 2), (ztop - s, ztop + s), (ztip - s, ztip)]
    z = _zgrid(fixed, fine, h, st["hz"], st["hmax_xy"], lo, hi)
    y = _ylines(w, m, ext, st["hmax_xy"], half)
    y0, y1 = (0.0 if half else -w / 2), w / 2
    boxes = [((-w / 2, y0, zs - w / 2), (w / 2, y1, ztip)),                    # A + radiator
             ((-s - w / 2, y0, zs - w / 2), (-s + w / 2, y1, ztop)),          # B
             ((-s, y0, zs - w / 2), (0.0, y1, zs + w / 2)),                   # short
             ((-s, y0, zt - w / 2), (-s / 2 - h / 2, y1, zt + w / 2)),        # tap bar, B side
             ((-s / 2 + h / 2, y0, zt - w / 2), (0.0, y1, zt + w / 2))]       # tap bar, A side
    port = ((-s / 2 - h / 2, y0, zt - w / 2), (-s / 2 + h / 2, y1, zt + w / 2), "x")
    zf, info = run_fdtd(name, boxes, port, (grid.x, y, z), f0, freqs, half, ground)
    info.update(m=m, w=w, h=h, z0_grid=z0g, z0_theory=120 * math.acosh(s / d), **st)
    return zf, info


def stub_fdtd(name, l, s, d, f0, freqs, m=3, settings=None, half=False):
    """Plain shorted two-wire stub: port bar (gap in its middle) at z = 0, short bar at z = l."""
    st = settings or _settings(f0)
    w, z0g, grid = _pair(s, d, m, st)
    h = grid.h
    ext = st["margin"] + 8 * st["hmax_xy"]
    fixed = [-w / 2, w / 2, l - w / 2, l + w / 2]
    fine = [(-w / 2 - s, w / 2 + s), (l - w / 2 - s, l + w / 2 + s)]
    z = _zgrid(fixed, fine, h, st["hz"], st["hmax_xy"], -w / 2 - ext, l + w / 2 + ext)
    y = _ylines(w, m, ext, st["hmax_xy"], half)
    y0, y1 = (0.0 if half else -w / 2), w / 2
    boxes = [((-w / 2, y0, -w / 2), (w / 2, y1, l + w / 2)),
             ((-s - w / 2, y0, -w / 2), (-s + w / 2, y1, l + w / 2)),
             ((-s, y0, l - w / 2), (0.0, y1, l + w / 2)),
             ((-s, y0, -w / 2), (-s / 2 - h / 2, y1, w / 2)),
             ((-s / 2 + h / 2, y0, -w / 2), (0.0, y1, w / 2))]
    port = ((-s / 2 - h / 2, y0, -w / 2), (-s / 2 + h / 2, y1, w / 2), "x")
    zf, info = run_fdtd(name, boxes, port, (grid.x, y, z), f0, freqs, half)
    info.update(m=m, w=w, h=h, z0_grid=z0g, z0_theory=120 * math.acosh(s / d), **st)
    return zf, info


def dipole_fdtd(name, length, d, f0, freqs, m=3, settings=None, half=False):
    """Centre-fed straight dipole along z (x = 0), a one-cell port gap at its centre. The square
    section is calibrated as one conductor of a pair 10 d apart (equivalent diameter d)."""
    st = settings or _settings(f0)
    s_cal = 10.0 * d
    w, z0g = calibrate_width(s_cal, d, m, st["margin"], st["hmax_xy"], gap=False)
    h = w / m
    ext = st["margin"] + 8 * st["hmax_xy"]
    x = grade([-ext, -w / 2, w / 2, ext], [(-w / 2, w / 2, h)], st["hmax_xy"])
    y = _ylines(w, m, ext, st["hmax_xy"], half)
    y0 = 0.0 if half else -w / 2
    half_l = length / 2
    fixed = [-h / 2, h / 2, -half_l, half_l]
    fine = [(-2 * w, 2 * w), (-half_l, -half_l + 2 * w), (half_l - 2 * w, half_l)]
    z = _zgrid(fixed, fine, h, st["hz"], st["hmax_xy"], -half_l - ext, half_l + ext)
    boxes = [((-w / 2, y0, -half_l), (w / 2, w / 2, -h / 2)), ((-w / 2, y0, h / 2), (w / 2, w / 2, half_l))]
    port = ((-w / 2, y0, -h / 2), (w / 2, w / 2, h / 2), "z")
    zf, info = run_fdtd(name, boxes, port, (x, y, z), f0, freqs, half)
    info.update(m=m, w=w, h=h, z0_grid_pair10d=z0g, **st)
    return zf, info


# ----------------------------------------------------------------------------------------------
# command line
# ----------------------------------------------------------------------------------------------
# FDTD_PLAN / FDTD_JPOLES: other files, e.g. a plan of a refitted model's dimensions and its runs
PLAN = Path(os.environ.get("FDTD_PLAN", DATA / "fdtd-plan.json"))
JPOLES = Path(os.environ.get("FDTD_JPOLES", DATA / "fdtd-jpoles.json"))
PROOFS = DATA / "fdtd-proofs.json"
SCRIPT = "bench/fdtd_ref.py"


def _now():
    return time.strftime("%Y-%m-%dT%H:%M:%SZ", time.gmtime())


def _append(path: Path, row: dict):
    """Append one row to a JSON list file atomically (rows already there are kept)."""
    rows = json.loads(path.read_text()) if path.exists() else []
    rows.append(row)
    tmp = path.with_suffix(".tmp")
    tmp.write_text(json.dumps(rows, indent=1))
    os.replace(tmp, path)


def _mesh_info(info):
    keys = ("m", "w", "h", "z0_grid", "z0_theory", "z0_grid_pair10d", "margin", "hmax_xy", "hz",
            "cells", "nx", "ny", "nz", "min_cell_m", "half", "ground", "end_db", "excitation",
            "run_s", "t_end_s")
    return {k: info[k] for k in keys if k in info}


# The rigid designs (vertical, free space): the model's dimensions come from `plan` (venv).
DESIGNS = (
    # name, f0, band, conductor OD, spacing
    ("2m-pipe-15.9-s50-free", 146.0e6, (144.0e6, 148.0e6), 0.0159, 0.050),    # 1/2-in copper pipe
    ("2m-pipe-22.2-s60-free", 146.0e6, (144.0e6, 148.0e6), 0.0222, 0.060),    # 3/4-in copper pipe
    ("70cm-rod-6.35-s25-free", 446.0e6, (420.0e6, 450.0e6), 0.00635, 0.025),  # 1/4-in rod
    ("2m-rod-9.5-s40-free", 146.0e6, (144.0e6, 148.0e6), 0.0095, 0.040),      # 3/8-in rod
    ("1.25m-pipe-15.9-s50-free", 223.5e6, (222.0e6, 225.0e6), 0.0159, 0.050),
    ("6m-tube-12.7-s75-free", 50.125e6, (50.0e6, 54.0e6), 0.0127, 0.075),     # 1/2-in OD tube
    # held-out designs (added for the rigid refit; none of their runs is used to fit)
    ("70cm-rod-9.5-s30-free", 446.0e6, (420.0e6, 450.0e6), 0.009525, 0.030),  # 3/8-in rod, D/d 3.1
    ("2m-pipe-28.6-s100-free", 146.0e6, (144.0e6, 148.0e6), 0.028575, 0.100),  # 1-in pipe, D/d 3.5
    ("1.25m-rod-9.5-s40-free", 223.5e6, (222.0e6, 225.0e6), 0.009525, 0.040),  # 3/8-in rod, D/d 4.2
    ("2m-pipe-15.9-s75-free", 146.0e6, (144.0e6, 148.0e6), 0.015875, 0.075),  # 1/2-in pipe, D/d 4.7
    ("1.25m-pipe-22.2-s56-free", 223.5e6, (222.0e6, 225.0e6), 0.022225, 0.056),  # 3/4-in pipe, D/d 2.5
)


def plan():
    """(venv) The model's dimensions for each design, as tests/test_jpole_nec.py model_design."""
    sys.path.insert(0, str(ROOT / "tests"))
    sys.path.insert(0, str(ROOT))
    import test_jpole_nec as acc
    from dataclasses import asdict
    rows = []
    for name, f0, band, d, s in DESIGNS:
        case = acc.Case(name, f0, band, d, d, s, "vertical", 3.0, acc.FREE)
        _, L, S, T = acc.model_design(case)
        c = asdict(case)
        c["band"] = list(c["band"])
        rows.append(dict(name=name, case=c, L_model=L, S_model=S, T_model=T))
        print(f"{name:28s} L {L:.4f} S {S:.4f} T {T:.4f}")
    PLAN.write_text(json.dumps(rows, indent=1))


def jpole_row(name, m=2, scale_s=1.0, scale_t=1.0):
    """(Debian) FDTD sweep of one planned design (stub/tap optionally scaled); row appended to
    fdtd-jpoles.json in bench/nec_study.py's layout."""
    r = next(p for p in json.loads(PLAN.read_text()) if p["name"] == name)
    c = r["case"]
    L, S, T = r["L_model"], r["S_model"] * scale_s, r["T_model"] * scale_t
    f0 = c["f0"]
    f = f0 * np.linspace(0.9, 1.1, 41)
    z, info = jpole_fdtd(f"jp-{name}-{m}-{scale_s}-{scale_t}", L, S, T, c["spacing"], c["stub_d"], f0, f, m=m,
                         wire_d=c["wire_d"])
    row = dict(name=name, case=c, L_model=r["L_model"], S_model=r["S_model"], T_model=r["T_model"],
               points=[[L, S, T, float(fi), float(zi.real), float(zi.imag)] for fi, zi in zip(f, z)],
               source="openEMS FDTD", mesh=_mesh_info(info), script=SCRIPT,
               command=f"jpole {name} {m} {scale_s} {scale_t}", date=_now())
    _append(JPOLES, row)
    zf0 = z[len(f) // 2]
    print(f"{name} m={m} S*{scale_s} T*{scale_t}: Z(f0) {zf0:.2f}, SWR {swr50(zf0):.3f}, "
          f"{info['run_s']:.0f} s, {info['cells']} cells")


def swr50(z):
    g = np.abs((np.asarray(z) - 50) / (np.asarray(z) + 50))
    return (1 + g) / (1 - g)


def proof_dipole(name, length, d, f0, m):
    f = f0 * np.linspace(0.8, 1.2, 41)
    z, info = dipole_fdtd(f"dip-{name}-{m}", length, d, f0, f, m)
    fr, rr = resonance(f, z)
    _append(PROOFS, dict(kind="dipole", name=name, length=length, d=d, f0=f0, f=list(map(float, f)),
                         z=_c(z), f_res=fr, r_res=rr, source="openEMS FDTD", mesh=_mesh_info(info),
                         script=SCRIPT, command=f"dipole-proof {name} {length} {d} {f0} {m}",
                         date=_now()))
    print(f"dipole {name} m={m}: resonance {fr/1e6:.3f} MHz, R {rr:.2f} ohm, {info['run_s']:.0f} s")


def proof_stub(name, l, s, d, f0, m):
    f = f0 * np.linspace(0.6, 1.4, 41)
    z, info = stub_fdtd(f"stub-{name}-{m}", l, s, d, f0, f, m)
    _append(PROOFS, dict(kind="stub", name=name, l=l, s=s, d=d, f0=f0, f=list(map(float, f)),
                         z=_c(z), source="openEMS FDTD", mesh=_mesh_info(info), script=SCRIPT,
                         command=f"stub-proof {name} {l} {s} {d} {f0} {m}", date=_now()))
    print(f"stub {name} m={m}: {info['run_s']:.0f} s")


def resonance(f, z):
    """First X = 0 crossing (rising) and R there, by linear interpolation."""
    x = z.imag
    i = np.where((x[:-1] < 0) & (x[1:] >= 0))[0]
    if not len(i):
        return None, None
    i = i[0]
    fr = float(np.interp(0.0, x[i:i + 2], f[i:i + 2]))
    return fr, float(np.interp(fr, f, z.real))


def _stub_fit(rows, with_gap=True):
    """Least-squares fit of the stub sweeps (one or several lengths l, same line) to line theory:
    X = Z0 tan(k (l + delta)) seen through the port gap's capacitance C in parallel (the one-cell
    gap is a small capacitor the NEC-2 delta gap does not have), points with |X| under 3 Z0 (away
    from the quarter-wave pole). Returns Z0, delta, C and the rms misfit."""
    from scipy.optimize import least_squares
    z0t = 120 * math.acosh(rows[0]["s"] / rows[0]["d"])
    f, x, l = [], [], []
    for r in rows:
        zz = np.asarray(r["z"])
        use = np.abs(zz[:, 1]) < 3 * z0t
        f += list(np.asarray(r["f"])[use])
        x += list(zz[use, 1])
        l += [r["l"]] * int(use.sum())
    f, x, l = map(np.asarray, (f, x, l))
    k = 2 * np.pi * f / C0

    def model(p):
        xl = p[0] * np.tan(k * (l + p[1]))
        return 1.0 / (1.0 / xl - 2 * np.pi * f * p[2] * 1e-12) if with_gap else xl

    sol = least_squares(lambda p: model(p) - x, [z0t, 0.5 * rows[0]["s"], 0.3][:3 if with_gap else 2])
    z0, delta = sol.x[:2]
    return dict(z0_fit=float(z0), z0_theory=z0t, z0_error=float(z0 / z0t - 1), delta_m=float(delta),
                delta_spacings=float(delta / rows[0]["s"]),
                gap_pf=float(sol.x[2]) if with_gap else None,
                rms_ohm=float(np.sqrt(np.mean(sol.fun ** 2))), n=int(len(f)))


def report():
    """(venv) Proof figures and the J-pole table: FDTD SWR at f0 and 2:1 band, NEC-2 at the same
    dimensions (tests/necref.py), written to bench/data/fdtd-summary.json and printed."""
    sys.path.insert(0, str(ROOT / "tests"))
    sys.path.insert(0, str(ROOT))
    import necref
    import test_jpole_nec as acc
    out = dict(date=_now(), script=SCRIPT, dipoles=[], stubs=[], jpoles=[])
    proofs = json.loads(PROOFS.read_text()) if PROOFS.exists() else []
    for r in proofs:
        if r["kind"] == "dipole":
            f = np.asarray(r["f"])
            nseg = 21 if r["length"] / r["d"] < 60 else 31
            zn = necref.dipole(r["length"], r["d"], f, nseg=nseg).z_feed
            fn, rn = resonance(f, zn)
            e = dict(name=r["name"], m=r["mesh"]["m"], h_mm=r["mesh"]["h"] * 1e3,
                     length_over_d=r["length"] / r["d"], f_res_fdtd=r["f_res"], r_res_fdtd=r["r_res"],
                     f_res_nec=fn, r_res_nec=rn, nec_segments=nseg, run_s=r["mesh"]["run_s"])
            out["dipoles"].append(e)
            print(f"dipole {r['name']:10s} m={e['m']} h {e['h_mm']:.2f} mm: FDTD {r['f_res']/1e6:.3f} MHz "
                  f"R {r['r_res']:.2f}; NEC-2 ({nseg} seg) {fn/1e6:.3f} MHz R {rn:.2f}; "
                  f"df {100*(r['f_res']/fn-1):+.2f} %, {e['run_s']:.0f} s")
    groups = {}
    for r in proofs:
        if r["kind"] == "stub":
            groups.setdefault((r["name"], r["mesh"]["m"]), []).append(r)
    for (name, m), rs in groups.items():
        for sel, label in [([r], f"l {r['l']:.3f}") for r in rs] + ([(rs, "joint")] if len(rs) > 1 else []):
            for gap in (True, False):
                e = dict(name=name, m=m, fit=label, lengths=[r["l"] for r in sel], s=sel[0]["s"],
                         d=sel[0]["d"], **_stub_fit(sel, gap), run_s=[r["mesh"]["run_s"] for r in sel])
                out["stubs"].append(e)
                gp = f", gap C {e['gap_pf']:.3f} pF" if gap else " (no gap C)"
                print(f"stub {name} m={m} {label}: Z0 fit {e['z0_fit']:.2f} theory {e['z0_theory']:.2f} "
                      f"({100*e['z0_error']:+.2f} %), delta {e['delta_m']*1e3:.1f} mm = "
                      f"{e['delta_spacings']:.2f} s{gp}, rms {e['rms_ohm']:.2f} ohm")
    rows = json.loads(JPOLES.read_text()) if JPOLES.exists() else []
    for r in rows:
        case = acc.Case(**{**r["case"], "band": tuple(r["case"]["band"])})
        pts = np.asarray(r["points"])
        L, S, T = pts[0, :3]
        f = pts[:, 3]
        z = pts[:, 4] + 1j * pts[:, 5]
        s_f = swr50(z)
        i0 = int(np.argmin(np.abs(f - case.f0)))
        zn = necref.jpole_model(case.nec_dims(L, S, T), f).z_feed
        s_n = swr50(zn)
        # the same with each bar in 3 segments (the corrected DESIGN.md §7 rule for bars)
        zn3 = necref.jpole_model(case.nec_dims(L, S, T), f, bar_segments=3).z_feed
        s_n3 = swr50(zn3)
        bf, bn = acc.band_2to1(f, s_f), acc.band_2to1(f, s_n)
        e = dict(name=r["name"], m=r["mesh"]["m"], L=L, S=S, T=T, scale_s=S / r["S_model"],
                 scale_t=T / r["T_model"], z_fdtd_f0=[float(z[i0].real), float(z[i0].imag)],
                 swr_fdtd_f0=float(s_f[i0]), band2_fdtd=bf, f_min_fdtd=float(f[np.argmin(s_f)]),
                 swr_min_fdtd=float(s_f.min()),
                 z_nec_f0=[float(zn[i0].real), float(zn[i0].imag)], swr_nec_f0=float(s_n[i0]),
                 band2_nec=bn, swr_nec_bars3_f0=float(s_n3[i0]), band2_nec_bars3=acc.band_2to1(f, s_n3),
                 run_s=r["mesh"]["run_s"], cells=r["mesh"]["cells"])
        out["jpoles"].append(e)
        fb = lambda b: "none" if b is None else f"{b[0]/1e6:.2f}-{b[1]/1e6:.2f}"
        print(f"{r['name']:26s} m={e['m']} S*{e['scale_s']:.3f} T*{e['scale_t']:.3f} "
              f"FDTD Z {z[i0]:.1f} SWR {s_f[i0]:.2f} (min {s_f.min():.2f} at {e['f_min_fdtd']/1e6:.2f}) "
              f"2:1 {fb(bf)} | NEC Z {zn[i0]:.1f} SWR {s_n[i0]:.2f} 2:1 {fb(bn)} | NEC 3-seg bars SWR {s_n3[i0]:.2f} | {e['run_s']:.0f} s")
    (DATA / "fdtd-summary.json").write_text(json.dumps(out, indent=1))


def _c(z):
    return [[float(v.real), float(v.imag)] for v in np.atleast_1d(z)]


def main(argv):
    cmd = argv[0] if argv else ""
    if cmd == "plan":
        plan()
        return 0
    if cmd == "report":
        report()
        return 0
    if cmd == "jpole":     # jpole NAME M [SCALE_S SCALE_T]
        jpole_row(argv[1], int(argv[2]), *(float(v) for v in argv[3:5]))
        return 0
    if cmd == "dipole-proof":   # NAME LENGTH D F0 M
        proof_dipole(argv[1], float(argv[2]), float(argv[3]), float(argv[4]), int(argv[5]))
        return 0
    if cmd == "stub-proof":     # NAME L S D F0 M
        proof_stub(argv[1], *(float(v) for v in argv[2:6]), int(argv[6]))
        return 0
    if cmd == "static":   # quick look at the calibration: static s d m
        s, d, m = float(argv[1]), float(argv[2]), int(argv[3])
        st = _settings(146e6)
        w, z = calibrate_width(s, d, m, st["margin"], st["hmax_xy"])
        print(f"w {w*1e3:.3f} mm (w/d {w/d:.4f}), Z0 grid {z:.3f}, theory {120*math.acosh(s/d):.3f}")
        return 0
    if cmd == "dipole":   # dipole LENGTH D F0 M [half]
        length, d, f0, m = float(argv[1]), float(argv[2]), float(argv[3]), int(argv[4])
        half = "half" in argv
        f = f0 * np.linspace(0.8, 1.2, 41)
        z, info = dipole_fdtd(f"dip-{m}", length, d, f0, f, m, half=half)
        print(json.dumps(info))
        for fi, zi in zip(f, z):
            print(f"{fi/1e6:9.3f} {zi.real:9.3f} {zi.imag:9.3f}")
        return 0
    sys.exit(__doc__)


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
