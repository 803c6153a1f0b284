"""Rotation, stand-off and tool-joint options at the faces: case file, CLI, worksheet
functions and the report.

The numbers are checked against calc (which tests/test_flow_rotation.py and
tests/test_flow_minor_losses.py check against an independent quadrature, exact limits and the
reference library `fluids`), and the joint losses once more against `fluids` here.
"""

import subprocess
import sys
import tomllib
from pathlib import Path

import numpy as np
import pytest

from addin.case import parse_case
from addin.report import compute
from addin.sheets.functions import BF_ECC_STANDOFF, BF_ROT_FACTOR
from calc.errors import InputError
from calc.flow import annulus_flow
from calc.flow.eccentricity import eccentricity_from_standoff
from calc.units import to_si

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "workbooks" / "demo-case.toml"
READINGS = [[600, 56], [300, 37], [200, 29], [100, 20], [6, 8], [3, 7]]


def _doc(**case_keys):
    data = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    data["case"].update(case_keys)
    return data


def test_case_rotation_key_and_check_rpm():
    case = parse_case(_doc(rotation=True))
    assert case.loss_options() == {"rpm": 140.0, "joint_losses": "bore_friction"}
    off = parse_case(_doc(rotation=False))
    assert off.loss_options()["rpm"] == 0.0
    # off by default: the model can only lower the annular loss (CASE-FORMAT.md, rotation)
    assert parse_case(_doc()).loss_options()["rpm"] == 0.0
    k = parse_case(_doc(joint_losses="bore_change_k"))
    assert k.loss_options()["joint_losses"] == "bore_change_k"


def test_unknown_joint_option_names_file_and_key():
    with pytest.raises(InputError) as exc:
        parse_case(_doc(joint_losses="sharp"), "demo.toml")
    msg = str(exc.value)
    assert "demo.toml" in msg and "case.joint_losses" in msg and "bore_change_k" in msg


def test_standoff_key_reaches_the_string_and_bad_values_are_refused():
    data = _doc()
    data["string"][-1]["standoff"] = 0.6
    case = parse_case(data)
    assert case.string.components[-1].standoff == 0.6
    data["string"][-1]["standoff"] = 1.4
    with pytest.raises(InputError) as exc:
        parse_case(data, "demo.toml").well(-1)
    assert "1.4" in str(exc.value)


def test_report_rotation_on_and_off():
    on = compute(parse_case(_doc(rotation=True)))
    off = compute(parse_case(_doc(rotation=False)))
    assert on.circulation.rpm == 140.0 and off.circulation.rpm == 0.0
    assert on.circulation.annulus.total < off.circulation.annulus.total
    assert on.circulation.ecd_bit < off.circulation.ecd_bit
    f = np.asarray(on.circulation.annulus.flow.rotation_factor)
    assert np.allclose(on.circulation.annulus.losses, off.circulation.annulus.losses * f,
                       rtol=1e-12)  # fmt: skip


def test_report_joint_losses_raise_only_the_string_loss():
    base = compute(parse_case(_doc()))
    k = compute(parse_case(_doc(joint_losses="bore_change_k")))
    d_spp = k.circulation.standpipe_pressure - base.circulation.standpipe_pressure
    d_str = k.circulation.string.total - base.circulation.string.total
    assert d_spp > to_si(100.0, "psi") and d_spp == pytest.approx(d_str, rel=1e-12)
    assert k.circulation.annulus.total == base.circulation.annulus.total


def test_cli_joint_losses_option(tmp_path):
    out = {}
    for opt in ("bore_friction", "bore_change_k"):
        r = subprocess.run(
            [sys.executable, "-m", "addin.cli", "calc", "circulate", str(DEMO), "--json",
             "--joint-losses", opt],
            capture_output=True, text=True, cwd=ROOT, check=True,
        )  # fmt: skip
        out[opt] = r.stdout
    assert out["bore_friction"] != out["bore_change_k"]
    r = subprocess.run(
        [sys.executable, "-m", "addin.cli", "calc", "circulate", str(DEMO), "--joint-losses",
         "nope"], capture_output=True, text=True, cwd=ROOT,
    )  # fmt: skip
    assert r.returncode == 2 and "bore_change_k" in r.stderr


def test_worksheet_rotation_factor_is_calcs():
    from calc.circulation import hydraulics_fluid_from_readings
    from calc.rheology import ViscometerReadings

    got = BF_ROT_FACTOR(11, READINGS, 8.5, 5.0, 300, 140)
    mud = ViscometerReadings.from_mapping({int(a): b for a, b in READINGS})
    fl = hydraulics_fluid_from_readings(mud, density=to_si(11.0, "ppg"))
    ty, k, n = fl.annulus_parameters
    ref = annulus_flow(to_si(300.0, "gpm"), to_si(8.5, "in"), to_si(5.0, "in"),
                       density=fl.density, tau_y=ty, k=k, n=n, rpm=140.0)  # fmt: skip
    assert got == pytest.approx(ref.rotation_factor, rel=1e-12) and got < 1.0


def test_worksheet_eccentricity_and_bad_input():
    assert BF_ECC_STANDOFF(0.2, 90) == pytest.approx(
        float(eccentricity_from_standoff(0.2, np.pi / 2)), rel=1e-15
    )
    assert str(BF_ECC_STANDOFF(1.5, 30)).startswith("#BF! stand-off = 1.5")
    assert "rotary speed = -5" in str(BF_ROT_FACTOR(11, READINGS, 8.5, 5.0, 300, -5))
    assert "600] rpm" in str(BF_ROT_FACTOR(11, READINGS, 8.5, 5.0, 300, 700))
