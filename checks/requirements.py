"""Model requirements as an IDS file, and the incoming model checked against them.

buildingSMART Information Delivery Specification (IDS 1.0), written and validated with
ifctester. The requirements are what the checker needs from the architect's model:
storeys with elevations, slabs with a floor/roof type, walls in a storey and with a
material, and shear walls identified. Each failed specification becomes one warning
finding naming the elements.
"""

from __future__ import annotations

import os
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path

from checks.errors import OutputError
from checks.findings import Finding, Severity

__all__ = ["build_requirements", "requirement_findings", "write_requirements_ids"]

_VERSIONS = ["IFC2X3", "IFC4", "IFC4X3_ADD2"]
_CLAUSE = "buildingSMART IDS 1.0 shearline model requirements"


def build_requirements():
    """The IDS document (an ``ifctester.ids.Ids``) of the checker's needs."""
    from ifctester import ids
    from ifctester.facet import Restriction

    walls = Restriction({"enumeration": ["IFCWALL", "IFCWALLSTANDARDCASE"]})
    doc = ids.Ids(
        title="shearline: what the lateral check needs from the model",
        author="shearline@example.com",
        version="1.0",
        description="Storeys with elevations, typed slabs, walls with storey and "
        "material, shear walls identified (PredefinedType SHEAR).",
        purpose="Seismic force allocation to shear walls",
    )

    def spec(identifier: str, name: str, description: str, **kw) -> ids.Specification:
        s = ids.Specification(
            name=name,
            ifcVersion=_VERSIONS,
            identifier=identifier,
            description=description,
            **kw,
        )
        doc.specifications.append(s)
        return s

    s = spec(
        "SL-01",
        "Storeys have an elevation",
        "Each IfcBuildingStorey gives its Elevation; levels are sorted by it.",
    )
    s.applicability.append(ids.Entity(name="IFCBUILDINGSTOREY"))
    s.requirements.append(ids.Attribute(name="Elevation", cardinality="required"))

    s = spec(
        "SL-02",
        "Slabs say whether they are floor, roof or base slab",
        "PredefinedType (on the slab or its type) FLOOR, ROOF, BASESLAB or LANDING.",
    )
    s.applicability.append(ids.Entity(name="IFCSLAB"))
    s.requirements.append(
        ids.Entity(
            name="IFCSLAB",
            predefinedType=Restriction(
                {"enumeration": ["FLOOR", "ROOF", "BASESLAB", "LANDING"]}
            ),
        )
    )

    s = spec(
        "SL-03",
        "Walls stand in a storey",
        "Each wall is contained in an IfcBuildingStorey.",
    )
    s.applicability.append(ids.Entity(name=walls))
    s.requirements.append(
        ids.PartOf(
            name="IFCBUILDINGSTOREY", relation="IFCRELCONTAINEDINSPATIALSTRUCTURE"
        )
    )

    s = spec(
        "SL-04",
        "Walls have a material",
        "A material (layer set) lets assemblies be matched and weights computed.",
    )
    s.applicability.append(ids.Entity(name=walls))
    s.requirements.append(ids.Material(cardinality="required"))

    s = spec(
        "SL-05",
        "Shear walls are identified",
        "At least one wall has PredefinedType SHEAR (on the wall or its type).",
        minOccurs=1,
        maxOccurs="unbounded",
    )
    s.applicability.append(ids.Entity(name="IFCWALL", predefinedType="SHEAR"))
    s.requirements.append(ids.Material(cardinality="required"))
    return doc


def write_requirements_ids(path: str | os.PathLike) -> Path:
    """Write the IDS XML file; returns its path.

    Raises:
        OutputError: The file cannot be written or does not validate against the
            IDS XSD.
    """
    path = Path(path)
    try:
        valid = build_requirements().to_xml(str(path))
    except OSError as exc:
        msg = f"{path}: cannot write the IDS file: {exc.strerror}"
        raise OutputError(msg) from exc
    if not valid:
        msg = f"{path}: the IDS written does not validate against the IDS 1.0 schema"
        raise OutputError(msg)
    return path


def _typed_once(ifc_file) -> dict[int, object]:
    """Entity id -> type of the elements that exactly one IfcRelDefinesByType types.

    ISO 16739 IfcRelDefinesByType: for such an element ``get_type`` returns that
    relationship's RelatingType (IFC4: ``IsTypedBy[0]``; IFC2X3: the one
    IfcRelDefinesByType in ``IsDefinedBy``); one pass over the relationships
    answers them all. An element typed twice (invalid) is left to ``get_type``.
    """
    found: dict[int, object] = {}
    twice: set[int] = set()
    for rel in ifc_file.by_type("IfcRelDefinesByType"):
        relating = rel.RelatingType
        for obj in rel.RelatedObjects or ():
            key = obj.id()
            if key in found:
                twice.add(key)
            found[key] = relating
    for key in twice:
        del found[key]
    return found


@contextmanager
def _types_memoised(ifc_file) -> Iterator[None]:
    """ifcopenshell's ``get_type`` and ``get_material`` memoised during a validation.

    ifctester asks for the type of each wall three times (predefined type, material,
    applicability) and for its material once per specification, and each answer
    walks the inverse index again; the file does not change during a validation, so
    each element's answer is looked up once (the types of singly typed elements all
    at once, :func:`_typed_once`). The originals are restored afterwards.
    """
    import ifcopenshell.util.element as element

    get_type, get_material = element.get_type, element.get_material
    types: dict[int, object] = _typed_once(ifc_file)
    materials: dict[tuple, object] = {}

    def memo_type(inst):  # same signature and result as the original
        key = inst.id()
        if not key:
            return get_type(inst)
        found = types.get(key, types)
        if found is types:
            found = types[key] = get_type(inst)
        return found

    def memo_material(element_, should_skip_usage=False, should_inherit=True):
        key = (element_.id(), should_skip_usage, should_inherit)
        if not key[0]:
            return get_material(element_, should_skip_usage, should_inherit)
        found = materials.get(key, materials)
        if found is materials:
            found = materials[key] = get_material(
                element_, should_skip_usage, should_inherit
            )
        return found

    element.get_type, element.get_material = memo_type, memo_material
    try:
        yield
    finally:
        element.get_type, element.get_material = get_type, get_material


def requirement_findings(ifc_file, *, source: str) -> list[Finding]:
    """Validate an open IFC file against the requirements; one finding per failure.

    Args:
        ifc_file: An open ``ifcopenshell.file``.
        source: Its path, for the messages.

    Returns:
        Warning findings, one per failed specification, naming the elements.
    """
    doc = build_requirements()
    with _types_memoised(ifc_file):
        doc.validate(ifc_file)
    out: list[Finding] = []
    for s in doc.specifications:
        if s.status is not False:
            continue
        # IfcRoot's first attribute is GlobalId (ISO 16739): read by position
        failed = sorted(
            {e.get_argument(0) for e in s.failed_entities if e.is_a("IfcRoot")}
        )
        reasons = sorted(
            {
                str(f.get("reason", ""))
                for r in s.requirements
                for f in getattr(r, "failures", [])
                if f.get("reason")
            }
        )
        what = f"{len(failed)} element(s) fail" if failed else "no applicable element"
        out.append(
            Finding(
                rule="model_requirements",
                clause=f"{_CLAUSE} {s.identifier}",
                severity=Severity.WARNING,
                level="",
                direction=None,
                guids=tuple(failed),
                title=f"Model requirement not met: {s.name}",
                description=(
                    f"{source}: {s.description} {what}"
                    + (f" ({'; '.join(reasons[:3])})" if reasons else "")
                    + ". Ask the model author to add it; shearline falls back to geometry "
                    "and the config where it can."
                ),
                discriminator=s.identifier or s.name,
            )
        )
    return out
