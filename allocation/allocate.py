"""Front door of the allocation: model + parameters -> forces in every level, line and pier.

Order of work: seismic weights (weights), ELF or given level forces and Fpx
(level_forces), piers and their stiffness, lines per level, then from the top level down
the flexible allocation (each story's walls take their own level's force plus the shear
of the walls above, which enters the diaphragm below at the upper walls' locations), the
rigid allocation of each story (story shear at the centre of mass of the levels at and
above), the envelope, and the load-path graph.
"""

from __future__ import annotations

from collections.abc import Sequence

from allocation._transfers import stands_on
from allocation.envelope import envelope, line_envelope
from allocation.flexible import allocate_flexible, transfer_point_loads
from allocation.level_forces import compute_level_forces
from allocation.lines import find_lines
from allocation.load_path import build_load_path
from allocation.parameters import AnalysisOptions, DeadLoads, SeismicParameters
from allocation.piers import make_piers
from allocation.results import (
    Allocation,
    Condition,
    ConditionKind,
    FlexibleResult,
    LevelLoad,
    Pier,
    PointLoad,
    ResistanceLine,
    RigidResult,
)
from allocation.rigid import allocate_rigid_story
from allocation.stiffness import assign_stiffness
from allocation.weights import level_weights
from ifc_bridge.model import BuildingModel, Direction

__all__ = ["allocate"]


def _plan_extent(model: BuildingModel, level: str, piers: Sequence[Pier]):
    polys = [d.polygon for d in model.diaphragms_of(level)]
    if polys:
        xs0, ys0, xs1, ys1 = zip(*(p.bounds for p in polys), strict=True)
        return (min(xs0), min(ys0), max(xs1), max(ys1))
    xs = [c for p in piers for c in (p.start[0], p.end[0])]
    ys = [c for p in piers for c in (p.start[1], p.end[1])]
    return (min(xs), min(ys), max(xs), max(ys))


def _centre_of_mass_above(
    levels: Sequence[LevelLoad], index: int
) -> tuple[float, float]:
    """Centre of the story forces at and above level ``index`` (Fx-weighted)."""
    above = levels[index:]
    total = sum(lv.story_force for lv in above)
    if total <= 0.0:
        total = sum(lv.seismic_weight for lv in above)
        wts = [lv.seismic_weight for lv in above]
    else:
        wts = [lv.story_force for lv in above]
    x = sum(w * lv.mass_centroid[0] for w, lv in zip(wts, above, strict=True)) / total
    y = sum(w * lv.mass_centroid[1] for w, lv in zip(wts, above, strict=True)) / total
    return (x, y)


def _stacking_loads(
    upper: Sequence[Pier],
    upper_forces: dict[str, float],
    lower_lines: Sequence[ResistanceLine],
    *,
    level_below: str,
    direction: Direction,
    tolerance: float,
) -> tuple[PointLoad, ...]:
    """Every upper pier's shear as a point load on the diaphragm below.

    Non-stacking piers come from :func:`transfer_point_loads` (with their conditions);
    piers that stand on a line of the story below deliver straight to that line.
    """
    loads = []
    for p in upper:
        if p.direction is not direction or p.id not in upper_forces:
            continue
        line = _line_below(p, lower_lines, tolerance)
        if line is not None:
            loads.append(
                PointLoad(
                    level=level_below,
                    direction=direction,
                    source_pier=p.id,
                    location=p.midpoint,
                    force=upper_forces[p.id],
                    shares=((line.id, upper_forces[p.id]),),
                )
            )
    return tuple(loads)


def _line_below(
    pier: Pier, lines: Sequence[ResistanceLine], tolerance: float
) -> ResistanceLine | None:
    return next((ln for ln in lines if stands_on(pier, ln, tolerance=tolerance)), None)


def allocate(
    model: BuildingModel,
    seismic: SeismicParameters,
    loads: DeadLoads,
    options: AnalysisOptions,
) -> Allocation:
    """Allocate the seismic force of every level to lines and wall piers.

    Flexible (ASCE 7-16 §12.3.1.1, tributary), rigid (§12.3.1.2, with inherent and
    accidental torsion, §12.8.4) and their envelope (common practice where a diaphragm
    is neither idealisation).

    Args:
        model: The structural model from IFC.
        seismic: Seismic parameters [g, s, -].
        loads: Dead loads [Pa, N].
        options: Analysis options.

    Returns:
        The allocation, with engineering conditions for the checks.
    """
    weights = level_weights(model, loads, options, base_level=seismic.base_level)
    summary, levels = compute_level_forces(weights, seismic)
    piers, conditions = make_piers(model.walls, options)
    piers, stiff_conditions = assign_stiffness(piers, options)
    conditions = list(conditions) + list(stiff_conditions)

    all_lines: list[ResistanceLine] = []
    piers_by_level: dict[str, list[Pier]] = {}
    for lv in levels:
        level_index = model.level(lv.level).index + 1  # 1-based: "Level 2" -> "L2-X-1"
        own = [p for p in piers if p.level == lv.level]
        lines, own, found = find_lines(
            own,
            model.diaphragms_of(lv.level),
            level=lv.level,
            level_index=level_index,
            options=options,
        )
        all_lines.extend(lines)
        piers_by_level[lv.level] = list(own)
        conditions.extend(found)
    known = {lv.level for lv in levels}
    orphans = [p for p in piers if p.level not in known]
    piers = tuple(p for lv in levels for p in piers_by_level[lv.level])
    for p in orphans:
        conditions.append(
            Condition(
                kind=ConditionKind.WALL_OFF_DIAPHRAGM,
                level=p.level,
                direction=p.direction,
                guids=(p.guid,),
                detail=f"shear wall {p.guid} ({p.name!r}) supports level {p.level!r}, "
                "which is not a diaphragm level above the base; it takes no force",
            )
        )

    flexible: list[FlexibleResult] = []
    rigid: list[RigidResult] = []
    for direction in (Direction.X, Direction.Y):
        upper_result: FlexibleResult | None = None
        upper_level: str | None = None
        for i in range(len(levels) - 1, -1, -1):
            lv = levels[i]
            lines = [ln for ln in all_lines if ln.level == lv.level]
            own = piers_by_level[lv.level]
            transfers: tuple[PointLoad, ...] = ()
            if upper_result is not None and upper_level is not None:
                upper = piers_by_level[upper_level]
                moving, found = transfer_point_loads(
                    upper,
                    upper_result.pier_forces,
                    lines,
                    level_below=lv.level,
                    direction=direction,
                    tolerance=options.line_tolerance,
                )
                stacking = _stacking_loads(
                    [p for p in upper if p.id not in {m.source_pier for m in moving}],
                    upper_result.pier_forces,
                    lines,
                    level_below=lv.level,
                    direction=direction,
                    tolerance=options.line_tolerance,
                )
                transfers = tuple(moving) + stacking
                conditions.extend(found)
            result = allocate_flexible(
                lv,
                model.diaphragms_of(lv.level),
                lines,
                own,
                direction=direction,
                point_loads=transfers,
                line_tolerance=options.line_tolerance,
            )
            flexible.append(result)
            upper_result, upper_level = result, lv.level
            if own:
                rigid.extend(
                    allocate_rigid_story(
                        own,
                        level=lv.level,
                        story_shear=lv.story_shear,
                        center_of_mass=_centre_of_mass_above(levels, i),
                        plan_extent=_plan_extent(model, lv.level, own),
                        direction=direction,
                        accidental_eccentricity=options.accidental_eccentricity,
                        amplify_torsion=options.amplify_torsion,
                    )
                )
    for r in (*flexible, *rigid):
        conditions.extend(r.conditions)
    env = envelope(flexible, rigid, method=options.diaphragm)
    return Allocation(
        seismic=summary,
        levels=tuple(levels),
        piers=piers,
        lines=tuple(all_lines),
        flexible=tuple(flexible),
        rigid=tuple(rigid),
        envelope=env,
        line_envelope=line_envelope(
            all_lines, flexible, rigid, method=options.diaphragm
        ),
        conditions=tuple(_dedupe(conditions)),
        graphs={
            d: build_load_path([f for f in flexible if f.direction is d], piers)
            for d in (Direction.X, Direction.Y)
        },
    )


def _dedupe(conditions: Sequence[Condition]) -> list[Condition]:
    seen: set[tuple] = set()
    out = []
    for c in conditions:
        key = (c.kind, c.level, c.direction, c.guids, c.ref)
        if key not in seen:
            seen.add(key)
            out.append(c)
    return out
