"""``boreflow batch PATH...``: a report for every case, a progress bar and a summary table.

The summary's numbers (standpipe pressure, ECD at the bit, tightest margin, cleaning verdict)
are taken from each run's computed results and converted to the case's units here, at the edge.
"""

from __future__ import annotations

import csv
import io
import sys
import time
from pathlib import Path

from addin import text
from addin.commands.exit_codes import EXIT_BATCH_FAILED, EXIT_OK
from addin.commands.output import error_text
from addin.commands.report import run_one
from addin.report.compute import scalar
from addin.safe_io import atomic_write_bytes, csv_safe
from calc.errors import InputError

__all__ = ["run"]

#: Hole-cleaning verdicts, worst first: the summary shows a case's worst interval.
_VERDICT_ORDER = ("poor", "marginal", "adequate")


def _expand(paths) -> list[Path]:
    out: list[Path] = []
    for p in paths:
        if p.startswith("@"):
            lst = Path(p[1:])
            lines = lst.read_text(encoding="utf-8").splitlines()
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


def _summary(results) -> dict[str, str]:
    """The summary-table cells of one run, from its computed results, in the case's units."""
    s = results.case.unit_system
    circ = results.circulation
    tight = None if circ.margins is None else circ.margins.tightest
    return {
        "standpipe_pressure": f"{_display(circ.standpipe_pressure, 'pressure', s):.0f}",
        "ecd_bit": f"{_display(circ.ecd_bit, 'density', s):.3f}",
        "tightest_margin": ""
        if tight is None
        else f"{_display(tight.margin, 'density', s):.3f} ({text.check_point(tight.point, s)})",
        "cleaning": ""
        if not results.cleaning
        else min((r["verdict"] for r in results.cleaning.result.table()), key=_VERDICT_ORDER.index),
        "units": s,
    }


def run(args) -> int:
    """Write a report for every case of ``args.paths``; print (and save) the summary table."""
    cases = _expand(args.paths)
    if not cases:
        raise InputError("batch paths", " ".join(args.paths), "case files, folders or @list")
    outdir = Path(args.output)
    if not outdir.is_dir():
        raise InputError("--output", str(outdir), "an existing folder")
    names = [c.stem for c in cases]
    dupes = {n for n in names if names.count(n) > 1}
    if dupes:
        raise InputError(
            "batch cases",
            ", ".join(sorted(dupes)),
            "distinct file names (reports are named after the case)",
        )
    rows, failed = [], 0
    tty = sys.stderr.isatty()
    t_all = time.perf_counter()
    for i, c in enumerate(cases):
        if not args.quiet:
            print(_bar(i, len(cases), c.name), end="" if tty else "\n", file=sys.stderr, flush=True)
        out = outdir / f"{c.stem}-report.xlsx"
        try:
            res, dt = run_one(
                c, out, force=args.force, allow_unusual=getattr(args, "allow_unusual", False)
            )
            rows.append(
                {
                    "case": c.name,
                    "status": "ok",
                    "report": out.name,
                    "seconds": f"{dt:.2f}",
                    **_summary(res),
                    "message": "",
                }
            )
        except (InputError, OSError) as exc:
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
                    "units": "",
                    "message": error_text(exc) if isinstance(exc, InputError) else str(exc),
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
        "units",
        "seconds",
        "message",
    ]
    widths = {k: max(len(k), *(len(str(r[k])) for r in rows)) for k in cols[:-1]}
    print("  ".join(k.ljust(widths[k]) for k in cols[:-1]) + "  message")
    for r in rows:
        print("  ".join(str(r[k]).ljust(widths[k]) for k in cols[:-1]) + "  " + r["message"])
    print(f"{len(rows) - failed} of {len(rows)} reports written to {outdir}")
    if args.summary:
        buf = io.StringIO()
        w = csv.writer(buf)
        w.writerow([*cols, "report"])
        for r in rows:
            w.writerow([csv_safe(r[k]) for k in [*cols, "report"]])
        atomic_write_bytes(args.summary, buf.getvalue().encode("utf-8"), overwrite=args.force)
    return EXIT_BATCH_FAILED if failed else EXIT_OK
