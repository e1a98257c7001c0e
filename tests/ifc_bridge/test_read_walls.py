"""Walls into segments: centreline, thickness, openings, splits, semantics."""

from __future__ import annotations

import pytest

from ifc_bridge.model import IssueSeverity
from ifc_bridge.read_model import read_model
from ifc_bridge.shear_walls import MatchRule
from tests.ifc_bridge._build import (
    add_opening,
    add_slab,
    add_storey,
    add_wall,
    box_building,
    new_model,
    run,
)


def test_box_walls_length_thickness_centreline(schema, tmp_path):
    model = read_model(box_building(schema, thickness=0.2).write(tmp_path / "box.ifc"))
    walls = {w.name: w for w in model.walls}
    assert [walls[n].length for n in ("W1", "W2", "W3", "W4")] == pytest.approx(
        [10, 6, 10, 6]
    )  # authoring input
    assert all(
        w.thickness == pytest.approx(0.2) for w in walls.values()
    )  # authoring input
    # reference line on a face: the centreline is t/2 = 0.1 m off it # common practice
    assert walls["W1"].start == pytest.approx((0.0, 0.1))
    assert walls["W1"].end == pytest.approx((10.0, 0.1))
    assert all(w.storey == "Ground" and w.level == "Roof" for w in walls.values())
    assert all(
        w.top_elevation == pytest.approx(2.8) for w in walls.values()
    )  # authoring input


def test_door_opening_and_opening_at_wall_end(schema, tmp_path):
    m = new_model(schema)
    ground = add_storey(m, "Ground", 0.0)
    add_storey(m, "Roof", 3.0)
    wall = add_wall(m, ground, (0, 0), (6, 0), base=0.0, height=3.0, thickness=0.2)
    door = add_opening(
        m,
        wall,
        (2.0, -0.1, 0.0),
        angle=0.0,
        width=0.9,
        height=2.1,
        depth=0.4,
        fill="IfcDoor",
    )
    end = add_opening(
        m, wall, (5.5, -0.1, 1.0), angle=0.0, width=1.0, height=1.2, depth=0.4
    )
    model = read_model(m.write(tmp_path / "door.ifc"))
    (seg,) = model.walls
    first, second = seg.openings
    assert first.guid == door.GlobalId
    assert (first.start, first.end, first.bottom, first.top) == pytest.approx(
        (2.0, 2.9, 0.0, 2.1)
    )  # authoring input
    assert first.filled_by == (m.ifc.by_type("IfcDoor")[0].GlobalId,)
    assert second.guid == end.GlobalId
    assert (second.start, second.end, second.bottom, second.top) == pytest.approx(
        (5.5, 6.0, 1.0, 2.2)
    )  # clipped at 6 m


def test_wall_through_two_storeys_is_split(schema, tmp_path):
    m = new_model(schema)
    ground, mid, roof = (
        add_storey(m, n, z) for n, z in (("Ground", 0.0), ("Mid", 3.0), ("Roof", 6.0))
    )
    outline = [(-1, -1), (9, -1), (9, 4), (-1, 4)]
    add_slab(m, mid, outline, top=3.0)
    add_slab(m, roof, outline, top=6.0, predefined_type="ROOF")
    wall = add_wall(m, ground, (0, 0), (8, 0), base=0.0, height=5.8)
    add_opening(m, wall, (1.0, -0.1, 2.0), angle=0.0, width=1.0, height=2.0, depth=0.4)
    model = read_model(m.write(tmp_path / "tall.ifc"))
    low, high = model.walls
    assert (low.part, low.storey, low.level) == (0, "Ground", "Mid")
    assert (high.part, high.storey, high.level) == (1, "Mid", "Roof")
    assert (low.base_elevation, low.top_elevation) == pytest.approx(
        (0.0, 3.0)
    )  # split at Mid, authoring input
    assert (high.base_elevation, high.top_elevation) == pytest.approx((3.0, 5.8))
    assert (low.openings[0].bottom, low.openings[0].top) == pytest.approx(
        (2.0, 3.0)
    )  # re-based, clipped
    assert (high.openings[0].bottom, high.openings[0].top) == pytest.approx((0.0, 1.0))
    assert model.wall_storeys == ((wall.GlobalId, "Ground"),)


def test_semantics_type_predefined_material_psets(schema, tmp_path):
    m = box_building(schema)
    w1 = m.ifc.by_type("IfcWall")[0]
    wall_type = run(
        "root.create_entity",
        m.ifc,
        ifc_class="IfcWallType",
        name="Shear 6in",
        predefined_type="SHEAR",
    )
    run("type.assign_type", m.ifc, related_objects=[w1], relating_type=wall_type)
    osb = run("material.add_material", m.ifc, name="OSB")
    run(
        "material.assign_material",
        m.ifc,
        products=[w1],
        type="IfcMaterial",
        material=osb,
    )
    pset = run("pset.add_pset", m.ifc, product=w1, name="Pset_WallCommon")
    run("pset.edit_pset", m.ifc, pset=pset, properties={"LoadBearing": False})
    rule = MatchRule(assembly="WSP", material="osb")
    model = read_model(m.write(tmp_path / "sem.ifc"), rules=[rule])
    walls = {w.name: w for w in model.walls}
    assert walls["W1"].type_name == "Shear 6in"
    assert (
        walls["W1"].predefined_type == "SHEAR"
    )  # from IfcWallType, get_predefined_type
    assert walls["W1"].materials == ("OSB",)
    assert walls["W1"].property_value("Pset_WallCommon.LoadBearing") == "False"
    assert (walls["W1"].is_shear_wall, walls["W1"].assembly) == (True, "WSP")
    assert walls["W2"].is_shear_wall is False
    expected = (
        "" if schema == "IFC2X3" else walls["W2"].predefined_type
    )  # IFC2X3 IfcWall: no attribute
    assert walls["W2"].predefined_type == expected
    assert walls["W2"].predefined_type in ("", "NOTDEFINED")


def test_georeferenced_coordinates_keep_lengths(schema, tmp_path):
    m = new_model(schema, "mm")
    ground = add_storey(m, "Ground", 0.0)
    add_storey(m, "Roof", 3.0)
    x0, y0 = (
        2_500_000.0,
        1_200_000.0,
    )  # 1e6 m from the origin, like a projected CRS # common practice
    add_wall(
        m, ground, (x0, y0), (x0 + 7.3, y0 + 4.1), base=0.0, height=2.9, thickness=0.14
    )
    (seg,) = read_model(m.write(tmp_path / "geo.ifc")).walls
    assert seg.length == pytest.approx(
        (7.3**2 + 4.1**2) ** 0.5, abs=1e-6
    )  # authoring input
    assert seg.thickness == pytest.approx(0.14, abs=1e-6)


def test_wall_without_geometry_is_reported_not_dropped(schema, tmp_path):
    m = box_building(schema)
    ghost = run("root.create_entity", m.ifc, ifc_class="IfcWall", name="Ghost")
    run(
        "spatial.assign_container",
        m.ifc,
        relating_structure=m.ifc.by_type("IfcBuildingStorey")[0],
        products=[ghost],
    )
    model = read_model(m.write(tmp_path / "ghost.ifc"))
    assert model.ifc_wall_count == 5
    assert len(model.walls) == 4
    assert (ghost.GlobalId, "Ground") in model.wall_storeys
    (issue,) = [i for i in model.issues if i.code == "wall_no_geometry"]
    assert issue.severity is IssueSeverity.ERROR
    assert ghost.GlobalId in issue.message


def test_turning_axis_is_a_curved_wall(schema, tmp_path):
    m = new_model(schema)
    ground = add_storey(m, "Ground", 0.0)
    wall = add_wall(m, ground, (0, 0), (4, 0), base=0.0, height=3.0)
    axis = next(
        r
        for r in wall.Representation.Representations
        if r.RepresentationIdentifier == "Axis"
    )
    pts = [
        m.ifc.createIfcCartesianPoint(p) for p in ((0.0, 0.0), (2.0, 0.3), (4.0, 0.0))
    ]
    axis.Items = [m.ifc.createIfcPolyline(pts)]
    model = read_model(m.write(tmp_path / "curved.ifc"))
    (seg,) = model.walls
    assert seg.curved is True
    assert any(
        i.code == "wall_curved" and i.severity is IssueSeverity.WARNING
        for i in model.issues
    )
