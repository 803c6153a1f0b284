"""Atomic, no-clobber writes and formula-safe text (addin.safe_io).

External reference for the text rule: OWASP, "CSV Injection" (formula triggers = + - @, tab, CR).
Fault injection: the write is made to fail or the writing process is killed at each stage; the
previous file must stay byte-for-byte intact.
"""

from __future__ import annotations

import os
import signal
import subprocess
import sys
import textwrap
import time
from pathlib import Path

import openpyxl
import pytest

from addin import safe_io
from addin.safe_io import OutputExistsError, atomic_write, atomic_write_bytes
from addin.xlsx_cells import set_text

ROOT = Path(__file__).resolve().parents[1]


def _leftovers(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if p.name.startswith(safe_io.TEMP_PREFIX))


def test_write_creates_file_and_no_temp(tmp_path):
    target = tmp_path / "r.bin"
    atomic_write_bytes(target, b"new")
    assert target.read_bytes() == b"new"
    assert _leftovers(tmp_path) == []


def test_existing_file_is_not_overwritten_unless_asked(tmp_path):
    target = tmp_path / "r.bin"
    target.write_bytes(b"old")
    with pytest.raises(OutputExistsError, match="already exists"):
        atomic_write_bytes(target, b"new")
    assert target.read_bytes() == b"old"
    atomic_write_bytes(target, b"new", overwrite=True)
    assert target.read_bytes() == b"new"
    assert _leftovers(tmp_path) == []


def test_target_appearing_during_write_is_not_clobbered(tmp_path):
    target = tmp_path / "r.bin"

    def writer(tmp: Path):
        tmp.write_bytes(b"mine")
        target.write_bytes(b"someone else's")  # a concurrent writer wins the race

    with pytest.raises(OutputExistsError):
        atomic_write_bytes(target, writer)
    assert target.read_bytes() == b"someone else's"
    assert _leftovers(tmp_path) == []


@pytest.mark.parametrize("stage", ["writer", "fsync", "replace"])
def test_failure_at_any_stage_keeps_previous_report(tmp_path, monkeypatch, stage):
    target = tmp_path / "r.xlsx"
    target.write_bytes(b"previous report")

    def writer(tmp: Path):
        tmp.write_bytes(b"half")
        if stage == "writer":
            raise OSError("disk full (injected)")

    if stage == "fsync":
        monkeypatch.setattr(os, "fsync", lambda fd: (_ for _ in ()).throw(OSError("injected")))
    if stage == "replace":
        monkeypatch.setattr(os, "replace", lambda a, b: (_ for _ in ()).throw(OSError("injected")))
    with pytest.raises(OSError, match="injected"):
        atomic_write_bytes(target, writer, overwrite=True)
    assert target.read_bytes() == b"previous report"
    assert _leftovers(tmp_path) == []


def test_missing_folder_is_an_error_and_writes_nothing(tmp_path):
    with pytest.raises(FileNotFoundError, match="does not exist"):
        atomic_write_bytes(tmp_path / "nope" / "r.bin", b"x")
    assert list(tmp_path.iterdir()) == []


def test_killed_writer_leaves_previous_report_intact(tmp_path):
    """SIGKILL the writing process while it is half way through; the old file must survive."""
    target = tmp_path / "r.xlsx"
    target.write_bytes(b"previous report")
    flag = tmp_path / "started"
    script = textwrap.dedent(
        f"""
        import sys, time, pathlib
        sys.path.insert(0, {str(ROOT)!r})
        from addin.safe_io import atomic_write
        with atomic_write({str(target)!r}, overwrite=True) as tmp:
            with open(tmp, "wb") as fh:
                fh.write(b"partial" * 1000)
                fh.flush()
                pathlib.Path({str(flag)!r}).write_text("x")
                time.sleep(60)
        """
    )
    proc = subprocess.Popen([sys.executable, "-c", script])
    try:
        for _ in range(200):
            if flag.exists():
                break
            time.sleep(0.05)
        assert flag.exists(), "child never reached the middle of the write"
        proc.send_signal(signal.SIGKILL)
        proc.wait(timeout=10)
    finally:
        if proc.poll() is None:
            proc.kill()
    assert proc.returncode == -signal.SIGKILL
    assert target.read_bytes() == b"previous report"
    # at most a hidden temp file is left, never a partial target
    assert all(n.endswith(".tmp") for n in _leftovers(tmp_path))


def test_context_manager_yields_path_in_same_folder(tmp_path):
    with atomic_write(tmp_path / "x.txt") as tmp:
        assert tmp.parent == tmp_path
        tmp.write_text("ok")
    assert (tmp_path / "x.txt").read_text() == "ok"


@pytest.mark.parametrize(
    "text", ["=1+1", '=HYPERLINK("http://x","y")', "+A1", "-A1", "@SUM(A1)", "=cmd|' /C calc'!A0"]
)
def test_formula_like_text_stays_text_after_save_and_load(tmp_path, text):
    # OWASP CSV Injection: = + - @ start a formula in spreadsheets
    wb = openpyxl.Workbook()
    set_text(wb.active["A1"], text)
    wb.active["A2"] = "=1+1"  # control: a real formula is stored as one
    wb.save(tmp_path / "t.xlsx")
    back = openpyxl.load_workbook(tmp_path / "t.xlsx").active
    assert back["A1"].value == text
    assert back["A1"].data_type == "s"
    assert back["A2"].data_type == "f"


def test_plain_text_is_not_quote_prefixed():
    wb = openpyxl.Workbook()
    set_text(wb.active["A1"], "DEMO-A1")
    assert wb.active["A1"].quotePrefix is False
    set_text(wb.active["A2"], "=x")
    assert wb.active["A2"].quotePrefix is True


def test_csv_safe():
    assert safe_io.csv_safe("-5 ft") == "'-5 ft"
    assert safe_io.csv_safe("well 1") == "well 1"
    assert safe_io.csv_safe(None) == ""
