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
from ifc_bridge.model import Direction

__all__ = ["LevelContext", "level_section", "wall_anchor"]

_DIRECTION = {d: d.value for d in Direction}  # the enum's ``.value`` is slow to read


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
        row_ids: Pier id -> HTML id of its table row.
        anchors: (GlobalId, level) -> :func:`wall_anchor` of every pier's wall.
    """

    run: Any
    fm: Formats
    checks: dict
    piers: dict[str, list]
    lines: dict[str, list]
    load_paths: LoadPaths
    row_ids: dict[str, str]
    anchors: dict[tuple[str, str], str]

    @classmethod
    def of(cls, run, fm: Formats) -> LevelContext:
        """Index the run's piers and lines by level; name each row and wall once."""
        alloc = run.allocation
        piers: dict[str, list] = {}
        row_ids: dict[str, str] = {}
        anchors: dict[tuple[str, str], str] = {}
        for p in alloc.piers:
            piers.setdefault(p.level, []).append(p)
            row_ids[p.id] = html_id("pier", p.id)
            if (p.guid, p.level) not in anchors:
                anchors[p.guid, p.level] = wall_anchor(p.guid, p.level)
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
            row_ids=row_ids,
            anchors=anchors,
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
    anchors, row_ids = ctx.anchors, ctx.row_ids
    walls = [
        PlanWall(
            group=anchors[p.guid, p.level],
            row=row_ids[p.id],
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


def _pier_rows(ctx: LevelContext, piers: list, tags: dict[str, str]) -> list[str]:
    """The table rows of the piers of one line, in order along the line.

    Common practice: a pier's row gives its wall (name and GlobalId on the wall's
    first pier), forces per method, unit shear, capacity, ratio and load path.
    Model and config strings are escaped; tags, directions, ids and numbers
    formatted here hold no markup, so they go in as they are.
    """
    fm = ctx.fm
    f, m, fpl, esc = fm.force, fm.length, fm.force_per_length, fm.escape
    envelopes, checks = ctx.run.allocation.envelope, ctx.checks
    cell, anchors, row_ids = ctx.load_paths.cell, ctx.anchors, ctx.row_ids
    rows, prev = [], None
    for p in piers:
        env, c = envelopes.get(p.id), checks.get(p.id)
        if env is None:
            flexible = rigid = envelope = gov = "-"
        else:
            flexible, rigid, envelope = f(env.flexible), f(env.rigid), f(env.envelope)
            gov = esc(f"{env.governing_method.value} {env.governing_case}")
        shear, capacity, dcr = (
            (None, None, None)
            if c is None
            else (
                getattr(c, "unit_shear", None),
                getattr(c, "capacity", None),
                getattr(c, "dcr", None),
            )
        )
        if prev != p.guid:
            name = f"{esc(p.name)}<br><small>{esc(p.guid)}</small>"
            prev = p.guid
        else:
            name = "<small>(same wall)</small>"
        rows.append(
            f'<tr id="{row_ids[p.id]}"><td class="t"><a href="#'
            f'{anchors[p.guid, p.level]}">{tags[p.guid]}</a></td>'
            f"<td class='t'>{name}</td><td>{p.pier}</td>"
            f"<td>{_DIRECTION.get(p.direction, '-')}</td>"
            f"<td class='t'>{esc(p.assembly or '-')}</td><td>{m(p.length)}</td>"
            f"<td>{flexible}</td><td>{rigid}</td><td><b>{envelope}</b></td>"
            f"<td class='g'>{gov}</td>"
            f"<td>{'-' if shear is None else fpl(shear)}</td>"
            f"<td>{'-' if capacity is None else fpl(capacity)}</td>"
            + (
                "<td>-</td>"
                if dcr is None
                else f"<td{' class=over' if dcr >= 1.0 else ''}>{dcr:.2f}</td>"
            )
            + f"<td class='lp'>{cell(p)}</td></tr>"
        )
    return rows


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
        rows += _pier_rows(ctx, piers, tags)
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
