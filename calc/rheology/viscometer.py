"""Rotational (Couette) viscometer: speeds and dial readings → shear rates and shear stresses.

The standard oilfield instrument is a coaxial-cylinder viscometer with the R1 rotor, B1 bob and
F1 torsion spring ("R1-B1-F1").  For a Newtonian fluid the shear rate at the bob is

    γ̇ = 2ω R_c² / (R_c² − R_b²),    ω = 2πN/60                                   (1)

and the shear stress at the bob is τ = k₁k₂θ·f, with θ the dial reading [degree], k₁ the spring
constant [N·m/degree], k₂ the bob constant [m⁻³] and f the spring factor (1 for F1).

Constants (calc/METHODS.md §1.1, §1.2; all from memory, not yet checked against the printed
standard):
R_c = 1.8415 cm (rotor inner radius), R_b = 1.7245 cm (bob radius), bob height 3.8 cm,
k₁ = 386 dyn·cm/degree, k₂ = 0.01323 cm⁻³.  Derived here: γ̇/N = 1.7023 s⁻¹ per rpm (texts
print 1.703), τ/θ = 0.51068 Pa per degree (texts print 0.511 Pa, 1.065–1.067 lbf/100 ft²).

Field values (API RP 13B-1): PV = θ600 − θ300 [cP], YP = θ300 − PV [lbf/100 ft²],
LSYP = 2θ3 − θ6 [lbf/100 ft²] (Guo & Liu 2011, eq. 2.12), gels = the maximum 3-rpm reading
after 10 s, 10 min (and 30 min) rest.  By field convention a dial degree is *read as*
1 lbf/100 ft² (6.7 % below the instrument stress); :attr:`ViscometerReadings.yp`, ``lsyp`` and
``gels`` follow that convention and are returned in SI (Pa) through :mod:`calc.units`, while
:attr:`ViscometerReadings.shear_stress` (what the models are fitted to) is the instrument stress.

References
----------
API RP 13B-1, *Field Testing Water-based Drilling Fluids* (ISO 10414-1), American Petroleum
Institute.  API RP 10B-2, *Testing Well Cements*, 2nd ed., 2013 (ISO 10426-2).
Guo, B. and Liu, G. (2011), *Applied Drilling Circulation Systems*, Gulf Professional.
"""

from __future__ import annotations

import difflib
import itertools
import math
from collections.abc import Mapping
from dataclasses import dataclass, field

import numpy as np

from calc.errors import InputError, as_float_array, check_finite
from calc.notes import Note
from calc.registry import MethodRegistry, Verification
from calc.rheology.table import RheometerTable
from calc.units import si_factor
from calc.values import Value

__all__ = [
    "GEL_NAMES",
    "SHEAR_RATE_CORRECTIONS",
    "STANDARD_GEOMETRY",
    "VISCOMETER_CORRECTIONS",
    "ViscometerGeometry",
    "ViscometerReadings",
    "couette_shear_rate_per_rpm",
    "gap_plug",
    "gap_plug_notes",
    "krieger_shear_rate",
    "radius_ratio",
    "spring_stress_per_degree",
]

#: SI value of the field units the trade reports viscometer results in (via calc.units).
FIELD_STRESS = si_factor("lbf/100ft2", "stress")  # Pa per lbf/100 ft²
CENTIPOISE = si_factor("cP", "viscosity")  # Pa·s per cP

#: Gel-strength names accepted (canonical key → accepted spellings).
GEL_NAMES: dict[str, tuple[str, ...]] = {
    "10s": ("10s", "10 s", "10sec", "10 sec", "s10", "10-s", "initial"),
    "10min": ("10min", "10 min", "10m", "m10", "10-min"),
    "30min": ("30min", "30 min", "30m", "m30", "30-min"),
}
_GEL_LOOKUP = {alias: key for key, aliases in GEL_NAMES.items() for alias in aliases}


def couette_shear_rate_per_rpm(rotor_radius, bob_radius):
    """Shear rate at the bob per rpm for a Newtonian fluid [1/s per rpm].

    γ̇/N = (2π/60)·2R_c²/(R_c² − R_b²), from eq. (1) of the module docstring.

    Parameters
    ----------
    rotor_radius : float
        Inner radius of the rotating sleeve R_c [m].
    bob_radius : float
        Radius of the bob R_b [m], 0 < R_b < R_c.

    Examples
    --------
    >>> round(couette_shear_rate_per_rpm(0.018415, 0.017245), 4)
    1.7023
    """
    rc = check_finite("rotor radius", rotor_radius, "m")
    rb = check_finite("bob radius", bob_radius, "m")
    if np.any(rb <= 0) or np.any(rc <= rb):
        raise InputError("bob radius", float(rb), f"0 < bob radius < rotor radius ({rc} m)")
    out = (2.0 * math.pi / 60.0) * 2.0 * rc**2 / (rc**2 - rb**2)
    return float(out) if np.ndim(out) == 0 else out


def spring_stress_per_degree(spring_constant, bob_constant):
    """Shear stress at the bob per dial degree, τ/θ = k₁·k₂ [Pa per degree].

    Parameters
    ----------
    spring_constant : float
        Torsion-spring constant k₁ [N·m per degree] (F1: 386 dyn·cm = 3.86e-5 N·m).
    bob_constant : float
        Bob constant k₂ = 1/(2πR_b²h_eff) [m⁻³] (B1: 0.01323 cm⁻³ = 13 230 m⁻³).

    Examples
    --------
    >>> round(spring_stress_per_degree(386e-7, 0.01323e6), 5)
    0.51068
    """
    k1 = float(check_finite("spring constant", spring_constant))
    k2 = float(check_finite("bob constant", bob_constant))
    if k1 <= 0 or k2 <= 0:
        raise InputError("spring constant × bob constant", k1 * k2, "> 0")
    return k1 * k2


@dataclass(frozen=True)
class ViscometerGeometry:
    """Instrument factors: shear rate per rpm [1/s], stress per dial degree [Pa], spring factor.

    Build the standard instrument with :data:`STANDARD_GEOMETRY`, another rotor/bob from its
    dimensions with :meth:`from_dimensions`, or give the two factors directly (e.g. from the
    instrument maker's table).  ``full_scale`` is the dial's range [degree] (300° on the common
    six-speed instruments — common practice).

    Examples
    --------
    The standard rotor/bob gives 1.702 1/s per rpm (1,021 1/s at 600 rpm); a spring twice as
    stiff doubles the stress per degree:

    >>> g = STANDARD_GEOMETRY
    >>> round(g.shear_rate_per_rpm, 3), round(600 * g.shear_rate_per_rpm)
    (1.702, 1021)
    >>> round(g.with_spring_factor(2.0).stress_per_reading / g.stress_per_reading, 12)
    2.0
    """

    name: str
    shear_rate_per_rpm: float
    stress_per_degree: float
    spring_factor: float = 1.0
    full_scale: float = 300.0
    source: str = "user-supplied factors"

    def __post_init__(self):
        for attr in ("shear_rate_per_rpm", "stress_per_degree", "spring_factor", "full_scale"):
            val = getattr(self, attr)
            if isinstance(val, str) or not np.isfinite(val) or val <= 0:
                raise InputError(f"viscometer {attr.replace('_', ' ')}", val, "a number > 0")
            object.__setattr__(self, attr, float(val))

    @classmethod
    def from_dimensions(
        cls,
        rotor_radius: float,
        bob_radius: float,
        spring_constant: float,
        bob_constant: float,
        *,
        name: str = "custom rotor/bob/spring",
        spring_factor: float = 1.0,
        full_scale: float = 300.0,
        source: str = "user-supplied dimensions",
    ) -> ViscometerGeometry:
        """Factors from rotor/bob radii [m], spring constant [N·m/degree], bob constant [m⁻³]."""
        return cls(
            name=name,
            shear_rate_per_rpm=couette_shear_rate_per_rpm(rotor_radius, bob_radius),
            stress_per_degree=spring_stress_per_degree(spring_constant, bob_constant),
            spring_factor=spring_factor,
            full_scale=full_scale,
            source=source,
        )

    def with_spring_factor(self, spring_factor: float) -> ViscometerGeometry:
        """The same rotor and bob with another spring (stress per degree × factor)."""
        return ViscometerGeometry(
            self.name + f" (spring factor {spring_factor:g})",
            self.shear_rate_per_rpm,
            self.stress_per_degree,
            spring_factor,
            self.full_scale,
            self.source,
        )

    @property
    def stress_per_reading(self) -> float:
        """Stress per dial degree including the spring factor [Pa]."""
        return self.stress_per_degree * self.spring_factor


#: R1-B1-F1: radii 1.8415/1.7245 cm, k₁ = 386 dyn·cm/degree, k₂ = 0.01323 cm⁻³ (from memory,
#: not yet checked against API RP 13B-1 / ISO 10414-1 — calc/METHODS.md §1.1, §1.2).
STANDARD_GEOMETRY = ViscometerGeometry.from_dimensions(
    rotor_radius=0.018415,
    bob_radius=0.017245,
    spring_constant=386e-7,  # 386 dyn·cm = 386e-7 N·m
    bob_constant=0.01323e6,  # 0.01323 cm⁻³ = 13 230 m⁻³
    name="R1-B1-F1",
    source="API RP 13B-1 (ISO 10414-1) standard rotor/bob/spring; dimensions from memory, not "
    "yet checked against the standard (calc/METHODS.md §1.1, §1.2)",
)

_MODES = ("mud", "cement")


def _reading_array(name: str, value) -> np.ndarray:
    if isinstance(value, str) or (
        isinstance(value, (list, tuple)) and any(isinstance(v, (bool, str)) for v in value)
    ):
        raise InputError(name, value, "numbers (one per speed)")
    arr = as_float_array(name, value)
    if arr.ndim != 1:
        raise InputError(name, value, "a one-dimensional list of numbers")
    return arr


def _canonical_gel(key) -> str:
    text = str(key).strip().lower()
    if text in _GEL_LOOKUP:
        return _GEL_LOOKUP[text]
    near = difflib.get_close_matches(text, list(_GEL_LOOKUP), n=1)
    hint = f" (did you mean '{_GEL_LOOKUP[near[0]]}'?)" if near else ""
    raise InputError("gel strength name", key, "10s, 10min, 30min" + hint, problem="unknown")


@dataclass(frozen=True, eq=False)
class ViscometerReadings:
    """One viscometer check: speeds [rpm], dial readings [degree], gels, instrument factors.

    Parameters
    ----------
    speeds : array_like
        Rotor speeds [rpm], any order, at least two distinct.
    dial : array_like, optional
        Dial readings [degree] at ``speeds`` (raw dial degrees; a stiffer spring goes in
        ``geometry.spring_factor``).  May be omitted when ``ramp_up`` and ``ramp_down`` are given.
    gels : mapping, optional
        Gel strengths as maximum 3-rpm dial readings [degree], keys ``10s``, ``10min``, ``30min``.
    geometry : ViscometerGeometry
        Instrument factors (default :data:`STANDARD_GEOMETRY`).
    mode : {"mud", "cement"}
        ``"cement"`` for slurries and spacers (API RP 10B-2 speeds, PV from 300/100 if no 600).
    ramp_up, ramp_down : array_like, optional
        Readings on the rising and falling ramps (API RP 10B-2); ``dial`` becomes their mean.
    label : str
        Name of the check, e.g. ``"D1 05:30"``.
    temperature : float, optional
        Cup temperature [K].
    resolution : float
        Reading resolution [degree] (±0.5° — common practice, calc/METHODS.md §16.1).

    Raises
    ------
    InputError
        fewer than two speeds; missing, negative or non-finite readings; readings that fall as
        speed rises (beyond ``resolution`` between speeds ≤ 6 rpm); readings beyond full scale;
        duplicate speeds with different readings; θ600 ≤ θ300 (PV ≤ 0).

    Examples
    --------
    >>> r = ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7])
    >>> round(r.pv / 1e-3, 6), round(r.yp / FIELD_STRESS, 6), round(r.lsyp / FIELD_STRESS, 6)
    (19.0, 18.0, 6.0)
    >>> round(float(r.shear_rate[-1]), 1)
    1021.4
    """

    speeds: np.ndarray
    dial: np.ndarray | None = None
    gels: Mapping[str, float] | None = None
    geometry: ViscometerGeometry = STANDARD_GEOMETRY
    mode: str = "mud"
    ramp_up: np.ndarray | None = None
    ramp_down: np.ndarray | None = None
    label: str = ""
    temperature: float | None = None
    resolution: float = 0.5
    shear_rate_correction: str = "newtonian"
    notes: tuple[Note, ...] = field(default=(), compare=False)

    # ------------------------------------------------------------------ construction
    def __post_init__(self):
        notes: list[Note] = list(self.notes)
        if not isinstance(self.geometry, ViscometerGeometry):
            raise InputError("viscometer geometry", self.geometry, "a ViscometerGeometry")
        if self.mode not in _MODES:
            raise InputError("viscometer mode", self.mode, "mud or cement")
        if self.shear_rate_correction not in SHEAR_RATE_CORRECTIONS:
            raise InputError(
                "shear-rate correction",
                self.shear_rate_correction,
                " or ".join(SHEAR_RATE_CORRECTIONS),
            )
        res = float(check_finite("reading resolution", self.resolution, "degree"))
        if res < 0:
            raise InputError("reading resolution", res, ">= 0 degree")
        speeds = _reading_array("viscometer speeds", self.speeds)
        if not np.all(np.isfinite(speeds)):
            bad = speeds[~np.isfinite(speeds)][0]
            raise InputError("viscometer speed", float(bad), "a finite number of rpm > 0")
        up = down = None
        if self.ramp_up is not None or self.ramp_down is not None:
            if self.ramp_up is None or self.ramp_down is None:
                raise InputError("ramp readings", "one ramp only", "both ramp_up and ramp_down")
            up = _reading_array("ramp-up readings", self.ramp_up)
            down = _reading_array("ramp-down readings", self.ramp_down)
            for nm, arr in (("ramp-up readings", up), ("ramp-down readings", down)):
                if arr.shape != speeds.shape:
                    raise InputError(nm, arr.size, f"{speeds.size} readings, one per speed")
                self._check_values(nm, speeds, arr)
            dial = 0.5 * (up + down)
            if self.dial is not None:
                raise InputError("dial readings", "given with ramps", "either dial or the ramps")
        else:
            if self.dial is None:
                raise InputError("dial readings", None, "one reading per speed")
            dial = _reading_array("dial readings", self.dial)
        if dial.shape != speeds.shape:
            raise InputError("dial readings", dial.size, f"{speeds.size} readings, one per speed")
        self._check_values("dial reading", speeds, dial)
        if np.any(speeds <= 0):
            raise InputError("viscometer speed", float(speeds[speeds <= 0][0]), "> 0 rpm")
        order = np.argsort(speeds, kind="stable")
        speeds, dial = speeds[order], dial[order]
        if up is not None:
            up, down = up[order], down[order]
        speeds, dial, up, down = self._merge_duplicates(speeds, dial, up, down, notes)
        if speeds.size < 2:
            raise InputError(
                "viscometer speeds", speeds.tolist(), "at least two different speeds", "too few"
            )
        self._check_order(speeds, dial, res, notes)
        if not dial[-1] > dial[0]:
            raise InputError(
                "dial readings",
                dial.tolist(),
                "readings that rise with speed",
                problem="flat flow curve",
            )
        object.__setattr__(self, "speeds", speeds)
        object.__setattr__(self, "dial", dial)
        object.__setattr__(self, "ramp_up", up)
        object.__setattr__(self, "ramp_down", down)
        object.__setattr__(self, "resolution", res)
        if self.temperature is not None:
            t = float(check_finite("cup temperature", self.temperature, "K"))
            if t <= 0:
                raise InputError("cup temperature", t, "> 0 K")
            object.__setattr__(self, "temperature", t)
        object.__setattr__(self, "gels", self._check_gels(notes))
        if self.shear_rate_correction == "krieger":
            _, slope_notes = krieger_shear_rate(speeds, dial, self.geometry)
            notes.extend(slope_notes)
        self._plausibility(notes)
        object.__setattr__(self, "notes", tuple(notes))

    @classmethod
    def from_mapping(cls, dial: Mapping, **kwargs) -> ViscometerReadings:
        """Readings from ``{rpm: reading}``, e.g. ``{600: 56, 300: 37, 6: 8, 3: 7}``."""
        if not isinstance(dial, Mapping) or not dial:
            raise InputError("dial readings", dial, "a mapping {rpm: reading} with two or more")
        speeds = []
        for key in dial:
            try:
                speeds.append(float(key))
            except (TypeError, ValueError) as exc:
                raise InputError("viscometer speed", key, "a number of rpm") from exc
        return cls(speeds, list(dial.values()), **kwargs)

    @classmethod
    def from_ramps(cls, speeds, ramp_up, ramp_down, **kwargs) -> ViscometerReadings:
        """Cement/spacer readings (API RP 10B-2): rising and falling ramps, averaged."""
        kwargs.setdefault("mode", "cement")
        return cls(speeds, None, ramp_up=ramp_up, ramp_down=ramp_down, **kwargs)

    def _check_values(self, name, speeds, arr):
        bad = ~np.isfinite(arr)
        if np.any(bad):
            rpm = speeds[bad][0]
            raise InputError(f"{name} at {rpm:g} rpm", float(arr[bad][0]), "a finite number")
        if np.any(arr < 0):
            rpm = speeds[arr < 0][0]
            raise InputError(f"{name} at {rpm:g} rpm", float(arr[arr < 0][0]), ">= 0 degree")
        fs = self.geometry.full_scale
        if np.any(arr > fs):
            rpm = speeds[arr > fs][0]
            raise InputError(
                f"{name} at {rpm:g} rpm",
                float(arr[arr > fs][0]),
                f"0 to {fs:g} degrees (the dial's full scale); for a stiffer spring give the raw "
                "dial reading and the spring factor",
                problem="off scale",
            )

    @staticmethod
    def _merge_duplicates(speeds, dial, up, down, notes):
        uniq, idx, counts = np.unique(speeds, return_index=True, return_counts=True)
        if np.all(counts == 1):
            return speeds, dial, up, down
        for s, c in zip(uniq, counts, strict=True):
            if c > 1:
                vals = dial[speeds == s]
                if np.ptp(vals) > 0:
                    raise InputError(
                        f"dial readings at {s:g} rpm",
                        vals.tolist(),
                        "one reading per speed (give ramp-up and ramp-down readings as ramps)",
                        problem="duplicate speed with different readings",
                    )
                notes.append(
                    Note(
                        "info",
                        "duplicate_speed",
                        "{speed:g} rpm given {count:.0f} times with the same reading; used once",
                        f"{s:g} rpm",
                        (Value("speed", float(s)), Value("count", float(c))),
                    )
                )
        keep = np.sort(idx)
        return (
            speeds[keep],
            dial[keep],
            None if up is None else up[keep],
            None if down is None else down[keep],
        )

    @staticmethod
    def _check_order(speeds, dial, res, notes):
        drop = dial[:-1] - dial[1:]  # > 0 where the reading falls as speed rises
        for i in np.flatnonzero(drop > 0):
            lo, hi = speeds[i], speeds[i + 1]
            low_shear = hi <= 6.0
            if low_shear and drop[i] <= res + 1e-12:
                notes.append(
                    Note(
                        "warning",
                        "low_shear_reversed",
                        "{low:g}-rpm ({low_dial:g}) > {high:g}-rpm ({high_dial:g}) within the "
                        "reading resolution (±{resolution:g}°): swapped?",
                        f"{lo:g}/{hi:g} rpm",
                        (
                            Value("low", float(lo)),
                            Value("low_dial", float(dial[i])),
                            Value("high", float(hi)),
                            Value("high_dial", float(dial[i + 1])),
                            Value("resolution", float(res)),
                        ),
                    )
                )
                continue
            raise InputError(
                f"dial reading at {hi:g} rpm",
                float(dial[i + 1]),
                f">= the {lo:g}-rpm reading ({dial[i]:g}): readings must not fall as speed rises",
                problem="falls as speed rises",
            )
        for i in np.flatnonzero(drop == 0):
            if speeds[i] > 6.0:
                notes.append(
                    Note(
                        "warning",
                        "tied_readings",
                        "{low:g} and {high:g} rpm read the same ({dial:g}°)",
                        f"{speeds[i]:g}/{speeds[i + 1]:g} rpm",
                        (
                            Value("low", float(speeds[i])),
                            Value("high", float(speeds[i + 1])),
                            Value("dial", float(dial[i])),
                        ),
                    )
                )

    def _check_gels(self, notes):
        if self.gels is None:
            return {}
        if not isinstance(self.gels, Mapping):
            raise InputError(
                "gel strengths", self.gels, "a mapping such as {'10s': 7, '10min': 12}"
            )
        out: dict[str, float] = {}
        for key, val in self.gels.items():
            name = _canonical_gel(key)
            if isinstance(val, str) or isinstance(val, bool):
                raise InputError(f"{name} gel", val, "a number (3-rpm dial reading, degree)")
            v = float(check_finite(f"{name} gel", val, "degree"))
            if v < 0:
                raise InputError(f"{name} gel", v, ">= 0 degree")
            if v > self.geometry.full_scale:
                raise InputError(
                    f"{name} gel", v, f"0 to {self.geometry.full_scale:g} degrees", "off scale"
                )
            out[name] = v
        order = [k for k in GEL_NAMES if k in out]
        for a, b in itertools.pairwise(order):
            if out[b] < out[a]:
                notes.append(
                    Note(
                        "warning",
                        "gels_reversed",
                        "{later} gel ({later_dial:g}) below {earlier} gel "
                        "({earlier_dial:g}): gels normally rise with rest time",
                        "gels",
                        (
                            Value("later", b),
                            Value("later_dial", out[b]),
                            Value("earlier", a),
                            Value("earlier_dial", out[a]),
                        ),
                    )
                )
        return {k: out[k] for k in order}

    def _plausibility(self, notes):
        """Notes (and the PV > 0 check) on readings that are possible but doubtful."""
        if self.speeds.size == 2 or self.speeds.min() > 6.0:
            notes.append(
                Note(
                    "warning",
                    "no_low_shear",
                    "no reading at 6 rpm or below: fits rest on "
                    "high-speed readings; annular results may be inaccurate",
                    "speeds",
                )
            )
        self._check_600_300(notes)
        if self.mode == "cement" and self.speeds.max() > 300.0:
            notes.append(
                Note(
                    "warning",
                    "cement_above_300",
                    "cement/spacer readings above 300 rpm are outside API RP 10B-2 practice",
                    "speeds",
                )
            )
        self._field_value_notes(notes)

    def _check_600_300(self, notes):
        """θ600 > θ300 (PV > 0), and a warning when their ratio is unusual."""
        t600, t300 = self.reading(600), self.reading(300)
        if t600 is not None and t300 is not None:
            if t600 <= t300:
                raise InputError(
                    "600-rpm reading",
                    t600,
                    f"> the 300-rpm reading ({t300:g}): PV = θ600 − θ300 must be > 0",
                    problem="PV <= 0",
                )
            ratio = t600 / t300 if t300 > 0 else math.inf
            if ratio > 2.0 or ratio <= 1.05:
                notes.append(
                    Note(
                        "warning",
                        "ratio_600_300",
                        "θ600/θ300 = {ratio:.3g} is outside 1.05–2 "
                        "(power-law n outside about 0.07–1)",
                        "600/300 rpm",
                        (Value("ratio", float(ratio)),),
                    )
                )

    def _field_value_notes(self, notes):
        """Warnings on YP (negative, or above 3 PV) and on small or close 3/6-rpm readings."""
        try:
            pv, yp = self.pv, self.yp
        except InputError:
            pv = yp = None
        if pv is not None:
            shown = (Value("yp", yp, "stress"), Value("pv", pv, "viscosity"))
            if yp < 0:
                notes.append(Note("warning", "yp_negative", "YP = {yp:.3g} < 0", "YP", shown[:1]))
            elif yp / FIELD_STRESS > 3 * (pv / CENTIPOISE):  # field units: YP > 3 PV
                notes.append(
                    Note("warning", "yp_high", "YP ({yp:.3g}) > 3 × PV ({pv:.3g})", "YP", shown)
                )
        t6, t3 = self.reading(6), self.reading(3)
        if t6 is not None and t3 is not None and (t3 < 3 or t6 < 3 or t6 - t3 < 1):
            notes.append(
                Note(
                    "info",
                    "low_shear_uncertain",
                    "low-shear readings (θ6 = {theta6:g}, θ3 = {theta3:g}) are small or close: "
                    "LSYP and τy uncertain by about ±{uncertainty:.3g}",
                    "3/6 rpm",
                    (
                        Value("theta6", t6),
                        Value("theta3", t3),
                        # one dial degree, read as 1 lbf/100 ft² (the field convention)
                        Value("uncertainty", FIELD_STRESS, "stress"),
                    ),
                )
            )

    # ------------------------------------------------------------------ derived values
    def reading(self, rpm: float) -> float | None:
        """Dial reading at ``rpm`` [degree], or None if that speed was not read."""
        hit = np.flatnonzero(np.isclose(self.speeds, rpm, rtol=0, atol=1e-9))
        return float(self.dial[hit[0]]) if hit.size else None

    def _need(self, *rpms, what: str) -> list[float]:
        vals = [self.reading(r) for r in rpms]
        if any(v is None for v in vals):
            raise InputError(
                f"speeds [rpm] for {what}",
                [float(f"{s:g}") for s in self.speeds],
                "readings at " + " and ".join(f"{r:g}" for r in rpms) + " rpm",
                problem="missing reading",
            )
        return vals

    @property
    def shear_rate(self) -> np.ndarray:
        """Shear rate at the bob for each speed [1/s].

        Newtonian (eq. 1) by default; with ``shear_rate_correction="krieger"`` the finite-gap
        power-law value of :func:`krieger_shear_rate` (what the least-squares fits use; the
        API field estimates keep their printed Newtonian shear rates).
        """
        if self.shear_rate_correction == "krieger":
            return krieger_shear_rate(self.speeds, self.dial, self.geometry)[0]
        return self.speeds * self.geometry.shear_rate_per_rpm

    @property
    def shear_stress(self) -> np.ndarray:
        """Instrument shear stress for each reading [Pa] (θ·k₁k₂·spring factor)."""
        return self.dial * self.geometry.stress_per_reading

    @property
    def shear_rate_range(self) -> tuple[float, float]:
        """(lowest, highest) measured shear rate [1/s]."""
        g = self.shear_rate
        return float(g[0]), float(g[-1])

    def _pv_pair(self) -> tuple[float, float, float] | None:
        """(factor, θ_high, θ_low) of the PV definition that applies, or None."""
        t600, t300, t100 = self.reading(600), self.reading(300), self.reading(100)
        if t600 is not None and t300 is not None:
            return 1.0, t600, t300
        if self.mode == "cement" and t300 is not None and t100 is not None:
            return 1.5, t300, t100
        return None

    @property
    def pv_definition(self) -> str:
        """Which field definition :attr:`pv` uses."""
        pair = self._pv_pair()
        if pair is None:
            return "PV needs 600/300 rpm (or 300/100 rpm for cement)"
        if pair[0] == 1.0:
            return "PV = θ600 − θ300 (API RP 13B-1)"
        return "PV = 1.5(θ300 − θ100) (cement practice, from memory — calc/METHODS.md §1.4)"

    def _pv_dial(self) -> float:
        pair = self._pv_pair()
        if pair is None:
            self._need(600, 300, what="PV")
        factor, hi, lo = pair
        return factor * (hi - lo) * self.geometry.spring_factor

    @property
    def pv(self) -> float:
        """Plastic viscosity, field definition [Pa·s] (θ600 − θ300 read as cP)."""
        return self._pv_dial() * CENTIPOISE

    @property
    def yp(self) -> float:
        """Yield point YP = θ300 − PV, field definition [Pa] (read as lbf/100 ft²)."""
        (t300,) = self._need(300, what="YP")
        return (t300 * self.geometry.spring_factor - self._pv_dial()) * FIELD_STRESS

    @property
    def lsyp(self) -> float:
        """Low-shear yield point 2θ3 − θ6 [Pa] (read as lbf/100 ft²; Guo & Liu 2011 eq. 2.12)."""
        t6, t3 = self._need(6, 3, what="LSYP")
        return (2.0 * t3 - t6) * self.geometry.spring_factor * FIELD_STRESS

    @property
    def av(self) -> float:
        """Apparent viscosity θ600/2 [Pa·s] (read as cP; API RP 13B-1)."""
        (t600,) = self._need(600, what="AV")
        return 0.5 * t600 * self.geometry.spring_factor * CENTIPOISE

    @property
    def gels_si(self) -> dict[str, float]:
        """Gel strengths [Pa] by the field convention (reading read as lbf/100 ft²)."""
        return {k: v * self.geometry.spring_factor * FIELD_STRESS for k, v in self.gels.items()}

    @property
    def up_down_ratio(self) -> np.ndarray | None:
        """Ramp-up / ramp-down reading per speed (API RP 10B-2), None without ramps.

        A zero ramp-down reading with a zero ramp-up reading gives 1; with a non-zero ramp-up
        reading the ratio is reported as inf (the readings say the gel broke down completely).
        """
        if self.ramp_up is None:
            return None
        up, down = self.ramp_up, self.ramp_down
        safe = np.where(down > 0, down, 1.0)
        return np.where(down > 0, up / safe, np.where(up > 0, np.inf, 1.0))

    def to_table(self):
        """The readings as a :class:`~calc.rheology.table.RheometerTable` (shear rate, stress)."""
        return RheometerTable(self.shear_rate, stress=self.shear_stress, label=self.label)


#: Shear-rate conversions of a Couette viscometer: ``newtonian`` (eq. 1, the field practice) and
#: ``krieger`` (finite-gap power-law correction, :func:`krieger_shear_rate`).
SHEAR_RATE_CORRECTIONS = ("newtonian", "krieger")

#: The viscometer corrections and checks of this module, with how they were checked.
VISCOMETER_CORRECTIONS = MethodRegistry("viscometer correction")

#: Lowest local slope n' = d ln τ/d ln Ω the Krieger correction uses (below it the gap is
#: close to plugged and the power-law form does not apply; a choice made here).
KRIEGER_MIN_SLOPE = 0.1


def radius_ratio(geometry: ViscometerGeometry = STANDARD_GEOMETRY) -> float:
    """Rotor-to-bob radius ratio s = R_c/R_b of a Couette geometry [-].

    Recovered from the Newtonian factor of eq. (1): with a = (γ̇/N)/(4π/60) = s²/(s² − 1),
    s = √(a/(a − 1)).

    Examples
    --------
    The standard rotor and bob (R_c = 1.8415 cm, R_b = 1.7245 cm):

    >>> round(radius_ratio(STANDARD_GEOMETRY), 6), round(0.018415 / 0.017245, 6)
    (1.067846, 1.067846)
    """
    a = geometry.shear_rate_per_rpm / (4.0 * math.pi / 60.0)
    if a <= 1.0:
        raise InputError(
            "viscometer shear rate per rpm",
            geometry.shear_rate_per_rpm,
            f"> {4.0 * math.pi / 60.0:.6g} 1/s per rpm (a Couette gap)",
        )
    return math.sqrt(a / (a - 1.0))


@VISCOMETER_CORRECTIONS.register(
    "krieger",
    "finite-gap shear rate at the bob, 2Ω/[n'(1 − s^(−2/n'))], n' = d ln τ/d ln Ω",
    "Krieger & Elrod (1953) J. Appl. Phys. 24:134; Krieger (1968) Trans. Soc. Rheol. 12:5",
    status=Verification(
        "exact_solution",
        "tests: equals the analytical Couette solution of a power-law fluid (stress at the bob "
        "from the torque, rotor speed from integrating γ̇(r) across the gap) to 1e-12 for "
        "n = 0.3–1, and the Newtonian eq. (1) for n' = 1",
        (
            "exact only where the local flow curve is a power law; n' is limited below at 0.1 "
            "(near a plugged gap the form does not apply)",
            "the API field estimates keep their printed Newtonian shear rates",
        ),
    ),
)
def krieger_shear_rate(speeds, dial, geometry: ViscometerGeometry = STANDARD_GEOMETRY):
    """Finite-gap (Krieger) shear rate at the bob for each speed [1/s], and notes.

    For a fluid whose local flow curve is a power law, τ ∝ Ωⁿ' with n' = d ln τ/d ln Ω, the
    shear rate at the bob of a Couette cell with s = R_c/R_b is exactly

        γ̇_b = 2Ω / [n'(1 − s^(−2/n'))],     Ω = 2πN/60                          (K1)

    (Krieger & Elrod 1953; Krieger 1968).  For n' = 1 it is the Newtonian value 2Ωs²/(s² − 1)
    of eq. (1).  n' is taken from the readings by second-order finite differences of ln θ
    against ln N (one-sided at the ends), which is exact for a power law; it is limited below
    at :data:`KRIEGER_MIN_SLOPE` (a note says where).

    Parameters
    ----------
    speeds : array_like
        Rotor speeds [rpm], increasing.
    dial : array_like
        Dial readings [degree] at ``speeds``, all > 0.
    geometry : ViscometerGeometry
        Instrument (default the standard rotor/bob).

    Returns
    -------
    (numpy.ndarray, tuple of Note)
        Bob shear rates [1/s]; notes where n' was limited.

    References
    ----------
    Krieger, I.M. and Elrod, H. (1953) J. Appl. Phys. 24:134–136.  Krieger, I.M. (1968) Trans.
    Soc. Rheol. 12:5–11.  (Form K1 is the exact power-law solution of Couette flow; derived
    again in calc/METHODS.md §21.3.)

    Examples
    --------
    A power-law fluid with n = 0.5 read at 300 and 600 rpm (θ ∝ √N): the corrected rate is
    above the Newtonian one (1.7023·N):

    >>> g, _ = krieger_shear_rate([300.0, 600.0], [20.0, 20.0 * 2**0.5])
    >>> [round(float(x), 1) for x in g]
    [544.2, 1088.3]
    """
    n_rpm = np.asarray(as_float_array("viscometer speeds", speeds), dtype=float)
    theta = np.asarray(as_float_array("dial readings", dial), dtype=float)
    if n_rpm.shape != theta.shape or n_rpm.ndim != 1 or n_rpm.size < 2:
        raise InputError("dial readings", theta.size, f"{n_rpm.size} readings, two or more")
    for nm, arr in (("viscometer speed", n_rpm), ("dial reading", theta)):
        if np.any(~np.isfinite(arr)) or np.any(arr <= 0):
            i = int(np.flatnonzero(~np.isfinite(arr) | (arr <= 0))[0])
            raise InputError(
                f"{nm} at {n_rpm[i]:g} rpm" if nm == "dial reading" else nm,
                float(arr[i]),
                "> 0 for the Krieger shear-rate correction (it uses ln θ and ln N)",
            )
    if np.any(np.diff(n_rpm) <= 0):
        raise InputError("viscometer speeds", n_rpm.tolist(), "increasing, all different")
    s = radius_ratio(geometry)
    x, y = np.log(n_rpm), np.log(theta)
    slope = np.gradient(y, x, edge_order=2 if x.size > 2 else 1)
    notes = []
    low = slope < KRIEGER_MIN_SLOPE
    for i in np.flatnonzero(low):
        notes.append(
            Note(
                "warning",
                "krieger_slope_limited",
                "local flow-curve slope n' = {slope:.3g} at {speed:g} rpm is below {limit:g}: "
                "the finite-gap correction uses {limit:g} there (the gap is close to plugged)",
                f"{n_rpm[i]:g} rpm",
                (
                    Value("slope", float(slope[i])),
                    Value("speed", float(n_rpm[i])),
                    Value("limit", KRIEGER_MIN_SLOPE),
                ),
            )
        )
    npr = np.maximum(slope, KRIEGER_MIN_SLOPE)
    omega = 2.0 * math.pi * n_rpm / 60.0
    return 2.0 * omega / (npr * (1.0 - s ** (-2.0 / npr))), tuple(notes)


@VISCOMETER_CORRECTIONS.register(
    "gap_plug",
    "partly plugged gap when the stress at the rotor τ_b/s² is below τy",
    "Reiner & Riwlin (1927) Kolloid-Z. 43:1 (Bingham Couette flow)",
    status=Verification(
        "exact_solution",
        "tests: the test agrees with the plug radius of the analytical Bingham Couette "
        "(Reiner-Riwlin) solution for readings generated from it, both sides of the limit",
        ("τy is the fitted model's; the check says nothing about wall slip",),
    ),
)
def gap_plug(readings: ViscometerReadings, tau_y: float, rpm: float):
    """Stress at the bob and at the rotor [Pa] at ``rpm``, and whether the gap is part plug.

    In Couette flow the stress falls across the gap as τ(r) = τ_b(R_b/r)², so at the rotor
    τ_c = τ_b/s².  A yield-stress fluid is sheared only where τ > τ_y: when τ_c < τ_y the
    sheared layer ends at the plug radius R_p = R_b√(τ_b/τ_y) < R_c and the outer part of the
    gap turns as a rigid plug with the rotor (Reiner–Riwlin solution for a Bingham fluid).

    Parameters
    ----------
    readings : ViscometerReadings
        The check (instrument stress τ_b = θ·k₁k₂·f).
    tau_y : float
        Yield stress of the fitted model [Pa], ≥ 0.
    rpm : float
        A speed that was read.

    Returns
    -------
    (float, float, bool) or None
        (τ_b, τ_c, plugged); None when ``rpm`` was not read.

    References
    ----------
    Reiner, M. and Riwlin, R. (1927) Kolloid-Z. 43:1–5 (from memory, not checked against the
    source; the stress distribution τ ∝ 1/r² is the torque balance of any Couette flow).

    Examples
    --------
    θ3 = 7° is 3.57 Pa at the bob and 3.13 Pa at the rotor: below a τy of 3.5 Pa, so the
    outer part of the gap is a plug:

    >>> r = ViscometerReadings.from_mapping({600: 56, 300: 37, 6: 8, 3: 7})
    >>> tb, tc, plugged = gap_plug(r, 3.5, 3)
    >>> round(tb, 3), round(tc, 3), plugged
    (3.575, 3.135, True)
    """
    ty = float(check_finite("yield stress", tau_y, "Pa"))
    if ty < 0:
        raise InputError("yield stress", ty, ">= 0 Pa")
    theta = readings.reading(rpm)
    if theta is None:
        return None
    tb = theta * readings.geometry.stress_per_reading
    tc = tb / radius_ratio(readings.geometry) ** 2
    return tb, tc, bool(ty > 0 and tc < ty)


def gap_plug_notes(
    readings: ViscometerReadings, tau_y: float, speeds=(3.0, 6.0)
) -> tuple[Note, ...]:
    """Warnings where the low-speed readings show a partly plugged gap (:func:`gap_plug`).

    A plugged gap means the reading is not a flow-curve point at the Newtonian shear rate the
    fits give it, so τy taken from those readings (and the annular loss and the surge floor
    that rest on it) are uncertain.

    Examples
    --------
    >>> r = ViscometerReadings.from_mapping({600: 56, 300: 37, 6: 8, 3: 7})
    >>> [n.subject for n in gap_plug_notes(r, 3.5)]
    ['3 rpm']
    >>> gap_plug_notes(r, 1.0)
    ()
    """
    out = []
    for rpm in speeds:
        got = gap_plug(readings, tau_y, rpm)
        if got is None or not got[2]:
            continue
        tb, tc, _ = got
        out.append(
            Note(
                "warning",
                "gap_plug",
                "at {speed:g} rpm the stress falls from {tau_bob:.3g} at the bob to "
                "{tau_rotor:.3g} at the rotor, below τy = {tau_y:.3g}: part of the gap turns "
                "as a plug, so the low-shear readings under-represent the fluid's shear rate "
                "and τy (and the annular loss and surge floor that rest on it) are uncertain",
                f"{rpm:g} rpm",
                (
                    Value("speed", float(rpm)),
                    Value("tau_bob", tb, "stress"),
                    Value("tau_rotor", tc, "stress"),
                    Value("tau_y", float(tau_y), "stress"),
                ),
            )
        )
    return tuple(out)
