"""Shear of upper walls that stand on no line below (re-exported by ``flexible``).

Signs as in :mod:`allocation.flexible`: forces positive in the +direction. The force a
pier above resists is delivered, with the same sign, to the diaphragm it stands on.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence

import numpy as np

from allocation._columns import ends as end_points
from allocation._columns import points
from allocation.errors import AllocationError
from allocation.lines import along, perpendicular
from allocation.results import (
    Condition,
    ConditionKind,
    Pier,
    PierId,
    PointLoad,
    ResistanceLine,
    StackedShear,
)
from ifc_bridge.model import Direction

__all__ = ["split_transfers", "stands_on", "transfer_point_loads"]


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


def _first_under(
    piers: Sequence[Pier],
    lines: Sequence[ResistanceLine],
    direction: Direction,
    tolerance: float,
    ends: np.ndarray | None = None,
) -> list[ResistanceLine | None]:
    """Per pier, the first of ``lines`` it :func:`stands_on`, or None (all at once).

    The same float comparisons as :func:`stands_on`, on arrays: piers by lines;
    ``ends`` the piers' end points when the caller has them.
    """
    if not piers or not lines:
        return [None] * len(piers)
    k, j = (1, 0) if direction is Direction.X else (0, 1)
    if ends is None:
        ends = end_points(piers)
    across = (ends[:, 0, k] + ends[:, 1, k]) / 2.0  # perpendicular(pier.midpoint)
    a = np.minimum(ends[:, 0, j], ends[:, 1, j])  # sorted along-line ends
    b = np.maximum(ends[:, 0, j], ends[:, 1, j])
    offset = np.array([ln.offset for ln in lines], dtype=np.float64)
    extent = points([ln.wall_extent for ln in lines], len(lines))
    stands = (
        ~(np.abs(across[:, None] - offset[None, :]) > tolerance)
        & (extent[None, :, 0] - tolerance <= a[:, None])
        & (b[:, None] <= extent[None, :, 1] + tolerance)
    )
    first = np.argmax(stands, axis=1).tolist()
    found = stands.any(axis=1).tolist()
    return [lines[i] if hit else None for i, hit in zip(first, found, strict=True)]


def split_transfers(
    upper_piers: Sequence[Pier],
    upper_pier_forces: Mapping[PierId, float],
    lower_lines: Sequence[ResistanceLine],
    *,
    level_below: str,
    direction: Direction,
    tolerance: float,
) -> tuple[tuple[PointLoad, ...], tuple[Condition, ...], StackedShear]:
    """:func:`transfer_point_loads`, plus the shear of the piers that do stack.

    Common practice: a stacking pier's shear goes straight into the first line below
    that it stands on (:func:`stands_on`).

    Returns:
        The non-stacking point loads and their conditions, as
        :func:`transfer_point_loads`; then the stacked shear: each other upper pier
        of ``direction`` with a force in ``upper_pier_forces`` that stands on a
        line, with that line and its whole force, in upper pier order.

    Raises:
        AllocationError: A non-stacking pier in a line has no force given.
    """
    lines = [
        ln
        for ln in lower_lines
        if ln.direction is direction and ln.level == level_below
    ]
    mine = [p for p in upper_piers if p.direction is direction]
    ends = end_points(mine) if mine else None
    under = _first_under(mine, lines, direction, tolerance, ends)
    loads, conditions = [], []
    for p, line in zip(mine, under, strict=True):
        if not p.line or line is not None:
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
    moved = {pl.source_pier for pl in loads}
    if ends is None:
        return tuple(loads), tuple(conditions), StackedShear()
    # Pier.midpoint of each, on the end points' array (the same floats)
    middle = ((ends[:, 0] + ends[:, 1]) / 2.0).tolist()
    ids, on, forces, at = [], [], [], []
    for p, line, mid in zip(mine, under, middle, strict=True):
        if line is None or p.id in moved:
            continue
        force = upper_pier_forces.get(p.id)
        if force is None:
            continue
        ids.append(p.id)
        on.append(line.id)
        forces.append(force)
        at.append(tuple(mid))
    stacked = StackedShear(
        source_piers=tuple(ids),
        lines=tuple(on),
        forces=tuple(forces),
        locations=tuple(at),
    )
    return tuple(loads), tuple(conditions), stacked


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
    loads, conditions, _ = split_transfers(
        upper_piers,
        upper_pier_forces,
        lower_lines,
        level_below=level_below,
        direction=direction,
        tolerance=tolerance,
    )
    return loads, conditions


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
