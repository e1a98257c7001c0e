"""Small pier factory for the allocation tests (plan coordinates in m)."""

from __future__ import annotations

from allocation.results import Pier
from ifc_bridge.model import Direction


def wall(
    name: str,
    direction: str | None,
    x: float,
    y: float,
    k: float | None = None,
    *,
    length: float = 2.0,
    level: str = "L1",
    height: float = 3.0,
    thickness: float = 0.2,
    assembly: str = "",
) -> Pier:
    """A pier centred at (x, y), along X or Y (``None``: skewed at 45°).

    Its stiffness is ``k``, or its length when ``k`` is None.
    """
    half = length / 2.0
    if direction == "X":
        start, end = (x - half, y), (x + half, y)
    elif direction == "Y":
        start, end = (x, y - half), (x, y + half)
    else:
        d = half / 2.0**0.5
        start, end = (x - d, y - d), (x + d, y + d)
    return Pier(
        id=f"{name}|{level}|0|0",
        guid=name,
        name=name,
        pier=0,
        part=0,
        level=level,
        storey="L0",
        direction=Direction(direction) if direction else None,
        start=start,
        end=end,
        height=height,
        thickness=thickness,
        assembly=assembly,
        stiffness=length if k is None else k,
    )
