"""Result and method plumbing for :mod:`calc.flow`: the result dataclass, the method registry.

Methods register a :class:`FlowMethod` in :data:`FRICTION_LAWS` (a
:class:`calc.registry.MethodRegistry`).  Each method turns a :class:`FlowCase` (the broadcast,
validated, flattened inputs) into a :class:`MethodState` (Reynolds number, limits, regime,
Fanning friction factor, wall shear rate and stress); :mod:`calc.flow.core` adds the
eccentricity correction, the gradient, the critical velocity and the notes.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field

import numpy as np

from calc.flow.area import cross_section_area
from calc.notes import Note
from calc.registry import MethodRegistry
from calc.values import Value

__all__ = [
    "CONSTANT_SETS",
    "FRICTION_LAWS",
    "LAMINAR",
    "REGIME_LABELS",
    "TRANSITIONAL",
    "TURBULENT",
    "FlowCase",
    "FlowMethod",
    "FlowResult",
    "MethodState",
    "classify_regime",
    "regime_label",
]

LAMINAR, TRANSITIONAL, TURBULENT = 0, 1, 2
REGIME_LABELS = ("laminar", "transitional", "turbulent")

#: Friction laws: the registered pipe/annulus pressure-gradient methods (``method="..."`` of
#: :func:`~calc.flow.pipe_flow`; a hydraulics method of :mod:`calc.hydraulics_method` names one).
FRICTION_LAWS = MethodRegistry("friction law")


def regime_label(regime):
    """Text for regime codes: 0 laminar, 1 transitional, 2 turbulent (scalar or array).

    Examples
    --------
    >>> regime_label(1)
    'transitional'
    >>> regime_label(np.array([0, 2])).tolist()
    ['laminar', 'turbulent']
    """
    codes = np.asarray(regime, dtype=int)
    labels = np.array(REGIME_LABELS, dtype=object)[codes]
    return str(labels) if codes.ndim == 0 else labels


def classify_regime(reynolds, laminar_limit, turbulent_limit):
    """0 where Re < laminar limit, 2 where Re ≥ turbulent limit, 1 between (int array).

    Examples
    --------
    >>> classify_regime(np.array([1000.0, 2100.0, 3000.0, 4000.0]), 2100.0, 4000.0).tolist()
    [0, 1, 1, 2]
    """
    re = np.asarray(reynolds)
    out = np.full(re.shape, TRANSITIONAL, dtype=int)
    out[re < laminar_limit] = LAMINAR
    out[re >= turbulent_limit] = TURBULENT
    return out


#: Constant sets a friction law may be computed with: ``"exact"`` (field constants derived from
#: SI, the default) or ``"as_printed"`` (the rounded constants printed in the published method,
#: so an auditor can reproduce a printed worked example to its last digit; calc/METHODS.md §7.9).
CONSTANT_SETS = ("exact", "as_printed")


@dataclass(frozen=True)
class FlowCase:
    """Validated, broadcast and flattened (1-D) inputs of one call, SI."""

    geometry: str  # "pipe" or "annulus"
    q: np.ndarray  # m³/s
    d_outer: np.ndarray  # m: pipe ID, or hole/casing ID
    d_inner: np.ndarray  # m: 0 for pipe, pipe OD for annulus
    density: np.ndarray  # kg/m³
    tau_y: np.ndarray  # Pa
    k: np.ndarray  # Pa·sⁿ
    n: np.ndarray  # -
    roughness: np.ndarray  # m
    eccentricity: np.ndarray  # -
    constants: str = "exact"  # field-constant set (calc.hydraulics_method.CONSTANT_SETS)

    @property
    def is_annulus(self) -> bool:
        return self.geometry == "annulus"

    @property
    def area(self) -> np.ndarray:
        return cross_section_area(self.d_outer, self.d_inner)

    @property
    def d_h(self) -> np.ndarray:
        """Hydraulic diameter: D (pipe), D2 - D1 (annulus) [m]."""
        return self.d_outer - self.d_inner

    @property
    def velocity(self) -> np.ndarray:
        return self.q / self.area


@dataclass(frozen=True)
class MethodState:
    """What a method computes for a case at the case's velocity (1-D arrays)."""

    reynolds: np.ndarray
    laminar_limit: np.ndarray
    turbulent_limit: np.ndarray
    regime: np.ndarray
    friction_factor: np.ndarray  # Fanning, concentric
    wall_shear_rate: np.ndarray  # 1/s
    wall_shear_stress: np.ndarray  # Pa, = fρV²/2
    notes: tuple[Note, ...] = ()
    #: factor on 2fρV²/D_h (1 but where a printed field constant rescales the gradient)
    gradient_scale: np.ndarray | float = 1.0
    #: factor on the reported mean velocity Q/A (1 but where the method's printed velocity
    #: formula, e.g. 0.408Q/D², is reported as it prints it)
    velocity_scale: np.ndarray | float = 1.0


@dataclass(frozen=True)
class FlowMethod:
    """A registered method: label with edition, the evaluation and its Reynolds number.

    ``evaluate(case)`` → :class:`MethodState`; ``reynolds(case, v)`` → the method's Re at
    velocity ``v``; ``laminar_limit(case)`` → the Re where laminar flow ends;
    ``check(case)`` raises :class:`calc.errors.InputError` for inputs the method cannot take;
    ``critical_velocity(case)``, if given, replaces the generic Re(v) = limit solve.
    ``limit_from_distinct``: the laminar limit depends on the (geometry, fluid) combination
    only, not on the rate, and costs a solve; it is then computed once per distinct
    combination and passed as ``evaluate(case, laminar_limit=...)``.
    """

    label: str
    evaluate: Callable[[FlowCase], MethodState]
    reynolds: Callable[[FlowCase, np.ndarray], np.ndarray]
    laminar_limit: Callable[[FlowCase], np.ndarray]
    check: Callable[[FlowCase], None]
    uses_roughness: bool = False
    critical_velocity: Callable[[FlowCase], np.ndarray] | None = None
    limit_from_distinct: bool = False
    #: field-constant sets the law can be computed with (calc/METHODS.md §7.9)
    constant_sets: tuple[str, ...] = ("exact",)


@dataclass(frozen=True)
class FlowResult:
    """Pressure gradient in a pipe or annulus, with the intermediates for a hand check.

    Arrays have the broadcast shape of the inputs; for all-scalar input they are Python
    floats (``regime`` an int).  SI units.

    Attributes
    ----------
    method, method_label : str
        Registry name and the method with its edition and source.
    geometry : str
        ``"pipe"`` or ``"annulus"``.
    velocity : mean velocity [m/s]
    hydraulic_diameter : D or D2 - D1 [m]
    wall_shear_rate : the method's wall shear rate [1/s]
    wall_shear_stress : mean wall shear stress of the concentric geometry, fρV²/2 [Pa]
    reynolds : the method's own Reynolds number [-]
    reynolds_laminar_limit, reynolds_turbulent_limit : the method's bounds [-]
    regime : 0 laminar, 1 transitional, 2 turbulent (see :attr:`regime_label`)
    friction_factor : Fanning friction factor, concentric [-]
    gradient : frictional pressure gradient -dp/dL, eccentricity applied [Pa/m]
    critical_velocity : velocity where the method's Re reaches its laminar limit [m/s]
    critical_flow_rate : critical_velocity × flow area [m³/s]
    eccentricity_factor : (dp/dL)_eccentric/(dp/dL)_concentric [-] (1 for pipes)
    notes : tuple of :class:`calc.errors.Note`
    rotation_factor : (dp/dL)_rotating/(dp/dL)_not rotating [-] (1 for pipes and without
        rotation; :func:`calc.flow.rotation.rotation_factor`), included in ``gradient``
    """

    method: str
    method_label: str
    geometry: str
    velocity: float | np.ndarray
    hydraulic_diameter: float | np.ndarray
    wall_shear_rate: float | np.ndarray
    wall_shear_stress: float | np.ndarray
    reynolds: float | np.ndarray
    reynolds_laminar_limit: float | np.ndarray
    reynolds_turbulent_limit: float | np.ndarray
    regime: int | np.ndarray
    friction_factor: float | np.ndarray
    gradient: float | np.ndarray
    critical_velocity: float | np.ndarray
    critical_flow_rate: float | np.ndarray
    eccentricity_factor: float | np.ndarray
    notes: tuple[Note, ...] = field(default=())
    rotation_factor: float | np.ndarray = 1.0

    @property
    def regime_label(self):
        """``"laminar"``, ``"transitional"`` or ``"turbulent"`` (array of them for arrays)."""
        return regime_label(self.regime)

    @property
    def darcy_friction_factor(self):
        """Darcy friction factor 4f [-]."""
        return 4.0 * self.friction_factor


def count_note(mask, level, code, what, subject="", values=()):
    """One :class:`Note` for the elements where ``mask`` holds, or ``None`` if none do.

    The text reads "<what> ({hits} of {evaluations} evaluations)" so a 10,000-rate sweep gives
    one note; ``what`` may name fields of ``values``.

    >>> str(count_note(np.array([True, False, True]), "info", "demo", "slow flow", "pipe"))
    'INFO [pipe]: slow flow (2 of 3 evaluations).'
    """
    m = np.asarray(mask, dtype=bool)
    hits = int(np.count_nonzero(m))
    if hits == 0:
        return None
    if m.size == 1:
        return Note(level, code, f"{what}.", subject, tuple(values))
    counts = (Value("hits", float(hits)), Value("evaluations", float(m.size)))
    text = f"{what} ({{hits:.0f}} of {{evaluations:.0f}} evaluations)."
    return Note(level, code, text, subject, (*values, *counts))
