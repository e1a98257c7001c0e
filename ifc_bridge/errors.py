"""Errors raised by the IFC bridge when a whole file cannot be used.

Exception tree::

    IfcBridgeError
    ├── IfcFileError (IfcBridgeError, OSError)      file missing, unreadable, not IFC
    ├── IfcSchemaError (IfcBridgeError, ValueError) schema unknown to ifcopenshell
    ├── IfcContentError (IfcBridgeError, ValueError) no storeys, no walls, ...
    └── UnitsError (IfcBridgeError, ValueError)     unit assignment unusable

One bad element never raises: it becomes an ``ImportIssue`` in the model.
"""

from __future__ import annotations

__all__ = [
    "IfcBridgeError",
    "IfcContentError",
    "IfcFileError",
    "IfcSchemaError",
    "UnitsError",
]


class IfcBridgeError(Exception):
    """Base of every error from ``ifc_bridge``; the message is one line."""


class IfcFileError(IfcBridgeError, OSError):
    """The file is missing, unreadable, or not an IFC-SPF file."""


class IfcSchemaError(IfcBridgeError, ValueError):
    """The file declares a schema that cannot be read."""


class IfcContentError(IfcBridgeError, ValueError):
    """The file is IFC but lacks what the analysis needs (storeys, walls)."""


class UnitsError(IfcBridgeError, ValueError):
    """The file's unit assignment cannot be converted to SI."""
