"""The command line: owns argument parsing and turning errors into exit codes and one-line messages.

`main(argv) -> int` is a plain function (tests call it in-process); `entry()` is the console script.
Exit 0 ok, 2 bad input (BuildsheetError, bad arguments), 1 internal fault. Each command is a thin
layer over the library; libraries a command does not need are not imported.
"""

from __future__ import annotations

import argparse
import sys

from buildsheet.errors import BuildsheetError


class _ArgumentError(Exception):
    pass


class _Parser(argparse.ArgumentParser):
    """argparse that reports a usage mistake as one line instead of exiting by itself."""

    def error(self, message: str):  # noqa: D102 - argparse API
        raise _ArgumentError(f"{self.prog}: {message} (see `{self.prog} --help`)")


def _parser() -> argparse.ArgumentParser:
    parser = _Parser(prog="buildsheet", description="Design, document and tune end-fed half-wave "
                     "antennas matched by a shorted quarter-wave stub.")
    from buildsheet import __version__
    parser.add_argument("--version", action="version", version=f"buildsheet {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    sub.required = True

    p = sub.add_parser("check", help="validate design files")
    p.add_argument("designs", nargs="+", metavar="DESIGN")
    p.set_defaults(run=_check)
    return parser


def _check(args) -> int:
    from buildsheet.design import load_design

    status = 0
    for path in args.designs:
        try:
            design = load_design(path)
        except BuildsheetError as exc:
            print(f"error: {exc}" if exc.file else f"error: {path}: {exc}", file=sys.stderr)
            status = 2
        else:
            print(f"{path}: OK {design.document_id} ({design.name})")
    return status


def main(argv: list[str] | None = None) -> int:
    argv = sys.argv[1:] if argv is None else list(argv)
    try:
        args = _parser().parse_args(argv)
        return args.run(args)
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
    sys.exit(main())
