"""Cautions sheet: one line per note code and wording with a count and the affected span,
worst level first (issue 14: one note per depth station flooded the sheet)."""

from __future__ import annotations

from pathlib import Path

import openpyxl

from addin import text
from addin.case import load_case
from addin.report import compute, write_report
from tests._report_demo import DEMO, demo_report_path

LEVELS = ["CAUTION", "WARNING", "INFO"]


def _note_lines(path):
    ws = openpyxl.load_workbook(path)["Cautions"]
    rows = [[c.value for c in r] for r in ws.iter_rows()]
    start = next(i for i, r in enumerate(rows) if r[:5] == ["level", "count", "code", "about",
                                                            "message"])  # fmt: skip
    return [r[:5] for r in rows[start + 1 :] if r[0] in LEVELS]


def _check_lines(lines, n_notes):
    keys = [(r[2], r[3]) for r in lines]
    assert len(keys) == len(set(keys)), "two lines with the same code and span"
    ranks = [LEVELS.index(r[0]) for r in lines]
    assert ranks == sorted(ranks), "worst level first"
    assert sum(r[1] for r in lines) == n_notes  # every note is counted once


def test_demo_cautions_have_no_repeated_code_and_span():
    from tests._report_demo import demo_results

    lines = _note_lines(demo_report_path())
    _check_lines(lines, len(demo_results().notes))
    codes = [r[2] for r in lines]
    # the loop's per-interval note and calc.flow's per-evaluation note share one code now
    assert "annular_velocity_below_critical" not in codes
    assert "below_critical_velocity" in codes


def test_bad_case_gives_a_short_grouped_list(tmp_path):
    """An invented bad variant of the demo (150 gpm, 12.9 ppg at the latest check): the ECD is
    near fracture at every station of the open hole; the sheet gives one line for them."""
    src = DEMO.read_text(encoding="utf-8")
    src = src.replace("flow_rate = 522.0", "flow_rate = 150.0").replace(
        "density = 11.2", "density = 12.9"
    )
    case = tmp_path / "bad.toml"
    case.write_text(src, encoding="utf-8")
    res = compute(load_case(case))
    near = [n for n in res.notes if n.code == "ecd_near_fracture"]
    assert len(near) > 20
    out = write_report(res, Path(tmp_path) / "bad.xlsx")
    lines = _note_lines(out)
    _check_lines(lines, len(res.notes))
    assert len(lines) < len(res.notes) / 2
    # the stations (Span subjects) in one line; a named weak point keeps its own line
    stations = [n for n in near if not isinstance(n.subject, str)]
    ecd = [r for r in lines if r[2] == "ecd_near_fracture" and "places" in r[3]]
    assert len(ecd) == 1 and ecd[0][1] == len(stations) > 20 and ecd[0][0] == "CAUTION"
    mds = [n.subject.top_md for n in stations]
    assert ecd[0][3].startswith(f"{len(stations)} places, " + text.depth_span(min(mds), max(mds)))


def test_distinct_messages_about_one_thing_stay_readable():
    """Notes of one code about one named thing (the method caveats) become one line that lists
    every distinct message, none lost."""
    from calc.notes import Note

    ns = [Note("warning", "method_caveat", t, "method") for t in ("first caveat", "second")]
    (g,) = text.group_notes(ns)
    assert g.count == 2 and "first caveat" in g.message and "second" in g.message


def test_filled_wordings_about_one_thing_are_all_listed():
    from calc.notes import Note
    from calc.values import Value

    ns = [Note("warning", "method_caveat", "{c}", "method", values=(Value("c", t),))
          for t in ("alpha caveat", "beta caveat")]  # fmt: skip
    (g,) = text.group_notes(ns)
    assert "alpha caveat" in g.message and "beta caveat" in g.message
    assert "the others differ" not in g.message
