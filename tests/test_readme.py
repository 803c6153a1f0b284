"""The README stays true: every figure it prints is recomputed here, its commands match CI,
its cautions are ours.

How each printed number is checked
----------------------------------
* ``>>>`` lines in the README's ``python`` blocks run as doctests (``doctest`` module, the
  blocks one after the other in one namespace, as a reader would paste them); the output
  below each call is compared with what it prints now.
* The methods table is regenerated from the snippet above it (the plain ``python`` block that
  loops over every hydraulics method): every numeric cell is compared with the snippet's
  fresh output, column by column, found by the column's header (not by position), so an
  added text column (e.g. a status) does not break the check.
* Figures quoted in the prose (the demo check's depth, density, rate and measured standpipe
  pressure, the tightest margin, exit codes, the 1995 method's Re limit, the Larsen range, the
  reading resolution, the Python version) are compared with the case file and the code.
* ``test_every_prose_number_is_accounted_for`` lists every number in the prose outside code
  and tables: a new number must be added to one of the checks above (or, for a number that
  is not a result, such as a publication year, to ``NOT_RESULTS`` with its reason), so a
  figure cannot be added unchecked.

A failure names the README line to update and the value it should now print.
"""

from __future__ import annotations

import ast
import contextlib
import doctest
import io
import re
import shlex
from pathlib import Path

import pytest

from addin.cli import build_parser
from addin.commands import exit_codes
from calc import cautions
from calc.cleaning.indicators import LARSEN_RANGE
from calc.flow.methods_api import API95_RE_LIMIT
from calc.hydraulics_method import DEFAULT_METHOD, list_hydraulics_methods
from calc.rheology import ViscometerReadings
from calc.units import from_si

ROOT = Path(__file__).resolve().parents[1]
README = (ROOT / "README.md").read_text(encoding="utf-8")
LINES = README.splitlines()


def _blocks(lang):
    return re.findall(rf"```{lang}\n(.*?)```", README, flags=re.S)


def _python_blocks() -> list[tuple[int, str]]:
    """(first README line number of the code, code) of every ``python`` block, in order."""
    out = []
    for m in re.finditer(r"```python\n(.*?)```", README, flags=re.S):
        out.append((README.count("\n", 0, m.start(1)) + 1, m.group(1)))
    return out


def _line_of(text: str, start: int = 0) -> int:
    """README line number (1-based) of the first occurrence of ``text``."""
    i = README.index(text, start)
    return README.count("\n", 0, i) + 1


class _Tour:
    """The README tour, run once: doctest failures and the plain blocks' printed output."""

    def __init__(self):
        self.namespace: dict = {"__name__": "readme"}
        self.failures: list[str] = []
        self.plain_output: list[tuple[int, str, str]] = []  # (first line, code, stdout)
        parser = doctest.DocTestParser()
        flags = doctest.ELLIPSIS | doctest.NORMALIZE_WHITESPACE
        for first_line, code in _python_blocks():
            if ">>> " not in code:
                buf = io.StringIO()
                with contextlib.redirect_stdout(buf):
                    exec(compile(code, "README.md", "exec"), self.namespace)
                self.plain_output.append((first_line, code, buf.getvalue()))
                continue
            test = parser.get_doctest(code, self.namespace, "README", "README.md", first_line - 1)
            report = io.StringIO()
            runner = doctest.DocTestRunner(optionflags=flags)
            runner.run(test, out=report.write, clear_globs=False)
            self.namespace.update(test.globs)
            if runner.failures:
                self.failures.append(report.getvalue())


@pytest.fixture(scope="module")
def tour(tmp_path_factory):
    with pytest.MonkeyPatch.context() as mp:
        mp.chdir(ROOT)
        return _Tour()


def test_python_tour_doctests(tour):
    """Every ``>>>`` output in the README is what the code prints now (doctest reports give the
    README line of each stale output: update it there)."""
    assert len(_python_blocks()) >= 4
    n_doctest = sum(">>> " in code for _, code in _python_blocks())
    assert n_doctest >= 3  # rheology, cleaning/trips/window, worksheet functions
    assert not tour.failures, "stale README output:\n" + "\n".join(tour.failures)


# ------------------------------------------------------------------------------ methods table
_SNIPPET_LINE = re.compile(r"^(\w+) (\d+) (\{.*\}) ([\d.]+)(?: \w+)?$")  # optional status


def _snippet_rows(tour) -> dict[str, dict[str, float]]:
    """The methods snippet's fresh output: method → {"spp": psi, part: psi, …, "ecd": ppg}."""
    snippets = [(f, o) for f, code, o in tour.plain_output if "circulate(" in code]
    assert len(snippets) == 1, "README: one plain python block (the methods loop) expected"
    first_line, out = snippets[0]
    rows = {}
    for line in out.strip().splitlines():
        m = _SNIPPET_LINE.match(line.strip())
        assert m, f"README.md line {first_line}: unexpected snippet output {line!r}"
        parts = ast.literal_eval(m.group(3))
        rows[m.group(1)] = {"spp": int(m.group(2)), **parts, "ecd": float(m.group(4))}
    return rows


def _methods_table() -> tuple[int, list[str], list[tuple[int, list[str]]]]:
    start = README.index("| method |")
    first = README.count("\n", 0, start) + 1
    header = [c.strip() for c in LINES[first - 1].strip().strip("|").split("|")]
    rows = []
    for k, line in enumerate(LINES[first + 1 :], start=first + 2):  # skip the |---| line
        if not line.startswith("|"):
            break
        rows.append((k, [c.strip() for c in line.strip().strip("|").split("|")]))
    return first, header, rows


def _column_key(label: str, parts: set[str]) -> str | None:
    """Which snippet value a column shows, from its header; None for a text column."""
    word = label.split()[0].lower()
    if word == "spp":
        return "spp"
    if word == "ecd":
        return "ecd"
    if word in parts:
        return word
    return None


_NUMBER = re.compile(r"^-?[\d,]+(\.\d+)?$")


def test_methods_table_matches_its_snippet(tour):
    """The README methods table is the output of the snippet above it, for every method the
    code registers (order included), every numeric column found by its header."""
    computed = _snippet_rows(tour)
    head_line, header, rows = _methods_table()
    parts = {k for row in computed.values() for k in row} - {"spp", "ecd"}
    parts |= {"surface", "string", "tools", "bit", "annulus"}  # the breakdown's keys
    names = []
    for line_no, cells in rows:
        m = re.match(r"`(\w+)`", cells[0])
        assert m, f"README.md line {line_no}: first cell {cells[0]!r} names no method"
        name = m.group(1)
        names.append(name)
        is_default = "(default)" in cells[0]
        assert is_default == (name == DEFAULT_METHOD), (
            f"README.md line {line_no}: '(default)' must mark {DEFAULT_METHOD!r} only"
        )
        for label, cell in zip(header[1:], cells[1:], strict=True):
            key = _column_key(label, parts)
            if key is None:
                assert not _NUMBER.match(cell), (
                    f"README.md line {head_line}: column {label!r} prints numbers but no check "
                    "knows what it shows; name it after a snippet value (SPP, ECD, a part)"
                )
                continue
            assert name in computed, f"README.md line {line_no}: {name!r} is not computed"
            value = computed[name].get(key, 0)
            want = f"{value:.2f}" if key == "ecd" else f"{value:,}"
            assert cell == want, (
                f"README.md line {line_no}: {name} {label!r} prints {cell}, the snippet now "
                f"gives {want}: update that cell"
            )
    registered = [m.name for m in list_hydraulics_methods()]
    assert names == registered, (
        f"README.md line {head_line}: the table lists {names}, the code registers {registered}"
    )
    assert list(computed) == registered


def test_demo_check_quoted_in_the_prose(tour):
    """'Day 2 of the demo well (11,880 ft MD, 11.2 ppg, 522 gpm; measured standpipe 2,860 psi)'
    is the latest check of workbooks/demo-case.toml."""
    m = re.search(
        r"Day (\d+) of the demo well \(([\d,]+) ft MD, ([\d.]+) ppg, ([\d,]+) gpm; "
        r"measured standpipe ([\d,]+) psi\)".replace(" ", r"\s+"),
        README,
    )
    assert m, "README: the line introducing the methods table ('Day 2 of the demo well …')"
    line = README.count("\n", 0, m.start()) + 1
    case = tour.namespace["case"]
    fresh = [
        str(len(case.checks)),
        f"{from_si(case.check_value(-1, 'bit_depth'), 'ft'):,.0f}",
        f"{from_si(case.check_value(-1, 'density'), 'ppg'):.1f}",
        f"{from_si(case.check_value(-1, 'flow_rate'), 'gpm'):,.0f}",
        f"{from_si(case.check_value(-1, 'measured_spp'), 'psi'):,.0f}",
    ]
    assert list(m.groups()) == fresh, f"README.md line {line}: now {fresh}"


def test_tightest_point_quoted_in_the_prose(tour):
    """'(here the base of the depleted Sand B, fracture side, 0.81 ppg)': the default method's
    tightest point on day 2."""
    ns = tour.namespace
    r = ns["circulate"](
        ns["well"],
        ns["hydraulics_fluid_from_readings"](
            ns["case"].checks[-1].readings, DEFAULT_METHOD, density=ns["rho"]
        ),
        ns["q"],
        method=DEFAULT_METHOD,
        window=ns["case"].window,
        weak_points=ns["case"].weak_points,
        margins=ns["margins"],
    )
    m = re.search(r"\(here\s+the\s+(.+?),\s+(fracture|pore)\s+side,\s+([\d.]+)\s+ppg\)", README)
    assert m, "README: the sentence on r.margins.tightest"
    line = README.count("\n", 0, m.end()) + 1
    name = " ".join(m.group(1).split())
    t = r.margins.tightest
    assert t.point.name in name, f"README.md line {line}: tightest is now {t.point.name!r}"
    assert m.group(2) == t.limit, f"README.md line {line}: now the {t.limit} side"
    fresh = f"{from_si(t.margin, 'ppg'):.2f}"
    assert m.group(3) == fresh, f"README.md line {line}: margin now {fresh} ppg"


def test_ecd_band_quoted_in_the_prose(tour):
    """The ECD-band paragraph: the default resolutions (±0.5°, ±0.1 / ±0.05 ppg, ±3 %), the
    spread methods, and the demo's band at the bit and on the SPP are what
    calc.circulation.ecd_band gives now."""
    from calc.circulation import band as B  # lazy: only this test needs the band module

    ns = tour.namespace
    flat = " ".join(README.split())
    line = _line_of("How much of that is the inputs?")
    assert f"±{B.DIAL_RESOLUTION:g}° on each dial reading" in flat, f"README.md line {line}"
    assert f"±{from_si(B.BALANCE_RESOLUTION, 'ppg'):g} ppg on a standard" in flat, line
    assert f"(±{from_si(B.BALANCE_RESOLUTION_PRESSURISED, 'ppg'):g} ppg pressurised)" in flat
    assert f"±{B.RATE_UNCERTAINTY * 100:g} % on the rate" in flat, f"README.md line {line}"
    assert ", ".join(f"`{m}`" for m in B.SPREAD_METHODS[:-1]) in flat.replace(", and", ",")
    case = ns["case"]
    band = B.ecd_band(
        ns["well"], case.checks[-1].readings, ns["rho"], ns["q"],
        window=case.window, weak_points=case.weak_points, margins=ns["margins"],
    )  # fmt: skip
    bit, spp = band.ecd_bit, band.spp
    lo, hi = bit.method_min[1], bit.method_max[1]
    fresh = (
        f"ECD at the bit is {from_si(bit.nominal, 'ppg'):.2f} ± "
        f"{from_si(bit.half_width, 'ppg'):.2f} ppg"
    )
    assert fresh in flat, f"README.md line {line}: now '{fresh}'"
    spread = f"methods give {from_si(lo, 'ppg'):.2f}–{from_si(hi, 'ppg'):.2f} ppg"
    assert spread in flat, f"README.md line {line}: now '{spread}'"
    fresh = f"SPP is {from_si(spp.nominal, 'psi'):,.0f} ± {from_si(spp.half_width, 'psi'):,.0f} psi"
    assert fresh in flat, f"README.md line {line}: now '{fresh}'"
    assert bit.dominant == "density" and "(mud balance dominates)" in flat
    assert spp.dominant == "flow_rate" and "(flow rate dominates)" in flat


def test_exit_codes_quoted_in_the_prose():
    """'Exit codes: 0 ok, 1 internal error, 2 bad input …, 141 output pipe closed' are
    addin.commands.exit_codes."""
    quoted = {
        "0 ok": exit_codes.EXIT_OK,
        "1 internal error": exit_codes.EXIT_INTERNAL,
        "2 bad input": exit_codes.EXIT_BAD_INPUT,
        "3 output exists": exit_codes.EXIT_EXISTS,
        "4 cannot write": exit_codes.EXIT_WRITE,
        "5 some": exit_codes.EXIT_BATCH_FAILED,
        "141 output pipe closed": exit_codes.EXIT_BROKEN_PIPE,
        "143 stopped by SIGTERM": exit_codes.EXIT_TERMINATED,
    }
    flat = " ".join(README.split())
    for text, code in quoted.items():
        assert text in flat, f"README.md line {_line_of('Exit codes')}: missing {text!r}"
        assert int(text.split()[0]) == code, f"README.md line {_line_of('Exit codes')}: {text}"


def test_constants_quoted_in_the_prose():
    """Re limit of the 1995 method, the Larsen et al. inclination range, the dial reading
    resolution and the Python version are the code's."""
    flat = " ".join(README.split())
    assert f"Re crosses {API95_RE_LIMIT:.0f}" in flat, f"README.md line {_line_of('Re crosses')}"
    lo, hi = LARSEN_RANGE
    assert f"({lo:.0f}–{hi:.0f}°)" in flat, f"README.md line {_line_of('critical rate (')}"
    res = ViscometerReadings.from_mapping({600: 56, 300: 37}).resolution
    assert f"±{res:g}° reading error" in flat, f"README.md line {_line_of('reading error')}"
    pyproject = (ROOT / "pyproject.toml").read_text(encoding="utf-8")
    version = re.search(r'requires-python = ">=([\d.]+)"', pyproject).group(1)
    assert f"Python {version}+" in flat, f"README.md line {_line_of('with Python')}"


#: Numbers in the prose that are not results, with why (each is still looked for in the text).
NOT_RESULTS = {
    "1986": "year of Bourgoyne et al. (citation)",
    "1990": "year of Haciislamoglu & Langlinais (citation)",
    "1992": "year of Darby, Mun & Boger (citation)",
    "1995": "edition year of API RP 13D (a method's name)",
    "2006": "edition year of API RP 13D (a method's name)",
    "2010": "edition year of API RP 13D (a method's name)",
    "13": "'API RP 13D', a standard's name",
    "600": "rotor speed naming the API pipe pair (600/300), an input",
    "300": "rotor speed naming the API pair / the start of an example rate range, an input",
    "100": "rotor speed naming the API annulus pair (100/3), an input",
    "3": "rotor speed (annulus pair, '3- and 6-rpm readings'), an input; exit code 3 is checked",
    "700": "end of the example rate range np.linspace(300, 700, 10_000), an input",
    "10": "10_000, the example's number of rates, an input",
    "6": "rotor speed ('3- and 6-rpm readings' in the cautions), an input",
    "18": "'calc/METHODS.md §18', a section number of the in-repo methods reference",
    "10.13": "'calc/METHODS.md §10.13', a section number of the in-repo methods reference",
    "24": "'calc/METHODS.md §24', a section number of the in-repo methods reference",
    "1997": "year of Larsen, Pilehvari & Azar (citation, a method's name)",
    "1999": "year of Rubiandini (citation, a method's name)",
}


def test_every_prose_number_is_accounted_for():
    """Each number in the README outside code blocks and tables is checked by a test above or
    listed in NOT_RESULTS with a reason: a new figure must get a check before it is printed."""
    checked = {  # the numbers the tests above recompute
        "0.81", "11,880", "11.2", "522", "2,860", "2", "2100", "55", "90", "0.5", "3.11",
        "0", "1", "4", "5", "141", "143",
        "0.1", "0.05", "11.82", "0.10", "11.81", "11.96", "2,952", "150",  # the ECD band
    }  # fmt: skip
    prose = re.sub(r"```.*?```", lambda m: "\n" * m.group(0).count("\n"), README, flags=re.S)
    unknown = []
    for k, line in enumerate(prose.splitlines(), start=1):
        if line.startswith("|"):
            continue
        for num in re.findall(r"(?<![\w.])\d+(?:,\d{3})*(?:\.\d+)?", line):
            if num not in checked and num not in NOT_RESULTS:
                unknown.append(f"README.md line {k}: {num}")
    assert not unknown, "numbers with no check (add one in tests/test_readme.py):\n" + "\n".join(
        unknown
    )


# ------------------------------------------------------------------------- commands, cautions
def test_test_command_is_the_ci_command():
    ci = (ROOT / ".ci" / "run").read_text(encoding="utf-8")
    bash = _blocks("bash")
    test_cmd = next(b.strip() for b in bash if "pytest" in b)
    assert test_cmd in ci


def test_cli_examples_parse():
    """Every `boreflow …` line in the README parses with the real argument parser."""
    parser = build_parser()
    seen = 0
    for block in _blocks("bash"):
        for line in block.splitlines():
            if not line.startswith("boreflow "):
                continue
            text = line.split("  #")[0]
            text = text.replace("CASE.toml|CASE.xlsx", "CASE.toml").replace(
                "[--force] [--json]", ""
            )
            text = re.sub(r"\[(--\S+)( [^\]\s]+)?\]", r"\1\2", text)  # "[--units metric]" → option
            args = shlex.split(text)[1:]
            parser.parse_args(args)  # argparse raises SystemExit(2) on an unknown option
            seen += 1
    assert seen >= 4


def test_cautions_shown():
    flat = " ".join(README.split())
    for line in cautions.LINES:
        body = line.split(". ", 1)[1]
        assert " ".join(body.split()) in flat
