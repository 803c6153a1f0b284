"""The steady surge/swab solver shared by every entry point (closed and open strings).

Steady-state method after Burkhardt (1961): the annulus is treated as a stationary-wall flow at
the *effective* velocity

.. math:: V_e = \\frac{Q_a}{A_a} + K_c V_p,\\qquad
          Q_a = V_p\\frac{\\pi}{4}D_1^2 - q_{rel}

(V_p pipe speed, D1 the local pipe OD, K_c the clinging constant, q_rel the flow entering an
open pipe relative to it; closed end q_rel = 0).  Any :mod:`calc.flow` method gives the
friction gradient at V_e in each annular interval.  Open end: q_rel is found by a bracketed,
vectorised root search so that the annulus and the bore (friction at the velocity relative to
the pipe wall, plus the bit nozzles) give the same pressure change at the bit.

The arrays the solver works on (:class:`SurgePaths`) are built from a well
(:func:`paths_from_well`) or from flat per-interval arguments (:func:`paths_flat`); the shared
helpers here are public names of this internal module for :mod:`calc.surge.pressure` and
:mod:`calc.surge.limits` (the package exports only :data:`PEAK_FACTOR`).

References
----------
Burkhardt, J.A. (1961) Wellbore pressure surges produced by pipe movement. JPT 13(6), 595-605,
SPE-1546-G.  Guo, B. & Liu, G. (2011) Applied Drilling Circulation Systems, ch. 2.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.bit import DEFAULT_DISCHARGE_COEFFICIENT, bit_pressure_drop
from calc.errors import InputError, check_choice, check_nonnegative, check_positive
from calc.flow import FlowResult, annulus_flow, cross_section_area, pipe_flow
from calc.flow.solvers import itp_solve
from calc.hydraulics_method import resolve_method
from calc.notes import Note
from calc.surge.clinging import check_clinging, clinging_constant_blended, transition_weight
from calc.values import Value

__all__ = [
    "DIRECTION_SIGN",
    "PEAK_FACTOR",
    "AnnulusState",
    "SurgePaths",
    "annulus_state",
    "bore_pressure",
    "check_peak",
    "check_trip",
    "method_text",
    "paths_flat",
    "paths_from_well",
    "solve",
    "string_end_for",
]

#: Ratio of peak to average stand speed used by default, 1.5 (from memory, not yet checked
#: against the source — calc/METHODS.md §11.5).  Set ``peak_factor=1`` when the speed given is
#: already the peak speed.
PEAK_FACTOR = 1.5

#: Sign of the pressure change per trip direction: surge (+) running in, swab (−) pulling out.
DIRECTION_SIGN = {"running": 1.0, "pulling": -1.0}

#: Clinging constants: the Burkhardt fits by name, or given K_c values.
Clinging = str | float | np.ndarray


def string_end_for(well, string_end: str) -> tuple[str, tuple[Note, ...]]:
    """The string end a trip is computed for ("closed"/"open"; ``"auto"``: closed with a float
    valve) and a warning when an open end is asked for a string with a float."""
    end = check_choice("string end", string_end, ("closed", "open", "auto"))
    has_float = any(c.float_valve for c in well.string.components)
    if end == "auto":
        return ("closed" if has_float else "open"), ()
    if end == "open" and has_float:
        return end, (
            Note(
                "warning",
                "open_end_with_float",
                "open-ended trip computed although the string has a float valve (it would "
                "close when running in).",
                "string end",
            ),
        )
    return end, ()


@dataclass(frozen=True, eq=False)
class SurgePaths:
    """The arrays the surge solver works on (SI): annular intervals along the last axis, the
    bore (open end only) and the nozzles.  Built from a well (:func:`paths_from_well`) or from
    flat arguments (:func:`paths_flat`).

    d2, d1, length     hole/casing ID, pipe OD, interval length per annular interval [m]
    rho                mud density [kg/m³]
    ann_params, pipe_params   (τ_y [Pa], K [Pa·sⁿ], n [-]) in the annulus and the bore
    method             friction method of :mod:`calc.flow`
    ecc                eccentricity [-] (scalar or per interval)
    bore_d, bore_length   bore diameter and length per string interval [m] (open end)
    tfa                bit nozzle total flow area [m²] (None: open pipe, no nozzles)
    cd                 nozzle discharge coefficient [-]
    """

    d2: np.ndarray
    d1: np.ndarray
    length: np.ndarray
    rho: float
    ann_params: tuple[float, float, float]
    pipe_params: tuple[float, float, float]
    method: str
    ecc: float | np.ndarray
    bore_d: np.ndarray | None = None
    bore_length: np.ndarray | None = None
    tfa: float | None = None
    cd: float = DEFAULT_DISCHARGE_COEFFICIENT

    @property
    def area_a(self):
        """Annular flow area per interval [m²]."""
        return cross_section_area(self.d2, self.d1)

    @property
    def area_o(self):
        """Pipe cross-section (closed-end displacement) per interval [m²]."""
        return cross_section_area(self.d1)


@dataclass(frozen=True, eq=False)
class AnnulusState:
    """The annulus at given pipe speeds (SI; speed axes + interval axis).

    relative_inflow    q_rel, flow entering the open pipe relative to it [m³/s] (speed axes)
    clinging           K_c per interval [-]
    effective_rate     q_e = V_p·πD1²/4 − q_rel + K_c·V_p·A_a [m³/s]
    gradient           friction gradient at q_e [Pa/m] (0 where nothing moves)
    regime             0 laminar, 1 transitional, 2 turbulent (0 where nothing moves)
    flow               the :func:`calc.flow.annulus_flow` result at q_e
    """

    relative_inflow: np.ndarray
    clinging: np.ndarray
    effective_rate: np.ndarray
    gradient: np.ndarray
    regime: np.ndarray
    flow: FlowResult


def _one_density(rho) -> float:
    rho = np.asarray(rho, dtype=float)
    if rho.ndim:
        raise InputError("fluid density", "an array", "one density for surge and swab")
    return float(check_positive("density", rho, "kg/m³"))


def paths_from_well(well, fluid, method: str | None, eccentricity) -> SurgePaths:
    """The solver's arrays from a well's annular and string intervals and its bit; ``method``
    a hydraulics method (None: the default), whose friction law the solver uses."""
    method = resolve_method(method).friction
    iv = well.flow_intervals()
    a, s = iv.annulus, iv.string
    return SurgePaths(
        d2=np.asarray(a.outer_diameter, dtype=float),
        d1=np.asarray(a.inner_diameter, dtype=float),
        length=np.asarray(a.length, dtype=float),
        rho=_one_density(fluid.density),
        ann_params=fluid.annulus_parameters,
        pipe_params=fluid.pipe_parameters,
        method=method,
        ecc=eccentricity,
        bore_d=np.asarray(s.outer_diameter, dtype=float),
        bore_length=np.asarray(s.length, dtype=float),
        tfa=well.bit.tfa,
        cd=well.bit.discharge_coefficient,
    )


def _annulus_gradient(p: SurgePaths, q_e):
    """Friction gradient [Pa/m] and regime at the effective rates; no movement, no friction."""
    ty, k, n = p.ann_params
    fr = annulus_flow(
        np.maximum(q_e, 1e-12), p.d2, p.d1, density=p.rho, tau_y=ty, k=k, n=n,
        method=p.method, eccentricity=p.ecc,
    )  # fmt: skip
    moving = np.asarray(q_e) > 0
    grad = np.where(moving, np.asarray(fr.gradient, dtype=float), 0.0)
    return grad, np.where(moving, np.asarray(fr.regime), 0), fr


def bore_pressure(p: SurgePaths, q_rel):
    """Bore friction at the relative flow plus the nozzle drop [Pa] (shape of q_rel)."""
    ty, k, n = p.pipe_params
    q = np.maximum(np.asarray(q_rel, dtype=float), 1e-12)
    fr = pipe_flow(q[..., None], p.bore_d, density=p.rho, tau_y=ty, k=k, n=n,
                   method=p.method)  # fmt: skip
    total = np.sum(np.asarray(fr.gradient) * p.bore_length, axis=-1)
    if p.tfa is not None:
        total = total + np.asarray(bit_pressure_drop(q, p.rho, p.tfa, p.cd))
    return total


def annulus_state(p: SurgePaths, vp, q_rel, clinging: Clinging) -> AnnulusState:
    """The annulus at pipe speeds ``vp`` [m/s] and relative inflow ``q_rel`` [m³/s], with the
    regime-dependent Burkhardt fit.

    The one place of the effective-rate formula q_e = V_p·πD1²/4 − q_rel + K_c·V_p·A_a."""
    q_disp = vp[..., None] * p.area_o - np.asarray(q_rel)[..., None]
    drag = vp[..., None] * p.area_a
    if isinstance(clinging, str):
        # the fits blended across the transitional zone of the flow at the laminar K_c
        # (calc.surge.clinging.clinging_constant_blended): continuous in the pipe speed
        kc = np.broadcast_to(clinging_constant_blended(p.d1, p.d2, 0.0), q_disp.shape)
        grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
        w = np.where(
            np.asarray(q_disp + kc * drag) > 0,
            transition_weight(fr.reynolds, fr.reynolds_laminar_limit, fr.reynolds_turbulent_limit),
            0.0,
        )
        if np.any(w > 0):
            kc = np.asarray(clinging_constant_blended(p.d1, p.d2, w))
            grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
    else:
        kc = np.broadcast_to(np.asarray(clinging, dtype=float), q_disp.shape)
        grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
    return AnnulusState(
        relative_inflow=np.asarray(q_rel),
        clinging=kc,
        effective_rate=q_disp + kc * drag,
        gradient=grad,
        regime=regime,
        flow=fr,
    )


def solve(p: SurgePaths, vp, end: str, clinging: Clinging, iterations: int = 50) -> AnnulusState:
    """Annulus state for pipe speeds ``vp`` [m/s] (any shape), closed or open end.

    Open end: q_rel in [0, V_p·min(πD1²/4)] from bore(q_rel) = annulus(q_rel), an increasing
    residual, by the bracketed ITP search of :func:`calc.flow.solvers.itp_solve` to the
    precision of ``iterations`` bisection steps (bracket ≤ 2⁻ⁱᵗᵉʳᵃᵗⁱᵒⁿˢ of the start);
    bisection's worst case, usually far fewer residual evaluations."""
    vp = np.asarray(vp, dtype=float)
    if end == "closed":
        q_rel = np.zeros_like(vp)
    else:
        q_max = vp * float(np.min(p.area_o))

        def f(qr):
            grad = annulus_state(p, vp, qr, clinging).gradient
            return bore_pressure(p, qr) - np.sum(grad * p.length, axis=-1)

        q_rel = itp_solve(f, np.zeros_like(vp), q_max, rtol=2.0 ** -(iterations + 1))
    return annulus_state(p, vp, q_rel, clinging)


def method_text(clinging: Clinging, method: str) -> str:
    """Method label of a surge result: the Burkhardt model, which K_c, which friction method."""
    kc = "fits (Guo & Liu 2011)" if isinstance(clinging, str) else "given"
    return f"Burkhardt (1961) steady surge; clinging {kc}; friction {method}"


def check_trip(direction, speed, peak_factor, clinging):
    """Validated (direction, average speed [m/s], peak factor, clinging) of a surge call."""
    direction = check_choice("direction", direction, ("running", "pulling"))
    v = check_nonnegative("trip speed", speed, "m/s")
    return direction, v, check_peak(peak_factor), check_clinging(clinging)


def check_peak(peak_factor) -> float:
    """A peak factor (peak over average speed), ≥ 1."""
    pf = float(check_positive("peak factor", peak_factor))
    if pf < 1.0:
        raise InputError("peak factor", pf, ">= 1 (peak over average speed)")
    return pf


def paths_flat(d_hole, d_pipe, length, *, density, tau_y, k, n, d_bore, tfa, cd,
                bore_parameters, string_end, method, eccentricity):  # fmt: skip
    """Flat arguments → (:class:`SurgePaths`, string end, geometry-was-scalar); ``method`` a
    hydraulics method (None: the default), whose friction law the solver uses."""
    method = resolve_method(method).friction
    end = check_choice("string end", string_end, ("closed", "open"))
    geo = [
        check_positive("hole diameter d_hole", d_hole, "m"),
        check_positive("pipe outside diameter d_pipe", d_pipe, "m"),
        check_nonnegative("interval length", length, "m"),
    ]
    if end == "open":
        if d_bore is None:
            raise InputError("bore diameter d_bore", None, "the pipe bore for an open string")
        geo.append(check_positive("bore diameter d_bore", d_bore, "m"))
    try:
        geo = np.broadcast_arrays(*geo)
    except ValueError as exc:
        shapes = " and ".join(str(np.shape(g)) for g in geo)
        raise InputError("interval geometry", shapes, "shapes that broadcast together") from exc
    if geo[0].ndim > 1:
        raise InputError("interval geometry", f"{geo[0].ndim}-D arrays", "one value or a 1-D array")
    scalar = geo[0].ndim == 0
    d2, d1, ln, *bore = (np.atleast_1d(g).astype(float) for g in geo)
    if np.any(d1 >= d2):
        i = int(np.flatnonzero(d1 >= d2)[0])
        raise InputError(
            "pipe outside diameter d_pipe", float(d1[i]), "< hole diameter {hole}",
            kind="diameter", values=(Value("hole", float(d2[i]), "diameter"),),
        )  # fmt: skip
    if bore and np.any(bore[0] >= d1):
        i = int(np.flatnonzero(bore[0] >= d1)[0])
        raise InputError(
            "bore diameter d_bore", float(bore[0][i]), "< pipe OD {pipe}",
            kind="diameter", values=(Value("pipe", float(d1[i]), "diameter"),),
        )  # fmt: skip
    ann = []
    for name, value, check in (
        ("yield stress tau_y", tau_y, check_nonnegative),
        ("consistency k", k, check_positive),
        ("flow behaviour index n", n, check_positive),
    ):
        if np.ndim(value):
            raise InputError(name, "an array", "one value (one fluid for surge and swab)")
        ann.append(float(check(name, value)))
    pipe = tuple(ann) if bore_parameters is None else tuple(float(x) for x in bore_parameters)
    tfa_v = None if tfa is None or end == "closed" else float(check_positive("TFA", tfa, "m²"))
    paths = SurgePaths(
        d2=d2, d1=d1, length=ln, rho=_one_density(density), ann_params=tuple(ann),
        pipe_params=pipe, method=method, ecc=eccentricity,
        bore_d=bore[0] if bore else None, bore_length=ln if bore else None, tfa=tfa_v, cd=cd,
    )  # fmt: skip
    return paths, end, scalar
