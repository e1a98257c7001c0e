"""Diaphragms of each level from its slab plans, and which levels are diaphragm levels.

Slab plans of one level are unioned (gaps under 10 mm closed, mitred corners kept);
each connected region is one diaphragm, ``"<level>/D<n>"`` with n from 1 by
decreasing area. World X-Y, metres.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Sequence

import shapely
from shapely.geometry import MultiPolygon, Polygon

from ifc_bridge.errors import IfcContentError
from ifc_bridge.model import Diaphragm, ImportIssue, IssueSeverity, Level
from ifc_bridge.read_levels import clean_elevation
from ifc_bridge.read_slabs import SlabPlan

__all__ = ["build_diaphragms", "polygons_of", "underside_reach"]

_GAP = 0.005  # [m]; half the gap between slabs that still joins them
_MIN_AREA = 0.05  # [m2]; smaller regions are slivers, not diaphragms
_MAX_DEPTH = 1.0  # [m]; deeper (sloped roofs) is not a slab depth
_REACH_MIN, _REACH_EXTRA = 0.15, 0.05  # [m]


def underside_reach(
    diaphragms: Sequence[Diaphragm], plans: Sequence[SlabPlan], levels: Sequence[Level]
) -> dict[str, float]:
    """How far below each level a wall top may stop and still support its diaphragm.

    Common practice: walls stop at the underside of the floor structure; the reach is
    the depth of the level's slabs below its elevation plus 0.05 m, at least 0.15 m.

    Args:
        diaphragms: Diaphragms read.
        plans: Slab plans read.
        levels: Levels.

    Returns:
        Level name -> reach [m].
    """
    by_guid = {p.guid: p for p in plans}
    out: dict[str, float] = {}
    for lv in levels:
        depths = [
            lv.elevation - by_guid[g].bottom
            for d in diaphragms
            if d.level == lv.name
            for g in d.slab_guids
        ]
        depths = [x for x in depths if 0.0 < x <= _MAX_DEPTH]
        out[lv.name] = max([_REACH_MIN, *(x + _REACH_EXTRA for x in depths)])
    return out


def polygons_of(geom: object) -> list[Polygon]:
    """The polygons of a (multi)polygon or geometry collection."""
    if isinstance(geom, Polygon):
        return [geom] if not geom.is_empty else []
    if isinstance(geom, MultiPolygon) or hasattr(geom, "geoms"):
        return [p for g in geom.geoms for p in polygons_of(g)]
    return []


def _level_diaphragms(
    level: str, plans: Sequence[SlabPlan], path: str
) -> tuple[list[Diaphragm], list[ImportIssue]]:
    union = shapely.union_all([p.net for p in plans])
    union = union.buffer(_GAP, join_style="mitre").buffer(-_GAP, join_style="mitre")
    regions = sorted(polygons_of(shapely.make_valid(union)), key=lambda p: -p.area)
    out, issues = [], []
    for region in regions:
        members = [p for p in plans if p.net.intersection(region).area > 1e-6]
        guids = tuple(sorted(p.guid for p in members))
        if region.area < _MIN_AREA or not members:
            msg = (
                f"{path}: storey {level!r}: slab region of {region.area:.3f} m2 from "
                f"{', '.join(guids) or 'no slab'} is a sliver; ignored"
            )
            issues.append(
                ImportIssue(
                    code="slab_sliver",
                    severity=IssueSeverity.INFO,
                    message=msg,
                    guids=guids,
                    storey=level,
                )
            )
            continue
        area_by_kind: dict[str, float] = {}
        for p in members:
            area_by_kind[p.kind] = area_by_kind.get(p.kind, 0.0) + p.net.area
        kind = max(sorted(area_by_kind), key=lambda k: area_by_kind[k])
        out.append(
            Diaphragm(
                id=f"{level}/D{len(out) + 1}",
                level=level,
                polygon=region,
                slab_guids=guids,
                kind=kind,
                elevation=clean_elevation(max(p.top for p in members)),
            )
        )
    return out, issues


def build_diaphragms(
    plans: Sequence[SlabPlan],
    levels: tuple[Level, ...],
    *,
    diaphragm_storeys: Sequence[str],
    path: str,
) -> tuple[tuple[Level, ...], tuple[Diaphragm, ...], tuple[ImportIssue, ...]]:
    """Diaphragms per level, and the levels with ``is_diaphragm_level`` set.

    Common practice: a level with floor or roof slabs is a diaphragm level; the
    config's ``diaphragm_storeys``, when given, decides instead.

    Args:
        plans: Slab plans with their level names.
        levels: Levels sorted by elevation.
        diaphragm_storeys: Level names from the config, or empty.
        path: File name, for messages.

    Returns:
        Levels (flag set), diaphragms, issues.

    Raises:
        IfcContentError: A name in ``diaphragm_storeys`` is not a storey.
    """
    names = [lv.name for lv in levels]
    unknown = [n for n in diaphragm_storeys if n not in names]
    if unknown:
        msg = (
            f"{path}: diaphragm_storeys names {', '.join(map(repr, unknown))}, "
            "not storeys "
            f"of the file; use one of {', '.join(map(repr, names))}"
        )
        raise IfcContentError(msg)
    issues: list[ImportIssue] = []
    diaphragms: list[Diaphragm] = []
    for lv in levels:
        found, extra = _level_diaphragms(
            lv.name, [p for p in plans if p.storey == lv.name], path
        )
        issues.extend(extra)
        diaphragms.extend(found)
    with_slabs = {d.level for d in diaphragms}
    chosen = set(diaphragm_storeys) if diaphragm_storeys else with_slabs
    out_levels = tuple(
        dataclasses.replace(lv, is_diaphragm_level=lv.name in chosen) for lv in levels
    )
    for lv in out_levels:
        if lv.is_diaphragm_level and lv.name not in with_slabs:
            msg = (
                f"{path}: storey {lv.name!r} ({lv.guid}) is named in diaphragm_storeys "
                "but has "
                "no floor or roof slab; its diaphragm has no outline; model its slab"
            )
            issues.append(
                ImportIssue(
                    code="diaphragm_level_no_slab",
                    severity=IssueSeverity.WARNING,
                    message=msg,
                    guids=(lv.guid,),
                    storey=lv.name,
                )
            )
        elif not lv.is_diaphragm_level:
            why = (
                "has no FLOOR, ROOF or BASESLAB slab"
                if lv.name not in with_slabs
                else "is not named in diaphragm_storeys"
            )
            msg = f"{path}: storey {lv.name!r} ({lv.guid}) {why}; not a diaphragm level"
            issues.append(
                ImportIssue(
                    code="level_no_diaphragm",
                    severity=IssueSeverity.INFO,
                    message=msg,
                    guids=(lv.guid,),
                    storey=lv.name,
                )
            )
    kept = tuple(d for d in diaphragms if d.level in chosen)
    return out_levels, kept, tuple(issues)
