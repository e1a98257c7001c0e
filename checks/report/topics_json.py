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
import dataclasses
import datetime as dt
import json
import logging
from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Any

from checks.errors import BcfError, OutputError
from checks.findings import Finding
from checks.report._camera import Camera
from checks.report._json_text import dumps_indented
from checks.report._topics_json_parse import EXTENSION_KEY, SCHEMA, dict_to_topics
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

__all__ = [
    "SCHEMA",
    "dict_to_topics",
    "topics_from_json",
    "topics_to_dict",
    "topics_to_json",
]

logger = logging.getLogger(__name__)

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
    """The topics as a JSON-ready dict (see the module docstring).

    BCF-API 3.0 field names (buildingSMART).

    Args:
        topics: The topics.

    Returns:
        ``{"schema", "bcf_version", "project_name", "topics"}``.
    """
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
    current: Mapping[str, str] | None = None,
    fresh: Topics | None = None,
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
        fresh: The topics ``topics_from_findings(findings, ...)`` gives for these
            arguments, when the caller has them already; used without ``previous``.

    Returns:
        The topics written.

    Raises:
        OutputError: The file cannot be written.
    """
    now = as_utc(now)
    if previous is None and fresh is not None:
        topics = dataclasses.replace(
            fresh,
            bcf_version=version,
            project_name=project_name or model.project_name,
        )
    elif previous is None:
        topics = topics_from_findings(
            findings,
            model=model,
            author=author,
            now=now,
            bcf_version=version,
            project_name=project_name,
        )
    else:
        plan = merge_topics(
            previous,
            findings,
            author=author,
            now=now,
            ifc_filename=ifc_filename,
            current=current,
        )
        topics = apply_plan(previous, plan, model=model)
    text = dumps_indented(topics_to_dict(topics), ensure_ascii=False)
    path = Path(path)
    try:
        path.write_text(text + "\n", encoding="utf-8")
    except OSError as exc:
        msg = (
            f"{path}: cannot write the topics JSON ({exc}); "
            "check the folder is writable"
        )
        raise OutputError(msg) from exc
    logger.info("%s: %d topics written", path, len(topics.topics))
    return topics


def topics_from_json(path: str | Path) -> Topics:
    """Read topics from a JSON file written by :func:`topics_to_json`.

    BCF-API 3.0 field names (buildingSMART).

    Args:
        path: The ``.json`` file.

    Returns:
        The topics, in file order.

    Raises:
        BcfError: The file is unreadable, too large, not JSON or not our shape.
    """
    path = Path(path)
    try:
        size = path.stat().st_size
        if size > _MAX_JSON:
            msg = (
                f"{path}: {size} bytes, "
                f"over the {_MAX_JSON} byte limit for a topics file"
            )
            raise BcfError(msg)
        data = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, UnicodeDecodeError, json.JSONDecodeError) as exc:
        msg = f"{path}: cannot read the topics JSON ({exc})"
        raise BcfError(msg) from exc
    return dict_to_topics(data, source=str(path))
