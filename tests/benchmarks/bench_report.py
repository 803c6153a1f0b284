"""Benchmark (reported, not asserted): `boreflow report` on the demo case, and a 50-case batch.

Run from the repository root::

    python3 tests/benchmarks/bench_report.py [--cases 50]

Prints the wall time of one report (load + compute + write, split by stage) and of a batch of
N copies of the demo case through `boreflow batch` (one process, sequential).
"""

from __future__ import annotations

import argparse
import shutil
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))


def main(argv=None) -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--cases", type=int, default=50)
    args = ap.parse_args(argv)
    from addin.case import load_case
    from addin.cli import main as cli
    from addin.report import build_report, compute

    demo = ROOT / "workbooks" / "demo-case.toml"
    with tempfile.TemporaryDirectory() as d:
        d = Path(d)
        t0 = time.perf_counter()
        case = load_case(demo)
        t1 = time.perf_counter()
        res = compute(case)
        t2 = time.perf_counter()
        wb = build_report(res)
        t3 = time.perf_counter()
        wb.save(d / "x.xlsx")
        t4 = time.perf_counter()
        print(
            f"one report, in process: load {t1 - t0:.2f} s, compute {t2 - t1:.2f} s, "
            f"build {t3 - t2:.2f} s, save {t4 - t3:.2f} s, total {t4 - t0:.2f} s"
        )
        t = time.perf_counter()
        rc = cli(["report", str(demo), "-o", str(d / "r.xlsx")])
        print(f"boreflow report (warm, in process): {time.perf_counter() - t:.2f} s, exit {rc}")
        cases = d / "cases"
        cases.mkdir()
        for i in range(args.cases):
            shutil.copy(demo, cases / f"case-{i:03d}.toml")
        out = d / "out"
        out.mkdir()
        t = time.perf_counter()
        rc = cli(["batch", str(cases), "-o", str(out), "-q"])
        dt = time.perf_counter() - t
        print(
            f"boreflow batch, {args.cases} cases: {dt:.1f} s ({dt / args.cases:.2f} s/case), "
            f"exit {rc}"
        )
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
