"""Build workbooks/input-template.xlsx: the input workbook, pre-filled with the invented demo case.

Run from the repository root::

    python3 workbooks/build_input_template.py [--force]

The workbook carries exactly the content of ``workbooks/demo-case.toml`` in the block layout of
``addin/workbook_layout.py``; ``boreflow report workbooks/input-template.xlsx`` reads it like the
case file.  Overwrite the demo values with your own; add rows inside a block, or columns for
more mud checks; keep one empty row between blocks.
"""

from __future__ import annotations

import argparse
import sys
import tomllib
from pathlib import Path

import openpyxl

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from addin.safe_io import atomic_write  # noqa: E402
from addin.workbook_layout import MARK  # noqa: E402
from addin.workbook_template import page_setup, write_case_sheets  # noqa: E402
from addin.xlsx_cells import add_styles, put, set_widths  # noqa: E402

HELP = (
    "boreflow input workbook (DEMO DATA, ENTIRELY FICTITIOUS: replace with your own)",
    "",
    f"Each block starts with a title cell '{MARK} key' in column A and ends at the first "
    "empty row.",
    "Values blocks: column B holds the key boreflow reads, column C the unit, column D on the "
    "value(s).",
    "Tables: the first row holds the keys, the second the units, then one row per item.",
    "Mud checks and slurries: one column per check (D, E, F ...), oldest first.",
    "Units follow the unit system in the Case block (oilfield, metric or si). To give one value "
    "in another unit, change its unit cell (e.g. 'sg' for a density).",
    "Blocks may sit on any sheet; do not repeat a block. Formulas are not evaluated: type values.",
    "Field-by-field documentation: workbooks/CASE-FORMAT.md.",
)


def build(out: Path, force: bool) -> Path:
    doc = tomllib.loads((ROOT / "workbooks" / "demo-case.toml").read_text(encoding="utf-8"))
    wb = openpyxl.Workbook()
    add_styles(wb)
    ws = wb.active
    ws.title = "Read me"
    for i, line in enumerate(HELP, start=1):
        put(ws, i, 1, line, "bf_title" if i == 1 else "bf_text")
    set_widths(ws, [120])
    write_case_sheets(wb, doc)
    for sheet in wb.worksheets:
        page_setup(sheet, "boreflow input workbook (template)", header_rows="1:1",
                   footer="boreflow input workbook; blocks marked §")  # fmt: skip
    with atomic_write(out, overwrite=force) as tmp:
        wb.save(tmp)
    return out


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("-o", "--output", default=str(ROOT / "workbooks" / "input-template.xlsx"))
    ap.add_argument("--force", action="store_true", help="replace an existing file")
    args = ap.parse_args(argv)
    print(build(Path(args.output), args.force))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
