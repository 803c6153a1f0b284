"""The daily hydraulics report workbook (openpyxl), built from :func:`compute` results.

Sheets, in order: ``Summary`` · ``Inputs`` (the case echoed in the input-workbook block layout,
so the report parses back to the same case) · ``Rheology`` · ``Hydraulics`` · ``ECD`` · ``Bit``
· ``Cleaning`` · ``Trips`` · ``Rate window`` (the flow-rate operating window) · ``Cautions`` ·
``Audit`` (run information, conversion factors and an index of the live checks).  Which sheets
appear depends on the calc modules present in this build (see :data:`SECTIONS`).

Usage (``write_report`` takes the computed results, not the case)::

    from addin.case import load_case
    from addin.report import compute, write_report
    write_report(compute(load_case("workbooks/demo-case.toml")), "demo-report.xlsx")

Modules: :mod:`~addin.report.compute` (runs calc, typed results), one module per sheet
(``sheet_rheology``, ``sheet_hydraulics``, ``sheet_ecd``, ``sheet_bit``, ``sheet_cleaning``,
``sheet_trips``, ``sheet_window``; Summary, Inputs, Cautions and Audit in ``sheets``),
``summary_rows``, ``audit`` (conversion factors, live checks), ``charts``, ``style``, ``jsonout``
(``--json``).
"""

from __future__ import annotations

from pathlib import Path

import openpyxl
from openpyxl.utils import get_column_letter

from addin.report.audit import Factors
from addin.report.compute import Results, compute
from addin.report.sheet_bit import write_bit
from addin.report.sheet_cement import write_cement
from addin.report.sheet_cleaning import write_cleaning
from addin.report.sheet_downhole import write_downhole
from addin.report.sheet_ecd import write_ecd
from addin.report.sheet_hydraulics import write_hydraulics
from addin.report.sheet_rheology import write_rheology
from addin.report.sheet_slurry_line import write_slurry_line
from addin.report.sheet_trips import write_trips
from addin.report.sheet_window import write_window
from addin.report.sheets import write_audit, write_cautions, write_inputs, write_summary
from addin.report.style import audit_print_layout, fit_text
from addin.report.summary_rows import summary_rows
from addin.report.trace import write_methods_and_trace
from addin.safe_io import OutputExistsError, atomic_write
from addin.xlsx_cells import add_styles

__all__ = ["Results", "build_report", "compute", "write_report"]


def build_report(results: Results):
    """The report as an openpyxl Workbook (not saved)."""
    wb = openpyxl.Workbook()
    add_styles(wb)
    case = results.case
    title = case.meta.get("title") or case.meta.get("well") or "boreflow report"
    summary = wb.active
    summary.title = "Summary"
    write_inputs(wb, results, title)
    audit = wb.create_sheet("Audit")
    factors = Factors(audit, row=12, system=case.unit_system)
    refs = {}
    refs["rheology"] = write_rheology(wb, results, factors, title)
    refs["hydraulics"] = write_hydraulics(wb, results, factors, title)
    refs["ecd"] = write_ecd(wb, results, factors, title)
    refs["bit"] = write_bit(wb, results, factors, title)
    refs["cleaning"] = write_cleaning(wb, results, factors, title, refs["hydraulics"]["q"])
    refs["trips"] = write_trips(wb, results, factors, title)
    refs["window"] = write_window(wb, results, title)
    refs["downhole"] = write_downhole(wb, results, title)
    write_slurry_line(wb, results, title)
    refs["cement"] = write_cement(wb, results, title)
    write_cautions(wb, results, title)
    write_summary(summary, results, refs, title)
    write_audit(audit, results, factors, title)
    write_methods_and_trace(audit, results, summary_rows(results, refs), factors.next_row + 2)
    audit_print_layout(audit)
    # Audit last in tab order
    wb.move_sheet("Audit", offset=len(wb.sheetnames) - 1 - wb.sheetnames.index("Audit"))
    for ws in wb.worksheets:  # text fits its cells; a print area (the used range unless set)
        fit_text(ws)
        if not ws.print_area:
            ws.print_area = f"A1:{get_column_letter(ws.max_column)}{ws.max_row}"
    wb.active = 0
    return wb


def write_report(results: Results, path, *, overwrite: bool = False) -> Path:
    """Build and save the report atomically; never replaces an existing file unless asked."""
    path = Path(path)
    if path.exists() and not overwrite:
        raise OutputExistsError(path)
    wb = build_report(results)
    with atomic_write(path, overwrite=overwrite) as tmp:
        wb.save(tmp)
    return path
