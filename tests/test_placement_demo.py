"""The demo liner cement job (workbooks/demo-case.toml [cement_job], invented data) through
addin.cement_job: the timeline's conservation and the tightest moment."""

from __future__ import annotations

import math
from functools import lru_cache

import numpy as np
import pytest

from addin.case import load_case
from addin.cement_job import cement_job
from tests.demo_well import CASE_FILE


@lru_cache(maxsize=1)
def _job():
    case = load_case(CASE_FILE)
    return cement_job(case, case.hydraulics_method())


def test_demo_job_conserves_volume_and_bumps_with_the_string_full():
    """Conservation of mass (exact): pumped + well volume = in well + returned at every step;
    at bump the returns have caught up with the pumps (string full)."""
    tl = _job().timeline
    v0 = tl.geometry.total_volume
    np.testing.assert_allclose(
        tl.fluid_volume_in_well.sum(axis=1) + tl.fluid_returned.sum(axis=1),
        v0 + tl.pumped,
        rtol=0,
        atol=1e-9 * v0,
    )
    assert tl.returned[-1] == pytest.approx(tl.pumped[-1], rel=1e-12)
    # bump volume: spacer + slurry + string volume to the float collar
    assert tl.pumped[-1] == pytest.approx(tl.train.cement_end + tl.geometry.float_collar_s)


def test_demo_job_tightest_moment_and_key_moments():
    """The tightest moment of the demo job is against fracture at Sand B; the key moments come
    in pumping order (positions follow from volumes, exact)."""
    job = _job()
    tl = job.timeline
    assert tl.tightest.point.startswith("Sand B")
    assert tl.tightest.limit == "fracture"
    k = tl.key_moments
    assert k["cement_at_shoe"] < k["spacer_at_liner_top"] < k["bump"]


def test_demo_top_of_cement_at_bump_from_the_annular_capacities():
    """Top of cement at bump by hand from capacities (exact: volume = π/4·(D² − d²)·L): the
    slurry less the shoe track fills the open hole × liner annulus, the rest the casing × liner
    overlap above the 9-5/8 in shoe."""
    tl = _job().timeline
    inch, ft, bbl = 0.0254, 0.3048, 0.158987294928
    area = lambda d_out, d_in: math.pi / 4 * ((d_out * inch) ** 2 - (d_in * inch) ** 2)  # noqa: E731
    v = 95.0 * bbl - area(6.184, 0.0) * (11860.0 - 11780.0) * ft
    v_oh = area(8.6, 7.0) * (11860.0 - 8200.0) * ft
    assert v > v_oh
    toc = 8200.0 * ft - (v - v_oh) / area(8.835, 7.0)
    assert tl.toc_md[-1] == pytest.approx(toc, rel=1e-9)
    # the U-tube during the plug drop shows as free fall
    assert tl.free_fall.any()
    assert len(tl.pumped) > 2000


@pytest.mark.parametrize(
    ("old", "new", "words"),
    [
        ("slurry_volumes = [95.0]", "slurry_volumes = [-95.0]", "volume = -95 bbl"),
        ("slurry_volumes = [95.0]", "slurry_volumes = [5000.0]", "5,040 bbl"),
        ('pump_rate = "5 bbl/min"', 'pump_rate = "-5 bbl/min"', "cement_job.pump_rate"),
        ('slurries = ["liner slurry (extended Class G)"]', 'slurries = ["tail"]', "'tail'"),
        ("slow_volume = 20.0 ", "slow_volume = 2000.0 ", "2,000 bbl"),
    ],
)
def test_bad_cement_job_inputs_name_the_input_in_the_case_units(tmp_path, old, new, words):
    """Bad [cement_job] input: an InputError naming the input and the value in the case's
    units (project rule), never a traceback."""
    from addin import text
    from calc.errors import InputError

    src = CASE_FILE.read_text(encoding="utf-8")
    assert old in src
    p = tmp_path / "bad.toml"
    p.write_text(src.replace(old, new), encoding="utf-8")
    with pytest.raises(InputError) as exc:
        case = load_case(p)
        cement_job(case, case.hydraulics_method())
    assert words in text.error(exc.value, "oilfield")
