"""Read the building storeys of an IFC file as levels, sorted by elevation.

Elevations are in metres, Z up, rounded to 1e-6 m (exporters write float noise such
as -1.8e-12 for 0). ``Elevation`` is used when present; otherwise the z of the
storey's placement in the world.
"""

from __future__ import annotations

from collections import Counter
from dataclasses import dataclass

import ifcopenshell
import ifcopenshell.util.placement

from ifc_bridge.errors import IfcContentError
from ifc_bridge.model import ImportIssue, IssueSeverity, Level

__all__ = ["StoreyLevels", "read_levels"]

_ROUND = 6  # decimals of a metre kept in elevations


@dataclass(frozen=True, slots=True, kw_only=True)
class StoreyLevels:
    """The levels of a file and how to find them from storey entities.

    Attributes:
        levels: Levels sorted by elevation, all with ``is_diaphragm_level=True``
            until the slabs are known.
        name_of: IfcBuildingStorey entity id -> level name.
        issues: Problems found (duplicate or missing names).
    """

    levels: tuple[Level, ...]
    name_of: dict[int, str]
    issues: tuple[ImportIssue, ...]


def clean_elevation(value: float) -> float:
    """Round an elevation to 1e-6 m so float noise reads as the intended value.

    Common practice: exporters write 0 as -1.8e-12 and 3.5 as 3.4999999999999996.

    Args:
        value: Elevation [m].

    Returns:
        Rounded elevation [m], never -0.0.
    """
    return float(round(value, _ROUND)) + 0.0


def _storey_elevation(
    storey: ifcopenshell.entity_instance, path: str, scale: float
) -> float:
    if storey.Elevation is not None:
        return clean_elevation(float(storey.Elevation) * scale)
    if storey.ObjectPlacement is None:
        msg = (
            f"{path}: storey {storey.GlobalId} ({storey.Name!r}) has neither "
            "Elevation nor "
            "ObjectPlacement; give the IfcBuildingStorey an Elevation"
        )
        raise IfcContentError(msg)
    matrix = ifcopenshell.util.placement.get_local_placement(storey.ObjectPlacement)
    return clean_elevation(float(matrix[2, 3]) * scale)


def read_levels(ifc: ifcopenshell.file, path: str, *, scale: float) -> StoreyLevels:
    """Levels from the file's IfcBuildingStorey entities.

    Common practice: one level per storey; names are made unique by appending the
    GlobalId to repeated names, since the model and the config refer to levels by name.

    Args:
        ifc: The open file.
        path: File name, for messages.
        scale: Length unit scale [m per file unit].

    Returns:
        Levels sorted by elevation [m], the entity-id map and the issues.

    Raises:
        IfcContentError: No storey at all, or a storey without any elevation.
    """
    storeys = ifc.by_type("IfcBuildingStorey")
    if not storeys:
        msg = f"{path}: has no IfcBuildingStorey; assign the walls and slabs to storeys"
        raise IfcContentError(msg)
    issues: list[ImportIssue] = []
    raw = [
        (_storey_elevation(s, path, scale), (s.Name or "").strip(), s) for s in storeys
    ]
    raw.sort(key=lambda t: (t[0], t[1], t[2].GlobalId))
    counts = Counter(name for _, name, _ in raw)
    levels, name_of = [], {}
    for index, (elevation, name, storey) in enumerate(raw):
        guid = storey.GlobalId
        unique = name
        if not name:
            unique = guid
            msg = f"{path}: storey {guid} has no Name; called it {guid!r}; name it"
            issues.append(
                _issue("storey_no_name", IssueSeverity.WARNING, msg, guid, unique)
            )
        elif counts[name] > 1:
            unique = f"{name} ({guid})"
            msg = (
                f"{path}: storey name {name!r} is used {counts[name]} times; "
                f"storey {guid} "
                f"read as {unique!r}; give each storey its own name"
            )
            issues.append(
                _issue(
                    "storey_duplicate_name", IssueSeverity.WARNING, msg, guid, unique
                )
            )
        levels.append(Level(name=unique, guid=guid, elevation=elevation, index=index))
        name_of[storey.id()] = unique
    return StoreyLevels(levels=tuple(levels), name_of=name_of, issues=tuple(issues))


def _issue(
    code: str, severity: IssueSeverity, message: str, guid: str, storey: str
) -> ImportIssue:
    return ImportIssue(
        code=code, severity=severity, message=message, guids=(guid,), storey=storey
    )
