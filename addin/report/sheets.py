"""Inputs echo, cautions, audit sheet and the summary page."""

from __future__ import annotations

import numpy as np
from openpyxl.styles import Alignment, Font, PatternFill

from addin import text
from addin.guard import finding_text
from addin.report.audit import AGREE_TOL
from addin.report.style import (
    heading,
    merged_text,
    note_row,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.report.summary_rows import summary_rows
from addin.text import display_number as out
from addin.text import unit_label as U
from addin.workbook_layout import LAYOUT
from addin.workbook_template import write_case_sheets
from addin.xlsx_cells import PALETTE, put, set_widths
from calc import cautions
from calc.circulation import ecd_deviation

__all__ = ["write_audit", "write_cautions", "write_inputs", "write_summary"]


# ------------------------------------------------------------------------------- inputs


def write_inputs(wb, results, title):
    case = results.case
    ws = wb.create_sheet("Inputs")
    put(
        ws,
        1,
        1,
        "Inputs as read (block layout of the input workbook; this sheet reads back "
        "as the same case)",
        "bf_title",
    )
    c = put(ws, 2, 1, f"source: {case.source}\ninputs hash (SHA-256): {case.hash}", "bf_note")
    c.alignment = Alignment(wrap_text=True, vertical="top")
    ws.merge_cells(start_row=2, start_column=1, end_row=2, end_column=5)
    ws.row_dimensions[2].height = 24
    ws.append([])
    write_case_sheets(wb, case.doc, {"Inputs": tuple(b.key for b in LAYOUT)})
    setup_print(ws, title)
    return ws


# ------------------------------------------------------------------------------- cautions


def write_cautions(wb, results, title):
    ws = wb.create_sheet("Cautions")
    set_widths(ws, [10, 7, 24, 40, 72])
    row = heading(ws, 1, "Cautions and notes", span=5, title=True)
    merged_text(ws, row, cautions.CELL, span=5, height=28, style="bf_text")
    row += 2
    row = heading(ws, row, "Engineering caution", span=5)
    row = note_row(ws, row, cautions.SHORT, span=5, style="bf_text", font_pt=9)
    row += 1
    for line in cautions.LINES:
        put(ws, row, 1, "•", "bf_text")
        row = note_row(ws, row, line, col=2, span=4, style="bf_text", font_pt=9)
    row += 1
    row = heading(
        ws,
        row,
        "Notes from this run (inputs interpreted, doubtful values, cautions): one line per "
        "kind of note and wording, worst first; 'count' = how many places or items it was "
        "raised for",
        span=5,
    )
    ws.print_title_rows = f"{row}:{row}"
    row = table_header(ws, row, 1, ["level", "count", "code", "about", "message"])
    for g in text.group_notes(results.notes, results.case.unit_system):
        put(ws, row, 1, g.level.upper(), "bf_cell")
        if g.level == "caution":
            ws.cell(row=row, column=1).font = Font(bold=True, color=PALETTE["bad"], size=9)
        put_number(ws, row, 2, g.count, "0")
        put(ws, row, 3, g.code, "bf_text")
        put(ws, row, 4, g.about, "bf_text")
        put(ws, row, 5, g.message, "bf_text")
        lines = max(
            sum(1 + len(x) // 85 for x in g.message.split("\n")),
            1 + len(g.about) // 38,
            1 + len(g.code) // 24,
        )
        ws.row_dimensions[row].height = 12.0 * lines
        row += 1
    if not results.notes:
        put(ws, row, 1, "(none)", "bf_note")
    setup_print(ws, title)
    return ws


# ------------------------------------------------------------------------------- audit


def write_audit(ws, results, factors, title):
    case = results.case
    set_widths(ws, [30, 20, 52, 60])
    heading(ws, 1, "Audit: run information and conversion factors", span=4, title=True)
    info = [
        ("boreflow version", results.version),
        ("run time", results.run_time),
        ("inputs hash (SHA-256 of the canonical case)", case.hash),
        ("case source", case.source),
        ("unit system", case.unit_system),
        ("hydraulics method", results.method),
        ("hydraulics fluid fits", results.fluid.fits),
    ]
    for i, (k, v) in enumerate(info, start=2):
        put(ws, i, 1, k, "bf_cell")
        put(ws, i, 2, str(v), "bf_cell")
        ws.merge_cells(start_row=i, start_column=2, end_row=i, end_column=3)
    put(
        ws,
        9,
        1,
        "How to audit: every blue cell is a live formula from native spreadsheet "
        "functions that recomputes boreflow's number (the plain number on its left) from cells "
        f"on this workbook; the cell to its right says 'agrees' within {AGREE_TOL:g} relative. "
        "The factors below convert the case's units to SI; each names its source.",
        "bf_text",
    )
    ws.merge_cells(start_row=9, start_column=1, end_row=9, end_column=4)
    ws.row_dimensions[9].height = 40
    table_header(ws, 11, 1, ["factor", "value", "meaning", "source"])
    setup_print(ws, title)
    return ws


# ------------------------------------------------------------------------------- summary

_STATUS_FILL = {
    "OK": PALETTE["ok"],
    text.STATUS_WORDS["near_limit"]: PALETTE["warn"],
    text.STATUS_WORDS["exceeded"]: PALETTE["bad"],
    text.CLEANING_STATUS["poor"]: PALETTE["bad"],
    "NOT CHECKED": PALETTE["muted"],
    text.PROGRAMME_WORDS["below"]: PALETTE["warn"],
    text.PROGRAMME_WORDS["above"]: PALETTE["warn"],
    "CHECK": PALETTE["warn"],
    "INFO": PALETTE["muted"],
}


def _status(ws, row, col, status):
    c = put(ws, row, col, status, "bf_cell")
    if status in _STATUS_FILL:
        c.fill = PatternFill("solid", fgColor=_STATUS_FILL[status])
        c.font = Font(name="Arial", size=9, bold=True, color="FFFFFF")


def write_summary(ws, results, refs, title):
    """The summary page: header, key results against limits, run information."""
    system = results.case.unit_system
    set_widths(ws, [42, 12, 12, 9, 11, 12, 12, 12, 12, 10, 10, 11])
    row = heading(ws, 1, f"Daily hydraulics report: {title}", span=12, title=True)
    c = put(ws, row, 1, cautions.CELL, "bf_note")
    c.font = Font(name="Arial", size=8, italic=True, color=PALETTE["bad"])
    ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=12)
    row = _header_block(ws, row + 2, results)
    row = _key_results(ws, row, results, refs, system)
    row += 1
    if len(results.trend) > 1:
        row = _trend_table(ws, row, results, system) + 1
    row = _run_block(ws, row, results)
    put(
        ws,
        row + 1,
        1,
        "Detail on the following sheets; every caution and note on 'Cautions'; "
        "units follow the case (" + system + ").",
        "bf_note",
    )
    ws.merge_cells(start_row=row + 1, start_column=1, end_row=row + 1, end_column=12)
    setup_print(ws, title, fit_height=1)
    ws.freeze_panes = None
    return ws


def _header_block(ws, row, results) -> int:
    """The header: the well and the report on the left, the hole and the operation on the right (two
    label/value column pairs).  Returns the row after the block's blank line."""
    left, right = _header_pairs(results)
    for i, ((lk, lv), (rk, rv)) in enumerate(zip(left, right, strict=True)):
        put(ws, row + i, 1, lk, "bf_note")
        put(ws, row + i, 2, str(lv), "bf_cell")
        ws.merge_cells(start_row=row + i, start_column=2, end_row=row + i, end_column=5)
        put(ws, row + i, 6, rk, "bf_note")
        put(ws, row + i, 7, str(rv), "bf_cell")
        ws.merge_cells(start_row=row + i, start_column=7, end_row=row + i, end_column=12)
    return row + len(left) + 1


def _header_pairs(results):
    """The header's (label, value) pairs: left column (well, operator, rig, location, period,
    mud check) and right column (depths, hole, last shoe, density, rate, method)."""
    case, system = results.case, results.case.unit_system
    chk = case.checks[-1]
    m = case.meta
    last_shoe = max(case.casings, key=lambda s: s.bottom) if case.casings else None
    left = [
        ("well", m.get("well", "")),
        ("operator", m.get("operator", "")),
        ("rig", m.get("rig", "")),
        ("location", m.get("location", "")),
        ("report period", m.get("report_period", "")),
        ("mud check", f"{chk.label}  ({chk.values.get('fluid', '')})"),
    ]
    bit_tvd = results.circulation.bit_tvd
    oh_d = case.open_hole.get("diameter") or case.open_hole["bit_size"]
    right = [
        (
            "bit depth MD / TVD",
            f"{out(chk.values['bit_depth'], 'depth', system):,.0f} / "
            f"{out(bit_tvd, 'depth', system):,.0f} {U('depth', system)}",
        ),
        ("open hole (effective)", f"{out(oh_d, 'diameter', system):.3f} {U('diameter', system)}"),
        (
            "last shoe MD, test EMW",
            f"{out(last_shoe.bottom, 'depth', system):,.0f} {U('depth', system)}, "
            f"{out(last_shoe.shoe_test, 'density', system):.2f} {U('density', system)}"
            if last_shoe is not None and last_shoe.shoe_test
            else "–",
        ),
        (
            "mud density",
            f"{out(chk.values['density'], 'density', system):.2f} {U('density', system)}",
        ),
        (
            "flow rate",
            f"{out(chk.values['flow_rate'], 'flow_rate', system):,.0f} {U('flow_rate', system)}"
            + _spm_suffix(results, chk.values["flow_rate"]),
        ),
        ("hydraulics method", text.method_words(results.method)),
    ]
    return left, right


def _spm_suffix(results, q) -> str:
    """ " (52 + 52 spm)" beside a flow rate when the case has pumps ("" otherwise): the check's
    own strokes per minute, else those the rate needs on each running pump."""
    pumps = getattr(results, "pumps", None)
    words = text.pump_speed(pumps) or text.pump_speed(pumps, q)
    return f" ({words})" if words else ""


def _unusual_rows(case) -> list[tuple[str, str]]:
    """Run-section rows of the inputs outside their usual range that ``--allow-unusual``
    let through (addin/guard.py); none for a case within its usual ranges."""
    if not case.unusual_allowed:
        return []
    return [("unusual input (accepted: --allow-unusual)", finding_text(f)) for f in case.unusual]


def _run_block(ws, row, results) -> int:
    """The run information: version, run time, inputs hash and case source."""
    row = heading(ws, row, "Run", span=12)
    for k, v in (
        ("boreflow version", results.version),
        ("run time", results.run_time),
        ("inputs hash (SHA-256)", results.case.hash),
        ("case source", results.case.source),
        *_unusual_rows(results.case),
    ):
        put(ws, row, 1, k, "bf_note")
        put(ws, row, 2, str(v), "bf_cell")
        ws.merge_cells(start_row=row, start_column=2, end_row=row, end_column=12)
        row += 1
    return row


def _key_results(ws, row, results, refs, system) -> int:
    """The key-results table (summary rows with live checks, limits, margins and status)."""
    row = heading(ws, row, "Key results against limits", span=12)
    row = table_header(
        ws,
        row,
        1,
        [
            "quantity",
            "boreflow",
            "live check",
            "agree?",
            "unit",
            "limit",
            "margin",
            "required",
            "status",
        ],
        ["", "computed", "from detail sheet", "", "", "", "limit − value", "", ""],
    )
    for item in results_rows(results, refs):
        put(ws, row, 1, item["name"], "bf_cell")
        kind = item["kind"]
        fmt = number_format(kind, system)
        if item.get("value") is not None:
            put_number(ws, row, 2, out(item["value"], kind, system) if kind else item["value"], fmt)
        elif item.get("text"):
            put(ws, row, 2, item["text"], "bf_cell")
        if item.get("check"):
            c = ws.cell(row=row, column=3, value="=" + item["check"])
            c.style = "bf_check"
            c.number_format = fmt
            ws.cell(
                row=row,
                column=4,
                value=(
                    f'=IF(ABS(B{row}-C{row})<={AGREE_TOL}*MAX(ABS(B{row}),1E-12),"agrees","DIFFERS")'
                ),
            ).style = "bf_note"
        put(ws, row, 5, U(kind, system) if kind else item.get("unit", "–"), "bf_unit")
        status = item.get("status", "")
        unlimited = _no_limit(item)
        for col, key in ((6, "limit"), (7, "margin"), (8, "required")):
            v = item.get(key)
            if unlimited and key in ("limit", "margin"):
                put(ws, row, col, "no limit given" if key == "limit" else "–", "bf_note")
                continue
            if v is not None:
                k2 = "density" if kind == "density" else kind
                if key in ("margin", "required") and kind == "density":
                    v = out(v, "density", system) - out(0.0, "density", system)
                elif k2:
                    v = out(v, k2, system)
                put_number(ws, row, col, v, fmt)
        if unlimited:
            status = "NOT CHECKED"
        if item.get("bound"):
            put(ws, row, 6, item["bound"], "bf_note")
            ws.merge_cells(start_row=row, start_column=6, end_row=row, end_column=8)
            ws.row_dimensions[row].height = 12.0 * (1 + len(item["bound"]) // 60)
        _status(ws, row, 9, status)
        row += 1
    return row


def _no_limit(item) -> bool:
    """True where a row has a limit or margin that is not a finite number: the case gives no
    such limit (e.g. no ``[pressure_window]``, so the fracture gradient at the bit is unknown);
    the row then says so and carries no OK status."""
    for key in ("limit", "margin"):
        v = item.get(key)
        if v is not None and not np.isfinite(float(v)):
            return True
    return False


def _trend_table(ws, row, results, system) -> int:
    """One row per mud check (oldest first): its own bit depth, rate and density."""
    row = heading(ws, row, "Trend: every mud check at its own bit depth, rate and density", span=12)
    pu, du, dn = U("pressure", system), U("depth", system), U("density", system)
    row = table_header(
        ws,
        row,
        1,
        ["check", "bit MD", "density", "PV", "YP", "SPP model", "SPP measured", "deviation",
         "ECD model at PWD", "ECD PWD", "gap", "tightest margin"],
        ["", du, dn, U("viscosity", system), U("stress", system), pu, pu,
         "% of measured", dn, dn, "model − PWD", dn],
    )  # fmt: skip
    for t in results.trend:
        put(ws, row, 1, t.label, "bf_cell")
        if t.circulation is None:
            put(ws, row, 2, "not computed: missing " + ", ".join(t.missing), "bf_note")
            ws.merge_cells(start_row=row, start_column=2, end_row=row, end_column=12)
            row += 1
            continue
        vals = [
            (2, out(t.bit_md, "depth", system), number_format("depth", system)),
            (3, out(t.density, "density", system), number_format("density", system)),
            (4, out(t.pv, "viscosity", system), number_format("viscosity", system)),
            (5, out(t.yp, "stress", system), number_format("stress", system)),
            (6, out(t.spp, "pressure", system), number_format("pressure", system)),
            (7, out(t.measured_spp, "pressure", system), number_format("pressure", system)),
            (8, t.spp_deviation_percent, "+0.0;-0.0;0.0"),
            (9, out(t.model_ecd_at_pwd, "density", system), number_format("density", system)),
            (10, out(t.pwd_ecd, "density", system), number_format("density", system)),
        ]
        if t.model_ecd_at_pwd is not None and t.pwd_ecd is not None:
            gap = out(ecd_deviation(t.model_ecd_at_pwd, t.pwd_ecd), "density", system)
            vals.append((11, gap, "+0.00;-0.00;0.00"))
        tight = t.tightest
        if tight is not None:
            m = out(float(tight.margin), "density", system) - out(0.0, "density", system)
            vals.append((12, m, number_format("density", system)))
        for col, v, fmt in vals:
            if v is None:
                put(ws, row, col, "–", "bf_cell")
            else:
                put_number(ws, row, col, v, fmt)
        row += 1
    where = [
        f"{t.label}: {text.check_point(t.tightest.point, system)} ({t.tightest.limit})"
        for t in results.trend
        if t.tightest is not None
    ]
    words = (
        "Each check is computed at its own bit depth, flow rate, density and rheology with the "
        "same method; deviation = (model − measured)/measured. Tightest margin (clean mud, no "
        "cuttings load; the key results above use the cuttings-loaded ECD) to the "
        "fracture/pore limit at: " + "; ".join(where) + "."
    )
    merged_text(ws, row, words, span=12, height=24)
    return row + 1


def results_rows(results, refs):
    """Rows of the key-results table (values SI; kinds for units)."""
    return summary_rows(results, refs)
