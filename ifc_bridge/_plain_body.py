"""Wall bodies that are one plumb extrusion of a straight-edged profile, read directly.

A 'Body' of type SweptSolid holding a single IfcExtrudedAreaSolid (IFC 4.3 §8.8.3.15)
whose profile is an IfcRectangleProfileDef (§8.15.3.26) or an
IfcArbitraryClosedProfileDef (§8.15.3.2) bounded by an IfcPolyline or by an
IfcIndexedPolyCurve of straight segments only (§8.9.3.36), extruded along the
vertical, is a prism: its vertices are the profile's corners at both ends, which are
the vertices of the kernel's triangulated mesh of it (its triangles add none; openings
are not subtracted, as in :mod:`ifc_bridge._geometry`). The reader needs only those
vertices on plan and the z-range (:mod:`ifc_bridge.read_walls`), so such walls are
read here and left out of the kernel pass; everything else (booleans and clippings,
mapped items, curved or indexed profiles, Breps, tessellations, tapered or sloped
extrusions) is meshed by the kernel. The result is checked against ifcopenshell's
kernel on the demo and the shared sample models (tests/ifc_bridge/test_plain_body.py).
"""

from __future__ import annotations

import math

import ifcopenshell
import numpy as np
from numpy.typing import NDArray

from ifc_bridge._direct import axis2placement
from ifc_bridge._relations import attr, axis_and_body

__all__ = ["PlainBody", "plain_body", "plain_item", "plain_solid"]

# (plan vertices [m], shape (n, 2); base z [m]; top z [m])
PlainBody = tuple[NDArray[np.float64], float, float]

_PLUMB_TOL = 1e-9  # [-]; direction cosines off the vertical that still count as plumb


def plain_item(wall: ifcopenshell.entity_instance) -> ifcopenshell.entity_instance | None:
    """The wall's one IfcExtrudedAreaSolid when its body qualifies, else None.

    Common practice: a cheap test on entity classes only (exact classes: subtypes
    such as IfcRoundedRectangleProfileDef or IfcExtrudedAreaSolidTapered carry
    vertices or faces a prism of the corners lacks), so that the walls that need the
    kernel are known before its pass starts.

    Args:
        wall: An IfcWall.

    Returns:
        The extruded solid, or None: the kernel meshes the wall.
    """
    _, body = axis_and_body(wall)
    return plain_solid(body) if body is not None else None


def plain_solid(
    body: ifcopenshell.entity_instance,
) -> ifcopenshell.entity_instance | None:
    """:func:`plain_item` from the wall's only 'Body' representation, already found.

    Args:
        body: The IfcShapeRepresentation.

    Returns:
        The extruded solid, or None: the kernel meshes the wall.
    """
    if (attr(body, "RepresentationType") or "") != "SweptSolid":
        return None
    items = attr(body, "Items") or ()
    if len(items) != 1 or items[0].is_a() != "IfcExtrudedAreaSolid":
        return None
    area = attr(items[0], "SweptArea")
    kind = area.is_a() if area is not None else ""
    if kind == "IfcRectangleProfileDef":
        return items[0]
    if kind == "IfcArbitraryClosedProfileDef":
        curve = attr(area, "OuterCurve")
        if curve is not None and _straight_edged(curve):
            return items[0]
    return None


def _straight_edged(curve: ifcopenshell.entity_instance) -> bool:
    kind = curve.is_a()
    if kind == "IfcPolyline":
        return True
    if kind != "IfcIndexedPolyCurve":
        return False
    # IFC 4.3 §8.9.3.36: no Segments means straight lines through the points
    segments = attr(curve, "Segments") or ()
    return all(s.is_a() == "IfcLineIndex" for s in segments)


def _profile_corners(area: ifcopenshell.entity_instance) -> list[tuple[float, float]]:
    if area.is_a() == "IfcRectangleProfileDef":
        x, y = float(attr(area, "XDim")) / 2.0, float(attr(area, "YDim")) / 2.0
        local = [(-x, -y), (x, -y), (x, y), (-x, y)]
        position = attr(area, "Position", None)
        if position is None:
            return local
        (r0, r1, _, _) = axis2placement(position).tolist()
        return [
            (r0[0] * u + r0[1] * v + r0[3], r1[0] * u + r1[1] * v + r1[3])
            for u, v in local
        ]
    curve = attr(area, "OuterCurve")
    if curve.is_a() == "IfcPolyline":
        return [tuple(attr(p, "Coordinates")[:2]) for p in attr(curve, "Points")]
    coords = attr(attr(curve, "Points"), "CoordList")
    segments = attr(curve, "Segments") or ()
    if not segments:
        return [(c[0], c[1]) for c in coords]
    used = sorted({i for s in segments for i in s.get_argument(0)})
    if used[0] < 1 or used[-1] > len(coords):
        return []  # an index outside the point list: the kernel reports it
    return [(coords[i - 1][0], coords[i - 1][1]) for i in used]


def _area(corners: list[tuple[float, float]]) -> float:
    """Shoelace area of the profile polygon [file units²]."""
    twice = 0.0
    for (x0, y0), (x1, y1) in zip(corners, corners[1:] + corners[:1], strict=True):
        twice += x0 * y1 - x1 * y0
    return abs(twice) / 2.0


def plain_body(
    item: ifcopenshell.entity_instance,
    placement: NDArray[np.float64],
    scale: float,
) -> PlainBody | None:
    """Plan vertices and z-range of a plain extruded body, world coordinates.

    Common practice: IfcExtrudedAreaSolid, IFC 4.3 §8.8.3.15: the profile lies in the
    solid's Position x-y plane and is swept by Depth along ExtrudedDirection (given
    in Position coordinates, not necessarily of unit length). Plain float arithmetic:
    a handful of corners per wall is cheaper without numpy's per-call overhead.

    Args:
        item: The solid from :func:`plain_item`.
        placement: The wall's world placement matrix
            (:func:`ifc_bridge._direct.placement_matrix`) [file units].
        scale: Length unit scale [m per file unit].

    Returns:
        The body [m], or None when the sweep is not plumb, has no depth or the profile
        no area (the kernel then meshes the wall).
    """
    position = attr(item, "Position", None)
    m = placement if position is None else placement @ axis2placement(position)
    r0, r1, r2, _ = m.tolist()
    ratios = (*attr(attr(item, "ExtrudedDirection"), "DirectionRatios"), 0.0, 0.0)
    a, b, c = ratios[0], ratios[1], ratios[2]
    dx = r0[0] * a + r0[1] * b + r0[2] * c
    dy = r1[0] * a + r1[1] * b + r1[2] * c
    dz = r2[0] * a + r2[1] * b + r2[2] * c
    length = math.sqrt(dx * dx + dy * dy + dz * dz)
    depth = float(attr(item, "Depth") or 0.0)
    if not length > 0.0 or not depth > 0.0:
        return None
    # plumb sweep of a horizontal profile: plan vertices are the same at both ends
    if math.hypot(dx, dy) > _PLUMB_TOL * length or abs(r2[2] - 1.0) > _PLUMB_TOL:
        return None
    corners = _profile_corners(attr(item, "SweptArea"))
    if len(corners) < 3 or not _area(corners) > 0.0:
        return None
    plan = [
        (
            (r0[0] * u + r0[1] * v + r0[3]) * scale,
            (r1[0] * u + r1[1] * v + r1[3]) * scale,
        )
        for u, v in corners
    ]
    if not all(math.isfinite(x) and math.isfinite(y) for x, y in plan):
        return None
    z0 = r2[3]
    z1 = z0 + math.copysign(depth, dz)
    return np.array(plan), min(z0, z1) * scale, max(z0, z1) * scale
