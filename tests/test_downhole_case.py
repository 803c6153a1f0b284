"""The [temperature] section of a case and the Downhole results (invented demo data)."""

from __future__ import annotations

from pathlib import Path

import pytest

from addin.case import CaseInputError, load_case
from addin.guard import ImplausibleInput
from addin.report.compute import compute
from addin.report.downhole import conditions_of
from calc.units import from_si

ROOT = Path(__file__).resolve().parents[1]


@pytest.fixture(scope="module", params=["demo-case.toml", "demo-case-obm.toml"])
def run(request):
    case = load_case(ROOT / "workbooks" / request.param)
    return request.param, compute(case, run_time="2026-01-01 00:00:00 UTC")


def test_demo_effect_sizes(run):
    """Regression values, reviewed: the T/p-corrected ECD at the bit is below the surface-mud
    ECD (at 232 °F static / 190 °F annulus the liquids' expansion outweighs compression), and
    the headline ECD (surface mud) is today's number."""
    name, res = run
    p = res.downhole.profile
    ecd, ecd0 = from_si(p.ecd_bit, "ppg"), from_si(float(p.ecd_surface[-1]), "ppg")
    assert ecd0 == pytest.approx(from_si(float(res.circulation.ecd_bit), "ppg"), rel=1e-12)
    want = {"demo-case.toml": (11.771, 11.822), "demo-case-obm.toml": (11.666, 11.751)}[name]
    assert (round(ecd, 3), round(ecd0, 3)) == want
    # the oil mud expands more than the water mud (Sorelle et al. 1982: oil is the more
    # compressible and expandable liquid)
    assert ecd < ecd0


def test_without_temperature_nothing_is_computed(tmp_path):
    text = (ROOT / "workbooks" / "demo-case.toml").read_text(encoding="utf-8")
    start = text.index("[temperature]")
    end = text.index("# ---------------- planned trip")
    f = tmp_path / "c.toml"
    f.write_text(text[:start] + text[end:], encoding="utf-8")
    case = load_case(f)
    assert conditions_of(case) is None


@pytest.mark.parametrize(
    ("old", "new", "match"),
    [
        ("oil_water_ratio = 80.0\nsolids = 15.5", "oil_water_ratio = 120.0\nsolids = 15.5",
         "oil_water_ratio = 120"),
        ('base_fluid = "mineral_oil"\nwater_phase = "brine"\noil_water_ratio = 80.0\nsolids = 15.5',
         'base_fluid = "kerosene"\nwater_phase = "brine"\noil_water_ratio = 80.0\nsolids = 15.5',
         "base_fluid"),
    ],
)  # fmt: skip
def test_bad_composition_is_refused_naming_the_key(tmp_path, old, new, match):
    text = (ROOT / "workbooks" / "demo-case-obm.toml").read_text(encoding="utf-8")
    assert old in text
    f = tmp_path / "c.toml"
    f.write_text(text.replace(old, new), encoding="utf-8")  # InputError naming key, value, range
    # the plausibility guard refuses the OWR at load; the base-fluid name at the conditions
    with pytest.raises((CaseInputError, ImplausibleInput), match=match):
        conditions_of(load_case(f))
