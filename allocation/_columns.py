"""Plan points of many records as float arrays, quickly (private).

``numpy.array`` of a list of nested tuples inspects every level of nesting; reading
the flattened floats with ``numpy.fromiter`` gives the same array several times
faster. Values are converted as ``numpy.array`` converts them (to float64).

:func:`ends` reads the end points of a whole run's walls or piers once: a later call
on the same sequence, or on records all taken from it (a level's piers, one
direction's), takes their rows from that table. The records are frozen, so the rows
are the floats a fresh read gives.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence
from itertools import chain, repeat
from operator import attrgetter

import numpy as np
from numpy.typing import NDArray

__all__ = ["ends", "flags", "floats", "ints", "pier_lengths", "points", "segments"]


def _read(flat: Iterable[float], n: int, shape: tuple[int, ...]) -> NDArray[np.float64]:
    out = np.fromiter(flat, dtype=np.float64)
    if out.size != n * math.prod(shape):
        msg = f"expected {n} rows of {shape} coordinates, got {out.size} numbers"
        raise ValueError(msg)
    return out.reshape(n, *shape)


def floats(values: Iterable[float], n: int) -> NDArray[np.float64]:
    """``n`` numbers as a float64 array."""
    return np.fromiter(values, dtype=np.float64, count=n)


def ints(values: Iterable[int], n: int) -> NDArray[np.intp]:
    """``n`` integers as an index array."""
    return np.fromiter(values, dtype=np.intp, count=n)


def flags(values: Iterable[object], n: int) -> NDArray[np.bool_]:
    """``n`` truth values (``bool()`` of each) as a boolean array."""
    return np.fromiter(values, dtype=bool, count=n)


def points(rows: Iterable[tuple[float, float]], n: int) -> NDArray[np.float64]:
    """``n`` (x, y) points as an (n, 2) array [m]."""
    return _read(chain.from_iterable(rows), n, (2,))


def segments(
    rows: Iterable[tuple[tuple[float, float], tuple[float, float]]], n: int
) -> NDArray[np.float64]:
    """``n`` (start, end) point pairs as an (n, 2, 2) array [m]."""
    return _read(chain.from_iterable(chain.from_iterable(rows)), n, (2, 2))


_ENDS = attrgetter("start", "end")
_KEEP = 4  # tables kept: a run's walls and piers, and a previous run's


class _Table:
    """The (n, 2, 2) end points of a sequence of records, and each record's row."""

    __slots__ = ("ends", "items", "row")

    def __init__(self, items: Sequence, ends: NDArray[np.float64]) -> None:
        self.items = items  # held: no id() in ``row`` can name another object
        self.ends = ends
        self.row = {id(o): i for i, o in enumerate(items)}


_TABLES: list[_Table] = []  # most recent first


def ends(items: Sequence, *, keep: bool = False) -> NDArray[np.float64]:
    """``segments`` of the records' ``(start, end)``: an (n, 2, 2) array [m].

    Args:
        items: Frozen records with ``start`` and ``end`` points (walls, piers).
        keep: Keep a table of these records for later calls (the run's whole
            sequence: the model's walls, the run's piers). The array is then
            returned read-only.

    Returns:
        The end points, row i for ``items[i]``.
    """
    for t in _TABLES:
        if t.items is items:
            return t.ends
    if items and not keep:
        first = id(items[0])
        for t in _TABLES:
            if first in t.row:
                try:
                    rows = ints(map(t.row.__getitem__, map(id, items)), len(items))
                except KeyError:  # not all of them from that table
                    break
                return t.ends[rows]
    out = segments(map(_ENDS, items), len(items))
    if keep:
        out.flags.writeable = False
        _TABLES.insert(0, _Table(items, out))
        del _TABLES[_KEEP:]
    return out


_FEW = 48  # fewer records than this: attribute reads beat an array's fixed costs


def pier_lengths(piers: Sequence) -> list[float]:
    """``Pier.length`` of each pier, from :func:`ends` (the same floats) [m].

    A few piers (one line's) are read one by one: the same operations on the same
    doubles, without the table look-up and array set-up that only pay on many.
    """
    if len(piers) < _FEW:
        return [p.length for p in piers]
    e = ends(piers)
    dx, dy = e[:, 1, 0] - e[:, 0, 0], e[:, 1, 1] - e[:, 0, 1]
    return list(map(float.__pow__, (dx * dx + dy * dy).tolist(), repeat(0.5)))
