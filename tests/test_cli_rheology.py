"""`boreflow rheology` through addin.cli.main([...]): output, units, JSON, exit codes."""

import json
from pathlib import Path

import pytest

from addin.cli import main
from addin.commands.exit_codes import EXIT_BAD_INPUT, EXIT_OK
from calc import cautions

DEMO = str(Path(__file__).resolve().parents[1] / "workbooks" / "demo-case.toml")


def test_text_output(capsys):
    assert main(["rheology", DEMO]) == EXIT_OK
    out = capsys.readouterr().out
    # field values of demo check D1 (API RP 13B-1 definitions of the invented readings)
    assert "PV 19 cP" in out and "YP 18 lbf/100ft²" in out and "LSYP 6 lbf/100ft²" in out
    for method in ("api13d_2010_hb", "hb_least_squares", "api13d_1995_annulus", "ranking"):
        assert method in out
    assert "D1 05:30 → D2 05:30" in out and "spacer" in out
    assert out.strip().endswith(cautions.CELL)


def test_json_output_units(capsys):
    assert main(["rheology", DEMO, "--json", "--units", "si"]) == EXIT_OK
    data = json.loads(capsys.readouterr().out)
    d1 = data["checks"][0]
    assert d1["pv"] == pytest.approx(0.019)  # 19 cP in Pa·s
    assert d1["stress_unit"] == "Pa"
    assert {f["method"] for f in d1["fits"]} >= {"api13d_2010_hb", "hb_least_squares"}
    assert data["comparisons"][0]["curves_differ"] is True
    assert data["caution"] == cautions.CELL
    assert main(["rheology", DEMO, "--json", "--units", "metric"]) == EXIT_OK
    metric = json.loads(capsys.readouterr().out)
    assert metric["checks"][0]["viscosity_unit"] == "mPa·s"
    assert metric["checks"][0]["pv"] == pytest.approx(19.0)


def test_bad_input_exit_code_one_line(tmp_path, capsys):
    assert main(["rheology", str(tmp_path / "missing.toml")]) == EXIT_BAD_INPUT
    err = capsys.readouterr().err
    assert err.startswith("boreflow: error:") and err.count("\n") == 1
    bad = tmp_path / "bad.toml"
    text = Path(DEMO).read_text(encoding="utf-8").replace("6 = 8, 3 = 7", "6 = 7, 3 = 8")
    bad.write_text(text, encoding="utf-8")
    assert main(["rheology", str(bad)]) == EXIT_BAD_INPUT
    err = capsys.readouterr().err
    assert "bad.toml" in err and "check[1]" in err and "6 rpm" in err and "Traceback" not in err
    assert main(["rheology", DEMO, "--units", "imperial"]) == EXIT_BAD_INPUT
    assert "invalid choice" in capsys.readouterr().err
    assert main(["nonsense"]) == EXIT_BAD_INPUT
    assert main([]) == EXIT_BAD_INPUT
