"""Build workbooks/demo-workbook.xlsx: a daily hydraulics sheet driven by boreflow functions.

    python workbooks/build_demo_workbook.py [--check D1|D2] [--out PATH] [--live]

The inputs come from the invented demo case (workbooks/demo-case.toml): one mud check, the
string, the hole, the bit.  Every result cell is a ``BF_…`` formula (or a SUM of them), so the
sheet recomputes when an input changes once the functions are enabled (see
workbooks/worksheet-functions.md); ``addin.sheets.engine.calculate`` computes it headlessly.

The workbook is shipped *computed*: the build runs ``boreflow sheets compute`` on it, so every
formula cell also stores its value and LibreOffice, macOS and Linux users see numbers instead
of ``#NAME?``.  Ordinary formulas stay live; the array formulas (the fits table, the rate sweep,
the units list, the gel-break and surge columns) are stored as values, with their text on the
sheet "BF array formulas" (LibreOffice recomputes array formulas on opening).  ``--live``
writes the uncomputed workbook with every array formula live (for Excel with the functions).

Layout (a design of our own): one sheet "Daily hydraulics" in six bands, inputs in blue-grey
cells on the left of each band, results to the right — 1 mud check and readings,
2 rheology, 3 circulating losses (and the gel-break pressure) interval by interval, 4 bit and
ECD, 5 hole cleaning, 6 surge and swab for the planned trip speeds and trip-speed limits — plus
"Rate sweep" (a column of rates through the array form of the functions), "Units" and the
"xlwings.conf" sheet that tells xlwings where the functions are.

The sheet is a hand-level calculation: intervals are concentric, tool joints and the MWD/RSS
drop are not modelled here (the drop is typed in from the supplier's sheet); the full-well
calculation is boreflow's report.  All data are invented.
"""

from __future__ import annotations

import argparse
import sys
import tomllib
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np
from openpyxl import Workbook
from openpyxl.styles import Alignment, Font, PatternFill
from openpyxl.worksheet.formula import ArrayFormula

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE.parent))

from addin.workbook_template import page_setup  # noqa: E402
from calc.geometry import Survey  # noqa: E402
from calc.units import UNIT_SYSTEMS  # noqa: E402

CASE = HERE / "demo-case.toml"
OUT = HERE / "demo-workbook.xlsx"
SHEET = "Daily hydraulics"

_INPUT = PatternFill("solid", fgColor="DCE3EA")
_HEAD = Font(bold=True, size=12)
_BOLD = Font(bold=True)


def _skip_empty(formula):
    """An option left out in the middle of a call is given as "" (empty text): every
    spreadsheet passes that to the function as a blank, whereas an empty argument (",,")
    reaches some engines as 0."""
    if isinstance(formula, str) and formula.startswith("="):
        while ",," in formula:
            formula = formula.replace(",,", ',"",')
    return formula


def _array(ref: str, formula: str) -> ArrayFormula:
    return ArrayFormula(ref, _skip_empty(formula))


@dataclass
class Interval:
    path: str  # "surface", "string" or "annulus"
    name: str
    d_outer: float  # in: pipe ID, or hole/casing ID
    d_inner: float | None  # in: pipe OD for an annulus
    length: float  # ft
    above_shoe: bool = False


@dataclass
class Layout:
    """Where things are: name → cell address on the main sheet (and the sweep ranges)."""

    cells: dict[str, str] = field(default_factory=dict)
    intervals: list[Interval] = field(default_factory=list)
    loss_cells: list[str] = field(default_factory=list)
    cleaning_rows: list[tuple[Interval, dict[str, str]]] = field(default_factory=list)
    sweep_rates: list[float] = field(default_factory=list)
    sweep_cells: dict[str, list[str]] = field(default_factory=dict)
    check: dict = field(default_factory=dict)
    tvd: dict[str, float] = field(default_factory=dict)
    surge: dict = field(default_factory=dict)


def _intervals(case: dict, bit_depth: float) -> list[Interval]:
    """Concentric intervals from the case: surface lines, string (bit up), annulus."""
    out = [Interval("surface", s["name"], s["id"], None, s["length"]) for s in case["surface_line"]]
    string = case["string"]
    fixed = sum(c["length"] for c in string if c["length"] != "fill")
    fill = bit_depth - fixed
    lengths = [fill if c["length"] == "fill" else c["length"] for c in string]
    for comp, length in reversed(list(zip(string, lengths, strict=True))):
        out.append(Interval("string", comp["name"], comp["id"], None, length))
    shoe = max(c["shoe"] for c in case["casing"])
    casing_id = min(c["id"] for c in case["casing"])
    hole = case["open_hole"]["diameter"]
    top = 0.0
    for comp, length in reversed(list(zip(string, lengths, strict=True))):
        bottom = top + length
        if top < shoe:
            seg = min(bottom, shoe) - top
            out.append(
                Interval("annulus", f"{comp['name']} in casing", casing_id, comp["od"], seg, True)
            )
        if bottom > shoe:
            seg = bottom - max(top, shoe)
            out.append(Interval("annulus", f"{comp['name']} in open hole", hole, comp["od"], seg))
        top = bottom
    return out


def _cut(intervals: list[Interval], md: float) -> list[Interval]:
    """The annular intervals from surface down to ``md`` (the last one shortened)."""
    out, top = [], 0.0
    for iv in intervals:
        if top >= md:
            break
        length = min(iv.length, md - top)
        out.append(Interval("annulus", iv.name, iv.d_outer, iv.d_inner, length, iv.above_shoe))
        top += iv.length
    return out


def _surge_band(case, lay, put, head, r, ref, readings, u, first_ann, last, survey) -> int:
    """Band 6: surge and swab at the bit for the planned speeds, trip-speed limits at the
    weak points, breaking circulation.  Returns the next free row."""
    ft = 0.3048
    lim = case["limits"]
    sand = next(w for w in case["weak_point"] if "Sand B" in w["name"])
    shoe_wp = next(w for w in case["weak_point"] if "shoe" in w["name"])
    win = case["pressure_window"]
    # swab at the bit: the pore pressure at the bit's own TVD (linear in TVD between the
    # window's stations, as calc.circulation.PressureWindow.pore_at), never one from the
    # undrilled formation below the bit
    pore_bit = float(np.interp(lay.tvd["bit"], win["tvd"], win["pore"]))
    tvd_sand = float(survey.tvd_at(sand["md"] * ft)) / ft
    sv = lay.surge
    rho = ref["density"]
    head(r, "6  Surge and swab while tripping (closed string, float valve; Burkhardt, steady)")
    r += 1
    speeds = [float(x) for x in case["trip"]["speeds"]]
    put(f"A{r}", "Average stand speed [ft/min]")
    cols_run, cols_pull = "BCDE", "FGHI"
    for col, v in zip(cols_run, speeds, strict=True):
        put(f"{col}{r}", v, fill=_INPUT)
    speed_row = r
    r += 1
    put(f"A{r}", "interval", bold=True)
    for cr_, cp, v in zip(cols_run, cols_pull, speeds, strict=True):
        put(f"{cr_}{r}", f"surge @ {v:g} [psi]", bold=True)
        put(f"{cp}{r}", f"swab @ {v:g} [psi]", bold=True)
    r += 1
    top, n_ann = r, last - first_ann + 1
    bottom = top + n_ann - 1
    geo = f"$C${first_ann}:$C${last},$D${first_ann}:$D${last},$E${first_ann}:$E${last}"
    sv["names"] = []
    for i in range(n_ann):
        put(f"A{top + i}", f"=A{first_ann + i}")
        sv["names"].append((f"A{top + i}", f"A{first_ann + i}"))
    sv["columns"] = []
    for cols, direction in ((cols_run, "running"), (cols_pull, "pulling")):
        for j, col in enumerate(cols):
            speed = f"{cols_run[j]}${speed_row}"
            sv["columns"].append((col, speeds[j], direction))
            put(
                f"{col}{top}",
                _array(
                    f"{col}{top}:{col}{bottom}",
                    f'=BF_SURGE({rho},{readings},{geo},{speed},"{direction}",,,,,,{u})',
                ),
                fmt="0.0",
            )
    sv["rows"] = (top, bottom)
    r = bottom + 1
    put(f"A{r}", "Total at the bit [psi]", bold=True)
    put(f"A{r + 1}", "EMW at the bit [ppg]", bold=True)
    for col in cols_run + cols_pull:
        put(f"{col}{r}", f"=SUM({col}{top}:{col}{bottom})", fmt="0.0")
        put(f"{col}{r + 1}", f"=BF_SURGE_EMW({rho},{ref['tvd_bit']},{col}{top}:{col}{bottom},,{u})",
            fmt="0.000")  # fmt: skip
    sv["total_row"], sv["emw_row"] = r, r + 1
    r += 3

    # trip-speed limits: inputs, then the intervals above Sand B
    inputs = [
        ("surge_lim_sand", f"Surge limit EMW at {sand['name']} (fracture − margin)",
         round(sand["fracture"] - lim["trip_fracture_margin"], 3), "ppg"),
        ("sand_md", f"{sand['name']} MD", sand["md"], "ft"),
        ("sand_tvd", f"{sand['name']} TVD (from the survey)", round(tvd_sand, 2), "ft"),
        ("surge_lim_shoe", f"Surge limit EMW at the {shoe_wp['name']} (FIT − margin)",
         round(shoe_wp["fracture"] - lim["trip_fracture_margin"], 3), "ppg"),
        ("swab_lim", "Swab limit EMW at the bit (pore at the bit TVD + margin)",
         round(pore_bit + lim["trip_pore_margin"], 3), "ppg"),
    ]  # fmt: skip
    for name, label, value, unit in inputs:
        put(f"A{r}", label)
        put(f"B{r}", value, name=name, fill=_INPUT)
        put(f"C{r}", unit)
        ref[name] = f"$B${r}"
        r += 1
    r += 1
    put(f"A{r}", f"Annulus from surface to {sand['name']}", bold=True)
    for col, text in zip("CDE", ("outer [in]", "inner [in]", "length [ft]"), strict=True):
        put(f"{col}{r}", text, bold=True)
    r += 1
    sand_ivs = _cut([iv for iv in lay.intervals if iv.path == "annulus"], sand["md"])
    s_top = r
    for iv in sand_ivs:
        put(f"A{r}", iv.name)
        put(f"C{r}", iv.d_outer, fill=_INPUT)
        put(f"D{r}", iv.d_inner, fill=_INPUT)
        put(f"E{r}", round(iv.length, 2), fill=_INPUT)
        r += 1
    s_bot = r - 1
    sv["sand_rows"] = (s_top, s_bot)
    sv["sand_intervals"] = sand_ivs
    sand_geo = f"$C${s_top}:$C${s_bot},$D${s_top}:$D${s_bot},$E${s_top}:$E${s_bot}"
    shoe_last = max(
        first_ann + i for i in range(n_ann) if lay.intervals[first_ann - 35 + i].above_shoe
    )
    shoe_geo = (
        f"$C${first_ann}:$C${shoe_last},$D${first_ann}:$D${shoe_last},$E${first_ann}:$E${shoe_last}"
    )
    sv["shoe_rows"] = (first_ann, shoe_last)
    r += 1
    limits = [
        ("run_sand", f"Max running speed, {sand['name']} [ft/min]",
         f'=BF_TRIP_SPEED({rho},{readings},{sand_geo},{ref["surge_lim_sand"]},{ref["sand_tvd"]},"running",,,,,,,{u})'),
        ("run_shoe", f"Max running speed, {shoe_wp['name']} [ft/min]",
         f'=BF_TRIP_SPEED({rho},{readings},{shoe_geo},{ref["surge_lim_shoe"]},{ref["tvd_shoe"]},"running",,,,,,,{u})'),
        ("pull_bit", "Max pulling speed, bit [ft/min]",
         f'=BF_TRIP_SPEED({rho},{readings},{geo},{ref["swab_lim"]},{ref["tvd_bit"]},"pulling",,,,,,,{u})'),
        ("gel_emw", "Bottom EMW while breaking circulation [ppg]",
         f"=BF_SURGE_EMW({rho},{ref['tvd_bit']},$G${first_ann}:$G${last},,{u})"),
    ]  # fmt: skip
    for name, label, formula in limits:
        put(f"A{r}", label)
        put(f"F{r}", formula, name=name, fmt="0.0" if name != "gel_emw" else "0.000")
        r += 1
    return r + 1


def build(out: Path = OUT, check_label: str = "D1", *, computed: bool = False) -> Layout:
    """Write the demo workbook to ``out``; with ``computed`` also store every value (as
    ``boreflow sheets compute`` does).  Returns the layout (where every result is)."""
    if computed:
        # lazy: the computing step needs the formula engine; building the formulas does not
        from addin.commands.sheets import compute_file

        plain = Path(out).with_suffix(".live.xlsx")
        lay = build(plain, check_label)
        try:
            compute_file(plain, out, force=True)
        finally:
            plain.unlink(missing_ok=True)
        return lay
    case = tomllib.loads(CASE.read_text(encoding="utf-8"))
    check = next(c for c in case["check"] if c["label"].startswith(check_label))
    st = case["survey"]["stations"]
    ft = 0.3048
    # stations are in ft (the case's oilfield units); the survey works in metres
    survey = Survey([s[0] * ft for s in st], [s[1] for s in st], [s[2] for s in st])
    shoe = max(c["shoe"] for c in case["casing"])
    tvd_bit = float(survey.tvd_at(check["bit_depth"] * ft)) / ft
    tvd_shoe = float(survey.tvd_at(shoe * ft)) / ft
    lay = Layout(check=check, tvd={"bit": tvd_bit, "shoe": tvd_shoe})
    lay.intervals = _intervals(case, check["bit_depth"])

    wb = Workbook()
    ws = wb.active
    ws.title = SHEET
    for col, width in zip("ABCDEFGHIJ", (34, 14, 14, 14, 14, 16, 16, 16, 16, 16), strict=True):
        ws.column_dimensions[col].width = width

    def put(addr, value, *, name=None, fill=None, bold=False, fmt=None):
        ws[addr] = _skip_empty(value)
        if fill:
            ws[addr].fill = fill
        if bold:
            ws[addr].font = _BOLD
        if fmt:
            ws[addr].number_format = fmt
        if name:
            lay.cells[name] = addr

    def head(row, text):
        ws[f"A{row}"] = text
        ws[f"A{row}"].font = _HEAD

    # ------------------------------------------------------------------ band 0: title
    ws["A1"] = f"{case['case']['title']} — daily hydraulics (boreflow worksheet functions)"
    ws["A1"].font = Font(bold=True, size=14)
    put("A2", "=BF_CAUTION()", name="caution")
    ws["A2"].alignment = Alignment(wrap_text=False)
    put("A3", "Computed by")
    put("B3", "=BF_VERSION()", name="version")
    put("A4", "Units (blank = oilfield)")
    put("B4", None, name="units", fill=_INPUT)
    u = "$B$4"

    # ------------------------------------------------------------------ band 1: mud check
    head(6, "1  Mud check")
    rows = [
        ("check", "Check", check["label"], ""),
        ("density", "Mud density", check["density"], "ppg"),
        ("rate", "Flow rate", check["flow_rate"], "gpm"),
        ("rop", "ROP", check["rop"], "ft/h"),
        ("bit_md", "Bit depth (MD)", check["bit_depth"], "ft"),
        ("tvd_bit", "Bit depth (TVD, from the survey)", round(tvd_bit, 2), "ft"),
        ("shoe_md", "Last shoe (MD)", shoe, "ft"),
        ("tvd_shoe", "Last shoe (TVD, from the survey)", round(tvd_shoe, 2), "ft"),
        ("cut_size", "Cuttings size", check["cuttings"]["size"], "in"),
        ("cut_density", "Cuttings density", check["cuttings"]["density"], "(text with unit)"),
        ("tool_dp", "MWD/RSS pressure drop (supplier sheet)", 320.0, "psi"),
        ("pwd", "PWD ECD (measured)", check["pwd"]["ecd"], "ppg"),
        ("spp_measured", "Standpipe pressure (measured)", check["measured_spp"], "psi"),
        ("gel10", "10-minute gel", check["gels"]["10min"], "lbf/100ft²"),
    ]
    r = 7
    for name, label, value, unit in rows:
        put(f"A{r}", label)
        put(f"B{r}", value, name=name, fill=_INPUT)
        put(f"C{r}", unit)
        r += 1
    ref = {k: f"$B${int(v[1:])}" for k, v in lay.cells.items() if v.startswith("B")}
    put("E6", "rpm", bold=True)
    put("F6", "dial", bold=True)
    speeds = sorted((float(k) for k in check["dial"]), reverse=True)
    for i, s in enumerate(speeds):
        put(f"E{7 + i}", s, fill=_INPUT)
        put(f"F{7 + i}", check["dial"][f"{s:g}"], fill=_INPUT)
    readings = f"$E$7:$F${6 + len(speeds)}"
    lay.cells["readings"] = readings
    put("E14", "Nozzles (1/32 in)")
    nozzle_text = " ".join(str(n) for n in case["bit"]["nozzles"])
    put("F14", nozzle_text, name="nozzles", fill=_INPUT)
    put("E15", "Bit size (in)")
    put("F15", case["bit"]["size"], name="bit_size", fill=_INPUT)
    ref.update(nozzles="$F$14", bit_size="$F$15")

    # ------------------------------------------------------------------ band 2: rheology
    head(21, "2  Rheology")
    for i, (label, formula, name) in enumerate(
        [
            ("PV [cP]", f"=BF_PV({readings},{u})", "pv"),
            ("YP [lbf/100ft²]", f"=BF_YP({readings},{u})", "yp"),
            ("LSYP [lbf/100ft²]", f"=BF_LSYP({readings},{u})", "lsyp"),
            ("AV [cP]", f"=BF_AV({readings},{u})", "av"),
            ("τy, API RP 13D HB", f'=BF_TAU_Y({readings},"api13d_2010_hb",{u})', "tau_y"),
            ("K, API RP 13D HB", f'=BF_K({readings},"api13d_2010_hb",{u})', "k"),
            ("n, API RP 13D HB", f'=BF_N({readings},"api13d_2010_hb")', "n"),
        ]
    ):
        put(f"A{22 + i}", label)
        put(f"B{22 + i}", formula, name=name, fmt="0.000")
    put("D21", "All fits, best first (array formula)", bold=True)
    fits_rows = 11  # header + one row per registered viscometer fit
    ws["D22"] = _array(f"D22:K{21 + fits_rows}", f"=BF_FITS({readings},{u})")
    lay.cells["fits"] = f"D22:K{21 + fits_rows}"

    # ------------------------------------------------------------------ band 3: losses
    head(33, "3  Circulating pressure losses (concentric, no tool joints)")
    for col, text in zip(
        "ABCDEF",
        ("interval", "path", "outer [in]", "inner [in]", "length [ft]", "loss [psi]"),
        strict=True,
    ):
        put(f"{col}34", text, bold=True)
    put("G34", "gel break [psi]", bold=True)
    r = 35
    rho, q = ref["density"], ref["rate"]
    for iv in lay.intervals:
        put(f"A{r}", iv.name)
        put(f"B{r}", iv.path)
        put(f"C{r}", iv.d_outer, fill=_INPUT)
        put(f"D{r}", iv.d_inner, fill=_INPUT)
        put(f"E{r}", round(iv.length, 2), fill=_INPUT)
        if iv.path == "annulus":
            f = f"=BF_ANN_LOSS({rho},{readings},C{r},D{r},E{r},{q},,,{u})"
        else:
            f = f"=BF_PIPE_LOSS({rho},{readings},C{r},E{r},{q},,{u})"
        put(f"F{r}", f, fmt="0.0")
        lay.loss_cells.append(f"F{r}")
        r += 1
    last = r - 1
    ann_rows = [i for i, iv in enumerate(lay.intervals) if iv.path == "annulus"]
    shoe_rows = [i for i, iv in enumerate(lay.intervals) if iv.path == "annulus" and iv.above_shoe]
    first_ann = 35 + ann_rows[0]
    first_str = 35 + next(i for i, iv in enumerate(lay.intervals) if iv.path == "string")
    # pressure to break the gel, string and annulus rows (blank inner diameter: pipe bore)
    ws[f"G{first_str}"] = _array(
        f"G{first_str}:G{last}",
        f"=BF_BREAK_CIRC({ref['gel10']},$C${first_str}:$C${last},$E${first_str}:$E${last},"
        f"$D${first_str}:$D${last},{u})",
    )
    lay.surge["gel_rows"] = (first_str, last)
    r += 1
    totals = [
        ("surface", "Surface lines", f'=SUMIF($B$35:$B${last},"surface",$F$35:$F${last})'),
        ("string_loss", "Drill string", f'=SUMIF($B$35:$B${last},"string",$F$35:$F${last})'),
        ("annulus_loss", "Annulus", f'=SUMIF($B$35:$B${last},"annulus",$F$35:$F${last})'),
        ("annulus_shoe", "Annulus above the shoe", f"=SUM($F${first_ann}:$F${35 + shoe_rows[-1]})"),
        ("bit_dp", "Bit nozzles", f"=BF_BIT_DP({rho},{ref['nozzles']},{q},,{u})"),
        ("tools", "MWD/RSS (typed in)", f"={ref['tool_dp']}"),
        ("gel_break", "Pressure to break circulation (gel)", f"=SUM(G{first_str}:G{last})"),
    ]
    for name, label, formula in totals:
        put(f"A{r}", label)
        put(f"F{r}", formula, name=name, fmt="0.0")
        r += 1
    put(f"A{r}", "Standpipe pressure estimate", bold=True)
    c = lay.cells
    put(
        f"F{r}",
        f"={c['surface']}+{c['string_loss']}+{c['annulus_loss']}+{c['bit_dp']}+{c['tools']}",
        name="spp",
        fmt="0.0",
        bold=True,
    )
    put(f"G{r}", f"={c['spp']}-{ref['spp_measured']}", name="spp_gap", fmt="0.0")
    put(f"H{r}", "estimate − measured")
    r += 2

    # ------------------------------------------------------------------ band 4: bit and ECD
    head(r, "4  Bit and ECD")
    r += 1
    band4 = r
    ws[f"A{r}"] = _array(
        f"A{r}:C{r + 8}",
        f"=BF_BIT({rho},{ref['nozzles']},{ref['bit_size']},{q},,{u})",
    )
    lay.cells["bit_table"] = f"A{r}:C{r + 8}"
    for i, (label, formula, name) in enumerate(
        [
            (
                "Hydrostatic at bit [psi]",
                f"=BF_HYDROSTATIC({rho},{ref['tvd_bit']},,{u})",
                "hydrostatic",
            ),
            (
                "ECD at the shoe [ppg]",
                f"=BF_ECD({rho},{ref['tvd_shoe']},{c['annulus_shoe']},,,{u})",
                "ecd_shoe",
            ),
            (
                "ECD at the bit [ppg]",
                f"=BF_ECD({rho},{ref['tvd_bit']},{c['annulus_loss']},,,{u})",
                "ecd_bit",
            ),
            ("ECD at the bit − PWD [ppg]", f"=H{band4 + 2}-{ref['pwd']}", "ecd_gap"),
            (
                "Critical rate, open hole × DP [gpm]",
                f"=BF_CRIT_RATE({rho},{readings},{case['open_hole']['diameter']},5,,{u})",
                "crit_rate",
            ),
        ]
    ):
        put(f"E{band4 + i}", label)
        put(f"H{band4 + i}", formula, name=name, fmt="0.000")
    r = band4 + 11

    # ------------------------------------------------------------------ band 5: cleaning
    head(r, "5  Hole cleaning per annular interval")
    r += 1
    for col, text in zip(
        "ABCDEFG",
        (
            "interval",
            "AV [ft/min]",
            "slip [ft/min]",
            "transport ratio",
            "CCI",
            "cuttings conc.",
            "critical rate [gpm]",
        ),
        strict=True,
    ):
        put(f"{col}{r}", text, bold=True)
    r += 1
    cs, cd, rop = ref["cut_size"], ref["cut_density"], ref["rop"]
    for i in ann_rows:
        iv = lay.intervals[i]
        row = 35 + i
        oh, ip = f"$C${row}", f"$D${row}"
        cellmap = {
            "av": f"B{r}",
            "slip": f"C{r}",
            "tr": f"D{r}",
            "cci": f"E{r}",
            "conc": f"F{r}",
            "crit": f"G{r}",
        }
        put(f"A{r}", f"=A{row}")
        put(cellmap["av"], f"=BF_ANN_VEL({oh},{ip},{q},{u})", fmt="0.0")
        put(cellmap["slip"], f"=BF_SLIP({rho},{readings},{cs},{cd},{oh},{ip},{q},,,{u})", fmt="0.0")
        put(
            cellmap["tr"],
            f"=BF_TRANSPORT_RATIO({rho},{readings},{cs},{cd},{oh},{ip},{q})",
            fmt="0.00",
        )
        put(cellmap["cci"], f"=BF_CCI({rho},{readings},{oh},{ip},{q},,{u})", fmt="0.00")
        put(
            cellmap["conc"],
            f"=BF_CUTTINGS_CONC({rho},{readings},{cs},{cd},{oh},{ip},"
            f"{ref['bit_size']},{q},{rop},,,{u})",
            fmt="0.00%",
        )
        put(cellmap["crit"], f"=BF_CRIT_RATE({rho},{readings},{oh},{ip},,{u})", fmt="0")
        lay.cleaning_rows.append((iv, cellmap))
        r += 1

    # ------------------------------------------------------------------ band 6: surge, trips
    r += 1
    r = _surge_band(case, lay, put, head, r, ref, readings, u, first_ann, last, survey)

    # ------------------------------------------------------------------ rate sweep
    sw = wb.create_sheet("Rate sweep")
    sw["A1"] = "Rate sweep: one array formula per column (open hole around drill pipe)"
    sw["A1"].font = _HEAD
    for col, text in zip(
        "ABCD",
        ("rate [gpm]", "bit ΔP [psi]", "annulus gradient [psi/ft]", "jet velocity [ft/s]"),
        strict=True,
    ):
        sw[f"{col}2"] = text
        sw[f"{col}2"].font = _BOLD
    lay.sweep_rates = [400.0 + 25.0 * i for i in range(11)]
    for i, qq in enumerate(lay.sweep_rates):
        sw[f"A{3 + i}"] = qq
        sw[f"A{3 + i}"].fill = _INPUT
    end = 2 + len(lay.sweep_rates)
    rates = f"$A$3:$A${end}"
    main = f"'{SHEET}'!"
    sw["B3"] = _array(
        f"B3:B{end}", f"=BF_BIT_DP({main}{ref['density']},{main}{ref['nozzles']},{rates})"
    )
    sw["C3"] = _array(
        f"C3:C{end}",
        f"=BF_ANN_GRAD({main}{ref['density']},{main}"
        f"{readings},{case['open_hole']['diameter']},5,{rates})",
    )
    sw["D3"] = _array(f"D3:D{end}", f"=BF_JET_VEL({main}{ref['nozzles']},{rates})")
    lay.sweep_cells = {col: [f"{col}{3 + i}" for i in range(len(lay.sweep_rates))] for col in "BCD"}

    # ------------------------------------------------------------------ units, config
    un = wb.create_sheet("Units")
    un["A1"] = "Units in force (from the Units cell of the main sheet)"
    un["A1"].font = _HEAD
    n_kinds = len(UNIT_SYSTEMS["oilfield"]) + 1  # the header row and one row per kind
    un["A2"] = _array(f"A2:B{1 + n_kinds}", f"=BF_UNITS({main}{u})")
    conf = wb.create_sheet("xlwings.conf")
    conf["A1"], conf["B1"] = "UDF Modules", "addin.sheets.functions"
    conf["A2"], conf["B2"] = "Show Console", "False"

    for sheet in wb.worksheets:
        if sheet.title != "xlwings.conf":
            page_setup(sheet, "boreflow demo workbook (invented data)", header_rows="1:1",
                       footer="boreflow worksheet functions demo; estimates")  # fmt: skip
    out = Path(out)
    tmp = out.with_suffix(".tmp.xlsx")
    wb.save(tmp)
    tmp.replace(out)
    return lay


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--check", default="D1", help="mud check label prefix (D1 or D2)")
    ap.add_argument("--out", default=str(OUT))
    ap.add_argument(
        "--live", action="store_true", help="formulas only, no stored values (array formulas live)"
    )
    a = ap.parse_args(argv)
    build(Path(a.out), a.check, computed=not a.live)
    print(f"wrote {a.out}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
