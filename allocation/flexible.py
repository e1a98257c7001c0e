"""Flexible-diaphragm allocation: tributary spans between lines, by the lever rule.

Axes and signs: plan X-Y [m]. For force in X the lines are lines of X walls (at
y = offset) and the diaphragm spans in y between them; for force in Y, the other way
round. Every force here (story force, piece forces, point loads, line and pier forces)
is positive in the +direction: a line force is the in-plane shear its walls resist,
acting on the diaphragm in -direction, equal to the inertial force delivered in
+direction. The lever rule can give a negative share where a piece's mass centroid lies
beyond its supports (an overhang).

Method (DESIGN.md item 6): each diaphragm region is split by its lines' chords (see
:mod:`allocation._pieces`); a piece's weight is its share of the level's located mass
items; its inertial force Fx·w_piece/W acts at its mass centroid and goes to the line
below and the line above by the lever rule (a simple beam). Walls standing on a line of
the direction send their tributary mass straight to it. Shear from a wall above that
does not stand on a line below enters as a point load and is split the same way.
"""

from __future__ import annotations

import dataclasses
import logging
import math
from collections.abc import Iterator, Sequence

from allocation._loading import load_masses, mass_items, total_weight
from allocation._pieces import Support
from allocation._records import maker
from allocation._transfers import transfer_point_loads
from allocation._tributary import (
    Slot,
    host,
    local_uv,
    make_slots,
    on_line,
)
from allocation.errors import AllocationError
from allocation.parameters import AnalysisOptions
from allocation.results import (
    Condition,
    ConditionKind,
    DiaphragmPiece,
    FlexibleResult,
    LevelLoad,
    LineId,
    Pier,
    PointLoad,
    ResistanceLine,
    StackedShear,
)
from allocation.within_line import choose_basis, distribute_in_line
from ifc_bridge.model import Diaphragm, Direction

__all__ = ["allocate_flexible", "lever_rule", "transfer_point_loads"]

# transfer_point_loads lives in allocation._transfers (module size); re-exported here.

logger = logging.getLogger(__name__)

_piece = maker(DiaphragmPiece)  # DiaphragmPiece(...), for every piece of every level


def lever_rule(
    force: float, position: float, supports: Sequence[Support]
) -> tuple[tuple[LineId, float], ...]:
    """Reactions of a simple beam between the supports below and above a load.

    Common practice: a flexible diaphragm piece spans as a simple beam; a load at
    distance a from one support and b from the other gives F·b/L and F·a/L.

    Args:
        force: Load [N].
        position: Local across-coordinate of the load [m].
        supports: The piece's lines, sorted by ``v``; one gives a cantilever.

    Returns:
        ``(line id, force [N])`` per loaded support; empty with no support.
    """
    if not supports:
        return ()
    if len(supports) == 1:
        return ((supports[0].line, float(force)),)
    below = [s for s in supports if s.v <= position]
    above = [s for s in supports if s.v > position]
    if not below:
        lo, hi = supports[0], supports[1]
    elif not above:
        lo, hi = supports[-2], supports[-1]
    else:
        lo, hi = below[-1], above[0]
    if len(supports) > 2:
        logger.warning(
            "piece with %d lines: spans between %s and %s",
            len(supports),
            lo.line,
            hi.line,
        )
    up = force * (position - lo.v) / (hi.v - lo.v)
    return ((lo.line, float(force - up)), (hi.line, float(up)))


def _depth(polygon, direction: Direction) -> float:
    """Extent of a piece across its span direction (perpendicular to the lines) [m]."""
    x0, y0, x1, y1 = polygon.bounds
    return (y1 - y0) if direction is Direction.X else (x1 - x0)


def _plan_xy(u: float, v: float, direction: Direction) -> tuple[float, float]:
    return (float(u), float(v)) if direction is Direction.X else (float(v), float(u))


def _finish_piece(
    slot: Slot,
    scale: float,
    level: str,
    direction: Direction,
    lines: dict[LineId, ResistanceLine],
    tol: float,
) -> tuple[DiaphragmPiece, list[Condition]]:
    if slot.weight > 0.0:
        u, v = slot.moment_u / slot.weight, slot.moment_v / slot.weight
    else:
        c = slot.piece.local.centroid
        u, v = float(c.x), float(c.y)
    force = scale * slot.weight
    supports = slot.piece.supports
    shares = lever_rule(force, v, supports)
    piece = _piece(
        id=slot.id,
        diaphragm=slot.region.id,
        level=level,
        direction=direction,
        polygon=slot.plan,
        weight=float(slot.weight),
        force=float(force),
        centroid=_plan_xy(u, v, direction),
        supports=tuple(s.line for s in supports),
        shares=shares,
    )
    slabs = slot.region.slab_guids
    if not supports:
        detail = (
            f"diaphragm piece {slot.id} ({slot.plan.area:.2f} m²) touches no line "
            f"acting in {direction.value}; its force {force:.0f} N has no support"
        )
        return piece, [
            _cond(
                ConditionKind.UNSUPPORTED_PIECE,
                level,
                direction,
                slabs,
                detail,
                force,
                slot.id,
            )
        ]
    if len(supports) == 1 and _depth(slot.plan, direction) <= tol:
        return piece, []  # a slab edge overhanging its line by less than the tolerance
    if len(supports) == 1:
        line = supports[0].line
        detail = (
            f"diaphragm piece {slot.id} cantilevers from line {line} alone "
            f"(force {force:.0f} N in {direction.value})"
        )
        walls = lines[line].piers if line in lines else ()
        guids = (*slabs, *(pid.split("|", 1)[0] for pid in walls))  # pier_id()
        return piece, [
            _cond(
                ConditionKind.CANTILEVER_PIECE,
                level,
                direction,
                guids,
                detail,
                force,
                slot.id,
            )
        ]
    return piece, []


def _cond(
    kind: ConditionKind,
    level: str,
    direction: Direction,
    guids: Sequence[str],
    detail: str,
    value: float | None,
    ref: str,
) -> Condition:
    return Condition(
        kind=kind,
        level=level,
        direction=direction,
        guids=tuple(sorted(set(guids))),
        detail=detail,
        value=None if value is None else float(value),
        ref=ref,
    )


def _route_point(
    pl: PointLoad, slots: Sequence[Slot], direction: Direction
) -> tuple[PointLoad, list[Condition]]:
    """The point load with its lines' shares, by its location, and its conditions."""
    guid = pl.source_pier.split("|", 1)[0]
    u, v = local_uv(pl.location, direction)
    line = on_line(u, v, slots)
    if line is not None:
        return _with(pl, ((line, float(pl.force)),)), []
    if not slots:
        detail = (
            f"shear {pl.force:.0f} N from pier {pl.source_pier} enters level "
            f"{pl.level!r}, which has no diaphragm region"
        )
        return _with(pl, ()), [
            _cond(
                ConditionKind.UNSUPPORTED_PIECE,
                pl.level,
                direction,
                (guid,),
                detail,
                pl.force,
                "",
            )
        ]
    slot, u, v = host(u, v, slots)
    shares = lever_rule(pl.force, v, slot.piece.supports)
    conds = []
    if not shares:
        detail = (
            f"shear {pl.force:.0f} N from pier {pl.source_pier} enters diaphragm "
            f"piece {slot.id}, which touches no line; it has no support"
        )
        guids = (guid, *slot.region.slab_guids)
        conds.append(
            _cond(
                ConditionKind.UNSUPPORTED_PIECE,
                pl.level,
                direction,
                guids,
                detail,
                pl.force,
                slot.id,
            )
        )
    return _with(pl, shares), conds


def _with(pl: PointLoad, shares: tuple[tuple[LineId, float], ...]) -> PointLoad:
    return PointLoad(
        level=pl.level,
        direction=pl.direction,
        source_pier=pl.source_pier,
        location=pl.location,
        force=pl.force,
        shares=shares,
    )


def _pier_forces(
    lines: Sequence[ResistanceLine],
    piers: Sequence[Pier],
    line_forces: dict[LineId, float],
) -> dict[str, float]:
    by_id = {p.id: p for p in piers}
    out: dict[str, float] = {}
    for line in lines:
        try:
            members = [by_id[pid] for pid in line.piers]
        except KeyError:
            missing = [pid for pid in line.piers if pid not in by_id]
            msg = f"line {line.id}: piers {', '.join(missing)} were not given"
            raise AllocationError(msg) from None
        out.update(
            distribute_in_line(line_forces[line.id], members, by=choose_basis(members))
        )
    return out


def allocate_flexible(
    level: LevelLoad,
    diaphragms: Sequence[Diaphragm],
    lines: Sequence[ResistanceLine],
    piers: Sequence[Pier],
    *,
    direction: Direction,
    point_loads: Sequence[PointLoad] = (),
    stacked: StackedShear | None = None,
    line_tolerance: float | None = None,
) -> FlexibleResult:
    """Allocate a level's story force to its lines and piers, flexible diaphragm.

    Common practice (DESIGN.md item 6): tributary spans, each piece a simple beam
    between the lines at its edges, its inertial force at its mass centroid shared by
    the lever rule. Story forces Fx are those of ASCE 7-16 Eq. 12.8-11 (or given).

    Args:
        level: Loads of the level: ``story_force`` Fx [N] and located ``masses``
            (weights [N]); without masses, ``seismic_weight`` is spread uniformly
            over the diaphragm (by area when it is 0 and Fx is given).
        diaphragms: Diaphragm regions (those of this level are used).
        lines: Lines of resistance (those of this level and direction are used).
        piers: Piers with ``line`` set (those of the lines are used).
        direction: Direction of the force.
        point_loads: Shear from walls above entering this level [N], each split by
            its location (any ``shares`` given are replaced).
        stacked: Shear of the walls above that stand on lines of this level [N],
            added to those lines (after the point loads); None: none.
        line_tolerance: As ``AnalysisOptions.line_tolerance`` [m] (default 0.5).

    Returns:
        Pieces, point loads with their shares, line and pier forces [N], conditions
        (cantilevered and unsupported pieces; unsupported force is not allocated).

    Raises:
        AllocationError: A point load for another level or direction, stacked
            shear on a line not of this level and direction, or a line whose piers
            are not given.
    """
    tol = AnalysisOptions().line_tolerance if line_tolerance is None else line_tolerance
    name = level.level
    regions = [d for d in diaphragms if d.level == name]
    mine = [ln for ln in lines if ln.level == name and ln.direction is direction]
    ids = {ln.id for ln in mine}
    for pl in point_loads:
        if pl.level != name or pl.direction is not direction:
            msg = (
                f"point load from pier {pl.source_pier} is for level {pl.level!r} "
                f"{pl.direction.value}, not {name!r} {direction.value}"
            )
            raise AllocationError(msg)
    slots = make_slots(regions, mine, direction, tol)
    items, physical = mass_items(level, regions)
    W, Fx = total_weight(items), float(level.story_force)
    scale = Fx / W if W > 0.0 else 0.0
    walls = {
        (p.guid, p.part): p.line for p in piers if p.line in ids and p.level == name
    }
    direct, lost = load_masses(items, slots, walls, direction)
    line_forces = {ln.id: 0.0 for ln in mine}
    for lid, w in direct.items():
        line_forces[lid] += scale * w
    by_id = {ln.id: ln for ln in mine}
    pieces, conditions = [], []
    for slot in slots:
        piece, cond = _finish_piece(slot, scale, name, direction, by_id, tol)
        if not physical:  # weights were plan areas
            piece = dataclasses.replace(piece, weight=0.0)
        pieces.append(piece)
        conditions.extend(cond)
        for lid, f in piece.shares:
            line_forces[lid] += f
    routed = []
    for pl in point_loads:
        done, cond = _route_point(pl, slots, direction)
        routed.append(done)
        conditions.extend(cond)
        for lid, f in done.shares:
            line_forces[lid] += f
    if stacked is None:
        stacked = StackedShear()
    for pid, lid, f in zip(
        stacked.source_piers, stacked.lines, stacked.forces, strict=True
    ):
        if lid not in ids:
            msg = (
                f"stacked shear of pier {pid}: line {lid} is not a line of level "
                f"{name!r} in {direction.value}"
            )
            raise AllocationError(msg)
        line_forces[lid] += f
    if W <= 0.0 and Fx != 0.0:
        lost, scale = 1.0, Fx  # all of Fx
    if lost > 0.0:
        detail = (
            f"level {name!r}: {scale * lost:.0f} N of its story force has no "
            "diaphragm region to carry it"
        )
        conditions.append(
            _cond(
                ConditionKind.UNSUPPORTED_PIECE,
                name,
                direction,
                (),
                detail,
                scale * lost,
                "",
            )
        )
    return FlexibleResult(
        level=name,
        direction=direction,
        applied=float(Fx + math.fsum(_transferred(point_loads, stacked))),
        pieces=tuple(pieces),
        point_loads=tuple(routed),
        line_forces={k: float(v) for k, v in line_forces.items()},
        pier_forces=_pier_forces(mine, piers, line_forces),
        conditions=tuple(conditions),
        stacked=stacked,
    )


def _transferred(
    point_loads: Sequence[PointLoad], stacked: StackedShear
) -> Iterator[float]:
    """The forces from the story above: point loads, then stacked shear [N]."""
    yield from (pl.force for pl in point_loads)
    yield from stacked.forces
