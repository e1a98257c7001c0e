"""Where a line of resistance supports a diaphragm region: its chords (private).

Used by :mod:`allocation.lines` (which re-exports :class:`Crossing`,
:func:`line_crossing` and :func:`region_crossings`) and :mod:`allocation._tributary`.
Axes as in :mod:`allocation.lines`: a line acting in X runs along x at y = offset.

A line supports a region over each full crossing (chord) of the region that its
walls physically cut: of the chords of the infinite line at the offset (holes
excluded), those that overlap the walls' extent. A line within 1e-6 m of a slab
vertex's coordinate is taken exactly at it. When the walls sit just outside the slab
edge, the chord is taken at the nearest slab edge within ``line_tolerance``. A region
and line met before (a typical floor) are answered from memory.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import dataclass

import shapely
from shapely.geometry import Polygon

from allocation._memo import Memo, float_bytes, wkb_of
from allocation._records import maker
from allocation.results import ResistanceLine
from ifc_bridge.model import Diaphragm, Direction

__all__ = [
    "Crossing",
    "RegionProbe",
    "crossing_on",
    "line_crossing",
    "merge_intervals",
    "region_crossings",
]

_EPS = 1e-9  # [m] geometric coincidence
_SNAP = 1e-6  # [m] a line this close to a slab vertex's coordinate is taken at it


@dataclass(frozen=True, slots=True, kw_only=True)
class Crossing:
    """Where a line supports one diaphragm region.

    Attributes:
        diaphragm: Diaphragm id.
        offset: Perpendicular coordinate of the chord(s) [m]; the line's offset, or
            the nearest slab edge within the tolerance when the walls are just off it.
        segments: Chords as ``(start, end)`` along-line coordinates, sorted [m].
        spans: ``segments`` with the gaps at interior openings bridged: one
            (first start, last end) per chord of the hole-filled outline. A gap
            between segments at an opening is spanned around by the diaphragm
            (common practice); where a span ends, the line's support ends [m].
    """

    diaphragm: str
    offset: float
    segments: tuple[tuple[float, float], ...]
    spans: tuple[tuple[float, float], ...] = ()

    @property
    def length(self) -> float:
        """Total chord length [m]."""
        return float(sum(b - a for a, b in self.segments))


_crossing = maker(Crossing)  # Crossing(...), for every line on every region


def merge_intervals(
    intervals: Iterable[tuple[float, float]],
) -> list[tuple[float, float]]:
    """Union of intervals, sorted; touching ones (within 1e-9 m) are joined [m]."""
    out: list[list[float]] = []
    for a, b in sorted(intervals):
        if out and a <= out[-1][1] + _EPS:
            out[-1][1] = max(out[-1][1], b)
        else:
            out.append([a, b])
    return [(a, b) for a, b in out]


class RegionProbe:
    """A diaphragm region prepared for probing by many lines (private).

    Holds the outline with its holes filled, the bounds, and each direction's
    distinct slab vertex coordinates across the lines, in ring order.
    """

    __slots__ = ("_edges", "_filled", "bounds", "diaphragm", "wkb")

    def __init__(self, diaphragm: Diaphragm) -> None:
        self.diaphragm = diaphragm
        self.bounds = diaphragm.polygon.bounds
        self.wkb = wkb_of(diaphragm.polygon)
        self._filled: Polygon | None = None
        self._edges: dict[Direction, list[float]] = {}

    @property
    def filled(self) -> Polygon:
        """The outline with its holes filled."""
        if self._filled is None:
            self._filled = Polygon(self.diaphragm.polygon.exterior)
        return self._filled

    def edges(self, direction: Direction) -> list[float]:
        """Distinct vertex coordinates across lines in ``direction`` [m]."""
        if direction not in self._edges:
            xy = shapely.get_coordinates(self.diaphragm.polygon)
            column = xy[:, 1 if direction is Direction.X else 0].tolist()
            self._edges[direction] = list(set(column))
        return self._edges[direction]


def _chords(
    polygon: Polygon,
    bounds: tuple[float, float, float, float],
    direction: Direction,
    offset: float,
) -> list[tuple[float, float]]:
    """Intervals along the line where the line at ``offset`` meets the polygon."""
    x0, y0, x1, y1 = bounds
    if direction is Direction.X:
        probe = [(x0 - 1.0, offset), (x1 + 1.0, offset)]
    else:
        probe = [(offset, y0 - 1.0), (offset, y1 + 1.0)]
    hit = shapely.intersection(polygon, shapely.linestrings(probe))
    k = 0 if direction is Direction.X else 1
    spans = []
    for g in shapely.get_parts(hit).tolist():
        if g.geom_type == "LineString" and g.length > _EPS:
            u = shapely.get_coordinates(g)[:, k].tolist()
            spans.append((min(u), max(u)))
    return merge_intervals(spans)


def _overlapping(
    chords: list[tuple[float, float]], extent: tuple[float, float]
) -> tuple[tuple[float, float], ...]:
    e0, e1 = extent
    return tuple((a, b) for a, b in chords if min(b, e1) - max(a, e0) > _EPS)


def _bridged(
    segments: tuple[tuple[float, float], ...], filled: list[tuple[float, float]]
) -> tuple[tuple[float, float], ...]:
    """Extent of the segments within each chord of the hole-filled outline."""
    out = []
    for a, b in filled:
        inside = [(s, t) for s, t in segments if s >= a - _EPS and t <= b + _EPS]
        if inside:
            out.append((min(s for s, _ in inside), max(t for _, t in inside)))
    return tuple(out)


def line_crossing(
    line: ResistanceLine, diaphragm: Diaphragm, *, tolerance: float
) -> Crossing | None:
    """The chords of a diaphragm region that a line physically cuts, or None.

    Common practice: a line supports the diaphragm over its full crossing of the
    region, collectors carrying the force where the walls are shorter (DESIGN.md 5).

    Args:
        line: The line of resistance.
        diaphragm: One diaphragm region (holes are excluded from the chords).
        tolerance: Largest distance from the line to a slab edge that still counts as
            the line standing at that edge [m] (``line_tolerance``).

    Returns:
        The crossing, or None when the line's walls cut no chord of the region.
    """
    return crossing_on(line, RegionProbe(diaphragm), tolerance)


def region_crossings(
    lines: Sequence[ResistanceLine], diaphragm: Diaphragm, *, tolerance: float
) -> list[Crossing | None]:
    """:func:`line_crossing` of each line on one region (the region prepared once).

    Common practice, as :func:`line_crossing`.

    Args:
        lines: The lines of resistance.
        diaphragm: One diaphragm region.
        tolerance: As for :func:`line_crossing` [m].

    Returns:
        One crossing or None per line, in order.
    """
    region = RegionProbe(diaphragm)
    return [crossing_on(line, region, tolerance) for line in lines]


_Chords = tuple[tuple[float, float], ...]
_CROSSINGS: Memo[tuple[float, _Chords, _Chords] | None] = Memo(4096)


def crossing_on(
    line: ResistanceLine, region: RegionProbe, tolerance: float
) -> Crossing | None:
    """:func:`line_crossing`; from memory for a region and line met before."""
    band = line.offset_range
    values = (line.offset, *line.wall_extent, tolerance, band is None)
    key = (region.wkb, line.direction, float_bytes((*values, *(band or ()))))
    found = _CROSSINGS.get(key, lambda: _cut(line, region, tolerance))
    if found is None:
        return None
    offset, segments, spans = found
    return _crossing(
        diaphragm=region.diaphragm.id, offset=offset, segments=segments, spans=spans
    )


def _cut(
    line: ResistanceLine, region: RegionProbe, tolerance: float
) -> tuple[float, _Chords, _Chords] | None:
    """(offset, segments, spans) of the crossing, or None; see :class:`Crossing`."""
    poly, d, off = region.diaphragm.polygon, line.direction, line.offset
    edges = sorted(region.edges(d), key=lambda v: (abs(v - off), v))
    exact = edges[0] if edges and abs(edges[0] - off) <= _SNAP else off
    near = [v for v in edges if abs(v - off) <= tolerance and v != exact]
    band = _band(line, exact)
    for v in (exact, *near):
        chords = _chords(poly, region.bounds, d, v)
        if v == exact and band:
            # walls slightly off-axis: the line meets the slab over the whole band
            extra = (c for b in band for c in _chords(poly, region.bounds, d, b))
            chords = merge_intervals([*chords, *extra])
        found = _overlapping(chords, line.wall_extent)
        if found:
            filled = _chords(region.filled, region.bounds, d, v)
            return float(v), found, _bridged(found, filled)
    return None


def _band(line: ResistanceLine, exact: float) -> tuple[float, ...]:
    """Extra probe offsets across an off-axis line's width (its piers' end points)."""
    if line.offset_range is None:
        return ()
    lo, hi = line.offset_range
    if hi - lo <= _SNAP:
        return ()
    return tuple(v for v in (lo, hi) if abs(v - exact) > _SNAP)
