"""A legal case without an optional section still gives a report that says what is missing.

Each variant drops one optional section (or optional key of every mud check) from the invented
demo case and runs the ``report`` command in-process: exit 0, a workbook, and no row that shows
an "OK" status against a limit the case never gave.  (issue 14, item 5: the report crashed
with a TypeError when ``[pressure_window]`` was absent.)
"""

from __future__ import annotations

import re

import openpyxl
import pytest

from addin.cli import main
from tests._report_demo import DEMO

SRC = DEMO.read_text(encoding="utf-8")


def drop_section(text: str, header: str) -> str:
    """The case text without every block headed exactly ``header`` (to the next header)."""
    out, skip = [], False
    for line in text.splitlines():
        s = line.strip()
        if s.startswith("["):
            skip = s.split("#")[0].strip() == header
        if not skip:
            out.append(line)
    return "\n".join(out) + "\n"


def drop_key(text: str, key: str) -> str:
    return "\n".join(ln for ln in text.splitlines() if not re.match(rf"\s*{key}\s*=", ln)) + "\n"


VARIANTS = {
    "pressure_window": lambda t: drop_section(t, "[pressure_window]"),
    "pressure_window+weak_points+shoe_tests": lambda t: drop_key(
        drop_section(drop_section(t, "[pressure_window]"), "[[weak_point]]"), "shoe_test"
    ),
    "pressure_window+weak_points": lambda t: drop_section(
        drop_section(t, "[pressure_window]"), "[[weak_point]]"
    ),
    "limits": lambda t: drop_section(t, "[limits]"),
    "weak_point": lambda t: drop_section(t, "[[weak_point]]"),
    "pump": lambda t: drop_section(t, "[[pump]]"),
    "surface_line": lambda t: drop_section(t, "[[surface_line]]"),
    "tool_pressure": lambda t: drop_section(t, "[tool_pressure]"),
    "trip": lambda t: drop_section(t, "[trip]"),
    "slurry": lambda t: drop_section(t, "[[slurry]]"),
    "programme": lambda t: drop_key(t, "program"),
    "pwd": lambda t: drop_key(t, "pwd"),
    "cuttings": lambda t: drop_key(t, "cuttings"),
    "gels": lambda t: drop_key(t, "gels"),
    "measured_spp": lambda t: drop_key(t, "measured_spp"),
    "rop+rpm": lambda t: drop_key(drop_key(t, "rop"), "rpm"),
}


@pytest.mark.parametrize("name", sorted(VARIANTS))
def test_report_without_optional_part(name, tmp_path, capsys):
    case = tmp_path / "case.toml"
    case.write_text(VARIANTS[name](SRC), encoding="utf-8")
    out = tmp_path / "r.xlsx"
    rc = main(["report", str(case), "-o", str(out)])
    err = capsys.readouterr().err
    assert rc == 0, err
    wb = openpyxl.load_workbook(out)
    ws = wb["Summary"]
    rows = [[c.value for c in r] for r in ws.iter_rows()]
    for r in rows:
        # a row whose limit column says none was given never carries OK
        if "no limit given" in r:
            assert "OK" not in r, r


def test_missing_pressure_window_is_said():
    """No pore/fracture curve: the ECD-at-bit rows say no limit was given, never OK."""
    import tempfile
    from pathlib import Path

    d = Path(tempfile.mkdtemp())
    case = d / "c.toml"
    case.write_text(drop_section(SRC, "[pressure_window]"), encoding="utf-8")
    assert main(["report", str(case), "-o", str(d / "r.xlsx")]) == 0
    ws = openpyxl.load_workbook(d / "r.xlsx")["Summary"]
    rows = [[c.value for c in r] for r in ws.iter_rows()]
    bit = [r for r in rows if isinstance(r[0], str) and r[0].startswith("ECD at the bit")]
    assert bit and all("no limit given" in r and "NOT CHECKED" in r for r in bit)
