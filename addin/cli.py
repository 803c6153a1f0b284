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

``boreflow sheets compute IN.xlsx -o OUT.xlsx [--force] [--keep-arrays]``
    A workbook of ``BF_…`` formulas computed headlessly; the copy stores every value.

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
143  stopped by SIGTERM: the temporary file of a write in progress is removed, no report is
   left half-written
141  the reader of the output went away (``boreflow rheology CASE | head``): the rest of the
   output is dropped quietly, as other command-line tools do (128 + SIGPIPE)
"""

from __future__ import annotations

import argparse
import os
import re
import signal
import sys
import threading

import numpy as np

import calc
from addin.commands import batch as batch_cmd
from addin.commands import calc as calc_cmd
from addin.commands import methods as methods_cmd
from addin.commands import report as report_cmd
from addin.commands import rheology as rheology_cmd
from addin.commands import sheets as sheets_cmd
from addin.commands.exit_codes import (
    EXIT_BAD_INPUT,
    EXIT_BROKEN_PIPE,
    EXIT_EXISTS,
    EXIT_INTERNAL,
    EXIT_INTERRUPTED,
    EXIT_TERMINATED,
    EXIT_WRITE,
)
from addin.commands.output import SanitisingStream, error_text
from calc.errors import InputError
from calc.flow.minor_losses import JOINT_LOSS_OPTIONS
from calc.hydraulics_method import CONSTANT_SETS, DEFAULT_METHOD, HYDRAULICS_METHODS
from calc.rheology.viscometer import SHEAR_RATE_CORRECTIONS
from calc.units import UNIT_SYSTEMS, from_si, label, to_si, unit_for

__all__ = ["build_parser", "main"]


class _ArgError(Exception):
    pass


class _Parser(argparse.ArgumentParser):
    def error(self, message):  # one line, exit code 2, no usage dump
        raise _ArgError(message)


# ------------------------------------------------------------------ cli: units and choices in help
def _unit_help(kind: str) -> str:
    """The unit of a ``kind`` option in every unit system, for its help text:
    ``ppg with --units oilfield, kg/m³ with metric or si``."""
    by_unit: dict[str, list[str]] = {}
    for system in UNIT_SYSTEMS:
        by_unit.setdefault(label(unit_for(kind, system)), []).append(system)
    parts = [f"{u} ({' or '.join(systems)})" for u, systems in by_unit.items()]
    return "a number in " + ", ".join(parts) + " by --units, or text with a unit"


def _units_option(p, *, default, dest="units", what="inputs and output") -> None:
    """``--units``: the unit system, with its choices."""
    fallback = default or "the case's [case].units"
    p.add_argument(
        "--units",
        dest=dest,
        choices=list(UNIT_SYSTEMS),
        default=default,
        metavar="SYSTEM",
        help=f"unit system of {what}: one of {', '.join(UNIT_SYSTEMS)} (default {fallback})",
    )


def _method_option(p) -> None:
    """``--method``: the hydraulics method, its choices from the registry."""
    names = HYDRAULICS_METHODS.names()
    p.add_argument(
        "--method",
        default=None,  # checked by the registry, whose message lists every name
        metavar="METHOD",
        help=f"hydraulics method: one of {', '.join(names)} (default: the case's "
        f"[case].method, else {DEFAULT_METHOD}; 'boreflow methods' describes each)",
    )


# ------------------------------------------------------------------ the subcommands
def _add_rheology(sub) -> None:
    p = sub.add_parser("rheology", help="rheology of the mud checks and slurries of a case")
    p.add_argument("case", help="case file (TOML), e.g. workbooks/demo-case.toml")
    _units_option(p, default=None, what="the output")
    p.add_argument("--json", action="store_true", help="machine-readable JSON output")
    _add_shear_rate_correction(p)
    p.set_defaults(func=rheology_cmd.run)


def _add_joint_losses(p) -> None:
    """``--joint-losses``: the tool-joint loss option (calc/METHODS.md §22)."""
    p.add_argument(
        "--joint-losses",
        choices=JOINT_LOSS_OPTIONS,
        default=None,
        help="tool-joint losses in the string: bore_friction (friction of the joint bore "
        "only; the default) or bore_change_k (also a sharp contraction and a Borda-Carnot "
        "expansion at every joint); overrides [case].joint_losses",
    )


def _add_constants(p) -> None:
    """``--constants``: the field-constant set of the hydraulics method (calc/METHODS.md §7.9)."""
    p.add_argument(
        "--constants",
        default=None,
        metavar="SET",
        help=f"field constants: one of {', '.join(CONSTANT_SETS)}; exact (derived from SI, "
        "default) or as_printed (the published rounded constants; api13d_1995_power_law only)",
    )


def _add_shear_rate_correction(p) -> None:
    p.add_argument(
        "--shear-rate-correction",
        default=None,
        choices=SHEAR_RATE_CORRECTIONS,
        help="viscometer shear rates for the fits: newtonian (field practice) or krieger "
        "(finite-gap correction); default the case's [case].shear_rate_correction, else "
        "newtonian",
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
    p.add_argument(
        "--json",
        action="store_true",
        help="also print every result as JSON (in the case's units, each named; "
        "schema: workbooks/report-json-schema.json)",
    )
    _method_option(p)
    _add_constants(p)
    _add_joint_losses(p)
    _add_shear_rate_correction(p)
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
        _units_option(q, default="oilfield")
        q.add_argument("--json", action="store_true", help="JSON output")
        _add_allow_unusual(q)
        q.set_defaults(func=calc_cmd.run)
        return q

    h = common(csub.add_parser("hydrostatic", help="pressure of a static column ρ·g·TVD"))
    h.add_argument("--density", required=True, help="mud density: " + _unit_help("density"))
    h.add_argument(
        "--tvd", required=True, help="true vertical depth (0 or more): " + _unit_help("depth")
    )
    h.add_argument(
        "--hydrostatic",
        choices=["exact", "0.052"],
        default="exact",
        help="g convention (default exact gₙ)",
    )
    a = common(csub.add_parser("annular-velocity", help="mean velocity Q / annulus area"))
    a.add_argument("--rate", required=True, help="flow rate: " + _unit_help("flow_rate"))
    a.add_argument(
        "--hole", required=True, help="hole or casing inside diameter: " + _unit_help("diameter")
    )
    a.add_argument("--pipe", required=True, help="pipe outside diameter: " + _unit_help("diameter"))
    b = common(csub.add_parser("bit", help="TFA, nozzle velocity, bit ΔP, power, HSI, impact"))
    b.add_argument("--rate", required=True, help="flow rate: " + _unit_help("flow_rate"))
    b.add_argument("--density", required=True, help="mud density: " + _unit_help("density"))
    b.add_argument("--size", required=True, help="bit diameter: " + _unit_help("diameter"))
    b.add_argument(
        "--nozzles",
        required=True,
        help="nozzle sizes in 1/32 in whatever --units (the trade's nozzle numbers), comma "
        "separated, e.g. 12,12,12,11,11,11 or 3x12,3x11",
    )
    b.add_argument(
        "--cd",
        type=float,
        default=0.95,
        help="nozzle discharge coefficient, dimensionless (default 0.95)",
    )
    k = csub.add_parser("circulate", help="SPP breakdown and ECD for a case at a rate")
    k.add_argument("case", help="case file (.toml) or input workbook (.xlsx)")
    k.add_argument(
        "--rate",
        help="flow rate (default: the latest check's): a number in the case's flow-rate unit "
        "(" + _unit_help("flow_rate").removeprefix("a number in ") + ")",
    )
    _method_option(k)
    _add_constants(k)
    _add_joint_losses(k)
    _units_option(k, default=None, dest="units_given", what="the output")
    k.add_argument("--json", action="store_true", help="JSON output")
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


def _jobs(text: str) -> int:
    """``--jobs``: a whole number of worker processes, 1 to 256."""
    try:
        n = int(text)
    except ValueError:
        n = 0
    if not 1 <= n <= 256:
        raise argparse.ArgumentTypeError(f"--jobs = {text!r}: allowed is a whole number 1 to 256")
    return n


def _add_batch(sub) -> None:
    bt = sub.add_parser(
        "batch",
        help="reports for many cases, with a progress bar and a summary table",
        description="Write CASE-report.xlsx into FOLDER for every case. PATH may be a case "
        "file, a folder (its *.toml and *.xlsx) or @list.txt (one path per line). Failed "
        "cases are listed, the others still written; exit status 5 if any failed.",
    )
    bt.add_argument("paths", nargs="+", metavar="PATH", help="case file, folder or @list.txt")
    bt.add_argument(
        "-o", "--output", required=True, metavar="FOLDER", help="report folder (created if need be)"
    )
    bt.add_argument(
        "--force", action="store_true", help="replace existing reports and --summary file"
    )
    bt.add_argument(
        "--summary",
        metavar="FILE.csv",
        help="also write the summary as CSV (an existing file is refused before any case runs, "
        "exit 3, unless --force)",
    )
    _units_option(bt, default="oilfield", what="the summary table (every case converted)")
    _method_option(bt)
    bt.add_argument("-q", "--quiet", action="store_true", help="no progress bar")
    bt.add_argument(
        "-j",
        "--jobs",
        type=_jobs,
        default=1,
        metavar="N",
        help="run the cases on N worker processes of this machine (default 1: one after "
        "another); with --scheduler, the number of workers of a local cluster",
    )
    bt.add_argument(
        "--scheduler",
        metavar="ADDRESS",
        help="run the cases on a Dask distributed cluster: a running scheduler's address "
        '(tcp://host:8786) or "local" for a cluster on this machine (needs the optional '
        'fleet extra: pip install "boreflow[fleet]")',
    )
    _add_allow_unusual(bt)
    bt.set_defaults(func=batch_cmd.run)


def _add_sheets(sub) -> None:
    sh = sub.add_parser(
        "sheets",
        help="workbooks of BF_ worksheet functions without a spreadsheet program",
        description="sheets compute IN.xlsx -o OUT.xlsx: evaluate every BF_ formula headlessly "
        "and write a copy in which every formula cell holds its value (formulas kept; array "
        "formulas stored as values and listed on a sheet 'BF array formulas').",
    )
    ssub = sh.add_subparsers(dest="action", metavar="ACTION", required=True, parser_class=_Parser)
    c = ssub.add_parser("compute", help="compute a workbook and write a copy with the values")
    c.add_argument("workbook", help="workbook (.xlsx), e.g. workbooks/demo-workbook.xlsx")
    c.add_argument("-o", "--output", required=True, help="the computed copy (.xlsx)")
    c.add_argument("--force", action="store_true", help="replace an existing output file")
    c.add_argument(
        "--keep-arrays",
        action="store_true",
        help="keep array formulas live too (LibreOffice then recomputes them: #NAME?)",
    )
    c.set_defaults(func=sheets_cmd.run)


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
  143  stopped by SIGTERM (temporary files removed)
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
    parser.add_argument(
        "--version", action="version", version=f"boreflow {calc.__version__}"
    )  # cli: --version
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    _add_rheology(sub)
    _add_report(sub)
    _add_calc(sub)
    _add_batch(sub)
    _add_methods(sub)
    _add_sheets(sub)
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


# ------------------------------------------------------------------ cli: errors in the user's unit
#: ``calc`` options holding a quantity: option -> (attribute, quantity kind).
_QUANTITY_OPTIONS = {
    "--density": ("density", "density"),
    "--tvd": ("tvd", "depth"),
    "--rate": ("rate", "flow_rate"),
    "--hole": ("hole", "diameter"),
    "--pipe": ("pipe", "diameter"),
    "--size": ("size", "diameter"),
}
_NUMBER = r"[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?"
_BOUND = re.compile(rf"^\s*([<>≤≥]=?)\s*({_NUMBER})\s*(\S+)\s*$")
_USER_VALUE = re.compile(rf"^\s*({_NUMBER})\s*(.*?)\s*$")


def _user_unit_error(args, exc: InputError) -> str | None:
    """A ``calc`` input error said with the option and the value as the user typed them, in the
    unit the user gave (their text's unit, else the ``--units`` system's), the bound converted
    to that unit: ``--density = -11 ppg: not allowed; allowed: > 0 ppg (density)``.  None when
    the error is not about one of the options."""
    if getattr(args, "command", None) != "calc" or getattr(args, "quantity", "") == "circulate":
        return None
    if isinstance(exc.value, (str, bool)) or np.ndim(exc.value) != 0:
        return None
    system = args.units
    for option, (attr, kind) in _QUANTITY_OPTIONS.items():
        given = getattr(args, attr, None)
        m = _USER_VALUE.match(str(given)) if given is not None else None
        if not m:
            continue
        unit = m.group(2) or unit_for(kind, system)
        try:
            si = float(to_si(float(m.group(1)), unit, kind, option))
        except (InputError, ValueError):
            continue
        if not np.isclose(si, float(exc.value), rtol=1e-9, atol=1e-12):
            continue
        allowed = exc.allowed
        b = _BOUND.match(exc.allowed)
        if b:
            try:
                bound_si = float(to_si(float(b.group(2)), b.group(3), kind, option))
                allowed = f"{b.group(1)} {float(from_si(bound_si, unit, kind)):.6g} {label(unit)}"
            except (InputError, ValueError):
                pass
        return (
            f"{option} = {m.group(1)} {label(unit)}: {exc.problem}; allowed: {allowed} ({exc.name})"
        )
    return None


# ------------------------------------------------------------------ cli: signals and output
class _Terminated(BaseException):
    """SIGTERM arrived: unwinds like KeyboardInterrupt, so every ``finally`` (the temporary
    file of :func:`addin.safe_io.atomic_write`) runs before the exit code 143."""


def _on_sigterm(signum, frame):
    raise _Terminated


def main(argv=None) -> int:
    """Run the command line; returns the exit code (the table in the module docstring)."""
    previous = None
    if threading.current_thread() is threading.main_thread():
        previous = signal.signal(signal.SIGTERM, _on_sigterm)
    out, err = sys.stdout, sys.stderr
    sys.stdout, sys.stderr = SanitisingStream(out), SanitisingStream(err, keep="\n\t\r")
    try:
        return _main(argv)
    except _Terminated:
        print("boreflow: terminated; nothing half-written was left behind", file=sys.stderr)
        return EXIT_TERMINATED
    finally:
        sys.stdout, sys.stderr = out, err
        if previous is not None:
            signal.signal(signal.SIGTERM, previous)


def _main(argv=None) -> int:
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
        said = _user_unit_error(locals().get("args"), exc) or error_text(exc)
        print(f"boreflow: error: {said}", file=sys.stderr)
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
