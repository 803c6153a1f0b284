"""Minimum cleaning rate of the demo well against the inclination of its tangent.

Edits a copy of workbooks/demo-case.toml (invented data): every survey station from 4,500 ft MD
to TD (the ~30° tangent) is set to one inclination, then ``boreflow report --json`` runs on the
copy and the cleaning part of its JSON is read.  Run from the worktree root:

    python -m tests.inclination_sweep            # 10 20 28 30 32 34 36 40 50 60 70°
    python -m tests.inclination_sweep 30 45      # chosen angles

``tangent_case_text`` is shared with tests/test_cleaning_inclination.py.
"""

from __future__ import annotations

import json
import re
import subprocess
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "workbooks" / "demo-case.toml"
ANGLES = (10, 20, 28, 30, 32, 34, 36, 40, 50, 60, 70)
TANGENT_TOP_MD = 4500.0
_STATION = re.compile(r"^(\s*\[\s*)([0-9.]+)(\s*,\s*)([0-9.]+)(\s*,.*)$")


def tangent_case_text(inclination: float, text: str | None = None) -> str:
    """The demo case text with every survey station at MD ≥ 4,500 ft set to ``inclination``."""
    text = DEMO.read_text(encoding="utf-8") if text is None else text
    out, in_survey, changed = [], False, 0
    for line in text.splitlines(keepends=True):
        if line.strip().startswith("["):
            header = line.strip()
            if header.startswith("[survey]"):
                in_survey = True
            elif header.startswith("[") and not header.startswith("[ ") and "," not in header:
                in_survey = False
        m = _STATION.match(line.rstrip("\n")) if in_survey else None
        if m and float(m.group(2)) >= TANGENT_TOP_MD:
            line = f"{m.group(1)}{m.group(2)}{m.group(3)}{float(inclination):.1f}{m.group(5)}\n"
            changed += 1
        out.append(line)
    if changed == 0:
        raise ValueError("no tangent stations found in the demo survey")
    return "".join(out)


def run_report(inclination: float) -> dict:
    """``boreflow report --json`` on the edited copy; returns the parsed JSON."""
    with tempfile.TemporaryDirectory() as tmp:
        case = Path(tmp) / f"demo-{inclination:g}.toml"
        case.write_text(tangent_case_text(inclination), encoding="utf-8")
        cmd = [sys.executable, "-m", "addin.cli", "report", str(case), "--json",
               "-o", str(Path(tmp) / "r.xlsx")]  # fmt: skip
        done = subprocess.run(cmd, cwd=ROOT, capture_output=True, text=True, check=True)
    return json.loads(done.stdout)


def main(argv: list[str]) -> None:
    angles = [float(a) for a in argv] or list(ANGLES)
    print("| tangent inclination (°) | minimum cleaning rate (gpm) | governing method | interval |")
    print("|---:|---:|---|---|")
    for a in angles:
        c = run_report(a)["cleaning"]
        rates = ", ".join(f"{m} {q:.0f}" for m, q in c["controlling_method_rates"].items())
        print(f"| {a:g} | {c['controlling_rate']:.0f} | {c['controlling_governing']} ({rates}) | "
              f"{c['controlling_interval']}, MD {c['controlling_top_md']:.0f}-"
              f"{c['controlling_bottom_md']:.0f} |")  # fmt: skip


if __name__ == "__main__":
    main(sys.argv[1:])
