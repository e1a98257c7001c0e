"""Shear of upper walls that stand on no line below (re-exported by ``flexible``).

Signs as in :mod:`allocation.flexible`: forces positive in the +direction. The force a
pier above resists is delivered, with the same sign, to the diaphragm it stands on.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence

from allocation.errors import AllocationError
from allocation.lines import along, perpendicular
from allocation.results import (
    Condition,
    ConditionKind,
    Pier,
    PierId,
    PointLoad,
    ResistanceLine,
)
from ifc_bridge.model import Direction

__all__ = ["stands_on", "transfer_point_loads"]


def stands_on(pier: Pier, line: ResistanceLine, *, tolerance: float) -> bool:
    """True when a pier above stands on a line of the story below.

    Common practice: an upper wall stacks when a lower line lies at the same offset
    (within the line tolerance) and the lower walls' extent covers the upper pier.

    Args:
        pier: Pier of the story above.
        line: Line of the story below, same direction.
        tolerance: Line tolerance [m], on the offset and at the extent's ends.

    Returns:
        Whether the pier's shear goes straight into that line.
    """
    d = line.direction
    if pier.direction is not d:
        return False
    if abs(perpendicular(pier.midpoint, d) - line.offset) > tolerance:
        return False
    a, b = sorted((along(pier.start, d), along(pier.end, d)))
    lo, hi = line.wall_extent
    return lo - tolerance <= a and b <= hi + tolerance


def transfer_point_loads(
    upper_piers: Sequence[Pier],
    upper_pier_forces: Mapping[PierId, float],
    lower_lines: Sequence[ResistanceLine],
    *,
    level_below: str,
    direction: Direction,
    tolerance: float,
) -> tuple[tuple[PointLoad, ...], tuple[Condition, ...]]:
    """Point loads on the diaphragm below from upper piers that stand on no line.

    Common practice (DESIGN.md items 6 and 10): the shear of a wall with no wall under
    it enters the diaphragm below at the wall's location, a discontinuity (ASCE 7-16
    Table 12.3-2, out-of-plane offset) that the checks report.

    Args:
        upper_piers: Piers of the story above (those of ``direction`` in a line count).
        upper_pier_forces: Their flexible forces [N], positive in +direction.
        lower_lines: Lines of the level below (those of ``direction`` count).
        level_below: Level whose diaphragm receives the loads.
        direction: Direction of force.
        tolerance: Line tolerance [m] (see :func:`stands_on`).

    Returns:
        One point load per non-stacking pier (at its mid-point, shares empty, to be
        split by :func:`allocate_flexible`), and a ``NON_STACKING_WALL`` condition each.

    Raises:
        AllocationError: A pier in a line has no force in ``upper_pier_forces``.
    """
    lines = [
        ln
        for ln in lower_lines
        if ln.direction is direction and ln.level == level_below
    ]
    loads, conditions = [], []
    for p in upper_piers:
        if p.direction is not direction or not p.line:
            continue
        if any(stands_on(p, ln, tolerance=tolerance) for ln in lines):
            continue
        if p.id not in upper_pier_forces:
            msg = f"pier {p.id} (line {p.line}): no force given for the transfer below"
            raise AllocationError(msg)
        force = float(upper_pier_forces[p.id])
        loads.append(
            PointLoad(
                level=level_below,
                direction=direction,
                source_pier=p.id,
                location=p.midpoint,
                force=force,
                shares=(),
            )
        )
        conditions.append(_non_stacking(p, force, level_below))
    return tuple(loads), tuple(conditions)


def _non_stacking(pier: Pier, force: float, level_below: str) -> Condition:
    x, y = pier.midpoint
    detail = (
        f"shear wall {pier.guid} ({pier.name!r}, pier {pier.pier}) of line {pier.line} "
        f"stands on no line of shear walls below; its shear {force:.0f} N enters the "
        f"diaphragm of level {level_below!r} at ({x:.2f}, {y:.2f}) m"
    )
    return Condition(
        kind=ConditionKind.NON_STACKING_WALL,
        level=level_below,
        direction=pier.direction,
        guids=(pier.guid,),
        detail=detail,
        value=force,
        ref=pier.id,
    )
