"""Plain extruded wall bodies read without the kernel equal the kernel's meshes.

Reference: ifcopenshell's geometry kernel (manifold, then opencascade), an independent
general-purpose library, on the demo and the open sample models of
``../shared/ifc_samples``; and IFC 4.3 §8.8.3.15 (IfcExtrudedAreaSolid) for the
synthetic cases.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import shapely

import ifc_bridge._geometry as geometry
from ifc_bridge._direct import placement_matrix
from ifc_bridge._plain_body import plain_body, plain_item
from ifc_bridge._relations import attr
from ifc_bridge.open_file import open_ifc
from ifc_bridge.read_model import read_model
from ifc_bridge.units import length_unit_scale
from tests.conftest import SAMPLE_MODELS, sample_path
from tests.ifc_bridge._build import add_storey, add_wall, new_model

DEMO = SAMPLE_MODELS / "demo_building.ifc"

# sample -> walls read directly; the others have Clipping, Tessellation, SurfaceModel
# or curved bodies, which the kernel meshes (ifc_samples/README.md describes each)
PLAIN_COUNTS = {
    "demo": (41, 41),
    "Duplex_A_20110907.ifc": (57, 52),
    "IfcLCA_Revit2023_4x3.ifc": (3, 3),
    "TallBuilding.ifc": (24, 0),  # 'Clipping' bodies (IfcBooleanClippingResult)
    "PCERT_Building-Architecture_IFC4.ifc": (4, 0),  # IfcTriangulatedFaceSet
    "vectorworks_unicode.ifc": (8, 0),  # IfcShellBasedSurfaceModel
    "Revit2014_Wall_Attach_Top_Roof_feet.ifc": (1, 0),  # clipped under the roof
}


def _path(name: str):
    return DEMO if name == "demo" else sample_path(name)


def _hull_gap(a: np.ndarray, b: np.ndarray) -> float:
    ha = shapely.convex_hull(shapely.multipoints(a))
    hb = shapely.convex_hull(shapely.multipoints(b))
    return float(shapely.hausdorff_distance(ha, hb))


@pytest.mark.parametrize("name", sorted(PLAIN_COUNTS))
def test_direct_bodies_equal_the_kernel_meshes(name: str) -> None:
    ifc = open_ifc(_path(name))
    scale = length_unit_scale(ifc, name)
    walls = ifc.by_type("IfcWall")
    plain = {w.id(): item for w in walls if (item := plain_item(w)) is not None}
    assert (len(walls), len(plain)) == PLAIN_COUNTS[name]
    meshes = geometry.mesh_elements(ifc, [w for w in walls if w.id() in plain])
    cache: dict = {}
    for wall in walls:
        if wall.id() not in plain:
            continue
        m = placement_matrix(attr(wall, "ObjectPlacement"), cache)
        body = plain_body(plain[wall.id()], m, scale)
        mesh = meshes[wall.id()]
        assert body is not None, wall.GlobalId
        pts, base, top = body
        # same plan outline and z-range as the kernel's vertices, to 1e-9 m
        assert _hull_gap(pts, mesh.verts[:, :2]) < 1e-9, wall.GlobalId
        assert base == pytest.approx(mesh.zmin, abs=1e-9)
        assert top == pytest.approx(mesh.zmax, abs=1e-9)


def _one_wall(tmp_path, *, unit: str = "m", tilt: float = 0.0):
    m = new_model(unit=unit)
    storey = add_storey(m, "Level 1", 0.0)
    wall = add_wall(m, storey, (1.0, 2.0), (6.0, 2.0), base=0.0, height=3.0)
    if tilt:
        solid = next(
            i
            for r in wall.Representation.Representations
            if r.RepresentationIdentifier == "Body"
            for i in r.Items
        )
        solid.ExtrudedDirection.DirectionRatios = (math.sin(tilt), 0.0, math.cos(tilt))
    return m, wall


@pytest.mark.parametrize("unit", ["m", "mm", "ft"])
def test_a_box_wall_reads_its_corners_in_metres(tmp_path, unit: str) -> None:
    # 5 m x 0.2 m x 3 m box from (1, 2): IFC 4.3 §8.8.3.15 sweep of the profile
    m, wall = _one_wall(tmp_path, unit=unit)
    item = plain_item(wall)
    assert item is not None
    body = plain_body(item, placement_matrix(wall.ObjectPlacement, {}), m.scale)
    assert body is not None
    pts, base, top = body
    assert (pts.min(axis=0), pts.max(axis=0)) == (
        pytest.approx((1.0, 2.0), abs=1e-9),
        pytest.approx((6.0, 2.2), abs=1e-9),
    )
    assert (base, top) == (pytest.approx(0.0, abs=1e-9), pytest.approx(3.0, abs=1e-9))


def test_an_out_of_plumb_sweep_is_left_to_the_kernel(tmp_path) -> None:
    # 2 degrees off the vertical: not a prism on plan; the kernel's mesh is used
    m, wall = _one_wall(tmp_path, tilt=math.radians(2.0))
    item = plain_item(wall)
    assert item is not None  # looks plain by its classes ...
    assert plain_body(item, placement_matrix(wall.ObjectPlacement, {}), 1.0) is None
    model = read_model(m.write(tmp_path / "tilted.ifc"))
    (segment,) = model.walls
    mesh = geometry.mesh_elements(m.ifc, [wall])[wall.id()]
    # ... and is read from the kernel's mesh: its top leans 3 m * tan(2 deg) over
    assert segment.top_elevation == pytest.approx(mesh.zmax, abs=1e-9)
    assert segment.end[0] - segment.start[0] == pytest.approx(
        mesh.verts[:, 0].max() - mesh.verts[:, 0].min(), abs=1e-6
    )


@pytest.mark.parametrize("name", ["demo", "Duplex_A_20110907.ifc"])
def test_reading_with_direct_bodies_equals_reading_every_wall_meshed(
    name: str, monkeypatch
) -> None:
    path = _path(name)
    direct = read_model(path)
    import ifc_bridge._shape_pass as shape_pass

    monkeypatch.setattr(shape_pass, "plain_solid", lambda body: None)  # all meshed
    meshed = read_model(path)
    assert len(direct.walls) == len(meshed.walls)
    for a, b in zip(direct.walls, meshed.walls, strict=True):
        assert a.guid == b.guid
        assert a.start == pytest.approx(b.start, abs=1e-9)
        assert a.end == pytest.approx(b.end, abs=1e-9)
        assert a.thickness == pytest.approx(b.thickness, abs=1e-9)
        assert (a.base_elevation, a.top_elevation) == pytest.approx(
            (b.base_elevation, b.top_elevation), abs=1e-9
        )
        assert [(o.guid, o.filled_by) for o in a.openings] == [
            (o.guid, o.filled_by) for o in b.openings
        ]
        for oa, ob in zip(a.openings, b.openings, strict=True):
            assert (oa.start, oa.end, oa.bottom, oa.top) == pytest.approx(
                (ob.start, ob.end, ob.bottom, ob.top), abs=1e-9
            )
