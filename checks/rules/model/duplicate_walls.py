"""Walls modelled twice: two IfcWall in the same place, usually a copy-paste slip.

Not a code provision (clause empty). A duplicate counts the wall's length twice on its
line, so the line looks stronger than it is. Severity: warning, pinned to both walls.
"""

from __future__ import annotations

import math
from collections import defaultdict

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


def check_duplicate_walls(model: BuildingModel) -> list[Finding]:
    """A warning for each pair of distinct walls of one storey in the same place.

    Args:
        model: The model; wall segments grouped by storey and part.

    Returns:
        One finding per duplicated pair, naming both GlobalIds.
    """
    cells: dict[tuple[str, int, int], list[WallSegment]] = defaultdict(list)
    for w in model.walls:  # 1 m grid of mid-points; duplicates fall in adjacent cells
        cells[(w.storey, round(w.midpoint[0]), round(w.midpoint[1]))].append(w)
    out: dict[str, Finding] = {}
    for (storey, cx, cy), walls in cells.items():
        near = [
            b
            for dx in (-1, 0, 1)
            for dy in (-1, 0, 1)
            for b in cells.get((storey, cx + dx, cy + dy), ())
        ]
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
