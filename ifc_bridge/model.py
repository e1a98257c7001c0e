"""The structural model read from an IFC file: levels, diaphragms and wall segments.

Plain frozen dataclasses; this module imports no ifcopenshell, so ``allocation`` can use
it without the IFC toolkit. Everything is SI: metres, radians. Plan geometry is global
X-Y (the IFC world coordinate system, after the file's unit scale), Z up, right-handed.

Axes and signs: a wall's ``start`` and ``end`` are its plan centreline end points; its
``angle`` is the direction of ``end - start`` measured counter-clockwise from +X, folded
into [0, pi). Opening intervals are distances along the centreline from ``start``.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from enum import StrEnum

from shapely.geometry import LineString, Polygon

__all__ = [
    "BuildingModel",
    "Diaphragm",
    "Direction",
    "IfcGuid",
    "ImportIssue",
    "IssueSeverity",
    "Level",
    "ModelError",
    "Opening",
    "WallSegment",
]

IfcGuid = str


class ModelError(ValueError):
    """An invariant of the structural model is broken; the message names the GUID."""


class Direction(StrEnum):
    """Plan direction of a seismic force and of the walls that resist it."""

    X = "X"
    Y = "Y"

    @property
    def other(self) -> Direction:
        """The perpendicular direction."""
        return Direction.Y if self is Direction.X else Direction.X


class IssueSeverity(StrEnum):
    """How much an import issue matters to the analysis."""

    ERROR = "error"
    WARNING = "warning"
    INFO = "info"


@dataclass(frozen=True, slots=True, kw_only=True)
class ImportIssue:
    """A problem with one element (or the file) found while reading; becomes a finding.

    Attributes:
        code: Short machine-readable kind, e.g. ``"wall_no_geometry"``.
        severity: How much it matters.
        message: One line naming the file, element GlobalId and what to fix.
        guids: GlobalIds of the elements concerned (may be empty for file-level issues).
        storey: Name of the storey concerned, or ``""``.
    """

    code: str
    severity: IssueSeverity
    message: str
    guids: tuple[IfcGuid, ...] = ()
    storey: str = ""


@dataclass(frozen=True, slots=True, kw_only=True)
class Level:
    """A building storey with an elevation.

    Attributes:
        name: ``IfcBuildingStorey.Name`` (unique within the model; the reader
            disambiguates duplicates by appending the GlobalId).
        guid: GlobalId of the IfcBuildingStorey.
        elevation: Storey elevation [m], from ``Elevation`` or the placement.
        index: Position in the elevation-sorted list, 0 = lowest.
        is_diaphragm_level: True when the level carries a diaphragm that receives
            seismic force (it has slabs, or the config names it).
    """

    name: str
    guid: IfcGuid
    elevation: float
    index: int
    is_diaphragm_level: bool = True

    def __post_init__(self) -> None:
        if not math.isfinite(self.elevation):
            msg = f"storey {self.guid} ({self.name!r}): elevation {self.elevation} is not finite"
            raise ModelError(msg)


@dataclass(frozen=True, slots=True, kw_only=True)
class Diaphragm:
    """One connected diaphragm region of a level, from the union of its slabs.

    Attributes:
        id: Stable id, ``"<level name>/D<n>"``, n from 1 in order of decreasing area.
        level: Name of the level it belongs to.
        polygon: Plan outline with slab openings (stairs, shafts) as holes [m].
        slab_guids: GlobalIds of the IfcSlab elements that form it, sorted.
        kind: ``"FLOOR"``, ``"ROOF"`` or ``"BASESLAB"`` (the predominant slab type).
        elevation: Top-of-slab elevation used for the level [m].
    """

    id: str
    level: str
    polygon: Polygon
    slab_guids: tuple[IfcGuid, ...]
    kind: str
    elevation: float

    def __post_init__(self) -> None:
        if self.polygon.is_empty or self.polygon.area <= 0.0:
            msg = f"diaphragm {self.id} (slabs {', '.join(self.slab_guids)}): empty plan polygon"
            raise ModelError(msg)

    @property
    def area(self) -> float:
        """Plan area net of openings [m²]."""
        return float(self.polygon.area)


@dataclass(frozen=True, slots=True, kw_only=True)
class Opening:
    """An opening (door, window, void) in a wall, as an interval along its centreline.

    Attributes:
        guid: GlobalId of the IfcOpeningElement.
        start: Distance from the wall's start point to the opening's near edge [m].
        end: Distance from the wall's start point to the opening's far edge [m].
        bottom: Sill height above the wall base [m].
        top: Head height above the wall base [m].
        filled_by: GlobalIds of the doors or windows that fill it.
    """

    guid: IfcGuid
    start: float
    end: float
    bottom: float
    top: float
    filled_by: tuple[IfcGuid, ...] = ()

    def __post_init__(self) -> None:
        if not (self.end > self.start and self.top > self.bottom):
            msg = (
                f"opening {self.guid}: empty interval [{self.start}, {self.end}] m "
                f"x [{self.bottom}, {self.top}] m"
            )
            raise ModelError(msg)

    @property
    def width(self) -> float:
        """Width along the wall [m]."""
        return self.end - self.start


@dataclass(frozen=True, slots=True, kw_only=True)
class WallSegment:
    """One story-high piece of an IfcWall (a wall through two storeys gives two).

    Attributes:
        guid: GlobalId of the IfcWall; shared by all segments of one wall.
        name: ``IfcWall.Name`` (or ``""``).
        storey: Name of the level the segment stands on.
        level: Name of the level whose diaphragm it supports (the next level up),
            or ``""`` when nothing is above it (a parapet, a wall above the roof).
        part: 0 for a wall within one story; 0, 1, ... bottom-up for a wall that runs
            through several storey levels and was split.
        base_elevation: Bottom of the segment [m].
        top_elevation: Top of the segment [m].
        start: Plan start point of the centreline (x, y) [m].
        end: Plan end point of the centreline (x, y) [m].
        thickness: Wall thickness [m].
        openings: Openings as intervals along the centreline, sorted by ``start``.
        type_name: Name of the wall's IfcWallType, or ``""``.
        materials: Names of the wall's materials (layer order), may be empty.
        predefined_type: Effective PredefinedType (occurrence, else type), or ``""``.
        properties: Flattened property values, ``("Pset_WallCommon.LoadBearing",
            "True")`` pairs, sorted; used by assembly match rules.
        is_shear_wall: True when recognised as a shear wall (PredefinedType SHEAR or
            an assembly match rule).
        assembly: Name of the matched ``[[assemblies]]`` entry, or ``""``.
        curved: True when the IFC wall is curved and this segment is its chord.
    """

    guid: IfcGuid
    name: str
    storey: str
    level: str
    part: int = 0
    base_elevation: float
    top_elevation: float
    start: tuple[float, float]
    end: tuple[float, float]
    thickness: float
    openings: tuple[Opening, ...] = ()
    type_name: str = ""
    materials: tuple[str, ...] = ()
    predefined_type: str = ""
    properties: tuple[tuple[str, str], ...] = ()
    is_shear_wall: bool = False
    assembly: str = ""
    curved: bool = False

    def __post_init__(self) -> None:
        values = (*self.start, *self.end, self.base_elevation, self.top_elevation)
        if not all(math.isfinite(v) for v in values):
            msg = f"wall {self.guid}: non-finite coordinate in {values}"
            raise ModelError(msg)
        if self.length <= 1e-6:
            msg = f"wall {self.guid} ({self.name!r}): zero length at {self.start}"
            raise ModelError(msg)
        if self.height <= 0.0:
            msg = (
                f"wall {self.guid} ({self.name!r}): top {self.top_elevation} m is not "
                f"above base {self.base_elevation} m"
            )
            raise ModelError(msg)
        if not self.thickness > 0.0:
            msg = f"wall {self.guid} ({self.name!r}): thickness {self.thickness} m <= 0"
            raise ModelError(msg)

    @property
    def length(self) -> float:
        """Plan length of the centreline [m]."""
        return math.hypot(self.end[0] - self.start[0], self.end[1] - self.start[1])

    @property
    def height(self) -> float:
        """Segment height [m]."""
        return self.top_elevation - self.base_elevation

    @property
    def angle(self) -> float:
        """Centreline direction from +X, counter-clockwise, folded into [0, pi) [rad]."""
        a = math.atan2(self.end[1] - self.start[1], self.end[0] - self.start[0])
        return a % math.pi

    @property
    def axis(self) -> LineString:
        """Plan centreline [m]."""
        return LineString([self.start, self.end])

    @property
    def midpoint(self) -> tuple[float, float]:
        """Plan mid-point of the centreline [m]."""
        return (
            (self.start[0] + self.end[0]) / 2.0,
            (self.start[1] + self.end[1]) / 2.0,
        )

    def property_value(self, key: str) -> str | None:
        """Value of a flattened ``"Pset.Property"`` key, or None."""
        for k, v in self.properties:
            if k == key:
                return v
        return None


@dataclass(frozen=True, slots=True, kw_only=True)
class BuildingModel:
    """Everything the analysis needs from one IFC file.

    Attributes:
        source: Path of the IFC file read.
        schema: IFC schema of the file (``"IFC2X3"``, ``"IFC4"``, ``"IFC4X3"``).
        project_name: ``IfcProject.Name`` (or ``""``).
        project_guid: GlobalId of the IfcProject.
        length_unit_scale: File length unit in metres (0.3048 for feet), as read.
        levels: Levels sorted by elevation, lowest first.
        diaphragms: Diaphragm regions of all levels.
        walls: Wall segments of all levels (every IfcWall, shear wall or not).
        ifc_wall_count: Number of IfcWall entities (subtypes included) in the file.
        issues: Problems found while reading, for the report and findings.
        storey_guids: Storey name -> GlobalId, for every storey read.
        wall_storeys: ``(IfcWall GlobalId, storey name it stands on)`` for every IfcWall
            in the file, including walls with no usable geometry (``""`` when it is in
            no storey and none could be inferred); ``inspect`` counts walls from it.
    """

    source: str
    schema: str
    project_name: str = ""
    project_guid: IfcGuid = ""
    length_unit_scale: float = 1.0
    levels: tuple[Level, ...]
    diaphragms: tuple[Diaphragm, ...] = ()
    walls: tuple[WallSegment, ...] = ()
    ifc_wall_count: int = 0
    issues: tuple[ImportIssue, ...] = ()
    storey_guids: tuple[tuple[str, IfcGuid], ...] = field(default=())
    wall_storeys: tuple[tuple[IfcGuid, str], ...] = field(default=())

    def __post_init__(self) -> None:
        elevations = [lv.elevation for lv in self.levels]
        if elevations != sorted(elevations):
            msg = f"{self.source}: levels are not sorted by elevation: {elevations}"
            raise ModelError(msg)
        names = [lv.name for lv in self.levels]
        if len(set(names)) != len(names):
            msg = f"{self.source}: duplicate level names {names}"
            raise ModelError(msg)

    def level(self, name: str) -> Level:
        """The level of that name.

        Raises:
            KeyError: No level has that name.
        """
        for lv in self.levels:
            if lv.name == name:
                return lv
        raise KeyError(name)

    def diaphragms_of(self, level: str) -> tuple[Diaphragm, ...]:
        """Diaphragm regions of one level."""
        return tuple(d for d in self.diaphragms if d.level == level)

    def walls_supporting(self, level: str) -> tuple[WallSegment, ...]:
        """Wall segments whose top supports the diaphragm of ``level``."""
        return tuple(w for w in self.walls if w.level == level)

    @property
    def shear_walls(self) -> tuple[WallSegment, ...]:
        """Wall segments recognised as shear walls."""
        return tuple(w for w in self.walls if w.is_shear_wall)
