"""``boreflow rheology CASE``: the rheology of every mud check and slurry, as text or JSON."""

from __future__ import annotations

from addin.case import load_case
from addin.commands.exit_codes import EXIT_OK
from addin.commands.output import json_text
from addin.report.jsonout import rheology_json
from addin.rheology_data import rheology_data
from calc.errors import InputError

__all__ = ["rheology_text", "run"]

_PARAM_LABELS = {
    "n": "n",
    "K": "K",
    "tau_y": "τy",
    "PV": "PV",
    "YP": "YP",
    "LSYP": "LSYP",
    "gel_10s": "gel 10 s",
    "gel_10min": "gel 10 min",
    "gel_30min": "gel 30 min",
}


def _g(x, digits=4):
    return "—" if x is None else f"{x:.{digits}g}"


def _fluid_text(d) -> list[str]:
    su, vu = d["stress_unit"], d["viscosity_unit"]
    temp = "" if d["temperature"] is None else f", {d['temperature']:.4g} {d['temperature_unit']}"
    lines = [f"{d['label']}  ({d['mode']}, {d['instrument']}{temp})"]
    lines.append("  rpm        " + "".join(f"{s:>9g}" for s in d["speeds_rpm"]))
    lines.append("  dial [°]   " + "".join(f"{s:>9g}" for s in d["dial_deg"]))
    lines.append("  γ̇ [1/s]    " + "".join(f"{s:>9.4g}" for s in d["shear_rate_1_s"]))
    lines.append(f"  τ [{su}]".ljust(13) + "".join(f"{s:>9.4g}" for s in d["shear_stress"]))
    if "up_down_ratio" in d:
        lines.append("  up/down    " + "".join(f"{s:>9.3g}" for s in d["up_down_ratio"]))
    gels = " / ".join(f"{k} {_g(v, 3)}" for k, v in d["gels"].items()) or "—"
    lines.append(
        f"  PV {_g(d['pv'])} {vu}   YP {_g(d['yp'])} {su}   LSYP {_g(d['lsyp'])} {su}   "
        f"gels {gels} {su if d['gels'] else ''}".rstrip()
    )
    lines.append(f"  ({d['pv_definition']}; YP, LSYP, gels by the field convention)")
    lines.append("  fits (quality over all readings used, RMSE in stress):")
    for f in d["fits"]:
        params = ", ".join(
            f"{k} = {p['value']:.4g}{' ' + p['unit'] if p['unit'] else ''}"
            for k, p in f["parameters"].items()
        )
        lo, hi = f["shear_rate_range"]
        q = f["quality"]
        lines.append(f"    {f['method']:<24} {f['model']:<17} {params}")
        lines.append(
            f"    {'':<24} RMSE {q['rmse']:.3g} {q['rmse_unit']}, R² {q['r2']:.5f}, "
            f"fitted over {lo:.4g}–{hi:.4g} 1/s"
        )
        lines.extend(f"    {'':<24} {n}" for n in f["notes"])
    lines.append("  ranking (residual standard error on all readings):")
    for e in d["ranking"]:
        lines.append(f"    {e['rank']:>2}. {e['method']:<24} s = {_g(e['std_error'], 3)} {su}")
    if d["notes"]:
        lines.append("  notes:")
        lines.extend(f"    {n}" for n in d["notes"])
    return lines


def _comparison_text(c) -> list[str]:
    lines = [f"{c['a']} → {c['b']}  (n, K, τy from {c['method']})"]
    lines.append(f"    {'parameter':<12}{'a':>10}{'b':>10}{'change':>10}{'rel.':>9}  unit")
    for r in c["changes"]:
        rel = "—" if r["relative"] is None else f"{100 * r['relative']:+.1f}%"
        flag = "  ← beyond tolerance" if r["flagged"] else ""
        lines.append(
            f"    {_PARAM_LABELS[r['parameter']]:<12}{r['a']:>10.4g}{r['b']:>10.4g}"
            f"{r['change']:>+10.3g}{rel:>9}  {r['unit']}{flag}"
        )
    verdict = "differ" if c["curves_differ"] else "do not differ"
    lines.append(
        f"    flow curves {verdict} by more than the reading resolution: largest "
        f"difference {c['max_curve_difference_deg']:+.2f}° at {c['at_shear_rate_1_s']:.4g}"
        f" 1/s (threshold {c['threshold_deg']:g}°)"
    )
    lines.extend(f"    {n}" for n in c["notes"])
    return lines


def rheology_text(data: dict) -> str:
    """The text ``boreflow rheology`` prints for :func:`~addin.rheology_data.rheology_data`."""
    out = [
        f"boreflow rheology — {data['case']}  {data['title']}".rstrip(),
        f"units: {data['units']}",
        "",
    ]
    if data["checks"]:
        out.append("MUD CHECKS")
        for d in data["checks"]:
            out += [*_fluid_text(d), ""]
    if data["slurries"]:
        out.append("CEMENT SLURRIES AND SPACERS")
        for d in data["slurries"]:
            out += [*_fluid_text(d), ""]
    if data["comparisons"]:
        out.append("CHANGES BETWEEN CONSECUTIVE CHECKS")
        for c in data["comparisons"]:
            out += [*_comparison_text(c), ""]
    out.append(data["caution"])
    return "\n".join(out)


def run(args) -> int:
    """Print the rheology of ``args.case`` in ``args.units`` (default the case's), text or JSON."""
    case = load_case(args.case).with_shear_rate_correction(
        getattr(args, "shear_rate_correction", None)
    )
    if not case.checks and not case.slurries:  # an empty file is not a rheology: exit 2
        raise InputError(
            case.source, "no [[check]] and no [[slurry]]", "at least one of them", problem="empty"
        )
    system = args.units or case.unit_system
    data = rheology_data(case, system)
    print(json_text(rheology_json(data)) if args.json else rheology_text(data))
    return EXIT_OK
