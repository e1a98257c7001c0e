"""Read floor, roof and base slabs into plan polygons, one per slab.

A slab forms a diaphragm when its effective PredefinedType (occurrence or type) is
FLOOR, ROOF or BASESLAB, or when it is a part of an IfcRoof. Its plan is the
extrusion profile placed in the world where the body is a vertical
IfcExtrudedAreaSolid, otherwise the union of the up-facing triangles of its mesh.
Openings voiding the slab (or its IfcRoof) are subtracted. World X-Y, metres.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

import ifcopenshell
import ifcopenshell.util.element
import numpy as np
import shapely
from numpy.typing import NDArray
from shapely.geometry import MultiPolygon, Polygon

from ifc_bridge._direct import body_extrusion
from ifc_bridge._geometry import Mesh, mesh_footprint
from ifc_bridge._semantics import effective_predefined_type
from ifc_bridge.model import ImportIssue, IssueSeverity, Level
from ifc_bridge.read_levels import StoreyLevels, clean_elevation

__all__ = [
    "DIAPHRAGM_KINDS",
    "MIN_SLAB_THICKNESS",
    "SlabPlan",
    "read_slab_plans",
    "slab_kind",
]

DIAPHRAGM_KINDS = ("FLOOR", "ROOF", "BASESLAB")
MIN_SLAB_THICKNESS = 0.05  # [m]; thinner slabs are floor finishes, not structure
_LEVEL_TOL = 0.05  # [m]


@dataclass(frozen=True, slots=True, kw_only=True)
class SlabPlan:
    """One slab that may form a diaphragm.

    Attributes:
        guid: GlobalId of the IfcSlab.
        name: Its Name, or ``""``.
        kind: ``"FLOOR"``, ``"ROOF"`` or ``"BASESLAB"``.
        storey: Level name it belongs to.
        gross: Plan outline before slab openings are subtracted [m].
        net: Plan outline with the openings subtracted [m].
        thickness: Extrusion depth, or z-extent of its mesh [m].
        top: Highest z of the body [m].
        bottom: Lowest z of the body [m].
        method: ``"extrusion"`` or the kernel name of the mesh used.
    """

    guid: str
    name: str
    kind: str
    storey: str
    gross: Polygon | MultiPolygon
    net: Polygon | MultiPolygon
    thickness: float
    top: float
    bottom: float
    method: str


def slab_kind(slab: ifcopenshell.entity_instance) -> str | None:
    """Diaphragm kind of a slab, or None when it does not form a diaphragm.

    Common practice: IfcSlabTypeEnum FLOOR / ROOF / BASESLAB (IFC 4.3 §5.1.3.34),
    from the occurrence or its type; a part of an IfcRoof is a ROOF.

    Args:
        slab: The IfcSlab.

    Returns:
        ``"FLOOR"``, ``"ROOF"``, ``"BASESLAB"`` or None.
    """
    kind = (effective_predefined_type(slab) or "").upper()
    if kind in DIAPHRAGM_KINDS:
        return kind
    parent = ifcopenshell.util.element.get_aggregate(slab)
    if parent is not None and parent.is_a("IfcRoof"):
        return "ROOF"
    return None


def level_below(levels: tuple[Level, ...], z: float) -> Level:
    """Highest level at or below ``z`` (+0.05 m), else the lowest level.

    Common practice: an element stands on the storey whose elevation is just below it.

    Args:
        levels: Levels sorted by elevation.
        z: Elevation [m].

    Returns:
        The level.
    """
    below = [lv for lv in levels if lv.elevation <= z + _LEVEL_TOL]
    return below[-1] if below else levels[0]


def _plan(
    slab: ifcopenshell.entity_instance,
    mesh: Mesh | None,
    scale: float,
    cache: dict[int, NDArray[np.float64]],
) -> tuple[Polygon | MultiPolygon, float, float, float, str] | None:
    ext = body_extrusion(slab, scale, cache)
    if ext is not None and not ext.footprint.is_empty:
        return ext.footprint, ext.depth, ext.zmin, ext.zmax, "extrusion"
    if mesh is None:
        return None
    fp = mesh_footprint(mesh, up_only=True)
    if fp.is_empty:
        return None
    return fp, mesh.zmax - mesh.zmin, mesh.zmin, mesh.zmax, mesh.kernel


def _openings_plan(
    host: ifcopenshell.entity_instance,
    meshes: Mapping[int, Mesh],
    scale: float,
    cache: dict[int, NDArray[np.float64]],
) -> list[Polygon | MultiPolygon]:
    hosts = [host]
    parent = ifcopenshell.util.element.get_aggregate(host)
    if parent is not None and parent.is_a("IfcRoof"):
        hosts.append(parent)
    out = []
    for h in hosts:
        for rel in getattr(h, "HasOpenings", ()) or ():
            op = rel.RelatedOpeningElement
            if (getattr(op, "PredefinedType", None) or "") == "RECESS":
                continue
            ext = body_extrusion(op, scale, cache)
            if ext is not None:
                out.append(ext.footprint)
            elif op.id() in meshes:
                out.append(mesh_footprint(meshes[op.id()], up_only=False))
    return out


def _storey_of(
    slab: ifcopenshell.entity_instance, levels: StoreyLevels, zmin: float, path: str
) -> tuple[str, ImportIssue | None]:
    container = ifcopenshell.util.element.get_container(
        slab, ifc_class="IfcBuildingStorey"
    )
    if container is not None and container.id() in levels.name_of:
        return levels.name_of[container.id()], None
    lv = level_below(levels.levels, zmin)
    msg = (
        f"{path}: slab {slab.GlobalId} ({slab.Name!r}) is in no storey; assigned to "
        f"{lv.name!r}, the storey below its underside z = {zmin:.3f} m; contain it "
        "(or its IfcRoof) in a storey"
    )
    issue = ImportIssue(
        code="slab_not_in_storey",
        severity=IssueSeverity.WARNING,
        message=msg,
        guids=(slab.GlobalId,),
        storey=lv.name,
    )
    return lv.name, issue


def read_slab_plans(
    ifc: ifcopenshell.file,
    path: str,
    *,
    scale: float,
    levels: StoreyLevels,
    meshes: Mapping[int, Mesh],
    cache: dict[int, NDArray[np.float64]],
) -> tuple[tuple[SlabPlan, ...], tuple[ImportIssue, ...]]:
    """Plan outlines of the slabs that form diaphragms.

    Common practice: a diaphragm is the plan of the floor or roof slabs of a level,
    net of stair and shaft openings; floor finishes thinner than 0.05 m are not
    structure and are left out (with an INFO issue).

    Args:
        ifc: The open file.
        path: File name, for messages.
        scale: Length unit scale [m per file unit].
        levels: The file's levels.
        meshes: Meshes by entity id, world coordinates [m].
        cache: Placement memo.

    Returns:
        The slab plans in file order, and the issues found.
    """
    plans: list[SlabPlan] = []
    issues: list[ImportIssue] = []
    for slab in ifc.by_type("IfcSlab"):
        kind = slab_kind(slab)
        if kind is None:
            ptype = effective_predefined_type(slab) or "unset"
            msg = (
                f"{path}: slab {slab.GlobalId} ({slab.Name!r}) has "
                f"PredefinedType {ptype}; "
                "not a diaphragm; set FLOOR, ROOF or BASESLAB if it is one"
            )
            issues.append(
                ImportIssue(
                    code="slab_not_diaphragm",
                    severity=IssueSeverity.INFO,
                    message=msg,
                    guids=(slab.GlobalId,),
                )
            )
            continue
        got = _plan(slab, meshes.get(slab.id()), scale, cache)
        if got is None:
            msg = (
                f"{path}: slab {slab.GlobalId} ({slab.Name!r}) has no usable body "
                "geometry; "
                "give it a solid 'Body' representation"
            )
            issues.append(
                ImportIssue(
                    code="slab_no_geometry",
                    severity=IssueSeverity.ERROR,
                    message=msg,
                    guids=(slab.GlobalId,),
                )
            )
            continue
        gross, thickness, zmin, zmax, method = got
        storey, issue = _storey_of(slab, levels, zmin, path)
        if issue is not None:
            issues.append(issue)
        if thickness < MIN_SLAB_THICKNESS:
            msg = (
                f"{path}: slab {slab.GlobalId} ({slab.Name!r}) is "
                f"{thickness * 1000:.0f} mm thick "
                f"(< {MIN_SLAB_THICKNESS * 1000:.0f} mm): "
                "read as a floor finish, not a diaphragm"
            )
            issues.append(
                ImportIssue(
                    code="slab_finish_ignored",
                    severity=IssueSeverity.INFO,
                    message=msg,
                    guids=(slab.GlobalId,),
                    storey=storey,
                )
            )
            continue
        gross = shapely.make_valid(gross)
        net = gross
        holes = _openings_plan(slab, meshes, scale, cache)
        if holes:
            net = shapely.make_valid(gross.difference(shapely.union_all(holes)))
        plans.append(
            SlabPlan(
                guid=slab.GlobalId,
                name=slab.Name or "",
                kind=kind,
                storey=storey,
                gross=gross,
                net=net,
                thickness=float(thickness),
                top=clean_elevation(zmax),
                bottom=clean_elevation(zmin),
                method=method,
            )
        )
    return tuple(plans), tuple(issues)
