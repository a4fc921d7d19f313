"""The quarter-wave sleeve choke, where a coil of the feed coax cannot be a choke (above HF).

Owns the `coax_jackets:` section of data/catalog.yaml (the diameter over each coax's braid and its
jacket's material) and the choice of a sleeve over a coil: no I/O beyond the catalogue, no
presentation. The sizing itself is physics.choke.design_sleeve_choke.
"""

from __future__ import annotations

import functools
from typing import TYPE_CHECKING

from buildsheet.catalog import catalog, raw_section
from buildsheet.physics import choke as choke_physics
from buildsheet.units import parse_quantity

if TYPE_CHECKING:
    from buildsheet.design import Design

#: a sleeve is offered only above HF: at 30 MHz and below a quarter-wave sleeve is 2 m or more of
#: tube, and a coil on a smaller form or ferrite is what builders use there (common practice)
SLEEVE_ABOVE_HZ = 30e6
#: the choke target, ohm (DESIGN.md §7: |Z| >= 1 kohm, common practice)
Z_TARGET = 1000.0


@functools.cache
def _jackets() -> dict:
    return {name: (parse_quantity(e["braid_diameter"], "length"), e["material"], " ".join(e["source"].split()))
            for name, e in raw_section("coax_jackets").items()}


def needs_sleeve(design: "Design", coil: choke_physics.ChokeDesign) -> bool:
    """Whether the coil falls short of the target (or cannot be a choke at all) above HF."""
    short = coil.impedance_low_edge_ohm is None or coil.impedance_low_edge_ohm < Z_TARGET
    return design.band_hz[1] > SLEEVE_ABOVE_HZ and short and coil.warning is not None


def sleeve_for(design: "Design", coil: choke_physics.ChokeDesign) -> choke_physics.SleeveChoke | None:
    """The sleeve choke that replaces the coil, or None where the coil is the choke (or the coax
    has no jacket data in the catalogue)."""
    if not needs_sleeve(design, coil) or design.feed.coax not in _jackets():
        return None
    braid, material, _ = _jackets()[design.feed.coax]
    jacket = catalog().dielectric(material)
    low, high = design.band_hz
    return choke_physics.design_sleeve_choke(design.frequency_hz, low, high,
                                             design.feed.coax_outer_diameter_m, braid, jacket.eps_r,
                                             jacket.tan_delta, z_target=Z_TARGET)


def jacket_source(coax: str) -> str:
    """Where the braid diameter of a coax comes from."""
    return _jackets()[coax][2] if coax in _jackets() else ""
