"""What the subcommands print: JSON text of plain data (numpy scalars and arrays allowed)."""

from __future__ import annotations

import json

import numpy as np

from addin import text
from addin.case import CaseInputError
from calc.errors import InputError

__all__ = ["error_text", "json_text"]


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
