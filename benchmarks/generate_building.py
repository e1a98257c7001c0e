"""Synthetic multi-storey buildings for the benchmark, authored with ifcopenshell.api.

Each storey is a rectangle with a grid of shear-wall lines in both directions, partition
walls between them, a floor slab with a stair hole, and an opening in every fifth wall.
Sizes are given as ``storeys x walls per storey``; the plan grows with the wall count so
wall density stays realistic. Invented data, for timing only.

    python benchmarks/generate_building.py --storeys 40 --walls 250 -o big.ifc
"""

from __future__ import annotations

import argparse
import math
import uuid
from pathlib import Path

import numpy as np

STOREY_HEIGHT = 3.0
SLAB_DEPTH = 0.25  # the slab hangs below its storey elevation; walls stop under it
BAY = 6.0


def _guid(*parts: object) -> str:
    import ifcopenshell.guid

    return ifcopenshell.guid.compress(
        uuid.uuid5(uuid.NAMESPACE_URL, "/".join(map(str, parts))).hex
    )


def generate(storeys: int, walls_per_storey: int, path: Path) -> Path:
    """Author the building and write it to ``path`` (IFC4, millimetres)."""
    import ifcopenshell
    import ifcopenshell.api
    import ifcopenshell.util.unit

    run = ifcopenshell.api.run
    f = run("project.create_file", version="IFC4")
    project = run(
        "root.create_entity", f, ifc_class="IfcProject", name="Benchmark tower"
    )
    run("unit.assign_unit", f)  # millimetres: attributes in file units, matrices in SI
    unit = ifcopenshell.util.unit.calculate_unit_scale(f)  # [m per file unit]
    ctx = run("context.add_context", f, context_type="Model")
    body = run(
        "context.add_context",
        f,
        context_type="Model",
        context_identifier="Body",
        target_view="MODEL_VIEW",
        parent=ctx,
    )
    axis_ctx = run(
        "context.add_context",
        f,
        context_type="Model",
        context_identifier="Axis",
        target_view="GRAPH_VIEW",
        parent=ctx,
    )
    site = run("root.create_entity", f, ifc_class="IfcSite", name="Site")
    building = run("root.create_entity", f, ifc_class="IfcBuilding", name="Tower")
    run("aggregate.assign_object", f, relating_object=project, products=[site])
    run("aggregate.assign_object", f, relating_object=site, products=[building])

    shear_type = run(
        "root.create_entity",
        f,
        ifc_class="IfcWallType",
        name="BW-SHEAR",
        predefined_type="SHEAR",
    )
    part_type = run(
        "root.create_entity",
        f,
        ifc_class="IfcWallType",
        name="BW-PART",
        predefined_type="PARTITIONING",
    )
    # n lines each way; each line has `segments` walls; the rest are partitions
    lines = max(2, int(math.sqrt(walls_per_storey / 2.5)))
    segs = max(1, walls_per_storey // (4 * lines))
    width = depth = lines * BAY
    seg_len = width / segs
    for s in range(storeys + 1):
        z = s * STOREY_HEIGHT
        storey = run(
            "root.create_entity",
            f,
            ifc_class="IfcBuildingStorey",
            name=f"Level {s + 1}",
        )
        storey.GlobalId = _guid("storey", s)
        storey.Elevation = z / unit
        run(
            "geometry.edit_object_placement",
            f,
            product=storey,
            matrix=_matrix(0.0, 0.0, z, 0.0),
        )
        run("aggregate.assign_object", f, relating_object=building, products=[storey])
        if s > 0:
            _slab(f, run, body, storey, s, width, depth, z)
        if s == storeys:
            continue
        count = 0
        walls = []
        for direction in (0, 1):
            for i in range(lines + 1):
                for k in range(segs):
                    if count >= walls_per_storey:
                        break
                    a = k * seg_len
                    x, y, ang = (
                        (a, i * BAY, 0.0) if direction == 0 else (i * BAY, a, 90.0)
                    )
                    wall = _wall(
                        f,
                        run,
                        body,
                        axis_ctx,
                        (s, direction, i, k),
                        x,
                        y,
                        z,
                        ang,
                        seg_len * 0.95,
                    )
                    walls.append(wall)
                    if count % 5 == 0:
                        _opening(
                            f,
                            run,
                            body,
                            wall,
                            _matrix(x, y, z, ang),
                            seg_len * 0.95,
                            (s, direction, i, k),
                        )
                    count += 1
        while count < walls_per_storey:  # partitions in the bays
            i, j = count % lines, (count // lines) % lines
            layer = count // (lines * lines)  # a further partition row in the bay
            if layer > 6:
                msg = f"{walls_per_storey} walls per storey do not fit {lines} bays"
                raise ValueError(msg)
            wall = _wall(
                f,
                run,
                body,
                axis_ctx,
                (s, "p", count),
                i * BAY + 1.0,
                j * BAY + 1.0 + 0.7 * layer,
                z,
                0.0,
                3.0,
            )
            walls.append(wall)
            count += 1
        shear = [w for w in walls if not w.Name.startswith("P")]
        run("type.assign_type", f, related_objects=shear, relating_type=shear_type)
        run(
            "type.assign_type",
            f,
            related_objects=[w for w in walls if w.Name.startswith("P")],
            relating_type=part_type,
        )
        run("spatial.assign_container", f, relating_structure=storey, products=walls)
    f.write(str(path))
    return path


def _matrix(x: float, y: float, z: float, angle_deg: float) -> np.ndarray:
    a = math.radians(angle_deg)
    m = np.eye(4)
    m[:2, :2] = [[math.cos(a), -math.sin(a)], [math.sin(a), math.cos(a)]]
    m[:3, 3] = (x, y, z)
    return m


def _wall(f, run, body, axis_ctx, key, x, y, z, angle, length):
    wall = run(
        "root.create_entity",
        f,
        ifc_class="IfcWall",
        name=("P" if "p" in key else "W") + "-" + "-".join(map(str, key)),
    )
    wall.GlobalId = _guid("wall", *key)
    run(
        "geometry.edit_object_placement",
        f,
        product=wall,
        matrix=_matrix(x, y, z, angle),
    )
    rep = run(
        "geometry.add_wall_representation",
        f,
        context=body,
        length=length,
        height=STOREY_HEIGHT - SLAB_DEPTH,
        thickness=0.2,
    )
    run("geometry.assign_representation", f, product=wall, representation=rep)
    axis = run(
        "geometry.add_axis_representation",
        f,
        context=axis_ctx,
        axis=[(0.0, 0.0), (length, 0.0)],
    )
    run("geometry.assign_representation", f, product=wall, representation=axis)
    return wall


def _opening(f, run, body, wall, wall_matrix, length, key):
    op = run("root.create_entity", f, ifc_class="IfcOpeningElement", name="door")
    op.GlobalId = _guid("opening", *key)
    w = min(1.0, length / 3)
    m = wall_matrix.copy()  # SI, as edit_object_placement expects (is_si=True)
    m[:3, 3] += m[:3, 0] * (length / 2 - w / 2) - m[:3, 1] * 0.2
    run("geometry.edit_object_placement", f, product=op, matrix=m)
    rep = run(
        "geometry.add_wall_representation",
        f,
        context=body,
        length=w,
        height=2.1,
        thickness=0.6,
    )
    run("geometry.assign_representation", f, product=op, representation=rep)
    run("feature.add_feature", f, feature=op, element=wall)


def _slab(f, run, body, storey, s, width, depth, z):
    slab = run(
        "root.create_entity",
        f,
        ifc_class="IfcSlab",
        name=f"Floor {s}",
        predefined_type="FLOOR",
    )
    slab.GlobalId = _guid("slab", s)
    run(
        "geometry.edit_object_placement",
        f,
        product=slab,
        matrix=_matrix(0.0, 0.0, z - SLAB_DEPTH, 0.0),
    )
    outer = [(0.0, 0.0), (width, 0.0), (width, depth), (0.0, depth), (0.0, 0.0)]
    rep = run(
        "geometry.add_slab_representation",
        f,
        context=body,
        depth=SLAB_DEPTH,
        polyline=outer,
    )
    run("geometry.assign_representation", f, product=slab, representation=rep)
    hole = run("root.create_entity", f, ifc_class="IfcOpeningElement", name="stair")
    hole.GlobalId = _guid("stair", s)
    run(
        "geometry.edit_object_placement",
        f,
        product=hole,
        matrix=_matrix(BAY * 0.5, BAY * 0.5, z - 0.5, 0.0),
    )
    hrep = run(
        "geometry.add_slab_representation",
        f,
        context=body,
        depth=1.0,
        polyline=[(0, 0), (2.5, 0), (2.5, 5.0), (0, 5.0), (0, 0)],
    )
    run("geometry.assign_representation", f, product=hole, representation=hrep)
    run("feature.add_feature", f, feature=hole, element=slab)
    run("spatial.assign_container", f, relating_structure=storey, products=[slab])


def main() -> None:
    """Command line: ``--storeys N --walls M -o FILE``."""
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--storeys", type=int, required=True)
    p.add_argument("--walls", type=int, required=True, help="walls per storey")
    p.add_argument("-o", "--output", type=Path, required=True)
    a = p.parse_args()
    generate(a.storeys, a.walls, a.output)


if __name__ == "__main__":
    main()
