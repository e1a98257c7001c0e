"""Semantics of an element from its attributes: type, predefined type, materials."""

from __future__ import annotations

from dataclasses import dataclass

import ifcopenshell
import ifcopenshell.util.element

__all__ = ["WallSemantics", "effective_predefined_type", "wall_semantics"]


def effective_predefined_type(element: ifcopenshell.entity_instance) -> str:
    """PredefinedType of an element, from its type first, as ifcopenshell resolves it.

    Common practice: ``ifcopenshell.util.element.get_predefined_type``; for a class
    with no PredefinedType attribute (IFC2X3 IfcWall, IfcSlab has one) and no typed
    value, that function returns ``ObjectType``, which is not a predefined type, so
    ``""`` is returned instead.

    Args:
        element: An IfcProduct.

    Returns:
        The predefined type (``"SHEAR"``, ``"FLOOR"``, a user-defined name), or ``""``.
    """
    value = ifcopenshell.util.element.get_predefined_type(element) or ""
    element_type = ifcopenshell.util.element.get_type(element)
    from_type = getattr(element_type, "PredefinedType", None) if element_type else None
    has_attribute = "PredefinedType" in element.get_attribute_names()
    if not has_attribute and from_type in (None, "NOTDEFINED"):
        return ""
    return str(value)


@dataclass(frozen=True, slots=True, kw_only=True)
class WallSemantics:
    """What the attributes of a wall say.

    Attributes:
        name: Name, or ``""``.
        type_name: Name of its IfcWallType, or ``""``.
        materials: Material names in layer order.
        predefined_type: Effective predefined type, or ``""``.
        properties: ``("Pset.Property", value)`` pairs, sorted.
        layer_thickness: Total of the material layers [m], or None.
    """

    name: str
    type_name: str
    materials: tuple[str, ...]
    predefined_type: str
    properties: tuple[tuple[str, str], ...]
    layer_thickness: float | None


def _layer_thickness(wall: ifcopenshell.entity_instance, scale: float) -> float | None:
    material = ifcopenshell.util.element.get_material(wall, should_skip_usage=True)
    if material is None or not material.is_a("IfcMaterialLayerSet"):
        return None
    total = sum(float(layer.LayerThickness or 0.0) for layer in material.MaterialLayers)
    return total * scale if total > 0.0 else None


def _properties(element: ifcopenshell.entity_instance) -> tuple[tuple[str, str], ...]:
    flat = []
    for pset, props in ifcopenshell.util.element.get_psets(
        element, psets_only=True
    ).items():
        for key, value in props.items():
            if key != "id":
                flat.append((f"{pset}.{key}", str(value)))
    return tuple(sorted(flat))


def wall_semantics(wall: ifcopenshell.entity_instance, scale: float) -> WallSemantics:
    """Name, type, materials, predefined type and properties of a wall.

    Common practice: occurrence property sets override those of the type
    (``ifcopenshell.util.element.get_psets``). LoadBearing is read, not trusted.

    Args:
        wall: The IfcWall.
        scale: Length unit scale [m per file unit].

    Returns:
        The wall's semantics.
    """
    wall_type = ifcopenshell.util.element.get_type(wall)
    materials = tuple(
        m.Name for m in ifcopenshell.util.element.get_materials(wall) if m.Name
    )
    return WallSemantics(
        name=wall.Name or "",
        type_name=(wall_type.Name or "") if wall_type is not None else "",
        materials=materials,
        predefined_type=effective_predefined_type(wall),
        properties=_properties(wall),
        layer_thickness=_layer_thickness(wall, scale),
    )
