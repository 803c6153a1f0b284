"""The case-file schema: every section, key and quantity kind a case may hold.

One table serves both readers: :mod:`addin.case` parses a TOML case file against it, and the
input workbook (:mod:`addin.workbook_layout`) derives its blocks and rows from it, so a key is
declared once.  :data:`SECTIONS` maps each top-level section to its schema (key → :class:`Field`);
the field-by-field documentation is ``workbooks/CASE-FORMAT.md``.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

__all__ = [
    "CASE_SCHEMA",
    "CHECK_SCHEMA",
    "HYDRAULICS_SECTIONS",
    "READING_KEYS",
    "READING_SCHEMA",
    "SECTIONS",
    "SLURRY_LINE_SCHEMA",
    "SLURRY_SCHEMA",
    "STATION_COLUMNS",
    "TEMPERATURE_SCHEMA",
    "UNCERTAINTY_SCHEMA",
    "Field",
]


@dataclass(frozen=True)
class Field:
    """One key of a schema.

    kind      a quantity kind of :data:`calc.units.KINDS` (converted to SI), or one of
              ``"text"``, ``"number"`` (plain, no unit), ``"bool"``, ``"dial"`` (rpm → degree
              mapping), ``"table"`` (nested, with ``sub``), ``"free"`` (table of plain numbers
              with any keys), ``"range"`` (two values of ``of``), ``"list"`` (a list of ``of``),
              ``"stations"`` (survey rows, see :data:`STATION_COLUMNS`), ``"length_or_fill"`` (a
              length or the word ``"fill"``)
    required  the key must be present
    sub       schema of a nested table
    of        kind of the items of a range or list
    guard     the quantity of :data:`calc.plausibility.RANGES` whose possible and usual ranges
              the value (or each item) is checked against ("" = none)
    """

    kind: str
    required: bool = False
    sub: Mapping[str, Field] | None = None
    of: str | None = None
    guard: str = ""


CASE_SCHEMA = {
    "schema": Field("text"),
    "title": Field("text"),
    "well": Field("text"),
    "operator": Field("text"),
    "rig": Field("text"),
    "location": Field("text"),
    "report_period": Field("text"),
    "units": Field("text"),
    "method": Field("text"),
    "constants": Field("text"),
    "rotation": Field("bool"),
    "joint_losses": Field("text"),
    "shear_rate_correction": Field("text"),
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
    "gels": Field(
        "table", sub={k: Field("stress", guard="gel") for k in ("10s", "10min", "30min")}
    ),
    "viscometer": Field("table", sub=VISCOMETER_SCHEMA),
}

#: The same sample read again at another cup temperature (and pressure, for a pressurised
#: viscometer): ``reading_2``, ``reading_3``, ``reading_4`` of a check (calc/METHODS.md §21).
READING_SCHEMA = {
    "temperature": Field("temperature", required=True, guard="rheology_temperature"),
    "pressure": Field("pressure", guard="viscometer_pressure"),
    "dial": Field("dial", required=True),
}
#: The keys of the further readings of a check, in order.
READING_KEYS = ("reading_2", "reading_3", "reading_4")

CHECK_SCHEMA: dict[str, Field] = {
    "label": Field("text", required=True),
    "date": Field("text"),
    "time": Field("text"),
    "sample": Field("text"),
    "fluid": Field("text"),
    "bit_depth": Field("depth", guard="depth"),
    "density": Field("density", guard="fluid_density"),
    "cup_temperature": Field("temperature", guard="temperature"),
    "cup_pressure": Field("pressure", guard="viscometer_pressure"),
    **_RHEOLOGY_KEYS,
    **{k: Field("table", sub=READING_SCHEMA) for k in READING_KEYS},
    "program": Field(
        "table",
        sub={
            "density": Field("range", of="density", guard="fluid_density"),
            "pv": Field("range", of="viscosity", guard="pv"),
            "yp": Field("range", of="stress", guard="yp"),
            "lsyp": Field("range", of="stress", guard="yp"),
            "gels": Field(
                "table",
                sub={
                    k: Field("range", of="stress", guard="gel") for k in ("10s", "10min", "30min")
                },
            ),
        },
    ),
    "flow_rate": Field("flow_rate", guard="flow_rate"),
    "pump_spm": Field("list", of="number", guard="spm"),
    "rop": Field("rop", guard="rop"),
    "rpm": Field("number", guard="rpm"),
    "measured_spp": Field("pressure", guard="spp"),
    "pwd": Field(
        "table",
        sub={"ecd": Field("density", guard="emw"), "md": Field("depth", guard="depth")},
    ),
    "cuttings": Field(
        "table",
        sub={
            "density": Field("density", guard="cuttings_density"),
            "size": Field("diameter", guard="cuttings_size"),
            "sphericity": Field("number", guard="sphericity"),
        },
    ),
    "properties": Field("free"),
    "remark": Field("text"),
    # composition for density at downhole T and p (calc.downhole; calc/METHODS.md §20)
    "base_fluid": Field("text"),
    "water_phase": Field("text"),
    "oil_water_ratio": Field("number", guard="oil_water_ratio"),
    "oil": Field("number", guard="percent_volume"),
    "water": Field("number", guard="percent_volume"),
    "solids": Field("number", guard="percent_volume"),
}

SLURRY_SCHEMA: dict[str, Field] = {
    "name": Field("text", required=True),
    "density": Field("density", guard="fluid_density"),
    "temperature": Field("temperature", guard="temperature"),
    "volume": Field("volume"),
    **_RHEOLOGY_KEYS,
    "remark": Field("text"),
}

LIMITS_SCHEMA = {
    "fracture_margin": Field("density", guard="density_margin"),
    "pore_margin": Field("density", guard="density_margin"),
    "surface_rating": Field("pressure", guard="rating"),
    "trip_fracture_margin": Field("density", guard="density_margin"),
    "trip_pore_margin": Field("density", guard="density_margin"),
}
#: Input resolutions of the ECD band (calc.circulation.ecd_band; calc/METHODS.md §18); every key
#: optional: dial_resolution [degree] 0.5, balance "standard" (0.1 ppg) or "pressurised"
#: (0.05 ppg), balance_resolution (overrides the balance's), rate_uncertainty [fraction] 0.03.
UNCERTAINTY_SCHEMA = {
    "dial_resolution": Field("number"),
    "balance": Field("text"),
    "balance_resolution": Field("density", guard="density_margin"),
    "rate_uncertainty": Field("number", guard="fraction"),
}
#: Temperatures in the well (calc.downhole; calc/METHODS.md §20): a static geotherm (surface
#: temperature and gradient, or a TVD/temperature table) and, optionally, the inputs of the
#: circulating model (inlet temperature, heat capacity, heat-transfer coefficients in SI).
TEMPERATURE_SCHEMA = {
    "surface_temperature": Field("temperature", guard="well_temperature"),
    "geothermal_gradient": Field("temperature_gradient", guard="geothermal_gradient"),
    "table_tvd": Field("list", of="depth", guard="depth"),
    "table_temperature": Field("list", of="temperature", guard="well_temperature"),
    "mud_weight_temperature": Field("temperature", guard="well_temperature"),
    "inlet_temperature": Field("temperature", guard="well_temperature"),
    "heat_capacity": Field("number", guard="heat_capacity"),
    "u_pipe": Field("number", guard="heat_transfer_coefficient"),
    "u_annulus": Field("number", guard="heat_transfer_coefficient"),
}
SURVEY_SCHEMA = {"stations": Field("stations", required=True)}
#: The columns of a ``stations`` row and their kinds (md is converted; angles are plain degrees).
STATION_COLUMNS: tuple[tuple[str, str], ...] = (("md", "depth"), ("inc", "angle"), ("azi", "angle"))
CASING_SCHEMA = {
    "name": Field("text", required=True),
    "od": Field("diameter", guard="hole_diameter"),
    "id": Field("diameter", required=True, guard="hole_diameter"),
    "drift": Field("diameter", guard="hole_diameter"),
    "top": Field("depth", guard="depth"),
    "shoe": Field("depth", required=True, guard="depth"),
    "shoe_test": Field("density", guard="emw"),
}
OPEN_HOLE_SCHEMA = {
    "bit_size": Field("diameter", required=True, guard="hole_diameter"),
    "diameter": Field("diameter", guard="hole_diameter"),
    "washout_factor": Field("number", guard="washout_factor"),
}
PRESSURE_WINDOW_SCHEMA = {
    "tvd": Field("list", required=True, of="depth", guard="depth"),
    "pore": Field("list", required=True, of="density", guard="emw"),
    "fracture": Field("list", required=True, of="density", guard="emw"),
}
WEAK_POINT_SCHEMA = {
    "name": Field("text", required=True),
    "md": Field("depth", required=True, guard="depth"),
    "fracture": Field("density", required=True, guard="emw"),
    "pore": Field("density", guard="emw"),
}
PUMP_SCHEMA = {
    "name": Field("text", required=True),
    "kind": Field("text"),
    "liner": Field("diameter", guard="liner"),
    "stroke": Field("diameter", guard="stroke"),
    "rod": Field("diameter", guard="pump_rod"),
    "efficiency": Field("number", guard="efficiency"),
    "rated_power": Field("power", guard="rated_power"),
    "liner_rating": Field("pressure", guard="rating"),
}
SURFACE_LINE_SCHEMA = {
    "name": Field("text", required=True),
    "length": Field("length", required=True, guard="line_length"),
    "id": Field("diameter", required=True, guard="line_diameter"),
}
BIT_SCHEMA = {
    "name": Field("text"),
    "size": Field("diameter", required=True, guard="hole_diameter"),
    "nozzles": Field("list", of="number", guard="nozzle_32nds"),
    "tfa": Field("area", guard="tfa"),
    "ports": Field("number", guard="ports"),
    "discharge_coefficient": Field("number", guard="discharge_coefficient"),
}
STRING_SCHEMA = {
    "name": Field("text", required=True),
    "od": Field("diameter", required=True, guard="pipe_diameter"),
    "id": Field("diameter", required=True, guard="pipe_diameter"),
    "length": Field("length_or_fill", required=True, guard="string_length"),
    "tool_joint_od": Field("diameter", guard="pipe_diameter"),
    "tool_joint_id": Field("diameter", guard="pipe_diameter"),
    "joint_length": Field("length", guard="joint_length"),
    "tool_joint_length": Field("length", guard="tool_joint_length"),
    "float_valve": Field("bool"),
    "standoff": Field("number", guard="standoff"),
}
TOOL_PRESSURE_SCHEMA = {
    "name": Field("text"),
    "reference_drop": Field("pressure", required=True, guard="tool_drop"),
    "reference_density": Field("density", required=True, guard="fluid_density"),
    "reference_rate": Field("flow_rate", required=True, guard="flow_rate"),
    "flow_window": Field("range", of="flow_rate", guard="flow_rate"),
    "covers": Field("list", of="text"),
}
TRIP_SCHEMA = {
    "stand_length": Field("length", guard="stand_length"),
    "string_end": Field("text"),
    "speeds": Field("list", required=True, of="trip_speed", guard="trip_speed"),
    "acceleration_time_s": Field("number", guard="accel_time"),
    "stand_gel": Field("text"),
    "circulation_gel": Field("text"),
    "schedule_band": Field("length", guard="string_length"),
}

#: A slurry line (settling solids in a carrier; calc.slurry, calc/METHODS.md §25).
SLURRY_LINE_SCHEMA = {
    "name": Field("text", required=True),
    "id": Field("diameter", required=True, guard="slurry_pipe_diameter"),
    "roughness": Field("diameter", guard="pipe_roughness"),
    "length": Field("length", required=True, guard="slurry_line_length"),
    "inclination": Field("number", guard="line_inclination"),
    "elevation_change": Field("length"),
    "solids_density": Field("density", required=True, guard="cuttings_density"),
    "concentration": Field("number", guard="solids_concentration"),
    "slurry_density": Field("density", guard="fluid_density"),
    "d50": Field("diameter", required=True, guard="particle_size"),
    "d85": Field("diameter", guard="particle_size"),
    "carrier": Field("text"),
    "carrier_density": Field("density", guard="fluid_density"),
    "rate": Field("flow_rate", guard="flow_rate"),
    "rate_range": Field("range", of="flow_rate", guard="flow_rate"),
    "method": Field("text"),
}
CEMENT_JOB_SCHEMA = {
    "mud": Field("text", required=True),
    "spacers": Field("list", of="text"),
    "spacer_volumes": Field("list", of="volume"),
    "slurries": Field("list", required=True, of="text"),
    "slurry_volumes": Field("list", required=True, of="volume"),
    "pump_rate": Field("flow_rate", required=True, guard="flow_rate"),
    "plug_drop_time": Field("time"),
    "displacement_rate": Field("flow_rate", required=True, guard="flow_rate"),
    "slow_rate": Field("flow_rate", guard="flow_rate"),
    "slow_volume": Field("volume"),
    "liner_top": Field("depth", required=True, guard="depth"),
    "shoe": Field("depth", required=True, guard="depth"),
    "float_collar": Field("depth", guard="depth"),
    "hole_depth": Field("depth", guard="depth"),
    "liner_od": Field("diameter", required=True, guard="hole_diameter"),
    "liner_id": Field("diameter", required=True, guard="hole_diameter"),
    "pipe_od": Field("diameter", required=True, guard="pipe_diameter"),
    "pipe_id": Field("diameter", required=True, guard="pipe_diameter"),
}

#: Top-level sections: name → (is an array of tables, schema or None if not parsed here yet).
SECTIONS: dict[str, tuple[bool, Mapping[str, Field] | None]] = {
    "case": (False, CASE_SCHEMA),
    "check": (True, CHECK_SCHEMA),
    "slurry": (True, SLURRY_SCHEMA),
    "limits": (False, LIMITS_SCHEMA),
    "uncertainty": (False, UNCERTAINTY_SCHEMA),
    "survey": (False, SURVEY_SCHEMA),
    "casing": (True, CASING_SCHEMA),
    "open_hole": (False, OPEN_HOLE_SCHEMA),
    "pressure_window": (False, PRESSURE_WINDOW_SCHEMA),
    "weak_point": (True, WEAK_POINT_SCHEMA),
    "pump": (True, PUMP_SCHEMA),
    "surface_line": (True, SURFACE_LINE_SCHEMA),
    "bit": (False, BIT_SCHEMA),
    "string": (True, STRING_SCHEMA),
    "tool_pressure": (False, TOOL_PRESSURE_SCHEMA),
    "trip": (False, TRIP_SCHEMA),
    "temperature": (False, TEMPERATURE_SCHEMA),
    "slurry_line": (True, SLURRY_LINE_SCHEMA),
    "cement_job": (False, CEMENT_JOB_SCHEMA),
}
#: Sections a hydraulics report needs (the rheology subcommand needs only checks).
HYDRAULICS_SECTIONS = ("survey", "open_hole", "bit", "string")
