"""The kernel-free part of reading walls: relations, Axis, properties, plain bodies.

It runs while the geometry kernel meshes the other bodies in workers
(:func:`ifc_bridge._geometry.start_meshing`); :func:`ifc_bridge.read_walls.read_walls`
finishes each wall once the meshes are in.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass

import ifcopenshell
import numpy as np
from numpy.typing import NDArray

from ifc_bridge._direct import placement_matrix
from ifc_bridge._plain_body import PlainBody, plain_body
from ifc_bridge._relations import Relations, attr
from ifc_bridge._semantics import WallSemantics, wall_semantics
from ifc_bridge._wall_axis import AxisInfo, wall_axis

__all__ = ["PreparedWall", "prepare_walls"]


@dataclass(frozen=True, slots=True, kw_only=True)
class PreparedWall:
    """What is known of a wall before its geometry: read while the kernel meshes.

    Attributes:
        wall: The IfcWall.
        guid: Its GlobalId.
        container: Its spatial container (IfcBuildingStorey), or None.
        axis: Direction and curvature from its 'Axis' representation.
        semantics: Name, type, materials, predefined type, properties.
        body: Its plain extruded body read directly (:mod:`ifc_bridge._plain_body`),
            or None: the kernel's mesh is used.
    """

    wall: ifcopenshell.entity_instance
    guid: str
    container: ifcopenshell.entity_instance | None
    axis: AxisInfo
    semantics: WallSemantics
    body: PlainBody | None = None


def prepare_walls(
    walls: Sequence[ifcopenshell.entity_instance],
    *,
    scale: float,
    cache: dict[int, NDArray[np.float64]],
    relations: Relations,
    plain: Mapping[int, ifcopenshell.entity_instance] | None = None,
) -> tuple[PreparedWall, ...]:
    """The kernel-free part of reading every wall (relations, Axis, properties).

    Common practice: as :func:`read_walls`; split out so that it runs while the
    geometry kernel meshes the bodies (:func:`ifc_bridge._geometry.start_meshing`).

    Args:
        walls: The IfcWall entities, file order.
        scale: Length unit scale [m per file unit].
        cache: Placement memo.
        relations: The file's relationship maps.
        plain: Entity id -> extruded solid of the walls whose body is read here
            (:func:`ifc_bridge._plain_body.plain_item`); the others are meshed.

    Returns:
        One prepared wall per IfcWall, same order.
    """
    plain = plain or {}
    out = []
    for wall in walls:
        axis = wall_axis(wall, cache)  # memoises the wall's placement
        item = plain.get(wall.id())
        body = None
        if item is not None:
            m = placement_matrix(attr(wall, "ObjectPlacement"), cache)
            body = plain_body(item, m, scale)
        out.append(
            PreparedWall(
                wall=wall,
                guid=attr(wall, "GlobalId"),
                container=relations.storey_of(wall),
                axis=axis,
                semantics=wall_semantics(wall, scale, relations),
                body=body,
            )
        )
    return tuple(out)
