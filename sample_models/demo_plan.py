"""The Larkspur Row demo building as plain data: storeys, wall types, walls, openings.

Invented for the shearline demo; nothing here describes a real project. Imports no
ifcopenshell: ``author_demo.py`` turns this plan into IFC files, and ``scenario()``
turns it into ``scenario.json``, the authoring inputs the tests compare the reader with.

Units are SI (m, m²). Plan axes: global X east, Y north, origin at the south-west
corner. A wall runs from ``start`` to ``end`` along its centreline; opening positions
are distances from ``start``, sills and heads heights above the wall base.
"""

from __future__ import annotations

import math
import uuid
from dataclasses import dataclass, replace
from itertools import pairwise

PROJECT = "Larkspur Row"
FOOT = 0.3048  # [m] international foot, exact by definition
NAMESPACE = uuid.uuid5(uuid.NAMESPACE_URL, "urn:shearline:sample-models:larkspur-row")
FILES = {  # file name -> (revision, schema, length unit)
    "demo_building.ifc": (1, "IFC4", "m"),
    "demo_building_ft_ifc2x3.ifc": (1, "IFC2X3", "ft"),
    "demo_building_rev2.ifc": (2, "IFC4", "m"),
}


@dataclass(frozen=True, slots=True)
class Storey:
    """A storey; its slab has its top at the elevation and ``depth`` below it [m]."""

    name: str
    tag: str
    elevation: float
    slab: str  # BASESLAB, FLOOR or ROOF
    depth: float


STOREYS = (
    Storey("Level 1", "L1", 0.0, "BASESLAB", 0.15),
    Storey("Level 2", "L2", 3.05, "FLOOR", 0.30),
    Storey("Level 3", "L3", 6.10, "FLOOR", 0.30),
    Storey("Roof", "RF", 9.15, "ROOF", 0.30),
)
OUTLINE = (
    (0.0, 0.0),
    (24.0, 0.0),
    (24.0, 22.0),
    (12.0, 22.0),
    (12.0, 12.0),
    (0.0, 12.0),
)
STAIR = ((9.4, 6.4), (12.0, 11.6))  # plan corners of the stair opening [m]
STAIR_STOREYS = ("Level 2", "Level 3")


@dataclass(frozen=True, slots=True)
class WallType:
    """A wall type: name, PredefinedType and layers (material, thickness [m])."""

    key: str
    name: str
    predefined_type: str
    layers: tuple[tuple[str, float], ...]

    @property
    def thickness(self) -> float:
        """Total layer thickness [m]."""
        return sum(t for _, t in self.layers)

    @property
    def shear(self) -> bool:
        """True for a shear wall type."""
        return self.predefined_type == "SHEAR"


PLY, GWB = "Structural I plywood 15/32 in", "Gypsum board 5/8 in Type X"
_SHEAR = ((PLY, 0.012), ("SPF stud framing 2x6", 0.140), (GWB, 0.016))
_PARTITION = ((GWB, 0.016), ("SPF stud framing 2x4", 0.089), (GWB, 0.016))
WALL_TYPES = {
    "SW-A": WallType("SW-A", "SW-A 15/32 Str I 10d @6", "SHEAR", _SHEAR),
    "SW-B": WallType("SW-B", "SW-B 15/32 Str I 10d @3", "SHEAR", _SHEAR),
    "PT-1": WallType("PT-1", "PT-1 2x4 GWB partition", "PARTITIONING", _PARTITION),
}


@dataclass(frozen=True, slots=True)
class Hole:
    """A window or door opening in a wall [m]."""

    n: int
    kind: str  # "window" or "door"
    start: float
    end: float
    sill: float
    head: float


def window(n: int, start: float, width: float = 1.5) -> Hole:
    """A window, sill 0.9 m and head 2.1 m above the wall base."""
    return Hole(n, "window", start, start + width, 0.9, 2.1)


def door(n: int, start: float, width: float = 0.9) -> Hole:
    """A door, head 2.1 m above the wall base."""
    return Hole(n, "door", start, start + width, 0.0, 2.1)


@dataclass(frozen=True, slots=True)
class Wall:
    """One IfcWall; it stands on ``storey`` and rises through ``spans`` storeys."""

    tag: str
    storey: str
    start: tuple[float, float]
    end: tuple[float, float]
    wall_type: str
    role: str
    openings: tuple[Hole, ...] = ()
    spans: int = 1
    load_bearing: bool | None = True  # None: no Pset_WallCommon at all
    external: bool = False

    @property
    def length(self) -> float:
        """Centreline length [m]."""
        return math.dist(self.start, self.end)

    @property
    def guid(self) -> str:
        """The wall's GlobalId."""
        return stable_guid(f"wall/{self.tag}")


def stable_guid(key: str) -> str:
    """IFC GlobalId (22 characters) derived from a stable element key with uuid5."""
    chars = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz_$"
    n = uuid.uuid5(NAMESPACE, key).int  # the same as ifcopenshell.guid.compress(u.hex)
    return "".join(chars[(n >> (6 * i)) & 63] for i in reversed(range(22)))


def storey_index(name: str) -> int:
    """Position of a storey in STOREYS."""
    return [s.name for s in STOREYS].index(name)


def wall_base_top(wall: Wall) -> tuple[float, float]:
    """Base (storey elevation) and top (underside of the slab ``spans`` up) [m]."""
    i = storey_index(wall.storey)
    above = STOREYS[i + wall.spans]
    return STOREYS[i].elevation, round(above.elevation - above.depth, 9)


def _exterior(s: Storey, revision: int) -> list[Wall]:
    t = "SW-B" if s.tag == "L1" else "SW-A"
    entry = door(3, 8.5) if s.tag == "L1" else window(3, 8.5)
    east = 2.0 if (revision == 2 and s.tag == "L1") else 1.5  # rev 2 widens it
    spec = (
        ("S1", (0, 0), (12, 0), t, (window(1, 1.5), window(2, 5.0), entry)),
        (
            "S2",
            (12, 0),
            (24, 0),
            t,
            (window(1, 2.0), window(2, 4.5), window(3, 10 - east, east)),
        ),
        ("E1", (24, 0), (24, 12), t, (window(1, 2.0), window(2, 8.5))),
        ("E2", (24, 12), (24, 22), t, (window(1, 4.0),)),
        ("N2", (24, 22), (12, 22), t, (window(1, 2.0), window(2, 8.0))),
        ("W2", (12, 22), (12, 12), t, (window(1, 3.0),)),
        ("N1", (12, 12), (0, 12), "SW-B", (window(1, 2.0), window(2, 7.0))),
        ("W1", (0, 12), (0, 0), t, (window(1, 2.0), window(2, 8.0))),
    )
    role = "exterior shear wall"
    return [
        Wall(f"{s.tag}-{k}", s.name, a, b, wt, role, holes, external=True)
        for k, a, b, wt, holes in spec
    ]


def _interior(s: Storey, revision: int) -> list[Wall]:
    n, tag, stair = s.name, s.tag, ((12.0, 6.4), (12.0, 11.6))
    d1 = "SW-A" if tag == "L3" else "SW-B"
    out = [
        Wall(
            f"{tag}-D1",
            n,
            (18, 0),
            (18, 12),
            d1,
            "demising shear wall",
            (door(1, 5.5, 1.0),),
        ),
        Wall(f"{tag}-P1", n, (6, 0), (6, 6), "PT-1", "partition", load_bearing=False),
        Wall(f"{tag}-P2", n, (6, 6), (6, 12), "PT-1", "partition", load_bearing=False),
        Wall(
            f"{tag}-P3", n, (12, 17), (24, 17), "PT-1", "partition", load_bearing=False
        ),
    ]
    ns_line = ((15, 19.5), (21, 19.5))
    if tag == "L1":
        out.append(Wall("L1-C1", n, (2, 6), (9.2, 6), "SW-B", "corridor shear wall"))
        out.append(Wall("L1-STE", n, *stair, "SW-B", "stair-tower shear wall", spans=2))
        if revision == 2:
            out.append(
                Wall("L1-NSB", n, *ns_line, "SW-A", "shear wall added under L2-NSB")
            )
    if tag == "L2" and revision == 1:  # short, 6 in nailing: overstressed
        out.append(Wall("L2-C1", n, (4.5, 6), (6.5, 6), "SW-A", "corridor shear wall"))
    if tag == "L2" and revision == 2:
        out.append(Wall("L2-C1", n, (2, 6), (9.2, 6), "SW-B", "corridor shear wall"))
        out.append(Wall("L2-NSB", n, *ns_line, "SW-A", "shear wall added under L3-NS"))
    if tag == "L3":
        out.append(Wall("L3-STE", n, *stair, "SW-A", "stair-tower shear wall"))
        out.append(Wall("L3-NS", n, *ns_line, "SW-A", "shear wall on no wall below"))
    return out


# Pset_WallCommon.LoadBearing wrong (or the pset missing) on purpose, like real exports.
WRONG_LOAD_BEARING = {"L2-E2": False, "L3-D1": False, "L1-P1": True, "L3-P2": None}


def plan(revision: int) -> tuple[Wall, ...]:
    """Every IfcWall of one revision (1 or 2), storey by storey."""
    walls: list[Wall] = []
    for s in STOREYS[:3]:
        walls += _exterior(s, revision) + _interior(s, revision)
    for i, w in enumerate(walls):
        if w.tag in WRONG_LOAD_BEARING:
            walls[i] = replace(w, load_bearing=WRONG_LOAD_BEARING[w.tag])
        if w.tag == "L2-P3" and revision == 2:  # moved 1.0 m south
            walls[i] = replace(w, start=(12, 16), end=(24, 16))
    return tuple(walls)


REV2_CHANGES = (
    (
        "L2-C1",
        "lengthened from 2.0 m (X 4.5-6.5) to 7.2 m (X 2.0-9.2), retyped SW-A -> SW-B",
    ),
    ("L2-NSB", "added at Level 2 under L3-NS (Y 19.5, X 15.0-21.0, SW-A)"),
    ("L1-NSB", "added at Level 1 under L2-NSB (Y 19.5, X 15.0-21.0, SW-A)"),
    ("L2-P3", "partition moved 1.0 m south (Y 17.0 -> 16.0)"),
    ("L1-S2", "window 3 widened from 1.5 m (8.5-10.0) to 2.0 m (8.0-10.0)"),
)


def piers(wall: Wall) -> list[tuple[float, float]]:
    """Full-height pieces of a wall between its openings, (start, end) [m]."""
    edge, out = 0.0, []
    for hole in sorted(wall.openings, key=lambda h: h.start):
        if hole.start > edge:
            out.append((edge, hole.start))
        edge = hole.end
    if wall.length > edge:
        out.append((edge, wall.length))
    return out


def polygon_area(points: tuple[tuple[float, float], ...]) -> float:
    """Shoelace area of a simple polygon [m²]."""
    pts = [*points, points[0]]
    return abs(sum(x0 * y1 - x1 * y0 for (x0, y0), (x1, y1) in pairwise(pts))) / 2


def _r(v: float) -> float:
    return round(v, 9)


def _wall_record(w: Wall) -> dict:
    wt, (base, top) = WALL_TYPES[w.wall_type], wall_base_top(w)
    holes = [
        {
            "guid": stable_guid(f"opening/{w.tag}/{h.n}"),
            "kind": h.kind,
            "filled_by": stable_guid(f"{h.kind}/{w.tag}/{h.n}"),
            "start": _r(h.start),
            "end": _r(h.end),
            "sill": h.sill,
            "head": h.head,
        }
        for h in w.openings
    ]
    spans = [s.name for s in STOREYS[storey_index(w.storey) :][: w.spans]]
    return {
        "guid": w.guid,
        "name": w.tag,
        "storey": w.storey,
        "spans_storeys": spans,
        "role": w.role,
        "type_name": wt.name,
        "predefined_type": wt.predefined_type,
        "shear": wt.shear,
        "start": [float(v) for v in w.start],
        "end": [float(v) for v in w.end],
        "length": _r(w.length),
        "thickness": _r(wt.thickness),
        "base": base,
        "top": top,
        "load_bearing": w.load_bearing,
        "external": w.external,
        "piers": [[_r(a), _r(b)] for a, b in piers(w)],
        "openings": holes,
    }


def _storey_records(walls: tuple[Wall, ...]) -> list[dict]:
    (x0, y0), (x1, y1) = STAIR
    out = []
    for i, s in enumerate(STOREYS):
        own = [w for w in walls if w.storey == s.name]
        first = storey_index
        on = [w for w in walls if first(w.storey) <= i < first(w.storey) + w.spans]
        void = _r((x1 - x0) * (y1 - y0)) if s.name in STAIR_STOREYS else 0.0
        out.append(
            {
                "name": s.name,
                "guid": stable_guid(f"storey/{s.name}"),
                "elevation": s.elevation,
                "slab_guid": stable_guid(f"slab/{s.name}"),
                "slab_kind": s.slab,
                "slab_top": s.elevation,
                "slab_depth": s.depth,
                "slab_outline_area": polygon_area(OUTLINE),
                "opening_area": void,
                "diaphragm_area": _r(polygon_area(OUTLINE) - void),
                "ifc_walls": len(own),
                "shear_walls": sum(WALL_TYPES[w.wall_type].shear for w in own),
                "wall_segments": len(on),
                "shear_wall_segments": sum(WALL_TYPES[w.wall_type].shear for w in on),
            }
        )
    return out


def _slender_piers(walls: tuple[Wall, ...]) -> list[dict]:
    out = []
    for w in walls:
        base, top = wall_base_top(w)
        for a, b in piers(w):
            if WALL_TYPES[w.wall_type].shear and (top - base) / (b - a) > 2.0:
                out.append(
                    {
                        "guid": w.guid,
                        "name": w.tag,
                        "pier": [_r(a), _r(b)],
                        "width": _r(b - a),
                        "height": _r(top - base),
                        "h_over_b": _r((top - base) / (b - a)),
                    }
                )
    return out


def _special(walls: tuple[Wall, ...], revision: int) -> dict:
    g = {w.tag: w.guid for w in walls}
    wrong = WRONG_LOAD_BEARING.items()
    return {
        "overstressed": [g["L2-C1"]] if revision == 1 else [],
        "non_stacking": [g["L3-NS"]] if revision == 1 else [],
        "through_storey": [g["L1-STE"]],
        "line_stops_below_top": [g["L1-C1"], g["L2-C1"]],
        "walls_with_openings": sorted(w.guid for w in walls if w.openings),
        "high_aspect_ratio_piers": _slender_piers(walls),
        "load_bearing_wrong": sorted(g[t] for t, v in wrong if v is not None),
        "pset_wall_common_missing": sorted(g[t] for t, v in wrong if v is None),
        "reentrant_corner": {
            "corner": [12.0, 12.0],
            "projection_x": 12.0,
            "plan_x": 24.0,
            "projection_y": 10.0,
            "plan_y": 22.0,
        },
    }


def scenario() -> dict:
    """The authoring inputs, for tests of the reader and the checks (SI: m, m²)."""
    revisions = {}
    for rev in (1, 2):
        walls = plan(rev)
        revisions[str(rev)] = {
            "ifc_walls": len(walls),
            "storeys": _storey_records(walls),
            "special": _special(walls, rev),
            "walls": [_wall_record(w) for w in walls],
        }
    files = {
        name: {
            "revision": rev,
            "schema": schema,
            "length_unit": unit,
            "length_unit_scale": FOOT if unit == "ft" else 1.0,
        }
        for name, (rev, schema, unit) in FILES.items()
    }
    return {
        "schema": "shearline.demo-scenario/1",
        "units": {"length": "m", "area": "m2"},
        "project": PROJECT,
        "note": "Invented building for the shearline demo; written by author_demo.py.",
        "plan": {
            "outline": [list(p) for p in OUTLINE],
            "stair_opening": [list(p) for p in STAIR],
            "stair_opening_storeys": list(STAIR_STOREYS),
        },
        "files": files,
        "revisions": revisions,
        "rev2_changes": [
            {"guid": stable_guid(f"wall/{tag}"), "name": tag, "change": text}
            for tag, text in REV2_CHANGES
        ],
    }
