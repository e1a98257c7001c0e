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


@contextmanager
def _types_memoised() -> Iterator[None]:
    """``ifcopenshell.util.element.get_type`` memoised while one file is validated.

    ifctester asks for the type of each wall three times (predefined type, material,
    applicability), and each answer walks the inverse index again; the file does not
    change during a validation, so each element's type is looked up once. The
    original function is restored afterwards.
    """
    import ifcopenshell.util.element as element

    original = element.get_type
    memo: dict[int, object] = {}

    def get_type(inst):  # same signature and result as the original
        key = inst.id()
        if not key:
            return original(inst)
        found = memo.get(key, memo)
        if found is memo:
            found = memo[key] = original(inst)
        return found

    element.get_type = get_type
    try:
        yield
    finally:
        element.get_type = original


def requirement_findings(ifc_file, *, source: str) -> list[Finding]:
    """Validate an open IFC file against the requirements; one finding per failure.

    Args:
        ifc_file: An open ``ifcopenshell.file``.
        source: Its path, for the messages.

    Returns:
        Warning findings, one per failed specification, naming the elements.
    """
    doc = build_requirements()
    with _types_memoised():
        doc.validate(ifc_file)
    out: list[Finding] = []
    for s in doc.specifications:
        if s.status is not False:
            continue
        failed = sorted(
            {e.GlobalId for e in s.failed_entities if hasattr(e, "GlobalId")}
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
