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

The arrays the solver works on (:class:`_Paths`) are built from a well
(:func:`_paths_from_well`) or from flat per-interval arguments (:func:`_paths_flat`).

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
from calc.flow import annulus_flow, cross_section_area, pipe_flow
from calc.flow.solvers import itp_solve
from calc.notes import Note
from calc.surge.clinging import _check_clinging, clinging_constant
from calc.units import from_si, unit_for
from calc.units import label as unit_label

__all__ = ["PEAK_FACTOR"]

#: Ratio of peak to average stand speed used by default, 1.5 (from memory, unverified —
#: METHODS §8).  Set ``peak_factor=1`` when the speed given is already the peak speed.
PEAK_FACTOR = 1.5

_SIGN = {"running": 1.0, "pulling": -1.0}


def _string_end(well, string_end):
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
class _Paths:
    """The arrays the surge solver works on: annular intervals along the last axis, the bore
    (open end only) and the nozzles.  Built from a well (:func:`_paths_from_well`) or from
    flat arguments (:func:`interval_surge`, :func:`trip_speed_limit`)."""

    d2: np.ndarray
    d1: np.ndarray
    length: np.ndarray
    rho: float
    ann_params: tuple
    pipe_params: tuple
    method: str
    ecc: object
    bore_d: np.ndarray | None = None
    bore_length: np.ndarray | None = None
    tfa: float | None = None
    cd: float = DEFAULT_DISCHARGE_COEFFICIENT

    @property
    def area_a(self):
        return cross_section_area(self.d2, self.d1)

    @property
    def area_o(self):
        return cross_section_area(self.d1)


def _one_density(rho) -> float:
    rho = np.asarray(rho, dtype=float)
    if rho.ndim:
        raise InputError("fluid density", "an array", "one density for surge and swab")
    return float(check_positive("density", rho, "kg/m³"))


# Interval names with their MD range in a unit system's depth unit (moved here from the former
# calc.circulation._well_link, which no longer builds display text; to be replaced by the
# rows' spans, calc.geometry.FlowIntervals.spans(), worded by the faces).
def _depth_span(top: float, bottom: float, system: str = "oilfield") -> str:
    u = unit_for("depth", system)
    a, b = (float(from_si(float(x), u)) for x in (top, bottom))
    digits = 0 if u == "ft" else 1
    return f"MD {a:,.{digits}f}-{b:,.{digits}f} {unit_label(u)}"


def _row_names(iv, path: str, system: str = "oilfield") -> tuple[str, ...]:
    out = []
    for comp, sec, tj, top, bot in zip(
        iv.component, iv.section, iv.is_tool_joint, iv.top_md, iv.bottom_md, strict=True
    ):
        part = f"{comp} tool joints" if tj else str(comp)
        where = f"{part} in {sec}" if path == "annulus" else part
        out.append(f"{where}, {_depth_span(top, bot, system)}")
    return tuple(out)


def _paths_from_well(well, fluid, method, eccentricity) -> tuple[_Paths, object, tuple]:
    iv = well.flow_intervals()
    a, s = iv.annulus, iv.string
    names = _row_names(a, "annulus")
    p = _Paths(
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
    return p, a, names


def _annulus_gradient(p: _Paths, q_e):
    """Friction gradient [Pa/m] and regime at the effective rates; no movement, no friction."""
    ty, k, n = p.ann_params
    fr = annulus_flow(
        np.maximum(q_e, 1e-12), p.d2, p.d1, density=p.rho, tau_y=ty, k=k, n=n,
        method=p.method, eccentricity=p.ecc,
    )  # fmt: skip
    moving = np.asarray(q_e) > 0
    grad = np.where(moving, np.asarray(fr.gradient, dtype=float), 0.0)
    return grad, np.where(moving, np.asarray(fr.regime), 0), fr


def _bore_pressure(p: _Paths, q_rel):
    """Bore friction at the relative flow plus the nozzle drop [Pa] (shape of q_rel)."""
    ty, k, n = p.pipe_params
    q = np.maximum(np.asarray(q_rel, dtype=float), 1e-12)
    fr = pipe_flow(q[..., None], p.bore_d, density=p.rho, tau_y=ty, k=k, n=n,
                   method=p.method)  # fmt: skip
    total = np.sum(np.asarray(fr.gradient) * p.bore_length, axis=-1)
    if p.tfa is not None:
        total = total + np.asarray(bit_pressure_drop(q, p.rho, p.tfa, p.cd))
    return total


def _annulus_state(p: _Paths, vp, q_rel, clinging):
    """(K_c, q_e, gradient, regime, FlowResult) with the regime-dependent Burkhardt fit.

    The one place of the effective-rate formula q_e = V_p·πD1²/4 − q_rel + K_c·V_p·A_a."""
    q_disp = vp[..., None] * p.area_o - np.asarray(q_rel)[..., None]
    drag = vp[..., None] * p.area_a
    if isinstance(clinging, str):
        kc = np.broadcast_to(clinging_constant(p.d1, p.d2, "laminar"), q_disp.shape)
        grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
        turb = regime == 2
        if np.any(turb):
            kc = np.asarray(clinging_constant(p.d1, p.d2, turb))
            grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
    else:
        kc = np.broadcast_to(np.asarray(clinging, dtype=float), q_disp.shape)
        grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
    return kc, q_disp + kc * drag, grad, regime, fr


def _solve(p: _Paths, vp, end, clinging, iterations=50):
    """Annulus state for pipe speeds ``vp`` (any shape), closed or open end.

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
            _, _, grad, _, _ = _annulus_state(p, vp, qr, clinging)
            return _bore_pressure(p, qr) - np.sum(grad * p.length, axis=-1)

        q_rel = itp_solve(f, np.zeros_like(vp), q_max, rtol=2.0 ** -(iterations + 1))
    return q_rel, *_annulus_state(p, vp, q_rel, clinging)


def _method_text(clinging, method: str) -> str:
    """Method label of a surge result: the Burkhardt model, which K_c, which friction method."""
    kc = "fits (Guo & Liu 2011)" if isinstance(clinging, str) else "given"
    return f"Burkhardt (1961) steady surge; clinging {kc}; friction {method}"


def _check_trip(direction, speed, peak_factor, clinging):
    """Validated (direction, average speed [m/s], peak factor, clinging) of a surge call."""
    direction = check_choice("direction", direction, ("running", "pulling"))
    v = check_nonnegative("trip speed", speed, "m/s")
    return direction, v, _check_peak(peak_factor), _check_clinging(clinging)


def _check_peak(peak_factor) -> float:
    pf = float(check_positive("peak factor", peak_factor))
    if pf < 1.0:
        raise InputError("peak factor", pf, ">= 1 (peak over average speed)")
    return pf


def _paths_flat(d_hole, d_pipe, length, *, density, tau_y, k, n, d_bore, tfa, cd,
                bore_parameters, string_end, method, eccentricity):  # fmt: skip
    """Flat arguments → (:class:`_Paths`, string end, geometry-was-scalar)."""
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
        raise InputError("pipe outside diameter d_pipe", d1[i], f"< hole diameter ({d2[i]:.6g} m)")
    if bore and np.any(bore[0] >= d1):
        i = int(np.flatnonzero(bore[0] >= d1)[0])
        raise InputError("bore diameter d_bore", bore[0][i], f"< pipe OD ({d1[i]:.6g} m)")
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
    paths = _Paths(
        d2=d2, d1=d1, length=ln, rho=_one_density(density), ann_params=tuple(ann),
        pipe_params=pipe, method=method, ecc=eccentricity,
        bore_d=bore[0] if bore else None, bore_length=ln if bore else None, tfa=tfa_v, cd=cd,
    )  # fmt: skip
    return paths, end, scalar
