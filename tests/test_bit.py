"""Bit hydraulics: field formulas against the SI forms, and nozzle bad-input checks.

Field constants are derived exactly from SI (calc/METHODS.md §0.4): in = 0.0254 m, ft = 0.3048 m,
lb = 0.45359237 kg, gₙ = 9.80665 m/s², US gal = 231 in³, hp = 550 ft·lbf/s (NIST SP 811).
"""

import numpy as np
import pytest

from calc.bit import (
    Bit,
    bit_hydraulic_power,
    bit_hydraulics,
    bit_pressure_drop,
    hsi,
    impact_force,
    nozzle_velocity,
    parse_nozzles,
    total_flow_area,
)
from calc.errors import InputError
from calc.units import G_N, from_si, to_si

G_IN = G_N / 0.0254  # gₙ in in/s² (386.0886)
G_FT = G_N / 0.3048  # gₙ in ft/s² (32.174049)


def _field(q_gpm=522.0, rho_ppg=11.0, tfa_in2=0.610, cd=0.95):
    return to_si(q_gpm, "gpm"), to_si(rho_ppg, "ppg"), to_si(tfa_in2, "in**2"), cd


@pytest.mark.parametrize(
    "nozzles", [[12, 12, 12, 11, 11, 11], [14, 14, 14], [18, 18, 0, 16], [6], [32, 32, 32, 32]]
)
def test_tfa_field_formula_equals_si(nozzles):
    tfa = from_si(total_flow_area(nozzles), "in**2")
    n = np.asarray(nozzles, dtype=float)
    # exact geometry: (π/4)·Σ(N/32)² in²
    assert tfa == pytest.approx(np.pi / 4 * np.sum((n / 32) ** 2), rel=1e-12)
    # field form Σ N²/1303.8 (common practice, calc/METHODS.md §8.1); 1303.8 = 4096/π rounded
    assert tfa == pytest.approx(np.sum(n**2) / 1303.8, rel=5e-6)


def test_bit_pressure_drop_field_constant_from_bernoulli():
    # SI ΔP = ρQ²/(2C_d²A²) at 1 ppg, 1 gpm, 1 in², C_d = 1 gives the field constant.
    k = from_si(bit_pressure_drop(*_field(1.0, 1.0, 1.0, 1.0)), "psi")
    # exact derivation 231/(7200·g_in) (calc/METHODS.md §0.4)
    assert k == pytest.approx(231.0 / (7200.0 * G_IN), rel=1e-12)
    # published field constant 8.311e-5 (Bourgoyne et al. 1986, ch. 4; from memory,
    # not yet checked against the source — calc/METHODS.md §8.3) and its C_d = 1 reciprocal
    # 1/12,032 (calc/METHODS.md §8.3)
    assert k == pytest.approx(8.311e-5, rel=2e-4)
    assert 1.0 / k == pytest.approx(12032, rel=2e-4)
    # common-practice form with C_d = 0.95: ΔP = MW·Q²/(10,858·TFA²) (calc/METHODS.md §16.4); the
    # exact constant is 0.95²/k = 10,860.6, so the printed 10,858 agrees to 2.5e-4
    q, rho, a, _ = _field(522.0, 11.0, 0.610, 0.95)
    dp = from_si(bit_pressure_drop(q, rho, a, 0.95), "psi")
    assert dp == pytest.approx(11.0 * 522.0**2 / (10858 * 0.610**2), rel=3e-4)


def test_api_156_form_is_a_discharge_coefficient_of_0_951():
    # API RP 13D (1995) ΔP = 156ρQ²/(ΣD_N²)², D_N in 32nds (seen second-hand —
    # calc/METHODS.md §8.3); equating it with ρQ²/(2C_d²A²) gives C_d ≈ 0.951 (derived, same
    # section)
    nozzles = [13, 13, 12, 12, 11]
    q, rho = to_si(480.0, "gpm"), to_si(12.5, "ppg")
    ours_cd1 = from_si(bit_pressure_drop(q, rho, total_flow_area(nozzles), 1.0), "psi")
    api = 156 * 12.5 * 480.0**2 / np.sum(np.square(nozzles)) ** 2
    cd = np.sqrt(ours_cd1 / api)
    assert cd == pytest.approx(0.951, abs=0.0006)


def test_hydraulic_power_field_constant_1714():
    # HHP = ΔP[psi]·Q[gpm]/1714 (Lyons 1996, eq. 4-77); exact 396,000/231 (calc/METHODS.md §0.4)
    dp, q = 1000.0, 500.0
    hp = from_si(bit_hydraulic_power(to_si(q, "gpm"), to_si(dp, "psi")), "hp")
    assert hp == pytest.approx(dp * q / (396000.0 / 231.0), rel=1e-10)
    assert hp == pytest.approx(dp * q / 1714, rel=2e-4)


def test_impact_force_field_constant_0_01823():
    # F = 0.01823·C_d·Q·√(ρΔP) lbf (Lyons 1996, eq. 4-78; Guo & Liu 2011, eq. 2.89);
    # exact constant √38.5/(60√g) (calc/METHODS.md §0.4); equivalently ρ·Q·v_n/1930 (v_n ft/s).
    q_gpm, rho_ppg, dp_psi, cd = 522.0, 11.0, 740.0, 0.95
    f = from_si(
        impact_force(to_si(q_gpm, "gpm"), to_si(rho_ppg, "ppg"), to_si(dp_psi, "psi"), cd), "lbf"
    )
    exact = np.sqrt(38.5) / (60 * np.sqrt(G_FT))
    assert f == pytest.approx(exact * cd * q_gpm * np.sqrt(rho_ppg * dp_psi), rel=1e-10)
    assert f == pytest.approx(0.01823 * cd * q_gpm * np.sqrt(rho_ppg * dp_psi), rel=1e-4)


def test_nozzle_velocity_field_constant_and_bernoulli():
    # v_n[ft/s] = Q/(3.117·A) (Lyons 1996, eq. 4-81); exact 720/231 (calc/METHODS.md §0.4)
    q, rho, a, cd = _field(522.0, 11.0, 0.610, 0.95)
    v = from_si(nozzle_velocity(q, a), "ft/s")
    assert v == pytest.approx(522.0 / (720.0 / 231.0 * 0.610), rel=1e-10)
    assert v == pytest.approx(522.0 / (3.117 * 0.610), rel=1e-4)
    # Bernoulli with losses: v_n = C_d·√(2ΔP/ρ) is the same velocity (exact identity)
    dp = bit_pressure_drop(q, rho, a, cd)
    assert nozzle_velocity(q, a) == pytest.approx(cd * np.sqrt(2 * dp / rho), rel=1e-12)
    # impact = momentum flux ρ·Q·v_n (exact identity)
    assert impact_force(q, rho, dp, cd) == pytest.approx(rho * q * nozzle_velocity(q, a))


def test_hsi_definition():
    # HSI = HHP/(π d²/4), hp/in² (calc/METHODS.md §8.5)
    p = to_si(226.0, "hp")
    assert from_si(hsi(p, to_si(8.5, "in")), "hp/in**2") == pytest.approx(
        226.0 / (np.pi / 4 * 8.5**2)
    )


def test_demo_day1_bit_against_scenario_hand_check():
    # invented demo scenario [expected_approx] day1: bit 740 psi, HSI 4.0, nozzle ~275 ft/s
    # (a simplified hand check good to ±10–15 %; not golden values)
    bit = Bit(to_si(8.5, "in"), nozzles=[12, 12, 12, 11, 11, 11], ports=6)
    h = bit_hydraulics(to_si(522.0, "gpm"), to_si(11.0, "ppg"), bit, to_si(2430.0, "psi"))
    assert from_si(h.pressure_drop, "psi") == pytest.approx(740, rel=0.05)
    assert from_si(h.hsi, "hp/in**2") == pytest.approx(4.0, rel=0.05)
    assert h.share_of_standpipe == pytest.approx(0.31, abs=0.02)
    assert h.notes == ()


def test_vectorised_over_flow_rate():
    bit = Bit(to_si(8.5, "in"), nozzles="3x12 3x11")
    q = to_si(np.linspace(300, 700, 10_000), "gpm")
    h = bit_hydraulics(q, 1318.0, bit)
    assert h.pressure_drop.shape == (10_000,)
    # ΔP ∝ Q² exactly
    np.testing.assert_allclose(h.pressure_drop / q**2, h.pressure_drop[0] / q[0] ** 2)
    assert isinstance(bit_hydraulics(q[0], 1318.0, bit).pressure_drop, float)


def test_bit_notes_high_velocity_low_hsi():
    # common practice (calc/METHODS.md §16.4): nozzle velocity > ~450 ft/s or HSI < ~1 → WARN
    small = Bit(to_si(8.5, "in"), nozzles=[9, 9, 9])
    codes = [n.code for n in bit_hydraulics(to_si(600.0, "gpm"), 1318.0, small).notes]
    assert "high_jet_velocity" in codes
    big = Bit(to_si(12.25, "in"), nozzles=[20, 20, 20, 20])
    codes = [n.code for n in bit_hydraulics(to_si(300.0, "gpm"), 1318.0, big).notes]
    assert "low_hsi" in codes


# ------------------------------------------------------------------ nozzle bad input
def test_nozzle_count_mismatch_7x12_with_6_ports():
    # demo scenario [[bad_input_example]] "nozzle count mismatch": nozzles "7x12", 6 ports → ERROR
    with pytest.raises(InputError, match="7 nozzles for 6 ports"):
        Bit(to_si(8.5, "in"), nozzles="7x12", ports=6)
    with pytest.raises(InputError, match="nozzle count"):
        total_flow_area("7x12", ports=6)


@pytest.mark.parametrize(
    ("nozzles", "match"),
    [
        ([0.375, 0.375], r"12/32\?"),  # common practice: "0.375 → 12/32?" (calc/METHODS.md §16.4)
        ([12, 12.5], "whole 32nds"),
        ([12, -1], ">= 0"),
        ("twelve", "sizes in 32nds"),
        ([], "at least one"),
        ([0, 0, 0], "non-zero"),
    ],
)
def test_nozzle_bad_input(nozzles, match):
    with pytest.raises(InputError, match=match):
        parse_nozzles(nozzles)


def test_nozzle_text_forms_and_notes():
    assert parse_nozzles("3 x 12, 3x11").sizes == (12, 12, 12, 11, 11, 11)
    assert parse_nozzles("6×12").sizes == (12,) * 6  # "6×12" = six (calc/METHODS.md §16.4)
    assert parse_nozzles("12 12 0").sizes == (12, 12, 0)
    assert [n.code for n in parse_nozzles([40, 12]).notes] == ["unusual_nozzle_size"]
    assert [n.code for n in parse_nozzles([12, 12], ports=3).notes] == ["ports_unlisted"]


def test_bit_needs_nozzles_or_tfa_and_checks_both():
    with pytest.raises(InputError, match="bit nozzles"):
        Bit(to_si(8.5, "in"))
    # common practice (calc/METHODS.md §16.4): given TFA vs Σ N²/1303.8 beyond 1–2 % → WARN
    b = Bit(to_si(8.5, "in"), nozzles=[12] * 6, tfa=to_si(0.75, "in**2"))
    assert [n.code for n in b.notes] == ["tfa_mismatch"]
    assert b.tfa == pytest.approx(total_flow_area([12] * 6))
    ok = Bit(to_si(8.5, "in"), nozzles=[12] * 6, tfa=to_si(0.663, "in**2"))
    assert ok.notes == ()
    with pytest.raises(InputError, match="discharge coefficient"):
        Bit(to_si(8.5, "in"), tfa=3e-4, discharge_coefficient=1.5)
    with pytest.raises(InputError, match="flow rate"):
        bit_hydraulics(0.0, 1300.0, ok)
