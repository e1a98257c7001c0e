"""Topic records -> bcf-client 0.9 model objects, for BCF-XML 2.1 and 3.0.

The two versions differ in shape (BCF-XML 3.0 nests comments and viewpoints in the
Topic and wraps labels); this module hides that. Cameras are world coordinates in
metres; bcf-client does no unit scaling on them.
"""

from __future__ import annotations

import datetime as dt
from pathlib import Path
from types import ModuleType

import bcf.v2.model as m2
import bcf.v3.model as m3
from bcf.v2.topic import TopicHandler as TopicHandler2
from bcf.v2.visinfo import VisualizationInfoHandler as VisInfo2
from bcf.v3.topic import TopicHandler as TopicHandler3
from bcf.v3.visinfo import VisualizationInfoHandler as VisInfo3
from xsdata.models.datatype import XmlDateTime

from checks.report.bcf_topics import Camera, Comment, Topic, Viewpoint, as_utc

__all__ = [
    "PRIMARY_SNAPSHOT",
    "PRIMARY_VIEWPOINT",
    "add_comment",
    "add_viewpoint",
    "header_for",
    "model_of",
    "new_topic_handler",
    "xml_date",
]

PRIMARY_VIEWPOINT = (
    "viewpoint.bcfv"  # BCF-XML 2.1 markup.xsd; IfcOpenShell #7152 workaround
)
PRIMARY_SNAPSHOT = "snapshot.png"
HIGHLIGHT_HEX = "FF1E1E"  # same red as the snapshot


def model_of(version: str) -> ModuleType:
    """The bcf-client model module of a BCF version."""
    return m3 if version == "3.0" else m2


def xml_date(when: dt.datetime) -> XmlDateTime:
    """An XmlDateTime in UTC; bcf-client would stamp naive local time (its bug 4)."""
    return XmlDateTime.from_datetime(as_utc(when))


def _camera(mdl: ModuleType, camera: Camera, version: str) -> dict[str, object]:
    """Keyword arguments of VisualizationInfo for one camera."""
    point = mdl.Point(
        x=camera.view_point[0], y=camera.view_point[1], z=camera.view_point[2]
    )
    direction = mdl.Direction(
        x=camera.direction[0], y=camera.direction[1], z=camera.direction[2]
    )
    up = mdl.Direction(
        x=camera.up_vector[0], y=camera.up_vector[1], z=camera.up_vector[2]
    )
    common: dict[str, object] = {
        "camera_view_point": point,
        "camera_direction": direction,
        "camera_up_vector": up,
    }
    if version == "3.0":
        common["aspect_ratio"] = camera.aspect_ratio
    if camera.kind == "orthogonal":
        cam = mdl.OrthogonalCamera(
            **common, view_to_world_scale=camera.view_to_world_scale or 1.0
        )
        return {"orthogonal_camera": cam}
    fov = camera.field_of_view or 60.0
    if version != "3.0":
        fov = min(max(fov, 45.0), 60.0)  # BCF-XML 2.1 visinfo.xsd allows 45..60 deg
    return {"perspective_camera": mdl.PerspectiveCamera(**common, field_of_view=fov)}


def _components(mdl: ModuleType, guids: tuple[str, ...], version: str) -> object:
    comps = [mdl.Component(ifc_guid=g) for g in guids]
    visibility = mdl.ComponentVisibility(default_visibility=True)
    if not comps:
        return mdl.Components(visibility=visibility)
    selection = mdl.ComponentSelection(component=list(comps))
    if version == "3.0":
        colour = m3.ComponentColoringColor(
            color=HIGHLIGHT_HEX,
            components=m3.ComponentColoringColorComponents(
                component=[m3.Component(ifc_guid=g) for g in guids]
            ),
        )
    else:
        colour = m2.ComponentColoringColor(
            color=HIGHLIGHT_HEX, component=[m2.Component(ifc_guid=g) for g in guids]
        )
    coloring = mdl.ComponentColoring(color=[colour])
    return mdl.Components(selection=selection, visibility=visibility, coloring=coloring)


def _visinfo(viewpoint: Viewpoint, version: str) -> object:
    mdl = model_of(version)
    kwargs: dict[str, object] = {"guid": viewpoint.guid}
    kwargs["components"] = _components(mdl, viewpoint.selected, version)
    if viewpoint.camera is not None:
        kwargs |= _camera(mdl, viewpoint.camera, version)
    return mdl.VisualizationInfo(**kwargs)


def _viewpoint_refs(handler: TopicHandler2 | TopicHandler3, version: str) -> list:
    """The list of ViewPoint references of a topic (created in 3.0 if missing)."""
    if version == "3.0":
        topic = handler.topic
        if topic.viewpoints is None:
            topic.viewpoints = m3.TopicViewpoints()
        return topic.viewpoints.view_point
    return handler.markup.viewpoints


def add_viewpoint(
    handler: TopicHandler2 | TopicHandler3, viewpoint: Viewpoint, version: str
) -> None:
    """Add a viewpoint (and its snapshot) to a topic handler.

    The topic's first viewpoint is named ``viewpoint.bcfv`` with ``snapshot.png``, as
    BCF 2.1 requires; later ones ``<guid>.bcfv`` and ``<guid>.png``. Both the snapshot
    bytes and the file name are set, else bcf-client drops the snapshot (its bug 6).
    """
    refs = _viewpoint_refs(handler, version)
    names = {r.viewpoint for r in refs}
    first = PRIMARY_VIEWPOINT not in names
    name = PRIMARY_VIEWPOINT if first else f"{viewpoint.guid}.bcfv"
    snap_name = None
    if viewpoint.snapshot:
        ext = "jpg" if viewpoint.snapshot_type == "jpg" else "png"
        snap_name = (
            PRIMARY_SNAPSHOT if first and ext == "png" else f"{viewpoint.guid}.{ext}"
        )
    vis_cls = VisInfo3 if version == "3.0" else VisInfo2
    handlers = handler.viewpoints  # loads (or creates) the dict before we add to it
    handlers[name] = vis_cls(_visinfo(viewpoint, version), snapshot=viewpoint.snapshot)
    mdl = model_of(version)
    refs.append(mdl.ViewPoint(viewpoint=name, snapshot=snap_name, guid=viewpoint.guid))


def add_comment(
    handler: TopicHandler2 | TopicHandler3, comment: Comment, version: str
) -> None:
    """Append a comment to a topic handler."""
    mdl = model_of(version)
    vp = (
        mdl.CommentViewpoint(guid=comment.viewpoint_guid)
        if comment.viewpoint_guid
        else None
    )
    item = mdl.Comment(
        guid=comment.guid,
        date=xml_date(comment.date),
        author=comment.author,
        comment=comment.text,
        viewpoint=vp,
        modified_date=xml_date(comment.modified_date)
        if comment.modified_date
        else None,
        modified_author=comment.modified_author,
    )
    handler.comments = [*handler.comments, item]


def header_for(
    version: str, *, ifc_filename: str, ifc_project: str, date: dt.datetime
) -> object | None:
    """A markup Header with one File referencing the IFC, or None when empty."""
    if not ifc_filename and not ifc_project:
        return None
    kw = {
        "filename": ifc_filename or None,
        "date": xml_date(date),
        "ifc_project": ifc_project or None,
        "is_external": True,
    }
    if version == "3.0":
        return m3.Header(files=m3.HeaderFiles(file=[m3.File(**kw)]))
    return m2.Header(file=[m2.HeaderFile(**kw)])


def _topic_model(topic: Topic, version: str) -> object:
    mdl = model_of(version)
    kw: dict[str, object] = {
        "guid": topic.guid,
        "title": topic.title,
        "priority": topic.priority or None,
        "creation_date": xml_date(topic.creation_date),
        "creation_author": topic.creation_author,
        "modified_date": xml_date(topic.modified_date) if topic.modified_date else None,
        "modified_author": topic.modified_author,
        "assigned_to": topic.assigned_to,
        "description": topic.description or None,
        "topic_type": topic.type,
        "topic_status": topic.status,
    }
    if version == "3.0":
        kw["labels"] = (
            m3.TopicLabels(label=list(topic.labels)) if topic.labels else None
        )
    else:
        kw["labels"] = list(topic.labels)
    return mdl.Topic(**kw)


def new_topic_handler(
    topic: Topic, version: str, *, header: object | None = None
) -> TopicHandler2 | TopicHandler3:
    """A bcf-client topic handler holding a topic record, its comments and viewpoints.

    The handler's folder is the topic GUID, so markup and viewpoints land in the same
    folder (bcf-client bug 5 otherwise).
    """
    mdl = model_of(version)
    markup = mdl.Markup(header=header, topic=_topic_model(topic, version))
    cls = TopicHandler3 if version == "3.0" else TopicHandler2
    handler = cls(topic_dir=Path(topic.guid))
    handler.markup = markup
    for comment in topic.comments:
        add_comment(handler, comment, version)
    for viewpoint in topic.viewpoints:
        add_viewpoint(handler, viewpoint, version)
    return handler
