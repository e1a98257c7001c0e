"""Tributary loading of diaphragm pieces with the level's located masses (private).

Used by :mod:`allocation.flexible`. Local frame as in :mod:`allocation._pieces`
(u along the lines, v across). A distributed mass item (slab, extra) is spread over
its polygon uniformly; a point item (a wall's tributary weight) sits at its location,
and goes straight to a line when the wall is in that line or lies on its chord.
"""

from __future__ import annotations

import logging
import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from shapely.geometry import Point, Polygon
from shapely.ops import nearest_points, unary_union

from allocation._memo import Memo
from allocation._pieces import Piece, Support, split_region, to_local, to_plan
from allocation.lines import along, perpendicular, region_crossings
from allocation.results import LevelLoad, LineId, MassItem, ResistanceLine
from ifc_bridge.model import Diaphragm, Direction

__all__ = [
    "Slot",
    "host",
    "load_masses",
    "local_uv",
    "make_slots",
    "mass_items",
    "on_line",
]

logger = logging.getLogger(__name__)

ON_LINE = 1e-6  # [m] a mass or point load this close to a chord is on the line
_COVER_TOL = 1e-7  # [m] a mass polygon this close around a piece covers it


@dataclass(slots=True, kw_only=True)
class Slot:
    """A piece being loaded (mutable accumulator, private)."""

    id: str
    region: Diaphragm
    piece: Piece
    plan: Polygon
    weight: float = 0.0
    moment_u: float = 0.0
    moment_v: float = 0.0

    def add(self, w: float, u: float, v: float) -> None:
        self.weight += w
        self.moment_u += w * u
        self.moment_v += w * v


def make_slots(
    regions: Sequence[Diaphragm],
    lines: Sequence[ResistanceLine],
    direction: Direction,
    tol: float,
) -> list[Slot]:
    """Split every region by its lines' chords into pieces, ids ``<region>/<X|Y><n>``.

    Args:
        regions: Diaphragm regions of the level.
        lines: Lines of the level acting in ``direction``.
        direction: Direction of force.
        tol: Line tolerance [m], for lines just off a slab edge.

    Returns:
        Empty accumulators, one per piece, in region then piece order.
    """
    slots = []
    for region in regions:
        supports = [
            Support(line=line.id, v=c.offset, segments=c.segments, spans=c.spans)
            for line, c in zip(
                lines, region_crossings(lines, region, tolerance=tol), strict=True
            )
            if c is not None
        ]
        local = to_local(region.polygon, direction)
        for n, piece in enumerate(split_region(local, supports, tol), start=1):
            slots.append(
                Slot(
                    id=f"{region.id}/{direction.value}{n}",
                    region=region,
                    piece=piece,
                    plan=to_plan(piece.local, direction),
                )
            )
    return slots


def mass_items(
    level: LevelLoad, regions: Sequence[Diaphragm]
) -> tuple[tuple[MassItem, ...], bool]:
    """The level's located masses, else its weight spread uniformly over the regions.

    Returns:
        The items, and False when they are plan areas [m²] standing in for a weight
        that is zero (a given story force on a weightless level: spread by area).
    """
    if math.fsum(m.weight for m in level.masses) > 0.0 or not regions:
        return level.masses, True
    union = unary_union([r.polygon for r in regions])
    physical = level.seismic_weight > 0.0
    logger.info("level %s: no located masses; spread over the diaphragm", level.level)
    c = union.centroid
    item = MassItem(
        source="slab",
        ref=level.level,
        weight=level.seismic_weight if physical else float(union.area),
        location=(c.x, c.y),
        polygon=union,
    )
    return (item,), physical


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
    polygon: Polygon, slots: Sequence[Slot], direction: Direction
) -> list[tuple[Slot, float, tuple[float, float]]]:
    """(piece, area of the polygon in it [m²], local centroid) for each piece.

    A piece the polygon covers (the usual slab item) is taken whole, which avoids
    GEOS round-off on edges shared by the piece and the slab outline. The same
    polygon on the same pieces (a typical floor) is taken from memory.
    """
    key = (polygon.wkb, direction, tuple(slot.plan.wkb for slot in slots))
    shares = _SPREADS.get(key, lambda: _shares(polygon, slots, direction))
    return [(slots[j], area, c) for j, area, c in shares]


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
_PLACES: Memo[tuple[_Place, ...]] = Memo(256)


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


def _point_targets(
    items: Sequence[MassItem],
    slots: Sequence[Slot],
    wall_lines: dict[tuple[str, int], LineId],
    direction: Direction,
) -> list[tuple[LineId | None, tuple[Slot, float, float] | None]]:
    """Where each point item goes: (its line, else its piece and local point).

    The points not in a line of their own are placed geometrically; the same
    points on the same pieces (a typical floor) are placed from memory.
    """
    uv = np.array([item.location for item in items], dtype=np.float64).reshape(-1, 2)
    if direction is not Direction.X:
        uv = uv[:, ::-1]  # as local_uv: (along, across) = (y, x)
    lines = [
        wall_lines.get((item.ref, item.pier_part)) if item.source == "wall" else None
        for item in items
    ]
    spots: list[tuple[Slot, float, float] | None] = [None] * len(items)
    ask = [k for k, line in enumerate(lines) if not line]
    if not ask:
        return list(zip(lines, spots, strict=True))
    pick = uv[np.array(ask)]
    key = (_slots_key(slots), pick.tobytes())
    placed = _PLACES.get(key, lambda: _place(pick[:, 0], pick[:, 1], slots))
    for n, (k, (j, s, u, v, off)) in enumerate(zip(ask, placed, strict=True)):
        lines[k] = slots[j].piece.supports[s].line if s >= 0 else None
        if s < 0 and j >= 0:
            spots[k] = (slots[j], u, v)
            if off:
                pu, pv = pick[n].tolist()
                logger.debug(
                    "point (%s, %s) off the diaphragm: placed on %s",
                    pu,
                    pv,
                    slots[j].id,
                )
    return list(zip(lines, spots, strict=True))


def _slots_key(slots: Sequence[Slot]) -> tuple[tuple[bytes, str], ...]:
    return tuple(
        (
            slot.piece.local.wkb,
            repr(tuple((s.v, s.segments) for s in slot.piece.supports)),
        )
        for slot in slots
    )


def load_masses(
    items: Sequence[MassItem],
    slots: Sequence[Slot],
    wall_lines: dict[tuple[str, int], LineId],
    direction: Direction,
) -> tuple[dict[LineId, float], float]:
    """Spread mass items onto the pieces (uniform over polygons; points at location).

    A distributed item is shared by the area of its polygon in each piece
    (normalised by their sum, so no weight is lost where it overhangs the regions);
    a point item of a wall in a line of this direction (``wall_lines``) or on a
    chord goes straight to that line; a point off
    every piece goes to the nearest piece, at the nearest point of it.

    Returns:
        Weight sent straight to each line [N], and weight with no region at all [N].
    """
    parts = [
        [] if item.polygon is None else _spread(item.polygon, slots, direction)
        for item in items
    ]
    bases = [math.fsum(area for _, area, _ in p) for p in parts]
    points = [i for i, base in enumerate(bases) if not base > 0.0]
    where = dict(
        zip(
            points,
            _point_targets([items[i] for i in points], slots, wall_lines, direction),
            strict=True,
        )
    )
    direct: dict[LineId, float] = {}
    lost = 0.0
    for i, item in enumerate(items):
        if bases[i] > 0.0:
            for slot, area, (u, v) in parts[i]:
                slot.add(item.weight * area / bases[i], u, v)
            continue
        line, spot = where[i]
        if line is not None:
            direct[line] = direct.get(line, 0.0) + item.weight
        elif spot is not None:
            slot, u, v = spot
            slot.add(item.weight, u, v)
        else:
            lost += item.weight
    return direct, lost
