"""Doors and windows that fill no opening: report them against the wall they sit in.

Some exporters place doors and windows without an IfcOpeningElement, so the wall
is not voided and its piers cannot be split. Each such door or window is matched
to a wall whose plan rectangle (widened by 0.1 m) contains its plan centre and whose
height overlaps it.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence

import ifcopenshell
import numpy as np
from numpy.typing import NDArray

from ifc_bridge._geometry import Mesh
from ifc_bridge._openings import opening_points
from ifc_bridge._relations import OpeningMaps
from ifc_bridge.model import ImportIssue, IssueSeverity

__all__ = ["unfilled_inserts", "unfilled_issues"]

_REACH = 0.1  # [m] beyond the wall faces


def unfilled_inserts(
    ifc: ifcopenshell.file, openings: OpeningMaps | None = None
) -> list[ifcopenshell.entity_instance]:
    """IfcDoor and IfcWindow entities that fill no opening (no IfcRelFillsElement).

    ``openings``: the file's opening maps, when read.
    """
    found = ifc.by_type("IfcDoor") + ifc.by_type("IfcWindow")
    if openings is None:
        return [e for e in found if not (getattr(e, "FillsVoids", None) or ())]
    filling = {e.id() for group in openings.fills.values() for e in group}
    return [e for e in found if e.id() not in filling]


_MARGIN = 1e-3  # [m]; the prefilter keeps every wall the exact test could accept


def _plan_arrays(plans: Sequence[object]) -> dict[str, NDArray[np.float64]]:
    """Start, direction, length, half-thickness, base and top of every plan."""
    if not plans:
        return {}
    return {
        "start": np.array([p.line.start for p in plans], dtype=np.float64),
        "dir": np.array([p.line.direction for p in plans], dtype=np.float64),
        "length": np.array([p.line.length for p in plans], dtype=np.float64),
        "half": np.array([p.line.thickness / 2 for p in plans], dtype=np.float64),
        "base": np.array([p.base for p in plans], dtype=np.float64),
        "top": np.array([p.top for p in plans], dtype=np.float64),
    }


def _candidates(
    centre: NDArray[np.float64],
    z0: float,
    z1: float,
    arrays: dict[str, NDArray[np.float64]],
) -> NDArray[np.intp]:
    """Indices of the plans that may contain the point: a loose, vectorised test."""
    if not arrays:
        return np.zeros(0, dtype=np.intp)
    rel = centre - arrays["start"]
    d = arrays["dir"]
    s = rel[:, 0] * d[:, 0] + rel[:, 1] * d[:, 1]
    t = np.abs(rel[:, 1] * d[:, 0] - rel[:, 0] * d[:, 1])
    reach = _REACH + _MARGIN
    ok = (s >= -reach) & (s <= arrays["length"] + reach)
    ok &= t <= arrays["half"] + reach
    ok &= (z0 < arrays["top"] + _MARGIN) & (z1 > arrays["base"] - _MARGIN)
    return np.flatnonzero(ok)


def _host(
    centre: NDArray[np.float64], z0: float, z1: float, plans: Sequence[object]
) -> str:
    for plan in plans:
        line = plan.line
        d = line.direction
        rel = centre - np.asarray(line.start)
        s = float(rel @ d)
        t = abs(float(rel @ np.array([-d[1], d[0]])))
        inside = (
            -_REACH <= s <= line.length + _REACH and t <= line.thickness / 2 + _REACH
        )
        if inside and z0 < plan.top and z1 > plan.base:
            return plan.guid
    return ""


def unfilled_issues(
    inserts: Sequence[ifcopenshell.entity_instance],
    plans: Sequence[object],
    *,
    meshes: Mapping[int, Mesh],
    scale: float,
    cache: dict[int, NDArray[np.float64]],
    path: str,
) -> tuple[ImportIssue, ...]:
    """INFO issues for doors and windows that cut no opening in their wall.

    Common practice: IfcRelFillsElement links a door or window to the opening it
    fills, IFC 4.3 §5.4.3.

    Args:
        inserts: Doors and windows with no IfcRelFillsElement.
        plans: Whole-wall rectangles (``WallPlan``) of the walls read.
        meshes: Meshes by entity id [m].
        scale: Length unit scale [m per file unit].
        cache: Placement memo.
        path: File name, for messages.

    Returns:
        One issue per door or window matched to a wall, plus one for the rest.
    """
    issues, unmatched = [], []
    arrays = _plan_arrays(plans) if inserts else {}
    for e in inserts:
        pts = opening_points(e, meshes, scale, cache)
        host = ""
        if pts is not None:
            centre = (pts[:, :2].min(axis=0) + pts[:, :2].max(axis=0)) / 2.0
            z0, z1 = float(pts[:, 2].min()), float(pts[:, 2].max())
            near = [plans[i] for i in _candidates(centre, z0, z1, arrays)]
            host = _host(centre, z0, z1, near)  # the exact test, in file order
        kind = "door" if e.is_a("IfcDoor") else "window"
        if not host:
            unmatched.append(e.GlobalId)
            continue
        msg = (
            f"{path}: {kind} {e.GlobalId} ({e.Name!r}) cuts no opening in wall {host}; "
            "piers not split; export doors and windows with their openings"
        )
        issues.append(
            ImportIssue(
                code="insert_without_opening",
                severity=IssueSeverity.INFO,
                message=msg,
                guids=(e.GlobalId, host),
            )
        )
    if unmatched:
        msg = (
            f"{path}: {len(unmatched)} doors/windows fill no opening and sit in "
            "no wall "
            "found; piers not split; export doors and windows with their openings"
        )
        issues.append(
            ImportIssue(
                code="insert_without_opening",
                severity=IssueSeverity.INFO,
                message=msg,
                guids=tuple(sorted(unmatched)),
            )
        )
    return tuple(issues)
