"""Read IfcWall entities (subtypes included) into story-high wall segments.

Plan centreline and thickness come from the body footprint's oriented rectangle (the
'Axis' gives only the direction: it is often a face); base and top from the body's
z-range (a clipped wall gives its clipped height). Openings are intervals along the
centreline. World X-Y, metres, Z up.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass

import ifcopenshell
import numpy as np
from numpy.typing import NDArray

from ifc_bridge._centreline import Centreline, centreline, centrelines_along
from ifc_bridge._direct import body_extrusion
from ifc_bridge._geometry import Mesh
from ifc_bridge._openings import wall_openings
from ifc_bridge._prepare_walls import PreparedWall, prepare_walls
from ifc_bridge._relations import Relations, build_relations
from ifc_bridge._semantics import WallSemantics
from ifc_bridge._split import split_fields
from ifc_bridge.model import ImportIssue, IssueSeverity, Level, WallSegment
from ifc_bridge.read_slabs import level_below
from ifc_bridge.shear_walls import MatchRule, match_assembly

__all__ = ["PreparedWall", "WallPlan", "WallsRead", "prepare_walls", "read_walls"]

_MIN_LENGTH = 1e-3  # [m]
_THICKNESS_TOL = 0.005  # [m]; geometry vs material layers


@dataclass(frozen=True, slots=True, kw_only=True)
class WallPlan:
    """A wall's whole plan rectangle, before splitting (for matching doors).

    Attributes:
        guid: GlobalId of the IfcWall.
        line: Its centreline [m].
        base: Base elevation [m].
        top: Top elevation [m].
    """

    guid: str
    line: Centreline
    base: float
    top: float


@dataclass(frozen=True, slots=True, kw_only=True)
class WallsRead:
    """What the wall reader found.

    Attributes:
        segments: Wall segments, file order, bottom-up within a wall.
        wall_storeys: ``(GlobalId, storey name)`` for every IfcWall.
        plans: Whole-wall plan rectangles of the walls with geometry.
        issues: Problems found.
    """

    segments: tuple[WallSegment, ...]
    wall_storeys: tuple[tuple[str, str], ...]
    plans: tuple[WallPlan, ...]
    issues: tuple[ImportIssue, ...]


def _issue(
    code: str, severity: IssueSeverity, msg: str, guid: str, storey: str = ""
) -> ImportIssue:
    return ImportIssue(
        code=code, severity=severity, message=msg, guids=(guid,), storey=storey
    )


def _body(
    wall: ifcopenshell.entity_instance,
    meshes: Mapping[int, Mesh],
    scale: float,
    cache: dict[int, NDArray[np.float64]],
) -> tuple[NDArray[np.float64], float, float] | None:
    mesh = meshes.get(wall.id())
    if mesh is not None:
        return mesh.verts[:, :2], mesh.zmin, mesh.zmax
    ext = body_extrusion(wall, scale, cache)
    if ext is None:
        return None
    return np.asarray(ext.footprint.convex_hull.exterior.coords), ext.zmin, ext.zmax


def _thickness(
    wall: ifcopenshell.entity_instance,
    line: Centreline,
    sem: WallSemantics,
    curved: bool,
    path: str,
    issues: list[ImportIssue],
) -> float:
    layers = sem.layer_thickness
    if curved:
        thickness = layers if layers is not None else line.thickness
        msg = (
            f"{path}: wall {wall.GlobalId} ({sem.name!r}) is curved; read as its chord "
            f"{line.length:.3f} m long, {thickness:.3f} m thick; "
            "split it into straight walls"
        )
        issues.append(_issue("wall_curved", IssueSeverity.WARNING, msg, wall.GlobalId))
        return thickness
    if layers is not None and abs(layers - line.thickness) > _THICKNESS_TOL:
        msg = (
            f"{path}: wall {wall.GlobalId} ({sem.name!r}) is {line.thickness:.3f} m "
            f"thick in its geometry but its material layers total {layers:.3f} m; "
            "the geometry is used"
        )
        issues.append(
            _issue("wall_thickness_mismatch", IssueSeverity.INFO, msg, wall.GlobalId)
        )
    return line.thickness


def _recognise(
    whole: dict, ctx: _Context, memo: dict[tuple, tuple[bool, str]]
) -> tuple[bool, str]:
    """``(is_shear_wall, assembly)`` as :func:`recognise_shear_walls` sets them."""
    key = (
        whole["type_name"],
        whole["name"] if ctx.rules_use_name else "",
        whole["materials"],
        whole["properties"],
        whole["predefined_type"],
    )
    found = memo.get(key)
    if found is None:
        assembly = match_assembly(WallSegment(**whole), ctx.rules or ())
        is_shear = bool(assembly) or (
            ctx.use_predefined_type and whole["predefined_type"].upper() == "SHEAR"
        )
        found = memo[key] = (is_shear, assembly)
    return found


def _read_one(
    prep: PreparedWall,
    ctx: _Context,
    body: tuple[NDArray[np.float64], float, float] | None,
    line: Centreline | None,
) -> tuple[str, tuple[WallSegment, ...], WallPlan | None, list[ImportIssue]]:
    issues: list[ImportIssue] = []
    wall, guid, container = prep.wall, prep.guid, prep.container
    storey = ctx.name_of.get(container.id(), "") if container is not None else ""
    if body is None:
        msg = (
            f"{ctx.path}: wall {guid} ({wall.Name!r}) has no usable body geometry; not "
            "analysed; give it a solid 'Body' representation"
        )
        return (
            storey,
            (),
            None,
            [_issue("wall_no_geometry", IssueSeverity.ERROR, msg, guid, storey)],
        )
    pts, base, top = body
    axis = prep.axis
    if line is None:
        line = centreline(pts, None if axis.curved else axis.direction)
    if (
        line is None
        or line.length < _MIN_LENGTH
        or line.thickness <= 0.0
        or top - base <= 0.0
    ):
        msg = (
            f"{ctx.path}: wall {guid} ({wall.Name!r}) has zero length, thickness or "
            "height "
            "in its geometry; not analysed; fix its 'Body' representation"
        )
        return (
            storey,
            (),
            None,
            [_issue("wall_no_geometry", IssueSeverity.ERROR, msg, guid, storey)],
        )
    sem = prep.semantics
    thickness = _thickness(wall, line, sem, axis.curved, ctx.path, issues)
    if not storey:
        lv = level_below(ctx.levels, base)
        storey = lv.name
        msg = (
            f"{ctx.path}: wall {guid} ({sem.name!r}) is in no storey; read as "
            "standing on "
            f"{storey!r} from its base z = {base:.3f} m; contain it in a storey"
        )
        issues.append(
            _issue("wall_not_in_storey", IssueSeverity.WARNING, msg, guid, storey)
        )
    ops = wall_openings(
        wall,
        line,
        base=base,
        top=top,
        meshes=ctx.meshes,
        scale=ctx.scale,
        cache=ctx.cache,
        path=ctx.path,
        openings=ctx.relations.openings_of(wall),
        fills=ctx.relations.fills,
    )
    issues.extend(ops.issues)
    whole = {  # the WallSegment of the whole wall, built once per part
        "guid": guid,
        "name": sem.name,
        "storey": storey,
        "level": "",
        "part": 0,
        "base_elevation": base,
        "top_elevation": top,
        "start": line.start,
        "end": line.end,
        "thickness": thickness,
        "openings": ops.openings,
        "type_name": sem.type_name,
        "materials": sem.materials,
        "predefined_type": sem.predefined_type,
        "properties": sem.properties,
        "is_shear_wall": False,
        "assembly": "",
        "curved": axis.curved,
    }
    if ctx.rules is not None:
        whole["is_shear_wall"], whole["assembly"] = _recognise(whole, ctx, ctx.memo)
    storey_elevation = ctx.elevation_of[storey]
    parts = split_fields(
        whole, ctx.diaphragm_levels, storey_elevation=storey_elevation, reach=ctx.reach
    )
    return storey, parts, WallPlan(guid=guid, line=line, base=base, top=top), issues


def _straight_lines(
    prepared: Sequence[PreparedWall],
    bodies: Sequence[tuple[NDArray[np.float64], float, float] | None],
) -> list[Centreline | None]:
    """Centrelines of the straight walls with an Axis direction, all at once.

    The others (curved, no Axis, no body) get None and are done one by one.
    """
    out: list[Centreline | None] = [None] * len(prepared)
    todo = [
        k
        for k, (p, b) in enumerate(zip(prepared, bodies, strict=True))
        if b is not None and not p.axis.curved and p.axis.direction is not None
    ]
    if not todo:
        return out
    lines = centrelines_along(
        [bodies[k][0] for k in todo],
        np.asarray([prepared[k].axis.direction for k in todo], dtype=np.float64),
    )
    for k, line in zip(todo, lines, strict=True):
        out[k] = line
    return out


def _first_elevations(levels: tuple[Level, ...]) -> dict[str, float]:
    out: dict[str, float] = {}
    for lv in levels:
        out.setdefault(lv.name, lv.elevation)  # as next(...) over the levels finds it
    return out


@dataclass(frozen=True, slots=True, kw_only=True)
class _Context:
    path: str
    scale: float
    levels: tuple[Level, ...]
    diaphragm_levels: tuple[Level, ...]
    name_of: Mapping[int, str]
    meshes: Mapping[int, Mesh]
    cache: dict[int, NDArray[np.float64]]
    reach: Mapping[str, float]
    relations: Relations
    elevation_of: Mapping[str, float]
    rules: tuple[MatchRule, ...] | None
    use_predefined_type: bool
    memo: dict[tuple, tuple[bool, str]]
    rules_use_name: bool


def read_walls(
    ifc: ifcopenshell.file,
    path: str,
    *,
    scale: float,
    levels: tuple[Level, ...],
    name_of: Mapping[int, str],
    meshes: Mapping[int, Mesh],
    cache: dict[int, NDArray[np.float64]],
    reach: Mapping[str, float] | None = None,
    relations: Relations | None = None,
    prepared: Sequence[PreparedWall] | None = None,
    rules: Sequence[MatchRule] | None = None,
    use_predefined_type: bool = True,
) -> WallsRead:
    """Wall segments of every IfcWall, split at the diaphragm levels they pass.

    Common practice: a wall's centreline is the mid-line of its plan rectangle; a
    wall through several floors is one segment per story.

    Args:
        ifc: The open file.
        path: File name, for messages.
        scale: Length unit scale [m per file unit].
        levels: Levels sorted by elevation, with ``is_diaphragm_level`` final.
        name_of: IfcBuildingStorey entity id -> level name.
        meshes: Meshes by entity id, world coordinates [m].
        cache: Placement memo.
        reach: Level name -> how far below a level a wall top may stop and still
            support it (slab depth + 0.05 m, at least 0.15 m) [m].
        relations: The file's relationship maps (built here when not given).
        prepared: :func:`prepare_walls` of the file's walls, when already read.
        rules: Assembly match rules: recognise shear walls while reading, as
            :func:`ifc_bridge.shear_walls.recognise_shear_walls` would; None leaves
            every segment unrecognised.
        use_predefined_type: With ``rules``: PredefinedType SHEAR is a shear wall.

    Returns:
        Segments, the storey of every wall, plan rectangles and issues.
    """
    ctx = _Context(
        path=path,
        scale=scale,
        levels=levels,
        diaphragm_levels=tuple(lv for lv in levels if lv.is_diaphragm_level),
        name_of=name_of,
        meshes=meshes,
        cache=cache,
        reach=dict(reach or {}),
        relations=relations if relations is not None else build_relations(ifc),
        elevation_of=_first_elevations(levels),
        rules=tuple(rules) if rules is not None else None,
        use_predefined_type=use_predefined_type,
        memo={},
        rules_use_name=any(r.name is not None for r in rules or ()),
    )
    if prepared is None:
        prepared = prepare_walls(
            ifc.by_type("IfcWall"), scale=scale, cache=cache, relations=ctx.relations
        )
    segments: list[WallSegment] = []
    storeys: list[tuple[str, str]] = []
    plans: list[WallPlan] = []
    issues: list[ImportIssue] = []
    bodies = [
        p.body if p.body is not None else _body(p.wall, ctx.meshes, ctx.scale, ctx.cache)
        for p in prepared
    ]
    lines = _straight_lines(prepared, bodies)
    for prep, body, line in zip(prepared, bodies, lines, strict=True):
        storey, parts, plan, found = _read_one(prep, ctx, body, line)
        storeys.append((parts[0].guid if parts else prep.guid, storey))
        segments.extend(parts)
        issues.extend(found)
        if plan is not None:
            plans.append(plan)
    return WallsRead(
        segments=tuple(segments),
        wall_storeys=tuple(storeys),
        plans=tuple(plans),
        issues=tuple(issues),
    )
