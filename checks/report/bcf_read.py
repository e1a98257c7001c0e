"""Read BCF topics back — from a BCF-XML 2.1/3.0 zip or from our topics JSON.

The zip is opened defensively (:mod:`checks.safe_zip`) and its XML parsed with lxml
without DTDs or entities; no BCF library is involved, so what comes back is plain
records (:mod:`checks.report.bcf_topics`). Each topic keeps its ``markup.bcf`` bytes
so nothing another tool wrote is lost. Cameras are world metres; dates UTC.
"""

from __future__ import annotations

import datetime as dt
import logging
from pathlib import Path

from lxml import etree

from checks.errors import BcfError
from checks.report._camera import Camera
from checks.report.bcf_topics import Comment, Topic, Topics, Viewpoint, as_utc
from checks.report.topics_json import topics_from_json
from checks.safe_zip import parse_xml, read_zip_members

__all__ = ["Topics", "read_topics"]

logger = logging.getLogger(__name__)


def _local(el: etree._Element) -> str:
    return etree.QName(el).localname if isinstance(el.tag, str) else ""


def _kids(el: etree._Element | None, name: str) -> list[etree._Element]:
    if el is None:
        return []
    return [c for c in el if _local(c) == name]


def _kid(el: etree._Element | None, name: str) -> etree._Element | None:
    kids = _kids(el, name)
    return kids[0] if kids else None


def _text(el: etree._Element | None, name: str) -> str | None:
    kid = _kid(el, name)
    return None if kid is None or kid.text is None else kid.text.strip()


def _date(
    value: str | None, where: str, *, required: bool = False
) -> dt.datetime | None:
    if not value:
        if required:
            msg = f"{where}: date missing; the BCF requires it"
            raise BcfError(msg)
        return None
    try:
        return as_utc(dt.datetime.fromisoformat(value))
    except ValueError as exc:
        msg = f"{where}: date {value!r} is not an ISO 8601 date-time"
        raise BcfError(msg) from exc


def _vector(el: etree._Element | None, where: str) -> tuple[float, float, float]:
    try:
        return tuple(float(_text(el, axis) or "") for axis in ("X", "Y", "Z"))  # type: ignore[return-value]
    except ValueError as exc:
        msg = f"{where}: camera vector without numeric X, Y, Z"
        raise BcfError(msg) from exc


def _camera(root: etree._Element, where: str) -> Camera | None:
    for tag, kind in (
        ("PerspectiveCamera", "perspective"),
        ("OrthogonalCamera", "orthogonal"),
    ):
        cam = _kid(root, tag)
        if cam is None:
            continue
        try:
            fov = (
                float(_text(cam, "FieldOfView")) if _text(cam, "FieldOfView") else None
            )
            scale = (
                float(_text(cam, "ViewToWorldScale"))
                if _text(cam, "ViewToWorldScale")
                else None
            )
            aspect = float(
                _text(cam, "AspectRatio") or 1.0
            )  # BCF 2.1 has none: assume 1
        except ValueError as exc:
            msg = f"{where}: {tag} has a non-numeric value"
            raise BcfError(msg) from exc
        return Camera(
            kind=kind,
            view_point=_vector(_kid(cam, "CameraViewPoint"), where),
            direction=_vector(_kid(cam, "CameraDirection"), where),
            up_vector=_vector(_kid(cam, "CameraUpVector"), where),
            field_of_view=fov,
            view_to_world_scale=scale,
            aspect_ratio=aspect,
        )
    return None


def _viewpoint(
    ref: etree._Element, folder: str, members: dict[str, bytes], source: str
) -> Viewpoint:
    guid = ref.get("Guid", "")
    file_name = _text(ref, "Viewpoint") or ""
    snap_name = _text(ref, "Snapshot") or ""
    selected: tuple[str, ...] = ()
    camera = None
    data = members.get(f"{folder}/{file_name}") if file_name else None
    if data is not None:
        where = f"{source}: {folder}/{file_name}"
        root = parse_xml(data, source=where)
        guid = guid or root.get("Guid", "")
        selection = _kid(_kid(root, "Components"), "Selection")
        selected = tuple(
            c.get("IfcGuid", "")
            for c in _kids(selection, "Component")
            if c.get("IfcGuid")
        )
        camera = _camera(root, where)
    elif file_name:
        logger.warning("%s: %s/%s is referenced but missing", source, folder, file_name)
    snapshot = members.get(f"{folder}/{snap_name}") if snap_name else None
    kind = "jpg" if snap_name.lower().endswith((".jpg", ".jpeg")) else "png"
    return Viewpoint(
        guid=guid,
        selected=selected,
        camera=camera,
        snapshot=snapshot,
        snapshot_type=kind,
        file_name=file_name,
    )


def _comment(el: etree._Element, where: str) -> Comment:
    vp = _kid(el, "Viewpoint")
    return Comment(
        guid=el.get("Guid", ""),
        date=_date(_text(el, "Date"), where, required=True),
        author=_text(el, "Author") or "",
        text=_text(el, "Comment") or "",
        viewpoint_guid=vp.get("Guid") if vp is not None else None,
        modified_date=_date(_text(el, "ModifiedDate"), where),
        modified_author=_text(el, "ModifiedAuthor"),
    )


def _topic(folder: str, members: dict[str, bytes], source: str) -> Topic:
    where = f"{source}: {folder}/markup.bcf"
    raw = members[f"{folder}/markup.bcf"]
    markup = parse_xml(raw, source=where)
    topic = _kid(markup, "Topic")
    if topic is None or not topic.get("Guid"):
        msg = f"{where}: no Topic with a Guid; the markup is not BCF"
        raise BcfError(msg)
    v3 = _kid(topic, "Comments") is not None or _kid(topic, "Viewpoints") is not None
    comments_parent = _kid(topic, "Comments") if v3 else markup
    comment_els = (
        _kids(comments_parent, "Comment") if comments_parent is not None else []
    )
    refs = (
        _kids(_kid(topic, "Viewpoints"), "ViewPoint")
        if v3
        else _kids(markup, "Viewpoints")
    )
    labels_el = _kid(topic, "Labels")
    if labels_el is not None and _kids(labels_el, "Label"):
        labels = tuple((e.text or "").strip() for e in _kids(labels_el, "Label"))
    else:
        labels = tuple((e.text or "").strip() for e in _kids(topic, "Labels"))
    return Topic(
        guid=topic.get("Guid", ""),
        title=_text(topic, "Title") or "",
        status=topic.get("TopicStatus", ""),
        type=topic.get("TopicType", ""),
        priority=_text(topic, "Priority") or "",
        labels=tuple(x for x in labels if x),
        description=_text(topic, "Description") or "",
        creation_date=_date(_text(topic, "CreationDate"), where, required=True),
        creation_author=_text(topic, "CreationAuthor") or "",
        modified_date=_date(_text(topic, "ModifiedDate"), where),
        modified_author=_text(topic, "ModifiedAuthor"),
        assigned_to=_text(topic, "AssignedTo"),
        server_assigned_id=topic.get("ServerAssignedId", ""),
        comments=tuple(_comment(c, where) for c in comment_els),
        viewpoints=tuple(_viewpoint(r, folder, members, source) for r in refs),
        folder=folder,
        raw_markup=raw,
    )


def _read_zip(path: Path) -> Topics:
    source = str(path)
    members = read_zip_members(path)
    if "bcf.version" not in members:
        msg = f"{path}: no bcf.version member; this is not a BCF-XML file"
        raise BcfError(msg)
    version_root = parse_xml(members["bcf.version"], source=f"{source}: bcf.version")
    version = version_root.get("VersionId", "")
    if version not in {"2.0", "2.1", "3.0"}:
        msg = (
            f"{path}: BCF version {version!r} is not supported; "
            "give a BCF 2.1 or 3.0 file"
        )
        raise BcfError(msg)
    project_name = project_id = ""
    if "project.bcfp" in members:
        project = _kid(
            parse_xml(members["project.bcfp"], source=f"{source}: project.bcfp"),
            "Project",
        )
        project_name = _text(project, "Name") or ""
        project_id = project.get("ProjectId", "") if project is not None else ""
    folders = [
        n.split("/")[0]
        for n in members
        if n.count("/") == 1 and n.endswith("/markup.bcf")
    ]
    topics = tuple(_topic(f, members, source) for f in folders)
    for t in topics:
        if t.guid != t.folder:
            logger.warning("%s: folder %s holds topic %s", path, t.folder, t.guid)
    return Topics(
        source=source,
        source_kind="bcf",
        bcf_version="3.0" if version == "3.0" else "2.1",
        project_name=project_name,
        project_id=project_id,
        topics=topics,
    )


def read_topics(path: str | Path) -> Topics:
    """Read the topics of a BCF-XML zip (2.1 or 3.0) or of our topics JSON.

    BCF-XML 2.1 / 3.0 (buildingSMART). Common practice: treat a received zip as
    untrusted (zip slip, zip bombs, XML entities).

    Args:
        path: A ``.bcf``/``.bcfzip`` file, or a ``.json`` written by
            :func:`checks.report.topics_json.topics_to_json`.

    Returns:
        The topics, in file order.

    Raises:
        BcfError: The file is missing, unsafe, or not BCF.
    """
    path = Path(path)
    if not path.is_file():
        msg = (
            f"{path}: no such BCF file; "
            "give the path of the previous run's .bcf or .json"
        )
        raise BcfError(msg)
    with path.open("rb") as fh:
        head = fh.read(64).lstrip()
    if path.suffix.lower() == ".json" or head.startswith(b"{"):
        return topics_from_json(path)
    return _read_zip(path)
