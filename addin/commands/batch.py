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

``--jobs N`` runs the cases on N worker processes, ``--scheduler ADDRESS`` (or ``local``) on a
Dask distributed cluster (:mod:`addin.fleet`); the reports and the summary rows are the same as
a serial run's, in the same order.
"""

from __future__ import annotations

import csv
import io
import sys
import time
from contextlib import nullcontext
from pathlib import Path

from addin import fleet
from addin.commands.exit_codes import EXIT_BATCH_FAILED, EXIT_OK, EXIT_WRITE
from addin.commands.report import output_path
from addin.safe_io import OutputExistsError, atomic_write_bytes, csv_safe
from calc.errors import InputError
from calc.hydraulics_method import resolve_method
from calc.units import label, unit_for

__all__ = ["run"]


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


#: The summary columns holding a quantity: column -> quantity kind (its unit goes in the header).
_QUANTITY_COLUMNS = {
    "standpipe_pressure": "pressure",
    "ecd_bit": "density",
    "tightest_margin": "density",
}


def _header(col: str, system: str) -> str:
    """A summary column's header: the quantity's columns carry their unit, ``ecd_bit [ppg]``."""
    kind = _QUANTITY_COLUMNS.get(col)
    return col if kind is None else f"{col} [{label(unit_for(kind, system))}]"


def _executor(args):
    """Where the cases run: this process (``--jobs 1``, the default), worker processes on this
    machine (``--jobs N``) or a Dask cluster (``--scheduler ADDRESS|local``)."""
    jobs = getattr(args, "jobs", 1) or 1
    scheduler = getattr(args, "scheduler", None)
    if scheduler:
        return fleet.dask_executor(scheduler, workers=jobs if jobs > 1 else None)
    if jobs > 1:
        return fleet.local_executor(jobs)
    return nullcontext(None)


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
    tty = sys.stderr.isatty()
    t_all = time.perf_counter()

    def progress(done, name):
        if not args.quiet:
            end = "" if tty else "\n"
            print(_bar(done, len(cases), name), end=end, file=sys.stderr, flush=True)

    with _executor(args) as ex:
        rows = fleet.run_batch(
            cases,
            outdir,
            executor=ex,
            units=system,
            force=args.force,
            method=args.method,
            allow_unusual=getattr(args, "allow_unusual", False),
            progress=progress,
        )
    failed = sum(r["status"] != "ok" for r in rows)
    if not args.quiet:
        print(
            _bar(len(cases), len(cases), f"done in {time.perf_counter() - t_all:.1f} s"),
            file=sys.stderr,
        )
    cols = list(fleet.SUMMARY_COLUMNS)
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
