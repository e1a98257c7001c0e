"""The walls' share of each level's seismic weight, worked out on columns (private).

Used by :mod:`allocation.weights`, whose module docstring states the rule: each
story-high segment sends half its weight to the level it stands on and half to the
level whose diaphragm it supports (all of it to the level it stands on when nothing
is above), area = length × height less the openings, unit load = the assembly's wall
dead load, else ``loads.wall``. The numbers are those a loop over the walls gives:
the same float operations, in numpy or through ``map``, and sums by ``math.fsum``.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from operator import attrgetter

import numpy as np
from numpy.typing import NDArray

from allocation._columns import ends as end_points
from allocation._columns import flags, floats, ints, points
from allocation._mass_table import MassTable
from allocation.results import WeightItem
from ifc_bridge.model import WallSegment

__all__ = ["WALLS_ABOVE", "WALLS_BELOW", "WallShares", "wall_shares"]

WALLS_BELOW = "walls below"
WALLS_ABOVE = "walls above"

_GUID, _PART, _STOREY, _LEVEL = (
    attrgetter(n) for n in ("guid", "part", "storey", "level")
)
_ASSEMBLY, _OPENINGS = attrgetter("assembly"), attrgetter("openings")
_HEIGHTS = attrgetter("base_elevation", "top_elevation")


@dataclass(frozen=True, slots=True)
class WallShares:
    """The wall weight landing on one level, one entry per wall half, in wall order.

    Attributes:
        walls: Index of each entry's wall segment in the model.
        above: True for a share of the level the wall stands on ("walls above").
        area: Tributary elevation area [m²].
        weight: area × unit load [N].
        group: Per entry, the assembly index of its unit load [-].
        columns: The model's wall columns the indices refer to.
    """

    walls: NDArray[np.intp]
    above: NDArray[np.bool_]
    area: NDArray[np.float64]
    weight: NDArray[np.float64]
    group: NDArray[np.intp]
    columns: _Columns

    def breakdown(self) -> list[WeightItem]:
        """Rows by source and unit load (first use first): areas, weights, walls."""
        combo = self.group * 2 + np.where(self.above, 0, 1)
        codes, first = np.unique(combo, return_index=True)
        groups: dict[tuple[str, float], list[int]] = {}  # (source, q) as dict keys
        for c in codes[np.argsort(first)].tolist():
            source = WALLS_ABOVE if c % 2 == 0 else WALLS_BELOW
            groups.setdefault((source, self.columns.q[c // 2]), []).append(c)
        guid = self.columns.guid
        out = []
        for (source, q), members in groups.items():
            hit = combo == members[0] if len(members) == 1 else np.isin(combo, members)
            rows = np.flatnonzero(hit)
            walls = self.walls[rows].tolist()
            out.append(
                WeightItem(
                    source=source,
                    quantity=math.fsum(self.area[rows].tolist()),
                    unit_load=q,
                    weight=math.fsum(self.weight[rows].tolist()),
                    guids=tuple(sorted(set(map(guid.__getitem__, walls)))),
                )
            )
        return out

    def masses(self) -> MassTable:
        """One point item per wall segment (its halves here merged), at its mid-point."""
        cols = self.columns
        index = self.walls.tolist()
        keys = list(map(cols.key.__getitem__, index))
        if len(set(keys)) == len(keys):  # no segment twice
            keep = np.flatnonzero(self.weight > 0.0)
            walls = self.walls[keep].tolist()
            weights = self.weight[keep].tolist()
        else:  # merge the halves of a segment that land here twice
            merged: dict[tuple[str, int], list[int]] = {}
            for n, key in enumerate(keys):
                merged.setdefault(key, []).append(n)
            all_weights = self.weight.tolist()
            walls, weights = [], []
            for rows in merged.values():
                w = (
                    all_weights[rows[0]]
                    if len(rows) == 1
                    else math.fsum(all_weights[r] for r in rows)
                )
                if w > 0.0:
                    walls.append(index[rows[0]])
                    weights.append(float(w))
        return MassTable(
            source=["wall"] * len(walls),
            ref=list(map(cols.guid.__getitem__, walls)),
            weight=np.array(weights, dtype=np.float64),
            xy=cols.xy[walls] if walls else np.zeros((0, 2)),
            polygon=[None] * len(walls),
            pier_part=list(map(cols.part.__getitem__, walls)),
        )


@dataclass(frozen=True, slots=True)
class _Columns:
    """The model's wall segments as columns (private)."""

    guid: list[str]
    part: list[int]
    key: list[tuple[str, int]]  # (guid, part)
    xy: NDArray[np.float64]  # WallSegment.midpoint, (n, 2) [m]
    q: list[float]  # unit load per assembly index [Pa]


def _areas(walls: Sequence[WallSegment], area_of: Callable) -> NDArray[np.float64]:
    """Net elevation area per wall, as ``wall_elevation_area`` gives [m²]."""
    ends = end_points(walls)
    dx = ends[:, 1, 0] - ends[:, 0, 0]
    dy = ends[:, 1, 1] - ends[:, 0, 1]
    length = floats(map(math.hypot, dx.tolist(), dy.tolist()), len(walls))
    zs = points(map(_HEIGHTS, walls), len(walls))  # (base, top) [m]
    gross = length * (zs[:, 1] - zs[:, 0])  # WallSegment.length × height
    area = np.where(gross < 0.0, 0.0, gross)  # max(gross - 0.0, 0.0)
    for i in np.flatnonzero(list(map(bool, map(_OPENINGS, walls)))).tolist():
        area[i] = area_of(walls[i])
    return area


def wall_shares(
    walls: Sequence[WallSegment],
    targets: dict[str, str | None],
    *,
    unit_load: Callable[[WallSegment], float],
    area_of: Callable[[WallSegment], float],
    missing: Callable[[str, WallSegment], object],
) -> dict[str, WallShares]:
    """The wall weight landing on each diaphragm level.

    Args:
        walls: The model's wall segments.
        targets: Level that takes the weight landing on each level (None: the base).
        unit_load: Dead load per elevation area of a wall [Pa] (by its assembly).
        area_of: Net elevation area of a wall with openings [m²].
        missing: Called with the first level name (and its wall) not in ``targets``;
            raises.

    Returns:
        Per level name, its shares in wall order (a wall's upper half after its
        lower).
    """
    storeys, levels = list(map(_STOREY, walls)), list(map(_LEVEL, walls))
    names = set(storeys) | (set(levels) - {""})
    if not names <= targets.keys():
        for w, s, lv in zip(walls, storeys, levels, strict=True):
            for name in (s, lv) if lv else (s,):
                if name not in targets:
                    missing(name, w)
    assemblies: dict[str, int] = {}
    group = [assemblies.setdefault(a, len(assemblies)) for a in map(_ASSEMBLY, walls)]
    group_of = ints(group, len(group))
    # each assembly's unit load, read off its first wall (group codes are in order of
    # first appearance)
    _, first = np.unique(group_of, return_index=True)
    q_of = [unit_load(walls[i]) for i in first.tolist()]
    ends = end_points(walls, keep=True)  # the model's walls: read once per run
    mid = (ends[:, 0] + ends[:, 1]) / 2.0
    guids, parts = list(map(_GUID, walls)), list(map(_PART, walls))
    cols = _Columns(
        guid=guids,
        part=parts,
        key=list(zip(guids, parts, strict=True)),
        xy=mid,
        q=q_of,
    )
    area = _areas(walls, area_of) if walls else np.zeros(0)
    q = np.array(q_of, dtype=np.float64)[group_of]
    has_level = flags(map(bool, levels), len(levels))
    fraction = np.where(has_level, 0.5, 1.0)  # a parapet: all of it
    # shares interleaved: wall i's lower-level half at 2i, its upper half at 2i + 1
    a = np.stack([fraction * area, 0.5 * area], axis=1).reshape(-1)
    code: dict[str, int] = {}
    level_names: list[str] = []
    for name in dict.fromkeys(v for v in targets.values() if v is not None):
        code[name] = len(level_names)
        level_names.append(name)
    code_of = {"": -1}  # level name -> code of the level taking its weight
    for name in names:
        code_of[name] = -1 if targets[name] is None else code.get(targets[name], -1)
    to = list(map(code_of.__getitem__, storeys))
    up = list(map(code_of.__getitem__, levels))
    target = np.stack([ints(to, len(to)), ints(up, len(up))], axis=1).reshape(-1)
    wall = np.repeat(np.arange(len(walls)), 2)
    weight = a * np.repeat(q, 2)
    order = np.argsort(target, kind="stable")
    order = order[target[order] >= 0]
    cuts = np.flatnonzero(np.diff(target[order])) + 1
    out: dict[str, WallShares] = {}
    for rows in np.split(order, cuts) if order.size else []:
        out[level_names[int(target[rows[0]])]] = WallShares(
            walls=wall[rows],
            above=(rows % 2 == 0),
            area=a[rows],
            weight=weight[rows],
            group=group_of[wall[rows]],
            columns=cols,
        )
    return out
