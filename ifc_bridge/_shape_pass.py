"""The reader's geometry in one pass per worker: wall axes, plain bodies, kernel meshes.

Each worker takes every n-th wall and every n-th other element (slab, opening, door,
window). For its walls it reads the 'Axis' direction (:mod:`ifc_bridge._wall_axis`)
and, for a body that is one plumb extrusion, the body itself
(:mod:`ifc_bridge._plain_body`); the kernel meshes everything else of its share in
one iterator pass (:mod:`ifc_bridge._geometry`). Results come back as flat arrays
(:mod:`ifc_bridge.worker`); without workers the same function runs here, so the answer
is the same either way.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import ifcopenshell
import numpy as np

from ifc_bridge._direct import placement_matrix
from ifc_bridge._geometry import Mesh, mesh_packed, mesh_workers, unpack_meshes
from ifc_bridge._plain_body import PlainBody, plain_body, plain_solid
from ifc_bridge._relations import attr, axis_and_body
from ifc_bridge._wall_axis import AxisInfo, axis_of
from ifc_bridge.worker import PendingCall, start_call

__all__ = ["PendingShapes", "WallShape", "start_shapes", "wall_shapes"]


@dataclass(frozen=True, slots=True, kw_only=True)
class WallShape:
    """A wall's geometry known without the kernel.

    Attributes:
        axis: Direction and curvature from its 'Axis' representation.
        body: Its plain extruded body, or None: the kernel meshed it.
    """

    axis: AxisInfo
    body: PlainBody | None


def wall_shapes(
    walls: Sequence[ifcopenshell.entity_instance],
    scale: float,
    cache: dict | None = None,
) -> tuple[list[WallShape], list[ifcopenshell.entity_instance]]:
    """Axis and plain body of each wall, and the walls the kernel must mesh.

    Common practice: IfcWall 'Axis' (IFC 4.3 §5.1.3.43) and 'Body' SweptSolid
    representations; see :func:`ifc_bridge._plain_body.plain_body`.

    Args:
        walls: The walls.
        scale: Length unit scale [m per file unit].
        cache: Placement memo (:func:`ifc_bridge._direct.placement_matrix`).

    Returns:
        One shape per wall (same order), and the walls without a plain body.
    """
    cache = {} if cache is None else cache
    shapes: list[WallShape] = []
    to_mesh: list[ifcopenshell.entity_instance] = []
    for wall in walls:
        axis_rep, body_rep = axis_and_body(wall)
        axis = axis_of(wall, axis_rep, cache)  # memoises the wall's placement
        item = plain_solid(body_rep) if body_rep is not None else None
        body = None
        if item is not None:
            m = placement_matrix(attr(wall, "ObjectPlacement"), cache)
            body = plain_body(item, m, scale)
        if body is None:
            to_mesh.append(wall)
        shapes.append(WallShape(axis=axis, body=body))
    return shapes, to_mesh


def _pack_shapes(shapes: Sequence[WallShape]) -> dict:
    n = len(shapes)
    direction = np.full((n, 2), np.nan)
    curved = np.zeros(n, dtype=bool)
    counts = np.zeros(n, dtype=np.int64)
    z = np.zeros((n, 2))
    points = []
    for k, s in enumerate(shapes):
        if s.axis.direction is not None:
            direction[k] = s.axis.direction
        curved[k] = s.axis.curved
        if s.body is not None:
            pts, base, top = s.body
            counts[k] = len(pts)
            z[k] = (base, top)
            points.append(pts)
    return {
        "direction": direction,
        "curved": curved,
        "counts": counts,
        "z": z,
        "points": np.concatenate(points) if points else np.zeros((0, 2)),
    }


def _unpack_shapes(data: dict) -> list[WallShape]:
    counts = data["counts"]
    if len(counts) == 0:
        return []
    points = np.split(data["points"], np.cumsum(counts)[:-1])
    out = []
    for d, c, n, (base, top), pts in zip(
        data["direction"].tolist(),
        data["curved"].tolist(),
        counts.tolist(),
        data["z"].tolist(),
        points,
        strict=True,
    ):
        axis = AxisInfo(direction=None if d[0] != d[0] else (d[0], d[1]), curved=c)
        out.append(WallShape(axis=axis, body=(pts, base, top) if n else None))
    return out


_EMPTY = {
    "ids": np.zeros(0, dtype=np.int64),
    "kernels": [],
    "nv": np.zeros(0, dtype=np.int64),
    "nf": np.zeros(0, dtype=np.int64),
    "verts": np.zeros((0, 3)),
    "faces": np.zeros((0, 3), dtype=np.int32),
}


def _share(
    ifc: ifcopenshell.file,
    walls: Sequence[ifcopenshell.entity_instance],
    others: Sequence[ifcopenshell.entity_instance],
    scale: float,
) -> dict:
    """One worker's pass: its walls' shapes and the meshes of the rest (flat arrays)."""
    shapes, to_mesh = wall_shapes(walls, scale)
    elements = [*to_mesh, *others]
    meshes = mesh_packed(ifc, elements) if elements else _EMPTY
    return {"shapes": _pack_shapes(shapes), "meshes": meshes}


def _decode(data: dict) -> tuple[list[WallShape], dict[int, Mesh]]:
    return _unpack_shapes(data["shapes"]), unpack_meshes(data["meshes"])



class PendingShapes:
    """The shape passes under way; :meth:`result` merges them in wall order."""

    __slots__ = ("_calls", "_count")

    def __init__(self, calls: Sequence[PendingCall], count: int) -> None:
        self._calls = list(calls)
        self._count = count

    def result(self) -> tuple[list[WallShape], dict[int, Mesh]]:
        """Every wall's shape (walls' order) and the meshes by entity id [m]."""
        n = len(self._calls)
        shapes: list[WallShape | None] = [None] * self._count
        meshes: dict[int, Mesh] = {}
        for k, call in enumerate(self._calls):
            part, found = call.result()
            shapes[k::n] = part
            meshes.update(found)
        return shapes, meshes  # type: ignore[return-value]

    def cancel(self) -> None:
        """Stop the workers whose results are no longer wanted."""
        for call in self._calls:
            call.cancel()


def start_shapes(
    ifc: ifcopenshell.file,
    walls: Sequence[ifcopenshell.entity_instance],
    others: Sequence[ifcopenshell.entity_instance],
    scale: float,
    *,
    parallel: bool | None = None,
) -> PendingShapes:
    """Start the shape passes: one per worker (:func:`mesh_workers`), or one here.

    Args:
        ifc: The open file.
        walls: Every IfcWall.
        others: Slabs, openings and unfilled doors/windows to mesh.
        scale: Length unit scale [m per file unit].
        parallel: Force (True: at least one worker) or forbid (False) the workers;
            default: automatic.

    Returns:
        The pending passes.
    """
    workers = mesh_workers(len(walls) + len(others))
    if parallel is True:
        workers = max(workers, 1)
    elif parallel is False:
        workers = 0
    n = max(workers, 1)
    calls = [
        start_call(
            "geometry",
            _share,
            ifc,
            walls[k::n],
            others[k::n],
            scale,
            decode=_decode,
            parallel=workers > 0,
        )
        for k in range(n)
    ]
    return PendingShapes(calls, len(walls))
