"""Front door of the allocation: model + parameters -> forces in every level, line and pier.

Order of work: seismic weights (weights), ELF or given level forces and Fpx
(level_forces), piers and their stiffness, lines per level, then from the top level down
the flexible allocation (each story's walls take their own level's force plus the shear
of the walls above, which enters the diaphragm below at the upper walls' locations), the
rigid allocation of each story (story shear at the centre of mass of the levels at and
above), the envelope, and the load-path graphs (built when first read). The cyclic
garbage collector is paused meanwhile (``allocation._gc``): the run builds a few hundred
thousand records and no garbage cycles.
"""

from __future__ import annotations

from collections.abc import Sequence

from allocation._transfers import split_transfers
from allocation.envelope import envelope, line_envelope
from allocation.flexible import allocate_flexible
from allocation.level_forces import compute_level_forces
from allocation.lines import group_lines
from allocation.load_path import LoadPathGraphs
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
    StackedShear,
)
from allocation.rigid import allocate_rigid_story
from allocation.stiffness import stiffness_values
from allocation.weights import level_weights
from ifc_bridge.gc_pause import collection_paused
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


def _fill_in(pier: Pier, *, stiffness: float, line: str) -> None:
    """Set the stiffness and line of a pier made by this allocation, in place.

    The pier is new and not yet handed out, so it is completed where it stands (as a
    ``__post_init__`` would) rather than copied twice; it is frozen from then on.
    """
    object.__setattr__(pier, "stiffness", stiffness)
    object.__setattr__(pier, "line", line)


def _lines_and_piers(
    model: BuildingModel,
    levels: Sequence[LevelLoad],
    options: AnalysisOptions,
    conditions: list[Condition],
) -> tuple[dict[str, list[ResistanceLine]], dict[str, list[Pier]], tuple[Pier, ...]]:
    """Piers with their stiffness and line, and the lines, per level.

    Returns:
        Lines per level, piers per level (model order), and every pier in level
        order; the conditions found are added to ``conditions``.
    """
    piers, found = make_piers(model.walls, options)
    conditions.extend(found)
    stiffness, found = stiffness_values(piers, options)
    conditions.extend(found)
    by_level: dict[str, list[Pier]] = {}
    for p, k in zip(piers, stiffness, strict=True):
        _fill_in(p, stiffness=k, line="")
        by_level.setdefault(p.level, []).append(p)
    lines_by_level: dict[str, list[ResistanceLine]] = {}
    piers_by_level: dict[str, list[Pier]] = {}
    for lv in levels:
        level_index = model.level(lv.level).index + 1  # 1-based: "Level 2" -> "L2-X-1"
        own = by_level.get(lv.level, [])
        lines, assigned, found = group_lines(
            own,
            model.diaphragms_of(lv.level),
            level=lv.level,
            level_index=level_index,
            options=options,
        )
        for p in own:
            if p.id in assigned:
                object.__setattr__(p, "line", assigned[p.id])
        lines_by_level[lv.level] = list(lines)
        piers_by_level[lv.level] = own
        conditions.extend(found)
    known = {lv.level for lv in levels}
    for p in piers:
        if p.level not in known:
            conditions.append(_orphan(p))
    ordered = tuple(p for lv in levels for p in piers_by_level[lv.level])
    return lines_by_level, piers_by_level, ordered


def _orphan(p: Pier) -> Condition:
    return Condition(
        kind=ConditionKind.WALL_OFF_DIAPHRAGM,
        level=p.level,
        direction=p.direction,
        guids=(p.guid,),
        detail=f"shear wall {p.guid} ({p.name!r}) supports level {p.level!r}, "
        "which is not a diaphragm level above the base; it takes no force",
    )


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
    with collection_paused():
        return _allocate(model, seismic, loads, options)


def _allocate(
    model: BuildingModel,
    seismic: SeismicParameters,
    loads: DeadLoads,
    options: AnalysisOptions,
) -> Allocation:
    weights = level_weights(model, loads, options, base_level=seismic.base_level)
    summary, levels = compute_level_forces(weights, seismic)
    conditions: list[Condition] = []
    lines_by_level, piers_by_level, piers = _lines_and_piers(
        model, levels, options, conditions
    )
    all_lines = [ln for lv in levels for ln in lines_by_level[lv.level]]

    flexible: list[FlexibleResult] = []
    rigid: list[RigidResult] = []
    for direction in (Direction.X, Direction.Y):
        upper_result: FlexibleResult | None = None
        upper_level: str | None = None
        for i in range(len(levels) - 1, -1, -1):
            lv = levels[i]
            lines = lines_by_level[lv.level]
            own = piers_by_level[lv.level]
            moving: tuple[PointLoad, ...] = ()
            stacked = StackedShear()
            if upper_result is not None and upper_level is not None:
                moving, found, stacked = split_transfers(
                    piers_by_level[upper_level],
                    upper_result.pier_forces,
                    lines,
                    level_below=lv.level,
                    direction=direction,
                    tolerance=options.line_tolerance,
                )
                conditions.extend(found)
            result = allocate_flexible(
                lv,
                model.diaphragms_of(lv.level),
                lines,
                own,
                direction=direction,
                point_loads=moving,
                stacked=stacked,
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
        graphs=LoadPathGraphs(flexible, piers),
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
