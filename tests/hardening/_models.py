"""Small test buildings for the hardening suite: IFC files and BuildingModel records.

Invented test geometry, not a real building. ``ifc_box`` writes a one- or two-storey
rectangular building with ifcopenshell.api (SI metres; the api helpers convert to the
file unit); ``plan_model`` builds a :class:`BuildingModel` straight from the dataclasses
for the property tests. ``CONFIG_TOML`` is a minimal project config in the agreed
format.
"""

from __future__ import annotations

import math
import uuid
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path

import ifcopenshell
import ifcopenshell.api
import ifcopenshell.api.project
import ifcopenshell.guid
import numpy as np
from shapely.geometry import Polygon

from allocation.parameters import (
    AnalysisOptions,
    AssemblyKind,
    AssemblyProperties,
    DeadLoads,
    DiaphragmMethod,
    SeismicParameters,
)
from checks.project import Assembly, ProjectConfig
from ifc_bridge.model import BuildingModel, Diaphragm, Level, WallSegment
from ifc_bridge.shear_walls import MatchRule

Point = tuple[float, float]

CONFIG_TOML = """\
[project]
name = "Hardening box"

[seismic]
procedure = "elf"
SDS = 1.0
SD1 = 0.6
S1 = 0.62
TL = "8 s"
R = 6.5
Ie = 1.0
Cd = 4.0
omega0 = 3.0
Ct = 0.02
x = 0.75

[loads]
floor = "15 psf"
roof = "20 psf"
wall = "10 psf"

[analysis]
diaphragm = "envelope"
line_tolerance = "0.5 m"
angle_tolerance = "10 deg"

[[assemblies]]
name = "SW"
kind = "wood_structural_panel"
match = { type_name = "SW*" }
unit_shear_capacity = "340 plf"
"""


def write_config(path: Path, text: str = CONFIG_TOML) -> Path:
    """Write a config file and return its path."""
    path.write_text(text, encoding="utf-8")
    return path


# --------------------------------------------------------------------------- IFC


def _run(usecase: str, ifc: ifcopenshell.file, **kw: object) -> object:
    return ifcopenshell.api.run(usecase, ifc, **kw)


def _place(ifc, product, origin: Sequence[float], angle: float = 0.0) -> None:
    c, s = math.cos(angle), math.sin(angle)
    matrix = np.array(
        [
            [c, -s, 0, origin[0]],
            [s, c, 0, origin[1]],
            [0, 0, 1, origin[2]],
            [0, 0, 0, 1],
        ]
    )
    _run(
        "geometry.edit_object_placement",
        ifc,
        product=product,
        matrix=matrix,
        is_si=True,
    )


@dataclass
class IfcBox:
    """What :func:`ifc_box` built: the file and the GlobalIds of its elements."""

    ifc: ifcopenshell.file
    storeys: list = field(default_factory=list)
    walls: list = field(default_factory=list)
    slabs: list = field(default_factory=list)
    wall_type: object = None
    contexts: tuple = ()
    same_guid: list = field(default_factory=list)  # (original, copy): copy gets its id

    def write(self, path: Path) -> Path:
        """Write the IFC file (GlobalIds made deterministic) and return its path."""
        stable_guids(self.ifc)
        for original, copy in self.same_guid:
            copy.GlobalId = original.GlobalId
        self.ifc.write(str(path))
        return path


def stable_guids(ifc: ifcopenshell.file) -> None:
    """Replace every GlobalId by one derived from the entity's class and step id.

    ifcopenshell.api draws random GlobalIds; tests must not depend on unseeded
    randomness, and two files built the same way must share their GlobalIds.
    """
    for e in ifc.by_type("IfcRoot"):
        u = uuid.uuid5(uuid.NAMESPACE_URL, f"shearline-tests/{e.is_a()}/{e.id()}")
        e.GlobalId = ifcopenshell.guid.compress(u.hex)


def _new_file() -> tuple[ifcopenshell.file, object, object, object]:
    ifc = ifcopenshell.api.project.create_file(version="IFC4")
    project = _run("root.create_entity", ifc, ifc_class="IfcProject", name="Box")
    length = _run("unit.add_si_unit", ifc, unit_type="LENGTHUNIT")
    _run("unit.assign_unit", ifc, units=[length])
    model = _run("context.add_context", ifc, context_type="Model")
    body = _run(
        "context.add_context",
        ifc,
        context_type="Model",
        context_identifier="Body",
        target_view="MODEL_VIEW",
        parent=model,
    )
    axis = _run(
        "context.add_context",
        ifc,
        context_type="Plan",
        context_identifier="Axis",
        target_view="GRAPH_VIEW",
        parent=model,
    )
    site = _run("root.create_entity", ifc, ifc_class="IfcSite", name="Site")
    building = _run("root.create_entity", ifc, ifc_class="IfcBuilding", name="Building")
    _run("aggregate.assign_object", ifc, relating_object=project, products=[site])
    _run("aggregate.assign_object", ifc, relating_object=site, products=[building])
    return ifc, body, axis, building


def add_wall(
    box: IfcBox,
    storey,
    p0: Point,
    p1: Point,
    *,
    base: float,
    height: float,
    name: str,
    shear: bool = True,
    thickness: float = 0.2,
):
    """A straight wall p0 -> p1 [m], typed SHEAR ("SW-1") when ``shear``."""
    ifc = box.ifc
    body, axis_ctx = box.contexts
    wall = _run("root.create_entity", ifc, ifc_class="IfcWall", name=name)
    dx, dy = p1[0] - p0[0], p1[1] - p0[1]
    angle = math.atan2(dy, dx)
    length = math.hypot(dx, dy)
    # reference line on one face: shift by half the thickness so the centreline is p0-p1
    nx, ny = -math.sin(angle), math.cos(angle)
    origin = (p0[0] - nx * thickness / 2, p0[1] - ny * thickness / 2, base)
    _place(ifc, wall, origin, angle)
    rep = _run(
        "geometry.add_wall_representation",
        ifc,
        context=body,
        length=length,
        height=height,
        thickness=thickness,
    )
    _run("geometry.assign_representation", ifc, product=wall, representation=rep)
    ax = _run(
        "geometry.add_axis_representation",
        ifc,
        context=axis_ctx,
        axis=((0.0, thickness / 2), (length, thickness / 2)),
    )
    _run("geometry.assign_representation", ifc, product=wall, representation=ax)
    if shear:
        _run(
            "type.assign_type", ifc, related_objects=[wall], relating_type=box.wall_type
        )
    _run("spatial.assign_container", ifc, relating_structure=storey, products=[wall])
    box.walls.append(wall)
    return wall


def add_slab(
    box: IfcBox,
    storey,
    outline: Sequence[Point],
    *,
    top: float,
    kind: str = "FLOOR",
    name: str = "Slab",
    depth: float = 0.2,
):
    """A slab of plan ``outline`` [m] with its top at ``top`` [m]."""
    ifc = box.ifc
    slab = _run(
        "root.create_entity", ifc, ifc_class="IfcSlab", name=name, predefined_type=kind
    )
    _place(ifc, slab, (0.0, 0.0, top - depth))
    rep = _run(
        "geometry.add_slab_representation",
        ifc,
        context=box.contexts[0],
        depth=depth,
        polyline=list(outline),
    )
    _run("geometry.assign_representation", ifc, product=slab, representation=rep)
    _run("spatial.assign_container", ifc, relating_structure=storey, products=[slab])
    box.slabs.append(slab)
    return slab


def add_storey(
    box: IfcBox,
    name: str,
    elevation: float,
    *,
    set_elevation: bool = True,
    building=None,
):
    """A storey at ``elevation`` [m]."""
    ifc = box.ifc
    storey = _run("root.create_entity", ifc, ifc_class="IfcBuildingStorey", name=name)
    building = building or ifc.by_type("IfcBuilding")[0]
    _run("aggregate.assign_object", ifc, relating_object=building, products=[storey])
    _place(ifc, storey, (0.0, 0.0, elevation))
    if set_elevation:
        storey.Elevation = elevation
    box.storeys.append(storey)
    return storey


def rotate(p: Point, angle: float, about: Point = (0.0, 0.0)) -> Point:
    """``p`` rotated by ``angle`` [rad] about ``about`` (plan, CCW)."""
    c, s = math.cos(angle), math.sin(angle)
    x, y = p[0] - about[0], p[1] - about[1]
    return (about[0] + c * x - s * y, about[1] + s * x + c * y)


def ifc_box(
    *,
    width: float = 12.0,
    depth: float = 8.0,
    story: float = 3.0,
    origin: Point = (0.0, 0.0),
    angle: float = 0.0,
    slabs: bool = True,
    names: Sequence[str] = ("South", "East", "North", "West"),
    storey_name: str = "Ground",
    roof_name: str = "Roof",
) -> IfcBox:
    """One storey of four SHEAR walls under a roof slab, in IFC4, metres.

    ``origin`` translates and ``angle`` [rad] rotates the whole plan about ``origin``.
    """
    ifc, body, axis, building = _new_file()
    box = IfcBox(ifc=ifc, contexts=(body, axis))
    box.wall_type = _run(
        "root.create_entity",
        ifc,
        ifc_class="IfcWallType",
        name="SW-1 plywood",
        predefined_type="SHEAR",
    )
    ground = add_storey(box, storey_name, 0.0, building=building)
    roof = add_storey(box, roof_name, story, building=building)
    local = [(0.0, 0.0), (width, 0.0), (width, depth), (0.0, depth)]
    corners = [rotate((origin[0] + x, origin[1] + y), angle, origin) for x, y in local]
    for i, name in enumerate(names):
        add_wall(
            box,
            ground,
            corners[i],
            corners[(i + 1) % 4],
            base=0.0,
            height=story - 0.2,
            name=name,
        )
    if slabs:
        add_slab(box, ground, corners, top=0.0, kind="BASESLAB", name="Ground slab")
        add_slab(box, roof, corners, top=story, kind="ROOF", name="Roof slab")
    return box


# ------------------------------------------------------------- BuildingModel records

SEISMIC = SeismicParameters(
    SDS=1.0,
    SD1=0.6,
    S1=0.62,
    TL=8.0,
    R=6.5,
    Ie=1.0,
    Cd=4.0,
    omega0=3.0,
    Ct=0.0488,
    x=0.75,
)  # ASCE 7-16 Table 12.8-2 (SI)
LOADS = DeadLoads(floor=718.0, roof=958.0, wall=479.0)  # 15, 20, 10 psf in Pa
WSP = AssemblyProperties(name="SW", kind=AssemblyKind.WOOD_PANEL)


def options(method: DiaphragmMethod = DiaphragmMethod.ENVELOPE) -> AnalysisOptions:
    """Analysis options with the one test assembly."""
    return AnalysisOptions(diaphragm=method, assemblies=(WSP,))


def project_config(method: DiaphragmMethod = DiaphragmMethod.ENVELOPE) -> ProjectConfig:
    """A ProjectConfig built in code: one wood panel assembly at 340 plf ASD."""
    assembly = Assembly(
        name="SW",
        kind=AssemblyKind.WOOD_PANEL,
        match=MatchRule(assembly="SW", type_name="SW*"),
        properties=WSP,
        unit_shear_capacity=4962.0,  # 340 plf in N/m (1 plf = 14.5939 N/m)
        capacity_source="user",
    )
    return ProjectConfig(
        path="hardening.toml",
        name="Hardening plan",
        seismic=SEISMIC,
        loads=LOADS,
        analysis=options(method),
        assemblies=(assembly,),
    )


@dataclass(frozen=True, slots=True, kw_only=True)
class Plan:
    """An invented plan: diaphragm outline, shear walls (start, end) per storey [m]."""

    outline: tuple[Point, ...]
    walls: tuple[tuple[Point, Point], ...]
    storeys: int = 1
    story_height: float = 3.0


def plan_model(
    plan: Plan, *, transform=None, guid_of=None, order=None
) -> BuildingModel:
    """A BuildingModel of ``plan.storeys`` identical stories of ``plan``.

    Args:
        plan: The plan.
        transform: Optional ``Point -> Point`` applied to every plan point.
        guid_of: Optional ``(story, wall index) -> GlobalId``.
        order: Optional permutation of the wall list (same GUIDs, other order).
    """
    tf = transform or (lambda p: p)
    gid = guid_of or (lambda s, i: f"W{s}-{i:02d}")
    n = plan.storeys
    names = ["Base", *[f"Level {k}" for k in range(2, n + 1)], "Roof"]
    levels = tuple(
        Level(name=nm, guid=f"G-{k}", elevation=k * plan.story_height, index=k)
        for k, nm in enumerate(names)
    )
    poly = Polygon([tf(p) for p in plan.outline])
    diaphragms = tuple(
        Diaphragm(
            id=f"{lv.name}/D1",
            level=lv.name,
            polygon=poly,
            slab_guids=(f"S-{lv.index}",),
            kind="ROOF" if lv is levels[-1] else "FLOOR",
            elevation=lv.elevation,
        )
        for lv in levels[1:]
    )
    walls = []
    for s in range(n):
        z0, z1 = levels[s].elevation, levels[s + 1].elevation
        for i, (a, b) in enumerate(plan.walls):
            walls.append(
                WallSegment(
                    guid=gid(s, i),
                    name=f"wall {s}-{i}",
                    storey=levels[s].name,
                    level=levels[s + 1].name,
                    base_elevation=z0,
                    top_elevation=z1,
                    start=tf(a),
                    end=tf(b),
                    thickness=0.15,
                    type_name="SW-1",
                    predefined_type="SHEAR",
                    is_shear_wall=True,
                    assembly="SW",
                )
            )
    if order is not None:
        walls = [walls[k] for k in order]
    return BuildingModel(
        source="plan.ifc",
        schema="IFC4",
        levels=levels,
        diaphragms=diaphragms,
        walls=tuple(walls),
    )
