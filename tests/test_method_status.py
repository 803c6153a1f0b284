"""Verification status per method: every registry entry has one, users see it where it belongs.

What is checked here is the bookkeeping, against the repository's own references: each status
kind is one of calc/METHODS.md §0.3's words; the rig-facing report sheets name a method by its
primary source only, while the Audit sheet, the Cautions sheet and ``--json`` carry the status
and every caveat; ``boreflow methods`` lists them; unknown method names are refused with the
registered names, in every registry and on the command line.  The evidence texts themselves
name the tests that check each method against published examples, exact solutions and
reference libraries (calc/verification.py).
"""

from __future__ import annotations

import json
import re
from pathlib import Path

import openpyxl
import pytest

from addin import text
from addin.cli import main
from addin.commands.methods import methods_data, methods_markdown
from addin.report.jsonout import results_data
from calc import list_methods
from calc.cleaning.slip import SLIP_METHODS
from calc.errors import InputError
from calc.flow import FRICTION_LAWS
from calc.hydraulics_method import DEFAULT_METHOD, HYDRAULICS_METHODS, resolve_method
from calc.registry import NOT_ASSESSED, STATUS_KINDS, Verification
from calc.verification import REGISTRIES, caveat_notes, method_caveats
from tests._report_demo import demo_report_path, demo_results

ROOT = Path(__file__).resolve().parents[1]
RIG_FACING = ("Summary", "Hydraulics", "ECD", "Bit", "Cleaning", "Trips", "Rate window", "Rheology")
#: Words that belong to the status and the Audit sheet, never to a rig-facing sheet.
NOT_ON_RIG_SHEETS = re.compile(
    r"pending verification|from memory|METHODS(\.md)? §|second-hand|secondary account", re.I
)


def test_every_entry_of_every_registry_has_an_assessed_status():
    rows = list_methods()
    assert len(rows) == sum(len(r.names()) for r in REGISTRIES) >= 37
    for r in rows:
        assert r["status"] in STATUS_KINDS and r["status"] != "not_assessed", r["name"]
        assert r["evidence"], (r["family"], r["name"])
        assert isinstance(r["caveats"], tuple)
    assert rows[0]["family"] == "hydraulics method" and rows[0]["name"] == DEFAULT_METHOD


def test_statuses_follow_the_tests_that_check_them():
    """Spot checks of calc/METHODS.md status lines (§7.6, §7.3, §3.5/§7.1, §7.5, §10.8)."""
    kind = {(r["family"], r["name"]): r["status"] for r in list_methods()}
    assert kind[("friction law", "exact_laminar")] == "exact_solution"
    assert kind[("friction law", "newtonian")] == "reference_library"
    assert kind[("hydraulics method", "api13d_2010_hb")] == "from_memory"
    assert kind[("friction law", "power_law")] == "published_example"
    assert kind[("slip-velocity method", "fang_2008")] == "published_example"
    assert kind[("slip-velocity method", "moore")] == "from_memory"
    caveats = " ".join(HYDRAULICS_METHODS.get("api13d_2010_hb").status.caveats)
    assert "1.066" in caveats and "from memory" in caveats


def test_registered_sources_are_primary_references_only():
    for r in list_methods():
        assert r["source"] and not NOT_ON_RIG_SHEETS.search(r["source"]), (r["name"], r["source"])


def test_a_preset_carries_its_registered_status():
    for info in HYDRAULICS_METHODS.describe():
        assert info.func.status == info.status != NOT_ASSESSED
        assert resolve_method(info.name).status == info.status


def test_status_is_declared_once_and_kinds_are_checked():
    with pytest.raises(ValueError, match="already declared"):
        HYDRAULICS_METHODS.set_status("newtonian", Verification("exact_solution"))
    with pytest.raises(ValueError, match="not one of"):
        Verification("trust_me")


def test_every_kind_has_words():
    assert set(text.STATUS_LABELS) == set(STATUS_KINDS)
    assert text.status_label("published_example") == "published worked example"
    with pytest.raises(InputError):
        text.status_label("trust_me")


def test_caveats_of_a_method_include_its_parts_once():
    got = method_caveats("api13d_2010_hb", "moore")
    texts = [c for _, _, c in got]
    assert len(texts) == len(set(texts))
    assert {f for f, _, _ in got} >= {"hydraulics method", "slip-velocity method"}
    law = FRICTION_LAWS.get("api13d_2010_hb").status.caveats
    slip = SLIP_METHODS.get("moore").status.caveats
    assert set(law) | set(slip) <= set(texts)
    # an overridden preset is not the preset as assessed: only its parts' caveats
    over = method_caveats(resolve_method("bingham", friction="newtonian"))
    assert all(family != "hydraulics method" for family, _, _ in over)
    assert [n.code for n in caveat_notes("exact_laminar")] == ["method_caveat"]


@pytest.mark.parametrize("registry", REGISTRIES, ids=lambda r: r.what)
def test_unknown_name_is_an_input_error_listing_the_registered_ones(registry):
    with pytest.raises(InputError) as e:
        registry.get("no_such_method")
    message = str(e.value)
    assert registry.what in message and all(n in message for n in registry.names())


def test_cli_unknown_method_is_bad_input(capsys, tmp_path):
    code = main(["report", str(ROOT / "workbooks" / "demo-case.toml"), "-o",
                 str(tmp_path / "r.xlsx"), "--method", "api13d_2011_hb"])  # fmt: skip
    assert code == 2
    err = capsys.readouterr().err
    assert "api13d_2011_hb" in err and "api13d_2010_hb" in err and "Traceback" not in err


# ------------------------------------------------------------------------- the command


def test_methods_command_text(capsys):
    assert main(["methods"]) == 0
    out = capsys.readouterr().out
    assert out.splitlines()[1].startswith(f"  {DEFAULT_METHOD} (default):")
    for r in list_methods():
        assert f"  {r['name']}" in out
    assert "status:   exact solution" in out
    assert "status:   coefficients from memory, not yet checked against the source" in out
    assert out.count("caveat:") == sum(len(r["caveats"]) for r in list_methods())


def test_methods_command_json(capsys):
    assert main(["methods", "--json"]) == 0
    rows = json.loads(capsys.readouterr().out)
    assert [(r["family"], r["name"]) for r in rows] == [
        (r["family"], r["name"]) for r in list_methods()
    ]
    first = rows[0]
    assert first["default"] is True and first["status"] == "from_memory"
    assert first["status_label"] == text.status_label("from_memory")
    assert any("1.066" in c for c in first["caveats"])


# -------------------------------------------------------------------------- the report


@pytest.fixture(scope="module")
def workbook():
    return openpyxl.load_workbook(demo_report_path())


def test_rig_facing_sheets_name_the_primary_source_only(workbook):
    bad = []
    for name in RIG_FACING:
        for row in workbook[name].iter_rows():
            for c in row:
                if isinstance(c.value, str) and NOT_ON_RIG_SHEETS.search(c.value):
                    bad.append(f"{name}!{c.coordinate}: {c.value[:80]}")
    assert not bad, "\n".join(bad)
    a2 = workbook["Hydraulics"]["A2"].value
    name = text.method_words(DEFAULT_METHOD)  # rig-facing sheets name methods in words
    assert f"Method: {name}: {HYDRAULICS_METHODS.get(DEFAULT_METHOD).source};" in a2


def _texts(ws) -> str:
    return "\n".join(c.value for row in ws.iter_rows() for c in row if isinstance(c.value, str))


#: the settling-slurry methods the demo's [[slurry_line]] uses (calc.slurry.SlurryCurve.methods)
DEMO_SLURRY_METHODS = (
    "durand_1952_deposition",
    "wilson_1979_deposition",
    "four_component_2006",
    "wilson_thomas_1985",
)


def test_audit_shows_status_and_every_caveat_of_the_methods_used(workbook):
    audit = _texts(workbook["Audit"])
    assert "Methods used and how they were checked" in audit
    for family, name, caveat in method_caveats(DEFAULT_METHOD, "moore", None, DEMO_SLURRY_METHODS):
        assert caveat in audit, (family, name)
    assert text.status_label("from_memory") in audit


def test_cautions_lists_every_caveat(workbook):
    """The Cautions sheet groups notes by code and subject (addin.text.group_notes): the method
    caveats are one line, counted, each caveat a bullet of its own."""
    ws = workbook["Cautions"]
    rows = [r for r in range(1, ws.max_row + 1) if ws.cell(r, 3).value == "method_caveat"]
    assert len(rows) == 1
    want = method_caveats(DEFAULT_METHOD, "moore", None, DEMO_SLURRY_METHODS)
    assert ws.cell(rows[0], 2).value == len(want)
    bullets = ws.cell(rows[0], 5).value.split("\n")
    assert bullets == [f"• {family} {name}: {caveat}" for family, name, caveat in want]


def test_json_carries_the_status_of_the_methods_used():
    data = results_data(demo_results())
    st = {(d["family"], d["name"]): d for d in data["method_status"]}
    hb = st[("hydraulics method", DEFAULT_METHOD)]
    assert hb["kind"] == "from_memory" and hb["status"] == text.status_label("from_memory")
    assert hb["evidence"] and any("1.066" in c for c in hb["caveats"])
    assert ("slip-velocity method", "moore") in st
    assert sum(n["code"] == "method_caveat" for n in data["notes"]) == len(
        method_caveats(DEFAULT_METHOD, "moore", None, DEMO_SLURRY_METHODS)
    )


# ------------------------------------------------------------------------- the README


def test_readme_methods_table_status_column():
    """The README's table of hydraulics methods gives each method's status in words."""
    readme = (ROOT / "README.md").read_text(encoding="utf-8")
    header = next(line for line in readme.splitlines() if line.startswith("| method | status |"))
    rows = readme.split(header, 1)[1].split("\n\n", 1)[0].strip().splitlines()[1:]
    seen = set()
    for line in rows:
        cells = [c.strip() for c in line.strip("|").split("|")]
        name = re.match(r"`([^`]+)`", cells[0]).group(1)
        assert cells[1] == text.status_label(HYDRAULICS_METHODS.get(name).status.kind), name
        seen.add(name)
    assert seen == set(HYDRAULICS_METHODS.names())


def test_methods_reference_status_table_is_the_generated_one():
    """calc/METHODS.md §17 is what ``boreflow methods --markdown`` prints (regenerate it so)."""
    ref = (ROOT / "calc" / "METHODS.md").read_text(encoding="utf-8")
    section = ref.split("## §17 Verification status per registered method", 1)[1]
    section = section.split("\n## ", 1)[0]  # §17 only: later sections have tables of their own
    table = [line for line in section.splitlines() if line.startswith("|")]
    assert "\n".join(table) == methods_markdown(methods_data())
    assert len(table) == 2 + len(list_methods())
