"""``boreflow methods [--json]``: every registered method, its source and how it was checked."""

from __future__ import annotations

from addin import text
from addin.commands.exit_codes import EXIT_OK
from addin.commands.output import json_text
from calc import list_methods
from calc.hydraulics_method import DEFAULT_METHOD

__all__ = ["methods_data", "methods_markdown", "methods_text", "run"]


def methods_data() -> list[dict]:
    """:func:`calc.list_methods` rows, with the status in words (``status_label``) beside its
    kind, for the JSON output.

    >>> rows = methods_data()
    >>> rows[0]["name"], rows[0]["default"], rows[0]["status_label"][:12]
    ('api13d_2010_hb', True, 'coefficients')
    """
    out = []
    for r in list_methods():
        d = dict(r)
        d["caveats"] = list(r["caveats"])
        d["status_label"] = text.status_label(r["status"])
        d["default"] = r["family"] == "hydraulics method" and r["name"] == DEFAULT_METHOD
        out.append(d)
    return out


def methods_text(rows: list[dict]) -> str:
    """The rows as text, grouped by family; each method with its description, primary source,
    status in words, evidence and caveats.

    >>> print(methods_text(methods_data()).splitlines()[0])
    hydraulics methods (the names users give with method= and --method)
    """
    lines: list[str] = []
    family = None
    for r in rows:
        if r["family"] != family:
            family = r["family"]
            if lines:
                lines.append("")
            extra = (
                " (the names users give with method= and --method)"
                if family == "hydraulics method"
                else ""
            )
            lines.append(f"{family}s{extra}")
        default = " (default)" if r["default"] else ""
        lines.append(f"  {r['name']}{default}: {r['description']}")
        lines.append(f"      source:   {r['source']}")
        lines.append(f"      status:   {r['status_label']}")
        if r["evidence"]:
            lines.append(f"      evidence: {r['evidence']}")
        for c in r["caveats"]:
            lines.append(f"      caveat:   {c}")
    return "\n".join(lines)


def _cell(s: str) -> str:
    return s.replace("|", "\\|").replace("\n", " ")


def methods_markdown(rows: list[dict]) -> str:
    """The status table of calc/METHODS.md §17 (``boreflow methods --markdown`` regenerates
    it; a test compares the two): family, method, status in words, evidence.

    >>> methods_markdown(methods_data()).splitlines()[0]
    '| family | method | status | evidence |'
    """
    lines = ["| family | method | status | evidence |", "|---|---|---|---|"]
    for r in rows:
        lines.append(
            f"| {r['family']} | `{r['name']}` | {r['status_label']} | {_cell(r['evidence'])} |"
        )
    return "\n".join(lines)


def run(args) -> int:
    rows = methods_data()
    if args.json:
        print(json_text(rows))
    elif getattr(args, "markdown", False):
        print(methods_markdown(rows))
    else:
        print(methods_text(rows))
    return EXIT_OK
