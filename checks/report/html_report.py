"""``report.html``: one self-contained page (no network) for the engineer and the reviewer.

Sections: seismic summary, one section per level from the roof down (plan SVG with its
key, a table of lines and wall piers with their forces per method, unit shear, ratio and
load path), findings linked to their walls on the plans, assumptions and the caution.
Print CSS starts each level on a new page. A Content-Security-Policy forbids every
script and every external resource, and every string from the model or config is
escaped.
"""

from __future__ import annotations

from collections.abc import Iterator
from html import escape
from pathlib import Path

from checks.findings import Severity
from checks.project import DisplayUnits
from checks.report._formats import Formats
from checks.report._html_level import LevelContext, level_section, wall_anchor
from checks.report._html_parts import html_id, seismic_section
from checks.report.results_json import CAUTION
from checks.units import format_value

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


def _link_targets(
    run, anchors: dict[tuple[str, str], str]
) -> dict[tuple[str, str], str]:
    """(GlobalId, level) -> id of its mark in the report; level "" = any level.

    ``anchors`` is ``LevelContext.anchors``: each pier's wall mark, in pier order.
    """
    out: dict[tuple[str, str], str] = {}
    for (guid, level), anchor in anchors.items():
        if (guid, level) not in out:
            out[guid, level] = anchor
            out.setdefault((guid, ""), anchor)
    levels = {lv.level for lv in run.allocation.levels}
    for d in run.model.diaphragms:
        if d.level in levels:
            for g in d.slab_guids:
                out.setdefault((g, d.level), html_id("diaphragm", d.id))
                out.setdefault((g, ""), html_id("diaphragm", d.id))
    for lv in run.allocation.levels:
        out.setdefault((lv.guid, ""), html_id("level", lv.level))
    return out


def _findings(run, anchors: dict[tuple[str, str], str]) -> str:
    targets, items = _link_targets(run, anchors), []
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
    return "".join(_report_parts(run, system))


def _report_parts(run, system: DisplayUnits) -> Iterator[str]:
    """The report's text in pieces (head, seismic section, each level, the rest)."""
    cfg, levels = run.config, list(reversed(run.allocation.levels))
    ctx = LevelContext.of(run, Formats.of(system))
    nav = "".join(
        f'<a href="#{html_id("level", lv.level)}">{escape(lv.level)}</a>'
        for lv in levels
    )
    yield (
        f'<!DOCTYPE html><html lang="en"><head><meta charset="utf-8">'
        f'<meta http-equiv="Content-Security-Policy" content="{_CSP}">'
        f'<meta name="viewport" content="width=device-width, initial-scale=1">'
        f"<title>{escape(cfg.name)} — shearline report</title><style>{_CSS}</style>"
        f"</head><body>{_DEFS}"
    )
    yield "".join(
        [
            f"<h1>{escape(cfg.name)}: lateral force allocation and checks</h1>",
            f'<p class="meta">Model {escape(str(run.model.source))} ({escape(run.model.schema)});'
            f" config {escape(str(cfg.path))}; display units {escape(DisplayUnits(system).value)}."
            "</p>",
            f'<p class="caution">{escape(CAUTION)}</p>',
            f'<nav><a href="#seismic">Seismic</a>{nav}<a href="#findings">Findings</a>'
            '<a href="#assumptions">Assumptions</a></nav>',
            seismic_section(run, system),
        ]
    )
    for lv in levels:
        yield level_section(ctx, lv)
    yield _findings(run, ctx.anchors)
    yield (
        '<section id="assumptions"><h2>Assumptions</h2><ul>'
        + "".join(f"<li>{escape(x)}</li>" for x in _assumptions(run, system))
        + "</ul>"
        f'<p class="caution">{escape(CAUTION)}</p></section>'
        "</body></html>"
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
    # piece by piece: the whole page is never held as one string (10 MB on a
    # 10,000-wall model) nor encoded in one go
    with path.open("w", encoding="utf-8") as fh:
        for part in _report_parts(run, system):
            fh.write(part)
    return path
