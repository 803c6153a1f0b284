"""Input-uncertainty band on ECD and standpipe pressure, and the spread between methods.

The known resolutions of the mud check — the viscometer dial (±0.5° per reading), the mud
balance (±0.1 ppg standard, ±0.05 ppg pressurised) — and the flow-rate uncertainty of the
pump's volumetric efficiency (±3 % of rate) are carried through the circulating system
(:func:`calc.circulation.circulate`, no second copy of any formula) by linear propagation:

.. math::

    c_i = \\frac{y(x_i^+) - y(x_i^-)}{x_i^+ - x_i^-}\\,a_i,\\qquad
    W = \\sqrt{\\sum_i c_i^2}

with :math:`a_i` the half-width of input *i* (its resolution), :math:`x_i^\\pm = x_i \\pm a_i`
(clipped at a physical bound, e.g. a dial reading of 0), :math:`c_i` its signed contribution and
:math:`W` the band's half-width (root-sum-square of independent inputs).  Every dial reading is
an input of its own: each is read off the dial independently, so their resolution errors are
independent and combine in quadrature (the worst case, all readings wrong the adverse way at
once, :math:`\\sum|c_i|`, is reported beside it as ``worst_case``).

The spread between the published drilling hydraulics methods (:data:`SPREAD_METHODS`) is a
model spread, not a random error: it is reported as the lowest and highest value with the
methods' names, never added to :math:`W`.  See calc/METHODS.md §18.
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Callable
from dataclasses import dataclass

import numpy as np

from calc.circulation.fluid import HydraulicsFluid, hydraulics_fluid_from_readings
from calc.circulation.hydrostatics import equivalent_circulating_density
from calc.circulation.loop import circulate
from calc.circulation.pore_fracture import CheckPoint, Margins, PressureWindow
from calc.errors import (
    InputError,
    check_finite,
    check_less,
    check_nonnegative,
    check_positive,
    check_range,
)
from calc.flow import annulus_flow
from calc.hydraulics_method import HYDRAULICS_METHODS, HydraulicsMethod, resolve_method
from calc.notes import Note
from calc.units import to_si
from calc.values import Value

__all__ = [
    "BALANCE_RESOLUTION",
    "BALANCE_RESOLUTION_PRESSURISED",
    "BAND_INPUTS",
    "BAND_QUANTITIES",
    "DIAL_RESOLUTION",
    "RATE_UNCERTAINTY",
    "SPREAD_METHODS",
    "EcdBand",
    "InputEffect",
    "QuantityBand",
    "annulus_ecd_band",
    "check_band_inputs",
    "ecd_band",
]

#: Viscometer dial resolution [degree]: ±0.5° per reading (common practice —
#: calc/METHODS.md §16.1, the same value as :attr:`calc.rheology.ViscometerReadings.resolution`).
DIAL_RESOLUTION = 0.5

#: Mud-balance resolution [kg/m³]: ±0.1 ppg for a standard (atmospheric) balance (common
#: practice — calc/METHODS.md §16.7; 0.1 ppg = 11.98 kg/m³, converted by calc.units).
BALANCE_RESOLUTION = float(to_si(0.1, "ppg"))

#: Pressurised mud-balance resolution [kg/m³]: ±0.05 ppg (common practice — §16.7).
BALANCE_RESOLUTION_PRESSURISED = float(to_si(0.05, "ppg"))

#: Flow-rate uncertainty from the pump's volumetric efficiency, as a fraction of the rate [-]:
#: ±3 % (common practice — calc/METHODS.md §16.7).
RATE_UNCERTAINTY = 0.03

#: The published drilling hydraulics methods whose spread is reported: API RP 13D (2010)
#: Herschel-Bulkley, API RP 13D (1995) power law, Bingham plastic (Bourgoyne et al. 1986) and
#: the power law (Dodge & Metzner 1959).  Not counted: ``newtonian`` (no yield stress, no shear
#: thinning: not a mud model), ``bingham_darby_1992`` (a slurry correlation that reads low for
#: muds, by its own registered caveat) and ``exact_laminar`` (laminar only: a check of the fast
#: methods, too low in turbulent pipe flow).  calc/METHODS.md §18.3.
SPREAD_METHODS = ("api13d_2010_hb", "api13d_1995_power_law", "bingham", "power_law")

#: The inputs of the band, in the order they are reported: each viscometer dial reading (one
#: input per speed, grouped as ``dial_readings``), the mud density (balance), the flow rate.
BAND_INPUTS = ("dial_readings", "density", "flow_rate")

#: The quantities a circulating-system band is given for, with their quantity kinds.
BAND_QUANTITIES = {
    "ecd_bit": "density",
    "ecd_shoe": "density",
    "ecd_tightest": "density",
    "spp": "pressure",
}

#: A contribution's second-order term beyond this share of the half-width marks the band as
#: not near-linear (a note): with a quadratic remainder of that size the first-order
#: half-width is off by about that share (program default, calc/METHODS.md §18.2).
NONLINEAR_SHARE = 0.2


@dataclass(frozen=True)
class InputEffect:
    """The effect of one input's half-width on one quantity (both sides evaluated).

    ``input`` one of :data:`BAND_INPUTS` (``"dial_readings"`` for a single reading, its speed
    in ``rpm`` [rpm]; None for the other inputs); ``delta`` the input's half-width a_i (degree,
    kg/m³ or m³/s); ``low_input``/``high_input`` the input values evaluated (x ∓ a, clipped at a
    physical bound); ``low``/``high`` the quantity there [SI]; ``effect`` the signed
    contribution c_i = slope·a_i [SI]; ``curvature`` the second-order term
    ((y⁺ + y⁻)/2 − y₀ for a symmetric pair, 0 for a one-sided one) [SI].
    """

    input: str
    rpm: float | None
    delta: float
    low_input: float
    high_input: float
    low: float
    high: float
    effect: float
    curvature: float


@dataclass(frozen=True)
class QuantityBand:
    """The band of one quantity: nominal value, half-width, contributions, method spread.

    ``quantity`` a key of :data:`BAND_QUANTITIES` (or ``"ecd"`` for :func:`annulus_ecd_band`);
    ``kind`` its quantity kind; ``point`` where it is taken (the shoe's or tightest point's
    :class:`CheckPoint`; None at the bit and for the SPP); ``md`` that depth [m] (None for the
    SPP); ``nominal`` the value at the inputs as given [SI]; ``effects`` one
    :class:`InputEffect` per input (each dial reading separately); ``method_values``
    ``(method, value)`` for each method of the spread [SI].
    """

    quantity: str
    kind: str
    point: CheckPoint | None
    md: float | None
    nominal: float
    effects: tuple[InputEffect, ...]
    method_values: tuple[tuple[str, float], ...] = ()

    @property
    def contributions(self) -> dict[str, float]:
        """Half-width from each input group of :data:`BAND_INPUTS` [SI]: the dial readings'
        effects combined in quadrature, the density's and the rate's |c_i|."""
        out = {}
        for name in BAND_INPUTS:
            out[name] = math.sqrt(sum(e.effect**2 for e in self.effects if e.input == name))
        return out

    @property
    def half_width(self) -> float:
        """W = √Σ c_i² over every input [SI] (independent inputs, root-sum-square)."""
        return math.sqrt(sum(e.effect**2 for e in self.effects))

    @property
    def worst_case(self) -> float:
        """Σ|c_i| [SI]: every input at the adverse end of its half-width at once."""
        return float(sum(abs(e.effect) for e in self.effects))

    @property
    def dominant(self) -> str:
        """The input group of :data:`BAND_INPUTS` with the largest contribution ("" if none)."""
        c = self.contributions
        best = max(BAND_INPUTS, key=lambda k: c[k])
        return best if c[best] > 0 else ""

    @property
    def low(self) -> float:
        """nominal − half-width [SI]."""
        return self.nominal - self.half_width

    @property
    def high(self) -> float:
        """nominal + half-width [SI]."""
        return self.nominal + self.half_width

    @property
    def method_min(self) -> tuple[str, float] | None:
        """(method, value) of the lowest value of the spread (None without a spread)."""
        return min(self.method_values, key=lambda mv: mv[1]) if self.method_values else None

    @property
    def method_max(self) -> tuple[str, float] | None:
        """(method, value) of the highest value of the spread (None without a spread)."""
        return max(self.method_values, key=lambda mv: mv[1]) if self.method_values else None


@dataclass(frozen=True, eq=False)
class EcdBand:
    """Bands on ECD at the bit, the last shoe and the tightest point, and on the SPP.

    ``method`` the hydraulics method of the nominal values; ``dial_resolution`` [degree],
    ``balance_resolution`` [kg/m³], ``rate_uncertainty`` [-] the half-widths used;
    ``spread_methods`` the methods of the model spread (those that could fit the readings; a
    method left out has a ``band_method_skipped`` note); ``ecd_shoe``/``ecd_tightest`` None
    where the well has no shoe check point / no margin table (no pressure window, weak point or
    shoe test); ``tightest_limit`` ``"fracture"`` or ``"pore"`` (the ECD at the tightest point
    is taken at the nominal tightest point's depth, which stays fixed while the inputs move);
    ``evaluations`` the number of :func:`~calc.circulation.circulate` calls; ``notes``.
    """

    method: str
    dial_resolution: float
    balance_resolution: float
    rate_uncertainty: float
    spread_methods: tuple[str, ...]
    ecd_bit: QuantityBand
    ecd_shoe: QuantityBand | None
    ecd_tightest: QuantityBand | None
    spp: QuantityBand
    tightest_limit: str | None
    evaluations: int
    notes: tuple[Note, ...] = ()

    @property
    def quantities(self) -> tuple[QuantityBand, ...]:
        """The bands present, in :data:`BAND_QUANTITIES` order."""
        return tuple(
            b for b in (self.ecd_bit, self.ecd_shoe, self.ecd_tightest, self.spp) if b is not None
        )


# ----------------------------------------------------------------------------- validation


def _one(name, value, unit) -> float:
    """One positive value (the band is for one rate and one density)."""
    v = check_positive(name, value, unit)
    if v.size != 1:
        raise InputError(name, f"{v.size} values", f"one value in {unit} (the band is for one)")
    return float(v.reshape(-1)[0])


def check_band_inputs(dial_resolution, balance_resolution, rate_uncertainty, density):
    """The band's half-widths and the density, checked: (dial [degree], balance [kg/m³], rate
    [-], density [kg/m³]) as floats.

    Raises :class:`~calc.errors.InputError` naming the input for a negative resolution, a rate
    uncertainty outside 0 ≤ u < 1, a balance resolution not below the density.

    >>> check_band_inputs(0.5, 11.98, 0.03, 1342.0)
    (0.5, 11.98, 0.03, 1342.0)
    """
    dial = float(check_nonnegative("dial-reading resolution", dial_resolution, "degree"))
    bal = float(check_finite("mud-balance resolution", balance_resolution, "kg/m³"))
    if bal < 0:
        raise InputError("mud-balance resolution", bal, ">= 0", kind="density")
    rate = float(
        check_range(
            "flow-rate uncertainty (pump volumetric efficiency)",
            rate_uncertainty,
            0.0,
            1.0,
            "fraction of the rate",
            hi_open=True,
        )
    )
    rho = _one("density", density, "kg/m³")
    if bal >= rho:
        raise InputError(
            "mud-balance resolution",
            bal,
            "< the density ({density})",
            kind="density",
            values=(Value("density", rho, "density"),),
        )
    return dial, bal, rate, rho


# ----------------------------------------------------------------------------- propagation

#: evaluate(fluid, q) → (N, K) quantities for a fluid whose density and the rates ``q`` are
#: (N,) arrays (or scalars).
Evaluate = Callable[[HydraulicsFluid, np.ndarray], np.ndarray]
#: make_fluid(readings, density) → the fitted fluid (no fit notes).
MakeFluid = Callable[[object, np.ndarray], HydraulicsFluid]


def _pair(y0, x0, xl, xh, yl, yh, delta, name, rpm):
    """InputEffects (one per quantity) from the two sides evaluated."""
    span = xh - xl
    out = []
    for k in range(y0.size):
        slope = 0.0 if span == 0 else (yh[k] - yl[k]) / span
        sym = xl < x0 < xh and math.isclose(x0 - xl, xh - x0, rel_tol=1e-9)
        curv = 0.5 * (yh[k] + yl[k]) - y0[k] if sym else 0.0
        out.append(
            InputEffect(
                input=name,
                rpm=rpm,
                delta=float(delta),
                low_input=float(xl),
                high_input=float(xh),
                low=float(yl[k]),
                high=float(yh[k]),
                effect=float(slope * delta),
                curvature=float(curv),
            )
        )
    return out


def _side_fluid(make_fluid: MakeFluid, readings, i, value, rho):
    """The fluid fitted with reading ``i`` set to ``value``; None where that makes no valid
    mud check or fit (e.g. the reading would fall below the next lower speed's): the
    difference is then one-sided."""
    dial = np.array(readings.dial, dtype=float)
    dial[i] = value
    try:
        r = dataclasses.replace(readings, dial=dial, ramp_up=None, ramp_down=None, notes=())
        return make_fluid(r, rho)
    except InputError:
        return None


def _propagate(evaluate: Evaluate, make_fluid: MakeFluid, readings, rho, q, dial, bal, rate):
    """Nominal quantities (K,), the InputEffects per quantity and the number of evaluations."""
    # density and rate: one vectorised call (nominal, rate −/+, density −/+)
    qs = q * np.array([1.0, 1.0 - rate, 1.0 + rate, 1.0, 1.0])
    rhos = np.array([rho, rho, rho, rho - bal, rho + bal])
    base = make_fluid(readings, rhos)
    y = np.asarray(evaluate(base, qs), dtype=float)
    y0 = y[0]
    per_input = [
        _pair(y0, q, qs[1], qs[2], y[1], y[2], rate * q, "flow_rate", None),
        _pair(y0, rho, rhos[3], rhos[4], y[3], y[4], bal, "density", None),
    ]
    calls = 1
    nominal_fluid = make_fluid(readings, rho)
    params0 = (nominal_fluid.pipe_parameters, nominal_fluid.annulus_parameters)
    full = readings.geometry.full_scale
    for i, rpm in enumerate(readings.speeds):
        th = float(readings.dial[i])
        sides = []
        for x in (max(th - dial, 0.0), min(th + dial, full)):
            f = _side_fluid(make_fluid, readings, i, x, rho) if x != th else None
            sides.append((th, None) if f is None else (x, f))
        (xl, fl), (xh, fh) = sides
        if dial == 0 or all(
            f is None or (f.pipe_parameters, f.annulus_parameters) == params0 for f in (fl, fh)
        ):
            yl = yh = y0  # the fit does not use this reading: no effect, no call
        else:
            yl = y0 if fl is None else np.asarray(evaluate(fl, q), dtype=float)[0]
            yh = y0 if fh is None else np.asarray(evaluate(fh, q), dtype=float)[0]
            calls += (fl is not None) + (fh is not None)
        per_input.append(_pair(y0, th, xl, xh, yl, yh, dial, "dial_readings", float(rpm)))
    effects = [tuple(e[k] for e in per_input) for k in range(y0.size)]
    return y0, effects, calls


#: Names of the quantities and inputs in the wording of the notes.
_NOTE_NAMES = {
    "ecd_bit": "ECD at the bit",
    "ecd_shoe": "ECD at the last shoe",
    "ecd_tightest": "ECD at the tightest point",
    "spp": "standpipe pressure",
    "dial_readings": "the dial readings",
    "density": "the density",
    "flow_rate": "the flow rate",
}


def _nonlinear_notes(bands) -> list[Note]:
    notes = []
    for b in bands:
        w = b.half_width
        for name in BAND_INPUTS:
            curv = sum(abs(e.curvature) for e in b.effects if e.input == name)
            if w > 0 and curv > NONLINEAR_SHARE * w:
                notes.append(
                    Note(
                        "info",
                        "band_not_linear",
                        "the band on {quantity} is not near-linear in {input}: second-order "
                        "term {curvature} against the half-width {half_width}; the band is a "
                        "first-order estimate",
                        b.quantity,
                        values=(
                            Value("quantity", _NOTE_NAMES[b.quantity]),
                            Value("input", _NOTE_NAMES[name]),
                            Value("curvature", curv, b.kind),
                            Value("half_width", w, b.kind),
                        ),
                    )
                )
    return notes


# ----------------------------------------------------------------------------- public


def ecd_band(
    well,
    readings,
    density: float,
    q: float,
    *,
    method: str | HydraulicsMethod | None = None,
    window: PressureWindow | None = None,
    weak_points=(),
    margins: Margins | None = None,
    eccentricity: float = 0.0,
    back_pressure: float = 0.0,
    friction_multiplier: float = 1.0,
    hydrostatic: str = "exact",
    dial_resolution: float = DIAL_RESOLUTION,
    balance_resolution: float = BALANCE_RESOLUTION,
    rate_uncertainty: float = RATE_UNCERTAINTY,
    spread_methods=SPREAD_METHODS,
    rpm: float = 0.0,
    joint_losses: str = "bore_friction",
) -> EcdBand:
    """Band on ECD (bit, last shoe, tightest point) and SPP from the input resolutions.

    .. math::

        W_y = \\sqrt{\\sum_i c_i^2},\\qquad
        c_i = \\frac{y(x_i^+) - y(x_i^-)}{x_i^+ - x_i^-}\\,a_i

    for y ∈ {ECD at the bit, ECD at the last shoe, ECD at the nominal tightest point, SPP},
    inputs x_i every dial reading (a_i = ``dial_resolution``), the density (a =
    ``balance_resolution``) and the rate (a = ``rate_uncertainty``·q); y is evaluated by
    :func:`calc.circulation.circulate` with the readings refitted by the hydraulics method
    (:func:`calc.circulation.hydraulics_fluid_from_readings`).  The density and rate sides run
    in one vectorised call; a reading the method's fit does not use costs no call.

    Parameters
    ----------
    well : calc.geometry.Well
        The well, as for :func:`~calc.circulation.circulate`.
    readings : calc.rheology.ViscometerReadings
        The mud check's dial readings [degree].
    density : float
        Mud density [kg/m³].
    q : float
        Flow rate [m³/s] (one rate).
    method : str or HydraulicsMethod, optional
        Hydraulics method of the nominal values (None: the default).
    window, weak_points, margins, eccentricity, back_pressure, friction_multiplier, hydrostatic
        As for :func:`~calc.circulation.circulate` (they set the shoe and the tightest point).
    rpm, joint_losses
        As for :func:`~calc.circulation.circulate` (string rotation, tool-joint losses).
    dial_resolution : float
        Half-width of each dial reading [degree], ≥ 0 (default :data:`DIAL_RESOLUTION`).
    balance_resolution : float
        Half-width of the density [kg/m³], ≥ 0 and < the density (default
        :data:`BALANCE_RESOLUTION`, a standard balance; :data:`BALANCE_RESOLUTION_PRESSURISED`
        for a pressurised one).
    rate_uncertainty : float
        Half-width of the flow rate as a fraction of it [-], 0 ≤ u < 1 (default
        :data:`RATE_UNCERTAINTY`).
    spread_methods : sequence of str
        Hydraulics methods of the model spread (default :data:`SPREAD_METHODS`); empty: none.

    Returns
    -------
    EcdBand
        SI values; per quantity the nominal value, half-width, contribution per input, the
        dominant input and the method spread (lowest/highest with the method names).

    Raises
    ------
    calc.errors.InputError
        A negative resolution, a rate uncertainty outside [0, 1), a balance resolution not
        below the density, an unknown method, or any input :func:`circulate` refuses.

    Notes
    -----
    First-order (linear) propagation of independent inputs: exact for a quantity linear in
    its inputs, a first-order estimate otherwise (a ``band_not_linear`` note where the
    second-order term from the same evaluations exceeds :data:`NONLINEAR_SHARE` of the
    half-width, e.g. near a regime change).  For inputs spread evenly over ±a_i (rounding of a
    reading), W = √3·u_c with u_c the combined standard uncertainty (u_i = a_i/√3); W covers
    the whole range where one input dominates and about 92 % of outcomes where many contribute
    alike (a normal distribution within ±√3σ).  The clean circulating mud: no cuttings load.
    ``evaluations`` counts the circulate calls (at most 2 + 2 × the readings + the spread
    methods).

    References
    ----------
    JCGM 100:2008, *Evaluation of measurement data — Guide to the expression of uncertainty in
    measurement* (GUM): law of propagation of uncertainty for uncorrelated inputs (§5.1.2) and
    the rectangular distribution u = a/√3 (§4.3.7) (section numbers from memory, not checked
    against the text — calc/METHODS.md §18).  JCGM 101:2008 (GUM Supplement 1): propagation of
    distributions by a Monte Carlo method, the check of the tests.

    Examples
    --------
    >>> from tests.demo_well import check, demo_readings, demo_rate, demo_well, demo_window, ppg
    >>> b = ecd_band(demo_well(1), demo_readings(1), ppg(check(1)["density"]), demo_rate(1),
    ...              window=demo_window())
    >>> b.ecd_bit.dominant, b.spp.dominant, b.evaluations
    ('density', 'flow_rate', 13)
    """
    dial, bal, rate, rho = check_band_inputs(
        dial_resolution, balance_resolution, rate_uncertainty, density
    )
    qv = _one("flow rate", q, "m³/s")
    preset = resolve_method(method)
    spread = tuple(spread_methods)
    for m in spread:
        HYDRAULICS_METHODS.get(m)  # InputError naming the registry if unknown
    loss_kw = dict(
        eccentricity=eccentricity,
        back_pressure=back_pressure,
        friction_multiplier=friction_multiplier,
        hydrostatic=hydrostatic,
        rpm=rpm,
        joint_losses=joint_losses,
    )
    nominal = circulate(
        well,
        hydraulics_fluid_from_readings(readings, preset, density=rho, fit_notes=False),
        qv,
        method=preset,
        window=window,
        weak_points=weak_points,
        margins=margins,
        **loss_kw,
    )
    mt = nominal.margins
    shoe = mt.points[mt.index("shoe")] if mt is not None and mt.index("shoe") is not None else None
    tight = mt.tightest if mt is not None else None
    tight_point = tight.point if tight is not None else None
    places = [("ecd_bit", None), ("ecd_shoe", shoe), ("ecd_tightest", tight_point)]
    places = [(k, p) for k, p in places if k == "ecd_bit" or p is not None]
    mds = np.array([p.md for _, p in places if p is not None], dtype=float)

    def evaluate_with(m):
        def evaluate(fluid, qq):
            res = circulate(well, fluid, qq, method=m, **loss_kw)
            cols = [np.atleast_1d(res.ecd_bit)]
            if mds.size:
                cols += list(np.atleast_2d(res.ecd_at(mds)).reshape(-1, mds.size).T)
            cols.append(np.atleast_1d(res.standpipe_pressure))
            return np.stack(cols, axis=-1)

        return evaluate

    def fluid_for(m):
        def make(r, dens):
            return hydraulics_fluid_from_readings(r, m, density=dens, fit_notes=False)

        return make

    y0, effects, calls = _propagate(
        evaluate_with(preset), fluid_for(preset), readings, rho, qv, dial, bal, rate
    )
    calls += 1  # the nominal call with the margins
    spread_values, used, notes = [], [], []
    for m in spread:
        if m == preset.name and not preset.overrides:
            spread_values.append(y0)
            used.append(m)
            continue
        mp = resolve_method(m)
        try:
            fluid_m = fluid_for(mp)(readings, rho)
        except InputError as exc:  # e.g. a two-speed pair these readings cannot give
            notes.append(
                Note(
                    "info",
                    "band_method_skipped",
                    "{method} left out of the method spread: {reason}",
                    "method spread",
                    values=(Value("method", m), Value("reason", str(exc))),
                )
            )
            continue
        spread_values.append(evaluate_with(mp)(fluid_m, qv)[0])
        used.append(m)
        calls += 1
    keys = [k for k, _ in places] + ["spp"]
    points = [p for _, p in places] + [None]
    bands = {}
    for j, (key, point) in enumerate(zip(keys, points, strict=True)):
        bands[key] = QuantityBand(
            quantity=key,
            kind=BAND_QUANTITIES[key],
            point=point,
            md=None if key == "spp" else (nominal.bit_md if point is None else float(point.md)),
            nominal=float(y0[j]),
            effects=effects[j],
            method_values=tuple((m, float(v[j])) for m, v in zip(used, spread_values, strict=True)),
        )
    notes += _nonlinear_notes(bands.values())
    return EcdBand(
        method=preset.label,
        dial_resolution=dial,
        balance_resolution=bal,
        rate_uncertainty=rate,
        spread_methods=tuple(used),
        ecd_bit=bands["ecd_bit"],
        ecd_shoe=bands.get("ecd_shoe"),
        ecd_tightest=bands.get("ecd_tightest"),
        spp=bands["spp"],
        tightest_limit=None if tight is None else str(tight.limit),
        evaluations=calls,
        notes=tuple(notes),
    )


def annulus_ecd_band(
    readings,
    density: float,
    q: float,
    d_hole,
    d_pipe,
    length,
    tvd: float,
    *,
    method: str | HydraulicsMethod | None = None,
    eccentricity: float = 0.0,
    back_pressure: float = 0.0,
    hydrostatic: str = "exact",
    dial_resolution: float = DIAL_RESOLUTION,
    balance_resolution: float = BALANCE_RESOLUTION,
    rate_uncertainty: float = RATE_UNCERTAINTY,
) -> QuantityBand:
    """Band on the ECD at the foot of a stack of annular intervals (the flat form).

    .. math::

        \\mathrm{ECD} = \\rho + \\frac{\\sum_j (dp/dL)_j L_j + p_s}{g\\,\\mathrm{TVD}},
        \\qquad W = \\sqrt{\\sum_i c_i^2}

    with the gradients of :func:`calc.flow.annulus_flow` (the method's annulus fit and friction
    law) and ECD by :func:`calc.circulation.equivalent_circulating_density`; the propagation
    is that of :func:`ecd_band` (same inputs, half-widths and checks).

    Parameters
    ----------
    readings : calc.rheology.ViscometerReadings
        Dial readings [degree].
    density : float
        Mud density [kg/m³].
    q : float
        Flow rate [m³/s].
    d_hole, d_pipe, length : array_like
        Per annular interval from the surface down: hole/casing ID [m], pipe OD [m], length [m].
    tvd : float
        True vertical depth of the point [m], > 0.
    method, eccentricity, back_pressure, hydrostatic
        As for :func:`~calc.circulation.circulate`.
    dial_resolution, balance_resolution, rate_uncertainty
        As for :func:`ecd_band`.

    Returns
    -------
    QuantityBand
        ``quantity`` ``"ecd"``, kind density [kg/m³]; no method spread.

    Examples
    --------
    >>> from calc.rheology import ViscometerReadings
    >>> r = ViscometerReadings([600, 300, 200, 100, 6, 3], [68, 44, 35, 25, 10, 9])
    >>> b = annulus_ecd_band(r, 1342.0, 0.033, [0.2159], [0.127], [3000.0], 3000.0)
    >>> b.dominant, round(b.contributions["density"], 2)
    ('density', 11.98)
    """
    dial, bal, rate, rho = check_band_inputs(
        dial_resolution, balance_resolution, rate_uncertainty, density
    )
    qv = _one("flow rate", q, "m³/s")
    d2 = np.atleast_1d(check_positive("hole diameter", d_hole, "m")).astype(float)
    d1 = np.atleast_1d(check_positive("pipe diameter", d_pipe, "m")).astype(float)
    ln = np.atleast_1d(check_nonnegative("length", length, "m")).astype(float)
    try:
        d2, d1, ln = np.broadcast_arrays(d2, d1, ln)
    except ValueError as exc:
        raise InputError(
            "annular intervals", (d2.size, d1.size, ln.size), "one hole, pipe and length each"
        ) from exc
    check_less(
        lambda i: f"pipe diameter (interval {i + 1})", d1, d2, "the hole diameter", "diameter"
    )
    depth = float(check_positive("tvd", tvd, "m"))
    preset = resolve_method(method)

    def make(r, dens):
        return hydraulics_fluid_from_readings(r, preset, density=dens, fit_notes=False)

    def evaluate(fluid, qq):
        qa = np.atleast_1d(np.asarray(qq, dtype=float))
        rh = np.broadcast_to(np.atleast_1d(np.asarray(fluid.density, dtype=float)), qa.shape)
        ty, k, n = fluid.annulus_parameters
        fr = annulus_flow(
            qa[:, None], d2[None, :], d1[None, :], density=rh[:, None], tau_y=ty, k=k, n=n,
            method=preset.friction, eccentricity=eccentricity,
        )  # fmt: skip
        loss = (np.asarray(fr.gradient) * ln[None, :]).sum(axis=-1)
        ecd = equivalent_circulating_density(
            rh, loss, depth, back_pressure=back_pressure, hydrostatic=hydrostatic
        )
        return np.asarray(ecd, dtype=float)[:, None]

    y0, effects, _ = _propagate(evaluate, make, readings, rho, qv, dial, bal, rate)
    return QuantityBand(
        quantity="ecd", kind="density", point=None, md=None, nominal=float(y0[0]),
        effects=effects[0],
    )  # fmt: skip
