"""Result records of the allocation: piers, lines, pieces, forces per method and case.

Frozen dataclasses, SI throughout (N, m, N/m). Forces in a wall or line are signed
in-plane shears along the force direction; reports use magnitudes. Each result records
what produced it (method, direction, case) so writers need no other context.

Ids:
    * ``PierId``: ``"<wall guid>|<level>|<part>|<pier>"`` (unique per story piece and pier).
    * ``LineId``: ``"L<level index>-<X|Y>-<n>"``, n from 1 in order of increasing offset.
    * piece id: ``"<diaphragm id>/<X|Y><n>"``.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from enum import StrEnum

from shapely.geometry import Polygon

from allocation._level_records import LevelLoad, MassItem, SeismicSummary, WeightItem
from ifc_bridge.model import Direction, IfcGuid

__all__ = [
    "Allocation",
    "Condition",
    "ConditionKind",
    "DiaphragmPiece",
    "FlexibleResult",
    "LevelLoad",
    "LineId",
    "LoadCase",
    "MassItem",
    "Method",
    "Pier",
    "PierEnvelope",
    "PierId",
    "PointLoad",
    "ResistanceLine",
    "RigidResult",
    "SeismicSummary",
    "StackedShear",
    "WeightItem",
]

PierId = str
LineId = str


class Method(StrEnum):
    """Diaphragm idealisation that produced a force."""

    FLEXIBLE = "flexible"
    RIGID = "rigid"
    ENVELOPE = "envelope"


class ConditionKind(StrEnum):
    """Engineering conditions found while allocating; ``checks`` makes findings of them."""

    NO_LINE = "no_line"  # a level and direction with no line of resistance
    UNSUPPORTED_PIECE = "unsupported_piece"  # diaphragm piece touching no line
    CANTILEVER_PIECE = "cantilever_piece"  # diaphragm piece touching one line
    NON_STACKING_WALL = (
        "non_stacking_wall"  # upper wall with no line below (point load)
    )
    SKEWED_WALL = "skewed_wall"  # shear wall beyond the angle tolerance of X and Y
    NO_SHEAR_WALLS = "no_shear_walls"  # a story with no shear wall at all
    TORSIONAL_INSTABILITY = "torsional_instability"  # rigid: no torsional stiffness
    WALL_OFF_DIAPHRAGM = "wall_off_diaphragm"  # shear wall not under any diaphragm
    NO_PIER = "no_pier"  # shear wall whose openings leave no full-height pier
    STIFFNESS_FALLBACK = (
        "stiffness_fallback"  # assembly stiffness inputs missing: length used
    )


@dataclass(frozen=True, slots=True, kw_only=True)
class Condition:
    """An engineering condition: data for a finding, not an exception.

    Attributes:
        kind: What was found.
        level: Level name.
        direction: Direction concerned, or None.
        guids: GlobalIds of the elements involved (walls, slabs), sorted.
        detail: One line an engineer can act on.
        value: A number that goes with it (a force [N], a length [m]), or None.
        ref: Id of the piece or line concerned, or ``""``.
    """

    kind: ConditionKind
    level: str
    direction: Direction | None
    guids: tuple[IfcGuid, ...]
    detail: str
    value: float | None = None
    ref: str = ""


@dataclass(frozen=True, slots=True, kw_only=True)
class Pier:
    """A full-height piece of a shear wall segment between openings (or the whole segment).

    Attributes:
        id: ``"<guid>|<level>|<part>|<pier>"``.
        guid: GlobalId of the IfcWall.
        name: Wall name.
        pier: 0 for a wall without openings, else 0, 1, ... along the wall.
        part: Story piece index of the wall (``WallSegment.part``).
        level: Level whose diaphragm it supports.
        storey: Level it stands on.
        direction: X or Y; None for a skewed wall (reported, not allocated).
        start: Plan start point (x, y) [m].
        end: Plan end point (x, y) [m].
        height: Clear height of the pier [m] (segment height).
        thickness: [m].
        assembly: Assembly name, or ``""``.
        stiffness: Relative or absolute in-plane stiffness used by the rigid analysis
            [N/m] (for ``wall_stiffness = "length"``, numerically the length in m).
        line: Id of the line it belongs to, or ``""``.
    """

    id: PierId
    guid: IfcGuid
    name: str
    pier: int
    part: int
    level: str
    storey: str
    direction: Direction | None
    start: tuple[float, float]
    end: tuple[float, float]
    height: float
    thickness: float
    assembly: str = ""
    stiffness: float = 0.0
    line: LineId = ""

    @property
    def length(self) -> float:
        """Plan length [m]."""
        dx, dy = self.end[0] - self.start[0], self.end[1] - self.start[1]
        return (dx * dx + dy * dy) ** 0.5

    @property
    def midpoint(self) -> tuple[float, float]:
        """Plan mid-point [m]."""
        return (
            (self.start[0] + self.end[0]) / 2.0,
            (self.start[1] + self.end[1]) / 2.0,
        )

    @property
    def aspect_ratio(self) -> float:
        """h/b [-]."""
        return self.height / self.length


@dataclass(frozen=True, slots=True, kw_only=True)
class ResistanceLine:
    """A line of shear walls acting in one direction at one level.

    Attributes:
        id: ``"L<level index>-<X|Y>-<n>"``.
        level: Level whose diaphragm it supports.
        direction: Direction of force it resists (walls parallel to it).
        offset: Perpendicular coordinate: y for X lines, x for Y lines [m];
            the length-weighted mean of its walls' offsets.
        piers: Ids of its piers, in order along the line.
        wall_extent: (min, max) coordinate along the line covered by walls [m].
        wall_length: Sum of pier lengths [m].
        crossings: ``(diaphragm id, crossing length [m])`` for each diaphragm region
            the line cuts.
        collector_length: Crossing length not backed by walls (collectors) [m].
        offset_range: (min, max) perpendicular coordinate of its piers' end points
            [m]; wider than a point when walls are slightly off-axis. None = offset.
    """

    id: LineId
    level: str
    direction: Direction
    offset: float
    piers: tuple[PierId, ...]
    wall_extent: tuple[float, float]
    wall_length: float
    crossings: tuple[tuple[str, float], ...] = ()
    collector_length: float = 0.0
    offset_range: tuple[float, float] | None = None


@dataclass(frozen=True, slots=True, kw_only=True)
class DiaphragmPiece:
    """A piece of a diaphragm between adjacent lines, for one direction.

    Attributes:
        id: ``"<diaphragm id>/<X|Y><n>"``.
        diaphragm: Diaphragm id.
        level: Level name.
        direction: Direction of the force.
        polygon: Plan outline [m].
        weight: Seismic weight assigned to the piece [N].
        force: Inertial force of the piece [N] (its share of Fx).
        centroid: Mass centroid (x, y) [m].
        supports: Ids of the lines it spans between (0, 1 or 2).
        shares: Force delivered to each support ``(line id, force [N])``.
    """

    id: str
    diaphragm: str
    level: str
    direction: Direction
    polygon: Polygon
    weight: float
    force: float
    centroid: tuple[float, float]
    supports: tuple[LineId, ...]
    shares: tuple[tuple[LineId, float], ...]


@dataclass(frozen=True, slots=True, kw_only=True)
class PointLoad:
    """Shear from a wall above that does not stand on a line below.

    Attributes:
        level: Level of the diaphragm that receives it (below the wall).
        direction: Direction of force.
        source_pier: Pier above whose shear enters the diaphragm.
        location: Plan point (x, y) [m].
        force: [N].
        shares: ``(line id, force [N])`` of the lines that take it.
    """

    level: str
    direction: Direction
    source_pier: PierId
    location: tuple[float, float]
    force: float
    shares: tuple[tuple[LineId, float], ...]


@dataclass(frozen=True, slots=True, kw_only=True)
class StackedShear:
    """Shear of the walls above that stand on a line of the level, column-wise.

    Common practice (DESIGN.md item 10): a wall standing on a line of the story
    below delivers its shear straight to that line; the diaphragm does not carry it.
    One entry per such pier, in upper pier order.

    Attributes:
        source_piers: The piers above.
        lines: The line of this level each stands on.
        forces: Each pier's force [N], positive in the +direction.
        locations: Each pier's plan mid-point (x, y) [m].

    Raises:
        ValueError: The columns differ in length.
    """

    source_piers: tuple[PierId, ...] = ()
    lines: tuple[LineId, ...] = ()
    forces: tuple[float, ...] = ()
    locations: tuple[tuple[float, float], ...] = ()

    def __post_init__(self) -> None:
        sizes = {
            len(self.source_piers),
            len(self.lines),
            len(self.forces),
            len(self.locations),
        }
        if len(sizes) > 1:
            msg = f"stacked shear: columns of different lengths {sorted(sizes)}"
            raise ValueError(msg)

    def __len__(self) -> int:
        return len(self.source_piers)


@dataclass(frozen=True, slots=True, kw_only=True)
class FlexibleResult:
    """Flexible-diaphragm allocation of one level and direction.

    Attributes:
        level: Level name.
        direction: Direction of force.
        applied: Level force allocated (Fx plus transfers entering here) [N].
        pieces: Diaphragm pieces with their shares.
        point_loads: Transfers from non-stacking walls above (into the diaphragm).
        line_forces: Force per line [N].
        pier_forces: Force per pier [N].
        conditions: Cantilevered / unsupported pieces and other conditions.
        stacked: Shear of the walls above that stand on a line of this level,
            added to that line's force.
    """

    level: str
    direction: Direction
    applied: float
    pieces: tuple[DiaphragmPiece, ...]
    point_loads: tuple[PointLoad, ...]
    line_forces: dict[LineId, float]
    pier_forces: dict[PierId, float]
    conditions: tuple[Condition, ...] = ()
    method: Method = Method.FLEXIBLE
    stacked: StackedShear = StackedShear()


@dataclass(frozen=True, slots=True, kw_only=True)
class LoadCase:
    """A rigid-diaphragm load case: direction, force sign, accidental eccentricity sign.

    Attributes:
        direction: Direction of force.
        sign: +1 or -1, sense of the force.
        ecc_sign: +1 or -1, sense of the accidental eccentricity.
    """

    direction: Direction
    sign: int
    ecc_sign: int

    @property
    def label(self) -> str:
        """``"+X+e"`` style label."""
        s = "+" if self.sign > 0 else "-"
        e = "+e" if self.ecc_sign > 0 else "-e"
        return f"{s}{self.direction.value}{e}"


@dataclass(frozen=True, slots=True, kw_only=True)
class RigidResult:
    """Rigid-diaphragm allocation of one story for one load case.

    Attributes:
        level: Level whose diaphragm the story's walls support.
        case: Load case.
        story_shear: Vx applied [N] (signed by ``case.sign``).
        center_of_mass: Of the levels at and above (x, y) [m].
        center_of_rigidity: Of the story's walls (x, y) [m].
        eccentricity: Total eccentricity of the shear about the CR, inherent plus
            accidental (amplified), measured perpendicular to the force [m].
        accidental: Accidental eccentricity used, including Ax [m].
        Ax: Torsional amplification factor, Eq. 12.8-14 [-].
        torsion: Torsional moment about the CR, CCW positive [N·m].
        J: Torsional stiffness about the CR [N·m] (in stiffness units × m²).
        pier_forces: Signed in-plane shear per pier [N] (direct + torsional); a
            read-only map (the allocation gives a ``PierForces`` over the story's
            array).
        pier_direct: Direct part per pier [N], likewise.
        drift_ratio_max: Max/avg displacement ratio at the plan extremes [-]
            (Table 12.3-1), computed with Ax = 1.
        conditions: Conditions found.
    """

    level: str
    case: LoadCase
    story_shear: float
    center_of_mass: tuple[float, float]
    center_of_rigidity: tuple[float, float]
    eccentricity: float
    accidental: float
    Ax: float
    torsion: float
    J: float
    pier_forces: Mapping[PierId, float]
    pier_direct: Mapping[PierId, float]
    drift_ratio_max: float = 1.0
    conditions: tuple[Condition, ...] = ()
    method: Method = Method.RIGID


@dataclass(frozen=True, slots=True, kw_only=True)
class PierEnvelope:
    """The governing force of one pier over methods and cases.

    Attributes:
        pier: Pier id.
        flexible: Largest flexible-method magnitude [N].
        rigid: Largest rigid-method magnitude over cases [N].
        envelope: max(flexible, rigid) [N].
        governing_method: Which method gives ``envelope``.
        governing_case: Case label (``"X"`` for flexible, ``"+X+e"`` for rigid).
    """

    pier: PierId
    flexible: float
    rigid: float
    envelope: float
    governing_method: Method
    governing_case: str


@dataclass(frozen=True, slots=True, kw_only=True)
class Allocation:
    """Everything the allocation produced for one building.

    Attributes:
        seismic: Base shear summary.
        levels: Loads per diaphragm level, bottom up.
        piers: All shear-wall piers.
        lines: All lines of resistance.
        flexible: Flexible results per (level, direction).
        rigid: Rigid results per (level, case).
        envelope: Envelope per pier.
        line_envelope: ``{line id: {"flexible": N, "rigid": N, "envelope": N}}``.
        conditions: All engineering conditions, for findings.
        graphs: Load-path graph per direction (networkx DiGraph), built when first
            read (``allocation.load_path.LoadPathGraphs``).
    """

    seismic: SeismicSummary
    levels: tuple[LevelLoad, ...]
    piers: tuple[Pier, ...]
    lines: tuple[ResistanceLine, ...]
    flexible: tuple[FlexibleResult, ...] = ()
    rigid: tuple[RigidResult, ...] = ()
    envelope: dict[PierId, PierEnvelope] = field(default_factory=dict)
    line_envelope: dict[LineId, dict[str, float]] = field(default_factory=dict)
    conditions: tuple[Condition, ...] = ()
    graphs: Mapping[Direction, object] = field(default_factory=dict)
