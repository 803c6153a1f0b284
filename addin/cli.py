"""The ``boreflow`` command line.

Subcommands (each adds itself through a ``_register_*`` function, so later faces add theirs):

``boreflow rheology CASE [--units oilfield|metric|si] [--json]``
    For every ``[[check]]`` and ``[[slurry]]`` in the case: the readings, PV/YP/LSYP/gels, every
    fit with its quality, the ranking and notes; then the comparison of consecutive checks and
    the one-line caution.

``boreflow report CASE [-o REPORT.xlsx] [--force] [--json]``
    The daily hydraulics report workbook from a TOML case file or an input workbook (.xlsx).
    Written atomically; an existing file is never replaced unless ``--force`` is given.

``boreflow calc hydrostatic|annular-velocity|bit|circulate ...``
    One-off numbers (``boreflow calc QUANTITY --help`` lists each one's options).

``boreflow batch PATH... -o FOLDER [--force] [--summary FILE.csv]``
    A report for every case (folders are searched for *.toml and *.xlsx, ``@list.txt`` reads
    paths from a file), with a progress bar on stderr and a summary table on stdout.

Exit codes
----------
0  success
1  internal error (a bug: please report it with the case file)
2  bad input (unknown option, unreadable or invalid case file or workbook, impossible
   readings); the message is one line on stderr, no traceback; nothing is written
3  the output file exists and ``--force`` was not given; nothing is written
4  the output could not be written (missing folder, permissions, disk full); any previous
   file is left intact
5  batch: at least one case failed (the others were written; see the summary table)
141  the reader of the output went away (``boreflow rheology CASE | head``): the rest of the
   output is dropped quietly, as other command-line tools do (128 + SIGPIPE)
"""

from __future__ import annotations

import argparse
import json
import os
import sys
from collections.abc import Callable

import numpy as np

from calc import cautions
from calc.errors import InputError
from calc.rheology import compare_series, fit_all
from calc.units import UNIT_SYSTEMS, from_si, label, unit_for

__all__ = [
    "EXIT_BAD_INPUT",
    "EXIT_BATCH_FAILED",
    "EXIT_BROKEN_PIPE",
    "EXIT_EXISTS",
    "EXIT_INTERNAL",
    "EXIT_OK",
    "EXIT_WRITE",
    "build_parser",
    "main",
]

EXIT_OK = 0
EXIT_INTERNAL = 1
EXIT_BAD_INPUT = 2
EXIT_EXISTS = 3
EXIT_WRITE = 4
EXIT_BATCH_FAILED = 5
EXIT_BROKEN_PIPE = 141  # 128 + SIGPIPE (13), the shell's code for a closed output pipe

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


class _ArgError(Exception):
    pass


class _Parser(argparse.ArgumentParser):
    def error(self, message):  # one line, exit code 2, no usage dump
        raise _ArgError(message)


def _unit(kind: str, system: str) -> tuple[str, str]:
    unit = unit_for(kind, system)
    text = label(unit)
    if kind == "consistency":
        text = text.replace("/", "·sⁿ/", 1) if "/" in text else text + "·sⁿ"
    return unit, text


def _conv(value, kind, system):
    if kind == "dimensionless":
        return value
    return from_si(value, unit_for(kind, system), kind)


# ------------------------------------------------------------------ rheology data
def _fit_dict(f, system):
    _, su = _unit("stress", system)
    q = f.quality
    lo, hi = f.shear_rate_range
    return {
        "method": f.method,
        "model": f.model.name,
        "description": f.description,
        "parameters": {
            k: {"value": v, "unit": u} for k, (v, u) in f.model.parameters(system).items()
        },
        "quality": {
            "space": q.space,
            "rmse": _conv(q.rmse, "stress", system),
            "rmse_unit": su,
            "r2": q.r2,
            "n_points": q.n_points,
            "residuals": [_conv(x, "stress", system) for x in q.residuals.tolist()],
        },
        "shear_rate_range": [lo, hi],
        "notes": [str(n) for n in f.notes],
        "source": f.source,
    }


def _field(r, attr):
    try:
        return getattr(r, attr)
    except InputError:
        return None


def _fluid_dict(name, r, system):
    fits = fit_all(r)
    _, su = _unit("stress", system)
    _, vu = _unit("viscosity", system)
    out = {
        "label": name,
        "mode": r.mode,
        "instrument": r.geometry.name,
        "temperature": None
        if r.temperature is None
        else _conv(r.temperature, "temperature", system),
        "temperature_unit": label(unit_for("temperature", system)),
        "speeds_rpm": r.speeds.tolist(),
        "dial_deg": r.dial.tolist(),
        "shear_rate_1_s": r.shear_rate.tolist(),
        "shear_stress": [_conv(x, "stress", system) for x in r.shear_stress.tolist()],
        "stress_unit": su,
        "viscosity_unit": vu,
        "pv": None if (v := _field(r, "pv")) is None else _conv(v, "viscosity", system),
        "pv_definition": r.pv_definition,
        "yp": None if (v := _field(r, "yp")) is None else _conv(v, "stress", system),
        "lsyp": None if (v := _field(r, "lsyp")) is None else _conv(v, "stress", system),
        "gels": {k: _conv(v, "stress", system) for k, v in r.gels_si.items()},
        "fits": [_fit_dict(f, system) for f in fits.results],
        "ranking": [
            {
                "rank": e.rank,
                "method": e.method,
                "model": e.model_name,
                "std_error": None if e.std_error is None else _conv(e.std_error, "stress", system),
                "r2": e.r2,
            }
            for e in fits.ranking
        ],
        "notes": [str(n) for n in (*r.notes, *fits.notes)],
    }
    if r.ramp_up is not None:
        out["up_down_ratio"] = r.up_down_ratio.tolist()
    return out


def _comparison_dict(c, system):
    rows = []
    for ch in c.changes:
        rows.append(
            {
                "parameter": ch.name,
                "a": _conv(ch.a, ch.kind, system),
                "b": _conv(ch.b, ch.kind, system),
                "change": _conv(ch.change, ch.kind, system)
                if ch.kind == "dimensionless"
                else _conv(ch.change, ch.kind, system) - _conv(0.0, ch.kind, system),
                "relative": ch.relative,
                "unit": "" if ch.kind == "dimensionless" else _unit(ch.kind, system)[1],
                "flagged": ch.flagged,
            }
        )
    return {
        "a": c.label_a,
        "b": c.label_b,
        "method": c.method,
        "changes": rows,
        "curves_differ": c.curves_differ,
        "max_curve_difference_deg": c.max_curve_difference,
        "at_shear_rate_1_s": c.max_difference_at,
        "threshold_deg": c.threshold,
        "reading_differences_deg": {f"{k:g}": v for k, v in c.reading_differences.items()},
        "notes": [str(n) for n in c.notes],
    }


def rheology_data(case, system: str) -> dict:
    """Everything ``boreflow rheology`` prints, as plain data (JSON-ready)."""
    return {
        "case": case.source,
        "title": case.header.get("title", ""),
        "units": system,
        "checks": [_fluid_dict(c.label, c.readings, system) for c in case.checks],
        "slurries": [_fluid_dict(s.name, s.readings, system) for s in case.slurries],
        "comparisons": [
            _comparison_dict(c, system) for c in compare_series([c.readings for c in case.checks])
        ],
        "caution": cautions.CELL,
    }


# ------------------------------------------------------------------ text output
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


def _cmd_rheology(args) -> int:
    from addin.case import load_case

    case = load_case(args.case)
    system = args.units or case.units
    data = rheology_data(case, system)
    if args.json:
        print(json.dumps(data, ensure_ascii=False, indent=2, default=_json_default))
    else:
        print(rheology_text(data))
    return EXIT_OK


def _json_default(obj):
    if isinstance(obj, np.generic):
        return obj.item()
    raise TypeError(type(obj).__name__)


def _register_rheology(sub) -> None:
    p = sub.add_parser("rheology", help="rheology of the mud checks and slurries of a case")
    p.add_argument("case", help="case file (TOML), e.g. workbooks/demo-case.toml")
    p.add_argument(
        "--units",
        choices=list(UNIT_SYSTEMS),
        default=None,
        help="unit system for output (default: the case's [case].units)",
    )
    p.add_argument("--json", action="store_true", help="machine-readable JSON output")
    p.set_defaults(func=_cmd_rheology)


def _register_report(sub) -> None:
    from addin.report import commands

    commands.register(sub)


#: Subcommand registrations; later faces append theirs (report, calc, batch).
REGISTRATIONS: list[Callable] = [_register_rheology, _register_report]


_EPILOG = """first run (the invented demo case):
  boreflow report workbooks/demo-case.toml -o demo-report.xlsx

more help: boreflow COMMAND --help

exit codes:
  0  success
  1  internal error (a bug; set BOREFLOW_DEBUG=1 for the traceback)
  2  bad input (the message names the file and key, or sheet and cell)
  3  output exists (use --force to replace it)
  4  cannot write the output (the previous file is left intact)
  5  batch: some cases failed (the others were written)
  141  output pipe closed by its reader (e.g. | head): rest of the output dropped
"""


def build_parser() -> argparse.ArgumentParser:
    parser = _Parser(
        prog="boreflow",
        description="Drilling-fluid and slurry hydraulics: rheology, circulating pressures, "
        "ECD, bit, hole cleaning, surge/swab, and the daily report workbook.",
        epilog=_EPILOG,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    for register in REGISTRATIONS:
        register(sub)
    return parser


def _broken_pipe() -> int:
    """The output pipe was closed by its reader: drop the rest of the output quietly.

    stdout is pointed at the null device so the interpreter's final flush cannot raise again
    (the approach of the Python documentation, "Note on SIGPIPE", module :mod:`signal`).
    """
    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
    except (OSError, ValueError, AttributeError):  # stdout without a file descriptor (tests)
        pass
    return EXIT_BROKEN_PIPE


def main(argv=None) -> int:
    """Run the command line; returns the exit code (0 ok, 2 bad input)."""
    parser = build_parser()
    try:
        args = parser.parse_args(argv)
        if not getattr(args, "func", None):
            parser.print_help()
            return EXIT_BAD_INPUT
        code = args.func(args)
        sys.stdout.flush()  # a closed pipe shows up here, inside the handler, not at exit
        return code
    except BrokenPipeError:
        return _broken_pipe()
    except SystemExit:  # --help printed: flush here so a closed pipe is handled quietly too
        try:
            sys.stdout.flush()
        except BrokenPipeError:
            return _broken_pipe()
        raise
    except _ArgError as exc:
        print(f"boreflow: error: {exc}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except InputError as exc:
        print(f"boreflow: error: {exc}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except FileExistsError as exc:
        print(f"boreflow: error: {exc}", file=sys.stderr)
        return EXIT_EXISTS
    except OSError as exc:
        print(f"boreflow: error: cannot write: {exc}", file=sys.stderr)
        return EXIT_WRITE
    except KeyboardInterrupt:
        print("boreflow: interrupted; nothing half-written was left behind", file=sys.stderr)
        return 130
    except Exception as exc:  # a bug: one line, not a traceback, unless asked
        if os.environ.get("BOREFLOW_DEBUG"):
            raise
        print(
            f"boreflow: internal error: {type(exc).__name__}: {exc} (set BOREFLOW_DEBUG=1 "
            "for the traceback)",
            file=sys.stderr,
        )
        return EXIT_INTERNAL


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
