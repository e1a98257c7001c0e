"""Direct-attribute extractor: plan footprint and z-range of vertical extrusions.

Reads the body representation without a geometry kernel (LIBRARY-NOTES §3.3): each
item must be an ``IfcExtrudedAreaSolid`` (or the first operand of a boolean, or a
mapped item of one) extruded vertically, with a rectangle or a straight-segment
profile. Anything else returns None and the kernel's mesh is used. World X-Y and z
in metres, Z up. A clipped body reports its unclipped height.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import ifcopenshell
import ifcopenshell.util.placement
import ifcopenshell.util.representation
import numpy as np
import shapely
import shapely.affinity
from numpy.typing import NDArray
from shapely.geometry import Polygon

from ifc_bridge._relations import attr

__all__ = ["Extrusion", "axis2placement", "body_extrusion", "placement_matrix"]


@dataclass(frozen=True, slots=True, kw_only=True)
class Extrusion:
    """Plan outline and z-range of a body made of vertical extrusions.

    Attributes:
        footprint: Union of the profiles in world X-Y [m] (profile holes kept).
        zmin: Lowest z [m].
        zmax: Highest z [m].
        depth: Largest single extrusion depth [m].
    """

    footprint: Polygon | shapely.MultiPolygon
    zmin: float
    zmax: float
    depth: float


def axis2placement(placement: ifcopenshell.entity_instance) -> NDArray[np.float64]:
    """4x4 matrix of an IfcAxis2Placement2D/3D (file units), without numpy overhead.

    Common practice: IfcAxis2Placement3D with Axis (Z) and RefDirection (X projected
    normal to Z), IFC 4.3 §8.9.3.2; defaults +Z and +X.

    Args:
        placement: The placement.

    Returns:
        Homogeneous transformation [file units].
    """
    loc = attr(placement, "Location")
    coords = (
        tuple(attr(loc, "Coordinates"))
        if loc is not None and loc.is_a("IfcCartesianPoint")
        else ()
    )
    o = (*coords, 0.0, 0.0, 0.0)[:3]
    axis = attr(placement, "Axis", None)
    ref = attr(placement, "RefDirection")
    z = tuple(attr(axis, "DirectionRatios")) if axis is not None else (0.0, 0.0, 1.0)
    x = tuple(attr(ref, "DirectionRatios")) if ref is not None else (1.0, 0.0, 0.0)
    z = (*z, 0.0)[:3] if len(z) == 3 else (0.0, 0.0, 1.0)
    x = (*x, 0.0)[:3]
    # written out, in the order sum() over the components would add them
    nz = math.sqrt(z[0] * z[0] + z[1] * z[1] + z[2] * z[2])
    z = (z[0] / nz, z[1] / nz, z[2] / nz)
    dot = x[0] * z[0] + x[1] * z[1] + x[2] * z[2]
    x = (x[0] - dot * z[0], x[1] - dot * z[1], x[2] - dot * z[2])
    nx = math.sqrt(x[0] * x[0] + x[1] * x[1] + x[2] * x[2])
    if nx <= 1e-12:
        return ifcopenshell.util.placement.get_axis2placement(placement)
    x = (x[0] / nx, x[1] / nx, x[2] / nx)
    y = (
        z[1] * x[2] - z[2] * x[1],
        z[2] * x[0] - z[0] * x[2],
        z[0] * x[1] - z[1] * x[0],
    )
    return np.array(
        [
            [x[0], y[0], z[0], o[0]],
            [x[1], y[1], z[1], o[1]],
            [x[2], y[2], z[2], o[2]],
            [0.0, 0.0, 0.0, 1.0],
        ]
    )


def placement_matrix(
    placement: ifcopenshell.entity_instance | None,
    cache: dict[int, NDArray[np.float64]],
) -> NDArray[np.float64]:
    """4x4 world matrix of an IfcLocalPlacement chain, memoised (file units).

    Common practice: the chain product of relative placements, IFC 4.3 §8.18.3.

    Args:
        placement: The IfcObjectPlacement, or None (identity).
        cache: Memo keyed by entity id, shared over one read.

    Returns:
        Homogeneous transformation [file units].
    """
    if placement is None:
        return np.eye(4)
    found = cache.get(placement.id())
    if found is not None:
        return found
    if placement.is_a("IfcLocalPlacement"):
        parent = placement_matrix(attr(placement, "PlacementRelTo"), cache)
        m = parent @ axis2placement(attr(placement, "RelativePlacement"))
    else:
        m = ifcopenshell.util.placement.get_local_placement(placement)
    cache[placement.id()] = m
    return m


def _curve_points(curve: ifcopenshell.entity_instance) -> NDArray[np.float64] | None:
    if curve.is_a("IfcPolyline"):
        return np.array([p.Coordinates[:2] for p in curve.Points], dtype=np.float64)
    if curve.is_a("IfcIndexedPolyCurve"):
        pts = np.array(curve.Points.CoordList, dtype=np.float64)[:, :2]
        if curve.Segments:
            idx: list[int] = []
            for seg in curve.Segments:
                if not seg.is_a("IfcLineIndex"):
                    return None
                ii = [i - 1 for i in seg.wrappedValue]
                idx.extend(ii if not idx else ii[1:])
            pts = pts[idx]
        return pts
    return None


def _profile(profile: ifcopenshell.entity_instance) -> Polygon | None:
    if profile.is_a("IfcRectangleProfileDef"):
        x, y = profile.XDim / 2.0, profile.YDim / 2.0
        corners = np.array([[-x, -y, 0, 1], [x, -y, 0, 1], [x, y, 0, 1], [-x, y, 0, 1]])
        m = axis2placement(profile.Position)
        return Polygon((m @ corners.T).T[:, :2])
    if profile.is_a("IfcArbitraryClosedProfileDef"):
        outer = _curve_points(profile.OuterCurve)
        inner = [_curve_points(c) for c in getattr(profile, "InnerCurves", None) or ()]
        if outer is None or len(outer) < 3 or any(i is None for i in inner):
            return None
        return Polygon(outer, [i for i in inner if i is not None and len(i) >= 3])
    return None


def _item_extrusion(
    item: ifcopenshell.entity_instance, m: NDArray[np.float64]
) -> tuple[Polygon, float, float, float] | None:
    while item.is_a("IfcBooleanResult"):
        item = item.FirstOperand
    if not item.is_a("IfcExtrudedAreaSolid"):
        return None
    poly = _profile(item.SweptArea)
    if poly is None or not poly.is_valid or poly.area <= 0.0:
        return None
    if item.Position is not None:
        m = m @ axis2placement(item.Position)
    d = m[:3, :3] @ np.asarray(item.ExtrudedDirection.DirectionRatios, dtype=np.float64)
    if abs(abs(d[2]) - np.linalg.norm(d)) > 1e-6 or abs(m[2, 2] - 1.0) > 1e-9:
        return None  # extruded or placed out of plumb: the kernel handles it

    def to_world(coords: object) -> NDArray[np.float64]:
        c = np.asarray(coords, dtype=np.float64)[:, :2]
        h = np.c_[c, np.zeros(len(c)), np.ones(len(c))]
        return (m @ h.T).T[:, :2]

    world = Polygon(
        to_world(poly.exterior.coords), [to_world(i.coords) for i in poly.interiors]
    )
    z0 = float(m[2, 3])
    z1 = z0 + float(np.sign(d[2])) * float(item.Depth)
    return world, min(z0, z1), max(z0, z1), float(item.Depth)


def body_extrusion(
    element: ifcopenshell.entity_instance,
    scale: float,
    cache: dict[int, NDArray[np.float64]],
) -> Extrusion | None:
    """Footprint and z-range of an element whose body is vertical extrusions.

    Common practice: IfcExtrudedAreaSolid geometry, IFC 4.3 §8.8.3.

    Args:
        element: Wall, slab or opening.
        scale: Length unit scale [m per file unit].
        cache: Placement memo for :func:`placement_matrix`.

    Returns:
        The extrusion in world coordinates [m], or None when not applicable.
    """
    rep = ifcopenshell.util.representation.get_representation(element, "Model", "Body")
    if rep is None:
        return None
    m0 = placement_matrix(element.ObjectPlacement, cache)
    polys, zs, depths = [], [], []
    for resolved in ifcopenshell.util.representation.resolve_items(rep):
        got = _item_extrusion(resolved["item"], m0 @ resolved["matrix"])
        if got is None:
            return None
        poly, z0, z1, depth = got
        polys.append(poly)
        zs += [z0, z1]
        depths.append(depth)
    if not polys:
        return None
    footprint = shapely.affinity.scale(
        shapely.union_all(polys), scale, scale, origin=(0, 0)
    )
    return Extrusion(
        footprint=footprint,
        zmin=min(zs) * scale,
        zmax=max(zs) * scale,
        depth=max(depths) * scale,
    )
