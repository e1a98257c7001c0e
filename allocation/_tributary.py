"""Tributary loading of diaphragm pieces with the level's located masses (private).

Used by :mod:`allocation.flexible` and :mod:`allocation._loading`. Local frame as in :mod:`allocation._pieces`
(u along the lines, v across). A distributed mass item (slab, extra) is spread over
its polygon uniformly; a point item (a wall's tributary weight) sits at its location,
and goes straight to a line when the wall is in that line or lies on its chord.
"""

from __future__ import annotations

import logging
from collections.abc import Hashable, Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from shapely.geometry import Point, Polygon
from shapely.ops import nearest_points

from allocation._memo import Memo, float_bytes, wkb_of
from allocation._pieces import (
    Piece,
    Support,
    split_key,
    split_region,
    to_local,
    to_plan,
)
from allocation._records import maker
from allocation.lines import along, perpendicular, region_crossings
from allocation.results import LineId, ResistanceLine
from ifc_bridge.model import Diaphragm, Direction

__all__ = [
    "Slot",
    "host",
    "local_uv",
    "make_slots",
    "on_line",
]

logger = logging.getLogger(__name__)

_support, _piece = maker(Support), maker(Piece)  # for every level's pieces

ON_LINE = 1e-6  # [m] a mass or point load this close to a chord is on the line
_COVER_TOL = 1e-7  # [m] a mass polygon this close around a piece covers it


@dataclass(slots=True, kw_only=True)
class Slot:
    """A piece being loaded (mutable accumulator, private).

    ``key`` names the piece's geometry exactly, whatever the level: the
    ``split_key`` of its region's split and its place in it (None: unknown).
    """

    id: str
    region: Diaphragm
    piece: Piece
    plan: Polygon
    weight: float = 0.0
    moment_u: float = 0.0
    moment_v: float = 0.0
    key: tuple | None = None

    def add(self, w: float, u: float, v: float) -> None:
        self.weight += w
        self.moment_u += w * u
        self.moment_v += w * v


_PLANS: Memo[tuple[Polygon, ...]] = Memo(256)

# What make_slots makes of a typical floor, by the exact numbers it reads (the regions'
# outlines, the lines' offsets, extents and offset ranges, the tolerance): per region,
# its supports as (line index, v, segments, spans) and its pieces as (local outline,
# indices of their supports, plan outline, split key).
_Layout = tuple[
    tuple[
        tuple[tuple[int, float, tuple, tuple], ...],
        tuple[tuple[Polygon, tuple[int, ...], Polygon, Hashable], ...],
    ],
    ...,
]
_LAYOUTS: Memo[_Layout] = Memo(64)


def make_slots(
    regions: Sequence[Diaphragm],
    lines: Sequence[ResistanceLine],
    direction: Direction,
    tol: float,
) -> list[Slot]:
    """Split every region by its lines' chords into pieces, ids ``<region>/<X|Y><n>``.

    A typical floor (the same outlines and lines, to the bit, whatever the lines are
    called) is laid out from memory.

    Args:
        regions: Diaphragm regions of the level.
        lines: Lines of the level acting in ``direction``.
        direction: Direction of force.
        tol: Line tolerance [m], for lines just off a slab edge.

    Returns:
        Empty accumulators, one per piece, in region then piece order.
    """
    numbers = [tol, len(lines)]
    for ln in lines:
        band = ln.offset_range
        numbers += (ln.offset, *ln.wall_extent, band is None, *(band or ()))
    key = (
        direction,
        float_bytes(numbers),
        tuple(wkb_of(region.polygon) for region in regions),
    )
    layout = _LAYOUTS.get(key, lambda: _layout(regions, lines, direction, tol))
    slots = []
    for region, (found, cells) in zip(regions, layout, strict=True):
        supports = [
            _support(line=lines[i].id, v=v, segments=segments, spans=spans)
            for i, v, segments, spans in found
        ]
        for n, (local, touching, plan, split) in enumerate(cells, start=1):
            slots.append(
                Slot(
                    id=f"{region.id}/{direction.value}{n}",
                    region=region,
                    piece=_piece(
                        local=local, supports=tuple(supports[j] for j in touching)
                    ),
                    plan=plan,
                    key=(split, n),
                )
            )
    return slots


def _layout(
    regions: Sequence[Diaphragm],
    lines: Sequence[ResistanceLine],
    direction: Direction,
    tol: float,
) -> _Layout:
    """:func:`make_slots` worked out, by line and support index."""
    out = []
    for region in regions:
        found = [
            (i, c)
            for i, c in enumerate(region_crossings(lines, region, tolerance=tol))
            if c is not None
        ]
        supports = [
            Support(line=lines[i].id, v=c.offset, segments=c.segments, spans=c.spans)
            for i, c in found
        ]
        local = to_local(region.polygon, direction)
        key = split_key(local, supports, tol)
        pieces = split_region(local, supports, tol, key=key)
        plans = _PLANS.get(
            (key, direction),
            lambda pieces=pieces: tuple(to_plan(p.local, direction) for p in pieces),
        )
        index = {id(s): j for j, s in enumerate(supports)}
        cells = tuple(
            (piece.local, tuple(index[id(s)] for s in piece.supports), plan, key)
            for piece, plan in zip(pieces, plans, strict=True)
        )
        numbers = tuple(
            (i, s.v, s.segments, s.spans)
            for (i, _), s in zip(found, supports, strict=True)
        )
        out.append((numbers, cells))
    return tuple(out)


def on_line(u: float, v: float, slots: Sequence[Slot]) -> LineId | None:
    """The line whose chord passes through the local point (within ``ON_LINE``)."""
    for slot in slots:
        for s in slot.piece.supports:
            if abs(v - s.v) <= ON_LINE and any(
                a - ON_LINE <= u <= b + ON_LINE for a, b in s.segments
            ):
                return s.line
    return None


def host(u: float, v: float, slots: Sequence[Slot]) -> tuple[Slot, float, float]:
    """The piece containing the local point, else the nearest one and its point."""
    pt = Point(u, v)
    for slot in slots:
        if slot.piece.local.covers(pt):
            return slot, u, v
    slot = min(slots, key=lambda s: s.piece.local.distance(pt))
    q = nearest_points(slot.piece.local, pt)[0]
    logger.debug("point (%s, %s) off the diaphragm: placed on %s", u, v, slot.id)
    return slot, float(q.x), float(q.y)


def local_uv(point: tuple[float, float], direction: Direction) -> tuple[float, float]:
    """Plan point in the local frame: (along, across) the lines [m]."""
    return along(point, direction), perpendicular(point, direction)


def _spread(
    polygon: Polygon,
    slots: Sequence[Slot],
    direction: Direction,
    slots_key: Hashable | None = None,
) -> list[tuple[Slot, float, tuple[float, float]]]:
    """(piece, area of the polygon in it [m²], local centroid) for each piece.

    A piece the polygon covers (the usual slab item) is taken whole, which avoids
    GEOS round-off on edges shared by the piece and the slab outline. The same
    polygon on the same pieces (a typical floor) is taken from memory.
    """
    shares = _spread_shares(polygon, slots, direction, slots_key)
    return [(slots[j], area, c) for j, area, c in shares]


def _spread_shares(
    polygon: Polygon,
    slots: Sequence[Slot],
    direction: Direction,
    slots_key: Hashable | None = None,
) -> tuple[tuple[int, float, tuple[float, float]], ...]:
    """:func:`_spread` with piece indices; from memory for a typical floor."""
    if slots_key is None:
        slots_key = _slots_key(slots)
    key = (wkb_of(polygon), direction, slots_key)
    return _SPREADS.get(key, lambda: _shares(polygon, slots, direction))


def _shares(
    polygon: Polygon, slots: Sequence[Slot], direction: Direction
) -> tuple[tuple[int, float, tuple[float, float]], ...]:
    grown = polygon.buffer(_COVER_TOL)
    out = []
    for j, slot in enumerate(slots):
        if not grown.intersects(slot.plan):
            continue
        part = slot.plan if grown.covers(slot.plan) else polygon.intersection(slot.plan)
        if part.area > 0.0:
            c = (
                slot.piece.local.centroid
                if part is slot.plan
                else to_local(part, direction).centroid
            )
            out.append((j, float(part.area), (float(c.x), float(c.y))))
    return tuple(out)


# (piece index or -1, support index or -1, local point u, v [m], off every piece)
_Place = tuple[int, int, float, float, bool]
_SPREADS: Memo[tuple[tuple[int, float, tuple[float, float]], ...]] = Memo(256)
# _place() of the same points on the same pieces, as arrays (allocation._loading)
_PLACES: Memo[tuple[np.ndarray, ...]] = Memo(256)


def _on_lines(
    u: np.ndarray, v: np.ndarray, slots: Sequence[Slot]
) -> list[tuple[int, int] | None]:
    """:func:`on_line` of many local points: (piece, support) indices, the same
    search order."""
    found: list[tuple[int, int] | None] = [None] * len(u)
    todo = np.ones(len(u), dtype=bool)
    for j, slot in enumerate(slots):
        for k, s in enumerate(slot.piece.supports):
            near = todo & (np.abs(v - s.v) <= ON_LINE)
            if not near.any():
                continue
            inside = np.zeros(len(u), dtype=bool)
            for a, b in s.segments:
                inside |= (a - ON_LINE <= u) & (u <= b + ON_LINE)
            hit = near & inside
            for i in np.flatnonzero(hit).tolist():
                found[i] = (j, k)
            todo &= ~hit
    return found


def _hosts(u: np.ndarray, v: np.ndarray, slots: Sequence[Slot]) -> list[_Place]:
    """:func:`host` of many local points at once (the same search order)."""
    out: list[_Place | None] = [None] * len(u)
    todo = np.ones(len(u), dtype=bool)
    points = shapely.points(u, v)
    for j, slot in enumerate(slots):
        idx = np.flatnonzero(todo)
        if idx.size == 0:
            break
        idx = idx[shapely.covers(slot.piece.local, points[idx])]
        for i in idx.tolist():
            out[i] = (j, -1, float(u[i]), float(v[i]), False)
        todo[idx] = False
    rest = np.flatnonzero(todo)
    if rest.size:  # off every piece: the nearest one (the first of equals)
        polys = np.array([slot.piece.local for slot in slots], dtype=object)
        off = points[rest]
        best = np.argmin(shapely.distance(polys[np.newaxis, :], off[:, np.newaxis]), 1)
        near = shapely.get_coordinates(shapely.shortest_line(polys[best], off))
        for k, (i, j) in enumerate(zip(rest.tolist(), best.tolist(), strict=True)):
            qu, qv = near[2 * k].tolist()
            out[i] = (j, -1, qu, qv, True)
    return out  # type: ignore[return-value]


def _place(u: np.ndarray, v: np.ndarray, slots: Sequence[Slot]) -> tuple[_Place, ...]:
    """Each local point on a chord (its support), else in (or nearest to) a piece."""
    on = _on_lines(u, v, slots)
    free = [i for i, hit in enumerate(on) if hit is None]
    nan = float("nan")
    out: list[_Place] = [
        (-1, -1, nan, nan, False) if hit is None else (*hit, nan, nan, False)
        for hit in on
    ]
    if free and slots:
        pick = np.array(free)
        for i, spot in zip(free, _hosts(u[pick], v[pick], slots), strict=True):
            out[i] = spot
    return tuple(out)


def _slots_key(slots: Sequence[Slot]) -> Hashable:
    """Exact identity of the pieces' geometry and supports, for the memos."""
    keys = tuple(slot.key for slot in slots)
    if None not in keys:
        return keys
    return tuple(
        (
            wkb_of(slot.piece.local),
            repr(tuple((s.v, s.segments) for s in slot.piece.supports)),  # rare path
        )
        for slot in slots
    )
