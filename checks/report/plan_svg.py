"""Plan drawing of one level as inline SVG: diaphragm, openings, lines, piers, forces.

Piers are coloured by demand/capacity ratio with a palette of our own: five bands whose
lightness falls steadily with the ratio (readable in greyscale print and by colour-blind
readers), plus a stroke pattern per band so the band never depends on colour alone.
Plan X to the right, Y up (the SVG's y axis is flipped). Every string from the model is
escaped.
"""

from __future__ import annotations

from dataclasses import dataclass
from html import escape

from shapely.geometry import Polygon

__all__ = ["BANDS", "PlanWall", "band_of", "plan_svg"]


@dataclass(frozen=True, slots=True)
class Band:
    """One ratio band of the palette."""

    upper: float  # band holds ratios below this
    label: str
    colour: str
    dash: str  # SVG stroke-dasharray ("" = solid)


# Lightness falls monotonically (about 90 % to 15 %): greyscale keeps the order.
BANDS: tuple[Band, ...] = (
    Band(0.5, "< 0.50", "#e9e3b4", ""),
    Band(0.8, "0.50–0.80", "#9fc59a", ""),
    Band(1.0, "0.80–1.00", "#4b8f8c", ""),
    Band(1.2, "1.00–1.20", "#7a3f74", "6 2"),
    Band(float("inf"), "≥ 1.20", "#2a0f2f", "2 2"),
)
NO_RATIO = Band(float("nan"), "no capacity", "#b8b8b8", "1 3")


def band_of(dcr: float | None) -> Band:
    """The palette band of a ratio (``None`` = no capacity)."""
    if dcr is None:
        return NO_RATIO
    for band in BANDS:
        if dcr < band.upper:
            return band
    return BANDS[-1]


@dataclass(frozen=True, slots=True, kw_only=True)
class PlanWall:
    """What the plan needs of one pier."""

    anchor: str  # HTML id of the pier's row / element
    guid: str
    label: str
    start: tuple[float, float]
    end: tuple[float, float]
    dcr: float | None


@dataclass(frozen=True, slots=True, kw_only=True)
class PlanLine:
    """What the plan needs of one line of resistance."""

    id: str
    direction: str  # "X" or "Y"
    offset: float
    extent: tuple[float, float]
    force_label: str


class _Frame:
    def __init__(self, bounds: tuple[float, float, float, float], width: float, height: float):
        x0, y0, x1, y1 = bounds
        self.margin = 60.0
        span = max(x1 - x0, y1 - y0, 1e-6)
        self.s = min((width - 2 * self.margin) / max(x1 - x0, span * 0.05),
                     (height - 2 * self.margin) / max(y1 - y0, span * 0.05))
        self.x0, self.y1 = x0, y1

    def pt(self, x: float, y: float) -> tuple[float, float]:
        return (self.margin + (x - self.x0) * self.s, self.margin + (self.y1 - y) * self.s)


def _path(poly: Polygon, fr: _Frame) -> str:
    def ring(coords) -> str:
        pts = [fr.pt(x, y) for x, y in coords]
        return "M" + " L".join(f"{a:.1f},{b:.1f}" for a, b in pts) + " Z"

    return " ".join([ring(poly.exterior.coords), *(ring(i.coords) for i in poly.interiors)])


def plan_svg(
    *,
    level: str,
    diaphragms: list[Polygon],
    walls: list[PlanWall],
    lines: list[PlanLine],
    centre_of_mass: tuple[float, float] | None,
    centre_of_rigidity: tuple[float, float] | None,
    width: float = 900.0,
    height: float = 620.0,
) -> str:
    """The SVG markup of one level's plan.

    Args:
        level: Level name (escaped into the title).
        diaphragms: Diaphragm outlines with holes [m].
        walls: Piers to draw, coloured by ratio.
        lines: Lines with their force labels (display units already applied).
        centre_of_mass: CM of the levels at and above [m], or None.
        centre_of_rigidity: CR of the story [m], or None.
        width: SVG width [px].
        height: SVG height [px].

    Returns:
        An ``<svg>`` element as text.
    """
    xs = [c for p in diaphragms for c in (p.bounds[0], p.bounds[2])]
    ys = [c for p in diaphragms for c in (p.bounds[1], p.bounds[3])]
    for w in walls:
        xs += [w.start[0], w.end[0]]
        ys += [w.start[1], w.end[1]]
    if not xs:
        xs, ys = [0.0, 1.0], [0.0, 1.0]
    fr = _Frame((min(xs), min(ys), max(xs), max(ys)), width, height)
    out = [
        f'<svg class="plan" xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {width:.0f} '
        f'{height:.0f}" role="img" aria-label="Plan of {escape(level)}">',
        f"<title>Plan of {escape(level)}</title>",
    ]
    for poly in diaphragms:
        out.append(f'<path class="diaphragm" fill-rule="evenodd" d="{_path(poly, fr)}"/>')
    for ln in lines:
        out.append(_line_svg(ln, fr))
    for w in walls:
        band = band_of(w.dcr)
        (ax, ay), (bx, by) = fr.pt(*w.start), fr.pt(*w.end)
        ratio = "no capacity" if w.dcr is None else f"DCR {w.dcr:.2f}"
        out.append(
            f'<a href="#{escape(w.anchor)}"><line class="wall" id="plan-{escape(w.anchor)}" '
            f'data-guid="{escape(w.guid)}" x1="{ax:.1f}" y1="{ay:.1f}" x2="{bx:.1f}" '
            f'y2="{by:.1f}" stroke="{band.colour}" stroke-dasharray="{band.dash}">'
            f"<title>{escape(w.label)} ({escape(w.guid)}): {ratio}</title></line></a>"
        )
    for mark, pt, cls in (("CM", centre_of_mass, "cm"), ("CR", centre_of_rigidity, "cr")):
        if pt is not None:
            x, y = fr.pt(*pt)
            shape = (f'<circle cx="{x:.1f}" cy="{y:.1f}" r="7"/>' if cls == "cm" else
                     f'<rect x="{x - 6:.1f}" y="{y - 6:.1f}" width="12" height="12"/>')
            out.append(f'<g class="{cls}">{shape}<text x="{x + 10:.1f}" y="{y - 8:.1f}">'
                       f"{mark}</text></g>")
    out.append(_scale_bar(fr, height))
    out.append("</svg>")
    return "\n".join(out)


def _line_svg(ln: PlanLine, fr: _Frame) -> str:
    a, b = ln.extent
    if ln.direction == "X":
        (x0, y0), (x1, y1) = fr.pt(a, ln.offset), fr.pt(b, ln.offset)
        ax, ay = x0 - 50, y0
        arrow = f"M{ax:.1f},{ay:.1f} L{ax + 40:.1f},{ay:.1f}"
        tx, ty = ax, ay - 6
    else:
        (x0, y0), (x1, y1) = fr.pt(ln.offset, a), fr.pt(ln.offset, b)
        ax, ay = x0, y0 + 50
        arrow = f"M{ax:.1f},{ay:.1f} L{ax:.1f},{ay - 40:.1f}"
        tx, ty = ax + 6, ay - 4
    return (
        f'<g class="line" data-line="{escape(ln.id)}"><line x1="{x0:.1f}" y1="{y0:.1f}" '
        f'x2="{x1:.1f}" y2="{y1:.1f}"/><path class="arrow" d="{arrow}" '
        f'marker-end="url(#arrowhead)"/><text x="{tx:.1f}" y="{ty:.1f}">'
        f"{escape(ln.id)}: {escape(ln.force_label)}</text></g>"
    )


def _scale_bar(fr: _Frame, height: float) -> str:
    metres = 5.0
    while metres * fr.s > 240:
        metres /= 2
    while metres * fr.s < 60:
        metres *= 2
    x, y = 20.0, height - 20.0
    return (f'<g class="scale"><line x1="{x:.1f}" y1="{y:.1f}" x2="{x + metres * fr.s:.1f}" '
            f'y2="{y:.1f}"/><text x="{x:.1f}" y="{y - 6:.1f}">{metres:g} m</text></g>')
