"""The README stays true: its Python tour runs, its commands match CI, its cautions are ours."""

import re
import shlex
from pathlib import Path

from addin.cli import build_parser
from calc import cautions

ROOT = Path(__file__).resolve().parents[1]
README = (ROOT / "README.md").read_text(encoding="utf-8")


def _blocks(lang):
    return re.findall(rf"```{lang}\n(.*?)```", README, flags=re.S)


def test_python_tour_runs(monkeypatch, capsys):
    monkeypatch.chdir(ROOT)
    namespace: dict = {}
    blocks = _blocks("python")
    assert len(blocks) >= 4
    for code in blocks:
        exec(compile(code, "README.md", "exec"), namespace)
    out = capsys.readouterr().out
    # the printed figures quoted in the README's comments (regression values, reviewed)
    for text in ("hb_least_squares", "τy = 8.289 lbf/100ft²", "n = 0.2914", "#BF! dial reading"):
        assert text in out


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
