"""The field-constant sets of a hydraulics method: ``"exact"`` (derived from SI) and
``"as_printed"`` (the rounded constants of the published API RP 13D (1995) recipe).

External references: the exact constants are derived here from the NIST SP 811 (2008) App. B
definitions (in = 0.0254 m, ft = 0.3048 m, lb = 0.45359237 kg, US gal = 231 in³, lbf = lb·gₙ,
gₙ = 9.80665 m/s², cP = 1e-3 Pa·s, dyn/cm² = 0.1 Pa); the printed constants are those of API RP
13D, 3rd ed. (1995), read second-hand in a one-page summary of its hydraulics equations
("Hydraulics Equations — API RP 13D", p. 3, 2002) and in the Texas A&M PETE 411 worked example
(tests/test_worked_examples_flow.py) — calc/METHODS.md §7.2, §7.9.
"""

from __future__ import annotations

import numpy as np
import pytest

from calc.bit import bit_pressure_drop
from calc.errors import InputError
from calc.flow import annulus_flow, critical_flow_rate, pipe_flow
from calc.flow.methods_api import API95_PRINTED, api95_constants
from calc.hydraulics_method import HYDRAULICS_METHODS, resolve_method
from calc.rheology import ViscometerReadings, fit

IN, FT, LB, GN = 0.0254, 0.3048, 0.45359237, 9.80665
GAL = 231 * IN**3
PPG, GPM, CP, PSI = LB / GAL, GAL / 60, 1e-3, LB * GN / IN**2

#: exact value of each printed constant, derived from the definitions above (R1-B1-F1 factors
#: 0.510678 Pa per degree and 1.70230 s⁻¹ per rpm: calc/METHODS.md §1.1-§1.2, from memory)
DERIVED = {
    "n_pipe": 1 / np.log10(2),
    "n_annulus": 1 / np.log10(100 / 3),
    "velocity": GPM / (np.pi / 4 * IN**2) / FT,
    "reynolds": PPG * FT * IN / CP,
    "gradient": (PSI / FT) / (2 * PPG * FT**2 / IN),
    "bit": PPG * GPM**2 / (2 * 0.95**2 * (np.pi / 4 * (IN / 32) ** 2) ** 2) / PSI,
}
PRINTED = {
    "n_pipe": 3.32, "n_annulus": 0.657, "dial_stress": 5.11, "rate_600": 1022.0,
    "rate_100": 170.2, "velocity": 0.408, "reynolds": 928.0, "gradient": 25.81, "bit": 156.0,
}  # fmt: skip


@pytest.mark.parametrize("name", sorted(DERIVED))
def test_exact_set_is_derived_from_si(name):
    assert getattr(api95_constants("exact"), name) == pytest.approx(DERIVED[name], rel=1e-12)


def test_viscometer_constants_of_the_exact_set():
    e = api95_constants("exact")
    # 386 dyn·cm/degree × 0.01323 cm⁻³ (R1-B1-F1; calc/METHODS.md §1.2, from memory)
    assert e.dial_stress == pytest.approx(386 * 0.01323, rel=1e-12)
    assert e.rate_600 == pytest.approx(1021.38, abs=0.01)
    assert e.rate_100 == pytest.approx(170.23, abs=0.01)


@pytest.mark.parametrize("name", sorted(PRINTED))
def test_printed_set_is_the_printed_constants(name):
    assert getattr(API95_PRINTED, name) == PRINTED[name]
    # each printed constant is its exact value rounded: within 0.35 % (the 156 of the bit drop
    # is the furthest, −0.33 %; calc/METHODS.md §7.9)
    assert abs(api95_constants("as_printed").ratio(name) - 1) < 3.5e-3


def test_exact_set_leaves_the_numbers_bit_identical():
    # constants="exact" multiplies by ratios that are exactly 1.0
    q = np.geomspace(1e-3, 0.06, 25)
    a = dict(density=1400.0, tau_y=0.0, k=0.3, n=0.6, method="api13d_1995_power_law")
    for f in (
        lambda **kw: pipe_flow(q, 0.1, **kw),
        lambda **kw: annulus_flow(q, 0.22, 0.127, **kw),
    ):
        r0, r1 = f(**a), f(**a, constants="exact")
        for attr in ("velocity", "reynolds", "friction_factor", "gradient", "critical_flow_rate"):
            assert np.array_equal(getattr(r0, attr), getattr(r1, attr)), attr
    assert bit_pressure_drop(0.03, 1400.0, 2e-4) == bit_pressure_drop(
        0.03, 1400.0, 2e-4, constants="exact"
    )


def test_as_printed_pipe_flow_is_the_printed_field_recipe():
    # One turbulent and one laminar pipe point, the printed recipe written out in field units.
    n, k_dyn = 0.65, 3.0
    for q_gpm, d_in in ((600.0, 4.276), (60.0, 4.276)):
        r = pipe_flow(
            q_gpm * GPM, d_in * IN, density=12.0 * PPG, tau_y=0.0, k=0.1 * k_dyn, n=n,
            method="api13d_1995_power_law", constants="as_printed",
        )  # fmt: skip
        v = 0.408 * q_gpm / d_in**2
        mu = 100 * k_dyn * (96 * v / d_in) ** (n - 1) * ((3 * n + 1) / (4 * n)) ** n
        re = 928 * d_in * v * 12.0 / mu
        f = 16 / re if re < 2100 else ((np.log10(n) + 3.93) / 50) / re ** ((1.75 - np.log10(n)) / 7)
        assert r.velocity / FT == pytest.approx(v, rel=1e-12)
        assert r.reynolds == pytest.approx(re, rel=1e-12)
        assert r.friction_factor == pytest.approx(f, rel=1e-12)
        assert r.gradient / (PSI / FT) == pytest.approx(f * v**2 * 12.0 / (25.81 * d_in), rel=1e-12)
        assert "constants=as_printed" in r.method_label


def test_as_printed_fits_are_the_printed_formulas():
    r = ViscometerReadings([3, 6, 100, 200, 300, 600], [7, 8, 20, 29, 37, 56])
    p = fit(r, "api13d_1995_pipe", constants="as_printed").model
    n = 3.32 * np.log10(56 / 37)
    assert p.n == pytest.approx(n, rel=1e-12)
    assert p.k / 0.1 == pytest.approx(5.11 * 56 / 1022**n, rel=1e-12)
    a = fit(r, "api13d_1995_annulus", constants="as_printed").model
    n = 0.657 * np.log10(20 / 7)
    assert a.n == pytest.approx(n, rel=1e-12)
    assert a.k / 0.1 == pytest.approx(5.11 * 20 / 170.2**n, rel=1e-12)


def test_as_printed_bit_drop_is_156_rho_q2_over_sum_n2_squared():
    nozzles = (12, 12, 12, 11, 11, 11)
    area = sum(np.pi / 4 * (x * IN / 32) ** 2 for x in nozzles)
    rho, q = 11.2, 522.0
    printed = 156 * rho * q**2 / sum(x**2 for x in nozzles) ** 2
    dp = bit_pressure_drop(q * GPM, rho * PPG, area, 0.95, constants="as_printed")
    assert dp / PSI == pytest.approx(printed, rel=1e-12)
    # another C_d: the Bernoulli (0.95/C_d)² dependence is kept
    dp2 = bit_pressure_drop(q * GPM, rho * PPG, area, 1.03, constants="as_printed")
    assert dp2 / dp == pytest.approx((0.95 / 1.03) ** 2, rel=1e-12)


def test_critical_rate_as_printed_puts_the_printed_re_at_2100():
    kw = dict(density=1300.0, tau_y=0.0, k=0.4, n=0.55, method="api13d_1995_power_law")
    qc = critical_flow_rate(0.1, **kw, constants="as_printed")
    r = pipe_flow(qc, 0.1, **kw, constants="as_printed")
    assert r.reynolds == pytest.approx(2100.0, rel=1e-9)


# ------------------------------------------------------------------------------- bad input
@pytest.mark.parametrize(
    "name", [m for m in HYDRAULICS_METHODS.names() if m != "api13d_1995_power_law"]
)
def test_as_printed_refused_for_methods_without_printed_constants(name):
    with pytest.raises(InputError) as exc:
        resolve_method(name, constants="as_printed")
    msg = str(exc.value)
    assert exc.value.name == "constants" and "api13d_1995_power_law" in msg and name in msg


def test_as_printed_refused_when_an_override_leaves_the_printed_recipe():
    with pytest.raises(InputError, match="api13d_1995_power_law"):
        resolve_method(
            "api13d_1995_power_law", constants="as_printed", pipe_fit="power_law_two_speed"
        )


def test_unknown_constant_set_names_the_allowed_ones():
    for call in (
        lambda: resolve_method("api13d_1995_power_law", constants="printed"),
        lambda: pipe_flow(0.01, 0.1, density=1e3, tau_y=0, k=0.1, n=0.7, constants="rounded"),
        lambda: fit(ViscometerReadings([300, 600], [30, 50]), "api13d_1995_pipe", constants="x"),
        lambda: bit_pressure_drop(0.03, 1e3, 2e-4, constants="nist"),
    ):
        with pytest.raises(InputError) as exc:
            call()
        assert exc.value.name == "constants"
        assert "exact" in str(exc.value) and "as_printed" in str(exc.value)


def test_flow_and_fit_layers_refuse_as_printed_for_other_laws():
    with pytest.raises(InputError, match="available for: api13d_1995_power_law"):
        pipe_flow(0.01, 0.1, density=1e3, tau_y=1.0, k=0.1, n=0.7, constants="as_printed")
    with pytest.raises(InputError, match="api13d_1995_pipe"):
        fit(ViscometerReadings([300, 600], [30, 50]), "bingham_two_speed", constants="as_printed")


def test_label_shows_the_constant_set():
    assert resolve_method("api13d_1995_power_law", constants="as_printed").label == (
        "api13d_1995_power_law (constants=as_printed)"
    )
    assert resolve_method("api13d_1995_power_law", constants="exact").label == (
        "api13d_1995_power_law"
    )


# ------------------------------------------------------------------- faces: case, CLI, report
def _demo_doc():
    import tomllib

    from tests._report_demo import DEMO

    return tomllib.loads(DEMO.read_text(encoding="utf-8"))


def test_case_file_keys_choose_method_and_constants():
    from addin.case import parse_case

    doc = _demo_doc()
    doc["case"].update(method="api13d_1995_power_law", constants="as_printed")
    case = parse_case(doc, "demo.toml")
    m = case.hydraulics_method()
    assert (m.name, m.constants) == ("api13d_1995_power_law", "as_printed")
    # the command line overrides the keys
    assert case.hydraulics_method(constants="exact").constants == "exact"
    assert case.hydraulics_method("bingham", "exact").name == "bingham"
    # default without the keys
    assert parse_case(_demo_doc(), "demo.toml").hydraulics_method().label == "api13d_2010_hb"


@pytest.mark.parametrize(
    "update, needle",
    [
        (dict(constants="printed"), "demo.toml: case.constants"),
        (dict(method="api13d_2010_hb", constants="as_printed"), "demo.toml: case.constants"),
        (dict(method="bingam"), "demo.toml: case.method"),
    ],
)
def test_case_file_bad_method_or_constants_name_file_and_key(update, needle):
    from addin.case import parse_case

    doc = _demo_doc()
    doc["case"].update(update)
    with pytest.raises(InputError) as exc:
        parse_case(doc, "demo.toml")
    msg = str(exc.value)
    assert needle in msg and "\n" not in msg, msg


def test_cli_constants_option_changes_the_numbers_and_bad_names_are_refused(capsys):
    from addin.cli import main
    from tests._report_demo import DEMO

    out = {}
    for c in ("exact", "as_printed"):
        rc = main(["calc", "circulate", str(DEMO), "--method", "api13d_1995_power_law",
                   "--constants", c, "--json"])  # fmt: skip
        assert rc == 0
        out[c] = capsys.readouterr().out
    assert out["exact"] != out["as_printed"]
    rc = main(["calc", "circulate", str(DEMO), "--constants", "as_printed"])
    err = capsys.readouterr().err
    assert rc != 0 and "api13d_1995_power_law" in err and "Traceback" not in err
    rc = main(["calc", "circulate", str(DEMO), "--constants", "rounded"])
    err = capsys.readouterr().err
    assert rc != 0 and "exact, as_printed" in err


def test_report_method_label_shows_the_constant_set():
    from addin.case import parse_case
    from addin.report import compute

    doc = _demo_doc()
    doc["case"].update(method="api13d_1995_power_law", constants="as_printed")
    r = compute(parse_case(doc, "demo.toml"), run_time="2026-01-01 06:00:00 UTC")
    assert r.method == "api13d_1995_power_law (constants=as_printed)"
    assert "constants=as_printed" in r.circulation.method
    assert "156" in r.circulation.bit.method
