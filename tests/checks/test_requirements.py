"""The IDS of the checker's needs: written, reloaded by ifctester, applied to models."""

from __future__ import annotations

from pathlib import Path

import pytest

from checks.cli import main
from checks.requirements import requirement_findings, write_requirements_ids
from tests.conftest import sample_path

DEMO = Path(__file__).resolve().parents[2] / "sample_models"


def test_ids_file_loads_with_ifctester_validation(
    tmp_path,
):  # buildingSMART IDS 1.0 XSD
    from ifctester import ids

    path = write_requirements_ids(tmp_path / "req.ids")
    doc = ids.open(str(path), validate=True)  # raises on an XSD-invalid file
    names = {s.name for s in doc.specifications}
    assert "Storeys have an elevation" in names
    assert "Shear walls are identified" in names


def test_cli_requirements_writes_the_file(tmp_path):
    out = tmp_path / "model.ids"
    assert main(["requirements", "-o", str(out)]) == 0
    assert out.read_text(encoding="utf-8").lstrip().startswith("<?xml")


def test_demo_model_meets_the_requirements():  # the demo carries SHEAR types, materials
    import ifcopenshell

    f = ifcopenshell.open(str(DEMO / "demo_building.ifc"))
    assert requirement_findings(f, source="demo") == []


def test_duplex_sample_has_no_shear_walls_identified():
    # buildingSMART Duplex Apartment sample (ifc_samples/README.md): no SHEAR walls
    import ifcopenshell

    f = ifcopenshell.open(str(sample_path("Duplex_A_20110907.ifc")))
    found = requirement_findings(f, source="Duplex")
    assert [x.clause.split()[-1] for x in found] == ["SL-05"]


def test_storey_without_elevation_is_named(tmp_path):
    import ifcopenshell
    import ifcopenshell.api

    f = ifcopenshell.api.run("project.create_file", version="IFC4")
    project = ifcopenshell.api.run("root.create_entity", f, ifc_class="IfcProject")
    storey = ifcopenshell.api.run(
        "root.create_entity", f, ifc_class="IfcBuildingStorey"
    )
    ifcopenshell.api.run(
        "aggregate.assign_object", f, relating_object=project, products=[storey]
    )
    found = {x.clause.split()[-1]: x for x in requirement_findings(f, source="tiny")}
    assert storey.GlobalId in found["SL-01"].guids


@pytest.mark.parametrize(
    "name",
    [
        "demo",
        "Duplex_A_20110907.ifc",  # IFC2X3: types through IsDefinedBy
        "IfcLCA_Revit2023_4x3.ifc",
        "TallBuilding.ifc",
        "PCERT_Building-Architecture_IFC4.ifc",
    ],
)
def test_memoised_type_and_material_lookups_equal_ifcopenshell(name):
    # reference: ifcopenshell.util.element.get_type / get_material, element by element
    import ifcopenshell.util.element as element

    from checks.requirements import _types_memoised
    from ifc_bridge.open_file import open_ifc

    path = DEMO / "demo_building.ifc" if name == "demo" else sample_path(name)
    ifc = open_ifc(path)
    items = [*ifc.by_type("IfcObject"), *ifc.by_type("IfcTypeObject")]
    plain_types = [element.get_type(e) for e in items]
    plain_materials = [element.get_material(e) for e in items]
    with _types_memoised(ifc):
        for _ in range(2):  # the second round answers from the memo
            assert [element.get_type(e) for e in items] == plain_types
            assert [element.get_material(e) for e in items] == plain_materials
    assert element.get_type.__module__ == "ifcopenshell.util.element"  # restored
