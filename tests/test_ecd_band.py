"""The input-uncertainty band on ECD and SPP (calc.circulation.band), checked by brute force.

Outside checks:

* exact: laminar Newtonian friction is linear in μ·Q (Hagen-Poiseuille / Lamb annulus: every
  f = C/Re law), and μ of the least-squares Newtonian fit, Σγ̇τ/Σγ̇², is linear in the
  readings, so the ECD above the mud weight is linear in every input and the linear band is
  exact (closed form below);
* brute force, JCGM 101:2008 (GUM Supplement 1, propagation of distributions by Monte Carlo):
  the band against the spread of many evaluations of the whole circulating system with the
  inputs drawn independently and evenly over their half-widths (fixed seed);
* brute force, full two-level factorial design over every input (all 2⁸ corners; main effects
  as in Box, Hunter & Hunter, *Statistics for Experimenters*, 2nd ed. 2005, ch. 5): the
  dominant input, each input's effect and the worst case against the corner values.
"""

from __future__ import annotations

import itertools
import math

import numpy as np
import pytest

from calc.circulation import (
    BALANCE_RESOLUTION,
    BALANCE_RESOLUTION_PRESSURISED,
    circulate,
    ecd_band,
    hydraulics_fluid_from_readings,
)
from calc.circulation.band import annulus_ecd_band
from calc.errors import InputError
from calc.rheology import ViscometerReadings
from calc.units import to_si
from tests.demo_well import check, demo_options, demo_rate, demo_readings, demo_well, ppg

IDX = 1  # the demo case's second check (the report's latest)
SQRT3 = math.sqrt(3.0)  # half-width of an even (rectangular) spread / its standard deviation


@pytest.fixture(scope="module")
def demo():
    well, readings = demo_well(IDX), demo_readings(IDX)
    rho, q = ppg(check(IDX)["density"]), demo_rate(IDX)
    opts = demo_options(IDX)
    band = ecd_band(
        well,
        readings,
        rho,
        q,
        window=opts["window"],
        weak_points=opts["weak_points"],
        margins=opts["margins"],
    )
    return well, readings, rho, q, band


def _quantities(well, band, readings, rho, q):
    """Brute force: the whole circulating system at (readings, density array, rate array)."""
    fluid = hydraulics_fluid_from_readings(readings, "api13d_2010_hb", density=rho)
    res = circulate(well, fluid, q)
    mds = np.array([band.ecd_shoe.md, band.ecd_tightest.md])
    at = np.atleast_2d(res.ecd_at(mds)).reshape(-1, 2)
    return np.stack(
        [np.atleast_1d(res.ecd_bit), at[:, 0], at[:, 1], np.atleast_1d(res.standpipe_pressure)],
        axis=-1,
    )


def _order(band):
    return [band.ecd_bit, band.ecd_shoe, band.ecd_tightest, band.spp]


def _with_dial(readings, dial):
    return ViscometerReadings(readings.speeds, dial)


# ---------------------------------------------------------------------------- exact


def test_laminar_newtonian_band_is_the_closed_form():
    """Exact: laminar Newtonian flow, Δp ∝ μQ (Hagen-Poiseuille/Lamb) and μ = Σγ̇θ·s/Σγ̇²
    (least squares through the origin), so with E = ECD − ρ = Δp/(g·TVD):
    c_ρ = a_ρ (laminar friction has no density in it), c_Q = E·u, c_θi = E·a·γ̇_i/Σγ̇_jθ_j."""
    r = ViscometerReadings([600, 300, 200, 100, 6, 3], [60.0, 30.0, 20.0, 10.0, 0.6, 0.3])
    rho, q = ppg(10.0), to_si(80.0, "gpm")  # Re ≈ 700 in 8.5 × 5 in: laminar
    b = annulus_ecd_band(
        r, rho, q, [to_si(8.5, "in")], [to_si(5.0, "in")], [1000.0], 1000.0, method="newtonian"
    )
    e = b.nominal - rho
    assert e > 0
    c = b.contributions
    assert c["density"] == pytest.approx(BALANCE_RESOLUTION, rel=1e-9)
    assert c["flow_rate"] == pytest.approx(e * 0.03, rel=1e-9)
    gam = r.shear_rate
    expect = e * 0.5 * gam / np.sum(gam * r.dial)
    got = [x.effect for x in b.effects if x.input == "dial_readings"]
    np.testing.assert_allclose(got, expect, rtol=1e-7)
    w = math.sqrt(BALANCE_RESOLUTION**2 + (e * 0.03) ** 2 + float(np.sum(expect**2)))
    assert b.half_width == pytest.approx(w, rel=1e-7)
    assert b.dominant == "density"
    assert all(abs(x.curvature) <= 1e-9 * rho for x in b.effects)  # linear: no curvature


# ---------------------------------------------------------------------------- Monte Carlo


def test_band_matches_monte_carlo_spread(demo):
    """JCGM 101:2008: the inputs drawn independently and evenly over ±a_i (fixed seed), the
    whole system evaluated per draw; for a linear model √3·σ equals the root-sum-square band.

    Tolerance, derived: the sample standard deviation has a relative standard error
    √((κ − 1)/(4N)) (κ the sample kurtosis of the output: the large-sample variance of the
    sample variance, (μ₄ − σ⁴)/N, halved for σ — a standard result, from memory): 4 such
    errors; plus the spread the band's own second-order terms h_i add,
    √3·sd(h_i·t²) = √3·√(4/45)·Σ|h_i| for t even on [−1, 1] (cross terms neglected:
    near-linear regime, no ``band_not_linear`` note)."""
    well, readings, rho, q, band = demo
    assert not band.notes
    rng = np.random.default_rng(20261204)
    n = 240
    dial = readings.dial[None, :] + rng.uniform(-0.5, 0.5, (n, readings.dial.size))
    rhos = rho + rng.uniform(-1.0, 1.0, n) * BALANCE_RESOLUTION
    qs = q * (1.0 + rng.uniform(-0.03, 0.03, n))
    y = np.concatenate(
        [
            _quantities(well, band, _with_dial(readings, dial[i]), rhos[i : i + 1], qs[i : i + 1])
            for i in range(n)
        ]
    )
    for j, qb in enumerate(_order(band)):
        s = float(np.std(y[:, j], ddof=1))
        z = (y[:, j] - y[:, j].mean()) / s
        kurt = float(np.mean(z**4))
        se = math.sqrt((kurt - 1.0) / (4.0 * n))
        curv = sum(abs(e.curvature) for e in qb.effects)
        tol = 4.0 * se * qb.half_width + SQRT3 * math.sqrt(4.0 / 45.0) * curv
        assert SQRT3 * s == pytest.approx(qb.half_width, abs=tol), qb.quantity
        # the sum of half-widths (a wrong combination) would fail this check:
        assert abs(qb.worst_case - SQRT3 * s) > tol, qb.quantity


# ---------------------------------------------------------------------------- factorial


@pytest.fixture(scope="module")
def corners(demo):
    """Every corner of the 8 inputs (6 readings, density, rate): 64 refits × 4 in one call."""
    well, readings, rho, q, band = demo
    signs = np.array(list(itertools.product((-1.0, 1.0), repeat=readings.dial.size)))
    dr = np.array([(sr, sq) for sr in (-1.0, 1.0) for sq in (-1.0, 1.0)])
    ys = []
    for s in signs:
        r = _with_dial(readings, readings.dial + 0.5 * s)
        ys.append(
            _quantities(
                well, band, r, rho + BALANCE_RESOLUTION * dr[:, 0], q * (1 + 0.03 * dr[:, 1])
            )
        )
    # design matrix: (64·4, 8) signs, output (64·4, 4)
    x = np.array([[*s, *d] for s in signs for d in dr])
    return x, np.concatenate(ys)


def test_dominant_input_and_effects_match_the_factorial(demo, corners):
    """Main effect of input i = (mean at +a_i − mean at −a_i)/2 over all corners (Box, Hunter &
    Hunter ch. 5).  For any quadratic response it equals the linear coefficient·a_i exactly
    (squares are constant over the corners, products orthogonal), as does the band's central
    difference: the two differ only by third-order terms, bounded here by the band's
    second-order terms Σ|h_i| (each order smaller than the last in a near-linear regime)."""
    _, readings, _, _, band = demo
    x, y = corners
    nd = readings.dial.size
    for j, qb in enumerate(_order(band)):
        main = np.array(
            [(y[x[:, i] > 0, j].mean() - y[x[:, i] < 0, j].mean()) / 2 for i in range(8)]
        )
        mine = np.array(
            [e.effect for e in qb.effects if e.input == "dial_readings"]
            + [next(e.effect for e in qb.effects if e.input == k) for k in ("density", "flow_rate")]
        )
        curv = sum(abs(e.curvature) for e in qb.effects)
        np.testing.assert_allclose(mine, main, atol=curv + 1e-12 * abs(qb.nominal))
        groups = {
            "dial_readings": math.sqrt(float(np.sum(main[:nd] ** 2))),
            "density": abs(main[nd]),
            "flow_rate": abs(main[nd + 1]),
        }
        assert qb.dominant == max(groups, key=groups.get), qb.quantity
    assert band.ecd_bit.dominant == "density" and band.spp.dominant == "flow_rate"


def test_worst_case_matches_the_corner_range(demo, corners):
    """The worst case Σ|c_i| is half the range over the corners for a linear response.  With a
    quadratic remainder ½δᵀHδ the diagonal part is the same at every corner (cancels in the
    range); bounding the cross terms by the diagonal (|H_ij| ≤ √(H_ii·H_jj)) with the band's
    h_i = ½H_ii·a_i² gives |half-range − Σ|c_i|| ≤ (Σ√|h_i|)²."""
    _, _, _, _, band = demo
    _, y = corners
    for j, qb in enumerate(_order(band)):
        half = (y[:, j].max() - y[:, j].min()) / 2
        tol = sum(math.sqrt(abs(e.curvature)) for e in qb.effects) ** 2
        assert half == pytest.approx(qb.worst_case, abs=tol + 1e-12 * abs(qb.nominal))


# ---------------------------------------------------------------------------- structure


def test_nominal_and_method_spread(demo):
    """Regression values, reviewed: nominal = the report's circulate(); the spread holds the
    four published drilling methods (README methods table: 11.81 … 11.96 ppg at the bit)."""
    well, readings, rho, q, band = demo
    res = circulate(well, hydraulics_fluid_from_readings(readings, None, density=rho), q)
    assert band.ecd_bit.nominal == pytest.approx(res.ecd_bit, rel=1e-12)
    assert band.spp.nominal == pytest.approx(res.standpipe_pressure, rel=1e-12)
    names = [m for m, _ in band.ecd_bit.method_values]
    assert names == ["api13d_2010_hb", "api13d_1995_power_law", "bingham", "power_law"]
    lo, hi = band.ecd_bit.method_min, band.ecd_bit.method_max
    assert lo[0] == "api13d_1995_power_law" and hi[0] == "bingham"
    assert lo[1] <= band.ecd_bit.nominal <= hi[1]
    assert band.ecd_tightest.md == pytest.approx(band.ecd_tightest.point.md)
    assert band.tightest_limit == "fracture"
    assert band.evaluations <= 2 + 2 * readings.dial.size + 4
    assert band.ecd_bit.contributions["density"] == pytest.approx(BALANCE_RESOLUTION, rel=1e-3)
    assert BALANCE_RESOLUTION_PRESSURISED == pytest.approx(BALANCE_RESOLUTION / 2)


@pytest.mark.parametrize(
    "kw, name",
    [
        (dict(dial_resolution=-0.5), "dial-reading resolution"),
        (dict(balance_resolution=-1.0), "mud-balance resolution"),
        (dict(rate_uncertainty=-0.01), "flow-rate uncertainty"),
        (dict(rate_uncertainty=1.0), "flow-rate uncertainty"),
        (dict(balance_resolution=5000.0), "mud-balance resolution"),
        (dict(spread_methods=("nonsense",)), "hydraulics method"),
    ],
)
def test_bad_inputs_name_the_input(demo, kw, name):
    well, readings, rho, q, _ = demo
    with pytest.raises(InputError) as exc:
        ecd_band(well, readings, rho, q, **kw)
    assert name in str(exc.value)


def test_zero_resolutions_give_a_zero_band(demo):
    well, readings, rho, q, _ = demo
    b = ecd_band(
        well, readings, rho, q, dial_resolution=0, balance_resolution=0, rate_uncertainty=0,
        spread_methods=(),
    )  # fmt: skip
    assert b.ecd_bit.half_width == 0.0 and b.spp.half_width == 0.0
    assert b.ecd_bit.dominant == "" and b.ecd_bit.method_min is None
    # no window or weak points, but the casing's shoe test gives the margin table its shoe
    assert b.ecd_shoe is not None and b.ecd_shoe.point.role == "shoe"
    assert b.evaluations == 2  # the nominal call with margins and the density/rate call


# ---------------------------------------------------------------------------- worksheet

R2 = [[600, 68], [300, 44], [200, 35], [100, 25], [6, 10], [3, 9]]  # D2 05:30 of the demo


def test_worksheet_band_as_a_spreadsheet_calls_it():
    """BF_ECD_BAND with cell values (numbers, a readings range, interval columns, blanks,
    words) against calc.circulation.annulus_ecd_band called directly in SI."""
    from addin.sheets.functions import BF_ECD_BAND

    out = BF_ECD_BAND(11.2, R2, [[12.25], [8.6]], [[5.0], [5.0]], [[8200], [3680]], 10821, 522)
    assert isinstance(out, list) and len(out) == 1 and len(out[0]) == 3
    ecd, half, words = out[0]
    r = ViscometerReadings([s for s, _ in R2], [d for _, d in R2])
    b = annulus_ecd_band(
        r,
        ppg(11.2),
        to_si(522.0, "gpm"),
        to_si(np.array([12.25, 8.6]), "in"),
        to_si(np.array([5.0, 5.0]), "in"),
        to_si(np.array([8200.0, 3680.0]), "ft"),
        to_si(10821.0, "ft"),
    )
    assert ecd == pytest.approx(b.nominal / ppg(1.0), rel=1e-12)
    assert half == pytest.approx(b.half_width / ppg(1.0), rel=1e-12)
    assert words == "mud balance" and b.dominant == "density"
    # the words 'pressurised' and a number in the call's density unit give the same half-width
    p1 = BF_ECD_BAND(11.2, R2, 8.5, 5.0, 10000.0, 10000.0, 522.0, None, None, "pressurised")
    p2 = BF_ECD_BAND(11.2, R2, 8.5, 5.0, 10000.0, 10000.0, 522.0, None, None, 0.05)
    assert p1[0][1] == pytest.approx(p2[0][1], rel=1e-12)
    assert p1[0][1] < out[0][1]


@pytest.mark.parametrize(
    "args, words",
    [
        ((None, -0.5), "dial-reading resolution = -0.5"),
        ((None, None, -0.1), "mud-balance resolution = -0.1 ppg"),
        ((None, None, None, 1.5), "flow-rate uncertainty"),
        ((None, None, None, -0.01), "flow-rate uncertainty"),
        (("nonsense",), "method = 'nonsense'"),
        ((None, None, "digital"), "balance resolution = 'digital'"),
    ],
)
def test_worksheet_band_bad_input_gives_a_message_in_the_cell(args, words):
    from addin.sheets.functions import BF_ECD_BAND, MARK

    out = BF_ECD_BAND(11.2, R2, 8.5, 5.0, 10000.0, 10000.0, 522.0, *args)
    assert isinstance(out, str) and out.startswith(MARK) and words in out, out


# ---------------------------------------------------------------------------- report


def test_report_summary_json_and_case_inputs():
    """The Summary's added band rows and the --json ecd_band block carry the band of
    compute(); the [uncertainty] section changes it (a pressurised balance halves the density
    contribution: ECD is linear in ρ where the annulus is laminar, the closed form above)."""
    import tomllib

    import openpyxl
    from _report_demo import DEMO, demo_report_path, demo_results

    from addin.case import parse_case
    from addin.report import compute
    from addin.report.jsonout import results_data

    res = demo_results()
    band = res.band
    ws = openpyxl.load_workbook(demo_report_path())["Summary"]
    rows = [r for r in ws.iter_rows(values_only=True) if str(r[0]).startswith("± band:")]
    shown = [q.half_width / (ppg(1.0) if q.kind == "density" else to_si(1.0, "psi"))
             for q in band.quantities]  # fmt: skip
    assert [r[1] for r in rows] == pytest.approx(shown, rel=1e-12)
    assert "dominant: mud balance" in rows[0][0] and "clean mud" in rows[0][0]
    assert "dominant: flow rate" in rows[-1][0] and rows[-1][4] == "psi"
    assert rows[0][5].startswith(
        "11.82 ± 0.10 ppg; methods 11.81 ppg (API RP 13D (1995) power law)"
    )
    data = results_data(res)["ecd_band"]
    q0 = data["quantities"][0]
    assert q0["si"]["half_width"] == band.ecd_bit.half_width
    assert q0["half_width"] == pytest.approx(band.ecd_bit.half_width / ppg(1.0), rel=1e-12)
    assert q0["dominant"] == "density" and q0["method_spread"]["max"]["method"] == "bingham"
    assert data["inputs"]["balance_resolution"]["si"] == BALANCE_RESOLUTION
    doc = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    doc["uncertainty"] = {"balance": "pressurised"}
    b2 = compute(parse_case(doc, "demo.toml"), run_time="x").band
    assert b2.ecd_bit.contributions["density"] == pytest.approx(
        band.ecd_bit.contributions["density"] / 2, rel=1e-3
    )
    doc["uncertainty"] = {"rate_uncertainty": 1.2}
    with pytest.raises(InputError, match=r"demo\.toml: uncertainty\.rate_uncertainty"):
        compute(parse_case(doc, "demo.toml"), run_time="x")


def test_a_wide_rate_band_is_flagged_not_linear(demo):
    """SPP grows about as Q^1.8–Q² (turbulent string; bit: Bernoulli), so ±70 % of rate has a
    second-order term of u²/(2u) = u/2 = 0.35 of the half-width for Q² (0.29 measured) above
    0.2·W: the band carries the band_not_linear note on the SPP for the flow rate; ±3 % does
    not (u/2 = 0.015)."""
    well, readings, rho, q, band = demo
    assert not band.notes
    wide = ecd_band(well, readings, rho, q, rate_uncertainty=0.7, spread_methods=())
    hits = [(n.value("quantity").value, n.value("input").value) for n in wide.notes]
    assert ("standpipe pressure", "the flow rate") in hits
    assert all(n.code == "band_not_linear" and n.level == "info" for n in wide.notes)


def test_uncertainty_section_round_trips_through_the_report_inputs(tmp_path):
    """The [uncertainty] section is echoed on the report's Inputs sheet (workbook block
    "§ uncertainty") and parses back to the same case (same inputs hash) and the same band."""
    import tomllib

    from _report_demo import DEMO

    from addin.case import parse_case
    from addin.report import compute, write_report
    from addin.workbook_input import read_blocks

    doc = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    doc["uncertainty"] = {"balance": "pressurised", "rate_uncertainty": 0.05, "dial_resolution": 1}
    case = parse_case(doc, "demo.toml")
    res = compute(case, run_time="x")
    out = tmp_path / "r.xlsx"
    write_report(res, out)
    back_doc, _ = read_blocks(out)
    back = parse_case(back_doc, "report")
    assert back.hash == case.hash
    b2 = compute(back, run_time="x").band
    assert b2.rate_uncertainty == 0.05 and b2.dial_resolution == 1.0
    assert b2.balance_resolution == pytest.approx(BALANCE_RESOLUTION_PRESSURISED, rel=1e-12)
    assert b2.spp.half_width == pytest.approx(res.band.spp.half_width, rel=1e-12)


def test_edge_readings_one_sided_and_methods_left_out(demo):
    """A zero 3-rpm reading cannot go below 0 and a reading tied with the next speed cannot
    rise past it (the check would fall with speed): those differences are one-sided.  The
    1995 annulus pair (0 < θ3 < θ100) and the log-log fit (all readings > 0) cannot use θ3 = 0:
    they are left out of the spread with a note, and the report still gets its band."""
    well, _, rho, q, _ = demo
    r = ViscometerReadings([600, 300, 200, 100, 6, 3], [68, 44, 35, 35, 0, 0])
    b = ecd_band(well, r, rho, q)
    by_rpm = {e.rpm: e for e in b.ecd_bit.effects if e.input == "dial_readings"}
    assert (by_rpm[3.0].low_input, by_rpm[3.0].high_input) == (0.0, 0.5)
    assert (by_rpm[100.0].low_input, by_rpm[100.0].high_input) == (34.5, 35.0)
    assert by_rpm[3.0].curvature == 0.0  # one-sided: no second-order term
    assert b.spread_methods == ("api13d_2010_hb", "bingham")
    skipped = {n.value("method").value for n in b.notes if n.code == "band_method_skipped"}
    assert skipped == {"api13d_1995_power_law", "power_law"}
    assert b.ecd_bit.half_width > 0
