"""One level's section of ``report.html``: plan, caption, table of lines and piers.

The per-run lookups (piers and lines by level, checks, envelopes, formatters) are built
once in a :class:`LevelContext` and shared by every level, so a tall building costs
one pass over its piers, not one per level. Every string from the model is escaped.
"""

from __future__ import annotations

from dataclasses import dataclass
from html import escape
from typing import Any

from checks.report._formats import Formats
from checks.report._html_parts import LoadPaths, html_id
from checks.report.plan_svg import PlanLine, PlanWall, legend_svg, plan_svg
from checks.units import to_display

__all__ = ["LevelContext", "level_section", "wall_anchor"]


def wall_anchor(guid: str, level: str) -> str:
    """HTML id of a wall's mark on the plan of a level (findings link here).

    Args:
        guid: GlobalId of the IfcWall.
        level: Level whose diaphragm the wall supports.

    Returns:
        The id.
    """
    return html_id("wall", guid, level)


@dataclass(frozen=True, slots=True, kw_only=True)
class LevelContext:
    """What every level section of one report reads, indexed once.

    Attributes:
        run: The :class:`checks.pipeline.CheckRun`.
        fm: The report's formatters.
        checks: Pier id -> its check (``unit_shear`` [N/m], ``capacity`` [N/m], ``dcr``).
        piers: Level name -> its piers, in allocation order.
        lines: Level name -> its lines, in allocation order.
        load_paths: Load-path cells of the piers.
    """

    run: Any
    fm: Formats
    checks: dict
    piers: dict[str, list]
    lines: dict[str, list]
    load_paths: LoadPaths

    @classmethod
    def of(cls, run, fm: Formats) -> LevelContext:
        """Index the run's piers and lines by level."""
        alloc = run.allocation
        piers: dict[str, list] = {}
        for p in alloc.piers:
            piers.setdefault(p.level, []).append(p)
        lines: dict[str, list] = {}
        for ln in alloc.lines:
            lines.setdefault(ln.level, []).append(ln)
        return cls(
            run=run,
            fm=fm,
            checks=getattr(run.checks, "pier_checks", {}),
            piers=piers,
            lines=lines,
            load_paths=LoadPaths(alloc.graphs, fm),
        )


def _piers_by_line(ctx: LevelContext, level: str) -> list[tuple[object | None, list]]:
    """Lines of a level with their piers in order along the line; then piers off a line."""
    piers = ctx.piers.get(level, [])
    by_line: dict[str, list] = {}
    for p in piers:
        by_line.setdefault(p.line, []).append(p)
    out = []
    for ln in ctx.lines.get(level, []):
        axis = 0 if ln.direction.value == "X" else 1
        on = list(by_line.get(ln.id, ()))
        first = {}
        for p in on:
            at = min(p.start[axis], p.end[axis])
            first[p.guid] = min(first.get(p.guid, at), at)
        on.sort(key=lambda p: (first[p.guid], p.guid, p.pier))
        out.append((ln, on))
    line_ids = {ln.id for ln, _ in out}
    rest = [p for p in piers if p.line not in line_ids]
    if rest:
        out.append((None, rest))
    return out


def _tags(groups) -> dict[str, str]:
    tags: dict[str, str] = {}
    for _, piers in groups:
        for p in piers:
            tags.setdefault(p.guid, f"W{len(tags) + 1}")
    return tags


def _plan(ctx: LevelContext, level, groups, tags) -> str:
    alloc, checks, run = ctx.run.allocation, ctx.checks, ctx.run
    walls = [
        PlanWall(
            group=wall_anchor(p.guid, p.level),
            row=html_id("pier", p.id),
            guid=p.guid,
            label=p.name,
            tag=tags[p.guid],
            start=p.start,
            end=p.end,
            dcr=getattr(checks.get(p.id), "dcr", None),
        )
        for _, piers in groups
        for p in piers
    ]
    lines = [
        PlanLine(
            id=ln.id,
            direction=ln.direction.value,
            offset=ln.offset,
            force_label=ctx.fm.force(
                alloc.line_envelope.get(ln.id, {}).get("envelope", 0.0)
            ),
        )
        for ln, _ in groups
        if ln is not None
    ]
    per_unit, label = to_display(1.0, "length", ctx.fm.system)
    cm, cr = _centres(run, level)
    return plan_svg(
        level=level.level,
        diaphragms=[
            (html_id("diaphragm", d.id), d.polygon)
            for d in run.model.diaphragms_of(level.level)
        ],
        walls=walls,
        lines=lines,
        centre_of_mass=cm,
        centre_of_rigidity=cr,
        scale_unit=(label, 1.0 / per_unit),
    )


def _centres(run, level):
    rigid = [r for r in run.allocation.rigid if r.level == level.level]
    if rigid:
        return rigid[0].center_of_mass, rigid[0].center_of_rigidity
    return level.mass_centroid, None


def _caption(run, level, fm: Formats) -> str:
    cm, cr = _centres(run, level)
    m = fm.length
    text = f"CM ({m(cm[0])}, {m(cm[1])}): centre of mass of the levels at and above."
    if cr is not None:
        text += (
            f" CR ({m(cr[0])}, {m(cr[1])}): centre of rigidity of the walls below;"
            f" CR − CM = ({m(cr[0] - cm[0])}, {m(cr[1] - cm[1])})."
        )
    return (
        f"<p><small>{text} Arrows show the positive sense of each line's force; the "
        "value is the envelope over both senses, ±accidental eccentricity and both "
        "idealisations. Tags W1, W2, ... key the walls to the table; a ratio is "
        "printed beside walls at or over capacity. Click a wall for its row.</small></p>"
    )


def _line_row(ln, alloc, fm: Formats) -> str:
    f, m = fm.force, fm.length
    if ln is None:
        return '<tr class="line"><td class="t" colspan="14">Not on a line of resistance</td></tr>'
    fo = alloc.line_envelope.get(ln.id, {})
    where = "y" if ln.direction.value == "X" else "x"
    return (
        f'<tr class="line" id="{html_id("line", ln.id)}"><td class="t" colspan="5">'
        f"Line {escape(ln.id)} ({escape(ln.direction.value)}), {where} = {m(ln.offset)};"
        f" collector {m(ln.collector_length)}</td><td>{m(ln.wall_length)}</td>"
        f"<td>{f(fo.get('flexible', 0.0))}</td><td>{f(fo.get('rigid', 0.0))}</td>"
        f"<td>{f(fo.get('envelope', 0.0))}</td><td colspan='5'></td></tr>"
    )


def _pier_row(p, ctx: LevelContext, tags, *, first: bool) -> str:
    fm = ctx.fm
    f, esc = fm.force, fm.escape
    v = lambda x: "-" if x is None else fm.force_per_length(x)  # noqa: E731
    env, c = ctx.run.allocation.envelope.get(p.id), ctx.checks.get(p.id)
    dcr = getattr(c, "dcr", None)
    gov = f"{env.governing_method.value} {env.governing_case}" if env else "-"
    ratio = "-" if dcr is None else f"{dcr:.2f}"
    name = (
        f"{esc(p.name)}<br><small>{esc(p.guid)}</small>"
        if first
        else "<small>(same wall)</small>"
    )
    return (
        f'<tr id="{html_id("pier", p.id)}"><td class="t"><a href="#{wall_anchor(p.guid, p.level)}">'
        f"{esc(tags[p.guid])}</a></td><td class='t'>{name}</td><td>{p.pier}</td>"
        f"<td>{esc(p.direction.value if p.direction else '-')}</td>"
        f"<td class='t'>{esc(p.assembly or '-')}</td>"
        f"<td>{fm.length(p.length)}</td>"
        f"<td>{f(env.flexible) if env else '-'}</td><td>{f(env.rigid) if env else '-'}</td>"
        f"<td><b>{f(env.envelope) if env else '-'}</b></td><td class='g'>{esc(gov)}</td>"
        f"<td>{v(getattr(c, 'unit_shear', None))}</td><td>{v(getattr(c, 'capacity', None))}</td>"
        f"<td{' class=over' if dcr is not None and dcr >= 1.0 else ''}>{ratio}</td>"
        f"<td class='lp'>{ctx.load_paths.cell(p)}</td></tr>"
    )


def level_section(ctx: LevelContext, level) -> str:
    """The section of one level: forces, plan with its key, caption, table.

    Common practice: one level per printed page, plan above its table.

    Args:
        ctx: The report's shared lookups.
        level: The level's ``LevelForces`` (allocation results).

    Returns:
        HTML text.
    """
    fm, alloc = ctx.fm, ctx.run.allocation
    groups = _piers_by_line(ctx, level.level)
    tags = _tags(groups)
    storeys = sorted({p.storey for _, ps in groups for p in ps})
    below = f" — walls of {escape(', '.join(storeys))}" if storeys else ""
    rows = []
    for ln, piers in groups:
        rows.append(_line_row(ln, alloc, fm))
        rows += [
            _pier_row(p, ctx, tags, first=i == 0 or piers[i - 1].guid != p.guid)
            for i, p in enumerate(piers)
        ]
    table = (
        "<table class='walls'><thead><tr><th class='t'>Tag</th><th class='t'>Wall</th>"
        "<th>Pier</th><th>Dir</th><th class='t'>Assembly</th><th>Length</th>"
        "<th>Flexible</th><th>Rigid</th><th>Envelope</th><th class='t'>Governs</th>"
        "<th>v = V/L</th><th>Capacity</th><th>DCR</th>"
        "<th class='t'>Load path (flexible)</th></tr></thead><tbody>"
        + "".join(rows)
        + "</tbody></table>"
    )
    return (
        f'<section class="level" id="{html_id("level", level.level)}">'
        f"<h2>{escape(level.level)}: diaphragm{below}</h2>"
        f"<p>Fx = {fm.force(level.story_force)}, "
        f"Vx = {fm.force(level.story_shear)}, "
        f"Fpx = {fm.force(level.diaphragm_force)}</p>"
        f"{_plan(ctx, level, groups, tags)}{legend_svg()}"
        f"{_caption(ctx.run, level, fm)}{table}</section>"
    )
