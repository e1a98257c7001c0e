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


def _cells_by_dict(
    walls: Sequence[WallSegment],
) -> list[tuple[list[WallSegment], list[WallSegment]]]:
    """(walls of the cell, walls of its 3 x 3 block) per cell, in order of use."""
    cells: dict[tuple[str, int, int], list[WallSegment]] = defaultdict(list)
    for w in walls:  # 1 m grid of mid-points; duplicates fall in adjacent cells
        cells[(w.storey, round(w.midpoint[0]), round(w.midpoint[1]))].append(w)
    return [
        (
            group,
            [b for dx, dy in _NEAR for b in cells.get((storey, cx + dx, cy + dy), ())],
        )
        for (storey, cx, cy), group in cells.items()
    ]


def _cells(
    walls: Sequence[WallSegment],
) -> list[tuple[list[WallSegment], list[WallSegment]]]:
    """:func:`_cells_by_dict` of the cells that can hold a pair, found with arrays.

    A cell with one wall and no used neighbour cell is left out (its one pair is
    the wall with itself). Cells keep their order of first use, walls their order.
    """
    if not walls:
        return []
    storeys: dict[str, int] = {}
    s = np.fromiter(
        (storeys.setdefault(name, len(storeys)) for name in map(_STOREY, walls)),
        dtype=np.int64,
        count=len(walls),
    )
    ends = end_points(walls)
    mid = np.round((ends[:, 0] + ends[:, 1]) / 2.0)  # round(): half to even
    if not np.isfinite(mid).all() or np.abs(mid).max() > _CODABLE:
        return _cells_by_dict(walls)
    c = mid.astype(np.int64)
    lo, span = int(c.min()) - 1, int(c.max() - c.min()) + 3
    code = (s * span + (c[:, 0] - lo)) * span + (c[:, 1] - lo)
    cells, first, where, count = np.unique(
        code, return_index=True, return_inverse=True, return_counts=True
    )
    members = np.argsort(where, kind="stable")  # wall indices, cell by cell
    start = np.concatenate(([0], np.cumsum(count)[:-1]))
    near = []
    for dx, dy in _NEAR:
        probe = cells + dx * span + dy
        at = np.minimum(np.searchsorted(cells, probe), len(cells) - 1)
        near.append(np.where(cells[at] == probe, at, -1))
    block = np.stack(near, axis=1)  # per cell: the 9 cells of its block, or -1
    crowded = (count > 1) | ((block >= 0).sum(axis=1) > 1)
    out = []
    for u in np.argsort(first, kind="stable")[crowded[np.argsort(first)]].tolist():
        group = [walls[i] for i in members[start[u] : start[u] + count[u]].tolist()]
        block_walls = [
            walls[i]
            for v in block[u].tolist()
            if v >= 0
            for i in members[start[v] : start[v] + count[v]].tolist()
        ]
        out.append((group, block_walls))
    return out


def check_duplicate_walls(model: BuildingModel) -> list[Finding]:
    """A warning for each pair of distinct walls of one storey in the same place.

    Args:
        model: The model; wall segments grouped by storey and part.

    Returns:
        One finding per duplicated pair, naming both GlobalIds.
    """
    out: dict[str, Finding] = {}
    for walls, near in _cells(model.walls):
        for a in walls:
            for b in near:
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
