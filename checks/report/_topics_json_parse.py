"""Parse our topics JSON (``shearline.topics/1``) back into topic records.

The shape is described in :mod:`checks.report.topics_json`; every problem is a one-line
:class:`checks.errors.BcfError` naming the file and the JSON path of the bad key.
"""

from __future__ import annotations

import base64
import binascii
import datetime as dt
from typing import Any

from checks.errors import BcfError
from checks.report._camera import Camera
from checks.report.bcf_topics import (
    Comment,
    FindingData,
    Topic,
    Topics,
    Viewpoint,
    as_utc,
)

__all__ = ["EXTENSION_KEY", "SCHEMA", "dict_to_topics"]

SCHEMA = "shearline.topics/1"
EXTENSION_KEY = "shearline"


def _need(
    obj: dict[str, Any], key: str, where: str, kind: type | tuple[type, ...] = str
) -> Any:
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
    for key, kind in (
        ("perspective_camera", "perspective"),
        ("orthogonal_camera", "orthogonal"),
    ):
        cam = obj.get(key)
        if not cam:
            continue
        try:
            vecs = [
                cam[k]
                for k in ("camera_view_point", "camera_direction", "camera_up_vector")
            ]
            v = [(float(p["x"]), float(p["y"]), float(p["z"])) for p in vecs]
            return Camera(
                kind=kind,
                view_point=v[0],
                direction=v[1],
                up_vector=v[2],
                field_of_view=float(cam["field_of_view"])
                if "field_of_view" in cam
                else None,
                view_to_world_scale=float(cam["view_to_world_scale"])
                if "view_to_world_scale" in cam
                else None,
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
        selected=tuple(
            c["ifc_guid"]
            for c in selection
            if isinstance(c, dict) and c.get("ifc_guid")
        ),
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
                modified_date=_parse_date(c["modified_date"], cw)
                if c.get("modified_date")
                else None,
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
        creation_date=_parse_date(
            _need(t, "creation_date", f"{where}.topic"), f"{where}.topic"
        ),
        creation_author=_need(t, "creation_author", f"{where}.topic"),
        modified_date=_parse_date(t["modified_date"], where)
        if t.get("modified_date")
        else None,
        modified_author=t.get("modified_author"),
        assigned_to=t.get("assigned_to"),
        server_assigned_id=""
        if t.get("server_assigned_id") == guid
        else t.get("server_assigned_id") or "",
        comments=tuple(comments),
        viewpoints=tuple(viewpoints),
        finding=_parse_finding(entry.get(EXTENSION_KEY), f"{where}.{EXTENSION_KEY}"),
    )


def dict_to_topics(data: Any, *, source: str) -> Topics:
    """Topics from a dict in our JSON shape.

    Common practice: refuse a document that does not declare our schema.

    Args:
        data: The parsed JSON document.
        source: File name, for the error messages.

    Returns:
        The topics (``source_kind`` ``"json"``).

    Raises:
        BcfError: The dict is not ``shearline.topics/1`` or a key is malformed.
    """
    if not isinstance(data, dict) or data.get("schema") != SCHEMA:
        msg = f"{source}: not a topics file (its 'schema' must be {SCHEMA!r})"
        raise BcfError(msg)
    version = data.get("bcf_version", "2.1")
    entries = _need(data, "topics", source, list)
    topics = tuple(
        _parse_topic(e, f"{source}: topics[{i}]") for i, e in enumerate(entries)
    )
    return Topics(
        source=source,
        source_kind="json",
        bcf_version="3.0" if version == "3.0" else "2.1",
        project_name=str(data.get("project_name", "")),
        topics=topics,
    )
