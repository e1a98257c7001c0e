"""The terminal summary of a check: forces per level, worst ratio per level and direction,
findings by severity. Values in display units; built as rich renderables.

Strings from the model go in as ``rich.text.Text``, so square brackets in a wall or level
name are shown as typed, never read as console markup.
"""

from __future__ import annotations

from collections import Counter

from rich.console import Group
from rich.table import Table
from rich.text import Text

from checks.findings import Severity
from checks.project import DisplayUnits
from checks.units import format_value

__all__ = ["render_summary", "worst_ratios"]


def worst_ratios(run) -> dict[tuple[str, str], tuple[float, str]]:
    """Largest demand/capacity ratio per (level, direction), with the wall GlobalId.

    Args:
        run: A :class:`checks.pipeline.CheckRun`.

    Returns:
        ``{(level, "X"): (dcr, guid)}`` for piers with a ratio.
    """
    checks = getattr(run.checks, "pier_checks", {})
    worst: dict[tuple[str, str], tuple[float, str]] = {}
    for p in run.allocation.piers:
        c = checks.get(p.id)
        dcr = getattr(c, "dcr", None)
        if dcr is None or p.direction is None:
            continue
        key = (p.level, p.direction.value)
        if key not in worst or dcr > worst[key][0]:
            worst[key] = (dcr, p.guid)
    return worst


def render_summary(run, *, units: str, verbose: bool = False) -> Group:
    """Summary tables of one check run.

    Args:
        run: A :class:`checks.pipeline.CheckRun`.
        units: ``"imperial"`` or ``"si"``.
        verbose: Also list every finding.

    Returns:
        A rich renderable.
    """
    system = DisplayUnits(units)
    s = run.allocation.seismic
    head = Text(
        f"{run.config.name}: {s.procedure.upper()} V = {format_value(s.V, 'force', system)}"
        f" (Cs = {s.Cs:.4f}, {s.Cs_governs}; T = {s.T:.3f} s; "
        f"W = {format_value(s.W, 'force', system)})"
    )
    levels = Table(title="Levels")
    for col in (
        "level",
        "wx",
        "Fx",
        "Vx",
        "Fpx",
        "worst DCR X (wall)",
        "worst DCR Y (wall)",
    ):
        levels.add_column(col, justify="left" if col == "level" else "right")
    worst = worst_ratios(run)
    names = {p.guid: p.name for p in run.allocation.piers}
    for lv in reversed(run.allocation.levels):
        cells = []
        for d in ("X", "Y"):
            w = worst.get((lv.level, d))
            cells.append(Text(f"{w[0]:.2f} {names.get(w[1]) or w[1]}" if w else "-"))
        levels.add_row(
            Text(lv.level),
            format_value(lv.seismic_weight, "force", system),
            format_value(lv.story_force, "force", system),
            format_value(lv.story_shear, "force", system),
            format_value(lv.diaphragm_force, "force", system),
            *cells,
        )
    counts = Counter(f.severity for f in run.findings)
    sev = Table(title="Findings")
    sev.add_column("severity")
    sev.add_column("count", justify="right")
    for level in (Severity.ERROR, Severity.WARNING, Severity.INFO):
        sev.add_row(level.value, str(counts.get(level, 0)))
    parts = [head, levels, sev]
    shown = [f for f in run.findings if verbose or f.severity is Severity.ERROR]
    if shown:
        detail = Table(title="All findings" if verbose else "Errors")
        for col in ("severity", "level", "rule", "title", "GlobalIds"):
            detail.add_column(col)
        for f in shown:
            guids = ", ".join(f.guids[:3]) + (" …" if len(f.guids) > 3 else "")
            detail.add_row(f.severity.value, Text(f.level), f.rule, Text(f.title), guids)
        parts.append(detail)
    return Group(*parts)
