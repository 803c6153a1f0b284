"""Stationary cuttings beds (calc.cleaning.bed): geometry against exact circle-segment results,
the equilibrium closure against the Larsen critical velocity, friction over the bed through the
annulus law, circulation before a trip, bad input, and the demo well (invented data)."""

from __future__ import annotations

import numpy as np
import pytest
from scipy.integrate import quad

from calc.cleaning import (
    BED_METHODS,
    bed_geometry,
    bed_height,
    circulation_factor,
    cleanup_circulation,
    cuttings_bed,
    larsen_critical_velocity,
    no_bed_rate,
    well_cuttings_beds,
)
from calc.errors import InputError
from calc.flow import annulus_flow
from calc.geometry import Survey, Well
from tests.cleaning_demo import demo_cuttings, demo_fluid, demo_rate, demo_rop, demo_well, ft

D2, D1 = 0.2159, 0.127  # 8-1/2 in hole, 5 in pipe
KW = dict(rop=0.0049, density=1318.0, k=0.02, tau_y=7.0, n=1.0, cuttings_size=0.00635)


def _segment_by_quadrature(d, h):
    """Area of a circle (diameter d) below height h from the low side: ∫ 2√(y(d − y)) dy
    (exact integral of the chord width, evaluated numerically by scipy)."""
    return quad(lambda y: 2.0 * np.sqrt(max(y * (d - y), 0.0)), 0.0, min(h, d))[0]


@pytest.mark.parametrize("h", [0.01, 0.05, 0.1, 0.127, 0.16, 0.2])
def test_bed_area_is_the_circle_segments(h):
    # exact geometry: bed = hole segment below h − pipe segment below h (pipe on the low side)
    g = bed_geometry(h, D2, D1)
    expect = _segment_by_quadrature(D2, h) - _segment_by_quadrature(D1, h)
    assert g.bed_area == pytest.approx(expect, rel=1e-7)
    assert g.open_area == pytest.approx(np.pi / 4 * (D2**2 - D1**2) - expect, rel=1e-9)


def test_hydraulic_diameter_limits():
    # no bed: D_h of a concentric annulus is D2 − D1 (the textbook hydraulic diameter)
    assert bed_geometry(0.0, D2, D1).hydraulic_diameter == pytest.approx(D2 - D1, rel=1e-12)
    # half-full open pipe: D_h = 4(πR²/2)/(πR + D) (exact)
    r = 0.1
    g = bed_geometry(r, 2 * r, 0.0)
    assert g.hydraulic_diameter == pytest.approx(4 * (np.pi * r * r / 2) / (np.pi * r + 2 * r))
    # pipe fully buried (h > D1): open area is the hole's upper segment, P = arc + chord
    h = 0.15
    g = bed_geometry(h, D2, D1)
    top = _segment_by_quadrature(D2, D2 - h)
    theta = np.arccos((D2 / 2 - (D2 - h)) / (D2 / 2))
    per = D2 * theta + 2 * np.sqrt(h * (D2 - h))
    assert g.open_area == pytest.approx(top, rel=1e-7)
    assert g.wetted_perimeter == pytest.approx(per, rel=1e-12)


def test_bed_height_inverts_the_area():
    hs = np.array([0.0, 0.02, 0.09, 0.13, 0.2])
    a = np.asarray(bed_geometry(hs, D2, D1).bed_area)
    assert np.allclose(bed_height(a, D2, D1), hs, atol=1e-9)


def test_equilibrium_bed_against_the_larsen_critical_velocity():
    q = np.array([0.005, 0.01, 0.02, 0.03, 0.06])
    r = cuttings_bed(q, D2, D1, inclination=70.0, **KW)
    lar = larsen_critical_velocity(
        KW["rop"], D2, D1, density=KW["density"], k=KW["k"], tau_y=KW["tau_y"], n=KW["n"],
        cuttings_size=KW["cuttings_size"], inclination=70.0,
    )  # fmt: skip
    a_ann = np.pi / 4 * (D2**2 - D1**2)
    below = q < lar.critical_rate
    assert below.any() and (~below).any()
    assert np.array_equal(r.forms, below)
    # equilibrium: the bed leaves exactly Q/V_crit open (Larsen et al. 1997, bed below CTFV)
    assert np.allclose(r.bed_area[below], a_ann - q[below] / lar.critical_velocity, rtol=1e-12)
    assert np.allclose(r.velocity_over_bed[below], lar.critical_velocity, rtol=1e-9)
    assert np.all(r.bed_area[~below] == 0.0)
    # the bed shrinks as the rate rises
    assert np.all(np.diff(r.bed_height) <= 0)
    assert r.no_bed_rate == pytest.approx(lar.critical_rate, rel=1e-12)


def test_friction_over_the_bed_is_the_annulus_law_on_the_open_area():
    q = 0.015
    r = cuttings_bed(q, D2, D1, inclination=80.0, **KW)
    assert r.forms
    dh, a = r.hydraulic_diameter, r.open_area
    s = 4 * a / (np.pi * dh)
    ref = annulus_flow(q, (s + dh) / 2, (s - dh) / 2, density=KW["density"], tau_y=KW["tau_y"],
                       k=KW["k"], n=KW["n"], method="api13d_2010_hb")  # fmt: skip
    assert r.gradient_bed == pytest.approx(ref.gradient, rel=1e-12)
    # the equivalent annulus carries the same velocity as the open area (continuity)
    assert ref.velocity == pytest.approx(q / a, rel=1e-12)
    assert r.gradient_bed > r.gradient_clean  # a bed narrows the flow: more friction


def test_no_bed_rate_by_bisection_matches_larsen_rate():
    incs = np.array([40.0, 60.0, 90.0])
    q0 = no_bed_rate(D2, D1, inclination=incs, **KW)
    r = cuttings_bed(np.asarray(q0) * 1.000001, D2, D1, inclination=incs, **KW)
    assert np.allclose(q0, r.no_bed_rate, rtol=1e-9)
    assert not np.any(r.forms)
    assert np.all(cuttings_bed(np.asarray(q0) * 0.999, D2, D1, inclination=incs, **KW).forms)


def test_no_bed_below_onset_and_notes():
    r = cuttings_bed(0.005, D2, D1, inclination=np.array([20.0, 40.0, 70.0]), **KW)
    assert r.forms.tolist() == [False, True, True]
    assert np.isinf(r.no_bed_rate[0])
    codes = {n.code for n in r.notes}
    assert "bed_angle_extrapolated" in codes  # 40° is below Larsen's 55-90°
    assert "thick_cuttings_bed" in codes


@pytest.mark.parametrize(
    "kwargs, name",
    [
        (dict(q=-0.01), "flow rate"),
        (dict(d_pipe=0.3), "pipe diameter"),
        (dict(inclination=200.0), "inclination"),
        (dict(onset=95.0), "bed onset inclination"),
    ],
)
def test_bad_input_names_the_input(kwargs, name):
    args = dict(q=0.01, d_hole=D2, d_pipe=D1, inclination=70.0, **KW)
    args.update(kwargs)
    with pytest.raises(InputError) as e:
        cuttings_bed(**args)
    assert e.value.name == name


def test_circulation_factors_common_practice():
    # common practice (values from memory, not checked against a source — calc/METHODS.md §10.16)
    assert circulation_factor([5.0, 20.0, 45.0, 75.0], 0.2159).tolist() == [1.3, 1.4, 1.6, 1.7]
    assert circulation_factor([5.0, 20.0, 45.0, 75.0], 0.4445).tolist() == [1.5, 1.7, 2.5, 3.0]
    assert circulation_factor(45.0, 0.31115) == 1.8
    c = cleanup_circulation(0.04, [0.3, 0.2159], [0.127, 0.127], [2000.0, 1000.0], [0.0, 50.0])
    v = np.pi / 4 * (np.array([0.3, 0.2159]) ** 2 - 0.127**2) * np.array([2000.0, 1000.0])
    m = np.array([1.3, 1.6])  # 0.3 m is nearest the 12-1/4 in column; 8-1/2 in at 50°
    assert c.bottoms_up_count == pytest.approx((v * m).sum() / v.sum(), rel=1e-12)
    assert c.circulating_time == pytest.approx((v * m).sum() / 0.04, rel=1e-12)
    assert c.bottoms_up_time == pytest.approx(v.sum() / 0.04, rel=1e-12)


def test_registered_with_status():
    info = BED_METHODS.get("larsen_1997_equilibrium_bed")
    assert info.status.kind == "from_memory"
    assert info.status.caveats


def test_demo_well_has_no_bed_below_onset():
    # the demo holds about 30° (below the 35° onset): no interval may carry a bed
    w = demo_well()
    b = well_cuttings_beds(w, demo_fluid(), demo_rate(), rop=demo_rop(), cuttings=demo_cuttings())
    assert b.max_inclination < 35.0
    assert not np.any(b.bed.forms) and b.worst is None
    assert b.extra_loss == 0.0 and b.ecd_increment == 0.0
    assert np.isinf(b.no_bed_rate)
    a = w.flow_intervals().annulus
    vol = np.pi / 4 * (np.asarray(a.outer_diameter) ** 2 - np.asarray(a.inner_diameter) ** 2)
    assert b.cleanup.annular_volume == pytest.approx(float((vol * a.length).sum()), rel=1e-12)


def _high_angle_well():
    """The demo well's hole and string on an invented build to 75° (for the bed cases)."""
    w = demo_well()
    md = ft(np.array([0.0, 3000.0, 5000.0, 7000.0, 12500.0]))
    sv = Survey(md, np.array([0.0, 0.0, 40.0, 75.0, 75.0]), np.full(5, 135.0))
    return Well(sv, w.hole, w.string, w.bit, w.surface_lines, w.tool_drops, w.bit_depth)


def test_high_angle_well_beds_and_ecd():
    w = _high_angle_well()
    fl = demo_fluid()
    q = 0.6 * demo_rate()
    b = well_cuttings_beds(w, fl, q, rop=demo_rop(), cuttings=demo_cuttings())
    assert np.any(b.bed.forms)
    inc = np.asarray(w.flow_intervals().annulus.inclination)
    assert not np.any(b.bed.forms & (inc < 35.0))
    # extra loss: Σ max(G_bed − G_clean, 0)·L over bed intervals, as EMW at the bit over g·TVD
    f = b.bed.forms
    dp = float(np.sum(np.maximum(b.bed.gradient_bed - b.bed.gradient_clean, 0)[f] * b.length[f]))
    assert b.extra_loss == pytest.approx(dp, rel=1e-12) and dp > 0
    assert b.ecd_increment == pytest.approx(dp / (9.80665 * w.tvd_at(w.bit_depth)), rel=1e-12)
    # at the no-bed rate no interval carries a bed
    b2 = well_cuttings_beds(w, fl, b.no_bed_rate * 1.0001, rop=demo_rop(),
                            cuttings=demo_cuttings())  # fmt: skip
    assert not np.any(b2.bed.forms)
    # at the check's rate a thin bed under tight tool joints lowers the D_h friction: not credited
    b3 = well_cuttings_beds(w, fl, demo_rate(), rop=demo_rop(), cuttings=demo_cuttings())
    low = b3.bed.forms & (b3.bed.gradient_bed < b3.bed.gradient_clean)
    assert low.any() and b3.ecd_increment >= 0.0
    assert "bed_friction_not_credited" in {n.code for n in b3.notes}


def test_worksheet_functions_as_a_spreadsheet_calls_them(tmp_path):
    """A small workbook with the bed functions in formulas, computed headlessly by PyPI
    ``formulas`` (addin.sheets.engine), compared with calc called directly."""
    openpyxl = pytest.importorskip("openpyxl")
    pytest.importorskip("formulas")
    from addin.sheets.engine import calculate
    from calc.circulation import hydraulics_fluid_from_readings
    from calc.rheology import ViscometerReadings
    from calc.units import from_si, to_si

    dial = [(600, 64), (300, 42), (200, 34), (100, 26), (6, 10), (3, 8)]
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Beds"
    for i, (rpm, deg) in enumerate(dial, start=1):
        ws.cell(row=i, column=4, value=rpm)
        ws.cell(row=i, column=5, value=deg)
    ws["A1"], ws["A2"], ws["A3"], ws["A4"], ws["A5"] = 11.0, 0.25, 8.5, 5.0, 70.0
    ws["A6"], ws["A7"] = 300.0, 60.0
    ws["B1"] = "=BF_BED_HEIGHT(A1,D1:E6,A2,A3,A4,A5,A6,A7)"
    ws["B2"] = "=BF_BED_AREA(A1,D1:E6,A2,A3,A4,A5,A6,A7)"
    ws["B3"] = "=BF_NO_BED_RATE(A1,D1:E6,A2,A3,A4,A5,A7)"
    ws["B4"] = "=BF_BU_FACTOR(A5,A3)"
    ws["B5"] = "=BF_NO_BED_RATE(A1,D1:E6,A2,A3,A4,20,A7)"
    path = tmp_path / "beds.xlsx"
    wb.save(path)
    got = calculate(path)
    r = ViscometerReadings([d[0] for d in dial], [d[1] for d in dial])
    fl = hydraulics_fluid_from_readings(r, density=to_si(11.0, "ppg"))
    ty, k, n = fl.annulus_parameters
    kw = dict(inclination=70.0, rop=to_si(60.0, "ft/hour"), density=fl.density, k=k, tau_y=ty,
              n=n, cuttings_size=to_si(0.25, "in"))  # fmt: skip
    ref = cuttings_bed(to_si(300.0, "gpm"), to_si(8.5, "in"), to_si(5.0, "in"), **kw)
    assert ref.forms
    assert got[("BEDS", "B1")] == pytest.approx(from_si(ref.bed_height, "in"), rel=1e-9)
    assert got[("BEDS", "B2")] == pytest.approx(ref.bed_fraction, rel=1e-9)
    assert got[("BEDS", "B3")] == pytest.approx(from_si(ref.no_bed_rate, "gpm"), rel=1e-9)
    assert got[("BEDS", "B4")] == 1.7  # 8-1/2 in column, above 60° (common practice)
    assert str(got[("BEDS", "B5")]).startswith("#BF! inclination")


def test_report_block_and_json_on_a_high_angle_well():
    """The Cleaning-sheet block and the --json block list the bed intervals (invented well)."""
    from types import SimpleNamespace

    import openpyxl

    from addin.report.sheet_beds import beds_data, write_beds
    from addin.xlsx_cells import add_styles
    from calc.units import from_si

    w = _high_angle_well()
    b = well_cuttings_beds(w, demo_fluid(), 0.6 * demo_rate(), rop=demo_rop(),
                           cuttings=demo_cuttings())  # fmt: skip
    results = SimpleNamespace(beds=b, case=SimpleNamespace(unit_system="oilfield"))
    wb = openpyxl.Workbook()
    add_styles(wb)
    ws = wb.active
    end = write_beds(ws, 1, results)
    rows = [[c.value for c in r] for r in ws.iter_rows(min_row=1, max_row=end)]
    bed_rows = [r for r in rows if r[13] == "bed"]
    assert len(bed_rows) == int(np.sum(b.bed.forms))
    i = int(np.flatnonzero(b.bed.forms)[0])
    assert bed_rows[0][6] == pytest.approx(from_si(float(b.bed.bed_height[i]), "in"), rel=1e-12)
    data = beds_data(results)
    assert sum(x["bed"] for x in data["intervals"]) == len(bed_rows)
    assert data["no_bed_rate"] == pytest.approx(from_si(b.no_bed_rate, "gpm"), rel=1e-12)
