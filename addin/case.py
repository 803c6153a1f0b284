"""Read a boreflow case file (TOML): the ``[case]`` header, mud ``[[check]]`` and ``[[slurry]]``.

The parser is declarative: each table has a *schema* (key → :class:`Field`) and
:func:`parse_table` walks any table against its schema, so further sections are added by
writing their schema (see ``SECTIONS``).  Sections of the file this module does not parse yet
are kept verbatim in :attr:`Case.raw`.

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
import re
import tomllib
from collections.abc import Mapping
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from calc.errors import InputError
from calc.rheology import STANDARD_GEOMETRY, ViscometerGeometry, ViscometerReadings
from calc.rheology.viscometer import FIELD_STRESS
from calc.units import UNIT_SYSTEMS, to_si, unit_for

__all__ = [
    "CHECK_SCHEMA",
    "SECTIONS",
    "SLURRY_SCHEMA",
    "Case",
    "CheckInput",
    "Field",
    "SlurryInput",
    "load_case",
    "parse_case",
    "parse_quantity",
    "parse_table",
]

_NUMBER_UNIT = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")


@dataclass(frozen=True)
class Field:
    """One key of a schema.

    kind      a quantity kind of :data:`calc.units.KINDS` (converted to SI), or one of
              ``"text"``, ``"number"`` (plain, no unit), ``"bool"``, ``"dial"`` (rpm → degree
              mapping), ``"table"`` (nested, with ``sub``), ``"free"`` (table of plain numbers
              with any keys), ``"range"`` (two values of ``of``), ``"list"`` (a list of ``of``)
    required  the key must be present
    sub       schema of a nested table
    of        kind of the items of a range or list
    """

    kind: str
    required: bool = False
    sub: Mapping[str, Field] | None = None
    of: str | None = None


def _where(source: str, path: str) -> str:
    return f"{source}: {path}" if path else source


def _unknown(source, path, key, known):
    near = difflib.get_close_matches(str(key), list(known), n=1)
    hint = f" (did you mean '{near[0]}'?)" if near else ""
    raise InputError(
        _where(source, path), key, "one of " + ", ".join(known) + hint, problem="unknown key"
    )


def parse_quantity(value, kind: str, system: str, where: str = "value") -> float:
    """A case value as SI: a number in ``system``'s unit for ``kind``, or ``"<number> <unit>"``.

    >>> round(parse_quantity("2.6 sg", "density", "oilfield"), 6)
    2600.0
    >>> round(parse_quantity(11.0, "density", "oilfield"), 4)
    1318.0907
    """
    if isinstance(value, bool) or value is None:
        raise InputError(where, value, f"a number or '<number> <unit>' ({kind})")
    if isinstance(value, (int, float)):
        return to_si(float(value), unit_for(kind, system), kind, where)
    if isinstance(value, str):
        m = _NUMBER_UNIT.match(value)
        if not m:
            raise InputError(
                where, value, f"a number or '<number> <unit>' ({kind.replace('_', ' ')})"
            )
        number, unit = float(m.group(1)), m.group(2)
        if not unit:
            return to_si(number, unit_for(kind, system), kind, where)
        try:
            return to_si(number, unit, kind, where)
        except InputError as exc:
            raise InputError(where, value, exc.allowed, exc.problem) from exc
    raise InputError(where, value, f"a number or '<number> <unit>' ({kind})")


def _plain_number(value, where):
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise InputError(where, value, "a number")
    return float(value)


def _dial(value, where) -> dict[float, float]:
    if not isinstance(value, Mapping):
        raise InputError(where, value, "readings keyed by rpm, e.g. { 600 = 56, 300 = 37 }")
    out = {}
    for key, reading in value.items():
        try:
            rpm = float(key)
        except ValueError as exc:
            raise InputError(f"{where}.{key}", key, "a rotor speed in rpm, e.g. 600") from exc
        out[rpm] = _plain_number(reading, f"{where}.{key}")
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
        return val
    if kind == "bool":
        if not isinstance(val, bool):
            raise InputError(where, val, "true or false")
        return val
    if kind == "number":
        return _plain_number(val, where)
    if kind == "dial":
        return _dial(val, where)
    if kind == "table":
        return parse_table(val, fld.sub, system, source, path)
    if kind == "free":
        if not isinstance(val, Mapping):
            raise InputError(where, val, "a table of numbers")
        return {k: _plain_number(v, f"{where}.{k}") for k, v in val.items()}
    if kind in ("range", "list"):
        if not isinstance(val, list) or (kind == "range" and len(val) != 2):
            raise InputError(where, val, "[low, high]" if kind == "range" else "a list")
        items = [
            _value(v, Field(fld.of), system, source, f"{path}[{i}]") for i, v in enumerate(val)
        ]
        if kind == "range" and items[0] > items[1]:
            raise InputError(where, val, "[low, high] with low <= high")
        return items
    return parse_quantity(val, kind, system, where)


# ------------------------------------------------------------------ schemas
CASE_SCHEMA = {
    "schema": Field("text"),
    "title": Field("text"),
    "well": Field("text"),
    "operator": Field("text"),
    "rig": Field("text"),
    "location": Field("text"),
    "report_period": Field("text"),
    "units": Field("text"),
}

VISCOMETER_SCHEMA = {
    "name": Field("text"),
    "shear_rate_per_rpm": Field("number"),
    "stress_per_degree": Field("number"),
    "spring_factor": Field("number"),
    "full_scale": Field("number"),
}

_RHEOLOGY_KEYS = {
    "dial": Field("dial"),
    "dial_up": Field("dial"),
    "dial_down": Field("dial"),
    "gels": Field("table", sub={k: Field("stress") for k in ("10s", "10min", "30min")}),
    "viscometer": Field("table", sub=VISCOMETER_SCHEMA),
}

CHECK_SCHEMA: dict[str, Field] = {
    "label": Field("text", required=True),
    "date": Field("text"),
    "time": Field("text"),
    "sample": Field("text"),
    "fluid": Field("text"),
    "bit_depth": Field("depth"),
    "density": Field("density"),
    "cup_temperature": Field("temperature"),
    **_RHEOLOGY_KEYS,
    "program": Field(
        "table",
        sub={
            "density": Field("range", of="density"),
            "pv": Field("range", of="viscosity"),
            "yp": Field("range", of="stress"),
            "lsyp": Field("range", of="stress"),
        },
    ),
    "flow_rate": Field("flow_rate"),
    "rop": Field("rop"),
    "rpm": Field("number"),
    "measured_spp": Field("pressure"),
    "pwd": Field("table", sub={"ecd": Field("density"), "md": Field("depth")}),
    "cuttings": Field(
        "table",
        sub={
            "density": Field("density"),
            "size": Field("diameter"),
            "sphericity": Field("number"),
        },
    ),
    "properties": Field("free"),
    "remark": Field("text"),
}

SLURRY_SCHEMA: dict[str, Field] = {
    "name": Field("text", required=True),
    "density": Field("density"),
    "temperature": Field("temperature"),
    "volume": Field("volume"),
    **_RHEOLOGY_KEYS,
    "remark": Field("text"),
}

#: Top-level sections: name → (is an array of tables, schema or None if not parsed here yet).
SECTIONS: dict[str, tuple[bool, Mapping[str, Field] | None]] = {
    "case": (False, CASE_SCHEMA),
    "check": (True, CHECK_SCHEMA),
    "slurry": (True, SLURRY_SCHEMA),
    # parsed by the well/hydraulics parts of this module (kept raw until then)
    "limits": (False, None),
    "survey": (False, None),
    "casing": (True, None),
    "open_hole": (False, None),
    "pressure_window": (False, None),
    "weak_point": (True, None),
    "pump": (True, None),
    "surface_line": (True, None),
    "bit": (False, None),
    "string": (True, None),
    "tool_pressure": (False, None),
    "trip": (False, None),
}


# ------------------------------------------------------------------ results
@dataclass(frozen=True, eq=False)
class CheckInput:
    """One ``[[check]]``: its readings and every parsed value (SI) by key."""

    label: str
    readings: ViscometerReadings
    values: Mapping[str, Any]


@dataclass(frozen=True, eq=False)
class SlurryInput:
    """One ``[[slurry]]`` (cement slurry or spacer): readings in cement mode and values (SI)."""

    name: str
    readings: ViscometerReadings
    values: Mapping[str, Any]


@dataclass(frozen=True, eq=False)
class Case:
    """A parsed case file."""

    source: str
    units: str
    header: Mapping[str, Any]
    checks: tuple[CheckInput, ...]
    slurries: tuple[SlurryInput, ...]
    raw: Mapping[str, Any] = field(default_factory=dict)


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


def _readings(values, where, mode, label, temperature) -> ViscometerReadings:
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
            )
        if "dial" not in values:
            raise InputError(f"{where}.dial", None, "readings keyed by rpm", problem="missing")
        dial = values["dial"]
        return ViscometerReadings.from_mapping(
            dial, gels=gels, geometry=geometry, mode=mode, label=label, temperature=temperature
        )
    except InputError as exc:
        if exc.name.startswith(where):
            raise
        raise InputError(f"{where}: {exc.name}", exc.value, exc.allowed, exc.problem) from exc


def parse_case(data: Mapping, source: str = "<case>") -> Case:
    """Parse a case already read from TOML (a mapping)."""
    if not isinstance(data, Mapping):
        raise InputError(source, data, "a TOML document")
    for key in data:
        if key not in SECTIONS:
            _unknown(source, key, key, SECTIONS)
    header = parse_table(data.get("case", {}), CASE_SCHEMA, "si", source, "case")
    units = header.get("units", "oilfield").strip().lower()
    if units not in UNIT_SYSTEMS:
        _unknown(source, "case.units", header.get("units"), UNIT_SYSTEMS)
    checks, slurries = [], []
    for name, schema, mode in (("check", CHECK_SCHEMA, "mud"), ("slurry", SLURRY_SCHEMA, "cement")):
        items = data.get(name, [])
        if not isinstance(items, list):
            raise InputError(_where(source, name), items, f"an array of tables [[{name}]]")
        for i, item in enumerate(items, start=1):
            path = f"{name}[{i}]"
            values = parse_table(item, schema, units, source, path)
            label = values.get("label") or values.get("name")
            temp = values.get("cup_temperature", values.get("temperature"))
            where = _where(source, f"{path} ({label})")
            readings = _readings(values, where, mode, label, temp)
            if name == "check":
                checks.append(CheckInput(label, readings, values))
            else:
                slurries.append(SlurryInput(label, readings, values))
    raw = {k: v for k, v in data.items() if SECTIONS[k][1] is None}
    return Case(source, units, header, tuple(checks), tuple(slurries), raw)


def load_case(path) -> Case:
    """Read and parse a case file.  Missing files and TOML syntax errors raise InputError."""
    p = Path(path)
    try:
        text = p.read_text(encoding="utf-8")
    except OSError as exc:
        raise InputError(
            "case file", str(path), "a readable TOML file", problem=exc.strerror or "cannot be read"
        ) from exc
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError(
            f"case file {p.name}", str(exc), "valid TOML", problem="syntax error"
        ) from exc
    return parse_case(data, p.name)
