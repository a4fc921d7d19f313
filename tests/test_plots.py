"""Tests of the SWR plot and the Smith chart (buildsheet/drawing/plots.py).

The input arrays are made up (a smooth series-resonant load, not an antenna model). References:
the reflection coefficient of a load, computed by scikit-rf (`skrf.network.z2s`, a one-port's S11);
the Smith chart's constant-r and constant-x contours checked by mapping points of the drawn circles
back through z = z_ref (1 + gamma) / (1 - gamma) (Smith 1939; Pozar, Microwave Engineering, 4th ed.,
§2.4); the SWR axis checked against its own printed tick labels.
"""

import math

import numpy as np
import pytest
import skrf

from buildsheet.drawing import plots
from buildsheet.drawing.plots import smith_axes, smith_chart, swr_axes, swr_plot
from buildsheet.drawing.shapes import Arc, Circle, Line, Polyline

BAND = (14.0e6, 14.35e6)
DESIGN = 14.175e6


def made_up_load(q=30.0, r=55.0, f0=DESIGN, lo=13.9e6, hi=14.45e6, n=221):
    """Frequencies (Hz), impedance (ohm), SWR at the feed and after a lossy line."""
    f = np.linspace(lo, hi, n)
    z = r + 1j * 50 * q * (f / f0 - f0 / f)
    g = np.abs((z - 50) / (z + 50))
    swr = (1 + g) / (1 - g)
    gt = g * 10 ** (-2 * 1.0 / 20)           # 1 dB of line loss each way
    return f, z, swr, (1 + gt) / (1 - gt)


def swr2_edges(f, swr):
    below = np.where(swr < 2.0)[0]
    lo, hi = below[0], below[-1]
    return (float(np.interp(2.0, [swr[lo], swr[lo - 1]], [f[lo], f[lo - 1]])),
            float(np.interp(2.0, [swr[hi], swr[hi + 1]], [f[hi], f[hi + 1]])))


def _feed_runs(d):
    return [p for p in d.primitives() if isinstance(p, Polyline) and not p.closed
            and p.width == plots.FEED_WIDTH and p.dash is None]


def _tx_runs(d):
    return [p for p in d.primitives() if isinstance(p, Polyline) and p.dash == plots.TX_DASH
            and p.width == plots.TX_WIDTH]


# ---------------------------------------------------------------- SWR plot

@pytest.mark.parametrize("q, size", [(30.0, (480, 230)), (80.0, (320, 200))])
def test_swr_curve_points_map_back_to_the_arrays(q, size):
    f, _, swr, swr_tx = made_up_load(q=q)
    edges = swr2_edges(f, swr)
    d = swr_plot(f, swr, swr_tx, BAND, DESIGN, edges, *size, "SWR")
    ax = swr_axes(f, swr, swr_tx, BAND, *size)
    for runs, curve in ((_feed_runs(d), swr), (_tx_runs(d), swr_tx)):
        assert runs
        mapped = [ax.from_page(*pt) for run in runs for pt in run.points]
        for fi, si in mapped:
            assert f[0] - 1 <= fi <= f[-1] + 1
            assert si == pytest.approx(np.interp(fi, f, curve), abs=0.01)
            assert 1.0 - 1e-9 <= si <= ax.y_max + 1e-9
        # Every sample inside the axis range is drawn.
        shown = np.count_nonzero(curve <= ax.y_max)
        drawn = sum(1 for fi, _ in mapped if np.min(np.abs(f - fi)) < 1.0)
        assert drawn >= shown
    # Read against the printed tick labels instead of the axis object: the feed curve's lowest point
    # stands at the frequency and SWR of the array's minimum.
    xs, mhz = zip(*_x_ticks(d, ax))
    y_labels = {float(t.text): t.bbox().center[1] for t in d.texts() if t.x < ax.frame.x0
                and t.rotation == 0 and t.text[0].isdigit()}
    levels = sorted(y_labels)
    lowest = max((pt for run in _feed_runs(d) for pt in run.points), key=lambda pt: pt[1])
    assert np.interp(lowest[0], xs, mhz) == pytest.approx(f[np.argmin(swr)] / 1e6, abs=0.001)
    assert np.interp(-lowest[1], [-y_labels[v] for v in levels], levels) == pytest.approx(
        swr.min(), abs=0.01)


def test_curve_above_the_top_is_clipped_at_the_frame():
    f, _, swr, swr_tx = made_up_load(q=80.0)
    ax = swr_axes(f, swr, swr_tx, BAND, 480, 230)
    assert swr.max() > ax.y_max                       # the case under test
    d = swr_plot(f, swr, swr_tx, BAND, DESIGN, swr2_edges(f, swr), 480, 230, "SWR")
    runs = _feed_runs(d)
    assert len(runs) == 1                             # one run: it leaves at the top on both sides
    ends = (runs[0].points[0], runs[0].points[-1])
    for x, y in ends:
        assert y == pytest.approx(ax.frame.y0)
        fi, _ = ax.from_page(x, y)
        assert np.interp(fi, f, swr) == pytest.approx(ax.y_max, abs=0.01)
    assert all(ax.frame.y0 - 1e-9 <= y <= ax.frame.y1 + 1e-9 for _, y in runs[0].points)


def test_axis_top_is_4_or_6():
    f, _, swr, swr_tx = made_up_load(q=30.0)
    assert swr[(f >= BAND[0]) & (f <= BAND[1])].max() <= 4
    assert swr_axes(f, swr, swr_tx, BAND, 480, 230).y_max == 4.0
    f, _, swr, swr_tx = made_up_load(q=120.0)
    assert swr[(f >= BAND[0]) & (f <= BAND[1])].max() > 4
    assert swr_axes(f, swr, swr_tx, BAND, 480, 230).y_max == 6.0


def _x_ticks(d, ax):
    """(x, MHz) of the frequency tick labels under the frame."""
    return [(t.x, float(t.text)) for t in d.texts()
            if t.anchor == "middle" and t.y > ax.frame.y1 + plots.TICK_LENGTH
            and t.text.replace(".", "").isdigit()]


def test_band_edge_lines_stand_at_the_band_edges():
    f, _, swr, swr_tx = made_up_load()
    d = swr_plot(f, swr, swr_tx, BAND, DESIGN, swr2_edges(f, swr), 480, 230, "SWR")
    ax = swr_axes(f, swr, swr_tx, BAND, 480, 230)
    edges = [p for p in d.primitives() if isinstance(p, Line) and p.x1 == p.x2
             and p.width == plots.BAND_EDGE_WIDTH and p.stroke == 0 and p.dash is None]
    assert len(edges) == 2
    for line in edges:
        assert (line.y1, line.y2) == pytest.approx((ax.frame.y0, ax.frame.y1))
    # Independent of the axis object: read the frequency of each line off the printed tick labels.
    ticks = _x_ticks(d, ax)
    assert len(ticks) >= 4
    xs, mhz = zip(*ticks)
    found = sorted(float(np.interp(line.x1, xs, mhz)) for line in edges)
    assert found == pytest.approx([b / 1e6 for b in BAND], abs=0.0005)


def test_ticks_are_evenly_spaced_and_labelled_in_mhz():
    f, _, swr, swr_tx = made_up_load()
    d = swr_plot(f, swr, swr_tx, BAND, DESIGN, swr2_edges(f, swr), 480, 230, "SWR")
    ax = swr_axes(f, swr, swr_tx, BAND, 480, 230)
    xs, mhz = zip(*_x_ticks(d, ax))
    assert np.allclose(np.diff(xs), np.diff(xs)[0]) and np.allclose(np.diff(mhz), np.diff(mhz)[0])
    assert mhz[0] >= f[0] / 1e6 - 1e-9 and mhz[-1] <= f[-1] / 1e6 + 1e-9
    assert any(t.text == "frequency, MHz" for t in d.texts())
    levels = {t.text for t in d.texts() if t.x < ax.frame.x0}
    assert {"1.0", "1.5", "2.0", "4.0"} <= levels


def test_reference_lines_design_mark_and_swr2_labels():
    f, _, swr, swr_tx = made_up_load()
    edges = swr2_edges(f, swr)
    d = swr_plot(f, swr, swr_tx, BAND, DESIGN, edges, 480, 230, "SWR")
    ax = swr_axes(f, swr, swr_tx, BAND, 480, 230)
    texts = [t.text for t in d.texts()]
    for level, label in ((1.5, "1.5:1"), (2.0, "2:1")):
        assert any(isinstance(p, Line) and p.y1 == p.y2 == pytest.approx(ax.y(level))
                   and p.dash == plots.REF_DASH for p in d.primitives())
        assert label in texts
    assert f"design {DESIGN / 1e6:.3f}" in texts
    assert any(isinstance(p, Line) and p.x1 == pytest.approx(ax.x(DESIGN)) and p.dash ==
               plots.DESIGN_DASH for p in d.primitives())
    for edge in edges:
        assert f"2:1 {edge / 1e6:.3f}" in texts
        assert any(isinstance(p, Circle) and (p.cx, p.cy) == pytest.approx(ax.to_page(edge, 2.0))
                   for p in d.primitives())


def test_missing_swr2_edges():
    f, _, swr, swr_tx = made_up_load(q=2.0)           # broad: stays under 2:1 across the sweep
    d = swr_plot(f, swr, swr_tx, BAND, DESIGN, (None, None), 480, 230, "SWR")
    assert [t.text for t in d.texts()].count("under 2:1 to sweep end") == 2
    assert d.check_layout() == []
    f, _, swr, swr_tx = made_up_load(r=150.0)          # never reaches 2:1
    assert swr.min() > 2
    d = swr_plot(f, swr, swr_tx, BAND, DESIGN, (None, None), 480, 230, "SWR")
    assert "SWR above 2:1 across the sweep" in [t.text for t in d.texts()]


@pytest.mark.parametrize("q, size", [(30.0, (480, 230)), (80.0, (320, 200)), (30.0, (260, 160))])
def test_swr_plot_layout_is_clean(q, size):
    f, _, swr, swr_tx = made_up_load(q=q)
    d = swr_plot(f, swr, swr_tx, BAND, DESIGN, swr2_edges(f, swr), *size, "Predicted SWR")
    assert d.check_layout() == []


def test_swr_plot_refuses_bad_arrays():
    f, _, swr, swr_tx = made_up_load()
    with pytest.raises(ValueError, match="increase"):
        swr_plot(f[::-1], swr, swr_tx, BAND, DESIGN, (None, None), 480, 230, "SWR")
    with pytest.raises(ValueError, match="swr_feed"):
        swr_plot(f, swr * 0.5, swr_tx, BAND, DESIGN, (None, None), 480, 230, "SWR")
    with pytest.raises(ValueError, match="too small"):
        swr_plot(f, swr, swr_tx, BAND, DESIGN, (None, None), 100, 60, "SWR")


# ---------------------------------------------------------------- Smith chart

def _z_of(ax, x, y, z_ref=50.0):
    g = ax.from_page(x, y)
    return z_ref * (1 + g) / (1 - g)


def test_smith_grid_contours_are_constant_r_and_x():
    f, z, _, _ = made_up_load()
    d = smith_chart(f, z, 50.0, BAND, DESIGN, 300, "Z")
    ax = smith_axes(300)
    prims = d.primitives()
    unit = [p for p in prims if isinstance(p, Circle) and p.r == pytest.approx(ax.radius)]
    assert len(unit) == 1 and (unit[0].cx, unit[0].cy) == pytest.approx((ax.cx, ax.cy))
    r_circles = [p for p in prims if isinstance(p, Circle) and p.stroke == plots.SMITH_GRID_GREY]
    found_r = []
    for c in r_circles:
        # Points on the drawn circle (away from gamma = 1, where z is infinite) have one resistance.
        rs = [(_z_of(ax, c.cx + c.r * math.cos(a), c.cy - c.r * math.sin(a)) / 50).real
              for a in np.linspace(0.5, 2 * math.pi - 0.5, 9)]
        assert np.allclose(rs, rs[0], rtol=1e-6)
        found_r.append(round(rs[0], 6))
    assert sorted(found_r) == list(plots.SMITH_R)
    found_x = []
    for a in (p for p in prims if isinstance(p, Arc)):
        pts = [a.point(a.start + a.extent * k / 10) for k in range(1, 10)]
        xs = [(_z_of(ax, *pt) / 50).imag for pt in pts]
        assert np.allclose(xs, xs[0], rtol=1e-6)
        # Clipped to the unit circle: inside it, with both ends on it.
        assert all(abs(ax.from_page(*pt)) <= 1 + 1e-9 for pt in pts)
        for end in a.end_points:
            assert abs(ax.from_page(*end)) == pytest.approx(1.0, abs=1e-9)
        found_x.append(round(xs[0], 6))
    assert sorted(found_x) == sorted([x for x in plots.SMITH_X] + [-x for x in plots.SMITH_X])


def test_smith_locus_is_the_reflection_coefficient_of_the_load():
    f, z, _, _ = made_up_load()
    d = smith_chart(f, z, 50.0, BAND, DESIGN, 300, "Z")
    ax = smith_axes(300)
    locus = [p for p in d.primitives() if isinstance(p, Polyline)
             and p.width in (plots.LOCUS_WIDTH, plots.LOCUS_OUT_WIDTH)]
    pts = []
    for run in locus:
        pts += [ax.from_page(*pt) for pt in run.points]
    # Runs share their end points where the locus enters and leaves the band.
    assert len(pts) == len(f) + len(locus) - 1
    unique = []
    for g in pts:
        if not unique or abs(unique[-1] - g) > 1e-12:
            unique.append(g)
    gamma_ref = skrf.network.z2s(z.reshape(-1, 1, 1), z0=50.0)[:, 0, 0]
    assert np.allclose(unique, gamma_ref, atol=1e-9)
    # Heavy from the first sample in the band to the first one past it.
    heavy = [run for run in locus if run.width == plots.LOCUS_WIDTH]
    assert len(heavy) == 1
    inside = np.flatnonzero((f >= BAND[0]) & (f <= BAND[1]))
    heavy_gamma = [ax.from_page(*pt) for pt in heavy[0].points]
    assert np.allclose(heavy_gamma, gamma_ref[inside[0]:inside[-1] + 2], atol=1e-9)


def test_smith_markers_and_labels():
    f, z, _, _ = made_up_load()
    d = smith_chart(f, z, 50.0, BAND, DESIGN, 300, "Z")
    ax = smith_axes(300)
    markers = [p for p in d.primitives() if isinstance(p, Circle) and p.r == plots.MARKER_RADIUS
               and p.width > 0]
    texts = d.texts()
    for fm, fill in ((BAND[0], 1.0), (BAND[1], 1.0), (DESIGN, 0.0)):
        zm = complex(np.interp(fm, f, z.real), np.interp(fm, f, z.imag))
        gm = skrf.network.z2s(np.array([[[zm]]]), z0=50.0)[0, 0, 0]
        hits = [m for m in markers if (m.cx, m.cy) == pytest.approx(ax.to_page(gm), abs=1e-9)]
        assert len(hits) == 1 and hits[0].fill == fill
        label = [t for t in texts if t.text == f"{fm / 1e6:.3f}"]
        assert len(label) == 1
        box = label[0].bbox()
        # Close to its marker: the label's box is within a label height of it.
        gap_x = max(box.x0 - hits[0].cx, hits[0].cx - box.x1, 0)
        gap_y = max(box.y0 - hits[0].cy, hits[0].cy - box.y1, 0)
        assert math.hypot(gap_x, gap_y) <= plots.MARKER_RADIUS + box.height
    assert any("50 \u03a9" in t.text for t in texts)


@pytest.mark.parametrize("width, q", [(300, 30.0), (220, 60.0), (400, 10.0)])
def test_smith_layout_is_clean(width, q):
    f, z, _, _ = made_up_load(q=q)
    d = smith_chart(f, z, 50.0, BAND, DESIGN, width, "Feed impedance")
    assert d.check_layout() == []
    assert d.bbox().within(plots.Box(0, 0, d.width, d.height))


def test_smith_refuses_active_loads():
    f, z, _, _ = made_up_load()
    with pytest.raises(ValueError, match="passive"):
        smith_chart(f, z - 100, 50.0, BAND, DESIGN, 300, "Z")
