"""The ``report``, ``calc`` and ``batch`` subcommands of ``boreflow`` (registered by addin.cli)."""

from __future__ import annotations

import csv
import io
import json
import sys
import time
from pathlib import Path

from addin import text
from calc.errors import InputError
from calc.units import UNIT_SYSTEMS, from_si, label, unit_for

__all__ = ["register", "run_one"]


def _json(obj) -> str:
    import numpy as np

    def default(o):
        if isinstance(o, np.generic):
            return o.item()
        if isinstance(o, np.ndarray):
            return o.tolist()
        raise TypeError(type(o).__name__)

    return json.dumps(obj, ensure_ascii=False, indent=2, default=default)


def run_one(case_path, out_path, *, force=False, method=None):
    """Load, compute and write one report; returns (results, seconds)."""
    from addin.case import load_case
    from addin.report import compute, write_report
    from addin.safe_io import OutputExistsError

    t0 = time.perf_counter()
    out = Path(out_path)
    if out.exists() and not force:  # refuse before any work, and write nothing
        raise OutputExistsError(out)
    if not out.parent.is_dir():
        raise FileNotFoundError(f"{out.parent}: output folder does not exist")
    case = load_case(case_path)
    results = compute(case, method=method) if method else compute(case)
    write_report(results, out, overwrite=force)
    return results, time.perf_counter() - t0


# --------------------------------------------------------------------------- report


def _cmd_report(args) -> int:
    from addin.report.jsonout import results_data

    out = Path(args.output) if args.output else Path(Path(args.case).stem + "-report.xlsx")
    results, dt = run_one(args.case, out, force=args.force, method=args.method)
    if args.json:
        print(_json(results_data(results)))
    else:
        print(
            f"{out}  ({results.case.source}, {len(results.case.checks)} checks, "
            f"{dt:.1f} s; inputs {results.case.hash[:12]})"
        )
    return 0


# --------------------------------------------------------------------------- calc


def _q(value, kind, system, name):
    """A command-line value: a number in the system's unit, or 'number unit'."""
    from addin.case import parse_quantity

    return parse_quantity(_num_or_text(value), kind, system, name)


def _num_or_text(v):
    try:
        return float(v)
    except ValueError:
        return v


def _show(d: dict, system: str, as_json: bool) -> None:
    rows = dict(d)
    if as_json:
        print(
            _json(
                {
                    k: {
                        "value": None
                        if v is None
                        else (float(from_si(v, unit_for(kind, system), kind)) if kind else v),
                        "unit": label(unit_for(kind, system)) if kind else "",
                    }
                    for k, (v, kind) in rows.items()
                }
            )
        )
        return
    for k, (v, kind) in rows.items():
        if kind:
            val = float(from_si(v, unit_for(kind, system), kind))
            print(f"{k:34s} {val:12.4g} {label(unit_for(kind, system))}")
        else:
            print(f"{k:34s} {v}")


def _cmd_calc(args) -> int:
    s = args.units
    if args.quantity == "hydrostatic":
        from calc.circulation import hydrostatic_pressure

        rho = _q(args.density, "density", s, "--density")
        tvd = _q(args.tvd, "depth", s, "--tvd")
        p = hydrostatic_pressure(rho, tvd, hydrostatic=args.hydrostatic)
        _show(
            {"hydrostatic pressure": (p, "pressure"), "gradient": (p / tvd, "pressure_gradient")},
            s,
            args.json,
        )
    elif args.quantity == "annular-velocity":
        from calc.cleaning import annular_velocity

        v = annular_velocity(
            _q(args.rate, "flow_rate", s, "--rate"),
            _q(args.hole, "diameter", s, "--hole"),
            _q(args.pipe, "diameter", s, "--pipe"),
        )
        _show({"annular velocity": (v, "velocity")}, s, args.json)
    elif args.quantity == "bit":
        from calc.bit import Bit, bit_hydraulics

        nozzles = tuple(int(x) for x in args.nozzles.replace(" ", "").split(",") if x)
        bit = Bit(
            _q(args.size, "diameter", s, "--size"), nozzles=nozzles, discharge_coefficient=args.cd
        )
        bh = bit_hydraulics(
            _q(args.rate, "flow_rate", s, "--rate"),
            _q(args.density, "density", s, "--density"),
            bit,
        )
        _show(
            {
                "total flow area": (bh.tfa, "area"),
                "nozzle velocity": (bh.nozzle_velocity, "jet_velocity"),
                "bit pressure drop": (bh.pressure_drop, "pressure"),
                "hydraulic power": (bh.hydraulic_power, "power"),
                "HSI": (bh.hsi, "power_density"),
                "impact force": (bh.impact_force, "force"),
            },
            s,
            args.json,
        )
    elif args.quantity == "circulate":
        from addin.case import load_case
        from addin.report.compute import DEFAULT_METHOD, fluid_for, scalar
        from calc.circulation import Margins
        from calc.circulation.loop import circulate

        case = load_case(args.case)
        s = args.units_given or case.units
        q = (
            _q(args.rate, "flow_rate", case.units, "--rate")
            if args.rate
            else case.check_value(-1, "flow_rate")
        )
        chk = case.checks[-1]
        fluid = fluid_for(
            chk.readings, case.check_value(-1, "density"), args.method or DEFAULT_METHOD, chk.label
        )
        lim = case.limits
        res = circulate(
            case.well(-1),
            fluid,
            q,
            method=args.method or DEFAULT_METHOD,
            window=case.window,
            weak_points=case.weak_points,
            margins=Margins(lim["fracture_margin"], lim["pore_margin"]),
            surface_rating=lim["surface_rating"],
        )
        d = {"flow rate": (scalar(res.q), "flow_rate")}
        d.update(
            {
                f"loss: {text.BREAKDOWN_LABELS[k]}": (scalar(v), "pressure")
                for k, v in res.breakdown().items()
            }
        )
        d["standpipe pressure"] = (scalar(res.standpipe_pressure), "pressure")
        d["ECD at the bit"] = (scalar(res.ecd_bit), "density")
        if res.margins is not None:
            t = res.margins.tightest
            where = text.check_point(t.point, s)
            d[f"tightest margin ({where}, {t.limit})"] = (float(t.margin), "density")
        _show(d, s, args.json)
    return 0


# --------------------------------------------------------------------------- batch


def _expand(paths) -> list[Path]:
    out: list[Path] = []
    for p in paths:
        if p.startswith("@"):
            lst = Path(p[1:])
            lines = lst.read_text(encoding="utf-8").splitlines()
            out.extend(
                _expand(
                    [ln.strip() for ln in lines if ln.strip() and not ln.lstrip().startswith("#")]
                )
            )
            continue
        path = Path(p)
        if path.is_dir():
            out.extend(
                sorted(
                    q
                    for q in path.iterdir()
                    if q.suffix.lower() in (".toml", ".xlsx") and not q.name.startswith((".", "~"))
                )
            )
        else:
            out.append(path)
    return out


def _bar(i, n, name, width=28):
    done = int(width * i / n) if n else width
    return f"\r[{'#' * done}{'.' * (width - done)}] {i}/{n} {name[:40]:40s}"


def _cmd_batch(args) -> int:
    from addin.report.jsonout import results_data
    from addin.safe_io import atomic_write_bytes, csv_safe

    cases = _expand(args.paths)
    if not cases:
        raise InputError("batch paths", " ".join(args.paths), "case files, folders or @list")
    outdir = Path(args.output)
    if not outdir.is_dir():
        raise InputError("--output", str(outdir), "an existing folder")
    names = [c.stem for c in cases]
    dupes = {n for n in names if names.count(n) > 1}
    if dupes:
        raise InputError(
            "batch cases",
            ", ".join(sorted(dupes)),
            "distinct file names (reports are named after the case)",
        )
    rows, failed = [], 0
    tty = sys.stderr.isatty()
    t_all = time.perf_counter()
    for i, c in enumerate(cases):
        if not args.quiet:
            print(_bar(i, len(cases), c.name), end="" if tty else "\n", file=sys.stderr, flush=True)
        out = outdir / f"{c.stem}-report.xlsx"
        try:
            res, dt = run_one(c, out, force=args.force)
            d = results_data(res)
            mt = d.get("margins", {}).get("tightest", {})
            s = res.case.system
            rows.append(
                {
                    "case": c.name,
                    "status": "ok",
                    "report": out.name,
                    "seconds": f"{dt:.2f}",
                    "standpipe_pressure": f"{d['circulation']['standpipe_pressure']:.0f}",
                    "ecd_bit": f"{d['circulation']['ecd_bit']:.3f}",
                    "tightest_margin": "" if not mt else f"{mt['margin']:.3f} ({mt['name']})",
                    "cleaning": ""
                    if "cleaning" not in d
                    else min(
                        (r["verdict"] for r in d["cleaning"]["intervals"]),
                        key=("poor", "marginal", "adequate").index,
                    ),
                    "units": s,
                    "message": "",
                }
            )
        except (InputError, OSError) as exc:
            failed += 1
            rows.append(
                {
                    "case": c.name,
                    "status": "failed",
                    "report": "",
                    "seconds": "",
                    "standpipe_pressure": "",
                    "ecd_bit": "",
                    "tightest_margin": "",
                    "cleaning": "",
                    "units": "",
                    "message": str(exc),
                }
            )
    if not args.quiet:
        print(
            _bar(len(cases), len(cases), f"done in {time.perf_counter() - t_all:.1f} s"),
            file=sys.stderr,
        )
    cols = [
        "case",
        "status",
        "standpipe_pressure",
        "ecd_bit",
        "tightest_margin",
        "cleaning",
        "units",
        "seconds",
        "message",
    ]
    widths = {k: max(len(k), *(len(str(r[k])) for r in rows)) for k in cols[:-1]}
    print("  ".join(k.ljust(widths[k]) for k in cols[:-1]) + "  message")
    for r in rows:
        print("  ".join(str(r[k]).ljust(widths[k]) for k in cols[:-1]) + "  " + r["message"])
    print(f"{len(rows) - failed} of {len(rows)} reports written to {outdir}")
    if args.summary:
        buf = io.StringIO()
        w = csv.writer(buf)
        w.writerow([*cols, "report"])
        for r in rows:
            w.writerow([csv_safe(r[k]) for k in [*cols, "report"]])
        atomic_write_bytes(args.summary, buf.getvalue().encode("utf-8"), overwrite=args.force)
    return 5 if failed else 0


# --------------------------------------------------------------------------- registration


def register(sub) -> None:
    p = sub.add_parser(
        "report",
        help="write the daily hydraulics report workbook for a case",
        description="Build the report workbook (.xlsx) from a case file (TOML) or an input "
        "workbook (.xlsx). The file is written atomically and never overwrites an existing "
        "one unless --force is given.",
    )
    p.add_argument(
        "case", help="case file (.toml) or input workbook (.xlsx), e.g. workbooks/demo-case.toml"
    )
    p.add_argument("-o", "--output", help="report file (default: CASE-report.xlsx here)")
    p.add_argument("--force", action="store_true", help="replace an existing report")
    p.add_argument("--json", action="store_true", help="also print every result as JSON")
    p.add_argument("--method", default=None, help="hydraulics method (default api13d_2010_hb)")
    p.set_defaults(func=_cmd_report)

    c = sub.add_parser(
        "calc",
        help="one-off numbers (hydrostatic, annular velocity, bit, circulate)",
        description="Quick calculations. Values are numbers in the unit system of --units "
        "(default oilfield) or text with a unit, e.g. --density '1.32 sg'.",
    )
    csub = c.add_subparsers(
        dest="quantity", metavar="QUANTITY", required=True, parser_class=sub._parser_class
    )

    def common(q):
        q.add_argument(
            "--units",
            choices=list(UNIT_SYSTEMS),
            default="oilfield",
            help="unit system of inputs and output (default oilfield)",
        )
        q.add_argument("--json", action="store_true", help="JSON output")
        q.set_defaults(func=_cmd_calc)
        return q

    h = common(csub.add_parser("hydrostatic", help="pressure of a static column ρ·g·TVD"))
    h.add_argument("--density", required=True)
    h.add_argument("--tvd", required=True)
    h.add_argument(
        "--hydrostatic",
        choices=["exact", "0.052"],
        default="exact",
        help="g convention (default exact gₙ)",
    )
    a = common(csub.add_parser("annular-velocity", help="mean velocity Q / annulus area"))
    a.add_argument("--rate", required=True)
    a.add_argument("--hole", required=True, help="hole or casing inside diameter")
    a.add_argument("--pipe", required=True, help="pipe outside diameter")
    b = common(csub.add_parser("bit", help="TFA, nozzle velocity, bit ΔP, power, HSI, impact"))
    b.add_argument("--rate", required=True)
    b.add_argument("--density", required=True)
    b.add_argument("--size", required=True, help="bit diameter")
    b.add_argument("--nozzles", required=True, help="sizes in 1/32 in, e.g. 12,12,12,11,11,11")
    b.add_argument("--cd", type=float, default=0.95, help="discharge coefficient (0.95)")
    k = csub.add_parser("circulate", help="SPP breakdown and ECD for a case at a rate")
    k.add_argument("case")
    k.add_argument("--rate", help="flow rate (default: the latest check's)")
    k.add_argument("--method", default=None)
    k.add_argument(
        "--units",
        dest="units_given",
        choices=list(UNIT_SYSTEMS),
        default=None,
        help="output units (default the case's)",
    )
    k.add_argument("--json", action="store_true")
    k.set_defaults(func=_cmd_calc, units="oilfield")

    bt = sub.add_parser(
        "batch",
        help="reports for many cases, with a progress bar and a summary table",
        description="Write CASE-report.xlsx into FOLDER for every case. PATH may be a case "
        "file, a folder (its *.toml and *.xlsx) or @list.txt (one path per line). Failed "
        "cases are listed, the others still written; exit status 5 if any failed.",
    )
    bt.add_argument("paths", nargs="+", metavar="PATH")
    bt.add_argument("-o", "--output", required=True, metavar="FOLDER")
    bt.add_argument("--force", action="store_true", help="replace existing reports")
    bt.add_argument("--summary", metavar="FILE.csv", help="also write the summary as CSV")
    bt.add_argument("-q", "--quiet", action="store_true", help="no progress bar")
    bt.set_defaults(func=_cmd_batch)
