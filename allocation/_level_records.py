"""Result records of the seismic weight and forces per level (part of ``results``).

Frozen dataclasses, SI throughout (N, m); re-exported by :mod:`allocation.results`.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from shapely.geometry import Polygon

from ifc_bridge.model import IfcGuid

__all__ = ["LevelLoad", "MassItem", "SeismicSummary", "WeightItem"]


@dataclass(frozen=True, slots=True, kw_only=True)
class WeightItem:
    """One entry of a level's seismic weight breakdown.

    Attributes:
        source: ``"floor"``, ``"roof"``, ``"walls below"``, ``"walls above"``, ``"extra"``.
        quantity: Area [m²] (or 0 for a lump).
        unit_load: Dead load per area [Pa] (or 0 for a lump).
        weight: Weight [N].
        guids: Elements that contribute, sorted.
    """

    source: str
    quantity: float
    unit_load: float
    weight: float
    guids: tuple[IfcGuid, ...] = ()


@dataclass(frozen=True, slots=True, kw_only=True)
class MassItem:
    """A part of a level's seismic weight with its plan location, for the allocation.

    Attributes:
        source: ``"slab"``, ``"wall"`` or ``"extra"``.
        ref: Diaphragm id (slab, extra) or wall GlobalId (wall).
        weight: Weight [N].
        location: Centroid (x, y) [m].
        polygon: For a distributed item (slab, extra), the plan region it is spread
            over uniformly; None for a point item (a wall's tributary weight, at its
            mid-point).
        pier_part: For a wall: ``WallSegment.part`` of the segment, else 0.
    """

    source: str
    ref: str
    weight: float
    location: tuple[float, float]
    polygon: Polygon | None = None
    pier_part: int = 0


@dataclass(frozen=True, slots=True, kw_only=True)
class LevelLoad:
    """Seismic weight and forces of one diaphragm level.

    Attributes:
        level: Level name.
        guid: IfcBuildingStorey GlobalId.
        elevation: Elevation [m].
        height: Height above the seismic base, hx [m].
        seismic_weight: wx [N].
        breakdown: Items that add up to ``seismic_weight``.
        story_force: Fx, ASCE 7-16 Eq. 12.8-11 (or given) [N].
        story_shear: Vx = sum of Fi at and above, Eq. 12.8-13 [N].
        diaphragm_force: Fpx, ASCE 7-16 Eq. 12.10-1 with its bounds [N].
        Cvx: Vertical distribution factor, Eq. 12.8-12 [-] (0 for given forces).
        mass_centroid: Centre of the weight at this level (x, y) [m].
        masses: The weight as located items; weights add up to ``seismic_weight``
            (a tuple, or the columns of the weight take-off: ``_mass_table``).
    """

    level: str
    guid: IfcGuid
    elevation: float
    height: float
    seismic_weight: float
    breakdown: tuple[WeightItem, ...]
    story_force: float = 0.0
    story_shear: float = 0.0
    diaphragm_force: float = 0.0
    Cvx: float = 0.0
    mass_centroid: tuple[float, float] = (0.0, 0.0)
    masses: Sequence[MassItem] = ()


@dataclass(frozen=True, slots=True, kw_only=True)
class SeismicSummary:
    """Base shear and the equivalent lateral force parameters, ASCE 7-16 §12.8.

    Attributes:
        procedure: ``"elf"`` or ``"given"``.
        hn: Structural height [m].
        Ta: Approximate period, Eq. 12.8-7 [s].
        T: Period used [s].
        Cu: Upper-limit coefficient, Table 12.8-1 [-].
        Cs: Seismic response coefficient used [-].
        Cs_governs: Which of Eq. 12.8-2 to 12.8-6 set ``Cs``.
        k: Distribution exponent, §12.8.3 [-].
        W: Effective seismic weight [N].
        V: Base shear, Eq. 12.8-1 [N].
    """

    procedure: str
    hn: float
    Ta: float
    T: float
    Cu: float
    Cs: float
    Cs_governs: str
    k: float
    W: float
    V: float
