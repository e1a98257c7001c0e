"""The topics as neutral JSON in the field names of the buildingSMART BCF REST API.

Shape (``schema`` ``"shearline.topics/1"``)::

    {"schema": "shearline.topics/1", "bcf_version": "2.1", "project_name": "...",
     "topics": [{"topic": {...}, "comments": [...], "viewpoints": [...],
                 "shearline": {...} | null}]}

``topic`` follows BCF-API 3.0 ``topic_GET.json``, each of ``comments`` follows
``comment_GET.json`` and each of ``viewpoints`` ``viewpoint_POST.json`` (components and
a base64 snapshot included). ``bcf_version`` is the BCF-XML version of the companion
zip. The finding's numbers sit under the one extra key ``shearline``, SI units in
``unit``. Cameras are world metres, angles degrees (BCF-API 3.0 README §1.3).
"""

from __future__ import annotations

import base64
import binascii
import datetime as dt
import json
import logging
from collections.abc import Sequence
from pathlib import Path
from typing import Any

from checks.errors import BcfError, OutputError
from checks.findings import Finding
from checks.report._camera import Camera
from checks.report.bcf_topics import (
    Comment,
    FindingData,
    Topic,
    Topics,
    Viewpoint,
    as_utc,
    topics_from_findings,
)
from checks.roundtrip import apply_plan, merge_topics
from ifc_bridge.model import BuildingModel

__all__ = ["SCHEMA", "dict_to_topics", "topics_from_json", "topics_to_dict", "topics_to_json"]

logger = logging.getLogger(__name__)

SCHEMA = "shearline.topics/1"
EXTENSION_KEY = "shearline"
_MAX_JSON = 200 * 1024 * 1024  # [bytes] same total limit as a BCF zip


def _date(value: dt.datetime) -> str:
    return as_utc(value).isoformat().replace("+00:00", "Z")


def _vec(v: tuple[float, float, float]) -> dict[str, float]:
    return {"x": float(v[0]), "y": float(v[1]), "z": float(v[2])}


def _topic_obj(t: Topic) -> dict[str, Any]:
    obj: dict[str, Any] = {
        "guid": t.guid,
        "server_assigned_id": t.server_assigned_id or t.guid,
        "topic_type": t.type,
        "topic_status": t.status,
        "title": t.title,
        "priority": t.priority or None,
        "labels": list(t.labels),
        "description": t.description,
        "creation_date": _date(t.creation_date),
        "creation_author": t.creation_author,
    }
    if t.modified_date is not None:
        obj["modified_date"] = _date(t.modified_date)
        obj["modified_author"] = t.modified_author
    if t.assigned_to:
        obj["assigned_to"] = t.assigned_to
    return obj


def _comment_obj(c: Comment, topic_guid: str) -> dict[str, Any]:
    obj: dict[str, Any] = {
        "guid": c.guid,
        "date": _date(c.date),
        "author": c.author,
        "comment": c.text,
        "topic_guid": topic_guid,
        "viewpoint_guid": c.viewpoint_guid,
    }
    if c.modified_date is not None:
        obj["modified_date"] = _date(c.modified_date)
        obj["modified_author"] = c.modified_author
    return obj


def _camera_obj(c: Camera) -> tuple[str, dict[str, Any]]:
    obj: dict[str, Any] = {
        "camera_view_point": _vec(c.view_point),
        "camera_direction": _vec(c.direction),
        "camera_up_vector": _vec(c.up_vector),
    }
    if c.kind == "orthogonal":
        obj["view_to_world_scale"] = float(c.view_to_world_scale or 1.0)
        key = "orthogonal_camera"
    else:
        obj["field_of_view"] = float(c.field_of_view or 60.0)
        key = "perspective_camera"
    obj["aspect_ratio"] = float(c.aspect_ratio)
    return key, obj


def _viewpoint_obj(v: Viewpoint) -> dict[str, Any]:
    obj: dict[str, Any] = {"guid": v.guid}
    if v.camera is not None:
        key, cam = _camera_obj(v.camera)
        obj[key] = cam
    obj["components"] = {"selection": [{"ifc_guid": g} for g in v.selected]}
    if v.snapshot:
        obj["snapshot"] = {
            "snapshot_type": v.snapshot_type,
            "snapshot_data": base64.b64encode(v.snapshot).decode("ascii"),
        }
    return obj


def _finding_obj(f: FindingData | None) -> dict[str, Any] | None:
    if f is None:
        return None
    return {
        "finding_id": f.finding_id,
        "rule": f.rule,
        "clause": f.clause,
        "severity": f.severity,
        "level": f.level,
        "direction": f.direction,
        "demand": f.demand,
        "capacity": f.capacity,
        "ratio": f.ratio,
        "unit": f.unit,
        "guids": list(f.guids),
    }


def topics_to_dict(topics: Topics) -> dict[str, Any]:
    """The topics as a JSON-ready dict (see the module docstring)."""
    return {
        "schema": SCHEMA,
        "bcf_version": topics.bcf_version,
        "project_name": topics.project_name,
        "topics": [
            {
                "topic": _topic_obj(t),
                "comments": [_comment_obj(c, t.guid) for c in t.comments],
                "viewpoints": [_viewpoint_obj(v) for v in t.viewpoints],
                EXTENSION_KEY: _finding_obj(t.finding),
            }
            for t in topics.topics
        ],
    }


def topics_to_json(
    findings: Sequence[Finding],
    path: str | Path,
    *,
    model: BuildingModel,
    author: str,
    version: str = "2.1",
    project_name: str = "",
    ifc_filename: str = "",
    previous: Topics | None = None,
    now: dt.datetime | None = None,
) -> Topics:
    """Write the findings' topics as JSON, merged with the previous run's if given.

    BCF-API 3.0 field names (buildingSMART). Same topics, GUIDs and comments as
    :func:`checks.report.bcf_write.write_bcf` with the same arguments.

    Args:
        findings: The findings of this run.
        path: The ``.json`` file to write.
        model: The model checked.
        author: Author of topics and comments.
        version: BCF-XML version of the companion zip, ``"2.1"`` or ``"3.0"``.
        project_name: Project name; the IFC project name when ``""``.
        ifc_filename: Name of the IFC file checked, quoted in re-check comments.
        previous: Topics of the previous run, or None.
        now: Date of the run; taken as UTC if naive, the clock if None.

    Returns:
        The topics written.

    Raises:
        OutputError: The file cannot be written.
    """
    now = as_utc(now)
    if previous is None:
        topics = topics_from_findings(
            findings, model=model, author=author, now=now, bcf_version=version, project_name=project_name
        )
    else:
        plan = merge_topics(previous, findings, author=author, now=now, ifc_filename=ifc_filename)
        topics = apply_plan(previous, plan, model=model)
    text = json.dumps(topics_to_dict(topics), indent=2, ensure_ascii=False, allow_nan=False)
    path = Path(path)
    try:
        path.write_text(text + "\n", encoding="utf-8")
    except OSError as exc:
        msg = f"{path}: cannot write the topics JSON ({exc}); check the folder is writable"
        raise OutputError(msg) from exc
    logger.info("%s: %d topics written", path, len(topics.topics))
    return topics


def _need(obj: dict[str, Any], key: str, where: str, kind: type | tuple[type, ...] = str) -> Any:
    if not isinstance(obj, dict) or key not in obj or not isinstance(obj[key], kind):
        msg = f"{where}: key {key!r} missing or of the wrong type"
        raise BcfError(msg)
    return obj[key]


def _parse_date(value: Any, where: str) -> dt.datetime:
    try:
        return as_utc(dt.datetime.fromisoformat(str(value)))
    except ValueError as exc:
        msg = f"{where}: date {value!r} is not ISO 8601"
        raise BcfError(msg) from exc


def _parse_camera(obj: dict[str, Any], where: str) -> Camera | None:
    for key, kind in (("perspective_camera", "perspective"), ("orthogonal_camera", "orthogonal")):
        cam = obj.get(key)
        if not cam:
            continue
        try:
            vecs = [cam[k] for k in ("camera_view_point", "camera_direction", "camera_up_vector")]
            v = [(float(p["x"]), float(p["y"]), float(p["z"])) for p in vecs]
            return Camera(
                kind=kind,
                view_point=v[0],
                direction=v[1],
                up_vector=v[2],
                field_of_view=float(cam["field_of_view"]) if "field_of_view" in cam else None,
                view_to_world_scale=float(cam["view_to_world_scale"]) if "view_to_world_scale" in cam else None,
                aspect_ratio=float(cam.get("aspect_ratio", 1.0)),
            )
        except (KeyError, TypeError, ValueError) as exc:
            msg = f"{where}: {key} malformed ({exc})"
            raise BcfError(msg) from exc
    return None


def _parse_viewpoint(obj: dict[str, Any], where: str) -> Viewpoint:
    snapshot = None
    snap = obj.get("snapshot") or {}
    if snap.get("snapshot_data"):
        try:
            snapshot = base64.b64decode(snap["snapshot_data"], validate=True)
        except (binascii.Error, ValueError) as exc:
            msg = f"{where}: snapshot_data is not base64"
            raise BcfError(msg) from exc
    selection = (obj.get("components") or {}).get("selection") or []
    return Viewpoint(
        guid=_need(obj, "guid", where),
        selected=tuple(c["ifc_guid"] for c in selection if isinstance(c, dict) and c.get("ifc_guid")),
        camera=_parse_camera(obj, where),
        snapshot=snapshot,
        snapshot_type=str(snap.get("snapshot_type", "png")),
    )


def _parse_finding(obj: Any, where: str) -> FindingData | None:
    if obj is None:
        return None
    try:
        return FindingData(
            finding_id=str(obj["finding_id"]),
            rule=str(obj["rule"]),
            clause=str(obj["clause"]),
            severity=str(obj["severity"]),
            level=str(obj["level"]),
            direction=obj.get("direction"),
            demand=obj.get("demand"),
            capacity=obj.get("capacity"),
            ratio=obj.get("ratio"),
            unit=str(obj.get("unit", "")),
            guids=tuple(obj.get("guids", ())),
        )
    except (KeyError, TypeError) as exc:
        msg = f"{where}: '{EXTENSION_KEY}' object malformed (missing {exc})"
        raise BcfError(msg) from exc


def _parse_topic(entry: dict[str, Any], where: str) -> Topic:
    t = _need(entry, "topic", where, dict)
    guid = _need(t, "guid", f"{where}.topic")
    comments = []
    for j, c in enumerate(_need(entry, "comments", where, list)):
        cw = f"{where}.comments[{j}]"
        comments.append(
            Comment(
                guid=_need(c, "guid", cw),
                date=_parse_date(_need(c, "date", cw), cw),
                author=_need(c, "author", cw),
                text=_need(c, "comment", cw),
                viewpoint_guid=c.get("viewpoint_guid"),
                modified_date=_parse_date(c["modified_date"], cw) if c.get("modified_date") else None,
                modified_author=c.get("modified_author"),
            )
        )
    viewpoints = [
        _parse_viewpoint(v, f"{where}.viewpoints[{j}]")
        for j, v in enumerate(_need(entry, "viewpoints", where, list))
    ]
    return Topic(
        guid=guid,
        title=_need(t, "title", f"{where}.topic"),
        status=t.get("topic_status") or "",
        type=t.get("topic_type") or "",
        priority=t.get("priority") or "",
        labels=tuple(x for x in (t.get("labels") or []) if x),
        description=t.get("description") or "",
        creation_date=_parse_date(_need(t, "creation_date", f"{where}.topic"), f"{where}.topic"),
        creation_author=_need(t, "creation_author", f"{where}.topic"),
        modified_date=_parse_date(t["modified_date"], where) if t.get("modified_date") else None,
        modified_author=t.get("modified_author"),
        assigned_to=t.get("assigned_to"),
        server_assigned_id="" if t.get("server_assigned_id") == guid else t.get("server_assigned_id") or "",
        comments=tuple(comments),
        viewpoints=tuple(viewpoints),
        finding=_parse_finding(entry.get(EXTENSION_KEY), f"{where}.{EXTENSION_KEY}"),
    )


def dict_to_topics(data: Any, *, source: str) -> Topics:
    """Topics from a dict in our JSON shape.

    Raises:
        BcfError: The dict is not ``shearline.topics/1`` or a key is malformed.
    """
    if not isinstance(data, dict) or data.get("schema") != SCHEMA:
        msg = f"{source}: not a topics file (its 'schema' must be {SCHEMA!r})"
        raise BcfError(msg)
    version = data.get("bcf_version", "2.1")
    entries = _need(data, "topics", source, list)
    topics = tuple(_parse_topic(e, f"{source}: topics[{i}]") for i, e in enumerate(entries))
    return Topics(
        source=source,
        source_kind="json",
        bcf_version="3.0" if version == "3.0" else "2.1",
        project_name=str(data.get("project_name", "")),
        topics=topics,
    )


def topics_from_json(path: str | Path) -> Topics:
    """Read topics from a JSON file written by :func:`topics_to_json`.

    Raises:
        BcfError: The file is unreadable, too large, not JSON or not our shape.
    """
    path = Path(path)
    try:
        size = path.stat().st_size
        if size > _MAX_JSON:
            msg = f"{path}: {size} bytes, over the {_MAX_JSON} byte limit for a topics file"
            raise BcfError(msg)
        data = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, UnicodeDecodeError, json.JSONDecodeError) as exc:
        msg = f"{path}: cannot read the topics JSON ({exc})"
        raise BcfError(msg) from exc
    return dict_to_topics(data, source=str(path))
