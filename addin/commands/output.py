"""What the subcommands print: JSON text of plain data (numpy scalars and arrays allowed)."""

from __future__ import annotations

import json
import re

import numpy as np

from addin import text
from addin.case import CaseInputError
from calc.errors import InputError

__all__ = ["SanitisingStream", "error_text", "json_text", "printable"]


def _default(o):
    if isinstance(o, np.generic):
        return o.item()
    if isinstance(o, np.ndarray):
        return o.tolist()
    raise TypeError(type(o).__name__)


def json_text(obj) -> str:
    """``obj`` as indented JSON, non-ASCII kept (units such as ``lbf/100ft²`` stay readable).

    >>> print(json_text({"rpm": np.float64(600.0), "dial": np.array([56, 37])}))
    {
      "rpm": 600.0,
      "dial": [
        56,
        37
      ]
    }
    """
    return json.dumps(obj, ensure_ascii=False, indent=2, default=_default)


def error_text(exc: InputError) -> str:
    """An input error in words: in the case's units where the error came from a case (the value
    as the user wrote it), else as raised."""
    if isinstance(exc, CaseInputError):
        return text.error(exc, exc.unit_system)
    return text.error(exc)


#: C0 controls, DEL and C1 controls: a terminal acts on them (colours, cursor moves, window
#: titles, ECMA-48 escape sequences) instead of showing them.
_CONTROL = re.compile(r"[\x00-\x1f\x7f-\x9f]")


def printable(value: str, keep: str = "\n\t") -> str:
    r"""``value`` with every control character except those in ``keep`` shown as ``\xNN`` text,
    so text from a case file cannot drive the terminal (ECMA-48 escape sequences start with
    ESC, 0x1b).

    >>> print(printable("well \x1b[31mA\x1b[0m B"))
    well \x1b[31mA\x1b[0m B
    """
    return _CONTROL.sub(
        lambda m: m.group() if m.group() in keep else f"\\x{ord(m.group()):02x}", value
    )


class SanitisingStream:
    """A text stream that writes through :func:`printable` (the command line wraps stdout and
    stderr in it); everything else is the wrapped stream's."""

    def __init__(self, stream, keep: str = "\n\t"):
        self._stream = stream
        self._keep = keep

    def write(self, value: str) -> int:
        self._stream.write(printable(value, self._keep))
        return len(value)

    def __getattr__(self, name):
        return getattr(self._stream, name)
