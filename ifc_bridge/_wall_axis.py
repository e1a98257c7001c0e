"""A wall's 'Axis' representation: plan direction and whether the wall is curved.

The Axis (reference line) is often a face of the wall, not its centreline, so it is
used only for direction and curvature; the centreline comes from the body footprint.
World X-Y, unit vector; counter-clockwise angles.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import ifcopenshell
import ifcopenshell.util.representation
import numpy as np
from numpy.typing import NDArray

from ifc_bridge._direct import placement_matrix
from ifc_bridge._relations import attr

__all__ = ["AxisInfo", "axis_of"]

_TURN_TOL = np.radians(1.0)  # [rad]; a polyline turning more than this is not straight
_CURVED_BASES = ("IfcCircle", "IfcEllipse", "IfcBSplineCurve", "IfcClothoid")


@dataclass(frozen=True, slots=True, kw_only=True)
class AxisInfo:
    """What the Axis curve says about a wall.

    Attributes:
        direction: Unit plan vector from the curve's start to its end [-], or None.
        curved: True for arcs, trimmed circles, or polylines that turn.
    """

    direction: tuple[float, float] | None
    curved: bool


def _points(
    curve: ifcopenshell.entity_instance,
) -> tuple[list[list[float]] | None, bool]:
    """2D points of a curve and whether it has curved parts."""
    if curve.is_a("IfcPolyline"):
        return [list(attr(p, "Coordinates")[:2]) for p in attr(curve, "Points")], False
    if curve.is_a("IfcIndexedPolyCurve"):
        coords = [list(c[:2]) for c in attr(attr(curve, "Points"), "CoordList")]
        curved = any(s.is_a("IfcArcIndex") for s in attr(curve, "Segments") or ())
        return coords, curved
    if curve.is_a("IfcTrimmedCurve"):
        basis = curve.BasisCurve
        curved = basis.is_a() in _CURVED_BASES or not basis.is_a("IfcLine")
        pts = [
            t.Coordinates[:2]
            for t in (*curve.Trim1, *curve.Trim2)
            if hasattr(t, "Coordinates")
        ]
        return ([list(p) for p in pts] if len(pts) == 2 else None), curved
    if curve.is_a("IfcCompositeCurve"):
        pts: list[list[float]] = []
        curved = False
        for seg in curve.Segments:
            parent = getattr(seg, "ParentCurve", None)
            if parent is None:
                return None, True
            p, c = _points(parent)
            curved = curved or c
            if p is None:
                return None, curved
            if getattr(seg, "SameSense", True) is False:
                p = p[::-1]
            pts.extend(p if not pts else p[1:])
        return pts, curved
    if curve.is_a("IfcLine"):
        return None, False
    return None, curve.is_a() in _CURVED_BASES


def _turns(pts: NDArray[np.float64]) -> bool:
    seg = np.diff(pts, axis=0)
    seg = seg[np.linalg.norm(seg, axis=1) > 1e-9]
    if len(seg) < 2:
        return False
    ang = np.arctan2(seg[:, 1], seg[:, 0])
    turn = np.abs((np.diff(ang) + np.pi) % (2 * np.pi) - np.pi)
    return bool((turn > _TURN_TOL).any())


def axis_of(
    wall: ifcopenshell.entity_instance,
    rep: ifcopenshell.entity_instance | None,
    cache: dict[int, NDArray[np.float64]],
) -> AxisInfo:
    """Direction and curvature of a wall from its 'Axis' representation.

    Common practice: IfcWall 'Axis' shape representation, IFC 4.3 §5.1.3.43
    (its reference line, offset from the centreline by the layer-set usage).

    Args:
        wall: The IfcWall.
        rep: Its first 'Axis' IfcShapeRepresentation, or None.
        cache: Placement memo.

    Returns:
        Axis information; ``direction`` None when there is no usable Axis.
    """
    if rep is None:
        return AxisInfo(direction=None, curved=False)
    items = attr(rep, "Items")
    if any(i.is_a("IfcMappedItem") for i in items):
        resolved = ifcopenshell.util.representation.resolve_items(rep)
    else:  # the common case, without resolve_items' overhead
        resolved = [{"item": i, "matrix": None} for i in items]
    m0 = placement_matrix(attr(wall, "ObjectPlacement"), cache)
    for r in resolved:
        pts, curved = _points(r["item"])
        if pts is None or len(pts) < 2:
            return AxisInfo(direction=None, curved=curved)
        m = m0 if r["matrix"] is None else m0 @ r["matrix"]
        # the chord end to end, turned to world (plain floats: two points per wall)
        (x0, y0, z0), (x1, y1, z1) = ((*p, 0.0)[:3] for p in (pts[0], pts[-1]))
        ax, ay, az = x1 - x0, y1 - y0, z1 - z0
        r0, r1 = m[0].tolist(), m[1].tolist()
        cx = r0[0] * ax + r0[1] * ay + r0[2] * az
        cy = r1[0] * ax + r1[1] * ay + r1[2] * az
        length = math.hypot(cx, cy)
        if length <= 1e-9:
            return AxisInfo(direction=None, curved=curved)
        if len(pts) > 2 and not curved:
            local = np.asarray(
                [(*p, 0.0, 1.0)[:4] if len(p) == 2 else (*p[:3], 1.0) for p in pts]
            )
            curved = _turns((m @ local.T).T[:, :2])
        return AxisInfo(direction=(cx / length, cy / length), curved=curved)
    return AxisInfo(direction=None, curved=False)
