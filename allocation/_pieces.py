"""Splitting a diaphragm region into pieces that span between lines (flexible method).

Works in a local frame in which the lines are horizontal: for force in X the lines of
X walls run along x at y = offset, so the local frame is the plan itself; for force in
Y the coordinates are swapped, (u, v) = (y, x). ``u`` runs along the lines and ``v``
across them, which is the direction the diaphragm spans.

Two cuts make the pieces. First, each line's chords (the crossings its walls cut) split
the region. Second, where a line's support ends (at a re-entrant corner, a notch, or an
opening it stops at) inside the u-range of a piece it touches, the piece is cut across
(at u = that end): the part beyond has no such line at its edge. A gap in a line's
chords at an interior opening it continues past (a stair) is not an end: the
diaphragm spans around the opening. After
both cuts every piece spans in v between the line below and the line above (or one,
or none), as a simple beam (common practice).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from shapely.geometry import MultiLineString, Polygon
from shapely.geometry.base import BaseGeometry
from shapely.ops import split

from allocation._memo import Memo, float_bytes, wkb_of
from ifc_bridge.model import Direction

__all__ = ["Piece", "Support", "split_key", "split_region", "to_local", "to_plan"]

_EPS = 1e-6  # [m] contact tolerance between a piece edge and a line
_MIN_AREA = 1e-9  # [m²] slivers from round-off are dropped
_PAD = 1e-3  # [m] margin of the bounds pre-tests (far above _EPS and round-off)


@dataclass(frozen=True, slots=True, kw_only=True)
class Support:
    """A line's chords on one region, in the local frame.

    Attributes:
        line: Line id.
        v: Local across-coordinate of the chords [m].
        segments: Chords as (u0, u1) [m].
        spans: The segments with gaps at interior openings bridged; pieces are cut
            across where they end (``segments`` when empty) [m].
    """

    line: str
    v: float
    segments: tuple[tuple[float, float], ...]
    spans: tuple[tuple[float, float], ...] = ()


@dataclass(frozen=True, slots=True, kw_only=True)
class Piece:
    """A piece in the local frame and the lines along its edges.

    Attributes:
        local: Outline in the local frame [m].
        supports: Lines touching the piece over a length, sorted by ``v``.
    """

    local: Polygon
    supports: tuple[Support, ...]


def _swap(coords):  # (n, 2) array of x, y -> y, x
    return coords[:, ::-1]


def to_local(geom: BaseGeometry, direction: Direction) -> BaseGeometry:
    """Plan geometry in the local frame of ``direction`` (swap x, y for Y)."""
    return geom if direction is Direction.X else shapely.transform(geom, _swap)


def to_plan(geom: BaseGeometry, direction: Direction) -> BaseGeometry:
    """Local geometry back in plan (the swap is its own inverse)."""
    return to_local(geom, direction)


def _polygons(geom: BaseGeometry) -> list[Polygon]:
    parts = getattr(geom, "geoms", [geom])
    return [g for g in parts if g.geom_type == "Polygon" and g.area > _MIN_AREA]


def _split(poly: Polygon, lines: BaseGeometry) -> list[Polygon]:
    """The pieces of ``poly`` cut by ``lines``, slivers dropped.

    ``shapely.ops.split`` of a polygon (its GEOS < 3.15 method: the cells of the
    boundary noded with the lines, kept where the polygon contains a point of
    them), in vectorised calls; with GEOS >= 3.15 that function itself.
    """
    if shapely.geos_version >= (3, 15, 0):
        return _polygons(split(poly, lines))
    noded = shapely.get_parts(shapely.union(poly.boundary, lines))
    cells = shapely.get_parts(shapely.polygonize(noded))
    shapely.prepare(poly)
    inside = shapely.contains(poly, shapely.point_on_surface(cells))
    keep = inside & (shapely.area(cells) > _MIN_AREA)
    return [g for g in cells[keep].tolist() if g.geom_type == "Polygon"]


class _Outline:
    """A polygon's edges as coordinate arrays, for repeated support tests (private).

    ``edges`` rows are (u0, v0, u1, v1), the exterior's edges then each hole's, in
    ring order, as the rings' coordinates give them.
    """

    __slots__ = ("edges", "polygon", "umax", "umin", "vmax", "vmin")

    def __init__(self, polygon: Polygon) -> None:
        self.polygon = polygon
        if shapely.get_num_interior_rings(polygon) == 0:
            xy = shapely.get_coordinates(polygon)
            self.edges = np.column_stack((xy[:-1], xy[1:]))
        else:  # no edge from one ring's last point to the next ring's first
            xy, ring = shapely.get_coordinates(
                shapely.get_rings(polygon), return_index=True
            )
            same = ring[1:] == ring[:-1]
            self.edges = np.column_stack((xy[:-1], xy[1:]))[same]
        self.umin, self.vmin, self.umax, self.vmax = polygon.bounds

    def reaches(self, support: Support) -> bool:
        """False when the support's v is clear of the outline's v-range."""
        return self.vmin - _PAD <= support.v <= self.vmax + _PAD


def _contact(outline: _Outline, support: Support) -> list[tuple[float, float]]:
    """Intervals in u where an edge of the piece lies on the support's chords."""
    if not outline.reaches(support):
        return []
    e, v = outline.edges, support.v
    on = (np.abs(e[:, 1] - v) <= _EPS) & (np.abs(e[:, 3] - v) <= _EPS)
    spans = []
    for u0, _, u1, _ in e[on].tolist():
        a, b = min(u0, u1), max(u0, u1)
        for s0, s1 in support.segments:
            lo, hi = max(a, s0), min(b, s1)
            if hi - lo > _EPS:
                spans.append((lo, hi))
    spans.sort()
    merged: list[list[float]] = []
    for a, b in spans:
        if merged and a <= merged[-1][1] + _EPS:
            merged[-1][1] = max(merged[-1][1], b)
        else:
            merged.append([a, b])
    return [(a, b) for a, b in merged]


def _meets(outline: _Outline, support: Support) -> bool:
    """The support's chords run along the piece's edge or into it (a slit)."""
    if not outline.reaches(support):
        return False
    if _contact(outline, support):
        return True
    near = [
        [(a, support.v), (b, support.v)]
        for a, b in support.segments
        if a <= outline.umax + _PAD and b >= outline.umin - _PAD
    ]
    if not near:
        return False
    cut = shapely.intersection(outline.polygon, shapely.linestrings(near))
    return bool((shapely.length(cut) > _EPS).any())


def _cut_across(
    piece: Polygon, supports: Sequence[Support], tol: float = _EPS
) -> list[Polygon]:
    u0, v0, u1, v1 = piece.bounds
    outline = _Outline(piece)
    ends = sorted(
        {
            e
            for s in supports
            if _meets(outline, s)
            for span in (s.spans or s.segments)
            for e in span
        }
    )
    # a support ending within the line tolerance of the piece's edge reaches it (a
    # slab edge a few cm off square); cutting there would only make slivers
    ends = [e for e in ends if u0 + tol < e < u1 - tol]
    if not ends:
        return [piece]
    cuts = MultiLineString([[(e, v0 - 1.0), (e, v1 + 1.0)] for e in ends])
    return _split(piece, cuts)


def _chord_lines(supports: Sequence[Support]) -> BaseGeometry | None:
    """All the supports' chords as one splitter, each a little longer than its chord."""
    chords = [
        [(a - _EPS, s.v), (b + _EPS, s.v)] for s in supports for a, b in s.segments
    ]
    if not chords:
        return None
    return shapely.multilinestrings(shapely.linestrings(np.array(chords)))


def _split_by_chords(poly: Polygon, chords: BaseGeometry | None) -> list[Polygon]:
    return [poly] if chords is None else _split(poly, chords)


def split_key(
    local: Polygon, supports: Sequence[Support], tol: float = _EPS
) -> tuple[bytes, bytes]:
    """What :func:`split_region` depends on, exactly: outline, tolerance and chords."""
    flat = [tol, len(supports)]
    for s in supports:
        flat += (s.v, len(s.segments), *(c for ab in s.segments for c in ab))
        flat += (len(s.spans), *(c for ab in s.spans for c in ab))
    return (wkb_of(local), float_bytes(flat))


def split_region(
    local: Polygon,
    supports: Sequence[Support],
    tol: float = _EPS,
    *,
    key: tuple[bytes, bytes] | None = None,
) -> list[Piece]:
    """Split one region (local frame) by its lines' chords into spanning pieces.

    Common practice: each piece spans as a simple beam between the lines at its
    edges (DESIGN.md item 6). The chords split the region; pieces are cut across
    where a line's support ends; the chords split them again (a chord that ended at
    an opening only separates the region once it is cut across there).

    A region and chords already split (the same outline and chords on a typical
    floor, whatever the lines are called) are taken from memory.

    Args:
        local: Region outline in the local frame, holes kept [m].
        supports: The lines' chords on this region.
        tol: Line tolerance [m]: support ends closer than this to the region's
            edge do not cut it across.
        key: ``split_key(local, supports, tol)`` when the caller has it already.

    Returns:
        The pieces, ordered by centroid (v, then u), with their supports.
    """
    if key is None:
        key = split_key(local, supports, tol)
    cells = _SPLITS.get(key, lambda: _split_region(local, supports, tol))
    return [
        Piece(local=poly, supports=tuple(supports[i] for i in touching))
        for poly, touching in cells
    ]


_SPLITS: Memo[tuple[tuple[Polygon, tuple[int, ...]], ...]] = Memo(256)


def _split_region(
    local: Polygon, supports: Sequence[Support], tol: float
) -> tuple[tuple[Polygon, tuple[int, ...]], ...]:
    """The pieces of :func:`split_region`, each with its supports' indices."""
    pieces = []
    chords = _chord_lines(supports)
    for p in _split_by_chords(local, chords):
        for q in _cut_across(p, supports, tol):
            for r in _split_by_chords(q, chords):
                outline = _Outline(r)
                touching = sorted(
                    (i for i, s in enumerate(supports) if _contact(outline, s)),
                    key=lambda i: supports[i].v,
                )
                pieces.append((r, tuple(touching)))
    pieces.sort(key=lambda p: (round(p[0].centroid.y, 9), round(p[0].centroid.x, 9)))
    return tuple(pieces)
