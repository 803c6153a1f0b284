"""Bit sheet: nozzles, TFA, jet velocity, bit pressure drop, power, HSI and impact force, each
with a live check."""

from __future__ import annotations

from addin import text
from addin.report.audit import Factors, cell_ref, checked_row, input_row
from addin.report.compute import scalar
from addin.report.style import (
    heading,
    note_row,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.text import display_number as _o
from addin.xlsx_cells import put, set_widths

__all__ = ["write_bit"]


def write_bit(wb, results, factors: Factors, title: str):
    """The Bit sheet: inputs, then each bit quantity with its live check."""
    ws = wb.create_sheet("Bit")
    set_widths(ws, [36, 13, 13, 9, 12, 9, 9, 9, 9, 9, 9])
    row = heading(ws, 1, f"Bit hydraulics: {results.case.bit.name}", span=6, title=True)
    row, inputs = _bit_inputs(ws, row + 1, results)
    f = _bit_factors(factors)
    row = table_header(
        ws, row, 1, ["quantity", "boreflow", "live check", "agree?", "unit", "formula in words"]
    )
    ws.merge_cells(start_row=row - 1, start_column=6, end_row=row - 1, end_column=11)
    row, dp = _jet_rows(ws, row, results, inputs, f)
    row, hsi = _power_rows(ws, row, results, inputs, f, dp[0])
    _share_and_method(ws, row, results)
    setup_print(ws, title)
    return {"dp": dp, "hsi": hsi}


def _bit_inputs(ws, row, results):
    """Rate, density, bit size, discharge coefficient and nozzle cells; returns the next row
    and their references (the nozzles as a range)."""
    res, bit, system = results.circulation, results.case.bit, results.case.unit_system
    q = input_row(ws, row, "flow rate", _o(res.q, "flow_rate", system), "flow_rate", system)
    rho = input_row(
        ws, row + 1, "mud density", _o(res.density, "density", system), "density", system
    )
    size = input_row(ws, row + 2, "bit size", _o(bit.size, "diameter", system), "diameter", system)
    cd = input_row(
        ws,
        row + 3,
        "discharge coefficient",
        bit.discharge_coefficient,
        "dimensionless",
        system,
        "0.00",
    )
    row += 4
    put(ws, row, 1, "nozzle sizes (one cell each)")
    nozzles = bit.nozzles or ()
    for j, nz in enumerate(nozzles):
        put_number(ws, row, 2 + j, nz, "0", "bf_input")
    put(ws, row, 2 + max(len(nozzles), 1), "1/32 in", "bf_unit")
    noz = f"B{row}:{chr(ord('B') + max(len(nozzles), 1) - 1)}{row}"
    return row + 2, (q, rho, size, cd, noz)


def _bit_factors(factors: Factors) -> dict[str, str]:
    """The conversion-factor cells the bit formulas use, by quantity kind (``"in32"``: the
    nozzle size unit), asked for in this order so the Audit table keeps its rows."""
    f = {k: factors.unit(k) for k in ("flow_rate", "density", "area", "pressure")}
    f["in32"] = factors.unit_factor_of("in32", "nozzle")
    for k in ("diameter", "jet_velocity", "power", "power_density", "force"):
        f[k] = factors.unit(k)
    return f


def _jet_rows(ws, row, results, inputs, f):
    """The nozzle rows: TFA (live from the nozzle cells, or as given), nozzle velocity and the
    bit pressure drop.  Returns the next row and the pressure drop's value and formula refs."""
    bit, bh, system = results.case.bit, results.circulation.bit, results.case.unit_system
    q, rho, _, cd, noz = inputs
    if bit.nozzles:
        tfa_v, _ = checked_row(
            ws,
            row,
            "total flow area (TFA)",
            _o(bit.tfa, "area", system),
            f"SUMPRODUCT(PI()/4*({noz}*{f['in32']})^2)/{f['area']}",
            "area",
            system,
            "Σ π/4·d²",
        )
    else:
        put(ws, row, 1, "total flow area (TFA, given)")
        put_number(ws, row, 2, _o(bit.tfa, "area", system), number_format("area", system))
        tfa_v = cell_ref(ws, row, 2)
    checked_row(
        ws,
        row + 1,
        "nozzle velocity",
        _o(scalar(bh.nozzle_velocity), "jet_velocity", system),
        f"{q}*{f['flow_rate']}/({tfa_v}*{f['area']})/{f['jet_velocity']}",
        "jet_velocity",
        system,
        "Q / TFA",
    )
    dp = checked_row(
        ws,
        row + 2,
        "bit pressure drop",
        _o(scalar(bh.pressure_drop), "pressure", system),
        f"{rho}*{f['density']}*({q}*{f['flow_rate']})^2"
        f"/(2*{cd}^2*({tfa_v}*{f['area']})^2)/{f['pressure']}",
        "pressure",
        system,
        "ρQ² / (2·Cd²·TFA²)",
    )
    return row + 3, dp


def _power_rows(ws, row, results, inputs, f, dp_v):
    """What the jets deliver: hydraulic power, HSI and jet impact force, from the pressure drop
    cell ``dp_v``.  Returns the next row and the HSI's value and formula refs."""
    bh, system = results.circulation.bit, results.case.unit_system
    q, rho, size, cd, _ = inputs
    hp_v, _ = checked_row(
        ws,
        row,
        "hydraulic power at the bit",
        _o(scalar(bh.hydraulic_power), "power", system),
        f"{dp_v}*{f['pressure']}*{q}*{f['flow_rate']}/{f['power']}",
        "power",
        system,
        "ΔP_bit · Q",
    )
    hsi = checked_row(
        ws,
        row + 1,
        "HSI (power per bit area)",
        _o(scalar(bh.hsi), "power_density", system),
        f"{hp_v}*{f['power']}/(PI()/4*({size}*{f['diameter']})^2)/{f['power_density']}",
        "power_density",
        system,
        "P_bit / (π/4·d_bit²)",
    )
    checked_row(
        ws,
        row + 2,
        "jet impact force",
        _o(scalar(bh.impact_force), "force", system),
        f"{cd}*{q}*{f['flow_rate']}*SQRT(2*{rho}*{f['density']}*{dp_v}*{f['pressure']})"
        f"/{f['force']}",
        "force",
        system,
        "Cd·Q·√(2ρ·ΔP_bit)",
    )
    return row + 3, hsi


def _share_and_method(ws, row, results) -> None:
    """The bit's share of the standpipe pressure, and the method note below it."""
    res = results.circulation
    put(ws, row, 1, "bit share of standpipe pressure")
    put_number(ws, row, 2, 100 * scalar(res.bit_share), "0.0")
    put(ws, row, 5, "%", "bf_unit")
    note_row(ws, row + 2, f"Method: {text.keys_in_words(res.bit.method)}.", span=11)
