"""Slabs into diaphragms: kinds, openings, floor finishes, roofs, disconnected parts."""

from __future__ import annotations

import pytest

from ifc_bridge.model import IssueSeverity
from ifc_bridge.read_model import read_model
from tests.ifc_bridge._build import (
    add_opening,
    add_slab,
    add_storey,
    add_wall,
    box_building,
    new_model,
    run,
)


def test_slab_with_opening(schema, tmp_path):
    m = box_building(schema)
    roof = m.ifc.by_type("IfcSlab")[1]
    add_opening(m, roof, (2.0, 1.0, 2.9), angle=0.0, width=2.0, height=0.4, depth=1.5)
    model = read_model(m.write(tmp_path / "slab.ifc"))
    (d,) = model.diaphragms_of("Roof")
    assert d.area == pytest.approx(
        10.0 * 6.0 - 2.0 * 1.5, rel=1e-9
    )  # authoring input: 10x6 m less 2x1.5 m
    assert len(d.polygon.interiors) == 1
    assert d.kind == "ROOF"
    assert d.elevation == pytest.approx(3.0, abs=1e-6)


def test_thin_finish_slab_is_not_a_diaphragm(schema, tmp_path):
    m = box_building(schema, "mm")
    roof_storey = m.ifc.by_type("IfcBuildingStorey")[1]
    finish = add_slab(
        m,
        roof_storey,
        [(20, 0), (24, 0), (24, 4), (20, 4)],
        top=3.019,
        depth=0.019,
        name="Finish Floor - Wood",
    )  # 19 mm, as in the Duplex sample
    model = read_model(m.write(tmp_path / "finish.ifc"))
    assert [d.area for d in model.diaphragms_of("Roof")] == pytest.approx(
        [60.0]
    )  # authoring input
    (issue,) = [i for i in model.issues if i.code == "slab_finish_ignored"]
    assert issue.guids == (finish.GlobalId,)
    assert issue.severity is IssueSeverity.INFO


def test_disconnected_parts_become_separate_diaphragms(schema, tmp_path):
    m = box_building(schema)
    roof_storey = m.ifc.by_type("IfcBuildingStorey")[1]
    add_slab(
        m,
        roof_storey,
        [(20, 0), (24, 0), (24, 4), (20, 4)],
        top=3.0,
        predefined_type="FLOOR",
    )
    model = read_model(m.write(tmp_path / "wings.ifc"))
    pieces = model.diaphragms_of("Roof")
    assert [d.id for d in pieces] == ["Roof/D1", "Roof/D2"]
    assert [d.area for d in pieces] == pytest.approx(
        [60.0, 16.0]
    )  # authoring input, decreasing
    assert pieces[0].kind == "ROOF"
    assert pieces[1].kind == "FLOOR"


def test_slab_kind_from_its_type_and_roof_in_building(schema, tmp_path):
    m = new_model(schema)
    ground = add_storey(m, "Ground", 0.0)
    add_storey(m, "Upper", 3.0)
    add_wall(m, ground, (0, 0), (5, 0), base=0.0, height=3.0)
    typed = add_slab(
        m, ground, [(0, 0), (5, 0), (5, 5), (0, 5)], top=0.0, predefined_type=None
    )
    slab_type = run(
        "root.create_entity",
        m.ifc,
        ifc_class="IfcSlabType",
        name="Floor type",
        predefined_type="FLOOR",
    )
    run("type.assign_type", m.ifc, related_objects=[typed], relating_type=slab_type)
    roof = run("root.create_entity", m.ifc, ifc_class="IfcRoof", name="Roof")
    run(
        "spatial.assign_container",
        m.ifc,
        relating_structure=m.building,
        products=[roof],
    )
    part = add_slab(
        m,
        None,
        [(0, 0), (5, 0), (5, 5), (0, 5)],
        top=3.3,
        depth=0.25,
        predefined_type=None,
        name="Roof part",
    )
    run("aggregate.assign_object", m.ifc, relating_object=roof, products=[part])
    model = read_model(m.write(tmp_path / "roof.ifc"))
    assert [d.kind for d in model.diaphragms_of("Ground")] == [
        "FLOOR"
    ]  # from IfcSlabType
    (up,) = model.diaphragms_of(
        "Upper"
    )  # roof part, underside z = 3.05 m: storey below is Upper
    assert up.kind == "ROOF"
    assert up.slab_guids == (part.GlobalId,)
    assert any(
        i.code == "slab_not_in_storey" and part.GlobalId in i.guids
        for i in model.issues
    )


def test_storey_without_slab_is_no_diaphragm_level(schema, tmp_path):
    m = box_building(schema)
    add_storey(m, "Attic", 6.0)
    model = read_model(m.write(tmp_path / "attic.ifc"))
    assert model.level("Attic").is_diaphragm_level is False
    assert model.level("Roof").is_diaphragm_level is True
    assert any(
        i.code == "level_no_diaphragm" and i.storey == "Attic" for i in model.issues
    )
