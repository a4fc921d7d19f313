"""The command line: owns argument parsing and turning errors into exit codes and one-line messages.

`main(argv) -> int` is a plain function (tests call it in-process); `entry()` is the console script.
Exit 0 ok, 2 bad input (BuildsheetError, bad arguments), 1 internal fault. Each command is a thin
layer over the library; libraries a command does not need are not imported.
"""

from __future__ import annotations

import argparse
import errno
import sys

from buildsheet.errors import BuildsheetError


class _ArgumentError(Exception):
    pass


class _Parser(argparse.ArgumentParser):
    """argparse that reports a usage mistake as one line instead of exiting by itself."""

    def error(self, message: str):  # noqa: D102 - argparse API
        raise _ArgumentError(f"{self.prog}: {message} (see `{self.prog} --help`)")


class _NotGiven:
    """Stands for the parser of a command other than the one on the command line: argparse hands the
    command line to that command's parser only, so the others' arguments are not set up (setting up
    every command's was 5-8 ms of each run)."""

    def add_argument(self, *args, **kwargs) -> None:
        pass

    def set_defaults(self, **kwargs) -> None:
        pass


def _parser(argv: list[str] | None = None) -> argparse.ArgumentParser:
    """The command-line parser; with `argv`, only the arguments of the command it names (its first
    word not starting with '-': the top level has no option taking a value) are set up, all of them
    when it names none."""
    parser = _Parser(prog="buildsheet", description="Design, document and tune end-fed half-wave "
                     "antennas matched by a shorted quarter-wave stub.")
    from buildsheet import __version__
    parser.add_argument("--version", action="version", version=f"buildsheet {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    sub.required = True
    # a word that names no command is refused by argparse all the same (its choices are every
    # command's name, set up below either way)
    given = next((word for word in argv or () if not word.startswith("-")), None)

    def command(name: str, **kwargs):
        p = sub.add_parser(name, **kwargs)
        return p if given in (None, name) else _NotGiven()

    p = command("check", help="validate design files")
    p.add_argument("designs", nargs="+", metavar="DESIGN")
    p.set_defaults(run=_check)

    p = command("solve", help="solve a design: dimensions, cut list, SWR, voltages, exposure")
    p.add_argument("design", metavar="DESIGN")
    p.add_argument("--json", action="store_true", help="print the whole solution as one JSON object (SI)")
    _output_options(p)
    p.set_defaults(run=_solve)

    p = command("record", help="append an as-built entry to the design's record")
    p.add_argument("design", metavar="DESIGN")
    p.add_argument("--date", required=True, metavar="YYYY-MM-DD", help="date of the measurements")
    p.add_argument("--site", metavar="TEXT", help="where the antenna was put up")
    p.add_argument("--radiator", metavar="LEN", help="radiator length as built, with a unit")
    p.add_argument("--short", dest="stub", metavar="LEN",
                   help="stub length as built: open top to the centre of the short")
    p.add_argument("--tap", metavar="LEN", help="tap as built: centre of the short to the tap")
    p.add_argument("--resonance", metavar="FREQ", help="measured frequency of lowest SWR")
    p.add_argument("--swr", metavar="N", help="measured SWR, a plain number such as 1.3")
    p.add_argument("--note", metavar="TEXT", help="one line of free text")
    p.add_argument("--readings", metavar="FILE", help="SWR readings taken on the antenna as this entry "
                   "records it: a CSV of the sheet's measurement log (frequency, SWR, R (Ω), X (Ω)) or "
                   "of frequency and SWR or return loss")
    p.add_argument("--reading", metavar="F=SWR", action="append",
                   help="one SWR reading, such as '14.1 MHz=1.8' or '14.1 MHz=RL 10 dB' (repeat)")
    p.set_defaults(run=_record)

    p = command("history", help="revisions of a design from git, with the key dimensions")
    p.add_argument("design", metavar="DESIGN")
    p.set_defaults(run=_history)

    p = command("build", help="write the PDF build sheet and the SVG figures")
    p.add_argument("design", metavar="DESIGN")
    p.add_argument("-o", "--output", metavar="DIR", help="output folder (default: out/<name>/)")
    p.add_argument("--card", action="store_true", help="also write the yard card <name>-card.pdf: one "
                   "or two pages to take out to the antenna")
    _output_options(p, paper=True)
    p.set_defaults(run=_build)

    p = command("draw", help="write the SVG figures of a design")
    p.add_argument("design", metavar="DESIGN")
    p.add_argument("-o", "--output", metavar="DIR", help="output folder (default: out/<name>/)")
    _output_options(p)
    p.set_defaults(run=_draw)

    p = command("fit", help="fit the model to a sweep measured at the tap; how to move the short "
                       "and the tap")
    p.add_argument("design", metavar="DESIGN")
    p.add_argument("sweep", metavar="SWEEP", nargs="?",
                   help="Touchstone 1-port (.s1p) or CSV of frequency, R, X")
    p.add_argument("--swr", metavar="F=SWR", action="append",
                   help="an SWR reading without phase, such as '14.1 MHz=1.8' or '14.1 MHz=RL 10 dB' "
                   "(return loss); give three or more instead of SWEEP for the dip and advice")
    p.add_argument("--readings", metavar="FILE",
                   help="SWR readings from a CSV (the sheet's measurement log: frequency, SWR, R (Ω), X (Ω), "
                   "what was changed; or frequency_mhz and SWR or return_loss_db) instead of SWEEP")
    p.add_argument("--from-record", action="store_true",
                   help="SWR readings from the latest as-built entry that has them (record --readings)")
    p.add_argument("--at", choices=("tap", "station"), default="tap",
                   help="where the sweep or readings were taken: at the tap (default) or at the station end "
                   "of the design's feed coax (carried back to the tap through it)")
    p.add_argument("--json", action="store_true", help="print the fit and the advice as one JSON object (SI)")
    p.add_argument("--write", action="store_true",
                   help="store the fitted calibration in the design file (backup kept as DESIGN.bak)")
    p.add_argument("--units", choices=("imperial", "metric"), help="override the design's output.units")
    p.add_argument("--date", metavar="YYYY-MM-DD",
                   help="date of the sweep stored with --write (default: the sweep file's date)")
    p.set_defaults(run=_fit)

    p = command("start", help="write a new commented design file from a few answers (asks on a "
                       "terminal for what the options do not give)")
    p.add_argument("file", metavar="FILE", help="the new design file (never overwritten); its name "
                   "gives the design's name")
    p.add_argument("--band", metavar="BAND", help="amateur band such as '20 m' or '70 cm' (the design "
                   "frequency is its middle)")
    p.add_argument("--frequency", metavar="FREQ", help="design frequency, such as '14.2 MHz'")
    p.add_argument("--line", metavar="NAME", help="stub line from the catalogue (default window-450)")
    p.add_argument("--coax", metavar="NAME", help="feed coax from the catalogue (default RG-8X)")
    p.add_argument("--orientation", choices=("horizontal", "sloper", "vertical", "inverted"),
                   help="how it is hung (default: horizontal below 30 MHz, vertical above)")
    p.add_argument("--height", metavar="LEN", help="height of the stub's open top (vertical and "
                   "inverted: of the short), with a unit")
    p.add_argument("--units", choices=("imperial", "metric"), help="units of the sheet")
    p.add_argument("--region", type=int, choices=(1, 2, 3), default=None, help="ITU region (default 2)")
    p.add_argument("--title", metavar="TEXT", help="title printed on the sheet")
    p.set_defaults(run=_start)

    p = command("catalogue", help="list the wires, materials, lines, coax, grounds, tube and rod "
                       "stock and bands the design files may name, with figures and sources")
    if not isinstance(p, _NotGiven):
        from buildsheet.listing import KINDS as _LIST_KINDS
        p.add_argument("sections", nargs="*", metavar="SECTION",
                       help=f"what to list: {', '.join(_LIST_KINDS)} (default: all)")
    p.add_argument("--region", type=int, choices=(1, 2, 3), default=2, help="ITU region of the bands")
    p.add_argument("--units", choices=("imperial", "metric"), default="imperial",
                   help="units of the sizes (default imperial)")
    p.set_defaults(run=_catalogue)

    p = command("handout", help="one booklet of build sheets for several designs (a club handout)")
    p.add_argument("designs", nargs="+", metavar="DESIGN",
                   help="design files, or folders standing for the *.yaml designs in them")
    p.add_argument("-o", "--output", required=True, metavar="FILE", help="the booklet's PDF file")
    p.add_argument("--title", metavar="TEXT", help="title on the cover and the booklet's own pages")
    p.add_argument("--event", metavar="TEXT", help="the event or club, printed under the title")
    p.add_argument("--date", metavar="YYYY-MM-DD",
                   help="date of the booklet and revision date of every sheet (default: each sheet's "
                        "own revision date, the booklet the latest of them)")
    p.add_argument("--paper", choices=("letter", "a4"),
                   help="paper of the whole booklet (default: the paper most of the designs ask for)")
    p.add_argument("--units", choices=("imperial", "metric"), help="override every design's output.units")
    p.add_argument("--quiet", action="store_true", help="no progress bar on a terminal")
    p.add_argument("--cards", action="store_true", help="yard cards instead of full build sheets, "
                   "with one shared safety page")
    p.set_defaults(run=_handout)
    return parser


#: what `start` asks on a terminal for the answers its options did not give: (option, question)
_QUESTIONS = (("band", "band, such as 20 m or 2 m (or leave empty and give a frequency)"),
              ("frequency", "design frequency, such as 14.2 MHz"),
              ("line", "stub line"), ("coax", "feed coax"),
              ("orientation", "horizontal, sloper, vertical or inverted"),
              ("height", "height of the stub's open top (vertical and inverted: of the short), such as 10 m"),
              ("units", "imperial or metric"))


def _start(args) -> int:
    from buildsheet.catalog import catalog
    from buildsheet.starter import Answers, design_text, slug, write_new

    given = {key: getattr(args, key) for key, _ in _QUESTIONS}
    if sys.stdin is not None and sys.stdin.isatty() and sys.stdout.isatty():
        hints = {"line": ", ".join(catalog().names("stub_line")), "coax": ", ".join(catalog().names("coax"))}
        for key, question in _QUESTIONS:
            if given[key] or (key == "frequency" and given["band"]):
                continue
            hint = f" ({hints[key]})" if key in hints else ""
            reply = input(f"{question}{hint} [default]: ").strip()
            given[key] = reply or None
    answers = Answers(name=slug(args.file), region=args.region or 2, title=args.title, **given)
    write_new(args.file, design_text(answers))
    print(f"{args.file}: new design '{answers.name}' written; next: buildsheet check {args.file}")
    return 0


def _catalogue(args) -> int:
    from buildsheet.listing import listing

    print(listing(tuple(args.sections), args.region, args.units), end="")
    return 0


def _handout(args) -> int:
    import os

    from buildsheet.design import revision_date
    from buildsheet.handout import Progress, check_text, design_paths, load_designs, make_booklet, prepare
    from buildsheet.writers.files import write_atomic
    from buildsheet.writers.pdf import render_booklet

    title, event = check_text("--title", args.title), check_text("--event", args.event)
    if args.date:
        revision_date(None, args.date)      # a bad --date is refused before any work
    designs = load_designs(design_paths(args.designs), args.units)
    if os.path.realpath(args.output) in {os.path.realpath(d.path) for d in designs}:
        raise BuildsheetError("is one of the designs; the booklet would overwrite it", file=args.output)
    progress = Progress(sys.stderr, enabled=sys.stderr.isatty() and not args.quiet)
    try:
        parts = prepare(designs, args.date, cards=args.cards,
                        on_done=lambda n: progress.show("preparing sheets", n, len(designs)))
        booklet = make_booklet(parts, title=title, event=event, paper=args.paper, cards=args.cards)
        pdf, pages = render_booklet(booklet,
                                    on_sheet=lambda i: progress.show("laying out sheets", i + 1, len(parts)))
    finally:
        progress.close()
    try:
        os.makedirs(os.path.dirname(args.output) or ".", exist_ok=True)
        write_atomic(args.output, pdf)      # nothing is written before the whole booklet is ready
    except OSError as exc:
        raise BuildsheetError(f"cannot write the handout: {exc.strerror or exc}", file=args.output) from None
    what = "yard cards" if args.cards else "build sheets"
    print(f"{args.output}: {len(parts)} {what}, {pages} pages, dated {booklet.date}")
    return 0


def _fit(args) -> int:
    import json

    from buildsheet.fit import fit_sweep, fit_text, write_calibration
    from buildsheet.touchstone import read_sweep

    design = _load(args)
    given = [args.sweep is not None, bool(args.swr), args.readings is not None, args.from_record]
    if sum(given) != 1:
        raise BuildsheetError("give one of a SWEEP file, SWR readings (--swr), a readings file "
                              "(--readings) or --from-record", key="fit")
    if not given[0]:
        from buildsheet.swronly import advice_text, advise, as_rho, parse_reading, read_readings, record_readings
        if args.write or args.json:
            raise BuildsheetError("SWR readings give advice only: --write and --json need a sweep with "
                                  "phase (R and X)", key="--swr")
        if args.swr:
            adv = advise(design, [parse_reading(r) for r in args.swr], at=args.at)
        elif args.readings is not None:
            adv = advise(design, as_rho(read_readings(args.readings)[0]), at=args.at, source=args.readings)
        else:
            readings, entry, _ = record_readings(design)
            adv = advise(design, as_rho(readings), at=args.at, source=design.path)
        print(advice_text(adv), end="")
        return 0
    fit = fit_sweep(design, read_sweep(args.sweep), at=args.at)
    written = write_calibration(args.design, fit, args.date) if args.write else None
    if args.json:
        print(json.dumps(fit.to_dict(written), indent=1, allow_nan=False))
    else:
        print(fit_text(fit, written), end="")
    return 0


def _draw(args) -> int:
    import os

    from buildsheet.design import revision_date
    from buildsheet.drawing.figures import figures
    from buildsheet.solver import solve
    from buildsheet.writers.files import write_many_atomic
    from buildsheet.writers.svg import render_svg

    design = _load(args)
    date = revision_date(args.design, args.date)
    solution = solve(design)
    out = args.output or os.path.join("out", design.name)
    files = {os.path.join(out, f"{design.name}-{key}.svg"): render_svg(drawing)
             for key, drawing in figures(design, solution, date).items()}
    _not_the_design(files, args.design)
    try:
        os.makedirs(out, exist_ok=True)
        write_many_atomic(files)   # all or nothing: an interrupted run keeps the previous files
    except OSError as exc:
        raise BuildsheetError(f"cannot write the figures: {exc.strerror or exc}", file=out) from None
    for path in files:
        print(path)
    return 0


def _build(args) -> int:
    import gc

    # A build is short and leaves few reference cycles (about 2,300 objects, half a megabyte), while
    # the cyclic collector's passes over everything it allocates took about 20 ms of it: paused for
    # the build, then left as it was.
    enabled = gc.isenabled()
    gc.disable()
    try:
        return _build_files(args)
    finally:
        if enabled:
            gc.enable()


def _build_files(args) -> int:
    import os

    from buildsheet.design import revision_date
    from buildsheet.drawing.figures import figures
    from buildsheet.sheet import build_sheet
    from buildsheet.solver import solve
    from buildsheet.writers.files import write_many_atomic
    from buildsheet.writers.pdf import render_pdf
    from buildsheet.writers.svg import render_svg

    design = _load(args)
    date = revision_date(args.design, args.date)
    solution = solve(design)
    drawings = figures(design, solution, date)
    out = args.output or os.path.join("out", design.name)
    files = {os.path.join(out, f"{design.name}.pdf"): render_pdf(build_sheet(design, solution, date),
                                                                  drawings)}
    if args.card:
        from buildsheet.card import build_card
        files[os.path.join(out, f"{design.name}-card.pdf")] = render_pdf(build_card(design, solution, date),
                                                                         drawings)
    files.update({os.path.join(out, f"{design.name}-{key}.svg"): render_svg(drawing)
                  for key, drawing in drawings.items()})
    _not_the_design(files, args.design)
    try:
        os.makedirs(out, exist_ok=True)
        write_many_atomic(files)   # all or nothing: an interrupted build keeps the previous files
    except OSError as exc:
        raise BuildsheetError(f"cannot write the build sheet: {exc.strerror or exc}", file=out) from None
    card = f", {design.name}-card.pdf" if args.card else ""
    print(f"{out}: {design.name}.pdf{card} and {len(drawings)} SVG figures, document {solution.design_id}, "
          f"revised {date}")
    return 0


def _not_the_design(files, design: str) -> None:
    """Refuse an output that is the design file itself (by any path, or through a link)."""
    import os

    real = os.path.realpath(design)
    for path in files:
        if os.path.realpath(path) == real or (os.path.lexists(path) and os.path.samefile(path, design)):
            raise BuildsheetError("is the design file itself (or a link to it); the output would "
                                  "overwrite it: choose another output folder", file=str(path))


def _record(args) -> int:
    from buildsheet.record import ENTRY_KEYS, add_entry

    fields = {key: getattr(args, key) for key in ENTRY_KEYS if key != "readings"}
    if args.readings is not None or args.reading:
        from buildsheet.design import Reading
        from buildsheet.swronly import parse_reading, read_readings
        if args.readings is not None and args.reading:
            raise BuildsheetError("give the readings as a FILE or typed (--reading), not both",
                                  key="--readings")
        if args.readings is not None:
            fields["readings"] = read_readings(args.readings)[0]
        else:
            fields["readings"] = [Reading(frequency_hz=f, swr=float(f"{(1 + r) / (1 - r):.4g}"))
                                  for f, r in (parse_reading(t, "--reading") for t in args.reading)]
    added = add_entry(args.design, fields)
    print(f"{added.path}: as-built entry {added.index + 1} ({added.entry.date}) added; document ID "
          f"{added.document_id} unchanged; the previous file is {added.backup}")
    return 0


def _history(args) -> int:
    from buildsheet.history import format_history, history

    for line in format_history(history(args.design)):
        print(line)
    return 0


def _output_options(p: argparse.ArgumentParser, *, paper: bool = False) -> None:
    p.add_argument("--units", choices=("imperial", "metric"), help="override the design's output.units")
    if paper:
        p.add_argument("--paper", choices=("letter", "a4"), help="override the design's output.paper")
    p.add_argument("--date", metavar="YYYY-MM-DD", help="revision date printed on the output")


def _load(args):
    """Load args.design with the command-line overrides of output options applied."""
    import dataclasses

    from buildsheet.design import load_design

    design = load_design(args.design)
    changes = {}
    if getattr(args, "units", None):
        changes["units"] = args.units
    if getattr(args, "paper", None):
        changes["paper"] = args.paper
    if changes:
        design = design.with_changes(output=dataclasses.replace(design.output, **changes))
    return design


def _solve(args) -> int:
    import json

    from buildsheet.solver import solve
    from buildsheet.summary import summary_text

    design = _load(args)
    solution = solve(design)
    if args.json:
        print(json.dumps(solution.to_dict(), indent=1, allow_nan=False))
    else:
        print(summary_text(design, solution), end="")
    return 0


def _check(args) -> int:
    from buildsheet.design import load_design
    from buildsheet.solver import check_geometry

    status = 0
    for path in args.designs:
        try:
            design = load_design(path)
            check_geometry(design)
        except BuildsheetError as exc:
            print(f"error: {exc}" if exc.file else f"error: {path}: {exc}", file=sys.stderr)
            status = 2
        else:
            print(f"{path}: OK {design.document_id} ({design.name})")
    return status


#: the largest SOURCE_DATE_EPOCH taken: the end of year 9999 (datetime's last year)
_MAX_EPOCH = 253402300799


def _check_environment() -> None:
    """Refuse, before any library is imported (numpy reads SOURCE_DATE_EPOCH at import), an
    environment that would break a command halfway."""
    import os

    epoch = os.environ.get("SOURCE_DATE_EPOCH")
    if epoch:
        text = epoch.strip()
        if not (text.isascii() and text.isdigit() and len(text) <= 12 and int(text) <= _MAX_EPOCH):
            shown = text if len(text) <= 30 else text[:27] + "..."
            raise BuildsheetError(f"must be whole seconds since 1970 up to the year 9999, got "
                                  f"'{shown}'", key="SOURCE_DATE_EPOCH")


def _output_error(exc: BaseException) -> int:
    """Exit status and message for a failure to write to stdout or stderr."""
    if isinstance(exc, BrokenPipeError):
        # the reader went away (`buildsheet solve x | head -1`): stop quietly, as Unix tools do
        _silence_stdout()
        return 141      # 128 + SIGPIPE, the status a shell shows for a tool killed by a closed pipe
    if isinstance(exc, UnicodeEncodeError):
        problem = (f"the output's encoding ({exc.encoding}) cannot show '{exc.object[exc.start:exc.end]}'"
                   .encode("ascii", "backslashreplace").decode("ascii")
                   + "; set PYTHONIOENCODING=utf-8 or use a UTF-8 terminal")
    elif getattr(exc, "errno", None) == errno.EBADF:
        problem = "cannot write the output: standard output is closed"
    else:
        problem = f"cannot write the output: {getattr(exc, 'strerror', None) or exc}"
    _silence_stdout()
    try:
        print(f"error: {problem}", file=sys.stderr)
        sys.stderr.flush()
    except (OSError, ValueError):
        pass
    return 2


def _silence_stdout() -> None:
    """Point stdout at /dev/null, so that the interpreter's own flush at exit cannot fail again."""
    import os

    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
        os.close(devnull)
    except (OSError, ValueError, AttributeError):
        pass


def main(argv: list[str] | None = None) -> int:
    argv = sys.argv[1:] if argv is None else list(argv)
    try:
        _check_environment()
        if sys.stdout is None:
            raise BuildsheetError("cannot write the output: standard output is closed")
        args = _parser(argv).parse_args(argv)
        status = args.run(args)
        sys.stdout.flush()      # a full disk or a closed pipe shows here, not after main returns
        return status
    except (BrokenPipeError, UnicodeEncodeError) as exc:
        return _output_error(exc)
    except OSError as exc:
        if exc.errno not in (errno.ENOSPC, errno.EDQUOT, errno.EIO, errno.EBADF):
            print(f"internal error (a bug in buildsheet, please report it): {type(exc).__name__}: {exc}",
                  file=sys.stderr)
            return 1
        # the user's disk or terminal: files written by a command report their own errors, so this
        # is the output stream (stdout on a full device, a closed descriptor)
        return _output_error(exc)
    except _ArgumentError as exc:
        print(f"error: {exc}", file=sys.stderr)
        return 2
    except BuildsheetError as exc:
        print(f"error: {exc}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        print("error: interrupted", file=sys.stderr)
        return 130
    except SystemExit as exc:  # --help and --version exit through argparse
        return int(exc.code or 0)
    except Exception as exc:  # a bug: still one line, and exit 1 so it is told apart from bad input
        print(f"internal error (a bug in buildsheet, please report it): {type(exc).__name__}: {exc}",
              file=sys.stderr)
        return 1


def entry() -> None:
    """The console script: main() with Python's warnings kept off the user's terminal (a case that
    would have warned is refused by the finite-number gates instead; tests call main() and see every
    warning)."""
    import warnings

    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        status = main()
    try:
        if sys.stdout is not None:
            sys.stdout.flush()
    except (OSError, ValueError) as exc:
        status = _output_error(exc)
    # The process ends here and the operating system frees its memory: Python's last collection of
    # reference cycles at exit would walk every object the command made (about 40 ms after a
    # build), so they are frozen out of it (exit handlers and stream flushing run as before).
    import gc

    gc.freeze()
    sys.exit(status)
