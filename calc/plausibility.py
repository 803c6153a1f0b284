"""Plausibility ranges of the quantities users enter: physically possible and usual.

Every input a user types (case file, input workbook, command-line option, worksheet cell) is
checked against two ranges of its *quantity* (a finer division than the unit kind: a mud
density and a cuttings density are both densities, but their ranges differ):

* **possible** — outside it the value cannot describe a real well with a liquid drilling
  fluid; the faces refuse it (exit 2, ``#BF!``) with the value in the user's unit;
* **usual** — the range met in the trade; outside it the value is possible but unusual, the
  faces warn and a report needs ``--allow-unusual``.

Both are in SI; each bound was written in the unit it is customarily quoted in and converted
here with :func:`calc.units.to_si`.  None of these ranges comes from a standard: they are
**common practice** (from memory, not checked against a source) unless the table says
otherwise.  Foam, mist, aerated and air drilling are outside boreflow's scope (it models
liquids), so a fluid density below 0.6 sg is *impossible* here, not merely unusual.

==================  ===========================  =========================  ====================
quantity            possible                     usual                      source / reason
==================  ===========================  =========================  ====================
fluid_density       0.6 – 3.0 sg                 7.5 – 20 ppg               common practice: base
                                                                            oils 0.78–0.85 sg,
                                                                            barite/hematite muds
                                                                            ≤ ~2.9 sg
emw (pore, frac.,   0.1 – 3.5 sg                 0.8 – 2.4 sg               common practice
 shoe test, ECD)
density_margin      0 – 0.5 sg                   0 – 1 ppg                  common practice
cuttings_density    1.0 – 5.5 sg                 2.0 – 2.9 sg               rock grain densities
                                                                            (coal ~1.3, quartz
                                                                            2.65, barite 4.5)
flow_rate           > 0 – 4,000 gpm              50 – 1,500 gpm             common practice: four
                                                                            large triplex pumps
                                                                            give < 4,000 gpm
depth (MD, TVD)     0 – 20,000 m                 0 – 9,000 m                deepest wells ~12–15
                                                                            km MD
hole_diameter       1 – 60 in                    3.5 – 36 in                common practice
pipe_diameter       > 0 – 60 in                  0.75 – 20 in               common practice
line_diameter       0.5 – 12 in                  2 – 6 in                   common practice
string_length       > 0 – 20,000 m               —                          as depth
line_length         > 0 – 1,000 m                1 – 200 m                  common practice
joint_length        > 0 – 20 m                   5 – 15 m                   API ranges 1–3
                                                                            (from memory)
tool_joint_length   > 0 – 3 m                    0.1 – 1 m                  common practice
stand_length        > 0 – 50 m                   15 – 30 m (doubles,        common practice
                                                 triples)
liner               > 0 – 12 in                  3 – 9 in                   common practice
stroke              > 0 – 24 in                  6 – 16 in                  common practice
pump_rod            0 – 6 in                     1.5 – 4 in (duplex)        common practice
spm                 0 – 250 spm                  0 – 150 spm                common practice
                                                                            (triplex ~100–175
                                                                            rated, from memory)
cuttings_size       > 0 – 100 mm                 0.1 – 30 mm                common practice
nozzle_32nds        1 – 40 /32 in                6 – 32 /32 in              common practice
tfa                 > 0 – 20 in²                 0.05 – 3 in²               common practice
ports               1 – 20 (whole)               1 – 10                     common practice
discharge_coeff.    > 0 – 1                      0.8 – 1                    common practice
washout_factor      1 – 3                        1 – 1.5                    common practice
efficiency          > 0 – 1 (a fraction)         0.85 – 1                   common practice
rated_power         > 0 – 5,000 hp               300 – 2,500 hp             common practice
spp                 > 0 – 30,000 psi             200 – 7,500 psi            common practice
rating              > 0 – 40,000 psi             1,000 – 15,000 psi         common practice
tool_drop           0 – 10,000 psi               0 – 2,000 psi              common practice
temperature         −20 – 320 °C                 5 – 95 °C (cup)            common practice
well_temperature    −20 – 350 °C                 0 – 200 °C                 common practice
geothermal_gradient 0 – 0.2 K/m                  0.01 – 0.05 K/m            common practice
heat_capacity       500 – 5,000 J/(kg·K)         1,200 – 4,200 J/(kg·K)     common practice
heat_transfer_coef. > 0 – 10,000 W/(m²·K)        5 – 2,000 W/(m²·K)         common practice
oil_water_ratio     0 – 100 % oil                50 – 95 % oil              definition
percent_volume      0 – 100 %                    —                          definition
rop                 > 0 – 600 m/h                0.3 – 100 m/h              common practice
rpm                 0 – 1,000 rpm                0 – 250 rpm                common practice
trip_speed          > 0 – 10 m/s                 0.05 – 2 m/s               common practice
accel_time          > 0 – 300 s                  0.5 – 20 s                 common practice
dial_speed          > 0 – 1,000 rpm              1 – 600 rpm                API RP 13B-1 speeds
                                                                            3–600 rpm (memory)
dial_reading        0 – 1,000 °                  0 – 300 °                  standard spring full
                                                                            scale 300°
gel                 0 – 500 lbf/100ft²           0 – 60 lbf/100ft²          common practice
pv                  0 – 500 cP                   1 – 80 cP                  common practice
yp                  0 – 500 lbf/100ft²           0 – 80 lbf/100ft²          common practice
sphericity          > 0 – 1                      0.3 – 1                    definition (≤ 1)
fraction            0 – 1                        0 – 0.2                    definition
standoff            0 – 1                        0 – 1                      definition
inclination         0 – 180 °                    0 – 100 °                  definition
azimuth             −360 – 360 °                 0 – 360 °                  definition
slurry_pipe_diam.   0.5 – 48 in                  2 – 24 in                  common practice (rig
                                                                            lines to dredge
                                                                            pipelines)
pipe_roughness      0 – 5 mm                     0 – 0.5 mm                 Moody (1944): drawn
                                                                            0.0015, steel 0.046,
                                                                            cast iron 0.26 mm
slurry_line_length  > 0 – 100 km                 1 – 5,000 m                common practice
line_inclination    −90 – 90 °                   −30 – 30 °                 definition
solids_conc.        0 – 0.6                      0.02 – 0.35                0.6: packing of
                                                                            grains (common
                                                                            practice)
particle_size       > 0 – 100 mm                 0.02 – 20 mm               common practice
spp_result          0 – 40,000 psi (a result)    —                          above the highest
                                                                            rating (common
                                                                            practice)
==================  ===========================  =========================  ====================

The same table is in ``calc/METHODS.md`` §"Plausibility ranges" and
``workbooks/CASE-FORMAT.md``.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from calc.units import to_si

__all__ = ["RANGES", "Plausibility", "assess"]


@dataclass(frozen=True)
class Plausibility:
    """The two ranges of one quantity, SI.

    ``kind`` is the unit kind (:data:`calc.kinds.KINDS`, or ``"number"`` for plain numbers);
    ``possible``/``usual`` are ``(low, high)`` with ``low_open`` making the possible low bound
    strict (> instead of ≥); ``usual`` may be ``None`` (no usual range beyond the possible
    one); ``whole`` requires a whole number; ``source`` says where the ranges come from.
    """

    quantity: str
    kind: str
    possible: tuple[float, float]
    usual: tuple[float, float] | None
    source: str = "common practice"
    low_open: bool = False
    whole: bool = False


def _r(quantity, kind, unit, possible, usual, source="common practice", **kw):
    def si(pair):
        if pair is None:
            return None
        return tuple(float(to_si(x, unit, kind if kind != "number" else None)) for x in pair)

    if unit is None:
        conv = (tuple(map(float, possible)), None if usual is None else tuple(map(float, usual)))
    else:
        conv = (si(possible), si(usual))
    return Plausibility(quantity, kind, conv[0], conv[1], source, **kw)


_SG = "sg"
#: quantity → its :class:`Plausibility` (the table of the module docstring).
RANGES: dict[str, Plausibility] = {
    p.quantity: p
    for p in (
        _r("fluid_density", "density", _SG, (0.6, 3.0), (0.8987, 2.3965)),  # 7.5–20 ppg
        _r("emw", "density", _SG, (0.1, 3.5), (0.8, 2.4)),
        _r("density_margin", "density", _SG, (0.0, 0.5), (0.0, 0.1198)),  # 1 ppg
        _r("cuttings_density", "density", _SG, (1.0, 5.5), (2.0, 2.9), "rock grain densities"),
        _r("flow_rate", "flow_rate", "gpm", (0.0, 4000.0), (50.0, 1500.0), low_open=True),
        _r("depth", "depth", "m", (0.0, 20000.0), (0.0, 9000.0)),
        _r("hole_diameter", "diameter", "in", (1.0, 60.0), (3.5, 36.0)),
        _r("pipe_diameter", "diameter", "in", (0.0, 60.0), (0.75, 20.0), low_open=True),
        _r("line_diameter", "diameter", "in", (0.5, 12.0), (2.0, 6.0)),
        _r("string_length", "length", "m", (0.0, 20000.0), None, low_open=True),
        _r("line_length", "length", "m", (0.0, 1000.0), (1.0, 200.0), low_open=True),
        _r("joint_length", "length", "m", (0.0, 20.0), (5.0, 15.0), low_open=True),
        _r("tool_joint_length", "length", "m", (0.0, 3.0), (0.1, 1.0), low_open=True),
        _r("stand_length", "length", "m", (0.0, 50.0), (15.0, 30.0), low_open=True),
        _r("liner", "diameter", "in", (0.0, 12.0), (3.0, 9.0), low_open=True),
        _r("stroke", "diameter", "in", (0.0, 24.0), (6.0, 16.0), low_open=True),
        _r("pump_rod", "diameter", "in", (0.0, 6.0), (1.5, 4.0)),
        _r("spm", "number", None, (0.0, 250.0), (0.0, 150.0)),
        _r("cuttings_size", "diameter", "mm", (0.0, 100.0), (0.1, 30.0), low_open=True),
        _r("nozzle_32nds", "number", None, (1.0, 40.0), (6.0, 32.0)),
        _r("tfa", "area", "in**2", (0.0, 20.0), (0.05, 3.0), low_open=True),
        _r("ports", "number", None, (1.0, 20.0), (1.0, 10.0), whole=True),
        _r("discharge_coefficient", "number", None, (0.0, 1.0), (0.8, 1.0), low_open=True),
        _r("washout_factor", "number", None, (1.0, 3.0), (1.0, 1.5)),
        _r("efficiency", "number", None, (0.0, 1.0), (0.85, 1.0), low_open=True),
        _r("rated_power", "power", "hp", (0.0, 5000.0), (300.0, 2500.0), low_open=True),
        _r("spp", "pressure", "psi", (0.0, 30000.0), (200.0, 7500.0), low_open=True),
        _r("rating", "pressure", "psi", (0.0, 40000.0), (1000.0, 15000.0), low_open=True),
        _r("tool_drop", "pressure", "psi", (0.0, 10000.0), (0.0, 2000.0)),
        _r("temperature", "temperature", "degC", (-20.0, 320.0), (5.0, 95.0)),
        _r("well_temperature", "temperature", "degC", (-20.0, 350.0), (0.0, 200.0)),
        _r("geothermal_gradient", "temperature_gradient", "K/m", (0.0, 0.2), (0.01, 0.05)),
        _r("heat_capacity", "number", None, (500.0, 5000.0), (1200.0, 4200.0)),
        _r("heat_transfer_coefficient", "number", None, (0.0, 1e4), (5.0, 2e3), low_open=True),
        _r("oil_water_ratio", "number", None, (0.0, 100.0), (50.0, 95.0), "definition"),
        _r("percent_volume", "number", None, (0.0, 100.0), None, "definition"),
        # a further viscometer reading of a check (calc/METHODS.md §21): HPHT instruments read
        # to about 260 °C; above 205 °C is unusual (common practice)
        _r("rheology_temperature", "temperature", "degC", (0.0, 260.0), (5.0, 205.0)),
        _r("viscometer_pressure", "pressure", "psi", (0.0, 40000.0), (0.0, 30000.0)),
        _r("rop", "rop", "m/hour", (0.0, 600.0), (0.3, 100.0), low_open=True),
        _r("rpm", "number", None, (0.0, 1000.0), (0.0, 250.0)),
        _r("trip_speed", "trip_speed", "m/s", (0.0, 10.0), (0.05, 2.0), low_open=True),
        _r("accel_time", "number", None, (0.0, 300.0), (0.5, 20.0), low_open=True),
        _r("dial_speed", "number", None, (0.0, 1000.0), (1.0, 600.0), low_open=True),
        _r("dial_reading", "number", None, (0.0, 1000.0), (0.0, 300.0)),
        _r("gel", "stress", "lbf_per_100ft_sq", (0.0, 500.0), (0.0, 60.0)),
        _r("pv", "viscosity", "cP", (0.0, 500.0), (1.0, 80.0)),
        _r("yp", "stress", "lbf_per_100ft_sq", (0.0, 500.0), (0.0, 80.0)),
        _r("sphericity", "number", None, (0.0, 1.0), (0.3, 1.0), "definition", low_open=True),
        _r("fraction", "number", None, (0.0, 1.0), (0.0, 0.2), "definition"),
        _r("standoff", "number", None, (0.0, 1.0), (0.0, 1.0), "definition"),
        _r("inclination", "number", None, (0.0, 180.0), (0.0, 100.0), "definition"),
        _r("azimuth", "number", None, (-360.0, 360.0), (0.0, 360.0), "definition"),
        _r("slurry_pipe_diameter", "diameter", "in", (0.5, 48.0), (2.0, 24.0)),
        _r("pipe_roughness", "diameter", "mm", (0.0, 5.0), (0.0, 0.5), "Moody (1944)"),
        _r("slurry_line_length", "length", "m", (0.0, 100000.0), (1.0, 5000.0), low_open=True),
        _r("line_inclination", "number", None, (-90.0, 90.0), (-30.0, 30.0), "definition"),
        _r("solids_concentration", "number", None, (0.0, 0.6), (0.02, 0.35)),
        _r("particle_size", "diameter", "mm", (0.0, 100.0), (0.02, 20.0), low_open=True),
        # results (not inputs): a predicted standpipe pressure beyond every rating
        _r("spp_result", "pressure", "psi", (0.0, 40000.0), None),
    )
}


def assess(quantity: str, value: float) -> str:
    """``"ok"``, ``"unusual"`` or ``"impossible"`` for an SI ``value`` of ``quantity``.

    NaN and infinities are impossible for every quantity.

    Examples
    --------
    >>> assess("fluid_density", 1318.0)      # 11 ppg
    'ok'
    >>> assess("fluid_density", 134.2)       # 1.12 ppg: not a liquid drilling fluid
    'impossible'
    >>> assess("flow_rate", 0.1)             # 1,585 gpm
    'unusual'
    """
    p = RANGES[quantity]
    x = float(value)
    lo, hi = p.possible
    if not math.isfinite(x) or x > hi or x < lo or (p.low_open and x <= lo):
        return "impossible"
    if p.whole and not x.is_integer():
        return "impossible"
    if p.usual is not None and not (p.usual[0] <= x <= p.usual[1]):
        return "unusual"
    return "ok"
