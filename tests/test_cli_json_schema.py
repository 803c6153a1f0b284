"""``boreflow report --json`` against its documented schema (workbooks/report-json-schema.json).

The schema is JSON Schema draft 2020-12 (json-schema.org, "JSON Schema Validation" and "Core"
specifications); the ``jsonschema`` package is not installed here, so the subset of keywords
the schema uses (type, enum, pattern, required, properties, additionalProperties,
propertyNames, items, allOf, local $ref) is checked by the small validator below, which is
itself tested on documents that must fail.
"""

from __future__ import annotations

import json
import re

import pytest
from _report_demo import DEMO, ROOT

from addin.cli import main

SCHEMA = json.loads((ROOT / "workbooks" / "report-json-schema.json").read_text(encoding="utf-8"))

_TYPES = {
    "object": lambda v: isinstance(v, dict),
    "array": lambda v: isinstance(v, list),
    "string": lambda v: isinstance(v, str),
    "number": lambda v: isinstance(v, (int, float)) and not isinstance(v, bool),
    "integer": lambda v: isinstance(v, int) and not isinstance(v, bool),
    "boolean": lambda v: isinstance(v, bool),
    "null": lambda v: v is None,
}


def errors(value, schema, root=SCHEMA, path="$") -> list[str]:
    """Every violation of ``schema`` by ``value`` (draft 2020-12 semantics, the subset used)."""
    out: list[str] = []
    if "$ref" in schema:
        node = root
        for part in schema["$ref"].removeprefix("#/").split("/"):
            node = node[part]
        out += errors(value, node, root, path)
    for sub in schema.get("allOf", ()):
        out += errors(value, sub, root, path)
    if "type" in schema:
        types = schema["type"] if isinstance(schema["type"], list) else [schema["type"]]
        if not any(_TYPES[t](value) for t in types):
            return [*out, f"{path}: {type(value).__name__} is not {types}"]
    if "enum" in schema and value not in schema["enum"]:
        out.append(f"{path}: {value!r} not in {schema['enum']}")
    if "pattern" in schema and isinstance(value, str) and not re.search(schema["pattern"], value):
        out.append(f"{path}: {value!r} does not match {schema['pattern']}")
    if isinstance(value, dict):
        out += [f"{path}: missing {k!r}" for k in schema.get("required", ()) if k not in value]
        props = schema.get("properties", {})
        for k, v in value.items():
            if "propertyNames" in schema:
                out += errors(k, schema["propertyNames"], root, f"{path} key {k!r}")
            if k in props:
                out += errors(v, props[k], root, f"{path}.{k}")
            elif schema.get("additionalProperties") is False:
                out.append(f"{path}: unexpected key {k!r}")
            elif isinstance(schema.get("additionalProperties"), dict):
                out += errors(v, schema["additionalProperties"], root, f"{path}.{k}")
    if isinstance(value, list) and "items" in schema:
        for i, v in enumerate(value):
            out += errors(v, schema["items"], root, f"{path}[{i}]")
    return out


@pytest.fixture(scope="module")
def demo_json(tmp_path_factory):
    out = tmp_path_factory.mktemp("json") / "r.xlsx"
    import contextlib
    import io

    buf = io.StringIO()
    with contextlib.redirect_stdout(buf):
        assert main(["report", str(DEMO), "-o", str(out), "--json"]) == 0
    return json.loads(buf.getvalue())


def test_demo_output_validates(demo_json):
    assert errors(demo_json, SCHEMA) == []


def test_no_display_labels_as_keys(demo_json):
    assert set(demo_json["circulation"]["breakdown"]) <= {
        "back_pressure",
        "surface",
        "string",
        "tools",
        "bit",
        "annulus",
    }
    assert demo_json["circulation"]["breakdown_labels"]["surface"] == "surface lines"
    lm = demo_json["operating_window"]["limit_margins"]
    assert lm["surface_rating"]["unit"] == demo_json["units"]["pressure"] == "psi"
    fit = demo_json["rheology"]["checks"][0]["fits"][0]["parameters"]
    assert all(re.fullmatch(r"[a-z][a-z0-9_]*", k) for k in fit)


def test_breakdown_sums_to_the_standpipe_pressure(demo_json):
    """SPP = Σ losses of the loop (conservation of energy along the flow path, exact)."""
    c = demo_json["circulation"]
    assert sum(c["breakdown"].values()) == pytest.approx(c["standpipe_pressure"], rel=1e-9)


@pytest.mark.parametrize(
    "mutate, needle",
    [
        (lambda d: d["circulation"]["breakdown"].update({"surface lines": 1.0}), "surface lines"),
        (lambda d: d.pop("bit"), "missing 'bit'"),
        (lambda d: d["run"].update({"unit_system": "imperial"}), "imperial"),
        (lambda d: d["circulation"].update({"ecd_bit": "11.8 ppg"}), "ecd_bit"),
        (lambda d: d["notes"].append({"level": "info", "code": "Bad Code", "message": ""}), "Bad"),
    ],
)
def test_the_validator_rejects_what_the_schema_forbids(demo_json, mutate, needle):
    doc = json.loads(json.dumps(demo_json))
    mutate(doc)
    found = errors(doc, SCHEMA)
    assert found and any(needle in e for e in found), found


def test_rheology_json_has_snake_case_keys(capsys):
    assert main(["rheology", str(DEMO), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert errors(data, {"$ref": "#/$defs/snake_case_everywhere"}) == []
    assert "gel_10s" in data["checks"][0]["gels"]
