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
from itertools import pairwise

import shapely
from shapely.geometry import LineString, MultiLineString, Polygon
from shapely.geometry.base import BaseGeometry
from shapely.ops import split

from ifc_bridge.model import Direction

__all__ = ["Piece", "Support", "split_region", "to_local", "to_plan"]

_EPS = 1e-6  # [m] contact tolerance between a piece edge and a line
_MIN_AREA = 1e-9  # [m²] slivers from round-off are dropped


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


def _contact(piece: Polygon, support: Support) -> list[tuple[float, float]]:
    """Intervals in u where an edge of the piece lies on the support's chords."""
    spans = []
    for ring in (piece.exterior, *piece.interiors):
        c = list(ring.coords)
        for (u0, v0), (u1, v1) in pairwise(c):
            if abs(v0 - support.v) > _EPS or abs(v1 - support.v) > _EPS:
                continue
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


def _meets(piece: Polygon, support: Support) -> bool:
    """The support's chords run along the piece's edge or into it (a slit)."""
    if _contact(piece, support):
        return True
    return any(
        piece.intersection(LineString([(a, support.v), (b, support.v)])).length > _EPS
        for a, b in support.segments
    )


def _cut_across(
    piece: Polygon, supports: Sequence[Support], tol: float = _EPS
) -> list[Polygon]:
    u0, v0, u1, v1 = piece.bounds
    ends = sorted(
        {
            e
            for s in supports
            if _meets(piece, s)
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
    return _polygons(split(piece, cuts))


def _split_by_chords(poly: Polygon, supports: Sequence[Support]) -> list[Polygon]:
    chords = [
        [(a - _EPS, s.v), (b + _EPS, s.v)] for s in supports for a, b in s.segments
    ]
    return _polygons(split(poly, MultiLineString(chords))) if chords else [poly]


def split_region(
    local: Polygon, supports: Sequence[Support], tol: float = _EPS
) -> list[Piece]:
    """Split one region (local frame) by its lines' chords into spanning pieces.

    Common practice: each piece spans as a simple beam between the lines at its
    edges (DESIGN.md item 6). The chords split the region; pieces are cut across
    where a line's support ends; the chords split them again (a chord that ended at
    an opening only separates the region once it is cut across there).

    Args:
        local: Region outline in the local frame, holes kept [m].
        supports: The lines' chords on this region.
        tol: Line tolerance [m]: support ends closer than this to the region's
            edge do not cut it across.

    Returns:
        The pieces, ordered by centroid (v, then u), with their supports.
    """
    pieces = []
    for p in _split_by_chords(local, supports):
        for q in _cut_across(p, supports, tol):
            for r in _split_by_chords(q, supports):
                touching = tuple(
                    sorted((s for s in supports if _contact(r, s)), key=lambda s: s.v)
                )
                pieces.append(Piece(local=r, supports=touching))
    pieces.sort(
        key=lambda p: (round(p.local.centroid.y, 9), round(p.local.centroid.x, 9))
    )
    return pieces
