"""Loading the pieces with a level's mass items, many points at once (private).

Used by :mod:`allocation.flexible`. Local frame as in :mod:`allocation._pieces` (u
along the lines, v across). What goes where is :mod:`allocation._tributary`'s: a
distributed item (slab, extra) is spread over its polygon uniformly; a point item (a
wall's tributary weight) goes straight to its line when the wall is in a line of the
direction or lies on a chord, else to the piece it is in (or the nearest one).

The sums are the one-item-at-a-time sums, in item order: ``numpy.add.at`` adds
repeated indices one after the other, so each piece's and line's total is the same
float a loop over the items gives.
"""

from __future__ import annotations

import logging
import math
from collections.abc import Hashable, Sequence
from dataclasses import dataclass
from itertools import compress, count, repeat
from operator import attrgetter, eq, is_not

import numpy as np
from numpy.typing import NDArray
from shapely.ops import unary_union

from allocation._columns import floats, points
from allocation._mass_table import MassTable
from allocation._memo import Memo, float_bytes, wkb_of
from allocation._tributary import _PLACES, Slot, _place, _slots_key, _spread_shares
from allocation.results import LevelLoad, LineId, MassItem
from ifc_bridge.model import Diaphragm, Direction

__all__ = ["load_masses", "mass_items", "total_weight"]

logger = logging.getLogger(__name__)


@dataclass(frozen=True, slots=True)
class _Items:
    """A level's mass items as arrays (private; the same for both directions)."""

    items: Sequence[MassItem]
    weight: NDArray[np.float64]  # [N]
    xy: NDArray[np.float64]  # (n, 2) locations [m]
    total: float  # math.fsum of the weights [N]
    spread: tuple[int, ...]  # indices of the items with a polygon
    rows_of: dict[tuple[str, int], int | list[int]]  # wall (ref, pier_part) -> row(s)
    signature: tuple  # the numbers the loading reads: weights, places, spread outlines


_ITEMS: Memo[_Items] = Memo(128)  # by id(items); both directions of every level


def _arrays(items: Sequence[MassItem]) -> _Items:
    found = _ITEMS.get(id(items), lambda: _make_arrays(items))
    if found.items is not items:  # another sequence now has that id
        found = _make_arrays(items)
        _ITEMS.put(id(items), found)
    return found


_WEIGHT, _LOCATION, _POLYGON = (
    attrgetter(n) for n in ("weight", "location", "polygon")
)
_SOURCE, _REF, _PART = (attrgetter(n) for n in ("source", "ref", "pier_part"))


def _make_arrays(items: Sequence[MassItem]) -> _Items:
    table = items if isinstance(items, MassTable) else None
    if table is not None:  # the weight take-off's columns
        weight, xy, polygons = table.weight, table.xy, table.polygon
        weights = weight.tolist()
        walls = (table.source, table.ref, table.pier_part)
    else:
        weights = list(map(_WEIGHT, items))
        weight = floats(weights, len(weights))
        xy = points(map(_LOCATION, items), len(items))
        polygons = list(map(_POLYGON, items))
        walls = tuple(list(map(g, items)) for g in (_SOURCE, _REF, _PART))
    spread = tuple(compress(count(), map(is_not, polygons, repeat(None))))
    return _Items(
        items=items,
        weight=weight,
        total=math.fsum(weights),
        xy=xy,
        spread=spread,
        rows_of=_wall_rows(*walls),
        signature=(
            weight.tobytes(),
            xy.tobytes(),
            spread,
            tuple(wkb_of(polygons[i]) for i in spread),
            tuple(weights[i] for i in spread),
        ),
    )


def _wall_rows(
    source: Sequence[str], ref: Sequence[str], part: Sequence[int]
) -> dict[tuple[str, int], int | list[int]]:
    """Item index (or indices, when a wall has several items) per wall segment."""
    rows = list(compress(count(), map(eq, source, repeat("wall"))))
    keys = [(ref[i], part[i]) for i in rows]
    out: dict[tuple[str, int], int | list[int]] = dict(zip(keys, rows, strict=True))
    if len(out) < len(rows):
        out = {}
        for i, key in zip(rows, keys, strict=True):
            out.setdefault(key, []).append(i)  # type: ignore[union-attr]
    return out


def mass_items(
    level: LevelLoad, regions: Sequence[Diaphragm]
) -> tuple[tuple[MassItem, ...], bool]:
    """The level's located masses, else its weight spread uniformly over the regions.

    Returns:
        The items, and False when they are plan areas [m²] standing in for a weight
        that is zero (a given story force on a weightless level: spread by area).
    """
    if total_weight(level.masses) > 0.0 or not regions:
        return level.masses, True
    union = unary_union([r.polygon for r in regions])
    physical = level.seismic_weight > 0.0
    logger.info("level %s: no located masses; spread over the diaphragm", level.level)
    c = union.centroid
    item = MassItem(
        source="slab",
        ref=level.level,
        weight=level.seismic_weight if physical else float(union.area),
        location=(c.x, c.y),
        polygon=union,
    )
    return (item,), physical


def total_weight(items: Sequence[MassItem]) -> float:
    """``math.fsum`` of the items' weights [N] (once per sequence)."""
    return _arrays(items).total


def _placed(
    uv: NDArray[np.float64], slots: Sequence[Slot], slots_key: Hashable
) -> tuple[NDArray, ...]:
    """``_place`` of local points as arrays (piece, support, u, v, off); memoised."""

    def compute() -> tuple[NDArray, ...]:
        spots = _place(uv[:, 0], uv[:, 1], slots)
        j, s, u, v, off = zip(*spots, strict=True) if spots else ((),) * 5
        return (
            np.array(j, dtype=np.intp),
            np.array(s, dtype=np.intp),
            np.array(u, dtype=np.float64),
            np.array(v, dtype=np.float64),
            np.array(off, dtype=bool),
        )

    return _PLACES.get((slots_key, uv.tobytes()), compute)


def _add_points(
    acc: NDArray[np.float64],
    rows: NDArray[np.intp],
    where: NDArray[np.intp],
    w: NDArray[np.float64],
    uv: NDArray[np.float64],
) -> None:
    """Add point weights and their moments to the pieces, in item order."""
    if rows.size:
        np.add.at(acc[0], where[rows], w[rows])
        np.add.at(acc[1], where[rows], w[rows] * uv[rows, 0])
        np.add.at(acc[2], where[rows], w[rows] * uv[rows, 1])


@dataclass(frozen=True, slots=True)
class _Loaded:
    """What :func:`load_masses` did, in terms a floor of the same layout can reuse.

    Lines are named by code: codes below ``named`` are the lines of ``wall_lines``
    in their order; each later code is the line of a support ``(piece, support)``.
    """

    acc: tuple[tuple[float, float, float], ...]  # per piece: weight, moment u, v
    named: int
    supports: tuple[tuple[int, int], ...]  # the pieces' supports of the later codes
    direct: tuple[tuple[int, float], ...]  # (line code, weight [N]), in item order
    lost: float  # [N]
    off: tuple[tuple[float, float, int], ...]  # points placed off every piece


_LOADS: Memo[_Loaded] = Memo(128)


def load_masses(
    items: Sequence[MassItem],
    slots: Sequence[Slot],
    wall_lines: dict[tuple[str, int], LineId],
    direction: Direction,
) -> tuple[dict[LineId, float], float]:
    """Spread mass items onto the pieces (uniform over polygons; points at location).

    A distributed item is shared by the area of its polygon in each piece
    (normalised by their sum, so no weight is lost where it overhangs the regions);
    a point item of a wall in a line of this direction (``wall_lines``) or on a
    chord goes straight to that line; a point off every piece goes to the nearest
    piece, at the nearest point of it. The pieces' accumulators are added to.

    The same items, pieces and line pattern (a typical floor) are loaded from
    memory: the key holds every number the loading reads, exactly.

    Returns:
        Weight sent straight to each line [N], and weight with no region at all [N].
    """
    arr, key = _arrays(items), _slots_key(slots)
    names: dict[LineId, int] = {}
    rows_codes = []
    for wall, line in wall_lines.items():
        rows = arr.rows_of.get(wall)
        if rows is not None and line:
            rows = tuple(rows) if isinstance(rows, list) else rows
            rows_codes.append((rows, names.setdefault(line, len(names))))
    seen: dict[LineId, int] = {}  # which supports are one line, and which are named
    lines_of_supports = tuple(
        (names.get(s.line, -1), seen.setdefault(s.line, len(seen)))
        for sl in slots
        for s in sl.piece.supports
    )
    start = [(sl.weight, sl.moment_u, sl.moment_v) for sl in slots]
    memo_key = (
        key,
        direction,
        arr.signature,
        tuple(rows_codes),
        lines_of_supports,
        float_bytes(v for row in start for v in row),
    )
    done = _LOADS.get(
        memo_key,
        lambda: _load(
            items, arr, slots, direction, key, rows_codes, dict(names), start
        ),
    )
    for slot, (w, mu, mv) in zip(slots, done.acc, strict=True):
        slot.weight, slot.moment_u, slot.moment_v = w, mu, mv
    if done.off and logger.isEnabledFor(logging.DEBUG):
        for pu, pv, j in done.off:
            logger.debug(
                "point (%s, %s) off the diaphragm: placed on %s", pu, pv, slots[j].id
            )
    ids = list(names)
    ids += [slots[j].piece.supports[k].line for j, k in done.supports]
    return {ids[c]: w for c, w in done.direct}, done.lost


def _load(
    items: Sequence[MassItem],
    arr: _Items,
    slots: Sequence[Slot],
    direction: Direction,
    key: Hashable,
    rows_codes: list[tuple[int | tuple[int, ...], int]],
    names: dict[LineId, int],
    start: list[tuple[float, float, float]],
) -> _Loaded:
    """:func:`load_masses` worked out, as a :class:`_Loaded`."""
    n = len(items)
    spread: dict[int, tuple[tuple, float]] = {}
    for i in arr.spread:
        parts = _spread_shares(items[i].polygon, slots, direction, key)
        base = math.fsum(area for _, area, _ in parts)
        if base > 0.0:
            spread[i] = (parts, base)
    # per item: line code, piece index (or -1 each), and the local point
    line_of = np.full(n, -1, dtype=np.intp)
    piece_of = np.full(n, -1, dtype=np.intp)
    uv = arr.xy if direction is Direction.X else arr.xy[:, ::-1]
    uv = np.array(uv, dtype=np.float64)  # writable, (along, across) as local_uv
    for rows, code in rows_codes:
        line_of[list(rows) if isinstance(rows, tuple) else rows] = code
    named, supports, off_log = len(names), [], []
    ask = line_of < 0
    ask[list(spread)] = False
    line_of[list(spread)] = -1
    rows = np.flatnonzero(ask)
    if rows.size:
        j, s, u, v, off = _placed(uv[rows], slots, key)
        for r in np.flatnonzero(s >= 0).tolist():  # on a chord: that support's line
            jj, ss = int(j[r]), int(s[r])
            line = slots[jj].piece.supports[ss].line
            if line not in names:
                names[line] = len(names)
                supports.append((jj, ss))
            line_of[rows[r]] = names[line]
        spot = (s < 0) & (j >= 0)
        for i, jj in zip(
            rows[spot & off].tolist(), j[spot & off].tolist(), strict=True
        ):
            pu, pv = uv[i].tolist()
            off_log.append((pu, pv, jj))
        piece_of[rows[spot]] = j[spot]
        uv[rows[spot], 0], uv[rows[spot], 1] = u[spot], v[spot]
    acc = np.array(start, dtype=np.float64).reshape(len(slots), 3).T.copy()
    at = 0
    for i in sorted(spread):  # points before each spread item, then the item
        _add_points(
            acc, np.flatnonzero(piece_of[at:i] >= 0) + at, piece_of, arr.weight, uv
        )
        parts, base = spread[i]
        w_item = items[i].weight
        for k, area, (pu, pv) in parts:
            w = w_item * area / base
            acc[0, k] += w
            acc[1, k] += w * pu
            acc[2, k] += w * pv
        at = i + 1
    _add_points(acc, np.flatnonzero(piece_of[at:] >= 0) + at, piece_of, arr.weight, uv)
    totals = np.zeros(len(names), dtype=np.float64)
    hit = np.flatnonzero(line_of >= 0)
    np.add.at(totals, line_of[hit], arr.weight[hit])
    codes, first = np.unique(line_of[hit], return_index=True)
    order = codes[np.argsort(first)].tolist()  # first appearance, as a loop gives
    lost = 0.0
    for i in np.flatnonzero((line_of < 0) & (piece_of < 0)).tolist():
        if i not in spread:
            lost += items[i].weight
    return _Loaded(
        acc=tuple(zip(*acc.tolist(), strict=True)),
        named=named,
        supports=tuple(supports),
        direct=tuple((c, totals[c].item()) for c in order),
        lost=lost,
        off=tuple(off_log),
    )
