"""The demo workbook, rebuilt by its script and computed headlessly by PyPI ``formulas`` with
the boreflow functions registered: every result cell compared with calc called directly."""

import importlib.util
import math
import sys
from pathlib import Path

import numpy as np
import openpyxl
import pytest

from addin.sheets.engine import calculate
from calc import bit as cb
from calc import cautions
from calc import circulation as cc
from calc import flow as cf
from calc import rheology as cr
from calc import surge as cs
from calc import units as cu
from calc.cleaning.indicators import carrying_capacity_index
from calc.cleaning.transport import Cuttings, annular_transport, annular_velocity

ROOT = Path(__file__).resolve().parents[1]
_spec = importlib.util.spec_from_file_location(
    "build_demo_workbook", ROOT / "workbooks" / "build_demo_workbook.py"
)
builder = importlib.util.module_from_spec(_spec)
sys.modules["build_demo_workbook"] = builder  # dataclasses look their module up
_spec.loader.exec_module(builder)

MAIN = builder.SHEET.upper()
PPG, GPM, INCH, FT, PSI = (cu.si_factor(u) for u in ("ppg", "gpm", "in", "ft", "psi"))


def oil(value_si, kind):
    return cu.from_si(value_si, cu.unit_for(kind, "oilfield"), kind)


@pytest.fixture(scope="module")
def book(tmp_path_factory):
    path = tmp_path_factory.mktemp("wb") / "demo.xlsx"
    layout = builder.build(path)
    values = calculate(path)
    formulas_at = {}
    wb = openpyxl.load_workbook(path)
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            for c in row:
                v = c.value
                text = getattr(v, "text", v)
                if isinstance(text, str) and text.startswith("="):
                    formulas_at[(ws.title.upper(), c.coordinate)] = text
    return layout, values, formulas_at


def _geometry(intervals):
    """(hole IDs, pipe ODs, lengths) [m] of annular intervals as the sheet holds them."""
    rows = [(iv.d_outer * INCH, iv.d_inner * INCH, round(iv.length, 2) * FT) for iv in intervals]
    return [np.array(col) for col in zip(*rows, strict=True)]


class Checker:
    def __init__(self, values):
        self.values = values
        self.seen = set()

    def __call__(self, sheet, addr, expected, rel=1e-10):
        got = self.values[(sheet, addr)]
        self.seen.add((sheet, addr))
        if isinstance(expected, str):
            assert got == expected, (sheet, addr, got)
        else:
            assert isinstance(got, int | float) and math.isfinite(got), (sheet, addr, got)
            assert got == pytest.approx(expected, rel=rel, abs=1e-12), (sheet, addr)


def test_committed_workbook_is_current(tmp_path):
    # the committed file must be what the script builds (formula text identical; the file is
    # shipped computed, so the stored values are those of a fresh computation)
    fresh = tmp_path / "fresh.xlsx"
    builder.build(fresh, computed=True)

    def cells(p):
        wb = openpyxl.load_workbook(p)
        return {
            (ws.title, c.coordinate): getattr(c.value, "text", c.value)
            for ws in wb.worksheets
            for row in ws.iter_rows()
            for c in row
            if c.value is not None
        }

    assert cells(fresh) == cells(ROOT / "workbooks" / "demo-workbook.xlsx")


def test_every_result_cell_equals_calc(book):
    lay, values, formulas_at = book
    check = Checker(values)
    c = lay.cells
    d = lay.check
    rho, q = d["density"] * PPG, d["flow_rate"] * GPM
    speeds = sorted((float(k) for k in d["dial"]), reverse=True)
    r = cr.ViscometerReadings(speeds, [d["dial"][f"{s:g}"] for s in speeds])

    check(MAIN, c["caution"], cautions.CELL)
    check(MAIN, c["version"], f"boreflow {__import__('calc').__version__}")
    # rheology
    check(MAIN, c["pv"], oil(r.pv, "viscosity"))
    check(MAIN, c["yp"], oil(r.yp, "stress"))
    check(MAIN, c["lsyp"], oil(r.lsyp, "stress"))
    check(MAIN, c["av"], oil(r.av, "viscosity"))
    hb = cr.fit(r, "api13d_2010_hb").model
    check(MAIN, c["tau_y"], oil(hb.tau_y, "stress"))
    check(MAIN, c["k"], oil(hb.k, "consistency"))
    check(MAIN, c["n"], hb.n)
    fs = cr.fit_all(r)
    top = c["fits"].split(":")[0]
    col0, row0 = top[0], int(top[1:])
    for i, entry in enumerate(fs.ranking):
        m = fs[entry.method].model
        row = row0 + 1 + i
        check(MAIN, f"{col0}{row}", float(entry.rank))
        check(MAIN, f"{chr(ord(col0) + 1)}{row}", entry.method)
        check(MAIN, f"{chr(ord(col0) + 3)}{row}", oil(m.tau_y, "stress"))
        check(MAIN, f"{chr(ord(col0) + 4)}{row}", oil(m.k, "consistency"))
        check(MAIN, f"{chr(ord(col0) + 5)}{row}", m.n)
        check(MAIN, f"{chr(ord(col0) + 6)}{row}", entry.r2)
    # losses, interval by interval (API RP 13D 2010 HB, the default method)
    fluid = cc.hydraulics_fluid_from_readings(r, density=rho)
    tp, kp, np_ = fluid.pipe_parameters
    ta, ka, na = fluid.annulus_parameters
    sums = {"surface": 0.0, "string": 0.0, "annulus": 0.0}
    shoe_sum = 0.0
    for iv, addr in zip(lay.intervals, lay.loss_cells, strict=True):
        if iv.path == "annulus":
            res = cf.annulus_flow(
                q, iv.d_outer * INCH, iv.d_inner * INCH, density=rho, tau_y=ta, k=ka, n=na
            )
        else:
            res = cf.pipe_flow(q, iv.d_outer * INCH, density=rho, tau_y=tp, k=kp, n=np_)
        loss = res.gradient * round(iv.length, 2) * FT
        check(MAIN, addr, oil(loss, "pressure"))
        sums[iv.path] += loss
        if iv.above_shoe:
            shoe_sum += loss
    check(MAIN, c["surface"], oil(sums["surface"], "pressure"))
    check(MAIN, c["string_loss"], oil(sums["string"], "pressure"))
    check(MAIN, c["annulus_loss"], oil(sums["annulus"], "pressure"))
    check(MAIN, c["annulus_shoe"], oil(shoe_sum, "pressure"))
    bit = cb.Bit(8.5 * INCH, nozzles=" ".join(str(n) for n in [12, 12, 12, 11, 11, 11]))
    bh = cb.bit_hydraulics(q, rho, bit)
    check(MAIN, c["bit_dp"], oil(bh.pressure_drop, "pressure"))
    check(MAIN, c["tools"], 320.0)
    spp = oil(sums["surface"] + sums["string"] + sums["annulus"] + bh.pressure_drop, "pressure")
    check(MAIN, c["spp"], spp + 320.0)
    check(MAIN, c["spp_gap"], spp + 320.0 - d["measured_spp"])
    # bit table
    top = c["bit_table"].split(":")[0]
    col0, row0 = top[0], int(top[1:])
    for i, (value, kind) in enumerate(
        [
            (bh.tfa, "area"),
            (bh.nozzle_velocity, "jet_velocity"),
            (bh.pressure_drop, "pressure"),
            (bh.hydraulic_power, "power"),
            (bh.hsi, "power_density"),
            (bh.impact_force, "force"),
        ]
    ):
        check(MAIN, f"{chr(ord(col0) + 1)}{row0 + 1 + i}", oil(value, kind))
    # hydrostatic and ECD
    tvd_bit = round(lay.tvd["bit"], 2) * FT
    tvd_shoe = round(lay.tvd["shoe"], 2) * FT
    check(MAIN, c["hydrostatic"], oil(cc.hydrostatic_pressure(rho, tvd_bit), "pressure"))
    ecd_shoe = cc.equivalent_circulating_density(rho, shoe_sum, tvd_shoe)
    ecd_bit = cc.equivalent_circulating_density(rho, sums["annulus"], tvd_bit)
    check(MAIN, c["ecd_shoe"], oil(ecd_shoe, "density"))
    check(MAIN, c["ecd_bit"], oil(ecd_bit, "density"))
    check(MAIN, c["ecd_gap"], oil(ecd_bit, "density") - d["pwd"]["ecd"])
    qc = cf.critical_flow_rate(8.6 * INCH, 5 * INCH, density=rho, tau_y=ta, k=ka, n=na)
    check(MAIN, c["crit_rate"], oil(qc, "flow_rate"))
    # hole cleaning per annular interval
    cut = Cuttings(d["cuttings"]["size"] * INCH, 2600.0)
    rop = cu.to_si(d["rop"], "ft/hour")
    for iv, cm in lay.cleaning_rows:
        d2, d1 = iv.d_outer * INCH, iv.d_inner * INCH
        tr = annular_transport(
            q, d2, d1, density=rho, k=ka, tau_y=ta, n=na, cuttings=cut, rop=rop,
            bit_diameter=8.5 * INCH,
        )  # fmt: skip
        va = annular_velocity(q, d2, d1)
        check(MAIN, cm["av"], oil(va, "velocity"))
        check(MAIN, cm["slip"], oil(tr.slip_velocity, "velocity"))
        check(MAIN, cm["tr"], tr.transport_ratio)
        cci = carrying_capacity_index(va, density=rho, k=ka, tau_y=ta, n=na).cci
        check(MAIN, cm["cci"], cci)
        check(MAIN, cm["conc"], tr.concentration)
        crit = cf.critical_flow_rate(d2, d1, density=rho, tau_y=ta, k=ka, n=na)
        check(MAIN, cm["crit"], oil(crit, "flow_rate"))
        label_row = int(cm["av"][1:])
        check(MAIN, f"A{label_row}", iv.name)
    # gel break per string/annulus row and its total (4τL/ΔD, calc.surge.gel_break_pressure)
    tau_g = cu.to_si(d["gels"]["10min"], "lbf_per_100ft_sq")
    g_first, g_last = lay.surge["gel_rows"]
    gel = {}
    for i, iv in enumerate(lay.intervals):
        row = 35 + i
        if g_first <= row <= g_last:
            di = 0.0 if iv.d_inner is None else iv.d_inner * INCH
            gel[row] = cs.gel_break_pressure(tau_g, iv.d_outer * INCH, round(iv.length, 2) * FT, di)
            check(MAIN, f"G{row}", oil(gel[row], "pressure"))
    check(MAIN, c["gel_break"], oil(sum(gel.values()), "pressure"))
    ann_gel = sum(v for row, v in gel.items() if lay.intervals[row - 35].path == "annulus")
    check(MAIN, c["gel_emw"], oil(cs.trip_emw(rho, ann_gel, tvd_bit), "density"))
    # surge and swab at the bit for the planned speeds (calc.surge.interval_surge)
    ann = [iv for iv in lay.intervals if iv.path == "annulus"]
    geo = _geometry(ann)
    kw = dict(density=rho, tau_y=ta, k=ka, n=na)
    top, bottom = lay.surge["rows"]
    for cell, src in lay.surge["names"]:
        check(MAIN, cell, values[(MAIN, src)])
    for col, speed, direction in lay.surge["columns"]:
        res = cs.interval_surge(cu.to_si(speed, "ft/min"), *geo, direction=direction, **kw)
        for i in range(bottom - top + 1):
            check(MAIN, f"{col}{top + i}", oil(res.pressure_change[i], "pressure"))
        check(MAIN, f"{col}{lay.surge['total_row']}", oil(res.total_pressure_change, "pressure"))
        emw = cs.trip_emw(rho, res.total_pressure_change, tvd_bit)
        check(MAIN, f"{col}{lay.surge['emw_row']}", oil(emw, "density"))
    # trip-speed limits (calc.surge.trip_speed_limit against calc.surge.trip_allowance)
    sand_geo = _geometry(lay.surge["sand_intervals"])
    sand_tvd = values[(MAIN, c["sand_tvd"])] * FT
    shoe_n = lay.surge["shoe_rows"][1] - lay.surge["shoe_rows"][0] + 1
    shoe_geo = [g[:shoe_n] for g in geo]
    for name, g, lim_name, tvd, direction in (
        ("run_sand", sand_geo, "surge_lim_sand", sand_tvd, "running"),
        ("run_shoe", shoe_geo, "surge_lim_shoe", tvd_shoe, "running"),
        ("pull_bit", geo, "swab_lim", tvd_bit, "pulling"),
    ):
        limit = values[(MAIN, c[lim_name])] * PPG
        allow = cs.trip_allowance(limit, rho, tvd, direction)
        got = cs.trip_speed_limit(allow, *g, direction=direction, **kw).max_speed
        check(MAIN, c[name], oil(got, "trip_speed"))
    # rate sweep (array formulas)
    rates = np.array(lay.sweep_rates) * GPM
    tfa = bit.tfa
    dp = cb.bit_pressure_drop(rates, rho, tfa)
    ann = cf.annulus_flow(rates, 8.6 * INCH, 5 * INCH, density=rho, tau_y=ta, k=ka, n=na)
    vj = cb.nozzle_velocity(rates, tfa)
    for i in range(len(rates)):
        check("RATE SWEEP", lay.sweep_cells["B"][i], oil(dp[i], "pressure"))
        check("RATE SWEEP", lay.sweep_cells["C"][i], oil(ann.gradient[i], "pressure_gradient"))
        check("RATE SWEEP", lay.sweep_cells["D"][i], oil(vj[i], "jet_velocity"))
    # units sheet
    for i, kind in enumerate(cu.UNIT_SYSTEMS["oilfield"]):
        check("UNITS", f"A{3 + i}", kind)
        check("UNITS", f"B{3 + i}", cu.label(cu.unit_for(kind, "oilfield")))

    # every formula cell of the workbook was compared (array formulas by their first cell)
    anchors = {k for k in formulas_at}
    missing = sorted(anchors - check.seen)
    # array-formula anchors are the header cell of their spilled table: check them by value
    for sheet, addr in list(missing):
        if values[(sheet, addr)] in ("rank", "quantity"):
            missing.remove((sheet, addr))
    units_anchor = ("UNITS", "A2")
    if units_anchor in missing and values[units_anchor] == "quantity":
        missing.remove(units_anchor)
    assert not missing, f"formula cells not compared with calc: {missing}"


def test_no_cell_holds_an_error(book):
    _, values, _ = book
    errors = {k: v for k, v in values.items() if isinstance(v, str) and v.startswith("#")}
    assert not errors, errors
