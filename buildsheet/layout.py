"""The site layout of a hung antenna (horizontal or sloper): owns where the supports and the ground
anchor go and how long each rope is, from the design's height and slope and the solved radiator.
Numbers in SI (m), and the one sentence that says them (`describe`, given a length formatter),
shared by the sheet and the overview drawing; no I/O.

Geometry (DESIGN.md §5). The radiator runs from the far end insulator's attachment point to the
stub's open top, which hangs by its own insulator and rope from the near support at `height`.
Horizontal: the far end is at the same height; the span between the supports is the radiator plus
an insulator and a stand-off rope at each end. Sloper: the radiator slopes down at `slope` below
horizontal from the open top; its far end insulator is tied by an anchor rope continuing along the
same straight line to a ground anchor (so the wire pulls straight), which is at h / tan(slope) from
the point below the open top, plus the near stand-off from the support's foot.
Hung (construction: hung, a wire vertical or inverted on a rope): the antenna hangs straight down
from a top insulator on a halyard over a branch or a pulley, at least a stand-off above its top and
out from the trunk; a tether from a bottom insulator to a ground stake straight below (or a weight)
keeps it straight and off the trunk. Vertical: the top is the radiator's far end, at the short's
height plus the stub and the radiator; inverted: the top is the short, at `height`, and the bottom
is the radiator's far end, at the height less the stub and the radiator.
"""

from __future__ import annotations

import math

from buildsheet.valueclass import valueclass

#: length of an end insulator with its loops, m (common practice: 7-10 cm egg or dog-bone insulators)
INSULATOR_M = 0.1
#: the ropes that reach the supports are halyards: up to a pulley at the top of the support and back
#: down to a cleat, with this much to tie off and handle, m (common practice)
TIE_OFF_M = 2.0


@valueclass
class Rope:
    """One rope to cut: what it does (a few words) and its length_m."""
    what: str
    length_m: float
    note: str


@valueclass
class SiteLayout:
    """Where things go on the ground, m. span_m (horizontal only): from support to support.
    far_end_height_m and far_end_distance_m: the far end insulator's height and its horizontal
    distance from the open top. anchor_distance_m (sloper only): the ground anchor from the high
    support's foot. standoff_m: the rope between each end insulator and its support. ropes: what
    to cut (Rope), including what is needed to tie off."""
    orientation: str
    height_m: float
    standoff_m: float
    far_end_height_m: float
    far_end_distance_m: float
    span_m: float | None
    anchor_distance_m: float | None
    ropes: tuple
    #: hung only: the branch or pulley the halyard runs over, at least this high, m; the antenna's
    #: top and bottom (the insulators' attachment points), m
    support_height_m: float | None = None
    top_m: float | None = None
    bottom_m: float | None = None


def standoff(wavelength_m: float) -> float:
    """Rope between an end insulator and its support, m: the radiator's far end and the stub's open
    top carry the highest RF voltage, so they are kept off trees and masts (common practice: a metre
    or more, more on the low bands): 2 % of a wavelength, at least 1 m and at most 3 m."""
    return min(3.0, max(1.0, 0.02 * wavelength_m))


def site_layout(orientation: str, height_m: float, slope_rad: float, radiator_m: float,
                wavelength_m: float, stub_m: float = 0.0, hung: bool = False) -> SiteLayout | None:
    """The layout of a horizontal, a sloper or a hung vertical (None for a vertical or inverted
    antenna on a mast). stub_m: the solved stub (hung only), m."""
    if orientation in ("vertical", "inverted"):
        return _hung_layout(orientation, height_m, radiator_m, stub_m, wavelength_m) if hung else None
    gap = standoff(wavelength_m)
    halyard = 2.0 * height_m + gap + TIE_OFF_M
    near = Rope("rope, near end", halyard,
                "from the open top's insulator over a pulley at the near support and down to a cleat")
    if orientation == "horizontal":
        span = radiator_m + 2.0 * (INSULATOR_M + gap)
        far = Rope("rope, far end", halyard,
                   "from the far end insulator over a pulley at the far support and down to a cleat")
        return SiteLayout(orientation, height_m, gap, height_m, radiator_m, span, None, (near, far))
    drop = radiator_m * math.sin(slope_rad)
    far_height = height_m - drop
    along_to_ground = height_m / math.sin(slope_rad)        # from the open top down the line to the ground
    anchor_rope = along_to_ground - radiator_m - INSULATOR_M
    anchor = Rope("anchor rope", max(anchor_rope, 0.0) + TIE_OFF_M,
                  "from the far end insulator straight on down the radiator's line to the ground anchor")
    return SiteLayout(orientation, height_m, gap, far_height, radiator_m * math.cos(slope_rad), None,
                      gap + height_m / math.tan(slope_rad), (near, anchor))


def _hung_layout(orientation: str, height_m: float, radiator_m: float, stub_m: float,
                 wavelength_m: float) -> SiteLayout:
    """A wire vertical or inverted antenna on a rope (see the module docstring)."""
    gap = standoff(wavelength_m)
    if orientation == "vertical":
        top, bottom = height_m + stub_m + radiator_m, height_m
        top_what, bottom_what = "the radiator's top insulator", "the insulator below the short"
    else:
        top, bottom = height_m, height_m - stub_m - radiator_m
        top_what, bottom_what = "the insulator above the short", "the radiator's end insulator"
    support = top + INSULATOR_M + gap
    halyard = Rope("halyard rope", gap + support + TIE_OFF_M,
                   f"from {top_what} up over the branch (a throw weight and line gets it there) "
                   "or a pulley hung there (it lets the antenna down to tune), down to a cleat")
    tether = Rope("tether rope", max(bottom - INSULATOR_M, 0.0) + TIE_OFF_M,
                  f"from {bottom_what} straight down to a ground stake (or a weight of about 1 kg)")
    return SiteLayout(orientation, height_m, gap, bottom if orientation == "inverted" else top, 0.0,
                      None, None, (halyard, tether), support, top, bottom)


def describe(layout: SiteLayout, length) -> str:
    """The layout in one sentence for the builder; `length(m)` formats a length (the sheet's units,
    to the inch or the cm: these are paced out, not cut)."""
    if layout.support_height_m is not None:
        low_end = "the short" if layout.orientation == "vertical" else "the radiator's far end"
        return (f"Hang it from a branch or a halyard pulley at least {length(layout.support_height_m)} "
                f"up and {length(layout.standoff_m)} out from the trunk: the top insulator "
                f"{length(layout.standoff_m)} below it, the antenna's top {length(layout.top_m)} up, "
                f"{low_end} {length(layout.bottom_m)} up, tethered to a ground stake straight below "
                "(or a weight of about 1 kg, common practice) so it hangs straight, clear of the "
                "trunk.")
    if layout.orientation == "horizontal":
        return (f"Supports {length(layout.span_m)} apart: the antenna wire, an end insulator and "
                f"{length(layout.standoff_m)} of rope at each end.")
    return (f"The far end insulator is {length(layout.far_end_height_m)} up and "
            f"{length(layout.far_end_distance_m)} out from the open top; the anchor rope runs on down "
            f"the same line to a ground anchor {length(layout.anchor_distance_m)} from the foot of "
            f"the high support (the open top hangs {length(layout.standoff_m)} out from it).")
