"""Many cases at once: the batch of daily reports and scenario sweeps, on any executor.

A rig fleet's daily reports, or a sweep of scenarios for a well plan, are independent runs. This
module runs them through a :class:`concurrent.futures.Executor`-style object (anything with
``submit(fn, *args) -> future``), so the same code runs

* in this process (``executor=None``: one case after another, as before),
* on the local cores (:func:`local_executor`, worker processes), or
* on a Dask distributed cluster (:func:`dask_executor`: a running scheduler's address, or
  ``"local"`` for a cluster on this machine; needs ``pip install "boreflow[fleet]"``).

No scheduler of our own: the executor decides where each run goes; this module only submits
the runs and collects their results *in submission order*, so a parallel batch writes the same
reports and the same summary rows as a serial one.

Python API::

    from addin.fleet import run_batch, sweep, local_executor
    with local_executor(2) as ex:
        rows = run_batch(["a.toml", "b.toml"], "reports/", executor=ex)
    table = sweep("workbooks/demo-case.toml", rates=[400, 450, 500], densities=[11.0, 11.2])

Every run's failure is caught *inside* the run (:func:`case_row` never raises), so one bad case
never stops the others, whichever executor carries them; a worker that dies is recorded as that
case's failure.
"""

from __future__ import annotations

import math
import os
import traceback
from collections.abc import Callable, Iterable, Sequence
from concurrent.futures import Executor, Future, ProcessPoolExecutor, as_completed
from contextlib import contextmanager
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from addin import text
from addin.case import load_case
from addin.commands.output import error_text
from addin.commands.report import run_one
from addin.report.compute import report_fluid, scalar
from calc.circulation import circulate
from calc.errors import InputError

__all__ = [
    "SUMMARY_COLUMNS",
    "SweepPoint",
    "case_row",
    "dask_executor",
    "local_executor",
    "run_batch",
    "sweep",
]

#: Hole-cleaning verdicts, worst first: the summary shows a case's worst interval.
_VERDICT_ORDER = ("poor", "marginal", "adequate")

#: The summary columns, in order (the batch command prints and writes these).
SUMMARY_COLUMNS = (
    "case",
    "status",
    "standpipe_pressure",
    "ecd_bit",
    "tightest_margin",
    "cleaning",
    "case_units",
    "seconds",
    "message",
)


def _four_digits(v: float) -> str:
    """At least four significant digits, no exponent: 2952 psi, 203.6 bar, 20355472 Pa.

    >>> _four_digits(2951.8), _four_digits(203.56), _four_digits(2.0355e7)
    ('2952', '203.6', '20355000')
    """
    if not math.isfinite(v) or v == 0:
        return f"{v:.0f}"
    return f"{v:.{max(0, 3 - math.floor(math.log10(abs(v))))}f}"


def _display(value, kind: str, system: str) -> float:
    """An SI result as a number in ``system``'s unit for ``kind`` (for the summary table)."""
    return text.display_number(scalar(value), kind, system)


def summary_cells(results, s: str) -> dict[str, str]:
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


def failure_text(exc: BaseException) -> str:
    """A failed case's message: input and write errors as such, anything else as a bug."""
    if isinstance(exc, InputError):
        return error_text(exc)
    if isinstance(exc, OSError):
        return f"cannot write: {exc}"
    where = traceback.extract_tb(exc.__traceback__)[-1:] if exc.__traceback__ else []
    at = f" at {Path(where[0].filename).name}:{where[0].lineno}" if where else ""
    return f"internal error{at}: {type(exc).__name__}: {exc} (please report it with the case)"


def failed_row(case_name: str, message: str) -> dict[str, str]:
    """The summary row of a case that did not produce a report."""
    row = dict.fromkeys(SUMMARY_COLUMNS, "")
    row.update(case=case_name, status="failed", report="", message=message)
    return row


def case_row(
    case_path,
    out_path,
    *,
    units: str = "oilfield",
    force: bool = False,
    method: str | None = None,
    allow_unusual: bool = False,
) -> dict[str, str]:
    """Write one case's report and return its summary row; never raises (a failure is a row).

    A module-level function of plain arguments, so any executor can pickle it to a worker.
    """
    c, out = Path(case_path), Path(out_path)
    try:
        res, dt = run_one(c, out, force=force, method=method, allow_unusual=allow_unusual)
    except Exception as exc:  # every failure is recorded and the batch goes on
        return failed_row(c.name, failure_text(exc))
    return {
        "case": c.name,
        "status": "ok",
        "report": out.name,
        "seconds": f"{dt:.2f}",
        **summary_cells(res, units),
        "message": "",
    }


def _collect(futures: Sequence[Future], names: Sequence[str], progress) -> list:
    """Results in submission order; a future that raised (a dead worker, a lost connection)
    becomes that case's failed row.  ``progress(done, name)`` after each completion."""
    index = {id(f): i for i, f in enumerate(futures)}
    out: list = [None] * len(futures)
    for done, f in enumerate(as_completed(futures), start=1):
        i = index[id(f)]
        try:
            out[i] = f.result()
        except Exception as exc:  # the executor lost the run: record it, go on
            out[i] = failed_row(names[i], f"the run was lost by its worker: {failure_text(exc)}")
        if progress is not None:
            progress(done, names[i])
    return out


def run_batch(
    cases: Iterable,
    outdir,
    *,
    executor: Executor | None = None,
    units: str = "oilfield",
    force: bool = False,
    method: str | None = None,
    allow_unusual: bool = False,
    progress: Callable[[int, str], None] | None = None,
) -> list[dict[str, str]]:
    """A report ``CASE-report.xlsx`` in ``outdir`` for every case; their summary rows, in order.

    ``executor``: None runs the cases one after another in this process; otherwise each case
    is submitted with ``executor.submit`` (e.g. :func:`local_executor`, :func:`dask_executor`,
    or any :class:`concurrent.futures.Executor`).  The rows do not depend on the executor.
    """
    paths = [Path(c) for c in cases]
    outdir = Path(outdir)
    kw = {"units": units, "force": force, "method": method, "allow_unusual": allow_unusual}
    outs = [outdir / f"{p.stem}-report.xlsx" for p in paths]
    if executor is None:
        rows = []
        for i, (p, o) in enumerate(zip(paths, outs, strict=True)):
            rows.append(case_row(p, o, **kw))
            if progress is not None:
                progress(i + 1, p.name)
        return rows
    futures = [
        executor.submit(case_row, str(p), str(o), **kw) for p, o in zip(paths, outs, strict=True)
    ]
    return _collect(futures, [p.name for p in paths], progress)


@contextmanager
def local_executor(jobs: int | None = None):
    """Worker processes on this machine (``jobs`` None → one per core); closed on exit."""
    jobs = jobs or os.cpu_count() or 1
    with ProcessPoolExecutor(max_workers=jobs) as ex:
        yield ex


@contextmanager
def dask_executor(address: str = "local", *, workers: int | None = None):
    """A :class:`concurrent.futures.Executor` backed by Dask's distributed scheduler.

    ``address``: a running scheduler (``"tcp://host:8786"``), or ``"local"`` for a cluster of
    ``workers`` processes (default one per core, one thread each) on this machine, shut down on
    exit.  Needs the optional extra: ``pip install "boreflow[fleet]"`` (``dask[distributed]``).
    """
    try:
        # lazy: optional dependency (the fleet extra), heavy to import
        from distributed import Client, LocalCluster
    except ImportError as exc:
        raise InputError(
            "--scheduler",
            address,
            'an installed Dask distributed (pip install "boreflow[fleet]")',
            problem="needs the optional fleet extra",
        ) from exc
    if address == "local":
        n = workers or os.cpu_count() or 1
        with (
            LocalCluster(
                n_workers=n, threads_per_worker=1, processes=True, dashboard_address=None
            ) as cluster,
            Client(cluster) as client,
        ):
            yield client.get_executor()
    else:
        with Client(address) as client:
            yield client.get_executor()


@dataclass(frozen=True)
class SweepPoint:
    """One density of a sweep: SI arrays over the swept rates (Pa, kg/m³)."""

    density: float
    rates: np.ndarray
    standpipe_pressure: np.ndarray
    ecd_bit: np.ndarray
    annulus_loss: np.ndarray


def _sweep_density(case_path: str, density: float, rates: tuple[float, ...]) -> SweepPoint:
    """One density's run over every rate (the circulation is vectorised over rates)."""
    case = load_case(case_path)
    method = case.hydraulics_method(None)
    fluid = report_fluid(case.checks[-1].readings, density, method, case.checks[-1].label)
    q = np.asarray(rates, dtype=float)
    res = circulate(case.well(-1), fluid, q, method=method)
    return SweepPoint(
        density=density,
        rates=q,
        standpipe_pressure=np.asarray(res.standpipe_pressure, dtype=float),
        ecd_bit=np.asarray(res.ecd_bit, dtype=float),
        annulus_loss=np.asarray(res.annulus.total, dtype=float),
    )


def sweep(
    case_path,
    *,
    rates: Sequence[float],
    densities: Sequence[float] | None = None,
    executor: Executor | None = None,
) -> list[SweepPoint]:
    """Standpipe pressure, ECD at the bit and annular loss of a case over rates × densities.

    ``rates`` [m³/s] and ``densities`` [kg/m³] are SI (convert with :func:`calc.units.to_si`);
    densities default to the latest check's.  The latest mud check's rheology and the case's
    well and method are used.  One task per density (all rates in one vectorised call), run on
    ``executor`` if given; the points come back in the order of ``densities``.
    """
    case_path = str(case_path)
    if densities is None:
        densities = [load_case(case_path).check_value(-1, "density")]
    rates = tuple(float(r) for r in rates)
    if not rates:
        raise InputError("rates", "[]", "one or more flow rates")
    if executor is None:
        return [_sweep_density(case_path, float(d), rates) for d in densities]
    futures = [executor.submit(_sweep_density, case_path, float(d), rates) for d in densities]
    return [f.result() for f in futures]
