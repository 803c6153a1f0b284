"""The worksheet-function convention: hints xlwings can convert, the error text, normalisation,
the generated reference.  (Adapter behaviour only; engineering checks live in calc's tests.)"""

import inspect
import typing
from typing import Annotated, Any, get_args, get_origin

import numpy as np
import pytest
import xlwings.conversion

import addin.sheets.functions  # noqa: F401  (registers every family)
from addin.sheets import cells, docs
from addin.sheets.framework import FUNCTIONS, MARK, clean_result, error_text, sheet_function
from calc.errors import InputError

# Options xlwings' value reader understands (xlwings/conversion/standard.py:
# CleanDataFromReadStage, AdjustDimensionsStage) plus the wizard text ("doc").
_XLWINGS_OPTIONS = {"doc", "ndim", "err_to_str", "empty", "numbers", "dates", "transpose"}


def _xlwings_top_level(hint):
    """Same logic as xlwings.udfs.extract_type_and_annotations (xlwings 0.37, udfs.py),
    which is not importable on Linux (it needs pywin32)."""
    origin = get_origin(hint)
    if origin is Annotated:
        base, *meta = get_args(hint)
        return get_origin(base) or base, meta
    return origin or hint, []


def _resolves(hint) -> bool:
    top, _ = _xlwings_top_level(hint)
    try:
        return top in xlwings.conversion.accessors
    except TypeError:  # unhashable
        return False


def test_every_function_is_registered_and_named_with_the_prefix():
    assert FUNCTIONS, "no worksheet functions registered"
    for name in FUNCTIONS:
        assert name.startswith("BF_"), name
        assert name == name.upper(), name


@pytest.mark.parametrize("name", list(FUNCTIONS))
def test_every_hint_resolves_to_an_xlwings_converter(name):
    func = FUNCTIONS[name].func  # the object xlwings decorates and inspects
    hints = typing.get_type_hints(func, include_extras=True)
    params = inspect.signature(func).parameters.values()
    for p in params:
        # xlwings.udfs.func_sig refuses keyword-only arguments
        assert p.kind is inspect.Parameter.POSITIONAL_OR_KEYWORD, (name, p.name)
        assert p.name in hints, f"{name}.{p.name} has no hint"
        assert _resolves(hints[p.name]), f"{name}.{p.name}: {hints[p.name]!r} is no converter"
        _, meta = _xlwings_top_level(hints[p.name])
        assert meta and isinstance(meta[0], dict) and meta[0].get("doc"), (name, p.name)
        assert set(meta[0]) <= _XLWINGS_OPTIONS, (name, p.name, meta[0])
    assert "return" in hints and _resolves(hints["return"]), name


def test_the_hint_check_rejects_a_union():
    # a union passes in Python but breaks inside the spreadsheet: the check must catch it
    assert not _resolves(float | str)
    assert not _resolves(typing.Optional[float])  # noqa: UP045 (the point of the test)
    assert _resolves(Annotated[list, {"ndim": 2}])
    assert _resolves(Any)


@pytest.mark.parametrize("name", list(FUNCTIONS))
def test_wizard_description_fits_the_excel_limit(name):
    # classic xlwings passes the docstring to MacroOptions cut at 255 characters (udfs.py);
    # the first paragraph must stand alone within that
    doc = inspect.getdoc(FUNCTIONS[name].raw)
    first = doc.split("\n\n")[0]
    assert 10 < len(first) <= 255, name


def test_error_text_and_guard():
    @sheet_function("test-only")
    def BF_TEST_ONLY(x: Any) -> Any:
        """Test helper."""
        if x == "input":
            raise InputError("thing", -1.0, "> 0")
        if x == "boom":
            raise ZeroDivisionError("deep inside")
        if x == "nan":
            return float("nan")
        if x == "table":
            return np.array([[1.0, np.inf], [2.0, 3.0]])
        return np.float64(2.5)

    try:
        assert BF_TEST_ONLY("input") == f"{MARK} thing = -1: not allowed; allowed: > 0"
        out = BF_TEST_ONLY("boom")
        assert out.startswith(MARK) and "ZeroDivisionError" in out and "Traceback" not in out
        assert BF_TEST_ONLY("nan").startswith(MARK)
        table = BF_TEST_ONLY("table")
        assert table[0][0] == 1.0 and table[0][1].startswith(MARK) and table[1] == [2.0, 3.0]
        value = BF_TEST_ONLY(None)
        assert type(value) is float and value == 2.5
    finally:
        del FUNCTIONS["BF_TEST_ONLY"]


def test_clean_result_shapes():
    assert clean_result(np.array(3.0)) == 3.0
    assert clean_result(np.array([1.0, 2.0])) == [[1.0], [2.0]]
    assert clean_result([["a", np.float64(1.5)]]) == [["a", 1.5]]
    assert error_text("x" * 400).endswith("…") and len(error_text("x" * 400)) == 250


# ---------------------------------------------------------------- normalisation


def test_number_accepts_what_a_cell_holds():
    assert cells.number(5, "x") == 5.0
    assert cells.number([[5.0]], "x") == 5.0  # one-cell range
    assert cells.number(" 12.5 ", "x") == 12.5  # number typed as text
    # a number with its own unit; 1 bbl = 42 US gal = 0.158987294928 m³ (NIST SP 811 App. B)
    assert cells.number("1 bbl/min", "q", "flow_rate") == pytest.approx(0.158987294928 / 60)
    # oilfield default: 11 ppg; 1 ppg = 119.826427317 kg/m³ (NIST SP 811 App. B)
    assert cells.number(11, "rho", "density") == pytest.approx(11 * 119.826427317)
    metric = cells.unit_set("metric")
    assert cells.number(2.5, "p", "pressure", metric) == pytest.approx(2.5e5)  # bar, exact


@pytest.mark.parametrize(
    ("value", "fragment"),
    [
        (None, "is blank"),
        ("", "is blank"),
        ("abc", "a number"),
        (True, "TRUE/FALSE"),
        ("#N/A", "error cell"),
        ("#BF! something upstream", "error cell"),
        (float("nan"), "finite"),
        (float("inf"), "finite"),
        ([[1, 2]], "single cell"),
        ("5 furlongs", "unit of x"),
        ("5 psi", "unit"),  # wrong dimension for a density
    ],
)
def test_number_rejects_with_a_reason(value, fragment):
    with pytest.raises(InputError) as err:
        cells.number(value, "x", "density")
    assert fragment in str(err.value)


def test_numbers_names_the_bad_cell():
    with pytest.raises(InputError, match=r"row 2, column 1"):
        cells.numbers([[1.0], [None], [3.0]], "rates", "flow_rate")
    with pytest.raises(InputError, match=r"row 1, column 2"):
        cells.numbers([[1.0, "x"]], "rates")
    out = cells.numbers([[1.0], ["2 bbl/min"]], "rates", "flow_rate")
    assert out.shape == (2, 1)
    assert out[1, 0] == pytest.approx(2 * 0.158987294928 / 60)


@pytest.mark.parametrize(
    "layout",
    [
        [[600, 56], [300, 37], [200, 29], [100, 20], [6, 8], [3, 7]],  # rpm | dial columns
        [[600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7]],  # two rows
        [[56], [37], [29], [20], [8], [7]],  # one column, standard speeds
        [[56, 37, 29, 20, 8, 7]],  # one row
        [56, 37, 29, 20, 8, 7],  # 1-D list (xlwings without ndim)
        [["rpm", "dial"], [600, 56], [300, 37], [200, 29], [100, 20], [6, 8], [3, 7]],
        [
            [600, 56, None],
            [300, 37, None],
            [200, 29, None],
            [100, 20, None],
            [6, 8, None],
            [3, 7, None],
            [None, None, None],
        ],  # over-selected range
    ],
)
def test_readings_layouts(layout):
    speeds, dials = cells.readings(layout)
    assert speeds.tolist() == [600, 300, 200, 100, 6, 3]
    assert dials.tolist() == [56, 37, 29, 20, 8, 7]


def test_readings_blank_dial_leaves_speed_out_and_bad_ranges_fail():
    speeds, dials = cells.readings([[600, 56], [300, 37], [200, None], [3, 7]])
    assert speeds.tolist() == [600, 300, 3] and dials.tolist() == [56, 37, 7]
    for bad, fragment in [
        ([[56, 37, 29]], "3 readings without speeds"),
        ([[600, 56]], "without speeds"),  # 1×2 is a row of two dials … at 600/300: ok below
        ([[1, 2, 3], [4, 5, 6], [7, 8, 9]], "3×3"),
        (None, "blank"),
        ([[600, "abc"], [300, 37]], "dial reading at 600 rpm"),
    ]:
        if bad == [[600, 56]]:
            s, d = cells.readings(bad)  # two values → the 600/300 pair (STANDARD_SPEEDS)
            assert s.tolist() == [600, 300] and d.tolist() == [600, 56]
            continue
        with pytest.raises(InputError) as err:
            cells.readings(bad)
        assert fragment in str(err.value)


def test_unit_set_forms():
    assert cells.unit_set(None).unit("pressure") == "psi"
    u = cells.unit_set("Metric; flow_rate = bbl/min, density=sg")
    assert (u.system, u.unit("flow_rate"), u.unit("density")) == ("metric", "bbl/min", "sg")
    block = cells.unit_set([["system", "si"], ["pressure", "bar"], [None, None]])
    assert (block.unit("pressure"), block.unit("depth")) == ("bar", "m")
    for bad, fragment in [
        ("imperial", "unit system"),
        ("oilfield; pressure=ppg", "unit for pressure"),
        ("oilfield; presure=psi", "quantity kind"),
        ([[1, 2, 3]], "two columns"),
    ]:
        with pytest.raises(InputError) as err:
            cells.unit_set(bad)
        assert fragment in str(err.value)


# ---------------------------------------------------------------- generated reference


def test_reference_is_up_to_date():
    assert docs.main(["--check"]) == 0, "run: python -m addin.sheets.docs"


def test_reference_documents_every_function_and_argument():
    text = docs.render()
    for name, sf in FUNCTIONS.items():
        assert f"### `{name}(" in text, name
        for p in inspect.signature(sf.raw).parameters:
            assert f"| `{p}` |" in text, (name, p)
    assert "UDF Modules" in text and "addin.sheets.functions" in text
