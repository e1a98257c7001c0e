"""Library-independent BCF topics: what the writers write and the readers return.

Plain frozen records in the vocabulary of BCF (topic, comment, viewpoint), so the
round trip does not depend on one BCF library's classes. Cameras are in world
coordinates, metres (BCF-API 3.0 README §1.3). Dates are timezone-aware UTC.

A finding becomes a topic whose GUID is ``topic_guid(finding.id)``, so a re-check of a
revised model finds its own topics again.
"""

from __future__ import annotations

import datetime as dt
import logging
import uuid
from collections.abc import Sequence
from dataclasses import dataclass

from checks.findings import Finding, Severity, topic_guid
from checks.report._camera import Camera, element_box, frame_box
from checks.report.snapshot import plan_snapshot_png
from ifc_bridge.model import BuildingModel

__all__ = [
    "PRIORITY",
    "TOOL_LABEL",
    "TOPIC_TYPE",
    "Camera",
    "Comment",
    "FindingData",
    "Topic",
    "Topics",
    "Viewpoint",
    "as_utc",
    "finding_data",
    "topic_from_finding",
]

TOOL_LABEL = "shearline"  # first label of every topic this tool writes
PRIORITY = {Severity.ERROR: "High", Severity.WARNING: "Normal", Severity.INFO: "Low"}
TOPIC_TYPE = {
    Severity.ERROR: "Error",
    Severity.WARNING: "Warning",
    Severity.INFO: "Info",
}
SNAPSHOT_SIZE = (800, 600)  # [px]

logger = logging.getLogger(__name__)


def as_utc(when: dt.datetime | None) -> dt.datetime:
    """A timezone-aware UTC datetime; a naive one is taken as UTC (BCF-XML 3.0 README).

    Args:
        when: A datetime, or None for the current time.

    Returns:
        The same instant in UTC, microseconds dropped.
    """
    if when is None:
        when = dt.datetime.now(dt.UTC)
    if when.tzinfo is None:
        when = when.replace(tzinfo=dt.UTC)
    return when.astimezone(dt.UTC).replace(microsecond=0)


@dataclass(frozen=True, slots=True, kw_only=True)
class Comment:
    """One BCF comment.

    Attributes:
        guid: Comment GUID.
        date: When it was written (UTC).
        author: Who wrote it.
        text: The comment.
        viewpoint_guid: GUID of the viewpoint it refers to, or None.
        modified_date: Last change (UTC), or None.
        modified_author: Who changed it last, or None.
    """

    guid: str
    date: dt.datetime
    author: str
    text: str
    viewpoint_guid: str | None = None
    modified_date: dt.datetime | None = None
    modified_author: str | None = None


@dataclass(frozen=True, slots=True, kw_only=True)
class Viewpoint:
    """One BCF viewpoint.

    Attributes:
        guid: Viewpoint GUID.
        selected: IfcGuids of the selected components.
        camera: The camera, or None when the viewpoint has none.
        snapshot: Snapshot image bytes, or None.
        snapshot_type: ``"png"`` or ``"jpg"``.
        file_name: Member name of the ``.bcfv`` in the zip, or ``""``.
    """

    guid: str
    selected: tuple[str, ...] = ()
    camera: Camera | None = None
    snapshot: bytes | None = None
    snapshot_type: str = "png"
    file_name: str = ""


@dataclass(frozen=True, slots=True, kw_only=True)
class FindingData:
    """The numbers of the finding a topic came from (SI, in ``unit``).

    Attributes:
        finding_id: ``Finding.id``.
        rule: Rule name.
        clause: Clause cited.
        severity: ``"error"``, ``"warning"`` or ``"info"``.
        level: Level name or ``""``.
        direction: ``"X"``, ``"Y"`` or None.
        demand: Demand [unit], or None.
        capacity: Capacity [unit], or None.
        ratio: Demand / capacity [-], or None.
        unit: SI unit of demand and capacity.
        guids: GlobalIds the finding is about.
    """

    finding_id: str
    rule: str
    clause: str
    severity: str
    level: str
    direction: str | None
    demand: float | None
    capacity: float | None
    ratio: float | None
    unit: str
    guids: tuple[str, ...] = ()


@dataclass(frozen=True, slots=True, kw_only=True)
class Topic:
    """One BCF topic with its comments and viewpoints.

    Attributes:
        guid: Topic GUID.
        title: Title.
        status: TopicStatus (``"Open"``, ``"Closed"``, ``"ReOpened"``, ...).
        type: TopicType (``"Error"``, ``"Warning"``, ``"Info"``, ...).
        priority: Priority, or ``""``.
        labels: Labels.
        description: Description, or ``""``.
        creation_date: Creation date (UTC).
        creation_author: Creation author.
        modified_date: Last change (UTC), or None.
        modified_author: Who changed it last, or None.
        assigned_to: Assignee, or None.
        server_assigned_id: BCF 3.0 ServerAssignedId, or ``""``.
        comments: Comments in file order.
        viewpoints: Viewpoints in file order.
        finding: The finding's numbers when this tool wrote the topic, else None.
        folder: Topic folder in the zip (``""`` when not read from a zip).
        raw_markup: The ``markup.bcf`` bytes as read, to keep foreign content.
    """

    guid: str
    title: str
    status: str
    type: str
    priority: str = ""
    labels: tuple[str, ...] = ()
    description: str = ""
    creation_date: dt.datetime
    creation_author: str
    modified_date: dt.datetime | None = None
    modified_author: str | None = None
    assigned_to: str | None = None
    server_assigned_id: str = ""
    comments: tuple[Comment, ...] = ()
    viewpoints: tuple[Viewpoint, ...] = ()
    finding: FindingData | None = None
    folder: str = ""
    raw_markup: bytes = b""

    @property
    def is_ours(self) -> bool:
        """True when this tool wrote the topic (tool label or finding present)."""
        return self.finding is not None or TOOL_LABEL in self.labels


@dataclass(frozen=True, slots=True, kw_only=True)
class Topics:
    """All topics of one BCF file (or of our JSON of it).

    Attributes:
        source: Path read, or ``""`` for topics built in memory.
        source_kind: ``"bcf"`` (a zip), ``"json"`` or ``""``.
        bcf_version: ``"2.1"`` or ``"3.0"``.
        project_name: BCF project name, or ``""``.
        project_id: BCF project id, or ``""``.
        topics: Topics in file order.
    """

    source: str = ""
    source_kind: str = ""
    bcf_version: str = "2.1"
    project_name: str = ""
    project_id: str = ""
    topics: tuple[Topic, ...] = ()

    def get(self, guid: str) -> Topic | None:
        """The topic with that GUID, or None."""
        for t in self.topics:
            if t.guid == guid:
                return t
        return None


def finding_data(finding: Finding) -> FindingData:
    """The numbers of a finding, as a topic carries them."""
    return FindingData(
        finding_id=finding.id,
        rule=finding.rule,
        clause=finding.clause,
        severity=str(finding.severity),
        level=finding.level,
        direction=str(finding.direction) if finding.direction is not None else None,
        demand=None if finding.demand is None else float(finding.demand),
        capacity=None if finding.capacity is None else float(finding.capacity),
        ratio=None if finding.ratio is None else float(finding.ratio),
        unit=finding.unit,
        guids=tuple(finding.guids),
    )


def numbers_text(finding: Finding) -> str:
    """One line with the clause and the numbers of a finding (SI)."""
    parts = [f"Clause: {finding.clause}."]
    if finding.demand is not None:
        parts.append(f"Demand {finding.demand:.4g} {finding.unit}.".replace(" .", "."))
    if finding.capacity is not None:
        parts.append(
            f"Capacity {finding.capacity:.4g} {finding.unit}.".replace(" .", ".")
        )
    if finding.ratio is not None:
        parts.append(f"Ratio {finding.ratio:.3f}.")
    return " ".join(parts)


def labels_of(finding: Finding) -> tuple[str, ...]:
    """Labels of a finding's topic: the tool, the rule, the level and the direction."""
    labels = [TOOL_LABEL, finding.rule]
    if finding.level:
        labels.append(finding.level)
    if finding.direction is not None:
        labels.append(str(finding.direction))
    return tuple(dict.fromkeys(labels))


def derived_guid(base: str, name: str) -> str:
    """A GUID derived from another GUID and a name (uuid5), for deterministic output."""
    return str(uuid.uuid5(uuid.UUID(base), name))


# A viewpoint selects at most this many elements. A finding about thousands of walls
# (a model requirement none of them meets) would otherwise give a viewpoint that is
# slow to write (bcf-client: ~0.3 ms per component) and to open; findings.json and the
# report list every GlobalId. Common practice: keep BCF viewpoints light.
MAX_SELECTED = 500


def viewpoint_for(
    finding: Finding,
    model: BuildingModel,
    *,
    guid: str,
    size: tuple[int, int] = SNAPSHOT_SIZE,
) -> Viewpoint:
    """A viewpoint that frames and selects a finding's elements, with a plan snapshot.

    Common practice: select the elements by IfcGuid, look at them from above at an
    angle, and attach a marked-up plan.

    Args:
        finding: The finding.
        model: The model the finding is about.
        guid: The viewpoint's GUID.
        size: Snapshot size [px].

    Returns:
        The viewpoint.
    """
    box = element_box(
        model, finding.guids, level=finding.level, location=finding.location
    )
    camera = frame_box(box, aspect_ratio=size[0] / size[1])
    level = finding.level if finding.level in {lv.name for lv in model.levels} else ""
    # an info finding is a result, not an issue: its viewpoint needs no marked plan
    png = (
        plan_snapshot_png(model, level=level, highlight=finding.guids, size=size)
        if finding.severity is not Severity.INFO
        else None
    )
    return Viewpoint(
        guid=guid,
        selected=tuple(finding.guids[:MAX_SELECTED]),
        camera=camera,
        snapshot=png,
    )


def topic_from_finding(
    finding: Finding, *, model: BuildingModel, author: str, now: dt.datetime
) -> Topic:
    """A new open topic for a finding, with one viewpoint.

    Common practice: one BCF topic per finding, pinned to the elements by IfcGuid.

    Args:
        finding: The finding.
        model: The model the finding is about.
        author: CreationAuthor (from the config).
        now: Creation date; taken as UTC if naive.

    Returns:
        The topic.
    """
    data = finding_data(finding)
    guid = topic_guid(data.finding_id)  # the id hashes every GlobalId: once will do
    viewpoint = viewpoint_for(finding, model, guid=derived_guid(guid, "viewpoint/1"))
    description = f"{finding.description}\n{numbers_text(finding)}".strip()
    if len(finding.guids) > MAX_SELECTED:
        description += (
            f"\nThe viewpoint selects the first {MAX_SELECTED} of the "
            f"{len(finding.guids)} elements; findings.json and report.html list all."
        )
    return Topic(
        guid=guid,
        title=finding.title,
        status="Open",
        type=TOPIC_TYPE[finding.severity],
        priority=PRIORITY[finding.severity],
        labels=labels_of(finding),
        description=description,
        creation_date=as_utc(now),
        creation_author=author,
        viewpoints=(viewpoint,),
        finding=data,
    )


def topics_from_findings(
    findings: Sequence[Finding],
    *,
    model: BuildingModel,
    author: str,
    now: dt.datetime,
    bcf_version: str = "2.1",
    project_name: str = "",
) -> Topics:
    """Fresh topics for findings (no previous file), in findings order.

    Common practice: one topic per finding; a finding given twice is one topic.

    Args:
        findings: The findings.
        model: The model they are about.
        author: CreationAuthor.
        now: Creation date (UTC if naive).
        bcf_version: ``"2.1"`` or ``"3.0"``, recorded on the result.
        project_name: Project name; the model's when ``""``.

    Returns:
        The topics.
    """
    seen: set[str] = set()
    topics = []
    for f in findings:
        if f.id in seen:
            logger.warning("finding %s given twice; written as one topic", f.id)
            continue
        seen.add(f.id)
        topics.append(topic_from_finding(f, model=model, author=author, now=now))
    return Topics(
        bcf_version=bcf_version,
        project_name=project_name or model.project_name,
        topics=tuple(topics),
    )
