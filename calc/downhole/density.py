"""Base-fluid and mud density at downhole temperature and pressure (calc/METHODS.md §20).

Water (and the aqueous phase of a brine) follows the industrial formulation of the IAPWS,
IAPWS-IF97 region 1 (compressed liquid) in closed form; diesel follows the linear correlation
of Sorelle et al. (1982).  A mud is a mixture of a base oil, an aqueous phase and solids whose
volume fractions are known at the surface (the retort of the mud check); its mass is
conserved while the liquids expand and compress and the solids are taken as incompressible:

.. math::

    \\rho_m(T, p) = \\frac{\\rho_{m,0}}
        {f_o\\,\\rho_{o,0}/\\rho_o(T, p) + f_w\\,\\rho_{w,0}/\\rho_w(T, p) + f_s}

where ``0`` is the surface state at which the mud weight was measured, and f_o + f_w + f_s = 1.
Only the liquids' *relative* change ρ(T, p)/ρ₀ enters, so a brine or a base oil of any surface
density can use the relative change of its model.

Temperatures are kelvin, pressures pascal.  ``pressure`` in this module is the *gauge* pressure
(relative to the atmosphere at the surface); the water formulation adds the standard atmosphere.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.errors import InputError, check_finite, check_range
from calc.notes import Note
from calc.numeric import float_or_array
from calc.registry import MethodRegistry, Verification
from calc.values import Value

__all__ = [
    "BASE_FLUIDS",
    "DENSITY_MODELS",
    "T_FREEZE",
    "T_MAX",
    "MudComposition",
    "base_fluid_ratio",
    "diesel_density",
    "mud_density",
    "water_density",
]

#: Standard atmosphere [Pa] (ISO 2533 / CGPM definition of the atmosphere): gauge → absolute.
P_ATM = 101_325.0
#: Freezing point of water at one atmosphere [K] (0 °C; common practice).  Brines freeze lower,
#: but the aqueous phase is modelled as liquid water, so this is the lower limit of every mud.
T_FREEZE = 273.15
#: Upper limit of IAPWS-IF97 region 1 [K] (623.15 K = 350 °C; IAPWS-IF97, region boundaries).
T_MAX = 623.15
#: Upper pressure limit of IAPWS-IF97 region 1 [Pa] (100 MPa; IAPWS-IF97).
P_MAX_IF97 = 100.0e6

# --- IAPWS-IF97 region 1: dimensionless Gibbs free energy, Table 2 (I, J, n) -----------------
_IF97_I = np.array([0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 2, 2, 2, 2, 2, 3, 3, 3, 4, 4, 4,
                    5, 8, 8, 21, 23, 29, 30, 31, 32], dtype=float)  # fmt: skip
_IF97_J = np.array([-2, -1, 0, 1, 2, 3, 4, 5, -9, -7, -1, 0, 1, 3, -3, 0, 1, 3, 17, -4, 0, 6,
                    -5, -2, 10, -8, -11, -6, -29, -31, -38, -39, -40, -41],
                   dtype=float)  # fmt: skip
_IF97_N = np.array([
    0.14632971213167, -0.84548187169114, -0.37563603672040e1, 0.33855169168385e1,
    -0.95791963387872, 0.15772038513228, -0.16616417199501e-1, 0.81214629983568e-3,
    0.28319080123804e-3, -0.60706301565874e-3, -0.18990068218419e-1, -0.32529748770505e-1,
    -0.21841717175414e-1, -0.52838357969930e-4, -0.47184321073267e-3, -0.30001780793026e-3,
    0.47661393906987e-4, -0.44141845330846e-5, -0.72694996297594e-15, -0.31679644845054e-4,
    -0.28270797985312e-5, -0.85205128120103e-9, -0.22425281908000e-5, -0.65171222895601e-6,
    -0.14341729937924e-12, -0.40516996860117e-6, -0.12734301741641e-8, -0.17424871230634e-9,
    -0.68762131295531e-18, 0.14478307828521e-19, 0.26335781662795e-22, -0.11947622640071e-22,
    0.18228094581404e-23, -0.93537087292458e-25,
])  # fmt: skip
#: Specific gas constant of water [J/(kg·K)] (IAPWS-IF97, eq. 1).
_IF97_R = 461.526
#: Reducing pressure p* = 16.53 MPa and temperature T* = 1386 K of region 1 (IAPWS-IF97, eq. 7).
_IF97_PSTAR, _IF97_TSTAR = 16.53e6, 1386.0

# --- Sorelle et al. (1982), eq. 1: diesel ρ [lb/gal] = a0 + a1·T [°F] + a2·p [psig] ----------
_SORELLE_DIESEL = (7.24032, -2.84383e-3, 2.75660e-5)
#: 1 lb/US gal in kg/m³: 0.45359237 kg / (231 in³ × 0.0254³ m³/in³) (exact definitions).
_PPG = 0.45359237 / (231.0 * 0.0254**3)
#: 1 psi in Pa: 0.45359237 kg × gₙ / 0.0254² m² (exact definitions).
_PSI = 0.45359237 * 9.80665 / 0.0254**2
#: Upper limit of the diesel data [Pa gauge]: 12,500 psia (Sorelle et al. 1982 data table, as
#: reproduced second-hand; calc/METHODS.md §20).
P_MAX_DIESEL = 12_500.0 * _PSI
#: Upper temperature of the diesel data [K]: 400 °F (from memory, not checked against the source).
T_MAX_DIESEL = (400.0 - 32.0) / 1.8 + 273.15


def _t_check(name, temperature):
    t = check_finite(name, temperature, "K")
    if np.any(t < T_FREEZE):
        bad = float(np.min(t))
        raise InputError(
            name, bad, "at or above the freezing point of water {lo}", kind="temperature",
            values=(Value("lo", T_FREEZE, "temperature"),),
        )  # fmt: skip
    if np.any(t > T_MAX):
        bad = float(np.max(t))
        raise InputError(
            name, bad, "at or below {hi}, the upper limit of the water formulation (IAPWS-IF97)",
            kind="temperature", values=(Value("hi", T_MAX, "temperature"),),
        )  # fmt: skip
    return t


def _p_check(name, pressure):
    p = check_finite(name, pressure, "Pa")
    if np.any(p < 0.0):
        raise InputError(name, float(np.min(p)), ">= 0 Pa (gauge)", kind="pressure")
    return p


def water_density(temperature, pressure=0.0):
    """Density of liquid water [kg/m³] from IAPWS-IF97 region 1.

    .. math::

        v = \\frac{R T}{p}\\,\\pi\\,\\gamma_\\pi,\\qquad
        \\gamma_\\pi = \\sum_{i=1}^{34} -n_i I_i (7.1-\\pi)^{I_i-1}(\\tau-1.222)^{J_i},\\qquad
        \\pi = p/p^*,\\ \\tau = T^*/T,\\qquad \\rho = 1/v

    with p* = 16.53 MPa, T* = 1386 K, R = 461.526 J/(kg·K) and (I, J, n) of Table 2.

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K], 273.15 ≤ T ≤ 623.15.
    pressure : float or array_like
        Gauge pressure [Pa], ≥ 0 (the standard atmosphere is added).

    Returns
    -------
    float or ndarray
        Density [kg/m³].

    Notes
    -----
    Region 1 covers 273.15–623.15 K up to 100 MPa, above the saturation pressure; below it (hot
    water near the surface) the formulation is evaluated as a metastable liquid.  Above
    100 MPa it is extrapolated (the mud functions add a note).

    References
    ----------
    IAPWS (2007). *Revised Release on the IAPWS Industrial Formulation 1997 for the
    Thermodynamic Properties of Water and Steam* (IAPWS-IF97), region 1, eq. 7 and Table 2.
    Wagner, W. et al. (2000). The IAPWS Industrial Formulation 1997 for the Thermodynamic
    Properties of Water and Steam. *J. Eng. Gas Turbines Power* 122, 150–182.

    Examples
    --------
    IAPWS-IF97 Table 5, T = 300 K, p = 3 MPa: v = 0.00100215168 m³/kg:

    >>> round(1.0 / water_density(300.0, 3.0e6 - 101325.0), 11)
    0.00100215168
    """
    t = _t_check("temperature", temperature)
    p = _p_check("pressure", pressure) + P_ATM
    pi = p / _IF97_PSTAR
    tau = _IF97_TSTAR / t
    a = (7.1 - pi)[..., None]
    b = (tau - 1.222)[..., None]
    gamma_pi = np.sum(-_IF97_N * _IF97_I * a ** (_IF97_I - 1.0) * b**_IF97_J, axis=-1)
    v = _IF97_R * t / p * pi * gamma_pi
    return float_or_array(1.0 / v)


def diesel_density(temperature, pressure=0.0):
    """Density of a diesel base oil [kg/m³] by the linear correlation of Sorelle et al. (1982).

    .. math:: \\rho\\,[\\mathrm{lb/gal}] = 7.24032 - 2.84383\\times10^{-3}\\,T\\,[°F]
              + 2.75660\\times10^{-5}\\,p\\,[\\mathrm{psig}]

    evaluated in SI (1 lb/gal = 119.826 kg/m³, 1 psi = 6894.76 Pa, exact definitions).

    Parameters
    ----------
    temperature : float or array_like
        Temperature [K], 273.15 ≤ T ≤ 623.15 (beyond 400 °F the correlation is extrapolated).
    pressure : float or array_like
        Gauge pressure [Pa], ≥ 0 (data to 12,500 psi).

    References
    ----------
    Sorelle, R.R., Jardiolin, R.A., Buckley, P., Barrios, J.R. (1982). Mathematical Field Model
    Predicts Downhole Density Changes in Static Drilling Fluids. SPE 11118, eq. 1 (coefficients
    second-hand, calc/METHODS.md §20).

    Examples
    --------
    At 32 °F and 0 psig the correlation gives 7.24032 - 0.0910 = 7.149 lb/gal:

    >>> round(diesel_density(273.15) / 119.82642731689663, 4)
    7.1493
    """
    t = _t_check("temperature", temperature)
    p = _p_check("pressure", pressure)
    a0, a1, a2 = _SORELLE_DIESEL
    t_f = (t - 273.15) * 1.8 + 32.0
    return float_or_array((a0 + a1 * t_f + a2 * p / _PSI) * _PPG)


#: Density models of base fluids: name → f(T [K], p_gauge [Pa]) → the *relative* density
#: ρ(T, p)/ρ(T₀, 0) is what the mud model uses.
DENSITY_MODELS = MethodRegistry("base-fluid density model")

_WATER_STATUS = Verification(
    "reference_library",
    "tests/test_downhole_density.py: IAPWS-IF97 Table 5 verification values (from memory, "
    "rel 1e-8) and the IAPWS-95 formulation of the `iapws` package across 20–200 °C and "
    "1–1,000 bar (rel 5e-5, measured 1.3e-5; skipped where `iapws` is not installed).",
    ("Liquid water only, 0–350 °C; above 100 MPa the formulation is extrapolated.",),
)
_BRINE_STATUS = Verification(
    "common_practice",
    "tests/test_downhole_density.py: the brine keeps its measured surface density and follows "
    "water's relative thermal expansion and compressibility (IAPWS-IF97).",
    (
        "A brine expands and compresses like fresh water here; salt changes both (calc/METHODS.md"
        " §20). The measured surface density carries the salt.",
    ),
)
_DIESEL_STATUS = Verification(
    "published_example",
    "tests/test_downhole_density.py: the worked example of Sorelle et al. (1982) (10 lb/gal "
    "invert, 120 °F at surface, 250 °F at 10,000 ft: mean column density 9.85 lb/gal), as "
    "reproduced second-hand; the coefficients are second-hand too (calc/METHODS.md §20).",
    (
        "Coefficients of Sorelle et al. (1982) taken second-hand, not checked against the paper"
        " (calc/METHODS.md §20).",
        "Diesel data to 12,500 psi; the temperature range (to 400 °F) is from memory.",
    ),
)
_PROXY_STATUS = Verification(
    "self_consistency",
    "tests/test_downhole_density.py: same relative change as diesel (Sorelle et al. 1982); no "
    "correlation of this base oil was checked against its paper.",
    (
        "Uses diesel's relative thermal expansion and compressibility (Sorelle et al. 1982): the "
        "published correlations for this base (Peters, Chenevert & Zhang 1990; Zamora et al. "
        "2000) could not be reached (calc/METHODS.md §20).",
    ),
)


@DENSITY_MODELS.register(
    "water_iapws_if97", "liquid water, IAPWS-IF97 region 1", "IAPWS-IF97 (2007), region 1",
    status=_WATER_STATUS,
)  # fmt: skip
def _water(t, p):
    return water_density(t, p)


@DENSITY_MODELS.register(
    "brine_water_relative", "brine: measured surface density, water's relative T/p change",
    "IAPWS-IF97 (2007), region 1", status=_BRINE_STATUS,
)  # fmt: skip
def _brine(t, p):
    return water_density(t, p)


@DENSITY_MODELS.register(
    "diesel_sorelle_1982", "diesel base oil, linear in T and p", "Sorelle et al. (1982) SPE 11118",
    status=_DIESEL_STATUS,
)  # fmt: skip
def _diesel(t, p):
    return diesel_density(t, p)


@DENSITY_MODELS.register(
    "mineral_oil_diesel_relative",
    "mineral base oil: diesel's relative T/p change",
    "Sorelle et al. (1982) SPE 11118",
    status=_PROXY_STATUS,
)
def _mineral(t, p):
    return diesel_density(t, p)


@DENSITY_MODELS.register(
    "synthetic_diesel_relative",
    "synthetic base fluid: diesel's relative T/p change",
    "Sorelle et al. (1982) SPE 11118",
    status=_PROXY_STATUS,
)
def _synthetic(t, p):
    return diesel_density(t, p)


#: Base fluid a user names → (phase, density model).
BASE_FLUIDS: dict[str, tuple[str, str]] = {
    "water": ("water", "water_iapws_if97"),
    "brine": ("water", "brine_water_relative"),
    "diesel": ("oil", "diesel_sorelle_1982"),
    "mineral_oil": ("oil", "mineral_oil_diesel_relative"),
    "synthetic": ("oil", "synthetic_diesel_relative"),
}


def base_fluid_ratio(model: str, temperature, pressure, reference_temperature):
    """Relative density ρ(T, p)/ρ(T₀, 0) of a base fluid [-] (the mud model's input).

    Parameters
    ----------
    model : str
        A name of :data:`DENSITY_MODELS`.
    temperature, pressure : float or array_like
        Temperature [K] and gauge pressure [Pa].
    reference_temperature : float
        Temperature of the surface measurement T₀ [K] (at 0 gauge).

    Examples
    --------
    Water heated from 20 °C to 80 °C at the surface loses 2.65 % of its density (971.8 against
    998.2 kg/m³, IAPWS):

    >>> round(base_fluid_ratio("water_iapws_if97", 353.15, 0.0, 293.15), 4)
    0.9735
    """
    fn = DENSITY_MODELS.get(model).func
    return float_or_array(
        np.asarray(fn(temperature, pressure)) / float(fn(reference_temperature, 0.0))
    )


@dataclass(frozen=True)
class MudComposition:
    """Volume fractions of a mud at the surface and the models of its liquids.

    ``oil``, ``water``, ``solids`` are fractions [-] that add up to 1 (the retort);
    ``oil_base`` and ``water_base`` name entries of :data:`BASE_FLUIDS` for the two liquids.

    Examples
    --------
    The demo's water-based mud, retort water 88.5 %, solids 11.5 % (invented):

    >>> MudComposition(0.0, 0.885, 0.115).models
    ('water_iapws_if97',)
    """

    oil: float
    water: float
    solids: float
    oil_base: str = "diesel"
    water_base: str = "water"

    def __post_init__(self):
        for name in ("oil", "water", "solids"):
            check_range(f"{name} fraction", getattr(self, name), 0.0, 1.0)
        total = self.oil + self.water + self.solids
        if abs(total - 1.0) > 1e-6:
            raise InputError("oil + water + solids fractions", total, "1 (the whole retort)")
        if self.oil > 0.0 and BASE_FLUIDS.get(self.oil_base, ("",))[0] != "oil":
            raise InputError("oil base", self.oil_base, "diesel, mineral_oil or synthetic")
        if self.water > 0.0 and BASE_FLUIDS.get(self.water_base, ("",))[0] != "water":
            raise InputError("water base", self.water_base, "water or brine")

    @classmethod
    def from_ratio(
        cls, oil_water_ratio: float, solids: float, *, oil_base="diesel", water_base="water"
    ) -> MudComposition:
        """From the oil/water ratio [% oil of the liquid, 0–100] and the solids fraction [-].

        Examples
        --------
        >>> c = MudComposition.from_ratio(80.0, 0.15, oil_base="mineral_oil", water_base="brine")
        >>> round(c.oil, 3), round(c.water, 3)
        (0.68, 0.17)
        """
        owr = float(check_range("oil/water ratio", oil_water_ratio, 0.0, 100.0, "% oil"))
        s = float(check_range("solids", solids, 0.0, 1.0, lo_open=False, hi_open=True))
        liquid = 1.0 - s
        return cls(owr / 100.0 * liquid, (1.0 - owr / 100.0) * liquid, s, oil_base, water_base)

    @property
    def models(self) -> tuple[str, ...]:
        """The density models this mud uses."""
        out = []
        if self.oil > 0.0:
            out.append(BASE_FLUIDS[self.oil_base][1])
        if self.water > 0.0:
            out.append(BASE_FLUIDS[self.water_base][1])
        return tuple(out)

    def range_notes(self, temperature, pressure) -> tuple[Note, ...]:
        """Notes where ``temperature`` [K] or ``pressure`` [Pa gauge] lie beyond a model's data."""
        t, p = np.asarray(temperature, float), np.asarray(pressure, float)
        notes: list[Note] = []
        if self.water > 0.0 and np.any(p + P_ATM > P_MAX_IF97):
            notes.append(_range_note("water formulation (IAPWS-IF97)", "pressure", p, P_MAX_IF97))
        if self.oil > 0.0:
            if np.any(p > P_MAX_DIESEL):
                notes.append(_range_note("base-oil correlation", "pressure", p, P_MAX_DIESEL))
            if np.any(t > T_MAX_DIESEL):
                notes.append(_range_note("base-oil correlation", "temperature", t, T_MAX_DIESEL))
        return tuple(notes)


def _range_note(model: str, what: str, arr, limit) -> Note:
    return Note(
        "warning",
        "density_model_extrapolated",
        f"{what} up to {{top}} is beyond the {model}'s range ({{limit}}): extrapolated",
        model,
        values=(Value("top", float(np.max(arr)), what), Value("limit", float(limit), what)),
    )


def mud_density(
    surface_density, composition: MudComposition, temperature, pressure, reference_temperature
):
    """Mud density at temperature and pressure [kg/m³] by the compositional model.

    .. math::

        \\rho_m(T, p) = \\frac{\\rho_{m,0}}
            {f_o\\,\\rho_{o,0}/\\rho_o(T, p) + f_w\\,\\rho_{w,0}/\\rho_w(T, p) + f_s}

    Parameters
    ----------
    surface_density : float
        Mud weight measured at the surface ρ_m,0 [kg/m³], > 0, at ``reference_temperature``.
    composition : MudComposition
        Volume fractions at the surface and the liquids' models.
    temperature : float or array_like
        Temperature [K].
    pressure : float or array_like
        Gauge pressure [Pa], ≥ 0.
    reference_temperature : float
        Temperature at which the mud weight was measured [K] (at 0 gauge).

    Notes
    -----
    Mass is conserved; solids are incompressible; the liquids change volume as their models
    say; no gas, no dissolution, no chemical change.

    References
    ----------
    Sorelle et al. (1982) SPE 11118 (the compositional form, incompressible solids).
    IAPWS-IF97 (2007) region 1 (water).

    Examples
    --------
    With the temperature and the pressure at the surface state, the mud weight is unchanged:

    >>> c = MudComposition(0.0, 0.885, 0.115)
    >>> round(mud_density(1198.3, c, 293.15, 0.0, 293.15), 6)
    1198.3
    """
    rho0 = float(check_range("surface density", surface_density, 0.0, np.inf, "kg/m³",
                             lo_open=True))  # fmt: skip
    if not isinstance(composition, MudComposition):
        raise InputError("composition", type(composition).__name__, "a MudComposition")
    t0 = float(_t_check("reference temperature", reference_temperature))
    t = _t_check("temperature", temperature)
    p = _p_check("pressure", pressure)
    vol = np.full(np.broadcast_shapes(t.shape, p.shape), composition.solids)
    if composition.oil > 0.0:
        model = BASE_FLUIDS[composition.oil_base][1]
        vol = vol + composition.oil / np.asarray(base_fluid_ratio(model, t, p, t0))
    if composition.water > 0.0:
        model = BASE_FLUIDS[composition.water_base][1]
        vol = vol + composition.water / np.asarray(base_fluid_ratio(model, t, p, t0))
    return float_or_array(rho0 / vol)
