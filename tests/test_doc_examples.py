"""Every public calc function that computes a trade quantity carries an ``Examples`` doctest.

The doctests themselves run with pytest's ``--doctest-modules`` (pyproject.toml); this test
makes sure they exist, so a new public function cannot arrive without a worked example.

The rule (what "computes a trade quantity" means here)
------------------------------------------------------
Walk every module of ``calc`` (``pkgutil.walk_packages``) except the packages in
:data:`EXCLUDED_PACKAGES` and the infrastructure modules in :data:`INFRASTRUCTURE`.  Each name in
a module's ``__all__`` that is defined in ``calc`` is required to have a numpydoc ``Examples``
section in its own docstring when it is

* a function, or
* a class with at least one public method or property in its body (it computes on request:
  a model's ``stress``, a survey's ``tvd_at``, a hole's ``diameter_at`` …).  A class that is
  only fields (a result record or an input record) is not required: the function that
  builds or reads it shows it in its own Examples.

Names in :data:`NOT_TRADE` are exempt, each with its reason (input checks, numerical solvers,
internal steps of one public function whose Examples show them, array plumbing, result records
whose methods are shown by the function returning them).  Both lists are for the lead to
shrink.
"""

from __future__ import annotations

import importlib
import inspect
import pkgutil
import re

import calc

#: Packages being rewritten elsewhere; their helpers add their own examples (lead: shrink).
EXCLUDED_PACKAGES = ("calc.cleaning", "calc.surge")

#: Modules that compute no trade quantity (errors, notes, values, places, registries, helpers).
INFRASTRUCTURE = {
    "calc.errors": "InputError and input checks",
    "calc.notes": "Note (level, code, wording) of results",
    "calc.values": "Value: an SI number with its kind, for notes",
    "calc.span": "Span: where a note or row lies",
    "calc.registry": "the name → implementation tables and their Verification status",
    "calc.kinds": "quantity kinds and unit systems as plain data",
    "calc.cautions": "the standard caution texts",
    "calc.numeric": "vectorised numerical helpers (bisection, scalar/array shaping)",
}

_INPUT_CHECK = "input check (raises InputError), no quantity"
_SOLVER = "numerical root finder (itp_solve carries the Examples of this module)"
_STATE = (
    "a registered friction law's state on an internal FlowCase; shown through "
    "pipe_flow/annulus_flow(method=...) Examples"
)
_LOOP_STEP = "a step of circulate(), which reads the well in named steps; circulate's Examples"
_PLUMBING = "array/record plumbing of results, no quantity"

#: Exempt names (module.qualname) with the reason.
NOT_TRADE = {
    "calc.circulation.band.check_band_inputs": _INPUT_CHECK,
    "calc.circulation.band.EcdBand": "result record of ecd_band, whose Examples show it",
    "calc.circulation.band.QuantityBand": "result record of ecd_band, whose Examples show it",
    "calc.downhole.profile.DownholeProfile": "result record of downhole_profile, whose Examples"
    " show it",
    "calc.downhole.temperature.CirculatingTemperature": "result record of "
    "circulating_temperature, whose Examples show it",
    "calc.flow.checks.require_n_at_most": _INPUT_CHECK,
    "calc.flow.checks.require_n_one": _INPUT_CHECK,
    "calc.flow.checks.require_no_yield": _INPUT_CHECK,
    "calc.flow.solvers.expand_bracket": _SOLVER,
    "calc.flow.solvers.newton_increasing_concave": _SOLVER,
    "calc.flow.solvers.solve_positive": _SOLVER,
    "calc.flow.methods_api.api13d_1995_state": _STATE,
    "calc.flow.methods_api.api13d_2010_state": _STATE,
    "calc.flow.methods_classic.bingham_darby_state": _STATE,
    "calc.flow.methods_classic.bingham_state": _STATE,
    "calc.flow.methods_classic.newtonian_state": _STATE,
    "calc.flow.methods_classic.power_law_state": _STATE,
    "calc.flow.methods_exact.exact_laminar_state": _STATE,
    "calc.flow.methods_exact.exact_wall_stress": _STATE,
    "calc.circulation.checks.check_points": _LOOP_STEP,
    "calc.circulation.checks.dedupe_notes": _LOOP_STEP,
    "calc.circulation.checks.interval_note": _LOOP_STEP,
    "calc.circulation.checks.margin_notes": _LOOP_STEP,
    "calc.circulation.checks.margin_table": _LOOP_STEP,
    "calc.circulation.checks.sweep_part": _LOOP_STEP,
    "calc.circulation.well_parts.annulus": _LOOP_STEP,
    "calc.circulation.well_parts.bit_drop": _LOOP_STEP,
    "calc.circulation.well_parts.bit_hydraulics": _LOOP_STEP,
    "calc.circulation.well_parts.check_method": _LOOP_STEP,
    "calc.circulation.well_parts.flow_notes": _LOOP_STEP,
    "calc.circulation.well_parts.method_label": _LOOP_STEP,
    "calc.circulation.well_parts.parts": _LOOP_STEP,
    "calc.circulation.well_parts.pipe": _LOOP_STEP,
    "calc.circulation.well_parts.reshape_bit": _LOOP_STEP,
    "calc.circulation.well_parts.tool_drops": _LOOP_STEP,
    "calc.circulation.result.as_scalar": _PLUMBING,
    "calc.circulation.result.reshape_flow": _PLUMBING,
    "calc.circulation.pore_fracture.as_plain": _PLUMBING,
    "calc.circulation.well_parts.WellParts": _LOOP_STEP,
    "calc.circulation.result.PathLosses": (
        "result record (losses of one flow path) inside circulate()'s result; its Examples"
    ),
    "calc.circulation.pore_fracture.MarginTable": (
        "result record returned by tabulate_margins(); index() is in its Examples"
    ),
    "calc.geometry.well.FlowIntervals": (
        "record returned by Well.flow_intervals(); string/annulus are in Well's Examples"
    ),
    "calc.circulation.result.CirculationResult": (
        "result record returned by circulate(); breakdown/ecd_at/profile are in circulate's "
        "Examples"
    ),
    "calc.flow.result.FlowResult": (
        "result record returned by pipe_flow/annulus_flow; its properties are in their Examples"
    ),
    "calc.rheology.fitresult.FitResult": (
        "result record returned by fit(); predict() is in fit's Examples"
    ),
    "calc.rheology.fitresult.FitSet": "result record returned by fit_all(); in its Examples",
    "calc.flow.result.FlowCase": (
        "validated inputs of one pipe_flow/annulus_flow call (internal record); their Examples"
    ),
    "calc.rheology.fit_viscometer.profile_fit": (
        "inner numerical step of fit_hb_stress (SSE profile over n); fit_hb_stress's Examples"
    ),
}

EXAMPLES = re.compile(r"^\s*Examples\n\s*-{3,}\s*\n", re.M)


def _computes_on_request(cls) -> bool:
    for name, member in vars(cls).items():
        if name.startswith("_"):
            continue
        if isinstance(member, property | staticmethod | classmethod) or inspect.isfunction(member):
            return True
    return False


def required_names() -> dict[str, object]:
    """module.qualname → object for every name the rule requires an Examples section of."""
    out: dict[str, object] = {}
    for info in pkgutil.walk_packages(calc.__path__, "calc."):
        if info.name.startswith(EXCLUDED_PACKAGES) or info.name in INFRASTRUCTURE:
            continue
        module = importlib.import_module(info.name)
        for name in getattr(module, "__all__", ()):
            obj = getattr(module, name)
            home = getattr(obj, "__module__", "") or ""
            if not home.startswith("calc.") or home.startswith(EXCLUDED_PACKAGES):
                continue
            if home in INFRASTRUCTURE:
                continue
            if inspect.isfunction(obj) or (inspect.isclass(obj) and _computes_on_request(obj)):
                out.setdefault(f"{home}.{obj.__qualname__}", obj)
    return out


def has_examples(obj) -> bool:
    return bool(EXAMPLES.search(obj.__doc__ or ""))


def test_every_public_trade_function_has_examples():
    required = required_names()
    assert len(required) > 100  # the walk found the calc API (guards a silent empty walk)
    missing = sorted(
        k for k, obj in required.items() if k not in NOT_TRADE and not has_examples(obj)
    )
    assert not missing, (
        "public calc functions without a numpydoc 'Examples' section (add a short doctest, a "
        "published worked example where one exists, or an exemption with its reason in "
        "tests/test_doc_examples.py NOT_TRADE):\n  " + "\n  ".join(missing)
    )


def test_exemptions_name_real_objects():
    """An exemption for a name that no longer exists (or that has gained Examples) is stale."""
    required = required_names()
    stale = sorted(k for k in NOT_TRADE if k not in required)
    assert not stale, f"NOT_TRADE names no required calc object: {stale}"
    for name in INFRASTRUCTURE:
        importlib.import_module(name)
    done = sorted(k for k in NOT_TRADE if has_examples(required[k]))
    assert not done, f"exempt but now with Examples (drop the exemption): {done}"


def test_the_rule_sees_a_missing_section():
    """The checker itself: a function without Examples is caught, one with them passes."""

    def without():
        """Compute nothing."""

    def with_examples():
        """Compute one.

        Examples
        --------
        >>> 1
        1
        """

    assert not has_examples(without)
    assert has_examples(with_examples)
