"""A small two-storey box building built directly from the model dataclasses.

Invented test data (not a real building): plan 20 m × 10 m, storey height 3 m, a roof
parapet 1 m high. Used by the weight and level-force tests.
"""

from __future__ import annotations

from shapely.geometry import Polygon, box

from allocation.parameters import (
    AnalysisOptions,
    AssemblyKind,
    AssemblyProperties,
    DeadLoads,
)
from ifc_bridge.model import BuildingModel, Diaphragm, Level, Opening, WallSegment

LOADS = DeadLoads(floor=700.0, roof=900.0, wall=500.0, extra=(("Level 2", 10_000.0),))
CMU = AssemblyProperties(name="CMU", kind=AssemblyKind.MASONRY, wall_dead_load=2000.0)
OPTIONS = AnalysisOptions(assemblies=(CMU,))
LEVELS = (("Ground", 0.0), ("Level 2", 3.0), ("Roof", 6.0))


def levels(names_elevations=LEVELS, *, no_diaphragm: tuple[str, ...] = ()):
    return tuple(
        Level(
            name=name,
            guid=f"G-{name.replace(' ', '')}",
            elevation=z,
            index=i,
            is_diaphragm_level=name not in no_diaphragm,
        )
        for i, (name, z) in enumerate(names_elevations)
    )


def diaphragm(level: str, z: float, kind: str, polygon: Polygon, n: int = 1):
    return Diaphragm(
        id=f"{level}/D{n}",
        level=level,
        polygon=polygon,
        slab_guids=(f"S-{level.replace(' ', '')}-{n}",),
        kind=kind,
        elevation=z,
    )


def wall(guid, storey, level, z0, z1, start, end, **kw):
    return WallSegment(
        guid=guid,
        name=guid,
        storey=storey,
        level=level,
        base_elevation=z0,
        top_elevation=z1,
        start=start,
        end=end,
        thickness=0.2,
        **kw,
    )


def perimeter(prefix, storey, level, z0, z1, lx=20.0, ly=10.0, **east_kw):
    """South, north, west, east walls of an lx × ly box."""
    return (
        wall(
            f"{prefix}S",
            storey,
            level,
            z0,
            z1,
            (0.0, 0.0),
            (lx, 0.0),
            is_shear_wall=True,
        ),
        wall(
            f"{prefix}N", storey, level, z0, z1, (0.0, ly), (lx, ly), is_shear_wall=True
        ),
        wall(
            f"{prefix}W",
            storey,
            level,
            z0,
            z1,
            (0.0, 0.0),
            (0.0, ly),
            is_shear_wall=True,
        ),
        wall(f"{prefix}E", storey, level, z0, z1, (lx, 0.0), (lx, ly), **east_kw),
    )


def box_building() -> BuildingModel:
    """The reference building of ``tests/allocation/test_weights.py``.

    Story 1 (Ground -> Level 2): perimeter walls, a 2 m × 2 m door in the south wall,
    the east wall of assembly "CMU". Story 2 (Level 2 -> Roof): perimeter walls and an
    interior partition at x = 10 m (not a shear wall). Roof: a 1 m parapet on the north.
    """
    door = Opening(guid="O-door", start=9.0, end=11.0, bottom=0.0, top=2.0)
    story1 = list(
        perimeter(
            "W1", "Ground", "Level 2", 0.0, 3.0, is_shear_wall=True, assembly="CMU"
        )
    )
    story1[0] = wall(
        "W1S", "Ground", "Level 2", 0.0, 3.0, (0.0, 0.0), (20.0, 0.0),
        openings=(door,), is_shear_wall=True,
    )  # fmt: skip
    story2 = (
        *perimeter("W2", "Level 2", "Roof", 3.0, 6.0, is_shear_wall=True),
        wall("W2P", "Level 2", "Roof", 3.0, 6.0, (10.0, 0.0), (10.0, 10.0)),
    )
    parapet = wall("W3N", "Roof", "", 6.0, 7.0, (0.0, 10.0), (20.0, 10.0))
    plan = box(0.0, 0.0, 20.0, 10.0)
    return BuildingModel(
        source="box.ifc",
        schema="IFC4",
        levels=levels(),
        diaphragms=(
            diaphragm("Level 2", 3.0, "FLOOR", plan),
            diaphragm("Roof", 6.0, "ROOF", plan),
        ),
        walls=(*story1, *story2, parapet),
    )
