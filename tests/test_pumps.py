"""Mud pumps (calc.pumps): volume per stroke against the cylinder geometry, rate ↔ spm, several
pumps, bad input, and the pump limits of the operating window on the demo case.

External check: the displacement per stroke is the swept volume of the cylinders — triplex
single-acting V = π/4·d²·L·3·η, duplex double-acting V = π/4·(2d² − d_rod²)·L·2·η
(Bourgoyne, Millheim, Chenevert & Young 1986, *Applied Drilling Engineering*, SPE Textbook
Series vol. 2, §4.2; quoted from memory).  The field forms checked here are the same
geometry in oilfield units: triplex gal/stk = 3·(π/4)·d²[in]·L[in]/231·η (231 in³ per US
gallon, the definition of the gallon), i.e. 0.000243·d²·L·η bbl/stk for a triplex (common
practice field constant, from memory).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from calc.errors import InputError
from calc.pumps import (
    SPM_MAX,
    Pump,
    hydraulic_power,
    pump_displacement,
    pump_limits,
    pumps_rate,
    pumps_spm,
    rate_from_spm,
    spm_from_rate,
)
from calc.units import from_si, to_si
from tests.demo_well import (
    case,
    demo_fluid,
    demo_margins,
    demo_rate,
    demo_surface_rating,
    demo_weak_points,
    demo_well,
    demo_window,
)

IN = to_si(1.0, "in")


def test_triplex_displacement_is_the_swept_volume_of_three_cylinders():
    # Bourgoyne et al. (1986) §4.2 (from memory): triplex single-acting π/4·d²·L·3·η.
    d, length, eta = 6.5, 12.0, 0.97
    in3 = math.pi / 4.0 * d**2 * length * 3 * eta  # cubic inches per stroke
    gal = in3 / 231.0  # US gallon = 231 in³ exactly (definition)
    v = pump_displacement(d * IN, length * IN, eta, "triplex")
    assert from_si(v, "gal") == pytest.approx(gal, rel=1e-12)
    assert from_si(v, "gal") == pytest.approx(5.016, abs=5e-4)
    # field constant 0.000243 bbl/(in²·in) at 100 % (common practice, from memory): 3·π/4/9702
    assert from_si(v, "bbl") == pytest.approx(0.000243 * d**2 * length * eta, rel=5e-3)


def test_duplex_displacement_is_the_swept_volume_of_both_sides_of_two_cylinders():
    # Bourgoyne et al. (1986) §4.2 (from memory): duplex double-acting π/4·(2d² − rod²)·L·2·η:
    # the front side sweeps π/4·d²·L, the back side π/4·(d² − rod²)·L, per cylinder.
    d, rod, length, eta = 6.0, 2.5, 16.0, 0.9
    per_cyl = math.pi / 4.0 * d**2 * length + math.pi / 4.0 * (d**2 - rod**2) * length
    v = pump_displacement(d * IN, length * IN, eta, "duplex", rod * IN)
    assert from_si(v, "in**3") == pytest.approx(2 * per_cyl * eta, rel=1e-12)


def test_rate_and_spm_are_inverse_and_add_over_pumps():
    p1 = Pump("p1", 6.5 * IN, 12 * IN, 0.97)
    p2 = Pump("p2", 6.0 * IN, 12 * IN, 0.95)
    q = pumps_rate([p1, p2], [52.0, 60.0])
    expected = (p1.displacement * 52.0 + p2.displacement * 60.0) / 60.0
    assert q == pytest.approx(expected, rel=1e-12)
    n = pumps_spm([p1, p2], q)  # the same spm on each pump
    assert pumps_rate([p1, p2], [n, n]) == pytest.approx(q, rel=1e-12)
    back = spm_from_rate(p1.displacement, rate_from_spm(p1.displacement, 77.0))
    assert back == pytest.approx(77.0, rel=1e-12)


def test_demo_pumps_give_the_checks_rate():
    # demo: two 6.5 in × 12 in triplex at 0.97, 52 spm each ≈ the check's 522 gpm
    c = case()
    pumps = [Pump(p["name"], p["liner"] * IN, p["stroke"] * IN, p["efficiency"]) for p in c["pump"]]
    q = pumps_rate(pumps, c["check"][-1]["pump_spm"])
    assert from_si(q, "gpm") == pytest.approx(521.7, abs=0.05)
    assert abs(q - demo_rate(-1)) / demo_rate(-1) < 0.01


@pytest.mark.parametrize(
    "call, name",
    [
        (lambda: pump_displacement(6.5 * IN, 12 * IN, 1.2), "pump efficiency"),
        (lambda: pump_displacement(6.5 * IN, 12 * IN, 0.0), "pump efficiency"),
        (lambda: pump_displacement(6.5 * IN, 12 * IN, -0.1), "pump efficiency"),
        (lambda: rate_from_spm(0.02, -5.0), "pump speed (strokes per minute)"),
        (lambda: rate_from_spm(0.02, SPM_MAX + 1.0), "pump speed (strokes per minute)"),
        (lambda: spm_from_rate(0.02, 1.0), "pump speed (strokes per minute)"),
        (lambda: pump_displacement(6.5 * IN, 12 * IN, 0.9, "quintuplex"), "pump kind"),
        (lambda: pump_displacement(6 * IN, 12 * IN, 0.9, "duplex", 7 * IN), "pump rod"),
        (lambda: Pump("p", 6 * IN, 12 * IN, 1.5), "pump efficiency"),
    ],
)
def test_bad_input_names_input_value_and_range(call, name):
    with pytest.raises(InputError) as exc:
        call()
    assert exc.value.name == name
    text = str(exc.value)
    assert name in text


def test_efficiency_error_states_the_range_and_value():
    with pytest.raises(InputError) as exc:
        pump_displacement(6.5 * IN, 12 * IN, 1.2)
    assert "1.2" in str(exc.value) and "(0, 1]" in str(exc.value)


def test_power_limit_holds_each_pump_at_its_share():
    # P = p·Q (definition); 1714.29 psi·gpm per hp (derived from SI: 1 hp = 745.7 W)
    assert from_si(hydraulic_power(to_si(1714.2857, "psi"), to_si(1.0, "gpm")), "hp") == (
        pytest.approx(1.0, rel=1e-3)
    )
    big = Pump("big", 7 * IN, 12 * IN, 1.0, rated_power=to_si(1000, "hp"))
    small = Pump("small", 5 * IN, 12 * IN, 1.0, rated_power=to_si(1000, "hp"))
    p, q = to_si(3000.0, "psi"), to_si(900.0, "gpm")
    lim = pump_limits([big, small], p, q)
    share = big.displacement / (big.displacement + small.displacement)
    assert float(lim["rated hydraulic power"]) == pytest.approx(
        to_si(1000, "hp") - p * q * share, rel=1e-12
    )
    assert "liner rating" not in lim


def test_demo_window_top_end_is_bound_by_the_liner_rating():
    """Issue 12: 650 gpm needs ~4,240 psi on the demo, above the 4,000 psi liners, so the
    window's top end is the liner rating, at an SPP of exactly 4,000 psi."""
    from calc.circulation import circulate
    from calc.rate_window import operating_window

    c = case()
    pumps = [
        Pump(
            p["name"], p["liner"] * IN, p["stroke"] * IN, p["efficiency"],
            rated_power=to_si(1600.0, "hp"), liner_rating=to_si(p["liner_rating"], "psi"),
        )
        for p in c["pump"]
    ]  # fmt: skip
    well, fluid = demo_well(-1), demo_fluid(index=-1)
    q0 = demo_rate(-1)
    kw = dict(
        window=demo_window(), weak_points=demo_weak_points(), margins=demo_margins(),
        surface_rating=demo_surface_rating(),
    )  # fmt: skip
    sweep = np.linspace(0.3 * q0, 1.8 * q0, 200)
    without = operating_window(well, fluid, sweep, **kw)
    win = operating_window(well, fluid, sweep, pumps=pumps, **kw)
    assert win.binding_high == "liner rating"
    assert win.q_high < without.q_high
    spp = circulate(well, fluid, win.q_high).standpipe_pressure
    assert from_si(spp, "psi") == pytest.approx(4000.0, abs=2.0)  # linear interpolation
    assert "rated hydraulic power" in win.limits
    assert win.q_low == pytest.approx(without.q_low, rel=1e-12)


def test_worksheet_functions_match_the_geometric_formula():
    """BF_PUMP_OUTPUT / BF_PUMP_RATE / BF_PUMP_SPM against the swept volume (Bourgoyne et al.
    1986 §4.2, from memory) in field units: 1 bbl = 9,702 in³ (42 US gal × 231 in³, the
    definitions of the barrel and the gallon)."""
    from addin.sheets.functions import BF_PUMP_OUTPUT, BF_PUMP_RATE, BF_PUMP_SPM

    bbl = math.pi / 4 * 6.5**2 * 12 * 3 * 0.97 / 9702.0
    assert BF_PUMP_OUTPUT(6.5, 12, 0.97) == pytest.approx(bbl, rel=1e-12)
    duplex = math.pi / 4 * (2 * 6.0**2 - 2.5**2) * 16 * 2 * 0.9 / 9702.0
    assert BF_PUMP_OUTPUT(6.0, 16, 0.9, "duplex", 2.5) == pytest.approx(duplex, rel=1e-12)
    gpm = 2 * bbl * 42.0 * 52  # two pumps, 52 spm, 42 gal/bbl
    assert BF_PUMP_RATE(6.5, 12, 0.97, 52, 2) == pytest.approx(gpm, rel=1e-12)
    assert BF_PUMP_SPM(6.5, 12, 0.97, gpm, 2) == pytest.approx(52.0, rel=1e-12)
    rates = BF_PUMP_RATE(6.5, 12, 0.97, [[40.0], [60.0]])
    assert np.shape(rates) == (2, 1) and rates[1][0] == pytest.approx(bbl * 42 * 60, rel=1e-12)


@pytest.mark.parametrize(
    "args, words",
    [
        ((6.5, 12, 1.2, 52), "pump efficiency = 1.2"),
        ((6.5, 12, 0.97, -5), "pump speed (strokes per minute) = -5"),
        ((6.5, 12, 0.97, 300), "pump speed (strokes per minute) = 300"),
        ((6.5, 12, 0.97, 52, 1.5), "pumps running = 1.5"),
    ],
)
def test_worksheet_bad_input_is_a_cell_error(args, words):
    from addin.sheets.functions import BF_PUMP_RATE

    out = BF_PUMP_RATE(*args)
    assert isinstance(out, str) and out.startswith("#BF!") and words in out
    assert "allowed" in out


def _demo_doc():
    import tomllib

    from tests.demo_well import CASE_FILE

    return tomllib.loads(CASE_FILE.read_text(encoding="utf-8"))


def test_case_pump_spm_count_must_match_the_pumps():
    from addin.case import parse_case

    doc = _demo_doc()
    doc["check"][-1]["pump_spm"] = [52, 52, 40]
    case = parse_case(doc, "three.toml")
    with pytest.raises(InputError) as exc:
        case.pump_spm(-1)
    assert "check[2].pump_spm" in exc.value.name and "(2)" in str(exc.value)


def test_case_pump_at_zero_spm_is_not_running_and_a_rate_mismatch_is_noted():
    from addin.case import parse_case
    from addin.report.compute import pump_run

    doc = _demo_doc()
    doc["check"][-1]["pump_spm"] = [104, 0]
    doc["pump"][1]["liner_rating"] = 3000.0
    case = parse_case(doc, "one-pump.toml")
    running = case.running_pumps(-1)
    assert [p.name for p in running] == ["pump 1"]  # pump 2's 3,000 psi liners do not limit
    run = pump_run(case, case.check_value(-1, "flow_rate"))
    assert not run.notes  # 104 spm on one pump ≈ 522 gpm
    doc["check"][-1]["pump_spm"] = [60, 60]  # ≈ 602 gpm against 522 gpm
    case = parse_case(doc, "fast.toml")
    run = pump_run(case, case.check_value(-1, "flow_rate"))
    assert [n.code for n in run.notes] == ["pump_rate_mismatch"]


def test_case_bad_pump_inputs_are_located_errors():
    from addin.case import parse_case

    doc = _demo_doc()
    doc["pump"][0]["kind"] = "quintuplex"
    with pytest.raises(InputError) as exc:
        _ = parse_case(doc, "bad.toml").pumps
    assert "pump[1]" in exc.value.name and "triplex" in str(exc.value)
    doc = _demo_doc()
    doc["check"][-1]["pump_spm"] = [52, 400]
    with pytest.raises(InputError) as exc:  # beyond the possible 0-250 spm
        parse_case(doc, "fast.toml")
    assert "pump_spm" in str(exc.value) and "400" in str(exc.value)
