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

import numpy as np
from numpy.typing import NDArray

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
class _ModelIndex:
    """A model's walls and diaphragms as corner arrays, keyed by GlobalId and level.

    ``wall_lo[i]`` / ``wall_hi[i]`` are the least and greatest corner coordinate of
    ``model.walls[i]`` (centreline ends, +/- half the thickness, base and top) [m];
    ``slab_lo[j]`` / ``slab_hi[j]`` those of ``model.diaphragms[j]`` (plan bounds at
    its elevation). A box is the min / max of the rows it holds: the same value as
    over the corners themselves, whatever their order.

    Attributes:
        walls: GlobalId -> rows of its segments in ``model.walls``, ascending.
        levels: Level name -> rows of the wall segments supporting it, ascending.
        slabs: Slab GlobalId -> rows in ``model.diaphragms``, ascending.
        wall_guid: Row -> GlobalId of the wall segment.
        wall_level: Row -> level name of the wall segment.
        wall_lo: Least corner (x, y, z) per wall row [m].
        wall_hi: Greatest corner (x, y, z) per wall row [m].
        slab_lo: Least corner (x, y, z) per diaphragm row [m].
        slab_hi: Greatest corner (x, y, z) per diaphragm row [m].
        level_boxes: Level name -> box of its walls and diaphragms, filled when asked.
    """

    walls: dict[str, list[int]]
    levels: dict[str, list[int]]
    slabs: dict[str, list[int]]
    wall_guid: list[str]
    wall_level: list[str]
    wall_lo: NDArray[np.float64]
    wall_hi: NDArray[np.float64]
    slab_lo: NDArray[np.float64]
    slab_hi: NDArray[np.float64]
    level_boxes: dict[str, Box | None] = field(default_factory=dict)


_INDEX: dict[int, tuple[BuildingModel, _ModelIndex]] = {}
_MANY = 64  # GlobalIds from which the walls are matched by a pass over the model


def _corner_arrays(
    walls: Sequence[WallSegment],
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Least and greatest corner (x, y, z) of each wall segment, shape (n, 3) [m]."""
    rows = np.array(
        [
            (*w.start, *w.end, w.thickness / 2.0, w.base_elevation, w.top_elevation)
            for w in walls
        ],
        dtype=np.float64,
    ).reshape(-1, 7)
    sx, sy, ex, ey, half, base, top = rows.T
    xs = (sx - half, sx + half, ex - half, ex + half)
    ys = (sy - half, sy + half, ey - half, ey + half)
    lo = np.stack([np.minimum.reduce(xs), np.minimum.reduce(ys), np.minimum(base, top)])
    hi = np.stack([np.maximum.reduce(xs), np.maximum.reduce(ys), np.maximum(base, top)])
    return lo.T.copy(), hi.T.copy()


def _index(model: BuildingModel) -> _ModelIndex:
    """The index of a model, built once (the writers frame one model's findings)."""
    hit = _INDEX.get(id(model))
    if hit is not None and hit[0] is model:
        return hit[1]
    walls: dict[str, list[int]] = {}
    levels: dict[str, list[int]] = {}
    for i, w in enumerate(model.walls):
        walls.setdefault(w.guid, []).append(i)
        levels.setdefault(w.level, []).append(i)
    slabs: dict[str, list[int]] = {}
    for i, d in enumerate(model.diaphragms):
        for g in dict.fromkeys(d.slab_guids):
            slabs.setdefault(g, []).append(i)
    wall_lo, wall_hi = _corner_arrays(model.walls)
    outline = np.array(
        [(*d.polygon.bounds, d.elevation) for d in model.diaphragms], dtype=np.float64
    ).reshape(-1, 5)
    x0, y0, x1, y1, z = outline.T
    index = _ModelIndex(
        walls=walls,
        levels=levels,
        slabs=slabs,
        wall_guid=[w.guid for w in model.walls],
        wall_level=[w.level for w in model.walls],
        wall_lo=wall_lo,
        wall_hi=wall_hi,
        slab_lo=np.stack([np.minimum(x0, x1), np.minimum(y0, y1), z]).T.copy(),
        slab_hi=np.stack([np.maximum(x0, x1), np.maximum(y0, y1), z]).T.copy(),
    )
    _INDEX.clear()  # keep only the latest model alive
    _INDEX[id(model)] = (model, index)
    return index


def _prefer_level(index: _ModelIndex, rows: list[int], level: str) -> list[int]:
    """The rows of walls supporting ``level``, or all ``rows`` when there are none."""
    names = index.wall_level
    return [r for r in rows if names[r] == level] or rows


def _box(index: _ModelIndex, walls: list[int], slabs: list[int]) -> Box | None:
    """Box of the wall rows and diaphragm rows, or None when both are empty."""
    los, his = [], []
    if walls:
        at = np.asarray(walls, dtype=np.intp)
        los.append(index.wall_lo[at].min(axis=0))
        his.append(index.wall_hi[at].max(axis=0))
    if slabs:
        at = np.asarray(slabs, dtype=np.intp)
        los.append(index.slab_lo[at].min(axis=0))
        his.append(index.slab_hi[at].max(axis=0))
    if not los:
        return None
    lo, hi = np.minimum.reduce(los).tolist(), np.maximum.reduce(his).tolist()
    return Box(lo=(lo[0], lo[1], lo[2]), hi=(hi[0], hi[1], hi[2]))


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

    Common practice: frame the walls named by GlobalId (those supporting the
    finding's level when any do); else the slabs' diaphragm outline; else the
    finding's plan point; else the whole level; else the model.

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
    if len(wanted) > _MANY:  # one membership test per wall beats a lookup per GUID
        hit = (g in wanted for g in index.wall_guid)
        named = np.fromiter(hit, dtype=bool, count=len(index.wall_guid))
        walls = np.flatnonzero(named).tolist()
    else:
        walls = [r for g in wanted for r in index.walls.get(g, ())]
    if len(wanted) > len(index.slabs):
        slabs = [r for g, at in index.slabs.items() if g in wanted for r in at]
    else:
        slabs = [r for g in wanted for r in index.slabs.get(g, ())]
    box = _box(index, _prefer_level(index, walls, level), slabs)
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
    if level:
        walls = index.levels.get(level, [])
        slabs = [i for i, d in enumerate(model.diaphragms) if d.level == level]
    else:
        walls = _prefer_level(index, list(range(len(model.walls))), level)
        slabs = list(range(len(model.diaphragms)))
    box = index.level_boxes[level] = _box(index, walls, slabs)
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
