"""A small bounded memo for pure geometric steps repeated level after level (private).

A tower's typical floors have the same slab outline and lines level after level, so
the same region split and line crossings come up again and again. Keys are built
from exact values (WKB bytes of geometry, the IEEE bytes of floats from
:func:`float_bytes`, so ``-0.0`` and ``0.0`` stay apart); an entry is only reused for
bit-identical input, so a result from memory is exactly the one a fresh computation
gives.
"""

from __future__ import annotations

import struct
import weakref
from collections import OrderedDict
from collections.abc import Callable, Hashable, Iterable
from typing import Generic, TypeVar

__all__ = ["Memo", "float_bytes", "wkb_of"]

V = TypeVar("V")


def float_bytes(values: Iterable[float]) -> bytes:
    """The values as IEEE 754 doubles, back to back: an exact, hashable key part.

    Unlike the floats themselves (``-0.0 == 0.0``), the bytes tell every distinct
    double apart; callers put counts in the sequence wherever its shape varies.
    """
    flat = tuple(values)
    return struct.pack(f"{len(flat)}d", *flat)


_WKB: dict[int, tuple[weakref.ref, bytes]] = {}


def wkb_of(geometry) -> bytes:
    """``geometry.wkb``, written once per geometry object: an exact key part.

    Shapely geometries are immutable, so the bytes of one object never change; they
    are kept while it lives (a weak reference tells a new object at a reused ``id``
    apart) and forgotten with it.
    """
    key = id(geometry)
    held = _WKB.get(key)
    if held is not None and held[0]() is geometry:
        return held[1]
    wkb = geometry.wkb
    _WKB[key] = (weakref.ref(geometry, lambda _gone, key=key: _forget(key)), wkb)
    return wkb


def _forget(key: int) -> None:
    held = _WKB.get(key)
    if held is not None and held[0]() is None:  # not a newer object at that id
        del _WKB[key]


class Memo(Generic[V]):
    """Least-recently-used memo of at most ``size`` entries.

    Args:
        size: Largest number of entries kept [-].
    """

    __slots__ = ("_entries", "size")

    def __init__(self, size: int) -> None:
        self.size = size
        self._entries: OrderedDict[Hashable, V] = OrderedDict()

    def get(self, key: Hashable, compute: Callable[[], V]) -> V:
        """The value for ``key``, computed by ``compute()`` when not held."""
        try:
            value = self._entries[key]
        except KeyError:
            value = compute()
            self._entries[key] = value
            if len(self._entries) > self.size:
                self._entries.popitem(last=False)
            return value
        self._entries.move_to_end(key)
        return value

    def put(self, key: Hashable, value: V) -> None:
        """Hold ``value`` for ``key`` (replacing any), as the most recent entry."""
        self._entries[key] = value
        self._entries.move_to_end(key)
        if len(self._entries) > self.size:
            self._entries.popitem(last=False)

    def clear(self) -> None:
        """Forget every entry."""
        self._entries.clear()

    def __len__(self) -> int:
        return len(self._entries)
