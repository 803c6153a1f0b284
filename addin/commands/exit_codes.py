"""Exit codes of the ``boreflow`` command (the table in :mod:`addin.cli` explains each)."""

from __future__ import annotations

__all__ = [
    "EXIT_BAD_INPUT",
    "EXIT_BATCH_FAILED",
    "EXIT_BROKEN_PIPE",
    "EXIT_EXISTS",
    "EXIT_INTERNAL",
    "EXIT_INTERRUPTED",
    "EXIT_OK",
    "EXIT_TERMINATED",
    "EXIT_WRITE",
]

EXIT_OK = 0
EXIT_INTERNAL = 1
EXIT_BAD_INPUT = 2
EXIT_EXISTS = 3
EXIT_WRITE = 4
EXIT_BATCH_FAILED = 5
EXIT_BROKEN_PIPE = 141  # 128 + SIGPIPE (13), the shell's code for a closed output pipe
EXIT_INTERRUPTED = 130  # 128 + SIGINT (2), the shell's code for an interrupted command
EXIT_TERMINATED = 143  # 128 + SIGTERM (15): stopped by a kill; temporary files removed
