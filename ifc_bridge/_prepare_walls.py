"""The kernel-free part of reading walls: relations, Axis, properties, plain bodies.

The Axis and plain bodies come from the shape pass
(:func:`ifc_bridge._shape_pass.start_shapes`), the properties are read while it
runs; :func:`ifc_bridge.read_walls.read_walls` finishes each wall with the meshes.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import ifcopenshell
import numpy as np
from numpy.typing import NDArray

from ifc_bridge._plain_body import PlainBody
from ifc_bridge._relations import Relations, attr
from ifc_bridge._semantics import WallSemantics, wall_semantics
from ifc_bridge._shape_pass import WallShape, wall_shapes
from ifc_bridge._wall_axis import AxisInfo

__all__ = ["PreparedWall", "prepare_walls"]


@dataclass(frozen=True, slots=True, kw_only=True)
class PreparedWall:
    """What is known of a wall without the kernel's meshes.

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
    shapes: Sequence[WallShape] | None = None,
    semantics: Sequence[WallSemantics] | None = None,
) -> tuple[PreparedWall, ...]:
    """The kernel-free part of reading every wall (relations, Axis, properties).

    Common practice: as :func:`ifc_bridge.read_walls.read_walls`; split out so that
    the shape pass (:func:`ifc_bridge._shape_pass.start_shapes`) and the properties
    read beside it can be handed in.

    Args:
        walls: The IfcWall entities, file order.
        scale: Length unit scale [m per file unit].
        cache: Placement memo.
        relations: The file's relationship maps.
        shapes: Axis and plain body of each wall, when the shape pass read them;
            None: read here (:func:`ifc_bridge._shape_pass.wall_shapes`).
        semantics: Properties of each wall, when already read; None: read here.

    Returns:
        One prepared wall per IfcWall, same order.
    """
    if shapes is None:
        shapes, _ = wall_shapes(walls, scale, cache)
    if semantics is None:
        semantics = [wall_semantics(w, scale, relations) for w in walls]
    return tuple(
        PreparedWall(
            wall=wall,
            guid=attr(wall, "GlobalId"),
            container=relations.storey_of(wall),
            axis=shape.axis,
            semantics=sem,
            body=shape.body,
        )
        for wall, shape, sem in zip(walls, shapes, semantics, strict=True)
    )
