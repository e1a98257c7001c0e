"""Tributary loading of diaphragm pieces with the level's located masses (private).

Used by :mod:`allocation.flexible`. Local frame as in :mod:`allocation._pieces`
(u along the lines, v across). A distributed mass item (slab, extra) is spread over
its polygon uniformly; a point item (a wall's tributary weight) sits at its location,
and goes straight to a line when the wall is in that line or lies on its chord.
"""

from __future__ import annotations

import logging
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
    slots = []
    for region in regions:
        supports = []
        for line in lines:
            c = line_crossing(line, region, tolerance=tol)
            if c is not None:
                supports.append(Support(line=line.id, v=c.offset, segments=c.segments))
        local = to_local(region.polygon, direction)
        for n, piece in enumerate(split_region(local, supports), start=1):
            slots.append(
                Slot(
                    id=f"{region.id}/{direction.value}{n}",
                    region=region,
                    piece=piece,
                    plan=to_plan(piece.local, direction),
                )
            )
    return slots


def mass_items(level: LevelLoad, regions: Sequence[Diaphragm]) -> tuple[MassItem, ...]:
    if level.masses:
        return level.masses
    logger.info(
        "level %s: no located masses; weight spread over the diaphragm", level.level
    )
    if not regions:
        return ()
    union = unary_union([r.polygon for r in regions])
    c = union.centroid
    return (
        MassItem(
            source="slab",
            ref=level.level,
            weight=level.seismic_weight,
            location=(c.x, c.y),
            polygon=union,
        ),
    )


def on_line(u: float, v: float, slots: Sequence[Slot]) -> LineId | None:
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
    return along(point, direction), perpendicular(point, direction)


def load_masses(
    items: Sequence[MassItem],
    slots: Sequence[Slot],
    wall_lines: dict[tuple[str, int], LineId],
    direction: Direction,
) -> tuple[dict[LineId, float], float]:
    """Spread mass items onto pieces; return weight sent straight to lines, and lost."""
    direct: dict[LineId, float] = {}
    lost = 0.0
    union = unary_union([s.region.polygon for s in slots]) if slots else None
    for item in items:
        base = 0.0
        if item.polygon is not None and union is not None:
            base = item.polygon.intersection(union).area
        if base > 0.0:
            for slot in slots:
                part = slot.plan.intersection(item.polygon)
                if part.area > 0.0:
                    c = to_local(part, direction).centroid
                    slot.add(item.weight * part.area / base, c.x, c.y)
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
