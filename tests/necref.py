"""NEC-2 reference harness (PyNEC): builds wire models of the antenna from dimensions; test/bench only.

It owns the NEC-2 meshing rules of DESIGN.md §7 and nothing of the product: buildsheet never imports
it, it never imports buildsheet (so the reference cannot inherit a bug of the model it checks).
The tests and bench import it with `sys.path` pointing at tests/.

Geometry (SI, metres; z up, ground plane z = 0):
  conductor A of the stub at x = 0, conductor B at x = -spacing, both in the x-z plane;
  the radiator continues from conductor A's open-top end, conductor B ends there (open);
  horizontal: stub hangs down from the open top at z = height, radiator runs along +x at z = height;
  sloper: as horizontal, radiator runs along +x sloping down at `slope` below horizontal;
  vertical: short at z = height, stub stands up, radiator continues straight up from A;
  inverted: the vertical turned upside down: short at z = height, the stub hangs down from it, the
  radiator continues straight down from A's open end (its far end is the lowest point).
  The short bar and the tap bar join A and B; the feed is a 1 V source on the tap bar's middle segment.

Symbols: f frequency (Hz), lam free-space wavelength (m), a radius (m), s spacing (m),
  L radiator length, S stub length (open top to short), T tap distance (short to tap), all m.

Meshing (DESIGN.md §7, "Meshing NEC-2 for a two-wire stub", the corrected rule): each bar (short,
  tap) in 3 segments (5 for refinement studies), each at least 8 conductor radii long (fewer, an odd
  count, only where the spacing is too small for that); every stub wire graded from the bar's segment
  length, growing by at most 1.3 per segment up to min(lam/40, 8 s); the open top is graded the same
  way (the stub's top and the radiator's start from the bar's segment length), the radiator growing
  to about lam/242 (never under 3 radii); both conductors split at the tap, with the same segment
  lengths on A and B so segment ends line up across the line; the source on the tap bar's middle
  segment; the extended thin-wire
  kernel where any segment is under 8 radii. tests/test_nec_harness.py proves this mesh before the
  model is judged by it: a plain shorted stub against line theory, refinement (growth, segment size,
  bar segments) moving a J-pole's feed impedance by under 1 ohm, the average gain of lossless wires,
  and the dipole of CHECK_VALUES §3d.

Patterns (physics/pattern.py's checks): pattern() runs one frequency with an RP card and returns NEC's
power-gain grid, radiated fraction and segment currents with their lengths; dipole_wires() builds a
horizontal or vertical centre-fed dipole for it.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

import numpy as np
import PyNEC

C0 = 299_792_458.0

# Tags of the J-pole wires, fixed so callers can pick currents by part.
TAG_RADIATOR = 1
TAG_A_LOW, TAG_A_HIGH, TAG_B_LOW, TAG_B_HIGH = 2, 3, 4, 5
TAG_SHORT, TAG_TAP = 6, 7


def awg_diameter(n: int) -> float:
    """AWG wire diameter (m): d = 0.127 mm * 92**((36 - n)/39) (ASTM B258)."""
    return 0.127e-3 * 92.0 ** ((36 - n) / 39)


@dataclass(frozen=True)
class Ground:
    """kind: 'free-space' | 'perfect' | 'real'; eps_r, sigma (S/m) for real ground.
    method for real ground: 'sommerfeld' (GN 2) or 'reflection' (GN 0, Fresnel reflection coefficient)."""
    kind: str = "free-space"
    eps_r: float = 13.0
    sigma: float = 0.005
    method: str = "sommerfeld"


@dataclass(frozen=True)
class JPoleDims:
    """All dimensions (m) and conductors of one J-pole, as built; see the module docstring for axes.
    sigma values in S/m (None = perfect conductor). height: open top (horizontal/sloper) or short
    (vertical, inverted) above ground. slope: rad below horizontal (sloper only)."""
    radiator: float
    stub: float
    tap: float
    spacing: float
    wire_d: float
    stub_d: float
    orientation: str = "horizontal"
    height: float = 10.0
    slope: float = 0.0
    ground: Ground = field(default_factory=Ground)
    wire_sigma: float | None = 5.8e7
    stub_sigma: float | None = 5.8e7


@dataclass(frozen=True)
class Wire:
    """A straight wire from p1 to p2 (m) of `radius` (m), in nseg equal segments, or graded: seglens
    gives the segment lengths from p1 (they add up to the wire's length; nseg = len(seglens))."""
    tag: int
    nseg: int
    p1: tuple[float, float, float]
    p2: tuple[float, float, float]
    radius: float
    seglens: tuple[float, ...] | None = None

    def segment_lengths(self) -> tuple[float, ...]:
        if self.seglens is not None:
            return self.seglens
        return (math.dist(self.p1, self.p2) / self.nseg,) * self.nseg


@dataclass(frozen=True)
class Mesh:
    """The knobs of the DESIGN.md §7 mesh, for refinement studies: growth per segment away from a bar
    (<= 1.3), a factor on the largest segments (stub and radiator; 0.5 halves them), segments per bar
    (odd: the source sits in the middle one)."""
    growth: float = 1.3
    scale: float = 1.0
    bar_segments: int = 3


MESH = Mesh()


@dataclass(frozen=True)
class NecResult:
    """z_feed: complex feed impedance per frequency (ohm); currents: per frequency a dict
    tag -> (positions along the wire from its p1 (m), complex segment currents (A) for 1 V drive)."""
    f_hz: np.ndarray
    z_feed: np.ndarray
    currents: tuple[dict[int, tuple[np.ndarray, np.ndarray]], ...] | None
    wires: tuple[Wire, ...]
    extended_kernel: bool
    average_gain: np.ndarray | None = None


def _nseg(length: float, target: float, radius: float, odd: bool = False) -> int:
    """Segments for a uniform wire: near `target` long, never shorter than 3 radii."""
    n = max(1, round(length / target))
    n = min(n, max(1, int(length / (3.0 * radius))))
    if odd and n % 2 == 0:
        n = n + 1 if length / (n + 1) >= 3.0 * radius else n - 1
    return max(1, n)


def bar_segments(spacing: float, radius: float, wanted: int = 3) -> int:
    """Segments of a bar across the line: `wanted` (odd: the source sits in the middle one).

    DESIGN.md §7 asks for bar segments of at least 8 radii and fewer only where that is impossible;
    measured on plain shorted stubs (tests/test_nec_harness.py), a one-segment bar reads the line's
    Z0 about 10 % high even where its segment is long enough, while three segments of only 2-6 radii
    with the extended thin-wire kernel stay within 2 %. So the bar keeps `wanted` segments down to
    2 radii each (the extended kernel switches on below 8 radii, needs_extended_kernel) and drops to
    fewer only below that, where the spacing is under about 6 radii and NEC-2 is no reference at
    all (DESIGN.md §7, fat conductors)."""
    n = wanted
    while n > 1 and spacing / n < 2.0 * radius:
        n -= 2
    return n


def graded(length: float, h_start: float | None, h_end: float | None, h_max: float,
           growth: float) -> tuple[float, ...]:
    """Segment lengths along a section of `length` (m): h_start at its start and h_end at its end
    (None: no grading at that end), each next one `growth` times the last, up to h_max; between the
    two ramps a uniform middle whose segments are within `growth` of both ramps' last ones and no
    longer than h_max. Where that cannot be had (a short section), the ramps are cut back from their
    long ends until it can."""
    def ramp(h):
        out = []
        while h is not None and h < h_max:
            out.append(h)
            h *= growth
        return out
    left, right = ramp(h_start), ramp(h_end)
    while True:
        ends = [r[-1] for r in (left, right) if r]
        rest = length - sum(left) - sum(right)
        lo = max(ends) / growth if ends else 0.0
        hi = min([h_max] + [e * growth for e in ends])
        n_mid = math.ceil(rest / hi * (1 - 1e-12)) if rest > 0 else 0
        if not ends or (n_mid > 0 and rest / n_mid >= lo * (1 - 1e-12)):
            break
        (left if left and (not right or left[-1] >= right[-1]) else right).pop()
    n_mid = max(n_mid, 1)
    return tuple(left + [rest / n_mid] * n_mid + right[::-1])


def jpole_wires(d: JPoleDims, f_mesh: float, mesh: Mesh = MESH,
                like: JPoleDims | None = None) -> tuple[Wire, ...]:
    """Wires of the J-pole meshed for f_mesh (Hz; use the highest frequency of the run) by the
    DESIGN.md §7 rule; `mesh` changes its knobs for refinement studies.

    like: mesh the radiator, the two stub sections and the bars as for the dimensions `like`, each
    section's segments scaled by its length over like's. The rule's segment counts change in steps
    with the lengths, and each step moves the feed impedance by a fraction of an ohm: enough to
    spoil a finite difference or a Newton step over a few millimetres. Studies that move the
    lengths a little (searches, sensitivities) mesh every point like their starting point, so that
    the impedance they differentiate is a smooth function of the lengths."""
    if like is not None:
        base = {w.tag: w for w in jpole_wires(like, f_mesh, mesh)}
        wires = jpole_wires(d, f_mesh, mesh)
        out = []
        for w in wires:
            b = base[w.tag]
            length = math.dist(w.p1, w.p2)
            scale = length / math.dist(b.p1, b.p2)
            segs = tuple(h * scale for h in b.segment_lengths())
            out.append(replace(w, nseg=len(segs), seglens=segs))
        return tuple(out)
    if not 0.0 < d.tap < d.stub:
        raise ValueError(f"tap {d.tap} m must lie between the short and the open top (stub {d.stub} m)")
    lam = C0 / f_mesh
    s, a_s, a_w = d.spacing, d.stub_d / 2.0, d.wire_d / 2.0
    h_stub = mesh.scale * min(lam / 40.0, 8.0 * s)
    h_rad = max(mesh.scale * lam / 242.0, 3.0 * a_w)
    n_bar = bar_segments(s, a_s, mesh.bar_segments)
    h_bar = s / n_bar
    low = graded(d.tap, h_bar, h_bar, h_stub, mesh.growth)
    # the open top is a junction at the scale of the spacing too: the stub's top and the radiator's
    # start are graded from the bar's segment length as well
    # (a segment meeting the radiator is kept at least 3 radiator radii long: NEC-2 refuses a
    # shorter one at a junction with a much thicker wire)
    h_top = max(h_bar, 3.0 * a_w)
    high = graded(d.stub - d.tap, h_bar, h_top, h_stub, mesh.growth)
    rad = graded(d.radiator, h_top, None, h_rad, mesh.growth)

    if d.orientation == "vertical":
        z_short, z_tap, z_top = d.height, d.height + d.tap, d.height + d.stub
        rad_end = (0.0, 0.0, z_top + d.radiator)
    elif d.orientation == "inverted":
        z_short, z_tap, z_top = d.height, d.height - d.tap, d.height - d.stub
        rad_end = (0.0, 0.0, z_top - d.radiator)
    elif d.orientation in ("horizontal", "sloper"):
        z_top = d.height
        z_short, z_tap = z_top - d.stub, z_top - d.stub + d.tap
        psi = d.slope if d.orientation == "sloper" else 0.0
        rad_end = (d.radiator * math.cos(psi), 0.0, z_top - d.radiator * math.sin(psi))
    else:
        raise ValueError(f"orientation {d.orientation!r}: expected horizontal, sloper, vertical or "
                         "inverted")
    if d.ground.kind != "free-space":
        lowest = min(z_short, rad_end[2])
        if lowest <= max(3 * a_s, 1e-3 * lam):
            raise ValueError(f"structure reaches z = {lowest:.3f} m: below or touching the ground")
    xa, xb = 0.0, -s
    return (
        Wire(TAG_RADIATOR, len(rad), (xa, 0.0, z_top), rad_end, a_w, rad),
        Wire(TAG_A_LOW, len(low), (xa, 0.0, z_short), (xa, 0.0, z_tap), a_s, low),
        Wire(TAG_A_HIGH, len(high), (xa, 0.0, z_tap), (xa, 0.0, z_top), a_s, high),
        Wire(TAG_B_LOW, len(low), (xb, 0.0, z_short), (xb, 0.0, z_tap), a_s, low),
        Wire(TAG_B_HIGH, len(high), (xb, 0.0, z_tap), (xb, 0.0, z_top), a_s, high),
        Wire(TAG_SHORT, n_bar, (xa, 0.0, z_short), (xb, 0.0, z_short), a_s),
        Wire(TAG_TAP, n_bar, (xa, 0.0, z_tap), (xb, 0.0, z_tap), a_s),
    )


def stub_wires(length: float, spacing: float, diameter: float, f_mesh: float,
               mesh: Mesh = MESH) -> tuple[Wire, ...]:
    """A plain shorted two-wire stub in free space, meshed as the J-pole's stub (DESIGN.md §7): the
    short bar at z = 0, the feed bar (tag TAG_TAP, source in its middle segment) at z = length,
    lengths between the bars' centre lines; conductors A at x = 0 and B at x = -spacing."""
    lam = C0 / f_mesh
    a = diameter / 2.0
    n_bar = bar_segments(spacing, a, mesh.bar_segments)
    h_bar = spacing / n_bar
    segs = graded(length, h_bar, h_bar, mesh.scale * min(lam / 40.0, 8.0 * spacing), mesh.growth)
    xb = -spacing
    return (
        Wire(TAG_A_LOW, len(segs), (0.0, 0.0, 0.0), (0.0, 0.0, length), a, segs),
        Wire(TAG_B_LOW, len(segs), (xb, 0.0, 0.0), (xb, 0.0, length), a, segs),
        Wire(TAG_SHORT, n_bar, (0.0, 0.0, 0.0), (xb, 0.0, 0.0), a),
        Wire(TAG_TAP, n_bar, (0.0, 0.0, length), (xb, 0.0, length), a),
    )


def stub_model(length: float, spacing: float, diameter: float, f_hz, mesh: Mesh = MESH,
               sigma: float | None = None) -> NecResult:
    """Input impedance (ohm) of the plain shorted stub of stub_wires at each frequency (Hz)."""
    f_hz = np.atleast_1d(np.asarray(f_hz, dtype=float))
    wires = stub_wires(length, spacing, diameter, float(f_hz.max()), mesh)
    bar = wires[-1]
    return run(wires, f_hz, Ground(), (TAG_TAP, (bar.nseg + 1) // 2),
               {w.tag: sigma for w in wires})


def needs_extended_kernel(wires: tuple[Wire, ...]) -> bool:
    """True where any segment is shorter than about 8 radii (DESIGN.md §7)."""
    return any(min(w.segment_lengths()) < 8.0 * w.radius for w in wires)


def _context(wires: tuple[Wire, ...], ground: Ground, sigma: dict[int, float | None] | None,
             extended_kernel: bool):
    """A PyNEC context holding `wires` (GW cards; a graded wire as one card per segment, all with
    the wire's tag: NEC numbers the segments of a tag in order, so EX and LD cards address them as
    one wire), LD 5 conductivity per tag, the extended kernel if asked, and the ground (GN -1 free
    space, GN 1 perfect, real: GN 2 Sommerfeld-Norton or GN 0 reflection coefficient)."""
    ctx = PyNEC.nec_context()
    geo = ctx.get_geometry()
    for w in wires:
        if w.seglens is None:
            geo.wire(w.tag, w.nseg, *w.p1, *w.p2, w.radius, 1.0, 1.0)
            continue
        p1, p2 = np.asarray(w.p1), np.asarray(w.p2)
        u = (p2 - p1) / np.linalg.norm(p2 - p1)
        ends = np.concatenate([[0.0], np.cumsum(w.seglens)])
        ends[-1] = np.linalg.norm(p2 - p1)
        for e0, e1 in zip(ends[:-1], ends[1:]):
            geo.wire(w.tag, 1, *(p1 + e0 * u), *(p1 + e1 * u), w.radius, 1.0, 1.0)
    ctx.geometry_complete(1 if ground.kind != "free-space" else 0)
    if extended_kernel:
        ctx.set_extended_thin_wire_kernel(True)
    for tag, sg in (sigma or {}).items():
        if sg is not None:
            ctx.ld_card(5, tag, 0, 0, sg, 0.0, 0.0)
    if ground.kind == "free-space":
        ctx.gn_card(-1, 0, 0, 0, 0, 0, 0, 0)
    elif ground.kind == "perfect":
        ctx.gn_card(1, 0, 0, 0, 0, 0, 0, 0)
    elif ground.kind == "real":
        ctx.gn_card(2 if ground.method == "sommerfeld" else 0, 0, ground.eps_r, ground.sigma, 0, 0, 0, 0)
    else:
        raise ValueError(f"ground kind {ground.kind!r}")
    return ctx


def run(wires: tuple[Wire, ...], f_hz, ground: Ground, source: tuple[int, int],
        sigma: dict[int, float | None] | None = None, currents: bool = False,
        extended_kernel: bool | None = None, pattern_step_deg: float | None = None) -> NecResult:
    """Run NEC-2 on `wires` at each frequency; 1 V source on (tag, segment); sigma per tag (S/m) as
    LD 5 wire conductivity. Ground: GN -1 free space, GN 1 perfect, real: GN 2 (Sommerfeld-Norton) or
    GN 0 (reflection coefficient). Returns the input impedance at the source per frequency.
    pattern_step_deg: also the radiated fraction, radiated power (over the sphere in free space, the
    upper hemisphere over ground) over the power put in, in NecResult.average_gain: NEC's average
    power gain from an RP card with that step in theta and phi (NEC-2 user's guide, RP card, XNDA
    A = 1) times the solid angle it averaged over, over 4 pi."""
    f_hz = np.atleast_1d(np.asarray(f_hz, dtype=float))
    ek = needs_extended_kernel(wires) if extended_kernel is None else extended_kernel
    ctx = _context(wires, ground, sigma, ek)
    ctx.ex_card(0, source[0], source[1], 0, 1.0, 0.0, 0, 0, 0, 0)
    z = np.empty(len(f_hz), dtype=complex)
    gain = np.empty(len(f_hz)) if pattern_step_deg else None
    cur = []
    for i, f in enumerate(f_hz):
        ctx.fr_card(0, 1, f / 1e6, 0.0)
        if pattern_step_deg:
            step = float(pattern_step_deg)
            top = 180.0 if ground.kind == "free-space" else 90.0
            n_th = int(round(top / step)) + 1
            n_ph = int(round(360.0 / step)) + 1
            ctx.rp_card(0, n_th, n_ph, 0, 0, 0, 1, 0.0, 0.0, step, step, 0.0, 0.0)
            rp = ctx.get_radiation_pattern(i)
            # the average over the solid angle covered, times its share of the sphere
            # PyNEC gives the solid angle in units of pi steradians (a hemisphere reads 2)
            gain[i] = rp.get_average_power_gain() * rp.get_average_power_solid_angle() / 4.0
        else:
            ctx.xq_card(0)
        z[i] = ctx.get_input_parameters(i).get_impedance()[0]
        if currents:
            cur.append(_currents(ctx.get_structure_currents(i), wires, C0 / f))
    return NecResult(f_hz, z, tuple(cur) if currents else None, tuple(wires), ek, gain)


def _currents(sc, wires, lam):
    """Segment currents by tag with positions along each wire; PyNEC gives centres in wavelengths."""
    tags = np.asarray(sc.get_current_segment_tag())
    i_seg = np.asarray(sc.get_current())
    xyz = np.column_stack([sc.get_current_segment_center_x(), sc.get_current_segment_center_y(),
                           sc.get_current_segment_center_z()]) * lam
    out = {}
    for w in wires:
        m = tags == w.tag
        out[w.tag] = (np.linalg.norm(xyz[m] - np.asarray(w.p1), axis=1), i_seg[m])
    return out


def jpole_model(d: JPoleDims, f_hz, currents: bool = False, f_mesh: float | None = None,
                extended_kernel: bool | None = None, mesh: Mesh = MESH,
                pattern_step_deg: float | None = None, like: JPoleDims | None = None) -> NecResult:
    """NEC-2 model of the J-pole from its dimensions: feed impedance (ohm) at each frequency (Hz),
    and optionally the currents. Meshed for f_mesh (default: the highest frequency); like: see
    jpole_wires."""
    f_hz = np.atleast_1d(np.asarray(f_hz, dtype=float))
    wires = jpole_wires(d, f_mesh or float(f_hz.max()), mesh, like)
    tap_bar = wires[TAG_TAP - 1]
    sigma = {TAG_RADIATOR: d.wire_sigma, **{t: d.stub_sigma for t in range(2, 8)}}
    return run(wires, f_hz, d.ground, (TAG_TAP, (tap_bar.nseg + 1) // 2), sigma, currents,
               extended_kernel, pattern_step_deg)


def dipole(length: float, diameter: float, f_hz, height: float = 0.0, nseg: int = 51,
           ground: Ground = Ground(), sigma: float | None = None) -> NecResult:
    """Centre-fed straight dipole along x (horizontal at `height` m), the harness's self-check
    against CHECK_VALUES §3c/§3d."""
    wires = (Wire(1, nseg, (-length / 2, 0.0, height), (length / 2, 0.0, height), diameter / 2),)
    return run(wires, f_hz, ground, (1, (nseg + 1) // 2), {1: sigma})


def common_mode_ratio(res: NecResult, index: int = 0) -> float:
    """Peak |I_A + I_B| along the stub (the common-mode current) over the radiator's peak |I|;
    needs currents. The sections of A and B have aligned segments, so they add element by element."""
    cur = res.currents[index]
    i_cm = np.concatenate([cur[TAG_A_LOW][1] + cur[TAG_B_LOW][1], cur[TAG_A_HIGH][1] + cur[TAG_B_HIGH][1]])
    return float(np.max(np.abs(i_cm)) / np.max(np.abs(cur[TAG_RADIATOR][1])))


def with_dims(d: JPoleDims, **changes) -> JPoleDims:
    """A copy of d with some fields changed (for sweeps in studies)."""
    return replace(d, **changes)


# ---- Radiation patterns (for physics/pattern.py's checks) ----

@dataclass(frozen=True)
class NecPattern:
    """One NEC-2 run with an RP card over the upper hemisphere (over ground) or the sphere (free space).

    theta_deg, phi_deg: the grid (theta from the zenith); gain_dbi: NEC's power gain, dBi, relative to
    the power put in, shape (len(theta_deg), len(phi_deg)) (-999 where NEC gives no field);
    radiated_fraction: NEC's average power gain times the solid angle it averaged over, over 4 pi
    (the space wave's power over the power put in); z_in: input impedance, ohm; currents: as
    NecResult.currents for this frequency, with the segment lengths: tag -> (positions from p1 (m),
    segment lengths (m), currents (A, for the 1 V drive))."""
    theta_deg: np.ndarray
    phi_deg: np.ndarray
    gain_dbi: np.ndarray
    radiated_fraction: float
    z_in: complex
    currents: dict


def dipole_wires(length: float, diameter: float, height: float, orientation: str = "horizontal",
                 nseg: int = 51) -> tuple[Wire, ...]:
    """A straight dipole of `length` (m) with its centre at `height` (m): along x (horizontal) or z
    (vertical); tag 1, source on the middle segment."""
    if orientation == "horizontal":
        p1, p2 = (-length / 2, 0.0, height), (length / 2, 0.0, height)
    elif orientation == "vertical":
        p1, p2 = (0.0, 0.0, height - length / 2), (0.0, 0.0, height + length / 2)
    else:
        raise ValueError(f"orientation {orientation!r}: expected horizontal or vertical")
    return (Wire(1, nseg, p1, p2, diameter / 2),)


def pattern(wires: tuple[Wire, ...], f: float, ground: Ground, source: tuple[int, int],
            sigma: dict[int, float | None] | None = None, theta_step: float = 1.0,
            phi_step: float = 5.0, extended_kernel: bool | None = None) -> NecPattern:
    """NEC-2 run of `wires` at f (Hz) with a 1 V source on (tag, segment), LD 5 conductivity per tag,
    the ground as in run(), and an RP card of power gain over theta 0..90 (0..180 in free space) by
    theta_step and phi 0..360 by phi_step degrees, averaged (XNDA = 0001: NEC-2 user's guide, RP)."""
    ek = needs_extended_kernel(wires) if extended_kernel is None else extended_kernel
    ctx = _context(wires, ground, sigma, ek)
    ctx.ex_card(0, source[0], source[1], 0, 1.0, 0.0, 0, 0, 0, 0)
    ctx.fr_card(0, 1, f / 1e6, 0.0)
    top = 180.0 if ground.kind == "free-space" else 90.0
    n_th = int(round(top / theta_step)) + 1
    n_ph = int(round(360.0 / phi_step)) + 1
    ctx.rp_card(0, n_th, n_ph, 0, 0, 0, 1, 0.0, 0.0, theta_step, phi_step, 0.0, 0.0)
    rp = ctx.get_radiation_pattern(0)
    gain = np.asarray(rp.get_gain(), dtype=float).reshape(n_th, n_ph)
    frac = rp.get_average_power_gain() * rp.get_average_power_solid_angle() / 4.0
    z_in = ctx.get_input_parameters(0).get_impedance()[0]
    sc = ctx.get_structure_currents(0)
    cur = _currents(sc, wires, C0 / f)
    cur = {t: (pos, np.asarray(next(w for w in wires if w.tag == t).segment_lengths()), i)
           for t, (pos, i) in cur.items()}
    return NecPattern(np.asarray(rp.get_theta_angles(), dtype=float),
                      np.asarray(rp.get_phi_angles(), dtype=float), gain, float(frac), complex(z_in), cur)


# ---------------------------------------------------------------- coils (the coiled-coax choke)

TAG_COIL, TAG_COIL_LEAD, TAG_COIL_FEED = 21, 22, 23


def _polygon_radius(radius: float, per_turn: int) -> float:
    """Vertex radius of a regular polygon of `per_turn` sides with the area of a circle of `radius`
    (the straight-segment helix then links the same flux per turn as the true circle)."""
    return radius * math.sqrt(2.0 * math.pi / (per_turn * math.sin(2.0 * math.pi / per_turn)))


def coil_per_turn(d_mean: float, wire_radius: float, f_max: float) -> int:
    """Segments per turn: about 4 wire radii long (the extended thin-wire kernel holds down to about
    2 radii), at least 12 and at most lam/20 long at f_max."""
    circ = math.pi * d_mean
    n = max(12, round(circ / (4.0 * wire_radius)))
    return max(n, math.ceil(circ / (C0 / f_max / 20.0)))


def coil_wires(turns: int, d_mean: float, wire_radius: float, pitch: float, per_turn: int,
               gap: float | None = None) -> tuple[Wire, ...]:
    """Wires of a single-layer coil of `turns` whole turns on the z axis, driven between its ends.

    The winding is a helix of mean diameter d_mean and the given pitch, starting at (R, 0, 0) and
    ending after `turns` turns at (R, 0, turns * pitch), in straight segments `per_turn` a turn with
    vertices at the equal-area radius (`_polygon_radius`). Leads: from each end a radial wire out to
    x = R + gap, joined by a straight return wire parallel to the axis outside the winding, the 1 V
    source in the middle segment of the first radial lead (gap defaults to 8 wire radii: 6 radii of
    clearance between the return's surface and the turns'). The leads' own series inductance
    (radial stubs plus the return, which closes with the helix's net axial current a hairpin of
    length turns * pitch) stays in the result: `coil_lead_loop` gives an upper bound for it to
    compare with. A single flat turn (pitch 0) is driven in its own segment instead, with no leads
    (the loop formula's geometry).
    """
    r = d_mean / 2.0
    rp = _polygon_radius(r, per_turn)
    a = wire_radius
    n_pts = turns * per_turn
    th = 2.0 * math.pi * np.arange(n_pts + 1) / per_turn
    pts = np.column_stack([rp * np.cos(th), rp * np.sin(th), pitch * th / (2.0 * math.pi)])
    if pitch == 0.0:
        if turns != 1:
            raise ValueError("a flat coil (pitch 0) must have one turn")
        pts[-1] = pts[0]
        wires = [Wire(TAG_COIL_FEED if k == 0 else TAG_COIL, 1, tuple(pts[k]), tuple(pts[k + 1]), a)
                 for k in range(n_pts)]
        return tuple(wires)
    if pitch < 2.0 * a:
        raise ValueError(f"pitch {pitch} m is less than the wire diameter {2 * a} m: turns overlap")
    wires = [Wire(TAG_COIL, 1, tuple(pts[k]), tuple(pts[k + 1]), a) for k in range(n_pts)]
    g = 8.0 * a if gap is None else gap
    x_out = rp + g
    z_end = pitch * turns
    # segments at least 2.5 radii long (the extended kernel's range); the source in the middle one of
    # three on the first radial lead, so that it has straight neighbours (not a bend, which a 1 V
    # gap next to a corner of the leads misreads by up to 15 % on a 3-turn coil)
    n_rad = max(3, int(g / (2.5 * a)))
    n_rad -= 1 - n_rad % 2
    n_ret = max(1, int(z_end / (2.5 * a)))
    wires += [Wire(TAG_COIL_FEED, n_rad, tuple(pts[0]), (x_out, 0.0, 0.0), a),
              Wire(TAG_COIL_LEAD, n_rad, tuple(pts[-1]), (x_out, 0.0, z_end), a),
              Wire(TAG_COIL_LEAD, n_ret, (x_out, 0.0, 0.0), (x_out, 0.0, z_end), a)]
    return tuple(wires)


def coil_source(wires: tuple[Wire, ...]) -> tuple[int, int]:
    feed = [w for w in wires if w.tag == TAG_COIL_FEED][0]
    return (TAG_COIL_FEED, (feed.nseg + 1) // 2)


def coil_model(turns: int, d_mean: float, wire_radius: float, pitch: float, f_hz,
               sigma: float | None = None, per_turn: int | None = None,
               gap: float | None = None) -> NecResult:
    """NEC-2 input impedance (ohm) of a coil driven between its ends (`coil_wires`), in free space,
    at each frequency (Hz). sigma: conductivity (S/m, LD 5) of all wires, None = lossless.

    The reference for the coiled coax's outside (the shield as a wire of the coax's outer radius,
    pitch = OD; use 1.01 OD: exactly touching turns trip PyNEC's connection check). What it can
    deliver, measured: a flat ring converges to the loop formula within 0.5 % by 24 segments a
    turn; close-wound turns converge slowly and from below (9 turns of RG-58 on 110 mm: 9804, 9878,
    9944, 9996 nH at segments of 6, 4, 3, 2.5 radii, against 10313 nH for Nagaoka less Rosa plus
    the leads), so its inductance at the default 4 radii is 3-8 % low; the first self-resonance
    moves by about 1 % between 6 and 3 radii. The leads (about 0.2-1 % of L for the HF chokes, about
    3 % for one turn: `coil_lead_loop`) are kept in the result, as an analyzer's leads would be.
    NEC-2 has no jacket dielectric and its thin-wire kernel misses the extra capacitance of turns
    that nearly touch, so a real coil of jacketed coax resonates lower than this model."""
    f_hz = np.atleast_1d(np.asarray(f_hz, dtype=float))
    n = per_turn or coil_per_turn(d_mean, wire_radius, float(f_hz.max()))
    sg = {t: sigma for t in (TAG_COIL, TAG_COIL_LEAD, TAG_COIL_FEED)}
    for extra in range(3):
        # PyNEC's segment-connection check rejects a few of these meshes ("Unknown exception" from
        # geometry_complete); one more segment a turn clears it and changes the result by under 1 %
        wires = coil_wires(turns, d_mean, wire_radius, pitch, n + extra, gap)
        try:
            return run(wires, f_hz, Ground(), coil_source(wires), sg)
        except RuntimeError:
            if extra == 2:
                raise


def coil_lead_loop(turns: int, d_mean: float, wire_radius: float, pitch: float, f_hz: float,
                   per_turn: int, gap: float | None = None) -> complex:
    """The leads of `coil_wires` closed by a straight wire from the coil's start to its end in place of
    the helix (a thin rectangle of (gap) x (turns * pitch)), lossless: Z (ohm) at f_hz. Its
    inductance bounds what the leads and the hairpin they make with the helix's axial current add."""
    full = coil_wires(turns, d_mean, wire_radius, pitch, per_turn, gap)
    leads = [w for w in full if w.tag != TAG_COIL]
    p0, p1 = leads[0].p1, leads[1].p1
    n = max(3, int(math.dist(p0, p1) / (3.0 * wire_radius)))
    wires = tuple(leads) + (Wire(TAG_COIL, n, p0, p1, wire_radius),)
    return complex(run(wires, [f_hz], Ground(), coil_source(wires)).z_feed[0])


def coil_resonance(turns: int, d_mean: float, wire_radius: float, pitch: float, f_lo: float,
                   f_hi: float, sigma: float | None = None, per_turn: int | None = None,
                   gap: float | None = None, points: int = 25, rtol: float = 2e-3) -> float | None:
    """First parallel self-resonance (Hz) between f_lo and f_hi: where the input reactance crosses
    from + to -, found on a log grid and refined by bisection to rtol; None if none in the range.
    Meshed for f_hi throughout (one mesh for the whole search)."""
    n = per_turn or coil_per_turn(d_mean, wire_radius, f_hi)
    f = np.geomspace(f_lo, f_hi, points)
    x = coil_model(turns, d_mean, wire_radius, pitch, f, sigma, n, gap).z_feed.imag
    cross = np.nonzero((x[:-1] > 0) & (x[1:] <= 0))[0]
    if not len(cross):
        return None
    lo, hi = f[cross[0]], f[cross[0] + 1]
    while hi / lo - 1 > rtol:
        mid = math.sqrt(lo * hi)
        if coil_model(turns, d_mean, wire_radius, pitch, [mid], sigma, n, gap).z_feed[0].imag > 0:
            lo = mid
        else:
            hi = mid
    return math.sqrt(lo * hi)


# ---------------------------------------------------------------- the stacked (collinear) J-pole

TAG_ELEMENT2, TAG_PH_A, TAG_PH_B, TAG_PH_SHORT = 31, 32, 33, 34


@dataclass(frozen=True)
class StackDims:
    """The second half-wave and its phasing stub, as built (m): element: the upper element's length;
    phasing: the phasing stub from its open end (the gap) to the short bar's centre line; spacing and
    stub_d: its line's centre-to-centre spacing and conductor diameter; sigma (S/m, None = perfect).

    Geometry: the radiator (element 1) ends at P1; the gap between the radiator's end and element
    2's start is the phasing line's spacing, along the radiator's axis t; the phasing stub runs
    from the gap perpendicular to the axis (u: +x for a vertical, straight down for a horizontal),
    conductor A' from P1, B' from P1 + spacing t, short bar at the far end; element 2 from
    P1 + spacing t along t."""
    element: float
    phasing: float
    spacing: float
    stub_d: float
    sigma: float | None = 5.8e7


def stacked_wires(d: JPoleDims, st: StackDims, f_mesh: float, mesh: Mesh = MESH,
                  like: tuple[JPoleDims, StackDims] | None = None) -> tuple[Wire, ...]:
    """Wires of the stacked J-pole meshed by the DESIGN.md §7 rule: the J-pole of jpole_wires with
    the radiator graded toward both its ends (its top meets the phasing stub, a junction at the
    scale of the phasing spacing), the phasing stub's conductors graded from its bar's segment
    length at both ends (the open end meets the elements), its short in `bar_segments` segments,
    element 2 graded from its start. like: mesh as for those dimensions (see jpole_wires)."""
    if like is not None:
        base = {w.tag: w for w in stacked_wires(*like, f_mesh, mesh)}
        out = []
        for w in stacked_wires(d, st, f_mesh, mesh):
            b = base[w.tag]
            scale = math.dist(w.p1, w.p2) / math.dist(b.p1, b.p2)
            segs = tuple(h * scale for h in b.segment_lengths())
            out.append(replace(w, nseg=len(segs), seglens=segs))
        return tuple(out)
    base = jpole_wires(d, f_mesh, mesh)
    lam = C0 / f_mesh
    a_w, a_p = d.wire_d / 2.0, st.stub_d / 2.0
    h_rad = max(mesh.scale * lam / 242.0, 3.0 * a_w)
    h_stub = mesh.scale * min(lam / 40.0, 8.0 * st.spacing)
    n_bar = bar_segments(st.spacing, a_p, mesh.bar_segments)
    h_bar = st.spacing / n_bar
    h_j = max(h_bar, 3.0 * a_w)
    rad = base[TAG_RADIATOR - 1]
    p0, p1 = np.asarray(rad.p1), np.asarray(rad.p2)
    t = (p1 - p0) / np.linalg.norm(p1 - p0)
    u = np.array([1.0, 0.0, 0.0]) if d.orientation == "vertical" else np.array([0.0, 0.0, -1.0])
    if d.orientation == "sloper":
        raise ValueError("a stacked sloper is not modelled")
    h_top = rad.segment_lengths()[0]
    rad_segs = graded(d.radiator, h_top, h_j, h_rad, mesh.growth)
    q = p1 + st.spacing * t
    el2 = graded(st.element, h_j, None, h_rad, mesh.growth)
    ph = graded(st.phasing, h_bar, h_bar, h_stub, mesh.growth)
    tup = lambda v: tuple(float(x) for x in v)
    if d.ground.kind != "free-space" and min((p1 + st.phasing * u)[2], (q + st.element * t)[2]) <= 0:
        raise ValueError("the phasing stub reaches the ground")
    return (replace(rad, nseg=len(rad_segs), seglens=rad_segs),) + tuple(base[1:]) + (
        Wire(TAG_ELEMENT2, len(el2), tup(q), tup(q + st.element * t), a_w, el2),
        Wire(TAG_PH_A, len(ph), tup(p1), tup(p1 + st.phasing * u), a_p, ph),
        Wire(TAG_PH_B, len(ph), tup(q), tup(q + st.phasing * u), a_p, ph),
        Wire(TAG_PH_SHORT, n_bar, tup(p1 + st.phasing * u), tup(q + st.phasing * u), a_p),
    )


def stacked_model(d: JPoleDims, st: StackDims, f_hz, currents: bool = False,
                  f_mesh: float | None = None, mesh: Mesh = MESH, pattern_step_deg: float | None = None,
                  like: tuple[JPoleDims, StackDims] | None = None) -> NecResult:
    """NEC-2 model of the stacked J-pole: feed impedance (ohm) per frequency (Hz), optionally the
    currents and the radiated fraction (see run)."""
    f_hz = np.atleast_1d(np.asarray(f_hz, dtype=float))
    wires = stacked_wires(d, st, f_mesh or float(f_hz.max()), mesh, like)
    tap_bar = wires[TAG_TAP - 1]
    sigma = {TAG_RADIATOR: d.wire_sigma, TAG_ELEMENT2: d.wire_sigma,
             **{t: d.stub_sigma for t in range(2, 8)},
             **{t: st.sigma for t in (TAG_PH_A, TAG_PH_B, TAG_PH_SHORT)}}
    return run(wires, f_hz, d.ground, (TAG_TAP, (tap_bar.nseg + 1) // 2), sigma, currents,
               None, pattern_step_deg)


def stacked_pattern(d: JPoleDims, st: StackDims, f: float, theta_step: float = 1.0,
                    phi_step: float = 5.0) -> NecPattern:
    """NEC-2 pattern (see pattern()) of the stacked J-pole at f (Hz)."""
    wires = stacked_wires(d, st, f)
    tap_bar = wires[TAG_TAP - 1]
    sigma = {TAG_RADIATOR: d.wire_sigma, TAG_ELEMENT2: d.wire_sigma,
             **{t: d.stub_sigma for t in range(2, 8)},
             **{t: st.sigma for t in (TAG_PH_A, TAG_PH_B, TAG_PH_SHORT)}}
    return pattern(wires, f, d.ground, (TAG_TAP, (tap_bar.nseg + 1) // 2), sigma, theta_step, phi_step)
