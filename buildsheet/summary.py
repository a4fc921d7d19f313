"""The terminal summary of `buildsheet solve`: owns its plain-text layout only; every number comes
from the Solution and every unit conversion from units.py."""

from __future__ import annotations

from buildsheet import units
from buildsheet.design import Design
from buildsheet.layout import describe
from buildsheet.solver import Solution
from buildsheet.stock import conductor_size


def _band(edges, fmt=units.format_frequency) -> str:
    if edges is None:
        return "none (SWR never gets that low)"
    low, high = edges
    return f"{fmt(low)} to {fmt(high)} ({(high - low) / 1e3:.0f} kHz)"


def _off(span, L) -> str:
    """How far a first cut may be off: '3.6 cm shorter to 3.6 cm longer', 'up to 15 cm longer'."""
    low, high = span
    if low < 0 < high:
        return f"{L(-low)} shorter to {L(high)} longer"
    return f"up to {L(high)} longer" if high > 0 else f"up to {L(-low)} shorter"


def radiation_line(r) -> str:
    """The pattern's two figures in one line (gain relative to the power delivered to the tap)."""
    where = "in free space" if r.ground_kind == "free-space" else "over the ground"
    angle = "elevation of the maximum" if r.ground_kind == "free-space" else "take-off angle"
    return (f"  radiation {where}: maximum gain {r.max_gain_dbi:.1f} dBi (relative to the power delivered "
            f"to the tap), {angle} {r.takeoff_deg:.0f}\u00b0")


def summary_text(design: Design, s: Solution) -> str:
    u = design.output.units
    L = lambda m: units.format_length(m, u)  # noqa: E731 - a local shorthand
    d = s.dimensions
    rows: list[str] = []
    add = rows.append
    add(f"{design.title}  [{design.name}, document {s.design_id}]")
    add(f"band {units.format_frequency(s.band_hz[0])} to {units.format_frequency(s.band_hz[1])}"
        f"{' (' + design.band_name + ')' if design.band_name else ''}, matched at "
        f"{units.format_frequency(s.frequency_hz)} to {units.format_impedance(design.feed.impedance_ohm)}")
    for w in s.warnings:
        add(f"model limit: {w}")
    for f in s.findings:
        add(f"warning: {f.text}")
    add("")
    add("Key dimensions (" + units.length_rounding(u) + ")")
    style = s.parts.construction
    add(f"  radiator   {L(d.radiator):>14}   " + {"tube": "free top to the stub's open top",
                                                  "twin-lead": "top end to the gap"}.get(
        style, "attachment point to attachment point"))
    add(f"  stub       {L(d.stub):>14}   {'the gap' if style == 'twin-lead' else 'open top'} to the "
        "centre of the short")
    add(f"  tap        {L(d.tap):>14}   centre of the short to the tap")
    add(f"  spacing    {units.format_length(d.spacing, u, 'size'):>14}   centre to centre of the stub conductors")
    k = s.stack
    if k is not None:
        add(f"  element    {L(k.element_m):>14}   upper element, attachment point to attachment point")
        add(f"  phasing    {L(k.phasing_m):>14}   phasing stub, open end (the gap) to the centre of its short")
        add(f"  gap        {units.format_length(k.phasing_spacing_m, u, 'size'):>14}   radiator's end to the "
            "element's start (the phasing stub's spacing)")
    add("")
    add("Cut list")
    for item in s.cut_list:
        qty = f"{item.quantity} x" if item.quantity > 1 else ""
        length = units.format_length(item.length_m, u, "coarse" if item.coarse else "fine")
        add(f"  [ ] {item.part:<14} {qty:>3} {length:>12}  {item.material_text(L)}; {item.note}")
    fc = s.first_cut
    margins = [(what, m, span) for what, m, span in (("stub line", fc.stub_margin_m, fc.stub_m),
                                                     ("radiator", fc.radiator_margin_m, fc.radiator_m))
               if m > 0]
    if margins:
        add("  First cut long (tuning margin, included above): "
            + "; ".join(f"{what} +{L(m)}, may need {_off(span, L)} than solved"
                        for what, m, span in margins))
        parts = {"stub line": ("the short at the long end", "move the short up"),
                 "radiator": ("the radiator hung long",
                              "trim its top" if style == "twin-lead" else "take up wire")}
        start = " and ".join(parts[what][0] for what, _, _ in margins)
        then = " and ".join(parts[what][1] for what, _, _ in margins)
        add("  Why: the velocity factor of dielectric line and jacketed wire is only known to the spread "
            f"between its sources; start with {start}, then {then} as the tuning table says.")
    site = s.site
    if site is not None:
        add("  Site: " + describe(site, lambda m: units.format_length(m, u, "coarse")))
    add("Hardware")
    for h in s.hardware:
        fits = (f"; to fit {conductor_size(h.fits_m, u, design.stub.conductor_material)}"
                if h.fits_m is not None else "")
        add(f"  [ ] {h.quantity:>3} x {h.item}: {h.note}{fits}")
    add("")
    add("Predicted performance")
    add(f"  feed impedance at {units.format_frequency(s.frequency_hz)}: "
        f"{units.format_complex_impedance(s.feed_impedance)}, SWR {s.feed_swr:.2f} at the tap, "
        f"{s.feed_swr_transmitter:.2f} at the transmitter")
    add(f"  SWR below 2:1   {_band(s.band_swr2_hz)}")
    add(f"  SWR below 1.5:1 {_band(s.band_swr15_hz)}")
    r = s.reference
    if r is not None:
        add(f"  checked in NEC-2 on {r.designs} unseen bare-wire {r.label}: SWR {r.swr_q90:.2f} or lower at "
            f"the model's dimensions on 9 in 10 (at most {r.swr_max:.2f}), 2:1 edges within "
            f"{r.edge_q90 * 100:.0f} % of the band's width on 9 in 10 (at most {r.edge_max * 100:.0f} %)")
    add(f"  coax loss {s.coax_loss_db:.2f} dB; {units.format_power(s.power_at_tap_w)} PEP reaches the tap")
    add(f"  open end of the stub: {units.format_voltage(s.voltage_open_end_v_rms)} rms, "
        f"{units.format_voltage(s.voltage_open_end_v_peak)} peak; far end of the radiator: "
        f"{units.format_voltage(s.voltage_far_end_v_rms)} rms, "
        f"{units.format_voltage(s.voltage_far_end_v_peak)} peak")
    add(f"  current through the short: {units.format_current(s.current_short_a_rms)} rms")
    add(f"  efficiency (radiated / delivered to the tap): {units.format_percent(s.efficiency)}")
    if s.radiation is not None:
        add(radiation_line(s.radiation))
    if k is not None:
        add(f"  stacked: {k.gain_over_single_db:+.1f} dB over the single half-wave of the same design "
            f"({k.single_max_gain_dbi:.1f} dBi); 2:1 band of the single: {_band(k.single_band_swr2_hz)}")
        add(f"  phasing stub: {units.format_voltage(k.voltage_phasing_open_v_rms)} rms, "
            f"{units.format_voltage(k.voltage_phasing_open_v_peak)} peak across its open end; "
            f"{units.format_current(k.current_phasing_short_a_rms)} rms through its short; far end of the "
            f"element: {units.format_voltage(k.voltage_element_end_v_rms)} rms (NEC-2 puts the phasing "
            "stub's current up to 30 % higher on the designs checked)")
    c = s.choke
    coil = (f"  choke: {c.turns} turn{'s' if c.turns != 1 else ''} of {design.feed.coax} on a "
            f"{L(c.form_diameter_m)} form, coil {L(c.coil_length_m)} long, {c.inductance_h * 1e6:.2f} uH")
    if c.self_resonance_hz is not None:
        coil += f", self-resonant at {units.format_frequency(c.self_resonance_hz)}"
    if c.impedance_ohm is not None:
        coil += (f", |Z| {units.format_impedance(c.impedance_ohm)} at the design frequency, "
                 f"{units.format_impedance(c.impedance_low_edge_ohm)} at the band's low edge")
    sl = s.sleeve
    if sl is not None:
        add(f"  choke: quarter-wave sleeve over the {design.feed.coax}, tube {sl.sleeve_inner_diameter_m * 1e3:.1f} mm "
            f"inside, {L(sl.length_m)} long (velocity factor {sl.velocity_factor:.3f}), |Z| "
            f"{units.format_impedance(sl.impedance_ohm)} at the design frequency, at least "
            f"{units.format_impedance(sl.impedance_band_min_ohm)} across the band")
        add(f"  not built, a coil instead:{coil[len('  choke:'):]}")
        if c.warning:
            add(f"  why not the coil: {c.warning}")
    else:
        add(coil)
        if c.warning:
            add(f"  choke warning: {c.warning}")
    e = s.exposure
    standard = {"us-fcc": "47 CFR 1.1310 (US FCC)", "icnirp-2020": "ICNIRP 2020"}[e.standard]
    add(f"  RF exposure ({standard}, {units.format_power(e.average_power_w)} average, "
        f"{e.gain_dbi:.2f} dBi, {e.gain_source}): keep people {units.format_distance(e.distance_general_m, u)} away "
        f"(general public), {units.format_distance(e.distance_controlled_m, u)} (controlled)")
    if e.distance_general_m < e.near_field_m:
        add(f"    these distances lie inside the reactive near field ({units.format_distance(e.near_field_m, u)})"
            "; a screening estimate only")
    for a in s.assumptions:
        add(f"  assumed: {a}.")
    add("")
    add("Cautions: keep the antenna and its fall zone well clear of power lines; the open end of the stub"
        + (" and the far end of the radiator carry" if k is None else
           ", the phasing stub's open end and the far ends of both elements carry")
        + " high RF voltage; follow local codes, your regulator and licensed practice.")
    return "\n".join(rows) + "\n"
