"""Public entry points: :func:`pipe_flow`, :func:`annulus_flow`, :func:`critical_flow_rate`.

Inputs are validated and broadcast here, the friction law is resolved through
:data:`calc.flow.result.FRICTION_LAWS`, and the eccentricity correction, the gradient, the
critical velocity and the notes are added to the method's state.
"""

from __future__ import annotations

import numpy as np

from calc.errors import (
    InputError,
    check_choice,
    check_less,
    check_nonnegative,
    check_positive,
    check_range,
)
from calc.flow.distinct import distinct_combinations
from calc.flow.eccentricity import VALIDITY, eccentricity_factor
from calc.flow.result import (
    CONSTANT_SETS,
    FRICTION_LAWS,
    LAMINAR,
    TRANSITIONAL,
    FlowCase,
    FlowMethod,
    FlowResult,
    MethodState,
    count_note,
)
from calc.flow.rotation import VALIDITY as ROTATION_VALIDITY
from calc.flow.rotation import check_rpm, outside_validity, rotation_factor
from calc.flow.solvers import solve_positive
from calc.registry import MethodInfo
from calc.values import Value

__all__ = [
    "DEFAULT_FRICTION_LAW",
    "annulus_flow",
    "critical_flow_rate",
    "list_friction_laws",
    "pipe_flow",
]

#: The friction law used when none is named (that of the default hydraulics method,
#: :data:`calc.hydraulics_method.DEFAULT_METHOD`; a test keeps the two together).
DEFAULT_FRICTION_LAW = "api13d_2010_hb"

#: Flow rate [m³/s] that seeds the critical-velocity solve (its start guess only: the critical
#: velocity depends on the geometry and the fluid, not on q).
NOMINAL_RATE = 1e-3
#: The inputs the critical velocity depends on.
_CRITICAL_INPUTS = ("d_outer", "d_inner", "density", "tau_y", "k", "n")


def list_friction_laws() -> list[MethodInfo]:
    """The registered friction laws (name, description, source), default first.

    Examples
    --------
    >>> [m.name for m in list_friction_laws()][:2]
    ['api13d_2010_hb', 'api13d_1995_power_law']
    """
    return FRICTION_LAWS.describe()


def _build_case(
    geometry, q, d_outer, d_inner, density, tau_y, k, n, roughness, eccentricity, constants="exact"
):
    outer_name = "pipe inside diameter d" if geometry == "pipe" else "hole diameter d_hole"
    vals = {
        "q": check_positive("flow rate q", q, "m³/s"),
        "d_outer": check_positive(outer_name, d_outer, "m"),
        "density": check_positive("density", density, "kg/m³"),
        "tau_y": check_nonnegative("yield stress tau_y", tau_y, "Pa"),
        "k": check_positive("consistency k", k, "Pa·sⁿ"),
        "n": check_positive("flow behaviour index n", n),
        "roughness": check_nonnegative("roughness", roughness, "m"),
        "eccentricity": check_range("eccentricity", eccentricity, 0.0, 1.0, hi_open=True),
    }
    if geometry == "annulus":
        vals["d_inner"] = check_positive("pipe outside diameter d_pipe", d_inner, "m")
    else:
        vals["d_inner"] = np.zeros(())
    keys = list(vals)
    arrays = np.broadcast_arrays(*(vals[key] for key in keys))
    shape = arrays[0].shape
    flat = {
        key: np.atleast_1d(a).ravel().astype(float) for key, a in zip(keys, arrays, strict=True)
    }
    if geometry == "annulus":
        check_less(
            "pipe outside diameter d_pipe",
            flat["d_inner"],
            flat["d_outer"],
            "hole diameter d_hole",
            "diameter",
        )
    d_h = flat["d_outer"] - flat["d_inner"]
    bad = flat["roughness"] >= 0.5 * d_h
    if np.any(bad):
        i = np.flatnonzero(bad)[0]
        raise InputError(
            "roughness",
            float(flat["roughness"][i]),
            "< half the hydraulic diameter ({half})",
            kind="length",
            values=(Value("half", float(0.5 * d_h[i]), "length"),),
        )
    case = FlowCase(geometry=geometry, constants=constants, **flat)
    return case, shape, _critical_case(geometry, vals, shape, constants)


def _check_constants(method: str, spec: FlowMethod, constants: str) -> None:
    """InputError unless friction law ``method`` can be computed with the constant set."""
    check_choice("constants", constants, CONSTANT_SETS)
    if constants in spec.constant_sets:
        return
    laws = [m.name for m in FRICTION_LAWS.describe() if constants in m.func.constant_sets]
    raise InputError(
        "constants",
        constants,
        f"'exact' for friction law '{method}'; '{constants}' is available for: " + ", ".join(laws),
        problem="no printed constants for this method",
    )


def _critical_case(geometry, vals, shape, constants="exact"):
    """The distinct (geometry, fluid) combinations of a call and the map back to its elements.

    Returns ``(case, inverse)``: ``case`` holds each distinct combination once (at
    :data:`NOMINAL_RATE`, no roughness or eccentricity: the critical velocity uses neither),
    ``inverse`` the index of each element's combination.
    """
    columns, inverse = distinct_combinations([vals[key] for key in _CRITICAL_INPUTS], shape)
    fields = dict(zip(_CRITICAL_INPUTS, columns, strict=True))
    zeros = np.zeros(columns[0].shape)
    case = FlowCase(
        geometry=geometry,
        q=np.full(columns[0].shape, NOMINAL_RATE),
        roughness=zeros,
        eccentricity=zeros,
        constants=constants,
        **fields,
    )
    return case, inverse


def _generic_critical_velocity(spec: FlowMethod, case: FlowCase, limit=None) -> np.ndarray:
    target = np.log(spec.laminar_limit(case) if limit is None else limit)
    guess = np.maximum(case.velocity, 1e-3)

    def resid(v):
        return np.log(spec.reynolds(case, v)) - target

    return solve_positive(resid, guess, rtol=1e-12)


def _critical_velocity(spec: FlowMethod, critical, limit=None) -> np.ndarray:
    """Critical velocity [m/s] per element, solved once per distinct (geometry, fluid).

    ``limit``: the laminar limit of the distinct combinations when already computed."""
    case, inverse = critical
    solve = spec.critical_velocity or (lambda c: _generic_critical_velocity(spec, c, limit))
    return solve(case)[inverse]


def _turbulent_weight(st: MethodState) -> np.ndarray:
    span = st.turbulent_limit - st.laminar_limit
    safe = np.where(span > 0, span, 1.0)
    w = np.where(span > 0, (st.reynolds - st.laminar_limit) / safe, st.reynolds >= st.laminar_limit)
    return np.clip(w, 0.0, 1.0)


def _shape_out(x, shape, as_int=False):
    arr = np.asarray(x).reshape(shape)
    if arr.ndim == 0:
        return int(arr) if as_int else float(arr)
    return arr.astype(int) if as_int else arr


def _eccentricity(method: str, case: FlowCase, st: MethodState):
    """Eccentricity factor per element (ones for pipes) and the notes on its validity."""
    if not case.is_annulus:
        return np.ones_like(case.q), []
    kappa = case.d_inner / case.d_outer
    ecc = eccentricity_factor(case.eccentricity, kappa, case.n, _turbulent_weight(st))
    bad = ecc <= 0
    if np.any(bad):
        i = np.flatnonzero(bad)[0]
        raise InputError(
            "eccentricity",
            float(case.eccentricity[i]),
            "a value for which the Haciislamoglu-Langlinais factor stays positive "
            "(here n = {n:.3g}, D1/D2 = {ratio:.3g})",
            values=(Value("n", float(case.n[i])), Value("ratio", float(kappa[i]))),
        )
    e_hi = VALIDITY["eccentricity"][1]
    k_lo, k_hi = VALIDITY["diameter_ratio"]
    n_lo, n_hi = VALIDITY["n"]
    outside = (case.eccentricity > 0) & (
        (case.eccentricity > e_hi)
        | (kappa < k_lo)
        | (kappa > k_hi)
        | (case.n < n_lo)
        | (case.n > n_hi)
    )
    notes = [
        count_note(
            outside,
            "warning",
            "eccentricity_outside_validity",
            "eccentricity correction (Haciislamoglu & Langlinais 1990) used outside its "
            "range e <= {e_max}, {ratio_min} <= D1/D2 <= {ratio_max}, {n_min} <= n <= {n_max}",
            "annulus",
            values=(
                Value("e_max", e_hi),
                Value("ratio_min", k_lo),
                Value("ratio_max", k_hi),
                Value("n_min", n_lo),
                Value("n_max", n_hi),
            ),
        )
    ]
    if method == "exact_laminar":
        notes.append(
            count_note(
                case.eccentricity > 0,
                "info",
                "eccentric_not_exact",
                "the eccentric gradient is the exact concentric one times the "
                "Haciislamoglu-Langlinais laminar factor, not an exact eccentric solution",
                "annulus",
            )
        )
    return ecc, notes


def _regime_notes(method: str, spec: FlowMethod, case: FlowCase, st: MethodState, v_c):
    """Transitional flow, laminar flow below the critical velocity, roughness not used."""
    notes = [
        count_note(
            st.regime == TRANSITIONAL,
            "warning",
            "transitional_flow",
            "transitional flow: the Reynolds number lies between the method's laminar and "
            "turbulent limits, where friction is least certain",
            case.geometry,
        ),
        count_note(
            (st.regime == LAMINAR) & (case.velocity < v_c),
            "info",
            "below_critical_velocity",
            "velocity below the critical velocity (laminar flow)",
            case.geometry,
        ),
    ]
    if not spec.uses_roughness:
        notes.append(
            count_note(
                case.roughness > 0,
                "info",
                "roughness_ignored",
                "method '{method}' assumes smooth walls; the roughness given is not used",
                case.geometry,
                values=(Value("method", method),),
            )
        )
    return notes


def _rotation(case: FlowCase, st: MethodState, rpm):
    """Rotation factor per element (ones without rotation) and its validity note."""
    if rpm is None or not np.any(rpm > 0):
        return np.ones_like(case.q), []
    factor = rotation_factor(rpm, case.d_outer, case.d_inner, case.velocity, case.n,
                             _turbulent_weight(st))  # fmt: skip
    lo, hi = ROTATION_VALIDITY["n"]
    note = count_note(
        outside_validity(rpm, case.d_outer, case.d_inner, case.velocity, case.n),
        "warning",
        "rotation_outside_validity",
        "rotation factor (laminar helical flow) used outside its range {n_min} <= n <= "
        "{n_max}, D1/D2 >= {ratio_min}, string surface speed <= {speed_max} x mean velocity",
        "annulus",
        values=(
            Value("n_min", lo),
            Value("n_max", hi),
            Value("ratio_min", ROTATION_VALIDITY["diameter_ratio"][0]),
            Value("speed_max", ROTATION_VALIDITY["speed_ratio"][1]),
        ),
    )
    return factor, [note]


def _evaluate(method: str, case: FlowCase, shape, critical, rpm=None) -> FlowResult:
    spec: FlowMethod = FRICTION_LAWS.get(method).func
    _check_constants(method, spec, case.constants)
    spec.check(case)
    if spec.limit_from_distinct:
        # rate-independent laminar limit: once per distinct (geometry, fluid), gathered back
        limit = spec.laminar_limit(critical[0])
        st = spec.evaluate(case, laminar_limit=limit[critical[1]])
    else:
        limit = None
        st = spec.evaluate(case)
    v = case.velocity
    ecc, ecc_notes = _eccentricity(method, case, st)
    rot, rot_notes = _rotation(case, st, rpm)
    gradient = 2.0 * st.friction_factor * case.density * v**2 / case.d_h * ecc * st.gradient_scale
    gradient = gradient * rot
    v_c = _critical_velocity(spec, critical, limit)
    notes = [*st.notes, *ecc_notes, *rot_notes, *_regime_notes(method, spec, case, st, v_c)]
    o = lambda x: _shape_out(x, shape)  # noqa: E731
    return FlowResult(
        method=method,
        method_label=spec.label
        + ("" if case.constants == "exact" else f" (constants={case.constants})"),
        geometry=case.geometry,
        velocity=o(v * st.velocity_scale),
        hydraulic_diameter=o(case.d_h),
        wall_shear_rate=o(st.wall_shear_rate),
        wall_shear_stress=o(st.wall_shear_stress),
        reynolds=o(st.reynolds),
        reynolds_laminar_limit=o(st.laminar_limit),
        reynolds_turbulent_limit=o(st.turbulent_limit),
        regime=_shape_out(st.regime, shape, as_int=True),
        friction_factor=o(st.friction_factor),
        gradient=o(gradient),
        critical_velocity=o(v_c * st.velocity_scale),
        critical_flow_rate=o(v_c * case.area),
        eccentricity_factor=o(ecc),
        notes=tuple(x for x in notes if x is not None),
        rotation_factor=o(rot),
    )


def pipe_flow(
    q, d, *, density, tau_y, k, n, method=DEFAULT_FRICTION_LAW, roughness=0.0, constants="exact"
) -> FlowResult:
    """Frictional pressure gradient for flow inside a pipe.

    .. math:: -\\frac{dp}{dL} = \\frac{2fρV^2}{D} = \\frac{4τ_w}{D}, \\qquad V = \\frac{4Q}{πD^2}

    Parameters
    ----------
    q : array_like
        Flow rate [m³/s], > 0.
    d : array_like
        Pipe inside diameter [m], > 0.
    density : array_like
        Fluid density [kg/m³], > 0.
    tau_y : array_like
        Herschel-Bulkley yield stress [Pa], ≥ 0 (Bingham: YP; 0 for Newtonian, power law).
    k : array_like
        Consistency [Pa·sⁿ], > 0 (viscosity μ for Newtonian, μ_p for Bingham).
    n : array_like
        Flow behaviour index [-], > 0 (1 for Newtonian and Bingham).
    method : str
        One of :func:`list_friction_laws` (default ``"api13d_2010_hb"``).
    roughness : array_like
        Absolute wall roughness [m], ≥ 0 (used by ``"newtonian"``; others note it is ignored).
    constants : str
        ``"exact"`` (field constants derived from SI) or ``"as_printed"`` (the rounded
        constants of the printed recipe; only ``"api13d_1995_power_law"``, calc/METHODS.md
        §7.9).

    Returns
    -------
    FlowResult
        Gradient [Pa/m] and the intermediates; all inputs broadcast together.

    Raises
    ------
    calc.errors.InputError
        Non-positive q, d, density, k, n; negative tau_y or roughness; unknown method; or
        inputs the method cannot take (e.g. tau_y > 0 for ``"power_law"``).

    Notes
    -----
    Each method's regime bounds and validity are in its description (:func:`list_friction_laws`).
    Doubtful cases (transitional flow, velocity below critical, correlations outside their
    fitted range) are reported in ``notes``.

    References
    ----------
    API RP 13D, 3rd ed. (1995) and 6th ed. (2010), American Petroleum Institute.
    Bourgoyne, A. T., Millheim, K. K., Chenevert, M. E. & Young, F. S. (1986). Applied Drilling
    Engineering. SPE Textbook Series 2, ch. 4.

    Examples
    --------
    >>> r = pipe_flow(0.01, 0.1, density=1000.0, tau_y=0.0, k=0.001, n=1.0, method="newtonian")
    >>> r.regime_label, round(r.reynolds)
    ('turbulent', 127324)

    Guo & Liu (2011), Illustrative Example 2.5, p. 41: 300 gpm of 10.5 ppg Bingham mud
    (PV 35 cP, YP 6 lbf/100ft²) in 4-1/2 in drill pipe (3.826 in ID) flows at 8.37 ft/s,
    turbulent (printed); Example 2.6, p. 44, same pipe, power law n = 0.8, K = 20 eq. cP:
    N_Re = 43,258 (printed; ours is Metzner-Reed, 43,304: 0.1 % apart through the book's
    rounded constants and velocity, tests/test_worked_examples_flow.py):

    >>> from calc.units import from_si, to_si
    >>> q, d, rho = to_si(300.0, "gpm"), to_si(3.826, "in"), to_si(10.5, "ppg")
    >>> r = pipe_flow(q, d, density=rho, tau_y=to_si(6.0, "lbf/100ft2"), k=to_si(35.0, "cP"),
    ...               n=1.0, method="bingham")
    >>> round(from_si(r.velocity, "ft/s"), 2), r.regime_label
    (8.37, 'turbulent')
    >>> r = pipe_flow(q, d, density=rho, tau_y=0.0, k=0.020, n=0.8, method="power_law")
    >>> round(r.reynolds), r.regime_label
    (43304, 'turbulent')
    """
    case, shape, critical = _build_case(
        "pipe", q, d, 0.0, density, tau_y, k, n, roughness, 0.0, constants
    )
    return _evaluate(method, case, shape, critical)


def annulus_flow(
    q,
    d_hole,
    d_pipe,
    *,
    density,
    tau_y,
    k,
    n,
    method=DEFAULT_FRICTION_LAW,
    eccentricity=0.0,
    roughness=0.0,
    constants="exact",
    rpm=0.0,
) -> FlowResult:
    """Frictional pressure gradient for flow in the annulus between a hole and a pipe.

    .. math::
        -\\frac{dp}{dL} = R_{rot}R_{ecc}\\frac{2fρV^2}{D_2 - D_1},
        \\qquad V = \\frac{4Q}{π(D_2^2 - D_1^2)}

    Parameters
    ----------
    q : array_like
        Flow rate [m³/s], > 0.
    d_hole : array_like
        Hole or casing inside diameter D2 [m], > 0.
    d_pipe : array_like
        Pipe outside diameter D1 [m], 0 < D1 < D2.
    density, tau_y, k, n, method, roughness, constants
        As for :func:`pipe_flow`.
    eccentricity : array_like
        e = 2δ/(D2 - D1) [-], 0 ≤ e < 1 (δ the offset of the pipe centre); corrected by
        Haciislamoglu & Langlinais (1990), laminar and turbulent forms blended across the
        transitional band (:func:`calc.flow.eccentricity.eccentricity_factor`).
    rpm : array_like
        String rotary speed [rpm], 0 ≤ rpm ≤ 600 (default 0: no rotation); the laminar
        helical-flow factor R_rot of :func:`calc.flow.rotation.rotation_factor` (faded out
        across the transitional band) multiplies the gradient.

    Returns
    -------
    FlowResult

    Notes
    -----
    Hydraulic diameter D2 - D1 throughout.  Tool joints are separate intervals (the
    geometry module splits them); this function treats one uniform interval.

    References
    ----------
    Haciislamoglu, M. & Langlinais, J. (1990). J. Energy Resour. Technol. 112(3), 163-169.
    API RP 13D, 6th ed. (2010).

    Examples
    --------
    >>> r = annulus_flow(0.03, 0.2159, 0.127, density=1200.0, tau_y=4.0, k=0.3, n=0.65)
    >>> r.geometry, r.regime_label
    ('annulus', 'laminar')

    Guo & Liu (2011), Illustrative Example 2.5, p. 42: 300 gpm of 10.5 ppg Bingham mud
    (PV 35 cP, YP 6 lbf/100ft²) between 4-1/2 in drill pipe and 8.755 in casing ID flows at
    2.17 ft/s, laminar (printed):

    >>> from calc.units import from_si, to_si
    >>> r = annulus_flow(to_si(300.0, "gpm"), to_si(8.755, "in"), to_si(4.5, "in"),
    ...                  density=to_si(10.5, "ppg"), tau_y=to_si(6.0, "lbf/100ft2"),
    ...                  k=to_si(35.0, "cP"), n=1.0, method="bingham")
    >>> round(from_si(r.velocity, "ft/s"), 2), r.regime_label
    (2.17, 'laminar')
    """
    case, shape, critical = _build_case(
        "annulus", q, d_hole, d_pipe, density, tau_y, k, n, roughness, eccentricity, constants
    )
    rpm_v = check_rpm(rpm)
    try:
        rpm_flat = np.broadcast_to(rpm_v, shape).ravel().astype(float) if shape else rpm_v.ravel()
    except ValueError as exc:
        raise InputError("rpm shape", rpm_v.shape, f"broadcastable to {shape}") from exc
    return _evaluate(method, case, shape, critical, rpm_flat)


def critical_flow_rate(
    d, d_pipe=None, *, density, tau_y, k, n, method=DEFAULT_FRICTION_LAW, constants="exact"
):
    """Flow rate at which the method's Reynolds number reaches its laminar limit [m³/s].

    Pipe when ``d_pipe`` is None (``d`` the pipe ID), annulus otherwise (``d`` the hole ID).
    Solved for all intervals at once by bracketing Re(V) = Re_lam in ln V.

    Parameters
    ----------
    d : array_like
        Pipe inside diameter, or hole diameter [m].
    d_pipe : array_like or None
        Pipe outside diameter [m] for an annulus.
    density, tau_y, k, n, method, constants
        As for :func:`pipe_flow`.

    Returns
    -------
    float or numpy.ndarray
        Critical flow rate [m³/s].

    Examples
    --------
    >>> qc = critical_flow_rate(0.1, density=1000.0, tau_y=0.0, k=0.001, n=1.0,
    ...                         method="newtonian")
    >>> round(qc / (np.pi * 0.1**2 / 4) * 1000.0 * 0.1 / 0.001)  # Re at the critical rate
    2100
    """
    geometry = "pipe" if d_pipe is None else "annulus"
    # the critical velocity does not depend on q: any valid rate will do
    case, shape, critical = _build_case(
        geometry, NOMINAL_RATE, d, 0.0 if d_pipe is None else d_pipe, density, tau_y, k, n, 0.0,
        0.0, constants,
    )  # fmt: skip
    spec: FlowMethod = FRICTION_LAWS.get(method).func
    _check_constants(method, spec, case.constants)
    spec.check(case)
    return _shape_out(_critical_velocity(spec, critical) * case.area, shape)
