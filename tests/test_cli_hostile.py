"""The command line under hostile or careless use: version, permissions, folders, failures in
a batch, empty or odd inputs, signals, full disks, unbounded reads, terminal escapes.

External references: POSIX ``umask``/``open`` (a new file gets mode 0o666 & ~umask); the shell
convention exit status = 128 + signal number (SIGTERM 15 -> 143); ECMA-48 (control functions
start with ESC, 0x1b); XML 1.0 §2.2 (control characters a workbook cell cannot store); the
TOML 1.0 specification (a file is UTF-8; arrays may nest); the Unicode standard (U+FEFF byte-order
mark, allowed at the start of a UTF-8 file).
"""

from __future__ import annotations

import csv
import errno
import os
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest
from _report_demo import DEMO, ROOT

import calc
from addin import fleet, safe_io
from addin.cli import main


def run(*args):
    return main([str(a) for a in args])


def _env():
    return {**os.environ, "PYTHONPATH": str(ROOT)}


# ------------------------------------------------------------------ item 1
def test_version_prints_the_package_version():
    proc = subprocess.run(
        [sys.executable, "-m", "addin.cli", "--version"],
        capture_output=True,
        text=True,
        env=_env(),
        cwd=ROOT,
    )
    assert proc.returncode == 0
    assert proc.stdout.strip() == f"boreflow {calc.__version__}"


@pytest.mark.parametrize("mask, mode", [(0o022, 0o644), (0o077, 0o600), (0o002, 0o664)])
def test_written_file_takes_its_mode_from_the_umask(tmp_path, mask, mode):
    old = os.umask(mask)
    try:
        safe_io.atomic_write_bytes(tmp_path / "r.bin", b"x")
    finally:
        os.umask(old)
    assert (tmp_path / "r.bin").stat().st_mode & 0o777 == mode


def test_report_under_umask_022_is_0644(tmp_path, capsys):
    old = os.umask(0o022)
    try:
        assert run("report", DEMO, "-o", tmp_path / "r.xlsx") == 0
    finally:
        os.umask(old)
    assert (tmp_path / "r.xlsx").stat().st_mode & 0o777 == 0o644


def test_batch_creates_its_output_folder(tmp_path, capsys):
    out = tmp_path / "new" / "folder"
    assert run("batch", DEMO, "-o", out, "-q") == 0
    assert (out / "demo-case-report.xlsx").is_file()


def test_batch_goes_on_after_an_unexpected_exception(tmp_path, capsys, monkeypatch):
    cases = tmp_path / "cases"
    cases.mkdir()
    for name in ("a", "b", "c"):
        shutil.copy(DEMO, cases / f"{name}.toml")
    real = fleet.run_one

    def flaky(case, out, **kw):
        if Path(case).stem == "b":
            raise TypeError("simulated bug")
        return real(case, out, **kw)

    monkeypatch.setattr(fleet, "run_one", flaky)
    summary = tmp_path / "s.csv"
    assert run("batch", cases, "-o", tmp_path / "out", "--summary", summary, "-q") == 5
    rows = {r["case"]: r for r in csv.DictReader(summary.open())}
    assert {k: r["status"] for k, r in rows.items()} == {
        "a.toml": "ok",
        "b.toml": "failed",
        "c.toml": "ok",
    }
    assert "internal error" in rows["b.toml"]["message"]
    assert "TypeError: simulated bug" in rows["b.toml"]["message"]
    assert (tmp_path / "out" / "c-report.xlsx").is_file()  # the case after the bug still ran
    assert "2 of 3 reports written" in capsys.readouterr().out


def test_batch_missing_list_file_is_bad_input(tmp_path, capsys):
    assert run("batch", f"@{tmp_path / 'missing.txt'}", "-o", tmp_path / "o") == 2
    err = capsys.readouterr().err
    assert "missing.txt" in err and "Traceback" not in err


def test_existing_summary_is_refused_before_any_case_runs(tmp_path, capsys):
    """--force semantics: an existing --summary is refused up front (exit 3, nothing written),
    so a later failure can never be hidden behind it; with --force it is replaced and the
    failures still give exit 5."""
    cases = tmp_path / "cases"
    cases.mkdir()
    shutil.copy(DEMO, cases / "good.toml")
    (cases / "broken.toml").write_text("[case\n")
    summary = tmp_path / "s.csv"
    summary.write_text("old")
    assert run("batch", cases, "-o", tmp_path / "out", "--summary", summary, "-q") == 3
    assert summary.read_text() == "old"
    assert not (tmp_path / "out").exists()
    code = run("batch", cases, "-o", tmp_path / "out", "--summary", summary, "-q", "--force")
    assert code == 5
    assert "broken.toml" in summary.read_text()


def test_rheology_of_an_empty_file_is_bad_input(tmp_path, capsys):
    empty = tmp_path / "empty.toml"
    empty.write_text("")
    assert run("rheology", empty) == 2
    assert "empty.toml" in capsys.readouterr().err


@pytest.mark.parametrize("cmd", ["report", "batch"])
def test_empty_output_option_is_an_error(tmp_path, capsys, cmd, monkeypatch):
    monkeypatch.chdir(tmp_path)
    assert run(cmd, DEMO, "-o", "") == 2
    assert "--output" in capsys.readouterr().err
    assert list(tmp_path.iterdir()) == []


def test_terminal_escape_codes_are_not_printed_raw(capsys):
    from addin.commands.output import SanitisingStream, printable

    assert printable("a\x1b[2Jb\x07\n") == "a\\x1b[2Jb\\x07\n"
    assert "\x1b" not in printable("".join(map(chr, range(0x20))))

    class Sink:
        text = ""

        def write(self, s):
            Sink.text += s

    SanitisingStream(Sink()).write("title \x1b]0;pwned\x07 ok\n")
    assert Sink.text == "title \\x1b]0;pwned\\x07 ok\n"


def test_escape_codes_in_a_workbook_label_do_not_reach_the_terminal(tmp_path, capfd):
    """The CLI's own text output goes through the sanitiser: an error naming a file whose
    name holds ESC shows it as text."""
    bad = tmp_path / "x\x1b[31m.toml"
    bad.write_text("[case\n")
    assert run("rheology", bad) == 2
    err = capfd.readouterr().err
    assert "\x1b" not in err and "\\x1b[31m" in err


# ------------------------------------------------------------------ item 2
def test_stale_temp_files_of_our_own_are_removed_on_the_next_write(tmp_path):
    old = tmp_path / ".~boreflow-dead.tmp"
    old.write_bytes(b"half")
    os.utime(old, (time.time() - 3600, time.time() - 3600))
    fresh = tmp_path / ".~boreflow-live.tmp"  # a write in progress elsewhere: kept
    fresh.write_bytes(b"busy")
    other = tmp_path / "notes.tmp"
    other.write_bytes(b"mine")
    os.utime(other, (0, 0))
    safe_io.atomic_write_bytes(tmp_path / "r.bin", b"x")
    assert sorted(p.name for p in tmp_path.iterdir()) == [
        ".~boreflow-live.tmp",
        "notes.tmp",
        "r.bin",
    ]


def test_sigterm_during_a_write_cleans_up_and_exits_143(tmp_path):
    script = f"""
import sys, time
sys.path.insert(0, {str(ROOT)!r})
from addin import cli
from addin.commands import report
def slow(results, out, overwrite=False):
    from addin.safe_io import atomic_write
    with atomic_write(out, overwrite=overwrite) as tmp:
        tmp.write_bytes(b"partial")
        print("writing", flush=True)
        time.sleep(30)
report.write_report = slow
sys.exit(cli.main(["report", {str(DEMO)!r}, "-o", {str(tmp_path / "r.xlsx")!r}]))
"""
    proc = subprocess.Popen(
        [sys.executable, "-c", script], stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True
    )
    assert proc.stdout.readline().strip() == "writing"
    proc.send_signal(signal.SIGTERM)
    _, err = proc.communicate(timeout=30)
    assert proc.returncode == 143
    assert "terminated" in err and "Traceback" not in err
    assert list(tmp_path.iterdir()) == []  # neither the report nor the temporary file


def test_full_disk_is_exit_4_with_a_message(tmp_path, capsys, monkeypatch):
    from addin.commands import report

    def full(results, out, overwrite=False):
        def writer(tmp):
            raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC), str(tmp))

        safe_io.atomic_write_bytes(out, writer, overwrite=overwrite)

    monkeypatch.setattr(report, "write_report", full)
    assert run("report", DEMO, "-o", tmp_path / "r.xlsx") == 4
    err = capsys.readouterr().err
    assert "No space left on device" in err and "Traceback" not in err
    assert list(tmp_path.iterdir()) == []


def test_report_of_an_endless_device_reads_a_bounded_amount(tmp_path, capsys):
    if not Path("/dev/zero").exists():
        pytest.skip("no /dev/zero")
    assert run("report", "/dev/zero", "-o", tmp_path / "r.xlsx") == 2  # returns: bounded read
    assert "at most 5 MiB" in capsys.readouterr().err


# ------------------------------------------------------------------ item 3
def _demo_text() -> str:
    return DEMO.read_text(encoding="utf-8")


def test_utf8_byte_order_mark_is_accepted(tmp_path, capsys):
    case = tmp_path / "bom.toml"
    case.write_bytes(b"\xef\xbb\xbf" + DEMO.read_bytes())
    assert run("rheology", case) == 0


@pytest.mark.parametrize(
    "content, needles",
    [
        (b'[case]\ntitle = "caf\xe9"\n', ("bad.toml", "not UTF-8", "line 2")),
        (b"a = " + b"[" * 5000 + b"]" * 5000 + b"\n", ("bad.toml", "valid TOML")),
        (b'[case]\ntitle = "x\\u001b[31m"\n', ("bad.toml", "case.title", "U+001B")),
    ],
    ids=["latin-1", "nested-5000", "control-char"],
)
def test_unreadable_text_is_bad_input_naming_file_and_key(tmp_path, capsys, content, needles):
    case = tmp_path / "bad.toml"
    case.write_bytes(content)
    assert run("report", case, "-o", tmp_path / "r.xlsx") == 2
    err = capsys.readouterr().err
    assert all(n in err for n in needles), err
    assert not (tmp_path / "r.xlsx").exists()


def test_empty_pressure_window_lists_are_bad_input(tmp_path, capsys):
    text = _demo_text()
    start = text.index("[pressure_window]")
    end = text.index("[[weak_point]]")
    case = tmp_path / "pw.toml"
    case.write_text(
        text[:start] + "[pressure_window]\ntvd = []\npore = []\nfracture = []\n\n" + text[end:]
    )
    assert run("report", case, "-o", tmp_path / "r.xlsx") == 2
    assert "pressure_window.tvd" in capsys.readouterr().err


def test_hydrostatic_at_zero_depth_is_zero(capsys):
    """p = ρ·g·TVD is 0 at TVD 0 (exact); the gradient ρ·g is still defined: 12 ppg is
    0.6234 psi/ft (12 × 0.051948 psi/ft per ppg, common practice)."""
    assert run("calc", "hydrostatic", "--density", 12, "--tvd", 0) == 0
    out = capsys.readouterr().out
    assert "hydrostatic pressure" in out and " 0 psi" in out
    assert "0.6234 psi/ft" in out


@pytest.mark.parametrize("nozzles", ["abc", "12,x", "0", ",,"])
def test_bad_nozzle_list_is_bad_input(capsys, nozzles):
    code = run("calc", "bit", "--rate", 500, "--density", 12, "--size", 8.5, "--nozzles", nozzles)
    assert code == 2
    err = capsys.readouterr().err
    assert "--nozzles" in err and "internal error" not in err


def test_nozzle_count_notation(capsys):
    """3x12,3x11 is the same bit as 12,12,12,11,11,11 (TFA = Σ π/4 (d/32)² in², exact)."""
    base = ["calc", "bit", "--rate", 500, "--density", 12, "--size", 8.5, "--json", "--nozzles"]
    assert run(*base, "3x12,3x11") == 0
    a = capsys.readouterr().out
    assert run(*base, "12,12,12,11,11,11") == 0
    assert capsys.readouterr().out == a


@pytest.mark.parametrize(
    "old, new, key",
    [("ports = 6", "ports = nan", "bit.ports"), ("ports = 6", "ports = inf", "bit.ports")],
)
def test_non_finite_numbers_in_a_case_are_bad_input(tmp_path, capsys, old, new, key):
    """TOML 1.0 allows nan and inf literals; no case value may be one."""
    text = _demo_text()
    assert old in text
    case = tmp_path / "nf.toml"
    case.write_text(text.replace(old, new, 1))
    assert run("report", case, "-o", tmp_path / "r.xlsx") == 2
    err = capsys.readouterr().err
    assert key in err and "finite" in err
    assert not (tmp_path / "r.xlsx").exists()
