"""Read a boreflow case: a TOML case file or the input workbook (.xlsx), the whole case.

The parser is declarative: each table has a *schema* (key → :class:`~addin.case_schema.Field`,
all in :mod:`addin.case_schema`, which the input workbook shares) and :func:`parse_table` walks
any table against its schema.  ``[case]``, ``[[check]]`` and ``[[slurry]]`` become
:class:`CheckInput`/:class:`SlurryInput` with their readings; every other section is parsed
into :attr:`Case.sections` (SI), and :class:`Case` builds the :mod:`calc` inputs from it
(:meth:`Case.well`, ``survey``, ``casings``, ``string``, ``bit``, ``surface_lines``,
``tool_drops``, ``window``, ``weak_points``, ``limits``, ``trip``).
The field-by-field documentation is ``workbooks/CASE-FORMAT.md``.

Values
------
* A number is in the case's unit system (``[case].units``: oilfield, metric or si) for the kind
  of quantity the key is (depth ft, density ppg, stress lbf/100 ft² … for oilfield).
* A string carries its own unit: ``"2.6 sg"``, ``"8.6 in"``, ``"12.43 bbl/min"``.
* Dial readings are keyed by rotor speed in rpm, ``{ 600 = 56, 300 = 37 }``, in dial degrees
  (no unit).  Gels are stresses (lbf/100 ft² for oilfield — by field convention the 3-rpm
  reading); a ``viscometer`` table may give instrument factors in SI
  (``shear_rate_per_rpm`` [1/s per rpm], ``stress_per_degree`` [Pa], ``spring_factor``,
  ``full_scale`` [degree]).

Every error is an :class:`~calc.errors.InputError` naming the file, the key path, the value and
what is allowed; an unknown key gets the nearest known key as a suggestion.
"""

from __future__ import annotations

import difflib
import hashlib
import json
import math
import re
import tomllib
from collections.abc import Mapping
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any

from addin.case_schema import (
    CASE_SCHEMA,
    CHECK_SCHEMA,
    HYDRAULICS_SECTIONS,
    READING_KEYS,
    SECTIONS,
    SLURRY_SCHEMA,
    Field,
)
from addin.guard import ImplausibleInput, case_verdict, collecting
from addin.guard import check as guard_check
from addin.workbook_input import read_blocks
from calc.bit import DEFAULT_DISCHARGE_COEFFICIENT, Bit
from calc.circulation import PressureWindow, WeakPoint
from calc.errors import InputError
from calc.flow.minor_losses import check_joint_losses
from calc.geometry import (
    DrillString,
    Hole,
    HoleSection,
    StringComponent,
    SurfaceLine,
    Survey,
    ToolPressureDrop,
    Well,
)
from calc.hydraulics_method import HydraulicsMethod, resolve_method
from calc.pumps import Pump
from calc.rheology import STANDARD_GEOMETRY, ViscometerGeometry, ViscometerReadings
from calc.rheology.viscometer import FIELD_STRESS, SHEAR_RATE_CORRECTIONS
from calc.units import UNIT_SYSTEMS, to_si, unit_for

__all__ = [
    "Case",
    "CheckInput",
    "SlurryInput",
    "input_hash",
    "load_case",
    "parse_case",
    "parse_quantity",
    "parse_table",
]

_NUMBER_UNIT = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")


def _where(source: str, path: str) -> str:
    return f"{source}: {path}" if path else source


def _unknown(source, path, key, known):
    near = difflib.get_close_matches(str(key), list(known), n=1)
    hint = f" (did you mean '{near[0]}'?)" if near else ""
    raise InputError(
        _where(source, path), key, "one of " + ", ".join(known) + hint, problem="unknown key"
    )


def parse_quantity(value, kind: str, system: str, where: str = "value", guard: str = "") -> float:
    """A case value as SI: a number in ``system``'s unit for ``kind``, or ``"<number> <unit>"``.

    This is the one place a typed quantity becomes SI: with ``guard`` (a quantity of
    :data:`calc.plausibility.RANGES`) the value is checked against its possible and usual
    ranges there (:func:`addin.guard.check`), in the unit the user gave.

    >>> round(parse_quantity("2.6 sg", "density", "oilfield"), 6)
    2600.0
    >>> round(parse_quantity(11.0, "density", "oilfield"), 4)
    1318.0907
    """
    if isinstance(value, bool) or value is None:
        raise InputError(where, value, f"a number or '<number> <unit>' ({kind})")
    if isinstance(value, (int, float)):
        return _guarded(float(value), unit_for(kind, system), kind, where, guard, True)
    if isinstance(value, str):
        m = _NUMBER_UNIT.match(value)
        if not m:
            raise InputError(
                where, value, f"a number or '<number> <unit>' ({kind.replace('_', ' ')})"
            )
        number, unit = float(m.group(1)), m.group(2)
        if not unit:
            return _guarded(number, unit_for(kind, system), kind, where, guard, True)
        try:
            si = to_si(number, unit, kind, where)
        except InputError as exc:
            raise InputError(where, value, exc.allowed, exc.problem) from exc
        return _guarded(number, unit, kind, where, guard, False, si)
    raise InputError(where, value, f"a number or '<number> <unit>' ({kind})")


def _guarded(number, unit, kind, where, guard, from_system, si=None) -> float:
    if not math.isfinite(number):
        raise InputError(where, number, f"a finite number ({kind.replace('_', ' ')})")
    if si is None:
        si = to_si(number, unit, kind, where)
    guard_check(si, guard, where, number, unit, from_system)
    return si


def _plain_number(value, where, guard: str = ""):
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise InputError(where, value, "a number")
    x = float(value)
    if not math.isfinite(x):
        raise InputError(where, x, "a finite number")
    guard_check(x, guard, where, x)
    return x


def _dial(value, where) -> dict[float, float]:
    if not isinstance(value, Mapping):
        raise InputError(where, value, "readings keyed by rpm, e.g. { 600 = 56, 300 = 37 }")
    out: dict[float, float] = {}
    keys: dict[float, str] = {}
    for key, reading in value.items():
        try:
            rpm = float(key)
        except ValueError as exc:
            raise InputError(f"{where}.{key}", key, "a rotor speed in rpm, e.g. 600") from exc
        if rpm in keys:
            raise InputError(
                f"{where}.{key}",
                key,
                f"each rotor speed once (also given as {keys[rpm]!r})",
                problem="duplicate speed",
            )
        keys[rpm] = str(key)
        _plain_number(rpm, f"{where}.{key} (rotor speed)", "dial_speed")
        out[rpm] = _plain_number(reading, f"{where}.{key}", "dial_reading")
    return out


def parse_table(raw, schema: Mapping[str, Field], system: str, source: str, path: str) -> dict:
    """Parse one table against ``schema``; values in SI (see :class:`Field`)."""
    if not isinstance(raw, Mapping):
        raise InputError(_where(source, path), raw, "a table of keys and values")
    out: dict[str, Any] = {}
    for key, val in raw.items():
        if key not in schema:
            _unknown(source, f"{path}.{key}" if path else key, key, schema)
        out[key] = _value(val, schema[key], system, source, f"{path}.{key}" if path else key)
    for key, fld in schema.items():
        if fld.required and key not in raw:
            raise InputError(
                _where(source, f"{path}.{key}" if path else key),
                None,
                f"a value ({fld.kind})",
                problem="missing",
            )
    return out


def _value(val, fld: Field, system, source, path):
    where = _where(source, path)
    kind = fld.kind
    if kind == "text":
        if not isinstance(val, str):
            raise InputError(where, val, "text")
        if fld.required and not val.strip():
            raise InputError(where, val, "a non-empty text", problem="empty")
        return val
    if kind == "bool":
        if not isinstance(val, bool):
            raise InputError(where, val, "true or false")
        return val
    if kind == "number":
        return _plain_number(val, where, fld.guard)
    if kind == "dial":
        return _dial(val, where)
    if kind == "table":
        return parse_table(val, fld.sub, system, source, path)
    if kind == "free":
        if not isinstance(val, Mapping):
            raise InputError(where, val, "a table of numbers")
        return {k: _plain_number(v, f"{where}.{k}") for k, v in val.items()}
    if kind == "stations":
        if not isinstance(val, list) or not val:
            raise InputError(where, val, "a list of [md, inclination, azimuth] rows")
        rows = []
        for i, row in enumerate(val):
            w = f"{where}[{i}]"
            if not (isinstance(row, list) and len(row) == 3):
                raise InputError(w, row, "[md, inclination, azimuth]")
            rows.append(
                (
                    parse_quantity(row[0], "depth", system, w + "[0]", "depth"),
                    _plain_number(row[1], w + "[1]", "inclination"),
                    _plain_number(row[2], w + "[2]", "azimuth"),
                )
            )
        return rows
    if kind == "length_or_fill":
        if val == "fill":
            return "fill"
        return parse_quantity(val, "length", system, where, fld.guard)
    if kind in ("range", "list"):
        if not isinstance(val, list) or (kind == "range" and len(val) != 2):
            raise InputError(where, val, "[low, high]" if kind == "range" else "a list")
        items = [
            _value(v, Field(fld.of, guard=fld.guard), system, source, f"{path}[{i}]")
            for i, v in enumerate(val)
        ]
        if kind == "range" and items[0] > items[1]:
            raise InputError(where, val, "[low, high] with low <= high")
        return items
    return parse_quantity(val, kind, system, where, fld.guard)


# ------------------------------------------------------------------ schemas


class CaseInputError(InputError):
    """An input error found while building a case's calc inputs: it keeps the case's unit
    system, so the faces can say the value and the limits in the units the case uses
    (:func:`addin.text.error`)."""

    def __init__(self, unit_system: str, *args, **kwargs):
        super().__init__(*args, **kwargs)
        self.unit_system = unit_system

    @classmethod
    def of(cls, unit_system: str, exc: InputError, name: str | None = None) -> CaseInputError:
        """``exc`` (a calc :class:`~calc.errors.InputError`) in ``unit_system``, its input
        renamed to ``name`` (the file and key) where given; raise it ``from exc``."""
        return cls(
            unit_system,
            exc.name if name is None else name,
            exc.value,
            exc.allowed,
            exc.problem,
            kind=exc.kind,
            values=exc.values,
        )


# ------------------------------------------------------------------ results
@dataclass(frozen=True, eq=False)
class CheckInput:
    """One ``[[check]]``: its readings and every parsed value (SI) by key."""

    label: str
    readings: ViscometerReadings
    values: Mapping[str, Any]
    #: the same sample read at further cup temperatures (``reading_2`` …; calc/METHODS.md §21)
    readings_at: tuple[ViscometerReadings, ...] = ()
    #: gauge pressure of each reading [Pa] (cup, then readings_at), None where not given
    pressures: tuple[float | None, ...] = ()

    @property
    def all_readings(self) -> tuple[ViscometerReadings, ...]:
        """The check's readings at every temperature it was read at, cup reading first."""
        return (self.readings, *self.readings_at)


@dataclass(frozen=True, eq=False)
class SlurryInput:
    """One ``[[slurry]]`` (cement slurry or spacer): readings in cement mode and values (SI)."""

    name: str
    readings: ViscometerReadings
    values: Mapping[str, Any]


@dataclass(frozen=True, eq=False)
class Case:
    """A parsed case file.

    ``unit_system`` is the name of the case's unit system (``[case].units``: ``"oilfield"``,
    ``"metric"`` or ``"si"``): its plain numbers were read in it and its messages are worded in
    it; the parsed values themselves are SI.  ``sections`` holds every other parsed section (SI
    values by key; arrays of tables as tuples), ``doc`` the document as read (numbers as floats:
    a TOML file and the workbook carrying the same content give the same ``doc`` and the same
    ``hash``), ``where`` the workbook cell of each key (empty for TOML).  :meth:`well` and the
    properties below build the :mod:`calc` inputs.
    """

    source: str
    unit_system: str
    header: Mapping[str, Any]
    checks: tuple[CheckInput, ...]
    slurries: tuple[SlurryInput, ...]
    raw: Mapping[str, Any] = field(default_factory=dict)
    sections: Mapping[str, Any] = field(default_factory=dict)
    doc: Mapping[str, Any] = field(default_factory=dict)
    where: Mapping[str, str] = field(default_factory=dict)
    hash: str = ""
    #: values outside their usual range (:class:`addin.guard.Finding`), and whether the run
    #: went on anyway (``--allow-unusual``)
    unusual: tuple = ()
    unusual_allowed: bool = False

    # -------------------------------------------------------------- calc inputs
    @property
    def meta(self) -> Mapping[str, Any]:
        return self.header

    def hydraulics_method(self, method=None, constants=None) -> HydraulicsMethod:
        """The case's hydraulics method: ``[case].method`` (default ``api13d_2010_hb``) with
        ``[case].constants`` (default ``"exact"``); ``method``/``constants`` given here (the
        command line's ``--method``/``--constants``) override the keys.  An unknown name, or
        ``"as_printed"`` for a method without printed constants, is an InputError naming the
        file and key (calc/METHODS.md §7.9; workbooks/CASE-FORMAT.md)."""
        name = method or self.header.get("method") or None
        const = constants or self.header.get("constants") or "exact"
        from_file = (method is None and "method" in self.header) or (
            constants is None and "constants" in self.header
        )
        try:
            return resolve_method(name, constants=const)
        except InputError as exc:
            if not from_file:
                raise
            key = "case.constants" if exc.name == "constants" else "case.method"
            return self._build(key, resolve_method, name, constants=const)

    def loss_options(self, index: int = -1, joint_losses=None) -> dict:
        """The :func:`calc.circulation.circulate` keywords ``rpm`` and ``joint_losses``.

        ``rpm``: check ``index``'s ``rpm`` if ``[case].rotation = true`` (default false: 0,
        because the rotation model can only lower the annular loss, see calc/METHODS.md §22);
        ``joint_losses``: the argument (the command line's
        ``--joint-losses``), else ``[case].joint_losses``, else ``"bore_friction"``.  An unknown
        option is an InputError naming the file and key (calc/METHODS.md §22).
        """
        rotation = bool(self.header.get("rotation", False))
        rpm = self.checks[index].values.get("rpm") if (rotation and self.checks) else None
        option = joint_losses or self.header.get("joint_losses") or "bore_friction"
        if joint_losses is None and "joint_losses" in self.header:
            option = self._build("case.joint_losses", check_joint_losses, str(option).strip())
        else:
            option = check_joint_losses(option)
        return dict(rpm=float(rpm or 0.0), joint_losses=option)

    def with_shear_rate_correction(self, correction: str | None) -> Case:
        """The case with every viscometer reading converted with ``correction`` (the command
        line's ``--shear-rate-correction``, which overrides ``[case].shear_rate_correction``):
        ``newtonian`` or ``krieger`` (calc/METHODS.md §21.2); None → the case unchanged."""
        if correction is None:
            return self
        c = str(correction).strip().lower()
        if c not in SHEAR_RATE_CORRECTIONS:
            raise InputError(
                "--shear-rate-correction", correction, " or ".join(SHEAR_RATE_CORRECTIONS)
            )

        def conv(r: ViscometerReadings) -> ViscometerReadings:
            if r.shear_rate_correction == c:
                return r
            dial = None if r.ramp_up is not None else r.dial
            return replace(r, dial=dial, shear_rate_correction=c, notes=())

        checks = tuple(
            replace(
                k,
                readings=conv(k.readings),
                readings_at=tuple(conv(x) for x in k.readings_at),
            )
            for k in self.checks
        )
        slurries = tuple(replace(x, readings=conv(x.readings)) for x in self.slurries)
        return replace(self, checks=checks, slurries=slurries)

    def _need(self, name: str):
        if name not in self.sections:
            brackets = f"[[{name}]]" if SECTIONS[name][0] else f"[{name}]"
            raise InputError(
                _where(self.source, name), None, f"a {brackets} section", problem="missing"
            )
        return self.sections[name]

    def _build(self, path: str, func, *args, **kwargs):
        try:
            return func(*args, **kwargs)
        except InputError as exc:
            if exc.name.startswith(self.source):
                raise
            raise CaseInputError.of(
                self.unit_system, exc, f"{_where(self.source, path)}: {exc.name}"
            ) from exc

    @property
    def limits(self) -> Mapping[str, float]:
        """Margins [kg/m³] and the surface rating [Pa] (margins default 0, rating None)."""
        lim = dict(self.sections.get("limits", {}))
        for k in ("fracture_margin", "pore_margin", "trip_fracture_margin", "trip_pore_margin"):
            lim.setdefault(k, 0.0)
        lim.setdefault("surface_rating", None)
        return lim

    @property
    def survey(self):
        st = self._need("survey")["stations"]
        return self._build(
            "survey",
            Survey,
            [r[0] for r in st],
            [r[1] for r in st],
            [r[2] for r in st],
        )

    @property
    def casings(self) -> tuple:
        return tuple(
            self._build(
                f"casing[{i}]",
                HoleSection,
                c["name"],
                c.get("top", 0.0),
                c["shoe"],
                c["id"],
                "casing",
                drift=c.get("drift"),
                shoe_test=c.get("shoe_test"),
                od=c.get("od"),
            )
            for i, c in enumerate(self.sections.get("casing", ()), start=1)
        )

    @property
    def open_hole(self) -> Mapping[str, Any]:
        return self._need("open_hole")

    def hole(self, depth: float):
        oh = self.open_hole
        return self._build(
            "open_hole",
            Hole.from_casing,
            self.casings,
            depth=depth,
            bit_size=oh["bit_size"],
            diameter=oh.get("diameter"),
            washout_factor=oh.get("washout_factor"),
        )

    @property
    def string(self):
        comps = []
        for i, c in enumerate(self._need("string"), start=1):
            comps.append(
                self._build(
                    f"string[{i}]",
                    StringComponent,
                    c["name"],
                    c["od"],
                    c["id"],
                    c["length"],
                    tool_joint_od=c.get("tool_joint_od"),
                    tool_joint_id=c.get("tool_joint_id"),
                    joint_length=c.get("joint_length"),
                    tool_joint_length=c.get("tool_joint_length"),
                    float_valve=bool(c.get("float_valve", False)),
                    standoff=c.get("standoff"),
                )
            )
        return self._build("string", DrillString, tuple(comps))

    @property
    def bit(self):
        b = self._need("bit")
        nozzles = b.get("nozzles")
        return self._build(
            "bit",
            Bit,
            b["size"],
            nozzles=tuple(int(n) if float(n).is_integer() else n for n in nozzles)
            if nozzles
            else None,
            tfa=b.get("tfa"),
            discharge_coefficient=b.get("discharge_coefficient", DEFAULT_DISCHARGE_COEFFICIENT),
            ports=int(b["ports"]) if "ports" in b else None,
            name=b.get("name", "bit"),
        )

    @property
    def surface_lines(self) -> tuple:
        return tuple(
            self._build(f"surface_line[{i}]", SurfaceLine, s["name"], s["length"], s["id"])
            for i, s in enumerate(self.sections.get("surface_line", ()), start=1)
        )

    @property
    def tool_drops(self) -> tuple:
        t = self.sections.get("tool_pressure")
        if not t:
            return ()
        win = tuple(t["flow_window"]) if "flow_window" in t else None
        return (
            self._build(
                "tool_pressure",
                ToolPressureDrop,
                t["reference_drop"],
                t["reference_density"],
                t["reference_rate"],
                flow_window=win,
                name=t.get("name", "downhole tools"),
                components=tuple(t.get("covers", ())),
            ),
        )

    @property
    def window(self):
        w = self.sections.get("pressure_window")
        if not w:
            return None
        for key in ("tvd", "pore", "fracture"):  # cli: an empty list is refused, not a crash
            if len(w[key]) == 0:
                raise InputError(
                    _where(self.source, f"pressure_window.{key}"),
                    "[]",
                    "at least one station",
                    problem="empty",
                )
        return self._build("pressure_window", PressureWindow, w["tvd"], w["pore"], w["fracture"])

    @property
    def weak_points(self) -> tuple:
        return tuple(
            self._build(
                f"weak_point[{i}]", WeakPoint, w["name"], w["md"], w["fracture"], w.get("pore")
            )
            for i, w in enumerate(self.sections.get("weak_point", ()), start=1)
        )

    @property
    def pumps(self) -> tuple:
        """The ``[[pump]]`` sections as :class:`calc.pumps.Pump` (empty unless every pump gives
        its ``liner`` and ``stroke``; kind default triplex, efficiency default 1)."""
        raw = self.sections.get("pump", ())
        if not raw or any("liner" not in p or "stroke" not in p for p in raw):
            return ()
        return tuple(
            self._build(
                f"pump[{i}]",
                Pump,
                p["name"],
                p["liner"],
                p["stroke"],
                p.get("efficiency", 1.0),
                kind=str(p.get("kind", "triplex")).strip().lower(),
                rod=p.get("rod", 0.0),
                rated_power=p.get("rated_power"),
                liner_rating=p.get("liner_rating"),
            )
            for i, p in enumerate(raw, start=1)
        )

    def pump_spm(self, index: int = -1) -> tuple[float, ...] | None:
        """A check's ``pump_spm`` (one per pump, in the ``[[pump]]`` order), None if not given;
        a count other than the pumps' is an InputError naming the key."""
        spm = self.checks[index].values.get("pump_spm")
        if spm is None:
            return None
        n = index + 1 if index >= 0 else len(self.checks) + index + 1
        pumps = self.pumps
        if len(spm) != len(pumps) or any(x is None for x in spm):
            raise InputError(
                _where(self.source, f"check[{n}].pump_spm"),
                list(spm),
                f"one speed per [[pump]] with liner and stroke ({len(pumps)})",
            )
        return tuple(float(x) for x in spm)

    def running_pumps(self, index: int = -1) -> tuple:
        """The pumps running at a check: those with spm > 0 in its ``pump_spm``, every pump
        when it gives none (their liner rating and rated power limit the operating window)."""
        spm = self.pump_spm(index)
        if spm is None:
            return self.pumps
        return tuple(p for p, n in zip(self.pumps, spm, strict=True) if n > 0)

    @property
    def trip(self) -> Mapping[str, Any] | None:
        t = self.sections.get("trip")
        if t and t.get("string_end", "closed") not in ("closed", "open"):
            raise InputError(
                _where(self.source, "trip.string_end"), t["string_end"], "closed or open"
            )
        return t

    def check_value(self, index: int, key: str):
        """A check's value by key (SI), raising a located error if it is missing."""
        chk = self.checks[index]
        if key not in chk.values:
            n = index + 1 if index >= 0 else len(self.checks) + index + 1
            raise InputError(
                _where(self.source, f"check[{n}].{key}"),
                None,
                f"a value for {key}",
                problem="missing",
            )
        return chk.values[key]

    def well(self, check_index: int = -1):
        """The :class:`calc.geometry.Well` at a check's bit depth (default the latest check)."""
        for name in HYDRAULICS_SECTIONS:
            self._need(name)
        if not self.checks:
            raise InputError(
                _where(self.source, "check"), None, "at least one [[check]]", problem="missing"
            )
        depth = self.check_value(check_index, "bit_depth")
        return self._build(
            "well",
            Well,
            self.survey,
            self.hole(depth),
            self.string,
            self.bit,
            self.surface_lines,
            self.tool_drops,
            bit_depth=depth,
        )


def _geometry(values, where) -> ViscometerGeometry:
    v = values.get("viscometer")
    if not v:
        return STANDARD_GEOMETRY
    try:
        return ViscometerGeometry(
            name=v.get("name", "user instrument"),
            shear_rate_per_rpm=v.get("shear_rate_per_rpm", STANDARD_GEOMETRY.shear_rate_per_rpm),
            stress_per_degree=v.get("stress_per_degree", STANDARD_GEOMETRY.stress_per_degree),
            spring_factor=v.get("spring_factor", 1.0),
            full_scale=v.get("full_scale", STANDARD_GEOMETRY.full_scale),
            source="case file",
        )
    except InputError as exc:
        raise InputError(
            f"{where}.viscometer: {exc.name}", exc.value, exc.allowed, exc.problem
        ) from exc


def _readings_at(values, where, label, correction):
    """The check's further readings (``reading_2`` …) and the pressures of all its readings."""
    more, press = [], [values.get("cup_pressure")]
    for key in READING_KEYS:
        if key not in values:
            continue
        sub = values[key]
        if values.get("cup_temperature") is None:
            raise InputError(
                f"{where}.{key}",
                "a reading at another temperature",
                "a cup_temperature on the check (the temperature of its own dial readings)",
                problem="missing cup_temperature",
            )
        rd = {"dial": sub["dial"], "viscometer": values.get("viscometer")}
        more.append(
            _readings(
                rd, f"{where}.{key}", "mud", f"{label} ({key})", sub["temperature"], correction
            )
        )
        press.append(sub.get("pressure"))
    return tuple(more), tuple(press)


def _readings(
    values, where, mode, label, temperature, correction="newtonian"
) -> ViscometerReadings:
    geometry = _geometry(values, where)
    gels = {
        k: v / (FIELD_STRESS * geometry.spring_factor) for k, v in values.get("gels", {}).items()
    }
    try:
        if "dial_up" in values or "dial_down" in values:
            if "dial" in values:
                raise InputError(
                    f"{where}.dial", "given with dial_up/dial_down", "either dial or both ramps"
                )
            up, down = values.get("dial_up"), values.get("dial_down")
            if up is None or down is None or set(up) != set(down):
                raise InputError(f"{where}.dial_up/dial_down", "ramps", "both ramps, same speeds")
            speeds = sorted(up)
            return ViscometerReadings.from_ramps(
                speeds,
                [up[s] for s in speeds],
                [down[s] for s in speeds],
                gels=gels,
                geometry=geometry,
                mode=mode,
                label=label,
                temperature=temperature,
                shear_rate_correction=correction,
            )
        if "dial" not in values:
            raise InputError(f"{where}.dial", None, "readings keyed by rpm", problem="missing")
        dial = values["dial"]
        return ViscometerReadings.from_mapping(
            dial,
            gels=gels,
            geometry=geometry,
            mode=mode,
            label=label,
            temperature=temperature,
            shear_rate_correction=correction,
        )
    except InputError as exc:
        if exc.name.startswith(where):
            raise
        raise InputError(f"{where}: {exc.name}", exc.value, exc.allowed, exc.problem) from exc


def parse_case(data: Mapping, source: str = "<case>") -> Case:
    """Parse a case already read from TOML (a mapping).

    Every value is checked against its plausibility ranges (:mod:`addin.guard`): impossible
    values raise (naming the unit system when several numbers fit another one), unusual ones
    are kept in :attr:`Case.unusual`.
    """
    with collecting() as found:
        try:
            case = _parse_case(data, source)
        except InputError:
            case_verdict(found, _declared_system(data), source)  # an impossible value first
            raise
        unusual = case_verdict(found, case.unit_system, source)
    return replace(case, unusual=tuple(unusual)) if unusual else case


def _declared_system(data) -> str:
    try:
        units = str(data.get("case", {}).get("units", "oilfield")).strip().lower()
    except AttributeError:
        return "oilfield"
    return units if units in UNIT_SYSTEMS else "oilfield"


def _parse_case(data: Mapping, source: str) -> Case:
    if not isinstance(data, Mapping):
        raise InputError(source, data, "a TOML document")
    for key in data:
        if key not in SECTIONS:
            _unknown(source, key, key, SECTIONS)
    header = parse_table(data.get("case", {}), CASE_SCHEMA, "si", source, "case")
    unit_system = header.get("units", "oilfield").strip().lower()
    if unit_system not in UNIT_SYSTEMS:
        _unknown(source, "case.units", header.get("units"), UNIT_SYSTEMS)
    for key in ("method", "constants", "shear_rate_correction"):
        if key in header:
            header[key] = str(header[key]).strip()
    correction = header.get("shear_rate_correction", "newtonian").lower()
    if correction not in SHEAR_RATE_CORRECTIONS:
        _unknown(source, "case.shear_rate_correction", correction, SHEAR_RATE_CORRECTIONS)
    checks, slurries = [], []
    for name, schema, mode in (("check", CHECK_SCHEMA, "mud"), ("slurry", SLURRY_SCHEMA, "cement")):
        items = data.get(name, [])
        if not isinstance(items, list):
            raise InputError(_where(source, name), items, f"an array of tables [[{name}]]")
        for i, item in enumerate(items, start=1):
            path = f"{name}[{i}]"
            values = parse_table(item, schema, unit_system, source, path)
            label = values.get("label") or values.get("name")
            temp = values.get("cup_temperature", values.get("temperature"))
            where = _where(source, f"{path} ({label})")
            readings = _readings(values, where, mode, label, temp, correction)
            if name == "check":
                more, press = _readings_at(values, where, label, correction)
                checks.append(CheckInput(label, readings, values, more, press))
            else:
                slurries.append(SlurryInput(label, readings, values))
    # the sections beyond [case]/[[check]]/[[slurry]], verbatim (parsed ones are in `sections`)
    raw = {k: v for k, v in data.items() if k not in ("case", "check", "slurry")}
    sections: dict[str, Any] = {}
    for name, (is_list, schema) in SECTIONS.items():
        if name in ("case", "check", "slurry") or schema is None or name not in data:
            continue
        item = data[name]
        if is_list:
            if not isinstance(item, list):
                raise InputError(_where(source, name), item, f"an array of tables [[{name}]]")
            sections[name] = tuple(
                parse_table(x, schema, unit_system, source, f"{name}[{i}]")
                for i, x in enumerate(item, start=1)
            )
        else:
            sections[name] = parse_table(item, schema, unit_system, source, name)
    case = Case(
        source,
        unit_system,
        header,
        tuple(checks),
        tuple(slurries),
        raw,
        sections=sections,
        doc=_canonical(data),
        hash=input_hash(data),
    )
    if "method" in header or "constants" in header:
        case.hydraulics_method()  # an unknown method or constant set fails at load, named
    if "joint_losses" in header:
        case.loss_options()  # an unknown tool-joint option fails at load, named
    return case


def _canonical(x):
    if isinstance(x, Mapping):
        return {str(k): _canonical(v) for k, v in x.items()}
    if isinstance(x, list | tuple):
        return [_canonical(v) for v in x]
    if isinstance(x, int | float) and not isinstance(x, bool):
        return float(x)
    return x


def input_hash(data: Mapping) -> str:
    """SHA-256 of the case document as canonical JSON (sorted keys, numbers as floats).

    The same content gives the same hash whether it came from TOML or from the workbook.
    """
    text = json.dumps(_canonical(data), sort_keys=True, separators=(",", ":"), ensure_ascii=False)
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


def _locate(exc: InputError, source: str, where: Mapping[str, str]) -> InputError:
    """Re-word an error about ``source: path`` with the workbook cell of that path."""
    name = exc.name
    prefix = f"{source}: "
    if not name.startswith(prefix):
        return exc
    path = name[len(prefix) :].split(" ", 1)[0].split(":", 1)[0]
    probe = path
    while probe:
        if probe in where:
            cell = where[probe].split(": ", 1)[-1]
            cls = ImplausibleInput if isinstance(exc, ImplausibleInput) else InputError
            new = cls(
                f"{source}: {cell} ({name[len(prefix) :]})", exc.value, exc.allowed, exc.problem
            )
            return new
        probe = probe.rsplit(".", 1)[0] if "." in probe else ""
    return exc


def load_case(path) -> Case:
    """Read and parse a case: a TOML case file, or an input workbook (.xlsx) in the block layout.

    Errors are :class:`InputError` naming the file and key (for a workbook also the sheet and
    cell), the value and what is allowed.
    """
    p = Path(path)
    if p.suffix.lower() in (".xlsx", ".xlsm"):
        doc, where = read_blocks(p)
        try:
            case = parse_case(doc, p.name)
        except InputError as exc:
            raise _locate(exc, p.name, where) from exc
        return Case(**{**{f: getattr(case, f) for f in case.__dataclass_fields__}, "where": where})
    if p.suffix.lower() not in (".toml", ""):
        raise InputError(
            f"case file {p.name}",
            p.suffix,
            ".toml case file or .xlsx workbook",
            problem="unknown file type",
        )
    text = _read_case_text(p)  # cli: bounded read, encoding and nesting checks
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError(
            f"case file {p.name}", str(exc), "valid TOML", problem="syntax error"
        ) from exc
    except RecursionError as exc:  # arrays nested thousands deep
        raise InputError(
            f"case file {p.name}", "nesting too deep", "valid TOML", problem="syntax error"
        ) from exc
    _check_text(data, p.name)
    return parse_case(data, p.name)


# ---------------------------------------------------------------- cli: reading the case text
#: Control characters a case's text may not hold (tab, line feed and carriage return may): a
#: workbook cell cannot store them (XML 1.0 §2.2) and a terminal would act on them.
_CONTROL_CHARS = re.compile(r"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f]")


def _check_text(node, source: str, path: str = "") -> None:
    """Refuse control characters in any text of a parsed case, naming the key and position,
    and the non-finite numbers TOML allows (``nan``, ``inf``): no case value may be one."""
    if isinstance(node, float) and not math.isfinite(node):
        raise InputError(_where(source, path), str(node), "a finite number", problem="not a number")
    if isinstance(node, str):
        m = _CONTROL_CHARS.search(node)
        if m:
            raise InputError(
                _where(source, path),
                f"character U+{ord(m.group()):04X} at position {m.start() + 1}",
                "printable text (no control characters)",
                problem="control character",
            )
    elif isinstance(node, dict):
        for k, v in node.items():
            _check_text(k, source, path)
            _check_text(v, source, f"{path}.{k}" if path else str(k))
    elif isinstance(node, list):
        for i, v in enumerate(node):
            _check_text(v, source, f"{path}[{i}]")


#: The largest case file read (a case is a few kB; 5 MiB leaves room for long surveys).
CASE_FILE_CAP = 5 * 2**20


def _read_case_text(p: Path) -> str:
    """The text of case file ``p``: at most :data:`CASE_FILE_CAP` bytes read from any kind of
    file (a device or pipe such as ``/dev/zero`` has no size to check first), UTF-8 with an
    optional byte-order mark (which is dropped); every failure an :class:`InputError` naming
    the file."""
    try:
        with open(p, "rb") as fh:
            raw = fh.read(CASE_FILE_CAP + 1)
    except OSError as exc:
        raise InputError(
            "case file", str(p), "a readable TOML file", problem=exc.strerror or "cannot be read"
        ) from exc
    if len(raw) > CASE_FILE_CAP:
        raise InputError(
            f"case file {p.name}", "more than 5 MiB", "at most 5 MiB", problem="too large"
        )
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        line = raw[: exc.start].count(b"\n") + 1
        raise InputError(
            f"case file {p.name}",
            f"byte 0x{raw[exc.start]:02x} at line {line}",
            "UTF-8 text (save the file as UTF-8)",
            problem="not UTF-8",
        ) from exc
