"""The ratio palette of the plans: bands, their strokes, and the legend.

Five bands whose CIE lightness falls steadily with the demand/capacity ratio (the order
survives greyscale print and every kind of colour blindness), each with its own stroke
pattern, so a band never depends on colour alone. A pier is drawn over a black casing
and a white underlay, so the palest band stays visible on the diaphragm fill and the
gaps of a pattern show white in every band.
"""

from __future__ import annotations

from dataclasses import dataclass
from html import escape

__all__ = ["BANDS", "NO_RATIO", "Band", "band_of", "legend_svg", "pier_strokes"]


@dataclass(frozen=True, slots=True, kw_only=True)
class Band:
    """One ratio band of the palette.

    Attributes:
        upper: The band holds ratios below this [-].
        label: Legend text.
        colour: sRGB hex colour.
        dash: SVG ``stroke-dasharray`` ("" = solid) [px].
    """

    upper: float
    label: str
    colour: str
    dash: str


# CIE L* falls from about 90 to 10 (checked by the tests); patterns all differ.
BANDS: tuple[Band, ...] = (
    Band(upper=0.5, label="< 0.50", colour="#e9e3b4", dash=""),
    Band(upper=0.8, label="0.50–0.80", colour="#9fc59a", dash="14 3"),
    Band(upper=1.0, label="0.80–1.00", colour="#4b8f8c", dash="7 3"),
    Band(upper=1.2, label="1.00–1.20", colour="#7a3f74", dash="3.5 2.5"),
    Band(upper=float("inf"), label="≥ 1.20", colour="#2a0f2f", dash="1.5 2.5"),
)
NO_RATIO = Band(
    upper=float("nan"), label="no capacity", colour="#8f8f8f", dash="1.5 3.5"
)


def band_of(dcr: float | None) -> Band:
    """The palette band of a demand/capacity ratio.

    Common practice: bands of 0.5, 0.8, 1.0 and 1.2 separate comfortable, working,
    near-limit, over and well over capacity.

    Args:
        dcr: Demand/capacity ratio [-], or None when there is no capacity.

    Returns:
        The band.
    """
    if dcr is None:
        return NO_RATIO
    for band in BANDS:
        if dcr < band.upper:
            return band
    return BANDS[-1]


def pier_strokes(band: Band, x1: float, y1: float, x2: float, y2: float) -> str:
    xy = f'x1="{x1:.1f}" y1="{y1:.1f}" x2="{x2:.1f}" y2="{y2:.1f}"'
    dash = f' stroke-dasharray="{band.dash}"' if band.dash else ""
    return (
        f'<line class="casing" {xy}/><line class="under" {xy}/>'
        f'<line class="band" {xy} stroke="{band.colour}"{dash}/>'
    )


def legend_svg() -> str:
    """The legend of the plans: ratio bands with their patterns, CM, CR, line arrow.

    Common practice: a drawing carries its own key, so it reads in greyscale print.

    Returns:
        An ``<svg>`` element as text.
    """
    items, x = [], 10.0
    for band in (*BANDS, NO_RATIO):
        items.append(
            f"{pier_strokes(band, x, 14, x + 40, 14)}"
            f'<text x="{x + 46:.1f}" y="18">{escape(band.label)}</text>'
        )
        x += 60.0 + 7.0 * len(band.label)
    return (
        f'<svg class="legend" xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {x:.0f} 28"'
        f' role="img" aria-label="Legend: demand/capacity ratio bands">'
        f"<title>Demand/capacity ratio bands</title>{''.join(items)}</svg>"
    )
