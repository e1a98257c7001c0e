"""Where a BCF viewpoint's camera stands to frame the elements of a finding.

World coordinates of the IFC file in metres, Z up, right-handed, as in
``ifc_bridge.model``; BCF cameras are in metres too (BCF-API 3.0 README §1.3).
The camera looks down at the box of the elements from the south-east (the +X, -Y
quadrant) at 45 degrees, far enough back that the box's bounding sphere fits in the
field of view.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, field

from ifc_bridge.model import BuildingModel, WallSegment

__all__ = ["Box", "Camera", "element_box", "frame_box"]

_FIELD_OF_VIEW = 60.0  # [deg] vertical; inside the 45-60 range of BCF 2.1 visinfo.xsd
_ELEVATION = math.radians(45.0)
_AZIMUTH = math.radians(-45.0)
_MIN_RADIUS = 1.0  # [m] so a single short wall is not filmed from a few cm
_POINT_HALF_SIZE = 1.5  # [m] box around a bare plan point
_STOREY_HEIGHT = 3.0  # [m] height of a box with no wall to give one; common practice


@dataclass(frozen=True, slots=True, kw_only=True)
class Box:
    """Axis-aligned box in world coordinates.

    Attributes:
        lo: Minimum corner (x, y, z) [m].
        hi: Maximum corner (x, y, z) [m].
    """

    lo: tuple[float, float, float]
    hi: tuple[float, float, float]

    @property
    def centre(self) -> tuple[float, float, float]:
        """Centre of the box [m]."""
        return (
            (self.lo[0] + self.hi[0]) / 2.0,
            (self.lo[1] + self.hi[1]) / 2.0,
            (self.lo[2] + self.hi[2]) / 2.0,
        )

    @property
    def diagonal(self) -> float:
        """Length of the space diagonal [m]."""
        return math.dist(self.lo, self.hi)


@dataclass(frozen=True, slots=True, kw_only=True)
class Camera:
    """A BCF camera (perspective or orthogonal), world coordinates.

    Attributes:
        kind: ``"perspective"`` or ``"orthogonal"``.
        view_point: Camera position (x, y, z) [m].
        direction: Viewing direction, unit vector [-].
        up_vector: Up direction, unit vector, perpendicular to ``direction`` [-].
        field_of_view: Vertical field of view of a perspective camera [deg].
        view_to_world_scale: Height of an orthogonal view in the world [m].
        aspect_ratio: Width / height of the view [-].
    """

    kind: str
    view_point: tuple[float, float, float]
    direction: tuple[float, float, float]
    up_vector: tuple[float, float, float]
    field_of_view: float | None = None
    view_to_world_scale: float | None = None
    aspect_ratio: float = 1.0


@dataclass(frozen=True, slots=True)
class _Extent:
    """Coordinates of the corners of what a box must hold, one list per axis [m].

    Each corner's value appears in the order of the corners (repeats dropped), so
    ``min`` and ``max`` pick the same value as over the corners themselves.
    """

    xs: list[float] = field(default_factory=list)
    ys: list[float] = field(default_factory=list)
    zs: list[float] = field(default_factory=list)

    def add_bounds(self, bounds: tuple[float, float, float, float], z: float) -> None:
        x0, y0, x1, y1 = bounds
        self.xs.extend((x0, x1))
        self.ys.extend((y0, y1))
        self.zs.extend((z, z))

    def box(self) -> Box | None:
        if not self.xs:
            return None
        xs, ys, zs = self.xs, self.ys, self.zs
        return Box(lo=(min(xs), min(ys), min(zs)), hi=(max(xs), max(ys), max(zs)))


@dataclass(frozen=True, slots=True)
class _ModelIndex:
    """A model's walls by GlobalId and by level, and its diaphragms by slab GlobalId.

    Attributes:
        walls: GlobalId -> (position in ``model.walls``, segment), in model order.
        levels: Level name -> its wall segments, in model order.
        slabs: Slab GlobalId -> positions in ``model.diaphragms``, ascending.
        level_boxes: Level name -> box of its walls and diaphragms, filled when asked.
    """

    walls: dict[str, list[tuple[int, WallSegment]]]
    levels: dict[str, list[WallSegment]]
    slabs: dict[str, list[int]]
    level_boxes: dict[str, Box | None] = field(default_factory=dict)


_INDEX: dict[int, tuple[BuildingModel, _ModelIndex]] = {}


def _index(model: BuildingModel) -> _ModelIndex:
    """The index of a model, built once (the writers frame one model's findings)."""
    hit = _INDEX.get(id(model))
    if hit is not None and hit[0] is model:
        return hit[1]
    walls: dict[str, list[tuple[int, WallSegment]]] = {}
    levels: dict[str, list[WallSegment]] = {}
    for i, w in enumerate(model.walls):
        walls.setdefault(w.guid, []).append((i, w))
        levels.setdefault(w.level, []).append(w)
    slabs: dict[str, list[int]] = {}
    for i, d in enumerate(model.diaphragms):
        for g in dict.fromkeys(d.slab_guids):
            slabs.setdefault(g, []).append(i)
    index = _ModelIndex(walls=walls, levels=levels, slabs=slabs)
    _INDEX.clear()  # keep only the latest model alive
    _INDEX[id(model)] = (model, index)
    return index


def _walls_named(index: _ModelIndex, guids: set[str]) -> list[WallSegment]:
    """Wall segments whose GlobalId is one of ``guids``, in model order."""
    hits = [hit for g in guids for hit in index.walls.get(g, ())]
    if len(guids) > 1:
        hits.sort(key=lambda hit: hit[0])
    return [w for _, w in hits]


def _wall_extent(walls: Sequence[WallSegment], level: str) -> _Extent:
    """Corners of the wall segments, preferring those under ``level``."""
    on_level = [w for w in walls if w.level == level]
    ext = _Extent()
    xs, ys, zs = ext.xs, ext.ys, ext.zs
    for w in on_level or walls:
        half = w.thickness / 2.0
        (sx, sy), (ex, ey) = w.start, w.end
        xs.extend((sx - half, sx + half, ex - half, ex + half))
        ys.extend((sy - half, sy + half, ey - half, ey + half))
        zs.extend((w.base_elevation, w.top_elevation))
    return ext


def _level_elevation(model: BuildingModel, level: str) -> float:
    for lv in model.levels:
        if lv.name == level:
            return lv.elevation
    return model.levels[0].elevation if model.levels else 0.0


def element_box(
    model: BuildingModel,
    guids: Sequence[str],
    *,
    level: str = "",
    location: tuple[float, float] | None = None,
) -> Box:
    """Box of the elements a finding is about, with sensible fall-backs.

    Common practice: frame the walls named by GlobalId; else the slabs' diaphragm
    outline; else the finding's plan point; else the whole level; else the model.

    Args:
        model: The structural model.
        guids: GlobalIds of the finding (walls or slabs).
        level: The finding's level name, or ``""``.
        location: The finding's plan point (x, y) [m], or None.

    Returns:
        The box [m].
    """
    index = _index(model)
    wanted = set(guids)
    ext = _wall_extent(_walls_named(index, wanted), level)
    for i in sorted({i for g in wanted for i in index.slabs.get(g, ())}):
        d = model.diaphragms[i]
        ext.add_bounds(d.polygon.bounds, d.elevation)
    box = ext.box()
    if box is not None:
        return box
    z = _level_elevation(model, level)
    if location is not None:
        x, y = location
        h = _POINT_HALF_SIZE
        return Box(lo=(x - h, y - h, z - _STOREY_HEIGHT), hi=(x + h, y + h, z))
    box = _level_box(model, index, level)
    if box is not None:
        return box
    h = _POINT_HALF_SIZE
    return Box(lo=(-h, -h, z - _STOREY_HEIGHT), hi=(h, h, z))


def _level_box(model: BuildingModel, index: _ModelIndex, level: str) -> Box | None:
    """Box of every wall and diaphragm of the level (of the model when ``""``)."""
    if level in index.level_boxes:
        return index.level_boxes[level]
    ext = _wall_extent(index.levels.get(level, []) if level else model.walls, level)
    for d in model.diaphragms:
        if not level or d.level == level:
            ext.add_bounds(d.polygon.bounds, d.elevation)
    box = index.level_boxes[level] = ext.box()
    return box


def frame_box(box: Box, *, aspect_ratio: float = 4.0 / 3.0) -> Camera:
    """Perspective camera from the south-east and above that shows the whole box.

    Common practice: the camera stands on the line through the box centre at 45
    degrees elevation, at the distance where the box's bounding sphere of radius r
    just fits the narrower field of view: d = r / sin(fov/2).

    Args:
        box: What to frame [m].
        aspect_ratio: Width / height of the view [-].

    Returns:
        The camera; view point [m], direction and up vector unit length.
    """
    fov_v = math.radians(_FIELD_OF_VIEW)
    fov_h = 2.0 * math.atan(math.tan(fov_v / 2.0) * aspect_ratio)
    half = min(fov_v, fov_h) / 2.0
    radius = max(box.diagonal / 2.0, _MIN_RADIUS)
    distance = radius / math.sin(half)
    out = (
        math.cos(_ELEVATION) * math.cos(_AZIMUTH),
        math.cos(_ELEVATION) * math.sin(_AZIMUTH),
        math.sin(_ELEVATION),
    )
    cx, cy, cz = box.centre
    eye = (cx + distance * out[0], cy + distance * out[1], cz + distance * out[2])
    direction = (-out[0], -out[1], -out[2])
    # up = Z minus its component along the view direction, normalised
    dz = direction[2]
    up = (-dz * direction[0], -dz * direction[1], 1.0 - dz * direction[2])
    norm = math.sqrt(sum(c * c for c in up))
    return Camera(
        kind="perspective",
        view_point=tuple(float(c) for c in eye),
        direction=tuple(float(c) for c in direction),
        up_vector=tuple(float(c / norm) for c in up),
        field_of_view=_FIELD_OF_VIEW,
        aspect_ratio=float(aspect_ratio),
    )
