"""Semantics of an element from its attributes: type, predefined type, materials."""

from __future__ import annotations

from dataclasses import dataclass

import ifcopenshell
import ifcopenshell.util.element

__all__ = [
    "WallSemantics",
    "effective_predefined_type",
    "element_type",
    "wall_semantics",
]


def element_type(
    element: ifcopenshell.entity_instance,
) -> ifcopenshell.entity_instance | None:
    """The IfcTypeObject of an element (IFC4 IsTypedBy, IFC2X3 IfcRelDefinesByType)."""
    for rel in getattr(element, "IsTypedBy", None) or ():
        return rel.RelatingType
    for rel in getattr(element, "IsDefinedBy", None) or ():
        if rel.is_a("IfcRelDefinesByType"):
            return rel.RelatingType
    return None


def effective_predefined_type(
    element: ifcopenshell.entity_instance,
    typed: ifcopenshell.entity_instance | bool | None = False,
) -> str:
    """PredefinedType of an element, from its type first, as ifcopenshell resolves it.

    Common practice: the rule of ``ifcopenshell.util.element.get_predefined_type``
    (type first, USERDEFINED -> ElementType / ObjectType). For a class with no
    PredefinedType attribute (IFC2X3 IfcWall) and no typed value, that function
    returns ``ObjectType``, which is not a predefined type; ``""`` is returned.

    Args:
        element: An IfcProduct.
        typed: Its type object when already known (None: untyped); False: look it up.

    Returns:
        The predefined type (``"SHEAR"``, ``"FLOOR"``, a user-defined name), or ``""``.
    """
    t = element_type(element) if typed is False else typed
    if t is not None:
        value = getattr(t, "PredefinedType", None)
        if value == "USERDEFINED" or not value:
            value = getattr(t, "ElementType", None) or getattr(t, "ProcessType", None)
        if value and value != "NOTDEFINED":
            return str(value)
    try:
        value = element.PredefinedType
    except AttributeError:
        return ""
    if value == "USERDEFINED" or not value:
        value = element.ObjectType
    return str(value or "")


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


def _material_names(material: ifcopenshell.entity_instance | None) -> tuple[str, ...]:
    if material is None:
        return ()
    if material.is_a("IfcMaterial"):
        found = [material]
    elif material.is_a("IfcMaterialList"):
        found = list(material.Materials)
    else:
        parts = (
            getattr(material, "MaterialLayers", None)
            or getattr(material, "MaterialConstituents", None)
            or getattr(material, "MaterialProfiles", None)
            or ()
        )
        found = [p.Material for p in parts if getattr(p, "Material", None) is not None]
    return tuple(m.Name for m in found if m.Name)


def _layer_thickness(
    material: ifcopenshell.entity_instance | None, scale: float
) -> float | None:
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
    wall_type = element_type(wall)
    material = ifcopenshell.util.element.get_material(wall, should_skip_usage=True)
    return WallSemantics(
        name=wall.Name or "",
        type_name=(wall_type.Name or "") if wall_type is not None else "",
        materials=_material_names(material),
        predefined_type=effective_predefined_type(wall, wall_type),
        properties=_properties(wall),
        layer_thickness=_layer_thickness(material, scale),
    )
