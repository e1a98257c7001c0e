"""Topics JSON: every object checked against the official BCF-API 3.0 JSON schemas.

The schemas (../shared/bcf_schemas/api/3.0, draft-03) are read in place; the tests skip
when they are absent. A small draft-03 checker below covers what they use: ``$ref``,
``type`` (with ``null``), ``required: true``, ``properties`` (no unknown keys),
``items``, ``enum`` and ``format: base64``.
"""

from __future__ import annotations

import base64
import binascii
import json
from pathlib import Path

import pytest

from checks.errors import BcfError
from checks.findings import topic_guid
from checks.report.bcf_read import read_topics
from checks.report.bcf_write import write_bcf
from checks.report.topics_json import (
    SCHEMA,
    topics_from_json,
    topics_to_dict,
    topics_to_json,
)
from tests.checks.report._bcf_xsd import BCF_SCHEMAS
from tests.checks.report._foreign import add_foreign_topic, add_reply
from tests.checks.report._tiny_model import (
    AUTHOR,
    NOW,
    diaphragm_finding,
    gid,
    tiny_model,
    wall_finding,
)

API = BCF_SCHEMAS / "api" / "3.0" / "Collaboration"
TOPIC = "Topic/topic_GET.json"
COMMENT = "Comment/comment_GET.json"
VIEWPOINT = "Viewpoint/viewpoint_POST.json"

_TYPES = {
    "string": lambda v: isinstance(v, str),
    "number": lambda v: isinstance(v, int | float) and not isinstance(v, bool),
    "integer": lambda v: isinstance(v, int) and not isinstance(v, bool),
    "boolean": lambda v: isinstance(v, bool),
    "object": lambda v: isinstance(v, dict),
    "array": lambda v: isinstance(v, list),
    "null": lambda v: v is None,
    "any": lambda v: True,
}


def _schema_path(name: str) -> Path:
    path = API / name
    if not path.is_file():
        pytest.skip(f"official BCF-API 3.0 JSON schemas not found in {API}")
    return path


def draft3_errors(value, schema: dict, base: Path, where: str = "$") -> list[str]:
    """Problems of ``value`` against a draft-03 ``schema`` whose file is ``base``."""
    if "$ref" in schema:
        target = (base.parent / schema["$ref"]).resolve()
        return draft3_errors(value, json.loads(target.read_text()), target, where)
    errors: list[str] = []
    types = schema.get("type")
    if types is not None:
        names = [
            "null" if t is None else t
            for t in (types if isinstance(types, list) else [types])
        ]
        if not any(_TYPES[t](value) for t in names):
            return [f"{where}: {value!r} is not of type {names}"]
    if "enum" in schema and value not in schema["enum"]:
        errors.append(f"{where}: {value!r} not in {schema['enum']}")
    if schema.get("format") == "base64" and isinstance(value, str):
        try:
            base64.b64decode(value, validate=True)
        except binascii.Error:
            errors.append(f"{where}: not base64")
    if isinstance(value, dict) and "properties" in schema:
        props = schema["properties"]
        errors += [
            f"{where}.{k}: required"
            for k, s in props.items()
            if s.get("required") is True and k not in value
        ]
        for k, v in value.items():
            if k not in props:
                errors.append(f"{where}.{k}: unknown key")
            else:
                errors += draft3_errors(v, props[k], base, f"{where}.{k}")
    if isinstance(value, list) and isinstance(schema.get("items"), dict):
        for i, item in enumerate(value):
            errors += draft3_errors(item, schema["items"], base, f"{where}[{i}]")
    return errors


def check(value, name: str) -> list[str]:
    path = _schema_path(name)
    return draft3_errors(value, json.loads(path.read_text()), path)


def _all_errors(doc: dict) -> list[str]:
    errors = []
    for i, entry in enumerate(doc["topics"]):
        errors += [f"topics[{i}].topic {e}" for e in check(entry["topic"], TOPIC)]
        for j, c in enumerate(entry["comments"]):
            errors += [f"topics[{i}].comments[{j}] {e}" for e in check(c, COMMENT)]
        for j, v in enumerate(entry["viewpoints"]):
            errors += [f"topics[{i}].viewpoints[{j}] {e}" for e in check(v, VIEWPOINT)]
    return errors


def _write_json(tmp_path, **kw):
    path = tmp_path / "topics.json"
    findings = [wall_finding("S"), diaphragm_finding()]
    topics_to_json(findings, path, model=tiny_model(), author=AUTHOR, now=NOW, **kw)
    return path, json.loads(path.read_text())


def test_checker_rejects_unknown_and_missing_keys():  # the checker is not vacuous
    bad = {"guid": "g", "title": 3, "colour": "red"}
    errors = check(bad, TOPIC)
    assert "$.colour: unknown key" in errors
    assert "$.creation_date: required" in errors
    assert any(e.startswith("$.title:") for e in errors)
    assert check({"snapshot": {"snapshot_type": "gif"}}, VIEWPOINT) == [
        "$.snapshot.snapshot_type: 'gif' not in ['jpg', 'png']"
    ]


def test_every_object_validates_against_bcf_api_3_0(
    tmp_path,
):  # BCF-API 3.0 JSON schemas
    _path, doc = _write_json(tmp_path)
    assert doc["schema"] == SCHEMA
    assert _all_errors(doc) == []


def test_shape_and_extension_numbers(tmp_path):
    _path, doc = _write_json(tmp_path)
    entry = doc["topics"][0]
    f = wall_finding("S")
    assert set(entry) == {"topic", "comments", "viewpoints", "shearline"}
    t = entry["topic"]
    assert (t["guid"], t["topic_status"], t["topic_type"], t["priority"]) == (
        topic_guid(f.id),
        "Open",
        "Error",
        "High",
    )
    assert t["creation_date"] == "2024-05-01T12:00:00Z"
    assert entry["shearline"] == {
        "finding_id": f.id,
        "rule": "unit_shear",
        "clause": "SDPWS 2015 §4.3",
        "severity": "error",
        "level": "Level 2",
        "direction": "X",
        "demand": 5000.0,
        "capacity": 3800.0,
        "ratio": pytest.approx(5000.0 / 3800.0),
        "unit": "N/m",
        "guids": [gid("Level 1/S")],
    }
    (vp,) = entry["viewpoints"]
    assert vp["components"]["selection"] == [{"ifc_guid": gid("Level 1/S")}]
    assert set(vp["perspective_camera"]) == {
        "camera_view_point",
        "camera_direction",
        "camera_up_vector",
        "field_of_view",
        "aspect_ratio",
    }
    assert base64.b64decode(vp["snapshot"]["snapshot_data"]).startswith(b"\x89PNG")


def test_json_round_trip_is_lossless(tmp_path):
    path, doc = _write_json(tmp_path)
    assert topics_to_dict(topics_from_json(path)) == doc


@pytest.mark.parametrize("version", ["2.1", "3.0"])
def test_json_of_a_bcf_with_foreign_content_validates(tmp_path, version):
    bcf_path = tmp_path / "ours.bcf"
    write_bcf(
        [wall_finding("S")],
        bcf_path,
        model=tiny_model(),
        author=AUTHOR,
        version=version,
        now=NOW,
    )
    add_reply(bcf_path, bcf_path, topic_guid(wall_finding("S").id), "Noted.")
    add_foreign_topic(bcf_path)
    doc = topics_to_dict(read_topics(bcf_path))
    assert _all_errors(doc) == []
    assert len(doc["topics"]) == 2
    # BCF-XML has no place for the numbers: topics read from a zip carry no extension
    assert [e["shearline"] for e in doc["topics"]] == [None, None]


@pytest.mark.parametrize(
    ("text", "match"),
    [
        ('{"schema": "other/1", "topics": []}', "'schema' must be"),
        ('{"schema": "shearline.topics/1"}', "key 'topics' missing"),
        (
            '{"schema": "shearline.topics/1", "topics": '
            '[{"topic": {"guid": "g"}, "comments": [], "viewpoints": []}]}',
            r"topics\[0\].topic: key 'title'",
        ),
        ("not json", "cannot read the topics JSON"),
    ],
)
def test_malformed_json_is_a_one_line_error(tmp_path, text, match):
    path = tmp_path / "bad.json"
    path.write_text(text)
    with pytest.raises(BcfError, match=match) as err:
        topics_from_json(path)
    assert "\n" not in str(err.value)


def test_bad_snapshot_data_is_refused(tmp_path):
    path, doc = _write_json(tmp_path)
    doc["topics"][0]["viewpoints"][0]["snapshot"]["snapshot_data"] = "***"
    path.write_text(json.dumps(doc))
    with pytest.raises(BcfError, match="snapshot_data is not base64"):
        topics_from_json(path)
