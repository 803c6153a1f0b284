"""Where every Summary number comes from: the trace table of the Audit sheet, in one place.

For each key-results row of the Summary (:func:`addin.report.summary_rows.summary_rows`) the
Audit sheet lists, per traced column (value, limit, margin, required): the SI value, the calc
function (dotted path), the Python inputs it was called with (SI numbers, keys of the case and
the earlier *setup* rows), the expression taking the quantity from its return value ``_``, the
method and its verification status, and the equation (calc/METHODS.md section).  An office
engineer recomputes any number from the Audit sheet alone::

    case = addin.case.load_case("<case source>")   # the inputs hash must match the Audit's
    well = case.well(-1)                             # each setup row: name = function(inputs)
    _ = calc.circulation.circulate(well=well, ...)   # a quantity: _ = function(inputs) …
    spp = _.standpipe_pressure                       # … then its result expression

``tests/test_audit_trace.py`` does exactly that.  A new Summary row gets its trace by a new
entry of :data:`TRACE` (matched by the start of the row's name); a Summary row without an entry
is written as "untraced" (and the test fails on it).

The methods a report used are listed with their status (:func:`used_methods`), and the
rig-facing sheets name a method by its name and primary source only (:func:`method_line`).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np

from addin import text
from addin.report.style import heading, table_header
from addin.xlsx_cells import put
from calc.cleaning.bed import BED_METHODS
from calc.cleaning.deviated import DEVIATED_METHODS
from calc.cleaning.slip import SLIP_METHODS
from calc.flow import FRICTION_LAWS
from calc.hydraulics_method import HYDRAULICS_METHODS, resolve_method
from calc.registry import MethodInfo
from calc.rheology import VISCOMETER_FITS
from calc.slurry import SLURRY_METHODS

__all__ = [
    "SETUP_NAMES",
    "TRACE",
    "TraceEntry",
    "TraceRow",
    "bed_method_of",
    "method_line",
    "slip_method_of",
    "trace_rows",
    "used_methods",
    "write_methods_and_trace",
]

#: calc/METHODS.md section of each hydraulics method's friction law (§7).
METHOD_SECTIONS = {
    "api13d_2010_hb": "§7.1",
    "api13d_1995_power_law": "§7.2",
    "newtonian": "§7.3",
    "bingham": "§7.4",
    "bingham_darby_1992": "§7.4b",
    "power_law": "§7.5",
    "exact_laminar": "§7.6",
}
#: calc/METHODS.md section of each slip-velocity method (§10).
SLIP_SECTIONS = {
    "moore": "§10.3",
    "chien": "§10.4",
    "walker_mayes": "§10.5",
    "api13d": "§10.6",
    "drag_balance": "§10.7",
    "fang_2008": "§10.8",
}


def slip_method_of(method_text: str) -> str | None:
    """The registered slip-velocity method a cleaning result's method text names (it starts
    with ``"name: source"``, or ``"[vertical criteria: ]slip name: source"`` for hole cleaning),
    or None."""
    body = method_text.removeprefix("vertical criteria: ").removeprefix("slip ")
    for name in sorted(SLIP_METHODS.names(), key=len, reverse=True):
        if body.startswith(name + ":"):
            return name
    return None


def bed_method_of(beds) -> str | None:
    """The cuttings-bed model a report used: its name where an interval reaches the bed onset
    (the Cleaning sheet shows beds there), else None."""
    if beds is None or not beds.max_inclination >= beds.onset:
        return None
    return next((n for n in BED_METHODS.names() if beds.bed.method.startswith(n + ":")), None)


def _slip_of(results) -> str | None:
    return None if results.cleaning is None else slip_method_of(results.cleaning.result.method)


def used_methods(results) -> list[tuple[str, MethodInfo]]:
    """(family, registry entry) of every registered method the report used: the hydraulics
    method, its friction law and fits, and the slip-velocity method of hole cleaning."""
    m = resolve_method(results.method)
    parts = [
        (HYDRAULICS_METHODS, m.name),
        (FRICTION_LAWS, m.friction),
        (VISCOMETER_FITS, m.pipe_fit),
        (VISCOMETER_FITS, m.annulus_fit),
    ]
    slip = _slip_of(results)
    if slip is not None:
        parts.append((SLIP_METHODS, slip))
        parts += [(DEVIATED_METHODS, name) for name in DEVIATED_METHODS.names()]
    bed = bed_method_of(getattr(results, "beds", None))
    if bed is not None:
        parts.append((BED_METHODS, bed))
    for curve in getattr(results, "slurry_lines", None) or ():
        parts += [(SLURRY_METHODS, name) for name in curve.methods]
    out, seen = [], set()
    for reg, name in parts:
        if (reg.what, name) not in seen:
            seen.add((reg.what, name))
            out.append((reg.what, reg.get(name)))
    return out


def method_line(results) -> str:
    """The hydraulics method as rig-facing sheets name it: its name (with any override) and
    its primary source, and the fits it uses.

    >>> from types import SimpleNamespace
    >>> method_line(SimpleNamespace(method="exact_laminar"))  # doctest: +NORMALIZE_WHITESPACE
    'exact laminar: Kelessidis et al. (2006) J. Pet. Sci. Eng. 53:203-224; fits:
     Herschel-Bulkley least-squares fit'
    """
    m = resolve_method(results.method)
    return f"{text.method_words(m.label)}: {m.source}; fits: {text.method_words(m.fits)}"


def slip_line(name: str) -> str:
    """A slip-velocity method by its name and primary source (rig-facing sheets)."""
    return f"{text.method_words(name)} ({SLIP_METHODS.get(name).source})"


# ------------------------------------------------------------------------------ the trace


@dataclass(frozen=True)
class TraceRow:
    """One traced number: ``function(**inputs)`` returns ``_``; ``result`` takes the quantity
    from it.  ``inputs`` is Python keyword-argument text (SI numbers, ``case`` keys, setup
    names); ``value`` is SI in ``unit`` (a text quantity: ``value`` is the text)."""

    quantity: str
    column: str
    value: float | str | None
    unit: str
    function: str
    inputs: str = ""
    result: str = ""
    method: str = ""
    status: str = ""
    equation: str = ""


@dataclass(frozen=True)
class TraceEntry:
    """How the Summary rows whose name starts with ``match`` are traced: ``build(results,
    row)`` returns the (column, function, inputs, result, method, status kind, equation)
    tuples of that row (``row``: the summary-row dict)."""

    match: str
    build: Callable[..., list[tuple[str, str, str, str, str, str, str]]]


def _num(x) -> str:
    """An SI number as Python text that reads back to the same float."""
    return repr(float(np.asarray(x, dtype=float).reshape(-1)[0]))


def _hyd(results) -> tuple[str, str]:
    m = resolve_method(results.method)
    return m.label, HYDRAULICS_METHODS.get(m.name).status.kind


def _eq(*sections: str) -> str:
    return "calc/METHODS.md " + ", ".join(sections)


def _hyd_eq(results, *more: str) -> str:
    return _eq(*more, METHOD_SECTIONS.get(resolve_method(results.method).name, "§7"))


def _loss_extras(circ) -> str:
    """``, rpm=…, joint_losses=…`` of a circulation run where they are not the defaults."""
    out = f", rpm={_num(circ.rpm)}" if circ.rpm else ""
    if circ.joint_losses != "bore_friction":
        out += f", joint_losses={circ.joint_losses!r}"
    return out


def _margins_index(results, role: str) -> int | None:
    mt = results.circulation.margins
    return None if mt is None else mt.index(role)


def _circ(results, column, result, *sections):
    name, kind = _hyd(results)
    return (column, "@circulation", "", result, name, kind, _hyd_eq(results, *sections))


def _spp(results, row):
    return [_circ(results, "value", "_.standpipe_pressure", "§9.4")]


def _spp_measured(results, row):
    return [
        ("value", "case.check_value", "-1, 'measured_spp'", "_", "case input", "", "—"),
    ]


def _loaded_on(results) -> bool:
    """The Summary's ECD rows hold the cuttings-loaded margins (setup row ``loaded``)."""
    ld = getattr(results, "loaded", None)
    return ld is not None and ld.margins is not None


def _loaded(results, column, result, *sections):
    """A quantity of the cuttings-loaded margin table (setup row ``loaded``)."""
    name, kind = _hyd(results)
    return (column, "@loaded", "", result, name, kind, _eq(*sections, "§10.14"))


def _ecd_shoe(results, row):
    i = _margins_index(results, "shoe")
    if _loaded_on(results):
        return [
            _loaded(results, "value", f"_.ecd[{i}]", "§9.3"),
            _loaded(results, "limit", f"_.fracture[{i}]", "§9.6"),
            _loaded(results, "margin", f"_.fracture_margin[{i}]", "§9.6"),
            _loaded(results, "required", "_.margins.fracture", "§9.6"),
        ]
    return [
        _circ(results, "value", f"_.margins.ecd[{i}]", "§9.3"),
        _circ(results, "limit", f"_.margins.fracture[{i}]", "§9.6"),
        _circ(results, "margin", f"_.margins.fracture_margin[{i}]", "§9.6"),
        _circ(results, "required", "_.margins.margins.fracture", "§9.6"),
    ]


def _bit_limit_rows(results, ecd_bit: float) -> list:
    """Limit, margin and required fracture margin at the bit for an ECD there [kg/m³] (the
    clean or the cuttings-loaded one): none without a margin table."""
    i = _margins_index(results, "bit")
    if i is None:
        return []
    f_bit = _num(np.asarray(results.circulation.margins.fracture).reshape(-1)[i])
    name, kind = _hyd(results)
    return [
        _circ(results, "limit", f"_.margins.fracture[{i}]", "§9.6"),
        (
            "margin",
            "calc.circulation.fracture_margin",
            f"{f_bit}, {_num(ecd_bit)}",
            "_",
            name,
            kind,
            _eq("§9.6"),
        ),
        _circ(results, "required", "_.margins.margins.fracture", "§9.6"),
    ]


def _ecd_bit_loaded(results, row):
    """ECD at the bit with the cuttings load: the clean ECD plus the load's increment."""
    res = results.circulation
    name, kind = _hyd(results)
    value = (
        "value",
        "calc.cleaning.cuttings_ecd_increment",
        f"well, cleaning.transport.loaded_density, {_num(res.density)}, {_num(res.bit_md)}",
        "circulation.ecd_bit + _",
        name,
        kind,
        _eq("§9.3", "§10.14"),
    )
    return [value, *_bit_limit_rows(results, results.loaded.ecd_bit)]


def _ecd_bit(results, row):
    value = _circ(results, "value", "_.ecd_bit", "§9.3")
    return [value, *_bit_limit_rows(results, results.circulation.ecd_bit)]


def _ecd_bit_downhole(results, row):
    """ECD at the bit from the local density at T and p (calc.downhole.downhole_profile)."""
    st = "exact_solution"  # the integral; the density models carry their own statuses
    value = ("value", "@downhole", "", "_.ecd_bit", "calc.downhole (density at T and p)", st,
             _eq("§20.5"))  # fmt: skip
    return [value, *_bit_limit_rows(results, results.downhole.profile.ecd_bit)]


def _downhole_setup(results) -> tuple[str, str, str]:
    """The setup row of the downhole profile: every input as SI text."""
    run = results.downhole
    c, comp = run.conditions, run.conditions.composition
    mix = (f"calc.downhole.MudComposition({_num(comp.oil)}, {_num(comp.water)}, "
           f"{_num(comp.solids)}, {comp.oil_base!r}, {comp.water_base!r})")  # fmt: skip
    table = "None"
    if c.table is not None:
        table = (f"calc.downhole.TemperatureTable({tuple(map(float, c.table.tvd))!r}, "
                 f"{tuple(map(float, c.table.temperature))!r})")  # fmt: skip
    circ = "None"
    if c.circulating is not None:
        ci = c.circulating
        circ = "calc.downhole.CirculatingInputs({}, {}, {}, {})".format(
            *(_num(x) for x in (ci.inlet_temperature, ci.heat_capacity, ci.u_pipe, ci.u_annulus))
        )
    ts = "None" if c.surface_temperature is None else _num(c.surface_temperature)
    g = "None" if c.gradient is None else _num(c.gradient)
    ref = "None" if c.reference_temperature is None else _num(c.reference_temperature)
    at = [float(md) for _, md, _, _ in run.weak_points]
    return (
        "downhole",
        "calc.downhole.downhole_profile",
        f"circulation, calc.downhole.DownholeConditions({mix}, {ts}, {g}, {table}, "
        f"reference_temperature={ref}, circulating={circ}), step={_num(results.profile_step)}, "
        f"at={at!r}",
    )


def _tightest(results, row):
    if _loaded_on(results):
        return [
            _loaded(results, "value", "_.tightest.margin", "§9.6"),
            _loaded(results, "required", "_.tightest.required", "§9.6"),
        ]
    return [
        _circ(results, "value", "_.margins.tightest.margin", "§9.6"),
        _circ(results, "required", "_.margins.tightest.required", "§9.6"),
    ]


def _esd(results, row):
    return [_circ(results, "value", "_.esd_bit", "§9.2")]


def _pwd(results, row):
    pwd = results.case.checks[-1].values["pwd"]
    pred = results.circulation.ecd_at(pwd["md"])
    name, kind = _hyd(results)
    return [
        ("value", "case.check_value", "-1, 'pwd'", "_['ecd']", "case input", "", "—"),
        (
            "margin",
            "calc.circulation.ecd_deviation",
            f"{_num(pred)}, {_num(pwd['ecd'])}",
            "-_",
            name,
            kind,
            _eq("§9.3"),
        ),
    ]


def _ecd_bit_calibrated(results, row):
    """ECD at the bit of the two-part calibration (setup row ``two_part``), plus the cuttings
    load's increment at the bit when the Summary shows loaded ECDs."""
    name, kind = _hyd(results)
    if results.loaded is not None:
        res = results.circulation
        value = (
            "value",
            "calc.cleaning.cuttings_ecd_increment",
            f"well, cleaning.transport.loaded_density, {_num(res.density)}, {_num(res.bit_md)}",
            "two_part.calibrated.ecd_bit + _",
            name,
            kind,
            _eq("§9.3", "§10.14", "§23.3"),
        )
        e = float(results.two_part.calibrated.ecd_bit) + results.loaded.increment_bit
    else:
        value = ("value", "@two_part", "", "_.calibrated.ecd_bit", name, kind, _eq("§23.3"))
        e = float(results.two_part.calibrated.ecd_bit)
    return [value, *_bit_limit_rows(results, e)]


def _hydrostatic(results, row):
    return [_circ(results, "value", "_.static_bhp", "§9.1")]


def _bit_inputs(results) -> str:
    b = results.circulation.bit
    return (
        f"q={_num(b.flow_rate)}, density={_num(b.density)}, tfa={_num(b.tfa)}, "
        f"discharge_coefficient={_num(b.discharge_coefficient)}"
    )


def _bit_dp(results, row):
    return [
        (
            "value",
            "calc.bit.bit_pressure_drop",
            _bit_inputs(results),
            "_",
            "nozzle Bernoulli with discharge coefficient",
            "published_example",
            _eq("§8.3"),
        )
    ]


def _hsi(results, row):
    b = results.circulation.bit
    return [
        (
            "value",
            "calc.bit.hsi",
            f"power={_num(b.hydraulic_power)}, bit_size={_num(b.bit_size)}",
            "_",
            "bit hydraulic power per bit area",
            "field_form_only",
            _eq("§8.4", "§8.5"),
        )
    ]


def _min_av(results, row):
    v = np.atleast_1d(np.asarray(results.circulation.annulus.flow.velocity, dtype=float))
    i = int(np.argmin(v.reshape(-1)))
    return [_circ(results, "value", f"_.annulus.flow.velocity[{i}]", "§6.1")]


def _cleaning(results, row):
    slip = _slip_of(results) or ""
    kind = SLIP_METHODS.get(slip).status.kind if slip else ""
    return [
        (
            "value",
            "@cleaning",
            "",
            "_.verdict",
            f"slip {slip}",
            kind,
            _eq("§10.13", SLIP_SECTIONS.get(slip, "§10")),
        )
    ]


def _window(results, row):
    name, kind = _hyd(results)
    end = "_.q_low" if "lowest" in row["name"] else "_.q_high"
    return [("value", "@window", "", end, name, kind, _hyd_eq(results, "§12.1"))]


def _window_none(results, row):
    name, kind = _hyd(results)
    return [("value", "@window", "", "_.feasible", name, kind, _hyd_eq(results, "§12.1"))]


def _trip(results, row):
    name, kind = _hyd(results)
    end = "_.max_running_speed" if "running" in row["name"] else "_.max_pulling_speed"
    return [("value", "@trips", "", end, name, kind, _hyd_eq(results, "§11.7"))]


def _band_info(results, row):
    """The band's heading row carries no number (its inputs are on the setup row ``band``)."""
    return []


def _band(results, row):
    """A ± band row: the half-width of the quantity the row names (setup row ``band``)."""
    band = results.band
    i = next(
        k for k, qb in enumerate(band.quantities)
        if qb.half_width == row.get("value")
    )  # fmt: skip
    name, kind = _hyd(results)
    return [("value", "@band", "", f"_.quantities[{i}].half_width", name, kind, _eq("§18.1"))]


def _programme(results, row):
    """A property of the latest check against its mud programme: density as read, PV / YP /
    LSYP from the readings (API RP 13B-1 definitions, calc.rheology.viscometer)."""
    label = row["name"].split(" against", 1)[0]
    key = next(k for k, (lab, _) in text.PROGRAMME_PROPERTIES.items() if lab == label)
    if key == "density":
        return [("value", "case.check_value", "-1, 'density'", "_", "case input", "", "—")]
    eq = _eq({"lsyp": "§1.5", "pv": "§1.3", "yp": "§1.3"}.get(key, "§1.6"))
    method = "API RP 13B-1 field definitions"
    got = f"_.checks[-1].readings.{key}"
    if key.startswith("gels."):
        got = f"_.checks[-1].readings.gels_si[{key.split('.', 1)[1]!r}]"
    return [("value", "@case", "", got, method, "common_practice", eq)]


#: Summary rows (by the start of their name) → how each is traced.  A new Summary row needs
#: an entry here (tests/test_audit_trace.py fails on an untraced row).
TRACE: tuple[TraceEntry, ...] = (
    TraceEntry("standpipe pressure, predicted", _spp),
    TraceEntry("standpipe pressure, measured", _spp_measured),
    TraceEntry("ECD at the bit, cuttings-loaded, CALIBRATED", _ecd_bit_calibrated),
    TraceEntry("ECD at the bit, CALIBRATED", _ecd_bit_calibrated),
    TraceEntry("ECD at the bit, cuttings-loaded", _ecd_bit_loaded),
    TraceEntry("ECD at the bit, at downhole temperature and pressure", _ecd_bit_downhole),
    TraceEntry("ECD at the bit", _ecd_bit),
    TraceEntry("ECD at the ", _ecd_shoe),
    TraceEntry("tightest margin", _tightest),
    TraceEntry("static mud weight (ESD)", _esd),
    TraceEntry("downhole gauge (PWD) ECD", _pwd),
    TraceEntry("hydrostatic pressure at the bit", _hydrostatic),
    TraceEntry("bit pressure drop", _bit_dp),
    TraceEntry("HSI", _hsi),
    TraceEntry("lowest annular velocity", _min_av),
    TraceEntry("hole cleaning verdict", _cleaning),
    TraceEntry("operating window, lowest rate", _window),
    TraceEntry("operating window, highest rate", _window),
    TraceEntry("operating window (see", _window_none),
    TraceEntry("max. running speed", _trip),
    TraceEntry("max. pulling speed", _trip),
    TraceEntry("input-uncertainty band", _band_info),
    TraceEntry("± band:", _band),
    *(
        TraceEntry(f"{lab} against the mud programme", _programme)
        for lab, _ in text.PROGRAMME_PROPERTIES.values()
    ),
)

#: The setup rows, in order: each is ``name = function(inputs)``; later rows and the traced
#: quantities refer to them by name (``@name`` in the function column: "the setup row's
#: return value").
SETUP_NAMES = (
    "case", "well", "fluid", "margins", "circulation", "band", "cleaning", "loaded", "window",
    "trips", "two_part", "downhole",
)  # fmt: skip


def _setup(results) -> list[tuple[str, str, str]]:
    """(name, function, inputs) of the setup rows this report needs."""
    case = results.case
    m = resolve_method(results.method)
    lim = case.limits
    density = case.check_value(-1, "density")
    q = case.check_value(-1, "flow_rate")
    rows = [
        ("case", "addin.case.load_case", repr(case.source)),
        ("well", "case.well", "-1"),
        (
            "fluid",
            "calc.circulation.hydraulics_fluid_from_readings",
            f"case.checks[-1].readings, {m.name!r}, density={_num(density)}, "
            f"label={case.checks[-1].label!r}, fit_notes=False",
        ),
        (
            "margins",
            "calc.circulation.Margins",
            f"fracture={_num(lim['fracture_margin'])}, pore={_num(lim['pore_margin'])}",
        ),
    ]
    rating = "None" if lim["surface_rating"] is None else _num(lim["surface_rating"])
    rpm_v = case.checks[-1].values.get("rpm")
    rpm = "None" if rpm_v is None else _num(rpm_v)
    rows.append(
        (
            "circulation",
            "calc.circulation.circulate",
            f"well, fluid, {_num(q)}, method={m.name!r}, window=case.window, "
            f"weak_points=case.weak_points, margins=margins, surface_rating={rating}"
            + _loss_extras(results.circulation),
        )
    )
    if getattr(results, "downhole", None) is not None:
        rows.append(_downhole_setup(results))
    band = getattr(results, "band", None)
    if band is not None:
        rows.append(
            (
                "band",
                "calc.circulation.ecd_band",
                f"well, case.checks[-1].readings, {_num(density)}, {_num(q)}, "
                f"method={m.name!r}, window=case.window, weak_points=case.weak_points, "
                f"margins=margins, dial_resolution={_num(band.dial_resolution)}, "
                f"balance_resolution={_num(band.balance_resolution)}, "
                f"rate_uncertainty={_num(band.rate_uncertainty)}"
                + _loss_extras(results.circulation),
            )
        )
    if results.cleaning is not None:
        c = results.cleaning.cuttings
        rows.append(
            (
                "cleaning",
                "calc.cleaning.hole_cleaning",
                f"well, fluid, {_num(q)}, rop={_num(case.check_value(-1, 'rop'))}, "
                f"cuttings=calc.cleaning.Cuttings(size={_num(c.size)}, "
                f"density={_num(c.density)}, sphericity={_num(c.sphericity)}), rpm={rpm}",
            )
        )
    if _loaded_on(results):
        rows.append(
            (
                "loaded",
                "calc.cleaning.loaded_margins",
                f"circulation.margins, cleaning, well, {_num(density)}",
            )
        )
    ow = results.window
    if ow is not None:
        qs = np.asarray(ow.q)
        cut = (
            "None"
            if results.cleaning is None
            else "calc.cleaning.Cuttings(size={}, density={}, sphericity={})".format(
                *(_num(x) for x in (c.size, c.density, c.sphericity))
            )
        )
        rop = _num(case.check_value(-1, "rop")) if results.cleaning is not None else "0.0"
        rows.append(
            (
                "window",
                "calc.rate_window.operating_window",
                f"well, fluid, numpy.linspace({_num(qs[0])}, {_num(qs[-1])}, {qs.size}), "
                f"window=case.window, weak_points=case.weak_points, margins=margins, "
                f"surface_rating={rating}, method={m.name!r}, rop={rop}, cuttings={cut}, "
                f"rpm={rpm if results.cleaning is not None else None}"
                + (", pumps=case.running_pumps(-1)" if getattr(results, "pumps", None) else ""),
            )
        )
    if results.surge is not None:
        end = results.surge.limits.string_end
        rows.append(
            (
                "trips",
                "calc.surge.trip_speed_limits",
                f"well, fluid, window=case.window, weak_points=case.weak_points, "
                f"fracture_margin={_num(lim['trip_fracture_margin'])}, "
                f"pore_margin={_num(lim['trip_pore_margin'])}, string_end={end!r}, "
                f"method={m.name!r}{_trip_extras(results.surge)}",
            )
        )
    tp = getattr(results, "two_part", None)
    if tp is not None:
        meas = "None" if tp.measured_spp is None else _num(tp.measured_spp)
        inc = (
            f"calc.cleaning.cuttings_ecd_increment(well, cleaning.transport.loaded_density, "
            f"{_num(density)}, {_num(tp.gauge_md)})"
            if results.cleaning is not None
            else "0.0"
        )
        rows.append(
            (
                "two_part",
                "calc.circulation.calibrate_two_part",
                f"well, fluid, {_num(q)}, measured_spp={meas}, gauge_ecd={_num(tp.gauge_ecd)}, "
                f"gauge_md={_num(tp.gauge_md)}, gauge_increment={inc}, method={m.name!r}, "
                f"window=case.window, weak_points=case.weak_points, margins=margins, "
                f"surface_rating={rating}",
            )
        )
    return rows


def _trip_extras(trip) -> str:
    """The inertia and stand-gel inputs of the trip-speed limits (acceleration time [s], the
    stand gel [Pa]) as keyword text, where the report used them."""
    out = ""
    t_acc = getattr(trip, "acceleration_time", None)
    if t_acc is not None:
        out += f", acceleration_time={_num(t_acc)}"
    gel = getattr(trip, "stand_gel", None)
    if gel is not None and gel[1] is not None:
        out += f", stand_gel={_num(gel[1])}"
    return out


def _si_unit(kind) -> str:
    return "" if not kind else text.unit_label(kind, "si")


def _value_of(row: dict, column: str):
    if column == "value":
        return row.get("value") if row.get("value") is not None else row.get("text")
    return row.get(column)


def trace_rows(results, summary) -> list[TraceRow]:
    """One :class:`TraceRow` per traced column of every Summary row (``summary``: the rows of
    :func:`addin.report.summary_rows.summary_rows`); an untraced row gives function
    ``"untraced"``."""
    out = []
    for row in summary:
        entry = next((e for e in TRACE if row["name"].startswith(e.match)), None)
        kind = row.get("kind")
        if entry is None:
            out.append(
                TraceRow(row["name"], "value", _value_of(row, "value"), _si_unit(kind), "untraced")
            )
            continue
        for column, function, inputs, result, method, status, eq in entry.build(results, row):
            out.append(
                TraceRow(
                    quantity=row["name"],
                    column=column,
                    value=_value_of(row, column),
                    unit=_si_unit(kind),
                    function=function,
                    inputs=inputs,
                    result=result,
                    method=method,
                    status=text.status_label(status) if status else "",
                    equation=eq,
                )
            )
    return out


# ------------------------------------------------------------------------------ the sheet


def _methods_block(ws, row, results) -> int:
    row = heading(ws, row, "Methods used and how they were checked", span=6)
    row = table_header(ws, row, 1, ["method", "family", "source", "status", "evidence", "caveats"])
    for family, info in used_methods(results):
        st = info.status
        cells = [
            info.name,
            family,
            info.source,
            text.status_label(st.kind),
            st.evidence,
            "\n".join(f"• {c}" for c in st.caveats) or "–",
        ]
        for col, v in enumerate(cells, start=1):
            put(ws, row, col, v, "bf_text")
        longest = max(len(st.evidence) // 50, sum(1 + len(c) // 50 for c in st.caveats), 1)
        ws.row_dimensions[row].height = 12.0 * (longest + 1)
        row += 1
    return row + 1


def _trace_block(ws, row, results, summary) -> int:
    row = heading(ws, row, "Trace of every Summary number (recompute in Python)", span=10)
    put(
        ws,
        row,
        1,
        "Inputs are SI (m, kg/m³, m³/s, Pa, m/s, Pa·s). Setup rows: name = function(inputs), "
        "in order ('case' is the case file named above; its inputs hash must match). Quantity "
        "rows: _ = function(inputs), or _ = the setup row named '@name'; the number is the "
        "result expression of _. Values are SI; the Summary shows them in the case's units.",
        "bf_text",
    )
    ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=10)
    ws.row_dimensions[row].height = 36
    row += 2
    heads = ["quantity", "column", "value (SI)", "SI unit", "calc function", "inputs",
             "result", "method", "status", "equation"]  # fmt: skip
    row = table_header(ws, row, 1, heads)
    for name, function, inputs in _setup(results):
        for col, v in enumerate((name, "setup", None, "", function, inputs), start=1):
            if v is not None:
                put(ws, row, col, v, "bf_cell")
        row += 1
    for tr in trace_rows(results, summary):
        shown = tr.value
        if isinstance(shown, (int, float, np.floating)) and tr.unit:
            shown = float(shown)
        cells = (tr.quantity, tr.column, shown, tr.unit, tr.function, tr.inputs, tr.result,
                 tr.method, tr.status, tr.equation)  # fmt: skip
        for col, v in enumerate(cells, start=1):
            if v is None:
                continue
            c = put(ws, row, col, v, "bf_cell")
            if col == 3 and isinstance(v, float):
                c.number_format = "0.000000000E+00"
        row += 1
    return row


def write_methods_and_trace(ws, results, summary, row: int) -> int:
    """The Audit sheet's status of every method used and the trace table, from ``row``;
    returns the next free row (columns A–D keep the widths of the sheet's first tables)."""
    for letter, width in zip("EFGHIJ", (44, 70, 30, 22, 30, 26), strict=True):
        ws.column_dimensions[letter].width = width
    row = _methods_block(ws, row, results)
    return _trace_block(ws, row + 1, results, summary)
