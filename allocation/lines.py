"""Lines of resistance: piers parallel to a direction grouped by perpendicular offset.

Axes: plan X-Y [m]. A line acting in X (walls parallel to X) has its ``offset`` in y
and runs along x; a line acting in Y has its offset in x and runs along y. "Along"
below means x for an X line and y for a Y line.

Grouping is single-linkage along the sorted pier offsets: a pier joins the current line
when its offset is within ``line_tolerance`` of the previous pier's offset, so a line's
total spread may exceed the tolerance when many piers step a little each (common
practice: the engineer's tolerance is on the gap between neighbouring walls).

A line supports a diaphragm region over each full crossing (chord) of the region that
its walls physically cut: of the chords of the infinite line at the offset (holes
excluded), those that overlap the walls' extent. A line within 1e-6 m of a slab
vertex's coordinate is taken exactly at it, so round-off in the offset cannot move it
off an edge it runs along. Where the walls stop short of the
chord, collectors are assumed (DESIGN.md item 5). When the walls sit just outside the
slab edge, the chord is taken at the nearest slab edge within ``line_tolerance``.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from itertools import repeat

import numpy as np

from allocation._columns import ends as end_points
from allocation._crossing import (
    Crossing,
    RegionProbe,
    crossing_on,
    line_crossing,
    merge_intervals,
    region_crossings,
)
from allocation._memo import Memo, float_bytes, wkb_of
from allocation._records import maker
from allocation.parameters import AnalysisOptions
from allocation.results import Condition, ConditionKind, Pier, ResistanceLine
from ifc_bridge.model import Diaphragm, Direction

__all__ = [
    "Crossing",
    "along",
    "find_lines",
    "group_lines",
    "line_crossing",
    "perpendicular",
    "region_crossings",
]


def perpendicular(point: tuple[float, float], direction: Direction) -> float:
    """Coordinate across a line acting in ``direction``: y for X, x for Y [m]."""
    return float(point[1] if direction is Direction.X else point[0])


def along(point: tuple[float, float], direction: Direction) -> float:
    """Coordinate along a line acting in ``direction``: x for X, y for Y [m]."""
    return float(point[0] if direction is Direction.X else point[1])


# A pier as the grouping sees it: (pier, mid-point offset, along-span start and end,
# length, smaller and larger end-point offsets) [m]; the same numbers, computed once,
# that perpendicular(), along() and Pier.length give.
_Placed = tuple[Pier, float, float, float, float, float, float]


def _placed(piers: Sequence[Pier], direction: Direction) -> list[_Placed]:
    """Each pier as the grouping sees it, worked out on arrays (the same floats)."""
    if not piers:
        return []
    ends = end_points(piers)
    s0, s1, e0, e1 = ends[:, 0, 0], ends[:, 0, 1], ends[:, 1, 0], ends[:, 1, 1]
    dx, dy = e0 - s0, e1 - s1
    if direction is Direction.X:  # along x, across y
        a, b, u, w, off = s0, e0, s1, e1, (s1 + e1) / 2.0
    else:
        a, b, u, w, off = s1, e1, s0, e0, (s0 + e0) / 2.0
    # min() and max() of two, as the builtins choose between equal values
    lo, hi = np.where(b < a, b, a), np.where(b > a, b, a)
    off_lo, off_hi = np.where(w < u, w, u), np.where(w > u, w, u)
    length = map(
        float.__pow__, (dx * dx + dy * dy).tolist(), repeat(0.5)
    )  # Pier.length
    return list(
        zip(
            piers,
            off.tolist(),
            lo.tolist(),
            hi.tolist(),
            length,
            off_lo.tolist(),
            off_hi.tolist(),
            strict=True,
        )
    )


def _cluster(piers: list[_Placed], tol: float) -> list[list[_Placed]]:
    ordered = sorted(piers, key=lambda q: (q[1], q[0].id))
    groups: list[list[_Placed]] = []
    last = None
    for q in ordered:
        off = q[1]
        if groups and last is not None and off - last <= tol:
            groups[-1].append(q)
        else:
            groups.append([q])
        last = off
    return groups


def _covered(
    spans: list[tuple[float, float]], chords: Iterable[tuple[float, float]]
) -> float:
    total = 0.0
    for a, b in chords:
        for s0, s1 in spans:
            total += max(0.0, min(b, s1) - max(a, s0))
    return total


def _make_line(
    group: list[_Placed],
    regions: Sequence[RegionProbe],
    *,
    line_id: str,
    level: str,
    direction: Direction,
    tolerance: float,
) -> ResistanceLine:
    group = sorted(group, key=lambda q: ((q[2], q[3]), q[0].id))
    length, moment = 0, 0  # sum() of lengths and of length x offset, in order
    lo, hi, off_lo, off_hi = group[0][2], group[0][3], group[0][5], group[0][6]
    for q in group:
        length += q[4]
        moment += q[4] * q[1]
        # min() / max() over the group: the first of equal values stays
        lo, hi = (q[2] if q[2] < lo else lo), (q[3] if q[3] > hi else hi)
        off_lo, off_hi = (
            (q[5] if q[5] < off_lo else off_lo),
            (q[6] if q[6] > off_hi else off_hi),
        )
    wall_length = float(length)
    fields = {
        "id": line_id,
        "level": level,
        "direction": direction,
        "offset": float(moment / wall_length),
        "piers": tuple(q[0].id for q in group),
        "wall_extent": (lo, hi),
        "wall_length": wall_length,
        "offset_range": (off_lo, off_hi),
    }
    line = ResistanceLine(**fields)
    merged = merge_intervals([(q[2], q[3]) for q in group])
    crossings, collector = [], 0.0
    for region in regions:
        c = crossing_on(line, region, tolerance)
        if c is None:
            continue
        crossings.append((region.diaphragm.id, c.length))
        collector += max(0.0, c.length - _covered(merged, c.segments))
    return ResistanceLine(
        **fields, crossings=tuple(crossings), collector_length=float(collector)
    )


def group_lines(
    piers: Sequence[Pier],
    diaphragms: Sequence[Diaphragm],
    *,
    level: str,
    level_index: int,
    options: AnalysisOptions,
) -> tuple[tuple[ResistanceLine, ...], dict[str, str], tuple[Condition, ...]]:
    """:func:`find_lines`, giving each grouped pier's line id instead of new piers.

    A level whose piers and regions are those of a level grouped before, to the bit
    (a typical floor), takes that grouping from memory: the same lines, with this
    level's names and pier ids.

    Returns:
        The lines, ``{pier id: line id}`` for the piers grouped, and the conditions.
    """
    regions = [d for d in diaphragms if d.level == level]
    tol = options.line_tolerance
    mine = {
        d: [p for p in piers if p.level == level and p.direction is d]
        for d in (Direction.X, Direction.Y)
    }
    key = (
        float_bytes((tol, len(regions))),
        tuple(wkb_of(d.polygon) for d in regions),
        *(end_points(m).tobytes() if m else b"" for m in mine.values()),
    )
    layout = _LAYOUTS.get(key, lambda: _layout(mine, regions, tol))
    if layout is None:  # piers at the same place along a line: ordered by id
        return _grouped(mine, regions, level, level_index, tol)
    lines: list[ResistanceLine] = []
    assigned: dict[str, str] = {}
    conditions: list[Condition] = []
    for direction, placed in layout:
        found = mine[direction]
        if not placed:
            conditions.append(_no_line(level, direction, _slabs(regions)))
        for n, g in enumerate(placed, start=1):
            line = _line(
                id=f"L{level_index}-{direction.value}-{n}",
                level=level,
                direction=direction,
                offset=g.offset,
                piers=tuple(found[i].id for i in g.order),
                wall_extent=g.wall_extent,
                wall_length=g.wall_length,
                offset_range=g.offset_range,
                crossings=tuple((regions[k].id, c) for k, c in g.crossings),
                collector_length=g.collector_length,
            )
            lines.append(line)
            for pid in line.piers:
                assigned[pid] = line.id
            if not line.crossings:
                group = [found[i] for i in g.order]
                conditions.append(_off_diaphragm(line, group))
    return tuple(lines), assigned, tuple(conditions)


@dataclass(frozen=True, slots=True)
class _Placement:
    """One line of a grouping, its piers by index in the level's list (private)."""

    order: tuple[int, ...]
    offset: float
    wall_extent: tuple[float, float]
    wall_length: float
    offset_range: tuple[float, float] | None
    crossings: tuple[tuple[int, float], ...]  # (region index, length [m])
    collector_length: float


_line = maker(ResistanceLine)  # ResistanceLine(...), for a typical floor's lines

# Each direction's lines of a level, by the exact numbers they are made of: the
# tolerance, the regions' outlines and the piers' end points in order.
_LAYOUTS: Memo[tuple[tuple[Direction, tuple[_Placement, ...]], ...] | None] = Memo(64)


def _layout(
    mine: dict[Direction, list[Pier]], regions: Sequence[Diaphragm], tol: float
) -> tuple[tuple[Direction, tuple[_Placement, ...]], ...] | None:
    """The grouping of :func:`_grouped` by pier index, or None where it depends on
    the pier ids (two piers of a line at the same place along it)."""
    lines, _, _ = _grouped(mine, regions, "", 0, tol)
    region_of = {d.id: k for k, d in enumerate(regions)}
    out = []
    for direction, found in mine.items():
        row = {p.id: i for i, p in enumerate(found)}
        # each pier's (start, end) along the line, which _make_line sorts on
        along = end_points(found)[:, :, 0 if direction is Direction.X else 1]
        placed = []
        for line in (ln for ln in lines if ln.direction is direction):
            order = tuple(row[pid] for pid in line.piers)
            spans = [tuple(sorted(along[i].tolist())) for i in order]
            if len(set(spans)) < len(spans):
                return None
            placed.append(
                _Placement(
                    order=order,
                    offset=line.offset,
                    wall_extent=line.wall_extent,
                    wall_length=line.wall_length,
                    offset_range=line.offset_range,
                    crossings=tuple((region_of[r], c) for r, c in line.crossings),
                    collector_length=line.collector_length,
                )
            )
        out.append((direction, tuple(placed)))
    return tuple(out)


def _slabs(regions: Sequence[Diaphragm]) -> tuple[str, ...]:
    return tuple(sorted({g for d in regions for g in d.slab_guids}))


def _grouped(
    mine: dict[Direction, list[Pier]],
    regions: Sequence[Diaphragm],
    level: str,
    level_index: int,
    tol: float,
) -> tuple[tuple[ResistanceLine, ...], dict[str, str], tuple[Condition, ...]]:
    """:func:`group_lines` worked out, direction by direction."""
    probes = [RegionProbe(d) for d in regions]
    lines: list[ResistanceLine] = []
    assigned: dict[str, str] = {}
    conditions: list[Condition] = []
    for direction, found in mine.items():
        groups = _cluster(_placed(found, direction), tol)
        if not groups:
            conditions.append(_no_line(level, direction, _slabs(regions)))
        for n, group in enumerate(groups, start=1):
            line_id = f"L{level_index}-{direction.value}-{n}"
            line = _make_line(
                group,
                probes,
                line_id=line_id,
                level=level,
                direction=direction,
                tolerance=tol,
            )
            lines.append(line)
            for q in group:
                assigned[q[0].id] = line_id
            if not line.crossings:
                conditions.append(_off_diaphragm(line, [q[0] for q in group]))
    return tuple(lines), assigned, tuple(conditions)


def find_lines(
    piers: Sequence[Pier],
    diaphragms: Sequence[Diaphragm],
    *,
    level: str,
    level_index: int,
    options: AnalysisOptions,
) -> tuple[tuple[ResistanceLine, ...], tuple[Pier, ...], tuple[Condition, ...]]:
    """Group the piers supporting one level into lines of resistance per direction.

    Common practice (DESIGN.md item 5): walls parallel to a direction whose
    perpendicular offsets lie within ``line_tolerance`` of each other form one line;
    the line's offset is the length-weighted mean of its piers' mid-point offsets.

    Args:
        piers: Piers (any levels; only those with ``level == level`` and a direction
            are grouped).
        diaphragms: Diaphragm regions (only those of ``level`` are used).
        level: Name of the level whose diaphragm the piers support.
        level_index: ``Level.index`` of that level, for the line ids.
        options: ``line_tolerance`` [m] is used.

    Returns:
        The lines (X first, each direction in increasing offset), the given piers in
        the same order with ``line`` set for those grouped, and the conditions: a
        direction with no line (``NO_LINE``) and a line that cuts no diaphragm region
        of the level (``WALL_OFF_DIAPHRAGM``).
    """
    lines, assigned, conditions = group_lines(
        piers, diaphragms, level=level, level_index=level_index, options=options
    )
    out = tuple(_with_line(p, assigned[p.id]) if p.id in assigned else p for p in piers)
    return lines, out, conditions


_PIER_FIELDS = tuple(
    f.name for f in dataclasses.fields(Pier) if f.init and f.name != "line"
)


def _with_line(pier: Pier, line: str) -> Pier:
    """``dataclasses.replace(pier, line=line)``, without its per-call field scan."""
    return Pier(**{name: getattr(pier, name) for name in _PIER_FIELDS}, line=line)


def _no_line(level: str, direction: Direction, slabs: tuple[str, ...]) -> Condition:
    detail = (
        f"level {level!r}: no line of shear walls resists force in {direction.value}; "
        f"add shear walls parallel to {direction.value} under this diaphragm"
    )
    return Condition(
        kind=ConditionKind.NO_LINE,
        level=level,
        direction=direction,
        guids=slabs,
        detail=detail,
    )


def _off_diaphragm(line: ResistanceLine, group: list[Pier]) -> Condition:
    axis = "y" if line.direction is Direction.X else "x"
    detail = (
        f"line {line.id} at {axis} = {line.offset:.3f} m: its walls cut no diaphragm "
        f"region of level {line.level!r}; they support no slab"
    )
    return Condition(
        kind=ConditionKind.WALL_OFF_DIAPHRAGM,
        level=line.level,
        direction=line.direction,
        guids=tuple(sorted({p.guid for p in group})),
        detail=detail,
        value=line.wall_length,
        ref=line.id,
    )
