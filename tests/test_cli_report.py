"""boreflow report / calc / batch: outputs, exit codes, one-line errors, nothing half-written.

External references: hydrostatic 12/231 psi/ft per ppg (exact, calc/METHODS.md §0.4); annular
velocity AV[ft/min] = 24.51·Q[gpm]/(Dh² − Dp²) (common practice, exact 77/π;
calc/METHODS.md §0.4); TFA = Σ N²/1303.8 in² (common practice, calc/METHODS.md §8.1).
"""

from __future__ import annotations

import csv
import json
import shutil
import subprocess
import sys

import openpyxl
import pytest
from _report_demo import DEMO, ROOT

from addin.cli import main
from addin.text import method_words


def run(*args):
    return main([str(a) for a in args])


def test_report_writes_and_refuses_to_overwrite(tmp_path, capsys):
    out = tmp_path / "r.xlsx"
    assert run("report", DEMO, "-o", out) == 0
    assert openpyxl.load_workbook(out).sheetnames[0] == "Summary"
    before = out.read_bytes()
    capsys.readouterr()
    assert run("report", DEMO, "-o", out) == 3
    err = capsys.readouterr().err
    assert "already exists" in err and "--force" in err and err.count("\n") == 1
    assert out.read_bytes() == before
    assert run("report", DEMO, "-o", out, "--force") == 0


def test_report_json_carries_every_section(tmp_path, capsys):
    assert run("report", DEMO, "-o", tmp_path / "r.xlsx", "--json") == 0
    data = json.loads(capsys.readouterr().out)
    for key in (
        "run",
        "units",
        "rheology",
        "circulation",
        "margins",
        "bit",
        "cleaning",
        "trips",
        "operating_window",
        "notes",
    ):
        assert key in data, key
    assert data["units"]["pressure"] == "psi"
    parts = sum(data["circulation"]["breakdown"].values())
    assert parts == pytest.approx(data["circulation"]["standpipe_pressure"], rel=1e-12)


@pytest.mark.parametrize(
    ("method", "fits"), [("bingham", "bingham_two_speed"), ("power_law", "power_law_loglog")]
)
def test_report_names_the_fit_of_the_method(tmp_path, capsys, method, fits):
    # The fit a hydraulics method used is named in the JSON run block and on the Hydraulics
    # sheet's method line, and its parameters are among the JSON fits of every check.
    out = tmp_path / "r.xlsx"
    assert run("report", DEMO, "-o", out, "--json", "--method", method) == 0
    data = json.loads(capsys.readouterr().out)
    assert (data["run"]["method"], data["run"]["fluid_fits"]) == (method, fits)
    for check in data["rheology"]["checks"]:
        assert fits in [f["method"] for f in check["fits"]]
    line = openpyxl.load_workbook(out)["Hydraulics"]["A2"].value
    # rig-facing sheets name methods in words (addin.text.method_words)
    words = method_words
    assert f"Method: {words(method)}:" in line and f"fits: {words(fits)};" in line


@pytest.mark.parametrize(
    "content, needle",
    [
        ("[case\nunits = 'oilfield'", "syntax error"),
        ("[[check]]\nlabel='a'\ndensty = 11.0\ndial={600=50,300=30}", "did you mean 'density'"),
        ("[bit]\nsize = 'eight'", "bit.size"),
        ("[nonsense]\n", "unknown key"),
    ],
)
def test_bad_case_gives_one_line_and_exit_2_and_writes_nothing(tmp_path, capsys, content, needle):
    case = tmp_path / "bad.toml"
    case.write_text(content)
    out = tmp_path / "r.xlsx"
    assert run("report", case, "-o", out) == 2
    err = capsys.readouterr().err
    assert needle in err and err.count("\n") == 1 and "Traceback" not in err
    assert not out.exists() and list(tmp_path.iterdir()) == [case]


def test_missing_section_is_named(tmp_path, capsys):
    text = DEMO.read_text(encoding="utf-8")
    start = text.index("[bit]")
    end = text.index("[[string]]")
    case = tmp_path / "nobit.toml"
    case.write_text(text[:start] + text[end:])
    assert run("report", case, "-o", tmp_path / "r.xlsx") == 2
    assert "nobit.toml: bit" in capsys.readouterr().err


def test_workbook_that_is_not_a_workbook(tmp_path, capsys):
    bad = tmp_path / "x.xlsx"
    bad.write_text("well,depth\n")
    assert run("report", bad, "-o", tmp_path / "r.xlsx") == 2
    assert "not a workbook" in capsys.readouterr().err


def test_workbook_error_names_sheet_and_cell(tmp_path, capsys):
    src = tmp_path / "in.xlsx"
    shutil.copy(ROOT / "workbooks" / "input-template.xlsx", src)
    wb = openpyxl.load_workbook(src)
    ws = wb["Mud checks"]
    for row in ws.iter_rows():
        if row[1].value == "density":
            row[4].value = "heavy"
    wb.save(src)
    assert run("report", src, "-o", tmp_path / "r.xlsx") == 2
    err = capsys.readouterr().err
    assert "Mud checks!E" in err and "heavy" in err


def test_missing_output_folder_is_exit_4(tmp_path, capsys):
    assert run("report", DEMO, "-o", tmp_path / "no" / "r.xlsx") == 4
    assert "does not exist" in capsys.readouterr().err


def test_calc_quick_numbers(capsys):
    assert run("calc", "hydrostatic", "--density", 11.0, "--tvd", 10000, "--json") == 0
    d = json.loads(capsys.readouterr().out)
    assert d["hydrostatic_pressure"]["value"] == pytest.approx(11.0 * 10000 * 12 / 231)
    assert run("calc", "annular-velocity", "--rate", 522, "--hole", 8.5, "--pipe", 5, "--json") == 0
    d = json.loads(capsys.readouterr().out)
    assert d["annular_velocity"]["value"] == pytest.approx(24.51 * 522 / (8.5**2 - 5**2), rel=1e-4)
    assert (
        run(
            "calc",
            "bit",
            "--rate",
            522,
            "--density",
            11.2,
            "--size",
            8.5,
            "--nozzles",
            "12,12,12,11,11,11",
            "--json",
        )
        == 0
    )
    d = json.loads(capsys.readouterr().out)
    assert d["total_flow_area"]["value"] == pytest.approx((3 * 144 + 3 * 121) / 1303.8, rel=2e-4)
    assert run("calc", "hydrostatic", "--density", "heavy", "--tvd", 1) == 2


def test_batch_progress_summary_and_failures(tmp_path, capsys):
    cases = tmp_path / "cases"
    cases.mkdir()
    shutil.copy(DEMO, cases / "well-a.toml")
    (cases / "broken.toml").write_text("[case\n")
    outdir = tmp_path / "out"
    outdir.mkdir()
    summary = tmp_path / "summary.csv"
    assert run("batch", cases, "-o", outdir, "--summary", summary) == 5
    cap = capsys.readouterr()
    assert "1 of 2 reports written" in cap.out
    assert "2/2" in cap.err  # progress bar reached the end
    assert (outdir / "well-a-report.xlsx").exists()
    assert not (outdir / "broken-report.xlsx").exists()
    rows = list(csv.DictReader(summary.open()))
    assert {r["case"]: r["status"] for r in rows} == {"broken.toml": "failed", "well-a.toml": "ok"}


def test_help_explains_exit_codes_and_the_first_command():
    proc = subprocess.run(
        [sys.executable, "-m", "addin.cli", "--help"],
        capture_output=True,
        text=True,
        cwd=ROOT,
        check=False,
    )
    assert proc.returncode == 0
    assert "boreflow report workbooks/demo-case.toml" in proc.stdout
    assert "3  output exists" in proc.stdout and "5  batch" in proc.stdout
