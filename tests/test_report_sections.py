"""Hydraulics section rows are exact aggregates of the per-station rows (invented demo data).

The check is against the circulation result of calc itself: the section losses of each flow
path must add up to that path's loss (conservation of the sum; rel 1e-12, float summation
order only), the section lengths to the path's flow length, and every section must stand for
rows of one pipe-in-hole pair only.
"""

from __future__ import annotations

import math

import numpy as np
import openpyxl
import pytest

from addin.report.sections import section_groups, section_rows
from addin.report.sheet_hydraulics import N_COLS, section_table
from calc.span import Span
from calc.units import from_si
from tests._report_demo import demo_report_path, demo_results


@pytest.fixture(scope="module")
def sections():
    return section_table(demo_results())


def test_section_losses_sum_to_the_path_losses_of_calc(sections):
    res = demo_results().circulation
    for path, group in (("surface", res.surface), ("string", res.string), ("annulus", res.annulus)):
        got = sum(sec.values["loss"] for p, sec in sections if p == path)
        assert got == pytest.approx(float(np.sum(group.losses)), rel=1e-12), path
    bd = res.breakdown()
    annulus = sum(sec.values["loss"] for p, sec in sections if p == "annulus")
    assert annulus == pytest.approx(float(bd["annulus"]), rel=1e-12)


def test_section_lengths_and_depths_cover_the_stations(sections):
    iv = demo_results().well.flow_intervals()
    for path in ("string", "annulus"):
        rows = iv.select(path)
        got = sum(sec.values["length"] for p, sec in sections if p == path)
        assert got == pytest.approx(float(np.sum(rows.length)), rel=1e-12)
        for p, sec in sections:
            if p == path:
                ix = np.asarray(sec.rows)
                assert sec.span.top_md == pytest.approx(float(rows.top_md[ix].min()))
                assert sec.span.bottom_md == pytest.approx(float(rows.bottom_md[ix].max()))
                # string: one component; annulus: one pipe/hole pair
                hole = rows.section if path == "annulus" else [""] * len(rows)
                assert len({(rows.component[i], hole[i]) for i in ix}) == 1


def test_one_row_per_pipe_in_hole_pair_and_fewer_than_the_stations(sections):
    res = demo_results().circulation
    ann = [sec for p, sec in sections if p == "annulus"]
    pairs = [(s.span.item, s.span.section, s.span.tool_joint) for s in ann]
    assert len(pairs) == len(set(pairs))
    # demo case: drill pipe in the 9-5/8 in casing and in open hole, each with its tool joints
    assert len(ann) < len(res.annulus.spans)


def test_sheet_section_rows_match_and_detail_is_below_the_print_range(sections):
    ws = openpyxl.load_workbook(demo_report_path())["Hydraulics"]
    heads = [c.row for c in ws["A"] if c.value == "interval"]
    assert len(heads) == 2  # section table, per-station detail
    end = int(str(ws.print_area).split("$")[-1])
    assert heads[0] < end < heads[1]
    losses = [
        ws.cell(r, N_COLS).value
        for r in range(heads[0] + 2, end)
        if isinstance(ws.cell(r, N_COLS).value, int | float)
    ]
    want = [from_si(sec.values["loss"], "psi") for _, sec in sections]  # demo case is oilfield
    assert losses == pytest.approx(want, rel=1e-12)


def test_aggregation_rules_on_a_hand_example():
    # two 50 m stations of one pair and one of another: sums, min/max depths, weighted mean
    s = [
        Span("annulus", "DP", "casing", top_md=0.0, bottom_md=50.0),
        Span("annulus", "DP", "casing", top_md=50.0, bottom_md=150.0),
        Span("annulus", "DP", "open hole", top_md=150.0, bottom_md=200.0),
    ]
    assert section_groups(s) == [(0, 1), (2,)]
    out = section_rows(s, {"g": ([1.0, 4.0, 9.0], "mean"), "r": ([0, 2, 2], "same")}, [50, 100, 50])
    assert out[0].values["g"] == pytest.approx((1.0 * 50 + 4.0 * 100) / 150)
    assert out[0].values["r"] is None and out[1].values["r"] == 2
    assert (out[0].span.top_md, out[0].span.bottom_md) == (0.0, 150.0)
    assert math.isclose(out[1].values["g"], 9.0)
