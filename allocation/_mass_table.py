"""A level's located masses held as columns (private; ``LevelLoad.masses``).

A tower level has a mass item per wall segment, so a run has tens of thousands of
them. The weight take-off makes them as columns and the loading reads them as
columns (:mod:`allocation._loading`), so :class:`MassTable` keeps the columns and
builds a :class:`~allocation.results.MassItem` only when one is read. It reads, and
compares and hashes, as the tuple of those items.
"""

from __future__ import annotations

from collections.abc import Iterator, Sequence
from typing import overload

import numpy as np
from numpy.typing import NDArray
from shapely.geometry import Polygon

from allocation._level_records import MassItem

__all__ = ["MassTable"]


class MassTable(Sequence[MassItem]):
    """Mass items as columns, in item order; immutable.

    Attributes:
        source: ``MassItem.source`` per item.
        ref: ``MassItem.ref`` per item.
        weight: ``MassItem.weight`` per item [N] (float64, read-only).
        xy: ``MassItem.location`` per item, (n, 2) [m] (float64, read-only).
        polygon: ``MassItem.polygon`` per item (None for a point item).
        pier_part: ``MassItem.pier_part`` per item.
    """

    __slots__ = ("pier_part", "polygon", "ref", "source", "weight", "xy")

    def __init__(
        self,
        *,
        source: Sequence[str],
        ref: Sequence[str],
        weight: NDArray[np.float64],
        xy: NDArray[np.float64],
        polygon: Sequence[Polygon | None],
        pier_part: Sequence[int],
    ) -> None:
        n = len(source)
        weight = np.array(weight, dtype=np.float64).reshape(n)
        xy = np.array(xy, dtype=np.float64).reshape(n, 2)
        if not len(ref) == len(polygon) == len(pier_part) == n:
            msg = "MassTable: columns of different lengths"
            raise ValueError(msg)
        weight.flags.writeable = False
        xy.flags.writeable = False
        self.source, self.ref = tuple(source), tuple(ref)
        self.weight, self.xy = weight, xy
        self.polygon, self.pier_part = tuple(polygon), tuple(pier_part)

    @classmethod
    def of(cls, items: Sequence[MassItem]) -> MassTable:
        """The table of some items (their order kept)."""
        if isinstance(items, MassTable):
            return items
        return cls(
            source=[m.source for m in items],
            ref=[m.ref for m in items],
            weight=np.array([m.weight for m in items], dtype=np.float64),
            xy=np.array([m.location for m in items], dtype=np.float64).reshape(-1, 2),
            polygon=[m.polygon for m in items],
            pier_part=[m.pier_part for m in items],
        )

    @classmethod
    def join(cls, tables: Sequence[MassTable]) -> MassTable:
        """The tables' items one table after the other."""
        if len(tables) == 1:
            return tables[0]
        return cls(
            source=[s for t in tables for s in t.source],
            ref=[r for t in tables for r in t.ref],
            weight=np.concatenate([t.weight for t in tables]) if tables else (),
            xy=np.concatenate([t.xy for t in tables]) if tables else (),
            polygon=[p for t in tables for p in t.polygon],
            pier_part=[k for t in tables for k in t.pier_part],
        )

    def __len__(self) -> int:
        return len(self.source)

    @overload
    def __getitem__(self, i: int) -> MassItem: ...
    @overload
    def __getitem__(self, i: slice) -> tuple[MassItem, ...]: ...
    def __getitem__(self, i):
        if isinstance(i, slice):
            return tuple(self[k] for k in range(*i.indices(len(self))))
        n = len(self)
        k = i + n if -n <= i < 0 else i
        if not 0 <= k < n:
            msg = "MassTable index out of range"
            raise IndexError(msg)
        x, y = self.xy[k].tolist()
        return MassItem(
            source=self.source[k],
            ref=self.ref[k],
            weight=float(self.weight[k]),
            location=(x, y),
            polygon=self.polygon[k],
            pier_part=self.pier_part[k],
        )

    def __iter__(self) -> Iterator[MassItem]:
        return map(self.__getitem__, range(len(self)))

    def __eq__(self, other: object) -> bool:
        if isinstance(other, MassTable | tuple | list):
            return len(self) == len(other) and tuple(self) == tuple(other)
        return NotImplemented

    def __hash__(self) -> int:
        return hash(tuple(self))

    def __repr__(self) -> str:
        return f"MassTable({len(self)} items)"

    def __reduce__(self):
        return (
            _rebuild,
            (self.source, self.ref, self.weight, self.xy, self.polygon, self.pier_part),
        )


def _rebuild(source, ref, weight, xy, polygon, pier_part) -> MassTable:
    return MassTable(
        source=source,
        ref=ref,
        weight=weight,
        xy=xy,
        polygon=polygon,
        pier_part=pier_part,
    )
