"""Seismic weight of each diaphragm level, from the model's slabs and walls.

Plan coordinates are global X-Y [m]; weights in N, loads per area in Pa.

Common practice, as used here:

* Slab: diaphragm plan area (openings excluded) × the roof dead load where the
  diaphragm's kind is ``ROOF``, else × the floor dead load.
* Walls: each story-high segment (shear wall or not) sends half its weight to the level
  it stands on and half to the level whose diaphragm it supports; a wall with nothing
  above (``level == ""``: a parapet) sends all of it to the level it stands on. Area is
  length × height less the openings (clipped to the segment); the unit load is the
  assembly's ``wall_dead_load``, else ``loads.wall``.
* Weight landing on the seismic base or below is not part of W (it goes to the
  foundation); weight landing on a level above the base without a diaphragm goes to
  the nearest diaphragm level by elevation (the upper one on a tie), and is logged.
* Extra weight given for a level is spread over its diaphragms in proportion to area.
"""

from __future__ import annotations

import logging
import math
from collections import defaultdict
from collections.abc import Iterable, Sequence

from allocation._mass_table import MassTable
from allocation._wall_weights import WallShares, wall_shares
from allocation.errors import ParameterError
from allocation.parameters import AnalysisOptions, DeadLoads
from allocation.results import LevelLoad, MassItem, WeightItem
from ifc_bridge.model import BuildingModel, Diaphragm, Level, WallSegment

__all__ = ["level_weights", "wall_elevation_area", "wall_unit_load"]

logger = logging.getLogger(__name__)

# breakdown row: (source, unit load [Pa], quantity [m²], weight [N], guids)
_Row = tuple[str, float, float, float, Iterable[str]]


def wall_elevation_area(wall: WallSegment) -> float:
    """Net elevation area of a wall segment: length × height less its openings.

    Common practice: openings are clipped to the segment's extent; overlapping
    openings are not merged, and the result is never negative.

    Args:
        wall: The wall segment.

    Returns:
        Area [m²].
    """
    length, height = wall.length, wall.height
    holes = (
        math.fsum(
            max(min(o.end, length) - max(o.start, 0.0), 0.0)
            * max(min(o.top, height) - max(o.bottom, 0.0), 0.0)
            for o in wall.openings
        )
        if wall.openings
        else 0.0
    )
    return float(max(length * height - holes, 0.0))


def wall_unit_load(
    wall: WallSegment, loads: DeadLoads, options: AnalysisOptions
) -> float:
    """Dead load of a wall per elevation area.

    Common practice: the assembly's own wall dead load where the configuration gives
    one, else the project's general wall load.

    Args:
        wall: The wall segment.
        loads: Project dead loads (``wall`` [Pa]).
        options: Analysis options with the assembly properties.

    Returns:
        Load per wall elevation area [Pa].
    """
    props = options.assembly(wall.assembly) if wall.assembly else None
    if props is not None and props.wall_dead_load is not None:
        return float(props.wall_dead_load)
    return float(loads.wall)


def _base(model: BuildingModel, base_level: str) -> Level:
    if not model.levels:
        msg = f"{model.source}: the model has no levels; no seismic weight to compute"
        raise ParameterError(msg)
    if not base_level:
        return model.levels[0]
    try:
        return model.level(base_level)
    except KeyError:
        names = ", ".join(repr(lv.name) for lv in model.levels)
        msg = f"[levels].base = {base_level!r} is not a level; levels: {names}"
        raise ParameterError(msg) from None


def _diaphragm_levels(
    model: BuildingModel, options: AnalysisOptions, base: Level
) -> list[Level]:
    above = [lv for lv in model.levels if lv.elevation > base.elevation]
    if options.diaphragm_levels:
        known = {lv.name: lv for lv in model.levels}
        for name in options.diaphragm_levels:
            if name not in known:
                names = ", ".join(repr(lv.name) for lv in model.levels)
                msg = (
                    f"[levels].diaphragms names {name!r}, not a level; levels: {names}"
                )
                raise ParameterError(msg)
            if known[name].elevation <= base.elevation:
                msg = (
                    f"[levels].diaphragms names {name!r}, at or below the seismic base "
                    f"{base.name!r}; list only levels above the base"
                )
                raise ParameterError(msg)
        chosen = [lv for lv in above if lv.name in set(options.diaphragm_levels)]
    else:
        chosen = [lv for lv in above if lv.is_diaphragm_level]
    if not chosen:
        msg = (
            f"{model.source}: no diaphragm level above the seismic base {base.name!r}; "
            "check the slabs or [levels].diaphragms"
        )
        raise ParameterError(msg)
    return chosen


def _targets(
    model: BuildingModel, base: Level, diaphragms: Sequence[Level]
) -> dict[str, str | None]:
    """Diaphragm level that takes the weight landing on each level; None at the base."""
    names = {d.name for d in diaphragms}
    out: dict[str, str | None] = {}
    for lv in model.levels:
        if lv.name in names or lv.elevation <= base.elevation:
            out[lv.name] = lv.name if lv.name in names else None
        else:
            near = min(
                diaphragms, key=lambda d: (abs(d.elevation - lv.elevation), -d.index)
            )
            logger.info(
                "level %r has no diaphragm: weight goes to %r", lv.name, near.name
            )
            out[lv.name] = near.name
    return out


def _lookup(
    targets: dict[str, str | None], name: str, what: str, source: str
) -> str | None:
    if name not in targets:
        msg = f"{source}: {what}: level {name!r} is not a level of the model"
        raise ParameterError(msg)
    return targets[name]


def _extras(
    loads: DeadLoads, model: BuildingModel, diaphragms: Sequence[Level]
) -> dict[str, float]:
    names = {lv.name for lv in diaphragms}
    out: dict[str, float] = defaultdict(float)
    for name, weight in loads.extra:
        if name not in names:
            listed = ", ".join(repr(n) for n in sorted(names))
            where = (
                "a level" if any(lv.name == name for lv in model.levels) else "no level"
            )
            msg = (
                f"loads.extra.{name}: {where}, but not a diaphragm level above the "
                f"seismic base; diaphragm levels: {listed}"
            )
            raise ParameterError(msg)
        out[name] += weight
    return out


def _grouped(items: Iterable[_Row]) -> list[WeightItem]:
    """Sum (source, unit_load, quantity, weight, guids) rows by source and unit load."""
    groups: dict[tuple[str, float], list[tuple[float, float, Iterable[str]]]] = {}
    for source, q, quantity, weight, guids in items:
        groups.setdefault((source, q), []).append((quantity, weight, guids))
    return [
        WeightItem(
            source=source,
            quantity=math.fsum(r[0] for r in rows),
            unit_load=q,
            weight=math.fsum(r[1] for r in rows),
            guids=tuple(sorted({g for r in rows for g in r[2]})),
        )
        for (source, q), rows in groups.items()
    ]


def _landing(
    model: BuildingModel, targets: dict[str, str | None]
) -> dict[str | None, list[Diaphragm]]:
    """The model's diaphragms by the level their weight lands on (None: the base)."""
    out: dict[str | None, list[Diaphragm]] = {}
    for d in model.diaphragms:
        to = _lookup(targets, d.level, f"diaphragm {d.id}", model.source)
        out.setdefault(to, []).append(d)
    return out


def _slab_parts(
    landing: Sequence[Diaphragm], loads: DeadLoads
) -> tuple[list[_Row], list[MassItem]]:
    """Slabs of the level, and of levels without a diaphragm whose weight lands
    here (``landing``, in model order)."""
    rows: list[_Row] = []
    masses: list[MassItem] = []
    for d in landing:
        is_roof = d.kind.upper() == "ROOF"
        q = loads.roof if is_roof else loads.floor
        weight = d.area * q
        rows.append(("roof" if is_roof else "floor", q, d.area, weight, d.slab_guids))
        if weight > 0.0:
            masses.append(_spread("slab", d, weight))
    return rows, masses


def _spread(source: str, d: Diaphragm, weight: float) -> MassItem:
    """A weight spread uniformly over a diaphragm region."""
    c = d.polygon.centroid
    return MassItem(
        source=source,
        ref=d.id,
        weight=float(weight),
        location=(float(c.x), float(c.y)),
        polygon=d.polygon,
    )


def _extra_masses(
    model: BuildingModel, level: Level, extra: float, located: MassTable
) -> list[MassItem]:
    """Extra weight over the diaphragms by area; without any, at the walls' centre."""
    if extra <= 0.0:
        return []
    regions = model.diaphragms_of(level.name)
    if regions:
        total = math.fsum(d.area for d in regions)
        return [_spread("extra", d, extra * d.area / total) for d in regions]
    if not located:
        msg = (
            f"level {level.name!r} (GUID {level.guid}): loads.extra has no diaphragm "
            "or wall to locate it on; check the slabs or [levels].diaphragms"
        )
        raise ParameterError(msg)
    logger.info(
        "level %r: no diaphragm; extra weight placed at the walls' centre", level.name
    )
    return [
        MassItem(
            source="extra", ref="", weight=float(extra), location=_centroid(located)
        )
    ]


def _centroid(masses: MassTable) -> tuple[float, float]:
    w, xy = masses.weight, masses.xy
    total = math.fsum(w.tolist())  # fsum: exact, whatever the order
    x = math.fsum((w * xy[:, 0]).tolist()) / total
    y = math.fsum((w * xy[:, 1]).tolist()) / total
    return (float(x), float(y))


def _level_load(
    model: BuildingModel,
    level: Level,
    *,
    base: Level,
    loads: DeadLoads,
    landing: Sequence[Diaphragm],
    shares: WallShares | None,
    extra: float,
) -> LevelLoad:
    rows, slabs = _slab_parts(landing, loads)
    located = MassTable.join(
        [MassTable.of(slabs)] + ([] if shares is None else [shares.masses()])
    )
    extras = _extra_masses(model, level, extra, located)
    masses = MassTable.join([located, MassTable.of(extras)]) if extras else located
    breakdown = _grouped(rows) + ([] if shares is None else shares.breakdown())
    if extra > 0.0:
        breakdown.append(
            WeightItem(source="extra", quantity=0.0, unit_load=0.0, weight=extra)
        )
    seismic_weight = math.fsum(item.weight for item in breakdown)
    if not seismic_weight > 0.0:
        msg = (
            f"level {level.name!r} (GUID {level.guid}) has no seismic weight: no "
            "slabs, walls or extra weight; check the slabs or [levels].diaphragms"
        )
        raise ParameterError(msg)
    return LevelLoad(
        level=level.name,
        guid=level.guid,
        elevation=level.elevation,
        height=float(level.elevation - base.elevation),
        seismic_weight=float(seismic_weight),
        breakdown=tuple(breakdown),
        mass_centroid=_centroid(masses),
        masses=masses,
    )


def level_weights(
    model: BuildingModel,
    loads: DeadLoads,
    options: AnalysisOptions,
    *,
    base_level: str = "",
) -> tuple[LevelLoad, ...]:
    """Seismic weight of every diaphragm level above the seismic base.

    ASCE 7-16 §12.7.2 (effective seismic weight: dead load above the base, plus the
    extras the user gives for partitions, equipment and snow). Common practice for the
    take-off from the model: see the module docstring.

    Args:
        model: Structural model (levels, diaphragms, wall segments) [m].
        loads: Dead loads: floor and roof per plan area, wall per elevation area [Pa],
            extra weight per level [N].
        options: Analysis options: assembly wall loads and the diaphragm levels.
        base_level: Name of the seismic base level; ``""`` for the lowest level.

    Returns:
        One ``LevelLoad`` per diaphragm level, bottom up, with ``seismic_weight`` [N],
        its ``breakdown``, the height above the base [m], the located ``masses`` and
        their centroid [m]; forces are left at zero.

    Raises:
        ParameterError: An unknown base or diaphragm level name, extra weight for a
            level that is not a diaphragm level, or a level with no seismic weight.
    """
    base = _base(model, base_level)
    diaphragms = _diaphragm_levels(model, options, base)
    targets = _targets(model, base, diaphragms)
    shares = wall_shares(
        model.walls,
        targets,
        unit_load=lambda w: wall_unit_load(w, loads, options),
        area_of=wall_elevation_area,
        missing=lambda name, w: _lookup(targets, name, f"wall {w.guid}", model.source),
    )
    extras = _extras(loads, model, diaphragms)
    landing = _landing(model, targets)
    return tuple(
        _level_load(
            model,
            lv,
            base=base,
            loads=loads,
            landing=landing.get(lv.name, ()),
            shares=shares.get(lv.name),
            extra=extras.get(lv.name, 0.0),
        )
        for lv in diaphragms
    )
