"""workbooks/CASE-FORMAT.md documents every key the parser accepts, and its example parses."""

from __future__ import annotations

import re
import tomllib

import pytest
from _report_demo import ROOT

from addin.case import parse_case
from addin.case_schema import SECTIONS


def _keys(schema, prefix=""):
    for k, f in schema.items():
        if f.kind == "table" and f.sub:
            yield from _keys(f.sub, prefix + k + ".")
        else:
            yield prefix + k


def test_every_section_and_key_is_documented():
    doc = (ROOT / "workbooks" / "CASE-FORMAT.md").read_text(encoding="utf-8")
    for name, (is_list, schema) in SECTIONS.items():
        head = f"[[{name}]]" if is_list else f"[{name}]"
        assert f"### `{head}`" in doc, head
        section = doc.split(f"### `{head}`", 1)[1].split("\n### ", 1)[0]
        for key in _keys(schema):
            assert f"| `{key}` |" in section, (name, key)


def test_minimal_example_builds_a_well():
    doc = (ROOT / "workbooks" / "CASE-FORMAT.md").read_text(encoding="utf-8")
    example = re.search(r"```toml\n(.*?)```", doc, re.S).group(1)
    case = parse_case(tomllib.loads(example), "minimal.toml")
    well = case.well()
    assert well.bit_depth == 2500.0  # metric: m
    assert case.check_value(-1, "flow_rate") == pytest.approx(2000.0 / 60000.0)  # L/min → m³/s
