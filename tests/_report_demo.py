"""Shared demo report for the report tests (built once per session; invented demo data)."""

from __future__ import annotations

from functools import lru_cache
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "workbooks" / "demo-case.toml"


@lru_cache(maxsize=1)
def demo_results():
    from addin.case import load_case
    from addin.report import compute

    return compute(load_case(DEMO), run_time="2026-01-01 06:00:00 UTC")


@lru_cache(maxsize=1)
def demo_report_path() -> Path:
    import tempfile

    from addin.report import write_report

    out = Path(tempfile.mkdtemp(prefix="bf-report-test-")) / "demo-report.xlsx"
    write_report(demo_results(), out)
    return out
