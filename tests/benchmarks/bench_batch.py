"""Benchmark: batch throughput, one process vs ``--jobs N`` vs a local Dask cluster (prints only).

Run:  python3 tests/benchmarks/bench_batch.py [--cases 20] [--jobs 2] [--no-dask]

Writes ``--cases`` copies of the demo case (invented data) to a temporary folder, runs
``boreflow batch`` on them serially, with ``--jobs N`` and (if Dask distributed is installed)
with ``--scheduler local``, in one process run, and prints cases per minute and the speed-up of
each over serial; it also checks that every run's summary rows (without the timing column) are
identical.  Nothing is asserted about time; timings depend on the machine and its load.
"""

from __future__ import annotations

import argparse
import csv
import importlib.util
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "workbooks" / "demo-case.toml"


def _run(cases: Path, out: Path, *extra: str) -> tuple[float, list[dict]]:
    summary = out.parent / f"{out.name}.csv"
    t0 = time.perf_counter()
    subprocess.run(
        [
            *(sys.executable, "-m", "addin.cli", "batch", str(cases), "-o", str(out), "-q"),
            *("--summary", str(summary), *extra),
        ],
        check=True,
        cwd=ROOT,
        stdout=subprocess.DEVNULL,
    )
    dt = time.perf_counter() - t0
    rows = [
        {k: v for k, v in r.items() if not k.startswith("seconds")}
        for r in csv.DictReader(summary.open())
    ]
    return dt, rows


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--cases", type=int, default=20)
    ap.add_argument("--jobs", type=int, default=2)
    ap.add_argument("--no-dask", action="store_true")
    a = ap.parse_args()
    tmp = Path(tempfile.mkdtemp(prefix="bf-bench-batch-"))
    cases = tmp / "cases"
    cases.mkdir()
    for i in range(a.cases):
        shutil.copy(DEMO, cases / f"variant{i:03d}.toml")
    runs = {"serial": ()}
    runs[f"--jobs {a.jobs}"] = ("--jobs", str(a.jobs))
    if not a.no_dask and importlib.util.find_spec("distributed") is not None:
        runs[f"dask local cluster ({a.jobs} workers)"] = (
            "--scheduler",
            "local",
            "--jobs",
            str(a.jobs),
        )
    results = {}
    for name, extra in runs.items():
        results[name] = _run(cases, tmp / name.split()[0].strip("-"), *extra)
    t_serial, rows_serial = results["serial"]
    print(f"{a.cases} demo variants, {a.jobs} workers where parallel")
    print(f"{'run':40s} {'seconds':>8s} {'cases/min':>10s} {'speed-up':>9s}  same rows")
    for name, (dt, rows) in results.items():
        same = "yes" if rows == rows_serial else "NO"
        print(f"{name:40s} {dt:8.1f} {60 * a.cases / dt:10.1f} {t_serial / dt:9.2f}  {same}")
    shutil.rmtree(tmp, ignore_errors=True)


if __name__ == "__main__":
    main()
