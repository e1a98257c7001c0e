"""Re-check a revised model against the BCF topics of the previous run.

Topics are matched to findings by GUID: a finding's topic GUID is
``topic_guid(finding.id)``, and the id depends only on the rule, the GlobalIds and a
stable discriminator, so it survives a model revision. For each topic this tool wrote:

* its finding no longer holds -> status ``Closed`` and a comment saying so;
* it still holds -> it stays open, with a comment giving the new numbers; a topic the
  design team had closed is set ``ReOpened`` and the comment says why.

Findings with no topic become new topics. Topics, comments and viewpoints written by
anyone else are left exactly as they are.
"""

from __future__ import annotations

import datetime as dt
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, replace
from enum import StrEnum

from checks.findings import Finding, topic_guid
from checks.report.bcf_topics import (
    Comment,
    Topic,
    Topics,
    as_utc,
    derived_guid,
    finding_data,
    numbers_text,
    topic_from_finding,
)
from ifc_bridge.model import BuildingModel

__all__ = ["Action", "MergePlan", "TopicChange", "apply_plan", "merge_topics"]

CLOSED_STATUSES = frozenset(
    {"closed", "resolved", "done"}
)  # common practice; case-insensitive
TOOL = "shearline"


class Action(StrEnum):
    """What a re-check does to one previous topic."""

    CLOSE = "close"
    KEEP_OPEN = "keep_open"
    REOPEN = "reopen"


@dataclass(frozen=True, slots=True, kw_only=True)
class TopicChange:
    """The change to one previous topic.

    Attributes:
        topic_guid: GUID of the topic changed.
        action: Close, keep open or re-open.
        new_status: TopicStatus to set, or None to leave it.
        comment: The comment to append.
        finding: The current finding (None when it no longer holds).
    """

    topic_guid: str
    action: Action
    new_status: str | None
    comment: Comment
    finding: Finding | None = None


@dataclass(frozen=True, slots=True, kw_only=True)
class MergePlan:
    """What a re-check changes in the previous topics.

    Attributes:
        changes: Changes to previous topics of this tool, in previous-file order.
        added: Findings with no previous topic, in findings order.
        untouched: GUIDs of previous topics left unchanged (other authors' topics, and
            closed topics whose finding is still gone).
        author: Author of the comments and status changes.
        now: Date of the re-check (UTC).
    """

    changes: tuple[TopicChange, ...] = ()
    added: tuple[Finding, ...] = ()
    untouched: tuple[str, ...] = ()
    author: str = ""
    now: dt.datetime

    def of_action(self, action: Action) -> tuple[TopicChange, ...]:
        """The changes with one action."""
        return tuple(c for c in self.changes if c.action is action)


def is_closed(status: str) -> bool:
    """True for a status that means the team considers the topic done."""
    return status.strip().lower() in CLOSED_STATUSES


def _comment(topic: Topic, text: str, *, author: str, now: dt.datetime) -> Comment:
    guid = derived_guid(topic.guid, f"recheck/{now.isoformat()}")
    return Comment(guid=guid, date=now, author=author, text=text)


def _now_text(topic: Topic, current: Mapping[str, str]) -> str:
    """The revised model's numbers for the elements a topic selects, or ``""``."""
    guids = sorted({g for v in topic.viewpoints for g in v.selected})
    states = [current[g] for g in guids if g in current]
    return (" Now: " + "; ".join(states) + ".") if states else ""


def _change_for(
    topic: Topic,
    finding: Finding | None,
    *,
    author: str,
    now: dt.datetime,
    where: str,
    current: Mapping[str, str],
) -> TopicChange | None:
    """The change for one of our previous topics, or None to leave it alone."""
    closed = is_closed(topic.status)
    if finding is None:
        if closed:
            return None
        text = (
            f"Re-check on {where}: no longer found; closed by {TOOL}."
            + _now_text(topic, current)
        )
        return TopicChange(
            topic_guid=topic.guid,
            action=Action.CLOSE,
            new_status="Closed",
            comment=_comment(topic, text, author=author, now=now),
        )
    numbers = numbers_text(finding)
    if closed:
        text = (
            f"Re-check on {where}: still found although the topic is {topic.status}; "
            f"re-opened by {TOOL}. {numbers}"
        )
        action, status = Action.REOPEN, "ReOpened"
    else:
        text = f"Re-check on {where}: still found. {numbers}"
        action, status = Action.KEEP_OPEN, None
    return TopicChange(
        topic_guid=topic.guid,
        action=action,
        new_status=status,
        comment=_comment(topic, text, author=author, now=now),
        finding=finding,
    )


def merge_topics(
    previous: Topics,
    findings: Sequence[Finding],
    *,
    author: str,
    now: dt.datetime | None,
    ifc_filename: str = "",
    current: Mapping[str, str] | None = None,
) -> MergePlan:
    """Plan the update of the previous run's topics for the current findings.

    Common practice: an issue is closed by whoever can verify the fix; the re-check
    closes what it no longer finds and says so in a comment, and never deletes.

    Args:
        previous: Topics of the previous BCF (or JSON) file.
        findings: Findings of the re-check.
        author: Author of the comments (from the config).
        now: Date of the re-check; taken as UTC if naive, the clock if None.
        ifc_filename: Name of the revised IFC file, quoted in the comments.
        current: GlobalId -> the revised model's numbers for that element (e.g.
            ``"wall 'L2-C1' DCR 0.45"``), quoted when a topic is closed.

    Returns:
        The plan.
    """
    now = as_utc(now)
    where = ifc_filename or "the revised model"
    by_guid: dict[str, Finding] = {}
    for f in findings:
        by_guid.setdefault(topic_guid(f.id), f)
    changes: list[TopicChange] = []
    untouched: list[str] = []
    matched: set[str] = set()
    for topic in previous.topics:
        finding = by_guid.get(topic.guid)
        if finding is not None:
            matched.add(topic.guid)
        if not topic.is_ours and finding is None:
            untouched.append(topic.guid)
            continue
        change = _change_for(
            topic, finding, author=author, now=now, where=where, current=current or {}
        )
        if change is None:
            untouched.append(topic.guid)
        else:
            changes.append(change)
    added = tuple(f for g, f in by_guid.items() if g not in matched)
    return MergePlan(
        changes=tuple(changes),
        added=added,
        untouched=tuple(untouched),
        author=author,
        now=now,
    )


def apply_plan(previous: Topics, plan: MergePlan, *, model: BuildingModel) -> Topics:
    """The previous topics with the plan applied, plus the new topics (in memory).

    Common practice: statuses change and comments are appended; nothing the design
    team wrote is edited or removed.

    Args:
        previous: Topics of the previous file.
        plan: The plan from :func:`merge_topics`.
        model: The revised model, for the new topics' viewpoints.

    Returns:
        The merged topics (previous order, then new topics).
    """
    changes = {c.topic_guid: c for c in plan.changes}
    merged: list[Topic] = []
    for topic in previous.topics:
        change = changes.get(topic.guid)
        if change is None:
            merged.append(topic)
            continue
        updates: dict[str, object] = {"comments": (*topic.comments, change.comment)}
        if change.new_status is not None:
            updates |= {
                "status": change.new_status,
                "modified_date": plan.now,
                "modified_author": plan.author,
            }
        if change.finding is not None:
            updates["finding"] = finding_data(change.finding)
        merged.append(replace(topic, **updates))
    for f in plan.added:
        merged.append(
            topic_from_finding(f, model=model, author=plan.author, now=plan.now)
        )
    return replace(previous, topics=tuple(merged))
