"""The file's length unit as one factor to metres.

Everything the readers return is in metres: IFC length values times ``scale``.
"""

from __future__ import annotations

import math

import ifcopenshell
import ifcopenshell.util.unit

from ifc_bridge.errors import UnitsError

__all__ = ["length_unit_scale"]


def length_unit_scale(ifc: ifcopenshell.file, path: str) -> float:
    """Metres per file length unit (0.001 for mm, 0.3048 for ft, 0.0254 for in).

    Common practice: ``ifc_project_length * scale = si_metres``, as
    ``ifcopenshell.util.unit.calculate_unit_scale`` defines it.

    Args:
        ifc: The open IFC file.
        path: File name, for the error message.

    Returns:
        Length unit scale [m per file unit].

    Raises:
        UnitsError: The length unit cannot be converted to metres.
    """
    try:
        scale = ifcopenshell.util.unit.calculate_unit_scale(ifc, "LENGTHUNIT")
    except Exception as exc:  # ifcopenshell raises bare Exception on odd units
        msg = (
            f"{path}: length unit cannot be read ({exc}); "
            "give the project an IfcSIUnit LENGTHUNIT"
        )
        raise UnitsError(msg) from exc
    scale = float(scale)
    if not (math.isfinite(scale) and scale > 0.0):
        msg = (
            f"{path}: length unit scale {scale} is not a positive number; "
            "fix the IfcUnitAssignment"
        )
        raise UnitsError(msg)
    return scale
