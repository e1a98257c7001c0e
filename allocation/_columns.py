"""Plan points of many records as float arrays, quickly (private).

``numpy.array`` of a list of nested tuples inspects every level of nesting; reading
the flattened floats with ``numpy.fromiter`` gives the same array several times
faster. Values are converted as ``numpy.array`` converts them (to float64).
"""

from __future__ import annotations

from collections.abc import Iterable
from itertools import chain

import numpy as np
from numpy.typing import NDArray

__all__ = ["flags", "floats", "ints", "points", "segments"]


def _read(flat: Iterable[float], n: int, shape: tuple[int, ...]) -> NDArray[np.float64]:
    out = np.fromiter(flat, dtype=np.float64)
    if out.size != n * int(np.prod(shape)):
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
