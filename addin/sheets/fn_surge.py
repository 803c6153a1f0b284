"""Worksheet functions: surge and swab pressure, trip EMW, trip-speed limit, breaking
circulation (over the flat forms of :mod:`calc.surge`).

Argument order: fluid (density, readings) → geometry (hole or casing ID, pipe OD, interval
length — one interval, or columns of the annular intervals from surface down to the depth of
interest) → rate (trip speed, average stand speed) → options (direction, an open string's bore
and nozzles, hydraulics method, clinging constant, peak factor) → units.

A closed string (float valve) is the default; giving ``d_bore`` makes the string open at the
bottom (its displacement splits between bore and annulus; ``nozzles`` adds the bit).  The mud
model is the hydraulics method's annulus fit (blank = API RP 13D 2010 HB), its pipe fit in
the bore.  Surge (running in) is positive, swab (pulling out) negative.
"""

from typing import Any

import numpy as np

from addin import text
from addin.sheets import cells
from addin.sheets.fn_flow import hydraulics_fluid
from addin.sheets.framework import Cells, Num, Text, sheet_function
from calc import bit as cb
from calc import surge as cs
from calc.circulation.hydrostatics import HYDROSTATIC_OPTIONS
from calc.errors import InputError
from calc.flow import regime_label
from calc.surge.solver import check_peak

__all__ = [
    "BF_BREAK_CIRC",
    "BF_SURGE",
    "BF_SURGE_EMW",
    "BF_SURGE_INERTIA",
    "BF_SURGE_PEAK",
    "BF_SURGE_TABLE",
    "BF_TRIP_SPEED",
]

FAMILY = "surge"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_DENSITY = "Mud density (ppg in oilfield units; or with its unit, '1.32 sg')"
_READINGS = "Viscometer readings: two columns rpm and dial, or one column of 6 dial readings"
_D_HOLE = "Hole or casing inside diameter (in); a column for several intervals"
_D_PIPE = "Pipe outside diameter (in); a column beside d_hole"
_LENGTH = "Interval length (ft); a column beside d_hole"
_DIRECTION = "'running' (blank; surge, +) or 'pulling' (swab, −); also 'surge' / 'swab'"
_D_BORE = "Pipe bore (in) for an open string (blank = closed: float valve); column as d_hole"
_NOZZLES = "Bit nozzles of an open string, 32nds ('3x12 3x11' or a range; blank = none)"
_METHOD = "Hydraulics method (blank = 'api13d_2010_hb'); picks the fit and the friction method"
_CLINGING = "Clinging constant K_c 0 to < 1 (blank = Burkhardt fits by regime)"
_PEAK = f"Peak/average pipe speed ratio ≥ 1 (blank = {cs.PEAK_FACTOR:g}; 1 if the speed is peak)"
_HYDRO = "'exact' (blank; g = 9.80665 m/s²) or '0.052' (hand-calc constant)"
_ACCEL = (
    f"Seconds for the pipe to reach its peak speed from rest (blank = "
    f"{cs.DEFAULT_ACCELERATION_TIME:g} s, an assumption)"
)
_STAND_GEL = "Gel broken when the pipe starts, usually the 10-second gel (lbf/100ft²; blank = 0)"

_DIRECTIONS = {"running": "running", "pulling": "pulling", "surge": "running", "swab": "pulling"}


def _direction(value) -> str:
    return _DIRECTIONS[cells.text(value, "direction", "running", choices=list(_DIRECTIONS))]


def _geometry(d_hole, d_pipe, length, d_bore, uset):
    """Annular intervals → (d2, d1, length, bore or None, 2-D shape or None for one cell)."""
    d2 = cells.positive_values(d_hole, "hole diameter", "diameter", uset)
    d1 = cells.positive_values(d_pipe, "pipe diameter", "diameter", uset)
    ln = cells.positive_values(length, "length", "length", uset, allow_zero=True)
    bore = None
    if not _all_blank(d_bore):
        bore = cells.positive_values(d_bore, "bore diameter", "diameter", uset)
    arrays = {"d_hole": d2, "d_pipe": d1, "length": ln}
    if bore is not None:
        arrays["d_bore"] = bore
    shape = cells.broadcast(**arrays)
    d2, d1, ln, *rest = (np.broadcast_to(a, shape) for a in arrays.values())
    for i in zip(*np.nonzero(np.atleast_1d(d1 >= d2)), strict=False):
        a = np.atleast_1d(d1)[i]
        raise InputError(
            "pipe diameter" + _where(i, shape),
            round(uset.from_si(float(a), "diameter"), 6),
            f"< hole diameter ({uset.from_si(float(np.atleast_1d(d2)[i]), 'diameter'):g} "
            f"{uset.label('diameter')})",
        )
    if rest:
        for i in zip(*np.nonzero(np.atleast_1d(rest[0] >= d1)), strict=False):
            raise InputError(
                "bore diameter" + _where(i, shape),
                round(uset.from_si(float(np.atleast_1d(rest[0])[i]), "diameter"), 6),
                f"< pipe diameter ({uset.from_si(float(np.atleast_1d(d1)[i]), 'diameter'):g} "
                f"{uset.label('diameter')})",
            )
    flat = [np.asarray(a, dtype=float).ravel() for a in (d2, d1, ln, *rest)]
    one = shape == ()
    return flat[0], flat[1], flat[2], (flat[3] if rest else None), (None if one else shape)


def _all_blank(value) -> bool:
    return all(cells.blank(v) for row in cells.as_grid(value) for v in row)


def _where(index, shape) -> str:
    if shape == ():
        return ""
    i, j = (int(x) for x in (*tuple(index), 0, 0)[:2])
    return f" (row {i + 1}, column {j + 1})"


def _options(nozzles, clinging, peak_factor, bore):
    tfa = None
    if not _all_blank(nozzles):
        if bore is None:
            raise InputError("nozzles", "given", "a bore diameter d_bore too (an open string)")
        tfa = cb.total_flow_area(cells.nozzle_sizes(nozzles))
        if tfa <= 0:
            raise InputError("nozzles", "all blanked", "at least one open nozzle")
    kc = cells.optional_number(clinging, "clinging constant", None)
    pf = cells.optional_number(peak_factor, "peak factor", cs.PEAK_FACTOR)
    return {
        "tfa": tfa,
        "clinging": "burkhardt" if kc is None else kc,
        "peak_factor": pf,
        "string_end": "closed" if bore is None else "open",
    }


def _surge(density, readings, d_hole, d_pipe, length, speed, direction, d_bore, nozzles,
           method, clinging, peak_factor, uset, *, one_speed=False):  # fmt: skip
    fluid, kw = hydraulics_fluid(density, readings, method, uset)
    d2, d1, ln, bore, shape = _geometry(d_hole, d_pipe, length, d_bore, uset)
    v = cells.positive_values(speed, "trip speed", "trip_speed", uset, allow_zero=True)
    if one_speed:
        cells.number(speed, "trip speed", "trip_speed", uset)
    if shape is not None and np.ndim(v):
        raise InputError(
            "trip speed", "a range", "one speed when the intervals are a range (or one interval)"
        )
    ty, k, n = fluid.annulus_parameters
    res = cs.interval_surge(
        v, d2 if shape else d2[0], d1 if shape else d1[0], ln if shape else ln[0],
        density=fluid.density, tau_y=ty, k=k, n=n,
        d_bore=None if bore is None else (bore if shape else bore[0]),
        bore_parameters=fluid.pipe_parameters, direction=_direction(direction),
        **_options(nozzles, clinging, peak_factor, bore), **kw,
    )  # fmt: skip
    return res, shape


@sheet_function(FAMILY)
def BF_SURGE(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Cells(_D_HOLE),
    d_pipe: Cells(_D_PIPE),
    length: Cells(_LENGTH),
    speed: Cells("Average stand speed (ft/min); a range for one interval gives a range"),
    direction: Text(_DIRECTION) = None,
    d_bore: Cells(_D_BORE) = None,
    nozzles: Cells(_NOZZLES) = None,
    method: Text(_METHOD) = None,
    clinging: Num(_CLINGING) = None,
    peak_factor: Num(_PEAK) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Surge (+) or swab (−) pressure change in annular intervals from pipe movement, by
    Burkhardt's steady method (psi); one value per interval, SUM them for a depth.
    """
    uset = cells.unit_set(units)
    res, shape = _surge(density, readings, d_hole, d_pipe, length, speed, direction, d_bore,
                        nozzles, method, clinging, peak_factor, uset)  # fmt: skip
    dp = res.pressure_change if shape is None else np.reshape(res.pressure_change, shape)
    return uset.from_si(dp, "pressure")


@sheet_function(FAMILY)
def BF_SURGE_TABLE(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Cells(_D_HOLE),
    d_pipe: Cells(_D_PIPE),
    length: Cells(_LENGTH),
    speed: Num("Average stand speed (ft/min), one value"),
    direction: Text(_DIRECTION) = None,
    d_bore: Cells(_D_BORE) = None,
    nozzles: Cells(_NOZZLES) = None,
    method: Text(_METHOD) = None,
    clinging: Num(_CLINGING) = None,
    peak_factor: Num(_PEAK) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """A spilled table of surge or swab per annular interval for a hand check: clinging
    constant, effective velocity, regime, gradient, pressure change, total, method, notes.
    """
    uset = cells.unit_set(units)
    res, _ = _surge(density, readings, d_hole, d_pipe, length, speed, direction, d_bore,
                    nozzles, method, clinging, peak_factor, uset, one_speed=True)  # fmt: skip
    lab = uset.label
    rows = [
        [
            "interval",
            "K_c",
            f"V_e [{lab('velocity')}]",
            "regime",
            f"gradient [{lab('pressure_gradient')}]",
            f"Δp [{lab('pressure')}]",
        ]
    ]
    kc, ve, reg, grad, dp = (
        np.atleast_1d(x)
        for x in (res.clinging, res.effective_velocity, res.regime, res.gradient,
                  res.pressure_change)
    )  # fmt: skip
    for i in range(kc.size):
        rows.append(
            [
                float(i + 1),
                float(kc[i]),
                uset.from_si(float(ve[i]), "velocity"),
                regime_label(int(reg[i])),
                uset.from_si(float(grad[i]), "pressure_gradient"),
                uset.from_si(float(dp[i]), "pressure"),
            ]
        )
    blank = ["", "", "", ""]
    rows.append(["total", *blank, uset.from_si(float(res.total_pressure_change), "pressure")])
    rows.append(
        [f"relative inflow [{lab('flow_rate')}]", *blank,
         uset.from_si(float(res.relative_inflow), "flow_rate")]
    )  # fmt: skip
    rows.append(
        [f"peak speed [{lab('trip_speed')}]", *blank,
         uset.from_si(float(res.peak_speed), "trip_speed")]
    )  # fmt: skip
    rows.append(["method", res.method, "", "", "", ""])
    rows += [["note", text.note_line(x, uset), x.level, "", "", ""] for x in res.notes]
    return rows


@sheet_function(FAMILY)
def BF_SURGE_EMW(
    density: Num(_DENSITY),
    tvd: Num("True vertical depth of the point (ft)"),
    pressure: Cells("Surge (+) or swab (−) pressure change at the depth (psi); a range is summed"),
    hydrostatic: Text(_HYDRO) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Equivalent mud weight while tripping, ρ + Δp/(g·TVD), with Δp the summed surge (+)
    or swab (−) of the intervals above the depth (ppg in oilfield units).

    >>> round(BF_SURGE_EMW(11.0, 10000.0, [[100.0], [4.0]], "0.052"), 6)
    11.2
    """
    uset = cells.unit_set(units)
    rho = cells.positive_number(density, "density", "density", uset)
    h = cells.positive_number(tvd, "tvd", "depth", uset)
    dp = float(np.sum(cells.values(pressure, "pressure", "pressure", uset)))
    hyd = cells.text(hydrostatic, "hydrostatic", "exact", choices=list(HYDROSTATIC_OPTIONS))
    return uset.from_si(cs.trip_emw(rho, dp, h, hydrostatic=hyd), "density")


@sheet_function(FAMILY)
def BF_TRIP_SPEED(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Cells("Hole or casing ID (in) of each annular interval from surface to the depth"),
    d_pipe: Cells(_D_PIPE),
    length: Cells(_LENGTH),
    limit_emw: Num("Limit EMW at the depth: fracture − margin (running) or pore + margin (ppg)"),
    tvd: Num("True vertical depth of the point (ft)"),
    direction: Text(_DIRECTION) = None,
    d_bore: Cells(_D_BORE) = None,
    nozzles: Cells(_NOZZLES) = None,
    method: Text(_METHOD) = None,
    clinging: Num(_CLINGING) = None,
    peak_factor: Num(_PEAK) = None,
    hydrostatic: Text(_HYDRO) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Highest average stand speed at which surge (running) or swab (pulling) keeps the EMW
    at the depth within the limit EMW (ft/min); 0 if no speed is safe, capped at 10 m/s.
    """
    uset = cells.unit_set(units)
    fluid, kw = hydraulics_fluid(density, readings, method, uset)
    d2, d1, ln, bore, _ = _geometry(d_hole, d_pipe, length, d_bore, uset)
    lim_emw = cells.positive_number(limit_emw, "limit EMW", "density", uset)
    h = cells.positive_number(tvd, "tvd", "depth", uset)
    hyd = cells.text(hydrostatic, "hydrostatic", "exact", choices=list(HYDROSTATIC_OPTIONS))
    d = _direction(direction)
    allow = cs.trip_allowance(lim_emw, fluid.density, h, d, hydrostatic=hyd)
    if allow <= 0:
        shown = f"{uset.from_si(fluid.density, 'density'):g} {uset.label('density')}"
        raise InputError(
            "limit EMW",
            round(uset.from_si(lim_emw, "density"), 6),
            f"{'above' if d == 'running' else 'below'} the mud density ({shown}): "
            "otherwise no trip speed is safe",
        )
    ty, k, n = fluid.annulus_parameters
    res = cs.trip_speed_limit(
        allow, d2, d1, ln, density=fluid.density, tau_y=ty, k=k, n=n, direction=d,
        d_bore=bore, bore_parameters=fluid.pipe_parameters,
        **_options(nozzles, clinging, peak_factor, bore), **kw,
    )  # fmt: skip
    return uset.from_si(res.max_speed, "trip_speed")


@sheet_function(FAMILY)
def BF_BREAK_CIRC(
    gel_strength: Num("Gel strength, usually the 10-minute gel (lbf/100ft²)"),
    d_outer: Cells("Pipe bore, or hole/casing ID for an annulus (in); a column for several"),
    length: Cells("Interval length (ft); a column beside d_outer"),
    d_inner: Cells("Pipe OD for an annulus (in); blank for the pipe bore") = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Pressure to break the gel and start circulation in an interval, 4·τ_g·L/(D_outer −
    D_inner) (psi in oilfield units); SUM the string and annulus intervals.

    >>> round(BF_BREAK_CIRC(12.0, 4.276, 10000.0), 1)  # τ·L/(300·d) psi
    93.5
    """
    uset = cells.unit_set(units)
    tg = cells.number(gel_strength, "gel strength", "stress", uset)
    cells.positive(tg, "gel strength", "stress", uset, allow_zero=True)
    do = cells.positive_values(d_outer, "outer diameter", "diameter", uset)
    ln = cells.positive_values(length, "length", "length", uset, allow_zero=True)
    if _all_blank(d_inner):
        di = 0.0
    else:  # blank cells in a column of pipe ODs mark pipe-bore rows
        filled = [[0.0 if cells.blank(v) else v for v in row] for row in cells.as_grid(d_inner)]
        di = cells.positive_values(filled, "inner diameter", "diameter", uset, allow_zero=True)
    shape = cells.broadcast(d_outer=do, length=ln, d_inner=di)
    do_b, di_b = (np.broadcast_to(np.asarray(a, dtype=float), shape) for a in (do, di))
    bad = np.atleast_1d(di_b >= do_b)
    if bad.any():
        i = tuple(int(x[0]) for x in np.nonzero(bad))
        raise InputError(
            "inner diameter" + _where(i, shape),
            round(uset.from_si(float(np.atleast_1d(di_b)[i]), "diameter"), 6),
            f"< outer diameter ({uset.from_si(float(np.atleast_1d(do_b)[i]), 'diameter'):g} "
            f"{uset.label('diameter')})",
        )
    return uset.from_si(cs.gel_break_pressure(tg, do, ln, di), "pressure")


def _accel_time(value) -> float:
    t = cells.optional_number(value, "acceleration time", cs.DEFAULT_ACCELERATION_TIME)
    if not t > 0:
        raise InputError("acceleration time", t, "> 0 s (to reach the peak speed from rest)")
    return t


def _inertia(density, d_hole, d_pipe, length, speed, accel_time, direction, d_bore,
             peak_factor, uset):  # fmt: skip
    """Signed inertial pressure per interval [Pa] and the geometry's 2-D shape (None: one)."""
    rho = cells.positive_number(density, "density", "density", uset)
    d2, d1, ln, bore, shape = _geometry(d_hole, d_pipe, length, d_bore, uset)
    v = cells.positive_number(speed, "trip speed", "trip_speed", uset, allow_zero=True)
    pf = check_peak(cells.optional_number(peak_factor, "peak factor", cs.PEAK_FACTOR))
    a = cs.trip_acceleration(v * pf, _accel_time(accel_time))
    dp = cs.inertial_pressure(
        rho, a, d2, d1, ln, d_bore=bore, string_end="closed" if bore is None else "open"
    )
    sign = 1.0 if _direction(direction) == "running" else -1.0
    return sign * np.atleast_1d(dp), shape


@sheet_function(FAMILY)
def BF_SURGE_INERTIA(
    density: Num(_DENSITY),
    d_hole: Cells(_D_HOLE),
    d_pipe: Cells(_D_PIPE),
    length: Cells(_LENGTH),
    speed: Num("Average stand speed (ft/min), one value"),
    accel_time: Num(_ACCEL) = None,
    direction: Text(_DIRECTION) = None,
    d_bore: Cells(_D_BORE) = None,
    peak_factor: Num(_PEAK) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Inertial surge (+) or swab (−) while the pipe speeds up to its peak speed in the
    acceleration time, ρ·r·a·L per annular interval (psi); SUM them for a depth.  r = D1²/(D2² −
    D1²) for a closed string, the open split otherwise (calc/METHODS.md §11.9).

    >>> round(BF_SURGE_INERTIA(11.0, 8.6, 5.0, 10000.0, 60.0, 2.0), 1)  # ρ·r·a·L, a = 0.75 ft/s²
    68.0
    """
    uset = cells.unit_set(units)
    dp, shape = _inertia(density, d_hole, d_pipe, length, speed, accel_time, direction, d_bore,
                         peak_factor, uset)  # fmt: skip
    out = uset.from_si(dp, "pressure")
    return float(out[0]) if shape is None else np.reshape(out, shape)


@sheet_function(FAMILY)
def BF_SURGE_PEAK(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Cells("Hole or casing ID (in) of each annular interval from surface to the depth"),
    d_pipe: Cells(_D_PIPE),
    length: Cells(_LENGTH),
    speed: Num("Average stand speed (ft/min), one value"),
    gel_strength: Num(_STAND_GEL) = None,
    accel_time: Num(_ACCEL) = None,
    direction: Text(_DIRECTION) = None,
    d_bore: Cells(_D_BORE) = None,
    nozzles: Cells(_NOZZLES) = None,
    method: Text(_METHOD) = None,
    clinging: Num(_CLINGING) = None,
    peak_factor: Num(_PEAK) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Peak surge (+) or swab (−) at the depth of the intervals' bottom while a stand starts:
    max(gel breaking, steady surge at the peak speed + inertia) (psi).

    The gel holds the mud until it breaks, before the mud flows; friction and inertia then act
    together while the pipe speeds up (calc/METHODS.md §11.9).
    """
    uset = cells.unit_set(units)
    res, _ = _surge(density, readings, d_hole, d_pipe, length, speed, direction, d_bore,
                    nozzles, method, clinging, peak_factor, uset, one_speed=True)  # fmt: skip
    dp_i, _ = _inertia(density, d_hole, d_pipe, length, speed, accel_time, direction, d_bore,
                       peak_factor, uset)  # fmt: skip
    tg = cells.optional_number(gel_strength, "gel strength", 0.0, "stress", uset)
    cells.positive(tg, "gel strength", "stress", uset, allow_zero=True)
    d2, d1, ln, bore, _ = _geometry(d_hole, d_pipe, length, d_bore, uset)
    ann, cap = cs.pipe_start_gel_pressure(
        tg, d2, d1, ln, d_bore=bore, string_end="closed" if bore is None else "open"
    )
    gel_dp = min(float(np.sum(ann)), cap)
    peak = cs.peak_trip_pressure(abs(float(res.total_pressure_change)),
                                 abs(float(np.sum(dp_i))), gel_dp)  # fmt: skip
    sign = 1.0 if res.direction == "running" else -1.0
    return uset.from_si(sign * float(peak), "pressure")
