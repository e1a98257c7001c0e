"""A small bounded memo for pure geometric steps repeated level after level (private).

A tower's typical floors have the same slab outline and lines level after level, so
the same region split and line crossings come up again and again. Keys are built
from exact values (WKB bytes of geometry, ``repr`` of floats, so ``-0.0`` and ``0.0``
stay apart); an entry is only reused for bit-identical input, so a result from
memory is exactly the one a fresh computation gives.
"""

from __future__ import annotations

from collections import OrderedDict
from collections.abc import Callable, Hashable
from typing import Generic, TypeVar

__all__ = ["Memo"]

V = TypeVar("V")


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

    def clear(self) -> None:
        """Forget every entry."""
        self._entries.clear()

    def __len__(self) -> int:
        return len(self._entries)
