"""``boreflow sheets compute IN.xlsx -o OUT.xlsx``: a workbook of ``BF_…`` formulas computed
without a spreadsheet program, written as a copy in which every formula cell holds its value.

The input is opened as untrusted (:func:`addin.workbook_input.check_workbook`: zip-bomb and
cell-count guards, defusedxml, no macros, no external links), computed by the headless formula
engine (:func:`addin.sheets.engine.calculate`, PyPI ``formulas``) and copied with the values
stored (:func:`addin.sheets.engine.store_values`):

* an ordinary formula keeps its formula *and* gets its value (Office Open XML stores both;
  openpyxl cannot write that, so the copy is made at the XML level), so LibreOffice, Excel
  without the functions and any file viewer show numbers, while Excel with the functions
  imported recomputes as before;
* an array formula is stored as its values, and its text is listed on an added sheet
  "BF array formulas" (LibreOffice recomputes array formulas on opening, which would give
  ``#NAME?`` where the functions are not available); ``--keep-arrays`` keeps them live.

Written atomically; an existing file is replaced only with ``--force``.
"""

from __future__ import annotations

import contextlib
import io
import sys
import zipfile
from pathlib import Path

from addin.commands.exit_codes import EXIT_OK
from addin.safe_io import OutputExistsError, atomic_write
from addin.sheets import engine
from addin.workbook_input import check_workbook, sheet_parts
from addin.workbook_layout import WorkbookError

__all__ = ["compute_file", "run"]

#: How many error cells are named one by one on stderr (the rest are counted).
_SHOWN = 10


def compute_file(src, out, *, force: bool = False, keep_arrays: bool = False):
    """Compute workbook ``src`` and write the copy with values to ``out``.

    Returns ``(stored, errors)``: :class:`addin.sheets.engine.Stored` and the
    ``(sheet, cell, value)`` of every formula that computed to an error value or a ``#BF!``
    message.
    """
    src, out = Path(src), Path(out)
    if out.exists() and not force:  # refuse before any work
        raise OutputExistsError(out)
    if not out.parent.is_dir():
        raise FileNotFoundError(f"{out.parent}: output folder does not exist")
    if src.resolve() == out.resolve():
        raise WorkbookError(str(src), "the input itself", "an output file other than the input")
    check_workbook(src)
    try:
        # lazy: the formula engine is an optional dependency (boreflow[sheets])
        import formulas  # noqa: F401
    except ImportError as exc:
        raise WorkbookError(
            str(src),
            "formula engine missing",
            'install it: pip install "boreflow[sheets]" (the Python package `formulas`)',
        ) from exc
    try:
        with contextlib.redirect_stderr(io.StringIO()):  # the engine's progress bars
            values = engine.calculate(src)
    except (OSError, MemoryError):
        raise
    except Exception as exc:  # the engine could not read or compute the file
        first = str(exc).splitlines()[0][:160] if str(exc) else ""
        raise WorkbookError(
            str(src),
            f"{type(exc).__name__}: {first}",
            "a workbook the formula engine reads",
            "cannot be computed",
        ) from exc
    with atomic_write(out, overwrite=force) as tmp:
        stored = engine.store_values(src, tmp, values, keep_arrays=keep_arrays)
    with zipfile.ZipFile(src) as z:  # the engine upper-cases sheet names: name them as typed
        title = {name.upper(): name for name in sheet_parts(z)}
    errors = sorted(
        (title.get(sheet, sheet), ref, v)
        for (sheet, ref), v in values.items()
        if isinstance(v, str) and (v in engine.ERROR_VALUES or v.startswith("#BF!"))
    )
    return stored, errors


def run(args) -> int:
    """``boreflow sheets compute``: print the output path and what was stored."""
    stored, errors = compute_file(
        args.workbook, args.output, force=args.force, keep_arrays=args.keep_arrays
    )
    line = f"{args.output}  ({stored.cells} formula cells given their value; formulas kept"
    if stored.arrays:
        line += (
            f"; {len(stored.arrays)} array formulas stored as values, their text on sheet "
            f"'{stored.formula_sheet}'"
        )
    if stored.dropped:
        line += f"; not copied: {', '.join(stored.dropped)} (macros and external links)"
    print(line + ")")
    for sheet, ref, v in errors[:_SHOWN]:
        print(f"boreflow: warning: {args.workbook}: {sheet}!{ref} computes to {v}", file=sys.stderr)
    if len(errors) > _SHOWN:
        print(f"boreflow: warning: … and {len(errors) - _SHOWN} more error cells", file=sys.stderr)
    return EXIT_OK
