"""Write results back into a copy of the IFC: a property set of our own on walls and storeys.

The original file is never modified: the copy is written to a new path, which must
differ from the source. Property values are SI (N, m, N/m) with the unit in the
property name, since IFC property sets of our own carry no unit assignment of their own.
"""

from __future__ import annotations

import logging
import os
from collections.abc import Mapping
from pathlib import Path

from ifc_bridge.errors import IfcBridgeError, IfcFileError
from ifc_bridge.model import IfcGuid

__all__ = ["PSET_STOREY", "PSET_WALL", "write_ifc_copy"]

log = logging.getLogger(__name__)

PSET_WALL = "Shearline_WallResults"
PSET_STOREY = "Shearline_StoreyResults"

PropertyValues = Mapping[str, float | int | str | bool | None]


def write_ifc_copy(
    source: str | os.PathLike,
    target: str | os.PathLike,
    *,
    walls: Mapping[IfcGuid, PropertyValues],
    storeys: Mapping[IfcGuid, PropertyValues],
) -> Path:
    """Copy ``source`` to ``target`` with result property sets added.

    Args:
        source: The IFC file that was checked.
        target: Path of the annotated copy (must not be ``source``).
        walls: IfcWall GlobalId -> property name -> value (``None`` values skipped).
        storeys: IfcBuildingStorey GlobalId -> property name -> value.

    Returns:
        The path written.

    Raises:
        IfcFileError: Target equals source, or the file cannot be read or written.
        IfcBridgeError: A GlobalId is not in the file.
    """
    import ifcopenshell.api.pset

    from ifc_bridge.open_file import open_ifc

    src, dst = Path(source), Path(target)
    if src.resolve() == dst.resolve():
        msg = f"{dst}: the annotated copy must not overwrite the checked model"
        raise IfcFileError(msg)
    f = open_ifc(src)
    for pset_name, table in ((PSET_WALL, walls), (PSET_STOREY, storeys)):
        for guid, values in table.items():
            try:
                element = f.by_guid(guid)
            except RuntimeError as exc:
                msg = f"{src}: element {guid} not found; cannot annotate it"
                raise IfcBridgeError(msg) from exc
            props = {k: _ifc_value(v) for k, v in values.items() if v is not None}
            if not props:
                continue
            pset = ifcopenshell.api.pset.add_pset(f, product=element, name=pset_name)
            ifcopenshell.api.pset.edit_pset(f, pset=pset, properties=props)
    try:
        f.write(str(dst))
    except OSError as exc:
        msg = f"{dst}: cannot write the annotated IFC copy: {exc}"
        raise IfcFileError(msg) from exc
    log.info("annotated %d walls and %d storeys into %s", len(walls), len(storeys), dst)
    return dst


def _ifc_value(value: float | int | str | bool) -> float | int | str | bool:
    if isinstance(value, bool | int | str):
        return value
    return float(value)
