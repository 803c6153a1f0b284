"""The input workbook's block layout, shared by its reader and its writer.

Reader: :mod:`addin.workbook_input` (safe opening, blocks → case document).  Writer:
:mod:`addin.workbook_template` (case document → blocks: the input template and the report's
``Inputs`` sheet).  Keys and quantity kinds come from the case schema
(:mod:`addin.case_schema`); this module adds what is the workbook's own.

Layout
    Content is organised in *blocks*.  A block starts with a title cell in column A whose text is
    ``"§ <key>"`` followed by a human title (e.g. ``"§ limits  Operating limits"``); the block's
    rows follow until the first empty row.  Three kinds:

    ``values`` (one record)
        rows: description | key | unit | value [| more values …]
    ``table`` (list of records, one per row; or columns of arrays)
        a header row of keys, a units row, then one row per record
    ``columns`` (list of records, one per column — mud checks, slurries)
        rows: description | key | unit | record 1 | record 2 | …

    Sheets are free: a reader finds blocks wherever they are, so the template spreads them over
    several sheets and the report's ``Inputs`` sheet stacks them on one.  A unit cell that differs
    from the case's unit system makes the value ``"<value> <unit>"`` (a per-value unit, exactly
    as a case file allows).  A key written ``name[0]``/``name[1]`` builds a list; a dotted key
    ``dial.600`` builds a nested table.
"""

from __future__ import annotations

import difflib
from dataclasses import dataclass, field

from addin.case_schema import SECTIONS, STATION_COLUMNS
from calc.errors import InputError
from calc.units import label, unit_for

__all__ = [
    "BLOCKS",
    "LABELS",
    "LAYOUT",
    "MARK",
    "Block",
    "Field",
    "WorkbookError",
    "unit_labels",
]

MARK = "§"


class WorkbookError(InputError):
    """A problem with an input workbook; the message names the file (and sheet and cell)."""

    def __init__(self, where: str, value, allowed: str, problem: str = "not allowed"):
        super().__init__(where, value, allowed, problem)


@dataclass(frozen=True)
class Field:
    """One key of a block: ``key`` (dotted, ``[i]`` for list items), description, unit kind."""

    key: str
    label: str
    kind: str = "dimensionless"  # calc.units quantity kind; "text" for words; "flag" for true/false
    many: bool = False  # a list of values (several cells in a values block)


@dataclass(frozen=True)
class Block:
    """A block of the layout: case key, title, kind (values/table/columns) and its fields."""

    key: str
    title: str
    kind: str
    fields: tuple[Field, ...]
    #: for kind "table": True if the TOML is a dict of arrays (e.g. pressure_window), False if a
    #: list of records (e.g. [[casing]]); "survey.stations"-style keys hold a list of rows
    arrays: bool = False
    rows_key: str | None = None
    note: str = ""
    by_key: dict = field(default_factory=dict, compare=False, repr=False)

    def __post_init__(self):
        self.by_key.update({f.key: f for f in self.fields})

    def lookup(self, key: str, where: str) -> Field:
        """The field of a row or column key (``dial.600``, ``program.pv[1]``, ``properties.x``).

        An unknown key raises :class:`WorkbookError` naming ``where`` and the nearest known key.
        """
        base = key.split("[")[0]
        f = self.by_key.get(key) or self.by_key.get(base)
        if f is None:
            # dotted keys with free sub-keys (dial.<rpm>, properties.<name>): match by prefix
            pre = base.rsplit(".", 1)[0]  # reading_2.dial.450 → reading_2.dial.*
            f = self.by_key.get(pre + ".*") or self.by_key.get(base.split(".")[0] + ".*")
        if f is None:
            near = difflib.get_close_matches(key, [k for k in self.by_key if "*" not in k], n=1)
            hint = f" (did you mean '{near[0]}'?)" if near else ""
            raise WorkbookError(where, key, f"a key of block '{self.key}'{hint}", "unknown key")
        return f


# ---------------------------------------------------------------------------- the case layout
# Keys and quantity kinds come from the case schema (addin.case_schema.SECTIONS); the workbook adds
# only what is its own: block titles and kinds (values/table/columns), block order, the row
# labels, the dial speeds given a row each, and one display unit (nozzle sizes).

_TEXT = "text"

#: case-schema kind → workbook kind (quantity kinds are kept as they are).
_KIND = {"number": "dimensionless", "bool": "flag", "length_or_fill": "length"}
#: rotor speeds [rpm] that get a labelled row of their own; other speeds use ``dial.*``.
_DIAL_SPEEDS = ("600", "300", "200", "100", "60", "30", "6", "3")
#: the two ends of a range, as label suffixes of a columns block's ``key[0]``/``key[1]`` rows.
_ENDS = ("low", "high")
#: Rows given to a list in a column block (a check's ``pump_spm``: up to this many pumps).
LIST_ROWS = 4
#: nozzle sizes are plain numbers in the case file, shown with the nozzle unit (32nds of an inch).
_DISPLAY_KIND = {("bit", "nozzles"): "nozzle"}

_RHEOLOGY_LABELS = {
    "dial": "dial reading",
    "dial_up": "dial reading, rising ramp,",
    "dial_down": "dial reading, falling ramp,",
    "gels.10s": "gel strength 10 s",
    "gels.10min": "gel strength 10 min",
    "gels.30min": "gel strength 30 min",
    "viscometer.name": "viscometer",
    "viscometer.shear_rate_per_rpm": "viscometer shear rate per rpm [1/s]",
    "viscometer.stress_per_degree": "viscometer stress per dial degree [Pa]",
    "viscometer.spring_factor": "viscometer spring factor",
    "viscometer.full_scale": "viscometer full scale [degree]",
}

#: Row labels by block and (dotted) case key; a range in a columns block gets ", low"/", high".
LABELS: dict[str, dict[str, str]] = {
    "case": {
        "schema": "case-file format version",
        "title": "report title",
        "well": "well name",
        "operator": "operator",
        "rig": "rig",
        "location": "location",
        "report_period": "report period",
        "units": "unit system (oilfield, metric or si)",
        "method": "hydraulics method (blank: api13d_2010_hb)",
        "shear_rate_correction": "viscometer shear rates: newtonian (blank) or krieger",
        "constants": "field constants (exact, or as_printed for api13d_1995_power_law)",
        "rotation": "apply string rotation to annular loss (true/false; blank: true)",
        "joint_losses": "tool-joint losses (bore_friction or bore_change_k; blank: bore_friction)",
    },
    "limits": {
        "fracture_margin": "ECD margin below fracture",
        "pore_margin": "margin above pore pressure",
        "surface_rating": "surface system pressure rating",
        "trip_fracture_margin": "surge margin below fracture",
        "trip_pore_margin": "swab margin above pore",
    },
    "uncertainty": {
        "dial_resolution": "dial-reading resolution [degree] (blank = 0.5)",
        "balance": "mud balance: standard or pressurised",
        "balance_resolution": "mud-balance resolution (blank = by balance)",
        "rate_uncertainty": "flow-rate uncertainty, fraction of rate (blank = 0.03)",
    },
    "survey": {"md": "measured depth", "inc": "inclination", "azi": "azimuth"},
    "casing": {
        "name": "name",
        "od": "outside diameter",
        "id": "inside diameter",
        "drift": "drift diameter",
        "top": "top (MD)",
        "shoe": "shoe (MD)",
        "shoe_test": "shoe test (LOT/FIT) EMW",
    },
    "open_hole": {
        "bit_size": "bit size",
        "diameter": "effective open-hole diameter",
        "washout_factor": "washout factor (instead of a diameter)",
    },
    "pressure_window": {
        "tvd": "true vertical depth",
        "pore": "pore pressure EMW",
        "fracture": "fracture pressure EMW",
    },
    "weak_point": {
        "name": "name",
        "md": "measured depth",
        "fracture": "fracture EMW",
        "pore": "pore EMW",
    },
    "pump": {
        "name": "name",
        "kind": "kind (triplex or duplex)",
        "liner": "liner size",
        "stroke": "stroke length",
        "rod": "piston-rod diameter (duplex)",
        "efficiency": "volumetric efficiency (fraction)",
        "rated_power": "rated power",
        "liner_rating": "liner pressure rating",
    },
    "surface_line": {"name": "name", "length": "length", "id": "inside diameter"},
    "bit": {
        "name": "description",
        "size": "bit size",
        "nozzles": "nozzle sizes",
        "tfa": "total flow area (instead of nozzles)",
        "ports": "number of ports",
        "discharge_coefficient": "nozzle discharge coefficient",
    },
    "string": {
        "name": "component",
        "od": "outside diameter",
        "id": "inside diameter",
        "length": "length (or 'fill')",
        "tool_joint_od": "tool-joint OD",
        "tool_joint_id": "tool-joint ID",
        "joint_length": "joint length",
        "tool_joint_length": "tool-joint length",
        "float_valve": "float valve (true/false)",
        "standoff": "stand-off ratio 0-1 (1 centred, 0 on the wall; blank: concentric)",
    },
    "tool_pressure": {
        "name": "tools (description)",
        "reference_drop": "drop at the reference conditions",
        "reference_density": "reference density",
        "reference_rate": "reference flow rate",
        "flow_window": "allowed flow range (min, max)",
        "covers": "components whose bore loss the drop includes",
    },
    "check": {
        "label": "check label",
        "date": "date",
        "time": "time",
        "sample": "sample point",
        "fluid": "fluid",
        "bit_depth": "bit depth (MD)",
        "density": "mud density",
        "cup_temperature": "rheology (cup) temperature",
        "cup_pressure": "rheology (cup) gauge pressure",
        **_RHEOLOGY_LABELS,
        "reading_2.temperature": "2nd reading: cup temperature",
        "reading_2.pressure": "2nd reading: gauge pressure",
        "reading_2.dial": "2nd reading: dial reading",
        "reading_3.temperature": "3rd reading: cup temperature",
        "reading_3.pressure": "3rd reading: gauge pressure",
        "reading_3.dial": "3rd reading: dial reading",
        "reading_4.temperature": "4th reading: cup temperature",
        "reading_4.pressure": "4th reading: gauge pressure",
        "reading_4.dial": "4th reading: dial reading",
        "program.density": "programme density",
        "program.pv": "programme PV",
        "program.yp": "programme YP",
        "program.lsyp": "programme LSYP",
        "program.gels.10s": "programme 10-second gel",
        "program.gels.10min": "programme 10-minute gel",
        "program.gels.30min": "programme 30-minute gel",
        "flow_rate": "flow rate",
        "pump_spm": "pump speed [strokes/min]",
        "rop": "rate of penetration",
        "rpm": "string rotary speed [rpm]",
        "measured_spp": "measured standpipe pressure",
        "pwd.ecd": "downhole gauge ECD",
        "pwd.md": "downhole gauge depth (MD)",
        "cuttings.density": "cuttings density",
        "cuttings.size": "cuttings size",
        "cuttings.sphericity": "cuttings sphericity",
        "properties": "other mud property (free name)",
        "remark": "remark",
        "base_fluid": "base fluid (water, brine, diesel, mineral_oil, synthetic)",
        "water_phase": "aqueous phase of an oil mud (water or brine)",
        "oil_water_ratio": "oil/water ratio, % oil",
        "oil": "retort oil, % by volume",
        "water": "retort water, % by volume",
        "solids": "retort solids, % by volume",
    },
    "temperature": {
        "surface_temperature": "surface temperature",
        "geothermal_gradient": "geothermal gradient",
        "table_tvd": "temperature table: TVDs",
        "table_temperature": "temperature table: temperatures",
        "mud_weight_temperature": "temperature of the mud-weight measurement",
        "inlet_temperature": "mud inlet temperature (circulating model)",
        "heat_capacity": "mud heat capacity, J/(kg·K) (blank = 1675)",
        "u_pipe": "heat transfer string ↔ annulus, W/(m²·K) (blank = 570)",
        "u_annulus": "heat transfer annulus ↔ formation, W/(m²·K) (blank = 57)",
    },
    "trip": {
        "stand_length": "stand length",
        "string_end": "string end (closed or open)",
        "speeds": "average stand speeds to evaluate",
        "acceleration_time_s": "seconds to reach the peak speed (blank = 2 s)",
        "stand_gel": "gel broken at each stand start (10s, 10min or 30min)",
        "circulation_gel": "gel broken when circulation starts (10min, 10s or 30min)",
        "schedule_band": "depth band of the trip schedule (blank = 1000 ft)",
    },
    "slurry_line": {
        "name": "line name",
        "id": "pipe inside diameter",
        "roughness": "pipe wall roughness (blank = 0.046 mm steel)",
        "length": "line length",
        "inclination": "inclination from horizontal [degree] (+ uphill)",
        "elevation_change": "outlet above inlet (blank = length × sin inclination)",
        "solids_density": "solids density",
        "concentration": "solids volume concentration (fraction)",
        "slurry_density": "slurry density (instead of, or to check, the concentration)",
        "d50": "particle size d50",
        "d85": "particle size d85 (blank = d50)",
        "carrier": "carrier: water, or a check label or slurry name",
        "carrier_density": "water density (blank = 998.2 kg/m³)",
        "rate": "design rate",
        "rate_range": "rate range",
        "method": "gradient method (four_component_2006 or durand_condolios_1952)",
    },
    "cement_job": {
        "mud": "mud in the well and displacing (check label)",
        "spacers": "spacers pumped first (slurry names)",
        "spacer_volumes": "spacer volumes",
        "slurries": "cement slurries, lead first (slurry names)",
        "slurry_volumes": "slurry volumes",
        "pump_rate": "spacer and slurry pump rate",
        "plug_drop_time": "pumps stopped to drop the plug",
        "displacement_rate": "displacement rate",
        "slow_rate": "slow rate before bump",
        "slow_volume": "displacement volume at the slow rate",
        "liner_top": "liner top (MD)",
        "shoe": "liner shoe (MD)",
        "float_collar": "float collar (MD)",
        "hole_depth": "TD (MD)",
        "liner_od": "liner OD",
        "liner_id": "liner ID",
        "pipe_od": "running-string OD",
        "pipe_id": "running-string ID",
    },
    "slurry": {
        "name": "name",
        "density": "density",
        "temperature": "test temperature",
        "volume": "volume",
        **_RHEOLOGY_LABELS,
        "remark": "remark",
    },
}


def _fields(block: str, layout: str, schema, prefix: str = "") -> list[Field]:
    """The workbook fields of one case section: its schema's keys, expanded to workbook rows."""
    labels = LABELS.get(block, {})
    out: list[Field] = []
    for name, fld in schema.items():
        key = prefix + name
        label = labels.get(key, key)
        kind = fld.kind
        if kind == "table":
            out += _fields(block, layout, fld.sub, key + ".")
        elif kind == "dial":
            out += [Field(f"{key}.{s}", f"{label} {s} rpm", "dimensionless") for s in _DIAL_SPEEDS]
            out.append(Field(f"{key}.*", f"{label} (other speed)", "dimensionless"))
        elif kind == "free":
            out.append(Field(f"{key}.*", label, "dimensionless"))
        elif kind == "stations":
            out += [Field(c, labels.get(c, c), k) for c, k in STATION_COLUMNS]
        elif kind in ("range", "list"):
            item = _DISPLAY_KIND.get((block, key), _KIND.get(fld.of, fld.of))
            if layout == "columns" and kind == "range":
                out += [Field(f"{key}[{i}]", f"{label}, {e}", item) for i, e in enumerate(_ENDS)]
            elif layout == "columns":  # a list in a column: one row per item (pump_spm)
                out += [
                    Field(f"{key}[{i}]", f"{label}, pump {i + 1}", item) for i in range(LIST_ROWS)
                ]
            else:
                out.append(Field(key, label, item, many=layout == "values"))
        else:
            out.append(Field(key, label, _DISPLAY_KIND.get((block, key), _KIND.get(kind, kind))))
    return out


def _block(key: str, title: str, kind: str, **kw) -> Block:
    return Block(key, title, kind, tuple(_fields(key, kind, SECTIONS[key][1])), **kw)


#: The case file's sections as workbook blocks, in the order the template and report show them.
LAYOUT: tuple[Block, ...] = (
    _block("case", "Case", "values"),
    _block("limits", "Operating limits and margins", "values"),
    _block("uncertainty", "Input resolutions for the ECD band", "values"),
    _block("survey", "Directional survey (TVD by minimum curvature)", "table", rows_key="stations"),
    _block("casing", "Casing and liners", "table"),
    _block("open_hole", "Open hole", "values"),
    _block("pressure_window", "Pore and fracture pressure (EMW against TVD)", "table", arrays=True),
    _block("weak_point", "Named weak points", "table"),
    _block("pump", "Mud pumps", "table"),
    _block("surface_line", "Surface lines (as pipe runs)", "table"),
    _block("bit", "Bit", "values"),
    _block("string", "Drill string, bit first", "table"),
    _block("tool_pressure", "Fixed downhole tool pressure drop", "values"),
    _block("check", "Mud checks, oldest first (one column each)", "columns"),
    _block("trip", "Planned trip (surge and swab)", "values"),
    _block("temperature", "Temperatures in the well (density at downhole T and p)", "values"),
    _block("slurry", "Spacer and cement slurries (one column each)", "columns"),
    _block("slurry_line", "Slurry lines, settling solids (one column each)", "columns"),
    _block("cement_job", "Planned cement job (liner placement)", "values"),
)

BLOCKS: dict[str, Block] = {b.key: b for b in LAYOUT}


def unit_labels(system: str):
    """``unit_of`` for the reader and the writer: the display unit of a kind in ``system``."""

    def unit_of(kind: str):
        if kind in (_TEXT, "flag", "dimensionless"):
            return None
        if kind == "nozzle":  # sizes are whole 32nds of an inch in every unit system (trade use)
            return label("in32")
        return label(unit_for(kind, system))

    return unit_of
