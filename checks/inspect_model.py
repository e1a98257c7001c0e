"""What ``shearline inspect`` shows: levels, diaphragms, walls per direction, warnings.

Counts follow the rule of the CLI contract: ``walls`` counts each IfcWall once, on the
level it stands on (so the levels add up to the file's IfcWall count, plus those in no
storey under ``unplaced_walls``); ``segments`` counts the story pieces after splitting.
"""

from __future__ import annotations

import math
from collections import Counter

from ifc_bridge.model import BuildingModel, WallSegment

__all__ = ["inspect_document", "wall_direction"]


def wall_direction(wall: WallSegment, angle_tolerance: float) -> str:
    """``"X"``, ``"Y"`` or ``"skewed"`` from the wall's plan angle.

    Args:
        wall: The wall segment.
        angle_tolerance: Tolerance on parallelism [rad].

    Returns:
        The direction label.
    """
    a = wall.angle
    if min(a, math.pi - a) <= angle_tolerance:
        return "X"
    if abs(a - math.pi / 2) <= angle_tolerance:
        return "Y"
    return "skewed"


def inspect_document(
    model: BuildingModel, *, angle_tolerance: float = math.radians(10.0)
) -> dict:
    """The inspection summary as a JSON-ready dict (areas in m², lengths in m).

    Args:
        model: The model read from IFC.
        angle_tolerance: Tolerance on parallelism for the per-direction counts [rad].

    Returns:
        ``{"source", "schema", "levels": [...], "issues": [...], ...}``.
    """
    wall_count = Counter(storey for _, storey in model.wall_storeys)
    levels = []
    for lv in model.levels:
        diaphragms = model.diaphragms_of(lv.name)
        standing = [w for w in model.walls if w.storey == lv.name]
        shear = [w for w in standing if w.is_shear_wall]
        by_dir = Counter(wall_direction(w, angle_tolerance) for w in shear)
        levels.append(
            {
                "name": lv.name,
                "guid": lv.guid,
                "elevation": lv.elevation,
                "is_diaphragm_level": lv.is_diaphragm_level,
                "diaphragm_area": sum(d.area for d in diaphragms),
                "diaphragms": [
                    {
                        "id": d.id,
                        "area": d.area,
                        "kind": d.kind,
                        "slabs": list(d.slab_guids),
                    }
                    for d in diaphragms
                ],
                "slab_count": sum(len(d.slab_guids) for d in diaphragms),
                "walls": wall_count.get(lv.name, 0),
                "shear_walls": len({w.guid for w in shear}),
                "segments": len(standing),
                "shear_walls_by_direction": {
                    k: by_dir.get(k, 0) for k in ("X", "Y", "skewed")
                },
                "shear_wall_list": [
                    {
                        "guid": w.guid,
                        "name": w.name,
                        "type": w.type_name,
                        "assembly": w.assembly,
                        "direction": wall_direction(w, angle_tolerance),
                        "length": w.length,
                        "openings": len(w.openings),
                        "supports": w.level,
                    }
                    for w in shear
                ],
            }
        )
    known = {lv.name for lv in model.levels}
    return {
        "source": model.source,
        "schema": model.schema,
        "project": model.project_name,
        "length_unit_scale": model.length_unit_scale,
        "ifc_wall_count": model.ifc_wall_count,
        "unplaced_walls": sum(n for s, n in wall_count.items() if s not in known),
        "levels": levels,
        "issues": [
            {
                "severity": i.severity.value,
                "code": i.code,
                "message": i.message,
                "guids": list(i.guids),
            }
            for i in model.issues
        ],
    }
