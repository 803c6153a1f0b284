"""How every registered method has been checked: one status per entry of every registry.

This module is the one place the statuses of the methods registered before their evidence was
written down are declared (:meth:`calc.registry.MethodRegistry.set_status`); it is imported by
``calc/__init__.py``, so the statuses are set whenever :mod:`calc` is imported.  A method
registered later declares its own status with ``register(..., status=...)`` beside its code.

Each :class:`~calc.registry.Verification` says what the tests actually compare (the test file
and test, the outside reference, the tolerance) and lists the caveats a user must know; the
kinds are those of :data:`calc.registry.STATUS_KINDS`, the words of calc/METHODS.md §0.3, and
each entry agrees with the status line of its calc/METHODS.md section (table in §17).

:func:`list_methods` lists every registered method of every registry with its status.

>>> rows = list_methods()
>>> rows[0]["family"], rows[0]["name"], rows[0]["status"]
('hydraulics method', 'api13d_2010_hb', 'from_memory')
>>> next(r for r in rows if r["name"] == "exact_laminar")["status"]
'exact_solution'
"""

from __future__ import annotations

from calc.bit.optimisation import OPTIMISATION_CRITERIA
from calc.cleaning.bed import BED_METHODS
from calc.cleaning.deviated import DEVIATED_METHODS
from calc.cleaning.slip import SLIP_METHODS
from calc.downhole.density import DENSITY_MODELS
from calc.flow import FRICTION_LAWS
from calc.flow.minor_losses import JOINT_LOSS_METHODS
from calc.flow.rotation import ROTATION_METHODS
from calc.hydraulics_method import DEFAULT_METHOD, HYDRAULICS_METHODS, resolve_method
from calc.notes import Note
from calc.registry import MethodRegistry, Verification
from calc.rheology import TABLE_FITS, VISCOMETER_FITS
from calc.rheology.temperature import TEMPERATURE_LAWS
from calc.rheology.viscometer import VISCOMETER_CORRECTIONS
from calc.slurry import SLURRY_METHODS
from calc.values import Value

__all__ = ["REGISTRIES", "caveat_notes", "list_methods", "method_caveats"]

#: Every registry of the calc layer, in the order :func:`list_methods` lists them (the
#: hydraulics methods users name first, then what they are built from).
REGISTRIES: tuple[MethodRegistry, ...] = (
    HYDRAULICS_METHODS,
    FRICTION_LAWS,
    VISCOMETER_FITS,
    TABLE_FITS,
    SLIP_METHODS,
    DEVIATED_METHODS,
    OPTIMISATION_CRITERIA,
    BED_METHODS,
    ROTATION_METHODS,
    JOINT_LOSS_METHODS,
    DENSITY_MODELS,
    SLURRY_METHODS,
    TEMPERATURE_LAWS,
    VISCOMETER_CORRECTIONS,
)

V = Verification

# Caveats shared by several entries (one wording each).
_API10_FIT = (
    "the 1.066 stress factor of the API RP 13D (2010) Herschel-Bulkley estimate and its adoption "
    "by API are from memory, not yet checked against the standard (calc/METHODS.md §3.5)"
)
_API10_LAW = (
    "the API RP 13D (2006/2010) yield-power-law structure (geometry factor, Reynolds number, "
    "laminar/turbulent bounds and the blended friction factor) is from memory, not yet checked "
    "against the standard (calc/METHODS.md §7.1, §6.12, §6.13)"
)
_API10_COST = (
    "in plug-dominated laminar flow its loss is up to 30 % (pipe) and 48 % (annulus) above the "
    "exact Herschel-Bulkley solution; 2.0 % and 6.5 % when the yield stress is at most half the "
    "wall stress (tests/test_flow_methods.py)"
)
_API95 = (
    "API RP 13D (1995) equations taken from a secondary account, not read in the standard "
    "itself (calc/METHODS.md §3.2, §7.2)"
)
_API95_JUMP = (
    "no transitional zone, as published: the friction factor jumps at Re 2100, so a loss can "
    "fall as the rate rises (calc/METHODS.md §7.2)"
)
_SLOT = (
    "annular laminar flow by the plane-slot approximation: up to 2.3 % below the exact "
    "concentric annulus at D1/D2 = 0.3, 0.8 % at 0.5 (tests/test_flow_methods.py)"
)
_HANKS = (
    "Hanks' critical-Reynolds constant (16,800) is from memory, not yet checked against the "
    "source (calc/METHODS.md §6.14)"
)
_DARBY = (
    "Darby, Mun & Boger (1992) coefficients from memory (the paper seen second-hand), not yet "
    "checked against the source (calc/METHODS.md §6.15)"
)
_DARBY_LOW = (
    "a slurry correlation fitted to large Hedström numbers: at He → 0, Re 10⁴ it reads 0.45 × "
    "the Newtonian (Colebrook) friction factor, so it reads low for drilling muds "
    "(test_darby_caveat_is_the_measured_gap_to_colebrook)"
)
_LAMINAR_ONLY = (
    "laminar flow only: where the Reynolds number is above the laminar limit it underestimates "
    "the loss (a warning names the intervals); concentric annulus only"
)
_NO_EXAMPLE = (
    "no printed worked example was found to test it against (tests/WORKED_EXAMPLES.md); "
    "constants from memory, not yet checked against the source"
)

# ------------------------------------------------------------------------- friction laws

FRICTION_LAWS.set_status(
    "api13d_2010_hb",
    V(
        "from_memory",
        "The SI code equals the field recipe written out with exact constants "
        "(test_api_hb_field_recipe_equals_si, 1e-9) and its geometry factor reduces to the "
        "pipe and slot forms (1e-14); its laminar loss is measured against the exact solutions "
        "(test_fast_methods_within_stated_tolerance_of_exact_laminar). These checks cannot "
        "catch a wrongly recalled structure.",
        (_API10_LAW, _API10_COST),
    ),
)
FRICTION_LAWS.set_status(
    "api13d_1995_power_law",
    V(
        "published_example",
        "With constants='as_printed' it reproduces every printed digit of the Texas A&M PETE "
        "411 drill-pipe example (n, K, V, μe, Re, a, b, f, 0.05837 psi/ft, 665 psi; "
        "tests/test_worked_examples_flow.py::test_tamu_api1995_drill_pipe_as_printed). "
        "Effective viscosity and Reynolds number equal the printed field form "
        "(test_api95_effective_viscosity_reynolds, 1e-5); the jump at Re 2100 is exactly "
        "a/2100^b over c/2100 (test_api95_as_published_jump_at_2100); the laminar pipe branch "
        "equals the exact power-law solution (5e-14).",
        (_API95, _API95_JUMP, _SLOT),
    ),
)
FRICTION_LAWS.set_status(
    "newtonian",
    V(
        "reference_library",
        "Turbulent Colebrook agrees with fluids.friction.Colebrook to 1e-9 "
        "(test_colebrook_against_fluids_library) and fluids.friction.friction_factor within "
        "1 %; laminar Hagen-Poiseuille and Lamb annulus agree with the exact solutions to "
        "1e-10 / 1e-9 (tests/test_flow_exact.py).",
        ("transition by linear interpolation between Re 2100 and 4000 (common practice)",),
    ),
)
FRICTION_LAWS.set_status(
    "bingham",
    V(
        "reference_library",
        "Turbulent branch agrees with fluids.friction.Colebrook on the plastic viscosity to 1e-9 "
        "(test_bingham_turbulent_tends_to_colebrook); laminar pipe equals the Buckingham-Reiner "
        "closed form to 1e-9 (test_bingham_laminar_is_buckingham_reiner_closed_form); Guo & Liu "
        "(2011) Ex. 2.5 annular velocities and regime as printed "
        "(test_gl_2_5_bingham_annulus_laminar_loss).",
        (
            _HANKS,
            "turbulent from Re_Bc + 1900 and τ_w never below the laminar value are this "
            "program's choices (calc/METHODS.md §7.4)",
            "annular laminar flow by the exact Bingham slot: 2.3 % below the exact annulus at "
            "D1/D2 = 0.3",
        ),
    ),
)
FRICTION_LAWS.set_status(
    "bingham_darby_1992",
    V(
        "from_memory",
        "Laminar pipe equals Buckingham-Reiner to 1e-6 for Re ≤ 0.5·Re_Bc "
        "(test_bingham_darby_pipe_laminar_is_buckingham_reiner); the blend limits are checked "
        "(test_darby_blend_limits); the turbulent correlation itself is not compared with "
        "anything outside the project.",
        (_DARBY, _DARBY_LOW, _HANKS),
    ),
)
FRICTION_LAWS.set_status(
    "power_law",
    V(
        "published_example",
        "Guo & Liu (2011) Illustrative Example 2.6: Metzner-Reed Reynolds numbers and the "
        "n-dependent bounds as printed (test_gl_2_6_power_law_pipe, "
        "test_gl_2_6_reynolds_bounds); turbulent branch equals the Dodge-Metzner equation "
        "solved by Brent's method to 1e-10; laminar pipe exact (5e-14).",
        (
            "the printed losses of Guo & Liu Ex. 2.6 use a Blasius factor; this law uses "
            "Dodge-Metzner and gives 341/180 psi where the book prints 408/211 psi",
            "annular laminar flow by the slot approximation: within 0.4 % of the exact annulus "
            "at D1/D2 = 0.7",
            "pipe roughness is ignored",
        ),
    ),
)
FRICTION_LAWS.set_status(
    "exact_laminar",
    V(
        "exact_solution",
        "Agrees with the exact laminar solutions: Hagen-Poiseuille and Lamb (1e-10 / 1e-9), "
        "Buckingham-Reiner (1e-11), the power-law pipe (1e-11), the Herschel-Bulkley pipe "
        "against scipy quadrature (1e-10) and the concentric annulus against an independent "
        "quadrature (1e-8), tending to the exact slot as the gap narrows "
        "(tests/test_flow_exact.py).",
        (_LAMINAR_ONLY,),
    ),
)

# ------------------------------------------------------------------------ viscometer fits

VISCOMETER_FITS.set_status(
    "power_law_two_speed",
    V(
        "field_form_only",
        "Not tested on its own; its two-point code path is shared with api13d_1995_pipe, whose "
        "n and K equal the printed field formulas (test_api_1995_pipe_and_annulus_against_"
        "field_formulas, 0.1 %).",
        ("two-point fit: matches two readings only",),
    ),
)
for _name, _pair in (("api13d_1995_pipe", "600/300"), ("api13d_1995_annulus", "100/3")):
    VISCOMETER_FITS.set_status(
        _name,
        V(
            "field_form_only",
            f"n and K through {_pair} rpm equal the printed field formulas "
            "(test_api_1995_pipe_and_annulus_against_field_formulas: 0.1 %, exact constants "
            "1e-12); exact Newtonian readings give n = 1 (test_newtonian_gives_n_one_and_zero_"
            "yield).",
            (_API95, "two-point fit: matches two readings only"),
        ),
    )
VISCOMETER_FITS.set_status(
    "bingham_two_speed",
    V(
        "field_form_only",
        "μp and τy equal the field PV and YP of API RP 13B-1 (test_bingham_two_speed_is_pv_yp, "
        "1e-4); the bingham hydraulics method is fed them "
        "(test_bingham_preset_is_the_field_pv_yp).",
        ("YP read as a dial stress: 6.7 % below the instrument stress (calc/METHODS.md §1.7)",),
    ),
)
VISCOMETER_FITS.set_status(
    "api13d_2010_hb",
    V(
        "from_memory",
        "τy, n and K equal the field formulas (test_api_2010_hb_against_field_formulas: 0.1 %, "
        "K 0.2 %) and the dial form printed by Guo & Liu (2011) eqs. 2.12-2.14 (0.1 %).",
        (
            _API10_FIT,
            "2θ3 − θ6 can overstate τy in polymer-rich water-based muds (Guo & Liu 2011)",
        ),
    ),
)
VISCOMETER_FITS.set_status(
    "hb_least_squares",
    V(
        "reference_library",
        "Agrees with scipy.optimize.curve_fit on the same objective and bounds to 1e-5, SSE not "
        "above scipy's (test_hb_least_squares_agrees_with_scipy_curve_fit); recovers exact "
        "synthetic parameters to 1e-6 (test_hb_least_squares_recovers_exact_parameters).",
    ),
)
VISCOMETER_FITS.set_status(
    "power_law_least_squares",
    V(
        "exact_solution",
        "Exact Newtonian readings give n = 1 to 1e-9 (test_newtonian_gives_n_one_and_zero_yield).",
        ("checked on exact Newtonian readings only",),
    ),
)
VISCOMETER_FITS.set_status(
    "bingham_least_squares",
    V(
        "exact_solution",
        "Exact Newtonian readings give μp to 1e-9 and τy = 0 "
        "(test_newtonian_gives_n_one_and_zero_yield); τy is held ≥ 0.",
        (
            "checked on exact Newtonian readings only",
            "the API RP 10B-2 practice it follows was read second-hand",
        ),
    ),
)
VISCOMETER_FITS.set_status(
    "newtonian_least_squares",
    V(
        "exact_solution",
        "Exact Newtonian readings give 20 cP to 1e-12 (test_newtonian_gives_n_one_and_zero_yield).",
    ),
)
VISCOMETER_FITS.set_status(
    "power_law_loglog",
    V(
        "reference_library",
        "Equals the regression line of scipy.stats.linregress on log-log axes to 1e-10 "
        "(test_power_law_loglog_is_the_log_log_regression_line).",
    ),
)

# ------------------------------------------------------------------ rheometer-table fits

TABLE_FITS.set_status(
    "power_law_loglog",
    V(
        "exact_solution",
        "An exact power-law table is recovered to 1e-10 (test_power_law_loglog_exact); the "
        "Carreau high-shear slope n − 1 within 0.01.",
    ),
)
TABLE_FITS.set_status(
    "hb_least_squares",
    V(
        "self_consistency",
        "Only a ranking regression (a mud's readings as a table rank this fit first, "
        "test_table_ranking_prefers_true_model) and bad-input properties are tested.",
    ),
)
TABLE_FITS.set_status(
    "newtonian_least_squares",
    V(
        "self_consistency",
        "Only through the ranking and property tests (tests/test_rheology_table.py).",
    ),
)
TABLE_FITS.set_status(
    "cross",
    V(
        "exact_solution",
        "Exact Cross tables are recovered: η0, λ, m to 1e-4, η∞ to 1e-6·η0 "
        "(test_plateau_models_recover_parameters).",
    ),
)
TABLE_FITS.set_status(
    "carreau_yasuda",
    V(
        "exact_solution",
        "Exact Carreau-Yasuda tables are recovered: η0, λ, n, a to 1e-4 "
        "(test_plateau_models_recover_parameters, test_carreau_high_shear_slope_is_n_minus_1).",
        ("a is fitted only with at least 7 points; otherwise Carreau (a = 2)",),
    ),
)

# ------------------------------------------------------------------- slip-velocity methods

SLIP_METHODS.set_status(
    "moore",
    V(
        "from_memory",
        "Viscous branch equals 0.6 × Stokes (1e-9) and the turbulent branch its closed form "
        "(1e-9); the three branches equal field forms taken from a compilation within 1 % "
        "(tests/test_cleaning_slip.py).",
        (
            _NO_EXAMPLE + " (calc/METHODS.md §10.3)",
            "the published drag law is discontinuous at Re 3 and 300; the larger slip velocity "
            "is taken (conservative)",
        ),
    ),
)
SLIP_METHODS.set_status(
    "chien",
    V(
        "from_memory",
        "Reduces to Stokes' law at low Re (a = 24.0 within 0.2 %) and equals the printed field "
        "form (test_chien_field_form, 1e-9).",
        (_NO_EXAMPLE + " (calc/METHODS.md §10.4)",),
    ),
)
SLIP_METHODS.set_status(
    "walker_mayes",
    V(
        "from_memory",
        "Shear rate and velocity equal the field form (test_walker_mayes_field_form, 1e-9); a "
        "yield stress holds small cuttings (test_yield_stress_holds_small_cuttings).",
        (
            _NO_EXAMPLE + " (calc/METHODS.md §10.5)",
            "the turbulent branch (Re ≥ 100, thin-disc drag 1.17, White, Fluid Mechanics, "
            "from memory) is this program's completion",
        ),
    ),
)
SLIP_METHODS.set_status(
    "api13d",
    V(
        "from_memory",
        "Low-Re limit is 24/a × Stokes (1e-3) and the Newtonian field form is reproduced "
        "(test_api13d_field_form_newtonian, 1e-6).",
        (
            "the API RP 13D (1995) slip formula was seen second-hand; constants, units and "
            "grouping from memory, not yet checked against the source (calc/METHODS.md §10.6)",
        ),
    ),
)
SLIP_METHODS.set_status(
    "drag_balance",
    V(
        "from_memory",
        "At sphericity 1 the drag agrees with fluids.drag.Haider_Levenspiel within 7 % and the "
        "settling velocity with fluids.drag.v_terminal within 7 %; reduces to Stokes' law "
        "(tests/test_cleaning_slip.py); the exact Stokes limit (1e-3) and the Newton-region "
        "balance hold also with annular flow (tests/test_cleaning_deviated.py).",
        (
            "Haider & Levenspiel (1989) coefficients from memory, not yet checked against the "
            "source; the sphericity dependence is not compared with anything "
            "(calc/METHODS.md §10.7)",
            "the mud's viscosity is taken at the quadrature sum of the particle and annular wall "
            "shear rates, √((V_s/d_s)² + (12V_a/(D2−D1))²): this program's combination, not a "
            "published correlation",
        ),
    ),
)
SLIP_METHODS.set_status(
    "fang_2008",
    V(
        "published_example",
        "Guo & Liu (2011) Table 2.4, p. 56: A′, B′, C′, the drag 2.9350 at Re 240 and the slip "
        "velocity 0.5166 ft/s as printed (tests/test_worked_examples_cleaning.py).",
        (
            "validity 0.1 ≤ Re_p ≤ 10⁵ not verified; below the Stokes-like slope the correlation "
            "is continued with slope −1 (this program's choice)",
            "the mud's viscosity is taken at the quadrature sum of the particle and annular wall "
            "shear rates: this program's combination, not a published correlation",
        ),
    ),
)

# ------------------------------------------------------------ nozzle optimisation criteria

OPTIMISATION_CRITERIA.set_status(
    "max_power",
    V(
        "independent_reimplementation",
        "The optimum equals a bounded numerical maximisation of (p − cQ^m)·Q: rate 1e-5, power "
        "1e-8, m 1.4-2.0 (test_max_power_bit_share_and_brute_force).",
        ("assumes a parasitic loss c·Q^m with one exponent m over the rate range",),
    ),
)
OPTIMISATION_CRITERIA.set_status(
    "max_impact",
    V(
        "independent_reimplementation",
        "The optimum equals a numerical maximisation of the jet impact force: rate 1e-5 "
        "(test_max_impact_bit_share_and_brute_force); the impact ratio of the two designs to "
        "1e-12.",
        ("assumes a parasitic loss c·Q^m with one exponent m over the rate range",),
    ),
)

# ------------------------------------------------------------------- hydraulics methods

HYDRAULICS_METHODS.set_status(
    "api13d_2010_hb",
    V(
        "from_memory",
        "Fit and friction law equal their field recipes written out with exact constants "
        "(test_api_2010_hb_against_field_formulas, test_api_hb_field_recipe_equals_si); the "
        "laminar loss is measured against the exact Herschel-Bulkley solutions "
        "(tests/test_flow_methods.py). These checks cannot catch a wrongly recalled constant.",
        (_API10_FIT, _API10_LAW, _API10_COST),
    ),
)
HYDRAULICS_METHODS.set_status(
    "api13d_1995_power_law",
    V(
        "published_example",
        "Pipe path reproduces the Texas A&M PETE 411 worked example to its printed digits with "
        "constants='as_printed' (tests/test_worked_examples_flow.py, drill pipe 665 psi); its "
        "annulus and bit parts were not legible in the copy found. "
        "Fits and friction law equal the printed field forms (test_api_1995_pipe_and_annulus_"
        "against_field_formulas, test_api95_effective_viscosity_reynolds); the laminar pipe "
        "branch equals the exact solution.",
        (_API95, _API95_JUMP, _SLOT),
    ),
)
HYDRAULICS_METHODS.set_status(
    "newtonian",
    V(
        "reference_library",
        "Colebrook agrees with fluids.friction.Colebrook to 1e-9; laminar pipe and annulus "
        "exact (tests/test_flow_exact.py); the fit is exact on Newtonian readings.",
        (
            "a Newtonian fit ignores yield stress and shear thinning: a reference, not a "
            "drilling-mud model",
        ),
    ),
)
HYDRAULICS_METHODS.set_status(
    "bingham",
    V(
        "reference_library",
        "Turbulent friction agrees with fluids.friction.Colebrook on PV to 1e-9, laminar pipe "
        "with Buckingham-Reiner to 1e-9; the fit is the field PV/YP of API RP 13B-1; Guo & Liu "
        "(2011) Ex. 2.5 reproduced once the book's conventions are written out "
        "(tests/test_worked_examples_flow.py).",
        (_HANKS,),
    ),
)
HYDRAULICS_METHODS.set_status(
    "bingham_darby_1992",
    V(
        "from_memory",
        "Laminar pipe equals Buckingham-Reiner to 1e-6; the fit is the field PV/YP; the "
        "turbulent correlation is not compared with anything outside the project.",
        (_DARBY, _DARBY_LOW),
    ),
)
HYDRAULICS_METHODS.set_status(
    "power_law",
    V(
        "published_example",
        "Reynolds numbers and bounds of Guo & Liu (2011) Ex. 2.6 as printed; turbulent "
        "Dodge-Metzner solved to 1e-10; the log-log fit equals scipy.stats.linregress to 1e-10.",
        (
            "the printed losses of Guo & Liu Ex. 2.6 use a Blasius factor; this method gives "
            "lower losses with Dodge-Metzner",
            "a power law has no yield stress: annular losses at low shear read low",
        ),
    ),
)
HYDRAULICS_METHODS.set_status(
    "exact_laminar",
    V(
        "exact_solution",
        "The friction law agrees with the exact laminar Herschel-Bulkley pipe and annulus "
        "solutions (tests/test_flow_exact.py, 1e-8 to 1e-11); the least-squares fit agrees with "
        "scipy.optimize.curve_fit to 1e-5.",
        (_LAMINAR_ONLY,),
    ),
)


def list_methods() -> list[dict]:
    """Every registered method of every registry, with its source and status.

    Rows (plain data; the faces word the status with ``addin.text.status_label``): ``family``
    (the registry's word), ``name``, ``description``, ``source``, ``status`` (a kind of
    :data:`calc.registry.STATUS_KINDS`), ``evidence`` and ``caveats`` (a tuple of texts).
    Hydraulics methods come first, the default (:data:`calc.hydraulics_method.DEFAULT_METHOD`)
    at the top; then friction laws, viscometer fits, rheometer-table fits, slip-velocity
    methods and nozzle-optimisation criteria, each in registration order.

    Examples
    --------
    >>> rows = list_methods()
    >>> rows[0]["name"] == DEFAULT_METHOD
    True
    >>> "cuttings-bed model" in {r["family"] for r in rows}
    True
    """
    rows = []
    for reg in REGISTRIES:
        infos = reg.describe()
        if reg is HYDRAULICS_METHODS:
            infos.sort(key=lambda i: i.name != DEFAULT_METHOD)
        for info in infos:
            rows.append(
                {
                    "family": reg.what,
                    "name": info.name,
                    "description": info.description,
                    "source": info.source,
                    "status": info.status.kind,
                    "evidence": info.status.evidence,
                    "caveats": tuple(info.status.caveats),
                }
            )
    return rows


def method_caveats(
    method,
    slip_method: str | None = None,
    bed_method: str | None = None,
    slurry_methods: tuple[str, ...] = (),
) -> tuple[tuple[str, str, str], ...]:
    """The caveats of a hydraulics method and of the fits and friction law it uses.

    ``method`` is a name or a :class:`calc.hydraulics_method.HydraulicsMethod` (overrides
    included); ``slip_method`` a slip-velocity method used with it (hole cleaning), or None;
    ``bed_method`` a cuttings-bed model used (:data:`calc.cleaning.bed.BED_METHODS`), or None;
    ``slurry_methods`` the settling-slurry methods used (:data:`calc.slurry.SLURRY_METHODS`).
    Returns ``(family, name, caveat)`` triples, each caveat text once: the preset's own first
    (left out when overrides replace part of it: they speak of the preset as registered), then
    its friction law's, its fits' and the slip method's.

    Examples
    --------
    >>> any("1.066" in c for _, _, c in method_caveats("api13d_2010_hb"))
    True
    >>> method_caveats("hb_none")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    calc.errors.InputError: hydraulics method = 'hb_none': unknown; allowed: ...
    """
    m = resolve_method(method)
    parts = [] if m.overrides else [(HYDRAULICS_METHODS, m.name)]
    parts += [
        (FRICTION_LAWS, m.friction),
        (VISCOMETER_FITS, m.pipe_fit),
        (VISCOMETER_FITS, m.annulus_fit),
    ]
    if slip_method is not None:
        parts.append((SLIP_METHODS, slip_method))
    if slip_method is not None:  # hole cleaning ran: every deviated-hole method applies
        parts += [(DEVIATED_METHODS, name) for name in DEVIATED_METHODS.names()]
    if bed_method is not None:
        parts.append((BED_METHODS, bed_method))
    parts += [(SLURRY_METHODS, name) for name in slurry_methods]
    seen: dict[str, tuple[str, str, str]] = {}
    for reg, name in parts:
        for c in reg.get(name).status.caveats:
            seen.setdefault(c, (reg.what, name, c))
    return tuple(seen.values())


def caveat_notes(
    method,
    slip_method: str | None = None,
    bed_method: str | None = None,
    slurry_methods: tuple[str, ...] = (),
) -> tuple[Note, ...]:
    """One warning note (code ``method_caveat``) per caveat of :func:`method_caveats`, so a
    report lists every caveat of the methods it used beside its other findings.

    Examples
    --------
    >>> notes = caveat_notes("exact_laminar")
    >>> notes[0].code, notes[0].value("method").value
    ('method_caveat', 'exact_laminar')
    """
    return tuple(
        Note(
            "warning",
            "method_caveat",
            "{family} {method}: {caveat}",
            "method",
            (Value("family", family), Value("method", name), Value("caveat", caveat)),
        )
        for family, name, caveat in method_caveats(method, slip_method, bed_method, slurry_methods)
    )
