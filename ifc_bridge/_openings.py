"""Openings of a wall as intervals along its centreline and heights above its base.

Each IfcRelVoidsElement of the wall gives one IfcOpeningElement; its body's vertices
are projected on the centreline (distance from the start point) and clipped to the
wall. Doors and windows that fill no opening are matched to walls by plan position.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass

import ifcopenshell
import numpy as np
from numpy.typing import NDArray

from ifc_bridge._centreline import Centreline
from ifc_bridge._direct import body_extrusion
from ifc_bridge._geometry import Mesh
from ifc_bridge._relations import attr
from ifc_bridge.model import ImportIssue, IssueSeverity, Opening

__all__ = ["WallOpenings", "opening_points", "wall_openings"]

_MIN_SIZE = 1e-3  # [m]; a clipped interval smaller than this is no opening


@dataclass(frozen=True, slots=True, kw_only=True)
class WallOpenings:
    """Openings of one wall, relative to its whole height.

    Attributes:
        openings: Openings sorted by start, heights above the wall base [m].
        issues: Openings without geometry or outside the wall.
    """

    openings: tuple[Opening, ...]
    issues: tuple[ImportIssue, ...]


_NONE = WallOpenings(openings=(), issues=())


def opening_points(
    element: ifcopenshell.entity_instance,
    meshes: Mapping[int, Mesh],
    scale: float,
    cache: dict[int, NDArray[np.float64]],
) -> NDArray[np.float64] | None:
    """World vertices (n, 3) of an opening (or door/window) body [m], or None."""
    mesh = meshes.get(element.id())
    if mesh is not None:
        return mesh.verts
    ext = body_extrusion(element, scale, cache)
    if ext is None:
        return None
    xy = np.asarray(ext.footprint.convex_hull.exterior.coords)
    lo = np.c_[xy, np.full(len(xy), ext.zmin)]
    hi = np.c_[xy, np.full(len(xy), ext.zmax)]
    return np.vstack([lo, hi])


def wall_openings(
    wall: ifcopenshell.entity_instance,
    line: Centreline,
    *,
    base: float,
    top: float,
    meshes: Mapping[int, Mesh],
    scale: float,
    cache: dict[int, NDArray[np.float64]],
    path: str,
    openings: Sequence[ifcopenshell.entity_instance] | None = None,
    fills: Mapping[int, Sequence[ifcopenshell.entity_instance]] | None = None,
) -> WallOpenings:
    """Openings voiding a wall, as intervals along its centreline.

    Common practice: IfcRelVoidsElement / IfcRelFillsElement, IFC 4.3 §5.4.3.

    Args:
        wall: The IfcWall.
        line: Its centreline [m].
        base: Wall base elevation [m].
        top: Wall top elevation [m].
        meshes: Meshes by entity id [m].
        scale: Length unit scale [m per file unit].
        cache: Placement memo.
        path: File name, for messages.
        openings: The wall's openings in ``HasOpenings`` order, when known.
        fills: Opening id -> the doors and windows filling it, when known.

    Returns:
        The openings and issues.
    """
    out: list[Opening] = []
    issues: list[ImportIssue] = []
    if openings is None:
        openings = [
            r.RelatedOpeningElement for r in getattr(wall, "HasOpenings", ()) or ()
        ]
    if not openings:
        return _NONE
    start = np.asarray(line.start)
    d = line.direction
    for op in openings:
        pts = opening_points(op, meshes, scale, cache)
        if pts is None:
            msg = (
                f"{path}: opening {op.GlobalId} in wall {wall.GlobalId} has no usable "
                "geometry; not counted; give it a solid 'Body' representation"
            )
            issues.append(
                ImportIssue(
                    code="opening_no_geometry",
                    severity=IssueSeverity.WARNING,
                    message=msg,
                    guids=(op.GlobalId, wall.GlobalId),
                )
            )
            continue
        s = (pts[:, :2] - start) @ d
        s0, s1 = max(float(s.min()), 0.0), min(float(s.max()), line.length)
        z0, z1 = max(float(pts[:, 2].min()), base), min(float(pts[:, 2].max()), top)
        if s1 - s0 < _MIN_SIZE or z1 - z0 < _MIN_SIZE:
            msg = (
                f"{path}: opening {op.GlobalId} lies outside wall {wall.GlobalId}; "
                "ignored; "
                "check the opening's placement"
            )
            issues.append(
                ImportIssue(
                    code="opening_outside_wall",
                    severity=IssueSeverity.WARNING,
                    message=msg,
                    guids=(op.GlobalId, wall.GlobalId),
                )
            )
            continue
        if fills is None:
            filling = [r.RelatedBuildingElement for r in op.HasFillings or ()]
        else:
            filling = fills.get(op.id(), ())
        out.append(
            Opening(
                guid=attr(op, "GlobalId"),
                start=s0,
                end=s1,
                bottom=z0 - base,
                top=z1 - base,
                filled_by=tuple(sorted(attr(e, "GlobalId") for e in filling)),
            )
        )
    out.sort(key=lambda o: (o.start, o.end, o.guid))
    return WallOpenings(openings=tuple(out), issues=tuple(issues))
