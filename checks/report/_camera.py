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
from dataclasses import dataclass

from ifc_bridge.model import BuildingModel

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


def _box_of(points: Sequence[tuple[float, float, float]]) -> Box:
    xs, ys, zs = zip(*points, strict=True)
    return Box(lo=(min(xs), min(ys), min(zs)), hi=(max(xs), max(ys), max(zs)))


def _wall_points(
    model: BuildingModel, guids: set[str], level: str
) -> list[tuple[float, float, float]]:
    """Corners of the finding's wall segments, preferring those under ``level``."""
    walls = [w for w in model.walls if w.guid in guids]
    on_level = [w for w in walls if w.level == level]
    points: list[tuple[float, float, float]] = []
    for w in on_level or walls:
        half = w.thickness / 2.0
        for x, y in (w.start, w.end):
            for z in (w.base_elevation, w.top_elevation):
                points.extend(((x - half, y - half, z), (x + half, y + half, z)))
    return points


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
    wanted = set(guids)
    points = _wall_points(model, wanted, level)
    for d in model.diaphragms:
        if wanted & set(d.slab_guids):
            x0, y0, x1, y1 = d.polygon.bounds
            points.extend(((x0, y0, d.elevation), (x1, y1, d.elevation)))
    if points:
        return _box_of(points)
    z = _level_elevation(model, level)
    if location is not None:
        x, y = location
        h = _POINT_HALF_SIZE
        return Box(lo=(x - h, y - h, z - _STOREY_HEIGHT), hi=(x + h, y + h, z))
    level_guids = {w.guid for w in model.walls if not level or w.level == level}
    points = _wall_points(model, level_guids, level)
    for d in model.diaphragms:
        if not level or d.level == level:
            x0, y0, x1, y1 = d.polygon.bounds
            points.extend(((x0, y0, d.elevation), (x1, y1, d.elevation)))
    if points:
        return _box_of(points)
    h = _POINT_HALF_SIZE
    return Box(lo=(-h, -h, z - _STOREY_HEIGHT), hi=(h, h, z))


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
