"""Write findings as a BCF-XML zip (2.1 by default, or 3.0) with bcf-client.

One topic per finding, GUID ``topic_guid(finding.id)``, with one viewpoint that frames
and selects the finding's elements (IfcGuid) and a plan snapshot. With ``previous``
(the topics of the last run's file), the previous zip is loaded, updated in place —
statuses and appended comments — and saved to the new path, so every topic, comment,
viewpoint, snapshot and document the design team added is kept.

Layout written (2.1)::

    bcf.version  project.bcfp
    <topic guid>/markup.bcf  <topic guid>/viewpoint.bcfv  <topic guid>/snapshot.png

3.0 adds ``extensions.xml`` declaring the topic types, statuses, priorities and labels
used. Camera coordinates are world metres. The zip's entry dates are the run date, so
the same inputs and ``now`` give the same bytes.
"""

from __future__ import annotations

import datetime as dt
import io
import logging
import uuid
import zipfile
from collections.abc import Mapping, Sequence
from pathlib import Path

import bcf.bcfxml
import bcf.v3.model as m3
from bcf.v2.bcfxml import BcfXml as BcfXml2
from bcf.v3.bcfxml import BcfXml as BcfXml3

from checks.errors import BcfError, OutputError
from checks.findings import Finding
from checks.report._bcf_objects import (
    add_comment,
    header_for,
    new_topic_handler,
    xml_date,
)
from checks.report.bcf_topics import (
    Topic,
    Topics,
    as_utc,
    topic_from_finding,
    topics_from_findings,
)
from checks.roundtrip import MergePlan, apply_plan, merge_topics
from checks.safe_zip import parse_xml, read_zip_members
from ifc_bridge.model import BuildingModel

__all__ = ["BCF_VERSIONS", "write_bcf"]

logger = logging.getLogger(__name__)

BCF_VERSIONS = ("2.1", "3.0")
_PROJECT_NAMESPACE = uuid.UUID("0d7b8c4e-3f21-4a8e-9b6d-2c5a1e9f7d30")  # never change
_XML_SUFFIXES = (".bcf", ".bcfv", ".bcfp", ".version", ".xml")


def _new_bcfxml(
    version: str, *, project_name: str, project_key: str
) -> BcfXml2 | BcfXml3:
    """An empty BCF with a project id derived from the project (not random)."""
    bcfxml = (
        BcfXml3.create_new(project_name)
        if version == "3.0"
        else BcfXml2.create_new(project_name)
    )
    project_id = str(
        uuid.uuid5(_PROJECT_NAMESPACE, project_key or project_name or "shearline")
    )
    bcfxml.project_info.project.project_id = project_id
    return bcfxml


def _declare_extensions(bcfxml: BcfXml3, topics: Sequence[Topic]) -> None:
    """Add the types, statuses, priorities and labels used to extensions.xml (3.0)."""
    try:
        ext = bcfxml.extensions
    except KeyError:  # bcf-client bug 7: the 3.0 zip had no extensions.xml
        ext = None
    ext = ext or m3.Extensions()
    wanted = {
        "topic_types": (
            "ExtensionsTopicTypes",
            "topic_type",
            ["Error", "Warning", "Info"],
        ),
        "topic_statuses": (
            "ExtensionsTopicStatuses",
            "topic_status",
            ["Open", "Closed", "ReOpened"],
        ),
        "priorities": ("ExtensionsPriorities", "priority", ["High", "Normal", "Low"]),
        "topic_labels": ("ExtensionsTopicLabels", "topic_label", []),
    }
    for t in topics:
        wanted["topic_types"][2].append(t.type)
        wanted["topic_statuses"][2].append(t.status)
        if t.priority:
            wanted["priorities"][2].append(t.priority)
        wanted["topic_labels"][2].extend(t.labels)
    for attr, (cls_name, item, values) in wanted.items():
        holder = getattr(ext, attr)
        if holder is None:
            holder = getattr(m3, cls_name)()
            setattr(ext, attr, holder)
        current = getattr(holder, item)
        for v in dict.fromkeys(values):
            if v and v not in current:
                current.append(v)
    bcfxml.extensions = ext


def _finalise_zip(path: Path, *, date: dt.datetime, keep: dict[str, bytes]) -> None:
    """Rewrite the saved zip with fixed entry dates; add back members it dropped.

    ``keep`` holds the previous file's members: any that bcf-client did not write
    (files in topic folders that no markup references) are copied unchanged.
    """
    stamp = as_utc(date).timetuple()[:6]
    with zipfile.ZipFile(path) as z:
        entries = [(i.filename, z.read(i)) for i in z.infolist()]
    written = {name for name, _ in entries}
    entries += [
        (n, d)
        for n, d in keep.items()
        if n not in written and n.rstrip("/") + "/" not in written
    ]
    out = io.BytesIO()
    with zipfile.ZipFile(out, "w", zipfile.ZIP_DEFLATED) as z:
        for name, data in entries:
            info = zipfile.ZipInfo(name, date_time=max(stamp, (1980, 1, 1, 0, 0, 0)))
            info.compress_type = zipfile.ZIP_DEFLATED
            info.external_attr = (
                (0o40755 << 16) | 0x10 if name.endswith("/") else 0o644 << 16
            )
            z.writestr(info, data)
    path.write_bytes(out.getvalue())


def _save(
    bcfxml: BcfXml2 | BcfXml3, path: Path, *, date: dt.datetime, keep: dict[str, bytes]
) -> None:
    try:
        path.parent.mkdir(parents=True, exist_ok=True)
        bcfxml.save(path)
        _finalise_zip(path, date=date, keep=keep)
    except OSError as exc:
        msg = (
            f"{path}: cannot write the BCF file ({exc}); "
            "check the folder exists and is writable"
        )
        raise OutputError(msg) from exc


def _aligned_members(source: str) -> dict[str, bytes]:
    """The previous zip's members, vetted, with each topic folder named by its GUID.

    Folders whose name differs from their Topic Guid are renamed, else bcf-client
    would write the markup and the viewpoints to different folders (its bug 5).
    """
    members = read_zip_members(source)
    for name, data in members.items():
        if name.lower().endswith(_XML_SUFFIXES):
            parse_xml(data, source=f"{source}: {name}")
    renames: dict[str, str] = {}
    for name, data in members.items():
        parts = name.split("/")
        if len(parts) == 2 and parts[1] == "markup.bcf":
            topic = parse_xml(data, source=f"{source}: {name}").find(".//Topic")
            guid = topic.get("Guid", "") if topic is not None else ""
            if guid and guid != parts[0]:
                if guid in renames.values() or f"{guid}/markup.bcf" in members:
                    msg = (
                        f"{source}: two topic folders claim topic {guid}; fix the file"
                    )
                    raise BcfError(msg)
                logger.warning(
                    "%s: folder %s holds topic %s; renamed", source, parts[0], guid
                )
                renames[parts[0]] = guid
    out: dict[str, bytes] = {}
    for name, data in members.items():
        head, sep, tail = name.partition("/")
        out[f"{renames.get(head, head)}{sep}{tail}"] = data
    return out


def _load_previous(members: dict[str, bytes], source: str) -> BcfXml2 | BcfXml3:
    buffer = io.BytesIO()
    with zipfile.ZipFile(buffer, "w", zipfile.ZIP_DEFLATED) as z:
        for name, data in members.items():
            z.writestr(name, data)
    buffer.seek(0)
    try:
        loaded = bcf.bcfxml.load(buffer)
    except Exception as exc:  # bcf-client raises bare exceptions on bad files
        msg = f"{source}: bcf-client cannot load the previous BCF ({exc})"
        raise BcfError(msg) from exc
    if loaded is None:
        msg = f"{source}: bcf-client cannot load the previous BCF"
        raise BcfError(msg)
    return loaded


def _apply_in_place(
    bcfxml: BcfXml2 | BcfXml3, plan: MergePlan, version: str, source: str
) -> None:
    """Set statuses and append comments on the loaded previous topics."""
    handlers = {h.guid: h for h in bcfxml.topics.values()}
    for change in plan.changes:
        handler = handlers.get(change.topic_guid)
        if handler is None:
            msg = (
                f"{source}: topic {change.topic_guid} was read "
                "but bcf-client cannot find it"
            )
            raise BcfError(msg)
        if change.new_status is not None:
            handler.topic.topic_status = change.new_status
            handler.topic.modified_date = xml_date(plan.now)
            handler.topic.modified_author = plan.author
        add_comment(handler, change.comment, version)


def _write_merged_zip(
    previous: Topics,
    plan: MergePlan,
    path: Path,
    *,
    model: BuildingModel,
    version: str,
    ifc_filename: str,
) -> None:
    members = _aligned_members(previous.source)
    bcfxml = _load_previous(members, previous.source)
    old_version = "3.0" if bcfxml.version.version_id == "3.0" else "2.1"
    if old_version != version:
        logger.warning(
            "%s is BCF %s; the update keeps %s (asked for %s) so nothing is lost",
            previous.source,
            old_version,
            old_version,
            version,
        )
    _apply_in_place(bcfxml, plan, old_version, previous.source)
    new_topics = [
        topic_from_finding(f, model=model, author=plan.author, now=plan.now)
        for f in plan.added
    ]
    _add_topics(
        bcfxml,
        new_topics,
        old_version,
        model=model,
        ifc_filename=ifc_filename,
        date=plan.now,
    )
    if old_version == "3.0":
        _declare_extensions(bcfxml, [*previous.topics, *new_topics])
    _save(bcfxml, path, date=plan.now, keep=members)


def _add_topics(
    bcfxml: BcfXml2 | BcfXml3,
    topics: Sequence[Topic],
    version: str,
    *,
    model: BuildingModel,
    ifc_filename: str,
    date: dt.datetime,
) -> None:
    for t in topics:
        header = None
        if t.finding is not None:
            header = header_for(
                version,
                ifc_filename=ifc_filename,
                ifc_project=model.project_guid,
                date=date,
            )
        bcfxml.topics[t.guid] = new_topic_handler(t, version, header=header)


def write_bcf(
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
) -> None:
    """Write the findings as a BCF-XML zip, updating the previous run's topics if given.

    BCF-XML 2.1 / 3.0 (buildingSMART). Common practice: one topic per finding,
    pinned to the elements by IfcGuid, with a viewpoint and a snapshot.

    Args:
        findings: The findings of this run.
        path: The ``.bcf`` file to write.
        model: The model checked (GlobalIds, geometry for cameras and snapshots).
        author: Author of topics and comments (from the config).
        version: ``"2.1"`` or ``"3.0"``; an update keeps the previous file's version.
        project_name: BCF project name; the IFC project name when ``""``.
        ifc_filename: Name of the IFC file checked, for the topics' header.
        previous: Topics read from the previous run's BCF (or JSON), or None.
        current: GlobalId -> the revised model's numbers, quoted in close comments.
        now: Date of the run; taken as UTC if naive, the clock if None.
        fresh: The topics ``topics_from_findings(findings, ...)`` gives for these
            arguments, when the caller has them already; used without ``previous``.

    Raises:
        BcfError: Unknown version, or the previous file cannot be read safely.
        OutputError: The file cannot be written.
    """
    if version not in BCF_VERSIONS:
        msg = (
            f"BCF version {version!r} is not supported; "
            f"use one of {', '.join(BCF_VERSIONS)}"
        )
        raise BcfError(msg)
    path = Path(path)
    now = as_utc(now)
    name = project_name or model.project_name
    if previous is not None:
        plan = merge_topics(
            previous,
            findings,
            author=author,
            now=now,
            ifc_filename=ifc_filename,
            current=current,
        )
        if previous.source_kind == "bcf":
            _write_merged_zip(
                previous,
                plan,
                path,
                model=model,
                version=version,
                ifc_filename=ifc_filename,
            )
            return
        topics = apply_plan(previous, plan, model=model).topics
    elif fresh is not None:
        topics = fresh.topics
    else:
        topics = topics_from_findings(
            findings, model=model, author=author, now=now
        ).topics
    bcfxml = _new_bcfxml(
        version, project_name=name, project_key=model.project_guid or name
    )
    _add_topics(
        bcfxml, topics, version, model=model, ifc_filename=ifc_filename, date=now
    )
    if version == "3.0":
        _declare_extensions(bcfxml, topics)
    _save(bcfxml, path, date=now, keep={})
    logger.info("%s: %d BCF %s topics written", path, len(topics), version)
