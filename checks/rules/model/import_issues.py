"""Problems found while reading the IFC file, as findings on the elements concerned.

Not a code provision: the clause is empty. Severity maps one to one from
``IssueSeverity`` (error → error, warning → warning, info → info).
"""

from __future__ import annotations

from allocation.results import Allocation
from checks.findings import Finding, Severity
from ifc_bridge.model import BuildingModel, ImportIssue

__all__ = ["check_import_issues"]

RULE = "import_issues"


def _finding(issue: ImportIssue) -> Finding:
    disc = f"{issue.code}|{issue.storey}"
    if not issue.guids:
        disc += f"|{issue.message}"  # file-level issue: its text is what identifies it
    return Finding(
        rule=RULE,
        clause="",
        severity=Severity(issue.severity.value),
        level=issue.storey,
        direction=None,
        guids=tuple(issue.guids),
        title=f"Model data: {issue.code.replace('_', ' ')}",
        description=issue.message,
        discriminator=disc,
    )


def check_import_issues(
    model: BuildingModel, allocation: Allocation | None = None
) -> list[Finding]:
    """One finding per distinct import issue of the model.

    Common practice: data problems are reported on the GlobalIds they concern so the
    architect sees them in their own tool.

    Args:
        model: The model with its ``issues``.
        allocation: Unused; accepted so every rule has the same shape.

    Returns:
        Findings in issue order; issues that map to the same id are merged.
    """
    out: dict[str, Finding] = {}
    for issue in model.issues:
        f = _finding(issue)
        if f.id in out:
            prev = out[f.id]
            worse = min(prev.severity, f.severity, key=list(Severity).index)
            text = (
                prev.description
                if issue.message in prev.description
                else (f"{prev.description}; {issue.message}")
            )
            f = Finding(
                rule=RULE,
                clause="",
                severity=worse,
                level=prev.level,
                direction=None,
                guids=prev.guids,
                title=prev.title,
                description=text,
                discriminator=prev.discriminator,
            )
        out[f.id] = f
    return list(out.values())
