"""Walls modelled twice: two IfcWall in the same place, usually a copy-paste slip.

Not a code provision (clause empty). A duplicate counts the wall's length twice on its
line, so the line looks stronger than it is. Severity: warning, pinned to both walls.
"""

from __future__ import annotations

import math
from collections import defaultdict
from collections.abc import Sequence
from operator import attrgetter

import numpy as np

from allocation._columns import ends as end_points
from checks.findings import Finding, Severity
from ifc_bridge.model import BuildingModel, WallSegment

__all__ = ["check_duplicate_walls", "overlap_fraction"]

RULE = "duplicate_wall"
_ANGLE = math.radians(2.0)  # [rad] parallel within this
_OVERLAP = 0.5  # [-] of the shorter wall's length


def overlap_fraction(a: WallSegment, b: WallSegment) -> float:
    """Share of the shorter wall's length that the other covers, in plan [-].

    Common practice: two walls of one storey on the same axis (within their
    thickness) that overlap along it are the same wall modelled twice.
    """
    da = min(abs(a.angle - b.angle), math.pi - abs(a.angle - b.angle))
    if da > _ANGLE:
        return 0.0
    ux, uy = math.cos(a.angle), math.sin(a.angle)
    mx, my = b.midpoint[0] - a.start[0], b.midpoint[1] - a.start[1]
    if abs(-uy * mx + ux * my) > max(a.thickness, b.thickness) / 2:
        return 0.0
    proj = [
        ux * (p[0] - a.start[0]) + uy * (p[1] - a.start[1]) for p in (a.start, a.end)
    ]
    prob = [
        ux * (p[0] - a.start[0]) + uy * (p[1] - a.start[1]) for p in (b.start, b.end)
    ]
    common = min(max(proj), max(prob)) - max(min(proj), min(prob))
    return max(0.0, common) / min(a.length, b.length)


_STOREY = attrgetter("storey")
_NEAR = [(dx, dy) for dx in (-1, 0, 1) for dy in (-1, 0, 1)]  # the cell's 3 x 3 block
_CODABLE = 2.0**40  # [m] mid-points beyond this are grouped without int64 cell codes


def _pairs_by_dict(walls: Sequence[WallSegment]) -> list[tuple[int, int]]:
    """Every pair of two walls whose mid-points fall in neighbouring cells, as indices.

    A 1 m grid of mid-points per storey (duplicates fall in adjacent cells): cells in
    order of first use, each wall of a cell in wall order, then the walls of its
    3 x 3 block, block cell by block cell.
    """
    cells: dict[tuple[str, int, int], list[int]] = defaultdict(list)
    for i, w in enumerate(walls):
        cells[(w.storey, round(w.midpoint[0]), round(w.midpoint[1]))].append(i)
    return [
        (i, j)
        for (storey, cx, cy), group in cells.items()
        for i in group
        for dx, dy in _NEAR
        for j in cells.get((storey, cx + dx, cy + dy), ())
        if i != j
    ]


# margins of the array test, so that it only leaves out pairs the exact test would
# (its float operations are not bit for bit those of overlap_fraction) [rad, m, -]
_SLACK_ANGLE, _SLACK_OFFSET, _SLACK_OVERLAP = 1e-9, 1e-6, 1e-6


def _pairs(walls: Sequence[WallSegment]) -> list[tuple[int, int]]:
    """The pairs of :func:`_pairs_by_dict` that may be duplicates, with arrays.

    Every pair of walls in neighbouring cells is tested at once with the tests of
    :func:`overlap_fraction` widened by a small slack; only those that pass (the
    rare near-duplicates) are left for the exact test, in the same order.
    """
    if not walls:
        return []
    storeys: dict[str, int] = {}
    names = list(map(_STOREY, walls))
    codes = [storeys.setdefault(name, len(storeys)) for name in names]
    s = np.array(codes, dtype=np.int64)
    ends = end_points(walls)
    mid = np.round((ends[:, 0] + ends[:, 1]) / 2.0)  # round(): half to even
    if not np.isfinite(mid).all() or np.abs(mid).max() > _CODABLE:
        return _pairs_by_dict(walls)
    c = mid.astype(np.int64)
    lo, span = int(c.min()) - 1, int(c.max() - c.min()) + 3
    code = (s * span + (c[:, 0] - lo)) * span + (c[:, 1] - lo)
    cells, first, where, count = np.unique(
        code, return_index=True, return_inverse=True, return_counts=True
    )
    where = where.reshape(-1)
    members = np.argsort(where, kind="stable")  # wall indices, cell by cell
    start = np.concatenate(([0], np.cumsum(count)[:-1]))
    rank = np.empty(len(cells), dtype=np.intp)
    rank[np.argsort(first, kind="stable")] = np.arange(len(cells))  # first use
    a_parts, k_parts, b_parts = [], [], []
    for k, (dx, dy) in enumerate(_NEAR):
        probe = cells + dx * span + dy
        at = np.minimum(np.searchsorted(cells, probe), len(cells) - 1)
        hit = np.where(cells[at] == probe, at, -1)[where]  # per wall: that cell
        a = np.flatnonzero(hit >= 0)
        v = hit[a]
        n = count[v]
        total = int(n.sum())
        if total == 0:
            continue
        # each wall a with every member of cell v, the members in wall order
        offset = np.repeat(start[v] - (np.cumsum(n) - n), n) + np.arange(total)
        a_parts.append(np.repeat(a, n))
        b_parts.append(members[offset])
        k_parts.append(np.full(total, k))
    if not a_parts:
        return []
    ia, kk, ib = (np.concatenate(x) for x in (a_parts, k_parts, b_parts))
    keep = ia != ib
    ia, kk, ib = ia[keep], kk[keep], ib[keep]
    maybe = _may_overlap(walls, ends, ia, ib)
    ia, kk, ib = ia[maybe], kk[maybe], ib[maybe]
    order = np.lexsort((ib, kk, ia, rank[where[ia]]))
    return list(zip(ia[order].tolist(), ib[order].tolist(), strict=True))


def _may_overlap(
    walls: Sequence[WallSegment],
    ends: np.ndarray,
    ia: np.ndarray,
    ib: np.ndarray,
) -> np.ndarray:
    """False where :func:`overlap_fraction` of the pair is surely below _OVERLAP.

    The tests of :func:`overlap_fraction` on arrays, each widened by its slack; a
    comparison that is not surely false (NaN, a zero length) keeps the pair.
    """
    sa, ea, sb, eb = ends[ia, 0], ends[ia, 1], ends[ib, 0], ends[ib, 1]
    with np.errstate(divide="ignore", invalid="ignore"):
        dira = np.arctan2(ea[:, 1] - sa[:, 1], ea[:, 0] - sa[:, 0]) % np.pi
        dirb = np.arctan2(eb[:, 1] - sb[:, 1], eb[:, 0] - sb[:, 0]) % np.pi
        d = np.abs(dira - dirb)
        off_angle = np.minimum(d, np.pi - d) > _ANGLE + _SLACK_ANGLE
        ux, uy = np.cos(dira), np.sin(dira)
        m = (sb + eb) / 2.0 - sa
        t = np.array([w.thickness for w in walls], dtype=np.float64)
        half = np.maximum(t[ia], t[ib]) / 2
        off_axis = np.abs(-uy * m[:, 0] + ux * m[:, 1]) > half + _SLACK_OFFSET
        pa = ux * (ea[:, 0] - sa[:, 0]) + uy * (ea[:, 1] - sa[:, 1])
        pb0 = ux * (sb[:, 0] - sa[:, 0]) + uy * (sb[:, 1] - sa[:, 1])
        pb1 = ux * (eb[:, 0] - sa[:, 0]) + uy * (eb[:, 1] - sa[:, 1])
        common = np.minimum(np.maximum(pa, 0.0), np.maximum(pb0, pb1)) - np.maximum(
            np.minimum(pa, 0.0), np.minimum(pb0, pb1)
        )
        la = np.hypot(ea[:, 0] - sa[:, 0], ea[:, 1] - sa[:, 1])
        lb = np.hypot(eb[:, 0] - sb[:, 0], eb[:, 1] - sb[:, 1])
        short = np.maximum(common, 0.0) / np.minimum(la, lb) < _OVERLAP - _SLACK_OVERLAP
    return ~(off_angle | off_axis | short)


def check_duplicate_walls(model: BuildingModel) -> list[Finding]:
    """A warning for each pair of distinct walls of one storey in the same place.

    Args:
        model: The model; wall segments grouped by storey and part.

    Returns:
        One finding per duplicated pair, naming both GlobalIds.
    """
    out: dict[str, Finding] = {}
    walls = model.walls
    for i, j in _pairs(walls):
        a, b = walls[i], walls[j]
        if a.guid >= b.guid or overlap_fraction(a, b) < _OVERLAP:
            continue
        f = Finding(
            rule=RULE,
            clause="",
            severity=Severity.WARNING,
            level=a.level or a.storey,
            direction=None,
            guids=(a.guid, b.guid),
            title="Wall modelled twice",
            description=(
                f"Walls {a.name!r} ({a.guid}) and {b.name!r} ({b.guid}) on "
                f"{a.storey!r} lie on one axis and overlap by "
                f"{overlap_fraction(a, b):.0%} of the shorter one; both are "
                "counted, so their line's wall length is doubled. Delete the "
                "copy in the model."
            ),
            discriminator=a.storey,
            location=a.midpoint,
        )
        out.setdefault(f.id, f)
    return list(out.values())
