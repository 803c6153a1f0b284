"""Killing or failing the report write at any point leaves the previous report intact."""

from __future__ import annotations

import signal
import subprocess
import sys
import textwrap
import time

import openpyxl
import pytest
from _report_demo import DEMO, ROOT, demo_results

from addin import safe_io
from addin.report import write_report


def _previous(tmp_path):
    target = tmp_path / "report.xlsx"
    target.write_bytes(b"yesterday's report")
    return target


@pytest.mark.parametrize("when", ["during save", "after save, before rename"])
def test_failed_write_keeps_previous_report(tmp_path, monkeypatch, when):
    target = _previous(tmp_path)
    real_save = openpyxl.Workbook.save

    def failing_save(self, filename):
        if when == "during save":
            with open(filename, "wb") as fh:
                fh.write(b"PK\x03\x04 truncated")
            raise OSError("disk full (injected)")
        real_save(self, filename)

    monkeypatch.setattr(openpyxl.Workbook, "save", failing_save)
    if when != "during save":
        import os

        def no_replace(a, b):
            raise OSError("rename failed (injected)")

        monkeypatch.setattr(os, "replace", no_replace)
    with pytest.raises(OSError, match="injected"):
        write_report(demo_results(), target, overwrite=True)
    assert target.read_bytes() == b"yesterday's report"
    assert [p.name for p in tmp_path.iterdir()] == ["report.xlsx"]


def test_existing_report_is_not_overwritten_without_asking(tmp_path):
    target = _previous(tmp_path)
    with pytest.raises(FileExistsError):
        write_report(demo_results(), target)
    assert target.read_bytes() == b"yesterday's report"


def test_killed_report_process_leaves_previous_report(tmp_path):
    """SIGKILL `boreflow report --force` while it is saving: the old report survives."""
    target = _previous(tmp_path)
    flag = tmp_path / "saving"
    script = textwrap.dedent(f"""
        import sys, time, pathlib, openpyxl
        sys.path.insert(0, {str(ROOT)!r})
        real = openpyxl.Workbook.save
        def slow_save(self, filename):
            real(self, filename)          # the temporary file is complete ...
            pathlib.Path({str(flag)!r}).write_text("x")
            time.sleep(60)                # ... and we are killed before the rename
        openpyxl.Workbook.save = slow_save
        from addin.cli import main
        main(["report", {str(DEMO)!r}, "-o", {str(target)!r}, "--force"])
    """)
    proc = subprocess.Popen([sys.executable, "-c", script])
    try:
        for _ in range(600):
            if flag.exists():
                break
            time.sleep(0.05)
        assert flag.exists(), "the child never reached the save"
        proc.send_signal(signal.SIGKILL)
        proc.wait(timeout=10)
    finally:
        if proc.poll() is None:
            proc.kill()
    assert target.read_bytes() == b"yesterday's report"
    leftovers = [p.name for p in tmp_path.iterdir() if p.name.startswith(safe_io.TEMP_PREFIX)]
    assert all(n.endswith(".tmp") for n in leftovers)  # hidden temp file at most
