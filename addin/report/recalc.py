"""Recalculate a workbook in LibreOffice headless and read back what the formulas evaluate to.

LibreOffice keeps the cached values stored in an OOXML file unless told otherwise, exits 0 even
when it could not read its input, and turns unknown function names into ``#NAME?``.  So this
harness

* starts LibreOffice with a throwaway user profile whose OOXML (and ODF) recalculation mode is
  "always" (``/org.openoffice.Office.Calc/Formula/Load``: ``OOXMLRecalcMode`` = 0),
* converts the workbook to a new .xlsx (which stores the freshly computed values), and
* judges success by the converted file's existence and contents, never by the exit status.

Use :func:`recalculated_values` to get ``{(sheet, "A1"): value}`` for every formula cell.
"""

from __future__ import annotations

import os
import shutil
import subprocess
import tempfile
from pathlib import Path

import openpyxl

__all__ = ["ERROR_VALUES", "RecalcError", "recalculate", "recalculated_values", "soffice"]

#: Spreadsheet error results (Excel spellings and LibreOffice's Err:nnn form is matched apart).
ERROR_VALUES = ("#NAME?", "#VALUE!", "#REF!", "#DIV/0!", "#NUM!", "#N/A", "#NULL!")

_PROFILE = """<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry"
 xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
 <prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
 <prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
"""


class RecalcError(RuntimeError):
    """LibreOffice did not produce a recalculated workbook."""


def soffice() -> str | None:
    """Path of the LibreOffice binary, or None when it is not installed."""
    return shutil.which("soffice") or shutil.which("libreoffice")


def _run(args: list[str], profile: Path, timeout: float) -> subprocess.CompletedProcess:
    env = dict(os.environ, HOME=str(profile), SAL_USE_VCLPLUGIN="svp")
    return subprocess.run(
        [
            soffice() or "soffice",
            f"-env:UserInstallation={profile.as_uri()}",
            "--headless",
            "--norestore",
            "--nologo",
            "--nodefault",
            "--nolockcheck",
            *args,
        ],
        capture_output=True,
        text=True,
        timeout=timeout,
        env=env,
        check=False,
    )


def convert(src, outdir, fmt: str, *, timeout: float = 180.0) -> Path:
    """Convert ``src`` with LibreOffice (recalculating on load) to ``fmt`` in ``outdir``."""
    if soffice() is None:
        raise RecalcError("LibreOffice (soffice) is not installed")
    src = Path(src).resolve()
    outdir = Path(outdir)
    outdir.mkdir(parents=True, exist_ok=True)
    with tempfile.TemporaryDirectory(prefix="bf-lo-profile-") as prof:
        profile = Path(prof)
        (profile / "user").mkdir()
        (profile / "user" / "registrymodifications.xcu").write_text(_PROFILE, encoding="utf-8")
        proc = _run(["--convert-to", fmt, "--outdir", str(outdir), str(src)], profile, timeout)
    out = outdir / (src.stem + "." + fmt.split(":")[0])
    if not out.exists() or out.stat().st_size == 0:
        raise RecalcError(
            f"LibreOffice produced no {fmt} for {src.name} (exit {proc.returncode}): "
            + (proc.stderr.strip() or proc.stdout.strip() or "no message")[:400]
        )
    return out


def recalculate(src, outdir, *, timeout: float = 180.0) -> Path:
    """Recalculate ``src`` in LibreOffice and save it as .xlsx in ``outdir``; return that path."""
    src = Path(src)
    tmp_in = Path(outdir) / ("in-" + src.name)
    Path(outdir).mkdir(parents=True, exist_ok=True)
    shutil.copyfile(src, tmp_in)  # never let LibreOffice write next to the original
    return convert(tmp_in, Path(outdir) / "recalc", "xlsx", timeout=timeout)


def recalculated_values(original, recalculated) -> dict[tuple[str, str], object]:
    """``{(sheet, coordinate): value}`` after recalculation, for every formula in ``original``."""
    src = openpyxl.load_workbook(original)  # formulas
    out = openpyxl.load_workbook(recalculated, data_only=True)  # cached (recalculated) values
    values = {}
    for ws in src.worksheets:
        ows = out[ws.title]
        for row in ws.iter_rows():
            for c in row:
                if c.data_type == "f":
                    values[(ws.title, c.coordinate)] = ows[c.coordinate].value
    return values
