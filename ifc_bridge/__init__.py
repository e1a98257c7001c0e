"""IFC in and out: read an architect's model into plain SI dataclasses; write results back.

Importing this package does not import ifcopenshell; only the readers and the writer do,
when called. ``allocation`` depends on :mod:`ifc_bridge.model` alone.
"""

from __future__ import annotations

from ifc_bridge.errors import (
    IfcBridgeError,
    IfcContentError,
    IfcFileError,
    IfcSchemaError,
    UnitsError,
)
from ifc_bridge.model import (
    BuildingModel,
    Diaphragm,
    Direction,
    ImportIssue,
    IssueSeverity,
    Level,
    ModelError,
    Opening,
    WallSegment,
)

__all__ = [
    "BuildingModel",
    "Diaphragm",
    "Direction",
    "IfcBridgeError",
    "IfcContentError",
    "IfcFileError",
    "IfcSchemaError",
    "ImportIssue",
    "IssueSeverity",
    "Level",
    "ModelError",
    "Opening",
    "UnitsError",
    "WallSegment",
]
