"""``report.html``: one self-contained page (no network) for the engineer and the reviewer.

Sections: seismic summary, one page per level (plan SVG, wall table with forces per
method, ratio and load path), findings linked to their walls, assumptions and the
caution. Print CSS puts one level on each page. Every string from the model or config is
escaped.
"""

from __future__ import annotations

import re
from html import escape
from pathlib import Path

from checks.findings import Severity
from checks.project import DisplayUnits
from checks.report.plan_svg import BANDS, NO_RATIO, PlanLine, PlanWall, plan_svg
from checks.report.results_json import CAUTION
from checks.units import format_value

__all__ = ["render_report", "write_report"]

_CSS = """
body{font-family:system-ui,-apple-system,Segoe UI,Helvetica,Arial,sans-serif;margin:2em;color:#1d1d1d;max-width:1200px}
h1{font-size:1.6em;margin-bottom:.2em} h2{border-bottom:2px solid #333;padding-bottom:.2em;margin-top:2em}
table{border-collapse:collapse;margin:.8em 0;font-size:.86em} th,td{border:1px solid #bbb;padding:.25em .5em;text-align:right}
th{background:#eee} td.t,th.t{text-align:left} tr:target{outline:3px solid #000}
.caution{border:2px solid #000;padding:.6em 1em;background:#fafafa;font-weight:600}
.sev-error{font-weight:700} .sev-error::before{content:"\\2716  "} .sev-warning::before{content:"\\25B2  "} .sev-info::before{content:"\\25CF  "}
svg.plan{width:100%;max-width:900px;height:auto;border:1px solid #999;background:#fff}
svg .diaphragm{fill:#f3f1ea;stroke:#555;stroke-width:1.5} svg .wall{stroke-width:7;stroke-linecap:butt}
svg .line line{stroke:#888;stroke-width:1;stroke-dasharray:8 4} svg .line text,svg .scale text,svg g text{font-size:12px;fill:#111}
svg .arrow{stroke:#111;stroke-width:2;fill:none} svg .cm circle{fill:none;stroke:#000;stroke-width:2} svg .cr rect{fill:#000}
svg .scale line{stroke:#000;stroke-width:3}
.legend span{display:inline-block;margin-right:1em;font-size:.85em} .legend i{display:inline-block;width:2.2em;height:.7em;margin-right:.3em;vertical-align:middle;border:1px solid #333}
details{margin:.2em 0} summary{cursor:pointer}
@media print{body{margin:0;max-width:none} section.level{page-break-before:always;break-before:page} a{color:inherit;text-decoration:none} details{display:block} .noprint{display:none}}
"""

_DEFS = (
    '<svg width="0" height="0" style="position:absolute" aria-hidden="true"><defs>'
    '<marker id="arrowhead" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" '
    'markerHeight="7" orient="auto-start-reverse"><path d="M0,0 L10,5 L0,10 z"/></marker>'
    "</defs></svg>"
)


def _anchor(text: str) -> str:
    return "p-" + re.sub(r"[^A-Za-z0-9_-]", lambda m: f"_{ord(m.group()):x}", text)


def wall_anchor(guid: str) -> str:
    """HTML id of a wall's first row (findings link here)."""
    return _anchor("wall " + guid)


def _seismic(run, system: DisplayUnits) -> str:
    s, p = run.allocation.seismic, run.config.seismic
    f = lambda v: format_value(v, "force", system)  # noqa: E731
    rows = [("Procedure", escape(s.procedure.upper())), ("SDS / SD1 / S1", f"{p.SDS:g} / {p.SD1:g} / {p.S1:g} g"),
            ("R / Ie / Cd / Ω0", f"{p.R:g} / {p.Ie:g} / {p.Cd:g} / {p.omega0:g}"),
            ("hn", format_value(s.hn, "length", system)),
            ("Ta / Cu / T used", f"{s.Ta:.3f} s / {s.Cu:.2f} / {s.T:.3f} s"), ("k", f"{s.k:.3f}"),
            ("Cs (governing equation)", f"{s.Cs:.4f} ({escape(s.Cs_governs)})"),
            ("W", f(s.W)), ("V = Cs·W", f(s.V))]
    head = "".join(f'<tr><th class="t">{k}</th><td>{v}</td></tr>' for k, v in rows)
    lv = "".join(
        f'<tr><td class="t">{escape(x.level)}</td><td>{format_value(x.height, "length", system)}</td>'
        f"<td>{f(x.seismic_weight)}</td><td>{x.Cvx:.4f}</td><td>{f(x.story_force)}</td>"
        f"<td>{f(x.story_shear)}</td><td>{f(x.diaphragm_force)}</td></tr>"
        for x in reversed(run.allocation.levels))
    return (f"<h2>Seismic summary (ASCE 7-16 §12.8)</h2><table>{head}</table><table><tr>"
            '<th class="t">Level</th><th>hx</th><th>wx</th><th>Cvx</th><th>Fx</th><th>Vx</th>'
            f"<th>Fpx (§12.10.1.1)</th></tr>{lv}</table>")


def _legend() -> str:
    items = [*BANDS, NO_RATIO]
    return '<p class="legend">Demand/capacity: ' + "".join(
        f'<span><i style="background:{b.colour}"></i>{escape(b.label)}'
        f'{" (dashed)" if b.dash else ""}</span>' for b in items) + "</p>"


def _level(run, level, system: DisplayUnits) -> str:
    alloc, checks = run.allocation, getattr(run.checks, "pier_checks", {})
    piers = [p for p in alloc.piers if p.level == level.level]
    lines = [ln for ln in alloc.lines if ln.level == level.level]
    f = lambda v: format_value(v, "force", system)  # noqa: E731
    rigid = [r for r in alloc.rigid if r.level == level.level]
    walls = [PlanWall(anchor=_anchor(p.id), guid=p.guid, label=p.name or p.guid, start=p.start,
                      end=p.end, dcr=getattr(checks.get(p.id), "dcr", None)) for p in piers]
    plan_lines = [PlanLine(id=ln.id, direction=ln.direction.value, offset=ln.offset,
                           extent=ln.wall_extent,
                           force_label=f(alloc.line_envelope.get(ln.id, {}).get("envelope", 0.0)))
                  for ln in lines]
    svg = plan_svg(level=level.level, diaphragms=[d.polygon for d in run.model.diaphragms_of(level.level)],
                   walls=walls, lines=plan_lines, centre_of_mass=level.mass_centroid,
                   centre_of_rigidity=rigid[0].center_of_rigidity if rigid else None)
    rows, seen = [], set()
    graphs = alloc.graphs
    for p in piers:
        env, c = alloc.envelope.get(p.id), checks.get(p.id)
        ids = f' id="{_anchor(p.id)}"'
        first = "" if p.guid in seen else f'<span id="{wall_anchor(p.guid)}"></span>'
        seen.add(p.guid)
        dcr = getattr(c, "dcr", None)
        rows.append(
            f"<tr{ids}><td class='t'>{first}{escape(p.name)}<br><small>{escape(p.guid)}</small></td>"
            f"<td>{p.pier}</td><td>{escape(p.direction.value if p.direction else '-')}</td>"
            f"<td class='t'>{escape(p.line)}</td><td>{format_value(p.length, 'length', system)}</td>"
            f"<td>{f(env.flexible) if env else '-'}</td><td>{f(env.rigid) if env else '-'}</td>"
            f"<td>{f(env.envelope) if env else '-'}</td>"
            f"<td class='t'>{escape(f'{env.governing_method.value} {env.governing_case}') if env else '-'}</td>"
            f"<td>{_fmt(getattr(c, 'unit_shear', None), 'force_per_length', system)}</td>"
            f"<td>{_fmt(getattr(c, 'capacity', None), 'force_per_length', system)}</td>"
            f"<td>{'-' if dcr is None else f'{dcr:.2f}'}</td>"
            f"<td class='t'>{_load_path(graphs, p, system)}</td></tr>")
    table = ("<table><tr><th class='t'>Wall</th><th>Pier</th><th>Dir</th><th class='t'>Line</th>"
             "<th>Length</th><th>Flexible</th><th>Rigid</th><th>Envelope</th><th class='t'>Governs</th>"
             "<th>Unit shear</th><th>Capacity</th><th>DCR</th><th class='t'>Load path</th></tr>"
             + "".join(rows) + "</table>")
    return (f'<section class="level" id="{_anchor("level " + level.level)}"><h2>{escape(level.level)}</h2>'
            f"{svg}{_legend()}<p>CM: centre of mass of the levels at and above (circle); "
            f"CR: centre of rigidity of the story below (square). Arrows: envelope force per line.</p>"
            f"{table}</section>")


def _fmt(v, quantity: str, system: DisplayUnits) -> str:
    return "-" if v is None else format_value(v, quantity, system)


def _load_path(graphs, pier, system: DisplayUnits) -> str:
    if pier.direction is None or pier.direction not in graphs:
        return "-"
    try:
        from allocation.load_path import explain_pier

        parts = explain_pier(graphs[pier.direction], pier.id)
    except (KeyError, ValueError, ImportError):
        return "-"
    items = "".join(f"<li>{escape(str(c.level))}: {escape(str(c.source))} — "
                    f"{c.share:.3f} × → {format_value(c.force, 'force', system)}</li>"
                    for c in parts)
    return f"<details><summary>{len(parts)} contributions</summary><ul>{items}</ul></details>"


def _findings(run) -> str:
    order = {Severity.ERROR: 0, Severity.WARNING: 1, Severity.INFO: 2}
    items = []
    for fd in sorted(run.findings, key=lambda x: (order[x.severity], x.level, x.id)):
        links = " ".join(f'<a href="#{wall_anchor(g)}">{escape(g)}</a>' for g in fd.guids)
        items.append(
            f'<li id="{_anchor("finding " + fd.id)}"><span class="sev-{fd.severity.value}">'
            f"{escape(fd.severity.value)}</span> <b>{escape(fd.title)}</b> "
            f"<small>[{escape(fd.clause)}; {escape(fd.level)}; id {escape(fd.id)}]</small><br>"
            f"{escape(fd.description)}<br><small>{links}</small></li>")
    return f"<h2>Findings ({len(items)})</h2><ol>{''.join(items)}</ol>"


def render_report(run, *, system: DisplayUnits) -> str:
    """The report page as HTML text.

    Args:
        run: A :class:`checks.pipeline.CheckRun`.
        system: Display units.

    Returns:
        The HTML document.
    """
    cfg = run.config
    a = cfg.analysis
    assumptions = [
        f"Diaphragm idealisation reported: {a.diaphragm.value}; flexible and rigid are both computed.",
        f"Accidental eccentricity ±{a.accidental_eccentricity:.0%} of the plan dimension "
        f"perpendicular to the force (ASCE 7-16 §12.8.4.2); Ax amplification "
        f"{'applied' if a.amplify_torsion else 'not applied'} (§12.8.4.3).",
        f"Wall stiffness for the rigid analysis: {a.wall_stiffness.value}.",
        f"Lines group walls within {format_value(a.line_tolerance, 'length', system)}.",
        f"Design basis {cfg.design_basis.value}; seismic weight from the model's slab areas and "
        "wall areas with the config's dead loads.",
        "Walls with openings are split into full-height piers.",
    ]
    body = "".join([
        f"<h1>{escape(cfg.name)}: lateral force allocation and checks</h1>",
        f"<p>Model: {escape(str(run.model.source))} ({escape(run.model.schema)}); config: "
        f"{escape(str(cfg.path))}.</p>",
        f'<p class="caution">{escape(CAUTION)}</p>',
        _seismic(run, system),
        *(_level(run, lv, system) for lv in run.allocation.levels),
        _findings(run),
        "<h2>Assumptions</h2><ul>" + "".join(f"<li>{escape(x)}</li>" for x in assumptions) + "</ul>",
        f'<p class="caution">{escape(CAUTION)}</p>',
    ])
    return (f'<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><title>{escape(cfg.name)}'
            f" — shearline report</title><style>{_CSS}</style></head><body>{_DEFS}{body}</body></html>")


def write_report(path: str | Path, run, *, system: DisplayUnits) -> Path:
    """Write ``report.html``; returns the path."""
    path = Path(path)
    path.write_text(render_report(run, system=system), encoding="utf-8")
    return path
