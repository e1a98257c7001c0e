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
from itertools import repeat
from operator import attrgetter

import numpy as np

from allocation._columns import ends as end_points
from allocation._columns import floats, points
from allocation._records import maker, records
from allocation.parameters import AnalysisOptions
from allocation.results import Condition, ConditionKind, Pier
from ifc_bridge.model import Direction, WallSegment

__all__ = ["MIN_PIER_LENGTH", "make_piers", "pier_id", "wall_direction"]

logger = logging.getLogger(__name__)

_pier = maker(Pier)  # Pier(...), faster for the many piers
_HEIGHTS = attrgetter("base_elevation", "top_elevation")
_GUID, _LEVEL, _PART, _NAME, _STOREY, _THICKNESS, _ASSEMBLY = (
    attrgetter(n)
    for n in ("guid", "level", "part", "name", "storey", "thickness", "assembly")
)

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
    if not wall.openings:  # what the general case gives without cuts
        return [(0.0, length)] if length >= MIN_PIER_LENGTH else []
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


def _wall_piers(wall: WallSegment, direction: Direction | None) -> list[Pier]:
    """The wall's piers; a point at ``s`` along it is ``start + (s / length)·(end - start)``."""
    (x0, y0), (x1, y1) = wall.start, wall.end
    dx, dy, length = x1 - x0, y1 - y0, wall.length
    guid, level, part = wall.guid, wall.level, wall.part
    out = []
    for n, (a, b) in enumerate(_solid_intervals(wall)):
        ta, tb = a / length, b / length
        out.append(
            _pier(
                id=f"{guid}|{level}|{part}|{n}",  # pier_id()
                guid=guid,
                name=wall.name,
                pier=n,
                part=part,
                level=level,
                storey=wall.storey,
                direction=direction,
                start=(x0 + ta * dx, y0 + ta * dy),
                end=(x0 + tb * dx, y0 + tb * dy),
                height=wall.height,
                thickness=wall.thickness,
                assembly=wall.assembly,
            )
        )
    return out


def _directions(
    walls: Sequence[WallSegment], tolerance: float
) -> list[Direction | None]:
    """:func:`wall_direction` of each wall's ``angle``, on arrays (the same floats)."""
    ends = end_points(walls)
    dx, dy = (ends[:, 1] - ends[:, 0]).T
    pi = math.pi
    angle = map(float.__mod__, map(math.atan2, dy.tolist(), dx.tolist()), repeat(pi))
    a = floats(map(float.__mod__, angle, repeat(pi)), len(walls))  # wall_direction's a
    across = np.where((pi - a) < a, pi - a, a) <= tolerance  # min(a, pi - a)
    along = np.abs(a - pi / 2.0) <= tolerance
    X, Y = Direction.X, Direction.Y
    return [
        X if x else (Y if y else None)
        for x, y in zip(across.tolist(), along.tolist(), strict=True)
    ]


def _plain_piers(
    walls: Sequence[WallSegment], directions: Sequence
) -> list[Pier | None]:
    """The one pier of each wall without openings (None: too short), on arrays.

    As :func:`_wall_piers` gives it: the interval (0, length) when length is at
    least ``MIN_PIER_LENGTH``, its ends at ``start + (s / length)·(end - start)``.
    """
    ends = end_points(walls)
    d = ends[:, 1] - ends[:, 0]
    length = floats(map(math.hypot, d[:, 0].tolist(), d[:, 1].tolist()), len(walls))
    ok = length >= MIN_PIER_LENGTH
    start = ends[:, 0] + (0.0 / length)[:, None] * d
    end = ends[:, 0] + (length / length)[:, None] * d
    rows = np.flatnonzero(ok).tolist()
    chosen = [walls[i] for i in rows]
    guid, level, part = (list(map(g, chosen)) for g in (_GUID, _LEVEL, _PART))
    zs = points(map(_HEIGHTS, chosen), len(chosen))
    made = records(
        Pier,
        id=list(map("{}|{}|{}|0".format, guid, level, part)),  # pier_id(..., 0)
        guid=guid,
        name=list(map(_NAME, chosen)),
        pier=[0] * len(rows),
        part=part,
        level=level,
        storey=list(map(_STOREY, chosen)),
        direction=[directions[i] for i in rows],
        start=list(map(tuple, start[rows].tolist())),
        end=list(map(tuple, end[rows].tolist())),
        height=(zs[:, 1] - zs[:, 0]).tolist(),  # WallSegment.height
        thickness=list(map(_THICKNESS, chosen)),
        assembly=list(map(_ASSEMBLY, chosen)),
    )
    out: list[Pier | None] = [None] * len(walls)
    for i, p in zip(rows, made, strict=True):
        out[i] = p
    return out


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
    shear = [w for w in walls if w.is_shear_wall and w.level]
    if not shear:
        return (), ()
    directions = _directions(shear, options.angle_tolerance)
    plain_rows = [i for i, w in enumerate(shear) if not w.openings]
    plain = dict(
        zip(
            plain_rows,
            _plain_piers(
                [shear[i] for i in plain_rows], [directions[i] for i in plain_rows]
            ),
            strict=True,
        )
    )
    piers: list[Pier] = []
    conditions: list[Condition] = []
    for i, (wall, direction) in enumerate(zip(shear, directions, strict=True)):
        if direction is None:
            conditions.append(_skewed(wall, options.angle_tolerance))
        if i in plain:
            one = plain[i]
            found = [] if one is None else [one]
        else:
            found = _wall_piers(wall, direction)
        if not found:
            conditions.append(_no_pier(wall, direction))
        piers.extend(found)
    made = tuple(piers)
    end_points(made, keep=True)  # read once: lines, transfers and rigid take rows
    return made, tuple(conditions)


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
