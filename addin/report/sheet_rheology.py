"""The rheology sheet: readings, field properties with live checks, every fit, change, rheogram."""

from __future__ import annotations

import numpy as np
from openpyxl.styles import Font
from openpyxl.utils import get_column_letter

from addin import text
from addin.report.audit import Factors, cell_ref, write_checked
from addin.report.charts import rheogram
from addin.report.style import (
    heading,
    note_row,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.report.summary_rows import programme_range, programme_values
from addin.text import display_number as _out
from addin.text import unit_label as U
from addin.xlsx_cells import PALETTE, put, set_widths
from calc.circulation.fluid import model_parameters

__all__ = ["write_rheology"]

_MODEL_CURVES = (
    "api13d_2010_hb",
    "hb_least_squares",
    "bingham_least_squares",
    "power_law_least_squares",
    "api13d_1995_pipe",
)
_CURVE_RATES = np.geomspace(1.0, 1100.0, 45)
#: Legend names of the model curves (the registry name stays on the fits table).
_CURVE_LABELS = {
    "api13d_2010_hb": "Herschel-Bulkley (API RP 13D 2010)",
    "hb_least_squares": "Herschel-Bulkley (least squares)",
    "bingham_least_squares": "Bingham (least squares)",
    "power_law_least_squares": "power law (least squares)",
    "api13d_1995_pipe": "power law (API RP 13D 1995, pipe)",
}


def write_rheology(wb, results, factors: Factors, title: str):
    """Add the sheet; return {"refs": {...}} with cells other sheets may cite."""
    system = results.case.unit_system
    ws = wb.create_sheet("Rheology")
    set_widths(ws, [28, 14, 11, 11, 9, 11, 11, 9, 11, 44])
    row = heading(
        ws,
        1,
        "Rheology: viscometer readings, field properties and fitted models",
        span=10,
        title=True,
    )
    checks = results.checks
    row, dial_cells, read_rows = _readings_table(ws, row + 1, checks, system)
    row, refs = _properties_table(ws, row, results, factors, dial_cells)
    row = _fits_table(ws, row, checks, system)
    if results.temperature_table is not None:
        row = _temperature_table(ws, row, results, system)
    last = checks[-1]
    if last.comparison is not None:
        row = _change_table(ws, row, last.comparison, system, checks[-2].readings.geometry)
    data_row = _rheogram(ws, row, checks, read_rows, system)
    setup_print(ws, title)
    last_col = max(10, 3 + 3 * len(checks))
    ws.print_area = f"A1:{get_column_letter(last_col)}{data_row - 2}"
    return {"refs": refs, "next_row": row}


def _readings_table(ws, row, checks, system):
    """Speeds, shear rates, dial readings and stresses of every check.

    Returns (next row, per check {rpm: absolute dial cell}, (first, last) reading row)."""
    row = heading(ws, row, "Viscometer readings (standard rotor–bob–spring)", span=10)
    speeds = sorted({float(s) for c in checks for s in c.readings.speeds}, reverse=True)
    su = U("stress", system)
    heads = ["speed", "shear rate"]
    units = ["rpm", "1/s"]
    for c in checks:
        heads += [f"{c.label}\ndial", f"{c.label}\nstress"]
        units += ["°", su]
    row = table_header(ws, row, 1, heads, units)
    dial_cells: list[dict] = [dict() for _ in checks]
    first = row
    geom = checks[-1].readings.geometry
    for s in speeds:
        put_number(ws, row, 1, s, "0")
        put_number(ws, row, 2, s * geom.shear_rate_per_rpm, "#,##0.0")
        for j, c in enumerate(checks):
            r = c.readings
            val = r.reading(s) if hasattr(r, "reading") else None
            col = 3 + 2 * j
            if val is not None:
                put_number(ws, row, col, val, "0.0", "bf_input")
                put_number(
                    ws,
                    row,
                    col + 1,
                    _out(val * r.geometry.stress_per_reading, "stress", system),
                    number_format("stress", system),
                )
                dial_cells[j][s] = cell_ref(ws, row, col, absolute=True)
        row += 1
    read_rows = (first, row - 1)
    krieger = checks[-1].readings.shear_rate_correction == "krieger"
    row = note_row(
        ws,
        row,
        "Stress = dial × instrument constant (k₁k₂, standard spring), shear rate = "
        "rpm × Couette factor of the standard geometry (calc.rheology.viscometer)"
        + (
            "; the least-squares fits use the finite-gap (Krieger) shear rates of each check."
            if krieger
            else "."
        ),
        span=2 + 2 * len(checks),
    )
    return row + 1, dial_cells, read_rows


def _properties_table(ws, row, results, factors: Factors, dial_cells):
    """PV, YP, LSYP, AV with live formulas over the dial cells, the gels, the programme.

    Returns (next row, {(property, check index): value cell})."""
    system = results.case.unit_system
    checks = results.checks
    su = U("stress", system)
    row = heading(ws, row, "Field properties (API RP 13B-1 definitions) with live checks", span=10)
    heads = ["property", "unit"]
    units = ["", ""]
    for c in checks:
        heads += [f"{c.label}\nboreflow", f"{c.label}\nlive check", "agree?"]
        units += ["", "formula", ""]
    heads += ["programme", f"{checks[-1].label}\nvs programme"]
    units += ["low – high", ""]
    row = table_header(ws, row, 1, heads, units)
    f_cp = factors.named(
        "SI per cP",
        1e-3,
        "multiplies a dial difference read as cP to Pa·s",
        "API RP 13B-1 (PV = θ600 − θ300 in cP); cP = 1e-3 Pa·s exact",
    )
    f_fs = factors.unit_factor_of("lbf_per_100ft_sq", "stress")
    f_visc = factors.unit("viscosity")
    f_str = factors.unit("stress")
    refs = {}
    props = [
        ("PV", "viscosity", lambda r: r.pv, lambda d: f"({d[600]}-{d[300]})*{f_cp}/{f_visc}", "pv"),
        ("YP", "stress", lambda r: r.yp, lambda d: f"(2*{d[300]}-{d[600]})*{f_fs}/{f_str}", "yp"),
        (
            "LSYP = 2θ3 − θ6",
            "stress",
            lambda r: r.lsyp,
            lambda d: f"(2*{d[3]}-{d[6]})*{f_fs}/{f_str}",
            "lsyp",
        ),
        (
            "AV = θ600 / 2",
            "viscosity",
            lambda r: r.av,
            lambda d: f"{d[600]}/2*{f_cp}/{f_visc}",
            None,
        ),
    ]
    for name, kind, get, formula, prog in props:
        put(ws, row, 1, name)
        put(ws, row, 2, U(kind, system), "bf_unit")
        for j, c in enumerate(checks):
            col = 3 + 3 * j
            try:
                v = get(c.readings)
                f = formula(dial_cells[j])
            except (KeyError, Exception):  # readings lack the speeds this property needs
                put(ws, row, col, "n/a (speeds missing)", "bf_note")
                continue
            vref, _ = write_checked(
                ws, row, col, _out(v, kind, system), f, kind=kind, system=system
            )
            refs[(name.split()[0], j)] = vref
        if prog:
            _programme_cells(ws, row, results, prog, kind)
        row += 1
    for gel in ("10s", "10min", "30min"):
        put(ws, row, 1, f"gel strength {gel}")
        put(ws, row, 2, su, "bf_unit")
        for j, c in enumerate(checks):
            g = c.readings.gels_si.get(gel) if c.readings.gels else None
            if g is not None:
                put_number(
                    ws, row, 3 + 3 * j, _out(g, "stress", system), number_format("stress", system)
                )
        _programme_cells(ws, row, results, f"gels.{gel}", "stress")
        row += 1
    return row + 1, refs


def _programme_cells(ws, row, results, key: str, kind: str) -> None:
    """The programme range of ``key`` and the latest check's status word (flagged in red
    outside the range), in the two columns after the checks."""
    system, n = results.case.unit_system, len(results.checks)
    rng = programme_range(results.case.checks[-1], key)
    if rng is None:
        return
    lo, hi = (text.quantity(x, kind, system) for x in rng)
    put(ws, row, 3 + 3 * n, f"{lo} – {hi}", "bf_cell")
    v = programme_values(results).get(key)
    if v is not None:
        word = text.programme_status(v, rng[0], rng[1], kind, system)
        c = put(ws, row, 4 + 3 * n, word, "bf_cell")
        if word != text.PROGRAMME_WORDS["in"]:
            c.font = Font(name="Arial", size=9, bold=True, color=PALETTE["bad"])


def _fits_table(ws, row, checks, system):
    """Every fit of every check: τy, K, n, quality, rank, range, source.  Returns next row."""
    su = U("stress", system)
    row = heading(ws, row, "Fitted models (every method; quality over all readings)", span=10)
    heads = [
        "check / method",
        "model",
        "τy",
        "K",
        "n",
        "RMSE",
        "R²",
        "rank",
        "fitted range",
        "source",
    ]
    units = ["", "", su, f"{su}·sⁿ", "–", su, "–", "1 = best", "1/s", ""]
    row = table_header(ws, row, 1, heads, units)
    for c in checks:
        rank = {e.method: e.rank for e in c.fits.ranking}
        for fr in c.fits.results:
            ty, k, n = model_parameters(fr.model)
            put(ws, row, 1, f"{c.label}: {text.method_words(fr.method)}")
            put(ws, row, 2, fr.model.name)
            put_number(ws, row, 3, _out(ty, "stress", system), number_format("stress", system))
            put_number(ws, row, 4, _out(k, "consistency", system), "0.0000")
            put_number(ws, row, 5, n, "0.000")
            put_number(ws, row, 6, _out(fr.quality.rmse, "stress", system), "0.00")
            put_number(ws, row, 7, fr.quality.r2, "0.0000")
            if fr.method in rank:
                put_number(ws, row, 8, rank[fr.method], "0")
            lo, hi = fr.shear_rate_range
            put(ws, row, 9, f"{lo:,.0f} – {hi:,.0f}")
            put(ws, row, 10, fr.source, "bf_note")
            if len(fr.source) > 60:
                ws.row_dimensions[row].height = 22
            row += 1
    row = note_row(
        ws,
        row,
        "τy, K, n: Herschel-Bulkley form τ = τy + K·γ̇ⁿ (Bingham: n = 1, K = μp; "
        "power law: τy = 0). RMSE in stress over all readings; rank by standard error.",
        span=10,
    )
    return row + 1


def _temperature_table(ws, row, results, system):
    """The latest check's readings at each cup temperature and the method's model parameters
    at temperatures across that range (calc/METHODS.md §21.1).  Returns the next row."""
    tt = results.temperature_table
    chk = results.case.checks[-1]
    su, tu = U("stress", system), U("temperature", system)
    row = heading(ws, row, f"Rheology of {tt.label} at its cup temperatures", span=10)
    reads = sorted(chk.all_readings, key=lambda r: r.temperature)
    speeds = sorted({float(s) for r in reads for s in r.speeds}, reverse=True)
    row = table_header(
        ws, row, 1, ["cup temperature", *[f"{s:g} rpm" for s in speeds]], [tu] + ["°"] * len(speeds)
    )
    for r in reads:
        put_number(ws, row, 1, _out(r.temperature, "temperature", system), "0.0")
        for j, s in enumerate(speeds):
            v = r.reading(s)
            if v is not None:
                put_number(ws, row, 2 + j, v, "0.0", "bf_input")
        row += 1
    row += 1
    heads = ["temperature", "measured?", "τy", "K", "n"]
    units = [tu, "", su, f"{su}·sⁿ", "–"]
    if not tt.same_models:
        heads = [*heads[:2], "annulus τy", "annulus K", "annulus n", "pipe τy", "pipe K", "pipe n"]
        units = [*units, su, f"{su}·sⁿ", "–"]
    row = table_header(ws, row, 1, heads, units)
    for t, meas, ann, pipe in zip(tt.temperatures, tt.measured, tt.annulus, tt.pipe, strict=True):
        put_number(ws, row, 1, _out(t, "temperature", system), "0.0")
        put(ws, row, 2, "yes" if meas else "law")
        models = (ann,) if tt.same_models else (ann, pipe)
        for m_i, m in enumerate(models):
            ty, k, n = model_parameters(m)
            col = 3 + 3 * m_i
            put_number(ws, row, col, _out(ty, "stress", system), number_format("stress", system))
            put_number(ws, row, col + 1, _out(k, "consistency", system), "0.0000")
            put_number(ws, row, col + 2, n, "0.000")
        row += 1
    row = note_row(
        ws,
        row,
        f"Fits of the hydraulics method ({text.method_words(tt.fits)}) at each cup temperature; "
        "between them K "
        "follows an Arrhenius law in temperature, τy and n straight lines (exact at the "
        "measured temperatures). The hydraulics of this report use the cup rheology of the "
        "check; the table shows how much the parameters move with temperature.",
        span=10,
    )
    return row + 1


def _change_table(ws, row, cmp_, system, geometry):
    """The latest check against the previous one: values, change, flags.  Returns next row.

    ``cmp_.max_curve_difference`` is in dial degrees of the previous check's instrument
    (calc.rheology.compare); ``geometry`` (that instrument) turns it into a stress."""
    su = U("stress", system)
    row = heading(
        ws,
        row,
        f"Change since the previous check ({cmp_.label_a} → {cmp_.label_b}, "
        f"{text.method_words(cmp_.method)})",
        span=10,
    )
    row = table_header(
        ws,
        row,
        1,
        ["parameter", "previous", "latest", "change", "relative", "flagged?"],
        ["", "", "", "", "%", "beyond tolerance"],
    )
    for ch in cmp_.changes:
        kind = ch.kind if ch.kind in ("stress", "viscosity", "consistency") else None
        name = text.parameter_words(ch.name)
        put(ws, row, 1, f"{name} [{U(kind, system)}]" if kind else name)
        for col, v in ((2, ch.a), (3, ch.b), (4, ch.change)):
            put_number(ws, row, col, _out(v, kind, system) if kind else v, "0.000")
        put_number(ws, row, 5, 100 * ch.relative, "0.0")
        put(ws, row, 6, "YES" if ch.flagged else "no")
        row += 1
    row = note_row(
        ws,
        row,
        f"Largest difference between the fitted curves: {cmp_.max_curve_difference:.2f} dial "
        f"degrees = {curve_difference_stress(cmp_, geometry, system):.2f} {su} at "
        f"{cmp_.max_difference_at:,.0f} 1/s.",
        span=6,
    )
    return row + 1


def curve_difference_stress(cmp_, geometry, system) -> float:
    """The comparison's largest curve difference [dial degrees] as a stress in ``system``'s unit:
    degrees × the instrument's stress per reading (Pa), then to the display unit.

    >>> from calc.rheology.viscometer import STANDARD_GEOMETRY
    >>> from types import SimpleNamespace
    >>> round(curve_difference_stress(SimpleNamespace(max_curve_difference=1.0),
    ...                               STANDARD_GEOMETRY, "oilfield"), 4)
    1.0666
    """
    return _out(cmp_.max_curve_difference * geometry.stress_per_reading, "stress", system)


def _rheogram(ws, row, checks, read_rows, system):
    """The rheogram chart at ``row`` and, below it, the model-curve data it plots.

    Returns the first row of the chart data (the print area ends two rows above it)."""
    su = U("stress", system)
    last = checks[-1]
    chart_row = row
    chart_rows = 20  # the 9.5-cm chart
    data_row = chart_row + chart_rows + 2
    put(
        ws,
        data_row - 1,
        1,
        "Chart data: the fitted curves of the latest check (rows below; not printed).",
        "bf_note",
    )
    ws.merge_cells(start_row=data_row - 1, start_column=1, end_row=data_row - 1, end_column=10)
    col0 = 1
    put(ws, data_row, col0, "Rheogram data (latest check's models)", "bf_section")
    shown = [m for m in _MODEL_CURVES if _has(last.fits, m)]
    heads = ["shear rate", *shown]
    row_d = table_header(
        ws,
        data_row + 1,
        col0,
        ["shear rate"] + [_CURVE_LABELS.get(m, m) for m in shown],
        ["1/s"] + [su] * len(shown),
    )
    for i, g in enumerate(_CURVE_RATES):
        put_number(ws, row_d + i, col0, g, "#,##0.0")
        for j, m in enumerate(heads[1:]):
            model = _fit_of(last.fits, m).model
            put_number(
                ws, row_d + i, col0 + 1 + j, _out(float(model.stress(g)), "stress", system), "0.00"
            )
    r1 = row_d + len(_CURVE_RATES) - 1
    models = [(_CURVE_LABELS.get(m, m), (ws, col0 + 1 + j, row_d, r1)) for j, m in enumerate(shown)]
    readings = [
        (f"{c.label} readings", (ws, 4 + 2 * j, read_rows[0], read_rows[1]))
        for j, c in enumerate(checks)
    ]
    ch = rheogram(
        readings,
        models,
        {"readings": (ws, 2, read_rows[0], read_rows[1]), "models": (ws, col0, row_d, r1)},
        stress_unit=su,
        title=f"Rheogram, {last.label} (log–log)",
    )
    ch.width = 22.0
    ws.add_chart(ch, f"A{chart_row}")
    return data_row


def _has(fs, method):
    return any(r.method == method for r in fs.results)


def _fit_of(fs, method):
    return next(r for r in fs.results if r.method == method)
