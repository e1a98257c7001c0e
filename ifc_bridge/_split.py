"""Split a wall into story-high segments at the diaphragm levels it runs through.

A diaphragm level cuts a wall when its elevation is more than 0.05 m above the base
and more than 0.15 m below the top (walls usually stop at the slab underside).
A segment supports the next diaphragm level above its base whose elevation is at
most 0.15 m above the segment top. Elevations in metres, Z up.
"""

from __future__ import annotations

import dataclasses

from ifc_bridge.model import Level, Opening, WallSegment

__all__ = ["BASE_TOL", "TOP_TOL", "split_wall", "supported_level"]

BASE_TOL = 0.05  # [m]
TOP_TOL = 0.15  # [m]


def supported_level(
    diaphragm_levels: tuple[Level, ...], *, above: float, top: float
) -> str:
    """Name of the diaphragm level a segment supports, or ``""``.

    Common practice: a wall supports the floor or roof it stops under.

    Args:
        diaphragm_levels: Diaphragm levels sorted by elevation.
        above: The level must be higher than this plus 0.05 m [m].
        top: Segment top; the level may be at most 0.15 m above it [m].

    Returns:
        Level name, or ``""`` (parapet, wall above the roof).
    """
    for lv in diaphragm_levels:
        if lv.elevation > above + BASE_TOL:
            return lv.name if lv.elevation <= top + TOP_TOL else ""
    return ""


def _rebase(openings: tuple[Opening, ...], lo: float, hi: float) -> tuple[Opening, ...]:
    """Openings of the part [lo, hi] (heights above the wall base), re-based to lo."""
    out = []
    for op in openings:
        b, t = max(op.bottom, lo), min(op.top, hi)
        if t - b > 1e-3:
            out.append(dataclasses.replace(op, bottom=b - lo, top=t - lo))
    return tuple(out)


def split_wall(
    whole: WallSegment,
    diaphragm_levels: tuple[Level, ...],
    *,
    storey_elevation: float,
) -> tuple[WallSegment, ...]:
    """Split a wall at each diaphragm level strictly inside its height.

    Common practice: each story-high piece of a wall resists the story shear of
    its own story.

    Args:
        whole: The wall as one segment (``storey`` = the storey it stands on,
            openings relative to its base).
        diaphragm_levels: Diaphragm levels sorted by elevation.
        storey_elevation: Elevation of ``whole.storey`` [m].

    Returns:
        Segments bottom-up, ``part`` 0, 1, ..., each with its ``level`` set.
    """
    base, top = whole.base_elevation, whole.top_elevation
    cuts = [lv for lv in diaphragm_levels if base + BASE_TOL < lv.elevation < top - TOP_TOL]
    bounds = [base, *(lv.elevation for lv in cuts), top]
    storeys = [whole.storey, *(lv.name for lv in cuts)]
    floors = [max(base, storey_elevation), *(lv.elevation for lv in cuts)]
    parts = []
    for k in range(len(bounds) - 1):
        lo, hi = bounds[k], bounds[k + 1]
        parts.append(
            dataclasses.replace(
                whole,
                part=k,
                storey=storeys[k],
                level=supported_level(diaphragm_levels, above=floors[k], top=hi),
                base_elevation=lo,
                top_elevation=hi,
                openings=_rebase(whole.openings, lo - base, hi - base),
            )
        )
    return tuple(parts)
