"""``findings.bcf`` and ``findings.json`` of a check run, carrying a previous file forward.

The BCF holds the error and warning findings (what the design team must act on);
``findings.json`` holds every finding, info included.

With ``previous`` (last run's ``findings.bcf`` or ``findings.json``), the design team's
topics, comments, viewpoints and snapshots are kept; topics whose finding is gone are
closed with a comment, still-true ones get a comment with the new numbers, new findings
become new topics (see :mod:`checks.roundtrip`).
"""

from __future__ import annotations

import datetime as dt
import os
from collections.abc import Sequence
from pathlib import Path

from checks.findings import Finding, Severity
from checks.report.bcf_topics import (
    Topic,
    Topics,
    as_utc,
    topic_from_finding,
    topics_from_findings,
)
from checks.report.bcf_write import write_bcf
from checks.report.topics_json import topics_to_json

__all__ = ["current_state", "fresh_topics", "write_findings"]


def current_state(run) -> dict[str, str]:
    """GlobalId -> this run's governing numbers for each shear wall, in display units.

    Quoted in the comment that closes a topic, so the design team sees the new
    numbers of the wall they changed.
    """
    from checks.report._formats import memo_formatter

    v = memo_formatter("force_per_length", run.config.display_units)
    best: dict[str, tuple[float, str]] = {}
    checks = getattr(run.checks, "pier_checks", {})
    for p in run.allocation.piers:
        c = checks.get(p.id)
        dcr = getattr(c, "dcr", None)
        if dcr is None:
            continue
        text = (
            f"wall {p.name!r} DCR {dcr:.2f} (v = {v(c.unit_shear)} against "
            f"{v(c.capacity)} supporting {p.level!r})"
        )
        if p.guid not in best or dcr > best[p.guid][0]:
            best[p.guid] = (dcr, text)
    return {g: t for g, (_, t) in best.items()}


def fresh_topics(
    run, findings: Sequence[Finding], *, now: dt.datetime, version: str
) -> tuple[Topics, Topics]:
    """New topics of every finding and of the issues, each finding's built once.

    Common practice: one topic per finding (see
    :func:`checks.report.bcf_topics.topics_from_findings`). The issues (error and
    warning findings) get the very topics of findings.json, cameras and plan
    snapshots included, so the BCF costs no second pass over the model.

    Args:
        run: A :class:`checks.pipeline.CheckRun` (model, author, project name).
        findings: Its findings, ``run.findings``.
        now: Creation date of the topics (UTC).
        version: BCF-XML version recorded on the topics.

    Returns:
        ``(every, issues)``: what ``topics_from_findings`` gives for all findings and
        for the error and warning findings alone.
    """
    kw = {"model": run.model, "author": run.config.author, "now": now}
    every = topics_from_findings(
        findings, bcf_version=version, project_name=run.config.name, **kw
    )
    made = {t.finding.finding_id: t for t in every.topics if t.finding is not None}
    # the topic of an id is the one of its first finding (a repeat is dropped)
    first: dict[str, Finding] = {}
    issues: dict[str, Topic] = {}
    for f, fid in zip(findings, [f.id for f in findings], strict=True):
        first.setdefault(fid, f)
        if f.severity is Severity.INFO or fid in issues:
            continue
        issues[fid] = made[fid] if first[fid] is f else topic_from_finding(f, **kw)
    return every, Topics(
        bcf_version=version,
        project_name=every.project_name,
        topics=tuple(issues.values()),
    )


def write_findings(
    run, out: Path, *, previous: str | os.PathLike | None, version: str
) -> dict[str, Path]:
    """Write ``findings.bcf`` and ``findings.json`` into ``out``.

    Both files carry the same run date. Without ``previous`` each finding's topic
    is built once for both (:func:`fresh_topics`).

    Args:
        run: A :class:`checks.pipeline.CheckRun`.
        out: Output folder.
        previous: Previous BCF zip or JSON to update, or None.
        version: BCF version ``"2.1"`` or ``"3.0"`` (an update keeps the previous one's).

    Returns:
        ``{"bcf": path, "findings": path}``.

    Raises:
        BcfError: ``previous`` cannot be read safely.
    """
    prev = None
    if previous is not None:
        from checks.report.bcf_read import read_topics

        prev = read_topics(previous)
    now = as_utc(None)
    common = {
        "model": run.model,
        "author": run.config.author,
        "version": version,
        "project_name": run.config.name,
        "ifc_filename": Path(run.model.source).name,
        "previous": prev,
        "now": now,
        "current": current_state(run) if prev is not None else None,
    }
    findings = run.findings  # sorted afresh on each access
    every = issue_topics = None
    if prev is None:
        every, issue_topics = fresh_topics(run, findings, now=now, version=version)
    bcf_path, json_path = out / "findings.bcf", out / "findings.json"
    # BCF carries what the design team must act on; info findings (diaphragm demands,
    # hold-down summaries, rho) are results, kept in findings.json and the report
    issues = [f for f in findings if f.severity is not Severity.INFO]
    write_bcf(issues, bcf_path, fresh=issue_topics, **common)
    topics_to_json(findings, json_path, fresh=every, **common)
    return {"bcf": bcf_path, "findings": json_path}
