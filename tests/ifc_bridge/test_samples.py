"""Every open IFC sample reads, and agrees with ifcopenshell's own counts and geometry.

Samples and their quirks: ../shared/ifc_samples/README.md ("README.md" below).
Each file is read once per module. Areas are checked against
``ifcopenshell.util.shape.get_footprint_area`` on the triangulated shape from
``ifcopenshell.geom`` (openings subtracted), within 1 %.
"""

from __future__ import annotations

import ifcopenshell
import ifcopenshell.geom
import ifcopenshell.util.element
import ifcopenshell.util.placement
import ifcopenshell.util.shape
import numpy as np
import pytest

from ifc_bridge._direct import axis2placement
from ifc_bridge._semantics import wall_semantics
from ifc_bridge.open_file import open_ifc
from ifc_bridge.read_model import read_model
from tests.conftest import sample_path

SAMPLES = [
    "Duplex_A_20110907.ifc",  # buildingSMART Duplex Apartment sample, README.md
    "TallBuilding.ifc",  # BIM Whale 'Tall Building' sample, ifc_samples/README.md
    "PCERT_Building-Architecture_IFC4.ifc",  # buildingSMART PCERT sample, README.md
    "vectorworks_unicode.ifc",  # opensourceBIM Vectorworks 2013 test file, README.md
    "IfcLCA_Revit2023_4x3.ifc",  # IfcLCA Revit 2023 IFC4X3 export, README.md
    "Revit2014_Wall_Attach_Top_Roof_feet.ifc",  # OpeningDesign Revit 2014 feet, README
]


@pytest.fixture(scope="module", params=SAMPLES)
def sample(request: pytest.FixtureRequest):
    path = sample_path(request.param)
    return request.param, open_ifc(path), read_model(path)


def test_counts_match_ifcopenshell(sample):
    _, ifc, model = sample
    assert len(model.levels) == len(
        ifc.by_type("IfcBuildingStorey")
    )  # ifcopenshell by_type
    assert model.ifc_wall_count == len(
        ifc.by_type("IfcWall")
    )  # ifcopenshell by_type, subtypes incl.
    assert len(model.wall_storeys) == model.ifc_wall_count
    assert {g for g, _ in model.wall_storeys} == {
        w.GlobalId for w in ifc.by_type("IfcWall")
    }
    assert all(w.length > 0 and w.thickness > 0 for w in model.walls)


def test_diaphragm_areas_match_ifcopenshell_geometry(sample):
    _, ifc, model = sample
    settings = ifcopenshell.geom.settings()
    settings.set("use-world-coords", True)
    for d in model.diaphragms:
        areas = []
        for guid in d.slab_guids:
            shape = ifcopenshell.geom.create_shape(settings, ifc.by_guid(guid))
            areas.append(ifcopenshell.util.shape.get_footprint_area(shape.geometry))
        if len(areas) == 1:  # ifcopenshell's own footprint, 1 % tolerance
            assert d.area == pytest.approx(areas[0], rel=0.01), d.id
        else:  # a union of slabs is no larger than the sum of their footprints
            assert max(areas) * 0.99 <= d.area <= sum(areas) * 1.01, d.id


def test_duplex_floor_finishes_are_ignored():
    model = read_model(sample_path(SAMPLES[0]))
    finishes = [i for i in model.issues if i.code == "slab_finish_ignored"]
    assert (
        len(finishes) == 14
    )  # 14 of 20 FLOOR slabs are 13/19 mm finishes, ifc_samples/README.md
    assert [lv.name for lv in model.levels] == [
        "T/FDN",
        "Level 1",
        "Level 2",
        "Roof",
    ]  # README.md
    assert (
        sum(len(w.openings) for w in model.walls) == 36
    )  # 36 openings hosted by walls, README.md


def test_feet_sample_elevation_and_split():
    model = read_model(sample_path(SAMPLES[5]))
    assert model.length_unit_scale == pytest.approx(
        0.3048
    )  # FOOT, ifc_samples/README.md
    assert model.level("Level 2").elevation == pytest.approx(
        3.048, abs=1e-6
    )  # 10 ft, README.md
    low, high = model.walls  # the wall runs through Level 2, README.md
    assert (low.part, high.part) == (0, 1)
    assert low.top_elevation == pytest.approx(3.048, abs=1e-6)
    assert high.top_elevation == pytest.approx(5.16, abs=0.01)  # 5.16 m tall, README.md
    assert low.level == "Level 2"


def test_ifc4x3_header_opens():
    model = read_model(sample_path(SAMPLES[4]))
    assert model.schema == "IFC4X3"  # header 'IFC4X3' read as IFC4X3_ADD2, README.md
    assert (
        model.level("U1.UG_RDOK").elevation == -3.5
    )  # -3.4999999999999996 in the file, README.md
    assert not model.diaphragms  # no slabs, README.md


def test_pcert_roof_in_building_goes_to_the_only_storey():
    model = read_model(sample_path(SAMPLES[2]))
    assert [lv.elevation for lv in model.levels] == [
        0.0
    ]  # -1.8e-12 mm noise, README.md
    assert (
        sum(i.code == "slab_not_in_storey" for i in model.issues) == 2
    )  # 2 roof slabs, README.md


def test_vectorworks_doors_without_openings_are_reported():
    model = read_model(sample_path(SAMPLES[3]))
    hits = [i for i in model.issues if i.code == "insert_without_opening"]
    assert len(hits) == 2  # 1 door + 1 window with no IfcRelFillsElement, README.md
    assert all(len(i.guids) == 2 for i in hits)  # each matched to the wall it sits in
    assert model.ifc_wall_count == 8  # 8 IfcWallStandardCase, README.md


def test_fast_placement_matrix_matches_ifcopenshell(sample):
    _, ifc, _ = sample
    for cls in ("IfcAxis2Placement3D", "IfcAxis2Placement2D"):
        for placement in ifc.by_type(cls):
            ours = axis2placement(placement)
            ref = ifcopenshell.util.placement.get_axis2placement(
                placement
            )  # reference library
            assert np.abs(ours - ref).max() < 1e-12


def test_semantics_match_ifcopenshell_util_element(sample):
    _, ifc, _ = sample
    for wall in ifc.by_type("IfcWall"):
        sem = wall_semantics(wall, 1.0)
        ref = [m.Name for m in ifcopenshell.util.element.get_materials(wall) if m.Name]
        assert sem.materials == tuple(ref)  # ifcopenshell.util.element.get_materials
        ref_type = ifcopenshell.util.element.get_type(wall)
        assert sem.type_name == ((ref_type.Name or "") if ref_type else "")
        if "PredefinedType" in wall.get_attribute_names():  # IFC4+: same rule
            expected = ifcopenshell.util.element.get_predefined_type(wall) or ""
            assert sem.predefined_type == expected
