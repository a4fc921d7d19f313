"""The club handout (DESIGN.md §1, §6): owns which designs a handout holds, preparing them (solve,
figures, sheet) across worker processes, and every word and rounding of the booklet's own pages
(cover, safety page, contents, summary table); it lays out nothing (writers/pdf.py renders a
Booklet) and writes no files (cli.py does).

A booklet is: the cover (title, event, date, the bands covered), the safety page shared by all its
designs, the contents, the summary table of all designs, then each design's build sheet whole, with
its own title block and document ID, its pages numbered across the booklet. Page numbers are known
only once the booklet is laid out: blocks name them by PageRef and the writer fills them in.
Strings in blocks are paragraph markup (as in sheet.py); user strings are escaped here.
"""

from __future__ import annotations

import dataclasses
import os
import signal
import sys
from collections.abc import Callable, Sequence

from markupsafe import escape

from buildsheet import fonts, units
from buildsheet.design import Design, load_design, revision_date
from buildsheet.drawing.figures import figures
from buildsheet.errors import BuildsheetError, one_line
from buildsheet.blocks import Booklet, Contents, ContentsEntry, Cover, PageRef, Part  # noqa: F401
from buildsheet.blocks import Para, Section, Table
from buildsheet.sheet import build_sheet, line_text, render_blocks
from buildsheet.solver import Solution, solve

DEFAULT_TITLE = "Antenna build sheets"
#: longest --title and --event: the title block of every page has room for this much
MAX_TEXT_CHARS = 120
SUMMARY_COLUMNS = ("design", "band", "design frequency", "radiator", "stub", "tap", "stub line",
                   "predicted 2:1 band", "page")


# ----------------------------------------------------------------------------------------------
# Which designs

def design_paths(arguments: Sequence[str]) -> list[str]:
    """The design files of a handout: each argument a design file, or a directory standing for the
    `*.yaml` files in it in sorted order. A file named twice is refused."""
    paths: list[str] = []
    for argument in arguments:
        if os.path.isdir(argument):
            found = sorted(name for name in os.listdir(argument)
                           if name.endswith(".yaml") and os.path.isfile(os.path.join(argument, name)))
            if not found:
                raise BuildsheetError("holds no design files (*.yaml)", file=argument)
            paths += [os.path.join(argument, name) for name in found]
        else:
            paths.append(argument)
    seen: dict[str, str] = {}
    for path in paths:
        real = os.path.realpath(path)
        if real in seen:
            raise BuildsheetError(f"is given twice (also as {seen[real]}); a handout holds each "
                                  "design once", file=path)
        seen[real] = path
    return paths


def load_designs(paths: Sequence[str], units_override: str | None = None) -> list[Design]:
    """Every design, validated in order (the first bad file stops it), with `units_override`
    (imperial | metric) applied to each."""
    designs = []
    for path in paths:
        design = load_design(path)
        if units_override:
            design = design.with_changes(output=dataclasses.replace(design.output, units=units_override))
        designs.append(design)
    return designs


def check_text(option: str, text: str | None) -> str:
    """A --title or --event as given, refused when the title block cannot print it."""
    if text is None:
        return ""
    if len(text) > MAX_TEXT_CHARS:
        raise BuildsheetError(f"must be at most {MAX_TEXT_CHARS} characters, got {len(text)}", key=option)
    if one_line(text) != text:
        raise BuildsheetError(f"must be one line of printable text, got '{one_line(text)}'", key=option)
    try:
        fonts.check_glyphs(text)
        fonts.check_glyphs(text, bold=True)
    except ValueError as exc:
        raise BuildsheetError(f"cannot be printed: {exc}", key=option) from None
    return text


# ----------------------------------------------------------------------------------------------
# Preparing the designs

def prepare_one(index: int, design: Design, date: str | None, cards: bool = False) -> Part:
    """Solve design number `index` (from 0) of the booklet and lay out its figures and sheet (its
    yard card with `cards`), dated `date` (YYYY-MM-DD) or by its own revision date."""
    day = revision_date(design.path, date)
    solution = solve(design)
    key = f"sheet-{index + 1}"
    band = design.band_name or f"{_mhz(design.band_hz[0])} to {_mhz(design.band_hz[1])}"
    if cards:
        from buildsheet.card import build_card
        sheet = build_card(design, solution, day, safety_where="the handout's safety page")
    else:
        sheet = build_sheet(design, solution, day)
    return Part(key=key, sheet=sheet,
                drawings=figures(design, solution, day), band=band, frequency_hz=design.frequency_hz,
                v_peak_v=max(solution.voltage_open_end_v_peak, solution.voltage_far_end_v_peak),
                power_w=design.power.transmitter_w,
                row=_summary_row(key, design, solution, band))


def _ignore_interrupt() -> None:
    """Worker set-up. Workers leave Ctrl-C to the main process, which stops them (one message, not
    one per worker), and die with the main process however it ends (SIGTERM, SIGKILL): the kernel
    sends them SIGKILL when it goes (Linux prctl PR_SET_PDEATHSIG), and a watchdog thread ends a
    worker whose parent has changed (other systems, or a parent gone before the prctl)."""
    signal.signal(signal.SIGINT, signal.SIG_IGN)
    parent = os.getppid()
    _die_with_parent()
    if os.getppid() != parent:
        os._exit(1)

    def watch():
        import time
        while True:
            time.sleep(0.5)
            if os.getppid() != parent:
                os._exit(1)

    import threading
    threading.Thread(target=watch, name="buildsheet-parent-watch", daemon=True).start()


def _die_with_parent() -> None:
    """Ask Linux to SIGKILL this process when its parent exits; nothing elsewhere."""
    if not sys.platform.startswith("linux"):
        return
    try:
        import ctypes
        libc = ctypes.CDLL(None, use_errno=True)
        PR_SET_PDEATHSIG = 1
        libc.prctl(PR_SET_PDEATHSIG, signal.SIGKILL, 0, 0, 0)
    except (OSError, AttributeError):
        pass


def prepare(designs: Sequence[Design], date: str | None = None, *, jobs: int | None = None,
            on_done: Callable[[int], None] | None = None, cards: bool = False) -> list[Part]:
    """Every design prepared (prepare_one), in order, across at most `jobs` worker processes
    (default and most: os.cpu_count()); in this process when one would do. `on_done(n)` is told
    how many are ready. The first design that fails stops the rest; of those that failed by then,
    the error of the earliest in order is raised, naming its file."""
    jobs = max(1, min(jobs or os.cpu_count() or 1, os.cpu_count() or 1, len(designs)))
    if jobs == 1:
        parts = []
        for i, design in enumerate(designs):
            try:
                parts.append(prepare_one(i, design, date, cards))
            except Exception as exc:
                _fail(design, exc)
            if on_done:
                on_done(i + 1)
        return parts
    from concurrent.futures import FIRST_COMPLETED, ProcessPoolExecutor, wait

    with ProcessPoolExecutor(max_workers=jobs, initializer=_ignore_interrupt) as pool:
        futures = [pool.submit(prepare_one, i, d, date, cards) for i, d in enumerate(designs)]
        try:
            pending = set(futures)
            while pending:
                done, pending = wait(pending, return_when=FIRST_COMPLETED)
                if on_done:
                    on_done(len(futures) - len(pending))
                if any(f.exception() for f in done):
                    break
        finally:
            for future in futures:
                future.cancel()
        wait(futures)   # the running ones finish; the cancelled ones never start
    for design, future in zip(designs, futures):
        if not future.cancelled() and future.exception():
            _fail(design, future.exception())
    return [future.result() for future in futures]


def _fail(design: Design, exc: Exception) -> None:
    """Raise the error of `design`: its own if it is bad input (with the file filled in), else the
    bug as a RuntimeError named with the file that showed it."""
    if isinstance(exc, BuildsheetError):
        raise exc.located(file=design.path)
    raise RuntimeError(f"{design.path}: {type(exc).__name__}: {exc}") from exc


# ----------------------------------------------------------------------------------------------
# The booklet

def make_booklet(parts: Sequence[Part], *, title: str = "", event: str = "",
                 paper: str | None = None, cards: bool = False) -> Booklet:
    """The booklet of the prepared designs, in order. paper: letter | a4, default the paper most of
    the designs ask for (the first of them on a tie); every sheet is set on it. The booklet is dated
    by the latest of its sheets' dates. cards: the parts are yard cards (card.py): the front is the
    shared safety page and the summary (whose page column serves as the contents)."""
    if not parts:
        raise BuildsheetError("a handout needs at least one design")
    title = title or DEFAULT_TITLE
    date = max(p.sheet.date for p in parts)
    if paper is None:
        papers = [p.sheet.paper for p in parts]
        paper = max(dict.fromkeys(papers), key=papers.count)    # max keeps the first of equals
    parts = [dataclasses.replace(p, sheet=dataclasses.replace(p.sheet, paper=paper)) for p in parts]
    n = len(parts)
    sheets = f"{n} {'yard card' if cards else 'build sheet'}{'s' if n != 1 else ''}"
    front = (Section("safety", "Safety first", _safety(parts)),
             Section("contents", "Contents", (_contents(parts),)),
             Section("summary", "Summary of the designs", _summary(parts)))
    if cards:
        front = (front[0], front[2])
    return Booklet(
        title=title, event=event, date=date, paper=paper,
        subtitle=("Club handout: yard cards for end-fed half-wave antennas" if cards else
                  "Club handout: build sheets for end-fed half-wave antennas"),
        furniture=(event or "club handout", sheets, f"dated {date}"),
        page_label="page {page} of {pages}",
        footer="Caution: high RF voltage at the stub's open end and the radiator's far end. Never touch "
               "an antenna while transmitting; keep it clear of power lines. Read the safety page first.",
        subject=f"{title}: {sheets}" + (f", {event}" if event else "") + f", dated {date}",
        cover=_cover(parts, title, event, date, cards),
        front=front,
        sheets=tuple(parts),
    )


def _mhz(hz: float) -> str:
    return units.format_frequency(hz)


def _nb(text: str) -> str:
    """A quantity that must not break across lines (as in sheet.py)."""
    return text.replace(" ", "\u00a0")


def _e(text: str) -> str:
    return str(escape(text))


def _bands(parts: Sequence[Part]) -> str:
    """The bands covered, lowest first, each once: "20 m, 15 m and 2 m"."""
    names = list(dict.fromkeys(p.band for p in sorted(parts, key=lambda p: p.frequency_hz)))
    return names[0] if len(names) == 1 else ", ".join(names[:-1]) + " and " + names[-1]


def _cover(parts: Sequence[Part], title: str, event: str, date: str, cards: bool = False) -> Cover:
    n = len(parts)
    what = ("one yard card each (the full build sheets are the record copies)" if cards else
            "one build sheet each")
    return Cover(
        title=_e(title), event=_e(event), date=_e(date),
        facts=(("bands", _e(_bands(parts))),
               ("designs", _e(f"{n} end-fed half-wave antenna{'s' if n != 1 else ''}, each matched by a "
                              f"shorted quarter-wave stub, {what}")),
               ("document IDs", _e("each sheet's title block carries the document ID of its design "
                                   "file; check that they match before you build"))),
        note="<b>Read the safety page before you build or put up any of these antennas.</b> Local "
             "codes, your regulator's rules and licensed practice come first.",
    )


def _safety(parts: Sequence[Part]) -> tuple:
    top = max(parts, key=lambda p: p.v_peak_v)
    return render_blocks("handout-safety.j2", v_peak=_nb(units.format_voltage(top.v_peak_v)),
                         v_where=f"{top.sheet.title}, at {units.format_power(top.power_w)} PEP")


def _contents(parts: Sequence[Part]) -> Contents:
    entries = [ContentsEntry("Safety first", "the cautions for every design", "safety"),
               ContentsEntry("Summary of the designs", "band, dimensions and predicted 2:1 band of each",
                             "summary")]
    entries += [ContentsEntry(_e(p.sheet.title),
                              _e(f"{p.band}, {_mhz(p.frequency_hz)}; {p.sheet.name}, document "
                                 f"{p.sheet.document_id}, revised {p.sheet.date}"), p.key)
                for p in parts]
    return Contents(tuple(entries))


def _summary(parts: Sequence[Part]) -> tuple:
    return (
        Para(_e("Dimensions as on each sheet, in its units: radiator, stub (open top to the centre "
                "of the short) and tap (centre of the short to the tap); the 2:1 band is predicted at "
                "the tap."), "note"),
        Table(header=SUMMARY_COLUMNS, rows=tuple(p.row for p in parts),
              widths=(1.5, 0.5, 0.95, 0.8, 0.75, 0.6, 1.15, 1.2, 0.45),
              align=("left", "left", "right", "right", "right", "right", "left", "right", "right")),
    )


def _summary_row(key: str, design: Design, s: Solution, band: str) -> tuple:
    u = design.output.units
    dims = s.dimensions
    swr2 = s.band_swr2_hz
    return (
        f"<b>{_e(design.title)}</b><br/>{_e(design.name)}, {_e(s.design_id)}",
        _e(band), _e(_nb(_mhz(s.frequency_hz))),
        *(_e(_nb(units.format_length(m, u))) for m in (dims.radiator, dims.stub, dims.tap)),
        _e(line_text(design, s, brief=True)),
        _e(f"{_nb(_mhz(swr2[0]))} to {_nb(_mhz(swr2[1]))}") if swr2 else _e("none"),
        PageRef(key),
    )


# ----------------------------------------------------------------------------------------------
# Progress on a terminal

class Progress:
    """A one-line progress bar on `stream` (stderr), drawn over itself; silent when not enabled."""

    WIDTH = 30

    def __init__(self, stream=sys.stderr, *, enabled: bool):
        self.stream = stream
        self.enabled = enabled

    def show(self, what: str, done: int, total: int) -> None:
        if not self.enabled:
            return
        filled = self.WIDTH * done // max(total, 1)
        self.stream.write(f"\r{what} [{'#' * filled}{'.' * (self.WIDTH - filled)}] {done}/{total}\x1b[K")
        self.stream.flush()

    def close(self) -> None:
        if self.enabled:
            self.stream.write("\r\x1b[K")
            self.stream.flush()
