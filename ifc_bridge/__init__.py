"""IFC in and out: read an architect's model into plain SI dataclasses; write results back.

Importing this package does not import ifcopenshell; only the readers and the writer do,
when called. ``allocation`` depends on :mod:`ifc_bridge.model` alone. The names below
load with their module on first use (PEP 562), so importing :mod:`ifc_bridge.errors`
alone does not load the model's geometry libraries.
"""

from __future__ import annotations

import importlib
from typing import Any

_HOMES = {
    "IfcBridgeError": "errors",
    "IfcContentError": "errors",
    "IfcFileError": "errors",
    "IfcSchemaError": "errors",
    "UnitsError": "errors",
    "BuildingModel": "model",
    "Diaphragm": "model",
    "Direction": "model",
    "ImportIssue": "model",
    "IssueSeverity": "model",
    "Level": "model",
    "ModelError": "model",
    "Opening": "model",
    "WallSegment": "model",
}


def __getattr__(name: str) -> Any:
    home = _HOMES.get(name)
    if home is None:
        msg = f"module 'ifc_bridge' has no attribute {name!r}"
        raise AttributeError(msg)
    value = getattr(importlib.import_module(f"ifc_bridge.{home}"), name)
    globals()[name] = value
    return value


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
