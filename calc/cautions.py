"""The standard caution texts, kept in one place for the report, the README and worksheet help."""

from __future__ import annotations

__all__ = ["CELL", "LINES", "LONG", "SHORT"]

#: One line, for a worksheet cell or the top of a printout.
CELL = (
    "Estimates only: not a substitute for well-control procedures, real-time monitoring, "
    "the operator's engineering review, local regulations or competent engineers."
)

#: Report footer paragraph.
SHORT = (
    "Engineering caution. These figures come from simplified steady-state models and are only as "
    "good as the inputs shown. They are estimates to support qualified engineering judgement, not "
    "measurements and not a basis for well control. Downhole density and rheology differ from "
    "surface test values with temperature, pressure, time and solids load. Low-shear readings "
    "(3 and 6 rpm), gels and any yield stress derived from them are uncertain. Calculated ECD, "
    "surge and swab can be wrong by more than the margins being managed. Where downhole pressure, "
    "measured pump pressure or pit volumes disagree with these results, trust the measurements "
    "and investigate. Nothing here replaces kick detection, flow checks, pore- and "
    "fracture-pressure monitoring, well-control procedures, the approved programme, the "
    "operator's engineering review, local regulations, or the judgement of competent, qualified "
    "and, where required, licensed engineers."
)

#: The same content as separate points (README, worksheet help, report caution sheet).
LINES = (
    "Results are model estimates. Losses, ECD, bit hydraulics, hole-cleaning indicators and "
    "surge/swab depend on the rheological model, the friction correlations and assumptions "
    "(eccentricity, tool joints, rotation, cuttings, steady flow, temperature); accepted methods "
    "can disagree noticeably. The method and the intermediate values are shown for hand checks.",
    "Inputs dominate accuracy. Readings describe the fluid at the test temperature only; 3- and "
    "6-rpm readings and gels are the least precise numbers in a mud check; open-hole size is "
    "usually unknown; pump efficiency is often guessed. Input checks catch common errors, not all.",
    "Calibrate and compare. Compare predictions with measured standpipe and downhole (PWD) "
    "pressure and record the difference. A calibration factor fits one set of conditions only.",
    "Not for well control. Nothing here replaces kick detection, flow checks, trip sheets, kill "
    "sheets, pore/fracture-pressure monitoring, the approved programmes, the operator's "
    "engineering review, or competent, qualified and, where required, licensed engineers. Keep to "
    "your programme's margins and local regulations.",
    "No warranty. Provided as is, without warranty of fitness for any well or operation. Verify "
    "results before acting on them.",
)

LONG = "\n\n".join(LINES)
