"""workbooks/CASE-FORMAT.md stays true: it documents every key the parser accepts with the unit
the parser uses, its example parses to the values it shows, and every number it prints (limits,
the error example, the minimal case) is recomputed here.  A failure names the line to update."""

from __future__ import annotations

import re
import tomllib

import pytest
from _report_demo import ROOT

from addin.case import parse_case, parse_quantity
from addin.case_schema import SECTIONS
from addin.workbook_input import Limits
from calc.bit import total_flow_area
from calc.errors import InputError
from calc.units import KINDS, label, to_si, unit_for

DOC = (ROOT / "workbooks" / "CASE-FORMAT.md").read_text(encoding="utf-8")
DEMO = tomllib.loads((ROOT / "workbooks" / "demo-case.toml").read_text(encoding="utf-8"))
SYSTEMS = ("oilfield", "metric", "si")


def _line(pos: int) -> int:
    return DOC.count("\n", 0, pos) + 1


def _keys(schema, prefix=""):
    for k, f in schema.items():
        if f.kind == "table" and f.sub:
            yield from _keys(f.sub, prefix + k + ".")
        else:
            yield prefix + k, f


def _section(name, is_list):
    head = f"[[{name}]]" if is_list else f"[{name}]"
    assert f"### `{head}`" in DOC, head
    start = DOC.index(f"### `{head}`")
    return start, DOC[start:].split("\n### ", 1)[0]


def test_every_section_and_key_is_documented():
    for name, (is_list, schema) in SECTIONS.items():
        _, section = _section(name, is_list)
        for key, _f in _keys(schema):
            assert f"| `{key}` |" in section, (name, key)


def test_unit_column_is_the_parsers_unit():
    """The 'unit (oilfield / metric / si)' cell of each key is the unit the parser reads that
    key in (calc.units.unit_for of the key's quantity kind), '–' for keys without a unit."""
    for name, (is_list, schema) in SECTIONS.items():
        start, section = _section(name, is_list)
        for key, f in _keys(schema):
            m = re.search(rf"^\| `{re.escape(key)}` \| [^|]* \| ([^|]*) \|", section, re.M)
            assert m, (name, key)
            kind = f.kind if f.kind in KINDS else (f.of if f.of in KINDS else None)
            want = " / ".join(label(unit_for(kind, s)) for s in SYSTEMS) if kind else "–"
            got = m.group(1).strip()
            line = _line(start + m.start())
            assert got == want, f"CASE-FORMAT.md line {line}: `{key}` unit {got!r}, now {want!r}"


def test_workbook_size_limits_are_the_readers():
    """'up to 20 MiB', '(200 MiB)', 'sheets (40)', 'cells (200 000)' are addin.workbook_input
    Limits' defaults."""
    lim = Limits()
    flat = " ".join(DOC.split())
    line = _line(DOC.index("Safety: only"))
    quoted = {
        f"up to {lim.max_file_bytes // 2**20} MiB": lim.max_file_bytes % 2**20 == 0,
        f"uncompressed size ({lim.max_uncompressed_bytes // 2**20} MiB)": (
            lim.max_uncompressed_bytes % 2**20 == 0
        ),
        f"sheets ({lim.max_sheets})": True,
        f"cells ({lim.max_cells:,})".replace(",", " "): True,
    }
    for text, whole in quoted.items():
        assert whole and text in flat, f"CASE-FORMAT.md line {line}: now {text!r}"


def test_error_example_is_what_the_parser_says():
    """The unknown-key example (`bit.noozles`) is the parser's message, its list of allowed keys
    shortened with '…'."""
    m = re.search(r"e\.g\. `(.+?)`", DOC, re.S)
    shown = " ".join(m.group(1).split())
    data = dict(DEMO)
    data["bit"] = {**DEMO["bit"], "noozles": DEMO["bit"]["nozzles"]}
    with pytest.raises(InputError) as err:
        parse_case(data, "demo.toml")
    head, tail = shown.split(" … ")
    msg = str(err.value)
    line = _line(m.start())
    assert msg.startswith(head.rstrip(",")), f"CASE-FORMAT.md line {line}: now {msg!r}"
    assert msg.endswith(tail), f"CASE-FORMAT.md line {line}: now {msg!r}"


def test_dial_example_is_the_demo_first_check():
    """The dial example in 'Rules' is the first mud check of workbooks/demo-case.toml (an input,
    shown as typed)."""
    m = re.search(r"`dial = \{ (.+?) \}`", DOC)
    shown = {int(k): float(v) for k, v in re.findall(r"(\d+) = (\d+)", m.group(1))}
    demo = {int(k): float(v) for k, v in DEMO["check"][0]["dial"].items()}
    assert shown == demo, f"CASE-FORMAT.md line {_line(m.start())}"
    assert "`[12, 12, 12, 11, 11, 11]`" in DOC and DEMO["bit"]["nozzles"] == [12, 12, 12] + [11] * 3


def test_minimal_example_builds_a_well():
    """Every number of the minimal (metric) case is read in the unit its comment or the unit
    column says: m, mm, kg/m³, L/min, 1/32 in, dial degrees."""
    m = re.search(r"```toml\n(.*?)```", DOC, re.S)
    example = m.group(1)
    line = _line(m.start())
    raw = tomllib.loads(example)
    assert raw["case"]["units"] == "metric"
    case = parse_case(raw, "minimal.toml")
    well = case.well()
    msg = f"CASE-FORMAT.md minimal case (from line {line})"
    assert well.bit_depth == pytest.approx(2500.0), msg  # m
    assert case.survey.md.tolist() == [0.0, 3000.0], msg  # m
    (casing,) = case.casings
    assert casing.diameter == pytest.approx(to_si(224.4, "mm")), msg
    assert casing.bottom == pytest.approx(1500.0), msg
    assert case.open_hole["bit_size"] == pytest.approx(to_si(215.9, "mm")), msg
    assert case.bit.size == pytest.approx(to_si(215.9, "mm")), msg
    assert case.bit.tfa == pytest.approx(total_flow_area([12, 12, 12])), msg  # 1/32 in
    (pipe,) = case.string.components
    assert (pipe.od, pipe.id) == pytest.approx((to_si(127.0, "mm"), to_si(108.6, "mm"))), msg
    assert case.check_value(-1, "density") == pytest.approx(1200.0), msg  # kg/m³
    assert case.check_value(-1, "flow_rate") == pytest.approx(2000.0 / 60000.0), msg  # L/min
    r = case.checks[-1].readings
    shown = {float(k): float(v) for k, v in raw["check"][0]["dial"].items()}
    assert dict(zip(r.speeds.tolist(), r.dial.tolist(), strict=True)) == shown, msg
    # the comments name the metric units the parser uses
    assert label(unit_for("diameter", "metric")) == "mm"
    assert label(unit_for("depth", "metric")) == "m"
    assert label(unit_for("density", "metric")) == "kg/m³"
    assert label(unit_for("flow_rate", "metric")) == "L/min"


def test_values_with_their_own_unit_parse():
    """The bullet 'A value may carry its own unit' quotes values the parser reads in the unit
    they name (checked against calc.units.to_si)."""
    start = DOC.index("**A value may carry its own unit**")
    bullet = DOC[start : DOC.index("\n*", start)]
    quoted = re.findall(r'`"([\d.]+) ([^"]+)"`', bullet)
    assert len(quoted) >= 4, f"CASE-FORMAT.md line {_line(start)}: examples not found"
    kinds = ("density", "diameter", "flow_rate", "depth", "pressure")
    for number, unit in quoted:
        parsed = []
        for kind in kinds:
            try:
                parsed.append(parse_quantity(f"{number} {unit}", kind, "oilfield"))
            except InputError:
                continue
        assert parsed, f"CASE-FORMAT.md line {_line(start)}: '{number} {unit}' does not parse"
        assert parsed[0] == pytest.approx(to_si(float(number), unit), rel=1e-12)


def test_covers_example_names_demo_components():
    """The `covers` example names two components of the demo case's string."""
    m = re.search(r"\(e\.g\. `(\[.+?\])`\)", DOC)
    names = tomllib.loads(f"x = {m.group(1)}")["x"]
    demo = {c["name"] for c in DEMO["string"]}
    assert set(names) <= demo, f"CASE-FORMAT.md line {_line(m.start())}: {names} not in the demo"
