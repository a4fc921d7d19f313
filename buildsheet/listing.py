"""The catalogue as a builder reads it (`buildsheet catalogue`): owns the words and columns of the
listing of wires, materials, insulation, stub lines, coax, grounds, tube and rod stock and the bands
of a region, each entry with its key figures and its source. Reads only catalog.py; writes nothing.
"""

from __future__ import annotations

import math

from buildsheet import units
from buildsheet.catalog import catalog
from buildsheet.errors import BuildsheetError

#: the sections of the listing, in the order printed
KINDS = ("wires", "materials", "insulation", "lines", "coax", "grounds", "stock", "bands")
#: gauges listed under wires: the common antenna wires (any gauge 4/0..40 is accepted in a design)
WIRE_GAUGES = (10, 12, 14, 16, 18, 20, 22)
IACS_S_M = 5.8001e7


def _one_line(text: str) -> str:
    return " ".join(str(text).split())


def _rows(kind: str, region: int, u: str) -> tuple[str, list[tuple[str, str, str]]]:
    """The heading of a section and its rows (name, key figures, source)."""
    c = catalog()

    def size(m: float) -> str:
        return units.format_length(m, u, "size")

    if kind == "wires":
        rows = [(f"{g} AWG", f"{size(units.awg_diameter(g))} diameter ({units.awg_diameter(g) * 1e3:.3f} mm)",
                 "ASTM B258 formula d = 0.127 mm x 92^((36-n)/39); any gauge 4/0..40 or a diameter "
                 "('1.6 mm') may be given") for g in WIRE_GAUGES]
        return "wires (radiator.wire)", rows
    if kind == "materials":
        return "materials (radiator.material, stub.conductor_material)", [
            (m.name, f"{m.conductivity_s_m:.4g} S/m ({m.conductivity_s_m / IACS_S_M:.0%} IACS)", m.source)
            for m in c.materials.values()]
    if kind == "insulation":
        return "insulation (radiator.insulation)", [
            (i.name, f"velocity factor {i.velocity_factor:g}" + (
                f" (sources {i.velocity_factor_spread[0]:g}-{i.velocity_factor_spread[1]:g})"
                if i.velocity_factor_spread else ""), i.source) for i in c.insulations.values()]
    if kind == "lines":
        rows = []
        for line in c.stub_lines.values():
            shape = f"{size(line.spacing_m)} spacing, {size(line.conductor_diameter_m)} {line.conductor_material}"
            if line.kind == "nominal":
                f, db = line.loss_db_per_100ft[0]
                figures = (f"{units.format_impedance(line.z0_ohm)}, VF {line.velocity_factor:g}, "
                           f"{db:g} dB/100 ft at {units.format_frequency(f)}; {shape}")
            else:
                d = c.dielectric(line.dielectric)
                z0 = 120.0 / math.sqrt(d.eps_r) * math.acosh(line.spacing_m / line.conductor_diameter_m)
                figures = (f"{units.format_impedance(z0)} from its geometry (120 acosh(s/d)), "
                           f"{line.dielectric}; {shape}")
            rows.append((line.name, figures, line.source))
        return "stub lines (stub.line)", rows
    if kind == "coax":
        rows = []
        for x in c.coaxes.values():
            loss = ", ".join(f"{db:g} at {units.format_frequency(f)}" for f, db in x.loss_db_per_100ft)
            rows.append((x.name, f"{units.format_impedance(x.z0_ohm)}, VF {x.velocity_factor:g}, "
                                 f"{size(x.outer_diameter_m)} over the jacket, loss {loss} (dB/100 ft)",
                         x.source))
        return "coax (feed.coax)", rows
    if kind == "grounds":
        rows = []
        for g in c.grounds.values():
            figures = ({"free-space": "no ground", "perfect": "perfectly conducting"}.get(g.kind)
                       or f"permittivity {g.permittivity:g}, {g.conductivity_s_m:g} S/m")
            rows.append((g.name, figures, g.source))
        return "grounds (site.ground)", rows
    if kind == "stock":
        return "tube and rod stock (printed beside a pipe or rod conductor)", [
            (s.name, f"{s.kind}, outside {units.format_length(s.outer_diameter_m, 'imperial', 'size')} = "
                     f"{s.outer_diameter_m * 1e3:.2f} mm, sold in {s.system} sizes", s.source) for s in c.stock]
    if kind == "bands":
        return f"bands of ITU region {region} (band)", [
            (b.name, f"{units.format_frequency(b.low_hz)} to {units.format_frequency(b.high_hz)}", b.source)
            for b in c.bands(region)]
    raise BuildsheetError(f"unknown catalogue section '{kind}'; expected one of {', '.join(KINDS)}")


def listing(kinds: tuple[str, ...] = (), region: int = 2, u: str = "imperial") -> str:
    """The listing of the named sections (all of them when none is named) as text: per section a
    heading, then per entry its name and key figures on one line and its source indented below."""
    if region not in (1, 2, 3):
        raise BuildsheetError(f"ITU region must be 1, 2 or 3, got {region}", key="--region")
    out: list[str] = []
    for kind in kinds or KINDS:
        heading, rows = _rows(kind, region, u)
        out.append(f"{heading}:")
        width = max(len(name) for name, _, _ in rows)
        for name, figures, source in rows:
            out.append(f"  {name:<{width}}  {figures}")
            out.append(f"  {'':<{width}}    source: {_one_line(source)}")
        out.append("")
    return "\n".join(out)
