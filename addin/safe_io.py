"""Safe file output: atomic writes that never clobber, and text that never turns into a formula.

Atomic write
    The bytes go to a temporary file in the *same folder* as the target (so the final step is a
    rename within one file system), are flushed and ``fsync``-ed, and only then moved into place:
    with :func:`os.replace` when overwriting was asked for, otherwise with :func:`os.link`, which
    fails if the target appeared meanwhile (no check-then-write race).  The folder is ``fsync``-ed
    afterwards so the rename itself survives a power cut.  On any failure the temporary file is
    removed and the previous target, if any, is untouched.  A process killed mid-write leaves at
    most a hidden ``.~boreflow-*.tmp`` file beside the target, never a half-written target.

Formula-like text
    A spreadsheet treats text that starts with ``=``, ``+``, ``-`` or ``@`` as a formula when a
    user edits or imports it.  :func:`is_formula_like` recognises such text and :func:`csv_safe`
    defuses it for a CSV field; workbook cells get it as literal text through
    :func:`addin.xlsx_cells.set_text`.
"""

from __future__ import annotations

import contextlib
import os
import tempfile
from collections.abc import Callable, Iterator
from pathlib import Path

__all__ = [
    "FORMULA_TRIGGERS",
    "OutputExistsError",
    "atomic_write",
    "atomic_write_bytes",
    "csv_safe",
    "is_formula_like",
]

#: First characters that make a spreadsheet read text as a formula (OWASP "CSV injection" list,
#: plus tab and carriage return, which some importers strip before looking).
FORMULA_TRIGGERS = ("=", "+", "-", "@", "\t", "\r")

TEMP_PREFIX = ".~boreflow-"


class OutputExistsError(FileExistsError):
    """The target file exists and overwriting was not asked for."""

    def __init__(self, path: Path):
        self.path = Path(path)
        super().__init__(
            f"{self.path}: already exists; not overwritten (use --force to replace it)"
        )


def _fsync_dir(folder: Path) -> None:
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:  # some platforms cannot open a directory; the rename is still atomic
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


def _commit(tmp: Path, target: Path, overwrite: bool) -> None:
    if overwrite:
        os.replace(tmp, target)
        return
    try:
        os.link(tmp, target)  # atomic and fails with FileExistsError if the target exists
    except FileExistsError:
        raise OutputExistsError(target) from None
    except OSError:
        # file systems without hard links: fall back to exclusive create + replace check
        if target.exists():
            raise OutputExistsError(target) from None
        os.replace(tmp, target)
        return
    os.unlink(tmp)


@contextlib.contextmanager
def atomic_write(path, *, overwrite: bool = False) -> Iterator[Path]:
    """Context manager giving a temporary path to write; the target appears only on success.

    The caller writes the complete file to the yielded path (it may open it any way it likes).
    When the block ends without an exception the file is fsync-ed and moved onto ``path``.

    Parameters
    ----------
    path : str or Path
        Final file name.
    overwrite : bool
        Replace an existing file.  If False and ``path`` exists, :class:`OutputExistsError` is
        raised *before* anything is written (and again at commit time if it appeared since).

    Examples
    --------
    >>> import tempfile, pathlib
    >>> d = pathlib.Path(tempfile.mkdtemp())
    >>> with atomic_write(d / "a.txt") as tmp:
    ...     _ = tmp.write_text("hello")
    >>> (d / "a.txt").read_text()
    'hello'
    >>> sorted(p.name for p in d.iterdir())
    ['a.txt']
    """
    target = Path(path)
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise FileNotFoundError(f"{folder}: output folder does not exist")
    if target.exists() and not overwrite:
        raise OutputExistsError(target)
    fd, name = tempfile.mkstemp(prefix=TEMP_PREFIX, suffix=".tmp", dir=folder)
    os.close(fd)
    tmp = Path(name)
    try:
        yield tmp
        with open(tmp, "rb+") as fh:
            fh.flush()
            os.fsync(fh.fileno())
        _commit(tmp, target, overwrite)
        _fsync_dir(folder)
    finally:
        with contextlib.suppress(FileNotFoundError):
            tmp.unlink()


def atomic_write_bytes(path, data: bytes | Callable[[Path], None], *, overwrite=False) -> Path:
    """Write ``data`` (bytes, or a callable that writes a given path) atomically to ``path``."""
    with atomic_write(path, overwrite=overwrite) as tmp:
        if callable(data):
            data(tmp)
        else:
            with open(tmp, "wb") as fh:
                fh.write(data)
    return Path(path)


def is_formula_like(text) -> bool:
    """True for text a spreadsheet would read as a formula.

    >>> is_formula_like("=HYPERLINK(1)"), is_formula_like("-A1"), is_formula_like("DEMO-A1")
    (True, True, False)
    """
    return isinstance(text, str) and text.startswith(FORMULA_TRIGGERS)


def csv_safe(text) -> str:
    """Text for a CSV field: formula-like text gets a leading apostrophe (OWASP advice).

    >>> csv_safe("=1+2"), csv_safe("DEMO")
    ("'=1+2", 'DEMO')
    """
    value = "" if text is None else str(text)
    return "'" + value if is_formula_like(value) else value
