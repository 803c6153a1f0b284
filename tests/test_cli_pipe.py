"""The command line when its reader closes the pipe early (``boreflow rheology CASE | head``).

Expected behaviour is the common convention of command-line tools (common practice): no
traceback, the rest of the output dropped, exit status 128 + SIGPIPE = 141 (POSIX shells report a
process killed by signal N as 128 + N; SIGPIPE is 13 on Linux).
"""

from __future__ import annotations

import os
import signal
import subprocess
import sys

import pytest
from _report_demo import DEMO, ROOT

from addin.cli import main
from addin.commands.exit_codes import EXIT_BROKEN_PIPE


def test_exit_code_is_128_plus_sigpipe():
    assert EXIT_BROKEN_PIPE == 128 + signal.SIGPIPE


class _ClosedPipe:
    """A stdout whose reader has gone: every write raises BrokenPipeError."""

    def write(self, text):
        raise BrokenPipeError(32, "Broken pipe")

    def flush(self):
        raise BrokenPipeError(32, "Broken pipe")


@pytest.mark.parametrize("argv", [["rheology", str(DEMO)], ["rheology", str(DEMO), "--json"]])
def test_broken_pipe_in_process_returns_141(monkeypatch, capsys, argv):
    monkeypatch.setattr(sys, "stdout", _ClosedPipe())
    assert main(argv) == EXIT_BROKEN_PIPE
    assert capsys.readouterr().err == ""  # no "cannot write" message, no traceback


@pytest.mark.parametrize(
    "args",
    [["rheology", str(DEMO)], ["calc", "hydrostatic", "--density", "11", "--tvd", "10000"]],
)
def test_real_closed_pipe_no_traceback(args):
    r, w = os.pipe()
    os.close(r)  # the reader is gone before the first write
    proc = subprocess.run(
        [sys.executable, "-m", "addin.cli", *args],
        stdout=w,
        stderr=subprocess.PIPE,
        cwd=ROOT,
        timeout=120,
        check=False,
    )
    os.close(w)
    assert proc.returncode == EXIT_BROKEN_PIPE, proc.stderr
    assert b"Traceback" not in proc.stderr and b"BrokenPipeError" not in proc.stderr
