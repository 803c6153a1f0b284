"""``boreflow report CASE``: the daily report workbook of one case (and its results as JSON)."""

from __future__ import annotations

import dataclasses
import sys
import time
from pathlib import Path

from addin.case import load_case
from addin.commands.exit_codes import EXIT_OK
from addin.commands.output import json_text
from addin.guard import accept_unusual
from addin.report import compute, write_report
from addin.report.jsonout import results_data
from addin.safe_io import OutputExistsError
from calc.errors import InputError

__all__ = ["output_path", "run", "run_one"]


def output_path(value: str, option: str = "--output") -> Path:
    """The path of an output option; empty or blank text is an error (never a silent default).

    >>> output_path("out/r.xlsx").as_posix()
    'out/r.xlsx'
    >>> output_path("  ")
    Traceback (most recent call last):
    calc.errors.InputError: --output = '  ': empty; allowed: a file or folder name
    """
    if not value.strip() or "\0" in value:
        raise InputError(option, value, "a file or folder name", problem="empty")
    return Path(value)


def run_one(
    case_path, out_path, *, force=False, method=None, constants=None, allow_unusual=False,
    joint_losses=None, shear_rate_correction=None,
):  # fmt: skip
    """Load, compute and write one report; returns (results, seconds).

    ``method``/``constants``/``shear_rate_correction`` override the case's ``[case]`` keys; a
    case with unusual values is refused unless ``allow_unusual`` (addin/guard.py)."""
    t0 = time.perf_counter()
    out = Path(out_path)
    if out.exists() and not force:  # refuse before any work, and write nothing
        raise OutputExistsError(out)
    if not out.parent.is_dir():
        raise FileNotFoundError(f"{out.parent}: output folder does not exist")
    case = accept_unusual(load_case(case_path), allow_unusual, _warn)
    if joint_losses is not None:  # --joint-losses overrides [case].joint_losses
        case = dataclasses.replace(case, header={**case.header, "joint_losses": joint_losses})
    case = case.with_shear_rate_correction(shear_rate_correction)
    results = compute(case, method=case.hydraulics_method(method, constants))
    write_report(results, out, overwrite=force)
    return results, time.perf_counter() - t0


def _warn(line: str) -> None:
    print(line, file=sys.stderr)


def run(args) -> int:
    """Write the report of ``args.case``; print its path, or every result as JSON."""
    out = (
        output_path(args.output)
        if args.output is not None
        else Path(Path(args.case).stem + "-report.xlsx")
    )
    results, dt = run_one(
        args.case,
        out,
        force=args.force,
        method=args.method,
        constants=args.constants,
        allow_unusual=getattr(args, "allow_unusual", False),
        joint_losses=getattr(args, "joint_losses", None),
        shear_rate_correction=getattr(args, "shear_rate_correction", None),
    )
    if args.json:
        print(json_text(results_data(results)))
    else:
        print(
            f"{out}  ({results.case.source}, {len(results.case.checks)} checks, "
            f"{dt:.1f} s; inputs {results.case.hash[:12]})"
        )
    return EXIT_OK
