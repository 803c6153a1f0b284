"""The one formatter of the faces: SI values, notes and places in the well → words and numbers.

:mod:`calc` returns SI numbers, quantity kinds, :class:`~calc.span.Span` places and structured
:class:`~calc.notes.Note` findings; the report, the command line, the JSON output and the
worksheet functions all turn them into text here, in any named unit system
(``"oilfield"``, ``"metric"``, ``"si"``; :data:`calc.units.UNIT_SYSTEMS`), or in a worksheet
function's unit set (any object with a ``unit(kind)`` method).

>>> quantity(0.03293, "flow_rate", "oilfield")
'522 gpm'
>>> depth_span(1828.8, 2499.36)
'MD 6,000-8,200 ft'
>>> depth_span(1828.8, 2499.36, "metric")
'MD 1,828.8-2,499.4 m'
>>> span(Span("annulus", "5 in DP", "9-5/8 in casing", top_md=1828.8, bottom_md=2499.36))
'5 in DP in 9-5/8 in casing, MD 6,000-8,200 ft'
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.errors import InputError, check_choice
from calc.notes import Note
from calc.span import Span
from calc.units import from_si, label, unit_for
from calc.values import Value, fill

__all__ = [
    "BAND_BASIS",
    "BAND_INPUT_WORDS",
    "BREAKDOWN_LABELS",
    "CLEANING_STATUS",
    "METHOD_WORDS",
    "PARAMETER_WORDS",
    "PROGRAMME_PROPERTIES",
    "PROGRAMME_WORDS",
    "STATUS_WORDS",
    "NoteGroup",
    "band_input",
    "band_quantity",
    "band_value",
    "check_point",
    "depth_point",
    "depth_span",
    "display_number",
    "display_values",
    "error",
    "group_notes",
    "keys_in_words",
    "method_spread",
    "method_words",
    "model",
    "model_parameters",
    "note",
    "note_line",
    "number_text",
    "parameter_unit",
    "parameter_words",
    "programme_status",
    "pump_speed",
    "quantity",
    "span",
    "status_label",
    "subject",
    "tightest_where",
    "unit_label",
    "value",
]


def _unit(kind: str, system) -> str:
    """The unit text of ``kind``: ``system`` is a unit-system name or any object with a
    ``unit(kind)`` method (a worksheet function's unit set with per-kind overrides)."""
    return unit_for(kind, system) if isinstance(system, str) else system.unit(kind)


def unit_label(kind: str, system: str) -> str:
    """Printable unit of a quantity kind in a unit system ("–" for dimensionless).

    >>> unit_label("stress", "oilfield")
    'lbf/100ft²'
    """
    if kind in ("dimensionless", "", None):
        return "–"
    return label(_unit(kind, system))


def display_number(v, kind: str, system: str) -> float | None:
    """SI → the number shown in the system's unit for ``kind``; None and non-finite → None.

    An array gives its first value (the report runs one rate).

    >>> round(display_number(1318.0907, "density", "oilfield"), 4)
    11.0
    >>> display_number(float("nan"), "density", "oilfield") is None
    True
    """
    if v is None:
        return None
    v = float(np.asarray(v, dtype=float).reshape(-1)[0]) if np.ndim(v) else float(v)
    if not np.isfinite(v):
        return None
    return float(from_si(v, _unit(kind, system), kind))


def display_values(v, kind: str, system: str):
    """SI → the system's unit, arrays too (a flat list); None and non-finite values → None;
    a pure number (``kind`` None, "" or "dimensionless") as it is.

    >>> display_values([1318.0907, float("nan")], "density", "oilfield")[1] is None
    True
    >>> display_values(None, "density", "oilfield") is None, display_values(0.7, None, "si")
    (True, 0.7)
    """
    a = np.asarray(np.nan if v is None else v, dtype=float)
    plain = kind in (None, "", "dimensionless")
    out = a if plain else np.asarray(from_si(a, _unit(kind, system), kind), dtype=float)
    if out.ndim == 0:
        return float(out) if np.isfinite(out) else None
    return [float(x) if np.isfinite(x) else None for x in out.ravel()]


def number_text(x: float, kind: str = "", spec: str = "") -> str:
    """A display number as text: ``spec`` if given, else thousands separators from 1,000 up,
    whole feet/metres-with-one-decimal for depths and lengths, 3–4 significant digits below.

    >>> number_text(10680.2, "depth"), number_text(3255.26, "depth"), number_text(0.3048)
    ('10,680', '3,255', '0.3048')
    """
    if spec:
        return format(x, spec)
    if not np.isfinite(x):
        return str(x)
    if kind in ("depth", "length"):
        return f"{x:,.0f}" if abs(x) >= 100 else f"{x:,.1f}"
    return f"{x:,.0f}" if abs(x) >= 1000 else f"{x:.4g}"


def quantity(v_si: float, kind: str, system: str = "oilfield", spec: str = "") -> str:
    """An SI value as "number unit" in the system's unit for ``kind``.

    >>> quantity(1318.09, "density", "oilfield"), quantity(2.0e7, "pressure", "metric")
    ('11 ppg', '200 bar')
    """
    if not kind or kind == "dimensionless":
        return number_text(float(v_si), "", spec)
    u = _unit(kind, system)
    return f"{number_text(float(from_si(float(v_si), u, kind)), kind, spec)} {label(u)}"


def _md(x: float, system: str) -> str:
    u = _unit("depth", system)
    digits = 0 if u == "ft" else 1
    return f"{float(from_si(float(x), u)):,.{digits}f}"


def depth_span(top: float, bottom: float, system: str = "oilfield") -> str:
    """An MD range [m] as 'MD a-b unit' in the system's depth unit (feet whole, metres to 0.1)."""
    return f"MD {_md(top, system)}-{_md(bottom, system)} {label(_unit('depth', system))}"


def depth_point(md: float, system: str = "oilfield") -> str:
    """One MD [m] as 'MD x unit'.

    >>> depth_point(3255.264)
    'MD 10,680 ft'
    """
    return f"MD {_md(md, system)} {label(_unit('depth', system))}"


def span(s: Span, system: str = "oilfield", *, depths: bool = True) -> str:
    """A place in the well in words: "item[ tool joints][ in section], MD a-b unit"; a point
    (top = bottom) reads "item, MD x unit" ("MD x unit" without an item).

    >>> span(Span("annulus", "", top_md=3255.264, bottom_md=3255.264))
    'MD 10,680 ft'
    """
    part = s.part
    where = f"{part} in {s.section}" if s.section else part
    if depths and s.has_depth:
        point = s.top_md == s.bottom_md
        md = depth_point(s.top_md, system) if point else depth_span(s.top_md, s.bottom_md, system)
        where = f"{where}, {md}" if where else md
    return where


def check_point(p, system: str = "oilfield") -> str:
    """A margin check point (:class:`calc.circulation.CheckPoint`) in words: its name, "MD x
    unit" for a depth-grid point, "window station, TVD x unit" for a pressure-window station.

    >>> from calc.circulation import CheckPoint
    >>> check_point(CheckPoint("window_station", "", 3298.0, 3018.13))
    'window station, TVD 9,902 ft'
    >>> check_point(CheckPoint("depth", "", 3255.264, 3000.0), "oilfield")
    'MD 10,680 ft'
    """
    if p.role == "depth":
        return depth_point(p.md, system)
    if p.role == "window_station":
        return f"window station, TVD {_md(p.tvd, system)} {label(_unit('depth', system))}"
    return p.name


#: Words for the margin states of :func:`calc.circulation.margin_status`.
STATUS_WORDS = {"ok": "OK", "near_limit": "MARGINAL", "exceeded": "OUTSIDE LIMIT"}

#: Words for the hole-cleaning verdicts (calc.cleaning): a poor verdict is not a limit crossed.
CLEANING_STATUS = {"adequate": "OK", "marginal": "MARGINAL", "poor": "POOR"}


#: The mud-programme properties of a check (case key → label, quantity kind) in table order.
PROGRAMME_PROPERTIES = {
    "density": ("density", "density"),
    "pv": ("PV", "viscosity"),
    "yp": ("YP", "stress"),
    "lsyp": ("LSYP", "stress"),
    "gels.10s": ("10-second gel", "stress"),
    "gels.10min": ("10-minute gel", "stress"),
    "gels.30min": ("30-minute gel", "stress"),
}

#: Status words of a property against its mud-programme range.
PROGRAMME_WORDS = {"in": "OK", "below": "BELOW PROGRAMME", "above": "ABOVE PROGRAMME"}


def programme_status(value_si, low_si, high_si, kind: str, system: str = "oilfield") -> str:
    """A property against its programme range, compared as displayed (the system's unit, to
    the 0.01 the report shows): PROGRAMME_WORDS 'in' / 'below' / 'above'; "" if unknown.

    >>> from calc.units import to_si
    >>> programme_status(0.024, 0.012, 0.022, "viscosity")  # 24 cP against 12-22 cP
    'ABOVE PROGRAMME'
    >>> programme_status(to_si(11.2, "ppg"), to_si(10.8, "ppg"), to_si(11.3, "ppg"), "density")
    'OK'
    """
    v, lo, hi = (display_number(x, kind, system) for x in (value_si, low_si, high_si))
    if v is None or lo is None or hi is None:
        return ""
    v, lo, hi = round(v, 2), round(lo, 2), round(hi, 2)
    key = "below" if v < lo else "above" if v > hi else "in"
    return PROGRAMME_WORDS[key]


def tightest_where(margins, system: str = "oilfield", step: float = 0.005, tight=None) -> str:
    """The tightest check point of ``margins`` (calc.circulation margins with ``tightest``) in
    words, naming every point tied with it: a point whose margin of the same limit differs by
    less than ``step`` in the display unit of density (half the 0.01 shown).

    ``tight`` (default ``margins.tightest``) is the point the caller reports.
    Returns 'A' or 'A and B' or 'A, B and N more points within 0.01 <unit>'."""
    t = margins.tightest if tight is None else tight
    arr = margins.fracture_margin if t.limit == "fracture" else margins.pore_margin
    arr = np.asarray(arr, dtype=float).reshape(len(margins.points), -1)[:, 0]
    m0 = display_number(float(np.asarray(t.margin).reshape(-1)[0]), "density", system)
    zero = display_number(0.0, "density", system)
    first = check_point(t.point, system)
    tied = [
        check_point(p, system)
        for p, m in zip(margins.points, arr, strict=True)
        if np.isfinite(m)
        and abs(display_number(float(m), "density", system) - zero - (m0 - zero)) < step
        and p is not t.point
    ]
    named = [w for w in dict.fromkeys(tied) if w != first]
    named.sort(key=lambda w: w.startswith("MD "))  # named points (weak points …) first
    if not named:
        return first
    if len(named) == 1:
        return f"{first} and {named[0]}"
    return (
        f"{first}; {named[0]}; and {len(named) - 1} more points within "
        f"{2 * step:g} {unit_label('density', system)}"
    )


#: Words for the verification kinds of :data:`calc.registry.STATUS_KINDS` (calc/METHODS.md §0.3).
STATUS_LABELS = {
    "exact_solution": "exact solution",
    "published_example": "published worked example",
    "reference_library": "reference library",
    "independent_reimplementation": "independent re-implementation",
    "field_form_only": "field form equals SI form only",
    "common_practice": "common practice",
    "self_consistency": "not checked against an outside source",
    "from_memory": "coefficients from memory, not yet checked against the source",
    "not_assessed": "not yet assessed",
}


def status_label(kind: str) -> str:
    """How a method has been checked, in words (a kind of :data:`calc.registry.STATUS_KINDS`).

    >>> status_label("exact_solution"), status_label("from_memory")
    ('exact solution', 'coefficients from memory, not yet checked against the source')
    >>> status_label("guessed")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    calc.errors.InputError: verification status = 'guessed': unknown; allowed: one of exact_...
    """
    return STATUS_LABELS[check_choice("verification status", kind, STATUS_LABELS)]


#: Words for the keys of :meth:`calc.circulation.CirculationResult.breakdown`.
BREAKDOWN_LABELS = {
    "back_pressure": "back pressure",
    "surface": "surface lines",
    "string": "drill string",
    "tools": "fixed tool drops",
    "bit": "bit",
    "annulus": "annulus",
}


def value(v: Value, system: str = "oilfield", spec: str = "") -> str:
    """One note value as text in the unit system (ranges as "a-b unit", lists joined by "; ")."""
    x = v.value
    if isinstance(x, Span):
        return span(x, system)
    if isinstance(x, str):
        return x
    if isinstance(x, tuple) and x and all(isinstance(e, (int, float)) for e in x):
        if not v.kind or v.kind == "dimensionless":
            return "-".join(number_text(float(e), "", spec) for e in x)
        u = _unit(v.kind, system)
        nums = [number_text(float(from_si(float(e), u, v.kind)), v.kind, spec) for e in x]
        return "-".join(nums) + f" {label(u)}"
    if isinstance(x, tuple):
        return "; ".join(value(Value(v.name, e, v.kind), system, spec) for e in x)
    return quantity(float(x), v.kind, system, spec)


def error(e: InputError, system: str = "oilfield") -> str:
    """An :class:`~calc.errors.InputError` in words, its numbers in the unit system (errors
    that carry no kind read as raised).

    >>> e = InputError("pipe OD", 0.254, "< the hole diameter {hole}", kind="diameter",
    ...                values=(Value("hole", 0.2159, "diameter"),))
    >>> error(e)
    'pipe OD = 10 in: not allowed; allowed: < the hole diameter 8.5 in'
    """
    if not e.kind and not e.values:
        return str(e)
    scalar = e.kind and np.ndim(e.value) == 0 and not isinstance(e.value, str)
    shown = quantity(float(e.value), e.kind, system) if scalar else e.shown
    allowed = fill(e.allowed, e.values, lambda v, spec: value(v, system, spec))
    return f"{e.name} = {shown}: {e.problem}; allowed: {allowed}"


def note(n: Note, system: str = "oilfield") -> str:
    """The note's text with its values in the unit system."""
    return fill(n.text, n.values, lambda v, spec: value(v, system, spec))


def subject(n: Note, system: str = "oilfield") -> str:
    """What the note concerns, in words ("" if nothing in particular)."""
    s = n.subject
    return span(s, system) if isinstance(s, Span) else str(s)


def note_line(n: Note, system: str = "oilfield") -> str:
    """'LEVEL [subject]: text' in the unit system (the command line's form of a note)."""
    where = subject(n, system)
    return f"{n.level.upper()}{' [' + where + ']' if where else ''}: {note(n, system)}"


#: Note levels, worst first (the order of a grouped note list).
_LEVEL_ORDER = ("caution", "warning", "info")


@dataclass(frozen=True)
class NoteGroup:
    """Notes of one code and one wording, shown as one line: the worst level, how many, where
    (the affected places, MD extent), and the message (the first note's, saying when the
    others' numbers differ)."""

    level: str
    code: str
    count: int
    about: str
    message: str


def _group_about(notes, system) -> str:
    """Where a group of notes lies: one note's subject; else 'N places, MD a-b unit' (with the
    items, at most three) for spans, or the distinct subjects (at most three, then '+N more')."""
    if len(notes) == 1:
        return subject(notes[0], system)
    spans = [n.subject for n in notes if isinstance(n.subject, Span)]
    mds = [m for s in spans for m in (s.top_md, s.bottom_md) if m is not None]
    names = list(dict.fromkeys(
        x for n in notes if (x := (span(n.subject, system, depths=False) if isinstance(
            n.subject, Span) else str(n.subject)))
    ))  # fmt: skip
    parts = []
    if mds:
        lo, hi = min(mds), max(mds)
        where = depth_point(lo, system) if lo == hi else depth_span(lo, hi, system)
        parts.append(f"{len(notes)} places, {where}")
    if names:
        shown = "; ".join(names[:3]) + (f"; +{len(names) - 3} more" if len(names) > 3 else "")
        parts.append(shown)
    return ", ".join(parts) if parts else f"{len(notes)} places"


def group_notes(notes, system: str = "oilfield") -> list[NoteGroup]:
    """One line per (code, affected place): notes raised once per station or interval (a
    :class:`~calc.span.Span` subject) are merged with a count and their MD extent; notes of one
    code about one named thing become one line listing their distinct messages (a bullet each);
    worst level first, then the larger count, then the
    order of first appearance.  calc's notes are unchanged (a face concern).

    >>> a = Note("caution", "ecd_near_fracture", "ECD near fracture", Span("annulus", "",
    ...          top_md=3000.0, bottom_md=3000.0))
    >>> b = Note("caution", "ecd_near_fracture", "ECD near fracture", Span("annulus", "",
    ...          top_md=3300.0, bottom_md=3300.0))
    >>> g = group_notes([Note("info", "x", "other"), a, b])
    >>> [(x.code, x.count) for x in g], g[0].about
    ([('ecd_near_fracture', 2), ('x', 1)], '2 places, MD 9,843-10,827 ft')
    """
    groups: dict[tuple[str, str], list[Note]] = {}
    for n in notes:
        where = "@span" if isinstance(n.subject, Span) else str(n.subject)
        groups.setdefault((n.code, where), []).append(n)
    out = []
    for i, ((code, _), ns) in enumerate(groups.items()):
        level = min((n.level for n in ns), key=_level_rank)
        by_text: dict[str, list[Note]] = {}
        for n in sorted(ns, key=lambda n: _level_rank(n.level)):
            # per-place notes: one wording, numbers may differ; about one thing: each message
            key = n.text if isinstance(n.subject, Span) else note(n, system)
            by_text.setdefault(key, []).append(n)
        lines = []
        for same in by_text.values():
            first = note(same[0], system)
            if len({note(n, system) for n in same}) > 1:
                first += f" (the first of {len(same)}; the others differ in their values)"
            lines.append(first)
        message = lines[0] if len(lines) == 1 else "\n".join("• " + x for x in lines)
        out.append((_level_rank(level), -len(ns), i, NoteGroup(
            level, code, len(ns), _group_about(ns, system), message)))  # fmt: skip
    return [g for *_, g in sorted(out, key=lambda t: t[:3])]


def _level_rank(level: str) -> int:
    return _LEVEL_ORDER.index(level) if level in _LEVEL_ORDER else len(_LEVEL_ORDER)


#: Model parameters of these kinds keep one unit in every system: relaxation times (Cross,
#: Carreau-Yasuda λ) are quoted in seconds, as rheometry reports them.
_FIXED_PARAMETER_UNITS = {"time": "s"}


def parameter_unit(kind: str, system="oilfield") -> str:
    """Printable unit of a rheology-model parameter of ``kind`` ("" for a pure number): the
    system's unit, with ·sⁿ for a consistency index, seconds for a time constant.

    >>> parameter_unit("consistency"), parameter_unit("consistency", "si"), parameter_unit("time")
    ('lbf·sⁿ/100ft²', 'Pa·sⁿ', 's')
    """
    if not kind or kind == "dimensionless":
        return ""
    if kind in _FIXED_PARAMETER_UNITS:
        return _FIXED_PARAMETER_UNITS[kind]
    text = label(_unit(kind, system))
    if kind == "consistency":
        text = text.replace("/", "·sⁿ/", 1) if "/" in text else text + "·sⁿ"
    return text


def model_parameters(m, system="oilfield") -> dict[str, tuple[float, str]]:
    """A rheology model's parameters in a unit system: symbol → (value, unit label).

    ``m`` is any :mod:`calc.rheology.models` model (its ``parameters()`` are SI values with
    kinds).

    >>> from calc.rheology import Bingham
    >>> model_parameters(Bingham(3.0, 0.025), "metric")
    {'τy': (3.0, 'Pa'), 'μp': (25.0, 'mPa·s')}
    """
    out = {}
    for v in m.parameters():
        if not v.kind or v.kind == "dimensionless" or v.kind in _FIXED_PARAMETER_UNITS:
            shown = float(v.value)
        else:
            shown = float(from_si(float(v.value), _unit(v.kind, system), v.kind))
        out[v.name] = (shown, parameter_unit(v.kind, system))
    return out


def model(m, system="oilfield", digits: int = 4) -> str:
    """One line: a rheology model's name and parameters in a unit system.

    >>> from calc.rheology import HerschelBulkley
    >>> model(HerschelBulkley(3.0, 0.5, 0.6), "si")
    'Herschel-Bulkley: τy = 3 Pa, K = 0.5 Pa·sⁿ, n = 0.6'
    """
    parts = [
        f"{sym} = {val:.{digits}g}{' ' + unit if unit else ''}"
        for sym, (val, unit) in model_parameters(m, system).items()
    ]
    return f"{m.name}: " + ", ".join(parts)


# ----------------------------------------------------------------------------- ECD band

#: Words for the inputs of :mod:`calc.circulation.band` (:data:`calc.circulation.BAND_INPUTS`).
BAND_INPUT_WORDS = {
    "dial_readings": "viscometer dial readings",
    "density": "mud balance",
    "flow_rate": "flow rate (pump efficiency)",
}

#: Display formats of a band's numbers, by unit (whole psi, 0.01 ppg …); others: 4 digits.
_BAND_SPEC = {"ppg": ".2f", "sg": ".3f", "kg/m**3": ".1f", "psi": ",.0f", "bar": ".1f"}

#: Where the band of the report is computed: the clean circulating mud (no cuttings load).
BAND_BASIS = "clean circulating mud, no cuttings load"


def _band_number(v_si: float, kind: str, system) -> str:
    u = _unit(kind, system)
    return number_text(float(from_si(float(v_si), u, kind)), kind, _BAND_SPEC.get(u, ""))


def band_input(name: str, band, system: str = "oilfield") -> str:
    """An input of an :class:`calc.circulation.EcdBand` with its half-width, in words.

    >>> from types import SimpleNamespace as NS
    >>> b = NS(dial_resolution=0.5, balance_resolution=11.9826427, rate_uncertainty=0.03)
    >>> band_input("density", b), band_input("dial_readings", b)
    ('mud balance (±0.10 ppg)', 'viscometer dial readings (±0.5° each)')
    >>> band_input("flow_rate", b)
    'flow rate (pump efficiency, ±3 % of rate)'
    """
    if name == "dial_readings":
        return f"{BAND_INPUT_WORDS[name]} (±{band.dial_resolution:g}° each)"
    if name == "density":
        res = _band_number(band.balance_resolution, "density", system)
        return f"{BAND_INPUT_WORDS[name]} (±{res} {unit_label('density', system)})"
    if name == "flow_rate":
        return f"flow rate (pump efficiency, ±{100 * band.rate_uncertainty:g} % of rate)"
    return name


def band_quantity(qb, band, system: str = "oilfield") -> str:
    """Which quantity a :class:`calc.circulation.QuantityBand` is, in words.

    >>> from types import SimpleNamespace as NS
    >>> band_quantity(NS(quantity="ecd_bit", point=None), None)
    'ECD at the bit'
    """
    if qb.quantity == "spp":
        return "standpipe pressure"
    if qb.quantity == "ecd_bit" or qb.point is None:
        return "ECD at the bit" if qb.quantity == "ecd_bit" else "ECD"
    where = check_point(qb.point, system)
    if qb.quantity == "ecd_tightest":
        limit = f", {band.tightest_limit}" if band.tightest_limit else ""
        return f"ECD at the tightest point ({where}{limit})"
    return f"ECD at the {where}"


def band_value(qb, system: str = "oilfield") -> str:
    """'nominal ± half-width unit' of a band.

    >>> from types import SimpleNamespace as NS
    >>> band_value(NS(nominal=1416.6, half_width=12.23, kind="density"))
    '11.82 ± 0.10 ppg'
    """
    lab = unit_label(qb.kind, system)
    nominal = _band_number(qb.nominal, qb.kind, system)
    return f"{nominal} ± {_band_number(qb.half_width, qb.kind, system)} {lab}"


def method_spread(qb, system: str = "oilfield") -> str:
    """The method spread of a band: 'methods a unit (name) to b unit (name)' ("" without one).

    >>> from types import SimpleNamespace as NS
    >>> method_spread(NS(kind="density", method_min=("power_law", 1414.6),
    ...                  method_max=("bingham", 1433.0)))
    'methods 11.81 ppg (power law) to 11.96 ppg (Bingham)'
    """
    lo, hi = qb.method_min, qb.method_max
    if lo is None:
        return ""
    lab = unit_label(qb.kind, system)
    return (
        f"methods {_band_number(lo[1], qb.kind, system)} {lab} ({method_words(lo[0])}) to "
        f"{_band_number(hi[1], qb.kind, system)} {lab} ({method_words(hi[0])})"
    )


def pump_speed(pumps, q=None) -> str:
    """Strokes per minute of the pumps (an :class:`addin.report.compute.PumpRun`) in words:
    at rate ``q`` [m³/s] the same spm on each running pump ("62.6 spm × 2 pumps"); without
    ``q`` the check's own ``pump_spm`` ("52 + 52 spm").  "" without pumps or a speed.

    >>> from types import SimpleNamespace
    >>> pump_speed(SimpleNamespace(spm=(52.0, 52.0)))
    '52 + 52 spm'
    """
    if pumps is None:
        return ""
    if q is None:
        return "" if pumps.spm is None else " + ".join(f"{x:g}" for x in pumps.spm) + " spm"
    n = pumps.spm_at(q)
    if n is None:
        return ""
    k = len(pumps.running)
    return f"{n:.1f} spm × {k} pump{'s' if k > 1 else ''}"


# ------------------------------------------------------------------- method and key names

#: Words for the parts of registry method names (``api13d_2010_hb`` → "API RP 13D (2010)
#: Herschel-Bulkley"); multi-part entries first.  A part not listed is shown as it is.
METHOD_WORDS = {
    "power_law": "power law",
    "two_speed": "two-speed",
    "least_squares": "least-squares fit",
    "equilibrium_bed": "equilibrium bed",
    "exact_laminar": "exact laminar",
    "drag_balance": "drag balance",
    "carreau_yasuda": "Carreau-Yasuda",
    "walker_mayes": "Walker-Mayes",
    "max_impact": "maximum jet impact",
    "max_power": "maximum hydraulic power",
    "as_printed": "as printed",
    "api13d": "API RP 13D",
    "hb": "Herschel-Bulkley",
    "bingham": "Bingham",
    "newtonian": "Newtonian",
    "loglog": "log-log fit",
    "larsen": "Larsen",
    "rubiandini": "Rubiandini",
    "moore": "Moore",
    "chien": "Chien",
    "cross": "Cross",
    "fang": "Fang",
    "darby": "Darby",
    "durand": "Durand",
    "condolios": "Condolios",
    "wilson": "Wilson",
    "thomas": "Thomas",
    "four_component": "four-component",
}


def method_words(name: str) -> str:
    """A registry method name (or a method label with an override in brackets) in words.

    >>> method_words("api13d_2010_hb")
    'API RP 13D (2010) Herschel-Bulkley'
    >>> method_words("api13d_1995_power_law (constants=as_printed)")
    'API RP 13D (1995) power law (constants as printed)'
    >>> method_words("larsen_1997_equilibrium_bed")
    'Larsen (1997) equilibrium bed'
    """
    import re  # lazy: only the faces' naming needs it

    def words(token: str) -> str:
        parts, out = token.split("_"), []
        i = 0
        while i < len(parts):
            two = "_".join(parts[i : i + 2])
            if i + 1 < len(parts) and two in METHOD_WORDS:
                out.append(METHOD_WORDS[two])
                i += 2
                continue
            p = parts[i]
            out.append(f"({p})" if re.fullmatch(r"(19|20)\d\d", p) else METHOD_WORDS.get(p, p))
            i += 1
        return " ".join(out)

    text = re.sub(r"[A-Za-z0-9]+(?:_[A-Za-z0-9]+)+|\b[a-z0-9]+\b", lambda m: words(m[0]), name)
    return text.replace("=", " ")


#: Rheology parameters and field properties by their calc key (calc.rheology.compare).
PARAMETER_WORDS = {
    "n": "flow behaviour index n",
    "K": "consistency index K",
    "tau_y": "yield stress τy",
    "gel_10s": "10-second gel",
    "gel_10min": "10-minute gel",
    "gel_30min": "30-minute gel",
}


def parameter_words(key: str) -> str:
    """A calc parameter key in words (PV, YP, LSYP stay as the trade writes them).

    >>> parameter_words("tau_y"), parameter_words("PV")
    ('yield stress τy', 'PV')
    """
    return PARAMETER_WORDS.get(key, key.replace("_", " "))


def keys_in_words(sentence: str) -> str:
    """A sentence with every method name in it (a token with an underscore) in words; math
    symbols with one-letter bases (V_crit, Q_crit, p_back) stay.

    >>> keys_in_words("Burkhardt (1961) steady surge/swab, friction api13d_2010_hb")
    'Burkhardt (1961) steady surge/swab, friction API RP 13D (2010) Herschel-Bulkley'
    """
    import re  # lazy: only the faces' naming needs it

    return re.sub(r"\b[A-Za-z0-9]{2,}(?:_[A-Za-z0-9]+)+\b", lambda m: method_words(m[0]), sentence)
