"""``boreflow batch PATH...``: a report for every case, a progress bar and a summary table.

The summary's numbers (standpipe pressure, ECD at the bit, tightest margin, cleaning verdict)
are taken from each run's computed results and converted here, at the edge, to the batch's one
unit system (``--units``, default oilfield) whatever each case's own units: every column holds
one unit, named in its header (``standpipe_pressure [psi]``).

A case that fails, for any reason (bad input, a write error, or an unexpected exception, which
is a bug), is recorded in its row with its message and the batch goes on with the next case;
the exit code is then 5 and the summary is still printed and written.  An existing ``--summary``
file follows the reports' rule: without ``--force`` it is refused *before any case is run*
(exit 3, nothing written), with ``--force`` it is replaced.
"""

from __future__ import annotations

import csv
import io
import math
import sys
import time
import traceback
from pathlib import Path

from addin import text
from addin.commands.exit_codes import EXIT_BATCH_FAILED, EXIT_OK, EXIT_WRITE
from addin.commands.output import error_text
from addin.commands.report import output_path, run_one
from addin.report.compute import scalar
from addin.safe_io import OutputExistsError, atomic_write_bytes, csv_safe
from calc.errors import InputError
from calc.hydraulics_method import resolve_method
from calc.units import label, unit_for

__all__ = ["run"]

#: Hole-cleaning verdicts, worst first: the summary shows a case's worst interval.
_VERDICT_ORDER = ("poor", "marginal", "adequate")


def _expand(paths) -> list[Path]:
    out: list[Path] = []
    for p in paths:
        if p.startswith("@"):
            lst = Path(p[1:])
            try:
                lines = lst.read_text(encoding="utf-8").splitlines()
            except (OSError, UnicodeDecodeError) as exc:  # an input that cannot be read: exit 2
                raise InputError(
                    "batch list file",
                    p,
                    "a readable UTF-8 text file, one case path per line",
                    problem=getattr(exc, "strerror", None) or "cannot be read",
                ) from exc
            out.extend(
                _expand(
                    [ln.strip() for ln in lines if ln.strip() and not ln.lstrip().startswith("#")]
                )
            )
            continue
        path = Path(p)
        if path.is_dir():
            out.extend(
                sorted(
                    q
                    for q in path.iterdir()
                    if q.suffix.lower() in (".toml", ".xlsx") and not q.name.startswith((".", "~"))
                )
            )
        else:
            out.append(path)
    return out


def _bar(i, n, name, width=28):
    done = int(width * i / n) if n else width
    return f"\r[{'#' * done}{'.' * (width - done)}] {i}/{n} {name[:40]:40s}"


def _display(value, kind: str, system: str) -> float:
    """An SI result as a number in ``system``'s unit for ``kind`` (for the summary table)."""
    return text.display_number(scalar(value), kind, system)


#: The summary columns holding a quantity: column -> quantity kind (its unit goes in the header).
_QUANTITY_COLUMNS = {
    "standpipe_pressure": "pressure",
    "ecd_bit": "density",
    "tightest_margin": "density",
}


def _four_digits(v: float) -> str:
    """At least four significant digits, no exponent: 2952 psi, 203.6 bar, 20355472 Pa.

    >>> _four_digits(2951.8), _four_digits(203.56), _four_digits(2.0355e7)
    ('2952', '203.6', '20355000')
    """
    if not math.isfinite(v) or v == 0:
        return f"{v:.0f}"
    return f"{v:.{max(0, 3 - math.floor(math.log10(abs(v))))}f}"


def _header(col: str, system: str) -> str:
    """A summary column's header: the quantity's columns carry their unit, ``ecd_bit [ppg]``."""
    kind = _QUANTITY_COLUMNS.get(col)
    return col if kind is None else f"{col} [{label(unit_for(kind, system))}]"


def _summary(results, s: str) -> dict[str, str]:
    """The summary-table cells of one run, from its computed results, in unit system ``s``."""
    circ = results.circulation
    tight = None if circ.margins is None else circ.margins.tightest
    return {
        "standpipe_pressure": _four_digits(_display(circ.standpipe_pressure, "pressure", s)),
        "ecd_bit": f"{_display(circ.ecd_bit, 'density', s):.3f}",
        "tightest_margin": ""
        if tight is None
        else f"{_display(tight.margin, 'density', s):.3f} ({text.check_point(tight.point, s)})",
        "cleaning": ""
        if not results.cleaning
        else min((r["verdict"] for r in results.cleaning.result.table()), key=_VERDICT_ORDER.index),
        "case_units": results.case.unit_system,
    }


def _failure(exc: BaseException) -> str:
    """A failed case's message: input and write errors as such, anything else as a bug."""
    if isinstance(exc, InputError):
        return error_text(exc)
    if isinstance(exc, OSError):
        return f"cannot write: {exc}"
    where = traceback.extract_tb(exc.__traceback__)[-1:] if exc.__traceback__ else []
    at = f" at {Path(where[0].filename).name}:{where[0].lineno}" if where else ""
    return f"internal error{at}: {type(exc).__name__}: {exc} (please report it with the case)"


def run(args) -> int:
    """Write a report for every case of ``args.paths``; print (and save) the summary table."""
    cases = _expand(args.paths)
    if not cases:
        raise InputError("batch paths", " ".join(args.paths), "case files, folders or @list")
    outdir = output_path(args.output, "--output")
    if outdir.exists() and not outdir.is_dir():
        raise InputError("--output", str(outdir), "a folder", problem="is a file")
    summary = output_path(args.summary, "--summary") if args.summary is not None else None
    if summary is not None and summary.exists() and not args.force:
        raise OutputExistsError(summary)  # before any case runs: exit 3, nothing written
    system = args.units
    if args.method is not None:
        resolve_method(args.method)  # an unknown name is bad input for the whole batch (exit 2)
    names = [c.stem for c in cases]
    dupes = {n for n in names if names.count(n) > 1}
    if dupes:
        raise InputError(
            "batch cases",
            ", ".join(sorted(dupes)),
            "distinct file names (reports are named after the case)",
        )
    outdir.mkdir(parents=True, exist_ok=True)  # a failure here is a write error: exit 4
    rows, failed = [], 0
    tty = sys.stderr.isatty()
    t_all = time.perf_counter()
    for i, c in enumerate(cases):
        if not args.quiet:
            print(_bar(i, len(cases), c.name), end="" if tty else "\n", file=sys.stderr, flush=True)
        out = outdir / f"{c.stem}-report.xlsx"
        try:
            res, dt = run_one(
                c,
                out,
                force=args.force,
                method=args.method,
                allow_unusual=getattr(args, "allow_unusual", False),
            )
            rows.append(
                {
                    "case": c.name,
                    "status": "ok",
                    "report": out.name,
                    "seconds": f"{dt:.2f}",
                    **_summary(res, system),
                    "message": "",
                }
            )
        except Exception as exc:  # every failure is recorded and the batch goes on
            failed += 1
            rows.append(
                {
                    "case": c.name,
                    "status": "failed",
                    "report": "",
                    "seconds": "",
                    "standpipe_pressure": "",
                    "ecd_bit": "",
                    "tightest_margin": "",
                    "cleaning": "",
                    "case_units": "",
                    "message": _failure(exc),
                }
            )
    if not args.quiet:
        print(
            _bar(len(cases), len(cases), f"done in {time.perf_counter() - t_all:.1f} s"),
            file=sys.stderr,
        )
    cols = [
        "case",
        "status",
        "standpipe_pressure",
        "ecd_bit",
        "tightest_margin",
        "cleaning",
        "case_units",
        "seconds",
        "message",
    ]
    heads = {k: _header(k, system) for k in cols}
    widths = {k: max(len(heads[k]), *(len(str(r[k])) for r in rows)) for k in cols[:-1]}
    print("  ".join(heads[k].ljust(widths[k]) for k in cols[:-1]) + "  message")
    for r in rows:
        print("  ".join(str(r[k]).ljust(widths[k]) for k in cols[:-1]) + "  " + r["message"])
    print(f"{len(rows) - failed} of {len(rows)} reports written to {outdir} (units: {system})")
    if summary is not None:
        buf = io.StringIO()
        w = csv.writer(buf)
        w.writerow([heads[k] for k in cols] + ["report"])
        for r in rows:
            w.writerow([csv_safe(r[k]) for k in [*cols, "report"]])
        try:
            atomic_write_bytes(summary, buf.getvalue().encode("utf-8"), overwrite=args.force)
        except OSError as exc:  # the failures above still decide the exit code
            print(f"boreflow: error: summary not written: {exc}", file=sys.stderr)
            return EXIT_BATCH_FAILED if failed else EXIT_WRITE
    return EXIT_BATCH_FAILED if failed else EXIT_OK
