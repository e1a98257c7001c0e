"""Plan drawing of one level as inline SVG: diaphragm, openings, lines, piers, forces.

Piers are coloured by demand/capacity ratio with a palette of our own: five bands whose
CIE lightness falls steadily with the ratio (the order survives greyscale print and
every kind of colour blindness), and each band has its own stroke pattern, so a band
never depends on colour alone. Each pier is drawn over a black casing and a white
underlay, so the palest band stays visible on the diaphragm fill and the gaps of a
pattern show white in every band.

Plan X to the right, Y up (the SVG's y axis is flipped). X lines carry their arrow in
the left margin, Y lines in the bottom margin, both pointing in the positive sense;
labels are spread apart where lines are close. Every string from the model is escaped.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from html import escape

from shapely.geometry import Polygon

from checks.report._plan_palette import (
    BANDS,
    NO_RATIO,
    Band,
    band_of,
    legend_svg,
    pier_strokes,
)

__all__ = [
    "BANDS",
    "NO_RATIO",
    "Band",
    "PlanLine",
    "PlanWall",
    "band_of",
    "legend_svg",
    "plan_svg",
    "spread",
]

_LEFT, _RIGHT, _TOP, _BOTTOM = 190.0, 30.0, 30.0, 175.0  # margins [px]
_LABEL_GAP = 15.0  # [px] closest spacing of two line labels (12 px text)


@dataclass(frozen=True, slots=True, kw_only=True)
class PlanWall:
    """What the plan needs of one pier.

    Attributes:
        group: HTML id of the wall's group on the plan (one per wall and level).
        row: HTML id of the pier's table row (the plan links there).
        guid: GlobalId of the IfcWall.
        label: Wall name for the tooltip.
        tag: Short key shown on the plan and in the table (``"W3"``).
        start: Plan start point [m].
        end: Plan end point [m].
        dcr: Demand/capacity ratio [-], or None.
    """

    group: str
    row: str
    guid: str
    label: str
    tag: str
    start: tuple[float, float]
    end: tuple[float, float]
    dcr: float | None


@dataclass(frozen=True, slots=True, kw_only=True)
class PlanLine:
    """What the plan needs of one line of resistance.

    Attributes:
        id: Line id.
        direction: ``"X"`` or ``"Y"``.
        offset: Perpendicular position of the line [m].
        force_label: Envelope force, already in display units.
    """

    id: str
    direction: str
    offset: float
    force_label: str


@dataclass(frozen=True, slots=True)
class _Frame:
    x0: float
    y1: float
    s: float  # [px/m]
    width: float
    height: float
    right: float  # px of the plan's right edge
    bottom: float  # px of the plan's bottom edge

    def pt(self, x: float, y: float) -> tuple[float, float]:
        return (_LEFT + (x - self.x0) * self.s, _TOP + (self.y1 - y) * self.s)


def _frame(bounds: tuple[float, float, float, float], width: float, max_plan_h: float):
    x0, y0, x1, y1 = bounds
    dx, dy = max(x1 - x0, 1e-6), max(y1 - y0, 1e-6)
    s = min((width - _LEFT - _RIGHT) / dx, max_plan_h / dy)
    return _Frame(
        x0=x0,
        y1=y1,
        s=s,
        width=width,
        height=_TOP + dy * s + _BOTTOM,
        right=_LEFT + dx * s,
        bottom=_TOP + dy * s,
    )


def spread(wanted: list[float], lo: float, hi: float, gap: float) -> list[float]:
    """Positions near ``wanted`` (sorted) at least ``gap`` apart, kept within [lo, hi].

    Common practice: a one-dimensional label layout, pushed forward then back.

    Args:
        wanted: Preferred positions, ascending [px].
        lo: Lowest allowed position [px].
        hi: Highest allowed position [px].
        gap: Least spacing [px].

    Returns:
        The positions, ascending [px].
    """
    out: list[float] = []
    for w in wanted:
        out.append(max(w, lo, out[-1] + gap if out else lo))
    for i in range(len(out) - 1, -1, -1):
        top = hi if i == len(out) - 1 else out[i + 1] - gap
        out[i] = min(out[i], top)
    return out


def _ring(coords, fr: _Frame) -> str:
    pts = [fr.pt(x, y) for x, y in coords]
    return "M" + " L".join(f"{a:.1f},{b:.1f}" for a, b in pts) + " Z"


def _diaphragm(poly: Polygon, fr: _Frame, ident: str) -> list[str]:
    rings = " ".join(
        [
            _ring(poly.exterior.coords, fr),
            *(_ring(i.coords, fr) for i in poly.interiors),
        ]
    )
    out = [
        f'<path class="diaphragm" id="{escape(ident)}" fill-rule="evenodd" d="{rings}"/>'
    ]
    for hole in poly.interiors:  # drafting convention: an opening is crossed
        h = Polygon(hole)
        x0, y0, x1, y1 = h.bounds
        if h.area < 0.95 * (x1 - x0) * (y1 - y0):
            continue
        (a, b), (c, d) = fr.pt(x0, y0), fr.pt(x1, y1)
        out.append(
            f'<path class="opening" d="M{a:.1f},{b:.1f} L{c:.1f},{d:.1f} '
            f'M{a:.1f},{d:.1f} L{c:.1f},{b:.1f}"/>'
        )
    return out


def _x_lines(lines: list[PlanLine], fr: _Frame) -> list[str]:
    xs = sorted((ln for ln in lines if ln.direction == "X"), key=lambda ln: -ln.offset)
    ys = [fr.pt(0.0, ln.offset)[1] for ln in xs]
    placed = spread(ys, _TOP, fr.bottom + 40.0, _LABEL_GAP)
    out = []
    for ln, y, ty in zip(xs, ys, placed, strict=True):
        a0, a1 = _LEFT - 62.0, _LEFT - 6.0
        leader = (
            f'<path class="leader" d="M{a0 - 4:.1f},{ty:.1f} L{a0:.1f},{y:.1f}"/>'
            if abs(ty - y) > 1.0
            else ""
        )
        out.append(
            f'<g class="line" data-line="{escape(ln.id)}">'
            f'<line class="axis" x1="{a1:.1f}" y1="{y:.1f}" x2="{fr.right + 8:.1f}" y2="{y:.1f}"/>'
            f'<path class="arrow" d="M{a0:.1f},{y:.1f} L{a1:.1f},{y:.1f}" '
            f'marker-end="url(#arrowhead)"/>{leader}'
            f'<text x="{a0 - 6:.1f}" y="{ty + 4:.1f}" text-anchor="end">'
            f'<tspan class="lid">{escape(ln.id)}</tspan> {escape(ln.force_label)}</text></g>'
        )
    return out


def _y_lines(lines: list[PlanLine], fr: _Frame) -> list[str]:
    ys = sorted((ln for ln in lines if ln.direction == "Y"), key=lambda ln: ln.offset)
    xs = [fr.pt(ln.offset, 0.0)[0] for ln in ys]
    placed = spread(xs, _LEFT - 20.0, fr.width - 10.0, _LABEL_GAP)
    out = []
    for ln, x, tx in zip(ys, xs, placed, strict=True):
        a0, a1 = fr.bottom + 62.0, fr.bottom + 6.0
        leader = (
            f'<path class="leader" d="M{tx:.1f},{a0 + 4:.1f} L{x:.1f},{a0:.1f}"/>'
            if abs(tx - x) > 1.0
            else ""
        )
        out.append(
            f'<g class="line" data-line="{escape(ln.id)}">'
            f'<line class="axis" x1="{x:.1f}" y1="{a1:.1f}" x2="{x:.1f}" y2="{_TOP - 8:.1f}"/>'
            f'<path class="arrow" d="M{x:.1f},{a0:.1f} L{x:.1f},{a1:.1f}" '
            f'marker-end="url(#arrowhead)"/>{leader}'
            f'<text transform="translate({tx + 4:.1f},{a0 + 6:.1f}) rotate(-90)" '
            f'text-anchor="end"><tspan class="lid">{escape(ln.id)}</tspan> '
            f"{escape(ln.force_label)}</text></g>"
        )
    return out


def _walls(walls: list[PlanWall], fr: _Frame, centre: tuple[float, float]) -> list[str]:
    groups: dict[str, list[PlanWall]] = {}
    for w in walls:
        groups.setdefault(w.group, []).append(w)
    centre_px = fr.pt(*centre)
    left, top, x0, y1, s = _LEFT, _TOP, fr.x0, fr.y1, fr.s
    out = []
    for gid, piers in groups.items():
        first = piers[0]
        if len(piers) == 1:  # most walls have no opening: one pier
            worst = first.dcr
        else:
            worst = max((p.dcr for p in piers if p.dcr is not None), default=None)
        ratio = "no capacity" if worst is None else f"DCR {worst:.2f}"
        guid = escape(first.guid)
        parts = [
            f'<g class="wall" id="{escape(gid)}" data-guid="{guid}">'
            f"<title>{escape(first.tag)} {escape(first.label)} ({guid})"
            f": {ratio}</title>"
        ]
        ends = []
        for p in piers:
            (sx, sy), (ex, ey) = p.start, p.end
            # as _Frame.pt, inline: one plan draws thousands of piers
            ax, ay = left + (sx - x0) * s, top + (y1 - sy) * s
            bx, by = left + (ex - x0) * s, top + (y1 - ey) * s
            ends.append((ax, ay, bx, by))
            parts.append(
                f'<a href="#{escape(p.row)}">'
                f"{pier_strokes(band_of(p.dcr), ax, ay, bx, by)}</a>"
            )
        parts.append(_tag(piers, ends, centre_px, worst))
        out.append("".join(parts) + "</g>")
    return out


def _tag(
    piers: list[PlanWall],
    ends: list[tuple[float, float, float, float]],
    centre_px: tuple[float, float],
    worst: float | None,
) -> str:
    """The wall's tag beside its longest pier, on the side of the centre of mass."""
    i = (
        0
        if len(piers) == 1
        else max(
            range(len(piers)),
            key=lambda k: (
                (piers[k].end[0] - piers[k].start[0]) ** 2
                + (piers[k].end[1] - piers[k].start[1]) ** 2
            ),
        )
    )
    p = piers[i]
    ax, ay, bx, by = ends[i]
    mx, my = (ax + bx) / 2.0, (ay + by) / 2.0
    length = max(((bx - ax) ** 2 + (by - ay) ** 2) ** 0.5, 1e-9)
    nx, ny = -(by - ay) / length, (bx - ax) / length
    cx, cy = centre_px
    if (cx - mx) * nx + (cy - my) * ny < 0:  # put the tag on the inner side
        nx, ny = -nx, -ny
    tx, ty = mx + 17.0 * nx, my + 17.0 * ny
    over = ""
    if worst is not None and worst >= 1.0:
        over = (
            f'<text class="over" x="{tx + 12:.1f}" y="{ty + 4:.1f}">{worst:.2f}</text>'
        )
    return (
        f'<g class="tag"><circle cx="{tx:.1f}" cy="{ty:.1f}" r="9"/>'
        f'<text x="{tx:.1f}" y="{ty + 3.5:.1f}" text-anchor="middle">'
        f"{escape(p.tag)}</text>{over}</g>"
    )


def _centres(
    cm: tuple[float, float] | None, cr: tuple[float, float] | None, fr: _Frame
) -> list[str]:
    out = []
    if cm is not None:
        x, y = fr.pt(*cm)
        out.append(
            f'<g class="cm"><circle cx="{x:.1f}" cy="{y:.1f}" r="7"/>'
            f'<path d="M{x:.1f},{y:.1f} L{x + 7:.1f},{y:.1f} A7,7 0 0 0 {x:.1f},{y - 7:.1f} '
            f'Z M{x:.1f},{y:.1f} L{x - 7:.1f},{y:.1f} A7,7 0 0 0 {x:.1f},{y + 7:.1f} Z"/>'
            f'<text x="{x - 10:.1f}" y="{y - 9:.1f}" text-anchor="end">CM</text></g>'
        )
    if cr is not None:
        x, y = fr.pt(*cr)
        out.append(
            f'<g class="cr"><rect x="{x - 6:.1f}" y="{y - 6:.1f}" width="12" height="12"/>'
            f'<path d="M{x - 6:.1f},{y - 6:.1f} L{x + 6:.1f},{y + 6:.1f} M{x - 6:.1f},'
            f'{y + 6:.1f} L{x + 6:.1f},{y - 6:.1f}"/>'
            f'<text x="{x + 10:.1f}" y="{y + 18:.1f}">CR</text></g>'
        )
    return out


def _scale_and_axes(fr: _Frame, unit: tuple[str, float]) -> str:
    label, metres_per_unit = unit
    px_per_unit = fr.s * metres_per_unit
    raw = 100.0 / px_per_unit  # [unit] that would be 100 px long
    decade = 10.0 ** math.floor(math.log10(raw))
    step = max(m * decade for m in (1.0, 2.0, 5.0, 10.0) if m * decade <= raw)
    x, y = 70.0, fr.height - 24.0
    bar = step * px_per_unit
    return (
        f'<g class="scale"><line x1="{x:.1f}" y1="{y:.1f}" x2="{x + bar:.1f}" y2="{y:.1f}"/>'
        f'<text x="{x:.1f}" y="{y - 7:.1f}">{step:g} {escape(label)}</text></g>'
        f'<g class="axes"><path class="arrow" d="M20,{y:.1f} L50,{y:.1f}" '
        f'marker-end="url(#arrowhead)"/><path class="arrow" d="M20,{y:.1f} L20,{y - 30:.1f}" '
        f'marker-end="url(#arrowhead)"/><text x="46" y="{y + 14:.1f}">X</text>'
        f'<text x="6" y="{y - 24:.1f}">Y</text></g>'
    )


def plan_svg(
    *,
    level: str,
    diaphragms: list[tuple[str, Polygon]],
    walls: list[PlanWall],
    lines: list[PlanLine],
    centre_of_mass: tuple[float, float] | None,
    centre_of_rigidity: tuple[float, float] | None,
    scale_unit: tuple[str, float] = ("m", 1.0),
    width: float = 900.0,
    max_plan_height: float = 560.0,
) -> str:
    """The SVG markup of one level's plan.

    Common practice: a framing-plan style drawing, lines of resistance as grid lines.

    Args:
        level: Level name (escaped into the title).
        diaphragms: (HTML id, outline with holes [m]) per diaphragm region.
        walls: Piers to draw, coloured by ratio.
        lines: Lines with their force labels (display units already applied).
        centre_of_mass: CM of the levels at and above [m], or None.
        centre_of_rigidity: CR of the story [m], or None.
        scale_unit: Label and length of the scale bar's unit (``("ft", 0.3048)``) [m].
        width: SVG width [px].
        max_plan_height: Largest height of the plan itself [px].

    Returns:
        An ``<svg>`` element as text.
    """
    xs = [c for _, p in diaphragms for c in (p.bounds[0], p.bounds[2])]
    ys = [c for _, p in diaphragms for c in (p.bounds[1], p.bounds[3])]
    for w in walls:
        xs += [w.start[0], w.end[0]]
        ys += [w.start[1], w.end[1]]
    if not xs:
        xs, ys = [0.0, 1.0], [0.0, 1.0]
    fr = _frame((min(xs), min(ys), max(xs), max(ys)), width, max_plan_height)
    centre = centre_of_mass or ((min(xs) + max(xs)) / 2.0, (min(ys) + max(ys)) / 2.0)
    out = [
        f'<svg class="plan" xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {width:.0f} '
        f'{fr.height:.0f}" role="img" aria-label="Plan of {escape(level)}">',
        f"<title>Plan of {escape(level)}</title>",
    ]
    for ident, poly in diaphragms:
        out += _diaphragm(poly, fr, ident)
    out += _x_lines(lines, fr) + _y_lines(lines, fr)
    out += _walls(walls, fr, centre)
    out += _centres(centre_of_mass, centre_of_rigidity, fr)
    out.append(_scale_and_axes(fr, scale_unit))
    out.append("</svg>")
    return "\n".join(out)
