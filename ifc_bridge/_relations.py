"""Relationship maps of one IFC file, built once per read, and fast attribute access.

ifcopenshell's ``entity.Name`` costs ~10-20 us (name lookup in Python) and every
inverse attribute (``ContainedInStructure``, ``IsTypedBy``, ``HasAssociations``,
``IsDefinedBy``, ``HasOpenings``) walks the file's inverse index; a reader doing that
for each of 10 000 walls spends seconds in it. Here each objectified relationship class
is read once with ``by_type`` into maps keyed by entity id, and attributes are read by
position (:func:`attr`). An element related more than once in the same way (an invalid
but real-world case whose answer depends on inverse order) is flagged so the readers
fall back to ifcopenshell's own utilities for it, which keeps results identical.
"""

from __future__ import annotations

from collections import defaultdict
from dataclasses import dataclass, field
from typing import Any

import ifcopenshell
import ifcopenshell.util.element

__all__ = [
    "OpeningMaps",
    "Relations",
    "attr",
    "axis_and_body",
    "build_relations",
    "opening_maps",
]

_ABSENT = 0xFFFFFFFF  # get_argument_index of an attribute the entity does not have

Entity = ifcopenshell.entity_instance


def attr(inst: Entity, name: str, *default: Any) -> Any:
    """Forward attribute ``name`` of an entity, read by its position in the schema.

    Common practice: equal to ``getattr(inst, name)`` (IFC attributes are ordered,
    ISO 10303-11), without ifcopenshell's per-call name lookup. An attribute the entity
    does not have as a forward attribute (inverse, derived, absent) is read with
    ``getattr`` and raises AttributeError like it.

    Args:
        inst: An IFC entity instance.
        name: Attribute name.
        *default: Value for an absent attribute, as ``getattr``'s third argument.

    Returns:
        The attribute value, as ``getattr`` would return it.
    """
    # ifcopenshell's own index look-up (0.22 us) is cheaper than the type name and a
    # cache keyed by it (0.36 us, measured)
    index = inst.get_argument_index(name)
    if index == _ABSENT:
        return getattr(inst, name, *default)
    return inst.get_argument(index)


def axis_and_body(inst: Entity) -> tuple[Entity | None, Entity | None]:
    """An element's first 'Axis' and its only 'Body' shape representation.

    Common practice: IfcProductDefinitionShape.Representations, identified by
    RepresentationIdentifier (IFC 4.3 §8.18.3.10); one walk finds both.

    Args:
        inst: An IfcProduct.

    Returns:
        ``(axis, body)``; body None when there is no 'Body' or more than one.
    """
    shape = attr(inst, "Representation")
    axis = body = None
    bodies = 0
    for rep in attr(shape, "Representations") if shape else ():
        ident = attr(rep, "RepresentationIdentifier") or ""
        if ident == "Axis" and axis is None:
            axis = rep
        elif ident == "Body":
            body, bodies = rep, bodies + 1
    return axis, body if bodies == 1 else None


@dataclass(frozen=True, slots=True, kw_only=True)
class Relations:
    """Who relates to whom, by entity id, with the answers memoised per shared object.

    Attributes:
        containers: Element id -> RelatingStructure of each IfcRelContainedInSpatialStructure.
        types: Object id -> RelatingType of each IfcRelDefinesByType.
        materials: Element id -> RelatingMaterial of each IfcRelAssociatesMaterial.
        definitions: Object id -> property definitions of its IfcRelDefinesByProperties.
        voids: Host id -> RelatedOpeningElement of each IfcRelVoidsElement.
        fills: Opening id -> RelatedBuildingElement of each IfcRelFillsElement.
        memo: Results shared by many elements (per storey, type, material, pset).
    """

    containers: dict[int, list[Entity]]
    types: dict[int, list[Entity]]
    materials: dict[int, list[Entity]]
    definitions: dict[int, list[Entity]]
    voids: dict[int, list[Entity]]
    fills: dict[int, list[Entity]]
    memo: dict[tuple[str, int], Any] = field(default_factory=dict)

    def storey_of(self, element: Entity) -> Entity | None:
        """The IfcBuildingStorey containing an element, as ``get_container`` finds it.

        Common practice: ``ifcopenshell.util.element.get_container(element,
        ifc_class="IfcBuildingStorey")``: the spatial container, walked up through its
        aggregates to the storey.
        """
        found = self.containers.get(element.id(), ())
        if len(found) != 1:  # none (maybe a part of an assembly) or ambiguous
            return ifcopenshell.util.element.get_container(
                element, ifc_class="IfcBuildingStorey"
            )
        structure = found[0]
        key = ("storey", structure.id())
        if key not in self.memo:
            container = structure
            while container is not None and not container.is_a("IfcBuildingStorey"):
                container = ifcopenshell.util.element.get_aggregate(container)
            self.memo[key] = container
        return self.memo[key]

    def type_of(self, element: Entity) -> Entity | bool | None:
        """The element's IfcTypeObject, None when untyped, False when typed twice."""
        found = self.types.get(element.id(), ())
        if len(found) > 1:
            return False
        return found[0] if found else None

    def openings_of(self, host: Entity) -> tuple[Entity, ...]:
        """Openings voiding a host, in the order of its ``HasOpenings`` inverse."""
        found = self.voids.get(host.id(), ())
        if len(found) <= 1:
            return tuple(found)
        return tuple(rel.RelatedOpeningElement for rel in host.HasOpenings or ())


def _append(out: dict[int, list[Entity]], related: Any, value: Entity) -> None:
    if related is None:
        return
    for element in related if isinstance(related, tuple) else (related,):
        if element is not None:
            out[element.id()].append(value)


@dataclass(frozen=True, slots=True, kw_only=True)
class OpeningMaps:
    """The two relationship maps of openings, read before the others.

    Attributes:
        voids: Host id -> RelatedOpeningElement of each IfcRelVoidsElement.
        fills: Opening id -> RelatedBuildingElement of each IfcRelFillsElement.
    """

    voids: dict[int, list[Entity]]
    fills: dict[int, list[Entity]]


def opening_maps(ifc: ifcopenshell.file) -> OpeningMaps:
    """IfcRelVoidsElement and IfcRelFillsElement (IFC 4.3 §5.4.3) by entity id.

    Common practice: as :func:`build_relations` reads them; few entities, so the
    geometry pass (which meshes the openings) can start before the rest is read.

    Args:
        ifc: The open file.

    Returns:
        The two maps.
    """
    voids: dict[int, list[Entity]] = defaultdict(list)
    fills: dict[int, list[Entity]] = defaultdict(list)
    for rel in ifc.by_type("IfcRelVoidsElement"):
        _append(
            voids,
            attr(rel, "RelatingBuildingElement"),
            attr(rel, "RelatedOpeningElement"),
        )
    for rel in ifc.by_type("IfcRelFillsElement"):
        _append(
            fills,
            attr(rel, "RelatingOpeningElement"),
            attr(rel, "RelatedBuildingElement"),
        )
    return OpeningMaps(voids=dict(voids), fills=dict(fills))


def build_relations(
    ifc: ifcopenshell.file, openings: OpeningMaps | None = None
) -> Relations:
    """Read the objectified relationships of a file into maps by entity id.

    Common practice: IfcRelContainedInSpatialStructure, IfcRelDefinesByType,
    IfcRelAssociatesMaterial, IfcRelDefinesByProperties, IfcRelVoidsElement,
    IfcRelFillsElement (IFC 4.3 §5.1.2, §5.4.3) are the inverse attributes the
    readers use.

    Args:
        ifc: The open file.
        openings: The file's :func:`opening_maps`, when already read.

    Returns:
        The maps.
    """
    if openings is None:
        openings = opening_maps(ifc)
    maps: dict[str, dict[int, list[Entity]]] = {
        k: defaultdict(list) for k in ("c", "t", "m", "d")
    }
    for rel in ifc.by_type("IfcRelContainedInSpatialStructure"):
        _append(maps["c"], attr(rel, "RelatedElements"), attr(rel, "RelatingStructure"))
    for rel in ifc.by_type("IfcRelDefinesByType"):
        _append(maps["t"], attr(rel, "RelatedObjects"), attr(rel, "RelatingType"))
    for rel in ifc.by_type("IfcRelAssociatesMaterial"):
        _append(maps["m"], attr(rel, "RelatedObjects"), attr(rel, "RelatingMaterial"))
    for rel in ifc.by_type("IfcRelDefinesByProperties"):
        _append(
            maps["d"],
            attr(rel, "RelatedObjects"),
            attr(rel, "RelatingPropertyDefinition"),
        )
    return Relations(
        containers=dict(maps["c"]),
        types=dict(maps["t"]),
        materials=dict(maps["m"]),
        definitions=dict(maps["d"]),
        voids=openings.voids,
        fills=openings.fills,
    )
