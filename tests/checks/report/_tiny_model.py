"""A tiny two-storey box building and findings on it, built from the dataclasses.

Invented data for the BCF tests only (no engineering values are checked against it):
a 10 m x 8 m box, 3 m storeys, four perimeter walls per storey, a floor diaphragm with
a 2 m x 2 m stair hole at Level 2 and no diaphragm at the roof.
"""

from __future__ import annotations

import datetime as dt
import uuid

import ifcopenshell.guid
from shapely.geometry import Polygon

from checks.findings import Finding, Severity
from ifc_bridge.model import BuildingModel, Diaphragm, Direction, Level, WallSegment

NOW = dt.datetime(2024, 5, 1, 12, 0, 0, tzinfo=dt.UTC)
LATER = dt.datetime(2024, 6, 3, 9, 30, 0, tzinfo=dt.UTC)
AUTHOR = "engineer@example.com"
ARCHITECT = "architect@example.com"


def gid(name: str) -> str:
    """A valid, deterministic IFC GlobalId (22 characters) for a name."""
    return ifcopenshell.guid.compress(
        uuid.uuid5(uuid.NAMESPACE_URL, f"shearline-test/{name}").hex
    )


_SIDES = (
    ((0.0, 0.0), (10.0, 0.0)),
    ((10.0, 0.0), (10.0, 8.0)),
    ((10.0, 8.0), (0.0, 8.0)),
    ((0.0, 8.0), (0.0, 0.0)),
)
_NAMES = ("S", "E", "N", "W")


def _walls(storey: str, level: str, base: float) -> tuple[WallSegment, ...]:
    return tuple(
        WallSegment(
            guid=gid(f"{storey}/{n}"),
            name=f"{storey} {n}",
            storey=storey,
            level=level,
            base_elevation=base,
            top_elevation=base + 3.0,
            start=s,
            end=e,
            thickness=0.2,
            is_shear_wall=True,
        )
        for n, (s, e) in zip(_NAMES, _SIDES, strict=True)
    )


def tiny_model(*, south_wall_at_level_1: bool = True) -> BuildingModel:
    """The box; optionally without the south wall of Level 1 (a 'revised' model)."""
    levels = (
        Level(
            name="Level 1",
            guid=gid("L1"),
            elevation=0.0,
            index=0,
            is_diaphragm_level=False,
        ),
        Level(name="Level 2", guid=gid("L2"), elevation=3.0, index=1),
        Level(name="Roof", guid=gid("R"), elevation=6.0, index=2),
    )
    floor = Polygon(
        [(0, 0), (10, 0), (10, 8), (0, 8)], [[(2, 2), (4, 2), (4, 4), (2, 4)]]
    )
    diaphragm = Diaphragm(
        id="Level 2/D1",
        level="Level 2",
        polygon=floor,
        slab_guids=(gid("slab2"),),
        kind="FLOOR",
        elevation=3.0,
    )
    walls = _walls("Level 1", "Level 2", 0.0) + _walls("Level 2", "Roof", 3.0)
    if not south_wall_at_level_1:
        walls = tuple(w for w in walls if w.guid != gid("Level 1/S"))
    return BuildingModel(
        source="tiny.ifc",
        schema="IFC4",
        project_name="Tiny box",
        project_guid=gid("project"),
        levels=levels,
        diaphragms=(diaphragm,),
        walls=walls,
    )


def wall_finding(
    side: str = "S", *, storey: str = "Level 1", demand: float = 5000.0
) -> Finding:
    """An over-capacity finding on one wall (unit shear, N/m)."""
    level = "Level 2" if storey == "Level 1" else "Roof"
    return Finding(
        rule="unit_shear",
        clause="SDPWS 2015 §4.3",
        severity=Severity.ERROR,
        level=level,
        direction=Direction.X if side in "SN" else Direction.Y,
        guids=(gid(f"{storey}/{side}"),),
        title=f"Wall {storey} {side} over capacity",
        description=(
            "Unit shear above the assembly's allowable value; "
            "lengthen the wall or upgrade the assembly."
        ),
        demand=demand,
        capacity=3800.0,
        unit="N/m",
        discriminator=f"{level}|X",
    )


def diaphragm_finding() -> Finding:
    """A warning on the Level 2 slab (no wall GlobalId)."""
    return Finding(
        rule="reentrant_corner",
        clause="ASCE 7-16 Table 12.3-1",
        severity=Severity.WARNING,
        level="Level 2",
        direction=None,
        guids=(gid("slab2"),),
        title="Opening near the diaphragm edge",
        description="Stair opening; check the chords around it.",
    )
