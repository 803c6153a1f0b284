"""Safe file output: atomic writes that never clobber, and text that never turns into a formula.

Atomic write
    The bytes go to a temporary file in the *same folder* as the target (so the final step is a
    rename within one file system), are flushed and ``fsync``-ed, and only then moved into place:
    with :func:`os.replace` when overwriting was asked for, otherwise with :func:`os.link`, which
    fails if the target appeared meanwhile (no check-then-write race).  The folder is ``fsync``-ed
    afterwards so the rename itself survives a power cut.  On any failure the temporary file is
    removed and the previous target, if any, is untouched.  A process killed mid-write leaves at
    most a hidden ``.~boreflow-*.tmp`` file beside the target, never a half-written target;
    such leftovers of our own (that name pattern, older than :data:`STALE_SECONDS`) are removed
    by the next write into that folder (:func:`remove_stale_temps`).  The final file gets the
    permissions an ordinary ``open()`` would give it (``0o666`` less the umask), not the
    ``0o600`` of the temporary file.

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
import time
from collections.abc import Callable, Iterator
from pathlib import Path

__all__ = [
    "FORMULA_TRIGGERS",
    "OutputExistsError",
    "atomic_write",
    "atomic_write_bytes",
    "csv_safe",
    "is_formula_like",
    "remove_stale_temps",
]

#: First characters that make a spreadsheet read text as a formula (OWASP "CSV injection" list,
#: plus tab and carriage return, which some importers strip before looking).
FORMULA_TRIGGERS = ("=", "+", "-", "@", "\t", "\r")

TEMP_PREFIX = ".~boreflow-"
TEMP_SUFFIX = ".tmp"
#: A temporary file of ours untouched for this long belongs to a killed run (a report takes
#: seconds to write): the next write into the folder removes it.
STALE_SECONDS = 300.0


def _umask() -> int:
    """The process umask (read by setting and restoring it; there is no read-only call)."""
    mask = os.umask(0o022)
    os.umask(mask)
    return mask


def remove_stale_temps(folder, *, older_than: float = STALE_SECONDS) -> list[Path]:
    """Remove our own leftover temporary files (``.~boreflow-*.tmp``) older than ``older_than``
    seconds from ``folder``; returns the removed paths.  Other files are never touched.

    >>> import tempfile, pathlib
    >>> d = pathlib.Path(tempfile.mkdtemp())
    >>> old = d / ".~boreflow-abc.tmp"; _ = old.write_text("x"); os.utime(old, (0, 0))
    >>> keep = d / "other.tmp"; _ = keep.write_text("x"); os.utime(keep, (0, 0))
    >>> [p.name for p in remove_stale_temps(d)], sorted(p.name for p in d.iterdir())
    (['.~boreflow-abc.tmp'], ['other.tmp'])
    """
    removed: list[Path] = []
    now = time.time()
    try:
        entries = list(Path(folder).iterdir())
    except OSError:
        return removed
    for q in entries:
        if not (q.name.startswith(TEMP_PREFIX) and q.name.endswith(TEMP_SUFFIX)):
            continue
        try:
            st = q.lstat()
            if not q.is_file() or q.is_symlink() or now - st.st_mtime < older_than:
                continue
            q.unlink()
            removed.append(q)
        except OSError:  # another run removed it, or no permission: leave it
            continue
    return removed


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
    remove_stale_temps(folder)
    fd, name = tempfile.mkstemp(prefix=TEMP_PREFIX, suffix=TEMP_SUFFIX, dir=folder)
    os.close(fd)
    tmp = Path(name)
    try:
        yield tmp
        with open(tmp, "rb+") as fh:
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, 0o666 & ~_umask())  # as open() would create it, not mkstemp's 0o600
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
