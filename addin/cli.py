"""The ``boreflow`` command line.

Every subcommand and its options are declared here, in :func:`build_parser`; each one's work is
done by ``run(args)`` of its module in :mod:`addin.commands` (``rheology``, ``report``,
``calc``, ``batch``, ``methods``), which returns the exit code (:mod:`addin.commands.exit_codes`).

Subcommands:

``boreflow rheology CASE [--units oilfield|metric|si] [--json]``
    For every ``[[check]]`` and ``[[slurry]]`` in the case: the readings, PV/YP/LSYP/gels, every
    fit with its quality, the ranking and notes; then the comparison of consecutive checks and
    the one-line caution.

``boreflow report CASE [-o REPORT.xlsx] [--force] [--json]``
    The daily hydraulics report workbook from a TOML case file or an input workbook (.xlsx).
    Written atomically; an existing file is never replaced unless ``--force`` is given.

``boreflow calc hydrostatic|annular-velocity|bit|circulate ...``
    One-off numbers (``boreflow calc QUANTITY --help`` lists each one's options).

``boreflow batch PATH... -o FOLDER [--force] [--summary FILE.csv]``
    A report for every case (folders are searched for *.toml and *.xlsx, ``@list.txt`` reads
    paths from a file), with a progress bar on stderr and a summary table on stdout.

``boreflow methods [--json | --markdown]``
    Every registered method of every registry (hydraulics methods first, the default at the
    top): description, primary source, verification status in words, evidence and caveats.

Exit codes
----------
0  success
1  internal error (a bug: please report it with the case file)
2  bad input (unknown option, unreadable or invalid case file or workbook, impossible
   readings); the message is one line on stderr, no traceback; nothing is written
3  the output file exists and ``--force`` was not given; nothing is written
4  the output could not be written (missing folder, permissions, disk full); any previous
   file is left intact
5  batch: at least one case failed (the others were written; see the summary table)
141  the reader of the output went away (``boreflow rheology CASE | head``): the rest of the
   output is dropped quietly, as other command-line tools do (128 + SIGPIPE)
"""

from __future__ import annotations

import argparse
import os
import sys

from addin.commands import batch as batch_cmd
from addin.commands import calc as calc_cmd
from addin.commands import methods as methods_cmd
from addin.commands import report as report_cmd
from addin.commands import rheology as rheology_cmd
from addin.commands.exit_codes import (
    EXIT_BAD_INPUT,
    EXIT_BROKEN_PIPE,
    EXIT_EXISTS,
    EXIT_INTERNAL,
    EXIT_INTERRUPTED,
    EXIT_WRITE,
)
from addin.commands.output import error_text
from calc.errors import InputError
from calc.units import UNIT_SYSTEMS

__all__ = ["build_parser", "main"]


class _ArgError(Exception):
    pass


class _Parser(argparse.ArgumentParser):
    def error(self, message):  # one line, exit code 2, no usage dump
        raise _ArgError(message)


# ------------------------------------------------------------------ the subcommands
def _add_rheology(sub) -> None:
    p = sub.add_parser("rheology", help="rheology of the mud checks and slurries of a case")
    p.add_argument("case", help="case file (TOML), e.g. workbooks/demo-case.toml")
    p.add_argument(
        "--units",
        choices=list(UNIT_SYSTEMS),
        default=None,
        help="unit system for output (default: the case's [case].units)",
    )
    p.add_argument("--json", action="store_true", help="machine-readable JSON output")
    p.set_defaults(func=rheology_cmd.run)


def _add_constants(p) -> None:
    """``--constants``: the field-constant set of the hydraulics method (calc/METHODS.md §7.9)."""
    p.add_argument(
        "--constants",
        default=None,
        help="field constants: exact (derived from SI, default) or as_printed (the published "
        "rounded constants; api13d_1995_power_law only)",
    )


def _add_allow_unusual(p) -> None:
    p.add_argument(
        "--allow-unusual",
        action="store_true",
        help="go on with inputs outside their usual range (still refused when physically "
        "impossible); the report's Run section records it (calc/METHODS.md, plausibility)",
    )


def _add_report(sub) -> None:
    p = sub.add_parser(
        "report",
        help="write the daily hydraulics report workbook for a case",
        description="Build the report workbook (.xlsx) from a case file (TOML) or an input "
        "workbook (.xlsx). The file is written atomically and never overwrites an existing "
        "one unless --force is given.",
    )
    p.add_argument(
        "case", help="case file (.toml) or input workbook (.xlsx), e.g. workbooks/demo-case.toml"
    )
    p.add_argument("-o", "--output", help="report file (default: CASE-report.xlsx here)")
    p.add_argument("--force", action="store_true", help="replace an existing report")
    p.add_argument("--json", action="store_true", help="also print every result as JSON")
    p.add_argument(
        "--method",
        default=None,
        help="hydraulics method (default: the case's, else api13d_2010_hb)",
    )
    _add_constants(p)
    _add_allow_unusual(p)
    p.set_defaults(func=report_cmd.run)


def _add_calc(sub) -> None:
    c = sub.add_parser(
        "calc",
        help="one-off numbers (hydrostatic, annular velocity, bit, circulate)",
        description="Quick calculations. Values are numbers in the unit system of --units "
        "(default oilfield) or text with a unit, e.g. --density '1.32 sg'.",
    )
    csub = c.add_subparsers(
        dest="quantity", metavar="QUANTITY", required=True, parser_class=_Parser
    )

    def common(q):
        q.add_argument(
            "--units",
            choices=list(UNIT_SYSTEMS),
            default="oilfield",
            help="unit system of inputs and output (default oilfield)",
        )
        q.add_argument("--json", action="store_true", help="JSON output")
        _add_allow_unusual(q)
        q.set_defaults(func=calc_cmd.run)
        return q

    h = common(csub.add_parser("hydrostatic", help="pressure of a static column ρ·g·TVD"))
    h.add_argument("--density", required=True)
    h.add_argument("--tvd", required=True)
    h.add_argument(
        "--hydrostatic",
        choices=["exact", "0.052"],
        default="exact",
        help="g convention (default exact gₙ)",
    )
    a = common(csub.add_parser("annular-velocity", help="mean velocity Q / annulus area"))
    a.add_argument("--rate", required=True)
    a.add_argument("--hole", required=True, help="hole or casing inside diameter")
    a.add_argument("--pipe", required=True, help="pipe outside diameter")
    b = common(csub.add_parser("bit", help="TFA, nozzle velocity, bit ΔP, power, HSI, impact"))
    b.add_argument("--rate", required=True)
    b.add_argument("--density", required=True)
    b.add_argument("--size", required=True, help="bit diameter")
    b.add_argument("--nozzles", required=True, help="sizes in 1/32 in, e.g. 12,12,12,11,11,11")
    b.add_argument("--cd", type=float, default=0.95, help="discharge coefficient (0.95)")
    k = csub.add_parser("circulate", help="SPP breakdown and ECD for a case at a rate")
    k.add_argument("case")
    k.add_argument("--rate", help="flow rate (default: the latest check's)")
    k.add_argument(
        "--method",
        default=None,
        help="hydraulics method (default: the case's, else api13d_2010_hb)",
    )
    _add_constants(k)
    k.add_argument(
        "--units",
        dest="units_given",
        choices=list(UNIT_SYSTEMS),
        default=None,
        help="output units (default the case's)",
    )
    k.add_argument("--json", action="store_true")
    _add_allow_unusual(k)
    k.set_defaults(func=calc_cmd.run, units="oilfield")


def _add_methods(sub) -> None:
    p = sub.add_parser(
        "methods",
        help="every registered method: its source and how it has been checked",
        description="Every hydraulics method (default first), friction law, viscometer and "
        "rheometer-table fit, slip-velocity method and nozzle-optimisation criterion, with its "
        "primary source, its verification status, the evidence and the caveats.",
    )
    out = p.add_mutually_exclusive_group()
    out.add_argument("--json", action="store_true", help="print JSON instead of text")
    out.add_argument(
        "--markdown", action="store_true", help="print the status table of calc/METHODS.md §17"
    )
    p.set_defaults(func=methods_cmd.run)


def _add_batch(sub) -> None:
    bt = sub.add_parser(
        "batch",
        help="reports for many cases, with a progress bar and a summary table",
        description="Write CASE-report.xlsx into FOLDER for every case. PATH may be a case "
        "file, a folder (its *.toml and *.xlsx) or @list.txt (one path per line). Failed "
        "cases are listed, the others still written; exit status 5 if any failed.",
    )
    bt.add_argument("paths", nargs="+", metavar="PATH")
    bt.add_argument("-o", "--output", required=True, metavar="FOLDER")
    bt.add_argument("--force", action="store_true", help="replace existing reports")
    bt.add_argument("--summary", metavar="FILE.csv", help="also write the summary as CSV")
    bt.add_argument("-q", "--quiet", action="store_true", help="no progress bar")
    _add_allow_unusual(bt)
    bt.set_defaults(func=batch_cmd.run)


_EPILOG = """first run (the invented demo case):
  boreflow report workbooks/demo-case.toml -o demo-report.xlsx

more help: boreflow COMMAND --help

exit codes:
  0  success
  1  internal error (a bug; set BOREFLOW_DEBUG=1 for the traceback)
  2  bad input (the message names the file and key, or sheet and cell)
  3  output exists (use --force to replace it)
  4  cannot write the output (the previous file is left intact)
  5  batch: some cases failed (the others were written)
  141  output pipe closed by its reader (e.g. | head): rest of the output dropped
"""


def build_parser() -> argparse.ArgumentParser:
    """The ``boreflow`` parser with every subcommand (rheology, report, calc, batch,
    methods)."""
    parser = _Parser(
        prog="boreflow",
        description="Drilling-fluid and slurry hydraulics: rheology, circulating pressures, "
        "ECD, bit, hole cleaning, surge/swab, and the daily report workbook.",
        epilog=_EPILOG,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    _add_rheology(sub)
    _add_report(sub)
    _add_calc(sub)
    _add_batch(sub)
    _add_methods(sub)
    return parser


def _broken_pipe() -> int:
    """The output pipe was closed by its reader: drop the rest of the output quietly.

    stdout is pointed at the null device so the interpreter's final flush cannot raise again
    (the approach of the Python documentation, "Note on SIGPIPE", module :mod:`signal`).
    """
    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
    except (OSError, ValueError, AttributeError):  # stdout without a file descriptor (tests)
        pass
    return EXIT_BROKEN_PIPE


def main(argv=None) -> int:
    """Run the command line; returns the exit code (0 ok, 2 bad input)."""
    parser = build_parser()
    try:
        args = parser.parse_args(argv)
        if not getattr(args, "func", None):
            parser.print_help()
            return EXIT_BAD_INPUT
        code = args.func(args)
        sys.stdout.flush()  # a closed pipe shows up here, inside the handler, not at exit
        return code
    except BrokenPipeError:
        return _broken_pipe()
    except SystemExit:  # --help printed: flush here so a closed pipe is handled quietly too
        try:
            sys.stdout.flush()
        except BrokenPipeError:
            return _broken_pipe()
        raise
    except _ArgError as exc:
        print(f"boreflow: error: {exc}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except InputError as exc:
        print(f"boreflow: error: {error_text(exc)}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except FileExistsError as exc:
        print(f"boreflow: error: {exc}", file=sys.stderr)
        return EXIT_EXISTS
    except OSError as exc:
        print(f"boreflow: error: cannot write: {exc}", file=sys.stderr)
        return EXIT_WRITE
    except KeyboardInterrupt:
        print("boreflow: interrupted; nothing half-written was left behind", file=sys.stderr)
        return EXIT_INTERRUPTED
    except Exception as exc:  # a bug: one line, not a traceback, unless asked
        if os.environ.get("BOREFLOW_DEBUG"):
            raise
        print(
            f"boreflow: internal error: {type(exc).__name__}: {exc} (set BOREFLOW_DEBUG=1 "
            "for the traceback)",
            file=sys.stderr,
        )
        return EXIT_INTERNAL


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
