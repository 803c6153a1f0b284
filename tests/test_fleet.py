"""Batches on several processes and on a Dask cluster give what a serial batch gives.

The parallel paths must not change a single number or the order of the summary: every check
here compares a parallel run with the serial run of the same cases in the same test (the serial
batch itself is checked elsewhere, tests/test_cli_report.py).  A failed case stays a failed row
whichever executor carried it.  The demo case is invented.
"""

from __future__ import annotations

import csv
import re
import shutil
from concurrent.futures import Future

import numpy as np
import openpyxl
import pytest
from _report_demo import DEMO

from addin import fleet
from addin.case import load_case
from addin.cli import main
from addin.report.compute import report_fluid
from calc.circulation import circulate
from calc.units import to_si

_STAMP = re.compile(r"\d{4}-\d\d-\d\d \d\d:\d\d(:\d\d)? UTC|\d+\.\d+ s\b")


def _cases(folder, n=2, bad=True):
    folder.mkdir()
    for i in range(n):
        shutil.copy(DEMO, folder / f"well{i}.toml")
    if bad:  # a broken case: the batch records it and goes on
        (folder / "zbroken.toml").write_text("[case]\ntitle = 'no well'\n", encoding="utf-8")
    return folder


def _rows(path):
    return [
        {k: v for k, v in r.items() if not k.startswith("seconds")}
        for r in csv.DictReader(path.open())
    ]


def _cells(path):
    """Every cell of a report, the run's time stamps masked (they differ from run to run)."""
    wb = openpyxl.load_workbook(path)
    out = {}
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            for c in row:
                v = c.value
                out[(ws.title, c.coordinate)] = _STAMP.sub("<t>", v) if isinstance(v, str) else v
    return out


def _batch(cases, out, *extra):
    summary = out.parent / f"{out.name}.csv"
    code = main(["batch", str(cases), "-o", str(out), "--summary", str(summary), "-q", *extra])
    return code, summary


def test_jobs_2_writes_the_same_reports_and_summary_as_serial(tmp_path, capsys):
    cases = _cases(tmp_path / "cases")
    c1, s1 = _batch(cases, tmp_path / "serial")
    c2, s2 = _batch(cases, tmp_path / "jobs2", "--jobs", "2")
    assert c1 == c2 == 5  # one broken case in each
    assert _rows(s1) == _rows(s2)
    assert [r["status"] for r in _rows(s2)] == ["ok", "ok", "failed"]
    for name in ("well0-report.xlsx", "well1-report.xlsx"):
        assert _cells(tmp_path / "serial" / name) == _cells(tmp_path / "jobs2" / name)
    assert not (tmp_path / "jobs2" / "zbroken-report.xlsx").exists()


def test_dask_local_cluster_gives_the_serial_rows(tmp_path, capsys):
    pytest.importorskip("distributed")
    cases = _cases(tmp_path / "cases", n=1)
    c1, s1 = _batch(cases, tmp_path / "serial")
    c2, s2 = _batch(cases, tmp_path / "dask", "--scheduler", "local", "--jobs", "2")
    assert c1 == c2 == 5
    assert _rows(s1) == _rows(s2)
    assert _cells(tmp_path / "serial" / "well0-report.xlsx") == _cells(
        tmp_path / "dask" / "well0-report.xlsx"
    )


class _LosingExecutor:
    """An executor whose every run is lost (as when a worker process dies)."""

    def submit(self, fn, *args, **kw):
        f = Future()
        f.set_exception(RuntimeError("worker died"))
        return f


def test_a_run_lost_by_its_executor_is_a_failed_row(tmp_path):
    rows = fleet.run_batch([DEMO], tmp_path, executor=_LosingExecutor())
    assert rows[0]["status"] == "failed" and rows[0]["case"] == DEMO.name
    assert "lost by its worker" in rows[0]["message"] and "worker died" in rows[0]["message"]


def test_sweep_equals_direct_circulation_on_any_executor():
    """One vectorised call per density, the same numbers in and out of a process pool; each
    point equals calc.circulation.circulate for that density (the exact same call)."""
    rates = [to_si(q, "gpm") for q in (400.0, 500.0, 600.0)]
    dens = [to_si(d, "ppg") for d in (11.0, 11.4)]
    serial = fleet.sweep(DEMO, rates=rates, densities=dens)
    with fleet.local_executor(2) as ex:
        pooled = fleet.sweep(DEMO, rates=rates, densities=dens, executor=ex)
    case = load_case(DEMO)
    method = case.hydraulics_method(None)
    for a, b, d in zip(serial, pooled, dens, strict=True):
        assert a.density == b.density == d
        np.testing.assert_array_equal(a.standpipe_pressure, b.standpipe_pressure)
        np.testing.assert_array_equal(a.ecd_bit, b.ecd_bit)
        fluid = report_fluid(case.checks[-1].readings, d, method, case.checks[-1].label)
        res = circulate(case.well(-1), fluid, np.asarray(rates), method=method)
        np.testing.assert_array_equal(a.standpipe_pressure, res.standpipe_pressure)
    # heavier mud: higher ECD at every rate
    assert np.all(serial[1].ecd_bit > serial[0].ecd_bit)


@pytest.mark.parametrize("bad", ["0", "-2", "two", "1000"])
def test_jobs_must_be_a_sensible_whole_number(tmp_path, capsys, bad):
    assert main(["batch", str(DEMO), "-o", str(tmp_path / "o"), "--jobs", bad]) == 2
    err = capsys.readouterr().err
    assert "--jobs" in err and "1 to 256" in err
