"""Author the Larkspur Row demo model of shearline with ifcopenshell's authoring API.

Larkspur Row is an invented three-storey light-frame wood apartment building with wood
structural panel shear walls, made for the demo only (see README.md in this folder).
The building itself is plain data in ``demo_plan.py``; this script turns it into IFC.

* L-shaped plan: main wing 24 m x 12 m (X 0-24, Y 0-12) plus a north wing 12 m x 10 m
  (X 12-24, Y 12-22), 408 m²; re-entrant corner at (12, 12) with projections of 50 %
  and 45 % of the plan dimensions (ASCE 7-16 Table 12.3-1, Type 2).
* Storeys Level 1 (0.00 m), Level 2 (3.05 m), Level 3 (6.10 m), Roof (9.15 m). Slabs
  have their top at the storey elevation and extrude downwards: slab on grade
  (BASESLAB, 0.15 m), floors (FLOOR, 0.30 m) voided by a 2.6 m x 5.2 m stair opening
  (X 9.4-12.0, Y 6.4-11.6) at Levels 2 and 3, and a roof slab (0.30 m) that is a part
  of an IfcRoof, typed by an IfcSlabType with PredefinedType ROOF.
* Walls are IfcWall typed by IfcWallType with a material layer set centred on the Axis
  (the centreline); each stands in its storey and rises to the underside of the slab
  above (2.75 m). Shear types "SW-A 15/32 Str I 10d @6" and "SW-B 15/32 Str I 10d @3"
  carry PredefinedType SHEAR on the type; partitions are "PT-1 2x4 GWB partition".
  Windows and doors fill IfcOpeningElements that void the walls.
* For the checks (revision 1): L2-C1 is a short SW-A corridor wall, overstressed; the
  corridor line stands in Levels 1 and 2 only; L3-NS stands on no wall below; L1-STE is
  one IfcWall from Level 1 to the underside of the Level 3 floor (5.80 m); 1.0 m piers
  have h/b = 2.75; Pset_WallCommon.LoadBearing is wrong on three walls, absent on one.
* Revision 2: L2-C1 lengthened to 7.2 m and retyped SW-B; L2-NSB and L1-NSB added under
  L3-NS; partition L2-P3 moved 1.0 m south; window 3 of L1-S2 widened to 2.0 m.

Placements and representation helpers take SI metres and ifcopenshell.api converts them
to the file's unit; attributes set directly (storey Elevation, layer thicknesses, door
sizes) are converted here. GlobalIds are uuid5 of stable element keys, property sets and
relationships get theirs from what they relate, and time stamps are fixed, so the output
is byte-for-byte reproducible.

Run ``python sample_models/author_demo.py`` to regenerate, in this folder (or ``--out
DIR``): demo_building.ifc (IFC4, m), demo_building_ft_ifc2x3.ifc (IFC2X3, ft, the same
GlobalIds), demo_building_rev2.ifc (IFC4, m), scenario.json and demo.toml. Each IFC file
is checked with ifcopenshell.validate (schema and express rules) before it is written.
"""

from __future__ import annotations

import argparse
import json
import logging
import sys
from dataclasses import dataclass, field
from pathlib import Path

import ifcopenshell
import ifcopenshell.api.aggregate
import ifcopenshell.api.context
import ifcopenshell.api.feature
import ifcopenshell.api.geometry
import ifcopenshell.api.material
import ifcopenshell.api.owner
import ifcopenshell.api.project
import ifcopenshell.api.pset
import ifcopenshell.api.root
import ifcopenshell.api.spatial
import ifcopenshell.api.type
import ifcopenshell.api.unit
import ifcopenshell.util.element
import numpy as np

if __package__ in (None, ""):  # run as a script: make the package importable
    sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from sample_models.demo_config import DEMO_TOML
from sample_models.demo_plan import (
    FILES,
    FOOT,
    OUTLINE,
    PROJECT,
    STAIR,
    STAIR_STOREYS,
    STOREYS,
    WALL_TYPES,
    Hole,
    Storey,
    Wall,
    plan,
    scenario,
    stable_guid,
    wall_base_top,
)

LOG = logging.getLogger("author_demo")
HERE = Path(__file__).resolve().parent
TIMESTAMP = "2024-05-06T09:00:00"  # fixed header time stamp (reproducible bytes)
EPOCH = 1714986000  # the same instant, for IfcOwnerHistory (IFC2X3 only)


@dataclass
class _Ctx:
    """The file being written and what later steps look up in it."""

    f: ifcopenshell.file
    scale: float  # file length unit [m]
    body: ifcopenshell.entity_instance | None = None  # Model/Body/MODEL_VIEW context
    axis: ifcopenshell.entity_instance | None = None  # Model/Axis/GRAPH_VIEW context
    storeys: dict = field(default_factory=dict)
    types: dict = field(default_factory=dict)
    materials: dict = field(default_factory=dict)

    def new(self, ifc_class: str, key: str, name: str | None = None, **kw):
        """Create an IfcRoot entity with the GlobalId of ``key``."""
        ent = ifcopenshell.api.root.create_entity(
            self.f, ifc_class=ifc_class, name=name, **kw
        )
        ent.GlobalId = stable_guid(key)
        return ent

    def u(self, metres: float) -> float:
        """A length in the file's unit, from metres."""
        return metres / self.scale

    @property
    def ifc4(self) -> bool:
        return self.f.schema != "IFC2X3"


def _matrix(origin: tuple[float, float, float], x_dir=(1.0, 0.0)) -> np.ndarray:
    dx, dy = x_dir
    m = np.eye(4)
    m[:3, 0] = (dx, dy, 0.0)
    m[:3, 1] = (-dy, dx, 0.0)
    m[:3, 3] = origin
    return m


def _place(ctx: _Ctx, product, matrix: np.ndarray) -> None:
    ifcopenshell.api.geometry.edit_object_placement(
        ctx.f, product=product, matrix=matrix
    )


def _new_file(schema: str, length_unit: str) -> _Ctx:
    f = ifcopenshell.api.project.create_file(version=schema)
    ctx = _Ctx(f=f, scale=FOOT if length_unit == "ft" else 1.0)
    if schema == "IFC2X3":  # IfcOwnerHistory is mandatory in IFC2X3
        app = ifcopenshell.api.owner.add_application(f)
        app.Version, app.ApplicationIdentifier = "1", "shearline-author-demo"
        app.ApplicationFullName = "shearline sample_models/author_demo.py"
        dev = app.ApplicationDeveloper  # keep library versions out of the file
        dev[0] = "shearline"  # Id in IFC2X3, Identification in IFC4
        dev.Name, dev.Description = "shearline", None
        for address in dev.Addresses or ():
            f.remove(address)
        person = ifcopenshell.api.owner.add_person(
            f, identification="demo", family_name="Author", given_name="Demo"
        )
        org = ifcopenshell.api.owner.add_organisation(
            f, identification="LR", name=PROJECT
        )
        ifcopenshell.api.owner.add_person_and_organisation(
            f, person=person, organisation=org
        )
    project = ctx.new("IfcProject", "project", PROJECT)
    _assign_units(ctx, project, length_unit)
    model = ifcopenshell.api.context.add_context(f, context_type="Model")
    ctx.body = ifcopenshell.api.context.add_context(
        f,
        context_type="Model",
        context_identifier="Body",
        target_view="MODEL_VIEW",
        parent=model,
    )
    ctx.axis = ifcopenshell.api.context.add_context(
        f,
        context_type="Model",
        context_identifier="Axis",
        target_view="GRAPH_VIEW",
        parent=model,
    )
    site = ctx.new("IfcSite", "site", "Larkspur Row site")
    building = ctx.new("IfcBuilding", "building", PROJECT)
    ifcopenshell.api.aggregate.assign_object(
        f, products=[site], relating_object=project
    )
    ifcopenshell.api.aggregate.assign_object(
        f, products=[building], relating_object=site
    )
    _place(ctx, site, np.eye(4))
    _place(ctx, building, np.eye(4))
    for s in STOREYS:
        st = ctx.new("IfcBuildingStorey", f"storey/{s.name}", s.name)
        ifcopenshell.api.aggregate.assign_object(
            f, products=[st], relating_object=building
        )
        _place(ctx, st, _matrix((0.0, 0.0, s.elevation)))
        st.Elevation = ctx.u(s.elevation)
        ctx.storeys[s.name] = st
    return ctx


def _assign_units(ctx: _Ctx, project, length_unit: str) -> None:
    f = ctx.f
    if length_unit == "ft":
        units = []
        for name, label in (
            ("foot", "FOOT"),
            ("square foot", "SQUARE FOOT"),
            ("cubic foot", "CUBIC FOOT"),
        ):
            unit = ifcopenshell.api.unit.add_conversion_based_unit(f, name=name)
            unit.Name = label
            units.append(unit)
    else:
        units = [
            ifcopenshell.api.unit.add_si_unit(f, unit_type=t)
            for t in ("LENGTHUNIT", "AREAUNIT", "VOLUMEUNIT")
        ]
    units.append(ifcopenshell.api.unit.add_si_unit(f, unit_type="PLANEANGLEUNIT"))
    project.UnitsInContext = f.createIfcUnitAssignment(units)


def _material(ctx: _Ctx, name: str):
    if name not in ctx.materials:
        ctx.materials[name] = ifcopenshell.api.material.add_material(ctx.f, name=name)
    return ctx.materials[name]


def _wall_types(ctx: _Ctx) -> None:
    f = ctx.f
    for t in WALL_TYPES.values():
        predefined = t.predefined_type
        if not ctx.ifc4 and predefined == "PARTITIONING":  # not in IFC2X3's enum
            predefined = "USERDEFINED"
        wt = ctx.new(
            "IfcWallType", f"walltype/{t.key}", t.name, predefined_type=predefined
        )
        if not ctx.ifc4 and predefined == "USERDEFINED":
            wt.ElementType = t.predefined_type
        layer_set = ifcopenshell.api.material.add_material_set(
            f, name=t.name, set_type="IfcMaterialLayerSet"
        )
        for mat, thick in t.layers:
            layer = ifcopenshell.api.material.add_layer(
                f, layer_set=layer_set, material=_material(ctx, mat)
            )
            ifcopenshell.api.material.edit_layer(
                f, layer=layer, attributes={"LayerThickness": ctx.u(thick)}
            )
        ifcopenshell.api.material.assign_material(
            f, products=[wt], type="IfcMaterialLayerSet", material=layer_set
        )
        ctx.types[t.key] = wt


def _box(ctx: _Ctx, length: float, height: float, thickness: float):
    return ifcopenshell.api.geometry.add_wall_representation(
        ctx.f,
        context=ctx.body,
        length=length,
        height=height,
        thickness=thickness,
        offset=-thickness / 2.0,
    )


def _add_wall(ctx: _Ctx, wall: Wall) -> None:
    f, wt = ctx.f, WALL_TYPES[wall.wall_type]
    base, top = wall_base_top(wall)
    ent = ctx.new("IfcWall", f"wall/{wall.tag}", wall.tag)
    ent.Description = wall.role
    ifcopenshell.api.spatial.assign_container(
        f, products=[ent], relating_structure=ctx.storeys[wall.storey]
    )
    ifcopenshell.api.type.assign_type(
        f, related_objects=[ent], relating_type=ctx.types[wt.key]
    )
    usage = ifcopenshell.util.element.get_material(ent)
    usage.OffsetFromReferenceLine = ctx.u(-wt.thickness / 2.0)
    length = wall.length
    ux, uy = (
        (wall.end[0] - wall.start[0]) / length,
        (wall.end[1] - wall.start[1]) / length,
    )
    matrix = _matrix((*wall.start, base), (ux, uy))
    _place(ctx, ent, matrix)
    reps = [
        ifcopenshell.api.geometry.add_axis_representation(
            f, context=ctx.axis, axis=((0.0, 0.0), (length, 0.0))
        ),
        _box(ctx, length, top - base, wt.thickness),
    ]
    for rep in reps:
        ifcopenshell.api.geometry.assign_representation(
            f, product=ent, representation=rep
        )
    if wall.load_bearing is not None:
        pset = ifcopenshell.api.pset.add_pset(f, product=ent, name="Pset_WallCommon")
        ifcopenshell.api.pset.edit_pset(
            f,
            pset=pset,
            properties={"LoadBearing": wall.load_bearing, "IsExternal": wall.external},
        )
    for hole in wall.openings:
        _add_hole(ctx, ent, wall, hole, matrix)


def _add_hole(
    ctx: _Ctx, wall_ent, wall: Wall, hole: Hole, wall_matrix: np.ndarray
) -> None:
    f, key = ctx.f, f"{wall.tag}/{hole.n}"
    width, height = hole.end - hole.start, hole.head - hole.sill
    kw = {"predefined_type": "OPENING"} if ctx.ifc4 else {}
    opening = ctx.new(
        "IfcOpeningElement", f"opening/{key}", f"{wall.tag} {hole.kind} {hole.n}", **kw
    )
    rep = _box(ctx, width, height, WALL_TYPES[wall.wall_type].thickness + 0.1)
    ifcopenshell.api.geometry.assign_representation(
        f, product=opening, representation=rep
    )
    ifcopenshell.api.feature.add_feature(f, feature=opening, element=wall_ent)
    local = np.eye(4)
    local[:3, 3] = (hole.start, 0.0, hole.sill)
    _place(ctx, opening, wall_matrix @ local)
    cls = "IfcWindow" if hole.kind == "window" else "IfcDoor"
    kw = {"predefined_type": hole.kind.upper()} if ctx.ifc4 else {}
    filling = ctx.new(
        cls, f"{hole.kind}/{key}", f"{wall.tag} {hole.kind} {hole.n}", **kw
    )
    filling.OverallWidth, filling.OverallHeight = ctx.u(width), ctx.u(height)
    rep = _box(ctx, width, height, 0.06)
    ifcopenshell.api.geometry.assign_representation(
        f, product=filling, representation=rep
    )
    ifcopenshell.api.spatial.assign_container(
        f, products=[filling], relating_structure=ctx.storeys[wall.storey]
    )
    ifcopenshell.api.feature.add_filling(f, opening=opening, element=filling)
    _place(ctx, filling, wall_matrix @ local)


def _slab_rep(ctx: _Ctx, points, depth: float):
    pts = [*points, points[0]]
    return ifcopenshell.api.geometry.add_slab_representation(
        ctx.f, context=ctx.body, depth=depth, direction_sense="NEGATIVE", polyline=pts
    )


def _add_slabs(ctx: _Ctx) -> None:
    f = ctx.f
    for s in STOREYS:
        storey = ctx.storeys[s.name]
        name = f"{s.tag} {s.slab.lower()} slab"
        if s.slab == "ROOF":
            roof = ctx.new("IfcRoof", "roof", "Roof", predefined_type="FLAT_ROOF")
            if not ctx.ifc4:
                roof.ShapeType, roof.ObjectType = "FLAT_ROOF", None
            ifcopenshell.api.spatial.assign_container(
                f, products=[roof], relating_structure=storey
            )
            _place(ctx, roof, _matrix((0.0, 0.0, s.elevation)))
            slab = ctx.new("IfcSlab", f"slab/{s.name}", name)
            slab_type = ctx.new(
                "IfcSlabType",
                "slabtype/roof",
                "RF-1 19/32 sheathing on trusses",
                predefined_type="ROOF",
            )
            ifcopenshell.api.material.assign_material(
                f,
                products=[slab_type],
                material=_material(ctx, "Plywood roof sheathing 19/32 in"),
            )
            ifcopenshell.api.type.assign_type(
                f, related_objects=[slab], relating_type=slab_type
            )
            ifcopenshell.api.aggregate.assign_object(
                f, products=[slab], relating_object=roof
            )
        else:
            slab = ctx.new("IfcSlab", f"slab/{s.name}", name, predefined_type=s.slab)
            mat = (
                "Concrete slab on grade"
                if s.slab == "BASESLAB"
                else "Plywood 23/32 on I-joists"
            )
            ifcopenshell.api.material.assign_material(
                f, products=[slab], material=_material(ctx, mat)
            )
            ifcopenshell.api.spatial.assign_container(
                f, products=[slab], relating_structure=storey
            )
        _place(ctx, slab, _matrix((0.0, 0.0, s.elevation)))
        rep = _slab_rep(ctx, OUTLINE, s.depth)
        ifcopenshell.api.geometry.assign_representation(
            f, product=slab, representation=rep
        )
        pset = ifcopenshell.api.pset.add_pset(f, product=slab, name="Pset_SlabCommon")
        ifcopenshell.api.pset.edit_pset(
            f,
            pset=pset,
            properties={"LoadBearing": True, "IsExternal": s.slab == "ROOF"},
        )
        if s.name in STAIR_STOREYS:
            _add_stair_opening(ctx, slab, s)


def _add_stair_opening(ctx: _Ctx, slab, s: Storey) -> None:
    (x0, y0), (x1, y1) = STAIR
    kw = {"predefined_type": "OPENING"} if ctx.ifc4 else {}
    opening = ctx.new(
        "IfcOpeningElement", f"opening/stair/{s.name}", f"{s.tag} stair opening", **kw
    )
    rep = _slab_rep(ctx, ((x0, y0), (x1, y0), (x1, y1), (x0, y1)), s.depth + 0.2)
    ifcopenshell.api.geometry.assign_representation(
        ctx.f, product=opening, representation=rep
    )
    ifcopenshell.api.feature.add_feature(ctx.f, feature=opening, element=slab)
    _place(ctx, opening, _matrix((0.0, 0.0, s.elevation + 0.1)))


def _owner_of(f: ifcopenshell.file, pset) -> str:
    for inv in f.get_inverse(pset):
        if inv.is_a("IfcRelDefinesByProperties"):
            return inv.RelatedObjects[0].GlobalId
        if inv.is_a("IfcTypeObject"):
            return inv.GlobalId
    msg = f"property set #{pset.id()} {pset.Name!r} has no owner"
    raise ValueError(msg)


def _ref(value) -> str:
    if isinstance(value, ifcopenshell.entity_instance):
        return value.GlobalId if value.is_a("IfcRoot") else f"#{value.is_a()}"
    return "+".join(sorted(_ref(v) for v in value))


def _rel_keys(f: ifcopenshell.file, rels) -> dict[int, str]:
    """Key of each relationship: its class and relating object, plus the related
    objects where that alone is not unique (or the relating object has no GlobalId)."""
    short, full = {}, {}
    for rel in rels:
        info = rel.get_info(recursive=False, include_identifier=False)
        relating = [k for k in info if k.startswith("Relating")]
        short[rel.id()] = rel.is_a() + "|" + "|".join(_ref(info[k]) for k in relating)
        parts = [_ref(v) for k, v in info.items() if k.startswith("Relat")]
        full[rel.id()] = rel.is_a() + "|" + "|".join(parts)
    counts: dict[str, int] = {}
    for key in short.values():
        counts[key] = counts.get(key, 0) + 1
    return {
        i: short[i] if counts[short[i]] == 1 and "#" not in short[i] else full[i]
        for i in short
    }


def _finalise(ctx: _Ctx, filename: str) -> None:
    """Stable GlobalIds of psets and relationships; one owner history; header."""
    f = ctx.f
    for pset in f.by_type("IfcPropertySetDefinition"):
        pset.GlobalId = stable_guid(f"pset/{_owner_of(f, pset)}/{pset.Name}")
    rels = f.by_type("IfcRelationship")
    for rel in rels:  # the API fills these SETs through Python sets: fix their order
        for i in range(len(rel)):
            value = rel[i]
            if (
                isinstance(value, tuple)
                and value
                and isinstance(value[0], ifcopenshell.entity_instance)
            ):
                rel[i] = sorted(value, key=lambda e: e.id())
    for i, key in _rel_keys(f, rels).items():
        f.by_id(i).GlobalId = stable_guid(f"rel/{key}")
    guids = [e.GlobalId for e in f.by_type("IfcRoot")]
    if len(set(guids)) != len(guids):
        msg = f"{filename}: duplicate GlobalIds generated"
        raise ValueError(msg)
    histories = f.by_type("IfcOwnerHistory")
    if histories:
        keep = histories[0]
        keep.CreationDate, keep.LastModifiedDate = EPOCH, EPOCH
        for ent in f.by_type("IfcRoot"):
            ent.OwnerHistory = keep
        for other in histories[1:]:
            f.remove(other)
    header = f.header
    view = "DesignTransferView_V1.0" if ctx.ifc4 else "CoordinationView_V2.0"
    header.file_description.description = (f"ViewDefinition [{view}]",)
    header.file_name.name = filename
    header.file_name.time_stamp = TIMESTAMP
    header.file_name.author = ("shearline demo",)
    header.file_name.organization = ("shearline",)
    header.file_name.preprocessor_version = "IfcOpenShell (ifcopenshell.api)"
    header.file_name.originating_system = "shearline sample_models/author_demo.py"
    header.file_name.authorization = "none"


def author(
    revision: int,
    *,
    schema: str = "IFC4",
    length_unit: str = "m",
    filename: str = "demo_building.ifc",
) -> ifcopenshell.file:
    """Build one revision of the demo building as an in-memory IFC file."""
    ctx = _new_file(schema, length_unit)
    _wall_types(ctx)
    for wall in plan(revision):
        _add_wall(ctx, wall)
    _add_slabs(ctx)
    _finalise(ctx, filename)
    return ctx.f


def write_all(out_dir: Path, *, validate: bool = True) -> list[Path]:
    """Regenerate every output into ``out_dir``; returns the paths written."""
    out_dir.mkdir(parents=True, exist_ok=True)
    written = []
    for name, (rev, schema, unit) in FILES.items():
        f = author(rev, schema=schema, length_unit=unit, filename=name)
        if validate:
            _validate(f, name)
        f.write(str(out_dir / name))
        written.append(out_dir / name)
    path = out_dir / "scenario.json"
    path.write_text(json.dumps(scenario(), indent=1) + "\n", encoding="utf-8")
    written.append(path)
    path = out_dir / "demo.toml"
    path.write_text(DEMO_TOML, encoding="utf-8")
    written.append(path)
    return written


def _validate(f: ifcopenshell.file, name: str) -> None:
    import ifcopenshell.validate

    logger = ifcopenshell.validate.json_logger()
    ifcopenshell.validate.validate(f, logger, express_rules=True)
    if logger.statements:
        first = logger.statements[0]
        msg = f"{name}: {len(logger.statements)} validation issue(s), first: {first}"
        raise ValueError(msg)
    LOG.info("%s: schema and express rules valid", name)


def main(argv: list[str] | None = None) -> int:
    """Command line: regenerate the demo scenario."""
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", type=Path, default=HERE, help="output folder")
    parser.add_argument(
        "--no-validate",
        action="store_true",
        help="skip ifcopenshell.validate (schema and express rules)",
    )
    args = parser.parse_args(argv)
    logging.basicConfig(level=logging.INFO, format="%(message)s")
    for path in write_all(args.out, validate=not args.no_validate):
        LOG.info("wrote %s", path)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
