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

from shapely.geometry import Point, Polygon
from shapely.ops import nearest_points, unary_union

from allocation._pieces import Piece, Support, split_region, to_local, to_plan
from allocation.lines import along, line_crossing, perpendicular
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
        supports = []
        for line in lines:
            c = line_crossing(line, region, tolerance=tol)
            if c is not None:
                supports.append(
                    Support(
                        line=line.id, v=c.offset, segments=c.segments, spans=c.spans
                    )
                )
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
    GEOS round-off on edges shared by the piece and the slab outline.
    """
    grown = polygon.buffer(_COVER_TOL)
    out = []
    for slot in slots:
        if not grown.intersects(slot.plan):
            continue
        part = slot.plan if grown.covers(slot.plan) else polygon.intersection(slot.plan)
        if part.area > 0.0:
            c = (
                slot.piece.local.centroid
                if part is slot.plan
                else to_local(part, direction).centroid
            )
            out.append((slot, float(part.area), (float(c.x), float(c.y))))
    return out


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
    direct: dict[LineId, float] = {}
    lost = 0.0
    for item in items:
        parts = [] if item.polygon is None else _spread(item.polygon, slots, direction)
        base = math.fsum(area for _, area, _ in parts)
        if base > 0.0:
            for slot, area, (u, v) in parts:
                slot.add(item.weight * area / base, u, v)
            continue
        u, v = local_uv(item.location, direction)
        line = (
            wall_lines.get((item.ref, item.pier_part))
            if item.source == "wall"
            else None
        )
        line = line or on_line(u, v, slots)
        if line is not None:
            direct[line] = direct.get(line, 0.0) + item.weight
        elif slots:
            slot, u, v = host(u, v, slots)
            slot.add(item.weight, u, v)
        else:
            lost += item.weight
    return direct, lost
