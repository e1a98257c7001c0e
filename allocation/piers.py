"""Shear-wall piers: the full-height pieces of each shear wall segment.

A wall with openings resists in-plane shear through the full-height pieces beside its
openings (common practice: the segmented shear wall approach, in which only full-height
segments count). Every opening interrupts the full height, whatever its sill and head,
so each opening interval along the centreline splits the wall.

Axes: plan X-Y [m]. A pier runs from ``start`` to ``end`` in the direction of its wall's
centreline. A pier's direction is the direction of force it resists (X for a wall
parallel to X).
"""

from __future__ import annotations

import logging
import math
from collections.abc import Sequence

from allocation.parameters import AnalysisOptions
from allocation.results import Condition, ConditionKind, Pier
from ifc_bridge.model import Direction, WallSegment

__all__ = ["MIN_PIER_LENGTH", "make_piers", "pier_id", "wall_direction"]

logger = logging.getLogger(__name__)

MIN_PIER_LENGTH = 0.05
"""Shortest full-height piece counted as a pier [m]; shorter slivers are wall ends that
the openings' framing covers (common practice)."""


def pier_id(guid: str, level: str, part: int, pier: int) -> str:
    """Pier id ``"<guid>|<level>|<part>|<pier>"`` (see :mod:`allocation.results`)."""
    return f"{guid}|{level}|{part}|{pier}"


def wall_direction(angle: float, tolerance: float) -> Direction | None:
    """Direction of force a wall at ``angle`` resists, or None when skewed.

    Common practice: a wall resists force parallel to its plane only.

    Args:
        angle: Centreline angle from +X, counter-clockwise, in [0, pi) [rad].
        tolerance: Angle within which a wall counts as parallel to an axis [rad].

    Returns:
        ``Direction.X``, ``Direction.Y`` or None.
    """
    a = angle % math.pi
    if min(a, math.pi - a) <= tolerance:
        return Direction.X
    if abs(a - math.pi / 2.0) <= tolerance:
        return Direction.Y
    return None


def _solid_intervals(wall: WallSegment) -> list[tuple[float, float]]:
    """Full-height intervals along the centreline, from ``start`` [m]."""
    length = wall.length
    cuts = sorted(
        (max(0.0, o.start), min(length, o.end))
        for o in wall.openings
        if o.end > 0.0 and o.start < length
    )
    merged: list[list[float]] = []
    for a, b in cuts:
        if merged and a <= merged[-1][1]:
            merged[-1][1] = max(merged[-1][1], b)
        else:
            merged.append([a, b])
    solid, pos = [], 0.0
    for a, b in merged:
        solid.append((pos, a))
        pos = b
    solid.append((pos, length))
    return [(a, b) for a, b in solid if b - a >= MIN_PIER_LENGTH]


def _point_at(wall: WallSegment, s: float) -> tuple[float, float]:
    t = s / wall.length
    return (
        wall.start[0] + t * (wall.end[0] - wall.start[0]),
        wall.start[1] + t * (wall.end[1] - wall.start[1]),
    )


def _wall_piers(wall: WallSegment, direction: Direction | None) -> list[Pier]:
    return [
        Pier(
            id=pier_id(wall.guid, wall.level, wall.part, n),
            guid=wall.guid,
            name=wall.name,
            pier=n,
            part=wall.part,
            level=wall.level,
            storey=wall.storey,
            direction=direction,
            start=_point_at(wall, a),
            end=_point_at(wall, b),
            height=wall.height,
            thickness=wall.thickness,
            assembly=wall.assembly,
        )
        for n, (a, b) in enumerate(_solid_intervals(wall))
    ]


def make_piers(
    walls: Sequence[WallSegment], options: AnalysisOptions
) -> tuple[tuple[Pier, ...], tuple[Condition, ...]]:
    """Split every shear wall segment that supports a diaphragm into full-height piers.

    Common practice: the full-height pieces beside openings resist the shear (segmented
    shear walls); pieces shorter than ``MIN_PIER_LENGTH`` are not piers. Walls that are
    not shear walls, or support no diaphragm (``level == ""``), are skipped.

    Args:
        walls: Wall segments of the model (any mix of shear and other walls).
        options: Analysis options; ``angle_tolerance`` [rad] sets X / Y / skewed.

    Returns:
        The piers in wall order (stiffness 0, no line yet), and the conditions: a
        skewed wall (``SKEWED_WALL``; its piers have direction None and are not
        allocated) and a wall whose openings leave no pier (``NO_PIER``).
    """
    piers: list[Pier] = []
    conditions: list[Condition] = []
    for wall in walls:
        if not wall.is_shear_wall or not wall.level:
            continue
        direction = wall_direction(wall.angle, options.angle_tolerance)
        if direction is None:
            conditions.append(_skewed(wall, options.angle_tolerance))
        found = _wall_piers(wall, direction)
        if not found:
            conditions.append(_no_pier(wall, direction))
        piers.extend(found)
    return tuple(piers), tuple(conditions)


def _skewed(wall: WallSegment, tolerance: float) -> Condition:
    detail = (
        f"shear wall {wall.guid} ({wall.name!r}) at {math.degrees(wall.angle):.1f} deg "
        f"is beyond {math.degrees(tolerance):.1f} deg of X and Y; it is not allocated "
        "(align it with a plan axis or widen analysis.angle_tolerance)"
    )
    return Condition(
        kind=ConditionKind.SKEWED_WALL,
        level=wall.level,
        direction=None,
        guids=(wall.guid,),
        detail=detail,
        value=wall.length,
    )


def _no_pier(wall: WallSegment, direction: Direction | None) -> Condition:
    widths = ", ".join(f"{o.width:.3f} m" for o in wall.openings)
    why = f"openings ({widths}) leave" if wall.openings else "it is too short for"
    detail = (
        f"shear wall {wall.guid} ({wall.name!r}, {wall.length:.3f} m): {why} "
        f"no full-height pier of {MIN_PIER_LENGTH} m or more; it resists no shear"
    )
    logger.debug(detail)
    guids = tuple(sorted({wall.guid, *(o.guid for o in wall.openings)}))
    return Condition(
        kind=ConditionKind.NO_PIER,
        level=wall.level,
        direction=direction,
        guids=guids,
        detail=detail,
        value=wall.length,
    )
