"""``report.html``: one self-contained page (no network) for the engineer and the reviewer.

Sections: seismic summary, one section per level from the roof down (plan SVG with its
key, a table of lines and wall piers with their forces per method, unit shear, ratio and
load path), findings linked to their walls on the plans, assumptions and the caution.
Print CSS starts each level on a new page. A Content-Security-Policy forbids every
script and every external resource, and every string from the model or config is
escaped.
"""

from __future__ import annotations

from html import escape
from pathlib import Path

from checks.findings import Severity
from checks.project import DisplayUnits
from checks.report._html_parts import html_id, load_path_cell, seismic_section
from checks.report.plan_svg import PlanLine, PlanWall, legend_svg, plan_svg
from checks.report.results_json import CAUTION
from checks.units import format_value, to_display

__all__ = ["render_report", "wall_anchor", "write_report"]

_CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:"
_CSS = """
*{-webkit-print-color-adjust:exact;print-color-adjust:exact}
body{font-family:system-ui,-apple-system,"Segoe UI",Helvetica,Arial,sans-serif;margin:2em auto;
 padding:0 1.5em;color:#1d1d1d;max-width:1180px;line-height:1.35}
h1{font-size:1.55em;margin-bottom:.2em} h2{border-bottom:2px solid #333;padding-bottom:.15em;margin-top:1.8em}
nav a{margin-right:1em} .meta{color:#333} small{color:#444}
table{border-collapse:collapse;margin:.6em 0;font-size:.84em} th,td{border:1px solid #bbb;padding:.22em .45em;
 text-align:right;vertical-align:top} th{background:#ececec} td.t,th.t{text-align:left} td{white-space:nowrap} td.t,td.lp{white-space:normal}
thead{display:table-header-group} tr{break-inside:avoid}
tr.line td{background:#f3f3f3;font-weight:600} tr:target td{background:#fff3b0}
td.over{font-weight:700} td.over::after{content:" \\25B2"}
.params td{text-align:left} .cols{display:flex;gap:2em;flex-wrap:wrap;align-items:flex-start}
.caution{border:2px solid #000;padding:.6em 1em;background:#fafafa;font-weight:600}
.sev{display:inline-block;min-width:5.5em;font-weight:700}
.sev-error::before{content:"\\2716  "} .sev-warning::before{content:"\\25B2  "} .sev-info::before{content:"\\25CF  "}
ol.findings li{margin:.45em 0}
svg.plan{display:block;width:100%;max-width:900px;height:auto;border:1px solid #999;background:#fff}
svg.legend{display:block;width:100%;max-width:760px;height:auto;margin:.3em 0}
svg text{font-family:inherit;font-size:12px;fill:#111} svg .lid{font-weight:700}
svg .diaphragm{fill:#f4f4f1;stroke:#555;stroke-width:1.2} svg .opening{stroke:#777;stroke-width:.8;fill:none}
svg .axis{stroke:#777;stroke-width:.8;stroke-dasharray:10 3 2 3} svg .leader{stroke:#777;stroke-width:.8;fill:none}
svg .arrow{stroke:#111;stroke-width:1.8;fill:none}
svg .casing{stroke:#111;stroke-width:9.5;stroke-linecap:butt} svg .under{stroke:#fff;stroke-width:6.5}
svg .band{stroke-width:6.5;stroke-linecap:butt}
svg .tag circle{fill:#fff;stroke:#111;stroke-width:1} svg .tag text{font-size:9px;font-weight:700}
svg .tag text.over{font-size:11px}
svg g.wall:target .casing{stroke-width:16} svg g.wall:target .tag circle{fill:#fff3b0;stroke-width:2.5}
svg .cm circle{fill:#fff;stroke:#000;stroke-width:1.5} svg .cm path{fill:#000}
svg .cr rect{fill:#fff;stroke:#000;stroke-width:1.5} svg .cr path{stroke:#000;stroke-width:1.2}
svg .scale line{stroke:#000;stroke-width:3} svg .cm text,svg .cr text{font-weight:700}
details{margin:0} summary{cursor:pointer} details ul{margin:.2em 0;padding-left:1.2em;text-align:left}
td.lp{font-size:.92em;text-align:left;max-width:22em} td.g{text-align:left}
@page{size:letter;margin:12mm}
@media print{body{margin:0;padding:0;max-width:none;font-size:10pt} nav{display:none}
 section.level{break-before:page} section.level>h2{margin-top:0} #findings{break-before:page}
 a{color:inherit;text-decoration:none} table{font-size:7pt} table.walls{width:100%}
 td,th{padding:.15em .3em} td.lp{max-width:14em} svg.plan,svg.legend{break-inside:avoid;max-width:100%}}
"""
_DEFS = (
    '<svg width="0" height="0" style="position:absolute" aria-hidden="true"><defs>'
    '<marker id="arrowhead" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" '
    'markerHeight="7" orient="auto-start-reverse"><path d="M0,0 L10,5 L0,10 z"/></marker>'
    "</defs></svg>"
)
_ORDER = {Severity.ERROR: 0, Severity.WARNING: 1, Severity.INFO: 2}


def wall_anchor(guid: str, level: str) -> str:
    """HTML id of a wall's mark on the plan of a level (findings link here).

    Args:
        guid: GlobalId of the IfcWall.
        level: Level whose diaphragm the wall supports.

    Returns:
        The id.
    """
    return html_id("wall", guid, level)


def _piers_by_line(alloc, level: str) -> list[tuple[object | None, list]]:
    """Lines of a level with their piers in order along the line; then piers off a line."""
    piers = [p for p in alloc.piers if p.level == level]
    out = []
    for ln in (x for x in alloc.lines if x.level == level):
        axis = 0 if ln.direction.value == "X" else 1
        on = [p for p in piers if p.line == ln.id]
        first = {}
        for p in on:
            at = min(p.start[axis], p.end[axis])
            first[p.guid] = min(first.get(p.guid, at), at)
        on.sort(key=lambda p: (first[p.guid], p.guid, p.pier))
        out.append((ln, on))
    rest = [p for p in piers if not any(p.line == ln.id for ln, _ in out)]
    if rest:
        out.append((None, rest))
    return out


def _tags(groups) -> dict[str, str]:
    tags: dict[str, str] = {}
    for _, piers in groups:
        for p in piers:
            tags.setdefault(p.guid, f"W{len(tags) + 1}")
    return tags


def _plan(run, level, groups, tags, system: DisplayUnits) -> str:
    alloc, checks = run.allocation, getattr(run.checks, "pier_checks", {})
    f = lambda v: format_value(v, "force", system)  # noqa: E731
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
            force_label=f(alloc.line_envelope.get(ln.id, {}).get("envelope", 0.0)),
        )
        for ln, _ in groups
        if ln is not None
    ]
    per_unit, label = to_display(1.0, "length", system)
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


def _caption(run, level, system: DisplayUnits) -> str:
    cm, cr = _centres(run, level)
    m = lambda v: format_value(v, "length", system)  # noqa: E731
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


def _line_row(ln, alloc, system: DisplayUnits) -> str:
    f = lambda v: format_value(v, "force", system)  # noqa: E731
    m = lambda v: format_value(v, "length", system)  # noqa: E731
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


def _pier_row(p, run, tags, system: DisplayUnits, *, first: bool) -> str:
    alloc, checks = run.allocation, getattr(run.checks, "pier_checks", {})
    f = lambda v: format_value(v, "force", system)  # noqa: E731
    v = lambda x: "-" if x is None else format_value(x, "force_per_length", system)  # noqa: E731
    env, c = alloc.envelope.get(p.id), checks.get(p.id)
    dcr = getattr(c, "dcr", None)
    gov = f"{env.governing_method.value} {env.governing_case}" if env else "-"
    ratio = "-" if dcr is None else f"{dcr:.2f}"
    name = (
        f"{escape(p.name)}<br><small>{escape(p.guid)}</small>"
        if first
        else "<small>(same wall)</small>"
    )
    return (
        f'<tr id="{html_id("pier", p.id)}"><td class="t"><a href="#{wall_anchor(p.guid, p.level)}">'
        f"{escape(tags[p.guid])}</a></td><td class='t'>{name}</td><td>{p.pier}</td>"
        f"<td>{escape(p.direction.value if p.direction else '-')}</td>"
        f"<td class='t'>{escape(p.assembly or '-')}</td>"
        f"<td>{format_value(p.length, 'length', system)}</td>"
        f"<td>{f(env.flexible) if env else '-'}</td><td>{f(env.rigid) if env else '-'}</td>"
        f"<td><b>{f(env.envelope) if env else '-'}</b></td><td class='g'>{escape(gov)}</td>"
        f"<td>{v(getattr(c, 'unit_shear', None))}</td><td>{v(getattr(c, 'capacity', None))}</td>"
        f"<td{' class=over' if dcr is not None and dcr >= 1.0 else ''}>{ratio}</td>"
        f"<td class='lp'>{load_path_cell(alloc.graphs, p, system)}</td></tr>"
    )


def _level(run, level, system: DisplayUnits) -> str:
    groups = _piers_by_line(run.allocation, level.level)
    tags = _tags(groups)
    storeys = sorted({p.storey for _, ps in groups for p in ps})
    below = f" — walls of {escape(', '.join(storeys))}" if storeys else ""
    rows = []
    for ln, piers in groups:
        rows.append(_line_row(ln, run.allocation, system))
        rows += [
            _pier_row(p, run, tags, system, first=i == 0 or piers[i - 1].guid != p.guid)
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
        f"<p>Fx = {format_value(level.story_force, 'force', system)}, "
        f"Vx = {format_value(level.story_shear, 'force', system)}, "
        f"Fpx = {format_value(level.diaphragm_force, 'force', system)}</p>"
        f"{_plan(run, level, groups, tags, system)}{legend_svg()}"
        f"{_caption(run, level, system)}{table}</section>"
    )


def _link_targets(run) -> dict[tuple[str, str], str]:
    """(GlobalId, level) -> id of its mark in the report; level "" = any level."""
    out: dict[tuple[str, str], str] = {}
    for p in run.allocation.piers:
        out.setdefault((p.guid, p.level), wall_anchor(p.guid, p.level))
        out.setdefault((p.guid, ""), wall_anchor(p.guid, p.level))
    levels = {lv.level for lv in run.allocation.levels}
    for d in run.model.diaphragms:
        if d.level in levels:
            for g in d.slab_guids:
                out.setdefault((g, d.level), html_id("diaphragm", d.id))
                out.setdefault((g, ""), html_id("diaphragm", d.id))
    for lv in run.allocation.levels:
        out.setdefault((lv.guid, ""), html_id("level", lv.level))
    return out


def _findings(run) -> str:
    targets, items = _link_targets(run), []
    names = {p.guid: p.name for p in run.allocation.piers}
    counts = {s: 0 for s in _ORDER}
    for fd in sorted(run.findings, key=lambda x: (_ORDER[x.severity], x.level, x.id)):
        counts[fd.severity] += 1
        links = []
        for g in fd.guids:
            href = targets.get((g, fd.level)) or targets.get((g, ""))
            text = f"{escape(names[g])} ({escape(g)})" if g in names else escape(g)
            links.append(f'<a href="#{href}">{text}</a>' if href else text)
        items.append(
            f'<li id="{html_id("finding", fd.id)}"><span class="sev sev-{fd.severity.value}">'
            f"{escape(fd.severity.value)}</span> <b>{escape(fd.title)}</b> "
            f"<small>[{escape(fd.clause)}; {escape(fd.level or 'building')}]</small><br>"
            f"{escape(fd.description)}<br><small>Elements: {' '.join(links) or '-'}; "
            f"finding id {escape(fd.id)}</small></li>"
        )
    head = ", ".join(
        f"{n} {s.value}{'s' if n != 1 and s is not Severity.INFO else ''}"
        for s, n in counts.items()
    )
    return (
        f'<section id="findings"><h2>Findings ({head})</h2>'
        f'<ol class="findings">{"".join(items)}</ol></section>'
    )


def _assumptions(run, system: DisplayUnits) -> list[str]:
    cfg = run.config
    a, ld = cfg.analysis, cfg.loads
    p = lambda v: format_value(v, "pressure", system)  # noqa: E731
    v = lambda x: "-" if x is None else format_value(x, "force_per_length", system)  # noqa: E731
    out = [
        f"Diaphragm idealisation reported: {a.diaphragm.value}; walls are checked for the "
        "envelope of the flexible and rigid results.",
        f"Accidental eccentricity ±{a.accidental_eccentricity:.0%} of the plan dimension "
        f"perpendicular to the force (ASCE 7-16 §12.8.4.2); Ax amplification "
        f"{'applied' if a.amplify_torsion else 'not applied'} (§12.8.4.3).",
        f"Wall stiffness for the rigid analysis: {a.wall_stiffness.value}.",
        f"Lines group walls within {format_value(a.line_tolerance, 'length', system)}.",
        f"Dead loads for seismic weight: floor {p(ld.floor)}, roof {p(ld.roof)}, "
        f"walls {p(ld.wall)} of wall area, over the model's slab and wall areas.",
        f"Design basis {cfg.design_basis.value}; unit shear v = V/L of each full-height pier.",
        "Walls with openings are split into full-height piers.",
    ]
    out += [
        f"Assembly {x.name} ({x.kind.value}): capacity {v(x.unit_shear_capacity)}"
        f"{'; ' + x.capacity_source if x.capacity_source else ''}."
        for x in cfg.assemblies
    ]
    return out


def render_report(run, *, system: DisplayUnits) -> str:
    """The report page as HTML text.

    Common practice: a calculation report an engineer can print, one level per page.

    Args:
        run: A :class:`checks.pipeline.CheckRun`.
        system: Display units.

    Returns:
        The HTML document.
    """
    cfg, levels = run.config, list(reversed(run.allocation.levels))
    nav = "".join(
        f'<a href="#{html_id("level", lv.level)}">{escape(lv.level)}</a>'
        for lv in levels
    )
    body = "".join(
        [
            f"<h1>{escape(cfg.name)}: lateral force allocation and checks</h1>",
            f'<p class="meta">Model {escape(str(run.model.source))} ({escape(run.model.schema)});'
            f" config {escape(str(cfg.path))}; display units {escape(DisplayUnits(system).value)}."
            "</p>",
            f'<p class="caution">{escape(CAUTION)}</p>',
            f'<nav><a href="#seismic">Seismic</a>{nav}<a href="#findings">Findings</a>'
            '<a href="#assumptions">Assumptions</a></nav>',
            seismic_section(run, system),
            *(_level(run, lv, system) for lv in levels),
            _findings(run),
            '<section id="assumptions"><h2>Assumptions</h2><ul>'
            + "".join(f"<li>{escape(x)}</li>" for x in _assumptions(run, system))
            + "</ul>"
            f'<p class="caution">{escape(CAUTION)}</p></section>',
        ]
    )
    return (
        f'<!DOCTYPE html><html lang="en"><head><meta charset="utf-8">'
        f'<meta http-equiv="Content-Security-Policy" content="{_CSP}">'
        f'<meta name="viewport" content="width=device-width, initial-scale=1">'
        f"<title>{escape(cfg.name)} — shearline report</title><style>{_CSS}</style>"
        f"</head><body>{_DEFS}{body}</body></html>"
    )


def write_report(path: str | Path, run, *, system: DisplayUnits) -> Path:
    """Write ``report.html``.

    Common practice: one self-contained file, so it can be mailed or archived as is.

    Args:
        path: Output file.
        run: A :class:`checks.pipeline.CheckRun`.
        system: Display units.

    Returns:
        The path written.
    """
    path = Path(path)
    path.write_text(render_report(run, system=system), encoding="utf-8")
    return path
