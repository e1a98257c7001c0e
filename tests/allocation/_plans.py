"""Small plans for the piers, lines, flexible and load-path tests (plan X-Y in m).

Invented test geometry, not a real building. Every helper builds the project's own
records directly (no IFC): wall segments, diaphragms, piers and level loads.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence

from shapely.geometry import Polygon

from allocation.flexible import allocate_flexible
from allocation.lines import find_lines
from allocation.parameters import AnalysisOptions
from allocation.piers import make_piers
from allocation.results import (
    FlexibleResult,
    LevelLoad,
    MassItem,
    Pier,
    PointLoad,
    ResistanceLine,
    StackedShear,
)
from ifc_bridge.model import (
    BuildingModel,
    Diaphragm,
    Direction,
    Level,
    Opening,
    WallSegment,
)

OPTIONS = AnalysisOptions()


def opening(
    guid: str, start: float, end: float, *, bottom: float = 0.0, top: float = 2.1
) -> Opening:
    """An opening from ``start`` to ``end`` along the wall [m]."""
    return Opening(guid=guid, start=start, end=end, bottom=bottom, top=top)


def segment(
    guid: str,
    start: tuple[float, float],
    end: tuple[float, float],
    *,
    level: str = "L1",
    storey: str = "L0",
    openings: Sequence[Opening] = (),
    shear: bool = True,
    assembly: str = "A",
    part: int = 0,
    base: float = 0.0,
    height: float = 3.0,
) -> WallSegment:
    """A wall segment 0.2 m thick standing on ``storey``, supporting ``level``."""
    return WallSegment(
        guid=guid,
        name=f"wall {guid}",
        storey=storey,
        level=level,
        part=part,
        base_elevation=base,
        top_elevation=base + height,
        start=start,
        end=end,
        thickness=0.2,
        openings=tuple(openings),
        is_shear_wall=shear,
        assembly=assembly if shear else "",
    )


def building(walls: Sequence[WallSegment], diaphragms: Sequence[Diaphragm] = ()):
    """A two-level model (L0 at 0 m, L1 at 3 m) holding the walls and diaphragms."""
    levels = (
        Level(name="L0", guid="G-L0", elevation=0.0, index=0),
        Level(name="L1", guid="G-L1", elevation=3.0, index=1),
    )
    return BuildingModel(
        source="plans.ifc",
        schema="IFC4",
        levels=levels,
        diaphragms=tuple(diaphragms),
        walls=tuple(walls),
    )


def diaphragm(polygon: Polygon, *, level: str = "L1", n: int = 1) -> Diaphragm:
    """Diaphragm ``<level>/D<n>`` made of slab ``S-<level>-<n>``."""
    return Diaphragm(
        id=f"{level}/D{n}",
        level=level,
        polygon=polygon,
        slab_guids=(f"S-{level}-{n}",),
        kind="FLOOR",
        elevation=3.0,
    )


def x_wall(guid: str, y: float, x0: float, x1: float, **kw) -> WallSegment:
    """Shear wall along X at ``y`` from ``x0`` to ``x1``."""
    return segment(guid, (x0, y), (x1, y), **kw)


def y_wall(guid: str, x: float, y0: float, y1: float, **kw) -> WallSegment:
    """Shear wall along Y at ``x`` from ``y0`` to ``y1``."""
    return segment(guid, (x, y0), (x, y1), **kw)


def pier(
    guid: str,
    start: tuple[float, float],
    end: tuple[float, float],
    *,
    stiffness: float = 0.0,
    assembly: str = "A",
    level: str = "L1",
    line: str = "",
) -> Pier:
    """A pier from ``start`` to ``end``; direction from its axis (X or Y only)."""
    direction = (
        Direction.X if abs(end[1] - start[1]) < abs(end[0] - start[0]) else Direction.Y
    )
    return Pier(
        id=f"{guid}|{level}|0|0",
        guid=guid,
        name=guid,
        pier=0,
        part=0,
        level=level,
        storey="L0",
        direction=direction,
        start=start,
        end=end,
        height=3.0,
        thickness=0.2,
        assembly=assembly,
        stiffness=stiffness,
        line=line,
    )


def lines_of(
    walls: Sequence[WallSegment],
    regions: Sequence[Diaphragm],
    *,
    level: str = "L1",
    level_index: int = 1,
) -> tuple[tuple[ResistanceLine, ...], tuple[Pier, ...]]:
    """Piers and lines of one level, through make_piers and find_lines."""
    piers, _ = make_piers(walls, OPTIONS)
    lines, piers, _ = find_lines(
        piers, regions, level=level, level_index=level_index, options=OPTIONS
    )
    return lines, piers


def slab_load(
    regions: Sequence[Diaphragm],
    *,
    Fx: float,
    unit_weight: float = 1000.0,
    extra: Sequence[MassItem] = (),
    level: str = "L1",
) -> LevelLoad:
    """A level whose weight is ``unit_weight`` [Pa] over each region, plus ``extra``."""
    masses = tuple(
        MassItem(
            source="slab",
            ref=d.id,
            weight=unit_weight * d.area,
            location=(d.polygon.centroid.x, d.polygon.centroid.y),
            polygon=d.polygon,
        )
        for d in regions
    ) + tuple(extra)
    W = sum(m.weight for m in masses)
    return LevelLoad(
        level=level,
        guid=f"G-{level}",
        elevation=3.0,
        height=3.0,
        seismic_weight=W,
        breakdown=(),
        story_force=Fx,
        masses=masses,
    )


def wall_mass(
    guid: str, weight: float, at: tuple[float, float], *, part: int = 0
) -> MassItem:
    """A wall's tributary weight [N] as a point at ``at``."""
    return MassItem(source="wall", ref=guid, weight=weight, location=at, pier_part=part)


def by_offset(lines: Sequence[ResistanceLine], forces: dict[str, float]) -> list[float]:
    """Line forces in order of increasing offset [N]."""
    return [forces[ln.id] for ln in sorted(lines, key=lambda ln: ln.offset)]


def run_flexible(
    walls: Sequence[WallSegment],
    regions: Sequence[Diaphragm],
    *,
    Fx: float = 1000.0,
    direction: Direction = Direction.X,
    extra: Sequence[MassItem] = (),
    point_loads: Sequence[PointLoad] = (),
    stacked: Callable[[Sequence[ResistanceLine]], StackedShear] | None = None,
) -> tuple[tuple[ResistanceLine, ...], tuple[Pier, ...], FlexibleResult]:
    """Lines, piers and the flexible result of one level with 1 kPa slabs;
    ``stacked`` makes the stacked shear from the level's lines."""
    lines, piers = lines_of(walls, regions)
    load = slab_load(regions, Fx=Fx, extra=extra)
    result = allocate_flexible(
        load,
        regions,
        lines,
        piers,
        direction=direction,
        point_loads=point_loads,
        stacked=None if stacked is None else stacked(lines),
    )
    return lines, piers, result
