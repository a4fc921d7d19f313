"""The yard card (`build --card`, `handout --cards`): owns which parts of the build sheet go on a
one- or two-page card taken out to the antenna: the key dimensions large, the overview drawing, the
cut list and hardware with tick boxes, the tuning steps with the stop rule, and the two cautions
that matter most there (power lines, the RF voltage at the open ends), with the design's own
figures and the document ID in every page's title block. The full sheet (sheet.py) stays the
record copy; every number here comes from the same formatting as on the sheet, so the two agree.
Lays out nothing (writers/pdf.py renders the Sheet it returns) and writes nothing.
"""

from __future__ import annotations

import dataclasses

from buildsheet import units
from buildsheet.design import Design
from buildsheet.layout import describe
from buildsheet.sheet import (Facts, Figures, KeyFigures, Para, Section, Sheet, Table, _Context,
                              KIND, _e, _volts, build_sheet, render_blocks)
from buildsheet.solver import Solution

SUBTITLE = "Yard card: end-fed half-wave antenna matched by a shorted quarter-wave stub"


def build_card(design: Design, solution: Solution, date: str, *, safety_where: str = "") -> Sheet:
    """The yard card of `design` solved as `solution`, dated `date` (YYYY-MM-DD). safety_where: where
    the builder finds the full safety cautions (default: the full build sheet's safety section)."""
    ctx = _Context(design, solution)
    full = build_sheet(design, solution, date)
    summary = full.section("summary").blocks
    key_figures = next(b for b in summary if isinstance(b, KeyFigures))
    facts = next(b for b in summary if isinstance(b, Facts))
    sections = (
        Section("key", "Key dimensions", (key_figures, facts, *(
            b for b in summary if isinstance(b, Para) and b.style == "caution"))),
        Section("overview", "Overview", (Figures(("overview",)),)),
        Section("cut-list", "Cut list and hardware", _cut_list(ctx), new_page=True),
        Section("tuning", "Tuning at the antenna", render_blocks("card-tuning.j2", **ctx.tuning_values())),
        Section("cautions", "The two cautions that matter most", _cautions(ctx, safety_where)),
    )
    return dataclasses.replace(
        full, subtitle=SUBTITLE if solution.stack is None else "Yard card: " + KIND[True],
        sections=sections,
        subject=f"Yard card of {design.name}, document {solution.design_id}, revised {date}")


def _cut_list(ctx: _Context) -> tuple:
    """The cut list and hardware with tick boxes, one line a piece: lengths as on the sheet (the
    allowances are included; the sheet's notes say what each piece is for)."""
    s = ctx.s
    site = ctx.layout()
    cut_rows = tuple((_e(i.part), str(i.quantity), _e(ctx.length(i.length_m, i.coarse)), _e(ctx.cut_material(i)))
                     for i in s.cut_list)
    return (
        Para(_e(f"Cut lengths include the allowances ({units.length_rounding(ctx.u)}; coax and rope "
                f"{units.length_rounding(ctx.u, 'coarse')}). {ctx.cut_list_margin()}"
                # a hung antenna's overview on the card's first page draws and states its site
                + (describe(site, lambda m: ctx.length(m, coarse=True))
                   if site and site.support_height_m is None else "")), "note"),
        Table(header=("part", "qty", "cut length", "material"), rows=cut_rows, widths=(1.6, 0.45, 1.1, 4.0),
              align=("left", "right", "right", "left"), boxes=tuple(i.quantity for i in s.cut_list)),
        Table(header=("qty", "hardware"), rows=tuple((str(h.quantity), _e(f"{h.item}: {ctx.hardware_note(h)}"))
                                                    for h in s.hardware),
              widths=(0.45, 6.7), align=("right", "left"), boxes=(1,) * len(s.hardware)),
    )


def _cautions(ctx: _Context, where: str) -> tuple:
    s = ctx.s
    low_point, low_what = s.parts.lowest_point_m, s.parts.lowest_point
    return render_blocks(
        "card-cautions.j2", top_height=ctx.length(ctx.top_height()), power=ctx.pep,
        v_open_pk=_volts(s.voltage_open_end_v_peak), v_far_pk=_volts(s.voltage_far_end_v_peak),
        v_phasing_pk=_volts(s.stack.voltage_phasing_open_v_peak) if s.stack else "",
        low_point=ctx.length(low_point) if low_point is not None else "", low_point_what=low_what,
        where=where or "the full build sheet's safety section")

