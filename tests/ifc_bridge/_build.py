"""Tiny IFC models built in memory with ifcopenshell.api, for the reader's tests.

Every input is in SI metres (the api helpers convert to the file's unit); a wall is
placed at its start point, rotated to its end point, with its reference line on one
face (``add_wall_representation`` draws the profile from y = 0 to y = thickness).
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path

import ifcopenshell
import ifcopenshell.api
import ifcopenshell.api.owner.settings
import ifcopenshell.api.project
import numpy as np

UNITS = {
    "m": (None, 1.0),
    "mm": ("MILLI", 0.001),
    "ft": ("foot", 0.3048),
    "in": ("inch", 0.0254),
}


@dataclass
class Model:
    """A file being built and what the helpers need."""

    ifc: ifcopenshell.file
    body: ifcopenshell.entity_instance
    axis: ifcopenshell.entity_instance
    building: ifcopenshell.entity_instance
    scale: float

    def write(self, path: Path) -> Path:
        """Write the file and return its path."""
        self.ifc.write(str(path))
        return path


def run(usecase: str, ifc: ifcopenshell.file, **kw: object) -> object:
    """Call an ifcopenshell.api use case."""
    return ifcopenshell.api.run(usecase, ifc, **kw)


def _first(ifc_class: str) -> object:
    def get(ifc: ifcopenshell.file) -> ifcopenshell.entity_instance | None:
        found = ifc.by_type(ifc_class)
        return found[0] if found else None

    return get


def new_model(schema: str = "IFC4", unit: str = "m") -> Model:
    """Project, site and building in ``schema`` with the length ``unit``."""
    ifc = ifcopenshell.api.project.create_file(version=schema)
    if (
        schema == "IFC2X3"
    ):  # IFC2X3 requires OwnerHistory (ifcopenshell test/bootstrap.py does the same)
        org = ifc.createIfcOrganization(Name="shearline tests")
        ifc.createIfcPersonAndOrganization(ifc.createIfcPerson(), org)
        ifc.createIfcApplication(org, "1", "shearline tests", "shearline-tests")
        ifcopenshell.api.owner.settings.get_user = _first("IfcPersonAndOrganization")
        ifcopenshell.api.owner.settings.get_application = _first("IfcApplication")
    project = run(
        "root.create_entity", ifc, ifc_class="IfcProject", name="Test project"
    )
    prefix, scale = UNITS[unit]
    if unit in ("ft", "in"):
        length = run("unit.add_conversion_based_unit", ifc, name=prefix)
    else:
        length = run("unit.add_si_unit", ifc, unit_type="LENGTHUNIT", prefix=prefix)
    run("unit.assign_unit", ifc, units=[length])
    model_ctx = run("context.add_context", ifc, context_type="Model")
    body = run(
        "context.add_context",
        ifc,
        context_type="Model",
        context_identifier="Body",
        target_view="MODEL_VIEW",
        parent=model_ctx,
    )
    axis = run(
        "context.add_context",
        ifc,
        context_type="Plan",
        context_identifier="Axis",
        target_view="GRAPH_VIEW",
        parent=model_ctx,
    )
    site = run("root.create_entity", ifc, ifc_class="IfcSite", name="Site")
    building = run("root.create_entity", ifc, ifc_class="IfcBuilding", name="Building")
    run("aggregate.assign_object", ifc, relating_object=project, products=[site])
    run("aggregate.assign_object", ifc, relating_object=site, products=[building])
    return Model(ifc=ifc, body=body, axis=axis, building=building, scale=scale)


def _place(
    m: Model,
    product: ifcopenshell.entity_instance,
    origin: Sequence[float],
    angle: float = 0.0,
) -> None:
    c, s = math.cos(angle), math.sin(angle)
    matrix = np.array(
        [
            [c, -s, 0, origin[0]],
            [s, c, 0, origin[1]],
            [0, 0, 1, origin[2]],
            [0, 0, 0, 1],
        ]
    )
    run(
        "geometry.edit_object_placement",
        m.ifc,
        product=product,
        matrix=matrix,
        is_si=True,
    )


def add_storey(
    m: Model, name: str, elevation: float, *, set_elevation: bool = True
) -> ifcopenshell.entity_instance:
    """A storey at ``elevation`` [m] in the building."""
    storey = run("root.create_entity", m.ifc, ifc_class="IfcBuildingStorey", name=name)
    run("aggregate.assign_object", m.ifc, relating_object=m.building, products=[storey])
    _place(m, storey, (0.0, 0.0, elevation))
    if set_elevation:
        storey.Elevation = elevation / m.scale
    return storey


def add_wall(
    m: Model,
    storey: ifcopenshell.entity_instance | None,
    p0: Sequence[float],
    p1: Sequence[float],
    *,
    base: float,
    height: float,
    thickness: float = 0.2,
    name: str = "Wall",
    ifc_class: str = "IfcWall",
    with_axis: bool = True,
) -> ifcopenshell.entity_instance:
    """A straight wall from p0 to p1 (reference line on its right face) [m]."""
    wall = run("root.create_entity", m.ifc, ifc_class=ifc_class, name=name)
    dx, dy = p1[0] - p0[0], p1[1] - p0[1]
    _place(m, wall, (p0[0], p0[1], base), math.atan2(dy, dx))
    length = math.hypot(dx, dy)
    rep = run(
        "geometry.add_wall_representation",
        m.ifc,
        context=m.body,
        length=length,
        height=height,
        thickness=thickness,
    )
    run("geometry.assign_representation", m.ifc, product=wall, representation=rep)
    if with_axis:
        axis = run(
            "geometry.add_axis_representation",
            m.ifc,
            context=m.axis,
            axis=((0.0, 0.0), (length, 0.0)),
        )
        run("geometry.assign_representation", m.ifc, product=wall, representation=axis)
    if storey is not None:
        run(
            "spatial.assign_container",
            m.ifc,
            relating_structure=storey,
            products=[wall],
        )
    return wall


def add_slab(
    m: Model,
    storey: ifcopenshell.entity_instance | None,
    outline: Sequence[tuple[float, float]],
    *,
    top: float,
    depth: float = 0.2,
    predefined_type: str | None = "FLOOR",
    name: str = "Slab",
) -> ifcopenshell.entity_instance:
    """A slab with plan ``outline`` [m], top at ``top`` [m], ``depth`` [m] thick."""
    slab = run(
        "root.create_entity",
        m.ifc,
        ifc_class="IfcSlab",
        name=name,
        predefined_type=predefined_type,
    )
    _place(m, slab, (0.0, 0.0, top - depth))
    rep = run(
        "geometry.add_slab_representation",
        m.ifc,
        context=m.body,
        depth=depth,
        polyline=list(outline),
    )
    run("geometry.assign_representation", m.ifc, product=slab, representation=rep)
    if storey is not None:
        run(
            "spatial.assign_container",
            m.ifc,
            relating_structure=storey,
            products=[slab],
        )
    return slab


def add_opening(
    m: Model,
    host: ifcopenshell.entity_instance,
    origin: Sequence[float],
    *,
    angle: float,
    width: float,
    height: float,
    depth: float,
    fill: str | None = None,
) -> ifcopenshell.entity_instance:
    """A box opening voiding ``host``: ``width`` along ``angle``, from world ``origin``
    (its near bottom corner, on the host's reference face) [m]."""
    opening = run(
        "root.create_entity", m.ifc, ifc_class="IfcOpeningElement", name="Opening"
    )
    _place(m, opening, origin, angle)
    rep = run(
        "geometry.add_wall_representation",
        m.ifc,
        context=m.body,
        length=width,
        height=height,
        thickness=depth,
    )
    run("geometry.assign_representation", m.ifc, product=opening, representation=rep)
    run("feature.add_feature", m.ifc, feature=opening, element=host)
    if fill is not None:
        door = run("root.create_entity", m.ifc, ifc_class=fill, name=fill[3:])
        run("feature.add_filling", m.ifc, opening=opening, element=door)
    return opening


def box_building(
    schema: str = "IFC4",
    unit: str = "m",
    *,
    width: float = 10.0,
    depth: float = 6.0,
    story: float = 3.0,
    thickness: float = 0.2,
) -> Model:
    """Two storeys, four walls on the ground floor, floor and roof slabs."""
    m = new_model(schema, unit)
    ground = add_storey(m, "Ground", 0.0)
    roof = add_storey(m, "Roof", story)
    corners = [(0.0, 0.0), (width, 0.0), (width, depth), (0.0, depth)]
    for i in range(4):
        add_wall(
            m,
            ground,
            corners[i],
            corners[(i + 1) % 4],
            base=0.0,
            height=story - 0.2,
            thickness=thickness,
            name=f"W{i + 1}",
        )
    add_slab(
        m,
        ground,
        corners,
        top=0.0,
        depth=0.2,
        predefined_type="BASESLAB",
        name="Ground slab",
    )
    add_slab(
        m, roof, corners, top=story, depth=0.2, predefined_type="ROOF", name="Roof slab"
    )
    return m
