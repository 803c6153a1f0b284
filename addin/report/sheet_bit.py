"""Bit sheet: nozzles, TFA, jet velocity, bit pressure drop, power, HSI and impact force, each
with a live check."""

from __future__ import annotations

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
    case, res, system = results.case, results.circulation, results.case.unit_system
    bit, bh = case.bit, res.bit
    ws = wb.create_sheet("Bit")
    set_widths(ws, [36, 13, 13, 9, 12, 9, 9, 9, 9, 9, 9])
    row = heading(ws, 1, f"Bit hydraulics: {bit.name}", span=6, title=True)
    row, (q, rho, size, cd, noz) = _bit_inputs(ws, row + 1, results)
    nozzles = bit.nozzles or ()
    fq, fr, fa, fp = (
        factors.unit("flow_rate"),
        factors.unit("density"),
        factors.unit("area"),
        factors.unit("pressure"),
    )
    f32 = factors.unit_factor_of("in32", "nozzle")
    fd, fv = factors.unit("diameter"), factors.unit("jet_velocity")
    fw, fpd, ff = factors.unit("power"), factors.unit("power_density"), factors.unit("force")
    row = table_header(
        ws, row, 1, ["quantity", "boreflow", "live check", "agree?", "unit", "formula in words"]
    )
    ws.merge_cells(start_row=row - 1, start_column=6, end_row=row - 1, end_column=11)
    refs = {}
    if nozzles:
        tfa_v, _ = checked_row(
            ws,
            row,
            "total flow area (TFA)",
            _o(bit.tfa, "area", system),
            f"SUMPRODUCT(PI()/4*({noz}*{f32})^2)/{fa}",
            "area",
            system,
            "Σ π/4·d²",
        )
    else:
        put(ws, row, 1, "total flow area (TFA, given)")
        put_number(ws, row, 2, _o(bit.tfa, "area", system), number_format("area", system))
        tfa_v = cell_ref(ws, row, 2)
    row += 1
    sv = scalar
    checked_row(
        ws,
        row,
        "nozzle velocity",
        _o(sv(bh.nozzle_velocity), "jet_velocity", system),
        f"{q}*{fq}/({tfa_v}*{fa})/{fv}",
        "jet_velocity",
        system,
        "Q / TFA",
    )
    row += 1
    dp_v, dp_f = checked_row(
        ws,
        row,
        "bit pressure drop",
        _o(sv(bh.pressure_drop), "pressure", system),
        f"{rho}*{fr}*({q}*{fq})^2/(2*{cd}^2*({tfa_v}*{fa})^2)/{fp}",
        "pressure",
        system,
        "ρQ² / (2·Cd²·TFA²)",
    )
    row += 1
    hp_v, _ = checked_row(
        ws,
        row,
        "hydraulic power at the bit",
        _o(sv(bh.hydraulic_power), "power", system),
        f"{dp_v}*{fp}*{q}*{fq}/{fw}",
        "power",
        system,
        "ΔP_bit · Q",
    )
    row += 1
    hsi_v, hsi_f = checked_row(
        ws,
        row,
        "HSI (power per bit area)",
        _o(sv(bh.hsi), "power_density", system),
        f"{hp_v}*{fw}/(PI()/4*({size}*{fd})^2)/{fpd}",
        "power_density",
        system,
        "P_bit / (π/4·d_bit²)",
    )
    row += 1
    checked_row(
        ws,
        row,
        "jet impact force",
        _o(sv(bh.impact_force), "force", system),
        f"{cd}*{q}*{fq}*SQRT(2*{rho}*{fr}*{dp_v}*{fp})/{ff}",
        "force",
        system,
        "Cd·Q·√(2ρ·ΔP_bit)",
    )
    row += 1
    put(ws, row, 1, "bit share of standpipe pressure")
    put_number(ws, row, 2, 100 * sv(res.bit_share), "0.0")
    put(ws, row, 5, "%", "bf_unit")
    row += 2
    note_row(ws, row, f"Method: {bh.method}.", span=11)
    refs.update(dp=(dp_v, dp_f), hsi=(hsi_v, hsi_f))
    setup_print(ws, title)
    return refs


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
