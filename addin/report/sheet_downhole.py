"""The Downhole sheet: temperatures and mud density down the well, ESD/ECD at T and p.

Static and circulating temperatures (string and annulus), the local mud density, and the ESD
and ECD from that density integrated down the well beside the values with the surface mud
weight (calc.downhole; calc/METHODS.md §20).  Only with the case's ``[temperature]`` section.
"""

from __future__ import annotations

import numpy as np

from addin import text
from addin.report.charts import depth_profile, nice_axis, temperature_profile
from addin.report.style import (
    heading,
    note_row,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.text import display_number as _o
from addin.text import unit_label as U
from addin.xlsx_cells import put, set_widths
from calc.cautions import CELL

__all__ = ["SHEET", "downhole_data", "write_downhole"]

SHEET = "Downhole"
SPAN = 11

#: Words of the base fluids on the sheet.
BASE_WORDS = {
    "water": "fresh water",
    "brine": "brine",
    "diesel": "diesel",
    "mineral_oil": "mineral oil",
    "synthetic": "synthetic base fluid",
}


def _temp(x, s):
    return _o(x, "temperature", s)


def _models(run) -> str:
    comp = run.conditions.composition
    parts = []
    if comp.water > 0:
        parts.append("water phase: IAPWS-IF97 (2007) region 1")
    if comp.oil > 0:
        if comp.oil_base == "diesel":
            parts.append("diesel: Sorelle et al. (1982) SPE 11118")
        else:
            parts.append(
                f"{BASE_WORDS[comp.oil_base]}: relative change of diesel, Sorelle et al. (1982)"
            )
    parts.append("solids incompressible")
    return "; ".join(parts)


def key_points(results) -> list[tuple[str, float, float, float, float, float]]:
    """(name, md, ECD T/p, ECD surface mud, ESD T/p, ESD surface mud) at the weak points and
    the bit [SI]."""
    run = results.downhole
    p = run.profile
    rows = [
        (name, md, e, es, float(p.at("esd", md)), float(p.at("esd_surface", md)))
        for name, md, e, es in run.weak_points
    ]
    rows.append(("bit", float(p.md[-1]), p.ecd_bit, float(p.ecd_surface[-1]), p.esd_bit,
                 float(p.esd_surface[-1])))  # fmt: skip
    return rows


def write_downhole(wb, results, title: str) -> dict:
    """The sheet (only with a ``[temperature]`` section); returns refs for the summary."""
    run = results.downhole
    if run is None:
        return {}
    s = results.case.unit_system
    ws = wb.create_sheet(SHEET)
    set_widths(ws, [26, 11, 11, 11, 11, 11, 12, 12, 12, 12, 12])
    row = heading(ws, 1, "Downhole conditions: temperature and mud density at depth",
                  span=SPAN, title=True)  # fmt: skip
    row = note_row(ws, row, CELL, span=SPAN)
    cond, p, comp = run.conditions, run.profile, run.conditions.composition
    tu, du, dn = U("temperature", s), U("depth", s), U("density", s)
    if cond.table is not None:
        geo = f"static temperature from a table of {len(cond.table.tvd)} rows"
    else:
        g = _o(cond.gradient, "temperature_gradient", s)
        geo = (f"static temperature {_temp(cond.t_surface, s):.1f} {tu} at the surface, "
               f"gradient {g:.2f} {U('temperature_gradient', s)}")  # fmt: skip
    if p.circulating is not None:
        circ = (f"circulating: Holmes & Swift (1970) steady model, inlet "
                f"{_temp(p.circulating.inlet, s):.1f} {tu}, outlet (flow line) "
                f"{_temp(p.circulating.outlet, s):.1f} {tu}")  # fmt: skip
    else:
        circ = "circulating: the static temperature (no inlet temperature given)"
    mud = (f"mud: {BASE_WORDS.get(run.base_fluid, run.base_fluid)} base; retort oil "
           f"{100 * comp.oil:.1f} %, water {100 * comp.water:.1f} %, solids "
           f"{100 * comp.solids:.1f} % by volume; surface mud weight "
           f"{_o(float(results.circulation.density), 'density', s):.2f} {dn} at "
           f"{_temp(cond.t_reference, s):.1f} {tu}")  # fmt: skip
    for line in (geo + "; " + circ + ".", mud + ".", "Density models: " + _models(run) + "."):
        row = note_row(ws, row, line, span=SPAN)
    row = note_row(
        ws, row,
        "ESD and ECD here integrate the local density down the well (the pressure feeds back "
        "into the density); the friction losses are those of the Hydraulics sheet. 'surface "
        "mud' columns use the surface mud weight everywhere, as the ECD sheet does.",
        span=SPAN,
    )  # fmt: skip
    # ---- key points
    row = heading(ws, row + 1, "At the weak points and the bit", span=SPAN)
    row = table_header(
        ws, row, 1,
        ["point", "MD", "ECD at T and p", "ECD surface mud", "difference", "ESD at T and p",
         "ESD surface mud", "difference"],
        ["", du, dn, dn, dn, dn, dn, dn],
    )  # fmt: skip
    fd = number_format("density", s)
    refs = {}
    for name, md, e, es, d, ds in key_points(results):
        put(ws, row, 1, name)
        put_number(ws, row, 2, _o(md, "depth", s), number_format("depth", s))
        for col, v in ((3, e), (4, es), (6, d), (7, ds)):
            put_number(ws, row, col, _o(v, "density", s), fd)
        put_number(ws, row, 5, _o(e, "density", s) - _o(es, "density", s), fd)
        put_number(ws, row, 8, _o(d, "density", s) - _o(ds, "density", s), fd)
        if name == "bit":
            refs["ecd_bit"] = ("Downhole", row, 3)
        row += 1
    # ---- charts, then the profile table
    chart_row = row + 1
    data_row = chart_row + 30
    cols = ["MD", "TVD", "T static", "T string", "T annulus", "density static",
            "density circulating", "ESD at T and p", "ESD surface mud", "ECD at T and p",
            "ECD surface mud"]  # fmt: skip
    units = [du, du, tu, tu, tu, dn, dn, dn, dn, dn, dn]
    r = heading(ws, data_row, "Profile down the well", span=SPAN)
    r = table_header(ws, r, 1, cols, units)
    r0 = r
    kinds = ["depth", "depth", *["temperature"] * 3, *["density"] * 6]
    arrays = [p.md, p.tvd, p.t_static, p.t_string, p.t_annulus, p.rho_static,
              p.rho_circulating, p.esd, p.esd_surface, p.ecd, p.ecd_surface]  # fmt: skip
    fmts = [number_format(k, s) for k in kinds]
    for i in range(1, p.md.size):
        for c, (arr, k, f) in enumerate(zip(arrays, kinds, fmts, strict=True), start=1):
            put_number(ws, r, c, _o(float(arr[i]), k, s), f)
        r += 1
    r1 = r - 1
    depth = (ws, 2, r0, r1)
    tmax = max(_temp(float(np.max(p.t_static)), s), _temp(float(np.max(p.t_annulus)), s))
    tmin = min(_temp(float(np.min(p.t_static)), s), _temp(float(np.min(p.t_string)), s))
    lo, hi, _step = nice_axis(tmin, tmax)
    tch = temperature_profile(
        depth,
        [("static (formation)", (ws, 3, r0, r1), "static"),
         ("string, circulating", (ws, 4, r0, r1), "string"),
         ("annulus, circulating", (ws, 5, r0, r1), "annulus")],
        temperature_unit=tu, depth_unit=du, x_limits=(lo, hi),
    )  # fmt: skip
    ws.add_chart(tch, f"A{chart_row}")
    vals = [_o(float(x), "density", s) for x in (*p.ecd[1:], *p.esd[1:], *p.ecd_surface[1:])]
    dlo, dhi, _step = nice_axis(min(vals), max(vals))
    dch = depth_profile(
        depth,
        [("ECD at T and p", (ws, 10, r0, r1), "ecd"),
         ("ECD surface mud", (ws, 11, r0, r1), "ecd_loaded"),
         ("ESD at T and p", (ws, 8, r0, r1), "esd"),
         ("ESD surface mud", (ws, 9, r0, r1), "pore")],
        density_unit=dn, depth_unit=du, x_limits=(dlo, dhi),
        title="ESD and ECD: at downhole T and p, and with the surface mud",
    )  # fmt: skip
    ws.add_chart(dch, f"G{chart_row}")
    setup_print(ws, title, fit_height=0)
    return refs


def downhole_data(results) -> dict | None:
    """The "downhole" block of ``--json`` (case units; None without ``[temperature]``)."""
    run = results.downhole
    if run is None:
        return None
    s = results.case.unit_system
    p, comp = run.profile, run.conditions.composition

    def dv(x, kind):
        return text.display_values(x, kind, s)

    return {
        "base_fluid": run.base_fluid,
        "composition_percent": {
            "oil": 100 * comp.oil,
            "water": 100 * comp.water,
            "solids": 100 * comp.solids,
        },
        "models": list(comp.models),
        "circulating_model": "holmes_swift_1970_steady" if p.circulating is not None else None,
        "ecd_bit": dv(p.ecd_bit, "density"),
        "ecd_bit_surface_mud": dv(float(p.ecd_surface[-1]), "density"),
        "esd_bit": dv(p.esd_bit, "density"),
        "esd_bit_surface_mud": dv(float(p.esd_surface[-1]), "density"),
        "points": [
            {
                "name": name,
                "md": dv(md, "depth"),
                "ecd": dv(e, "density"),
                "ecd_surface_mud": dv(es, "density"),
                "esd": dv(d, "density"),
                "esd_surface_mud": dv(ds, "density"),
            }
            for name, md, e, es, d, ds in key_points(results)
        ],
        "profile": {
            "md": dv(p.md[1:], "depth"),
            "tvd": dv(p.tvd[1:], "depth"),
            "temperature_static": dv(p.t_static[1:], "temperature"),
            "temperature_string": dv(p.t_string[1:], "temperature"),
            "temperature_annulus": dv(p.t_annulus[1:], "temperature"),
            "density_static": dv(p.rho_static[1:], "density"),
            "density_circulating": dv(p.rho_circulating[1:], "density"),
            "esd": dv(p.esd[1:], "density"),
            "ecd": dv(p.ecd[1:], "density"),
            "ecd_surface_mud": dv(p.ecd_surface[1:], "density"),
        },
    }
