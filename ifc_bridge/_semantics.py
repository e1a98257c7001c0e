"""Semantics of an element from its attributes: type, predefined type, materials."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import ifcopenshell
import ifcopenshell.util.element

from ifc_bridge._relations import Relations, attr

_ABSENT = 0xFFFFFFFF  # get_argument_index of an attribute the entity lacks

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
        value = _type_predefined(t)
        if value:
            return value
    return _own_predefined(element)


def _type_predefined(t: ifcopenshell.entity_instance) -> str:
    value = getattr(t, "PredefinedType", None)
    if value == "USERDEFINED" or not value:
        value = getattr(t, "ElementType", None) or getattr(t, "ProcessType", None)
    return str(value) if value and value != "NOTDEFINED" else ""


def _own_predefined(element: ifcopenshell.entity_instance) -> str:
    if element.get_argument_index("PredefinedType") == _ABSENT:
        return ""  # IFC2X3 IfcWall: no such attribute
    value = attr(element, "PredefinedType")
    if value == "USERDEFINED" or not value:
        value = attr(element, "ObjectType")
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


def _flatten(psets: dict[str, dict[str, Any]]) -> tuple[tuple[str, str], ...]:
    flat = []
    for pset, props in psets.items():
        for key, value in props.items():
            if key != "id":
                flat.append((f"{pset}.{key}", str(value)))
    return tuple(sorted(flat))


def _properties(element: ifcopenshell.entity_instance) -> tuple[tuple[str, str], ...]:
    return _flatten(ifcopenshell.util.element.get_psets(element, psets_only=True))


def _memo(rel: Relations, kind: str, key: int, make: Any) -> Any:
    k = (kind, key)
    if k not in rel.memo:
        rel.memo[k] = make()
    return rel.memo[k]


def _occurrence_sets(definitions: list) -> list[ifcopenshell.entity_instance]:
    out = []
    for d in definitions:
        members = d.wrappedValue if d.is_a("IfcPropertySetDefinitionSet") else (d,)
        out.extend(
            m
            for m in members
            if m.is_a("IfcPropertySet") or m.is_a("IfcPreDefinedPropertySet")
        )
    return out


def _fast_properties(
    element: ifcopenshell.entity_instance,
    typed: ifcopenshell.entity_instance | None,
    rel: Relations,
) -> tuple[tuple[str, str], ...] | None:
    """``_properties`` from memoised type and property-set answers; None: ambiguous."""
    tid = typed.id() if typed is not None else 0
    base = _memo(
        rel,
        "type_psets",
        tid,
        lambda: (
            {}
            if typed is None
            else ifcopenshell.util.element.get_psets(
                typed, psets_only=True, should_inherit=False
            )
        ),
    )
    own = _occurrence_sets(rel.definitions.get(element.id(), []))
    if not own:
        return _memo(rel, "type_flat", tid, lambda: _flatten(base))
    names = [attr(p, "Name") for p in own]
    if len(set(names)) != len(names):
        return None  # same-named sets: the override order is the inverse order
    merged = {k: dict(v) for k, v in base.items()}
    for pset, name in zip(own, names, strict=True):
        found = _memo(
            rel,
            "pset",
            pset.id(),
            lambda p=pset: ifcopenshell.util.element.get_property_definition(p),
        )
        merged.setdefault(name, {}).update(found)
    return _flatten(merged)


def _skip_usage(
    material: ifcopenshell.entity_instance,
) -> ifcopenshell.entity_instance:
    if material.is_a("IfcMaterialLayerSetUsage"):
        return material.ForLayerSet
    if material.is_a("IfcMaterialProfileSetUsage"):
        return material.ForProfileSet
    return material


def _fast_material(
    element: ifcopenshell.entity_instance,
    typed: ifcopenshell.entity_instance | None,
    rel: Relations,
) -> tuple[ifcopenshell.entity_instance | None, bool]:
    """``get_material(element, should_skip_usage=True)``; False: ambiguous."""
    own = rel.materials.get(element.id(), ())
    if len(own) > 1:
        return None, False
    if own:
        return _skip_usage(own[0]), True
    if typed is None:
        return None, True
    return _memo(
        rel,
        "type_material",
        typed.id(),
        lambda: (
            ifcopenshell.util.element.get_material(typed, should_skip_usage=True)
            if getattr(typed, "HasAssociations", None)
            else None
        ),
    ), True


def _fast_semantics(
    wall: ifcopenshell.entity_instance, scale: float, rel: Relations
) -> WallSemantics | None:
    typed = rel.type_of(wall)
    if typed is False:
        return None
    material, ok = _fast_material(wall, typed, rel)
    props = _fast_properties(wall, typed, rel) if ok else None
    if props is None:
        return None
    names, layers = _memo(
        rel,
        "material",
        material.id() if material is not None else 0,
        lambda: (_material_names(material), _layer_thickness(material, scale)),
    )
    tid = typed.id() if typed is not None else 0
    type_name, type_ptype = _memo(
        rel,
        "type",
        tid,
        lambda: (
            ("", "") if typed is None else (typed.Name or "", _type_predefined(typed))
        ),
    )
    return WallSemantics(
        name=attr(wall, "Name") or "",
        type_name=type_name,
        materials=names,
        predefined_type=type_ptype or _own_predefined(wall),
        properties=props,
        layer_thickness=layers,
    )


def wall_semantics(
    wall: ifcopenshell.entity_instance,
    scale: float,
    relations: Relations | None = None,
) -> WallSemantics:
    """Name, type, materials, predefined type and properties of a wall.

    Common practice: occurrence property sets override those of the type
    (``ifcopenshell.util.element.get_psets``). LoadBearing is read, not trusted.

    Args:
        wall: The IfcWall.
        scale: Length unit scale [m per file unit].
        relations: The file's relationship maps; answers shared by the walls of one
            type, material or property set are then computed once.

    Returns:
        The wall's semantics.
    """
    if relations is not None:
        fast = _fast_semantics(wall, scale, relations)
        if fast is not None:
            return fast
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
