"""Split a wall into story-high segments at the diaphragm levels it runs through.

A diaphragm level cuts a wall when its elevation is more than 0.05 m above the base
(and above the storey the wall stands on) and more than 0.15 m below the top.
A segment supports the next diaphragm level above its base whose elevation is at
most its ``reach`` above the segment top: 0.15 m, or the depth of the level's slabs
below its elevation plus 0.05 m when that is more (walls usually stop at the slab
underside). Elevations in metres, Z up.
"""

from __future__ import annotations

import dataclasses
from bisect import bisect_right
from collections.abc import Mapping
from typing import Any

from ifc_bridge.model import Level, Opening, WallSegment

__all__ = ["BASE_TOL", "TOP_TOL", "split_fields", "split_wall", "supported_level"]

BASE_TOL = 0.05  # [m]
TOP_TOL = 0.15  # [m]
_EPS = 1e-6  # [m]; float noise (3.85 + 0.15 < 4.0)


_ELEVATIONS: dict[int, tuple[tuple[Level, ...], list[float]]] = {}


def _elevations(levels: tuple[Level, ...]) -> list[float]:
    """Elevations of sorted levels, memoised per tuple (the reader passes one tuple)."""
    found = _ELEVATIONS.get(id(levels))
    if found is None or found[0] is not levels:
        if len(_ELEVATIONS) > 64:
            _ELEVATIONS.clear()
        found = _ELEVATIONS[id(levels)] = (levels, [lv.elevation for lv in levels])
    return found[1]


def supported_level(
    diaphragm_levels: tuple[Level, ...],
    *,
    above: float,
    top: float,
    reach: Mapping[str, float] | None = None,
) -> str:
    """Name of the diaphragm level a segment supports, or ``""``.

    Common practice: a wall supports the floor or roof it stops under.

    Args:
        diaphragm_levels: Diaphragm levels sorted by elevation.
        above: The level must be higher than this plus 0.05 m [m].
        top: Segment top [m].
        reach: Level name -> how far above the top the level may be [m]
            (default 0.15 m).

    Returns:
        Level name, or ``""`` (parapet, wall above the roof).
    """
    elevations = _elevations(diaphragm_levels)
    k = bisect_right(elevations, above + BASE_TOL)  # first level strictly above
    if k == len(elevations):
        return ""
    lv = diaphragm_levels[k]
    limit = top + max(TOP_TOL, (reach or {}).get(lv.name, TOP_TOL)) + _EPS
    return lv.name if lv.elevation <= limit else ""


def _rebase(openings: tuple[Opening, ...], lo: float, hi: float) -> tuple[Opening, ...]:
    """Openings of the part [lo, hi] (heights above the wall base), re-based to lo."""
    if lo == 0.0 and all(
        op.bottom >= 0.0 and op.top <= hi and op.top - op.bottom > 1e-3
        for op in openings
    ):
        return openings  # the whole wall: every opening as it is
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
    reach: Mapping[str, float] | None = None,
) -> tuple[WallSegment, ...]:
    """Split a wall at each diaphragm level strictly inside its height.

    Common practice: each story-high piece of a wall resists the story shear of
    its own story.

    Args:
        whole: The wall as one segment (``storey`` = the storey it stands on,
            openings relative to its base).
        diaphragm_levels: Diaphragm levels sorted by elevation.
        storey_elevation: Elevation of ``whole.storey`` [m].
        reach: Level name -> tolerance above a segment top, see
            :func:`supported_level` [m].

    Returns:
        Segments bottom-up, ``part`` 0, 1, ..., each with its ``level`` set.
    """
    fields = {f.name: getattr(whole, f.name) for f in dataclasses.fields(whole)}
    return split_fields(
        fields, diaphragm_levels, storey_elevation=storey_elevation, reach=reach
    )


def split_fields(
    whole: dict[str, Any],
    diaphragm_levels: tuple[Level, ...],
    *,
    storey_elevation: float,
    reach: Mapping[str, float] | None = None,
) -> tuple[WallSegment, ...]:
    """:func:`split_wall` of a wall given as its WallSegment field values.

    Common practice: as :func:`split_wall`; each segment is built once.

    Args:
        whole: WallSegment keyword arguments of the whole wall.
        diaphragm_levels: Diaphragm levels sorted by elevation.
        storey_elevation: Elevation of the storey it stands on [m].
        reach: Level name -> tolerance above a segment top [m].

    Returns:
        Segments bottom-up, as :func:`split_wall` returns them.
    """
    base, top = whole["base_elevation"], whole["top_elevation"]
    low = max(base, storey_elevation) + BASE_TOL
    elevations = _elevations(diaphragm_levels)
    first = bisect_right(elevations, low)
    cuts = [
        lv
        for lv in diaphragm_levels[first : bisect_right(elevations, top - TOP_TOL) + 1]
        if low < lv.elevation < top - TOP_TOL
    ]
    bounds = [base, *(lv.elevation for lv in cuts), top]
    storeys = [whole["storey"], *(lv.name for lv in cuts)]
    floors = [max(base, storey_elevation), *(lv.elevation for lv in cuts)]
    parts = []
    for k in range(len(bounds) - 1):
        lo, hi = bounds[k], bounds[k + 1]
        parts.append(
            WallSegment(
                **{
                    **whole,
                    "part": k,
                    "storey": storeys[k],
                    "level": supported_level(
                        diaphragm_levels, above=floors[k], top=hi, reach=reach
                    ),
                    "base_elevation": lo,
                    "top_elevation": hi,
                    "openings": _rebase(whole["openings"], lo - base, hi - base),
                }
            )
        )
    return tuple(parts)
