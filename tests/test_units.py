"""Unit factors against NIST SP 811 (2008), Appendix B, and the registry's guard rails."""

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from calc import units
from calc.errors import InputError

# (unit text, SI value of one unit, source).  NIST SP 811 (2008) App. B.8/B.9 exact factors;
# the derived ones are built from the exact base definitions (ft = 0.3048 m, in = 0.0254 m,
# lb = 0.45359237 kg, gal = 231 in³, gₙ = 9.80665 m/s²).
NIST = [
    ("psi", 6.894757293168361e3, "NIST SP 811 B.8: psi = 6.894 757 E+03 Pa (exact from lbf, in)"),
    ("gal", 3.785411784e-3, "NIST SP 811 B.8: gallon (US) = 3.785 411 784 E-03 m³ (exact)"),
    ("bbl", 1.58987294928e-1, "NIST SP 811 B.8: barrel (oil, 42 gal) = 1.589 873 E-01 m³"),
    ("lb", 0.45359237, "NIST SP 811 B.8: pound (avoirdupois) = 4.535 923 7 E-01 kg (exact)"),
    ("lbf", 4.4482216152605, "NIST SP 811 B.8: pound-force = 4.448 222 N"),
    ("in", 0.0254, "NIST SP 811 B.8: inch = 2.54 E-02 m (exact)"),
    ("ft", 0.3048, "NIST SP 811 B.8: foot = 3.048 E-01 m (exact)"),
    ("cP", 1e-3, "NIST SP 811 B.8: centipoise = 1.0 E-03 Pa·s (exact)"),
    ("lbf/100ft2", 4.4482216152605 / (100 * 0.3048**2), "derived: lbf / (100 ft²)"),
    ("ppg", 0.45359237 / 3.785411784e-3, "NIST SP 811 B.8: lb/gal (US) = 1.198 264 E+02 kg/m³"),
    ("gpm", 3.785411784e-3 / 60, "NIST SP 811 B.8: gal/min = 6.309 020 E-05 m³/s"),
    ("bbl/min", 1.58987294928e-1 / 60, "derived: 42 gal / 60 s"),
    ("psi/ft", 6.894757293168361e3 / 0.3048, "derived: psi / ft"),
    ("32nds", 0.0254 / 32, "nozzle sizes are in 1/32 in (common practice)"),
    ("hp", 745.69987158227, "NIST SP 811 B.8: horsepower (550 ft·lbf/s) = 7.456 999 E+02 W"),
    ("bar", 1e5, "NIST SP 811 B.8: bar = 1.0 E+05 Pa (exact)"),
    ("kPa", 1e3, "SI prefix"),
    ("L/min", 1e-3 / 60, "SI: litre = 1e-3 m³ (CGPM 1964)"),
    ("m3/min", 1 / 60, "SI"),
    ("mm", 1e-3, "SI"),
    ("mPa·s", 1e-3, "SI"),
    ("kg/L", 1e3, "SI"),
    ("sg", 1e3, "specific gravity relative to 1000 kg/m³ water (common practice)"),
    ("lb/gal", 0.45359237 / 3.785411784e-3, "same as ppg"),
]


@pytest.mark.parametrize(("text", "si", "source"), NIST, ids=[n[0] for n in NIST])
def test_factor_against_nist(text, si, source):
    assert units.si_factor(text) == pytest.approx(si, rel=1e-12), source


def test_pint_own_names_are_not_the_trade_ones():
    # pint's bbl is the 31.5-gal barrel and cp a cup; the trade text goes through parse_unit.
    assert units.ureg("bbl").to("gallon").magnitude == pytest.approx(31.5)
    assert units.ureg("cp").to("mL").magnitude == pytest.approx(236.5882365)
    assert units.si_factor("bbl") == pytest.approx(42 * 3.785411784e-3, rel=1e-12)
    assert units.si_factor("cp") == pytest.approx(1e-3)
    assert units.si_factor("bpm") == pytest.approx(units.si_factor("bbl/min"))


def test_redefinition_refused():
    with pytest.raises(Exception, match=r"(?i)redefin|already"):
        units.ureg.define("ppg = 2 * pound / gallon")


def test_hydrostatic_constant_0052():
    # 0.052 psi/ft per ppg (common practice) is 12/231 exactly (calc/METHODS.md §0.4, derived).
    g = units.G_N * units.si_factor("ppg") * units.si_factor("ft") / units.si_factor("psi")
    assert g == pytest.approx(12 / 231, rel=1e-9)
    assert g == pytest.approx(0.052, rel=2e-3)


def test_temperature_offsets():
    assert units.to_si(32.0, "degF") == pytest.approx(273.15)
    assert units.from_si(373.15, "degF") == pytest.approx(212.0)
    assert units.convert(120.0, "°F", "°C") == pytest.approx(48.888888889)


def test_unit_systems_cover_same_kinds():
    kinds = set(units.UNIT_SYSTEMS["oilfield"])
    for name, table in units.UNIT_SYSTEMS.items():
        assert set(table) == kinds, name
        for kind, unit in table.items():
            units.parse_unit(unit, kind)  # every unit has its kind's dimension


@pytest.mark.parametrize(
    ("text", "kind"), [("frobnitz/min", None), ("ft", "pressure"), ("", None), ("psi", "bogus")]
)
def test_bad_units_name_the_problem(text, kind):
    with pytest.raises(InputError) as exc:
        units.parse_unit(text, kind)
    assert "allowed" in str(exc.value)


def test_unknown_system():
    with pytest.raises(InputError, match="unit system"):
        units.unit_for("pressure", "imperial-ish")


def test_text_value_refused():
    with pytest.raises(InputError):
        units.to_si("eleven", "ppg")


_oilfield = sorted((k, u) for k, u in units.UNIT_SYSTEMS["oilfield"].items() if k != "temperature")


@given(
    st.sampled_from(_oilfield),
    st.floats(min_value=-1e9, max_value=1e9, allow_nan=False, allow_infinity=False),
)
def test_round_trip_oilfield_si(kind_unit, x):
    kind, unit = kind_unit
    back = units.from_si(units.to_si(x, unit, kind), unit, kind)
    assert back == pytest.approx(x, rel=1e-12, abs=1e-12)


def test_vectorised():
    out = units.to_si(np.array([1.0, 2.0, 3.0]), "psi")
    assert out.shape == (3,)
    assert out[2] == pytest.approx(3 * 6894.757293168361)
