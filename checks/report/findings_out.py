"""``findings.bcf`` and ``findings.json`` of a check run, carrying a previous file forward.

The BCF holds the error and warning findings (what the design team must act on);
``findings.json`` holds every finding, info included.

With ``previous`` (last run's ``findings.bcf`` or ``findings.json``), the design team's
topics, comments, viewpoints and snapshots are kept; topics whose finding is gone are
closed with a comment, still-true ones get a comment with the new numbers, new findings
become new topics (see :mod:`checks.roundtrip`).
"""

from __future__ import annotations

import os
from pathlib import Path

from checks.findings import Severity
from checks.report.bcf_read import read_topics
from checks.report.bcf_write import write_bcf
from checks.report.topics_json import topics_to_json

__all__ = ["current_state", "write_findings"]


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


def write_findings(
    run, out: Path, *, previous: str | os.PathLike | None, version: str
) -> dict[str, Path]:
    """Write ``findings.bcf`` and ``findings.json`` into ``out``.

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
    prev = read_topics(previous) if previous is not None else None
    common = {
        "model": run.model,
        "author": run.config.author,
        "version": version,
        "project_name": run.config.name,
        "ifc_filename": Path(run.model.source).name,
        "previous": prev,
        "current": current_state(run) if prev is not None else None,
    }
    bcf_path, json_path = out / "findings.bcf", out / "findings.json"
    # BCF carries what the design team must act on; info findings (diaphragm demands,
    # hold-down summaries, rho) are results, kept in findings.json and the report
    issues = [f for f in run.findings if f.severity is not Severity.INFO]
    write_bcf(issues, bcf_path, **common)
    topics_to_json(run.findings, json_path, **common)
    return {"bcf": bcf_path, "findings": json_path}
